package server

import (
	"context"
	"encoding/json"
	"errors"
	"math"
	"net/http"
	"net/url"
	"strconv"
	"strings"

	"github.com/go-chi/chi/v5"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/calc/units"
	"fogbench/calc/valid"
	"fogbench/store"
	"fogbench/views"
)

// defaultTableK is the temperature the liquids page opens at: 25 °C.
const defaultTableK = 298.15

// liquidByID finds a built-in liquid or a stored user liquid; rec is set for
// a user liquid.
func (s *Server) liquidByID(ctx context.Context, id string) (*fluid.Liquid, *store.LiquidRecord, error) {
	if l, err := fluid.Lookup(id); err == nil {
		return l, nil, nil
	}
	rec, err := s.Store.GetLiquid(ctx, id)
	if err != nil {
		if calc.ErrorCode(err) == calc.NotFound {
			return nil, nil, calc.Errorf(calc.NotFound, "There is no liquid %q.", id)
		}
		return nil, nil, err
	}
	l, err := fluid.NewCustomLiquid(rec.Spec)
	if err != nil {
		// Stored specs were validated on save; a failure now is ours.
		return nil, nil, &calc.Error{Code: calc.Internal, Message: "stored liquid no longer valid", Err: err}
	}
	return l, &rec, nil
}

// allLiquids lists the built-in liquids, then the user liquids.
func (s *Server) allLiquids(ctx context.Context) ([]*fluid.Liquid, map[string]bool, error) {
	ls := fluid.Liquids()
	user := map[string]bool{}
	recs, err := s.Store.ListLiquids(ctx)
	if err != nil {
		return nil, nil, err
	}
	for _, rec := range recs {
		l, err := fluid.NewCustomLiquid(rec.Spec)
		if err != nil {
			s.Logger.Warn("stored liquid does not build", "id", rec.Spec.ID, "err", err)
			continue
		}
		ls = append(ls, l)
		user[l.ID] = true
	}
	return ls, user, nil
}

// customFluidOptions lists the stored user liquids for the case form.
func (s *Server) customFluidOptions(r *http.Request) []views.Option {
	recs, err := s.Store.ListLiquids(r.Context())
	if err != nil {
		s.Logger.Warn("list user liquids", "err", err)
		return nil
	}
	var out []views.Option
	for _, rec := range recs {
		name := rec.Spec.Name
		if name == "" {
			name = rec.Spec.ID
		}
		out = append(out, views.Option{Value: rec.Spec.ID, Label: name + " (user-defined)"})
	}
	return out
}

// embedCustomFluid puts the definition of a user liquid into the case when
// the case names one, so the saved case carries it: the case's own copy
// (from the form's hidden field) when it is of the chosen liquid, else the
// stored liquid's current definition. A built-in liquid carries none.
func (s *Server) embedCustomFluid(ctx context.Context, c *calc.Case) {
	if _, err := fluid.Lookup(c.Fluid); err == nil || c.Fluid == "" {
		c.CustomFluid = nil
		return
	}
	if c.CustomFluid != nil && c.CustomFluid.ID == c.Fluid {
		return
	}
	c.CustomFluid = nil
	if rec, err := s.Store.GetLiquid(ctx, c.Fluid); err == nil {
		spec := rec.Spec
		c.CustomFluid = &spec
	}
}

// caseFluidOptions are the liquids the case form offers beyond the
// built-in ones: the stored user liquids, and the liquid a case defines
// itself when the store does not hold it (an imported case), so editing such
// a case never switches its liquid silently.
func (s *Server) caseFluidOptions(r *http.Request, vals map[string]string) []views.Option {
	opts := s.customFluidOptions(r)
	id := vals["fluid"]
	if id == "" {
		return opts
	}
	if _, err := fluid.Lookup(id); err == nil {
		return opts
	}
	for _, o := range opts {
		if o.Value == id {
			return opts
		}
	}
	var spec fluid.CustomSpec
	if err := json.Unmarshal([]byte(vals["custom_fluid_json"]), &spec); err == nil && spec.ID == id {
		name := spec.Name
		if name == "" {
			name = id
		}
		return append(opts, views.Option{Value: id, Label: name + " (defined in this case)"})
	}
	return append(opts, views.Option{Value: id, Label: id + " (unknown liquid)"})
}

