package fn

import (
	"math"
	"sync"

	"steamcell/fn/if97"
)

// accept is the one acceptance test of every solve: pr, solved on region
// r's equation, is an answer if it lies in region r (by RegionOf, or
// within rounding of its edge, see onBoundary) and, in region 3, is a
// stable single phase (stable3). In regions 1 and 2 below 623.15 K the
// region test is the side of the saturation line too: RegionOf puts
// p ≥ ps(T) in region 1 and p < ps(T) in region 2.
func accept(r int, pr *if97.Props) bool {
	if if97.RegionOf(pr.P, pr.T) != r {
		if !onBoundary(r, pr.P, pr.T) {
			return false
		}
		// onBoundary may not carry a state across the saturation line:
		// that would give region 1's liquid at a vapour's (p, T) or the
		// reverse. (A state RegionOf puts in region r is on r's side
		// already; testing it again cost a saturation pressure a solve.)
		if pr.T <= T13 && (r == 1 || r == 2) && (pr.P >= if97.SatPressure(pr.T)) != (r == 1) {
			return false
		}
	}
	if r == 3 {
		return stable3(pr)
	}
	return true
}

// satBand is the relative distance from ps(T) within which a
// single-phase answer is compared with the saturated phases at its
// temperature (onSatPhase). A pair that pins p loosely (v of cold liquid
// moves p by 3e-9 of ps at 1e-15 in v) lands that far from the line.
const satBand = 1e-6

// onSatPhase returns the saturated phase (x = 0 or 1) that a single-phase
// answer pr to q1 = x, q2 = y cannot be told from: where both inputs are
// the phase's own within the solve's tolerance (sameInput), the answer is
// that phase, whichever pair gave it, as the fallbacks' onLine test makes
// it too.
func onSatPhase(pr *if97.Props, q1 Quantity, x float64, q2 Quantity, y float64) (State, bool) {
	if !(pr.T < if97.Tc) || math.Abs(pr.P/if97.SatPressure(pr.T)-1) > satBand {
		return State{}, false
	}
	var sat Saturation
	var ok bool
	switch q1 {
	case Pressure:
		sat, ok = saturationAtP(x)
	case Temperature:
		sat, ok = saturationAt(x)
	default:
		sat, ok = saturationAt(pr.T)
	}
	if !ok {
		return State{}, false
	}
	for i, ph := range []*if97.Props{&sat.Liquid, &sat.Vapour} {
		if sameInput(q1, x, ph) && sameInput(q2, y, ph) {
			return mixture(sat, float64(i)), true
		}
	}
	return State{}, false
}

// sameInput reports whether input q = val is pr's own within the solve's
// tolerance (edgeTol).
func sameInput(q Quantity, val float64, pr *if97.Props) bool {
	return math.Abs(value(q, pr)-val) <= edgeTol(q, val)
}

// stable3 reports whether a region-3 state is a stable single phase
// inside the range: not beyond the state at 100 MPa (region3Dense), and
// below Tc on its own side of the saturation line: a density above ρc
// (the liquid branch, onBranch) at p ≥ ps(T), a density below it at
// p ≤ ps(T). Between the branches' saturated densities lie the superheated
// liquid, supercooled vapour and unstable states of the Helmholtz equation.
func stable3(pr *if97.Props) bool {
	if !region3Dense(pr) {
		return false
	}
	if pr.T >= if97.Tc {
		return true
	}
	ps := if97.SatPressure(pr.T)
	if pr.Rho > if97.Rhoc {
		return pr.P >= ps
	}
	return pr.P <= ps
}

// onBoundary reports whether (p, T) lies within rounding of the edge of
// region r, so that a state the solve put exactly on a boundary line counts
// for the region it was solved in.
func onBoundary(r int, p, T float64) bool {
	const e = 1e-9
	for _, dp := range []float64{-e, 0, e} {
		for _, dT := range []float64{-e, 0, e} {
			if if97.RegionOf(p*(1+dp), T*(1+dT)) == r {
				return true
			}
		}
	}
	return false
}

// region3Dense reports whether a region-3 state lies within the range of
// validity on the dense side: mechanically stable ((∂p/∂ρ)_T > 0) and not
// denser than the state at 100 MPa and its temperature. Beyond that the
// Helmholtz equation is extrapolated and can bend back to pressures below
// 100 MPa with a negative compressibility (found by FuzzSolve at 647 K,
// 987.5 kg/m³).
func region3Dense(pr *if97.Props) bool {
	if !(pr.KappaT > 0) {
		return false
	}
	// Region 3's density at 100 MPa is at least 386.89 kg/m³ (at the top of
	// the B23 line, 863.15 K; measured in 0.01 K steps); below 380 no
	// state can be denser than it.
	if pr.Rho < 380 {
		return true
	}
	// Elsewhere a table of that density in 1 K steps settles all but the
	// states within 0.1 % of it, which get the exact solve.
	if top, ok := rho100Approx(pr.T); ok {
		switch {
		case pr.Rho < top*0.999:
			return true
		case pr.Rho > top*1.001:
			return false
		}
	}
	rhoTop, ok := region3Density(PMax, pr.T)
	return ok && pr.Rho <= rhoTop*(1+1e-12)
}

// rho100 tabulates region 3's density at 100 MPa from 623.15 K to
// 862.15 K in 1 K steps, filled on first use.
var (
	rho100Once  sync.Once
	rho100Table [240]float64
)

// rho100Approx returns region 3's density at 100 MPa and T by linear
// interpolation in rho100Table (good to far better than 0.1 %: the density
// is smooth in T), or false outside the table.
func rho100Approx(T float64) (float64, bool) {
	rho100Once.Do(func() {
		for i := range rho100Table {
			rho100Table[i], _ = region3Density(PMax, T13+float64(i))
		}
	})
	x := T - T13
	i := int(x)
	if x < 0 || i+1 >= len(rho100Table) {
		return 0, false
	}
	f := x - float64(i)
	return rho100Table[i] + f*(rho100Table[i+1]-rho100Table[i]), true
}
