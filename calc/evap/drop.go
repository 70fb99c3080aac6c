package evap

import (
	"fmt"
	"math"

	"fogbench/calc/valid"
)

// maxSurfaceMoleFraction caps the surface vapor mole fraction X_s. Where the
// curved-surface vapor pressure S·p_sat would reach the gas pressure (tiny
// drops near the boiling point) the quasi-steady Stefan-flow model no longer
// applies; the cap keeps B_M finite (ln(1+B_M) ≲ 14) and the rate is flagged.
const maxSurfaceMoleFraction = 1 - 1e-6

// Warning flags raised while evaluating a drop; see warningText.
const (
	warnSurfaceCapped = 1 << iota
	warnRanzMarshallRe
	warnCliftRe
	warnASB
	warnASPrSc
	warnKelvinSmall
	warnContinuumAtHighKn
	warnEnhancementUndefined
	warnTranscritical
)

func warningText(flags uint) []string {
	if flags == 0 {
		return nil
	}
	var w []string
	add := func(bit uint, s string) {
		if flags&bit != 0 {
			w = append(w, s)
		}
	}
	add(warnSurfaceCapped, "the curved-surface vapor pressure reaches the gas pressure: the drop is boiling, and the rate is capped at X_s = 1 − 1e-6")
	add(warnRanzMarshallRe, "Reynolds number above 200, outside the range of the Ranz–Marshall/Frössling data")
	add(warnCliftRe, "Reynolds number above 400, outside the range of the Clift Sh0/Nu0 form")
	add(warnASB, "Spalding number outside 0–20, the fitted range of the Abramzon–Sirignano F(B)")
	add(warnASPrSc, "Prandtl or Schmidt number outside 1–3, the fitted range of the Abramzon–Sirignano F(B)")
	add(warnKelvinSmall, "radius below 5 nm: the Kelvin equation is only indicative there")
	add(warnContinuumAtHighKn, "Knudsen number above 0.1 with the transition correction off: the continuum rate overstates evaporation")
	add(warnTranscritical, "the surface reaches the mixture critical point of liquid and gas: the steady temperature is held just below it, where the evaporation model stops applying")
	add(warnEnhancementUndefined, "a flat surface would not evaporate here (it would condense or stay in equilibrium), so the curvature enhancement is undefined (reported as 0)")
	return w
}

// DropState is the quasi-steady state of one drop. All fields are SI.
type DropState struct {
	Diameter           float64 // d, m
	SurfaceTemperature float64 // T_s, K
	LaplacePressure    float64 // 2σ/r, Pa
	VaporPressure      float64 // equilibrium vapor partial pressure over the drop, S times the flat value (p_sat without Equilibrium), Pa
	KelvinRatio        float64 // S = p_r/p_sat (1 when Curvature is off)
	Knudsen            float64 // λ/r
	Regime             string  // see Regime
	MassRate           float64 // evaporation rate, kg/s (> 0 evaporating, < 0 condensing)
	// Enhancement is the rate with the Kelvin raise over the rate of a flat
	// surface at the same diameter and surface temperature (1 when Curvature
	// is off; 0, with a warning, when the flat surface does not evaporate).
	Enhancement float64
	BM, BT      float64 // Spalding mass number and heat number c_p,v (T_∞ − T_s)/L

	SurfaceVaporMassFraction float64 // Y_s
	Reynolds                 float64 // ρ_g |u| d / μ_g on the film state
	Sherwood, Nusselt        float64 // the Sh and Nu used (Sh*, Nu* for Abramzon–Sirignano)
	TransitionFactor         float64 // Fuchs–Sutugin factor applied (1 when Transition is off)
	HeatRate                 float64 // heat conducted from the gas to the surface, W
	HeatToLiquid             float64 // HeatRate − MassRate·L, W; zero at the steady temperature
	// Transcritical is set when the steady heat balance has no root below
	// the surface's critical limit: the state is the one just below it,
	// where the model stops (see ErrTranscritical).
	Transcritical bool
	Warnings      []string
}

// dropEval is the allocation-free core of DropState used inside solvers.
type dropEval struct {
	mdot, heatToLiquid, q    float64
	s, psat, pv, sigma, rhoL float64
	flat                     float64 // flat-surface equilibrium partial pressure, Pa
	lk, ys, bm, bt, kn, fs   float64
	re, sh, nu, lat          float64
	conductance              float64 // ∂Q/∂(T_∞ − T_s) at fixed film: Q/(T_∞ − T_s), W/K
	flags                    uint
}

