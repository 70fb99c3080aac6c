package atomize

// Properties are the liquid and gas properties at the operating point, in
// SI, filled by the caller (normally from calc/fluid).
type Properties struct {
	LiquidDensity   float64 `json:"liquid_density_kg_m3"`
	LiquidViscosity float64 `json:"liquid_viscosity_pa_s"`
	SurfaceTension  float64 `json:"surface_tension_n_m"`
	GasDensity      float64 `json:"gas_density_kg_m3"`
	GasViscosity    float64 `json:"gas_viscosity_pa_s"`
}

// InputInfo describes one input of a family. Min and Max bound the values a
// form offers and the bracket Solve searches when the correlation states no
// validity range for that input; they are typical of the trade (common
// practice, no source), not validity limits.
type InputInfo struct {
	Name        string  `json:"name"`
	Unit        string  `json:"unit"`
	Description string  `json:"description"`
	Typical     float64 `json:"typical"`
	Min         float64 `json:"min"`
	Max         float64 `json:"max"`
	Required    bool    `json:"required"`
}

// Range is a validity range of one quantity (an input name or a property
// such as "liquid_viscosity_pa_s"), with where it comes from.
type Range struct {
	Quantity string  `json:"quantity"`
	Min      float64 `json:"min"`
	Max      float64 `json:"max"`
	Source   string  `json:"source"`
}

// CorrelationInfo describes one published correlation.
type CorrelationInfo struct {
	ID          string  `json:"id"`
	Name        string  `json:"name"`
	Quantity    string  `json:"quantity"` // what it predicts: "SMD (D32)", "number median D_n0.5", ...
	Equation    string  `json:"equation"`
	FittedUnits string  `json:"fitted_units"`
	Validity    string  `json:"validity"`
	Ranges      []Range `json:"ranges"`
	Source      string  `json:"source"` // Provenance.Citation in one line
	Status      string  `json:"status"` // Provenance.Status
	Needs       string  `json:"needs"`  // inputs it needs beyond the family's required ones
	// Provenance is the published citation and how far the form was
	// checked; Source and Status are copied from it.
	Provenance Provenance `json:"provenance"`
}

// FamilyInfo describes one atomizer family.
type FamilyInfo struct {
	ID                  string            `json:"id"`
	Name                string            `json:"name"`
	Description         string            `json:"description"`
	Inputs              []InputInfo       `json:"inputs"`
	Correlations        []CorrelationInfo `json:"correlations"`
	DefaultCorrelation  string            `json:"default_correlation"`
	SMDStatus           string            `json:"smd_status,omitempty"` // set when no SMD correlation is offered
	RosinRammlerQ       float64           `json:"rosin_rammler_q"`
	RosinRammlerQSource string            `json:"rosin_rammler_q_source"`
}

// SMDEstimate is one correlation's drop size at the operating point.
type SMDEstimate struct {
	Correlation string     `json:"correlation"`
	SMD         float64    `json:"smd_m"`
	Quantity    string     `json:"quantity"` // "SMD (D32)" unless the correlation predicts another diameter
	InRange     bool       `json:"in_range"`
	Source      string     `json:"source"`
	Status      string     `json:"status"`
	Provenance  Provenance `json:"provenance"`
	Warnings    []string   `json:"warnings,omitempty"`
}

// Group is a dimensionless group with the regime it indicates.
type Group struct {
	Name       string  `json:"name"`
	Symbol     string  `json:"symbol"`
	Definition string  `json:"definition"`
	Value      float64 `json:"value"`
	Regime     string  `json:"regime"`
	Source     string  `json:"source"`
}

// Band is the spread between correlations that predict the same quantity.
type Band struct {
	Min   float64 `json:"min_m"`
	Max   float64 `json:"max_m"`
	Ratio float64 `json:"ratio"` // Max/Min; 0 when fewer than two estimates
	Count int     `json:"count"`
}

// Result is one evaluated operating point.
type Result struct {
	Family      string `json:"family"`
	Correlation string `json:"correlation"` // the chosen one; "" when the family has none

	MassFlow      float64 `json:"mass_flow_kg_s"`
	MassFlowKnown bool    `json:"mass_flow_known"`
	GasMassFlow   float64 `json:"gas_mass_flow_kg_s"` // ALR × ṁ_L where both are known

	// Flow number and discharge coefficient, known when ΔP and the liquid
	// flow are (FlowKnown).
	FlowNumberSI         float64 `json:"flow_number_m2"`
	FlowNumberUS         float64 `json:"flow_number_lb_h_psi05"`
	FlowNumberUK         float64 `json:"flow_number_ukgal_h_psi05"`
	DischargeCoefficient float64 `json:"discharge_coefficient"`
	FlowKnown            bool    `json:"flow_known"`
	LiquidVelocity       float64 `json:"liquid_velocity_m_s"` // mean velocity in the orifice, 0 when not defined

	SMD       []SMDEstimate `json:"smd"` // every applicable correlation, the chosen one first
	SMDBand   Band          `json:"smd_band"`
	SMDStatus string        `json:"smd_status,omitempty"`

	ConeAngleDeg        float64 `json:"cone_angle_deg"` // full angle; 0 when not given
	ConeAngleKnown      bool    `json:"cone_angle_known"`
	ConeAngleSource     string  `json:"cone_angle_source,omitempty"`
	FilmThickness       float64 `json:"film_thickness_m"` // 0 when not given
	FilmThicknessKnown  bool    `json:"film_thickness_known"`
	FilmThicknessSource string  `json:"film_thickness_source,omitempty"`

	Groups   []Group  `json:"groups"`
	Warnings []string `json:"warnings"`
	Notes    []string `json:"notes,omitempty"`
}

// Estimate returns the estimate of correlation id and whether it is present.
func (r Result) Estimate(id string) (SMDEstimate, bool) {
	for _, e := range r.SMD {
		if e.Correlation == id {
			return e, true
		}
	}
	return SMDEstimate{}, false
}
