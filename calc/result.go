package calc

import "fogbench/calc/atomize"

// Result is a case evaluated: the spray's representative diameters, one row
// per size bin, the evaporation history, the properties used and every
// warning. JSON names carry SI units; quantities that do not exist for a case
// (a drop that never evaporates) are null, never NaN or Inf.
type Result struct {
	Summary    Summary     `json:"summary"`
	Bins       []BinResult `json:"bins"`
	Curvature  Curvature   `json:"curvature"`
	Properties Properties  `json:"properties"`
	// Equilibrium is the flat-surface equilibrium at the gas pressure at
	// the reference temperature (see calc/equilibrium.go); nil when the
	// gas has no equation-of-state constants.
	Equilibrium *Equilibrium    `json:"equilibrium,omitempty"`
	History     *History        `json:"history,omitempty"`
	Atomizer    *atomize.Result `json:"atomizer,omitempty"`
	// Superheat is set when the liquid leaves the nozzle at or above its
	// boiling point at the gas pressure; the evaporation fields are then
	// not computed (see calc/superheat.go).
	Superheat *Superheat `json:"superheat,omitempty"`
	Warnings  []string   `json:"warnings"`
}

// Summary holds the spray-level figures.
type Summary struct {
	// D10M, D20M and D30M are null, with a warning, when the model's
	// number distribution has no such mean (a Rosin–Rammler with q ≤ 3:
	// its number density diverges at D → 0, so the classes' means only
	// follow the lower cut).
	D10M         *float64 `json:"d10_m"`
	D20M         *float64 `json:"d20_m"`
	D30M         *float64 `json:"d30_m"`
	D32M         float64  `json:"d32_m"`
	D43M         float64  `json:"d43_m"`
	Dv10M        float64  `json:"dv10_m"`
	Dv50M        float64  `json:"dv50_m"`
	Dv90M        float64  `json:"dv90_m"`
	Span         float64  `json:"span"`
	RelativeSpan float64  `json:"relative_span"`
	// Times to 50, 90 and 99 % of the liquid mass evaporated; null when the
	// spray does not get there (saturated surroundings).
	T50S *float64 `json:"t50_s"`
	T90S *float64 `json:"t90_s"`
	T99S *float64 `json:"t99_s"`
	// Drops per second for the case's liquid flow, when one is given.
	DropsPerSecond *float64 `json:"drops_per_s,omitempty"`
}

// BinResult is one size class.
type BinResult struct {
	DLoM                   float64  `json:"d_lo_m"`
	DHiM                   float64  `json:"d_hi_m"`
	DM                     float64  `json:"d_m"`
	NumberFraction         float64  `json:"number_fraction"`
	VolumeFraction         float64  `json:"volume_fraction"`
	LaplacePa              float64  `json:"laplace_pa"`
	VaporPressurePa        float64  `json:"vapor_pressure_pa"`
	KelvinRatio            float64  `json:"kelvin_ratio"`
	EvaporationEnhancement float64  `json:"evaporation_enhancement"`
	LifetimeS              *float64 `json:"lifetime_s"`
	SurfaceTemperatureK    float64  `json:"surface_temperature_k"`
	Knudsen                float64  `json:"knudsen"`
	Regime                 string   `json:"regime"`
	EvaporationRateKgS     float64  `json:"evaporation_rate_kg_s"`
	// Grows is set only in supersaturated surroundings: whether the class's
	// radius exceeds Curvature.KelvinCriticalRadiusM, so its drops grow.
	Grows *bool `json:"grows,omitempty"`
	// Transcritical is set when the class's surface reaches the mixture
	// critical point of liquid and gas: its evaporation model stops there
	// (present only when true).
	Transcritical bool `json:"transcritical,omitempty"`
}

