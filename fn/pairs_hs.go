package fn

import (
	"math"

	"steamcell/fn/if97"
)

// satQ returns quantity q of the saturated liquid and vapour at T, with
// the saturation state; ok is false where it cannot be computed.
func satQ(T float64, q Quantity) (ql, qv float64, sat Saturation, ok bool) {
	sat, ok = saturationAt(T)
	return value(q, &sat.Liquid), value(q, &sat.Vapour), sat, ok
}

// FromHS returns the state at specific enthalpy h (kJ/kg) and specific
// entropy s (kJ/(kg·K)).
//
// The two-phase region is the part of the h–s plane under the saturation
// line and above the 273.15 K isotherm; there T is the temperature at which
// h and s give the same quality. Elsewhere the backward equations p(h,s) of
// SR2-01(2014) (regions 1 and 2) and SR4-04(2014) (region 3) start a Newton
// solve on the forward equations; where that fails, a bracketed solve for p
// along the isentrope (nestedHS) finds the state.
func FromHS(h, s float64) (State, error) {
	if err := checkFinite(Input{Enthalpy, h}, Input{Entropy, s}); err != nil {
		return State{}, err
	}
	lo := &satAtTMin
	if s >= lo.Liquid.S && s <= lo.Vapour.S {
		// The 273.15 K isotherm through the two-phase region bounds the range.
		l, g := &lo.Liquid, &lo.Vapour
		if hMin := l.H + (s-l.S)*(g.H-l.H)/(g.S-l.S); h < hMin {
			return State{}, outOfRange(Enthalpy, h, hMin, "h below %.8g kJ/kg, its value at %g K for this s", hMin, TMin)
		}
		// Single-phase answers are tried first: stable states map to (h, s)
		// one to one, so a stable single-phase answer rules out a wet one.
		// Points well above the saturation line need no more: the SR4-04
		// (2014) boundary equations h'(s), h''(s) deviate from the
		// saturation line of the phase equations by less than 0.01 kJ/kg
		// (measured over 273.16 K … Tc in 0.05 K steps), so a margin of 0.1
		// kJ/kg is safe. The rest get the exact two-phase test.
		for _, r := range regionOrderHS(h, s) {
			if r, pr, ok := solveHS(r, h, s); ok {
				return singleState(r, pr), nil
			}
		}
		if h <= satLineApprox(s)+0.1 {
			if st, ok, err := twoPhaseHS(h, s); err != nil || ok {
				return st, err
			}
		}
		return nestedHS(h, s)
	}
	for _, r := range regionOrderHS(h, s) {
		if r, pr, ok := solveHS(r, h, s); ok {
			return singleState(r, pr), nil
		}
	}
	return nestedHS(h, s)
}

// nestedHS solves (h, s) where the Newton solves from the backward
// equations fail (very low pressures, the edges of regions): at constant s,
// h rises with p in every phase (dh = v dp), so p is the root of
// h(p, s) − h, with the state at (p, s) from the (p, s) solver.
func nestedHS(h, s float64) (State, error) {
	f := func(lp float64) float64 {
		st, err := fromPQ(math.Exp(lp), Input{Entropy, s})
		if err != nil {
			return math.NaN()
		}
		return st.H - h
	}
	lo, hi, ok := validSpan(f, math.Log(1e-12), math.Log(PMax))
	flo, fhi := f(lo), f(hi)
	if !ok || flo > 0 || fhi < 0 {
		return State{}, pairError(Input{Enthalpy, h}, Input{Entropy, s}, ErrOutOfRange,
			"no state between %g K and %g K at pressures up to %g MPa (%g MPa above %g K) has these values", TMin, TMaxHigh, PMax, PMaxHigh, TMax)
	}
	lp, ok := rootBrent(f, lo, hi, flo, fhi, 1e-15)
	if !ok {
		return State{}, noConvergence("h,s")
	}
	st, err := fromPQ(math.Exp(lp), Input{Entropy, s})
	if err != nil || st.HasX {
		return st, err
	}
	// The (p, s) solve stops at a residual in s that is fine for (p, s)
	// but, where h hardly depends on p (cold liquid), leaves p loose: a
	// last Newton solve on (h, s) pins it.
	if pr, ok := newton2n(st.Region, Enthalpy, h, Entropy, s, native(st.Region, &st.Props), st.T, 60, 1e-3); ok && if97.RegionOf(pr.P, pr.T) == st.Region {
		return singleState(st.Region, pr), nil
	}
	return st, nil
}

