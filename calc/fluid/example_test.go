package fluid_test

import (
	"fmt"

	"fogbench/calc/fluid"
)

// Look up a built-in liquid and evaluate its vapor pressure at 25 degC.
func ExampleLookup() {
	water, err := fluid.Lookup("water")
	if err != nil {
		panic(err)
	}
	fmt.Printf("%s p_s(298.15 K) = %.1f Pa\n", water.Name, water.SaturationPressure(298.15))
	heptane, _ := fluid.Lookup("n-heptane")
	tb, _ := heptane.SaturationTemperature(101325)
	fmt.Printf("%s boils at %.2f K\n", heptane.Name, tb)
	_, err = fluid.Lookup("kerosine")
	fmt.Println(err != nil)
	// Output:
	// Water p_s(298.15 K) = 3169.7 Pa
	// n-Heptane boils at 371.55 K
	// true
}
