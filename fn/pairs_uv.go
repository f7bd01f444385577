package fn

import (
	"math"

	"steamcell/fn/if97"
)

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
	if st, ok := fastUV(u, v); ok {
		return st, nil
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

// fastUV tries (u, v) by Newton steps from rough starts: first in region 3
// at the given density (where ρ is a native variable, so the solve is for T
// alone and cheap even when it lands outside region 3), then in regions 1,
// 2 and 5 in (p, T). An answer counts only if it lies
// in the region solved in and, on the saturation dome's side, in a stable
// single phase: below Tc its pressure must be above ps(T) for liquid
// (v below the critical volume) and below it for vapour, and a region-3
// answer below Tc must have a density outside the saturated densities.
// Everything else goes to the exact path.
func fastUV(u, v float64) (State, bool) {
	if !(v > 0) {
		return State{}, false
	}
	stable := func(pr *if97.Props) bool {
		if pr.T >= if97.Tc {
			return true
		}
		ps := if97.SatPressure(pr.T)
		if v < 1/if97.Rhoc {
			return pr.P > ps
		}
		return pr.P < ps
	}
	accept := func(r int, pr if97.Props, ok bool) (State, bool) {
		if ok && if97.RegionOf(pr.P, pr.T) == r && stable(&pr) {
			return singleState(r, pr), true
		}
		return State{}, false
	}
	rho := 1 / v
	// Region 3 first where the density allows it: at a given density the
	// solve is for T alone, cheap even when it lands outside region 3.
	if rho > 60 && rho < 800 {
		pr, ok := newton1n(3, InternalEnergy, u, rho, 700, true, 20)
		if ok {
			switch if97.RegionOf(pr.P, pr.T) {
			case 3:
				if stableRegion3(&pr) {
					return singleState(3, pr), true
				}
			case 2:
				// Dense vapour just below the B23 line: the region-3
				// equation, continued a little past its boundary, lands
				// close to region 2's answer (the two agree on the
				// boundary), a far better start than the ideal gas.
				pr2, ok := newton2n(2, Volume, v, InternalEnergy, u, pr.P, pr.T, 20, 1)
				if st, ok := accept(2, pr2, ok); ok {
					return st, true
				}
			}
		}
	}
	if v < 0.0017 { // liquid-like: region 1 from cp ≈ 4.2 kJ/(kg·K)
		t0 := math.Min(T13, math.Max(TMin, TMin+u/4.2))
		pr, ok := newton2n(1, Volume, v, InternalEnergy, u, math.Min(PMax, if97.SatPressure(t0)+5), t0, 20, 1)
		if st, ok := accept(1, pr, ok); ok {
			return st, true
		}
	}
	if v > 0.0015 { // vapour-like: u ≈ 2375 + 1.5 (T − 273.15) − 3.5/v kJ/kg, ideal-gas p
		t0 := math.Min(TMaxHigh, math.Max(TMin, TMin+(u+3.5/v-2375)/1.5))
		order := [2]int{2, 5}
		if t0 > TMax {
			order = [2]int{5, 2}
		}
		for _, r := range order {
			t := t0
			if r == 5 {
				t = math.Max(t0, TMax+1)
			} else {
				t = math.Min(t0, TMax-1)
			}
			pr, ok := newton2n(r, Volume, v, InternalEnergy, u, if97.R*t/(mpaM3*v), t, 20, 1)
			if st, ok := accept(r, pr, ok); ok {
				return st, true
			}
		}
	}
	return State{}, false
}
