package evap

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/phys"
)

// d2Conditions is a constant-property liquid with B_M = b in dry air, no
// curvature, no transition, no convection: the d² law holds exactly.
func d2Conditions(b float64) *Conditions {
	return &Conditions{
		Liquid: liquidWithB(b, phys.MolarMassWater, phys.MolarMassAir, 1e5, 1000, 2.4e6),
		Gas:    airFilm(1, 1006), GasMolarMass: phys.MolarMassAir,
		Pressure: 1e5, GasTemperature: 300, Convection: ConvectionNone,
	}
}

// The spray history reproduces the analytic d² law (Godsave 1953; Spalding
// 1953): bin i keeps (1 − t/t_i)^(3/2) of its mass, t_i = d0_i²/K, to 1e-6.
func TestHistoryD2Law(t *testing.T) {
	const tol = 1e-6
	const b = 0.05
	c := d2Conditions(b)
	k := 8 * 1.2 * 2.5e-5 * math.Log1p(b) / 1000
	d := []float64{5e-6, 12e-6, 30e-6, 55e-6, 90e-6}
	w := []float64{0.1, 0.25, 0.3, 0.25, 0.1}
	h, err := c.History(d, w, HistoryOptions{SurfaceTemperature: 290, Steps: 300})
	if err != nil {
		t.Fatal(err)
	}
	remaining := func(t float64) (rem, d32 float64) {
		s3, s2 := 0.0, 0.0
		for i := range d {
			x := 1 - t/(d[i]*d[i]/k)
			if x <= 0 {
				continue
			}
			f := x * math.Sqrt(x)
			rem += w[i] * f
			di := d[i] * math.Sqrt(x)
			s3 += w[i] * f
			s2 += w[i] * f / di
		}
		if s2 > 0 {
			d32 = s3 / s2
		}
		return rem, d32
	}
	for j, tj := range h.T {
		rem, d32 := remaining(tj)
		if !scalar.EqualWithinAbsOrRel(h.EvaporatedMassFraction[j], 1-rem, tol, tol) {
			t.Fatalf("t=%g: evaporated %.9f, d² law %.9f", tj, h.EvaporatedMassFraction[j], 1-rem)
		}
		if !scalar.EqualWithinAbsOrRel(h.D32[j], d32, 1e-12, tol) {
			t.Fatalf("t=%g: D32 %.9g, d² law %.9g", tj, h.D32[j], d32)
		}
	}
	for _, x := range []struct{ got, frac float64 }{{h.T50, 0.5}, {h.T90, 0.9}, {h.T99, 0.99}} {
		rem, _ := remaining(x.got)
		if math.Abs(1-rem-x.frac) > tol {
			t.Errorf("T%.0f = %g gives %.8f evaporated", 100*x.frac, x.got, 1-rem)
		}
	}
	if h.T[len(h.T)-1] != h.T99 || h.T[0] != 0 {
		t.Errorf("grid runs from %g to %g, want 0 to T99 = %g", h.T[0], h.T[len(h.T)-1], h.T99)
	}
	if x := h.Distance(2); x[len(x)-1] != 2*h.T99 {
		t.Errorf("distance at T99 = %g", x[len(x)-1])
	}
}

// With curvature, transition and steady temperatures the shared shrinkage
// table agrees with the adaptive lifetime quadrature: a single bin reaches
// 99 % evaporated when d = d0·0.01^(1/3), i.e. at
// t = Lifetime(d0) − Lifetime(d0·0.01^(1/3)); and the remaining mass at
// several times matches (d/d0)³ with d found from the lifetimes.
func TestHistoryMatchesLifetime(t *testing.T) {
	const tol = 1e-6
	c := waterInAir()
	c.Transition = true
	c.Gas = airFilm(0.85, 1870)
	for _, d0 := range []float64{0.2e-6, 3e-6} {
		h, err := c.History([]float64{d0}, []float64{1}, HistoryOptions{Steps: 50})
		if err != nil {
			t.Fatal(err)
		}
		l0, err := c.Lifetime(d0, LifetimeOptions{RelTol: 1e-11})
		if err != nil {
			t.Fatal(err)
		}
		l99, _ := c.Lifetime(d0*math.Cbrt(0.01), LifetimeOptions{RelTol: 1e-11})
		if !scalar.EqualWithinAbsOrRel(h.T99, l0-l99, 0, tol) {
			t.Errorf("d0=%g: T99 %.9g, lifetimes give %.9g", d0, h.T99, l0-l99)
		}
		for _, j := range []int{10, 25, 40} {
			tj := h.T[j]
			lnD, err := brent(func(x float64) float64 {
				l, _ := c.Lifetime(math.Exp(x), LifetimeOptions{RelTol: 1e-11})
				return l - (l0 - tj)
			}, math.Log(d0*1e-4), math.Log(d0), -(l0 - tj), tj, 1e-9)
			if err != nil {
				t.Fatal(err)
			}
			r := math.Exp(lnD) / d0
			if want := 1 - r*r*r; !scalar.EqualWithinAbsOrRel(h.EvaporatedMassFraction[j], want, tol, 0) {
				t.Errorf("d0=%g t=%g: evaporated %.9f, lifetimes give %.9f", d0, tj, h.EvaporatedMassFraction[j], want)
			}
		}
	}
}