// tableTemperature reads the "t" and "t_unit" query parameters.
func tableTemperature(q url.Values) (tk float64, input, unit, msg string) {
	input, unit = strings.TrimSpace(q.Get("t")), q.Get("t_unit")
	if unit == "" {
		unit = "°C"
	}
	u, err := units.Lookup(units.Temperature, unit)
	if err != nil {
		return defaultTableK, input, "°C", err.Error()
	}
	if input == "" {
		return defaultTableK, strconv.FormatFloat(u.FromSI(defaultTableK), 'g', 6, 64), u.Symbol, ""
	}
	v, err := parseNumber(input)
	if err != nil {
		return defaultTableK, input, u.Symbol, err.Error()
	}
	tk = u.ToSI(v)
	if tk <= 0 {
		return defaultTableK, input, u.Symbol, "must be above absolute zero"
	}
	return tk, input, u.Symbol, ""
}

func fluidRow(l *fluid.Liquid, user bool, tk float64) views.FluidRow {
	lo, hi := l.Range()
	row := views.FluidRow{ID: l.ID, Name: l.Name, Formula: l.Formula, Surrogate: l.Surrogate, User: user, TMin: lo, TMax: hi}
	p, err := l.Props(tk)
	if err != nil {
		row.Err = "no values: " + calc.ErrorMessage(err)
		var fe *valid.FieldError
		if errors.As(err, &fe) {
			row.Err = "no values at this temperature: " + fe.Message
		}
		return row
	}
	row.Props = &p
	return row
}

// handleFluids serves GET /fluids.
func (s *Server) handleFluids(w http.ResponseWriter, r *http.Request) {
	ls, user, err := s.allLiquids(r.Context())
	if err != nil {
		s.error(w, r, err)
		return
	}
	tk, input, unit, msg := tableTemperature(r.URL.Query())
	v := views.FluidsView{
		Chrome:    views.Chrome{Title: "Liquids", Nav: "fluids", Display: display(r)},
		TempInput: input, TempUnit: unit, TempError: msg, TK: tk,
	}
	for _, l := range ls {
		v.Rows = append(v.Rows, fluidRow(l, user[l.ID], tk))
	}
	v.Plots = s.drawPlots(comparisonCharts(ls, v.Display))
	s.render(w, r, http.StatusOK, v.Chrome, views.FluidsPage(v))
}

// handleFluidShow serves GET /fluids/{id}.
func (s *Server) handleFluidShow(w http.ResponseWriter, r *http.Request) {
	l, rec, err := s.liquidByID(r.Context(), chi.URLParam(r, "id"))
	if err != nil {
		s.error(w, r, err)
		return
	}
	tk, input, unit, msg := tableTemperature(r.URL.Query())
	d := display(r)
	v := views.FluidView{
		Chrome: views.Chrome{Title: l.Name, Nav: "fluids", Display: d},
		Liquid: fluidRow(l, rec != nil, tk), CAS: l.CAS, Constants: views.ConstantFigures(l, d),
		TempInput: input, TempUnit: unit, TempError: msg, TK: tk, Sources: l.Sources(),
		Plots: s.drawPlots(liquidCharts(l, d)),
	}
	if rec != nil {
		v.Revision = rec.Revision
		v.Reference = rec.Spec.Reference
		if b, err := json.MarshalIndent(rec.Spec, "", "  "); err == nil {
			v.SpecJSON = string(b)
		}
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.FluidPage(v))
}

// propertyCurve samples one property of a liquid over its published range,
// x in the display temperature unit.
func propertyCurve(l *fluid.Liquid, d views.Display, f func(T float64) float64) ([]float64, []float64) {
	lo, hi := l.Range()
	u := units.Default(d.System, units.Temperature)
	const n = 60
	xs, ys := make([]float64, 0, n), make([]float64, 0, n)
	for i := range n {
		T := lo + (hi-lo)*float64(i)/(n-1)
		y := f(T)
		if math.IsNaN(y) || math.IsInf(y, 0) {
			continue
		}
		xs = append(xs, u.FromSI(T))
		ys = append(ys, y)
	}
	return xs, ys
}

