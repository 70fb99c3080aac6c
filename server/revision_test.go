package server

import (
	"context"
	"fmt"
	"net/http"
	"net/url"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/store"
)

// Two people edit revision 1 of the same case in two browser sessions. The
// second save gets the conflict page with both versions; merging keeps both
// people's changes and writes nothing silently.
func TestConflictPageAndMerge(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	ana, ben := client(t), client(t)
	resp := postForm(t, ana, ts.URL+"/cases", validForm())
	resp.Body.Close()
	id := mustInt(t, caseURL.FindStringSubmatch(resp.Header.Get("Location"))[1])
	caseAt := fmt.Sprintf("%s/cases/%d", ts.URL, id)

	// Ana changes q; Ben, from the same revision 1, changes the gas
	// temperature and the name.
	fa := validForm()
	fa.Set("revision", "1")
	fa.Set("q", "3.4")
	resp = postForm(t, ana, caseAt, fa)
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther {
		t.Fatalf("ana's save: %d", resp.StatusCode)
	}
	fb := validForm()
	fb.Set("revision", "1")
	fb.Set("gas_temperature", "60")
	fb.Set("name", "Ben's nozzle")
	resp = postForm(t, ben, caseAt, fb)
	if resp.StatusCode != http.StatusConflict {
		t.Fatalf("ben's stale save: status %d", resp.StatusCode)
	}
	doc := docOf(t, resp)
	if doc.Find(`[data-testid=conflict-page]`).Length() != 1 {
		t.Fatal("no conflict page")
	}
	differs := map[string]bool{}
	doc.Find(`[data-testid=conflict-differs] code`).Each(func(_ int, s *goquery.Selection) { differs[s.Text()] = true })
	for _, f := range []string{"name", "gas.temperature_k", "distribution.q"} {
		if !differs[f] {
			t.Errorf("field %s not marked as differing (marked: %v)", f, differs)
		}
	}
	if len(differs) != 3 {
		t.Errorf("marked %v, want exactly name, gas temperature and q", differs)
	}
	// Preselection: Ben's values where Ben changed, Ana's where she did.
	checked := func(path string) string {
		v, _ := doc.Find(`input[name="pick.` + path + `"][checked]`).Attr("value")
		return v
	}
	if checked("gas.temperature_k") != "mine" || checked("distribution.q") != "theirs" {
		t.Fatalf("preselected T=%s q=%s", checked("gas.temperature_k"), checked("distribution.q"))
	}
	if rec, _ := st.GetCase(ctx, id); rec.Revision != 2 || rec.Case.Distribution.Q != 3.4 {
		t.Fatalf("the conflict wrote something: rev %d", rec.Revision)
	}

	// Ben merges with the preselected choices.
	mine, _ := doc.Find(`input[name=mine]`).Attr("value")
	form := url.Values{"mine": {mine}, "base": {"1"}, "current": {"2"}, "action": {"merge"}}
	doc.Find(`input[type=radio][checked]`).Each(func(_ int, s *goquery.Selection) {
		n, _ := s.Attr("name")
		v, _ := s.Attr("value")
		form.Set(n, v)
	})
	resp = postForm(t, ben, caseAt+"/merge", form)
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther {
		t.Fatalf("merge: status %d", resp.StatusCode)
	}
	rec, _ := st.GetCase(ctx, id)
	if rec.Revision != 3 || rec.Case.Distribution.Q != 3.4 || rec.Case.Name != "Ben's nozzle" || rec.Case.Gas.TemperatureK != 333.15 {
		t.Fatalf("merged rev %d q %g name %q T %g", rec.Revision, rec.Case.Distribution.Q, rec.Case.Name, rec.Case.Gas.TemperatureK)
	}

	// Replaying the same merge (based on revision 2, now stale) is a
	// conflict again, never an overwrite.
	resp = postForm(t, ben, caseAt+"/merge", form)
	resp.Body.Close()
	if resp.StatusCode != http.StatusConflict {
		t.Fatalf("stale merge: status %d", resp.StatusCode)
	}
	// Re-apply on the newest revision, and save-as-copy, both work.
	form.Set("current", "3")
	form.Set("action", "reapply")
	resp = postForm(t, ben, caseAt+"/merge", form)
	resp.Body.Close()
	if rec, _ = st.GetCase(ctx, id); resp.StatusCode != http.StatusSeeOther || rec.Case.Distribution.Q != 3.4 || rec.Case.Name != "Ben's nozzle" {
		t.Fatalf("reapply: %d %+v", resp.StatusCode, rec.Case.Name)
	}
	form.Set("action", "copy")
	resp = postForm(t, ben, caseAt+"/merge", form)
	resp.Body.Close()
	m := caseURL.FindStringSubmatch(resp.Header.Get("Location"))
	if resp.StatusCode != http.StatusSeeOther || m == nil || mustInt(t, m[1]) == id {
		t.Fatalf("copy: %d %q", resp.StatusCode, resp.Header.Get("Location"))
	}
}

