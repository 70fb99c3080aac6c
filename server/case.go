package server

import (
	"errors"
	"fmt"
	"net/http"
	"net/url"
	"slices"
	"strconv"

	"github.com/go-chi/chi/v5"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/calc/units"
	"fogbench/calc/valid"
	"fogbench/store"
	"fogbench/views"
)

const pageSize = 50

// handleLibrary serves GET /cases.
func (s *Server) handleLibrary(w http.ResponseWriter, r *http.Request) {
	v, err := s.libraryView(r, r.URL.Query())
	if err != nil {
		s.error(w, r, err)
		return
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.LibraryPage(v))
}

// libraryView is the library page for the filters and page in q.
func (s *Server) libraryView(r *http.Request, q url.Values) (views.LibraryView, error) {
	page, _ := strconv.Atoi(q.Get("page"))
	page = max(page, 1)
	opts := store.ListOptions{
		Query: q.Get("q"), Fluid: q.Get("fluid"), Tag: q.Get("tag"), Sort: q.Get("sort"),
		Trash: q.Get("trash") == "1", Limit: pageSize, Offset: (page - 1) * pageSize,
		Family: q.Get("family"),
	}
	rows, total, err := s.Store.ListCases(r.Context(), opts)
	if err != nil {
		return views.LibraryView{}, err
	}
	v := views.LibraryView{
		Chrome: views.Chrome{Title: "Case library", Nav: "library", Display: display(r)},
		Total:  total, Query: opts.Query, Fluid: opts.Fluid, Tag: opts.Tag, Sort: opts.Sort, Trash: opts.Trash,
		Fluids: fluidOptions(), Page: page, Pages: (total + pageSize - 1) / pageSize,
		Family: opts.Family, Families: familyOptions(),
	}
	if v.TagOptions, err = s.tagOptions(r); err != nil {
		return views.LibraryView{}, err
	}
	for _, c := range rows {
		v.Rows = append(v.Rows, views.CaseRow{ID: c.ID, Name: c.Name, Fluid: c.Fluid, Model: modelLabel(c.Model, c.Family),
			Revision: c.Revision, Updated: c.UpdatedAt, Tags: c.Tags})
	}
	return v, nil
}

func modelLabel(model, family string) string {
	if model == "atomizer" && family != "" {
		return "atomizer: " + family
	}
	return model
}

func fluidOptions() []views.Option {
	var out []views.Option
	for _, l := range fluid.Liquids() {
		out = append(out, views.Option{Value: l.ID, Label: l.Name})
	}
	return out
}

func gasOptions() []views.Option {
	var out []views.Option
	for _, g := range fluid.Gases() {
		out = append(out, views.Option{Value: g.ID, Label: g.Name})
	}
	return out
}

func caseID(r *http.Request) (int64, error) {
	raw := chi.URLParam(r, "id")
	id, err := strconv.ParseInt(raw, 10, 64)
	if err != nil || id <= 0 {
		return 0, calc.Errorf(calc.NotFound, "%q is not a case number", raw)
	}
	return id, nil
}

// storedCase reads the {id} of the route and loads that case: not found for
// a malformed id or a missing case.
func (s *Server) storedCase(r *http.Request) (store.CaseRecord, error) {
	id, err := caseID(r)
	if err != nil {
		return store.CaseRecord{}, err
	}
	return s.Store.GetCase(r.Context(), id)
}

// handleCaseShow serves GET /cases/{id}.
func (s *Server) handleCaseShow(w http.ResponseWriter, r *http.Request) {
	rec, err := s.storedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	v := s.caseView(r, rec)
	s.render(w, r, http.StatusOK, v.Chrome, views.CasePage(v))
}

// caseView evaluates a stored case and prepares the page.
func (s *Server) caseView(r *http.Request, rec store.CaseRecord) views.CaseView {
	d := display(r)
	v := views.CaseView{
		Chrome: views.Chrome{Title: rec.Case.Name, Nav: "library", Display: d},
		ID:     rec.ID, Revision: rec.Revision, Case: rec.Case, Author: rec.Author,
		Updated: rec.UpdatedAt, Tags: rec.Tags, ParentID: rec.ParentID, Trashed: !rec.DeletedAt.IsZero(),
		Inputs: inputFigures(rec.Case, d), Flammable: flammable(rec.Case.Fluid),
	}
	s.fillStoredResults(r, &v)
	return v
}

