package server

import (
	"context"
	"encoding/csv"
	"io"
	"net/http"
	"net/url"
	"strconv"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/calc"
	"fogbench/calc/units"
	"fogbench/views"
)

// highPressureCases are the operating points the equilibrium block is
// shown for: the kerosene-like n-dodecane at 20 bar in 700 K air with the
// steady temperature (mixture critical point present, no class reaches
// it), and n-heptane in N2 at 60 bar with transient heating, at 900 K
// (no class transcritical) and at 1200 K, where every class's surface
// reaches the mixture critical point (calc: TestTranscriticalClassesAreMarked
// uses 2000 K; at 60 bar the switch lies between 1160 and 1170 K).
func highPressureCases() []calc.Case {
	inj := 300.0
	return []calc.Case{
		{Format: calc.CaseFormat, Name: "dodecane 20 bar 700 K", Fluid: "n-dodecane", Heating: "steady",
			Gas:          calc.Gas{ID: "air", PressurePa: 20e5, TemperatureK: 700},
			Distribution: calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 10}},
		{Format: calc.CaseFormat, Name: "heptane 60 bar 900 K", Fluid: "n-heptane", Heating: "transient", InjectionTemperatureK: &inj,
			Gas:          calc.Gas{ID: "nitrogen", PressurePa: 60e5, TemperatureK: 900},
			Distribution: calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 8}},
		{Format: calc.CaseFormat, Name: "heptane 60 bar 1200 K", Fluid: "n-heptane", Heating: "transient", InjectionTemperatureK: &inj,
			Gas:          calc.Gas{ID: "nitrogen", PressurePa: 60e5, TemperatureK: 1200},
			Distribution: calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 8}},
	}
}

// equilibriumKeys are calc's JSON keys of the equilibrium block: no page,
// report or PDF shows them. (latent_heat_j_kg is left out: the properties
// panel names the liquid's property keys of the fluid file on purpose.)
var equilibriumKeys = []string{"flat_vapor_pressure_pa", "poynting_factor", "fugacity_factor", "enhancement_factor",
	"dissolved_gas_mole_fraction", "mixture_critical_temperature_k", "FlatVaporPressurePa", "EnhancementFactor"}

func norm(s string) string { return strings.Join(strings.Fields(s), " ") }

