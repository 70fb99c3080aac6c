package server

import (
	"bytes"
	"fmt"
	"io"
	"regexp"
	"strings"

	"codeberg.org/go-fonts/liberation/liberationsansbold"
	"codeberg.org/go-fonts/liberation/liberationsansitalic"
	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"codeberg.org/go-fonts/liberation/liberationserifregular"
	"codeberg.org/go-pdf/fpdf"

	"fogbench/calc"
	"fogbench/calc/sizedist"
	"fogbench/views"
)

// The PDF report is drawn with fpdf (no browser at run time). Text goes
// through embedded Liberation fonts so µ, σ, ², °C and Δ come out as they
// are; the plots are the page's charts rendered to PNG by vgimg, because
// fpdf cannot take SVG.

const (
	pdfMarginX   = 15.0 // mm, left and right
	pdfMarginTop = 18.0 // mm, below the running header
	pdfMarginBot = 18.0 // mm, above the footer
	pdfPlotDPI   = 200
	pdfLine      = 4.2 // mm, line height of body text
)

var (
	colInk    = [3]int{0x1d, 0x27, 0x33}
	colMuted  = [3]int{0x55, 0x60, 0x6e}
	colLine   = [3]int{0xc9, 0xce, 0xc7}
	colAccent = [3]int{0x1f, 0x5f, 0x7a}
	colWarnBg = [3]int{0xff, 0xf6, 0xdc}
	colWarn   = [3]int{0xb7, 0x86, 0x0b}
	colBadBg  = [3]int{0xfd, 0xec, 0xea}
	colBad    = [3]int{0xa3, 0x26, 0x1b}
	colHead   = [3]int{0xee, 0xf0, 0xec}
	colStripe = [3]int{0xf7, 0xf8, 0xf5}
)

// pdfReport draws one report.
type pdfReport struct {
	f      *fpdf.Fpdf
	v      views.ReportView // the case the body methods draw
	width  float64          // content width, mm
	pageH  float64
	record func(string) // sees every string drawn (tests check the glyphs)
	// The running header of the pages that follow.
	headLeft, headRight string
}

// chartByID finds the chart behind a plot of the case page, so the PDF
// shows the same plots as the page. fit is the model fitted to measured
// classes (nil for model distributions), as the page overlays it.
func chartByID(id string, res *calc.Result, fit *sizedist.FitResult) (chart, bool) {
	switch id {
	case "dist-density":
		return sizeDensityChart(res, fit), true
	case "dist-cumulative":
		return cumulativeChart(res, fit), true
	case "volume":
		return volumeChart(res), true
	case "curvature":
		return curvatureChart(res), true
	case "history":
		return historyChart(res)
	case "sizes":
		return sizeHistoryChart(res)
	case "distance":
		return distanceChart(res)
	}
	return chart{}, false
}

// writeReportPDF draws the report of v as PDF into w.
func (s *Server) writeReportPDF(w io.Writer, v views.ReportView) error {
	data, err := buildReportPDF(v, nil)
	if err != nil {
		return &calc.Error{Code: calc.Internal, Message: "could not draw the PDF report", Err: err}
	}
	_, err = w.Write(data)
	return err
}

// buildReportPDF returns the PDF bytes; record, when not nil, is called with
// every piece of text drawn.
func buildReportPDF(v views.ReportView, record func(string)) ([]byte, error) {
	p := newPDFReport(v.Paper, v.Case.Name+" · fogbench spray report", v.Author, v, record)
	p.headLeft, p.headRight = v.Case.Name, v.HeaderLine()
	p.f.AddPage()
	p.body()
	return p.output()
}

// newPDFReport starts a document on A4 (or Letter) with the fonts, margins,
// metadata, header and footer; v is the case the body methods draw.
func newPDFReport(paper, title, author string, v views.ReportView, record func(string)) *pdfReport {
	size := "A4"
	if paper == views.PaperLetter {
		size = "Letter"
	}
	f := fpdf.New("P", "mm", size, "")
	f.AddUTF8FontFromBytes("sans", "", liberationsansregular.TTF)
	f.AddUTF8FontFromBytes("sans", "B", liberationsansbold.TTF)
	f.AddUTF8FontFromBytes("sans", "I", liberationsansitalic.TTF)
	f.AddUTF8FontFromBytes("serif", "", liberationserifregular.TTF)
	f.SetMargins(pdfMarginX, pdfMarginTop, pdfMarginX)
	f.SetAutoPageBreak(true, pdfMarginBot)
	f.SetCellMargin(0)
	f.AliasNbPages("{nb}")
	f.SetTitle(title, true)
	f.SetAuthor(author, true)
	f.SetCreator("fogbench", true)
	f.SetCreationDate(v.Generated)
	f.SetModificationDate(v.Generated)
	f.SetCatalogSort(true)
	pw, ph := f.GetPageSize()
	p := &pdfReport{f: f, v: v, width: pw - 2*pdfMarginX, pageH: ph, record: record}
	f.SetHeaderFuncMode(p.header, true)
	f.SetFooterFunc(p.footer)
	return p
}

