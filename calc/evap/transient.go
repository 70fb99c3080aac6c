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
	s := math.Max(0, hermite(x, h, p.s[j], p.s[j+1], p.ds[j], p.ds[j+1]))
	T := hermite(x, h, p.T[j], p.T[j+1], p.dT[j], p.dT[j+1])
	return p.diameter(s, T), s * math.Sqrt(s)
}

// hermite is the cubic Hermite interpolant at x ∈ [0, 1] of a step of
// length h with end values y0, y1 and end slopes d0, d1.
func hermite(x, h, y0, y1, d0, d1 float64) float64 {
	x2, x3 := x*x, x*x*x
	return (2*x3-3*x2+1)*y0 + (x3-2*x2+x)*h*d0 + (-2*x3+3*x2)*y1 + (x3-x2)*h*d1
}

// fraction returns the remaining mass fraction at time t, the second
// result of at without the diameter (no liquid density, no cube root):
// the remaining-mass sums of the t50/t90/t99 search need no more.
func (p *transientPath) fraction(t float64) float64 {
	n := len(p.t)
	if t >= p.t[n-1] {
		if p.gone {
			return 0
		}
		return p.lastFrc
	}
	j := sort.SearchFloat64s(p.t, t)
	if j > 0 {
		j--
	}
	h := p.t[j+1] - p.t[j]
	x := (t - p.t[j]) / h
	s := math.Max(0, hermite(x, h, p.s[j], p.s[j+1], p.ds[j], p.ds[j+1]))
	return s * math.Sqrt(s)
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
//
// When the rates do not depend on the size except through the factor d
// (see similarTransient) every bin follows the same path in τ = t/d0²;
// the largest bin is integrated and the others take its steps scaled
// (sharedTransient). Otherwise, or when the largest bin does not settle,
// each bin is integrated on its own.
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
	sp.tr = make([]*transientPath, len(sp.d0))
	sp.heldWeight, sp.shortestLife = 0, math.Inf(1)
	if !sp.directTransient && c.similarTransient() && len(sp.d0) > 1 {
		done, err := sp.sharedTransient(tInj, horizon)
		if err != nil || done {
			return err
		}
		sp.heldWeight, sp.shortestLife = 0, math.Inf(1)
	}
	for i := range sp.d0 {
		if err := sp.stopped(); err != nil {
			return err
		}
		p, tEnd, joined, err := sp.integrateBin(i, tInj, horizon, nil)
		if err != nil {
			return err
		}
		sp.setTransient(i, p, tEnd, joined)
	}
	return nil
}

// similarTransient reports whether the heating equations are the same for
// every drop size in τ = t/d0²: with a flat surface (no Kelvin factor), no
// transition factor and no slip (Re = 0, so Sh and Nu do not depend on d)
// ṁ and Q are d times a function of T_s alone, m ∝ d0³ s^(3/2), so ds/dt
// and dT_s/dt are 1/d0² times functions of (s, T_s); the first step h0 is
// ∝ d0² as well. The only size-dependent output is the Knudsen warning.
func (c *Conditions) similarTransient() bool {
	return !c.Curvature && !c.Transition && c.RelativeVelocity == 0
}

// stepRecord is what sharedTransient keeps of the integrated bin's
// accepted steps: whether its heat balance had settled there, the largest
// Knudsen number and the warning flags of all evaluations up to it.
type stepRecord struct {
	settled bool
	maxKn   float64
	flags   uint
}

