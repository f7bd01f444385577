package transport

import (
	"errors"
	"fmt"
	"math"
)

// Input names an input of a function of this package in errors.
type Input int

// Inputs that errors can name.
const (
	InputT        Input = iota // temperature, K
	InputRho                   // density, kg/m³
	InputP                     // pressure, MPa
	InputDrhoDp                // (∂ρ/∂p)_T at the state, kg/(m³·MPa)
	InputDrhoDpTR              // (∂ρ/∂p)_T at T_R, kg/(m³·MPa)
	InputCp                    // isobaric heat capacity, kJ/(kg·K)
	InputCv                    // isochoric heat capacity, kJ/(kg·K)
	InputKappaT                // isothermal compressibility, 1/MPa
)

var inputNames = [...]string{
	InputT:        "T",
	InputRho:      "rho",
	InputP:        "p",
	InputDrhoDp:   "(∂ρ/∂p)_T",
	InputDrhoDpTR: "(∂ρ/∂p)_T at T_R",
	InputCp:       "cp",
	InputCv:       "cv",
	InputKappaT:   "kappaT",
}

func (in Input) String() string {
	if in >= 0 && int(in) < len(inputNames) {
		return inputNames[in]
	}
	return fmt.Sprintf("Input(%d)", int(in))
}

// Sentinel kinds of the errors of this package; test with errors.Is.
var (
	// ErrNonPhysical: the input is not a finite number or has a sign no
	// state can have (T ≤ 0, ρ < 0, cv ≤ 0).
	ErrNonPhysical = errors.New("non-physical input")
	// ErrOutOfRange: the input lies outside the range where the formulation
	// is defined or may be extrapolated.
	ErrOutOfRange = errors.New("input out of range")
)

// InputError reports an input that no formulation of this package accepts.
type InputError struct {
	Func  string  // the function that rejected the input
	Input Input   // which input
	Value float64 // its value, in base units
	Err   error   // ErrNonPhysical
}

func (e *InputError) Error() string {
	return fmt.Sprintf("transport.%s: %v = %g: %v", e.Func, e.Input, e.Value, e.Err)
}

func (e *InputError) Unwrap() error { return e.Err }

// RangeError reports an input outside the interval [Min, Max] where a
// formulation is defined or may be extrapolated; no value is returned.
type RangeError struct {
	Func     string  // the function that rejected the input
	Input    Input   // which input
	Value    float64 // its value, in base units
	Min, Max float64 // the interval accepted, in base units
}

func (e *RangeError) Error() string {
	return fmt.Sprintf("transport.%s: %v = %g outside [%g, %g]", e.Func, e.Input, e.Value, e.Min, e.Max)
}

func (e *RangeError) Unwrap() error { return ErrOutOfRange }

// Property names a property of this package in warnings.
type Property int

// Properties that warnings can name.
const (
	PropertyViscosity      Property = iota // IAPWS R12-08
	PropertyConductivity                   // IAPWS R15-11
	PropertySurfaceTension                 // IAPWS R1-76(2014)
)

var propertyNames = [...]string{
	PropertyViscosity:      "viscosity",
	PropertyConductivity:   "thermal conductivity",
	PropertySurfaceTension: "surface tension",
}

func (pr Property) String() string {
	if pr >= 0 && int(pr) < len(propertyNames) {
		return propertyNames[pr]
	}
	return fmt.Sprintf("Property(%d)", int(pr))
}

// Warning marks a value computed outside the range of validity its release
// states: the value is an extrapolation of the correlation, without the
// release's stated uncertainty, and is returned anyway.
type Warning struct {
	Property Property
	P, T     float64 // the state, MPa and K (P is NaN for surface tension)
	// TMin and TMax bound the range of validity in T at pressure P, K. Both
	// are NaN when P itself is above PMax.
	TMin, TMax float64
	PMax       float64 // the highest pressure of the range of validity, MPa
}

func (w *Warning) String() string {
	if math.IsNaN(w.P) {
		return fmt.Sprintf("%v at T = %g K extrapolated: valid for %g K ≤ T ≤ %g K", w.Property, w.T, w.TMin, w.TMax)
	}
	return fmt.Sprintf("%v at p = %g MPa, T = %g K extrapolated: valid at this p for %g K ≤ T ≤ %g K, p ≤ %g MPa",
		w.Property, w.P, w.T, w.TMin, w.TMax, w.PMax)
}

