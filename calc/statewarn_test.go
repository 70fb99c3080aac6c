package calc

import (
	"strings"
	"testing"
)

// Property-range warnings follow the temperature the drops are computed
// at, under every model: the fixed temperature, the solved steady
// temperature and the transient path; one per property, naming the
// temperature reached. Published ranges (calc/fluid, from Perry's tables):
// n-dodecane liquid heat capacity 263.57–330 K, n-hexadecane surface
// tension 291.35–559.95 K.
func TestRangeWarningsFollowTheState(t *testing.T) {
	kerosene := func() Case {
		return Case{Format: CaseFormat, Name: "dryer", Fluid: "kerosene-surrogate",
			Gas:          Gas{PressurePa: 101325, TemperatureK: 600},
			Distribution: Distribution{Model: "rosin-rammler", D32M: 30e-6, Q: 2.5, Bins: 10}}
	}
	hexadecane := Case{Format: CaseFormat, Name: "diesel-like", Fluid: "n-hexadecane",
		Gas:          Gas{PressurePa: 38e5, TemperatureK: 700},
		Distribution: Distribution{Model: "rosin-rammler", D32M: 30e-6, Q: 2.5, Bins: 10}}
	transient := kerosene()
	transient.Heating, transient.InjectionTemperatureK = "transient", ptr(300)
	fixed := kerosene()
	fixed.LiquidTemperatureK = ptr(400)
	for _, tc := range []struct {
		name     string
		c        Case
		property string // the property that must warn, once
		state    string
	}{
		{"kerosene steady", kerosene(), "Kerosene / Jet A surrogate (n-dodecane) liquid heat capacity", "steady temperature reached"},
		{"kerosene transient", transient, "Kerosene / Jet A surrogate (n-dodecane) liquid heat capacity", "from injection to steady) reached"},
		{"kerosene fixed", fixed, "Kerosene / Jet A surrogate (n-dodecane) liquid heat capacity", "fixed drop temperature reached 400.00 K"},
		{"hexadecane steady, 38 bar", hexadecane, "n-Hexadecane surface tension", "steady temperature reached"},
	} {
		res, err := Evaluate(tc.c)
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		n := 0
		for _, w := range res.Warnings {
			if strings.HasPrefix(w, tc.property+":") {
				n++
				if !strings.Contains(w, tc.state) || !strings.Contains(w, "outside the published range") {
					t.Errorf("%s: warning %q does not say %q", tc.name, w, tc.state)
				}
			}
		}
		if n != 1 {
			t.Errorf("%s: %d warnings for %s, want 1: %q", tc.name, n, tc.property, res.Warnings)
		}
	}
}

// No warning is repeated: the classes' states and the history raise some
// of the same flags (the Clift Reynolds-number range appeared twice in
// the A–S transient at 15 bar, 700 K).
func TestWarningsAreNotRepeated(t *testing.T) {
	c := Case{Format: CaseFormat, Name: "A–S transient", Fluid: "kerosene-surrogate", Heating: "transient",
		InjectionTemperatureK: ptr(300),
		Gas:                   Gas{PressurePa: 15e5, TemperatureK: 700, RelativeVelocityMS: 10},
		Distribution:          Distribution{Model: "rosin-rammler", D32M: 30e-6, Q: 2.5, Bins: 12},
		Evaporation:           Evaporation{Convection: "abramzon-sirignano"}}
	res, err := Evaluate(c)
	if err != nil {
		t.Fatal(err)
	}
	seen := map[string]bool{}
	for _, w := range res.Warnings {
		if seen[w] {
			t.Errorf("repeated warning %q", w)
		}
		seen[w] = true
	}
}
