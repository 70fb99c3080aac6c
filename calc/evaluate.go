package calc

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"

	"fogbench/calc/atomize"
	"fogbench/calc/evap"
	"fogbench/calc/fluid"
	"fogbench/calc/phys"
	"fogbench/calc/sizedist"
	"fogbench/calc/valid"
)

// Limits on what a case may ask for. They bound the work one request can
// cause and keep the property correlations near their ranges.
const (
	MaxBins          = 2000
	MinPressurePa    = 1e3   // 10 mbar
	MaxPressurePa    = 2e7   // 200 bar: beyond, the film's dense-gas corrections (calc/fluid/dense.go) are far from their data
	MinGasTempK      = 200.0 // K
	MaxGasTempK      = 2500.0
	MaxRelVelocityMS = 500.0
	MaxNotesBytes    = 64 << 10
	// Bounds that only keep absurd numbers (1e300 kg/s) out of the
	// arithmetic; they are far beyond any real spray.
	MaxSprayVelocityMS = 1000.0
	MaxMassFlowKgS     = 1e4
	MaxHistoryTimeS    = 1e7
	// Drop diameters a case may name: from molecular clusters to drops
	// far larger than any that survive breakup (common practice, no
	// source); beyond them the arithmetic overflows.
	MinDropDiameterM = 1e-9
	MaxDropDiameterM = 0.1
	// DefaultBins is the number of classes a model is cut into when the case
	// does not say.
	DefaultBins = 40
)

// MaxNameChars bounds a case name, in characters.
const MaxNameChars = 200

// CheckName refuses a case name that is empty, longer than MaxNameChars
// characters, or not one line of printable text: control characters (line
// breaks, tabs, NUL) and bytes that are not UTF-8 are refused, as for
// author names, since a name is shown on one line in pages, lists, file
// names and CSV cells. The name is checked as given (Normalize trims it).
func CheckName(name string) error {
	if err := checkNameLength(name); err != nil {
		return err
	}
	return checkNameText(name)
}

func checkNameLength(name string) error {
	switch {
	case strings.TrimSpace(name) == "":
		return &valid.FieldError{Field: "name", Message: "give the case a name"}
	case utf8.RuneCountInString(name) > MaxNameChars:
		return &valid.FieldError{Field: "name", Value: quoteClipped(name), Message: fmt.Sprintf("must be at most %d characters", MaxNameChars)}
	}
	return nil
}

func checkNameText(name string) error {
	switch {
	case !utf8.ValidString(name):
		return &valid.FieldError{Field: "name", Value: quoteClipped(name), Message: "holds bytes that are not UTF-8 text; type the name again or save the file as UTF-8"}
	case strings.IndexFunc(name, unicode.IsControl) >= 0:
		return &valid.FieldError{Field: "name", Value: quoteClipped(name), Message: "must be one line of text, without control characters (line breaks, tabs, NUL)"}
	}
	return nil
}

// checkText refuses text fields that are not text: a name with control
// characters or either of name and notes with bytes that are not UTF-8 or
// NUL. Validate applies it to what users send; Evaluate does not, so a
// case stored before these checks still computes.
func checkText(c Case) error {
	var errs valid.Errors
	errs.Add(checkNameText(c.Name))
	if !utf8.ValidString(c.Notes) || strings.ContainsRune(c.Notes, 0) {
		errs = append(errs, &valid.FieldError{Field: "notes", Message: "holds bytes that are not text (invalid UTF-8 or NUL); save the notes as UTF-8 text"})
	}
	return errs.Err()
}

func quoteClipped(s string) string {
	if r := []rune(s); len(r) > 40 {
		return strconv.Quote(string(r[:40]) + "…")
	}
	return strconv.Quote(s)
}

// setup is a validated case with its liquid, gas and drop-size classes.
type setup struct {
	c        Case
	liquid   *fluid.Liquid
	gas      *fluid.Gas
	binned   *sizedist.Binned
	atomizer *atomize.Result
	model    sizedist.Model // the parametric model cut into classes; nil for measured classes
	xInf     float64        // far-field vapor mole fraction
	warnings []string
	// criticalTimes are the transient history's times at which each
	// class's surface reached the mixture critical point (−1: never).
	criticalTimes []float64
}

// Validate checks a case without evaluating its evaporation: every field
// error is returned at once as valid.Errors.
func Validate(c Case) error {
	c.Normalize()
	var errs valid.Errors
	errs.Add(checkText(c))
	if _, err := prepare(c); err != nil && !errs.Add(err) {
		return err
	}
	return errs.Err()
}

