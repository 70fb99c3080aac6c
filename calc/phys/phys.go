// Package phys holds the physical constants and unit factors shared by every
// calc subpackage, each with the document that defines it.
package phys

const (
	// GasConstant is the molar gas constant R in J/(mol K), exact since the
	// 2019 SI redefinition (CODATA 2018: R = N_A k).
	GasConstant = 8.314462618

	// Boltzmann is the Boltzmann constant k in J/K, exact (CODATA 2018).
	Boltzmann = 1.380649e-23

	// Avogadro is the Avogadro constant N_A in 1/mol, exact (CODATA 2018).
	Avogadro = 6.02214076e23

	// StandardAtmosphere is 1 atm in Pa, exact by definition (NIST SP 811, B.8).
	StandardAtmosphere = 101325.0

	// ZeroCelsius is 0 °C in K, exact by definition (NIST SP 811, 4.2.1.1).
	ZeroCelsius = 273.15

	// MolarMassAir is the molar mass of dry air in kg/mol (ASHRAE Handbook —
	// Fundamentals 2017, ch. 1, 28.966 g/mol; the 28.9647 g/mol used here is
	// the value of the U.S. Standard Atmosphere 1976, Table 2 — from memory).
	MolarMassAir = 28.9647e-3

	// MolarMassWater is the molar mass of H2O in kg/mol (IAPWS R6-95(2018),
	// used with IAPWS-95 and IF97: 18.015268 g/mol).
	MolarMassWater = 18.015268e-3

	// MolarMassNitrogen is the molar mass of N2 in kg/mol (IUPAC 2013
	// standard atomic weight of N, 14.0067, times two).
	MolarMassNitrogen = 28.0134e-3
)
