package atomize

import (
	"fmt"
	"math"
	"sort"

	"fogbench/calc/valid"
)

// point is one resolved operating point: the validated inputs and the
// quantities derived from them.
type point struct {
	p  Properties
	in map[string]float64

	dp, mdot, fn, cd, d0, uL float64
	hasMass                  bool // the liquid mass flow is known
	flowKnown                bool // FN and C_D are known (ΔP and flow known)
	massFromPressure         bool // ṁ_L follows from ΔP through FN, C_D or geometry

	cone       float64 // full cone angle, deg
	coneKnown  bool
	coneSource string
	film       float64 // film thickness, m
	filmKnown  bool
	filmSource string

	warnings, notes []string
}

func (pt *point) has(name string) bool { _, ok := pt.in[name]; return ok }

func (pt *point) warnf(format string, args ...any) {
	pt.warnings = append(pt.warnings, fmt.Sprintf(format, args...))
}

func (pt *point) notef(format string, args ...any) {
	pt.notes = append(pt.notes, fmt.Sprintf(format, args...))
}

// omega is the rotational speed in rad/s from speed_rpm.
func (pt *point) omega() float64 { return pt.in[inSpeed] * 2 * math.Pi / 60 }

// volumeRatio is Q_L/Q_A = (ṁ_L/ρ_L)/(ALR ṁ_L/ρ_A) = ρ_A/(ρ_L ALR).
func (pt *point) volumeRatio() float64 {
	return pt.p.GasDensity / (pt.p.LiquidDensity * pt.in[inALR])
}

// quantity looks up a quantity a validity range may refer to.
func (pt *point) quantity(name string) (float64, bool) {
	switch name {
	case qLiquidDensity:
		return pt.p.LiquidDensity, true
	case qLiquidViscosity:
		return pt.p.LiquidViscosity, true
	case qSurfaceTension:
		return pt.p.SurfaceTension, true
	case qGasDensity:
		return pt.p.GasDensity, true
	case qLiquidVelocity:
		return pt.uL, pt.uL > 0
	case inMassFlow:
		return pt.mdot, pt.hasMass
	case inDeltaP:
		return pt.dp, pt.dp > 0
	}
	v, ok := pt.in[name]
	return v, ok
}

// inputField is the case-file path of an input.
func inputField(name string) string { return "distribution.inputs." + name }

// missing reports an input that is needed but absent.
func missing(name, msg string) error {
	return &valid.FieldError{Field: inputField(name), Message: msg}
}

// validateProperties rejects NaN, ±Inf, zero and negative properties.
func validateProperties(p Properties) error {
	checks := []struct {
		field string
		v     float64
	}{
		{"properties.liquid_density_kg_m3", p.LiquidDensity},
		{"properties.liquid_viscosity_pa_s", p.LiquidViscosity},
		{"properties.surface_tension_n_m", p.SurfaceTension},
		{"properties.gas_density_kg_m3", p.GasDensity},
		{"properties.gas_viscosity_pa_s", p.GasViscosity},
	}
	for _, c := range checks {
		if err := valid.Positive(c.field, c.v); err != nil {
			return err
		}
	}
	return nil
}

// newPoint validates the inputs of family f and resolves the operating point.
func newPoint(f *family, inputs map[string]float64, props Properties) (*point, error) {
	if err := validateProperties(props); err != nil {
		return nil, err
	}
	names := make([]string, 0, len(inputs))
	for k := range inputs {
		names = append(names, k)
	}
	sort.Strings(names)
	for _, k := range names {
		v := inputs[k]
		if _, ok := f.inputInfo(k); !ok {
			return nil, valid.Errorf(inputField(k), v, "is not an input of family %s; its inputs are: %s", f.info.ID, f.inputNames())
		}
		if err := valid.Positive(inputField(k), v); err != nil {
			return nil, err
		}
		switch k {
		case inCD:
			if v > 1 {
				return nil, valid.Errorf(inputField(k), v, "a discharge coefficient cannot exceed 1")
			}
		case inConeAngle:
			if v >= 180 {
				return nil, valid.Errorf(inputField(k), v, "a full cone angle must be below 180 deg")
			}
		}
	}
	for _, info := range f.info.Inputs {
		if _, ok := inputs[info.Name]; info.Required && !ok {
			return nil, missing(info.Name, fmt.Sprintf("is required for family %s (%s, %s)", f.info.ID, info.Description, info.Unit))
		}
	}
	pt := &point{p: props, in: inputs}
	for _, k := range names {
		info, _ := f.inputInfo(k)
		if v := inputs[k]; v < info.Min || v > info.Max {
			pt.warnf("%s = %s %s is outside the usual range %s–%s %s (common practice, no source)",
				k, valid.FormatValue(v), info.Unit, valid.FormatValue(info.Min), valid.FormatValue(info.Max), info.Unit)
		}
	}
	if err := f.resolve(pt); err != nil {
		return nil, err
	}
	return pt, nil
}