func prepare(c Case) (*setup, error) {
	c.Normalize()
	var errs valid.Errors
	add := func(err error) {
		if err != nil && !errs.Add(err) {
			errs = append(errs, &valid.FieldError{Field: "case", Message: err.Error()})
		}
	}
	s := &setup{c: c}
	if c.Format != CaseFormat {
		add(&valid.FieldError{Field: "format", Value: c.Format, Message: fmt.Sprintf("must be %q", CaseFormat)})
	}
	add(checkNameLength(c.Name))
	if len(c.Notes) > MaxNotesBytes {
		add(&valid.FieldError{Field: "notes", Value: fmt.Sprint(len(c.Notes)), Message: fmt.Sprintf("must be at most %d bytes", MaxNotesBytes)})
	}
	l, err := LookupLiquid(c)
	add(err)
	s.liquid = l
	g, err := fluid.LookupGas(c.Gas.ID)
	add(err)
	s.gas = g

	add(valid.Between("gas.pressure_pa", c.Gas.PressurePa, MinPressurePa, MaxPressurePa, "Pa"))
	add(valid.Between("gas.temperature_k", c.Gas.TemperatureK, MinGasTempK, MaxGasTempK, "K"))
	add(valid.Between("gas.relative_velocity_m_s", c.Gas.RelativeVelocityMS, 0, MaxRelVelocityMS, "m/s"))
	// The range warnings of the temperatures given here come with those
	// the drops reach (stateWarnings), one per property.
	if c.LiquidTemperatureK != nil && l != nil {
		_, err := l.Check(*c.LiquidTemperatureK)
		add(err)
	}
	if c.InjectionTemperatureK != nil && l != nil {
		// The supply temperature of the transient drops and of an
		// atomizer's liquid. The liquid's check speaks of
		// liquid_temperature_k; this is the other field.
		if _, err := l.Check(*c.InjectionTemperatureK); err != nil {
			add(renameField(err, "injection_temperature_k"))
		}
	}
	switch c.Heating {
	case "", "steady":
	case "transient":
		if c.InjectionTemperatureK == nil {
			add(&valid.FieldError{Field: "injection_temperature_k", Message: `is needed with "heating":"transient"`})
		}
	default:
		add(&valid.FieldError{Field: "heating", Value: c.Heating, Message: `must be "steady" or "transient"`})
	}
	if g != nil {
		w, err := g.Check(c.Gas.TemperatureK, c.Gas.PressurePa)
		add(err)
		s.warnings = append(s.warnings, w...)
	}
	if l != nil && len(errs) == 0 {
		x, err := ambientVapor(c.Gas, l)
		add(err)
		s.xInf = x
		if err == nil && c.Gas.RelativeHumidity != nil && g != nil {
			s.xInf = math.Min(x*saturationEnhancement(l, g, c.Gas.PressurePa, c.Gas.TemperatureK), 1-1e-9)
		}
	}
	add(checkEvaporation(c.Evaporation))
	if l != nil && g != nil && len(errs) == 0 {
		b, at, m, w, err := distribution(c, l, g)
		add(err)
		s.binned, s.atomizer, s.model = b, at, m
		s.warnings = append(s.warnings, w...)
	}
	if err := errs.Err(); err != nil {
		return nil, err
	}
	return s, nil
}

func checkEvaporation(e Evaporation) error {
	var errs valid.Errors
	switch e.Convection {
	case "", evap.ConvectionRanzMarshall, evap.ConvectionAbramzonSirignano, evap.ConvectionNone, evap.ConvectionFrossling:
	default:
		errs = append(errs, &valid.FieldError{Field: "evaporation.convection", Value: e.Convection,
			Message: `must be "ranz-marshall", "frossling", "abramzon-sirignano" or "none"`})
	}
	if e.AccommodationCoef != 0 {
		errs.Add(valid.Between("evaporation.accommodation_coefficient", e.AccommodationCoef, 1e-4, 1, ""))
	}
	errs.Add(valid.Between("evaporation.spray_velocity_m_s", e.SprayVelocityMS, 0, MaxSprayVelocityMS, "m/s"))
	errs.Add(valid.Between("evaporation.mass_flow_kg_s", e.MassFlowKgS, 0, MaxMassFlowKgS, "kg/s"))
	errs.Add(valid.Between("evaporation.max_time_s", e.MaxTimeS, 0, MaxHistoryTimeS, "s"))
	return errs.Err()
}

// ambientVapor turns whichever way the case gives the far-field vapor into
// a mole fraction.
func ambientVapor(g Gas, l *fluid.Liquid) (float64, error) {
	given := 0
	for _, p := range []*float64{g.VaporMoleFraction, g.VaporPartialPressurePa, g.RelativeHumidity} {
		if p != nil {
			given++
		}
	}
	if given > 1 {
		return 0, &valid.FieldError{Field: "gas.vapor_mole_fraction", Message: "give the ambient vapor one way only: mole fraction, partial pressure or relative humidity"}
	}
	switch {
	case g.VaporMoleFraction != nil:
		x := *g.VaporMoleFraction
		if err := valid.Finite("gas.vapor_mole_fraction", x); err != nil {
			return 0, err
		}
		if x < 0 || x >= 1 {
			return 0, valid.Errorf("gas.vapor_mole_fraction", x, "must be at least 0 and below 1")
		}
		return x, nil
	case g.VaporPartialPressurePa != nil:
		if err := valid.NonNegative("gas.vapor_partial_pressure_pa", *g.VaporPartialPressurePa); err != nil {
			return 0, err
		}
		x, err := fluid.VaporMoleFractionFromPartialPressure(*g.VaporPartialPressurePa, g.PressurePa)
		if err != nil {
			return 0, renameField(err, "gas.vapor_partial_pressure_pa")
		}
		return x, nil
	case g.RelativeHumidity != nil:
		if err := valid.Between("gas.relative_humidity", *g.RelativeHumidity, 0, fluid.MaxSaturationRatio, "(saturation ratio; 1 = saturated, above 1 supersaturated)"); err != nil {
			return 0, err
		}
		x, err := fluid.VaporMoleFractionFromRelativeHumidity(l, *g.RelativeHumidity, g.TemperatureK, g.PressurePa)
		if err != nil {
			return 0, renameField(err, "gas.relative_humidity")
		}
		return x, nil
	}
	return 0, nil
}

