package fn

import (
	"fmt"
	"math"
	"sync"

	"steamcell/fn/if97"
)

// fromPV returns the state at pressure p and specific volume v. In the
// vapour regions and region 3, v rises with T at constant p. In liquid water
// below about 277 K it falls (the density maximum), so a v near the smallest
// liquid volume can fit two temperatures: such a v is refused with
// ErrTwoSolutions, naming both.
func fromPV(p, v float64) (State, error) {
	if err := checkP(p); err != nil {
		return State{}, err
	}
	if err := checkV(v); err != nil {
		return State{}, err
	}
	if st, ok := fastPV(p, v); ok {
		return st, nil
	}
	_, tHi := tRangeAtP(p)
	if vmax := quantityAt(Volume, p, tHi); v > vmax {
		return State{}, outOfRange(Volume, v, vmax, "v above %.8g m³/kg, its value at %g K and p = %g MPa", vmax, tHi, p)
	}
	vapour := func(tLo float64) (State, error) {
		if tHi > TMax && v > quantityAt(Volume, p, TMax) {
			return solvedAtP(5, p, Volume, v, TMax, tHi)
		}
		return solvedAtP(2, p, Volume, v, tLo, TMax)
	}
	if p < PMinSat {
		if vmin := quantityAt(Volume, p, TMin); v < vmin {
			return State{}, outOfRange(Volume, v, vmin, "v below %.8g m³/kg, its value at %g K and p = %g MPa", vmin, TMin, p)
		}
		return vapour(TMin)
	}
	liquidTop := T13
	if p <= P13Sat {
		liquidTop = if97.SatTemperature(p)
		liq, vap := if97.Region1(p, liquidTop), if97.Region2(p, liquidTop)
		switch {
		case v >= liq.V && v <= vap.V:
			sat := Saturation{P: p, T: liquidTop, Liquid: liq, Vapour: vap}
			if cold := if97.Region1(p, TMin); v <= cold.V {
				// Near the density maximum a liquid colder than the
				// saturation temperature has this v too.
				a, _ := solveAtP(1, p, Volume, v, TMin, liquidTop)
				return State{}, &InputError{Input: "p,v", Pair: true, Kind: ErrTwoSolutions, Alternatives: []float64{a.T, liquidTop},
					Detail: fmt.Sprintf("near the density maximum of water, v = %g m³/kg at p = %g MPa fits liquid at T = %.6g K and a wet mixture at T = %.6g K; give T instead of v", v, p, a.T, liquidTop)}
			}
			return mixture(sat, quality(liq.V, vap.V, v)), nil
		case v > vap.V:
			return vapour(liquidTop)
		}
		return liquidAtPV(p, v, liquidTop)
	}
	if v <= quantityAt(Volume, p, T13) {
		return liquidAtPV(p, v, T13)
	}
	tb := if97.B23Temperature(p)
	if v >= quantityAt(Volume, p, tb) {
		return vapour(tb)
	}
	if p < if97.Pc {
		if sat, ok := saturationAt(if97.SatTemperature(p)); ok {
			sat.P = p
			if v >= sat.Liquid.V && v <= sat.Vapour.V {
				return mixture(sat, quality(sat.Liquid.V, sat.Vapour.V, v)), nil
			}
		}
	}
	return solvedAtP(3, p, Volume, v, T13, tb)
}

