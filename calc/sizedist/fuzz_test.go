package sizedist

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"testing"

	"fogbench/calc/valid"
)

// FuzzImportCSV checks that no input panics, that an error is always a file
// field error with nothing returned, and that a successful import holds only
// finite numbers with fractions summing to 1.
func FuzzImportCSV(f *testing.F) {
	files, _ := filepath.Glob("../../testdata/sizedist/*.csv")
	tsv, _ := filepath.Glob("../../testdata/sizedist/*.tsv")
	for _, name := range append(files, tsv...) {
		if filepath.Base(name) == "scipy_reference.csv" {
			continue
		}
		data, err := os.ReadFile(name)
		if err != nil {
			f.Fatal(err)
		}
		if len(data) > 4096 {
			data = data[:4096]
		}
		f.Add(data)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		imp, err := ImportCSV(bytes.NewReader(data), 1<<20)
		if err != nil {
			var fe *valid.FieldError
			if imp != nil || !errors.As(err, &fe) || fe.Field != "file" {
				t.Fatalf("error %v with result %v", err, imp)
			}
			return
		}
		b := imp.Binned
		if b == nil || b.Len() < 1 || len(b.Edges) != b.Len()+1 || len(b.Volume) != b.Len() {
			t.Fatalf("malformed Binned %+v", b)
		}
		for i, e := range b.Edges {
			if !(e > 0) || math.IsInf(e, 0) || (i > 0 && !(e > b.Edges[i-1])) {
				t.Fatalf("edge %d = %g", i, e)
			}
		}
		for _, fr := range [][]float64{b.Number, b.Volume} {
			var s float64
			for _, v := range fr {
				if !(v >= 0) || math.IsInf(v, 0) {
					t.Fatalf("fraction %g", v)
				}
				s += v
			}
			if math.Abs(s-1) > 1e-9 {
				t.Fatalf("fractions sum to %g", s)
			}
		}
		checkSummary(t, b.Summary())
		if imp.Raw != nil {
			checkSummary(t, *imp.Raw)
		}
	})
}

func checkSummary(t *testing.T, s Summary) {
	t.Helper()
	for _, v := range []float64{s.D10, s.D20, s.D30, s.D21, s.D31, s.D32, s.D43, s.Dv10, s.Dv50, s.Dv90, s.Dn50, s.Span, s.RelativeSpan} {
		if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 {
			t.Fatalf("summary value %g in %+v", v, s)
		}
	}
}