// evaluate computes the quasi-steady state of a drop of diameter d (m) at
// surface temperature ts (K), with (curved) or without the Kelvin raise.
//
// Mass rate (Spalding 1953; Abramzon & Sirignano 1989 eq. 22 form):
//
//	ṁ = π d ρ_g D Sh ln(1 + B_M) · f_FS
//
// Heat conducted to the surface with Stefan flow (Abramzon & Sirignano 1989):
//
//	Q = π d k Nu (T_∞ − T_s) ln(1 + B_T')/B_T' · f_FS,
//	B_T' = (1 + B_M)^φ − 1,  φ = (c_p,v/c_p,g)(Sh/Nu)/Le,  Le = k/(ρ_g D c_p,g)
//
// The same Fuchs–Sutugin factor is applied to heat as to mass, a
// simplification (no source) that leaves the steady temperature independent
// of the transition correction.
func (c *Conditions) evaluate(d, ts float64, curved bool) (dropEval, error) {
	return c.evaluateAt(d, ts, curved, nil)
}

// liquidAt holds the liquid properties at one surface temperature, so that
// a sweep over diameters at a fixed temperature evaluates them once.
type liquidAt struct {
	ts, psat, sigma, rhoL, lat, flat float64
	ok                               bool
}

// evaluateAt is evaluate with an optional cache of the liquid properties
// (nil for none); the cache changes no result, only how often the
// property functions run.
func (c *Conditions) evaluateAt(d, ts float64, curved bool, cache *liquidAt) (dropEval, error) {
	var e dropEval
	l := c.Liquid
	r := d / 2
	mv := l.MolarMass()
	if cache != nil && cache.ok && cache.ts == ts {
		e.psat, e.sigma, e.rhoL, e.lat, e.flat = cache.psat, cache.sigma, cache.rhoL, cache.lat, cache.flat
	} else {
		e.psat = l.SaturationPressure(ts)
		e.sigma = l.SurfaceTension(ts)
		e.rhoL = l.Density(ts)
		e.lat = l.LatentHeat(ts)
		if err := c.checkCritical(ts); err != nil {
			return e, err
		}
		if err := propertyCheck(ts, e.psat, e.sigma, e.rhoL, e.lat, mv); err != nil {
			return e, err
		}
		e.flat = e.psat
		if c.Equilibrium != nil {
			f, err := c.Equilibrium.FlatVaporPressure(ts)
			if err != nil {
				return e, err
			}
			e.flat = f
			e.lat *= c.Equilibrium.LatentHeatFactor(ts)
		}
		if cache != nil {
			*cache = liquidAt{ts: ts, psat: e.psat, sigma: e.sigma, rhoL: e.rhoL, lat: e.lat, flat: e.flat, ok: true}
		}
	}
	e.lk = KelvinLength(e.sigma, mv/e.rhoL, ts)
	e.s = 1
	if curved {
		e.s = math.Exp(math.Min(e.lk/r, maxKelvinExponent))
		if r < 5e-9 {
			e.flags |= warnKelvinSmall
		}
	}
	e.pv = e.s * e.flat
	xs := e.pv / c.Pressure
	if xs > maxSurfaceMoleFraction {
		xs = maxSurfaceMoleFraction
		e.flags |= warnSurfaceCapped
	}
	e.ys = MassFraction(xs, mv, c.GasMolarMass)
	yinf := MassFraction(c.VaporMoleFraction, mv, c.GasMolarMass)
	e.bm = SpaldingMassNumber(e.ys, yinf)
	lnbm := math.Log1p(e.bm)

	f := c.Gas.Film(c.Pressure, ts, c.GasTemperature, e.ys, yinf)
	if err := f.check(); err != nil {
		return e, err
	}
	rho, mu, k, cp, cpv, diff := f.Density, f.Viscosity, f.Conductivity, f.HeatCapacity, f.VaporHeatCapacity, f.Diffusivity
	e.re = rho * c.RelativeVelocity * d / mu
	sc := mu / (rho * diff)
	pr := mu * cp / k
	le := k / (rho * diff * cp)
	e.bt = SpaldingHeatNumber(cpv, c.GasTemperature, ts, e.lat)

	var sh0, nu0 float64
	as := false
	switch c.Convection {
	case ConvectionRanzMarshall:
		sh0, nu0 = RanzMarshall(e.re, sc), RanzMarshall(e.re, pr)
		if e.re > ranzMarshallMaxRe {
			e.flags |= warnRanzMarshallRe
		}
	case ConvectionFrossling:
		sh0, nu0 = Frossling(e.re, sc), Frossling(e.re, pr)
		if e.re > ranzMarshallMaxRe {
			e.flags |= warnRanzMarshallRe
		}
	case ConvectionAbramzonSirignano:
		as = true
		sh0, nu0 = CliftNumber(e.re, sc), CliftNumber(e.re, pr)
		if e.re > asMaxRe {
			e.flags |= warnCliftRe
		}
		if e.re > 0 && (pr < asMinPrSc || pr > asMaxPrSc || sc < asMinPrSc || sc > asMaxPrSc) {
			e.flags |= warnASPrSc
		}
	default:
		sh0, nu0 = 2, 2
	}
	e.sh, e.nu = sh0, nu0
	if as {
		e.sh = ModifiedNumber(sh0, e.bm)
	}
	// B_T' depends on Nu* through φ and Nu* on B_T' through F: a fixed
	// point that converges in a few sweeps because F varies slowly.
	var bte, phiLnBM float64
	for it := 0; it < 50; it++ {
		phiLnBM = (cpv / cp) * (e.sh / e.nu) / le * lnbm
		bte = math.Expm1(phiLnBM)
		if !as || e.re == 0 {
			break
		}
		nu := ModifiedNumber(nu0, bte)
		done := math.Abs(nu-e.nu) <= 1e-13*nu
		e.nu = nu
		if done {
			phiLnBM = (cpv / cp) * (e.sh / e.nu) / le * lnbm
			bte = math.Expm1(phiLnBM)
			break
		}
	}
	if as && e.re > 0 && (e.bm < 0 || e.bm > asMaxB || bte < 0 || bte > asMaxB) {
		e.flags |= warnASB
	}

	lambda := f.MeanFreePath
	if lambda == 0 {
		lambda = VaporMeanFreePath(diff, f.T, mv)
	}
	e.kn = Knudsen(lambda, r)
	e.fs = 1
	if c.Transition {
		e.fs = FuchsSutugin(e.kn, c.alpha())
	} else if e.kn > slipMaxKnudsen {
		e.flags |= warnContinuumAtHighKn
	}
	e.mdot = math.Pi * d * rho * diff * e.sh * lnbm * e.fs
	// ln(1 + B_T')/B_T' with ln(1 + B_T') = φ ln(1 + B_M) exactly, since
	// B_T' = e^(φ ln(1 + B_M)) − 1: no second logarithm.
	stefan := 1.0
	if bte != 0 {
		stefan = phiLnBM / bte
	}
	e.q = e.fs * math.Pi * d * k * e.nu * (c.GasTemperature - ts) * stefan
	e.conductance = e.fs * math.Pi * d * k * e.nu * stefan
	e.heatToLiquid = e.q - e.mdot*e.lat
	return e, nil
}

