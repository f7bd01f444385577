package transport

import "math"

// Constants of IAPWS R15-11, Eqs. (2) to (6) and Table 3. T*, ρ* and p* are
// those of R12-08 (tStar, rhoStar, pStar).
const (
	lambdaStar = 1.00e-3    // reference thermal conductivity λ*, W/(m·K)
	condR      = 0.46151805 // specific gas constant R, kJ/(kg·K), used to reduce cp
	condLambda = 177.8514   // amplitude Λ of Eq. (18)
	condQD     = 0.40       // 1/q_D, nm
	// condCpMax is the bound R15-11 puts on c̄p in Eq. (18): a c̄p below 0 or
	// above it is replaced by it.
	condCpMax = 1e13
	// condYMin is the y = q_D ξ below which R15-11 sets Z(y) = 0 (Eq. 19).
	condYMin = 1.2e-7
)

// Dilute-gas conductivity coefficients L_k of IAPWS R15-11, Table 1 (Eq. 16).
var conductivityL0 = [5]float64{
	2.443221e-3,
	1.323095e-2,
	6.770357e-3,
	-3.454586e-3,
	4.096266e-4,
}

// Residual conductivity coefficients L_ij of IAPWS R15-11, Table 2 (Eq. 17),
// indexed [i][j]: i is the power of (1/T̄ − 1), j that of (ρ̄ − 1).
var conductivityL1 = [5][6]float64{
	{1.60397357, -0.646013523, 0.111443906, 0.102997357, -0.0504123634, 0.00609859258},
	{2.33771842, -2.78843778, 1.53616167, -0.463045512, 0.0832827019, -0.00719201245},
	{2.19650529, -4.54580785, 3.55777244, -1.40944978, 0.275418278, -0.0205938816},
	{-1.21051378, 1.60812989, -0.621178141, 0.0716373224, 0, 0},
	{-2.7203370, 4.57586331, -3.18369245, 1.1168348, -0.19268305, 0.012913842},
}

// conductivityDilute returns the reduced dilute-gas conductivity
//
//	λ̄0(T̄) = √T̄ / Σ_{k=0..4} L_k / T̄^k
//
// of IAPWS R15-11, Eq. (16), with L_k from Table 1; T̄ = T/T*.
func conductivityDilute(tau float64) float64 {
	s := conductivityL0[4]
	for k := 3; k >= 0; k-- {
		s = s/tau + conductivityL0[k]
	}
	return math.Sqrt(tau) / s
}

// conductivityResidual returns the reduced residual factor
//
//	λ̄1(T̄, ρ̄) = exp[ρ̄ Σ_i (1/T̄ − 1)^i Σ_j L_ij (ρ̄ − 1)^j]
//
// of IAPWS R15-11, Eq. (17), with L_ij from Table 2.
func conductivityResidual(tau, delta float64) float64 {
	x, y := 1/tau-1, delta-1
	sum := 0.0
	for i := len(conductivityL1) - 1; i >= 0; i-- {
		sum = sum*x + horner(conductivityL1[i][:], y)
	}
	return math.Exp(delta * sum)
}

// conductivityZ returns the crossover function of IAPWS R15-11, Eq. (19),
//
//	Z(y) = 2/(π y) {[(1 − κ⁻¹) arctan y + κ⁻¹ y] − [1 − exp(−1/(y⁻¹ + y²/(3ρ̄²)))]},
//
// with y = q_D ξ and κ = cp/cv; Z = 0 for y < 1.2e-7.
func conductivityZ(y, kappaInv, delta float64) float64 {
	if y < condYMin {
		return 0
	}
	a := (1-kappaInv)*math.Atan(y) + kappaInv*y
	b := 1 - math.Exp(-1/(1/y+y*y/(3*delta*delta)))
	return 2 / (math.Pi * y) * (a - b)
}

// conductivityCritical returns the reduced critical enhancement of IAPWS
// R15-11, Eq. (18),
//
//	λ̄2 = Λ ρ̄ c̄p T̄ Z(y) / μ̄,
//
// with c̄p = cp/R (cp in kJ/(kg·K)), κ = cp/cv, ξ in nm and μ̄ = μ/μ* the
// viscosity of R12-08 including its own enhancement.
func conductivityCritical(tau, delta, cp, cv, xi, muBar float64) float64 {
	cpBar := cp / condR
	if cpBar < 0 || cpBar > condCpMax {
		cpBar = condCpMax
	}
	kappaInv := cv / (cpBar * condR)
	z := conductivityZ(xi/condQD, kappaInv, delta)
	return condLambda * delta * cpBar * tau * z / muBar
}

// ConductivityNoEnhancement returns the thermal conductivity of water in
// W/(m·K) at density rho in kg/m³ and temperature T in K, by IAPWS R15-11,
// Eq. (10), λ = λ* λ̄0(T̄) λ̄1(T̄, ρ̄) (Eqs. 16 and 17, Tables 1 and 2), with
// the critical enhancement λ̄2 set to 0. Unlike the viscosity enhancement,
// λ̄2 is not negligible over a wide region around the critical point (tens
// of kelvin and from vapour to liquid densities); use Conductivity for
// properties, this function for checks and background values.
//
// The release's range of validity is stated in (p, T), see
// CheckConductivityRange; this function does not know p and does not check
// it. It returns an *InputError if T is not a finite number > 0 or rho is not
// a finite number ≥ 0.
func ConductivityNoEnhancement(rho, T float64) (float64, error) {
	if err := checkRhoT("ConductivityNoEnhancement", rho, T); err != nil {
		return math.NaN(), err
	}
	tau, delta := T/tStar, rho/rhoStar
	return lambdaStar * conductivityDilute(tau) * conductivityResidual(tau, delta), nil
}

