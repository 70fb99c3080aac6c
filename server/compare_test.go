package server

import (
	"context"
	"fmt"
	"net/http"
	"net/http/httptest"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/calc"
	"fogbench/store"
	"fogbench/views"
)

// fourCases adds a fourth case (the first demo case at a higher gas
// temperature) to the three demo cases and returns their ids.
func fourCases(t *testing.T, st *store.Store) []int64 {
	t.Helper()
	ctx := context.Background()
	rows, _, err := st.ListCases(ctx, store.ListOptions{Sort: "id"})
	if err != nil || len(rows) != 3 {
		t.Fatalf("demo rows %d %v", len(rows), err)
	}
	first, _ := st.GetCase(ctx, rows[0].ID)
	c := first.Case
	c.Name = "Hot-air variant"
	c.Gas.TemperatureK += 40
	rec, err := st.CreateCase(ctx, c, "t")
	if err != nil {
		t.Fatal(err)
	}
	return []int64{rows[0].ID, rows[1].ID, rows[2].ID, rec.ID}
}

// openCompare serves the demo library with a fourth case and opens the
// comparison of all four with the first as baseline.
func openCompare(t *testing.T) (ts *httptest.Server, st *store.Store, ids []int64, c *http.Client, u string, doc *goquery.Document) {
	t.Helper()
	ts, st = newTestServer(t)
	ids = fourCases(t, st)
	c = client(t)
	u = views.CompareURL(ids, ids[0])
	doc, code := getDoc(t, c, ts.URL+u)
	if code != http.StatusOK {
		t.Fatalf("compare: status %d", code)
	}
	return ts, st, ids, c, u, doc
}

func TestCompareFourCases(t *testing.T) {
	ts, st, ids, c, u, doc := openCompare(t)
	// The page links to its own URL, so it can be reopened.
	if href, _ := doc.Find(`[data-testid=compare-link]`).Attr("href"); href != u {
		t.Fatalf("self link %q, want %q", href, u)
	}
	if got := doc.Find(`[data-testid=compare-results] thead th`).Length(); got != 5 {
		t.Fatalf("result table has %d header cells, want 1 + 4 cases", got)
	}
	// Every overlay plot is drawn, each with one line per computed case.
	for _, id := range []string{"volume", "cumulative", "history", "curvature"} {
		svg := doc.Find(`[data-testid=plot-` + id + `] svg`)
		if svg.Length() != 1 {
			t.Fatalf("plot %s missing", id)
		}
	}
	// D32 differences against the baseline are computed from the results.
	ctx := context.Background()
	var d32 []float64
	for _, id := range ids {
		rec, _ := st.GetCase(ctx, id)
		res, err := calc.Evaluate(rec.Case)
		if err != nil {
			t.Fatal(err)
		}
		d32 = append(d32, res.Summary.D32M*1e6)
	}
	row := doc.Find(`[data-testid=compare-row]`).First()
	if !strings.Contains(row.Text(), "D32") {
		t.Fatalf("first result row is %q", row.Text())
	}
	deltas := row.Find(`[data-testid=delta]`)
	if deltas.Length() != 3 {
		t.Fatalf("%d deltas in the D32 row, want 3", deltas.Length())
	}
	want := views.CompareRow{Numeric: true, Values: d32, Has: []bool{true, true, true, true}}
	for i := 1; i < 4; i++ {
		if got := deltas.Eq(i - 1).Text(); got != want.DeltaText(i, 0) {
			t.Errorf("delta %d: %q, want %q", i, got, want.DeltaText(i, 0))
		}
	}
	// The hot-air variant differs from the baseline in the gas temperature
	// only; that input row is marked.
	marked := 0
	doc.Find(`[data-testid=compare-inputs] tr.differs`).Each(func(_ int, s *goquery.Selection) {
		if strings.Contains(s.Find("th").Text(), "gas.temperature_k") {
			marked++
		}
	})
	if marked != 1 {
		t.Fatal("gas temperature row not marked as differing")
	}

	// Choosing another baseline is another URL.
	doc, _ = getDoc(t, c, ts.URL+views.CompareURL(ids, ids[2]))
	rec, _ := st.GetCase(ctx, ids[2])
	if got := doc.Find(`[data-testid=baseline]`).Text(); got != rec.Case.Name {
		t.Fatalf("baseline %q", got)
	}
}

func TestCompareURLNormalised(t *testing.T) {
	ts, st := newTestServer(t)
	ids := fourCases(t, st)
	c := client(t)
	// The library's checkboxes send ids repeatedly and no base: redirect
	// to the one canonical address, baseline first.
	resp, err := c.Get(fmt.Sprintf("%s/compare?ids=%d&ids=%d&ids=%d", ts.URL, ids[1], ids[0], ids[1]))
	if err != nil {
		t.Fatal(err)
	}
	resp.Body.Close()
	if resp.StatusCode != http.StatusFound || resp.Header.Get("Location") != views.CompareURL([]int64{ids[1], ids[0]}, ids[1]) {
		t.Fatalf("status %d to %q", resp.StatusCode, resp.Header.Get("Location"))
	}
	// A base outside the set falls back to the first case.
	resp, _ = c.Get(fmt.Sprintf("%s/compare?ids=%d,%d&base=999", ts.URL, ids[0], ids[1]))
	resp.Body.Close()
	if resp.Header.Get("Location") != views.CompareURL(ids[:2], ids[0]) {
		t.Fatalf("bad base redirected to %q", resp.Header.Get("Location"))
	}
	for _, q := range []string{
		fmt.Sprintf("ids=%d", ids[0]),     // one case
		"ids=1,2,3,4,5,6,7",               // seven
		fmt.Sprintf("ids=%d,abc", ids[0]), // not a number
	} {
		_, code := getDoc(t, c, ts.URL+"/compare?"+q)
		if code != http.StatusBadRequest {
			t.Errorf("%s: status %d, want 400", q, code)
		}
	}
	_, code := getDoc(t, c, fmt.Sprintf("%s/compare?ids=%d,424242&base=%d", ts.URL, ids[0], ids[0]))
	if code != http.StatusNotFound {
		t.Errorf("unknown case: status %d", code)
	}
}

