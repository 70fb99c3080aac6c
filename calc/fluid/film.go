package fluid

import (
	"math"

	"fogbench/calc/valid"
)

// Film is the state of the gas film around an evaporating drop at the
// reference state of the 1/3 rule, with mixture properties of vapor + gas.
type Film struct {
	T                 float64  `json:"temperature_k"`              // reference temperature, K
	VaporMassFraction float64  `json:"vapor_mass_fraction"`        // reference vapor mass fraction
	VaporMoleFraction float64  `json:"vapor_mole_fraction"`        // the same as a mole fraction
	MolarMass         float64  `json:"molar_mass_kg_mol"`          // mixture molar mass, kg/mol
	Density           float64  `json:"density_kg_m3"`              // mixture density, kg/m3 (Peng–Robinson above 0.5 MPa, see dense.go)
	Compressibility   float64  `json:"compressibility"`            // Z of the film mixture as used (1: ideal gas)
	Viscosity         float64  `json:"viscosity_pa_s"`             // Wilke mixture viscosity, Pa s
	Conductivity      float64  `json:"conductivity_w_m_k"`         // Mason-Saxena mixture conductivity, W/(m K)
	HeatCapacity      float64  `json:"heat_capacity_j_kg_k"`       // mass-weighted mixture cp, J/(kg K)
	VaporHeatCapacity float64  `json:"vapor_heat_capacity_j_kg_k"` // cp of the pure vapor at T, J/(kg K)
	Diffusivity       float64  `json:"diffusivity_m2_s"`           // Fuller vapor-gas diffusivity, m2/s
	MeanFreePath      float64  `json:"mean_free_path_m"`           // gas-kinetic mean free path of the mixture, m
	Warnings          []string `json:"warnings,omitempty"`
}

// CheckFilm validates the inputs of FilmProperties: p, Ts and Tinf positive
// and finite, Ys and Yinf in [0, 1), Ts inside the liquid's hard limits. It
// returns the warnings of the liquid, vapor and gas range checks at the
// reference state.
func CheckFilm(l *Liquid, g *Gas, p, Ts, Tinf, Ys, Yinf float64) ([]string, error) {
	var es valid.Errors
	es.Add(valid.Positive("gas.pressure_pa", p))
	es.Add(valid.Positive("gas.temperature_k", Tinf))
	es.Add(valid.Between("surface_vapor_mass_fraction", Ys, 0, 1, ""))
	es.Add(valid.Between("gas.vapor_mass_fraction", Yinf, 0, 1, ""))
	if Ys >= 1 {
		es.Add(valid.Errorf("surface_vapor_mass_fraction", Ys, "must be below 1 (the drop is boiling)"))
	}
	if Yinf >= 1 {
		es.Add(valid.Errorf("gas.vapor_mass_fraction", Yinf, "must be below 1"))
	}
	lw, err := l.Check(Ts)
	es.Add(err)
	if err := es.Err(); err != nil {
		return nil, err
	}
	tr := Ts + (Tinf-Ts)/3
	vw, _ := l.VaporCheck(tr)
	gw, _ := g.Check(tr, p)
	return append(append(lw, vw...), gw...), nil
}