// integrateBin integrates bin i's heating phase (see addTransient); rec,
// when not nil, receives one stepRecord per point of the path.
func (sp *sprayPaths) integrateBin(i int, tInj, horizon float64, rec *[]stepRecord) (*transientPath, float64, bool, error) {
	c := sp.c
	d0 := sp.d0[i]
	rhoInj := c.Liquid.Density(tInj)
	uTop := math.Inf(-1)
	if sp.table != nil {
		uTop = sp.table.u[len(sp.table.u)-1]
	}
	p := &transientPath{c: c, m0: rhoInj * math.Pi * d0 * d0 * d0 / 6}
	var last dropEval
	var evalErr error
	maxKn, flags := 0.0, uint(0)
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
		maxKn = math.Max(maxKn, e.kn)
		flags |= e.flags &^ (warnKelvinSmall | warnContinuumAtHighKn)
		return nil
	}
	y := []float64{1, tInj}
	dy := make([]float64, 2)
	if err := f(0, y, dy); err != nil {
		return nil, 0, false, err
	}
	settled := func() bool {
		return last.mdot > 0 && math.Abs(last.heatToLiquid) <= 1e-3*last.mdot*last.lat
	}
	p.t, p.s, p.T, p.ds, p.dT = []float64{0}, []float64{1}, []float64{tInj}, []float64{dy[0]}, []float64{dy[1]}
	if rec != nil {
		*rec = append((*rec)[:0], stepRecord{settled(), maxKn, flags})
	}
	joined := false
	after := func(t float64, y, dy []float64) bool {
		p.t = append(p.t, t)
		p.s = append(p.s, y[0])
		p.T = append(p.T, y[1])
		p.ds = append(p.ds, dy[0])
		p.dT = append(p.dT, dy[1])
		if rec != nil {
			*rec = append(*rec, stepRecord{settled(), maxKn, flags})
		}
		if y[0] <= 1e-6 {
			p.gone = true
			return true
		}
		if settled() && sp.table != nil {
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
			return nil, 0, false, evalErr
		}
		return nil, 0, false, fmt.Errorf("evap: transient heating of the %s m bin: %w", valid.FormatValue(d0), err)
	}
	p.lastFrc = y[0] * math.Sqrt(math.Max(y[0], 0))
	p.lastD = p.diameter(math.Max(y[0], 0), y[1])
	return p, tEnd, joined, nil
}

// setTransient stores bin i's heating path p, which ended at tEnd, joined
// to the table or not.
func (sp *sprayPaths) setTransient(i int, p *transientPath, tEnd float64, joined bool) {
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

// sharedTransient integrates the largest bin and gives every smaller bin
// its path scaled to its size, t = (d0/d0_ref)² τ_ref with the same (s, T_s)
// at each step (see similarTransient); a bin stops at the first step where
// its own integration would (evaporated, or settled at a diameter inside
// the table). It reports false, with nothing stored, when the largest bin
// neither joins the table nor evaporates before the horizon or the step
// limit: a smaller bin could then stop at its own horizon, which the
// scaled path does not reproduce.
func (sp *sprayPaths) sharedTransient(tInj, horizon float64) (bool, error) {
	c := sp.c
	ref := len(sp.d0) - 1
	var rec []stepRecord
	pr, tEnd, joined, err := sp.integrateBin(ref, tInj, horizon, &rec)
	if err != nil || !(joined || pr.gone) || len(pr.t) > 200000 {
		// Each bin is integrated on its own, which reports any error for
		// the bin where it first occurs.
		return false, nil
	}
	uTop := math.Inf(-1)
	if sp.table != nil {
		uTop = sp.table.u[len(sp.table.u)-1]
	}
	rhoInj := c.Liquid.Density(tInj)
	dRef := sp.d0[ref]
	for i := 0; i < ref; i++ {
		if err := sp.stopped(); err != nil {
			return true, err
		}
		d0 := sp.d0[i]
		ratio := d0 / dRef
		r2 := ratio * ratio
		p := &transientPath{c: c, m0: rhoInj * math.Pi * d0 * d0 * d0 / 6}
		k, bJoined := 1, false
		for ; k < len(pr.t); k++ {
			if pr.s[k] <= 1e-6 {
				p.gone = true
				break
			}
			if rec[k].settled && sp.table != nil && math.Log(p.diameter(pr.s[k], pr.T[k])) <= uTop {
				bJoined = true
				break
			}
		}
		if k == len(pr.t) {
			// The largest bin's last step stops every smaller one.
			return false, nil
		}
		p.t, p.ds, p.dT = make([]float64, k+1), make([]float64, k+1), make([]float64, k+1)
		for j := 0; j <= k; j++ {
			p.t[j] = pr.t[j] * r2
			p.ds[j] = pr.ds[j] / r2
			p.dT[j] = pr.dT[j] / r2
		}
		p.s, p.T = pr.s[:k+1:k+1], pr.T[:k+1:k+1]
		s := pr.s[k]
		p.lastFrc = s * math.Sqrt(math.Max(s, 0))
		p.lastD = p.diameter(math.Max(s, 0), pr.T[k])
		sp.rate.flags |= rec[k].flags
		if !c.Transition && rec[k].maxKn/ratio > slipMaxKnudsen {
			sp.rate.flags |= warnContinuumAtHighKn
		}
		sp.setTransient(i, p, p.t[k], bJoined)
	}
	sp.setTransient(ref, pr, tEnd, joined)
	return true, nil
}
