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
func FromHS(h, s float64) (State, error) { return Solve(Input{Enthalpy, h}, Input{Entropy, s}) }

// Starts of (h,s): the backward equations p(h,s) of SR2-01(2014) (regions
// 1 and 2) and SR4-04(2014) (region 3), with T from T(p,h) of R7-97(2012)
// and SR3-03(2014), each gated by the entropy span of its region
// (regionSpans).
func startHS1(h, s float64) (float64, float64, bool) {
	if s > regionSpans.s1Max {
		return 0, 0, false
	}
	p := if97.Region1PFromHS(h, s)
	T := if97.Region1TFromPH(p, h)
	if !(p > hsLowP) {
		// Near the saturation line at low pressure SR2-01's p(h,s) can go
		// negative: start from T at the entropy instead and the pressure
		// that the enthalpy then needs, from (∂h/∂p)_T = v (1 − T αv).
		T = if97.Region1TFromPS(hsLowP, s)
		ps := if97.SatPressure(T)
		pr := if97.Region1(ps, T)
		p = ps + (h-pr.H)/(mpaM3*pr.V*(1-T*pr.AlphaV))
		p = math.Max(p, 1.0001*ps)
	}
	return inBox(1, p, T)
}

// satS2Min is s”(623.15 K), the lower end of SR4-04(2014)'s Tsat(h,s).
var satS2Min = if97.Region2(P13Sat, T13).S

// hsLowP is the pressure, MPa, below which SR2-01(2014)'s region-1
// p(h,s) is no start: its permissible error there, 15 kPa (tested in
// if97's backward12hs_test.go), is a sixth of it.
const hsLowP = 0.1

func startHS2(h, s float64) (float64, float64, bool) {
	if s < regionSpans.s2Min || h > regionSpans.h2Max {
		return 0, 0, false
	}
	p := if97.Region2PFromHS(h, s)
	T := if97.Region2TFromPH(p, h)
	return inBox(2, p, T)
}

func startHS3(h, s float64) (float64, float64, bool) {
	if s < regionSpans.s3Min || s > regionSpans.s3Max {
		return 0, 0, false
	}
	p := if97.Region3PFromHS(h, s)
	rho, T := 1/if97.Region3VFromPH(p, h), if97.Region3TFromPH(p, h)
	return inBox(3, rho, T)
}

func startHS5(h, s float64) (float64, float64, bool) {
	if s < regionSpans.s5Min {
		return 0, 0, false
	}
	p, T := startHS5Ideal(h, s)
	return p, T, true
}

// inBox reports whether a start lies inside region r's box of native
// variables (regionBox), its T within startMarginK; the start is then
// moved inside the box.
func inBox(r int, a, T float64) (float64, float64, bool) {
	b := regionBox(r)
	ok := a >= b.aMin && a <= b.aMax && T >= b.tMin-startMarginK && T <= b.tMax+startMarginK
	return a, math.Max(b.tMin, math.Min(b.tMax, T)), ok
}

// fallbackHS solves (h, s) where no candidate is accepted: the two-phase
// test for (h, s) under the saturation line, then a bracketed solve for p
// along the isentrope (nestedHS).
func fallbackHS(h, s float64, _ given) (State, error) {
	lo := &satAtTMin
	if s >= lo.Liquid.S && s <= lo.Vapour.S {
		// The 273.15 K isotherm through the two-phase region bounds the range.
		l, g := &lo.Liquid, &lo.Vapour
		if hMin := l.H + (s-l.S)*(g.H-l.H)/(g.S-l.S); h < hMin {
			return State{}, outOfRange(Enthalpy, h, hMin, "h below {0}, its value at {1} for this s", fig(Enthalpy, hMin), fig(Temperature, TMin))
		}
		if st, ok, err := twoPhaseHS(h, s); err != nil || ok {
			return st, err
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
		st, err := Solve(Input{Pressure, math.Exp(lp)}, Input{Entropy, s})
		if err != nil {
			return math.NaN()
		}
		return st.H - h
	}
	lo, hi, ok := validSpan(f, math.Log(1e-12), math.Log(PMax))
	flo, fhi := f(lo), f(hi)
	// At constant p, dh = T ds: the (p, s) solve's tolerance in s moves h
	// by up to T times it.
	tol := resTol(Enthalpy, h) + TMaxHigh*resTol(Entropy, s)
	switch { // an end of the range, to rounding
	case ok && flo > 0 && flo <= tol:
		return Solve(Input{Pressure, math.Exp(lo)}, Input{Entropy, s})
	case ok && fhi < 0 && -fhi <= tol:
		return Solve(Input{Pressure, math.Exp(hi)}, Input{Entropy, s})
	}
	if !ok || flo > 0 || fhi < 0 {
		return State{}, pairError(Input{Enthalpy, h}, Input{Entropy, s}, ErrOutOfRange,
			"no state between {0} and {1} at pressures up to {2} ({3} above {0}) has these values",
			fig(Temperature, TMin), fig(Temperature, TMaxHigh), fig(Pressure, PMax), fig(Pressure, PMaxHigh), fig(Temperature, TMax))
	}
	lp, ok := rootBrent(f, lo, hi, flo, fhi, 1e-15)
	if !ok {
		return State{}, solverFailed("bracketed solve in p along the isentrope")
	}
	st, err := Solve(Input{Pressure, math.Exp(lp)}, Input{Entropy, s})
	if err != nil || st.HasX {
		return st, err
	}
	// The (p, s) solve stops at a residual in s that is fine for (p, s)
	// but, where h hardly depends on p (cold liquid), leaves p loose: a
	// last Newton solve on (h, s) pins it.
	for _, tf := range []float64{1e-3, 1} {
		if pr, ok := newton(st.Region, Enthalpy, h, Entropy, s, native(st.Region, &st.Props), st.T, 60, tf); ok && accept(st.Region, &pr) {
			return singleState(st.Region, pr), nil
		}
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
		return State{}, false, solverFailed("saturation temperature at s")
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
	// At Tc the phases are one and g has no value: the bracket stops a
	// hair below it.
	lo, hi := TMin, math.Min(tb, if97.Tc*(1-1e-12))
	if s >= satS2Min { // SR4-04(2014) Tsat(h,s), valid from s''(623.15 K) up, starts a narrow bracket
		if t0 := if97.SatTFromHS(h, s); t0 > lo && t0 < hi {
			if a, b := math.Max(lo, t0-0.05), math.Min(hi, t0+0.05); g(a)*g(b) <= 0 {
				lo, hi = a, b
			}
		}
	}
	glo, ghi := g(lo), g(hi)
	if glo*ghi > 0 && math.Abs(ghi) <= 1e-12 {
		// On the saturation line itself (x = 0 or 1): rounding put the
		// root's sign change just past the bracket's end.
		ghi = 0
	}
	T, ok := rootBrent(g, lo, hi, glo, ghi, 1e-14)
	if !ok {
		return State{}, false, solverFailed("two-phase temperature at (h, s)")
	}
	sat, _ = saturationAt(T)
	return mixture(sat, quality(sat.Liquid.S, sat.Vapour.S, s)), true, nil
}

// startHS5Ideal estimates (p, T) in region 5 from (h, s): T where h(1 MPa, T) = h
// by Newton steps on cp (h hardly depends on p there, and cp hardly on T),
// then p from the ideal-gas relation s(p) = s(1 MPa) − R ln p.
func startHS5Ideal(h, s float64) (p, T float64) {
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
