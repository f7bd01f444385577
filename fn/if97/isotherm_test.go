package if97

import (
	"math"
	"math/rand/v2"
	"testing"
)

// The isotherm polynomials give the h and s of the basic equations
// (identity check: the same sums in another order, so to rounding; 1e-12
// of the value, with floors of 1e-9 kJ/kg and 1e-12 kJ/(kg·K) where h and
// s pass through zero near 273.16 K), over each region's states.
func TestIsothermMatchesRegions(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 42))
	check := func(r int, T, a float64, pr Props) {
		t.Helper()
		h := NewIsotherm(r, T, IsothermEnthalpy)
		s := NewIsotherm(r, T, IsothermEntropy)
		if got := h.At(a); !(math.Abs(got-pr.H) <= 1e-12*math.Abs(pr.H)+1e-9) {
			t.Errorf("region %d, T = %g K, a = %g: h %.17g, want %.17g", r, T, a, got, pr.H)
		}
		if got := s.At(a); !(math.Abs(got-pr.S) <= 1e-12*math.Abs(pr.S)+1e-12) {
			t.Errorf("region %d, T = %g K, a = %g: s %.17g, want %.17g", r, T, a, got, pr.S)
		}
	}
	for i := 0; i < 2000; i++ {
		T := 273.15 + rng.Float64()*350
		p := SatPressure(T) + rng.Float64()*(100-SatPressure(T))
		check(1, T, p, Region1(p, T))
		T = 273.15 + rng.Float64()*800
		p = math.Exp(math.Log(1e-6) + rng.Float64()*(math.Log(100)-math.Log(1e-6)))
		check(2, T, p, Region2(p, T))
		T = 1073.15 + rng.Float64()*1200
		p = math.Exp(math.Log(1e-6) + rng.Float64()*(math.Log(50)-math.Log(1e-6)))
		check(5, T, p, Region5(p, T))
		T = 623.15 + rng.Float64()*240
		rho := 100 + rng.Float64()*700
		check(3, T, rho, Region3(rho, T))
	}
	if it := NewIsotherm(4, 400, IsothermEnthalpy); !math.IsNaN(it.At(1)) {
		t.Errorf("region 4 isotherm gives %g, want NaN", it.At(1))
	}
}

func BenchmarkIsothermAt(b *testing.B) {
	it := NewIsotherm(2, 600, IsothermEnthalpy)
	for i := 0; b.Loop(); i++ {
		quickSink = it.At(0.1 + float64(i&7))
	}
}
