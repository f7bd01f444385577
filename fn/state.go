package fn

import (
	"math"

	"steamcell/fn/if97"
)

// Limits of the range of validity of IAPWS-IF97, R7-97(2012) section 4.
const (
	TMin      = 273.15  // K, lowest temperature of regions 1 and 2
	TMax      = 1073.15 // K, highest temperature of regions 1 to 3; start of region 5
	TMaxHigh  = 2273.15 // K, highest temperature of region 5
	PMax      = 100.0   // MPa, highest pressure of regions 1 to 3
	PMaxHigh  = 50.0    // MPa, highest pressure of region 5
	T13       = 623.15  // K, boundary between regions 1 and 3
	nearSatK  = 0.5     // K, single-phase states closer than this to saturation get a warning
	nearCritK = 2.0     // K, states this close to Tc (and near pc) get a warning
	nearCritP = 1.0     // MPa
)

// State is a state of water or steam: every property of IF97 in base units,
// with the phase, the region and, on the saturation line, the quality and the
// saturated-liquid and saturated-vapour properties.
//
// For a saturated mixture (0 < x < 1) the embedded Props hold the mixture's
// p, T, v, ρ, u, h, s, g and f; Cp, Cv, W, Kappa, AlphaV and KappaT have no
// meaning for a mixture and are zero (see Defined). For saturated liquid or
// vapour (x = 0 or 1) every property is that of the saturated phase.
type State struct {
	if97.Props
	Phase  Phase
	Region int     // IF97 region: 1, 2, 3, 5, or 4 on the saturation line
	X      float64 // quality, vapour mass fraction; meaningful when HasX
	HasX   bool    // the state lies on the saturation line

	// Liquid and Vapour are the saturated-liquid and saturated-vapour states
	// at the state's saturation temperature; set when HasX.
	Liquid, Vapour if97.Props

	// Warnings are short sentences for the user: nearness to saturation or
	// to the critical point, a choice between two solutions. Their numbers
	// are Figures, for the caller to render in the user's units.
	Warnings []Note
}

// Defined reports whether the single-phase derivative properties (Cp, Cv,
// W, Kappa, AlphaV, KappaT) are defined for s: false only for a saturated
// mixture.
func (s *State) Defined() bool { return s.Phase != SaturatedMixture }

// checkPT checks (p, T) against the range of validity and returns the region
// of a single-phase state there (1, 2, 3 or 5). The errors name p or T.
func checkPT(p, T float64) (int, error) {
	switch {
	case p <= 0:
		return 0, outOfRange(Pressure, p, 0, "p must be above {0} (absolute)", fig(Pressure, 0))
	case T < TMin:
		return 0, outOfRange(Temperature, T, TMin, "T below {0}", fig(Temperature, TMin))
	case T > TMaxHigh:
		return 0, outOfRange(Temperature, T, TMaxHigh, "T above {0}", fig(Temperature, TMaxHigh))
	case p > PMax:
		return 0, outOfRange(Pressure, p, PMax, "p above {0}", fig(Pressure, PMax))
	case T > TMax && p > PMaxHigh:
		return 0, outOfRange(Pressure, p, PMaxHigh, "p above {0} at T above {1}", fig(Pressure, PMaxHigh), fig(Temperature, TMax))
	}
	return if97.RegionOf(p, T), nil
}

// FromPT returns the state at pressure p (MPa) and temperature T (K).
//
// On the saturation line (T ≤ Tc and p = ps(T)) p and T do not fix the state:
// FromPT refuses it with ErrOnSaturation. IF97 region 3 is solved for ρ from
// (p, T) with the backward equations of SR5-05(2016), polished with Newton
// steps on the forward equation.
func FromPT(p, T float64) (State, error) {
	if err := checkFinite(Input{Pressure, p}, Input{Temperature, T}); err != nil {
		return State{}, err
	}
	r, err := checkPT(p, T)
	if err != nil {
		return State{}, err
	}
	if T <= if97.Tc && p == if97.SatPressure(T) {
		return State{}, &InputError{Input: "p,t", Pair: true, Kind: ErrOnSaturation,
			Detail: note("at T = {0} the saturation pressure is {1}; give x, h or s as the second input", fig(Temperature, T), fig(Pressure, p))}
	}
	pr, err := evalPT(r, p, T)
	if err != nil {
		return State{}, err
	}
	return singleState(r, pr), nil
}