// resolveLiquidFlow sets ΔP, d0 and the liquid flow from exactly one of
// mass_flow_kg_s, flow_number_m2 or discharge_coefficient; when none is
// given, fallback (if any) supplies a discharge coefficient from geometry.
func resolveLiquidFlow(pt *point, fallbackHint string, fallback func(*point) (float64, error)) error {
	pt.dp = pt.in[inDeltaP]
	pt.d0 = pt.in[inOrificeD]
	rho := pt.p.LiquidDensity
	var given []string
	for _, n := range []string{inMassFlow, inFlowNumber, inCD} {
		if pt.has(n) {
			given = append(given, n)
		}
	}
	if len(given) > 1 {
		return valid.Errorf(inputField(given[1]), pt.in[given[1]],
			"give only one of mass_flow_kg_s, flow_number_m2 and discharge_coefficient (%s is also given)", given[0])
	}
	switch {
	case pt.has(inMassFlow):
		pt.mdot = pt.in[inMassFlow]
	case pt.has(inFlowNumber):
		pt.mdot = massFlowFromFlowNumber(pt.in[inFlowNumber], rho, pt.dp)
		pt.massFromPressure = true
	case pt.has(inCD):
		pt.mdot = massFlowFromDischargeCoefficient(pt.in[inCD], rho, pt.dp, pt.d0)
		pt.massFromPressure = true
	default:
		if fallback == nil {
			return missing(inMassFlow, "give one of mass_flow_kg_s, flow_number_m2 and discharge_coefficient")
		}
		cd, err := fallback(pt)
		if err != nil {
			return err
		}
		if cd == 0 {
			return missing(inMassFlow, "give one of mass_flow_kg_s, flow_number_m2 and discharge_coefficient, or "+fallbackHint)
		}
		pt.mdot = massFlowFromDischargeCoefficient(cd, rho, pt.dp, pt.d0)
		pt.massFromPressure = true
	}
	pt.hasMass = true
	pt.flowKnown = true
	pt.fn = flowNumberSI(pt.mdot, rho, pt.dp)
	pt.cd = dischargeCoefficient(pt.mdot, rho, pt.dp, pt.d0)
	pt.uL = pt.mdot / (rho * orificeArea(pt.d0))
	if pt.cd > 1 {
		pt.warnf("the discharge coefficient is %.3g, above 1: this mass flow cannot pass the orifice at this pressure", pt.cd)
	}
	return nil
}

func resolvePlainOrifice(pt *point) error {
	var lichtarowicz float64
	if pt.has(inOrificeL) {
		lichtarowicz = lichtarowiczDischargeCoefficient(pt.in[inOrificeL], pt.in[inOrificeD])
	}
	fallback := func(pt *point) (float64, error) {
		if !pt.has(inOrificeL) {
			return 0, nil
		}
		if lichtarowicz <= 0.05 {
			return 0, valid.Errorf(inputField(inOrificeL), pt.in[inOrificeL],
				"the orifice is too long for the Lichtarowicz et al. (1965) discharge coefficient (C_D = %.3g)", lichtarowicz)
		}
		pt.notef("C_D = %.4f from the high-Reynolds-number limit of %s (%s); at low Reynolds number the real C_D is lower",
			lichtarowicz, relations[RelLichtarowicz].Citation.String(), relations[RelLichtarowicz].Status)
		return lichtarowicz, nil
	}
	if err := resolveLiquidFlow(pt, "orifice_length_m", fallback); err != nil {
		return err
	}
	usedLength := !pt.has(inMassFlow) && !pt.has(inFlowNumber) && !pt.has(inCD)
	if pt.has(inOrificeL) && !usedLength && lichtarowicz > 0 {
		pt.notef("for comparison, Lichtarowicz, Duggins & Markland (1965) give C_D,max = %.4f for l0/d0 = %.3g",
			lichtarowicz, pt.in[inOrificeL]/pt.in[inOrificeD])
	}
	return nil
}

