package calc

import (
	"strings"
	"testing"
)

// An injection temperature outside the liquid's range is reported on its
// own field, not on liquid_temperature_k (which the case may not even set).
func TestInjectionTemperatureIsNamed(t *testing.T) {
	for _, tc := range []struct {
		liquid    *float64
		injection float64
	}{{nil, 1000}, {ptr(298.15), 1000}, {ptr(298.15), 100}} {
		c := waterCase()
		c.LiquidTemperatureK = tc.liquid
		c.Heating = "transient"
		c.InjectionTemperatureK = ptr(tc.injection)
		fes := FieldErrors(Validate(c))
		if len(fes) != 1 || fes[0].Field != "injection_temperature_k" || !strings.Contains(fes[0].Message, "liquid only between") {
			t.Errorf("liquid %v, injection %g K: got %v, want one error on injection_temperature_k", tc.liquid, tc.injection, fes)
		}
	}
	c := waterCase()
	c.LiquidTemperatureK = ptr(1000)
	if fes := FieldErrors(Validate(c)); len(fes) != 1 || fes[0].Field != "liquid_temperature_k" {
		t.Errorf("a bad liquid temperature: got %v", fes)
	}
}

// Case names are one line of printable UTF-8 text, whichever way they come
// in (the form and the API both end in Validate).
func TestCaseNamesRefuseControlCharactersAndBadUTF8(t *testing.T) {
	for _, tc := range []struct{ name, message string }{
		{"line\nbreak", "control characters"},
		{"carriage\rreturn", "control characters"},
		{"nul\x00byte", "control characters"},
		{"tab\there", "control characters"},
		{"bell\x07", "control characters"},
		{"del\u0085next", "control characters"},
		{"bad \xff byte", "not UTF-8"},
		{"cut \xe2\x82", "not UTF-8"},
		{strings.Repeat("ü", MaxNameChars+1), "at most 200 characters"},
		{"   ", "give the case a name"},
	} {
		c := waterCase()
		c.Name = tc.name
		fes := FieldErrors(Validate(c))
		if len(fes) != 1 || fes[0].Field != "name" || !strings.Contains(fes[0].Message, tc.message) {
			t.Errorf("name %q: got %v, want an error on name saying %q", tc.name, fes, tc.message)
		}
	}
	for _, ok := range []string{"Nozzle A — 25 °C", strings.Repeat("ü", MaxNameChars), "a;=1+1", "名前"} {
		c := waterCase()
		c.Name = ok
		if err := Validate(c); err != nil {
			t.Errorf("name %q refused: %v", ok, err)
		}
	}
	c := waterCase()
	c.Notes = "two\nlines\tand a tab"
	if err := Validate(c); err != nil {
		t.Errorf("notes may hold line breaks and tabs: %v", err)
	}
	c.Notes = "bad \xff"
	if fes := FieldErrors(Validate(c)); len(fes) != 1 || fes[0].Field != "notes" {
		t.Errorf("notes with invalid UTF-8: %v", fes)
	}
	// A JSON case file with invalid UTF-8 is refused before encoding/json
	// would mend it into U+FFFD.
	_, err := Decode(strings.NewReader("{\"name\":\"caf\xe9\"}"))
	if fes := FieldErrors(err); len(fes) != 1 || fes[0].Field != "name" || !strings.Contains(fes[0].Message, "UTF-8") {
		t.Errorf("invalid UTF-8 in a case file: %v", err)
	}
}