// LookupLiquid returns the case's liquid: the user liquid embedded in
// custom_fluid when its id is the case's fluid, else the built-in liquid of
// that id. Errors of the embedded definition name "custom_fluid.<field>".
func LookupLiquid(c Case) (*fluid.Liquid, error) {
	if c.CustomFluid == nil {
		return fluid.Lookup(c.Fluid)
	}
	if c.CustomFluid.ID != c.Fluid {
		return nil, &valid.FieldError{Field: "custom_fluid.id", Value: c.CustomFluid.ID,
			Message: fmt.Sprintf("must equal the case's fluid %q (drop custom_fluid to use a built-in liquid)", c.Fluid)}
	}
	l, err := fluid.NewCustomLiquid(*c.CustomFluid)
	if err != nil {
		var out valid.Errors
		for _, fe := range FieldErrors(err) {
			out = append(out, &valid.FieldError{Field: "custom_fluid." + strings.TrimPrefix(fe.Field, "custom."), Value: fe.Value, Message: fe.Message})
		}
		if len(out) == 0 {
			return nil, err
		}
		return nil, out
	}
	return l, nil
}

// renameField puts a helper's field error on the case-file field the user
// typed.
func renameField(err error, field string) error {
	var fes valid.Errors
	if errors.As(err, &fes) && len(fes) > 0 {
		msgs := make([]string, len(fes))
		for i, fe := range fes {
			msgs[i] = fe.Message
		}
		return &valid.FieldError{Field: field, Value: fes[0].Value, Message: strings.Join(msgs, "; ")}
	}
	var fe *valid.FieldError
	if errors.As(err, &fe) {
		return &valid.FieldError{Field: field, Value: fe.Value, Message: fe.Message}
	}
	return &valid.FieldError{Field: field, Message: err.Error()}
}

// distribution builds the drop-size classes of a case.
func distribution(c Case, l *fluid.Liquid, g *fluid.Gas) (*sizedist.Binned, *atomize.Result, sizedist.Model, []string, error) {
	d := c.Distribution
	if err := checkDiameters(d); err != nil {
		return nil, nil, nil, nil, err
	}
	if d.Model == "bins" {
		// Refuse an absurd class list before any work is done on it.
		if len(d.EdgesM) > MaxBins+1 {
			return nil, nil, nil, nil, &valid.FieldError{Field: "distribution.edges_m", Value: fmt.Sprint(len(d.EdgesM)),
				Message: fmt.Sprintf("too many class edges: at most %d (%d classes)", MaxBins+1, MaxBins)}
		}
		if len(d.Fraction) > MaxBins {
			return nil, nil, nil, nil, &valid.FieldError{Field: "distribution.fraction", Value: fmt.Sprint(len(d.Fraction)),
				Message: fmt.Sprintf("too many fractions: at most %d", MaxBins)}
		}
		b, err := sizedist.FromFractions(d.EdgesM, d.Fraction, sizedist.Basis(d.Basis))
		if err != nil {
			return nil, nil, nil, nil, err
		}
		return b, nil, nil, b.Warnings, nil
	}
	var warnings []string
	var at *atomize.Result
	var m sizedist.Model
	var err error
	switch d.Model {
	case "rosin-rammler":
		if d.D32M > 0 {
			m, err = sizedist.RosinRammlerFromSMD(d.D32M, d.Q)
		} else {
			m = sizedist.RosinRammler{X: d.XM, Q: d.Q}
		}
	case "log-normal":
		if d.D32M > 0 {
			m, err = sizedist.LogNormalFromSMD(d.D32M, d.GSD)
		} else {
			m = sizedist.LogNormal{Median: d.MedianM, GSD: d.GSD, Basis: sizedist.Basis(d.Basis)}
		}
	case "upper-limit":
		if d.D32M > 0 {
			m, err = sizedist.UpperLimitFromSMD(d.D32M, d.DUpperM, d.Delta)
		} else {
			m = sizedist.UpperLimit{DMax: d.DUpperM, Dv50: d.Dv50M, Delta: d.Delta}
		}
	case "nukiyama-tanasawa":
		if err := valid.Positive("distribution.scale_m", d.ScaleM); d.D32M == 0 && err != nil {
			return nil, nil, nil, nil, err
		}
		if d.D32M > 0 {
			m, err = sizedist.NukiyamaTanasawaFromSMD(d.D32M, d.P, d.QNT)
		} else {
			m = sizedist.NukiyamaTanasawa{B: math.Pow(d.ScaleM, -d.QNT), P: d.P, Q: d.QNT}
		}
	case "atomizer":
		var smd float64
		var q float64
		at, smd, q, warnings, err = atomizerSMD(c, l, g)
		if err == nil {
			m, err = sizedist.RosinRammlerFromSMD(smd, q)
		}
	case "":
		return nil, nil, nil, nil, &valid.FieldError{Field: "distribution.model", Message: "choose a size model"}
	default:
		return nil, nil, nil, nil, &valid.FieldError{Field: "distribution.model", Value: d.Model,
			Message: `must be "rosin-rammler", "log-normal", "upper-limit", "nukiyama-tanasawa", "atomizer" or "bins"`}
	}
	if err != nil {
		return nil, nil, nil, nil, err
	}
	if err := m.Validate(); err != nil {
		return nil, nil, nil, nil, err
	}
	bins, dmin, dmax := d.Bins, d.DMinM, d.DMaxM
	if bins == 0 {
		bins = DefaultBins
	}
	if bins < 2 || bins > MaxBins {
		return nil, nil, nil, nil, &valid.FieldError{Field: "distribution.bins", Value: fmt.Sprint(bins),
			Message: fmt.Sprintf("must be between 2 and %d", MaxBins)}
	}
	// Without a range, cover the model from 0.1 % to 99.9 % of the volume.
	if dmin == 0 {
		dmin = m.VolumeQuantile(0.001)
	}
	if dmax == 0 {
		dmax = m.VolumeQuantile(0.999)
	}
	b, err := sizedist.Cut(m, dmin, dmax, bins, sizedist.Spacing(d.Spacing))
	if err != nil {
		return nil, nil, nil, nil, err
	}
	if d.Spacing == "linear" {
		warnings = append(warnings, coarseClassWarning(b)...)
	}
	return b, at, m, append(warnings, b.Warnings...), nil
}

