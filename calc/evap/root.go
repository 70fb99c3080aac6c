package evap

import "fogbench/calc/numeric"

// brent is numeric.Brent (Brent 1973, ch. 4) with the iteration budget the
// evaporation solvers use; it returns an error when the root is not
// bracketed or f gives NaN.
func brent(f func(float64) float64, a, b, fa, fb, xtol float64) (float64, error) {
	x, _, err := numeric.Brent(f, a, b, fa, fb, xtol, 200)
	return x, err
}
