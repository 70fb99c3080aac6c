package server

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"net/http"
	"net/url"
	"strconv"
	"strings"

	"github.com/go-chi/chi/v5"

	"fogbench/calc"
	"fogbench/calc/atomize"
	"fogbench/calc/fluid"
	"fogbench/calc/units"
	"fogbench/calc/valid"
	"fogbench/views"
)

// familyInfo finds an atomizer family by id.
func familyInfo(id string) (atomize.FamilyInfo, error) {
	for _, f := range atomize.Families() {
		if f.ID == id {
			return f, nil
		}
	}
	return atomize.FamilyInfo{}, calc.Errorf(calc.NotFound, "There is no atomizer family %q.", id)
}

// parseAtomizerInputs reads the inputs of one family from a form (names
// views.AtomizerInputKey, units under the same name + "_unit") into SI.
// Empty inputs are left out; messages are keyed views.AtomizerErrorKey.
func parseAtomizerInputs(family string, vals, us map[string]string) (map[string]float64, valid.Errors) {
	f, err := familyInfo(family)
	if err != nil {
		return nil, valid.Errors{{Field: "family", Value: family, Message: "unknown atomizer family"}}
	}
	in := map[string]float64{}
	var errs valid.Errors
	for _, info := range f.Inputs {
		key := views.AtomizerInputKey(family, info.Name)
		raw := strings.TrimSpace(vals[key])
		if raw == "" {
			continue
		}
		v, err := parseNumber(raw)
		if err != nil {
			errs = append(errs, &valid.FieldError{Field: views.AtomizerErrorKey(info.Name), Message: err.Error()})
			continue
		}
		if kind := views.AtomizerInputKind(info.Unit); kind != "" {
			sym := us[key]
			if sym == "" {
				sym = info.Unit
			}
			u, err := units.Lookup(kind, sym)
			if err != nil || units.VolumeFlow(u) {
				errs = append(errs, &valid.FieldError{Field: views.AtomizerErrorKey(info.Name), Message: fmt.Sprintf("unknown unit %q", sym)})
				continue
			}
			v = u.ToSI(v)
		}
		in[info.Name] = v
	}
	return in, errs
}

// isAtomizerFormInput reports whether a case-form input name belongs to the
// atomizer group (so its message is shown beside it).
func isAtomizerFormInput(name string) bool {
	switch name {
	case "family", "correlation", "atomizer_q":
		return true
	}
	return strings.HasPrefix(name, "atomizer.")
}

// atomizerFormField places an atomize or case-file field on the atomizer
// form inputs; "" when it belongs to none.
func atomizerFormField(path string) string {
	switch {
	case strings.HasPrefix(path, "distribution.inputs."):
		return views.AtomizerErrorKey(strings.TrimPrefix(path, "distribution.inputs."))
	case path == "distribution.family":
		return "family"
	case path == "distribution.correlation":
		return "correlation"
	case strings.HasPrefix(path, "solve.unknown"):
		return "solve_unknown"
	case strings.HasPrefix(path, "solve.target"), strings.HasPrefix(path, "target"):
		return "target_smd"
	}
	return ""
}

