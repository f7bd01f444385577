package transport

import "math"

// Reference constants of IAPWS R12-08, Eqs. (2) to (5). IAPWS R15-11 uses the
// same T*, ρ* and p* (its Eqs. (2) to (4)).
const (
	tStar   = 647.096 // reference temperature T*, K (equal to Tc)
	rhoStar = 322.0   // reference density ρ*, kg/m³ (equal to ρc)
	pStar   = 22.064  // reference pressure p*, MPa (equal to pc)
	muStar  = 1.00e-6 // reference viscosity μ*, Pa·s
)

// ReferenceTemperatureTR is T_R = 1.5 T*, the temperature at which IAPWS
// R12-08 (Eq. 21) and R15-11 (Eq. 22) take the background value of
// (∂ρ/∂p)_T in the critical enhancements, in K.
const ReferenceTemperatureTR = tR * tStar

// Dilute-gas viscosity coefficients H_i of IAPWS R12-08, Table 1 (Eq. 11).
var viscosityH0 = [4]float64{
	1.67752,
	2.20462,
	0.6366564,
	-0.241605,
}

// Residual viscosity coefficients H_ij of IAPWS R12-08, Table 2 (Eq. 12),
// indexed [i][j]: i is the power of (1/T̄ − 1), j that of (ρ̄ − 1). The
// release lists 21 non-zero coefficients; the rest of the grid is zero.
var viscosityH1 = [6][7]float64{
	{5.20094e-1, 2.22531e-1, -2.81378e-1, 1.61913e-1, -3.25372e-2, 0, 0},
	{8.50895e-2, 9.99115e-1, -9.06851e-1, 2.57399e-1, 0, 0, 0},
	{-1.08374, 1.88797, -7.72479e-1, 0, 0, 0, 0},
	{-2.89555e-1, 1.26613, -4.89837e-1, 0, 6.98452e-2, 0, -4.35673e-3},
	{0, 0, -2.57040e-1, 0, 0, 8.72102e-3, 0},
	{0, 1.20573e-1, 0, 0, 0, 0, -5.93264e-4},
}

// Critical-region constants of IAPWS R12-08, Table 3 (Eqs. 13 to 21).
const (
	viscosityXMu = 0.068 // critical exponent x_μ
	viscosityQC  = 1.9   // 1/q_C, nm
	viscosityQD  = 1.1   // 1/q_D, nm
	critNu       = 0.630 // critical exponent ν (also R15-11 Table 3)
	critGamma    = 1.239 // critical exponent γ (also R15-11 Table 3)
	critXi0      = 0.13  // amplitude ξ0, nm (also R15-11 Table 3)
	critGamma0   = 0.06  // amplitude Γ0 (also R15-11 Table 3)
	tR           = 1.5   // reduced reference temperature T̄_R (also R15-11)
	// viscosityXiSwitch is the correlation length in nm below which R12-08
	// evaluates Y by the series of Eq. (15) instead of Eq. (16).
	viscosityXiSwitch = 0.3817016416
)

// viscosityDilute returns the reduced dilute-gas viscosity
//
//	μ̄0(T̄) = 100 √T̄ / Σ_{i=0..3} H_i / T̄^i
//
// of IAPWS R12-08, Eq. (11), with H_i from Table 1; T̄ = T/T*.
func viscosityDilute(tau float64) float64 {
	s := viscosityH0[3]
	for i := 2; i >= 0; i-- {
		s = s/tau + viscosityH0[i]
	}
	return 100 * math.Sqrt(tau) / s
}

// viscosityResidual returns the reduced residual factor
//
//	μ̄1(T̄, ρ̄) = exp[ρ̄ Σ_i (1/T̄ − 1)^i Σ_j H_ij (ρ̄ − 1)^j]
//
// of IAPWS R12-08, Eq. (12), with H_ij from Table 2.
func viscosityResidual(tau, delta float64) float64 {
	x, y := 1/tau-1, delta-1
	sum := 0.0
	for i := len(viscosityH1) - 1; i >= 0; i-- {
		sum = sum*x + horner(viscosityH1[i][:], y)
	}
	return math.Exp(delta * sum)
}

