package fn

import (
	"math"

	"steamcell/fn/if97"
)

// region3Density returns the density (kg/m³) of the region-3 state at p
// (MPa) and T (K): the SR5-05(2016) backward equation v(p,T) gives the start,
// Newton steps on p(ρ,T) of the Helmholtz equation (R7-97(2012) Eq. 28) the
// answer, to rounding.
func region3Density(p, T float64) (float64, bool) {
	v0 := if97.Region3VFromPT(p, T)
	if !(v0 > 0) {
		return 0, false
	}
	if rho, ok := region3Newton(p, T, 1/v0); ok {
		return rho, true
	}
	return region3Bracketed(p, T, 1/v0)
}

// region3Newton polishes rho with Newton steps on p(ρ,T) = p until the
// pressure agrees to 2e-10 (see resTol).
func region3Newton(p, T, rho float64) (float64, bool) {
	tol := resTol(Pressure, p)
	for it := 0; it < 50; it++ {
		pr := if97.Region3(rho, T)
		res := p - pr.P
		if math.Abs(res) <= tol {
			return rho, true
		}
		dpdrho := 1 / (pr.Rho * pr.KappaT)
		if !(dpdrho > 0) {
			return rho, false
		}
		step := res / dpdrho
		if math.Abs(step) > rho/4 {
			step = math.Copysign(rho/4, step)
		}
		rho += step
	}
	return rho, false
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