type propertyPlot struct {
	id, title, ylabel string
	logY              bool
	f                 func(l *fluid.Liquid, T float64) float64
}

func propertyPlots(d views.Display) []propertyPlot {
	pu := units.Default(d.System, units.Pressure)
	return []propertyPlot{
		{"vapor-pressure", "Saturation (vapor) pressure", "p_sat (" + pu.Symbol + ")", true, func(l *fluid.Liquid, T float64) float64 { return pu.FromSI(l.SaturationPressure(T)) }},
		{"surface-tension", "Surface tension", "σ (mN/m)", false, func(l *fluid.Liquid, T float64) float64 { return l.SurfaceTension(T) * 1e3 }},
		{"density", "Liquid density", "ρ_L (kg/m³)", false, func(l *fluid.Liquid, T float64) float64 { return l.Density(T) }},
		{"viscosity", "Liquid viscosity", "μ_L (mPa·s)", true, func(l *fluid.Liquid, T float64) float64 { return l.Viscosity(T) * 1e3 }},
		{"latent-heat", "Latent heat of vaporization", "h_fg (kJ/kg)", false, func(l *fluid.Liquid, T float64) float64 { return l.LatentHeat(T) / 1e3 }},
	}
}

// comparisonCharts draws each property of every liquid over its own range.
func comparisonCharts(ls []*fluid.Liquid, d views.Display) []plotSpec {
	tu := units.Default(d.System, units.Temperature).Symbol
	var out []plotSpec
	for _, pp := range propertyPlots(d) {
		c := chart{Title: pp.title, XLabel: "Temperature T (" + tu + ")", YLabel: pp.ylabel, LogY: pp.logY}
		for i, l := range ls {
			xs, ys := propertyCurve(l, d, func(T float64) float64 { return pp.f(l, T) })
			// Past six liquids the colours repeat; dashes keep them apart.
			c.Series = append(c.Series, series{Name: l.Name, X: xs, Y: ys, Dashed: i >= len(palette)})
		}
		out = append(out, plotSpec{"cmp-" + pp.id, pp.title + " of every liquid over its published range (the joint range of its liquid-phase correlations).", c})
	}
	return out
}

// liquidCharts draws one liquid's properties over its published range, the
// normal boiling point marked where it lies inside.
func liquidCharts(l *fluid.Liquid, d views.Display) []plotSpec {
	tu := units.Default(d.System, units.Temperature)
	tb := []float64{tu.FromSI(l.NormalBoilingPoint())}
	var out []plotSpec
	for _, pp := range propertyPlots(d) {
		xs, ys := propertyCurve(l, d, func(T float64) float64 { return pp.f(l, T) })
		c := chart{Title: pp.title, XLabel: "Temperature T (" + tu.Symbol + ")", YLabel: pp.ylabel, LogY: pp.logY,
			Series: []series{{Name: l.Name, X: xs, Y: ys}}, Marks: tb, MarkNames: []string{"normal boiling point"}}
		out = append(out, plotSpec{pp.id, pp.title + " over the published range; the sources table names each correlation.", c})
	}
	xl, yl := propertyCurve(l, d, func(T float64) float64 { return l.HeatCapacity(T) / 1e3 })
	xv, yv := propertyCurve(l, d, func(T float64) float64 { return l.VaporHeatCapacity(T) / 1e3 })
	out = append(out, plotSpec{"heat-capacity", "Heat capacity of the liquid and of its vapor (ideal gas) over the liquid's published range.", chart{
		Title: "Heat capacities", XLabel: "Temperature T (" + tu.Symbol + ")", YLabel: "c_p (kJ/(kg·K))",
		Series: []series{{Name: "liquid", X: xl, Y: yl}, {Name: "vapor (ideal gas)", X: xv, Y: yv, Dashed: true}}}})
	return out
}

// liquidFormKeys are the constant inputs of the user-liquid form.
var liquidFormKeys = []string{"molar_mass_kg_mol", "normal_boiling_point_k", "melting_point_k", "critical_temperature_k",
	"critical_pressure_pa", "critical_volume_m3_mol", "dipole_moment_debye", "diffusion_volume"}