// liquidAtPV solves v(p, T) = v in region 1 for T in [273.15 K, tTop],
// minding the density maximum: where αv < 0 at 273.15 K, v falls with T up to
// the temperature of maximum density and rises after it.
func liquidAtPV(p, v, tTop float64) (State, error) {
	cold := if97.Region1(p, TMin)
	if cold.AlphaV >= 0 { // no density maximum inside the range at this p
		if v < cold.V {
			return State{}, outOfRange(Volume, v, cold.V, "v below %.8g m³/kg, its value at %g K and p = %g MPa", cold.V, TMin, p)
		}
		return solvedAtP(1, p, Volume, v, TMin, tTop)
	}
	// Temperature of maximum density: αv(p, T) = 0.
	f := func(T float64) float64 { return if97.Region1(p, T).AlphaV }
	tmd, ok := rootBrent(f, TMin, 300, cold.AlphaV, f(300), 1e-13)
	if !ok {
		return State{}, noConvergence("p,v")
	}
	vmin := if97.Region1(p, tmd).V
	switch {
	case v < vmin:
		return State{}, outOfRange(Volume, v, vmin, "v below %.8g m³/kg, the smallest liquid volume at p = %g MPa (at T = %.4g K)", vmin, p, tmd)
	case v <= cold.V:
		a, _ := solveAtP(1, p, Volume, v, TMin, tmd)
		b, _ := solveAtP(1, p, Volume, v, tmd, tTop)
		return State{}, &InputError{Input: "p,v", Pair: true, Kind: ErrTwoSolutions, Alternatives: []float64{a.T, b.T},
			Detail: fmt.Sprintf("near the density maximum of water, v = %g m³/kg at p = %g MPa fits T = %.6g K and T = %.6g K; give T instead of v", v, p, a.T, b.T)}
	}
	return solvedAtP(1, p, Volume, v, tmd, tTop)
}

// fastPV tries (p, v) in regions 1 and 2 by Newton steps in T, from the
// ideal-gas temperature for vapour and from the top of the liquid range for
// liquid (v is convex in T there, so the steps approach from above), and
// accepts the answer by which side of the saturation temperature (or of the
// region boundaries above 16.529 MPa) it lies on. Liquid answers below
// 285 K go to the exact path, which minds the density maximum.
func fastPV(p, v float64) (State, bool) {
	if !(p >= PMinSat && p <= PMax && v > 0) {
		return State{}, false
	}
	tLiqTop, tVapLo := T13, if97.B23Temperature(p)
	if p <= P13Sat {
		tLiqTop = if97.SatTemperature(p)
		tVapLo = tLiqTop
	}
	if v < 0.0025 {
		pr, ok := newton1n(1, Volume, v, p, tLiqTop, true, 12)
		if ok && pr.T < tLiqTop && pr.T >= 285 && pr.AlphaV > 0 {
			return singleState(1, pr), true
		}
	}
	if p > P13Sat && v > 1/800.0 && v < 1/100.0 {
		// Region 3: at fixed ρ the pressure rises with T; solve T.
		t0 := (T13 + if97.B23Temperature(p)) / 2
		pr, ok := newton1n(3, Pressure, p, 1/v, t0, true, 15)
		if ok && if97.RegionOf(pr.P, pr.T) == 3 && stableRegion3(&pr) {
			return singleState(3, pr), true
		}
	}
	if v < 0.0025 {
		return State{}, false
	}
	tIdeal := p * v * mpaM3 / if97.R
	if tIdeal > TMax && p <= PMaxHigh {
		pr, ok := newton1n(5, Volume, v, p, math.Min(tIdeal, TMaxHigh), true, 12)
		if ok && pr.T > TMax && pr.T <= TMaxHigh {
			return singleState(5, pr), true
		}
	}
	t0 := math.Max(tVapLo, math.Min(TMax, tIdeal))
	pr, ok := newton1n(2, Volume, v, p, t0, true, 12)
	if ok && pr.T > tVapLo && pr.T <= TMax {
		return singleState(2, pr), true
	}
	return State{}, false
}

// stableRegion3 reports whether a region-3 state is a stable single phase
// inside the range: not denser than at 100 MPa (region3Dense); above Tc
// then always; below it only with a density outside the saturated
// densities at its temperature (inside lie metastable and unstable states
// of the Helmholtz equation).
func stableRegion3(pr *if97.Props) bool {
	if !region3Dense(pr) {
		return false
	}
	if pr.T >= if97.Tc {
		return true
	}
	rl, rv, ok := if97.Region3SatDensities(pr.T)
	return ok && (pr.Rho > rl || pr.Rho < rv)
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
