package fluid

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// IAPWS R7-97(2012) Table 35 (p_s(T)) and Table 36 (T_s(p)) verification
// values, read in python3-iapws test.py test_IAPWS97_4.
func TestWaterIF97Region4Tables35And36(t *testing.T) {
	const tolP = 1e-8 // relative, Table 35 prints 9 significant digits
	for _, c := range []struct{ T, pMPa float64 }{
		{300, 0.353658941e-2},
		{500, 0.263889776e1},
		{600, 0.123443146e2},
	} {
		got := waterSaturationPressure(c.T) / 1e6
		if !scalar.EqualWithinAbsOrRel(got, c.pMPa, 0, tolP) {
			t.Errorf("p_s(%g K) = %.9e MPa, want %.9e", c.T, got, c.pMPa)
		}
	}
	const tolT = 1e-6 // K, Table 36 prints 9 significant digits
	for _, c := range []struct{ pMPa, T float64 }{
		{0.1, 0.372755919e3},
		{1, 0.453035632e3},
		{10, 0.584149488e3},
	} {
		l, _ := Lookup("water")
		got, err := l.SaturationTemperature(c.pMPa * 1e6)
		if err != nil {
			t.Fatal(err)
		}
		if !scalar.EqualWithinAbsOrRel(got, c.T, tolT, 0) {
			t.Errorf("T_s(%g MPa) = %.9f K, want %.9f", c.pMPa, got, c.T)
		}
	}
}

// IAPWS R1-76(2014) Table 1 values (read in python3-iapws test.py
// test_Tension), printed to 0.01 mN/m.
func TestWaterSurfaceTensionR176Table1(t *testing.T) {
	const tol = 0.005e-3 // N/m, half the last printed digit
	l, _ := Lookup("water")
	for _, c := range []struct{ T, mNm float64 }{
		{273.16, 75.65},
		{293.15, 72.74},
		{298.15, 71.97}, // 25 degC
		{303.15, 71.19},
		{323.15, 67.94},
		{373.15, 58.91}, // 100 degC
		{473.15, 37.67},
	} {
		got := l.SurfaceTension(c.T)
		if !scalar.EqualWithinAbsOrRel(got, c.mNm*1e-3, tol, 0) {
			t.Errorf("sigma(%g K) = %.5f mN/m, want %.2f", c.T, got*1e3, c.mNm)
		}
	}
	// python3-iapws _Tension docstring values, printed to 9 digits.
	for _, c := range []struct{ T, mNm float64 }{{300, 71.6859625}, {450, 42.8914992}} {
		if got := waterSurfaceTension(c.T) * 1e3; !scalar.EqualWithinAbsOrRel(got, c.mNm, 0, 1e-8) {
			t.Errorf("sigma(%g K) = %.7f mN/m, want %.7f", c.T, got, c.mNm)
		}
	}
}

// IAPWS R7-97(2012) Table 5, region 1 at 300 K, 80 MPa: cp = 4.01008987
// kJ/(kg K), read in the python3-iapws 1.5.2 _Region1 docstring.
func TestWaterRegion1HeatCapacity(t *testing.T) {
	if got := waterRegion1HeatCapacity(300, 80e6) / 1e3; !scalar.EqualWithinAbsOrRel(got, 4.01008987, 0, 1e-8) {
		t.Errorf("cp(300 K, 80 MPa) = %.8f kJ/(kg K), want 4.01008987", got)
	}
}

// IAPWS R12-08 Table 4 check via python3-iapws 1.5.2 _Viscosity docstring:
// _Viscosity(998, 298.15) = 0.0008897351001498108 Pa s (no critical term).
func TestWaterViscosityR1208(t *testing.T) {
	if got := waterViscosity(298.15, 998); !scalar.EqualWithinAbsOrRel(got, 0.0008897351001498108, 0, 1e-12) {
		t.Errorf("mu(298.15 K, 998 kg/m3) = %.16g Pa s", got)
	}
	// python3-iapws _ThCond(0, 873.15) = 0.07910346589648833 W/(m K), the dilute term.
	if got := waterDiluteConductivity(873.15); !scalar.EqualWithinAbsOrRel(got, 0.07910346589648833, 0, 1e-12) {
		t.Errorf("lambda0(873.15 K) = %.16g W/(m K)", got)
	}
}

// Values of the same equations (IF97 eqs. 30, 31) computed by independent
// arithmetic.
func TestWaterIF97Computed(t *testing.T) {
	if got := waterSaturationPressure(298.15); !scalar.EqualWithinAbsOrRel(got, 3169.747, 0, 1e-6) {
		t.Errorf("p_s(298.15 K) = %.3f Pa", got)
	}
	if got := waterSaturationPressure(373.15); !scalar.EqualWithinAbsOrRel(got, 101417.98, 0, 1e-6) {
		t.Errorf("p_s(373.15 K) = %.2f Pa", got)
	}
	if got := waterSaturationTemperature(101325); !scalar.EqualWithinAbsOrRel(got, 373.1243, 1e-4, 0) {
		t.Errorf("T_s(101325 Pa) = %.4f K", got)
	}
}

// Water is densest at 3.98 degC, 277.13 K (common knowledge; Kell 1975, from
// memory); the SR1-86 saturated-liquid density must peak there within 0.3 K.
func TestWaterDensityMaximum(t *testing.T) {
	best, tBest := 0.0, 0.0
	for T := 273.16; T < 285; T += 0.001 {
		if d := waterSaturatedLiquidDensity(T); d > best {
			best, tBest = d, T
		}
	}
	if tBest < 276.83 || tBest > 277.43 {
		t.Errorf("density maximum at %.3f K (%.4f kg/m3)", tBest, best)
	}
}
