package evap_test

import (
	"fmt"
	"math"

	"fogbench/calc/evap"
)

// still is an invented liquid with constant properties, close to water at
// 10 °C, and a constant air-like film, so the example is self-contained.
type still struct{}

func (still) MolarMass() float64                   { return 0.018015268 }
func (still) SaturationPressure(T float64) float64 { return 1228 * math.Exp(5300*(1/283.15-1/T)) }
func (still) SurfaceTension(float64) float64       { return 0.0742 }
func (still) Density(float64) float64              { return 999.7 }
func (still) LatentHeat(float64) float64           { return 2.477e6 }
func (still) HeatCapacity(float64) float64         { return 4192 }

type air struct{}

func (air) Film(p, Ts, Tinf, Ys, Yinf float64) evap.Film {
	return evap.Film{T: Ts + (Tinf-Ts)/3, Density: 1.2, Viscosity: 1.8e-5, Conductivity: 0.0255,
		HeatCapacity: 1006, VaporHeatCapacity: 1870, Diffusivity: 2.5e-5}
}

func ExampleConditions_Drop() {
	c := evap.Conditions{
		Liquid: still{}, Gas: air{}, GasMolarMass: 0.0289647,
		Pressure: 101325, GasTemperature: 298.15,
		Curvature: true, Transition: true, Convection: evap.ConvectionNone,
	}
	for _, d := range []float64{20e-9, 200e-9, 20e-6} {
		s, err := c.Drop(d, 283.15)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("d = %6.0e m: S = %.4f, E = %.4f, Kn = %.3g (%s), mdot = %.3e kg/s\n",
			d, s.KelvinRatio, s.Enhancement, s.Knudsen, s.Regime, s.MassRate)
	}
	// Output:
	// d =  2e-08 m: S = 1.1203, E = 1.1214, Kn = 12.9 (free-molecular), mdot = 1.825e-15 kg/s
	// d =  2e-07 m: S = 1.0114, E = 1.0115, Kn = 1.29 (transition), mdot = 1.224e-13 kg/s
	// d =  2e-05 m: S = 1.0001, E = 1.0001, Kn = 0.0129 (slip), mdot = 2.840e-11 kg/s
}
