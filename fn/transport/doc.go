// Package transport holds the transport and interface properties of water and
// steam from the IAPWS releases:
//
//   - IAPWS R12-08, Release on the IAPWS Formulation 2008 for the Viscosity
//     of Ordinary Water Substance (viscosity.go);
//   - IAPWS R15-11, Release on the IAPWS Formulation 2011 for the Thermal
//     Conductivity of Ordinary Water Substance (conductivity.go);
//   - IAPWS R1-76(2014), Revised Release on Surface Tension of Ordinary Water
//     Substance (surface.go);
//   - IAPWS R14-08(2011), Revised Release on the Pressure along the Melting
//     and Sublimation Curves of Ordinary Water Substance, for the low end of
//     the ranges of validity (validity.go).
//
// Base units: T in K, ρ in kg/m³, p in MPa, heat capacities in kJ/(kg·K),
// (∂ρ/∂p)_T in kg/(m³·MPa); results in SI units:
//
//	symbol  quantity                 unit     from
//	mu      dynamic viscosity μ      Pa·s     R12-08 Eq. (10)
//	k       thermal conductivity λ   W/(m·K)  R15-11 Eq. (10)
//	sigma   surface tension σ        N/m      R1-76(2014) Eq. (1)
//	nu      kinematic viscosity ν    m²/s     μ/ρ
//	alpha   thermal diffusivity a    m²/s     λ/(ρ cp)
//	pr      Prandtl number Pr        1        μ cp/λ
//
// Viscosity and conductivity are functions of (ρ, T); their critical
// enhancements also need (∂ρ/∂p)_T at the state and at T_R = 1.5 Tc, and the
// conductivity's needs cp and cv (type NearCritical). ForState takes all of
// that from an IF97 state, as R15-11 recommends for industrial use.
//
// Ranges of validity are stated by the releases in (p, T), not in (ρ, T):
// the (ρ, T) functions only reject non-physical inputs (*InputError);
// CheckViscosityRange and CheckConductivityRange tell whether a state is
// covered, and ForState puts a Warning in its result for each property that
// is extrapolated. Surface tension is refused (*RangeError) outside
// 248.15 K ≤ T ≤ Tc and marked by CheckSurfaceTensionRange below 273.16 K.
//
// The coefficients and equation numbers were typed from memory of the
// releases; each verification table of the releases that could be recalled
// is reproduced in the tests beside each file.
package transport
