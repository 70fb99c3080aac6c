package store

import (
	"bytes"
	"context"
	"encoding/json"
	"regexp"
	"strings"
	"testing"

	"fogbench/calc"
)

// A bad bundle is named by the full path of the first bad field, with the
// case's index, in plain words, whatever reads it (DecodeBundle is what
// /api/import and the import page call): never "cases.uid", "bundle" for a
// field, or a Go type name.
func TestDecodeBundleNamesTheFieldByItsPath(t *testing.T) {
	goTypeName := regexp.MustCompile(`\b[a-z]+\.[A-Z]\w+|\[\]|map\[|float64|int64|struct`)
	s, err := Open(context.Background(), t.TempDir()+"/lib.db")
	if err != nil {
		t.Fatal(err)
	}
	defer s.Close()
	if _, err := s.SeedDemo(context.Background()); err != nil {
		t.Fatal(err)
	}
	good := exportBytes(t, s, ExportOptions{})
	spoil := func(f func(cases []any)) []byte {
		var b map[string]any
		if err := json.Unmarshal(good, &b); err != nil {
			t.Fatal(err)
		}
		f(b["cases"].([]any))
		data, _ := json.Marshal(b)
		return data
	}
	caseOf := func(cs []any, i int) map[string]any { return cs[i].(map[string]any)["case"].(map[string]any) }
	many := make([]any, MaxTagsPerCase+1)
	for i := range many {
		many[i] = strings.Repeat("t", 3) + string(rune('a'+i%26)) + string(rune('a'+i/26))
	}
	for _, c := range []struct {
		name    string
		data    []byte
		field   string
		message string
	}{
		{"uid a number", spoil(func(cs []any) { cs[1].(map[string]any)["uid"] = 7 }), "cases[1].uid", "must be text"},
		{"revision text", spoil(func(cs []any) { cs[0].(map[string]any)["revision"] = "2" }), "cases[0].revision", "must be a whole number"},
		{"tags not a list", spoil(func(cs []any) { cs[2].(map[string]any)["tags"] = map[string]any{} }), "cases[2].tags", "must be a list"},
		{"a tag not text", spoil(func(cs []any) { cs[0].(map[string]any)["tags"] = []any{"a", 1} }), "cases[0].tags[1]", "must be text"},
		{"too many tags", spoil(func(cs []any) { cs[1].(map[string]any)["tags"] = many }), "cases[1].tags", "at most 50 tags"},
		{"tag too long", spoil(func(cs []any) { cs[1].(map[string]any)["tags"] = []any{strings.Repeat("x", 41)} }), "cases[1].tags", "at most 40 characters"},
		{"unknown case field", spoil(func(cs []any) { caseOf(cs, 1)["gas"].(map[string]any)["foo"] = 1 }), "cases[1].case.gas.foo", "unknown field"},
		{"case field wrong kind", spoil(func(cs []any) { caseOf(cs, 2)["distribution"].(map[string]any)["bins"] = "40" }), "cases[2].case.distribution.bins", "must be a whole number"},
		{"case invalid", spoil(func(cs []any) { caseOf(cs, 0)["gas"].(map[string]any)["pressure_pa"] = 1 }), "cases[0].case.gas.pressure_pa", "must be between"},
		{"name with a line break", spoil(func(cs []any) { caseOf(cs, 0)["name"] = "a\nb" }), "cases[0].case.name", "control characters"},
		{"cases an object", []byte(`{"format":"fogbench-bundle/1","case_count":0,"cases":{}}`), "cases", "must be a list"},
		{"unknown top field", bytes.Replace(good, []byte(`"cases":`), []byte(`"extra": 1, "cases":`), 1), "extra", "unknown field"},
		{"bad UTF-8", bytes.Replace(good, []byte(`"name": "`), []byte("\"name\": \"\xff"), 1), "cases[0].case.name", "not valid UTF-8"},
		{"truncated", good[:len(good)/2], "bundle", "ends too early"},
	} {
		_, err := DecodeBundle(bytes.NewReader(c.data))
		fes := calc.FieldErrors(err)
		if len(fes) == 0 || fes[0].Field != c.field || !strings.Contains(fes[0].Message, c.message) {
			t.Errorf("%s: got %v, want %s: …%s…", c.name, err, c.field, c.message)
			continue
		}
		if m := goTypeName.FindString(err.Error()); m != "" {
			t.Errorf("%s: message names a Go type (%q): %v", c.name, m, err)
		}
	}
}
