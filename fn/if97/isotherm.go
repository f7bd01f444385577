package if97

import "math"

// Isotherm gives h or s of one region along one isotherm, for searches
// that evaluate them at many points of the isotherm (the (T,h) and (T,s)
// solves of package fn). At fixed T every power of τ (or of τ − 1.222,
// τ − 0.5) in the basic equation is fixed, so the equation collapses to a
// polynomial in its first variable:
//
//	value = scale · (k + l·ln x + Σ_I d_I x^I),
//
// with x = 7.1 − π in region 1 (R7-97(2012) Eq. 7), x = π in regions 2 and
// 5 (Eqs. 15 and 32; the ln π of the ideal-gas part gives l), x = δ in
// region 3 (Eq. 28; its n₁ ln δ gives l). The coefficients d_I gather the
// rows of each table with the same I, with the relations of Tables 12, 31
// and 42 applied (h = RTτγτ, s = R(τγτ − γ) for the Gibbs regions;
// h = RT(τφτ + δφδ), s = R(τφτ − φ) for region 3). The values are those of
// Region1, Region2, Region3 and Region5 summed in another order, so they
// agree with them to rounding.
type Isotherm struct {
	x0, xs float64 // x = x0 + xs·a, a the region's native variable (p in MPa, ρ in kg/m³)
	scale  float64
	k, l   float64
	d      [isoMaxI + 1]float64
	top    int // highest I with a coefficient
	hasLog bool
	ok     bool
}

// isoMaxI is the highest exponent I in the tables of the basic equations
// (32 in region 1, R7-97(2012) Table 2).
const isoMaxI = 32

// IsothermQuantity selects what an Isotherm gives.
type IsothermQuantity int

const (
	IsothermEnthalpy IsothermQuantity = iota // h, kJ/kg
	IsothermEntropy                          // s, kJ/(kg·K)
)

// NewIsotherm returns h or s of region r (1, 2, 3 or 5) along the isotherm
// T (K). Other regions give an Isotherm whose At is NaN.
func NewIsotherm(r int, T float64, q IsothermQuantity) Isotherm {
	var it Isotherm
	it.ok = true
	ent := q == IsothermEntropy
	// gibbs adds the rows of a Gibbs table with b = τ − shift: γτ and γ by I.
	gibbs := func(rows []term, tau, b float64) {
		for _, row := range rows {
			b0, b1, _ := regPowDerivs(b, row.J)
			c := row.n * b1 // ∂/∂τ of n·b^J
			if ent {
				c = row.n * (tau*b1 - b0)
			}
			it.d[row.I] += c
			it.top = max(it.top, row.I)
		}
	}
	// ideal adds the ideal-gas part of regions 2 and 5 (every row I = 0,
	// plus ln π): to k, and −ln π to l for s.
	ideal := func(rows []term, tau float64) {
		for _, row := range rows {
			b0, b1, _ := regPowDerivs(tau, row.J)
			if ent {
				it.k += row.n * (tau*b1 - b0)
			} else {
				it.k += row.n * b1
			}
		}
		if ent {
			it.l, it.hasLog = -1, true
		}
	}
	switch r {
	case 1:
		tau := r1TStar / T
		it.x0, it.xs = 7.1, -1/r1PStar
		gibbs(r1Coef[:], tau, tau-1.222)
		it.scale = isoScale(ent, T, tau)
	case 2:
		tau := r2TStar / T
		it.x0, it.xs = 0, 1/r2PStar
		ideal(r2IdealCoef[:], tau)
		gibbs(r2ResidualCoef[:], tau, tau-0.5)
		it.scale = isoScale(ent, T, tau)
	case 5:
		tau := r5TStar / T
		it.x0, it.xs = 0, 1/r5PStar
		ideal(r5IdealCoef[:], tau)
		gibbs(r5ResidualCoef[:], tau, tau)
		it.scale = isoScale(ent, T, tau)
	case 3:
		tau := Tc / T
		it.x0, it.xs = 0, 1/Rhoc
		for _, row := range r3Coef {
			b0, b1, _ := regPowDerivs(tau, row.J)
			tPhiT := row.n * tau * b1 // τ ∂/∂τ of n·τ^J, times δ^I
			if ent {
				it.d[row.I] += tPhiT - row.n*b0
			} else {
				it.d[row.I] += tPhiT + float64(row.I)*row.n*b0 // + δ ∂/∂δ of n·δ^I
			}
			it.top = max(it.top, row.I)
		}
		if ent {
			it.l, it.hasLog = -r3N1, true
			it.scale = R
		} else {
			it.k = r3N1 // δ ∂/∂δ of n₁ ln δ
			it.scale = R * T
		}
	default:
		it.ok = false
	}
	return it
}

// isoScale is the factor before the sums of a Gibbs region: RTτ for h
// (h = RTτγτ), R for s (s = R(τγτ − γ)).
func isoScale(ent bool, T, tau float64) float64 {
	if ent {
		return R
	}
	return R * T * tau
}

// At returns the value at a, the region's native variable: p in MPa for
// regions 1, 2 and 5, ρ in kg/m³ for region 3.
func (it *Isotherm) At(a float64) float64 {
	if !it.ok {
		return math.NaN()
	}
	x := it.x0 + it.xs*a
	sum := it.d[it.top]
	for i := it.top - 1; i >= 0; i-- { // Horner's rule
		sum = sum*x + it.d[i]
	}
	v := it.k + sum
	if it.hasLog {
		v += it.l * math.Log(x)
	}
	return it.scale * v
}
