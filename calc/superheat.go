package calc

import (
	"errors"
	"fmt"
	"math"

	"fogbench/calc/evap"
	"fogbench/calc/flash"
	"fogbench/calc/sizedist"
	"fogbench/calc/valid"
)

// Superheat describes a liquid that leaves the nozzle above its boiling
// point at the gas pressure (calc/flash). Quantities that do not exist for
// the case are null.
type Superheat struct {
	TemperatureK           float64 `json:"temperature_k"`
	TemperatureField       string  `json:"temperature_field"` // the case field T_l came from
	PressurePa             float64 `json:"pressure_pa"`
	SaturationTemperatureK float64 `json:"saturation_temperature_k"` // T_sat(p_amb)
	SaturationPressurePa   float64 `json:"saturation_pressure_pa"`   // p_sat(T_l)
	DeltaTK                float64 `json:"delta_t_k"`
	PressureRatio          float64 `json:"pressure_ratio"`
	Jakob                  float64 `json:"jakob"`
	VaporDensityKgM3       float64 `json:"vapor_density_kg_m3"` // saturated vapor at p_amb, used in Ja
	Regime                 string  `json:"regime"`
	RegimeSource           string  `json:"regime_source"`
	// BubbleVaporPressurePa is p_v* inside the critical bubble (Poynting-corrected).
	BubbleVaporPressurePa  float64  `json:"bubble_vapor_pressure_pa"`
	CriticalBubbleRadiusM  *float64 `json:"critical_bubble_radius_m"`
	NucleationBarrierJ     *float64 `json:"nucleation_barrier_j"`
	NucleationBarrierKT    *float64 `json:"nucleation_barrier_kt"`
	NucleationRateM3S      float64  `json:"nucleation_rate_m3_s"`
	NucleationThresholdM3S float64  `json:"nucleation_threshold_m3_s"` // J that defines the kinetic limit
	KineticLimitK          *float64 `json:"kinetic_limit_k"`
	SpinodalK              *float64 `json:"spinodal_k"` // Peng–Robinson liquid spinodal at p_amb
	Note                   string   `json:"note"`
}

// superheatedTemperature returns the liquid temperature at the nozzle when
// it is at or above the boiling point at the gas pressure, and the case
// field it came from. Of injection_temperature_k and liquid_temperature_k
// the hotter superheated one counts; a temperature outside the liquid's
// range is left to the checks that already report it.
func (s *setup) superheatedTemperature() (float64, string, bool) {
	best, field := 0.0, ""
	for _, c := range []struct {
		t     *float64
		field string
	}{{s.c.LiquidTemperatureK, "liquid_temperature_k"}, {s.c.InjectionTemperatureK, "injection_temperature_k"}} {
		if c.t == nil {
			continue
		}
		if _, err := s.liquid.Check(*c.t); err != nil {
			continue
		}
		if s.liquid.SaturationPressure(*c.t) >= s.c.Gas.PressurePa && *c.t > best {
			best, field = *c.t, c.field
		}
	}
	return best, field, best > 0
}

