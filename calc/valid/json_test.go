package valid

import (
	"bytes"
	"encoding/json"
	"errors"
	"io"
	"reflect"
	"regexp"
	"strings"
	"testing"
	"unicode/utf8"
)

type jsonGas struct {
	PressurePa float64  `json:"pressure_pa"`
	Vapor      *float64 `json:"vapor_mole_fraction,omitempty"`
}

type jsonCase struct {
	Name   string             `json:"name"`
	Bins   int                `json:"bins,omitempty"`
	Gas    jsonGas            `json:"gas"`
	Inputs map[string]float64 `json:"inputs,omitempty"`
	Edges  []float64          `json:"edges_m,omitempty"`
	Off    bool               `json:"no_transition,omitempty"`
	Raw    json.RawMessage    `json:"case,omitempty"`
	//lint:ignore U1000 an unexported field, which a document cannot set: "hidden" in JSON is an unknown field
	hidden int
}

type jsonBundle struct {
	Cases []jsonCase `json:"cases"`
}

// goTypeName matches what encoding/json's own messages leak: package-
// qualified type names, slice and map types, Go kind names.
var goTypeName = regexp.MustCompile(`\b[a-z]+\.[A-Z]\w+|\[\]|map\[|float64|int64|struct`)

func TestDecodeJSONNamesTheFieldInPlainWords(t *testing.T) {
	cases := []struct {
		in, field, message, value string
	}{
		{`{"cases":[{"name":"a"},{"gas":{"foo":1}}]}`, "cases[1].gas.foo", "unknown field", ""},
		{`{"cases":[{"uid":1}]}`, "cases[0].uid", "unknown field", ""},
		{`{"cases":[{"name":1}]}`, "cases[0].name", "must be text", "1"},
		{`{"cases":[{"gas":{"pressure_pa":"high"}}]}`, "cases[0].gas.pressure_pa", "must be a number", `"high"`},
		{`{"cases":[{"inputs":{"d_m":[1]}}]}`, "cases[0].inputs.d_m", "must be a number", "a list"},
		{`{"cases":[{"inputs":[]}]}`, "cases[0].inputs", "must be an object", "a list"},
		{`{"cases":[{"edges_m":[1,2,"x"]}]}`, "cases[0].edges_m[2]", "must be a number", `"x"`},
		{`{"cases":[{"edges_m":{}}]}`, "cases[0].edges_m", "must be a list", "an object"},
		{`{"cases":"x"}`, "cases", "must be a list", `"x"`},
		{`{"cases":[{"bins":1.5}]}`, "cases[0].bins", "must be a whole number", "1.5"},
		{`{"cases":[{"bins":100000000000000000000}]}`, "cases[0].bins", "too large a whole number", "100000000000000000000"},
		{`{"cases":[{"bins":1e3}]}`, "cases[0].bins", "must be a whole number", "1e3"},
		{`{"cases":[{"gas":{"pressure_pa":1e999}}]}`, "cases[0].gas.pressure_pa", "too large a number", "1e999"},
		{`{"cases":[{"no_transition":"yes"}]}`, "cases[0].no_transition", "must be true or false", `"yes"`},
		{`{"cases":[{"gas":{"vapor_mole_fraction":true}}]}`, "cases[0].gas.vapor_mole_fraction", "must be a number", "true"},
		{`{"cases":[{"name":"a` + "\xff" + `b"}]}`, "cases[0].name", "not valid UTF-8", ""},
		{`{"cases":[{"case":{"x":["` + "\xc3" + `"]}}]}`, "cases[0].case.x[0]", "not valid UTF-8", ""},
		{`{"cases":[{"name":NaN}]}`, "cases[0].name", "not valid JSON at line 1, column 19", ""},
		{"{\"cases\":[\n {\"name\":\"a\",}]}", "cases[0]", "not valid JSON at line 2", ""},
		{`{"cases":[{"name":"a"}`, "bundle", "ends too early", ""},
		{``, "bundle", "is empty", ""},
		{`[]`, "bundle", "must be an object", "a list"},
		{`{"cases":[]} {}`, "bundle", "has more after the end", ""},
		{`{"cases":[]} x`, "bundle", "has more after the end", ""},
		{`{"cases":[{"hidden":1}]}`, "cases[0].hidden", "unknown field", ""},
	}
	for _, c := range cases {
		var b jsonBundle
		err := DecodeJSON([]byte(c.in), &b, "bundle")
		var fe *FieldError
		if !errors.As(err, &fe) {
			t.Errorf("%q: got %v, want a field error", c.in, err)
			continue
		}
		if fe.Field != c.field || !strings.Contains(fe.Message, c.message) || fe.Value != c.value {
			t.Errorf("%q:\n got %q %q (value %q)\nwant %q %q (value %q)", c.in, fe.Field, fe.Message, fe.Value, c.field, c.message, c.value)
		}
		if goTypeName.MatchString(fe.Error()) {
			t.Errorf("%q: message names a Go type: %s", c.in, fe)
		}
	}
}

