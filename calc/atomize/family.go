package atomize

import (
	"math"
	"sort"
	"strings"
)

// Input names, as they appear in a case file under distribution.inputs.
const (
	inDeltaP      = "delta_p_pa"
	inMassFlow    = "mass_flow_kg_s"
	inFlowNumber  = "flow_number_m2"
	inCD          = "discharge_coefficient"
	inOrificeD    = "orifice_diameter_m"
	inOrificeL    = "orifice_length_m"
	inSwirlD      = "swirl_chamber_diameter_m"
	inPortArea    = "inlet_port_area_m2"
	inConeAngle   = "cone_angle_deg"
	inAirVelocity = "air_velocity_m_s"
	inALR         = "alr"
	inPrefilmerD  = "prefilmer_diameter_m"
	inHydraulicD  = "hydraulic_diameter_m"
	inSpeed       = "speed_rpm"
	inDiskD       = "disk_diameter_m"
	inFrequency   = "frequency_hz"
)

// Derived and property quantities that validity ranges may refer to.
const (
	qLiquidVelocity  = "liquid_velocity_m_s"
	qLiquidViscosity = "liquid_viscosity_pa_s"
	qLiquidDensity   = "liquid_density_kg_m3"
	qSurfaceTension  = "surface_tension_n_m"
	qGasDensity      = "gas_density_kg_m3"
)

// inputCatalog holds every input once; families pick from it. Min, Max and
// Typical are typical of the trade (common practice, no source).
var inputCatalog = map[string]InputInfo{
	inDeltaP:      {Unit: "Pa", Description: "liquid injection pressure differential across the atomizer", Typical: 1e6, Min: 1e4, Max: 3e8},
	inMassFlow:    {Unit: "kg/s", Description: "liquid mass flow", Typical: 0.01, Min: 1e-7, Max: 10},
	inFlowNumber:  {Unit: "m²", Description: "flow number FN = ṁ_L/(ρ_L ΔP_L)^0.5", Typical: 3.6e-7, Min: 1e-11, Max: 1e-4},
	inCD:          {Unit: "1", Description: "discharge coefficient C_D = ṁ_L/(A0 (2 ρ_L ΔP_L)^0.5)", Typical: 0.35, Min: 0.05, Max: 1},
	inOrificeD:    {Unit: "m", Description: "final orifice diameter d0", Typical: 1e-3, Min: 5e-5, Max: 2e-2},
	inOrificeL:    {Unit: "m", Description: "orifice length l0", Typical: 2e-3, Min: 1e-5, Max: 0.1},
	inSwirlD:      {Unit: "m", Description: "swirl-chamber diameter D_s", Typical: 4e-3, Min: 2e-4, Max: 0.1},
	inPortArea:    {Unit: "m²", Description: "total inlet-port area A_p of the swirl chamber", Typical: 2e-6, Min: 1e-9, Max: 1e-3},
	inConeAngle:   {Unit: "deg", Description: "full spray cone angle 2θ, measured or from the maker's data", Typical: 80, Min: 5, Max: 170},
	inAirVelocity: {Unit: "m/s", Description: "air velocity relative to the liquid", Typical: 100, Min: 1, Max: 400},
	inALR:         {Unit: "1", Description: "air/liquid mass flow ratio", Typical: 3, Min: 0.01, Max: 20},
	inPrefilmerD:  {Unit: "m", Description: "prefilmer lip diameter D_p", Typical: 0.02, Min: 1e-3, Max: 0.2},
	inHydraulicD:  {Unit: "m", Description: "hydraulic mean diameter D_h of the air exit duct", Typical: 0.02, Min: 1e-3, Max: 0.2},
	inSpeed:       {Unit: "rpm", Description: "disk or cup rotational speed", Typical: 10000, Min: 100, Max: 1e5},
	inDiskD:       {Unit: "m", Description: "disk or cup diameter D", Typical: 0.05, Min: 5e-3, Max: 0.5},
	inFrequency:   {Unit: "Hz", Description: "driving frequency of the ultrasonic horn", Typical: 40e3, Min: 1e4, Max: 1e7},
}

// rangeCommon labels validity bounds that are not the papers' own.
const rangeCommon = "common practice, no source: the paper's own data range was not read"

