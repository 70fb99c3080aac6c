package evap

import (
	"errors"
	"math"

	"fogbench/calc/valid"
)

// ErrBoiling is wrapped by SteadyTemperature when the heat balance has no
// root below the boiling point: the temperature returned is then the boiling
// point and is still usable as the clamped surface temperature.
var ErrBoiling = errors.New("evap: the drop surface reaches the boiling point at the gas pressure; temperature clamped there")

// boilingTemperature returns the flat-surface boiling temperature at the gas
// pressure, p_sat(T_b) = p, in K. When the liquid's saturation pressure
// stops being finite before it reaches p (for example above a critical
// point the property model refuses), ok is false and tb is the highest
// temperature at which it was finite.
func (c *Conditions) boilingTemperature() (tb float64, ok bool, err error) {
	l, p := c.Liquid, c.Pressure
	g := func(t float64) float64 {
		ps := l.SaturationPressure(t)
		if !(ps > 0) || math.IsInf(ps, 0) {
			return math.NaN()
		}
		return math.Log(ps / p)
	}
	t0 := c.GasTemperature
	g0 := g(t0)
	const step, maxSteps = 10.0, 400
	if math.IsNaN(g0) {
		// Start lower: the far field may be hotter than the liquid model allows.
		for i := 0; i < maxSteps && math.IsNaN(g0) && t0 > step; i++ {
			t0 -= step
			g0 = g(t0)
		}
		if math.IsNaN(g0) {
			return 0, false, valid.Errorf("liquid.saturation_pressure_pa", l.SaturationPressure(c.GasTemperature), "is not usable at any temperature tried")
		}
	}
	if g0 >= 0 {
		// The far field is at or above the boiling point: step down to a
		// temperature below it, passing over any range the model refuses.
		found := false
		for i := 0; i < maxSteps && t0 > step; i++ {
			t0 -= step
			if g0 = g(t0); g0 < 0 {
				found = true
				break
			}
		}
		if !found {
			return 0, false, valid.Errorf("gas.pressure_pa", p, "no boiling point of the liquid found at this pressure")
		}
	}
	// Step up from below the boiling point.
	lo, glo := t0, g0
	for i := 0; i < maxSteps; i++ {
		t := lo + step
		gt := g(t)
		if math.IsNaN(gt) {
			// Refine the edge of the model's range by bisection.
			hi := t
			for j := 0; j < 60; j++ {
				m := 0.5 * (lo + hi)
				if gm := g(m); math.IsNaN(gm) {
					hi = m
				} else if gm >= 0 {
					return brentBoil(g, lo, m, glo, gm)
				} else {
					lo, glo = m, gm
				}
			}
			return lo, false, nil
		}
		if gt >= 0 {
			return brentBoil(g, lo, t, glo, gt)
		}
		lo, glo = t, gt
	}
	return lo, false, nil
}

func brentBoil(g func(float64) float64, a, b, ga, gb float64) (float64, bool, error) {
	t, err := brent(g, a, b, ga, gb, 1e-10)
	return t, err == nil, err
}

// SteadyTemperature returns the steady (wet-bulb) surface temperature in K
// of a drop of diameter d (m): the T_s at which the heat conducted from the
// gas just supplies the latent heat, Q = ṁ L, so no heat enters the liquid.
// With the Stefan-flow forms of Abramzon & Sirignano (1989) this is
//
//	(1 + B_M)^φ − 1 = c_p,v (T_∞ − T_s)/L(T_s),   φ = (c_p,v/c_p,g)(Sh/Nu)/Le
//
// with B_M from the curvature-corrected vapor pressure when Curvature is on.
// With Le = 1, Sh = Nu and c_p,v = c_p,g it reduces to the classical
// B_M = B_T = c_p,g (T_∞ − T_s)/L (Spalding 1953).
//
// The root is bracketed (stepping out from T_∞) and refined by Brent's
// method to 1e-12 relative. The bracket is capped at the flat-surface boiling
// point T_b (p_sat(T_b) = p); if the balance has no root below T_b the
// result is T_b and an error wrapping ErrBoiling. In supersaturated
// surroundings the drop condenses and the steady temperature lies above T_∞.
func (c *Conditions) SteadyTemperature(d float64) (float64, error) {
	if err := c.Validate(); err != nil {
		return 0, err
	}
	if err := valid.Positive("drop.diameter_m", d); err != nil {
		return 0, err
	}
	tb, _, err := c.upperTemperature()
	if err != nil {
		return 0, err
	}
	return c.steadyTemperature(d, tb, 0)
}

// SteadyState returns the DropState at the steady temperature of a drop of
// diameter d (m); see SteadyTemperature and Drop. A clamp at the boiling
// point is reported as a warning in the state rather than as an error.
func (c *Conditions) SteadyState(d float64) (DropState, error) {
	ts, err := c.SteadyTemperature(d)
	var warn string
	critical := errors.Is(err, ErrTranscritical)
	if errors.Is(err, ErrBoiling) || critical {
		if !critical {
			warn = err.Error()
		}
		ts = math.Nextafter(ts, 0)
	} else if err != nil {
		return DropState{}, err
	}
	s, err := c.Drop(d, ts)
	if warn != "" {
		s.Warnings = append(s.Warnings, warn)
	}
	s.Transcritical = critical
	return s, err
}

