package if97

import "math"

// SatPressureSlope returns dps/dT, MPa/K, the derivative of the
// saturation-pressure equation SatPressure (R7-97(2012) Eq. 30) at T in K,
// by implicit differentiation of Eq. 29, F(β, ϑ) = 0:
// dβ/dϑ = −(∂F/∂ϑ)/(∂F/∂β), dϑ/dT = 1 − n₉/(T − n₁₀)², p = β⁴. Like
// SatPressure it is meant for 273.15 K ≤ T ≤ Tc and does not check T.
func SatPressureSlope(T float64) float64 {
	n := &r4Coef
	theta := T + n[8]/(T-n[9])
	p := SatPressure(T)
	beta := math.Sqrt(math.Sqrt(p))
	fTheta := 2*beta*beta*theta + n[0]*beta*beta + 2*n[2]*beta*theta + n[3]*beta + 2*n[5]*theta + n[6]
	fBeta := 2*beta*theta*theta + 2*n[0]*beta*theta + 2*n[1]*beta + n[2]*theta*theta + n[3]*theta + n[4]
	dTheta := 1 - n[8]/((T-n[9])*(T-n[9]))
	return 4 * beta * beta * beta * (-fTheta / fBeta) * dTheta
}
