package server

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"net/http"
	"net/url"
	"reflect"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"

	"fogbench/calc"
	"fogbench/calc/atomize"
	"fogbench/calc/fluid"
	"fogbench/calc/sizedist"
	"fogbench/store"
)

// The case form must keep every field of the case file. These tests find
// the fields by reflection over calc.Case, so a field added later is
// covered without editing them: for each field (and nested field, and each
// atomizer input), a valid case that sets it to a non-default value is
// stored, opened in the edit form, and the form's inputs are submitted as a
// browser would; the case must come back identical (canonical JSON).

// caseLeaf is one field of calc.Case that holds a value: its dotted path in
// the case file and the struct fields leading to it.
type caseLeaf struct {
	path  string
	index [][]int // field index per struct level; pointers to structs are followed
}

// caseLeaves lists every field of t (calc.Case) that holds a value, in the
// file's order, following nested structs and pointers to structs.
func caseLeaves(t reflect.Type, prefix string, index [][]int) []caseLeaf {
	var out []caseLeaf
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
		path := prefix + name
		idx := append(slices.Clone(index), f.Index)
		ft := f.Type
		if ft.Kind() == reflect.Pointer && ft.Elem().Kind() == reflect.Struct {
			ft = ft.Elem()
		}
		if ft.Kind() == reflect.Struct {
			out = append(out, caseLeaves(ft, path+".", idx)...)
			continue
		}
		out = append(out, caseLeaf{path: path, index: idx})
	}
	return out
}

// field returns the settable value of the leaf in c, allocating the structs
// on the way when alloc is set; ok is false when a pointer on the way is nil.
func (l caseLeaf) field(c *calc.Case, alloc bool) (reflect.Value, bool) {
	v := reflect.ValueOf(c).Elem()
	for _, idx := range l.index {
		if v.Kind() == reflect.Pointer {
			if v.IsNil() {
				if !alloc {
					return reflect.Value{}, false
				}
				v.Set(reflect.New(v.Type().Elem()))
			}
			v = v.Elem()
		}
		v = v.FieldByIndex(idx)
	}
	return v, true
}

