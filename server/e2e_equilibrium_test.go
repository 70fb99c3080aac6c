package server

import (
	"context"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"

	"fogbench/calc"
	"fogbench/views"
)

// In a real browser the case page of a high-pressure case shows the
// surface equilibrium block where a reader sees it (visible, with calc's
// figures formatted), and a transcritical case's per-class table shows the
// mark and its legend. Screenshots go with the journey's others.
func TestE2EEquilibriumPanel(t *testing.T) {
	e := newE2E(t)
	var ids []string
	for _, k := range highPressureCases() {
		if k.Gas.TemperatureK == 900 {
			continue // the two others show both kinds of table
		}
		res, err := calc.Evaluate(k)
		if err != nil {
			t.Fatal(err)
		}
		rec, err := e.st.CreateCase(context.Background(), k, "tester")
		if err != nil {
			t.Fatal(err)
		}
		ids = append(ids, itoa(rec.ID))
		e.do("open "+k.Name, chromedp.Navigate(e.base+"/cases/"+itoa(rec.ID)))
		for _, f := range views.EquilibriumFiguresOf(views.Display{}, res.Equilibrium) {
			want := strings.TrimSpace(f.Value + " " + f.Unit)
			if got := strings.Join(strings.Fields(e.text(`[data-testid="eq-`+f.ID+`"]`)), " "); got != want {
				t.Errorf("%s: eq-%s shows %q, want %q", k.Name, f.ID, got, want)
			}
		}
		if m := e.text(`[data-testid="eq-method"]`); !strings.Contains(m, "Peng–Robinson") {
			t.Errorf("%s: method %q", k.Name, m)
		}
		e.do("scroll "+k.Name, chromedp.ScrollIntoView(`[data-testid="equilibrium"]`))
		e.shot(strings.ReplaceAll(k.Name, " ", "-"))
		if k.Gas.TemperatureK == 1200 {
			if n := e.text(`[data-testid="transcritical-note"]`); !strings.Contains(n, "‡") {
				t.Errorf("legend %q", n)
			}
			if c := e.text(`[data-testid="bin-table"] tbody tr.transcritical td:nth-child(9)`); c != views.TranscriticalLifetime {
				t.Errorf("lifetime cell %q", c)
			}
		}
		// The print report shows the same block.
		e.do("report "+k.Name, chromedp.Navigate(e.base+"/cases/"+itoa(rec.ID)+"/report"))
		if got := e.text(`[data-testid="eq-enhancement"]`); got != views.EquilibriumFiguresOf(views.Display{}, res.Equilibrium)[3].Value {
			t.Errorf("%s report: enhancement %q", k.Name, got)
		}
		e.shot("report-" + strings.ReplaceAll(k.Name, " ", "-"))
	}
	// The comparison lists the equilibrium rows.
	e.do("compare", chromedp.Navigate(e.base+"/compare?ids="+strings.Join(ids, ",")+"&base="+ids[0]))
	if got := e.text(`[data-testid="compare-results"]`); !strings.Contains(got, "Enhancement over p_sat") {
		t.Errorf("compare results %q", got)
	}
	e.shot("compare")
}
