package server

import (
	"context"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"testing"

	"fogbench/calc"
)

var sinkBytes int

// BenchmarkCasePage renders GET /cases/{id} of a 60-bin case with its plots:
// "drawn" evaluates and draws every time (a server without the result
// cache), "cached" serves the plots of the stored revision from the cache.
func BenchmarkCasePage(b *testing.B) {
	ctx := context.Background()
	st := openTestStore(b)
	t := 293.15
	rec, err := st.CreateCase(ctx, calc.Case{Format: calc.CaseFormat, Name: "page bench", Fluid: "water", LiquidTemperatureK: &t,
		Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 300},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 60, DMinM: 1e-6, DMaxM: 300e-6}}, "bench")
	if err != nil {
		b.Fatal(err)
	}
	logger := slog.New(slog.NewTextHandler(io.Discard, nil))
	for _, k := range []struct {
		name   string
		cached bool
	}{{"drawn", false}, {"cached", true}} {
		b.Run(k.name, func(b *testing.B) {
			s := New(st, logger)
			if !k.cached {
				s.results = nil
			}
			h := s.Handler()
			url := fmt.Sprintf("/cases/%d", rec.ID)
			b.ReportAllocs()
			for b.Loop() {
				w := httptest.NewRecorder()
				h.ServeHTTP(w, httptest.NewRequest(http.MethodGet, url, nil))
				if w.Code != http.StatusOK {
					b.Fatalf("status %d", w.Code)
				}
				sinkBytes = w.Body.Len()
			}
		})
	}
}
