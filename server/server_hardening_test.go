package server

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"log/slog"
	"net"
	"net/http"
	"net/http/httptest"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/PuerkitoBio/goquery"
	"github.com/go-chi/chi/v5"
	"github.com/go-chi/chi/v5/middleware"
)

// logBuffer collects what the server logs, safe for the handler goroutines.
type logBuffer struct {
	mu  sync.Mutex
	buf bytes.Buffer
}

func (b *logBuffer) Write(p []byte) (int, error) {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.buf.Write(p)
}

func (b *logBuffer) String() string {
	b.mu.Lock()
	defer b.mu.Unlock()
	return b.buf.String()
}

// newLoggedServer is newTestServer with the log kept for inspection.
func newLoggedServer(t *testing.T) (*httptest.Server, *Server, *logBuffer) {
	t.Helper()
	ctx := context.Background()
	st := openTestStore(t)
	if _, err := st.SeedDemo(ctx); err != nil {
		t.Fatal(err)
	}
	logs := &logBuffer{}
	s := New(st, slog.New(slog.NewTextHandler(logs, nil)))
	ts := httptest.NewServer(s.Handler())
	t.Cleanup(ts.Close)
	return ts, s, logs
}

var anyParam = regexp.MustCompile(`\{[^}]*\}`)

// changingRoutes lists every route registered with a method that changes
// state, with its parameters filled in so the request reaches a handler.
func changingRoutes(t *testing.T, s *Server) [][2]string {
	t.Helper()
	routes, ok := s.Handler().(chi.Routes)
	if !ok {
		t.Fatal("Handler is not a chi router")
	}
	fill := strings.NewReplacer("{id}", "1", "{family}", "pressure-swirl", "/*", "")
	var out [][2]string
	err := chi.Walk(routes, func(method, route string, _ http.Handler, _ ...func(http.Handler) http.Handler) error {
		switch method {
		case http.MethodGet, http.MethodHead, http.MethodOptions:
			return nil
		}
		// Named parameters not listed above are ids: 1 exists in the
		// seeded library.
		path := anyParam.ReplaceAllString(fill.Replace(route), "1")
		if len(path) > 1 {
			path = strings.TrimSuffix(path, "/")
		}
		out = append(out, [2]string{method, path})
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if len(out) < 5 {
		t.Fatalf("only %d state-changing routes found: %v", len(out), out)
	}
	return out
}

func caseCount(t *testing.T, s *Server) int {
	t.Helper()
	n, err := s.Store.CountCases(context.Background())
	if err != nil {
		t.Fatal(err)
	}
	return n
}

const apiCase = `{"format":"fogbench-case/1","name":"csrf check","fluid":"water","liquid_temperature_k":298.15,
  "gas":{"pressure_pa":101325,"temperature_k":298.15},
  "distribution":{"model":"rosin-rammler","x_m":5e-5,"q":2.5,"bins":6,"d_min_m":1e-6,"d_max_m":3e-4}}`

// Every state-changing route refuses a request a browser marks as sent from
// another site, and one whose Origin names another host, with 403 and a
// message; nothing is stored.
func TestCrossSiteRequestsAreRefused(t *testing.T) {
	ts, s, logs := newLoggedServer(t)
	before := caseCount(t, s)
	foreign := []struct {
		name   string
		header map[string]string
	}{
		{"Sec-Fetch-Site cross-site", map[string]string{"Sec-Fetch-Site": "cross-site", "Origin": "https://elsewhere.example"}},
		{"Sec-Fetch-Site same-site", map[string]string{"Sec-Fetch-Site": "same-site", "Origin": "http://sub." + ts.Listener.Addr().String()}},
		{"foreign Origin only", map[string]string{"Origin": "https://elsewhere.example"}},
		{"htmx from another site", map[string]string{"Sec-Fetch-Site": "cross-site", "HX-Request": "true", "Origin": "https://elsewhere.example"}},
	}
	for _, rt := range changingRoutes(t, s) {
		for _, f := range foreign {
			body := validForm().Encode()
			ctype := "application/x-www-form-urlencoded"
			if strings.HasPrefix(rt[1], "/api/") {
				body, ctype = apiCase, "application/json"
			}
			req, _ := http.NewRequest(rt[0], ts.URL+rt[1], strings.NewReader(body))
			req.Header.Set("Content-Type", ctype)
			for k, v := range f.header {
				req.Header.Set(k, v)
			}
			resp, err := client(t).Do(req)
			if err != nil {
				t.Fatal(err)
			}
			data, _ := io.ReadAll(resp.Body)
			resp.Body.Close()
			if resp.StatusCode != http.StatusForbidden {
				t.Errorf("%s %s (%s): status %d, want 403", rt[0], rt[1], f.name, resp.StatusCode)
				continue
			}
			if strings.HasPrefix(rt[1], "/api/") {
				var e struct{ Error string }
				if json.Unmarshal(data, &e) != nil || !strings.Contains(e.Error, "cross-origin") {
					t.Errorf("%s %s: JSON refusal %q", rt[0], rt[1], data)
				}
			} else if !bytes.Contains(data, []byte("came from another site")) {
				t.Errorf("%s %s: refusal page does not say why", rt[0], rt[1])
			}
		}
	}
	if after := caseCount(t, s); after != before {
		t.Fatalf("cross-site requests changed the library: %d cases, was %d", after, before)
	}
	if !strings.Contains(logs.String(), "cross-origin request refused") {
		t.Error("refusals are not logged")
	}
}

// The same requests from fogbench's own pages pass: a plain form post, an
// htmx preview, and API clients that are not browsers (no Origin, no
// Sec-Fetch-Site).
func TestSameOriginRequestsPass(t *testing.T) {
	ts, s, _ := newLoggedServer(t)
	self := ts.URL
	post := func(path, ctype, body string, h map[string]string) *http.Response {
		req, _ := http.NewRequest(http.MethodPost, ts.URL+path, strings.NewReader(body))
		req.Header.Set("Content-Type", ctype)
		for k, v := range h {
			req.Header.Set(k, v)
		}
		resp, err := client(t).Do(req)
		if err != nil {
			t.Fatal(err)
		}
		io.Copy(io.Discard, resp.Body)
		resp.Body.Close()
		return resp
	}
	form := "application/x-www-form-urlencoded"
	before := caseCount(t, s)
	if resp := post("/cases", form, validForm().Encode(), map[string]string{"Sec-Fetch-Site": "same-origin", "Origin": self}); resp.StatusCode != http.StatusSeeOther {
		t.Errorf("same-origin form post: status %d, want 303", resp.StatusCode)
	}
	if resp := post("/cases", form, validForm().Encode(), map[string]string{"Origin": self}); resp.StatusCode != http.StatusSeeOther {
		t.Errorf("same-origin form post by Origin alone: status %d, want 303", resp.StatusCode)
	}
	if resp := post("/cases/preview", form, validForm().Encode(), map[string]string{"Sec-Fetch-Site": "same-origin", "Origin": self,
		"HX-Request": "true", "HX-Current-URL": self + "/cases/new"}); resp.StatusCode != http.StatusOK {
		t.Errorf("htmx preview: status %d, want 200", resp.StatusCode)
	}
	// A typed address or bookmark (Sec-Fetch-Site: none) is the user's own act.
	if resp := post("/settings/units", form, "system=us&back=/cases", map[string]string{"Sec-Fetch-Site": "none"}); resp.StatusCode != http.StatusSeeOther {
		t.Errorf("user-initiated post: status %d, want 303", resp.StatusCode)
	}
	if resp := post("/api/cases", "application/json", apiCase, nil); resp.StatusCode != http.StatusCreated {
		t.Errorf("API client without browser headers: status %d, want 201", resp.StatusCode)
	}
	if after := caseCount(t, s); after != before+3 {
		t.Errorf("%d cases after three saves, was %d", after, before)
	}
}

// Each security header is on every kind of response: a page, JSON, a static
// file, a missing page, a refusal and an oversized upload.
func TestSecurityHeadersOnEveryResponse(t *testing.T) {
	ts, _, _ := newLoggedServer(t)
	get := func(path string, h map[string]string, method string) *http.Response {
		req, _ := http.NewRequest(method, ts.URL+path, nil)
		for k, v := range h {
			req.Header.Set(k, v)
		}
		resp, err := client(t).Do(req)
		if err != nil {
			t.Fatal(err)
		}
		io.Copy(io.Discard, resp.Body)
		resp.Body.Close()
		return resp
	}
	responses := map[string]*http.Response{
		"page":      get("/cases", nil, http.MethodGet),
		"json":      get("/api/cases", nil, http.MethodGet),
		"static":    get("/static/fogbench.css", nil, http.MethodGet),
		"not found": get("/no/such/page", nil, http.MethodGet),
		"refused":   get("/cases", map[string]string{"Sec-Fetch-Site": "cross-site"}, http.MethodPost),
	}
	big := rawRequest(t, ts, "POST", "/cases", "application/x-www-form-urlencoded", MaxBodyBytes+1)
	responses["too large"] = big
	for kind, resp := range responses {
		h := resp.Header
		t.Run(kind, func(t *testing.T) {
			t.Run("Content-Security-Policy", func(t *testing.T) {
				csp := h.Get("Content-Security-Policy")
				for _, want := range []string{"default-src 'self'", "script-src 'self'", "style-src 'self'",
					"frame-ancestors 'none'", "base-uri 'none'", "form-action 'self'"} {
					if !strings.Contains(csp, want) {
						t.Errorf("CSP %q lacks %s", csp, want)
					}
				}
				for _, bad := range []string{"unsafe-inline", "unsafe-eval", "*"} {
					if strings.Contains(csp, bad) {
						t.Errorf("CSP %q allows %s", csp, bad)
					}
				}
			})
			t.Run("X-Content-Type-Options", func(t *testing.T) {
				if got := h.Get("X-Content-Type-Options"); got != "nosniff" {
					t.Errorf("got %q", got)
				}
			})
			t.Run("Referrer-Policy", func(t *testing.T) {
				if got := h.Get("Referrer-Policy"); got != "same-origin" {
					t.Errorf("got %q", got)
				}
			})
			t.Run("X-Frame-Options", func(t *testing.T) {
				if got := h.Get("X-Frame-Options"); got != "DENY" {
					t.Errorf("got %q", got)
				}
			})
		})
	}
}

// rawRequest sends a request that declares a body of declared bytes but
// writes only a few, and reads the answer: the server must refuse it on
// the declared length alone, before reading what it cannot hold.
func rawRequest(t *testing.T, ts *httptest.Server, method, path, ctype string, declared int) *http.Response {
	t.Helper()
	conn, err := net.Dial("tcp", ts.Listener.Addr().String())
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { conn.Close() })
	conn.SetDeadline(time.Now().Add(10 * time.Second))
	fmt.Fprintf(conn, "%s %s HTTP/1.1\r\nHost: %s\r\nContent-Type: %s\r\nContent-Length: %d\r\n\r\nname=x",
		method, path, ts.Listener.Addr(), ctype, declared)
	req, _ := http.NewRequest(method, ts.URL+path, nil)
	resp, err := http.ReadResponse(bufio.NewReader(conn), req)
	if err != nil {
		t.Fatalf("%s %s: %v", method, path, err)
	}
	body, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	resp.Body = io.NopCloser(bytes.NewReader(body))
	return resp
}

// checkTooLarge holds a response to the promise of a clear 413: JSON with
// the limit for the API, an error page with it for pages.
func checkTooLarge(t *testing.T, what string, resp *http.Response) {
	t.Helper()
	checkTooLargeLimit(t, what, resp, "8 MiB")
}

// checkTooLargeLimit is checkTooLarge for a route with its own limit.
func checkTooLargeLimit(t *testing.T, what string, resp *http.Response, limit string) {
	t.Helper()
	body, _ := io.ReadAll(resp.Body)
	if resp.StatusCode != http.StatusRequestEntityTooLarge {
		t.Errorf("%s: status %d, want 413: %.200s", what, resp.StatusCode, body)
		return
	}
	if strings.HasPrefix(resp.Header.Get("Content-Type"), "application/json") {
		var e struct{ Error string }
		if err := json.Unmarshal(body, &e); err != nil || !strings.Contains(e.Error, limit) {
			t.Errorf("%s: JSON %q does not give the limit", what, body)
		}
		return
	}
	doc, err := goquery.NewDocumentFromReader(bytes.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	if msg := doc.Find(`[data-testid=error]`).Text(); !strings.Contains(msg, "larger than the limit of "+limit) {
		t.Errorf("%s: error page says %q", what, msg)
	}
}

// Every upload path answers an oversized body with a clear "too large":
// refused on its declared length whatever the route, and cut at the limit
// when it comes chunked without one.
func TestOversizedBodiesGetAClearMessage(t *testing.T) {
	ts, s, _ := newLoggedServer(t)
	before := caseCount(t, s)
	registered := map[string]bool{}
	for _, rt := range changingRoutes(t, s) {
		registered[rt[0]+" "+rt[1]] = true
		ctype := "application/x-www-form-urlencoded"
		if strings.HasPrefix(rt[1], "/api/") {
			ctype = "application/json"
		}
		// Bundle imports have their own, larger limit (BundleBodyBytes).
		limit := bodyLimit(httptest.NewRequest(rt[0], rt[1], nil))
		resp := rawRequest(t, ts, rt[0], rt[1], ctype, int(limit)+1)
		checkTooLargeLimit(t, "declared "+rt[0]+" "+rt[1], resp, fmt.Sprintf("%d MiB", limit>>20))
		if strings.HasPrefix(rt[1], "/api/") && !strings.HasPrefix(resp.Header.Get("Content-Type"), "application/json") {
			t.Errorf("%s %s: API refusal is %s, not JSON", rt[0], rt[1], resp.Header.Get("Content-Type"))
		}
	}
	// Chunked bodies, to the routes that read one.
	chunked := []struct{ method, path, ctype, prefix string }{
		{"POST", "/cases", "application/x-www-form-urlencoded", "name="},
		{"POST", "/cases/preview", "application/x-www-form-urlencoded", "name="},
		{"POST", "/api/evaluate", "application/json", `[`},
		{"POST", "/api/cases", "application/json", `[`},
		{"PUT", "/api/cases/1", "application/json", `{"revision":1,"case":"`},
		{"POST", "/api/atomize", "application/json", `{"family":"`},
	}
	for _, c := range chunked {
		if !registered[c.method+" "+c.path] {
			continue // a route not (yet) registered in this tree
		}
		filler := strings.Repeat(" ", MaxBodyBytes+1024)
		if c.ctype != "application/json" {
			filler = strings.Repeat("a", MaxBodyBytes+1024)
		}
		body := io.MultiReader(strings.NewReader(c.prefix), strings.NewReader(filler))
		req, _ := http.NewRequest(c.method, ts.URL+c.path, body) // no length: chunked
		req.Header.Set("Content-Type", c.ctype)
		resp, err := client(t).Do(req)
		if err != nil {
			t.Fatalf("chunked %s %s: %v", c.method, c.path, err)
		}
		checkTooLarge(t, "chunked "+c.method+" "+c.path, resp)
		resp.Body.Close()
	}
	if after := caseCount(t, s); after != before {
		t.Fatalf("oversized requests changed the library: %d cases, was %d", after, before)
	}
}

// A handler that panics gives the user the error page (status 500, no
// panic text) and leaves a log line with the value, the path and the
// request id; the server goes on serving.
func TestPanicGivesErrorPageAndLogLine(t *testing.T) {
	_, s, logs := newLoggedServer(t)
	calls := 0
	h := middleware.RequestID(s.recoverer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		calls++
		if r.URL.Path == "/boom" {
			var m map[string]int
			//lint:ignore SA5000 the test needs a runtime panic, whose text the log must carry
			m["hardening-test-panic"] = 1 // assignment to a nil map panics
		}
		w.WriteHeader(http.StatusNoContent)
	})))
	rec := httptest.NewRecorder()
	h.ServeHTTP(rec, httptest.NewRequest(http.MethodGet, "/boom", nil))
	if rec.Code != http.StatusInternalServerError {
		t.Fatalf("status %d, want 500", rec.Code)
	}
	doc, err := goquery.NewDocumentFromReader(rec.Body)
	if err != nil {
		t.Fatal(err)
	}
	msg := doc.Find(`[data-testid=error]`).Text()
	if !strings.Contains(msg, "internal error") || strings.Contains(msg, "nil map") {
		t.Errorf("error page says %q", msg)
	}
	log := logs.String()
	for _, want := range []string{"level=ERROR msg=panic", "path=/boom", "assignment to entry in nil map", "request_id="} {
		if !strings.Contains(log, want) {
			t.Errorf("log lacks %q:\n%s", want, log)
		}
	}
	rec = httptest.NewRecorder()
	h.ServeHTTP(rec, httptest.NewRequest(http.MethodGet, "/fine", nil))
	if rec.Code != http.StatusNoContent || calls != 2 {
		t.Errorf("after the panic: status %d, %d calls", rec.Code, calls)
	}
}

