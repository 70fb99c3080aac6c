package server

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"net/http"
	"strings"
	"testing"

	"fogbench/calc"
	"fogbench/calc/atomize"
)

// internalMarks are strings no user-visible text may contain: the name of
// the project's internal reference file and its section sign.
var internalMarks = []string{"REFERENCE-DATA", "§"}

// atomizerMarks add the recalled-not-read mark, which stays in code and
// docs/: atomizer texts say "not confirmed here" in its place.
var atomizerMarks = append([]string{"from memory"}, internalMarks...)

func assertNoInternalMarks(t *testing.T, where, text string) {
	t.Helper()
	assertNone(t, where, text, internalMarks)
}

func assertNone(t *testing.T, where, text string, marks []string) {
	t.Helper()
	for _, bad := range marks {
		if i := strings.Index(text, bad); i >= 0 {
			t.Errorf("%s shows %q: …%s…", where, bad, text[max(0, i-150):min(len(text), i+80)])
		}
	}
}

func pageText(t *testing.T, c *http.Client, u string) string {
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
	return string(b)
}

// The workbench of every family (with a Monte Carlo and a sweep), the JSON
// API for the same nozzle, and the report (methods list included), the case
// page and the summary CSV of a case sized by each family's default
// correlation show published citations only, never an internal document.
func TestNoInternalDocumentShown(t *testing.T) {
	ts, st := newTestServer(t)
	c := client(t)
	assertNone(t, "atomizer index", pageText(t, c, ts.URL+"/atomizers"), atomizerMarks)
	ctx := context.Background()
	for _, f := range atomize.Families() {
		page := pageText(t, c, ts.URL+"/atomizers/"+f.ID+"?mc_cv=5&mc_n=50&mc_seed=1")
		assertNone(t, f.ID+" workbench", page, atomizerMarks)
		doc, _ := getDoc(t, c, ts.URL+"/atomizers/"+f.ID)
		if n := doc.Find(`[data-testid=corr-citation]`).Length(); n != len(f.Correlations) {
			t.Errorf("%s: %d citations for %d correlations", f.ID, n, len(f.Correlations))
		}
		// The API request the bench shows, posted as it is.
		body := doc.Find(`[data-testid=api-json]`).Text()
		if body == "" {
			t.Fatalf("%s: no API request on the bench", f.ID)
		}
		resp, err := http.Post(ts.URL+"/api/atomize", "application/json", strings.NewReader(body))
		if err != nil {
			t.Fatal(err)
		}
		b, _ := io.ReadAll(resp.Body)
		resp.Body.Close()
		if resp.StatusCode != http.StatusOK {
			t.Fatalf("%s: API %d %s", f.ID, resp.StatusCode, b)
		}
		assertNone(t, f.ID+" API", string(b), atomizerMarks)
		if len(f.Correlations) > 0 && !strings.Contains(string(b), `"provenance"`) {
			t.Errorf("%s: API result without provenance", f.ID)
		}

		if len(f.Correlations) == 0 {
			continue // a family without an SMD cannot size a case's drops
		}
		var req struct {
			Inputs map[string]float64 `json:"inputs"`
		}
		if err := json.Unmarshal([]byte(body), &req); err != nil || len(req.Inputs) == 0 {
			t.Fatalf("%s: request %s: %v", f.ID, body, err)
		}
		inj := 300.0
		cs := calc.Case{Format: calc.CaseFormat, Name: "nozzle " + f.ID, Fluid: "water",
			Heating: "transient", InjectionTemperatureK: &inj,
			Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 300},
			Distribution: calc.Distribution{Model: "atomizer", Family: f.ID, Inputs: req.Inputs, Bins: 20}}
		if _, err := calc.Evaluate(cs); err != nil {
			t.Logf("%s: no case from this nozzle: %v", f.ID, err) // the rotary family gives a main-drop size, not an SMD
			continue
		}
		rec, err := st.CreateCase(ctx, calc.Case{Format: calc.CaseFormat, Name: "nozzle " + f.ID, Fluid: "water",
			Heating: "transient", InjectionTemperatureK: &inj,
			Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 300},
			Distribution: calc.Distribution{Model: "atomizer", Family: f.ID, Inputs: req.Inputs, Bins: 20}}, "tester")
		if err != nil {
			t.Fatalf("%s: %v", f.ID, err)
		}
		id := fmt.Sprint(rec.ID)
		var cite atomize.Citation
		for _, c := range f.Correlations {
			if c.ID == f.DefaultCorrelation {
				cite = c.Provenance.Citation
			}
		}
		for _, path := range []string{"/cases/" + id, "/cases/" + id + "/report", "/cases/" + id + "/summary.csv"} {
			text := pageText(t, c, ts.URL+path)
			assertNoInternalMarks(t, f.ID+" "+path, text)
			if strings.HasSuffix(path, "/report") {
				doc, _ := getDoc(t, c, ts.URL+path)
				methods := doc.Find(`[data-testid=section-methods]`).Text()
				if methods == "" {
					t.Fatalf("%s: no methods section", f.ID)
				}
				assertNone(t, f.ID+" report methods", methods, atomizerMarks)
			}
			if path != "/cases/"+id && !strings.Contains(text, cite.Journal) {
				t.Errorf("%s %s: the default correlation's citation is missing", f.ID, path)
			}
		}
	}
}
