package units_test

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/units"
)

// nistFactor reads a factor as NIST SP 811 prints it ("6.894 757 E+03") and
// returns its value and the relative tolerance its rounding allows: half a
// unit in the last printed digit. Exact factors get 1e-15, a few float64
// roundings.
func nistFactor(t *testing.T, s string, exact bool) (v, relTol float64) {
	t.Helper()
	s = strings.ReplaceAll(s, " ", "")
	mant, exp, ok := strings.Cut(s, "E")
	if !ok {
		t.Fatalf("factor %q has no exponent", s)
	}
	v, err := strconv.ParseFloat(mant+"e"+exp, 64)
	if err != nil {
		t.Fatalf("factor %q: %v", s, err)
	}
	if exact {
		return v, 1e-15
	}
	e, err := strconv.Atoi(exp)
	if err != nil {
		t.Fatalf("factor %q: %v", s, err)
	}
	decimals := 0
	if _, frac, ok := strings.Cut(mant, "."); ok {
		decimals = len(frac)
	}
	return v, 0.5 * math.Pow(10, float64(e-decimals)) / math.Abs(v)
}

// unitSize returns how many base units one u is. A gauge unit's slope is
// taken over a span of 1e6 so that subtracting the atmosphere cancels no
// digits that matter.
func unitSize(u units.Unit) float64 {
	if u.Gauge {
		return (u.ToBase(1e6, 0) - u.ToBase(0, 0)) / 1e6
	}
	return u.ToBase(1, 0)
}

