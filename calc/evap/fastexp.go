package evap

import "math"

// expTableBits sets the table of expFast: 2^(j/256) for j = 0..255.
const expTableBits = 8

var exp2Table = func() (t [1 << expTableBits]float64) {
	for j := range t {
		t[j] = math.Exp2(float64(j) / (1 << expTableBits))
	}
	return
}()

// Constants of expFast: N/ln 2 and ln 2/N split in two so that k·hi is
// exact for |k| < 2^21 (hi has its 21 low mantissa bits zero; lo is the
// rest of ln 2/256 to double precision, computed with 50-digit decimals;
// both are the ln 2/64 pair divided by 4, exactly).
const (
	expInvLn2N = (1 << expTableBits) / math.Ln2
	expLn2NHi  = 0.01083042469326756 / 4
	expLn2NLo  = 2.9815858269852933e-12 / 4
)

// expFast returns e^x for the history sweep's diameter lookups, where
// math.Exp was the largest single cost (docs/performance.md). It uses the
// standard reduction x = (256m + j)·ln2/256 + r, |r| ≤ ln2/512, then
// e^x = 2^m · 2^(j/256) · e^r with e^r − 1 by its Taylor polynomial to r⁴
// (truncation below 4e-17 relative), evaluated in two independent halves
// to shorten the chain of dependent multiplications. The result is within
// 3 ulp of math.Exp (TestExpFastMatchesExp; measured at most 2); outside
// −700 < x < 700 (and for NaN) it is math.Exp itself.
func expFast(x float64) float64 {
	if !(x > -700 && x < 700) {
		return math.Exp(x)
	}
	kf := math.RoundToEven(x * expInvLn2N)
	k := int64(kf)
	r := (x - kf*expLn2NHi) - kf*expLn2NLo
	r2 := r * r
	p := r + r2*(0.5+r*(1.0/6)) + (r2*r2)*(1.0/24)
	t := exp2Table[k&(1<<expTableBits-1)]
	y := t + t*p
	return math.Float64frombits(math.Float64bits(y) + uint64(k>>expTableBits)<<52)
}

// logTableBits sets the table of logFast: centres c_j = 1 + (j + ½)/256 of
// the mantissa intervals [1 + j/256, 1 + (j+1)/256), with 1/c_j and ln c_j.
const logTableBits = 8

var logTable = func() (t [1 << logTableBits]struct{ c, invC, lnC float64 }) {
	for j := range t {
		c := 1 + (float64(j)+0.5)/(1<<logTableBits)
		t[j].c, t[j].invC, t[j].lnC = c, 1/c, math.Log(c)
	}
	return
}()

// ln 2 split so that e·logLn2Hi is exact for every binary exponent e of a
// float64 (logLn2Hi has its 32 low mantissa bits zero; the pair is the
// fdlibm split of ln 2).
const (
	logLn2Hi = 6.93147180369123816490e-01
	logLn2Lo = 1.90821492927058770002e-10
)

// logFast returns ln x for the history sweep, where math.Log of each bin's
// remaining evaporation time was a fixed share of every time step
// (docs/performance.md). With x = 2^e·m, m ∈ [1, 2), and c the centre of
// m's interval in a 256-entry table, ln x = e·ln 2 + ln c + ln(1 + r),
// r = (m − c)/c, |r| ≤ 1/513, and ln(1 + r) is its Taylor polynomial to r⁵
// (truncation below 1e-17 absolute), evaluated in two independent halves.
// m − c is exact, so the result is within
// a few units of the last place of the larger of |ln x| and ln 2 of math.Log
// (TestLogFastMatchesLog). Zero, negative, subnormal, infinite and NaN
// arguments are math.Log's.
func logFast(x float64) float64 {
	if !(x >= 0x1p-1022 && x <= math.MaxFloat64) {
		return math.Log(x)
	}
	b := math.Float64bits(x)
	e := float64(int64(b>>52) - 1023)
	t := &logTable[(b>>(52-logTableBits))&(1<<logTableBits-1)]
	m := math.Float64frombits(b&(1<<52-1) | 1023<<52)
	r := (m - t.c) * t.invC
	r2 := r * r
	p := r + r2*(r*(1.0/3)-0.5) + (r2*r2)*(r*0.2-0.25)
	return e*logLn2Hi + (t.lnC + (p + e*logLn2Lo))
}
