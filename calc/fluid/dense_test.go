package fluid

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestChungDenseConductivityWorkedExample checks ChungDenseConductivity
// against the worked example of CalebBell/chemicals, Chung_dense (propylene
// at 473 K and Vm = 172.1 cm3/mol, Poling et al. 5th ed.): 0.06160569232570781
// W/(m K), with Chung's own dilute value λ° = 31.2 η° Ψ/M' and the polar
// terms of μ = 0.4 debye.
func TestChungDenseConductivityWorkedExample(t *testing.T) {
	const (
		T, m, tc, vc, omega = 473.0, 42.081e-3, 364.9, 184.6e-6, 0.142
		cvm, vm, mu, dipole = 82.67, 172.1e-6, 134e-7, 0.4
	)
	mur := 131.3 * dipole / math.Sqrt(vc*1e6*tc)
	alpha := cvm/gasConstant - 1.5
	beta := 0.7862 - 0.7109*omega + 1.3168*omega*omega
	z := 2 + 10.5*(T/tc)*(T/tc)
	psi := 1 + alpha*((0.215+0.28288*alpha-1.061*beta+0.26665*z)/(0.6366+beta*z+1.061*alpha*beta))
	k0 := 31.2 * mu * psi / m
	got := ChungDenseConductivity(k0, T, 1/vm, m, tc, vc, omega, mur*mur*mur*mur, 0)
	// chemicals uses R = 8.314462618 as calc/phys does (CODATA 2018); the
	// order of its operations differs, which leaves about 1e-11.
	if want := 0.06160569232570781; math.Abs(got/want-1) > 1e-10 {
		t.Errorf("Chung dense conductivity = %.17g, chemicals' example %.17g", got, want)
	}
}

// TestChungDenseAgainstArithmetic compares ChungDenseViscosity and
// ChungDenseConductivity with the plain-Python arithmetic of the published
// form in testdata/fluid/chung_dense.csv (written by chung_dense.py).
func TestChungDenseAgainstArithmetic(t *testing.T) {
	f, err := os.Open("../../testdata/fluid/chung_dense.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	rows, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) < 5 {
		t.Fatalf("%d rows", len(rows))
	}
	for _, row := range rows[1:] {
		v := make([]float64, len(row))
		for i, s := range row {
			v[i], _ = strconv.ParseFloat(strings.TrimSpace(s), 64)
		}
		mu := ChungDenseViscosity(v[0], v[2], v[3], v[4], v[5], v[6], v[7], 0, 0)
		k := ChungDenseConductivity(v[1], v[2], v[3], v[4], v[5], v[6], v[7], 0, 0)
		if math.Abs(mu/v[8]-1) > 1e-12 || math.Abs(k/v[9]-1) > 1e-12 {
			t.Errorf("row %v: mu %.17g k %.17g, want %.17g %.17g", row[:8], mu, k, v[8], v[9])
		}
	}
}

// TestChungDenseLimits: as the density goes to 0 the dense values tend to
// the dilute ones (to first order in y), and they rise with density.
func TestChungDenseLimits(t *testing.T) {
	const mu0, k0, T, m, tc, vc, om = 3e-5, 0.045, 700.0, 28.0134e-3, 126.192, 89.41e-6, 0.0372
	for _, rho := range []float64{1e-9, 1e-6} {
		if mu := ChungDenseViscosity(mu0, T, rho, m, tc, vc, om, 0, 0); math.Abs(mu/mu0-1) > 1e-6 {
			t.Errorf("ρ = %g mol/m3: μ/μ° = %.12g, want → 1", rho, mu/mu0)
		}
		if k := ChungDenseConductivity(k0, T, rho, m, tc, vc, om, 0, 0); math.Abs(k/k0-1) > 1e-6 {
			t.Errorf("ρ = %g mol/m3: λ/λ° = %.12g, want → 1", rho, k/k0)
		}
	}
	prevMu, prevK := mu0, k0
	for rho := 200.0; rho <= 4000; rho += 200 {
		mu := ChungDenseViscosity(mu0, T, rho, m, tc, vc, om, 0, 0)
		k := ChungDenseConductivity(k0, T, rho, m, tc, vc, om, 0, 0)
		if !(mu > prevMu && k > prevK) {
			t.Errorf("ρ = %g mol/m3: μ %g, λ %g do not rise from %g, %g", rho, mu, k, prevMu, prevK)
		}
		prevMu, prevK = mu, k
	}
}

// TestRiaziWhitsonFactor checks the published form's arithmetic: 1.07 at
// μ/μ° = 1 and, for ω = 0.3, pr = 5, μ/μ° = 1.5: b = −0.27 − 0.114 =
// −0.384, c pr = (−0.05 + 0.03)·5 = −0.1, so 1.07 · 1.5^−0.484 (hand
// arithmetic).
func TestRiaziWhitsonFactor(t *testing.T) {
	if f := RiaziWhitsonFactor(1, 3, 0.2); f != 1.07 {
		t.Errorf("factor at μ/μ° = 1: %g, want 1.07", f)
	}
	want := 1.07 * math.Exp(-0.484*math.Log(1.5))
	if f := RiaziWhitsonFactor(1.5, 5, 0.3); math.Abs(f/want-1) > 1e-14 {
		t.Errorf("factor = %.15g, want %.15g", f, want)
	}
}

