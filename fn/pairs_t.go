package fn

import (
	"fmt"
	"math"
	"strings"

	"steamcell/fn/if97"
)

// checkT checks a temperature given as an input.
func checkT(T float64) error {
	switch {
	case T < TMin:
		return outOfRange(Temperature, T, TMin, "T below %g K", TMin)
	case T > TMaxHigh:
		return outOfRange(Temperature, T, TMaxHigh, "T above %g K", TMaxHigh)
	}
	return nil
}

// checkV checks a specific volume given as an input.
func checkV(v float64) error {
	if v <= 0 {
		return outOfRange(Volume, v, 0, "v must be above 0 m³/kg")
	}
	return nil
}

// pMaxAtT is the highest pressure of the range of validity at T.
func pMaxAtT(T float64) float64 {
	if T > TMax {
		return PMaxHigh
	}
	return PMax
}

// fromTV returns the state at temperature T and specific volume v. Along an
// isotherm v falls as p rises ((∂v/∂p)_T < 0 for every stable state), so the
// answer is unique.
func fromTV(T, v float64) (State, error) {
	if err := checkT(T); err != nil {
		return State{}, err
	}
	if err := checkV(v); err != nil {
		return State{}, err
	}
	if st, ok := fastTV(T, v); ok {
		return st, nil
	}
	pTop := pMaxAtT(T)
	tooDense := func() error {
		vmin := quantityAt(Volume, pTop, T)
		return outOfRange(Volume, v, vmin, "v below %.8g m³/kg, its value at %g MPa and T = %g K", vmin, pTop, T)
	}
	denseOK := func() bool { return v >= quantityAt(Volume, pTop, T) }
	if T < if97.Tc {
		sat, ok := saturationAt(T)
		if !ok {
			return State{}, noConvergence("t,v")
		}
		vl, vv := sat.Liquid.V, sat.Vapour.V
		switch {
		case v >= vl && v <= vv:
			return mixture(sat, quality(vl, vv, v)), nil
		case T <= T13 && v < vl:
			if !denseOK() {
				return State{}, tooDense()
			}
			return solvedAtT(1, T, Volume, v, sat.P, pTop)
		case T <= T13:
			return solvedAtT(2, T, Volume, v, 0, sat.P)
		}
	}
	switch {
	case T > TMax:
		if !denseOK() {
			return State{}, tooDense()
		}
		return solvedAtT(5, T, Volume, v, 0, pTop)
	case T > if97.B23Temperature(PMax):
		if !denseOK() {
			return State{}, tooDense()
		}
		return solvedAtT(2, T, Volume, v, 0, pTop)
	}
	// 623.15 K < T ≤ 863.15 K: region 3 above the B23 line, where p follows
	// from ρ directly, region 2 below it.
	pb := if97.B23Pressure(T)
	pr := if97.Region3(1/v, T)
	switch {
	case pr.P > pTop || pr.P >= pb && !region3Dense(&pr):
		return State{}, tooDense()
	case pr.P >= pb:
		return singleState(3, pr), nil
	}
	return solvedAtT(2, T, Volume, v, 0, pb)
}

// fastTV tries (T, v) in regions 1 and 2 up to 623.15 K by Newton steps in
// p from a start that needs no evaluation (p just above ps(T) for liquid,
// the ideal-gas pressure for vapour), and accepts the answer by which side
// of ps(T) it lies on: v falls as p rises along an isotherm, so that settles
// the phase. Anything else goes to the exact path.
func fastTV(T, v float64) (State, bool) {
	if T < TMin || T > T13 || !(v > 0) {
		return State{}, false
	}
	ps := if97.SatPressure(T)
	if v < 0.0025 { // liquid-like; vc = 0.0031 m³/kg
		pr, ok := newton1n(1, Volume, v, math.Min(ps+1, PMax), T, false, 12)
		if ok && pr.P > ps && pr.P <= PMax {
			return singleState(1, pr), true
		}
		return State{}, false
	}
	p0 := math.Min(if97.R*T/(mpaM3*v), ps)
	pr, ok := newton1n(2, Volume, v, p0, T, false, 12)
	if ok && pr.P < ps && pr.P > 0 {
		return singleState(2, pr), true
	}
	return State{}, false
}

// solvedAtT solves q(p, T) = val for p in (pLo, pHi] in the Gibbs region r
// at fixed T and returns the state. q must be monotonic in p there.
func solvedAtT(r int, T float64, q Quantity, val, pLo, pHi float64) (State, error) {
	pr, ok := solveAtT(r, T, q, val, pLo, pHi)
	if !ok {
		return State{}, noConvergence("t," + q.Symbol())
	}
	return singleState(r, pr), nil
}

