package calc

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// The steady temperature of a 0.8–1 mm water drop in still moist air at
// 101325 Pa, through Evaluate with calc/fluid's real film properties,
// against the thermodynamic wet-bulb temperatures of psychrolib 1.1.1 (npm;
// ASHRAE Handbook—Fundamentals 2017 ch. 1 eqs. 33/35), 10–45 °C and 0–90 %
// RH, testdata/evap/wetbulb_psychrolib.csv (testdata/evap/gen_psychrolib.mjs).
// The far field gets psychrolib's own vapor pressure, so only the two models
// differ. A stagnant drop's heat-to-mass transfer ratio is the Lewis number
// (Nu = Sh = 2), about 0.85 for water vapor in air, where adiabatic
// saturation has 1; with c_p,v = 1870 in the Stefan-flow form the drop runs
// up to 1–1.5 K colder in dry air (Abramzon & Sirignano 1989 stagnant form,
// from memory, computed by independent arithmetic: 6.948 against 8.248 °C at
// 25 °C) and the gap closes towards saturation. Hence ±2 K, the
// drop never warmer than the wet bulb by more than tolWarm = 0.01 K, and the
// gap at 90 % RH smaller than in dry air at the same dry-bulb temperature.
// Rows whose wet bulb is below 2 °C are left out: the drop would fall below
// 273.15 K, where calc/fluid holds water's properties constant.
func TestEvaluateSteadyTemperaturePsychrolib(t *testing.T) {
	const tolModel, tolWarm = 2.0, 0.01
	b, err := os.ReadFile("../testdata/evap/wetbulb_psychrolib.csv")
	if err != nil {
		t.Fatal(err)
	}
	head, body, _ := strings.Cut(string(b), "\n")
	if !strings.HasPrefix(head, "# psychrolib ") {
		t.Fatalf("first line does not name the library: %q", head)
	}
	recs, err := csv.NewReader(strings.NewReader(body)).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(recs) < 41 || recs[0][0] != "t_dry_c" || recs[0][2] != "vapor_pressure_pa" || recs[0][4] != "t_wet_bulb_c" {
		t.Fatalf("unexpected table: header %v, %d lines", recs[0], len(recs))
	}
	gap := map[[2]float64]float64{}
	checked := 0
	for _, r := range recs[1:] {
		var v [5]float64
		for i := range v {
			if v[i], err = strconv.ParseFloat(r[i], 64); err != nil {
				t.Fatal(err)
			}
		}
		tDry, rh, pv, twb := v[0], v[1], v[2], v[4]
		if twb < 2 {
			continue
		}
		c := Case{Format: CaseFormat, Name: "psychrometric check", Fluid: "water",
			Gas: Gas{PressurePa: 101325, TemperatureK: 273.15 + tDry, VaporPartialPressurePa: ptr(pv)},
			Distribution: Distribution{Model: "bins", EdgesM: []float64{0.8e-3, 0.9e-3, 1e-3},
				Fraction: []float64{0.5, 0.5}, Basis: "volume"},
			Evaporation: Evaporation{Convection: "none"},
		}
		res, err := Evaluate(c)
		if err != nil {
			t.Fatalf("%g °C, RH %g: %v", tDry, rh, err)
		}
		large := res.Bins[len(res.Bins)-1]
		d := large.SurfaceTemperatureK - 273.15 - twb
		if math.Abs(d) > tolModel || d > tolWarm {
			t.Errorf("%g °C, RH %g: %g µm drop at %.3f °C, psychrolib wet bulb %.3f °C (diff %.3f K)",
				tDry, rh, large.DM*1e6, large.SurfaceTemperatureK-273.15, twb, d)
		}
		gap[[2]float64{tDry, rh}] = d
		checked++
	}
	if checked < 70 {
		t.Fatalf("only %d rows checked", checked)
	}
	for k, humid := range gap {
		if k[1] != 0.9 {
			continue
		}
		if dry, ok := gap[[2]float64{k[0], 0}]; ok && !(math.Abs(humid) < math.Abs(dry)) {
			t.Errorf("%g °C: gap at 90 %% RH %.3f K not below the dry gap %.3f K", k[0], humid, dry)
		}
	}
}