// TestNISTFactors checks the size of every non-SI unit, and of the SI
// multiples, against NIST Special Publication 811 (2008), Appendix B
// (factors from memory of B.8, "Factors for units listed alphabetically",
// and B.9 for the temperature interval). SP 811 gives a factor to the SI
// unit; toBase turns that SI unit into the engine's base unit (Pa -> MPa:
// 1e-6). Tolerance: half a unit in the last digit SP 811 prints; 1e-15
// relative where the factor is exact.
func TestNISTFactors(t *testing.T) {
	for _, tc := range []struct {
		unit    string
		dim     units.Dim
		factor  string  // to the SI unit, as printed in SP 811
		exact   bool    // SP 811 marks the factor exact (bold)
		toBase  float64 // SI unit -> base unit
		inverse bool    // the unit is the reciprocal of the SP 811 one
		entry   string
	}{
		// NIST SP 811 (2008), B.8: atmosphere, standard (atm) -> Pa 1.013 25 E+05 (exact)
		{"atm", units.Pressure, "1.013 25 E+05", true, 1e-6, false, "atmosphere, standard"},
		// NIST SP 811 (2008), B.8: bar (bar) -> Pa 1.0 E+05 (exact)
		{"bar", units.Pressure, "1.0 E+05", true, 1e-6, false, "bar"},
		{"barg", units.Pressure, "1.0 E+05", true, 1e-6, false, "bar (gauge slope)"},
		// NIST SP 811 (2008), B.8: millibar (mbar) -> Pa 1.0 E+02 (exact)
		{"mbar", units.Pressure, "1.0 E+02", true, 1e-6, false, "millibar"},
		// NIST SP 811 (2008), B.8: pound-force per square inch (psi) -> Pa 6.894 757 E+03
		{"psi", units.Pressure, "6.894 757 E+03", false, 1e-6, false, "pound-force per square inch"},
		{"psia", units.Pressure, "6.894 757 E+03", false, 1e-6, false, "pound-force per square inch"},
		{"psig", units.Pressure, "6.894 757 E+03", false, 1e-6, false, "pound-force per square inch (gauge slope)"},
		// NIST SP 811 (2008), B.8: kilogram-force per square centimeter (kgf/cm²) -> Pa 9.806 65 E+04 (exact)
		{"kgf/cm²", units.Pressure, "9.806 65 E+04", true, 1e-6, false, "kilogram-force per square centimeter"},
		{"kgf/cm²g", units.Pressure, "9.806 65 E+04", true, 1e-6, false, "kilogram-force per square centimeter (gauge slope)"},
		// NIST SP 811 (2008), B.8: millimeter of mercury, conventional (mmHg) -> Pa 1.333 224 E+02
		{"mmHg", units.Pressure, "1.333 224 E+02", false, 1e-6, false, "millimeter of mercury, conventional"},
		// NIST SP 811 (2008), B.8: inch of mercury, conventional (inHg) -> Pa 3.386 389 E+03
		{"inHg", units.Pressure, "3.386 389 E+03", false, 1e-6, false, "inch of mercury, conventional"},
		// NIST SP 811 (2008), B.8: torr (Torr) -> Pa 1.333 224 E+02
		{"torr", units.Pressure, "1.333 224 E+02", false, 1e-6, false, "torr"},
		// NIST SP 811 (2008), B.8: atmosphere, technical (at) -> Pa 9.806 65 E+04 (exact)
		{"ata", units.Pressure, "9.806 65 E+04", true, 1e-6, false, "atmosphere, technical"},
		// NIST SP 811 (2008), B.8: millimeter of water, conventional (mmH2O) -> Pa 9.806 65 E+00 (exact)
		{"mmH2Oa", units.Pressure, "9.806 65 E+00", true, 1e-6, false, "millimeter of water, conventional"},
		{"mmH2Og", units.Pressure, "9.806 65 E+00", true, 1e-6, false, "millimeter of water, conventional (gauge slope)"},
		// NIST SP 811 (2008), B.8: inch of water, conventional (inH2O) -> Pa 2.490 889 E+02
		{"inH2Oa", units.Pressure, "2.490 889 E+02", false, 1e-6, false, "inch of water, conventional"},
		{"inH2Og", units.Pressure, "2.490 889 E+02", false, 1e-6, false, "inch of water, conventional (gauge slope)"},
		// NIST SP 811 (2008), B.8: pound-force per square inch (psi) -> Pa 6.894 757 E+03, reciprocal
		{"1/psi", units.InversePressure, "6.894 757 E+03", false, 1e-6, true, "pound-force per square inch"},
		// NIST SP 811 (2008), B.8: bar -> Pa 1.0 E+05 (exact), reciprocal
		{"1/bar", units.InversePressure, "1.0 E+05", true, 1e-6, true, "bar"},

		// NIST SP 811 (2008), B.8: British thermal unit_IT per pound (Btu_IT/lb) -> J/kg 2.326 E+03 (exact)
		{"Btu/lb", units.SpecificEnergy, "2.326 E+03", true, 1e-3, false, "British thermal unit_IT per pound"},
		// NIST SP 811 (2008), B.8: calorie_IT per gram (cal_IT/g) -> J/kg 4.1868 E+03 (exact); kcal/kg = cal/g
		{"kcal/kg", units.SpecificEnergy, "4.1868 E+03", true, 1e-3, false, "calorie_IT per gram"},

		// NIST SP 811 (2008), B.8: British thermal unit_IT per pound degree Fahrenheit -> J/(kg·K) 4.1868 E+03 (exact)
		{"Btu/(lb·°F)", units.SpecificEntropy, "4.1868 E+03", true, 1e-3, false, "Btu_IT/(lb·°F)"},
		// NIST SP 811 (2008), B.8: British thermal unit_IT per pound degree Rankine -> J/(kg·K) 4.1868 E+03 (exact)
		{"Btu/(lb·°R)", units.SpecificEntropy, "4.1868 E+03", true, 1e-3, false, "Btu_IT/(lb·°R)"},
		// NIST SP 811 (2008), B.8: calorie_IT per gram degree Celsius -> J/(kg·K) 4.1868 E+03 (exact)
		{"kcal/(kg·K)", units.SpecificEntropy, "4.1868 E+03", true, 1e-3, false, "cal_IT/(g·°C)"},

		// NIST SP 811 (2008), B.8: cubic foot per pound (ft³/lb) -> m³/kg 6.242 796 E-02
		{"ft³/lb", units.SpecificVolume, "6.242 796 E-02", false, 1, false, "cubic foot per pound"},
		// NIST SP 811 (2008), B.8: liter (L) -> m³ 1.0 E-03 (exact)
		{"L/kg", units.SpecificVolume, "1.0 E-03", true, 1, false, "liter"},
		// NIST SP 811 (2008), B.8: pound per cubic foot (lb/ft³) -> kg/m³ 1.601 846 E+01
		{"lb/ft³", units.Density, "1.601 846 E+01", false, 1, false, "pound per cubic foot"},
		// NIST SP 811 (2008), B.8: gram per cubic centimeter (g/cm³) -> kg/m³ 1.0 E+03 (exact)
		{"g/cm³", units.Density, "1.0 E+03", true, 1, false, "gram per cubic centimeter"},
		// NIST SP 811 (2008), B.8: foot per second (ft/s) -> m/s 3.048 E-01 (exact)
		{"ft/s", units.Speed, "3.048 E-01", true, 1, false, "foot per second"},

		// NIST SP 811 (2008), B.8: centipoise (cP) -> Pa·s 1.0 E-03 (exact)
		{"cP", units.DynamicViscosity, "1.0 E-03", true, 1, false, "centipoise"},
		// NIST SP 811 (2008), B.8: pound per foot hour [lb/(ft·h)] -> Pa·s 4.133 789 E-04
		{"lb/(ft·h)", units.DynamicViscosity, "4.133 789 E-04", false, 1, false, "pound per foot hour"},
		// NIST SP 811 (2008), B.8: pound per foot second [lb/(ft·s)] -> Pa·s 1.488 164 E+00
		{"lb/(ft·s)", units.DynamicViscosity, "1.488 164 E+00", false, 1, false, "pound per foot second"},
		// NIST SP 811 (2008), B.8: British thermal unit_IT per hour foot degree Fahrenheit -> W/(m·K) 1.730 735 E+00
		{"Btu/(h·ft·°F)", units.ThermalConductivity, "1.730 735 E+00", false, 1, false, "Btu_IT/(h·ft·°F)"},
		// NIST SP 811 (2008), B.8: dyne per centimeter (dyn/cm) -> N/m 1.0 E-03 (exact)
		{"dyn/cm", units.SurfaceTension, "1.0 E-03", true, 1, false, "dyne per centimeter"},

		// NIST SP 811 (2008), B.8: centistokes (cSt) -> m²/s 1.0 E-06 (exact)
		{"cSt", units.KinematicViscosity, "1.0 E-06", true, 1, false, "centistokes"},
		// NIST SP 811 (2008), B.8: square foot per second (ft²/s) -> m²/s 9.290 304 E-02 (exact)
		{"ft²/s", units.KinematicViscosity, "9.290 304 E-02", true, 1, false, "square foot per second"},
		{"ft²/s", units.ThermalDiffusivity, "9.290 304 E-02", true, 1, false, "square foot per second"},
		// NIST SP 811 (2008), B.8: square foot per hour (ft²/h) -> m²/s 2.580 64 E-05 (exact)
		{"ft²/h", units.KinematicViscosity, "2.580 64 E-05", true, 1, false, "square foot per hour"},
		{"ft²/h", units.ThermalDiffusivity, "2.580 64 E-05", true, 1, false, "square foot per hour"},

		// NIST SP 811 (2008), B.9, temperature interval: degree Fahrenheit -> K 5.555 556 E-01, reciprocal
		{"1/°F", units.InverseTemperature, "5.555 556 E-01", false, 1, true, "degree Fahrenheit (interval)"},
		// NIST SP 811 (2008), B.9, temperature interval: degree Rankine -> K 5.555 556 E-01, reciprocal
		{"1/°R", units.InverseTemperature, "5.555 556 E-01", false, 1, true, "degree Rankine (interval)"},
		// NIST SP 811 (2008), B.9, temperature interval: degree Celsius -> K 1.0 E+00 (exact), reciprocal
		{"1/°C", units.InverseTemperature, "1.0 E+00", true, 1, true, "degree Celsius (interval)"},
	} {
		u, err := units.Lookup(tc.unit, tc.dim)
		if err != nil {
			t.Errorf("Lookup(%q, %s): %v", tc.unit, tc.dim, err)
			continue
		}
		f, tol := nistFactor(t, tc.factor, tc.exact)
		want := f * tc.toBase
		if tc.inverse {
			want = 1 / want
		}
		got := unitSize(u)
		if !scalar.EqualWithinRel(got, want, tol) {
			t.Errorf("%s (SP 811 %s): 1 %s = %.10g base units, want %.10g (rel tol %.1e)",
				tc.unit, tc.entry, tc.unit, got, want, tol)
		}
	}
}

