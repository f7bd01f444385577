package fn

import (
	"math"
	"strconv"

	"steamcell/fn/if97"
)

// The bracketed fallback along an isobar, for (p,h), (p,s) and (p,v): the
// value is placed among its values at the ends of the range, at the region
// boundaries and on the saturation line at p, and T is solved in the
// stretch of the isobar that holds it. Region 3 is evaluated at any (p, T)
// inside it, its boundary lines included (region3Density).

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
		return outOfRange(Pressure, p, 0, "p must be above {0} (absolute)", fig(Pressure, 0))
	case p > PMax:
		return outOfRange(Pressure, p, PMax, "p above {0}", fig(Pressure, PMax))
	}
	return nil
}

// quantityAt returns quantity q of the stable single-phase state at (p, T),
// which must be inside the range of validity, or NaN.
func quantityAt(q Quantity, p, T float64) float64 {
	pr, err := evalPT(if97.RegionOf(p, T), p, T)
	if err != nil {
		return math.NaN()
	}
	return value(q, &pr)
}

// stretch is a stretch of an isobar from tLo to tHi in region r, or the
// saturation line (r = 4, at tLo = tHi = Ts(p)). A region-3 stretch below
// pc lies on one side of the saturation line: liquid below Ts(p), vapour
// above it.
type stretch struct {
	r        int
	tLo, tHi float64
	liquid   bool
}

// isobarStretches returns the stretches of the isobar p inside the range of
// validity in order of rising T, and the saturation state if there is one.
func isobarStretches(p float64) ([]stretch, *Saturation, bool) {
	_, tHi := tRangeAtP(p)
	vapour := func(tLo float64) []stretch {
		out := []stretch{{2, tLo, TMax, false}}
		if tHi > TMax {
			out = append(out, stretch{5, TMax, tHi, false})
		}
		return out
	}
	if p < PMinSat { // below the triple-point pressure: vapour only
		return vapour(TMin), nil, true
	}
	if p <= P13Sat {
		sat, _ := saturationAtP(p)
		return append([]stretch{{1, TMin, sat.T, true}, {4, sat.T, sat.T, false}}, vapour(sat.T)...), &sat, true
	}
	tb := math.Max(T13, if97.B23Temperature(p))
	out := []stretch{{1, TMin, T13, true}}
	if p >= if97.Pc {
		return append(append(out, stretch{3, T13, tb, true}), vapour(tb)...), nil, true
	}
	sat, ok := saturationAtP(p)
	out = append(out, stretch{3, T13, sat.T, true}, stretch{4, sat.T, sat.T, false}, stretch{3, sat.T, tb, false})
	return append(out, vapour(tb)...), &sat, ok
}

// atP returns the properties at (p, T) on stretch st.
func (st stretch) atP(p, T float64) (if97.Props, bool) {
	if st.r != 3 {
		return eval(st.r, p, T), true
	}
	return region3At(p, T, st.liquid || p >= if97.Pc)
}

// fallbackIsobar solves (p, q) for q rising with T along the isobar (h, s,
// and v outside cold liquid) by placing val among its values at the ends
// of the stretches and solving in the stretch that holds it.
//
// Where val falls between the values of two neighbouring regions at their
// common boundary (the equations of neighbouring regions agree there only
// within IF97's stated consistency, R7-97(2012) section 4: a few
// thousandths of a kJ/kg in h between regions 1 and 3 at 623.15 K), the
// state is the boundary state itself, and the lower region's equation,
// continued by the fraction of a kelvin the gap is wide, gives it: the
// answer carries a warning saying so.
func fallbackIsobar(p float64, q Quantity, val float64, gv Input) (State, error) {
	if err := checkP(p); err != nil {
		return State{}, err
	}
	sts, sat, ok := isobarStretches(p)
	if !ok {
		return State{}, solverFailed("saturated densities in region 3")
	}
	tLo, tHi := tRangeAtP(p)
	var prev *stretch
	for i := range sts {
		st := &sts[i]
		if st.r == 4 {
			if got, ok := onLine(*sat, q, val); ok {
				if q == Volume && val <= if97.Region1(p, TMin).V {
					// Near the density maximum a liquid colder than the
					// saturation temperature has this v too.
					a, _ := solveAtP(stretch{1, TMin, sat.T, true}, p, Volume, val)
					return State{}, twoPV(gv, val, p, []Figure{fig(Temperature, a.T), fig(Temperature, sat.T)},
						"fits liquid at T = {2} and a wet mixture at T = {3}")
				}
				return got, nil
			}
			continue
		}
		lo, okLo := st.atP(p, st.tLo)
		hi, okHi := st.atP(p, st.tHi)
		if !okLo || !okHi {
			return State{}, solverFailed("region-3 density at the ends of a stretch of the isobar")
		}
		qlo, qhi := value(q, &lo), value(q, &hi)
		if st.r == 1 && q == Volume {
			// v is not monotonic in cold liquid: liquidAtPV places it.
			if val <= qhi {
				return liquidAtPV(p, val, st.tHi, gv)
			}
			prev = st
			continue
		}
		if val < qlo {
			if prev == nil {
				if qlo-val <= edgeTol(q, val) { // the bottom of the range, to rounding
					return singleState(st.r, lo), nil
				}
				return State{}, belowAtP(gv, q, val, qlo, tLo, p)
			}
			return bridgeAtP(*prev, p, q, val)
		}
		if val <= qhi {
			return solvedOn(*st, p, q, val)
		}
		if prev = st; i == len(sts)-1 {
			if val-qhi <= edgeTol(q, val) { // the top of the range, to rounding
				return singleState(st.r, hi), nil
			}
			return State{}, aboveAtP(gv, q, val, qhi, tHi, p)
		}
	}
	return State{}, solverFailed("placing the value along the isobar")
}

