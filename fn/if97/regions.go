package if97

import "math"

// term is one row of an IF97 coefficient table: the exponents I and J and
// the coefficient n of a term n·a^I·b^J. Every table of the forward and
// backward equations is a []term or an array of them.
type term struct {
	I, J int
	n    float64
}

// regDerivs holds a dimensionless energy function f(a, b) and its first and
// second partial derivatives. The Gibbs regions use it with (a, b) = (π, τ),
// region 3 with (a, b) = (δ, τ).
type regDerivs struct {
	f, fa, faa, fb, fbb, fab float64
}

func (d regDerivs) plus(e regDerivs) regDerivs {
	return regDerivs{d.f + e.f, d.fa + e.fa, d.faa + e.faa, d.fb + e.fb, d.fbb + e.fbb, d.fab + e.fab}
}

// regPolySum returns Σ n·a^I·b^J over rows, with its derivatives in a and b.
//
// Each derivative is a sum of the same terms t = n·a^I·b^J with a factor
// from the exponents, divided by a power of a or b: ∂f/∂a = Σ I·t / a,
// ∂²f/∂a² = Σ I(I−1)·t / a², and so on. So each row costs one power of b
// (and one of a where I changes: the tables are ordered by I) and a few
// multiplications. Where a or b is exactly zero (a division would fail)
// regPolySumZero sums the derivative terms one by one.
func regPolySum(rows []term, a, b float64) regDerivs {
	if a == 0 || b == 0 {
		return regPolySumZero(rows, a, b)
	}
	var f, sa, saa, sb, sbb, sab float64
	lastI, aI := 0, 1.0
	for _, r := range rows {
		if r.I != lastI {
			lastI, aI = r.I, powi(a, r.I)
		}
		t := r.n * aI * powi(b, r.J)
		i, j := float64(r.I), float64(r.J)
		f += t
		sa += i * t
		saa += i * (i - 1) * t
		sb += j * t
		sbb += j * (j - 1) * t
		sab += i * j * t
	}
	ia, ib := 1/a, 1/b
	return regDerivs{f, sa * ia, saa * ia * ia, sb * ib, sbb * ib * ib, sab * ia * ib}
}

// regPolySumZero is regPolySum term by term, for a or b exactly zero.
func regPolySumZero(rows []term, a, b float64) regDerivs {
	var d regDerivs
	for _, r := range rows {
		a0, a1, a2 := regPowDerivs(a, r.I)
		b0, b1, b2 := regPowDerivs(b, r.J)
		d.f += r.n * a0 * b0
		d.fa += r.n * a1 * b0
		d.faa += r.n * a2 * b0
		d.fb += r.n * a0 * b1
		d.fbb += r.n * a0 * b2
		d.fab += r.n * a1 * b1
	}
	return d
}

// regPowDerivs returns x^k and its first two derivatives k·x^(k-1) and
// k(k-1)·x^(k-2). A derivative whose factor is zero is exactly zero, so a
// constant or linear factor stays finite at x = 0.
func regPowDerivs(x float64, k int) (p0, p1, p2 float64) {
	switch {
	case k == 0:
		return 1, 0, 0
	case k == 1:
		return x, 1, 0
	case x == 0:
		return powi(x, k), float64(k) * powi(x, k-1), float64(k*(k-1)) * powi(x, k-2)
	}
	q := powi(x, k-2) // one power, the other two by multiplication
	return q * x * x, float64(k) * q * x, float64(k*(k-1)) * q
}

// powi returns x^k for an integer k by repeated squaring; the IF97 tables
// use integer exponents only, where this is faster than math.Pow.
func powi(x float64, k int) float64 {
	if k < 0 {
		x, k = 1/x, -k
	}
	r := 1.0
	for k > 0 {
		if k&1 == 1 {
			r *= x
		}
		x *= x
		k >>= 1
	}
	return r
}

// termSum returns Σ n·a^I·b^J over the rows of a coefficient table, the
// common form of the backward equations (R7-97(2012), SR2-01, SR3-03,
// SR4-04, SR5-05).
func termSum(rows []term, a, b float64) float64 {
	var sum float64
	lastI, aI := 0, 1.0
	for _, r := range rows {
		if r.I != lastI { // most tables are ordered by I: one power of a per value of I
			lastI, aI = r.I, powi(a, r.I)
		}
		sum += r.n * aI * powi(b, r.J)
	}
	return sum
}

// regIdealGamma returns γ⁰ = ln π + Σ n⁰ᵢ τ^J⁰ᵢ and its derivatives, the form
// of the ideal-gas part of regions 2 and 5 (R7-97(2012) Eqs. 16, 19 and 33).
// Every row has I = 0.
func regIdealGamma(rows []term, pi, tau float64) regDerivs {
	d := regPolySum(rows, pi, tau)
	d.f += math.Log(pi)
	d.fa += 1 / pi
	d.faa -= 1 / (pi * pi)
	return d
}

// Unit factors between the base units of this package: R·T is in kJ/kg and
// pressure in MPa, so R·T/p is in 10⁻³ m³/kg and p·v in 10³ kJ/kg.
const (
	regKJPerMPaM3 = 1e3 // kJ in one MPa·m³
	regJPerKJ     = 1e3 // J in one kJ, for the speed of sound in m/s
	regPaPerMPa   = 1e6 // Pa in one MPa, for the isentropic exponent
)

