package if97

import "math"

// Backward equations p(h,s) for region 3, the boundary equations in the
// (h,s) plane and Tsat(h,s) for the two-phase region, from IAPWS
// SR4-04(2014), Revised Supplementary Release on Backward Equations
// p(h,s) for Region 3, Equations as a Function of h and s for the Region
// Boundaries, and an Equation Tsat(h,s) for Region 4 of the IAPWS Industrial
// Formulation 1997 for the Thermodynamic Properties of Water and Steam.
//
// Rows are (Iᵢ, Jᵢ, nᵢ) in the order printed in the release; the polynomial
// evaluation is shared with the SR3-03 equations (termSum). Table numbers are
// as recalled from the 2014 edition of SR4-04 and may be off by a few; the
// equation number named beside each table identifies it without doubt.

// IAPWS SR4-04(2014), Table 3: coefficients and exponents of p3a(h,s), Eq. 1.
var bw3P3aHS = [33]term{
	{0, 0, 0.770889828326934e1},
	{0, 1, -0.260835009128688e2},
	{0, 5, 0.267416218930389e3},
	{1, 0, 0.172221089496844e2},
	{1, 3, -0.293542332145970e3},
	{1, 4, 0.614135601882478e3},
	{1, 8, -0.610562757725674e5},
	{1, 14, -0.651272251118219e8},
	{2, 6, 0.735919313521937e5},
	{2, 16, -0.116646505914191e11},
	{3, 0, 0.355267086434461e2},
	{3, 2, -0.596144543825955e3},
	{3, 3, -0.475842430145708e3},
	{4, 0, 0.696781965359503e2},
	{4, 1, 0.335674250377312e3},
	{4, 4, 0.250526809130882e5},
	{4, 5, 0.146997380630766e6},
	{5, 28, 0.538069315091534e20},
	{6, 28, 0.143619827291346e22},
	{7, 24, 0.364985866165994e20},
	{8, 1, -0.254741561156775e4},
	{10, 32, 0.240120197096563e28},
	{10, 36, -0.393847464679496e30},
	{14, 22, 0.147073407024852e25},
	{18, 28, -0.426391250432059e32},
	{20, 36, 0.194509340621077e39},
	{22, 16, 0.666212132114896e24},
	{22, 28, 0.706777016552858e34},
	{24, 36, 0.175563621975576e42},
	{28, 16, 0.108408607429124e29},
	{28, 36, 0.730872705175151e44},
	{32, 10, 0.159145847398870e25},
	{32, 28, 0.377121605943324e41},
}

// IAPWS SR4-04(2014), Table 4: coefficients and exponents of p3b(h,s), Eq. 2.
var bw3P3bHS = [35]term{
	{-12, 2, 0.125244360717979e-12},
	{-12, 10, -0.126599322553713e-1},
	{-12, 12, 0.506878030140626e1},
	{-12, 14, 0.317847171154202e2},
	{-12, 20, -0.391041161399932e6},
	{-10, 2, -0.975733406392044e-10},
	{-10, 10, -0.186312419488279e2},
	{-10, 14, 0.510973543414101e3},
	{-10, 18, 0.373847005822362e6},
	{-8, 2, 0.299804024666572e-7},
	{-8, 8, 0.200544393820342e2},
	{-6, 2, -0.498030487662829e-5},
	{-6, 6, -0.102301806360030e2},
	{-6, 7, 0.552819126990325e2},
	{-6, 8, -0.206211367510878e3},
	{-5, 10, -0.794012232324823e4},
	{-4, 4, 0.782248472028153e1},
	{-4, 5, -0.586544326902468e2},
	{-4, 8, 0.355073647696481e4},
	{-3, 1, -0.115303107290162e-3},
	{-3, 3, -0.175092403171802e1},
	{-3, 5, 0.257981687748160e3},
	{-3, 6, -0.727048374179467e3},
	{-2, 0, 0.121644822609198e-3},
	{-2, 1, 0.393137871762692e-1},
	{-1, 0, 0.704181005909296e-2},
	{0, 3, -0.829108200698110e2},
	{2, 0, -0.265178818131250},
	{2, 1, 0.137531682453991e2},
	{5, 0, -0.522394090753046e2},
	{6, 1, 0.240556298941048e4},
	{8, 1, -0.227361631268929e5},
	{10, 1, 0.890746343932567e5},
	{14, 3, -0.239234565822486e8},
	{14, 7, 0.568795808129714e10},
}

