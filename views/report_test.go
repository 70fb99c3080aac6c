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

// A transient case lists its heating model and the temperature the
// size-class table is computed at; a time not reached within the history
// the case ends itself is said to be so, not blamed on the surroundings.
func TestTransientMethodsAndHistoryEnd(t *testing.T) {
	tinj := 300.0
	c := calc.Case{Heating: "transient", InjectionTemperatureK: &tinj, Distribution: calc.Distribution{Model: "rosin-rammler"}}
	v := ReportView{CaseView: CaseView{Case: c}}
	if v.MethodRef("heating") == "" || v.MethodRef("temperature") == "" {
		t.Errorf("transient case: heating %q, per-class temperature %q", v.MethodRef("heating"), v.MethodRef("temperature"))
	}
	v.Case.Heating = ""
	if v.MethodRef("heating") != "" {
		t.Error("heating method listed for a steady case")
	}

	t50 := 1e-3
	cv := CaseView{Result: &calc.Result{Summary: calc.Summary{T50S: &t50}}}
	hint := func() string {
		for _, f := range cv.SummaryFigures() {
			if f.Symbol == "t99" {
				return f.Hint
			}
		}
		return ""
	}
	if got := hint(); !strings.Contains(got, "surroundings") {
		t.Errorf("no end set: hint %q", got)
	}
	cv.Case.Evaporation.MaxTimeS = 0.01
	if got := hint(); !strings.Contains(got, "end of the history") || !strings.Contains(got, "10 ms") {
		t.Errorf("history ends at 10 ms: hint %q", got)
	}
}
