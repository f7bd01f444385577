package fn

import (
	"math"

	"steamcell/fn/if97"
)

// P13Sat is the saturation pressure at 623.15 K, where the saturation line
// leaves regions 1 and 2 for region 3 (about 16.529 MPa), R7-97(2012) Eq. 30.
var P13Sat = if97.SatPressure(T13)

// tRangeAtP returns the temperature limits of the range of validity at p.
func tRangeAtP(p float64) (lo, hi float64) {
	if p > PMaxHigh {
		return TMin, TMax
	}
	return TMin, TMaxHigh
}

// checkP checks a pressure given as an input.
func checkP(p float64) error {
	switch {
	case p <= 0:
		return outOfRange(Pressure, p, 0, "p must be above 0 MPa (absolute)")
	case p > PMax:
		return outOfRange(Pressure, p, PMax, "p above %g MPa", PMax)
	}
	return nil
}

// checkQAtP checks that q = val lies between its values at the lowest and
// the highest temperature of the range of validity at pressure p; q must
// increase with T at constant p (h, s).
func checkQAtP(p float64, q Quantity, val float64) error {
	tLo, tHi := tRangeAtP(p)
	if lo := quantityAt(q, p, tLo); val < lo {
		return outOfRange(q, val, lo, "%s below %.8g %s, its value at %g K and p = %g MPa", q.Symbol(), lo, q.BaseUnit(), tLo, p)
	}
	if hi := quantityAt(q, p, tHi); val > hi {
		return outOfRange(q, val, hi, "%s above %.8g %s, its value at %g K and p = %g MPa", q.Symbol(), hi, q.BaseUnit(), tHi, p)
	}
	return nil
}

// fromPQ returns the state at pressure p and q = in.Value, where q is h or
// s, both rising with T at constant pressure.
//
// Below 16.529 MPa the fast path guesses the phase from the value, solves in
// that phase's region from its backward equation and accepts the answer if
// its temperature lies on that phase's side of Ts(p): h and s rise with T at
// constant p, so that settles the phase without evaluating the saturation
// line. Everything else (two-phase states, region 3, region 5, the edges of
// the range) goes through fromPQExact.
func fromPQ(p float64, in Input) (State, error) {
	q, val := in.Q, in.Value
	if err := checkP(p); err != nil {
		return State{}, err
	}
	liquidFirst := q == Enthalpy && val < 1500 || q == Entropy && val < 3.5
	switch {
	case p < PMinSat: // below the triple-point pressure: vapour only
		if st, ok := tryVapourAtP(p, q, val, TMin); ok {
			return st, nil
		}
	case p <= P13Sat:
		ts := if97.SatTemperature(p)
		for i := 0; i < 2; i++ {
			if liquidFirst == (i == 0) {
				if pr, ok := tryAtP(1, p, q, val); ok && pr.T < ts && pr.T >= TMin {
					return singleState(1, pr), nil
				}
			} else if st, ok := tryVapourAtP(p, q, val, ts); ok {
				return st, nil
			}
		}
	case p > P13Sat:
		// Regions 1 and 2 are bounded by isotherms here (623.15 K and the
		// B23 line). The backward estimates of regions 1 and 2 (cheap next
		// to a failed Newton solve) say which of them can hold the answer;
		// a region-3 answer below pc must also pass region3SideOK.
		tb := if97.B23Temperature(p)
		t2 := backwardT(2, p, q, val)
		// Regions 2 and 5 start above 2400 kJ/kg and 4.9 kJ/(kg·K) at these
		// pressures (their values on the B23 line); below, region 2's
		// backward equations run wild (a liquid's h gives T in the millions).
		vapourPossible := q == Enthalpy && val > 2400 || q == Entropy && val > 4.9
		if vapourPossible && t2 > tb-10 {
			if st, ok := tryVapourAtPFrom(p, q, val, tb, t2); ok {
				return st, nil
			}
		}
		t1 := backwardT(1, p, q, val)
		if t1 < T13+10 {
			if pr, ok := tryAtPFrom(1, p, q, val, t1); ok && pr.T <= T13 && pr.T >= TMin {
				return singleState(1, pr), nil
			}
		}
		if pr, ok := tryAtP3(p, q, val); ok && region3SideOK(&pr, p) {
			return singleState(3, pr), nil
		}
	}
	return fromPQExact(p, q, val)
}

// tryVapourAtP tries region 2 above tLo and, where region 2's equation
// (extended past 1073.15 K, which its regionBox allows) puts the answer
// above 1073.15 K, region 5 from there.
func tryVapourAtP(p float64, q Quantity, val, tLo float64) (State, bool) {
	return tryVapourAtPFrom(p, q, val, tLo, backwardT(2, p, q, val))
}