// TestDenseFilmAtPressure evaluates the film of n-dodecane and water in N2
// and air at 20–60 bar and 600–900 K gas: the film is denser than the
// ideal gas where attraction wins (Z < 1 with much vapor) and close to it
// in hot, nearly pure gas; the viscosity and conductivity rise above the
// dilute values with pressure and ρD falls; every number is finite and
// positive.
func TestDenseFilmAtPressure(t *testing.T) {
	for _, lid := range []string{"n-dodecane", "water"} {
		l, _ := Lookup(lid)
		for _, gid := range []string{"nitrogen", "air"} {
			g, _ := LookupGas(gid)
			for _, tinf := range []float64{600, 750, 900} {
				ts := 450.0
				if lid == "water" {
					ts = 420
				}
				ys := 0.2
				dil := FilmProperties(l, g, 4e5, ts, tinf, ys, 0) // dilute (below the blend)
				prevMuRatio, prevKRatio, prevRhoD := 1.0, 1.0, math.Inf(1)
				for _, p := range []float64{2e6, 4e6, 6e6} {
					f := FilmProperties(l, g, p, ts, tinf, ys, 0)
					ideal := p * f.MolarMass / (gasConstant * f.T)
					if math.Abs(f.Density*f.Compressibility/ideal-1) > 1e-12 {
						t.Errorf("%s/%s %g K %g Pa: ρ Z = %g, ideal ρ %g", lid, gid, tinf, p, f.Density*f.Compressibility, ideal)
					}
					if !(f.Compressibility > 0.8 && f.Compressibility < 1.1) {
						t.Errorf("%s/%s %g K %g Pa: Z = %g, out of the plausible range", lid, gid, tinf, p, f.Compressibility)
					}
					muR, kR := f.Viscosity/dil.Viscosity, f.Conductivity/dil.Conductivity
					rhoD := f.Density * f.Diffusivity
					if !(muR > prevMuRatio && kR > prevKRatio && muR < 1.5 && kR < 1.5) {
						t.Errorf("%s/%s %g K %g Pa: μ/μ° = %g, λ/λ° = %g (previous %g, %g)", lid, gid, tinf, p, muR, kR, prevMuRatio, prevKRatio)
					}
					if !(rhoD < prevRhoD) || !(rhoD > 0) {
						t.Errorf("%s/%s %g K %g Pa: ρD = %g does not fall from %g", lid, gid, tinf, p, rhoD, prevRhoD)
					}
					prevMuRatio, prevKRatio, prevRhoD = muR, kR, rhoD
				}
			}
		}
	}
}

// TestDenseBlend: at and below 0.5 MPa the film is the dilute ideal gas bit
// for bit (Z = 1 exactly, density p M/(R T)); the blend is continuous at
// both ends.
func TestDenseBlend(t *testing.T) {
	l, _ := Lookup("n-dodecane")
	g, _ := LookupGas("nitrogen")
	for _, p := range []float64{101325, 2e5, 5e5} {
		f := FilmProperties(l, g, p, 450, 700, 0.1, 0)
		if f.Compressibility != 1 || f.Density != p*f.MolarMass/(gasConstant*f.T) {
			t.Errorf("%g Pa: Z = %v, ρ = %v, want the ideal gas exactly", p, f.Compressibility, f.Density)
		}
	}
	for _, p := range []float64{denseLow, denseHigh} {
		a := FilmProperties(l, g, p*(1-1e-9), 450, 700, 0.1, 0)
		b := FilmProperties(l, g, p*(1+1e-9), 450, 700, 0.1, 0)
		for _, pair := range [][2]float64{{a.Density / p, b.Density / p}, {a.Viscosity, b.Viscosity}, {a.Conductivity, b.Conductivity}, {a.Diffusivity * p, b.Diffusivity * p}} {
			if math.Abs(pair[0]/pair[1]-1) > 1e-6 {
				t.Errorf("blend jumps at %g Pa: %g vs %g", p, pair[0], pair[1])
			}
		}
	}
	if w := denseWeight(0.75e6); w != 0.5 {
		t.Errorf("weight at the middle = %g, want 0.5", w)
	}
}

// TestDenseFilmCacheMatchesDirect: the solvers' FilmCache (direct and
// from its grid) carries the dense corrections as FilmProperties does, at
// 40 bar.
func TestDenseFilmCacheMatchesDirect(t *testing.T) {
	l, _ := Lookup("n-dodecane")
	g, _ := LookupGas("nitrogen")
	c := NewFilmCache(l, g)
	for i, ts := range []float64{450, 452.3, 455.7, 460.1, 470.9} {
		want := FilmProperties(l, g, 4e6, ts, 800, 0.3, 0)
		got := c.Properties(4e6, ts, 800, 0.3, 0)
		if want.Compressibility == 1 {
			t.Fatalf("no dense correction at 40 bar")
		}
		for _, pair := range [][2]float64{{got.Density, want.Density}, {got.Viscosity, want.Viscosity}, {got.Conductivity, want.Conductivity}, {got.Diffusivity, want.Diffusivity}, {got.Compressibility, want.Compressibility}} {
			if math.Abs(pair[0]/pair[1]-1) > 1e-12 {
				t.Errorf("state %d (Ts %g K): cache %.15g, direct %.15g", i, ts, pair[0], pair[1])
			}
		}
	}
}
