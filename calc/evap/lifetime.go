package evap

import (
	"errors"
	"fmt"
	"math"

	"fogbench/calc/valid"
)

// LifetimeOptions choose how Lifetime treats the surface temperature.
type LifetimeOptions struct {
	// SurfaceTemperature fixes T_s in K for every diameter; zero means the
	// steady (wet-bulb) temperature of each diameter.
	SurfaceTemperature float64
	// RelTol is the relative tolerance of the quadrature; zero means 1e-9.
	RelTol float64
}

// LifetimeResult is the outcome of LifetimeReport.
type LifetimeResult struct {
	// Time is the time to evaporate completely, s. It is +Inf when the drop
	// does not evaporate (Evaporates false): ṁ ≤ 0 at some size.
	Time       float64
	Evaporates bool
	// EquilibriumRadius is the Kelvin equilibrium radius r* in m, where the
	// far-field saturation ratio equals the Kelvin ratio; drops with r < r*
	// evaporate, larger ones grow. Valid when HasEquilibrium.
	EquilibriumRadius float64
	HasEquilibrium    bool
	Warnings          []string
}

// lifetimeSpan is the ratio of the smallest diameter integrated numerically
// to d0; the rest is the small-drop tail, see LifetimeReport.
const lifetimeSpan = 1e-6

// Lifetime returns the time in s for a drop of initial diameter d0 (m) to
// evaporate completely; see LifetimeReport. It is +Inf, with a nil error,
// when the drop never evaporates; LifetimeReport says why.
func (c *Conditions) Lifetime(d0 float64, opts LifetimeOptions) (float64, error) {
	r, err := c.LifetimeReport(d0, opts)
	return r.Time, err
}

// LifetimeReport integrates the quasi-steady mass balance dm/dt = −ṁ(d)
// exactly:
//
//	t_life = ∫_0^d0 (ρ_L π d²/2) / ṁ(d) dd = ∫ (ρ_L π d³/2)/ṁ(d) d(ln d)
//
// with ρ_L and ṁ at the surface temperature of each diameter (fixed, or the
// steady temperature), by adaptive Gauss–Kronrod 7/15 quadrature in ln d
// from d0·1e-6 to d0. Below that the tail ρ_L π d_min³/(4 ṁ(d_min)) assumes
// ṁ ∝ d (a relative contribution near 1e-12). With constant properties and
// neither curvature nor transition this is the d² law, d² = d0² − K t with
// K = 8 ρ_g D ln(1 + B_M)/ρ_L (Godsave 1953; Spalding 1953).
//
// Thermal expansion along the path is neglected (ρ_L is taken at the local
// T_s in dm/dd). If ṁ ≤ 0 at d0 or anywhere on the way the result is
// Time = +Inf with Evaporates false, never NaN or a negative time.
func (c *Conditions) LifetimeReport(d0 float64, opts LifetimeOptions) (LifetimeResult, error) {
	var res LifetimeResult
	if err := c.Validate(); err != nil {
		return res, err
	}
	if err := valid.Positive("drop.diameter_m", d0); err != nil {
		return res, err
	}
	tb, _, err := c.upperTemperature()
	if err != nil {
		return res, err
	}
	if opts.SurfaceTemperature != 0 {
		if err := valid.Between("lifetime.surface_temperature_k", opts.SurfaceTemperature, 1, tb, "K (the boiling point)"); err != nil {
			return res, err
		}
	}
	relTol := opts.RelTol
	if relTol == 0 {
		relTol = 1e-9
	}
	if err := valid.Between("lifetime.rel_tol", relTol, 1e-14, 0.1, ""); err != nil {
		return res, err
	}
	teq := opts.SurfaceTemperature
	if teq == 0 {
		teq = math.Min(c.GasTemperature, tb)
	}
	res.EquilibriumRadius, res.HasEquilibrium = c.equilibriumRadius(teq)

	rate := newRateFunc(c, opts.SurfaceTemperature, tb)
	m0, rho0, err := rate.at(d0)
	if err != nil {
		return res, err
	}
	if !(m0 > 0) {
		res.Time, res.Warnings = math.Inf(1), warningText(rate.flags)
		return res, nil
	}
	_ = rho0
	growth := false
	integrand := func(u float64) float64 {
		d := math.Exp(u)
		m, rho, err := rate.at(d)
		if err != nil {
			return math.NaN()
		}
		if !(m > 0) {
			growth = true
			return 0
		}
		return rho * math.Pi * d * d * d / (2 * m)
	}
	dmin := d0 * lifetimeSpan
	t, qErrEst, qerr := integrate(integrand, math.Log(dmin), math.Log(d0), relTol, 0)
	if rate.err != nil {
		return res, rate.err
	}
	res.Warnings = warningText(rate.flags)
	if growth {
		res.Time = math.Inf(1)
		return res, nil
	}
	if errors.Is(qerr, errQuadrature) && qErrEst <= 1e-6*math.Abs(t) {
		// Rounding in tiny near-equilibrium rates can stall the error
		// estimate above a very tight tolerance; 1e-6 is still reported.
		res.Warnings = append(res.Warnings, fmt.Sprintf("lifetime quadrature reached a relative accuracy of %.1g, not the %.1g asked for", qErrEst/t, relTol))
		qerr = nil
	}
	if qerr != nil {
		return res, qerr
	}
	mmin, rhomin, err := rate.at(dmin)
	if err != nil {
		return res, err
	}
	if mmin > 0 {
		t += rhomin * math.Pi * dmin * dmin * dmin / (4 * mmin)
	}
	res.Time, res.Evaporates = t, true
	return res, nil
}

