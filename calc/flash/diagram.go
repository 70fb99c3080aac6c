package flash

import (
	"math"

	"fogbench/calc/valid"
)

// Point is one (T, p) pair of a p–T diagram: K and Pa.
type Point struct {
	TK, PPa float64
}

// Diagram holds the lines of a p–T diagram of the metastable liquid:
// the saturation curve from the liquid's own correlation, the
// Peng–Robinson liquid spinodal (positive pressures only) and the kinetic
// limit of superheat. Each line runs up to the critical point.
type Diagram struct {
	Saturation   []Point
	Spinodal     []Point
	KineticLimit []Point
	Threshold    float64 // 1/(m3 s) of the kinetic-limit line
}

// PTDiagram samples the lines of Diagram for liquid l on n points each,
// from the saturation temperature at pmin (Pa) to just below Tc, with
// temperatures evenly spaced and the kinetic-limit pressures spaced
// evenly in ln p. Points a line does not have (a spinodal in tension, a
// pressure without a kinetic limit) are left out, so a line may be shorter
// than n. threshold 0 means DefaultNucleationThreshold; n must be 2…2000.
func PTDiagram(l Liquid, pmin, threshold float64, n int) (Diagram, error) {
	if n < 2 || n > 2000 {
		return Diagram{}, valid.Errorf("points", float64(n), "must be between 2 and 2000")
	}
	if err := valid.Positive("pressure_pa", pmin); err != nil {
		return Diagram{}, err
	}
	if threshold == 0 {
		threshold = DefaultNucleationThreshold
	}
	tmin, err := l.SaturationTemperature(pmin)
	if err != nil {
		return Diagram{}, err
	}
	tc, pc := l.CriticalTemperature(), l.CriticalPressure()
	pr := PengRobinson{Tc: tc, Pc: pc, Omega: l.AcentricFactor()}
	if err := pr.Validate(); err != nil {
		return Diagram{}, err
	}
	d := Diagram{Threshold: threshold}
	top := tc * (1 - 1e-6)
	for i := range n {
		t := tmin + (top-tmin)*float64(i)/float64(n-1)
		d.Saturation = append(d.Saturation, Point{t, l.SaturationPressure(t)})
		if p, _, err := pr.LiquidSpinodal(t); err == nil && p > 0 {
			d.Spinodal = append(d.Spinodal, Point{t, p})
		}
	}
	pmax := l.SaturationPressure(top)
	for i := range n {
		p := math.Exp(math.Log(pmin) + (math.Log(pmax)-math.Log(pmin))*float64(i)/float64(n-1))
		if t, err := KineticLimit(l, p, threshold); err == nil {
			d.KineticLimit = append(d.KineticLimit, Point{t, p})
		}
	}
	return d, nil
}