// benchDefaults is what a family's bench opens with: water at 20 °C into
// air at 25 °C and 1 atm, the family's typical required inputs and flow.
func benchDefaults(f atomize.FamilyInfo, d views.Display) (url.Values, error) {
	q := url.Values{}
	tu := units.Default(d.System, units.Temperature)
	pu := units.Default(d.System, units.Pressure)
	show := func(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
	q.Set("fluid", "water")
	q.Set("liquid_temperature", show(tu.FromSI(293.15)))
	q.Set("liquid_temperature_unit", tu.Symbol)
	q.Set("gas", "air")
	q.Set("pressure", show(pu.FromSI(101325)))
	q.Set("pressure_unit", pu.Symbol)
	q.Set("gas_temperature", show(tu.FromSI(298.15)))
	q.Set("gas_temperature_unit", tu.Symbol)
	q.Set("correlation", f.DefaultCorrelation)
	// Optional inputs some correlation needs (the first way it names) are
	// filled too, so every correlation of the family shows at once.
	needed := map[string]bool{}
	for _, c := range f.Correlations {
		first, _, _ := strings.Cut(c.Needs, ", or ")
		for _, part := range strings.FieldsFunc(first, func(r rune) bool { return r == ',' || r == ' ' }) {
			needed[part] = true
		}
	}
	for _, in := range f.Inputs {
		// The liquid flow is optional for the correlations but fixes the
		// flow number, so the bench starts with it.
		if !in.Required && in.Name != "mass_flow_kg_s" && !needed[in.Name] {
			continue
		}
		key := views.AtomizerInputKey(f.ID, in.Name)
		v := in.Typical
		if kind := views.AtomizerInputKind(in.Unit); kind != "" {
			u := units.MustLookup(kind, views.AtomizerDefaultUnit(kind, d))
			v = u.FromSI(v)
			q.Set(key+"_unit", u.Symbol)
		}
		q.Set(key, show(v))
	}
	q.Set("sweep_var", sweepDefault(f))
	return q, nil
}

// sweepDefault is the operating variable a family is usually swept over.
func sweepDefault(f atomize.FamilyInfo) string {
	for _, name := range []string{"delta_p_pa", "air_velocity_m_s", "speed_rpm", "frequency_hz"} {
		for _, in := range f.Inputs {
			if in.Name == name && in.Required {
				return name
			}
		}
	}
	return f.Inputs[0].Name
}

// benchState is a parsed bench form.
type benchState struct {
	family  atomize.FamilyInfo
	vals    map[string]string
	us      map[string]string
	marks   map[string]string
	general []string
	props   atomize.Properties
	rhoL    float64
	inputs  map[string]float64
	corr    string
	warns   []string // liquid and gas range warnings
}

func (b *benchState) mark(field, msg string) {
	if _, ok := b.marks[field]; !ok {
		b.marks[field] = msg
	}
}

// markErr places an error on its input, or in the general message.
func (b *benchState) markErr(err error) {
	fes := calc.FieldErrors(err)
	if fes == nil {
		b.general = append(b.general, calc.ErrorMessage(err))
		return
	}
	for _, fe := range fes {
		msg := fe.Message
		if fe.Value != "" {
			msg += " (got " + fe.Value + ")"
		}
		if name := atomizerFormField(fe.Field); name != "" {
			b.mark(name, msg)
		} else {
			b.general = append(b.general, fe.Error())
		}
	}
}

// number reads a bench number in its chosen unit; ok is false when empty
// or unreadable (then marked).
func (b *benchState) number(name string, kind units.Kind) (float64, bool) {
	raw := strings.TrimSpace(b.vals[name])
	if raw == "" {
		return 0, false
	}
	v, err := parseNumber(raw)
	if err != nil {
		b.mark(name, err.Error())
		return 0, false
	}
	if kind != "" {
		sym := b.us[name]
		u, err := units.Lookup(kind, sym)
		if sym == "" {
			u, err = units.Default(units.SI, kind), nil
		}
		if err != nil || units.VolumeFlow(u) {
			b.mark(name, fmt.Sprintf("unknown unit %q", sym))
			return 0, false
		}
		v = u.ToSI(v)
	}
	return v, true
}

// readBench parses the bench form and the liquid and gas properties.
func (s *Server) readBench(r *http.Request, f atomize.FamilyInfo, q url.Values) *benchState {
	b := &benchState{family: f, vals: map[string]string{}, us: map[string]string{}, marks: map[string]string{}}
	for k, v := range q {
		if len(v) == 0 {
			continue
		}
		if strings.HasSuffix(k, "_unit") {
			b.us[strings.TrimSuffix(k, "_unit")] = v[0]
		} else {
			b.vals[k] = v[0]
		}
	}
	b.corr = b.vals["correlation"]
	in, errs := parseAtomizerInputs(f.ID, b.vals, b.us)
	for _, e := range errs {
		b.mark(e.Field, e.Message)
	}
	b.inputs = in
	l, _, err := s.liquidByID(r.Context(), b.vals["fluid"])
	if err != nil {
		b.mark("fluid", calc.ErrorMessage(err))
	}
	g, err := fluid.LookupGas(b.vals["gas"])
	if err != nil {
		b.mark("gas", calc.ErrorMessage(err))
	}
	p, okP := b.number("pressure", units.Pressure)
	tg, okG := b.number("gas_temperature", units.Temperature)
	tl, okL := b.number("liquid_temperature", units.Temperature)
	if !okP && b.marks["pressure"] == "" {
		b.mark("pressure", "give the gas pressure")
	}
	if !okG && b.marks["gas_temperature"] == "" {
		b.mark("gas_temperature", "give the gas temperature")
	}
	if !okL && b.marks["liquid_temperature"] == "" {
		// Never the gas temperature: the nozzle is fed with the liquid
		// at its supply temperature.
		b.mark("liquid_temperature", "give the temperature the liquid is supplied at: the correlations take its properties there")
	}
	if g != nil && okP && okG {
		if err := valid.Between("gas.pressure_pa", p, calc.MinPressurePa, calc.MaxPressurePa, "Pa"); err != nil {
			b.mark("pressure", calc.FieldErrors(err)[0].Message)
		}
		w, err := g.Check(tg, p)
		if err != nil {
			b.mark("gas_temperature", calc.ErrorMessage(err))
		}
		b.warns = append(b.warns, w...)
	}
	if l != nil && okL {
		w, err := l.Check(tl)
		if err != nil {
			var fe *valid.FieldError
			msg := calc.ErrorMessage(err)
			if errors.As(err, &fe) {
				msg = fe.Message
			}
			b.mark("liquid_temperature", msg)
		}
		b.warns = append(b.warns, w...)
	}
	if len(b.marks) == 0 && l != nil && g != nil {
		b.rhoL = l.Density(tl)
		b.props = atomize.Properties{LiquidDensity: b.rhoL, LiquidViscosity: l.Viscosity(tl), SurfaceTension: l.SurfaceTension(tl),
			GasDensity: g.Density(tg, p), GasViscosity: g.Viscosity(tg)}
	}
	return b
}

// handleAtomizers serves GET /atomizers: the families, or a redirect to
// the one picked in the family select.
func (s *Server) handleAtomizers(w http.ResponseWriter, r *http.Request) {
	if fam := r.URL.Query().Get("family"); fam != "" {
		http.Redirect(w, r, views.FamilyURL(fam), http.StatusSeeOther)
		return
	}
	c := views.Chrome{Title: "Atomizers", Nav: "atomizers", Display: display(r)}
	s.render(w, r, http.StatusOK, c, views.AtomizerIndexPage(c, atomize.Families()))
}

// benchRequest reads the bench's family from the route and its inputs from
// the query, or the family's defaults when the query gives none.
func benchRequest(r *http.Request) (atomize.FamilyInfo, url.Values, error) {
	f, err := familyInfo(chi.URLParam(r, "family"))
	if err != nil {
		return f, nil, err
	}
	q := r.URL.Query()
	if q.Get("fluid") == "" {
		q, _ = benchDefaults(f, display(r))
	}
	return f, q, nil
}

// handleAtomizerBench serves GET /atomizers/{family}.
func (s *Server) handleAtomizerBench(w http.ResponseWriter, r *http.Request) {
	f, q, err := benchRequest(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	d := display(r)
	b := s.readBench(r, f, q)
	v := views.BenchView{
		Chrome: views.Chrome{Title: f.Name, Nav: "atomizers", Display: d},
		Family: f, Values: b.vals, Units: b.us, Errors: b.marks, Fluids: append(fluidOptions(), s.customFluidOptions(r)...),
		Gases: gasOptions(), Correlation: b.corr,
		CaseURL: "/atomizers/" + url.PathEscape(f.ID) + "/case?" + q.Encode(),
	}
	for _, fam := range atomize.Families() {
		v.Families = append(v.Families, views.Option{Value: fam.ID, Label: fam.Name})
	}
	if len(b.marks) == 0 {
		s.benchCompute(b, &v)
	}
	v.Errors = b.marks
	v.General = strings.Join(b.general, " ")
	status := http.StatusOK
	if v.HasErrors() {
		status = http.StatusUnprocessableEntity
	}
	s.render(w, r, status, v.Chrome, views.AtomizerBenchPage(v))
}

// benchCompute evaluates, and where asked solves, samples and sweeps.
func (s *Server) benchCompute(b *benchState, v *views.BenchView) {
	f := b.family
	res, err := atomize.Evaluate(f.ID, b.corr, b.inputs, b.props)
	if err != nil {
		b.markErr(err)
		return
	}
	res.Warnings = append(append([]string{}, b.warns...), res.Warnings...)
	v.Panel = &views.AtomizerPanelView{Display: v.Display, Result: res, LiquidDensity: b.rhoL}
	if body, err := json.MarshalIndent(atomizeRequest{Family: f.ID, Correlation: b.corr, Inputs: b.inputs, Properties: &b.props}, "", "  "); err == nil {
		v.APIJSON = string(body)
	}
	if len(f.Correlations) == 0 {
		return // flow only: no drop size to size for, sample or sweep
	}

	if unknown := b.vals["solve_unknown"]; unknown != "" {
		var t atomize.Target
		smd, okS := b.number("target_smd", units.Length)
		flow, okF := b.number("target_flow", units.MassFlow)
		switch {
		case okS && okF:
			b.mark("target_smd", "give a target drop size or a target flow, not both")
		case okS:
			t.SMD = smd
		case okF:
			t.MassFlow = flow
		default:
			if b.marks["target_smd"] == "" && b.marks["target_flow"] == "" {
				b.mark("target_smd", "give a target drop size or a target flow to solve for "+unknown)
			}
		}
		if t.SMD > 0 || t.MassFlow > 0 {
			in := map[string]float64{}
			for k, x := range b.inputs {
				if k != unknown {
					in[k] = x
				}
			}
			sol, err := atomize.Solve(f.ID, b.corr, in, b.props, unknown, t)
			if err != nil {
				b.markErr(asInvalid(err))
			} else {
				v.Solution = &sol
				v.SolveUnit = atomizeUnit(f, unknown)
				if kind := views.AtomizerInputKind(v.SolveUnit); kind != "" {
					v.SolveKind = kind
					if u := b.us[views.AtomizerInputKey(f.ID, unknown)]; u != "" {
						v.SolveUnit = u
					} else {
						v.SolveUnit = views.AtomizerDefaultUnit(kind, v.Display)
					}
				}
			}
		}
	}

	if cv, ok := b.number("mc_cv", ""); ok && cv != 0 {
		n, seed := 2000.0, 1.0
		if x, ok := b.number("mc_n", ""); ok {
			n = x
		}
		if x, ok := b.number("mc_seed", ""); ok {
			seed = x
		}
		switch {
		case cv < 0 || cv > 100:
			b.mark("mc_cv", "must be between 0 and 100 %")
		case n < 2 || n > 1e5 || n != math.Trunc(n):
			b.mark("mc_n", "must be a whole number from 2 to 100000")
		case seed < 0 || seed != math.Trunc(seed) || seed > 1<<53:
			b.mark("mc_seed", "must be a whole number ≥ 0")
		default:
			uncert := map[string]float64{}
			for k := range b.inputs {
				uncert[k] = cv / 100
			}
			pc, err := atomize.MonteCarlo(f.ID, b.corr, b.inputs, b.props, uncert, int(n), uint64(seed))
			if err != nil {
				b.markErr(asInvalid(err))
			} else {
				v.MC = &pc
			}
		}
	}
	s.benchSweep(b, v)
}

// asInvalid treats a failure of the solver or sampler on user input as bad
// input: they report it as plain errors when no point can be evaluated.
func asInvalid(err error) error {
	if calc.ErrorCode(err) == calc.Internal {
		return &calc.Error{Code: calc.Invalid, Message: err.Error(), Err: err}
	}
	return err
}

// atomizeUnit is the SI unit of a family's input.
func atomizeUnit(f atomize.FamilyInfo, name string) string {
	for _, in := range f.Inputs {
		if in.Name == name {
			return in.Unit
		}
	}
	return ""
}

// sweepAxis converts a swept variable's SI values for the plot axis.
func sweepAxis(siUnit string, d views.Display) (units.Unit, bool) {
	kind := views.AtomizerInputKind(siUnit)
	if kind == "" {
		return units.Unit{}, false
	}
	return units.MustLookup(kind, views.AtomizerDefaultUnit(kind, d)), true
}

// benchSweep draws SMD and flow against the chosen variable; each
// correlation is solid inside its validity range and dashed outside it.
func (s *Server) benchSweep(b *benchState, v *views.BenchView) {
	f := b.family
	variable := b.vals["sweep_var"]
	if variable == "" {
		variable = sweepDefault(f)
	}
	siUnit := atomizeUnit(f, variable)
	if siUnit == "" {
		b.mark("sweep_var", "not an input of this family")
		return
	}
	var lo, hi float64
	for _, in := range f.Inputs {
		if in.Name == variable {
			lo, hi = in.Min, in.Max
		}
	}
	for _, c := range f.Correlations {
		if c.ID == b.corr || (b.corr == "" && c.ID == f.DefaultCorrelation) {
			for _, rg := range c.Ranges {
				if rg.Quantity == variable {
					// Show the range with a margin either side, so what lies
					// outside it is seen too.
					lo, hi = math.Max(lo, rg.Min/3), math.Min(hi, rg.Max*3)
				}
			}
		}
	}
	if x, ok := b.number("sweep_lo", ""); ok {
		lo = x
	}
	if x, ok := b.number("sweep_hi", ""); ok {
		hi = x
	}
	if b.marks["sweep_lo"] != "" || b.marks["sweep_hi"] != "" {
		return
	}
	in := map[string]float64{}
	for k, x := range b.inputs {
		if k != variable {
			in[k] = x
		}
	}
	sw, err := atomize.Sweep(f.ID, in, b.props, variable, lo, hi, 80)
	if err != nil {
		fes := calc.FieldErrors(err)
		if len(fes) > 0 && (strings.Contains(fes[0].Field, "lo") || strings.Contains(fes[0].Field, "hi")) {
			b.mark("sweep_lo", fes[0].Error())
			return
		}
		b.markErr(asInvalid(err))
		return
	}
	axis, conv := sweepAxis(siUnit, v.Display)
	xs := make([]float64, len(sw.X))
	xlabel := variable + " (" + siUnit + ")"
	for i, x := range sw.X {
		xs[i] = x
		if conv {
			xs[i] = axis.FromSI(x)
		}
	}
	if conv {
		xlabel = variable + " (" + axis.Symbol + ")"
	}
	smd := chart{Title: "Drop size against " + variable, XLabel: xlabel, YLabel: "predicted diameter (µm)", LogX: sw.LogSpaced, LogY: true}
	names := map[string]string{}
	for _, c := range f.Correlations {
		names[c.ID] = c.Name
	}
	for i, se := range sw.Series {
		var inX, inY, outX, outY []float64
		for j := range sw.X {
			if !se.Valid[j] {
				continue
			}
			if se.InRange[j] {
				inX, inY = append(inX, xs[j]), append(inY, se.SMD[j]*1e6)
			} else {
				outX, outY = append(outX, xs[j]), append(outY, se.SMD[j]*1e6)
			}
		}
		smd.Series = append(smd.Series,
			series{Name: names[se.Correlation] + " (in range)", X: inX, Y: inY, Color: i + 1},
			series{Name: names[se.Correlation] + " (outside)", X: outX, Y: outY, Dashed: true, Color: i + 1})
		if se.HasRange {
			for _, m := range []float64{se.RangeMin, se.RangeMax} {
				if conv {
					m = axis.FromSI(m)
				}
				smd.Marks = append(smd.Marks, m)
			}
		}
	}
	if len(smd.Marks) > 0 {
		smd.MarkNames = []string{"validity limits"} // one legend entry for all
	}
	v.SweepNote = append(v.SweepNote, sw.Warnings...)
	if len(sw.Series) > 0 {
		if svg, err := smd.SVG(); err == nil {
			v.Sweep = &views.Plot{ID: "sweep", Title: smd.Title, SVG: svg,
				Caption: "Each correlation's predicted diameter: solid inside every validity range it states, dashed outside it; grey dotted lines mark the range limits of the swept variable. Whether each form was checked is listed under the family's correlations."}
		} else {
			s.Logger.Warn("sweep plot", "err", err)
		}
	}
	var fx, fy []float64
	for j := range sw.X {
		if sw.MassFlowKnown[j] {
			fx, fy = append(fx, xs[j]), append(fy, units.Default(v.Display.System, units.MassFlow).FromSI(sw.MassFlow[j]))
		}
	}
	if flat := len(fy) > 1 && floatsEqual(fy); flat {
		v.SweepNote = append(v.SweepNote, "The liquid flow is an input here and stays "+views.Num(fy[0], 4)+" "+v.Display.Unit(units.MassFlow)+" along the sweep; give the nozzle by its flow number or discharge coefficient instead to see the flow follow "+variable+".")
	} else if len(fx) > 1 {
		fc := chart{Title: "Liquid flow against " + variable, XLabel: xlabel,
			YLabel: "liquid mass flow (" + v.Display.Unit(units.MassFlow) + ")", LogX: sw.LogSpaced,
			Series: []series{{Name: "ṁ_L", X: fx, Y: fy}}}
		if svg, err := fc.SVG(); err == nil {
			v.FlowSweep = &views.Plot{ID: "sweep-flow", Title: fc.Title, SVG: svg, Caption: "Liquid mass flow from the discharge coefficient or flow number at each point."}
		}
	}
}

// handleAtomizerCase serves GET /atomizers/{family}/case: the case form
// prefilled with this nozzle as the case's drop-size source.
func (s *Server) handleAtomizerCase(w http.ResponseWriter, r *http.Request) {
	f, q, err := benchRequest(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	d := display(r)
	vals, us := fillForm(newCaseDefaults(), d)
	vals["model"], vals["family"], vals["correlation"] = "atomizer", f.ID, q.Get("correlation")
	vals["name"] = f.Name + " nozzle"
	for _, k := range []string{"fluid", "gas", "pressure", "gas_temperature"} {
		if x := q.Get(k); x != "" {
			vals[k] = x
		}
		if u := q.Get(k + "_unit"); u != "" {
			us[k] = u
		}
	}
	supplyToCase(q, vals, us)
	prefix := "at." + f.ID + "."
	for k, x := range q {
		if strings.HasPrefix(k, prefix) && len(x) > 0 {
			if name, ok := strings.CutSuffix(k, "_unit"); ok {
				us[name] = x[0]
			} else {
				vals[k] = x[0]
			}
		}
	}
	// The model decides the classes; leave the range to the distribution.
	delete(vals, "d_min")
	delete(vals, "d_max")
	form := s.formView(r, "New case", "/cases", 0, 0, vals, us, nil, "")
	form.Flash = "Prefilled from the atomizer workbench; check the inputs and save."
	s.render(w, r, http.StatusOK, form.Chrome, views.CaseFormPage(form))
}

// supplyToCase puts the bench's liquid temperature, the temperature the
// nozzle is fed with, into the new case as its injection temperature
// (injection_temperature_k), which the case's nozzle takes the liquid's
// properties at, never as the drops' fixed surface temperature: a 20 bar,
// 700 K combustor case showed t50 = 7 s with the drops held at 293 K.
// Where the gas is hotter than the liquid the drops heat up from it
// (transient heating); otherwise each class sits at its steady
// temperature. The drop surface temperature is left empty either way.
func supplyToCase(q url.Values, vals, us valuesMap) {
	delete(vals, "liquid_temperature")
	x := q.Get("liquid_temperature")
	if x == "" {
		return
	}
	vals["injection_temperature"] = x
	lu := q.Get("liquid_temperature_unit")
	if lu != "" {
		us["injection_temperature"] = lu
	}
	tl, okL := temperatureK(x, lu)
	tg, okG := temperatureK(q.Get("gas_temperature"), q.Get("gas_temperature_unit"))
	if okL && okG && tg > tl {
		vals["heating"] = "transient"
	}
}

// temperatureK reads a temperature typed in unit sym (kelvin when empty).
func temperatureK(raw, sym string) (float64, bool) {
	v, err := parseNumber(raw)
	if err != nil {
		return 0, false
	}
	u := units.Default(units.SI, units.Temperature)
	if sym != "" {
		if u, err = units.Lookup(units.Temperature, sym); err != nil {
			return 0, false
		}
	}
	return u.ToSI(v), true
}

// atomizeRequest is the body of POST /api/atomize and /api/atomize/solve.
// Properties may be given directly; otherwise they are computed from the
// liquid (built-in, stored, or custom_fluid) and the gas.
type atomizeRequest struct {
	Family             string              `json:"family"`
	Correlation        string              `json:"correlation,omitempty"`
	Inputs             map[string]float64  `json:"inputs"`
	Properties         *atomize.Properties `json:"properties,omitempty"`
	Fluid              string              `json:"fluid,omitempty"`
	CustomFluid        *fluid.CustomSpec   `json:"custom_fluid,omitempty"`
	LiquidTemperatureK *float64            `json:"liquid_temperature_k,omitempty"`
	Gas                *calc.Gas           `json:"gas,omitempty"`
	Unknown            string              `json:"unknown,omitempty"`
	Target             *atomize.Target     `json:"target,omitempty"`
}

// decodeAtomize reads the body and works out the properties.
func (s *Server) decodeAtomize(r *http.Request) (atomizeRequest, atomize.Properties, []string, error) {
	var req atomizeRequest
	data, err := io.ReadAll(r.Body)
	if err != nil {
		return req, atomize.Properties{}, nil, err // 413 with the limit
	}
	if err := valid.DecodeJSON(data, &req, "request"); err != nil {
		return req, atomize.Properties{}, nil, err
	}
	if req.Properties != nil {
		if req.Fluid != "" || req.CustomFluid != nil || req.Gas != nil {
			return req, atomize.Properties{}, nil, &valid.FieldError{Field: "properties", Message: "give either properties or fluid and gas, not both"}
		}
		return req, *req.Properties, nil, nil
	}
	c := calc.Case{Fluid: req.Fluid, CustomFluid: req.CustomFluid}
	if c.Fluid == "" {
		return req, atomize.Properties{}, nil, &valid.FieldError{Field: "fluid", Message: "give a fluid (and gas), or the properties"}
	}
	var l *fluid.Liquid
	if req.CustomFluid == nil {
		l, _, err = s.liquidByID(r.Context(), req.Fluid)
		if calc.ErrorCode(err) == calc.NotFound {
			err = &valid.FieldError{Field: "fluid", Value: req.Fluid, Message: "unknown liquid"}
		}
	} else {
		l, err = calc.LookupLiquid(c)
	}
	if err != nil {
		return req, atomize.Properties{}, nil, err
	}
	gas := calc.Gas{ID: "air", PressurePa: 101325, TemperatureK: 298.15}
	if req.Gas != nil {
		gas = *req.Gas
		if gas.ID == "" {
			gas.ID = "air"
		}
	}
	g, err := fluid.LookupGas(gas.ID)
	if err != nil {
		return req, atomize.Properties{}, nil, err
	}
	if err := valid.Between("gas.pressure_pa", gas.PressurePa, calc.MinPressurePa, calc.MaxPressurePa, "Pa"); err != nil {
		return req, atomize.Properties{}, nil, err
	}
	warns, err := g.Check(gas.TemperatureK, gas.PressurePa)
	if err != nil {
		return req, atomize.Properties{}, nil, err
	}
	// The nozzle takes the liquid at its supply temperature, never at the
	// gas temperature.
	if req.LiquidTemperatureK == nil {
		return req, atomize.Properties{}, nil, &valid.FieldError{Field: "liquid_temperature_k",
			Message: "give the temperature the liquid is supplied at: the correlations take its properties there"}
	}
	tl := *req.LiquidTemperatureK
	w, err := l.Check(tl)
	if err != nil {
		return req, atomize.Properties{}, nil, err
	}
	warns = append(warns, w...)
	return req, atomize.Properties{LiquidDensity: l.Density(tl), LiquidViscosity: l.Viscosity(tl), SurfaceTension: l.SurfaceTension(tl),
		GasDensity: g.Density(gas.TemperatureK, gas.PressurePa), GasViscosity: g.Viscosity(gas.TemperatureK)}, warns, nil
}

// handleAPIAtomize serves POST /api/atomize: one operating point.
func (s *Server) handleAPIAtomize(w http.ResponseWriter, r *http.Request) {
	req, props, warns, err := s.decodeAtomize(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	if req.Unknown != "" || req.Target != nil {
		s.apiError(w, r, &valid.FieldError{Field: "unknown", Message: "inverse sizing is POST /api/atomize/solve"})
		return
	}
	res, err := atomize.Evaluate(req.Family, req.Correlation, req.Inputs, props)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	res.Warnings = append(warns, res.Warnings...)
	writeJSON(w, http.StatusOK, map[string]any{"properties": props, "result": res})
}

// handleAPIAtomizeSolve serves POST /api/atomize/solve: the input value
// that reaches a target SMD or flow, or the nearest reachable one.
func (s *Server) handleAPIAtomizeSolve(w http.ResponseWriter, r *http.Request) {
	req, props, warns, err := s.decodeAtomize(r)
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	if req.Target == nil {
		s.apiError(w, r, &valid.FieldError{Field: "target", Message: `give {"smd_m":…} or {"mass_flow_kg_s":…}`})
		return
	}
	sol, err := atomize.Solve(req.Family, req.Correlation, req.Inputs, props, req.Unknown, *req.Target)
	if err != nil {
		s.apiError(w, r, asInvalid(err))
		return
	}
	sol.Warnings = append(warns, sol.Warnings...)
	writeJSON(w, http.StatusOK, map[string]any{"properties": props, "solution": sol})
}

// parseAtomizerDistribution reads the case form's atomizer group: family,
// correlation, the chosen family's inputs and the spread (its own input,
// since the Rosin–Rammler group's q may hold a stale value).
func parseAtomizerDistribution(c *calc.Case, cf *caseForm) {
	d := &c.Distribution
	d.Family, d.Correlation = cf.Values["family"], cf.Values["correlation"]
	if _, err := familyInfo(d.Family); err != nil {
		cf.Errors = append(cf.Errors, &valid.FieldError{Field: "family", Message: "choose an atomizer family"})
		return
	}
	in, errs := parseAtomizerInputs(d.Family, cf.Values, cf.Units)
	cf.Errors = append(cf.Errors, errs...)
	d.Inputs = in
	d.Q = 0
	if raw := strings.TrimSpace(cf.Values["atomizer_q"]); raw != "" {
		v, err := parseNumber(raw)
		if err != nil {
			cf.Errors = append(cf.Errors, &valid.FieldError{Field: "atomizer_q", Message: err.Error()})
		} else {
			d.Q = v
		}
	}
}

// fillAtomizerForm shows a case's atomizer (and its own liquid definition)
// on the case form.
func fillAtomizerForm(c calc.Case, disp views.Display, vals, us valuesMap) {
	if c.CustomFluid != nil {
		if b, err := json.Marshal(c.CustomFluid); err == nil {
			vals["custom_fluid_json"] = string(b)
		}
	}
	d := c.Distribution
	if d.Model != "atomizer" {
		return
	}
	vals["family"], vals["correlation"] = d.Family, d.Correlation
	if d.Q > 0 {
		vals["atomizer_q"] = strconv.FormatFloat(d.Q, 'g', 8, 64)
	}
	f, err := familyInfo(d.Family)
	if err != nil {
		return
	}
	for _, in := range f.Inputs {
		v, ok := d.Inputs[in.Name]
		if !ok {
			continue
		}
		key := views.AtomizerInputKey(f.ID, in.Name)
		if kind := views.AtomizerInputKind(in.Unit); kind != "" {
			u := units.MustLookup(kind, views.AtomizerDefaultUnit(kind, disp))
			v = u.FromSI(v)
			us[key] = u.Symbol
		}
		vals[key] = strconv.FormatFloat(v, 'g', 8, 64)
	}
}

// floatsEqual reports whether every value equals the first.
func floatsEqual(v []float64) bool {
	for _, x := range v[1:] {
		if x != v[0] {
			return false
		}
	}
	return true
}
