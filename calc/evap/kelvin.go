package evap

import (
	"math"

	"fogbench/calc/phys"
)

// maxKelvinExponent caps ln S so that KelvinRatio stays finite for radii far
// below molecular size; exp(700) ≈ 1e304. Such radii lie outside the
// Kelvin equation's validity anyway (see KelvinRatio).
const maxKelvinExponent = 700

// LaplacePressure returns the pressure jump across a spherical interface,
//
//	Δp = p_inside − p_outside = 2 σ / r
//
// (Young–Laplace equation; e.g. Adamson & Gast, Physical Chemistry of
// Surfaces, 6th ed., eq. II-7 — from memory for the equation number).
// sigma is the surface tension in N/m, r the RADIUS in m (a diameter d
// needs r = d/2); the result is in Pa. Valid for r much larger than the
// molecular size (continuum). The caller validates r > 0; r = 0 gives +Inf.
func LaplacePressure(sigma, r float64) float64 {
	return 2 * sigma / r
}

// KelvinLength returns 2 σ V_m / (R T) in m, the length scale of the Kelvin
// equation: ln(p_r/p_sat) = KelvinLength / r. sigma in N/m, molarVolume
// V_m = M/ρ_L in m3/mol, T in K. R is CODATA 2018.
func KelvinLength(sigma, molarVolume, T float64) float64 {
	return 2 * sigma * molarVolume / (phys.GasConstant * T)
}

// KelvinRatio returns the saturation ratio over a curved surface,
//
//	S = p_r / p_sat = exp( 2 σ V_m / (r R T) )
//
// with σ in N/m, molar volume V_m = M/ρ_L in m3/mol, RADIUS r in m and T in
// K; S is dimensionless (Thomson 1871; Kelvin equation, e.g. Seinfeld &
// Pandis, Atmospheric Chemistry and Physics, 2nd ed., eq. 10.86 — from
// memory for the equation number).
//
// It is the Poynting integral for a liquid whose pressure is raised by the
// Laplace pressure: for an ideal vapor in equilibrium with the liquid,
// R T ln(p_v/p_sat) = ∫ v_L dp over the liquid pressure from p_sat to p_l.
// The full form is p_v(r) = p_sat · exp( v_L (p_l − p_sat) / (R T) ) with
// p_l = p_v + 2σ/r. Taking v_L constant (incompressible liquid) and
// p_l − p_sat ≈ 2σ/r (the vapor-pressure difference is negligible beside
// the Laplace pressure) gives the form used here.
//
// Validity: continuum thermodynamics, fine down to r ≈ 5–10 nm, indicative
// at r ≈ 1 nm where the curvature dependence of σ (Tolman length) and
// molecular discreteness matter. For radii so small that ln S would exceed
// 700 the exponent is capped there so the result stays finite.
func KelvinRatio(sigma, molarVolume, r, T float64) float64 {
	return math.Exp(math.Min(KelvinLength(sigma, molarVolume, T)/r, maxKelvinExponent))
}

// CurvedVaporPressure returns the equilibrium vapor pressure in Pa over a
// drop of RADIUS r (m) of liquid l at temperature T (K):
// p_r = p_sat(T) · KelvinRatio(σ(T), M/ρ_L(T), r, T). Same validity as
// KelvinRatio and as the liquid's own property functions.
func CurvedVaporPressure(l Liquid, T, r float64) float64 {
	return l.SaturationPressure(T) * KelvinRatio(l.SurfaceTension(T), l.MolarMass()/l.Density(T), r, T)
}
