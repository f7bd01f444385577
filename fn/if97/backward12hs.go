package if97

// Coefficients of the backward equation p(h,s) for region 1.
// IAPWS SR2-01(2014), Table 2 (Eq. 1).
var bw12Region1PHS = [19]term{
	{0, 0, -0.691997014660582},
	{0, 1, -0.183612548787560e2},
	{0, 2, -0.928332409297335e1},
	{0, 4, 0.659639569909906e2},
	{0, 5, -0.162060388912024e2},
	{0, 6, 0.450620017338667e3},
	{0, 8, 0.854680678224170e3},
	{0, 14, 0.607523214001162e4},
	{1, 0, 0.326487682621856e2},
	{1, 1, -0.269408844582931e2},
	{1, 4, -0.319947848334300e3},
	{1, 6, -0.928354307043320e3},
	{2, 0, 0.303634537455249e2},
	{2, 1, -0.650540422444146e2},
	{2, 10, -0.430991316516130e4},
	{3, 4, -0.747512324096068e3},
	{4, 1, 0.730000345529245e3},
	{4, 4, 0.114284032569021e4},
	{5, 0, -0.436407041874559e3},
}

// Coefficients of the boundary equation h2ab(s) between sub-regions 2a and
// 2b of the backward equations p(h,s). IAPWS SR2-01(2014), Table 5 (Eq. 2).
var bw12B2ab = [4]float64{
	-0.349898083432139e4,
	0.257560716905876e4,
	-0.421073558227969e3,
	0.276349063799944e2,
}

// Coefficients of the backward equation p(h,s) for sub-region 2a.
// IAPWS SR2-01(2014), Table 6 (Eq. 3).
var bw12Region2aPHS = [29]term{
	{0, 1, -0.182575361923032e-1},
	{0, 3, -0.125229548799536},
	{0, 6, 0.592290437320145},
	{0, 16, 0.604769706185122e1},
	{0, 20, 0.238624965444474e3},
	{0, 22, -0.298639090222922e3},
	{1, 0, 0.512250813040750e-1},
	{1, 1, -0.437266515606486},
	{1, 2, 0.413336902999504},
	{1, 3, -0.516468254574773e1},
	{1, 5, -0.557014838445711e1},
	{1, 6, 0.128555037824478e2},
	{1, 10, 0.114144108953290e2},
	{1, 16, -0.119504225652714e3},
	{1, 20, -0.284777985961560e4},
	{1, 22, 0.431757846408006e4},
	{2, 3, 0.112894040802650e1},
	{2, 16, 0.197409186206319e4},
	{2, 20, 0.151612444706087e4},
	{3, 0, 0.141324451421235e-1},
	{3, 2, 0.585501282219601},
	{3, 3, -0.297258075863012e1},
	{3, 6, 0.594567314847319e1},
	{3, 16, -0.623656565798905e4},
	{4, 16, 0.965986235133332e4},
	{5, 3, 0.681500934948134e1},
	{5, 16, -0.633207286824489e4},
	{6, 3, -0.558919224465760e1},
	{7, 1, 0.400645798472063e-1},
}

// Coefficients of the backward equation p(h,s) for sub-region 2b.
// IAPWS SR2-01(2014), Table 7 (Eq. 4).
var bw12Region2bPHS = [33]term{
	{0, 0, 0.801496989929495e-1},
	{0, 1, -0.543862807146111},
	{0, 2, 0.337455597421283},
	{0, 4, 0.890555451157450e1},
	{0, 8, 0.313840736431485e3},
	{1, 0, 0.797367065977789},
	{1, 1, -0.121616973556240e1},
	{1, 2, 0.872803386937477e1},
	{1, 3, -0.169769781757602e2},
	{1, 5, -0.186552827328416e3},
	{1, 12, 0.951159274344237e5},
	{2, 1, -0.189168510120494e2},
	{2, 6, -0.433407037194840e4},
	{2, 18, 0.543212633012715e9},
	{3, 0, 0.144793408386013},
	{3, 1, 0.128024559637516e3},
	{3, 7, -0.672309534071268e5},
	{3, 12, 0.336972380095287e8},
	{4, 1, -0.586634196762720e3},
	{4, 16, -0.221403224769889e11},
	{5, 1, 0.171606668708389e4},
	{5, 12, -0.570817595806302e9},
	{6, 1, -0.312109693178482e4},
	{6, 8, -0.207841384633010e7},
	{6, 18, 0.305605946157786e13},
	{7, 1, 0.322157004314333e4},
	{7, 16, 0.326810259797295e12},
	{8, 1, -0.144104158934487e4},
	{8, 3, 0.410694867802691e3},
	{8, 14, 0.109077066873024e12},
	{8, 18, -0.247964654258893e14},
	{12, 10, 0.188801906865134e10},
	{14, 16, -0.123651009018773e15},
}

