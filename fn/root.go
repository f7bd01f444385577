package fn

import "math"

// rootBracketed finds x in [lo, hi] with f(x) = 0, where f(lo) and f(hi)
// have opposite signs (flo, fhi given), by Newton steps on f's derivative
// where they stay inside the bracket and bisection where they do not
// (a safeguarded Newton method, e.g. Press et al., Numerical Recipes,
// "rtsafe"). f returns the value and the derivative. It stops when the step
// is below tol·|x| and reports false if the bracket is invalid or 200 steps
// do not suffice.
func rootBracketed(f func(x float64) (fx, dfx float64), lo, hi, flo, fhi, x0, tol float64) (float64, bool) {
	if math.IsNaN(flo) || math.IsNaN(fhi) || flo*fhi > 0 {
		return 0, false
	}
	if flo == 0 {
		return lo, true
	}
	if fhi == 0 {
		return hi, true
	}
	if flo > 0 { // orient so that f(lo) < 0 < f(hi)
		lo, hi = hi, lo
	}
	x := x0
	if !(x > math.Min(lo, hi) && x < math.Max(lo, hi)) {
		x = (lo + hi) / 2
	}
	dxOld := math.Abs(hi - lo)
	dx := dxOld
	fx, dfx := f(x)
	for it := 0; it < 200; it++ {
		if math.IsNaN(fx) {
			return x, false
		}
		if fx == 0 {
			return x, true
		}
		if fx < 0 {
			lo = x
		} else {
			hi = x
		}
		// Bisect when Newton would leave the bracket or converges too slowly.
		if dfx == 0 || math.IsNaN(dfx) || ((x-hi)*dfx-fx)*((x-lo)*dfx-fx) > 0 || math.Abs(2*fx) > math.Abs(dxOld*dfx) {
			dxOld = dx
			dx = (hi - lo) / 2
			x = lo + dx
		} else {
			dxOld = dx
			dx = -fx / dfx
			x += dx
		}
		if math.Abs(dx) <= tol*math.Abs(x) || lo == hi {
			return x, true
		}
		fx, dfx = f(x)
	}
	return x, false
}

// rootBrent finds x in [a, b] with f(x) = 0 by Brent's method (R. P. Brent,
// Algorithms for Minimization without Derivatives, 1973, ch. 4), where
// f(a) = fa and f(b) = fb have opposite signs. It stops when the bracket is
// below tol·|x| and reports false if the bracket is invalid, f returns NaN
// or 200 steps do not suffice.
func rootBrent(f func(float64) float64, a, b, fa, fb, tol float64) (float64, bool) {
	if math.IsNaN(fa) || math.IsNaN(fb) || fa*fb > 0 {
		return 0, false
	}
	if fa == 0 {
		return a, true
	}
	if fb == 0 {
		return b, true
	}
	c, fc := a, fa
	d := b - a
	e := d
	for it := 0; it < 200; it++ {
		if fb*fc > 0 {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*2.2e-16*math.Abs(b) + tol*math.Abs(b)/2
		xm := (c - b) / 2
		if math.Abs(xm) <= tol1 || fb == 0 {
			return b, true
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			var p, q, r float64
			s := fb / fa
			if a == c {
				p, q = 2*xm*s, 1-s
			} else {
				q, r = fa/fc, fb/fc
				p = s * (2*xm*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			}
			p = math.Abs(p)
			if 2*p < math.Min(3*xm*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e, d = d, p/q
			} else {
				d, e = xm, xm
			}
		} else {
			d, e = xm, xm
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else {
			b += math.Copysign(tol1, xm)
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return b, false
		}
	}
	return b, false
}