// IAPWS SR4-04(2014), Table 9: coefficients and exponents of h′1(s), Eq. 3.
var bw3HLiq1S = [27]term{
	{0, 14, 0.332171191705237},
	{0, 36, 0.611217706323496e-3},
	{1, 3, -0.882092478906822e1},
	{1, 16, -0.455628192543250},
	{2, 0, -0.263483840850452e-4},
	{2, 5, -0.223949661148062e2},
	{3, 4, -0.428398660164013e1},
	{3, 36, -0.616679338856916},
	{4, 4, -0.146823031104040e2},
	{4, 16, 0.284523138727299e3},
	{4, 24, -0.113398503195444e3},
	{5, 18, 0.115671380760859e4},
	{5, 24, 0.395551267359325e3},
	{7, 1, -0.154891257229285e1},
	{8, 4, 0.194486637751291e2},
	{12, 2, -0.357915139457043e1},
	{12, 4, -0.335369414148819e1},
	{14, 1, -0.664426796332460},
	{14, 22, 0.323321885383934e5},
	{16, 10, 0.331766744667084e4},
	{20, 12, -0.223501257931087e5},
	{20, 28, 0.573953875852936e7},
	{22, 8, 0.173226193407919e3},
	{24, 3, -0.363968822121321e-1},
	{28, 0, 0.834596332878346e-6},
	{32, 6, 0.503611916682674e1},
	{32, 8, 0.655444787064505e2},
}

// IAPWS SR4-04(2014), Table 10: coefficients and exponents of h′3(s), Eq. 4.
var bw3HLiq3S = [19]term{
	{0, 1, 0.822673364673336},
	{0, 4, 0.181977213534479},
	{0, 10, -0.112000260313624e-1},
	{0, 16, -0.746778287048033e-3},
	{2, 1, -0.179046263257381},
	{3, 36, 0.424220110836657e-1},
	{4, 3, -0.341355823438768},
	{4, 16, -0.209881740853565e1},
	{5, 20, -0.822477343323596e1},
	{5, 36, -0.499684082076008e1},
	{6, 4, 0.191413958471069},
	{7, 2, 0.581062241093136e-1},
	{7, 28, -0.165505498701029e4},
	{7, 32, 0.158870443421201e4},
	{10, 14, -0.850623535172818e2},
	{10, 32, -0.317714386511207e5},
	{10, 36, -0.945890406632871e5},
	{32, 0, -0.139273847088690e-5},
	{32, 6, 0.631052532240980},
}

// IAPWS SR4-04(2014), Table 16: coefficients and exponents of h″2ab(s),
// Eq. 5.
var bw3HVap2abS = [30]term{
	{1, 8, -0.524581170928788e3},
	{1, 24, -0.926947218142218e7},
	{2, 4, -0.237385107491666e3},
	{2, 32, 0.210770155812776e11},
	{4, 1, -0.239494562010986e2},
	{4, 2, 0.221802480294197e3},
	{7, 7, -0.510472533393438e7},
	{8, 5, 0.124981396109147e7},
	{8, 12, 0.200008436996201e10},
	{10, 1, -0.815158509791035e3},
	{12, 0, -0.157612685637523e3},
	{12, 7, -0.114200422332791e11},
	{18, 10, 0.662364680776872e16},
	{20, 12, -0.227622818296144e19},
	{24, 32, -0.171048081348406e32},
	{28, 8, 0.660788766938091e16},
	{28, 12, 0.166320055886021e23},
	{28, 20, -0.218003784381501e30},
	{28, 22, -0.787276140295618e30},
	{28, 24, 0.151062329700346e32},
	{32, 2, 0.795732170300541e7},
	{32, 7, 0.131957647355347e16},
	{32, 12, -0.325097068299140e24},
	{32, 14, -0.418600611419248e26},
	{32, 24, 0.297478906557467e35},
	{36, 10, -0.953588761745473e20},
	{36, 12, 0.166957699620939e25},
	{36, 20, -0.175407764869978e33},
	{36, 22, 0.347581490626396e35},
	{36, 28, -0.710971318427851e39},
}

