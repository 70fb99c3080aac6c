package numeric

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

func TestBrent(t *testing.T) {
	// Source: closed-form roots (2^(1/3), ln 3, π, 1), outside the project;
	// tolerance abs or rel 1e-12.
	const tol = 1e-12
	cases := []struct {
		name string
		f    func(float64) float64
		a, b float64
		want float64
	}{
		{"x³ − 2", func(x float64) float64 { return x*x*x - 2 }, 0, 2, math.Cbrt(2)},
		{"eˣ − 3", func(x float64) float64 { return math.Exp(x) - 3 }, -5, 5, math.Log(3)},
		{"sin x on [3, 4]", math.Sin, 3, 4, math.Pi},
		{"(x − 1)⁵, flat at the root", func(x float64) float64 { return math.Pow(x-1, 5) }, 0, 3, 1},
		{"step-like tanh(50(x − 0.3))", func(x float64) float64 { return math.Tanh(50 * (x - 0.3)) }, -1, 1, 0.3},
		{"x³ − 2x − 5 (Wallis's cubic)", func(x float64) float64 { return x*x*x - 2*x - 5 }, 2, 3, 2.0945514815423265},
	}
	for _, c := range cases {
		x, it, err := Brent(c.f, c.a, c.b, c.f(c.a), c.f(c.b), 1e-15, 200)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if !scalar.EqualWithinAbsOrRel(x, c.want, tol, tol) {
			t.Errorf("%s: got %.17g, want %.17g (%d iterations)", c.name, x, c.want, it)
		}
	}
	// A discontinuous step: Brent must fall back to bisection and close on
	// the jump at 0.3 to the requested width.
	step := func(x float64) float64 {
		if x < 0.3 {
			return -1
		}
		return 1
	}
	if x, _, err := Brent(step, 0, 1, -1, 1, 1e-12, 200); err != nil || math.Abs(x-0.3) > 1e-11 {
		t.Errorf("step: got %v (%v), want 0.3", x, err)
	}
	if _, _, err := Brent(math.Sin, 1, 2, math.Sin(1), math.Sin(2), 1e-12, 100); err != ErrNotBracketed {
		t.Errorf("unbracketed interval: got %v, want ErrNotBracketed", err)
	}
}

func TestBrentRandomCubics(t *testing.T) {
	// Identity: for random monotone cubics (x − r)((x − r)² + s), s > 0, the
	// only real root is r; Brent must find it within rel 1e-12 in fewer steps
	// than bisection would need (about 60).
	rng := rand.New(rand.NewPCG(7, 11))
	for i := 0; i < 200; i++ {
		r := rng.Float64()*10 - 5
		s := rng.Float64() + 0.01
		f := func(x float64) float64 { return (x - r) * ((x-r)*(x-r) + s) }
		x, it, err := Brent(f, -10, 10, f(-10), f(10), 1e-15, 200)
		if err != nil || !scalar.EqualWithinAbsOrRel(x, r, 1e-13, 1e-12) || it > 60 {
			t.Fatalf("cubic %d: root %.17g, got %.17g in %d iterations (%v)", i, r, x, it, err)
		}
	}
}
