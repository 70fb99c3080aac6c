package server

import (
	"crypto/hmac"
	"crypto/sha256"
	"encoding/base64"
	"net/http"
	"strings"
	"unicode/utf8"
)

// A one-line notice after a redirect ("Saved revision 4") travels in a
// short-lived cookie that the server signs, never in the URL: a link
// cannot put words of its own into the status banner (issue 17:
// ?flash=Reviewed+and+approved+by+the+safety+board showed as a green
// banner). The next page drawn reads it and clears it.
const (
	flashCookie = "fogbench_flash"
	flashMaxAge = 60 // seconds: the redirect is followed at once
	flashMaxLen = 400
)

// redirectWithFlash sends the browser to url (a local path) and has the
// page there show msg once.
func (s *Server) redirectWithFlash(w http.ResponseWriter, r *http.Request, url, msg string) {
	if len(msg) > flashMaxLen {
		msg = msg[:flashMaxLen]
		for !utf8.ValidString(msg) {
			msg = msg[:len(msg)-1]
		}
	}
	c := &http.Cookie{Name: flashCookie, Value: s.signFlash(msg), Path: "/", MaxAge: flashMaxAge,
		HttpOnly: true, SameSite: http.SameSiteLaxMode, Secure: r.TLS != nil || s.SecureCookies}
	http.SetCookie(w, c)
	http.Redirect(w, r, url, http.StatusSeeOther)
}

func (s *Server) flashMAC(msg string) []byte {
	m := hmac.New(sha256.New, s.flashKey)
	m.Write([]byte("fogbench-flash-v1|" + msg))
	return m.Sum(nil)
}

func (s *Server) signFlash(msg string) string {
	enc := base64.RawURLEncoding
	return enc.EncodeToString([]byte(msg)) + "." + enc.EncodeToString(s.flashMAC(msg))
}

// takeFlash returns the notice the request carries, if its signature is
// ours, and clears the cookie. Only full pages take it (not htmx
// fragments), so the page the redirect leads to shows it.
func (s *Server) takeFlash(w http.ResponseWriter, r *http.Request) string {
	c, err := r.Cookie(flashCookie)
	if err != nil || r.Header.Get("HX-Request") != "" {
		return ""
	}
	http.SetCookie(w, &http.Cookie{Name: flashCookie, Value: "", Path: "/", MaxAge: -1,
		HttpOnly: true, SameSite: http.SameSiteLaxMode, Secure: r.TLS != nil || s.SecureCookies})
	enc := base64.RawURLEncoding
	msgB64, macB64, ok := strings.Cut(c.Value, ".")
	if !ok || len(msgB64) > 2*flashMaxLen {
		return ""
	}
	msg, err1 := enc.DecodeString(msgB64)
	mac, err2 := enc.DecodeString(macB64)
	if err1 != nil || err2 != nil || s.flashKey == nil || !hmac.Equal(mac, s.flashMAC(string(msg))) {
		return ""
	}
	return string(msg)
}