// edgeTol is how far q = val may lie outside the range and still be its
// edge: the solves' residual tolerance (resTol), and for v and ρ four
// units of rounding, what v = 1/ρ and back can change (p and T, given
// exactly, likewise).
func edgeTol(q Quantity, val float64) float64 {
	if q == Volume || q == Density || q == Pressure || q == Temperature {
		return 1e-15 * math.Abs(val)
	}
	return resTol(q, val)
}

// belowAtP and aboveAtP report q = val beyond its range along the isobar.
func belowAtP(gv Input, q Quantity, val, lim, T, p float64) error {
	if q == Volume {
		return volumeOutOfRange(gv, lim, true, "its value at {1} and p = {2}", fig(Temperature, T), fig(Pressure, p))
	}
	return outOfRange(q, val, lim, q.Symbol()+" below {0}, its value at {1} and p = {2}", fig(q, lim), fig(Temperature, T), fig(Pressure, p))
}

func aboveAtP(gv Input, q Quantity, val, lim, T, p float64) error {
	if q == Volume {
		return volumeOutOfRange(gv, lim, false, "its value at {1} and p = {2}", fig(Temperature, T), fig(Pressure, p))
	}
	return outOfRange(q, val, lim, q.Symbol()+" above {0}, its value at {1} and p = {2}", fig(q, lim), fig(Temperature, T), fig(Pressure, p))
}

// solvedOn solves q(p, T) = val on stretch st, which holds it.
func solvedOn(st stretch, p float64, q Quantity, val float64) (State, error) {
	pr, ok := solveAtP(st, p, q, val)
	if !ok {
		return State{}, solverFailed("bracketed solve in T at fixed p in region " + string(rune('0'+st.r)))
	}
	return singleState(st.r, pr), nil
}

// bridgeAtP returns the state where val lies in the gap between the value
// at the top of stretch st and the value at the bottom of the next: st's
// equation continued past its top boundary, by Newton steps from it.
func bridgeAtP(st stretch, p float64, q Quantity, val float64) (State, error) {
	top, ok := st.atP(p, st.tHi)
	if !ok {
		return State{}, solverFailed("region-3 density at a region boundary")
	}
	pr, ok := newton(st.r, Pressure, p, q, val, native(st.r, &top), st.tHi, maxNewtonSteps, 1)
	if !ok || !(pr.T >= st.tHi) || pr.T > st.tHi+bridgeMaxK {
		return State{}, solverFailed("continuing a region's equation across the gap at its boundary")
	}
	s := singleState(st.r, pr)
	s.Warnings = append(s.Warnings, note("this value lies between the values that the equations of two neighbouring IF97 regions give at their boundary at {0}; region "+strconv.Itoa(st.r)+"'s equation is continued {1} past it, within the consistency IF97 states for the two",
		fig(Temperature, st.tHi), Figure{Q: Temperature, V: pr.T - st.tHi, Diff: true}))
	return s, nil
}

// bridgeMaxK bounds the continuation across a boundary gap, K: IF97's
// consistency at the boundaries, |Δh| ≤ 0.2 kJ/kg and |Δs| ≤ 0.2 J/(kg·K)
// (R7-97(2012) section 4, as recalled), is well under a kelvin's worth of
// h and s at every boundary (cp ≥ 1 kJ/(kg·K) in the range).
const bridgeMaxK = 1.0

func ptr(p if97.Props) *if97.Props { return &p }

// quality returns x = (val − ql)/(qv − ql), clamped to [0, 1] against
// rounding.
func quality(ql, qv, val float64) float64 {
	x := (val - ql) / (qv - ql)
	return math.Max(0, math.Min(1, x))
}

