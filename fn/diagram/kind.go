package diagram

import (
	"fmt"
	"strings"

	"steamcell/fn/units"
)

// Coordinate is one property a diagram can put on an axis.
type Coordinate struct {
	Symbol string    // "p", "t", "h", "s", "v"
	Name   string    // "pressure", in words
	Dim    units.Dim // its quantity, for the unit of the axis
	of     func(*Sample) float64
}

// The coordinates of the diagrams.
var (
	pressure    = Coordinate{"p", "pressure", units.Pressure, func(s *Sample) float64 { return s.P }}
	temperature = Coordinate{"t", "temperature", units.Temperature, func(s *Sample) float64 { return s.T }}
	enthalpy    = Coordinate{"h", "specific enthalpy", units.SpecificEnergy, func(s *Sample) float64 { return s.H }}
	entropy     = Coordinate{"s", "specific entropy", units.SpecificEntropy, func(s *Sample) float64 { return s.S }}
	volume      = Coordinate{"v", "specific volume", units.SpecificVolume, func(s *Sample) float64 { return s.V }}
)

// Axis is one axis of a kind of diagram: its coordinate, whether it is
// drawn on a logarithmic scale, and its default range in base units.
type Axis struct {
	Coordinate
	Log      bool
	Min, Max float64
}

// Kind is one kind of diagram.
type Kind struct {
	Name  string // "ts", as in /diagram/ts.svg
	Title string // "Temperature–entropy"
	X, Y  Axis
	// Quality says whether lines of constant quality are drawn; on p–T
	// they all lie on the vapour-pressure curve.
	Quality bool
}

// Default ranges in base units: from 0 °C to 800 °C, the top of IF97
// regions 1 to 3, and from 0.6 kPa (the triple point, near 611 Pa) to
// 100 MPa, the top of the formulation; entropy, enthalpy and volume span
// the states between those limits.
const (
	tLow, tHigh = 273.15, 1073.15
	pLow, pHigh = 0.0006, 100.0
)

// kinds is the catalogue of diagrams; every list a user sees (routes, the
// page's choices, the README) is read from it.
var kinds = []Kind{
	{Name: "ts", Title: "Temperature–entropy", Quality: true,
		X: Axis{entropy, false, 0, 10}, Y: Axis{temperature, false, tLow, tHigh}},
	{Name: "hs", Title: "Enthalpy–entropy", Quality: true,
		X: Axis{entropy, false, 0, 10}, Y: Axis{enthalpy, false, 0, 4200}},
	{Name: "ph", Title: "Pressure–enthalpy", Quality: true,
		X: Axis{enthalpy, false, 0, 4200}, Y: Axis{pressure, true, pLow, pHigh}},
	{Name: "tv", Title: "Temperature–specific volume", Quality: true,
		X: Axis{volume, true, 5e-4, 1e3}, Y: Axis{temperature, false, tLow, tHigh}},
	{Name: "pt", Title: "Pressure–temperature", Quality: false,
		X: Axis{temperature, false, tLow, tHigh}, Y: Axis{pressure, true, pLow, pHigh}},
}

// ErrUnknownKind: a kind of diagram that does not exist.
var ErrUnknownKind = fmt.Errorf("unknown kind of diagram")

// Kinds returns the kinds of diagram in their order.
func Kinds() []Kind { return append([]Kind(nil), kinds...) }

// KindNames returns the names of the kinds: ts, hs, ph, tv, pt.
func KindNames() []string {
	names := make([]string, len(kinds))
	for i, k := range kinds {
		names[i] = k.Name
	}
	return names
}

// KindByName returns the kind of diagram name (case-insensitive).
func KindByName(name string) (Kind, error) {
	for _, k := range kinds {
		if strings.EqualFold(k.Name, name) {
			return k, nil
		}
	}
	return Kind{}, &Error{Param: "kind", Kind: ErrUnknownKind,
		Msg: fmt.Sprintf("%q is not a kind of diagram; kinds are %s", name, strings.Join(KindNames(), ", "))}
}
