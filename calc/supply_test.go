package calc

import (
	"math"
	"testing"

	"fogbench/calc/fluid"
)

// kerosenePressureSwirl is a pressure-swirl nozzle spraying the kerosene
// surrogate into 15 bar, 700 K air (a gas-turbine combustor point).
func kerosenePressureSwirl() Case {
	return Case{Format: CaseFormat, Name: "combustor", Fluid: "kerosene-surrogate",
		Gas: Gas{PressurePa: 15e5, TemperatureK: 700},
		Distribution: Distribution{Model: "atomizer", Family: "pressure-swirl", Correlation: "lefebvre-1987", Q: 2.5, Bins: 12,
			Inputs: map[string]float64{"delta_p_pa": 1e6, "orifice_diameter_m": 5e-4, "mass_flow_kg_s": 0.01}}}
}

// The nozzle takes the liquid's properties at its supply temperature
// (injection_temperature_k, else liquid_temperature_k), never at the gas
// temperature: Lefebvre's SMD = 2.25 σ^0.25 μ_L^0.25 ṁ^0.25 ΔP^−0.5 ρ_A^−0.25
// (Lefebvre 1987, as in calc/atomize) with σ and μ_L at 300 K. Without
// either temperature the case names injection_temperature_k.
func TestAtomizerUsesTheSupplyTemperature(t *testing.T) {
	l, _ := fluid.Lookup("kerosene-surrogate")
	g, _ := fluid.LookupGas("air")
	lefebvre := func(tl float64) float64 {
		return 2.25 * math.Pow(l.SurfaceTension(tl), 0.25) * math.Pow(l.Viscosity(tl), 0.25) * math.Pow(0.01, 0.25) /
			math.Sqrt(1e6) * math.Pow(g.Density(700, 15e5), -0.25)
	}
	want := lefebvre(300)
	for _, tc := range []struct {
		name string
		edit func(c *Case)
	}{
		{"injection temperature, transient", func(c *Case) { c.Heating, c.InjectionTemperatureK = "transient", ptr(300) }},
		{"injection temperature, steady", func(c *Case) { c.InjectionTemperatureK = ptr(300) }},
		{"fixed liquid temperature", func(c *Case) { c.LiquidTemperatureK = ptr(300) }},
		{"injection beats the fixed temperature", func(c *Case) { c.InjectionTemperatureK, c.LiquidTemperatureK = ptr(300), ptr(350) }},
	} {
		c := kerosenePressureSwirl()
		tc.edit(&c)
		s, err := prepare(c)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		got := s.atomizer.SMD[0].SMD
		if math.Abs(got/want-1) > 1e-12 {
			t.Errorf("%s: SMD %.4g µm, want %.4g µm (the gas temperature gives %.4g µm)", tc.name, got*1e6, want*1e6, lefebvre(700)*1e6)
		}
	}
	err := Validate(kerosenePressureSwirl())
	fes := FieldErrors(err)
	if len(fes) != 1 || fes[0].Field != "injection_temperature_k" {
		t.Errorf("no supply temperature: %v, want an error naming injection_temperature_k", err)
	}
}