// solveAtP solves q(p, T) = val for T on stretch st by a bracketed Newton
// solve (rootBracketed); q rises with T along the stretch. Region 3 is
// evaluated at its density at (p, T) on the stretch's side of the
// saturation line.
func solveAtP(st stretch, p float64, q Quantity, val float64) (if97.Props, bool) {
	r := st.r
	f := func(T float64) (float64, float64) {
		pr, ok := st.atP(p, T)
		if !ok {
			return math.NaN(), 0
		}
		if r != 3 {
			_, d := partials(q, r, &pr)
			return value(q, &pr) - val, d
		}
		// (∂q/∂T)_p from the (ρ, T) partials: (∂q/∂T)_ρ − (∂q/∂ρ)_T (∂p/∂T)_ρ/(∂p/∂ρ)_T.
		dr, dt := partials(q, 3, &pr)
		dpr, dpt := partials(Pressure, 3, &pr)
		return value(q, &pr) - val, dt - dr*dpt/dpr
	}
	flo, _ := f(st.tLo)
	fhi, _ := f(st.tHi)
	T, ok := rootBracketed(f, st.tLo, st.tHi, flo, fhi, (st.tLo+st.tHi)/2, 1e-15)
	if !ok {
		return if97.Props{}, false
	}
	return st.atP(p, T)
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

// checkVolume checks a specific volume or density given as an input.
func checkVolume(g Input) error {
	if g.Value <= 0 {
		return outOfRange(g.Q, g.Value, 0, g.Q.Symbol()+" must be above {0}", fig(g.Q, 0))
	}
	return nil
}

// volumeOutOfRange reports the volume input g (v or ρ, as given) beyond
// the limit vLim on v: vBelow when v is below it (ρ above 1/vLim). where
// finishes the sentence, its figures numbered from {1}.
func volumeOutOfRange(g Input, vLim float64, vBelow bool, where string, figs ...Figure) *InputError {
	lim, below := vLim, vBelow
	if g.Q == Density {
		lim, below = 1/vLim, !vBelow
	}
	side := " above {0}, "
	if below {
		side = " below {0}, "
	}
	return outOfRange(g.Q, g.Value, lim, g.Q.Symbol()+side+where, append([]Figure{fig(g.Q, lim)}, figs...)...)
}

// volumeFigure is v as the user gave it: as v, or as ρ.
func volumeFigure(g Input, v float64) Figure {
	if g.Q == Density {
		return fig(Density, 1/v)
	}
	return fig(Volume, v)
}

// fallbackPQ is the fallback of (p,h) and (p,s).
func fallbackPQ(p float64, q Quantity, val float64) (State, error) {
	return fallbackIsobar(p, q, val, Input{q, val})
}

// fallbackPV is the fallback of (p,v): v rises with T along the isobar but
// in liquid water below about 277 K, where it falls (the density maximum,
// liquidAtPV).
func fallbackPV(p, v float64, g given) (State, error) {
	return fallbackIsobar(p, Volume, v, g[1])
}

// twoPV is the refusal of a (p,v) that two states fit, at temperatures
// alts; text names them as {2} and {3}.
func twoPV(gv Input, v, p float64, alts []Figure, text string) error {
	return &InputError{Input: "p," + gv.Q.Symbol(), Pair: true, Kind: ErrTwoSolutions, Alternatives: alts,
		Detail: note("near the density maximum of water, "+gv.Q.Symbol()+" = {0} at p = {1} "+text+"; give T instead of "+gv.Q.Symbol(),
			append([]Figure{volumeFigure(gv, v), fig(Pressure, p)}, alts...)...)}
}

// liquidAtPV solves v(p, T) = v in region 1 for T in [273.15 K, tTop],
// minding the density maximum: where αv < 0 at 273.15 K, v falls with T up to
// the temperature of maximum density and rises after it.
func liquidAtPV(p, v, tTop float64, gv Input) (State, error) {
	cold := if97.Region1(p, TMin)
	if cold.AlphaV >= 0 { // no density maximum inside the range at this p
		if v < cold.V-edgeTol(Volume, v) {
			return State{}, volumeOutOfRange(gv, cold.V, true, "its value at {1} and p = {2}", fig(Temperature, TMin), fig(Pressure, p))
		}
		if v <= cold.V {
			return singleState(1, cold), nil
		}
		return solvedOn(stretch{1, TMin, tTop, true}, p, Volume, v)
	}
	// Temperature of maximum density: αv(p, T) = 0, below 300 K at every
	// pressure (277.13 K at 0.1 MPa, lower at higher pressures; common
	// knowledge of the trade, no source; TestEntropyFallsWithPressure
	// checks αv > 0 from 278 K up).
	f := func(T float64) float64 { return if97.Region1(p, T).AlphaV }
	tmd, ok := rootBrent(f, TMin, 300, cold.AlphaV, f(300), 1e-13)
	if !ok {
		return State{}, solverFailed("temperature of maximum density")
	}
	vmin := if97.Region1(p, tmd).V
	switch {
	case v < vmin:
		return State{}, volumeOutOfRange(gv, vmin, true, "the smallest liquid volume at p = {2} (at T = {1})", fig(Temperature, tmd), fig(Pressure, p))
	case v <= cold.V:
		a, _ := solveAtP(stretch{1, TMin, tmd, true}, p, Volume, v)
		b, _ := solveAtP(stretch{1, tmd, tTop, true}, p, Volume, v)
		return State{}, twoPV(gv, v, p, []Figure{fig(Temperature, a.T), fig(Temperature, b.T)}, "fits T = {2} and T = {3}")
	}
	return solvedOn(stretch{1, tmd, tTop, true}, p, Volume, v)
}