// parseLiquidForm reads the user-liquid form into a spec; numbers that do
// not parse are marked by their form names.
func parseLiquidForm(form url.Values) (fluid.CustomSpec, map[string]string, map[string]string) {
	vals := map[string]string{}
	for k, v := range form {
		if len(v) > 0 {
			vals[k] = v[0]
		}
	}
	errs := map[string]string{}
	num := func(key string) float64 {
		raw := strings.TrimSpace(vals[key])
		if raw == "" {
			return 0
		}
		v, err := parseNumber(raw)
		if err != nil {
			errs[key] = err.Error()
			return 0
		}
		return v
	}
	spec := fluid.CustomSpec{
		ID: strings.TrimSpace(vals["id"]), Name: strings.TrimSpace(vals["name"]), Reference: strings.TrimSpace(vals["reference"]),
	}
	consts := map[string]*float64{
		"molar_mass_kg_mol": &spec.MolarMassKgMol, "normal_boiling_point_k": &spec.NormalBoilingPointK,
		"melting_point_k": &spec.MeltingPointK, "critical_temperature_k": &spec.CriticalTemperatureK,
		"critical_pressure_pa": &spec.CriticalPressurePa, "critical_volume_m3_mol": &spec.CriticalVolumeM3Mol,
		"dipole_moment_debye": &spec.DipoleMomentDebye, "diffusion_volume": &spec.DiffusionVolume,
	}
	for _, k := range liquidFormKeys {
		*consts[k] = num(k)
	}
	rows := map[string]*fluid.CorrelationSpec{
		"vapor_pressure": &spec.VaporPressure, "liquid_density": &spec.LiquidDensity, "surface_tension": &spec.SurfaceTension,
		"liquid_viscosity": &spec.LiquidViscosity, "latent_heat": &spec.LatentHeat,
		"liquid_heat_capacity": &spec.LiquidHeatCapacity, "vapor_heat_capacity": &spec.VaporHeatCapacity,
	}
	for _, p := range views.CustomProperties() {
		cs := rows[p.Key]
		cs.Form = vals[p.Key+".form"]
		cs.Value, cs.A, cs.B, cs.C = num(p.Key+".value"), num(p.Key+".a"), num(p.Key+".b"), num(p.Key+".c")
		cs.D, cs.E, cs.TMinK, cs.TMaxK = num(p.Key+".d"), num(p.Key+".e"), num(p.Key+".t_min_k"), num(p.Key+".t_max_k")
	}
	return spec, vals, errs
}

// specValues shows a stored spec on the form.
func specValues(spec fluid.CustomSpec) map[string]string {
	show := func(v float64) string {
		if v == 0 {
			return ""
		}
		return strconv.FormatFloat(v, 'g', -1, 64)
	}
	vals := map[string]string{"id": spec.ID, "name": spec.Name, "reference": spec.Reference,
		"molar_mass_kg_mol": show(spec.MolarMassKgMol), "normal_boiling_point_k": show(spec.NormalBoilingPointK),
		"melting_point_k": show(spec.MeltingPointK), "critical_temperature_k": show(spec.CriticalTemperatureK),
		"critical_pressure_pa": show(spec.CriticalPressurePa), "critical_volume_m3_mol": show(spec.CriticalVolumeM3Mol),
		"dipole_moment_debye": show(spec.DipoleMomentDebye), "diffusion_volume": show(spec.DiffusionVolume)}
	for key, cs := range map[string]fluid.CorrelationSpec{
		"vapor_pressure": spec.VaporPressure, "liquid_density": spec.LiquidDensity, "surface_tension": spec.SurfaceTension,
		"liquid_viscosity": spec.LiquidViscosity, "latent_heat": spec.LatentHeat,
		"liquid_heat_capacity": spec.LiquidHeatCapacity, "vapor_heat_capacity": spec.VaporHeatCapacity,
	} {
		vals[key+".form"] = cs.Form
		for col, v := range map[string]float64{"value": cs.Value, "a": cs.A, "b": cs.B, "c": cs.C, "d": cs.D, "e": cs.E,
			"t_min_k": cs.TMinK, "t_max_k": cs.TMaxK} {
			vals[key+"."+col] = show(v)
		}
	}
	return vals
}

