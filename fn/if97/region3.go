package if97

import "math"

// r3N1 is n₁, the coefficient of the logarithmic term of region 3,
// R7-97(2012) Table 30, row i = 1.
const r3N1 = 0.10658070028513e1

// r3Coef holds the coefficients and exponents of the polynomial part of
// the dimensionless Helmholtz free energy of region 3, R7-97(2012) Table 30,
// rows i = 2 to 40.
var r3Coef = [...]term{
	{0, 0, -0.15732845290239e2},
	{0, 1, 0.20944396974307e2},
	{0, 2, -0.76867707878716e1},
	{0, 7, 0.26185947787954e1},
	{0, 10, -0.28080781148620e1},
	{0, 12, 0.12053369696517e1},
	{0, 23, -0.84566812812502e-2},
	{1, 2, -0.12654315477714e1},
	{1, 6, -0.11524407806681e1},
	{1, 15, 0.88521043984318},
	{1, 17, -0.64207765181607},
	{2, 0, 0.38493460186671},
	{2, 2, -0.85214708824206},
	{2, 6, 0.48972281541877e1},
	{2, 7, -0.30502617256965e1},
	{2, 22, 0.39420536879154e-1},
	{2, 26, 0.12558408424308},
	{3, 0, -0.27999329698710},
	{3, 2, 0.13899799569460e1},
	{3, 4, -0.20189915023570e1},
	{3, 16, -0.82147637173963e-2},
	{3, 26, -0.47596035734923},
	{4, 0, 0.43984074473500e-1},
	{4, 2, -0.44476435428739},
	{4, 4, 0.90572070719733},
	{4, 26, 0.70522450087967},
	{5, 1, 0.10770512626332},
	{5, 3, -0.32913623258954},
	{5, 26, -0.50871062041158},
	{6, 0, -0.22175400873096e-1},
	{6, 2, 0.94260751665092e-1},
	{6, 26, 0.16436278447961},
	{7, 2, -0.13503372241348e-1},
	{8, 26, -0.14834345352472e-1},
	{9, 2, 0.57922953628084e-3},
	{9, 26, 0.32308904703711e-2},
	{10, 0, 0.80964802996215e-4},
	{10, 1, -0.16557679795037e-3},
	{11, 26, -0.44923899061815e-4},
}

// r3Phi returns φ = f/(RT) of region 3 and its derivatives in δ and τ,
// R7-97(2012) Eq. 28 and Table 32: φ = n₁ ln δ + Σ nᵢ δ^Iᵢ τ^Jᵢ.
func r3Phi(delta, tau float64) regDerivs {
	d := regPolySum(r3Coef[:], delta, tau)
	d.f += r3N1 * math.Log(delta)
	d.fa += r3N1 / delta
	d.faa -= r3N1 / (delta * delta)
	return d
}

// Region3 returns the properties of water at density rho in kg/m³ and
// temperature T in K from the basic equation of region 3, the dimensionless
// Helmholtz free energy of IAPWS R7-97(2012) Eq. 28 with the coefficients of
// Table 30 and the relations of Table 31. Its inputs are density and
// temperature, not pressure: the pressure is one of the results.
//
// Region 3 is 623.15 K ≤ T ≤ TB23(p) with pB23(T) ≤ p ≤ 100 MPa, where pB23
// and TB23 are B23Pressure and B23Temperature; near the critical point the
// equation also covers the two-phase states below the saturation line, where
// its single-phase results are not equilibrium states. Region3 does not check
// its inputs: outside that range it extrapolates, without stated accuracy;
// rho ≤ 0 makes F, G and S NaN or infinite and the other fields meaningless;
// a NaN input gives NaN results.
func Region3(rho, T float64) Props {
	delta, tau := rho/Rhoc, Tc/T
	return regHelmholtzProps(rho, T, delta, tau, r3Phi(delta, tau))
}
