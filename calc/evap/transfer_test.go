package evap

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/phys"
)

// Ranz–Marshall (1952) and Frössling (1938) forms, values computed by hand
// (the forms were later read in open droplet-evaporation code that cites them).
func TestRanzMarshallFrossling(t *testing.T) {
	const tol = 1e-6
	for _, c := range []struct{ re, pr, rm, fr float64 }{
		{1, 0.7, 2.532742, 2.490123}, {100, 0.7, 7.327424, 6.901230}, {100, 2.0, 9.559526, 8.954764},
	} {
		if got := RanzMarshall(c.re, c.pr); !scalar.EqualWithinAbsOrRel(got, c.rm, 0, tol) {
			t.Errorf("RanzMarshall(%g, %g) = %.7g, want %.7g", c.re, c.pr, got, c.rm)
		}
		if got := Frossling(c.re, c.pr); !scalar.EqualWithinAbsOrRel(got, c.fr, 0, tol) {
			t.Errorf("Frossling(%g, %g) = %.7g, want %.7g", c.re, c.pr, got, c.fr)
		}
	}
	if RanzMarshall(0, 0.7) != 2 || Frossling(0, 0.7) != 2 {
		t.Error("stagnant limit must be 2")
	}
}

// Abramzon & Sirignano (1989) F(B), Clift Sh0 and Sh*, values computed by hand
// (forms later read in open code citing A–S eqs. 8/10/12/17/21/23).
func TestAbramzonSirignano(t *testing.T) {
	const tol = 1e-6
	for _, c := range []struct{ b, f float64 }{
		{0.01, 1.001988}, {0.1, 1.018859}, {0.5, 1.077079}, {1, 1.126021},
		{2, 1.185221}, {5, 1.256075}, {10, 1.284710}, {20, 1.282457},
	} {
		if got := FilmCorrection(c.b); !scalar.EqualWithinAbsOrRel(got, c.f, 0, tol) {
			t.Errorf("F(%g) = %.7g, want %.7g", c.b, got, c.f)
		}
	}
	if got := FilmCorrection(0); got != 1 {
		t.Errorf("F(0) = %g, want the limit 1", got)
	}
	// The series branch of ln(1+B)/B must agree with the closed form where
	// they meet.
	for _, b := range []float64{-0.99e-5, 0.99e-5} {
		if a, c := lnOnePlusOverB(b), math.Log1p(b)/b; math.Abs(a-c) > 1e-12 {
			t.Errorf("ln(1+B)/B at %g: series %.15g vs closed %.15g", b, a, c)
		}
	}
	for _, c := range []struct{ re, sc, sh0 float64 }{{0.5, 1, 2.144714}, {10, 0.7, 3.387976}, {50, 2.0, 7.294016}, {100, 0.7, 6.903181}} {
		if got := CliftNumber(c.re, c.sc); !scalar.EqualWithinAbsOrRel(got, c.sh0, 0, tol) {
			t.Errorf("Sh0(%g, %g) = %.7g, want %.7g", c.re, c.sc, got, c.sh0)
		}
	}
	if got := ModifiedNumber(CliftNumber(50, 2), 4.32176); !scalar.EqualWithinAbsOrRel(got, 6.246409, 0, tol) {
		t.Errorf("Sh* = %.7g, want 6.246409", got)
	}
}

