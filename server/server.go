// Package server is fogbench's web front: chi routes, page and JSON
// handlers, plots, and the one place that turns errors into responses.
package server

import (
	"bytes"
	"context"
	"encoding/json"
	"io/fs"
	"log/slog"
	"net/http"
	"sync"
	"time"

	"github.com/a-h/templ"
	"github.com/go-chi/chi/v5"
	"github.com/go-chi/chi/v5/middleware"

	"fogbench/calc"
	"fogbench/calc/units"
	"fogbench/static"
	"fogbench/views"
)

// MaxBodyBytes bounds every request body (forms, case files, imports).
const MaxBodyBytes = 8 << 20

// Server holds what the handlers share.
type Server struct {
	Store  Library
	Logger *slog.Logger
	// Author names the person saving revisions when no account system
	// says otherwise.
	Author string
	// SecureCookies marks every cookie Secure (newCookie): set it when
	// serving over TLS.
	SecureCookies bool
	// Token, when set, is the access token every request must present
	// (auth.go); empty leaves a loopback-only fogbench open.
	Token string
	// AllowedHosts are the names, besides 127.0.0.1, localhost and [::1],
	// that a fogbench without a token answers to (host.go): a reverse
	// proxy's name, "name" for any port or "name:port" for one.
	AllowedHosts []string

	// sessions are the signed-in browsers (session.go); failures counts
	// wrong tokens per client and failDelay is the pause after each
	// (throttle.go); flashKey signs the one-line notices (flash.go).
	sessions  *sessionTable
	failures  *failureThrottle
	failDelay time.Duration
	flashKey  []byte

	// results caches evaluated stored cases and their plots per revision
	// and unit system (plotcache.go); nil draws every time.
	results *resultCache
	// admission runs evaluations one per core in arrival order (admit.go);
	// nil runs every request at once.
	admission *admission
}

// New returns a server over the library (store.Open gives one).
func New(st Library, logger *slog.Logger) *Server {
	if logger == nil {
		logger = slog.Default()
	}
	return &Server{Store: st, Logger: logger, results: newResultCache(resultCacheEntries, resultCacheBytes),
		admission: defaultAdmission(), sessions: newSessionTable(), failures: newFailureThrottle(time.Now),
		failDelay: failurePause, flashKey: randomKey()}
}

// Handler returns the routes, registered in one place.
func (s *Server) Handler() http.Handler {
	r := chi.NewRouter()
	r.Use(middleware.RequestID)
	r.Use(middleware.ClientIPFromRemoteAddr)
	r.Use(requestLogger(s.Logger))
	r.Use(s.recoverer)
	r.Use(s.checkHost) // DNS rebinding: on loopback, only our own names (host.go)
	r.Use(middleware.CleanPath)
	r.Use(middleware.Timeout(30 * time.Second))
	r.Use(securityHeaders)
	r.Use(s.crossOrigin) // CSRF: cross-site POSTs get 403 (csrf.go)
	r.Use(s.limitBody(bodyLimit))

	// What is public is decided by the route the router chose, never by
	// the raw path: the static files and the sign-in page sit outside the
	// group that asks for the token (/static/../api/export once got
	// through a check of the raw path).
	sub, _ := fs.Sub(static.FS, ".")
	r.Handle("/static/*", http.StripPrefix("/static/", cacheStatic(http.FileServerFS(sub))))
	r.Get("/login", s.handleLogin)
	r.Post("/login", s.handleLoginPost)
	r.Group(s.guardedRoutes)

	r.NotFound(func(w http.ResponseWriter, r *http.Request) {
		s.error(w, r, calc.Errorf(calc.NotFound, "There is no page at %s.", r.URL.Path))
	})
	return r
}

