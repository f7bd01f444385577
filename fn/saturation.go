package fn

import (
	"math"

	"steamcell/fn/if97"
)

// The saturation line, once for the whole package.
//
// IF97 defines region 4 by the saturation-pressure equation, R7-97(2012)
// Eq. 30 (ps(T)) and its inverse Eq. 31 (Ts(p)), from 273.15 K to Tc, and
// steamcell lets that equation alone decide saturation everywhere, above
// 623.15 K too: a state below Tc is liquid where p ≥ ps(T) and vapour where
// p < ps(T) (phaseAt). The saturated phases are the single-phase states on
// either side of the line at the same (p, T): regions 1 and 2 up to
// 623.15 K, and above it the region-3 basic equation, Eq. 28, solved for
// the density at (p, T) on its liquid and its vapour branch
// (region3DensityOn). So every pair sees the same line: a compressed
// liquid approached along any path ends at the saturated liquid of the
// same T and p, whichever pair fixed it.
//
// Eq. 28's own phase equilibrium (equal p and g, if97.Region3SatDensities)
// lies within IF97's stated consistency of Eq. 30 but not on it (up to
// 5e-4 MPa apart near 637 K), which is why it does not decide anything.
// It is used in one place: within about 2e-5 K of Tc, Eq. 30 passes
// outside the tiny van der Waals loop of Eq. 28 (1.5e-9 MPa off at
// 1e-5 K, with the loop 1e-9 MPa wide), so one branch has no density at
// ps(T); there the phases take Eq. 28's equilibrium densities at T, at the
// pressure of Eq. 30.

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

// saturationAt returns the saturation state at T (TMin ≤ T ≤ Tc,
// unchecked), at p = ps(T) of Eq. 30.
func saturationAt(T float64) (Saturation, bool) {
	return satPhases(if97.SatPressure(T), T)
}

// saturationAtP returns the saturation state at p (PMinSat ≤ p ≤ pc,
// unchecked), at T = Ts(p) of Eq. 31.
func saturationAtP(p float64) (Saturation, bool) {
	return satPhases(p, if97.SatTemperature(p))
}

// satPhases returns the saturated phases at (p, T) on the line.
func satPhases(p, T float64) (Saturation, bool) {
	if T <= T13 || p <= P13Sat { // Eq. 31 at P13Sat gives T13 only to rounding
		T = math.Min(T, T13)
		return Saturation{P: p, T: T, Liquid: if97.Region1(p, T), Vapour: if97.Region2(p, T)}, true
	}
	if T >= if97.Tc {
		c := if97.Region3(if97.Rhoc, if97.Tc)
		c.P = if97.Pc
		return Saturation{P: if97.Pc, T: if97.Tc, Liquid: c, Vapour: c}, true
	}
	l, okl := region3At(p, T, true)
	v, okv := region3At(p, T, false)
	if !okl || !okv {
		rl, rv, ok := if97.Region3SatDensities(T)
		if !ok {
			return Saturation{}, false
		}
		l, v = if97.Region3(rl, T), if97.Region3(rv, T)
	}
	sat := Saturation{P: p, T: T, Liquid: l, Vapour: v}
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
		return Saturation{}, outOfRange(Temperature, T, TMin, "T below {0}", fig(Temperature, TMin))
	}
	if T > if97.Tc {
		return Saturation{}, &InputError{Input: "t", Q: Temperature, Value: T, Limit: if97.Tc, HasLimit: true,
			Kind: ErrAboveCritical, Detail: note("T above the critical temperature {0}", fig(Temperature, if97.Tc))}
	}
	sat, ok := saturationAt(T)
	if !ok {
		return Saturation{}, &SolverError{Inputs: [2]Input{{Temperature, T}}, Step: "saturated densities in region 3"}
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
	sat, ok := saturationAtP(p)
	if !ok {
		return Saturation{}, &SolverError{Inputs: [2]Input{{Pressure, p}}, Step: "saturated densities in region 3"}
	}
	return sat, nil
}

// checkSatP checks that a saturation state exists at p.
func checkSatP(p float64) error {
	if p < PMinSat {
		return outOfRange(Pressure, p, PMinSat, "p below {0}, the saturation pressure at {1}, the lowest of IF97",
			fig(Pressure, PMinSat), fig(Temperature, TMin))
	}
	if p > if97.Pc {
		return &InputError{Input: "p", Q: Pressure, Value: p, Limit: if97.Pc, HasLimit: true,
			Kind: ErrAboveCritical, Detail: note("p above the critical pressure {0}", fig(Pressure, if97.Pc))}
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

// onLine returns the state on the saturation line sat whose q is val, if
// val lies between the saturated values ql and qv (q rising from liquid
// to vapour) or within the solve's residual tolerance (resTol) outside
// them: such a value cannot be told from the saturated phase's own, and
// is that phase (x = 0 or 1).
func onLine(sat Saturation, q Quantity, val float64) (State, bool) {
	ql, qv := value(q, &sat.Liquid), value(q, &sat.Vapour)
	tol := resTol(q, val)
	if val < ql-tol || val > qv+tol {
		return State{}, false
	}
	return mixture(sat, quality(ql, qv, val)), true
}
