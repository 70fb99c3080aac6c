package fluid

import "math"

// correlation is one temperature-dependent property of one fluid: its
// evaluation in SI units and where it comes from. tmin and tmax are the
// published validity bounds in K.
type correlation struct {
	property  string
	method    string
	reference string
	tmin      float64
	tmax      float64
	eval      func(T float64) float64
}

func (c correlation) source() Source {
	return Source{Property: c.property, Method: c.method, Reference: c.reference}
}

func (c correlation) inRange(T float64) bool { return T >= c.tmin && T <= c.tmax }

// The equation forms below return plain functions of T in K. Each states the
// units of its coefficients; the catalog converts molar results to mass units.

// dippr100 is DIPPR equation 100, the polynomial
// y = A + B T + C T^2 + D T^3 + E T^4 (Perry's Chemical Engineers' Handbook,
// 8th ed., Table 2-153 uses it for liquid heat capacity in J/(kmol K)).
func dippr100(a, b, c, d, e float64) func(float64) float64 {
	return func(T float64) float64 { return a + T*(b+T*(c+T*(d+T*e))) }
}

// dippr101 is DIPPR equation 101, y = exp(C1 + C2/T + C3 ln T + C4 T^C5)
// (Perry's 8th ed. Table 2-8 vapor pressure in Pa, Table 2-313 liquid
// viscosity in Pa s).
func dippr101(c1, c2, c3, c4, c5 float64) func(float64) float64 {
	return func(T float64) float64 {
		return math.Exp(c1 + c2/T + c3*math.Log(T) + c4*math.Pow(T, c5))
	}
}

// dippr105 is DIPPR equation 105, y = C1 / C2^(1 + (1 - T/C3)^C4) (Perry's
// 8th ed. liquid density table; C1 in mol/m3 gives mol/m3). Above C3 the
// bracket is held at zero so the form stays finite.
func dippr105(c1, c2, c3, c4 float64) func(float64) float64 {
	return func(T float64) float64 {
		tau := math.Max(1-T/c3, 0)
		return c1 / math.Pow(c2, 1+math.Pow(tau, c4))
	}
}

// dippr106 is DIPPR equation 106,
// y = C1 (1 - Tr)^(C2 + C3 Tr + C4 Tr^2), Tr = T/Tc (Perry's 8th ed.
// Table 2-150 enthalpy of vaporization; C1 in J/mol gives J/mol).
func dippr106(tc, c1, c2, c3, c4 float64) func(float64) float64 {
	return func(T float64) float64 {
		tr := T / tc
		if tr >= 1 {
			return 0
		}
		return c1 * math.Pow(1-tr, c2+tr*(c3+tr*c4))
	}
}

// dippr114 is DIPPR equation 114 for liquid heat capacity near the critical
// point, with tau = 1 - T/Tc:
// y = A^2/tau + B - 2 A C tau - A D tau^2 - C^2 tau^3/3 - C D tau^4/2 - D^2 tau^5/5
// (Perry's 8th ed. Table 2-153, J/(kmol K)). The form diverges at Tc; tau is
// held at 1e-6 or above.
func dippr114(tc, a, b, c, d float64) func(float64) float64 {
	return func(T float64) float64 {
		t := math.Max(1-T/tc, 1e-6)
		return a*a/t + b - 2*a*c*t - a*d*t*t - c*c*t*t*t/3 - c*d*t*t*t*t/2 - d*d*t*t*t*t*t/5
	}
}

// antoine is log10(p/Pa) = A - B/(T + C), T in K (Poling, Prausnitz &
// O'Connell, 5th ed., Appendix A, in the Pa-and-K form of the
// CalebBell/chemicals transcription, where the coefficients were read).
func antoine(a, b, c float64) func(float64) float64 {
	return func(T float64) float64 { return math.Pow(10, a-b/(T+c)) }
}

// wagner36 is the Wagner (3,6) vapor-pressure form of McGarry (1983),
// ln(p/pc) = (a tau + b tau^1.5 + c tau^3 + d tau^6)/Tr, tau = 1 - Tr.
func wagner36(tc, pc, a, b, c, d float64) func(float64) float64 {
	return func(T float64) float64 {
		tr := T / tc
		tau := math.Max(1-tr, 0)
		return pc * math.Exp((a*tau+b*math.Pow(tau, 1.5)+c*tau*tau*tau+d*math.Pow(tau, 6))/tr)
	}
}

