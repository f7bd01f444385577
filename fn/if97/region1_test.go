package if97_test

import (
	"fmt"
	"testing"

	"steamcell/fn/if97"
)

func TestRegion1VerificationTable(t *testing.T) {
	// R7-97(2012) Table 5: v in m³/kg, h and u in kJ/kg, s and cp in
	// kJ/(kg·K), w in m/s.
	regCheckTable(t, "Region1", if97.Region1, "V", "MPa", []regVerifyRow{
		{3, 300, 0.100215168e-2, 0.115331273e3, 0.112324818e3, 0.392294792, 0.417301218e1, 0.150773921e4},
		{80, 300, 0.971180894e-3, 0.184142828e3, 0.106448356e3, 0.368563852, 0.401008987e1, 0.163469054e4},
		{3, 500, 0.120241800e-2, 0.975542239e3, 0.971934985e3, 0.258041912e1, 0.465580682e1, 0.124071337e4},
	})
}

func ExampleRegion1() {
	// Compressed liquid at 3 MPa and 300 K, the first state of R7-97(2012)
	// Table 5.
	s := if97.Region1(3, 300)
	fmt.Printf("v = %.9g m³/kg, h = %.6f kJ/kg, w = %.5f m/s\n", s.V, s.H, s.W)
	// Output: v = 0.00100215168 m³/kg, h = 115.331273 kJ/kg, w = 1507.73921 m/s
}

func BenchmarkRegion1(b *testing.B) {
	for b.Loop() {
		regSink = if97.Region1(3, 300)
	}
}
