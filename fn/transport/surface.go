package transport

import "math"

// Constants of IAPWS R1-76(2014), Revised Release on Surface Tension of
// Ordinary Water Substance, Eq. (1).
const (
	surfaceB  = 235.8e-3 // B, N/m
	surfaceb  = -0.625   // b
	surfaceMu = 1.256    // exponent μ
	surfaceTc = 647.096  // critical temperature T_c, K
	// surfaceTMin is the lowest temperature the release allows the
	// equation to be extrapolated to (supercooled liquid), K.
	surfaceTMin = 248.15
	// surfaceTValid is the low end of the range of validity (the triple
	// point), K.
	surfaceTValid = 273.16
)

// SurfaceTension returns the surface tension of water against its vapour in
// N/m at temperature T in K, IAPWS R1-76(2014) Eq. (1):
//
//	σ = B τ^μ (1 + b τ),  τ = 1 − T/T_c,
//
// with B = 235.8 mN/m, b = −0.625, μ = 1.256, T_c = 647.096 K. The range of
// validity is 273.16 K ≤ T ≤ T_c, where σ(T_c) = 0; the release states that
// the equation extrapolates reasonably into the supercooled liquid down to
// 248.15 K, where CheckSurfaceTensionRange returns a warning. Outside
// [248.15 K, T_c] it returns NaN and a *RangeError; for NaN an *InputError.
func SurfaceTension(T float64) (float64, error) {
	if math.IsNaN(T) {
		return math.NaN(), &InputError{Func: "SurfaceTension", Input: InputT, Value: T, Err: ErrNonPhysical}
	}
	if T < surfaceTMin || T > surfaceTc {
		return math.NaN(), &RangeError{Func: "SurfaceTension", Input: InputT, Value: T, Min: surfaceTMin, Max: surfaceTc}
	}
	tau := 1 - T/surfaceTc
	return surfaceB * math.Pow(tau, surfaceMu) * (1 + surfaceb*tau), nil
}

// CheckSurfaceTensionRange returns nil if T in K lies in the range of
// validity of IAPWS R1-76(2014), 273.16 K ≤ T ≤ 647.096 K, and a *Warning
// otherwise (in the supercooled band 248.15 K ≤ T < 273.16 K SurfaceTension
// still returns a value; elsewhere it returns an error).
func CheckSurfaceTensionRange(T float64) *Warning {
	if T >= surfaceTValid && T <= surfaceTc {
		return nil
	}
	return &Warning{Property: PropertySurfaceTension, P: math.NaN(), T: T,
		TMin: surfaceTValid, TMax: surfaceTc, PMax: math.NaN()}
}