// tryVapourAtPFrom is tryVapourAtP from region 2's backward estimate t0.
func tryVapourAtPFrom(p float64, q Quantity, val, tLo, t0 float64) (State, bool) {
	if t0 > TMax && p <= PMaxHigh {
		// Above region 2: region 5 straight from the backward estimate
		// (if the answer lies below 1073.15 K after all, region 2 follows).
		t5 := quickSteps(5, p, q, val, math.Min(t0, TMaxHigh))
		if pr, ok := newton1n(5, q, val, p, t5, true, 12); ok && pr.T > TMax && pr.T <= TMaxHigh {
			return singleState(5, pr), true
		}
	}
	pr, ok := tryAtPFrom(2, p, q, val, t0)
	switch {
	case ok && pr.T > tLo && pr.T <= TMax:
		return singleState(2, pr), true
	case ok && pr.T > TMax && p <= PMaxHigh:
		if pr, ok := newton1n(5, q, val, p, pr.T, true, 12); ok && pr.T > TMax && pr.T <= TMaxHigh {
			return singleState(5, pr), true
		}
	}
	return State{}, false
}

// tryAtP solves q(p, T) = val in Gibbs region r by Newton steps from the
// region's backward equation, without checking the region's limits.
func tryAtP(r int, p float64, q Quantity, val float64) (if97.Props, bool) {
	return tryAtPFrom(r, p, q, val, backwardT(r, p, q, val))
}

// tryAtPFrom is tryAtP from a backward estimate t0 already at hand.
func tryAtPFrom(r int, p float64, q Quantity, val, t0 float64) (if97.Props, bool) {
	b := regionBox(r)
	if !(t0 > b.tMin && t0 < b.tMax) {
		return if97.Props{}, false
	}
	t0 = quickSteps(r, p, q, val, t0)
	// A start from outside the region fails fast.
	return newton1n(r, q, val, p, t0, true, 8)
}

// fromPQExact solves (p, h) or (p, s) by first placing the value among its
// values at the ends of the range and on the saturation line, then solving
// in the region found. fromPQ falls back to it.
func fromPQExact(p float64, q Quantity, val float64) (State, error) {
	if err := checkQAtP(p, q, val); err != nil {
		return State{}, err
	}
	_, tHi := tRangeAtP(p)
	vapour := func(tLo float64) (State, error) {
		if tHi > TMax && val > quantityAt(q, p, TMax) {
			return solvedAtP(5, p, q, val, TMax, tHi)
		}
		return solvedAtP(2, p, q, val, tLo, math.Min(tHi, TMax))
	}
	if p <= P13Sat {
		if p < PMinSat { // below the triple-point pressure: vapour only
			return vapour(TMin)
		}
		ts := if97.SatTemperature(p)
		liq := if97.Region1(p, ts)
		if ql := value(q, &liq); val < ql {
			return solvedAtP(1, p, q, val, TMin, ts)
		} else if vap := if97.Region2(p, ts); val <= value(q, &vap) {
			sat := Saturation{P: p, T: ts, Liquid: liq, Vapour: vap}
			return mixture(sat, quality(ql, value(q, &vap), val)), nil
		}
		return vapour(ts)
	}
	if val <= quantityAt(q, p, T13) {
		return solvedAtP(1, p, q, val, TMin, T13)
	}
	tb := if97.B23Temperature(p)
	if val >= value(q, ptr(if97.Region2(p, tb))) {
		return vapour(tb)
	}
	if p < if97.Pc {
		ts := if97.SatTemperature(p)
		sat, ok := saturationAt(ts)
		if ok {
			sat.P = p
			ql, qv := value(q, &sat.Liquid), value(q, &sat.Vapour)
			if val >= ql && val <= qv {
				return mixture(sat, quality(ql, qv, val)), nil
			}
		}
	}
	return solvedAtP(3, p, q, val, T13, tb)
}

func ptr(p if97.Props) *if97.Props { return &p }

// quality returns x = (val − ql)/(qv − ql), clamped to [0, 1] against
// rounding.
func quality(ql, qv, val float64) float64 {
	x := (val - ql) / (qv - ql)
	return math.Max(0, math.Min(1, x))
}

// solvedAtP solves q(p, T) = val for T in [tLo, tHi] in region r and
// returns the state.
func solvedAtP(r int, p float64, q Quantity, val, tLo, tHi float64) (State, error) {
	pr, ok := solveAtP(r, p, q, val, tLo, tHi)
	if !ok {
		return State{}, &InputError{Input: "p," + q.Symbol(), Pair: true, Kind: ErrNoSolution,
			Detail: "the solve in region " + string(rune('0'+r)) + " did not converge; please report this state"}
	}
	return singleState(r, pr), nil
}

