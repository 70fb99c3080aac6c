package server

import (
	"bytes"
	"fmt"
	"image/color"
	"math"
	"regexp"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"

	"fogbench/calc"
	"fogbench/views"
)

// Plot colours of our own: deep teal, rust, olive, slate, plum, ochre.
var palette = []color.Color{
	color.RGBA{0x1f, 0x5f, 0x7a, 0xff},
	color.RGBA{0xb0, 0x4a, 0x1e, 0xff},
	color.RGBA{0x5b, 0x6e, 0x1f, 0xff},
	color.RGBA{0x4a, 0x55, 0x68, 0xff},
	color.RGBA{0x7d, 0x3c, 0x78, 0xff},
	color.RGBA{0xa8, 0x7b, 0x00, 0xff},
}

// series is one line of a plot.
type series struct {
	Name   string
	X, Y   []float64
	Step   bool // draw as a histogram outline
	Dashed bool
	// Color picks palette[Color-1] so that two series (a curve's in-range
	// and out-of-range parts) share a colour; 0 colours by position.
	Color int
}

// chart describes a plot before it is drawn to SVG or PNG.
type chart struct {
	Title, XLabel, YLabel string
	LogX, LogY            bool
	Series                []series
	Marks                 []float64 // vertical reference lines at these x
	MarkNames             []string
}

// maxPlotMagnitude bounds the values a chart draws: beyond it (and, on a
// log axis, below its inverse) a point is left out, so that every axis
// range, its headroom and its ticks stay finite. No quantity fogbench plots
// comes near it in any display unit.
const maxPlotMagnitude = 1e300

// drawable reports whether v can be drawn on an axis of that kind.
func drawable(v float64, log bool) bool {
	if math.IsNaN(v) || math.Abs(v) > maxPlotMagnitude {
		return false
	}
	return !log || v >= 1/maxPlotMagnitude
}

// newPlot builds the gonum plot. Points that an axis cannot show (NaN, Inf,
// ≤ 0 on a log axis) are dropped, since gonum panics on them, and the axis
// ranges are settled so that no series (flat, a single value, extreme) can
// make gonum panic or loop while it draws.
func (c chart) newPlot() (*plot.Plot, error) {
	p := plot.New()
	p.Title.Text = c.Title
	p.X.Label.Text = c.XLabel
	p.Y.Label.Text = c.YLabel
	p.Title.TextStyle.Font.Size = vg.Points(12)
	p.X.Label.TextStyle.Font.Size = vg.Points(11)
	p.Y.Label.TextStyle.Font.Size = vg.Points(11)
	p.X.Tick.Label.Font.Size = vg.Points(10)
	p.Y.Tick.Label.Font.Size = vg.Points(10)
	p.Legend.Top = true
	p.Legend.TextStyle.Font.Size = vg.Points(10)
	p.Add(plotter.NewGrid())
	if c.LogX {
		p.X.Scale = plot.LogScale{}
		p.X.Tick.Marker = sparseLogTicks{}
	}
	if c.LogY {
		p.Y.Scale = plot.LogScale{}
		p.Y.Tick.Marker = sparseLogTicks{}
	}
	xmin, xmax := math.Inf(1), math.Inf(-1)
	ymin, ymax := math.Inf(1), math.Inf(-1)
	drawn, legendLines := 0, 0
	for i, s := range c.Series {
		var pts plotter.XYs
		for j := range min(len(s.X), len(s.Y)) {
			x, y := s.X[j], s.Y[j]
			if !drawable(x, c.LogX) || !drawable(y, c.LogY) {
				continue
			}
			pts = append(pts, plotter.XY{X: x, Y: y})
			xmin, xmax = math.Min(xmin, x), math.Max(xmax, x)
			ymin, ymax = math.Min(ymin, y), math.Max(ymax, y)
		}
		col := palette[i%len(palette)]
		if s.Color > 0 {
			col = palette[(s.Color-1)%len(palette)]
		}
		if len(pts) == 0 {
			continue
		}
		if len(pts) == 1 { // one value: a dot, since a line needs two
			sc, err := plotter.NewScatter(pts)
			if err != nil {
				return nil, err
			}
			sc.GlyphStyle.Color = col
			sc.GlyphStyle.Radius = vg.Points(3)
			p.Add(sc)
			if s.Name != "" {
				p.Legend.Add(s.Name, sc)
				legendLines++
			}
			drawn++
			continue
		}
		l, err := plotter.NewLine(pts)
		if err != nil {
			return nil, err
		}
		l.Color = col
		l.Width = vg.Points(1.6)
		if s.Step {
			l.StepStyle = plotter.PostStep
		}
		if s.Dashed {
			l.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
		}
		p.Add(l)
		if s.Name != "" {
			p.Legend.Add(s.Name, l)
			legendLines++
		}
		drawn++
	}
	if drawn == 0 {
		return nil, fmt.Errorf("plot %q: no drawable points", c.Title)
	}
	type markLine struct {
		x    float64
		name string
	}
	var marks []markLine
	for i, m := range c.Marks {
		if !(m >= xmin && m <= xmax) || !drawable(m, c.LogX) {
			continue
		}
		ml := markLine{x: m}
		if i < len(c.MarkNames) {
			ml.name = c.MarkNames[i]
			legendLines++
		}
		marks = append(marks, ml)
	}
	headroom(p, c.LogY, ymin, ymax, legendLines)
	settle(&p.X, c.LogX, xmin, xmax)
	settle(&p.Y, c.LogY, ymin, ymax)
	// Marks span the data; over flat data, the axis.
	y0, y1 := ymin, ymax
	if !(y1 > y0) {
		y0, y1 = p.Y.Min, p.Y.Max
	}
	for _, m := range marks {
		l, err := plotter.NewLine(plotter.XYs{{X: m.x, Y: y0}, {X: m.x, Y: y1}})
		if err != nil {
			return nil, err
		}
		l.Color = color.Gray{Y: 0x80}
		l.Dashes = []vg.Length{vg.Points(2), vg.Points(2)}
		p.Add(l)
		if m.name != "" {
			p.Legend.Add(m.name, l)
		}
	}
	return p, nil
}

