package evap

import (
	"errors"
	"math"
)

var errNoBracket = errors.New("evap: root not bracketed")

// brent returns a root of f in [a, b] where f(a) = fa and f(b) = fb have
// opposite signs (or one is zero), to an absolute tolerance xtol in x. It is
// Brent's method (Brent, Algorithms for Minimization without Derivatives,
// 1973, ch. 4): inverse quadratic interpolation or secant steps kept inside
// the shrinking bracket, falling back to bisection, so it converges for any
// continuous f. A NaN from f stops it with an error.
func brent(f func(float64) float64, a, b, fa, fb, xtol float64) (float64, error) {
	const maxIter = 200
	if fa == 0 {
		return a, nil
	}
	if fb == 0 {
		return b, nil
	}
	if math.IsNaN(fa) || math.IsNaN(fb) || (fa > 0) == (fb > 0) {
		return math.NaN(), errNoBracket
	}
	c, fc := b, fb
	var d, e float64
	for i := 0; i < maxIter; i++ {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol := 2*2.220446049250313e-16*math.Abs(b) + 0.5*xtol
		xm := 0.5 * (c - b)
		if math.Abs(xm) <= tol || fb == 0 {
			return b, nil
		}
		if math.Abs(e) >= tol && math.Abs(fa) > math.Abs(fb) {
			s := fb / fa
			var p, q float64
			if a == c {
				p = 2 * xm * s
				q = 1 - s
			} else {
				q = fa / fc
				r := fb / fc
				p = s * (2*xm*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*xm*q-math.Abs(tol*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = xm
				e = d
			}
		} else {
			d = xm
			e = d
		}
		a, fa = b, fb
		if math.Abs(d) > tol {
			b += d
		} else {
			b += math.Copysign(tol, xm)
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return math.NaN(), errors.New("evap: function returned NaN during root search")
		}
	}
	return b, nil
}
