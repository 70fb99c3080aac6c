package evap

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestExpFastMatchesExp holds expFast within 3 ulp of math.Exp (itself
// within 1 ulp of e^x, per its documentation) over seeded arguments across
// its whole range and at the edges of the table reduction, and checks it
// hands NaN, ±Inf and |x| ≥ 700 to math.Exp.
func TestExpFastMatchesExp(t *testing.T) {
	const tolULP = 3
	rng := rand.New(rand.NewPCG(3, 5))
	var xs []float64
	for range 200000 {
		xs = append(xs, -700+1400*rng.Float64(), -40+50*rng.Float64())
	}
	for k := -4000; k <= 4000; k++ { // reduction boundaries: (k ± 1/2)·ln2/256
		for _, off := range []float64{-0.5, 0, 0.5} {
			x := (float64(k) + off) * math.Ln2 / 256
			xs = append(xs, math.Nextafter(x, -1), x, math.Nextafter(x, 1))
		}
	}
	worst := 0.0
	for _, x := range xs {
		got, want := expFast(x), math.Exp(x)
		ulp := math.Nextafter(want, math.Inf(1)) - want
		if u := math.Abs(got-want) / ulp; u > worst {
			worst = u
		}
	}
	if worst > tolULP {
		t.Errorf("expFast differs from math.Exp by %.1f ulp, more than %d", worst, tolULP)
	}
	t.Logf("largest difference from math.Exp: %.0f ulp over %d arguments", worst, len(xs))
	for _, x := range []float64{math.NaN(), math.Inf(1), math.Inf(-1), 700, -700, 710, -750, 0} {
		got, want := expFast(x), math.Exp(x)
		if !(got == want || math.IsNaN(got) && math.IsNaN(want)) {
			t.Errorf("expFast(%v) = %v, math.Exp gives %v", x, got, want)
		}
	}
}

// TestLogFastMatchesLog holds logFast within 2 ulp of max(|ln x|, ln 2) of
// math.Log (itself within 1 ulp of ln x, per its documentation) over seeded
// arguments across the normal range, near 1 and at the edges of the table
// intervals, and checks it hands zero, negatives, subnormals, ±Inf and NaN
// to math.Log.
func TestLogFastMatchesLog(t *testing.T) {
	const tolULP = 2
	rng := rand.New(rand.NewPCG(7, 11))
	var xs []float64
	for range 200000 {
		xs = append(xs, math.Exp(-708+1416*rng.Float64()), math.Exp(-30+35*rng.Float64()), 0.9+0.2*rng.Float64())
	}
	for e := -1022; e <= 1023; e += 7 {
		for j := 0; j <= 256; j++ { // interval edges 1 + j/256
			x := math.Ldexp(1+float64(j)/256, e)
			if j == 256 && e == 1023 {
				continue
			}
			xs = append(xs, math.Nextafter(x, 0), x, math.Nextafter(x, math.Inf(1)))
		}
	}
	xs = append(xs, 1, 0x1p-1022, math.MaxFloat64)
	worst := 0.0
	for _, x := range xs {
		got, want := logFast(x), math.Log(x)
		scale := math.Max(math.Abs(want), math.Ln2)
		ulp := math.Nextafter(scale, math.Inf(1)) - scale
		if u := math.Abs(got-want) / ulp; u > worst {
			worst = u
		}
	}
	if worst > tolULP {
		t.Errorf("logFast differs from math.Log by %.2f ulp of max(|ln x|, ln 2), more than %d", worst, tolULP)
	}
	t.Logf("largest difference from math.Log: %.2f ulp of max(|ln x|, ln 2) over %d arguments", worst, len(xs))
	for _, x := range []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, -1, 0x1p-1074, 0x1p-1023} {
		got, want := logFast(x), math.Log(x)
		if !(got == want || math.IsNaN(got) && math.IsNaN(want)) {
			t.Errorf("logFast(%v) = %v, math.Log gives %v", x, got, want)
		}
	}
}