// correlationLength returns the correlation length ξ in nm of IAPWS R12-08,
// Eqs. (20) and (21) (identical to R15-11, Eqs. (21) and (22)):
//
//	Δχ̄ = ρ̄ [ζ(T̄, ρ̄) − ζ(T̄_R, ρ̄) T̄_R/T̄],  ξ = ξ0 (Δχ̄/Γ0)^(ν/γ),
//
// where ζ = (∂ρ̄/∂p̄)_T̄ is given reduced, zeta at the state and zetaR at T̄_R.
// Where Δχ̄ is negative or not a number, both releases set ξ = 0 (no
// enhancement).
func correlationLength(tau, delta, zeta, zetaR float64) float64 {
	dchi := delta * (zeta - zetaR*tR/tau)
	if !(dchi > 0) {
		return 0
	}
	return critXi0 * math.Pow(dchi/critGamma0, critNu/critGamma)
}

// viscosityCritical returns the critical-enhancement factor μ̄2 = exp(x_μ Y)
// of IAPWS R12-08, Eq. (13), for the correlation length xi in nm, with Y
// from Eq. (15) for ξ ≤ 0.3817016416 nm and Eq. (16) above.
func viscosityCritical(xi float64) float64 {
	if xi <= 0 {
		return 1
	}
	return math.Exp(viscosityXMu * viscosityY(xi))
}

// viscosityY returns the crossover function Y(ξ) of IAPWS R12-08, Eqs. (15)
// to (19), for ξ in nm: the series of Eq. (15) up to ξ = 0.3817016416 nm, the
// closed form of Eq. (16) above. The two forms cross at that ξ.
func viscosityY(xi float64) float64 {
	if xi <= viscosityXiSwitch {
		return viscosityYSeries(xi)
	}
	return viscosityYClosed(xi)
}

// viscosityYSeries returns Y(ξ) by the series of IAPWS R12-08, Eq. (15),
//
//	Y = (1/5) q_C ξ (q_D ξ)⁵ [1 − q_C ξ + (q_C ξ)² − (765/504)(q_D ξ)²].
func viscosityYSeries(xi float64) float64 {
	qc := xi / viscosityQC // q_C ξ
	qd := xi / viscosityQD // q_D ξ
	qd2 := qd * qd
	return qc * qd2 * qd2 * qd / 5 * (1 - qc + qc*qc - 765.0/504.0*qd2)
}

// viscosityYClosed returns Y(ξ) by the closed form of IAPWS R12-08,
// Eqs. (16) to (19), with ψ_D = arccos[(1 + q_D²ξ²)^(−1/2)] and
// w = |(q_C ξ − 1)/(q_C ξ + 1)|^(1/2) tan(ψ_D/2).
func viscosityYClosed(xi float64) float64 {
	qc := xi / viscosityQC                                     // q_C ξ
	qd := xi / viscosityQD                                     // q_D ξ
	psiD := math.Acos(1 / math.Sqrt(1+qd*qd))                  // Eq. (17)
	w := math.Sqrt(math.Abs((qc-1)/(qc+1))) * math.Tan(psiD/2) // Eq. (18)
	var lw float64
	if qc > 1 {
		lw = math.Log((1 + w) / (1 - w)) // Eq. (19), q_C ξ > 1
	} else {
		lw = 2 * math.Atan(math.Abs(w)) // Eq. (19), q_C ξ ≤ 1
	}
	qc2 := qc * qc
	return math.Sin(3*psiD)/12 -
		math.Sin(2*psiD)/(4*qc) +
		(1-1.25*qc2)*math.Sin(psiD)/qc2 -
		((1-1.5*qc2)*psiD-math.Pow(math.Abs(qc2-1), 1.5)*lw)/(qc2*qc)
}

