package evap

// Liquid is what the evaporation model needs to know about the drop's
// liquid. All arguments and results are SI; T is the liquid (surface)
// temperature in K.
type Liquid interface {
	MolarMass() float64                   // kg/mol
	SaturationPressure(T float64) float64 // Pa, over a flat surface
	SurfaceTension(T float64) float64     // N/m
	Density(T float64) float64            // kg/m3
	LatentHeat(T float64) float64         // J/kg
	HeatCapacity(T float64) float64       // liquid c_p, J/(kg K)
}

// Film holds the gas-film properties at the reference state between the
// drop surface and the far field (for example the 1/3 rule of Hubbard,
// Denny & Mills 1975). All fields are SI.
type Film struct {
	T                 float64 // reference temperature, K
	VaporMassFraction float64 // reference vapor mass fraction, -
	Density           float64 // mixture density, kg/m3
	Viscosity         float64 // mixture dynamic viscosity, Pa s
	Conductivity      float64 // mixture thermal conductivity, W/(m K)
	HeatCapacity      float64 // mixture c_p, J/(kg K)
	VaporHeatCapacity float64 // vapor c_p, J/(kg K)
	Diffusivity       float64 // binary diffusion coefficient vapor–gas, m2/s
	// MeanFreePath is the vapor mean free path used for the Knudsen number of
	// the Fuchs–Sutugin correction, m. Zero asks evap to use
	// λ = 3 D / c̄_v (Seinfeld & Pandis convention), which is the value that
	// makes the Fuchs–Sutugin flux tend exactly to the kinetic flux.
	MeanFreePath float64
}

// FilmModel returns the gas-film properties for a drop at surface
// temperature Ts (K) with surface vapor mass fraction Ys in a gas at
// pressure p (Pa), far-field temperature Tinf (K) and far-field vapor mass
// fraction Yinf.
type FilmModel interface {
	Film(p, Ts, Tinf, Ys, Yinf float64) Film
}
