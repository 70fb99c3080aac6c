package server

import (
	"bytes"
	"context"
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"net/http"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"codeberg.org/go-fonts/liberation/liberationsansbold"
	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"codeberg.org/go-fonts/liberation/liberationserifregular"
	"github.com/PuerkitoBio/goquery"
	"golang.org/x/image/font/sfnt"

	"fogbench/calc"
	"fogbench/store"
	"fogbench/views"
)

// demoCase loads a seeded case and computes it independently of the
// handlers, so the tests compare the report against calc.Evaluate.
func demoCase(t *testing.T, st *store.Store, id int64) (store.CaseRecord, *calc.Result) {
	t.Helper()
	rec, err := st.GetCase(context.Background(), id)
	if err != nil {
		t.Fatal(err)
	}
	res, err := calc.Evaluate(rec.Case)
	if err != nil {
		t.Fatalf("case %d: %v", id, err)
	}
	return rec, res
}

// leadingNumber reads the number at the start of a displayed figure
// ("33.85 µm", "1.2×10⁻⁵ Pa").
func leadingNumber(t *testing.T, s string) float64 {
	t.Helper()
	s = strings.TrimSpace(s)
	m := regexp.MustCompile(`^(-?[0-9.]+)(?:×10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+))?`).FindStringSubmatch(s)
	if m == nil {
		t.Fatalf("no number at the start of %q", s)
	}
	v, err := strconv.ParseFloat(m[1], 64)
	if err != nil {
		t.Fatal(err)
	}
	if m[2] != "" {
		e, _ := strconv.Atoi(superToASCII.Replace(m[2]))
		v *= math.Pow(10, float64(e))
	}
	return v
}

func TestCaseReportHTML(t *testing.T) {
	ts, st := newTestServer(t)
	c := client(t)
	for id := int64(1); id <= 3; id++ {
		rec, res := demoCase(t, st, id)
		doc, code := getDoc(t, c, fmt.Sprintf("%s/cases/%d/report", ts.URL, id))
		if code != http.StatusOK {
			t.Fatalf("case %d: status %d", id, code)
		}
		for _, sec := range []string{"report-header", "purpose", "section-inputs", "section-summary", "section-warnings",
			"section-cautions", "section-plots", "section-bins", "section-properties", "section-methods"} {
			if doc.Find(`[data-testid=`+sec+`]`).Length() != 1 {
				t.Errorf("case %d: section %s missing", id, sec)
			}
		}
		head := doc.Find(`[data-testid=report-header]`).Text()
		if !strings.Contains(head, rec.Case.Name) || !strings.Contains(head, fmt.Sprintf("revision %d", rec.Revision)) ||
			!strings.Contains(head, rec.UpdatedAt.UTC().Format("2006-01-02")) {
			t.Errorf("case %d: running header %q lacks name, revision or date", id, head)
		}
		// The figures are those of the case computed on its own, to the four
		// significant figures shown.
		for sym, want := range map[string]float64{
			"D32": res.Summary.D32M * 1e6, "Dv50": res.Summary.Dv50M * 1e6, "Dv10": res.Summary.Dv10M * 1e6,
			"Dv90": res.Summary.Dv90M * 1e6, "D43": res.Summary.D43M * 1e6,
		} {
			got := leadingNumber(t, doc.Find(`[data-testid="fig-`+sym+`"]`).Text())
			if math.Abs(got-want) > 5e-4*want {
				t.Errorf("case %d: %s shows %g, calc.Evaluate gives %g", id, sym, got, want)
			}
		}
		// No truncated table: every class, every column, no empty cell.
		rows := doc.Find(`[data-testid=bin-table] tbody tr`)
		if rows.Length() != len(res.Bins) {
			t.Errorf("case %d: bin table has %d rows, the case has %d classes", id, rows.Length(), len(res.Bins))
		}
		cols := doc.Find(`[data-testid=bin-table] thead th`).Length()
		rows.Each(func(i int, r *goquery.Selection) {
			cells := r.Find("td")
			if cells.Length() != cols {
				t.Errorf("case %d row %d: %d cells under %d headings", id, i, cells.Length(), cols)
			}
			cells.Each(func(_ int, c *goquery.Selection) {
				if strings.TrimSpace(c.Text()) == "" {
					t.Errorf("case %d row %d: empty cell", id, i)
				}
			})
			if i == len(res.Bins)-1 {
				d := leadingNumber(t, cells.Eq(1).Text())
				if want := res.Bins[i].DM * 1e6; math.Abs(d-want) > 5e-4*want {
					t.Errorf("case %d: last class d = %g, want %g", id, d, want)
				}
			}
		})
		if n := doc.Find(`[data-testid=sources] tbody tr`).Length(); n != len(res.Properties.Sources) || n == 0 {
			t.Errorf("case %d: %d source rows, the evaluation used %d", id, n, len(res.Properties.Sources))
		}
		// Every method link in the table points at a listed method.
		doc.Find(`a.ref`).Each(func(_ int, a *goquery.Selection) {
			href, _ := a.Attr("href")
			if doc.Find(`[id="`+strings.TrimPrefix(href, "#")+`"]`).Length() != 1 {
				t.Errorf("case %d: method link %s goes nowhere", id, href)
			}
		})
		for _, m := range []string{"method-kelvin", "method-laplace", "method-sizes", "method-convection"} {
			if doc.Find(`[data-testid=`+m+`]`).Length() != 1 {
				t.Errorf("case %d: %s not listed", id, m)
			}
		}
		// Every warning and every caution.
		if n := doc.Find(`[data-testid=warnings] li`).Length(); n != len(res.Warnings) {
			t.Errorf("case %d: %d warnings shown, %d computed", id, n, len(res.Warnings))
		}
		want := views.Cautions(flammable(rec.Case.Fluid), res)
		got := doc.Find(`[data-testid=section-cautions] li`)
		if got.Length() != len(want) {
			t.Fatalf("case %d: %d cautions, want %d", id, got.Length(), len(want))
		}
		got.Each(func(i int, li *goquery.Selection) {
			if li.Text() != want[i] {
				t.Errorf("case %d: caution %d = %q", id, i, li.Text())
			}
		})
		// The plots of the case page, as inline SVG.
		page, _ := getDoc(t, c, fmt.Sprintf("%s/cases/%d", ts.URL, id))
		page.Find(`figure.plot`).Each(func(_ int, fig *goquery.Selection) {
			pid, _ := fig.Attr("data-testid")
			if doc.Find(`[data-testid="`+pid+`"] svg`).Length() != 1 {
				t.Errorf("case %d: %s missing from the report", id, pid)
			}
		})
		if n := doc.Find(`figure.plot svg`).Length(); n < 2 || doc.Find(`[data-testid=plot-curvature] svg`).Length() != 1 {
			t.Errorf("case %d: %d vector plots", id, n)
		}
	}
	// The heptane rig is flammable; water is not.
	doc, _ := getDoc(t, c, ts.URL+"/cases/2/report")
	if !strings.Contains(doc.Find(`[data-testid=section-cautions]`).Text(), "Flammable") {
		t.Error("heptane report lacks the flammable-mist caution")
	}
	if _, code := getDoc(t, c, ts.URL+"/cases/999/report"); code != http.StatusNotFound {
		t.Errorf("unknown case: status %d", code)
	}
}

