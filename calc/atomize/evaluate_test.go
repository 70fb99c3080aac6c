package atomize

import (
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"fogbench/calc/valid"
	"gonum.org/v1/gonum/floats/scalar"
)

func TestEvaluateRejectsBadInput(t *testing.T) {
	ok := map[string]float64{"delta_p_pa": 1e6, "mass_flow_kg_s": 0.01, "orifice_diameter_m": 1e-3}
	with := func(k string, v float64) map[string]float64 {
		m := map[string]float64{}
		for a, b := range ok {
			m[a] = b
		}
		m[k] = v
		return m
	}
	without := func(k string) map[string]float64 {
		m := with(k, 0)
		delete(m, k)
		return m
	}
	bad := ps1
	bad.SurfaceTension = math.NaN()
	cases := []struct {
		name, family, corr string
		inputs             map[string]float64
		props              Properties
		field, value       string
		msgHas             string
	}{
		{"NaN", "pressure-swirl", "", with("delta_p_pa", math.NaN()), ps1, "distribution.inputs.delta_p_pa", "NaN", ""},
		{"+Inf", "pressure-swirl", "", with("orifice_diameter_m", math.Inf(1)), ps1, "distribution.inputs.orifice_diameter_m", "+Inf", ""},
		{"zero", "pressure-swirl", "", with("mass_flow_kg_s", 0), ps1, "distribution.inputs.mass_flow_kg_s", "0", ""},
		{"negative", "pressure-swirl", "", with("delta_p_pa", -5), ps1, "distribution.inputs.delta_p_pa", "-5", ""},
		{"unknown input", "pressure-swirl", "", with("speed_rpm", 100), ps1, "distribution.inputs.speed_rpm", "100", "delta_p_pa"},
		{"missing required", "pressure-swirl", "", without("delta_p_pa"), ps1, "distribution.inputs.delta_p_pa", "", "required"},
		{"no flow spec", "pressure-swirl", "", without("mass_flow_kg_s"), ps1, "distribution.inputs.mass_flow_kg_s", "", "flow_number_m2"},
		{"two flow specs", "pressure-swirl", "", with("flow_number_m2", 3e-7), ps1, "distribution.inputs.flow_number_m2", "3e-07", "only one"},
		{"C_D above 1", "plain-orifice", "", map[string]float64{"delta_p_pa": 1e6, "orifice_diameter_m": 1e-3, "discharge_coefficient": 1.2}, ps1, "distribution.inputs.discharge_coefficient", "1.2", ""},
		{"half the geometry", "pressure-swirl", "", with("swirl_chamber_diameter_m", 4e-3), ps1, "distribution.inputs.inlet_port_area_m2", "", ""},
		{"cone angle 180", "pressure-swirl", "", with("cone_angle_deg", 180), ps1, "distribution.inputs.cone_angle_deg", "180", ""},
		{"needs cone angle", "pressure-swirl", "wang-lefebvre-1987", ok, ps1, "distribution.inputs.cone_angle_deg", "", "wang-lefebvre-1987"},
		{"bad property", "pressure-swirl", "", ok, bad, "properties.surface_tension_n_m", "NaN", ""},
		{"unknown family", "jet-mill", "", ok, ps1, "distribution.family", "jet-mill", "pressure-swirl"},
		{"unknown correlation", "pressure-swirl", "smith-2001", ok, ps1, "distribution.correlation", "smith-2001", "lefebvre-1987"},
		{"effervescent correlation", "effervescent", "lefebvre-1987", ok, ps1, "distribution.correlation", "lefebvre-1987", "no verified correlation"},
		{"overflow", "pressure-swirl", "", with("mass_flow_kg_s", 1e308), ps1, "distribution.inputs", "", "finite"},
	}
	for _, c := range cases {
		_, err := Evaluate(c.family, c.corr, c.inputs, c.props)
		var fe *valid.FieldError
		if !errors.As(err, &fe) {
			t.Errorf("%s: got %v, want a *valid.FieldError", c.name, err)
			continue
		}
		if fe.Field != c.field || (c.value != "" && fe.Value != c.value) || !strings.Contains(fe.Message, c.msgHas) {
			t.Errorf("%s: got field %q value %q message %q", c.name, fe.Field, fe.Value, fe.Message)
		}
	}
}