// solveAtP solves q(p, T) = val for T in [tLo, tHi] in region r, starting
// from the backward equation of the region where IF97 has one, with Newton
// steps on the forward equation, and a bracketed solve if those fail.
func solveAtP(r int, p float64, q Quantity, val, tLo, tHi float64) (if97.Props, bool) {
	if r == 3 {
		if q == Volume {
			return solveAtPV3(p, 1/val, tLo, tHi)
		}
		return solveAtP3(p, q, val, tLo, tHi)
	}
	t0 := backwardT(r, p, q, val)
	if !(t0 >= tLo && t0 <= tHi) {
		t0 = (tLo + tHi) / 2
	}
	if pr, ok := newton1(r, q, val, p, t0, true); ok && pr.T >= tLo-1e-9 && pr.T <= tHi+1e-9 {
		return pr, true
	}
	f := func(T float64) (float64, float64) {
		pr := eval(r, p, T)
		_, d := partials(q, r, &pr)
		return value(q, &pr) - val, d
	}
	flo, _ := f(tLo)
	fhi, _ := f(tHi)
	T, ok := rootBracketed(f, tLo, tHi, flo, fhi, t0, 1e-14)
	return eval(r, p, T), ok
}

// backwardT returns the backward-equation estimate of T from (p, h) or
// (p, s) in regions 1 and 2 (R7-97(2012) Eqs. 11, 13, 22–27), or NaN.
//
// Below the triple-point pressure the region-2 equation T(p,s) loses
// accuracy (10–30 K at 10 Pa), while the vapour is an ideal gas to a few
// parts in 10⁴, where s(p, T) = s(pt, T) − R ln(p/pt). There the estimate is
// taken at pt with s shifted by R ln(p/pt), which puts it within about
// 0.2 K; the steps on the forward equation at the true p then make it exact.
// (T(p,h) keeps its accuracy there.)
func backwardT(r int, p float64, q Quantity, val float64) float64 {
	if r == 2 && q == Entropy && p < PMinSat {
		val += if97.R * math.Log(p/PMinSat)
		p = PMinSat
	}
	switch {
	case r == 1 && q == Enthalpy:
		return if97.Region1TFromPH(p, val)
	case r == 1 && q == Entropy:
		return if97.Region1TFromPS(p, val)
	case r == 2 && q == Enthalpy:
		return if97.Region2TFromPH(p, val)
	case r == 2 && q == Entropy:
		return if97.Region2TFromPS(p, val)
	}
	return math.NaN()
}

// tryAtP3 solves q(p, T) = val in region 3 from the SR3-03(2014) backward
// equations by Newton steps in (ρ, T), and reports whether the answer lies
// in region 3.
func tryAtP3(p float64, q Quantity, val float64) (if97.Props, bool) {
	var t0, v0 float64
	switch q {
	case Enthalpy:
		t0, v0 = if97.Region3TFromPH(p, val), if97.Region3VFromPH(p, val)
	case Entropy:
		t0, v0 = if97.Region3TFromPS(p, val), if97.Region3VFromPS(p, val)
	default:
		return if97.Props{}, false
	}
	b := regionBox(3)
	if !(t0 > b.tMin && t0 < b.tMax && v0 > 0) {
		return if97.Props{}, false
	}
	pr, ok := newton2n(3, Pressure, p, q, val, 1/v0, t0, 10, 1)
	return pr, ok && if97.RegionOf(pr.P, pr.T) == 3
}

// solveAtP3 solves q(p, T) = val in region 3 with T in [tLo, tHi]: start
// from the SR3-03(2014) backward equations T and v of (p, h) or (p, s),
// Newton steps in (ρ, T) on the Helmholtz equation, and a bracketed solve in
// T (with ρ from (p, T)) if those fail.
func solveAtP3(p float64, q Quantity, val, tLo, tHi float64) (if97.Props, bool) {
	var t0, v0 float64
	switch q {
	case Enthalpy:
		t0, v0 = if97.Region3TFromPH(p, val), if97.Region3VFromPH(p, val)
	case Entropy:
		t0, v0 = if97.Region3TFromPS(p, val), if97.Region3VFromPS(p, val)
	}
	if t0 >= tLo && t0 <= tHi && v0 > 0 {
		pr, ok := newton2(3, Pressure, p, q, val, 1/v0, t0)
		if ok && pr.T >= tLo-1e-9 && pr.T <= tHi+1e-9 && if97.RegionOf(pr.P, pr.T) == 3 {
			return pr, true
		}
	}
	f := func(T float64) (float64, float64) {
		rho, ok := region3Density(p, T)
		if !ok {
			return math.NaN(), 0
		}
		pr := if97.Region3(rho, T)
		// (∂q/∂T)_p from the (ρ, T) partials: (∂q/∂T)_ρ − (∂q/∂ρ)_T (∂p/∂T)_ρ/(∂p/∂ρ)_T.
		dr, dt := partials(q, 3, &pr)
		dpr, dpt := partials(Pressure, 3, &pr)
		return value(q, &pr) - val, dt - dr*dpt/dpr
	}
	lo, hi := tLo, tHi
	if p < if97.Pc { // keep the bracket off the saturation temperature
		ts := if97.SatTemperature(p)
		if v := quantityAt(q, p, ts+1e-9); val > v {
			lo = ts + 1e-9
		} else {
			hi = ts - 1e-9
		}
	}
	flo, _ := f(lo)
	fhi, _ := f(hi)
	T, ok := rootBracketed(f, lo, hi, flo, fhi, t0, 1e-14)
	if !ok {
		return if97.Props{}, false
	}
	rho, ok := region3Density(p, T)
	return if97.Region3(rho, T), ok
}

