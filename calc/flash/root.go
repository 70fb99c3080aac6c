package flash

import "math"

// bisect finds a root of f between a and b, where fa = f(a) and fb = f(b)
// have opposite signs (or one is zero), to |b − a| ≤ tol. Bisection is slow
// but cannot leave the bracket, and the functions here are cheap; every
// caller brackets first, so it always converges (about 60 halvings at most
// for the tolerances used).
func bisect(f func(float64) float64, a, b, fa, fb, tol float64) float64 {
	if fa == 0 {
		return a
	}
	if fb == 0 {
		return b
	}
	for i := 0; i < 200 && math.Abs(b-a) > tol; i++ {
		m := 0.5 * (a + b)
		fm := f(m)
		if fm == 0 {
			return m
		}
		if (fm < 0) == (fa < 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return 0.5 * (a + b)
}
