package server

import (
	"fmt"
	"math"
	"net/http"
	"strings"
	"testing"

	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"github.com/PuerkitoBio/goquery"
	"golang.org/x/image/font/sfnt"

	"fogbench/views"
)

func TestCompareReportHTML(t *testing.T) {
	ts, st := newTestServer(t)
	c := client(t)
	doc, code := getDoc(t, c, ts.URL+"/compare/report?ids=1,2,3&base=2")
	if code != http.StatusOK {
		t.Fatalf("status %d", code)
	}
	if h := doc.Find(`[data-testid=report-header]`).Text(); !strings.Contains(h, "Comparison of 3 cases") || !strings.Contains(h, "1 r1, 2 r1, 3 r1") {
		t.Errorf("running header %q", h)
	}
	for _, sec := range []string{"section-cases", "section-compare-results", "section-compare-inputs", "section-cautions", "section-plots"} {
		if doc.Find(`[data-testid=compare-report] [data-testid=`+sec+`]`).Length() != 1 {
			t.Errorf("section %s missing", sec)
		}
	}
	// The baseline column is case 2, and each case's D32 is its own
	// computation.
	if h := doc.Find(`[data-testid=compare-results] thead th`).Eq(2).Text(); !strings.Contains(h, "baseline") {
		t.Errorf("baseline heading %q", h)
	}
	d32 := doc.Find(`[data-testid=compare-results] tbody tr`).First()
	if !strings.Contains(d32.Find("th").Text(), "D32") {
		t.Fatalf("first result row is %q", d32.Find("th").Text())
	}
	for i := int64(1); i <= 3; i++ {
		_, res := demoCase(t, st, i)
		got := leadingNumber(t, d32.Find("td").Eq(int(i-1)).Text())
		if want := res.Summary.D32M * 1e6; math.Abs(got-want) > 5e-4*want {
			t.Errorf("case %d D32 %g, want %g", i, got, want)
		}
		// Each case's full report follows, every class included.
		app := doc.Find(fmt.Sprintf(`[data-testid=appendix-%d]`, i))
		if app.Length() != 1 {
			t.Fatalf("report of case %d missing", i)
		}
		if n := app.Find(`[data-testid=bin-table] tbody tr`).Length(); n != len(res.Bins) {
			t.Errorf("case %d: %d class rows of %d", i, n, len(res.Bins))
		}
	}
	// The cautions of all cases, each once: heptane brings the flammable one.
	caut := doc.Find(`[data-testid=compare-report] [data-testid=section-cautions] li`)
	seen := map[string]bool{}
	flam := false
	caut.Each(func(_ int, li *goquery.Selection) {
		if seen[li.Text()] {
			t.Errorf("caution repeated: %q", li.Text())
		}
		seen[li.Text()] = true
		flam = flam || strings.HasPrefix(li.Text(), "Flammable")
	})
	if !flam {
		t.Error("flammable caution missing from the comparison")
	}
	if doc.Find(`[data-testid=compare-report] figure.plot svg`).Length() < 3 {
		t.Error("overlay plots missing")
	}
	if _, code := getDoc(t, c, ts.URL+"/compare/report?ids=1"); code != http.StatusBadRequest {
		t.Errorf("one case: status %d", code)
	}
	if _, code := getDoc(t, c, ts.URL+"/compare/report?ids=1,999"); code != http.StatusNotFound {
		t.Errorf("unknown case: status %d", code)
	}
}

func TestCompareReportPDF(t *testing.T) {
	ts, st := newTestServer(t)
	text := pdfToText(t, getPDF(t, ts.URL+"/compare/report.pdf?ids=1,3&base=1"))
	pages := strings.Split(strings.TrimRight(text, "\f"), "\f")
	n := len(pages)
	// Two demo reports of 6 pages each and the comparison.
	if n < 8 || n > 20 {
		t.Errorf("%d pages", n)
	}
	for i, p := range pages {
		if !strings.Contains(p, fmt.Sprintf("Page %d of %d", i+1, n)) {
			t.Errorf("page %d lacks 'Page %d of %d'", i+1, i+1, n)
		}
	}
	flat := spaces.ReplaceAllString(text, " ")
	want := []string{"Comparison of 2 cases", "Key results", "Inputs that differ"}
	for _, id := range []int64{1, 3} {
		rec, res := demoCase(t, st, id)
		want = append(want, rec.Case.Name, views.Micro(res.Summary.D32M)+" µm")
		want = append(want, views.Cautions(flammable(rec.Case.Fluid), res)...)
	}
	for _, w := range want {
		if !strings.Contains(flat, spaces.ReplaceAllString(w, " ")) {
			t.Errorf("PDF text lacks %q", w)
		}
	}
}

func TestCompareReportPDFGlyphs(t *testing.T) {
	_, st := newTestServer(t)
	font, err := sfnt.Parse(liberationsansregular.TTF)
	if err != nil {
		t.Fatal(err)
	}
	var buf sfnt.Buffer
	r, _ := http.NewRequest(http.MethodGet, "/compare/report.pdf?ids=1,2,3&base=1", nil)
	v, err := New(st, nil).compareReportView(r)
	if err != nil {
		t.Fatal(err)
	}
	missing := map[rune]string{}
	if _, err := buildCompareReportPDF(v, func(text string) {
		for _, ru := range text {
			if g, _ := font.GlyphIndex(&buf, ru); g == 0 && ru != ' ' {
				missing[ru] = text
			}
		}
	}); err != nil {
		t.Fatal(err)
	}
	for ru, text := range missing {
		t.Errorf("no glyph for %q (U+%04X) in %q", ru, ru, text)
	}
}

func TestComparePageLinksReports(t *testing.T) {
	ts, _ := newTestServer(t)
	doc, code := getDoc(t, client(t), ts.URL+"/compare?ids=1,2&base=1")
	if code != http.StatusOK {
		t.Fatalf("status %d", code)
	}
	for id, want := range map[string]string{
		"compare-report-link": "/compare/report?ids=1%2C2&base=1",
		"compare-pdf-link":    "/compare/report.pdf?ids=1%2C2&base=1",
	} {
		if href, _ := doc.Find(`[data-testid=` + id + `]`).Attr("href"); href != want {
			t.Errorf("%s: href %q, want %q", id, href, want)
		}
	}
}