// solveAtPV3 solves p(ρ, T) = p for T in [tLo, tHi] at fixed ρ in region 3,
// where p rises with T at constant ρ.
func solveAtPV3(p, rho, tLo, tHi float64) (if97.Props, bool) {
	f := func(T float64) (float64, float64) {
		pr := if97.Region3(rho, T)
		_, d := partials(Pressure, 3, &pr)
		return pr.P - p, d
	}
	flo, _ := f(tLo)
	fhi, _ := f(tHi)
	T, ok := rootBracketed(f, tLo, tHi, flo, fhi, (tLo+tHi)/2, 1e-15)
	return if97.Region3(rho, T), ok
}

// region3SideOK reports whether a region-3 state solved at pressure p is
// a stable single phase: at or above pc always. Below pc its density must
// lie clearly outside the saturated densities at Ts(p), estimated by the
// SR5-05(2016) v(p,T) just below and just above Ts on either side (those
// equations agree with the Helmholtz equation to 0.001 % there, so a margin
// of 0.1 % is safe); inside lie the superheated-liquid, supercooled-vapour
// and unstable states of the Helmholtz equation. Close to pc (above 21 MPa,
// where SR5-05's auxiliary equations are less accurate) it compares with
// the exact saturated densities at the state's own temperature
// (stableRegion3); within the margin it answers false and the exact path
// decides.
// TestRegion3SideRejectsWetStates checks that no wet state passes.
func region3SideOK(pr *if97.Props, p float64) bool {
	if p >= if97.Pc {
		return true
	}
	if p > 21 {
		return stableRegion3(pr)
	}
	ts := if97.SatTemperature(p)
	rl := 1 / if97.Region3VFromPT(p, ts*(1-1e-9))
	rv := 1 / if97.Region3VFromPT(p, ts*(1+1e-9))
	return pr.Rho > rl*1.001 || pr.Rho < rv*0.999
}

// quickSteps takes Halley steps on h, s, cp and dcp/dT alone
// (if97.Region1HSCp and its kin, about two thirds of the cost of the full
// property set) from the estimate t0 of T at pressure p in Gibbs region r:
// one step takes a backward equation's estimate, within 25 mK, to within
// rounding, and a start within 0.5 K to well inside the solve's tolerance,
// so that the full solve that follows usually stops at its first
// evaluation; after a step larger than 0.5 K (a start rougher than that) it
// steps again, up to four times.
func quickSteps(r int, p float64, q Quantity, val, t0 float64) float64 {
	if q != Enthalpy && q != Entropy {
		return t0
	}
	for i := 0; i < 4; i++ {
		var h, s, cp, dcp float64
		switch r {
		case 1:
			h, s, cp, dcp = if97.Region1HSCp(p, t0)
		case 2:
			h, s, cp, dcp = if97.Region2HSCp(p, t0)
		case 5:
			h, s, cp, dcp = if97.Region5HSCp(p, t0)
		}
		if !(cp > 0) {
			return t0
		}
		// Halley's step on f(T) = q(T) − val: the second derivative (from
		// dcp/dT) makes it cubic, so that a backward estimate within 25 mK
		// comes out within rounding of the root, and the full solve stops at
		// its first evaluation.
		var f, f1, f2 float64
		if q == Enthalpy {
			f, f1, f2 = h-val, cp, dcp
		} else {
			f, f1, f2 = s-val, cp/t0, dcp/t0-cp/(t0*t0)
		}
		step := f / f1
		if d := 1 - step*f2/(2*f1); d > 0.5 {
			step /= d
		}
		// Keep a wild step from a start outside the region inside reason.
		step = math.Max(-t0/3, math.Min(t0/3, step))
		t0 -= step
		if math.Abs(step) < 0.5 {
			break
		}
	}
	return t0
}