// fillResults evaluates v.Case and draws its plots; a case that cannot be
// computed gets the reason instead. The evaluation stops with the request
// (time limit or client gone).
func (s *Server) fillResults(r *http.Request, v *views.CaseView) {
	res, err := calc.EvaluateContext(r.Context(), v.Case)
	if err != nil {
		if calc.ErrorCode(err) == calc.Internal {
			s.Logger.Error("evaluate", "path", r.URL.Path, "err", err)
		}
		v.Error = calc.ErrorMessage(err)
		return
	}
	v.Result = res
	v.Plots = append(s.distPlots(res, measuredFit(v.Case)), s.plots(res)...)
	v.SuperheatPlot = s.superheatPlot(v.Case, res)
}

func (s *Server) plots(res *calc.Result) []views.Plot {
	curvCaption := "Raise of the vapor pressure by the Kelvin equation and of the evaporation rate, each as ratio − 1, per size class; dashed lines mark where the rate is raised by 1 % and 10 %."
	if res.Curvature.KelvinCriticalRadiusM != nil {
		curvCaption = "Raise of the vapor pressure by the Kelvin equation and of the evaporation rate, each as ratio − 1, per size class; dashed lines mark where the rate is raised by 1 % and 10 % and the Kelvin critical diameter 2r*, above which drops grow in these supersaturated surroundings."
	}
	specs := []plotSpec{{"curvature", curvCaption, curvatureChart(res)}}
	for _, o := range []struct {
		id, caption string
		build       func(*calc.Result) (chart, bool)
	}{
		{"history", "Share of the liquid mass evaporated against time; dashed lines mark t50, t90 and t99.", historyChart},
		{"sizes", "Sauter mean and volume median diameter of the drops still present against time.", sizeHistoryChart},
		{"distance", "Share of the liquid mass evaporated against distance at the spray velocity.", distanceChart},
	} {
		if c, ok := o.build(res); ok {
			specs = append(specs, plotSpec{o.id, o.caption, c})
		}
	}
	return s.drawPlots(specs)
}

func flammable(id string) bool {
	l, err := fluid.Lookup(id)
	if err != nil {
		return true // unknown liquids are treated as flammable
	}
	return l.ID != "water"
}

// inputFigures lists a case's inputs for the side panel.
func inputFigures(c calc.Case, d views.Display) []views.Figure {
	name := c.Fluid
	if l, err := fluid.Lookup(c.Fluid); err == nil {
		name = l.Name
	}
	figs := append([]views.Figure{{Label: "Liquid", Value: name}}, dropTemperatureModel(c, d)...)
	figs = append(figs,
		views.Figure{Label: "Gas", Value: c.Gas.ID},
		views.Figure{Label: "Pressure", Value: d.Quantity(units.Pressure, c.Gas.PressurePa, 6)},
		views.Figure{Label: "Gas temperature", Value: d.Quantity(units.Temperature, c.Gas.TemperatureK, 5)})
	switch {
	case c.Gas.RelativeHumidity != nil:
		figs = append(figs, views.Figure{Label: "Relative saturation", Value: views.Num(*c.Gas.RelativeHumidity*100, 4) + " %"})
	case c.Gas.VaporPartialPressurePa != nil:
		figs = append(figs, views.Figure{Label: "Vapor partial pressure", Value: d.Quantity(units.Pressure, *c.Gas.VaporPartialPressurePa, 4)})
	case c.Gas.VaporMoleFraction != nil:
		figs = append(figs, views.Figure{Label: "Vapor mole fraction", Value: views.Num(*c.Gas.VaporMoleFraction, 4)})
	}
	if c.Gas.RelativeVelocityMS > 0 {
		figs = append(figs, views.Figure{Label: "Relative velocity", Value: d.Quantity(units.Velocity, c.Gas.RelativeVelocityMS, 4)})
	}
	dist := c.Distribution
	figs = append(figs, views.Figure{Label: "Drop sizes", Value: dist.Model})
	add := func(label, v string) { figs = append(figs, views.Figure{Label: label, Value: v}) }
	um := func(m float64) string { return views.Micro(m) + " µm" }
	// A given D32 sizes the parametric models instead of their own scale.
	scale := func(label string, m float64) {
		if dist.D32M > 0 {
			add("D32", um(dist.D32M))
		} else {
			add(label, um(m))
		}
	}
	switch dist.Model {
	case "rosin-rammler":
		scale("X", dist.XM)
		add("q", views.Num(dist.Q, 4))
	case "log-normal":
		scale("Median ("+dist.Basis+")", dist.MedianM)
		add("σg", views.Num(dist.GSD, 4))
	case "upper-limit":
		add("Largest drop", um(dist.DUpperM))
		scale("Dv50", dist.Dv50M)
		add("δ", views.Num(dist.Delta, 4))
	case "nukiyama-tanasawa":
		scale("Scale b^(−1/q)", dist.ScaleM)
		add("p", views.Num(dist.P, 4))
		add("q", views.Num(dist.QNT, 4))
	case "bins":
		add("Classes", fmt.Sprintf("%d (%s basis)", len(dist.Fraction), dist.Basis))
	case "atomizer":
		add("Family", dist.Family)
		add("Correlation", orText(dist.Correlation, "the family's default"))
		if dist.Q > 0 {
			add("q", views.Num(dist.Q, 4))
		} else {
			add("q", "the family's typical value")
		}
	}
	if dist.Model != "bins" {
		n := dist.Bins
		if n == 0 {
			n = calc.DefaultBins
		}
		rng := "0.1–99.9 % of the volume"
		if dist.DMinM > 0 && dist.DMaxM > 0 {
			rng = views.Micro(dist.DMinM) + "–" + views.Micro(dist.DMaxM) + " µm"
		}
		add("Classes", fmt.Sprintf("%d, %s", n, rng))
	}
	return append(figs, evaporationModel(c, d)...)
}

