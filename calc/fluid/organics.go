package fluid

// organicData is the transcription of one organic liquid from the tables it
// cites. Coefficients are copied as printed in the source (Perry's units,
// converted by the builder); ranges are the published Tmin..Tmax columns.
type organicData struct {
	id, name, formula, cas string
	m                      float64 // kg/mol
	tc, pc, tb, tmelt      float64 // K, Pa, K, K
	vc, dipole, kappa      float64 // m3/mol, debye, Chung association factor
	c, h, o                int     // atoms, for the Fuller volume
	constSrc               []Source

	psat      [7]float64 // DIPPR 101 C1..C5, Tmin, Tmax (Perry Table 2-8)
	sigmaForm string     // "mulero" or "jasper"
	sigma     []float64  // mulero: Tc, s0, n0, s1, n1, ...; jasper: a, b
	sigmaT    [2]float64
	rho       [6]float64 // DIPPR 105 C1..C4, Tmin, Tmax
	mu        [7]float64 // DIPPR 101 C1..C5, Tmin, Tmax (Perry Table 2-313)
	hvap      [7]float64 // DIPPR 106 Tc, C1..C4, Tmin, Tmax (Perry Table 2-150)
	cp        [7]float64 // DIPPR 100 A..E, Tmin, Tmax (Perry Table 2-153)
	cpv       [7]float64 // Poling a0..a4, Tmin, Tmax
}

func newOrganic(d organicData) *Liquid {
	m := d.m
	l := &Liquid{
		ID: d.id, Name: d.name, Formula: d.formula, CAS: d.cas,
		molarMass: m, tc: d.tc, pc: d.pc, tb: d.tb, tmelt: d.tmelt,
		vc: d.vc, dipole: d.dipole, kappa: d.kappa,
		diffVolume: fullerVolume(d.c, d.h, d.o),
	}
	p := d.psat
	l.psat = correlation{"saturation pressure", "DIPPR eq. 101", refPerry2_8 + refReadVia, p[5], p[6],
		dippr101(p[0], p[1], p[2], p[3], p[4])}
	switch d.sigmaForm {
	case "mulero":
		var s, n []float64
		for i := 1; i+1 < len(d.sigma); i += 2 {
			s = append(s, d.sigma[i])
			n = append(n, d.sigma[i+1])
		}
		l.sigma = correlation{"surface tension", "Mulero-Cachadiña sum of powers", refMulero + refReadVia,
			d.sigmaT[0], d.sigmaT[1], mulero(d.sigma[0], s, n)}
	default:
		l.sigma = correlation{"surface tension", "Jasper linear fit", refJasper + refReadVia,
			d.sigmaT[0], d.sigmaT[1], jasper(d.sigma[0], d.sigma[1])}
	}
	r := d.rho
	l.rho = correlation{"liquid density", "DIPPR eq. 105", refPerry2_32 + refReadVia, r[4], r[5],
		molarToMassDensity(m, dippr105(r[0], r[1], r[2], r[3]))}
	v := d.mu
	l.mu = correlation{"liquid viscosity", "DIPPR eq. 101", refPerry2_313 + refReadVia, v[5], v[6],
		dippr101(v[0], v[1], v[2], v[3], v[4])}
	hv := d.hvap
	l.hvap = correlation{"latent heat", "DIPPR eq. 106", refPerry2_150 + refReadVia, hv[5], hv[6],
		perMass(m, dippr106(hv[0], hv[1], hv[2], hv[3], hv[4]))}
	c := d.cp
	l.cp = correlation{"liquid heat capacity", "DIPPR eq. 100", refPerry2_153 + refReadVia, c[5], c[6],
		perKmolToKg(m, dippr100(c[0], c[1], c[2], c[3], c[4]))}
	g := d.cpv
	l.cpVapor = correlation{"vapor heat capacity", "ideal-gas polynomial Cp0/R", refPolingA + refReadVia, g[5], g[6],
		perMass(m, idealGasCp(g[0], g[1], g[2], g[3], g[4]))}
	finishOrganic(l)
	l.constants = append([]Source{
		{"melting point (hard lower limit)", "triple point = lower bound of the vapor-pressure fit", refPerry2_8},
		{"acentric factor", "definition omega = -log10(p_s(0.7 Tc)/pc) - 1 (Pitzer 1955) evaluated with the vapor-pressure correlation", "computed"},
		{"diffusion volume", "sum of atomic increments C 15.9, H 2.31, O 6.11", refFuller},
	}, d.constSrc...)
	chungVapor(l)
	return l
}

