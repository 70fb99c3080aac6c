package flash

import (
	"math"

	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// stubLiquid has constant properties and a Clausius–Clapeyron vapor
// pressure p_sat = p0 exp(−(h M/R)(1/T − 1/T0)), so T_sat(p) is exact and
// the tests can see the nucleation formulas without correlation noise.
// Its numbers are loosely water-like and invented.
type stubLiquid struct {
	p0, t0, h, m, rho, sigma, cp, tc, pc, omega float64
}

func waterLikeStub() stubLiquid {
	return stubLiquid{p0: 101325, t0: 373.15, h: 2.257e6, m: 0.018, rho: 950, sigma: 0.058,
		cp: 4200, tc: 647, pc: 22e6, omega: 0.344}
}

func (s stubLiquid) SaturationPressure(T float64) float64 {
	return s.p0 * math.Exp(-s.h*s.m/phys.GasConstant*(1/T-1/s.t0))
}

func (s stubLiquid) SaturationTemperature(p float64) (float64, error) {
	if err := valid.Positive("pressure_pa", p); err != nil {
		return 0, err
	}
	return 1 / (1/s.t0 - phys.GasConstant/(s.h*s.m)*math.Log(p/s.p0)), nil
}

func (s stubLiquid) SurfaceTension(float64) float64 { return s.sigma }
func (s stubLiquid) Density(float64) float64        { return s.rho }
func (s stubLiquid) LatentHeat(float64) float64     { return s.h }
func (s stubLiquid) HeatCapacity(float64) float64   { return s.cp }
func (s stubLiquid) MolarMass() float64             { return s.m }
func (s stubLiquid) CriticalTemperature() float64   { return s.tc }
func (s stubLiquid) CriticalPressure() float64      { return s.pc }
func (s stubLiquid) AcentricFactor() float64        { return s.omega }
