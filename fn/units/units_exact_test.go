package units_test

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/unit"

	"steamcell/fn/units"
)

// Exact definitions, in SI units with their dimensions carried by
// gonum/unit so that a factor built the wrong way round (a missing length,
// a per-hour for a per-second) fails on its dimensions, not only its value.
var (
	exKilogram = unit.Kilogram.Unit()
	exMetre    = unit.Metre.Unit()
	exSecond   = unit.Second.Unit()
	exKelvin   = unit.Kelvin.Unit()
	exJoule    = unit.Joule.Unit()
	exPascal   = unit.Pascal.Unit()
	exWatt     = unit.Watt.Unit()
	exNewton   = unit.Newton.Unit()

	exPound   = unit.New(0.45359237, unit.Dimensions{unit.MassDim: 1})                                          // 1 lb = 0.45359237 kg, exact
	exInch    = unit.New(0.0254, unit.Dimensions{unit.LengthDim: 1})                                            // 1 in = 0.0254 m, exact
	exFoot    = unit.New(0.3048, unit.Dimensions{unit.LengthDim: 1})                                            // 1 ft = 0.3048 m, exact
	exHour    = unit.New(3600, unit.Dimensions{unit.TimeDim: 1})                                                // 1 h = 3600 s, exact
	exRankine = unit.New(1/1.8, unit.Dimensions{unit.TemperatureDim: 1})                                        // degree Rankine or Fahrenheit interval = K/1.8, exact
	exGravity = unit.New(9.80665, unit.Dimensions{unit.LengthDim: 1, unit.TimeDim: -2})                         // standard gravity, exact: 1 kgf = 9.80665 N
	exBtu     = unit.New(1055.05585262, unit.Dimensions{unit.MassDim: 1, unit.LengthDim: 2, unit.TimeDim: -2})  // Btu (IT), exact
	exCalorie = unit.New(4.1868, unit.Dimensions{unit.MassDim: 1, unit.LengthDim: 2, unit.TimeDim: -2})         // calorie (IT), exact
	exMmHg    = unit.New(133.322387415, unit.Dimensions{unit.MassDim: 1, unit.LengthDim: -1, unit.TimeDim: -2}) // conventional mmHg, exact
	exAtm     = unit.New(101325, unit.Dimensions{unit.MassDim: 1, unit.LengthDim: -1, unit.TimeDim: -2})        // standard atmosphere, exact
	// Conventional water of the water-column units, 1 g/cm³ (NIST SP 811
	// (2008), B.8, footnote to "millimeter of water, conventional").
	exWaterDensity = unit.New(1000, unit.Dimensions{unit.MassDim: 1, unit.LengthDim: -3})
)

// mul and div combine quantities without changing their arguments.
func mul(a *unit.Unit, bs ...*unit.Unit) *unit.Unit {
	r := a.Copy()
	for _, b := range bs {
		r.Mul(b)
	}
	return r
}

func div(a *unit.Unit, bs ...*unit.Unit) *unit.Unit {
	r := a.Copy()
	for _, b := range bs {
		r.Div(b)
	}
	return r
}

func scaled(f float64, a *unit.Unit) *unit.Unit {
	r := a.Copy()
	r.SetValue(f * r.Value())
	return r
}

// exBase gives, per quantity, the engine's base unit in SI terms: its
// dimensions and its size in coherent SI units (MPa = 1e6 Pa, kJ/kg =
// 1e3 J/kg, ...).
func exBase(d units.Dim) *unit.Unit {
	switch d {
	case units.Pressure:
		return scaled(1e6, exPascal)
	case units.SpecificEnergy:
		return scaled(1e3, div(exJoule, exKilogram))
	case units.SpecificEntropy:
		return scaled(1e3, div(exJoule, exKilogram, exKelvin))
	case units.SpecificVolume:
		return div(mul(exMetre, exMetre, exMetre), exKilogram)
	case units.Density:
		return div(exKilogram, mul(exMetre, exMetre, exMetre))
	case units.Speed:
		return div(exMetre, exSecond)
	case units.DynamicViscosity:
		return mul(exPascal, exSecond)
	case units.ThermalConductivity:
		return div(exWatt, exMetre, exKelvin)
	case units.SurfaceTension:
		return div(exNewton, exMetre)
	case units.KinematicViscosity, units.ThermalDiffusivity:
		return div(mul(exMetre, exMetre), exSecond)
	case units.InverseTemperature:
		return div(unit.New(1, unit.Dimensions{}), exKelvin)
	case units.InversePressure:
		return div(unit.New(1, unit.Dimensions{}), scaled(1e6, exPascal))
	}
	panic("no SI base for " + d.String())
}

