package evap

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/phys"
)

// liquidWithB returns a constant-property liquid whose surface vapor
// pressure gives the Spalding mass number b in a dry gas of molar mass mg
// at pressure p: Y_s = b/(1+b), X_s from Y_s, p_sat = X_s p.
func liquidWithB(b, mv, mg, p, rho, latent float64) testLiquid {
	ys := b / (1 + b)
	xs := (ys / mv) / (ys/mv + (1-ys)/mg)
	return testLiquid{molarMass: mv, psat: constant(xs * p), sigma: constant(0.03), rho: rho, latent: constant(latent), cp: 2000}
}

// Worked lifetime E1, computed by hand from the d² law: water in dry still air
// with stated properties ρ_g = 1.2, D = 2.5e-5, B_M = 0.00678, ρ_L = 1000:
// K = 8 ρ_g D ln(1+B_M)/ρ_L = 1.62171e-9 m2/s.
func TestLifetimeE1(t *testing.T) {
	const tol = 1e-5
	c := &Conditions{
		Liquid: liquidWithB(0.00678, phys.MolarMassWater, phys.MolarMassAir, phys.StandardAtmosphere, 1000, 2.45e6),
		Gas:    airFilm(1, 1006), GasMolarMass: phys.MolarMassAir,
		Pressure: phys.StandardAtmosphere, GasTemperature: 298.15, Convection: ConvectionNone,
	}
	s, err := c.Drop(100e-6, 285)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(s.BM, 0.00678, 0, 1e-12) || !scalar.EqualWithinAbsOrRel(s.MassRate, 1.27369e-10, 0, tol) {
		t.Errorf("B_M = %g, ṁ(100 µm) = %.6g kg/s, want 1.27369e-10", s.BM, s.MassRate)
	}
	for _, k := range []struct{ d0, life float64 }{{100e-6, 6.1663}, {10e-6, 0.061663}} {
		got, err := c.Lifetime(k.d0, LifetimeOptions{SurfaceTemperature: 285})
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(got, k.life, 0, tol) {
			t.Errorf("t_life(%g) = %.6g s, want %.6g", k.d0, got, k.life)
		}
	}
}

// Worked lifetime E2, computed by hand from the d² law: n-hexane in hot
// quiescent N2. The setup is modelled on Turns' ch. 10 example, from memory;
// Turns' printed answers are not reproduced. T_∞ = 850 K, T_s = 342 K,
// h_fg = 335e3, c_p,g = 2850, k_g = 0.0425, ρ_L = 659: B_T = 4.32179,
// K = 8 k ln(1+B_T)/(ρ_L c_p,g) = 3.02646e-7 m2/s. With Le = 1 and one c_p,
// B_M = B_T at the steady state, so the liquid stub is given that B_M at
// 342 K, and the steady temperature must come out at 342 K.
func TestLifetimeE2(t *testing.T) {
	const tol = 1e-5
	const cp, k = 2850, 0.0425
	bT := SpaldingHeatNumber(cp, 850, 342, 335e3)
	const mHexane = 86.175e-3 // kg/mol; only enters through the stub's own X_s ↔ Y_s
	c := &Conditions{
		Liquid: liquidWithB(bT, mHexane, phys.MolarMassNitrogen, phys.StandardAtmosphere, 659, 335e3),
		Gas: constFilm{T: 511.333, Density: 0.6, Viscosity: 2.6e-5, Conductivity: k, HeatCapacity: cp,
			VaporHeatCapacity: cp, Diffusivity: k / (0.6 * cp)},
		GasMolarMass: phys.MolarMassNitrogen, Pressure: phys.StandardAtmosphere, GasTemperature: 850,
		Convection: ConvectionNone,
	}
	ts, err := c.SteadyTemperature(100e-6)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(ts-342) > 1e-6 {
		t.Errorf("steady T_s = %.8g K, want 342", ts)
	}
	for _, q := range []struct{ d0, life float64 }{{100e-6, 0.033042}, {500e-6, 0.82604}, {1e-3, 3.3042}} {
		for _, opts := range []LifetimeOptions{{SurfaceTemperature: 342}, {}} {
			got, err := c.Lifetime(q.d0, opts)
			if err != nil {
				t.Fatal(err)
			}
			if !scalar.EqualWithinAbsOrRel(got, q.life, 0, tol) {
				t.Errorf("t_life(%g, %+v) = %.6g s, want %.6g", q.d0, opts, got, q.life)
			}
		}
	}
}

