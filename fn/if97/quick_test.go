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
		h, s, cp := Region1HSCp(p, T)
		f := Region1(p, T)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinAbsOrRel(s, f.S, 1e-15, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region1HSCp(%g, %g) = %g, %g, %g; Region1 gives %g, %g, %g", p, T, h, s, cp, f.H, f.S, f.Cp)
		}
		T5 := 1073.15 + rng.Float64()*1200
		p5 := 1e-3 + rng.Float64()*50
		h, s, cp = Region5HSCp(p5, T5)
		f = Region5(p5, T5)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinRel(s, f.S, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region5HSCp(%g, %g) = %g, %g, %g; Region5 gives %g, %g, %g", p5, T5, h, s, cp, f.H, f.S, f.Cp)
		}
		T2 := 273.15 + rng.Float64()*800
		p2 := 1e-3 + rng.Float64()*10
		h, s, cp = Region2HSCp(p2, T2)
		f = Region2(p2, T2)
		if !scalar.EqualWithinRel(h, f.H, 1e-12) || !scalar.EqualWithinRel(s, f.S, 1e-12) || !scalar.EqualWithinRel(cp, f.Cp, 1e-12) {
			t.Fatalf("Region2HSCp(%g, %g) = %g, %g, %g; Region2 gives %g, %g, %g", p2, T2, h, s, cp, f.H, f.S, f.Cp)
		}
	}
}

func BenchmarkRegion1HSCp(b *testing.B) {
	for i := 0; i < b.N; i++ {
		quickSink, _, _ = Region1HSCp(3, 300)
	}
}

func BenchmarkRegion2HSCp(b *testing.B) {
	for i := 0; i < b.N; i++ {
		quickSink, _, _ = Region2HSCp(0.0035, 300)
	}
}

var quickSink float64
