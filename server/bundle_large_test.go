package server

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"mime/multipart"
	"net/http"
	"net/http/httptest"
	"strings"
	"testing"
	"time"

	"fogbench/calc"
	"fogbench/store"
)

// rigNotes are about 2 KB of notes, as engineers' notes run.
var rigNotes = strings.Repeat("Measured on the test rig; nozzle re-seated after cleaning. ", 34)

// seedLargeLibrary writes n variants of the demo cases, each with notes of
// about 2 KB (as engineers' notes run), into st in one import.
func seedLargeLibrary(t *testing.T, st *store.Store, n int) {
	t.Helper()
	demo, err := store.DemoCases()
	if err != nil {
		t.Fatal(err)
	}
	notes := rigNotes
	const chunk = 1000 // imports of a few MB each
	for from := 0; from < n; from += chunk {
		importCases(t, st, demo, notes, from, min(from+chunk, n))
	}
}

func importCases(t *testing.T, st *store.Store, demo []calc.Case, notes string, from, to int) {
	t.Helper()
	decoded, err := store.DecodeBundle(bytes.NewReader(rigBundle(t, demo, notes, from, to)))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := st.Import(context.Background(), decoded, nil, "", "test"); err != nil {
		t.Fatal(err)
	}
}

// rigBundle is a bundle of the cases from…to-1 of seedLargeLibrary.
func rigBundle(t *testing.T, demo []calc.Case, notes string, from, to int) []byte {
	t.Helper()
	b := store.Bundle{Format: store.BundleFormat, CaseCount: to - from}
	for i := from; i < to; i++ {
		c := demo[i%len(demo)]
		c.Name = fmt.Sprintf("Rig case %05d", i)
		c.Notes = notes
		c.Gas.TemperatureK += float64(i%40) * 0.5
		c.Normalize()
		body, err := c.Encode()
		if err != nil {
			t.Fatal(err)
		}
		b.Cases = append(b.Cases, store.BundleCase{UID: fmt.Sprintf("%032x", i+1), Tags: []string{"rig"},
			Checksum: store.Checksum(body), Case: json.RawMessage(body)})
	}
	data, err := b.Encode()
	if err != nil {
		t.Fatal(err)
	}
	return data
}

// TestExportedLibraryImportsIntoAFreshServer exports a library larger than
// the 8 MiB of ordinary requests (3,000 cases) and imports it into an empty
// server through the API and through the import pages: every case arrives.
// Before bundles had their own limit the import answered 413.
func TestExportedLibraryImportsIntoAFreshServer(t *testing.T) {
	if testing.Short() {
		t.Skip("seeds 3,000 cases")
	}
	const n = 3000
	srcStore := openTestStore(t)
	seedLargeLibrary(t, srcStore, n)
	src := newServerOver(t, srcStore)
	c := client(t)
	bundle, resp := getBody(t, c, src.URL+"/api/export")
	if resp.StatusCode != http.StatusOK {
		t.Fatalf("export: %d", resp.StatusCode)
	}
	if len(bundle) <= MaxBodyBytes {
		t.Fatalf("the export is %d bytes, not above the 8 MiB of other requests", len(bundle))
	}
	t.Logf("%d cases exported in %.1f MB", n, float64(len(bundle))/1e6)

	// The API.
	dstStore := openTestStore(t)
	dst := newServerOver(t, dstStore)
	resp, err := c.Post(dst.URL+"/api/import", "application/json", bytes.NewReader(bundle))
	if err != nil {
		t.Fatal(err)
	}
	body, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusOK {
		t.Fatalf("API import: %d %.300s", resp.StatusCode, body)
	}
	if got, _ := dstStore.CountCases(context.Background()); got != n {
		t.Fatalf("API import: %d cases in the library, want %d", got, n)
	}

	// The pages: upload, preview, apply.
	webStore := openTestStore(t)
	web := newServerOver(t, webStore)
	upload := func(u, field, filename string, data []byte) *http.Response {
		var buf bytes.Buffer
		mw := multipart.NewWriter(&buf)
		if filename != "" {
			fw, _ := mw.CreateFormFile(field, filename)
			fw.Write(data)
		} else {
			mw.WriteField(field, string(data))
		}
		mw.Close()
		resp, err := c.Post(u, mw.FormDataContentType(), &buf)
		if err != nil {
			t.Fatal(err)
		}
		return resp
	}
	resp = upload(web.URL+"/bundle/import", "file", "library.json", bundle)
	doc := docOf(t, resp)
	if k := doc.Find(`[data-testid=bundle-add]`).Length(); resp.StatusCode != http.StatusOK || k != n {
		t.Fatalf("preview: %d, %d cases to add, want %d", resp.StatusCode, k, n)
	}
	carried, _ := doc.Find(`input[name=bundle]`).Attr("value")
	resp = upload(web.URL+"/bundle/import/apply", "bundle", "", []byte(carried))
	doc = docOf(t, resp)
	if resp.StatusCode != http.StatusOK || doc.Find(`[data-testid=bundle-done]`).Length() != 1 {
		t.Fatalf("apply: %d", resp.StatusCode)
	}
	if got, _ := webStore.CountCases(context.Background()); got != n {
		t.Fatalf("page import: %d cases in the library, want %d", got, n)
	}
}

