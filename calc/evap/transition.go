package evap

import (
	"math"

	"fogbench/calc/phys"
)

// Regime names returned by Regime.
const (
	RegimeContinuum      = "continuum"
	RegimeSlip           = "slip"
	RegimeTransition     = "transition"
	RegimeFreeMolecular  = "free-molecular"
	continuumMaxKnudsen  = 0.01
	slipMaxKnudsen       = 0.1
	transitionMaxKnudsen = 10
)

// FuchsSutugin returns the Fuchs–Sutugin transition-regime factor that
// multiplies the continuum evaporation (or condensation) rate,
//
//	f(Kn, α) = 0.75 α (1 + Kn) / (Kn² + Kn + 0.283 Kn α + 0.75 α)
//
// with Kn = λ/r (RADIUS) and the mass accommodation coefficient α (0 < α ≤ 1);
// dimensionless. This is the exact-coefficient form; for α = 1 it reads
// (1 + Kn)/(1 + 1.7107 Kn + 1.3333 Kn²), often rounded to 1.71 and 1.33.
// Source: Fuchs & Sutugin (1971), in Topics in Current Aerosol Research
// (Hidy & Brock, eds.), Pergamon, 1–60; as written in Seinfeld & Pandis,
// Atmospheric Chemistry and Physics, eq. 12.43. f → 1 as Kn → 0, and for
// Kn → ∞ f·(continuum flux) → α·(1/4) c̄ Δn 4πr² (the kinetic flux) when
// λ = 3 D/c̄ (see VaporMeanFreePath). Valid for all Kn ≥ 0.
func FuchsSutugin(kn, alpha float64) float64 {
	return 0.75 * alpha * (1 + kn) / (kn*kn + kn + 0.283*kn*alpha + 0.75*alpha)
}

// Knudsen returns Kn = λ / r for a mean free path lambda (m) and a RADIUS r
// (m); dimensionless.
func Knudsen(lambda, r float64) float64 {
	return lambda / r
}

// Regime labels a Knudsen number: "continuum" for Kn < 0.01, "slip" for
// 0.01 ≤ Kn < 0.1, "transition" for 0.1 ≤ Kn ≤ 10, "free-molecular" above
// 10. The thresholds are common practice in rarefied-gas dynamics, no
// source.
func Regime(kn float64) string {
	switch {
	case kn < continuumMaxKnudsen:
		return RegimeContinuum
	case kn < slipMaxKnudsen:
		return RegimeSlip
	case kn <= transitionMaxKnudsen:
		return RegimeTransition
	}
	return RegimeFreeMolecular
}

// MeanMolecularSpeed returns the mean molecular speed of an ideal gas,
//
//	c̄ = ( 8 R T / (π M) )^(1/2)
//
// in m/s, for T in K and the molar mass M in kg/mol (kinetic theory; e.g.
// Seinfeld & Pandis eq. 9.2 — from memory). R is CODATA 2018.
func MeanMolecularSpeed(T, M float64) float64 {
	return math.Sqrt(8 * phys.GasConstant * T / (math.Pi * M))
}

// VaporMeanFreePath returns the vapor mean free path used with the
// Fuchs–Sutugin factor, λ = 3 D / c̄_v, in m, for the diffusivity D (m2/s),
// temperature T (K) and vapor molar mass M (kg/mol). Convention of Seinfeld
// & Pandis ch. 12 (from memory); it is the λ for which the Fuchs–Sutugin
// rate tends to the kinetic-theory flux at large Kn.
func VaporMeanFreePath(D, T, M float64) float64 {
	return 3 * D / MeanMolecularSpeed(T, M)
}
