package flash

import (
	"errors"
	"math"
	"testing"
)

var (
	testDodecane = PengRobinson{Tc: 658.0, Pc: 1.82e6, Omega: 0.5763853193272348}
	testNitrogen = PengRobinson{Tc: 126.192, Pc: 3.3958e6, Omega: 0.0372}
)

// The mixture critical temperature at a pressure above the liquid's
// critical pressure bounds the two-phase region: a split exists just below
// it, none just above, the two phases' gas fractions close in on each
// other as it is approached, and for N2–n-dodecane (type III) it lies
// below the alkane's Tc and falls as the pressure rises.
func TestBinaryCriticalTemperature(t *testing.T) {
	m := Binary{Liquid: testDodecane, Gas: testNitrogen, Kij: 0.1122}
	prev := math.Inf(1)
	for _, p := range []float64{2e6, 4e6, 6e6, 1e7} {
		tc, err := m.CriticalTemperature(p, 400)
		if err != nil {
			t.Fatal(err)
		}
		if !(tc < testDodecane.Tc && tc < prev) {
			t.Errorf("%g Pa: critical temperature %g K (previous %g)", p, tc, prev)
		}
		prev = tc
		below, err := m.Flash(tc-0.05, p)
		if err != nil {
			t.Fatalf("%g Pa: no split 0.05 K below the critical temperature: %v", p, err)
		}
		far, _ := m.Flash(tc-20, p)
		if !(below.Y2-below.X2 < far.Y2-far.X2) {
			t.Errorf("%g Pa: the phases do not close in: gap %g at Tc − 0.05 K, %g at Tc − 20 K", p, below.Y2-below.X2, far.Y2-far.X2)
		}
		if _, err := m.Flash(tc+0.05, p); !errors.Is(err, ErrNoTwoPhase) {
			t.Errorf("%g Pa: split 0.05 K above the critical temperature (%v)", p, err)
		}
	}
}

// The cubic's roots satisfy it, and a binary with both components the same
// substance gives the pure fugacity coefficient whatever the composition.
func TestBinaryReducesToPure(t *testing.T) {
	m := Binary{Liquid: testDodecane, Gas: testDodecane}
	p := 1e5
	T := 500.0
	ps, err := testDodecane.SaturationPressure(T)
	if err != nil {
		t.Fatal(err)
	}
	l1, _, _ := m.LnPhi(T, ps, 0, LiquidPhase)
	v1, _, _ := m.LnPhi(T, ps, 0.7, VaporPhase)
	if math.Abs(l1-v1) > 1e-9 {
		t.Errorf("at the pure vapor pressure ln φ_L %g ≠ ln φ_V %g", l1, v1)
	}
	a, b, _, _, _, _ := m.mixParams(T, 0.3)
	A, B := a*p/math.Pow(8.314462618*T, 2), b*p/(8.314462618*T)
	zl, zv := cubicRoots(A, B)
	for _, z := range []float64{zl, zv} {
		if r := z*z*z - (1-B)*z*z + (A-3*B*B-2*B)*z - (A*B - B*B - B*B*B); math.Abs(r) > 1e-12 {
			t.Errorf("root %g leaves %g", z, r)
		}
	}
}
