package flash

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/fluid"
	"fogbench/calc/phys"
)

// Classical nucleation against hand arithmetic, inputs σ = 0.05 N/m,
// p_sat = 1e6 Pa, p_l = 1e5 Pa, v_l = 2e-5 m3/mol, T = 450 K:
//
//	v_l (p_l − p_sat)/(R T) = 2e-5 · (−9e5) / (8.314462618 · 450)
//	                        = −18 / 3741.5082 = −4.8108942e-3
//	p_v* = 1e6 · exp(−4.8108942e-3) = 995 200.66 Pa
//	p_v* − p_l = 895 200.66 Pa
//	r_c = 2 · 0.05 / 895 200.66 = 1.1170680e-7 m
//	W = 16 π (0.05)³ / (3 · 895 200.66²) = 6.2831853e-3 / 2.4041473e12
//	  = 2.6134718e-15 J  (= (4/3) π r_c² σ)
//
// Rate with a water-like liquid, ρ = 900 kg/m3, M = 0.018015268 kg/mol,
// σ = 0.04 N/m and W/(kT) = 60:
//
//	N = 900 · 6.02214076e23 / 0.018015268 = 3.0085185e28 m⁻³
//	m = 0.018015268 / 6.02214076e23 = 2.9915056e-26 kg
//	(2σ/(π m))^0.5 = (0.08 / 9.3980e-26)^0.5 = 9.22629e11 s⁻¹
//	J = 3.0085185e28 · 9.22629e11 · e^−60 (= 8.7565e-27) = 2.43057e14 m⁻³ s⁻¹
//
// Tolerance rel 1e-6 (the hand values carry 7–8 digits).
func TestNucleationHandArithmetic(t *testing.T) {
	const tol = 1e-6
	pv := BubbleVaporPressure(1e6, 1e5, 2e-5, 450)
	rc := CriticalRadius(0.05, pv, 1e5)
	w := Barrier(0.05, pv, 1e5)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"p_v*", pv, 995200.66},
		{"r_c", rc, 1.1170680e-7},
		{"W", w, 2.6134718e-15},
		{"W = 4/3 π r_c² σ", w, 4.0 / 3 * math.Pi * rc * rc * 0.05},
	} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 0, tol) {
			t.Errorf("%s = %.9g, want %.9g", c.name, c.got, c.want)
		}
	}
	const m = 0.018015268
	n := 900 * phys.Avogadro / m
	T := 300.0
	wkt := 60 * phys.Boltzmann * T
	if j := NucleationRate(n, m/phys.Avogadro, 0.04, wkt, T); !scalar.EqualWithinAbsOrRel(j, 2.43057e14, 0, 1e-5) {
		t.Errorf("J = %.7g, want 2.43057e14", j)
	}
	if j := NucleationRate(n, m/phys.Avogadro, 0.04, math.Inf(1), T); j != 0 {
		t.Errorf("J with an infinite barrier = %g, want 0", j)
	}
}

// As the superheat goes to zero (p_l → p_sat from below at fixed T) the
// critical radius and barrier grow without bound, monotonically, and are
// +Inf at saturation; the rate falls to 0 (identity of the Laplace balance).
func TestCriticalRadiusDivergesAtSaturation(t *testing.T) {
	l := waterLikeStub()
	const T = 420.0
	ps := l.SaturationPressure(T)
	prev := 0.0
	for _, frac := range []float64{0.5, 0.9, 0.99, 0.999, 0.9999, 0.99999} {
		nu, err := Nucleation(l, T, frac*ps)
		if err != nil {
			t.Fatal(err)
		}
		if !(nu.CriticalRadiusM > prev) || math.IsInf(nu.CriticalRadiusM, 0) {
			t.Errorf("p_l/p_sat = %g: r_c = %g after %g", frac, nu.CriticalRadiusM, prev)
		}
		// Linearising the Poynting factor, p_v* − p_l → (p_sat − p_l)(1 − v_l p_sat/(R T)),
		// so r_c (p_sat − p_l) → 2σ/(1 − v_l p_sat/(R T)) (the ratio ρ_v/ρ_l of an ideal vapor).
		want := 2 * l.sigma / (1 - l.m/l.rho*ps/(phys.GasConstant*T))
		if frac >= 0.999 && !scalar.EqualWithinAbsOrRel(nu.CriticalRadiusM*(ps-frac*ps), want, 0, 1e-4) {
			t.Errorf("p_l/p_sat = %g: r_c Δp = %.8g, want %.8g", frac, nu.CriticalRadiusM*(ps-frac*ps), want)
		}
		prev = nu.CriticalRadiusM
	}
	if prev < 1e-4 {
		t.Errorf("r_c at p_l = 0.99999 p_sat is only %g m", prev)
	}
	nu, err := Nucleation(l, T, ps)
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsInf(nu.CriticalRadiusM, 1) || !math.IsInf(nu.BarrierJ, 1) || nu.Rate != 0 {
		t.Errorf("at saturation: r_c = %g, W = %g, J = %g; want +Inf, +Inf, 0", nu.CriticalRadiusM, nu.BarrierJ, nu.Rate)
	}
}

