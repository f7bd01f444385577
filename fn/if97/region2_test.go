package if97_test

import (
	"testing"

	"steamcell/fn/if97"
)

func TestRegion2VerificationTable(t *testing.T) {
	// R7-97(2012) Table 15: v in m³/kg, h and u in kJ/kg, s and cp in
	// kJ/(kg·K), w in m/s.
	regCheckTable(t, "Region2", if97.Region2, "V", "MPa", []regVerifyRow{
		{0.0035, 300, 0.394913866e2, 0.254991145e4, 0.241169160e4, 0.852238967e1, 0.191300162e1, 0.427920172e3},
		{0.0035, 700, 0.923015898e2, 0.333568375e4, 0.301262819e4, 0.101749996e2, 0.208141274e1, 0.644289068e3},
		{30, 700, 0.542946619e-2, 0.263149474e4, 0.246861076e4, 0.517540298e1, 0.103505092e2, 0.480386523e3},
	})
}

func TestRegion2MetastableVerificationTable(t *testing.T) {
	// R7-97(2012) Table 18, for the metastable-vapour equation (Eq. 18).
	regCheckTable(t, "Region2Metastable", if97.Region2Metastable, "V", "MPa", []regVerifyRow{
		{1, 450, 0.192516540, 0.276881115e4, 0.257629461e4, 0.656660377e1, 0.276349265e1, 0.498408101e3},
		{1, 440, 0.186212297, 0.274015123e4, 0.255393894e4, 0.650218759e1, 0.298166443e1, 0.489363295e3},
		{1.5, 450, 0.121685206, 0.272134539e4, 0.253881758e4, 0.629170440e1, 0.362795578e1, 0.481941819e3},
	})
}

func BenchmarkRegion2(b *testing.B) {
	for b.Loop() {
		regSink = if97.Region2(30, 700)
	}
}

func BenchmarkRegion2Metastable(b *testing.B) {
	for b.Loop() {
		regSink = if97.Region2Metastable(1, 450)
	}
}