// Fuchs & Sutugin (1971) exact-coefficient form, values computed by hand
// [computed] (form read in the particula docs, as Seinfeld & Pandis eq. 12.43).
func TestFuchsSutugin(t *testing.T) {
	const tol = 1e-6
	for _, c := range []struct{ kn, f1, f01 float64 }{
		{0.001, 0.999289, 0.987448}, {0.01, 0.992883, 0.887179}, {0.1, 0.928740, 0.439227},
		{1, 0.494560, 0.071317}, {10, 0.072636, 0.007476}, {100, 0.007478, 0.000750},
	} {
		// Absolute half-unit in the 6th decimal where the table's digits
		// give less than rel 1e-6 (small f).
		atol := 5e-7
		if got := FuchsSutugin(c.kn, 1); !scalar.EqualWithinAbsOrRel(got, c.f1, atol, tol) {
			t.Errorf("f(%g, 1) = %.7g, want %.6g", c.kn, got, c.f1)
		}
		if got := FuchsSutugin(c.kn, 0.1); !scalar.EqualWithinAbsOrRel(got, c.f01, atol, tol) {
			t.Errorf("f(%g, 0.1) = %.7g, want %.6g", c.kn, got, c.f01)
		}
	}
	// The rounded-coefficient form differs in the 4th digit (§6.7): at Kn = 1
	// it gives 0.495050, which this implementation must not reproduce.
	if got := FuchsSutugin(1, 1); math.Abs(got-0.495050) < 1e-4 {
		t.Errorf("f(1, 1) = %g looks like the rounded form", got)
	}
	// Water vapor in air at 298.15 K, §6.7 [computed].
	cbar := MeanMolecularSpeed(298.15, phys.MolarMassWater)
	if !scalar.EqualWithinAbsOrRel(cbar, 591.95, 0.005, 0) {
		t.Errorf("c̄ = %.5g m/s, want 591.95", cbar)
	}
	lambda := VaporMeanFreePath(2.5037e-5, 298.15, phys.MolarMassWater)
	if !scalar.EqualWithinAbsOrRel(lambda, 126.89e-9, 0.005e-9, 0) {
		t.Errorf("λ = %.5g m, want 126.89e-9", lambda)
	}
	for _, c := range []struct{ r, kn, f float64 }{{10e-9, 12.689, 0.057666}, {100e-9, 1.2689, 0.426693}, {1e-6, 0.12689, 0.909859}} {
		kn := Knudsen(lambda, c.r)
		if !scalar.EqualWithinAbsOrRel(kn, c.kn, 0, 5e-5) || !scalar.EqualWithinAbsOrRel(FuchsSutugin(kn, 1), c.f, 0, 1e-5) {
			t.Errorf("r=%g: Kn = %.5g (want %g), f = %.6g (want %g)", c.r, kn, c.kn, FuchsSutugin(kn, 1), c.f)
		}
	}
}

// Limits of Fuchs–Sutugin: f → 1 in the continuum, and in the free-molecular
// limit f·(continuum flux 4π r D Δρ) → α·(1/4) c̄ Δρ 4π r² (kinetic theory)
// when λ = 3D/c̄; the ratio of the two is 4 f Kn/(3α).
func TestFuchsSutuginLimits(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < 200; i++ {
		alpha := 0.01 + 0.99*rng.Float64()
		if f := FuchsSutugin(1e-12, alpha); math.Abs(f-1) > 1e-9 {
			t.Fatalf("f(1e-12, %g) = %g, want → 1", alpha, f)
		}
		const D, T, M = 2.5e-5, 300.0, 0.018
		lambda := VaporMeanFreePath(D, T, M)
		prev := math.Inf(1)
		for _, kn := range []float64{1e2, 1e4, 1e6, 1e8} {
			r := lambda / kn
			continuum := 4 * math.Pi * r * D // per unit Δρ
			kinetic := alpha * 0.25 * MeanMolecularSpeed(T, M) * 4 * math.Pi * r * r
			dev := math.Abs(FuchsSutugin(kn, alpha)*continuum/kinetic - 1)
			if dev > prev {
				t.Fatalf("α=%g: deviation from the kinetic flux grows at Kn=%g", alpha, kn)
			}
			prev = dev
		}
		if prev > 1e-6 {
			t.Fatalf("α=%g: f·continuum/kinetic deviates by %g at Kn = 1e8", alpha, prev)
		}
	}
	for _, c := range []struct {
		kn   float64
		want string
	}{{0.001, "continuum"}, {0.05, "slip"}, {1, "transition"}, {10, "transition"}, {11, "free-molecular"}} {
		if got := Regime(c.kn); got != c.want {
			t.Errorf("Regime(%g) = %q, want %q", c.kn, got, c.want)
		}
	}
}

// Reference-state helper values are the integrator's; here the Spalding
// numbers of worked lifetime E2 (lifetime_test.go), by hand: B_T = 2850·(850−342)/335e3.
func TestSpaldingNumbers(t *testing.T) {
	if got := SpaldingHeatNumber(2850, 850, 342, 335e3); !scalar.EqualWithinAbsOrRel(got, 4.32179, 0, 1e-5) {
		t.Errorf("B_T = %.6g, want 4.32179", got)
	}
	if got := math.Log1p(SpaldingHeatNumber(2850, 850, 342, 335e3)); !scalar.EqualWithinAbsOrRel(got, 1.67181, 0, 1e-5) {
		t.Errorf("ln(1+B_T) = %.6g, want 1.67181", got)
	}
	// B_M of §3: Y_s = 0.019690 in dry air gives 0.020086.
	if got := SpaldingMassNumber(0.019690, 0); !scalar.EqualWithinAbsOrRel(got, 0.020086, 1e-6, 0) {
		t.Errorf("B_M = %.6g", got)
	}
	if got := MassFraction(0.031283, phys.MolarMassWater, phys.MolarMassAir); !scalar.EqualWithinAbsOrRel(got, 0.019690, 1e-6, 0) {
		t.Errorf("Y = %.6g, want 0.019690", got)
	}
}
