package flash

import (
	"errors"
	"fmt"
	"math"

	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// PengRobinson is the Peng–Robinson cubic equation of state of one pure
// substance (Peng & Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59–64,
// eqs. 4, 9, 10, 12, 17, 18; equation numbers from memory):
//
//	p = R T/(v − b) − a(T)/(v² + 2 b v − b²)
//	a(T) = Ωa R² Tc²/pc · α(T),   α = [1 + κ (1 − sqrt(T/Tc))]²
//	b = Ωb R Tc/pc
//	κ = 0.37464 + 1.54226 ω − 0.26992 ω²
//
// with p in Pa, T in K, molar volume v in m3/mol, R the CODATA 2018 gas
// constant. Ωa ≈ 0.45724 and Ωb ≈ 0.07780 (the paper's rounded values) are
// computed here to full precision from the critical conditions
// ∂p/∂v = ∂²p/∂v² = 0 at (Tc, pc), so that the model's critical point is
// exactly (Tc, pc) and the spinodal meets the saturation curve there.
//
// Validity: κ was fitted to vapor pressures of non-polar substances with
// ω ≤ 0.49 from Tr ≈ 0.7 to 1 (Peng & Robinson 1976, from memory); for
// polar liquids (water, alcohols) the saturation pressure is off by a few
// percent and the liquid volume by 10–20 %. Use it for the shape of the
// metastable region, not for property values.
type PengRobinson struct {
	Tc    float64 // critical temperature, K
	Pc    float64 // critical pressure, Pa
	Omega float64 // acentric factor ω, dimensionless
}

// ErrSupercritical is wrapped when a quantity of the two-phase region is
// asked for at or above the critical temperature or pressure.
var ErrSupercritical = errors.New("flash: at or above the critical point there is no liquid–vapor coexistence or spinodal")

// Exact Peng–Robinson constants: xc = vc/b, Fc = a/(b R Tc) at the critical
// point, Ωa and Ωb. See prConstants.
var prXc, prFc, prOmegaA, prOmegaB = prConstants()

// prConstants solves the critical conditions of the Peng–Robinson form. On
// an isotherm, ∂p/∂v = 0 holds where a/(b R T) = F(x) with x = v/b and
//
//	F(x) = (x² + 2x − 1)² / (2 (x + 1) (x − 1)²)
//
// F falls from +∞ at x → 1 to a minimum at the critical volume xc and rises
// again; at the critical point a/(b R Tc) = F(xc). Then p(Tc, vc) = pc gives
// Ωb = 1/(xc − 1) − F(xc)/(xc² + 2xc − 1) and Ωa = F(xc) Ωb.
func prConstants() (xc, fc, omegaA, omegaB float64) {
	// d ln F/dx = 0.
	dlnF := func(x float64) float64 {
		return 2*(2*x+2)/(x*x+2*x-1) - 1/(x+1) - 2/(x-1)
	}
	xc = bisect(dlnF, 1.5, 10, dlnF(1.5), dlnF(10), 1e-15)
	fc = spinodalF(xc - 1)
	omegaB = 1/(xc-1) - fc/(xc*xc+2*xc-1)
	return xc, fc, fc * omegaB, omegaB
}

// spinodalF is F(x) of prConstants written in y = x − 1 (x² + 2x − 1 =
// y² + 4y + 2), which keeps precision next to the co-volume.
func spinodalF(y float64) float64 {
	q := y*y + 4*y + 2
	return q * q / (2 * (y + 2) * y * y)
}

// Validate checks the constants: finite and positive Tc and pc, and ω
// between −0.5 and 2 (the κ polynomial is meaningless beyond).
func (m PengRobinson) Validate() error {
	if err := valid.Positive("critical_temperature_k", m.Tc); err != nil {
		return err
	}
	if err := valid.Positive("critical_pressure_pa", m.Pc); err != nil {
		return err
	}
	return valid.Between("acentric_factor", m.Omega, -0.5, 2, "")
}

// Warnings lists where the constants leave the range κ was fitted on.
func (m PengRobinson) Warnings() []string {
	if m.Omega > 0.49 {
		return []string{fmt.Sprintf("acentric factor %.3g is above 0.49, beyond the range of the Peng–Robinson (1976) κ(ω) fit", m.Omega)}
	}
	return nil
}

// Kappa returns κ(ω) = 0.37464 + 1.54226 ω − 0.26992 ω² (Peng & Robinson
// 1976, eq. 18 — from memory for the number).
func (m PengRobinson) Kappa() float64 {
	w := m.Omega
	return 0.37464 + 1.54226*w - 0.26992*w*w
}

// params returns a(T) in Pa m6/mol2 and b in m3/mol.
func (m PengRobinson) params(T float64) (a, b float64) {
	r := phys.GasConstant
	s := 1 + m.Kappa()*(1-math.Sqrt(T/m.Tc))
	a = prOmegaA * r * r * m.Tc * m.Tc / m.Pc * s * s
	b = prOmegaB * r * m.Tc / m.Pc
	return a, b
}

// CoVolume returns b = Ωb R Tc/pc in m3/mol.
func (m PengRobinson) CoVolume() float64 {
	_, b := m.params(m.Tc)
	return b
}

// Pressure returns p(T, v) in Pa for T in K and molar volume v in m3/mol
// (v > b; v ≤ b returns NaN, the equation has no meaning there).
func (m PengRobinson) Pressure(T, v float64) float64 {
	a, b := m.params(T)
	if !(v > b) {
		return math.NaN()
	}
	return m.pressureY(T, a, b, v/b-1)
}

// pressureY is p at x = v/b = 1 + y.
func (m PengRobinson) pressureY(T, a, b, y float64) float64 {
	return phys.GasConstant*T/(b*y) - a/(b*b*(y*y+4*y+2))
}

// lnPhi returns ln φ, the fugacity coefficient of the pure substance at
// pressure p on the root x = 1 + y (Peng & Robinson 1976, eq. 15 — from
// memory for the number):
//
//	ln φ = Z − 1 − ln(Z − B) − A/(2√2 B) · ln[(Z + (1+√2) B)/(Z + (1−√2) B)]
//
// with Z = p v/(R T), A = a p/(R T)², B = b p/(R T); in x the last ratio is
// (x + 1 + √2)/(x + 1 − √2) and A/B = a/(b R T).
func lnPhi(p, T, a, b, y float64) float64 {
	rt := phys.GasConstant * T
	bb := b * p / rt
	z := bb * (1 + y)
	return z - 1 - math.Log(bb*y) - a/(b*rt)/(2*math.Sqrt2)*math.Log((y+2+math.Sqrt2)/(y+2-math.Sqrt2))
}

// spinodals returns y = v/b − 1 of the liquid (yl) and vapor (yv) spinodal
// at T, or ErrSupercritical when T is at or above the model's critical
// temperature.
func (m PengRobinson) spinodals(T float64) (a, b, yl, yv float64, err error) {
	a, b = m.params(T)
	target := a / (b * phys.GasConstant * T)
	if !(target > prFc) {
		return a, b, 0, 0, fmt.Errorf("at T = %s K ≥ Tc = %s K: %w", valid.FormatValue(T), valid.FormatValue(m.Tc), ErrSupercritical)
	}
	g := func(y float64) float64 { return spinodalF(y) - target }
	yc := prXc - 1
	// Liquid branch: F falls on (0, yc), so g goes from + to −.
	lo := yc * 1e-12
	yl = bisect(g, lo, yc, g(lo), g(yc), 1e-15*yc)
	// Vapor branch: F rises on (yc, ∞) and F(y + 1) > (y + 1)/2.
	hi := 2*target + 2
	yv = bisect(g, yc, hi, g(yc), g(hi), 1e-14*hi)
	return a, b, yl, yv, nil
}

// LiquidSpinodal returns the pressure p_sp (Pa) and molar volume v_sp
// (m3/mol) of the liquid spinodal at T (K): the end of the metastable
// liquid branch, where (∂p/∂v)_T = 0 at the smallest volume. p_sp is
// negative (the liquid under tension) well below Tc and rises to pc at Tc.
// T must lie in (0, Tc); at or above Tc the error wraps ErrSupercritical.
func (m PengRobinson) LiquidSpinodal(T float64) (p, v float64, err error) {
	if err := m.Validate(); err != nil {
		return 0, 0, err
	}
	if err := valid.Positive("temperature_k", T); err != nil {
		return 0, 0, err
	}
	a, b, yl, _, err := m.spinodals(T)
	if err != nil {
		return 0, 0, err
	}
	return m.pressureY(T, a, b, yl), b * (1 + yl), nil
}

// SpinodalTemperature returns the temperature in K at which the liquid
// spinodal pressure equals p (Pa): the thermodynamic limit of superheat at
// that pressure. p must be below pc (else ErrSupercritical). Found by
// bisection on T between 0.2 Tc and Tc to 1e-9 K; the spinodal pressure
// rises monotonically with T on that interval.
func (m PengRobinson) SpinodalTemperature(p float64) (float64, error) {
	if err := m.Validate(); err != nil {
		return 0, err
	}
	if err := valid.Finite("pressure_pa", p); err != nil {
		return 0, err
	}
	if p >= m.Pc {
		return 0, fmt.Errorf("p = %s Pa ≥ pc = %s Pa: %w", valid.FormatValue(p), valid.FormatValue(m.Pc), ErrSupercritical)
	}
	h := func(T float64) float64 {
		ps, _, err := m.LiquidSpinodal(T)
		if err != nil {
			return m.Pc - p // at the critical point itself
		}
		return ps - p
	}
	lo, hi := 0.2*m.Tc, m.Tc*(1-1e-12)
	hlo, hhi := h(lo), h(hi)
	if hlo > 0 {
		return 0, valid.Errorf("pressure_pa", p, "is below the liquid spinodal pressure even at 0.2 Tc")
	}
	if hhi < 0 {
		// p lies within rounding of pc.
		return m.Tc, nil
	}
	return bisect(h, lo, hi, hlo, hhi, 1e-9), nil
}

// SaturationPressure returns the vapor pressure in Pa at T (K) where the
// liquid and vapor roots have equal fugacity, ln φ_L = ln φ_V (the
// equal-area condition of the cubic). The pressure is bracketed between the
// spinodal pressures (or a small positive pressure when the liquid spinodal
// is in tension), where both roots exist, and found by bisection on ln p to
// 1e-13; ln φ_L − ln φ_V falls monotonically with p there, since its
// derivative is (v_L − v_V)/(R T) < 0. T in (0, Tc); at or above Tc the
// error wraps ErrSupercritical.
func (m PengRobinson) SaturationPressure(T float64) (float64, error) {
	if err := m.Validate(); err != nil {
		return 0, err
	}
	if err := valid.Positive("temperature_k", T); err != nil {
		return 0, err
	}
	a, b, yl, yv, err := m.spinodals(T)
	if err != nil {
		return 0, err
	}
	pl, pv := m.pressureY(T, a, b, yl), m.pressureY(T, a, b, yv)
	g := func(lnp float64) float64 {
		p := math.Exp(lnp)
		ly := m.liquidRoot(T, a, b, p, yl)
		vy := m.vaporRoot(T, a, b, p, yv)
		return lnPhi(p, T, a, b, ly) - lnPhi(p, T, a, b, vy)
	}
	hi := math.Log(pv) - 1e-12
	lo := hi - 1
	if pl > 0 {
		lo = math.Max(math.Log(pl)+1e-12, lo)
	}
	glo := g(lo)
	for i := 0; glo < 0 && i < 700; i++ {
		lo -= 1
		if pl > 0 && lo <= math.Log(pl) {
			lo = math.Log(pl) + 1e-12
			glo = g(lo)
			break
		}
		glo = g(lo)
	}
	ghi := g(hi)
	if glo < 0 || ghi > 0 || math.IsNaN(glo) || math.IsNaN(ghi) {
		return 0, valid.Errorf("temperature_k", T, "no Peng–Robinson saturation pressure found (reduced temperature %.3g)", T/m.Tc)
	}
	return math.Exp(bisect(g, lo, hi, glo, ghi, 1e-13)), nil
}

// liquidRoot returns y = v/b − 1 of the liquid root at p (p above the
// liquid spinodal pressure, which sits at ysp): p(y) falls from +∞ to the
// spinodal pressure on (0, ysp). Bisection on ln y.
func (m PengRobinson) liquidRoot(T, a, b, p, ysp float64) float64 {
	f := func(u float64) float64 { return m.pressureY(T, a, b, math.Exp(u)) - p }
	lo, hi := math.Log(ysp)-40, math.Log(ysp)
	return math.Exp(bisect(f, lo, hi, f(lo), f(hi), 1e-14))
}

// vaporRoot returns y of the vapor root at 0 < p < the vapor spinodal
// pressure (at ysp): p(y) falls from there towards 0, and p(y) < R T/(b y),
// so the root lies below y = R T/(b p).
func (m PengRobinson) vaporRoot(T, a, b, p, ysp float64) float64 {
	f := func(u float64) float64 { return m.pressureY(T, a, b, math.Exp(u)) - p }
	lo, hi := math.Log(ysp), math.Log(phys.GasConstant*T/(b*p))
	if hi <= lo {
		return ysp
	}
	return math.Exp(bisect(f, lo, hi, f(lo), f(hi), 1e-14))
}

// VaporCompressibility returns Z = p v/(R T) of the vapor root at T (K)
// and p (Pa), for 0 < p below the vapor spinodal pressure and T < Tc;
// otherwise an error (wrapping ErrSupercritical at or above Tc).
func (m PengRobinson) VaporCompressibility(T, p float64) (float64, error) {
	if err := m.Validate(); err != nil {
		return 0, err
	}
	if err := valid.Positive("temperature_k", T); err != nil {
		return 0, err
	}
	if err := valid.Positive("pressure_pa", p); err != nil {
		return 0, err
	}
	a, b, _, yv, err := m.spinodals(T)
	if err != nil {
		return 0, err
	}
	if pv := m.pressureY(T, a, b, yv); p >= pv {
		return 0, valid.Errorf("pressure_pa", p, "is above the vapor spinodal pressure %s Pa at %s K: no vapor root", valid.FormatValue(pv), valid.FormatValue(T))
	}
	y := m.vaporRoot(T, a, b, p, yv)
	return p * b * (1 + y) / (phys.GasConstant * T), nil
}
