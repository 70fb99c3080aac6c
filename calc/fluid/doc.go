// Package fluid holds the temperature-dependent properties of the liquids
// fogbench atomizes and of the gases they evaporate into: saturation
// pressure, surface tension, density, viscosity, latent heat and heat
// capacities of the liquid, the vapor-phase properties needed in the gas
// film around a drop, binary diffusivities and the 1/3-rule film state.
//
// Every correlation carries its published source and validity range. A
// property asked for outside that range is still computed (the formula is
// smooth there) but Check and Props report a warning naming the property, the
// temperature and the published range; a temperature past the hard limits of
// the liquid (melting point, critical temperature) is an error. All inputs and
// outputs are SI: K, Pa, N/m, kg/m3, Pa s, J/kg, J/(kg K), W/(m K), kg/mol,
// m2/s. docs/methods-fluid.md lists every equation with its source.
package fluid
