package server

import (
	"context"
	"fmt"
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