// input builds the InputInfo of name from the catalog.
func input(name string, required bool) InputInfo {
	in := inputCatalog[name]
	in.Name = name
	in.Required = required
	return in
}

// inputTypical is input with a family-specific typical value.
func inputTypical(name string, required bool, typical float64) InputInfo {
	in := input(name, required)
	in.Typical = typical
	return in
}

// correlation is one SMD correlation with its evaluation.
type correlation struct {
	info CorrelationInfo
	// needs reports the first missing input as a field error, nil when the
	// correlation applies at this point.
	needs func(pt *point) error
	smd   func(pt *point) float64
}

// family is one atomizer family with its resolution of inputs into an
// operating point.
type family struct {
	info    FamilyInfo
	corrs   []*correlation
	resolve func(pt *point) error
	groups  func(pt *point) []Group
}

var families = buildFamilies()

var familyByID = func() map[string]*family {
	m := make(map[string]*family, len(families))
	for _, f := range families {
		m[f.info.ID] = f
	}
	return m
}()

// Families lists the atomizer families with their inputs and correlations.
// The slices are copies; changing them does not change the package.
func Families() []FamilyInfo {
	out := make([]FamilyInfo, len(families))
	for i, f := range families {
		out[i] = copyInfo(f.info)
	}
	return out
}

func copyInfo(fi FamilyInfo) FamilyInfo {
	fi.Inputs = append([]InputInfo(nil), fi.Inputs...)
	cs := make([]CorrelationInfo, len(fi.Correlations))
	for i, c := range fi.Correlations {
		c.Ranges = append([]Range(nil), c.Ranges...)
		cs[i] = c
	}
	fi.Correlations = cs
	return fi
}

func familyIDs() string {
	ids := make([]string, len(families))
	for i, f := range families {
		ids[i] = f.info.ID
	}
	return strings.Join(ids, ", ")
}

func (f *family) correlation(id string) *correlation {
	for _, c := range f.corrs {
		if c.info.ID == id {
			return c
		}
	}
	return nil
}

func (f *family) correlationIDs() string {
	ids := make([]string, len(f.corrs))
	for i, c := range f.corrs {
		ids[i] = c.info.ID
	}
	return strings.Join(ids, ", ")
}

func (f *family) inputInfo(name string) (InputInfo, bool) {
	for _, in := range f.info.Inputs {
		if in.Name == name {
			return in, true
		}
	}
	return InputInfo{}, false
}

func (f *family) inputNames() string {
	names := make([]string, len(f.info.Inputs))
	for i, in := range f.info.Inputs {
		names[i] = in.Name
	}
	sort.Strings(names)
	return strings.Join(names, ", ")
}

// Rosin–Rammler spreads per family. Lefebvre (1989) gives q between about
// 1.5 and 4 for most sprays (from memory); the single values below are
// common practice, no source.
const qSource = "common practice, no source (Lefebvre's Atomization and Sprays (1989) quotes q ≈ 1.5–4 for most sprays; not checked here)"

func buildFamilies() []*family {
	return []*family{
		plainOrificeFamily(),
		pressureSwirlFamily(),
		airblastFamily(),
		airAssistFamily(),
		rotaryFamily(),
		ultrasonicFamily(),
		effervescentFamily(),
	}
}

