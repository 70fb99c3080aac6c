package calc

import (
	"testing"
)

// In supersaturated gas with the steady temperature, the equilibrium
// radius r* divides the classes as their own rates do: every class larger
// than r* condenses (rate < 0, grows) and every smaller one evaporates,
// each at its own steady temperature. r* used to be taken at the largest
// class's temperature, which condensation warms above the gas: classes of
// 24–65 nm radius condensed while marked grows:false under r* = 80 nm.
// The equilibrium drop exchanges no latent heat, so Q = 0 puts it at the
// gas temperature (Spalding's heat balance with ṁ = 0). relative_humidity
// above 1 is accepted as supersaturated.
func TestSupersaturatedEquilibriumRadiusMatchesRates(t *testing.T) {
	for _, rh := range []float64{1.005, 1.02, 1.2} {
		for _, fixed := range []bool{false, true} {
			c := Case{Format: CaseFormat, Name: "supersaturated", Fluid: "water",
				Gas:          Gas{PressurePa: 101325, TemperatureK: 300, RelativeHumidity: ptr(rh)},
				Distribution: Distribution{Model: "log-normal", MedianM: 100e-9, GSD: 2.5, Basis: "volume", Bins: 60, DMinM: 10e-9, DMaxM: 2e-6},
				Evaporation:  Evaporation{MaxTimeS: 1}}
			if fixed {
				c.LiquidTemperatureK = ptr(300)
			}
			res, err := Evaluate(c)
			if err != nil {
				t.Fatalf("rh %g: %v", rh, err)
			}
			r := res.Curvature.KelvinCriticalRadiusM
			if r == nil {
				t.Fatalf("rh %g: no equilibrium radius", rh)
			}
			below, above := 0, 0
			for _, b := range res.Bins {
				condenses := b.EvaporationRateKgS < 0
				if b.Grows == nil || *b.Grows != condenses || (b.DM/2 > *r) != condenses {
					t.Errorf("rh %g fixed %v: class r = %.4g nm at %.3f K: rate %.3g kg/s, grows %v, r* = %.4g nm",
						rh, fixed, b.DM/2*1e9, b.SurfaceTemperatureK, b.EvaporationRateKgS, b.Grows, *r*1e9)
				}
				if condenses {
					above++
				} else {
					below++
				}
			}
			if below == 0 || above == 0 {
				t.Errorf("rh %g: r* = %.4g nm does not fall inside the classes (%d evaporate, %d condense)", rh, *r*1e9, below, above)
			}
		}
	}
}
