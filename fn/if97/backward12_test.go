package if97_test

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

// bw12TableRel is the relative tolerance for the computer-program
// verification tables of the backward releases: they print nine or ten
// significant digits, so a correct result may differ from the printed one by
// half a unit in the last digit, at most 5e-9 relative.
const bw12TableRel = 1e-8

// bw12GridPoints is the number of random states per sub-region in the
// forward–backward consistency checks.
const bw12GridPoints = 2000

// bw12Seed fixes the random states of the consistency checks so that every
// run checks the same points.
const bw12Seed = 97

func TestBackward12Region1TFromPH(t *testing.T) {
	// IAPWS R7-97(2012), Table 7.
	for _, tc := range []struct{ p, h, want float64 }{
		{3, 500, 0.391798509e3},
		{80, 500, 0.378108626e3},
		{80, 1500, 0.611041229e3},
	} {
		got := if97.Region1TFromPH(tc.p, tc.h)
		if !scalar.EqualWithinRel(got, tc.want, bw12TableRel) {
			t.Errorf("Region1TFromPH(p=%g MPa, h=%g kJ/kg) = %.9g K, want %.9g K", tc.p, tc.h, got, tc.want)
		}
	}
}

func TestBackward12Region1TFromPS(t *testing.T) {
	// IAPWS R7-97(2012), Table 9.
	for _, tc := range []struct{ p, s, want float64 }{
		{3, 0.5, 0.307842258e3},
		{80, 0.5, 0.309979785e3},
		{80, 3, 0.565899909e3},
	} {
		got := if97.Region1TFromPS(tc.p, tc.s)
		if !scalar.EqualWithinRel(got, tc.want, bw12TableRel) {
			t.Errorf("Region1TFromPS(p=%g MPa, s=%g kJ/(kg K)) = %.9g K, want %.9g K", tc.p, tc.s, got, tc.want)
		}
	}
}

func TestBackward12B2bc(t *testing.T) {
	// IAPWS R7-97(2012), section 6.3.1: check values of Eqs. 20 and 21,
	// p = 0.100000000e3 MPa and h = 0.3516004323e4 kJ/kg.
	const p, h = 0.100000000e3, 0.3516004323e4
	if got := if97.B2bcPressure(h); !scalar.EqualWithinRel(got, p, bw12TableRel) {
		t.Errorf("B2bcPressure(h=%.10g kJ/kg) = %.10g MPa, want %.10g MPa", h, got, p)
	}
	if got := if97.B2bcEnthalpy(p); !scalar.EqualWithinRel(got, h, bw12TableRel) {
		t.Errorf("B2bcEnthalpy(p=%.10g MPa) = %.10g kJ/kg, want %.10g kJ/kg", p, got, h)
	}
	// The two equations are inverses of each other along the whole boundary,
	// from the saturated-vapour end at 6.546699678 MPa (R7-97(2012),
	// section 6.3.1) up to 100 MPa.
	for p := 6.546699678; p <= 100; p += 0.5 {
		h := if97.B2bcEnthalpy(p)
		// The three terms of Eq. 20 (about 906, −1800 and +900 MPa) cancel to a
		// few MPa, so about three digits of round-off are lost.
		if got := if97.B2bcPressure(h); !scalar.EqualWithinRel(got, p, 1e-11) {
			t.Errorf("B2bcPressure(B2bcEnthalpy(p=%.10g MPa)) = %.10g MPa, want %.10g MPa", p, got, p)
		}
	}
	// Below pi = n5 the boundary has no real enthalpy.
	if got := if97.B2bcEnthalpy(4); !math.IsNaN(got) {
		t.Errorf("B2bcEnthalpy(p=4 MPa) = %g, want NaN", got)
	}
}

func TestBackward12Region2TFromPH(t *testing.T) {
	// IAPWS R7-97(2012), Table 24: rows 1–3 sub-region 2a, 4–6 2b, 7–9 2c.
	for _, tc := range []struct{ p, h, want float64 }{
		{0.001, 3000, 0.534433241e3},
		{3, 3000, 0.575373370e3},
		{3, 4000, 0.101077577e4},
		{5, 3500, 0.801299102e3},
		{5, 4000, 0.101531583e4},
		{25, 3500, 0.875279054e3},
		{40, 2700, 0.743056411e3},
		{60, 2700, 0.791137067e3},
		{60, 3200, 0.882756860e3},
	} {
		got := if97.Region2TFromPH(tc.p, tc.h)
		if !scalar.EqualWithinRel(got, tc.want, bw12TableRel) {
			t.Errorf("Region2TFromPH(p=%g MPa, h=%g kJ/kg) = %.9g K, want %.9g K", tc.p, tc.h, got, tc.want)
		}
	}
}

