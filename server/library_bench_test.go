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

	"fogbench/calc"
	"fogbench/store"
)

// benchSink keeps results alive so the compiler cannot drop the work.
var benchSink int

// seedLibrary fills a library with n cases (variants of the demo cases,
// every tenth tagged) in one import transaction.
func seedLibrary(b *testing.B, n int) *store.Store {
	b.Helper()
	st := openTestStore(b)
	demo, err := store.DemoCases()
	if err != nil {
		b.Fatal(err)
	}
	// Bundles are capped at 8 MiB, so seed in chunks.
	const chunk = 2000
	for start := 0; start < n; start += chunk {
		importChunk(b, st, demo, start, min(start+chunk, n))
	}
	return st
}

func importChunk(b *testing.B, st *store.Store, demo []calc.Case, from, to int) {
	ctx := context.Background()
	bundle := store.Bundle{Format: store.BundleFormat, CaseCount: to - from}
	for i := from; i < to; i++ {
		c := demo[i%len(demo)]
		c.Name = fmt.Sprintf("Bench case %05d — %s", i, c.Name)
		c.Gas.TemperatureK += float64(i%50) * 0.5
		c.Normalize()
		body, _ := c.Encode()
		tags := []string{}
		if i%10 == 0 {
			tags = []string{"batch-" + fmt.Sprint(i%7)}
		}
		bundle.Cases = append(bundle.Cases, store.BundleCase{UID: fmt.Sprintf("%032x", i+1), Tags: tags,
			Checksum: store.Checksum(body), Case: json.RawMessage(body)})
	}
	data, _ := bundle.Encode()
	decoded, err := store.DecodeBundle(bytes.NewReader(data))
	if err != nil {
		b.Fatal(err)
	}
	if _, err := st.Import(ctx, decoded, nil, "", "bench"); err != nil {
		b.Fatal(err)
	}
}

// BenchmarkLibrary10k measures the library query and the whole library
// page (query, tags, template) over 10,000 cases.
func BenchmarkLibrary10k(b *testing.B) {
	if testing.Short() {
		b.Skip("seeds 10,000 cases")
	}
	st := seedLibrary(b, 10000)
	defer st.Close()
	ctx := context.Background()
	queries := []struct {
		name string
		o    store.ListOptions
	}{
		{"query/newest", store.ListOptions{}},
		{"query/by-name-page-100", store.ListOptions{Sort: "name", Offset: 4950}},
		{"query/fluid", store.ListOptions{Fluid: "n-heptane"}},
		{"query/tag", store.ListOptions{Tag: "batch-3"}},
		{"query/search-text", store.ListOptions{Query: "humidifier"}},
		{"query/trash", store.ListOptions{Trash: true}},
	}
	for _, q := range queries {
		b.Run(q.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				rows, total, err := st.ListCases(ctx, q.o)
				if err != nil {
					b.Fatal(err)
				}
				benchSink += len(rows) + total
			}
		})
	}
	h := New(st, slog.New(slog.NewTextHandler(io.Discard, nil))).Handler()
	for _, page := range []string{"/cases", "/cases?sort=name&page=100", "/cases?tag=batch-3"} {
		b.Run("page"+page, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				rec := httptest.NewRecorder()
				h.ServeHTTP(rec, httptest.NewRequest(http.MethodGet, page, nil))
				if rec.Code != http.StatusOK {
					b.Fatalf("status %d", rec.Code)
				}
				benchSink += rec.Body.Len()
			}
		})
	}
}
