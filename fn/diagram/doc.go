// Package diagram computes the lines of water's state diagrams from the
// engine and draws them.
//
// Five kinds of diagram are known (Kinds): temperature–entropy (ts),
// enthalpy–entropy (hs), pressure–enthalpy with log p (ph),
// temperature–specific volume with log v (tv) and pressure–temperature with
// log p (pt). Each shows the saturation dome (the saturated-liquid and
// saturated-vapour lines of IAPWS-IF97 region 4 meeting at the critical
// point), isobars, isotherms, lines of constant quality and, on request,
// the boundaries between the IF97 regions, with the user's points and
// process lines (a point may name the point it is reached from).
//
// Build computes a Diagram: every line as samples of states in base units
// (MPa, K, kJ/kg, kJ/(kg·K), m³/kg), so that tests can check each sample
// against the engine. The Diagram is written in the user's units only at
// the edges: Render draws it as SVG or PNG with gonum/plot, and
// AppendJSON writes its lines and frame for a page that adds hover values
// and zoom. Dome returns the saturation dome alone, for charts that other
// programs draw (the workbook's native chart).
package diagram
