package server

import (
	"crypto/hmac"
	"crypto/sha256"
	"crypto/subtle"
	"encoding/hex"
	"net/http"
	"net/url"
	"strconv"
	"strings"
	"time"
	"unicode"
	"unicode/utf8"

	"fogbench/views"
)

// A shared host is guarded by one access token that the team shares (see
// docs/access.md for why a token and not accounts). A browser exchanges it
// once at /login for a session cookie; JSON clients send it as a bearer
// token. The token itself is never stored in a cookie or logged.

const (
	sessionCookie = "fogbench_session"
	authorCookie  = "author"
	sessionTTL    = 12 * time.Hour
	// MinTokenLen is the shortest access token main accepts.
	MinTokenLen  = 16
	maxAuthorLen = 60
)

// tokenMatches compares a presented token with the configured one in
// constant time; hashing first also hides the token's length.
func (s *Server) tokenMatches(given string) bool {
	a := sha256.Sum256([]byte(given))
	b := sha256.Sum256([]byte(s.Token))
	return subtle.ConstantTimeCompare(a[:], b[:]) == 1
}

// sessionMAC signs an expiry time with a key derived from the token, so
// changing the token ends every session.
func (s *Server) sessionMAC(exp int64) []byte {
	key := sha256.Sum256([]byte("fogbench session key\x00" + s.Token))
	m := hmac.New(sha256.New, key[:])
	m.Write([]byte("fogbench-session-v1|" + strconv.FormatInt(exp, 10)))
	return m.Sum(nil)
}

func (s *Server) newSession(now time.Time) (string, time.Time) {
	exp := now.Add(sessionTTL)
	return strconv.FormatInt(exp.Unix(), 10) + "." + hex.EncodeToString(s.sessionMAC(exp.Unix())), exp
}

func (s *Server) validSession(v string, now time.Time) bool {
	expRaw, macHex, ok := strings.Cut(v, ".")
	if !ok {
		return false
	}
	exp, err := strconv.ParseInt(expRaw, 10, 64)
	if err != nil || now.Unix() >= exp {
		return false
	}
	mac, err := hex.DecodeString(macHex)
	return err == nil && hmac.Equal(mac, s.sessionMAC(exp))
}

// authenticated reports whether a request carries a valid session cookie
// or bearer token.
func (s *Server) authenticated(r *http.Request) bool {
	if c, err := r.Cookie(sessionCookie); err == nil && s.validSession(c.Value, time.Now()) {
		return true
	}
	if h := r.Header.Get("Authorization"); strings.HasPrefix(h, "Bearer ") {
		return s.tokenMatches(strings.TrimPrefix(h, "Bearer "))
	}
	return false
}

// requireToken lets a request through when no token is configured (a
// loopback-only fogbench), for the login page and static files, or when the
// request is authenticated. Pages send the browser to /login; the API
// answers 401.
func (s *Server) requireToken(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		p := r.URL.Path
		if s.Token == "" || p == "/login" || strings.HasPrefix(p, "/static/") || s.authenticated(r) {
			next.ServeHTTP(w, r)
			return
		}
		if strings.HasPrefix(p, "/api/") {
			w.Header().Set("WWW-Authenticate", `Bearer realm="fogbench"`)
			writeJSON(w, http.StatusUnauthorized, map[string]string{"error": "sign in: send the access token as Authorization: Bearer TOKEN"})
			return
		}
		next := r.URL.Path
		if r.Method == http.MethodGet && r.URL.RawQuery != "" {
			next += "?" + r.URL.RawQuery
		}
		http.Redirect(w, r, "/login?next="+url.QueryEscape(next), http.StatusSeeOther)
	})
}

// safeNext keeps a post-login redirect on this site.
func safeNext(n string) string {
	if !strings.HasPrefix(n, "/") || strings.HasPrefix(n, "//") || strings.ContainsAny(n, "\\\r\n") {
		return "/cases"
	}
	return n
}

