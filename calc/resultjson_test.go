package calc

import (
	"bytes"
	"encoding/json"
	"math"
	"math/rand/v2"
	"reflect"
	"testing"
)

// TestResultJSONMatchesEncodingJSON holds Result.AppendJSON and
// AppendResultsJSON to encoding/json's output byte for byte: over the
// results of seeded random cases (randomCase, the fuzz test's generator),
// and over seeded synthetic results in which every field reachable by
// reflection is set (floats across the format switch at 1e-6 and 1e21,
// signed zeros, subnormals; strings that need escaping; nil, empty and
// filled slices and pointers), so a field added to Result without the
// encoder learning it fails here.
func TestResultJSONMatchesEncodingJSON(t *testing.T) {
	check := func(what string, r *Result) {
		t.Helper()
		want, err := json.Marshal(r)
		if err != nil {
			t.Fatalf("%s: encoding/json: %v", what, err)
		}
		got, err := r.AppendJSON(nil)
		if err != nil {
			t.Fatalf("%s: AppendJSON: %v", what, err)
		}
		if !bytes.Equal(got, want) {
			i := 0
			for i < min(len(got), len(want)) && got[i] == want[i] {
				i++
			}
			lo := max(0, i-80)
			t.Fatalf("%s: differs at byte %d:\n got  …%s\n want …%s", what, i, got[lo:min(len(got), i+40)], want[lo:min(len(want), i+40)])
		}
	}
	rng := rand.New(rand.NewPCG(11, 29))
	var all []*Result
	evaluated := 0
	for i := range 300 {
		res, err := Evaluate(randomCase(rng))
		if err != nil {
			continue
		}
		evaluated++
		check("evaluated case", res)
		// The size hint covers an evaluated result, so its buffer is
		// allocated once.
		if out, _ := res.AppendJSON(nil); len(out) > res.jsonSizeHint() {
			t.Fatalf("evaluated case: %d bytes of JSON in a buffer of %d, hint %d", len(out), cap(out), res.jsonSizeHint())
		}
		if i%3 == 0 {
			all = append(all, res)
		}
	}
	if evaluated < 50 {
		t.Fatalf("only %d of 300 random cases evaluated; the comparison needs more", evaluated)
	}
	for i := range 500 {
		var r Result
		fillRandom(rng, reflect.ValueOf(&r).Elem(), 0)
		check("synthetic result", &r)
		if i%5 == 0 {
			all = append(all, &r)
		}
	}
	for _, rs := range [][]*Result{nil, {}, {nil}, all} {
		want, _ := json.Marshal(rs)
		got, err := AppendResultsJSON([]byte("x"), rs)
		if err != nil || !bytes.Equal(got[1:], want) || got[0] != 'x' {
			t.Errorf("AppendResultsJSON of %d results: %v, output differs from encoding/json (%d vs %d bytes)", len(rs), err, len(got)-1, len(want))
		}
	}
}

// TestResultJSONRejectsNonFinite checks that NaN and ±Inf are errors, as
// they are for encoding/json.
func TestResultJSONRejectsNonFinite(t *testing.T) {
	for _, f := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		r := &Result{History: &History{TS: []float64{0, f}}}
		if _, err := json.Marshal(r); err == nil {
			t.Fatal("encoding/json accepted a non-finite float")
		}
		if _, err := r.AppendJSON(nil); err == nil {
			t.Errorf("AppendJSON accepted %v", f)
		}
	}
}

// jsonFloats straddle encoding/json's switches between 'f' and 'e' format
// and its exponent clean-up.
var jsonFloats = []float64{0, math.Copysign(0, -1), 5e-324, 2.2250738585072014e-308, 1e-300, 1.5e-9, 9.99999999e-7,
	1e-6, 1.0000000000000002e-6, -1e-6, 1e-7, 0.1, 1, -1, 3, 123456789, 1e20, 9.999999999999999e20, 1e21, -1e21,
	1.7976931348623157e308, 1.0 / 3, math.Pi, 273.15, 6.02214076e23}

var jsonStrings = []string{"", "continuum", "transition", "free molecular", "a \"quoted\" word", `back\slash`,
	"<b>&amp;</b>", "a < b", "c > d", "e & f", "µm and °C", "line\nbreak\ttab", "\u2028\u2029", "bad \xff utf-8", "\x00\x1f", "~\x7f"}

// fillRandom sets v and everything below it to seeded values.
func fillRandom(rng *rand.Rand, v reflect.Value, depth int) {
	switch v.Kind() {
	case reflect.Float64:
		if rng.IntN(3) == 0 {
			v.SetFloat(jsonFloats[rng.IntN(len(jsonFloats))])
		} else {
			v.SetFloat((rng.Float64() - 0.3) * math.Pow(10, float64(rng.IntN(60)-30)))
		}
	case reflect.Float32:
		v.SetFloat(float64(float32(rng.Float64() * 100)))
	case reflect.Int, reflect.Int64, reflect.Int32:
		v.SetInt(int64(rng.IntN(2000) - 1000))
	case reflect.Bool:
		v.SetBool(rng.IntN(2) == 0)
	case reflect.String:
		v.SetString(jsonStrings[rng.IntN(len(jsonStrings))])
	case reflect.Pointer:
		if depth > 4 || rng.IntN(4) == 0 {
			return // nil
		}
		p := reflect.New(v.Type().Elem())
		fillRandom(rng, p.Elem(), depth+1)
		v.Set(p)
	case reflect.Slice:
		switch n := rng.IntN(6); {
		case n == 0 || depth > 4:
			return // nil
		default:
			s := reflect.MakeSlice(v.Type(), n-1, n-1) // empty or filled
			for i := range s.Len() {
				fillRandom(rng, s.Index(i), depth+1)
			}
			v.Set(s)
		}
	case reflect.Struct:
		for i := range v.NumField() {
			if v.Type().Field(i).IsExported() {
				fillRandom(rng, v.Field(i), depth+1)
			}
		}
	}
}

var sinkJSON []byte

// BenchmarkResultJSON encodes the four 60-bin benchmark results (201
// history points each) with encoding/json and with AppendResultsJSON.
func BenchmarkResultJSON(b *testing.B) {
	var rs []*Result
	for _, bc := range benchCases() {
		r, err := Evaluate(bc.c)
		if err != nil {
			b.Fatal(err)
		}
		rs = append(rs, r)
	}
	b.Run("encoding-json", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			out, err := json.Marshal(rs)
			if err != nil {
				b.Fatal(err)
			}
			sinkJSON = out
		}
	})
	b.Run("append", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			out, err := AppendResultsJSON(nil, rs)
			if err != nil {
				b.Fatal(err)
			}
			sinkJSON = out
		}
	})
}
