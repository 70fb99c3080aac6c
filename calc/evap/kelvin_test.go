package evap

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/phys"
)

// Stub check against IAPWS R7-97(2012) Table 35 and IAPWS R1-76(2014)
// Table 1 (values read in the releases), so the water used below is the
// published water.
func TestWaterStub(t *testing.T) {
	const tolPsat = 1e-8
	for _, c := range []struct{ T, p float64 }{{300, 0.353658941e4}, {500, 0.263889776e7}, {600, 0.123443146e8}} {
		if got := if97SaturationPressure(c.T); !scalar.EqualWithinAbsOrRel(got, c.p, 0, tolPsat) {
			t.Errorf("p_sat(%g) = %.9g Pa, want %.9g", c.T, got, c.p)
		}
	}
	const tolSigma = 1e-8
	for _, c := range []struct{ T, s float64 }{{300, 71.6859625e-3}, {450, 42.8914992e-3}} {
		if got := r176SurfaceTension(c.T); !scalar.EqualWithinAbsOrRel(got, c.s, 0, tolSigma) {
			t.Errorf("σ(%g) = %.9g N/m, want %.9g", c.T, got, c.s)
		}
	}
}

// Laplace pressure of water at 25 °C, σ = 0.0719722 N/m (IAPWS R1-76);
// values computed from Δp = 2σ/r (Young–Laplace).
func TestLaplacePressure(t *testing.T) {
	const tol = 1e-5
	sigma := r176SurfaceTension(298.15)
	if !scalar.EqualWithinAbsOrRel(sigma, 0.0719722, 0, 1e-6) {
		t.Fatalf("σ(298.15 K) = %.7g, want 0.0719722", sigma)
	}
	// Radius at which the Laplace pressure is one atmosphere: r = 2σ/p.
	rAtm := 2 * sigma / phys.StandardAtmosphere
	if !scalar.EqualWithinAbsOrRel(rAtm, 1.42062e-6, 0, tol) {
		t.Errorf("r(Δp = 1 atm) = %.6g m, want 1.42062e-6", rAtm)
	}
	if got := LaplacePressure(sigma, rAtm); !scalar.EqualWithinAbsOrRel(got, phys.StandardAtmosphere, 0, 1e-12) {
		t.Errorf("Δp at that radius = %g", got)
	}
	for _, c := range []struct{ r, dp float64 }{{1e-9, 1.43944e8}, {1e-8, 1.43944e7}, {1e-7, 1.43944e6}, {1e-6, 1.43944e5}} {
		if got := LaplacePressure(sigma, c.r); !scalar.EqualWithinAbsOrRel(got, c.dp, 0, tol) {
			t.Errorf("Δp(r=%g) = %.6g, want %.6g", c.r, got, c.dp)
		}
	}
}

// Kelvin ratios for water at 298.15 K, computed from the Kelvin equation:
// σ = 0.0719722 N/m, V_m = 0.018015268/997.047013 = 1.80686244e-5 m3/mol,
// Kelvin length 2σV_m/(RT) = 2·0.0719722·1.80686244e-5/(8.314462618·298.15)
// = 1.049182 nm; S = exp(1.049182 nm / r).
func TestKelvinRatio(t *testing.T) {
	sigma := r176SurfaceTension(298.15)
	vm := phys.MolarMassWater / 997.047013
	if !scalar.EqualWithinAbsOrRel(vm, 1.80686244e-5, 0, 1e-8) {
		t.Fatalf("V_m = %.9g", vm)
	}
	if lk := KelvinLength(sigma, vm, 298.15); !scalar.EqualWithinAbsOrRel(lk, 1.049182e-9, 0, 1e-6) {
		t.Errorf("Kelvin length = %.7g m, want 1.049182e-9", lk)
	}
	// The table is rounded; the tolerance is half a unit in its last digit
	// (tighter than the rel 1e-5…1e-9 the table lists wherever that is
	// below its own rounding).
	for _, c := range []struct{ r, s, tol float64 }{
		{1e-9, 2.855315, 5e-7}, {2e-9, 1.689768, 5e-7}, {5e-9, 1.233476, 5e-7},
		{1e-8, 1.110620, 5e-7}, {1e-7, 1.010547, 5e-7}, {1e-6, 1.0010497, 5e-8}, {1e-5, 1.00010492, 5e-9},
	} {
		if got := KelvinRatio(sigma, vm, c.r, 298.15); !scalar.EqualWithinAbsOrRel(got, c.s, c.tol, 0) {
			t.Errorf("S(r=%g) = %.9g, want %.9g (tol %g)", c.r, got, c.s, c.tol)
		}
	}
	l := water(997.047013)
	if got, want := CurvedVaporPressure(l, 298.15, 1e-8), if97SaturationPressure(298.15)*1.110620; !scalar.EqualWithinAbsOrRel(got, want, 0, 1e-6) {
		t.Errorf("curved p_v = %g, want %g", got, want)
	}
	// The cap keeps absurdly small radii finite.
	if s := KelvinRatio(sigma, vm, 1e-15, 298.15); math.IsInf(s, 0) || math.IsNaN(s) {
		t.Errorf("S(1 fm) = %g, want finite", s)
	}
}

