package transport

import (
	"fmt"
	"math"
	"testing"
)

func TestCheckRanges(t *testing.T) {
	// Ranges of validity of IAPWS R12-08 and R15-11 as recalled (see the
	// doc comments of CheckViscosityRange and CheckConductivityRange):
	// points just inside and just outside each edge.
	for _, tc := range []struct {
		p, T           float64
		viscOK, condOK bool
	}{
		{0.1, 300, true, true},
		{0.1, 1173.15, true, true},
		{0.1, 1173.2, false, false},
		{0.1, 273.16, true, true},
		{0.1, 273.14, false, false},     // below the melting point, 273.1525 K
		{0.0005, 273.155, false, false}, // below p_t: T ≥ 273.16 K
		{0.0005, 273.165, true, true},
		{100, 1000, true, true},
		{150, 1000, true, false}, // R15-11: 874 K above 100 MPa
		{150, 870, true, true},
		{260, 580, true, false},  // R15-11: 573 K above 250 MPa
		{310, 880, false, false}, // R12-08: 873.15 K above 300 MPa
		{310, 570, true, true},
		{400, 440, false, true}, // R12-08: 433.15 K above 350 MPa
		{700, 400, false, true}, // R12-08: 373.15 K above 500 MPa
		{800, 350, true, false}, // R15-11: 348 K above 785 MPa
		{1000, 340, true, true},
		{1000, 290, false, false}, // below the ice VI melting point, 300.2 K
		{1001, 340, false, false}, // above 1000 MPa
		{0, 300, false, false},
		{math.NaN(), 300, false, false},
		{0.1, math.NaN(), false, false},
		{math.Inf(1), 300, false, false},
	} {
		for _, c := range []struct {
			name  string
			check func(p, T float64) *Warning
			ok    bool
			pr    Property
		}{
			{"CheckViscosityRange", CheckViscosityRange, tc.viscOK, PropertyViscosity},
			{"CheckConductivityRange", CheckConductivityRange, tc.condOK, PropertyConductivity},
		} {
			w := c.check(tc.p, tc.T)
			if (w == nil) != c.ok || (w != nil && (w.Property != c.pr || !same(w.P, tc.p) || !same(w.T, tc.T))) {
				t.Errorf("%s(p=%g MPa, T=%g K) = %v, want in range: %v", c.name, tc.p, tc.T, w, c.ok)
			}
		}
	}
}

func same(a, b float64) bool { return a == b || (math.IsNaN(a) && math.IsNaN(b)) }

func TestMeltingTemperature(t *testing.T) {
	// Trade fact (common practice, no source): air-free water melts at
	// 1 atm at 273.1525 K, 0.0075 K below the triple point.
	tpCheck(t, "T_m(0.101325 MPa)", MeltingTemperature(0.101325), 273.1525, 2e-4, 0)
	// IAPWS R14-08(2011): the melting curves of neighbouring ices meet at the
	// triple points the release lists (Ih–III at 251.165 K, 208.566 MPa;
	// III–V at 256.164 K, 350.100 MPa; V–VI at 273.31 K, 632.400 MPa;
	// VI–VII at 355 K, 2216 MPa) to the five or six digits printed there.
	tpCheck(t, "p_m,Ih(251.165 K) in MPa", iceIhPressure(iceIIIT), iceIIIP, 0, 1e-5)
	for _, tc := range []struct{ p, want float64 }{
		{iceIIIP, iceIIIT},
		{iceVP, iceVT},
		{iceVIP, iceVIT},
	} {
		lo, hi := MeltingTemperature(math.Nextafter(tc.p, 0)), MeltingTemperature(math.Nextafter(tc.p, math.Inf(1)))
		tpCheck(t, fmt.Sprintf("T_m just below %g MPa", tc.p), lo, tc.want, 0, 2e-5)
		tpCheck(t, fmt.Sprintf("T_m just above %g MPa", tc.p), hi, tc.want, 0, 2e-5)
	}
	tpCheck(t, "T_m(2216 MPa)", MeltingTemperature(iceVIIP), 355, 0, 2e-5)
	if got := MeltingTemperature(0.0001); got != 273.16 {
		t.Errorf("MeltingTemperature(0.0001 MPa) = %g, want the triple point 273.16 K", got)
	}
	if got := MeltingTemperature(3000); !math.IsNaN(got) {
		t.Errorf("MeltingTemperature(3000 MPa) = %g, want NaN", got)
	}
}
