package flash

import "fogbench/calc/numeric"

// bisect finds a root of f between a and b, where fa = f(a) and fb = f(b)
// have opposite signs (or one is zero), to about tol in x, with
// numeric.Brent (Brent 1973, ch. 4), which never leaves the bracket. Every
// caller brackets first, so the root exists.
func bisect(f func(float64) float64, a, b, fa, fb, tol float64) float64 {
	x, _, _ := numeric.Brent(f, a, b, fa, fb, tol, 200)
	return x
}
