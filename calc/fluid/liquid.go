package fluid

import (
	"fmt"
	"math"
	"sort"

	"fogbench/calc/valid"
)

// Liquid is one pure liquid (or a single-component surrogate of a mixture)
// with its constants and sourced correlations. Built-in liquids come from
// Lookup and Liquids; user-defined ones from NewCustomLiquid.
type Liquid struct {
	ID        string `json:"id"`
	Name      string `json:"name"`
	Surrogate string `json:"surrogate,omitempty"` // what the single component stands for, and why
	Formula   string `json:"formula"`
	CAS       string `json:"cas,omitempty"`

	molarMass  float64 // kg/mol
	tc         float64 // K
	pc         float64 // Pa
	omega      float64 // acentric factor
	tb         float64 // K, normal boiling point
	tmelt      float64 // K, triple or melting point: the hard lower limit
	vc         float64 // m3/mol, critical volume (Chung's method)
	dipole     float64 // debye (Chung's method)
	kappa      float64 // Chung's association factor
	diffVolume float64 // Fuller sum of atomic diffusion volumes

	constants []Source // sources of the constants above

	psat, sigma, rho, mu, hvap, cp correlation
	cpVapor, muVapor, kVapor       correlation

	// vaporFilm, where set, returns cpVapor, muVapor and kVapor at one
	// (held) T, the same numbers bit for bit, sharing the work they have
	// in common.
	vaporFilm func(T float64) (cp, mu, k float64)

	// tsat is a published backward equation T_s(p), or nil.
	tsat func(p float64) float64
}

// MolarMass returns M in kg/mol.
func (l *Liquid) MolarMass() float64 { return l.molarMass }

// CriticalTemperature returns Tc in K. It is the upper hard limit of every
// liquid property.
func (l *Liquid) CriticalTemperature() float64 { return l.tc }

// CriticalPressure returns pc in Pa.
func (l *Liquid) CriticalPressure() float64 { return l.pc }

// AcentricFactor returns Pitzer's acentric factor omega (dimensionless).
func (l *Liquid) AcentricFactor() float64 { return l.omega }

// NormalBoilingPoint returns the boiling point at 101325 Pa in K, as
// tabulated (not solved from the vapor-pressure correlation).
func (l *Liquid) NormalBoilingPoint() float64 { return l.tb }

// MeltingPoint returns the triple or normal melting point in K, the lower
// hard limit of the liquid properties.
func (l *Liquid) MeltingPoint() float64 { return l.tmelt }

// DiffusionVolume returns the Fuller sum of atomic diffusion volumes (Poling
// et al. 5th ed. Table 11-1; dimensionless, cm3/mol convention).
func (l *Liquid) DiffusionVolume() float64 { return l.diffVolume }

// clampLiquid holds T inside the hard limits so a correlation never sees a
// temperature where its form breaks down (NaN, division by zero). Check
// reports such temperatures as errors; the methods below only stay finite.
func (l *Liquid) clampLiquid(T float64) float64 {
	if math.IsNaN(T) {
		return l.tmelt
	}
	return math.Min(math.Max(T, l.tmelt), l.tc)
}

// SaturationPressure returns the vapor pressure p_s(T) in Pa, T in K, by the
// liquid's vapor-pressure correlation (see Sources). T is held inside
// [MeltingPoint, CriticalTemperature]; call Check for warnings and errors.
func (l *Liquid) SaturationPressure(T float64) float64 { return l.psat.eval(l.clampLiquid(T)) }

// SaturationTemperature returns T_s(p) in K for p in Pa: by the published
// backward equation where one exists (water: IF97 eq. 31), else by bracketed
// root finding (bisection on ln p_s between the hard limits, to 1e-9 K).
// p outside [p_s(MeltingPoint), p_s(Tc)] is an error on field "pressure_pa".
func (l *Liquid) SaturationTemperature(p float64) (float64, error) {
	if err := valid.Positive("pressure_pa", p); err != nil {
		return 0, err
	}
	plo, phi := l.psat.eval(l.tmelt), l.psat.eval(l.tc)
	if p < plo || p > phi {
		return 0, valid.Errorf("pressure_pa", p, "%s boils only between %s Pa (at %s K) and %s Pa (at the critical point)",
			l.Name, valid.FormatValue(plo), valid.FormatValue(l.tmelt), valid.FormatValue(phi))
	}
	if l.tsat != nil {
		return l.tsat(p), nil
	}
	lnp := math.Log(p)
	lo, hi := l.tmelt, l.tc
	for i := 0; i < 200 && hi-lo > 1e-9; i++ {
		mid := 0.5 * (lo + hi)
		if math.Log(l.psat.eval(mid)) < lnp {
			lo = mid
		} else {
			hi = mid
		}
	}
	return 0.5 * (lo + hi), nil
}

// SurfaceTension returns sigma(T) in N/m against the liquid's own vapor
// (see Sources for form and range). T in K, held inside the hard limits.
func (l *Liquid) SurfaceTension(T float64) float64 { return l.sigma.eval(l.clampLiquid(T)) }

