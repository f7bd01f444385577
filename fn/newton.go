package fn

import (
	"math"

	"steamcell/fn/if97"
)

// The solvers below work on the native variables of each IF97 region: (p, T)
// for the Gibbs regions 1, 2 and 5, (ρ, T) for the Helmholtz region 3. Their
// Jacobians come from the derivative properties of if97.Props (cp, αv, κT),
// by the relations of R7-97(2012) Tables 3 and 31 and the chain rule; see
// partials.

// mpaM3 is kJ in one MPa·m³: p·v in MPa·m³/kg times mpaM3 is in kJ/kg.
const mpaM3 = 1e3

// eval returns the properties in region r at native variables a and T: a is
// p (MPa) for regions 1, 2 and 5, ρ (kg/m³) for region 3.
func eval(r int, a, T float64) if97.Props {
	switch r {
	case 1:
		return if97.Region1(a, T)
	case 2:
		return if97.Region2(a, T)
	case 3:
		return if97.Region3(a, T)
	}
	return if97.Region5(a, T)
}

// native returns the native first variable of region r for props pr.
func native(r int, pr *if97.Props) float64 {
	if r == 3 {
		return pr.Rho
	}
	return pr.P
}

// value returns quantity q of pr.
func value(q Quantity, pr *if97.Props) float64 {
	switch q {
	case Pressure:
		return pr.P
	case Temperature:
		return pr.T
	case Enthalpy:
		return pr.H
	case Entropy:
		return pr.S
	case Volume:
		return pr.V
	case Density:
		return pr.Rho
	case InternalEnergy:
		return pr.U
	}
	return math.NaN()
}

// partials returns the derivatives of quantity q with respect to the native
// variables of region r: (∂q/∂p)_T and (∂q/∂T)_p for the Gibbs regions,
// (∂q/∂ρ)_T and (∂q/∂T)_ρ for region 3.
//
// In (p, T), from v, αv = (1/v)(∂v/∂T)_p, κT = −(1/v)(∂v/∂p)_T and cp:
//
//	(∂v/∂p)_T = −v κT               (∂v/∂T)_p = v αv
//	(∂h/∂p)_T = v (1 − T αv)        (∂h/∂T)_p = cp
//	(∂s/∂p)_T = −v αv               (∂s/∂T)_p = cp / T
//	(∂u/∂p)_T = v (p κT − T αv)     (∂u/∂T)_p = cp − p v αv
//
// and in (ρ, T), with (∂p/∂ρ)_T = 1/(ρ κT) and (∂p/∂T)_ρ = αv/κT, by the chain
// rule from the above.
func partials(q Quantity, r int, pr *if97.Props) (da, dT float64) {
	v, T, p := pr.V, pr.T, pr.P
	var dp float64 // (∂q/∂p)_T
	switch q {
	case Pressure:
		dp, dT = 1, 0
	case Temperature:
		dp, dT = 0, 1
	case Volume:
		dp, dT = -v*pr.KappaT, v*pr.AlphaV
	case Density:
		dp, dT = pr.Rho*pr.KappaT, -pr.Rho*pr.AlphaV
	case Enthalpy:
		dp, dT = mpaM3*v*(1-T*pr.AlphaV), pr.Cp
	case Entropy:
		dp, dT = -mpaM3*v*pr.AlphaV, pr.Cp/T
	case InternalEnergy:
		dp, dT = mpaM3*v*(p*pr.KappaT-T*pr.AlphaV), pr.Cp-mpaM3*p*v*pr.AlphaV
	}
	if r != 3 {
		return dp, dT
	}
	// Region 3: the native variables are (ρ, T).
	switch q {
	case Density:
		return 1, 0
	case Volume:
		return -v * v, 0
	case Temperature:
		return 0, 1
	}
	dpdrho := 1 / (pr.Rho * pr.KappaT)
	dpdT := pr.AlphaV / pr.KappaT
	return dp * dpdrho, dT + dp*dpdT
}

// box bounds the native variables of a region during a solve.
type box struct{ aMin, aMax, tMin, tMax float64 }

// regionBox returns generous bounds of region r's native variables; the
// solution is checked against the exact region afterwards.
func regionBox(r int) box {
	switch r {
	// Each box reaches a little past its region (1 K, 1 % in p), so that a
	// solve for a state on the region's edge is not squeezed against the
	// box; accept judges the answer by the exact region.
	case 1:
		return box{1e-7, 1.01 * PMax, TMin - 1, T13 + 1}
	case 2:
		// Up to region 5's top: the extended region-2 equation gives
		// region 5's solves their start.
		return box{1e-9, 1.01 * PMax, TMin - 1, TMaxHigh + 1}
	case 3:
		// Region 3's densities span 1/v3Max to 1/v3Min (regionSpans), about
		// 114 to 700 kg/m³; half and one and a half times those bound it.
		return box{0.5 / regionSpans.v3Max, 1.5 / regionSpans.v3Min, T13 - 1, if97.B23Temperature(PMax) + 1}
	}
	return box{1e-9, 1.01 * PMaxHigh, TMax - 1, TMaxHigh + 1}
}

