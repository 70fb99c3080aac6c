package server

import (
	"context"
	"encoding/json"
	"math"
	"net/http"
	"net/url"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"
	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/atomize"
)

// benchQuery is a pressure-swirl nozzle on the bench: water at 20 °C into
// air at 25 °C, 1 MPa, 1 mm orifice, 10 g/s.
func benchQuery() url.Values {
	return url.Values{
		"fluid": {"water"}, "liquid_temperature": {"20"}, "liquid_temperature_unit": {"°C"},
		"gas": {"air"}, "pressure": {"101.325"}, "pressure_unit": {"kPa"},
		"gas_temperature": {"25"}, "gas_temperature_unit": {"°C"}, "correlation": {"lefebvre-1987"},
		"at.pressure-swirl.delta_p_pa": {"1"}, "at.pressure-swirl.delta_p_pa_unit": {"MPa"},
		"at.pressure-swirl.orifice_diameter_m": {"1"}, "at.pressure-swirl.orifice_diameter_m_unit": {"mm"},
		"at.pressure-swirl.mass_flow_kg_s": {"10"}, "at.pressure-swirl.mass_flow_kg_s_unit": {"g/s"},
		"sweep_var": {"delta_p_pa"},
	}
}

func TestAtomizerIndexAndDefaults(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	doc, code := getDoc(t, c, ts.URL+"/atomizers")
	if code != 200 || doc.Find(`[data-testid=family-card]`).Length() != len(atomize.Families()) {
		t.Fatalf("index: %d, %d cards", code, doc.Find(`[data-testid=family-card]`).Length())
	}
	// Every family's bench opens with values that evaluate.
	for _, f := range atomize.Families() {
		doc, code := getDoc(t, c, ts.URL+"/atomizers/"+f.ID)
		if code != 200 || doc.Find(`[data-testid=atomizer-panel]`).Length() != 1 {
			t.Errorf("%s bench: %d %s", f.ID, code, doc.Find(`[data-testid=form-errors], .field-error`).Text())
		}
		if n := doc.Find(`[data-testid=corr-status]`).Length(); n != len(f.Correlations) {
			t.Errorf("%s: %d correlation statuses shown, want %d", f.ID, n, len(f.Correlations))
		}
	}
	if _, code := getDoc(t, c, ts.URL+"/atomizers/garden-hose"); code != 404 {
		t.Errorf("unknown family: %d", code)
	}
}

func TestAtomizerBenchEvaluateSolveMonteCarloSweep(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	q := benchQuery()
	q.Set("solve_unknown", "delta_p_pa")
	q.Set("target_smd", "40")
	q.Set("target_smd_unit", "µm")
	q.Set("mc_cv", "5")
	q.Set("mc_n", "500")
	q.Set("mc_seed", "3")
	doc, code := getDoc(t, c, ts.URL+"/atomizers/pressure-swirl?"+q.Encode())
	if code != 200 {
		t.Fatalf("status %d: %s", code, doc.Find(`[data-testid=form-errors]`).Text())
	}
	rows := doc.Find(`[data-testid=smd-row]`)
	if rows.Length() != 3 { // wang-lefebvre needs the cone angle, not given
		t.Errorf("%d SMD rows", rows.Length())
	}
	if first, _ := rows.First().Attr("data-correlation"); first != "lefebvre-1987" {
		t.Errorf("chosen correlation not first: %s", first)
	}
	if !strings.Contains(rows.First().Find(`.status`).Text(), "checked against") {
		t.Error("provenance status not shown beside the correlation")
	}
	if doc.Find(`[data-testid=smd-band]`).Length() != 1 || doc.Find(`[data-testid=groups-table] tbody tr`).Length() == 0 {
		t.Error("band or dimensionless groups missing")
	}
	// The flow-number conversion is stated with the density used: water
	// at 20 °C, 998.2 kg/m³ (IAPWS-95 998.21).
	if note := doc.Find(`[data-testid=fn-conversion]`).Text(); !strings.Contains(note, "0.45359237") || !strings.Contains(note, "998.") {
		t.Errorf("conversion note %q", note)
	}
	if doc.Find(`[data-testid=solution-reached]`).Length() != 1 {
		t.Errorf("40 µm should be reachable: %s", doc.Find(`[data-testid=solution]`).Text())
	}
	if doc.Find(`[data-testid=mc-p5]`).Length() != 1 || doc.Find(`[data-testid=plot-sweep] svg`).Length() != 1 {
		t.Error("Monte Carlo or sweep plot missing")
	}
	// Same seed, same percentiles.
	doc2, _ := getDoc(t, c, ts.URL+"/atomizers/pressure-swirl?"+q.Encode())
	if a, b := doc.Find(`[data-testid=mc-p95]`).Text(), doc2.Find(`[data-testid=mc-p95]`).Text(); a != b || a == "" {
		t.Errorf("seeded Monte Carlo differs: %q vs %q", a, b)
	}
	// A target no pressure in range reaches: said so, with the nearest value.
	q.Set("target_smd", "0.5")
	doc, _ = getDoc(t, c, ts.URL+"/atomizers/pressure-swirl?"+q.Encode())
	if txt := doc.Find(`[data-testid=solution-unreached]`).Text(); !strings.Contains(txt, "nearest") {
		t.Errorf("unreachable target: %q", doc.Find(`[data-testid=solution]`).Text())
	}
}

