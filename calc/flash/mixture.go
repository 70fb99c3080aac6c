package flash

import (
	"errors"
	"fmt"
	"math"

	"fogbench/calc/numeric"
	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// Binary is the Peng–Robinson equation of state of a binary mixture: the
// drop's substance (component 1, Liquid) and the surrounding gas (component
// 2, Gas), with the van der Waals one-fluid mixing rules
//
//	a = Σ_i Σ_j z_i z_j (1 − k_ij) sqrt(a_i a_j),   b = Σ_i z_i b_i
//
// and one binary interaction parameter k_12 = Kij (Peng & Robinson 1976;
// the mixing rules are their eqs. 19–20, equation numbers from memory).
// Pressures in Pa, temperatures in K, compositions as mole fractions of
// the GAS (component 2), which keeps precision where it is small (the gas
// dissolved in the liquid).
//
// Validity: non-polar or weakly polar mixtures with a fitted k_12; with
// k_12 = 0 for a polar liquid the dissolved-gas fraction is only an
// estimate. The liquid volume of Peng–Robinson is 10–20 % off for heavy
// liquids, so callers take the liquid's own volume and vapor pressure for
// the Poynting and Raoult parts and use this model for the fugacity
// coefficients and the phase boundary.
type Binary struct {
	Liquid PengRobinson // component 1
	Gas    PengRobinson // component 2
	Kij    float64      // k_12, dimensionless
}

// ErrNoTwoPhase is wrapped when a binary flash at (T, p) finds only one
// phase: past the mixture's critical point or outside the two-phase
// region.
var ErrNoTwoPhase = errors.New("flash: no liquid–vapor split of the mixture at this temperature and pressure")

// Phase selects the root of the cubic: the liquid (smallest volume) or the
// vapor (largest).
type Phase int

// The two roots LnPhi may take.
const (
	LiquidPhase Phase = iota
	VaporPhase
)

// mixParams returns a, b and the sums 2 Σ_j z_j a_ij / a of each component
// at gas mole fraction z2.
func (m Binary) mixParams(T, z2 float64) (a, b, s1, s2, b1, b2 float64) {
	a1, b1 := m.Liquid.params(T)
	a2, b2 := m.Gas.params(T)
	a12 := (1 - m.Kij) * math.Sqrt(a1*a2)
	z1 := 1 - z2
	a = z1*z1*a1 + 2*z1*z2*a12 + z2*z2*a2
	b = z1*b1 + z2*b2
	s1 = 2 * (z1*a1 + z2*a12) / a
	s2 = 2 * (z1*a12 + z2*a2) / a
	return a, b, s1, s2, b1, b2
}

// cubicRoots returns the real roots above B of
// Z³ − (1 − B) Z² + (A − 3B² − 2B) Z − (A B − B² − B³) = 0, smallest and
// largest (equal when there is one), by numeric.CubicRoots.
func cubicRoots(A, B float64) (zmin, zmax float64) {
	zmin, zmax = math.Inf(1), math.Inf(-1)
	for _, z := range numeric.CubicRoots(-(1 - B), A-3*B*B-2*B, -(A*B - B*B - B*B*B)) {
		if z > B {
			zmin, zmax = math.Min(zmin, z), math.Max(zmax, z)
		}
	}
	return zmin, zmax
}

// LnPhi returns ln φ_1 and ln φ_2, the fugacity coefficients of the two
// components in the phase of gas mole fraction z2 at T (K) and p (Pa), and
// its compressibility Z (Peng & Robinson 1976, eq. 21 — from memory for the
// number):
//
//	ln φ_i = (b_i/b)(Z − 1) − ln(Z − B)
//	         − A/(2√2 B) · (2 Σ_j z_j a_ij / a − b_i/b) · ln[(Z + (1+√2) B)/(Z + (1−√2) B)]
//
// with A = a p/(R T)², B = b p/(R T). phase picks the root; where the
// cubic has one real root both phases take it.
func (m Binary) LnPhi(T, p, z2 float64, phase Phase) (lnPhi1, lnPhi2, Z float64) {
	a, b, s1, s2, b1, b2 := m.mixParams(T, z2)
	rt := phys.GasConstant * T
	A := a * p / (rt * rt)
	B := b * p / rt
	zmin, zmax := cubicRoots(A, B)
	Z = zmax
	if phase == LiquidPhase {
		Z = zmin
	}
	lg := math.Log((Z + (1+math.Sqrt2)*B) / (Z + (1-math.Sqrt2)*B))
	c := A / (2 * math.Sqrt2 * B) * lg
	base := -math.Log(Z - B)
	lnPhi1 = b1/b*(Z-1) + base - c*(s1-b1/b)
	lnPhi2 = b2/b*(Z-1) + base - c*(s2-b2/b)
	return lnPhi1, lnPhi2, Z
}

// PureLiquidLnPhi returns ln φ of the pure component m on the liquid
// (smallest) root at T (K) and p (Pa); see LnPhi.
func (m PengRobinson) PureLiquidLnPhi(T, p float64) float64 {
	l, _, _ := Binary{Liquid: m, Gas: m}.LnPhi(T, p, 0, LiquidPhase)
	return l
}

// PureVaporLnPhi returns ln φ of the pure component m on the vapor (largest)
// root at T (K) and p (Pa): eq. 15 of Peng & Robinson (1976) (from memory
// for the number); see lnPhi.
func (m PengRobinson) PureVaporLnPhi(T, p float64) float64 {
	l, _, _ := Binary{Liquid: m, Gas: m}.LnPhi(T, p, 0, VaporPhase)
	return l
}

// Split is a binary liquid–vapor equilibrium: gas mole fractions in the
// liquid (X2) and the vapor (Y2).
type Split struct {
	X2, Y2 float64
}

// criticalGap is the smallest |Y2 − X2| Flash accepts as two phases: closer
// than that, the split is taken to have reached the mixture critical point.
const criticalGap = 1e-4

// Flash returns the liquid–vapor split of the binary at T (K) and p (Pa):
// equal fugacities z_i φ_i^L = y_i φ_i^V for both components, solved by
// successive substitution on K_i = φ_i^L/φ_i^V from Wilson's K-values
// (Michelsen & Mollerup, Thermodynamic Models, 2nd ed., ch. 10; the Wilson
// form ln K_i = ln(pc_i/p) + 5.373 (1 + ω_i)(1 − Tc_i/T) — from memory),
// then Newton steps on the two equilibrium equations. With two components
// the split follows from the K-values alone: x_1 = (1 − K_2)/(K_1 − K_2),
// y_i = K_i x_i. The error wraps ErrNoTwoPhase when the iteration falls to
// the trivial solution (x = y) or leaves 0 < x, y < 1: past the mixture
// critical point, or at a temperature where one phase is stable at every
// composition.
func (m Binary) Flash(T, p float64) (Split, error) {
	return m.FlashOffset(T, p, 0)
}

// FlashOffset is Flash with ln φ_1 of the liquid phase raised by d1: the
// liquid fugacity of component 1 becomes x_1 φ_1^L e^d1 p. With
// d1 = ln(f_1/p) − ln φ_1,pure^L(T, p) the liquid's substance takes its
// activity coefficient φ_1^L(x)/φ_1,pure^L from the equation of state and
// its pure-liquid fugacity f_1 from elsewhere (its own vapor pressure and
// molar volume), so that the split keeps the critical point of the
// equation of state while matching the liquid's vapor pressure.
func (m Binary) FlashOffset(T, p, d1 float64) (Split, error) {
	if err := m.Liquid.Validate(); err != nil {
		return Split{}, err
	}
	if err := m.Gas.Validate(); err != nil {
		return Split{}, err
	}
	if !(T > 0) || !(p > 0) || math.IsInf(T, 0) || math.IsInf(p, 0) {
		return Split{}, valid.Errorf("pressure_pa", p, "flash needs positive finite T and p (T = %s K)", valid.FormatValue(T))
	}
	wilson := func(c PengRobinson) float64 {
		return math.Log(c.Pc/p) + 5.373*(1+c.Omega)*(1-c.Tc/T)
	}
	lk1, lk2 := wilson(m.Liquid), wilson(m.Gas)
	split := func(lk1, lk2 float64) (x2, y2 float64, ok bool) {
		k1, k2 := math.Exp(lk1), math.Exp(lk2)
		if !(k1 < 1 && k2 > 1) {
			return 0, 0, false
		}
		x1 := (1 - k2) / (k1 - k2)
		x2 = 1 - x1
		y2 = k2 * x2
		return x2, y2, x2 > 0 && x2 < 1 && y2 > 0 && y2 < 1
	}
	none := func() error {
		return fmt.Errorf("at T = %s K, p = %s Pa: %w", valid.FormatValue(T), valid.FormatValue(p), ErrNoTwoPhase)
	}
	x2, y2, ok := split(lk1, lk2)
	if !ok {
		// Wilson's estimate says one phase; start from a split that is
		// surely two-phase instead (little gas dissolved, little vapor).
		x2, y2 = 1e-3, 0.99
	}
	for it := 0; it < 60; it++ {
		l1, l2, _ := m.LnPhi(T, p, x2, LiquidPhase)
		v1, v2, _ := m.LnPhi(T, p, y2, VaporPhase)
		n1, n2 := l1+d1-v1, l2-v2
		nx, ny, ok := split(n1, n2)
		if !ok {
			break
		}
		d := math.Abs(n1-lk1) + math.Abs(n2-lk2)
		lk1, lk2, x2, y2 = n1, n2, nx, ny
		if d < 1e-10 {
			break
		}
	}
	// Newton on r_i = ln z_i + ln φ_i^L − ln y_i − ln φ_i^V in (x2, y2).
	res := func(x2, y2 float64) (r1, r2 float64) {
		l1, l2, _ := m.LnPhi(T, p, x2, LiquidPhase)
		v1, v2, _ := m.LnPhi(T, p, y2, VaporPhase)
		return math.Log1p(-x2) + l1 + d1 - math.Log1p(-y2) - v1, math.Log(x2) + l2 - math.Log(y2) - v2
	}
	for it := 0; it < 50; it++ {
		r1, r2 := res(x2, y2)
		if math.IsNaN(r1) || math.IsNaN(r2) {
			return Split{}, none()
		}
		if math.Abs(r1)+math.Abs(r2) < 1e-13 {
			break
		}
		hx, hy := 1e-7*math.Min(x2, 1-x2), 1e-7*math.Min(y2, 1-y2)
		a1, a2 := res(x2+hx, y2)
		c1, c2 := res(x2, y2+hy)
		j11, j21 := (a1-r1)/hx, (a2-r2)/hx
		j12, j22 := (c1-r1)/hy, (c2-r2)/hy
		det := j11*j22 - j12*j21
		if det == 0 || math.IsNaN(det) {
			break
		}
		dx := (r1*j22 - r2*j12) / det
		dy := (j11*r2 - j21*r1) / det
		// Damp the step to stay inside (0, 1).
		s := 1.0
		for s > 1e-6 && !(x2-s*dx > 0 && x2-s*dx < 1 && y2-s*dy > 0 && y2-s*dy < 1) {
			s /= 2
		}
		x2, y2 = x2-s*dx, y2-s*dy
	}
	r1, r2 := res(x2, y2)
	if !(math.Abs(r1)+math.Abs(r2) < 1e-9) || !(math.Abs(y2-x2) > criticalGap) || !(y2 > x2) {
		return Split{}, none()
	}
	return Split{X2: x2, Y2: y2}, nil
}

// CriticalTemperature returns the mixture critical temperature at p (Pa)
// for p at or above the liquid's critical pressure: the highest
// temperature at which Flash still splits the binary into two phases
// (to within criticalGap in composition), found by bisection in T between
// lo and the liquid's critical temperature to 0.01 K. For n-alkane–N2
// mixtures (type III phase behaviour) the critical locus starts at the
// alkane's critical point and runs to higher pressures at lower
// temperatures, so above the pure critical pressure a two-phase surface
// exists below this temperature. lo (K) must be a temperature at which
// the binary splits; otherwise the error wraps ErrNoTwoPhase.
func (m Binary) CriticalTemperature(p, lo float64) (float64, error) {
	return m.CriticalTemperatureOffset(p, lo, func(float64) float64 { return 0 })
}

// CriticalTemperatureOffset is CriticalTemperature for FlashOffset with
// the offset d1(T).
func (m Binary) CriticalTemperatureOffset(p, lo float64, d1 func(T float64) float64) (float64, error) {
	if _, err := m.FlashOffset(lo, p, d1(lo)); err != nil {
		return 0, err
	}
	hi := m.Liquid.Tc
	if _, err := m.FlashOffset(hi, p, d1(hi)); err == nil {
		return hi, nil
	}
	for hi-lo > 0.01 {
		mid := 0.5 * (lo + hi)
		if _, err := m.FlashOffset(mid, p, d1(mid)); err == nil {
			lo = mid
		} else {
			hi = mid
		}
	}
	return lo, nil
}

// ResidualEnthalpy returns the molar residual (departure) enthalpy
// h − h_ig in J/mol of the phase of gas mole fraction z2 at T (K) and p
// (Pa), from the Peng–Robinson form (e.g. Poling, Prausnitz & O'Connell,
// The Properties of Gases and Liquids, 5th ed., Table 6-3 — from memory
// for the table):
//
//	h − h_ig = R T (Z − 1) + (T da/dT − a)/(2√2 b) · ln[(Z + (1+√2) B)/(Z + (1−√2) B)]
//
// with da/dT by a central difference of the mixing rule (relative step
// 1e-5).
func (m Binary) ResidualEnthalpy(T, p, z2 float64, phase Phase) float64 {
	a, b, _, _, _, _ := m.mixParams(T, z2)
	h := 1e-5 * T
	ap, _, _, _, _, _ := m.mixParams(T+h, z2)
	am, _, _, _, _, _ := m.mixParams(T-h, z2)
	dadt := (ap - am) / (2 * h)
	rt := phys.GasConstant * T
	A := a * p / (rt * rt)
	B := b * p / rt
	zmin, zmax := cubicRoots(A, B)
	Z := zmax
	if phase == LiquidPhase {
		Z = zmin
	}
	lg := math.Log((Z + (1+math.Sqrt2)*B) / (Z + (1-math.Sqrt2)*B))
	return rt*(Z-1) + (T*dadt-a)/(2*math.Sqrt2*b)*lg
}
