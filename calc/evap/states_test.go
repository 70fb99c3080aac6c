package evap

import (
	"fmt"
	"math"
	"reflect"
	"testing"
)

// steadyStateTol bounds the difference between a steady state solved by
// secant steps from the previous diameter's temperature (accepted at
// |Q − ṁL| ≤ 1e-11 ṁL) and one solved by bracketing and Brent's method (to
// 1e-12 of T): each bounds the rate's relative error near 1e-11 (see
// steadyResidualTol), so the two differ by a few 1e-11 in every quantity
// that follows from T_s; 1e-9 is a hundred times that.
const steadyStateTol = 1e-9

// A StateSweep gives what Drop and SteadyState give: at a fixed surface
// temperature bit for bit, states and errors alike; at the steady
// temperature the same warnings and errors and every number within
// steadyStateTol (relative; the surface temperature within steadyStateTol
// K; the heat to the liquid, zero at the root, within steadyStateTol of
// the heat rate). For each regime of the benchmarks, diameters from 5 nm
// to 500 µm are visited up and down (so the shared liquid properties and
// the warm start are reused and replaced), and a liquid whose steady root
// is capped at its boiling point takes the warning path.
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
	compared, warned, worst := 0, 0, 0.0
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
				same := reflect.DeepEqual(got, want)
				if ts == 0 && !same {
					diff := steadyStateDiff(got, want)
					worst = math.Max(worst, diff)
					same = diff <= steadyStateTol
				}
				if fmt.Sprint(gotErr) != fmt.Sprint(wantErr) || !same {
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
	t.Logf("%d states compared, %d with warnings; steady states differ by at most %.2g", compared, warned, worst)
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

// steadyStateDiff returns the largest difference between two states in the
// measure of steadyStateTol over every float64 field (found by reflection,
// so a field added to DropState is compared too), or +Inf when another
// field (regime, warnings) differs.
func steadyStateDiff(a, b DropState) float64 {
	va, vb := reflect.ValueOf(a), reflect.ValueOf(b)
	worst := 0.0
	for i := range va.NumField() {
		name := va.Type().Field(i).Name
		fa, fb := va.Field(i), vb.Field(i)
		if fa.Kind() != reflect.Float64 {
			if !reflect.DeepEqual(fa.Interface(), fb.Interface()) {
				return math.Inf(1)
			}
			continue
		}
		x, y := fa.Float(), fb.Float()
		var d float64
		switch name {
		case "SurfaceTemperature":
			d = math.Abs(x - y)
		case "HeatToLiquid":
			d = math.Abs(x-y) / math.Max(math.Abs(a.HeatRate), math.Abs(b.HeatRate))
		default:
			if x != y {
				d = math.Abs(x-y) / math.Max(math.Abs(x), math.Abs(y))
			}
		}
		if math.IsNaN(d) {
			return math.Inf(1)
		}
		worst = math.Max(worst, d)
	}
	return worst
}
