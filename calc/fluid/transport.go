package fluid

import "math"

// Diffusivity returns the binary diffusion coefficient of the liquid's vapor
// in the gas in m2/s by the method of Fuller, Schettler & Giddings (1966) with
// the volumes of Fuller, Ensley & Giddings (1969), Poling, Prausnitz &
// O'Connell 5th ed. eq. 11-4.4:
//
//	D = 1.43e-2 T^1.75 / (p M_AB^(1/2) [(Sv_A)^(1/3) + (Sv_B)^(1/3)]^2)
//	M_AB = 2 / (1/M_A + 1/M_B)  in g/mol
//
// T in K, p in Pa. Valid for low pressure (ideal-gas region, below about
// 3 MPa); Poling et al. give typical errors of 5-10 %. T and p must be
// positive (check with Liquid.VaporCheck and Gas.Check); non-positive inputs
// give 0.
func Diffusivity(l *Liquid, g *Gas, T, p float64) float64 {
	if !(T > 0) || !(p > 0) || math.IsInf(T, 0) || math.IsInf(p, 0) {
		return 0
	}
	return fullerPair(l, g).at(T, p)
}

// fuller holds the parts of Diffusivity that depend only on the pair:
// M_AB^(1/2) and (Sv_A)^(1/3) + (Sv_B)^(1/3).
type fuller struct{ sqrtMab, s float64 }

func fullerPair(l *Liquid, g *Gas) fuller {
	mab := 2 / (1/(l.molarMass*1e3) + 1/(g.molarMass*1e3))
	return fuller{math.Sqrt(mab), math.Cbrt(l.diffVolume) + math.Cbrt(g.diffVolume)}
}

// at is Diffusivity for positive finite T and p.
func (f fuller) at(T, p float64) float64 {
	r := math.Sqrt(T)
	t175 := T * r * math.Sqrt(r) // T^1.75
	return 1.43e-2 * t175 / (p * f.sqrtMab * f.s * f.s)
}

// MeanFreePath returns the gas-kinetic mean free path in m,
//
//	lambda = 2 mu / (p (8 M / (pi R T))^(1/2))
//
// (Seinfeld & Pandis, Atmospheric Chemistry and Physics, eq. 9.6 form, form
// and equation number from memory), viscosity in Pa s, T
// in K, p in Pa, molarMass in kg/mol. Non-positive inputs give 0.
func MeanFreePath(viscosity, T, p, molarMass float64) float64 {
	if !(viscosity > 0) || !(T > 0) || !(p > 0) || !(molarMass > 0) {
		return 0
	}
	return 2 * viscosity / (p * math.Sqrt(8*molarMass/(math.Pi*gasConstant*T)))
}
