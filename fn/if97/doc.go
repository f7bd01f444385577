// Package if97 holds the equations of the IAPWS Industrial Formulation 1997 for
// the thermodynamic properties of water and steam, and of its supplementary
// releases on backward equations:
//
//   - IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation
//     1997 for the Thermodynamic Properties of Water and Steam: regions 1 to 5,
//     the B23 boundary and the backward equations T(p,h), T(p,s) of regions 1
//     and 2.
//   - IAPWS SR2-01(2014): backward equations p(h,s) for regions 1 and 2.
//   - IAPWS SR3-03(2014): backward equations T(p,h), v(p,h), T(p,s), v(p,s)
//     for region 3.
//   - IAPWS SR4-04(2014): backward equations p(h,s) for region 3 and
//     Tsat(h,s) for the two-phase region.
//   - IAPWS SR5-05(2016): backward equations v(p,T) for region 3.
//
// Everything here works in one base unit system: pressure in MPa, temperature
// in K, specific volume in m³/kg, density in kg/m³, specific energies in kJ/kg,
// specific entropy and heat capacities in kJ/(kg·K), speed of sound in m/s.
//
// The functions do not check their inputs against the range of validity: that
// is the job of package fn, which chooses the region and returns typed errors.
// Raw dimensionless equations are unexported; each exported function names the
// release and the equation it implements.
package if97
