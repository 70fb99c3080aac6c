package server

import (
	"context"
	"strings"
	"testing"

	"fogbench/calc"
)

// A superheated case shows the superheat panel with its computed figures,
// regime and p–T diagram; a subcooled demo case shows none.
func TestCasePageSuperheatPanel(t *testing.T) {
	ts, st := newTestServer(t)
	tl := 413.15 // water at 140 °C into air at 1 atm
	c := calc.Case{Format: calc.CaseFormat, Name: "Hot rinse spray (invented)", Fluid: "water", LiquidTemperatureK: &tl,
		Gas:          calc.Gas{ID: "air", PressurePa: 101325, TemperatureK: 298.15},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 5e-5, Q: 2.5, Bins: 12}}
	rec, err := st.CreateCase(context.Background(), c, "tester")
	if err != nil {
		t.Fatal(err)
	}
	res, err := calc.Evaluate(c)
	if err != nil || res.Superheat == nil {
		t.Fatalf("evaluate: %v, superheat %v", err, res)
	}
	doc, code := getDoc(t, client(t), ts.URL+"/cases/"+itoa(rec.ID))
	if code != 200 {
		t.Fatalf("status %d", code)
	}
	panel := doc.Find(`[data-testid="superheat"]`)
	if panel.Length() != 1 {
		t.Fatal("no superheat panel")
	}
	if got := strings.TrimSpace(panel.Find(`[data-testid="superheat-regime"]`).Text()); got != res.Superheat.Regime || got != "fully flashing" {
		t.Errorf("regime %q, result %q", got, res.Superheat.Regime)
	}
	// ΔT and R_p as the page formats them from the result (4 figures).
	for sym, want := range map[string]string{"ΔT": "40.03", "R_p": "3.568"} {
		if got := panel.Find(`[data-testid="superheat-` + sym + `"]`).Text(); !strings.Contains(got, want) {
			t.Errorf("%s shows %q, want %s", sym, got, want)
		}
	}
	if panel.Find(`[data-testid="plot-superheat"] svg`).Length() != 1 {
		t.Error("no p–T diagram in the panel")
	}
	if doc.Find(`[data-testid="compute-error"]`).Length() != 0 {
		t.Error("a superheated case is reported as not computable")
	}

	// A subcooled demo case has no panel.
	doc, _ = getDoc(t, client(t), ts.URL+"/cases/1")
	if doc.Find(`[data-testid="superheat"]`).Length() != 0 {
		t.Error("superheat panel on a subcooled case")
	}
}

// The p–T chart has its four lines, all of them drawable, and the case
// point at the gas pressure.
func TestSuperheatChart(t *testing.T) {
	tl := 450.0
	c := calc.Case{Format: calc.CaseFormat, Name: "x", Fluid: "n-heptane", LiquidTemperatureK: &tl,
		Gas:          calc.Gas{ID: "nitrogen", PressurePa: 3e5, TemperatureK: 500},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 2e-5, Q: 2.5, Bins: 8}}
	res, err := calc.Evaluate(c)
	if err != nil {
		t.Fatal(err)
	}
	ch, ok := superheatChart(c, res)
	if !ok || len(ch.Series) != 4 {
		t.Fatalf("ok %v, %d series", ok, len(ch.Series))
	}
	for _, s := range ch.Series {
		if len(s.X) < 2 || len(s.X) != len(s.Y) {
			t.Errorf("series %q has %d/%d points", s.Name, len(s.X), len(s.Y))
		}
	}
	if y := ch.Series[3].Y; y[0] != 0.3 || ch.Series[3].X[1] != tl {
		t.Errorf("case segment %v %v", ch.Series[3].X, y)
	}
	if _, err := ch.SVG(); err != nil {
		t.Error(err)
	}
	sub := 300.0
	c.LiquidTemperatureK = &sub
	res, _ = calc.Evaluate(c)
	if _, ok := superheatChart(c, res); ok {
		t.Error("chart for a subcooled case")
	}
}