var (
	srcIUPACConstants = []Source{
		{"molar mass", "from IUPAC atomic weights", "IUPAC standard atomic weights"},
		{"critical temperature, critical pressure", "evaluated data (Tc as used by the Perry correlations)", refIUPACCrit},
		{"normal boiling point", "handbook value", refCRCTb},
		{"critical volume, dipole moment", "tabulated values", refPolingA + " (from memory)"},
	}
	srcMemoryConstants = []Source{
		{"molar mass", "from IUPAC 2013 conventional atomic weights (C 12.011, H 1.008, O 15.999)", "computed"},
		{"critical temperature", "Tc of the Perry correlations", refPerry2_8},
		{"critical pressure, normal boiling point, critical volume, dipole moment", "tabulated values", refPolingA + " (from memory)"},
	}
)

func newDecane() *Liquid {
	return newOrganic(organicData{
		id: "n-decane", name: "n-Decane", formula: "C10H22", cas: "124-18-5",
		m: 142.285e-3, tc: 617.7, pc: 2.11e6, tb: 447.3, tmelt: 243.51, vc: 624e-6,
		c: 10, h: 22, constSrc: srcIUPACConstants,
		psat:      [7]float64{112.73, -9749.6, -13.245, 7.1266e-06, 2, 243.51, 617.7},
		sigmaForm: "mulero", sigma: []float64{617.7, 0.05473, 1.29}, sigmaT: [2]float64{243, 443.15},
		rho:  [6]float64{410.84, 0.25175, 617.7, 0.28571, 243.51, 617.7},
		mu:   [7]float64{-9.6489, 1181.1, -0.24367, 9.0522e+34, -15, 240.05, 494.16},
		hvap: [7]float64{617.7, 66126, 0.39797, 0, 0, 243.51, 617.7},
		cp:   [7]float64{278620, -197.91, 1.0737, 0, 0, 243.51, 460},
		cpv:  [7]float64{13.467, 0.004139, 0.00023127, -3.0477e-07, 1.197e-10, 200, 1000},
	})
}

func newDodecane() *Liquid {
	return newOrganic(organicData{
		id: "n-dodecane", name: "n-Dodecane", formula: "C12H26", cas: "112-40-3",
		m: 170.338e-3, tc: 658.0, pc: 1.82e6, tb: 489.47, tmelt: 263.57, vc: 754e-6,
		c: 12, h: 26, constSrc: srcIUPACConstants,
		psat:      [7]float64{137.47, -11976, -16.698, 8.0906e-06, 2, 263.57, 658},
		sigmaForm: "mulero", sigma: []float64{658.1, 0.0154, 4.18, 0.048, 1.17}, sigmaT: [2]float64{273.15, 473.15},
		rho:  [6]float64{332.67, 0.24664, 658, 0.28571, 263.57, 658},
		mu:   [7]float64{-7.8244, 1191.9, -0.49963, 3.9572e+23, -10, 262.15, 526.4},
		hvap: [7]float64{658, 77337, 0.40681, 0, 0, 263.57, 658},
		cp:   [7]float64{508210, -1368.7, 3.1015, 0, 0, 263.57, 330},
		cpv:  [7]float64{17.229, -0.007242, 0.00031922, -4.2322e-07, 1.7022e-10, 200, 1000},
	})
}

