package server

import (
	"fmt"
	"math"
	"net/http"
	"strconv"
	"strings"

	"fogbench/calc"
	"fogbench/calc/units"
	"fogbench/store"
	"fogbench/views"
)

// parseCompareIDs reads ?ids= given as one comma list or as repeated
// parameters (the library's checkboxes), keeping their order and dropping
// repeats. canonical reports whether the URL already had the one-list form.
func parseCompareIDs(r *http.Request) (ids []int64, canonical bool, err error) {
	raw := r.URL.Query()["ids"]
	canonical = len(raw) == 1
	seen := map[int64]bool{}
	for _, v := range raw {
		for _, part := range strings.Split(v, ",") {
			part = strings.TrimSpace(part)
			if part == "" {
				continue
			}
			id, perr := strconv.ParseInt(part, 10, 64)
			if perr != nil || id <= 0 {
				return nil, false, calc.Errorf(calc.Invalid, "%q in ids is not a case number", part)
			}
			if !seen[id] {
				seen[id] = true
				ids = append(ids, id)
			} else {
				canonical = false
			}
		}
	}
	if len(ids) < 2 || len(ids) > views.MaxCompare {
		return nil, false, calc.Errorf(calc.Invalid, "Choose 2 to %d cases to compare (got %d): tick them in the library and press Compare.", views.MaxCompare, len(ids))
	}
	return ids, canonical, nil
}