// EquilibriumRadius returns the Kelvin equilibrium radius r* (m) of the
// conditions at surface temperature Ts (K): the radius at which the
// curved-surface vapor pressure equals the far-field vapor partial pressure,
//
//	S_∞ = X_∞ p / p_sat(T_s) = exp( 2σV_m/(r* R T_s) ),  r* = (2σV_m/(R T_s)) / ln S_∞
//
// It exists only for a supersaturated far field (S_∞ > 1) with Curvature on;
// ok is false otherwise (every size evaporates when S_∞ ≤ 1, none when S_∞ > 1
// and the surface is flat). At equilibrium ṁ = 0, so with the steady
// temperature Ts = T_∞. S_∞ is taken against the flat-surface equilibrium
// at the gas pressure (Conditions.Equilibrium; p_sat without it), the
// same vapor pressure the rates use. Source: the Kelvin equation (see
// KelvinRatio).
func (c *Conditions) EquilibriumRadius(Ts float64) (r float64, ok bool, err error) {
	if err := c.Validate(); err != nil {
		return 0, false, err
	}
	if err := valid.Positive("drop.surface_temperature_k", Ts); err != nil {
		return 0, false, err
	}
	r, ok = c.equilibriumRadius(Ts)
	return r, ok, nil
}

func (c *Conditions) equilibriumRadius(ts float64) (float64, bool) {
	l := c.Liquid
	ps := c.flatPressure(ts)
	sAmb := c.VaporMoleFraction * c.Pressure / ps
	if !c.Curvature || !(sAmb > 1) || math.IsInf(sAmb, 0) {
		return 0, false
	}
	lk := KelvinLength(l.SurfaceTension(ts), l.MolarMass()/l.Density(ts), ts)
	r := lk / math.Log(sAmb)
	if math.IsNaN(r) || math.IsInf(r, 0) {
		return 0, false
	}
	return r, true
}

// rateFunc evaluates ṁ(d) and ρ_L(d) at a fixed or steady surface
// temperature, warm-starting each steady solve at the previous root.
type rateFunc struct {
	c         *Conditions
	fixedTs   float64
	tb, guess float64
	flags     uint
	err       error
	liq       liquidAt // liquid properties at the last surface temperature
	lastT     float64  // surface temperature of the last call
	// exact makes atNear solve every steady temperature by bracketing and
	// Brent's method, as at does (for tests of the secant path).
	exact bool
}

func newRateFunc(c *Conditions, fixedTs, tb float64) *rateFunc {
	return &rateFunc{c: c, fixedTs: fixedTs, tb: tb}
}

// minSteadyDiameter is the smallest diameter for which rateFunc solves the
// steady temperature; smaller drops (where the Kelvin equation has lost its
// meaning) take the temperature of a drop this size, or of the smallest
// larger size whose heat balance has a root.
const minSteadyDiameter = 2e-9

func (r *rateFunc) temperature(d float64) (float64, error) {
	if r.fixedTs > 0 {
		return r.fixedTs, nil
	}
	dEff := math.Max(d, minSteadyDiameter)
	t, err := r.c.steadyTemperature(dEff, r.tb, r.guess)
	for i := 0; err != nil && !errors.Is(err, ErrBoiling) && !errors.Is(err, ErrTranscritical) && i < 20 && dEff < 1e-6; i++ {
		dEff *= 2
		t, err = r.c.steadyTemperature(dEff, r.tb, r.guess)
	}
	if err != nil && t == r.tb && t > 0 {
		// Clamped at the boiling point or the surface's critical limit:
		// keep going just below it.
		if errors.Is(err, ErrTranscritical) {
			r.flags |= warnTranscritical
		} else {
			r.flags |= warnSurfaceCapped
		}
		t, err = math.Nextafter(r.tb, 0), nil
	}
	if err == nil {
		r.guess = t
	}
	return t, err
}

func (r *rateFunc) at(d float64) (mdot, rhoL float64, err error) {
	t, err := r.temperature(d)
	if err != nil {
		r.err = err
		return 0, 0, err
	}
	r.lastT = t
	e, err := r.c.evaluateAt(d, t, r.c.Curvature, &r.liq)
	if err != nil {
		r.err = err
		return 0, 0, err
	}
	r.flags |= e.flags &^ warnKelvinSmall
	return e.mdot, e.rhoL, nil
}

// atNear is at with a guess of the steady temperature (K; ignored with a
// fixed surface temperature, and zero for none): from a close guess the
// secant steps of steadyNear need about three heat-balance evaluations
// where bracketing and Brent's method need about ten. Where they do not
// converge, or below minSteadyDiameter, it is at.
func (r *rateFunc) atNear(d, guess float64) (mdot, rhoL float64, err error) {
	if r.fixedTs > 0 || r.exact || !(guess > 0) || d < minSteadyDiameter {
		return r.at(d)
	}
	t, e, ok := r.c.steadyNear(d, r.tb, guess, &r.liq)
	if !ok {
		r.guess = guess
		return r.at(d)
	}
	r.guess, r.lastT = t, t
	r.flags |= e.flags &^ warnKelvinSmall
	return e.mdot, e.rhoL, nil
}
