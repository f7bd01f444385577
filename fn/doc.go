// Package fn turns two known properties of water or steam into the whole
// state: every property of IAPWS-IF97, the phase in the trade's words and the
// IF97 region.
//
// A user knows two properties of a state (from a gauge and a thermocouple, a
// design specification, a sample) and needs the others. Solve takes any
// supported pair of inputs; FromPT, FromPH, FromPS, FromHS, FromPX and FromTX
// take one pair each. All values are in base units: pressure in MPa (absolute), temperature
// in K, specific volume in m³/kg, density in kg/m³, specific energies in kJ/kg,
// specific entropy and heat capacities in kJ/(kg·K), speed of sound in m/s,
// quality as a fraction 0…1. Package fn/units converts other units.
//
// # Range of validity (IAPWS R7-97(2012), section 4)
//
//   - 273.15 K ≤ T ≤ 1073.15 K at 0 < p ≤ 100 MPa;
//   - 1073.15 K < T ≤ 2273.15 K at 0 < p ≤ 50 MPa.
//
// Every input pair maps to these limits on p and T; a state outside them is
// refused with an *InputError whose Kind is ErrOutOfRange, naming the input,
// the limit and its value. NaN and infinite inputs are refused with
// ErrNotFinite. No NaN or infinite value ever leaves the package. A solve
// that did not converge, which is our fault and never the user's, is a
// *SolverError of kind ErrSolver that names the inputs. Messages keep their
// numbers as Figures (Note), for the caller to render in the user's units.
//
// # Phases
//
// Phase names follow the trade (see Phase). The boundaries:
//
//   - two-phase states (region 4) lie on the saturation line, T ≤ Tc: x = 0
//     is saturated liquid, x = 1 saturated vapour, 0 < x < 1 a saturated
//     mixture;
//   - p ≥ pc and T ≥ Tc: supercritical fluid;
//   - T < Tc and p at or above the saturation pressure ps(T), or p ≥ pc:
//     compressed liquid;
//   - otherwise (p below ps(T) at T < Tc, or p < pc at T ≥ Tc): superheated
//     vapour.
//
// with Tc = 647.096 K and pc = 22.064 MPa (R7-97(2012) Eqs. 2 and 3). The
// saturation line is R7-97(2012) Eq. 30 everywhere, above 623.15 K too, and
// every pair decides the phase by it (saturation.go).
package fn
