package if97

// Reducing quantities of region 1, R7-97(2012) Eq. 7.
const (
	r1PStar = 16.53 // p*, MPa
	r1TStar = 1386  // T*, K
)

// r1Coef holds the coefficients and exponents of the dimensionless Gibbs
// free energy of region 1, R7-97(2012) Table 2, rows i = 1 to 34.
var r1Coef = [...]term{
	{0, -2, 0.14632971213167},
	{0, -1, -0.84548187169114},
	{0, 0, -0.37563603672040e1},
	{0, 1, 0.33855169168385e1},
	{0, 2, -0.95791963387872},
	{0, 3, 0.15772038513228},
	{0, 4, -0.16616417199501e-1},
	{0, 5, 0.81214629983568e-3},
	{1, -9, 0.28319080123804e-3},
	{1, -7, -0.60706301565874e-3},
	{1, -1, -0.18990068218419e-1},
	{1, 0, -0.32529748770505e-1},
	{1, 1, -0.21841717175414e-1},
	{1, 3, -0.52838357969930e-4},
	{2, -3, -0.47184321073267e-3},
	{2, 0, -0.30001780793026e-3},
	{2, 1, 0.47661393906987e-4},
	{2, 3, -0.44141845330846e-5},
	{2, 17, -0.72694996297594e-15},
	{3, -4, -0.31679644845054e-4},
	{3, 0, -0.28270797985312e-5},
	{3, 6, -0.85205128120103e-9},
	{4, -5, -0.22425281908000e-5},
	{4, -2, -0.65171222895601e-6},
	{4, 10, -0.14341729937924e-12},
	{5, -8, -0.40516996860117e-6},
	{8, -11, -0.12734301741641e-8},
	{8, -6, -0.17424871230634e-9},
	{21, -29, -0.68762131295531e-18},
	{23, -31, 0.14478307828521e-19},
	{29, -38, 0.26335781662795e-22},
	{30, -39, -0.11947622640071e-22},
	{31, -40, 0.18228094581404e-23},
	{32, -41, -0.93537087292458e-25},
}

// r1Gamma returns γ = g/(RT) of region 1 and its derivatives in π and τ,
// R7-97(2012) Eq. 7 and Table 4: γ = Σ nᵢ (7.1 − π)^Iᵢ (τ − 1.222)^Jᵢ.
func r1Gamma(pi, tau float64) regDerivs {
	d := regPolySum(r1Coef[:], 7.1-pi, tau-1.222)
	// The sum is in a = 7.1 − π, so ∂/∂π = −∂/∂a.
	d.fa, d.fab = -d.fa, -d.fab
	return d
}

// Region1 returns the properties of liquid water at pressure p in MPa and
// temperature T in K from the basic equation of region 1, the dimensionless
// Gibbs free energy of IAPWS R7-97(2012) Eq. 7 with the coefficients of
// Table 2 and the relations of Table 3.
//
// Region 1 is 273.15 K ≤ T ≤ 623.15 K with ps(T) ≤ p ≤ 100 MPa, where ps is
// SatPressure. Region1 does not check its inputs: outside that range it
// extrapolates the polynomial, whose values have no stated accuracy there and
// soon have no physical meaning. A NaN input gives NaN results.
func Region1(p, T float64) Props {
	pi, tau := p/r1PStar, r1TStar/T
	return regGibbsProps(p, T, pi, tau, r1Gamma(pi, tau))
}