// Coefficients of the backward equation p(h,s) for sub-region 2c.
// IAPWS SR2-01(2014), Table 8 (Eq. 5).
var bw12Region2cPHS = [31]term{
	{0, 0, 0.112225607199012},
	{0, 1, -0.339005953606712e1},
	{0, 2, -0.320503911730094e2},
	{0, 3, -0.197597305104900e3},
	{0, 4, -0.407693861553446e3},
	{0, 8, 0.132943775222331e5},
	{1, 0, 0.170846839774007e1},
	{1, 2, 0.373694198142245e2},
	{1, 5, 0.358144365815434e4},
	{1, 8, 0.423014446424664e6},
	{1, 14, -0.751071025760063e9},
	{2, 2, 0.523446127607898e2},
	{2, 3, -0.228351290812417e3},
	{2, 7, -0.960652417056937e6},
	{2, 10, -0.807059292526074e8},
	{2, 18, 0.162698017225669e13},
	{3, 0, 0.772465073604171},
	{3, 5, 0.463929973837746e5},
	{3, 8, -0.137317885134128e8},
	{3, 16, 0.170470392630512e13},
	{3, 18, -0.251104628187308e14},
	{4, 18, 0.317748830835520e14},
	{5, 1, 0.538685623675312e2},
	{5, 4, -0.553089094625169e5},
	{5, 6, -0.102861522421405e7},
	{5, 14, 0.204249418756234e13},
	{6, 8, 0.273918446626977e9},
	{6, 18, -0.263963146312685e16},
	{10, 7, -0.107890854108088e10},
	{12, 7, -0.296492620980124e11},
	{16, 10, -0.111754907323424e16},
}

// Region1PFromHS returns the pressure, MPa, of compressed water from the
// specific enthalpy h, kJ/kg, and the specific entropy s, kJ/(kg·K):
//
//	pi(eta, sigma) = Σ n_i (eta + 0.05)^I_i (sigma + 0.05)^J_i,
//
// with pi = p/(100 MPa), eta = h/(3400 kJ/kg), sigma = s/(7.6 kJ/(kg·K)).
// Valid in region 1 (273.15 K ≤ T ≤ 623.15 K, psat(T) ≤ p ≤ 100 MPa), where
// it agrees with the basic equation Region1 within 15 kPa for p ≤ 2.5 MPa and
// within 0.6 % above: the pressure of a liquid hardly moves h and s, so it is
// poorly fixed by them. Inputs outside region 1 are evaluated without check
// and give meaningless values.
// Source: IAPWS SR2-01(2014), Eq. 1, Table 2.
func Region1PFromHS(h, s float64) float64 {
	eta, sigma := h/3400, s/7.6
	return 100 * termSum(bw12Region1PHS[:], eta+0.05, sigma+0.05)
}

// B2abEnthalpy returns the specific enthalpy, kJ/kg, on the boundary between
// sub-regions 2a and 2b of the backward equations p(h,s) at the specific
// entropy s, kJ/(kg·K):
//
//	eta(sigma) = n1 + n2 sigma + n3 sigma² + n4 sigma³,
//
// with eta = h/(1 kJ/kg), sigma = s/(1 kJ/(kg·K)). The line approximates the
// 4 MPa isobar of region 2, for 6.070 kJ/(kg·K) ≤ s ≤ 7.852 kJ/(kg·K) (from
// saturated vapour to 1073.15 K); states with h ≤ B2abEnthalpy(s) belong to
// 2a. Source: IAPWS SR2-01(2014), Eq. 2, Table 5.
func B2abEnthalpy(s float64) float64 {
	sigma := s / 1
	n := &bw12B2ab
	return n[0] + sigma*(n[1]+sigma*(n[2]+sigma*n[3]))
}

// Region2PFromHS returns the pressure, MPa, of steam in region 2 from the
// specific enthalpy h, kJ/kg, and the specific entropy s, kJ/(kg·K). It picks
// the sub-region as IAPWS SR2-01(2014) does:
//
//	2a (h ≤ B2abEnthalpy(s)):           pi = [Σ n_i (eta - 0.5)^I_i (sigma - 1.2)^J_i]^4,
//	                                    pi = p/4 MPa, eta = h/4200 kJ/kg, sigma = s/12 kJ/(kg·K),
//	                                    Eq. 3, Table 6;
//	2b (h > B2abEnthalpy(s), s ≥ 5.85): pi = [Σ n_i (eta - 0.6)^I_i (sigma - 1.01)^J_i]^4,
//	                                    pi = p/100 MPa, eta = h/4100 kJ/kg, sigma = s/7.9 kJ/(kg·K),
//	                                    Eq. 4, Table 7;
//	2c (h > B2abEnthalpy(s), s < 5.85): pi = [Σ n_i (eta - 0.7)^I_i (sigma - 1.1)^J_i]^4,
//	                                    pi = p/100 MPa, eta = h/3500 kJ/kg, sigma = s/5.9 kJ/(kg·K),
//	                                    Eq. 5, Table 8.
//
// Valid in region 2 (saturated vapour up to 1073.15 K, 0 < p ≤ 100 MPa, without
// the metastable part), where 2a agrees with the basic equation Region2
// within |Δp/p| = 0.0035 %, 2b within 0.0019 % and 2c within 0.0088 %.
// Inputs outside region 2 are evaluated without check and give meaningless
// values.
func Region2PFromHS(h, s float64) float64 {
	switch {
	case h <= B2abEnthalpy(s): // Eq. 3
		pi := termSum(bw12Region2aPHS[:], h/4200-0.5, s/12-1.2)
		return 4 * bw12Sq(bw12Sq(pi))
	case s >= bw12Region2bcEntropy: // Eq. 4
		pi := termSum(bw12Region2bPHS[:], h/4100-0.6, s/7.9-1.01)
		return 100 * bw12Sq(bw12Sq(pi))
	default: // Eq. 5
		pi := termSum(bw12Region2cPHS[:], h/3500-0.7, s/5.9-1.1)
		return 100 * bw12Sq(bw12Sq(pi))
	}
}

// bw12Sq returns x².
func bw12Sq(x float64) float64 { return x * x }
