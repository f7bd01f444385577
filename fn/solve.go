package fn

import (
	"errors"
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
// none exists, a bracketed solve finds it (pairs.go). Input errors are
// *InputError, reported on the input as given (ρ as ρ); a solve that did
// not converge is a *SolverError, whose kind is ErrSolver.
func Solve(a, b Input) (State, error) {
	st, err := solve(a, b)
	if err != nil {
		var se *SolverError
		if errors.As(err, &se) {
			se.Inputs = [2]Input{a, b}
		}
	}
	return st, err
}

func solve(a, b Input) (State, error) {
	if err := checkFinite(a, b); err != nil {
		return State{}, err
	}
	isVolume := func(q Quantity) bool { return q == Volume || q == Density }
	if !a.Q.valid() || !b.Q.valid() || a.Q == b.Q || isVolume(a.Q) && isVolume(b.Q) {
		return State{}, pairError(a, b, ErrPair, "give two different properties, e.g. p and t, p and h, h and s")
	}
	g := given{a, b}
	for _, in := range g {
		if isVolume(in.Q) {
			if err := checkVolume(in); err != nil {
				return State{}, err
			}
		}
	}
	// ρ is solved as v; g keeps it as given, for the errors.
	for _, in := range []*Input{&a, &b} {
		if in.Q == Density {
			*in = Input{Volume, 1 / in.Value}
		}
	}
	if a.Q > b.Q { // canonical order: the order of the Quantity constants
		a, b = b, a
		g[0], g[1] = g[1], g[0]
	}
	switch [2]Quantity{a.Q, b.Q} {
	case [2]Quantity{Pressure, Temperature}:
		return FromPT(a.Value, b.Value)
	case [2]Quantity{Pressure, Quality}:
		return FromPX(a.Value, b.Value)
	case [2]Quantity{Temperature, Quality}:
		return FromTX(a.Value, b.Value)
	}
	ps := pairTable[a.Q][b.Q]
	if ps == nil {
		return State{}, pairError(a, b, ErrPair,
			"supported pairs: p,t  p,h  p,s  h,s  p,x  t,x  p,v  t,v  t,h  t,s  u,v (rho in place of v)")
	}
	if err := checkOne(a); err != nil {
		return State{}, err
	}
	return ps.solvePair(a.Value, b.Value, g)
}

// checkOne checks the range of an input that bounds the range by itself:
// p and T.
func checkOne(in Input) error {
	switch in.Q {
	case Pressure:
		return checkP(in.Value)
	case Temperature:
		return checkT(in.Value)
	}
	return nil
}

// checkFinite refuses NaN and infinite inputs.
func checkFinite(in ...Input) error {
	for _, i := range in {
		if math.IsNaN(i.Value) || math.IsInf(i.Value, 0) {
			return notFinite(i.Q, i.Value)
		}
	}
	return nil
}

// checkX checks a quality.
func checkX(x float64) error {
	if x < 0 || x > 1 {
		lim := 0.0
		if x > 1 {
			lim = 1
		}
		return outOfRange(Quality, x, lim, "x must lie between {0} and {1} (a fraction, not a percentage)", fig(Quality, 0), fig(Quality, 1))
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
		return State{}, &InputError{Input: "p", Q: Pressure, Value: p, Limit: if97.Pc, HasLimit: true,
			Kind: ErrAboveCritical, Detail: note("x has no meaning at or above the critical pressure {0}", fig(Pressure, if97.Pc))}
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
		return State{}, &InputError{Input: "t", Q: Temperature, Value: T, Limit: if97.Tc, HasLimit: true,
			Kind: ErrAboveCritical, Detail: note("x has no meaning at or above the critical temperature {0}", fig(Temperature, if97.Tc))}
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