// twoPhaseHS returns the two-phase state at (h, s) if (h, s) lies on or
// under the saturation line; s lies between s'(273.15 K) and s”(273.15 K).
func twoPhaseHS(h, s float64) (State, bool, error) {
	// The temperature at which the saturation line has entropy s.
	q := func(T float64) float64 {
		sl, sv, _, _ := satQ(T, Entropy)
		if s <= if97.Sc {
			return sl - s
		}
		return sv - s
	}
	tb, ok := rootBrent(q, TMin, if97.Tc, q(TMin), q(if97.Tc), 1e-14)
	if !ok {
		return State{}, false, noConvergence("h,s")
	}
	sat, _ := saturationAt(tb)
	hb := sat.Liquid.H
	if s > if97.Sc {
		hb = sat.Vapour.H
	}
	if h > hb {
		return State{}, false, nil
	}
	// Under the line: the temperature at which h and s give the same
	// quality. (The isotherms are the straight lines h = h' + T (s − s')
	// only as far as g' = g''; IF97's phase equations meet that to their
	// stated consistency, so the solve uses the quality itself.)
	g := func(T float64) float64 {
		sat, _ := saturationAt(T)
		l, v := &sat.Liquid, &sat.Vapour
		return (h-l.H)/(v.H-l.H) - (s-l.S)/(v.S-l.S)
	}
	lo, hi := TMin, tb
	if s >= 5.210887825 { // SR4-04(2014) Tsat(h,s) starts a narrow bracket
		if t0 := if97.SatTFromHS(h, s); t0 > lo && t0 < hi {
			if a, b := math.Max(lo, t0-0.05), math.Min(hi, t0+0.05); g(a)*g(b) <= 0 {
				lo, hi = a, b
			}
		}
	}
	T, ok := rootBrent(g, lo, hi, g(lo), g(hi), 1e-14)
	if !ok {
		return State{}, false, noConvergence("h,s")
	}
	sat, _ = saturationAt(T)
	return mixture(sat, quality(sat.Liquid.S, sat.Vapour.S, s)), true, nil
}

// regionOrderHS returns the single-phase regions to try for (h, s), the
// likeliest first.
func regionOrderHS(h, s float64) [4]int {
	switch {
	case s <= 3.778281340 && s >= 3.397782955 && h > if97.B13Enthalpy(s):
		// Above the boundary of regions 1 and 3 (SR4-04(2014) Eq. 7, valid
		// from s(100 MPa, 623.15 K) to s'(623.15 K)).
		return [4]int{3, 1, 2, 5}
	case s <= 3.778281340: // s'(623.15 K), SR4-04(2014) section 4.3
		return [4]int{1, 3, 2, 5}
	case s <= 5.210887825: // s''(623.15 K), SR4-04(2014) section 4.3
		return [4]int{3, 2, 1, 5}
	case h > 4200: // above region 2's highest enthalpy (at 1073.15 K, low p)
		return [4]int{5, 2, 3, 1}
	}
	return [4]int{2, 3, 5, 1}
}