func newHexadecane() *Liquid {
	return newOrganic(organicData{
		id: "n-hexadecane", name: "n-Hexadecane", formula: "C16H34", cas: "544-76-3",
		m: 16*12.011e-3 + 34*1.008e-3, tc: 723, pc: 1.40e6, tb: 560.0, tmelt: 291.31, vc: 969e-6,
		c: 16, h: 34, constSrc: srcMemoryConstants,
		psat:      [7]float64{156.06, -15015, -18.941, 6.8172e-06, 2, 291.31, 723},
		sigmaForm: "jasper", sigma: []float64{29.18, 0.0854}, sigmaT: [2]float64{291.35, 559.95},
		rho:  [6]float64{232.89, 0.23659, 723, 0.28571, 291.31, 723},
		mu:   [7]float64{-20.182, 2203.5, 1.2289, 0, 0, 291.31, 564.15},
		hvap: [7]float64{723, 101560, 0.45726, 0, 0, 291.31, 723},
		cp:   [7]float64{370350, 231.47, 0.68632, 0, 0, 291.31, 560.01},
		cpv:  [7]float64{39.747, -0.206152, 0.00114814, -1.55548e-06, 6.7534e-10, 200, 1000},
	})
}

func newIsoOctane() *Liquid {
	return newOrganic(organicData{
		id: "iso-octane", name: "iso-Octane (2,2,4-trimethylpentane)", formula: "C8H18", cas: "540-84-1",
		m: 114.231e-3, tc: 543.8, pc: 2.57e6, tb: 372.37, tmelt: 165.78, vc: 468e-6,
		c: 8, h: 18, constSrc: srcIUPACConstants,
		psat:      [7]float64{84.912, -6722.2, -9.5157, 7.2244e-06, 2, 165.78, 543.8},
		sigmaForm: "mulero", sigma: []float64{543.87, 0.04794, 1.209}, sigmaT: [2]float64{273.15, 373.15},
		rho:  [6]float64{590.59, 0.27424, 543.8, 0.2847, 165.78, 543.8},
		mu:   [7]float64{-12.928, 1137.5, 0.25725, -3.6929e-28, 10, 165.78, 541.15},
		hvap: [7]float64{543.8, 47711, 0.37949, 0, 0, 165.78, 543.8},
		cp:   [7]float64{95275, 696.7, -1.3765, 0.0021734, 0, 165.78, 520},
		cpv:  [7]float64{0.384, 0.077059, 0.00000665, -5.565e-08, 2.619e-11, 200, 1000},
	})
}

func newEthanol() *Liquid {
	return newOrganic(organicData{
		id: "ethanol", name: "Ethanol", formula: "C2H6O", cas: "64-17-5",
		m: 46.069e-3, tc: 514.0, pc: 6.137e6, tb: 351.44, tmelt: 159.05, vc: 167e-6, dipole: 1.7, kappa: 0.174823,
		c: 2, h: 6, o: 1, constSrc: append(srcIUPACConstants, Source{"Chung association factor", "kappa = 0.174823", "Chung et al. (1988), Poling et al. 5th ed. section 9-4 (from memory)"}),
		psat:      [7]float64{73.304, -7122.3, -7.1424, 2.8853e-06, 2, 159.05, 514},
		sigmaForm: "mulero", sigma: []float64{513.9, 0.05, 0.952}, sigmaT: [2]float64{180.12, 513.15},
		rho:  [6]float64{1628.8, 0.27469, 514, 0.23178, 159.05, 514},
		mu:   [7]float64{7.875, 781.98, -3.0418, 0, 0, 200, 440},
		hvap: [7]float64{514, 55789, 0.31245, 0, 0, 159.05, 514},
		cp:   [7]float64{102640, -139.63, -0.030341, 0.0020386, 0, 159.05, 390},
		cpv:  [7]float64{4.396, 0.000628, 0.00005546, -7.024e-08, 2.685e-11, 50, 1000},
	})
}