// solveAtT solves q(p, T) = val for p in (pLo, pHi] in Gibbs region r by a
// bracketed Newton solve in ln p; the start is the ideal-gas pressure for v
// in the vapour regions.
func solveAtT(r int, T float64, q Quantity, val, pLo, pHi float64) (if97.Props, bool) {
	lo := math.Log(math.Max(pLo, 1e-12))
	hi := math.Log(pHi)
	f := func(lp float64) (float64, float64) {
		p := math.Exp(lp)
		pr := eval(r, p, T)
		dp, _ := partials(q, r, &pr)
		return value(q, &pr) - val, dp * p
	}
	x0 := (lo + hi) / 2
	if q == Volume && r != 1 {
		x0 = math.Log(if97.R * T / (mpaM3 * val))
		// Newton steps from the ideal-gas pressure usually get there
		// without the bracket's two end evaluations.
		if p0 := math.Exp(x0); p0 > pLo && p0 < pHi {
			if pr, ok := newton1n(r, q, val, p0, T, false, 12); ok && pr.P > pLo && pr.P <= pHi {
				return pr, true
			}
		}
	}
	flo, _ := f(lo)
	fhi, _ := f(hi)
	lp, ok := rootBracketed(f, lo, hi, flo, fhi, x0, 1e-15)
	if !ok {
		return if97.Props{}, false
	}
	return eval(r, math.Exp(lp), T), true
}

func noConvergence(pair string) error {
	return &InputError{Input: pair, Pair: true, Kind: ErrNoSolution,
		Detail: "the solve did not converge; please report these inputs"}
}

// branch is a stretch of an isotherm inside one region: the native variable
// a (p for regions 1, 2 and 5, ρ for region 3) runs from lo to hi.
type branch struct {
	r      int
	lo, hi float64
	log    bool // sample a on a log scale
}

// isothermBranches returns the single-phase stretches of the isotherm T
// inside the range of validity, and the saturation state if T < Tc.
func isothermBranches(T float64) ([]branch, *Saturation, bool) {
	pTop := pMaxAtT(T)
	const pFloor = 1e-12 // MPa: states at lower pressure are not searched
	switch {
	case T > TMax:
		return []branch{{5, pFloor, pTop, true}}, nil, true
	case T <= T13:
		sat, ok := saturationAt(T)
		return []branch{{2, pFloor, sat.P, true}, {1, sat.P, pTop, true}}, &sat, ok
	case T > if97.B23Temperature(PMax):
		return []branch{{2, pFloor, pTop, true}}, nil, true
	}
	pb := if97.B23Pressure(T)
	rhoB, ok1 := region3Density(pb, T)
	rhoTop, ok2 := region3Density(pTop, T)
	bs := []branch{{2, pFloor, pb, true}}
	if T >= if97.Tc {
		return append(bs, branch{3, rhoB, rhoTop, false}), nil, ok1 && ok2
	}
	sat, ok := saturationAt(T)
	if sat.Vapour.Rho > rhoB {
		bs = append(bs, branch{3, rhoB, sat.Vapour.Rho, false})
	}
	return append(bs, branch{3, sat.Liquid.Rho, rhoTop, false}), &sat, ok && ok1 && ok2
}

// fromTQ returns the state at temperature T and q = in.Value, q being h or
// s. Along an isotherm neither need be monotonic (h rises with p in cold
// liquid and falls in hot; s rises with p in water below about 277 K, where
// its expansion coefficient is negative), so each stretch of the isotherm
// is sampled and every crossing refined; two or more answers are refused
// with ErrTwoSolutions, naming them.
func fromTQ(T float64, in Input) (State, error) {
	q, val := in.Q, in.Value
	if err := checkT(T); err != nil {
		return State{}, err
	}
	bs, sat, ok := isothermBranches(T)
	if !ok {
		return State{}, noConvergence("t," + q.Symbol())
	}
	if q == Entropy && T >= tSFallsWithP {
		if st, ok := fromTSFalling(T, val, bs, sat); ok {
			return st, nil
		}
	}
	return searchIsotherm(T, q, val, bs, sat)
}

