package evap

import "math"

// Published ranges of the convective correlations, used for warnings.
const (
	ranzMarshallMaxRe = 200 // Ranz & Marshall (1952) data range, 0–200 — from memory
	asMaxRe           = 400 // Clift et al. (1978) Sh0 form, Re ≤ 400 — from memory
	asMaxB            = 20  // Abramzon & Sirignano (1989) F(B) fit, 0 ≤ B ≤ 20 — from memory
	asMinPrSc         = 1   // Abramzon & Sirignano (1989) F(B) fit, 1 ≤ Pr, Sc ≤ 3 — from memory
	asMaxPrSc         = 3
)

// RanzMarshall returns the Ranz–Marshall Nusselt (or Sherwood) number
//
//	Nu = 2 + 0.6 Re^(1/2) Pr^(1/3)   (Sh likewise with Sc)
//
// for a sphere, with the Reynolds number re = ρ_g |u| d / μ_g built on the
// DIAMETER and the Prandtl (or Schmidt) number prOrSc; all dimensionless.
// Source: Ranz & Marshall (1952), Chem. Eng. Prog. 48, 141–146 and 173–180
// (form from memory). Fitted for 0 ≤ Re ≤ 200; Conditions.Drop warns
// above that.
func RanzMarshall(re, prOrSc float64) float64 {
	if re == 0 {
		return 2 // a stagnant drop; skips the cube root
	}
	return 2 + 0.6*math.Sqrt(re)*math.Cbrt(prOrSc)
}

// Frossling returns the Frössling Sherwood (or Nusselt) number
//
//	Sh = 2 (1 + 0.276 Re^(1/2) Sc^(1/3))
//
// (Frössling 1938, Gerlands Beitr. Geophys. 52, 170–216; form from memory).
// re on the DIAMETER; dimensionless. Same practical range as RanzMarshall.
func Frossling(re, sc float64) float64 {
	return 2 * (1 + 0.276*math.Sqrt(re)*math.Cbrt(sc))
}

// FilmCorrection returns the Abramzon–Sirignano film-thickening factor
//
//	F(B) = (1 + B)^0.7 ln(1 + B) / B,   F(0) = 1
//
// for a Spalding number B (dimensionless). Source: Abramzon & Sirignano
// (1989), Int. J. Heat Mass Transfer 32(9), 1605–1618 (form from memory).
// Fitted for 0 ≤ B ≤ 20 and 1 ≤ Pr, Sc ≤ 3; defined for any B > −1 and used
// unchanged for condensation (B < 0), which Conditions.Drop flags. F is not
// monotonic: it peaks near B ≈ 10. (1 + B)^0.7 is taken as
// e^(0.7 ln(1 + B)) with ln(1 + B) by math.Log1p, which the fixed point on
// Nu* calls several times per rate: math.Pow was a sixth of an
// Abramzon–Sirignano history.
func FilmCorrection(b float64) float64 {
	l := math.Log1p(b)
	ratio := l / b // ln(1 + B)/B, as lnOnePlusOverB
	if math.Abs(b) < 1e-5 {
		ratio = lnOnePlusOverB(b)
	}
	return math.Exp(0.7*l) * ratio
}

// CliftNumber returns the isolated-sphere Sherwood (or Nusselt) number used
// by Abramzon & Sirignano,
//
//	Sh0 = 1 + (1 + Re Sc)^(1/3) f(Re),   f(Re) = max(1, Re^0.077)
//
// re on the DIAMETER, sc the Schmidt (or Prandtl) number; dimensionless.
// Source: Clift, Grace & Weber, Bubbles, Drops and Particles (1978), as used
// in Abramzon & Sirignano (1989) eq. 14–15 (form and equation numbers from
// memory). Valid for Re ≤ 400.
func CliftNumber(re, sc float64) float64 {
	f := 1.0
	if re > 1 {
		f = math.Pow(re, 0.077)
	}
	return 1 + math.Cbrt(1+re*sc)*f
}

// ModifiedNumber returns the Abramzon–Sirignano modified Sherwood or Nusselt
// number Sh* = 2 + (Sh0 − 2)/F(B) for the isolated-sphere value n0 and the
// Spalding number b (mass number for Sh*, heat number for Nu*).
// Source: Abramzon & Sirignano (1989) (form from memory).
func ModifiedNumber(n0, b float64) float64 {
	return 2 + (n0-2)/FilmCorrection(b)
}