// The workbench never takes the liquid at the gas temperature: an empty
// liquid temperature is marked beside its field.
func TestAtomizerBenchNeedsTheSupplyTemperature(t *testing.T) {
	ts, _ := newTestServer(t)
	q := benchQuery()
	q.Set("liquid_temperature", "")
	doc, _ := getDoc(t, client(t), ts.URL+"/atomizers/pressure-swirl?"+q.Encode())
	if txt := doc.Find(`[data-testid="error-liquid_temperature"]`).Text(); !strings.Contains(txt, "supplied at") {
		t.Errorf("empty liquid temperature: %q (form errors %q)", txt, doc.Find(`[data-testid=form-errors]`).Text())
	}
}

func TestAtomizerBenchBadInputKeepsForm(t *testing.T) {
	ts, _ := newTestServer(t)
	q := benchQuery()
	q.Set("at.pressure-swirl.orifice_diameter_m", "-1")
	q.Set("at.pressure-swirl.delta_p_pa", "lots")
	q.Set("liquid_temperature", "150")
	resp, err := client(t).Get(ts.URL + "/atomizers/pressure-swirl?" + q.Encode())
	if err != nil {
		t.Fatal(err)
	}
	doc, _ := goquery.NewDocumentFromReader(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusUnprocessableEntity {
		t.Fatalf("status %d", resp.StatusCode)
	}
	if doc.Find(`[data-testid="error-atomizer.delta_p_pa"]`).Length() != 1 {
		t.Error("unreadable pressure not marked")
	}
	if v, _ := doc.Find(`[name="at.pressure-swirl.delta_p_pa"]`).Attr("value"); v != "lots" {
		t.Errorf("typed value not kept: %q", v)
	}
	// Water boils at 150 °C only above 1 atm, but 150 °C is inside its
	// liquid range; the bad diameter is found once the rest parses.
	q.Set("at.pressure-swirl.delta_p_pa", "1")
	doc, _ = getDoc(t, client(t), ts.URL+"/atomizers/pressure-swirl?"+q.Encode())
	if doc.Find(`[data-testid="error-atomizer.orifice_diameter_m"]`).Length() != 1 {
		t.Errorf("negative diameter not marked: %s", doc.Find(`[data-testid=form-errors]`).Text())
	}
}

// "Use in a new case" opens the case form with the nozzle; saving it gives
// a case whose page shows the atomizer panel, and a bad atomizer input is
// marked beside its field.
func TestAtomizerIntoCase(t *testing.T) {
	ts, st := newTestServer(t)
	c := client(t)
	doc, _ := getDoc(t, c, ts.URL+"/atomizers/pressure-swirl?"+benchQuery().Encode())
	href, ok := doc.Find(`[data-testid=use-in-case]`).Attr("href")
	if !ok {
		t.Fatal("no use-in-case link")
	}
	doc, code := getDoc(t, c, ts.URL+href)
	if code != 200 {
		t.Fatalf("prefilled form: %d", code)
	}
	if sel, _ := doc.Find(`#f-model option[selected]`).Attr("value"); sel != "atomizer" {
		t.Errorf("model %q", sel)
	}
	if v, _ := doc.Find(`[name="at.pressure-swirl.delta_p_pa"]`).Attr("value"); v != "1" {
		t.Errorf("pressure not carried: %q", v)
	}
	// Submit the form as the browser would.
	form := url.Values{}
	doc.Find(`#case-form input, #case-form select, #case-form textarea`).Each(func(_ int, s *goquery.Selection) {
		name, _ := s.Attr("name")
		if name == "" {
			return
		}
		switch {
		case goquery.NodeName(s) == "select":
			if v, ok := s.Find("option[selected]").Attr("value"); ok {
				form.Set(name, v)
			} else if v, ok := s.Find("option").First().Attr("value"); ok {
				form.Set(name, v)
			}
		case goquery.NodeName(s) == "textarea":
			form.Set(name, s.Text())
		default:
			if typ, _ := s.Attr("type"); typ == "submit" || typ == "button" {
				return
			}
			v, _ := s.Attr("value")
			form.Set(name, v)
		}
	})
	bad := url.Values{}
	for k, v := range form {
		bad[k] = v
	}
	bad.Set("at.pressure-swirl.orifice_diameter_m", "0")
	resp := postForm(t, c, ts.URL+"/cases", bad)
	bdoc, _ := goquery.NewDocumentFromReader(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusUnprocessableEntity || bdoc.Find(`[data-testid="error-atomizer.orifice_diameter_m"]`).Length() != 1 {
		t.Fatalf("zero diameter: %d %s", resp.StatusCode, bdoc.Find(`.field-error`).Text())
	}

	resp = postForm(t, c, ts.URL+"/cases", form)
	resp.Body.Close()
	m := caseURL.FindStringSubmatch(resp.Header.Get("Location"))
	if resp.StatusCode != http.StatusSeeOther || m == nil {
		t.Fatalf("save: %d", resp.StatusCode)
	}
	rec, _ := st.GetCase(context.Background(), mustInt(t, m[1]))
	d := rec.Case.Distribution
	if d.Model != "atomizer" || d.Family != "pressure-swirl" || d.Inputs["delta_p_pa"] != 1e6 || d.Inputs["orifice_diameter_m"] != 1e-3 || d.Inputs["mass_flow_kg_s"] != 0.01 {
		t.Fatalf("stored distribution %+v", d)
	}
	// The bench's 20 °C liquid is the nozzle's supply (injection)
	// temperature, and the 25 °C gas heats the drops from it; the drops'
	// surface temperature is not fixed at it.
	if tc := rec.Case; tc.InjectionTemperatureK == nil || math.Abs(*tc.InjectionTemperatureK-293.15) > 1e-9 ||
		tc.Heating != "transient" || tc.LiquidTemperatureK != nil {
		t.Errorf("stored temperatures: injection %v, heating %q, fixed %v", tc.InjectionTemperatureK, tc.Heating, tc.LiquidTemperatureK)
	}
	doc, _ = getDoc(t, c, ts.URL+"/cases/"+m[1])
	if doc.Find(`[data-testid=atomizer-panel] [data-testid=smd-row]`).Length() < 2 {
		t.Fatalf("case page lacks the atomizer panel: %s", doc.Find(`[data-testid=compute-error]`).Text())
	}
	// The edit form shows the stored nozzle again.
	doc, _ = getDoc(t, c, ts.URL+"/cases/"+m[1]+"/edit")
	if v, _ := doc.Find(`[name="at.pressure-swirl.orifice_diameter_m"]`).Attr("value"); v != "1" {
		t.Errorf("edit form diameter %q", v)
	}
}

func TestAPIAtomize(t *testing.T) {
	ts, _ := newTestServer(t)
	post := func(path, body string) (int, map[string]json.RawMessage) {
		resp, err := http.Post(ts.URL+path, "application/json", strings.NewReader(body))
		if err != nil {
			t.Fatal(err)
		}
		defer resp.Body.Close()
		var out map[string]json.RawMessage
		json.NewDecoder(resp.Body).Decode(&out)
		return resp.StatusCode, out
	}
	body := `{"family":"pressure-swirl","inputs":{"delta_p_pa":1e6,"orifice_diameter_m":1e-3,"mass_flow_kg_s":0.01},
	  "fluid":"water","liquid_temperature_k":293.15,"gas":{"pressure_pa":101325,"temperature_k":298.15}}`
	code, out := post("/api/atomize", body)
	var res atomize.Result
	json.Unmarshal(out["result"], &res)
	if code != 200 || len(res.SMD) < 2 || !res.FlowKnown {
		t.Fatalf("evaluate: %d %s", code, out["error"])
	}
	// Solve for the pressure that gives 50 µm, and substitute it back.
	sb, _ := json.Marshal(map[string]any{"family": "pressure-swirl", "fluid": "water", "liquid_temperature_k": 293.15,
		"inputs":  map[string]float64{"orifice_diameter_m": 1e-3, "mass_flow_kg_s": 0.01},
		"unknown": "delta_p_pa", "target": map[string]float64{"smd_m": 5e-5}})
	code, out = post("/api/atomize/solve", string(sb))
	var sol atomize.Solution
	json.Unmarshal(out["solution"], &sol)
	if code != 200 || !sol.Reached {
		t.Fatalf("solve: %d %s %+v", code, out["error"], sol)
	}
	const backTol = 1e-6 // Solve's own contract: substituted back within 1e-6
	in := map[string]float64{"delta_p_pa": sol.Value, "orifice_diameter_m": 1e-3, "mass_flow_kg_s": 0.01}
	b, _ := json.Marshal(map[string]any{"family": "pressure-swirl", "inputs": in, "fluid": "water", "liquid_temperature_k": 293.15})
	_, out = post("/api/atomize", string(b))
	json.Unmarshal(out["result"], &res)
	if !scalar.EqualWithinRel(res.SMD[0].SMD, 5e-5, backTol) {
		t.Errorf("SMD at the solved pressure %g, want 5e-5", res.SMD[0].SMD)
	}
	// Bad input answers 400 naming the field.
	for _, tc := range []struct{ body, field string }{
		{strings.Replace(body, `"orifice_diameter_m":1e-3`, `"orifice_diameter_m":-1`, 1), "distribution.inputs.orifice_diameter_m"},
		{strings.Replace(body, `"water"`, `"treacle"`, 1), "fluid"},
		// The liquid is taken at its supply temperature, never the gas's.
		{strings.Replace(body, `"liquid_temperature_k":293.15,`, ``, 1), "liquid_temperature_k"},
		{strings.Replace(body, `"family"`, `"famliy"`, 1), "famliy"},
	} {
		code, out := post("/api/atomize", tc.body)
		var fields []map[string]string
		json.Unmarshal(out["fields"], &fields)
		if code != 400 || len(fields) == 0 || fields[0]["field"] != tc.field {
			t.Errorf("want 400 on %s, got %d %s", tc.field, code, out["fields"])
		}
	}
}

// The bench's liquid temperature becomes the new case's injection
// temperature; transient heating is chosen only where the gas is hotter,
// and the drops' fixed surface temperature is never set from it.
func TestSupplyToCase(t *testing.T) {
	for _, tc := range []struct {
		liquid, lu, gas, gu string
		heating             string
	}{
		{"20", "°C", "700", "K", "transient"},
		{"300", "K", "26.85", "°C", ""}, // equal: no heating
		{"80", "°C", "20", "°C", ""},
	} {
		q := url.Values{"liquid_temperature": {tc.liquid}, "liquid_temperature_unit": {tc.lu},
			"gas_temperature": {tc.gas}, "gas_temperature_unit": {tc.gu}}
		vals, us := valuesMap{"liquid_temperature": "25"}, valuesMap{}
		supplyToCase(q, vals, us)
		if vals["injection_temperature"] != tc.liquid || us["injection_temperature"] != tc.lu ||
			vals["heating"] != tc.heating || vals["liquid_temperature"] != "" {
			t.Errorf("%s %s liquid, %s %s gas: %v %v", tc.liquid, tc.lu, tc.gas, tc.gu, vals, us)
		}
	}
}
