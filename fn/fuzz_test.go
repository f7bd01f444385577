package fn

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

// FuzzSolve feeds any pair of inputs to Solve: it must never panic, and an
// answer without an error must hold finite values only (the package
// promise that no NaN or infinite value leaves the engine). The seeds are
// states of every region and every kind of bad input.
func FuzzSolve(f *testing.F) {
	for _, s := range []struct {
		qa, qb int
		a, b   float64
	}{
		{1, 2, 1, 573.15}, {1, 3, 1, 2800}, {1, 4, 1, 6.5}, {3, 4, 2800, 6.5}, {1, 8, 1, 0.5},
		{2, 8, 400, 0.5}, {1, 5, 1, 0.2}, {2, 5, 700, 0.003}, {2, 3, 700, 2500}, {2, 4, 300, 0.4},
		{7, 5, 2500, 0.1}, {1, 6, 22, 322}, {1, 2, 22.064, 647.096}, {1, 2, math.NaN(), 300},
		{1, 2, -1, 300}, {1, 8, 30, 0.5}, {3, 4, -1e300, 1e300}, {7, 5, 1e9, 1e-9}, {2, 6, 1500, 1e-3},
		// The defects of issue 11 (TestIssue11Defects).
		{1, 3, 33.99, 1599.59}, {1, 4, 33.99, 3.618889}, {1, 2, 22.0110537, 646.898}, {2, 6, 300, 2000},
	} {
		f.Add(s.qa, s.qb, s.a, s.b)
	}
	f.Fuzz(func(t *testing.T, qa, qb int, a, b float64) {
		st, err := Solve(Input{Quantity(qa), a}, Input{Quantity(qb), b})
		var ie *InputError
		if err != nil && !errors.As(err, &ie) {
			// A solve that did not converge (ErrSolver) is our fault.
			t.Fatalf("Solve(%v=%g, %v=%g): %v", Quantity(qa), a, Quantity(qb), b, err)
		}
		if err != nil {
			return
		}
		all := []if97.Props{st.Props}
		if st.HasX {
			all = append(all, st.Liquid, st.Vapour)
		}
		for _, pr := range all {
			for _, v := range []float64{pr.P, pr.T, pr.V, pr.Rho, pr.U, pr.H, pr.S, pr.G, pr.F, pr.Cp, pr.Cv, pr.W, pr.Kappa, pr.AlphaV, pr.KappaT} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("Solve(%v=%g, %v=%g) = %+v without an error", Quantity(qa), a, Quantity(qb), b, pr)
				}
			}
		}
		if math.IsNaN(st.X) || math.IsInf(st.X, 0) {
			t.Fatalf("Solve(%v=%g, %v=%g): x = %g", Quantity(qa), a, Quantity(qb), b, st.X)
		}
	})
}

// TestAnswersHonourTheirInputs draws pairs of input values at random over
// ranges wider than the range of validity (fixed seed): every answer must
// reproduce both inputs (to 1e-9 relative, or 1e-9 absolute for values
// near zero, volumes and x looser as noted) and hold finite values; every
// other outcome must be a typed *InputError. Identity check, no source.
func TestAnswersHonourTheirInputs(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	draw := map[Quantity]func() float64{
		Pressure:       func() float64 { return math.Exp(-12 + rng.Float64()*17) }, // 6e-6 … 150 MPa
		Temperature:    func() float64 { return 250 + rng.Float64()*2200 },
		Enthalpy:       func() float64 { return -200 + rng.Float64()*8000 },
		Entropy:        func() float64 { return -1 + rng.Float64()*14 },
		Volume:         func() float64 { return math.Exp(-7.5 + rng.Float64()*14) }, // 5e-4 … 600 m³/kg
		Density:        func() float64 { return math.Exp(-6 + rng.Float64()*13) },
		InternalEnergy: func() float64 { return -200 + rng.Float64()*6000 },
		Quality:        func() float64 { return -0.2 + rng.Float64()*1.4 },
	}
	pairs := [][2]Quantity{{Pressure, Temperature}, {Pressure, Enthalpy}, {Pressure, Entropy}, {Enthalpy, Entropy},
		{Pressure, Quality}, {Temperature, Quality}, {Pressure, Volume}, {Temperature, Volume}, {Pressure, Density},
		{Temperature, Density}, {Temperature, Enthalpy}, {Temperature, Entropy}, {InternalEnergy, Volume}}
	n := 20000
	if testing.Short() {
		n = 2000
	}
	answered := 0
	kinds := map[error]int{}
	for i := 0; i < n; i++ {
		pq := pairs[i%len(pairs)]
		a, b := Input{pq[0], draw[pq[0]]()}, Input{pq[1], draw[pq[1]]()}
		st, err := Solve(a, b)
		if err != nil {
			// No refusal counts as a pass by itself: a solve that did not
			// converge fails the test, and a two-solution refusal must
			// name states that exist.
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Errorf("Solve(%v, %v): error %v is not an *InputError", a, b, err)
				continue
			}
			kinds[ie.Kind]++
			if errors.Is(err, ErrTwoSolutions) {
				x, y := a, b
				if x.Q > y.Q {
					x, y = y, x
				}
				checkAlternatives(t, "Solve", x, y, ie, 1e-8, nil)
			}
			continue
		}
		answered++
		// A single-phase answer lies in the region it names and is
		// physical: stable (cp, cv, κT > 0) with a real speed of sound.
		if !st.HasX && st.Phase != MetastableVapour {
			if r := if97.RegionOf(st.P, st.T); r != st.Region && !onBoundary(st.Region, st.P, st.T) {
				t.Errorf("Solve(%v, %v): region %d, but (p=%g, T=%g) lies in region %d", a, b, st.Region, st.P, st.T, r)
			}
			if !(st.Cp > 0 && st.Cv > 0 && st.KappaT > 0 && st.W > 0) {
				t.Errorf("Solve(%v, %v) = unphysical state %+v", a, b, st.Props)
			}
		}
		for _, in := range []Input{a, b} {
			var got float64
			tol := 1e-9
			switch in.Q {
			case Quality:
				got = st.X
			case Volume, Density:
				got = value(in.Q, &st.Props)
				if st.HasX {
					tol = 1e-8 // the mixture's v is a sum of two rounded terms
				}
			default:
				got = value(in.Q, &st.Props)
			}
			if !scalar.EqualWithinAbsOrRel(got, in.Value, 1e-9, tol) {
				t.Errorf("Solve(%v, %v) = %v (region %d) with %v = %.12g", a, b, st.Phase, st.Region, in.Q, got)
			}
		}
	}
	t.Logf("%d of %d random pairs had an answer; refusals by kind: %v", answered, n, kinds)
	// Every input that reaches the engine is in range or refused as out
	// of range: ErrNoSolution would mean a state was missed.
	if kinds[ErrNoSolution] > 0 {
		t.Errorf("%d random pairs refused as having no state", kinds[ErrNoSolution])
	}
}