// dropTemperatureModel states how the drop temperature was computed: fixed,
// steady per class, or transient from the injection temperature (then also
// the temperature of the size-class table, which is fixed or steady).
func dropTemperatureModel(c calc.Case, d views.Display) []views.Figure {
	fixed := "steady (solved per class)"
	if c.LiquidTemperatureK != nil {
		fixed = "fixed at " + d.Quantity(units.Temperature, *c.LiquidTemperatureK, 5)
	}
	if c.Heating != "transient" {
		return []views.Figure{{Label: "Drop temperature", Value: fixed}}
	}
	inj := "the injection temperature"
	if c.InjectionTemperatureK != nil {
		inj = d.Quantity(units.Temperature, *c.InjectionTemperatureK, 5)
	}
	return []views.Figure{
		{Label: "Drop temperature", Value: "transient from " + inj + " at injection"},
		{Label: "Size-class table at", Value: fixed},
	}
}

// convectionNames are the case file's convection models as the form and
// the reports name them.
var convectionNames = map[string]string{
	"":                   "Ranz–Marshall (1952)",
	"ranz-marshall":      "Ranz–Marshall (1952)",
	"frossling":          "Frössling (1938)",
	"abramzon-sirignano": "Abramzon–Sirignano film theory (1989)",
	"none":               "none (stagnant)",
}

// evaporationModel lists the evaporation options the results were computed
// with, defaults included, so a page or report never leaves them implicit.
func evaporationModel(c calc.Case, d views.Display) []views.Figure {
	e := c.Evaporation
	conv, ok := convectionNames[e.Convection]
	if !ok {
		conv = e.Convection
	}
	alpha := "1 (default)"
	if e.AccommodationCoef > 0 {
		alpha = views.Num(e.AccommodationCoef, 4)
	}
	transition := "Fuchs–Sutugin, on"
	if e.NoTransition {
		transition = "off (continuum for every size)"
		alpha += ", not used"
	}
	figs := []views.Figure{
		{Label: "Convection", Value: conv},
		{Label: "Transition correction", Value: transition},
		{Label: "Accommodation coefficient α", Value: alpha},
	}
	if e.MassFlowKgS > 0 {
		figs = append(figs, views.Figure{Label: "Liquid flow", Value: d.Quantity(units.MassFlow, e.MassFlowKgS, 4)})
	}
	if e.SprayVelocityMS > 0 {
		figs = append(figs, views.Figure{Label: "Spray velocity", Value: d.Quantity(units.Velocity, e.SprayVelocityMS, 4)})
	}
	end := "when 99 % has evaporated"
	if e.MaxTimeS > 0 {
		end = "at " + d.Quantity(units.Time, e.MaxTimeS, 4)
	}
	return append(figs, views.Figure{Label: "History ends", Value: end})
}