// sparseLogTicks are gonum's log ticks (a label per decade, minor ticks
// between) for axes of up to two dozen decades, which every real plot here
// stays within. A wider axis, which only absurd data make, gets about a
// dozen labelled ticks and no minor ones, so that drawing it stays as cheap
// as a normal plot (hundreds of decades took a second to draw).
type sparseLogTicks struct{}

func (sparseLogTicks) Ticks(min, max float64) []plot.Tick {
	lo, hi := math.Floor(math.Log10(min)), math.Ceil(math.Log10(max))
	if hi-lo <= 24 {
		return plot.LogTicks{Prec: -1}.Ticks(min, max)
	}
	step := math.Ceil((hi - lo) / 12)
	var ticks []plot.Tick
	for e := lo; e <= hi; e += step {
		v := math.Pow(10, e)
		ticks = append(ticks, plot.Tick{Value: v, Label: strconv.FormatFloat(v, 'g', -1, 64)})
	}
	return ticks
}

// settle gives the axis a range gonum can draw: finite, positive on a log
// axis, and wide enough for the tick code to step through. Without it a
// flat series (a constant property) gets gonum's default of value ± 1,
// which puts a log axis below zero (a panic), and a range narrower than
// the floating-point spacing of its values can keep the tick code looping.
// A flat series is shown in a range around its value: a decade either side
// on a log axis; on a linear one from zero (when positive, as most
// quantities are) or ±10 %, or −1…1 at zero.
func settle(a *plot.Axis, log bool, dmin, dmax float64) {
	usable := func(lo, hi float64) bool {
		if math.IsNaN(lo) || math.IsNaN(hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) || !(hi > lo) {
			return false
		}
		if log {
			r := hi / lo
			return lo > 0 && r >= 1+1e-6 && !math.IsInf(r, 0)
		}
		return hi-lo >= 1e-9*math.Max(math.Abs(lo), math.Abs(hi)) && !math.IsInf(hi-lo, 0)
	}
	if usable(a.Min, a.Max) {
		return
	}
	if usable(dmin, dmax) {
		a.Min, a.Max = dmin, dmax
		return
	}
	v := dmax // the data are flat (or nearly): one value
	switch {
	case log:
		a.Min, a.Max = v/10, v*10
	case v > 0:
		a.Min, a.Max = 0, 1.5*v
	case v < 0:
		a.Min, a.Max = 1.1*v, 0.9*v
	default:
		a.Min, a.Max = -1, 1
	}
}

// headroom raises the top of the y axis so the legend, drawn in the top
// right corner, sits above the data instead of over it: about one tenth of
// the axis per legend line.
func headroom(p *plot.Plot, logY bool, ymin, ymax float64, entries int) {
	if entries == 0 || !(ymax > ymin) {
		return
	}
	// Capped, so a legend of many entries (a dozen liquids) does not squash
	// the data into the bottom of the plot.
	f := math.Min(0.1*float64(entries+1), 0.5)
	if logY {
		p.Y.Min, p.Y.Max = ymin, ymax*math.Pow(ymax/ymin, math.Min(f, 0.3))
		return
	}
	lo := math.Min(ymin, 0)
	p.Y.Min, p.Y.Max = lo, ymax+f*(ymax-lo)
}

