package server

import (
	"net/http"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"
)

// TestNavMarksTheCurrentSection: the navigation marks the section a page
// belongs to, and only that one (the Sharing pages once marked "Case
// library").
func TestNavMarksTheCurrentSection(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	for path, want := range map[string]string{
		"/cases":         "Case library",
		"/cases/new":     "New case",
		"/fluids":        "Liquids",
		"/atomizers":     "Atomizers",
		"/bundle/export": "Sharing",
		"/bundle/import": "Sharing",
	} {
		doc, code := getDoc(t, c, ts.URL+path)
		if code != http.StatusOK {
			t.Errorf("%s: status %d", path, code)
			continue
		}
		var current []string
		doc.Find(`nav[aria-label="Main"] a[aria-current]`).Each(func(_ int, a *goquery.Selection) {
			current = append(current, strings.TrimSpace(a.Text()))
		})
		if len(current) != 1 || current[0] != want {
			t.Errorf("%s: navigation marks %q, want %q alone", path, current, want)
		}
	}
}
