package fluid

import (
	"math"
	"math/rand/v2"
	"runtime"
	"testing"
)

// The tests in this file check the evaluation forms that share work
// between properties (one logarithm for several powers, roots shared
// between the SR1-86 equations, the film's pure properties in one pass)
// against the direct forms of the same formulas, kept here as reference
// implementations. Bit-level claims are checked for equality; the one
// rounding-level change (tau^(1/6) by roots) against a stated tolerance.

// TestPowFromLog: powFromLog gives math.Pow's bits for the exponents the
// package uses and for seeded exponents in [-8, 8] over bases in
// [1e-6, 1e6], and falls back to math.Pow outside its range.
func TestPowFromLog(t *testing.T) {
	if runtime.GOARCH == "s390x" {
		t.Skip("math.Pow is an assembly routine on s390x, not the steps powFromLog copies")
	}
	rng := rand.New(rand.NewPCG(5, 17))
	used := []float64{1.256, -1.1, -0.3, -1.0, -0.7, 1.319, 1.6, 0.952, 1.29, 4.18, 1.17, 1.3355, 1.677, 4.4402, 1.209, 0.5, -0.5, 0, 1, 2, 6}
	n := 0
	for i := range 200000 {
		x := math.Exp(rng.Float64()*2*math.Log(1e6) - math.Log(1e6))
		y := (rng.Float64()*2 - 1) * 8
		if i%4 == 0 {
			y = used[i/4%len(used)]
		}
		if got, want := powFromLog(x, math.Log(x), y), math.Pow(x, y); got != want {
			t.Fatalf("powFromLog(%v, %v) = %v, math.Pow %v", x, y, got, want)
		}
		n++
	}
	for _, c := range [][2]float64{{0, 1.256}, {0, 1.6}, {1e-200, 1.3}, {1e200, -1.1}, {3, 20.5}, {math.Inf(1), 0.3}} {
		if got, want := powFromLog(c[0], math.Log(c[0]), c[1]), math.Pow(c[0], c[1]); got != want {
			t.Errorf("powFromLog(%v, %v) = %v, math.Pow %v", c[0], c[1], got, want)
		}
	}
	t.Logf("%d seeded arguments, all equal to math.Pow bit for bit", n)
}

// refGasConductivity is Gas.Conductivity in its direct form, two calls of
// math.Pow (Lemmon & Jacobsen 2004 eq. 5).
func refGasConductivity(g *Gas, T float64) float64 {
	T = g.clamp(T)
	tau := g.tcLJ / T
	return (g.n1*g.viscosityMicro(T) + g.n2*math.Pow(tau, g.t2) + g.n3*math.Pow(tau, g.t3)) * 1e-3
}

// refWaterSurfaceTension is IAPWS R1-76 with math.Pow.
func refWaterSurfaceTension(T float64) float64 {
	tau := math.Max(1-T/waterTc, 0)
	return 235.8e-3 * math.Pow(tau, 1.256) * (1 - 0.625*tau)
}

// refChungViscosity is chungViscosity in its direct form, every factor at
// each call.
func refChungViscosity(T, tc, m, vc, omega, dipole, kappa float64) float64 {
	mg := m * 1e3
	vcc := vc * 1e6
	mur := 131.3 * dipole / math.Sqrt(vcc*tc)
	fc := 1 - 0.2756*omega + 0.059035*mur*mur*mur*mur + kappa
	return 40.785 * fc * math.Sqrt(mg*T) / (math.Pow(vcc, 2.0/3) * neufeldOmega(1.2593*T/tc)) * 1e-7
}

// directMulero is the Mulero-Cachadina sum with one math.Pow per term.
func directMulero(tc float64, s, n []float64, T float64) float64 {
	tau := math.Max(1-T/tc, 0)
	var sum float64
	for i := range s {
		sum += s[i] * math.Pow(tau, n[i])
	}
	return math.Max(sum, 0)
}