func plainOrificeFamily() *family {
	velocityRange := Range{Quantity: qLiquidVelocity, Min: 5, Max: 300, Source: rangeCommon}
	f := &family{
		info: FamilyInfo{
			ID:          "plain-orifice",
			Name:        "Plain orifice (jet)",
			Description: "A round liquid jet from a plain orifice, broken up by the surrounding gas.",
			Inputs: []InputInfo{
				input(inDeltaP, true), input(inOrificeD, true),
				input(inMassFlow, false), input(inCD, false), input(inOrificeL, false),
			},
			DefaultCorrelation:  "harmon-1955",
			RosinRammlerQ:       2.0,
			RosinRammlerQSource: qSource,
		},
		resolve: resolvePlainOrifice,
		groups:  jetGroups,
	}
	f.corrs = []*correlation{
		{
			info: CorrelationInfo{
				ID: "harmon-1955", Name: "Harmon (1955)", Quantity: quantitySMD,
				Equation:    "SMD = 3330 d0^0.3 μ_L^0.07 ρ_L^−0.648 σ^−0.15 U_L^−0.55 μ_A^0.78 ρ_A^−0.052",
				FittedUnits: "SI (dimensional); the units the constant belongs to are not confirmed",
				Validity:    "low-speed jets in air; " + rangeCommon,
				Ranges:      []Range{velocityRange},
				Provenance: unconfirmed(Citation{Authors: "Harmon, D. B.", Journal: "J. Franklin Inst.", Year: 1955, Volume: "259", Pages: "519"},
					"no open text quoting this form was found"),
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return harmonSMD(pt.d0, p.LiquidViscosity, p.LiquidDensity, p.SurfaceTension, pt.uL, p.GasViscosity, p.GasDensity)
			},
		},
		{
			info: CorrelationInfo{
				ID: "merrington-richardson-1947", Name: "Merrington & Richardson (1947)", Quantity: quantitySMD,
				Equation:    "SMD = 500 d0^1.2 ν_L^0.2 / U_L",
				FittedUnits: "SI (dimensional): d0 m, ν_L m²/s, U_L m/s, SMD m",
				Validity:    "jets into still air; " + rangeCommon,
				Ranges:      []Range{velocityRange},
				Provenance: checkedAgainst(Citation{Authors: "Merrington, A. C. & Richardson, E. G.", Title: "The break-up of liquid jets",
					Journal: "Proc. Phys. Soc.", Year: 1947, Volume: "59", Pages: "1"},
					srcSVEC+": SMD = 500 d0^1.2 ν_L^0.2/U_L with d0 in m, ν_L in m²/s, U_L in m/s", ""),
			},
			smd: func(pt *point) float64 {
				return merringtonRichardsonSMD(pt.d0, pt.p.LiquidViscosity/pt.p.LiquidDensity, pt.uL)
			},
		},
		{
			info: CorrelationInfo{
				ID: "elkotb-1982", Name: "Elkotb (1982)", Quantity: quantitySMD,
				Equation:    "SMD[µm] = 6156 ν_L^0.385 (σ ρ_L)^0.737 ρ_A^0.06 ΔP_L[bar]^−0.54, i.e. SMD = 3.0853 ν_L^0.385 (σ ρ_L)^0.737 ρ_A^0.06 ΔP_L^−0.54 in SI",
				FittedUnits: "SMD µm, ν_L m²/s, σ N/m, ρ kg/m³, ΔP_L bar; evaluated in SI with the exact conversion",
				Validity:    "diesel injection; " + rangeCommon,
				Ranges:      []Range{{Quantity: inDeltaP, Min: 5e6, Max: 3e8, Source: rangeCommon}},
				Provenance: checkedAgainst(Citation{Authors: "Elkotb, M. M.", Title: "Fuel atomization for spray modelling",
					Journal: "Prog. Energy Combust. Sci.", Year: 1982, Volume: "8", Pages: "61"},
					srcSVEC+": 6156 with ν_L in m²/s and ΔP_L in bar, SMD in µm", ""),
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return elkotbSMD(p.LiquidViscosity/p.LiquidDensity, p.SurfaceTension, p.LiquidDensity, p.GasDensity, pt.dp)
			},
		},
	}
	finishFamily(f)
	return f
}

