package server

import (
	"encoding/json"
	"fmt"
	"math"
	"net/url"
	"strconv"
	"strings"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/calc/units"
	"fogbench/calc/valid"
	"fogbench/store"
	"fogbench/views"
)

// formField ties one input of the case form to its field in the case file:
// the form shows it in a unit the user picks, the case stores SI.
type formField struct {
	name string     // form input name
	path string     // case-file path, used to place validation messages
	kind units.Kind // "" for dimensionless numbers
	// exactly one of ref (always present) and opt (may be absent) is set
	ref func(c *calc.Case) *float64
	opt func(c *calc.Case) **float64
}

var numberFields = []formField{
	{name: "liquid_temperature", path: "liquid_temperature_k", kind: units.Temperature, opt: func(c *calc.Case) **float64 { return &c.LiquidTemperatureK }},
	{name: "injection_temperature", path: "injection_temperature_k", kind: units.Temperature, opt: func(c *calc.Case) **float64 { return &c.InjectionTemperatureK }},
	{name: "pressure", path: "gas.pressure_pa", kind: units.Pressure, ref: func(c *calc.Case) *float64 { return &c.Gas.PressurePa }},
	{name: "gas_temperature", path: "gas.temperature_k", kind: units.Temperature, ref: func(c *calc.Case) *float64 { return &c.Gas.TemperatureK }},
	{name: "relative_velocity", path: "gas.relative_velocity_m_s", kind: units.Velocity, ref: func(c *calc.Case) *float64 { return &c.Gas.RelativeVelocityMS }},
	{name: "spray_velocity", path: "evaporation.spray_velocity_m_s", kind: units.Velocity, ref: func(c *calc.Case) *float64 { return &c.Evaporation.SprayVelocityMS }},
	{name: "accommodation", path: "evaporation.accommodation_coefficient", ref: func(c *calc.Case) *float64 { return &c.Evaporation.AccommodationCoef }},
	{name: "max_time", path: "evaporation.max_time_s", kind: units.Time, ref: func(c *calc.Case) *float64 { return &c.Evaporation.MaxTimeS }},
	{name: "d32", path: "distribution.d32_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.D32M }},
	{name: "x", path: "distribution.x_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.XM }},
	{name: "q", path: "distribution.q", ref: func(c *calc.Case) *float64 { return &c.Distribution.Q }},
	{name: "median", path: "distribution.median_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.MedianM }},
	{name: "gsd", path: "distribution.gsd", ref: func(c *calc.Case) *float64 { return &c.Distribution.GSD }},
	{name: "d_upper", path: "distribution.d_upper_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.DUpperM }},
	{name: "dv50", path: "distribution.dv50_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.Dv50M }},
	{name: "delta", path: "distribution.delta", ref: func(c *calc.Case) *float64 { return &c.Distribution.Delta }},
	{name: "scale", path: "distribution.scale_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.ScaleM }},
	{name: "p", path: "distribution.p", ref: func(c *calc.Case) *float64 { return &c.Distribution.P }},
	{name: "q_nt", path: "distribution.q_nt", ref: func(c *calc.Case) *float64 { return &c.Distribution.QNT }},
	{name: "d_min", path: "distribution.d_min_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.DMinM }},
	{name: "d_max", path: "distribution.d_max_m", kind: units.Length, ref: func(c *calc.Case) *float64 { return &c.Distribution.DMaxM }},
}

// pathToForm places a case-file validation message on a form input.
var pathToForm = map[string]string{
	"name":                          "name",
	"fluid":                         "fluid",
	"gas.id":                        "gas",
	"gas.vapor_mole_fraction":       "vapor",
	"gas.relative_humidity":         "vapor",
	"gas.vapor_partial_pressure_pa": "vapor",
	"distribution.model":            "model",
	"distribution.bins":             "bins",
	"distribution.spacing":          "spacing",
	"distribution.edges_m":          "edges",
	"distribution.fraction":         "fractions",
	"evaporation.convection":        "convection",
	"evaporation.no_transition":     "transition",
	"evaporation.mass_flow_kg_s":    "mass_flow",
	"heating":                       "heating",
	"custom_fluid":                  "fluid",
}

func init() {
	for _, f := range numberFields {
		pathToForm[f.path] = f.name
	}
}

// formFor maps a case-file path to the form input that shows it; basis
// belongs to whichever model group is in use.
func formFor(path, model string) string {
	if path == "distribution.basis" {
		if model == "bins" {
			return "bins_basis"
		}
		return "ln_basis"
	}
	if name := atomizerFormField(path); name != "" {
		return name
	}
	if path == "distribution.q" && model == "atomizer" {
		return "atomizer_q"
	}
	if name, ok := pathToForm[path]; ok {
		return name
	}
	// Unknown sub-paths (e.g. "distribution.fraction[3]") fall back to
	// their parent.
	for p, name := range pathToForm {
		if strings.HasPrefix(path, p+"[") || strings.HasPrefix(path, p+".") {
			return name
		}
	}
	return ""
}

// parseNumber reads a number as people type it: spaces allowed, a decimal
// comma accepted when there is no point.
func parseNumber(s string) (float64, error) {
	s = strings.TrimSpace(strings.ReplaceAll(s, " ", ""))
	if !strings.Contains(s, ".") && strings.Count(s, ",") == 1 {
		s = strings.Replace(s, ",", ".", 1)
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("%q is not a number", s)
	}
	return v, nil
}

// parseList reads numbers separated by spaces, line breaks, semicolons or
// commas (a comma is a separator here unless the list uses ';').
func parseList(s string) ([]float64, error) {
	sep := func(r rune) bool { return r == '\n' || r == '\r' || r == '\t' || r == ' ' || r == ';' || r == ',' }
	if strings.Contains(s, ";") {
		sep = func(r rune) bool { return r == '\n' || r == '\r' || r == '\t' || r == ' ' || r == ';' }
	}
	var out []float64
	for i, tok := range strings.FieldsFunc(s, sep) {
		v, err := parseNumber(tok)
		if err != nil {
			return nil, fmt.Errorf("entry %d: %v", i+1, err)
		}
		out = append(out, v)
	}
	return out, nil
}

// caseForm is a submitted form: the raw values, the units chosen and what
// was wrong with them.
type caseForm struct {
	Values valuesMap
	Units  valuesMap
	Errors valid.Errors // Field holds the form input name
}

type valuesMap map[string]string

// parseCaseForm turns a submitted form into a case. Values that cannot be
// read (not a number, unknown unit) are marked; the case is filled with what
// could be read.
func parseCaseForm(form url.Values) (calc.Case, caseForm) {
	cf := caseForm{Values: valuesMap{}, Units: valuesMap{}}
	for k, v := range form {
		if len(v) > 0 {
			if strings.HasSuffix(k, "_unit") {
				cf.Units[strings.TrimSuffix(k, "_unit")] = v[0]
			} else {
				cf.Values[k] = v[0]
			}
		}
	}
	mark := func(name, msg string) {
		cf.Errors = append(cf.Errors, &valid.FieldError{Field: name, Message: msg})
	}
	// Browsers submit a textarea's line breaks as CRLF; the case keeps LF.
	lf := strings.NewReplacer("\r\n", "\n", "\r", "\n")
	c := calc.Case{
		Format: calc.CaseFormat,
		Name:   strings.TrimSpace(cf.Values["name"]),
		Notes:  strings.TrimSpace(lf.Replace(cf.Values["notes"])),
		Fluid:  cf.Values["fluid"],
		Gas:    calc.Gas{ID: cf.Values["gas"]},
		Distribution: calc.Distribution{
			Model:   cf.Values["model"],
			Spacing: cf.Values["spacing"],
		},
		Evaporation: calc.Evaporation{Convection: cf.Values["convection"], NoTransition: cf.Values["transition"] == "off"},
	}
	if cf.Values["heating"] == "transient" {
		c.Heating = "transient"
	}
	if cf.Values["heating"] == "transient" {
		c.Heating = "transient"
	}
	if raw := cf.Values["custom_fluid_json"]; raw != "" {
		// The liquid a case defines itself travels through the form as JSON.
		var spec fluid.CustomSpec
		if err := json.Unmarshal([]byte(raw), &spec); err == nil && spec.ID == c.Fluid {
			c.CustomFluid = &spec
		}
	}
	if c.Evaporation.Convection == "ranz-marshall" {
		c.Evaporation.Convection = "" // the default stays implicit in the file
	}
	if c.Name == "" {
		mark("name", "give the case a name")
	}
	unitOf := func(name string, kind units.Kind) (units.Unit, bool) {
		sym := cf.Units[name]
		if sym == "" {
			return units.Default(units.SI, kind), true
		}
		u, err := units.Lookup(kind, sym)
		if err != nil {
			mark(name, err.Error())
			return units.Unit{}, false
		}
		return u, true
	}
	for _, f := range numberFields {
		raw := strings.TrimSpace(cf.Values[f.name])
		if raw == "" {
			continue
		}
		v, err := parseNumber(raw)
		if err != nil {
			mark(f.name, err.Error())
			continue
		}
		if f.kind != "" {
			u, ok := unitOf(f.name, f.kind)
			if !ok {
				continue
			}
			v = u.ToSI(v)
		}
		if f.opt != nil {
			*f.opt(&c) = &v
		} else {
			*f.ref(&c) = v
		}
	}
	if raw := strings.TrimSpace(cf.Values["bins"]); raw != "" {
		n, err := strconv.Atoi(raw)
		if err != nil {
			mark("bins", fmt.Sprintf("%q is not a whole number", raw))
		} else {
			c.Distribution.Bins = n
		}
	}
	if raw := strings.TrimSpace(cf.Values["vapor"]); raw != "" {
		v, err := parseNumber(raw)
		switch {
		case err != nil:
			mark("vapor", err.Error())
		case cf.Values["vapor_mode"] == "relative_humidity":
			rh := v / 100
			c.Gas.RelativeHumidity = &rh
		case cf.Values["vapor_mode"] == "partial_pressure":
			c.Gas.VaporPartialPressurePa = &v
		default:
			c.Gas.VaporMoleFraction = &v
		}
	}
	switch c.Distribution.Model {
	case "log-normal":
		c.Distribution.Basis = cf.Values["ln_basis"]
	case "bins":
		c.Distribution.Basis = cf.Values["bins_basis"]
		c.Distribution.Spacing = ""
		if u, ok := unitOf("edges", units.Length); ok {
			edges, err := parseList(cf.Values["edges"])
			if err != nil {
				mark("edges", err.Error())
			}
			for i := range edges {
				edges[i] = u.ToSI(edges[i])
			}
			c.Distribution.EdgesM = edges
		}
		fr, err := parseList(cf.Values["fractions"])
		if err != nil {
			mark("fractions", err.Error())
		}
		for i := range fr {
			fr[i] /= 100
		}
		c.Distribution.Fraction = fr
	}
	if c.Distribution.Model == "atomizer" {
		parseAtomizerDistribution(&c, &cf)
	}
	if raw := strings.TrimSpace(cf.Values["mass_flow"]); raw != "" {
		v, err := parseNumber(raw)
		u, ok := unitOf("mass_flow", units.MassFlow)
		switch {
		case err != nil:
			mark("mass_flow", err.Error())
		case ok && units.VolumeFlow(u):
			rho, derr := liquidDensity(c)
			if derr != nil {
				mark("mass_flow", "choose a known liquid to give the flow by volume")
			} else {
				c.Evaporation.MassFlowKgS = u.ToSI(v) * rho
			}
		case ok:
			c.Evaporation.MassFlowKgS = u.ToSI(v)
		}
	}
	return c, cf
}

// liquidDensity is the density used to turn a volume flow into a mass flow:
// at the drop temperature if given, else at 15 °C (common practice for
// metering fuel by volume, no source).
func liquidDensity(c calc.Case) (float64, error) {
	l, err := calc.LookupLiquid(c)
	if err != nil {
		return 0, err
	}
	t := 288.15
	if c.LiquidTemperatureK != nil {
		t = *c.LiquidTemperatureK
	}
	return l.Density(t), nil
}

// fillForm shows a stored case in the form, in the display units.
func fillForm(c calc.Case, d views.Display) (valuesMap, valuesMap) {
	vals := valuesMap{
		"name": c.Name, "notes": c.Notes, "fluid": c.Fluid, "gas": c.Gas.ID,
		"model": c.Distribution.Model, "spacing": c.Distribution.Spacing, "convection": c.Evaporation.Convection,
		"transition": "on",
	}
	if c.Heating == "transient" {
		vals["heating"] = "transient"
	}
	if c.Evaporation.NoTransition {
		vals["transition"] = "off"
	}
	if c.Heating == "transient" {
		vals["heating"] = "transient"
	}
	us := valuesMap{}
	if vals["convection"] == "" {
		vals["convection"] = "ranz-marshall"
	}
	if vals["gas"] == "" {
		vals["gas"] = "air"
	}
	show := func(v float64) string { return strconv.FormatFloat(v, 'g', 8, 64) }
	for _, f := range numberFields {
		var v *float64
		if f.opt != nil {
			v = *f.opt(&c)
		} else if x := *f.ref(&c); x != 0 {
			v = &x
		}
		if v == nil {
			continue
		}
		if f.kind != "" {
			u := units.Default(d.System, f.kind)
			vals[f.name] = show(u.FromSI(*v))
			us[f.name] = u.Symbol
		} else {
			vals[f.name] = show(*v)
		}
	}
	if c.Distribution.Bins > 0 {
		vals["bins"] = strconv.Itoa(c.Distribution.Bins)
	}
	switch {
	case c.Gas.RelativeHumidity != nil:
		vals["vapor_mode"], vals["vapor"] = "relative_humidity", show(*c.Gas.RelativeHumidity*100)
	case c.Gas.VaporPartialPressurePa != nil:
		vals["vapor_mode"], vals["vapor"] = "partial_pressure", show(*c.Gas.VaporPartialPressurePa)
	case c.Gas.VaporMoleFraction != nil:
		vals["vapor_mode"], vals["vapor"] = "mole_fraction", show(*c.Gas.VaporMoleFraction)
	}
	if c.Evaporation.MassFlowKgS > 0 {
		u := units.Default(d.System, units.MassFlow)
		vals["mass_flow"], us["mass_flow"] = show(u.FromSI(c.Evaporation.MassFlowKgS)), u.Symbol
	}
	fillAtomizerForm(c, d, vals, us)
	if c.Distribution.Model == "bins" {
		vals["bins_basis"] = c.Distribution.Basis
		lines := make([]string, len(c.Distribution.EdgesM))
		for i, e := range c.Distribution.EdgesM {
			lines[i] = show(e * 1e6)
		}
		vals["edges"], us["edges"] = strings.Join(lines, "\n"), "µm"
		fl := make([]string, len(c.Distribution.Fraction))
		for i, f := range c.Distribution.Fraction {
			fl[i] = show(f * 100)
		}
		vals["fractions"] = strings.Join(fl, "\n")
	} else {
		vals["ln_basis"] = c.Distribution.Basis
	}
	return vals, us
}

// newCaseDefaults is what a blank form starts from: water into still air at
// 25 °C with a Rosin–Rammler spray, values a user will overwrite.
func newCaseDefaults() calc.Case {
	zero := 0.0
	return calc.Case{
		Format: calc.CaseFormat,
		Fluid:  "water",
		Gas:    calc.Gas{ID: "air", PressurePa: 101325, TemperatureK: 298.15, VaporMoleFraction: &zero},
		Distribution: calc.Distribution{Model: "rosin-rammler", XM: 50e-6, Q: 2.5, Bins: 40,
			DMinM: 1e-6, DMaxM: 300e-6, Spacing: "log", Basis: "volume"},
	}
}

// keepUnchanged carries into a submitted case every field the user did not
// change on the form, exactly as the stored revision the form was opened
// from (base) has it. The form shows numbers rounded to eight digits in the
// display units and leaves out what it cannot show, so a case read from the
// form alone would lose digits and fields on every save. Here the base case
// is shown and read back as an untouched form would be (ancestor); each
// field where the submitted case equals the ancestor keeps the base value,
// and each field the user changed takes the form's value: the same
// three-way merge, on the canonical case file, that re-applies a change to
// a newer revision (store.ReapplyChanges).
func keepUnchanged(base, submitted calc.Case, d views.Display) (calc.Case, error) {
	vals, us := fillForm(base, d)
	form := url.Values{}
	for k, v := range vals {
		form.Set(k, v)
	}
	for k, u := range us {
		form.Set(k+"_unit", u)
	}
	ancestor, _ := parseCaseForm(form)
	merged, _, err := store.ReapplyChanges(ancestor, submitted, base)
	if err != nil {
		return submitted, err
	}
	return merged, nil
}
