package units

import (
	"fmt"
	"strings"
)

// Set is a choice of one unit per quantity, used for output and for numbers
// typed without a unit. The zero Set is the "si" set. Sets are values: Override
// returns a changed copy.
type Set struct {
	name  string
	units [numDims]uint8 // 1 + index into registry[d].units; 0: as in the default set
}

// siUnits are the units of the default set "si"; "si-mpa" and "bar" are
// the same but for pressure.
var siUnits = [numDims]string{
	Pressure: "kPa", Temperature: "°C", SpecificEnergy: "kJ/kg", SpecificEntropy: "kJ/(kg·K)",
	SpecificVolume: "m³/kg", Density: "kg/m³", Speed: "m/s",
	// µPa·s and mm²/s put water and steam viscosities at plain
	// numbers (about 10 to 1800 µPa·s; 0.1 to a few hundred mm²/s
	// at plant pressures) instead of powers of ten.
	DynamicViscosity: "µPa·s", ThermalConductivity: "W/(m·K)", SurfaceTension: "mN/m",
	Quality: "", KinematicViscosity: "mm²/s", ThermalDiffusivity: "mm²/s",
	InverseTemperature: "1/K", InversePressure: "1/kPa", Dimensionless: "",
}

// withPressure returns units with pressure (and its inverse) replaced.
func withPressure(units [numDims]string, p, inverse string) [numDims]string {
	units[Pressure], units[InversePressure] = p, inverse
	return units
}

// setSpecs are the named unit sets, by quantity. The default is "si".
var setSpecs = []struct {
	name  string
	units [numDims]string
}{
	{"si", siUnits},
	{"si-mpa", withPressure(siUnits, "MPa", "1/MPa")},
	{"bar", withPressure(siUnits, "bar", "1/bar")},
	{"us", [numDims]string{
		Pressure: "psia", Temperature: "°F", SpecificEnergy: "Btu/lb", SpecificEntropy: "Btu/(lb·°R)",
		SpecificVolume: "ft³/lb", Density: "lb/ft³", Speed: "ft/s",
		// lb/(ft·h) over lb/ft³ is ft²/h, so the set stays coherent.
		DynamicViscosity: "lb/(ft·h)", ThermalConductivity: "Btu/(h·ft·°F)", SurfaceTension: "mN/m",
		Quality: "", KinematicViscosity: "ft²/h", ThermalDiffusivity: "ft²/h",
		InverseTemperature: "1/°R", InversePressure: "1/psi", Dimensionless: "",
	}},
	{"base", [numDims]string{ // the engine's own units
		Pressure: "MPa", Temperature: "K", SpecificEnergy: "kJ/kg", SpecificEntropy: "kJ/(kg·K)",
		SpecificVolume: "m³/kg", Density: "kg/m³", Speed: "m/s",
		DynamicViscosity: "Pa·s", ThermalConductivity: "W/(m·K)", SurfaceTension: "N/m",
		Quality: "", KinematicViscosity: "m²/s", ThermalDiffusivity: "m²/s",
		InverseTemperature: "1/K", InversePressure: "1/MPa", Dimensionless: "",
	}},
}

// sets holds the named sets, built once; sets[0] is the default.
var sets = buildSets()

func buildSets() []Set {
	out := make([]Set, len(setSpecs))
	for i, spec := range setSpecs {
		out[i].name = spec.name
		for d := Pressure; d <= Dimensionless; d++ {
			u, err := Lookup(spec.units[d], d)
			if err != nil {
				panic(fmt.Sprintf("units: set %s: %v", spec.name, err))
			}
			out[i].units[d] = unitIndex(u)
		}
	}
	return out
}

// SetNames returns the names of the unit sets; the first is the default.
func SetNames() []string {
	names := make([]string, len(sets))
	for i, s := range sets {
		names[i] = s.name
	}
	return names
}

// SetByName returns the unit set of that name, ignoring case and
// surrounding spaces; "" gives the default set "si". The error is an
// *InputError of kind ErrUnknownSet listing the names.
func SetByName(name string) (Set, error) {
	n := strings.TrimSpace(name)
	if n == "" {
		return sets[0], nil
	}
	for _, s := range sets {
		if strings.EqualFold(s.name, n) {
			return s, nil
		}
	}
	return Set{}, &InputError{Name: "units", Text: name, Err: ErrUnknownSet,
		Detail: "unknown unit set; choose one of " + strings.Join(SetNames(), ", ")}
}

// Name returns the name of the set the receiver was made from.
func (s Set) Name() string {
	if s.name == "" {
		return sets[0].name
	}
	return s.name
}

// Unit returns the set's unit for d, or the zero Unit for an invalid Dim.
func (s Set) Unit(d Dim) Unit {
	if !d.valid() {
		return Unit{}
	}
	return registry[d].units[s.index(d)]
}

// index returns the index in registry[d].units of the set's unit for a
// valid d.
func (s *Set) index(d Dim) int {
	i := s.units[d]
	if i == 0 {
		i = sets[0].units[d]
	}
	return int(i) - 1
}

// unitIndex returns 1 + the index of u among the units of its quantity.
func unitIndex(u Unit) uint8 {
	for i, v := range registry[u.Dim].units {
		if v.Name == u.Name {
			return uint8(i + 1)
		}
	}
	panic("units: unit " + u.Name + " not registered")
}

// Override returns a copy of s that uses unit for d, e.g. from a query
// parameter unit_p=barg. The error is that of Lookup.
func (s Set) Override(d Dim, unit string) (Set, error) {
	u, err := Lookup(unit, d)
	if err != nil {
		return s, err
	}
	if s.name == "" {
		s = sets[0]
	}
	s.units[d] = unitIndex(u)
	return s, nil
}
