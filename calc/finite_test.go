package calc

import (
	"fmt"
	"math"
	"reflect"
	"strings"
	"testing"
)

// floatLeaf is one float64 reachable from a Result, with its JSON path.
type floatLeaf struct {
	path string
	v    reflect.Value
}

// fillAll sets every pointer in v to a fresh value, every slice to two
// elements and every float64 to 1, so that every float field of the type
// exists somewhere in the value.
func fillAll(v reflect.Value) {
	switch v.Kind() {
	case reflect.Float64:
		v.SetFloat(1)
	case reflect.Pointer:
		if v.IsNil() {
			v.Set(reflect.New(v.Type().Elem()))
		}
		fillAll(v.Elem())
	case reflect.Struct:
		for i := range v.NumField() {
			if v.Type().Field(i).IsExported() {
				fillAll(v.Field(i))
			}
		}
	case reflect.Slice:
		v.Set(reflect.MakeSlice(v.Type(), 2, 2))
		for i := range v.Len() {
			fillAll(v.Index(i))
		}
	case reflect.Map:
		if v.Type().Elem().Kind() == reflect.Float64 {
			v.Set(reflect.MakeMap(v.Type()))
			v.SetMapIndex(reflect.ValueOf("k").Convert(v.Type().Key()), reflect.ValueOf(1.0))
		}
	}
}

// leaves lists every float64 in v with the JSON path the guard reports,
// walking the type by reflection: an oracle independent of nonFinite's
// field-by-field list.
func leaves(v reflect.Value, path string, out *[]floatLeaf) {
	switch v.Kind() {
	case reflect.Float32, reflect.Float64:
		*out = append(*out, floatLeaf{strings.TrimPrefix(path, "."), v})
	case reflect.Pointer, reflect.Interface:
		if !v.IsNil() {
			leaves(v.Elem(), path, out)
		}
	case reflect.Struct:
		t := v.Type()
		for i := range t.NumField() {
			f := t.Field(i)
			if !f.IsExported() {
				continue
			}
			name, _, _ := strings.Cut(f.Tag.Get("json"), ",")
			if name == "-" {
				continue
			}
			if name == "" {
				name = f.Name
			}
			leaves(v.Field(i), path+"."+name, out)
		}
	case reflect.Slice, reflect.Array:
		for i := range v.Len() {
			leaves(v.Index(i), fmt.Sprintf("%s[%d]", path, i), out)
		}
	case reflect.Map:
		if v.Len() > 0 {
			panic("the finite guard's test does not handle maps of numbers: add them to nonFinite and here")
		}
	}
}

// Every float64 that a Result can carry, in every nested struct, slice and
// optional pointer, is caught by the guard at its JSON path when it is NaN,
// +Inf or −Inf.
func TestNonFiniteCoversEveryField(t *testing.T) {
	r := &Result{}
	fillAll(reflect.ValueOf(r).Elem())
	if p := nonFinite(r); p != "" {
		t.Fatalf("finite result reported at %s", p)
	}
	var ls []floatLeaf
	leaves(reflect.ValueOf(r).Elem(), "", &ls)
	if len(ls) < 80 {
		t.Fatalf("only %d float fields found; the oracle lost its way", len(ls))
	}
	for _, l := range ls {
		for _, bad := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
			l.v.SetFloat(bad)
			want := fmt.Sprintf("%s = %g", l.path, bad)
			if got := nonFinite(r); got != want {
				t.Errorf("%s set to %g: guard says %q, want %q", l.path, bad, got, want)
			}
			l.v.SetFloat(1)
		}
	}
	if p := nonFinite(nil); p != "" {
		t.Errorf("nil result reported at %s", p)
	}
}

// An evaluated result passes the guard and a number spoiled afterwards is
// refused by name.
func TestNonFiniteOnEvaluatedCase(t *testing.T) {
	k := benchCases()[0]
	r, err := Evaluate(k.c)
	if err != nil {
		t.Fatal(err)
	}
	if p := nonFinite(r); p != "" {
		t.Fatalf("evaluated result reported at %s", p)
	}
	r.Bins[7].KelvinRatio = math.NaN()
	if got, want := nonFinite(r), "bins[7].kelvin_ratio = NaN"; got != want {
		t.Fatalf("got %q, want %q", got, want)
	}
}

func BenchmarkNonFinite(b *testing.B) {
	r, err := Evaluate(benchCases()[0].c)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		sinkString = nonFinite(r)
	}
}

var sinkString string