// guardedRoutes are every route but the public ones: each asks for the
// access token on a shared host (requireToken).
func (s *Server) guardedRoutes(r chi.Router) {
	r.Use(s.requireToken)
	r.Get("/", func(w http.ResponseWriter, r *http.Request) { http.Redirect(w, r, "/cases", http.StatusFound) })
	r.Route("/cases", func(r chi.Router) {
		r.Get("/", s.handleLibrary)
		r.Post("/", s.handleCaseCreate)
		r.Get("/new", s.handleCaseNew)
		r.Post("/preview", s.handleCasePreview)
		r.Post("/import-preview", s.handleCaseImport)
		r.Route("/{id}", func(r chi.Router) {
			r.Get("/", s.handleCaseShow)
			r.Post("/", s.handleCaseUpdate)
			r.Get("/edit", s.handleCaseEdit)
			r.Post("/duplicate", s.handleCaseDuplicate)
			r.Post("/rename", s.handleCaseRename)
			r.Post("/tags", s.handleCaseTags)
			r.Post("/trash", s.handleCaseTrash)
			r.Post("/restore", s.handleCaseRestore)
			r.Post("/merge", s.handleCaseMerge)
			r.Get("/revisions", s.handleRevisions)
			r.Get("/revisions/{rev}", s.handleRevisionShow)
			r.Post("/revisions/{rev}/restore", s.handleRevisionRestore)
			r.Get("/diff", s.handleRevisionDiff)
			r.Get("/report", s.handleCaseReport)
			r.Get("/report.pdf", s.handleCaseReportPDF)
			r.Get("/bins.csv", s.handleCaseBinsCSV)
			r.Get("/summary.csv", s.handleCaseSummaryCSV)
		})
	})
	r.Post("/settings/units", s.handleUnitsSet)
	r.Get("/compare", s.handleCompare)
	r.Get("/compare/report", s.handleCompareReport)
	r.Get("/compare/report.pdf", s.handleCompareReportPDF)
	r.Get("/compare/summary.csv", s.handleCompareSummaryCSV)
	r.Get("/bundle/export", s.handleExportPage)
	r.Get("/bundle/import", s.handleImportPage)
	r.Post("/bundle/import", s.handleImportPreview)
	r.Post("/bundle/import/apply", s.handleImportApply)
	r.Post("/logout", s.handleLogout)
	r.Route("/fluids", func(r chi.Router) {
		r.Get("/", s.handleFluids)
		r.Get("/custom/new", s.handleLiquidNew)
		r.Post("/custom", s.handleLiquidCreate)
		r.Get("/custom/{id}/edit", s.handleLiquidEdit)
		r.Post("/custom/{id}", s.handleLiquidUpdate)
		r.Post("/custom/{id}/delete", s.handleLiquidDelete)
		r.Get("/{id}", s.handleFluidShow)
	})
	r.Route("/atomizers", func(r chi.Router) {
		r.Get("/", s.handleAtomizers)
		r.Get("/{family}", s.handleAtomizerBench)
		r.Get("/{family}/case", s.handleAtomizerCase)
	})
	r.Route("/api", func(r chi.Router) {
		r.Get("/fluids", s.handleAPIFluids)
		r.Get("/fluids/{id}", s.handleAPIFluid)
		r.Post("/atomize", s.handleAPIAtomize)
		r.Post("/atomize/solve", s.handleAPIAtomizeSolve)
		r.With(s.admit).Post("/evaluate", s.handleAPIEvaluate)
		r.Get("/cases", s.handleAPICaseList)
		r.Post("/cases", s.handleAPICaseCreate)
		r.Get("/cases/{id}", s.handleAPICaseGet)
		r.Put("/cases/{id}", s.handleAPICaseUpdate)
		r.Get("/cases/{id}/file", s.handleAPICaseFile)
		r.Get("/cases/{id}/revisions", s.handleAPIRevisions)
		r.Get("/export", s.handleAPIExport)
		r.Post("/import", s.handleAPIImport)
	})
}

// display is the reader's unit system (a cookie, SI by default).
func display(r *http.Request) views.Display {
	if c, err := r.Cookie("units"); err == nil && c.Value == string(units.US) {
		return views.Display{System: units.US}
	}
	return views.Display{System: units.SI}
}

// render draws a page into a buffer first, so a failing component never
// leaves half a page on the wire.
func (s *Server) render(w http.ResponseWriter, r *http.Request, status int, chrome views.Chrome, content templ.Component) {
	if chrome.Back == "" && r.Method == http.MethodGet {
		chrome.Back = r.URL.RequestURI() // the units switch comes back here
	}
	if status == http.StatusOK && r.Method == http.MethodGet && chrome.Flash == "" {
		chrome.Flash = s.takeFlash(w, r) // flash.go: a notice after a redirect
	}
	chrome.Author = s.author(r)
	chrome.SignedIn = authorFromCookie(r) != ""
	chrome.TokenMode = s.Token != ""
	buf := pageBuffer()
	defer putPageBuffer(buf)
	// Drawing is bounded work, and a page whose evaluation was stopped by
	// the request's time limit must still say so: templ gives up on a done
	// context, so draw without its cancellation.
	if err := views.Layout(chrome, content).Render(context.WithoutCancel(r.Context()), buf); err != nil {
		s.Logger.Error("render", "path", r.URL.Path, "err", err)
		http.Error(w, "internal error while drawing the page", http.StatusInternalServerError)
		return
	}
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	w.WriteHeader(status)
	w.Write(buf.Bytes())
}