// The compare page links to a summary CSV with one row per compared case,
// in the comparison's order, each row what the case's own summary CSV
// holds and its D32 what calc.Evaluate gives; bad ids are refused.
func TestCompareSummaryCSV(t *testing.T) {
	ts, st, ids, c, _, doc := openCompare(t)
	href, _ := doc.Find(`[data-testid=compare-csv-link]`).Attr("href")
	if !strings.HasPrefix(href, "/compare/summary.csv?") {
		t.Fatalf("CSV link %q", href)
	}
	hdr, recs := readCSV(t, ts.URL+href)
	if cd := hdr.Get("Content-Disposition"); !strings.Contains(cd, fmt.Sprintf("compare-%d-%d-%d-%d-summary.csv", ids[0], ids[1], ids[2], ids[3])) {
		t.Errorf("Content-Disposition %q", cd)
	}
	if len(recs) != 1+len(ids) || strings.Join(recs[0], ",") != strings.Join(summaryCSVHeader, ",") {
		t.Fatalf("compare CSV: %d lines, header %q", len(recs), recs[0])
	}
	for i, id := range ids {
		_, own := readCSV(t, fmt.Sprintf("%s/cases/%d/summary.csv", ts.URL, id))
		if strings.Join(recs[1+i], ",") != strings.Join(own[1], ",") {
			t.Errorf("row %d: %q, the case's own summary %q", i+1, recs[1+i], own[1])
		}
		rec, err := st.GetCase(context.Background(), id)
		if err != nil {
			t.Fatal(err)
		}
		res, err := calc.Evaluate(rec.Case)
		if err != nil {
			t.Fatal(err)
		}
		if recs[1+i][0] != fmt.Sprint(id) || recs[1+i][6] != csvNum(res.Summary.D32M*1e6).s {
			t.Errorf("row %d: case %q D32 %q, want %d and %s", i+1, recs[1+i][0], recs[1+i][6], id, csvNum(res.Summary.D32M*1e6).s)
		}
	}
	for _, bad := range []string{"ids=1", "ids=1,x", fmt.Sprintf("ids=%d,999999", ids[0])} {
		resp, err := c.Get(ts.URL + "/compare/summary.csv?" + bad)
		if err != nil {
			t.Fatal(err)
		}
		resp.Body.Close()
		if resp.StatusCode == http.StatusOK {
			t.Errorf("%s: status 200", bad)
		}
	}
}

// A list of class edges is shown in the unit its name implies (µm, not the
// stored metres), rounded like the other inputs, and compared exactly: edges
// that differ below the shown digits still mark the row as differing.
func TestCompareInputListsInTheirUnit(t *testing.T) {
	base := calc.Case{Format: calc.CaseFormat, Name: "a", Fluid: "water",
		Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 300},
		Distribution: calc.Distribution{Model: "bins", EdgesM: []float64{5e-6, 7.5e-6, 1.68e-05, 4e-05}, Fraction: []float64{0.2, 0.5, 0.3}, Basis: "volume"}}
	other := base
	other.Name = "b"
	other.Distribution.EdgesM = []float64{5e-6, 7.5e-6, 1.68e-05 * (1 + 1e-12), 4e-05}
	fields, err := store.CompareCases(base, other)
	if err != nil {
		t.Fatal(err)
	}
	var edges, model *views.CompareRow
	for _, f := range fields {
		row := inputRow(f, 2)
		switch f.Path {
		case "distribution.edges_m":
			edges = &row
		case "distribution.model":
			model = &row
		}
	}
	if edges == nil || model == nil {
		t.Fatal("edges or model row missing")
	}
	want := strings.Join([]string{views.Num(5, 6), views.Num(7.5, 6), views.Num(16.8, 6), views.Num(40, 6)}, ", ")
	if edges.Unit != "µm" || edges.Cell(0) != want || edges.Cell(1) != want {
		t.Errorf("edges row: unit %q, cells %q and %q, want µm and %q", edges.Unit, edges.Cell(0), edges.Cell(1), want)
	}
	if !edges.Differs(1, 0) || edges.Differs(0, 0) {
		t.Error("edges that differ below the shown digits are not marked as differing")
	}
	if model.Unit != "" || model.Cell(0) != "bins" || model.Differs(1, 0) {
		t.Errorf("model row: unit %q, cell %q, differs %v", model.Unit, model.Cell(0), model.Differs(1, 0))
	}
}
