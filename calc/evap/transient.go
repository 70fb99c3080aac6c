package evap

import (
	"errors"
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

// atFrom is at with the step found by walking from *cur (a sweep's times
// increase, so the step is usually the same or the next); *cur is updated.
func (p *transientPath) atFrom(t float64, cur *int) (float64, float64) {
	n := len(p.t)
	if t >= p.t[n-1] {
		return p.at(t)
	}
	j := p.step(t, cur)
	h := p.t[j+1] - p.t[j]
	x := (t - p.t[j]) / h
	s := math.Max(0, hermite(x, h, p.s[j], p.s[j+1], p.ds[j], p.ds[j+1]))
	T := hermite(x, h, p.T[j], p.T[j+1], p.dT[j], p.dT[j+1])
	return p.diameter(s, T), s * math.Sqrt(s)
}

// step returns the step j with t[j] < t ≤ t[j+1] for t < t[n−1] (j = 0
// for t ≤ t[0]), walking forward from *cur when t lies at or above its
// step, else by bisection; *cur is updated. A node time gives the node's
// values from either neighbouring step, so the walk and the bisection
// agree.
func (p *transientPath) step(t float64, cur *int) int {
	j := *cur
	if j < 0 || j >= len(p.t)-1 || t < p.t[j] {
		j = sort.SearchFloat64s(p.t, t)
		if j > 0 {
			j--
		}
	}
	for t > p.t[j+1] {
		j++
	}
	*cur = j
	return j
}

// hermite is the cubic Hermite interpolant at x ∈ [0, 1] of a step of
// length h with end values y0, y1 and end slopes d0, d1.
func hermite(x, h, y0, y1, d0, d1 float64) float64 {
	x2, x3 := x*x, x*x*x
	return (2*x3-3*x2+1)*y0 + (x3-2*x2+x)*h*d0 + (-2*x3+3*x2)*y1 + (x3-x2)*h*d1
}

// fraction returns the remaining mass fraction at time t, the second
// result of at without the diameter (no liquid density, no cube root):
// the remaining-mass sums of the t50/t90/t99 search need no more;
// *cur is a step hint as for atFrom.
func (p *transientPath) fraction(t float64, cur *int) float64 {
	n := len(p.t)
	if t >= p.t[n-1] {
		if p.gone {
			return 0
		}
		return p.lastFrc
	}
	j := p.step(t, cur)
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
	sp.trCur = make([]int, len(sp.d0))
	for i := range sp.trCur {
		sp.trCur[i] = -1
	}
	sp.integrated = 0
	sp.heldWeight, sp.shortestLife = 0, math.Inf(1)
	if !sp.directTransient && c.similarTransient() && len(sp.d0) > 1 {
		done, err := sp.sharedTransient(tInj, horizon)
		if err != nil || done {
			return err
		}
		sp.heldWeight, sp.shortestLife = 0, math.Inf(1)
	}
	if !sp.directTransient && !c.similarTransient() && len(sp.d0) >= interpMinBins {
		done, err := sp.interpTransient(tInj, horizon)
		if err != nil || done {
			return err
		}
	}
	for i := range sp.d0 {
		if sp.tr[i] != nil {
			continue // a reference of interpTransient, integrated already
		}
		if err := sp.stopped(); err != nil {
			return err
		}
		p, tEnd, joined, err := sp.integrateBin(i, tInj, horizon, nil, nil)
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

// pathExtension asks integrateBin to go on for a few accepted steps past
// the join, so that an interpolation reference covers the join times of
// its neighbours (see interpTransient); t, s, T, ds, dT receive the whole
// path, the extension included.
type pathExtension struct {
	steps           int
	t, s, T, ds, dT []float64
}

// integrateBin integrates bin i's heating phase (see addTransient); rec,
// when not nil, receives one stepRecord per point of the path. With ext
// the integration continues ext.steps accepted steps past the join; the
// returned path, its end time and the warnings still stop at the join, as
// without ext.
func (sp *sprayPaths) integrateBin(i int, tInj, horizon float64, rec *[]stepRecord, ext *pathExtension) (*transientPath, float64, bool, error) {
	c := sp.c
	d0 := sp.d0[i]
	sp.integrated++
	rhoInj := c.Liquid.Density(tInj)
	uTop := math.Inf(-1)
	if sp.table != nil {
		uTop = sp.table.u[len(sp.table.u)-1]
	}
	p := &transientPath{c: c, m0: rhoInj * math.Pi * d0 * d0 * d0 / 6}
	var last dropEval
	maxKn, flags := 0.0, uint(0)
	joinAt := 0 // points of the path up to the join, once joined
	f := func(_ float64, y, dy []float64) error {
		s := math.Max(y[0], 1e-30)
		// A surface that reaches the mixture critical point is held
		// there (see holdAtCritical).
		T, held := c.holdAtCritical(y[1])
		d := p.diameter(s, T)
		e, err := c.evaluate(d, T, c.Curvature)
		if err != nil {
			return err
		}
		m := p.m0 * s * math.Sqrt(s)
		dy[0] = -(2.0 / 3) * e.mdot / (p.m0 * math.Sqrt(s))
		dy[1] = e.heatToLiquid / (m * c.Liquid.HeatCapacity(T))
		if held {
			dy[1] = 0
			e.flags |= warnTranscritical
		}
		last = e
		if joinAt > 0 {
			// The extension past the join is no part of this bin's path.
			return nil
		}
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
	// imbalance is |Q − ṁL| − max(1e-3 ṁL, G·settledTemperatureTol),
	// ≤ 0 once the heat balance has settled; +Inf while the drop does not
	// evaporate. G = Q/(T_∞ − T_s) turns the second bound into a surface
	// temperature within settledTemperatureTol of the balance: for a drop
	// of low volatility, whose steady temperature lies a few mK below the
	// gas, 1e-3 ṁL asks for a temperature the integrator, held by the
	// drop's thermal time to steps far shorter than its lifetime, cannot
	// resolve, and the drop never joined the steady path (200,000 steps
	// per class, then a refusal).
	imbalance := func(e dropEval) float64 {
		if !(e.mdot > 0) {
			return math.Inf(1)
		}
		return math.Abs(e.heatToLiquid) - math.Max(1e-3*e.mdot*e.lat, e.conductance*settledTemperatureTol)
	}
	settled := func() bool { return imbalance(last) <= 0 }
	prevImb := imbalance(last)
	var joinNode [5]float64 // t, s, T, ds, dT where the heat balance settles
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
		if joinAt > 0 {
			return len(p.t) >= joinAt+ext.steps || y[0] <= 1e-6
		}
		if rec != nil {
			*rec = append(*rec, stepRecord{settled(), maxKn, flags})
		}
		if y[0] <= 1e-6 {
			p.gone = true
			return true
		}
		imb := imbalance(last)
		if imb <= 0 && sp.table != nil && math.Log(p.diameter(y[0], y[1])) <= uTop {
			n := len(p.t) - 1
			joinNode = [5]float64{t, y[0], y[1], dy[0], dy[1]}
			if prevImb > 0 {
				// The heat balance settled within this step: the drop joins
				// where it did, found on the step's cubic Hermite
				// interpolant, not at the step's end, so that where the
				// steps fall does not move the join.
				j, h := n-1, p.t[n]-p.t[n-1]
				at := func(x float64) (float64, float64) {
					return math.Max(hermite(x, h, p.s[j], p.s[n], p.ds[j], p.ds[n]), 1e-30),
						hermite(x, h, p.T[j], p.T[n], p.dT[j], p.dT[n])
				}
				g := func(x float64) float64 {
					sx, Tx := at(x)
					e, err := c.evaluate(p.diameter(sx, Tx), Tx, c.Curvature)
					if err != nil {
						return math.NaN()
					}
					return imbalance(e)
				}
				if x, err := brent(g, 0, 1, prevImb, imb, 1e-6); err == nil && x < 1 {
					sx, Tx := at(x)
					yx, dyx := []float64{sx, Tx}, make([]float64, 2)
					if f(0, yx, dyx) == nil && math.Log(p.diameter(sx, Tx)) <= uTop {
						joinNode = [5]float64{p.t[j] + x*h, sx, Tx, dyx[0], dyx[1]}
					}
				}
			}
			joined = true
			joinAt = n + 1
			p.lastFrc = joinNode[1] * math.Sqrt(joinNode[1])
			p.lastD = p.diameter(joinNode[1], joinNode[2])
			return ext == nil || ext.steps == 0
		}
		prevImb = imb
		return len(p.t) > 200000
	}
	// The first step is a small fraction of the drop's thermal time.
	h0 := 1e-3 * p.m0 * c.Liquid.HeatCapacity(tInj) / (math.Pi * d0 * 0.03 * 2)
	st := newODEStepper(f, 2, 1e-7, []float64{1e-10, 1e-6})
	tEnd, err := st.run(0, horizon, y, h0, after)
	if err != nil && joinAt == 0 {
		// The stepper returns the rate's own error when it persists (an
		// error at a trial stage it recovered from is not one).
		if !errors.Is(err, errStepTooSmall) {
			return nil, 0, false, err
		}
		return nil, 0, false, fmt.Errorf("evap: transient heating of the %s m bin: %w", valid.FormatValue(d0), err)
	}
	if joinAt > 0 {
		// The path ends at the join node; an extension goes on from the
		// step's end after it.
		n := joinAt - 1
		tj := joinNode[0]
		path := [5][]float64{p.t, p.s, p.T, p.ds, p.dT}
		var out, whole [5][]float64
		same := tj == p.t[n]
		for a := range path {
			x := path[a]
			out[a] = append(append(make([]float64, 0, n+1), x[:n]...), joinNode[a])
			if ext != nil {
				if same {
					whole[a] = x
				} else {
					whole[a] = append(append(append(make([]float64, 0, len(x)+1), x[:n]...), joinNode[a]), x[n:]...)
				}
			}
		}
		p.t, p.s, p.T, p.ds, p.dT = out[0], out[1], out[2], out[3], out[4]
		if ext != nil {
			ext.t, ext.s, ext.T, ext.ds, ext.dT = whole[0], whole[1], whole[2], whole[3], whole[4]
		}
		return p, tj, true, nil
	}
	p.lastFrc = y[0] * math.Sqrt(math.Max(y[0], 0))
	p.lastD = p.diameter(math.Max(y[0], 0), y[1])
	return p, tEnd, joined, nil
}

// settledTemperatureTol is the surface-temperature offset from the heat
// balance (K) within which a heating drop counts as settled however small
// its wet-bulb depression: 1 mK moves the rate by under 1e-4 relative
// (d ln ṁ/dT ≈ 0.06 /K for water, less for the alkanes), and it binds only
// where the depression is below 1 K, so drops with a depression of
// kelvins settle by the 1e-3 ṁL bound as before.
const settledTemperatureTol = 1e-3

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
	pr, tEnd, joined, err := sp.integrateBin(ref, tInj, horizon, &rec, nil)
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
		if k == len(pr.t) || bJoined && k < len(pr.t)-1 {
			// The largest bin's last step stops every smaller one; and a
			// smaller bin that joins where the largest could not (above
			// the table) would find its own join within the step.
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

// Interpolated heating paths. With the Kelvin or transition factor or slip
// the heating path in τ = t/d0² depends on d0, but smoothly: a few bins
// (references) are integrated and every other bin's path is interpolated
// in ln d0 at fixed τ between them. A reference interval is split (its
// midpoint bin integrated and compared with the interpolation) until the
// interpolation error is below interpTransientTol; see docs/methods-evap.md.
const (
	// interpTransientTol bounds the interpolation error a midpoint check
	// accepts: the largest of the remaining mass fraction's and d/d0's
	// absolute differences over the heating phase and after it, and the
	// lifetime's relative difference. It is a quarter of the 1e-6 that
	// TestInterpTransientMatchesDirect holds each bin to, itself below the
	// 2–4e-6 by which the per-bin integration at rtol 1e-7 differs from one
	// at rtol 1e-10, and a hundredth of the 1e-4 the Python reference asks.
	interpTransientTol = 2.5e-7
	// interpMinBins is the smallest spray interpolated: below it the
	// references and checks would cost about as much as every bin.
	interpMinBins = 12
	// interpExtraSteps is how far a reference integrates past its join:
	// its neighbours may join a little later in τ.
	interpExtraSteps = 3
)

// transientRef is an integrated reference bin's path in τ = t/d0², with
// the slopes per unit τ, extended past its join (node join).
type transientRef struct {
	bin               int
	u                 float64 // ln d0
	tau, s, T, ds, dT []float64
	join              int
	cur               int // cursor of the last evaluation (interpolatedPath)
}

// eval returns s, T and their slopes per unit τ at τ by the path's cubic
// Hermite interpolant, walking from r.cur; ok is false past the path's end.
func (r *transientRef) eval(tau float64) (s, T, ds, dT float64, ok bool) {
	n := len(r.tau)
	if tau > r.tau[n-1] {
		return 0, 0, 0, 0, false
	}
	j := r.cur
	if j < 0 || j >= n-1 || tau < r.tau[j] {
		j = 0
	}
	for j < n-2 && tau > r.tau[j+1] {
		j++
	}
	r.cur = j
	h := r.tau[j+1] - r.tau[j]
	x := (tau - r.tau[j]) / h
	s, ds = hermiteSlope(x, h, r.s[j], r.s[j+1], r.ds[j], r.ds[j+1])
	T, dT = hermiteSlope(x, h, r.T[j], r.T[j+1], r.dT[j], r.dT[j+1])
	return s, T, ds, dT, true
}

// hermiteSlope returns hermite's value and its slope dy/dt (per unit of
// the step's variable, not of x).
func hermiteSlope(x, h, y0, y1, d0, d1 float64) (float64, float64) {
	x2 := x * x
	y := hermite(x, h, y0, y1, d0, d1)
	dy := ((6*x2-6*x)*(y0-y1))/h + (3*x2-4*x+1)*d0 + (3*x2-2*x)*d1
	return y, dy
}

// lagrangeWeights returns the weights of the Lagrange polynomial through
// the nodes xs evaluated at x.
func lagrangeWeights(xs []float64, x float64, w []float64) []float64 {
	w = w[:0]
	for a := range xs {
		l := 1.0
		for b := range xs {
			if b != a {
				l *= (x - xs[b]) / (xs[a] - xs[b])
			}
		}
		w = append(w, l)
	}
	return w
}

// newTransientRef integrates bin i as a reference; ok is false when it
// does not join the table (evaporates first, grows past it, or does not
// settle before the horizon), and the caller then stores its path as
// it is: integrateBin's result does not depend on the extension.
func (sp *sprayPaths) newTransientRef(i int, tInj, horizon float64) (*transientRef, *transientPath, float64, bool, error) {
	ext := &pathExtension{steps: interpExtraSteps}
	p, tEnd, joined, err := sp.integrateBin(i, tInj, horizon, nil, ext)
	if err != nil || !joined {
		return nil, p, tEnd, joined, err
	}
	d0 := sp.d0[i]
	d2 := d0 * d0
	r := &transientRef{bin: i, u: math.Log(d0), join: len(p.t) - 1,
		tau: make([]float64, len(ext.t)), s: ext.s, T: ext.T,
		ds: make([]float64, len(ext.t)), dT: make([]float64, len(ext.t))}
	for k := range ext.t {
		r.tau[k] = ext.t[k] / d2
		r.ds[k] = ext.ds[k] * d2
		r.dT[k] = ext.dT[k] * d2
	}
	return r, p, tEnd, true, nil
}

// interpolatedPath builds bin i's heating path from the references
// stencil (at most four, in increasing ln d0), whose member near is the
// nearest to bin i. The bin joins the table at τ_J, the Lagrange
// interpolation in ln d0 of the references' join times (each where its
// heat balance settled, found within its step, so smooth in d0); its nodes
// are near's steps before τ_J and τ_J itself, its values and slopes the
// Lagrange interpolation of the references' at the same τ (their cubic
// Hermite interpolants, extended past their joins). ok is false when a
// reference does not reach τ_J or the bin would join above the table; the
// bin is then integrated on its own.
func (sp *sprayPaths) interpolatedPath(i int, stencil []*transientRef, near *transientRef, rhoInj float64) (*transientPath, float64, bool) {
	d0 := sp.d0[i]
	d2 := d0 * d0
	var xs [4]float64
	for a, r := range stencil {
		xs[a] = r.u
		r.cur = 0
	}
	var wb [4]float64
	w := lagrangeWeights(xs[:len(stencil)], math.Log(d0), wb[:0])
	tauJ := 0.0
	for a, r := range stencil {
		tauJ += w[a] * r.tau[r.join]
	}
	k := 0
	for k < len(near.tau) && near.tau[k] < tauJ {
		k++
	}
	p := &transientPath{c: sp.c, m0: rhoInj * math.Pi * d0 * d0 * d0 / 6}
	p.t, p.s, p.T = make([]float64, k+1), make([]float64, k+1), make([]float64, k+1)
	p.ds, p.dT = make([]float64, k+1), make([]float64, k+1)
	for j := 0; j <= k; j++ {
		tau := tauJ
		if j < k {
			tau = near.tau[j]
		}
		var s, T, ds, dT float64
		for a, r := range stencil {
			rs, rT, rds, rdT, ok := r.eval(tau)
			if r == near && j < k {
				rs, rT, rds, rdT, ok = r.s[j], r.T[j], r.ds[j], r.dT[j], true
			}
			if !ok {
				return nil, 0, false
			}
			s += w[a] * rs
			T += w[a] * rT
			ds += w[a] * rds
			dT += w[a] * rdT
		}
		if !(s > 1e-6) {
			return nil, 0, false
		}
		p.t[j], p.s[j], p.T[j], p.ds[j], p.dT[j] = tau*d2, s, T, ds/d2, dT/d2
	}
	s, T := p.s[k], p.T[k]
	p.lastFrc = s * math.Sqrt(s)
	p.lastD = p.diameter(s, T)
	if math.Log(p.lastD) > sp.table.u[len(sp.table.u)-1] {
		return nil, 0, false
	}
	return p, p.t[k], true
}

// binLife is a joined bin's state at time t: its heating path before
// tJoin, the table from its joining diameter after (see sprayPaths.state).
func (sp *sprayPaths) binLife(p *transientPath, tJoin, g0, t float64, cur *int) (float64, float64) {
	if t < tJoin {
		return p.at(t)
	}
	if t == tJoin {
		return p.lastD, p.lastFrc
	}
	d := sp.table.diameter(g0-(t-tJoin), cur)
	r := d / p.lastD
	return d, p.lastFrc * r * r * r
}

// interpError is the difference between bin i's interpolated path pi
// (joined at ti) and its integrated path pd (joined at td) that matters
// downstream: the largest absolute difference of the remaining mass
// fraction and of d/d0 at both paths' nodes and midway between them, of
// the remaining mass fraction at 24 times from the later join to the end
// of the shorter life, and the relative difference of the lifetimes.
// After the join d/d0 is held through the lifetime: near the end of life
// it changes as the square root of the time left, which magnifies any
// lifetime difference without bound.
func (sp *sprayPaths) interpError(i int, pi *transientPath, ti float64, pd *transientPath, td float64) float64 {
	gi, gd := sp.table.evaporationTime(pi.lastD), sp.table.evaporationTime(pd.lastD)
	li, ld := ti+gi, td+gd
	worst := math.Abs(li/ld - 1)
	d0 := sp.d0[i]
	ci, cd := -1, -1
	tBoth := math.Max(ti, td)
	cmp := func(t float64) {
		di, fi := sp.binLife(pi, ti, gi, t, &ci)
		dd, fd := sp.binLife(pd, td, gd, t, &cd)
		worst = math.Max(worst, math.Abs(fi-fd))
		if t <= tBoth {
			worst = math.Max(worst, math.Abs(di-dd)/d0)
		}
	}
	for _, p := range []*transientPath{pi, pd} {
		ci, cd = -1, -1
		for k := 1; k < len(p.t); k++ {
			cmp(0.5 * (p.t[k-1] + p.t[k]))
			cmp(p.t[k])
		}
	}
	t1 := math.Min(li, ld)
	ci, cd = -1, -1
	for k := 1; k <= 24 && t1 > tBoth; k++ {
		cmp(tBoth + (t1-tBoth)*float64(k)/25)
	}
	return worst
}

// interpTransient gives every bin a heating path from references
// integrated in ln d0 (see interpolatedPath): five references spread
// evenly in ln d0 (the smallest and the largest bin among them), then
// each interval between neighbouring references is checked at its
// middle bin, which is integrated and becomes a reference; an interval
// whose check misses interpTransientTol is split and both halves are
// checked in turn. It reports false, with every integrated reference
// stored as the per-bin integration would store it, when a reference does
// not join the table; the caller integrates the other bins on their own.
func (sp *sprayPaths) interpTransient(tInj, horizon float64) (bool, error) {
	n := len(sp.d0)
	rhoInj := sp.c.Liquid.Density(tInj)
	u0, u1 := math.Log(sp.d0[0]), math.Log(sp.d0[n-1])
	refs := make([]*transientRef, 0, 16) // in increasing bin
	failed := false
	add := func(i int) (*transientRef, *transientPath, float64, error) {
		if err := sp.stopped(); err != nil {
			return nil, nil, 0, err
		}
		r, p, tEnd, joined, err := sp.newTransientRef(i, tInj, horizon)
		if err != nil {
			return nil, nil, 0, err
		}
		sp.setTransient(i, p, tEnd, joined)
		if r == nil {
			failed = true
			return nil, p, tEnd, nil
		}
		at := len(refs)
		for at > 0 && refs[at-1].bin > i {
			at--
		}
		refs = append(refs, nil)
		copy(refs[at+1:], refs[at:])
		refs[at] = r
		return r, p, tEnd, nil
	}
	// nearestBin returns the bin in (a, b) nearest to ln d0 = u.
	nearestBin := func(a, b int, u float64) int {
		m := a + 1
		for k := a + 2; k < b; k++ {
			if math.Abs(math.Log(sp.d0[k])-u) < math.Abs(math.Log(sp.d0[m])-u) {
				m = k
			}
		}
		return m
	}
	const first = 5
	prev := -1
	for k := 0; k < first; k++ {
		i := n - 1
		if k < first-1 {
			i = nearestBin(prev, n, u0+(u1-u0)*float64(k)/(first-1))
		}
		if i <= prev {
			continue
		}
		if _, _, _, err := add(i); err != nil || failed {
			return false, err
		}
		prev = i
	}
	// stencil returns the (up to four) references around the interval
	// between refs[j] and refs[j+1], and the one of those two nearest to u.
	stencil := func(j int, u float64) ([]*transientRef, *transientRef) {
		lo, hi := max(0, j-1), min(len(refs)-1, j+2)
		for hi-lo < 3 && (lo > 0 || hi < len(refs)-1) {
			if lo > 0 {
				lo--
			} else {
				hi++
			}
		}
		near := refs[j]
		if u-refs[j].u > refs[j+1].u-u {
			near = refs[j+1]
		}
		return refs[lo : hi+1 : hi+1], near
	}
	refIndex := func(bin int) int {
		for j, r := range refs {
			if r.bin == bin {
				return j
			}
		}
		return -1
	}
	type interval struct{ a, b int } // bins of two neighbouring references
	var todo []interval
	for j := 0; j+1 < len(refs); j++ {
		if refs[j+1].bin-refs[j].bin > 1 {
			todo = append(todo, interval{refs[j].bin, refs[j+1].bin})
		}
	}
	for len(todo) > 0 {
		iv := todo[len(todo)-1]
		todo = todo[:len(todo)-1]
		m := nearestBin(iv.a, iv.b, 0.5*(math.Log(sp.d0[iv.a])+math.Log(sp.d0[iv.b])))
		st, near := stencil(refIndex(iv.a), math.Log(sp.d0[m]))
		pi, ti, ok := sp.interpolatedPath(m, st, near, rhoInj)
		_, pd, td, err := add(m)
		if err != nil || failed {
			return false, err
		}
		if ok && sp.interpError(m, pi, ti, pd, td) <= interpTransientTol {
			continue
		}
		for _, h := range []interval{{iv.a, m}, {m, iv.b}} {
			if h.b-h.a > 1 {
				todo = append(todo, h)
			}
		}
	}
	for j := 0; j+1 < len(refs); j++ {
		for i := refs[j].bin + 1; i < refs[j+1].bin; i++ {
			if err := sp.stopped(); err != nil {
				return true, err
			}
			st, near := stencil(j, math.Log(sp.d0[i]))
			p, tEnd, ok := sp.interpolatedPath(i, st, near, rhoInj)
			if !ok {
				var err error
				if p, tEnd, ok, err = sp.integrateBin(i, tInj, horizon, nil, nil); err != nil {
					return true, err
				}
			}
			sp.setTransient(i, p, tEnd, ok)
		}
	}
	return true, nil
}

// transientTemperatureRange returns the lowest and highest surface
// temperature on the heating paths (their nodes: the Hermite interpolant
// between them stays within the nodes' range to the integrator's
// tolerance), for the property-range warnings.
func (sp *sprayPaths) transientTemperatureRange() (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, p := range sp.tr {
		if p == nil {
			continue
		}
		for _, T := range p.T {
			lo, hi = math.Min(lo, T), math.Max(hi, T)
		}
	}
	if lo > hi {
		return 0, 0
	}
	return lo, hi
}