// pageBuffers holds drawing buffers between requests: a case page is a few
// hundred KB, and growing a fresh buffer to that size took about a fifth
// of a cached case page's time (docs/performance.md).
var pageBuffers = sync.Pool{New: func() any { return new(bytes.Buffer) }}

func pageBuffer() *bytes.Buffer {
	b := pageBuffers.Get().(*bytes.Buffer)
	b.Reset()
	return b
}

// putPageBuffer returns b to the pool unless it grew unusually large.
func putPageBuffer(b *bytes.Buffer) {
	if b.Cap() <= 4<<20 {
		pageBuffers.Put(b)
	}
}

// renderFragment draws a component without the layout (htmx swaps).
func (s *Server) renderFragment(w http.ResponseWriter, r *http.Request, status int, c templ.Component) {
	var buf bytes.Buffer
	if err := c.Render(context.WithoutCancel(r.Context()), &buf); err != nil {
		s.Logger.Error("render fragment", "path", r.URL.Path, "err", err)
		http.Error(w, "internal error while drawing the page", http.StatusInternalServerError)
		return
	}
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	w.WriteHeader(status)
	w.Write(buf.Bytes())
}

// statusOf maps an error code to its HTTP status.
func statusOf(err error) int {
	switch calc.ErrorCode(err) {
	case calc.Invalid:
		return http.StatusBadRequest
	case calc.NotFound:
		return http.StatusNotFound
	case calc.Conflict:
		return http.StatusConflict
	case calc.Unavailable:
		status, _ := storageStatus(err) // 507 disk full, 503 read-only
		return status
	case calc.Canceled:
		// The request's time limit passed (chi's Timeout also answers
		// 504) or the client left, when no one reads the answer.
		return http.StatusGatewayTimeout
	}
	if isTooLarge(err) {
		return http.StatusRequestEntityTooLarge
	}
	return http.StatusInternalServerError
}

// error is the one place a failed request becomes a response: internal
// faults are logged and shown generically, the rest say what is wrong.
func (s *Server) error(w http.ResponseWriter, r *http.Request, err error) {
	status := statusOf(err)
	msg := calc.ErrorMessage(err)
	if status == http.StatusRequestEntityTooLarge {
		msg = "The upload is larger than the limit of " + limitText(err) + "."
	}
	if status == http.StatusInternalServerError {
		s.Logger.Error("request failed", "path", r.URL.Path, "request_id", middleware.GetReqID(r.Context()), "err", err)
	}
	if _, ok := storageStatus(err); ok {
		s.logStorage(r, err)
	}
	chrome := views.Chrome{Title: "Error", Display: display(r)}
	s.render(w, r, status, chrome, views.ErrorPage(status, msg))
}

// apiError answers a JSON client.
func (s *Server) apiError(w http.ResponseWriter, r *http.Request, err error) {
	status := statusOf(err)
	if status == http.StatusInternalServerError {
		s.Logger.Error("api request failed", "path", r.URL.Path, "request_id", middleware.GetReqID(r.Context()), "err", err)
	}
	body := map[string]any{"error": calc.ErrorMessage(err)}
	if _, ok := storageStatus(err); ok {
		s.logStorage(r, err)
		body["code"] = storageCode(err)
	}
	if status == http.StatusRequestEntityTooLarge {
		body["error"] = "request body is larger than " + limitText(err)
	}
	if fes := calc.FieldErrors(err); len(fes) > 0 {
		fields := make([]map[string]string, len(fes))
		for i, fe := range fes {
			fields[i] = map[string]string{"field": fe.Field, "message": fe.Message, "value": fe.Value}
		}
		body["fields"] = fields
	}
	writeJSON(w, status, body)
}

func writeJSON(w http.ResponseWriter, status int, v any) {
	data, err := json.Marshal(v)
	if err != nil {
		http.Error(w, `{"error":"could not encode the answer"}`, http.StatusInternalServerError)
		return
	}
	w.Header().Set("Content-Type", "application/json")
	w.WriteHeader(status)
	w.Write(data)
	w.Write([]byte("\n"))
}
