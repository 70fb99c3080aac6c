package server

import (
	"crypto/sha256"
	"crypto/subtle"
	"fmt"
	"math"
	"net"
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
	// MinTokenBits is the least strength an access token must have, by
	// TokenBits's estimate.
	MinTokenBits = 128
	maxAuthorLen = 60
)

// TokenBits estimates the strength of an access token in bits, by a rule
// that is simple to check by hand (docs/access.md):
//
//	bits = min(L, 4·D) × log2(A)
//
// where L is the number of characters, D the number of different
// characters, and A the size of the alphabet the characters are drawn
// from: 16 when every character is a hexadecimal digit (0-9 with a-f, or
// with A-F), otherwise the sum over the classes that occur of 10 (digits),
// 26 (a-z), 26 (A-Z) and 33 (anything else: ASCII punctuation, space,
// characters beyond ASCII). The 4·D cap counts a token that repeats few
// characters ("aaaaaaaaaaaaaaaa", "abababab…") as short as it is weak.
// For random tokens the estimate is close to their true strength: 24
// random bytes in base64 (32 characters) give about 190 bits, 16 random
// bytes in hex (32 characters) exactly 128. A token a person made up is
// weaker than the estimate; make tokens at random.
func TokenBits(tok string) float64 {
	var n, digit, lower, upper, other, hexLower, hexUpper int
	seen := map[rune]bool{}
	for _, c := range tok {
		n++
		seen[c] = true
		switch {
		case c >= '0' && c <= '9':
			digit++
		case c >= 'a' && c <= 'z':
			lower++
			if c <= 'f' {
				hexLower++
			}
		case c >= 'A' && c <= 'Z':
			upper++
			if c <= 'F' {
				hexUpper++
			}
		default:
			other++
		}
	}
	if n == 0 {
		return 0
	}
	alphabet := 0
	switch {
	case other == 0 && upper == 0 && lower == hexLower, other == 0 && lower == 0 && upper == hexUpper:
		alphabet = 16
	default:
		for _, class := range []struct{ count, size int }{{digit, 10}, {lower, 26}, {upper, 26}, {other, 33}} {
			if class.count > 0 {
				alphabet += class.size
			}
		}
	}
	if alphabet < 2 {
		return 0
	}
	return float64(min(n, 4*len(seen))) * math.Log2(float64(alphabet))
}

// CheckToken refuses an access token weaker than MinTokenBits.
func CheckToken(tok string) error {
	if b := TokenBits(tok); b < MinTokenBits {
		return fmt.Errorf("the access token is too weak: about %.0f bits by fogbench's estimate, at least %d needed (make one with: head -c 24 /dev/urandom | base64; see docs/access.md)", math.Floor(b), MinTokenBits)
	}
	return nil
}

// tokenMatches compares a presented token with the configured one in
// constant time; hashing first also hides the token's length.
func (s *Server) tokenMatches(given string) bool {
	a := sha256.Sum256([]byte(given))
	b := sha256.Sum256([]byte(s.Token))
	return subtle.ConstantTimeCompare(a[:], b[:]) == 1
}

// newSession opens a session on the server (session.go) and returns the
// cookie value that names it and when it ends.
func (s *Server) newSession(now time.Time) (string, time.Time) {
	exp := now.Add(sessionTTL)
	return s.sessions.start(now, exp), exp
}

func (s *Server) validSession(v string, now time.Time) bool {
	return v != "" && s.sessions.valid(v, now)
}

