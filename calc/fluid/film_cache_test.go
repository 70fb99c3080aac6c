package fluid

import (
	"math"
	"math/rand/v2"
	"testing"
)

// filmGridTol bounds FilmCache's interpolated films against FilmProperties,
// relative in every number: the cubic through nodes filmGridStep apart
// leaves an error far below the 1e-9 to which calc holds solved states,
// near the rounding of the property functions themselves.
const filmGridTol = 1e-12

// FilmCache gives FilmProperties' numbers: bit for bit for its first
// surface state, when an entry is reused (same p, Ts, Tinf with new vapor
// fractions), and for inputs FilmProperties holds to the nearest valid
// value; within filmGridTol when later states come from its grid. For
// every built-in liquid in both gases, over seeded states across each
// liquid's range.
func TestFilmCacheMatchesFilmProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 3))
	worst, gridded := 0.0, 0
	for _, g := range Gases() {
		for _, l := range Liquids() {
			c := NewFilmCache(l, g)
			p, ts, tinf := 1e5, 300.0, 400.0
			held := false
			for i := range 400 {
				if i%4 == 0 { // a new surface state every fourth call
					p = math.Exp(rng.Float64()*5) * 1e4
					ts = l.tmelt + rng.Float64()*(0.9*l.tc-l.tmelt)
					tinf = 250 + rng.Float64()*1000
					held = false
				}
				ys, yinf := rng.Float64(), 0.3*rng.Float64()
				if i%97 == 0 {
					ts, ys, p = -5, 1.5, math.NaN() // held to valid values
					held = true
				}
				want := FilmProperties(l, g, p, ts, tinf, ys, yinf)
				want.Warnings = nil
				got := c.Properties(p, ts, tinf, ys, yinf)
				if i < 4 || held {
					if !sameFilm(got, want) {
						t.Fatalf("%s in %s at p=%g Ts=%g Tinf=%g Ys=%g Yinf=%g (computed directly):\n got %+v\nwant %+v", l.ID, g.ID, p, ts, tinf, ys, yinf, got, want)
					}
					continue
				}
				d := filmDiff(got, want)
				worst = math.Max(worst, d)
				if !(d <= filmGridTol) {
					t.Fatalf("%s in %s at p=%g Ts=%g Tinf=%g Ys=%g Yinf=%g: differs by %.3g:\n got %+v\nwant %+v", l.ID, g.ID, p, ts, tinf, ys, yinf, d, got, want)
				}
			}
			gridded += len(c.grid)
		}
	}
	if gridded == 0 {
		t.Fatal("no film came from the grid")
	}
	t.Logf("largest relative difference of a gridded film: %.2g (%d grid nodes in all)", worst, gridded)
}

// filmDiff is the largest relative difference between the numbers of two
// films (+Inf when a NaN appears or the warnings differ).
func filmDiff(a, b Film) float64 {
	if len(a.Warnings) != len(b.Warnings) {
		return math.Inf(1)
	}
	worst := 0.0
	for _, p := range [][2]float64{{a.T, b.T}, {a.VaporMassFraction, b.VaporMassFraction}, {a.VaporMoleFraction, b.VaporMoleFraction},
		{a.MolarMass, b.MolarMass}, {a.Density, b.Density}, {a.Viscosity, b.Viscosity}, {a.Conductivity, b.Conductivity},
		{a.HeatCapacity, b.HeatCapacity}, {a.VaporHeatCapacity, b.VaporHeatCapacity}, {a.Diffusivity, b.Diffusivity},
		{a.MeanFreePath, b.MeanFreePath}} {
		if p[0] == p[1] {
			continue
		}
		d := math.Abs(p[0]-p[1]) / math.Max(math.Abs(p[0]), math.Abs(p[1]))
		if math.IsNaN(d) {
			return math.Inf(1)
		}
		worst = math.Max(worst, d)
	}
	return worst
}

// sameFilm compares every number bit for bit (NaN never appears: the test
// would then fail, as it should).
func sameFilm(a, b Film) bool {
	return a.T == b.T && a.VaporMassFraction == b.VaporMassFraction && a.VaporMoleFraction == b.VaporMoleFraction &&
		a.MolarMass == b.MolarMass && a.Density == b.Density && a.Viscosity == b.Viscosity &&
		a.Conductivity == b.Conductivity && a.HeatCapacity == b.HeatCapacity &&
		a.VaporHeatCapacity == b.VaporHeatCapacity && a.Diffusivity == b.Diffusivity &&
		a.MeanFreePath == b.MeanFreePath && len(a.Warnings) == 0 && len(b.Warnings) == 0
}