func pressureSwirlFamily() *family {
	pressureRange := Range{Quantity: inDeltaP, Min: 1e5, Max: 1e7, Source: rangeCommon}
	f := &family{
		info: FamilyInfo{
			ID:          "pressure-swirl",
			Name:        "Pressure-swirl (simplex)",
			Description: "Liquid swirled in a chamber leaves the orifice as a conical sheet.",
			Inputs: []InputInfo{
				input(inDeltaP, true), input(inOrificeD, true),
				input(inMassFlow, false), input(inFlowNumber, false), input(inCD, false),
				input(inSwirlD, false), input(inPortArea, false), input(inConeAngle, false),
			},
			DefaultCorrelation:  "lefebvre-1987",
			RosinRammlerQ:       2.5,
			RosinRammlerQSource: qSource,
		},
		resolve: resolvePressureSwirl,
		groups:  swirlGroups,
	}
	f.corrs = []*correlation{
		{
			info: CorrelationInfo{
				ID: "lefebvre-1987", Name: "Lefebvre (1987)", Quantity: quantitySMD,
				Equation:    "SMD = 2.25 σ^0.25 μ_L^0.25 ṁ_L^0.25 ΔP_L^−0.5 ρ_A^−0.25",
				FittedUnits: "SI (dimensional)",
				Validity:    rangeCommon,
				Ranges:      []Range{pressureRange},
				Provenance: checkedAgainst(Citation{Authors: "Lefebvre, A. H.", Journal: "Atomisation Spray Technol.", Year: 1987, Volume: "3", Pages: "37"},
					srcPerseus+" (SMDlev): SMD = 2.25 σ^0.25 μ_L^0.25 ṁ_L^0.25 ρ_A^−0.25 ΔP_L^−0.5 in SI", ""),
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return lefebvre1987SMD(p.SurfaceTension, p.LiquidViscosity, pt.mdot, pt.dp, p.GasDensity)
			},
		},
		{
			info: CorrelationInfo{
				ID: "radcliffe-1955", Name: "Radcliffe (1955)", Quantity: quantitySMD,
				Equation:    "SMD = 7.3 σ^0.6 ν_L^0.2 ṁ_L^0.25 ΔP_L^−0.4",
				FittedUnits: "SI (dimensional)",
				Validity:    "data of Needham and of Joyce, low-viscosity fuels; numeric bounds " + rangeCommon,
				Ranges:      []Range{pressureRange, {Quantity: qLiquidViscosity, Min: 3e-4, Max: 3e-3, Source: rangeCommon}},
				Provenance: checkedAgainst(Citation{Authors: "Radcliffe, A.", Journal: "Proc. Inst. Mech. Eng.", Year: 1955, Volume: "169", Pages: "93"},
					srcPerseus+" (SMDrad): SMD = 7.3 σ^0.6 μ_L^0.2 ρ_L^−0.2 ṁ_L^0.25 ΔP_L^−0.4 in SI, the same as ν_L^0.2", ""),
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return radcliffeSMD(p.SurfaceTension, p.LiquidViscosity/p.LiquidDensity, pt.mdot, pt.dp)
			},
		},
		{
			info: CorrelationInfo{
				ID: "jasuja-1979", Name: "Jasuja (1979)", Quantity: quantitySMD,
				Equation:    "SMD = 4.4 σ^0.6 ν_L^0.16 ṁ_L^0.22 ΔP_L^−0.43",
				FittedUnits: "SI (dimensional)",
				Validity:    "kerosene, gas oil and residual oils; numeric bounds " + rangeCommon,
				Ranges:      []Range{pressureRange, {Quantity: qLiquidViscosity, Min: 5e-4, Max: 5e-2, Source: rangeCommon}},
				Provenance: checkedAgainst(Citation{Authors: "Jasuja, A. K.", Journal: "ASME J. Eng. Power", Year: 1979, Volume: "101", Pages: "250"},
					srcPerseus+" (SMDjas): SMD = 4.4 σ^0.6 μ_L^0.16 ρ_L^−0.16 ṁ_L^0.22 ΔP_L^−0.43 in SI, the same as ν_L^0.16", ""),
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return jasujaSMD(p.SurfaceTension, p.LiquidViscosity/p.LiquidDensity, pt.mdot, pt.dp)
			},
		},
		{
			info: CorrelationInfo{
				ID: "wang-lefebvre-1987", Name: "Wang & Lefebvre (1987)", Quantity: quantitySMD,
				Equation: "SMD = 4.52 [σ μ_L²/(ρ_A ΔP_L²)]^0.25 (t cos θ)^0.25 + 0.39 [σ ρ_L/(ρ_A ΔP_L)]^0.25 (t cos θ)^0.75; " +
					"t = 2.7 [d0 ṁ_L μ_L/(ρ_L ΔP_L)]^0.25 (Suyari & Lefebvre 1986), θ = cone half-angle",
				FittedUnits: "dimensionally consistent",
				Validity:    rangeCommon,
				Ranges:      []Range{pressureRange},
				Provenance: checkedAgainst(Citation{Authors: "Wang, X. F. & Lefebvre, A. H.", Title: "Mean drop sizes from pressure-swirl nozzles",
					Journal: "J. Propulsion Power", Year: 1987, Volume: "3(1)", Pages: "11–18"},
					srcSVEC+": the form with the half angle θ, fed the film thickness t = 2.7 [d0 ṁ_L μ_L/(ρ_L ΔP_L)]^0.25",
					"fed the constant 3.66 of Rizk & Lefebvre (1985) instead, the SMD is (3.66/2.7)^0.25–(3.66/2.7)^0.75 times larger (8–26 %)"),
				Needs: "cone_angle_deg, or swirl_chamber_diameter_m with inlet_port_area_m2",
			},
			needs: func(pt *point) error {
				if !pt.coneKnown {
					return missing(inConeAngle, "wang-lefebvre-1987 needs the cone angle: give cone_angle_deg, or swirl_chamber_diameter_m with inlet_port_area_m2")
				}
				return nil
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return wangLefebvreSMD(p.SurfaceTension, p.LiquidViscosity, p.LiquidDensity, p.GasDensity, pt.dp, pt.film, pt.cone*math.Pi/360)
			},
		},
	}
	finishFamily(f)
	return f
}