// MaxClassVolumeFraction is the share of the volume one linearly spaced
// class may hold before the case is warned that its classes are too
// coarse where the volume is: over a wide range linear classes put nearly
// all the volume of a Rosin–Rammler in the first class (D32 71–500 %
// high, t50 88–96 % low against converged classes, measured). Common
// practice, no source.
const MaxClassVolumeFraction = 0.2

// coarseClassWarning warns when one class of b holds more than
// MaxClassVolumeFraction of the volume.
func coarseClassWarning(b *sizedist.Binned) []string {
	worst := 0
	for i, v := range b.Volume {
		if v > b.Volume[worst] {
			worst = i
		}
	}
	if b.Len() == 0 || !(b.Volume[worst] > MaxClassVolumeFraction) {
		return nil
	}
	return []string{fmt.Sprintf("The linear classes are too coarse where the volume is: the class %.3g–%.3g µm holds %.0f %% of the volume (more than %.0f %%), so the means, lifetimes and history are coarse there. Use log spacing, more classes or a narrower range.",
		b.Edges[worst]*1e6, b.Edges[worst+1]*1e6, 100*b.Volume[worst], 100*MaxClassVolumeFraction)}
}

// checkDiameters keeps every diameter a case gives within
// [MinDropDiameterM, MaxDropDiameterM]; zero means "not given" for the
// optional ones. NaN and ±Inf are refused by the same comparison.
func checkDiameters(d Distribution) error {
	var errs valid.Errors
	check := func(field string, v float64, optional bool) {
		if optional && v == 0 {
			return
		}
		if !(v >= MinDropDiameterM && v <= MaxDropDiameterM) {
			errs = append(errs, valid.Errorf(field, v, "must be between %s and %s m", valid.FormatValue(MinDropDiameterM), valid.FormatValue(MaxDropDiameterM)))
		}
	}
	check("distribution.d_min_m", d.DMinM, true)
	check("distribution.d_max_m", d.DMaxM, true)
	check("distribution.d32_m", d.D32M, true)
	switch d.Model {
	case "rosin-rammler":
		if d.D32M == 0 {
			check("distribution.x_m", d.XM, false)
		}
	case "log-normal":
		if d.D32M == 0 {
			check("distribution.median_m", d.MedianM, false)
		}
	case "upper-limit":
		check("distribution.d_upper_m", d.DUpperM, false)
		if d.D32M == 0 {
			check("distribution.dv50_m", d.Dv50M, false)
		}
	case "nukiyama-tanasawa":
		if d.D32M == 0 {
			check("distribution.scale_m", d.ScaleM, false)
		}
	case "bins":
		if len(d.EdgesM) <= MaxBins+1 {
			for _, e := range d.EdgesM {
				if !(e >= MinDropDiameterM && e <= MaxDropDiameterM) {
					check("distribution.edges_m", e, false)
					break
				}
			}
		}
	}
	return errs.Err()
}

// supplyTemperature is the temperature of the liquid a nozzle is fed
// with, at which its correlations and flow take the liquid's properties:
// injection_temperature_k, else liquid_temperature_k (a fixed drop
// temperature is the liquid's temperature throughout), else an error
// naming injection_temperature_k. Never the gas temperature: kerosene at
// 700 K has a fifth of its surface tension at 300 K and a tenth of its
// viscosity, which made a Lefebvre SMD of 1.28 µm out of 27.3 µm.
func supplyTemperature(c Case) (float64, error) {
	switch {
	case c.InjectionTemperatureK != nil:
		return *c.InjectionTemperatureK, nil
	case c.LiquidTemperatureK != nil:
		return *c.LiquidTemperatureK, nil
	}
	return 0, &valid.FieldError{Field: "injection_temperature_k",
		Message: "is needed with an atomizer distribution: the nozzle's correlations and flow take the liquid's properties at the temperature it is supplied at (give injection_temperature_k, or liquid_temperature_k for a fixed drop temperature)"}
}

