package server

import (
	"context"
	"encoding/json"
	"fmt"
	"io"
	"net/http"
	"net/url"
	"regexp"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/store"
)

// goTypeName matches what encoding/json's own messages leak into an
// answer: package-qualified type names, slice and map types, Go kinds.
var goTypeName = regexp.MustCompile(`\b[a-z]+\.[A-Z]\w+|\[\]|map\[|float64|int64|struct`)

type apiAnswer struct {
	status int
	raw    string
	Error  string
	Fields []struct{ Field, Message, Value string }
}

func apiCall(t *testing.T, method, u, body string) apiAnswer {
	t.Helper()
	req, err := http.NewRequest(method, u, strings.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	req.Header.Set("Content-Type", "application/json")
	resp, err := http.DefaultClient.Do(req)
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	data, _ := io.ReadAll(resp.Body)
	a := apiAnswer{status: resp.StatusCode, raw: string(data)}
	json.Unmarshal(data, &a)
	return a
}

// exportedBundle is the demo library as /api/export writes it, decoded
// loosely so a test can spoil one part.
func exportedBundle(t *testing.T, base string) map[string]any {
	t.Helper()
	resp, err := http.Get(base + "/api/export")
	if err != nil {
		t.Fatal(err)
	}
	defer resp.Body.Close()
	var b map[string]any
	if err := json.NewDecoder(resp.Body).Decode(&b); err != nil {
		t.Fatal(err)
	}
	return b
}

func spoilBundle(t *testing.T, base string, spoil func(cases []any)) string {
	t.Helper()
	b := exportedBundle(t, base)
	spoil(b["cases"].([]any))
	data, err := json.Marshal(b)
	if err != nil {
		t.Fatal(err)
	}
	return string(data)
}

// Every JSON entry point of the server answers bad input with 400, the
// field named by its full path with list indexes, the kind of value wanted
// in plain words, and no Go type name anywhere in the answer.
func TestJSONErrorsNameTheFieldAtEveryEntry(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	before, err := st.CountCases(ctx)
	if err != nil {
		t.Fatal(err)
	}
	withGas := func(gas string) string {
		return strings.Replace(apiCase, `"gas":{"pressure_pa":101325,"temperature_k":298.15}`, `"gas":`+gas, 1)
	}
	atomizeBody := `{"family":"pressure-swirl","inputs":{"delta_p_pa":1e6,"orifice_diameter_m":1e-3,"mass_flow_kg_s":0.01},"fluid":"water"}`
	for _, c := range []struct {
		method, path, body, field, message string
	}{
		{"POST", "/api/evaluate", withGas(`{"pressure_pa":101325,"temperature_k":298.15,"foo":1}`), "gas.foo", "unknown field"},
		{"POST", "/api/evaluate", "[" + apiCase + "," + withGas(`{"pressure_pa":"1 bar","temperature_k":298.15}`) + "]", "[1].gas.pressure_pa", "must be a number"},
		{"POST", "/api/evaluate", strings.Replace(apiCase, `"bins":6`, `"bins":6.5`, 1), "distribution.bins", "must be a whole number"},
		// An array goes on past a case it cannot compute (its error stands
		// in its place); strict=1 answers with the first one.
		{"POST", "/api/evaluate?strict=1", "[" + apiCase + "," + withGas(`{"pressure_pa":0,"temperature_k":298.15}`) + "]", "[1].gas.pressure_pa", "must be between"},
		{"POST", "/api/evaluate", strings.Replace(apiCase, `"x_m":5e-5`, `"x_m":[5e-5]`, 1), "distribution.x_m", "must be a number"},
		{"POST", "/api/evaluate", `[]`, "file", "is an empty list"},
		{"POST", "/api/evaluate", ` [ ]`, "file", "is an empty list"},
		{"POST", "/api/evaluate", `{"name":`, "file", "ends too early"},
		{"POST", "/api/evaluate", apiCase + `{}`, "file", "has more after the end"},
		{"POST", "/api/cases", strings.Replace(apiCase, `"model"`, `"modle"`, 1), "distribution.modle", "unknown field"},
		{"POST", "/api/cases", strings.Replace(apiCase, `"name":"csrf check"`, `"name":["a"]`, 1), "name", "must be text"},
		{"POST", "/api/cases", `"a case"`, "file", "must be an object"},
		{"PUT", "/api/cases/1", `{"revision":1,"case":` + withGas(`{"pressure_pa":101325,"temperature_k":298.15,"foo":1}`) + `}`, "case.gas.foo", "unknown field"},
		{"PUT", "/api/cases/1", `{"revision":1,"case":` + strings.Replace(apiCase, `"q":2.5`, `"q":"2.5"`, 1) + `}`, "case.distribution.q", "must be a number"},
		{"PUT", "/api/cases/1", `{"revision":"1","case":` + apiCase + `}`, "revision", "must be a whole number"},
		{"PUT", "/api/cases/1", `{"revison":1,"case":` + apiCase + `}`, "revison", "unknown field"},
		{"PUT", "/api/cases/1", `{"revision":1,"case":[]}`, "case", "must be an object"},
		{"PUT", "/api/cases/1", `{"revision":1}`, "case", "give the case"},
		{"POST", "/api/atomize", strings.Replace(atomizeBody, `"mass_flow_kg_s":0.01`, `"mass_flow_kg_s":"0.01"`, 1), "inputs.mass_flow_kg_s", "must be a number"},
		{"POST", "/api/atomize", strings.Replace(atomizeBody, `"family"`, `"famliy"`, 1), "famliy", "unknown field"},
		{"POST", "/api/atomize", strings.Replace(atomizeBody, `"fluid":"water"`, `"fluid":"water","gas":{"pressure":1}`, 1), "gas.pressure", "unknown field"},
		{"POST", "/api/atomize", strings.Replace(atomizeBody, `"fluid":"water"`, `"fluid":"mine","custom_fluid":{"id":"mine","vapor_pressure":{"form":1}}`, 1), "custom_fluid.vapor_pressure.form", "must be text"},
		{"POST", "/api/atomize", strings.Replace(atomizeBody, `"fluid":"water"`, `"properties":{"liquid_density_kg_m3":true}`, 1), "properties.liquid_density_kg_m3", "must be a number"},
		{"POST", "/api/atomize", `[` + atomizeBody + `]`, "request", "must be an object"},
		{"POST", "/api/atomize/solve", strings.Replace(atomizeBody, `"fluid":"water"`, `"fluid":"water","unknown":"delta_p_pa","target":{"smd":5e-5}`, 1), "target.smd", "unknown field"},
		{"POST", "/api/import", spoilBundle(t, ts.URL, func(cs []any) { cs[0].(map[string]any)["uid"] = 1 }), "cases[0].uid", "must be text"},
		{"POST", "/api/import", spoilBundle(t, ts.URL, func(cs []any) {
			cs[1].(map[string]any)["case"].(map[string]any)["gas"].(map[string]any)["foo"] = 1
		}), "cases[1].case.gas.foo", "unknown field"},
		{"POST", "/api/import", spoilBundle(t, ts.URL, func(cs []any) {
			cs[2].(map[string]any)["case"].(map[string]any)["gas"].(map[string]any)["pressure_pa"] = 0
		}), "cases[2].case.gas.pressure_pa", "must be between"},
		{"POST", "/api/import", spoilBundle(t, ts.URL, func(cs []any) { cs[0].(map[string]any)["tags"] = "x" }), "cases[0].tags", "must be a list"},
		{"POST", "/api/import", `{"format":"fogbench-bundle/1","cases":{}}`, "cases", "must be a list"},
	} {
		a := apiCall(t, c.method, ts.URL+c.path, c.body)
		if a.status != http.StatusBadRequest || len(a.Fields) == 0 {
			t.Errorf("%s %s (%s): status %d, %s", c.method, c.path, c.field, a.status, a.raw)
			continue
		}
		if f := a.Fields[0]; f.Field != c.field || !strings.Contains(f.Message, c.message) {
			t.Errorf("%s %s: named %q %q, want %q %q", c.method, c.path, f.Field, f.Message, c.field, c.message)
		}
		if m := goTypeName.FindString(a.raw); m != "" {
			t.Errorf("%s %s (%s): answer names a Go type (%q): %s", c.method, c.path, c.field, m, a.raw)
		}
	}
	if after, _ := st.CountCases(ctx); after != before {
		t.Fatalf("bad input changed the library: %d cases, was %d", after, before)
	}
}

// Case names are one line of UTF-8 text through the API, the form and a
// bundle import; nothing is stored when one is refused.
func TestCaseNamesRefuseControlCharactersEverywhere(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	before, _ := st.CountCases(ctx)
	for _, name := range []string{"line\\nbreak", "cr\\rhere", "nul\\u0000byte", "bad \xff byte"} {
		body := strings.Replace(apiCase, `"name":"csrf check"`, `"name":"`+name+`"`, 1)
		a := apiCall(t, "POST", ts.URL+"/api/cases", body)
		if a.status != http.StatusBadRequest || len(a.Fields) == 0 || a.Fields[0].Field != "name" {
			t.Errorf("API name %q: status %d, %s", name, a.status, a.raw)
		}
		a = apiCall(t, "PUT", ts.URL+"/api/cases/1", `{"revision":1,"case":`+body+`}`)
		if a.status != http.StatusBadRequest || len(a.Fields) == 0 || a.Fields[0].Field != "case.name" {
			t.Errorf("API update name %q: status %d, %s", name, a.status, a.raw)
		}
		b := spoilBundle(t, ts.URL, func(cs []any) {
			cs[0].(map[string]any)["case"].(map[string]any)["name"] = "x"
		})
		b = strings.Replace(b, `"name":"x"`, `"name":"`+name+`"`, 1)
		a = apiCall(t, "POST", ts.URL+"/api/import", b)
		if a.status != http.StatusBadRequest || len(a.Fields) == 0 || a.Fields[0].Field != "cases[0].case.name" {
			t.Errorf("bundle name %q: status %d, %s", name, a.status, a.raw)
		}
	}
	c := client(t)
	for _, name := range []string{"line\nbreak", "cr\rhere", "nul\x00byte", "bad \xff byte"} {
		v := validForm()
		v.Set("name", name)
		resp := postForm(t, c, ts.URL+"/cases", v)
		page, _ := io.ReadAll(resp.Body)
		resp.Body.Close()
		if resp.StatusCode != http.StatusUnprocessableEntity || !strings.Contains(string(page), `data-testid="error-name"`) {
			t.Errorf("form name %q: status %d, no message beside the name", name, resp.StatusCode)
		}
		resp = postForm(t, c, ts.URL+"/cases/1/rename", url.Values{"name": {name}, "revision": {"1"}, "back": {"/cases"}})
		doc, err := goquery.NewDocumentFromReader(resp.Body)
		resp.Body.Close()
		if err != nil {
			t.Fatal(err)
		}
		if resp.StatusCode != http.StatusBadRequest || doc.Find(`form[action="/cases/1/rename"] [data-testid=error-name]`).Length() != 1 {
			t.Errorf("rename to %q: status %d, no message beside the name", name, resp.StatusCode)
		}
	}
	if after, _ := st.CountCases(ctx); after != before {
		t.Fatalf("refused names changed the library: %d cases, was %d", after, before)
	}
	if rec, _ := st.GetCase(ctx, 1); rec.Revision != 1 {
		t.Fatalf("case 1 changed by a refused rename or update: revision %d", rec.Revision)
	}
}

// Tags are capped in number and length with a message, through the tags
// form and a bundle import; none is dropped silently.
func TestTagsAreCappedWithAMessage(t *testing.T) {
	ts, st := newTestServer(t)
	ctx := context.Background()
	orig, err := st.GetCase(ctx, 1)
	if err != nil {
		t.Fatal(err)
	}
	c := client(t)
	setTags := func(tags []string) (int, string) {
		resp := postForm(t, c, ts.URL+"/cases/1/tags", url.Values{"tags": {strings.Join(tags, ",")}, "back": {"/cases?sort=name"}})
		defer resp.Body.Close()
		page, _ := io.ReadAll(resp.Body)
		return resp.StatusCode, string(page)
	}
	many := make([]string, store.MaxTagsPerCase+1)
	for i := range many {
		many[i] = fmt.Sprintf("t%03d", i)
	}
	long := strings.Repeat("x", store.MaxTagChars+1)
	for _, tc := range []struct {
		tags    []string
		message string
	}{
		{many, "at most 50 tags per case"},
		{[]string{"ok", long}, "at most 40 characters"},
		{[]string{"a\x00b"}, "control characters"},
	} {
		code, page := setTags(tc.tags)
		if code != http.StatusBadRequest || !strings.Contains(page, tc.message) {
			t.Errorf("%d tags: status %d, want 400 saying %q", len(tc.tags), code, tc.message)
		}
		// The library page comes back with the row open, what was typed in
		// the field and the message beside it.
		doc, err := goquery.NewDocumentFromReader(strings.NewReader(page))
		if err != nil {
			t.Fatal(err)
		}
		row := doc.Find(`form[action="/cases/1/tags"]`)
		// (HTML shows a NUL as U+FFFD.)
		if got, _ := row.Find(`input[name=tags]`).Attr("value"); got != strings.ReplaceAll(strings.Join(tc.tags, ","), "\x00", "\ufffd") {
			t.Errorf("%d tags: the field shows %q, not what was typed", len(tc.tags), got)
		}
		if !strings.Contains(row.Find(`[data-testid=error-tags]`).Text(), tc.message) || row.Closest("details[open]").Length() != 1 {
			t.Errorf("%d tags: no message beside the open field", len(tc.tags))
		}
	}
	if rec, _ := st.GetCase(ctx, 1); strings.Join(rec.Tags, ",") != strings.Join(orig.Tags, ",") {
		t.Fatalf("refused tags changed the case's tags: %v, was %v", rec.Tags, orig.Tags)
	}
	if code, _ := setTags(append(many[:store.MaxTagsPerCase-1:store.MaxTagsPerCase-1], strings.Repeat("ü", store.MaxTagChars))); code != http.StatusSeeOther {
		t.Fatalf("50 tags of up to 40 characters: status %d", code)
	}
	if rec, _ := st.GetCase(ctx, 1); len(rec.Tags) != store.MaxTagsPerCase {
		t.Fatalf("stored %d tags, want %d", len(rec.Tags), store.MaxTagsPerCase)
	}
	for _, tags := range [][]string{many, {long}} {
		b := spoilBundle(t, ts.URL, func(cs []any) {
			list := make([]any, len(tags))
			for i, t := range tags {
				list[i] = t
			}
			cs[1].(map[string]any)["tags"] = list
		})
		a := apiCall(t, "POST", ts.URL+"/api/import", b)
		if a.status != http.StatusBadRequest || len(a.Fields) == 0 || a.Fields[0].Field != "cases[1].tags" {
			t.Errorf("bundle with %d tags: status %d, %s", len(tags), a.status, a.raw)
		}
	}
}
