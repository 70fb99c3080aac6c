package atomize

import "math"

// The functions in this file take SI numbers that Evaluate has already
// validated (finite and positive); they do not check their arguments.

// orificeArea is A0 = π d0²/4 in m² for an orifice diameter d0 in m.
func orificeArea(d0 float64) float64 { return math.Pi * d0 * d0 / 4 }

// flowNumberSI is the definition FN_SI = ṁ_L/(ρ_L ΔP_L)^0.5 in m², with ṁ_L in
// kg/s, ρ_L in kg/m³ and ΔP_L in Pa (a definition, exact).
func flowNumberSI(mdot, rhoL, dp float64) float64 { return mdot / math.Sqrt(rhoL*dp) }

// massFlowFromFlowNumber inverts flowNumberSI: ṁ_L = FN_SI (ρ_L ΔP_L)^0.5 in kg/s.
func massFlowFromFlowNumber(fn, rhoL, dp float64) float64 { return fn * math.Sqrt(rhoL*dp) }

// dischargeCoefficient is the definition C_D = ṁ_L/(A0 (2 ρ_L ΔP_L)^0.5),
// A0 = π d0²/4, dimensionless (a definition, exact). Hence
// FN_SI = √2 C_D A0.
func dischargeCoefficient(mdot, rhoL, dp, d0 float64) float64 {
	return mdot / (orificeArea(d0) * math.Sqrt(2*rhoL*dp))
}

// massFlowFromDischargeCoefficient inverts dischargeCoefficient:
// ṁ_L = C_D A0 (2 ρ_L ΔP_L)^0.5 in kg/s.
func massFlowFromDischargeCoefficient(cd, rhoL, dp, d0 float64) float64 {
	return cd * orificeArea(d0) * math.Sqrt(2*rhoL*dp)
}

// rizkLefebvreDischargeCoefficient is the pressure-swirl discharge
// coefficient of Rizk & Lefebvre (1985), J. Propulsion Power 1(3), 193:
//
//	C_D = 0.35 K^0.5 (D_s/d0)^0.25,   K = A_p/(D_s d0)
//
// with A_p the total inlet-port area (m²), D_s the swirl-chamber diameter (m)
// and d0 the orifice diameter (m). Form checked against open codes that
// cite the paper (provenance RelRizkLefebvreCD). Validity not recalled;
// Evaluate warns when the result exceeds 1.
func rizkLefebvreDischargeCoefficient(portArea, swirlD, d0 float64) float64 {
	k := portArea / (swirlD * d0)
	return 0.35 * math.Sqrt(k) * math.Pow(swirlD/d0, 0.25)
}

// giffenMuraszewDischargeCoefficient is the inviscid pressure-swirl
// discharge coefficient of Giffen & Muraszew (1953):
//
//	C_D = 1.17 [(1 − X)³/(1 + X)]^0.5,   X = A_air-core/A0 in (0, 1)
//
// Form checked against open code (provenance RelGiffenMuraszew). It needs
// the air-core fraction X, which the package does
// not predict, so it is used only as a reference relation in tests and docs.
func giffenMuraszewDischargeCoefficient(x float64) float64 {
	return 1.17 * math.Sqrt(math.Pow(1-x, 3)/(1+x))
}

// lichtarowiczDischargeCoefficient is the high-Reynolds-number limit of the
// plain-orifice discharge coefficient of Lichtarowicz, Duggins & Markland
// (1965), J. Mech. Eng. Sci. 7, 210:
//
//	C_D,max = 0.827 − 0.0085 l0/d0
//
// with l0 the orifice length and d0 its diameter (m). Form checked against
// open code that cites the paper (provenance RelLichtarowicz). It is a
// high-Re limit: at low Reynolds number the
// real C_D is lower, and Evaluate says so.
func lichtarowiczDischargeCoefficient(l0, d0 float64) float64 {
	return 0.827 - 0.0085*l0/d0
}

// rizkLefebvreFilmThickness is the liquid film thickness at the exit of a
// pressure-swirl orifice, Rizk & Lefebvre (1985), J. Propulsion Power 1(3), 193:
//
//	t = 3.66 [d0 ṁ_L μ_L/(ρ_L ΔP_L)]^0.25
//
// d0 in m, ṁ_L in kg/s, μ_L in Pa s, ρ_L in kg/m³, ΔP_L in Pa; t in m. Form
// checked against open code (provenance RelRizkLefebvreFilm), where it is
// labelled the theoretical (converging-exit) value. Reported as a note; the
// film fed to Wang & Lefebvre (1987) is suyariLefebvreFilmThickness.
func rizkLefebvreFilmThickness(d0, mdot, muL, rhoL, dp float64) float64 {
	return 3.66 * math.Pow(d0*mdot*muL/(rhoL*dp), 0.25)
}

// suyariLefebvreFilmThickness is the film thickness of Suyari & Lefebvre
// (1986), J. Propulsion Power 2(6), 528:
//
//	t = 2.7 [d0 FN_SI μ_L/(ΔP_L ρ_L)^0.5]^0.25
//
// (the same group as Rizk & Lefebvre, since FN_SI/(ρ_L ΔP_L)^0.5 = ṁ_L/(ρ_L
// ΔP_L); constant 2.7 fitted to measured films). SI units as above, FN_SI in
// m². Checked against open codes (provenance RelSuyariFilm); one of them,
// citing Wang & Lefebvre (1987) by title, feeds this film to their SMD.
func suyariLefebvreFilmThickness(d0, fn, muL, rhoL, dp float64) float64 {
	return 2.7 * math.Pow(d0*fn*muL/math.Sqrt(dp*rhoL), 0.25)
}

// rizkLefebvreConeAngle is the full spray cone angle in degrees of a
// pressure-swirl atomizer, Rizk & Lefebvre (1985):
//
//	2θ = 6 K^−0.15 (ΔP_L d0² ρ_L/μ_L²)^0.11,   K = A_p/(D_s d0)
//
// SI inputs; the result is in degrees. Form from memory, not checked against
// the printed source (provenance RelRizkLefebvreCone).
func rizkLefebvreConeAngle(portArea, swirlD, d0, dp, rhoL, muL float64) float64 {
	k := portArea / (swirlD * d0)
	return 6 * math.Pow(k, -0.15) * math.Pow(dp*d0*d0*rhoL/(muL*muL), 0.11)
}
