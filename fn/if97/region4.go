package if97

import "math"

// r4Coef holds n₁ to n₁₀ of the saturation-pressure equation, R7-97(2012)
// Table 34.
var r4Coef = [10]float64{
	0.11670521452767e4,
	-0.72421316703206e6,
	-0.17073846940092e2,
	0.12020824702470e5,
	-0.32325550322333e7,
	0.14915108613530e2,
	-0.48232657361591e4,
	0.40511340542057e6,
	-0.23855557567849,
	0.65017534844798e3,
}

// SatPressure returns the saturation (vapour) pressure of water in MPa at
// temperature T in K, the saturation-pressure equation of IAPWS R7-97(2012)
// Eq. 30 with the coefficients of Table 34: the implicit quadratic of Eq. 29
// in β = (p/p*)^¼ and ϑ = T/T* + n₉/(T/T* − n₁₀), p* = 1 MPa, T* = 1 K,
// solved for p.
//
// The equation is valid from 273.15 K, where it gives 611.212677 Pa, to the
// critical temperature Tc = 647.096 K, where it gives Pc = 22.064 MPa.
// SatPressure does not check T: below 273.15 K it extrapolates without stated
// accuracy, and above Tc it returns a number, or NaN, that is no saturation
// state. A NaN input gives NaN.
func SatPressure(T float64) float64 {
	n := &r4Coef
	theta := T + n[8]/(T-n[9])
	a := theta*theta + n[0]*theta + n[1]
	b := n[2]*theta*theta + n[3]*theta + n[4]
	c := n[5]*theta*theta + n[6]*theta + n[7]
	beta := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	beta2 := beta * beta
	return beta2 * beta2
}

// SatTemperature returns the saturation temperature of water in K at
// pressure p in MPa, the saturation-temperature equation of IAPWS R7-97(2012)
// Eq. 31 with the coefficients of Table 34: Eq. 29 solved for T, the inverse
// of SatPressure.
//
// The equation is valid from 611.213 Pa, where it gives 273.15 K, to the
// critical pressure Pc = 22.064 MPa, where it gives Tc = 647.096 K.
// SatTemperature does not check p: below 611.213 Pa it extrapolates without
// stated accuracy, and above Pc it returns a number that is no saturation
// state. p < 0 or a NaN input gives NaN.
func SatTemperature(p float64) float64 {
	n := &r4Coef
	beta := math.Sqrt(math.Sqrt(p))
	e := beta*beta + n[2]*beta + n[5]
	f := n[0]*beta*beta + n[3]*beta + n[6]
	g := n[1]*beta*beta + n[4]*beta + n[7]
	d := 2 * g / (-f - math.Sqrt(f*f-4*e*g))
	return (n[9] + d - math.Sqrt((n[9]+d)*(n[9]+d)-4*(n[8]+n[9]*d))) / 2
}
