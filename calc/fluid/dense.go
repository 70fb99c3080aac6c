package fluid

import (
	"math"

	"fogbench/calc/numeric"
)

// The gas film at pressure. Above about 1 MPa the dilute-gas mixture
// properties of FilmProperties drift: the film is denser than an ideal gas,
// its viscosity and conductivity rise with density and the product ρD of
// the binary diffusivity falls. This file holds the corrections applied to
// the film at the reference state of the 1/3 rule, with the film mixture
// (the liquid's vapor and the gas) treated as one pseudo-pure fluid:
//
//	density: Peng–Robinson (1976) with van der Waals mixing and the
//	  published k_ij (FilmInteraction), vapor root Z at (Tr, p, x_v):
//	  ρ = p M/(Z R Tr)
//	viscosity, conductivity: the dense-fluid terms of Chung, Ajlan, Lee &
//	  Starling, Ind. Eng. Chem. Res. 27 (1988) 671 (ChungDenseViscosity,
//	  ChungDenseConductivity) added to the dilute Wilke/Mason–Saxena
//	  mixture values, with Kay's-rule pseudo-critical constants
//	diffusivity: Riazi & Whitson, Ind. Eng. Chem. Res. 32 (1993) 3081
//	  (RiaziWhitsonFactor): D = D_Fuller · Z · 1.07 (μ/μ°)^(b + c p/pc,m)
//
// The corrections are blended in between denseLow and denseHigh
// (denseWeight), so that at and below 5 bar the film is the dilute ideal
// gas bit for bit: the Riazi–Whitson factor is 1.07 rather than 1 in the
// dilute limit (the scatter of the data it was fitted on), and the
// blend keeps the low-pressure rates, which agree with the independent
// reference to 1e-9, where they were.

// denseLow and denseHigh bound the pressure blend of the dense-film
// corrections in Pa: none at or below 0.5 MPa, all at and above 1 MPa
// (where the dilute values are more than about 1 % off; common practice,
// no source).
const (
	denseLow  = 0.5e6
	denseHigh = 1e6
)

// denseMaxReduced is the largest reduced pressure p/pc of the gas at
// which Gas.Check stays silent about the high-pressure diffusivity
// factor (Riazi & Whitson 1993 fitted data to reduced pressures of about 6;
// from memory, not read).
const denseMaxReduced = 6.0

// denseWeight is the blend weight of the dense corrections at p (Pa): the
// smoothstep 3s² − 2s³ of s = (p − denseLow)/(denseHigh − denseLow) held to
// [0, 1]; continuous with a continuous first derivative in p.
func denseWeight(p float64) float64 {
	s := (p - denseLow) / (denseHigh - denseLow)
	if !(s > 0) {
		return 0
	}
	if s >= 1 {
		return 1
	}
	return s * s * (3 - 2*s)
}

// gasCritical holds the critical constants of the carrier gases for the
// equation of state and Chung's method: N2 Tc, pc from Span et al., J.
// Phys. Chem. Ref. Data 29 (2000) 1361 and ω = 0.0372 (from memory; Vc =
// 1/ρc with ρc = 11.1839 mol/dm3, from memory); air as one pseudo-component
// with the maxcondentherm constants of Lemmon et al. (2000) (Tc, pc read in
// python3-iapws 1.5.2, humidAir.py Air; ω and Vc = 1/10.4477 mol/dm3 from
// memory).
var gasCritical = map[string]struct{ tc, pc, omega, vc float64 }{
	"nitrogen": {126.192, 3.3958e6, 0.0372, 1 / 11183.9},
	"air":      {132.6306, 3.786e6, 0.0335, 1 / 10447.7},
}

// Critical returns the gas's critical temperature (K), critical pressure
// (Pa) and acentric factor for the Peng–Robinson equation of state, and
// whether it has them.
func (g *Gas) Critical() (tc, pc, omega float64, ok bool) {
	c, ok := gasCritical[g.ID]
	return c.tc, c.pc, c.omega, ok
}

// KijSource is the published table of the N2–liquid interaction parameters.
const KijSource = "DECHEMA Peng–Robinson interaction parameters as distributed in ChemSep's pr.ipd (Kooijman & Taylor 2009; read in the copy in CalebBell/thermo)"

