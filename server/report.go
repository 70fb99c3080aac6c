package server

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"net/http"
	"regexp"
	"strconv"
	"strings"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/store"
	"fogbench/views"
)

// paperOf reads ?paper=a4|letter; anything else leaves the choice to the
// print dialog (HTML) or A4 (PDF).
func paperOf(r *http.Request) string {
	switch p := strings.ToLower(r.URL.Query().Get("paper")); p {
	case views.PaperA4, views.PaperLetter:
		return p
	}
	return ""
}

// reportView evaluates a stored case and lays it out for a report.
func (s *Server) reportView(r *http.Request, rec store.CaseRecord, d views.Display, paper string) views.ReportView {
	cv := views.CaseView{
		Chrome: views.Chrome{Title: rec.Case.Name, Display: d},
		ID:     rec.ID, Revision: rec.Revision, Case: rec.Case, Author: rec.Author,
		Updated: rec.UpdatedAt, Tags: rec.Tags, ParentID: rec.ParentID,
		Inputs: inputFigures(rec.Case, d), Flammable: flammable(rec.Case.Fluid),
	}
	s.fillResults(r, &cv)
	v := views.ReportView{CaseView: cv, Generated: s.Store.Now(), Paper: paper, LiquidName: rec.Case.Fluid, GasName: rec.Case.Gas.ID}
	if l, err := calc.LookupLiquid(rec.Case); err == nil {
		v.LiquidName = l.Name
	}
	if g, err := fluid.LookupGas(rec.Case.Gas.ID); err == nil {
		v.GasName = g.Name
	}
	return v
}

// handleCaseReport serves GET /cases/{id}/report.
func (s *Server) handleCaseReport(w http.ResponseWriter, r *http.Request) {
	rec, err := s.storedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	v := s.reportView(r, rec, display(r), paperOf(r))
	var buf bytes.Buffer
	if err := views.ReportPage(v).Render(r.Context(), &buf); err != nil {
		s.error(w, r, &calc.Error{Code: calc.Internal, Message: "could not draw the report", Err: err})
		return
	}
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	w.Write(buf.Bytes())
}

// handleCaseReportPDF serves GET /cases/{id}/report.pdf.
func (s *Server) handleCaseReportPDF(w http.ResponseWriter, r *http.Request) {
	rec, err := s.storedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	var buf bytes.Buffer
	if err := s.writeReportPDF(&buf, s.reportView(r, rec, display(r), paperOf(r))); err != nil {
		s.error(w, r, err)
		return
	}
	w.Header().Set("Content-Type", "application/pdf")
	w.Header().Set("Content-Disposition", attachment(rec, "report", "pdf"))
	w.Write(buf.Bytes())
}

// WriteCaseReportPDF writes the PDF report of a stored case in SI display
// units: the `fogbench report` command.
func (s *Server) WriteCaseReportPDF(ctx context.Context, w io.Writer, id int64, paper string) error {
	rec, err := s.Store.GetCase(ctx, id)
	if err != nil {
		return err
	}
	r, _ := http.NewRequestWithContext(ctx, http.MethodGet, fmt.Sprintf("/cases/%d/report.pdf", id), nil)
	v := s.reportView(r, rec, views.Display{}, paper)
	if v.Error != "" {
		s.Logger.Warn("case cannot be computed; the report says why", "case", id, "reason", v.Error)
	}
	return s.writeReportPDF(w, v)
}

var unsafeFileRunes = regexp.MustCompile(`[^A-Za-z0-9._-]+`)

// attachment names a download after the case: case-3-r2-nozzle-a-report.pdf.
func attachment(rec store.CaseRecord, what, ext string) string {
	slug := strings.Trim(unsafeFileRunes.ReplaceAllString(strings.ToLower(rec.Case.Name), "-"), "-")
	if len(slug) > 40 {
		slug = strings.TrimRight(slug[:40], "-")
	}
	name := fmt.Sprintf("case-%d-r%d", rec.ID, rec.Revision)
	if slug != "" {
		name += "-" + slug
	}
	return fmt.Sprintf(`attachment; filename="%s-%s.%s"`, name, what, ext)
}

// binsCSVHeader names each per-class column with its unit in parentheses.
var binsCSVHeader = []string{
	"d_lo (um)", "d_hi (um)", "d (um)", "number_fraction (-)", "volume_fraction (-)",
	"laplace_pressure (Pa)", "vapor_pressure (Pa)", "kelvin_ratio (-)", "evaporation_enhancement (-)",
	"lifetime (s)", "surface_temperature (K)", "knudsen (-)", "regime", "evaporation_rate (kg/s)", "transcritical",
}