// solveHS solves (h, s) in region r by Newton steps from the backward
// equations' start and reports whether the answer lies in region r; with
// the region it lies in, which is 5 where region 2's equation, extended
// past 1073.15 K, led there and region 5's solve from that point
// confirmed it.
func solveHS(r int, h, s float64) (int, if97.Props, bool) {
	var a, T float64
	switch r {
	case 1:
		a = if97.Region1PFromHS(h, s)
		T = if97.Region1TFromPH(a, h)
		if !(a > 0.1) {
			// At low pressure SR2-01's p(h,s) is off by up to 15 kPa (its
			// permissible inconsistency), enough to go negative: start from
			// T at the entropy instead and the pressure that the enthalpy
			// then needs, from (∂h/∂p)_T = v (1 − T αv).
			T = if97.Region1TFromPS(0.1, s)
			ps := if97.SatPressure(T)
			pr := if97.Region1(ps, T)
			a = ps + (h-pr.H)/(mpaM3*pr.V*(1-T*pr.AlphaV))
			a = math.Max(a, 1.0001*ps)
		}
	case 2:
		a = if97.Region2PFromHS(h, s)
		T = if97.Region2TFromPH(a, h)
	case 3:
		p := if97.Region3PFromHS(h, s)
		a, T = 1/if97.Region3VFromPH(p, h), if97.Region3TFromPH(p, h)
	case 5:
		a, T = startHS5(h, s)
	}
	bx := regionBox(r)
	if !(a >= bx.aMin && a <= bx.aMax) || !(T >= bx.tMin && T <= bx.tMax) {
		a, T = (bx.aMin+bx.aMax)/2, (bx.tMin+bx.tMax)/2
		if r != 3 {
			a = 1
		}
	}
	pr, ok := newton2n(r, Enthalpy, h, Entropy, s, a, T, 20, 1e-3)
	if ok && r == 2 && pr.T > TMax && pr.P <= PMaxHigh {
		if pr5, ok := newton2n(5, Enthalpy, h, Entropy, s, pr.P, pr.T, 20, 1e-3); ok && if97.RegionOf(pr5.P, pr5.T) == 5 {
			return 5, pr5, true
		}
	}
	if !ok || if97.RegionOf(pr.P, pr.T) != r && !onBoundary(r, pr.P, pr.T) {
		return r, pr, false
	}
	if r == 3 && !stableRegion3(&pr) {
		return r, pr, false // a metastable or unstable state inside the dome
	}
	return r, pr, true
}

// onBoundary reports whether (p, T) lies within rounding of the edge of
// region r, so that a state the solve put exactly on a boundary line counts
// for the region it was solved in.
func onBoundary(r int, p, T float64) bool {
	const e = 1e-9
	for _, dp := range []float64{-e, 0, e} {
		for _, dT := range []float64{-e, 0, e} {
			if if97.RegionOf(p*(1+dp), T*(1+dT)) == r {
				return true
			}
		}
	}
	return false
}

// startHS5 estimates (p, T) in region 5 from (h, s): T where h(1 MPa, T) = h
// by Newton steps on cp (h hardly depends on p there, and cp hardly on T),
// then p from the ideal-gas relation s(p) = s(1 MPa) − R ln p.
func startHS5(h, s float64) (p, T float64) {
	T = 1600
	var pr if97.Props
	for i := 0; i < 3; i++ { // the 2D solve that follows finishes the job
		pr = if97.Region5(1, T)
		T = math.Min(TMaxHigh, math.Max(TMax, T-(pr.H-h)/pr.Cp))
	}
	p = math.Exp((pr.S + pr.Cp*math.Log(T/pr.T) - s) / if97.R)
	return math.Min(math.Max(p, 1e-6), PMaxHigh), T
}

// validSpan returns the stretch [a, b] of [lo, hi] on which f is defined
// (not NaN), assumed to be one interval: f is sampled at 48 points and the
// ends of the defined stretch are refined by bisection.
func validSpan(f func(float64) float64, lo, hi float64) (a, b float64, ok bool) {
	const n = 48
	first, last := -1, -1
	x := func(i int) float64 { return lo + (hi-lo)*float64(i)/n }
	for i := 0; i <= n; i++ {
		if !math.IsNaN(f(x(i))) {
			if first < 0 {
				first = i
			}
			last = i
		}
	}
	if first < 0 {
		return 0, 0, false
	}
	edge := func(in, out float64) float64 { // in is defined, out is not
		for k := 0; k < 60; k++ {
			m := (in + out) / 2
			if math.IsNaN(f(m)) {
				out = m
			} else {
				in = m
			}
		}
		return in
	}
	a, b = x(first), x(last)
	if first > 0 {
		a = edge(a, x(first-1))
	}
	if last < n {
		b = edge(b, x(last+1))
	}
	return a, b, true
}

// satLineApprox returns the enthalpy of the saturation line at entropy s by
// the boundary equations of SR4-04(2014): h'1(s), h'3(s) on the liquid side
// (s up to s'(623.15 K) = 3.778281340 and up to sc), h”2c3b(s) and
// h”2ab(s) on the vapour side (from sc to 5.85 and above).
func satLineApprox(s float64) float64 {
	switch {
	case s <= 3.778281340:
		return if97.SatLiquidEnthalpy1FromS(s)
	case s <= if97.Sc:
		return if97.SatLiquidEnthalpy3FromS(s)
	case s <= 5.85:
		return if97.SatVapourEnthalpy2c3bFromS(s)
	}
	return if97.SatVapourEnthalpy2ab4FromS(s)
}
