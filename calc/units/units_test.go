package units

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// Factors to SI as printed in NIST Special Publication 811 (2008), Appendix
// B.9 "Factors for units listed by kind of quantity"; the exact ones are
// marked so there. Tolerance: the printed significant figures.
func TestFactorsAgainstNISTSP811(t *testing.T) {
	const tol = 1e-9
	cases := []struct {
		kind   Kind
		symbol string
		factor float64 // SI per unit, as printed
	}{
		{Length, "in", 2.54e-2},             // B.9 length: inch, exact
		{Pressure, "psi", 6.894757e3},       // B.9 pressure: pound-force per square inch
		{Pressure, "bar", 1.0e5},            // B.9 pressure: bar, exact
		{Pressure, "atm", 1.01325e5},        // B.9 pressure: atmosphere, standard, exact
		{MassFlow, "lb/h", 1.259979e-4},     // B.9 mass divided by time: pound per hour
		{Velocity, "ft/s", 3.048e-1},        // B.9 velocity: foot per second, exact
		{MassFlow, "US gal/h", 1.051503e-6}, // B.9 volume divided by time: gallon (U.S.) per hour, m³/s
		{MassFlow, "L/min", 1.666667e-5},    // B.9 volume divided by time: liter per minute, m³/s
		{Length, "µm", 1e-6},                // SI prefix, exact
		{Pressure, "kPa", 1e3},              // SI prefix, exact
	}
	for _, c := range cases {
		u, err := Lookup(c.kind, c.symbol)
		if err != nil {
			t.Fatal(err)
		}
		// NIST prints 7 significant figures for inexact factors.
		if !scalar.EqualWithinAbsOrRel(u.Scale, c.factor, 0, 5e-7) && !scalar.EqualWithinAbsOrRel(u.Scale, c.factor, tol, tol) {
			t.Errorf("%s: factor %.10g, NIST SP 811 %.7g", c.symbol, u.Scale, c.factor)
		}
	}
}

// Temperature conversions: NIST SP 811 sec. 4.2.1.1 (T/K = t/°C + 273.15) and
// B.9 (T/K = (t/°F + 459.67)/1.8), exact.
func TestTemperature(t *testing.T) {
	cases := []struct {
		symbol string
		v, k   float64
	}{
		{"°C", 25, 298.15},
		{"°C", -40, 233.15},
		{"°F", -40, 233.15},
		{"°F", 212, 373.15},
		{"°F", 32, 273.15},
		{"K", 300, 300},
	}
	for _, c := range cases {
		u := MustLookup(Temperature, c.symbol)
		if got := u.ToSI(c.v); math.Abs(got-c.k) > 1e-9 {
			t.Errorf("%v %s = %v K, want %v", c.v, c.symbol, got, c.k)
		}
		if back := u.FromSI(c.k); math.Abs(back-c.v) > 1e-9 {
			t.Errorf("%v K = %v %s, want %v", c.k, back, c.symbol, c.v)
		}
	}
}

func TestRoundTripAndAliases(t *testing.T) {
	for _, kind := range []Kind{Length, Pressure, Temperature, MassFlow, Velocity, Time} {
		for _, s := range Symbols(kind) {
			u := MustLookup(kind, s)
			for _, v := range []float64{1e-7, 0.5, 3, 1234.5} {
				if got := u.FromSI(u.ToSI(v)); !scalar.EqualWithinAbsOrRel(got, v, 1e-12, 1e-12) {
					t.Errorf("%s round trip %v -> %v", s, v, got)
				}
			}
		}
	}
	if u, err := Lookup(Length, "um"); err != nil || u.Symbol != "µm" {
		t.Errorf("alias um: %v %v", u, err)
	}
	if _, err := Lookup(Length, "furlong"); err == nil {
		t.Error("unknown unit must be an error")
	}
	if _, err := Lookup(Pressure, "µm"); err == nil {
		t.Error("a unit of another kind must be an error")
	}
	if !VolumeFlow(MustLookup(MassFlow, "L/min")) || VolumeFlow(MustLookup(MassFlow, "kg/h")) {
		t.Error("VolumeFlow misclassifies")
	}
	if Default(US, Pressure).Symbol != "psi" || Default(SI, Temperature).Symbol != "°C" {
		t.Error("defaults changed")
	}
}

// Typed values convert to the nearest double of the SI value, so a stored
// case holds 6e-05 m for 60 µm, not 5.9999999999999995e-05.
func TestDecimalPrefixesAreExact(t *testing.T) {
	cases := []struct {
		sym  string
		kind Kind
		v    float64
		si   float64
	}{
		{"µm", Length, 60, 6e-5},
		{"µm", Length, 3, 3e-6},
		{"mm", Length, 0.7, 7e-4},
		{"nm", Length, 10, 1e-8},
		{"ms", Time, 3, 3e-3},
		{"g/s", MassFlow, 7, 7e-3},
	}
	for _, c := range cases {
		if got := MustLookup(c.kind, c.sym).ToSI(c.v); got != c.si {
			t.Errorf("%v %s = %v, want %v", c.v, c.sym, got, c.si)
		}
	}
}
