package fn

import (
	"fmt"

	"steamcell/fn/if97"
)

// Saturation is a point on the saturation line: its pressure and temperature
// with the saturated-liquid and saturated-vapour properties.
type Saturation struct {
	P, T           float64 // MPa, K
	Liquid, Vapour if97.Props
}

// PMinSat is the saturation pressure at 273.15 K, the lowest of IF97,
// R7-97(2012) Eq. 30 (611.213 Pa), in MPa.
var PMinSat = if97.SatPressure(TMin)

// satAtTMin is the saturation state at 273.15 K, the bottom of the range,
// which several solves compare their inputs with.
var satAtTMin, _ = saturationAt(TMin)

// saturationAt returns the saturation state at T (TMin ≤ T ≤ Tc, unchecked).
//
// Up to 623.15 K the liquid is from region 1 and the vapour from region 2 at
// p = ps(T) of R7-97(2012) Eq. 30. From 623.15 K to Tc both phases lie in
// region 3: their densities are those at which the region-3 equation gives
// equal pressure and Gibbs energy (if97.Region3SatDensities), and the
// pressure reported is ps(T) of Eq. 30, which agrees with the region-3
// equilibrium pressure within the consistency IF97 states for the two.
func saturationAt(T float64) (Saturation, bool) {
	p := if97.SatPressure(T)
	if T <= T13 {
		return Saturation{P: p, T: T, Liquid: if97.Region1(p, T), Vapour: if97.Region2(p, T)}, true
	}
	rl, rv, ok := if97.Region3SatDensities(T)
	if !ok {
		return Saturation{}, false
	}
	sat := Saturation{P: p, T: T, Liquid: if97.Region3(rl, T), Vapour: if97.Region3(rv, T)}
	sat.Liquid.P, sat.Vapour.P = p, p
	return sat, true
}

// SaturationAtT returns the saturation state at temperature T (K),
// 273.15 K ≤ T ≤ 647.096 K.
func SaturationAtT(T float64) (Saturation, error) {
	if err := checkFinite(Input{Temperature, T}); err != nil {
		return Saturation{}, err
	}
	if T < TMin {
		return Saturation{}, outOfRange(Temperature, T, TMin, "T below %g K", TMin)
	}
	if T > if97.Tc {
		return Saturation{}, &InputError{Input: "t", Value: T, Limit: if97.Tc, HasLimit: true, Unit: "K",
			Kind: ErrAboveCritical, Detail: fmt.Sprintf("T above the critical temperature %g K", if97.Tc)}
	}
	sat, ok := saturationAt(T)
	if !ok {
		return Saturation{}, &InputError{Input: "t", Value: T, Unit: "K", Kind: ErrNoSolution,
			Detail: "the region-3 saturation densities did not converge"}
	}
	return sat, nil
}

// SaturationAtP returns the saturation state at pressure p (MPa),
// 611.213 Pa ≤ p ≤ 22.064 MPa.
func SaturationAtP(p float64) (Saturation, error) {
	if err := checkFinite(Input{Pressure, p}); err != nil {
		return Saturation{}, err
	}
	if err := checkSatP(p); err != nil {
		return Saturation{}, err
	}
	sat, err := SaturationAtT(if97.SatTemperature(p))
	sat.P = p
	sat.Liquid.P, sat.Vapour.P = p, p
	return sat, err
}

// checkSatP checks that a saturation state exists at p.
func checkSatP(p float64) error {
	if p < PMinSat {
		return outOfRange(Pressure, p, PMinSat, "p below %g MPa, the saturation pressure at %g K, the lowest of IF97", PMinSat, TMin)
	}
	if p > if97.Pc {
		return &InputError{Input: "p", Value: p, Limit: if97.Pc, HasLimit: true, Unit: "MPa",
			Kind: ErrAboveCritical, Detail: fmt.Sprintf("p above the critical pressure %g MPa", if97.Pc)}
	}
	return nil
}

// mixture returns the state of quality x on the saturation line sat.
func mixture(sat Saturation, x float64) State {
	s := State{Region: 4, X: x, HasX: true, Liquid: sat.Liquid, Vapour: sat.Vapour, Phase: twoPhase(x)}
	switch x {
	case 0:
		s.Props = sat.Liquid
	case 1:
		s.Props = sat.Vapour
	default:
		l, g := &sat.Liquid, &sat.Vapour
		mix := func(a, b float64) float64 { return a + x*(b-a) }
		s.Props = if97.Props{P: sat.P, T: sat.T, V: mix(l.V, g.V), U: mix(l.U, g.U),
			H: mix(l.H, g.H), S: mix(l.S, g.S), G: mix(l.G, g.G)}
		s.Rho = 1 / s.V
		s.F = s.U - s.T*s.S
	}
	s.P, s.T = sat.P, sat.T
	s.Warnings = warnings(&s)
	return s
}
