package calc

import (
	"context"
	"fmt"

	"fogbench/calc/atomize"
)

// nonFinite returns the JSON path of the first NaN or ±Inf in r, as
// "path = value", or "" when every number is finite. It is the last guard
// before a result leaves calc: encoding/json cannot write such numbers, and
// a user must never see them.
//
// It checks the fields of Result one by one (a reflective walk cost about
// 14 % of a 60-bin evaluation). TestNonFiniteCoversEveryField sets every
// float64 reachable from Result to NaN and ±Inf in turn and checks that
// this guard names it at its JSON path, so a field added to Result without
// a check here fails that test.
func nonFinite(r *Result) string {
	if r == nil {
		return ""
	}
	s := &r.Summary
	sv := [...]float64{opt(s.D10M), opt(s.D20M), opt(s.D30M), s.D32M, s.D43M, s.Dv10M, s.Dv50M, s.Dv90M, s.Span, s.RelativeSpan,
		opt(s.T50S), opt(s.T90S), opt(s.T99S), opt(s.DropsPerSecond)}
	if p := firstNonFinite("summary.", summaryNames[:], sv[:]); p != "" {
		return p
	}
	for i := range r.Bins {
		b := &r.Bins[i]
		bv := [...]float64{b.DLoM, b.DHiM, b.DM, b.NumberFraction, b.VolumeFraction, b.LaplacePa, b.VaporPressurePa,
			b.KelvinRatio, b.EvaporationEnhancement, opt(b.LifetimeS), b.SurfaceTemperatureK, b.Knudsen, b.EvaporationRateKgS}
		if j := firstBad(bv[:]); j >= 0 {
			return fmt.Sprintf("bins[%d].%s = %g", i, binNames[j], bv[j])
		}
	}
	c := &r.Curvature
	cv := [...]float64{c.KelvinLengthM, opt(c.Enhancement1PctDM), opt(c.Enhancement10PctDM), c.LaplaceOneAtmDM,
		opt(c.KelvinCriticalRadiusM), c.ReferenceTemperatureK}
	if p := firstNonFinite("curvature.", curvatureNames[:], cv[:]); p != "" {
		return p
	}
	pr := &r.Properties
	pv := [...]float64{pr.TemperatureK, pr.SaturationPressurePa, pr.SurfaceTensionNM, pr.LiquidDensityKgM3,
		pr.LiquidViscosityPaS, pr.LatentHeatJKg, pr.LiquidHeatCapacityJKgK, pr.MolarMassKgMol, pr.MolarVolumeM3Mol,
		pr.NormalBoilingPointK, pr.GasDensityKgM3, pr.FilmTemperatureK, pr.FilmDensityKgM3, pr.FilmViscosityPaS,
		pr.FilmConductivityWMK, pr.FilmHeatCapacityJKgK, pr.DiffusivityM2S, pr.MeanFreePathM, pr.AmbientVaporMoleFraction}
	if p := firstNonFinite("properties.", propertyNames[:], pv[:]); p != "" {
		return p
	}
	if e := r.Equilibrium; e != nil {
		ev := [...]float64{e.TemperatureK, e.FlatVaporPressurePa, e.PoyntingFactor, e.FugacityFactor, e.EnhancementFactor,
			e.DissolvedGasMoleFraction, e.LatentHeatJKg, opt(e.MixtureCriticalTemperatureK)}
		if p := firstNonFinite("equilibrium.", equilibriumNames[:], ev[:]); p != "" {
			return p
		}
	}
	if h := r.History; h != nil {
		for _, s := range [...]struct {
			name string
			v    []float64
		}{{"t_s", h.TS}, {"x_m", h.XM}, {"evaporated_mass_fraction", h.EvaporatedMassFraction}, {"d32_m", h.D32M}, {"dv50_m", h.Dv50M}} {
			if j := firstBad(s.v); j >= 0 {
				return fmt.Sprintf("history.%s[%d] = %g", s.name, j, s.v[j])
			}
		}
	}
	if a := r.Atomizer; a != nil {
		if p := atomizerNonFinite(a); p != "" {
			return p
		}
	}
	if h := r.Superheat; h != nil {
		hv := [...]float64{h.TemperatureK, h.PressurePa, h.SaturationTemperatureK, h.SaturationPressurePa, h.DeltaTK,
			h.PressureRatio, h.Jakob, h.VaporDensityKgM3, h.BubbleVaporPressurePa, opt(h.CriticalBubbleRadiusM),
			opt(h.NucleationBarrierJ), opt(h.NucleationBarrierKT), h.NucleationRateM3S, h.NucleationThresholdM3S,
			opt(h.KineticLimitK), opt(h.SpinodalK)}
		if p := firstNonFinite("superheat.", superheatNames[:], hv[:]); p != "" {
			return p
		}
	}
	return ""
}

