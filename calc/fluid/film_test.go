package fluid

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// The 1/3 rule (Hubbard, Denny & Mills 1975, from memory; computed by
// independent arithmetic):
// Ts = 342 K, Tinf = 850 K gives Tr = 511.333 K; Ys = 1, Yinf = 0 gives
// Yr = 2/3. The mixture values are re-derived here by hand from the pure
// properties at Tr, so the test checks the mixing rules, not the pure data.
func TestFilmPropertiesOneThirdRule(t *testing.T) {
	w, _ := Lookup("water")
	air, _ := LookupGas("air")
	const p, ts, tinf, ys, yinf = 101325.0, 342.0, 850.0, 0.3, 0.01
	f := FilmProperties(w, air, p, ts, tinf, ys, yinf)

	// Tr = 342 + (850 - 342)/3 = 511.3333 K; Yr = 0.3 + (0.01 - 0.3)/3 = 0.2033333.
	tr, yr := 342+508.0/3, 0.3-0.29/3
	if !scalar.EqualWithinAbsOrRel(f.T, tr, 1e-12, 0) || !scalar.EqualWithinAbsOrRel(f.VaporMassFraction, yr, 1e-15, 0) {
		t.Fatalf("reference state %g K, %g; want %g K, %g", f.T, f.VaporMassFraction, tr, yr)
	}
	mv, mg := 0.018015268, 0.0289647
	// x_v = (0.2033333/0.018015268)/(0.2033333/0.018015268 + 0.7966667/0.0289647)
	//     = 11.286723/(11.286723 + 27.504744) = 0.2909589
	xv := (yr / mv) / (yr/mv + (1-yr)/mg)
	if !scalar.EqualWithinAbsOrRel(xv, 0.2909589, 0, 1e-6) || !scalar.EqualWithinAbsOrRel(f.VaporMoleFraction, xv, 0, 1e-12) {
		t.Errorf("x_v = %.6f (hand %.6f)", f.VaporMoleFraction, xv)
	}
	m := 1 / (yr/mv + (1-yr)/mg)
	if want := p * m / (8.314462618 * tr); !scalar.EqualWithinAbsOrRel(f.Density, want, 0, 1e-12) {
		t.Errorf("density %g, want %g", f.Density, want)
	}
	cpv, cpg := w.VaporHeatCapacity(tr), air.HeatCapacity(tr)
	if want := yr*cpv + (1-yr)*cpg; !scalar.EqualWithinAbsOrRel(f.HeatCapacity, want, 0, 1e-12) {
		t.Errorf("cp %g, want %g", f.HeatCapacity, want)
	}
	// Wilke by hand.
	muv, mug := w.VaporViscosity(tr), air.Viscosity(tr)
	phi := func(mi, mj, Mi, Mj float64) float64 {
		return math.Pow(1+math.Sqrt(mi/mj)*math.Pow(Mj/Mi, 0.25), 2) / math.Sqrt(8*(1+Mi/Mj))
	}
	xg := 1 - xv
	wantMu := xv*muv/(xv+xg*phi(muv, mug, mv, mg)) + xg*mug/(xg+xv*phi(mug, muv, mg, mv))
	if !scalar.EqualWithinAbsOrRel(f.Viscosity, wantMu, 0, 1e-12) {
		t.Errorf("Wilke viscosity %g, want %g", f.Viscosity, wantMu)
	}
	if f.Viscosity <= math.Min(muv, mug) || f.Viscosity >= math.Max(muv, mug) {
		t.Errorf("mixture viscosity %g must lie between %g and %g here", f.Viscosity, muv, mug)
	}
	if want := Diffusivity(w, air, tr, p); !scalar.EqualWithinAbsOrRel(f.Diffusivity, want, 0, 1e-12) {
		t.Errorf("diffusivity %g, want %g", f.Diffusivity, want)
	}
	if f.Conductivity <= 0 || f.MeanFreePath <= 0 {
		t.Error("conductivity and mean free path must be positive")
	}
}

// Limits: with no vapor anywhere the film is pure gas at Tr.
func TestFilmPureGasLimit(t *testing.T) {
	h, _ := Lookup("n-heptane")
	air, _ := LookupGas("air")
	f := FilmProperties(h, air, 101325, 300, 600, 0, 0)
	if f.VaporMassFraction != 0 || f.Viscosity != air.Viscosity(400) || f.Conductivity != air.Conductivity(400) || f.HeatCapacity != air.HeatCapacity(400) {
		t.Errorf("pure-gas film %+v", f)
	}
	if len(f.Warnings) != 0 {
		t.Errorf("unexpected warnings %v", f.Warnings)
	}
}

func TestFilmInvalidInputsStayFinite(t *testing.T) {
	h, _ := Lookup("n-heptane")
	air, _ := LookupGas("air")
	if _, err := CheckFilm(h, air, -1, 300, 600, 1.2, 0); err == nil {
		t.Fatal("negative pressure and Ys > 1 must be errors")
	}
	f := FilmProperties(h, air, math.NaN(), math.Inf(1), -5, 2, math.NaN())
	for _, v := range []float64{f.T, f.Density, f.Viscosity, f.Conductivity, f.HeatCapacity, f.Diffusivity, f.MeanFreePath} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			t.Fatalf("non-finite value escaped: %+v", f)
		}
	}
	if len(f.Warnings) == 0 {
		t.Error("invalid inputs must be reported in Warnings")
	}
}

// Vapor content: x = pv/p; x = rh p_s/p. Water at 25 degC, 50 % RH, 1 atm:
// 0.5*3169.747/101325 = 0.0156415 (p_s from IF97 eq. 30, computed).
func TestVaporMoleFraction(t *testing.T) {
	x, err := VaporMoleFractionFromPartialPressure(1000, 1e5)
	if err != nil || x != 0.01 {
		t.Errorf("pv/p = %g, %v", x, err)
	}
	if _, err := VaporMoleFractionFromPartialPressure(2e5, 1e5); err == nil {
		t.Error("pv > p must be an error")
	}
	w, _ := Lookup("water")
	x, err = VaporMoleFractionFromRelativeHumidity(w, 0.5, 298.15, 101325)
	if err != nil || !scalar.EqualWithinAbsOrRel(x, 0.5*3169.747/101325, 0, 1e-6) {
		t.Errorf("x(50 %% RH) = %g, %v", x, err)
	}
	// Above 1 is supersaturated, accepted as documented.
	x, err = VaporMoleFractionFromRelativeHumidity(w, 1.5, 298.15, 101325)
	if err != nil || !scalar.EqualWithinAbsOrRel(x, 1.5*3169.747/101325, 0, 1e-6) {
		t.Errorf("x(150 %% RH) = %g, %v", x, err)
	}
	for _, c := range []struct{ rh, T, p float64 }{{10.5, 298.15, 101325}, {-0.1, 298.15, 101325}, {0.5, 700, 101325}, {1, 380, 101325}, {0.5, 298.15, 0}} {
		if _, err := VaporMoleFractionFromRelativeHumidity(w, c.rh, c.T, c.p); err == nil {
			t.Errorf("rh=%g T=%g p=%g must be an error", c.rh, c.T, c.p)
		}
	}
	y := MassFractionFromMoleFraction(0.3, mvWater, mgAir)
	if back := MoleFractionFromMassFraction(y, mvWater, mgAir); !scalar.EqualWithinAbsOrRel(back, 0.3, 0, 1e-14) {
		t.Errorf("round trip %g", back)
	}
}

const mvWater, mgAir = 0.018015268, 0.0289647
