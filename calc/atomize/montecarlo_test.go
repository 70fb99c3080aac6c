package atomize

import (
	"errors"
	"testing"

	"fogbench/calc/valid"
	"gonum.org/v1/gonum/floats/scalar"
)

func TestMonteCarloReproducible(t *testing.T) {
	in := map[string]float64{"delta_p_pa": 1e6, "mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	unc := map[string]float64{"delta_p_pa": 0.1, "mass_flow_kg_s": 0.05, "surface_tension_n_m": 0.03, "liquid_viscosity_pa_s": 0.1}
	a, err := MonteCarlo("pressure-swirl", "lefebvre-1987", in, ps1, unc, 2000, 42)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := MonteCarlo("pressure-swirl", "lefebvre-1987", in, ps1, unc, 2000, 42)
	if a.P5 != b.P5 || a.P50 != b.P50 || a.P95 != b.P95 || a.Mean != b.Mean {
		t.Errorf("same seed, different answers: %+v vs %+v", a, b)
	}
	c, _ := MonteCarlo("pressure-swirl", "lefebvre-1987", in, ps1, unc, 2000, 43)
	if c.P50 == a.P50 {
		t.Errorf("different seeds gave identical medians %g", a.P50)
	}
	if !(a.P5 < a.P50 && a.P50 < a.P95) {
		t.Errorf("percentiles not ordered: %g %g %g", a.P5, a.P50, a.P95)
	}
	if a.Samples != 2000 || a.Failed != 0 {
		t.Errorf("samples %d failed %d", a.Samples, a.Failed)
	}
}

func TestMonteCarloSmallUncertainty(t *testing.T) {
	// Identity: with 1 % input scatter the median lies within 0.5 % of the
	// deterministic value, and with no scatter every percentile equals it.
	in := map[string]float64{"air_velocity_m_s": 100, "alr": 3, "prefilmer_diameter_m": 0.02}
	small := map[string]float64{"air_velocity_m_s": 0.01, "alr": 0.01, "gas_density_kg_m3": 0.01}
	p, err := MonteCarlo("airblast", "rizk-lefebvre-1980", in, ps1, small, 4000, 1)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinRel(p.P50, p.Deterministic, 5e-3) {
		t.Errorf("p50 %g vs deterministic %g", p.P50, p.Deterministic)
	}
	zero, err := MonteCarlo("airblast", "rizk-lefebvre-1980", in, ps1, map[string]float64{"alr": 0}, 10, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, v := range []float64{zero.P5, zero.P50, zero.P95, zero.Mean} {
		if !scalar.EqualWithinRel(v, zero.Deterministic, 1e-14) {
			t.Errorf("zero scatter: %g vs %g", v, zero.Deterministic)
		}
	}
}

func TestQuantile7(t *testing.T) {
	// Source: Hyndman & Fan (1996) definition 7, numpy.quantile's default
	// ("linear"): for x = 1..5, p = 0.05 → 1.2, 0.5 → 3, 0.95 → 4.8 (hand
	// arithmetic: h = 4p). Tolerance abs 1e-12.
	x := []float64{1, 2, 3, 4, 5}
	for _, c := range []struct{ p, want float64 }{{0.05, 1.2}, {0.5, 3}, {0.95, 4.8}, {0, 1}, {1, 5}} {
		if got := quantile7(x, c.p); !scalar.EqualWithinAbs(got, c.want, 1e-12) {
			t.Errorf("p = %g: got %g, want %g", c.p, got, c.want)
		}
	}
}

func TestMonteCarloErrors(t *testing.T) {
	in := map[string]float64{"delta_p_pa": 1e6, "mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	cases := []struct {
		name  string
		unc   map[string]float64
		n     int
		field string
	}{
		{"too few samples", nil, 1, "monte_carlo.n"},
		{"unknown key", map[string]float64{"speed_rpm": 0.1}, 100, "uncertainty.speed_rpm"},
		{"negative sd", map[string]float64{"delta_p_pa": -0.1}, 100, "uncertainty.delta_p_pa"},
		{"sd above 1", map[string]float64{"delta_p_pa": 2}, 100, "uncertainty.delta_p_pa"},
	}
	for _, c := range cases {
		_, err := MonteCarlo("pressure-swirl", "", in, ps1, c.unc, c.n, 1)
		var fe *valid.FieldError
		if !errors.As(err, &fe) || fe.Field != c.field {
			t.Errorf("%s: got %v, want a field error on %s", c.name, err, c.field)
		}
	}
}
