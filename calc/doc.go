// Package calc is fogbench's domain core: the case (what an engineer enters),
// its evaluation into per-bin and spray-level results, and the error type the
// rest of the application speaks. It imports only the standard library, gonum
// and its own subpackages:
//
//   - calc/fluid: liquid, vapor and gas properties with their sources
//   - calc/sizedist: droplet-size distributions, statistics, import and fits
//   - calc/evap: Laplace pressure, Kelvin equation, transfer numbers, lifetimes
//   - calc/atomize: atomizer correlations, forward and inverse
//   - calc/units: unit conversion for forms and displays
//   - calc/valid: the field error every package returns for bad input
//
// Nothing in calc knows about HTTP or SQL; store and server depend on calc,
// never the reverse.
package calc
