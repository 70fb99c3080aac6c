package server

import (
	"bytes"
	"context"
	"encoding/json"
	"io"
	"log/slog"
	"mime/multipart"
	"net/http"
	"net/http/httptest"
	"testing"

	"fogbench/store"
)

func getBody(t *testing.T, c *http.Client, u string) ([]byte, *http.Response) {
	t.Helper()
	resp, err := c.Get(u)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	data, _ := io.ReadAll(resp.Body)
	return data, resp
}

func TestExportImportAPI(t *testing.T) {
	src, srcStore := newTestServer(t)
	c := client(t)
	bundle, resp := getBody(t, c, src.URL+"/api/export")
	if resp.StatusCode != http.StatusOK || resp.Header.Get("Content-Disposition") == "" {
		t.Fatalf("export: %d", resp.StatusCode)
	}
	if _, resp := getBody(t, c, src.URL+"/api/export?ids=1&ids=2"); resp.StatusCode != http.StatusOK {
		t.Fatalf("export selection: %d", resp.StatusCode)
	}
	if _, resp := getBody(t, c, src.URL+"/api/export?ids=1,x"); resp.StatusCode != http.StatusBadRequest {
		t.Fatalf("bad ids: %d", resp.StatusCode)
	}

	// Another machine: an empty library.
	ctx := context.Background()
	dstStore := openTestStore(t)
	dst := newServerOver(t, dstStore)
	post := func(body []byte, q string) (int, map[string][]map[string]any) {
		resp, err := c.Post(dst.URL+"/api/import"+q, "application/json", bytes.NewReader(body))
		if err != nil {
			t.Fatal(err)
		}
		defer resp.Body.Close()
		var out map[string][]map[string]any
		json.NewDecoder(resp.Body).Decode(&out)
		return resp.StatusCode, out
	}
	// Truncated or malformed: 400, nothing written.
	for _, bad := range [][]byte{bundle[:len(bundle)/2], []byte("{"), bytes.Replace(bundle, []byte(`"checksum": "`), []byte(`"checksum": "1`), 1)} {
		if code, _ := post(bad, ""); code != http.StatusBadRequest {
			t.Fatalf("bad bundle: %d", code)
		}
	}
	if n, _ := dstStore.CountCases(ctx); n != 0 {
		t.Fatalf("a refused import wrote %d cases", n)
	}
	code, out := post(bundle, "")
	if code != http.StatusOK || len(out["added"]) != 3 || len(out["kept"]) != 0 {
		t.Fatalf("import: %d %v", code, out)
	}
	code, out = post(bundle, "")
	if code != http.StatusOK || len(out["kept"]) != 3 {
		t.Fatalf("re-import: %d %v", code, out)
	}
	// Identical content, identical results: the JSON of each case's result
	// is the same on both machines.
	srcRows, _, _ := srcStore.ListCases(ctx, store.ListOptions{Sort: "id"})
	dstRows, _, _ := dstStore.ListCases(ctx, store.ListOptions{Sort: "id"})
	for i := range srcRows {
		a, _ := srcStore.GetCase(ctx, srcRows[i].ID)
		b, _ := dstStore.GetCase(ctx, dstRows[i].ID)
		if a.Checksum != b.Checksum {
			t.Fatalf("case %d differs after import", i)
		}
	}
}

func newServerOver(t *testing.T, st *store.Store) *httptest.Server {
	t.Helper()
	ts := httptest.NewServer(New(st, slog.New(slog.NewTextHandler(io.Discard, nil))).Handler())
	t.Cleanup(ts.Close)
	return ts
}

func TestImportPages(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	bundle, _ := getBody(t, c, ts.URL+"/api/export")
	upload := func(u string, field string, data []byte) *http.Response {
		var buf bytes.Buffer
		mw := multipart.NewWriter(&buf)
		if field == "file" {
			fw, _ := mw.CreateFormFile("file", "team.json")
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
	resp := upload(ts.URL+"/bundle/import", "file", bundle[:100])
	doc := docOf(t, resp)
	if resp.StatusCode != http.StatusBadRequest || doc.Find(`[data-testid=bundle-error]`).Length() != 1 {
		t.Fatalf("truncated upload: %d", resp.StatusCode)
	}
	resp = upload(ts.URL+"/bundle/import", "file", bundle)
	doc = docOf(t, resp)
	if n := doc.Find(`[data-testid=bundle-keep]`).Length(); resp.StatusCode != http.StatusOK || n != 3 {
		t.Fatalf("preview: %d, %d kept", resp.StatusCode, n)
	}
	carried, _ := doc.Find(`input[name=bundle]`).Attr("value")
	resp = upload(ts.URL+"/bundle/import/apply", "bundle", []byte(carried))
	doc = docOf(t, resp)
	if resp.StatusCode != http.StatusOK || doc.Find(`[data-testid=bundle-done]`).Length() != 1 {
		t.Fatalf("apply: %d", resp.StatusCode)
	}
}
