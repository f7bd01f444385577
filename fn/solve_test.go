package fn

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

// randomStates returns n single-phase states spread over every region of
// the range of validity, drawn from (p, T) with a fixed seed. The draw is
// uniform in ln p and in T, region by region, so that region 3 and region 5
// get their share.
func randomStates(t testing.TB, n int, seed uint64) []State {
	t.Helper()
	rng := rand.New(rand.NewPCG(seed, 7))
	boxes := []struct{ pLo, pHi, tLo, tHi float64 }{
		{1e-3, 100, TMin, T13},     // regions 1 and 2 at low T
		{1e-3, 100, T13, 863.15},   // regions 2 and 3
		{1e-3, 100, 863.15, TMax},  // region 2 at high T
		{1e-3, 50, TMax, TMaxHigh}, // region 5
		{16.5, 30, 640, 660},       // near the critical point
		{1e-5, 1e-2, TMin, 400},    // low pressure vapour
		{20, 100, T13, 750},        // dense region 3
	}
	var out []State
	for len(out) < n {
		b := boxes[len(out)%len(boxes)]
		p := math.Exp(math.Log(b.pLo) + rng.Float64()*(math.Log(b.pHi)-math.Log(b.pLo)))
		T := b.tLo + rng.Float64()*(b.tHi-b.tLo)
		st, err := FromPT(p, T)
		if err != nil {
			continue // outside the range (p above 50 MPa in region 5 boxes) or on saturation
		}
		out = append(out, st)
	}
	return out
}

// roundTripTwoBound bounds the share of TestRoundTripAllPairs's states
// refused as two solutions, pair by pair.
var roundTripTwoBound = map[string]float64{"p,v": 0.012, "p,rho": 0.012, "t,h": 0.15, "t,s": 0.007}

// TestRoundTripAllPairs solves each pair of every random state back to the
// state and checks that p and T come back to 1e-7 relative. Identity
// check: the pairs must invert FromPT (common practice for property
// software, no source).
func TestRoundTripAllPairs(t *testing.T) {
	n := 10000
	if testing.Short() {
		n = 1000
	}
	states := randomStates(t, n, 1)
	type pairOf func(s *State) (Input, Input)
	pairs := []struct {
		name string
		in   pairOf
		// twoOK: the pair may honestly have two solutions for some states
		// (see fromTQ, liquidAtPV); those must be refused with ErrTwoSolutions.
		twoOK bool
	}{
		{"p,h", func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Enthalpy, s.H} }, false},
		{"p,s", func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Entropy, s.S} }, false},
		{"h,s", func(s *State) (Input, Input) { return Input{Enthalpy, s.H}, Input{Entropy, s.S} }, false},
		{"p,v", func(s *State) (Input, Input) { return Input{Pressure, s.P}, Input{Volume, s.V} }, true},
		{"p,rho", func(s *State) (Input, Input) { return Input{Density, s.Rho}, Input{Pressure, s.P} }, true},
		{"t,v", func(s *State) (Input, Input) { return Input{Temperature, s.T}, Input{Volume, s.V} }, false},
		{"t,h", func(s *State) (Input, Input) { return Input{Temperature, s.T}, Input{Enthalpy, s.H} }, true},
		{"t,s", func(s *State) (Input, Input) { return Input{Temperature, s.T}, Input{Entropy, s.S} }, true},
		{"u,v", func(s *State) (Input, Input) { return Input{InternalEnergy, s.U}, Input{Volume, s.V} }, false},
	}
	for _, pc := range pairs {
		t.Run(pc.name, func(t *testing.T) {
			fails, twos := 0, 0
			for i := range states {
				want := &states[i]
				a, b := pc.in(want)
				got, err := Solve(a, b)
				if err != nil {
					var ie *InputError
					if pc.twoOK && errors.As(err, &ie) && errors.Is(err, ErrTwoSolutions) {
						// The refusal must name the original state, and
						// every state it names must exist (checkTwo).
						twos++
						x, y := a, b
						if x.Q > y.Q {
							x, y = y, x
						}
						checkTwo(t, pc.name, x, y, ie, want)
						continue
					}
					fails++
					if fails <= 5 {
						t.Errorf("%s from p=%.12g MPa, T=%.12g K (region %d): %v", pc.name, want.P, want.T, want.Region, err)
					}
					continue
				}
				// The answer reproduces both inputs to the README's 2e-10
				// (inputTol), and is the state drawn, p and T to 1e-7.
				checkAnswer(t, pc.name, a, b, &got)
				if !scalar.EqualWithinRel(got.P, want.P, 1e-7) || !scalar.EqualWithinRel(got.T, want.T, 1e-7) {
					fails++
					if fails <= 5 {
						t.Errorf("%s from p=%.12g MPa, T=%.12g K (region %d): got p=%.12g, T=%.12g (region %d)",
							pc.name, want.P, want.T, want.Region, got.P, got.T, got.Region)
					}
				}
			}
			if fails > 0 {
				t.Errorf("%s: %d of %d states failed", pc.name, fails, len(states))
			}
			// The refusals are honest (checkTwo) and few: the bound is
			// twice the share measured on this draw, a rise means states
			// with one answer are refused.
			if frac := float64(twos) / float64(len(states)); frac > roundTripTwoBound[pc.name] {
				t.Errorf("%s: %d of %d refused as two solutions, above the bound %g", pc.name, twos, len(states), roundTripTwoBound[pc.name])
			}
			t.Logf("%s: %d states, %d refused as two solutions", pc.name, len(states), twos)
		})
	}
}

