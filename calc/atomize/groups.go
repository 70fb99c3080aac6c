package atomize

import "math"

// Dimensionless groups. The definitions are the standard ones of fluid
// mechanics; the regime each indicates is stated with its source, or marked
// "common practice, no source".

// reynolds is Re = ρ U L/μ.
func reynolds(rho, u, l, mu float64) float64 { return rho * u * l / mu }

// weber is We = ρ U² L/σ.
func weber(rho, u, l, sigma float64) float64 { return rho * u * u * l / sigma }

// ohnesorge is Oh = μ/(ρ σ L)^0.5.
func ohnesorge(mu, rho, sigma, l float64) float64 { return mu / math.Sqrt(rho*sigma*l) }

// The regime bounds are from memory, not checked against the printed source.
const reitzSource = "Reitz (1978) jet regimes as quoted by Lin & Reitz (1998), Annu. Rev. Fluid Mech. 30, 85; bounds not checked here"

// jetRegime classifies a round liquid jet by its gas Weber number:
// Rayleigh We_G < 0.4 (or < 1.2 + 3.41 Oh^0.9), first wind-induced up to 13,
// second wind-induced up to 40.3, atomization above (reitzSource).
func jetRegime(weG, oh float64) string {
	switch {
	case weG < math.Max(0.4, 1.2+3.41*math.Pow(oh, 0.9)):
		return "Rayleigh breakup (drops larger than the jet)"
	case weG < 13:
		return "first wind-induced breakup"
	case weG < 40.3:
		return "second wind-induced breakup"
	}
	return "atomization"
}

func reynoldsGroup(re float64, length string) Group {
	regime := "turbulent orifice flow"
	if re < 2300 {
		regime = "laminar orifice flow"
	}
	return Group{
		Name: "liquid Reynolds number", Symbol: "Re_L", Definition: "ρ_L U_L " + length + "/μ_L", Value: re,
		Regime: regime, Source: "pipe-flow transition near Re = 2300; common practice, no source",
	}
}

func ohnesorgeGroup(oh float64, length string) Group {
	return Group{
		Name: "Ohnesorge number", Symbol: "Oh", Definition: "μ_L/(ρ_L σ " + length + ")^0.5", Value: oh,
		Regime: "no boundary applied", Source: "the Ohnesorge (1936) chart boundaries are not recalled",
	}
}

// jetGroups are the groups of a plain-orifice jet at its mean orifice
// velocity U_L = ṁ_L/(ρ_L A0), based on d0.
func jetGroups(pt *point) []Group {
	p := pt.p
	weG := weber(p.GasDensity, pt.uL, pt.d0, p.SurfaceTension)
	oh := ohnesorge(p.LiquidViscosity, p.LiquidDensity, p.SurfaceTension, pt.d0)
	return []Group{
		reynoldsGroup(reynolds(p.LiquidDensity, pt.uL, pt.d0, p.LiquidViscosity), "d0"),
		{Name: "gas Weber number", Symbol: "We_G", Definition: "ρ_A U_L² d0/σ", Value: weG,
			Regime: jetRegime(weG, oh), Source: reitzSource},
		{Name: "liquid Weber number", Symbol: "We_L", Definition: "ρ_L U_L² d0/σ",
			Value:  weber(p.LiquidDensity, pt.uL, pt.d0, p.SurfaceTension),
			Regime: "no boundary applied", Source: "none"},
		ohnesorgeGroup(oh, "d0"),
	}
}

// swirlGroups are the groups of a pressure-swirl atomizer at the ideal
// (Bernoulli) velocity U = (2 ΔP_L/ρ_L)^0.5, based on d0.
func swirlGroups(pt *point) []Group {
	p := pt.p
	u := math.Sqrt(2 * pt.dp / p.LiquidDensity)
	none := "no published regime boundary is applied to pressure-swirl atomizers here"
	return []Group{
		{Name: "liquid Reynolds number", Symbol: "Re_L", Definition: "ρ_L U d0/μ_L, U = (2 ΔP_L/ρ_L)^0.5",
			Value: reynolds(p.LiquidDensity, u, pt.d0, p.LiquidViscosity), Regime: none, Source: "none"},
		{Name: "gas Weber number", Symbol: "We_G", Definition: "ρ_A U² d0/σ, U = (2 ΔP_L/ρ_L)^0.5",
			Value: weber(p.GasDensity, u, pt.d0, p.SurfaceTension), Regime: none, Source: "none"},
		ohnesorgeGroup(ohnesorge(p.LiquidViscosity, p.LiquidDensity, p.SurfaceTension, pt.d0), "d0"),
	}
}

// airGroups are the groups of the air-driven families: the air Weber number
// on the prefilmer diameter (or d0), the Ohnesorge number and the ALR.
func airGroups(pt *point) []Group {
	p := pt.p
	var gs []Group
	l, lname := 0.0, ""
	switch {
	case pt.has(inPrefilmerD):
		l, lname = pt.in[inPrefilmerD], "D_p"
	case pt.has(inOrificeD):
		l, lname = pt.in[inOrificeD], "d0"
	}
	if l > 0 && pt.has(inAirVelocity) {
		gs = append(gs, Group{Name: "air Weber number", Symbol: "We_A", Definition: "ρ_A U_A² " + lname + "/σ",
			Value:  weber(p.GasDensity, pt.in[inAirVelocity], l, p.SurfaceTension),
			Regime: "no boundary applied", Source: "none"})
	}
	if l > 0 {
		gs = append(gs, ohnesorgeGroup(ohnesorge(p.LiquidViscosity, p.LiquidDensity, p.SurfaceTension, l), lname))
	}
	if pt.has(inALR) {
		gs = append(gs, Group{Name: "air/liquid mass ratio", Symbol: "ALR", Definition: "ṁ_A/ṁ_L", Value: pt.in[inALR],
			Regime: alrRegime(pt.in[inALR]), Source: "common practice, no source"})
	}
	return gs
}

// alrRegime says what kind of pneumatic atomizer an ALR is typical of.
func alrRegime(alr float64) string {
	if alr < 1 {
		return "below 1: typical of air-assist and effervescent atomizers, low for airblast"
	}
	return "1 or more: typical of airblast atomizers"
}

// rotaryGroups are the groups of a rotary disk at its rim speed U = ω D/2.
func rotaryGroups(pt *point) []Group {
	p := pt.p
	d := pt.in[inDiskD]
	u := pt.omega() * d / 2
	return []Group{{
		Name: "rim Weber number", Symbol: "We_rim", Definition: "ρ_L (ω D/2)² D/σ",
		Value: weber(p.LiquidDensity, u, d, p.SurfaceTension), Regime: "no boundary applied",
		Source: "the direct-drop/ligament transition is not recalled",
	}}
}
