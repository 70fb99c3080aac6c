package flash

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/fluid"
)

// *fluid.Liquid is the property source calc hands to this package.
var _ Liquid = (*fluid.Liquid)(nil)

// Regime labels at and around the thresholds (Lacey et al. 2017, from
// memory: p_amb/p_sat = 1 and 0.3).
func TestRegimeThresholds(t *testing.T) {
	for _, c := range []struct {
		rp   float64
		want string
	}{
		{0.5, RegimeNone}, {math.Nextafter(1, 0), RegimeNone}, {1, RegimeTransitional}, {2, RegimeTransitional},
		{3.3, RegimeTransitional}, {1 / 0.3, RegimeFull}, {10, RegimeFull}, {math.NaN(), RegimeNone},
	} {
		if got := Regime(c.rp); got != c.want {
			t.Errorf("Regime(%g) = %q, want %q", c.rp, got, c.want)
		}
	}
}

// Jakob number by hand: ρ_l = 950, c_p = 4200, ΔT = 20 K, ρ_v = 0.6,
// h_fg = 2.257e6: 950·4200·20 = 7.98e7; 0.6·2.257e6 = 1.3542e6;
// Ja = 7.98e7/1.3542e6 = 58.92778. Tolerance rel 1e-6.
func TestJakobHandArithmetic(t *testing.T) {
	if ja := Jakob(950, 4200, 20, 0.6, 2.257e6); !scalar.EqualWithinAbsOrRel(ja, 58.92778, 0, 1e-6) {
		t.Errorf("Ja = %.8g, want 58.92778", ja)
	}
}

