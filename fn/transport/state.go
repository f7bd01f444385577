package transport

import (
	"math"

	"steamcell/fn/if97"
)

// Result holds the transport properties of one single-phase state, in base
// units.
type Result struct {
	Viscosity          float64 // dynamic viscosity μ, Pa·s
	Conductivity       float64 // thermal conductivity λ, W/(m·K)
	KinematicViscosity float64 // ν = μ/ρ, m²/s
	ThermalDiffusivity float64 // a = λ/(ρ cp), m²/s
	Prandtl            float64 // Pr = μ cp/λ, dimensionless
	// Warnings lists the properties whose release does not cover the state
	// (see CheckViscosityRange, CheckConductivityRange); their values are
	// extrapolations. Empty inside both ranges of validity.
	Warnings []Warning
}

// ForState returns the transport properties of the single-phase IF97 state
// st, which must have P (MPa), T (K), Rho (kg/m³), Cp, Cv (kJ/(kg·K)) and
// KappaT (1/MPa) filled in, as the region functions of package if97 do.
//
// Viscosity is IAPWS R12-08 Eq. (10) and thermal conductivity IAPWS R15-11
// Eq. (10), both with their critical enhancements, computed the way R15-11
// recommends for industrial use with IAPWS-IF97:
//   - (∂ρ/∂p)_T at the state is Rho·KappaT from IF97, and cp, cv are IF97's;
//   - (∂ρ/∂p)_T at the same density and T_R = 970.644 K comes from the
//     approximation DrhoDpAtTR (R15-11 Eq. 25), since IF97 does not reach
//     the densities needed there (it ends at 100 MPa);
//   - the viscosity in λ̄2 is the enhanced one.
//
// The enhancements vanish wherever Δχ̄ ≤ 0, which holds far from the critical
// point; R12-08 notes μ̄2 exceeds 1.02 only in 645.91 K < T < 650.77 K,
// 245.8 kg/m³ < ρ < 405.3 kg/m³, while λ̄2 reaches a few percent of λ
// tens of kelvin away (3.6 % in near-saturated liquid at 621 K with IF97 derivatives). Near the critical
// point the results inherit IF97's derivatives, which differ from the
// IAPWS-95 derivatives the releases' scientific form uses: at 647.35 K and
// 322 kg/m³, λ is about 19 % below the IAPWS-95 value (R15-11 Table 5) and μ
// 1.5 % below (R12-08 Table 5).
//
// From these, ν = μ/ρ, a = λ/(ρ cp) and Pr = μ cp/λ. A state outside a
// release's range of validity still gets its value, with a Warning in
// Result.Warnings. ForState returns an *InputError when P, T, Rho, Cp, Cv or
// KappaT are not finite and > 0 (KappaT ≤ 0 is a mechanically unstable state,
// which a single-phase IF97 state never is).
func ForState(st if97.Props) (Result, error) {
	const fn = "ForState"
	for _, in := range [...]struct {
		which Input
		v     float64
	}{
		{InputP, st.P}, {InputT, st.T}, {InputRho, st.Rho},
		{InputCp, st.Cp}, {InputCv, st.Cv}, {InputKappaT, st.KappaT},
	} {
		if !(in.v > 0) || math.IsInf(in.v, 1) {
			return Result{}, &InputError{Func: fn, Input: in.which, Value: in.v, Err: ErrNonPhysical}
		}
	}
	nc := NearCritical{
		DrhoDp:   st.Rho * st.KappaT,
		DrhoDpTR: DrhoDpAtTR(st.Rho),
		Cp:       st.Cp,
		Cv:       st.Cv,
	}
	tau, delta := st.T/tStar, st.Rho/rhoStar
	mu := viscosity(tau, delta, nc)
	k := conductivity(tau, delta, nc, mu)
	r := Result{
		Viscosity:          mu,
		Conductivity:       k,
		KinematicViscosity: KinematicViscosity(mu, st.Rho),
		ThermalDiffusivity: ThermalDiffusivity(k, st.Rho, st.Cp),
		Prandtl:            PrandtlNumber(mu, st.Cp, k),
	}
	if w := CheckViscosityRange(st.P, st.T); w != nil {
		r.Warnings = append(r.Warnings, *w)
	}
	if w := CheckConductivityRange(st.P, st.T); w != nil {
		r.Warnings = append(r.Warnings, *w)
	}
	return r, nil
}

// jPerKJ converts heat capacities in kJ/(kg·K) to J/(kg·K).
const jPerKJ = 1e3

// KinematicViscosity returns ν = μ/ρ in m²/s for the dynamic viscosity mu in
// Pa·s and the density rho in kg/m³.
func KinematicViscosity(mu, rho float64) float64 { return mu / rho }

// ThermalDiffusivity returns a = λ/(ρ cp) in m²/s for the thermal
// conductivity k in W/(m·K), the density rho in kg/m³ and the isobaric heat
// capacity cp in kJ/(kg·K).
func ThermalDiffusivity(k, rho, cp float64) float64 { return k / (rho * cp * jPerKJ) }

// PrandtlNumber returns Pr = μ cp/λ, dimensionless, for the dynamic
// viscosity mu in Pa·s, the isobaric heat capacity cp in kJ/(kg·K) and the
// thermal conductivity k in W/(m·K).
func PrandtlNumber(mu, cp, k float64) float64 { return mu * cp * jPerKJ / k }
