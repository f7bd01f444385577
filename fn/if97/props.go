package if97

// Constants of IAPWS R7-97(2012), Eqs. (1) to (4).
const (
	// R is the specific gas constant of water, kJ/(kg·K) (R7-97(2012), Eq. 1).
	R = 0.461526
	// Tc is the critical temperature, K (R7-97(2012), Eq. 2).
	Tc = 647.096
	// Pc is the critical pressure, MPa (R7-97(2012), Eq. 3).
	Pc = 22.064
	// Rhoc is the critical density, kg/m³ (R7-97(2012), Eq. 4).
	Rhoc = 322.0
	// Sc is the specific entropy at the critical point, kJ/(kg·K), which
	// splits sub-regions 3a and 3b of the backward equations (IAPWS
	// SR3-03(2014) section 3.3; SR4-04(2014) section 3.1).
	Sc = 4.41202148223476
	// Tt is the triple-point temperature, K (R7-97(2012), section 5).
	Tt = 273.16
	// Pt is the triple-point pressure, MPa: 611.657 Pa, the value adopted by
	// IAPWS (Revised Supplementary Release on Saturation Properties of
	// Ordinary Water Substance, 1992; from memory). R7-97(2012) Eq. 30 gives
	// 611.657 Pa at Tt too; its value at 273.15 K is 611.213 Pa.
	Pt = 611.657e-6
)

// Props is the full set of single-phase properties of one state, in base units.
type Props struct {
	P      float64 // pressure, MPa
	T      float64 // temperature, K
	V      float64 // specific volume, m³/kg
	Rho    float64 // density, kg/m³
	U      float64 // specific internal energy, kJ/kg
	H      float64 // specific enthalpy, kJ/kg
	S      float64 // specific entropy, kJ/(kg·K)
	G      float64 // specific Gibbs free energy, kJ/kg
	F      float64 // specific Helmholtz free energy, kJ/kg
	Cp     float64 // specific isobaric heat capacity, kJ/(kg·K)
	Cv     float64 // specific isochoric heat capacity, kJ/(kg·K)
	W      float64 // speed of sound, m/s
	Kappa  float64 // isentropic exponent -(v/p)(∂p/∂v)_s, dimensionless
	AlphaV float64 // isobaric cubic expansion coefficient, 1/K
	KappaT float64 // isothermal compressibility, 1/MPa
}
