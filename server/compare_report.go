package server

import (
	"bytes"
	"fmt"
	"net/http"
	"strconv"

	"fogbench/calc"
	"fogbench/store"
	"fogbench/views"
)

// compareReportView reads ?ids=&base= like the comparison page, builds the
// comparison and the report of each case.
func (s *Server) compareReportView(r *http.Request) (views.CompareReportView, error) {
	ids, _, err := parseCompareIDs(r)
	if err != nil {
		return views.CompareReportView{}, err
	}
	base := ids[0]
	if b, err := strconv.ParseInt(r.URL.Query().Get("base"), 10, 64); err == nil {
		for _, id := range ids {
			if id == b {
				base = b
			}
		}
	}
	recs := make([]store.CaseRecord, len(ids))
	for i, id := range ids {
		if recs[i], err = s.Store.GetCase(r.Context(), id); err != nil {
			return views.CompareReportView{}, err
		}
	}
	cv, err := s.CompareView(r, recs, base)
	if err != nil {
		return views.CompareReportView{}, err
	}
	v := views.CompareReportView{CompareView: cv, Generated: s.Store.Now(), Paper: paperOf(r)}
	for _, rec := range recs {
		v.Reports = append(v.Reports, s.reportView(r, rec, cv.Display, v.Paper))
	}
	return v, nil
}

// handleCompareReport serves GET /compare/report?ids=1,2&base=1.
func (s *Server) handleCompareReport(w http.ResponseWriter, r *http.Request) {
	v, err := s.compareReportView(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	var buf bytes.Buffer
	if err := views.CompareReportPage(v).Render(r.Context(), &buf); err != nil {
		s.error(w, r, &calc.Error{Code: calc.Internal, Message: "could not draw the report", Err: err})
		return
	}
	w.Header().Set("Content-Type", "text/html; charset=utf-8")
	w.Write(buf.Bytes())
}

// handleCompareReportPDF serves GET /compare/report.pdf?ids=1,2&base=1.
func (s *Server) handleCompareReportPDF(w http.ResponseWriter, r *http.Request) {
	v, err := s.compareReportView(r)
	if err != nil {
		s.error(w, r, err)
		return
	}
	data, err := buildCompareReportPDF(v, nil)
	if err != nil {
		s.error(w, r, &calc.Error{Code: calc.Internal, Message: "could not draw the PDF report", Err: err})
		return
	}
	name := "comparison"
	for _, c := range v.Cases {
		name += fmt.Sprintf("-%d", c.ID)
	}
	w.Header().Set("Content-Type", "application/pdf")
	w.Header().Set("Content-Disposition", fmt.Sprintf(`attachment; filename="%s-report.pdf"`, name))
	w.Write(data)
}

// buildCompareReportPDF draws the comparison, then each case's report from
// a new page.
func buildCompareReportPDF(v views.CompareReportView, record func(string)) ([]byte, error) {
	first := views.ReportView{Generated: v.Generated, Paper: v.Paper}
	p := newPDFReport(v.Paper, v.Title()+" · fogbench", "", first, record)
	p.headLeft, p.headRight = v.Title(), v.HeaderLine()
	p.f.AddPage()
	p.compareBody(v)
	for _, rv := range v.Reports {
		p.v = rv
		p.headLeft = fmt.Sprintf("%s · case %d: %s", v.Title(), rv.ID, rv.Case.Name)
		p.headRight = rv.HeaderLine()
		p.f.AddPage()
		p.body()
	}
	return p.output()
}

func (p *pdfReport) compareBody(v views.CompareReportView) {
	f := p.f
	p.font("", 7.5)
	p.color(colMuted)
	p.drawText(pdfMarginX, f.GetY()+3, "FOGBENCH COMPARISON REPORT")
	f.SetY(f.GetY() + 4)
	p.paragraph(v.Title(), "B", 16, colInk)
	f.Ln(1)
	p.paragraph("report drawn "+v.GeneratedText(), "", 8.5, colMuted)
	f.Ln(1)
	p.paragraph("Purpose. Compare the drop sizes, curvature effects and evaporation of these cases against the baseline.", "", 9.5, colInk)
	p.paragraph(v.BaseNote(), "", 9, colMuted)
	f.Ln(1.5)
	p.draw(colInk)
	f.SetLineWidth(0.3)
	f.Line(pdfMarginX, f.GetY(), pdfMarginX+p.width, f.GetY())

	p.heading("Cases", "")
	var figs []views.Figure
	for i, c := range v.Cases {
		name := c.Name
		if i == v.Base {
			name += " (baseline)"
		}
		figs = append(figs, views.Figure{Label: fmt.Sprintf("Case %d, revision %d", c.ID, c.Revision), Value: name})
	}
	p.figureTable(figs, false)
	var errs []string
	for _, c := range v.Cases {
		if c.Error != "" {
			errs = append(errs, fmt.Sprintf("Case %d (%s) cannot be computed: %s", c.ID, c.Name, c.Error))
		}
	}
	if len(errs) > 0 {
		p.noteBox("Not computed", errs, colBadBg, colBad)
	}
	p.heading("Key results", "")
	p.compareTable(v, v.Results)
	p.heading(fmt.Sprintf("Inputs that differ (%d of %d)", v.ChangedInputs(), len(v.Inputs)), "")
	if rows := v.ChangedRows(); len(rows) > 0 {
		p.compareTable(v, rows)
	} else {
		p.paragraph("None: the cases have the same inputs.", "", 9, colInk)
	}
	p.noteBox("Safety", v.Cautions(), [3]int{0xff, 0xfd, 0xf5}, colWarn)

	charts := map[string]chart{}
	for _, c := range compareCharts(v.Cases) {
		charts[c.id] = c.chart
	}
	first := true
	for _, pl := range v.Plots {
		c, ok := charts[pl.ID]
		if !ok {
			continue
		}
		p.plot(pl, c, &first)
	}
	f.Ln(2)
	p.paragraph("Each case's full report follows: inputs, results, warnings, plots, every size class, properties with sources and methods.", "", 8.5, colMuted)
}

// compareTable is quantity | one column per case, the difference from the
// baseline under each value.
func (p *pdfReport) compareTable(v views.CompareReportView, rows []views.CompareRow) {
	n := len(v.Cases)
	label := p.width * 0.28
	widths := []float64{label}
	for range n {
		widths = append(widths, (p.width-label)/float64(n))
	}
	heads := []string{"Quantity"}
	for i, c := range v.Cases {
		h := fmt.Sprintf("Case %d", c.ID)
		if i == v.Base {
			h += " (baseline)"
		}
		heads = append(heads, h)
	}
	headStyle := []cellStyle{{"B", 7.5, colInk, false}}
	head := func() {
		hd := colHead
		p.tableRow(widths, heads, headStyle, &hd, true, nil)
	}
	p.need(16)
	head()
	styles := []cellStyle{{"", 7.5, colMuted, false}}
	for range n {
		styles = append(styles, cellStyle{"", 7.5, colInk, false})
	}
	for _, r := range rows {
		cells := []string{r.RowLabel()}
		for i := range v.Cases {
			c := r.Cell(i)
			if d := r.DeltaText(i, v.Base); d != "" {
				c += "\n" + d
			}
			cells = append(cells, c)
		}
		p.tableRow(widths, cells, styles, nil, true, head)
	}
}