// nitrogenKij gives k_ij of N2 with each built-in organic liquid and where
// the value comes from. Values are tabulated for n-heptane (0.1441),
// n-decane (0.1122) and methanol (−0.2141); the heavier n-alkanes take the
// n-decane value and iso-octane the n-heptane value (the nearest
// tabulated alkanes; an assumption, no source); ethanol and acetone have no
// tabulated value and take 0.
var nitrogenKij = map[string]struct {
	k    float64
	note string
}{
	"n-heptane":          {0.1441, "N2–n-heptane, tabulated"},
	"n-decane":           {0.1122, "N2–n-decane, tabulated"},
	"n-dodecane":         {0.1122, "the N2–n-decane value (no tabulated N2–n-dodecane value; assumption)"},
	"kerosene-surrogate": {0.1122, "the N2–n-decane value (no tabulated N2–n-dodecane value; assumption)"},
	"n-hexadecane":       {0.1122, "the N2–n-decane value (no tabulated N2–n-hexadecane value; assumption)"},
	"diesel-surrogate":   {0.1122, "the N2–n-decane value (no tabulated N2–n-hexadecane value; assumption)"},
	"iso-octane":         {0.1441, "the N2–n-heptane value (no tabulated N2–iso-octane value; assumption)"},
	"methanol":           {-0.2141, "N2–methanol, tabulated"},
	"ethanol":            {0, "0 (no tabulated N2–ethanol value)"},
	"acetone":            {0, "0 (no tabulated N2–acetone value)"},
}

// FilmInteraction returns the Peng–Robinson k_ij of the liquid's substance
// with the gas (air takes the N2 value), a note on where it comes from and
// whether the liquid has an entry (false: a user liquid or water, k_ij = 0).
func FilmInteraction(l *Liquid) (kij float64, note string, ok bool) {
	v, ok := nitrogenKij[l.ID]
	if !ok {
		return 0, "0 (no tabulated value for a user liquid)", false
	}
	return v.k, v.note, true
}

// denseFilm holds the constants of the film mixture's dense corrections
// for one liquid–gas pair.
type denseFilm struct {
	ok                 bool
	kij                float64
	vcV, vcG           float64 // critical volumes, m3/mol
	tcV, tcG, pcV, pcG float64
	omegaV, omegaG     float64
	liquidFor          *Liquid
	gasFor             *Gas
}

// newDenseFilm returns the dense-film constants of liquid l in gas g; ok is
// false when the gas has no critical constants (the dilute film is kept).
func newDenseFilm(l *Liquid, g *Gas) denseFilm {
	c, ok := gasCritical[g.ID]
	d := denseFilm{liquidFor: l, gasFor: g}
	if !ok || !(l.tc > 0 && l.pc > 0 && l.vc > 0) {
		return d
	}
	kij, _, _ := FilmInteraction(l)
	d.ok = true
	d.kij = kij
	d.vcV, d.vcG = l.vc, c.vc
	d.tcV, d.tcG, d.pcV, d.pcG = l.tc, c.tc, l.pc, c.pc
	d.omegaV, d.omegaG = l.omega, c.omega
	return d
}

// apply corrects the dilute film f (vapor mole fraction f.VaporMoleFraction,
// molar mass f.MolarMass, at f.T and p) for pressure, with the blend
// weight denseWeight(p). Nothing changes where the weight is 0.
func (d *denseFilm) apply(f *Film, p float64) {
	w := denseWeight(p)
	if w == 0 || !d.ok {
		return
	}
	xv := f.VaporMoleFraction
	xg := 1 - xv
	T := f.T
	z := d.compressibility(T, p, xv)
	if !(z > 0) || math.IsNaN(z) || math.IsInf(z, 0) {
		return
	}
	// Kay's rule pseudo-critical constants of the film mixture.
	tc := xv*d.tcV + xg*d.tcG
	pc := xv*d.pcV + xg*d.pcG
	omega := xv*d.omegaV + xg*d.omegaG
	vc := xv*d.vcV + xg*d.vcG
	// The polar terms (μr⁴, κ) are left out: with the 1988 coefficients
	// they turn E_i negative for water and acetone vapor (E1 < 0 for
	// water), and the film is mostly the nonpolar gas.
	const mur4, kappa = 0, 0
	rhoMolar := p / (z * gasConstant * T) // mol/m3
	mu0, k0 := f.Viscosity, f.Conductivity
	mu := ChungDenseViscosity(mu0, T, rhoMolar, f.MolarMass, tc, vc, omega, mur4, kappa)
	k := ChungDenseConductivity(k0, T, rhoMolar, f.MolarMass, tc, vc, omega, mur4, kappa)
	diff := f.Diffusivity * z * RiaziWhitsonFactor(mu/mu0, p/pc, omega)
	rho := f.Density / z
	for _, v := range [...]float64{mu, k, diff, rho} {
		if !(v > 0) || math.IsInf(v, 0) {
			return // outside the correlations' reach: keep the dilute film
		}
	}
	f.Density += w * (rho - f.Density)
	f.Viscosity += w * (mu - f.Viscosity)
	f.Conductivity += w * (k - f.Conductivity)
	f.Diffusivity += w * (diff - f.Diffusivity)
	f.Compressibility = 1 + w*(z-1)
	f.MeanFreePath = MeanFreePath(f.Viscosity, T, p, f.MolarMass)
}

