package calc

import (
	"bytes"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/fluid"
)

// labHeptane is an invented user liquid that copies the coefficients of the
// built-in n-heptane (Perry's 8th ed. Tables 2-8, 2-313, 2-150, 2-153 and the
// DIPPR 105 table, Poling App. A cp; the same numbers calc/fluid's own custom
// test uses), so where the forms agree the case must see the same values.
func labHeptane() *fluid.CustomSpec {
	return &fluid.CustomSpec{
		ID: "lab-heptane", Name: "Lab heptane",
		MolarMassKgMol: 100.204e-3, CriticalTemperatureK: 540.2, CriticalPressurePa: 2.74e6,
		CriticalVolumeM3Mol: 428e-6, NormalBoilingPointK: 371.55, MeltingPointK: 182.57, DiffusionVolume: 148.26,
		VaporPressure:      fluid.CorrelationSpec{Form: "dippr101", A: 87.829, B: -6996.4, C: -9.8802, D: 7.2099e-06, E: 2, TMinK: 182.57, TMaxK: 540.2},
		LiquidDensity:      fluid.CorrelationSpec{Form: "dippr105", A: 612.59, B: 0.26211, C: 540.2, D: 0.28141, TMinK: 182.57, TMaxK: 540.2},
		SurfaceTension:     fluid.CorrelationSpec{Form: "power", A: 0.0522, B: 1.24, TMinK: 183, TMaxK: 540},
		LiquidViscosity:    fluid.CorrelationSpec{Form: "dippr101", A: -9.4622, B: 877.07, C: -0.23445, D: 1.4022e+22, E: -10, TMinK: 182.57, TMaxK: 432.16},
		LatentHeat:         fluid.CorrelationSpec{Form: "dippr106", A: 50014, B: 0.38795, TMinK: 182.57, TMaxK: 540.2},
		LiquidHeatCapacity: fluid.CorrelationSpec{Form: "constant", Value: 2240, TMinK: 200, TMaxK: 400},
		VaporHeatCapacity:  fluid.CorrelationSpec{Form: "poling", A: 9.634, B: 0.004156, C: 0.00015494, D: -2.0066e-07, E: 7.77e-11, TMinK: 200, TMaxK: 1000},
	}
}

func heptaneCase() Case {
	t := 293.15
	return Case{
		Format: CaseFormat, Name: "custom liquid", Fluid: "n-heptane", LiquidTemperatureK: &t,
		Gas:          Gas{PressurePa: 101325, TemperatureK: 298.15},
		Distribution: Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 12},
	}
}

// A case that embeds a user liquid evaluates with it, and the values that
// share their correlation with the built-in liquid agree to rounding.
func TestEvaluateWithCustomFluid(t *testing.T) {
	builtin, err := Evaluate(heptaneCase())
	if err != nil {
		t.Fatal(err)
	}
	c := heptaneCase()
	c.Fluid, c.CustomFluid = "lab-heptane", labHeptane()
	custom, err := Evaluate(c)
	if err != nil {
		t.Fatal(err)
	}
	if custom.Properties.Fluid != "lab-heptane" {
		t.Errorf("properties name fluid %q", custom.Properties.Fluid)
	}
	const tol = 1e-12 // same coefficients, same arithmetic
	for name, pair := range map[string][2]float64{
		"saturation_pressure_pa": {custom.Properties.SaturationPressurePa, builtin.Properties.SaturationPressurePa},
		"liquid_density_kg_m3":   {custom.Properties.LiquidDensityKgM3, builtin.Properties.LiquidDensityKgM3},
		"liquid_viscosity_pa_s":  {custom.Properties.LiquidViscosityPaS, builtin.Properties.LiquidViscosityPaS},
	} {
		if !scalar.EqualWithinAbsOrRel(pair[0], pair[1], 0, tol) {
			t.Errorf("%s: custom %g, built-in %g", name, pair[0], pair[1])
		}
	}
	if custom.Properties.LiquidHeatCapacityJKgK != 2240 {
		t.Errorf("constant cp of the user liquid not used: %g", custom.Properties.LiquidHeatCapacityJKgK)
	}
	var userSource bool
	for _, s := range custom.Properties.Sources {
		if s.Reference == "user data" {
			userSource = true
		}
	}
	if !userSource {
		t.Errorf("sources do not say the values are the user's: %+v", custom.Properties.Sources)
	}
}

func TestCustomFluidErrorsNameTheField(t *testing.T) {
	c := heptaneCase()
	c.CustomFluid = labHeptane() // id lab-heptane, fluid n-heptane
	if fe := FieldErrors(Validate(c)); fe.For("custom_fluid.id") == "" {
		t.Errorf("mismatched id: %v", fe)
	}
	c.Fluid = "lab-heptane"
	c.CustomFluid.MolarMassKgMol = -0.1
	if fe := FieldErrors(Validate(c)); fe.For("custom_fluid.molar_mass_kg_mol") == "" {
		t.Errorf("negative molar mass: %v", fe)
	}
}

// The embedded definition survives the case file: encode, decode, equal.
func TestCustomFluidRoundTripsThroughCaseFile(t *testing.T) {
	c := heptaneCase()
	c.Fluid, c.CustomFluid = "lab-heptane", labHeptane()
	data, err := c.Encode()
	if err != nil {
		t.Fatal(err)
	}
	got, err := Decode(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	if got[0].CustomFluid == nil || *got[0].CustomFluid != *c.CustomFluid {
		t.Fatalf("custom_fluid after round trip: %+v", got[0].CustomFluid)
	}
}
