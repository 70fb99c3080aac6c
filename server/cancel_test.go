package server

import (
	"context"
	"encoding/json"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"strings"
	"testing"
	"time"

	"fogbench/calc"
)

// slowCase is a transient case with n classes: each class is heated along
// its own path, about 1 ms of work per class on the development machine.
func slowCase(n int) calc.Case {
	tinj := 300.0
	return calc.Case{Format: calc.CaseFormat, Name: "Hot chamber, transient (invented)", Fluid: "n-decane",
		InjectionTemperatureK: &tinj, Heating: "transient",
		Gas:          calc.Gas{ID: "air", PressurePa: 300000, TemperatureK: 600, RelativeVelocityMS: 5},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 3e-5, Q: 3, Bins: n}}
}

// POST /api/evaluate evaluates under the request's context: when its
// deadline passes (as chi's Timeout sets one) the work stops and the client
// gets 504 with a JSON message, soon after, not when the full case would
// have finished. The bound is generous (seconds) for slow runs.
func TestAPIEvaluateStopsWithTheRequest(t *testing.T) {
	h := New(nil, slog.New(slog.NewTextHandler(io.Discard, nil))).Handler()
	body, err := json.Marshal(slowCase(calc.MaxBins))
	if err != nil {
		t.Fatal(err)
	}
	const limit = 50 * time.Millisecond
	ctx, cancel := context.WithTimeout(context.Background(), limit)
	defer cancel()
	req := httptest.NewRequestWithContext(ctx, http.MethodPost, "/api/evaluate", strings.NewReader(string(body)))
	req.Header.Set("Content-Type", "application/json")
	rec := httptest.NewRecorder()
	start := time.Now()
	h.ServeHTTP(rec, req)
	took := time.Since(start)
	if rec.Code != http.StatusGatewayTimeout || !strings.Contains(rec.Body.String(), "time limit") {
		t.Fatalf("status %d after %v, body %.300s", rec.Code, took, rec.Body.String())
	}
	if took > limit+3*time.Second {
		t.Errorf("the evaluation ran %v past a %v deadline", took-limit, limit)
	}
	t.Logf("answered after %v", took)
}

// A case page whose time limit passes during the evaluation shows the
// reason, and the cut evaluation is not cached: the next request computes
// the case in full.
func TestCasePageCancelledIsNotCached(t *testing.T) {
	ctx := context.Background()
	st := openTestStore(t)
	rec, err := st.CreateCase(ctx, slowCase(400), "tester")
	if err != nil {
		t.Fatal(err)
	}
	h := New(st, slog.New(slog.NewTextHandler(io.Discard, nil))).Handler()
	get := func(ctx context.Context) *httptest.ResponseRecorder {
		req := httptest.NewRequestWithContext(ctx, http.MethodGet, "/cases/"+itoa(rec.ID), nil)
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		return w
	}
	short, cancel := context.WithTimeout(ctx, 100*time.Millisecond)
	defer cancel()
	w := get(short)
	if !strings.Contains(w.Body.String(), "ran past its time limit") {
		t.Errorf("page past its deadline: status %d, no reason shown", w.Code)
	}
	if strings.Contains(w.Body.String(), `data-testid="bin-table"`) {
		t.Error("a cancelled evaluation drew a result table")
	}
	w = get(ctx)
	if w.Code != http.StatusOK || !strings.Contains(w.Body.String(), `data-testid="bin-table"`) || strings.Contains(w.Body.String(), "time limit") {
		t.Fatalf("page after a cancelled one: status %d, table %v", w.Code, strings.Contains(w.Body.String(), `data-testid="bin-table"`))
	}
}
