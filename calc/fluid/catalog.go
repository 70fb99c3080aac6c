package fluid

import "fogbench/calc/phys"

// Reference strings used by many entries.
const (
	refPerry2_8   = "Green & Perry, Perry's Chemical Engineers' Handbook 8th ed. (2008), Table 2-8"
	refPerry2_32  = "Green & Perry, Perry's Chemical Engineers' Handbook 8th ed. (2008), liquid density table (Table 2-32, number from memory)"
	refPerry2_150 = "Green & Perry, Perry's Chemical Engineers' Handbook 8th ed. (2008), Table 2-150"
	refPerry2_153 = "Green & Perry, Perry's Chemical Engineers' Handbook 8th ed. (2008), Table 2-153"
	refPerry2_313 = "Green & Perry, Perry's Chemical Engineers' Handbook 8th ed. (2008), Table 2-313"
	refPolingA    = "Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids 5th ed. (2001), Appendix A"
	refMulero     = "Mulero, Cachadiña & Parra, J. Phys. Chem. Ref. Data 41 (2012) 043105"
	refJasper     = "Jasper, J. Phys. Chem. Ref. Data 1 (1972) 841, as reprinted in Lange's Handbook 16th ed."
	refIUPACCrit  = "IUPAC critical-property evaluations (J. Chem. Eng. Data series), as tabulated in CalebBell/chemicals IUPACOrganicCriticalProps.tsv"
	refCRCTb      = "CRC Handbook of Chemistry and Physics, boiling points (as tabulated in CalebBell/chemicals)"
	refFuller     = "Fuller, Ensley & Giddings (1969) increments, Poling et al. 5th ed. Table 11-1"
	refReadVia    = " (coefficients read in CalebBell/chemicals data files)"
)

// builtins is the stable list Liquids returns.
var builtins = []*Liquid{
	newWater(),
	newHeptane(),
	newIsoOctane(),
	newDecane(),
	newDodecane(),
	newHexadecane(),
	newEthanol(),
	newMethanol(),
	newAcetone(),
	newKeroseneSurrogate(),
	newDieselSurrogate(),
}

// fullerVolume sums the Fuller et al. (1969) atomic diffusion volumes of
// Poling et al. 5th ed. Table 11-1: C 15.9, H 2.31, O 6.11 (no rings in the
// built-in organics).
func fullerVolume(c, h, o int) float64 {
	return 15.9*float64(c) + 2.31*float64(h) + 6.11*float64(o)
}

func newWater() *Liquid {
	l := &Liquid{
		ID: "water", Name: "Water", Formula: "H2O", CAS: "7732-18-5",
		molarMass:  phys.MolarMassWater,
		tc:         waterTc,
		pc:         waterPc,
		omega:      0.3443,
		tb:         373.1243,
		tmelt:      273.15,
		vc:         phys.MolarMassWater / waterRhoc,
		dipole:     1.855,
		diffVolume: 13.1,
		tsat:       waterSaturationTemperature,
	}
	l.constants = []Source{
		{"molar mass, critical point", "IAPWS constants", "IAPWS R6-95(2018) eqs. 2-4; R7-97(2012) eq. 1"},
		{"normal boiling point", "IF97 eq. 31 at 101325 Pa", "IAPWS R7-97(2012)"},
		{"melting point (hard lower limit)", "lower bound of IF97 region 4", "IAPWS R7-97(2012) section 8"},
		{"acentric factor, dipole moment", "as coded in python3-iapws 1.5.2 (IAPWS95.f_acent, momentoDipolar)", "python3-iapws 1.5.2 iapws95.py"},
		{"critical volume", "M/rho_c", "IAPWS R6-95(2018), rho_c = 322 kg/m3"},
		{"diffusion volume", "Fuller simple-molecule value for H2O", refFuller},
	}
	l.psat = correlation{"saturation pressure", "IAPWS-IF97 region 4, eq. 30",
		"IAPWS R7-97(2012)", 273.15, waterTc, waterSaturationPressure}
	l.sigma = correlation{"surface tension", "IAPWS R1-76 sigma = B tau^mu (1 + b tau)",
		"IAPWS R1-76(2014)", 248.15, waterTc, waterSurfaceTension}
	l.rho = correlation{"liquid density", "saturated-liquid density, SR1-86 eq. 2",
		"IAPWS SR1-86(1992) (Wagner & Pruss 1993)", 273.16, waterTc, waterSaturatedLiquidDensity}
	l.mu = correlation{"liquid viscosity", "IAPWS 2008 viscosity at the SR1-86 saturated-liquid density, no critical enhancement",
		"IAPWS R12-08 eqs. 10-12", 273.16, 640,
		func(T float64) float64 { return waterViscosity(T, waterSaturatedLiquidDensity(T)) }}
	l.hvap = correlation{"latent heat", "Clapeyron equation with SR1-86 p_s, rho', rho''",
		"IAPWS SR1-86(1992) eqs. 1-3", 273.16, waterTc, waterLatentHeat}
	l.cp = correlation{"liquid heat capacity", "IAPWS-IF97 region 1 at max(p_s, 101325 Pa)",
		"IAPWS R7-97(2012) eq. 7, Tables 2-4", 273.15, 623.15, waterLiquidHeatCapacity}
	l.cpVapor = correlation{"vapor heat capacity", "IAPWS-95 ideal-gas part",
		"IAPWS R6-95(2018) Table 1, eq. 5", 273.16, 1273, waterVaporHeatCapacity}
	l.muVapor = correlation{"vapor viscosity", "IAPWS 2008 viscosity, dilute-gas term mu0",
		"IAPWS R12-08 eq. 11", 273.16, 1173.15, waterDiluteViscosity}
	l.kVapor = correlation{"vapor thermal conductivity", "IAPWS 2011 conductivity, dilute-gas term lambda0",
		"IAPWS R15-11 eq. 16", 273.16, 1173.15, waterDiluteConductivity}
	l.vaporFilm = waterVaporFilm
	return l
}