// FilmProperties evaluates the gas film at the reference state of the 1/3
// rule (Hubbard, Denny & Mills, Int. J. Heat Mass Transfer 18 (1975) 1003;
// Yuen & Chen 1976; from memory):
//
//	Tr = Ts + (Tinf - Ts)/3,  Yr = Ys + (Yinf - Ys)/3
//
// with vapor (v) and gas (g) mixed by these rules:
//
//	x_v = (Yr/M_v) / (Yr/M_v + (1 - Yr)/M_g),  M = 1/(Yr/M_v + (1 - Yr)/M_g)
//	density: ideal gas rho = p M/(R Tr)
//	  (at pressure: Peng–Robinson, and the dense viscosity, conductivity
//	  and diffusivity corrections of dense.go, phased in between 0.5 and
//	  1 MPa)
//	cp: mass-weighted cp = Yr cp_v + (1 - Yr) cp_g
//	viscosity: Wilke (1950), Poling et al. 5th ed. eq. 9-5.13,
//	  mu = sum_i x_i mu_i / sum_j x_j phi_ij,
//	  phi_ij = [1 + (mu_i/mu_j)^(1/2) (M_j/M_i)^(1/4)]^2 / [8 (1 + M_i/M_j)]^(1/2)
//	conductivity: Wassiljewa form with the Mason & Saxena (1958) A_ij = phi_ij,
//	  Poling et al. 5th ed. eqs. 10-6.1 and 10-6.4 (epsilon = 1)
//	diffusivity: Fuller (Diffusivity) at Tr, p
//	mean free path: MeanFreePath with the mixture viscosity and molar mass
//
// p in Pa, temperatures in K, mass fractions dimensionless. Inputs must pass
// CheckFilm; its warnings are copied into Film.Warnings. Invalid inputs are
// held to the nearest valid value (T, p >= 1e-3, Y in [0, 0.999999]) so that
// no NaN leaves the function.
func FilmProperties(l *Liquid, g *Gas, p, Ts, Tinf, Ys, Yinf float64) Film {
	w, err := CheckFilm(l, g, p, Ts, Tinf, Ys, Yinf)
	if err != nil {
		w = []string{"invalid film inputs, values held to the nearest valid ones: " + err.Error()}
	}
	var pc filmPure
	pc.at(l, g, p, Ts, Tinf)
	f := pc.mix(Ys, Yinf)
	f.Warnings = w
	return f
}

// filmPure holds what FilmProperties computes from the pure components
// alone: everything at the reference temperature, which depends on Ts and
// Tinf but not on the vapor fractions.
type filmPure struct {
	p, tr, mv, mg              float64
	cpv, cpg, muv, mug, kv, kg float64
	phiVG, phiGV, diff         float64
	inP, inTs, inTinf          float64 // the arguments it was made for
	set                        bool
	// The pair constants of Diffusivity, kept across calls for one pair.
	fl  fuller
	fl1 *Liquid
	flg *Gas
	// The dense-film constants of the pair (dense.go).
	dense denseFilm
}

// at fills pc for p, Ts, Tinf as FilmProperties takes them (held to the
// nearest valid values).
func (pc *filmPure) at(l *Liquid, g *Gas, p, Ts, Tinf float64) {
	pc.inP, pc.inTs, pc.inTinf, pc.set = p, Ts, Tinf, true
	p = positiveOr(p, 1e-3)
	Ts = l.clampLiquid(Ts)
	Tinf = positiveOr(Tinf, 1e-3)
	pc.atRef(l, g, p, Ts+(Tinf-Ts)/3)
}

// atRef fills the properties at the reference temperature tr (held p).
func (pc *filmPure) atRef(l *Liquid, g *Gas, p, tr float64) {
	pc.p, pc.tr, pc.mv, pc.mg = p, tr, l.molarMass, g.molarMass
	// The same numbers as VaporHeatCapacity, HeatCapacity, VaporViscosity,
	// Viscosity, VaporConductivity, Conductivity and Diffusivity at tr, with
	// the work they share done once (TestFilmPureMatchesPublicFunctions).
	pc.cpv, pc.muv, pc.kv = l.vaporProps(tr)
	pc.cpg, pc.mug, pc.kg = g.filmProps(tr)
	pc.phiVG = wilkePhi(pc.muv, pc.mug, pc.mv, pc.mg)
	pc.phiGV = wilkePhi(pc.mug, pc.muv, pc.mg, pc.mv)
	if pc.fl1 != l || pc.flg != g {
		pc.fl, pc.fl1, pc.flg = fullerPair(l, g), l, g
	}
	pc.setDense(l, g)
	if tr > 0 && p > 0 && !math.IsInf(tr, 0) && !math.IsInf(p, 0) {
		pc.diff = pc.fl.at(tr, p)
	} else {
		pc.diff = 0
	}
}

