package if97

import (
	"math"
	"sync"
)

// Saturated liquid and vapour densities in the range of region 3 from the
// phase-equilibrium condition applied to the region-3 basic equation.

// Limits and settings of the saturation solve.
const (
	// sat3TMin is the lower end of region 3, K (R7-97(2012), section 4).
	sat3TMin = 623.15
	// sat3NearTc is the distance below Tc, K, under which the starting values
	// come from the mean-field scaling of a reference solution instead of
	// the SR5-05 backward equations.
	sat3NearTc = 0.1
	// sat3Series is the distance below Tc, K, under which the densities
	// come from the expansion about the critical point.
	sat3Series = 1e-3
	// sat3MaxIter bounds the Newton iteration.
	sat3MaxIter = 60
	// sat3Tol is the relative change of the densities at which the
	// iteration stops.
	sat3Tol = 1e-13
	// sat3Floor is the relative step below which a step that fails to
	// shrink fourfold ends the iteration.
	sat3Floor = 1e-6
	// sat3Accept is the relative mismatch of p and g between the two phases
	// above which a result is refused.
	sat3Accept = 1e-11
)

// Region3SatDensities returns the densities in kg/m³ of saturated liquid
// (rhoLiq) and saturated vapour (rhoVap) at temperature T in K from the
// region-3 basic equation f3(ρ,T) of IAPWS R7-97(2012), Eq. (28) with
// Table 30: the pair ρ′ > ρ″ with equal pressure and equal specific Gibbs
// free energy (phase-equilibrium or Maxwell condition),
//
//	p(ρ′,T) = p(ρ″,T),   g(ρ′,T) = g(ρ″,T),   g = f + p/ρ.
//
// Valid for 623.15 K ≤ T ≤ 647.096 K (Tc). At T = Tc both densities are
// Rhoc. It returns ok = false for T outside that range, for NaN, and when the
// iteration does not converge.
//
// For Tc − T ≥ 1 mK the two conditions are solved by Newton's method in the
// mean density m = (ρ′+ρ″)/2 and the half-difference d = (ρ′−ρ″)/2, each
// condition divided by 2d so that the trivial root ρ′ = ρ″ drops out. The
// Jacobian is analytic, from (∂p/∂ρ)_T = 1/(ρ κ_T) and
// (∂g/∂ρ)_T = (∂p/∂ρ)_T/ρ. Starting values: for T ≤ Tc − 0.1 K the
// SR5-05(2016) backward equations v(p,T) just above and just below ps(T) of
// R7-97 Eq. (30); closer to Tc the solution at Tc − 0.1 K scaled as near a
// mean-field critical point, d ∝ (Tc−T)^½ and m − ρc ∝ Tc − T, which the
// analytic equation f3 obeys.
//
// For Tc − T < 1 mK the determination of m from the two conditions loses
// digits to rounding (both conditions tend to the same equation), and the
// densities come from the expansion about the critical point,
//
//	d = ε^½ (c0 + c1 ε),   m = ρc + a1 ε + a2 ε²,   ε = Tc − T in K,
//
// with c0 and c1 matched to the Newton solutions at ε = 1 and 4 mK, a1 and
// a2 at ε = 4 and 10 mK. The densities are then good to a few 1e-6 kg/m³,
// and d vanishes at Tc as it must.
func Region3SatDensities(T float64) (rhoLiq, rhoVap float64, ok bool) {
	switch {
	case !(T >= sat3TMin && T <= Tc):
		return 0, 0, false
	case T == Tc:
		return Rhoc, Rhoc, true
	}
	dT := Tc - T
	if dT >= sat3NearTc {
		rl, rv := sat3Start(T)
		return sat3Solve(T, rl, rv)
	}
	c := sat3Critical()
	if !c.ok {
		return 0, 0, false
	}
	if dT < sat3Series {
		d := math.Sqrt(dT) * (c.c0 + c.c1*dT)
		m := Rhoc + dT*(c.a1+c.a2*dT)
		return m + d, m - d, true
	}
	x := dT / sat3NearTc
	m := Rhoc + (c.mRef-Rhoc)*x
	d := c.dRef * math.Sqrt(x)
	return sat3Solve(T, m+d, m-d)
}

// sat3Start returns starting densities, kg/m³, for the saturation solve at T
// from the SR5-05(2016) backward equations on either side of ps(T).
func sat3Start(T float64) (rl, rv float64) {
	ps := SatPressure(T)
	rl = 1 / Region3VFromPT(ps*(1+1e-7), T)
	pv := ps * (1 - 1e-7)
	sub := Region3SubregionPT(pv, T)
	if sub == 0 {
		// At 623.15 K the vapour side lies on the B23 line, just outside
		// region 3; sub-region 3t holds the saturated vapour there.
		sub = 't'
	}
	eq := &sr5Equations[sub-'a']
	rv = 1 / (eq.vStar * eq.omega(pv/eq.pStar, T/eq.tStar))
	return rl, rv
}

