package units_test

import (
	"errors"
	"testing"

	"steamcell/fn/units"
)

// TestSets checks the unit of each quantity in each named set (the issue's
// list; choices explained in sets.go).
func TestSets(t *testing.T) {
	want := map[string]map[units.Dim]string{
		"si": {
			units.Pressure: "kPa", units.Temperature: "°C", units.SpecificEnergy: "kJ/kg",
			units.SpecificEntropy: "kJ/(kg·K)", units.SpecificVolume: "m³/kg", units.Density: "kg/m³",
			units.Speed: "m/s", units.DynamicViscosity: "µPa·s", units.ThermalConductivity: "W/(m·K)",
			units.SurfaceTension: "mN/m", units.Quality: "", units.KinematicViscosity: "mm²/s",
			units.ThermalDiffusivity: "mm²/s", units.InverseTemperature: "1/K", units.InversePressure: "1/kPa",
			units.Dimensionless: "",
		},
		"si-mpa": {units.Pressure: "MPa", units.Temperature: "°C", units.SpecificEnergy: "kJ/kg", units.InversePressure: "1/MPa"},
		"bar":    {units.Pressure: "bar", units.Temperature: "°C", units.SpecificVolume: "m³/kg", units.InversePressure: "1/bar"},
		"us": {
			units.Pressure: "psia", units.Temperature: "°F", units.SpecificEnergy: "Btu/lb",
			units.SpecificEntropy: "Btu/(lb·°R)", units.SpecificVolume: "ft³/lb", units.Density: "lb/ft³",
			units.Speed: "ft/s", units.DynamicViscosity: "lb/(ft·h)", units.ThermalConductivity: "Btu/(h·ft·°F)",
			units.KinematicViscosity: "ft²/h", units.ThermalDiffusivity: "ft²/h", units.InverseTemperature: "1/°R",
			units.InversePressure: "1/psi", units.Quality: "",
		},
	}
	names := units.SetNames()
	if len(names) == 0 || names[0] != "si" {
		t.Fatalf("SetNames() = %v, want si first (the default)", names)
	}
	for _, name := range names {
		s, err := units.SetByName(name)
		if err != nil {
			t.Errorf("SetByName(%q): %v", name, err)
			continue
		}
		if s.Name() != name {
			t.Errorf("SetByName(%q).Name() = %q", name, s.Name())
		}
		for _, d := range units.Dims() {
			u := s.Unit(d)
			if u.Dim != d {
				t.Errorf("set %s: Unit(%s) = %q of %s", name, d, u.Name, u.Dim)
			}
			if w, ok := want[name][d]; ok && u.Name != w {
				t.Errorf("set %s: Unit(%s) = %q, want %q", name, d, u.Name, w)
			}
		}
	}
	// The base set is the engine's own units.
	base, err := units.SetByName("base")
	if err != nil {
		t.Fatal(err)
	}
	for _, d := range units.Dims() {
		if got, want := base.Unit(d).Name, d.Base().Name; got != want {
			t.Errorf("set base: Unit(%s) = %q, want %q", d, got, want)
		}
	}
}

// TestSetDefaults: the zero Set and the empty name are "si"; names ignore
// case; unknown names are refused with the list.
func TestSetDefaults(t *testing.T) {
	var zero units.Set
	if zero.Name() != "si" || zero.Unit(units.Pressure).Name != "kPa" {
		t.Errorf("zero Set = %s with pressure in %q, want si and kPa", zero.Name(), zero.Unit(units.Pressure).Name)
	}
	if u := zero.Unit(0); u.Dim != 0 {
		t.Errorf("Set.Unit(0) = %+v, want the zero Unit", u)
	}
	for _, name := range []string{"", " SI ", "Si"} {
		s, err := units.SetByName(name)
		if err != nil || s.Name() != "si" {
			t.Errorf("SetByName(%q) = %s, %v; want si", name, s.Name(), err)
		}
	}
	if s, err := units.SetByName("US"); err != nil || s.Name() != "us" {
		t.Errorf("SetByName(%q) = %s, %v; want us", "US", s.Name(), err)
	}
	_, err := units.SetByName("metric")
	if !errors.Is(err, units.ErrUnknownSet) {
		t.Errorf("SetByName(%q) error %v, want %v", "metric", err, units.ErrUnknownSet)
	} else if msg := err.Error(); msg != `units "metric": unknown unit set; choose one of si, si-mpa, bar, us, base` {
		t.Errorf("SetByName(%q) error %q", "metric", msg)
	}
}

// TestOverride picks one unit per quantity without changing the original.
func TestOverride(t *testing.T) {
	si, _ := units.SetByName("si")
	s, err := si.Override(units.Pressure, "barg")
	if err != nil {
		t.Fatal(err)
	}
	if got := s.Unit(units.Pressure); got.Name != "barg" || !got.Gauge {
		t.Errorf("Override(Pressure, barg).Unit(Pressure) = %+v", got)
	}
	if got := s.Unit(units.Temperature).Name; got != "°C" {
		t.Errorf("Override changed temperature to %q", got)
	}
	if got := si.Unit(units.Pressure).Name; got != "kPa" {
		t.Errorf("Override changed the original set: pressure in %q", got)
	}
	var zero units.Set
	if z, err := zero.Override(units.Temperature, "K"); err != nil || z.Unit(units.Temperature).Name != "K" || z.Unit(units.Pressure).Name != "kPa" {
		t.Errorf("zero Set Override(Temperature, K) = %q/%q, %v", z.Unit(units.Temperature).Name, z.Unit(units.Pressure).Name, err)
	}
	if _, err := si.Override(units.Pressure, "°C"); !errors.Is(err, units.ErrWrongDimension) {
		t.Errorf("Override(Pressure, °C) error %v, want %v", err, units.ErrWrongDimension)
	}
	if _, err := si.Override(units.Pressure, "mPa"); !errors.Is(err, units.ErrUnknownUnit) {
		t.Errorf("Override(Pressure, mPa) error %v, want %v", err, units.ErrUnknownUnit)
	}
}