// searchIsotherm is fromTQ's general search: every stretch of the isotherm
// sampled, every crossing refined.
func searchIsotherm(T float64, q Quantity, val float64, bs []branch, sat *Saturation) (State, error) {
	var found []State
	if sat != nil {
		ql, qv := value(q, &sat.Liquid), value(q, &sat.Vapour)
		if val >= ql && val <= qv {
			found = append(found, mixture(*sat, quality(ql, qv, val)))
		}
	}
	qMin, qMax := math.Inf(1), math.Inf(-1)
	for _, b := range bs {
		// The samples and the bracketed solves run on the region's
		// equation collapsed to the isotherm (if97.Isotherm, the same
		// values to rounding at a tenth of the cost); each root is then
		// polished on the full equation.
		it := isothermOf(b.r, T, q)
		f := func(a float64) float64 { return it.At(a) - val }
		for _, br := range crossings(f, b.lo, b.hi, b.log, &qMin, &qMax) {
			a, ok := rootBrent(f, br[0], br[1], f(br[0]), f(br[1]), 1e-15)
			if !ok {
				continue
			}
			pr := polishOnIsotherm(b, q, val, a, br, T)
			if !seen(found, pr.P) {
				found = append(found, singleState(b.r, pr))
			}
		}
	}
	qMin, qMax = qMin+val, qMax+val
	switch len(found) {
	case 0:
		return State{}, outOfRangeAlongIsotherm(q, val, T, qMin, qMax)
	case 1:
		return found[0], nil
	}
	var alts []string
	var ps []float64
	for _, s := range found {
		alts = append(alts, fmt.Sprintf("p = %.6g MPa (%s)", s.P, s.Phase))
		ps = append(ps, s.P)
	}
	return State{}, &InputError{Input: "t," + q.Symbol(), Pair: true, Kind: ErrTwoSolutions, Alternatives: ps,
		Detail: fmt.Sprintf("at T = %g K, %s = %g %s fits %s; give p instead of T", T, q.Symbol(), val, q.BaseUnit(), strings.Join(alts, " and "))}
}

// isothermOf returns h or s of region r along the isotherm T.
func isothermOf(r int, T float64, q Quantity) if97.Isotherm {
	if q == Entropy {
		return if97.NewIsotherm(r, T, if97.IsothermEntropy)
	}
	return if97.NewIsotherm(r, T, if97.IsothermEnthalpy)
}

// polishOnIsotherm returns the state on stretch b of the isotherm T where
// q = val, from a root a found on the collapsed equation inside the
// bracket br: a safeguarded Newton solve on the full equation from a, kept
// inside br, to the same tolerance as the bracketed solve on the full
// equation would reach. Where the isotherm is nearly flat (s of water near
// its density maximum), rounding moves the root by more than the Newton
// steps' tolerance allows, and the solve falls back on bisection of br.
func polishOnIsotherm(b branch, q Quantity, val, a float64, br [2]float64, T float64) if97.Props {
	f := func(x float64) (float64, float64) {
		pr := eval(b.r, x, T)
		da, _ := partials(q, b.r, &pr)
		return value(q, &pr) - val, da
	}
	flo, _ := f(br[0])
	fhi, _ := f(br[1])
	if x, ok := rootBracketed(f, br[0], br[1], flo, fhi, a, 1e-15); ok {
		a = x
	}
	return eval(b.r, a, T)
}

// tSFallsWithP is the temperature, K, above which s falls with rising p
// (and ρ) along the whole isotherm inside IF97's range:
// (∂s/∂p)_T = −v αv, and αv < 0 only in liquid water colder than its
// density maximum, 277.13 K at 0.1 MPa and lower at higher pressures
// (common knowledge of the trade, no source; TestEntropyFallsWithPressure
// checks αv > 0 on a grid of region 1 from here up).
const tSFallsWithP = 278.0

// fromTSFalling solves (T, s) where s falls along every stretch of the
// isotherm (T ≥ tSFallsWithP), so at most one state fits: the mixture if s
// lies between s' and s”, else the one stretch whose end values enclose
// s, solved by Brent's method in ln p (or ρ) on the equation collapsed to
// the isotherm and polished on the full equation (polishOnIsotherm).
// It reports false where that does not settle the answer (s outside every
// stretch, a failed solve), and fromTQ's general search decides.
func fromTSFalling(T, val float64, bs []branch, sat *Saturation) (State, bool) {
	if sat != nil && val >= sat.Liquid.S && val <= sat.Vapour.S {
		return mixture(*sat, quality(sat.Liquid.S, sat.Vapour.S, val)), true
	}
	for _, b := range bs {
		it := isothermOf(b.r, T, Entropy)
		f := func(x float64) float64 {
			if b.log {
				x = math.Exp(x)
			}
			return it.At(x) - val
		}
		lo, hi := b.lo, b.hi
		if b.log {
			lo, hi = math.Log(lo), math.Log(hi)
		}
		flo, fhi := f(lo), f(hi)
		if !(flo >= 0 && fhi <= 0) {
			continue // s falls with a: this stretch holds val only if it lies between its end values
		}
		x, ok := rootBrent(f, lo, hi, flo, fhi, 1e-12)
		if !ok {
			return State{}, false
		}
		a := x
		if b.log {
			a = math.Exp(x)
		}
		pr := polishOnIsotherm(b, Entropy, val, a, [2]float64{b.lo, b.hi}, T)
		if math.Abs(pr.S-val) > resTol(Entropy, val) {
			return State{}, false
		}
		return singleState(b.r, pr), true
	}
	return State{}, false
}

