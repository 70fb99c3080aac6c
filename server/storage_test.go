package server

import (
	"bytes"
	"context"
	"encoding/json"
	"io"
	"net/http"
	"strings"
	"testing"

	"fogbench/store"
)

// TestSavesOnAFullOrReadOnlyLibraryTellTheUser makes the library refuse
// writes as a full disk and as a read-only file system would (the real
// SQLite errors, SQLITE_FULL and SQLITE_READONLY) and saves through the
// case form, the user-liquid form and the API: each answer says what
// happened and that nothing was saved (507 for the full disk, 503 for the
// read-only library), the form comes back with what was typed, the log
// names the cause, and the library is unchanged. Before, every one was a
// generic 500.
func TestSavesOnAFullOrReadOnlyLibraryTellTheUser(t *testing.T) {
	for _, tc := range []struct {
		fault  store.StorageFault
		status int
		says   string
		code   string
	}{
		{store.StorageFull, http.StatusInsufficientStorage, "disk holding the case library is full", "storage_full"},
		{store.StorageReadOnly, http.StatusServiceUnavailable, "case library is read-only", "storage_read_only"},
	} {
		t.Run(string(tc.fault), func(t *testing.T) {
			ts, s, logs := newLoggedServer(t)
			st := s.Store.(*store.Store)
			ctx := context.Background()
			if err := st.SimulateStorageFault(ctx, tc.fault); err != nil {
				t.Fatal(err)
			}
			before := caseCount(t, s)
			c := client(t)
			// Notes long enough that the row needs pages of its own, which a
			// full disk cannot give.
			notes := strings.Repeat("Spray checked against the rig's patternator. ", 700)
			form := validForm()
			form.Set("notes", notes)
			checkForm := func(what string, resp *http.Response) {
				t.Helper()
				doc := docOf(t, resp)
				msg := doc.Find(`[data-testid=form-errors]`).Text()
				if resp.StatusCode != tc.status || !strings.Contains(msg, tc.says) || !strings.Contains(msg, "nothing was saved") {
					t.Errorf("%s: status %d, message %q; want %d and %q", what, resp.StatusCode, msg, tc.status, tc.says)
				}
				if v, _ := doc.Find(`[name=name]`).Attr("value"); what != "liquid form" && v != "Test nozzle" {
					t.Errorf("%s: the form lost the name: %q", what, v)
				}
				if got := doc.Find(`[name=notes]`).Text(); what != "liquid form" && !strings.Contains(got, "patternator") {
					t.Errorf("%s: the form lost the notes", what)
				}
			}
			checkForm("new case", postForm(t, c, ts.URL+"/cases", form))
			edit := validForm()
			edit.Set("notes", notes)
			edit.Set("revision", "1")
			checkForm("edit", postForm(t, c, ts.URL+"/cases/1", edit))
			liquid := userLiquidForm()
			liquid.Set("reference", strings.Repeat("supplier sheet 4, ", 300))
			checkForm("liquid form", postForm(t, c, ts.URL+"/fluids/custom", liquid))

			// The API: the status and a message, with a code for programs.
			demo, err := store.DemoCases()
			if err != nil {
				t.Fatal(err)
			}
			apiCase := demo[0]
			apiCase.Name, apiCase.Notes = "API nozzle", notes
			body, _ := json.Marshal(apiCase)
			resp, err := c.Post(ts.URL+"/api/cases", "application/json", bytes.NewReader(body))
			if err != nil {
				t.Fatal(err)
			}
			raw, _ := io.ReadAll(resp.Body)
			resp.Body.Close()
			var out struct{ Error, Code string }
			json.Unmarshal(raw, &out)
			if resp.StatusCode != tc.status || !strings.Contains(out.Error, tc.says) || out.Code != tc.code {
				t.Errorf("API: %d %s; want %d, %q and code %s", resp.StatusCode, raw, tc.status, tc.says, tc.code)
			}

			if after := caseCount(t, s); after != before {
				t.Errorf("%d cases after the refused saves, was %d", after, before)
			}
			if rec, _ := st.GetCase(ctx, 1); rec.Revision != 1 {
				t.Errorf("case 1 is at revision %d after a refused edit", rec.Revision)
			}
			log := logs.String()
			if !strings.Contains(log, "save refused by the library's storage") || strings.Contains(log, "level=ERROR") {
				t.Errorf("the log does not name the cause as a warning:\n%s", log)
			}
		})
	}
}

// TestStartupWriteCheck is the check fogbench serve makes at start: a
// writable library passes, one that refuses writes gives a *StorageError
// that says read-only.
func TestStartupWriteCheck(t *testing.T) {
	_, s, _ := newLoggedServer(t)
	st := s.Store.(*store.Store)
	ctx := context.Background()
	wc, err := st.CheckWritable(ctx)
	if err != nil {
		t.Fatalf("a fresh library: %v", err)
	}
	if wc.FreeBytes == 0 {
		t.Errorf("free space %d", wc.FreeBytes)
	}
	if err := st.SimulateStorageFault(ctx, store.StorageReadOnly); err != nil {
		t.Fatal(err)
	}
	_, err = st.CheckWritable(ctx)
	if status, ok := storageStatus(err); !ok || status != http.StatusServiceUnavailable {
		t.Fatalf("a read-only library passes the write check: %v", err)
	}
}
