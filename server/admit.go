package server

import (
	"net/http"
	"runtime"
	"strconv"
	"strings"
	"sync/atomic"
)

// admissionQueueLen is how many requests may wait for a compute slot
// beyond those running; more than that are refused with 503 at once
// (docs/performance.md, "Admission").
const admissionQueueLen = 256

// admission lets at most one compute-bound request run per core and serves
// the rest in arrival order. Without it, Go's scheduler shares the cores
// among every request in flight without regard to arrival order, so under
// load a few requests wait many times the mean while others pass; with it
// every request waits about the same time (queue length / throughput).
type admission struct {
	// slots holds one token per running request. A goroutine blocked on a
	// channel send is queued first in, first out (the runtime keeps the
	// senders of a full channel in a FIFO list), so waiting requests are
	// admitted in the order they asked.
	slots chan struct{}
	// queued counts the requests waiting for a slot.
	queued   atomic.Int64
	maxQueue int64
	// retryAfter is the Retry-After of a refusal, in whole seconds.
	retryAfter int
}

// newAdmission returns an admission with slots running requests (at least
// one) and room for maxQueue waiting ones.
func newAdmission(slots, maxQueue int) *admission {
	if slots < 1 {
		slots = 1
	}
	return &admission{slots: make(chan struct{}, slots), maxQueue: int64(maxQueue), retryAfter: 1}
}

// defaultAdmission has one slot per core the Go runtime uses.
func defaultAdmission() *admission {
	return newAdmission(runtime.GOMAXPROCS(0), admissionQueueLen)
}

// acquire waits for a slot in arrival order. It reports false, without a
// slot, when the queue is full or the request is cancelled while waiting.
func (a *admission) acquire(r *http.Request) bool {
	select {
	case a.slots <- struct{}{}: // a free slot and nobody waiting before us
		return true
	default:
	}
	if a.queued.Add(1) > a.maxQueue {
		a.queued.Add(-1)
		return false
	}
	defer a.queued.Add(-1)
	select {
	case a.slots <- struct{}{}:
		return true
	case <-r.Context().Done():
		return false
	}
}

func (a *admission) release() { <-a.slots }

// admit runs next in a compute slot. A full queue gets 503 Service
// Unavailable with Retry-After and a JSON or page error; a client that
// leaves while waiting gets nothing computed.
func (s *Server) admit(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		a := s.admission
		if a == nil {
			next.ServeHTTP(w, r)
			return
		}
		if !a.acquire(r) {
			if r.Context().Err() != nil {
				return // the client is gone; nobody reads an answer
			}
			msg := "The server is busy: every compute slot is taken and the queue is full; retry after " +
				strconv.Itoa(a.retryAfter) + " s."
			w.Header().Set("Retry-After", strconv.Itoa(a.retryAfter))
			if strings.HasPrefix(r.URL.Path, "/api/") {
				writeJSON(w, http.StatusServiceUnavailable, map[string]string{"error": msg})
				return
			}
			http.Error(w, msg, http.StatusServiceUnavailable)
			return
		}
		defer a.release()
		next.ServeHTTP(w, r)
	})
}