// With constant properties, no curvature, no transition and no convection
// the lifetime is the d² law t = d0²/K, K = 8 ρ_g D ln(1+B_M)/ρ_L
// (Godsave 1953; Spalding 1953), to 1e-6 relative (seeded random inputs).
func TestLifetimeD2Law(t *testing.T) {
	const tol = 1e-6
	rng := rand.New(rand.NewPCG(3, 4))
	for i := 0; i < 50; i++ {
		b := math.Pow(10, -3+4*rng.Float64())
		rhoL := 500 + 1000*rng.Float64()
		c := &Conditions{
			Liquid: liquidWithB(b, phys.MolarMassWater, phys.MolarMassAir, 1e5, rhoL, 2e6),
			Gas:    airFilm(1, 1006), GasMolarMass: phys.MolarMassAir,
			Pressure: 1e5, GasTemperature: 300, Convection: ConvectionNone,
		}
		d0 := math.Pow(10, -7+4*rng.Float64())
		k := 8 * 1.2 * 2.5e-5 * math.Log1p(b) / rhoL
		got, err := c.Lifetime(d0, LifetimeOptions{SurfaceTemperature: 280})
		if err != nil {
			t.Fatal(err)
		}
		if want := d0 * d0 / k; !scalar.EqualWithinAbsOrRel(got, want, 0, tol) {
			t.Fatalf("B=%g d0=%g: t = %.10g, d² law %.10g", b, d0, got, want)
		}
	}
}

// Steady drop temperature of water in dry air at 25 °C, 1 atm,
// computed by independent arithmetic: Le = 1, c_p,g = 1006, IF97 p_sat and
// L = 2.501e6 − 2369 (T − 273.15) give 281.4211 K; the Abramzon–Sirignano
// stagnant form with c_p,v = 1870 gives 8.248 °C (Le = 1) and 6.948 °C
// (Le = 0.85).
func TestSteadyTemperatureWater(t *testing.T) {
	for _, k := range []struct {
		name     string
		le, cpv  float64
		want, tl float64
	}{
		{"Le=1 single cp", 1, 1006, 281.4211, 0.01},
		{"A-S Le=1", 1, 1870, phys.ZeroCelsius + 8.248, 0.002},
		{"A-S Le=0.85", 0.85, 1870, phys.ZeroCelsius + 6.948, 0.002},
	} {
		c := waterInAir()
		c.Curvature = false
		c.Gas = airFilm(k.le, k.cpv)
		got, err := c.SteadyTemperature(1e-4)
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(got-k.want) > k.tl {
			t.Errorf("%s: T_s = %.5f K, want %.4f ± %g", k.name, got, k.want, k.tl)
		}
		// A 1 mm drop with curvature is the flat drop to well under 1 mK.
		c.Curvature = true
		if got2, _ := c.SteadyTemperature(1e-3); math.Abs(got2-got) > 1e-4 {
			t.Errorf("%s: curvature moves a 1 mm drop by %g K", k.name, got2-got)
		}
		s, err := c.SteadyState(1e-4)
		if err != nil || math.Abs(s.HeatToLiquid) > 1e-9*math.Abs(s.HeatRate) {
			t.Errorf("%s: heat into the liquid at the steady state = %g W (of %g), err %v", k.name, s.HeatToLiquid, s.HeatRate, err)
		}
	}
}

