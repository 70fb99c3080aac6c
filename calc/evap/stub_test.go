package evap

import (
	"math"

	"fogbench/calc/phys"
)

// testLiquid is a liquid for tests: each property is a constant unless a
// function is given.
type testLiquid struct {
	molarMass float64
	psat      func(T float64) float64
	sigma     func(T float64) float64
	rho       float64
	latent    func(T float64) float64
	cp        float64
}

func (l testLiquid) MolarMass() float64                   { return l.molarMass }
func (l testLiquid) SaturationPressure(T float64) float64 { return l.psat(T) }
func (l testLiquid) SurfaceTension(T float64) float64     { return l.sigma(T) }
func (l testLiquid) Density(T float64) float64            { return l.rho }
func (l testLiquid) LatentHeat(T float64) float64         { return l.latent(T) }
func (l testLiquid) HeatCapacity(T float64) float64       { return l.cp }

func constant(v float64) func(float64) float64 { return func(float64) float64 { return v } }

// if97SaturationPressure is IAPWS R7-97(2012) eq. 30 (Region 4), T in K,
// result in Pa. Coefficients read in the release, Table 34.
func if97SaturationPressure(T float64) float64 {
	const (
		n1  = 0.11670521452767e4
		n2  = -0.72421316703206e6
		n3  = -0.17073846940092e2
		n4  = 0.12020824702470e5
		n5  = -0.32325550322333e7
		n6  = 0.14915108613530e2
		n7  = -0.48232657361591e4
		n8  = 0.40511340542057e6
		n9  = -0.23855557567849
		n10 = 0.65017534844798e3
	)
	th := T + n9/(T-n10)
	a := th*th + n1*th + n2
	b := n3*th*th + n4*th + n5
	c := n6*th*th + n7*th + n8
	p := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	return p * p * p * p * 1e6
}

// r176SurfaceTension is IAPWS R1-76(2014) for ordinary water, T in K,
// result in N/m (coefficients read in the release).
func r176SurfaceTension(T float64) float64 {
	tau := 1 - T/647.096
	return 235.8e-3 * math.Pow(tau, 1.256) * (1 - 0.625*tau)
}

// waterLatent is the linear latent heat used for the wet-bulb checks, as
// in the ASHRAE Handbook—Fundamentals ch. 1 psychrometric enthalpy (2501 kJ/kg
// at 0 °C; the slope from memory): L = 2.501e6 − 2369 (T − 273.15) J/kg.
func waterLatent(T float64) float64 { return 2.501e6 - 2369*(T-phys.ZeroCelsius) }

// water is the test-only water: IF97 saturation, R1-76 surface tension,
// constant density rho (kg/m3), the linear latent heat, c_p 4181 J/(kg K).
func water(rho float64) testLiquid {
	return testLiquid{
		molarMass: phys.MolarMassWater,
		psat:      if97SaturationPressure,
		sigma:     r176SurfaceTension,
		rho:       rho,
		latent:    waterLatent,
		cp:        4181,
	}
}

// constFilm returns the same film whatever the state.
type constFilm Film

func (f constFilm) Film(p, Ts, Tinf, Ys, Yinf float64) Film { return Film(f) }

// airFilm is a constant film resembling air near room temperature with
// Lewis number le and vapor heat capacity cpv.
func airFilm(le, cpv float64) constFilm {
	const rho, D, cp = 1.2, 2.5e-5, 1006
	return constFilm{T: 290, Density: rho, Viscosity: 1.8e-5, Conductivity: le * rho * D * cp,
		HeatCapacity: cp, VaporHeatCapacity: cpv, Diffusivity: D}
}

// waterInAir is water in dry still air at 25 °C, 1 atm, Le = 1.
func waterInAir() *Conditions {
	return &Conditions{
		Liquid: water(997.047013), Gas: airFilm(1, 1006), GasMolarMass: phys.MolarMassAir,
		Pressure: phys.StandardAtmosphere, GasTemperature: 298.15,
		Curvature: true, Convection: ConvectionNone,
	}
}
