package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"fogbench/calc"
	"fogbench/store"
)

func TestEvalCaseFile(t *testing.T) {
	var out, errb bytes.Buffer
	code := run([]string{"eval", "testdata/cases/water-rosin-rammler.json"}, nil, &out, &errb)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var res struct {
		Summary map[string]*float64 `json:"summary"`
		Bins    []map[string]any    `json:"bins"`
	}
	if err := json.Unmarshal(out.Bytes(), &res); err != nil {
		t.Fatal(err)
	}
	for _, k := range []string{"d32_m", "d43_m", "dv10_m", "dv50_m", "dv90_m", "span"} {
		if v := res.Summary[k]; v == nil || *v <= 0 {
			t.Errorf("summary %s = %v", k, v)
		}
	}
	// The case's Rosin–Rammler has q = 2.5: no number mean exists.
	if v, ok := res.Summary["d10_m"]; !ok || v != nil {
		t.Errorf("summary d10_m = %v (present %v), want null", v, ok)
	}
	if len(res.Bins) != 40 {
		t.Fatalf("%d bins", len(res.Bins))
	}
	for _, k := range []string{"d_lo_m", "d_hi_m", "d_m", "number_fraction", "volume_fraction", "laplace_pa",
		"vapor_pressure_pa", "kelvin_ratio", "evaporation_enhancement", "lifetime_s"} {
		if _, ok := res.Bins[0][k]; !ok {
			t.Errorf("bin field %s missing", k)
		}
	}
}

