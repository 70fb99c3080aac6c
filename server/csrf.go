package server

import (
	"net/http"
	"strings"
	"time"

	"github.com/go-chi/chi/v5/middleware"

	"fogbench/views"
)

// crossOrigin refuses state-changing requests (every method but GET, HEAD
// and OPTIONS) that a browser sent from another site, so a page elsewhere
// cannot make a user's browser save, delete or import here. It is Go's
// tokenless http.CrossOriginProtection: the browser's Sec-Fetch-Site header
// decides, and where a browser sends none, the Origin header must name
// this host. htmx requests are same-origin fetches and pass; clients that
// send neither header (curl, scripts on this machine) are not browsers
// acting for a user and pass too.
func (s *Server) crossOrigin(next http.Handler) http.Handler {
	p := http.NewCrossOriginProtection()
	p.SetDenyHandler(http.HandlerFunc(s.refuseCrossOrigin))
	return p.Handler(next)
}

// crossOriginMessage tells the user why nothing happened.
const crossOriginMessage = "This request came from another site, so it was refused: fogbench accepts changes only from its own pages. Open fogbench directly and try again."

func (s *Server) refuseCrossOrigin(w http.ResponseWriter, r *http.Request) {
	s.Logger.Warn("cross-origin request refused", "method", r.Method, "path", r.URL.Path,
		"origin", r.Header.Get("Origin"), "sec_fetch_site", r.Header.Get("Sec-Fetch-Site"),
		"request_id", middleware.GetReqID(r.Context()))
	if wantsJSON(r) {
		writeJSON(w, http.StatusForbidden, map[string]string{"error": "cross-origin request refused: changes are accepted only from fogbench's own pages"})
		return
	}
	chrome := views.Chrome{Title: "Refused", Display: display(r)}
	s.render(w, r, http.StatusForbidden, chrome, views.ErrorPage(http.StatusForbidden, crossOriginMessage))
}

// wantsJSON reports whether a response should be JSON: the API's paths,
// or a client that asks for JSON and not HTML.
func wantsJSON(r *http.Request) bool {
	if r.URL.Path == "/api" || strings.HasPrefix(r.URL.Path, "/api/") {
		return true
	}
	accept := r.Header.Get("Accept")
	return strings.Contains(accept, "application/json") && !strings.Contains(accept, "text/html")
}

// newCookie returns a cookie with fogbench's policy: not readable by
// script, not sent on cross-site subrequests, and Secure when the server
// runs over TLS (SecureCookies), so it never travels in clear text. A
// maxAge of zero makes a session cookie; a negative one deletes it.
func (s *Server) newCookie(name, value string, maxAge time.Duration) *http.Cookie {
	c := &http.Cookie{Name: name, Value: value, Path: "/", HttpOnly: true,
		SameSite: http.SameSiteLaxMode, Secure: s.SecureCookies}
	switch {
	case maxAge > 0:
		c.MaxAge = int(maxAge / time.Second)
	case maxAge < 0:
		c.MaxAge = -1
	}
	return c
}
