package calc

import (
	"math"
	"testing"
)

// The history starts from the classes the summary describes: its D32 at
// t = 0 is the summary's D32 (the class-average rule of ASTM E799) to
// 1e-9, however coarse the classes; it used to start each class at its
// geometric-mean diameter, up to 95 % off on coarse classes.
func TestHistoryStartsAtTheSummaryD32(t *testing.T) {
	for _, tc := range []struct {
		name string
		d    Distribution
	}{
		{"2 log classes", Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 2, DMinM: 1e-6, DMaxM: 300e-6}},
		{"5 linear classes", Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 5, DMinM: 1e-6, DMaxM: 300e-6, Spacing: "linear"}},
		{"40 log classes", Distribution{Model: "log-normal", MedianM: 30e-6, GSD: 2, Basis: "volume", Bins: 40}},
		{"measured classes", Distribution{Model: "bins", EdgesM: []float64{1e-6, 10e-6, 50e-6, 200e-6}, Fraction: []float64{0.2, 0.5, 0.3}, Basis: "volume"}},
	} {
		for _, heating := range []string{"", "transient"} {
			c := waterCase()
			c.Distribution = tc.d
			if heating != "" {
				c.LiquidTemperatureK, c.Heating, c.InjectionTemperatureK = nil, heating, ptr(293.15)
			}
			res, err := Evaluate(c)
			if err != nil {
				t.Errorf("%s %s: %v", tc.name, heating, err)
				continue
			}
			got, want := res.History.D32M[0], res.Summary.D32M
			if math.Abs(got/want-1) > 1e-9 {
				t.Errorf("%s %s: D32(t=0) = %.6g µm, summary D32 = %.6g µm", tc.name, heating, got*1e6, want*1e6)
			}
		}
	}
}