// atomizerSMD evaluates the case's nozzle and returns its chosen SMD and the
// Rosin–Rammler spread to shape the distribution with.
func atomizerSMD(c Case, l *fluid.Liquid, g *fluid.Gas) (*atomize.Result, float64, float64, []string, error) {
	d := c.Distribution
	t, err := supplyTemperature(c)
	if err != nil {
		return nil, 0, 0, nil, err
	}
	props := atomize.Properties{
		LiquidDensity: l.Density(t), LiquidViscosity: l.Viscosity(t), SurfaceTension: l.SurfaceTension(t),
		GasDensity: g.Density(c.Gas.TemperatureK, c.Gas.PressurePa), GasViscosity: g.Viscosity(c.Gas.TemperatureK),
	}
	res, err := atomize.Evaluate(d.Family, d.Correlation, d.Inputs, props)
	if err != nil {
		return nil, 0, 0, nil, err
	}
	if len(res.SMD) == 0 || res.SMD[0].SMD <= 0 {
		msg := "this atomizer family has no drop-size correlation to build a distribution from"
		if res.SMDStatus != "" {
			msg = res.SMDStatus
		}
		return nil, 0, 0, nil, &valid.FieldError{Field: "distribution.family", Value: d.Family, Message: msg}
	}
	chosen := res.SMD[0]
	if !strings.HasPrefix(chosen.Quantity, "SMD") && chosen.Quantity != "" {
		return nil, 0, 0, nil, &valid.FieldError{Field: "distribution.correlation", Value: chosen.Correlation,
			Message: fmt.Sprintf("predicts %s, not the SMD a distribution is built from; pick an SMD correlation", chosen.Quantity)}
	}
	q := d.Q
	var warnings []string
	if q == 0 {
		for _, f := range atomize.Families() {
			if f.ID == res.Family {
				q = f.RosinRammlerQ
				warnings = append(warnings, fmt.Sprintf("Rosin–Rammler spread q = %.3g is the family's typical value (%s); give q to override.", q, f.RosinRammlerQSource))
			}
		}
	}
	if err := valid.Between("distribution.q", q, 1.05, 20, ""); err != nil {
		return nil, 0, 0, nil, err
	}
	warnings = append(warnings, res.Warnings...)
	warnings = append(warnings, chosen.Warnings...)
	if !chosen.InRange {
		warnings = append(warnings, fmt.Sprintf("The %s correlation is used outside its published range; its SMD is an extrapolation.", chosen.Correlation))
	}
	return &res, chosen.SMD, q, warnings, nil
}

// filmAdapter gives evap the 1/3-rule film of calc/fluid. Its cache keeps
// the pure-component properties of the last surface temperature (the same
// numbers as fluid.FilmProperties, which the range warnings aside this
// adapter would otherwise call): one adapter per evaluation, never shared
// between goroutines.
type filmAdapter struct {
	cache *fluid.FilmCache
}

// Film implements evap.FilmModel. The mean free path is left at zero so that
// evap uses the vapor mean free path 3D/c̄ that the Fuchs–Sutugin form is
// written with (Seinfeld & Pandis eq. 12.43 convention).
func (a filmAdapter) Film(p, ts, tinf, ys, yinf float64) evap.Film {
	f := a.cache.Properties(p, ts, tinf, ys, yinf)
	return evap.Film{T: f.T, VaporMassFraction: f.VaporMassFraction, Density: f.Density, Viscosity: f.Viscosity,
		Conductivity: f.Conductivity, HeatCapacity: f.HeatCapacity, VaporHeatCapacity: f.VaporHeatCapacity,
		Diffusivity: f.Diffusivity}
}

func (s *setup) conditions(curvature bool) *evap.Conditions {
	e := s.c.Evaporation
	conv := e.Convection
	if conv == "" {
		conv = evap.ConvectionRanzMarshall
	}
	c := &evap.Conditions{
		Liquid: s.liquid, Gas: filmAdapter{fluid.NewFilmCache(s.liquid, s.gas)}, GasMolarMass: s.gas.MolarMass(),
		Pressure: s.c.Gas.PressurePa, GasTemperature: s.c.Gas.TemperatureK, VaporMoleFraction: s.xInf,
		RelativeVelocity: s.c.Gas.RelativeVelocityMS, Curvature: curvature, Transition: !e.NoTransition,
		Convection: conv, AccommodationCoefficient: e.AccommodationCoef,
	}
	if eq := newSurfaceEquilibrium(s.liquid, s.gas, s.c.Gas.PressurePa); eq != nil {
		c.Equilibrium = eq
	}
	return c
}