// Bad numbers at the form and the JSON API come back as errors naming the
// field; nothing is stored.
func TestBadInputIsNamedAtEveryServerEntry(t *testing.T) {
	ts, s, _ := newLoggedServer(t)
	before := caseCount(t, s)
	// Forms: the message sits beside the input and the typed text stays.
	for _, v := range []struct{ field, value string }{
		{"pressure", "NaN"}, {"pressure", "Inf"}, {"gas_temperature", "-1e999"}, {"q", "1e999"},
		{"pressure", "-101"}, {"gas_temperature", "5000"}, {"bins", "100000000"}, {"d_max", "1e300"},
	} {
		form := validForm()
		form.Set(v.field, v.value)
		resp := postForm(t, client(t), ts.URL+"/cases", form)
		doc, err := goquery.NewDocumentFromReader(resp.Body)
		resp.Body.Close()
		if err != nil {
			t.Fatal(err)
		}
		if resp.StatusCode != http.StatusUnprocessableEntity {
			t.Errorf("form %s=%s: status %d, want 422", v.field, v.value, resp.StatusCode)
			continue
		}
		if doc.Find(`[data-testid=error-`+v.field+`]`).Length() != 1 {
			t.Errorf("form %s=%s: no message beside the field (%s)", v.field, v.value, doc.Find(`[data-testid=form-errors]`).Text())
		}
		if got, _ := doc.Find(`#f-` + v.field).Attr("value"); got != v.value {
			t.Errorf("form %s=%s: typed value not kept (%q)", v.field, v.value, got)
		}
	}
	// JSON: 400 with the field named in "fields".
	many := "[" + strings.Repeat(apiCase+",", 100) + apiCase + "]"
	big := strings.Replace(apiCase, `"bins":6`, `"bins":2000`, 1)
	heavy := "[" + big + "," + big + "," + big + "]" // 6000 classes: refused before any work
	for _, c := range []struct{ path, body, field string }{
		{"/api/evaluate", strings.Replace(apiCase, `"x_m":5e-5`, `"x_m":1e999`, 1), "distribution.x_m"},
		{"/api/evaluate", strings.Replace(apiCase, `"bins":6`, `"bins":1000000000`, 1), "distribution.bins"},
		{"/api/evaluate", strings.Replace(apiCase, `"pressure_pa":101325`, `"pressure_pa":0`, 1), "gas.pressure_pa"},
		{"/api/evaluate", strings.Replace(apiCase, `"liquid_temperature_k":298.15`, `"liquid_temperature_k":-3`, 1), "liquid_temperature_k"},
		{"/api/evaluate", many, "file"},
		{"/api/evaluate", heavy, "file"},
		{"/api/cases", strings.Replace(apiCase, `"temperature_k":298.15}`, `"temperature_k":1e6}`, 1), "gas.temperature_k"},
		{"/api/cases", strings.Replace(apiCase, `"d_max_m":3e-4`, `"d_max_m":-3e-4`, 1), "distribution.d_max_m"},
	} {
		resp, err := http.Post(ts.URL+c.path, "application/json", strings.NewReader(c.body))
		if err != nil {
			t.Fatal(err)
		}
		var e struct {
			Error  string
			Fields []struct{ Field, Message, Value string }
		}
		err = json.NewDecoder(resp.Body).Decode(&e)
		resp.Body.Close()
		if err != nil || resp.StatusCode != http.StatusBadRequest {
			t.Errorf("%s with bad %s: status %d, %v", c.path, c.field, resp.StatusCode, err)
			continue
		}
		named := false
		for _, f := range e.Fields {
			named = named || f.Field == c.field && f.Message != ""
		}
		if !named {
			t.Errorf("%s with bad %s: fields %+v", c.path, c.field, e.Fields)
		}
	}
	if after := caseCount(t, s); after != before {
		t.Fatalf("bad input changed the library: %d cases, was %d", after, before)
	}
}

// newCookie follows the server's TLS setting.
func TestCookiesSecureOnlyOverTLS(t *testing.T) {
	s := &Server{}
	c := s.newCookie("session", "v", time.Hour)
	if !c.HttpOnly || c.SameSite != http.SameSiteLaxMode || c.Secure || c.MaxAge != 3600 || c.Path != "/" {
		t.Errorf("plain HTTP cookie %+v", c)
	}
	s.SecureCookies = true
	if c := s.newCookie("session", "", -1); !c.Secure || c.MaxAge != -1 {
		t.Errorf("TLS deletion cookie %+v", c)
	}
	if got := (&http.Cookie{Name: "x"}).String(); strings.Contains(got, "Secure") {
		t.Fatalf("test premise: %q", got)
	}
	if got := s.newCookie("x", "y", 0).String(); !strings.Contains(got, "Secure") || !strings.Contains(got, "HttpOnly") {
		t.Errorf("header %q", got)
	}
}