func TestBackward12Region2TFromPS(t *testing.T) {
	// IAPWS R7-97(2012), Table 29: rows 1–3 sub-region 2a, 4–6 2b, 7–9 2c.
	for _, tc := range []struct{ p, s, want float64 }{
		{0.1, 7.5, 0.399517097e3},
		{0.1, 8, 0.514127081e3},
		{2.5, 8, 0.103984917e4},
		{8, 6, 0.600484040e3},
		{8, 7.5, 0.106495556e4},
		{90, 6, 0.103801126e4},
		{20, 5.75, 0.697992849e3},
		{80, 5.25, 0.854011484e3},
		{80, 5.75, 0.949017998e3},
	} {
		got := if97.Region2TFromPS(tc.p, tc.s)
		if !scalar.EqualWithinRel(got, tc.want, bw12TableRel) {
			t.Errorf("Region2TFromPS(p=%g MPa, s=%g kJ/(kg K)) = %.9g K, want %.9g K", tc.p, tc.s, got, tc.want)
		}
	}
}

// bw12Region1State draws a random state of region 1 (R7-97(2012), section 4:
// 273.15 K ≤ T ≤ 623.15 K, psat(T) ≤ p ≤ 100 MPa). The pressure is spread
// with a square so that low pressures, where the backward equations are least
// tried, are not rare.
func bw12Region1State(rng *rand.Rand) (p, T float64) {
	T = 273.15 + 350*rng.Float64()
	ps := if97.SatPressure(T)
	u := rng.Float64()
	return ps + (100-ps)*u*u, T
}

// bw12Region2MaxPressure is the upper pressure limit of region 2 at the
// temperature T, MPa (R7-97(2012), section 4): the saturation pressure up to
// 623.15 K, the B23 line up to 863.15 K, then 100 MPa.
func bw12Region2MaxPressure(T float64) float64 {
	switch {
	case T <= 623.15:
		return if97.SatPressure(T)
	case T <= 863.15:
		return if97.B23Pressure(T)
	default:
		return 100
	}
}

// bw12Region2State draws a random state of region 2 with pressure between the
// triple-point pressure and the upper limit of region 2 at T, spread evenly in
// ln p, and 273.16 K ≤ T ≤ 1073.15 K. Sub-region selects 'a' for
// p ≤ 4 MPa, 'b' or 'c' for the rest, split at the B2bc line in (p,h).
func bw12Region2State(rng *rand.Rand, sub byte) (p, T float64) {
	for {
		T = 273.16 + 800*rng.Float64()
		lo, hi := if97.Pt, bw12Region2MaxPressure(T)
		if sub != 'a' {
			lo = 4
		} else {
			hi = math.Min(hi, 4)
		}
		if hi <= lo {
			continue
		}
		p = lo * math.Exp(rng.Float64()*math.Log(hi/lo))
		if sub == 'a' {
			return p, T
		}
		h := if97.Region2(p, T).H
		if (p <= if97.B2bcPressure(h)) == (sub == 'b') {
			return p, T
		}
	}
}

// bw12CheckTemperature runs n random states through a backward equation
// T(p,x) and fails the test where |T(p,x(p,T)) − T| exceeds the permissible
// value tol(p,T), K. It logs the largest difference found for each distinct
// permissible value.
func bw12CheckTemperature(t *testing.T, name string, n int,
	state func(*rand.Rand) (p, T float64),
	forward func(p, T float64) float64,
	backward func(p, x float64) float64,
	tol func(p, T float64) float64) {
	t.Helper()
	rng := rand.New(rand.NewPCG(bw12Seed, 0))
	type worst struct{ tol, dT, p, T float64 }
	var found []worst
	for range n {
		p, T := state(rng)
		lim := tol(p, T)
		d := math.Abs(backward(p, forward(p, T)) - T)
		if !(d <= lim) {
			t.Errorf("%s: |ΔT| = %.3g K at p=%g MPa, T=%g K, permissible %g K", name, d, p, T, lim)
		}
		i := 0
		for i < len(found) && found[i].tol != lim {
			i++
		}
		if i == len(found) {
			found = append(found, worst{tol: lim})
		}
		if d > found[i].dT {
			found[i] = worst{lim, d, p, T}
		}
	}
	for _, w := range found {
		t.Logf("%s: max |ΔT| = %.2f mK (permissible %g mK) at p=%.4g MPa, T=%.5g K", name, w.dT*1e3, w.tol*1e3, w.p, w.T)
	}
}

// Permissible inconsistencies between the backward equations T(p,h), T(p,s)
// and the basic equations, IAPWS R7-97(2012), sections 5.2.1 and 6.3 (values
// as recalled from the release): |ΔT| ≤ 25 mK in region 1; in region 2
// |ΔT| ≤ 10 mK where s ≥ 5.85 kJ/(kg K) and ≤ 25 mK where s < 5.85 kJ/(kg K),
// near the critical region, which is most of sub-region 2c.
func bw12Region1TolT(p, T float64) float64 { return 25e-3 }

func bw12Region2TolT(p, T float64) float64 {
	if if97.Region2(p, T).S >= 5.85 {
		return 10e-3
	}
	return 25e-3
}

