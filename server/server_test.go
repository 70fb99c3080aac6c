package server

import (
	"bytes"
	"context"
	"encoding/json"
	"io"
	"log/slog"
	"net/http"
	"net/http/cookiejar"
	"net/http/httptest"
	"net/url"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/store"
)

// openTestStore opens a fresh library file in the test's temporary folder,
// closed when the test ends.
func openTestStore(tb testing.TB) *store.Store {
	tb.Helper()
	st, err := store.Open(context.Background(), filepath.Join(tb.TempDir(), "lib.db"))
	if err != nil {
		tb.Fatal(err)
	}
	tb.Cleanup(func() { st.Close() })
	return st
}

// newTestServer serves a fresh library seeded with the demo cases.
func newTestServer(t *testing.T) (*httptest.Server, *store.Store) {
	t.Helper()
	ctx := context.Background()
	st := openTestStore(t)
	if _, err := st.SeedDemo(ctx); err != nil {
		t.Fatal(err)
	}
	logger := slog.New(slog.NewTextHandler(io.Discard, nil))
	ts := httptest.NewServer(New(st, logger).Handler())
	t.Cleanup(ts.Close)
	return ts, st
}

// client does not follow redirects, so tests see the 303s.
func client(t *testing.T) *http.Client {
	jar, _ := cookiejar.New(nil)
	return &http.Client{Jar: jar, CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse }}
}

func getDoc(t *testing.T, c *http.Client, u string) (*goquery.Document, int) {
	t.Helper()
	resp, err := c.Get(u)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	doc, err := goquery.NewDocumentFromReader(resp.Body)
	if err != nil {
		t.Fatal(err)
	}
	return doc, resp.StatusCode
}