// requireToken lets a request through when no token is configured (a
// loopback-only fogbench) or when it carries a live session cookie or the
// right bearer token. Only the routes that need it are wrapped in it
// (server.go), so what is public is the router's decision, never a test
// of the raw path. A wrong bearer token is counted against the client
// like a wrong token at /login (throttle.go). Pages without credentials
// send the browser to /login; the API answers 401.
func (s *Server) requireToken(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if s.Token == "" {
			next.ServeHTTP(w, r)
			return
		}
		if c, err := r.Cookie(sessionCookie); err == nil && s.validSession(c.Value, time.Now()) {
			next.ServeHTTP(w, r)
			return
		}
		if given, bearer := strings.CutPrefix(r.Header.Get("Authorization"), "Bearer "); bearer {
			if wait := s.failures.wait(clientKey(r)); wait > 0 {
				w.Header().Set("Retry-After", retryAfter(wait))
				writeJSON(w, http.StatusTooManyRequests, map[string]string{"error": "too many wrong access tokens from this address: try again in " + retryAfter(wait) + " s"})
				return
			}
			if s.tokenMatches(given) {
				next.ServeHTTP(w, r)
				return
			}
			s.refuseToken(r, "bearer token refused")
			w.Header().Set("WWW-Authenticate", `Bearer realm="fogbench", error="invalid_token"`)
			writeJSON(w, http.StatusUnauthorized, map[string]string{"error": "the access token is not right"})
			return
		}
		if strings.HasPrefix(r.URL.Path, "/api/") {
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

// refuseToken counts a wrong token against the client, logs it (without
// the token) and pauses, so that guessing is slow on every connection.
func (s *Server) refuseToken(r *http.Request, what string) {
	s.failures.fail(clientKey(r))
	s.Logger.Warn(what, "client", clientIP(r))
	if s.failDelay > 0 {
		time.Sleep(s.failDelay)
	}
}

// retryAfter is a wait in whole seconds, rounded up, at least 1.
func retryAfter(d time.Duration) string {
	return strconv.Itoa(max(1, int(math.Ceil(d.Seconds()))))
}

// safeNext keeps a post-login redirect on this site. It accepts only a
// local path: "/" alone, or "/" followed by a character that is not "/",
// "\\" or white space, both in the value as given (already decoded from the
// form or query) and in it percent-decoded once more; and, in the value as
// given, no control character, white space or backslash anywhere (browsers
// drop tabs and newlines from a URL and read "\\" as "/", and http.Redirect
// cleans "/x/../" away, so any of them could turn the path into "//host").
// Anything else gives /cases.
func safeNext(n string) string {
	const fallback = "/cases"
	dec, err := url.PathUnescape(n)
	if err != nil || !localStart(n) || !localStart(dec) {
		return fallback
	}
	if strings.ContainsFunc(n, func(c rune) bool {
		return c == '\\' || unicode.IsSpace(c) || unicode.IsControl(c) || c == utf8.RuneError
	}) {
		return fallback
	}
	return n
}

// localStart reports whether v is "/" or starts with "/" and a character
// that is not "/", "\\" or white space.
func localStart(v string) bool {
	if v == "/" {
		return true
	}
	if len(v) < 2 || v[0] != '/' {
		return false
	}
	c, _ := utf8.DecodeRuneInString(v[1:])
	return c != '/' && c != '\\' && !unicode.IsSpace(c) && !unicode.IsControl(c)
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
		if wait := s.failures.wait(clientKey(r)); wait > 0 {
			w.Header().Set("Retry-After", retryAfter(wait))
			v.Error = "Too many wrong access tokens from your address: try again in " + retryAfter(wait) + " s."
			s.render(w, r, http.StatusTooManyRequests, v.Chrome, views.LoginPage(v))
			return
		}
		if !s.tokenMatches(r.PostFormValue("token")) {
			// Counted per client and paused (throttle.go): guessing is
			// slow; the token's strength is the defence.
			s.refuseToken(r, "login refused")
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

// handleLogout serves POST /logout: the session ends on the server, so
// its cookie no longer signs anyone in even if kept, and both cookies are
// cleared.
func (s *Server) handleLogout(w http.ResponseWriter, r *http.Request) {
	if c, err := r.Cookie(sessionCookie); err == nil {
		s.sessions.end(c.Value)
	}
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

// clientKey is the client a wrong token is counted against: its IPv4
// address, or the /64 network of an IPv6 address (one host usually holds a
// whole /64).
func clientKey(r *http.Request) string {
	host := strings.Trim(clientIP(r), "[]")
	ip := net.ParseIP(host)
	if ip == nil || ip.To4() != nil {
		return host
	}
	return ip.Mask(net.CIDRMask(64, 128)).String() + "/64"
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
