package fn

import (
	"math"

	"steamcell/fn/if97"
)

// One solver for every pair. Each pair lists the regions its state may lie
// in, each with the start of a Newton solve on that region's equation, as
// data (pairTable); solvePair tries them in turn with the one Newton driver
// (newton) and the one acceptance test (accept), and where none is
// accepted hands over to the pair's bracketed fallback, which places the
// values among those at the region boundaries and the saturation line and
// solves in the region found (isobar.go, isotherm.go, hs.go, uv.go).
//
// A candidate whose start lies outside its region is skipped without an
// evaluation: the starts are backward equations where IAPWS has them, and
// a backward equation puts a state of its region within its permissible
// error of the true temperature (startMarginK), so a true answer is never
// skipped. Other starts are rough (an ideal gas, a mid-range point) and
// gated by the span of the input over the region (regionSpans), computed
// from the equations.

// startMarginK is the largest permissible |ΔT| of the backward equations
// that give the starts: 25 mK for T1(p,h), T1(p,s) (R7-97(2012) section 5)
// and T3(p,h), T3(p,s) (SR3-03(2014) Table 1); T2 has 10 mK or 25 mK.
const startMarginK = 0.025

// candidate is one region where a pair's state may lie and the start of
// its solve there.
type candidate struct {
	r int
	// start returns region r's native variables (p or ρ, and T) to start
	// from for the values x, y of the pair (in the canonical order of
	// Solve), or false if the state cannot lie in region r.
	start func(x, y float64) (a, T float64, ok bool)
}

// pairSolver is the data of one pair.
type pairSolver struct {
	q1, q2 Quantity // the pair in canonical order (v for ρ)
	cands  []candidate
	// quick: the Gibbs regions take Halley steps on h, s alone
	// (quickSteps) before the Newton solve, the pairs (p,h) and (p,s).
	quick bool
	// tolFactor scales the residual tolerance, see newton.
	tolFactor float64
	// steps bounds each candidate's Newton solve: a start from a backward
	// equation reaches rounding in one to three steps, so a candidate that
	// needs more than eight is in the wrong region; the rough starts need
	// up to a dozen, the (h,s) starts from SR2-01 at low p up to twenty.
	steps int
	// unique, if set, must hold for an accepted state: (p,v) has two
	// liquid states near water's density maximum. It takes pr by value:
	// a pointer handed to a function value escapes to the heap.
	unique func(r int, pr if97.Props, x, y float64) bool
	// fallback is the bracketed solve; g holds the inputs as given, for
	// its errors.
	fallback func(x, y float64, g given) (State, error)
}

// given is the pair as the user gave it (ρ as ρ), in canonical order.
type given [2]Input

// maxNewtonSteps bounds the Newton solves outside the candidates (the
// bridges across boundary gaps, the tests).
const maxNewtonSteps = 20

// solvePair solves the pair x, y by its candidates, then its fallback.
func (ps *pairSolver) solvePair(x, y float64, g given) (State, error) {
	for _, c := range ps.cands {
		a, T, ok := c.start(x, y)
		if !ok {
			continue
		}
		if ps.quick && c.r != 3 {
			T = quickSteps(c.r, a, ps.q2, y, T)
		}
		pr, ok := newton(c.r, ps.q1, x, ps.q2, y, a, T, ps.steps, ps.tolFactor)
		if ok && accept(c.r, &pr) && (ps.unique == nil || ps.unique(c.r, pr, x, y)) {
			if st, ok := onSatPhase(&pr, ps.q1, x, ps.q2, y); ok {
				return st, nil
			}
			return singleState(c.r, pr), nil
		}
	}
	return ps.fallback(x, y, g)
}

// pairTable holds every pair solved by solvePair, indexed by its
// quantities in canonical order (nil for the others). (p,T), (p,x) and
// (T,x) need no solve. It is an array, not the map pairs returns: a map
// lookup hashes its key, a few percent of a (p,h) solve. It is filled in
// init: the fallbacks of (h,s) and (u,v) solve other pairs through Solve.
var pairTable [Quality + 1][Quality + 1]*pairSolver

func init() {
	for k, ps := range pairs() {
		pairTable[k[0]][k[1]] = ps
	}
}