// mix is the mixing step of FilmProperties at the vapor mass fractions Ys
// and Yinf (held to [0, 0.999999]).
func (pc *filmPure) mix(Ys, Yinf float64) Film {
	Ys, Yinf = clampFraction(Ys), clampFraction(Yinf)
	tr, p := pc.tr, pc.p
	yr := Ys + (Yinf-Ys)/3
	mv, mg := pc.mv, pc.mg
	nv, ng := yr/mv, (1-yr)/mg
	xv := nv / (nv + ng)
	m := 1 / (nv + ng)
	cpv, cpg, muv, mug, kv, kg := pc.cpv, pc.cpg, pc.muv, pc.mug, pc.kv, pc.kg
	phiVG, phiGV := pc.phiVG, pc.phiGV
	xg := 1 - xv
	mu := xv*muv/(xv+xg*phiVG) + xg*mug/(xg+xv*phiGV)
	k := xv*kv/(xv+xg*phiVG) + xg*kg/(xg+xv*phiGV)

	f := Film{
		T:                 tr,
		VaporMassFraction: yr,
		VaporMoleFraction: xv,
		MolarMass:         m,
		Density:           p * m / (gasConstant * tr),
		Viscosity:         mu,
		Conductivity:      k,
		HeatCapacity:      yr*cpv + (1-yr)*cpg,
		VaporHeatCapacity: cpv,
		Diffusivity:       pc.diff,
		MeanFreePath:      MeanFreePath(mu, tr, p, m),
		Compressibility:   1,
	}
	pc.dense.apply(&f, p)
	return f
}

// setDense makes pc's dense-film constants those of l in g.
func (pc *filmPure) setDense(l *Liquid, g *Gas) {
	if pc.dense.liquidFor != l || pc.dense.gasFor != g {
		pc.dense = newDenseFilm(l, g)
	}
}

// FilmCache evaluates the film of one liquid in one gas for a solver that
// asks many times. It keeps the pure-component properties of the last
// (p, Ts, Tinf), so that at a fixed surface temperature every drop size
// pays only for the mixing step (the vapor fraction at the surface changes
// with the Kelvin raise, the reference temperature does not). Solvers whose
// surface temperature changes at every call (the steady temperature of each
// size, transient heating) get them, from the second surface temperature
// on, by interpolation on a grid in the reference temperature (see
// filmGridStep). It is not safe for concurrent use; make one per
// evaluation.
type FilmCache struct {
	l  *Liquid
	g  *Gas
	pc filmPure
	// The grid: pure-component properties at tr = k·filmGridStep for the
	// p and Tinf of gridP, gridTinf, filled as queries need them.
	grid            map[int64]filmNode
	gridP, gridTinf float64
	// win holds the four nodes around the last gridded query (the cell
	// k0), which nearby queries share.
	win    [4]filmNode
	winK   int64
	winSet bool
	misses int // surface states computed so far
}

// filmGridStep is the spacing in K of FilmCache's grid in the reference
// temperature. Each property is interpolated by the cubic through the four
// nodes around the query; the properties are smooth in T, and with nodes
// 0.125 K apart the interpolation error is at the level of the rounding of
// the property functions themselves (TestFilmCacheGridMatchesFilmProperties
// holds every film number to 1e-12 relative of FilmProperties).
const filmGridStep = 0.125

// filmNode is what the grid keeps of filmPure at a node.
type filmNode struct{ cpv, cpg, muv, mug, kv, kg, diff, phiVG, phiGV float64 }

// node returns the grid's node k (tr = k·filmGridStep at gridP), computing
// it the first time.
func (c *FilmCache) node(k int64) filmNode {
	if n, ok := c.grid[k]; ok {
		return n
	}
	var pc filmPure
	pc.fl, pc.fl1, pc.flg = c.pc.fl, c.pc.fl1, c.pc.flg
	pc.atRef(c.l, c.g, c.gridP, float64(k)*filmGridStep)
	c.pc.fl, c.pc.fl1, c.pc.flg = pc.fl, pc.fl1, pc.flg
	n := filmNode{pc.cpv, pc.cpg, pc.muv, pc.mug, pc.kv, pc.kg, pc.diff, pc.phiVG, pc.phiGV}
	c.grid[k] = n
	return n
}

// NewFilmCache returns an empty cache for liquid l in gas g.
func NewFilmCache(l *Liquid, g *Gas) *FilmCache { return &FilmCache{l: l, g: g} }

// Properties returns FilmProperties(l, g, p, Ts, Tinf, Ys, Yinf) without
// its Warnings (call CheckFilm for those); see FilmProperties for the
// formulas, units and sources. The first surface state, and any whose
// interpolation would reach outside the property functions' smooth range,
// are computed directly and are FilmProperties' numbers bit for bit; later
// ones come from the grid, within 1e-12 relative.
func (c *FilmCache) Properties(p, Ts, Tinf, Ys, Yinf float64) Film {
	if !c.pc.set || c.pc.inP != p || c.pc.inTs != Ts || c.pc.inTinf != Tinf {
		c.misses++
		if c.misses == 1 || !c.fromGrid(p, Ts, Tinf) {
			c.pc.at(c.l, c.g, p, Ts, Tinf)
		}
	}
	return c.pc.mix(Ys, Yinf)
}

