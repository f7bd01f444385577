package if97

// Reducing quantities of region 2 and of its metastable-vapour equation,
// R7-97(2012) Eqs. 15 and 18.
const (
	r2PStar = 1   // p*, MPa
	r2TStar = 540 // T*, K
)

// r2IdealCoef holds the exponents J⁰ and coefficients n⁰ of the ideal-gas
// part of region 2, R7-97(2012) Table 10, rows i = 1 to 9 (I is unused: 0).
var r2IdealCoef = [...]term{
	{0, 0, -0.96927686500217e1},
	{0, 1, 0.10086655968018e2},
	{0, -5, -0.56087911283020e-2},
	{0, -4, 0.71452738081455e-1},
	{0, -3, -0.40710498223928},
	{0, -2, 0.14240819171444e1},
	{0, -1, -0.43839511319450e1},
	{0, 2, -0.28408632460772},
	{0, 3, 0.21268463753307e-1},
}

// r2ResidualCoef holds the coefficients and exponents of the residual
// part of region 2, R7-97(2012) Table 11, rows i = 1 to 43.
var r2ResidualCoef = [...]term{
	{1, 0, -0.17731742473213e-2},
	{1, 1, -0.17834862292358e-1},
	{1, 2, -0.45996013696365e-1},
	{1, 3, -0.57581259083432e-1},
	{1, 6, -0.50325278727930e-1},
	{2, 1, -0.33032641670203e-4},
	{2, 2, -0.18948987516315e-3},
	{2, 4, -0.39392777243355e-2},
	{2, 7, -0.43797295650573e-1},
	{2, 36, -0.26674547914087e-4},
	{3, 0, 0.20481737692309e-7},
	{3, 1, 0.43870667284435e-6},
	{3, 3, -0.32277677238570e-4},
	{3, 6, -0.15033924542148e-2},
	{3, 35, -0.40668253562649e-1},
	{4, 1, -0.78847309559367e-9},
	{4, 2, 0.12790717852285e-7},
	{4, 3, 0.48225372718507e-6},
	{5, 7, 0.22922076337661e-5},
	{6, 3, -0.16714766451061e-10},
	{6, 16, -0.21171472321355e-2},
	{6, 35, -0.23895741934104e2},
	{7, 0, -0.59059564324270e-17},
	{7, 11, -0.12621808899101e-5},
	{7, 25, -0.38946842435739e-1},
	{8, 8, 0.11256211360459e-10},
	{8, 36, -0.82311340897998e1},
	{9, 13, 0.19809712802088e-7},
	{10, 4, 0.10406965210174e-18},
	{10, 10, -0.10234747095929e-12},
	{10, 14, -0.10018179379511e-8},
	{16, 29, -0.80882908646985e-10},
	{16, 50, 0.10693031879409},
	{18, 57, -0.33662250574171},
	{20, 20, 0.89185845355421e-24},
	{20, 35, 0.30629316876232e-12},
	{20, 48, -0.42002467698208e-5},
	{21, 21, -0.59056029685639e-25},
	{22, 53, 0.37826947613457e-5},
	{23, 39, -0.12768608934681e-14},
	{24, 26, 0.73087610595061e-28},
	{24, 40, 0.55414715350778e-16},
	{24, 58, -0.94369707241210e-6},
}

// r2MetastableIdealCoef holds the exponents J⁰ and coefficients n⁰ of the
// ideal-gas part of the metastable-vapour equation, R7-97(2012) Eq. 19
// (section 6.2): the rows of Table 10 with n⁰₁ and n⁰₂ replaced by the values
// given there.
var r2MetastableIdealCoef = func() [len(r2IdealCoef)]term {
	t := r2IdealCoef
	t[0].n = -0.96937268393049e1
	t[1].n = 0.10087275970006e2
	return t
}()

// r2MetastableResidualCoef holds the coefficients and exponents of the
// residual part of the metastable-vapour equation, R7-97(2012) Table 16, rows
// i = 1 to 13.
var r2MetastableResidualCoef = [...]term{
	{1, 0, -0.73362260186506e-2},
	{1, 2, -0.88223831943146e-1},
	{1, 5, -0.72334555213245e-1},
	{1, 11, -0.40813178534455e-2},
	{2, 1, 0.20097803380207e-2},
	{2, 7, -0.53045921898642e-1},
	{2, 16, -0.76190409086970e-2},
	{3, 4, -0.63498037657313e-2},
	{3, 16, -0.86043093028588e-1},
	{4, 7, 0.75321581522770e-2},
	{4, 10, -0.79238375446139e-2},
	{5, 9, -0.22888160778447e-3},
	{5, 10, -0.26456501482810e-2},
}

// Region2 returns the properties of steam at pressure p in MPa and
// temperature T in K from the basic equation of region 2, the dimensionless
// Gibbs free energy of IAPWS R7-97(2012) Eq. 15: the ideal-gas part of
// Eq. 16 and Table 10 plus the residual part of Eq. 17 and Table 11, with the
// relations of Table 12.
//
// Region 2 is 0 < p ≤ ps(T) for 273.15 K ≤ T ≤ 623.15 K, 0 < p ≤ pB23(T) for
// 623.15 K < T ≤ 863.15 K and 0 < p ≤ 100 MPa for 863.15 K < T ≤ 1073.15 K,
// where ps is SatPressure and pB23 is B23Pressure. Region2 does not
// check its inputs: outside that range it extrapolates, without stated
// accuracy; p ≤ 0 makes G and S NaN or infinite and the other fields
// meaningless; a NaN input gives NaN results.
func Region2(p, T float64) Props {
	pi, tau := p/r2PStar, r2TStar/T
	d := regIdealGamma(r2IdealCoef[:], pi, tau).plus(regPolySum(r2ResidualCoef[:], pi, tau-0.5))
	return regGibbsProps(p, T, pi, tau, d)
}

// Region2Metastable returns the properties of metastable (supercooled) vapour
// at pressure p in MPa and temperature T in K from the supplementary equation
// of IAPWS R7-97(2012) Eq. 18: the ideal-gas part of Eq. 19 with the
// coefficients of Table 10, two of them replaced (section 6.2), plus the
// residual part of Eq. 20 and Table 16, with the relations of Table 12.
//
// The equation is valid for 0 < p ≤ 10 MPa from the saturated-vapour line to
// the 5 % equilibrium-moisture line, the line of h = h′ + 0.95(h″ − h′) at
// that pressure. On the saturated-vapour line it agrees with Region2 within
// the consistency of the two equations. Region2Metastable does not check its
// inputs: outside that range it extrapolates, without stated accuracy; p ≤ 0
// makes G and S NaN or infinite and the other fields meaningless; a NaN input
// gives NaN results.
func Region2Metastable(p, T float64) Props {
	pi, tau := p/r2PStar, r2TStar/T
	d := regIdealGamma(r2MetastableIdealCoef[:], pi, tau).plus(regPolySum(r2MetastableResidualCoef[:], pi, tau-0.5))
	return regGibbsProps(p, T, pi, tau, d)
}