func pairs() map[[2]Quantity]*pairSolver {
	return map[[2]Quantity]*pairSolver{
		{Pressure, Enthalpy}: isobarPair(Enthalpy),
		{Pressure, Entropy}:  isobarPair(Entropy),
		{Pressure, Volume}: {q1: Pressure, q2: Volume, tolFactor: 1, steps: 12, cands: []candidate{
			{1, startPV1}, {3, startPV3}, {5, startPV5}, {2, startPV2}},
			unique: uniquePV, fallback: fallbackPV},
		{Temperature, Volume}: {q1: Temperature, q2: Volume, tolFactor: 1, steps: 12, cands: []candidate{
			{1, startTV1}, {3, startTV3}, {2, startTV2}, {5, startTV5}},
			fallback: fallbackTV},
		{Temperature, Enthalpy}: {q1: Temperature, q2: Enthalpy, fallback: searchTQ},
		{Temperature, Entropy}:  {q1: Temperature, q2: Entropy, fallback: searchTQ},
		// (∂h/∂p)_s = v is small in cold liquid, so h and s together pin p
		// only at a residual tolerance 1e-3 of the plain one (see newton).
		{Enthalpy, Entropy}: {q1: Enthalpy, q2: Entropy, tolFactor: 1e-3, steps: 20, cands: []candidate{
			{1, startHS1}, {3, startHS3}, {2, startHS2}, {5, startHS5}},
			fallback: fallbackHS},
		{Volume, InternalEnergy}: {q1: Volume, q2: InternalEnergy, tolFactor: 1, steps: 20, cands: []candidate{
			{3, startUV3}, {1, startUV1}, {5, startUV5}, {2, startUV2}},
			fallback: fallbackUV},
	}
}

// isobarPair is the data of (p,h) and (p,s): q rises with T along every
// isobar, the starts are the backward equations T(p,h), T(p,s) of
// R7-97(2012) (regions 1 and 2, region 2's continued past 1073.15 K for
// region 5) and SR3-03(2014) (region 3).
func isobarPair(q Quantity) *pairSolver {
	// The span of q over each Gibbs region (regionSpans) gates its start
	// before the backward equation is evaluated: most values lie outside
	// all but one region's span, and a gate is a comparison where a
	// backward equation is a polynomial of some forty terms.
	sp := regionSpans
	span := [6][2]float64{1: {math.Inf(-1), sp.s1Max}, 2: {sp.s2Min, math.Inf(1)}, 5: {sp.s5Min, math.Inf(1)}}
	if q == Enthalpy {
		span = [6][2]float64{1: {math.Inf(-1), sp.h1Max}, 2: {sp.h2Min, sp.h2Max}, 5: {sp.h5Min, math.Inf(1)}}
	}
	gibbs := func(r int) func(p, val float64) (float64, float64, bool) {
		lo, hi := span[r][0], span[r][1]
		return func(p, val float64) (float64, float64, bool) {
			if val < lo || val > hi {
				return 0, 0, false
			}
			br := r
			if r == 5 {
				br = 2
			}
			T := backwardT(br, p, q, val)
			if r == 5 {
				// Region 2's equation run wild on a region-3 value can
				// land above 1073.15 K.
				T = math.Min(T, TMaxHigh)
			}
			return p, T, nearRegion(r, p, T)
		}
	}
	// Chosen once here: evaluating the (p,h) equations and then replacing
	// them with the (p,s) ones was 7 % of a (p,s) solve in its profile.
	tOf, vOf := if97.Region3TFromPH, if97.Region3VFromPH
	if q == Entropy {
		tOf, vOf = if97.Region3TFromPS, if97.Region3VFromPS
	}
	three := func(p, val float64) (float64, float64, bool) {
		T, v := tOf(p, val), vOf(p, val)
		return 1 / v, T, v > 0 && nearRegion(3, p, T)
	}
	return &pairSolver{q1: Pressure, q2: q, quick: true, tolFactor: 1, steps: 8,
		cands:    []candidate{{1, gibbs(1)}, {2, gibbs(2)}, {5, gibbs(5)}, {3, three}},
		fallback: func(p, val float64, _ given) (State, error) { return fallbackPQ(p, q, val) }}
}