// TestSIMultiples checks the SI and decimal units against their prefixes
// (SI prefixes are exact; the litre is exactly 1 dm³, the poise family and
// dyne are CGS decimals: NIST SP 811 (2008), B.8). Tolerance: 1e-15
// relative.
func TestSIMultiples(t *testing.T) {
	for _, tc := range []struct {
		unit string
		dim  units.Dim
		want float64 // base units per unit
	}{
		{"Pa", units.Pressure, 1e-6},
		{"kPa", units.Pressure, 1e-3},
		{"kPag", units.Pressure, 1e-3},
		{"MPa", units.Pressure, 1},
		{"MPag", units.Pressure, 1},
		{"mbarg", units.Pressure, 1e-4},
		{"J/kg", units.SpecificEnergy, 1e-3},
		{"MJ/kg", units.SpecificEnergy, 1e3},
		{"kJ/kg", units.SpecificEnergy, 1},
		{"J/(kg·K)", units.SpecificEntropy, 1e-3},
		{"cm³/g", units.SpecificVolume, 1e-3},
		{"Pa·s", units.DynamicViscosity, 1},
		{"mPa·s", units.DynamicViscosity, 1e-3},
		{"µPa·s", units.DynamicViscosity, 1e-6},
		{"mW/(m·K)", units.ThermalConductivity, 1e-3},
		{"mN/m", units.SurfaceTension, 1e-3},
		{"%", units.Quality, 1e-2},
		{"mm²/s", units.KinematicViscosity, 1e-6},
		{"cm²/s", units.KinematicViscosity, 1e-4},
		{"mm²/s", units.ThermalDiffusivity, 1e-6},
		{"cm²/s", units.ThermalDiffusivity, 1e-4},
		{"1/kPa", units.InversePressure, 1e3},
		{"1/Pa", units.InversePressure, 1e6},
		{"1/K", units.InverseTemperature, 1},
	} {
		u, err := units.Lookup(tc.unit, tc.dim)
		if err != nil {
			t.Errorf("Lookup(%q, %s): %v", tc.unit, tc.dim, err)
			continue
		}
		got := unitSize(u)
		if !scalar.EqualWithinRel(got, tc.want, 1e-15) {
			t.Errorf("1 %s = %.17g base units, want %.17g", tc.unit, got, tc.want)
		}
	}
}