// PropertyLimitError is the error of a rate evaluated at a surface
// temperature where one of the liquid's properties is not usable: its
// latent heat or surface tension has reached zero at the critical point,
// or a fit has left the range where it is a number. It is a physical
// limit of the model (the surface has reached the liquid's critical
// region), which the caller words for the user; Err is the field error
// naming the property.
type PropertyLimitError struct {
	Property    string  // the property, as in Err's field: "liquid.latent_heat_j_kg"
	Temperature float64 // the surface temperature reached, K
	Err         error
}

func (e *PropertyLimitError) Error() string { return e.Err.Error() }
func (e *PropertyLimitError) Unwrap() error { return e.Err }

func propertyCheck(ts, psat, sigma, rhoL, lat, mv float64) error {
	bad := func(name string, v float64, positive bool) error {
		if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 || (positive && v == 0) {
			return &PropertyLimitError{Property: name, Temperature: ts,
				Err: valid.Errorf(name, v, "liquid property is not a usable number at %s K", valid.FormatValue(ts))}
		}
		return nil
	}
	for _, err := range []error{
		bad("liquid.saturation_pressure_pa", psat, false),
		bad("liquid.surface_tension_n_m", sigma, false),
		bad("liquid.density_kg_m3", rhoL, true),
		bad("liquid.latent_heat_j_kg", lat, true),
		bad("liquid.molar_mass_kg_mol", mv, true),
	} {
		if err != nil {
			return err
		}
	}
	return nil
}

// check rejects film properties that are not positive and finite (the
// mean free path may be zero: evap then estimates it); the error names the
// first bad one. Every rate evaluation checks its film, so usable values
// pass one comparison chain (NaN fails every comparison).
func (f Film) check() error {
	const big = math.MaxFloat64
	if f.T > 0 && f.T <= big && f.Density > 0 && f.Density <= big && f.Viscosity > 0 && f.Viscosity <= big &&
		f.Conductivity > 0 && f.Conductivity <= big && f.HeatCapacity > 0 && f.HeatCapacity <= big &&
		f.VaporHeatCapacity > 0 && f.VaporHeatCapacity <= big && f.Diffusivity > 0 && f.Diffusivity <= big &&
		f.MeanFreePath >= 0 && f.MeanFreePath <= big {
		return nil
	}
	for _, p := range []struct {
		name string
		v    float64
	}{
		{"film.temperature_k", f.T},
		{"film.density_kg_m3", f.Density},
		{"film.viscosity_pa_s", f.Viscosity},
		{"film.conductivity_w_m_k", f.Conductivity},
		{"film.heat_capacity_j_kg_k", f.HeatCapacity},
		{"film.vapor_heat_capacity_j_kg_k", f.VaporHeatCapacity},
		{"film.diffusivity_m2_s", f.Diffusivity},
	} {
		if err := valid.Positive(p.name, p.v); err != nil {
			return err
		}
	}
	return valid.NonNegative("film.mean_free_path_m", f.MeanFreePath)
}

