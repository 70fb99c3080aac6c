package fluid

import "math"

// powFromLog returns math.Pow(x, y) given lx = math.Log(x), so that several
// non-integer powers of one base share a single logarithm. It takes the
// steps of math.Pow itself: y is split into an integer part n and a
// fraction f in [-0.5, 0.5], x^f = exp(f lx), x^n by repeated squaring, and
// 1/x^|y| for y < 0. For x in [2^-100, 2^100] and |y| <= 8, where no step
// leaves the normal range, math.Pow's scaling by powers of two is exact and
// the result is math.Pow's to the bit (TestPowFromLog checks it against
// math.Pow over seeded arguments); elsewhere it calls math.Pow.
func powFromLog(x, lx, y float64) float64 {
	if !(x >= 0x1p-100 && x <= 0x1p100) || !(math.Abs(y) <= 8) || y == 0.5 || y == -0.5 || y == 0 || x == 1 {
		return math.Pow(x, y)
	}
	n, f := math.Modf(math.Abs(y))
	a := 1.0
	if f != 0 {
		if f > 0.5 {
			f--
			n++
		}
		a = math.Exp(f * lx)
	}
	for i, xx := int64(n), x; i != 0; i >>= 1 {
		if i&1 == 1 {
			a *= xx
		}
		xx *= xx
	}
	if y < 0 {
		a = 1 / a
	}
	return a
}
