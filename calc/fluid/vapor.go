package fluid

import "math"

// neufeldOmega is the Lennard-Jones collision integral for viscosity of
// Neufeld, Janzen & Aziz (1972), Poling et al. 5th ed. eq. 9-4.3:
// Omega_v = A T*^-B + C exp(-D T*) + E exp(-F T*), with A = 1.16145,
// B = 0.14874, C = 0.52487, D = 0.77320, E = 2.16178, F = 2.43787 (from
// memory; valid 0.3 <= T* <= 100, error 0.064 %).
func neufeldOmega(tstar float64) float64 {
	return 1.16145*math.Pow(tstar, -0.14874) + 0.52487*math.Exp(-0.77320*tstar) + 2.16178*math.Exp(-2.43787*tstar)
}

// chungViscosity is the dilute-gas viscosity of Chung, Lee & Starling
// (1984, 1988), Poling et al. 5th ed. eqs. 9-4.10 to 9-4.12 (from memory):
//
//	eta [uP] = 40.785 Fc (M T)^(1/2) / (Vc^(2/3) Omega_v(T*)),  T* = 1.2593 T/Tc
//	Fc = 1 - 0.2756 omega + 0.059035 mu_r^4 + kappa,  mu_r = 131.3 mu / (Vc Tc)^(1/2)
//
// with M in g/mol, Vc in cm3/mol, mu (dipole) in debye. Arguments here are SI
// (M kg/mol, Vc m3/mol); the result is in Pa s. Poling et al. report errors of
// 0.5-1.5 % for nonpolar gases at low pressure.
func chungViscosity(T, tc, m, vc, omega, dipole, kappa float64) float64 {
	return newChungViscosity(tc, m, vc, omega, dipole, kappa)(T)
}

// newChungViscosity returns chungViscosity as a function of T alone, with
// the factors that depend only on the constants (Fc, Vc^(2/3)) computed
// once; the numbers are chungViscosity's bit for bit.
func newChungViscosity(tc, m, vc, omega, dipole, kappa float64) func(T float64) float64 {
	mg := m * 1e3
	vcc := vc * 1e6
	mur := 131.3 * dipole / math.Sqrt(vcc*tc)
	fc := 1 - 0.2756*omega + 0.059035*mur*mur*mur*mur + kappa
	vc23 := math.Pow(vcc, 2.0/3)
	return func(T float64) float64 {
		return 40.785 * fc * math.Sqrt(mg*T) / (vc23 * neufeldOmega(1.2593*T/tc)) * 1e-7
	}
}

// chungConductivity is the dilute-gas thermal conductivity of Chung, Lee &
// Starling (1984), Poling et al. 5th ed. eq. 10-3.14, as read in the
// CalebBell/chemicals implementation:
//
//	lambda M / (eta Cv) = 3.75 Psi / (Cv/R)
//	Psi = 1 + alpha [0.215 + 0.28288 alpha - 1.061 beta + 0.26665 Z] / [0.6366 + beta Z + 1.061 alpha beta]
//	alpha = Cv/R - 3/2,  beta = 0.7862 - 0.7109 omega + 1.3168 omega^2,  Z = 2 + 10.5 Tr^2
//
// T in K, M in kg/mol, eta in Pa s, cvMolar in J/(mol K); W/(m K).
func chungConductivity(T, tc, m, omega, eta, cvMolar float64) float64 {
	alpha := cvMolar/gasConstant - 1.5
	beta := 0.7862 - 0.7109*omega + 1.3168*omega*omega
	z := 2 + 10.5*(T/tc)*(T/tc)
	psi := 1 + alpha*(0.215+0.28288*alpha-1.061*beta+0.26665*z)/(0.6366+beta*z+1.061*alpha*beta)
	return 3.75 * psi * gasConstant * eta / m
}

// chungVapor fills the vapor viscosity and conductivity of l from its
// constants and its ideal-gas cp correlation (already set), over the range of
// that cp correlation: Chung et al. state no bound of their own. The
// constants must be final when it is called.
func chungVapor(l *Liquid) {
	cp := l.cpVapor
	lo, hi := cp.tmin, cp.tmax
	mu := newChungViscosity(l.tc, l.molarMass, l.vc, l.omega, l.dipole, l.kappa)
	tc, m, omega := l.tc, l.molarMass, l.omega
	l.muVapor = correlation{
		property: "vapor viscosity", method: "Chung et al. (1988) corresponding states",
		reference: "Poling, Prausnitz & O'Connell 5th ed. eq. 9-4.10 (from memory)",
		tmin:      lo, tmax: hi,
		eval: mu,
	}
	l.kVapor = correlation{
		property: "vapor thermal conductivity", method: "Chung et al. (1984)",
		reference: "Poling, Prausnitz & O'Connell 5th ed. eq. 10-3.14",
		tmin:      lo, tmax: hi,
		eval: func(T float64) float64 {
			return chungConductivity(T, tc, m, omega, mu(T), cp.eval(T)*m-gasConstant)
		},
	}
	// The film needs all three at one T: the conductivity reuses that cp
	// and that viscosity.
	l.vaporFilm = func(T float64) (float64, float64, float64) {
		c, v := cp.eval(T), mu(T)
		return c, v, chungConductivity(T, tc, m, omega, v, c*m-gasConstant)
	}
}
