package fn

import (
	"math"
	"strconv"
	"strings"

	"steamcell/fn/if97"
)

// checkT checks a temperature given as an input.
func checkT(T float64) error {
	switch {
	case T < TMin:
		return outOfRange(Temperature, T, TMin, "T below {0}", fig(Temperature, TMin))
	case T > TMaxHigh:
		return outOfRange(Temperature, T, TMaxHigh, "T above {0}", fig(Temperature, TMaxHigh))
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

// fallbackTV solves (T, v) along the isotherm. Along an isotherm v falls
// as p rises ((∂v/∂p)_T < 0 for every stable state), so the answer is
// unique: the stretch whose end values hold v gets a bracketed solve in
// ln p; region 3, where ρ and T are the equation's own variables, needs
// none.
func fallbackTV(T, v float64, g given) (State, error) {
	gv := g[1]
	if err := checkT(T); err != nil {
		return State{}, err
	}
	pTop := pMaxAtT(T)
	tooDense := func() error {
		vmin := quantityAt(Volume, pTop, T)
		return volumeOutOfRange(gv, vmin, true, "its value at {1} and T = {2}", fig(Pressure, pTop), fig(Temperature, T))
	}
	denseOK := func() bool { return v >= quantityAt(Volume, pTop, T)-edgeTol(Volume, v) }
	if T < if97.Tc {
		sat, ok := saturationAt(T)
		if !ok {
			return State{}, solverFailed("saturated densities in region 3")
		}
		switch st, ok := onLine(sat, Volume, v); {
		case ok:
			return st, nil
		case T <= T13 && v < sat.Liquid.V:
			if !denseOK() {
				return State{}, tooDense()
			}
			return solvedAtT(1, T, Volume, v, sat.P, pTop)
		case T <= T13:
			return solvedAtT(2, T, Volume, v, 0, sat.P)
		}
	}
	if !denseOK() {
		return State{}, tooDense()
	}
	switch {
	case T > TMax:
		return solvedAtT(5, T, Volume, v, 0, pTop)
	case T > if97.B23Temperature(PMax):
		return solvedAtT(2, T, Volume, v, 0, pTop)
	}
	// 623.15 K < T ≤ 863.15 K: region 3 above the B23 line, where p follows
	// from ρ directly, region 2 below it.
	pb := if97.B23Pressure(T)
	pr := if97.Region3(1/v, T)
	switch {
	case pr.P > pTop*(1+1e-12) || pr.P >= pb && !region3Dense(&pr): // 1e-12: p at the top, to the rounding of v
		return State{}, tooDense()
	case pr.P >= pb:
		if !stable3(&pr) {
			// Between the saturated densities: the mixture, placed above
			// (onLine); only rounding at its ends gets here.
			return State{}, solverFailed("region-3 state at (T, v) inside the saturation dome")
		}
		return singleState(3, pr), nil
	}
	if v2 := if97.Region2(pb, T).V; v < v2 && pr.KappaT > 0 {
		// v lies between region 2's value on the B23 line and region 3's
		// (their equations agree there only within IF97's consistency):
		// the boundary state, from region 3's own variables, continued
		// just below the line.
		s := singleState(3, pr)
		s.Warnings = append(s.Warnings, note("this value lies between the values that the equations of IF97 regions 2 and 3 give on their boundary at {0}; region 3's equation is continued to {1}, within the consistency IF97 states for the two",
			fig(Pressure, pb), fig(Pressure, pr.P)))
		return s, nil
	}
	return solvedAtT(2, T, Volume, v, 0, pb)
}

// solvedAtT solves q(p, T) = val for p in (pLo, pHi] in the Gibbs region r
// at fixed T and returns the state. q must be monotonic in p there.
func solvedAtT(r int, T float64, q Quantity, val, pLo, pHi float64) (State, error) {
	pr, ok := solveAtT(r, T, q, val, pLo, pHi)
	if !ok {
		return State{}, solverFailed("bracketed solve in p at fixed T in region " + string(rune('0'+r)))
	}
	return singleState(r, pr), nil
}

// solveAtT solves q(p, T) = val for p in (pLo, pHi] in Gibbs region r by a
// bracketed Newton solve in ln p.
func solveAtT(r int, T float64, q Quantity, val, pLo, pHi float64) (if97.Props, bool) {
	lo := math.Log(math.Max(pLo, 1e-12))
	if q == Volume && r != 1 {
		// A vapour rarer than 1e-12 MPa: the ideal gas bounds it, its
		// pressure is within a part in 1e9 of R T/v there.
		lo = math.Min(lo, math.Log(if97.R*T/(mpaM3*val)/2))
	}
	hi := math.Log(pHi)
	f := func(lp float64) (float64, float64) {
		p := math.Exp(lp)
		pr := eval(r, p, T)
		dp, _ := partials(q, r, &pr)
		return value(q, &pr) - val, dp * p
	}
	x0 := (lo + hi) / 2
	if q == Volume && r != 1 {
		x0 = math.Max(lo, math.Min(hi, math.Log(if97.R*T/(mpaM3*val)))) // the ideal-gas pressure
	}
	flo, _ := f(lo)
	fhi, _ := f(hi)
	lp, ok := rootBracketed(f, lo, hi, flo, fhi, x0, 1e-15)
	if !ok {
		return if97.Props{}, false
	}
	return eval(r, math.Exp(lp), T), true
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

// searchTQ solves (T, h) or (T, s), the pairs with no candidates: along an isotherm neither need be monotonic (h rises with p in cold
// liquid and falls in hot; s rises with p in water below about 277 K, where
// its expansion coefficient is negative), so each stretch of the isotherm
// is sampled and every crossing refined; two or more answers are refused
// with ErrTwoSolutions, naming them.
func searchTQ(T, val float64, g given) (State, error) {
	q := g[1].Q
	if err := checkT(T); err != nil {
		return State{}, err
	}
	bs, sat, ok := isothermBranches(T)
	if !ok {
		return State{}, solverFailed("the isotherm's stretches in region 3")
	}
	if q == Entropy && T >= tSFallsWithP {
		if st, ok := fromTSFalling(T, val, bs, sat); ok {
			return st, nil
		}
	}
	return searchIsotherm(T, q, val, bs, sat)
}

// searchIsotherm is searchTQ's general search: every stretch of the isotherm
// sampled, every crossing refined.
func searchIsotherm(T float64, q Quantity, val float64, bs []branch, sat *Saturation) (State, error) {
	var found []State
	if sat != nil {
		if st, ok := onLine(*sat, q, val); ok {
			found = append(found, st)
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
	if st, ok := atIsothermEnd(T, q, val, bs); ok && !seen(found, st.P) {
		found = append(found, st)
	}
	if len(found) == 0 {
		if st, ok := bridgeOnIsotherm(T, q, val, bs); ok {
			return st, nil
		}
	}
	switch len(found) {
	case 0:
		if val >= qMin && val <= qMax {
			return State{}, solverFailed("search along the isotherm")
		}
		return State{}, outOfRangeAlongIsotherm(q, val, T, qMin, qMax)
	case 1:
		return found[0], nil
	}
	figs := []Figure{fig(Temperature, T), fig(q, val)}
	var alts []Figure
	var names []string
	for i, s := range found {
		p := math.Min(s.P, pMaxAtT(T)) // a root at the top of the range, to rounding
		alts = append(alts, fig(Pressure, p))
		figs = append(figs, fig(Pressure, p))
		names = append(names, "p = {"+strconv.Itoa(i+2)+"} ("+s.Phase.String()+")")
	}
	return State{}, &InputError{Input: "t," + q.Symbol(), Pair: true, Kind: ErrTwoSolutions, Alternatives: alts,
		Detail: note("at T = {0}, "+q.Symbol()+" = {1} fits "+strings.Join(names, " and ")+"; give p instead of T", figs...)}
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
// stretch, a failed solve), and searchTQ's general search decides.
func fromTSFalling(T, val float64, bs []branch, sat *Saturation) (State, bool) {
	if sat != nil {
		if st, ok := onLine(*sat, Entropy, val); ok {
			return st, true
		}
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

// atIsothermEnd returns the state at the top end of the isotherm (its
// highest pressure) if its q is val within the solve's tolerance: the
// samples on the collapsed equation can miss a root that rounding puts
// just outside the range, or right on its end.
func atIsothermEnd(T float64, q Quantity, val float64, bs []branch) (State, bool) {
	b := bs[len(bs)-1]
	pr := eval(b.r, b.hi, T)
	if math.Abs(value(q, &pr)-val) <= resTol(q, val) && accept(b.r, &pr) {
		return singleState(b.r, pr), true
	}
	return State{}, false
}

// bridgeOnIsotherm returns the state where val falls in the gap between
// the values of two neighbouring stretches of the isotherm at their common
// boundary (regions 2 and 3 on the B23 line, whose equations agree there
// only within IF97's consistency; see fallbackIsobar): the lower
// stretch's equation continued past its top by Newton steps at fixed T.
func bridgeOnIsotherm(T float64, q Quantity, val float64, bs []branch) (State, bool) {
	for i := 0; i+1 < len(bs); i++ {
		b, next := bs[i], bs[i+1]
		top, bottom := eval(b.r, b.hi, T), eval(next.r, next.lo, T)
		qt, qb := value(q, &top), value(q, &bottom)
		tol := resTol(q, val)
		if !(val >= math.Min(qt, qb)-tol && val <= math.Max(qt, qb)+tol) || b.r == next.r {
			continue
		}
		pr, ok := newton(b.r, Temperature, T, q, val, b.hi, T, maxNewtonSteps, 1)
		if !ok || math.Abs(pr.P/top.P-1) > 1e-3 {
			continue
		}
		s := singleState(b.r, pr)
		s.Warnings = append(s.Warnings, note("this value lies between the values that the equations of two neighbouring IF97 regions give at their boundary at {0}; region "+strconv.Itoa(b.r)+"'s equation is continued to {1}, within the consistency IF97 states for the two",
			fig(Pressure, top.P), fig(Pressure, pr.P)))
		return s, true
	}
	return State{}, false
}

// seen reports whether a state at pressure p is already in found (the same
// state reached from two regions at their common boundary, or a saturated
// phase reached from its single-phase side too).
func seen(found []State, p float64) bool {
	for _, s := range found {
		if math.Abs(s.P-p) <= 1e-8*p {
			return true
		}
	}
	return false
}

func outOfRangeAlongIsotherm(q Quantity, val, T, qMin, qMax float64) error {
	if val > qMax {
		return outOfRange(q, val, qMax, q.Symbol()+" above {0}, its highest value along the isotherm T = {1} within the range of validity",
			fig(q, qMax), fig(Temperature, T))
	}
	return outOfRange(q, val, qMin, q.Symbol()+" below {0}, its lowest value along the isotherm T = {1} within the range of validity",
		fig(q, qMin), fig(Temperature, T))
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
