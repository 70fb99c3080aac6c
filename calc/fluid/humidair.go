package fluid

import (
	"math"

	"fogbench/calc/phys"
)

// Water vapor in air at pressure: the virial equation of the IAPWS
// Guideline on a Virial Equation for the Fugacity of H2O in Humid Air
// (IAPWS G11-15; the equations and the air–water coefficients read in
// python3-iapws 1.5.2, humidAir.py _virial and _fugacity), and the
// solubility of air in liquid water from the IAPWS Guideline on the Henry's
// constant and vapor-liquid distribution constant for gases in H2O and D2O
// at high temperatures (IAPWS G7-04; coefficients read in python3-iapws
// 1.5.2, _iapws.py _Henry).

// HumidAirVirialRange is the temperature range (K) of the guideline's
// third cross virial coefficients, the narrowest of its parts; its
// pressure range is 0–5 MPa.
var HumidAirVirialRange = [2]float64{193, 473}

// HumidAirMaxPressure is the top of the guideline's pressure range, Pa.
const HumidAirMaxPressure = 5e6

// iapws95Virial returns the second and third virial coefficients of water
// B_ww (m3/mol) and C_ww (m6/mol2) at T (K) from the low-density limit of
// the IAPWS-95 residual Helmholtz energy (R6-95(2018) Table 2; the terms
// with d = 1 give B, those with d = 2 and the d = 1 terms with c = 1 give C;
// the non-analytic terms contribute below 1e-12 there and are left out):
//
//	B = a1/ρc,  C = 2 a2/ρc²  for  φ^r = a1(τ) δ + a2(τ) δ² + …,  τ = Tc/T
func iapws95Virial(T float64) (B, C float64) {
	tau := waterTc / T
	rhoc := 322.0 / 18.015268e-3 // mol/m3
	p := math.Pow
	a1 := 0.012533547935523*p(tau, -0.5) + 7.8957634722828*p(tau, 0.875) - 8.7803203303561*tau +
		// d = 1 exponential terms, c = 1 and c = 2
		-0.66856572307965*p(tau, 4) + 0.20433810950965*p(tau, 6) - 6.6212605039687e-05*p(tau, 12) +
		-0.10793600908932*p(tau, 7)
	a2 := 0.31802509345418*p(tau, 0.5) - 0.26145533859358*p(tau, 0.75) +
		// d = 2 exponential terms (c = 1: t = 1, 5; c = 2: t = 1, 9, 10)
		-0.19232721156002*tau - 0.25709043003438*p(tau, 5) +
		0.017611491008752*tau + 0.22132295167546*p(tau, 9) - 0.40247669763528*p(tau, 10) +
		// δ·exp(−δ) = δ − δ² + …: the d = 1, c = 1 terms with their sign turned
		0.66856572307965*p(tau, 4) - 0.20433810950965*p(tau, 6) + 6.6212605039687e-05*p(tau, 12)
	return a1 / rhoc, 2 * a2 / (rhoc * rhoc)
}

// airVirial returns the second and third virial coefficients of dry air
// B_aa (m3/mol) and C_aa (m6/mol2) at T (K) from the low-density limit of
// the Lemmon et al. (2000) air equation (J. Phys. Chem. Ref. Data 29, 331;
// coefficients read in python3-iapws 1.5.2, humidAir.py Air), as above.
func airVirial(T float64) (B, C float64) {
	tau := 132.6312 / T
	rhoc := 10447.7 // mol/m3
	p := math.Pow
	a1 := 0.118160747229 + 0.713116392079*p(tau, 0.33) - 1.61824192067*p(tau, 1.01) +
		-0.101365037912*p(tau, 1.6) - 0.146629609713*p(tau, 3.6) + 0.0148287891978*p(tau, 3.5)
	a2 := 0.0714140178971 + 0.101365037912*p(tau, 1.6)
	return a1 / rhoc, 2 * a2 / (rhoc * rhoc)
}

// airWaterCrossVirial returns B_aw (m3/mol), C_aaw and C_aww (m6/mol2) at
// T (K): IAPWS G11-15 eqs. 7–9 with Table 3 (Harvey & Huang 2007 for B_aw,
// Hyland & Wexler 1983 for the third coefficients), θ = T/(100 K).
func airWaterCrossVirial(T float64) (baw, caaw, caww float64) {
	th := T / 100
	baw = 1e-6 * (66.5687*math.Pow(th, -0.237) - 238.834*math.Pow(th, -1.048) - 176.755*math.Pow(th, -3.183))
	caaw = 1e-6 * (0.482737e-3 + 0.105678e-2/th - 0.656394e-2/(th*th) + 0.294442e-1/(th*th*th) - 0.319317e-1/(th*th*th*th))
	caww = -1e-6 * math.Exp(-10.728876+34.7802/th-38.3383/(th*th)+33.406/(th*th*th))
	return baw, caaw, caww
}

