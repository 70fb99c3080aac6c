package evap

import (
	"errors"
	"fmt"
	"math"

	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// ErrTranscritical is wrapped when a drop's surface reaches the mixture
// critical point of liquid and gas (or the equation of state's limit of a
// two-phase surface): past it there is no interface, the drop mixes with
// the gas as a dense fluid, and the quasi-steady evaporation model does
// not apply.
var ErrTranscritical = errors.New("evap: the drop surface reaches the mixture critical point")

// SurfaceEquilibrium gives the vapor's equilibrium over a FLAT surface of
// the liquid at the gas pressure, with the gas dissolved in the liquid and
// both phases' non-ideality (see FlatEquilibrium for the form). evap
// multiplies its partial pressure by the Kelvin ratio of each drop. Nil
// in Conditions means the ideal limit: the flat vapor pressure is p_sat.
type SurfaceEquilibrium interface {
	// FlatVaporPressure returns the equilibrium partial pressure y_v p of
	// the vapor over a flat surface at surface temperature T (K), in Pa;
	// the error wraps ErrTranscritical past CriticalTemperature.
	FlatVaporPressure(T float64) (float64, error)
	// LatentHeatFactor returns, after FlatVaporPressure at the same T,
	// the latent heat of the liquid's substance at the surface state
	// (liquid and vapor at the gas pressure, with the gas mixed in) over
	// the liquid's own L(T) at saturation: evap multiplies L(T) by it. It
	// falls to 0 at the mixture critical point.
	LatentHeatFactor(T float64) float64
	// CriticalTemperature returns the surface temperature in K at which
	// the surface reaches the mixture critical point at the gas pressure,
	// and ok = false when no such limit lies below the liquid's boiling
	// point (the gas pressure is below the liquid's critical pressure).
	CriticalTemperature() (t float64, ok bool)
}

// PoyntingFactor returns exp(v_L (p_l − p_sat)/(R T)), the Poynting
// integral exp(∫ v_L dp/(R T)) of an incompressible liquid of molar volume
// vL (m3/mol) raised from its vapor pressure psat to the pressure pl (Pa)
// at T (K) (e.g. Prausnitz, Lichtenthaler & de Azevedo, Molecular
// Thermodynamics of Fluid-Phase Equilibria, 3rd ed., eq. 3-17 — from
// memory for the number). With pl = p + 2σ/r it splits exactly into the
// flat part at the gas pressure p and the Kelvin ratio exp(2σ v_L/(r R T)):
//
//	exp(v_L (p + 2σ/r − p_sat)/(R T)) = exp(v_L (p − p_sat)/(R T)) · exp(2σ v_L/(r R T)).
//
// Validity: incompressible liquid, good to 0.3 % for water at 40 MPa
// against the IAPWS-95 Gibbs energies (TestPoyntingWaterIAPWS95).
func PoyntingFactor(vL, psat, pl, T float64) float64 {
	return math.Exp(vL * (pl - psat) / (phys.GasConstant * T))
}

// FlatEquilibrium is the equilibrium of the vapor over a flat surface at
// the gas pressure, in the parts fogbench reports. The vapor mole fraction
// y_v at the surface solves equal fugacities of the liquid's substance,
//
//	y_v φ_v p = x_L p_sat φ_sat · exp(∫ v_L dp/(R T) from p_sat to p)
//
// and each drop multiplies y_v p by its Kelvin ratio, the rest of the
// Poynting integral from p to p + 2σ/r.
type FlatEquilibrium struct {
	VaporPressure      float64 // y_v p, Pa
	PoyntingFactor     float64 // exp(v_L (p − p_sat)/(R T))
	FugacityFactor     float64 // φ_sat/φ_v
	Enhancement        float64 // y_v p / p_sat
	DissolvedGas       float64 // 1 − x_L, mole fraction of gas in the liquid
	LatentHeatFactor   float64 // latent heat at the surface state over that of the pure liquid at saturation
	VaporMoleFraction  float64 // y_v
	CriticalLimit      float64 // K; 0 when none applies
	CriticalLimitFound bool
}

// criticalLimit returns the surface's critical temperature at the gas
// pressure (see SurfaceEquilibrium.CriticalTemperature).
func (c *Conditions) criticalLimit() (float64, bool) {
	if c.Equilibrium == nil {
		return 0, false
	}
	return c.Equilibrium.CriticalTemperature()
}

// checkCritical refuses a surface temperature at or past the surface's
// critical limit with an error wrapping ErrTranscritical.
func (c *Conditions) checkCritical(ts float64) error {
	if tc, ok := c.criticalLimit(); ok && ts > tc {
		return fmt.Errorf("evap: surface at %s K, critical limit %s K: %w", valid.FormatValue(ts), valid.FormatValue(tc), ErrTranscritical)
	}
	return nil
}

// upperTemperature returns the highest surface temperature the model
// follows: the boiling point at the gas pressure, or the surface's
// critical limit where that lies lower (always, above the liquid's
// critical pressure, where the pure liquid has no boiling point). critical
// tells which.
func (c *Conditions) upperTemperature() (t float64, critical bool, err error) {
	tb, ok, err := c.boilingTemperature()
	tc, has := c.criticalLimit()
	if has && (err != nil || !ok || tc <= tb) {
		return tc, true, nil
	}
	return tb, false, err
}

// limitError is the error of a heat balance that has no root below the
// upper temperature tHi: ErrTranscritical when tHi is the surface's
// critical limit, else ErrBoiling.
func (c *Conditions) limitError(d, tHi float64) error {
	if tc, ok := c.criticalLimit(); ok && tHi == tc {
		return fmt.Errorf("evap: steady temperature of a %s m drop: %w", valid.FormatValue(d), ErrTranscritical)
	}
	return fmt.Errorf("evap: steady temperature of a %s m drop: %w", valid.FormatValue(d), ErrBoiling)
}

// holdAtCritical returns the surface temperature a transient drop is
// evaluated at: T itself, or the surface's critical limit when T has
// reached it (held = true). Past that point there is no interface and the
// model does not follow the drop; holding the surface there keeps the
// integration going so that the other classes and the spray's history
// are still computed, and the class is reported as transcritical from the
// time it got there (Spray.CriticalTimes).
func (c *Conditions) holdAtCritical(T float64) (float64, bool) {
	if tc, ok := c.criticalLimit(); ok && T >= tc {
		return tc, true
	}
	return T, false
}

// criticalTimes returns, per bin, the first time (s) on its transient
// heating path at which the surface temperature reaches the critical
// limit (linear between the path's points), or −1 when it does not.
func (sp *sprayPaths) criticalTimes() []float64 {
	out := make([]float64, len(sp.d0))
	tc, ok := sp.c.criticalLimit()
	for i := range out {
		out[i] = -1
		if !ok || sp.tr == nil || sp.tr[i] == nil {
			continue
		}
		p := sp.tr[i]
		for j := range p.T {
			if p.T[j] >= tc {
				out[i] = p.t[j]
				if j > 0 && p.T[j] > p.T[j-1] {
					out[i] = p.t[j-1] + (p.t[j]-p.t[j-1])*(tc-p.T[j-1])/(p.T[j]-p.T[j-1])
				}
				break
			}
		}
	}
	return out
}

// flatPressure returns the flat-surface vapor pressure at ts (K) the rates
// use: the Equilibrium's, or p_sat without one (or where it fails).
func (c *Conditions) flatPressure(ts float64) float64 {
	if c.Equilibrium != nil {
		if p, err := c.Equilibrium.FlatVaporPressure(ts); err == nil {
			return p
		}
	}
	return c.Liquid.SaturationPressure(ts)
}
