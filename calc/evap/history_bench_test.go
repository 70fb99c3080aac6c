package evap

import (
	"fmt"
	"math"
	"testing"
)

// BenchmarkHistoryScaling shows how the history's cost grows with the
// number of bins and of time steps (fixed surface temperature, Kelvin and
// transition factors on): the shrinkage table costs the same for any bin
// count, the sweep grows as bins × steps.
func BenchmarkHistoryScaling(b *testing.B) {
	for _, k := range []struct{ bins, steps int }{
		{50, 200}, {200, 200}, {800, 200}, {200, 50}, {200, 800},
	} {
		d := make([]float64, k.bins)
		w := make([]float64, k.bins)
		for i := range d {
			d[i] = 1e-6 * math.Pow(200, float64(i)/float64(k.bins-1))
			x := math.Log(d[i] / 40e-6)
			w[i] = math.Exp(-x * x)
		}
		b.Run(fmt.Sprintf("bins=%d/steps=%d", k.bins, k.steps), func(b *testing.B) {
			c := benchConditions("kelvin-transition")
			opts := HistoryOptions{SurfaceTemperature: 282, Steps: k.steps}
			b.ReportAllocs()
			for b.Loop() {
				sinkH, _ = c.History(d, w, opts)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(k.bins*(k.steps+1)), "ns/bin-step")
		})
	}
}
