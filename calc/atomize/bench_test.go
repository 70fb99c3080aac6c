package atomize

import "testing"

var (
	benchResult   Result
	benchSolution Solution
)

func BenchmarkEvaluate(b *testing.B) {
	cases := []struct {
		name, family string
		props        Properties
		inputs       map[string]float64
	}{
		{"pressure-swirl", "pressure-swirl", ps1, map[string]float64{"delta_p_pa": 1e6, "orifice_diameter_m": 1e-3, "swirl_chamber_diameter_m": 4e-3, "inlet_port_area_m2": 2e-6}},
		{"plain-orifice", "plain-orifice", po1, map[string]float64{"delta_p_pa": 1e6, "orifice_diameter_m": 0.5e-3, "orifice_length_m": 2e-3}},
		{"airblast", "airblast", ps1, map[string]float64{"air_velocity_m_s": 100, "alr": 3, "prefilmer_diameter_m": 0.02, "hydraulic_diameter_m": 0.02, "mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}},
		{"rotary", "rotary", po1, map[string]float64{"speed_rpm": 10000, "disk_diameter_m": 0.05}},
		{"ultrasonic", "ultrasonic", po1, map[string]float64{"frequency_hz": 40e3}},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				r, err := Evaluate(c.family, "", c.inputs, c.props)
				if err != nil {
					b.Fatal(err)
				}
				benchResult = r
			}
		})
	}
}

func BenchmarkSolve(b *testing.B) {
	cases := []struct {
		name, family, corr, unknown string
		props                       Properties
		inputs                      map[string]float64
		target                      Target
	}{
		{"reachable/pressure-swirl-dp", "pressure-swirl", "lefebvre-1987", "delta_p_pa", ps1,
			map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}, Target{SMD: 40e-6}},
		{"reachable/airblast-velocity", "airblast", "rizk-lefebvre-1980", "air_velocity_m_s", ps1,
			map[string]float64{"alr": 3, "prefilmer_diameter_m": 0.02}, Target{SMD: 30e-6}},
		{"unreachable/pressure-swirl-dp", "pressure-swirl", "lefebvre-1987", "delta_p_pa", ps1,
			map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}, Target{SMD: 1e-6}},
	}
	for _, c := range cases {
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				s, err := Solve(c.family, c.corr, c.inputs, c.props, c.unknown, c.target)
				if err != nil {
					b.Fatal(err)
				}
				benchSolution = s
			}
		})
	}
}
