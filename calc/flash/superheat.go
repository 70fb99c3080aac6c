package flash

import (
	"errors"
	"fmt"
	"math"

	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// Flashing regimes returned by Regime.
const (
	RegimeNone         = "no flashing"
	RegimeTransitional = "transitional"
	RegimeFull         = "fully flashing"
)

// Pressure-ratio thresholds of the regime map, R_p = p_sat(T_l)/p_amb.
// Lacey et al. (2017) classified flash-boiling multi-hole gasoline sprays by
// p_amb/p_sat: above 1 no flashing, between about 0.3 and 1 transitional
// flashing, below about 0.3 flare (fully) flashing — source and values from
// memory, not verified in print. The boundaries move with nozzle geometry,
// injector and fuel, so the label is an indication only.
const (
	TransitionalPressureRatio = 1.0
	FullFlashingPressureRatio = 1 / 0.3
)

// RegimeSource names the thresholds for the user.
const RegimeSource = "pressure-ratio map of Lacey et al. (2017), thresholds R_p = 1 and 1/0.3 ≈ 3.3 (from memory); the thresholds vary with nozzle geometry and fuel"

// ErrSubcooled is wrapped by Analyze when the liquid is not superheated:
// p_sat(T_l) < p_amb.
var ErrSubcooled = errors.New("flash: the liquid is below its boiling point at this pressure (not superheated)")

// DegreeOfSuperheat returns ΔT = T_l − T_sat(p_amb) in K: positive for a
// superheated liquid, negative for a subcooled one. T in K, p in Pa; p
// outside the liquid's saturation range is an error on "pressure_pa".
func DegreeOfSuperheat(l Liquid, T, p float64) (float64, error) {
	if err := checkState(l, T, p); err != nil {
		return 0, err
	}
	ts, err := l.SaturationTemperature(p)
	if err != nil {
		return 0, err
	}
	return T - ts, nil
}

// PressureRatio returns R_p = p_sat(T_l)/p_amb (dimensionless); R_p ≥ 1
// means the liquid is superheated. T in K, p in Pa.
func PressureRatio(l Liquid, T, p float64) (float64, error) {
	if err := checkState(l, T, p); err != nil {
		return 0, err
	}
	return l.SaturationPressure(T) / p, nil
}

// Jakob returns the Jakob number of a superheated liquid,
//
//	Ja = ρ_l c_p,l ΔT / (ρ_v h_fg)
//
// the sensible heat stored by the superheat over the latent heat per unit
// volume of vapor: the volume of vapor one volume of liquid can make by
// flashing (e.g. Carey, Liquid–Vapor Phase-Change Phenomena, 2nd ed. (2008),
// ch. 5 — from memory). ρ in kg/m3, c_p in J/(kg K), ΔT in K, h_fg in J/kg;
// the result is dimensionless. Negative ΔT gives a negative number;
// callers pass ΔT ≥ 0. Inputs are not checked.
func Jakob(rhoL, cpL, dT, rhoV, hfg float64) float64 {
	return rhoL * cpL * dT / (rhoV * hfg)
}

// Regime labels a pressure ratio R_p by the thresholds above: "no
// flashing" below TransitionalPressureRatio, "transitional" up to
// FullFlashingPressureRatio, "fully flashing" beyond (see RegimeSource).
func Regime(rp float64) string {
	switch {
	case !(rp >= TransitionalPressureRatio):
		return RegimeNone
	case rp < FullFlashingPressureRatio:
		return RegimeTransitional
	}
	return RegimeFull
}

// Options tune Analyze.
type Options struct {
	// NucleationThreshold is the rate (1/(m3 s)) that defines the kinetic
	// limit of superheat; 0 means DefaultNucleationThreshold.
	NucleationThreshold float64
}

// Result is the superheat analysis of one liquid state. Quantities that do
// not exist for the state are flagged by the Has… fields or are +Inf where
// the doc says so; the caller decides how to show them.
type Result struct {
	TemperatureK           float64 // liquid temperature T_l
	PressurePa             float64 // ambient (and liquid) pressure p_amb
	SaturationTemperatureK float64 // T_sat(p_amb)
	SaturationPressurePa   float64 // p_sat(T_l)
	DeltaTK                float64 // T_l − T_sat(p_amb), ≥ 0
	PressureRatio          float64 // p_sat(T_l)/p_amb, ≥ 1
	Jakob                  float64 // ρ_l c_p ΔT/(ρ_v h_fg)
	VaporDensityKgM3       float64 // ρ_v of the saturated vapor at p_amb used in Ja
	Regime                 string
	Nucleus                Nucleus // critical bubble and rate at (T_l, p_amb)
	NucleationThreshold    float64 // 1/(m3 s), defines the kinetic limit
	KineticLimitK          float64 // valid when HasKineticLimit
	HasKineticLimit        bool
	SpinodalK              float64 // Peng–Robinson liquid spinodal at p_amb; valid when HasSpinodal
	HasSpinodal            bool
	Note                   string   // what the figures mean for the spray, in one paragraph
	Warnings               []string // ranges left, limits passed
}

// Analyze describes liquid l at temperature T (K) entering surroundings at
// pressure p (Pa): superheat, pressure ratio, Jakob number, regime, the
// critical bubble and nucleation rate at (T, p), the kinetic limit of
// superheat and the Peng–Robinson spinodal temperature at p.
//
// The liquid is taken at the ambient pressure (the state just after the
// nozzle exit). ρ_v in the Jakob number is the Peng–Robinson saturated
// vapor at (T_sat(p), p), or the ideal gas with a warning where the EOS has
// no vapor root; ρ_l and c_p are taken at T_l, h_fg at T_sat(p).
//
// Errors: T outside (0, Tc) or p ≤ 0 (a *valid.FieldError), p outside the
// liquid's saturation range, or a subcooled liquid (wraps ErrSubcooled).
func Analyze(l Liquid, T, p float64, opts Options) (Result, error) {
	if err := checkState(l, T, p); err != nil {
		return Result{}, err
	}
	th := opts.NucleationThreshold
	if th == 0 {
		th = DefaultNucleationThreshold
	}
	if err := valid.Positive("nucleation_threshold_m3_s", th); err != nil {
		return Result{}, err
	}
	ps := l.SaturationPressure(T)
	if !(ps >= p) {
		return Result{}, fmt.Errorf("p_sat(%s K) = %s Pa < %s Pa: %w", valid.FormatValue(T), valid.FormatValue(ps), valid.FormatValue(p), ErrSubcooled)
	}
	ts, err := l.SaturationTemperature(p)
	if err != nil {
		return Result{}, err
	}
	r := Result{
		TemperatureK: T, PressurePa: p, SaturationTemperatureK: ts, SaturationPressurePa: ps,
		DeltaTK: math.Max(T-ts, 0), PressureRatio: ps / p, NucleationThreshold: th,
	}
	r.Regime = Regime(r.PressureRatio)

	pr := PengRobinson{Tc: l.CriticalTemperature(), Pc: l.CriticalPressure(), Omega: l.AcentricFactor()}
	r.Warnings = append(r.Warnings, pr.Warnings()...)
	m := l.MolarMass()
	if z, err := pr.VaporCompressibility(ts, p); err == nil {
		r.VaporDensityKgM3 = p * m / (z * phys.GasConstant * ts)
	} else {
		r.VaporDensityKgM3 = p * m / (phys.GasConstant * ts)
		r.Warnings = append(r.Warnings, "the Peng–Robinson equation has no vapor root at the saturation state; the Jakob number uses ideal-gas vapor")
	}
	r.Jakob = Jakob(l.Density(T), l.HeatCapacity(T), r.DeltaTK, r.VaporDensityKgM3, l.LatentHeat(ts))

	r.Nucleus = nucleation(l, T, p)
	if !(r.Nucleus.SurfaceTensionNM > 0) {
		r.Warnings = append(r.Warnings, fmt.Sprintf("the surface tension correlation gives %.3g N/m at %.1f K (its own critical point): classical nucleation figures are not available there", r.Nucleus.SurfaceTensionNM, T))
	}
	if tk, err := KineticLimit(l, p, th); err == nil {
		r.KineticLimitK, r.HasKineticLimit = tk, true
	}
	if tsp, err := pr.SpinodalTemperature(p); err == nil {
		r.SpinodalK, r.HasSpinodal = tsp, true
	}
	tc := l.CriticalTemperature()
	switch {
	case r.HasSpinodal && T >= r.SpinodalK:
		r.Warnings = append(r.Warnings, fmt.Sprintf("the liquid temperature %.1f K is beyond the Peng–Robinson liquid spinodal (%.1f K at this pressure): no metastable liquid exists there", T, r.SpinodalK))
	case r.HasKineticLimit && T >= r.KineticLimitK:
		r.Warnings = append(r.Warnings, fmt.Sprintf("the liquid temperature %.1f K is above the kinetic limit of superheat (%.1f K): homogeneous nucleation throughout the liquid is explosive", T, r.KineticLimitK))
	}
	if T > 0.95*tc {
		r.Warnings = append(r.Warnings, "within 5 % of the critical temperature: classical nucleation theory with the flat-surface tension is only indicative there")
	}
	r.Note = note(r)
	return r, nil
}

// note explains the figures in words for the results page.
func note(r Result) string {
	s := fmt.Sprintf("The liquid is %.3g K above its boiling point at the ambient pressure (p_sat/p_amb = %.3g): ", r.DeltaTK, r.PressureRatio)
	switch {
	case r.PressureRatio <= 1:
		s += "at the boiling point itself, no bubble can grow. "
	case r.Regime == RegimeTransitional:
		s += "bubbles nucleated on walls and impurities can grow, and the jet may partly flash. "
	default:
		s += "vapor bubbles grow fast inside the jet and it is expected to flash-boil and shatter. "
	}
	if r.HasKineticLimit {
		if r.TemperatureK < r.KineticLimitK {
			s += "Homogeneous nucleation stays negligible below the kinetic limit of superheat, so flashing relies on heterogeneous sites (walls, dissolved gas, impurities). "
		} else {
			s += "The kinetic limit is passed: homogeneous nucleation alone makes the liquid boil explosively. "
		}
	}
	s += "The quasi-steady drop evaporation model does not apply to a superheated liquid; " + RegimeSource + "."
	return s
}