// ViscosityNoEnhancement returns the dynamic viscosity of water in Pa·s at
// density rho in kg/m³ and temperature T in K, by IAPWS R12-08, Eq. (10),
// μ = μ* μ̄0(T̄) μ̄1(T̄, ρ̄) (Eqs. 11 and 12, Tables 1 and 2), with the
// critical enhancement μ̄2 set to 1.
//
// R12-08 (section on industrial use, as recalled) allows μ̄2 = 1 everywhere
// except in the small region 645.91 K < T < 650.77 K, 245.8 kg/m³ < ρ <
// 405.3 kg/m³: outside it μ̄2 stays below 1.02. Use Viscosity there.
//
// The release's range of validity is stated in (p, T), see
// CheckViscosityRange; this function does not know p and does not check it.
// It returns an *InputError if T is not a finite number > 0 or rho is not a
// finite number ≥ 0.
func ViscosityNoEnhancement(rho, T float64) (float64, error) {
	if err := checkRhoT("ViscosityNoEnhancement", rho, T); err != nil {
		return math.NaN(), err
	}
	tau, delta := T/tStar, rho/rhoStar
	return muStar * viscosityDilute(tau) * viscosityResidual(tau, delta), nil
}

// NearCritical holds the thermodynamic derivatives at one state that the
// critical enhancements of viscosity (IAPWS R12-08) and thermal conductivity
// (IAPWS R15-11) need, in base units.
type NearCritical struct {
	// DrhoDp is (∂ρ/∂p)_T at the state (ρ, T), kg/(m³·MPa); for an IF97
	// state it is Rho·KappaT.
	DrhoDp float64
	// DrhoDpTR is (∂ρ/∂p)_T at the same density and T_R = 1.5 T* =
	// 970.644 K, kg/(m³·MPa); see DrhoDpAtTR for the industrial
	// approximation.
	DrhoDpTR float64
	// Cp and Cv are the isobaric and isochoric specific heat capacities at the
	// state, kJ/(kg·K). The viscosity does not use them.
	Cp, Cv float64
}

// xi returns the correlation length ξ in nm at the state.
func (nc NearCritical) xi(tau, delta float64) float64 {
	const zetaUnit = pStar / rhoStar // reduces (∂ρ/∂p)_T in kg/(m³·MPa)
	return correlationLength(tau, delta, nc.DrhoDp*zetaUnit, nc.DrhoDpTR*zetaUnit)
}

// Viscosity returns the dynamic viscosity of water in Pa·s at density rho in
// kg/m³ and temperature T in K with the critical enhancement, IAPWS R12-08,
// Eq. (10): μ = μ* μ̄0 μ̄1 μ̄2, where μ̄2 (Eqs. 13 to 21, Table 3) comes from the
// correlation length ξ computed from nc.DrhoDp and nc.DrhoDpTR. Where
// Δχ̄ = ρ̄[ζ(T̄) − ζ(T̄_R) T̄_R/T̄] ≤ 0, μ̄2 = 1, as the release prescribes.
//
// The release computes the derivatives from IAPWS-95; with IF97 derivatives
// (as ForState does) the result is the industrial approximation.
//
// The range of validity is stated in (p, T), see CheckViscosityRange. It
// returns an *InputError if T is not a finite number > 0, rho is not a finite
// number ≥ 0, or a derivative in nc is not finite.
func Viscosity(rho, T float64, nc NearCritical) (float64, error) {
	if err := checkRhoT("Viscosity", rho, T); err != nil {
		return math.NaN(), err
	}
	if err := checkFinite("Viscosity", InputDrhoDp, nc.DrhoDp); err != nil {
		return math.NaN(), err
	}
	if err := checkFinite("Viscosity", InputDrhoDpTR, nc.DrhoDpTR); err != nil {
		return math.NaN(), err
	}
	return viscosity(T/tStar, rho/rhoStar, nc), nil
}

// viscosity returns μ in Pa·s with the enhancement, without input checks.
func viscosity(tau, delta float64, nc NearCritical) float64 {
	mu2 := viscosityCritical(nc.xi(tau, delta))
	return muStar * viscosityDilute(tau) * viscosityResidual(tau, delta) * mu2
}

// horner returns Σ_j c_j y^j for the coefficients c of one row of a
// double-sum table (R12-08 Table 2, R15-11 Table 2), by Horner's rule.
func horner(c []float64, y float64) float64 {
	v := 0.0
	for j := len(c) - 1; j >= 0; j-- {
		v = v*y + c[j]
	}
	return v
}
