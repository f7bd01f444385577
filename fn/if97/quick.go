package if97

import "math"

// The solves of package fn for T at a given pressure (from (p,h) or (p,s))
// take one Newton step from the backward equation's estimate before the
// full property set is computed. That step needs h, s and cp only, which
// need only γ, γτ and γττ of the Gibbs free energy: about half the sums of
// Region1, Region2 or Region5. The functions below give just those, by the
// same equations and coefficients (R7-97(2012) Eq. 7 with Tables 2 and 3
// for region 1, Eq. 15 with Tables 10, 11 and 12 for region 2, Eq. 32 with
// Tables 37 to 39 for region 5).

// Region1HSCp returns the specific enthalpy (kJ/kg), specific entropy
// (kJ/(kg·K)) and isobaric heat capacity (kJ/(kg·K)) of region 1 at p (MPa)
// and T (K), the same values as Region1, without the other properties;
// and dcp/dT (kJ/(kg·K²)), for Halley steps.
func Region1HSCp(p, T float64) (h, s, cp, dcp float64) {
	pi, tau := p/r1PStar, r1TStar/T
	g, gt, gtt, gttt := regPolySumB(r1Coef[:], 7.1-pi, tau-1.222)
	return quickHSCp(T, tau, g, gt, gtt, gttt)
}

// Region2HSCp returns h, s and cp of region 2 at p (MPa) and T (K), as
// Region2 would, without the other properties.
func Region2HSCp(p, T float64) (h, s, cp, dcp float64) {
	pi, tau := p/r2PStar, r2TStar/T
	g0, gt0, gtt0, g30 := regPolySumB(r2IdealCoef[:], pi, tau)
	gr, gtr, gttr, g3r := regPolySumB(r2ResidualCoef[:], pi, tau-0.5)
	return quickHSCp(T, tau, g0+math.Log(pi)+gr, gt0+gtr, gtt0+gttr, g30+g3r)
}

// Region5HSCp returns h, s and cp of region 5 at p (MPa) and T (K), as
// Region5 would (R7-97(2012) Eq. 32, Tables 37 to 39), without the other
// properties.
func Region5HSCp(p, T float64) (h, s, cp, dcp float64) {
	pi, tau := p/r5PStar, r5TStar/T
	g0, gt0, gtt0, g30 := regPolySumB(r5IdealCoef[:], pi, tau)
	gr, gtr, gttr, g3r := regPolySumB(r5ResidualCoef[:], pi, tau)
	return quickHSCp(T, tau, g0+math.Log(pi)+gr, gt0+gtr, gtt0+gttr, g30+g3r)
}

// quickHSCp applies the relations of R7-97(2012) Table 3 for h, s and cp,
// and dcp/dT = (R τ²/T)(2γττ + τ γτττ), from cp = −R τ² γττ with
// dτ/dT = −τ/T.
func quickHSCp(T, tau, g, gt, gtt, gttt float64) (h, s, cp, dcp float64) {
	return R * T * tau * gt, R * (tau*gt - g), -R * tau * tau * gtt, R * tau * tau / T * (2*gtt + tau*gttt)
}

// regPolySumB returns Σ n·a^I·b^J over rows and its first three
// derivatives in b only, summed as regPolySum does (one power of b a row,
// the exponent factors, and the powers of 1/b at the end).
func regPolySumB(rows []term, a, b float64) (f, fb, fbb, fbbb float64) {
	if b == 0 {
		return regPolySumBZero(rows, a)
	}
	var sb, sbb, sbbb float64
	lastI, aI := 0, 1.0
	for _, r := range rows {
		if r.I != lastI {
			lastI, aI = r.I, powi(a, r.I)
		}
		t := r.n * aI * powi(b, r.J)
		j := float64(r.J)
		f += t
		sb += j * t
		sbb += j * (j - 1) * t
		sbbb += j * (j - 1) * (j - 2) * t
	}
	ib := 1 / b
	return f, sb * ib, sbb * ib * ib, sbbb * ib * ib * ib
}

// regPolySumBZero is regPolySumB at b = 0, where only the rows with J ≤ 3
// count: the derivative of order J of b^J is J! there.
func regPolySumBZero(rows []term, a float64) (f, fb, fbb, fbbb float64) {
	for _, r := range rows {
		na := r.n * powi(a, r.I)
		switch r.J {
		case 0:
			f += na
		case 1:
			fb += na
		case 2:
			fbb += 2 * na
		case 3:
			fbbb += 6 * na
		}
	}
	return f, fb, fbb, fbbb
}
