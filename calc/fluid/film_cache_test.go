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
