package server

import (
	"bytes"
	"encoding/json"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"testing"

	"fogbench/calc"
)

// BenchmarkAPIEvaluate is one POST /api/evaluate of the 60-bin
// fixed-temperature case testdata/perf drives, through the whole handler
// stack (middleware, admission, decode, evaluate, encode).
func BenchmarkAPIEvaluate(b *testing.B) {
	st := openTestStore(b)
	t, rh := 293.15, 0.3
	body, _ := json.Marshal(calc.Case{Format: calc.CaseFormat, Name: "perf", Fluid: "water", LiquidTemperatureK: &t,
		Gas:          calc.Gas{PressurePa: 101325, TemperatureK: 300, RelativeHumidity: &rh, RelativeVelocityMS: 2},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 60, DMinM: 1e-6, DMaxM: 300e-6}})
	h := New(st, slog.New(slog.NewTextHandler(io.Discard, nil))).Handler()
	b.ReportAllocs()
	for b.Loop() {
		w := httptest.NewRecorder()
		h.ServeHTTP(w, httptest.NewRequest(http.MethodPost, "/api/evaluate", bytes.NewReader(body)))
		if w.Code != http.StatusOK {
			b.Fatalf("status %d: %s", w.Code, w.Body)
		}
		sinkBytes = w.Body.Len()
	}
}
