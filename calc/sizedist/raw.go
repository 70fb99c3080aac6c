package sizedist

import (
	"fmt"
	"math"
	"slices"

	"fogbench/calc/valid"
)

// FromDiameters bins a list of individual drop diameters (m) into bins
// log-spaced classes (2..2000) from the smallest to the largest drop. Number
// fractions are counts/N; volume fractions are the exact Σ d³ of the drops
// in each class over the total, so Volume is not the class-average
// conversion of Number that FromFractions uses. If all drops have one size
// the range is widened to ±1 % with a warning. Errors: "distribution.diameters"
// (fewer than 2 drops, or a drop not finite and positive) and
// "distribution.bins".
func FromDiameters(d []float64, bins int) (*Binned, error) {
	if len(d) < 2 {
		return nil, valid.Errorf("distribution.diameters", float64(len(d)), "needs at least 2 drops")
	}
	if bins < MinBins || bins > MaxBins {
		return nil, valid.Errorf("distribution.bins", float64(bins), "must be between %d and %d", MinBins, MaxBins)
	}
	lo, hi := math.Inf(1), 0.0
	for i, x := range d {
		if !(x > 0) || math.IsInf(x, 0) {
			return nil, valid.Errorf("distribution.diameters", x, "drop %d must have a finite diameter above zero", i+1)
		}
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	var warn []string
	if hi/lo < 1+1e-9 {
		lo, hi = lo/1.01, hi*1.01
		warn = append(warn, "all drops have the same diameter; classes span ±1 % around it")
	}
	edges, err := Edges(lo, hi, bins, SpacingLog)
	if err != nil {
		return nil, err
	}
	b := &Binned{Edges: edges, Number: make([]float64, bins), Volume: make([]float64, bins), Warnings: warn}
	llo := math.Log(lo)
	scale := float64(bins) / (math.Log(hi) - llo)
	for _, x := range d {
		i := int((math.Log(x) - llo) * scale)
		i = max(0, min(bins-1, i))
		// Guard the rounding of the log at class edges.
		for i > 0 && x < edges[i] {
			i--
		}
		for i < bins-1 && x >= edges[i+1] {
			i++
		}
		b.Number[i]++
		r := x / hi
		b.Volume[i] += r * r * r
	}
	normalise(b.Number)
	normalise(b.Volume)
	return b, nil
}

// RawMeans gives the exact statistics of a list of drop diameters (m):
//
//	D_pq = (Σ d^p / Σ d^q)^(1/(p−q))       (Mugele & Evans 1951)
//
// over the drops themselves, no classes. The quantiles use the empirical
// inverse: Dv_F is the smallest drop d_(k) (sorted ascending) whose
// cumulative volume Σ_{j≤k} d_j³ / Σ d³ reaches F, and Dn50 the smallest
// d_(k) with k/N ≥ 0.5. Drops that are not finite and positive are skipped
// with a warning; with fewer than one valid drop the Summary is zero with a
// warning.
func RawMeans(d []float64) Summary {
	var s Summary
	ok := make([]float64, 0, len(d))
	bad := 0
	for _, x := range d {
		if x > 0 && !math.IsInf(x, 0) {
			ok = append(ok, x)
		} else {
			bad++
		}
	}
	if bad > 0 {
		s.Warnings = append(s.Warnings, fmt.Sprintf("%d drops without a finite positive diameter were skipped", bad))
	}
	if len(ok) == 0 {
		s.Warnings = append(s.Warnings, "no drops to describe")
		return s
	}
	slices.Sort(ok)
	ref := ok[len(ok)-1]
	var s0, s1, s2, s3, s4 float64
	for _, x := range ok {
		r := x / ref
		r2 := r * r
		s0++
		s1 += r
		s2 += r2
		s3 += r2 * r
		s4 += r2 * r2
	}
	s.D10 = ref * s1 / s0
	s.D20 = ref * math.Sqrt(s2/s0)
	s.D30 = ref * math.Cbrt(s3/s0)
	s.D21 = ref * s2 / s1
	s.D31 = ref * math.Sqrt(s3/s1)
	s.D32 = ref * s3 / s2
	s.D43 = ref * s4 / s3
	targets := [3]float64{0.1, 0.5, 0.9}
	dst := [3]*float64{&s.Dv10, &s.Dv50, &s.Dv90}
	var cum float64
	k := 0
	for _, x := range ok {
		r := x / ref
		cum += r * r * r
		for k < 3 && cum >= targets[k]*s3 {
			*dst[k] = x
			k++
		}
	}
	for ; k < 3; k++ {
		*dst[k] = ref
	}
	s.Dn50 = ok[max(0, int(math.Ceil(0.5*float64(len(ok))))-1)]
	s.setSpread()
	return s
}