func TestCasePageLinksReports(t *testing.T) {
	ts, _ := newTestServer(t)
	doc, _ := getDoc(t, client(t), ts.URL+"/cases/1")
	for id, want := range map[string]string{
		"link-report": "/cases/1/report", "link-report-pdf": "/cases/1/report.pdf",
		"link-bins-csv": "/cases/1/bins.csv", "link-summary-csv": "/cases/1/summary.csv",
	} {
		if href, _ := doc.Find(`[data-testid=` + id + `]`).Attr("href"); href != want {
			t.Errorf("%s: href %q, want %q", id, href, want)
		}
	}
}

func readCSV(t *testing.T, url string) (http.Header, [][]string) {
	t.Helper()
	resp, err := http.Get(url)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	if resp.StatusCode != http.StatusOK {
		t.Fatalf("%s: status %d", url, resp.StatusCode)
	}
	recs, err := csv.NewReader(resp.Body).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return resp.Header, recs
}

func TestCaseCSV(t *testing.T) {
	ts, st := newTestServer(t)
	_, res := demoCase(t, st, 1)
	hdr, recs := readCSV(t, ts.URL+"/cases/1/bins.csv")
	if ct := hdr.Get("Content-Type"); !strings.HasPrefix(ct, "text/csv") {
		t.Errorf("content type %q", ct)
	}
	if cd := hdr.Get("Content-Disposition"); !strings.Contains(cd, `filename="case-1-r1-`) || !strings.HasSuffix(cd, `-bins.csv"`) {
		t.Errorf("disposition %q", cd)
	}
	if len(recs) != len(res.Bins)+1 {
		t.Fatalf("%d lines for %d classes", len(recs), len(res.Bins))
	}
	unit := regexp.MustCompile(`\(.+\)$`)
	for _, h := range recs[0] {
		if h != "regime" && h != "transcritical" && !unit.MatchString(h) { // text and flag columns have none
			t.Errorf("column %q has no unit", h)
		}
	}
	// Full precision: the CSV holds the computed doubles.
	for i, b := range res.Bins {
		row := recs[i+1]
		for j, want := range map[int]float64{0: b.DLoM * 1e6, 2: b.DM * 1e6, 4: b.VolumeFraction, 5: b.LaplacePa, 7: b.KelvinRatio} {
			got, err := strconv.ParseFloat(row[j], 64)
			if err != nil || got != want {
				t.Errorf("class %d, %s = %q, want %v", i, recs[0][j], row[j], want)
			}
		}
		if b.LifetimeS != nil && row[9] != strconv.FormatFloat(*b.LifetimeS, 'g', -1, 64) {
			t.Errorf("class %d lifetime %q", i, row[9])
		}
	}
	_, recs = readCSV(t, ts.URL+"/cases/1/summary.csv")
	if len(recs) != 2 || len(recs[0]) != len(recs[1]) {
		t.Fatalf("summary CSV shape %d lines", len(recs))
	}
	col := map[string]string{}
	for i, h := range recs[0] {
		col[h] = recs[1][i]
	}
	if got, _ := strconv.ParseFloat(col["D32 (um)"], 64); got != res.Summary.D32M*1e6 {
		t.Errorf("summary D32 %q, want %v", col["D32 (um)"], res.Summary.D32M*1e6)
	}
	if col["case_id"] != "1" || col["revision"] != "1" {
		t.Errorf("summary identifies %q rev %q", col["case_id"], col["revision"])
	}
	resp, _ := http.Get(ts.URL + "/cases/999/bins.csv")
	resp.Body.Close()
	if resp.StatusCode != http.StatusNotFound {
		t.Errorf("unknown case CSV: status %d", resp.StatusCode)
	}
}