// validityBand is one pressure interval (previous PMax, PMax] of a range of
// validity and the highest temperature allowed in it.
type validityBand struct{ pMax, tMax float64 }

// Range of validity of IAPWS R12-08 (section "Range of validity"): above the
// melting temperature and below these temperatures. Pressures in MPa, K.
var viscosityBands = []validityBand{
	{300, 1173.15},
	{350, 873.15},
	{500, 433.15},
	{1000, 373.15},
}

// Range of validity of IAPWS R15-11 (section "Range of validity"): above the
// melting temperature and below these temperatures. Pressures in MPa, K.
var conductivityBands = []validityBand{
	{100, 1173.15},
	{250, 874},
	{687, 573},
	{785, 403},
	{1000, 348},
}

// CheckViscosityRange returns nil if the state at pressure p in MPa and
// temperature T in K lies in the range of validity of IAPWS R12-08, and a
// *Warning otherwise. As recalled from the release, the range is
//
//	0 < p < p_t:          273.16 K ≤ T ≤ 1173.15 K
//	p_t ≤ p ≤ 300 MPa:    T_m(p) ≤ T ≤ 1173.15 K
//	300 < p ≤ 350 MPa:    T_m(p) ≤ T ≤ 873.15 K
//	350 < p ≤ 500 MPa:    T_m(p) ≤ T ≤ 433.15 K
//	500 < p ≤ 1000 MPa:   T_m(p) ≤ T ≤ 373.15 K
//
// with p_t = 611.657 Pa the triple-point pressure and T_m the melting
// temperature of ice (MeltingTemperature). The correlation is smooth beyond
// it and the release reports reasonable behaviour there (in particular up
// to IF97's 2273.15 K at low pressure), so the value is still given, marked.
func CheckViscosityRange(p, T float64) *Warning {
	return checkBands(PropertyViscosity, viscosityBands, p, T)
}

// CheckConductivityRange returns nil if the state at pressure p in MPa and
// temperature T in K lies in the range of validity of IAPWS R15-11, and a
// *Warning otherwise. As recalled from the release, the range is
//
//	0 < p < p_t:          273.16 K ≤ T ≤ 1173.15 K
//	p_t ≤ p ≤ 100 MPa:    T_m(p) ≤ T ≤ 1173.15 K
//	100 < p ≤ 250 MPa:    T_m(p) ≤ T ≤ 874 K
//	250 < p ≤ 687 MPa:    T_m(p) ≤ T ≤ 573 K
//	687 < p ≤ 785 MPa:    T_m(p) ≤ T ≤ 403 K
//	785 < p ≤ 1000 MPa:   T_m(p) ≤ T ≤ 348 K
//
// with p_t and T_m as for CheckViscosityRange.
func CheckConductivityRange(p, T float64) *Warning {
	return checkBands(PropertyConductivity, conductivityBands, p, T)
}

func checkBands(pr Property, bands []validityBand, p, T float64) *Warning {
	pMax := bands[len(bands)-1].pMax
	tMin, tMax := math.NaN(), math.NaN()
	// The warning is made only when returned: a point within range costs no
	// allocation.
	warn := func() *Warning { return &Warning{Property: pr, P: p, T: T, TMin: tMin, TMax: tMax, PMax: pMax} }
	if !(p > 0 && p <= pMax) {
		return warn()
	}
	for _, b := range bands {
		if p <= b.pMax {
			tMax = b.tMax
			break
		}
	}
	// T_m(p) ≤ 273.31 K up to 632.4 MPa: skip the melting curve where it
	// cannot matter.
	if T > 273.31 && p <= iceVIP && T <= tMax {
		return nil
	}
	tMin = MeltingTemperature(p)
	if T >= tMin && T <= tMax {
		return nil
	}
	return warn()
}

