package store

import (
	"context"
	"errors"
	"testing"

	"fogbench/calc"
	"fogbench/calc/fluid"
)

// testLiquid is an invented user liquid with n-heptane's published
// coefficients (Perry's 8th ed. tables, as the built-in entry uses), so it
// passes every consistency check NewCustomLiquid applies.
func testLiquid() fluid.CustomSpec {
	return fluid.CustomSpec{
		ID: "plant-solvent", Name: "Plant solvent",
		MolarMassKgMol: 100.204e-3, CriticalTemperatureK: 540.2, CriticalPressurePa: 2.74e6,
		CriticalVolumeM3Mol: 428e-6, NormalBoilingPointK: 371.55, MeltingPointK: 182.57, DiffusionVolume: 148.26,
		VaporPressure:      fluid.CorrelationSpec{Form: "dippr101", A: 87.829, B: -6996.4, C: -9.8802, D: 7.2099e-06, E: 2, TMinK: 182.57, TMaxK: 540.2},
		LiquidDensity:      fluid.CorrelationSpec{Form: "dippr105", A: 612.59, B: 0.26211, C: 540.2, D: 0.28141, TMinK: 182.57, TMaxK: 540.2},
		SurfaceTension:     fluid.CorrelationSpec{Form: "power", A: 0.0522, B: 1.24, TMinK: 183, TMaxK: 540},
		LiquidViscosity:    fluid.CorrelationSpec{Form: "dippr101", A: -9.4622, B: 877.07, C: -0.23445, D: 1.4022e+22, E: -10, TMinK: 182.57, TMaxK: 432.16},
		LatentHeat:         fluid.CorrelationSpec{Form: "dippr106", A: 50014, B: 0.38795, TMinK: 182.57, TMaxK: 540.2},
		LiquidHeatCapacity: fluid.CorrelationSpec{Form: "constant", Value: 2240, TMinK: 200, TMaxK: 400},
		VaporHeatCapacity:  fluid.CorrelationSpec{Form: "poling", A: 9.634, B: 0.004156, C: 0.00015494, D: -2.0066e-07, E: 7.77e-11, TMinK: 200, TMaxK: 1000},
		Reference:          "test data",
	}
}

func TestLiquidRoundTrip(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
		spec := testLiquid()
		rec, err := s.CreateLiquid(ctx, spec)
		if err != nil {
			t.Fatal(err)
		}
		if rec.Revision != 1 || rec.Spec != spec {
			t.Fatalf("created %+v", rec)
		}
		// What comes back builds the same liquid.
		liq, err := fluid.NewCustomLiquid(rec.Spec)
		if err != nil || liq.SaturationPressure(300) <= 0 {
			t.Fatalf("stored spec no longer builds: %v", err)
		}
		spec.Name = "Plant solvent, batch 2"
		spec.LiquidHeatCapacity.Value = 2250
		rec2, err := s.UpdateLiquid(ctx, spec.ID, 1, spec)
		if err != nil {
			t.Fatal(err)
		}
		if rec2.Revision != 2 || rec2.Spec.LiquidHeatCapacity.Value != 2250 || !rec2.UpdatedAt.After(rec.UpdatedAt) {
			t.Fatalf("updated %+v", rec2)
		}
		// A save based on revision 1 is now stale and changes nothing.
		spec.Name = "stale"
		if _, err := s.UpdateLiquid(ctx, spec.ID, 1, spec); calc.ErrorCode(err) != calc.Conflict {
			t.Fatalf("stale update: %v", err)
		}
		if got, _ := s.GetLiquid(ctx, spec.ID); got.Spec.Name != "Plant solvent, batch 2" {
			t.Fatalf("stale update wrote %q", got.Spec.Name)
		}
		list, err := s.ListLiquids(ctx)
		if err != nil || len(list) != 1 || list[0].Spec.ID != "plant-solvent" {
			t.Fatalf("list %+v %v", list, err)
		}
		if err := s.DeleteLiquid(ctx, spec.ID); err != nil {
			t.Fatal(err)
		}
		if _, err := s.GetLiquid(ctx, spec.ID); calc.ErrorCode(err) != calc.NotFound {
			t.Fatalf("after delete: %v", err)
		}
		if err := s.DeleteLiquid(ctx, spec.ID); calc.ErrorCode(err) != calc.NotFound {
			t.Fatalf("second delete: %v", err)
		}
	})
}

// Bad definitions are rejected with every bad field named, and nothing is
// written.
func TestLiquidValidation(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		s := l.fresh(t)
		cases := []struct {
			name  string
			edit  func(*fluid.CustomSpec)
			field string
		}{
			{"id with spaces", func(c *fluid.CustomSpec) { c.ID = "My Solvent" }, "custom.id"},
			{"built-in id", func(c *fluid.CustomSpec) { c.ID = "water" }, "custom.id"},
			{"negative molar mass", func(c *fluid.CustomSpec) { c.MolarMassKgMol = -1 }, "custom.molar_mass_kg_mol"},
			{"unknown form", func(c *fluid.CustomSpec) { c.SurfaceTension.Form = "cubic" }, "custom.surface_tension.form"},
		}
		for _, tc := range cases {
			spec := testLiquid()
			tc.edit(&spec)
			_, err := s.CreateLiquid(ctx, spec)
			if fe := calc.FieldErrors(err); fe.For(tc.field) == "" {
				t.Errorf("%s: want an error on %s, got %v", tc.name, tc.field, err)
			}
		}
		if list, _ := s.ListLiquids(ctx); len(list) != 0 {
			t.Fatalf("rejected liquids were stored: %d", len(list))
		}
		// A taken id is refused and the first definition stays.
		if _, err := s.CreateLiquid(ctx, testLiquid()); err != nil {
			t.Fatal(err)
		}
		dup := testLiquid()
		dup.Name = "other"
		if _, err := s.CreateLiquid(ctx, dup); calc.FieldErrors(err).For("custom.id") == "" {
			t.Fatalf("duplicate id: %v", err)
		}
		// Renaming through an update is refused.
		ren := testLiquid()
		ren.ID = "renamed"
		if _, err := s.UpdateLiquid(ctx, "plant-solvent", 1, ren); calc.FieldErrors(err).For("custom.id") == "" {
			t.Fatalf("rename: %v", err)
		}
		if _, err := s.UpdateLiquid(ctx, "absent", 1, func() fluid.CustomSpec { x := testLiquid(); x.ID = "absent"; return x }()); calc.ErrorCode(err) != calc.NotFound {
			t.Fatalf("update of a missing liquid: %v", err)
		}
	})
}

// The liquids table is part of a reopened library (migration applied once).
func TestLiquidSurvivesReopen(t *testing.T) {
	eachBackend(t, func(t *testing.T, l lib) {
		ctx := context.Background()
		dsn := l.dsn(t)
		s, err := Open(ctx, dsn)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := s.CreateLiquid(ctx, testLiquid()); err != nil {
			t.Fatal(err)
		}
		s.Close()
		s, err = Open(ctx, dsn)
		if err != nil {
			t.Fatal(err)
		}
		defer s.Close()
		rec, err := s.GetLiquid(ctx, "plant-solvent")
		if err != nil {
			t.Fatal(err)
		}
		if rec.Spec != testLiquid() {
			t.Fatalf("after reopen %+v", rec.Spec)
		}
		var nf *calc.Error
		if _, err := s.GetLiquid(ctx, "nope"); !errors.As(err, &nf) || nf.Code != calc.NotFound {
			t.Fatalf("unknown id: %v", err)
		}
	})
}
