package flash

// Liquid is what the package needs to know about the superheated liquid.
// Temperatures are in K, pressures in Pa. *fluid.Liquid satisfies it.
type Liquid interface {
	// SaturationPressure is p_sat(T) in Pa.
	SaturationPressure(T float64) float64
	// SaturationTemperature is T_sat(p) in K, or an error outside the
	// liquid's range.
	SaturationTemperature(p float64) (float64, error)
	// SurfaceTension is σ(T) in N/m against the liquid's own vapor.
	SurfaceTension(T float64) float64
	// Density is the (saturated) liquid density in kg/m3.
	Density(T float64) float64
	// LatentHeat is h_fg(T) in J/kg.
	LatentHeat(T float64) float64
	// HeatCapacity is the liquid c_p(T) in J/(kg K).
	HeatCapacity(T float64) float64
	// MolarMass is M in kg/mol.
	MolarMass() float64
	// CriticalTemperature is Tc in K, CriticalPressure pc in Pa and
	// AcentricFactor Pitzer's ω (dimensionless): the Peng–Robinson inputs.
	CriticalTemperature() float64
	CriticalPressure() float64
	AcentricFactor() float64
}