// The case page, the print report and the PDF show calc's equilibrium block
// (at the reference surface temperature) formatted in the display units of
// SI and US customary, with the method; transcritical classes are marked in
// the per-class table with a legend and their warning is listed; no
// internal key shows. The comparison shows the same rows.
func TestPagesShowSurfaceEquilibrium(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	var ids []string
	for _, k := range highPressureCases() {
		res, err := calc.Evaluate(k)
		if err != nil {
			t.Fatalf("%s: %v", k.Name, err)
		}
		e := res.Equilibrium
		if e == nil || e.MixtureCriticalTemperatureK == nil {
			t.Fatalf("%s: equilibrium block %+v", k.Name, e)
		}
		rec, err := st.CreateCase(ctx, k, "tester")
		if err != nil {
			t.Fatal(err)
		}
		id := itoa(rec.ID)
		ids = append(ids, id)
		nTrans := 0
		for _, b := range res.Bins {
			if b.Transcritical {
				nTrans++
			}
		}
		if want := k.Gas.TemperatureK == 1200; want != (nTrans > 0) {
			t.Fatalf("%s: %d transcritical classes", k.Name, nTrans)
		}
		for _, sys := range []string{"si", "us"} {
			c := client(t)
			resp := postForm(t, c, ts.URL+"/settings/units", url.Values{"system": {sys}, "back": {"/"}})
			resp.Body.Close()
			d := views.Display{System: units.System(sys)}
			figs := views.EquilibriumFiguresOf(d, e)
			if len(figs) != 6 {
				t.Fatalf("%s: %d equilibrium figures", k.Name, len(figs))
			}
			want := map[string]string{}
			for _, f := range figs {
				want[f.ID] = norm(f.Value + " " + f.Unit)
			}
			// Independent of the view's own formatting: the value shown
			// parses back to calc's to its shown precision.
			pu := map[string]string{"si": "kPa", "us": "psi"}[sys]
			if !strings.HasSuffix(want["flat-pressure"], pu) {
				t.Errorf("%s %s: flat vapour pressure %q not in %s", k.Name, sys, want["flat-pressure"], pu)
			}
			checkClose(t, k.Name+" poynting", want["poynting"], e.PoyntingFactor, 1e-6)
			checkClose(t, k.Name+" enhancement", want["enhancement"], e.EnhancementFactor, 1e-6)
			checkClose(t, k.Name+" dissolved", strings.TrimSuffix(want["dissolved"], " mol %"), e.DissolvedGasMoleFraction*100, 1e-3)
			tc := *e.MixtureCriticalTemperatureK - 273.15 // °C
			if sys == "us" {
				tc = tc*9/5 + 32 // °F
			}
			checkClose(t, k.Name+" critical T", strings.Fields(want["critical"])[0], tc, 1e-4)

			for _, path := range []string{"/cases/" + id, "/cases/" + id + "/report"} {
				doc, code := getDoc(t, c, ts.URL+path)
				if code != http.StatusOK {
					t.Fatalf("%s: status %d", path, code)
				}
				for fid, w := range want {
					if got := norm(doc.Find(`[data-testid="eq-` + fid + `"]`).Text()); got != w {
						t.Errorf("%s %s %s: eq-%s shows %q, want %q", k.Name, sys, path, fid, got, w)
					}
				}
				if m := doc.Find(`[data-testid="eq-method"]`).Text(); !strings.Contains(m, e.Method) || !strings.Contains(m, "Peng–Robinson (1976)") {
					t.Errorf("%s %s: method %q", k.Name, path, m)
				}
				html, _ := doc.Html()
				text := doc.Text()
				assertNone(t, k.Name+" "+path, text, equilibriumKeys)
				assertNone(t, k.Name+" "+path+" html", html, equilibriumKeys)
				if !strings.Contains(text, "Vapour pressure over a flat surface at the gas pressure") || !strings.Contains(text, "Poynting factor (liquid at the gas pressure)") {
					t.Errorf("%s %s: labels missing", k.Name, path)
				}
				rows := doc.Find(`[data-testid="bin-table"] tbody tr`)
				if rows.Length() != len(res.Bins) {
					t.Fatalf("%s: %d rows for %d classes", path, rows.Length(), len(res.Bins))
				}
				rows.Each(func(i int, tr *goquery.Selection) {
					marked := tr.HasClass("transcritical") && strings.Contains(tr.Text(), views.TranscriticalLifetime)
					if marked != res.Bins[i].Transcritical {
						t.Errorf("%s %s class %d: marked %v, calc transcritical %v", k.Name, path, i+1, marked, res.Bins[i].Transcritical)
					}
				})
				note := doc.Find(`[data-testid="transcritical-note"]`).Text()
				warn := doc.Find(`[data-testid="warnings"]`).Text()
				if nTrans > 0 {
					if !strings.Contains(note, "‡") || !strings.Contains(note, itoa(int64(nTrans))+" of "+itoa(int64(len(res.Bins)))) {
						t.Errorf("%s %s: legend %q", k.Name, path, note)
					}
					if !strings.Contains(warn, "mixture critical point") {
						t.Errorf("%s %s: no transcritical warning in %q", k.Name, path, warn)
					}
				} else if note != "" {
					t.Errorf("%s %s: legend %q without transcritical classes", k.Name, path, note)
				}
			}

			pdf := pdfToText(t, getWith(t, c, ts.URL+"/cases/"+id+"/report.pdf"))
			flat := norm(pdf)
			for fid, w := range want {
				if !strings.Contains(flat, w) {
					t.Errorf("%s %s PDF: eq-%s %q missing", k.Name, sys, fid, w)
				}
			}
			for _, label := range []string{"Surface equilibrium at the gas pressure", "Vapour fugacity factor", "Enhancement over p_sat", "Gas dissolved in the liquid", "Mixture critical temperature"} {
				if !strings.Contains(flat, label) {
					t.Errorf("%s %s PDF: %q missing", k.Name, sys, label)
				}
			}
			if nTrans > 0 && !strings.Contains(flat, "Transcritical: the surface of") {
				t.Errorf("%s PDF: no transcritical legend", k.Name)
			}
			assertNone(t, k.Name+" PDF", pdf, equilibriumKeys)
		}

		// Summary CSV: the equilibrium columns at full precision.
		rows := readCSVRows(t, ts.URL+"/cases/"+id+"/summary.csv")
		col := map[string]int{}
		for i, h := range rows[0] {
			col[h] = i
		}
		for name, v := range map[string]float64{"flat_vapor_pressure (Pa)": e.FlatVaporPressurePa, "poynting_factor (-)": e.PoyntingFactor,
			"fugacity_factor (-)": e.FugacityFactor, "enhancement_factor (-)": e.EnhancementFactor,
			"dissolved_gas_mole_fraction (-)": e.DissolvedGasMoleFraction, "latent_heat_at_surface (J/kg)": e.LatentHeatJKg,
			"mixture_critical_temperature (K)": *e.MixtureCriticalTemperatureK, "equilibrium_surface_temperature (K)": e.TemperatureK} {
			i, ok := col[name]
			if !ok {
				t.Fatalf("summary CSV: no column %q", name)
			}
			got, err := strconv.ParseFloat(rows[1][i], 64)
			if err != nil || got != v {
				t.Errorf("%s summary CSV %s = %q, want %v", k.Name, name, rows[1][i], v)
			}
		}
		// bins.csv: one transcritical flag per class, as calc marks it.
		bins := readCSVRows(t, ts.URL+"/cases/"+id+"/bins.csv")
		last := len(bins[0]) - 1
		if bins[0][last] != "transcritical" || len(bins) != len(res.Bins)+1 {
			t.Fatalf("bins CSV header %q, %d rows", bins[0], len(bins))
		}
		for i, b := range res.Bins {
			if got := bins[i+1][last]; got != strconv.FormatBool(b.Transcritical) {
				t.Errorf("%s bins CSV class %d: transcritical %q", k.Name, i+1, got)
			}
		}
		if got := rows[1][col["equilibrium_method"]]; got != e.Method {
			t.Errorf("%s summary CSV method %q", k.Name, got)
		}
	}

	// The comparison shows the equilibrium rows, without internal keys.
	doc, code := getDoc(t, client(t), ts.URL+"/compare?ids="+strings.Join(ids, ",")+"&base="+ids[0])
	if code != http.StatusOK {
		t.Fatalf("compare: status %d", code)
	}
	text := doc.Find(`[data-testid="compare-results"]`).Text()
	for _, label := range []string{"Vapour pressure over a flat surface at the gas pressure", "Poynting factor (liquid at the gas pressure)", "Vapour fugacity factor", "Enhancement over p_sat", "Gas dissolved in the liquid", "Mixture critical temperature"} {
		if !strings.Contains(text, label) {
			t.Errorf("compare: %q missing", label)
		}
	}
	assertNone(t, "compare", doc.Text(), equilibriumKeys)
}