func TestRevisionPages(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	rows, _, _ := st.ListCases(ctx, store.ListOptions{Sort: "id"})
	id := rows[0].ID
	rec, _ := st.GetCase(ctx, id)
	c := rec.Case
	c.Gas.PressurePa *= 2
	if _, err := st.UpdateCase(ctx, id, 1, c, "ana"); err != nil {
		t.Fatal(err)
	}
	cl := client(t)
	base := fmt.Sprintf("%s/cases/%d", ts.URL, id)
	doc, code := getDoc(t, cl, base+"/revisions")
	if code != http.StatusOK || doc.Find(`[data-testid=revision-row]`).Length() != 2 {
		t.Fatalf("revisions page %d", code)
	}
	if !strings.Contains(doc.Find(`[data-testid=revision-row]`).First().Text(), "ana") {
		t.Fatal("author missing from the newest revision")
	}
	doc, code = getDoc(t, cl, base+"/diff?a=2&b=1")
	if code != http.StatusOK {
		t.Fatalf("diff %d", code)
	}
	changed := doc.Find(`[data-testid=diff-changed] code`)
	if changed.Length() != 1 || changed.Text() != "gas.pressure_pa" {
		t.Fatalf("changed rows %d %q", changed.Length(), changed.Text())
	}
	// Revision 1 read-only: no edit button, a restore button instead.
	doc, code = getDoc(t, cl, base+"/revisions/1")
	if code != http.StatusOK || doc.Find(`[data-testid=old-revision]`).Length() != 1 || doc.Find(`a[href$="/edit"]`).Length() != 0 {
		t.Fatalf("old revision page %d", code)
	}
	resp := postForm(t, cl, base+"/revisions/1/restore", url.Values{"base": {"2"}})
	resp.Body.Close()
	if rec, _ = st.GetCase(ctx, id); resp.StatusCode != http.StatusSeeOther || rec.Revision != 3 || rec.Case.Gas.PressurePa != c.Gas.PressurePa/2 {
		t.Fatalf("restore: %d rev %d", resp.StatusCode, rec.Revision)
	}
	if _, code = getDoc(t, cl, base+"/revisions/9"); code != http.StatusNotFound {
		t.Fatalf("missing revision: %d", code)
	}
}

func TestLibraryActions(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	rows, _, _ := st.ListCases(ctx, store.ListOptions{Sort: "id"})
	id := rows[0].ID
	cl := client(t)
	at := fmt.Sprintf("%s/cases/%d", ts.URL, id)
	resp := postForm(t, cl, at+"/rename", url.Values{"name": {"Renamed dryer"}, "revision": {"1"}, "back": {"/cases?sort=name"}})
	resp.Body.Close()
	if loc := resp.Header.Get("Location"); loc != "/cases?sort=name" {
		t.Fatalf("rename went back to %q", loc)
	}
	resp = postForm(t, cl, at+"/tags", url.Values{"tags": {"Dryer, team-b"}, "back": {"https://elsewhere.example/"}})
	resp.Body.Close()
	if loc := resp.Header.Get("Location"); loc != fmt.Sprintf("/cases/%d", id) {
		t.Fatalf("an outside back URL was followed: %q", loc)
	}
	rec, _ := st.GetCase(ctx, id)
	if rec.Case.Name != "Renamed dryer" || rec.Revision != 2 || strings.Join(rec.Tags, ",") != "dryer,team-b" {
		t.Fatalf("after rename and tag: %q rev %d tags %v", rec.Case.Name, rec.Revision, rec.Tags)
	}
	doc, _ := getDoc(t, cl, ts.URL+"/cases?tag=team-b")
	if n := doc.Find(`[data-testid=case-row]`).Length(); n != 1 {
		t.Fatalf("tag filter shows %d rows", n)
	}
	resp = postForm(t, cl, at+"/trash", url.Values{})
	resp.Body.Close()
	doc, _ = getDoc(t, cl, ts.URL+"/cases?trash=1")
	if n := doc.Find(`[data-testid=restore]`).Length(); n != 1 {
		t.Fatalf("trash shows %d restore buttons", n)
	}
	resp = postForm(t, cl, at+"/restore", url.Values{"back": {"/cases?trash=1"}})
	resp.Body.Close()
	if _, total, _ := st.ListCases(ctx, store.ListOptions{}); total != 3 {
		t.Fatalf("after restore %d cases", total)
	}
	// A stale rename is refused with a message, not applied.
	resp = postForm(t, cl, at+"/rename", url.Values{"name": {"Stale"}, "revision": {"1"}})
	resp.Body.Close()
	if rec, _ = st.GetCase(ctx, id); rec.Case.Name != "Renamed dryer" {
		t.Fatal("stale rename applied")
	}
}

// docOf parses a response body and closes it.
func docOf(t *testing.T, resp *http.Response) *goquery.Document {
	t.Helper()
	defer resp.Body.Close()
	doc, err := goquery.NewDocumentFromReader(resp.Body)
	if err != nil {
		t.Fatal(err)
	}
	return doc
}