// TestRoundTripTwoPhase solves wet states back from every pair that can
// reach them: (p,x), (T,x), (p,h), (p,s), (h,s), (p,v), (T,v), (T,h), (T,s),
// (u,v). Identity check, no source.
func TestRoundTripTwoPhase(t *testing.T) {
	rng := rand.New(rand.NewPCG(2, 9))
	n := 2000
	if testing.Short() {
		n = 200
	}
	for i := 0; i < n; i++ {
		T := TMin + rng.Float64()*(if97.Tc-0.5-TMin)
		x := rng.Float64()
		want, err := FromTX(T, x)
		if err != nil {
			t.Fatalf("FromTX(%g, %g): %v", T, x, err)
		}
		for _, in := range [][2]Input{
			{{Pressure, want.P}, {Quality, x}},
			{{Pressure, want.P}, {Enthalpy, want.H}},
			{{Pressure, want.P}, {Entropy, want.S}},
			{{Enthalpy, want.H}, {Entropy, want.S}},
			{{Pressure, want.P}, {Volume, want.V}},
			{{Temperature, T}, {Volume, want.V}},
			{{Temperature, T}, {Enthalpy, want.H}},
			{{Temperature, T}, {Entropy, want.S}},
			{{InternalEnergy, want.U}, {Volume, want.V}},
		} {
			got, err := Solve(in[0], in[1])
			if err != nil {
				if errors.Is(err, ErrTwoSolutions) && in[0].Q == Temperature {
					continue // cold liquid overlaps the wet region in (T,h), (T,s)
				}
				t.Errorf("Solve(%v, %v) from T=%.10g K, x=%.6g: %v", in[0], in[1], T, x, err)
				continue
			}
			if !got.HasX || !scalar.EqualWithinRel(got.T, T, 1e-7) || !scalar.EqualWithinAbs(got.X, x, 1e-6) {
				t.Errorf("Solve(%v, %v) from T=%.10g K, x=%.6g: got T=%.10g, x=%.8g, phase %v", in[0], in[1], T, x, got.T, got.X, got.Phase)
			}
		}
	}
}

// A (p,h) or (p,s) inside the two-phase dome between 16.529 MPa and pc must
// never be answered by a single-phase state: no candidate of the pair's
// solver may be accepted for a wet state (the acceptance test's side of
// saturation, stable3), and Solve must return the wet state. Identity
// check, no source.
func TestAcceptRejectsWetStates(t *testing.T) {
	for T := 623.2; T < if97.Tc-0.01; T += 0.25 {
		for x := 0.025; x < 1; x += 0.05 {
			wet, err := FromTX(T, x)
			if err != nil {
				t.Fatal(err)
			}
			for _, q := range []Input{{Enthalpy, wet.H}, {Entropy, wet.S}} {
				ps := pairTable[Pressure][q.Q]
				for _, c := range ps.cands {
					a, T0, ok := c.start(wet.P, q.Value)
					if !ok {
						continue
					}
					if pr, ok := newton(c.r, Pressure, wet.P, q.Q, q.Value, a, T0, maxNewtonSteps, 1); ok && accept(c.r, &pr) {
						t.Errorf("T=%g K, x=%g: %v = %g accepted as a region-%d state T=%g K, rho=%g", T, x, q.Q, q.Value, c.r, pr.T, pr.Rho)
					}
				}
				got, err := Solve(Input{Pressure, wet.P}, q)
				if err != nil || !got.HasX || !scalar.EqualWithinAbs(got.X, x, 1e-6) {
					t.Errorf("Solve(p=%g, %v=%g) = x %g (phase %v), %v; want x = %g", wet.P, q.Q, q.Value, got.X, got.Phase, err, x)
				}
			}
		}
	}
}

