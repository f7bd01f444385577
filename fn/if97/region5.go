package if97

// Reducing quantities of region 5, R7-97(2012) Eq. 32.
const (
	r5PStar = 1    // p*, MPa
	r5TStar = 1000 // T*, K
)

// r5IdealCoef holds the exponents J⁰ and coefficients n⁰ of the
// ideal-gas part of region 5, R7-97(2012) Table 37, rows i = 1 to 6 (I is
// unused: 0).
var r5IdealCoef = [...]term{
	{0, 0, -0.13179983674201e2},
	{0, 1, 0.68540841634434e1},
	{0, -3, -0.24805148933466e-1},
	{0, -2, 0.36901534980333},
	{0, -1, -0.31161318213925e1},
	{0, 2, -0.32961626538917},
}

// r5ResidualCoef holds the coefficients and exponents of the residual
// part of region 5, R7-97(2012) Table 38, rows i = 1 to 6.
var r5ResidualCoef = [...]term{
	{1, 1, 0.15736404855259e-2},
	{1, 2, 0.90153761673944e-3},
	{1, 3, -0.50270077677648e-2},
	{2, 3, 0.22440037409485e-5},
	{2, 9, -0.41163275453471e-5},
	{3, 7, 0.37919454822955e-7},
}

// Region5 returns the properties of high-temperature steam at pressure p in
// MPa and temperature T in K from the basic equation of region 5, the
// dimensionless Gibbs free energy of IAPWS R7-97(2012) Eq. 32: the ideal-gas
// part of Eq. 33 and Table 37 plus the residual part of Eq. 34 and Table 38,
// with the relations of Table 39.
//
// Region 5 is 1073.15 K ≤ T ≤ 2273.15 K with 0 < p ≤ 50 MPa. Region5 does
// not check its inputs: outside that range it extrapolates, without stated
// accuracy; p ≤ 0 makes G and S NaN or infinite and the other fields
// meaningless; a NaN input gives NaN results.
func Region5(p, T float64) Props {
	pi, tau := p/r5PStar, r5TStar/T
	d := regIdealGamma(r5IdealCoef[:], pi, tau).plus(regPolySum(r5ResidualCoef[:], pi, tau))
	return regGibbsProps(p, T, pi, tau, d)
}
