package fn

import (
	"math"

	"steamcell/fn/if97"
)

// Region 3 is the one region whose basic equation, f3(ρ, T) of R7-97(2012)
// Eq. 28, does not take p. Every (p, T) solve in it goes through
// region3Density, which works at any (p, T) of region 3, its boundary lines
// (623.15 K and B23) included, on the side of the saturation line that the
// phase decision of saturation.go gives.

// region3Density returns the density (kg/m³) of the stable region-3 state
// at p (MPa) and T (K): the liquid where p ≥ ps(T) below Tc (phaseAt), the
// vapour below it.
func region3Density(p, T float64) (float64, bool) {
	pr, ok := region3PT(p, T)
	return pr.Rho, ok
}

// region3PT is region3Density with the properties at the density found.
func region3PT(p, T float64) (if97.Props, bool) {
	return region3At(p, T, T < if97.Tc && p >= if97.SatPressure(T))
}

// region3DensityOn returns the density (kg/m³) of the region-3 state at p
// (MPa) and T (K) on the liquid branch (liquid true) or the vapour branch
// of the isotherm; above Tc the branch does not matter. The SR5-05(2016)
// backward equation v(p,T) gives the start, taken a hair inside region 3
// where rounding puts (p, T) just outside (B23Pressure at B23Temperature(p)
// misses p by up to 1e-12 relative, either way) and on the requested side of
// Ts(p); Newton steps on p(ρ,T) of f3 give the answer, to rounding, and
// a bracketed solve takes over where they fail (near the critical point,
// where (∂p/∂ρ)_T vanishes). The answer must be mechanically stable and on
// its branch (onBranch).
func region3DensityOn(p, T float64, liquid bool) (float64, bool) {
	pr, ok := region3At(p, T, liquid)
	return pr.Rho, ok
}

// region3At is region3DensityOn with the properties at the density found.
func region3At(p, T float64, liquid bool) (if97.Props, bool) {
	v0 := region3Start(p, T, liquid)
	if !(v0 > 0) {
		return if97.Props{}, false
	}
	if pr, ok := region3Newton(p, T, 1/v0); ok && onBranch(&pr, liquid) {
		return pr, true
	}
	if rho, ok := region3Bracketed(p, T, 1/v0); ok {
		if pr := if97.Region3(rho, T); onBranch(&pr, liquid) {
			return pr, true
		}
	}
	if !liquid {
		// Vapour within rounding of both 623.15 K and the saturation line,
		// where B23 and the line cross: SR5-05 has no vapour sub-region
		// inside region 3 there, and region 2's density, equal to region
		// 3's on B23 within IF97's consistency, starts the steps.
		if pr, ok := region3Newton(p, T, if97.Region2(p, T).Rho); ok && onBranch(&pr, false) {
			return pr, true
		}
	}
	return if97.Props{}, false
}

// region3Start is the SR5-05(2016) estimate of v at (p, T), moved by the
// rounding of the boundary equations into region 3 where it lies just
// outside, and, below the critical point, to the requested side of the
// saturation line (SR5-05 picks the side by Ts(p) of R7-97(2012) Eq. 31).
func region3Start(p, T float64, liquid bool) float64 {
	if T < if97.Tc && p <= if97.Pc {
		// 1e-9 relative is far inside the backward equation's accuracy
		// (0.001 % in v) and far outside rounding.
		if ts := if97.SatTemperature(p); liquid && T >= ts {
			T = ts * (1 - 1e-9)
		} else if !liquid && T <= ts {
			T = ts * (1 + 1e-9)
		}
	}
	// B23Temperature and B23Pressure invert each other to about 1e-12
	// relative, so a point on the line may need T lowered by as much:
	// steps doubling from 1e-15 relative find the inside.
	p = math.Min(p, PMax)
	T = math.Max(T, T13)
	for k, t0 := 0, T; k < 40 && if97.Region3SubregionPT(p, T) == 0 && p >= if97.B23Pressure(T13); k++ {
		T = t0 * (1 - 1e-15*math.Exp2(float64(k)))
	}
	return if97.Region3VFromPT(p, T)
}

// onBranch reports whether a region-3 density at T is a mechanically stable
// state on the requested branch. Below Tc the isotherm's liquid branch lies
// above ρc and its vapour branch below: ρc lies inside the mechanically
// unstable stretch, (∂p/∂ρ)_T < 0, of every isotherm from 623.15 K to Tc
// (TestCriticalDensitySplitsBranches).
func onBranch(pr *if97.Props, liquid bool) bool {
	if !(pr.KappaT > 0) {
		return false
	}
	return pr.T >= if97.Tc || liquid == (pr.Rho > if97.Rhoc)
}

// region3Newton polishes rho with Newton steps on p(ρ,T) = p until the
// pressure agrees to 2e-10 (see resTol), and returns the properties there.
func region3Newton(p, T, rho float64) (if97.Props, bool) {
	tol := resTol(Pressure, p)
	var pr if97.Props
	for it := 0; it < 50; it++ {
		pr = if97.Region3(rho, T)
		res := p - pr.P
		if math.Abs(res) <= tol {
			return pr, true
		}
		dpdrho := 1 / (pr.Rho * pr.KappaT)
		if !(dpdrho > 0) {
			return pr, false
		}
		step := res / dpdrho
		if math.Abs(step) > rho/4 {
			step = math.Copysign(rho/4, step)
		}
		rho += step
	}
	return pr, false
}

// region3Bracketed solves p(ρ,T) = p near rho0 where Newton steps fail (at
// and near the critical point, where (∂p/∂ρ)_T vanishes): it widens a
// bracket around rho0 by 1 % steps, up to 20 %, until p − p(ρ,T) changes
// sign, and bisects with safeguarded Newton steps.
func region3Bracketed(p, T, rho0 float64) (float64, bool) {
	f := func(rho float64) (float64, float64) {
		pr := if97.Region3(rho, T)
		return pr.P - p, 1 / (pr.Rho * pr.KappaT)
	}
	f0, _ := f(rho0)
	for k := 1; k <= 20; k++ {
		for _, r := range []float64{rho0 * (1 + 0.01*float64(k)), rho0 * (1 - 0.01*float64(k))} {
			fr, _ := f(r)
			if f0*fr <= 0 {
				return rootBracketed(f, rho0, r, f0, fr, rho0, 1e-15)
			}
		}
	}
	return rho0, false
}
