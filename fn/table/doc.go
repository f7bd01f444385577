// Package table computes steam tables on demand: saturation tables by
// pressure or by temperature over a range with a step, and superheat
// tables at one or more pressures over a range of temperature, with any
// properties of the catalogue of fn/point. The quantity of a saturation
// table follows from the unit of its range ("from 1 bar" is by pressure,
// "from 100 °C" by temperature).
//
// Build computes a Table in the user's units through point.Render, the
// same rendering as every other answer; WriteCSV, WriteJSON and WriteXLSX
// write it. A row the formulation cannot give (above the critical
// point, on the saturation line of a superheat table) keeps its place
// with a status saying why.
package table
