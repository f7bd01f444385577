// Package process computes the results of a plant or acceptance test from
// the measured states of a process between them: a turbine section's or a
// pump's isentropic efficiency, a throttling calorimeter's quality, the
// outlet of a mixing (spray) point or the spray flow it needs, and a closed
// feedwater heater's duty, extraction flow, terminal temperature
// difference and drain cooler approach.
//
// States are numbered: the inputs of state n are named by a property
// symbol and n ("p1", "t1", "p2", "x2"), any pair that fixes a state;
// flows are m1, m2. Every input carries its standard uncertainty, and every
// result carries its own, propagated by package uncertain through the whole
// calculation with the full Jacobian of the results with respect to the
// raw inputs, so that inputs shared by several intermediate values stay
// correlated as the calculation makes them.
//
// All values are in the engine's base units: MPa, K, kJ/kg, kJ/(kg·K);
// flows in any one unit the caller chooses, and results of flow in that
// unit.
package process
