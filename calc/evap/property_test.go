package evap

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// Seeded random conditions: the enhancement is ≥ 1 and falls with d; the
// lifetime grows with d0.
func TestPropertiesEnhancementAndLifetime(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for i := 0; i < 30; i++ {
		c := waterInAir()
		c.GasTemperature = 280 + 60*rng.Float64()
		c.VaporMoleFraction = 0.9 * rng.Float64() * if97SaturationPressure(c.GasTemperature) / c.Pressure
		c.Transition = rng.IntN(2) == 0
		c.Gas = airFilm(0.8+0.4*rng.Float64(), 1006+900*rng.Float64())
		c.RelativeVelocity = 2 * rng.Float64()
		c.Convection = []string{ConvectionNone, ConvectionRanzMarshall, ConvectionAbramzonSirignano}[rng.IntN(3)]
		ts, err := c.SteadyTemperature(1e-5)
		if err != nil {
			t.Fatal(err)
		}
		prevE := math.Inf(1)
		for d := 5e-9; d < 1e-3; d *= 1.7 {
			s, err := c.Drop(d, ts)
			if err != nil {
				t.Fatal(err)
			}
			if s.Enhancement < 1 || s.Enhancement > prevE*(1+1e-12) {
				t.Fatalf("case %d d=%g: E = %.12g after %.12g", i, d, s.Enhancement, prevE)
			}
			prevE = s.Enhancement
		}
		prevL := 0.0
		for _, d0 := range []float64{1e-7, 1e-6, 1e-5, 1e-4} {
			l, err := c.Lifetime(d0, LifetimeOptions{})
			if err != nil {
				t.Fatal(err)
			}
			if !(l > prevL) || math.IsInf(l, 0) {
				t.Fatalf("case %d: lifetime(%g) = %g after %g", i, d0, l, prevL)
			}
			prevL = l
		}
	}
}

// No NaN, Inf (other than the flagged +Inf lifetimes) or negative results
// for supersaturated, saturated, humid, near-boiling and hot conditions,
// across sizes from 1 nm to 1 mm, and mass conservation in the histories:
// the evaporated fraction stays in [0, 1] and never decreases without
// transient heating.
func TestPropertiesNoNaN(t *testing.T) {
	finite := func(name string, v float64) {
		t.Helper()
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("%s = %g", name, v)
		}
	}
	for _, tinf := range []float64{275, 300, 360, 372, 380, 600, 1500} {
		for _, sat := range []float64{0, 0.5, 0.99, 1, 1.02, 1.5} {
			for _, conv := range []string{ConvectionNone, ConvectionAbramzonSirignano} {
				c := waterInAir()
				c.GasTemperature, c.Transition, c.Convection, c.RelativeVelocity = tinf, true, conv, 5
				c.Gas = airFilm(0.85, 1870)
				c.VaporMoleFraction = math.Min(0.95, sat*if97SaturationPressure(math.Min(tinf, 373))/c.Pressure)
				for _, d := range []float64{1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3} {
					ts, err := c.SteadyTemperature(d)
					if err != nil {
						continue // tiny drops without a heat balance are reported as errors
					}
					finite("T_s", ts)
					s, err := c.Drop(d, math.Min(ts, 373))
					if err != nil {
						t.Fatalf("T∞=%g sat=%g d=%g: %v", tinf, sat, d, err)
					}
					for name, v := range map[string]float64{"mdot": s.MassRate, "E": s.Enhancement, "Kn": s.Knudsen,
						"BM": s.BM, "BT": s.BT, "Sh": s.Sherwood, "Nu": s.Nusselt, "Q": s.HeatRate, "pv": s.VaporPressure} {
						finite(name, v)
					}
					if (s.Enhancement < 1 && !(s.Enhancement == 0 && len(s.Warnings) > 0)) || s.KelvinRatio < 1 {
						t.Fatalf("enhancement below 1 without a warning, or S < 1: %+v", s)
					}
					r, err := c.LifetimeReport(d, LifetimeOptions{})
					if err != nil {
						t.Fatalf("T∞=%g sat=%g d=%g: lifetime %v", tinf, sat, d, err)
					}
					if math.IsNaN(r.Time) || r.Time < 0 || (r.Evaporates == math.IsInf(r.Time, 1)) {
						t.Fatalf("T∞=%g sat=%g d=%g: lifetime %+v", tinf, sat, d, r)
					}
				}
				h, err := c.History([]float64{1e-6, 1e-5, 5e-5}, []float64{0.2, 0.5, 0.3}, HistoryOptions{MaxTime: 10, Steps: 40})
				if err != nil {
					t.Fatalf("T∞=%g sat=%g: history %v", tinf, sat, err)
				}
				for j := range h.T {
					finite("evaporated", h.EvaporatedMassFraction[j])
					finite("D32", h.D32[j])
					finite("Dv50", h.Dv50[j])
					if f := h.EvaporatedMassFraction[j]; f < 0 || f > 1 || (j > 0 && f < h.EvaporatedMassFraction[j-1]-1e-12) {
						t.Fatalf("T∞=%g sat=%g: evaporated fraction %g at step %d", tinf, sat, f, j)
					}
					if h.D32[j] < 0 || h.Dv50[j] < 0 || h.D32[j] > 5e-5*(1+1e-9) {
						t.Fatalf("T∞=%g sat=%g: D32 %g Dv50 %g", tinf, sat, h.D32[j], h.Dv50[j])
					}
				}
			}
		}
	}
}

