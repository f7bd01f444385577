package if97_test

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

func TestSatPressureVerificationTable(t *testing.T) {
	// R7-97(2012) Table 35: T in K, ps in MPa.
	for _, tc := range []struct{ T, want float64 }{
		{300, 0.353658941e-2},
		{500, 0.263889776e1},
		{600, 0.123443146e2},
	} {
		if got := if97.SatPressure(tc.T); !scalar.EqualWithinRel(got, tc.want, regTableRel) {
			t.Errorf("SatPressure(T=%g K) = %.9g MPa, want %.9g", tc.T, got, tc.want)
		}
	}
}

func TestSatTemperatureVerificationTable(t *testing.T) {
	// R7-97(2012) Table 36: p in MPa, Ts in K.
	for _, tc := range []struct{ p, want float64 }{
		{0.1, 0.372755919e3},
		{1, 0.453035632e3},
		{10, 0.584149488e3},
	} {
		if got := if97.SatTemperature(tc.p); !scalar.EqualWithinRel(got, tc.want, regTableRel) {
			t.Errorf("SatTemperature(p=%g MPa) = %.9g K, want %.9g", tc.p, got, tc.want)
		}
	}
}

func TestSatEnds(t *testing.T) {
	// Points of the saturation line that the text of R7-97(2012) names, from
	// memory: ps(273.15 K) = 611.212677 Pa, the lowest pressure of the
	// formulation; the triple point 273.16 K, 611.657 Pa; the critical point
	// Tc, pc of Eqs. 2 and 3. The rel tolerance matches the printed digits.
	for _, tc := range []struct {
		T, p, rel float64
	}{
		{273.15, 611.212677e-6, 1e-9},
		{if97.Tt, 611.657e-6, 1e-6},
		{if97.Tc, if97.Pc, 1e-9},
	} {
		if got := if97.SatPressure(tc.T); !scalar.EqualWithinRel(got, tc.p, tc.rel) {
			t.Errorf("SatPressure(T=%.9g K) = %.12g MPa, want %.12g", tc.T, got, tc.p)
		}
		if got := if97.SatTemperature(tc.p); !scalar.EqualWithinRel(got, tc.T, 1e-9) {
			t.Errorf("SatTemperature(p=%.12g MPa) = %.12g K, want %.12g", tc.p, got, tc.T)
		}
	}
}

// Eqs. 30 and 31 solve the same quadratic (Eq. 29) for p and for T, so each
// inverts the other to rounding error along the whole line.
func TestSatRoundTrip(t *testing.T) {
	for T := 273.15; T <= if97.Tc; T += 0.25 {
		p := if97.SatPressure(T)
		if got := if97.SatTemperature(p); !scalar.EqualWithinRel(got, T, 1e-12) {
			t.Errorf("SatTemperature(SatPressure(T=%g K)) = %.15g K", T, got)
		}
	}
}

func TestSatNaN(t *testing.T) {
	for _, tc := range []struct {
		name string
		got  float64
	}{
		{"SatPressure(NaN)", if97.SatPressure(math.NaN())},
		{"SatTemperature(NaN)", if97.SatTemperature(math.NaN())},
		{"SatTemperature(-1 MPa)", if97.SatTemperature(-1)},
	} {
		if !math.IsNaN(tc.got) {
			t.Errorf("%s = %g, want NaN", tc.name, tc.got)
		}
	}
}

func ExampleSatTemperature() {
	// Water boils at 372.76 K under 0.1 MPa (R7-97(2012) Table 36).
	fmt.Printf("%.2f K\n", if97.SatTemperature(0.1))
	// Output: 372.76 K
}

func BenchmarkSatPressure(b *testing.B) {
	var x float64
	for b.Loop() {
		x = if97.SatPressure(500)
	}
	_ = x
}