// nearRegion reports whether (p, T) lies in region r or within
// startMarginK of it in T.
func nearRegion(r int, p, T float64) bool {
	if !(T > 0) || math.IsInf(T, 0) {
		return false
	}
	return if97.RegionOf(p, T) == r || if97.RegionOf(p, T-startMarginK) == r || if97.RegionOf(p, T+startMarginK) == r
}

// regionSpans are the extreme values of v and s over each region,
// computed once from the equations at the corners of the regions
// (R7-97(2012) Fig. 1) where the extremes lie: v and s rise with T along
// an isobar and fall with p along an isotherm above 277 K, so region 1's
// largest v and s are those of saturated liquid at 623.15 K; region 2's
// and region 5's smallest v are at their highest pressure and lowest
// temperature (100 MPa on the B23 line, 50 MPa at 1073.15 K); region 3
// spans the densities from its 100 MPa, 623.15 K corner to saturated
// vapour at 623.15 K, and its entropies start at that corner.
//
// The entropies where regions 2 and 3 meet come from the B23 line itself
// (R7-97(2012) Eq. 5), which bounds region 3 above and region 2 below in
// T: along it s is not monotonic (it rises from 5.211 kJ/(kg·K) at
// 623.15 K to 5.261 near 644 K and 19.1 MPa, falls to 5.048 near 777 K
// and 56.6 MPa, and rises to 5.098 at 863.15 K), so region 2's smallest
// s and region 3's largest are the extremes of a scan of the line in 1 K
// steps (s is smooth there: the scan's extremes are within 2e-7
// kJ/(kg·K) of those of a scan in 0.01 K steps), together with saturated
// vapour at 623.15 K, where region 2's saturation edge meets the line (s
// of saturated vapour falls as T rises, so that end is the edge's
// lowest). TestRegionSpansHoldTheirStates checks every span.
//
// Each extreme is widened by IF97's consistency at the region boundaries
// (R7-97(2012) section 4, as recalled: |Δv/v| ≤ 0.05 %, |Δs| ≤
// 0.2 J/(kg·K)), since the neighbouring region's equation gives the
// corner within that.
//
// Region 5's smallest h is at that corner too, and region 2's largest h
// at 1073.15 K and p → 0 (h rises as p falls along every isotherm of
// region 2), taken at region 2's lowest pressure in the solves, 1e-9 MPa.
//
// h rises with T along every isobar, so each region's smallest h lies on
// its lower edge in T and its largest on its upper edge. Region 1's
// largest h is that of saturated liquid at 623.15 K: along the 623.15 K
// isotherm h falls with p from there ((∂h/∂p)_T = v(1 − Tαv) < 0 while
// Tαv > 1) and reaches only 1554 kJ/kg at 100 MPa, against 1671 kJ/kg at
// the corner (a scan of the isotherm in 10 000 steps of p finds nothing
// larger); both corners are taken. Region 2's smallest h lies on its
// lower edge: saturated vapour, whose h has its one maximum near 3 MPa
// (from memory), is lowest at one end of the line, at 273.15 K
// (2501 kJ/kg) or 623.15 K (2564 kJ/kg); the B23 line rises in h from its
// 623.15 K end, and below the triple-point pressure h at 273.15 K rises as
// p falls (scans of both lines in 10 000 steps); both ends are taken.
var regionSpans = func() (sp struct{ v1Max, v2Min, v3Min, v3Max, v5Min, s1Max, s2Min, s3Min, s3Max, s5Min, h1Max, h2Min, h2Max, h5Min float64 }) {
	const dv, ds = 5e-4, 2e-4 // relative in v; kJ/(kg·K) in s
	tb := if97.B23Temperature(PMax)
	l, g := if97.Region1(P13Sat, T13), if97.Region2(P13Sat, T13)
	c1 := if97.Region1(PMax, T13)
	c2 := if97.Region2(PMax, tb)
	c5 := if97.Region5(PMaxHigh, TMax)
	sp.v1Max, sp.s1Max = l.V*(1+dv), l.S+ds
	sB23Min, sB23Max := g.S, g.S
	for T := T13; T <= tb; T++ {
		s := if97.Region2(if97.B23Pressure(T), T).S
		sB23Min, sB23Max = math.Min(sB23Min, s), math.Max(sB23Max, s)
	}
	sp.v2Min, sp.s2Min = c2.V*(1-dv), math.Min(c2.S, sB23Min)-ds
	sp.v3Min, sp.v3Max = c1.V*(1-dv), g.V*(1+dv)
	sp.s3Min, sp.s3Max = c1.S-ds, sB23Max+ds
	sp.v5Min, sp.s5Min = c5.V*(1-dv), c5.S-ds
	const dh = 0.2 // kJ/kg, IF97's consistency in h at the boundaries, as recalled
	sp.h5Min, sp.h2Max = c5.H-dh, if97.Region2(1e-9, TMax).H+dh
	sp.h1Max = math.Max(l.H, c1.H) + dh
	sp.h2Min = math.Min(if97.Region2(PMinSat, TMin).H, g.H) - dh
	return sp
}()

