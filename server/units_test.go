package server

import (
	"net/http"
	"net/url"
	"strings"
	"testing"

	"fogbench/calc/units"
)

func TestUnitsSwitchSetsCookieAndComesBack(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	resp := postForm(t, c, ts.URL+"/settings/units", url.Values{"system": {"us"}, "back": {"/cases/1?x=1"}})
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther || resp.Header.Get("Location") != "/cases/1?x=1" {
		t.Fatalf("status %d, location %q", resp.StatusCode, resp.Header.Get("Location"))
	}
	var cookie *http.Cookie
	for _, ck := range resp.Cookies() {
		if ck.Name == "units" {
			cookie = ck
		}
	}
	if cookie == nil || cookie.Value != "us" || !cookie.HttpOnly || cookie.Path != "/" {
		t.Fatalf("units cookie %+v", cookie)
	}
	// Pages now show US customary units, and the switch shows the choice.
	doc, _ := getDoc(t, c, ts.URL+"/cases/1")
	if got := doc.Find(`#units-system option[selected]`).AttrOr("value", ""); got != "us" {
		t.Errorf("switch shows %q", got)
	}
	want := units.Default(units.US, units.Pressure).Symbol
	if !strings.Contains(doc.Find(`.inputs`).Text(), want) {
		t.Errorf("inputs panel not in %s: %q", want, doc.Find(`.inputs`).Text())
	}
	// The back field of a page is its own path.
	if got := doc.Find(`[data-testid=units-form] input[name=back]`).AttrOr("value", ""); got != "/cases/1" {
		t.Errorf("back field %q", got)
	}
	// A new form starts in the chosen units.
	doc, _ = getDoc(t, c, ts.URL+"/cases/new")
	if got := doc.Find(`select[name=pressure_unit] option[selected]`).AttrOr("value", ""); got != "psi" {
		t.Errorf("new form pressure unit %q", got)
	}
}

func TestUnitsSwitchRefusesBadInput(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	resp := postForm(t, c, ts.URL+"/settings/units", url.Values{"system": {"imperial-ish"}})
	resp.Body.Close()
	if resp.StatusCode != http.StatusBadRequest {
		t.Errorf("unknown system: status %d", resp.StatusCode)
	}
	// A back address that leads off the site is not followed.
	for _, back := range []string{"//elsewhere.example/x", "https://elsewhere.example/", "/\\elsewhere.example", "cases"} {
		resp := postForm(t, c, ts.URL+"/settings/units", url.Values{"system": {"si"}, "back": {back}})
		resp.Body.Close()
		if loc := resp.Header.Get("Location"); loc != "/cases" {
			t.Errorf("back %q redirected to %q", back, loc)
		}
	}
}