// Drop returns the quasi-steady state of a drop of diameter d (m) whose
// surface is at Ts (K), and its evaporation rate
//
//	ṁ = π d ρ_g D Sh ln(1 + B_M) · f_FS(Kn, α)       (kg/s)
//
// with X_s = S(r) p_sat(T_s)/p, Y from X by MassFraction, B_M by
// SpaldingMassNumber, Sh from the chosen convection model (2 when stagnant,
// which gives the classical ṁ = 2π d ρ_g D ln(1 + B_M)), and f_FS the
// Fuchs–Sutugin factor when Transition is on. Sources: Spalding (1953);
// Abramzon & Sirignano (1989); Fuchs & Sutugin (1971) (see each helper).
//
// Enhancement is ṁ with curvature over ṁ of a flat surface at the same d and
// Ts. Errors: invalid Conditions, d ≤ 0, Ts ≤ 0, or Ts at or above the
// boiling point (p_sat(Ts) ≥ p). Results outside a correlation's range carry
// Warnings.
func (c *Conditions) Drop(d, Ts float64) (DropState, error) {
	if err := c.Validate(); err != nil {
		return DropState{}, err
	}
	if err := valid.Positive("drop.diameter_m", d); err != nil {
		return DropState{}, err
	}
	if err := c.checkSurfaceTemperature(Ts); err != nil {
		return DropState{}, err
	}
	var liq liquidAt // the curved and flat states share the liquid properties
	return c.dropAt(d, Ts, &liq)
}

// checkSurfaceTemperature refuses a surface temperature that is not
// positive or at which the liquid boils at the gas pressure.
func (c *Conditions) checkSurfaceTemperature(ts float64) error {
	if err := valid.Positive("drop.surface_temperature_k", ts); err != nil {
		return err
	}
	if ps := c.Liquid.SaturationPressure(ts); ps >= c.Pressure {
		return valid.Errorf("drop.surface_temperature_k", ts,
			"is at or above the boiling point at the gas pressure (p_sat = %s Pa ≥ %s Pa)", valid.FormatValue(ps), valid.FormatValue(c.Pressure))
	}
	return nil
}

// dropAt is Drop after its checks, with the liquid-property cache liq.
func (c *Conditions) dropAt(d, Ts float64, liq *liquidAt) (DropState, error) {
	e, err := c.evaluateAt(d, Ts, c.Curvature, liq)
	if err != nil {
		return DropState{}, err
	}
	enh := 1.0
	if c.Curvature {
		flat, err := c.evaluateAt(d, Ts, false, liq)
		if err != nil {
			return DropState{}, err
		}
		if flat.mdot > 0 {
			enh = e.mdot / flat.mdot
		} else {
			enh = 0
			e.flags |= warnEnhancementUndefined
		}
	}
	return e.state(d, Ts, enh), nil
}

func (e dropEval) state(d, ts, enh float64) DropState {
	return DropState{
		Diameter:                 d,
		SurfaceTemperature:       ts,
		LaplacePressure:          LaplacePressure(e.sigma, d/2),
		VaporPressure:            e.pv,
		KelvinRatio:              e.s,
		Knudsen:                  e.kn,
		Regime:                   Regime(e.kn),
		MassRate:                 e.mdot,
		Enhancement:              enh,
		BM:                       e.bm,
		BT:                       e.bt,
		SurfaceVaporMassFraction: e.ys,
		Reynolds:                 e.re,
		Sherwood:                 e.sh,
		Nusselt:                  e.nu,
		TransitionFactor:         e.fs,
		HeatRate:                 e.q,
		HeatToLiquid:             e.heatToLiquid,
		Warnings:                 warningText(e.flags),
	}
}

// String gives a one-line summary, handy in examples and logs.
func (s DropState) String() string {
	return fmt.Sprintf("d=%.3g m Ts=%.2f K mdot=%.4g kg/s E=%.6f Kn=%.3g (%s)",
		s.Diameter, s.SurfaceTemperature, s.MassRate, s.Enhancement, s.Knudsen, s.Regime)
}
