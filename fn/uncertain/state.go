package uncertain

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/diff/fd"

	"steamcell/fn"
	"steamcell/fn/if97"
)

// kJPerMPaM3 converts a product of pressure and specific volume, MPa·m³/kg,
// to kJ/kg (1 MPa·m³/kg = 10⁶ J/kg, exact).
const kJPerMPaM3 = 1000

// ErrDegenerate: the two inputs do not fix the state to first order where
// it lies (their Jacobian with respect to the state's coordinates is
// singular), so no sensitivity can be given.
var ErrDegenerate = errors.New("the inputs do not fix the state to first order here")

// Input is one of the two inputs of a state: its quantity and its value
// with sensitivities, in base units.
type Input struct {
	Q fn.Quantity
	N Number
}

// State is a solved state whose main properties carry their sensitivities
// to the raw inputs of the budget the inputs came from.
type State struct {
	fn.State
	P, T, V, Rho, U, H, S, G, F Number
	X                           Number // quality; meaningful when HasX

	// The state's coordinates as Numbers: (p, T) in a single phase,
	// (T, x) on the saturation line (Mixture).
	z       [2]Number
	Mixture bool
}

// property indexes the rows of the analytic Jacobian.
type property int

const (
	propP property = iota
	propT
	propV
	propRho
	propU
	propH
	propS
	propG
	propF
	propX
	numProps
)

// rows holds the derivatives of each property with respect to the state's
// two coordinates.
type rows [numProps][2]float64

// rowsPT returns the derivatives of the properties of a single-phase state
// with respect to (p, T), from the IF97 properties v, cp, αv and κT. With
// (∂v/∂T)p = αv·v and (∂v/∂p)T = −κT·v (R7-97(2012) Table 3 definitions):
//
//	(∂h/∂T)p = cp            (∂h/∂p)T = v − T(∂v/∂T)p
//	(∂s/∂T)p = cp/T          (∂s/∂p)T = −(∂v/∂T)p        (Maxwell)
//	(∂u/∂T)p = cp − p(∂v/∂T)p   (∂u/∂p)T = −T(∂v/∂T)p − p(∂v/∂p)T
//	(∂g/∂T)p = −s            (∂g/∂p)T = v
//	(∂f/∂T)p = −s − p(∂v/∂T)p   (∂f/∂p)T = −p(∂v/∂p)T
//
// the p·v products times 1000 to give kJ/kg from MPa·m³/kg.
func rowsPT(pr *if97.Props) rows {
	var r rows
	p, T, v, k := pr.P, pr.T, pr.V, float64(kJPerMPaM3)
	dvdT, dvdp := pr.AlphaV*v, -pr.KappaT*v
	r[propP] = [2]float64{1, 0}
	r[propT] = [2]float64{0, 1}
	r[propV] = [2]float64{dvdp, dvdT}
	r[propRho] = [2]float64{-pr.Rho * pr.Rho * dvdp, -pr.Rho * pr.Rho * dvdT}
	r[propH] = [2]float64{k * (v - T*dvdT), pr.Cp}
	r[propS] = [2]float64{-k * dvdT, pr.Cp / T}
	r[propU] = [2]float64{k * (-T*dvdT - p*dvdp), pr.Cp - k*p*dvdT}
	r[propG] = [2]float64{k * v, -pr.S}
	r[propF] = [2]float64{-k * p * dvdp, -pr.S - k*p*dvdT}
	return r
}

// SatSlope returns dps/dT along the saturation line, MPa/K, from the
// Clausius–Clapeyron relation dp/dT = (h” − h')/(T (v” − v')) with the
// saturated phases of IF97 (the relation follows from g' = g” along the
// line; R7-97(2012) section 8.1 states the consistency of Eq. 30 with it).
func SatSlope(T float64, liq, vap *if97.Props) float64 {
	return (vap.H - liq.H) / (T * (vap.V - liq.V) * kJPerMPaM3)
}