// handleCompare serves GET /compare?ids=1,2,3&base=1.
func (s *Server) handleCompare(w http.ResponseWriter, r *http.Request) {
	ids, canonical, err := parseCompareIDs(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	base := ids[0]
	if b, err := strconv.ParseInt(r.URL.Query().Get("base"), 10, 64); err == nil {
		for _, id := range ids {
			if id == b {
				base = b
			}
		}
	}
	if want := views.CompareURL(ids, base); !canonical || r.URL.Query().Get("base") != strconv.FormatInt(base, 10) {
		// One address per comparison, so a bookmark or a shared link
		// reopens exactly this view.
		http.Redirect(w, r, want, http.StatusFound)
		return
	}
	recs := make([]store.CaseRecord, len(ids))
	for i, id := range ids {
		if recs[i], err = s.Store.GetCase(r.Context(), id); err != nil {
			s.error(w, r, err)
			return
		}
	}
	v, err := s.CompareView(r, recs, base)
	if err != nil {
		s.error(w, r, err)
		return
	}
	s.render(w, r, http.StatusOK, v.Chrome, views.ComparePage(v))
}

// CompareView evaluates the cases and builds the comparison: tables with
// numbers in display units and the overlay plots.
func (s *Server) CompareView(r *http.Request, recs []store.CaseRecord, baseID int64) (views.CompareView, error) {
	d := display(r)
	v := views.CompareView{Chrome: views.Chrome{Title: "Compare cases", Nav: "compare", Display: d}}
	cases := make([]calc.Case, len(recs))
	for i, rec := range recs {
		cc := views.CompareCase{ID: rec.ID, Revision: rec.Revision, Name: rec.Case.Name, Case: rec.Case}
		res, err := calc.EvaluateContext(r.Context(), rec.Case)
		if err != nil {
			if calc.ErrorCode(err) == calc.Internal {
				s.Logger.Error("evaluate", "case", rec.ID, "err", err)
			}
			cc.Error = calc.ErrorMessage(err)
		} else {
			cc.Result = res
		}
		if rec.ID == baseID {
			v.Base = i
		}
		v.Cases = append(v.Cases, cc)
		cases[i] = rec.Case
	}
	fields, err := store.CompareCases(cases...)
	if err != nil {
		return v, err
	}
	for _, f := range fields {
		v.Inputs = append(v.Inputs, inputRow(f, len(cases)))
	}
	v.Results = resultRows(v.Cases, d)
	for _, c := range compareCharts(v.Cases) {
		svg, err := c.chart.SVG()
		if err != nil {
			s.Logger.Warn("compare plot", "id", c.id, "err", err)
			continue
		}
		v.Plots = append(v.Plots, views.Plot{ID: c.id, Title: c.chart.Title, SVG: svg, Caption: c.caption})
	}
	return v, nil
}

// inputRow turns a case-file field into a table row: numbers in the unit
// its name implies; lists of numbers (class edges) as text in that unit,
// compared exactly; anything else as text, without a unit when the name
// implies one its text is not in.
func inputRow(f store.FieldDiff, n int) views.CompareRow {
	unit, scale := views.FieldUnit(f.Path)
	row := views.CompareRow{Label: f.Path, Unit: unit, Numeric: true, Values: make([]float64, n), Has: make([]bool, n), Sig: 6}
	text := make([]string, n)
	raw := false
	for i := range n {
		if !f.Present[i] {
			continue
		}
		if x, ok := f.Number(i); ok {
			row.Values[i], row.Has[i] = x*scale, true
			text[i] = views.Num(x*scale, row.Sig)
			continue
		}
		row.Numeric = false
		if xs, ok := f.Numbers(i); ok {
			parts := make([]string, len(xs))
			for k, x := range xs {
				parts[k] = views.Num(x*scale, row.Sig)
			}
			text[i] = strings.Join(parts, ", ")
			continue
		}
		text[i], raw = f.Values[i], true
	}
	if !row.Numeric {
		row.Text, row.Key = text, f.Values
		if raw && scale != 1 {
			row.Unit = ""
		}
	}
	return row
}

// resultRows are the key results: representative diameters, times to
// evaporate, and where curvature matters.
func resultRows(cs []views.CompareCase, d views.Display) []views.CompareRow {
	type pick struct {
		label, sym, unit string
		get              func(r *calc.Result) (float64, bool)
	}
	// Rows left out when no case has them, and the figures they show.
	dropEmpty := map[string]bool{"Ṅ": true}
	sig := map[string]int{}
	val := func(f func(r *calc.Result) float64) func(r *calc.Result) (float64, bool) {
		return func(r *calc.Result) (float64, bool) { return f(r), true }
	}
	opt := func(f func(r *calc.Result) *float64, scale float64) func(r *calc.Result) (float64, bool) {
		return func(r *calc.Result) (float64, bool) {
			p := f(r)
			if p == nil {
				return 0, false
			}
			return *p * scale, true
		}
	}
	tu := units.Default(d.System, units.Time)
	picks := []pick{
		{"Sauter mean diameter", "D32", "µm", val(func(r *calc.Result) float64 { return r.Summary.D32M * 1e6 })},
		{"Volume median diameter", "Dv50", "µm", val(func(r *calc.Result) float64 { return r.Summary.Dv50M * 1e6 })},
		{"10 % of volume below", "Dv10", "µm", val(func(r *calc.Result) float64 { return r.Summary.Dv10M * 1e6 })},
		{"90 % of volume below", "Dv90", "µm", val(func(r *calc.Result) float64 { return r.Summary.Dv90M * 1e6 })},
		{"Relative span", "(Dv90−Dv10)/Dv50", "", val(func(r *calc.Result) float64 { return r.Summary.Span })},
		{"De Brouckere mean", "D43", "µm", val(func(r *calc.Result) float64 { return r.Summary.D43M * 1e6 })},
		{"Arithmetic mean", "D10", "µm", opt(func(r *calc.Result) *float64 { return r.Summary.D10M }, 1e6)},
		{"50 % of mass evaporated", "t50", tu.Symbol, opt(func(r *calc.Result) *float64 { return r.Summary.T50S }, tu.FromSI(1))},
		{"90 % evaporated", "t90", tu.Symbol, opt(func(r *calc.Result) *float64 { return r.Summary.T90S }, tu.FromSI(1))},
		{"99 % evaporated", "t99", tu.Symbol, opt(func(r *calc.Result) *float64 { return r.Summary.T99S }, tu.FromSI(1))},
		{"Kelvin length", "ℓ_K", "nm", val(func(r *calc.Result) float64 { return r.Curvature.KelvinLengthM * 1e9 })},
		{"Evaporation raised > 1 % below", "d(E = 1.01)", "µm", opt(func(r *calc.Result) *float64 { return r.Curvature.Enhancement1PctDM }, 1e6)},
		{"Evaporation raised > 10 % below", "d(E = 1.10)", "µm", opt(func(r *calc.Result) *float64 { return r.Curvature.Enhancement10PctDM }, 1e6)},
		{"Laplace pressure 1 atm at", "d", "µm", val(func(r *calc.Result) float64 { return r.Curvature.LaplaceOneAtmDM * 1e6 })},
		{"Drops per second", "Ṅ", "1/s", opt(func(r *calc.Result) *float64 { return r.Summary.DropsPerSecond }, 1)},
	}
	pu, Tu := units.Default(d.System, units.Pressure), units.Default(d.System, units.Temperature)
	eq := func(f func(e *calc.Equilibrium) float64) func(r *calc.Result) (float64, bool) {
		return func(r *calc.Result) (float64, bool) {
			if r.Equilibrium == nil {
				return 0, false
			}
			return f(r.Equilibrium), true
		}
	}
	for sym, n := range map[string]int{"p_flat": 5, "": 6, "φ_sat/φ_v": 6, "p_flat/p_sat": 6, "1 − x_L": 4, "T_c,mix": 5} {
		dropEmpty[sym], sig[sym] = true, n
	}
	picks = append(picks,
		pick{label: "Vapour pressure over a flat surface at the gas pressure", sym: "p_flat", unit: pu.Symbol,
			get: eq(func(e *calc.Equilibrium) float64 { return pu.FromSI(e.FlatVaporPressurePa) })},
		pick{label: "Poynting factor (liquid at the gas pressure)", sym: "",
			get: eq(func(e *calc.Equilibrium) float64 { return e.PoyntingFactor })},
		pick{label: "Vapour fugacity factor", sym: "φ_sat/φ_v",
			get: eq(func(e *calc.Equilibrium) float64 { return e.FugacityFactor })},
		pick{label: "Enhancement over p_sat", sym: "p_flat/p_sat",
			get: eq(func(e *calc.Equilibrium) float64 { return e.EnhancementFactor })},
		pick{label: "Gas dissolved in the liquid", sym: "1 − x_L", unit: "mol %",
			get: eq(func(e *calc.Equilibrium) float64 { return e.DissolvedGasMoleFraction * 100 })},
		pick{label: "Mixture critical temperature", sym: "T_c,mix", unit: Tu.Symbol,
			get: func(r *calc.Result) (float64, bool) {
				if r.Equilibrium == nil || r.Equilibrium.MixtureCriticalTemperatureK == nil {
					return 0, false
				}
				return Tu.FromSI(*r.Equilibrium.MixtureCriticalTemperatureK), true
			}},
	)
	var rows []views.CompareRow
	for _, p := range picks {
		row := views.CompareRow{Label: p.label, Symbol: p.sym, Unit: p.unit, Numeric: true,
			Values: make([]float64, len(cs)), Has: make([]bool, len(cs)), Sig: sig[p.sym]}
		found := false
		for i, c := range cs {
			if c.Result == nil {
				continue
			}
			x, ok := p.get(c.Result)
			if ok && !math.IsNaN(x) && !math.IsInf(x, 0) {
				row.Values[i], row.Has[i] = x, true
				found = true
			}
		}
		if found || !dropEmpty[p.sym] { // drop the flow and equilibrium rows only when no case gives them
			rows = append(rows, row)
		}
	}
	return rows
}

type compareChart struct {
	id, caption string
	chart       chart
}

// seriesName labels a case in a plot legend.
func seriesName(c views.CompareCase) string {
	name := []rune(c.Name)
	if len(name) > 28 {
		name = append(name[:27], '…')
	}
	return fmt.Sprintf("%d: %s", c.ID, string(name))
}

// compareCharts overlays the cases, one series (colour) per case in column
// order: volume distribution, cumulative volume, evaporation history and
// curvature enhancement. Cases that could not be computed are left out.
func compareCharts(cs []views.CompareCase) []compareChart {
	vol := chart{Title: "Volume distribution", XLabel: "Drop diameter d (µm)", YLabel: "dV/d ln d (–)", LogX: true}
	cum := chart{Title: "Cumulative volume", XLabel: "Drop diameter d (µm)", YLabel: "volume fraction below d (–)", LogX: true}
	hist := chart{Title: "Evaporation history", XLabel: "Time t (ms)", YLabel: "mass fraction evaporated (–)", LogX: true}
	curv := chart{Title: "Curvature enhancement of evaporation", XLabel: "Drop diameter d (µm)", YLabel: "rate enhancement − 1 (–)", LogX: true, LogY: true}
	hasHist := false
	for _, c := range cs {
		r := c.Result
		if r == nil {
			vol.Series = append(vol.Series, series{Name: seriesName(c) + " (not computed)"})
			cum.Series = append(cum.Series, series{})
			hist.Series = append(hist.Series, series{})
			curv.Series = append(curv.Series, series{})
			continue
		}
		name := seriesName(c)
		dx, dy, cx, cy := volumeCurves(r)
		vol.Series = append(vol.Series, series{Name: name, X: dx, Y: dy, Step: true})
		cum.Series = append(cum.Series, series{Name: name, X: cx, Y: cy})
		if h := r.History; h != nil && len(h.TS) > 1 {
			t := make([]float64, len(h.TS))
			for i := range h.TS {
				t[i] = h.TS[i] * 1e3
			}
			hist.Series = append(hist.Series, series{Name: name, X: t, Y: h.EvaporatedMassFraction})
			hasHist = true
		} else {
			hist.Series = append(hist.Series, series{})
		}
		var d, en []float64
		for _, b := range r.Bins {
			d = append(d, b.DM*1e6)
			en = append(en, b.EvaporationEnhancement-1)
		}
		curv.Series = append(curv.Series, series{Name: name, X: d, Y: en})
	}
	out := []compareChart{
		{"volume", "Volume per unit ln d of each case (steps; the area under each is 1 on this axis).", vol},
		{"cumulative", "Share of the liquid volume in drops smaller than d.", cum},
	}
	if hasHist {
		out = append(out, compareChart{"history", "Share of the liquid mass evaporated against time, for each case's own surroundings.", hist})
	}
	out = append(out, compareChart{"curvature", "How much the Kelvin effect raises the evaporation rate per size class (ratio − 1).", curv})
	return out
}

// volumeCurves are a result's volume fraction per unit ln d (as steps from
// each class's lower edge, closed at the last upper edge) and its cumulative
// volume fraction at the class edges, diameters in µm.
func volumeCurves(r *calc.Result) (dx, dy, cx, cy []float64) {
	n := len(r.Bins)
	if n == 0 {
		return nil, nil, nil, nil
	}
	cx, cy = []float64{r.Bins[0].DLoM * 1e6}, []float64{0}
	total := 0.0
	for _, b := range r.Bins {
		dx = append(dx, b.DLoM*1e6)
		dy = append(dy, b.VolumeFraction/math.Log(b.DHiM/b.DLoM))
		total += b.VolumeFraction
		cx = append(cx, b.DHiM*1e6)
		cy = append(cy, total)
	}
	dx = append(dx, r.Bins[n-1].DHiM*1e6)
	dy = append(dy, dy[n-1])
	return dx, dy, cx, cy
}