// writeBinsCSV writes one row per size class at full precision.
func writeBinsCSV(w io.Writer, res *calc.Result) error {
	rows := [][]csvCell{textCells(binsCSVHeader)}
	for _, b := range res.Bins {
		rows = append(rows, []csvCell{
			csvNum(b.DLoM * 1e6), csvNum(b.DHiM * 1e6), csvNum(b.DM * 1e6), csvNum(b.NumberFraction), csvNum(b.VolumeFraction),
			csvNum(b.LaplacePa), csvNum(b.VaporPressurePa), csvNum(b.KelvinRatio), csvNum(b.EvaporationEnhancement),
			csvOpt(b.LifetimeS, 1), csvNum(b.SurfaceTemperatureK), csvNum(b.Knudsen), textCell(b.Regime), csvNum(b.EvaporationRateKgS),
			textCell(strconv.FormatBool(b.Transcritical)),
		})
	}
	return writeCSVRows(w, rows...)
}

// summaryCSVHeader: one row per case, so that several cases stack.
var summaryCSVHeader = []string{
	"case_id", "revision", "name",
	"D10 (um)", "D20 (um)", "D30 (um)", "D32 (um)", "D43 (um)", "Dv10 (um)", "Dv50 (um)", "Dv90 (um)", "relative_span (-)",
	"t50 (s)", "t90 (s)", "t99 (s)", "drops_per_second (1/s)",
	"kelvin_length (nm)", "d_laplace_1atm (um)", "d_enhancement_1pct (um)", "d_enhancement_10pct (um)", "kelvin_critical_diameter (um)",
	"reference_temperature (K)", "warnings",
	"drop_temperature_model", "liquid_temperature (K)", "injection_temperature (K)",
	"convection", "transition_correction", "accommodation_coefficient (-)",
	"atomizer_correlation", "atomizer_source", "atomizer_status",
	"equilibrium_surface_temperature (K)", "flat_vapor_pressure (Pa)", "poynting_factor (-)", "fugacity_factor (-)",
	"enhancement_factor (-)", "dissolved_gas_mole_fraction (-)", "latent_heat_at_surface (J/kg)",
	"mixture_critical_temperature (K)", "equilibrium_method",
}

// modelCSVCells are the model columns of a summary row: how the drop
// temperature was computed and the evaporation options, defaults spelt out.
func modelCSVCells(c calc.Case) []csvCell {
	tmodel := "steady"
	if c.LiquidTemperatureK != nil {
		tmodel = "fixed"
	}
	inj := csvCell{}
	if c.Heating == "transient" {
		tmodel = "transient"
		inj = csvOpt(c.InjectionTemperatureK, 1)
	}
	e := c.Evaporation
	conv := e.Convection
	if conv == "" {
		conv = "ranz-marshall"
	}
	transition := "fuchs-sutugin"
	if e.NoTransition {
		transition = "off"
	}
	alpha := e.AccommodationCoef
	if alpha == 0 {
		alpha = 1
	}
	return []csvCell{textCell(tmodel), csvOpt(c.LiquidTemperatureK, 1), inj, textCell(conv), textCell(transition), csvNum(alpha)}
}

func summaryCSVRow(rec store.CaseRecord, res *calc.Result) []csvCell {
	s, c := res.Summary, res.Curvature
	crit := csvCell{}
	if c.KelvinCriticalRadiusM != nil {
		crit = csvNum(2 * *c.KelvinCriticalRadiusM * 1e6)
	}
	row := []csvCell{
		csvInt(rec.ID), csvInt(int64(rec.Revision)), textCell(rec.Case.Name),
		csvOpt(s.D10M, 1e6), csvOpt(s.D20M, 1e6), csvOpt(s.D30M, 1e6), csvNum(s.D32M * 1e6), csvNum(s.D43M * 1e6),
		csvNum(s.Dv10M * 1e6), csvNum(s.Dv50M * 1e6), csvNum(s.Dv90M * 1e6), csvNum(s.RelativeSpan),
		csvOpt(s.T50S, 1), csvOpt(s.T90S, 1), csvOpt(s.T99S, 1), csvOpt(s.DropsPerSecond, 1),
		csvNum(c.KelvinLengthM * 1e9), csvNum(c.LaplaceOneAtmDM * 1e6), csvOpt(c.Enhancement1PctDM, 1e6), csvOpt(c.Enhancement10PctDM, 1e6), crit,
		csvNum(c.ReferenceTemperatureK), csvInt(int64(len(res.Warnings))),
	}
	row = append(row, modelCSVCells(rec.Case)...)
	row = append(row, atomizerCSVCells(res)...)
	return append(row, equilibriumCSVCells(res)...)
}