// Density returns the saturated-liquid density in kg/m3, T in K.
func (l *Liquid) Density(T float64) float64 { return l.rho.eval(l.clampLiquid(T)) }

// Viscosity returns the liquid dynamic viscosity in Pa s, T in K.
func (l *Liquid) Viscosity(T float64) float64 { return l.mu.eval(l.clampLiquid(T)) }

// LatentHeat returns the enthalpy of vaporization in J/kg, T in K.
func (l *Liquid) LatentHeat(T float64) float64 { return l.hvap.eval(l.clampLiquid(T)) }

// HeatCapacity returns the liquid isobaric heat capacity in J/(kg K), T in K.
func (l *Liquid) HeatCapacity(T float64) float64 { return l.cp.eval(l.clampLiquid(T)) }

// clampVapor holds a vapor temperature inside [MeltingPoint, 3000 K]; the
// vapor correlations are smooth there and VaporCheck warns outside their
// published ranges.
func (l *Liquid) clampVapor(T float64) float64 {
	if math.IsNaN(T) {
		return l.tmelt
	}
	return math.Min(math.Max(T, l.tmelt), 3000)
}

// VaporHeatCapacity returns the ideal-gas isobaric heat capacity of the
// vapor in J/(kg K), T in K.
func (l *Liquid) VaporHeatCapacity(T float64) float64 { return l.cpVapor.eval(l.clampVapor(T)) }

// VaporViscosity returns the low-pressure (dilute) vapor viscosity in Pa s.
func (l *Liquid) VaporViscosity(T float64) float64 { return l.muVapor.eval(l.clampVapor(T)) }

// VaporConductivity returns the low-pressure vapor thermal conductivity in
// W/(m K).
func (l *Liquid) VaporConductivity(T float64) float64 { return l.kVapor.eval(l.clampVapor(T)) }

// vaporProps returns VaporHeatCapacity, VaporViscosity and
// VaporConductivity at T, bit for bit, in one call for the film.
func (l *Liquid) vaporProps(T float64) (cp, mu, k float64) {
	T = l.clampVapor(T)
	if l.vaporFilm != nil {
		return l.vaporFilm(T)
	}
	return l.cpVapor.eval(T), l.muVapor.eval(T), l.kVapor.eval(T)
}

func (l *Liquid) liquidCorrelations() []*correlation {
	return []*correlation{&l.psat, &l.sigma, &l.rho, &l.mu, &l.hvap, &l.cp}
}

func (l *Liquid) vaporCorrelations() []*correlation {
	return []*correlation{&l.cpVapor, &l.muVapor, &l.kVapor}
}

// Range returns the joint published validity in K of the liquid-phase
// correlations: the widest interval inside every one of them.
func (l *Liquid) Range() (tmin, tmax float64) {
	tmin, tmax = math.Inf(-1), math.Inf(1)
	for _, c := range l.liquidCorrelations() {
		tmin = math.Max(tmin, c.tmin)
		tmax = math.Min(tmax, c.tmax)
	}
	return tmin, tmax
}

// Check validates a liquid temperature T in K. Inside every published range it
// returns nil, nil. Between a published range and the hard limits (melting
// point .. critical temperature) the values are usable and each extrapolated
// property gets a warning naming it, T and its published range. Outside the
// hard limits, or for NaN/Inf, it returns a *valid.FieldError on field
// "liquid_temperature_k".
func (l *Liquid) Check(T float64) (warnings []string, err error) {
	const field = "liquid_temperature_k"
	if err := valid.Finite(field, T); err != nil {
		return nil, err
	}
	if T < l.tmelt || T > l.tc {
		return nil, valid.Errorf(field, T, "%s is liquid only between its melting point %s K and its critical temperature %s K",
			l.Name, valid.FormatValue(l.tmelt), valid.FormatValue(l.tc))
	}
	for _, c := range l.liquidCorrelations() {
		if !c.inRange(T) {
			warnings = append(warnings, rangeWarning(l.Name, *c, T))
		}
	}
	return warnings, nil
}

// VaporCheck warns for each vapor-phase property evaluated outside its
// published range at T in K (the film temperature); NaN, Inf or T <= 0 is an
// error on field "film_temperature_k".
func (l *Liquid) VaporCheck(T float64) (warnings []string, err error) {
	if err := valid.Positive("film_temperature_k", T); err != nil {
		return nil, err
	}
	for _, c := range l.vaporCorrelations() {
		if !c.inRange(T) {
			warnings = append(warnings, rangeWarning(l.Name+" vapor", *c, T))
		}
	}
	return warnings, nil
}

