package sizedist

import (
	"bytes"
	"math/rand/v2"
	"strconv"
	"testing"
)

var (
	sinkSummary Summary
	sinkImport  *Import
)

// rawListCSV is a single-column file of n drop diameters in µm.
func rawListCSV(n int) []byte {
	rng := rand.New(rand.NewPCG(3, 5))
	var buf bytes.Buffer
	buf.WriteString("Drop diameter (µm)\n")
	for range n {
		buf.WriteString(strconv.FormatFloat(5+200*rng.Float64()*rng.Float64(), 'f', 2, 64))
		buf.WriteByte('\n')
	}
	return buf.Bytes()
}

// BenchmarkImportCSV reads a raw list and summarises it (target: 10^6
// drops in well under a second).
func BenchmarkImportCSV(b *testing.B) {
	for _, n := range []int{1_000, 1_000_000} {
		data := rawListCSV(n)
		b.Run("raw_"+strconv.Itoa(n), func(b *testing.B) {
			b.ReportAllocs()
			b.SetBytes(int64(len(data)))
			for b.Loop() {
				imp, err := ImportCSV(bytes.NewReader(data), 1<<30)
				if err != nil {
					b.Fatal(err)
				}
				sinkImport = imp
				sinkSummary = imp.Binned.Summary()
			}
		})
	}
	bins := []byte("Lower edge (µm);Upper edge (µm);Volume (%)\n5,0;10,0;20\n10,0;20,0;50\n20,0;40,0;30\n")
	b.Run("bins_3", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			imp, err := ImportCSV(bytes.NewReader(bins), 1<<20)
			if err != nil {
				b.Fatal(err)
			}
			sinkSummary = imp.Binned.Summary()
		}
	})
}

// BenchmarkCutSummary cuts each model into 200 log classes and summarises.
func BenchmarkCutSummary(b *testing.B) {
	for _, m := range []Model{
		RosinRammler{X: 100 * um, Q: 2.5},
		LogNormal{Median: 60 * um, GSD: 1.8, Basis: BasisVolume},
		UpperLimit{DMax: 300 * um, Dv50: 80 * um, Delta: 0.9},
		NukiyamaTanasawa{B: 1e5, P: 2, Q: 1},
	} {
		b.Run(m.Name(), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				bn, err := Cut(m, 1*um, 500*um, 200, SpacingLog)
				if err != nil {
					b.Fatal(err)
				}
				sinkSummary = bn.Summary()
			}
		})
	}
}