// fromGrid fills c.pc for (p, Ts, Tinf) by interpolation on the grid and
// reports whether it could: the inputs must be valid as they stand (no
// holding) and the four nodes inside the range where the vapor and gas
// properties are evaluated unclamped.
func (c *FilmCache) fromGrid(p, Ts, Tinf float64) bool {
	l, g := c.l, c.g
	if !(p >= 1e-3 && p <= math.MaxFloat64) || !(Tinf >= 1e-3 && Tinf <= math.MaxFloat64) || l.clampLiquid(Ts) != Ts {
		return false
	}
	tr := Ts + (Tinf-Ts)/3
	x := tr / filmGridStep
	k0 := math.Floor(x)
	lo, hi := (k0-1)*filmGridStep, (k0+2)*filmGridStep
	if !(k0 > -1e15 && k0 < 1e15) || l.clampVapor(lo) != lo || l.clampVapor(hi) != hi || g.clamp(lo) != lo || g.clamp(hi) != hi {
		return false
	}
	if c.grid == nil || c.gridP != p || c.gridTinf != Tinf {
		c.grid, c.gridP, c.gridTinf, c.winSet = map[int64]filmNode{}, p, Tinf, false
	}
	if k := int64(k0); !c.winSet || c.winK != k {
		for j := range c.win {
			c.win[j] = c.node(k - 1 + int64(j))
		}
		c.winK, c.winSet = k, true
	}
	// Lagrange weights of the cubic through the nodes at −1, 0, 1, 2.
	u := x - k0
	w0, w1, w2, w3 := -u*(u-1)*(u-2)/6, (u+1)*(u-1)*(u-2)/2, -(u+1)*u*(u-2)/2, (u+1)*u*(u-1)/6
	n0, n1, n2, n3 := &c.win[0], &c.win[1], &c.win[2], &c.win[3]
	pc := &c.pc
	pc.setDense(l, g)
	pc.inP, pc.inTs, pc.inTinf, pc.set = p, Ts, Tinf, true
	pc.p, pc.tr, pc.mv, pc.mg = p, tr, l.molarMass, g.molarMass
	pc.cpv = w0*n0.cpv + w1*n1.cpv + w2*n2.cpv + w3*n3.cpv
	pc.cpg = w0*n0.cpg + w1*n1.cpg + w2*n2.cpg + w3*n3.cpg
	pc.muv = w0*n0.muv + w1*n1.muv + w2*n2.muv + w3*n3.muv
	pc.mug = w0*n0.mug + w1*n1.mug + w2*n2.mug + w3*n3.mug
	pc.kv = w0*n0.kv + w1*n1.kv + w2*n2.kv + w3*n3.kv
	pc.kg = w0*n0.kg + w1*n1.kg + w2*n2.kg + w3*n3.kg
	pc.diff = w0*n0.diff + w1*n1.diff + w2*n2.diff + w3*n3.diff
	pc.phiVG = w0*n0.phiVG + w1*n1.phiVG + w2*n2.phiVG + w3*n3.phiVG
	pc.phiGV = w0*n0.phiGV + w1*n1.phiGV + w2*n2.phiGV + w3*n3.phiGV
	return true
}

// wilkePhi is Wilke's interaction parameter phi_ij (Poling et al. 5th ed.
// eq. 9-5.14).
func wilkePhi(mui, muj, mi, mj float64) float64 {
	a := 1 + math.Sqrt(mui/muj)*math.Sqrt(math.Sqrt(mj/mi))
	return a * a / math.Sqrt(8*(1+mi/mj))
}

func positiveOr(v, floor float64) float64 {
	if math.IsNaN(v) || v < floor {
		return floor
	}
	if math.IsInf(v, 1) {
		return math.MaxFloat64
	}
	return v
}

func clampFraction(y float64) float64 {
	if math.IsNaN(y) || y < 0 {
		return 0
	}
	return math.Min(y, 0.999999)
}
