package server

import (
	"context"
	"encoding/binary"
	"encoding/json"
	"fmt"
	"math"
	"net/http"
	"strings"
	"testing"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/views"
)

// plantSolventJSON is the user liquid of docs/case-format.md: its viscosity
// is a constant, so the viscosity plot is a flat line on a log axis.
const plantSolventJSON = `{
  "id": "plant-solvent", "name": "Plant solvent", "reference": "supplier sheet 4",
  "molar_mass_kg_mol": 0.100204, "critical_temperature_k": 540.2, "critical_pressure_pa": 2.74e6,
  "critical_volume_m3_mol": 4.28e-4, "normal_boiling_point_k": 371.55, "melting_point_k": 182.57,
  "diffusion_volume": 148.26,
  "vapor_pressure": {"form": "dippr101", "a": 87.829, "b": -6996.4, "c": -9.8802, "d": 7.2099e-6, "e": 2, "t_min_k": 182.57, "t_max_k": 540.2},
  "liquid_density": {"form": "dippr105", "a": 612.59, "b": 0.26211, "c": 540.2, "d": 0.28141, "t_min_k": 182.57, "t_max_k": 540.2},
  "surface_tension": {"form": "power", "a": 0.0522, "b": 1.24, "t_min_k": 183, "t_max_k": 540},
  "liquid_viscosity": {"form": "constant", "value": 4e-4, "t_min_k": 250, "t_max_k": 400},
  "latent_heat": {"form": "dippr106", "a": 50014, "b": 0.38795, "t_min_k": 182.57, "t_max_k": 540.2},
  "liquid_heat_capacity": {"form": "constant", "value": 2240, "t_min_k": 200, "t_max_k": 400},
  "vapor_heat_capacity": {"form": "poling", "a": 9.634, "b": 0.004156, "c": 1.5494e-4, "d": -2.0066e-7, "e": 7.77e-11, "t_min_k": 200, "t_max_k": 1000}
}`

// TestConstantViscosityLiquidPage opens the Liquids page of the documented
// example liquid (constant viscosity): it used to answer 500 because gonum
// put the log axis of a flat series below zero and panicked.
func TestConstantViscosityLiquidPage(t *testing.T) {
	ts, st := newTestServer(t)
	var spec fluid.CustomSpec
	if err := json.Unmarshal([]byte(plantSolventJSON), &spec); err != nil {
		t.Fatal(err)
	}
	if _, err := st.CreateLiquid(context.Background(), spec); err != nil {
		t.Fatal(err)
	}
	c := client(t)
	for _, u := range []string{"/fluids/plant-solvent", "/fluids", "/fluids/plant-solvent?t=300&t_unit=K"} {
		doc, code := getDoc(t, c, ts.URL+u)
		if code != http.StatusOK {
			t.Fatalf("GET %s: status %d, want 200", u, code)
		}
		if u == "/fluids/plant-solvent" {
			if n := doc.Find(`[data-testid=plot-viscosity] svg, #plot-viscosity svg`).Length(); n == 0 {
				t.Errorf("no viscosity plot on %s", u)
			}
		}
	}
}