// WaterInAirLnPhi returns ln φ_w, the natural log of the fugacity
// coefficient of water vapor at mole fraction x in humid air at T (K) and
// p (Pa), IAPWS G11-15 eqs. 2–4:
//
//	ln φ_w = β p/(R T) + ½ γ (p/(R T))²
//	β = x(2 − x) B_ww + (1 − x)² (2 B_aw − B_aa)
//	γ = x²(3 − 2x) C_www + (1 − x)² [6x C_aww + 3(1 − 2x) C_aaw − 2(1 − x) C_aaa]
//	    + [x² B_ww + 2x(1 − x) B_aw + (1 − x)² B_aa] · [x(3x − 4) B_ww + 2(1 − x)(3x − 2) B_aw + 3(1 − x)² B_aa]
//
// Validity: 193–473 K, 0–5 MPa (HumidAirVirialRange, HumidAirMaxPressure);
// beyond, an extrapolation the caller must flag. With x = 1 it is the
// fugacity coefficient of pure water vapor.
func WaterInAirLnPhi(T, p, x float64) float64 {
	return NewHumidAirVirial(T).LnPhi(p, x)
}

// HumidAirVirial holds the virial coefficients of humid air at one
// temperature, so that ln φ_w at many (p, x) costs no more powers.
type HumidAirVirial struct {
	T                                     float64
	bww, cwww, baa, caaa, baw, caaw, caww float64
}

// NewHumidAirVirial evaluates the coefficients of WaterInAirLnPhi at T (K).
func NewHumidAirVirial(T float64) HumidAirVirial {
	v := HumidAirVirial{T: T}
	v.bww, v.cwww = iapws95Virial(T)
	v.baa, v.caaa = airVirial(T)
	v.baw, v.caaw, v.caww = airWaterCrossVirial(T)
	return v
}

// LnPhi is WaterInAirLnPhi at the coefficients' temperature.
func (v HumidAirVirial) LnPhi(p, x float64) float64 {
	T := v.T
	bww, cwww, baa, caaa, baw, caaw, caww := v.bww, v.cwww, v.baa, v.caaa, v.baw, v.caaw, v.caww
	y := 1 - x
	beta := x*(2-x)*bww + y*y*(2*baw-baa)
	gamma := x*x*(3-2*x)*cwww + y*y*(6*x*caww+3*(1-2*x)*caaw-2*y*caaa) +
		(x*x*bww+2*x*y*baw+y*y*baa)*(x*(3*x-4)*bww+2*y*(3*x-2)*baw+3*y*y*baa)
	rho := p / (phys.GasConstant * T)
	return beta*rho + 0.5*gamma*rho*rho
}

// henryWater returns Henry's constant k_H (Pa) of a gas in liquid water
// at T (K), IAPWS G7-04 eq. 3 with Table 2:
//
//	ln(k_H/p_sat) = A/T_R + B τ^0.355/T_R + C T_R^−0.41 e^τ,  T_R = T/Tc, τ = 1 − T_R
//
// with p_sat the water vapor pressure (IAPWS-IF97 here, within 0.03 % of
// the guideline's own form). Valid 278–636 K for N2, 274–617 K for O2,
// 273–568 K for Ar (Table 2 ranges).
func henryWater(T, A, B, C float64) float64 {
	tr := T / waterTc
	tau := 1 - tr
	return waterSaturationPressure(T) * math.Exp(A/tr+B*math.Pow(tau, 0.355)/tr+C*math.Pow(tr, -0.41)*math.Exp(tau))
}

// WaterDissolvedGas returns the mole fraction of the gas dissolved in
// liquid water at T (K) under a gas partial pressure pg (Pa), x = pg/k_H
// (Henry's law, dilute solution), for gasID "nitrogen" (N2) or "air"
// (N2, O2 and Ar in the dry-air mole fractions 0.7809, 0.2095, 0.0093 of the
// U.S. Standard Atmosphere 1976, from memory, each by its own k_H). Other
// gases return 0 and false.
func WaterDissolvedGas(gasID string, T, pg float64) (float64, bool) {
	s, ok := WaterGasSolubility(gasID, T)
	return pg * s, ok
}

// WaterGasSolubility returns the Henry's-law slope x/p_g (1/Pa) of
// WaterDissolvedGas at T (K), and false for a gas it does not know.
func WaterGasSolubility(gasID string, T float64) (float64, bool) {
	n2 := henryWater(T, -9.67578, 4.72162, 11.70585)
	switch gasID {
	case "nitrogen":
		return 1 / n2, true
	case "air":
		o2 := henryWater(T, -9.44833, 4.43822, 11.42005)
		ar := henryWater(T, -8.40954, 4.29587, 10.52779)
		return 0.7809/n2 + 0.2095/o2 + 0.0093/ar, true
	}
	return 0, false
}