// evaluate computes a case: classes, per-class curvature and evaporation,
// the curvature summary, properties used and the spray history. Evaluate
// (finite.go) wraps it with the guard against non-finite numbers.
func evaluate(ctx context.Context, c Case) (*Result, error) {
	s, err := prepare(c)
	if err != nil {
		return nil, err
	}
	cond := s.conditions(true)
	res := &Result{Warnings: append([]string{}, s.warnings...), Atomizer: s.atomizer}
	b := s.binned
	sum := b.Summary()
	res.Summary = Summary{D32M: sum.D32, D43M: sum.D43,
		Dv10M: sum.Dv10, Dv50M: sum.Dv50, Dv90M: sum.Dv90, Span: sum.RelativeSpan, RelativeSpan: sum.RelativeSpan}
	res.Warnings = append(res.Warnings, sum.Warnings...)
	res.Warnings = append(res.Warnings, s.numberMeans(&res.Summary, sum)...)
	if tl, field, ok := s.superheatedTemperature(); ok {
		return s.evaluateSuperheated(res, tl, field)
	}

	fixedT := 0.0
	if s.c.LiquidTemperatureK != nil {
		fixedT = *s.c.LiquidTemperatureK
	}
	seen := map[string]bool{}
	warn := func(w string) {
		if !seen[w] {
			seen[w] = true
			res.Warnings = append(res.Warnings, w)
		}
	}
	n := b.Len()
	res.Bins = make([]BinResult, n)
	// Each class's state at the fixed or its steady temperature; the
	// sweep checks the conditions once and shares the liquid's properties.
	states, err := cond.NewStateSweep(fixedT)
	if err != nil {
		return nil, s.evaluationError(err, b.Diameter(0))
	}
	for i := range n {
		if err := ctx.Err(); err != nil {
			return nil, canceled(err)
		}
		d := b.Diameter(i)
		st, err := states.State(d)
		if err != nil {
			return nil, s.evaluationError(err, d)
		}
		for _, w := range st.Warnings {
			warn(w)
		}
		bin := BinResult{
			DLoM: b.Edges[i], DHiM: b.Edges[i+1], DM: d,
			NumberFraction: b.Number[i], VolumeFraction: b.Volume[i],
			LaplacePa: st.LaplacePressure, VaporPressurePa: st.VaporPressure, KelvinRatio: st.KelvinRatio,
			EvaporationEnhancement: st.Enhancement, SurfaceTemperatureK: st.SurfaceTemperature,
			Knudsen: st.Knudsen, Regime: st.Regime, EvaporationRateKgS: st.MassRate,
			Transcritical: st.Transcritical && s.c.Heating != "transient",
		}
		res.Bins[i] = bin
	}
	// Every class's lifetime comes from the spray's one shrinkage table,
	// the same integral LifetimeReport takes per diameter.
	d := make([]float64, n)
	for i := range d {
		d[i] = b.Diameter(i)
	}
	// The history counts each class's drops at the class's own Sauter
	// diameter, so that its D32 starts at the summary's.
	opts := s.historyOptions(fixedT)
	opts.SauterFactors = make([]float64, n)
	for i := range d {
		opts.SauterFactors[i] = b.SauterDiameter(i) / d[i]
	}
	spray, err := cond.NewSpray(d, b.Volume, opts)
	if err != nil {
		return nil, s.evaluationError(err, d[n-1])
	}
	for i, t := range spray.Lifetimes() {
		if !math.IsInf(t, 0) && !math.IsNaN(t) {
			res.Bins[i].LifetimeS = &t
		}
	}
	refT := fixedT
	if refT == 0 {
		refT = res.Bins[n-1].SurfaceTemperatureK // the large-drop (wet-bulb) limit
		// A solved steady temperature below the melting point means a
		// supercooled drop: the liquid correlations end there and hold
		// their melting-point values, which the user must know.
		coldest := math.Inf(1)
		for _, b := range res.Bins {
			coldest = math.Min(coldest, b.SurfaceTemperatureK)
		}
		if tm := s.liquid.MeltingPoint(); coldest < tm {
			res.Warnings = append(res.Warnings, fmt.Sprintf("The drops settle at %.2f K, %.2f K below the melting point of %s (%.2f K): they are supercooled, may freeze, and the liquid properties are held at their melting-point values there.", coldest, tm-coldest, s.liquid.Name, tm))
		}
	}
	res.Curvature = s.curvature(cond, refT)
	if fixedT == 0 {
		// Each class sits at its own steady temperature. The equilibrium
		// drop neither evaporates nor condenses, so no latent heat crosses
		// its surface and Q = 0 puts it at the gas temperature: r* is
		// taken there, not at the large drops' temperature (which a
		// condensing spray warms above the gas), so that it divides the
		// classes as their own rates do.
		res.Curvature.KelvinCriticalRadiusM = nil
		if r, ok, err := cond.EquilibriumRadius(s.c.Gas.TemperatureK); err == nil && ok {
			res.Curvature.KelvinCriticalRadiusM = &r
		}
	}
	markGrowth(res)
	res.Properties = s.properties(refT)
	res.Equilibrium = equilibriumBlock(cond, refT)
	if e := s.c.Evaporation; e.MassFlowKgS > 0 {
		nd, err := sizedist.DropsPerSecond(b, e.MassFlowKgS, s.liquid.Density(refT))
		if err == nil && !math.IsInf(nd, 0) && !math.IsNaN(nd) {
			res.Summary.DropsPerSecond = &nd
		}
	}
	h, err := s.history(ctx, spray, d, res)
	if err != nil {
		return nil, err
	}
	s.markTranscritical(cond, res)
	s.equilibriumWarnings(cond, res)
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, b := range res.Bins {
		lo, hi = math.Min(lo, b.SurfaceTemperatureK), math.Max(hi, b.SurfaceTemperatureK)
	}
	state := "the drops' steady temperature"
	if fixedT > 0 {
		state = "the fixed drop temperature"
	}
	if s.c.Heating == "transient" && h.SurfaceTemperatureMax > 0 {
		lo, hi = math.Min(lo, h.SurfaceTemperatureMin), math.Max(hi, h.SurfaceTemperatureMax)
		state = "the drops' temperature (from injection to steady)"
	}
	res.Warnings = append(res.Warnings, s.stateWarnings(lo, hi, state)...)
	res.Warnings = dedupe(res.Warnings)
	return res, nil
}

// dedupe drops repeated warnings, keeping the first of each: the classes'
// states and the history raise some of the same flags.
func dedupe(ws []string) []string {
	seen := make(map[string]bool, len(ws))
	out := ws[:0]
	for _, w := range ws {
		if !seen[w] {
			seen[w] = true
			out = append(out, w)
		}
	}
	return out
}

