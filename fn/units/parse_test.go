package units_test

import (
	"errors"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"steamcell/fn/units"
)

// Exact definitions the expected values below are computed from (NIST SP
// 811 (2008), B.8; standard atmosphere 101 325 Pa; conventional mmHg
// 133.322387415 Pa), independent of the package's own constants.
const (
	tPsi   = 0.45359237 * 9.80665 / (0.0254 * 0.0254) * 1e-6 // psi, MPa
	tAtm   = 0.101325                                        // standard atmosphere, MPa
	tFt3Lb = 0.3048 * 0.3048 * 0.3048 / 0.45359237           // ft³/lb, m³/kg
	tLbFt3 = 0.45359237 / (0.3048 * 0.3048 * 0.3048)         // lb/ft³, kg/m³
	tLbFtH = 0.45359237 / (0.3048 * 3600)                    // lb/(ft·h), Pa·s
	tBtuHF = 1055.05585262 * 1.8 / (3600 * 0.3048)           // Btu/(h·ft·°F), W/(m·K)
	tMmHg  = 133.322387415e-6                                // conventional mmHg, MPa
)

// TestParse reads values as people type them. Expected values come from the
// exact definitions above. Tolerance: 1e-12 relative.
func TestParse(t *testing.T) {
	si := units.Options{}
	for _, tc := range []struct {
		text string
		dim  units.Dim
		opt  units.Options
		want float64 // base units
		unit string  // Name of the unit it was read in
	}{
		// The examples.
		{"600kPa", units.Pressure, si, 0.6, "kPa"},
		{"6 bar", units.Pressure, si, 0.6, "bar"},
		{"6 barg", units.Pressure, si, 0.6 + tAtm, "barg"},
		{"87 psig", units.Pressure, si, 87*tPsi + tAtm, "psig"},
		{"0.6 MPa", units.Pressure, si, 0.6, "MPa"},
		{"330C", units.Temperature, si, 603.15, "°C"},
		{"330 °C", units.Temperature, si, 603.15, "°C"},
		{"626 °F", units.Temperature, si, 603.15, "°F"},
		{"603.15 K", units.Temperature, si, 603.15, "K"},
		{"1100 R", units.Temperature, si, 1100 / 1.8, "°R"},
		{"2800 kJ/kg", units.SpecificEnergy, si, 2800, "kJ/kg"},
		{"1204 Btu/lb", units.SpecificEnergy, si, 1204 * 2.326, "Btu/lb"},
		{"0.25 m3/kg", units.SpecificVolume, si, 0.25, "m³/kg"},
		{"4 ft³/lb", units.SpecificVolume, si, 4 * tFt3Lb, "ft³/lb"},
		{"85 %", units.Quality, si, 0.85, "%"},
		{"0.85", units.Quality, si, 0.85, ""},

		// Case and spacing; MPa in any case but the millipascal one.
		{"600 KPA", units.Pressure, si, 0.6, "kPa"},
		{"600 kpa", units.Pressure, si, 0.6, "kPa"},
		{"600 Kpa", units.Pressure, si, 0.6, "kPa"},
		{"6 Bar", units.Pressure, si, 0.6, "bar"},
		{"6 BAR", units.Pressure, si, 0.6, "bar"},
		{"0.6 mpa", units.Pressure, si, 0.6, "MPa"},
		{"0.6 Mpa", units.Pressure, si, 0.6, "MPa"},
		{"0.6 MPA", units.Pressure, si, 0.6, "MPa"},
		{"  6 bar  ", units.Pressure, si, 0.6, "bar"},
		{"6\tbar", units.Pressure, si, 0.6, "bar"},
		{"6\u00a0bar", units.Pressure, si, 0.6, "bar"}, // no-break space
		{"6\u202fbar", units.Pressure, si, 0.6, "bar"}, // narrow no-break space, as SI style prints
		{"60 mbar", units.Pressure, si, 0.006, "mbar"},
		{"60 MBAR", units.Pressure, si, 0.006, "mbar"},

		// Gauge and absolute marks.
		{"6 bar(g)", units.Pressure, si, 0.6 + tAtm, "barg"},
		{"6 bar g", units.Pressure, si, 0.6 + tAtm, "barg"},
		{"6 BARG", units.Pressure, si, 0.6 + tAtm, "barg"},
		{"6 bar gauge", units.Pressure, si, 0.6 + tAtm, "barg"},
		{"6 bara", units.Pressure, si, 0.6, "bar"},
		{"6 bar(a)", units.Pressure, si, 0.6, "bar"},
		{"6 bar abs", units.Pressure, si, 0.6, "bar"},
		{"500 kPag", units.Pressure, si, 0.5 + tAtm, "kPag"},
		{"500 kPa(g)", units.Pressure, si, 0.5 + tAtm, "kPag"},
		{"500 kPa(a)", units.Pressure, si, 0.5, "kPa"},
		{"1 MPag", units.Pressure, si, 1 + tAtm, "MPag"},
		{"1 MPa(g)", units.Pressure, si, 1 + tAtm, "MPag"},
		{"87 psi", units.Pressure, si, 87 * tPsi, "psia"},
		{"87 psia", units.Pressure, si, 87 * tPsi, "psia"},
		{"87 psi(a)", units.Pressure, si, 87 * tPsi, "psia"},
		{"87 PSIG", units.Pressure, si, 87*tPsi + tAtm, "psig"},
		{"87 psi(g)", units.Pressure, si, 87*tPsi + tAtm, "psig"},
		{"10 kgf/cm²", units.Pressure, si, 0.980665, "kgf/cm²"},
		{"10 kgf/cm2g", units.Pressure, si, 0.980665 + tAtm, "kgf/cm²g"},
		{"10 kg/cm2g", units.Pressure, si, 0.980665 + tAtm, "kgf/cm²g"},
		{"10 kg/cm²(g)", units.Pressure, si, 0.980665 + tAtm, "kgf/cm²g"},
		{"50 mbarg", units.Pressure, si, 0.005 + tAtm, "mbarg"},
		{"-0.5 barg", units.Pressure, si, tAtm - 0.05, "barg"}, // vacuum
		{"1 atm", units.Pressure, si, tAtm, "atm"},
		{"760 mmHg", units.Pressure, si, 760 * tMmHg, "mmHg"},
		{"760 mm Hg", units.Pressure, si, 760 * tMmHg, "mmHg"},
		{"29.92 inHg", units.Pressure, si, 29.92 * 25.4 * tMmHg, "inHg"},
		{"101325 Pa", units.Pressure, si, tAtm, "Pa"},
		{"101325 N/m²", units.Pressure, si, tAtm, "Pa"},

		// Temperature spellings.
		{"330 deg C", units.Temperature, si, 603.15, "°C"},
		{"330 degC", units.Temperature, si, 603.15, "°C"},
		{"330 degrees C", units.Temperature, si, 603.15, "°C"},
		{"330℃", units.Temperature, si, 603.15, "°C"},
		{"330 ºC", units.Temperature, si, 603.15, "°C"}, // masculine ordinal, typed for degree on some keyboards
		{"330 celsius", units.Temperature, si, 603.15, "°C"},
		{"330 c", units.Temperature, si, 603.15, "°C"},
		{"626 degF", units.Temperature, si, 603.15, "°F"},
		{"626 ℉", units.Temperature, si, 603.15, "°F"},
		{"626 F", units.Temperature, si, 603.15, "°F"},
		{"603.15 k", units.Temperature, si, 603.15, "K"},
		{"603.15 °K", units.Temperature, si, 603.15, "K"},
		{"603.15 \u212a", units.Temperature, si, 603.15, "K"}, // kelvin sign
		{"1100 °R", units.Temperature, si, 1100 / 1.8, "°R"},
		{"1100 degR", units.Temperature, si, 1100 / 1.8, "°R"},

		// Energy, entropy and heat capacity.
		{"2800 J/g", units.SpecificEnergy, si, 2800, "kJ/kg"},
		{"2.8e6 J/kg", units.SpecificEnergy, si, 2800, "J/kg"},
		{"500 kcal/kg", units.SpecificEnergy, si, 500 * 4.1868, "kcal/kg"},
		{"1204 BTU/lbm", units.SpecificEnergy, si, 1204 * 2.326, "Btu/lb"},
		{"6.5 kJ/(kg·K)", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 kJ/(kg⋅K)", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 kJ/kgK", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 kJ/kg/K", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 kJ/(kg K)", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 kJ/kg-K", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 kJ/kg.K", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 kJ/kg*K", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"6.5 KJ/KG K", units.SpecificEntropy, si, 6.5, "kJ/(kg·K)"},
		{"4.18 kJ/(kg·°C)", units.SpecificEntropy, si, 4.18, "kJ/(kg·K)"},
		{"6500 J/(kg·K)", units.SpecificEntropy, si, 6.5, "J/(kg·K)"},
		{"1.5 Btu/(lb·°R)", units.SpecificEntropy, si, 1.5 * 4.1868, "Btu/(lb·°R)"},
		{"1.5 Btu/lb-R", units.SpecificEntropy, si, 1.5 * 4.1868, "Btu/(lb·°R)"},
		{"1.5 Btu/(lb·°F)", units.SpecificEntropy, si, 1.5 * 4.1868, "Btu/(lb·°F)"},
		{"1.5 Btu/lbm-F", units.SpecificEntropy, si, 1.5 * 4.1868, "Btu/(lb·°F)"},
		{"1.5 Btu/(lbm °F)", units.SpecificEntropy, si, 1.5 * 4.1868, "Btu/(lb·°F)"},
		{"1 kcal/(kg·°C)", units.SpecificEntropy, si, 4.1868, "kcal/(kg·K)"},

		// Volume and density.
		{"0.25 m^3/kg", units.SpecificVolume, si, 0.25, "m³/kg"},
		{"0.25 m³/kg", units.SpecificVolume, si, 0.25, "m³/kg"},
		{"250 L/kg", units.SpecificVolume, si, 0.25, "L/kg"},
		{"250 l/kg", units.SpecificVolume, si, 0.25, "L/kg"},
		{"250 cm³/g", units.SpecificVolume, si, 0.25, "cm³/g"},
		{"250 cm3/g", units.SpecificVolume, si, 0.25, "cm³/g"},
		{"4 ft^3/lbm", units.SpecificVolume, si, 4 * tFt3Lb, "ft³/lb"},
		{"998 kg/m3", units.Density, si, 998, "kg/m³"},
		{"0.998 g/cm³", units.Density, si, 998, "g/cm³"},
		{"62.3 lb/ft3", units.Density, si, 62.3 * tLbFt3, "lb/ft³"},

		// Transport properties.
		{"1500 m/s", units.Speed, si, 1500, "m/s"},
		{"1000 ft/s", units.Speed, si, 304.8, "ft/s"},
		{"1000 ft/sec", units.Speed, si, 304.8, "ft/s"},
		{"1 Pa·s", units.DynamicViscosity, si, 1, "Pa·s"},
		{"1 kg/(m·s)", units.DynamicViscosity, si, 1, "Pa·s"},
		{"0.89 mPa·s", units.DynamicViscosity, si, 0.89e-3, "mPa·s"},
		{"0.89 mPa.s", units.DynamicViscosity, si, 0.89e-3, "mPa·s"},
		{"0.89 mPa s", units.DynamicViscosity, si, 0.89e-3, "mPa·s"},
		{"0.89 cP", units.DynamicViscosity, si, 0.89e-3, "cP"},
		{"18 µPa·s", units.DynamicViscosity, si, 18e-6, "µPa·s"},
		{"18 μPa·s", units.DynamicViscosity, si, 18e-6, "µPa·s"}, // Greek mu
		{"18 uPa.s", units.DynamicViscosity, si, 18e-6, "µPa·s"},
		{"2.42 lb/(ft·h)", units.DynamicViscosity, si, 2.42 * tLbFtH, "lb/(ft·h)"},
		{"2.42 lbm/ft-hr", units.DynamicViscosity, si, 2.42 * tLbFtH, "lb/(ft·h)"},
		{"0.6 W/(m·K)", units.ThermalConductivity, si, 0.6, "W/(m·K)"},
		{"0.6 W/m-K", units.ThermalConductivity, si, 0.6, "W/(m·K)"},
		{"0.6 W/(m·°C)", units.ThermalConductivity, si, 0.6, "W/(m·K)"},
		{"600 mW/(m·K)", units.ThermalConductivity, si, 0.6, "mW/(m·K)"},
		{"0.35 Btu/(h·ft·°F)", units.ThermalConductivity, si, 0.35 * tBtuHF, "Btu/(h·ft·°F)"},
		{"0.35 Btu/hr-ft-F", units.ThermalConductivity, si, 0.35 * tBtuHF, "Btu/(h·ft·°F)"},
		{"58.9 mN/m", units.SurfaceTension, si, 0.0589, "mN/m"},
		{"0.0589 N/m", units.SurfaceTension, si, 0.0589, "N/m"},
		{"58.9 dyn/cm", units.SurfaceTension, si, 0.0589, "dyn/cm"},
		{"1 mm²/s", units.KinematicViscosity, si, 1e-6, "mm²/s"},
		{"1 mm2/s", units.KinematicViscosity, si, 1e-6, "mm²/s"},
		{"1 cSt", units.KinematicViscosity, si, 1e-6, "cSt"},
		{"1 ft²/s", units.KinematicViscosity, si, 0.09290304, "ft²/s"},
		{"1 ft^2/h", units.KinematicViscosity, si, 0.09290304 / 3600, "ft²/h"},
		{"0.15 mm²/s", units.ThermalDiffusivity, si, 0.15e-6, "mm²/s"},
		{"1 ft2/hr", units.ThermalDiffusivity, si, 0.09290304 / 3600, "ft²/h"},
		{"2.1e-4 1/K", units.InverseTemperature, si, 2.1e-4, "1/K"},
		{"2.1e-4 K⁻¹", units.InverseTemperature, si, 2.1e-4, "1/K"},
		{"2.1e-4 K^-1", units.InverseTemperature, si, 2.1e-4, "1/K"},
		{"1e-4 1/°F", units.InverseTemperature, si, 1.8e-4, "1/°F"},
		{"4.5e-4 1/MPa", units.InversePressure, si, 4.5e-4, "1/MPa"},
		{"4.5e-7 1/kPa", units.InversePressure, si, 4.5e-4, "1/kPa"},
		{"4.5e-5 1/bar", units.InversePressure, si, 4.5e-4, "1/bar"},
		{"1.33", units.Dimensionless, si, 1.33, ""},
		{"1.33 -", units.Dimensionless, si, 1.33, ""},

		// Quality.
		{"85%", units.Quality, si, 0.85, "%"},
		{"85 percent", units.Quality, si, 0.85, "%"},
		{"100 %", units.Quality, si, 1, "%"},
		{"0 %", units.Quality, si, 0, "%"},
		{"1", units.Quality, si, 1, ""},
		{"0", units.Quality, si, 0, ""},
		{"0.5 -", units.Quality, si, 0.5, ""},

		// Number forms.
		{"+6 bar", units.Pressure, si, 0.6, "bar"},
		{"1.2e3 kPa", units.Pressure, si, 1.2, "kPa"},
		{"1.2E+3 kPa", units.Pressure, si, 1.2, "kPa"},
		{"1.2e3kPa", units.Pressure, si, 1.2, "kPa"},
		{"1.2e−3 MPa", units.Pressure, si, 1.2e-3, "MPa"}, // Unicode minus in the exponent
		{"−40 °C", units.Temperature, si, 233.15, "°C"},   // Unicode minus sign
		{".5 MPa", units.Pressure, si, 0.5, "MPa"},
		{"5. bar", units.Pressure, si, 0.5, "bar"},
	} {
		got, u, err := units.ParseUnit(tc.text, tc.dim, tc.opt)
		if err != nil {
			t.Errorf("ParseUnit(%q, %s): %v", tc.text, tc.dim, err)
			continue
		}
		if !scalar.EqualWithinRel(got, tc.want, 1e-12) {
			t.Errorf("ParseUnit(%q, %s) = %.15g, want %.15g", tc.text, tc.dim, got, tc.want)
		}
		if u.Name != tc.unit || u.Dim != tc.dim {
			t.Errorf("ParseUnit(%q, %s) read it in %q (%s), want %q", tc.text, tc.dim, u.Name, u.Dim, tc.unit)
		}
	}
}

// TestParseUnderflow: a number too small for float64 is zero, not an error.
func TestParseUnderflow(t *testing.T) {
	got, err := units.Parse("1e-999", units.Dimensionless, units.Options{})
	if err != nil || got != 0 {
		t.Errorf("Parse(%q) = %g, %v; want 0, nil", "1e-999", got, err)
	}
}

// TestParseOptions covers the unit given apart from the text, unit sets for
// bare numbers and the site atmosphere. Expected values from the exact
// definitions; the 1000 m site pressure is the standard atmosphere model's
// 89.876 kPa (ISO 2533, from memory). Tolerance: 1e-12 relative.
func TestParseOptions(t *testing.T) {
	us, _ := units.SetByName("us")
	bar, _ := units.SetByName("bar")
	for _, tc := range []struct {
		text string
		dim  units.Dim
		opt  units.Options
		want float64
	}{
		{"6", units.Pressure, units.Options{}, 0.006}, // default set si: kPa
		{"330", units.Temperature, units.Options{}, 603.15},
		{"6", units.Pressure, units.Options{Set: bar}, 0.6},
		{"87", units.Pressure, units.Options{Set: us}, 87 * tPsi},
		{"626", units.Temperature, units.Options{Set: us}, 603.15},
		{"1204", units.SpecificEnergy, units.Options{Set: us}, 1204 * 2.326},
		{"6", units.Pressure, units.Options{Unit: "barg"}, 0.6 + tAtm},
		{"6", units.Pressure, units.Options{Unit: " bar(g) "}, 0.6 + tAtm},
		{"6", units.Pressure, units.Options{Unit: "[bar]"}, 0.6},
		{"600 kPa", units.Pressure, units.Options{Unit: "bar"}, 0.6}, // the text's unit wins
		{"603.15 K", units.Temperature, units.Options{Unit: "°C"}, 603.15},
		{"85", units.Quality, units.Options{Unit: "%"}, 0.85},
		{"0 barg", units.Pressure, units.Options{}, tAtm},
		{"0 barg", units.Pressure, units.Options{Patm: 0.089876}, 0.089876},
		{"1 barg", units.Pressure, units.Options{Patm: 0.089876}, 0.189876},
		{"6", units.Pressure, units.Options{Unit: "barg", Patm: 0.089876}, 0.689876},
		{"14.5 psig", units.Pressure, units.Options{Patm: 0.089876}, 14.5*tPsi + 0.089876},
		{"6 bar", units.Pressure, units.Options{Patm: 0.089876}, 0.6}, // absolute: patm unused
	} {
		got, err := units.Parse(tc.text, tc.dim, tc.opt)
		if err != nil {
			t.Errorf("Parse(%q, %s, %+v): %v", tc.text, tc.dim, tc.opt, err)
			continue
		}
		if !scalar.EqualWithinRel(got, tc.want, 1e-12) {
			t.Errorf("Parse(%q, %s, unit %q, patm %g) = %.15g, want %.15g", tc.text, tc.dim, tc.opt.Unit, tc.opt.Patm, got, tc.want)
		}
	}
}

// TestParseErrors checks that each refused input gives the right kind,
// names the input, quotes the text and says what is accepted. Rules: the
// package doc (common practice, no source).
func TestParseErrors(t *testing.T) {
	for _, tc := range []struct {
		text string
		dim  units.Dim
		opt  units.Options
		kind error
		says []string // parts of the message
	}{
		{"", units.Pressure, units.Options{Name: "p"}, units.ErrEmpty, []string{`p ""`, "no value"}},
		{"   ", units.Pressure, units.Options{Name: "p"}, units.ErrEmpty, nil},
		{"\u00a0", units.Temperature, units.Options{Name: "T"}, units.ErrEmpty, nil},

		{"300C", units.Pressure, units.Options{Name: "p"}, units.ErrWrongDimension,
			[]string{`p "300C"`, "°C is a unit of temperature", "p needs a unit of pressure", "kPa", "barg", "psig"}},
		{"6 bar", units.Temperature, units.Options{Name: "T"}, units.ErrWrongDimension, []string{"bar is a unit of pressure", "°F"}},
		{"85 %", units.Pressure, units.Options{Name: "p"}, units.ErrWrongDimension, []string{"quality"}},
		{"1 mPa·s", units.Pressure, units.Options{Name: "p"}, units.ErrWrongDimension, []string{"dynamic viscosity"}},
		{"1 m²/s", units.Pressure, units.Options{}, units.ErrWrongDimension, []string{"kinematic viscosity or thermal diffusivity", "this input"}},
		{"6", units.Pressure, units.Options{Name: "p", Unit: "°C"}, units.ErrWrongDimension, []string{"unit given separately"}},

		{"6 kpsi", units.Pressure, units.Options{Name: "p"}, units.ErrUnknownUnit, []string{`unknown unit "kpsi"`, "MPa, MPag, Pa, kPa"}},
		{"6 bar x", units.Pressure, units.Options{}, units.ErrUnknownUnit, nil},
		{"6 ()", units.Pressure, units.Options{}, units.ErrUnknownUnit, nil},
		{"6 -", units.Pressure, units.Options{}, units.ErrUnknownUnit, nil},
		{"0.5.", units.Quality, units.Options{}, units.ErrUnknownUnit, nil},
		{"0x10 kPa", units.Pressure, units.Options{}, units.ErrUnknownUnit, nil},
		{"6 psid", units.Pressure, units.Options{}, units.ErrUnknownUnit, nil},
		// A degree sign alone could be °C or °F: refused.
		{"300°", units.Temperature, units.Options{Name: "T"}, units.ErrUnknownUnit, []string{`unknown unit "°"`, "°C, °F"}},
		{"300 deg", units.Temperature, units.Options{}, units.ErrUnknownUnit, nil},
		// Exact SI case naming another prefix is refused, not guessed.
		{"0.6 mPa", units.Pressure, units.Options{Name: "p"}, units.ErrUnknownUnit, []string{"millipascal", "write MPa"}},
		{"0.6 mPag", units.Pressure, units.Options{Name: "p"}, units.ErrUnknownUnit, []string{"millipascal"}},
		{"6", units.Pressure, units.Options{Name: "p", Unit: "mPa"}, units.ErrUnknownUnit, []string{"millipascal"}},
		{"1 Mbar", units.Pressure, units.Options{}, units.ErrUnknownUnit, []string{"megabar"}},
		{"1 MPa·s", units.DynamicViscosity, units.Options{}, units.ErrUnknownUnit, []string{"megapascal second"}},
		{"1 MW/(m·K)", units.ThermalConductivity, units.Options{}, units.ErrUnknownUnit, []string{"megawatt"}},
		{"58 MN/m", units.SurfaceTension, units.Options{}, units.ErrUnknownUnit, []string{"meganewton"}},
		{"4e-4 1/mPa", units.InversePressure, units.Options{}, units.ErrUnknownUnit, []string{"millipascal"}},
		{"4e-4 mPa⁻¹", units.InversePressure, units.Options{}, units.ErrUnknownUnit, []string{"millipascal"}},
		{"1 Mm²/s", units.KinematicViscosity, units.Options{}, units.ErrUnknownUnit, []string{"megametre"}},

		{"-2 barg", units.Pressure, units.Options{Name: "p"}, units.ErrPressureNotPositive, []string{"0.101325 MPa", "above 0"}},
		{"-14.7 psig", units.Pressure, units.Options{Name: "p"}, units.ErrPressureNotPositive, nil},
		{"-0.95 barg", units.Pressure, units.Options{Patm: 0.089876}, units.ErrPressureNotPositive, []string{"0.089876 MPa"}},
		{"0 kPa", units.Pressure, units.Options{}, units.ErrPressureNotPositive, []string{"kPag"}},
		{"-5 bar", units.Pressure, units.Options{}, units.ErrPressureNotPositive, nil},
		{"-300 °C", units.Temperature, units.Options{Name: "T"}, units.ErrNegativeAbsolute, []string{"absolute zero"}},
		{"-273.15 °C", units.Temperature, units.Options{}, units.ErrNegativeAbsolute, nil},
		{"0 K", units.Temperature, units.Options{}, units.ErrNegativeAbsolute, nil},
		{"-460 °F", units.Temperature, units.Options{}, units.ErrNegativeAbsolute, nil},
		{"-1 R", units.Temperature, units.Options{}, units.ErrNegativeAbsolute, nil},

		{"NaN", units.Pressure, units.Options{}, units.ErrNotFinite, nil},
		{"nan kPa", units.Pressure, units.Options{}, units.ErrNotFinite, nil},
		{"Inf", units.Temperature, units.Options{}, units.ErrNotFinite, nil},
		{"-Inf", units.Temperature, units.Options{}, units.ErrNotFinite, nil},
		{"+infinity", units.Density, units.Options{}, units.ErrNotFinite, nil},
		{"∞", units.Density, units.Options{}, units.ErrNotFinite, nil},
		{"1e999", units.Pressure, units.Options{}, units.ErrNotFinite, []string{"1e999"}},
		{"-1e999 kPa", units.Pressure, units.Options{}, units.ErrNotFinite, nil},
		{"1e308 1/Pa", units.InversePressure, units.Options{}, units.ErrNotFinite, nil}, // overflows in 1/MPa

		{"1,013.25 kPa", units.Pressure, units.Options{Name: "p"}, units.ErrAmbiguousNumber, []string{"comma", "thousands"}},
		{"1.013,25 kPa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, nil},
		{"1013,25 kPa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, nil},
		{"0,85", units.Quality, units.Options{}, units.ErrAmbiguousNumber, nil},
		{"1 013.25 kPa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, []string{"space"}},
		{"1\u202f013.25 kPa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, nil},
		{"1.013.250 Pa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, []string{"separator"}},
		{"1'013 kPa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, nil},
		{"1_000 kPa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, nil},
		{"- 5 kPa", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, nil},
		{"6 .5 bar", units.Pressure, units.Options{}, units.ErrAmbiguousNumber, nil},

		{"abc", units.Pressure, units.Options{}, units.ErrSyntax, nil},
		{"kPa", units.Pressure, units.Options{}, units.ErrSyntax, nil},
		{".", units.Pressure, units.Options{}, units.ErrSyntax, nil},
		{"-", units.Pressure, units.Options{}, units.ErrSyntax, nil},
		{"+-5", units.Pressure, units.Options{}, units.ErrSyntax, nil},
		{"--5", units.Pressure, units.Options{}, units.ErrSyntax, nil},
		{"١٢", units.Pressure, units.Options{}, units.ErrSyntax, nil}, // Arabic-Indic digits

		{"85", units.Quality, units.Options{Name: "x"}, units.ErrQualityRange, []string{`x "85"`, "0 to 1", "85 %"}},
		{"1.5", units.Quality, units.Options{}, units.ErrQualityRange, nil},
		{"-0.1", units.Quality, units.Options{}, units.ErrQualityRange, nil},
		{"120 %", units.Quality, units.Options{}, units.ErrQualityRange, []string{"100 %"}},
		{"-1 %", units.Quality, units.Options{}, units.ErrQualityRange, nil},

		// "6 bar" under a "barg" header may be either: refused.
		{"6 bar", units.Pressure, units.Options{Name: "p", Unit: "barg"}, units.ErrUnitConflict, []string{"bar (absolute)", "barg (gauge)"}},
		{"600 kPag", units.Pressure, units.Options{Unit: "kPa"}, units.ErrUnitConflict, nil},

		{"6 barg", units.Pressure, units.Options{Patm: 101.325}, units.ErrBadPatm, []string{"MPa"}},
		{"6 bar", units.Pressure, units.Options{Patm: -0.1}, units.ErrBadPatm, nil},
		{"6 bar", units.Pressure, units.Options{Patm: math.NaN()}, units.ErrBadPatm, nil},
		{"6 bar", units.Pressure, units.Options{Patm: 14.7}, units.ErrBadPatm, nil},

		{"6", 0, units.Options{}, units.ErrUnknownUnit, nil},
		{"6", units.Dimensionless + 1, units.Options{}, units.ErrUnknownUnit, nil},
	} {
		got, err := units.Parse(tc.text, tc.dim, tc.opt)
		if err == nil {
			t.Errorf("Parse(%q, %s, %+v) = %g, want error %v", tc.text, tc.dim, tc.opt, got, tc.kind)
			continue
		}
		if !errors.Is(err, tc.kind) {
			t.Errorf("Parse(%q, %s) error %q is not %v", tc.text, tc.dim, err, tc.kind)
		}
		var ie *units.InputError
		if !errors.As(err, &ie) {
			t.Errorf("Parse(%q, %s) error %T, want *units.InputError", tc.text, tc.dim, err)
			continue
		}
		if tc.kind != units.ErrBadPatm && ie.Name != tc.opt.Name {
			t.Errorf("Parse(%q) error names %q, want %q", tc.text, ie.Name, tc.opt.Name)
		}
		if got != 0 {
			t.Errorf("Parse(%q) returned %g with its error, want 0", tc.text, got)
		}
		for _, s := range tc.says {
			if !strings.Contains(err.Error(), s) {
				t.Errorf("Parse(%q, %s) error %q does not say %q", tc.text, tc.dim, err, s)
			}
		}
	}
}

// TestRoundTrip converts every unit of every quantity to base and back.
// Tolerance: 1e-12 relative to the value, or, for units with an offset
// (°C, °F, gauge), 1e-12 times the offset, since subtracting the offset
// cancels digits that no arithmetic can keep.
func TestRoundTrip(t *testing.T) {
	values := []float64{-1234.5, -3.3, -1e-3, 1e-9, 1e-3, 0.37, 1, 42.5, 626, 6894.76, 1e6, 3.7e12}
	for _, patm := range []float64{0, 0.089876} {
		for _, d := range units.Dims() {
			for _, name := range units.ForQuantity(d) {
				u, err := units.Lookup(name, d)
				if err != nil {
					t.Errorf("Lookup(%q, %s): %v", name, d, err)
					continue
				}
				offset := math.Abs(u.FromBase(0, patm))
				for _, v := range values {
					b := u.ToBase(v, patm)
					got := u.FromBase(b, patm)
					if !scalar.EqualWithinAbsOrRel(got, v, 1e-12*offset, 1e-12) {
						t.Errorf("%s: FromBase(ToBase(%g, patm=%g)) = %.17g via %.17g", name, v, patm, got, b)
					}
				}
			}
		}
	}
}

// TestNames: every printed unit name reads back as itself, and the base
// units are those of the engine (the list).
func TestNames(t *testing.T) {
	for _, d := range units.Dims() {
		names := units.ForQuantity(d)
		if len(names) == 0 {
			t.Errorf("ForQuantity(%s) is empty", d)
		}
		for _, name := range names {
			u, err := units.Lookup(name, d)
			if err != nil || u.Name != name || u.Dim != d {
				t.Errorf("Lookup(%q, %s) = %q (%s), %v; want itself", name, d, u.Name, u.Dim, err)
			}
		}
	}
	base := map[units.Dim]string{
		units.Pressure: "MPa", units.Temperature: "K", units.SpecificEnergy: "kJ/kg",
		units.SpecificEntropy: "kJ/(kg·K)", units.SpecificVolume: "m³/kg", units.Density: "kg/m³",
		units.Speed: "m/s", units.DynamicViscosity: "Pa·s", units.ThermalConductivity: "W/(m·K)",
		units.SurfaceTension: "N/m", units.Quality: "", units.KinematicViscosity: "m²/s",
		units.ThermalDiffusivity: "m²/s", units.InverseTemperature: "1/K", units.InversePressure: "1/MPa",
		units.Dimensionless: "",
	}
	if len(units.Dims()) != len(base) {
		t.Errorf("Dims() has %d quantities, want %d", len(units.Dims()), len(base))
	}
	for d, want := range base {
		b := d.Base()
		if b.Name != want || b.Dim != d || b.Gauge {
			t.Errorf("%s.Base() = %q (%s, gauge %v), want %q", d, b.Name, b.Dim, b.Gauge, want)
		}
		for _, v := range []float64{-2.5, 0, 1, 647.096} {
			if got := b.ToBase(v, 0); got != v {
				t.Errorf("%s.Base().ToBase(%g) = %g, want it unchanged", d, v, got)
			}
		}
	}
	if s := units.Dim(0).String(); s != "no quantity" {
		t.Errorf("Dim(0).String() = %q", s)
	}
	if b := units.Dim(0).Base(); b.Dim != 0 {
		t.Errorf("Dim(0).Base() = %+v, want the zero Unit", b)
	}
	if units.ForQuantity(0) != nil {
		t.Errorf("ForQuantity(0) = %v, want nil", units.ForQuantity(0))
	}
}

// TestLookupErrors: Lookup refuses what Parse refuses, with the same kinds.
func TestLookupErrors(t *testing.T) {
	for _, tc := range []struct {
		name string
		dim  units.Dim
		kind error
	}{
		{"", units.Pressure, units.ErrEmpty},
		{"°C", units.Pressure, units.ErrWrongDimension},
		{"furlong", units.Speed, units.ErrUnknownUnit},
		{"mPa", units.Pressure, units.ErrUnknownUnit},
		{"kPa", 0, units.ErrUnknownUnit},
		{strings.Repeat("k", 100), units.Pressure, units.ErrUnknownUnit},
	} {
		_, err := units.Lookup(tc.name, tc.dim)
		if !errors.Is(err, tc.kind) {
			t.Errorf("Lookup(%q, %s) error %v, want %v", tc.name, tc.dim, err, tc.kind)
		}
	}
	if u, err := units.Lookup("", units.Quality); err != nil || u.Name != "" || u.Dim != units.Quality {
		t.Errorf("Lookup(\"\", Quality) = %+v, %v; want the fraction", u, err)
	}
}

// BenchmarkParse measures the common path: a gauge pressure and a
// temperature with a Unicode degree sign.
func BenchmarkParse(b *testing.B) {
	b.ReportAllocs()
	var sink float64
	for b.Loop() {
		p, err := units.Parse("6 barg", units.Pressure, units.Options{Name: "p"})
		if err != nil {
			b.Fatal(err)
		}
		T, err := units.Parse("330 °C", units.Temperature, units.Options{Name: "T"})
		if err != nil {
			b.Fatal(err)
		}
		sink += p + T
	}
	_ = sink
}