// IAPWS SR4-04(2014), Table 17: coefficients and exponents of h″2c3b(s),
// Eq. 6.
var bw3HVap2c3bS = [16]term{
	{0, 0, 0.104351280732769e1},
	{0, 3, -0.227807912708513e1},
	{0, 4, 0.180535256723202e1},
	{1, 0, 0.420440834792042},
	{1, 12, -0.105721244834660e6},
	{5, 36, 0.436911607493884e25},
	{6, 12, -0.328032702839753e12},
	{7, 16, -0.678686760804270e16},
	{8, 2, 0.743957464645363e4},
	{8, 20, -0.356896445355761e20},
	{12, 32, 0.167590585186801e32},
	{16, 36, -0.355028625419105e38},
	{22, 2, 0.396611982166538e12},
	{22, 32, -0.414716268484468e41},
	{24, 7, 0.359080103867382e19},
	{36, 20, -0.116994334851995e41},
}

// IAPWS SR4-04(2014), Table 23: coefficients and exponents of hB13(s), Eq. 7.
var bw3HB13S = [6]term{
	{0, 0, 0.913965547600543},
	{1, -2, -0.430944856041991e-4},
	{1, 2, 0.603235694765419e2},
	{3, -12, 0.117518273082168e-17},
	{5, -4, 0.220000904781292},
	{6, -3, -0.690815545851641e2},
}

// IAPWS SR4-04(2014), Table 25: coefficients and exponents of TB23(h,s),
// Eq. 8.
var bw3TB23HS = [25]term{
	{-12, 10, 0.629096260829810e-3},
	{-10, 8, -0.823453502583165e-3},
	{-8, 3, 0.515446951519474e-7},
	{-4, 4, -0.117565945784945e1},
	{-3, 3, 0.348519684726192e1},
	{-2, -6, -0.507837382408313e-11},
	{-2, 2, -0.284637670005479e1},
	{-2, 3, -0.236092263939673e1},
	{-2, 4, 0.601492324973779e1},
	{0, 0, 0.148039650824546e1},
	{1, -3, 0.360075182221907e-3},
	{1, -2, -0.126700045009952e-1},
	{1, 10, -0.122184332521413e7},
	{3, -2, 0.149276502463272},
	{3, -1, 0.698733471798484},
	{5, -5, -0.252207040114321e-1},
	{6, -6, 0.147151930985213e-1},
	{6, -3, -0.108618917681849e1},
	{8, -8, -0.936875039816322e-3},
	{8, -2, 0.819877897570217e2},
	{8, -1, -0.182041861521835e3},
	{12, -12, 0.261907376402688e-5},
	{12, -1, -0.291626417025961e5},
	{14, -12, 0.140660774926165e-4},
	{14, 1, 0.783237062349385e7},
}

// IAPWS SR4-04(2014), Table 28: coefficients and exponents of Tsat(h,s),
// Eq. 9.
var bw3TsatHS = [36]term{
	{0, 0, 0.179882673606601},
	{0, 3, -0.267507455199603},
	{0, 12, 0.116276722612600e1},
	{1, 0, 0.147545428713616},
	{1, 1, -0.512871635973248},
	{1, 2, 0.421333567697984},
	{1, 5, 0.563749522189870},
	{2, 0, 0.429274443819153},
	{2, 5, -0.335704552142140e1},
	{2, 8, 0.108890916499278e2},
	{3, 0, -0.248483390456012},
	{3, 2, 0.304153221906390},
	{3, 3, -0.494819763939905},
	{3, 4, 0.107551674933261e1},
	{4, 0, 0.733888415457688e-1},
	{4, 1, 0.140170545411085e-1},
	{5, 1, -0.106110975998808},
	{5, 2, 0.168324361811875e-1},
	{5, 4, 0.125028363714877e1},
	{5, 16, 0.101316840309509e4},
	{6, 6, -0.151791558000712e1},
	{6, 8, 0.524277865990866e2},
	{6, 22, 0.230495545563912e5},
	{8, 1, 0.249459806365456e-1},
	{10, 20, 0.210796467412137e7},
	{10, 36, 0.366836848613065e9},
	{12, 24, -0.144814105365163e9},
	{14, 1, -0.179276373003590e-2},
	{14, 28, 0.489955602100459e10},
	{16, 12, 0.471262212070518e3},
	{16, 32, -0.829294390198652e11},
	{18, 14, -0.171545662263191e4},
	{18, 22, 0.355777682973575e7},
	{18, 36, 0.586062760258436e12},
	{20, 24, -0.129887635078195e8},
	{28, 36, 0.317247449371057e11},
}