// stateWarnings are the liquid's property-range warnings over the
// temperatures lo to hi (K) the drops reached under the case's model
// (state says which), and the nozzle's supply temperature with an
// atomizer: one per property, naming the temperature reached farthest
// outside its published range. They follow the state the results were
// computed at: a steady temperature that settles outside a fit's range
// warns as a fixed one there does.
func (s *setup) stateWarnings(lo, hi float64, state string) []string {
	if s.atomizer != nil {
		if t, err := supplyTemperature(s.c); err == nil {
			lo, hi = math.Min(lo, t), math.Max(hi, t)
			state += " and the nozzle's supply temperature"
		}
	}
	if !(lo <= hi) {
		return nil
	}
	return s.liquid.RangeWarnings(lo, hi, state)
}

// numberMeans sets the summary's number means D10, D20 and D30 from the
// classes' sums, or leaves them null with a warning when the model they
// were cut from has no such mean. D_pq needs the number moments of orders
// p and q to converge at D → 0; for a Rosin–Rammler the number density is
// q0 ∝ D^(q−4) exp(−(D/X)^q), so the moment of order k converges iff
// k + q − 4 > −1, i.e. q > 3 − k: D10, D20 and D30 (order 0) exist only
// for q > 3 (D21 for q > 2, D32 for q > 1). Below that the classes' means
// are set by the lower cut alone, not by the spray (sizedist's
// MeanDiameter of each model says which means exist).
func (s *setup) numberMeans(out *Summary, sum sizedist.Summary) []string {
	var missing []string
	reason := ""
	for _, mean := range []struct {
		name string
		p, q float64
		v    float64
		dst  **float64
	}{{"D10", 1, 0, sum.D10, &out.D10M}, {"D20", 2, 0, sum.D20, &out.D20M}, {"D30", 3, 0, sum.D30, &out.D30M}} {
		if s.model != nil {
			if _, err := s.model.MeanDiameter(mean.p, mean.q); err != nil {
				missing = append(missing, mean.name)
				if reason == "" {
					// "D10 of a … is undefined: the moment of order 0
					// diverges …": keep the cause after the first colon.
					reason = err.Error()
					if fes := FieldErrors(err); len(fes) > 0 {
						reason = fes[0].Message
						if k := strings.Index(reason, ": "); k >= 0 {
							reason = reason[k+2:]
						}
						reason = fmt.Sprintf("%s; %s = %s", reason, fes[0].Field, fes[0].Value)
					}
				}
				continue
			}
		}
		v := mean.v
		*mean.dst = &v
	}
	if len(missing) == 0 {
		return nil
	}
	names := strings.Join(missing, ", ")
	if k := strings.LastIndex(names, ", "); k >= 0 {
		names = names[:k] + " and " + names[k+2:]
	}
	return []string{fmt.Sprintf("%s left out (null): the model's number distribution has no such mean (%s), so the classes' values would only follow the lower cut.", names+map[bool]string{true: " is", false: " are"}[len(missing) == 1], reason)}
}

// canceled is the error of an evaluation stopped by its context.
func canceled(err error) error {
	msg := "The calculation was cancelled before it finished."
	if errors.Is(err, context.DeadlineExceeded) {
		msg = "The calculation was stopped: it ran past its time limit. Fewer size classes make it faster."
	}
	return &Error{Code: Canceled, Message: msg, Err: err}
}

// evaluationError explains a failure of the evaporation model.
func (s *setup) evaluationError(err error, d float64) error {
	if errors.Is(err, context.Canceled) || errors.Is(err, context.DeadlineExceeded) {
		return canceled(err)
	}
	if errors.Is(err, evap.ErrTranscritical) {
		return &Error{Code: Invalid, Message: fmt.Sprintf("The drop surface (drop %.3g µm) is at or past the mixture critical point of the liquid and the gas at this pressure: there is no liquid surface to evaporate from, and the drop mixes with the gas as a dense fluid, which this model does not follow. Lower the liquid temperature.", d*1e6), Err: err}
	}
	if errors.Is(err, evap.ErrBoiling) {
		return &Error{Code: Invalid, Message: fmt.Sprintf("The liquid boils at these conditions (drop %.3g µm): its vapor pressure reaches the gas pressure, so the quasi-steady evaporation model does not apply. Lower the liquid temperature or raise the pressure.", d*1e6), Err: err}
	}
	var pl *evap.PropertyLimitError
	if errors.As(err, &pl) {
		// The cause is kept as text only: its field (a liquid property)
		// is no field of the case for a form to mark.
		return &Error{Code: Invalid, Message: s.criticalLimitMessage(d), Err: errors.New(err.Error())}
	}
	if ErrorCode(err) == Invalid {
		return err
	}
	return &Error{Code: Internal, Message: "evaluation failed", Err: fmt.Errorf("drop %.4g m: %w", d, err)}
}

// criticalLimitMessage words a surface that reached the liquid's critical
// region, where its latent heat and surface tension vanish (they are zero
// at the critical temperature), so the quasi-steady evaporation model (a
// drop with a sharp surface and a latent heat) ends there. Above the
// liquid's critical pressure nothing stops the drop heating to that point;
// below it the curvature raise or a capped boiling surface can carry it
// there. d is the drop diameter, m.
func (s *setup) criticalLimitMessage(d float64) string {
	l := s.liquid
	p := s.c.Gas.PressurePa
	msg := fmt.Sprintf("The drop surface (drop %.3g µm) heats into the critical region of %s (critical point %.1f K, %.3g bar), where its latent heat and surface tension vanish: the drop no longer evaporates across a surface, and this model cannot follow it.",
		d*1e6, l.Name, l.CriticalTemperature(), l.CriticalPressure()/1e5)
	if p >= l.CriticalPressure() {
		msg += fmt.Sprintf(" The gas pressure (%.3g bar) is above the liquid's critical pressure, so the drop heats towards its critical point instead of settling below a boiling point.", p/1e5)
	}
	return msg + " Lower the gas temperature or pressure, or give a fixed liquid temperature below the critical point."
}

