// Package numeric holds the small numerical routines several calc packages
// share: a bracketed root finder and the real roots of a cubic. Each states
// its method and source.
package numeric

import (
	"errors"
	"math"
)

// Errors of Brent.
var (
	ErrNotBracketed = errors.New("root not bracketed: f(a) and f(b) have the same sign")
	ErrNoConverge   = errors.New("root finder did not converge")
)

// Brent finds x in [a, b] with f(x) = 0 by Brent's method (Brent, R. P.,
// Algorithms for Minimization without Derivatives, Prentice-Hall 1973,
// ch. 4, procedure zero): inverse quadratic interpolation or secant steps,
// falling back to bisection whenever they do not shrink the bracket fast
// enough, so it converges whenever f is continuous and f(a), f(b) differ in
// sign. fa and fb are f(a) and f(b). It stops when the bracket is narrower
// than 4 eps |x| + xtol, or f(x) = 0 exactly. It returns ErrNotBracketed
// when fa and fb have the same sign (or either is NaN), and ErrNoConverge
// after maxIter steps or when f returns NaN.
func Brent(f func(float64) float64, a, b, fa, fb, xtol float64, maxIter int) (x float64, iter int, err error) {
	if math.IsNaN(fa) || math.IsNaN(fb) || (fa > 0) == (fb > 0) && fa != 0 && fb != 0 {
		return 0, 0, ErrNotBracketed
	}
	if fa == 0 {
		return a, 0, nil
	}
	if fb == 0 {
		return b, 0, nil
	}
	c, fc := a, fa
	d := b - a
	e := d
	for iter = 1; iter <= maxIter; iter++ {
		if (fb > 0) == (fc > 0) {
			// Keep the root between b and c.
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			// Make b the best estimate so far.
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*2.220446049250313e-16*math.Abs(b) + 0.5*xtol
		m := 0.5 * (c - b)
		if math.Abs(m) <= tol1 || fb == 0 {
			return b, iter, nil
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			var p, q float64
			s := fb / fa
			if a == c {
				// Secant step.
				p = 2 * m * s
				q = 1 - s
			} else {
				// Inverse quadratic interpolation.
				qq := fa / fc
				r := fb / fc
				p = s * (2*m*qq*(qq-r) - (b-a)*(r-1))
				q = (qq - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < math.Min(3*m*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = m
				e = m
			}
		} else {
			d = m
			e = m
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if m > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		fb = f(b)
		if math.IsNaN(fb) {
			return b, iter, ErrNoConverge
		}
	}
	return b, maxIter, ErrNoConverge
}
