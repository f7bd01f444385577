package if97

import "math"

// b23Coef holds n₁ to n₅ of the boundary equation between regions 2 and 3,
// R7-97(2012) Table 1.
var b23Coef = [5]float64{
	0.34805185628969e3,
	-0.11671859879975e1,
	0.10192970039326e-2,
	0.57254459862746e3,
	0.13918839778870e2,
}

// B23Pressure returns the pressure in MPa of the boundary between regions 2
// and 3 at temperature T in K, the quadratic of IAPWS R7-97(2012) Eq. 5 with
// the coefficients of Table 1: p = n₁ + n₂T + n₃T².
//
// The boundary runs from 623.15 K, 16.5292 MPa to 863.15 K, 100 MPa.
// B23Pressure does not check T; outside that range it extends the parabola.
func B23Pressure(T float64) float64 {
	n := &b23Coef
	return n[0] + n[1]*T + n[2]*T*T
}

// B23Temperature returns the temperature in K of the boundary between regions
// 2 and 3 at pressure p in MPa, the inverse of B23Pressure given as IAPWS
// R7-97(2012) Eq. 6 with the coefficients of Table 1:
// T = n₄ + ((p − n₅)/n₃)^½.
//
// The boundary runs from 16.5292 MPa, 623.15 K to 100 MPa, 863.15 K.
// B23Temperature does not check p; below n₅ = 13.9188 MPa it returns NaN.
func B23Temperature(p float64) float64 {
	n := &b23Coef
	return n[3] + math.Sqrt((p-n[4])/n[2])
}
