package server

import (
	"context"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"net/url"
	"strings"
	"testing"
	"time"
)

const testToken = "correct-horse-battery-staple-42"

func newTokenServer(t *testing.T) *httptest.Server {
	t.Helper()
	ctx := context.Background()
	st := openTestStore(t)
	st.SeedDemo(ctx)
	var logs strings.Builder
	s := New(st, slog.New(slog.NewTextHandler(&logs, &slog.HandlerOptions{Level: slog.LevelDebug})))
	s.Token = testToken
	ts := httptest.NewServer(s.Handler())
	t.Cleanup(func() {
		ts.Close()
		if strings.Contains(logs.String(), testToken) {
			t.Error("the access token appears in the log")
		}
	})
	return ts
}

func TestTokenGate(t *testing.T) {
	ts := newTokenServer(t)
	c := client(t)
	// Pages send the browser to the login page, keeping where it wanted
	// to go; the API answers 401; static files stay reachable.
	resp, _ := c.Get(ts.URL + "/cases?sort=name")
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther || resp.Header.Get("Location") != "/login?next="+url.QueryEscape("/cases?sort=name") {
		t.Fatalf("page without session: %d %q", resp.StatusCode, resp.Header.Get("Location"))
	}
	resp, _ = c.Get(ts.URL + "/api/cases")
	resp.Body.Close()
	if resp.StatusCode != http.StatusUnauthorized {
		t.Fatalf("api without token: %d", resp.StatusCode)
	}
	resp, _ = c.Get(ts.URL + "/static/fogbench.css")
	resp.Body.Close()
	if resp.StatusCode != http.StatusOK {
		t.Fatalf("static: %d", resp.StatusCode)
	}
	// A wrong token is refused and sets no session.
	resp = postForm(t, c, ts.URL+"/login", url.Values{"name": {"Ana"}, "token": {"guess"}, "next": {"/cases"}})
	resp.Body.Close()
	if resp.StatusCode != http.StatusUnauthorized || len(resp.Cookies()) != 0 {
		t.Fatalf("wrong token: %d, cookies %v", resp.StatusCode, resp.Cookies())
	}
	// The right one sets an HttpOnly, SameSite=Strict session cookie that
	// does not contain the token, and the author name.
	resp = postForm(t, c, ts.URL+"/login", url.Values{"name": {"Ana Müller"}, "token": {testToken}, "next": {"//evil.example/"}})
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther || resp.Header.Get("Location") != "/cases" {
		t.Fatalf("login: %d to %q", resp.StatusCode, resp.Header.Get("Location"))
	}
	var session *http.Cookie
	for _, ck := range resp.Cookies() {
		if ck.Name == sessionCookie {
			session = ck
		}
	}
	if session == nil || !session.HttpOnly || session.SameSite != http.SameSiteStrictMode || session.Secure || strings.Contains(session.Value, testToken) {
		t.Fatalf("session cookie %+v", session)
	}
	_, code := getDoc(t, c, ts.URL+"/cases")
	if code != http.StatusOK {
		t.Fatalf("with session: %d", code)
	}
	// Saves carry the name given at login.
	resp = postForm(t, c, ts.URL+"/cases", validForm())
	resp.Body.Close()
	loc := resp.Header.Get("Location")
	req, _ := http.NewRequest("GET", ts.URL+"/api/cases/"+caseURL.FindStringSubmatch(loc)[1], nil)
	req.Header.Set("Authorization", "Bearer "+testToken)
	resp, err := http.DefaultClient.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	body, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusOK || !strings.Contains(string(body), `"author":"Ana Müller"`) {
		t.Fatalf("bearer API call %d: %s", resp.StatusCode, body)
	}
	// A forged or expired session is not accepted, nor one another
	// server (another token, or before a restart) opened.
	s := New(nil, nil)
	s.Token = testToken
	if s.validSession("9999999999.00ff", timeNow()) || s.validSession(strings.Repeat("0", 64), timeNow()) || s.validSession("", timeNow()) {
		t.Fatal("forged session accepted")
	}
	other := New(nil, nil)
	other.Token = "another-token-of-enough-length"
	val, _ := other.newSession(timeNow())
	if s.validSession(val, timeNow()) {
		t.Fatal("a session opened by another server was accepted")
	}
	val, exp := s.newSession(timeNow())
	if !s.validSession(val, timeNow()) || s.validSession(val, exp) {
		t.Fatal("a session is not valid exactly until it ends")
	}
}

// On loopback without a token nothing is asked; /login only records a name.
func TestNoTokenLoopback(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	if _, code := getDoc(t, c, ts.URL+"/cases"); code != http.StatusOK {
		t.Fatalf("library: %d", code)
	}
	doc, _ := getDoc(t, c, ts.URL+"/login")
	if doc.Find(`input[name=token]`).Length() != 0 {
		t.Fatal("token field shown without a token")
	}
	resp := postForm(t, c, ts.URL+"/login", url.Values{"name": {"Ben"}})
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther {
		t.Fatalf("name: %d", resp.StatusCode)
	}
}

func timeNow() time.Time { return time.Now() }