// bw3P3aHSRaw is Eq. 1 of SR4-04(2014): π = p/99 MPa as a function of
// η = h/2300 kJ/kg and σ = s/4.4 kJ/(kg·K).
func bw3P3aHSRaw(eta, sigma float64) float64 {
	return termSum(bw3P3aHS[:], eta-1.01, sigma-0.750)
}

// bw3P3bHSRaw is Eq. 2 of SR4-04(2014): π = p/16.6 MPa as a function of
// η = h/2800 kJ/kg and σ = s/5.3 kJ/(kg·K), π = 1/Σ nᵢ (η−0.681)^Iᵢ (σ−0.792)^Jᵢ.
func bw3P3bHSRaw(eta, sigma float64) float64 {
	return 1 / termSum(bw3P3bHS[:], eta-0.681, sigma-0.792)
}

// Region3PFromHS returns the pressure p, MPa, of a region-3 state from
// specific enthalpy h in kJ/kg and specific entropy s in kJ/(kg·K).
//
// Valid in region 3 of IAPWS-IF97 (16.529 MPa ≤ p ≤ 100 MPa,
// 623.15 K ≤ T ≤ T_B23(p), single phase); states with
// s ≤ sc = 4.41202148223476 kJ/(kg·K) use subregion 3a, the others 3b. No
// range check. Consistent with the basic equation f(ρ,T) within
// |Δp/p| ≤ 0.01 %. With p known, T and v follow from Region3TFromPS and
// Region3VFromPS.
//
// Source: IAPWS SR4-04(2014), Eq. 1 (3a, Table 3) and Eq. 2 (3b, Table 4).
func Region3PFromHS(h, s float64) float64 {
	if s <= Sc {
		// Eq. 1, subregion 3a.
		return 99 * bw3P3aHSRaw(h/2300, s/4.4)
	}
	// Eq. 2, subregion 3b.
	return 16.6 * bw3P3bHSRaw(h/2800, s/5.3)
}

// SatLiquidEnthalpy1FromS returns h′1(s), kJ/kg, the enthalpy of the
// saturated liquid as a function of its specific entropy s in kJ/(kg·K), on
// the part of the saturated-liquid line bordering region 1.
//
// Valid for s′(273.15 K) = −1.545495919e−4 kJ/(kg·K) ≤ s ≤
// s′(623.15 K) = 3.778281340 kJ/(kg·K). No range check.
//
// Source: IAPWS SR4-04(2014), Eq. 3, Table 9:
// η = h′1/1700 kJ/kg = Σ nᵢ (σ − 1.09)^Iᵢ (σ + 0.366e−4)^Jᵢ,
// σ = s/3.8 kJ/(kg·K).
func SatLiquidEnthalpy1FromS(s float64) float64 {
	sigma := s / 3.8
	return 1700 * termSum(bw3HLiq1S[:], sigma-1.09, sigma+0.366e-4)
}

// SatLiquidEnthalpy3FromS returns h′3(s), kJ/kg, the enthalpy of the
// saturated liquid as a function of its specific entropy s in kJ/(kg·K), on
// the part of the saturated-liquid line bordering region 3.
//
// Valid for s′(623.15 K) = 3.778281340 kJ/(kg·K) ≤ s ≤
// sc = 4.41202148223476 kJ/(kg·K). No range check.
//
// Source: IAPWS SR4-04(2014), Eq. 4, Table 10:
// η = h′3/1700 kJ/kg = Σ nᵢ (σ − 1.09)^Iᵢ (σ + 0.366e−4)^Jᵢ,
// σ = s/3.8 kJ/(kg·K).
func SatLiquidEnthalpy3FromS(s float64) float64 {
	sigma := s / 3.8
	return 1700 * termSum(bw3HLiq3S[:], sigma-1.09, sigma+0.366e-4)
}

// SatVapourEnthalpy2ab4FromS returns h″2ab(s), kJ/kg, the enthalpy of the
// saturated vapour as a function of its specific entropy s in kJ/(kg·K), on
// the part of the saturated-vapour line bordering subregions 2a and 2b.
//
// Valid for s″2bc = 5.85 kJ/(kg·K) ≤ s ≤ s″(273.15 K) =
// 9.155759395 kJ/(kg·K). No range check.
//
// Source: IAPWS SR4-04(2014), Eq. 5, Table 16:
// η = h″/2800 kJ/kg = exp(Σ nᵢ (1/σ₁ − 0.513)^Iᵢ (σ₂ − 0.524)^Jᵢ),
// σ₁ = s/5.21 kJ/(kg·K), σ₂ = s/9.2 kJ/(kg·K).
func SatVapourEnthalpy2ab4FromS(s float64) float64 {
	sigma1 := s / 5.21
	sigma2 := s / 9.2
	return 2800 * math.Exp(termSum(bw3HVap2abS[:], 1/sigma1-0.513, sigma2-0.524))
}