func resolvePressureSwirl(pt *point) error {
	hasDs, hasAp := pt.has(inSwirlD), pt.has(inPortArea)
	if hasDs != hasAp {
		if hasDs {
			return missing(inPortArea, "give inlet_port_area_m2 together with swirl_chamber_diameter_m")
		}
		return missing(inSwirlD, "give swirl_chamber_diameter_m together with inlet_port_area_m2")
	}
	geometry := hasDs && hasAp
	fallback := func(pt *point) (float64, error) {
		if !geometry {
			return 0, nil
		}
		cd := rizkLefebvreDischargeCoefficient(pt.in[inPortArea], pt.in[inSwirlD], pt.in[inOrificeD])
		pt.notef("C_D = %.4f from the swirl-chamber geometry, %s", cd, relationSource(RelRizkLefebvreCD))
		return cd, nil
	}
	if err := resolveLiquidFlow(pt, "swirl_chamber_diameter_m with inlet_port_area_m2", fallback); err != nil {
		return err
	}
	p := pt.p
	// The measured-film constant 2.7 (Suyari & Lefebvre 1986) is the one
	// open code citing Wang & Lefebvre (1987) feeds to their SMD; Rizk &
	// Lefebvre's theoretical 3.66 is reported beside it.
	pt.film = suyariLefebvreFilmThickness(pt.d0, pt.fn, p.LiquidViscosity, p.LiquidDensity, pt.dp)
	pt.filmKnown = true
	pt.filmSource = relationSource(RelSuyariFilm)
	pt.notef("film thickness %.4g µm (constant 2.7, Suyari & Lefebvre 1986) is the one fed to Wang & Lefebvre (1987); "+
		"Rizk & Lefebvre's (1985) theoretical constant 3.66 gives %.4g µm (%s)",
		pt.film*1e6, rizkLefebvreFilmThickness(pt.d0, pt.mdot, p.LiquidViscosity, p.LiquidDensity, pt.dp)*1e6,
		relations[RelRizkLefebvreFilm].Status)
	if pt.has(inConeAngle) {
		pt.cone, pt.coneKnown, pt.coneSource = pt.in[inConeAngle], true, "input (cone_angle_deg)"
	}
	if geometry {
		cone := rizkLefebvreConeAngle(pt.in[inPortArea], pt.in[inSwirlD], pt.d0, pt.dp, p.LiquidDensity, p.LiquidViscosity)
		switch {
		case pt.coneKnown:
			pt.notef("Rizk & Lefebvre (1985) give a full cone angle of %.1f deg from the geometry (%s)", cone, relations[RelRizkLefebvreCone].Status)
		case cone >= 180:
			pt.warnf("Rizk & Lefebvre (1985) give a cone angle of %.0f deg here, which is not physical; no cone angle is reported", cone)
		default:
			pt.cone, pt.coneKnown = cone, true
			pt.coneSource = relationSource(RelRizkLefebvreCone)
		}
	}
	return nil
}

func resolveAirblast(pt *point) error {
	if pt.has(inMassFlow) {
		pt.mdot, pt.hasMass = pt.in[inMassFlow], true
	}
	if pt.has(inDeltaP) {
		pt.dp = pt.in[inDeltaP]
	}
	if pt.has(inOrificeD) {
		pt.d0 = pt.in[inOrificeD]
	}
	rho := pt.p.LiquidDensity
	if pt.hasMass && pt.dp > 0 {
		pt.fn = flowNumberSI(pt.mdot, rho, pt.dp)
		pt.flowKnown = pt.d0 > 0
		if pt.flowKnown {
			pt.cd = dischargeCoefficient(pt.mdot, rho, pt.dp, pt.d0)
		} else {
			pt.notef("give orifice_diameter_m to get the discharge coefficient")
		}
	}
	if pt.hasMass && pt.d0 > 0 {
		pt.uL = pt.mdot / (rho * orificeArea(pt.d0))
	}
	if pt.flowKnown && pt.cd > 1 {
		pt.warnf("the discharge coefficient is %.3g, above 1: this mass flow cannot pass the orifice at this pressure", pt.cd)
	}
	return nil
}

func resolveAirAssist(pt *point) error { return resolveLiquidFlow(pt, "", nil) }

func resolveEffervescent(pt *point) error {
	if err := resolveLiquidFlow(pt, "", nil); err != nil {
		return err
	}
	pt.notef("flow number and discharge coefficient are the liquid-only definitions; " +
		"the gas in the orifice raises the pressure drop, which these definitions do not model")
	return nil
}

func resolveRotary(pt *point) error {
	if pt.has(inMassFlow) {
		pt.mdot, pt.hasMass = pt.in[inMassFlow], true
	}
	pt.warnf("walton-prewett-1949 holds in the direct-drop regime only; its flow-rate limit is not recalled, " +
		"so the regime is not checked")
	return nil
}

func resolveUltrasonic(pt *point) error {
	if pt.has(inMassFlow) {
		pt.mdot, pt.hasMass = pt.in[inMassFlow], true
	}
	pt.notef("capillary wavelength λ_c = %.4g µm (Lang 1962)",
		capillaryWavelength(pt.p.SurfaceTension, pt.p.LiquidDensity, pt.in[inFrequency])*1e6)
	return nil
}