// Evaporation enhancement by curvature, computed by independent arithmetic: water
// in dry air at 101325 Pa with B_M evaluated at the same temperature;
// E = ln(1+B_M(r))/ln(1+B_M(∞)).
func TestEnhancementIsothermal(t *testing.T) {
	const tol = 6e-7 // absolute: half a unit in the 6th decimal the table quotes
	c := waterInAir()
	flat := *c
	flat.Curvature = false
	s, err := flat.Drop(2e-6, 298.15)
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(s.SurfaceVaporMassFraction, 0.019690, tol, 0) || !scalar.EqualWithinAbsOrRel(s.BM, 0.020086, tol, 0) {
		t.Errorf("flat: Y_s = %.6g (want 0.019690), B_M = %.6g (want 0.020086)", s.SurfaceVaporMassFraction, s.BM)
	}
	if x := s.VaporPressure / c.Pressure; !scalar.EqualWithinAbsOrRel(x, 0.031283, tol, 0) {
		t.Errorf("X_s = %.6g, want 0.031283", x)
	}
	for _, k := range []struct{ r, bm, e float64 }{{10e-9, 0.022387, 1.113342}, {100e-9, math.NaN(), 1.010783}} {
		s, err := c.Drop(2*k.r, 298.15)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(s.Enhancement, k.e, tol, 0) {
			t.Errorf("E(r=%g) = %.7f, want %.6f", k.r, s.Enhancement, k.e)
		}
		if !math.IsNaN(k.bm) && !scalar.EqualWithinAbsOrRel(s.BM, k.bm, tol, 0) {
			t.Errorf("B_M(r=%g) = %.6g, want %.6g", k.r, s.BM, k.bm)
		}
	}
}

// Enhancement at the dry-air wet-bulb state, computed by independent arithmetic:
// T_s = 281.4211 K, σ = σ_R1-76(T_s) ≈ 0.07447 N/m, ρ_L = 999.86 kg/m3, so the
// Kelvin length is 1.14692 nm; p_sat = 1092.956 Pa, B_M(∞) = 0.006782.
func TestEnhancementWetBulb(t *testing.T) {
	// Absolute: the inputs (T_s, ρ_L) are quoted to 6–7 digits.
	const tolS, tolE = 2e-6, 2e-6
	c := waterInAir()
	c.Liquid = water(999.86)
	const ts = 281.4211
	if got := if97SaturationPressure(ts); !scalar.EqualWithinAbsOrRel(got, 1092.956, 0, 1e-6) {
		t.Errorf("p_sat(T_s) = %.7g, want 1092.956", got)
	}
	if lk := KelvinLength(r176SurfaceTension(ts), phys.MolarMassWater/999.86, ts); !scalar.EqualWithinAbsOrRel(lk, 1.14692e-9, 0, 1e-5) {
		t.Errorf("Kelvin length = %.6g, want 1.14692e-9", lk)
	}
	for _, k := range []struct{ r, s, e float64 }{
		{5e-9, 1.257825, 1.260261}, {10e-9, 1.121528, 1.122551}, {50e-9, 1.023204, 1.023381},
		{100e-9, 1.011535, 1.011623}, {1e-6, 1.001148, 1.001156},
	} {
		s, err := c.Drop(2*k.r, ts)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(s.KelvinRatio, k.s, tolS, 0) || !scalar.EqualWithinAbsOrRel(s.Enhancement, k.e, tolE, 0) {
			t.Errorf("r=%g: S = %.7f (want %.6f), E = %.7f (want %.6f)", k.r, s.KelvinRatio, k.s, s.Enhancement, k.e)
		}
	}
}
