package uncertain

import (
	"fmt"
	"math"

	"steamcell/fn"
	"steamcell/fn/if97"
)

// CoverageK is the coverage factor of the intervals the checks use, k = 2
// (about 95 % for a normal distribution, JCGM 100:2008 6.3.3).
const CoverageK = 2

// LinearityLimit is how far, as a fraction of the result's expanded
// uncertainty 2u, a result evaluated at one input ± 2u may depart from the
// linear estimate before the estimate is called unreliable. It is our own
// criterion: JCGM 100:2008 5.1.2 asks for higher-order terms "if the
// nonlinearity of f is significant" without a number, and JCGM 101:2008
// section 8 validates by Monte Carlo, which this cheap check stands in for
// (the tests run the Monte Carlo and show the two agree where it passes).
const LinearityLimit = 0.1

// PhaseRisk says whether the k = 2 interval of a state reaches the
// saturation line.
type PhaseRisk struct {
	Uncertain bool
	// Margin is the distance from the line with its standard uncertainty:
	// T − Ts(p) in K for a single phase, the quality x in a mixture.
	Margin, U float64
	Text      string // the warning, when Uncertain
}

// Phase reports whether the state's phase is uncertain: whether the k = 2
// interval of T − Ts(p) (single phase below the critical pressure) or of x
// (on the saturation line) reaches the saturation line. Across the line h,
// s and v jump by their values of evaporation, so a linear estimate there
// means nothing.
func Phase(b *Budget, s *State) PhaseRisk {
	if s.Mixture {
		x, u := s.X.Value, b.U(s.X)
		if u == 0 || (x-CoverageK*u > 0 && x+CoverageK*u < 1) {
			return PhaseRisk{Margin: x, U: u}
		}
		side := "subcooled liquid"
		if x+CoverageK*u >= 1 && (x-CoverageK*u > 0 || x > 0.5) {
			side = "superheated vapour"
		}
		return PhaseRisk{Uncertain: true, Margin: x, U: u, Text: fmt.Sprintf(
			"phase uncertain: x = %.4g with U = %.2g (k = 2) reaches %s; the state may be %s, where h, s and v no longer follow x, so the uncertainties here are not reliable",
			x, CoverageK*u, map[bool]string{true: "x = 1", false: "x = 0"}[side == "superheated vapour"], side)}
	}
	p, T := s.State.P, s.State.T
	if p >= if97.Pc || p < fn.PMinSat || T >= if97.Tc {
		return PhaseRisk{}
	}
	sat, err := fn.SaturationAtP(p)
	if err != nil {
		return PhaseRisk{}
	}
	// dTs/dp, the inverse of the slope of R7-97(2012) Eq. 30, the one
	// saturation line.
	dTs := 1 / if97.SatPressureSlope(sat.T)
	m := Linear2(T-sat.T, s.T, 1, s.P, -dTs)
	u := b.U(m)
	if u == 0 || math.Abs(m.Value) > CoverageK*u {
		return PhaseRisk{Margin: m.Value, U: u}
	}
	other := "wet (a saturated mixture) or superheated"
	if m.Value > 0 {
		other = "wet (a saturated mixture) or compressed liquid"
	}
	return PhaseRisk{Uncertain: true, Margin: m.Value, U: u, Text: fmt.Sprintf(
		"phase uncertain: T − Ts = %.3g K with U = %.2g K (k = 2) reaches the saturation line (Ts = %.6g K); within the interval the state may be %s, where h, s and v jump, so the uncertainties here are not reliable",
		m.Value, CoverageK*u, sat.T, other)}
}

// Linearity re-evaluates a calculation at each raw input ± 2u(x) (the
// others at their values) and returns, for each result ys[j], the largest
// departure of the change from the linear estimate ±2u(x)·∂y/∂x, as a
// fraction of the result's expanded uncertainty 2u(y). eval computes the
// results' values from the raw inputs' values. A failed evaluation (the
// interval leaves the range of validity, or crosses into a state the
// calculation refuses) gives +Inf. A result with u = 0 gives 0.
func Linearity(b *Budget, ys []Number, eval func(x []float64) ([]float64, error)) []float64 {
	out := make([]float64, len(ys))
	uy := make([]float64, len(ys))
	for j, y := range ys {
		uy[j] = b.U(y)
	}
	x := append([]float64(nil), b.values...)
	for i, u := range b.u {
		if u == 0 {
			continue
		}
		for _, sign := range []float64{1, -1} {
			x[i] = b.values[i] + sign*CoverageK*u
			got, err := eval(x)
			for j, y := range ys {
				if uy[j] == 0 {
					continue
				}
				if err != nil || len(got) <= j || math.IsNaN(got[j]) {
					out[j] = math.Inf(1)
					continue
				}
				lin := sign * CoverageK * u * y.Sensitivity(i)
				out[j] = math.Max(out[j], math.Abs(got[j]-y.Value-lin)/(CoverageK*uy[j]))
			}
		}
		x[i] = b.values[i]
	}
	return out
}

// NonlinearText is the warning for results whose linear estimate fails
// the Linearity check.
func NonlinearText(names []string) string {
	return fmt.Sprintf("the linear (GUM) uncertainty of %s is unreliable here: over the k = 2 interval of the inputs the result departs from its linear estimate by more than %g of its expanded uncertainty (near the critical point or a boundary); a Monte Carlo propagation (JCGM 101:2008) is needed", joinNames(names), LinearityLimit)
}

func joinNames(names []string) string {
	switch len(names) {
	case 0:
		return ""
	case 1:
		return names[0]
	}
	s := names[0]
	for _, n := range names[1 : len(names)-1] {
		s += ", " + n
	}
	return s + " and " + names[len(names)-1]
}