func TestCSVCellNeutralisesFormulas(t *testing.T) {
	for in, want := range map[string]string{"=SUM(A1)": "'=SUM(A1)", "+1": "'+1", "@x": "'@x", "-2": "'-2", "Nozzle A": "Nozzle A"} {
		if got := csvText(in); got != want {
			t.Errorf("csvText(%q) = %q, want %q", in, got, want)
		}
	}
}

// pdfToText runs poppler's pdftotext; without it the test is skipped
// locally and fails in CI, which installs poppler-utils.
func pdfToText(t *testing.T, pdf []byte) string {
	t.Helper()
	bin, err := exec.LookPath("pdftotext")
	if err != nil {
		if os.Getenv("CI") == "true" {
			t.Fatal("pdftotext (poppler-utils) is missing in CI")
		}
		t.Skip("pdftotext not installed (apt-get install poppler-utils); PDF text checks skipped")
	}
	path := filepath.Join(t.TempDir(), "r.pdf")
	if err := os.WriteFile(path, pdf, 0o644); err != nil {
		t.Fatal(err)
	}
	out, err := exec.Command(bin, "-enc", "UTF-8", path, "-").Output()
	if err != nil {
		t.Fatalf("pdftotext cannot read the PDF: %v", err)
	}
	return string(out)
}

func getPDF(t *testing.T, url string) []byte {
	t.Helper()
	resp, err := http.Get(url)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	body, _ := io.ReadAll(resp.Body)
	if resp.StatusCode != http.StatusOK || resp.Header.Get("Content-Type") != "application/pdf" || !bytes.HasPrefix(body, []byte("%PDF-")) {
		t.Fatalf("%s: status %d, type %q", url, resp.StatusCode, resp.Header.Get("Content-Type"))
	}
	return body
}

var spaces = regexp.MustCompile(`\s+`)

func TestCaseReportPDF(t *testing.T) {
	ts, st := newTestServer(t)
	for id := int64(1); id <= 3; id++ {
		rec, res := demoCase(t, st, id)
		text := pdfToText(t, getPDF(t, fmt.Sprintf("%s/cases/%d/report.pdf", ts.URL, id)))
		pages := strings.Split(strings.TrimRight(text, "\f"), "\f")
		n := len(pages)
		// The demo cases fill three to eight pages; a runaway layout (a row
		// or a plot per page) or a lost section would leave this range.
		if n < 3 || n > 8 {
			t.Errorf("case %d: %d pages", id, n)
		}
		for i, p := range pages {
			if !strings.Contains(p, fmt.Sprintf("Page %d of %d", i+1, n)) {
				t.Errorf("case %d: page %d lacks its footer 'Page %d of %d'", id, i+1, i+1, n)
			}
			if !strings.Contains(spaces.ReplaceAllString(p, " "), fmt.Sprintf("Case %d · revision %d", id, rec.Revision)) {
				t.Errorf("case %d: page %d lacks the running header", id, i+1)
			}
		}
		flat := spaces.ReplaceAllString(text, " ")
		v := views.CaseView{Result: res}
		want := []string{rec.Case.Name, "Inputs", "Per size class", "Properties used", "Methods", "Kelvin equation"}
		for _, f := range v.SummaryFigures() {
			want = append(want, strings.TrimSpace(f.Value+" "+f.Unit))
		}
		want = append(want, views.Cautions(flammable(rec.Case.Fluid), res)...)
		for _, w := range res.Warnings {
			want = append(want, flowText(w))
		}
		// First and last class of the table.
		rows := v.BinRows()
		want = append(want, rows[0].Range, rows[len(rows)-1].Range)
		for _, w := range want {
			if !strings.Contains(flat, spaces.ReplaceAllString(w, " ")) {
				t.Errorf("case %d: PDF text lacks %q", id, w)
			}
		}
	}
	// Letter paper when asked.
	body := getPDF(t, ts.URL+"/cases/1/report.pdf?paper=letter")
	if !bytes.Contains(body, []byte("/MediaBox [0 0 612.00 792.00]")) {
		t.Error("?paper=letter did not give a Letter page")
	}
}