func BenchmarkFilm(b *testing.B) {
	w, _ := Lookup("water")
	air, _ := LookupGas("air")
	b.Run("FilmProperties", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			sinkFilm = FilmProperties(w, air, 101325, 290, 350, 0.02, 0.001)
		}
	})
	b.Run("cache/same-Ts", func(b *testing.B) {
		c := NewFilmCache(w, air)
		b.ReportAllocs()
		for b.Loop() {
			sinkFilm = c.Properties(101325, 290, 350, 0.02, 0.001)
		}
	})
	b.Run("cache/new-Ts", func(b *testing.B) {
		c := NewFilmCache(w, air)
		ts := 290.0
		b.ReportAllocs()
		for b.Loop() {
			ts = 600 - ts
			sinkFilm = c.Properties(101325, ts, 350, 0.02, 0.001)
		}
	})
	// A steady-temperature solve: the surface temperature moves a little
	// at every call (1e-3 K steps over a 4 K range), from the grid.
	b.Run("cache/solve", func(b *testing.B) {
		c := NewFilmCache(w, air)
		b.ReportAllocs()
		i := 0
		for b.Loop() {
			sinkFilm = c.Properties(101325, 285+float64(i%4000)*1e-3, 350, 0.02, 0.001)
			i++
		}
	})
	b.Run("direct/solve", func(b *testing.B) {
		var pc filmPure
		b.ReportAllocs()
		i := 0
		for b.Loop() {
			pc.at(w, air, 101325, 285+float64(i%4000)*1e-3, 350)
			sinkFilm = pc.mix(0.02, 0.001)
			i++
		}
	})
}

var sinkFilm Film

// filmTemperatures are 64 seeded surface temperatures in [lo, hi], the
// changing Ts of a steady-temperature solve.
func filmTemperatures(lo, hi float64) []float64 {
	rng := rand.New(rand.NewPCG(3, 5))
	ts := make([]float64, 64)
	for i := range ts {
		ts[i] = lo + rng.Float64()*(hi-lo)
	}
	return ts
}

// BenchmarkFilmPure is filmPure.at, the pure-component part of the film,
// at a new surface temperature every call (what a steady-temperature solve
// asks), per liquid in air.
func BenchmarkFilmPure(b *testing.B) {
	air, _ := LookupGas("air")
	for _, id := range []string{"water", "n-heptane"} {
		l, _ := Lookup(id)
		ts := filmTemperatures(l.tmelt+5, l.tb-5)
		b.Run(id+"/new-Ts", func(b *testing.B) {
			var pc filmPure
			b.ReportAllocs()
			i := 0
			for b.Loop() {
				pc.at(l, air, 101325, ts[i&63], 400)
				i++
			}
			sinkFilm.T = pc.kg + pc.diff
		})
	}
}

// BenchmarkSurfaceProperties is the latent heat and surface tension that a
// rate evaluation asks at each new surface temperature, per liquid.
func BenchmarkSurfaceProperties(b *testing.B) {
	for _, id := range []string{"water", "n-heptane"} {
		l, _ := Lookup(id)
		ts := filmTemperatures(l.tmelt+5, l.tb-5)
		b.Run(id+"/new-Ts", func(b *testing.B) {
			b.ReportAllocs()
			var s float64
			i := 0
			for b.Loop() {
				T := ts[i&63]
				s += l.LatentHeat(T) + l.SurfaceTension(T)
				i++
			}
			sinkFilm.T = s
		})
	}
}

// A steady-temperature solve asks at one p and Tinf for ever new surface
// temperatures: the grid is reused across them and every film stays
// within filmGridTol of FilmProperties.
func TestFilmCacheGridOverASolve(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	worst := 0.0
	for _, g := range Gases() {
		for _, l := range Liquids() {
			c := NewFilmCache(l, g)
			p, tinf := 101325.0, 250+rng.Float64()*1000
			lo := l.tmelt + 0.5
			hi := math.Min(l.tc-5, lo+60)
			for range 300 {
				ts := lo + rng.Float64()*(hi-lo)
				ys := 0.5 * rng.Float64()
				want := FilmProperties(l, g, p, ts, tinf, ys, 0)
				want.Warnings = nil
				d := filmDiff(c.Properties(p, ts, tinf, ys, 0), want)
				worst = math.Max(worst, d)
				if !(d <= filmGridTol) {
					t.Fatalf("%s in %s at Ts=%g Tinf=%g: differs by %.3g", l.ID, g.ID, ts, tinf, d)
				}
			}
			if len(c.grid) < 8 {
				t.Fatalf("%s in %s: %d grid nodes over 300 temperatures; the grid was not reused", l.ID, g.ID, len(c.grid))
			}
		}
	}
	t.Logf("largest relative difference: %.2g", worst)
}
