package fluid

import (
	"encoding/json"
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/valid"
)

// heptaneSpec rebuilds n-heptane from the same published coefficients as the
// built-in entry (Perry's Tables 2-8, 2-313, 2-150, 2-153 and the DIPPR 105
// table; Poling App. A cp), with a Mulero single-term surface tension. The
// custom liquid must then reproduce the built-in values exactly where the
// forms agree.
func heptaneSpec() CustomSpec {
	return CustomSpec{
		ID: "my-heptane", Name: "Heptane (user copy)",
		MolarMassKgMol: 100.204e-3, CriticalTemperatureK: 540.2, CriticalPressurePa: 2.74e6,
		CriticalVolumeM3Mol: 428e-6, NormalBoilingPointK: 371.55, MeltingPointK: 182.57, DiffusionVolume: 148.26,
		VaporPressure:      CorrelationSpec{Form: "dippr101", A: 87.829, B: -6996.4, C: -9.8802, D: 7.2099e-06, E: 2, TMinK: 182.57, TMaxK: 540.2},
		LiquidDensity:      CorrelationSpec{Form: "dippr105", A: 612.59, B: 0.26211, C: 540.2, D: 0.28141, TMinK: 182.57, TMaxK: 540.2},
		SurfaceTension:     CorrelationSpec{Form: "power", A: 0.0522, B: 1.24, TMinK: 183, TMaxK: 540},
		LiquidViscosity:    CorrelationSpec{Form: "dippr101", A: -9.4622, B: 877.07, C: -0.23445, D: 1.4022e+22, E: -10, TMinK: 180.15 + 2.42, TMaxK: 432.16},
		LatentHeat:         CorrelationSpec{Form: "dippr106", A: 50014, B: 0.38795, TMinK: 182.57, TMaxK: 540.2},
		LiquidHeatCapacity: CorrelationSpec{Form: "constant", Value: 2240, TMinK: 200, TMaxK: 400},
		VaporHeatCapacity:  CorrelationSpec{Form: "poling", A: 9.634, B: 0.004156, C: 0.00015494, D: -2.0066e-07, E: 7.77e-11, TMinK: 200, TMaxK: 1000},
		Reference:          "Perry's 8th ed. tables as in the built-in entry",
	}
}

func TestCustomLiquidReproducesBuiltIn(t *testing.T) {
	// The spec travels as JSON (case files); round-trip it first.
	b, err := json.Marshal(heptaneSpec())
	if err != nil {
		t.Fatal(err)
	}
	var spec CustomSpec
	if err := json.Unmarshal(b, &spec); err != nil {
		t.Fatal(err)
	}
	c, err := NewCustomLiquid(spec)
	if err != nil {
		t.Fatal(err)
	}
	h, _ := Lookup("n-heptane")
	for _, T := range []float64{250, 298.15, 350, 400} {
		for name, pair := range map[string][2]float64{
			"p_s": {c.SaturationPressure(T), h.SaturationPressure(T)}, "rho": {c.Density(T), h.Density(T)},
			"mu": {c.Viscosity(T), h.Viscosity(T)}, "h_fg": {c.LatentHeat(T), h.LatentHeat(T)},
			"cp_v": {c.VaporHeatCapacity(T), h.VaporHeatCapacity(T)}, "mu_v": {c.VaporViscosity(T), h.VaporViscosity(T)},
		} {
			if !scalar.EqualWithinAbsOrRel(pair[0], pair[1], 0, 1e-12) {
				t.Errorf("%s at %g K: custom %g, built-in %g", name, T, pair[0], pair[1])
			}
		}
	}
	if got := c.HeatCapacity(300); got != 2240 {
		t.Errorf("constant cp %g", got)
	}
	if math.Abs(c.AcentricFactor()-h.AcentricFactor()) > 1e-12 {
		t.Errorf("omega %g vs %g", c.AcentricFactor(), h.AcentricFactor())
	}
	if w, err := c.Check(450); err != nil || len(w) == 0 {
		t.Errorf("450 K is past the user's cp and viscosity ranges: %v %v", w, err)
	}
}

func TestCustomLiquidValidation(t *testing.T) {
	cases := []struct {
		name  string
		edit  func(*CustomSpec)
		field string
	}{
		{"empty id", func(s *CustomSpec) { s.ID = "" }, "custom.id"},
		{"built-in id", func(s *CustomSpec) { s.ID = "water" }, "custom.id"},
		{"negative molar mass", func(s *CustomSpec) { s.MolarMassKgMol = -1 }, "custom.molar_mass_kg_mol"},
		{"NaN pc", func(s *CustomSpec) { s.CriticalPressurePa = math.NaN() }, "custom.critical_pressure_pa"},
		{"boiling above Tc", func(s *CustomSpec) { s.NormalBoilingPointK = 600 }, "custom.normal_boiling_point_k"},
		{"unknown form", func(s *CustomSpec) { s.LiquidDensity.Form = "cubic" }, "custom.liquid_density.form"},
		{"range past Tc", func(s *CustomSpec) { s.LatentHeat.TMaxK = 700 }, "custom.latent_heat.t_min_k"},
		{"falling vapor pressure", func(s *CustomSpec) {
			s.VaporPressure = CorrelationSpec{Form: "antoine", A: 5, B: -500, C: 0, TMinK: 200, TMaxK: 500}
		}, "custom.vapor_pressure"},
		{"boiling point inconsistent", func(s *CustomSpec) { s.NormalBoilingPointK = 390 }, "custom.vapor_pressure"},
		{"negative density", func(s *CustomSpec) {
			s.LiquidDensity = CorrelationSpec{Form: "constant", Value: -3, TMinK: 200, TMaxK: 500}
		}, "custom.liquid_density"},
		{"rising surface tension", func(s *CustomSpec) {
			s.SurfaceTension = CorrelationSpec{Form: "linear", A: 0.01, B: 1e-5, TMinK: 200, TMaxK: 500}
		}, "custom.surface_tension"},
	}
	for _, c := range cases {
		s := heptaneSpec()
		c.edit(&s)
		_, err := NewCustomLiquid(s)
		var es valid.Errors
		if !errors.As(err, &es) || es.For(c.field) == "" {
			t.Errorf("%s: want an error on %s, got %v", c.name, c.field, err)
		}
	}
}
