package evap

import (
	"fmt"

	"fogbench/calc/valid"
)

// Convection model names accepted in Conditions.Convection.
const (
	ConvectionNone              = "none"               // Sh = Nu = 2 (stagnant)
	ConvectionRanzMarshall      = "ranz-marshall"      // Ranz & Marshall (1952)
	ConvectionFrossling         = "frossling"          // Frössling (1938)
	ConvectionAbramzonSirignano = "abramzon-sirignano" // Abramzon & Sirignano (1989)
)

// Conditions describe a drop's liquid and its surroundings.
type Conditions struct {
	Liquid Liquid
	Gas    FilmModel

	GasMolarMass float64 // molar mass of the carrier gas, kg/mol

	Pressure          float64 // far-field pressure, Pa
	GasTemperature    float64 // far-field temperature, K
	VaporMoleFraction float64 // far-field vapor mole fraction, 0 ≤ X < 1

	RelativeVelocity float64 // drop–gas slip speed, m/s (0 = stagnant)

	Curvature  bool   // apply the Kelvin raise (false gives the flat-surface reference)
	Transition bool   // apply the Fuchs–Sutugin transition-regime factor
	Convection string // one of the Convection* names

	// AccommodationCoefficient is the mass accommodation coefficient α of
	// the Fuchs–Sutugin factor, 0 < α ≤ 1; zero means 1.
	AccommodationCoefficient float64

	// Equilibrium, when set, gives the flat-surface vapor pressure at the
	// gas pressure (Poynting factor, fugacity coefficients, dissolved gas)
	// and the surface's critical limit; nil takes p_sat (see
	// SurfaceEquilibrium).
	Equilibrium SurfaceEquilibrium
}

// Validate checks every field and returns all problems at once as
// valid.Errors, each naming the field and the offending value.
func (c *Conditions) Validate() error {
	var es valid.Errors
	if c.Liquid == nil {
		es = append(es, &valid.FieldError{Field: "liquid", Message: "no liquid given"})
	}
	if c.Gas == nil {
		es = append(es, &valid.FieldError{Field: "gas", Message: "no gas film model given"})
	}
	es.Add(valid.Positive("gas.molar_mass_kg_mol", c.GasMolarMass))
	es.Add(valid.Positive("gas.pressure_pa", c.Pressure))
	es.Add(valid.Positive("gas.temperature_k", c.GasTemperature))
	if err := valid.NonNegative("gas.vapor_mole_fraction", c.VaporMoleFraction); err != nil {
		es.Add(err)
	} else if c.VaporMoleFraction >= 1 {
		es.Add(valid.Errorf("gas.vapor_mole_fraction", c.VaporMoleFraction, "must be below 1 (the gas cannot be pure vapor)"))
	}
	es.Add(valid.NonNegative("gas.relative_velocity_m_s", c.RelativeVelocity))
	switch c.Convection {
	case ConvectionNone, ConvectionRanzMarshall, ConvectionFrossling, ConvectionAbramzonSirignano:
	default:
		es = append(es, &valid.FieldError{Field: "evaporation.convection", Value: fmt.Sprintf("%q", c.Convection),
			Message: "must be one of none, ranz-marshall, frossling, abramzon-sirignano"})
	}
	if c.AccommodationCoefficient != 0 {
		es.Add(valid.Between("evaporation.accommodation_coefficient", c.AccommodationCoefficient, 1e-6, 1, ""))
	}
	return es.Err()
}

func (c *Conditions) alpha() float64 {
	if c.AccommodationCoefficient == 0 {
		return 1
	}
	return c.AccommodationCoefficient
}