// Psychrometric wet-bulb temperatures, ASHRAE Handbook—Fundamentals (2017)
// ch. 1 eqs. 33/35 with eqs. 5–6 [computed with those
// equations, read in psychrolib]. The dry-air droplet model with Le = 1 and
// c_p,g = 1006 reproduces the dry case to 0.05 K; a droplet with a realistic
// Le = 0.85 (and c_p,v = 1870) runs 1–1.5 K colder, asserted within ±2 K.
func TestSteadyTemperaturePsychrometric(t *testing.T) {
	c := waterInAir()
	c.Curvature = false
	got, err := c.SteadyTemperature(1e-4)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(got-(phys.ZeroCelsius+8.271)) > 0.05 {
		t.Errorf("dry 25 °C: T_s = %.3f °C, want 8.271 ± 0.05", got-phys.ZeroCelsius)
	}
	for _, k := range []struct{ tC, rh, wb float64 }{{25, 0, 8.271}, {25, 0.5, 17.889}, {20, 0.5, 13.784}, {30, 0.4, 20.064}} {
		c := waterInAir()
		c.Curvature = false
		c.Gas = airFilm(0.85, 1870)
		c.GasTemperature = phys.ZeroCelsius + k.tC
		c.VaporMoleFraction = k.rh * if97SaturationPressure(c.GasTemperature) / c.Pressure
		got, err := c.SteadyTemperature(1e-4)
		if err != nil {
			t.Fatal(err)
		}
		if d := got - phys.ZeroCelsius - k.wb; math.Abs(d) > 2 {
			t.Errorf("%g °C RH %g: droplet %.3f °C vs psychrometric %.3f °C", k.tC, k.rh, got-phys.ZeroCelsius, k.wb)
		}
	}
}

// A saturated or supersaturated far field: a drop larger than the Kelvin
// equilibrium size never evaporates (Time = +Inf, flagged), a smaller one
// does, and nothing returns NaN.
func TestLifetimeSupersaturated(t *testing.T) {
	c := waterInAir()
	ts := 290.0
	c.VaporMoleFraction = 1.01 * if97SaturationPressure(ts) / c.Pressure
	r, ok, err := c.EquilibriumRadius(ts)
	if err != nil || !ok {
		t.Fatalf("equilibrium radius: %g %v %v", r, ok, err)
	}
	lk := KelvinLength(r176SurfaceTension(ts), phys.MolarMassWater/997.047013, ts)
	if want := lk / math.Log(1.01); !scalar.EqualWithinAbsOrRel(r, want, 0, 1e-12) {
		t.Errorf("r* = %g, want %g", r, want)
	}
	big, err := c.LifetimeReport(4*r, LifetimeOptions{SurfaceTemperature: ts})
	if err != nil || big.Evaporates || !math.IsInf(big.Time, 1) || !big.HasEquilibrium {
		t.Errorf("d = 4r*: %+v, %v; want +Inf, not evaporating", big, err)
	}
	small, err := c.LifetimeReport(r, LifetimeOptions{SurfaceTemperature: ts})
	if err != nil || !small.Evaporates || !(small.Time > 0) || math.IsInf(small.Time, 0) {
		t.Errorf("d = r*: %+v, %v; want a finite lifetime", small, err)
	}
	c.Curvature = false
	if _, ok, _ := c.EquilibriumRadius(ts); ok {
		t.Error("a flat surface has no equilibrium radius")
	}
}

func TestSteadyTemperatureBoilingAndErrors(t *testing.T) {
	// A liquid whose vapor pressure jumps to the gas pressure just above
	// 300 K in a 2000 K gas: the steady root is capped at the boiling point.
	c := waterInAir()
	c.GasTemperature = 2000
	got, err := c.SteadyTemperature(1e-4)
	if err != nil || !(got < 373.13) || !(got > 340) {
		t.Errorf("water in a 2000 K gas: T_s = %g, %v", got, err)
	}
	step := testLiquid{molarMass: 0.1, psat: func(T float64) float64 {
		if T > 300 {
			return 2e5
		}
		return 1e-6
	}, sigma: constant(0.02), rho: 700, latent: constant(1e9), cp: 2000}
	c.Liquid = step
	got, err = c.SteadyTemperature(1e-4)
	if !errors.Is(err, ErrBoiling) || math.IsNaN(got) || got < 299 || got > 301 {
		t.Errorf("step liquid: T_s = %g, err %v; want the boiling point and ErrBoiling", got, err)
	}
}