func (p *pdfReport) output() ([]byte, error) {
	if err := p.f.Error(); err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	if err := p.f.Output(&buf); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// superscriptExp finds the powers of ten that views.Num writes
// ("1.2×10⁻⁵"); Liberation Sans lacks ⁰, ⁹ and ⁻, so the PDF draws the
// exponent as raised small digits instead.
var superscriptExp = regexp.MustCompile(`×10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+)`)

var superToASCII = strings.NewReplacer("⁻", "-", "⁰", "0", "¹", "1", "²", "2", "³", "3", "⁴", "4", "⁵", "5", "⁶", "6", "⁷", "7", "⁸", "8", "⁹", "9")

// flowText is text for wrapped paragraphs, where raised digits cannot be
// drawn: powers of ten become "×10^-5".
func flowText(s string) string {
	return superscriptExp.ReplaceAllStringFunc(s, func(m string) string {
		return "×10^" + superToASCII.Replace(strings.TrimPrefix(m, "×10"))
	})
}

func (p *pdfReport) color(c [3]int)                  { p.f.SetTextColor(c[0], c[1], c[2]) }
func (p *pdfReport) fill(c [3]int)                   { p.f.SetFillColor(c[0], c[1], c[2]) }
func (p *pdfReport) draw(c [3]int)                   { p.f.SetDrawColor(c[0], c[1], c[2]) }
func (p *pdfReport) font(style string, size float64) { p.f.SetFont("sans", style, size) }

func (p *pdfReport) seen(s string) {
	if p.record != nil {
		p.record(s)
	}
}

// width of s as drawText draws it.
func (p *pdfReport) textWidth(s string) float64 {
	w := 0.0
	for _, seg := range splitExp(s) {
		if seg.exp {
			size, _ := p.f.GetFontSize()
			p.f.SetFontSize(size * 0.7)
			w += p.f.GetStringWidth(seg.text)
			p.f.SetFontSize(size)
		} else {
			w += p.f.GetStringWidth(seg.text)
		}
	}
	return w
}

type segment struct {
	text string
	exp  bool
}

// splitExp cuts s into plain text and the exponents of powers of ten.
func splitExp(s string) []segment {
	var out []segment
	last := 0
	for _, m := range superscriptExp.FindAllStringSubmatchIndex(s, -1) {
		out = append(out, segment{text: s[last:m[2]]}, segment{text: superToASCII.Replace(s[m[2]:m[3]]), exp: true})
		last = m[1]
	}
	if last < len(s) {
		out = append(out, segment{text: s[last:]})
	}
	return out
}

// drawText writes one line with its baseline at y, raising exponents.
func (p *pdfReport) drawText(x, y float64, s string) {
	for _, seg := range splitExp(s) {
		p.seen(seg.text)
		if seg.exp {
			size, _ := p.f.GetFontSize()
			p.f.SetFontSize(size * 0.7)
			p.f.Text(x, y-size*0.35*25.4/72, seg.text)
			x += p.f.GetStringWidth(seg.text)
			p.f.SetFontSize(size)
			continue
		}
		p.f.Text(x, y, seg.text)
		x += p.f.GetStringWidth(seg.text)
	}
}

// lines wraps s to width w in the current font.
func (p *pdfReport) lines(s string, w float64) []string {
	if s == "" {
		return []string{""}
	}
	var out []string
	for _, para := range strings.Split(s, "\n") {
		out = append(out, p.f.SplitText(flowText(para), w)...)
	}
	if len(out) == 0 {
		return []string{""}
	}
	return out
}

// need starts a new page unless h mm fit below the current position.
func (p *pdfReport) need(h float64) bool {
	if p.f.GetY()+h > p.pageH-pdfMarginBot {
		p.f.AddPage()
		return true
	}
	return false
}

func (p *pdfReport) header() {
	f := p.f
	top := 9.0
	p.font("", 7.5)
	right := p.headRight
	rw := p.textWidth(right)
	name := p.headLeft
	p.font("B", 7.5)
	for p.textWidth(name) > p.width-rw-6 && len([]rune(name)) > 4 {
		r := []rune(name)
		name = string(r[:len(r)-4]) + "…"
	}
	p.color(colInk)
	p.drawText(pdfMarginX, top+3, name)
	p.font("", 7.5)
	p.color(colMuted)
	p.drawText(pdfMarginX+p.width-rw, top+3, right)
	p.draw(colMuted)
	f.SetLineWidth(0.15)
	f.Line(pdfMarginX, top+4.5, pdfMarginX+p.width, top+4.5)
	f.SetY(pdfMarginTop)
}

func (p *pdfReport) footer() {
	y := p.pageH - 10
	p.font("", 7.5)
	p.color(colMuted)
	p.drawText(pdfMarginX, y, "fogbench spray report · estimates, not certification")
	right := fmt.Sprintf("Page %d of {nb}", p.f.PageNo())
	p.drawText(pdfMarginX+p.width-p.textWidth(fmt.Sprintf("Page %d of %d", p.f.PageNo(), 99)), y, right)
}

// heading starts a section; subheading a part of one. Each stays with the
// start of what follows and may carry method references.
func (p *pdfReport) heading(text string, refs string) { p.title(text, refs, 22, 3, 12, 5, 2.5) }

func (p *pdfReport) subheading(text, refs string) { p.title(text, refs, 17, 1.5, 10, 4, 2) }

// title draws a bold line of the given size after a gap, keeping room (mm)
// for it and what follows on the page, with "methods …" in small type.
func (p *pdfReport) title(text, refs string, room, gap, size, drop, after float64) {
	p.need(room)
	p.f.Ln(gap)
	p.font("B", size)
	p.color(colInk)
	y := p.f.GetY() + drop
	p.drawText(pdfMarginX, y, text)
	if refs != "" {
		w := p.textWidth(text)
		p.font("", 7.5)
		p.color(colMuted)
		p.drawText(pdfMarginX+w+3, y, "methods "+refs)
	}
	p.f.SetY(y + after)
}

// paragraph writes wrapped text, keeping it on one page when it fits one.
func (p *pdfReport) paragraph(s string, style string, size float64, c [3]int) {
	p.font(style, size)
	lh := size * 0.45
	ls := p.lines(s, p.width)
	p.need(float64(len(ls)) * lh)
	p.color(c)
	for _, l := range ls {
		p.need(lh)
		y := p.f.GetY()
		p.drawText(pdfMarginX, y+lh*0.78, l)
		p.f.SetY(y + lh)
	}
}

// tableRow draws one row of wrapped cells, never split across pages. It
// returns whether the row started a new page.
type cellStyle struct {
	style string
	size  float64
	color [3]int
	right bool
}

func (p *pdfReport) rowHeight(widths []float64, cells []string, styles []cellStyle, pad float64) (float64, [][]string) {
	wrapped := make([][]string, len(cells))
	maxLines := 1
	for i, c := range cells {
		st := styles[i%len(styles)]
		p.font(st.style, st.size)
		if st.right {
			wrapped[i] = strings.Split(c, "\n") // numbers never wrap
		} else {
			wrapped[i] = p.lines(c, widths[i]-2*pad)
		}
		maxLines = max(maxLines, len(wrapped[i]))
	}
	size := styles[0].size
	return float64(maxLines)*size*0.42 + 1.4, wrapped
}

func (p *pdfReport) tableRow(widths []float64, cells []string, styles []cellStyle, bg *[3]int, rule bool, onBreak func()) {
	const pad = 0.8
	h, wrapped := p.rowHeight(widths, cells, styles, pad)
	if p.need(h) && onBreak != nil {
		onBreak()
	}
	y := p.f.GetY()
	if bg != nil {
		p.fill(*bg)
		p.f.Rect(pdfMarginX, y, sum(widths), h, "F")
	}
	x := pdfMarginX
	for i, ls := range wrapped {
		st := styles[i%len(styles)]
		p.font(st.style, st.size)
		p.color(st.color)
		lh := st.size * 0.42
		for j, l := range ls {
			tx := x + pad
			if st.right {
				tx = x + widths[i] - pad - p.textWidth(l)
			}
			p.drawText(tx, y+0.7+lh*float64(j)+lh*0.8, l)
		}
		x += widths[i]
	}
	if rule {
		p.draw(colLine)
		p.f.SetLineWidth(0.1)
		p.f.Line(pdfMarginX, y+h, pdfMarginX+sum(widths), y+h)
	}
	p.f.SetY(y + h)
}

func sum(v []float64) float64 {
	t := 0.0
	for _, x := range v {
		t += x
	}
	return t
}

// figureTable is a label | value | note table of display figures.
func (p *pdfReport) figureTable(figs []views.Figure, withHint bool) {
	widths := []float64{p.width * 0.45, p.width * 0.25, p.width * 0.30}
	if !withHint {
		widths = []float64{p.width * 0.45, p.width * 0.55}
	}
	styles := []cellStyle{{"", 9, colMuted, false}, {"", 9, colInk, false}, {"", 8, colMuted, false}}
	for _, fg := range figs {
		label := fg.Label
		if fg.Symbol != "" {
			label += "  " + fg.Symbol
		}
		value := strings.TrimSpace(fg.Value + " " + fg.Unit)
		cells := []string{label, value}
		if withHint {
			cells = append(cells, fg.Hint)
		}
		p.tableRow(widths, cells, styles, nil, true, nil)
	}
}

// noteBox draws a list in a tinted box with a coloured left bar, one item
// at a time so that no item is split across pages.
func (p *pdfReport) noteBox(title string, items []string, bg, bar [3]int) {
	const size, indent = 8.5, 6.0
	lh := size * 0.45
	p.font("", size)
	total := 9.0
	wrapped := make([][]string, len(items))
	for i, it := range items {
		wrapped[i] = p.lines(it, p.width-indent-3)
		total += float64(len(wrapped[i]))*lh + 1.2
	}
	if total < p.pageH-pdfMarginTop-pdfMarginBot {
		p.need(total + 4)
	}
	p.f.Ln(3)
	box := func(y, h float64) {
		p.fill(bg)
		p.f.Rect(pdfMarginX, y, p.width, h, "F")
		p.fill(bar)
		p.f.Rect(pdfMarginX, y, 1.2, h, "F")
	}
	p.need(9 + lh)
	y := p.f.GetY()
	box(y, 8)
	p.font("B", 11)
	p.color(colInk)
	p.drawText(pdfMarginX+4, y+5.8, title)
	p.f.SetY(y + 8)
	for _, ls := range wrapped {
		h := float64(len(ls))*lh + 1.2
		p.need(h)
		y := p.f.GetY()
		box(y, h)
		p.font("", size)
		p.color(colInk)
		p.drawText(pdfMarginX+4, y+lh*0.8, "•")
		for j, l := range ls {
			p.drawText(pdfMarginX+indent, y+lh*float64(j)+lh*0.8, l)
		}
		p.f.SetY(y + h)
	}
	p.f.Ln(1)
}

func (p *pdfReport) body() {
	v := p.v
	f := p.f
	// Title block.
	p.font("", 7.5)
	p.color(colMuted)
	p.drawText(pdfMarginX, f.GetY()+3, "FOGBENCH SPRAY REPORT")
	f.SetY(f.GetY() + 4)
	p.paragraph(v.Case.Name, "B", 16, colInk)
	meta := fmt.Sprintf("Case %d · revision %d", v.ID, v.Revision)
	if v.Author != "" {
		meta += " · saved by " + v.Author
	}
	meta += " · " + v.UpdatedText() + " · report drawn " + v.GeneratedText()
	f.Ln(1)
	p.paragraph(meta, "", 8.5, colMuted)
	f.Ln(1)
	p.paragraph("Purpose. "+v.Purpose(), "", 9.5, colInk)
	if v.Case.Notes != "" {
		p.paragraph("Notes. "+v.Case.Notes, "", 9, colMuted)
	}
	f.Ln(1.5)
	p.draw(colInk)
	f.SetLineWidth(0.3)
	f.Line(pdfMarginX, f.GetY(), pdfMarginX+p.width, f.GetY())

	p.heading("Inputs", "")
	p.figureTable(v.Inputs, false)

	if v.Error != "" {
		p.noteBox("This case cannot be computed", []string{v.Error}, colBadBg, colBad)
	}
	if v.Result != nil {
		p.heading("Results", v.MethodRefs("sizes", "means", "history"))
		p.figureTable(v.SummaryFigures(), true)
		p.subheading("Curvature", v.MethodRefs("laplace", "equilibrium", "kelvin", "evaporation"))
		p.figureTable(v.CurvatureFigures(), true)
		if eq := v.EquilibriumFigures(); len(eq) > 0 {
			p.subheading("Surface equilibrium at the gas pressure", v.MethodRefs("equilibrium"))
			p.paragraph("At the reference surface temperature "+v.EquilibriumTemperature()+".", "", 8.5, colMuted)
			p.figureTable(views.PlainFigures(eq), true)
			p.paragraph("Method: "+v.EquilibriumMethod(), "", 8, colMuted)
		}
		if sh := v.SuperheatView(); sh.S != nil {
			p.subheading("Superheat and flashing: "+sh.S.Regime, "")
			p.figureTable(sh.Figures(), true)
			if sh.S.Note != "" {
				p.paragraph(sh.S.Note, "", 8.5, colMuted)
			}
		}
		warnings := v.Result.Warnings
		if len(warnings) == 0 {
			warnings = []string{"None: every correlation and property was used inside its stated range."}
		}
		p.noteBox("Validity warnings", warnings, colWarnBg, colWarn)
	}
	p.noteBox("Safety", v.Cautions(), [3]int{0xff, 0xfd, 0xf5}, colWarn)

	if v.Result != nil {
		p.plots()
		p.binTable()
		p.properties()
		p.methods()
	}
	f.Ln(4)
	p.paragraph("fogbench computes estimates from published correlations and models. It does not replace testing, local codes or licensed engineering practice.", "", 8, colMuted)
}

// plots places each chart of the case page as a PNG, whole on one page.
func (p *pdfReport) plots() {
	first := true
	fit := measuredFit(p.v.Case)
	for _, pl := range p.v.Plots {
		if c, ok := chartByID(pl.ID, p.v.Result, fit); ok {
			p.plot(pl, c, &first)
		}
	}
	if pl := p.v.SuperheatPlot; pl != nil {
		if c, ok := superheatChart(p.v.Case, p.v.Result); ok {
			p.plot(*pl, c, &first)
		}
	}
}

// plot draws one chart as PNG across the text width with its caption, on
// one page; the first one brings the "Plots" heading with it.
func (p *pdfReport) plot(pl views.Plot, c chart, first *bool) {
	f := p.f
	png, err := c.PNG(pdfPlotDPI)
	if err != nil {
		return // the page left it out for the same reason
	}
	w := p.width
	h := w * float64(plotH) / float64(plotW)
	p.font("", 8)
	caption := p.lines(pl.Caption, w)
	need := h + float64(len(caption))*3.6 + 4
	if *first {
		p.need(need + 14) // the heading stays with its first plot
		p.heading("Plots", "")
		*first = false
	}
	p.need(need)
	name := fmt.Sprintf("plot-%d-%s", f.PageNo(), pl.ID)
	f.RegisterImageOptionsReader(name, fpdf.ImageOptions{ImageType: "PNG"}, bytes.NewReader(png))
	y := f.GetY()
	f.ImageOptions(name, pdfMarginX, y, w, h, false, fpdf.ImageOptions{ImageType: "PNG"}, 0, "")
	f.SetY(y + h + 1)
	p.font("", 8)
	p.color(colMuted)
	for _, l := range caption {
		y := f.GetY()
		p.drawText(pdfMarginX, y+2.8, l)
		f.SetY(y + 3.6)
	}
	f.Ln(3)
}

// binTable is the per-class table, its head repeated on every page and no
// row split.
func (p *pdfReport) binTable() {
	v := p.v
	cols := v.BinColumns()
	// Relative widths: the class range and the pressures need the most room.
	rel := []float64{1.7, 1.0, 1.0, 1.0, 1.25, 1.3, 1.3, 1.3, 1.05, 1.0, 0.95, 1.15}
	widths := make([]float64, len(rel))
	for i, r := range rel {
		widths[i] = p.width * r / sum(rel)
	}
	heads := make([]string, len(cols))
	for i, c := range cols {
		heads[i] = c.Heading
		if r := v.MethodRef(c.Method); r != "" {
			heads[i] += " (" + r + ")"
		}
	}
	headStyle := []cellStyle{{"B", 6.8, colInk, false}}
	numStyle := make([]cellStyle, len(cols))
	for i := range numStyle {
		numStyle[i] = cellStyle{"", 7, colInk, i < len(cols)-1}
	}
	head := func() {
		hd := colHead
		p.tableRow(widths, heads, headStyle, &hd, true, nil)
	}
	hh, _ := p.rowHeight(widths, heads, headStyle, 0.8)
	note := v.GrowthNote()
	if tn := v.TranscriticalNote(); tn != "" {
		if note != "" {
			note += "\n"
		}
		note += tn
	}
	nh := 0.0
	if note != "" {
		p.font("", 8)
		nh = float64(len(p.lines(note, p.width)))*8*0.45 + 1.5
	}
	p.need(14 + nh + hh + 3*4) // heading, note and head never sit alone at a page foot
	p.heading(fmt.Sprintf("Per size class (%d classes)", len(v.Result.Bins)), "")
	if note != "" {
		p.paragraph(note, "", 8, colInk)
		p.f.Ln(1.5)
	}
	head()
	for i, b := range v.BinRows() {
		var bg *[3]int
		if i%2 == 1 {
			st := colStripe
			bg = &st
		}
		cells := b.Cells()
		if b.Grows {
			st := colWarnBg
			bg = &st
			// Numeric cells never wrap: break the growth mark by hand so
			// it stays inside the narrow lifetime column.
			for j, c := range cells {
				if c == views.GrowsLifetime {
					cells[j] = strings.Replace(c, " (", "\n(", 1)
				}
			}
		}
		if b.Transcritical {
			st := colWarnBg
			bg = &st
			for j, c := range cells {
				if c == views.TranscriticalLifetime {
					cells[j] = strings.Replace(c, " ", "\n", 1)
				}
			}
		}
		p.tableRow(widths, cells, numStyle, bg, true, head)
	}
}

func (p *pdfReport) properties() {
	v := p.v
	p.heading("Properties used", "")
	p.paragraph(v.LiquidName+" at the reference surface temperature and in the gas film.", "", 8.5, colMuted)
	p.f.Ln(1)
	p.figureTable(v.PropertyRows(), false)
	p.need(12 + 16)
	p.subheading("Sources of the properties", "")
	widths := []float64{p.width * 0.22, p.width * 0.33, p.width * 0.45}
	headStyle := []cellStyle{{"B", 7.5, colInk, false}}
	style := []cellStyle{{"", 7.5, colInk, false}, {"", 7.5, colInk, false}, {"", 7.5, colMuted, false}}
	head := func() {
		hd := colHead
		p.tableRow(widths, []string{"Property", "Method", "Reference"}, headStyle, &hd, true, nil)
	}
	p.need(12)
	head()
	for _, s := range v.Sources() {
		p.tableRow(widths, []string{s.Property, s.Method, s.Reference}, style, nil, true, head)
	}
}

func (p *pdfReport) methods() {
	f := p.f
	p.heading("Methods", "")
	const indent = 9.0
	for i, m := range p.v.Methods() {
		type line struct {
			text  string
			font  string
			style string
			size  float64
			color [3]int
		}
		var ls []line
		p.font("B", 8.5)
		for _, l := range p.lines(m.Name, p.width-indent) {
			ls = append(ls, line{l, "sans", "B", 8.5, colInk})
		}
		f.SetFont("serif", "", 9.5)
		for _, l := range p.lines(m.Equation, p.width-indent) {
			ls = append(ls, line{l, "serif", "", 9.5, colInk})
		}
		p.font("", 8)
		for _, l := range p.lines("Used for: "+m.Use+".", p.width-indent) {
			ls = append(ls, line{l, "sans", "", 8, colMuted})
		}
		for _, l := range p.lines(m.Reference, p.width-indent) {
			ls = append(ls, line{l, "sans", "", 8, colMuted})
		}
		h := 1.5
		for _, l := range ls {
			h += l.size * 0.42
		}
		p.need(h)
		y := f.GetY() + 0.8
		p.font("B", 8.5)
		p.color(colAccent)
		p.drawText(pdfMarginX, y+8.5*0.42*0.8, fmt.Sprintf("M%d", i+1))
		for _, l := range ls {
			f.SetFont(l.font, l.style, l.size)
			p.color(l.color)
			lh := l.size * 0.42
			p.drawText(pdfMarginX+indent, y+lh*0.8, l.text)
			y += lh
		}
		p.draw(colLine)
		f.SetLineWidth(0.1)
		f.Line(pdfMarginX, y+0.7, pdfMarginX+p.width, y+0.7)
		f.SetY(y + 0.7)
	}
}
