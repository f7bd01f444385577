package fn

import (
	"fmt"
	"math"

	"steamcell/fn/if97"
)

// Solve returns the state fixed by two inputs, in either order. The pairs
// are (p,T), (p,h), (p,s), (h,s), (p,x), (T,x), (p,v), (T,v), (T,h), (T,s)
// and (u,v), with ρ accepted in place of v.
//
// Where IAPWS backward equations exist they give the starting values
// (R7-97(2012) T(p,h), T(p,s); SR2-01 and SR4-04 p(h,s); SR3-03 T and v from
// (p,h) and (p,s); SR5-05 v(p,T)), and Newton steps on the forward
// equations polish the answer until it agrees with them to rounding. Where
// none exists, a bracketed Newton solve finds it. Errors are *InputError.
func Solve(a, b Input) (State, error) {
	if err := checkFinite(a, b); err != nil {
		return State{}, err
	}
	if !a.Q.valid() || !b.Q.valid() || a.Q == b.Q ||
		(a.Q == Volume || a.Q == Density) && (b.Q == Volume || b.Q == Density) {
		return State{}, pairError(a, b, ErrPair, "give two different properties, e.g. p and t, p and h, h and s")
	}
	// ρ is accepted in place of v.
	for _, in := range []*Input{&a, &b} {
		if in.Q == Density {
			if in.Value <= 0 {
				return State{}, outOfRange(Density, in.Value, 0, "rho must be above 0 kg/m³")
			}
			*in = Input{Volume, 1 / in.Value}
		}
	}
	if a.Q > b.Q { // canonical order: the order of the Quantity constants
		a, b = b, a
	}
	switch a.Q {
	case Pressure:
		switch b.Q {
		case Temperature:
			return FromPT(a.Value, b.Value)
		case Enthalpy, Entropy:
			return fromPQ(a.Value, b)
		case Volume:
			return fromPV(a.Value, b.Value)
		case Quality:
			return FromPX(a.Value, b.Value)
		}
	case Temperature:
		switch b.Q {
		case Quality:
			return FromTX(a.Value, b.Value)
		case Volume:
			return fromTV(a.Value, b.Value)
		case Enthalpy, Entropy:
			return fromTQ(a.Value, b)
		}
	case Enthalpy:
		if b.Q == Entropy {
			return FromHS(a.Value, b.Value)
		}
	case Volume:
		if b.Q == InternalEnergy {
			return FromUV(b.Value, a.Value)
		}
	}
	return State{}, pairError(a, b, ErrPair,
		"supported pairs: p,t  p,h  p,s  h,s  p,x  t,x  p,v  t,v  t,h  t,s  u,v (rho in place of v)")
}

// checkX checks a quality.
func checkX(x float64) error {
	if x < 0 || x > 1 {
		lim := 0.0
		if x > 1 {
			lim = 1
		}
		return outOfRange(Quality, x, lim, "x must lie between 0 and 1 (a fraction, not a percentage)")
	}
	return nil
}

// FromPX returns the state on the saturation line at pressure p (MPa) with
// quality x (0…1).
func FromPX(p, x float64) (State, error) {
	if err := checkFinite(Input{Pressure, p}, Input{Quality, x}); err != nil {
		return State{}, err
	}
	if err := checkX(x); err != nil {
		return State{}, err
	}
	if p >= if97.Pc {
		return State{}, &InputError{Input: "p", Value: p, Limit: if97.Pc, HasLimit: true, Unit: "MPa",
			Kind: ErrAboveCritical, Detail: fmt.Sprintf("x has no meaning at or above the critical pressure %g MPa", if97.Pc)}
	}
	sat, err := SaturationAtP(p)
	if err != nil {
		return State{}, err
	}
	return mixture(sat, x), nil
}

// FromTX returns the state on the saturation line at temperature T (K) with
// quality x (0…1).
func FromTX(T, x float64) (State, error) {
	if err := checkFinite(Input{Temperature, T}, Input{Quality, x}); err != nil {
		return State{}, err
	}
	if err := checkX(x); err != nil {
		return State{}, err
	}
	if T >= if97.Tc {
		return State{}, &InputError{Input: "t", Value: T, Limit: if97.Tc, HasLimit: true, Unit: "K",
			Kind: ErrAboveCritical, Detail: fmt.Sprintf("x has no meaning at or above the critical temperature %g K", if97.Tc)}
	}
	sat, err := SaturationAtT(T)
	if err != nil {
		return State{}, err
	}
	return mixture(sat, x), nil
}

// FromPH returns the state at pressure p (MPa) and specific enthalpy h (kJ/kg).
func FromPH(p, h float64) (State, error) { return Solve(Input{Pressure, p}, Input{Enthalpy, h}) }

// FromPS returns the state at pressure p (MPa) and specific entropy s (kJ/(kg·K)).
func FromPS(p, s float64) (State, error) { return Solve(Input{Pressure, p}, Input{Entropy, s}) }

// FromPV returns the state at pressure p (MPa) and specific volume v (m³/kg).
func FromPV(p, v float64) (State, error) { return Solve(Input{Pressure, p}, Input{Volume, v}) }

// FromTV returns the state at temperature T (K) and specific volume v (m³/kg).
func FromTV(T, v float64) (State, error) { return Solve(Input{Temperature, T}, Input{Volume, v}) }

// FromTH returns the state at temperature T (K) and specific enthalpy h (kJ/kg).
func FromTH(T, h float64) (State, error) { return Solve(Input{Temperature, T}, Input{Enthalpy, h}) }

// FromTS returns the state at temperature T (K) and specific entropy s (kJ/(kg·K)).
func FromTS(T, s float64) (State, error) { return Solve(Input{Temperature, T}, Input{Entropy, s}) }

// quantityAt returns quantity q of the single-phase state at (p, T), which
// must be inside the range of validity.
func quantityAt(q Quantity, p, T float64) float64 {
	pr, err := evalPT(if97.RegionOf(p, T), p, T)
	if err != nil {
		return math.NaN()
	}
	return value(q, &pr)
}