func TestFlowNumberUnitConsistency(t *testing.T) {
	// Exact unit definitions (units.go): the flow in the customary units,
	// computed from FN_US and FN_UK in lb/h and UK gal/h at ΔP in psi,
	// converted back to kg/s with 1 lb = 0.45359237 kg and 1 UK gal =
	// 4.54609 L, equals the SI mass flow; conversions round-trip. Tolerance
	// rel 1e-13 (only rounding).
	rng := rand.New(rand.NewPCG(3, 5))
	for i := 0; i < 200; i++ {
		rho := 600 + 800*rng.Float64()
		dp := math.Exp(math.Log(1e4) + rng.Float64()*math.Log(1e4))
		mdot := math.Exp(math.Log(1e-4) + rng.Float64()*math.Log(1e4))
		fn := flowNumberSI(mdot, rho, dp)
		us, uk := flowNumberUS(fn, rho), flowNumberUK(fn, rho)
		psi := dp / PSI
		lbPerHour := us * math.Sqrt(psi)
		galPerHour := uk * math.Sqrt(psi)
		if got := lbPerHour * Pound / Hour; !scalar.EqualWithinRel(got, mdot, 1e-13) {
			t.Fatalf("US: %g kg/s from FN_US, want %g", got, mdot)
		}
		if got := galPerHour * UKGallon / Hour * rho; !scalar.EqualWithinRel(got, mdot, 1e-13) {
			t.Fatalf("UK: %g kg/s from FN_UK, want %g", got, mdot)
		}
		if back := flowNumberSIFromUS(us, rho); !scalar.EqualWithinRel(back, fn, 1e-13) {
			t.Fatalf("US round trip %g vs %g", back, fn)
		}
		if back := flowNumberSIFromUK(uk, rho); !scalar.EqualWithinRel(back, fn, 1e-13) {
			t.Fatalf("UK round trip %g vs %g", back, fn)
		}
		// FN_SI = √2 C_D A0 (the definitions).
		d0 := 1e-3 * (0.2 + rng.Float64())
		cd := dischargeCoefficient(mdot, rho, dp, d0)
		if !scalar.EqualWithinRel(fn, math.Sqrt2*cd*orificeArea(d0), 1e-13) {
			t.Fatalf("FN = √2 C_D A0 fails: %g vs %g", fn, math.Sqrt2*cd*orificeArea(d0))
		}
	}
	// PSI from the exact pound, standard gravity and inch; NIST SP 811 B.8
	// gives 6.894757E+03 Pa.
	if !scalar.EqualWithinAbs(PSI, 6894.757, 5e-4) {
		t.Errorf("PSI = %.9g Pa", PSI)
	}
}

func TestEvaluateIdentities(t *testing.T) {
	// Seeded random points over every family: the chosen correlation comes
	// first, every estimate is positive and finite, the band spans the SMD
	// estimates, nothing in the JSON is NaN, and the result says the forms
	// are from memory.
	rng := rand.New(rand.NewPCG(11, 13))
	lu := func(lo, hi float64) float64 { return lo * math.Pow(hi/lo, rng.Float64()) }
	for i := 0; i < 300; i++ {
		p := Properties{LiquidDensity: lu(650, 1300), LiquidViscosity: lu(3e-4, 3e-2), SurfaceTension: lu(0.02, 0.075),
			GasDensity: lu(0.5, 30), GasViscosity: lu(1e-5, 3e-5)}
		fam := families[i%len(families)]
		in := map[string]float64{}
		for _, info := range fam.info.Inputs {
			if info.Required || rng.Float64() < 0.5 {
				in[info.Name] = lu(info.Min, info.Max)
			}
		}
		// Swirl geometry comes in pairs.
		if _, ok := in[inSwirlD]; ok {
			in[inPortArea] = lu(1e-7, 1e-5)
		} else {
			delete(in, inPortArea)
		}
		// Keep exactly one flow specification where one is needed.
		delete(in, inFlowNumber)
		delete(in, inCD)
		if fam.info.ID == "pressure-swirl" || fam.info.ID == "plain-orifice" || fam.info.ID == "air-assist" || fam.info.ID == "effervescent" {
			in[inMassFlow] = lu(1e-3, 0.1)
		}
		for _, c := range fam.corrs {
			r, err := Evaluate(fam.info.ID, c.info.ID, in, p)
			if err != nil {
				var fe *valid.FieldError
				if !errors.As(err, &fe) || c.needs == nil {
					t.Fatalf("%s/%s at %v: %v", fam.info.ID, c.info.ID, in, err)
				}
				continue
			}
			if r.SMD[0].Correlation != c.info.ID {
				t.Fatalf("%s: chosen %s not first", fam.info.ID, c.info.ID)
			}
			for _, e := range r.SMD {
				if !(e.SMD > 0) || math.IsInf(e.SMD, 0) || e.Status == "" || e.Status != e.Provenance.Status || e.Source != e.Provenance.Citation.String() {
					t.Fatalf("%s/%s: bad estimate %+v", fam.info.ID, e.Correlation, e)
				}
				if e.Quantity == quantitySMD && (e.SMD < r.SMDBand.Min || e.SMD > r.SMDBand.Max) {
					t.Fatalf("%s: %g outside band %+v", e.Correlation, e.SMD, r.SMDBand)
				}
				if !e.InRange && len(e.Warnings) == 0 {
					t.Fatalf("%s: out of range without a warning", e.Correlation)
				}
			}
			// An estimate whose published form was not confirmed is named
			// in a warning; a result of checked forms only carries none.
			for _, e := range r.SMD {
				named := strings.Contains(strings.Join(r.Warnings, "|"), "published form not confirmed here for") &&
					strings.Contains(strings.Join(r.Warnings, "|"), e.Correlation)
				if !e.Provenance.Checked && !named {
					t.Fatalf("%s: unconfirmed %s not named in the warnings %q", fam.info.ID, e.Correlation, r.Warnings)
				}
			}
			if _, err := json.Marshal(r); err != nil { // encoding/json rejects NaN and ±Inf
				t.Fatalf("%s: %v", fam.info.ID, err)
			}
		}
	}
}

