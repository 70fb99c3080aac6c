// Package evap computes the evaporation of single drops and of whole sprays:
// Laplace pressure and the Kelvin (curvature) raise of vapor pressure,
// Spalding transfer numbers, convective Sherwood and Nusselt numbers, the
// Fuchs–Sutugin transition-regime factor, the steady (wet-bulb) surface
// temperature, drop lifetimes by quadrature and spray evaporation histories.
//
// All quantities are SI: m, kg, s, K, Pa, J, W. Diameters are named d,
// radii r = d/2; every formula says which one it takes.
//
// The package does not know any real fluid. It reads the liquid through the
// Liquid interface and the gas film through FilmModel, so callers supply
// property models (calc/fluid does that in fogbench) and tests use
// constant-property stubs. Equations, sources and tolerances are collected
// in docs/methods-evap.md.
package evap
