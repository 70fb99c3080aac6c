package evap

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// sharedTransientTol is the Dormand–Prince tolerance of the heating phase
// (rtol 1e-7): the scaled shared path may differ from each bin's own
// integration by rounding only, and must stay within what the integrator
// itself guarantees.
const sharedTransientTol = 1e-7

// sharedTransientCase returns seeded flat, continuum, no-slip conditions
// (where every bin's heating path is the same in t/d0²) and a spray.
func sharedTransientCase(rng *rand.Rand) (*Conditions, []float64, []float64, HistoryOptions) {
	c := waterInAir()
	c.Gas = airFilm(0.7+0.6*rng.Float64(), 1006+1000*rng.Float64())
	c.Curvature, c.Transition = false, false
	c.GasTemperature += 40 * rng.Float64()
	c.VaporMoleFraction = 0.01 * rng.Float64()
	if rng.IntN(2) == 0 {
		c.Convection = ConvectionRanzMarshall // with no slip, Sh = Nu = 2
	}
	d, w, opts := seededTransientSpray(rng, 121)
	return c, d, w, opts
}

// seededTransientSpray returns 2 to maxBins log-spaced bins (smallest
// 0.3–30 µm, spans 2–502) with random volume fractions, and transient
// options with an injection temperature of 275–320 K and 50–299 steps.
func seededTransientSpray(rng *rand.Rand, maxBins int) (d, w []float64, opts HistoryOptions) {
	n := 2 + rng.IntN(maxBins-1)
	lo := 0.3e-6 * math.Pow(100, rng.Float64())
	span := 2 + 500*rng.Float64()
	d = make([]float64, n)
	w = make([]float64, n)
	for i := range d {
		d[i] = lo * math.Pow(span, float64(i)/float64(n-1))
		w[i] = rng.Float64()
	}
	opts = HistoryOptions{Transient: true, InjectionTemperature: 275 + 45*rng.Float64(), Steps: 50 + rng.IntN(250)}
	return d, w, opts
}

// fastAndDirect builds the spray twice, once with every bin's heating
// phase integrated on its own, and returns both with their histories.
func fastAndDirect(t *testing.T, trial int, c *Conditions, d, w []float64, opts HistoryOptions) (fast, direct *Spray, hf, hd History) {
	t.Helper()
	fast, err := c.NewSpray(d, w, opts)
	if err != nil {
		t.Fatal(err)
	}
	direct, err = c.NewSpray(d, w, opts)
	if err != nil {
		t.Fatal(err)
	}
	direct.sp.directTransient = true
	if hf, err = fast.History(0); err != nil {
		t.Fatalf("trial %d: %v", trial, err)
	}
	if hd, err = direct.History(0); err != nil {
		t.Fatalf("trial %d: %v", trial, err)
	}
	return fast, direct, hf, hd
}