func TestEvaluateFamilyDetails(t *testing.T) {
	// Effervescent: flow relations only, SMD marked unavailable.
	r, err := Evaluate("effervescent", "", map[string]float64{"delta_p_pa": 5e5, "orifice_diameter_m": 1e-3, "mass_flow_kg_s": 0.01, "alr": 0.05}, po1)
	if err != nil {
		t.Fatal(err)
	}
	if len(r.SMD) != 0 || !strings.Contains(r.SMDStatus, "no verified correlation available") {
		t.Errorf("effervescent SMD: %v, status %q", r.SMD, r.SMDStatus)
	}
	if !scalar.EqualWithinRel(r.GasMassFlow, 5e-4, 1e-15) || !r.FlowKnown {
		t.Errorf("effervescent gas flow %g, flow known %v", r.GasMassFlow, r.FlowKnown)
	}

	// Airblast at AB1: both prefilming forms and the warning about their
	// disagreement (about 2.9× at this point, hand arithmetic from the two
	// forms).
	r, err = Evaluate("airblast", "", map[string]float64{"air_velocity_m_s": 100, "alr": 3, "prefilmer_diameter_m": 0.02, "hydraulic_diameter_m": 0.02}, ps1)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(strings.Join(r.Warnings, "|"), "prefilming airblast forms differ by a factor of 2.87") {
		t.Errorf("no prefilming disagreement warning: %q", r.Warnings)
	}

	// Pressure-swirl with geometry: C_D, cone angle and film from Rizk &
	// Lefebvre (PS1 values, hand arithmetic from the forms).
	r, err = Evaluate("pressure-swirl", "", map[string]float64{"delta_p_pa": 1e6, "orifice_diameter_m": 1e-3, "swirl_chamber_diameter_m": 4e-3, "inlet_port_area_m2": 2e-6}, ps1)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinRel(r.DischargeCoefficient, 0.35, 1e-12) || !r.ConeAngleKnown || !r.FilmThicknessKnown {
		t.Errorf("geometry: C_D %g cone %v film %v", r.DischargeCoefficient, r.ConeAngleKnown, r.FilmThicknessKnown)
	}

	// Ultrasonic: Lang gives a number median, flagged as not an SMD.
	r, err = Evaluate("ultrasonic", "", map[string]float64{"frequency_hz": 40e3}, po1)
	if err != nil {
		t.Fatal(err)
	}
	if r.SMD[0].Quantity == quantitySMD || len(r.SMD[0].Warnings) == 0 || r.SMDBand.Count != 0 {
		t.Errorf("lang-1962 estimate not flagged as a number median: %+v", r.SMD[0])
	}

	// Plain orifice: out of the Elkotb pressure range gives a warning.
	r, err = Evaluate("plain-orifice", "elkotb-1982", map[string]float64{"delta_p_pa": 1e6, "orifice_diameter_m": 0.3e-3, "orifice_length_m": 1e-3}, po2)
	if err != nil {
		t.Fatal(err)
	}
	if r.SMD[0].InRange || !strings.Contains(strings.Join(r.Warnings, "|"), "elkotb-1982: delta_p_pa") {
		t.Errorf("elkotb at 1 MPa not flagged: %+v", r.SMD[0])
	}
	if !scalar.EqualWithinRel(r.DischargeCoefficient, 0.827-0.0085/0.3, 1e-12) {
		t.Errorf("C_D from orifice length: %g", r.DischargeCoefficient)
	}
}

func TestFamiliesInfo(t *testing.T) {
	fs := Families()
	if len(fs) != 7 {
		t.Fatalf("%d families", len(fs))
	}
	for _, f := range fs {
		if f.RosinRammlerQ <= 0 || f.RosinRammlerQSource == "" {
			t.Errorf("%s: no Rosin–Rammler q with source", f.ID)
		}
		if f.DefaultCorrelation == "" && f.SMDStatus == "" {
			t.Errorf("%s: neither a default correlation nor an SMD status", f.ID)
		}
		for _, in := range f.Inputs {
			if in.Unit == "" || in.Description == "" || !(in.Min > 0 && in.Min <= in.Typical && in.Typical <= in.Max) {
				t.Errorf("%s: input %+v incomplete", f.ID, in)
			}
		}
		for _, c := range f.Correlations {
			if c.Equation == "" || c.FittedUnits == "" || c.Validity == "" || c.Source == "" || c.Status == "" {
				t.Errorf("%s/%s: description incomplete: %+v", f.ID, c.ID, c)
			}
			for _, r := range c.Ranges {
				if !(r.Min < r.Max) || r.Source == "" {
					t.Errorf("%s/%s: bad range %+v", f.ID, c.ID, r)
				}
			}
		}
	}
	// The copies are independent of the package.
	fs[0].Correlations[0].ID = "changed"
	if Families()[0].Correlations[0].ID == "changed" {
		t.Error("Families returns the package's own slices")
	}
}
