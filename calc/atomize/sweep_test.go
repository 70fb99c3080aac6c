package atomize

import (
	"errors"
	"math"
	"testing"

	"fogbench/calc/valid"
	"gonum.org/v1/gonum/floats/scalar"
)

func TestSweepMatchesEvaluate(t *testing.T) {
	in := map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3, "cone_angle_deg": 80}
	s, err := Sweep("pressure-swirl", in, ps1, "delta_p_pa", 5e4, 2e7, 25)
	if err != nil {
		t.Fatal(err)
	}
	if !s.LogSpaced || s.X[0] != 5e4 || s.X[24] != 2e7 {
		t.Fatalf("grid: log %v, ends %g %g", s.LogSpaced, s.X[0], s.X[24])
	}
	if _, given := in["delta_p_pa"]; given {
		t.Fatal("Sweep changed the caller's inputs")
	}
	for i, x := range s.X {
		pin := map[string]float64{"delta_p_pa": x}
		for k, v := range in {
			pin[k] = v
		}
		r, err := Evaluate("pressure-swirl", "", pin, ps1)
		if err != nil {
			t.Fatal(err)
		}
		for _, ser := range s.Series {
			e, ok := r.Estimate(ser.Correlation)
			if !ok || !ser.Valid[i] || e.SMD != ser.SMD[i] || e.InRange != ser.InRange[i] {
				t.Errorf("%s at %g: sweep %g (valid %v, in range %v), evaluate %g (%v)", ser.Correlation, x,
					ser.SMD[i], ser.Valid[i], ser.InRange[i], e.SMD, e.InRange)
			}
		}
		// Identity: with fixed ṁ_L every SMD form here falls with ΔP.
		if i > 0 {
			for _, ser := range s.Series {
				if !(ser.SMD[i] < ser.SMD[i-1]) {
					t.Errorf("%s not falling with ΔP at %g", ser.Correlation, x)
				}
			}
		}
	}
	// The ends lie outside the 0.1–10 MPa range (common practice bounds).
	if s.Series[0].InRange[0] || s.Series[0].InRange[24] || !s.Series[0].InRange[12] {
		t.Errorf("in-range flags at the ends and middle: %v %v %v", s.Series[0].InRange[0], s.Series[0].InRange[24], s.Series[0].InRange[12])
	}
	if !s.Series[0].HasRange || s.Series[0].RangeMax != 1e7 {
		t.Errorf("validity range of the swept variable not reported: %+v", s.Series[0])
	}
}

func TestSweepMassFlowScaling(t *testing.T) {
	// Identity from the flow-number definition: at fixed FN, ṁ_L ∝ ΔP^0.5.
	in := map[string]float64{"flow_number_m2": 3.58e-7, "orifice_diameter_m": 1e-3}
	s, err := Sweep("pressure-swirl", in, ps1, "delta_p_pa", 1e5, 9e5, 9)
	if err != nil {
		t.Fatal(err)
	}
	if s.LogSpaced {
		t.Error("hi/lo = 9 should be evenly spaced")
	}
	for i, x := range s.X {
		if want := 3.58e-7 * math.Sqrt(780*x); !s.MassFlowKnown[i] || !scalar.EqualWithinRel(s.MassFlow[i], want, 1e-13) {
			t.Errorf("ΔP %g: ṁ %g, want %g", x, s.MassFlow[i], want)
		}
	}
}

func TestSweepInvalidPoints(t *testing.T) {
	// Without the cone angle Wang–Lefebvre cannot be evaluated: its points
	// are invalid and zero, never NaN, and the reason is given once.
	in := map[string]float64{"mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	s, err := Sweep("pressure-swirl", in, ps1, "delta_p_pa", 1e5, 1e6, 5)
	if err != nil {
		t.Fatal(err)
	}
	for _, ser := range s.Series {
		for i, v := range ser.SMD {
			if math.IsNaN(v) {
				t.Fatalf("%s: NaN at %d", ser.Correlation, i)
			}
			if ser.Correlation == "wang-lefebvre-1987" && (ser.Valid[i] || v != 0) {
				t.Errorf("wang-lefebvre-1987 valid without a cone angle")
			}
		}
	}
	// Every pressure-swirl form was checked, so only the missing-cone
	// reason is left.
	if len(s.Warnings) != 1 {
		t.Errorf("want the missing-cone reason once, got %q", s.Warnings)
	}
	for _, c := range []struct {
		variable string
		lo, hi   float64
		n        int
		field    string
	}{
		{"speed_rpm", 1, 2, 5, "sweep.variable"},
		{"delta_p_pa", 0, 2, 5, "sweep.lo"},
		{"delta_p_pa", 2, 1, 5, "sweep.hi"},
		{"delta_p_pa", 1, math.Inf(1), 5, "sweep.hi"},
		{"delta_p_pa", 1, 2, 1, "sweep.n"},
	} {
		_, err := Sweep("pressure-swirl", in, ps1, c.variable, c.lo, c.hi, c.n)
		var fe *valid.FieldError
		if !errors.As(err, &fe) || fe.Field != c.field {
			t.Errorf("%+v: got %v, want field %s", c, err, c.field)
		}
	}
}