// steadyTemperature solves the heat balance for diameter d with the upper
// bracket tHi (the boiling point); guess > 0 starts a narrow bracket there,
// which makes sweeps over nearby diameters cheap.
func (c *Conditions) steadyTemperature(d, tHi, guess float64) (float64, error) {
	var evalErr error
	h := func(t float64) float64 {
		e, err := c.evaluate(d, t, c.Curvature)
		if err != nil {
			evalErr = err
			return math.NaN()
		}
		return e.heatToLiquid
	}
	t0, step := guess, 0.25
	if !(t0 > 0) || t0 > tHi {
		t0, step = math.Min(c.GasTemperature, tHi), 2
	}
	f0 := h(t0)
	if evalErr != nil {
		return 0, evalErr
	}
	if f0 == 0 {
		return t0, nil
	}
	var lo, hi, flo, fhi float64
	if f0 > 0 {
		lo, flo = t0, f0
		for {
			t := math.Min(lo+step, tHi)
			ft := h(t)
			if evalErr != nil {
				return 0, evalErr
			}
			if ft <= 0 {
				hi, fhi = t, ft
				break
			}
			if t == tHi {
				return tHi, c.limitError(d, tHi)
			}
			lo, flo = t, ft
			step *= 2
		}
	} else {
		hi, fhi = t0, f0
		floor := 0.2 * t0
		for {
			t := hi - step
			if t < floor {
				return 0, valid.Errorf("drop.diameter_m", d,
					"has no steady temperature between %s and %s K (below a few nm the curvature raise exceeds what any heat balance can carry)", valid.FormatValue(floor), valid.FormatValue(t0))
			}
			ft := h(t)
			if evalErr != nil {
				return 0, evalErr
			}
			if ft >= 0 {
				lo, flo = t, ft
				break
			}
			hi, fhi = t, ft
			step *= 2
		}
	}
	t, err := brent(h, lo, hi, flo, fhi, 1e-12*hi)
	if evalErr != nil {
		return 0, evalErr
	}
	if err == nil && tHi-t < 1e-6 {
		// The balance closes only at the boiling point itself.
		return tHi, c.limitError(d, tHi)
	}
	return t, err
}

// steadyResidualTol bounds the heat-balance residual steadyNear accepts,
// relative to ṁL. Since Q falls and ṁL rises with T_s, a residual r at a
// temperature δT off the root is r ≈ (dQ/dT − L dṁ/dT) δT with both terms
// of one sign, so |δT| ≤ |r|/(L dṁ/dT) and the rate's relative error
// |dṁ/dT δT|/ṁ ≤ |r|/(ṁL) to first order (the small dL/dT term changes
// the bound by about 2 % for water). 1e-11 matches what Brent's method
// to 1e-12 T relative leaves in ṁ (dln ṁ/dT ≈ 0.06 /K for water).
const steadyResidualTol = 1e-11

// steadyNear solves the heat balance of a drop of diameter d from a guess
// close to its steady temperature by secant steps, and returns the state
// at the accepted temperature. It accepts a temperature only when the drop
// evaporates there and |Q − ṁL| ≤ steadyResidualTol·ṁL (see that
// constant for the resulting bound on ṁ); ok is false when it does not get
// there in a few steps, or leaves (0.2·guess, tHi − 1e-6), and the caller
// then runs steadyTemperature, whose bracketing also reports boiling.
func (c *Conditions) steadyNear(d, tHi, guess float64, liq *liquidAt) (float64, dropEval, bool) {
	lo, hi := 0.2*guess, tHi-1e-6
	accept := func(e dropEval) bool {
		return e.mdot > 0 && math.Abs(e.heatToLiquid) <= steadyResidualTol*e.mdot*e.lat
	}
	if !(guess > lo && guess < hi) {
		return 0, dropEval{}, false
	}
	t0 := guess
	e0, err := c.evaluateAt(d, t0, c.Curvature, liq)
	if err != nil {
		return 0, dropEval{}, false
	}
	if accept(e0) {
		return t0, e0, true
	}
	t1 := t0 + 1e-4
	if t1 >= hi {
		t1 = t0 - 1e-4
	}
	f0 := e0.heatToLiquid
	for range 6 {
		e1, err := c.evaluateAt(d, t1, c.Curvature, liq)
		if err != nil {
			return 0, dropEval{}, false
		}
		if accept(e1) {
			return t1, e1, true
		}
		f1 := e1.heatToLiquid
		if f1 == f0 {
			return 0, dropEval{}, false
		}
		t2 := t1 - f1*(t1-t0)/(f1-f0)
		if !(t2 > lo && t2 < hi) {
			return 0, dropEval{}, false
		}
		t0, f0, t1 = t1, f1, t2
	}
	return 0, dropEval{}, false
}