// Equilibrium is the vapor's equilibrium over a flat surface of the liquid
// at the gas pressure and the reference surface temperature:
// y_v φ_v p = x_L p_sat φ_sat exp(v_L (p − p_sat)/(R T)). Each class's
// vapor_pressure_pa is FlatVaporPressurePa times its Kelvin ratio at its
// own surface temperature.
type Equilibrium struct {
	TemperatureK float64 `json:"temperature_k"`
	// FlatVaporPressurePa is the equilibrium partial pressure y_v p, Pa.
	FlatVaporPressurePa float64 `json:"flat_vapor_pressure_pa"`
	// PoyntingFactor is exp(v_L (p − p_sat)/(R T)).
	PoyntingFactor float64 `json:"poynting_factor"`
	// FugacityFactor is φ_sat/φ_v.
	FugacityFactor float64 `json:"fugacity_factor"`
	// EnhancementFactor is FlatVaporPressurePa / p_sat.
	EnhancementFactor float64 `json:"enhancement_factor"`
	// DissolvedGasMoleFraction is 1 − x_L.
	DissolvedGasMoleFraction float64 `json:"dissolved_gas_mole_fraction"`
	// LatentHeatJKg is the heat of vaporisation at the surface state at the
	// gas pressure (the liquid's L(T) corrected by Peng–Robinson departure
	// functions, or for water by the virial guideline's and the liquid's
	// enthalpy change with pressure), J/kg.
	LatentHeatJKg float64 `json:"latent_heat_j_kg"`
	// MixtureCriticalTemperatureK is the surface temperature at which the
	// surface reaches the mixture critical point at the gas pressure
	// (only at or above the liquid's critical pressure).
	MixtureCriticalTemperatureK *float64 `json:"mixture_critical_temperature_k,omitempty"`
	Method                      string   `json:"method"`
}

// Curvature summarises where the Kelvin effect matters for this case.
type Curvature struct {
	// KelvinLengthM is 2σ v_L/(R T) at the reference surface temperature:
	// the radius at which the vapor pressure is raised by a factor e.
	KelvinLengthM float64 `json:"kelvin_length_m"`
	// Diameters below which the evaporation rate is raised by more than 1 %
	// and 10 % (null when no diameter in range reaches it).
	Enhancement1PctDM  *float64 `json:"enhancement_1pct_d_m"`
	Enhancement10PctDM *float64 `json:"enhancement_10pct_d_m"`
	// LaplaceOneAtmDM is the diameter at which 2σ/r equals one standard
	// atmosphere.
	LaplaceOneAtmDM float64 `json:"laplace_one_atm_d_m"`
	// KelvinCriticalRadiusM is the equilibrium radius in supersaturated
	// surroundings: smaller drops evaporate, larger ones grow.
	KelvinCriticalRadiusM *float64 `json:"kelvin_critical_radius_m,omitempty"`
	ReferenceTemperatureK float64  `json:"reference_temperature_k"`
}

// Properties lists every property value the evaluation used, at the
// reference surface temperature and in the gas film, with its source.
type Properties struct {
	Fluid                    string   `json:"fluid"`
	TemperatureK             float64  `json:"temperature_k"`
	SaturationPressurePa     float64  `json:"saturation_pressure_pa"`
	SurfaceTensionNM         float64  `json:"surface_tension_n_m"`
	LiquidDensityKgM3        float64  `json:"liquid_density_kg_m3"`
	LiquidViscosityPaS       float64  `json:"liquid_viscosity_pa_s"`
	LatentHeatJKg            float64  `json:"latent_heat_j_kg"`
	LiquidHeatCapacityJKgK   float64  `json:"liquid_heat_capacity_j_kg_k"`
	MolarMassKgMol           float64  `json:"molar_mass_kg_mol"`
	MolarVolumeM3Mol         float64  `json:"molar_volume_m3_mol"`
	NormalBoilingPointK      float64  `json:"normal_boiling_point_k"`
	GasDensityKgM3           float64  `json:"gas_density_kg_m3"`
	FilmTemperatureK         float64  `json:"film_temperature_k"`
	FilmDensityKgM3          float64  `json:"film_density_kg_m3"`
	FilmViscosityPaS         float64  `json:"film_viscosity_pa_s"`
	FilmConductivityWMK      float64  `json:"film_conductivity_w_m_k"`
	FilmHeatCapacityJKgK     float64  `json:"film_heat_capacity_j_kg_k"`
	DiffusivityM2S           float64  `json:"diffusivity_m2_s"`
	MeanFreePathM            float64  `json:"mean_free_path_m"`
	AmbientVaporMoleFraction float64  `json:"ambient_vapor_mole_fraction"`
	Sources                  []Source `json:"sources"`
}

// Source names where one property comes from.
type Source struct {
	Property  string `json:"property"`
	Method    string `json:"method"`
	Reference string `json:"reference"`
}

// History is the spray's evaporation against time (and distance when a
// spray velocity is given).
type History struct {
	TS                     []float64 `json:"t_s"`
	XM                     []float64 `json:"x_m,omitempty"`
	EvaporatedMassFraction []float64 `json:"evaporated_mass_fraction"`
	D32M                   []float64 `json:"d32_m"`
	Dv50M                  []float64 `json:"dv50_m"`
}
