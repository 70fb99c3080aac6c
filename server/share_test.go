package server

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"testing"
	"time"

	"fogbench/calc"
	"fogbench/store"
	"fogbench/store/storetest"
)

// twoServers starts two fogbench servers on their own loopback ports, each
// with its own connection to one library, as two hosts behind one address
// would run.
func twoServers(t *testing.T, b storetest.Backend) (a, z *httptest.Server) {
	t.Helper()
	ctx := context.Background()
	dsn := b.New(t)
	var srv [2]*httptest.Server
	for i := range srv {
		st, err := store.Open(ctx, dsn)
		if err != nil {
			t.Fatal(err)
		}
		t.Cleanup(func() { st.Close() })
		if _, err := st.SeedDemo(ctx); err != nil {
			t.Fatal(err)
		}
		logger := slog.New(slog.NewTextHandler(io.Discard, nil))
		srv[i] = httptest.NewServer(New(st, logger).Handler())
		t.Cleanup(srv[i].Close)
	}
	return srv[0], srv[1]
}

type sharedCase struct {
	ID       int64     `json:"id"`
	Revision int       `json:"revision"`
	Case     calc.Case `json:"case"`
}

func apiDo(t *testing.T, c *http.Client, method, url string, body any) (int, []byte) {
	t.Helper()
	var rd io.Reader
	if body != nil {
		data, err := json.Marshal(body)
		if err != nil {
			t.Fatal(err)
		}
		rd = bytes.NewReader(data)
	}
	req, _ := http.NewRequest(method, url, rd)
	req.Header.Set("Content-Type", "application/json")
	resp, err := c.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	data, _ := io.ReadAll(resp.Body)
	return resp.StatusCode, data
}

func apiGetCase(t *testing.T, c *http.Client, base string, id int64) sharedCase {
	t.Helper()
	code, data := apiDo(t, c, http.MethodGet, fmt.Sprintf("%s/api/cases/%d", base, id), nil)
	var got sharedCase
	if code != http.StatusOK || json.Unmarshal(data, &got) != nil {
		t.Fatalf("GET case %d from %s: %d %s", id, base, code, data)
	}
	return got
}

// Two servers over one library: what one saves the other shows, and saves
// of one case sent to both at once give one winner and one 409 with the
// winner's version, never a lost update. The rounds are bounded (ten, under
// a client timeout), so a hang fails instead of stalling the suite.
func TestTwoServersShareOneLibrary(t *testing.T) {
	for _, b := range storetest.Backends() {
		t.Run(b.Name, func(t *testing.T) {
			a, z := twoServers(t, b)
			c := &http.Client{Timeout: 20 * time.Second}

			// The demo cases were seeded once, whichever server started first.
			code, data := apiDo(t, c, http.MethodGet, z.URL+"/api/cases", nil)
			var list struct {
				Total int `json:"total"`
			}
			demo, _ := store.DemoCases()
			if json.Unmarshal(data, &list); code != 200 || list.Total != len(demo) {
				t.Fatalf("library on the second server: %d, total %d, want %d", code, list.Total, len(demo))
			}

			// A case created on one is seen on the other; an edit on the
			// other is seen back on the first.
			first := apiGetCase(t, c, a.URL, 1)
			fresh := first.Case
			fresh.Name = "Shared nozzle"
			code, data = apiDo(t, c, http.MethodPost, a.URL+"/api/cases", fresh)
			var created sharedCase
			if json.Unmarshal(data, &created); code != http.StatusCreated {
				t.Fatalf("create on A: %d %s", code, data)
			}
			seen := apiGetCase(t, c, z.URL, created.ID)
			if seen.Case.Name != "Shared nozzle" || seen.Revision != 1 {
				t.Fatalf("B sees %q rev %d", seen.Case.Name, seen.Revision)
			}
			seen.Case.Notes = "edited on B"
			if code, data := apiDo(t, c, http.MethodPut, fmt.Sprintf("%s/api/cases/%d", z.URL, created.ID),
				map[string]any{"revision": 1, "case": seen.Case}); code != http.StatusOK {
				t.Fatalf("update on B: %d %s", code, data)
			}
			if back := apiGetCase(t, c, a.URL, created.ID); back.Revision != 2 || back.Case.Notes != "edited on B" {
				t.Fatalf("A sees rev %d notes %q", back.Revision, back.Case.Notes)
			}

			// Rounds of simultaneous saves of one revision, one to each server.
			for round := range 10 {
				cur := apiGetCase(t, c, a.URL, created.ID)
				type reply struct {
					code  int
					body  []byte
					notes string
				}
				replies := make(chan reply, 2)
				start := make(chan struct{})
				for i, srv := range []*httptest.Server{a, z} {
					edit := cur.Case
					edit.Notes = fmt.Sprintf("round %d from server %d", round, i)
					go func() {
						<-start
						code, body := apiDo(t, c, http.MethodPut, fmt.Sprintf("%s/api/cases/%d", srv.URL, created.ID),
							map[string]any{"revision": cur.Revision, "case": edit})
						replies <- reply{code, body, edit.Notes}
					}()
				}
				close(start)
				r1, r2 := <-replies, <-replies
				if r1.code == http.StatusConflict {
					r1, r2 = r2, r1
				}
				if r1.code != http.StatusOK || r2.code != http.StatusConflict {
					t.Fatalf("round %d: answers %d and %d, want one 200 and one 409 (%s / %s)", round, r1.code, r2.code, r1.body, r2.body)
				}
				var conflict struct {
					Current sharedCase `json:"current"`
				}
				if err := json.Unmarshal(r2.body, &conflict); err != nil || conflict.Current.Case.Notes != r1.notes || conflict.Current.Revision != cur.Revision+1 {
					t.Fatalf("round %d: the 409 carries %q rev %d, the winner saved %q", round, conflict.Current.Case.Notes, conflict.Current.Revision, r1.notes)
				}
				for _, srv := range []*httptest.Server{a, z} {
					if now := apiGetCase(t, c, srv.URL, created.ID); now.Case.Notes != r1.notes || now.Revision != cur.Revision+1 {
						t.Fatalf("round %d: %s holds %q rev %d, want the winner %q", round, srv.URL, now.Case.Notes, now.Revision, r1.notes)
					}
				}
			}
			code, data = apiDo(t, c, http.MethodGet, fmt.Sprintf("%s/api/cases/%d/revisions", z.URL, created.ID), nil)
			var revs struct {
				Revisions []struct{ Revision int } `json:"revisions"`
			}
			if json.Unmarshal(data, &revs); code != 200 || len(revs.Revisions) != 12 || revs.Revisions[0].Revision != 12 {
				t.Fatalf("history: %d revisions (%s), want 12: one per winning save", len(revs.Revisions), data)
			}
		})
	}
}
