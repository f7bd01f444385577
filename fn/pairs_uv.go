package fn

import "math"

// FromUV returns the state at specific internal energy u (kJ/kg) and
// specific volume v (m³/kg), the pair of a closed rigid vessel.
//
// At constant v, u rises with T in every phase (cv > 0, and in two phases
// too), so T is the root of u(T, v) − u along the isochore, where the state
// at (T, v) comes from the (T, v) solver with its phase. The search runs
// from 273.15 K to the highest temperature the isochore reaches inside the
// range of validity.
func FromUV(u, v float64) (State, error) {
	if err := checkFinite(Input{InternalEnergy, u}, Input{Volume, v}); err != nil {
		return State{}, err
	}
	if err := checkV(v); err != nil {
		return State{}, err
	}
	f := func(T float64) float64 {
		st, err := fromTV(T, v)
		if err != nil {
			return math.NaN()
		}
		return st.U - u
	}
	tLo := TMin
	flo := f(tLo)
	if math.IsNaN(flo) {
		if _, err := fromTV(tLo, v); err != nil {
			return State{}, err // v itself is outside the range at 273.15 K
		}
	}
	if flo > 0 {
		return State{}, outOfRange(InternalEnergy, u, u-flo, "u below %.8g kJ/kg, its value at %g K for this v", u-flo, tLo)
	}
	// The highest T on this isochore inside the range of validity: the
	// pressure rises with T at constant v and meets its limit somewhere.
	tHi := TMaxHigh
	fhi := f(tHi)
	if math.IsNaN(fhi) {
		a, b := tLo, tHi
		for i := 0; i < 60 && b-a > 1e-9*b; i++ {
			m := (a + b) / 2
			if math.IsNaN(f(m)) {
				b = m
			} else {
				a = m
			}
		}
		tHi = a
		fhi = f(tHi)
	}
	if fhi < 0 {
		return State{}, outOfRange(InternalEnergy, u, u-fhi, "u above %.8g kJ/kg, its highest value for this v within the range of validity (at %.6g K)", u-fhi, tHi)
	}
	T, ok := rootBrent(f, tLo, tHi, flo, fhi, 1e-15)
	if !ok {
		return State{}, noConvergence("u,v")
	}
	return fromTV(T, v)
}
