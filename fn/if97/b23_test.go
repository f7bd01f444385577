package if97_test

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

func TestB23VerificationValue(t *testing.T) {
	// R7-97(2012), check value after Eq. 6: T = 0.62315e3 K,
	// p = 0.165291643e2 MPa.
	const T, p = 0.62315e3, 0.165291643e2
	if got := if97.B23Pressure(T); !scalar.EqualWithinRel(got, p, regTableRel) {
		t.Errorf("B23Pressure(T=%g K) = %.9g MPa, want %.9g", T, got, p)
	}
	if got := if97.B23Temperature(p); !scalar.EqualWithinRel(got, T, regTableRel) {
		t.Errorf("B23Temperature(p=%g MPa) = %.9g K, want %.9g", p, got, T)
	}
}

func TestB23Ends(t *testing.T) {
	// The boundary ends at 863.15 K, 100 MPa (R7-97(2012), Fig. 1 and text
	// on the B23 equation).
	if got := if97.B23Pressure(863.15); !scalar.EqualWithinRel(got, 100, 1e-6) {
		t.Errorf("B23Pressure(T=863.15 K) = %.9g MPa, want 100", got)
	}
}

// Eq. 6 is Eq. 5 solved for T, so the two invert each other to rounding.
func TestB23RoundTrip(t *testing.T) {
	for T := 623.15; T <= 863.15; T += 0.5 {
		if got := if97.B23Temperature(if97.B23Pressure(T)); !scalar.EqualWithinRel(got, T, 1e-9) {
			t.Errorf("B23Temperature(B23Pressure(T=%g K)) = %.12g K", T, got)
		}
	}
}

func TestB23TemperatureBelowVertex(t *testing.T) {
	// Below p = n₅ = 13.9188 MPa (R7-97(2012) Table 1) the square root of
	// Eq. 6 has a negative argument.
	if got := if97.B23Temperature(10); !math.IsNaN(got) {
		t.Errorf("B23Temperature(p=10 MPa) = %g, want NaN", got)
	}
}
