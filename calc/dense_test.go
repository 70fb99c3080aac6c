package calc

import (
	"math"
	"testing"

	"fogbench/calc/flash"
	"fogbench/calc/fluid"
)

// TestFilmCompressibilityMatchesFlash holds the film's Peng–Robinson Z in
// calc/fluid (which cannot import calc/flash) equal to calc/flash's Binary
// on its vapor root with the same k_ij, for N2 and air with n-dodecane and
// n-heptane at 20–60 bar and 600–900 K.
func TestFilmCompressibilityMatchesFlash(t *testing.T) {
	for _, gid := range []string{"nitrogen", "air"} {
		g, _ := fluid.LookupGas(gid)
		tc, pc, om, _ := g.Critical()
		for _, lid := range []string{"n-dodecane", "n-heptane"} {
			l, _ := fluid.Lookup(lid)
			kij, _, _ := fluid.FilmInteraction(l)
			bin := flash.Binary{Liquid: flash.PengRobinson{Tc: l.CriticalTemperature(), Pc: l.CriticalPressure(), Omega: l.AcentricFactor()},
				Gas: flash.PengRobinson{Tc: tc, Pc: pc, Omega: om}, Kij: kij}
			for _, p := range []float64{2e6, 4e6, 6e6} {
				for _, T := range []float64{600, 750, 900} {
					for _, xv := range []float64{0, 0.1, 0.3} {
						_, _, want := bin.LnPhi(T, p, 1-xv, flash.VaporPhase)
						got := fluid.FilmCompressibility(l, g, T, p, xv)
						if math.Abs(got-want) > 1e-12 {
							t.Errorf("%s in %s, %g Pa, %g K, x_v = %g: Z = %.15g, flash %.15g", lid, gid, p, T, xv, got, want)
						}
					}
				}
			}
		}
	}
}