// Kinetic limit of superheat at 1 atm against measured superheat limits.
//
// Water: measured limits at 0.1 MPa of about 575 K (Skripov's capillary
// and droplet data as compiled by Avedisian, J. Phys. Chem. Ref. Data 14
// (1985) 695 — value from memory; droplet-in-host experiments have given
// as low as about 553 K). Tolerance 15 K.
//
// n-Alkanes: Lienhard's (1976) fit of measured limits,
// T_sl/Tc = 0.905 + 0.095 (T_sat/Tc)^8 (form and constants from memory),
// which puts hydrocarbons at 1 atm near 0.90–0.91 Tc as Blander & Katz
// (AIChE J. 21 (1975) 833) report (from memory). Tolerance 0.015 Tc
// (8–10 K), the scatter of the data around the fit.
func TestKineticLimitAgainstMeasuredSuperheatLimits(t *testing.T) {
	water, _ := fluid.Lookup("water")
	tk, err := KineticLimit(water, 101325, 0)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(tk-575) > 15 {
		t.Errorf("water: kinetic limit %.1f K, measured about 575 K (from memory)", tk)
	}
	for _, id := range []string{"n-heptane", "n-decane", "n-dodecane"} {
		l, _ := fluid.Lookup(id)
		tk, err := KineticLimit(l, 101325, 0)
		if err != nil {
			t.Fatal(err)
		}
		tc := l.CriticalTemperature()
		tr := l.NormalBoilingPoint() / tc
		want := (0.905 + 0.095*math.Pow(tr, 8)) * tc
		if math.Abs(tk-want) > 0.015*tc {
			t.Errorf("%s: kinetic limit %.1f K (%.4f Tc), Lienhard fit of measured limits %.1f K (%.4f Tc)", id, tk, tk/tc, want, want/tc)
		}
	}
}

// The root is a root: J(T_kl) equals the threshold; the limit rises with
// the threshold (by well under a kelvin per decade) and with pressure.
func TestKineticLimitIdentities(t *testing.T) {
	l, _ := fluid.Lookup("n-heptane")
	prevT := 0.0
	for _, th := range []float64{1e6, 1e9, 1e12, 1e15, 1e18} {
		tk, err := KineticLimit(l, 101325, th)
		if err != nil {
			t.Fatal(err)
		}
		nu, _ := Nucleation(l, tk, 101325)
		if !scalar.EqualWithinAbsOrRel(math.Log(nu.Rate), math.Log(th), 1e-5, 0) {
			t.Errorf("threshold %g: J(T_kl = %.4f K) = %g", th, tk, nu.Rate)
		}
		if prevT > 0 && !(tk > prevT && tk-prevT < 3) {
			t.Errorf("threshold %g: T_kl %.3f after %.3f", th, tk, prevT)
		}
		prevT = tk
	}
	prevT = 0
	for _, p := range []float64{1e4, 1e5, 5e5, 1e6, 2e6} {
		tk, err := KineticLimit(l, p, 0)
		if err != nil {
			t.Fatal(err)
		}
		ts, _ := l.SaturationTemperature(p)
		if !(tk > prevT && tk > ts && tk < l.CriticalTemperature()) {
			t.Errorf("p = %g: T_kl = %g (T_sat %g, previous %g)", p, tk, ts, prevT)
		}
		prevT = tk
	}
	if _, err := KineticLimit(l, 101325, 1e80); !errors.Is(err, ErrNoKineticLimit) {
		t.Errorf("unreachable threshold: %v", err)
	}
	if _, err := KineticLimit(l, -1, 0); err == nil {
		t.Error("negative pressure accepted")
	}
	if _, err := KineticLimit(l, 1e9, 0); err == nil {
		t.Error("pressure above the critical accepted")
	}
}