// equilibriumCSVCells are the flat-surface equilibrium at the gas pressure
// at the reference surface temperature, full precision in SI; empty when
// the result has no equilibrium block. The method is text and goes through
// the formula guard.
func equilibriumCSVCells(res *calc.Result) []csvCell {
	e := res.Equilibrium
	if e == nil {
		return textCells(make([]string, 9))
	}
	return []csvCell{csvNum(e.TemperatureK), csvNum(e.FlatVaporPressurePa), csvNum(e.PoyntingFactor), csvNum(e.FugacityFactor),
		csvNum(e.EnhancementFactor), csvNum(e.DissolvedGasMoleFraction), csvNum(e.LatentHeatJKg),
		csvOpt(e.MixtureCriticalTemperatureK, 1), textCell(e.Method)}
}

// atomizerCSVCells are the correlation that sized the drops, its published
// citation and its status from the correlation's provenance record; empty
// when the drop sizes do not come from a nozzle.
func atomizerCSVCells(res *calc.Result) []csvCell {
	a := res.Atomizer
	if a == nil || len(a.SMD) == 0 {
		return textCells([]string{"", "", ""})
	}
	e := a.SMD[0] // the chosen correlation comes first
	return textCells([]string{e.Correlation, e.Provenance.Citation.String(), e.Provenance.Status})
}

// evaluatedCase loads and computes the case of the route; a case that
// cannot be computed is a 400 with the reason.
func (s *Server) evaluatedCase(r *http.Request) (store.CaseRecord, *calc.Result, error) {
	rec, err := s.storedCase(r)
	if err != nil {
		return rec, nil, err
	}
	res, err := calc.EvaluateContext(r.Context(), rec.Case)
	return rec, res, err
}

// handleCompareSummaryCSV serves GET /compare/summary.csv?ids=…: the
// summary CSV of every compared case, one row each under one header, in
// the comparison's order, as a spreadsheet wants them side by side.
func (s *Server) handleCompareSummaryCSV(w http.ResponseWriter, r *http.Request) {
	ids, _, err := parseCompareIDs(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	rows := make([][]csvCell, len(ids))
	for i, id := range ids {
		rec, err := s.Store.GetCase(r.Context(), id)
		if err != nil {
			s.error(w, r, err)
			return
		}
		res, err := calc.EvaluateContext(r.Context(), rec.Case)
		if err != nil {
			s.error(w, r, fmt.Errorf("case %d: %w", id, err))
			return
		}
		rows[i] = summaryCSVRow(rec, res)
	}
	body, err := summaryCSV(rows...)
	if err != nil {
		s.error(w, r, err)
		return
	}
	writeCSV(w, fmt.Sprintf(`attachment; filename="compare-%s-summary.csv"`, joinIDs(ids, "-")), body)
}

// summaryCSV is the summary header and the given rows.
func summaryCSV(rows ...[]csvCell) ([]byte, error) {
	var buf bytes.Buffer
	err := writeCSVRows(&buf, append([][]csvCell{textCells(summaryCSVHeader)}, rows...)...)
	return buf.Bytes(), err
}

// joinIDs writes case numbers joined by sep.
func joinIDs(ids []int64, sep string) string {
	parts := make([]string, len(ids))
	for i, id := range ids {
		parts[i] = strconv.FormatInt(id, 10)
	}
	return strings.Join(parts, sep)
}

func writeCSV(w http.ResponseWriter, disposition string, body []byte) {
	w.Header().Set("Content-Type", "text/csv; charset=utf-8")
	w.Header().Set("Content-Disposition", disposition)
	w.Write(body)
}

// handleCaseBinsCSV serves GET /cases/{id}/bins.csv.
func (s *Server) handleCaseBinsCSV(w http.ResponseWriter, r *http.Request) {
	rec, res, err := s.evaluatedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	var buf bytes.Buffer
	if err := writeBinsCSV(&buf, res); err != nil {
		s.error(w, r, err)
		return
	}
	writeCSV(w, attachment(rec, "bins", "csv"), buf.Bytes())
}

// handleCaseSummaryCSV serves GET /cases/{id}/summary.csv.
func (s *Server) handleCaseSummaryCSV(w http.ResponseWriter, r *http.Request) {
	rec, res, err := s.evaluatedCase(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	body, err := summaryCSV(summaryCSVRow(rec, res))
	if err != nil {
		s.error(w, r, err)
		return
	}
	writeCSV(w, attachment(rec, "summary", "csv"), body)
}