// prOmegaA and prOmegaB are the Peng–Robinson constants Ωa and Ωb (Peng &
// Robinson 1976, rounded there to 0.45724 and 0.07780), here to full
// precision from the critical conditions ∂p/∂v = ∂²p/∂v² = 0, as calc/flash
// computes them (prConstants there).
var prOmegaA, prOmegaB = prConstantsFluid()

// prConstantsFluid returns Ωa and Ωb of Peng–Robinson: the critical
// volume x = vc/b is the minimum of F(x) = (x² + 2x − 1)²/(2 (x + 1)
// (x − 1)²) (a/(b R T) on the spinodal), found by bisection on
// d ln F/dx = 0 over [1.5, 10]; then Ωb = 1/(xc − 1) − F(xc)/(xc² + 2xc − 1)
// and Ωa = F(xc) Ωb.
func prConstantsFluid() (omegaA, omegaB float64) {
	dlnF := func(x float64) float64 {
		return 2*(2*x+2)/(x*x+2*x-1) - 1/(x+1) - 2/(x-1)
	}
	lo, hi := 1.5, 10.0
	for i := 0; i < 200 && hi-lo > 1e-15; i++ {
		mid := 0.5 * (lo + hi)
		if dlnF(lo)*dlnF(mid) <= 0 {
			hi = mid
		} else {
			lo = mid
		}
	}
	xc := 0.5 * (lo + hi)
	q := xc*xc + 2*xc - 1
	fc := q * q / (2 * (xc + 1) * (xc - 1) * (xc - 1))
	omegaB = 1/(xc-1) - fc/q
	return fc * omegaB, omegaB
}

// compressibility returns Z of the film mixture (vapor mole fraction xv)
// at T (K) and p (Pa) on the vapor (largest) root of the Peng–Robinson
// cubic with van der Waals one-fluid mixing,
//
//	a = Σ_i Σ_j x_i x_j (1 − k_ij) (a_i a_j)^½,  b = Σ x_i b_i
//	a_i = Ωa R² Tc_i²/pc_i [1 + κ_i (1 − (T/Tc_i)^½)]²,  b_i = Ωb R Tc_i/pc_i
//	κ = 0.37464 + 1.54226 ω − 0.26992 ω²
//	Z³ − (1 − B) Z² + (A − 3B² − 2B) Z − (A B − B² − B³) = 0,
//	A = a p/(R T)², B = b p/(R T)
//
// (Peng & Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59): the equations
// of calc/flash's Binary, which calc/fluid cannot import (flash's tests
// import fluid); TestFilmCompressibilityMatchesFlash in calc holds the two
// equal. NaN where the cubic has no root above B.
func (d *denseFilm) compressibility(T, p, xv float64) float64 {
	r := gasConstant
	ai := func(tc, pc, omega float64) (a, b float64) {
		k := 0.37464 + 1.54226*omega - 0.26992*omega*omega
		s := 1 + k*(1-math.Sqrt(T/tc))
		return prOmegaA * r * r * tc * tc / pc * s * s, prOmegaB * r * tc / pc
	}
	a1, b1 := ai(d.tcV, d.pcV, d.omegaV)
	a2, b2 := ai(d.tcG, d.pcG, d.omegaG)
	xg := 1 - xv
	a := xv*xv*a1 + 2*xv*xg*(1-d.kij)*math.Sqrt(a1*a2) + xg*xg*a2
	b := xv*b1 + xg*b2
	rt := r * T
	A := a * p / (rt * rt)
	B := b * p / rt
	return cubicLargestRoot(A, B)
}

// cubicLargestRoot returns the largest real root above B of the
// Peng–Robinson cubic in Z (see compressibility), by numeric.CubicRoots
// (whose first root is the largest); NaN if none lies above B.
func cubicLargestRoot(A, B float64) float64 {
	z := numeric.CubicRoots(-(1 - B), A-3*B*B-2*B, -(A*B - B*B - B*B*B))[0]
	if !(z > B) {
		return math.NaN()
	}
	return z
}

