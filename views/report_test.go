package views

import (
	"strings"
	"testing"

	"fogbench/calc"
)

func TestPurposeArticle(t *testing.T) {
	for liquid, want := range map[string]string{"n-Heptane": "of an n-heptane spray", "Water": "of a water spray", "Ethanol": "of an ethanol spray"} {
		v := ReportView{LiquidName: liquid, GasName: "Air", CaseView: CaseView{Case: calc.Case{Gas: calc.Gas{PressurePa: 101325, TemperatureK: 298.15}}}}
		if got := v.Purpose(); !strings.Contains(got, want) {
			t.Errorf("%s: %q", liquid, got)
		}
	}
}

// The methods list follows the case's options and numbers every method the
// tables refer to.
func TestMethodsFollowTheCase(t *testing.T) {
	c := calc.Case{Distribution: calc.Distribution{Model: "log-normal"}, Evaporation: calc.Evaporation{Convection: "abramzon-sirignano", NoTransition: true}}
	v := ReportView{CaseView: CaseView{Case: c}}
	names := map[string]string{}
	for _, m := range v.Methods() {
		names[m.ID] = m.Name
		if m.Equation == "" || m.Reference == "" || m.Use == "" {
			t.Errorf("method %s is incomplete: %+v", m.ID, m)
		}
	}
	if !strings.Contains(names["sizes"], "Log-normal") || !strings.Contains(names["convection"], "Abramzon") {
		t.Errorf("methods %v", names)
	}
	if _, ok := names["transition"]; ok {
		t.Error("transition correction listed although the case turns it off")
	}
	if !strings.Contains(names["temperature"], "Steady") {
		t.Errorf("drop temperature method %q", names["temperature"])
	}
	if v.MethodRef("transition") != "" || v.MethodRef("kelvin") == "" {
		t.Errorf("refs: transition %q, kelvin %q", v.MethodRef("transition"), v.MethodRef("kelvin"))
	}
	tk := 300.0
	c.LiquidTemperatureK = &tk
	c.Evaporation = calc.Evaporation{}
	v.Case = c
	if got := v.Methods(); !strings.Contains(got[len(got)-3].Name, "Fixed drop temperature") {
		t.Errorf("fixed temperature not listed: %q", got[len(got)-3].Name)
	}
}
