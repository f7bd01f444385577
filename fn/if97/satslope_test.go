package if97_test

import (
	"testing"

	"gonum.org/v1/gonum/diff/fd"
	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

// TestSatPressureSlope checks the implicit derivative of Eq. 30 against
// central differences of SatPressure (gonum diff/fd) at the temperatures of
// R7-97(2012) Table 35 and along the whole line.
func TestSatPressureSlope(t *testing.T) {
	for _, T := range []float64{273.15, 300, 373.15, 500, 600, 640, 647} {
		got := if97.SatPressureSlope(T)
		want := fd.Derivative(if97.SatPressure, T, &fd.Settings{Formula: fd.Central, Step: 1e-4})
		if !scalar.EqualWithinRel(got, want, 1e-7) {
			t.Errorf("dps/dT(%g K) = %.12g MPa/K, fd %.12g", T, got, want)
		}
	}
}
