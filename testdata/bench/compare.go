package main

import (
	"fmt"
	"math"
	"strings"

	"fogbench/calc"
)

// Result is what both programs write per case (the reference writes the
// summary, bins and history parts of it).
type Result = calc.Result

// Tolerances of the agreement, per quantity. The per-bin states and the
// size statistics use the same closed forms in both programs, so they agree
// to rounding. Lifetimes and the history come from two different
// quadratures and interpolants of the shrinkage time G(d): fogbench's
// five-point Gauss–Legendre table 1/16 decade apart with a Hermite
// interpolant in ln G, the reference's six-point panels 1/40 decade apart
// with a PCHIP interpolant.
var tolerances = []struct {
	name string
	tol  float64
	kind string // "rel" or "abs" (history diameters: relative to the initial D32)
}{
	{"per-bin states (rel)", 1e-9, "rel"},
	{"size statistics (rel)", 1e-9, "rel"},
	{"lifetimes (rel)", 1e-4, "rel"},
	{"t50, t90, t99 (rel)", 1e-4, "rel"},
	{"history time grid (rel)", 1e-4, "rel"},
	{"evaporated fraction (abs)", 1e-4, "abs"},
	{"history D32, Dv50 (per initial D32)", 1e-3, "abs"},
}

// Agreement holds the worst difference found for each tolerance.
type Agreement struct {
	Worst  []float64
	Where  []string
	Counts int
}

func (a *Agreement) note(k int, diff float64, where string) {
	if diff > a.Worst[k] || math.IsNaN(diff) {
		a.Worst[k], a.Where[k] = diff, where
	}
}

// OK reports whether every worst difference is inside its tolerance.
func (a *Agreement) OK() bool {
	for k, t := range tolerances {
		if !(a.Worst[k] <= t.tol) {
			return false
		}
	}
	return true
}

func (a *Agreement) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "agreement over %d cases:\n", a.Counts)
	for k, t := range tolerances {
		status := "ok"
		if !(a.Worst[k] <= t.tol) {
			status = "EXCEEDED"
		}
		fmt.Fprintf(&b, "  %-38s worst %9.2e  tolerance %7.0e  %s  %s\n", t.name, a.Worst[k], t.tol, status, a.Where[k])
	}
	return b.String()
}

func rel(a, b float64) float64 {
	if a == b {
		return 0
	}
	return math.Abs(a-b) / math.Max(math.Abs(a), math.Abs(b))
}

// Compare checks fogbench's results fb against the reference's py.
func Compare(fb, py []Result) (*Agreement, error) {
	if len(fb) != len(py) {
		return nil, fmt.Errorf("fogbench wrote %d results, the reference %d", len(fb), len(py))
	}
	a := &Agreement{Worst: make([]float64, len(tolerances)), Where: make([]string, len(tolerances)), Counts: len(fb)}
	for c := range fb {
		f, p := fb[c], py[c]
		at := func(s string) string { return fmt.Sprintf("(case %d %s)", c+1, s) }
		if len(f.Bins) != len(p.Bins) {
			return nil, fmt.Errorf("case %d: %d bins against %d", c+1, len(f.Bins), len(p.Bins))
		}
		for i := range f.Bins {
			x, y := f.Bins[i], p.Bins[i]
			for _, q := range []struct {
				name string
				a, b float64
			}{
				{"d_lo_m", x.DLoM, y.DLoM}, {"d_hi_m", x.DHiM, y.DHiM}, {"d_m", x.DM, y.DM},
				{"number_fraction", x.NumberFraction, y.NumberFraction}, {"volume_fraction", x.VolumeFraction, y.VolumeFraction},
				{"laplace_pa", x.LaplacePa, y.LaplacePa}, {"vapor_pressure_pa", x.VaporPressurePa, y.VaporPressurePa},
				{"kelvin_ratio", x.KelvinRatio, y.KelvinRatio}, {"evaporation_enhancement", x.EvaporationEnhancement, y.EvaporationEnhancement},
				{"surface_temperature_k", x.SurfaceTemperatureK, y.SurfaceTemperatureK}, {"knudsen", x.Knudsen, y.Knudsen},
				{"evaporation_rate_kg_s", x.EvaporationRateKgS, y.EvaporationRateKgS},
			} {
				a.note(0, rel(q.a, q.b), at(fmt.Sprintf("bin %d %s", i, q.name)))
			}
			if x.Regime != y.Regime {
				a.note(0, math.Inf(1), at(fmt.Sprintf("bin %d regime %s vs %s", i, x.Regime, y.Regime)))
			}
			if x.LifetimeS == nil || y.LifetimeS == nil {
				a.note(2, math.Inf(1), at(fmt.Sprintf("bin %d lifetime missing", i)))
			} else {
				a.note(2, rel(*x.LifetimeS, *y.LifetimeS), at(fmt.Sprintf("bin %d", i)))
			}
		}
		s, r := f.Summary, p.Summary
		for _, q := range []struct {
			name string
			a, b *float64
		}{{"D10", s.D10M, r.D10M}, {"D20", s.D20M, r.D20M}, {"D30", s.D30M, r.D30M}} {
			switch {
			case q.a == nil && q.b == nil:
			case q.a == nil || q.b == nil:
				a.note(1, math.Inf(1), at(q.name+" missing"))
			default:
				a.note(1, rel(*q.a, *q.b), at("summary"))
			}
		}
		for _, q := range [][2]float64{{s.D32M, r.D32M},
			{s.D43M, r.D43M}, {s.Dv10M, r.Dv10M}, {s.Dv50M, r.Dv50M}, {s.Dv90M, r.Dv90M}, {s.RelativeSpan, r.RelativeSpan}} {
			a.note(1, rel(q[0], q[1]), at("summary"))
		}
		for _, q := range []struct {
			name string
			a, b *float64
		}{{"t50", s.T50S, r.T50S}, {"t90", s.T90S, r.T90S}, {"t99", s.T99S, r.T99S}} {
			if q.a == nil || q.b == nil {
				a.note(3, math.Inf(1), at(q.name+" missing"))
				continue
			}
			a.note(3, rel(*q.a, *q.b), at(q.name))
		}
		h, g := f.History, p.History
		if h == nil || g == nil || len(h.TS) != len(g.TS) {
			return nil, fmt.Errorf("case %d: histories of different shape", c+1)
		}
		d32 := s.D32M
		for k := range h.TS {
			a.note(4, rel(h.TS[k], g.TS[k]), at(fmt.Sprintf("t[%d]", k)))
			a.note(5, math.Abs(h.EvaporatedMassFraction[k]-g.EvaporatedMassFraction[k]), at(fmt.Sprintf("t[%d]", k)))
			a.note(6, math.Abs(h.D32M[k]-g.D32M[k])/d32, at(fmt.Sprintf("D32 at t[%d]", k)))
			a.note(6, math.Abs(h.Dv50M[k]-g.Dv50M[k])/d32, at(fmt.Sprintf("Dv50 at t[%d]", k)))
		}
	}
	return a, nil
}
