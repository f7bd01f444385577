package if97

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// The quick subsets agree with the full property sets (identity check: the
// same equations, summed in a different order, so to rounding: 1e-12),
// over each region's range.
func TestQuickSubsetsMatchFullProps(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 12))
	for i := 0; i < 2000; i++ {
		T := 273.15 + rng.Float64()*350
		p := SatPressure(T) + rng.Float64()*(100-SatPressure(T))
		h, s, cp, _ := Region1HSCp(p, T)
		f := Region1(p, T)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinAbsOrRel(s, f.S, 1e-15, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region1HSCp(%g, %g) = %g, %g, %g; Region1 gives %g, %g, %g", p, T, h, s, cp, f.H, f.S, f.Cp)
		}
		T5 := 1073.15 + rng.Float64()*1200
		p5 := 1e-3 + rng.Float64()*50
		h, s, cp, _ = Region5HSCp(p5, T5)
		f = Region5(p5, T5)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinRel(s, f.S, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region5HSCp(%g, %g) = %g, %g, %g; Region5 gives %g, %g, %g", p5, T5, h, s, cp, f.H, f.S, f.Cp)
		}
		T2 := 273.15 + rng.Float64()*800
		p2 := 1e-3 + rng.Float64()*10
		h, s, cp, _ = Region2HSCp(p2, T2)
		f = Region2(p2, T2)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinRel(s, f.S, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region2HSCp(%g, %g) = %g, %g, %g; Region2 gives %g, %g, %g", p2, T2, h, s, cp, f.H, f.S, f.Cp)
		}
	}
}

// dcp/dT from the quick subsets agrees with a central difference of cp
// (identity check: 1e-6 relative, the difference's own error).
func TestQuickDcpMatchesDifference(t *testing.T) {
	for _, c := range []struct {
		f    func(p, T float64) (h, s, cp, dcp float64)
		p, T float64
	}{{Region1HSCp, 10, 450}, {Region2HSCp, 1, 600}, {Region2HSCp, 15, 620}, {Region5HSCp, 20, 1500}} {
		_, _, _, dcp := c.f(c.p, c.T)
		const dT = 1e-3
		_, _, cp1, _ := c.f(c.p, c.T+dT)
		_, _, cp0, _ := c.f(c.p, c.T-dT)
		if want := (cp1 - cp0) / (2 * dT); !scalar.EqualWithinAbsOrRel(dcp, want, 1e-9, 1e-6) {
			t.Errorf("dcp/dT at p=%g, T=%g: %g, difference gives %g", c.p, c.T, dcp, want)
		}
	}
}

func BenchmarkRegion1HSCp(b *testing.B) {
	for i := 0; i < b.N; i++ {
		quickSink, _, _, _ = Region1HSCp(3, 300)
	}
}

func BenchmarkRegion2HSCp(b *testing.B) {
	for i := 0; i < b.N; i++ {
		quickSink, _, _, _ = Region2HSCp(0.0035, 300)
	}
}

var quickSink float64