// Mass balance of the transient path: the mass lost by integrating ṁ along
// the stored path equals the drop in remaining mass (Simpson on the
// Dormand–Prince steps; the steps are taken at rtol 1e-7, so 1e-4 overall).
func TestTransientMassBalance(t *testing.T) {
	c := waterInAir()
	c.Curvature = false
	d0 := 30e-6
	sp, err := c.newSprayPaths([]float64{d0}, []float64{1}, 0, 373.12, 1.5)
	if err != nil {
		t.Fatal(err)
	}
	if err := sp.addTransient(330, 0); err != nil {
		t.Fatal(err)
	}
	p := sp.tr[0]
	// Simpson's rule on 16 sub-intervals of every step, with s and T_s from
	// the cubic Hermite interpolants of the stored steps.
	rate := func(j int, x float64) float64 {
		h := p.t[j+1] - p.t[j]
		herm := func(y0, y1, d0, d1 float64) float64 {
			x2, x3 := x*x, x*x*x
			return (2*x3-3*x2+1)*y0 + (x3-2*x2+x)*h*d0 + (-2*x3+3*x2)*y1 + (x3-x2)*h*d1
		}
		s := herm(p.s[j], p.s[j+1], p.ds[j], p.ds[j+1])
		T := herm(p.T[j], p.T[j+1], p.dT[j], p.dT[j+1])
		e, _ := c.evaluate(p.diameter(s, T), T, false)
		return e.mdot
	}
	lost := 0.0
	const m = 16
	for j := 0; j+1 < len(p.t); j++ {
		sum := rate(j, 0) + rate(j, 1)
		for k := 1; k < m; k++ {
			sum += float64(2+2*(k%2)) * rate(j, float64(k)/m)
		}
		lost += sum * (p.t[j+1] - p.t[j]) / (3 * m)
	}
	n := len(p.t) - 1
	remaining := p.s[n] * math.Sqrt(p.s[n])
	if got := lost / p.m0; math.Abs(got-(1-remaining)) > 1e-4*(1-remaining)+1e-9 {
		t.Errorf("∫ṁ dt / m0 = %.6g, 1 − m/m0 = %.6g", got, 1-remaining)
	}
	if p.m0 != 997.047013*math.Pi*d0*d0*d0/6 {
		t.Errorf("m0 = %g", p.m0)
	}
	_ = phys.ZeroCelsius
}

// Film.check accepts positive finite properties (and a zero mean free
// path) and names the first field that is zero, negative, infinite or NaN.
func TestFilmCheckNamesBadField(t *testing.T) {
	good := Film{T: 300, Density: 1.2, Viscosity: 1.8e-5, Conductivity: 0.026, HeatCapacity: 1006,
		VaporHeatCapacity: 1870, Diffusivity: 2.5e-5, MeanFreePath: 6.7e-8}
	if err := good.check(); err != nil {
		t.Fatalf("usable film refused: %v", err)
	}
	noLambda := good
	noLambda.MeanFreePath = 0
	if err := noLambda.check(); err != nil {
		t.Fatalf("zero mean free path refused: %v", err)
	}
	fields := []struct {
		name string
		set  func(*Film, float64)
		zero bool // zero is allowed
	}{
		{"film.temperature_k", func(f *Film, v float64) { f.T = v }, false},
		{"film.density_kg_m3", func(f *Film, v float64) { f.Density = v }, false},
		{"film.viscosity_pa_s", func(f *Film, v float64) { f.Viscosity = v }, false},
		{"film.conductivity_w_m_k", func(f *Film, v float64) { f.Conductivity = v }, false},
		{"film.heat_capacity_j_kg_k", func(f *Film, v float64) { f.HeatCapacity = v }, false},
		{"film.vapor_heat_capacity_j_kg_k", func(f *Film, v float64) { f.VaporHeatCapacity = v }, false},
		{"film.diffusivity_m2_s", func(f *Film, v float64) { f.Diffusivity = v }, false},
		{"film.mean_free_path_m", func(f *Film, v float64) { f.MeanFreePath = v }, true},
	}
	for _, fd := range fields {
		for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1), -1, 0} {
			if v == 0 && fd.zero {
				continue
			}
			f := good
			fd.set(&f, v)
			err := f.check()
			var fe *valid.FieldError
			if !errors.As(err, &fe) || fe.Field != fd.name {
				t.Errorf("%s = %v: error %v, want one naming the field", fd.name, v, err)
			}
		}
	}
}
