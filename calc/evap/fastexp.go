package evap

import "math"

// expTableBits sets the table of expFast: 2^(j/64) for j = 0..63.
const expTableBits = 6

var exp2Table = func() (t [1 << expTableBits]float64) {
	for j := range t {
		t[j] = math.Exp2(float64(j) / (1 << expTableBits))
	}
	return
}()

// Constants of expFast: N/ln 2 and ln 2/N split in two so that k·hi is
// exact for |k| < 2^21 (hi has its 21 low mantissa bits zero; lo is the
// rest of ln 2/64 to double precision, computed with 50-digit decimals).
const (
	expInvLn2N = (1 << expTableBits) / math.Ln2
	expLn2NHi  = 0.01083042469326756
	expLn2NLo  = 2.9815858269852933e-12
)

// expFast returns e^x for the history sweep's diameter lookups, where
// math.Exp was the largest single cost (docs/performance.md). It uses the
// standard reduction x = (64m + j)·ln2/64 + r, |r| ≤ ln2/128, then
// e^x = 2^m · 2^(j/64) · e^r with e^r − 1 by its Taylor polynomial to r⁶
// (truncation below 4e-17 relative). The result is within 3 ulp of
// math.Exp (TestExpFastMatchesExp; measured at most 2); outside
// −700 < x < 700 (and for NaN) it is math.Exp itself.
func expFast(x float64) float64 {
	if !(x > -700 && x < 700) {
		return math.Exp(x)
	}
	kf := math.RoundToEven(x * expInvLn2N)
	k := int64(kf)
	r := (x - kf*expLn2NHi) - kf*expLn2NLo
	p := r + r*r*(0.5+r*(1.0/6+r*(1.0/24+r*(1.0/120+r*(1.0/720)))))
	t := exp2Table[k&(1<<expTableBits-1)]
	y := t + t*p
	return math.Float64frombits(math.Float64bits(y) + uint64(k>>expTableBits)<<52)
}
