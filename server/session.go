package server

import (
	"crypto/rand"
	"crypto/sha256"
	"encoding/hex"
	"sync"
	"time"
)

// maxSessions bounds the session table: past it the session closest to
// its end is dropped, so a flood of sign-ins cannot grow memory.
const maxSessions = 10000

// sessionTable holds the signed-in browsers on the server, so that signing
// out ends a session for good: the cookie carries only a random id, and
// an id that is not in the table is not a session. The table lives in
// memory; a restart (and so a new token) signs everyone out.
type sessionTable struct {
	mu  sync.Mutex
	exp map[[32]byte]time.Time // SHA-256 of the id -> end of the session
}

func newSessionTable() *sessionTable {
	return &sessionTable{exp: map[[32]byte]time.Time{}}
}

// start opens a session ending at exp and returns its cookie value: 32
// random bytes in hex.
func (t *sessionTable) start(now, exp time.Time) string {
	var b [32]byte
	rand.Read(b[:]) // never fails (crypto/rand, Go 1.24+)
	id := hex.EncodeToString(b[:])
	t.mu.Lock()
	defer t.mu.Unlock()
	if len(t.exp) >= maxSessions {
		t.prune(now)
	}
	t.exp[sha256.Sum256([]byte(id))] = exp
	return id
}

// valid reports whether id names a session that has not ended.
func (t *sessionTable) valid(id string, now time.Time) bool {
	k := sha256.Sum256([]byte(id))
	t.mu.Lock()
	defer t.mu.Unlock()
	exp, ok := t.exp[k]
	if ok && !now.Before(exp) {
		delete(t.exp, k)
		return false
	}
	return ok
}

// end forgets a session; its cookie no longer signs anyone in.
func (t *sessionTable) end(id string) {
	t.mu.Lock()
	defer t.mu.Unlock()
	delete(t.exp, sha256.Sum256([]byte(id)))
}

// prune drops ended sessions and, if the table is still full, the one
// that would end first. The caller holds mu.
func (t *sessionTable) prune(now time.Time) {
	var first [32]byte
	var firstExp time.Time
	for k, exp := range t.exp {
		if !now.Before(exp) {
			delete(t.exp, k)
			continue
		}
		if firstExp.IsZero() || exp.Before(firstExp) {
			first, firstExp = k, exp
		}
	}
	if len(t.exp) >= maxSessions {
		delete(t.exp, first)
	}
}

// randomKey is a fresh 32-byte key for what the server signs for itself.
func randomKey() []byte {
	k := make([]byte, 32)
	rand.Read(k)
	return k
}