// Transient heating: a drop injected at its own steady temperature follows
// the steady history; a warm drop (injected at T_∞, above its wet bulb)
// first evaporates faster, so it finishes sooner, but by a small margin.
func TestHistoryTransient(t *testing.T) {
	c := waterInAir()
	c.Curvature = false
	d := []float64{10e-6, 40e-6}
	w := []float64{0.5, 0.5}
	steady, err := c.History(d, w, HistoryOptions{})
	if err != nil {
		t.Fatal(err)
	}
	ts, _ := c.SteadyTemperature(10e-6)
	same, err := c.History(d, w, HistoryOptions{Transient: true, InjectionTemperature: ts})
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(same.T99, steady.T99, 0, 1e-4) || !scalar.EqualWithinAbsOrRel(same.T50, steady.T50, 0, 1e-4) {
		t.Errorf("injected at the steady temperature: T50 %g/%g, T99 %g/%g", same.T50, steady.T50, same.T99, steady.T99)
	}
	warm, err := c.History(d, w, HistoryOptions{Transient: true, InjectionTemperature: 298.15})
	if err != nil {
		t.Fatal(err)
	}
	if !(warm.T99 < steady.T99) || warm.T99 < 0.9*steady.T99 {
		t.Errorf("warm injection: T99 %g vs steady %g", warm.T99, steady.T99)
	}
	for j := 1; j < len(warm.T); j++ {
		if warm.EvaporatedMassFraction[j] < warm.EvaporatedMassFraction[j-1]-1e-9 {
			t.Fatalf("evaporated fraction falls at t=%g", warm.T[j])
		}
	}
}

func TestHistoryInput(t *testing.T) {
	c := waterInAir()
	for _, k := range []struct {
		d, w  []float64
		field string
	}{
		{[]float64{2e-5, 1e-5}, []float64{1, 1}, "history.diameters_m[1]"},
		{[]float64{1e-5, 2e-5}, []float64{1}, "history.volume_fractions"},
		{[]float64{1e-5, 2e-5}, []float64{1, -1}, "history.volume_fractions[1]"},
		{[]float64{1e-5, math.NaN()}, []float64{1, 1}, "history.diameters_m[1]"},
		{nil, nil, "history.diameters_m"},
	} {
		if _, err := c.History(k.d, k.w, HistoryOptions{}); err == nil || !contains(err.Error(), k.field) {
			t.Errorf("%v %v: %v; want a %s error", k.d, k.w, err, k.field)
		}
	}
	c.VaporMoleFraction = 1.2 * if97SaturationPressure(298.15) / c.Pressure
	if _, err := c.History([]float64{1e-5}, []float64{1}, HistoryOptions{}); err == nil || !contains(err.Error(), "history.max_time_s") {
		t.Errorf("supersaturated without MaxTime: %v", err)
	}
}

// Kelvin enhancement thresholds: at the isothermal 298.15 K state E ≈ S
// (dry air), so E − 1 = 1 % near d = 2·1.049182 nm/ln 1.01 ≈ 0.21 µm, and
// the threshold for 10 % is smaller.
func TestEnhancementThreshold(t *testing.T) {
	c := waterInAir()
	d1, err := c.EnhancementThreshold(0.01, 298.15)
	if err != nil {
		t.Fatal(err)
	}
	d10, err := c.EnhancementThreshold(0.1, 298.15)
	if err != nil {
		t.Fatal(err)
	}
	if approx := 2 * 1.049182e-9 / math.Log(1.01); math.Abs(d1/approx-1) > 0.05 || !(d10 < d1) {
		t.Errorf("thresholds 1 %%: %g m (≈ %g), 10 %%: %g m", d1, approx, d10)
	}
	s, _ := c.Drop(d1, 298.15)
	if math.Abs(s.Enhancement-1.01) > 1e-8 {
		t.Errorf("E at the 1 %% threshold = %.10f", s.Enhancement)
	}
	if _, err := c.EnhancementThreshold(0.01, 0); err != nil {
		t.Errorf("steady-temperature threshold: %v", err)
	}
	c.VaporMoleFraction = if97SaturationPressure(298.15) / c.Pressure
	if _, err := c.EnhancementThreshold(0.01, 298.15); err == nil {
		t.Error("a saturated far field leaves E undefined; want an error")
	}
}
