package server

import (
	"context"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/calc"
	"fogbench/calc/units"
)

func TestResultCacheEvictsLeastRecentlyUsed(t *testing.T) {
	c := newResultCache(2, 1000)
	k := func(id int64) resultKey { return resultKey{id: id, revision: 1, system: units.SI} }
	c.put(k(1), caseResults{err: "one", size: 100})
	c.put(k(2), caseResults{err: "two", size: 100})
	if _, ok := c.get(k(1)); !ok { // 1 is now the most recent
		t.Fatal("entry 1 missing")
	}
	c.put(k(3), caseResults{err: "three", size: 100})
	if _, ok := c.get(k(2)); ok {
		t.Error("entry 2 should have been evicted (least recently used)")
	}
	if v, ok := c.get(k(1)); !ok || v.err != "one" {
		t.Errorf("entry 1 = %+v, %v", v, ok)
	}
	// The byte bound evicts as well, and an entry above it is not kept.
	c.put(k(4), caseResults{size: 950})
	if c.len() != 1 {
		t.Errorf("after a 950-byte entry the 1000-byte cache holds %d entries, want 1", c.len())
	}
	c.put(k(5), caseResults{size: 2000})
	if _, ok := c.get(k(5)); ok {
		t.Error("an entry larger than the cache was kept")
	}
	// Another unit system or revision is another entry.
	if _, ok := c.get(resultKey{id: 4, revision: 1, system: units.US}); ok {
		t.Error("US units served the SI entry")
	}
	if _, ok := c.get(resultKey{id: 4, revision: 2, system: units.SI}); ok {
		t.Error("revision 2 served the revision 1 entry")
	}
}

// A saved edit makes a new revision, so the case page never shows the
// plots of the old one.
func TestCasePageNotStaleAfterSave(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	c := calc.Case{Format: calc.CaseFormat, Name: "cache check", Fluid: "water",
		Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 298.15},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 20}}
	rec, err := st.CreateCase(ctx, c, "test")
	if err != nil {
		t.Fatal(err)
	}
	cl := client(t)
	page := func() string {
		doc, status := getDoc(t, cl, fmt.Sprintf("%s/cases/%d", ts.URL, rec.ID))
		if status != 200 {
			t.Fatalf("status %d", status)
		}
		// The plots alone: the page also shows the revision number.
		svg := ""
		doc.Find("svg").Each(func(_ int, sel *goquery.Selection) {
			h, _ := sel.Html()
			svg += h
		})
		if svg == "" {
			t.Fatal("the case page has no plots")
		}
		return svg
	}
	first := page()
	if again := page(); again != first {
		t.Error("the cached page differs from the first one")
	}
	c.Distribution.XM = 20e-6
	if _, err := st.UpdateCase(ctx, rec.ID, rec.Revision, c, "test"); err != nil {
		t.Fatal(err)
	}
	if after := page(); after == first {
		t.Error("the page after a save still shows the old revision's results")
	}
}

// TestCachedPanelMatchesDrawn checks that the case page served with the
// cached results panel is byte for byte the page drawn from scratch, in
// both unit systems, on the first (drawn and cached) and a later request.
func TestCachedPanelMatchesDrawn(t *testing.T) {
	ctx := context.Background()
	st := openTestStore(t)
	temp := 293.15
	rec, err := st.CreateCase(ctx, calc.Case{Format: calc.CaseFormat, Name: "panel check", Fluid: "water", LiquidTemperatureK: &temp,
		Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 300},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 30, DMinM: 1e-6, DMaxM: 300e-6}}, "test")
	if err != nil {
		t.Fatal(err)
	}
	logger := slog.New(slog.NewTextHandler(io.Discard, nil))
	cached := New(st, logger)
	drawn := New(st, logger)
	drawn.results = nil
	get := func(s *Server, system units.System) string {
		req := httptest.NewRequest(http.MethodGet, fmt.Sprintf("/cases/%d", rec.ID), nil)
		req.AddCookie(&http.Cookie{Name: "units", Value: string(system)})
		w := httptest.NewRecorder()
		s.Handler().ServeHTTP(w, req)
		if w.Code != http.StatusOK {
			t.Fatalf("status %d", w.Code)
		}
		return w.Body.String()
	}
	for _, system := range []units.System{units.SI, units.US} {
		want := get(drawn, system)
		if !strings.Contains(want, `data-testid="bin-table"`) {
			t.Fatal("the drawn page has no bin table")
		}
		for i := range 2 {
			if got := get(cached, system); got != want {
				t.Errorf("%s, request %d: cached page differs from the drawn one (%d vs %d bytes)", system, i+1, len(got), len(want))
			}
		}
	}
	if n := cached.results.len(); n != 2 {
		t.Errorf("cache holds %d entries, want 2 (one per unit system)", n)
	}
}