// formView builds the form page from values.
func (s *Server) formView(r *http.Request, title, action string, id int64, rev int, vals, us valuesMap, errs valid.Errors, model string) views.FormView {
	f := views.FormView{
		Chrome: views.Chrome{Title: title, Nav: "new", Display: display(r)},
		Action: action, ID: id, Revision: rev, Values: vals, Units: us,
		Errors: map[string]string{}, Fluids: fluidOptions(), Gases: gasOptions(),
	}
	if id > 0 {
		f.Nav = "library"
	}
	f.Fluids = append(f.Fluids, s.caseFluidOptions(r, vals)...)
	for _, e := range errs {
		name := formFor(e.Field, model)
		if name == "" {
			name = e.Field // already a form name (parse errors)
		}
		if _, known := f.Errors[name]; known {
			continue
		}
		if isFormInput(name) {
			f.Errors[name] = e.Message
		} else {
			f.General += e.Error() + " "
		}
	}
	return f
}

func isFormInput(name string) bool {
	if isAtomizerFormInput(name) {
		return true
	}
	switch name {
	case "name", "notes", "fluid", "gas", "vapor", "model", "bins", "spacing", "edges", "fractions",
		"ln_basis", "bins_basis", "convection", "mass_flow", "heating", "transition":
		return true
	}
	for _, f := range numberFields {
		if f.name == name {
			return true
		}
	}
	return false
}

// handleCaseNew serves GET /cases/new.
func (s *Server) handleCaseNew(w http.ResponseWriter, r *http.Request) {
	vals, us := fillForm(newCaseDefaults(), display(r))
	f := s.formView(r, "New case", "/cases", 0, 0, vals, us, nil, "")
	s.render(w, r, http.StatusOK, f.Chrome, views.CaseFormPage(f))
}

// readCaseForm parses and validates a submitted case form. It returns the
// case, the raw form and the errors to show (nil when the case is good).
func (s *Server) readCaseForm(r *http.Request) (calc.Case, caseForm, valid.Errors, error) {
	if err := r.ParseForm(); err != nil {
		return calc.Case{}, caseForm{}, nil, err
	}
	c, cf := parseCaseForm(r.PostForm)
	if len(cf.Errors) == 0 {
		if base, ok := s.formBase(r); ok {
			merged, err := keepUnchanged(base, c, display(r))
			if err != nil {
				return c, cf, nil, err
			}
			c = merged
		}
	}
	s.embedCustomFluid(r.Context(), &c)
	errs := cf.Errors
	if len(errs) == 0 {
		// Validate only when every field could be read, so a message about
		// a missing value is not shown beside a field the user did fill.
		if err := calc.Validate(c); err != nil {
			fes := calc.FieldErrors(err)
			if fes == nil {
				return c, cf, nil, err
			}
			errs = fes
		}
	}
	return c, cf, errs, nil
}

// formBase is the stored revision a submitted case form was opened from
// (the case of the route, else the form's case_id, and its revision field),
// so that keepUnchanged can carry what the user did not change. A new case,
// or a revision the library does not hold, has none.
func (s *Server) formBase(r *http.Request) (calc.Case, bool) {
	raw := chi.URLParam(r, "id")
	if raw == "" {
		raw = r.PostForm.Get("case_id")
	}
	id, _ := strconv.ParseInt(raw, 10, 64)
	rev, _ := strconv.Atoi(r.PostForm.Get("revision"))
	if id <= 0 || rev <= 0 {
		return calc.Case{}, false
	}
	old, err := s.Store.GetRevision(r.Context(), id, rev)
	if err != nil {
		return calc.Case{}, false
	}
	return old.Case, true
}

