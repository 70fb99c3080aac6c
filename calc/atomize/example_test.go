package atomize_test

import (
	"fmt"

	"fogbench/calc/atomize"
)

// A fictional kerosene burner nozzle: 10 g/s at 10 bar through a 1 mm
// pressure-swirl orifice. Each correlation's provenance record says how far
// its form was checked.
func ExampleEvaluate() {
	props := atomize.Properties{
		LiquidDensity:   780,
		LiquidViscosity: 1.3e-3,
		SurfaceTension:  0.0275,
		GasDensity:      1.2,
		GasViscosity:    1.8e-5,
	}
	inputs := map[string]float64{
		"delta_p_pa":         1e6,
		"mass_flow_kg_s":     0.01,
		"orifice_diameter_m": 1e-3,
		"cone_angle_deg":     80,
	}
	r, err := atomize.Evaluate("pressure-swirl", "lefebvre-1987", inputs, props)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("FN = %.4g m² = %.3f lb/(h psi^0.5) = %.3f UK gal/(h psi^0.5), C_D = %.3f\n",
		r.FlowNumberSI, r.FlowNumberUS, r.FlowNumberUK, r.DischargeCoefficient)
	for _, e := range r.SMD {
		fmt.Printf("%-20s %.1f µm\n", e.Correlation, e.SMD*1e6)
	}
	fmt.Printf("film %.0f µm\n", r.FilmThickness*1e6)
	// Output:
	// FN = 3.581e-07 m² = 6.590 lb/(h psi^0.5) = 0.843 UK gal/(h psi^0.5), C_D = 0.322
	// lefebvre-1987        52.6 µm
	// radcliffe-1955       74.4 µm
	// jasuja-1979          57.9 µm
	// wang-lefebvre-1987   38.1 µm
	// film 173 µm
}

// The pressure that brings the same nozzle's SMD down to 40 µm at fixed
// flow.
func ExampleSolve() {
	props := atomize.Properties{LiquidDensity: 780, LiquidViscosity: 1.3e-3, SurfaceTension: 0.0275, GasDensity: 1.2, GasViscosity: 1.8e-5}
	inputs := map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	sol, err := atomize.Solve("pressure-swirl", "lefebvre-1987", inputs, props, "delta_p_pa", atomize.Target{SMD: 40e-6})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("reached %v: ΔP = %.4g Pa\n", sol.Reached, sol.Value)
	// Output:
	// reached true: ΔP = 1.727e+06 Pa
}