// rowsTX returns the derivatives of the properties of a state on the
// saturation line with respect to (T, x). Each saturated phase moves along
// the line: dy'/dT = (∂y/∂T)p + (∂y/∂p)T·dps/dT. fn evaluates both phases
// at (ps(T), T) with ps(T) of R7-97(2012) Eq. 30 everywhere (the one
// saturation line of fn/saturation.go; above 623.15 K on the region-3
// equation), so the slope is that equation's own (if97.SatPressureSlope).
// The mixture's y = y' + x(y” − y') then has ∂y/∂T = dy'/dT +
// x(dy”/dT − dy'/dT) and ∂y/∂x = y” − y'.
func rowsTX(st *fn.State) rows {
	dp := if97.SatPressureSlope(st.T)
	liq, vap := st.Liquid, st.Vapour
	rl, rv := rowsPT(&liq), rowsPT(&vap)
	val := func(pr *if97.Props) [numProps]float64 {
		return [numProps]float64{pr.P, pr.T, pr.V, pr.Rho, pr.U, pr.H, pr.S, pr.G, pr.F}
	}
	yl, yv := val(&st.Liquid), val(&st.Vapour)
	x := st.X
	var r rows
	for k := propP; k < propX; k++ {
		dl := rl[k][1] + rl[k][0]*dp
		dv := rv[k][1] + rv[k][0]*dp
		r[k] = [2]float64{dl + x*(dv-dl), yv[k] - yl[k]}
	}
	// ρ = 1/v of the mixture, not the mixture of the densities.
	r[propRho] = [2]float64{-st.Rho * st.Rho * r[propV][0], -st.Rho * st.Rho * r[propV][1]}
	r[propP] = [2]float64{if97.SatPressureSlope(st.T), 0}
	r[propX] = [2]float64{0, 1}
	return r
}

// rowOf returns the row of an input quantity.
func (r *rows) rowOf(q fn.Quantity) ([2]float64, bool) {
	switch q {
	case fn.Pressure:
		return r[propP], true
	case fn.Temperature:
		return r[propT], true
	case fn.Enthalpy:
		return r[propH], true
	case fn.Entropy:
		return r[propS], true
	case fn.Volume:
		return r[propV], true
	case fn.Density:
		return r[propRho], true
	case fn.InternalEnergy:
		return r[propU], true
	case fn.Quality:
		return r[propX], true
	}
	return [2]float64{}, false
}

// Solve returns the state fixed by a and b with the sensitivities of its
// properties. The sensitivities with respect to (a, b) are
// J(z) · J(a,b)(z)⁻¹, z the state's coordinates ((p, T), or (T, x) on the
// saturation line), each J analytic (rowsPT, rowsTX). Errors are those of
// fn.Solve, or ErrDegenerate.
func Solve(a, b Input) (State, error) {
	st, err := fn.Solve(fn.Input{Q: a.Q, Value: a.N.Value}, fn.Input{Q: b.Q, Value: b.N.Value})
	if err != nil {
		return State{}, err
	}
	return Linearise(st, a, b)
}