// seen reports whether a state at pressure p is already in found (the same
// state reached from two regions at their common boundary).
func seen(found []State, p float64) bool {
	for _, s := range found {
		if math.Abs(s.P-p) <= 1e-9*p && !s.HasX {
			return true
		}
	}
	return false
}

func outOfRangeAlongIsotherm(q Quantity, val, T, qMin, qMax float64) error {
	lim, side := qMin, "below"
	if val > qMax {
		lim, side = qMax, "above"
	}
	return outOfRange(q, val, lim, "%s %s %.8g %s, its %s value along the isotherm T = %g K within the range of validity",
		q.Symbol(), side, lim, q.BaseUnit(), map[string]string{"below": "lowest", "above": "highest"}[side], T)
}

// crossings samples f on [lo, hi] (on a log scale if logScale) and returns
// brackets [a, b] with f(a)·f(b) ≤ 0, one per sign change. Where the samples
// show a local extremum, the extremum is located by golden-section search
// (Kiefer 1953) and, if f changes sign there, the interval is split at it,
// so that two roots between neighbouring samples are not missed. fMin and
// fMax are lowered and raised to the extreme values of f seen.
func crossings(f func(float64) float64, lo, hi float64, logScale bool, fMin, fMax *float64) [][2]float64 {
	const n = 64
	var xs, fs [n + 1]float64
	ratio := math.Pow(hi/lo, 1.0/n) // log scale: each sample this factor above the last
	for i := range xs {
		switch {
		case i == n:
			xs[i] = hi
		case logScale && i > 0:
			xs[i] = xs[i-1] * ratio
		case logScale:
			xs[i] = lo
		default:
			xs[i] = lo + (hi-lo)*float64(i)/n
		}
		fs[i] = f(xs[i])
	}
	// Refine each interior extremum into a point of its own.
	type pt struct{ x, f float64 }
	pts := make([]pt, 0, n+8)
	for i := range xs {
		pts = append(pts, pt{xs[i], fs[i]})
		if i == 0 || i == n {
			continue
		}
		isMin := fs[i] < fs[i-1] && fs[i] <= fs[i+1]
		isMax := fs[i] > fs[i-1] && fs[i] >= fs[i+1]
		if !isMin && !isMax {
			continue
		}
		sign := 1.0
		if isMax {
			sign = -1
		}
		xe := goldenMin(func(x float64) float64 { return sign * f(x) }, xs[i-1], xs[i+1])
		pts = append(pts, pt{xe, f(xe)})
	}
	sortPts := func() {
		for i := 1; i < len(pts); i++ {
			for j := i; j > 0 && pts[j].x < pts[j-1].x; j-- {
				pts[j], pts[j-1] = pts[j-1], pts[j]
			}
		}
	}
	sortPts()
	var out [][2]float64
	for i := range pts {
		*fMin, *fMax = math.Min(*fMin, pts[i].f), math.Max(*fMax, pts[i].f)
		if i == 0 {
			continue
		}
		a, b := pts[i-1], pts[i]
		if a.f == 0 && i > 1 {
			continue // counted as the end of the previous interval
		}
		if a.f*b.f <= 0 && a.x < b.x {
			out = append(out, [2]float64{a.x, b.x})
		}
	}
	return out
}

// goldenMin returns the x in [a, b] that minimises f, by golden-section
// search to a relative width of 1e-12.
func goldenMin(f func(float64) float64, a, b float64) float64 {
	const g = 0.6180339887498949 // (√5 − 1)/2
	c, d := b-g*(b-a), a+g*(b-a)
	fc, fd := f(c), f(d)
	for i := 0; i < 200 && b-a > 1e-12*math.Abs(b); i++ {
		if fc < fd {
			b, d, fd = d, c, fc
			c = b - g*(b-a)
			fc = f(c)
		} else {
			a, c, fc = c, d, fd
			d = a + g*(b-a)
			fd = f(d)
		}
	}
	return (a + b) / 2
}
