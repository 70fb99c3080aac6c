package flash

import (
	"testing"

	"fogbench/calc/fluid"
)

var sinkResult Result
var sinkFloat float64

// BenchmarkAnalyze runs one superheat analysis per regime: just above
// saturation, transitional, fully flashing, and past the kinetic limit.
func BenchmarkAnalyze(b *testing.B) {
	water, _ := fluid.Lookup("water")
	for _, c := range []struct {
		name string
		T    float64
	}{{"near-saturation", 373.5}, {"transitional", 390}, {"fully-flashing", 450}, {"past-kinetic-limit", 585}} {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				r, err := Analyze(water, c.T, 101325, Options{})
				if err != nil {
					b.Fatal(err)
				}
				sinkResult = r
			}
		})
	}
}

// BenchmarkPengRobinson times the saturation pressure far from and close
// to the critical point, and the spinodal temperature.
func BenchmarkPengRobinson(b *testing.B) {
	m := PengRobinson{Tc: 540.2, Pc: 2.74e6, Omega: 0.35}
	for _, c := range []struct {
		name string
		f    func() (float64, error)
	}{
		{"psat-Tr0.6", func() (float64, error) { return m.SaturationPressure(0.6 * m.Tc) }},
		{"psat-Tr0.999", func() (float64, error) { return m.SaturationPressure(0.999 * m.Tc) }},
		{"spinodal-T-1atm", func() (float64, error) { return m.SpinodalTemperature(101325) }},
	} {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				v, err := c.f()
				if err != nil {
					b.Fatal(err)
				}
				sinkFloat = v
			}
		})
	}
}