func atomizerNonFinite(a *atomize.Result) string {
	av := [...]float64{a.MassFlow, a.GasMassFlow, a.FlowNumberSI, a.FlowNumberUS, a.FlowNumberUK,
		a.DischargeCoefficient, a.LiquidVelocity}
	if p := firstNonFinite("atomizer.", atomizerNames[:], av[:]); p != "" {
		return p
	}
	for i, e := range a.SMD {
		if !finite(e.SMD) {
			return fmt.Sprintf("atomizer.smd[%d].smd_m = %g", i, e.SMD)
		}
	}
	bv := [...]float64{a.SMDBand.Min, a.SMDBand.Max, a.SMDBand.Ratio}
	if p := firstNonFinite("atomizer.smd_band.", bandNames[:], bv[:]); p != "" {
		return p
	}
	fv := [...]float64{a.ConeAngleDeg, a.FilmThickness}
	if p := firstNonFinite("atomizer.", atomizerLaterNames[:], fv[:]); p != "" {
		return p
	}
	for i, g := range a.Groups {
		if !finite(g.Value) {
			return fmt.Sprintf("atomizer.groups[%d].value = %g", i, g.Value)
		}
	}
	return ""
}

// JSON names of the checked fields, in the order nonFinite lists them.
var (
	summaryNames = [...]string{"d10_m", "d20_m", "d30_m", "d32_m", "d43_m", "dv10_m", "dv50_m", "dv90_m", "span",
		"relative_span", "t50_s", "t90_s", "t99_s", "drops_per_s"}
	binNames = [...]string{"d_lo_m", "d_hi_m", "d_m", "number_fraction", "volume_fraction", "laplace_pa",
		"vapor_pressure_pa", "kelvin_ratio", "evaporation_enhancement", "lifetime_s", "surface_temperature_k",
		"knudsen", "evaporation_rate_kg_s"}
	curvatureNames = [...]string{"kelvin_length_m", "enhancement_1pct_d_m", "enhancement_10pct_d_m",
		"laplace_one_atm_d_m", "kelvin_critical_radius_m", "reference_temperature_k"}
	propertyNames = [...]string{"temperature_k", "saturation_pressure_pa", "surface_tension_n_m",
		"liquid_density_kg_m3", "liquid_viscosity_pa_s", "latent_heat_j_kg", "liquid_heat_capacity_j_kg_k",
		"molar_mass_kg_mol", "molar_volume_m3_mol", "normal_boiling_point_k", "gas_density_kg_m3",
		"film_temperature_k", "film_density_kg_m3", "film_viscosity_pa_s", "film_conductivity_w_m_k",
		"film_heat_capacity_j_kg_k", "diffusivity_m2_s", "mean_free_path_m", "ambient_vapor_mole_fraction"}
	equilibriumNames = [...]string{"temperature_k", "flat_vapor_pressure_pa", "poynting_factor", "fugacity_factor",
		"enhancement_factor", "dissolved_gas_mole_fraction", "latent_heat_j_kg", "mixture_critical_temperature_k"}
	superheatNames = [...]string{"temperature_k", "pressure_pa", "saturation_temperature_k", "saturation_pressure_pa",
		"delta_t_k", "pressure_ratio", "jakob", "vapor_density_kg_m3", "bubble_vapor_pressure_pa",
		"critical_bubble_radius_m", "nucleation_barrier_j", "nucleation_barrier_kt", "nucleation_rate_m3_s",
		"nucleation_threshold_m3_s", "kinetic_limit_k", "spinodal_k"}
	atomizerNames = [...]string{"mass_flow_kg_s", "gas_mass_flow_kg_s", "flow_number_m2", "flow_number_lb_h_psi05",
		"flow_number_ukgal_h_psi05", "discharge_coefficient", "liquid_velocity_m_s"}
	bandNames          = [...]string{"min_m", "max_m", "ratio"}
	atomizerLaterNames = [...]string{"cone_angle_deg", "film_thickness_m"}
)

// finite reports whether v is neither NaN nor ±Inf: v − v is 0 for every
// finite v and NaN otherwise.
func finite(v float64) bool { return v-v == 0 }

// opt is an optional number's value, 0 (finite) when absent.
func opt(p *float64) float64 {
	if p == nil {
		return 0
	}
	return *p
}

// firstBad returns the index of the first non-finite value, or -1.
func firstBad(v []float64) int {
	for i, x := range v {
		if !finite(x) {
			return i
		}
	}
	return -1
}

func firstNonFinite(prefix string, names []string, v []float64) string {
	if j := firstBad(v); j >= 0 {
		return fmt.Sprintf("%s%s = %g", prefix, names[j], v[j])
	}
	return ""
}

// Evaluate computes a case: classes, per-class curvature and evaporation,
// the curvature summary, properties used and the spray history. A result
// holding NaN or ±Inf anywhere is a fault of ours: it is returned as an
// internal error naming the field, never as numbers a user would read.
// It is EvaluateContext with a context that is never done.
func Evaluate(c Case) (*Result, error) {
	return EvaluateContext(context.Background(), c)
}

// EvaluateContext is Evaluate that stops when ctx is done: it looks at ctx
// between size classes and between the time steps (and, with transient
// heating, the classes) of the spray history, and then returns an *Error
// with code Canceled whose message says whether the time limit passed or
// the caller cancelled. Each look is a cheap ctx.Err().
func EvaluateContext(ctx context.Context, c Case) (*Result, error) {
	res, err := evaluate(ctx, c)
	if err != nil {
		return nil, err
	}
	if p := nonFinite(res); p != "" {
		return nil, &Error{Code: Internal, Message: "evaluation failed", Err: fmt.Errorf("non-finite result %s", p)}
	}
	return res, nil
}
