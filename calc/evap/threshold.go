package evap

import (
	"math"

	"fogbench/calc/valid"
)

// EnhancementThreshold returns the diameter d in m below which the Kelvin
// enhancement of the evaporation rate, E(d) = ṁ_curved/ṁ_flat at the same d
// and T_s, exceeds 1 + level (level = 0.01 for 1 %, 0.1 for 10 %). Ts is the
// surface temperature in K, or zero for the steady temperature of each
// diameter (with curvature). The curvature is applied whatever
// c.Curvature says. E falls monotonically with d (dilute limit:
// E ≈ (S − H)/(1 − H) with H the far-field saturation ratio), so the root
// is found by Brent's method in ln d over 0.1 nm–1 m (2 nm–1 m with the
// steady temperature), to 1e-10 in ln d.
// Errors: invalid input, a flat surface that does not evaporate (E
// undefined), or a level not reached in that range.
func (c *Conditions) EnhancementThreshold(level, Ts float64) (float64, error) {
	if err := c.Validate(); err != nil {
		return 0, err
	}
	if err := valid.Between("enhancement.level", level, 1e-9, 100, ""); err != nil {
		return 0, err
	}
	tb, _, err := c.upperTemperature()
	if err != nil {
		return 0, err
	}
	if Ts != 0 {
		if err := valid.Between("enhancement.surface_temperature_k", Ts, 1, math.Nextafter(tb, 0), "K (below the boiling point)"); err != nil {
			return 0, err
		}
	}
	cc := *c
	cc.Curvature = true
	guess := 0.0
	var solveErr error
	// The liquid's properties depend on T alone: with a fixed T every
	// evaluation of the search shares them, with the steady T the flat
	// evaluation shares the curved one's.
	var liq liquidAt
	excess := func(lnD float64) float64 {
		d := math.Exp(lnD)
		t := Ts
		if t == 0 {
			var err error
			if t, err = cc.steadyTemperature(d, tb, guess); err != nil {
				solveErr = err
				return math.NaN()
			}
			guess = t
		}
		curved, err := cc.evaluateAt(d, t, true, &liq)
		if err != nil {
			solveErr = err
			return math.NaN()
		}
		flat, err := cc.evaluateAt(d, t, false, &liq)
		if err != nil {
			solveErr = err
			return math.NaN()
		}
		if !(flat.mdot > 0) {
			solveErr = valid.Errorf("gas.vapor_mole_fraction", c.VaporMoleFraction,
				"leaves a flat surface at %s K not evaporating, so the curvature enhancement is undefined", valid.FormatValue(t))
			return math.NaN()
		}
		return curved.mdot/flat.mdot - 1 - level
	}
	lo, hi := math.Log(1e-10), 0.0
	if Ts == 0 {
		lo = math.Log(minSteadyDiameter)
	}
	flo := excess(lo)
	fhi := excess(hi)
	if solveErr != nil {
		return 0, solveErr
	}
	if flo < 0 || fhi > 0 {
		return 0, valid.Errorf("enhancement.level", level, "is not reached between %s m and 1 m", valid.FormatValue(math.Exp(lo)))
	}
	x, err := brent(excess, lo, hi, flo, fhi, 1e-10)
	if solveErr != nil {
		return 0, solveErr
	}
	if err != nil {
		return 0, err
	}
	return math.Exp(x), nil
}