// airblastVelocity is the relative-air-velocity range used for every
// airblast and air-assist correlation: subsonic air (common practice, no
// source).
var airblastVelocity = Range{Quantity: inAirVelocity, Min: 20, Max: 340, Source: rangeCommon}

func nukiyamaTanasawa() *correlation {
	return &correlation{
		info: CorrelationInfo{
			ID: "nukiyama-tanasawa-1939", Name: "Nukiyama & Tanasawa (1939)", Quantity: quantitySMD,
			Equation:    "SMD[µm] = (585/U_R) (σ/ρ_L)^0.5 + 597 [μ_L/(σ ρ_L)^0.5]^0.45 (1000 Q_L/Q_A)^1.5; Q_L/Q_A = ρ_A/(ρ_L ALR)",
			FittedUnits: "mixed cgs: SMD µm, U_R m/s, σ dyn/cm, ρ_L g/cm³, μ_L poise, Q_L/Q_A volume ratio",
			Validity: "small pneumatic nozzles; liquid density about 0.7–1.2 g/cm³, surface tension about 19–73 dyn/cm, " +
				"viscosity about 0.3–50 cP (" + ntRange + "); velocity bound " + rangeCommon,
			Ranges: []Range{
				airblastVelocity,
				{Quantity: qLiquidDensity, Min: 700, Max: 1200, Source: ntRange},
				{Quantity: qSurfaceTension, Min: 0.019, Max: 0.073, Source: ntRange},
				{Quantity: qLiquidViscosity, Min: 3e-4, Max: 5e-2, Source: ntRange},
			},
			Provenance: unconfirmed(Citation{Authors: "Nukiyama, S. & Tanasawa, Y.", Journal: "Trans. Soc. Mech. Eng. Japan", Year: 1939, Volume: "5", Pages: "62"},
				"fitted in mixed cgs units; no open text quoting the SMD form was found"),
		},
		smd: func(pt *point) float64 {
			p := pt.p
			return nukiyamaTanasawaSMD(p.SurfaceTension, p.LiquidViscosity, p.LiquidDensity, pt.in[inAirVelocity], pt.volumeRatio())
		},
	}
}

