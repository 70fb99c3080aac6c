package evap

import "math"

// MassFraction converts a vapor mole fraction x into a mass fraction,
//
//	Y = x M_v / ( x M_v + (1 − x) M_g )
//
// with the vapor and gas molar masses mv, mg in kg/mol (definition; e.g.
// Turns, An Introduction to Combustion, 2nd ed., eq. 2.11 — from memory).
// Valid for 0 ≤ x ≤ 1.
func MassFraction(x, mv, mg float64) float64 {
	return x * mv / (x*mv + (1-x)*mg)
}

// SpaldingMassNumber returns the Spalding mass transfer number
//
//	B_M = (Y_s − Y_∞) / (1 − Y_s)
//
// from the vapor mass fractions at the surface (ys) and in the far field
// (yinf), both dimensionless (Spalding 1953, 4th Symp. (Int.) Combust. 847;
// Turns 2nd ed. ch. 3 — forms from memory, standard). Valid for ys < 1;
// B_M < 0 means condensation.
func SpaldingMassNumber(ys, yinf float64) float64 {
	return (ys - yinf) / (1 - ys)
}

// SpaldingHeatNumber returns the Spalding heat transfer number
//
//	B_T = c_p (T_∞ − T_s) / L_eff
//
// with the specific heat cp in J/(kg K), temperatures in K and the effective
// latent heat lEff in J/kg (latent heat plus heat conducted into the
// liquid per unit mass evaporated, if any). Sources as SpaldingMassNumber.
// Abramzon & Sirignano (1989) use the vapor c_p here; with Le = 1 and a
// single c_p it equals B_M at the steady state.
func SpaldingHeatNumber(cp, tinf, ts, lEff float64) float64 {
	return cp * (tinf - ts) / lEff
}

// lnOnePlusOverB returns ln(1+B)/B, with its limit 1 − B/2 + B²/3 near B = 0
// so that no 0/0 arises; B > −1.
func lnOnePlusOverB(b float64) float64 {
	if math.Abs(b) < 1e-5 {
		return 1 - b/2 + b*b/3
	}
	return math.Log1p(b) / b
}