// Analyze on the stub, whose T_sat and p_sat are exact: the superheat,
// ratio and regime follow their definitions; Ja uses the Peng–Robinson
// vapor at (T_sat, p), which at 1 atm is within 2 % of the ideal gas.
func TestAnalyzeStub(t *testing.T) {
	l := waterLikeStub()
	r, err := Analyze(l, 400, 101325, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(r.DeltaTK, 400-373.15, 1e-9, 0) {
		t.Errorf("ΔT = %g", r.DeltaTK)
	}
	if !scalar.EqualWithinAbsOrRel(r.PressureRatio, l.SaturationPressure(400)/101325, 0, 1e-12) || r.Regime != RegimeTransitional {
		t.Errorf("R_p = %g, regime %q", r.PressureRatio, r.Regime)
	}
	ideal := 101325 * l.m / (8.314462618 * 373.15)
	if !scalar.EqualWithinAbsOrRel(r.VaporDensityKgM3, ideal, 0, 0.02) {
		t.Errorf("ρ_v = %g, ideal gas %g", r.VaporDensityKgM3, ideal)
	}
	if want := Jakob(l.rho, l.cp, r.DeltaTK, r.VaporDensityKgM3, l.h); !scalar.EqualWithinAbsOrRel(r.Jakob, want, 0, 1e-12) {
		t.Errorf("Ja = %g, want %g", r.Jakob, want)
	}
	// The stub keeps σ = 0.058 N/m up to Tc, so the barrier never falls far
	// enough: J stays below 1e12 /(m3 s) and there is no kinetic limit.
	if r.HasKineticLimit || !r.HasSpinodal || !(r.SpinodalK > 400) || r.Note == "" {
		t.Errorf("kinetic limit %v %g, spinodal %v %g, note %q", r.HasKineticLimit, r.KineticLimitK, r.HasSpinodal, r.SpinodalK, r.Note)
	}
	if _, err := Analyze(l, 360, 101325, Options{}); !errors.Is(err, ErrSubcooled) {
		t.Errorf("subcooled: %v, want ErrSubcooled", err)
	}
	for name, c := range map[string][2]float64{"T NaN": {math.NaN(), 1e5}, "T above Tc": {700, 1e5}, "p zero": {400, 0}, "p Inf": {400, math.Inf(1)}} {
		if _, err := Analyze(l, c[0], c[1], Options{}); err == nil {
			t.Errorf("%s: no error", name)
		}
	}
	if _, err := Analyze(l, 400, 1e5, Options{NucleationThreshold: -1}); err == nil {
		t.Error("negative threshold accepted")
	}
}

// Water sprayed at 180 °C into 1 atm: R_p ≈ 9.9 flashes fully by the
// regime map, and the warnings flag a liquid past its kinetic limit.
func TestAnalyzeWaterRegimesAndWarnings(t *testing.T) {
	l, _ := fluid.Lookup("water")
	r, err := Analyze(l, 453.15, 101325, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if r.Regime != RegimeFull || len(r.Warnings) != 0 {
		t.Errorf("regime %q, warnings %q", r.Regime, r.Warnings)
	}
	hot, err := Analyze(l, r.KineticLimitK+2, 101325, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(hot.Warnings) == 0 || hot.Nucleus.Rate < DefaultNucleationThreshold {
		t.Errorf("above the kinetic limit: warnings %q, J = %g", hot.Warnings, hot.Nucleus.Rate)
	}
}

// Property test over a grid of liquids, pressures and temperatures, plus
// seeded random states: every superheated state gives finite, non-negative
// figures with r_c > 0 (it may be +Inf only at exact saturation) and a
// kinetic limit between T_sat and Tc; every subcooled state is
// ErrSubcooled.
func TestAnalyzeGridFiniteAndNonNegative(t *testing.T) {
	rng := rand.New(rand.NewPCG(13, 1))
	for _, l := range fluid.Liquids() {
		tc := l.CriticalTemperature()
		for _, p := range []float64{2e3, 2e4, 101325, 5e5, 2e6} {
			ts, err := l.SaturationTemperature(p)
			if err != nil {
				continue // the pressure is beyond this liquid's critical point
			}
			var temps []float64
			for i := 0; i <= 12; i++ {
				temps = append(temps, ts-30+float64(i)/12*(tc*0.999-ts+30))
			}
			for range 4 {
				temps = append(temps, ts+rng.Float64()*(tc-ts))
			}
			for _, T := range temps {
				if T <= l.MeltingPoint() || T >= tc {
					continue
				}
				r, err := Analyze(l, T, p, Options{})
				if l.SaturationPressure(T) < p {
					if !errors.Is(err, ErrSubcooled) {
						t.Errorf("%s T = %g p = %g: subcooled gave %v", l.ID, T, p, err)
					}
					continue
				}
				if err != nil {
					t.Errorf("%s T = %g p = %g: %v", l.ID, T, p, err)
					continue
				}
				vals := map[string]float64{
					"ΔT": r.DeltaTK, "R_p": r.PressureRatio, "Ja": r.Jakob, "ρ_v": r.VaporDensityKgM3,
					"p_v*": r.Nucleus.BubbleVaporPa, "r_c": r.Nucleus.CriticalRadiusM, "W": r.Nucleus.BarrierJ,
					"J": r.Nucleus.Rate, "T_kl": r.KineticLimitK, "T_sp": r.SpinodalK,
				}
				for k, v := range vals {
					if math.IsNaN(v) || v < 0 || (math.IsInf(v, 0) && k != "r_c" && k != "W") {
						t.Errorf("%s T = %g p = %g: %s = %g", l.ID, T, p, k, v)
					}
				}
				if math.IsInf(r.Nucleus.CriticalRadiusM, 0) && r.PressureRatio > 1+1e-9 {
					t.Errorf("%s T = %g p = %g: r_c infinite at R_p = %g", l.ID, T, p, r.PressureRatio)
				}
				if r.HasKineticLimit && !(r.KineticLimitK > r.SaturationTemperatureK && r.KineticLimitK < tc) {
					t.Errorf("%s p = %g: T_kl = %g outside (%g, %g)", l.ID, p, r.KineticLimitK, r.SaturationTemperatureK, tc)
				}
			}
		}
	}
}

func TestPTDiagram(t *testing.T) {
	l, _ := fluid.Lookup("n-heptane")
	d, err := PTDiagram(l, 1e4, 0, 30)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Saturation) != 30 || len(d.KineticLimit) < 25 || len(d.Spinodal) < 2 {
		t.Fatalf("lines of %d, %d, %d points", len(d.Saturation), len(d.KineticLimit), len(d.Spinodal))
	}
	// At every kinetic-limit point the liquid is superheated and below the
	// spinodal temperature at that pressure.
	m := PengRobinson{Tc: l.CriticalTemperature(), Pc: l.CriticalPressure(), Omega: l.AcentricFactor()}
	for _, pt := range d.KineticLimit {
		tsp, err := m.SpinodalTemperature(pt.PPa)
		if l.SaturationPressure(pt.TK) < pt.PPa || (err == nil && pt.TK > tsp) {
			t.Errorf("kinetic limit (%g K, %g Pa): p_sat %g, T_sp %g", pt.TK, pt.PPa, l.SaturationPressure(pt.TK), tsp)
		}
	}
	for _, pt := range append(append(d.Saturation, d.Spinodal...), d.KineticLimit...) {
		if !(pt.PPa > 0) || math.IsInf(pt.PPa, 0) || !(pt.TK > 0) {
			t.Errorf("bad point %+v", pt)
		}
	}
	if _, err := PTDiagram(l, 1e4, 0, 1); err == nil {
		t.Error("one point accepted")
	}
	if _, err := PTDiagram(l, -5, 0, 10); err == nil {
		t.Error("negative pressure accepted")
	}
}