// hostileSeries are the shapes of data that used to make gonum panic or
// that a plot builder can meet: flat (a constant property), empty, a single
// point, NaN and ±Inf, zero and negative values on a log axis, lengths that
// disagree, and extreme magnitudes.
var hostileSeries = map[string]series{
	"flat":            {X: []float64{250, 300, 350, 400}, Y: []float64{0.4, 0.4, 0.4, 0.4}},
	"flat zero":       {X: []float64{1, 2, 3}, Y: []float64{0, 0, 0}},
	"flat negative":   {X: []float64{1, 2, 3}, Y: []float64{-2, -2, -2}},
	"flat x":          {X: []float64{5, 5, 5}, Y: []float64{1, 2, 3}},
	"nearly flat":     {X: []float64{1, 2}, Y: []float64{1e15, 1e15 + 0.125}},
	"empty":           {},
	"single point":    {X: []float64{3}, Y: []float64{7}},
	"not finite":      {X: []float64{1, 2, 3, 4}, Y: []float64{math.NaN(), math.Inf(1), math.Inf(-1), 2}},
	"non-positive":    {X: []float64{-1, 0, 1, 2}, Y: []float64{-5, 0, -1, 0}},
	"lengths differ":  {X: []float64{1, 2, 3, 4, 5}, Y: []float64{1, 2}},
	"huge range":      {X: []float64{1e-300, 1e300}, Y: []float64{1e-300, 1e300}},
	"beyond range":    {X: []float64{1, 2, 3}, Y: []float64{1e308, -1e308, 5e-324}},
	"subnormal only":  {X: []float64{1, 2}, Y: []float64{5e-324, 1e-320}},
	"negative colour": {X: []float64{1, 2}, Y: []float64{1, 2}, Color: -3},
}

// TestChartsDrawHostileSeries draws every hostile series alone and beside a
// normal one, on every combination of axes, with marks inside and outside
// the data: no panic, and a chart with anything drawable gives an SVG
// whose numbers are all finite.
func TestChartsDrawHostileSeries(t *testing.T) {
	normal := series{Name: "normal", X: []float64{1, 10, 100}, Y: []float64{2, 3, 5}}
	for name, hs := range hostileSeries {
		hs.Name = name
		for _, withNormal := range []bool{false, true} {
			for _, axes := range [][2]bool{{false, false}, {true, false}, {false, true}, {true, true}} {
				c := chart{Title: name, XLabel: "x", YLabel: "y", LogX: axes[0], LogY: axes[1],
					Series: []series{hs}, Marks: []float64{5, -1, math.NaN(), 1e9}, MarkNames: []string{"m"}}
				if withNormal {
					c.Series = append(c.Series, normal)
				}
				svg, err := drawNoPanic(t, c)
				if withNormal && err != nil {
					t.Errorf("%s %v beside a normal series: %v", name, axes, err)
				}
				if err == nil && (!strings.Contains(svg, "<svg") || strings.Contains(svg, "NaN") || strings.Contains(svg, "Inf")) {
					t.Errorf("%s %v: SVG without <svg> or with NaN/Inf coordinates", name, axes)
				}
			}
		}
	}
	// A flat series alone still draws (the viscosity of a constant-viscosity
	// liquid), with its value inside the axis range.
	for _, logY := range []bool{false, true} {
		p, err := chart{LogY: logY, Series: []series{hostileSeries["flat"]}}.newPlot()
		if err != nil {
			t.Fatalf("flat, log %v: %v", logY, err)
		}
		if !(p.Y.Min < 0.4 && 0.4 < p.Y.Max) || (logY && p.Y.Min <= 0) {
			t.Errorf("flat at 0.4, log %v: y axis %g…%g", logY, p.Y.Min, p.Y.Max)
		}
	}
}

// drawNoPanic draws c to SVG and PNG, failing the test (not the binary) on
// a panic.
func drawNoPanic(t *testing.T, c chart) (svg string, err error) {
	t.Helper()
	defer func() {
		if r := recover(); r != nil {
			t.Errorf("chart %q (log x %v, log y %v) panicked: %v", c.Title, c.LogX, c.LogY, r)
			err = fmt.Errorf("panic")
		}
	}()
	svg, err = c.SVG()
	if err == nil {
		_, err = c.PNG(30)
	}
	return svg, err
}

