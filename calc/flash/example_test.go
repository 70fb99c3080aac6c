package flash_test

import (
	"fmt"

	"fogbench/calc/flash"
	"fogbench/calc/fluid"
)

// Hot water leaving a nozzle at 140 °C into air at 1 atm.
func ExampleAnalyze() {
	water, _ := fluid.Lookup("water")
	r, err := flash.Analyze(water, 413.15, 101325, flash.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("superheat %.1f K, p_sat/p_amb %.2f, regime %s\n", r.DeltaTK, r.PressureRatio, r.Regime)
	fmt.Printf("critical bubble radius %.3g µm\n", r.Nucleus.CriticalRadiusM*1e6)
	fmt.Printf("kinetic limit %.0f K, Peng–Robinson spinodal %.0f K\n", r.KineticLimitK, r.SpinodalK)
	// Output:
	// superheat 40.0 K, p_sat/p_amb 3.57, regime fully flashing
	// critical bubble radius 0.392 µm
	// kinetic limit 578 K, Peng–Robinson spinodal 597 K
}

func ExamplePengRobinson_SaturationPressure() {
	m := flash.PengRobinson{Tc: 540.2, Pc: 2.74e6, Omega: 0.35} // n-heptane-like constants
	p, _ := m.SaturationPressure(371.55)
	sp, _, _ := m.LiquidSpinodal(371.55)
	fmt.Printf("p_sat %.4g kPa, liquid spinodal %.4g MPa\n", p/1e3, sp/1e6)
	// Output:
	// p_sat 101.1 kPa, liquid spinodal -17.28 MPa
}
