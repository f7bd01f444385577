package fn

import "steamcell/fn/if97"

// Phase is the phase of a state in the trade's words.
type Phase int

// The phases. The exact boundaries are in the package documentation.
const (
	CompressedLiquid   Phase = iota + 1 // liquid below its boiling point at its pressure
	SaturatedLiquid                     // on the saturation line, x = 0
	SaturatedMixture                    // two phases, 0 < x < 1
	SaturatedVapour                     // on the saturation line, x = 1
	SuperheatedVapour                   // vapour above its saturation temperature
	SupercriticalFluid                  // p ≥ pc and T ≥ Tc
	MetastableVapour                    // vapour below its saturation temperature; only from FromPTMetastable
)

var phaseNames = [...]string{
	CompressedLiquid:   "compressed liquid",
	SaturatedLiquid:    "saturated liquid",
	SaturatedMixture:   "saturated mixture",
	SaturatedVapour:    "saturated vapour",
	SuperheatedVapour:  "superheated vapour",
	SupercriticalFluid: "supercritical fluid",
	MetastableVapour:   "metastable vapour",
}

// String returns the phase in words, e.g. "superheated vapour".
func (ph Phase) String() string {
	if ph < CompressedLiquid || ph > MetastableVapour {
		return "unknown"
	}
	return phaseNames[ph]
}

// singlePhase classifies a single-phase state at p (MPa) and T (K) by the
// boundaries in the package documentation. It is the one phase decision of
// the package: below Tc a state is liquid where p ≥ ps(T) of R7-97(2012)
// Eq. 30 (saturation.go), the same test by which RegionOf puts a state in
// region 1 and region3Density picks the liquid branch.
func singlePhase(p, T float64) Phase {
	switch {
	case p >= if97.Pc && T >= if97.Tc:
		return SupercriticalFluid
	case T >= if97.Tc:
		return SuperheatedVapour
	case p >= if97.Pc || p >= if97.SatPressure(T):
		return CompressedLiquid
	default:
		return SuperheatedVapour
	}
}

// twoPhase classifies a state on the saturation line with quality x.
func twoPhase(x float64) Phase {
	switch x {
	case 0:
		return SaturatedLiquid
	case 1:
		return SaturatedVapour
	}
	return SaturatedMixture
}