// chungG returns y = ρ Vc/6 and G1 = (1 − 0.5 y)/(1 − y)³ of Chung et al.
// (1988), ρ in mol/m3 and Vc in m3/mol.
func chungY(rhoMolar, vc float64) (y, g1 float64) {
	y = rhoMolar * vc / 6
	d := 1 - y
	return y, (1 - 0.5*y) / (d * d * d)
}

// chungG2 is G2 = {(E1/y)[1 − exp(−E4 y)] + E2 G1 exp(E5 y) + E3 G1} /
// (E1 E4 + E2 + E3) of Chung et al. (1988), which tends to 1 as y → 0.
func chungG2(e1, e2, e3, e4, e5, y, g1 float64) float64 {
	var first float64
	if y < 1e-300 {
		first = e1 * e4
	} else {
		first = e1 / y * -math.Expm1(-e4*y)
	}
	return (first + e2*g1*math.Exp(e5*y) + e3*g1) / (e1*e4 + e2 + e3)
}

// Chung et al. (1988) viscosity coefficients a_i, b_i, c_i, d_i of
// E_i = a_i + b_i ω + c_i μr⁴ + d_i κ (Poling, Prausnitz & O'Connell, The
// Properties of Gases and Liquids, 5th ed., Table 9-6, not read; a_i and
// b_i read in two open-source implementations of Chung et al. 1988 found
// with the search tool, which agree with each other; c_i and d_i, the
// polar terms, in one of them).
var chungViscA = [10]float64{6.32402, 1.2102e-3, 5.28346, 6.62263, 19.74540, -1.89992, 24.27450, 0.79716, -0.23816, 0.068629}
var chungViscB = [10]float64{50.41190, -1.1536e-3, 254.209, 38.0957, 7.63034, -12.53670, 3.44945, 1.11764, 0.067695, 0.34793}
var chungViscC = [10]float64{-51.68, -6.2571e-3, -168.481, -8.46414, -14.35440, 4.98529, -11.29130, 0.012348, -0.8163, 0.59256}
var chungViscD = [10]float64{1189.02, 0.037283, 3898.270, 31.4178, 31.52670, -18.1507, 69.3464, -4.1161, 4.02528, -0.72663}

// ChungDenseViscosity returns the viscosity in Pa s of a dense gas by the
// method of Chung, Ajlan, Lee & Starling, Ind. Eng. Chem. Res. 27 (1988)
// 671, as given by Poling, Prausnitz & O'Connell, 5th ed., eqs.
// 9-6.18 to 9-6.21 (equation numbers from the brief, not read):
//
//	μ = μ° (1/G2 + E6 y) + μ**,  μ** [μP] = 36.344 (M Tc)^½/Vc^⅔ · E7 y² G2 exp(E8 + E9/T* + E10/T*²)
//	y = ρ Vc/6,  G1 = (1 − 0.5 y)/(1 − y)³,  T* = 1.2593 T/Tc
//	G2 = {(E1/y)[1 − exp(−E4 y)] + E2 G1 exp(E5 y) + E3 G1}/(E1 E4 + E2 + E3)
//	E_i = a_i + b_i ω + c_i μr⁴ + d_i κ
//
// (M in g/mol, Vc in cm3/mol, ρ in mol/cm3 inside the formula). Here the
// dilute viscosity μ° (Pa s) is the caller's: Chung's own is
// 40.785 Fc (M T)^½/(Vc^⅔ Ω_v) μP; with it the function is Chung's method
// exactly. Arguments are SI: T K, ρ mol/m3, M kg/mol, Tc K, Vc m3/mol;
// mur4 = μr⁴ (μr = 131.3 μ/(Vc Tc)^½, μ in debye) and kappa the
// association factor. As ρ → 0 the result tends to μ°. Validity (Chung et
// al. 1988, from memory): nonpolar and polar gases and liquids, about
// 5–10 % at high density; the dense part is fitted on pure fluids, and a
// mixture takes pseudo-critical constants.
func ChungDenseViscosity(mu0, T, rhoMolar, m, tc, vc, omega, mur4, kappa float64) float64 {
	var e [10]float64
	for i := range e {
		e[i] = chungViscA[i] + chungViscB[i]*omega + chungViscC[i]*mur4 + chungViscD[i]*kappa
	}
	y, g1 := chungY(rhoMolar, vc)
	g2 := chungG2(e[0], e[1], e[2], e[3], e[4], y, g1)
	ts := 1.2593 * T / tc
	vcc := vc * 1e6
	muss := e[6] * y * y * g2 * math.Exp(e[7]+e[8]/ts+e[9]/(ts*ts))
	return mu0*(1/g2+e[5]*y) + 36.344*math.Sqrt(m*1e3*tc)/math.Cbrt(vcc*vcc)*muss*1e-7
}