// The forms that share work give the direct forms' numbers bit for bit:
// gas conductivity (one log for two powers), water surface tension,
// Chung's viscosity and conductivity with the constant factors hoisted,
// the Mulero sums, the SR1-86 density and slope helpers, Diffusivity split
// into pair constants and T, p.
func TestSharedFormsBitIdentical(t *testing.T) {
	rng := rand.New(rand.NewPCG(23, 7))
	for _, g := range Gases() {
		for range 5000 {
			T := 20 + rng.Float64()*2500
			if got, want := g.Conductivity(T), refGasConductivity(g, T); got != want {
				t.Fatalf("%s conductivity at %v K: %v, direct form %v", g.ID, T, got, want)
			}
		}
	}
	for range 20000 {
		T := 248.15 + rng.Float64()*(waterTc-248.15)
		if got, want := waterSurfaceTension(T), refWaterSurfaceTension(T); got != want {
			t.Fatalf("water surface tension at %v K: %v, direct form %v", T, got, want)
		}
		tau := math.Max(1-T/waterTc, 0)
		if got, want := sr86Slope(T, tau, math.Sqrt(tau)), waterSaturationSlope(T); got != want {
			t.Fatalf("SR1-86 slope at %v K: %v vs %v", T, got, want)
		}
		if T < waterTc {
			a := waterLatentHeat(T)
			b := T * waterSaturationSlope(T) * (1/waterSaturatedVaporDensity(T) - 1/waterSaturatedLiquidDensity(T))
			if a != b {
				t.Fatalf("latent heat at %v K: eqs. 1-3 sharing tau %v, one by one %v", T, a, b)
			}
		}
	}
	for _, T := range []float64{waterTc, waterTc + 1} {
		if got, want := waterSurfaceTension(T), refWaterSurfaceTension(T); got != want {
			t.Errorf("water surface tension at %v K: %v, direct form %v", T, got, want)
		}
	}
	// Heptane, dodecane and methanol use one, two and three Mulero terms.
	for _, c := range []struct {
		tc   float64
		s, n []float64
	}{
		{540.13, []float64{0.07765, -0.02599}, []float64{1.319, 1.6}},
		{658.1, []float64{0.0154, 0.048}, []float64{4.18, 1.17}},
		{513.38, []float64{0.22421, -0.21408, 0.083233}, []float64{1.3355, 1.677, 4.4402}},
		{543.87, []float64{0.04794}, []float64{1.209}},
	} {
		f := mulero(c.tc, c.s, c.n)
		for range 5000 {
			T := 150 + rng.Float64()*(c.tc+20-150)
			if got, want := f(T), directMulero(c.tc, c.s, c.n, T); got != want {
				t.Fatalf("Mulero sum (Tc %v) at %v K: %v, direct form %v", c.tc, T, got, want)
			}
		}
	}
	for _, l := range Liquids() {
		if l.ID == "water" {
			continue
		}
		for range 500 {
			T := 100 + rng.Float64()*1500
			want := refChungViscosity(T, l.tc, l.molarMass, l.vc, l.omega, l.dipole, l.kappa)
			if got := l.muVapor.eval(T); got != want {
				t.Fatalf("%s Chung viscosity at %v K: %v, direct form %v", l.ID, T, got, want)
			}
			wantK := chungConductivity(T, l.tc, l.molarMass, l.omega, want, l.cpVapor.eval(T)*l.molarMass-gasConstant)
			if got := l.kVapor.eval(T); got != wantK {
				t.Fatalf("%s Chung conductivity at %v K: %v, direct form %v", l.ID, T, got, wantK)
			}
		}
	}
}

// filmPure.at gives, bit for bit, the public property functions at the
// reference temperature for every liquid in both gases, over seeded
// states including ones held to valid values.
func TestFilmPureMatchesPublicFunctions(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 2))
	for _, g := range Gases() {
		for _, l := range Liquids() {
			var pc filmPure
			for i := range 300 {
				p := math.Exp(rng.Float64()*6) * 1e3
				ts := l.tmelt + rng.Float64()*(l.tc-l.tmelt)
				tinf := 200 + rng.Float64()*2500
				if i%50 == 0 {
					ts, tinf = -3, 4000
				}
				pc.at(l, g, p, ts, tinf)
				tr := pc.tr
				got := [...]float64{pc.cpv, pc.muv, pc.kv, pc.cpg, pc.mug, pc.kg, pc.diff}
				want := [...]float64{l.VaporHeatCapacity(tr), l.VaporViscosity(tr), l.VaporConductivity(tr),
					g.HeatCapacity(tr), g.Viscosity(tr), g.Conductivity(tr), Diffusivity(l, g, tr, p)}
				if got != want {
					t.Fatalf("%s in %s at Tr = %v K, p = %v Pa:\n got %v\nwant %v", l.ID, g.ID, tr, p, got, want)
				}
			}
		}
	}
}