const plotW, plotH = 6.4 * vg.Inch, 3.6 * vg.Inch

// SVG draws the chart as an SVG document held in memory.
func (c chart) SVG() (string, error) {
	p, err := c.newPlot()
	if err != nil {
		return "", err
	}
	canvas := vgsvg.NewWith(vgsvg.UseWH(plotW, plotH))
	p.Draw(draw.New(canvas))
	var buf bytes.Buffer
	if _, err := canvas.WriteTo(&buf); err != nil {
		return "", err
	}
	return styleToAttributes(stripXMLProlog(buf.String())), nil
}

var styleAttr = regexp.MustCompile(`\s+style="([^"]*)"`)

// styleToAttributes rewrites gonum's style="k:v;…" attributes as SVG
// presentation attributes (k="v"), which the page's Content-Security-Policy
// allows; inline style attributes would be blocked and the plot drawn black.
func styleToAttributes(svg string) string {
	return styleAttr.ReplaceAllStringFunc(svg, func(m string) string {
		decls := styleAttr.FindStringSubmatch(m)[1]
		var b strings.Builder
		for _, d := range strings.Split(decls, ";") {
			k, v, ok := strings.Cut(d, ":")
			k, v = strings.TrimSpace(k), strings.TrimSpace(v)
			if !ok || k == "" || strings.ContainsAny(k+v, `"<>&`) {
				continue
			}
			b.WriteString(" " + k + `="` + v + `"`)
		}
		return b.String()
	})
}

func init() {
	// Sans-serif plot text to match the pages (Liberation ships with gonum).
	plot.DefaultFont = font.Font{Typeface: "Liberation", Variant: "Sans"}
	plotter.DefaultFont = plot.DefaultFont
}

// PNG draws the chart as a PNG image at dpi (for PDF reports: vgpdf mangles
// non-ASCII text, vgimg does not).
func (c chart) PNG(dpi int) ([]byte, error) {
	p, err := c.newPlot()
	if err != nil {
		return nil, err
	}
	canvas := vgimg.NewWith(vgimg.UseWH(plotW, plotH), vgimg.UseDPI(dpi))
	p.Draw(draw.New(canvas))
	var buf bytes.Buffer
	if _, err := (vgimg.PngCanvas{Canvas: canvas}).WriteTo(&buf); err != nil {
		return nil, err
	}
	return buf.Bytes(), nil
}

// stripXMLProlog removes the <?xml …?> line so the SVG can sit inline in
// HTML.
func stripXMLProlog(s string) string {
	if i := bytes.Index([]byte(s), []byte("<svg")); i > 0 {
		return s[i:]
	}
	return s
}

// volumeChart is the distribution: volume fraction per unit ln d, so that
// the area under the curve on a log axis is the volume fraction, plus the
// cumulative volume.
func volumeChart(r *calc.Result) chart {
	n := len(r.Bins)
	xs := make([]float64, 0, n+1)
	dens := make([]float64, 0, n+1)
	cumX := make([]float64, 0, n+1)
	cum := make([]float64, 0, n+1)
	total := 0.0
	if n > 0 {
		cumX = append(cumX, r.Bins[0].DLoM*1e6)
		cum = append(cum, 0)
	}
	for _, b := range r.Bins {
		w := math.Log(b.DHiM / b.DLoM)
		xs = append(xs, b.DLoM*1e6)
		dens = append(dens, b.VolumeFraction/w)
		total += b.VolumeFraction
		cumX = append(cumX, b.DHiM*1e6)
		cum = append(cum, total)
	}
	if n > 0 { // close the last step
		xs = append(xs, r.Bins[n-1].DHiM*1e6)
		dens = append(dens, dens[len(dens)-1])
	}
	return chart{
		Title:  "Drop sizes by volume",
		XLabel: "Drop diameter d (µm)",
		YLabel: "dV/d ln d (–) and cumulative volume fraction (–)",
		LogX:   true,
		Series: []series{
			{Name: "volume per unit ln d", X: xs, Y: dens, Step: true},
			{Name: "cumulative volume", X: cumX, Y: cum},
		},
		Marks:     []float64{r.Summary.D32M * 1e6, r.Summary.Dv50M * 1e6},
		MarkNames: []string{"D32", "Dv50"},
	}
}