func airblastFamily() *family {
	alrRange := Range{Quantity: inALR, Min: 0.5, Max: 10, Source: rangeCommon}
	f := &family{
		info: FamilyInfo{
			ID:   "airblast",
			Name: "Airblast (prefilming and plain-jet)",
			Description: "A large flow of moderate-velocity air atomizes a liquid sheet spread on a prefilmer lip " +
				"(prefilming) or a liquid jet (plain-jet).",
			Inputs: []InputInfo{
				input(inAirVelocity, true), input(inALR, true),
				input(inPrefilmerD, false), input(inHydraulicD, false),
				input(inMassFlow, false), input(inOrificeD, false), input(inDeltaP, false),
			},
			DefaultCorrelation:  "rizk-lefebvre-1980",
			RosinRammlerQ:       2.5,
			RosinRammlerQSource: qSource,
		},
		resolve: resolveAirblast,
		groups:  airGroups,
	}
	needPrefilmer := func(pt *point) error {
		if !pt.has(inPrefilmerD) {
			return missing(inPrefilmerD, "prefilming correlations need prefilmer_diameter_m")
		}
		return nil
	}
	f.corrs = []*correlation{
		{
			info: CorrelationInfo{
				ID: "rizk-lefebvre-1980", Name: "Rizk & Lefebvre (1980), prefilming", Quantity: quantitySMD,
				Equation:    "SMD = 3.33e-3 (σ ρ_L D_p)^0.5/(ρ_A U_A) (1 + 1/ALR) + 13.0e-3 (μ_L²/(σ ρ_L))^0.425 D_p^0.575 (1 + 1/ALR)²",
				FittedUnits: "SI (dimensional)",
				Validity:    "prefilming airblast; " + rangeCommon,
				Ranges:      []Range{airblastVelocity, alrRange},
				Provenance: unconfirmed(Citation{Authors: "Rizk, N. K. & Lefebvre, A. H.", Journal: "ASME J. Eng. Power", Year: 1980, Volume: "102", Pages: "706"},
					"which of their prefilming papers (this one or AIAA J. 21 (1983) 1139) gives this form is not settled; "+
						"the two prefilming forms here differ by a factor of about 2.9 at the same point"),
				Needs: inPrefilmerD,
			},
			needs: needPrefilmer,
			smd: func(pt *point) float64 {
				p := pt.p
				return rizkLefebvrePrefilmingSMD(p.SurfaceTension, p.LiquidViscosity, p.LiquidDensity, p.GasDensity,
					pt.in[inAirVelocity], pt.in[inALR], pt.in[inPrefilmerD])
			},
		},
		{
			info: CorrelationInfo{
				ID: "elshanawany-lefebvre-1980", Name: "El-Shanawany & Lefebvre (1980), prefilming", Quantity: quantitySMD,
				Equation:    "SMD/D_h = (1 + 1/ALR) [0.33 (σ/(ρ_A U_A² D_p))^0.6 (ρ_L/ρ_A)^0.1 + 0.068 (μ_L²/(σ ρ_L D_p))^0.5]",
				FittedUnits: "dimensionally consistent",
				Validity:    "three similar atomizers, lip diameters 19.05, 38.10 and 76.20 mm (abstract, read); other bounds " + rangeCommon,
				Ranges: []Range{airblastVelocity, alrRange,
					{Quantity: inPrefilmerD, Min: 0.019, Max: 0.077, Source: "lip diameters of the tested atomizers, read in the paper's abstract"}},
				Provenance: unconfirmed(Citation{Authors: "El-Shanawany, M. S. & Lefebvre, A. H.", Journal: "J. Energy", Year: 1980, Volume: "4(4)", Pages: "184"},
					"the abstract (lip diameters 19.05, 38.10 and 76.20 mm, a dimensionally correct expression) was read, the expression was not"),
				Needs: inPrefilmerD + ", " + inHydraulicD,
			},
			needs: func(pt *point) error {
				if err := needPrefilmer(pt); err != nil {
					return err
				}
				if !pt.has(inHydraulicD) {
					return missing(inHydraulicD, "elshanawany-lefebvre-1980 needs hydraulic_diameter_m")
				}
				return nil
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return elShanawanyLefebvreSMD(p.SurfaceTension, p.LiquidViscosity, p.LiquidDensity, p.GasDensity,
					pt.in[inAirVelocity], pt.in[inALR], pt.in[inPrefilmerD], pt.in[inHydraulicD])
			},
		},
		{
			info: CorrelationInfo{
				ID: "lorenzetto-lefebvre-1977", Name: "Lorenzetto & Lefebvre (1977), plain-jet", Quantity: quantitySMD,
				Equation:    "SMD = 0.95 (σ ṁ_L)^0.33/(U_R ρ_L^0.37 ρ_A^0.30) (1 + 1/ALR)^1.70 + 0.13 μ_L (d0/(σ ρ_L))^0.5 (1 + 1/ALR)^1.70",
				FittedUnits: "SI (dimensional)",
				Validity:    "plain-jet airblast; " + rangeCommon,
				Ranges:      []Range{airblastVelocity, alrRange},
				Provenance:  unconfirmed(Citation{Authors: "Lorenzetto, G. E. & Lefebvre, A. H.", Journal: "AIAA J.", Year: 1977, Volume: "15(7)", Pages: "1006"}, ""),
				Needs:       inMassFlow + ", " + inOrificeD,
			},
			needs: func(pt *point) error {
				if !pt.hasMass {
					return missing(inMassFlow, "lorenzetto-lefebvre-1977 needs mass_flow_kg_s")
				}
				if !pt.has(inOrificeD) {
					return missing(inOrificeD, "lorenzetto-lefebvre-1977 needs orifice_diameter_m")
				}
				return nil
			},
			smd: func(pt *point) float64 {
				p := pt.p
				return lorenzettoLefebvreSMD(p.SurfaceTension, p.LiquidViscosity, p.LiquidDensity, p.GasDensity,
					pt.mdot, pt.in[inAirVelocity], pt.in[inALR], pt.in[inOrificeD])
			},
		},
		nukiyamaTanasawa(),
	}
	finishFamily(f)
	return f
}

