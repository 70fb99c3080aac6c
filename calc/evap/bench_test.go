package evap

import (
	"math"
	"testing"
)

var (
	sinkState DropState
	sinkF     float64
	sinkH     History
)

// benchConditions returns water in dry air at 25 °C for a regime name.
func benchConditions(regime string) *Conditions {
	c := waterInAir()
	c.Gas = airFilm(0.85, 1870)
	switch regime {
	case "flat":
		c.Curvature = false
	case "kelvin-transition":
		c.Transition = true
	case "abramzon-sirignano":
		c.Transition = true
		c.Convection, c.RelativeVelocity = ConvectionAbramzonSirignano, 3
	}
	return c
}

var benchRegimes = []string{"flat", "kelvin-transition", "abramzon-sirignano"}

func BenchmarkDrop(b *testing.B) {
	for _, r := range benchRegimes {
		b.Run(r, func(b *testing.B) {
			c := benchConditions(r)
			b.ReportAllocs()
			for b.Loop() {
				sinkState, _ = c.Drop(1e-6, 282)
			}
		})
	}
}

func BenchmarkSteadyTemperature(b *testing.B) {
	for _, r := range benchRegimes {
		b.Run(r, func(b *testing.B) {
			c := benchConditions(r)
			b.ReportAllocs()
			for b.Loop() {
				sinkF, _ = c.SteadyTemperature(1e-6)
			}
		})
	}
}

func BenchmarkLifetime(b *testing.B) {
	for _, r := range benchRegimes {
		b.Run(r+"/steady-Ts", func(b *testing.B) {
			c := benchConditions(r)
			b.ReportAllocs()
			for b.Loop() {
				sinkF, _ = c.Lifetime(20e-6, LifetimeOptions{})
			}
		})
	}
}

// BenchmarkHistory runs a full 200-bin history (1–200 µm, log-spaced) to 99 %
// evaporated on 200 time steps and reports the cost per bin-step.
func BenchmarkHistory(b *testing.B) {
	const bins, steps = 200, 200
	d := make([]float64, bins)
	w := make([]float64, bins)
	for i := range d {
		d[i] = 1e-6 * math.Pow(200, float64(i)/(bins-1))
		x := math.Log(d[i] / 40e-6)
		w[i] = math.Exp(-x * x)
	}
	cases := []struct {
		name   string
		regime string
		opts   HistoryOptions
	}{
		{"flat/fixed-Ts", "flat", HistoryOptions{SurfaceTemperature: 282, Steps: steps}},
		{"flat/steady-Ts", "flat", HistoryOptions{Steps: steps}},
		{"kelvin-transition/steady-Ts", "kelvin-transition", HistoryOptions{Steps: steps}},
		{"abramzon-sirignano/steady-Ts", "abramzon-sirignano", HistoryOptions{Steps: steps}},
		{"flat/transient", "flat", HistoryOptions{Transient: true, InjectionTemperature: 298.15, Steps: steps}},
		{"kelvin-transition/transient", "kelvin-transition", HistoryOptions{Transient: true, InjectionTemperature: 298.15, Steps: steps}},
	}
	for _, k := range cases {
		b.Run(k.name, func(b *testing.B) {
			c := benchConditions(k.regime)
			b.ReportAllocs()
			for b.Loop() {
				sinkH, _ = c.History(d, w, k.opts)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/(bins*(steps+1)), "ns/bin-step")
		})
	}
}