// TestBundleLimitIsEnforcedWhileStreaming sends a chunked body past the
// bundle limit (no length declared): it is cut at the limit and answered
// 413 with the limit, and nothing is written.
func TestBundleLimitIsEnforcedWhileStreaming(t *testing.T) {
	if testing.Short() {
		t.Skip("sends 256 MiB")
	}
	ts, st := newTestServer(t)
	before, _ := st.CountCases(context.Background())
	body := io.MultiReader(strings.NewReader(`{"format":"fogbench-bundle/1","cases":[`),
		io.LimitReader(zeros{}, store.MaxBundleBytes+1024))
	req, _ := http.NewRequest(http.MethodPost, ts.URL+"/api/import", body)
	req.Header.Set("Content-Type", "application/json")
	resp, err := client(t).Do(req)
	if err != nil {
		t.Fatal(err)
	}
	checkTooLargeLimit(t, "chunked bundle", resp, "256 MiB")
	resp.Body.Close()
	if after, _ := st.CountCases(context.Background()); after != before {
		t.Fatalf("%d cases after a refused import, was %d", after, before)
	}
}

// zeros reads as endless JSON whitespace.
type zeros struct{}

func (zeros) Read(p []byte) (int, error) {
	for i := range p {
		p[i] = ' '
	}
	return len(p), nil
}

// slowReader hands out data in pieces with a pause before each.
type slowReader struct {
	data  []byte
	piece int
	pause time.Duration
}

func (s *slowReader) Read(p []byte) (int, error) {
	if len(s.data) == 0 {
		return 0, io.EOF
	}
	time.Sleep(s.pause)
	n := copy(p[:min(len(p), s.piece)], s.data)
	s.data = s.data[n:]
	return n, nil
}

// TestBundleImportOutlastsTheServerTimeouts imports a bundle whose upload
// takes longer than the server's read and write timeouts (shortened here
// to 1 s; 60 s in fogbench serve), as a bundle near its limit does: the
// import routes extend both for themselves, so the import succeeds.
func TestBundleImportOutlastsTheServerTimeouts(t *testing.T) {
	st := openTestStore(t)
	srv := httptest.NewUnstartedServer(New(st, nil).Handler())
	srv.Config.ReadTimeout, srv.Config.WriteTimeout = time.Second, time.Second
	srv.Start()
	t.Cleanup(srv.Close)
	demo, err := store.DemoCases()
	if err != nil {
		t.Fatal(err)
	}
	data := rigBundle(t, demo, "", 0, 20)
	body := &slowReader{data: data, piece: len(data)/10 + 1, pause: 250 * time.Millisecond} // about 2.5 s
	req, _ := http.NewRequest(http.MethodPost, srv.URL+"/api/import", body)
	req.Header.Set("Content-Type", "application/json")
	resp, err := client(t).Do(req)
	if err != nil {
		t.Fatalf("the slow import was cut off: %v", err)
	}
	out, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusOK {
		t.Fatalf("slow import: %d %.300s", resp.StatusCode, out)
	}
	if n, _ := st.CountCases(context.Background()); n != 20 {
		t.Fatalf("%d cases after the slow import, want 20", n)
	}
}
