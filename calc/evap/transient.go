package evap

import (
	"fmt"
	"math"
	"sort"

	"fogbench/calc/valid"
)

// transientPath is one bin's heating phase: accepted Dormand–Prince steps
// of y = (s, T_s) with s = (m/m0)^(2/3), interpolated by cubic Hermite
// polynomials between steps.
type transientPath struct {
	c              *Conditions
	m0             float64
	t, s, T        []float64
	ds, dT         []float64
	gone           bool // evaporated before joining the steady path
	lastD, lastFrc float64
}

// at returns the diameter (m) and remaining mass fraction at time t.
func (p *transientPath) at(t float64) (float64, float64) {
	n := len(p.t)
	if t >= p.t[n-1] {
		if p.gone {
			return 0, 0
		}
		return p.lastD, p.lastFrc
	}
	j := sort.SearchFloat64s(p.t, t)
	if j > 0 {
		j--
	}
	h := p.t[j+1] - p.t[j]
	x := (t - p.t[j]) / h
	herm := func(y0, y1, d0, d1 float64) float64 {
		x2, x3 := x*x, x*x*x
		return (2*x3-3*x2+1)*y0 + (x3-2*x2+x)*h*d0 + (-2*x3+3*x2)*y1 + (x3-x2)*h*d1
	}
	s := math.Max(0, herm(p.s[j], p.s[j+1], p.ds[j], p.ds[j+1]))
	T := herm(p.T[j], p.T[j+1], p.dT[j], p.dT[j+1])
	return p.diameter(s, T), s * math.Sqrt(s)
}

func (p *transientPath) diameter(s, T float64) float64 {
	m := p.m0 * s * math.Sqrt(s)
	return math.Cbrt(6 * m / (math.Pi * p.c.Liquid.Density(T)))
}

// addTransient integrates the heating phase of every bin:
//
//	dm/dt = −ṁ,   m c_p,L dT_s/dt = Q − ṁ L
//
// (uniform-temperature drop, "infinite liquid conductivity"; Abramzon &
// Sirignano 1989, section 2 — from memory) in the variables s = (m/m0)^(2/3)
// and T_s, whose right-hand sides stay finite as m → 0. Each drop joins the
// steady shrinkage table once |Q − ṁL| ≤ 1e-3 ṁ L; one that grows or never
// settles is integrated to the horizon (MaxTime, or 20 times the longest
// steady lifetime).
func (sp *sprayPaths) addTransient(tInj, maxTime float64) error {
	c := sp.c
	horizon := maxTime
	if horizon == 0 {
		longest := 0.0
		for _, l := range sp.life {
			if !math.IsInf(l, 1) {
				longest = math.Max(longest, l)
			}
		}
		if longest == 0 || sp.heldWeight > 0 {
			return valid.Errorf("history.max_time_s", 0, "is needed: some drops do not evaporate under these conditions")
		}
		horizon = 20 * longest
	}
	rhoInj := c.Liquid.Density(tInj)
	sp.tr = make([]*transientPath, len(sp.d0))
	sp.heldWeight, sp.shortestLife = 0, math.Inf(1)
	uTop := math.Inf(-1)
	if sp.table != nil {
		uTop = sp.table.u[len(sp.table.u)-1]
	}
	for i, d0 := range sp.d0 {
		if err := sp.stopped(); err != nil {
			return err
		}
		p := &transientPath{c: c, m0: rhoInj * math.Pi * d0 * d0 * d0 / 6}
		var last dropEval
		var evalErr error
		f := func(_ float64, y, dy []float64) error {
			s := math.Max(y[0], 1e-30)
			d := p.diameter(s, y[1])
			e, err := c.evaluate(d, y[1], c.Curvature)
			if err != nil {
				evalErr = err
				return err
			}
			m := p.m0 * s * math.Sqrt(s)
			dy[0] = -(2.0 / 3) * e.mdot / (p.m0 * math.Sqrt(s))
			dy[1] = e.heatToLiquid / (m * c.Liquid.HeatCapacity(y[1]))
			last = e
			sp.rate.flags |= e.flags &^ warnKelvinSmall
			return nil
		}
		y := []float64{1, tInj}
		dy := make([]float64, 2)
		if err := f(0, y, dy); err != nil {
			return err
		}
		p.t, p.s, p.T, p.ds, p.dT = []float64{0}, []float64{1}, []float64{tInj}, []float64{dy[0]}, []float64{dy[1]}
		joined := false
		after := func(t float64, y, dy []float64) bool {
			p.t = append(p.t, t)
			p.s = append(p.s, y[0])
			p.T = append(p.T, y[1])
			p.ds = append(p.ds, dy[0])
			p.dT = append(p.dT, dy[1])
			if y[0] <= 1e-6 {
				p.gone = true
				return true
			}
			if last.mdot > 0 && math.Abs(last.heatToLiquid) <= 1e-3*last.mdot*last.lat && sp.table != nil {
				if math.Log(p.diameter(y[0], y[1])) <= uTop {
					joined = true
					return true
				}
			}
			return len(p.t) > 200000
		}
		// The first step is a small fraction of the drop's thermal time.
		h0 := 1e-3 * p.m0 * c.Liquid.HeatCapacity(tInj) / (math.Pi * d0 * 0.03 * 2)
		st := newODEStepper(f, 2, 1e-7, []float64{1e-10, 1e-6})
		tEnd, err := st.run(0, horizon, y, h0, after)
		if err != nil {
			if evalErr != nil {
				return evalErr
			}
			return fmt.Errorf("evap: transient heating of the %s m bin: %w", valid.FormatValue(d0), err)
		}
		p.lastFrc = y[0] * math.Sqrt(math.Max(y[0], 0))
		p.lastD = p.diameter(math.Max(y[0], 0), y[1])
		sp.tr[i] = p
		switch {
		case joined:
			sp.join[i] = tEnd
			sp.dJoin[i] = p.lastD
			sp.scale[i] = p.lastFrc
			sp.g0[i] = sp.table.evaporationTime(p.lastD)
			sp.life[i] = tEnd + sp.g0[i]
		case p.gone:
			sp.join[i], sp.life[i] = math.Inf(1), tEnd
		default:
			sp.join[i], sp.life[i], sp.g0[i] = math.Inf(1), math.Inf(1), math.Inf(1)
			sp.heldWeight += sp.w[i]
		}
		sp.shortestLife = math.Min(sp.shortestLife, sp.life[i])
	}
	return nil
}
