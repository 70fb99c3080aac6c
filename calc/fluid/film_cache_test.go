package fluid

import (
	"math"
	"math/rand/v2"
	"testing"
)

// FilmCache gives FilmProperties' numbers bit for bit, whether its entry is
// reused (same p, Ts, Tinf with new vapor fractions) or replaced, for every
// built-in liquid in both gases, including inputs FilmProperties holds to
// the nearest valid value.
func TestFilmCacheMatchesFilmProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 3))
	for _, g := range Gases() {
		for _, l := range Liquids() {
			c := NewFilmCache(l, g)
			p, ts, tinf := 1e5, 300.0, 400.0
			for i := range 400 {
				if i%4 == 0 { // a new surface state every fourth call
					p = math.Exp(rng.Float64()*5) * 1e4
					ts = l.tmelt + rng.Float64()*(0.9*l.tc-l.tmelt)
					tinf = 250 + rng.Float64()*1000
				}
				ys, yinf := rng.Float64(), 0.3*rng.Float64()
				if i%97 == 0 {
					ts, ys, p = -5, 1.5, math.NaN() // held to valid values
				}
				want := FilmProperties(l, g, p, ts, tinf, ys, yinf)
				want.Warnings = nil
				got := c.Properties(p, ts, tinf, ys, yinf)
				if !sameFilm(got, want) {
					t.Fatalf("%s in %s at p=%g Ts=%g Tinf=%g Ys=%g Yinf=%g:\n got %+v\nwant %+v", l.ID, g.ID, p, ts, tinf, ys, yinf, got, want)
				}
			}
		}
	}
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
