package main

import (
	"bytes"
	"regexp"
	"strings"
	"testing"
)

// `fogbench eval` names a bad field by its full path, with the list index
// of the case, in plain words: exit 2, one line, no Go type name.
func TestEvalNamesTheFieldByItsPath(t *testing.T) {
	goTypeName := regexp.MustCompile(`\b[a-z]+\.[A-Z]\w+|\[\]|map\[|float64|int64|struct`)
	one := `{"format":"fogbench-case/1","name":"cli","fluid":"water","liquid_temperature_k":298.15,
  "gas":{"pressure_pa":101325,"temperature_k":310},
  "distribution":{"model":"rosin-rammler","x_m":5e-5,"q":2.5,"bins":4}}`
	for _, c := range []struct{ in, want string }{
		{strings.Replace(one, `"temperature_k":310`, `"temperature_k":310,"foo":1`, 1), "gas.foo: unknown field"},
		{"[" + one + "," + strings.Replace(one, `"pressure_pa":101325`, `"pressure_pa":"1 bar"`, 1) + "]", `[1].gas.pressure_pa: must be a number (got "1 bar")`},
		{"[" + one + "," + strings.Replace(one, `"bins":4`, `"bins":[4]`, 1) + "]", `[1].distribution.bins: must be a whole number (got a list)`},
		{strings.Replace(one, `"x_m":5e-5`, `"x_m":{}`, 1), "distribution.x_m: must be a number (got an object)"},
		{strings.Replace(one, `"name":"cli"`, "\"name\":\"cl\xffi\"", 1), "name: holds text that is not valid UTF-8"},
		{`[]`, "file: is an empty list"},
		{strings.Replace(one, `"q":2.5`, `"q":2.5,,`, 1), "distribution: is not valid JSON at line 3, column"},
	} {
		var out, errb bytes.Buffer
		code := run([]string{"eval", "-"}, strings.NewReader(c.in), &out, &errb)
		msg := errb.String()
		if code != 2 || !strings.Contains(msg, c.want) || out.Len() != 0 || strings.Count(strings.TrimSpace(msg), "\n") != 0 {
			t.Errorf("exit %d, message %q; want 2 and one line with %q", code, msg, c.want)
		}
		if m := goTypeName.FindString(msg); m != "" {
			t.Errorf("message names a Go type (%q): %s", m, msg)
		}
	}
}