// liquidFormErrors places store and validation errors ("custom.x.y") on
// the form inputs ("x.y"); anything else becomes the general message.
func liquidFormErrors(err error, marks map[string]string) (map[string]string, string) {
	fes := calc.FieldErrors(err)
	if fes == nil {
		return marks, calc.ErrorMessage(err)
	}
	for _, fe := range fes {
		key := strings.TrimPrefix(fe.Field, "custom.")
		if _, seen := marks[key]; seen {
			continue
		}
		msg := fe.Message
		if fe.Value != "" {
			msg += " (got " + fe.Value + ")"
		}
		marks[key] = msg
	}
	return marks, ""
}

func (s *Server) liquidForm(r *http.Request, title, action string, editing bool, rev int, vals, errs map[string]string, general string) views.CustomLiquidForm {
	return views.CustomLiquidForm{
		Chrome: views.Chrome{Title: title, Nav: "fluids", Display: display(r)},
		Action: action, Editing: editing, Revision: rev, Values: vals, Errors: errs, General: general,
	}
}

// handleLiquidNew serves GET /fluids/custom/new.
func (s *Server) handleLiquidNew(w http.ResponseWriter, r *http.Request) {
	f := s.liquidForm(r, "New user liquid", "/fluids/custom", false, 0, map[string]string{}, nil, "")
	s.render(w, r, http.StatusOK, f.Chrome, views.CustomLiquidFormPage(f))
}

// handleLiquidCreate serves POST /fluids/custom.
func (s *Server) handleLiquidCreate(w http.ResponseWriter, r *http.Request) {
	if err := r.ParseForm(); err != nil {
		s.error(w, r, err)
		return
	}
	spec, vals, marks := parseLiquidForm(r.PostForm)
	var err error
	if len(marks) == 0 {
		_, err = s.Store.CreateLiquid(r.Context(), spec)
	}
	if len(marks) > 0 || err != nil {
		if err != nil && calc.ErrorCode(err) == calc.Internal {
			s.error(w, r, err)
			return
		}
		general := ""
		if err != nil {
			marks, general = liquidFormErrors(err, marks)
		}
		status := http.StatusUnprocessableEntity
		if st, ok := storageStatus(err); ok { // disk full or read-only: the form stays
			status, general = st, general+keptFormNote
			s.logStorage(r, err)
		}
		f := s.liquidForm(r, "New user liquid", "/fluids/custom", false, 0, vals, marks, general)
		s.render(w, r, status, f.Chrome, views.CustomLiquidFormPage(f))
		return
	}
	s.redirectWithFlash(w, r, "/fluids/"+url.PathEscape(spec.ID), "Saved")
}

// handleLiquidEdit serves GET /fluids/custom/{id}/edit.
func (s *Server) handleLiquidEdit(w http.ResponseWriter, r *http.Request) {
	id := chi.URLParam(r, "id")
	rec, err := s.Store.GetLiquid(r.Context(), id)
	if err != nil {
		s.error(w, r, err)
		return
	}
	f := s.liquidForm(r, "Edit "+rec.Spec.Name, "/fluids/custom/"+url.PathEscape(id), true, rec.Revision, specValues(rec.Spec), nil, "")
	s.render(w, r, http.StatusOK, f.Chrome, views.CustomLiquidFormPage(f))
}

// handleLiquidUpdate serves POST /fluids/custom/{id}.
func (s *Server) handleLiquidUpdate(w http.ResponseWriter, r *http.Request) {
	id := chi.URLParam(r, "id")
	if err := r.ParseForm(); err != nil {
		s.error(w, r, err)
		return
	}
	spec, vals, marks := parseLiquidForm(r.PostForm)
	base, _ := strconv.Atoi(r.PostForm.Get("revision"))
	var err error
	if len(marks) == 0 {
		_, err = s.Store.UpdateLiquid(r.Context(), id, base, spec)
	}
	if len(marks) > 0 || err != nil {
		if err != nil && (calc.ErrorCode(err) == calc.Internal || calc.ErrorCode(err) == calc.NotFound) {
			s.error(w, r, err)
			return
		}
		general := ""
		if err != nil {
			marks, general = liquidFormErrors(err, marks)
		}
		status := http.StatusUnprocessableEntity
		if calc.ErrorCode(err) == calc.Conflict {
			status = http.StatusConflict
		}
		if st, ok := storageStatus(err); ok { // disk full or read-only: the form stays
			status, general = st, general+keptFormNote
			s.logStorage(r, err)
		}
		f := s.liquidForm(r, "Edit "+spec.Name, "/fluids/custom/"+url.PathEscape(id), true, base, vals, marks, general)
		s.render(w, r, status, f.Chrome, views.CustomLiquidFormPage(f))
		return
	}
	s.redirectWithFlash(w, r, "/fluids/"+url.PathEscape(id), "Saved")
}