// cleanAuthor checks a name given for revisions.
func cleanAuthor(n string) (string, string) {
	n = strings.TrimSpace(n)
	switch {
	case n == "":
		return "", "Give your name; it is shown on the revisions you save."
	case utf8.RuneCountInString(n) > maxAuthorLen:
		return "", "Use at most 60 characters."
	case strings.IndexFunc(n, unicode.IsControl) >= 0 || !utf8.ValidString(n):
		return "", "The name holds characters that cannot be shown."
	}
	return n, ""
}

func (s *Server) loginView(r *http.Request) views.LoginView {
	v := views.LoginView{
		Chrome:        views.Chrome{Title: "Sign in", Display: display(r)},
		Next:          safeNext(r.URL.Query().Get("next")),
		TokenRequired: s.Token != "",
	}
	if name := authorFromCookie(r); name != "" {
		v.Name = name
		v.SignedIn = true
	}
	if !v.TokenRequired {
		v.Title = "Your name"
	}
	return v
}

// handleLogin serves GET /login.
func (s *Server) handleLogin(w http.ResponseWriter, r *http.Request) {
	v := s.loginView(r)
	s.render(w, r, http.StatusOK, v.Chrome, views.LoginPage(v))
}

// handleLoginPost serves POST /login: checks the token (on a shared host)
// and sets the session and author cookies.
func (s *Server) handleLoginPost(w http.ResponseWriter, r *http.Request) {
	v := s.loginView(r)
	v.Next = safeNext(r.PostFormValue("next"))
	v.Name = r.PostFormValue("name")
	name, msg := cleanAuthor(v.Name)
	if msg != "" {
		v.Error = msg
		s.render(w, r, http.StatusBadRequest, v.Chrome, views.LoginPage(v))
		return
	}
	secure := r.TLS != nil || s.SecureCookies
	if s.Token != "" {
		if !s.tokenMatches(r.PostFormValue("token")) {
			// A pause makes guessing slow; the token is long enough that
			// this is a courtesy, not the defence.
			time.Sleep(400 * time.Millisecond)
			s.Logger.Warn("login refused", "client", clientIP(r))
			v.Error = "That access token is not right."
			s.render(w, r, http.StatusUnauthorized, v.Chrome, views.LoginPage(v))
			return
		}
		val, exp := s.newSession(time.Now())
		http.SetCookie(w, &http.Cookie{Name: sessionCookie, Value: val, Path: "/", Expires: exp,
			HttpOnly: true, SameSite: http.SameSiteStrictMode, Secure: secure})
	}
	http.SetCookie(w, &http.Cookie{Name: authorCookie, Value: url.QueryEscape(name), Path: "/", MaxAge: 365 * 24 * 3600,
		HttpOnly: true, SameSite: http.SameSiteStrictMode, Secure: secure})
	http.Redirect(w, r, v.Next, http.StatusSeeOther)
}

// handleLogout serves POST /logout: both cookies are cleared.
func (s *Server) handleLogout(w http.ResponseWriter, r *http.Request) {
	for _, n := range []string{sessionCookie, authorCookie} {
		http.SetCookie(w, &http.Cookie{Name: n, Value: "", Path: "/", MaxAge: -1, HttpOnly: true,
			SameSite: http.SameSiteStrictMode, Secure: r.TLS != nil || s.SecureCookies})
	}
	http.Redirect(w, r, "/login", http.StatusSeeOther)
}

func clientIP(r *http.Request) string {
	host := r.RemoteAddr
	if i := strings.LastIndexByte(host, ':'); i > 0 {
		host = host[:i]
	}
	return host
}

// authorFromCookie is the name the user gave at /login, or "". The cookie
// holds it URL-escaped, since cookie values cannot carry every character a
// name may have.
func authorFromCookie(r *http.Request) string {
	c, err := r.Cookie(authorCookie)
	if err != nil || c.Value == "" || len(c.Value) > 8*maxAuthorLen {
		return ""
	}
	raw, err := url.QueryUnescape(c.Value)
	if err != nil {
		return ""
	}
	name, msg := cleanAuthor(raw)
	if msg != "" {
		return ""
	}
	return name
}
