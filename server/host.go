package server

import (
	"fmt"
	"net"
	"net/http"
	"strconv"
	"strings"
)

// checkHost defends a fogbench without a token (loopback only) against
// DNS rebinding: a page on another site whose name the attacker then
// points at 127.0.0.1 would otherwise be same-origin with fogbench for the
// browser, and could read and change the library. Such a request names
// the attacker's domain in its Host header, so without a token only these
// names are answered: 127.0.0.1, localhost and [::1] (and the listening
// address itself), each with the port the request came in on, and the
// names in AllowedHosts (a reverse proxy's). Others get 421 with a
// one-line reason. With a token, the token guards instead: a rebound name
// carries no session cookie of ours and no bearer token.
//
// The port is the listener's, which http.Server puts in the request's
// context. A request handed to the handler in-process, without a listener
// (tests of single handlers), has no such address and is not checked.
func (s *Server) checkHost(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if s.Token != "" || s.hostAllowed(r) {
			next.ServeHTTP(w, r)
			return
		}
		s.Logger.Warn("request for another host name refused", "host", r.Host, "path", r.URL.Path, "client", clientIP(r))
		w.Header().Set("Content-Type", "text/plain; charset=utf-8")
		w.Header().Set("X-Content-Type-Options", "nosniff")
		w.WriteHeader(http.StatusMisdirectedRequest)
		w.Write([]byte(hostRefusal(r) + "\n"))
	})
}

// hostRefusal is the one line a refused request gets.
func hostRefusal(r *http.Request) string {
	port := "its port"
	if p := localPort(r); p != "" {
		port = "port " + p
	}
	return "fogbench answers only as 127.0.0.1, localhost or [::1] on " + port +
		"; a request for another host name is refused (a reverse proxy's name can be allowed with -allow-host)"
}

// localPort is the port the request came in on, or "" when unknown.
func localPort(r *http.Request) string {
	a, ok := r.Context().Value(http.LocalAddrContextKey).(net.Addr)
	if !ok {
		return ""
	}
	_, port, err := net.SplitHostPort(a.String())
	if err != nil {
		return ""
	}
	return port
}

// hostAllowed reports whether r's Host header names this server.
func (s *Server) hostAllowed(r *http.Request) bool {
	name, port := splitHost(r.Host)
	if name == "" {
		return false
	}
	for _, a := range s.AllowedHosts {
		an, ap := splitHost(a)
		if an == name && (ap == "" || ap == port) {
			return true
		}
	}
	local, ok := r.Context().Value(http.LocalAddrContextKey).(net.Addr)
	if !ok {
		// In-process (no listener): nothing to compare the port with.
		return true
	}
	lhost, lport, err := net.SplitHostPort(local.String())
	if err != nil {
		return false
	}
	if port == "" {
		port = "80"
		if r.TLS != nil {
			port = "443"
		}
	}
	if port != lport {
		return false
	}
	switch name {
	case "127.0.0.1", "localhost", "::1":
		return true
	}
	return name == strings.ToLower(lhost)
}

// splitHost splits a Host header (or an -allow-host entry) into a
// lower-case name without brackets and a port ("" when none). A malformed
// one gives an empty name.
func splitHost(h string) (name, port string) {
	h = strings.ToLower(strings.TrimSpace(h))
	if h == "" {
		return "", ""
	}
	if n, p, err := net.SplitHostPort(h); err == nil {
		if _, err := strconv.ParseUint(p, 10, 16); err != nil {
			return "", ""
		}
		return n, p
	}
	if strings.HasPrefix(h, "[") && strings.HasSuffix(h, "]") {
		return h[1 : len(h)-1], ""
	}
	if strings.Contains(h, ":") && net.ParseIP(h) == nil {
		return "", "" // a colon with no valid port
	}
	return h, ""
}

// CheckAllowedHost refuses an AllowedHosts entry that is not a host name
// or address with an optional port.
func CheckAllowedHost(h string) error {
	name, _ := splitHost(h)
	if name == "" || strings.ContainsAny(name, "/ ?#@") {
		return fmt.Errorf("%q is not a host name (NAME or NAME:PORT)", h)
	}
	return nil
}
