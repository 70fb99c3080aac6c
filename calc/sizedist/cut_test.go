package sizedist

import (
	"fmt"
	"math"
	"strings"
	"testing"
)

// Binned means and quantiles converge to the closed forms of the
// Rosin–Rammler volume distribution (Rosin & Rammler 1933) as the classes
// are refined (the model's own closed forms are the reference; the tails outside 0.01–400 µm hold < 1e-13 of the
// volume). The error must shrink at each refinement, at second order in the
// class width for the means (a fivefold refinement cuts it at least
// 15-fold; 25 is the asymptote; quantiles at least 5-fold, as their error
// also depends on where F falls inside a class), and be below the named tolerance at 1000 classes.
func TestCutConvergesToClosedForm(t *testing.T) {
	const finestTol = 2e-4
	r := RosinRammler{X: 100 * um, Q: 3.5}
	type stat struct {
		name   string
		shrink float64
		exact  float64
		get    func(*Binned) float64
	}
	mean := func(p, q float64) func(*Binned) float64 {
		return func(b *Binned) float64 { d, _ := b.MeanDiameter(p, q); return d }
	}
	exact := func(p, q float64) float64 { d, _ := r.MeanDiameter(p, q); return d }
	stats := []stat{
		{"D32", 15, exact(3, 2), mean(3, 2)},
		{"D43", 15, exact(4, 3), mean(4, 3)},
		{"D31", 15, exact(3, 1), mean(3, 1)},
		{"Dv10", 5, r.VolumeQuantile(0.1), func(b *Binned) float64 { return b.VolumeQuantile(0.1) }},
		{"Dv50", 5, r.VolumeQuantile(0.5), func(b *Binned) float64 { return b.VolumeQuantile(0.5) }},
		{"Dv90", 5, r.VolumeQuantile(0.9), func(b *Binned) float64 { return b.VolumeQuantile(0.9) }},
	}
	prev := make([]float64, len(stats))
	for k, bins := range []int{40, 200, 1000} {
		b, err := Cut(r, 0.01*um, 400*um, bins, SpacingLog)
		if err != nil {
			t.Fatal(err)
		}
		var line []string
		for i, s := range stats {
			e := math.Abs(s.get(b)/s.exact - 1)
			line = append(line, fmt.Sprintf("%s %.2e", s.name, e))
			if k > 0 && !(e*s.shrink < prev[i]) {
				t.Errorf("%d classes: %s error %.3g did not shrink %g-fold from %.3g", bins, s.name, e, s.shrink, prev[i])
			}
			if bins == 1000 && e > finestTol {
				t.Errorf("1000 classes: %s rel error %.3g above %g", s.name, e, finestTol)
			}
			prev[i] = e
		}
		t.Logf("%4d classes: %s", bins, strings.Join(line, ", "))
	}
}

// Mass balance: fractions sum to 1 and the truncated tails plus the cut
// range hold the whole model volume, for both spacings.
func TestCutMassBalance(t *testing.T) {
	r := RosinRammler{X: 60 * um, Q: 2}
	for _, sp := range []Spacing{SpacingLog, SpacingLinear} {
		b, err := Cut(r, 20*um, 90*um, 17, sp)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "Σv", sumOf(b.Volume), 1, 1e-13)
		near(t, "Σn", sumOf(b.Number), 1, 1e-13)
		inRange := r.VolumeCDF(90*um) - r.VolumeCDF(20*um)
		near(t, "tails+range", b.TruncatedBelow+b.TruncatedAbove+inRange, 1, 1e-13)
		near(t, "v_0", b.Volume[0], (r.VolumeCDF(b.Edges[1])-r.VolumeCDF(b.Edges[0]))/inRange, 1e-12)
		if len(b.Warnings) == 0 || !strings.Contains(b.Warnings[0], "outside") {
			t.Errorf("%s: no truncation warning: %q", sp, b.Warnings)
		}
		if b.Len() != 17 || len(b.Edges) != 18 || b.Edges[17] != 90*um {
			t.Errorf("%s: %d classes, last edge %g", sp, b.Len(), b.Edges[len(b.Edges)-1])
		}
	}
}

func TestCutErrors(t *testing.T) {
	r := RosinRammler{X: 60 * um, Q: 2}
	for _, c := range []struct {
		m          Model
		dmin, dmax float64
		bins       int
		sp         Spacing
		field      string
	}{
		{r, 0, 1e-4, 10, SpacingLog, "distribution.d_min_m"},
		{r, 1e-6, math.NaN(), 10, SpacingLog, "distribution.d_max_m"},
		{r, 1e-4, 1e-5, 10, SpacingLog, "distribution.d_max_m"},
		{r, 1e-6, 1e-4, 1, SpacingLog, "distribution.bins"},
		{r, 1e-6, 1e-4, 2001, SpacingLog, "distribution.bins"},
		{r, 1e-6, 1e-4, 10, "cubic", "distribution.spacing"},
		{RosinRammler{X: -1, Q: 2}, 1e-6, 1e-4, 10, SpacingLog, "distribution.x_m"},
		{r, 10, 20, 10, SpacingLog, "distribution.d_max_m"}, // no volume in 10–20 m
		{nil, 1e-6, 1e-4, 10, SpacingLog, "distribution.family"},
	} {
		b, err := Cut(c.m, c.dmin, c.dmax, c.bins, c.sp)
		if b != nil || err == nil {
			t.Errorf("%+v: want error", c)
			continue
		}
		wantField(t, err, c.field)
	}
}