// Linearise gives the solved state st, fixed by a and b, the sensitivities
// of its properties (see Solve).
func Linearise(st fn.State, a, b Input) (State, error) {
	s := State{State: st, Mixture: st.HasX}
	var r rows
	var z [2]float64
	if s.Mixture {
		r, z = rowsTX(&st), [2]float64{st.T, st.X}
	} else {
		if st.Phase == fn.MetastableVapour {
			return State{}, fmt.Errorf("%w: metastable vapour has no sensitivities here", ErrDegenerate)
		}
		r, z = rowsPT(&st.Props), [2]float64{st.P, st.T}
	}
	ra, okA := r.rowOf(a.Q)
	rb, okB := r.rowOf(b.Q)
	det := ra[0]*rb[1] - ra[1]*rb[0]
	scale := math.Hypot(ra[0], ra[1]) * math.Hypot(rb[0], rb[1])
	if !okA || !okB || !(math.Abs(det) > 1e-12*scale) {
		return State{}, fmt.Errorf("%w (%s and %s at p = %g MPa, T = %g K)", ErrDegenerate, a.Q.Symbol(), b.Q.Symbol(), st.P, st.T)
	}
	// M = A⁻¹ with A = ∂(a,b)/∂z: ∂z/∂(a,b).
	m := [2][2]float64{{rb[1] / det, -ra[1] / det}, {-rb[0] / det, ra[0] / det}}
	s.z[0] = Linear2(z[0], a.N, m[0][0], b.N, m[0][1])
	s.z[1] = Linear2(z[1], a.N, m[1][0], b.N, m[1][1])
	at := func(k property, v float64) Number { return Linear2(v, s.z[0], r[k][0], s.z[1], r[k][1]) }
	s.P, s.T, s.V, s.Rho = at(propP, st.P), at(propT, st.T), at(propV, st.V), at(propRho, st.Rho)
	s.U, s.H, s.S = at(propU, st.U), at(propH, st.H), at(propS, st.S)
	s.G, s.F = at(propG, st.G), at(propF, st.F)
	if s.Mixture {
		s.X = at(propX, st.X)
	}
	// The inputs themselves keep their own sensitivities exactly, not
	// their round trip through A⁻¹A.
	for _, in := range []Input{a, b} {
		if n := s.field(in.Q); n != nil {
			*n = in.N
		}
	}
	return s, nil
}

// field returns the Number of an input quantity.
func (s *State) field(q fn.Quantity) *Number {
	switch q {
	case fn.Pressure:
		return &s.P
	case fn.Temperature:
		return &s.T
	case fn.Enthalpy:
		return &s.H
	case fn.Entropy:
		return &s.S
	case fn.Volume:
		return &s.V
	case fn.Density:
		return &s.Rho
	case fn.InternalEnergy:
		return &s.U
	case fn.Quality:
		return &s.X
	}
	return nil
}

// Numeric returns the value and sensitivities of a property the state
// carries no analytic row for (cp, w, the transport properties, the
// saturation temperature, …), by central differences of get along the
// state's coordinates (gonum diff/fd). get reads the property of a state
// and says whether it has one. On the saturation line every such property
// is one of a saturated phase, which depends on T alone, so only T is
// stepped there.
func (s *State) Numeric(get func(*fn.State) (float64, bool)) (Number, bool) {
	y, ok := get(&s.State)
	if !ok || math.IsNaN(y) || math.IsInf(y, 0) {
		return Number{}, false
	}
	if s.Mixture {
		dT, ok := derivative(func(T float64) (fn.State, error) { return fn.FromTX(T, s.X.Value) },
			get, s.State.T, 1e-6*s.State.T, fn.TMin, if97.Tc)
		if !ok {
			return Number{}, false
		}
		return Linear2(y, s.z[0], dT, s.z[1], 0), true
	}
	p, T := s.State.P, s.State.T
	tMax := fn.TMaxHigh
	dp, ok1 := derivative(func(p float64) (fn.State, error) { return fn.FromPT(p, T) }, get, p, 1e-6*p, 0, fn.PMax)
	dT, ok2 := derivative(func(T float64) (fn.State, error) { return fn.FromPT(p, T) }, get, T, 1e-6*T, fn.TMin, tMax)
	if !ok1 || !ok2 {
		return Number{}, false
	}
	return Linear2(y, s.z[0], dp, s.z[1], dT), true
}

// derivative differentiates get∘solve at c with step h, one-sided where a
// central step would leave [lo, hi].
func derivative(solve func(float64) (fn.State, error), get func(*fn.State) (float64, bool), c, h, lo, hi float64) (float64, bool) {
	bad := false
	f := func(x float64) float64 {
		st, err := solve(x)
		if err != nil {
			bad = true
			return math.NaN()
		}
		v, ok := get(&st)
		if !ok {
			bad = true
		}
		return v
	}
	formula := fd.Central
	switch {
	case c-h < lo:
		formula = fd.Forward
	case c+h > hi:
		formula = fd.Backward
	}
	d := fd.Derivative(f, c, &fd.Settings{Formula: formula, Step: h})
	return d, !bad && !math.IsNaN(d) && !math.IsInf(d, 0)
}