// P13Sat is the saturation pressure at 623.15 K, where the saturation line
// leaves regions 1 and 2 for region 3 (about 16.529 MPa), R7-97(2012) Eq. 30.
var P13Sat = if97.SatPressure(T13)

// Starts of (p,v): v rises with T along an isobar (but in cold liquid).
func startPV1(p, v float64) (float64, float64, bool) {
	// v is convex in T in the liquid: steps from the top of region 1 at p
	// approach from above.
	top := T13
	if p <= P13Sat {
		top = if97.SatTemperature(p)
	}
	return p, top, v <= regionSpans.v1Max && p >= PMinSat
}

func startPV3(p, v float64) (float64, float64, bool) {
	ok := p > if97.B23Pressure(T13) && v >= regionSpans.v3Min && v <= regionSpans.v3Max
	return 1 / v, (T13 + if97.B23Temperature(p)) / 2, ok
}

func startPV5(p, v float64) (float64, float64, bool) {
	tIdeal := p * v * mpaM3 / if97.R
	return p, math.Max(TMax+1, math.Min(tIdeal, TMaxHigh)), p <= PMaxHigh && v >= regionSpans.v5Min && tIdeal > TMax
}

func startPV2(p, v float64) (float64, float64, bool) {
	lo := TMin
	switch {
	case p > P13Sat:
		lo = if97.B23Temperature(p)
	case p >= PMinSat:
		lo = if97.SatTemperature(p)
	}
	return p, math.Max(lo, math.Min(TMax, p*v*mpaM3/if97.R)), v >= regionSpans.v2Min
}

// uniquePV: a liquid v fits two temperatures where it is below its value
// at 273.15 K (the density maximum lies between, αv = 0); the fallback
// reports those. Above it, and on the rising side (αv > 0), one only.
func uniquePV(r int, pr if97.Props, p, v float64) bool {
	return r != 1 || pr.AlphaV > 0 && v > if97.Region1(p, TMin).V
}

// Starts of (T,v): v falls with p along every isotherm.
func startTV1(T, v float64) (float64, float64, bool) {
	// Mid-range of region 1's pressures at T: v is nearly linear in p.
	return (if97.SatPressure(T) + PMax) / 2, T, T <= T13 && v <= regionSpans.v1Max
}

func startTV3(T, v float64) (float64, float64, bool) {
	// ρ and T are region 3's own variables: the solve is one evaluation.
	return 1 / v, T, T >= T13 && T <= if97.B23Temperature(PMax) && v >= regionSpans.v3Min && v <= regionSpans.v3Max
}

func startTV2(T, v float64) (float64, float64, bool) {
	top := PMax
	switch {
	case T <= T13:
		top = if97.SatPressure(T)
	case T <= if97.B23Temperature(PMax):
		top = if97.B23Pressure(T)
	}
	return math.Min(if97.R*T/(mpaM3*v), top), T, T <= TMax && v >= regionSpans.v2Min
}

func startTV5(T, v float64) (float64, float64, bool) {
	return math.Min(if97.R*T/(mpaM3*v), PMaxHigh), T, T > TMax && v >= regionSpans.v5Min
}