// newton is the one Newton driver of every pair: it solves
// q1(a, T) = v1, q2(a, T) = v2 in region r from the start (a, T), a and T
// the region's native variables (see eval), by Newton steps with the
// analytic Jacobian (partials), damped to stay in the region's box. A pair
// that fixes a native variable (p in the Gibbs regions, T, ρ in region 3)
// gives it as q1: its row of the Jacobian is exact, so that variable stays
// put and the steps are those of a one-dimensional Newton method in the
// other. It stops when both residuals are below resTol scaled by
// tolFactor (pairs whose inputs hardly depend on one of the variables, h
// and s of cold liquid hardly moving with p, need 1e-3 to pin that
// variable to 1e-9) and returns the properties at the last point
// evaluated, reporting false if maxIter steps do not get there.
func newton(r int, q1 Quantity, v1 float64, q2 Quantity, v2 float64, a, T float64, maxIter int, tolFactor float64) (if97.Props, bool) {
	b := regionBox(r)
	s1, s2 := scaleOf(q1, v1), scaleOf(q2, v2)
	tol1, tol2 := tolFactor*resTol(q1, v1), tolFactor*resTol(q2, v2)
	var pr if97.Props
	for it := 0; it < maxIter; it++ {
		pr = eval(r, a, T)
		e1, e2 := value(q1, &pr)-v1, value(q2, &pr)-v2
		if math.Abs(e1) <= tol1 && math.Abs(e2) <= tol2 {
			return pr, true
		}
		r1, r2 := e1/s1, e2/s2
		j11, j12 := partials(q1, r, &pr)
		j21, j22 := partials(q2, r, &pr)
		j11, j12, j21, j22 = j11/s1, j12/s1, j21/s2, j22/s2
		det := j11*j22 - j12*j21
		if det == 0 || math.IsNaN(det) {
			return pr, false
		}
		da := (-r1*j22 + r2*j12) / det
		dT := (-r2*j11 + r1*j21) / det
		// Damp the step to stay inside the box and to move T by at most
		// a third, a by at most a factor of three, per step.
		lam := 1.0
		lam = limitStep(lam, T, dT, b.tMin, b.tMax, T/3)
		lam = limitStep(lam, a, da, b.aMin, b.aMax, 2*a)
		if lam == 1 && math.Abs(da) <= 1e-14*math.Abs(a) && math.Abs(dT) <= 1e-14*T {
			// The step is below rounding: no better point exists, and
			// the point stands if it meets the plain tolerance (for v and
			// ρ, which stop only at rounding, the rounding of a solve in
			// two variables, 1e-12).
			return pr, math.Abs(e1) <= roundTol(q1, v1, tol1/tolFactor) && math.Abs(e2) <= roundTol(q2, v2, tol2/tolFactor)
		}
		if lam == 1 && math.Abs(e1) <= tol1/tolFactor && math.Abs(e2) <= tol2/tolFactor &&
			math.Abs(da) <= 1e-10*math.Abs(a) && math.Abs(dT) <= 1e-13*T {
			// Within the plain tolerance and the steps are down to the
			// rounding of the values (near 273 K, h and s are sums that
			// cancel to a few kJ/kg and hundredths of kJ/(kg·K)): a is
			// pinned to 1e-10, which is all the tighter tolerance asks.
			return pr, true
		}
		a += lam * da
		T += lam * dT
	}
	return pr, false
}

// resTol is the residual at which a solve for q = v stops: 2e-10 of v, with
// a floor for quantities that pass through zero (h and u near the triple
// point, s of cold liquid), so that every answer agrees with the forward
// equations to better than the 1e-9 relative that steamcell promises.
// Volume and density stop only at rounding: liquid water is so stiff that
// v to 2e-10 leaves p uncertain by 0.5 kPa.
func resTol(q Quantity, v float64) float64 {
	floor := 0.0
	switch q {
	case Volume, Density:
		return 1e-15 * math.Abs(v)
	case Enthalpy, InternalEnergy:
		floor = 1 // kJ/kg
	case Entropy:
		floor = 0.01 // kJ/(kg·K)
	}
	return 2e-10 * math.Max(math.Abs(v), floor)
}

// roundTol is the residual a point at rounding may keep: tol, or for v
// and ρ 1e-12 relative.
func roundTol(q Quantity, v, tol float64) float64 {
	if q == Volume || q == Density {
		return math.Max(tol, 1e-12*math.Abs(v))
	}
	return tol
}

// limitStep shrinks lam so that x + lam·dx stays inside [lo, hi] (stopping
// halfway to a bound it would cross) and |lam·dx| ≤ maxStep.
func limitStep(lam, x, dx, lo, hi, maxStep float64) float64 {
	if dx == 0 {
		return lam
	}
	if m := math.Abs(dx) * lam; m > maxStep {
		lam *= maxStep / m
	}
	if y := x + lam*dx; y > hi {
		lam = (hi - x) / dx / 2
	} else if y < lo {
		lam = (lo - x) / dx / 2
	}
	return lam
}

// scaleOf returns a residual scale for quantity q near value v, so that
// the two residuals of a Newton solve are of comparable size.
func scaleOf(q Quantity, v float64) float64 {
	switch q {
	case Entropy:
		return 1 // kJ/(kg·K): s runs 0…12
	case Enthalpy, InternalEnergy:
		return 1000
	case Temperature:
		return 100
	}
	if a := math.Abs(v); a > 0 {
		return a
	}
	return 1
}