// handleCaseCreate serves POST /cases.
func (s *Server) handleCaseCreate(w http.ResponseWriter, r *http.Request) {
	c, cf, errs, err := s.readCaseForm(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	if len(errs) > 0 {
		f := s.formView(r, "New case", "/cases", 0, 0, cf.Values, cf.Units, errs, c.Distribution.Model)
		s.render(w, r, http.StatusUnprocessableEntity, f.Chrome, views.CaseFormPage(f))
		return
	}
	rec, err := s.Store.CreateCase(r.Context(), c, s.author(r))
	if err != nil {
		s.caseSaveFailed(w, r, err, s.formView(r, "New case", "/cases", 0, 0, cf.Values, cf.Units, nil, c.Distribution.Model))
		return
	}
	s.redirectWithFlash(w, r, fmt.Sprintf("/cases/%d", rec.ID), "Saved")
}

// handleCaseEdit serves GET /cases/{id}/edit.
func (s *Server) handleCaseEdit(w http.ResponseWriter, r *http.Request) {
	rec, err := s.storedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	id := rec.ID
	vals, us := fillForm(rec.Case, display(r))
	f := s.formView(r, "Edit "+rec.Case.Name, fmt.Sprintf("/cases/%d", id), id, rec.Revision, vals, us, nil, "")
	s.render(w, r, http.StatusOK, f.Chrome, views.CaseFormPage(f))
}

// handleCaseUpdate serves POST /cases/{id}: a new revision, or a conflict
// when someone saved since the form was opened.
func (s *Server) handleCaseUpdate(w http.ResponseWriter, r *http.Request) {
	id, err := caseID(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	c, cf, errs, err := s.readCaseForm(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	base, _ := strconv.Atoi(r.PostForm.Get("revision"))
	action := fmt.Sprintf("/cases/%d", id)
	if len(errs) > 0 {
		f := s.formView(r, "Edit "+c.Name, action, id, base, cf.Values, cf.Units, errs, c.Distribution.Model)
		s.render(w, r, http.StatusUnprocessableEntity, f.Chrome, views.CaseFormPage(f))
		return
	}
	if r.PostForm.Get("as_copy") == "1" {
		rec, err := s.Store.CreateCase(r.Context(), c, s.author(r))
		if err != nil {
			s.caseSaveFailed(w, r, err, s.formView(r, "Edit "+c.Name, action, id, base, cf.Values, cf.Units, nil, c.Distribution.Model))
			return
		}
		s.redirectWithFlash(w, r, fmt.Sprintf("/cases/%d", rec.ID), "Saved as a new case")
		return
	}
	rec, err := s.Store.UpdateCase(r.Context(), id, base, c, s.author(r))
	var ce *store.ConflictError
	if errors.As(err, &ce) {
		s.renderConflict(w, r, id, base, c, ce, "") // revision.go: both versions, merge or copy
		return
	}
	if err != nil {
		s.caseSaveFailed(w, r, err, s.formView(r, "Edit "+c.Name, action, id, base, cf.Values, cf.Units, nil, c.Distribution.Model))
		return
	}
	s.redirectWithFlash(w, r, fmt.Sprintf("/cases/%d", rec.ID), fmt.Sprintf("Saved revision %d", rec.Revision))
}

// handleCaseDuplicate serves POST /cases/{id}/duplicate.
func (s *Server) handleCaseDuplicate(w http.ResponseWriter, r *http.Request) {
	src, err := s.storedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	id := src.ID
	rec, err := s.Store.DuplicateCase(r.Context(), id, "Copy of "+src.Case.Name, s.author(r))
	if err != nil {
		s.error(w, r, err)
		return
	}
	http.Redirect(w, r, fmt.Sprintf("/cases/%d/edit", rec.ID), http.StatusSeeOther)
}

// handleCasePreview serves POST /cases/preview: the results panel for the
// form as it stands, swapped in by htmx while the user types.
func (s *Server) handleCasePreview(w http.ResponseWriter, r *http.Request) {
	c, _, errs, err := s.readCaseForm(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	v := views.CaseView{Chrome: views.Chrome{Display: display(r)}, Case: c, Flammable: flammable(c.Fluid)}
	// A case without a name yet can still be computed; the name matters
	// only when it is saved.
	errs = slices.DeleteFunc(errs, func(e *valid.FieldError) bool { return e.Field == "name" })
	if len(errs) == 0 && c.Name == "" {
		c.Name = "(unsaved)"
		if err := calc.Validate(c); err != nil {
			errs = calc.FieldErrors(err)
		}
		v.Case = c
	}
	if len(errs) > 0 {
		v.Error = "Not computed yet: " + errs.Error()
	} else {
		s.fillResults(r, &v)
	}
	s.renderFragment(w, r, http.StatusOK, views.ResultsPanel(v))
}

// author names who saved a revision: the name the user set (cookie), else
// the server's default.
func (s *Server) author(r *http.Request) string {
	if name := authorFromCookie(r); name != "" { // auth.go sets it
		return name
	}
	if s.Author != "" {
		return s.Author
	}
	return "local user"
}

func orText(s, alt string) string {
	if s == "" {
		return alt
	}
	return s
}