// evaluateSuperheated fills res for a superheated liquid: the superheat
// analysis instead of the quasi-steady evaporation, which has no steady
// state above the boiling point. Each class keeps its sizes, Laplace
// pressure and Kelvin-raised vapor pressure at T_l; rates are 0 and
// lifetimes null; there is no history.
func (s *setup) evaluateSuperheated(res *Result, tl float64, field string) (*Result, error) {
	l, p := s.liquid, s.c.Gas.PressurePa
	fr, err := flash.Analyze(l, tl, p, flash.Options{})
	if err != nil {
		var fe *valid.FieldError
		if errors.As(err, &fe) && fe.Field == "liquid_temperature_k" {
			err = renameField(err, field)
		}
		if ErrorCode(err) == Invalid {
			return nil, err
		}
		return nil, &Error{Code: Internal, Message: "superheat analysis failed", Err: err}
	}
	res.Superheat = superheatResult(fr, field)
	res.Warnings = append(res.Warnings, fmt.Sprintf("The liquid at %.1f K is %.3g K above its boiling point at the gas pressure (p_sat/p = %.3g): it is superheated and may flash-boil, so the quasi-steady evaporation model does not apply. Per-class evaporation rates, lifetimes and the spray history are not computed; see the superheat figures.", tl, fr.DeltaTK, fr.PressureRatio))
	res.Warnings = append(res.Warnings, fr.Warnings...)
	res.Warnings = append(res.Warnings, s.stateWarnings(tl, tl, "the superheated liquid's temperature")...)

	cond := s.conditions(true)
	res.Properties = s.properties(tl)
	res.Curvature = s.curvature(cond, tl)
	sigma, vm, ps := l.SurfaceTension(tl), l.MolarMass()/l.Density(tl), l.SaturationPressure(tl)
	lambda := evap.VaporMeanFreePath(res.Properties.DiffusivityM2S, res.Properties.FilmTemperatureK, l.MolarMass())
	b := s.binned
	res.Bins = make([]BinResult, b.Len())
	for i := range res.Bins {
		d := b.Diameter(i)
		kr := evap.KelvinRatio(sigma, vm, d/2, tl)
		kn := evap.Knudsen(lambda, d/2)
		res.Bins[i] = BinResult{
			DLoM: b.Edges[i], DHiM: b.Edges[i+1], DM: d,
			NumberFraction: b.Number[i], VolumeFraction: b.Volume[i],
			LaplacePa: evap.LaplacePressure(sigma, d/2), VaporPressurePa: ps * kr, KelvinRatio: kr,
			SurfaceTemperatureK: tl, Knudsen: finiteOr(kn, 0), Regime: evap.Regime(kn),
		}
	}
	if e := s.c.Evaporation; e.MassFlowKgS > 0 {
		if nd, err := sizedist.DropsPerSecond(b, e.MassFlowKgS, l.Density(tl)); err == nil {
			res.Summary.DropsPerSecond = &nd
		}
	}
	return res, nil
}

// superheatResult turns the analysis into the JSON shape, with null for
// what does not exist (an infinite radius at exact saturation, a limit
// not reached below Tc).
func superheatResult(fr flash.Result, field string) *Superheat {
	finite := func(v float64) *float64 {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil
		}
		return &v
	}
	// A zero surface tension (past the correlation's own critical point)
	// leaves no critical bubble to report.
	positive := func(v float64) *float64 {
		if !(v > 0) {
			return nil
		}
		return finite(v)
	}
	sh := &Superheat{
		TemperatureK: fr.TemperatureK, TemperatureField: field, PressurePa: fr.PressurePa,
		SaturationTemperatureK: fr.SaturationTemperatureK, SaturationPressurePa: fr.SaturationPressurePa,
		DeltaTK: fr.DeltaTK, PressureRatio: fr.PressureRatio, Jakob: fr.Jakob, VaporDensityKgM3: fr.VaporDensityKgM3,
		Regime: fr.Regime, RegimeSource: flash.RegimeSource,
		BubbleVaporPressurePa: fr.Nucleus.BubbleVaporPa,
		CriticalBubbleRadiusM: positive(fr.Nucleus.CriticalRadiusM),
		NucleationBarrierJ:    positive(fr.Nucleus.BarrierJ),
		NucleationBarrierKT:   positive(fr.Nucleus.BarrierKT),
		NucleationRateM3S:     fr.Nucleus.Rate, NucleationThresholdM3S: fr.NucleationThreshold,
		Note: fr.Note,
	}
	if fr.HasKineticLimit {
		sh.KineticLimitK = finite(fr.KineticLimitK)
	}
	if fr.HasSpinodal {
		sh.SpinodalK = finite(fr.SpinodalK)
	}
	return sh
}

// markGrowth flags, in supersaturated surroundings, the classes whose
// drops are larger than the Kelvin equilibrium radius and so grow by
// condensation (evap.Conditions.EquilibriumRadius).
func markGrowth(res *Result) {
	r := res.Curvature.KelvinCriticalRadiusM
	if r == nil {
		return
	}
	for i := range res.Bins {
		g := res.Bins[i].DM/2 > *r
		res.Bins[i].Grows = &g
	}
}

func finiteOr(v, alt float64) float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return alt
	}
	return v
}
