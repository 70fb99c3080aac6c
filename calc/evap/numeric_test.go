package evap

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// Gauss–Kronrod weights: K15 must integrate polynomials up to degree 22
// exactly and G7 up to degree 13; adaptive integration of known integrals.
func TestQuadrature(t *testing.T) {
	for deg := 0; deg <= 22; deg++ {
		f := func(x float64) float64 { return math.Pow(x, float64(deg)) }
		k, _ := kronrod15(f, 0, 1)
		if want := 1 / float64(deg+1); !scalar.EqualWithinAbsOrRel(k, want, 1e-15, 1e-14) {
			t.Errorf("K15 ∫x^%d = %.16g, want %.16g", deg, k, want)
		}
	}
	for deg := 0; deg <= 9; deg++ {
		s := 0.0
		for i, x := range gl5Nodes {
			s += gl5Weights[i] * math.Pow(0.5*(x+1), float64(deg)) * 0.5
		}
		if want := 1 / float64(deg+1); !scalar.EqualWithinAbsOrRel(s, want, 1e-15, 1e-14) {
			t.Errorf("GL5 ∫x^%d = %.16g, want %.16g", deg, s, want)
		}
	}
	for _, c := range []struct {
		name       string
		f          func(float64) float64
		a, b, want float64
	}{
		{"sqrt end singularity", func(x float64) float64 { return 1 / math.Sqrt(x) }, 0, 1, 2},
		{"peak", func(x float64) float64 { return 1 / (1e-4 + x*x) }, -1, 1, 2 * math.Atan(100) * 100},
		{"exp", math.Exp, -20, 5, math.Exp(5) - math.Exp(-20)},
	} {
		got, _, err := integrate(c.f, c.a, c.b, 1e-10, 0)
		if err != nil || !scalar.EqualWithinAbsOrRel(got, c.want, 0, 1e-8) {
			t.Errorf("%s: %.12g (err %v), want %.12g", c.name, got, err, c.want)
		}
	}
}

func TestValidate(t *testing.T) {
	c := waterInAir()
	if err := c.Validate(); err != nil {
		t.Fatal(err)
	}
	bad := *c
	bad.Pressure, bad.GasTemperature, bad.VaporMoleFraction, bad.RelativeVelocity = 0, math.NaN(), 1.2, -3
	bad.Convection, bad.AccommodationCoefficient = "fast", 2
	err := bad.Validate()
	for _, want := range []string{
		"gas.pressure_pa: must be greater than zero (got 0)",
		"gas.temperature_k: must be a finite number (got NaN)",
		"gas.vapor_mole_fraction: must be below 1 (the gas cannot be pure vapor) (got 1.2)",
		"gas.relative_velocity_m_s: must not be negative (got -3)",
		`evaporation.convection: must be one of`,
		"evaporation.accommodation_coefficient",
	} {
		if err == nil || !contains(err.Error(), want) {
			t.Errorf("Validate: %v; want it to mention %q", err, want)
		}
	}
	if _, err := c.Drop(-1, 290); err == nil || !contains(err.Error(), "drop.diameter_m") {
		t.Errorf("Drop(-1): %v", err)
	}
	if _, err := c.Drop(1e-5, 380); err == nil || !contains(err.Error(), "boiling point") {
		t.Errorf("Drop above boiling: %v", err)
	}
	if _, err := c.Lifetime(math.Inf(1), LifetimeOptions{}); err == nil {
		t.Error("Lifetime(+Inf) must fail")
	}
	broken := *c
	broken.Gas = constFilm{}
	if _, err := broken.Drop(1e-5, 290); err == nil || !contains(err.Error(), "film.") {
		t.Errorf("zero film: %v", err)
	}
}

func contains(s, sub string) bool {
	for i := 0; i+len(sub) <= len(s); i++ {
		if s[i:i+len(sub)] == sub {
			return true
		}
	}
	return false
}
