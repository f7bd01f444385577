package point_test

import (
	"fmt"
	"testing"

	"steamcell/fn"
	"steamcell/fn/point"
)

func TestParseHeader(t *testing.T) {
	// Headers as people write them on test sheets; common practice, no
	// source. want.Q == 0 means the header must not be taken for an input.
	for _, tc := range []struct {
		text string
		want point.HeaderMatch
	}{
		{"P [barg]", point.HeaderMatch{Symbol: "p", Q: fn.Pressure, Unit: "barg"}},
		{"p", point.HeaderMatch{Symbol: "p", Q: fn.Pressure}},
		{"Pressure", point.HeaderMatch{Symbol: "p", Q: fn.Pressure}},
		{"Temperature (°F)", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "°F"}},
		{"h (kJ/kg)", point.HeaderMatch{Symbol: "h", Q: fn.Enthalpy, Unit: "kJ/kg"}},
		{"Drum pressure [barg]", point.HeaderMatch{Symbol: "p", Q: fn.Pressure, Unit: "barg"}},
		{"T_steam (C)", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "C"}},
		{"Steam temperature [°C]", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "°C"}},
		{"Feedwater pressure [barg]", point.HeaderMatch{Symbol: "p", Q: fn.Pressure, Unit: "barg"}},
		{"Steam T [°C]", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "°C"}},
		{"  TEMP [K] ", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "K"}},
		{"Temp. (degF)", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "degF"}},
		{"P1 [psig]", point.HeaderMatch{Symbol: "p", Q: fn.Pressure, Unit: "psig"}},
		{"s [kJ/(kg·K)]", point.HeaderMatch{Symbol: "s", Q: fn.Entropy, Unit: "kJ/(kg·K)"}},
		{"s (kJ/(kg K))", point.HeaderMatch{Symbol: "s", Q: fn.Entropy, Unit: "kJ/(kg K)"}},
		{"Specific enthalpy [Btu/lb]", point.HeaderMatch{Symbol: "h", Q: fn.Enthalpy, Unit: "Btu/lb"}},
		{"Entropy", point.HeaderMatch{Symbol: "s", Q: fn.Entropy}},
		{"v [m³/kg]", point.HeaderMatch{Symbol: "v", Q: fn.Volume, Unit: "m³/kg"}},
		{"Specific volume (ft3/lb)", point.HeaderMatch{Symbol: "v", Q: fn.Volume, Unit: "ft3/lb"}},
		{"rho [kg/m3]", point.HeaderMatch{Symbol: "rho", Q: fn.Density, Unit: "kg/m3"}},
		{"ρ", point.HeaderMatch{Symbol: "rho", Q: fn.Density}},
		{"Density (lb/ft³)", point.HeaderMatch{Symbol: "rho", Q: fn.Density, Unit: "lb/ft³"}},
		{"x [-]", point.HeaderMatch{Symbol: "x", Q: fn.Quality, Unit: "-"}},
		{"Quality [%]", point.HeaderMatch{Symbol: "x", Q: fn.Quality, Unit: "%"}},
		{"Dryness fraction", point.HeaderMatch{Symbol: "x", Q: fn.Quality, Unit: "fraction"}},
		{"u [kJ/kg]", point.HeaderMatch{Symbol: "u", Q: fn.InternalEnergy, Unit: "kJ/kg"}},
		{"Internal energy (kJ/kg)", point.HeaderMatch{Symbol: "u", Q: fn.InternalEnergy, Unit: "kJ/kg"}},
		{"T (steam) [°C]", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "°C"}},
		{"Pressure, barg", point.HeaderMatch{Symbol: "p", Q: fn.Pressure, Unit: "barg"}},
		{"P barg", point.HeaderMatch{Symbol: "p", Q: fn.Pressure, Unit: "barg"}},
		{"Steam T °C", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "°C"}},
		{"Flow temperature [°C]", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "°C"}},
		{"Saturation temperature [°C]", point.HeaderMatch{Symbol: "t", Q: fn.Temperature, Unit: "°C"}},

		// Not inputs.
		{"Point", point.HeaderMatch{}},
		{"Time", point.HeaderMatch{}},
		{"Time [s]", point.HeaderMatch{}},
		{"Time s", point.HeaderMatch{}},
		{"Steam flow [t/h]", point.HeaderMatch{}},
		{"Note", point.HeaderMatch{}},
		{"Sample", point.HeaderMatch{}},
		{"Test no.", point.HeaderMatch{}},
		{"", point.HeaderMatch{}},
		{"Pressure drop [kPa]", point.HeaderMatch{}},
		{"Temperature rise [K]", point.HeaderMatch{}},
		{"ΔT [K]", point.HeaderMatch{}},
		{"dp [kPa]", point.HeaderMatch{}},
		{"Volume flow [m³/h]", point.HeaderMatch{}},
		{"Tank volume [m³]", point.HeaderMatch{}},
		{"Superheat temperature [K]", point.HeaderMatch{}},
		{"Pressure (drum)", point.HeaderMatch{}},
		{"P [°C]", point.HeaderMatch{}},
		{"Pressure or temperature", point.HeaderMatch{}},
		{"p s", point.HeaderMatch{}},
		{"Unit 3 steam", point.HeaderMatch{}},
		{"Pressure tag", point.HeaderMatch{}},
	} {
		got, ok := point.ParseHeader(tc.text)
		if ok != (tc.want.Q != 0) || got != tc.want {
			t.Errorf("ParseHeader(%q) = %+v, %v; want %+v, %v", tc.text, got, ok, tc.want, tc.want.Q != 0)
		}
	}
}

func TestExplainHeader(t *testing.T) {
	// A header that names a quantity but is not taken says why; one that is
	// taken, or names nothing, gives "".
	for _, tc := range []struct {
		text    string
		explain bool
	}{
		{"P [barx]", true},
		{"Pressure (drum)", true},
		{"P [°C]", true},
		{"Pressure or temperature [bar]", true},
		{"P [barg]", false},
		{"Steam flow [t/h]", false},
		{"Note", false},
	} {
		got := point.ExplainHeader(tc.text)
		if (got != "") != tc.explain {
			t.Errorf("ExplainHeader(%q) = %q; want an explanation: %v", tc.text, got, tc.explain)
		}
		if _, ok := point.ParseHeader(tc.text); ok && got != "" {
			t.Errorf("ParseHeader(%q) matches but ExplainHeader says %q", tc.text, got)
		}
	}
}

func ExampleParseHeader() {
	m, ok := point.ParseHeader("Drum pressure [barg]")
	fmt.Println(m.Symbol, m.Unit, ok)
	_, ok = point.ParseHeader("Steam flow [t/h]")
	fmt.Println(ok)
	// Output:
	// p barg true
	// false
}