// handleLiquidDelete serves POST /fluids/custom/{id}/delete.
func (s *Server) handleLiquidDelete(w http.ResponseWriter, r *http.Request) {
	id := chi.URLParam(r, "id")
	if err := s.Store.DeleteLiquid(r.Context(), id); err != nil {
		s.error(w, r, err)
		return
	}
	s.redirectWithFlash(w, r, "/fluids", "Deleted "+id+"; cases that used it keep their own copy")
}

// fluidJSON is one liquid in the API list.
type fluidJSON struct {
	ID                   string  `json:"id"`
	Name                 string  `json:"name"`
	Formula              string  `json:"formula,omitempty"`
	CAS                  string  `json:"cas,omitempty"`
	Surrogate            string  `json:"surrogate,omitempty"`
	User                 bool    `json:"user_defined"`
	TMinK                float64 `json:"t_min_k"`
	TMaxK                float64 `json:"t_max_k"`
	MeltingPointK        float64 `json:"melting_point_k"`
	CriticalTemperatureK float64 `json:"critical_temperature_k"`
	NormalBoilingPointK  float64 `json:"normal_boiling_point_k"`
	MolarMassKgMol       float64 `json:"molar_mass_kg_mol"`
}

func toFluidJSON(l *fluid.Liquid, user bool) fluidJSON {
	lo, hi := l.Range()
	return fluidJSON{ID: l.ID, Name: l.Name, Formula: l.Formula, CAS: l.CAS, Surrogate: l.Surrogate, User: user,
		TMinK: lo, TMaxK: hi, MeltingPointK: l.MeltingPoint(), CriticalTemperatureK: l.CriticalTemperature(),
		NormalBoilingPointK: l.NormalBoilingPoint(), MolarMassKgMol: l.MolarMass()}
}

// handleAPIFluids serves GET /api/fluids.
func (s *Server) handleAPIFluids(w http.ResponseWriter, r *http.Request) {
	ls, user, err := s.allLiquids(r.Context())
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	out := make([]fluidJSON, len(ls))
	for i, l := range ls {
		out[i] = toFluidJSON(l, user[l.ID])
	}
	writeJSON(w, http.StatusOK, map[string]any{"fluids": out})
}

// handleAPIFluid serves GET /api/fluids/{id}?t_k=…: every property at one
// temperature with its warnings and sources. Past the liquid's hard limits
// the answer is 400 naming t_k.
func (s *Server) handleAPIFluid(w http.ResponseWriter, r *http.Request) {
	l, rec, err := s.liquidByID(r.Context(), chi.URLParam(r, "id"))
	if err != nil {
		s.apiError(w, r, err)
		return
	}
	raw := r.URL.Query().Get("t_k")
	if raw == "" {
		s.apiError(w, r, &valid.FieldError{Field: "t_k", Message: "give the liquid temperature in K, e.g. ?t_k=298.15"})
		return
	}
	tk, err := strconv.ParseFloat(raw, 64)
	if err != nil {
		s.apiError(w, r, &valid.FieldError{Field: "t_k", Value: raw, Message: "must be a number (K)"})
		return
	}
	p, err := l.Props(tk)
	if err != nil {
		var fe *valid.FieldError
		if errors.As(err, &fe) {
			err = &valid.FieldError{Field: "t_k", Value: fe.Value, Message: fe.Message}
		}
		s.apiError(w, r, err)
		return
	}
	if p.Warnings == nil {
		p.Warnings = []string{}
	}
	writeJSON(w, http.StatusOK, map[string]any{
		"fluid": toFluidJSON(l, rec != nil), "properties": p, "warnings": p.Warnings, "sources": l.Sources(),
	})
}
