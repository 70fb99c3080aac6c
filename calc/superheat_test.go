package calc

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"math"
	"os"
	"strings"
	"testing"

	"fogbench/calc/fluid"
)

var updateSubcooled = flag.Bool("update-subcooled", false, "rewrite testdata/flash/subcooled_golden.json from the current Evaluate")

const subcooledGolden = "../testdata/flash/subcooled_golden.json"

// steadyGoldenTol is the golden's tolerance on what follows from a solved
// steady surface temperature. A class's steady temperature is accepted at
// a heat-balance residual of 1e-11 ṁL (secant steps from the previous
// class) or at Brent's 1e-12 of T (the bracketing solve); either leaves a
// few 1e-11 in the rate and the states (evap's TestStateSweepMatchesDropAndSteadyState
// measures 7.7e-11 between the two), so a solver change moves them by that
// much; 1e-9 is well above it and far below any change of the physics.
const steadyGoldenTol = 1e-9

// The superheat path must leave subcooled cases alone. The golden file
// holds `fogbench eval testdata/flash/subcooled_cases.json` as written
// before calc/superheat.go existed (same cases: steady water, heptane at a
// fixed 330 K, transient decane, water in supersaturated air). Every value
// there must come back unchanged (rel 1e-12; per-class states and the
// property and curvature summaries, which follow from solved steady
// temperatures, rel steadyGoldenTol; lifetimes, evaporated-mass times and
// the history, which are quadratures others may refine, rel 1e-4); the
// only keys allowed to be new are "grows" (per class, supersaturated
// surroundings only). After a
// deliberate change to the evaporation results, regenerate with
// `go test ./calc -run SubcooledUnchanged -update-subcooled` and review
// the diff.
func TestSubcooledUnchanged(t *testing.T) {
	f, err := os.Open("../testdata/flash/subcooled_cases.json")
	if err != nil {
		t.Fatal(err)
	}
	cases, err := Decode(f)
	f.Close()
	if err != nil {
		t.Fatal(err)
	}
	var results []*Result
	for _, c := range cases {
		r, err := Evaluate(c)
		if err != nil {
			t.Fatalf("%s: %v", c.Name, err)
		}
		if r.Superheat != nil {
			t.Errorf("%s: subcooled case got a superheat object", c.Name)
		}
		results = append(results, r)
	}
	got, err := json.Marshal(results)
	if err != nil {
		t.Fatal(err)
	}
	if *updateSubcooled {
		if err := os.WriteFile(subcooledGolden, append(got, '\n'), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(subcooledGolden)
	if err != nil {
		t.Fatal(err)
	}
	var g, w any
	if err := json.Unmarshal(got, &g); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(want, &w); err != nil {
		t.Fatal(err)
	}
	var diffs []string
	compareJSON("", w, g, &diffs)
	for i, d := range diffs {
		if i == 20 {
			t.Errorf("… and %d more", len(diffs)-20)
			break
		}
		t.Error(d)
	}
	// The supersaturated case marks its classes.
	last := results[len(results)-1]
	if last.Curvature.KelvinCriticalRadiusM == nil {
		t.Fatal("supersaturated case has no Kelvin critical radius")
	}
	for _, b := range last.Bins {
		if b.Grows == nil || *b.Grows != (b.DM/2 > *last.Curvature.KelvinCriticalRadiusM) {
			t.Errorf("d = %g: grows %v with r* = %g", b.DM, b.Grows, *last.Curvature.KelvinCriticalRadiusM)
		}
	}
	if results[0].Bins[0].Grows != nil {
		t.Error("grows set without supersaturation")
	}
}

// compareJSON reports every difference of got from want: missing keys,
// changed strings, numbers off by more than the tolerances of
// TestSubcooledUnchanged. New keys in
// got are allowed only for "grows".
func compareJSON(path string, want, got any, diffs *[]string) {
	switch w := want.(type) {
	case map[string]any:
		g, ok := got.(map[string]any)
		if !ok {
			*diffs = append(*diffs, fmt.Sprintf("%s: object became %T", path, got))
			return
		}
		for k, v := range w {
			gv, ok := g[k]
			if !ok {
				*diffs = append(*diffs, fmt.Sprintf("%s/%s: missing", path, k))
				continue
			}
			compareJSON(path+"/"+k, v, gv, diffs)
		}
		for k := range g {
			if _, ok := w[k]; !ok && k != "grows" {
				*diffs = append(*diffs, fmt.Sprintf("%s/%s: new key", path, k))
			}
		}
	case []any:
		g, ok := got.([]any)
		if !ok || len(g) != len(w) {
			*diffs = append(*diffs, fmt.Sprintf("%s: array of %d became %v", path, len(w), got))
			return
		}
		for i := range w {
			compareJSON(fmt.Sprintf("%s/%d", path, i), w[i], g[i], diffs)
		}
	case float64:
		tol := 1e-12
		if strings.Contains(path, "/bins/") || strings.Contains(path, "/properties/") || strings.Contains(path, "/curvature/") || strings.Contains(path, "/equilibrium/") {
			tol = steadyGoldenTol
		}
		if strings.HasSuffix(path, "/lifetime_s") || strings.Contains(path, "/history/") ||
			strings.HasSuffix(path, "/t50_s") || strings.HasSuffix(path, "/t90_s") || strings.HasSuffix(path, "/t99_s") {
			tol = 1e-4
		}
		g, ok := got.(float64)
		if !ok || math.Abs(g-w) > tol*math.Max(math.Abs(w), math.Abs(g)) {
			*diffs = append(*diffs, fmt.Sprintf("%s: %v became %v", path, w, got))
		}
	default:
		if want != got {
			*diffs = append(*diffs, fmt.Sprintf("%s: %v became %v", path, want, got))
		}
	}
}

// Property test: superheated cases over a grid of liquids, pressures and
// temperatures (fixed drop temperature and transient injection) evaluate
// without error into JSON (which refuses NaN and Inf), with a superheat
// object whose figures are non-negative, null lifetimes and no history.
func TestSuperheatedCasesFiniteGrid(t *testing.T) {
	n := 0
	for _, id := range []string{"water", "n-heptane", "n-dodecane", "ethanol", "diesel-surrogate"} {
		l, err := fluid.Lookup(id)
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range []float64{5e3, 101325, 1e6} {
			ts, err := l.SaturationTemperature(p)
			if err != nil {
				t.Fatal(err)
			}
			tc := l.CriticalTemperature()
			for _, frac := range []float64{0, 0.02, 0.3, 0.7, 0.99} {
				T := ts + 0.01 + frac*(tc-ts-0.02)
				for _, transient := range []bool{false, true} {
					c := Case{Format: CaseFormat, Name: "grid", Fluid: id,
						Gas:          Gas{ID: "nitrogen", PressurePa: p, TemperatureK: 600},
						Distribution: Distribution{Model: "rosin-rammler", XM: 3e-5, Q: 2.5, Bins: 12},
						Evaporation:  Evaporation{MassFlowKgS: 0.01}}
					tt := T
					if transient {
						c.Heating, c.InjectionTemperatureK = "transient", &tt
					} else {
						c.LiquidTemperatureK = &tt
					}
					r, err := Evaluate(c)
					if err != nil {
						t.Errorf("%s p = %g T = %.2f transient %v: %v", id, p, T, transient, err)
						continue
					}
					n++
					checkSuperheated(t, fmt.Sprintf("%s p = %g T = %.2f", id, p, T), r)
				}
			}
		}
	}
	if n < 100 {
		t.Errorf("only %d superheated cases evaluated", n)
	}
}

func checkSuperheated(t *testing.T, name string, r *Result) {
	t.Helper()
	var buf bytes.Buffer
	if err := json.NewEncoder(&buf).Encode(r); err != nil {
		t.Errorf("%s: %v", name, err)
		return
	}
	sh := r.Superheat
	if sh == nil {
		t.Errorf("%s: no superheat object", name)
		return
	}
	for k, v := range map[string]float64{"delta_t_k": sh.DeltaTK, "jakob": sh.Jakob, "nucleation_rate_m3_s": sh.NucleationRateM3S,
		"bubble_vapor_pressure_pa": sh.BubbleVaporPressurePa} {
		if !(v >= 0) {
			t.Errorf("%s: %s = %g", name, k, v)
		}
	}
	if !(sh.PressureRatio >= 1) || sh.Regime == "" || sh.Note == "" {
		t.Errorf("%s: R_p = %g, regime %q", name, sh.PressureRatio, sh.Regime)
	}
	for k, v := range map[string]*float64{"critical_bubble_radius_m": sh.CriticalBubbleRadiusM, "kinetic_limit_k": sh.KineticLimitK, "spinodal_k": sh.SpinodalK} {
		if v != nil && !(*v > 0) {
			t.Errorf("%s: %s = %g", name, k, *v)
		}
	}
	if r.History != nil || r.Summary.T50S != nil {
		t.Errorf("%s: history computed for a superheated liquid", name)
	}
	for _, b := range r.Bins {
		if b.LifetimeS != nil || b.EvaporationRateKgS != 0 || !(b.LaplacePa >= 0) || !(b.KelvinRatio >= 1) || b.Knudsen < 0 {
			t.Errorf("%s: class %g m: %+v", name, b.DM, b)
			break
		}
	}
	found := false
	for _, w := range r.Warnings {
		found = found || strings.Contains(w, "quasi-steady evaporation model does not apply")
	}
	if !found {
		t.Errorf("%s: no warning that the evaporation model does not apply: %q", name, r.Warnings)
	}
}
