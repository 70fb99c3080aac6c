package calc

import (
	"fmt"
	"math"
	"strings"

	"fogbench/calc/evap"
	"fogbench/calc/flash"
	"fogbench/calc/fluid"
	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// Equilibrium at the drop surface at the real gas pressure: the vapor mole
// fraction over a flat surface from equal fugacities of the liquid's
// substance,
//
//	y_v φ_v p = x_L p_sat φ_sat exp(v_L (p − p_sat)/(R T)),
//
// and each class's partial pressure y_v p times its Kelvin ratio (the rest
// of the Poynting integral, from p to p + 2σ/r). p_sat, v_L = M/ρ_L and
// the Kelvin ratio come from the liquid's own correlations; φ_v, φ_sat and
// the dissolved gas 1 − x_L from an equation of state: Peng–Robinson with
// van der Waals mixing for organic liquids, the IAPWS virial guideline and
// Henry's constants for water.

// The gases' Peng–Robinson constants (fluid.Gas.Critical) and the N2–liquid
// interaction parameters with their source (fluid.FilmInteraction,
// fluid.KijSource) live in calc/fluid, which uses them for the film at
// pressure too.

// surfaceEquilibrium implements evap.SurfaceEquilibrium for one case.
type surfaceEquilibrium struct {
	l      *fluid.Liquid
	gasID  string
	p      float64
	water  bool         // water: IAPWS virial fugacity and Henry's constants
	bin    flash.Binary // organic liquids
	tcrit  float64      // surface critical limit, K
	crit   bool
	method string
	// last is the surface temperature and result of the last call, which
	// the solvers ask for again and again.
	lastT float64
	last  evap.FlatEquilibrium
	// grid holds exact solutions at T = k·eqGridStep; qT, qFlat, qLF the
	// last FlatVaporPressure query.
	grid           map[int64]eqNode
	qT, qFlat, qLF float64
}

// newSurfaceEquilibrium builds the equilibrium of liquid l under gas g at
// pressure p (Pa), or nil when the gas has no equation-of-state constants.
func newSurfaceEquilibrium(l *fluid.Liquid, g *fluid.Gas, p float64) *surfaceEquilibrium {
	gtc, gpc, gomega, ok := g.Critical()
	ge := flash.PengRobinson{Tc: gtc, Pc: gpc, Omega: gomega}
	if !ok {
		return nil
	}
	s := &surfaceEquilibrium{l: l, gasID: g.ID, p: p, lastT: math.NaN(), qT: math.NaN()}
	if l.ID == "water" {
		s.water = true
		s.method = fmt.Sprintf("water vapor in %s: fugacity coefficients by the IAPWS Guideline on a Virial Equation for the Fugacity of H2O in Humid Air (G11-15), dissolved gas by Henry's law with the IAPWS G7-04 constants, Poynting integral with the incompressible saturated liquid; latent heat at the surface from the guideline's vapor enthalpy departure and the liquid's enthalpy rise with pressure", g.Name)
		return s
	}
	kij, note, _ := fluid.FilmInteraction(l)
	s.bin = flash.Binary{
		Liquid: flash.PengRobinson{Tc: l.CriticalTemperature(), Pc: l.CriticalPressure(), Omega: l.AcentricFactor()},
		Gas:    ge, Kij: kij,
	}
	gasWord := "N2"
	if g.ID == "air" {
		gasWord = "air as one pseudo-component with the N2 value"
	}
	s.method = fmt.Sprintf("Peng–Robinson (1976) with van der Waals mixing for φ_v, φ_sat and the dissolved gas; k_ij = %.4g for %s: %s, %s; Poynting integral with the liquid's own molar volume, taken incompressible; latent heat at the surface from the liquid's L(T) corrected by Peng–Robinson departure functions", kij, gasWord, note, fluid.KijSource)
	if p >= l.CriticalPressure() {
		lo := math.Max(l.MeltingPoint(), 0.5*l.CriticalTemperature())
		if tc, err := s.bin.CriticalTemperatureOffset(p, lo, s.offset); err == nil {
			s.tcrit, s.crit = tc, true
		}
	}
	return s
}

// eqGridStep is the spacing in K of the grid on which FlatVaporPressure
// interpolates ln(enhancement) and the latent-heat factor; both are smooth
// in T, and the cubic through four nodes 0.125 K apart reproduces the
// exact solution to 1e-9 relative (TestEquilibriumGridMatchesExact;
// measured 2e-10), except next to the critical limit (eqExactBand).
const eqGridStep = 0.125

// eqExactBand is the band in K below the critical limit in which
// FlatVaporPressure solves exactly: the solution steepens towards the
// limit, and within about 8 K of it the cubic's error grows past 1e-9.
const eqExactBand = 15

// eqNode is the exact flat equilibrium at one grid node.
type eqNode struct {
	lnE, lf float64
	ok      bool
}

// node returns the grid node k (T = k·eqGridStep), solving it once.
func (s *surfaceEquilibrium) node(k int64) eqNode {
	if n, ok := s.grid[k]; ok {
		return n
	}
	if s.grid == nil {
		s.grid = map[int64]eqNode{}
	}
	var n eqNode
	if f, err := s.solve(float64(k) * eqGridStep); err == nil && f.Enhancement > 0 {
		n = eqNode{lnE: math.Log(f.Enhancement), lf: f.LatentHeatFactor, ok: true}
	}
	s.grid[k] = n
	return n
}

// interpolated returns ln(enhancement) and the latent-heat factor at T from
// the cubic through the four grid nodes around it, and false where a node
// is missing (past the critical limit, or no solution) or T is not finite.
func (s *surfaceEquilibrium) interpolated(T float64) (lnE, lf float64, ok bool) {
	x := T / eqGridStep
	if !(x > 1 && x < 1e9) {
		return 0, 0, false
	}
	k0 := math.Floor(x)
	if s.crit && (k0+2)*eqGridStep > s.tcrit-eqExactBand {
		return 0, 0, false
	}
	u := x - k0
	// Lagrange weights on the nodes −1, 0, 1, 2.
	w := [4]float64{
		-u * (u - 1) * (u - 2) / 6,
		(u + 1) * (u - 1) * (u - 2) / 2,
		-(u + 1) * u * (u - 2) / 2,
		(u + 1) * u * (u - 1) / 6,
	}
	for j := range 4 {
		n := s.node(int64(k0) - 1 + int64(j))
		if !n.ok {
			return 0, 0, false
		}
		lnE += w[j] * n.lnE
		lf += w[j] * n.lf
	}
	return lnE, lf, true
}

// CriticalTemperature implements evap.SurfaceEquilibrium.
func (s *surfaceEquilibrium) CriticalTemperature() (float64, bool) { return s.tcrit, s.crit }

// FlatVaporPressure implements evap.SurfaceEquilibrium: p_sat(T) times
// the enhancement interpolated on the grid (see eqGridStep), or the exact
// solution where the grid does not reach (next to the critical limit).
func (s *surfaceEquilibrium) FlatVaporPressure(T float64) (float64, error) {
	if T == s.qT {
		return s.qFlat, nil
	}
	if s.crit && T > s.tcrit {
		return 0, fmt.Errorf("calc: surface at %s K: %w", valid.FormatValue(T), evap.ErrTranscritical)
	}
	if lnE, lf, ok := s.interpolated(T); ok {
		s.qT, s.qFlat, s.qLF = T, s.l.SaturationPressure(T)*math.Exp(lnE), lf
		return s.qFlat, nil
	}
	f, err := s.flat(T)
	if err != nil {
		return 0, err
	}
	s.qT, s.qFlat, s.qLF = T, f.VaporPressure, f.LatentHeatFactor
	return s.qFlat, nil
}

// flat solves the flat-surface equilibrium at surface temperature T (K):
// y_v from equal fugacities of the liquid's substance and the dissolved
// gas x_g from equal fugacities of the gas: for organic liquids the
// Peng–Robinson split of flash.Binary.FlashOffset (see offset), for water
// the virial guideline and Henry's law by successive substitution from
// y_v = p_sat/p, x_g = 0 to 1e-13 in both. At p = p_sat the gas is gone (y_v = 1, x_g =
// 0, φ_v = φ_sat) and the result is p_sat exactly.
func (s *surfaceEquilibrium) flat(T float64) (evap.FlatEquilibrium, error) {
	if T == s.lastT {
		return s.last, nil
	}
	f, err := s.solve(T)
	if err == nil {
		s.lastT, s.last = T, f
	}
	return f, err
}

// solve is flat without its cache.
func (s *surfaceEquilibrium) solve(T float64) (evap.FlatEquilibrium, error) {
	if !(T > 0) || math.IsInf(T, 0) {
		return evap.FlatEquilibrium{}, valid.Errorf("drop.surface_temperature_k", T, "must be a positive temperature")
	}
	if s.crit && T > s.tcrit {
		return evap.FlatEquilibrium{}, fmt.Errorf("calc: surface at %s K: %w", valid.FormatValue(T), evap.ErrTranscritical)
	}
	l, p := s.l, s.p
	psat := l.SaturationPressure(T)
	vL := l.MolarMass() / l.Density(T)
	out := evap.FlatEquilibrium{PoyntingFactor: evap.PoyntingFactor(vL, psat, p, T), CriticalLimit: s.tcrit, CriticalLimitFound: s.crit}
	var lnPhiSat float64
	var vir fluid.HumidAirVirial
	var henry float64
	if s.water {
		vir = fluid.NewHumidAirVirial(T)
		henry, _ = fluid.WaterGasSolubility(s.gasID, T)
		lnPhiSat = vir.LnPhi(psat, 1)
	} else {
		lnPhiSat = s.bin.Liquid.PureVaporLnPhi(T, psat)
	}
	fL := psat * math.Exp(lnPhiSat) * out.PoyntingFactor // fugacity of the pure liquid at p
	if !s.water {
		sp, err := s.bin.FlashOffset(T, p, math.Log(fL/p)-s.bin.Liquid.PureLiquidLnPhi(T, p))
		if err == nil {
			lnPhiV, _, _ := s.bin.LnPhi(T, p, sp.Y2, flash.VaporPhase)
			out.LatentHeatFactor = s.latentHeatFactor(T, p, psat, sp.X2, sp.Y2)
			return s.store(T, psat, out, 1-sp.Y2, sp.X2, lnPhiSat, lnPhiV), nil
		}
		if s.crit {
			return evap.FlatEquilibrium{}, fmt.Errorf("calc: surface at %s K: %w", valid.FormatValue(T), evap.ErrTranscritical)
		}
		// Below the liquid's critical pressure the split fails only next
		// to (or past) the boiling point, where the vapor at the surface
		// is nearly pure and the gas barely dissolves: there the liquid
		// is taken pure (x_L = 1) and y_v solves y_v φ_v(y_v) p = f_L alone,
		// by a damped fixed point; failing that, φ_v = 1.
		out.LatentHeatFactor = 1
		y := math.Min(fL/p, 1)
		var lnPhiV float64
		ok := false
		for it := 0; it < 200; it++ {
			lnPhiV, _, _ = s.bin.LnPhi(T, p, 1-math.Min(y, 1), flash.VaporPhase)
			yNew := fL / (math.Exp(lnPhiV) * p)
			if !(yNew > 0) || math.IsInf(yNew, 0) {
				break
			}
			if math.Abs(yNew-y) <= 1e-13*y {
				y, ok = yNew, true
				break
			}
			y = 0.5 * (y + yNew)
		}
		if !ok {
			y, lnPhiV = fL/p, 0
		}
		return s.store(T, psat, out, y, 0, lnPhiSat, lnPhiV), nil
	}
	out.LatentHeatFactor = 1
	y := math.Min(psat/p, 1)
	xg := 0.0
	var lnPhiV float64
	// Water: the virial fugacity coefficient and Henry's law, by
	// successive substitution (the vapor is dilute in the gas or the gas
	// in the vapor; both converge in a few steps).
	for it := 0; it < 200; it++ {
		lnPhiV = vir.LnPhi(p, y)
		yNew := (1 - xg) * fL / (math.Exp(lnPhiV) * p)
		xNew := math.Max(1-yNew, 0) * p * henry
		done := math.Abs(yNew-y) <= 1e-13*math.Max(y, 1e-300) && math.Abs(xNew-xg) <= 1e-13*math.Max(xg, 1e-300)+1e-300
		y, xg = yNew, xNew
		if done || !(y > 0) || math.IsInf(y, 0) {
			break
		}
	}
	if !(y > 0) || math.IsInf(y, 0) || math.IsNaN(xg) || xg >= 1 {
		return evap.FlatEquilibrium{}, fmt.Errorf("calc: no flat-surface equilibrium at %s K and %s Pa: %w", valid.FormatValue(T), valid.FormatValue(p), evap.ErrTranscritical)
	}
	out.LatentHeatFactor = s.waterLatentHeatFactor(T, psat, y)
	return s.store(T, psat, out, y, xg, lnPhiSat, lnPhiV), nil
}

// waterLatentHeatFactor is latentHeatFactor for water: the vapor's
// partial molar enthalpy departure in the gas at (T, p, y) from the virial
// guideline, h̄ − h^ig = −R T² ∂ ln φ_w/∂T at constant p and y, against the
// saturated vapor's at (T, p_sat), and the liquid raised from p_sat to p at
// constant T, h(T, p) − h(T, p_sat) = v_L (1 − T α)(p − p_sat) with
// α = −(1/ρ) dρ/dT of the liquid's density (incompressible; checked against
// IAPWS-95 in TestWaterLiquidEnthalpyAtPressure):
//
//	L_surface = L(T) + [(h̄_V − h^ig)(p, y) − (h_V − h^ig)(p_sat, 1) − v_L (1 − T α)(p − p_sat)]/M
//
// Derivatives by central differences of ±1e-3 K.
func (s *surfaceEquilibrium) waterLatentHeatFactor(T, psat, y float64) float64 {
	const h = 1e-3
	l, p := s.l, s.p
	up, dn := fluid.NewHumidAirVirial(T+h), fluid.NewHumidAirVirial(T-h)
	rt2 := phys.GasConstant * T * T
	depMix := -rt2 * (up.LnPhi(p, y) - dn.LnPhi(p, y)) / (2 * h)
	depSat := -rt2 * (up.LnPhi(psat, 1) - dn.LnPhi(psat, 1)) / (2 * h)
	lfit := l.LatentHeat(T)
	if !(lfit > 0) {
		return 1
	}
	dhL := waterLiquidEnthalpyRise(l, T, psat, p) * l.MolarMass()
	return math.Max(1+(depMix-depSat-dhL)/(l.MolarMass()*lfit), 0.02)
}

// waterLiquidEnthalpyRise returns h(T, p) − h(T, p_sat) of the liquid in
// J/kg, v (1 − T α)(p − p_sat) with v = 1/ρ and α = −(1/ρ) dρ/dT from the
// liquid's density by central differences of ±1e-3 K (dh = v(1 − Tα) dp at
// constant T, e.g. Moran & Shapiro, Fundamentals of Engineering
// Thermodynamics, ch. 11 — from memory for the chapter).
func waterLiquidEnthalpyRise(l *fluid.Liquid, T, psat, p float64) float64 {
	const h = 1e-3
	rho := l.Density(T)
	alpha := -(l.Density(T+h) - l.Density(T-h)) / (2 * h) / rho
	return (1 - T*alpha) * (p - psat) / rho
}

// LatentHeatFactor implements evap.SurfaceEquilibrium: the factor of the
// last flat equilibrium at T, or 1 when none was computed there.
func (s *surfaceEquilibrium) LatentHeatFactor(T float64) float64 {
	if T != s.qT || !(s.qLF > 0) {
		return 1
	}
	return s.qLF
}

// latentHeatFactor returns the latent heat of the liquid's substance at the
// surface state over that of the pure liquid at saturation, both from
// Peng–Robinson departure functions. The molar enthalpy of vaporisation
// into the gas at the surface is the difference of the partial molar
// enthalpies of component 1 in the vapor (y) and the liquid (x) at (T, p);
// the ideal-gas parts cancel and each departure is
// h̄_1 − h_1^ig = −R T² (∂ ln φ_1/∂T) at constant p and composition
// (e.g. Prausnitz, Lichtenthaler & de Azevedo, 3rd ed., ch. 3 — from memory
// for the chapter), so
//
//	ΔH_surface = −R T² [∂ ln φ_1^V/∂T − ∂ ln φ_1^L/∂T]  at (T, p, y), (T, p, x)
//	ΔH_pure    = the same for the pure liquid and vapor roots at (T, p_sat)
//
// by central differences (±1e-3 K). The liquid's own fit L(T) is corrected
// by the difference, L_surface = L(T) + (ΔH_surface − ΔH_pure)/M, so that it
// stays right at low pressure (the factor tends to 1) and carries the
// equation of state's change with pressure and dissolved gas; a ratio
// ΔH_surface/ΔH_pure would blow up near the pure Tc, where ΔH_pure falls
// to 0. The factor L_surface/L(T) is kept at or above 0.02 so the heat
// balance stays defined next to the critical limit. Where the pure cubic
// has a single root at p_sat (within a few kelvin of Tc) the factor is 1.
func (s *surfaceEquilibrium) latentHeatFactor(T, p, psat, x2, y2 float64) float64 {
	surface := vaporisationEnthalpy(s.bin, T, p, x2, y2)
	pure := vaporisationEnthalpy(flash.Binary{Liquid: s.bin.Liquid, Gas: s.bin.Liquid}, T, psat, 0, 0)
	lfit := s.l.LatentHeat(T)
	if !(pure > 0) || !(surface >= 0) || !(lfit > 0) {
		return 1
	}
	f := 1 + (surface-pure)/(s.l.MolarMass()*lfit)
	return math.Max(f, 0.02)
}

// vaporisationEnthalpy returns h̄_1^V − h̄_1^L in J/mol, the enthalpy to move
// one mole of component 1 from the liquid of gas fraction x2 to the vapor
// of gas fraction y2 at T (K) and p (Pa):
// R T² [∂ ln φ_1^L/∂T − ∂ ln φ_1^V/∂T] at constant p and compositions, by
// central differences of ±1e-3 K.
func vaporisationEnthalpy(m flash.Binary, T, p, x2, y2 float64) float64 {
	const h = 1e-3
	d := func(z float64, phase flash.Phase) float64 {
		up, _, _ := m.LnPhi(T+h, p, z, phase)
		dn, _, _ := m.LnPhi(T-h, p, z, phase)
		return (up - dn) / (2 * h)
	}
	return phys.GasConstant * T * T * (d(x2, flash.LiquidPhase) - d(y2, flash.VaporPhase))
}

// store completes and keeps the flat equilibrium at T.
func (s *surfaceEquilibrium) store(T, psat float64, out evap.FlatEquilibrium, y, xg, lnPhiSat, lnPhiV float64) evap.FlatEquilibrium {
	out.VaporMoleFraction = y
	out.VaporPressure = y * s.p
	out.FugacityFactor = math.Exp(lnPhiSat - lnPhiV)
	out.Enhancement = out.VaporPressure / psat
	out.DissolvedGas = xg
	return out
}

// offset is the raise of ln φ_1 in the liquid that makes the
// Peng–Robinson split take the liquid's own pure-liquid fugacity
// p_sat φ_sat exp(v_L (p − p_sat)/(R T)) (see flash.Binary.FlashOffset).
func (s *surfaceEquilibrium) offset(T float64) float64 {
	l, p := s.l, s.p
	psat := l.SaturationPressure(T)
	vL := l.MolarMass() / l.Density(T)
	fL := psat * math.Exp(s.bin.Liquid.PureVaporLnPhi(T, psat)) * evap.PoyntingFactor(vL, psat, p, T)
	return math.Log(fL/p) - s.bin.Liquid.PureLiquidLnPhi(T, p)
}

// equilibriumBlock is the result's flat-surface equilibrium at the
// reference temperature t (K), or nil when the case has none or it cannot
// be evaluated there.
func equilibriumBlock(cond *evap.Conditions, t float64) *Equilibrium {
	s, ok := cond.Equilibrium.(*surfaceEquilibrium)
	if !ok || s == nil {
		return nil
	}
	f, err := s.flat(t)
	if err != nil {
		return nil
	}
	e := &Equilibrium{TemperatureK: t, FlatVaporPressurePa: f.VaporPressure, PoyntingFactor: f.PoyntingFactor,
		FugacityFactor: f.FugacityFactor, EnhancementFactor: f.Enhancement, DissolvedGasMoleFraction: f.DissolvedGas,
		LatentHeatJKg: s.l.LatentHeat(t) * f.LatentHeatFactor, Method: s.method}
	if s.crit {
		tc := s.tcrit
		e.MixtureCriticalTemperatureK = &tc
	}
	return e
}

// markTranscritical marks the classes whose surface reaches the mixture
// critical point: under the steady temperature at once (their state is
// the one just below it), under transient heating at the time the history
// found. Their lifetimes are withdrawn and one warning says when and
// where, in plain words.
func (s *setup) markTranscritical(cond *evap.Conditions, res *Result) {
	first, last := -1, -1
	tFirst, tLast := math.Inf(1), math.Inf(-1)
	firstClass := -1
	count := 0
	for i := range res.Bins {
		t := -1.0
		if s.criticalTimes != nil {
			if s.criticalTimes[i] >= 0 {
				t = s.criticalTimes[i]
				res.Bins[i].Transcritical = true
			}
		} else if res.Bins[i].Transcritical {
			t = 0
		}
		if t < 0 {
			continue
		}
		res.Bins[i].LifetimeS = nil
		count++
		if first < 0 {
			first = i
		}
		last = i
		if t < tFirst {
			tFirst, firstClass = t, i
		}
		tLast = math.Max(tLast, t)
	}
	if count == 0 {
		return
	}
	tc, _ := cond.Equilibrium.CriticalTemperature()
	when := "at once (the steady surface temperature lies past it)"
	if s.criticalTimes != nil {
		when = "at " + formatDuration(tFirst)
	}
	classes := fmt.Sprintf("class %d (%.3g µm)", firstClass+1, res.Bins[firstClass].DM*1e6)
	if count > 1 {
		span := ""
		if s.criticalTimes != nil && tLast > tFirst {
			span = fmt.Sprintf(", the last at %s", formatDuration(tLast))
		}
		classes += fmt.Sprintf("; %d of %d classes reach it, from %.3g to %.3g µm%s", count, len(res.Bins),
			res.Bins[first].DM*1e6, res.Bins[last].DM*1e6, span)
	}
	res.Warnings = append(res.Warnings, fmt.Sprintf("The surface reaches the mixture critical point of %s and %s (%.1f K at %s bar) %s, first in %s; after that the drop mixes as a dense fluid, which this model does not follow. Those classes are marked transcritical and have no lifetime; the history carries them on with the surface held just below that temperature, an indication only.",
		s.liquid.Name, s.gas.Name, tc, formatBar(s.c.Gas.PressurePa), when, classes))
}

// formatDuration writes a time in s, ms or µs as suits it.
func formatDuration(t float64) string {
	switch {
	case t >= 1:
		return fmt.Sprintf("%.3g s", t)
	case t >= 1e-3:
		return fmt.Sprintf("%.3g ms", t*1e3)
	}
	return fmt.Sprintf("%.3g µs", t*1e6)
}

// formatBar writes a pressure in Pa as bar.
func formatBar(p float64) string { return fmt.Sprintf("%.4g", p/1e5) }

// saturationEnhancement returns the enhancement factor f = y_v p/p_sat of
// the flat-surface equilibrium at the gas temperature T (K) and pressure p
// (Pa), by which a relative humidity is turned into a mole fraction: the
// WMO definition of relative humidity in moist air takes it against the
// saturation mole fraction x_vs = f p_sat/p (WMO Guide to Instruments and
// Methods of Observation, annex on humidity formulae — from memory), so
// that relative_humidity 1 is saturated over a flat surface of the liquid
// at the real pressure. It is 1 where the equilibrium does not apply (no
// equation-of-state constants for the gas, T past the boiling point or
// the critical limit).
func saturationEnhancement(l *fluid.Liquid, g *fluid.Gas, p, T float64) float64 {
	s := newSurfaceEquilibrium(l, g, p)
	if s == nil || l.SaturationPressure(T) >= p {
		return 1
	}
	f, err := s.flat(T)
	if err != nil || !(f.Enhancement > 0) || math.IsInf(f.Enhancement, 0) {
		return 1
	}
	return f.Enhancement
}

// equilibriumWarnings flags the surface equilibrium used outside what its
// sources cover: the water virial guideline beyond 193–473 K or 5 MPa and
// Henry's constants beyond their ranges (IAPWS G7-04 Table 2: N2 278–636 K,
// O2 274–617 K, Ar 273–568 K), and, above 1 MPa, where it matters, an
// interaction parameter that is not tabulated for the pair.
func (s *setup) equilibriumWarnings(cond *evap.Conditions, res *Result) {
	eq, ok := cond.Equilibrium.(*surfaceEquilibrium)
	if !ok || eq == nil || len(res.Bins) == 0 {
		return
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, b := range res.Bins {
		lo, hi = math.Min(lo, b.SurfaceTemperatureK), math.Max(hi, b.SurfaceTemperatureK)
	}
	p := s.c.Gas.PressurePa
	if eq.water {
		r := fluid.HumidAirVirialRange
		if lo < r[0] || hi > r[1] || p > fluid.HumidAirMaxPressure {
			res.Warnings = append(res.Warnings, fmt.Sprintf("The fugacity of water vapor in %s (IAPWS virial guideline, %g–%g K, up to %g MPa) is used at surface temperatures %.1f–%.1f K and %.4g MPa; the enhancement factor is extrapolated there.",
				strings.ToLower(s.gas.Name), r[0], r[1], fluid.HumidAirMaxPressure/1e6, lo, hi, p/1e6))
		}
		hmin, hmax := 278.0, 568.0 // the narrowest of the air gases' ranges
		if s.gas.ID == "nitrogen" {
			hmax = 636
		}
		if lo < hmin || hi > hmax {
			res.Warnings = append(res.Warnings, fmt.Sprintf("Henry's constants of the gas in water (IAPWS G7-04, %g–%g K here) are used at surface temperatures %.1f–%.1f K; the dissolved gas is extrapolated.", hmin, hmax, lo, hi))
		}
		return
	}
	if p > 1e6 {
		if _, vnote, ok := fluid.FilmInteraction(s.liquid); !ok || strings.Contains(vnote, "assumption") || strings.Contains(vnote, "no tabulated") {
			note := "0, no tabulated value"
			if ok {
				note = vnote
			}
			res.Warnings = append(res.Warnings, fmt.Sprintf("No published nitrogen interaction parameter for %s was found: the surface equilibrium takes k_ij = %s. At %.4g bar that matters: for n-dodecane in N2 at 20–60 bar a change of ±0.03 in k_ij moves the surface vapor content by up to 2 %% and the dissolved gas by up to 7 %%.",
				s.liquid.Name, note, p/1e5))
		}
	}
}
