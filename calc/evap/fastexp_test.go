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
	for k := -1000; k <= 1000; k++ { // reduction boundaries: (k ± 1/2)·ln2/64
		for _, off := range []float64{-0.5, 0, 0.5} {
			x := (float64(k) + off) * math.Ln2 / 64
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