func newMethanol() *Liquid {
	return newOrganic(organicData{
		id: "methanol", name: "Methanol", formula: "CH4O", cas: "67-56-1",
		m: 32.042e-3, tc: 512.5, pc: 8.084e6, tb: 337.75, tmelt: 175.47, vc: 118e-6, dipole: 1.7, kappa: 0.215175,
		c: 1, h: 4, o: 1, constSrc: append(srcIUPACConstants, Source{"Chung association factor", "kappa = 0.215175", "Chung et al. (1988), Poling et al. 5th ed. section 9-4 (from memory)"}),
		psat:      [7]float64{82.718, -6904.5, -8.8622, 7.4664e-06, 2, 175.47, 512.5},
		sigmaForm: "mulero", sigma: []float64{513.38, 0.22421, 1.3355, -0.21408, 1.677, 0.083233, 4.4402}, sigmaT: [2]float64{175.61, 508.15},
		rho:  [6]float64{2326.7, 0.27073, 512.5, 0.24713, 175.47, 512.5},
		mu:   [7]float64{-25.317, 1789.2, 2.069, 0, 0, 175.47, 337.85},
		hvap: [7]float64{512.5, 50451, 0.33594, 0, 0, 175.47, 512.5},
		cp:   [7]float64{105800, -362.23, 0.9379, 0, 0, 175.47, 400},
		cpv:  [7]float64{4.714, -0.006986, 0.00004211, -4.443e-08, 1.535e-11, 50, 1000},
	})
}

func newAcetone() *Liquid {
	return newOrganic(organicData{
		id: "acetone", name: "Acetone", formula: "C3H6O", cas: "67-64-1",
		m: 3*12.011e-3 + 6*1.008e-3 + 15.999e-3, tc: 508.2, pc: 4.701e6, tb: 329.22, tmelt: 178.45, vc: 209e-6, dipole: 2.9,
		c: 3, h: 6, o: 1, constSrc: srcMemoryConstants,
		psat:      [7]float64{69.006, -5599.6, -7.0985, 6.2237e-06, 2, 178.45, 508.2},
		sigmaForm: "mulero", sigma: []float64{508.1, 0.0633, 1.16}, sigmaT: [2]float64{182.06, 353.15},
		rho:  [6]float64{1233.2, 0.25886, 508.2, 0.2913, 178.45, 508.2},
		mu:   [7]float64{-14.918, 1023.4, 0.5961, 0, 0, 190, 329.44},
		hvap: [7]float64{508.2, 42150, 0.3397, 0, 0, 178.45, 508.2},
		cp:   [7]float64{135600, -177, 0.2837, 0.000689, 0, 178.45, 329.44},
		cpv:  [7]float64{5.126, 0.001511, 0.00005731, -7.177e-08, 2.728e-11, 200, 1000},
	})
}

// surrogate reuses a compound's correlations under an id and name of its own.
func surrogate(base *Liquid, id, name, note string) *Liquid {
	s := *base
	s.ID, s.Name, s.Surrogate = id, name, note
	s.constants = append(append([]Source(nil), base.constants...),
		Source{"surrogate choice", note, "see Surrogate note"})
	return &s
}

func newKeroseneSurrogate() *Liquid {
	return surrogate(newDodecane(), "kerosene-surrogate", "Kerosene / Jet A surrogate (n-dodecane)",
		"Single-component stand-in for kerosene and Jet A: n-dodecane, the most common one-component "+
			"kerosene surrogate in the combustion literature (Dagaut & Cathonnet, Prog. Energy Combust. Sci. 32 "+
			"(2006) 48, from memory). Its boiling point (489 K) lies inside the Jet A distillation range and its "+
			"ignition behaviour is close, but its density (about 745 kg/m3 at 25 degC) is about 6 % below Jet A "+
			"and it has no light or aromatic fraction, so it evaporates as one boiling point, not a range.")
}

func newDieselSurrogate() *Liquid {
	return surrogate(newHexadecane(), "diesel-surrogate", "Diesel surrogate (n-hexadecane)",
		"Single-component stand-in for diesel fuel: n-hexadecane (cetane), the reference compound of the "+
			"cetane-number scale and the usual one-component diesel surrogate (Pitz & Mueller, Prog. Energy "+
			"Combust. Sci. 37 (2011) 330, from memory). It freezes at 291 K (18 degC), far above diesel's cloud "+
			"point, has no aromatics and a single boiling point (560 K, near the middle of the diesel range); "+
			"expect slower early evaporation than real diesel.")
}