func (s *setup) curvature(cond *evap.Conditions, t float64) Curvature {
	l := s.liquid
	sigma := l.SurfaceTension(t)
	vm := l.MolarMass() / l.Density(t)
	c := Curvature{
		KelvinLengthM:         evap.KelvinLength(sigma, vm, t),
		LaplaceOneAtmDM:       2 * 2 * sigma / phys.StandardAtmosphere,
		ReferenceTemperatureK: t,
	}
	for _, lv := range []struct {
		level float64
		dst   **float64
	}{{0.01, &c.Enhancement1PctDM}, {0.10, &c.Enhancement10PctDM}} {
		if d, err := cond.EnhancementThreshold(lv.level, t); err == nil {
			*lv.dst = &d
		}
	}
	if r, ok, err := cond.EquilibriumRadius(t); err == nil && ok {
		c.KelvinCriticalRadiusM = &r
	}
	return c
}

func (s *setup) properties(t float64) Properties {
	l, g, c := s.liquid, s.gas, s.c
	ps := l.SaturationPressure(t)
	ys := fluid.MassFractionFromMoleFraction(math.Min(ps/c.Gas.PressurePa, 0.999999), l.MolarMass(), g.MolarMass())
	yinf := fluid.MassFractionFromMoleFraction(s.xInf, l.MolarMass(), g.MolarMass())
	f := fluid.FilmProperties(l, g, c.Gas.PressurePa, t, c.Gas.TemperatureK, ys, yinf)
	p := Properties{
		Fluid: l.ID, TemperatureK: t, SaturationPressurePa: ps, SurfaceTensionNM: l.SurfaceTension(t),
		LiquidDensityKgM3: l.Density(t), LiquidViscosityPaS: l.Viscosity(t), LatentHeatJKg: l.LatentHeat(t),
		LiquidHeatCapacityJKgK: l.HeatCapacity(t), MolarMassKgMol: l.MolarMass(),
		MolarVolumeM3Mol: l.MolarMass() / l.Density(t), NormalBoilingPointK: l.NormalBoilingPoint(),
		GasDensityKgM3: g.Density(c.Gas.TemperatureK, c.Gas.PressurePa), FilmTemperatureK: f.T,
		FilmDensityKgM3: f.Density, FilmViscosityPaS: f.Viscosity, FilmConductivityWMK: f.Conductivity,
		FilmHeatCapacityJKgK: f.HeatCapacity, DiffusivityM2S: f.Diffusivity, MeanFreePathM: f.MeanFreePath,
		AmbientVaporMoleFraction: s.xInf,
	}
	for _, src := range l.Sources() {
		p.Sources = append(p.Sources, Source{Property: src.Property, Method: src.Method, Reference: src.Reference})
	}
	for _, src := range g.Sources() {
		p.Sources = append(p.Sources, Source{Property: src.Property, Method: src.Method, Reference: src.Reference})
	}
	return p
}

// historyOptions are the case's options for the spray history.
func (s *setup) historyOptions(fixedT float64) evap.HistoryOptions {
	opts := evap.HistoryOptions{SurfaceTemperature: fixedT, MaxTime: s.c.Evaporation.MaxTimeS}
	if s.c.Heating == "transient" {
		opts.Transient = true
		opts.InjectionTemperature = *s.c.InjectionTemperatureK
		opts.SurfaceTemperature = 0
	}
	return opts
}

// history follows every class along its own d(t) and sums the spray.
func (s *setup) history(ctx context.Context, spray *evap.Spray, d []float64, res *Result) (evap.History, error) {
	opts := evap.HistoryOptions{MaxTime: s.c.Evaporation.MaxTimeS}
	if opts.MaxTime == 0 {
		// Part of the spray never evaporates (saturated or supersaturated
		// surroundings): end the history at ten times the longest finite
		// lifetime, or an hour when none is finite.
		longest, never := 0.0, false
		for _, bin := range res.Bins {
			if bin.LifetimeS == nil {
				never = true
			} else {
				longest = math.Max(longest, *bin.LifetimeS)
			}
		}
		if never {
			opts.MaxTime = 3600
			if longest > 0 {
				opts.MaxTime = 10 * longest
			}
			res.Warnings = append(res.Warnings, fmt.Sprintf("Part of the spray never evaporates in these surroundings; the history stops at %.3g s.", opts.MaxTime))
		}
	}
	h, err := spray.HistoryContext(ctx, opts.MaxTime)
	if err != nil {
		return h, s.evaluationError(err, d[len(d)-1])
	}
	res.Warnings = append(res.Warnings, h.Warnings...)
	res.History = &History{TS: h.T, EvaporatedMassFraction: h.EvaporatedMassFraction, D32M: h.D32, Dv50M: h.Dv50}
	s.criticalTimes = h.CriticalTime
	if u := s.c.Evaporation.SprayVelocityMS; u > 0 {
		res.History.XM = h.Distance(u)
	}
	finite := func(v float64) *float64 {
		if math.IsInf(v, 0) || math.IsNaN(v) {
			return nil
		}
		return &v
	}
	res.Summary.T50S, res.Summary.T90S, res.Summary.T99S = finite(h.T50), finite(h.T90), finite(h.T99)
	return h, nil
}