// TestTemperaturePoints checks the temperature scales at fixed points.
// Source: exact definitions, T/K = t/°C + 273.15 = (t/°F + 459.67)/1.8 =
// (T/°R)/1.8 (NIST SP 811 (2008), B.8, degree Celsius, degree Fahrenheit,
// degree Rankine). Tolerance: 1e-12 relative.
func TestTemperaturePoints(t *testing.T) {
	for _, tc := range []struct {
		text string
		want float64 // K
	}{
		{"0 °C", 273.15},
		{"100 °C", 373.15},
		{"-40 °C", 233.15},
		{"32 °F", 273.15},
		{"212 °F", 373.15},
		{"-40 °F", 233.15},
		{"491.67 R", 273.15},
		{"671.67 °R", 373.15},
		{"273.15 K", 273.15},
		{"0.01 °C", 273.16},    // triple point of water on ITS-90 (exact by the Celsius definition)
		{"647.096 K", 647.096}, // critical temperature, IAPWS R7-97(2012) Eq. 3
		{"-459.66 °F", 0.01 / 1.8},
	} {
		got, err := units.Parse(tc.text, units.Temperature, units.Options{Name: "T"})
		if err != nil {
			t.Errorf("Parse(%q): %v", tc.text, err)
			continue
		}
		if !scalar.EqualWithinRel(got, tc.want, 1e-12) {
			t.Errorf("Parse(%q) = %.15g K, want %.15g K", tc.text, got, tc.want)
		}
	}
}

