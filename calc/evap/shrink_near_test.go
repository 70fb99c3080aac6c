package evap

import (
	"math"
	"testing"

	"fogbench/calc/fluid"
)

// fluidFilm is the 1/3-rule film of calc/fluid, as calc gives it to evap.
type fluidFilm struct{ c *fluid.FilmCache }

func (f fluidFilm) Film(p, ts, tinf, ys, yinf float64) Film {
	x := f.c.Properties(p, ts, tinf, ys, yinf)
	return Film{T: x.T, VaporMassFraction: x.VaporMassFraction, Density: x.Density, Viscosity: x.Viscosity,
		Conductivity: x.Conductivity, HeatCapacity: x.HeatCapacity, VaporHeatCapacity: x.VaporHeatCapacity,
		Diffusivity: x.Diffusivity}
}

// nearCases are steady-temperature conditions for the secant path: the
// test liquid with the constant film in each benchmark regime, and water
// and n-heptane with calc/fluid's properties in hot, humid, fast and
// low-pressure surroundings.
func nearCases(t testing.TB) map[string]*Conditions {
	out := map[string]*Conditions{}
	for _, r := range benchRegimes {
		out["stub/"+r] = benchConditions(r)
	}
	air, _ := fluid.LookupGas("air")
	for _, k := range []struct {
		name, liquid, conv string
		tGas, p, x, u      float64
		transition         bool
	}{
		{"water/dry-25C", "water", ConvectionNone, 298.15, 101325, 0, 0, true},
		{"water/humid-hot-rm", "water", ConvectionRanzMarshall, 450, 101325, 0.05, 20, true},
		{"water/low-p-as", "water", ConvectionAbramzonSirignano, 600, 3e4, 0, 10, false},
		{"heptane/as", "n-heptane", ConvectionAbramzonSirignano, 400, 101325, 0, 5, true},
		{"heptane/hot-frossling", "n-heptane", ConvectionFrossling, 800, 2e5, 0.01, 30, true},
	} {
		l, err := fluid.Lookup(k.liquid)
		if err != nil {
			t.Fatal(err)
		}
		out[k.name] = &Conditions{Liquid: l, Gas: fluidFilm{fluid.NewFilmCache(l, air)}, GasMolarMass: air.MolarMass(),
			Pressure: k.p, GasTemperature: k.tGas, VaporMoleFraction: k.x, RelativeVelocity: k.u,
			Curvature: true, Transition: k.transition, Convection: k.conv}
	}
	return out
}

// The shrinkage table built with secant solves from interpolated guesses
// (rateFunc.atNear) against the one built with bracketing and Brent's
// method at every point, the solver the table used before: the remaining
// evaporation time G(d) may differ by at most 1e-9 relative anywhere from
// 1 nm to 300 µm (the requirement is 1e-6 on lifetimes; steadyResidualTol
// bounds each rate to about 1e-11).
func TestShrinkTableNearMatchesExact(t *testing.T) {
	const tol = 1e-9
	for name, c := range nearCases(t) {
		tb, _, err := c.boilingTemperature()
		if err != nil {
			t.Fatal(err)
		}
		build := func(exact bool) *shrinkTable {
			r := newRateFunc(c, 0, tb)
			r.exact = exact
			table, ok, err := buildShrinkTable(r, 1e-9, 300e-6)
			if err != nil || !ok {
				t.Fatalf("%s (exact %v): ok %v, %v", name, exact, ok, err)
			}
			return table
		}
		near, exact := build(false), build(true)
		worst := 0.0
		for d := 1.1e-9; d < 300e-6; d *= 1.13 {
			a, b := near.evaporationTime(d), exact.evaporationTime(d)
			worst = math.Max(worst, math.Abs(a/b-1))
		}
		if worst > tol {
			t.Errorf("%s: G(d) differs by %.2g relative (tolerance %g)", name, worst, tol)
		}
		t.Logf("%s: worst relative difference of G(d) %.2g", name, worst)
	}
}
