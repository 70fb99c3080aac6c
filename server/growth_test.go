package server

import (
	"context"
	"io"
	"net/http"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/calc"
	"fogbench/views"
)

// supersaturatedCase is water at 20 °C in air holding 2400 Pa of vapor
// (p_sat(20 °C) ≈ 2339 Pa, so S ≈ 1.026): drops above the Kelvin critical
// size, about 0.08 µm, grow, the smaller ones evaporate.
func supersaturatedCase() calc.Case {
	tl, pv := 293.15, 2400.0
	return calc.Case{Format: calc.CaseFormat, Name: "Fog chamber (invented)", Fluid: "water", LiquidTemperatureK: &tl,
		Gas:          calc.Gas{ID: "air", PressurePa: 101325, TemperatureK: 293.15, VaporPartialPressurePa: &pv},
		Evaporation:  calc.Evaporation{MaxTimeS: 0.01},
		Distribution: calc.Distribution{Model: "log-normal", MedianM: 2e-7, GSD: 2, Basis: "number", Bins: 10, DMinM: 2e-8, DMaxM: 5e-6}}
}

// The case page of a supersaturated case says which classes grow: the note
// names the Kelvin critical diameter, each growing class's lifetime reads
// "grows (above r*)" and its row is marked, the evaporating ones keep their
// lifetimes, and the curvature plot marks 2r*.
func TestCasePageMarksGrowingClasses(t *testing.T) {
	ts, st := newTestServer(t)
	c := supersaturatedCase()
	rec, err := st.CreateCase(context.Background(), c, "tester")
	if err != nil {
		t.Fatal(err)
	}
	res, err := calc.Evaluate(c)
	if err != nil {
		t.Fatal(err)
	}
	if res.Curvature.KelvinCriticalRadiusM == nil {
		t.Fatal("the case is not supersaturated")
	}
	wantGrow := 0
	for _, b := range res.Bins {
		if b.Grows != nil && *b.Grows {
			wantGrow++
		}
	}
	if wantGrow == 0 || wantGrow == len(res.Bins) {
		t.Fatalf("%d of %d classes grow; the case should have both kinds", wantGrow, len(res.Bins))
	}
	doc, code := getDoc(t, client(t), ts.URL+"/cases/"+itoa(rec.ID))
	if code != http.StatusOK {
		t.Fatalf("status %d", code)
	}
	note := doc.Find(`[data-testid="growth-note"]`).Text()
	d := views.Micro(2 * *res.Curvature.KelvinCriticalRadiusM)
	if !strings.Contains(note, "2r* = "+d+" µm") || !strings.Contains(note, itoa(int64(wantGrow))+" of "+itoa(int64(len(res.Bins)))) {
		t.Errorf("growth note %q; want 2r* = %s µm and %d of %d classes", note, d, wantGrow, len(res.Bins))
	}
	rows := doc.Find(`[data-testid="bin-table"] tbody tr`)
	if rows.Length() != len(res.Bins) {
		t.Fatalf("%d rows for %d classes", rows.Length(), len(res.Bins))
	}
	lifeCol := 8 // Class, d, Number, Volume, Laplace, Vapor pressure, Kelvin, Enhancement, Lifetime
	rows.Each(func(i int, tr *goquery.Selection) {
		grows := *res.Bins[i].Grows
		life := strings.TrimSpace(tr.Find("td").Eq(lifeCol).Text())
		if grows != (life == views.GrowsLifetime) || grows != tr.HasClass("grows") {
			t.Errorf("class %d (d = %g m, grows %v): lifetime cell %q, row class %q", i, res.Bins[i].DM, grows, life, tr.AttrOr("class", ""))
		}
		if !grows && (res.Bins[i].LifetimeS == nil || life == "never") {
			t.Errorf("class %d evaporates but shows %q", i, life)
		}
	})
	if svg, _ := doc.Find(`[data-testid="plot-curvature"]`).Html(); !strings.Contains(svg, "Kelvin critical 2r*") {
		t.Error("the curvature plot does not mark the Kelvin critical diameter")
	}

	// The printable report shows the same, and the PDF is drawn.
	doc, code = getDoc(t, client(t), ts.URL+"/cases/"+itoa(rec.ID)+"/report")
	if code != http.StatusOK {
		t.Fatalf("report status %d", code)
	}
	if n := doc.Find(`[data-testid="bin-table"] tbody tr.grows`).Length(); n != wantGrow {
		t.Errorf("report marks %d growing rows, want %d", n, wantGrow)
	}
	if !strings.Contains(doc.Find(`[data-testid="growth-note"]`).Text(), "2r* = "+d) {
		t.Error("report has no growth note")
	}
	resp, err := client(t).Get(ts.URL + "/cases/" + itoa(rec.ID) + "/report.pdf")
	if err != nil {
		t.Fatal(err)
	}
	body, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusOK || !strings.HasPrefix(string(body), "%PDF") {
		t.Errorf("report.pdf: status %d, %d bytes", resp.StatusCode, len(body))
	}

	// A demo case in dry air shows no note and no growing row.
	demo, code := getDoc(t, client(t), ts.URL+"/cases/1")
	if code != http.StatusOK || demo.Find(`[data-testid="bin-table"] tbody tr`).Length() == 0 {
		t.Fatalf("demo case 1: status %d, no bin table", code)
	}
	if demo.Find(`[data-testid="growth-note"]`).Length() != 0 || demo.Find(`tr.grows`).Length() != 0 {
		t.Error("a case in unsaturated air shows growth")
	}
}

// BinRows puts the growth mark in the lifetime cell that the page, the
// printable report and the PDF all draw (BinRow.Cells).
func TestBinRowsGrowsCell(t *testing.T) {
	res, err := calc.Evaluate(supersaturatedCase())
	if err != nil {
		t.Fatal(err)
	}
	v := views.CaseView{Result: res}
	for i, b := range v.BinRows() {
		grows := *res.Bins[i].Grows
		if b.Grows != grows || (b.Cells()[8] == views.GrowsLifetime) != grows {
			t.Errorf("class %d: row %+v, grows %v", i, b, grows)
		}
	}
}