func TestEvalArrayFromStdin(t *testing.T) {
	in := strings.NewReader(`[` + strings.Repeat(`{"format":"fogbench-case/1","name":"x","fluid":"water","liquid_temperature_k":300,
	"gas":{"pressure_pa":101325,"temperature_k":300},"distribution":{"model":"rosin-rammler","x_m":2e-5,"q":3,"bins":10}},`, 2) + `{"format":"fogbench-case/1","name":"y","fluid":"n-decane","liquid_temperature_k":320,
	"gas":{"pressure_pa":101325,"temperature_k":500},"distribution":{"model":"rosin-rammler","x_m":2e-5,"q":3,"bins":10}}]`)
	var out, errb bytes.Buffer
	if code := run([]string{"eval", "-"}, in, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	var res []json.RawMessage
	if err := json.Unmarshal(out.Bytes(), &res); err != nil || len(res) != 3 {
		t.Fatalf("want an array of 3 results: %v", err)
	}
}

// eval writes compact JSON, one line, unless a single case goes to a
// terminal; the field names are those of the indented form.
func TestEvalWritesCompactJSON(t *testing.T) {
	var out, errb bytes.Buffer
	if code := run([]string{"eval", "testdata/cases/water-rosin-rammler.json"}, nil, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	b := out.Bytes()
	if n := bytes.Count(b, []byte("\n")); n != 1 || b[len(b)-1] != '\n' {
		t.Fatalf("want one line ending in a newline, got %d newlines", n)
	}
	var indented bytes.Buffer
	if err := json.Indent(&indented, b, "", "  "); err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(indented.Bytes(), []byte(`"evaporation_rate_kg_s": `)) {
		t.Fatal("indented form lost a field name")
	}
	f, err := os.Create(t.TempDir() + "/out.json")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	if isTerminal(&out) || isTerminal(f) {
		t.Fatal("a buffer or a regular file taken for a terminal")
	}
}

// Cases evaluated and encoded on several goroutines come back in input
// order: the joined output is byte for byte what encoding the one-by-one
// results as an array gives (calc.AppendResultsJSON), and the failure
// reported is the first in input order whatever the number of workers.
func TestEncodeAllKeepsOrder(t *testing.T) {
	one := func(name, fluid string, x float64) string {
		return fmt.Sprintf(`{"format":"fogbench-case/1","name":%q,"fluid":%q,"liquid_temperature_k":300,
		"gas":{"pressure_pa":101325,"temperature_k":320},"distribution":{"model":"rosin-rammler","x_m":%g,"q":3,"bins":8}}`, name, fluid, x)
	}
	var good, bad []string
	for i := range 12 {
		good = append(good, one(fmt.Sprint(i), "water", float64(i+1)*5e-6))
		f := "water"
		if i == 4 || i == 9 {
			f = "no-such-liquid"
		}
		bad = append(bad, one(fmt.Sprint(i), f, float64(i+1)*5e-6))
	}
	goodCases, err := calc.Decode(strings.NewReader("[" + strings.Join(good, ",") + "]"))
	if err != nil {
		t.Fatal(err)
	}
	badCases, err := calc.Decode(strings.NewReader("[" + strings.Join(bad, ",") + "]"))
	if err != nil {
		t.Fatal(err)
	}
	var want []*calc.Result
	for _, c := range goodCases {
		r, err := calc.Evaluate(c)
		if err != nil {
			t.Fatal(err)
		}
		want = append(want, r)
	}
	wantJSON, err := calc.AppendResultsJSON(nil, want)
	if err != nil {
		t.Fatal(err)
	}
	ctx := context.Background()
	for _, workers := range []int{1, 2, 5, 32} {
		outs, _, err := encodeAll(ctx, goodCases, workers)
		if err != nil {
			t.Fatal(err)
		}
		var got bytes.Buffer
		if _, err := joinJSON(outs, true).WriteTo(&got); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(got.Bytes(), append(wantJSON, '\n')) {
			t.Fatalf("%d workers: output differs from the one-by-one results encoded as an array", workers)
		}
		_, i, err := encodeAll(ctx, badCases, workers)
		if err == nil || i != 4 || !strings.Contains(err.Error(), "no-such-liquid") {
			t.Fatalf("%d workers: failure at case %d (%v), want case index 4", workers, i, err)
		}
	}
	// One case, not an array: the object and a newline.
	outs, _, err := encodeAll(ctx, goodCases[:1], 2)
	if err != nil {
		t.Fatal(err)
	}
	var got bytes.Buffer
	joinJSON(outs, false).WriteTo(&got)
	first, _ := want[0].AppendJSON(nil)
	if !bytes.Equal(got.Bytes(), append(first, '\n')) {
		t.Fatal("a single case's output is not its object and a newline")
	}
}

// Bad input exits 2 with one line that names the field.
func TestEvalBadInput(t *testing.T) {
	cases := []struct {
		args  []string
		stdin string
		field string
	}{
		{[]string{"eval", "testdata/cases/bad-q.json"}, "", "distribution.q"},
		{[]string{"eval"}, `{"format":"fogbench-case/1","name":"n","fluid":"mercury","gas":{"pressure_pa":1e5,"temperature_k":300},"distribution":{"model":"rosin-rammler","x_m":1e-5,"q":2}}`, "fluid"},
		{[]string{"eval"}, `{"name":"n","fluid":"water","gaz":{}}`, "gaz"},
		{[]string{"eval"}, `{"name":"n","fluid":"water","gas":{"pressure_pa":"high"}}`, "gas.pressure_pa"},
		{[]string{"eval"}, `{"name":`, "file"},
		{[]string{"eval", "no/such/file.json"}, "", "no such file"},
	}
	for _, c := range cases {
		var out, errb bytes.Buffer
		code := run(c.args, strings.NewReader(c.stdin), &out, &errb)
		msg := errb.String()
		if code != 2 || !strings.Contains(msg, c.field) || strings.Count(strings.TrimSpace(msg), "\n") != 0 {
			t.Errorf("%v %q: exit %d, message %q; want 2 and one line naming %q", c.args, c.stdin, code, msg, c.field)
		}
		if out.Len() != 0 {
			t.Errorf("%v: printed results despite the error", c.args)
		}
	}
}

func TestServeRefusesNonLoopback(t *testing.T) {
	var errb bytes.Buffer
	if code := run([]string{"serve", "-addr", "0.0.0.0:0", "-db", t.TempDir() + "/x.db"}, nil, &errb, &errb); code != 2 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(errb.String(), "loopback") {
		t.Fatalf("message %q", errb.String())
	}
}

func TestReportCommand(t *testing.T) {
	dir := t.TempDir()
	db := filepath.Join(dir, "lib.db")
	st, err := store.Open(context.Background(), db)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := st.SeedDemo(context.Background()); err != nil {
		t.Fatal(err)
	}
	st.Close()
	out := filepath.Join(dir, "r.pdf")
	var stdout, stderr bytes.Buffer
	// The id may come after the flags or before them.
	if code := run([]string{"report", "-db", db, "2", "-o", out, "-paper", "letter"}, nil, &stdout, &stderr); code != 0 {
		t.Fatalf("exit %d: %s", code, stderr.String())
	}
	data, err := os.ReadFile(out)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.HasPrefix(data, []byte("%PDF-")) || !bytes.Contains(data, []byte("/MediaBox [0 0 612.00 792.00]")) {
		t.Fatalf("not a Letter PDF (%d bytes)", len(data))
	}
	for _, tc := range []struct {
		args []string
		msg  string
	}{
		{[]string{"report", "99", "-o", out, "-db", db}, "case 99"},
		{[]string{"report", "x", "-o", out, "-db", db}, "not a case id"},
		{[]string{"report", "1", "-db", db}, "-o FILE.pdf"},
		{[]string{"report", "1", "-o", out, "-db", filepath.Join(dir, "none.db")}, "none.db"},
	} {
		stderr.Reset()
		if code := run(tc.args, nil, &stdout, &stderr); code != 2 || !strings.Contains(stderr.String(), tc.msg) {
			t.Errorf("%v: exit %d, %q", tc.args, code, stderr.String())
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "none.db")); err == nil {
		t.Error("report created a library that did not exist")
	}
}

// A batch never aborts for one case: each failing case has its error
// object in its place, the others their results; the exit code is 0
// unless -strict, which exits with the failing case's code.
func TestEvalBatchWritesEachCaseError(t *testing.T) {
	good := `{"format":"fogbench-case/1","name":"x","fluid":"water","liquid_temperature_k":300,
	"gas":{"pressure_pa":101325,"temperature_k":300},"distribution":{"model":"rosin-rammler","x_m":2e-5,"q":3,"bins":10}}`
	bad := `{"format":"fogbench-case/1","name":"bad","fluid":"water","liquid_temperature_k":300,
	"gas":{"pressure_pa":101325,"temperature_k":300},"distribution":{"model":"rosin-rammler","x_m":2e-5,"q":-3,"bins":10}}`
	// A gas hotter than the model's range. (n-dodecane at 60 bar in 900 K
	// gas stood here as a physical limit until the surface equilibrium at
	// pressure made it computable: TestHotHighPressureCasesEvaluate.)
	limit := `{"format":"fogbench-case/1","name":"limit","fluid":"water","liquid_temperature_k":300,
	"gas":{"pressure_pa":101325,"temperature_k":5000},"distribution":{"model":"rosin-rammler","x_m":2e-5,"q":3,"bins":6}}`
	in := "[" + good + "," + bad + "," + good + "," + limit + "]"
	for _, strict := range []bool{false, true} {
		args := []string{"eval", "-"}
		if strict {
			args = []string{"eval", "-strict", "-"}
		}
		var out, errb bytes.Buffer
		code := run(args, strings.NewReader(in), &out, &errb)
		want := 0
		if strict {
			want = 2
		}
		if code != want {
			t.Errorf("strict %v: exit %d, want %d (%s)", strict, code, want, errb.String())
		}
		var res []map[string]json.RawMessage
		if err := json.Unmarshal(out.Bytes(), &res); err != nil || len(res) != 4 {
			t.Fatalf("strict %v: want an array of 4: %v %s", strict, err, out.String())
		}
		for _, i := range []int{0, 2} {
			if _, ok := res[i]["summary"]; !ok {
				t.Errorf("case %d: no result: %s", i+1, res[i])
			}
		}
		var e calc.CaseError
		if err := json.Unmarshal(mustMarshal(t, res[1]), &e); err != nil || e.Code != calc.Invalid ||
			len(e.Fields) != 1 || e.Fields[0].Field != "[1].distribution.q" {
			t.Errorf("case 2: error object %s (%v)", res[1], err)
		}
		e = calc.CaseError{}
		if err := json.Unmarshal(mustMarshal(t, res[3]), &e); err != nil || e.Code != calc.Invalid ||
			len(e.Fields) == 0 || e.Fields[0].Field != "[3].gas.temperature_k" {
			t.Errorf("case 4: error object %s (%v)", res[3], err)
		}
		msg := errb.String()
		// The list index names each case as POST /api/evaluate names it.
		if !strings.Contains(msg, "[1].distribution.q") || !strings.Contains(msg, "[3].gas.temperature_k") || strings.Count(msg, "\n") != 2 {
			t.Errorf("strict %v: stderr %q: want one line for [1] and one for [3], named as the API names them", strict, msg)
		}
	}
}

func mustMarshal(t *testing.T, v any) []byte {
	t.Helper()
	b, err := json.Marshal(v)
	if err != nil {
		t.Fatal(err)
	}
	return b
}
