package evap

import (
	"errors"
	"math"
	"testing"
)

// Dormand–Prince on problems with closed-form solutions: exponential decay,
// the harmonic oscillator over ten periods, and the 5th-order convergence of
// the global error as the tolerance shrinks.
func TestDormandPrince(t *testing.T) {
	decay := func(_ float64, y, dy []float64) error { dy[0] = -2 * y[0]; return nil }
	s := newODEStepper(decay, 1, 1e-10, []float64{1e-14})
	y := []float64{1}
	tEnd, err := s.run(0, 3, y, 1e-3, nil)
	if err != nil || tEnd != 3 || math.Abs(y[0]-math.Exp(-6)) > 1e-11 {
		t.Errorf("decay: y(3) = %.15g at %g (err %v), want %.15g", y[0], tEnd, err, math.Exp(-6))
	}
	osc := func(_ float64, y, dy []float64) error { dy[0], dy[1] = y[1], -y[0]; return nil }
	var prevErr float64
	for i, rtol := range []float64{1e-6, 1e-8, 1e-10} {
		s := newODEStepper(osc, 2, rtol, []float64{rtol, rtol})
		y := []float64{1, 0}
		if _, err := s.run(0, 20*math.Pi, y, 0.01, nil); err != nil {
			t.Fatal(err)
		}
		e := math.Hypot(y[0]-1, y[1])
		if e > 1000*rtol {
			t.Errorf("oscillator rtol %g: error %g", rtol, e)
		}
		if i > 0 && !(e < prevErr) {
			t.Errorf("oscillator: error %g did not shrink from %g", e, prevErr)
		}
		prevErr = e
	}
	// The after hook stops the integration where asked.
	s = newODEStepper(decay, 1, 1e-8, []float64{1e-12})
	y = []float64{1}
	tStop, _ := s.run(0, 10, y, 1e-3, func(_ float64, y, _ []float64) bool { return y[0] < 0.5 })
	if !(y[0] < 0.5) || tStop >= 10 || math.Abs(y[0]-math.Exp(-2*tStop)) > 1e-7 {
		t.Errorf("stop hook: y = %g at t = %g", y[0], tStop)
	}
}

// A right-hand side that fails at a trial state the step overshot to
// (here y < 0, as a drop's mass past zero) rejects the step instead of
// ending the run; an error at every step size is still returned.
func TestODEStageErrorShrinksTheStep(t *testing.T) {
	errNegative := errors.New("negative state")
	f := func(_ float64, y, dy []float64) error {
		if y[0] < 0 {
			return errNegative
		}
		dy[0] = -1
		return nil
	}
	// The first step, 10, overshoots to y = −1 at its second stage.
	s := newODEStepper(f, 1, 1e-8, []float64{1e-12})
	y := []float64{1}
	tStop, err := s.run(0, 10, y, 10, func(_ float64, y, _ []float64) bool { return y[0] < 1e-2 })
	if err != nil || !(y[0] < 1e-2 && y[0] >= 0) || math.Abs(tStop-(1-y[0])) > 1e-9 {
		t.Errorf("y = %g at t = %g, err %v", y[0], tStop, err)
	}
	// Every state past 1.5 fails: the steps shrink towards it until no
	// step is left, and the stage's own error comes back.
	grow := func(_ float64, y, dy []float64) error {
		if y[0] > 1.5 {
			return errNegative
		}
		dy[0] = 1
		return nil
	}
	y = []float64{1}
	if _, err := newODEStepper(grow, 1, 1e-8, []float64{1e-12}).run(0, 1, y, 0.1, nil); !errors.Is(err, errNegative) {
		t.Errorf("a persistent stage error: got %v", err)
	}
}
