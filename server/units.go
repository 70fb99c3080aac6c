package server

import (
	"net/http"
	"net/url"
	"time"

	"fogbench/calc"
	"fogbench/calc/units"
)

// unitsCookieAge keeps the reader's choice for a year.
const unitsCookieAge = 365 * 24 * 60 * 60

// handleUnitsSet serves POST /settings/units: it stores the reader's unit
// system in the units cookie (read by display) and sends the browser back to
// the page it came from. Storage and computation stay SI; only what pages
// show and what blank forms start with follows the choice.
func (s *Server) handleUnitsSet(w http.ResponseWriter, r *http.Request) {
	if err := r.ParseForm(); err != nil {
		s.error(w, r, err)
		return
	}
	sys := units.System(r.PostForm.Get("system"))
	if sys != units.SI && sys != units.US {
		s.error(w, r, calc.Errorf(calc.Invalid, "Unknown unit system %q: choose si or us.", string(sys)))
		return
	}
	http.SetCookie(w, s.newCookie("units", string(sys), unitsCookieAge*time.Second))
	http.Redirect(w, r, backTarget(r), http.StatusSeeOther)
}

// backTarget is the local page to return to: the form's back field, else the
// Referer when it is this site, else the library. Anything that could lead
// off the site (another host, a scheme, "//host") is refused.
func backTarget(r *http.Request) string {
	if p, ok := localPath(r.PostForm.Get("back")); ok {
		return p
	}
	if ref, err := url.Parse(r.Referer()); err == nil && ref.Host == r.Host {
		if p, ok := localPath(ref.RequestURI()); ok {
			return p
		}
	}
	return "/cases"
}

// localPath accepts a path on this site, with its query.
func localPath(raw string) (string, bool) {
	if raw == "" || raw[0] != '/' || len(raw) > 1 && (raw[1] == '/' || raw[1] == '\\') {
		return "", false
	}
	u, err := url.Parse(raw)
	if err != nil || u.Scheme != "" || u.Host != "" || u.User != nil {
		return "", false
	}
	return u.RequestURI(), true
}
