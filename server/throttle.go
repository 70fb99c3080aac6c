package server

import (
	"math"
	"sync"
	"time"
)

// Wrong access tokens, at /login or as a bearer token, are counted per
// client address in a leaky bucket: each failure adds one, the bucket
// drains by one every failureDrain, and a client whose bucket holds
// failureBurst is refused (429) without its token being looked at until
// it has drained below. Each failure also waits failurePause before its
// answer. A client therefore gets at most failureBurst guesses at once and
// then one per failureDrain, however many connections it opens.
const (
	failureBurst = 5
	failureDrain = 2 * time.Second
	failurePause = 400 * time.Millisecond
	// maxThrottled bounds the table; past it, buckets that have drained
	// are dropped, and if none has, the table starts again.
	maxThrottled = 10000
)

type failureThrottle struct {
	mu      sync.Mutex
	now     func() time.Time
	buckets map[string]bucket
}

type bucket struct {
	level float64
	at    time.Time
}

func newFailureThrottle(now func() time.Time) *failureThrottle {
	return &failureThrottle{now: now, buckets: map[string]bucket{}}
}

// drained is b's level at now.
func (b bucket) drained(now time.Time) float64 {
	return math.Max(0, b.level-float64(now.Sub(b.at))/float64(failureDrain))
}

// wait is how long client must wait before a token it sends is looked
// at; zero when it may try now.
func (f *failureThrottle) wait(client string) time.Duration {
	f.mu.Lock()
	defer f.mu.Unlock()
	b, ok := f.buckets[client]
	if !ok {
		return 0
	}
	over := b.drained(f.now()) - (failureBurst - 1)
	if over <= 0 {
		return 0
	}
	return time.Duration(over * float64(failureDrain))
}

// fail counts one wrong token from client.
func (f *failureThrottle) fail(client string) {
	f.mu.Lock()
	defer f.mu.Unlock()
	now := f.now()
	if len(f.buckets) >= maxThrottled {
		for k, b := range f.buckets {
			if b.drained(now) == 0 {
				delete(f.buckets, k)
			}
		}
		if len(f.buckets) >= maxThrottled {
			clear(f.buckets)
		}
	}
	b := f.buckets[client]
	f.buckets[client] = bucket{level: b.drained(now) + 1, at: now}
}