// refSR86VaporDensity is SR1-86(1992) eq. 3 term by term with math.Pow:
// rho”/rhoc = exp(sum c_i tau^(k_i/6)), k = 2, 4, 8, 18, 37, 71.
func refSR86VaporDensity(T float64) float64 {
	tau := math.Max(1-T/waterTc, 0)
	var s float64
	for i, k := range [6]float64{2, 4, 8, 18, 37, 71} {
		s += sr86c[i] * math.Pow(tau, k/6)
	}
	return math.Exp(s) * waterRhoc
}

// refSR86LiquidDensity is SR1-86(1992) eq. 2 term by term with math.Pow.
func refSR86LiquidDensity(T float64) float64 {
	tau := math.Max(1-T/waterTc, 0)
	s := 1.0
	for i, k := range [6]float64{1, 2, 5, 16, 43, 110} {
		s += sr86b[i] * math.Pow(tau, k/3)
	}
	return s * waterRhoc
}

// refSR86Slope is dp_s/dT of SR1-86(1992) eq. 1 term by term with math.Pow.
func refSR86Slope(T float64) float64 {
	tau := math.Max(1-T/waterTc, 0)
	var s, ds float64
	for i, e := range sr86ae {
		s += sr86a[i] * math.Pow(tau, e)
		ds += sr86a[i] * e * math.Pow(tau, e-1)
	}
	return waterPc * math.Exp(waterTc/T*s) * (-waterTc/(T*T)*s - ds/T)
}

// TestWaterSR86Forms: the saturated-vapor density with tau^(1/6) as the
// square root of tau^(1/3), and the latent heat that shares tau's roots
// among eqs. 1-3, against SR1-86 eqs. 1-3 written term by term with
// math.Pow, at 20000 seeded temperatures over 273.16 K to Tc - 1e-3 K.
// These differ from the direct form only by rounding; eq. 3 multiplies a
// relative error e in tau^(1/6) by up to sum |c_i| k_i tau^(k_i/6), which
// reaches about 100 at low T, hence the 5e-14 tolerance; the form before
// this change (tau^(1/6) by math.Pow) is as far from the term-by-term form.
func TestWaterSR86Forms(t *testing.T) {
	const tolVapor, tolLatent = 5e-14, 5e-14 // relative
	rng := rand.New(rand.NewPCG(41, 9))
	relDiff := func(a, b float64) float64 { return math.Abs(a-b) / math.Abs(b) }
	var worstV, worstL, worstVOld, worstChange float64
	for i := range 20000 {
		T := 273.16 + rng.Float64()*(waterTc-1e-3-273.16)
		if i == 0 {
			T = 273.16
		}
		rv := refSR86VaporDensity(T)
		dv := relDiff(waterSaturatedVaporDensity(T), rv)
		worstV = math.Max(worstV, dv)
		// The form before this change (tau^(1/6) by math.Pow) for scale.
		x := math.Pow(math.Max(1-T/waterTc, 0), 1.0/6)
		worstVOld = math.Max(worstVOld, relDiff(sr86VaporDensity(x), rv))
		worstChange = math.Max(worstChange, relDiff(waterSaturatedVaporDensity(T), sr86VaporDensity(x)))
		rl := T * refSR86Slope(T) * (1/rv - 1/refSR86LiquidDensity(T))
		dl := relDiff(waterLatentHeat(T), rl)
		worstL = math.Max(worstL, dl)
		if dv > tolVapor || dl > tolLatent {
			t.Fatalf("at %v K: vapor density rel. diff %.3g, latent heat %.3g", T, dv, dl)
		}
	}
	t.Logf("worst relative difference from the term-by-term form: vapor density %.3g (math.Pow(tau, 1/6) form %.3g), latent heat %.3g; roots form against math.Pow(tau, 1/6) form %.3g",
		worstV, worstVOld, worstL, worstChange)
}
