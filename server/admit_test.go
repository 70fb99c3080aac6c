package server

import (
	"context"
	"encoding/json"
	"net/http"
	"net/http/httptest"
	"strings"
	"sync"
	"testing"
	"time"
)

// waitQueued waits until n requests wait for a slot.
func waitQueued(t *testing.T, a *admission, n int64) {
	t.Helper()
	deadline := time.Now().Add(5 * time.Second)
	for a.queued.Load() != n {
		if time.Now().After(deadline) {
			t.Fatalf("queued = %d, want %d", a.queued.Load(), n)
		}
		time.Sleep(time.Millisecond)
	}
}

// TestAdmissionFIFO holds the one slot, queues requests one after another
// and checks that they run in the order they arrived.
func TestAdmissionFIFO(t *testing.T) {
	s := &Server{admission: newAdmission(1, 16)}
	gate := make(chan struct{})
	var mu sync.Mutex
	var order []string
	h := s.admit(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		name := r.URL.Query().Get("n")
		if name == "first" {
			<-gate
		}
		mu.Lock()
		order = append(order, name)
		mu.Unlock()
	}))
	var wg sync.WaitGroup
	do := func(name string) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := httptest.NewRecorder()
			h.ServeHTTP(w, httptest.NewRequest(http.MethodPost, "/api/evaluate?n="+name, nil))
			if w.Code != http.StatusOK {
				t.Errorf("%s: status %d", name, w.Code)
			}
		}()
	}
	do("first")
	deadline := time.Now().Add(5 * time.Second)
	for len(s.admission.slots) != 1 {
		if time.Now().After(deadline) {
			t.Fatal("the first request never took the slot")
		}
		time.Sleep(time.Millisecond)
	}
	want := []string{"first"}
	for i, name := range []string{"a", "b", "c", "d", "e", "f", "g", "h"} {
		do(name)
		waitQueued(t, s.admission, int64(i+1))
		want = append(want, name)
	}
	close(gate)
	wg.Wait()
	if strings.Join(order, ",") != strings.Join(want, ",") {
		t.Errorf("run order %v, want arrival order %v", order, want)
	}
}

// TestAdmissionFullQueue fills the slot and the queue: the next request is
// refused at once with 503, Retry-After and a JSON error; a page request
// gets the same status as text.
func TestAdmissionFullQueue(t *testing.T) {
	s := &Server{admission: newAdmission(1, 2)}
	gate := make(chan struct{})
	h := s.admit(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) { <-gate }))
	var wg sync.WaitGroup
	for i := range 3 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := httptest.NewRecorder()
			h.ServeHTTP(w, httptest.NewRequest(http.MethodPost, "/api/evaluate", nil))
			if w.Code != http.StatusOK {
				t.Errorf("admitted request %d: status %d", i, w.Code)
			}
		}()
	}
	waitQueued(t, s.admission, 2)
	for _, path := range []string{"/api/evaluate", "/cases/1"} {
		w := httptest.NewRecorder()
		h.ServeHTTP(w, httptest.NewRequest(http.MethodPost, path, nil))
		if w.Code != http.StatusServiceUnavailable {
			t.Fatalf("%s with a full queue: status %d, want 503", path, w.Code)
		}
		if got := w.Header().Get("Retry-After"); got != "1" {
			t.Errorf("%s: Retry-After %q, want 1", path, got)
		}
		if !strings.Contains(w.Body.String(), "busy") {
			t.Errorf("%s: body %q does not say the server is busy", path, w.Body.String())
		}
		if path == "/api/evaluate" {
			var body map[string]string
			if err := json.Unmarshal(w.Body.Bytes(), &body); err != nil || body["error"] == "" {
				t.Errorf("API refusal is not a JSON error: %q (%v)", w.Body.String(), err)
			}
		}
	}
	close(gate)
	wg.Wait()
	if n := s.admission.queued.Load(); n != 0 {
		t.Errorf("queued = %d after all finished", n)
	}
}

// TestAdmissionCancelledWhileWaiting checks that a request whose client
// leaves while queued is never run and frees its place in the queue.
func TestAdmissionCancelledWhileWaiting(t *testing.T) {
	s := &Server{admission: newAdmission(1, 4)}
	gate := make(chan struct{})
	ran := make(chan string, 4)
	h := s.admit(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		ran <- r.URL.Query().Get("n")
		if r.URL.Query().Get("n") == "first" {
			<-gate
		}
	}))
	go h.ServeHTTP(httptest.NewRecorder(), httptest.NewRequest(http.MethodPost, "/api/evaluate?n=first", nil))
	if got := <-ran; got != "first" {
		t.Fatalf("ran %q first", got)
	}
	ctx, cancel := context.WithCancel(context.Background())
	done := make(chan struct{})
	go func() {
		h.ServeHTTP(httptest.NewRecorder(), httptest.NewRequestWithContext(ctx, http.MethodPost, "/api/evaluate?n=gone", nil))
		close(done)
	}()
	waitQueued(t, s.admission, 1)
	cancel()
	<-done
	if n := s.admission.queued.Load(); n != 0 {
		t.Errorf("queued = %d after the waiting client left", n)
	}
	close(gate)
	w := httptest.NewRecorder()
	h.ServeHTTP(w, httptest.NewRequest(http.MethodPost, "/api/evaluate?n=next", nil))
	if got := <-ran; got != "next" {
		t.Errorf("after the cancelled request, %q ran, want next", got)
	}
}