func TestDecodeJSONAcceptsWhatEncodingJSONAccepts(t *testing.T) {
	in := `{"cases":[{"NAME":"a","gas":{"pressure_pa":1e5,"vapor_mole_fraction":null},"inputs":{"x":1},"edges_m":[1,2],"case":{"any":[1,"é"]}}]}`
	var b jsonBundle
	if err := DecodeJSON([]byte(in), &b, "bundle"); err != nil {
		t.Fatal(err)
	}
	if len(b.Cases) != 1 || b.Cases[0].Name != "a" || b.Cases[0].Gas.PressurePa != 1e5 || string(b.Cases[0].Raw) != `{"any":[1,"é"]}` {
		t.Fatalf("decoded %+v", b)
	}
}

// The fallback, for an error the walk does not find, still names no Go type.
func TestJSONErrorFallbackNamesNoGoType(t *testing.T) {
	var b jsonBundle
	err := json.Unmarshal([]byte(`{"cases":"x"}`), &b)
	fe := ExplainJSONError(err, "bundle")
	if fe.Field != "cases" || fe.Message != "must be a list" || goTypeName.MatchString(fe.Error()) {
		t.Fatalf("fallback: %v", fe)
	}
	if fe := ExplainJSONError(errors.New("json: cannot unmarshal into Go value of type main.x"), "file"); goTypeName.MatchString(fe.Error()) {
		t.Fatalf("fallback: %v", fe)
	}
}

func TestWithinPrefixesEveryField(t *testing.T) {
	err := Within("[2]", Errors{{Field: "gas.pressure_pa", Message: "m"}, {Field: "", Message: "n"}})
	var es Errors
	if !errors.As(err, &es) || es[0].Field != "[2].gas.pressure_pa" || es[1].Field != "[2]" {
		t.Fatalf("%v", err)
	}
	var fe *FieldError
	if !errors.As(Within("cases[0].case", &FieldError{Field: "name"}), &fe) || fe.Field != "cases[0].case.name" {
		t.Fatalf("%v", fe)
	}
	if e := errors.New("x"); Within("a", e) != e {
		t.Fatal("a foreign error must pass unchanged")
	}
}

// DecodeJSON accepts exactly what a strict encoding/json decode accepts
// (plus: UTF-8 only, one value), and every refusal is found by the walk,
// not the fallback, and names no Go type.
func FuzzDecodeJSON(f *testing.F) {
	for _, s := range []string{
		`{"cases":[{"name":"a","gas":{"pressure_pa":1e5},"inputs":{"x":1},"edges_m":[1,2],"case":{"any":[1]}}]}`,
		`{"cases":[{"gas":{"foo":1}}]}`, `{"cases":[{"bins":1.5}]}`, `{"cases":"x"}`, `[]`, `{"cases":[]} {}`,
		"{\"cases\":[{\"name\":\"\xff\"}]}", `{"CASES":[{"Name":"a","BINS":2}]}`, `{"cases":[{"bins":-0}]}`, `null`,
		`{"cases":[null,{"gas":null}]}`, `{"cases":[{"no_transition":null,"edges_m":[null]}]}`,
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		var got jsonBundle
		err := DecodeJSON(data, &got, "bundle")
		var want jsonBundle
		dec := json.NewDecoder(bytes.NewReader(data))
		dec.DisallowUnknownFields()
		jerr := dec.Decode(&want)
		if jerr == nil {
			if _, terr := dec.Token(); terr != io.EOF || !utf8.Valid(data) {
				jerr = errNotClean
			}
		}
		if (err == nil) != (jerr == nil) {
			t.Fatalf("%q: DecodeJSON %v, encoding/json %v", data, err, jerr)
		}
		if err == nil {
			return
		}
		var fe *FieldError
		if !errors.As(err, &fe) || goTypeName.MatchString(fe.Message) {
			t.Fatalf("%q: %v", data, err)
		}
		w := &jsonWalker{data: data, dec: json.NewDecoder(bytes.NewReader(data)), doc: "bundle"}
		w.dec.UseNumber()
		if w.document(reflect.TypeOf(&got)) == nil {
			t.Fatalf("%q: the walk found nothing; encoding/json said %v", data, jerr)
		}
	})
}
