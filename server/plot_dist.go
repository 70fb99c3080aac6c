package server

import (
	"fmt"
	"math"
	"strconv"

	"fogbench/calc"
	"fogbench/calc/sizedist"
	"fogbench/views"
)

// fitGridPoints is how many diameters a fitted curve is drawn through.
const fitGridPoints = 160

// measuredFit fits the four model families to a case's measured classes and
// returns the one with the highest R², or nil when the case has no measured
// classes or no family fits. It is drawn over the measured distribution.
func measuredFit(c calc.Case) *sizedist.FitResult {
	d := c.Distribution
	if d.Model != "bins" {
		return nil
	}
	b, err := sizedist.FromFractions(d.EdgesM, d.Fraction, sizedist.Basis(d.Basis))
	if err != nil {
		return nil
	}
	var best *sizedist.FitResult
	for _, fam := range sizedist.Families {
		fit, err := sizedist.Fit(b, fam)
		if err != nil {
			continue
		}
		if best == nil || fit.R2 > best.R2 {
			best = &fit
		}
	}
	return best
}

// r2Text shows a coefficient of determination to five decimals, where fits
// of sprays differ.
func r2Text(r2 float64) string { return strconv.FormatFloat(r2, 'f', 5, 64) }

// logGrid is n diameters spaced evenly in ln d from lo to hi.
func logGrid(lo, hi float64, n int) []float64 {
	out := make([]float64, n)
	r := math.Log(hi / lo)
	for i := range out {
		out[i] = lo * math.Exp(r*float64(i)/float64(n-1))
	}
	out[n-1] = hi
	return out
}

// classSteps turns per-class fractions into a step outline of fraction per
// unit ln d over the class edges, so the area under it on a log axis is the
// fraction.
func classSteps(bins []calc.BinResult, frac func(calc.BinResult) float64) (xs, ys []float64) {
	for _, b := range bins {
		xs = append(xs, b.DLoM*1e6)
		ys = append(ys, frac(b)/math.Log(b.DHiM/b.DLoM))
	}
	if n := len(bins); n > 0 {
		xs = append(xs, bins[n-1].DHiM*1e6)
		ys = append(ys, ys[len(ys)-1])
	}
	return xs, ys
}

// sizeDensityChart draws the number and volume distributions as fractions
// per unit ln d (q0·d and q3·d) against diameter on a log axis. A fit is
// drawn as its volume density d·q3(d), and as its number density d·q0(d)
// normalised over the plotted range, since the measured number fractions
// sum to one over that range.
func sizeDensityChart(r *calc.Result, fit *sizedist.FitResult) chart {
	nx, ny := classSteps(r.Bins, func(b calc.BinResult) float64 { return b.NumberFraction })
	vx, vy := classSteps(r.Bins, func(b calc.BinResult) float64 { return b.VolumeFraction })
	c := chart{
		Title:  "Drop-size distribution by number and by volume",
		XLabel: "Drop diameter d (µm)",
		YLabel: "fraction per unit ln d (–)",
		LogX:   true,
		Series: []series{
			{Name: "number", X: nx, Y: ny, Step: true},
			{Name: "volume", X: vx, Y: vy, Step: true},
		},
		Marks:     []float64{r.Summary.D32M * 1e6, r.Summary.Dv50M * 1e6},
		MarkNames: []string{"D32", "Dv50"},
	}
	if fit != nil && len(r.Bins) > 0 {
		lo, hi := r.Bins[0].DLoM, r.Bins[len(r.Bins)-1].DHiM
		grid := logGrid(lo, hi, fitGridPoints)
		x := make([]float64, len(grid))
		num := make([]float64, len(grid))
		vol := make([]float64, len(grid))
		for i, d := range grid {
			x[i] = d * 1e6
			num[i] = fit.Model.NumberPDF(d) * d
			vol[i] = fit.Model.VolumePDF(d) * d
		}
		// Trapezoidal ∫ q0(d) d dln d over the range.
		h := math.Log(hi/lo) / float64(len(grid)-1)
		total := 0.0
		for i := 1; i < len(num); i++ {
			total += 0.5 * (num[i-1] + num[i]) * h
		}
		if total > 0 && !math.IsInf(total, 0) {
			for i := range num {
				num[i] /= total
			}
			c.Series = append(c.Series, series{Name: "number, " + fit.Family + " fit", X: x, Y: num, Dashed: true})
		}
		c.Series = append(c.Series, series{Name: "volume, " + fit.Family + " fit", X: x, Y: vol, Dashed: true})
	}
	return c
}

// cumulativeChart draws the cumulative volume fraction Q3 at the class
// edges, and the fitted model's Q3(d) (the curve the fit minimised against).
func cumulativeChart(r *calc.Result, fit *sizedist.FitResult) chart {
	var x, y []float64
	total := 0.0
	if len(r.Bins) > 0 {
		x, y = append(x, r.Bins[0].DLoM*1e6), append(y, 0)
	}
	for _, b := range r.Bins {
		total += b.VolumeFraction
		x, y = append(x, b.DHiM*1e6), append(y, total)
	}
	c := chart{
		Title:     "Cumulative volume undersize",
		XLabel:    "Drop diameter d (µm)",
		YLabel:    "cumulative volume fraction Q3 (–)",
		LogX:      true,
		Series:    []series{{Name: "classes", X: x, Y: y}},
		Marks:     []float64{r.Summary.Dv10M * 1e6, r.Summary.Dv50M * 1e6, r.Summary.Dv90M * 1e6},
		MarkNames: []string{"Dv10", "Dv50", "Dv90"},
	}
	if fit != nil && len(r.Bins) > 0 {
		grid := logGrid(r.Bins[0].DLoM, r.Bins[len(r.Bins)-1].DHiM, fitGridPoints)
		fx := make([]float64, len(grid))
		fy := make([]float64, len(grid))
		for i, d := range grid {
			fx[i], fy[i] = d*1e6, fit.Model.VolumeCDF(d)
		}
		c.Series = append(c.Series, series{Name: fit.Family + " fit", X: fx, Y: fy, Dashed: true})
	}
	return c
}

// distPlots draws the distribution plots of the case page; fit, when not
// nil, is overlaid and named in the captions.
func (s *Server) distPlots(res *calc.Result, fit *sizedist.FitResult) []views.Plot {
	fitNote := ""
	if fit != nil {
		fitNote = fmt.Sprintf(" Dashed: the %s model fitted to the classes (best R² of the four families, %s).",
			views.ModelLabel(fit.Family), r2Text(fit.R2))
	}
	return s.drawPlots([]plotSpec{
		{"dist-density", "Fraction of the drops (number) and of the liquid (volume) per unit ln d; the area under each step curve is its fraction. Grey dashes mark D32 and Dv50." + fitNote, sizeDensityChart(res, fit)},
		{"dist-cumulative", "Share of the liquid volume in drops smaller than d; grey dashes mark Dv10, Dv50 and Dv90." + fitNote, cumulativeChart(res, fit)},
	})
}