// TestExactDefinitions rebuilds every non-SI factor from the exact
// definitions above with gonum/unit and checks both its dimensions (against
// the quantity's base unit) and its size. Tolerance: 1e-14 relative, a few
// float64 roundings in each chain.
func TestExactDefinitions(t *testing.T) {
	lbf := mul(exPound, exGravity)
	for _, tc := range []struct {
		unit string
		dim  units.Dim
		def  *unit.Unit
	}{
		{"psia", units.Pressure, div(lbf, exInch, exInch)},
		{"psig", units.Pressure, div(lbf, exInch, exInch)},
		{"kgf/cm²", units.Pressure, div(mul(unit.New(1, unit.Dimensions{unit.MassDim: 1}), exGravity), scaled(1e-4, mul(exMetre, exMetre)))},
		{"atm", units.Pressure, exAtm},
		{"mmHg", units.Pressure, exMmHg},
		{"inHg", units.Pressure, scaled(25.4, exMmHg)},      // 1 in = 25.4 mm
		{"inHg vac", units.Pressure, scaled(-25.4, exMmHg)}, // counted down from patm
		{"mmHg vac", units.Pressure, scaled(-1, exMmHg)},
		{"torr", units.Pressure, scaled(1.0/760, exAtm)}, // 1 torr = 1/760 atm
		{"ata", units.Pressure, div(mul(unit.New(1, unit.Dimensions{unit.MassDim: 1}), exGravity), scaled(1e-4, mul(exMetre, exMetre)))},
		{"mmH2Oa", units.Pressure, mul(exWaterDensity, exGravity, scaled(1e-3, exMetre))}, // conventional: 1 g/cm³ × g_n × 1 mm
		{"inH2Og", units.Pressure, mul(exWaterDensity, exGravity, exInch)},
		{"Btu/lb", units.SpecificEnergy, div(exBtu, exPound)},
		{"kcal/kg", units.SpecificEnergy, div(scaled(1e3, exCalorie), exKilogram)},
		{"Btu/(lb·°R)", units.SpecificEntropy, div(exBtu, exPound, exRankine)},
		{"Btu/(lb·°F)", units.SpecificEntropy, div(exBtu, exPound, exRankine)},
		{"kcal/(kg·K)", units.SpecificEntropy, div(scaled(1e3, exCalorie), exKilogram, exKelvin)},
		{"ft³/lb", units.SpecificVolume, div(mul(exFoot, exFoot, exFoot), exPound)},
		{"lb/ft³", units.Density, div(exPound, mul(exFoot, exFoot, exFoot))},
		{"ft/s", units.Speed, div(exFoot, exSecond)},
		{"lb/(ft·h)", units.DynamicViscosity, div(exPound, exFoot, exHour)},
		{"lb/(ft·s)", units.DynamicViscosity, div(exPound, exFoot, exSecond)},
		{"Btu/(h·ft·°F)", units.ThermalConductivity, div(exBtu, exHour, exFoot, exRankine)},
		{"ft²/s", units.KinematicViscosity, div(mul(exFoot, exFoot), exSecond)},
		{"ft²/h", units.KinematicViscosity, div(mul(exFoot, exFoot), exHour)},
		{"ft²/s", units.ThermalDiffusivity, div(mul(exFoot, exFoot), exSecond)},
		{"ft²/h", units.ThermalDiffusivity, div(mul(exFoot, exFoot), exHour)},
		{"1/°F", units.InverseTemperature, div(unit.New(1, unit.Dimensions{}), exRankine)},
		{"1/°R", units.InverseTemperature, div(unit.New(1, unit.Dimensions{}), exRankine)},
		{"1/psi", units.InversePressure, div(unit.New(1, unit.Dimensions{}), div(lbf, exInch, exInch))},
	} {
		u, err := units.Lookup(tc.unit, tc.dim)
		if err != nil {
			t.Errorf("Lookup(%q, %s): %v", tc.unit, tc.dim, err)
			continue
		}
		base := exBase(tc.dim)
		if !unit.DimensionsMatch(tc.def, base) {
			t.Errorf("%s: definition has dimensions %v, base unit of %s has %v", tc.unit, tc.def.Dimensions(), tc.dim, base.Dimensions())
			continue
		}
		want := tc.def.Value() / base.Value()
		if got := unitSize(u); !scalar.EqualWithinRel(got, want, 1e-14) {
			t.Errorf("1 %s = %.17g base units, want %.17g from exact definitions", tc.unit, got, want)
		}
	}
}

// TestExactIdentities checks identities that follow from the exact
// definitions: 1 Btu/lb = 2.326 kJ/kg and 1 Btu/(lb·°F) = 4.1868 kJ/(kg·K)
// (the IT Btu is defined so), 760 mmHg is within 0.02 Pa of one standard
// atmosphere, 1 inHg = 25.4 mmHg. Tolerance: 1e-15 relative.
func TestExactIdentities(t *testing.T) {
	for _, tc := range []struct {
		text string
		dim  units.Dim
		want float64
	}{
		{"1 Btu/lb", units.SpecificEnergy, 2.326},
		{"1 Btu/(lb·°F)", units.SpecificEntropy, 4.1868},
		{"1 Btu/(lb·°R)", units.SpecificEntropy, 4.1868},
		{"1 kcal/(kg·K)", units.SpecificEntropy, 4.1868},
		{"760 mmHg", units.Pressure, 760 * 133.322387415e-6},
		{"1 inHg", units.Pressure, 25.4 * 133.322387415e-6},
	} {
		got, err := units.Parse(tc.text, tc.dim, units.Options{})
		if err != nil {
			t.Errorf("Parse(%q, %s): %v", tc.text, tc.dim, err)
			continue
		}
		if !scalar.EqualWithinRel(got, tc.want, 1e-15) {
			t.Errorf("Parse(%q) = %.17g, want %.17g", tc.text, got, tc.want)
		}
	}
	// 760 mmHg versus the standard atmosphere: equal to 1.5e-7 relative,
	// not exactly (conventional mmHg is defined by a mercury column).
	mm, _ := units.Parse("760 mmHg", units.Pressure, units.Options{})
	if !scalar.EqualWithinRel(mm, units.StandardAtmosphere, 1.5e-7) || mm == units.StandardAtmosphere {
		t.Errorf("760 mmHg = %.12g MPa, want near but not equal to %.12g MPa", mm, units.StandardAtmosphere)
	}
}