// regGibbsProps returns the properties of a state from the dimensionless
// Gibbs free energy γ = g/(RT) as a function of π = p/p* and τ = T*/T, given
// in d with a = π and b = τ. The relations are those of R7-97(2012) Table 3
// (region 1), Table 12 (region 2) and Table 39 (region 5), written for the
// whole γ so that the three regions share them; αv, κT and the isentropic
// exponent κ = w²/(pv) follow from the same derivatives.
func regGibbsProps(p, T, pi, tau float64, d regDerivs) Props {
	g, gp, gpp, gt, gtt, gpt := d.f, d.fa, d.faa, d.fb, d.fbb, d.fab
	rt := R * T
	v := rt / p * pi * gp / regKJPerMPaM3
	dt := gp - tau*gpt // γπ − τγπτ
	w2 := regJPerKJ * rt * gp * gp / (dt*dt/(tau*tau*gtt) - gpp)
	s := Props{
		P:      p,
		T:      T,
		V:      v,
		Rho:    1 / v,
		U:      rt * (tau*gt - pi*gp),
		H:      rt * tau * gt,
		S:      R * (tau*gt - g),
		G:      rt * g,
		Cp:     -R * tau * tau * gtt,
		Cv:     R * (-tau*tau*gtt + dt*dt/gpp),
		W:      math.Sqrt(w2),
		AlphaV: (1 - tau*gpt/gp) / T,
		KappaT: -pi * gpp / (p * gp),
	}
	s.F = s.G - p*v*regKJPerMPaM3
	s.Kappa = w2 / (p * v * regPaPerMPa)
	return s
}

// regHelmholtzProps returns the properties of a state from the dimensionless
// Helmholtz free energy φ = f/(RT) as a function of δ = ρ/ρc and τ = Tc/T,
// given in d with a = δ and b = τ, by the relations of R7-97(2012) Table 31;
// g = f + pv, αv = κT(∂p/∂T)_ρ, κT = 1/(ρ(∂p/∂ρ)_T) and κ = w²/(pv) follow
// from the same derivatives.
func regHelmholtzProps(rho, T, delta, tau float64, d regDerivs) Props {
	phi, pd, pdd, pt, ptt, pdt := d.f, d.fa, d.faa, d.fb, d.fbb, d.fab
	rt := R * T
	dd := delta * (pd - tau*pdt)     // δφδ − δτφδτ
	dp := delta * (2*pd + delta*pdd) // 2δφδ + δ²φδδ, the reduced (∂p/∂ρ)_T
	w2 := regJPerKJ * rt * (dp - dd*dd/(tau*tau*ptt))
	p := rho * rt * delta * pd / regKJPerMPaM3
	s := Props{
		P:      p,
		T:      T,
		V:      1 / rho,
		Rho:    rho,
		U:      rt * tau * pt,
		H:      rt * (tau*pt + delta*pd),
		S:      R * (tau*pt - phi),
		F:      rt * phi,
		G:      rt * (phi + delta*pd),
		Cv:     -R * tau * tau * ptt,
		Cp:     R * (-tau*tau*ptt + dd*dd/dp),
		W:      math.Sqrt(w2),
		AlphaV: dd / (dp * T),
		KappaT: regKJPerMPaM3 / (rho * rt * dp),
	}
	s.Kappa = w2 * rho / (p * regPaPerMPa)
	return s
}

// Limits of the regions, R7-97(2012) Fig. 1.
const (
	regTMin    = 273.15  // lowest temperature of regions 1 and 2, K
	regT13     = 623.15  // upper temperature of region 1, lower of region 3, K
	regTB23Max = 863.15  // upper end of the B23 line, K
	regT25     = 1073.15 // upper temperature of region 2, lower of region 5, K
	regTMax    = 2273.15 // upper temperature of region 5, K
	regPMax    = 100     // upper pressure of regions 1 to 3, MPa
	regP5Max   = 50      // upper pressure of region 5, MPa
)

// RegionOf returns the IF97 region, 1, 2, 3 or 5, whose basic equation covers
// the state at pressure p in MPa and temperature T in K, by the division of
// R7-97(2012) Fig. 1, or 0 when the state is outside the range of validity:
//
//	273.15 K ≤ T ≤ 1073.15 K, 0 < p ≤ 100 MPa (regions 1, 2, 3);
//	1073.15 K < T ≤ 2273.15 K, 0 < p ≤ 50 MPa (region 5).
//
// Up to 623.15 K the saturation line SatPressure(T) divides liquid (region 1,
// p ≥ ps) from vapour (region 2, p < ps): a state exactly on the line is
// reported as region 1, since a pair (p, T) on it does not fix the phase.
// From 623.15 K to 863.15 K the B23 line divides region 3 (p > B23Pressure(T))
// from region 2 (p ≤ B23Pressure(T)); the 623.15 K isotherm belongs to region
// 1 and the 1073.15 K isotherm to region 2. Region 4, the saturation line, is
// not a region of (p, T) states and is never returned. NaN inputs give 0.
func RegionOf(p, T float64) int {
	switch {
	case !(p > 0) || !(T >= regTMin):
		return 0
	case T <= regT13:
		if p > regPMax {
			return 0
		}
		if p >= SatPressure(T) {
			return 1
		}
		return 2
	case T <= regT25:
		if p > regPMax {
			return 0
		}
		if T <= regTB23Max && p > B23Pressure(T) {
			return 3
		}
		return 2
	case T <= regTMax && p <= regP5Max:
		return 5
	}
	return 0
}
