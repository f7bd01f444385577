// Package tabletest holds the header readings that every path into
// point.ReadTable must agree on: /batch with a CSV header, /batch with JSON
// keys, and the workbook fill (steamcell fill, POST /workbook). The point
// package tests them on ReadTable itself; the command's tests run them
// through the server and the workbook. Pressures and temperatures are
// converted with exact definitions (NIST SP 811 (2008) B.8: 1 bar =
// 0.1 MPa, standard atmosphere 0.101325 MPa for gauge readings; T/K =
// t/°C + 273.15).
package tabletest

import (
	"steamcell/fn"
	"steamcell/fn/point"
)

// Case is one table: a header row, an optional row of units under it and
// one row of data.
type Case struct {
	Name   string
	Header []string
	Units  []string // the row of units under the header; nil for none
	Row    []string // one row of data

	// Want holds the inputs the row is read as, in base units, in the
	// order of the columns; nil when the header is refused.
	Want []fn.Input
	From []point.UnitSource // how each input column's unit is decided
	// Refused is, for a refused header, a part of the message: the header
	// as it should be written, or the reason.
	Refused string
}

// HasUnitRow reports whether the case has a row of units, which JSON keys
// cannot carry (an object has no row under its keys).
func (c Case) HasUnitRow() bool { return c.Units != nil }

func pt(p, t float64) []fn.Input {
	return []fn.Input{{Q: fn.Pressure, Value: p}, {Q: fn.Temperature, Value: t}}
}

func tp(t, p float64) []fn.Input {
	return []fn.Input{{Q: fn.Temperature, Value: t}, {Q: fn.Pressure, Value: p}}
}

// drum is 6 barg with the standard atmosphere: 0.6 + 0.101325 MPa.
const drum = 0.701325

// Cases are read in the unit set si (kPa, °C).
var Cases = []Case{
	// The bug of issue 11: the unit was only seen at the end of a header,
	// so 6 under "Pressure [barg] PT-101" was read as 6 kPa absolute (h =
	// 3137.1 kJ/kg, status ok) instead of 6 barg (h = 3122.2 kJ/kg).
	{Name: "unit before a tag", Header: []string{"Pressure [barg] PT-101", "T [°C]"}, Row: []string{"6", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "unit before a word", Header: []string{"T [K] inlet", "Drum pressure [bar] avg"}, Row: []string{"603.15", "7.01325"},
		Want: tp(603.15, drum), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "tag in brackets passed over", Header: []string{"P [PT-101] [barg]", "T (°C)"}, Row: []string{"6", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "unit as a word", Header: []string{"Tag", "Pressure barg avg", "Temperature, °C"}, Row: []string{"FW-1", "6", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "quantity over unit", Header: []string{"p/bar", "T/°C"}, Row: []string{"7.01325", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "no unit: the unit set", Header: []string{"Tag", "Pressure", "Temperature"}, Row: []string{"FW-1", "701.325", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromSet, point.FromSet}},
	{Name: "only a tag: the unit set", Header: []string{"Pressure [PT-101]", "T"}, Row: []string{"701.325", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromSet, point.FromSet}},
	{Name: "absolute said twice", Header: []string{"P [bar] abs", "T [K] abs"}, Row: []string{"7.01325", "603.15"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "gauge said twice", Header: []string{"P gauge [barg]", "T [°C]"}, Row: []string{"6", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "other measurements are not inputs", Header: []string{"Pressure drop [kPa]", "P [barg]", "Flow [t/h]", "T [°C]"},
		Row: []string{"12", "6", "40", "330"}, Want: pt(drum, 603.15), From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "quality in percent", Header: []string{"p [bar]", "Dryness [%]"}, Row: []string{"10", "90"},
		Want: []fn.Input{{Q: fn.Pressure, Value: 1}, {Q: fn.Quality, Value: 0.9}}, From: []point.UnitSource{point.FromHeader, point.FromHeader}},
	{Name: "row of units", Header: []string{"Drum pressure", "T"}, Units: []string{"barg", "[°C]"}, Row: []string{"6", "330"},
		Want: pt(drum, 603.15), From: []point.UnitSource{point.FromUnitRow, point.FromUnitRow}},
	{Name: "row of units fills in brackets without a unit", Header: []string{"Pressure (drum)", "T [°C]"}, Units: []string{"barg", ""},
		Row: []string{"6", "330"}, Want: pt(drum, 603.15), From: []point.UnitSource{point.FromUnitRow, point.FromHeader}},

	// Refused: the words outside the brackets qualify or contradict the
	// unit, or the brackets hold no unit of the quantity.
	{Name: "gauge word, absolute unit", Header: []string{"P [kPa] gauge", "T [°C]"}, Row: []string{"500", "330"}, Refused: `"P [kPag]"`},
	{Name: "absolute word, Celsius", Header: []string{"P [barg]", "T [°C] abs"}, Row: []string{"6", "330"}, Refused: `"T [K]"`},
	{Name: "absolute word, Fahrenheit", Header: []string{"P [psig]", "T [°F] absolute"}, Row: []string{"87", "626"}, Refused: `"T [K]"`},
	{Name: "absolute word, gauge unit", Header: []string{"P [barg] abs", "T [°C]"}, Row: []string{"6", "330"}, Refused: `"P [bar]"`},
	{Name: "gauge letter apart", Header: []string{"P bar g", "T [°C]"}, Row: []string{"6", "330"}, Refused: `"P [barg]"`},
	{Name: "gauge word, unit set", Header: []string{"Pressure gauge", "T [°C]"}, Row: []string{"600", "330"}, Refused: `"Pressure [kPag]"`},
	{Name: "vacuum", Header: []string{"Condenser pressure vacuum [kPa]", "T [°C]"}, Row: []string{"90", "40"}, Refused: "vacuum"},
	{Name: "brackets without a unit", Header: []string{"Tag", "Pressure (drum)", "T [°C]"}, Row: []string{"FW-1", "6", "330"},
		Refused: `headers seen: "Tag", "Pressure (drum)", "T [°C]"`},
	{Name: "a unit of another quantity", Header: []string{"P [°C]", "T [°C]"}, Row: []string{"6", "330"}, Refused: "not of pressure"},
	{Name: "two units", Header: []string{"Pressure [barg] [kPa]", "T [°C]"}, Row: []string{"6", "330"}, Refused: "two units"},
	{Name: "header and row of units disagree", Header: []string{"P [bar]", "T [°C]"}, Units: []string{"barg", "°C"}, Row: []string{"6", "330"},
		Refused: "remove one"},
}