// caseCopy is a deep copy through the case file.
func caseCopy(t *testing.T, c calc.Case) calc.Case {
	t.Helper()
	b, err := json.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	out, err := calc.DecodeOne(b)
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// canonical is the case file as the library stores it, compact.
func canonical(t *testing.T, c calc.Case) string {
	t.Helper()
	c.Normalize()
	b, err := json.Marshal(c)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// flatLeaves maps each leaf of a case file's JSON (dotted path) to its
// compact value; arrays are leaves.
func flatLeaves(t *testing.T, doc string) map[string]any {
	t.Helper()
	dec := json.NewDecoder(strings.NewReader(doc))
	dec.UseNumber()
	var m map[string]any
	if err := dec.Decode(&m); err != nil {
		t.Fatal(err)
	}
	out := map[string]any{}
	var walk func(prefix string, m map[string]any)
	walk = func(prefix string, m map[string]any) {
		for k, v := range m {
			if sub, ok := v.(map[string]any); ok {
				walk(prefix+k+".", sub)
				continue
			}
			out[prefix+k] = v
		}
	}
	walk("", m)
	return out
}

// Candidate values, tried in order until one gives a valid case that keeps
// the field: nudges of a value the base case already has (with digits that
// no display rounding keeps), numbers over the decades for an unset one,
// the words the case file knows, and free text.
var (
	unsetNumbers = []float64{312.3456789, 345.678912, 0.123456789, 0.56789123, 1.23456789, 2.3456789, 12.3456789,
		1.23456789e-5, 3.456789e-5, 2.3456789e-4, 3.456789e-3, 1234.56789, 123456.789, 2.3456789e6}
	nudges    = []float64{1.00123456789, 0.99876543211, 1.0123456789, 0.987654321, 1.3456789, 0.7654321}
	caseWords = []string{"transient", "steady", "nitrogen", "n-heptane", "frossling", "abramzon-sirignano",
		"none", "ranz-marshall", "linear", "number", "volume"}
	freeText = "Edited: Δp ≈ 3 bar, “quoted” & <b>not bold</b> ✓"
	// notesText spans lines: browsers send a textarea's line breaks as CRLF.
	notesText = "First line of the notes\nsecond line — 30 °C\n\nafter a blank line"
)

// candidates are the values to try for a field that now holds cur.
func candidates(path string, cur reflect.Value) []reflect.Value {
	var out []reflect.Value
	floats := func(x float64, typ reflect.Type) []reflect.Value {
		var vs []float64
		if x != 0 {
			for _, n := range nudges {
				vs = append(vs, x*n)
			}
		}
		vs = append(vs, unsetNumbers...)
		var out []reflect.Value
		for _, v := range vs {
			out = append(out, reflect.ValueOf(v).Convert(typ))
		}
		return out
	}
	switch cur.Kind() {
	case reflect.Float32, reflect.Float64:
		out = floats(cur.Float(), cur.Type())
	case reflect.Pointer:
		x := 0.0
		if !cur.IsNil() {
			x = cur.Elem().Float()
		}
		for _, v := range floats(x, cur.Type().Elem()) {
			p := reflect.New(cur.Type().Elem())
			p.Elem().Set(v)
			out = append(out, p)
		}
	case reflect.Int, reflect.Int64, reflect.Int32:
		for _, n := range []int64{cur.Int() + 7, 17, 33, 64, 3} {
			out = append(out, reflect.ValueOf(n).Convert(cur.Type()))
		}
	case reflect.Bool:
		out = append(out, reflect.ValueOf(!cur.Bool()))
	case reflect.String:
		if path == "notes" {
			out = append(out, reflect.ValueOf(notesText))
		}
		for _, w := range caseWords {
			out = append(out, reflect.ValueOf(w))
		}
		out = append(out, reflect.ValueOf(freeText))
		if s := cur.String(); s != "" {
			out = append(out, reflect.ValueOf(s+" (edited)"))
		}
	case reflect.Slice:
		if cur.Len() == 0 || cur.Type().Elem().Kind() != reflect.Float64 {
			break
		}
		xs := cur.Interface().([]float64)
		scaled, reversed, percent := slices.Clone(xs), slices.Clone(xs), slices.Clone(xs)
		for i := range scaled {
			scaled[i] *= 1.00123456789
			percent[i] *= 100
		}
		slices.Reverse(reversed)
		out = append(out, reflect.ValueOf(scaled), reflect.ValueOf(reversed), reflect.ValueOf(percent))
	}
	// A candidate equal to the current value changes nothing.
	return slices.DeleteFunc(out, func(v reflect.Value) bool {
		return reflect.DeepEqual(v.Interface(), cur.Interface())
	})
}

// roundTripBases are valid cases to set one field on: one per size model
// and atomizer family, a user liquid and transient heating. A field is set
// on the first base where its value is valid and kept (the distribution
// keeps only the parameters of its model).
func roundTripBases(t *testing.T) []calc.Case {
	t.Helper()
	gas := calc.Gas{ID: "air", PressurePa: 101325, TemperatureK: 320}
	named := func(name string, d calc.Distribution) calc.Case {
		d.Bins = 12
		return calc.Case{Format: calc.CaseFormat, Name: name, Fluid: "water", Gas: gas, Distribution: d}
	}
	bases := []calc.Case{
		named("rosin-rammler", calc.Distribution{Model: "rosin-rammler", XM: 40e-6, Q: 2.5}),
		named("log-normal", calc.Distribution{Model: "log-normal", MedianM: 30e-6, GSD: 1.6, Basis: "volume"}),
		named("upper-limit", calc.Distribution{Model: "upper-limit", DUpperM: 200e-6, Dv50M: 50e-6, Delta: 1}),
		named("nukiyama-tanasawa", calc.Distribution{Model: "nukiyama-tanasawa", ScaleM: 20e-6, P: 2, QNT: 1}),
		{Format: calc.CaseFormat, Name: "bins", Fluid: "water", Gas: gas, Distribution: calc.Distribution{Model: "bins",
			EdgesM: []float64{10e-6, 20e-6, 40e-6, 80e-6}, Fraction: []float64{0.2, 0.5, 0.3}, Basis: "volume"}},
	}
	// Per atomizer family and drop-size correlation (the default, then
	// each SMD correlation by name): the required inputs at their typical
	// values, then each optional input that keeps the case valid or that a
	// case still invalid may need.
	for _, f := range atomize.Families() {
		corrs := []string{""}
		for _, co := range f.Correlations {
			if strings.HasPrefix(co.Quantity, "SMD") {
				corrs = append(corrs, co.ID)
			}
		}
		for _, corr := range corrs {
			in := map[string]float64{}
			c := named("atomizer "+f.ID+" "+corr, calc.Distribution{Model: "atomizer", Family: f.ID, Correlation: corr, Inputs: in})
			// A nozzle takes its liquid at the supply temperature.
			supply := 293.15
			c.InjectionTemperatureK = &supply
			for _, info := range f.Inputs {
				if info.Required {
					in[info.Name] = info.Typical
				}
			}
			for _, info := range f.Inputs {
				if _, ok := in[info.Name]; ok {
					continue
				}
				wasValid := calc.Validate(c) == nil
				in[info.Name] = info.Typical
				if wasValid && calc.Validate(c) != nil {
					delete(in, info.Name)
				}
			}
			if err := calc.Validate(c); err != nil {
				t.Logf("atomizer family %s, correlation %q, at typical inputs is not a base: %v", f.ID, corr, err)
				continue
			}
			bases = append(bases, c)
		}
	}
	custom := named("user liquid", calc.Distribution{Model: "rosin-rammler", XM: 40e-6, Q: 2.5})
	custom.Fluid, custom.CustomFluid = "plant-solvent", plantSolvent()
	transient := named("transient", calc.Distribution{Model: "rosin-rammler", XM: 40e-6, Q: 2.5})
	tinj := 290.0
	transient.Heating, transient.InjectionTemperatureK = "transient", &tinj
	bases = append(bases, custom, transient)
	for _, b := range bases {
		if err := calc.Validate(b); err != nil {
			t.Fatalf("base case %q: %v", b.Name, err)
		}
	}
	return bases
}

// plantSolvent is the user liquid of docs/case-format.md.
func plantSolvent() *fluid.CustomSpec {
	return &fluid.CustomSpec{
		ID: "plant-solvent", Name: "Plant solvent", Reference: "supplier sheet 4",
		MolarMassKgMol: 0.100204, CriticalTemperatureK: 540.2, CriticalPressurePa: 2.74e6,
		CriticalVolumeM3Mol: 4.28e-4, NormalBoilingPointK: 371.55, MeltingPointK: 182.57, DiffusionVolume: 148.26,
		VaporPressure:      fluid.CorrelationSpec{Form: "dippr101", A: 87.829, B: -6996.4, C: -9.8802, D: 7.2099e-6, E: 2, TMinK: 182.57, TMaxK: 540.2},
		LiquidDensity:      fluid.CorrelationSpec{Form: "dippr105", A: 612.59, B: 0.26211, C: 540.2, D: 0.28141, TMinK: 182.57, TMaxK: 540.2},
		SurfaceTension:     fluid.CorrelationSpec{Form: "power", A: 0.0522, B: 1.24, TMinK: 183, TMaxK: 540},
		LiquidViscosity:    fluid.CorrelationSpec{Form: "constant", Value: 4e-4, TMinK: 250, TMaxK: 400},
		LatentHeat:         fluid.CorrelationSpec{Form: "dippr106", A: 50014, B: 0.38795, TMinK: 182.57, TMaxK: 540.2},
		LiquidHeatCapacity: fluid.CorrelationSpec{Form: "constant", Value: 2240, TMinK: 200, TMaxK: 400},
		VaporHeatCapacity:  fluid.CorrelationSpec{Form: "poling", A: 9.634, B: 0.004156, C: 1.5494e-4, D: -2.0066e-7, E: 7.77e-11, TMinK: 200, TMaxK: 1000},
	}
}

// roundTripCase is one field set on one base.
type roundTripCase struct {
	path string
	c    calc.Case
}

// fieldCases builds, for every leaf of calc.Case (and every atomizer input
// a base holds), a valid case with that field set to a value the bases do
// not have; a field that no candidate can set is tested as a base holds it,
// and a field no base holds at all fails the test.
func fieldCases(t *testing.T) []roundTripCase {
	t.Helper()
	bases := roundTripBases(t)
	var out []roundTripCase
	// try sets the field on each base in turn, bases that already hold the
	// struct the field is in first, with each candidate until one gives a
	// valid case that keeps it.
	try := func(l caseLeaf, path string, set func(c *calc.Case) []func()) bool {
		ordered := slices.Clone(bases)
		slices.SortStableFunc(ordered, func(a, b calc.Case) int {
			_, ha := l.field(&a, false)
			_, hb := l.field(&b, false)
			switch {
			case ha && !hb:
				return -1
			case hb && !ha:
				return 1
			}
			return 0
		})
		for _, b := range ordered {
			base := canonical(t, b)
			for i := 0; ; i++ {
				c := caseCopy(t, b)
				fs := set(&c)
				if i >= len(fs) {
					break
				}
				fs[i]()
				if calc.Validate(c) != nil {
					continue
				}
				got := canonical(t, c)
				if _, kept := flatLeaves(t, got)[path]; !kept || got == base {
					continue
				}
				if path != "name" {
					c.Name = path + " set"
				}
				out = append(out, roundTripCase{path: path, c: c})
				return true
			}
		}
		return false
	}
	held := func(path string) bool {
		for _, b := range bases {
			if _, ok := flatLeaves(t, canonical(t, b))[path]; ok {
				out = append(out, roundTripCase{path: path + " (as a base holds it)", c: b})
				return true
			}
		}
		return false
	}
	leaves := caseLeaves(reflect.TypeFor[calc.Case](), "", nil)
	if len(leaves) < 30 {
		t.Fatalf("found only %d fields in calc.Case", len(leaves))
	}
	for _, l := range leaves {
		typ := reflect.TypeFor[calc.Case]()
		for _, idx := range l.index {
			if typ.Kind() == reflect.Pointer {
				typ = typ.Elem()
			}
			typ = typ.FieldByIndex(idx).Type
		}
		if typ.Kind() == reflect.Map {
			// Each key a base holds is a field of its own.
			keys := map[string]bool{}
			for _, b := range bases {
				if v, ok := l.field(&b, false); ok {
					for _, k := range v.MapKeys() {
						keys[k.String()] = true
					}
				}
			}
			if len(keys) == 0 {
				t.Errorf("%s: no base case holds an entry", l.path)
			}
			for _, k := range slices.Sorted(func(yield func(string) bool) {
				for k := range keys {
					if !yield(k) {
						return
					}
				}
			}) {
				path := l.path + "." + k
				ok := try(l, path, func(c *calc.Case) []func() {
					v, ok := l.field(c, false)
					if !ok || !v.MapIndex(reflect.ValueOf(k)).IsValid() {
						return nil
					}
					var fs []func()
					for _, cand := range candidates(path, v.MapIndex(reflect.ValueOf(k))) {
						fs = append(fs, func() { v.SetMapIndex(reflect.ValueOf(k), cand) })
					}
					return fs
				})
				if !ok && !held(path) {
					t.Errorf("%s: no valid case sets this atomizer input", path)
				}
			}
			continue
		}
		ok := try(l, l.path, func(c *calc.Case) []func() {
			v, _ := l.field(c, true)
			var fs []func()
			for _, cand := range candidates(l.path, v) {
				fs = append(fs, func() { v.Set(cand) })
			}
			return fs
		})
		if !ok && !held(l.path) {
			t.Errorf("%s: no base case and no candidate value gives a valid case with this field set; "+
				"add a base or a candidate to caseform_roundtrip_test.go", l.path)
		}
	}
	return out
}

// formSubmission is what a browser sends for the form: the entry list of
// the HTML standard for an urlencoded form without a submitter.
func formSubmission(form *goquery.Selection) url.Values {
	vals := url.Values{}
	crlf := strings.NewReplacer("\r\n", "\r\n", "\r", "\r\n", "\n", "\r\n")
	form.Find("input, select, textarea").Each(func(_ int, el *goquery.Selection) {
		name, ok := el.Attr("name")
		if !ok || name == "" {
			return
		}
		if _, disabled := el.Attr("disabled"); disabled || el.ParentsFiltered("fieldset[disabled]").Length() > 0 {
			return
		}
		switch goquery.NodeName(el) {
		case "textarea":
			vals.Add(name, crlf.Replace(el.Text()))
		case "select":
			opts := el.Find("option")
			sel := opts.FilterFunction(func(_ int, o *goquery.Selection) bool { _, ok := o.Attr("selected"); return ok })
			if _, multiple := el.Attr("multiple"); !multiple {
				if sel.Length() == 0 {
					sel = opts.First() // the first option shows and is sent
				} else {
					sel = sel.Last() // the last selected wins
				}
			}
			sel.Each(func(_ int, o *goquery.Selection) {
				v, ok := o.Attr("value")
				if !ok {
					v = strings.Join(strings.Fields(o.Text()), " ")
				}
				vals.Add(name, v)
			})
		default:
			typ := strings.ToLower(el.AttrOr("type", "text"))
			switch typ {
			case "submit", "image", "reset", "button":
				return
			case "checkbox", "radio":
				if _, checked := el.Attr("checked"); checked {
					vals.Add(name, el.AttrOr("value", "on"))
				}
			case "file":
				vals.Add(name, "")
			case "text", "search", "tel", "url", "email", "password":
				// Value sanitization strips line breaks from these.
				vals.Add(name, strings.NewReplacer("\r", "", "\n", "").Replace(el.AttrOr("value", "")))
			default:
				// Hidden and other inputs keep them, sent as CRLF.
				vals.Add(name, crlf.Replace(el.AttrOr("value", "")))
			}
		}
	})
	return vals
}

// editFormValues opens the case's edit page and returns the form's action
// and what a browser would submit.
func editFormValues(t *testing.T, c *http.Client, base string, id int64) (string, url.Values) {
	t.Helper()
	doc, code := getDoc(t, c, fmt.Sprintf("%s/cases/%d/edit", base, id))
	if code != http.StatusOK {
		t.Fatalf("edit page of case %d: status %d", id, code)
	}
	form := doc.Find("form#case-form")
	if form.Length() != 1 {
		t.Fatal("edit page has no case form")
	}
	return form.AttrOr("action", ""), formSubmission(form)
}

// savedID posts a form and returns the case it redirected to.
func savedID(t *testing.T, c *http.Client, u string, vals url.Values) int64 {
	t.Helper()
	resp := postForm(t, c, u, vals)
	body, _ := io.ReadAll(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther {
		doc, _ := goquery.NewDocumentFromReader(bytes.NewReader(body))
		t.Fatalf("POST %s: status %d: %s", u, resp.StatusCode,
			strings.Join(strings.Fields(doc.Find(".form-errors, .field-error, main").First().Text()), " "))
	}
	m := caseURL.FindStringSubmatch(resp.Header.Get("Location"))
	if m == nil {
		t.Fatalf("POST %s: redirect to %q", u, resp.Header.Get("Location"))
	}
	return mustInt(t, m[1])
}

// sameWithin compares two case files leaf by leaf, numbers to a relative
// tol (the form shows eight significant digits), and names what differs.
func sameWithin(t *testing.T, want, got string, tol float64) []string {
	t.Helper()
	w, g := flatLeaves(t, want), flatLeaves(t, got)
	var diffs []string
	for k, wv := range w {
		gv, ok := g[k]
		if !ok {
			diffs = append(diffs, k+" lost")
			continue
		}
		if !closeJSON(wv, gv, tol) {
			diffs = append(diffs, fmt.Sprintf("%s: %v became %v", k, wv, gv))
		}
	}
	for k, gv := range g {
		if _, ok := w[k]; !ok {
			diffs = append(diffs, fmt.Sprintf("%s: added as %v", k, gv))
		}
	}
	slices.Sort(diffs)
	return diffs
}

func closeJSON(a, b any, tol float64) bool {
	an, aok := a.(json.Number)
	bn, bok := b.(json.Number)
	if aok && bok {
		x, _ := strconv.ParseFloat(string(an), 64)
		y, _ := strconv.ParseFloat(string(bn), 64)
		return math.Abs(x-y) <= tol*math.Max(math.Abs(x), math.Abs(y))
	}
	as, aok := a.([]any)
	bs, bok := b.([]any)
	if aok && bok {
		if len(as) != len(bs) {
			return false
		}
		for i := range as {
			if !closeJSON(as[i], bs[i], tol) {
				return false
			}
		}
		return true
	}
	return reflect.DeepEqual(a, b)
}

// TestEditFormKeepsEveryField: a case with any one field set, opened in the
// edit form and saved unchanged, is stored unchanged and makes no new
// revision; "save as a new case" from that form and "duplicate" copy it
// whole; an API PUT of the case as read keeps it; and the form's inputs
// alone (without the stored revision to carry from) give the same case to
// the form's eight digits, so every field is shown, not only carried.
func TestEditFormKeepsEveryField(t *testing.T) {
	ts, st := newTestServer(t)
	hc := client(t)
	ctx := context.Background()
	cases := fieldCases(t)
	issue := calc.Case{Format: calc.CaseFormat, Name: "transient, α = 0.04 (issue 17)", Fluid: "n-heptane",
		Gas:          calc.Gas{ID: "air", PressurePa: 2e5, TemperatureK: 600},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 12},
		Evaporation:  calc.Evaporation{AccommodationCoef: 0.04}, Heating: "transient"}
	tinj := 300.0
	issue.InjectionTemperatureK = &tinj
	cases = append(cases, roundTripCase{path: "heating transient + injection_temperature_k + accommodation_coefficient", c: issue})
	t.Logf("%d fields and scenarios", len(cases))
	seen := map[string]bool{}
	for _, rc := range cases {
		seen[strings.Fields(rc.path)[0]] = true
	}
	for _, l := range caseLeaves(reflect.TypeFor[calc.Case](), "", nil) {
		if !seen[l.path] && !strings.HasPrefix(l.path, "distribution.inputs") {
			t.Errorf("field %s has no round-trip case", l.path)
		}
	}
	for _, rc := range cases {
		t.Run(rc.path, func(t *testing.T) {
			want := canonical(t, rc.c)
			body, _ := json.Marshal(rc.c)
			createdID := createCaseAPI(t, hc, ts.URL, body)
			stored := func(id int64) store.CaseRecord {
				t.Helper()
				rec, err := st.GetCase(ctx, id)
				if err != nil {
					t.Fatal(err)
				}
				return rec
			}
			if got := canonical(t, stored(createdID).Case); got != want {
				t.Fatalf("API create changed the case:\n%s", strings.Join(sameWithin(t, want, got, 0), "\n"))
			}

			// Edit, save unchanged.
			action, vals := editFormValues(t, hc, ts.URL, createdID)
			if id := savedID(t, hc, ts.URL+action, vals); id != createdID {
				t.Fatalf("edit saved case %d, not %d", id, createdID)
			}
			rec := stored(createdID)
			if got := canonical(t, rec.Case); got != want {
				t.Errorf("edit form, saved unchanged, changed the case:\n%s", strings.Join(sameWithin(t, want, got, 0), "\n"))
			}
			if rec.Revision != 1 {
				t.Errorf("saving an unchanged form made revision %d", rec.Revision)
			}

			// Save my version as a new case.
			cp := maps(vals)
			cp.Set("as_copy", "1")
			copyID := savedID(t, hc, ts.URL+action, cp)
			if got := canonical(t, stored(copyID).Case); got != want {
				t.Errorf("save as a new case changed the case:\n%s", strings.Join(sameWithin(t, want, got, 0), "\n"))
			}

			// Duplicate, then edit the duplicate and save it unchanged.
			dup := savedID(t, hc, fmt.Sprintf("%s/cases/%d/duplicate", ts.URL, createdID), url.Values{})
			wantDup := rc.c
			wantDup.Name = "Copy of " + rc.c.Name
			if got := canonical(t, stored(dup).Case); got != canonical(t, wantDup) {
				t.Errorf("duplicate changed the case:\n%s", strings.Join(sameWithin(t, canonical(t, wantDup), got, 0), "\n"))
			}
			daction, dvals := editFormValues(t, hc, ts.URL, dup)
			savedID(t, hc, ts.URL+daction, dvals)
			if got := canonical(t, stored(dup).Case); got != canonical(t, wantDup) {
				t.Errorf("edit of the duplicate changed the case:\n%s", strings.Join(sameWithin(t, canonical(t, wantDup), got, 0), "\n"))
			}

			// The API: PUT the case as GET gives it.
			var got struct {
				Revision int             `json:"revision"`
				Case     json.RawMessage `json:"case"`
			}
			resp, err := hc.Get(fmt.Sprintf("%s/api/cases/%d", ts.URL, createdID))
			if err != nil {
				t.Fatal(err)
			}
			json.NewDecoder(resp.Body).Decode(&got)
			resp.Body.Close()
			put, _ := json.Marshal(map[string]any{"revision": got.Revision, "case": got.Case})
			req, _ := http.NewRequest(http.MethodPut, fmt.Sprintf("%s/api/cases/%d", ts.URL, createdID), bytes.NewReader(put))
			req.Header.Set("Content-Type", "application/json")
			resp, err = hc.Do(req)
			if err != nil {
				t.Fatal(err)
			}
			resp.Body.Close()
			if resp.StatusCode != http.StatusOK {
				t.Errorf("API PUT: status %d", resp.StatusCode)
			}
			if rec := stored(createdID); canonical(t, rec.Case) != want || rec.Revision != 1 {
				t.Errorf("API PUT of the case as read changed it (revision %d):\n%s", rec.Revision,
					strings.Join(sameWithin(t, want, canonical(t, rec.Case), 0), "\n"))
			}

			// The form's inputs alone, as a new case: every field is on
			// the form, to its eight digits.
			nv := maps(vals)
			nv.Set("case_id", "0")
			nv.Set("revision", "0")
			newID := savedID(t, hc, ts.URL+"/cases", nv)
			if diffs := sameWithin(t, implicitDefaults(t, want), implicitDefaults(t, canonical(t, stored(newID).Case)), 1e-7); len(diffs) > 0 {
				t.Errorf("the form does not show every field (new case from its inputs):\n%s", strings.Join(diffs, "\n"))
			}
		})
	}
}

func maps(v url.Values) url.Values {
	out := url.Values{}
	for k, vs := range v {
		out[k] = slices.Clone(vs)
	}
	return out
}

// defaultSpellings are values the case file may spell out or omit with the
// same meaning; the form offers one choice for both, so the form's inputs
// alone cannot tell them apart (an edit keeps the spelling the case had).
var defaultSpellings = map[string]string{"heating": "steady", "evaporation.convection": "ranz-marshall"}

// implicitDefaults removes the spelt-out defaults from a case file.
func implicitDefaults(t *testing.T, doc string) string {
	t.Helper()
	var m map[string]any
	dec := json.NewDecoder(strings.NewReader(doc))
	dec.UseNumber()
	if err := dec.Decode(&m); err != nil {
		t.Fatal(err)
	}
	for path, v := range defaultSpellings {
		obj, key := m, path
		if parent, k, ok := strings.Cut(path, "."); ok {
			obj, _ = m[parent].(map[string]any)
			key = k
		}
		if obj != nil && obj[key] == v {
			delete(obj, key)
		}
	}
	b, err := json.Marshal(m)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

// The inputs added for the model options take their messages beside them,
// in the form's words, and keep what the user typed.
func TestCaseFormModelInputsMarkErrors(t *testing.T) {
	ts, _ := newTestServer(t)
	hc := client(t)
	for _, tc := range []struct {
		set   map[string]string
		field string // data-testid error-<field>
	}{
		{map[string]string{"accommodation": "2"}, "accommodation"},
		{map[string]string{"heating": "transient"}, "injection_temperature"},
		{map[string]string{"max_time": "-3", "max_time_unit": "ms"}, "max_time"},
		{map[string]string{"d32": "0.000001", "d32_unit": "µm"}, "d32"},
		{map[string]string{"injection_temperature": "warm"}, "injection_temperature"},
	} {
		form := validForm()
		for k, v := range tc.set {
			form.Set(k, v)
		}
		resp := postForm(t, hc, ts.URL+"/cases", form)
		doc, err := goquery.NewDocumentFromReader(resp.Body)
		resp.Body.Close()
		if err != nil {
			t.Fatal(err)
		}
		if resp.StatusCode != http.StatusUnprocessableEntity {
			t.Errorf("%v: status %d, want 422", tc.set, resp.StatusCode)
			continue
		}
		if msg := doc.Find(`[data-testid="error-` + tc.field + `"]`).Text(); msg == "" {
			t.Errorf("%v: no message beside %s; form errors: %q", tc.set, tc.field, doc.Find(".form-errors").Text())
		}
		for k, v := range tc.set {
			if strings.HasSuffix(k, "_unit") {
				continue
			}
			sel := doc.Find(`[name="` + k + `"]`)
			got := sel.AttrOr("value", "")
			if goquery.NodeName(sel) == "select" {
				got = sel.Find("option[selected]").AttrOr("value", "")
			}
			if got != v {
				t.Errorf("%v: %s came back as %q", tc.set, k, got)
			}
		}
	}
}

// Using a fit of measured classes replaces a D32 the form held, which
// would otherwise size the model instead of the fitted parameters.
func TestUseFitClearsD32(t *testing.T) {
	b, err := sizedist.FromFractions([]float64{10e-6, 20e-6, 40e-6, 80e-6}, []float64{0.2, 0.5, 0.3}, sizedist.Basis("volume"))
	if err != nil {
		t.Fatal(err)
	}
	fit, err := sizedist.Fit(b, "rosin-rammler")
	if err != nil {
		t.Fatal(err)
	}
	vals, us := map[string]string{"model": "log-normal", "d32": "35", "bins": "30"}, map[string]string{"d32": "µm"}
	useFit(vals, us, fit, b)
	if vals["model"] != "rosin-rammler" || vals["x"] == "" || vals["d32"] != "" {
		t.Errorf("after using the fit: model %q, x %q, d32 %q", vals["model"], vals["x"], vals["d32"])
	}
}

// The reported loss: a transient case made through the API, with only its
// notes edited in the form, lost heating, injection temperature and
// accommodation coefficient, and its t50 changed. An edit now changes what
// the user changed (notes; then the pressure, in the unit chosen) and
// nothing else, and the results stay those of the same model.
func TestEditNotesKeepsTransientModel(t *testing.T) {
	ts, st := newTestServer(t)
	hc := client(t)
	ctx := context.Background()
	tinj := 300.0
	c := calc.Case{Format: calc.CaseFormat, Name: "Heptane, transient", Fluid: "n-heptane", Heating: "transient",
		InjectionTemperatureK: &tinj,
		Gas:                   calc.Gas{ID: "air", PressurePa: 2e5, TemperatureK: 600},
		Distribution:          calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 12},
		Evaporation:           calc.Evaporation{AccommodationCoef: 0.04}}
	rec, err := st.CreateCase(ctx, c, "test")
	if err != nil {
		t.Fatal(err)
	}
	before, err := calc.Evaluate(rec.Case)
	if err != nil {
		t.Fatal(err)
	}

	action, vals := editFormValues(t, hc, ts.URL, rec.ID)
	vals.Set("notes", "checked against the rig on Tuesday")
	savedID(t, hc, ts.URL+action, vals)
	got, err := st.GetCase(ctx, rec.ID)
	if err != nil {
		t.Fatal(err)
	}
	want := c
	want.Notes = "checked against the rig on Tuesday"
	if got.Revision != 2 || canonical(t, got.Case) != canonical(t, want) {
		t.Fatalf("revision %d after editing the notes:\n%s", got.Revision, strings.Join(sameWithin(t, canonical(t, want), canonical(t, got.Case), 0), "\n"))
	}
	after, err := calc.Evaluate(got.Case)
	if err != nil {
		t.Fatal(err)
	}
	if *after.Summary.T50S != *before.Summary.T50S {
		t.Errorf("t50 %g s before the edit, %g s after", *before.Summary.T50S, *after.Summary.T50S)
	}

	action, vals = editFormValues(t, hc, ts.URL, rec.ID)
	vals.Set("pressure", "3")
	vals.Set("pressure_unit", "bar")
	savedID(t, hc, ts.URL+action, vals)
	got, _ = st.GetCase(ctx, rec.ID)
	want.Gas.PressurePa = 3e5
	if got.Revision != 3 || canonical(t, got.Case) != canonical(t, want) {
		t.Fatalf("revision %d after changing the pressure:\n%s", got.Revision, strings.Join(sameWithin(t, canonical(t, want), canonical(t, got.Case), 0), "\n"))
	}
}