// TestVacuumReadings: a vacuum reading counts down from the atmosphere of
// patm, p = patm − v. Sizes from NIST SP 811 (2008), B.8: inch of mercury,
// conventional (inHg) 3.386 389 E+03 Pa; millimeter of mercury,
// conventional (mmHg) 1.333 224 E+02 Pa; kPa exact. Tolerance: half a unit
// in the last digit SP 811 prints, on the reading's part of p.
func TestVacuumReadings(t *testing.T) {
	for _, tc := range []struct {
		text   string
		patm   float64 // MPa; 0: the standard atmosphere
		v      float64 // the reading, in its unit
		factor string  // the unit to Pa, as printed in SP 811
		exact  bool
	}{
		{"28 inHg vac", 0, 28, "3.386 389 E+03", false},
		{"24 inHg vacuum", 0.0899, 24, "3.386 389 E+03", false},
		{"710 mmHg vac", 0, 710, "1.333 224 E+02", false},
		{"80 kPa vac", 0, 80, "1.0 E+03", true},
		{"80kPa vac", 0.095, 80, "1.0 E+03", true},
		{"0 kPa vac", 0, 0, "1.0 E+03", true},
	} {
		f, tol := nistFactor(t, tc.factor, tc.exact)
		patm := tc.patm
		if patm == 0 {
			patm = units.StandardAtmosphere
		}
		reading := tc.v * f * 1e-6
		got, u, err := units.ParseUnit(tc.text, units.Pressure, units.Options{Name: "p", Patm: tc.patm})
		if err != nil {
			t.Errorf("Parse(%q, patm %g): %v", tc.text, tc.patm, err)
			continue
		}
		if !u.Gauge || !scalar.EqualWithinAbs(got, patm-reading, tol*reading+1e-15) {
			t.Errorf("Parse(%q, patm %g) = %.10g MPa (%s, gauge %v), want patm − %.10g = %.10g MPa",
				tc.text, tc.patm, got, u.Name, u.Gauge, reading, patm-reading)
		}
		if back := u.FromBase(got, tc.patm); !scalar.EqualWithinAbsOrRel(back, tc.v, 1e-9, 1e-12) {
			t.Errorf("%s: FromBase gives %.12g, want %g", tc.text, back, tc.v)
		}
	}
}

// TestAmbiguousUnits: text that names a unit without saying whether it is
// gauge or absolute, or a prefix by case alone, is refused with a message
// that says what to write (common practice, no source: water columns are
// read both as gauge draft and as absolute, "at" both ways).
func TestAmbiguousUnits(t *testing.T) {
	for _, tc := range []struct {
		text string
		dim  units.Dim
		kind error
		want string
	}{
		{"25 mmH2O", units.Pressure, units.ErrUnknownUnit, "mmH2Og"},
		{"25 mm w.c.", units.Pressure, units.ErrUnknownUnit, "mmH2Oa"},
		{"4 inH2O", units.Pressure, units.ErrUnknownUnit, "inH2Og"},
		{"4 inWC", units.Pressure, units.ErrUnknownUnit, "inH2Oa"},
		{"1.2 at", units.Pressure, units.ErrUnknownUnit, "ata"},
		{"28 vac", units.Pressure, units.ErrUnknownUnit, "inHg vac"},
		{"-5 kPa vac", units.Pressure, units.ErrAmbiguousNumber, "kPag"},
		{"31 inHg vac", units.Pressure, units.ErrPressureNotPositive, "above 0"},
		{"2.8 mJ/kg", units.SpecificEnergy, units.ErrUnknownUnit, "MJ/kg"},
		{"-1 bar", units.Pressure, units.ErrPressureNotPositive, "absolute"},
	} {
		_, err := units.Parse(tc.text, tc.dim, units.Options{Name: "p"})
		if !errors.Is(err, tc.kind) || !strings.Contains(err.Error(), tc.want) {
			t.Errorf("Parse(%q, %s) = %v, want %v mentioning %q", tc.text, tc.dim, err, tc.kind, tc.want)
		}
	}
	// Marked forms are read, and the marks mean what they say.
	for _, tc := range []struct {
		text string
		want float64 // MPa
	}{
		// NIST SP 811 (2008), B.8: millimeter of water, conventional = 9.806 65 Pa (exact)
		{"250 mmH2Og", units.StandardAtmosphere + 250*9.80665e-6},
		{"250 mmH2O(a)", 250 * 9.80665e-6},
		// NIST SP 811 (2008), B.8: inch of water, conventional = 2.490 889 E+02 Pa
		{"4 inWC(g)", units.StandardAtmosphere + 4*249.0889e-6},
		// NIST SP 811 (2008), B.8: atmosphere, technical = 9.806 65 E+04 Pa (exact)
		{"1.2 ata", 1.2 * 0.0980665},
		// NIST SP 811 (2008), B.8: torr = 1.333 224 E+02 Pa
		{"750 Torr", 750 * 133.3224e-6},
	} {
		got, err := units.Parse(tc.text, units.Pressure, units.Options{})
		if err != nil || !scalar.EqualWithinRel(got, tc.want, 5e-7) {
			t.Errorf("Parse(%q) = %.10g, %v; want %.10g MPa", tc.text, got, err, tc.want)
		}
	}
}