// fuzzResult builds a calc.Result from fuzzed numbers: classes from
// consecutive values (edges, fractions, ratios), a history from the rest,
// and the marks from the first few.
func fuzzResult(v []float64) *calc.Result {
	at := func(i int) float64 {
		if len(v) == 0 {
			return 0
		}
		return v[i%len(v)]
	}
	r := &calc.Result{}
	nb := len(v) / 4
	for i := range nb {
		r.Bins = append(r.Bins, calc.BinResult{DLoM: at(4 * i), DHiM: at(4*i + 1), DM: at(4*i + 2),
			NumberFraction: at(4*i + 3), VolumeFraction: at(4*i + 1), KelvinRatio: at(4*i + 2), EvaporationEnhancement: at(4 * i)})
	}
	if len(v) >= 2 {
		h := &calc.History{}
		for i := range len(v) / 2 {
			h.TS = append(h.TS, at(2*i))
			h.EvaporatedMassFraction = append(h.EvaporatedMassFraction, at(2*i+1))
			h.XM = append(h.XM, at(i))
		}
		h.D32M, h.Dv50M = v[:len(v)/3], v[len(v)/3:]
		r.History = h
	}
	x0, x1, x2 := at(0), at(1), at(2)
	r.Summary.D32M, r.Summary.Dv50M, r.Summary.Dv10M, r.Summary.Dv90M = x0, x1, x2, at(3)
	r.Summary.T50S, r.Summary.T90S = &x0, &x1
	r.Curvature.Enhancement1PctDM, r.Curvature.KelvinCriticalRadiusM = &x1, &x2
	return r
}

// FuzzPlotBuilders feeds every chart builder of the case, report and
// compare pages, and a raw chart on each kind of axes, with numbers taken
// from the fuzzer's bytes (eight bytes a float, at most 48): no builder or
// drawing may panic. The seeds are the hostile shapes above.
func FuzzPlotBuilders(f *testing.F) {
	enc := func(vs ...float64) []byte {
		b := make([]byte, 0, 8*len(vs))
		for _, v := range vs {
			b = binary.LittleEndian.AppendUint64(b, math.Float64bits(v))
		}
		return b
	}
	f.Add(enc(1e-6, 2e-6, 1.5e-6, 0.5, 2e-6, 4e-6, 3e-6, 0.5), uint8(0))
	f.Add(enc(0.4, 0.4, 0.4, 0.4, 0.4, 0.4, 0.4, 0.4), uint8(3))
	f.Add(enc(math.NaN(), math.Inf(1), -1, 0, 5e-324, 1e308, 1e-300, 1e300), uint8(2))
	f.Add(enc(7), uint8(1))
	f.Add([]byte{}, uint8(3))
	f.Fuzz(func(t *testing.T, raw []byte, axes uint8) {
		defer func() {
			if p := recover(); p != nil {
				t.Fatalf("a chart builder or drawing panicked: %v", p)
			}
		}()
		runBuilders(raw, axes)
	})
}

// runBuilders runs every chart builder on numbers taken from raw and draws
// each chart to SVG.
func runBuilders(raw []byte, axes uint8) {
	{
		var v []float64
		for i := 0; i+8 <= len(raw) && len(v) < 48; i += 8 {
			v = append(v, math.Float64frombits(binary.LittleEndian.Uint64(raw[i:])))
		}
		r := fuzzResult(v)
		charts := []chart{volumeChart(r), curvatureChart(r), sizeDensityChart(r, nil), cumulativeChart(r, nil)}
		for _, b := range []func(*calc.Result) (chart, bool){historyChart, sizeHistoryChart, distanceChart} {
			if c, ok := b(r); ok {
				charts = append(charts, c)
			}
		}
		for _, cc := range compareCharts([]views.CompareCase{{ID: 1, Name: "a", Result: r}, {ID: 2, Name: "b"}}) {
			charts = append(charts, cc.chart)
		}
		half := len(v) / 2
		charts = append(charts, chart{LogX: axes&1 != 0, LogY: axes&2 != 0,
			Series: []series{{X: v[:half], Y: v[half:]}, {X: v[half:], Y: v[:half]}}, Marks: v})
		for _, c := range charts {
			func() {
				defer func() {
					if p := recover(); p != nil {
						panic(fmt.Sprintf("chart %q (log x %v, log y %v): %v", c.Title, c.LogX, c.LogY, p))
					}
				}()
				_, _ = c.SVG()
			}()
		}
	}
}