// Every character the PDF draws exists in the embedded fonts, so nothing
// comes out as an empty box (Liberation lacks ⁰, ⁹ and ⁻, for example).
func TestReportPDFGlyphs(t *testing.T) {
	ts, st := newTestServer(t)
	_ = ts
	var fonts []*sfnt.Font
	for _, ttf := range [][]byte{liberationsansregular.TTF, liberationsansbold.TTF, liberationserifregular.TTF} {
		f, err := sfnt.Parse(ttf)
		if err != nil {
			t.Fatal(err)
		}
		fonts = append(fonts, f)
	}
	var buf sfnt.Buffer
	missing := map[rune]string{}
	s := New(st, nil)
	for id := int64(1); id <= 3; id++ {
		rec, _ := demoCase(t, st, id)
		r, _ := http.NewRequest(http.MethodGet, "/", nil)
		v := s.reportView(r, rec, views.Display{}, views.PaperA4)
		if _, err := buildReportPDF(v, func(text string) {
			for _, ru := range text {
				for _, f := range fonts {
					if g, _ := f.GlyphIndex(&buf, ru); g == 0 && ru != ' ' {
						missing[ru] = text
					}
				}
			}
		}); err != nil {
			t.Fatal(err)
		}
	}
	for ru, text := range missing {
		t.Errorf("no glyph for %q (U+%04X) in %q", ru, ru, text)
	}
}

// The PDF shows the same plots as the page: each plot of the case page has
// a chart to render as PNG.
func TestReportPDFHasEveryPlot(t *testing.T) {
	_, st := newTestServer(t)
	s := New(st, nil)
	for id := int64(1); id <= 3; id++ {
		rec, res := demoCase(t, st, id)
		r, _ := http.NewRequest(http.MethodGet, "/", nil)
		v := s.reportView(r, rec, views.Display{}, "")
		if len(v.Plots) < 2 {
			t.Fatalf("case %d: %d plots on the page", id, len(v.Plots))
		}
		for _, p := range v.Plots {
			if _, ok := chartByID(p.ID, res, measuredFit(rec.Case)); !ok {
				t.Errorf("case %d: plot %q has no chart for the PDF", id, p.ID)
			}
		}
	}
}

func TestFlowTextExponents(t *testing.T) {
	for in, want := range map[string]string{
		"1.2×10⁻⁵ Pa": "1.2×10^-5 Pa", "3×10¹² m": "3×10^12 m", "5 m³": "5 m³",
	} {
		if got := flowText(in); got != want {
			t.Errorf("flowText(%q) = %q, want %q", in, got, want)
		}
	}
	segs := splitExp("4.2×10⁻⁹ s")
	if len(segs) != 3 || segs[0].text != "4.2×10" || !segs[1].exp || segs[1].text != "-9" || segs[2].text != " s" {
		t.Errorf("splitExp: %+v", segs)
	}
}

// A steady case whose drops settle outside a property's published range
// lists that warning in its report, never "None": the kerosene surrogate
// in 1 atm, 600 K air settles near 153 °C, beyond the 0–57 °C of its
// heat-capacity fit.
func TestReportListsStateWarnings(t *testing.T) {
	ts, _ := newTestServer(t)
	body := `{"format":"fogbench-case/1","name":"hot dryer","fluid":"kerosene-surrogate",
	  "gas":{"pressure_pa":101325,"temperature_k":600},
	  "distribution":{"model":"rosin-rammler","d32_m":3e-5,"q":2.5,"bins":10}}`
	id := createCaseAPI(t, http.DefaultClient, ts.URL, []byte(body))
	doc, code := getDoc(t, client(t), fmt.Sprintf("%s/cases/%d/report", ts.URL, id))
	if code != http.StatusOK {
		t.Fatalf("report: %d", code)
	}
	w := doc.Find(`[data-testid=section-warnings]`).Text()
	if strings.Contains(w, "None:") || !strings.Contains(w, "liquid heat capacity: the drops' steady temperature reached") {
		t.Errorf("report warnings: %q", w)
	}
}
