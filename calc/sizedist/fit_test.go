package sizedist

import (
	"math"
	"math/rand/v2"
	"testing"
)

// Fits recover the parameters of synthetic data cut from known models, with
// seeded multiplicative noise of 2 % (1σ) on each class's volume fraction.
// Tolerances are per parameter (rel), chosen from the noise level; the
// Nukiyama–Tanasawa exponents are strongly correlated, so for that family
// the check is on the fitted curve's D32 and Dv50 and on a noise-free fit.
func TestFitRecoversParameters(t *testing.T) {
	cases := []struct {
		m     Model
		dmin  float64
		dmax  float64
		noise float64
		tol   map[string]float64
	}{
		{RosinRammler{X: 90 * um, Q: 2.6}, 2 * um, 400 * um, 0.02, map[string]float64{"x_m": 0.02, "q": 0.04}},
		{LogNormal{Median: 45 * um, GSD: 1.7, Basis: BasisVolume}, 2 * um, 400 * um, 0.02, map[string]float64{"median_m": 0.02, "gsd": 0.03}},
		{UpperLimit{DMax: 250 * um, Dv50: 70 * um, Delta: 1.1}, 2 * um, 249 * um, 0.0, map[string]float64{"d_max_m": 0.01, "dv50_m": 0.01, "delta": 0.02}},
		{UpperLimit{DMax: 250 * um, Dv50: 70 * um, Delta: 1.1}, 2 * um, 249 * um, 0.02, map[string]float64{"dv50_m": 0.02}},
		{NukiyamaTanasawa{B: 1e5, P: 2, Q: 1}, 1 * um, 300 * um, 0, map[string]float64{"b": 0.05, "p": 0.05, "q": 0.05}},
		{NukiyamaTanasawa{B: 1e5, P: 2, Q: 1}, 1 * um, 300 * um, 0.02, nil},
	}
	rng := rand.New(rand.NewPCG(42, 43))
	for _, c := range cases {
		b, err := Cut(c.m, c.dmin, c.dmax, 40, SpacingLog)
		if err != nil {
			t.Fatal(err)
		}
		for i := range b.Volume {
			b.Volume[i] *= math.Max(0, 1+c.noise*rng.NormFloat64())
		}
		normalise(b.Volume)
		res, err := Fit(b, c.m.Name())
		if err != nil {
			t.Fatalf("%s: %v", c.m.Name(), err)
		}
		truth := families[c.m.Name()].params(c.m)
		for k, tol := range c.tol {
			near(t, c.m.Name()+" "+k, res.Params[k], truth[k], tol)
		}
		for _, pq := range [][2]float64{{3, 2}, {4, 3}} {
			want, _ := c.m.MeanDiameter(pq[0], pq[1])
			got, _ := res.Model.MeanDiameter(pq[0], pq[1])
			near(t, c.m.Name()+" fitted D_pq", got, want, 0.02+c.noise)
		}
		if res.R2 < 0.999 || res.RMS > 0.01 || len(res.Residuals) != len(b.Edges) {
			t.Errorf("%s: R² %g RMS %g, %d residuals", c.m.Name(), res.R2, res.RMS, len(res.Residuals))
		}
		t.Logf("%s noise %g: params %v R² %.6f RMS %.2e", c.m.Name(), c.noise, res.Params, res.R2, res.RMS)
	}
}

func TestFitErrors(t *testing.T) {
	b, _ := Cut(RosinRammler{X: 1e-4, Q: 2}, 1e-6, 1e-3, 10, SpacingLog)
	if _, err := Fit(b, "gamma"); err == nil {
		t.Error("unknown family accepted")
	} else {
		wantField(t, err, "distribution.family")
	}
	// A log-normal fitted to Rosin–Rammler data is imperfect but finite.
	res, err := Fit(b, "log-normal")
	if err != nil {
		t.Fatal(err)
	}
	if !(res.R2 > 0.9 && res.R2 < 1) || math.IsNaN(res.RMS) {
		t.Errorf("cross-family fit R² %g RMS %g", res.R2, res.RMS)
	}
}