func airAssistFamily() *family {
	nt := nukiyamaTanasawa()
	nt.info.Validity += ". Applied to air-assist atomizers as a pneumatic-nozzle estimate: common practice, no source; " +
		"no air-assist correlation could be stated reliably"
	f := &family{
		info: FamilyInfo{
			ID:   "air-assist",
			Name: "Air-assist",
			Description: "A pressure atomizer helped by a small flow of high-velocity air; the liquid flow follows " +
				"its own flow number or discharge coefficient.",
			Inputs: []InputInfo{
				inputTypical(inDeltaP, true, 3e5), input(inOrificeD, true), inputTypical(inAirVelocity, true, 150),
				inputTypical(inALR, true, 0.3), input(inMassFlow, false), input(inFlowNumber, false), input(inCD, false),
			},
			DefaultCorrelation:  "nukiyama-tanasawa-1939",
			RosinRammlerQ:       2.3,
			RosinRammlerQSource: qSource,
		},
		resolve: resolveAirAssist,
		groups:  airGroups,
		corrs:   []*correlation{nt},
	}
	finishFamily(f)
	return f
}

func rotaryFamily() *family {
	f := &family{
		info: FamilyInfo{
			ID:          "rotary",
			Name:        "Rotary disk or cup (direct-drop regime)",
			Description: "Liquid fed to a spinning disk or cup leaves the rim as single drops at low flow.",
			Inputs: []InputInfo{
				input(inSpeed, true), input(inDiskD, true), input(inMassFlow, false),
			},
			DefaultCorrelation:  "walton-prewett-1949",
			RosinRammlerQ:       4.0,
			RosinRammlerQSource: "common practice, no source (direct-drop sprays are narrow)",
		},
		resolve: resolveRotary,
		groups:  rotaryGroups,
	}
	f.corrs = []*correlation{{
		info: CorrelationInfo{
			ID: "walton-prewett-1949", Name: "Walton & Prewett (1949)", Quantity: "main-drop diameter (direct-drop regime)",
			Equation:    "d = (K/ω) (σ/(ρ_L D))^0.5, K = 3.8, ω in rad/s",
			FittedUnits: "dimensionally consistent",
			Validity: "direct-drop regime only (low flow); other authors quote K from about 2.7 to 4. " +
				"The flow limit of the regime is not recalled, so it is not checked; speed bound " + rangeCommon,
			Ranges: []Range{{Quantity: inSpeed, Min: 500, Max: 50000, Source: rangeCommon}},
			Provenance: checkedAgainst(Citation{Authors: "Walton, W. H. & Prewett, W. C.",
				Title:   "The production of sprays and mists of uniform drop size by means of spinning disc type sprayers",
				Journal: "Proc. Phys. Soc. B", Year: 1949, Volume: "62", Pages: "341"},
				"the paper's abstract (discovery.researcher.life record): d = 3.8 (T/(D ρ))^½/ω, with T the surface tension, "+
					"D the disc diameter and ω its angular velocity, for drops from 3 mm down to 15 µm",
				"the abstract calls the equation approximate; other authors quote the constant from about 2.7 to 4"),
		},
		smd: func(pt *point) float64 {
			return waltonPrewettDiameter(pt.p.SurfaceTension, pt.p.LiquidDensity, pt.omega(), pt.in[inDiskD])
		},
	}}
	finishFamily(f)
	return f
}