// wagner25 is the Wagner (2.5,5) vapor-pressure form used in Poling et al.
// 5th ed. Appendix A and in the VDI Heat Atlas (PPDS),
// ln(p/pc) = (a tau + b tau^1.5 + c tau^2.5 + d tau^5)/Tr, tau = 1 - Tr.
func wagner25(tc, pc, a, b, c, d float64) func(float64) float64 {
	return func(T float64) float64 {
		tr := T / tc
		tau := math.Max(1-tr, 0)
		return pc * math.Exp((a*tau+b*math.Pow(tau, 1.5)+c*math.Pow(tau, 2.5)+d*math.Pow(tau, 5))/tr)
	}
}

// jasper is the linear surface-tension fit of Jasper (1972),
// sigma [mN/m] = a - b t, t in degC; returned in N/m and never below zero.
func jasper(a, b float64) func(float64) float64 {
	return func(T float64) float64 {
		return math.Max(a-b*(T-273.15), 0) * 1e-3
	}
}

// mulero is the surface-tension form of Mulero, Cachadina & Parra (2012),
// sigma [N/m] = sum_i s_i (1 - T/Tc)^n_i. The powers share one logarithm
// of tau (powFromLog gives math.Pow's bits).
func mulero(tc float64, s, n []float64) func(float64) float64 {
	return func(T float64) float64 {
		tau := math.Max(1-T/tc, 0)
		lt := math.Log(tau)
		var sum float64
		for i := range s {
			sum += s[i] * powFromLog(tau, lt, n[i])
		}
		return math.Max(sum, 0)
	}
}

// ppdsDensity is the VDI Heat Atlas PPDS saturated-liquid density form
// rho = rhoc + A tau^0.35 + B tau^(2/3) + C tau + D tau^(4/3), kg/m3.
func ppdsDensity(tc, rhoc, a, b, c, d float64) func(float64) float64 {
	return func(T float64) float64 {
		tau := math.Max(1-T/tc, 0)
		return rhoc + a*math.Pow(tau, 0.35) + b*math.Pow(tau, 2.0/3) + c*tau + d*math.Pow(tau, 4.0/3)
	}
}

// ppdsViscosity is the VDI Heat Atlas PPDS liquid-viscosity form
// mu = E exp(A x^(1/3) + B x^(4/3)), x = (C - T)/(T - D), Pa s.
func ppdsViscosity(a, b, c, d, e float64) func(float64) float64 {
	return func(T float64) float64 {
		x := (c - T) / (T - d)
		return e * math.Exp(a*math.Cbrt(x)+b*x*math.Cbrt(x))
	}
}

// ppdsLatentHeat is the VDI Heat Atlas PPDS enthalpy of vaporization,
// dH = R Tc (A tau^(1/3) + B tau^(2/3) + C tau + D tau^2 + E tau^6), J/mol.
func ppdsLatentHeat(tc, a, b, c, d, e float64) func(float64) float64 {
	return func(T float64) float64 {
		tau := math.Max(1-T/tc, 0)
		return gasConstant * tc * (a*math.Cbrt(tau) + b*math.Pow(tau, 2.0/3) + c*tau + d*tau*tau + e*math.Pow(tau, 6))
	}
}

// watson scales a latent heat h1 known at T1 to T by Watson (1943),
// h = h1 [(1 - T/Tc)/(1 - T1/Tc)]^n (Poling et al. 5th ed. eq. 7-12.1, from
// memory for the equation number).
func watson(h1, t1, tc, n float64) func(float64) float64 {
	return func(T float64) float64 {
		return h1 * math.Pow(math.Max(1-T/tc, 0)/(1-t1/tc), n)
	}
}

// idealGasCp is the ideal-gas heat capacity polynomial of Poling, Prausnitz &
// O'Connell, 5th ed., Appendix A (Section C): Cp0/R = a0 + a1 T + a2 T^2 +
// a3 T^3 + a4 T^4, T in K; returned in J/(mol K).
func idealGasCp(a0, a1, a2, a3, a4 float64) func(float64) float64 {
	return func(T float64) float64 {
		return gasConstant * (a0 + T*(a1+T*(a2+T*(a3+T*a4))))
	}
}

// perMass turns a molar function (per mol) into a mass function (per kg).
func perMass(m float64, f func(float64) float64) func(float64) float64 {
	return func(T float64) float64 { return f(T) / m }
}

// perKmolToKg turns a per-kmol function (Perry's units) into per-kg.
func perKmolToKg(m float64, f func(float64) float64) func(float64) float64 {
	return func(T float64) float64 { return f(T) / (1000 * m) }
}

// molarToMassDensity turns mol/m3 into kg/m3.
func molarToMassDensity(m float64, f func(float64) float64) func(float64) float64 {
	return func(T float64) float64 { return f(T) * m }
}