// RangeWarnings warns once for each liquid-phase property whose published
// range the liquid's temperatures, lo to hi in K, leave, naming the
// temperature reached farthest beyond it and what reached it (state, e.g.
// "the drops' steady temperature"). lo = hi is one temperature; a property
// left on both sides names both ends.
func (l *Liquid) RangeWarnings(lo, hi float64, state string) []string {
	var out []string
	for _, c := range l.liquidCorrelations() {
		below, above := lo < c.tmin, hi > c.tmax
		var reached string
		switch {
		case below && above:
			reached = fmt.Sprintf("%.2f K and %.2f K", lo, hi)
		case below:
			reached = fmt.Sprintf("%.2f K", lo)
		case above:
			reached = fmt.Sprintf("%.2f K", hi)
		default:
			continue
		}
		out = append(out, fmt.Sprintf("%s %s: %s reached %s, outside the published range %.2f–%.2f K of %s (%s); value extrapolated",
			l.Name, c.property, state, reached, c.tmin, c.tmax, c.method, c.reference))
	}
	return out
}

func rangeWarning(name string, c correlation, T float64) string {
	return fmt.Sprintf("%s %s at %.2f K is outside the published range %.2f–%.2f K of %s (%s); value extrapolated",
		name, c.property, T, c.tmin, c.tmax, c.method, c.reference)
}

// Sources lists where every constant and correlation of the liquid comes from.
func (l *Liquid) Sources() []Source {
	out := append([]Source(nil), l.constants...)
	for _, c := range l.liquidCorrelations() {
		out = append(out, c.source())
	}
	for _, c := range l.vaporCorrelations() {
		out = append(out, c.source())
	}
	return out
}

// Properties is every property of a liquid at one temperature, the audit
// record a result carries. Units are in the JSON names.
type Properties struct {
	LiquidID               string   `json:"liquid_id"`
	TemperatureK           float64  `json:"temperature_k"`
	SaturationPressurePa   float64  `json:"saturation_pressure_pa"`
	SurfaceTensionNM       float64  `json:"surface_tension_n_m"`
	LiquidDensityKgM3      float64  `json:"liquid_density_kg_m3"`
	LiquidViscosityPaS     float64  `json:"liquid_viscosity_pa_s"`
	LatentHeatJKg          float64  `json:"latent_heat_j_kg"`
	LiquidHeatCapacityJKgK float64  `json:"liquid_heat_capacity_j_kg_k"`
	VaporHeatCapacityJKgK  float64  `json:"vapor_heat_capacity_j_kg_k"`
	VaporViscosityPaS      float64  `json:"vapor_viscosity_pa_s"`
	VaporConductivityWMK   float64  `json:"vapor_conductivity_w_m_k"`
	MolarMassKgMol         float64  `json:"molar_mass_kg_mol"`
	CriticalTemperatureK   float64  `json:"critical_temperature_k"`
	CriticalPressurePa     float64  `json:"critical_pressure_pa"`
	NormalBoilingPointK    float64  `json:"normal_boiling_point_k"`
	MolarVolumeM3Mol       float64  `json:"molar_volume_m3_mol"`
	Warnings               []string `json:"warnings,omitempty"`
}

// Props evaluates every property at the liquid temperature T in K, with the
// warnings of Check and VaporCheck. A T past the hard limits is the error of
// Check.
func (l *Liquid) Props(T float64) (Properties, error) {
	w, err := l.Check(T)
	if err != nil {
		return Properties{}, err
	}
	wv, _ := l.VaporCheck(T)
	rho := l.Density(T)
	return Properties{
		LiquidID:               l.ID,
		TemperatureK:           T,
		SaturationPressurePa:   l.SaturationPressure(T),
		SurfaceTensionNM:       l.SurfaceTension(T),
		LiquidDensityKgM3:      rho,
		LiquidViscosityPaS:     l.Viscosity(T),
		LatentHeatJKg:          l.LatentHeat(T),
		LiquidHeatCapacityJKgK: l.HeatCapacity(T),
		VaporHeatCapacityJKgK:  l.VaporHeatCapacity(T),
		VaporViscosityPaS:      l.VaporViscosity(T),
		VaporConductivityWMK:   l.VaporConductivity(T),
		MolarMassKgMol:         l.molarMass,
		CriticalTemperatureK:   l.tc,
		CriticalPressurePa:     l.pc,
		NormalBoilingPointK:    l.tb,
		MolarVolumeM3Mol:       l.molarMass / rho,
		Warnings:               append(w, wv...),
	}, nil
}

// Lookup returns the built-in liquid with the given id. An unknown id is a
// *valid.FieldError on field "fluid" that lists the known ids.
func Lookup(id string) (*Liquid, error) {
	for _, l := range builtins {
		if l.ID == id {
			return l, nil
		}
	}
	ids := make([]string, len(builtins))
	for i, l := range builtins {
		ids[i] = l.ID
	}
	sort.Strings(ids)
	return nil, &valid.FieldError{Field: "fluid", Value: id, Message: fmt.Sprintf("unknown liquid; known: %v", ids)}
}

// Liquids returns all built-in liquids in a stable order (water first, then
// the hydrocarbons by carbon number, the oxygenates, the surrogates).
func Liquids() []*Liquid { return append([]*Liquid(nil), builtins...) }