// evalPT computes the properties of a single-phase state in region r.
func evalPT(r int, p, T float64) (if97.Props, error) {
	switch r {
	case 1:
		return if97.Region1(p, T), nil
	case 2:
		return if97.Region2(p, T), nil
	case 5:
		return if97.Region5(p, T), nil
	}
	pr, ok := region3PT(p, T)
	if !ok {
		return if97.Props{}, solverFailed("region-3 density at (p, T)")
	}
	pr.P = p // equal to rounding after the Newton polish; keep the input exactly
	return pr, nil
}

// singleState wraps the properties of a single-phase state with its phase,
// region and warnings. The phase is that of the region's equation where
// the region decides it (region 1 is liquid, regions 2 and 5 vapour or
// supercritical fluid), so that a state within rounding of the saturation
// line keeps the phase of the equation it was solved on; region 3 takes
// singlePhase, which matches its branch (stable3).
func singleState(r int, pr if97.Props) State {
	ph := singlePhase(pr.P, pr.T)
	switch {
	case r == 1:
		ph = CompressedLiquid
	case (r == 2 || r == 5) && ph == CompressedLiquid:
		ph = SuperheatedVapour
	}
	s := State{Props: pr, Region: r, Phase: ph}
	s.Warnings = warnings(&s)
	return s
}

// warnings returns the cautions that apply to s.
func warnings(s *State) []Note {
	var w []Note
	if !s.HasX && s.P < if97.Pc {
		ts := if97.SatTemperature(s.P)
		if d := math.Abs(s.T - ts); d < nearSatK {
			w = append(w, note("within {0} of saturation (Ts = {1} at this pressure): a small error in p or T puts the point in the other phase",
				Figure{Q: Temperature, V: nearSatK, Diff: true}, fig(Temperature, ts)))
		}
	}
	if math.Abs(s.T-if97.Tc) < nearCritK && math.Abs(s.P-if97.Pc) < nearCritP {
		w = append(w, note("near the critical point, where IF97 is least accurate and properties change steeply"))
	}
	return w
}

// FromPTMetastable returns supercooled (metastable) vapour at p (MPa) and T
// (K) from the metastable-vapour equation of IAPWS R7-97(2012) section 6.2
// (Eq. 18, Table 16): vapour that has expanded below its saturation
// temperature without condensing, as in a fast expansion through a nozzle
// or turbine stage. The release gives the equation for 0 < p ≤ 10 MPa from
// the saturated-vapour line down to the 5 % equilibrium-moisture line; the
// latter has no closed form, so FromPTMetastable accepts T from 273.15 K up
// to Ts(p) at p ≤ 10 MPa and warns that the equation is valid only down to
// about 5 % equilibrium moisture.
func FromPTMetastable(p, T float64) (State, error) {
	if err := checkFinite(Input{Pressure, p}, Input{Temperature, T}); err != nil {
		return State{}, err
	}
	switch {
	case p <= 0:
		return State{}, outOfRange(Pressure, p, 0, "p must be above {0} (absolute)", fig(Pressure, 0))
	case p > 10:
		return State{}, outOfRange(Pressure, p, 10, "the metastable-vapour equation holds up to {0}", fig(Pressure, 10))
	case T < TMin:
		return State{}, outOfRange(Temperature, T, TMin, "T below {0}", fig(Temperature, TMin))
	}
	if p >= PMinSat {
		if ts := if97.SatTemperature(p); T > ts {
			return State{}, outOfRange(Temperature, T, ts, "T above the saturation temperature {0}: the vapour is not metastable; use FromPT", fig(Temperature, ts))
		}
	} else {
		return State{}, outOfRange(Pressure, p, PMinSat, "below {0} no vapour is metastable above {1}", fig(Pressure, PMinSat), fig(Temperature, TMin))
	}
	s := State{Props: if97.Region2Metastable(p, T), Region: 2, Phase: MetastableVapour}
	s.Warnings = []Note{note("metastable (supercooled) vapour from the IF97 metastable-vapour equation, valid down to about 5 % equilibrium moisture")}
	return s, nil
}
