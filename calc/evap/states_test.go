package evap

import (
	"fmt"
	"math"
	"reflect"
	"testing"
)

// A StateSweep gives what Drop and SteadyState give, bit for bit, states
// and errors alike: for each regime of the benchmarks, a fixed and the
// steady surface temperature, diameters from 5 nm to 500 µm visited up
// and down (so the shared liquid properties are reused and replaced), and a
// liquid whose steady root is capped at its boiling point (the warning
// path).
func TestStateSweepMatchesDropAndSteadyState(t *testing.T) {
	var ds []float64
	for i := 0; i <= 60; i++ {
		ds = append(ds, 5e-9*math.Pow(1e5, float64(i)/60))
	}
	for i := len(ds) - 1; i >= 0; i -= 7 {
		ds = append(ds, ds[i])
	}
	type setup struct {
		name string
		c    *Conditions
	}
	var setups []setup
	for _, r := range benchRegimes {
		setups = append(setups, setup{r, benchConditions(r)})
	}
	boiling := waterInAir()
	boiling.GasTemperature = 2000
	boiling.Liquid = testLiquid{molarMass: 0.1, psat: func(T float64) float64 {
		if T > 300 {
			return 2e5
		}
		return 1e-6
	}, sigma: constant(0.02), rho: 700, latent: constant(1e9), cp: 2000}
	setups = append(setups, setup{"boiling step liquid", boiling})
	compared, warned := 0, 0
	for _, s := range setups {
		for _, ts := range []float64{0, 282} {
			sw, err := s.c.NewStateSweep(ts)
			if err != nil {
				t.Fatalf("%s Ts=%g: %v", s.name, ts, err)
			}
			for _, d := range ds {
				got, gotErr := sw.State(d)
				var want DropState
				var wantErr error
				if ts == 0 {
					want, wantErr = s.c.SteadyState(d)
				} else {
					want, wantErr = s.c.Drop(d, ts)
				}
				if fmt.Sprint(gotErr) != fmt.Sprint(wantErr) || !reflect.DeepEqual(got, want) {
					t.Fatalf("%s Ts=%g d=%g:\n sweep %+v, %v\n alone %+v, %v", s.name, ts, d, got, gotErr, want, wantErr)
				}
				compared++
				if len(want.Warnings) > 0 {
					warned++
				}
			}
		}
	}
	if warned == 0 {
		t.Error("no state carried a warning; the warning path went untested")
	}
	t.Logf("%d states compared, %d with warnings", compared, warned)
	// The checks of the conditions and of the surface temperature.
	if _, err := boiling.NewStateSweep(400); err == nil {
		t.Error("a surface temperature above the boiling point was accepted")
	}
	bad := *benchConditions("flat")
	bad.Pressure = math.NaN()
	if _, err := bad.NewStateSweep(282); err == nil {
		t.Error("conditions with a NaN pressure were accepted")
	}
}