// curvatureChart shows how much curvature raises the vapor pressure and the
// evaporation rate, as ratio − 1 on log-log axes (the ratios themselves sit
// too close to 1 to read).
func curvatureChart(r *calc.Result) chart {
	var d, kr, en []float64
	for _, b := range r.Bins {
		d = append(d, b.DM*1e6)
		kr = append(kr, b.KelvinRatio-1)
		en = append(en, b.EvaporationEnhancement-1)
	}
	c := chart{
		Title:  "Curvature effect per size class",
		XLabel: "Drop diameter d (µm)",
		YLabel: "ratio − 1 (–)",
		LogX:   true, LogY: true,
		Series: []series{
			{Name: "vapor pressure p(r)/p_flat − 1 (Kelvin)", X: d, Y: kr},
			{Name: "evaporation rate enhancement − 1", X: d, Y: en, Dashed: true},
		},
	}
	if p := r.Curvature.Enhancement1PctDM; p != nil {
		c.Marks = append(c.Marks, *p*1e6)
		c.MarkNames = append(c.MarkNames, "+1 % rate")
	}
	if p := r.Curvature.Enhancement10PctDM; p != nil {
		c.Marks = append(c.Marks, *p*1e6)
		c.MarkNames = append(c.MarkNames, "+10 % rate")
	}
	// In supersaturated surroundings drops above 2r* grow instead of
	// evaporating; the mark shows where that starts.
	if r := r.Curvature.KelvinCriticalRadiusM; r != nil {
		c.Marks = append(c.Marks, 2**r*1e6)
		c.MarkNames = append(c.MarkNames, "Kelvin critical 2r*")
	}
	return c
}

// historyChart is the share of the spray's mass evaporated against time,
// with the times to 50, 90 and 99 % marked.
func historyChart(r *calc.Result) (chart, bool) {
	h := r.History
	if h == nil || len(h.TS) < 2 {
		return chart{}, false
	}
	c := chart{
		Title:  "Evaporation history of the spray",
		XLabel: "Time t (ms)",
		YLabel: "mass evaporated (–)",
		LogX:   true,
		Series: []series{{Name: "mass evaporated", X: scaled(h.TS, 1e3), Y: h.EvaporatedMassFraction}},
	}
	for _, m := range []struct {
		name string
		t    *float64
	}{{"t50", r.Summary.T50S}, {"t90", r.Summary.T90S}, {"t99", r.Summary.T99S}} {
		if m.t != nil {
			c.Marks = append(c.Marks, *m.t*1e3)
			c.MarkNames = append(c.MarkNames, m.name)
		}
	}
	return c, true
}

// sizeHistoryChart is D32 and Dv50 of the drops still present against time:
// both grow as the small drops vanish first.
func sizeHistoryChart(r *calc.Result) (chart, bool) {
	h := r.History
	if h == nil || len(h.TS) < 2 {
		return chart{}, false
	}
	return chart{
		Title:  "Size of the remaining drops",
		XLabel: "Time t (ms)",
		YLabel: "Diameter (µm)",
		LogX:   true,
		Series: []series{
			{Name: "D32 of remaining drops", X: scaled(h.TS, 1e3), Y: scaled(h.D32M, 1e6)},
			{Name: "Dv50 of remaining drops", X: scaled(h.TS, 1e3), Y: scaled(h.Dv50M, 1e6), Dashed: true},
		},
	}, true
}

// distanceChart is the evaporated mass against distance travelled at the
// case's spray velocity.
func distanceChart(r *calc.Result) (chart, bool) {
	h := r.History
	if h == nil || len(h.XM) < 2 {
		return chart{}, false
	}
	return chart{
		Title:  "Evaporation along the spray",
		XLabel: "Distance x (mm)",
		YLabel: "mass evaporated (–)",
		LogX:   true,
		Series: []series{{Name: "mass evaporated", X: scaled(h.XM, 1e3), Y: h.EvaporatedMassFraction}},
	}, true
}

// scaled returns v multiplied by k, for plotting in display units.
func scaled(v []float64, k float64) []float64 {
	out := make([]float64, len(v))
	for i, x := range v {
		out[i] = x * k
	}
	return out
}

// plotSpec is one plot of a page: its id, caption and chart.
type plotSpec struct {
	id, caption string
	c           chart
}

// drawPlots renders charts to SVG, leaving out any that cannot be drawn.
func (s *Server) drawPlots(specs []plotSpec) []views.Plot {
	var out []views.Plot
	for _, sp := range specs {
		svg, err := sp.c.SVG()
		if err != nil {
			s.Logger.Warn("plot", "id", sp.id, "err", err)
			continue
		}
		out = append(out, views.Plot{ID: sp.id, Title: sp.c.Title, SVG: svg, Caption: sp.caption})
	}
	return out
}
