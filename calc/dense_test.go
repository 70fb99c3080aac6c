package calc

import (
	"math"
	"testing"

	"fogbench/calc/flash"
	"fogbench/calc/fluid"
	"fogbench/calc/phys"
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

// TestDenseFilmInResult: a case at 40 bar reports the film at pressure
// (Z of the film mixture away from 1, the density p M/(Z R Tr)), and the
// same case at 2 bar reports the ideal-gas film exactly.
func TestDenseFilmInResult(t *testing.T) {
	l, _ := fluid.Lookup("kerosene-surrogate")
	g, _ := fluid.LookupGas("air")
	for _, p := range []float64{2e5, 40e5} {
		k := Case{Format: CaseFormat, Name: "kerosene", Fluid: "kerosene-surrogate", Heating: "steady",
			Gas:          Gas{ID: "air", PressurePa: p, TemperatureK: 700},
			Distribution: Distribution{Model: "rosin-rammler", XM: 30e-6, Q: 2.5, Bins: 12}}
		res, err := Evaluate(k)
		if err != nil {
			t.Fatal(err)
		}
		pr := res.Properties
		// The properties block's film: the surface vapor at p_sat(T)/p, none far away.
		ys := fluid.MassFractionFromMoleFraction(math.Min(l.SaturationPressure(pr.TemperatureK)/p, 0.999999), l.MolarMass(), g.MolarMass())
		f := fluid.FilmProperties(l, g, p, pr.TemperatureK, 700, ys, 0)
		if pr.FilmDensityKgM3 != f.Density || pr.FilmViscosityPaS != f.Viscosity || pr.DiffusivityM2S != f.Diffusivity {
			t.Errorf("%g Pa: reported film %g, %g, %g; FilmProperties %g, %g, %g", p,
				pr.FilmDensityKgM3, pr.FilmViscosityPaS, pr.DiffusivityM2S, f.Density, f.Viscosity, f.Diffusivity)
		}
		ideal := p * f.MolarMass / (phys.GasConstant * f.T)
		switch {
		case p < 5e5 && (f.Compressibility != 1 || f.Density != ideal):
			t.Errorf("%g Pa: Z = %g, ρ = %g, want the ideal gas %g", p, f.Compressibility, f.Density, ideal)
		case p > 1e6 && !(math.Abs(f.Compressibility-1) > 1e-3 && math.Abs(f.Density*f.Compressibility/ideal-1) < 1e-12):
			t.Errorf("%g Pa: Z = %g, ρ = %g (ideal %g): no dense film", p, f.Compressibility, f.Density, ideal)
		}
	}
}
