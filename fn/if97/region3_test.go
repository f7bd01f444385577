package if97_test

import (
	"fmt"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/if97"
)

func TestRegion3VerificationTable(t *testing.T) {
	// R7-97(2012) Table 33: inputs ρ in kg/m³ and T; p in MPa, h and u in
	// kJ/kg, s and cp in kJ/(kg·K), w in m/s.
	regCheckTable(t, "Region3", if97.Region3, "P", "kg/m³", []regVerifyRow{
		{500, 650, 0.255837018e2, 0.186343019e4, 0.181226279e4, 0.405427273e1, 0.138935717e2, 0.502005554e3},
		{200, 650, 0.222930643e2, 0.237512401e4, 0.226365868e4, 0.485438792e1, 0.446579342e2, 0.383444594e3},
		{500, 750, 0.783095639e2, 0.225868845e4, 0.210206932e4, 0.446971906e1, 0.634165359e1, 0.760696041e3},
	})
}

// The basic equation of region 3 reproduces the critical point: at ρc and Tc
// it gives pc, and (∂p/∂ρ)_T vanishes there, so the compressibility diverges
// (R7-97(2012), text on region 3, from memory).
func TestRegion3CriticalPoint(t *testing.T) {
	got := if97.Region3(if97.Rhoc, if97.Tc)
	if !scalar.EqualWithinRel(got.P, if97.Pc, 1e-9) {
		t.Errorf("Region3(ρc, Tc).P = %.12g MPa, want %.12g", got.P, if97.Pc)
	}
	// Away from the critical point 1/κT = ρ(∂p/∂ρ)_T is of order 10 to
	// 10⁴ MPa; at it, below 10⁻⁶.
	if inv := 1 / got.KappaT; math.Abs(inv) > 1e-6 {
		t.Errorf("Region3(ρc, Tc): 1/KappaT = %g MPa, want 0 within 1e-6", inv)
	}
}

func ExampleRegion3() {
	// Region 3 takes density and temperature; pressure is a result. The
	// first state of R7-97(2012) Table 33.
	s := if97.Region3(500, 650)
	fmt.Printf("p = %.7f MPa, h = %.5f kJ/kg\n", s.P, s.H)
	// Output: p = 25.5837018 MPa, h = 1863.43019 kJ/kg
}

func BenchmarkRegion3(b *testing.B) {
	for b.Loop() {
		regSink = if97.Region3(500, 650)
	}
}