func newHeptane() *Liquid {
	const m = 100.204e-3
	l := &Liquid{
		ID: "n-heptane", Name: "n-Heptane", Formula: "C7H16", CAS: "142-82-5",
		molarMass:  m,
		tc:         540.2,
		pc:         2.74e6,
		tb:         371.55,
		tmelt:      182.57,
		vc:         428e-6,
		diffVolume: fullerVolume(7, 16, 0),
	}
	l.psat = correlation{"saturation pressure", "DIPPR eq. 101", refPerry2_8 + refReadVia, 182.57, 540.2,
		dippr101(87.829, -6996.4, -9.8802, 7.2099e-06, 2)}
	l.sigma = correlation{"surface tension", "Mulero-Cachadiña sum of powers", refMulero + refReadVia, 183, 540.08,
		mulero(540.13, []float64{0.07765, -0.02599}, []float64{1.319, 1.6})}
	l.rho = correlation{"liquid density", "DIPPR eq. 105", refPerry2_32 + refReadVia, 182.57, 540.2,
		molarToMassDensity(m, dippr105(612.59, 0.26211, 540.2, 0.28141))}
	l.mu = correlation{"liquid viscosity", "DIPPR eq. 101", refPerry2_313 + refReadVia, 180.15, 432.16,
		dippr101(-9.4622, 877.07, -0.23445, 1.4022e+22, -10)}
	l.hvap = correlation{"latent heat", "DIPPR eq. 106", refPerry2_150 + refReadVia, 182.57, 540.2,
		perMass(m, dippr106(540.2, 50014, 0.38795, 0, 0))}
	l.cp = correlation{"liquid heat capacity", "DIPPR eq. 114", refPerry2_153 + refReadVia, 182.57, 520,
		perKmolToKg(m, dippr114(540.2, 61.26, 314410, 1824.6, -2547.9))}
	l.cpVapor = correlation{"vapor heat capacity", "ideal-gas polynomial Cp0/R", refPolingA + refReadVia, 200, 1000,
		perMass(m, idealGasCp(9.634, 0.004156, 0.00015494, -2.0066e-07, 7.77e-11))}
	finishOrganic(l)
	l.constants = []Source{
		{"molar mass", "C7H16 from IUPAC atomic weights", "IUPAC standard atomic weights"},
		{"critical temperature, critical pressure", "evaluated data", refIUPACCrit},
		{"normal boiling point", "handbook value", refCRCTb},
		{"melting point (hard lower limit)", "triple point = lower bound of the vapor-pressure fit", refPerry2_8},
		{"critical volume", "tabulated Vc", refPolingA + " (from memory)"},
		{"acentric factor", "definition omega = -log10(p_s(0.7 Tc)/pc) - 1 (Pitzer 1955) evaluated with the vapor-pressure correlation", "computed"},
		{"diffusion volume", "sum of atomic increments", refFuller},
	}
	chungVapor(l)
	return l
}

// finishOrganic derives the acentric factor from its definition,
// omega = -log10(p_s(0.7 Tc)/pc) - 1 (Pitzer et al. 1955), with the
// liquid's own vapor-pressure correlation, so the constant and the curve agree.
func finishOrganic(l *Liquid) {
	pr := l.psat.eval(0.7*l.tc) / l.pc
	l.omega = -log10(pr) - 1
}