// SatVapourEnthalpy2c3bFromS returns h″2c3b(s), kJ/kg, the enthalpy of the
// saturated vapour as a function of its specific entropy s in kJ/(kg·K), on
// the part of the saturated-vapour line bordering subregions 2c and 3b.
//
// Valid for sc = 4.41202148223476 kJ/(kg·K) ≤ s ≤ s″2bc = 5.85 kJ/(kg·K).
// No range check.
//
// Source: IAPWS SR4-04(2014), Eq. 6, Table 17:
// η = h″/2800 kJ/kg = (Σ nᵢ (σ − 1.02)^Iᵢ (σ − 0.726)^Jᵢ)⁴,
// σ = s/5.9 kJ/(kg·K).
func SatVapourEnthalpy2c3bFromS(s float64) float64 {
	sigma := s / 5.9
	sum := termSum(bw3HVap2c3bS[:], sigma-1.02, sigma-0.726)
	sum *= sum
	return 2800 * sum * sum
}

// B13Enthalpy returns hB13(s), kJ/kg, the enthalpy on the boundary between
// regions 1 and 3 (the isotherm T = 623.15 K) as a function of specific
// entropy s in kJ/(kg·K).
//
// Valid for s(100 MPa, 623.15 K) = 3.397782955 kJ/(kg·K) ≤ s ≤
// s′(623.15 K) = 3.778281340 kJ/(kg·K). No range check.
//
// Source: IAPWS SR4-04(2014), Eq. 7, Table 23:
// η = hB13/1700 kJ/kg = Σ nᵢ (σ − 0.884)^Iᵢ (σ − 0.864)^Jᵢ,
// σ = s/3.8 kJ/(kg·K).
func B13Enthalpy(s float64) float64 {
	sigma := s / 3.8
	return 1700 * termSum(bw3HB13S[:], sigma-0.884, sigma-0.864)
}

// B23TFromHS returns TB23(h,s), K, the temperature on the boundary between
// regions 2 and 3 (the B23 line of IAPWS-IF97) as a function of specific
// enthalpy h in kJ/kg and specific entropy s in kJ/(kg·K). Comparing it with
// the temperature from the region-2 or region-3 backward equations decides
// on which side of B23 a given (h,s) lies.
//
// Valid for 2.563592004e3 kJ/kg ≤ h ≤ 2.812942061e3 kJ/kg and
// 5.048096828 kJ/(kg·K) ≤ s ≤ 5.260578707 kJ/(kg·K), near the B23 line.
// No range check.
//
// Source: IAPWS SR4-04(2014), Eq. 8, Table 25:
// θ = T/900 K = Σ nᵢ (η − 0.727)^Iᵢ (σ − 0.864)^Jᵢ,
// η = h/3000 kJ/kg, σ = s/5.3 kJ/(kg·K).
func B23TFromHS(h, s float64) float64 {
	return 900 * termSum(bw3TB23HS[:], h/3000-0.727, s/5.3-0.864)
}

// SatTFromHS returns Tsat(h,s), K, the saturation temperature of a
// two-phase (wet steam) state given its specific enthalpy h in kJ/kg and
// specific entropy s in kJ/(kg·K). With T known, the pressure is
// SatPressure(T) and the quality follows from h or s.
//
// Valid in the two-phase region for s ≥ s″(623.15 K) =
// 5.210887825 kJ/(kg·K) up to s″(273.15 K) = 9.155759395 kJ/(kg·K), i.e.
// 273.15 K ≤ Tsat ≤ 623.15 K; h must lie between the saturated-liquid and
// saturated-vapour lines. No range check. Consistent with IAPWS-IF97 within
// |ΔT| ≤ 25 mK.
//
// Source: IAPWS SR4-04(2014), Eq. 9, Table 28:
// θ = T/550 K = Σ nᵢ (η − 0.119)^Iᵢ (σ − 1.07)^Jᵢ,
// η = h/2800 kJ/kg, σ = s/9.2 kJ/(kg·K).
func SatTFromHS(h, s float64) float64 {
	return 550 * termSum(bw3TsatHS[:], h/2800-0.119, s/9.2-1.07)
}