func ultrasonicFamily() *family {
	f := &family{
		info: FamilyInfo{
			ID:          "ultrasonic",
			Name:        "Ultrasonic",
			Description: "A liquid film on a vibrating surface breaks into drops from capillary waves.",
			Inputs: []InputInfo{
				input(inFrequency, true), input(inMassFlow, false),
			},
			DefaultCorrelation:  "lang-1962",
			RosinRammlerQ:       3.0,
			RosinRammlerQSource: "common practice, no source",
		},
		resolve: resolveUltrasonic,
		groups:  func(*point) []Group { return nil },
	}
	f.corrs = []*correlation{{
		info: CorrelationInfo{
			ID: "lang-1962", Name: "Lang (1962)", Quantity: "number median diameter D_n0.5",
			Equation:    "D_n0.5 = 0.34 λ_c, λ_c = (8π σ/(ρ_L f²))^(1/3)",
			FittedUnits: "dimensionally consistent",
			Validity:    "capillary-wave atomization at low flow; frequency bound " + rangeCommon,
			Ranges:      []Range{{Quantity: inFrequency, Min: 1e4, Max: 3e6, Source: rangeCommon}},
			Provenance: checkedAgainst(Citation{Authors: "Lang, R. J.", Title: "Ultrasonic atomization of liquids", Journal: "J. Acoust. Soc. Am.", Year: 1962, Volume: "34(1)", Pages: "6–8"},
				"the paper's abstract (doi:10.1121/1.1909020): the number-median diameter is 0.34 of the capillary wavelength, "+
					"which Kelvin's equation gives from the exciting frequency",
				"the abstract does not print the wavelength formula; λ_c = (8π σ/(ρ_L f²))^(1/3) was not checked against the paper"),
		},
		smd: func(pt *point) float64 {
			return langDiameter(pt.p.SurfaceTension, pt.p.LiquidDensity, pt.in[inFrequency])
		},
	}}
	finishFamily(f)
	return f
}

// noEffervescentSMD is shown in place of an SMD for effervescent atomizers.
const noEffervescentSMD = "no verified correlation available: the SMD model of Lund, Sojka, Lefebvre & Gosselin " +
	"(Atomization and Sprays 3(1) (1993) 77–89) could not be confirmed in a published source here, so only the flow is given"

func effervescentFamily() *family {
	f := &family{
		info: FamilyInfo{
			ID:   "effervescent",
			Name: "Effervescent",
			Description: "Gas bubbled into the liquid upstream of the orifice; only the flow definitions are given, " +
				"based on the liquid flow.",
			Inputs: []InputInfo{
				inputTypical(inDeltaP, true, 5e5), input(inOrificeD, true), inputTypical(inALR, true, 0.05),
				input(inMassFlow, false), input(inFlowNumber, false), input(inCD, false),
			},
			SMDStatus:           noEffervescentSMD,
			RosinRammlerQ:       2.0,
			RosinRammlerQSource: "common practice, no source",
		},
		resolve: resolveEffervescent,
		groups:  airGroups,
	}
	finishFamily(f)
	return f
}

// quantitySMD labels correlations that predict the Sauter mean diameter.
const quantitySMD = "SMD (D32)"

// ntRange labels the Nukiyama–Tanasawa property bounds.
const ntRange = "property bounds of the original tests, not confirmed in a published source here"

// finishFamily copies the correlation descriptions into the family info,
// with Source and Status taken from each correlation's provenance record.
func finishFamily(f *family) {
	f.info.Correlations = make([]CorrelationInfo, len(f.corrs))
	for i, c := range f.corrs {
		c.info.Source = c.info.Provenance.Citation.String()
		c.info.Status = c.info.Provenance.Status
		f.info.Correlations[i] = c.info
	}
}