// Every bin's scaled shared heating path agrees with its own integration:
// each bin's remaining mass and diameter on the history grid and between
// its points, the spray's evaporated mass fraction, D32, Dv50, t50/t90/t99
// and the warnings, over seeded sprays.
func TestSharedTransientMatchesDirect(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 2026))
	worst := 0.0
	for trial := 0; trial < 40; trial++ {
		c, d, w, opts := sharedTransientCase(rng)
		shared, direct, hs, hd := fastAndDirect(t, trial, c, d, w, opts)
		n := len(d)
		if &shared.sp.tr[0].s[0] != &shared.sp.tr[n-1].s[0] {
			t.Fatalf("trial %d: the bins do not share the largest bin's path", trial)
		}
		if &direct.sp.tr[0].s[0] == &direct.sp.tr[n-1].s[0] {
			t.Fatalf("trial %d: the direct spray shares a path", trial)
		}
		if !slices.Equal(hs.Warnings, hd.Warnings) {
			t.Fatalf("trial %d: warnings %q, direct %q", trial, hs.Warnings, hd.Warnings)
		}
		for _, x := range [][2]float64{{hs.T50, hd.T50}, {hs.T90, hd.T90}, {hs.T99, hd.T99}} {
			worst = math.Max(worst, math.Abs(x[0]/x[1]-1))
			if !scalar.EqualWithinAbsOrRel(x[0], x[1], 0, sharedTransientTol) {
				t.Fatalf("trial %d: t50/t90/t99 %v, direct %v", trial, x[0], x[1])
			}
		}
		if len(hs.T) != len(hd.T) {
			t.Fatalf("trial %d: %d time points, direct %d", trial, len(hs.T), len(hd.T))
		}
		for j := range hs.T {
			for _, x := range [][2]float64{{hs.T[j], hd.T[j]}, {hs.D32[j], hd.D32[j]}, {hs.Dv50[j], hd.Dv50[j]}} {
				if !scalar.EqualWithinAbsOrRel(x[0], x[1], 1e-15, sharedTransientTol) {
					t.Fatalf("trial %d, step %d: %v, direct %v", trial, j, x[0], x[1])
				}
			}
			e := math.Abs(hs.EvaporatedMassFraction[j] - hd.EvaporatedMassFraction[j])
			worst = math.Max(worst, e)
			if e > sharedTransientTol {
				t.Fatalf("trial %d, t=%g: evaporated %.12f, direct %.12f", trial, hs.T[j], hs.EvaporatedMassFraction[j], hd.EvaporatedMassFraction[j])
			}
		}
		for i := range d {
			for j := 1; j < len(hs.T); j++ {
				for _, tt := range []float64{hs.T[j], 0.5 * (hs.T[j-1] + hs.T[j])} {
					cs, cd := -1, -1
					ds, fs := shared.sp.state(i, tt, &cs)
					dd, fd := direct.sp.state(i, tt, &cd)
					worst = math.Max(worst, math.Abs(fs-fd))
					if math.Abs(fs-fd) > sharedTransientTol || !scalar.EqualWithinAbsOrRel(ds, dd, 1e-15, sharedTransientTol) {
						t.Fatalf("trial %d, bin %d (%.3g m), t=%g: d %.10g frac %.12f, direct d %.10g frac %.12f", trial, i, d[i], tt, ds, fs, dd, fd)
					}
				}
			}
		}
	}
	t.Logf("largest difference from the per-bin integration: %.3g", worst)
}

// With the Kelvin or transition factor, or slip, the heating path depends
// on the size beyond the factor d, and every bin is integrated on its own.
func TestSharedTransientOnlyWhenSimilar(t *testing.T) {
	d := []float64{2e-6, 10e-6, 50e-6}
	w := []float64{1, 1, 1}
	for name, set := range map[string]func(*Conditions){
		"kelvin":     func(c *Conditions) { c.Curvature = true },
		"transition": func(c *Conditions) { c.Transition = true },
		"slip":       func(c *Conditions) { c.RelativeVelocity = 1 },
	} {
		c := waterInAir()
		c.Curvature = false
		set(c)
		s, err := c.NewSpray(d, w, HistoryOptions{Transient: true, InjectionTemperature: 290})
		if err != nil {
			t.Fatal(err)
		}
		if _, err := s.History(0); err != nil {
			t.Fatal(err)
		}
		if &s.sp.tr[0].s[0] == &s.sp.tr[2].s[0] {
			t.Errorf("%s: the bins share a heating path", name)
		}
	}
}

// fraction is at's remaining mass fraction bit for bit, before, between,
// at and after the stored steps, for paths that join the table and for
// paths that evaporate first.
func TestTransientFractionMatchesAt(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	checked := 0
	for _, curved := range []bool{false, true} {
		c := waterInAir()
		c.Curvature = curved
		s, err := c.NewSpray([]float64{0.4e-6, 5e-6, 40e-6, 120e-6}, []float64{1, 1, 1, 1}, HistoryOptions{Transient: true, InjectionTemperature: 285})
		if err != nil {
			t.Fatal(err)
		}
		if _, err := s.History(0); err != nil {
			t.Fatal(err)
		}
		for _, p := range s.sp.tr {
			n := len(p.t)
			cur := -1 // one hint for all: random times walk it forward or bisect
			for k := 0; k < 3000; k++ {
				x := p.t[n-1] * 1.1 * rng.Float64()
				if k%4 == 0 {
					x = p.t[rng.IntN(n)]
				}
				_, want := p.at(x)
				if got := p.fraction(x, &cur); got != want {
					t.Fatalf("t=%g: fraction %v, at %v", x, got, want)
				}
				checked++
			}
		}
	}
	if checked == 0 {
		t.Fatal("no transient path checked")
	}
}
