package evap

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// Spray.Lifetimes reads every bin's lifetime off the shared shrinkage table;
// LifetimeReport integrates the same ∫ (ρ_L π d²/2)/ṁ dd per diameter by
// adaptive Gauss–Kronrod to 1e-9. The two quadratures must agree.
func TestSprayLifetimesMatchLifetimeReport(t *testing.T) {
	// Tolerance: the table's five-point Gauss–Legendre panels 1/16 decade
	// wide and its Hermite interpolant between nodes; measured worst cases
	// are 1.1e-6 with the Kelvin and transition factors and 3.3e-6 where the
	// Clift factor max(1, Re^0.077) has its kink at Re = 1 inside a panel.
	const tol = 1e-5
	d := make([]float64, 25)
	w := make([]float64, len(d))
	for i := range d {
		d[i] = 0.02e-6 * math.Pow(1e4, float64(i)/float64(len(d)-1)) // 20 nm to 200 µm
		w[i] = 1
	}
	for _, regime := range benchRegimes {
		for _, ts := range []float64{0, 282} {
			c := benchConditions(regime)
			s, err := c.NewSpray(d, w, HistoryOptions{SurfaceTemperature: ts})
			if err != nil {
				t.Fatal(err)
			}
			worst := 0.0
			for i, got := range s.Lifetimes() {
				want, err := c.Lifetime(d[i], LifetimeOptions{SurfaceTemperature: ts})
				if err != nil {
					t.Fatal(err)
				}
				worst = math.Max(worst, math.Abs(got/want-1))
				if !scalar.EqualWithinAbsOrRel(got, want, 0, tol) {
					t.Errorf("%s Ts=%g d=%g: table %.10g s, quadrature %.10g s", regime, ts, d[i], got, want)
				}
			}
			t.Logf("%s Ts=%g: worst relative difference %.2g", regime, ts, worst)
		}
	}
}