// Chung et al. (1988) conductivity coefficients of B_i = a_i + b_i ω +
// c_i μr⁴ + d_i κ (Poling et al. 5th ed. Table 10-3; read in CalebBell/
// chemicals, thermal_conductivity.py, Chung_dense, which cites Chung et al.
// 1988 and Poling et al. 2000).
var chungCondA = [7]float64{2.4166, -0.50924, 6.6107, 14.543, 0.79274, -5.8634, 91.089}
var chungCondB = [7]float64{0.74824, -1.5094, 5.6207, -8.9139, 0.82019, 12.801, 128.11}
var chungCondC = [7]float64{-0.91858, -49.991, 64.760, -5.6379, -0.69369, 9.5893, -54.217}
var chungCondD = [7]float64{121.72, 69.983, 27.039, 74.344, 6.3173, 65.529, 523.81}

// ChungDenseConductivity returns the thermal conductivity in W/(m K) of a
// dense gas by Chung et al. (1988), Poling et al. 5th ed. eq. 10-5.4
// (equation number from the brief, not read; the form read in CalebBell/
// chemicals, Chung_dense):
//
//	λ = λ° (1/G2 + B6 y) + q B7 y² Tr^½ G2,  q = 3.586e-3 (Tc/M')^½/Vc^⅔
//
// with y, G1, G2 as in ChungDenseViscosity (B_i in place of E_i), M' in
// kg/mol, Vc in cm3/mol. The dilute conductivity λ° is the caller's;
// Chung's own is 31.2 η° Ψ/M'. SI arguments as ChungDenseViscosity. As
// ρ → 0 the result tends to λ°.
func ChungDenseConductivity(k0, T, rhoMolar, m, tc, vc, omega, mur4, kappa float64) float64 {
	var b [7]float64
	for i := range b {
		b[i] = chungCondA[i] + chungCondB[i]*omega + chungCondC[i]*mur4 + chungCondD[i]*kappa
	}
	y, g1 := chungY(rhoMolar, vc)
	g2 := chungG2(b[0], b[1], b[2], b[3], b[4], y, g1)
	vcc := vc * 1e6
	q := 3.586e-3 * math.Sqrt(tc/m) / math.Cbrt(vcc*vcc)
	return k0*(1/g2+b[5]*y) + q*b[6]*y*y*math.Sqrt(T/tc)*g2
}

// RiaziWhitsonFactor returns (ρD)/(ρD)° of Riazi & Whitson, Ind. Eng.
// Chem. Res. 32 (1993) 3081, their fit of the high-pressure binary
// diffusivity data (in the spirit of Takahashi's 1974 chart):
//
//	(ρD)/(ρD)° = 1.07 (μ/μ°)^(b + c pr),  b = −0.27 − 0.38 ω,  c = −0.05 + 0.1 ω
//
// with μ/μ° the mixture's viscosity over its dilute value, pr = p/pc and ω
// of the mixture by Kay's rule (the form and Kay's-rule pr and ω read in an
// open-source porous-media code found with the search tool; the paper not
// read). ° marks the low-pressure values; D = D° (ρ°/ρ) times the factor,
// and ρ°/ρ = Z at the same T and p. Dimensionless. In the dilute limit the
// factor is 1.07, not 1 (the fit's scatter); callers blend it in above
// low pressure (see denseWeight).
func RiaziWhitsonFactor(muRatio, pr, omega float64) float64 {
	b := -0.27 - 0.38*omega
	c := -0.05 + 0.1*omega
	return 1.07 * math.Pow(muRatio, b+c*pr)
}

// FilmCompressibility returns Z of the film mixture of liquid l's vapor
// (mole fraction xv) in gas g at T (K) and p (Pa), from the Peng–Robinson
// equation of the film's density (see denseFilm.compressibility), or NaN
// where the pair has no constants or the cubic no vapor root.
func FilmCompressibility(l *Liquid, g *Gas, T, p, xv float64) float64 {
	d := newDenseFilm(l, g)
	if !d.ok {
		return math.NaN()
	}
	return d.compressibility(T, p, xv)
}
