package main

import (
	"testing"

	"fogbench/calc"
)

var (
	sinkResults []*calc.Result
	sinkBytes   int
)

// BenchmarkBatch is the fogbench side of the batch without process start:
// evaluate 100 cases of the seeded batch and encode them as `fogbench eval`
// does. Profile with
//
//	go test -run XXX -bench Batch -cpuprofile /tmp/batch.prof ./testdata/bench
func BenchmarkBatch(b *testing.B) {
	cases := Batch(100, 1)
	b.ReportAllocs()
	for b.Loop() {
		res := make([]*calc.Result, len(cases))
		for i, c := range cases {
			r, err := calc.Evaluate(c)
			if err != nil {
				b.Fatal(err)
			}
			res[i] = r
		}
		out, err := calc.AppendResultsJSON(nil, res) // compact, as eval writes an array
		if err != nil {
			b.Fatal(err)
		}
		sinkBytes = len(out)
		sinkResults = res
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(cases))/1e3, "µs/case")
}
