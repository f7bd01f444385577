package fn

import (
	"math"
	"strconv"

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
	if v >= regionSpans.v3Min && v <= regionSpans.v3Max {
		// Dense vapour near the B23 line: region 3's equation at the
		// given density, solved for T alone and continued a little past
		// its boundary, lands close to region 2's answer (the two agree on
		// the boundary), a far better start than the ideal gas.
		if pr, ok := newton(3, Volume, v, InternalEnergy, u, 1/v, (T13+if97.B23Temperature(PMax))/2, 20, 1); ok && pr.P > 0 && pr.P <= PMax {
			return pr.P, pr.T, true
		}
	}
	t := math.Min(TMax, math.Max(TMin, vapourT(u, v)))
	return if97.R * t / (mpaM3 * v), t, v >= regionSpans.v2Min
}

func startUV5(v, u float64) (float64, float64, bool) {
	t := math.Min(TMaxHigh, math.Max(TMax, vapourT(u, v)))
	return math.Min(PMaxHigh, if97.R*t/(mpaM3*v)), t, v >= regionSpans.v5Min && vapourT(u, v) > TMax
}

// rootSampled finds a root of f on [lo, hi] by sampling f at 64 points
// and running Brent's method between the neighbouring samples, both
// defined, where f changes sign.
func rootSampled(f func(float64) float64, lo, hi float64) (float64, bool) {
	const n = 64
	xa, fa := lo, f(lo)
	for i := 1; i <= n; i++ {
		xb := lo + (hi-lo)*float64(i)/n
		fb := f(xb)
		if !math.IsNaN(fa) && !math.IsNaN(fb) && fa*fb <= 0 {
			return rootBrent(f, xa, xb, fa, fb, 1e-15)
		}
		xa, fa = xb, fb
	}
	return 0, false
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
	if flo > 0 && flo <= resTol(InternalEnergy, u) { // the bottom of the range, to rounding
		return tv(tLo)
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
		for i := 0; i < 64 && b-a > 1e-15*b; i++ {
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
	if fhi < 0 && -fhi <= resTol(InternalEnergy, u) {
		return tv(tHi)
	}
	if fhi < 0 {
		return State{}, outOfRange(InternalEnergy, u, u-fhi, "u above {0}, its highest value for this "+gv.Q.Symbol()+" within the range of validity (at {1})",
			fig(InternalEnergy, u-fhi), fig(Temperature, tHi))
	}
	T, ok := rootBrent(f, tLo, tHi, flo, fhi, 1e-15)
	if !ok {
		// A point of the isochore where (T, v) has no answer (the gap
		// between regions 1 and 3 at 623.15 K) stopped the solve: narrow
		// the bracket by samples to the stretch of the sign change.
		T, ok = rootSampled(f, tLo, tHi)
	}
	if !ok {
		// Rounding noise in u(T) (a mixture on one side, the liquid on
		// the other) can keep the bracket from closing to 1e-15 at a
		// root: the last point stands if it meets the tolerance.
		for _, t := range []float64{T, math.Nextafter(T, 0), math.Nextafter(T, math.Inf(1))} {
			if st, err := tv(t); err == nil && math.Abs(st.U-u) <= resTol(InternalEnergy, u) {
				return st, nil
			}
		}
	}
	if !ok {
		return State{}, solverFailed("bracketed solve in T along the isochore")
	}
	st, err := tv(T)
	if err != nil || st.HasX || math.Abs(st.U-u) <= resTol(InternalEnergy, u) {
		return st, err
	}
	// u jumps where the isochore crosses a region boundary (the
	// neighbouring equations agree only within IF97's consistency), and
	// the root is that jump: the state is the boundary state, from the
	// equation of the side the solve ended on, continued past it.
	for _, r := range []int{st.Region, 1, 2, 3} {
		a := 1 / v // region 3 starts at the given density
		if r != 3 {
			a = st.P
		}
		pr, ok := newton(r, Volume, v, InternalEnergy, u, a, st.T, maxNewtonSteps, 1)
		if !ok || math.Abs(pr.T-T) > bridgeMaxK || !(pr.P > 0 && pr.P <= PMax) {
			continue
		}
		b := singleState(r, pr)
		b.Warnings = append(b.Warnings, note("this state lies on the boundary of IF97 region "+strconv.Itoa(r)+", whose equation is continued past it to meet the given values, within the consistency IF97 states between neighbouring regions"))
		return b, nil
	}
	return State{}, solverFailed("continuing a region's equation across the gap at its boundary")
}
