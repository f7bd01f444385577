package if97_test

import (
	"testing"

	"steamcell/fn/if97"
)

func TestRegion5VerificationTable(t *testing.T) {
	// R7-97(2012) Table 42 (the region 5 equation as revised in 2007): v in
	// m³/kg, h and u in kJ/kg, s and cp in kJ/(kg·K), w in m/s.
	regCheckTable(t, "Region5", if97.Region5, "V", "MPa", []regVerifyRow{
		{0.5, 1500, 0.138455090e1, 0.521976855e4, 0.452749310e4, 0.965408875e1, 0.261609445e1, 0.917068690e3},
		{30, 1500, 0.230761299e-1, 0.516723514e4, 0.447495124e4, 0.772970133e1, 0.272724317e1, 0.928548002e3},
		{30, 2000, 0.311385219e-1, 0.657122604e4, 0.563707038e4, 0.853640523e1, 0.288569882e1, 0.106736948e4},
	})
}

func BenchmarkRegion5(b *testing.B) {
	for b.Loop() {
		regSink = if97.Region5(30, 1500)
	}
}
