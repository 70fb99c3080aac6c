package calc

import (
	"math"
	"strings"
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

// Linear classes warn when one holds more than 20 % of the volume: over
// 1 µm – 2 mm ten linear classes put nearly all of a 50 µm Rosin–Rammler
// in the first; 200 linear classes over 1–300 µm do not.
func TestLinearClassesWarnWhenCoarse(t *testing.T) {
	for _, tc := range []struct {
		bins       int
		dmin, dmax float64
		warn       bool
	}{{10, 1e-6, 2e-3, true}, {200, 1e-6, 300e-6, false}} {
		c := waterCase()
		c.Distribution = Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: tc.bins, DMinM: tc.dmin, DMaxM: tc.dmax, Spacing: "linear"}
		res, err := Evaluate(c)
		if err != nil {
			t.Fatal(err)
		}
		warned := false
		for _, w := range res.Warnings {
			warned = warned || strings.Contains(w, "linear classes are too coarse")
		}
		maxV := 0.0
		for _, b := range res.Bins {
			maxV = math.Max(maxV, b.VolumeFraction)
		}
		if warned != tc.warn || warned != (maxV > 0.2) {
			t.Errorf("%d classes %g–%g m: warned %v, largest class %.3g of the volume", tc.bins, tc.dmin, tc.dmax, warned, maxV)
		}
	}
}

// Number means a model does not have are null with a warning: a
// Rosin–Rammler's number moment of order 0 converges only for q > 3
// (q0 ∝ D^(q−4) e^(−(D/X)^q); Rosin & Rammler 1933 form), so D10, D20 and
// D30 exist only then. They used to follow the lower cut.
func TestNumberMeansThatDoNotExistAreNull(t *testing.T) {
	for _, q := range []float64{2.5, 3, 3.5, 4.5} {
		c := waterCase()
		c.Distribution = Distribution{Model: "rosin-rammler", XM: 50e-6, Q: q, Bins: 40, DMinM: 1e-6, DMaxM: 300e-6}
		res, err := Evaluate(c)
		if err != nil {
			t.Fatal(err)
		}
		s := res.Summary
		warned := 0
		for _, w := range res.Warnings {
			if strings.Contains(w, "left out (null)") {
				warned++
				if !strings.HasPrefix(w, "D10, D20 and D30 are left out") || !strings.Contains(w, "q > 3") {
					t.Errorf("q = %g: warning %q", q, w)
				}
			}
		}
		data, err := res.AppendJSON(nil)
		if err != nil {
			t.Fatal(err)
		}
		nulls := strings.Contains(string(data), `"d10_m":null,"d20_m":null,"d30_m":null`)
		if q <= 3 {
			if s.D10M != nil || s.D20M != nil || s.D30M != nil || warned != 1 || !nulls {
				t.Errorf("q = %g: D10 %v D20 %v D30 %v, %d warnings, JSON nulls %v", q, s.D10M, s.D20M, s.D30M, warned, nulls)
			}
			continue
		}
		if s.D10M == nil || s.D20M == nil || s.D30M == nil || warned != 0 {
			t.Fatalf("q = %g: a mean is missing or warned about (%d)", q, warned)
		}
		// D30 of the model X [Γ(1)/Γ(1 − 3/q)]^(1/3), within what the
		// classes' cut at 1 µm leaves out (slowly converging near q = 3).
		want := 50e-6 * math.Pow(1/math.Gamma(1-3/q), 1.0/3)
		if tol := map[float64]float64{3.5: 0.1, 4.5: 0.01}[q]; math.Abs(*s.D30M/want-1) > tol {
			t.Errorf("q = %g: D30 %.4g µm, model %.4g µm", q, *s.D30M*1e6, want*1e6)
		}
	}
}