// createCaseAPI stores a case file through POST /api/cases and returns its
// id; anything but 201 Created fails the test.
func createCaseAPI(t *testing.T, c *http.Client, base string, body []byte) int64 {
	t.Helper()
	resp, err := c.Post(base+"/api/cases", "application/json", bytes.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	var created struct {
		ID int64 `json:"id"`
	}
	json.NewDecoder(resp.Body).Decode(&created)
	if resp.StatusCode != http.StatusCreated {
		t.Fatalf("POST /api/cases: status %d", resp.StatusCode)
	}
	return created.ID
}

func postForm(t *testing.T, c *http.Client, u string, v url.Values) *http.Response {
	t.Helper()
	resp, err := c.PostForm(u, v)
	if err != nil {
		t.Fatal(err)
	}
	return resp
}

// validForm is what a user types for a new case (display units: µm, kPa, °C).
func validForm() url.Values {
	return url.Values{
		"name": {"Test nozzle"}, "fluid": {"water"}, "gas": {"air"},
		"pressure": {"101.325"}, "pressure_unit": {"kPa"},
		"gas_temperature": {"25"}, "gas_temperature_unit": {"°C"},
		"liquid_temperature": {"20"}, "liquid_temperature_unit": {"°C"},
		"vapor": {"0"}, "vapor_mode": {"mole_fraction"},
		"model": {"rosin-rammler"}, "x": {"60"}, "x_unit": {"µm"}, "q": {"2.8"},
		"bins": {"30"}, "d_min": {"2"}, "d_min_unit": {"µm"}, "d_max": {"300"}, "d_max_unit": {"µm"}, "spacing": {"log"},
	}
}

var caseURL = regexp.MustCompile(`^/cases/(\d+)`)

func TestLibraryListsDemoCases(t *testing.T) {
	ts, _ := newTestServer(t)
	doc, code := getDoc(t, client(t), ts.URL+"/cases")
	if code != http.StatusOK {
		t.Fatalf("status %d", code)
	}
	if n := doc.Find(`[data-testid=case-row]`).Length(); n != 3 {
		t.Fatalf("library shows %d rows, want the 3 demo cases", n)
	}
	doc, _ = getDoc(t, client(t), ts.URL+"/cases?fluid=n-heptane")
	if n := doc.Find(`[data-testid=case-row]`).Length(); n != 1 {
		t.Fatalf("fluid filter shows %d rows", n)
	}
}

func TestCreateViewEditCase(t *testing.T) {
	ts, st := newTestServer(t)
	c := client(t)
	resp := postForm(t, c, ts.URL+"/cases", validForm())
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther {
		t.Fatalf("create: status %d", resp.StatusCode)
	}
	loc := resp.Header.Get("Location")
	m := caseURL.FindStringSubmatch(loc)
	if m == nil {
		t.Fatalf("redirect to %q", loc)
	}
	doc, code := getDoc(t, c, ts.URL+loc)
	if code != http.StatusOK {
		t.Fatalf("case page status %d", code)
	}
	if got := doc.Find(`[data-testid=case-name]`).Text(); got != "Test nozzle" {
		t.Fatalf("case name %q", got)
	}
	// The page shows computed numbers, both plots and the bin table.
	if doc.Find(`[data-testid=compute-error]`).Length() != 0 {
		t.Fatalf("compute error: %s", doc.Find(`[data-testid=compute-error]`).Text())
	}
	for _, id := range []string{"plot-dist-density", "plot-dist-cumulative", "plot-curvature"} {
		if doc.Find(`[data-testid=`+id+`] svg`).Length() != 1 {
			t.Errorf("plot %s missing", id)
		}
	}
	if rows := doc.Find(`[data-testid=bin-table] tbody tr`).Length(); rows != 30 {
		t.Errorf("bin table has %d rows, want 30", rows)
	}
	d32 := strings.TrimSpace(doc.Find(`[data-testid="fig-D32"]`).Text())
	if d32 == "" || strings.HasPrefix(d32, "0 ") {
		t.Errorf("D32 figure %q", d32)
	}
	if doc.Find(`[data-testid=cautions] li`).Length() < 2 {
		t.Error("safety cautions missing")
	}

	// Stored in SI: 60 µm, 20 °C.
	id := m[1]
	rec, err := st.GetCase(context.Background(), mustInt(t, id))
	if err != nil {
		t.Fatal(err)
	}
	if rec.Case.Distribution.XM != 60e-6 || *rec.Case.LiquidTemperatureK != 293.15 || rec.Case.Gas.PressurePa != 101325 {
		t.Fatalf("stored %+v", rec.Case)
	}

	// Edit shows the stored values and saves revision 2.
	doc, _ = getDoc(t, c, ts.URL+"/cases/"+id+"/edit")
	if v, _ := doc.Find(`#f-x`).Attr("value"); v != "60" {
		t.Errorf("edit form x = %q", v)
	}
	form := validForm()
	form.Set("revision", "1")
	form.Set("q", "3.2")
	resp = postForm(t, c, ts.URL+"/cases/"+id, form)
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther {
		t.Fatalf("update: status %d", resp.StatusCode)
	}
	rec, _ = st.GetCase(context.Background(), mustInt(t, id))
	if rec.Revision != 2 || rec.Case.Distribution.Q != 3.2 {
		t.Fatalf("after edit %+v", rec)
	}

	// A second save based on revision 1 is a conflict that keeps the form.
	form.Set("q", "4")
	resp = postForm(t, c, ts.URL+"/cases/"+id, form)
	body, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusConflict || !strings.Contains(string(body), `data-testid="merge-copy"`) {
		t.Fatalf("stale save: status %d", resp.StatusCode)
	}
	if rec, _ = st.GetCase(context.Background(), mustInt(t, id)); rec.Case.Distribution.Q != 3.2 {
		t.Fatal("stale save overwrote the newer revision")
	}
}

func mustInt(t *testing.T, s string) int64 {
	t.Helper()
	n, err := strconv.ParseInt(s, 10, 64)
	if err != nil {
		t.Fatal(err)
	}
	return n
}

// A rejected form comes back with the user's values and a message at each
// bad field, and nothing is stored.
func TestBadInputKeepsForm(t *testing.T) {
	ts, st := newTestServer(t)
	c := client(t)
	form := validForm()
	form.Set("q", "abc")
	form.Set("pressure", "-5")
	form.Set("x", "NaN")
	form.Set("name", "Keeps my name")
	resp := postForm(t, c, ts.URL+"/cases", form)
	defer resp.Body.Close()
	if resp.StatusCode != http.StatusUnprocessableEntity {
		t.Fatalf("status %d", resp.StatusCode)
	}
	doc, err := goquery.NewDocumentFromReader(resp.Body)
	if err != nil {
		t.Fatal(err)
	}
	for _, f := range []string{"q", "x"} {
		if doc.Find(`[data-testid=error-`+f+`]`).Length() != 1 {
			t.Errorf("no message beside %s", f)
		}
	}
	if v, _ := doc.Find(`#f-q`).Attr("value"); v != "abc" {
		t.Errorf("typed q not kept: %q", v)
	}
	if v, _ := doc.Find(`#f-name`).Attr("value"); v != "Keeps my name" {
		t.Errorf("name not kept: %q", v)
	}
	if n, _ := st.CountCases(context.Background()); n != 3 {
		t.Fatalf("a rejected form stored something: %d cases", n)
	}
	// Once the numbers parse, range errors are placed too.
	form = validForm()
	form.Set("pressure", "-5")
	form.Set("bins", "1")
	resp2 := postForm(t, c, ts.URL+"/cases", form)
	defer resp2.Body.Close()
	doc, _ = goquery.NewDocumentFromReader(resp2.Body)
	if doc.Find(`[data-testid=error-pressure]`).Length() != 1 {
		t.Errorf("negative pressure not marked: %s", doc.Find(`[data-testid=form-errors]`).Text())
	}
}

func TestAPIEvaluateAndCases(t *testing.T) {
	ts, _ := newTestServer(t)
	body := `{"format":"fogbench-case/1","name":"api","fluid":"water","liquid_temperature_k":298.15,
	  "gas":{"pressure_pa":101325,"temperature_k":298.15,"vapor_mole_fraction":0},
	  "distribution":{"model":"rosin-rammler","x_m":5e-5,"q":2.5,"bins":20,"d_min_m":1e-6,"d_max_m":3e-4}}`
	resp, err := http.Post(ts.URL+"/api/evaluate", "application/json", strings.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	var res struct {
		Summary map[string]any   `json:"summary"`
		Bins    []map[string]any `json:"bins"`
	}
	json.NewDecoder(resp.Body).Decode(&res)
	resp.Body.Close()
	if resp.StatusCode != 200 || len(res.Bins) != 20 || res.Summary["d32_m"] == nil {
		t.Fatalf("evaluate: %d %v", resp.StatusCode, res.Summary)
	}
	// A bad field answers 400 naming it.
	resp, _ = http.Post(ts.URL+"/api/evaluate", "application/json", strings.NewReader(strings.Replace(body, `"q":2.5`, `"q":-1`, 1)))
	var e struct {
		Error  string              `json:"error"`
		Fields []map[string]string `json:"fields"`
	}
	json.NewDecoder(resp.Body).Decode(&e)
	resp.Body.Close()
	if resp.StatusCode != 400 || len(e.Fields) == 0 || e.Fields[0]["field"] != "distribution.q" {
		t.Fatalf("bad q: %d %+v", resp.StatusCode, e)
	}
	// Create, list, get, update with conflict.
	resp, _ = http.Post(ts.URL+"/api/cases", "application/json", strings.NewReader(body))
	var created struct {
		ID       int64 `json:"id"`
		Revision int   `json:"revision"`
	}
	json.NewDecoder(resp.Body).Decode(&created)
	resp.Body.Close()
	if resp.StatusCode != 201 || created.ID == 0 || created.Revision != 1 {
		t.Fatalf("create: %d %+v", resp.StatusCode, created)
	}
	resp, _ = http.Get(ts.URL + "/api/cases")
	var list struct {
		Cases []map[string]any `json:"cases"`
	}
	json.NewDecoder(resp.Body).Decode(&list)
	resp.Body.Close()
	if len(list.Cases) != 4 {
		t.Fatalf("list has %d cases", len(list.Cases))
	}
	put := func(rev int) int {
		req, _ := http.NewRequest(http.MethodPut, ts.URL+"/api/cases/"+itoa(created.ID),
			strings.NewReader(`{"revision":`+itoa(int64(rev))+`,"case":`+strings.Replace(body, `"api"`, `"api v`+itoa(int64(rev))+`"`, 1)+`}`))
		resp, err := http.DefaultClient.Do(req)
		if err != nil {
			t.Fatal(err)
		}
		resp.Body.Close()
		return resp.StatusCode
	}
	if code := put(1); code != 200 {
		t.Fatalf("put rev 1: %d", code)
	}
	if code := put(1); code != http.StatusConflict {
		t.Fatalf("stale put: %d", code)
	}
	resp, _ = http.Get(ts.URL + "/api/cases/999")
	resp.Body.Close()
	if resp.StatusCode != 404 {
		t.Fatalf("missing case: %d", resp.StatusCode)
	}
}

func itoa(n int64) string { return strconv.FormatInt(n, 10) }

func TestSecurityHeadersAndBodyLimit(t *testing.T) {
	ts, _ := newTestServer(t)
	resp, err := http.Get(ts.URL + "/cases")
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	csp := resp.Header.Get("Content-Security-Policy")
	if !strings.Contains(csp, "script-src 'self'") || !strings.Contains(csp, "frame-ancestors 'none'") {
		t.Errorf("CSP %q", csp)
	}
	big := strings.NewReader(`[` + strings.Repeat(" ", MaxBodyBytes+10) + `]`)
	resp, err = http.Post(ts.URL+"/api/evaluate", "application/json", big)
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != http.StatusRequestEntityTooLarge {
		t.Errorf("oversized body: %d", resp.StatusCode)
	}
}

// POST /api/evaluate with an array never aborts for one case: the failing
// case's error object stands in its place (200); ?strict=1 answers with
// the first failing case's error instead. Either way the fields carry the
// case's list index, as a decoding error's do ("[1].distribution.q").
func TestAPIEvaluateArrayKeepsGoing(t *testing.T) {
	ts, _ := newTestServer(t)
	good := `{"format":"fogbench-case/1","name":"api","fluid":"water","liquid_temperature_k":298.15,
	  "gas":{"pressure_pa":101325,"temperature_k":298.15},
	  "distribution":{"model":"rosin-rammler","x_m":5e-5,"q":2.5,"bins":8}}`
	bad := strings.Replace(good, `"q":2.5`, `"q":-1`, 1)
	body := "[" + good + "," + bad + "," + good + "]"
	resp, err := http.Post(ts.URL+"/api/evaluate", "application/json", strings.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	var res []struct {
		Summary map[string]any `json:"summary"`
		Error   string         `json:"error"`
		Code    string         `json:"code"`
		Fields  []struct{ Field, Message string }
	}
	err = json.NewDecoder(resp.Body).Decode(&res)
	resp.Body.Close()
	if err != nil || resp.StatusCode != 200 || len(res) != 3 {
		t.Fatalf("array: %d, %d answers, %v", resp.StatusCode, len(res), err)
	}
	if res[0].Summary == nil || res[2].Summary == nil || res[0].Error != "" {
		t.Errorf("good cases: %+v %+v", res[0], res[2])
	}
	if res[1].Summary != nil || res[1].Code != "invalid" || len(res[1].Fields) != 1 || res[1].Fields[0].Field != "[1].distribution.q" {
		t.Errorf("bad case: %+v", res[1])
	}
	resp, err = http.Post(ts.URL+"/api/evaluate?strict=1", "application/json", strings.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	var e struct {
		Error  string `json:"error"`
		Fields []struct{ Field string }
	}
	json.NewDecoder(resp.Body).Decode(&e)
	resp.Body.Close()
	if resp.StatusCode != 400 || len(e.Fields) != 1 || e.Fields[0].Field != "[1].distribution.q" || !strings.HasPrefix(e.Error, "[1].distribution.q") {
		t.Errorf("strict: %d %+v", resp.StatusCode, e)
	}
}