func TestBackward12Region1Consistency(t *testing.T) {
	bw12CheckTemperature(t, "Region1TFromPH", bw12GridPoints, bw12Region1State,
		func(p, T float64) float64 { return if97.Region1(p, T).H }, if97.Region1TFromPH, bw12Region1TolT)
	bw12CheckTemperature(t, "Region1TFromPS", bw12GridPoints, bw12Region1State,
		func(p, T float64) float64 { return if97.Region1(p, T).S }, if97.Region1TFromPS, bw12Region1TolT)
}

func TestBackward12Region2Consistency(t *testing.T) {
	h := func(p, T float64) float64 { return if97.Region2(p, T).H }
	s := func(p, T float64) float64 { return if97.Region2(p, T).S }
	for _, sub := range []byte{'a', 'b', 'c'} {
		state := func(rng *rand.Rand) (p, T float64) { return bw12Region2State(rng, sub) }
		bw12CheckTemperature(t, "Region2TFromPH 2"+string(sub), bw12GridPoints, state, h, if97.Region2TFromPH, bw12Region2TolT)
		bw12CheckTemperature(t, "Region2TFromPS 2"+string(sub), bw12GridPoints, state, s, if97.Region2TFromPS, bw12Region2TolT)
	}
}

// The sub-region equations of region 2 meet at their boundaries: just on
// either side of p = 4 MPa and of the B2bc line the two equations must give
// the same temperature within the permissible inconsistency, since both are
// within it of the basic equation (IAPWS R7-97(2012), section 6.3).
func TestBackward12Region2SubregionBoundaries(t *testing.T) {
	const eps = 1e-9
	for h := 2801.0; h <= 4140; h += 10 { // 4 MPa isobar, saturated vapour to 1073 K
		a, b := if97.Region2TFromPH(4, h), if97.Region2TFromPH(4*(1+eps), h)
		if d := math.Abs(a - b); !(d <= 2*10e-3) {
			t.Errorf("Region2TFromPH at p=4 MPa, h=%g kJ/kg: 2a %.6f K, 2b %.6f K, |ΔT| %.3g K", h, a, b, d)
		}
	}
	for p := 6.6; p <= 100; p += 1 { // along B2bc
		h := if97.B2bcEnthalpy(p)
		b, c := if97.Region2TFromPH(p, h), if97.Region2TFromPH(p*(1+eps), h)
		if d := math.Abs(b - c); !(d <= 10e-3+25e-3) {
			t.Errorf("Region2TFromPH at B2bc p=%g MPa, h=%g kJ/kg: 2b %.6f K, 2c %.6f K, |ΔT| %.3g K", p, h, b, c, d)
		}
	}
}

func TestBackward12NaN(t *testing.T) {
	nan := math.NaN()
	for name, f := range map[string]func() float64{
		"Region1TFromPH": func() float64 { return if97.Region1TFromPH(nan, 500) },
		"Region1TFromPS": func() float64 { return if97.Region1TFromPS(3, nan) },
		"B2bcPressure":   func() float64 { return if97.B2bcPressure(nan) },
		"B2bcEnthalpy":   func() float64 { return if97.B2bcEnthalpy(nan) },
		"Region2TFromPH": func() float64 { return if97.Region2TFromPH(5, nan) },
		"Region2TFromPS": func() float64 { return if97.Region2TFromPS(nan, 6) },
	} {
		if got := f(); !math.IsNaN(got) {
			t.Errorf("%s with a NaN input = %g, want NaN", name, got)
		}
	}
}

func TestBackward12NoAllocations(t *testing.T) {
	if n := testing.AllocsPerRun(100, func() {
		bw12Sink = if97.Region1TFromPH(3, 500) + if97.Region1TFromPS(3, 0.5) +
			if97.B2bcPressure(3000) + if97.B2bcEnthalpy(50) +
			if97.Region2TFromPH(3, 3000) + if97.Region2TFromPH(5, 3500) + if97.Region2TFromPH(60, 2700) +
			if97.Region2TFromPS(0.1, 7.5) + if97.Region2TFromPS(8, 6) + if97.Region2TFromPS(80, 5.25)
	}); n != 0 {
		t.Errorf("backward equations T(p,h), T(p,s): %g allocations per run, want 0", n)
	}
}

var bw12Sink float64

func BenchmarkBackward12Region1TFromPH(b *testing.B) {
	for b.Loop() {
		bw12Sink = if97.Region1TFromPH(80, 1500)
	}
}

func BenchmarkBackward12Region1TFromPS(b *testing.B) {
	for b.Loop() {
		bw12Sink = if97.Region1TFromPS(80, 3)
	}
}

func BenchmarkBackward12B2bcPressure(b *testing.B) {
	for b.Loop() {
		bw12Sink = if97.B2bcPressure(3516.004323)
	}
}

func BenchmarkBackward12B2bcEnthalpy(b *testing.B) {
	for b.Loop() {
		bw12Sink = if97.B2bcEnthalpy(100)
	}
}

func BenchmarkBackward12Region2TFromPH(b *testing.B) {
	for b.Loop() {
		bw12Sink = if97.Region2TFromPH(5, 3500)
	}
}

func BenchmarkBackward12Region2TFromPS(b *testing.B) {
	for b.Loop() {
		bw12Sink = if97.Region2TFromPS(8, 6)
	}
}