// sat3Crit holds what the near-critical branch of Region3SatDensities needs:
// the solution at Tc − sat3NearTc as mean density mRef and half-difference
// dRef, kg/m³, and the coefficients of the expansion used below
// Tc − sat3Series.
type sat3Crit struct {
	mRef, dRef     float64
	c0, c1, a1, a2 float64
	ok             bool
}

var (
	sat3CritOnce sync.Once
	sat3CritVal  sat3Crit
)

// sat3Critical computes the near-critical data once.
func sat3Critical() sat3Crit {
	sat3CritOnce.Do(func() {
		c := &sat3CritVal
		T := Tc - sat3NearTc
		rl, rv := sat3Start(T)
		rl, rv, ok := sat3Solve(T, rl, rv)
		if !ok {
			return
		}
		c.mRef, c.dRef = (rl+rv)/2, (rl-rv)/2
		// Newton solutions at ε = 1, 4 and 10 mK. The split d is matched at
		// 1 and 4 mK, where the neglected ε^(5/2) term is smallest; the mean
		// m at 4 and 10 mK, where rounding disturbs it least (its scatter
		// grows from 2e-7 kg/m³ at 10 mK to 8e-6 kg/m³ at 1 mK).
		eps := [3]float64{sat3Series, 4 * sat3Series, 10 * sat3Series}
		var m, d [3]float64
		for k, e := range eps {
			x := e / sat3NearTc
			mk := Rhoc + (c.mRef-Rhoc)*x
			dk := c.dRef * math.Sqrt(x)
			rl, rv, ok := sat3Solve(Tc-e, mk+dk, mk-dk)
			if !ok {
				return
			}
			m[k], d[k] = (rl+rv)/2-Rhoc, (rl-rv)/2
		}
		k0, k1 := d[0]/math.Sqrt(eps[0]), d[1]/math.Sqrt(eps[1])
		c.c1 = (k1 - k0) / (eps[1] - eps[0])
		c.c0 = k0 - c.c1*eps[0]
		c.a2 = (m[2]/eps[2] - m[1]/eps[1]) / (eps[2] - eps[1])
		c.a1 = m[1]/eps[1] - c.a2*eps[1]
		c.ok = true
	})
	return sat3CritVal
}

// sat3Side holds p in MPa, g in kJ/kg, and their density derivatives at
// constant T of one phase.
type sat3Side struct {
	p, g, dp, dg float64
}

// sat3Eval evaluates f3 (R7-97 Eq. 28) at ρ in kg/m³ and T in K.
func sat3Eval(rho, T float64) sat3Side {
	pr := Region3(rho, T)
	dp := 1 / (rho * pr.KappaT)
	// dg = v dp; with p in MPa and g in kJ/kg the factor is 1000.
	return sat3Side{pr.P, pr.G, dp, 1000 * dp / rho}
}

// sat3Solve runs the Newton iteration of Region3SatDensities from the
// starting densities rl > rv, kg/m³, at T in K.
func sat3Solve(T, rl, rv float64) (rhoLiq, rhoVap float64, ok bool) {
	if !(rl > rv && rv > 0) {
		return 0, 0, false
	}
	m, d := (rl+rv)/2, (rl-rv)/2
	last := math.Inf(1)
	for it := 0; it < sat3MaxIter; it++ {
		L, V := sat3Eval(m+d, T), sat3Eval(m-d, T)
		e1 := (L.p - V.p) / (2 * d)
		e2 := (L.g - V.g) / (2 * d)
		j11 := (L.dp - V.dp) / (2 * d)
		j12 := (L.dp+V.dp)/(2*d) - e1/d
		j21 := (L.dg - V.dg) / (2 * d)
		j22 := (L.dg+V.dg)/(2*d) - e2/d
		det := j11*j22 - j12*j21
		if det == 0 || math.IsNaN(det) {
			return 0, 0, false
		}
		dm := -(e1*j22 - e2*j12) / det
		dd := -(j11*e2 - j21*e1) / det
		// Keep both densities positive and the phases apart.
		for k := 0; k < 30 && !(d+dd > 0 && m+dm-(d+dd) > 0); k++ {
			dm, dd = dm/2, dd/2
		}
		m, d = m+dm, d+dd
		// Stop on a step of sat3Tol, or once the steps no longer shrink
		// quadratically although small: near Tc rounding in f3 sets a floor
		// (about 1e-9 of m at Tc − 10 mK) that further steps only jitter on.
		step := math.Abs(dm) + math.Abs(dd)
		if step <= sat3Tol*m || (step <= sat3Floor*m && step > last/4) {
			break
		}
		last = step
	}
	// The result stands if the phases balance and both are mechanically
	// stable, which the spurious root d → 0 on a spinodal is not.
	L, V := sat3Eval(m+d, T), sat3Eval(m-d, T)
	if !(d > 0 && L.dp > 0 && V.dp > 0) || !sat3Balanced(L, V) {
		return 0, 0, false
	}
	return m + d, m - d, true
}

// sat3Balanced reports whether p and g of the two phases agree to
// sat3Accept relative.
func sat3Balanced(L, V sat3Side) bool {
	return math.Abs(L.p-V.p) <= sat3Accept*math.Abs(L.p) &&
		math.Abs(L.g-V.g) <= sat3Accept*math.Abs(L.g)
}
