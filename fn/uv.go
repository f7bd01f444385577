package fn

import (
	"math"

	"steamcell/fn/if97"
)

// (u,v), the pair of a closed rigid vessel. The starts are rough: region 3
// at the given density from a mid-range T (ρ is region 3's own variable,
// so the solve is in T alone), region 1 from cp ≈ 4.2 kJ/(kg·K) of water,
// the vapour regions from u ≈ 2375 + 1.5 (T − 273.15) − 3.5/v kJ/kg, a
// rough fit to superheated steam, at the ideal-gas pressure. Each is gated
// by the volume span of its region (regionSpans).

func startUV3(v, u float64) (float64, float64, bool) {
	return 1 / v, (T13 + if97.B23Temperature(PMax)) / 2, v >= regionSpans.v3Min && v <= regionSpans.v3Max
}

func startUV1(v, u float64) (float64, float64, bool) {
	t0 := math.Min(T13, math.Max(TMin, TMin+u/4.2))
	return (if97.SatPressure(t0) + PMax) / 2, t0, v <= regionSpans.v1Max
}

func startUV2(v, u float64) (float64, float64, bool) {
	t := math.Min(TMax, math.Max(TMin, vapourT(u, v)))
	return if97.R * t / (mpaM3 * v), t, v >= regionSpans.v2Min
}

func startUV5(v, u float64) (float64, float64, bool) {
	t := math.Min(TMaxHigh, math.Max(TMax, vapourT(u, v)))
	return math.Min(PMaxHigh, if97.R*t/(mpaM3*v)), t, v >= regionSpans.v5Min && vapourT(u, v) > TMax
}

// vapourT is the rough start of T for vapour of internal energy u and
// volume v, from u ≈ 2375 + 1.5 (T − 273.15) − 3.5/v kJ/kg.
func vapourT(u, v float64) float64 { return TMin + (u+3.5/v-2375)/1.5 }

// fallbackUV solves (u, v) along the isochore: at constant v, u rises with
// T in every phase (cv > 0, and in two phases too), so T is the root of
// u(T, v) − u, where the state at (T, v) comes from the (T, v) solver with
// its phase. The search runs from 273.15 K to the highest temperature the
// isochore reaches inside the range of validity.
func fallbackUV(v, u float64, g given) (State, error) {
	gv := g[0]
	tv := func(T float64) (State, error) {
		return Solve(Input{Temperature, T}, gv)
	}
	f := func(T float64) float64 {
		st, err := tv(T)
		if err != nil {
			return math.NaN()
		}
		return st.U - u
	}
	tLo := TMin
	flo := f(tLo)
	if math.IsNaN(flo) {
		if _, err := tv(tLo); err != nil {
			return State{}, err // v itself is outside the range at 273.15 K
		}
	}
	if flo > 0 {
		return State{}, outOfRange(InternalEnergy, u, u-flo, "u below {0}, its value at {1} for this "+gv.Q.Symbol(),
			fig(InternalEnergy, u-flo), fig(Temperature, tLo))
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
		return State{}, outOfRange(InternalEnergy, u, u-fhi, "u above {0}, its highest value for this "+gv.Q.Symbol()+" within the range of validity (at {1})",
			fig(InternalEnergy, u-fhi), fig(Temperature, tHi))
	}
	T, ok := rootBrent(f, tLo, tHi, flo, fhi, 1e-15)
	if !ok {
		return State{}, solverFailed("bracketed solve in T along the isochore")
	}
	return tv(T)
}
