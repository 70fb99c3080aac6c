package server

import (
	"errors"
	"fmt"
	"log/slog"
	"net/http"
	"runtime/debug"
	"strings"
	"time"

	"github.com/go-chi/chi/v5/middleware"

	"fogbench/calc"
	"fogbench/store"
)

// requestLogger logs one line per request with slog.
func requestLogger(l *slog.Logger) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			ww := middleware.NewWrapResponseWriter(w, r.ProtoMajor)
			start := time.Now()
			next.ServeHTTP(ww, r)
			l.Debug("request", "method", r.Method, "path", r.URL.Path, "status", ww.Status(),
				"bytes", ww.BytesWritten(), "dur", time.Since(start), "client", middleware.GetClientIP(r.Context()),
				"request_id", middleware.GetReqID(r.Context()))
		})
	}
}

// recoverer turns a panic into a logged internal error and an error page.
func (s *Server) recoverer(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		defer func() {
			if v := recover(); v != nil {
				if v == http.ErrAbortHandler {
					panic(v)
				}
				s.Logger.Error("panic", "path", r.URL.Path, "value", fmt.Sprint(v), "stack", string(debug.Stack()))
				s.error(w, r, &calc.Error{Code: calc.Internal, Message: "internal error", Err: fmt.Errorf("panic: %v", v)})
			}
		}()
		next.ServeHTTP(w, r)
	})
}

// securityHeaders forbids inline script and framing and keeps the referrer
// to ourselves. htmx is loaded from /static and configured not to inject
// inline styles.
func securityHeaders(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		h := w.Header()
		h.Set("Content-Security-Policy", "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data:; frame-ancestors 'none'; base-uri 'none'; form-action 'self'")
		h.Set("X-Content-Type-Options", "nosniff")
		h.Set("Referrer-Policy", "same-origin")
		h.Set("X-Frame-Options", "DENY")
		next.ServeHTTP(w, r)
	})
}

// limitBody caps request bodies. A body that declares a larger
// Content-Length is refused at once with 413 and a message (a page, or
// JSON for the API) whatever the handler; a chunked body, and a multipart
// upload (whose handler reads it part by part to keep the fields typed
// before an oversized file), is cut at n and the handler sees
// *http.MaxBytesError.
func (s *Server) limitBody(limit func(*http.Request) int64) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			n := limit(r)
			multipart := strings.HasPrefix(r.Header.Get("Content-Type"), "multipart/form-data")
			if r.ContentLength > n && !multipart {
				err := &http.MaxBytesError{Limit: n}
				if wantsJSON(r) {
					s.apiError(w, r, err)
				} else {
					s.error(w, r, err)
				}
				return
			}
			if r.Body != nil {
				r.Body = http.MaxBytesReader(w, r.Body, n)
			}
			next.ServeHTTP(w, r)
		})
	}
}

func isTooLarge(err error) bool {
	var mbe *http.MaxBytesError
	return errors.As(err, &mbe)
}

// bundleRoutes take a library bundle, which may be far larger than any
// other request: a whole library exported by /api/export.
var bundleRoutes = map[string]bool{"/api/import": true, "/bundle/import": true, "/bundle/import/apply": true}

// BundleBodyBytes bounds the body of a bundle import: the bundle's own
// limit (the form around it, a file name or the conflict choices, is small
// beside it).
const BundleBodyBytes = store.MaxBundleBytes

// bodyLimit is the largest body a request may send: BundleBodyBytes to the
// bundle import routes, MaxBodyBytes to every other.
func bodyLimit(r *http.Request) int64 {
	if r.Method == http.MethodPost && bundleRoutes[r.URL.Path] {
		return BundleBodyBytes
	}
	return MaxBodyBytes
}

// limitText is the limit a too-large error was cut at, for its message.
func limitText(err error) string {
	n := int64(MaxBodyBytes)
	if mbe := (*http.MaxBytesError)(nil); errors.As(err, &mbe) && mbe.Limit > 0 {
		n = mbe.Limit
	}
	return fmt.Sprintf("%d MiB", n>>20)
}

// cacheStatic lets browsers keep the embedded assets for a day; embed.FS has
// no modification times to revalidate against. It serves files only: a
// directory (a path that ends in "/", after the prefix is stripped) is
// not listed.
func cacheStatic(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if r.URL.Path == "" || strings.HasSuffix(r.URL.Path, "/") {
			http.NotFound(w, r)
			return
		}
		w.Header().Set("Cache-Control", "public, max-age=86400")
		next.ServeHTTP(w, r)
	})
}