// Melting curves of IAPWS R14-08(2011), Revised Release on the Pressure along
// the Melting and Sublimation Curves of Ordinary Water Substance, Eqs. (1) to
// (4): ice Ih, III, V and VI. Pressures in MPa, temperatures in K.
const (
	iceTt   = 273.16     // Ih–vapour–liquid triple point, K
	icePt   = 611.657e-6 // and its pressure, MPa
	iceIIIT = 251.165    // Ih–III–liquid triple point, K
	iceIIIP = 208.566    // and its pressure, MPa
	iceVT   = 256.164    // III–V–liquid triple point, K
	iceVP   = 350.100    // and its pressure, MPa
	iceVIT  = 273.31     // V–VI–liquid triple point, K
	iceVIP  = 632.400    // and its pressure, MPa
	iceVIIP = 2216.0     // VI–VII–liquid triple-point pressure, MPa
	iceIIIa = 0.299948   // coefficient of Eq. (2), ice III
	iceIIIb = 60.0       // exponent of θ in Eq. (2)
	iceVa   = 1.18721    // coefficient of Eq. (3), ice V
	iceVb   = 8.0        // exponent of θ in Eq. (3)
	iceVIa  = 1.07476    // coefficient of Eq. (4), ice VI
	iceVIb  = 4.6        // exponent of θ in Eq. (4)
)

// Coefficients a_i, b_i of the ice Ih melting curve, IAPWS R14-08(2011),
// Eq. (1) and its table: p/p_t = 1 + Σ a_i (1 − θ^b_i), θ = T/T_t.
var iceIhA = [3]float64{0.119539337e7, 0.808183159e5, 0.333826860e4}
var iceIhB = [3]float64{0.300000e1, 0.257500e2, 0.103750e3}

// iceIhPressure returns the melting pressure of ice Ih in MPa at T in K,
// IAPWS R14-08(2011) Eq. (1), 251.165 K ≤ T ≤ 273.16 K.
func iceIhPressure(T float64) float64 {
	theta := T / iceTt
	s := 1.0
	for i := range iceIhA {
		s += iceIhA[i] * (1 - math.Pow(theta, iceIhB[i]))
	}
	return icePt * s
}

// MeltingTemperature returns the melting temperature of ice in K at pressure
// p in MPa, from the melting-pressure equations of IAPWS R14-08(2011) for ice
// Ih (Eq. 1, p_t ≤ p ≤ 208.566 MPa), III (Eq. 2, to 350.1 MPa), V (Eq. 3,
// to 632.4 MPa) and VI (Eq. 4, to 2216 MPa), inverted (Ih by bisection,
// the others in closed form). Below the triple-point pressure p_t =
// 611.657 Pa it returns the triple-point temperature 273.16 K, the lower
// limit the transport releases state there. Above 2216 MPa, or for NaN, it
// returns NaN.
func MeltingTemperature(p float64) float64 {
	switch {
	case p <= icePt:
		return iceTt
	case p <= iceIIIP:
		lo, hi := iceIIIT, iceTt // p decreases with T along Ih
		for range 60 {
			mid := (lo + hi) / 2
			if iceIhPressure(mid) > p {
				lo = mid
			} else {
				hi = mid
			}
		}
		return (lo + hi) / 2
	case p <= iceVP:
		return iceIIIT * math.Pow(1-(1-p/iceIIIP)/iceIIIa, 1/iceIIIb)
	case p <= iceVIP:
		return iceVT * math.Pow(1-(1-p/iceVP)/iceVa, 1/iceVb)
	case p <= iceVIIP:
		return iceVIT * math.Pow(1-(1-p/iceVIP)/iceVIa, 1/iceVIb)
	}
	return math.NaN()
}

// checkRhoT returns an *InputError unless T is finite and > 0 and rho is
// finite and ≥ 0.
func checkRhoT(fn string, rho, T float64) error {
	if !(T > 0) || math.IsInf(T, 0) {
		return &InputError{Func: fn, Input: InputT, Value: T, Err: ErrNonPhysical}
	}
	if !(rho >= 0) || math.IsInf(rho, 0) {
		return &InputError{Func: fn, Input: InputRho, Value: rho, Err: ErrNonPhysical}
	}
	return nil
}

// checkFinite returns an *InputError unless v is a finite number.
func checkFinite(fn string, in Input, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &InputError{Func: fn, Input: in, Value: v, Err: ErrNonPhysical}
	}
	return nil
}