// Conductivity returns the thermal conductivity of water in W/(m·K) at
// density rho in kg/m³ and temperature T in K with the critical enhancement,
// IAPWS R15-11, Eq. (10): λ = λ*(λ̄0 λ̄1 + λ̄2), λ̄2 from Eqs. (18) to (22)
// with the derivatives and heat capacities in nc and the viscosity of IAPWS
// R12-08 including its enhancement (Viscosity). Where Δχ̄ ≤ 0, λ̄2 = 0.
//
// The release computes the derivatives from IAPWS-95; with IF97 derivatives
// (as ForState does) the result is the industrial approximation.
//
// The range of validity is stated in (p, T), see CheckConductivityRange. It
// returns an *InputError if T is not a finite number > 0, rho is not a finite
// number ≥ 0, or a field of nc is not finite, or Cv is not > 0.
func Conductivity(rho, T float64, nc NearCritical) (float64, error) {
	const fn = "Conductivity"
	if err := checkRhoT(fn, rho, T); err != nil {
		return math.NaN(), err
	}
	for _, in := range [...]struct {
		which Input
		v     float64
	}{{InputDrhoDp, nc.DrhoDp}, {InputDrhoDpTR, nc.DrhoDpTR}, {InputCp, nc.Cp}, {InputCv, nc.Cv}} {
		if err := checkFinite(fn, in.which, in.v); err != nil {
			return math.NaN(), err
		}
	}
	if !(nc.Cv > 0) {
		return math.NaN(), &InputError{Func: fn, Input: InputCv, Value: nc.Cv, Err: ErrNonPhysical}
	}
	tau, delta := T/tStar, rho/rhoStar
	mu := viscosity(tau, delta, nc)
	return conductivity(tau, delta, nc, mu), nil
}

// conductivity returns λ in W/(m·K) with the enhancement, given μ in Pa·s,
// without input checks.
func conductivity(tau, delta float64, nc NearCritical, mu float64) float64 {
	l2 := conductivityCritical(tau, delta, nc.Cp, nc.Cv, nc.xi(tau, delta), mu/muStar)
	return lambdaStar * (conductivityDilute(tau)*conductivityResidual(tau, delta) + l2)
}

// Coefficients A_ij of the industrial approximation of ζ(T̄_R, ρ̄) in IAPWS
// R15-11, section on the use with IAPWS-IF97 (Eq. 25 and its table of A_ij),
// indexed [j][i]: j selects the density interval of
// conductivityTRBounds, i is the power of ρ̄.
var conductivityA = [5][6]float64{
	{6.53786807199516, -5.61149954923348, 3.39624167361325, -2.27492629730878, 10.2631854662709, 1.97815050331519},
	{6.52717759281799, -6.30816983387575, 8.08379285492595, -9.82240510197603, 12.1358413791395, -5.54349664571295},
	{5.35500529896124, -3.96415689925446, 8.91990208918795, -12.0338729505790, 9.19494865194302, -2.16866274479712},
	{1.55225959906681, 0.464621290821181, 8.93237374861479, -11.0321960061126, 6.16780999933360, -0.965458722086812},
	{1.11999926419994, 0.595748562571649, 9.88952565078920, -10.3255051147040, 4.66861294457414, -0.503243546373828},
}

// Upper bounds of ρ̄ for the rows j = 0..3 of conductivityA (IAPWS R15-11,
// with Eq. 25); row 4 holds above the last bound.
var conductivityTRBounds = [4]float64{0.310559006, 0.776397516, 1.242236025, 1.863354037}

// DrhoDpAtTR returns (∂ρ/∂p)_T in kg/(m³·MPa) at density rho in kg/m³ and
// T_R = 1.5 T* = 970.644 K, by the approximation that IAPWS R15-11 gives for
// industrial use with IAPWS-IF97 (Eq. 25):
//
//	ζ(T̄_R, ρ̄) = 1 / Σ_{i=0..5} A_ij ρ̄^i,  ζ = (ρc/pc)⁻¹ (∂ρ/∂p)_T,
//
// with the coefficient set j chosen by the density interval. It stands for
// IAPWS-95 where IF97 does not reach: IF97 ends at 100 MPa, which at T_R is
// 284 kg/m³, while the liquid of IF97 is up to 3.3 ρc dense. Below
// 284 kg/m³ it agrees with IF97 region 2 to 6e-4. The critical enhancements
// use it only through Δχ̄, which is negative (no enhancement) far from the
// critical point. rho < 0 or NaN gives NaN.
func DrhoDpAtTR(rho float64) float64 {
	if !(rho >= 0) {
		return math.NaN()
	}
	delta := rho / rhoStar
	j := len(conductivityTRBounds)
	for k, b := range conductivityTRBounds {
		if delta <= b {
			j = k
			break
		}
	}
	a := conductivityA[j]
	s := a[5]
	for i := 4; i >= 0; i-- {
		s = s*delta + a[i]
	}
	return rhoStar / pStar / s
}
