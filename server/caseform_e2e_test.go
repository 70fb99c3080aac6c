package server

import (
	"bytes"
	"encoding/json"
	"fmt"
	"net/http"
	"strings"
	"testing"
	"time"

	"github.com/chromedp/chromedp"

	"fogbench/calc"
)

// TestE2EEditKeepsModel opens a case that sets many fields the form once
// dropped (transient heating, injection temperature, accommodation
// coefficient, D32, history end, transition off, vapor partial pressure,
// nitrogen, notes over several lines) in the real browser with its scripts,
// saves it unchanged, and checks that the library holds the same case file
// at the same revision and that the case page states the model.
func TestE2EEditKeepsModel(t *testing.T) {
	e := newE2E(t)
	tinj, pv := 300.0, 1234.56789
	c := calc.Case{Format: calc.CaseFormat, Name: "Browser transient case", Notes: "first line\nsecond line",
		Fluid: "n-heptane", Heating: "transient", InjectionTemperatureK: &tinj,
		Gas: calc.Gas{ID: "nitrogen", PressurePa: 2.0123456789e5, TemperatureK: 600.123456789, VaporPartialPressurePa: &pv,
			RelativeVelocityMS: 3.3},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, D32M: 21.23456789e-6, Bins: 16},
		Evaporation: calc.Evaporation{Convection: "frossling", NoTransition: true, AccommodationCoef: 0.04,
			MaxTimeS: 0.0123456789, SprayVelocityMS: 12.5, MassFlowKgS: 0.0021}}
	body, _ := json.Marshal(c)
	resp, err := http.Post(e.base+"/api/cases", "application/json", bytes.NewReader(body))
	if err != nil {
		t.Fatal(err)
	}
	var created struct {
		ID       int64     `json:"id"`
		Revision int       `json:"revision"`
		Case     calc.Case `json:"case"`
	}
	json.NewDecoder(resp.Body).Decode(&created)
	resp.Body.Close()
	if resp.StatusCode != http.StatusCreated {
		t.Fatalf("POST /api/cases: status %d", resp.StatusCode)
	}
	want := canonical(t, created.Case)

	e.do("open the edit form", chromedp.Navigate(fmt.Sprintf("%s/cases/%d/edit", e.base, created.ID)),
		chromedp.WaitVisible(chromedp.ID("case-form")))
	if _, err := chromedp.Run(e.ctx, chromedp.Poll[bool](`document.querySelector('#preview [data-testid="fig-D32"]') !== null`,
		chromedp.WithPollingTimeout(12*time.Second))); err != nil {
		e.shot("failed-preview")
		t.Fatalf("live results did not appear: %v", err)
	}
	if got := e.value(`#f-heating`); got != "transient" {
		t.Errorf("heating select shows %q", got)
	}
	if got := e.value(`#f-accommodation`); got != "0.04" {
		t.Errorf("accommodation field shows %q", got)
	}
	e.shot("edit-form")
	e.reloaded("save unchanged", `document.querySelector("[data-testid=case-page]") !== null`,
		chromedp.Click(chromedp.CSS(`.form-actions button.primary[type=submit]`)))
	e.shot("case-page")
	if got := e.text(`aside.inputs`); !strings.Contains(got, "transient from 26.85 °C at injection") || !strings.Contains(got, "off (continuum") {
		t.Errorf("case page inputs do not state the model: %q", got)
	}

	resp, err = http.Get(fmt.Sprintf("%s/api/cases/%d", e.base, created.ID))
	if err != nil {
		t.Fatal(err)
	}
	var got struct {
		Revision int       `json:"revision"`
		Case     calc.Case `json:"case"`
	}
	json.NewDecoder(resp.Body).Decode(&got)
	resp.Body.Close()
	if got.Revision != created.Revision || canonical(t, got.Case) != want {
		t.Errorf("saved unchanged from the browser: revision %d → %d:\n%s", created.Revision, got.Revision,
			strings.Join(sameWithin(t, want, canonical(t, got.Case), 0), "\n"))
	}
}
