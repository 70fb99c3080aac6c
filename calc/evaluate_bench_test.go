package calc

import "testing"

var sinkResult *Result

// benchCases are 60-bin cases, one per evaporation regime: the path through
// Evaluate differs by surface-temperature treatment and convection model.
func benchCases() []struct {
	name string
	c    Case
} {
	base := func(fluid string, tGas float64) Case {
		return Case{
			Format: CaseFormat, Name: "bench " + fluid, Fluid: fluid,
			Gas:          Gas{PressurePa: 101325, TemperatureK: tGas, VaporMoleFraction: ptr(0), RelativeVelocityMS: 5},
			Distribution: Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 60, DMinM: 1e-6, DMaxM: 300e-6},
		}
	}
	fixed := base("water", 298.15)
	fixed.LiquidTemperatureK = ptr(298.15)
	fixed.Gas.RelativeVelocityMS = 0
	fixed.Evaporation.Convection = "none"
	steady := base("water", 350)
	heptaneAS := base("n-heptane", 400)
	heptaneAS.Evaporation.Convection = "abramzon-sirignano"
	transient := base("water", 400)
	transient.Heating, transient.InjectionTemperatureK = "transient", ptr(293.15)
	return []struct {
		name string
		c    Case
	}{
		{"water/fixed-Ts/stagnant", fixed},
		{"water/steady-Ts/ranz-marshall", steady},
		{"n-heptane/steady-Ts/abramzon-sirignano", heptaneAS},
		{"water/transient/ranz-marshall", transient},
	}
}

// BenchmarkEvaluate is one whole 60-bin case evaluation: classes, per-class
// states and lifetimes, curvature summary, properties and the history.
func BenchmarkEvaluate(b *testing.B) {
	for _, k := range benchCases() {
		b.Run(k.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				r, err := Evaluate(k.c)
				if err != nil {
					b.Fatal(err)
				}
				sinkResult = r
			}
		})
	}
}
