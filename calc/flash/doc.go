// Package flash describes a liquid that leaves the nozzle hotter than its
// boiling point at the surrounding pressure (a superheated, metastable
// liquid that may flash-boil): the degree of superheat, the pressure ratio
// and Jakob number with a flashing-regime label, the critical bubble radius
// and the homogeneous nucleation barrier and rate of classical nucleation
// theory, the kinetic limit of superheat, and the Peng–Robinson saturation
// pressure and liquid spinodal that bound the metastable liquid.
//
// All quantities are SI: K, Pa, m, kg, J, mol; rates per m3 per s. Radii
// are radii, never diameters.
//
// The package knows no real fluid. It reads the liquid through the Liquid
// interface (calc/fluid's *fluid.Liquid satisfies it), so tests can use
// constant-property stubs. The equilibrium (Kelvin) radius of a drop in
// supersaturated vapor is calc/evap's business (Conditions.EquilibriumRadius)
// and is not repeated here. Equations, sources and checks are collected in
// docs/methods-flash.md.
package flash
