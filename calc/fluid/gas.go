package fluid

import (
	"fmt"
	"math"

	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// Gas is the carrier gas around the drops. Its transport properties are the
// zero-density (dilute-gas) limits of the Lemmon & Jacobsen (2004) equations,
// which hold to better than 1 % below about 1 MPa.
type Gas struct {
	ID   string `json:"id"`
	Name string `json:"name"`

	molarMass  float64 // kg/mol
	diffVolume float64 // Fuller
	// Lemmon & Jacobsen (2004) dilute-gas constants.
	epsK, sigmaNM, mLJ float64 // K, nm, g/mol
	tcLJ               float64 // K, reducing temperature of lambda0
	n1, n2, n3         float64
	t2, t3             float64
	cp                 correlation
	tmin, tmax         float64 // validity of the transport equations, K
	sources            []Source
}

// MolarMass returns M in kg/mol.
func (g *Gas) MolarMass() float64 { return g.molarMass }

// DiffusionVolume returns the Fuller diffusion volume (Poling et al. 5th ed.
// Table 11-1: air 19.7, N2 18.5).
func (g *Gas) DiffusionVolume() float64 { return g.diffVolume }

func (g *Gas) clamp(T float64) float64 {
	if math.IsNaN(T) {
		return g.tmin
	}
	return math.Min(math.Max(T, 20), 5000)
}

// HeatCapacity returns the ideal-gas isobaric heat capacity in J/(kg K), T in
// K (see Sources for the form).
func (g *Gas) HeatCapacity(T float64) float64 { return g.cp.eval(g.clamp(T)) }

// lemmonOmega is the collision integral of Lemmon & Jacobsen (2004) eq. 4,
// Omega = exp(sum_{i=0..4} b_i (ln T*)^i), b = 0.431, -0.4623, 0.08406,
// 0.005341, -0.00331 (read in python3-iapws 1.5.2, humidAir.py Air._visco).
func lemmonOmega(tstar float64) float64 {
	b := [5]float64{0.431, -0.4623, 0.08406, 0.005341, -0.00331}
	x := math.Log(tstar)
	return math.Exp(b[0] + x*(b[1]+x*(b[2]+x*(b[3]+x*b[4]))))
}

// Viscosity returns the dilute-gas viscosity of Lemmon & Jacobsen, Int. J.
// Thermophys. 25 (2004) 21, eq. 2: eta0 [uPa s] = 0.0266958 (M T)^(1/2) /
// (sigma^2 Omega(T/(eps/k))), M in g/mol, sigma in nm. T in K, Pa s.
func (g *Gas) Viscosity(T float64) float64 {
	T = g.clamp(T)
	return g.viscosityMicro(T) * 1e-6
}

func (g *Gas) viscosityMicro(T float64) float64 {
	return 0.0266958 * math.Sqrt(g.mLJ*T) / (g.sigmaNM * g.sigmaNM * lemmonOmega(T/g.epsK))
}

// Conductivity returns the dilute-gas thermal conductivity of Lemmon &
// Jacobsen (2004) eq. 5: lambda0 [mW/(m K)] = N1 eta0[uPa s] + N2 tau^t2 +
// N3 tau^t3, tau = Tc/T. T in K, W/(m K).
func (g *Gas) Conductivity(T float64) float64 {
	T = g.clamp(T)
	return g.conductivityFrom(T, g.viscosityMicro(T))
}

// conductivityFrom is Conductivity at a held T with eta0 in uPa s already
// known. The two powers of tau share one logarithm (powFromLog gives
// math.Pow's bits).
func (g *Gas) conductivityFrom(T, etaMicro float64) float64 {
	tau := g.tcLJ / T
	lt := math.Log(tau)
	return (g.n1*etaMicro + g.n2*powFromLog(tau, lt, g.t2) + g.n3*powFromLog(tau, lt, g.t3)) * 1e-3
}

// filmProps returns HeatCapacity, Viscosity and Conductivity at one T, the
// same numbers bit for bit, with the viscosity evaluated once for both
// transport properties.
func (g *Gas) filmProps(T float64) (cp, mu, k float64) {
	T = g.clamp(T)
	eta := g.viscosityMicro(T)
	return g.cp.eval(T), eta * 1e-6, g.conductivityFrom(T, eta)
}

// Density returns the ideal-gas density rho = p M/(R T) in kg/m3, T in K,
// p in Pa.
func (g *Gas) Density(T, p float64) float64 {
	return p * g.molarMass / (gasConstant * g.clamp(T))
}

// Check validates the gas state: T and p must be finite and positive (errors
// on fields "gas.temperature_k" and "gas.pressure_pa"). It warns outside the
// published temperature range of the transport equations, above 0.5 MPa,
// where the film takes the dense-gas corrections of dense.go, and above
// denseMaxReduced times the gas's critical pressure.
func (g *Gas) Check(T, p float64) (warnings []string, err error) {
	var es valid.Errors
	es.Add(valid.Positive("gas.temperature_k", T))
	es.Add(valid.Positive("gas.pressure_pa", p))
	if err := es.Err(); err != nil {
		return nil, err
	}
	if T < g.tmin || T > g.tmax {
		warnings = append(warnings, fmt.Sprintf("%s transport properties at %.2f K are outside the published range %.0f–%.0f K of Lemmon & Jacobsen (2004); values extrapolated",
			g.Name, T, g.tmin, g.tmax))
	}
	if !g.cp.inRange(T) {
		warnings = append(warnings, rangeWarning(g.Name, g.cp, T))
	}
	if p > denseLow {
		warnings = append(warnings, fmt.Sprintf("%s at %.3g Pa: the gas film is taken as a dense gas (density from Peng–Robinson, viscosity and conductivity with the dense-fluid terms of Chung et al. 1988, diffusivity with the high-pressure factor of Riazi & Whitson 1993, phased in between 0.5 and 1 MPa); expect about 10 %% in the film's transport properties", g.Name, p))
	}
	if _, ok := gasCritical[g.ID]; ok && p > denseMaxReduced*gasCritical[g.ID].pc {
		warnings = append(warnings, fmt.Sprintf("%s at %.3g Pa is above %g times the gas's critical pressure, beyond the reduced pressures the high-pressure diffusivity factor of Riazi & Whitson (1993) was fitted on (about 1 to %g, from memory); the film diffusivity is extrapolated", g.Name, p, denseMaxReduced, denseMaxReduced))
	}
	return warnings, nil
}

// Sources lists where each property of the gas comes from.
func (g *Gas) Sources() []Source { return append([]Source(nil), g.sources...) }

var gases = []*Gas{newAir(), newNitrogen()}

// LookupGas returns the built-in gas with the given id ("air", "nitrogen").
// An unknown id is a *valid.FieldError on field "gas.id".
func LookupGas(id string) (*Gas, error) {
	for _, g := range gases {
		if g.ID == id {
			return g, nil
		}
	}
	return nil, &valid.FieldError{Field: "gas.id", Value: id, Message: "unknown gas; known: [air nitrogen]"}
}

// Gases returns the built-in gases in a stable order.
func Gases() []*Gas { return append([]*Gas(nil), gases...) }

// airIdealCp is the ideal-gas heat capacity of the air equation of state of
// Lemmon, Jacobsen, Penoncello & Friend, J. Phys. Chem. Ref. Data 29 (2000)
// 331, from the second temperature derivative of its ideal-gas Helmholtz
// energy (eq. 25, Table 13; coefficients read in python3-iapws 1.5.2,
// humidAir.py Air.Fi0): cp0/R = 1 - tau^2 d2(alpha0)/dtau2, tau = 132.6312 K/T,
// R = 8.31451 J/(mol K), M = 28.9586 g/mol. T in K, J/(kg K); valid 60-2000 K.
func airIdealCp(T float64) float64 {
	tau := 132.6312 / T
	pows := [6]float64{-3, -2, -1, 0, 1, 1.5}
	ns := [6]float64{0.6057194e-7, -0.210274769e-4, -0.158860716e-3, 9.7450251743948, 10.0986147428912, -0.19536342e-3}
	// tau^(t-2) for t = -3, -2, -1, 0, 1, 1.5 by products (the t = 0 and
	// t = 1 terms vanish through t (t - 1)).
	x := 1 / tau
	x2 := x * x
	x3 := x2 * x
	tp := [6]float64{x3 * x2, x2 * x2, x3, x2, x, 1 / math.Sqrt(tau)}
	ftt := -2.490888032 / (tau * tau)
	for i, t := range pows {
		ftt += ns[i] * t * (t - 1) * tp[i]
	}
	for i, n := range [2]float64{0.791309509, 0.212236768} {
		th := [2]float64{25.36365, 16.90741}[i]
		e := math.Exp(-th * tau)
		ftt -= n * th * th * e / ((1 - e) * (1 - e))
	}
	{
		n, th, c := -0.197938904, 87.31279, 2.0/3
		e := math.Exp(-th * tau)
		ftt += c * n * th * th * e / ((c*e + 1) * (c*e + 1))
	}
	return (1 - tau*tau*ftt) * 8.31451 / 28.9586e-3
}

func newAir() *Gas {
	g := &Gas{
		ID: "air", Name: "Air",
		molarMass:  phys.MolarMassAir,
		diffVolume: 19.7,
		epsK:       103.3, sigmaNM: 0.360, mLJ: 28.9586, tcLJ: 132.6312,
		n1: 1.308, n2: 1.405, n3: -1.036, t2: -1.1, t3: -0.3,
		tmin: 70, tmax: 2000,
	}
	g.cp = correlation{"heat capacity", "ideal-gas part of the Lemmon et al. (2000) air equation of state",
		"Lemmon, Jacobsen, Penoncello & Friend, J. Phys. Chem. Ref. Data 29 (2000) 331", 60, 2000, airIdealCp}
	g.sources = []Source{
		{"molar mass", "dry air", "U.S. Standard Atmosphere 1976 via calc/phys (from memory)"},
		{"diffusion volume", "Fuller simple-molecule value for air", refFuller},
		{"viscosity", "dilute-gas eq. 2, eps/k = 103.3 K, sigma = 0.360 nm", "Lemmon & Jacobsen, Int. J. Thermophys. 25 (2004) 21 (read in python3-iapws 1.5.2)"},
		{"thermal conductivity", "dilute-gas eq. 5, N = 1.308, 1.405, -1.036; t = -1.1, -0.3", "Lemmon & Jacobsen (2004) (read in python3-iapws 1.5.2)"},
		g.cp.source(),
		{"density", "ideal gas p M/(R T)", "R from CODATA 2018"},
	}
	return g
}

func newNitrogen() *Gas {
	const m = 28.0134e-3
	g := &Gas{
		ID: "nitrogen", Name: "Nitrogen",
		molarMass:  phys.MolarMassNitrogen,
		diffVolume: 18.5,
		epsK:       98.94, sigmaNM: 0.3656, mLJ: 28.01348, tcLJ: 126.192,
		n1: 1.511, n2: 2.117, n3: -3.332, t2: -1.0, t3: -0.7,
		tmin: 70, tmax: 2000,
	}
	g.cp = correlation{"heat capacity", "ideal-gas polynomial Cp0/R", refPolingA + refReadVia, 50, 1000,
		perMass(m, idealGasCp(3.539, -0.000261, 0.00000007, 1.57e-09, -9.9e-13))}
	g.sources = []Source{
		{"molar mass", "N2", "IUPAC 2013 atomic weight via calc/phys"},
		{"diffusion volume", "Fuller simple-molecule value for N2", refFuller},
		{"viscosity", "dilute-gas eq. 2, eps/k = 98.94 K, sigma = 0.3656 nm", "Lemmon & Jacobsen, Int. J. Thermophys. 25 (2004) 21, Table I (from memory)"},
		{"thermal conductivity", "dilute-gas eq. 5, N = 1.511, 2.117, -3.332; t = -1.0, -0.7", "Lemmon & Jacobsen (2004) Table IV (from memory)"},
		g.cp.source(),
		{"density", "ideal gas p M/(R T)", "R from CODATA 2018"},
	}
	return g
}
