package server

import (
	"fmt"
	"strings"

	"fogbench/calc"
	"fogbench/calc/flash"
	"fogbench/views"
)

// superheatDiagramPoints is the number of points per line of the p–T
// diagram: enough for smooth curves, cheap (each kinetic-limit point is a
// bracketed root, about 0.3 ms).
const superheatDiagramPoints = 60

// superheatChart is the p–T diagram of a superheated case: the saturation
// curve from the liquid's own correlation, the Peng–Robinson liquid
// spinodal, the kinetic limit of superheat, and the case's superheat at its
// gas pressure (from T_sat(p) to T_l), with the liquid temperature marked.
// ok is false for a case that is not superheated.
func superheatChart(c calc.Case, res *calc.Result) (chart, bool) {
	sh := res.Superheat
	if sh == nil {
		return chart{}, false
	}
	l, err := calc.LookupLiquid(c)
	if err != nil {
		return chart{}, false
	}
	// Start a decade and a bit below the case's pressure, inside the
	// liquid's range.
	pmin := sh.PressurePa / 20
	if _, err := l.SaturationTemperature(pmin); err != nil {
		pmin = sh.PressurePa
	}
	d, err := flash.PTDiagram(l, pmin, sh.NucleationThresholdM3S, superheatDiagramPoints)
	if err != nil {
		return chart{}, false
	}
	line := func(name string, pts []flash.Point, dashed bool) series {
		s := series{Name: name, Dashed: dashed}
		for _, p := range pts {
			s.X = append(s.X, p.TK)
			s.Y = append(s.Y, p.PPa/1e6)
		}
		return s
	}
	p := sh.PressurePa / 1e6
	return chart{
		Title:  "Superheated liquid on the p–T plane",
		XLabel: "Temperature T (K)",
		YLabel: "Pressure p (MPa)",
		LogY:   true,
		Series: []series{
			line("p_sat(T)", d.Saturation, false),
			line("spinodal (PR)", d.Spinodal, true),
			line("kinetic limit, J = "+strings.Replace(fmt.Sprintf("%.0e", d.Threshold), "e+", "e", 1)+" 1/(m³ s)", d.KineticLimit, true),
			{Name: "this case: ΔT at p_amb", X: []float64{sh.SaturationTemperatureK, sh.TemperatureK}, Y: []float64{p, p}},
		},
		Marks:     []float64{sh.TemperatureK},
		MarkNames: []string{"T_l"},
	}, true
}

// superheatPlot draws superheatChart for the case page, or nil.
func (s *Server) superheatPlot(c calc.Case, res *calc.Result) *views.Plot {
	ch, ok := superheatChart(c, res)
	if !ok {
		return nil
	}
	svg, err := ch.SVG()
	if err != nil {
		s.Logger.Warn("plot", "id", "superheat", "err", err)
		return nil
	}
	return &views.Plot{ID: "superheat", Title: ch.Title, SVG: svg,
		Caption: "Saturation curve of the liquid's vapor-pressure correlation, the Peng–Robinson liquid spinodal (the end of the metastable liquid), and the classical-nucleation kinetic limit of superheat; the solid horizontal segment runs from the boiling point at the gas pressure to the liquid temperature (dashed vertical line)."}
}