// Cold liquid near 273 K: h and s hardly depend on p there, and both are
// small sums of large terms, so the (h, s) Newton solve in region 1 must
// stop at the rounding of h and s while still pinning p. Identity check
// (the pair must invert FromPT, p to 1e-9 relative: common practice, no
// source), and the solve in region 1 itself must succeed (the bracketed
// fallback would also find p, at a hundred times the cost).
func TestColdLiquidHSPinsPressure(t *testing.T) {
	for _, T := range []float64{273.16, 273.2, 273.34033753545947, 274, 277.13, 280} {
		for _, p := range []float64{0.002, 0.006658550726334081, 0.05, 0.3, 2, 20} {
			want, err := FromPT(p, T)
			if err != nil || want.Region != 1 {
				continue
			}
			a, T0, ok := startHS1(want.H, want.S)
			pr, ok2 := newton(1, Enthalpy, want.H, Entropy, want.S, a, T0, maxNewtonSteps, 1e-3)
			if !ok || !ok2 || !accept(1, &pr) {
				t.Errorf("p=%g MPa, T=%g K: the region-1 (h,s) solve failed (ended at p=%g, T=%g)", p, T, pr.P, pr.T)
				continue
			}
			if !scalar.EqualWithinRel(pr.P, p, 1e-9) || !scalar.EqualWithinRel(pr.T, T, 1e-12) {
				t.Errorf("p=%g MPa, T=%g K: (h,s) gave p=%.12g, T=%.15g", p, T, pr.P, pr.T)
			}
		}
	}
}

// fromTSFalling relies on s falling with p along every isotherm from
// tSFallsWithP up, i.e. αv > 0 in every single-phase state there (common
// knowledge of the trade, no source: water's density maximum lies at
// 277.13 K at 0.1 MPa and lower at higher pressures). Checked on a grid of
// the whole range, and the quick answer is compared with the general
// search of the isotherm over random states (identity check).
func TestEntropyFallsWithPressure(t *testing.T) {
	for T := tSFallsWithP; T <= TMaxHigh; T++ {
		for lp := math.Log(1e-6); lp <= math.Log(PMax); lp += 0.1 {
			st, err := FromPT(math.Exp(lp), T)
			if err != nil {
				continue // outside the range, or on the saturation line
			}
			if !(st.AlphaV > 0) {
				t.Fatalf("αv = %g at p = %g MPa, T = %g K: s does not fall with p there", st.AlphaV, st.P, T)
			}
		}
	}
	rng := rand.New(rand.NewPCG(31, 32))
	for i := 0; i < 1500; i++ {
		T := tSFallsWithP + rng.Float64()*(TMaxHigh-tSFallsWithP)
		s := 3 + rng.Float64()*10
		if i%3 == 0 {
			s = rng.Float64() * 7 // liquid and wet states too
		}
		bs, sat, ok := isothermBranches(T)
		if !ok {
			t.Fatalf("T = %g K: no isotherm", T)
		}
		quick, ok := fromTSFalling(T, s, bs, sat)
		search, err := searchIsotherm(T, Entropy, s, bs, sat)
		switch {
		case ok && err != nil:
			t.Errorf("T = %g K, s = %g: the quick path gives p = %g MPa, the search refuses: %v", T, s, quick.P, err)
		case !ok && err == nil:
			t.Errorf("T = %g K, s = %g: the quick path finds nothing, the search p = %g MPa", T, s, search.P)
		case ok && (!scalar.EqualWithinRel(quick.P, search.P, 1e-9) || quick.HasX != search.HasX ||
			quick.HasX && !scalar.EqualWithinAbs(quick.X, search.X, 1e-9)):
			t.Errorf("T = %g K, s = %g: quick p = %.10g MPa (x %v %g), search p = %.10g MPa (x %v %g)", T, s, quick.P, quick.HasX, quick.X, search.P, search.HasX, search.X)
		}
	}
}

// Every state of a region must lie within regionSpans, which gate the
// starts of (p,h), (p,s), (h,s), (p,v), (T,v) and (u,v): a span that shut
// out a true answer would only send it to the slower fallback, which the
// round trips cannot see. Checked over the whole-domain scan and a random
// draw. Identity check, no source.
func TestRegionSpansHoldTheirStates(t *testing.T) {
	sp := regionSpans
	inf := math.Inf(1)
	type lim struct{ lo, hi float64 }
	// v, s, h spans of each region; ±inf where regionSpans has no bound.
	spans := map[int][3]lim{
		1: {{-inf, sp.v1Max}, {-inf, sp.s1Max}, {-inf, sp.h1Max}},
		2: {{sp.v2Min, inf}, {sp.s2Min, inf}, {sp.h2Min, sp.h2Max}},
		3: {{sp.v3Min, sp.v3Max}, {sp.s3Min, sp.s3Max}, {-inf, inf}},
		5: {{sp.v5Min, inf}, {sp.s5Min, inf}, {sp.h5Min, inf}},
	}
	states := append(scanStates(t), randomStates(t, 2000, 5)...)
	for i := range states {
		s := &states[i]
		for k, q := range []Quantity{Volume, Entropy, Enthalpy} {
			l := spans[s.Region][k]
			if v := value(q, &s.Props); v < l.lo || v > l.hi {
				t.Errorf("region %d at p=%.15g MPa, T=%.15g K: %s = %.15g outside its span [%g, %g]", s.Region, s.P, s.T, q.Symbol(), v, l.lo, l.hi)
			}
		}
	}
}