// At 1 atm with a fixed liquid temperature below the critical pressure the
// mixture critical temperature is absent: its figure is left out.
func TestEquilibriumFiguresWithoutCriticalPoint(t *testing.T) {
	tl := 300.0
	res, err := calc.Evaluate(calc.Case{Format: calc.CaseFormat, Name: "w", Fluid: "water", LiquidTemperatureK: &tl,
		Gas:          calc.Gas{ID: "air", PressurePa: 101325, TemperatureK: 300},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 5}})
	if err != nil {
		t.Fatal(err)
	}
	if res.Equilibrium == nil || res.Equilibrium.MixtureCriticalTemperatureK != nil {
		t.Fatalf("equilibrium %+v", res.Equilibrium)
	}
	figs := views.EquilibriumFiguresOf(views.Display{}, res.Equilibrium)
	if len(figs) != 5 {
		t.Fatalf("%d figures", len(figs))
	}
	for _, f := range figs {
		if f.ID == "critical" {
			t.Error("critical temperature shown without one")
		}
	}
}

func checkClose(t *testing.T, what, shown string, want, rel float64) {
	t.Helper()
	s := strings.ReplaceAll(strings.ReplaceAll(shown, "−", "-"), " ", "")
	s = strings.ReplaceAll(s, ",", "")
	got, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Errorf("%s: shown %q is not a number", what, shown)
		return
	}
	if d := (got - want) / want; d > rel || d < -rel {
		t.Errorf("%s: shown %q, calc %v (rel %.2g > %.2g)", what, shown, want, d, rel)
	}
}

func getWith(t *testing.T, c *http.Client, u string) []byte {
	t.Helper()
	resp, err := c.Get(u)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	b, _ := io.ReadAll(resp.Body)
	if resp.StatusCode != http.StatusOK {
		t.Fatalf("%s: status %d", u, resp.StatusCode)
	}
	return b
}

func readCSVRows(t *testing.T, u string) [][]string {
	t.Helper()
	rows, err := csv.NewReader(strings.NewReader(string(getWith(t, client(t), u)))).ReadAll()
	if err != nil || len(rows) < 2 {
		t.Fatalf("%s: %v (%d rows)", u, err, len(rows))
	}
	return rows
}
