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

// The steady sweep skips the evaporated bins and takes d/d0 as e^(u − ln d0)
// and each bin's Σ n d² share as (w/d0)(d/d0)²; it must give what the
// general per-bin state gives (d, then d/d0 and v/d) to rounding: the
// evaporated fraction within sweepRoundingAbs, D32 and Dv50 within
// sweepRoundingRel.
func TestSweepSteadyMatchesState(t *testing.T) {
	const sweepRoundingAbs, sweepRoundingRel = 1e-15, 1e-14
	worst := [3]float64{}
	d := make([]float64, 40)
	w := make([]float64, len(d))
	for i := range d {
		d[i] = 1e-6 * math.Pow(300, float64(i)/float64(len(d)-1))
		x := math.Log(d[i] / 40e-6)
		w[i] = math.Exp(-x * x)
	}
	for _, regime := range benchRegimes {
		c := benchConditions(regime)
		s, err := c.NewSpray(d, w, HistoryOptions{})
		if err != nil {
			t.Fatal(err)
		}
		h, err := s.History(0)
		if err != nil {
			t.Fatal(err)
		}
		sp := s.sp
		vol := make([]float64, len(d))
		now := make([]float64, len(d))
		for k, tk := range h.T {
			rem, s3, s2, ev := 0.0, 0.0, 0.0, 0.0
			for i := range d {
				cur := -1
				di, f := sp.state(i, tk, &cur)
				v := sp.w[i] * f
				vol[i], now[i] = v, di
				rem += v
				ev += sp.w[i] * (1 - f)
				if di > 0 {
					s3 += v
					s2 += v / di
				}
			}
			want := [3]float64{math.Max(0, ev), 0, volumeMedian(now, vol, rem)}
			if s2 > 0 {
				want[1] = s3 / s2
			}
			got := [3]float64{h.EvaporatedMassFraction[k], h.D32[k], h.Dv50[k]}
			for m := range got {
				diff := math.Abs(got[m] - want[m])
				tol := sweepRoundingAbs
				if m > 0 {
					diff /= math.Max(want[m], math.SmallestNonzeroFloat64)
					tol = sweepRoundingRel
				}
				worst[m] = math.Max(worst[m], diff)
				if diff > tol {
					t.Fatalf("%s t[%d] = %g: sweep %v, per-bin state %v", regime, k, tk, got, want)
				}
			}
		}
	}
	t.Logf("largest difference: evaporated fraction %.2g (abs), D32 %.2g, Dv50 %.2g (rel)", worst[0], worst[1], worst[2])
}
