package atomize

import (
	"errors"
	"math"
	"strings"
	"testing"

	"fogbench/calc/valid"
	"gonum.org/v1/gonum/floats/scalar"
)

// Inverse sizing is checked by substitution: the solved input, put back
// into Evaluate, must reproduce the target within rel 1e-6 (an identity
// check, independent of whether the forms match the papers).
func TestSolveSubstitution(t *testing.T) {
	const tol = 1e-6
	cases := []struct {
		name, family, corr string
		props              Properties
		inputs             map[string]float64
		unknown            string
		target             Target
	}{
		{"swirl ΔP for 40 µm, fixed flow", "pressure-swirl", "lefebvre-1987", ps1,
			map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}, "delta_p_pa", Target{SMD: 40e-6}},
		{"swirl ΔP for 40 µm, fixed flow number", "pressure-swirl", "radcliffe-1955", ps1,
			map[string]float64{"flow_number_m2": 3.58e-7, "orifice_diameter_m": 1e-3}, "delta_p_pa", Target{SMD: 60e-6}},
		{"swirl d0 for 45 µm (Wang-Lefebvre)", "pressure-swirl", "wang-lefebvre-1987", ps1,
			map[string]float64{"delta_p_pa": 1e6, "mass_flow_kg_s": 0.01, "cone_angle_deg": 80}, "orifice_diameter_m", Target{SMD: 45e-6}},
		{"swirl ΔP for a mass flow", "pressure-swirl", "", ps1,
			map[string]float64{"flow_number_m2": 3.58e-7, "orifice_diameter_m": 1e-3}, "delta_p_pa", Target{MassFlow: 0.02}},
		{"plain orifice d0 for a mass flow", "plain-orifice", "", po1,
			map[string]float64{"delta_p_pa": 2e6, "discharge_coefficient": 0.7}, "orifice_diameter_m", Target{MassFlow: 0.005}},
		{"plain orifice ΔP for 20 µm (Elkotb)", "plain-orifice", "elkotb-1982", po2,
			map[string]float64{"orifice_diameter_m": 0.2e-3, "discharge_coefficient": 0.7}, "delta_p_pa", Target{SMD: 20e-6}},
		{"prefilming air velocity for 30 µm", "airblast", "rizk-lefebvre-1980", ps1,
			map[string]float64{"alr": 3, "prefilmer_diameter_m": 0.02}, "air_velocity_m_s", Target{SMD: 30e-6}},
		{"plain-jet air velocity for 60 µm", "airblast", "lorenzetto-lefebvre-1977", ps1,
			map[string]float64{"alr": 3, "mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}, "air_velocity_m_s", Target{SMD: 60e-6}},
		{"rotary speed for 100 µm", "rotary", "", po1,
			map[string]float64{"disk_diameter_m": 0.05}, "speed_rpm", Target{SMD: 100e-6}},
		{"ultrasonic frequency for 20 µm", "ultrasonic", "", po1,
			map[string]float64{}, "frequency_hz", Target{SMD: 20e-6}},
		{"effervescent ΔP for a mass flow", "effervescent", "", po1,
			map[string]float64{"orifice_diameter_m": 1e-3, "discharge_coefficient": 0.6, "alr": 0.05}, "delta_p_pa", Target{MassFlow: 0.02}},
	}
	for _, c := range cases {
		sol, err := Solve(c.family, c.corr, c.inputs, c.props, c.unknown, c.target)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if !sol.Reached {
			t.Errorf("%s: not reached: %s", c.name, sol.Message)
			continue
		}
		in := map[string]float64{c.unknown: sol.Value}
		for k, v := range c.inputs {
			in[k] = v
		}
		r, err := Evaluate(c.family, c.corr, in, c.props)
		if err != nil {
			t.Errorf("%s: substitution: %v", c.name, err)
			continue
		}
		got, want := r.MassFlow, c.target.MassFlow
		if c.target.SMD != 0 {
			got, want = r.SMD[0].SMD, c.target.SMD
		}
		if !scalar.EqualWithinRel(got, want, tol) {
			t.Errorf("%s: %s = %g gives %.10g, want %.10g", c.name, c.unknown, sol.Value, got, want)
		}
		if sol.Value < sol.Bracket[0] || sol.Value > sol.Bracket[1] {
			t.Errorf("%s: %g outside bracket %v", c.name, sol.Value, sol.Bracket)
		}
		if _, ok := c.inputs[c.unknown]; ok {
			t.Errorf("%s: Solve changed the caller's inputs", c.name)
		}
	}
}

func TestSolveClosedForm(t *testing.T) {
	// Lefebvre (1987) SMD ∝ ΔP^−0.5 at fixed ṁ_L, so the ΔP giving SMD_t is
	// ΔP_1 (SMD_1/SMD_t)² (algebra on the form); tolerance rel 1e-9.
	in := map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	smd1 := lefebvre1987SMD(0.0275, 1.3e-3, 0.01, 1e6, 1.2)
	target := 40e-6
	sol, err := Solve("pressure-swirl", "lefebvre-1987", in, ps1, "delta_p_pa", Target{SMD: target})
	if err != nil {
		t.Fatal(err)
	}
	want := 1e6 * (smd1 / target) * (smd1 / target)
	if !scalar.EqualWithinRel(sol.Value, want, 1e-9) {
		t.Errorf("ΔP: got %.12g Pa, want %.12g Pa", sol.Value, want)
	}
}

func TestSolveUnreachable(t *testing.T) {
	// Lefebvre (1987) at fixed flow: SMD falls with ΔP, and the validity
	// bracket ends at 10 MPa, so a 1 µm target cannot be reached; the nearest
	// value is the upper end of the bracket.
	in := map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	sol, err := Solve("pressure-swirl", "lefebvre-1987", in, ps1, "delta_p_pa", Target{SMD: 1e-6})
	if err != nil {
		t.Fatal(err)
	}
	if sol.Reached {
		t.Fatalf("1 µm reported reached at ΔP = %g", sol.Value)
	}
	if !scalar.EqualWithinRel(sol.Value, sol.Bracket[1], 1e-9) || sol.Bracket[1] != 1e7 {
		t.Errorf("nearest value %g, want the bracket end %v", sol.Value, sol.Bracket)
	}
	want := lefebvre1987SMD(0.0275, 1.3e-3, 0.01, 1e7, 1.2)
	if !scalar.EqualWithinRel(sol.Achieved, want, 1e-9) {
		t.Errorf("achieved %g, want %g", sol.Achieved, want)
	}
	if !strings.Contains(sol.Message, "nearest reachable") || len(sol.Warnings) == 0 {
		t.Errorf("message does not say so: %q", sol.Message)
	}

	// The SMD of Lefebvre (1987) does not depend on d0: unreachable, and the
	// message says why.
	in = map[string]float64{"mass_flow_kg_s": 0.01, "delta_p_pa": 1e6}
	sol, err = Solve("pressure-swirl", "lefebvre-1987", in, ps1, "orifice_diameter_m", Target{SMD: 30e-6})
	if err != nil {
		t.Fatal(err)
	}
	if sol.Reached || !strings.Contains(sol.Message, "does not depend on") {
		t.Errorf("independent unknown: reached %v, message %q", sol.Reached, sol.Message)
	}
}

func TestSolveErrors(t *testing.T) {
	in := map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	cases := []struct {
		name, family, corr, unknown, field string
		target                             Target
	}{
		{"unknown input", "pressure-swirl", "", "speed_rpm", "solve.unknown", Target{SMD: 4e-5}},
		{"no target", "pressure-swirl", "", "delta_p_pa", "target.smd_m", Target{}},
		{"two targets", "pressure-swirl", "", "delta_p_pa", "target.mass_flow_kg_s", Target{SMD: 4e-5, MassFlow: 1}},
		{"NaN target", "pressure-swirl", "", "delta_p_pa", "target.smd_m", Target{SMD: math.NaN()}},
		{"negative target", "pressure-swirl", "", "delta_p_pa", "target.smd_m", Target{SMD: -1}},
		{"effervescent SMD", "effervescent", "", "delta_p_pa", "target.smd_m", Target{SMD: 4e-5}},
		{"unknown family", "jet-mill", "", "delta_p_pa", "distribution.family", Target{SMD: 4e-5}},
	}
	for _, c := range cases {
		_, err := Solve(c.family, c.corr, in, ps1, c.unknown, c.target)
		var fe *valid.FieldError
		if !errors.As(err, &fe) || fe.Field != c.field {
			t.Errorf("%s: got %v, want a field error on %s", c.name, err, c.field)
		}
	}
}
