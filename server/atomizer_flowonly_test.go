package server

import (
	"net/url"
	"testing"
)

// The effervescent family has no confirmed drop-size correlation: its
// bench shows the flow only, offers no inverse sizing, Monte Carlo or
// sweep, and computes none even when the query asks for them.
func TestEffervescentBenchFlowOnly(t *testing.T) {
	ts, _ := newTestServer(t)
	q := url.Values{
		"fluid": {"water"}, "liquid_temperature": {"20"}, "liquid_temperature_unit": {"°C"},
		"gas": {"air"}, "pressure": {"101.325"}, "pressure_unit": {"kPa"},
		"gas_temperature": {"25"}, "gas_temperature_unit": {"°C"},
		"at.effervescent.delta_p_pa": {"5"}, "at.effervescent.delta_p_pa_unit": {"bar"},
		"at.effervescent.orifice_diameter_m": {"1"}, "at.effervescent.orifice_diameter_m_unit": {"mm"},
		"at.effervescent.mass_flow_kg_s": {"10"}, "at.effervescent.mass_flow_kg_s_unit": {"g/s"},
		"at.effervescent.alr": {"0.05"},
		"sweep_var":           {"delta_p_pa"}, "mc_cv": {"5"}, "mc_n": {"100"}, "mc_seed": {"1"},
		"solve_unknown": {"delta_p_pa"}, "target_flow": {"20"}, "target_flow_unit": {"g/s"},
	}
	doc, code := getDoc(t, client(t), ts.URL+"/atomizers/effervescent?"+q.Encode())
	if code != 200 {
		t.Fatalf("status %d: %s", code, doc.Find(`[data-testid=form-errors]`).Text())
	}
	if doc.Find(`[data-testid=atomizer-flow]`).Length() != 1 || doc.Find(`[data-testid=flow-only]`).Length() != 1 {
		t.Error("flow figures or the flow-only note missing")
	}
	for _, sel := range []string{`[data-testid=solution]`, `[data-testid=montecarlo]`, `[data-testid=plot-sweep]`, `[data-testid=plot-sweep-flow]`,
		`[name=solve_unknown]`, `[name=mc_cv]`, `[name=sweep_var]`} {
		if n := doc.Find(sel).Length(); n != 0 {
			t.Errorf("%s shown on the flow-only bench", sel)
		}
	}
	// A family with a correlation still offers them.
	doc, _ = getDoc(t, client(t), ts.URL+"/atomizers/pressure-swirl")
	if doc.Find(`[name=solve_unknown]`).Length() != 1 || doc.Find(`[data-testid=flow-only]`).Length() != 0 {
		t.Error("pressure-swirl bench lost its inverse sizing")
	}
}
