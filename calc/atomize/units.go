package atomize

import "math"

// Exact unit definitions used for the customary flow numbers of the trade.
const (
	// Pound is the international avoirdupois pound in kg, exact by the 1959
	// international yard and pound agreement (NIST SP 811, B.8).
	Pound = 0.45359237
	// StandardGravity in m/s², exact by the 3rd CGPM (1901); it turns the
	// pound into the pound-force.
	StandardGravity = 9.80665
	// Inch in m, exact by the 1959 agreement.
	Inch = 0.0254
	// PSI is one pound-force per square inch in Pa, derived from the exact
	// definitions above: 0.45359237 × 9.80665 / 0.0254² = 6894.757293168… Pa
	// (NIST SP 811 rounds it to 6.894757E+03).
	PSI = Pound * StandardGravity / (Inch * Inch)
	// UKGallon is the imperial gallon in m³, exact (4.54609 L, UK Weights and
	// Measures Act 1985).
	UKGallon = 4.54609e-3
	// Hour in s.
	Hour = 3600.0
)

// flowNumberUSPerSI is the factor k in FN_US = k · ρ_L^0.5 · FN_SI, where
// FN_US = ṁ[lb/h]/ΔP[psi]^0.5 and FN_SI = ṁ/(ρ_L ΔP)^0.5 (definitions).
// Derivation: ṁ[lb/h] = ṁ[kg/s]·Hour/Pound and ΔP[psi] = ΔP[Pa]/PSI,
// so k = Hour/Pound · PSI^0.5 = 6.59016E5 (kg/m³)^-0.5 per m². Lefebvre
// states the factor as 0.66E6 (from memory).
var flowNumberUSPerSI = Hour / Pound * math.Sqrt(PSI)

// flowNumberUKPerSI is the factor k in FN_UK = k · ρ_L^−0.5 · FN_SI, where
// FN_UK = Q[UK gal/h]/ΔP[psi]^0.5: Q = ṁ/ρ_L, so k = Hour/UKGallon · PSI^0.5.
var flowNumberUKPerSI = Hour / UKGallon * math.Sqrt(PSI)

// flowNumberUS converts FN_SI (m²) to lb/(h psi^0.5) for a liquid of density
// rhoL (kg/m³). Exact to the unit definitions.
func flowNumberUS(fnSI, rhoL float64) float64 { return flowNumberUSPerSI * math.Sqrt(rhoL) * fnSI }

// flowNumberUK converts FN_SI (m²) to UK gal/(h psi^0.5). Exact to the unit
// definitions.
func flowNumberUK(fnSI, rhoL float64) float64 { return flowNumberUKPerSI / math.Sqrt(rhoL) * fnSI }

// flowNumberSIFromUS is the inverse of flowNumberUS.
func flowNumberSIFromUS(fnUS, rhoL float64) float64 {
	return fnUS / (flowNumberUSPerSI * math.Sqrt(rhoL))
}

// flowNumberSIFromUK is the inverse of flowNumberUK.
func flowNumberSIFromUK(fnUK, rhoL float64) float64 {
	return fnUK * math.Sqrt(rhoL) / flowNumberUKPerSI
}
