package evap

import (
	"context"
	"fmt"
	"math"

	"fogbench/calc/valid"
)

// HistoryOptions control History.
type HistoryOptions struct {
	// SurfaceTemperature fixes T_s in K for every drop; zero means the
	// steady temperature of each diameter. Not used with Transient.
	SurfaceTemperature float64
	// Transient heats each drop from InjectionTemperature (K) as a
	// uniform-temperature sphere, m c_p,L dT_s/dt = Q − ṁ L, until it
	// reaches its steady temperature; from there it follows the steady path.
	Transient            bool
	InjectionTemperature float64
	// MaxTime ends the time grid, s; zero means the time at which 99 % of the
	// mass has evaporated.
	MaxTime float64
	// Steps is the number of log-spaced time points after t = 0; zero means 200.
	Steps int
	// SauterFactors, when not nil, gives per bin the ratio c_i of the
	// Sauter diameter of the drops the bin stands for to its
	// representative diameter d0_i. D32 then counts bin i's drops at c_i
	// times its diameter (they shrink in proportion with the
	// representative drop, the mass following it exactly), with number
	// weight w_i/(c_i d0_i)³: D32 = Σ w_i f_i / Σ w_i f_i/(c_i d_i), f_i
	// the bin's remaining mass fraction, which at t = 0 is the
	// classes' Sauter mean (Σ w_i / Σ w_i/(c_i d0_i)). Nil means 1.
	SauterFactors []float64
}

// History is the evaporation of a spray given as size bins.
type History struct {
	T                      []float64 // time, s; T[0] = 0
	EvaporatedMassFraction []float64 // evaporated mass over initial mass
	D32                    []float64 // Sauter mean diameter of the remaining drops, m (0 once all are gone)
	Dv50                   []float64 // volume median diameter of the remaining drops, m (0 once all are gone)
	// T50, T90, T99 are the times at which 50, 90 and 99 % of the mass has
	// evaporated, s; +Inf (with a warning) when never reached.
	T50, T90, T99 float64
	// CriticalTime is, per bin, the time (s) at which its surface reached
	// the mixture critical point on its transient heating path, or −1;
	// nil without transient heating.
	CriticalTime []float64
	Warnings     []string
	// SurfaceTemperatureMin and Max bound the surface temperatures the
	// transient heating paths passed through (from the injection
	// temperature to where each class joined its steady temperature), K;
	// both 0 without transient heating.
	SurfaceTemperatureMin, SurfaceTemperatureMax float64
}

// Distance converts the time grid into distance travelled at a constant
// spray speed u (m/s): x = u t, in m.
func (h History) Distance(u float64) []float64 {
	x := make([]float64, len(h.T))
	for i, t := range h.T {
		x[i] = u * t
	}
	return x
}

// History follows every size bin of a spray along its own d(t) and sums the
// spray: the evaporated mass fraction 1 − Σ w_i m_i(t)/m_i(0), the Sauter
// mean D32 = Σ n_i d_i³/Σ n_i d_i² with n_i ∝ w_i/d0_i³ and the volume
// median Dv50 of the remaining drops. diameters (m) are the bins'
// representative diameters, strictly increasing; volumeFractions their
// volume (mass) fractions, normalised here. Drops do not interact and the
// gas does not change (dilute spray).
//
// Without Transient all drops of the same conditions share one shrinkage
// curve: the table G(d) of remaining evaporation time is built once by
// cumulative Gauss–Legendre quadrature, and each bin's d(t) solves
// G(d) = G(d0) − t by interpolation, O(bins × steps). Dv50 treats each bin
// as a point mass at its current diameter with the cumulative volume at
// bin i taken as (Σ_{j<i} v_j + v_i/2)/V, interpolated linearly in d.
// Bins that would grow (supersaturated far field, d0 at or above the Kelvin
// equilibrium size) are held at their initial size with a warning.
func (c *Conditions) History(diameters, volumeFractions []float64, opts HistoryOptions) (History, error) {
	s, err := c.NewSpray(diameters, volumeFractions, opts)
	if err != nil {
		return History{}, err
	}
	return s.History(opts.MaxTime)
}

// Spray is a spray prepared for History: the options checked and the shared
// shrinkage table built once, so that the per-bin lifetimes and the history
// come from the same table (see History).
type Spray struct {
	c      *Conditions
	opts   HistoryOptions
	steps  int
	sp     *sprayPaths
	steady sprayPathsState // the steady paths, restored before each History
}

// sprayPathsState is the part of sprayPaths that transient heating changes.
type sprayPathsState struct {
	life, g0, join, scale, dJoin []float64
	heldWeight, shortestLife     float64
}

func (sp *sprayPaths) save() sprayPathsState {
	cp := func(x []float64) []float64 { return append([]float64(nil), x...) }
	return sprayPathsState{cp(sp.life), cp(sp.g0), cp(sp.join), cp(sp.scale), cp(sp.dJoin), sp.heldWeight, sp.shortestLife}
}

func (sp *sprayPaths) restore(s sprayPathsState) {
	copy(sp.life, s.life)
	copy(sp.g0, s.g0)
	copy(sp.join, s.join)
	copy(sp.scale, s.scale)
	copy(sp.dJoin, s.dJoin)
	sp.heldWeight, sp.shortestLife, sp.tr = s.heldWeight, s.shortestLife, nil
}

// NewSpray checks the bins and options as History does and builds the
// spray's shared shrinkage table; opts.MaxTime is checked but the horizon
// is given to Spray.History.
func (c *Conditions) NewSpray(diameters, volumeFractions []float64, opts HistoryOptions) (*Spray, error) {
	if err := c.Validate(); err != nil {
		return nil, err
	}
	w, err := checkBins(diameters, volumeFractions)
	if err != nil {
		return nil, err
	}
	steps := opts.Steps
	if steps == 0 {
		steps = 200
	}
	if steps < 1 || steps > 1000000 {
		return nil, valid.Errorf("history.steps", float64(steps), "must be between 1 and 1000000")
	}
	if err := valid.NonNegative("history.max_time_s", opts.MaxTime); err != nil {
		return nil, err
	}
	tb, _, err := c.upperTemperature()
	if err != nil {
		return nil, err
	}
	if opts.SurfaceTemperature != 0 {
		if opts.Transient {
			return nil, valid.Errorf("history.surface_temperature_k", opts.SurfaceTemperature, "cannot be fixed when transient heating is on")
		}
		if err := valid.Between("history.surface_temperature_k", opts.SurfaceTemperature, 1, tb, "K (the boiling point)"); err != nil {
			return nil, err
		}
	}
	if opts.Transient {
		if err := valid.Between("history.injection_temperature_k", opts.InjectionTemperature, 1, tb, "K (the boiling point)"); err != nil {
			return nil, err
		}
	}

	topFactor := 1.0
	if opts.Transient {
		// Cold drops may first grow by condensation before joining the table.
		topFactor = 1.5
	}
	if opts.SauterFactors != nil && len(opts.SauterFactors) != len(diameters) {
		return nil, valid.Errorf("history.sauter_factors", float64(len(opts.SauterFactors)), "must have one factor per bin (%d)", len(diameters))
	}
	for _, f := range opts.SauterFactors {
		if err := valid.Positive("history.sauter_factors", f); err != nil {
			return nil, err
		}
	}
	sp, err := c.newSprayPaths(diameters, w, opts.SurfaceTemperature, tb, topFactor)
	if err != nil {
		return nil, err
	}
	sp.sauter = opts.SauterFactors
	return &Spray{c: c, opts: opts, steps: steps, sp: sp, steady: sp.save()}, nil
}

// Lifetimes returns each bin's quasi-steady lifetime in s at the fixed or
// steady surface temperature (never the transient path): G(d0) of the
// shared shrinkage table, the same integral t_life = ∫_0^d0 (ρ_L π d²/2)/ṁ(d) dd
// that LifetimeReport evaluates per diameter, here by the table's
// cumulative Gauss–Legendre quadrature and its interpolant between nodes.
// Bins that do not evaporate (at or above the Kelvin equilibrium size) are
// +Inf.
func (s *Spray) Lifetimes() []float64 {
	return append([]float64(nil), s.steady.life...)
}

// History follows the spray to the horizon maxTime (s; zero means the time
// at which 99 % of the mass has evaporated); see Conditions.History.
func (s *Spray) History(maxTime float64) (History, error) {
	return s.HistoryContext(context.Background(), maxTime)
}

// HistoryContext is History that stops when ctx is done: it looks at
// ctx.Err() before each bin's transient path and each time step of the
// sweep, and returns that error (wrapped) with no history.
func (s *Spray) HistoryContext(ctx context.Context, maxTime float64) (History, error) {
	var h History
	if err := valid.NonNegative("history.max_time_s", maxTime); err != nil {
		return h, err
	}
	sp, opts, steps := s.sp, s.opts, s.steps
	sp.restore(s.steady)
	sp.ctx = ctx
	defer func() { sp.ctx = nil }()
	if opts.Transient {
		if err := sp.addTransient(opts.InjectionTemperature, maxTime); err != nil {
			return h, err
		}
		h.SurfaceTemperatureMin, h.SurfaceTemperatureMax = sp.transientTemperatureRange()
		h.CriticalTime = sp.criticalTimes()
	}
	// Every drop's path to zero size passes radii below 5 nm, and for a
	// volatile liquid radii where S·p_sat exceeds the gas pressure; those
	// last nanometres take a negligible share of the lifetime, so the flags
	// they raise say nothing about the spray. The per-class states report
	// them where they matter.
	// A surface held at the mixture critical point is reported per class
	// (DropState.Transcritical, History.CriticalTime), not here.
	h.Warnings = warningText(sp.rate.flags &^ (warnKelvinSmall | warnSurfaceCapped | warnTranscritical))
	if sp.heldWeight > 0 {
		h.Warnings = append(h.Warnings, fmt.Sprintf("%.3g %% of the spray volume is in drops that do not evaporate (at or above the Kelvin equilibrium size, or not within the time considered); without transient heating they are held at their initial size (growth is not modelled)", 100*sp.heldWeight))
	}
	cr := sp.crossings(0.5, 0.9, 0.99)
	h.T50, h.T90, h.T99 = cr[0], cr[1], cr[2]
	for _, x := range []struct {
		t    float64
		name string
	}{{h.T50, "50"}, {h.T90, "90"}, {h.T99, "99"}} {
		if math.IsInf(x.t, 1) {
			h.Warnings = append(h.Warnings, "the spray never reaches "+x.name+" % evaporated in these surroundings")
		}
	}
	tEnd := maxTime
	if tEnd == 0 {
		tEnd = h.T99
		if math.IsInf(tEnd, 1) {
			return h, valid.Errorf("history.max_time_s", 0, "is needed: the spray never reaches 99 %% evaporated under these conditions")
		}
	}
	tFirst := math.Max(tEnd*1e-6, math.Min(tEnd*1e-3, 0.05*sp.shortestLife))
	h.T = make([]float64, steps+1)
	ratio := math.Log(tEnd / tFirst)
	for k := 1; k <= steps; k++ {
		h.T[k] = tFirst * math.Exp(ratio*float64(k-1)/float64(max(steps-1, 1)))
	}
	if steps == 1 {
		h.T[1] = tEnd
	}
	h.T[steps] = tEnd
	h.EvaporatedMassFraction = make([]float64, steps+1)
	h.D32 = make([]float64, steps+1)
	h.Dv50 = make([]float64, steps+1)
	if err := sp.sweep(h.T, h.EvaporatedMassFraction, h.D32, h.Dv50); err != nil {
		return History{}, err
	}
	return h, nil
}

func checkBins(d, w []float64) ([]float64, error) {
	if len(d) == 0 {
		return nil, &valid.FieldError{Field: "history.diameters_m", Message: "no size bins given"}
	}
	if len(w) != len(d) {
		return nil, valid.Errorf("history.volume_fractions", float64(len(w)), "must have one value per diameter (%d)", len(d))
	}
	sum := 0.0
	for i := range d {
		if err := valid.Positive(fmt.Sprintf("history.diameters_m[%d]", i), d[i]); err != nil {
			return nil, err
		}
		if i > 0 && !(d[i] > d[i-1]) {
			return nil, valid.Errorf(fmt.Sprintf("history.diameters_m[%d]", i), d[i], "must be larger than the previous bin (%s)", valid.FormatValue(d[i-1]))
		}
		if err := valid.NonNegative(fmt.Sprintf("history.volume_fractions[%d]", i), w[i]); err != nil {
			return nil, err
		}
		sum += w[i]
	}
	if !(sum > 0) || math.IsInf(sum, 0) {
		return nil, valid.Errorf("history.volume_fractions", sum, "must add up to a positive finite total")
	}
	out := make([]float64, len(w))
	for i := range w {
		out[i] = w[i] / sum
	}
	return out, nil
}

// sprayPaths holds every bin's path: either the shared steady table from
// d0, or a transient start followed by the table.
type sprayPaths struct {
	c            *Conditions
	rate         *rateFunc
	table        *shrinkTable
	d0, w        []float64
	n32          []float64 // number weights w/d0³
	sauter       []float64 // HistoryOptions.SauterFactors (nil: 1)
	life         []float64 // total evaporation time per bin, +Inf when held
	g0           []float64 // G at the point where the bin joins the table
	join         []float64 // time at which the bin joins the table (0 without transient)
	scale        []float64 // remaining mass fraction when it joins
	dJoin        []float64
	tr           []*transientPath
	trCur        []int // step hints into tr, for remaining and the sweep
	heldWeight   float64
	shortestLife float64
	cursor       []int
	dNow         []float64
	// ctx stops a history early (Spray.HistoryContext); nil never stops.
	ctx context.Context
	// directTransient integrates every bin's heating phase on its own even
	// where the scaled shared path or the interpolated paths apply (tests
	// compare them).
	directTransient bool
	// integrated counts the heating phases integrated by the last history.
	integrated int
}

// stopped returns the context's error, wrapped, once the history's context
// is done; a nil context never stops.
func (sp *sprayPaths) stopped() error {
	if sp.ctx == nil {
		return nil
	}
	if err := sp.ctx.Err(); err != nil {
		return fmt.Errorf("evap: history stopped: %w", err)
	}
	return nil
}

func (c *Conditions) newSprayPaths(d0, w []float64, fixedTs, tb, topFactor float64) (*sprayPaths, error) {
	n := len(d0)
	sp := &sprayPaths{c: c, rate: newRateFunc(c, fixedTs, tb), d0: d0, w: w,
		n32: make([]float64, n), life: make([]float64, n), g0: make([]float64, n),
		join: make([]float64, n), scale: make([]float64, n), dJoin: make([]float64, n),
		cursor: make([]int, n), dNow: make([]float64, n), shortestLife: math.Inf(1)}
	// Bins at or above the equilibrium size do not evaporate; ṁ(d) falls
	// with d, so they are the largest ones.
	top := n - 1
	for ; top >= 0; top-- {
		m, _, err := sp.rate.at(d0[top])
		if err != nil {
			return nil, err
		}
		if m > 0 {
			break
		}
	}
	for i := range d0 {
		sp.n32[i] = w[i] / (d0[i] * d0[i] * d0[i])
		sp.scale[i], sp.dJoin[i] = 1, d0[i]
		if i > top {
			sp.life[i] = math.Inf(1)
			sp.heldWeight += w[i]
		}
	}
	if top < 0 {
		return sp, nil
	}
	sp.rate.guess = 0
	dTop := d0[top] * topFactor
	if top < n-1 {
		dTop = math.Min(dTop, d0[top+1])
	}
	table, ok, err := buildShrinkTable(sp.rate, d0[0]*1e-3, dTop)
	if err != nil {
		return nil, err
	}
	if !ok {
		return nil, fmt.Errorf("evap: the evaporation rate changes sign below %s m; the shrinkage table cannot be built", valid.FormatValue(d0[top]))
	}
	sp.table = table
	for i := 0; i <= top; i++ {
		sp.g0[i] = table.evaporationTime(d0[i])
		sp.life[i] = sp.g0[i]
		sp.shortestLife = math.Min(sp.shortestLife, sp.life[i])
	}
	return sp, nil
}

// state returns bin i's diameter (m) and remaining mass fraction at time t.
func (sp *sprayPaths) state(i int, t float64, cursor *int) (d, frac float64) {
	if math.IsInf(sp.life[i], 1) && sp.tr == nil {
		return sp.d0[i], 1
	}
	if sp.tr != nil && sp.tr[i] != nil && t < sp.join[i] {
		return sp.tr[i].at(t)
	}
	if math.IsInf(sp.g0[i], 1) || sp.table == nil || t <= sp.join[i] {
		// At the moment it joins the table (t = 0 without transient
		// heating) a bin is at its joining state exactly, not at the
		// table's round trip of it.
		return sp.dJoin[i], sp.scale[i]
	}
	d = sp.table.diameter(sp.g0[i]-(t-sp.join[i]), cursor)
	r := d / sp.dJoin[i]
	return d, sp.scale[i] * r * r * r
}

// remaining returns the remaining mass fraction of the spray at time t.
func (sp *sprayPaths) remaining(t float64) float64 {
	m := 0.0
	for i := range sp.d0 {
		var f float64
		if sp.tr != nil && sp.tr[i] != nil && t < sp.join[i] {
			// state's transient branch, without the diameter; the
			// scan's times increase, so each path's step is walked.
			f = sp.tr[i].fraction(t, &sp.trCur[i])
		} else {
			// Each bin keeps its table cursor between calls: the root
			// search's times close in, so the hint mostly holds.
			_, f = sp.state(i, t, &sp.cursor[i])
		}
		m += sp.w[i] * f
	}
	return m
}

// crossings returns, for each level x, the first time at which the
// evaporated fraction reaches x, or +Inf. Without transient heating the
// remaining mass falls monotonically and Brent's method on [0, longest
// life] finds it; with it a log-spaced scan brackets the first crossing
// first. The scan is shared by all levels: each grid point's remaining mass
// is computed once and every level takes the first grid interval where it
// crosses, the bracket a scan per level would find.
func (sp *sprayPaths) crossings(xs ...float64) []float64 {
	out := make([]float64, len(xs))
	tMax := 0.0
	for i, l := range sp.life {
		if sp.w[i] > 0 && !math.IsInf(l, 1) {
			tMax = math.Max(tMax, l)
		}
	}
	if tMax == 0 {
		for k := range out {
			out[k] = math.Inf(1)
		}
		return out
	}
	remEnd, rem0 := sp.remaining(tMax), sp.remaining(0)
	type bracket struct{ lo, hi, flo, fhi float64 }
	br := make([]bracket, len(xs))
	open := 0 // levels still looking for their first crossing in the scan
	for k, x := range xs {
		br[k] = bracket{0, tMax, rem0 - (1 - x), remEnd - (1 - x)}
		if br[k].fhi > 0 {
			out[k] = math.Inf(1)
			continue
		}
		open++
	}
	if sp.tr != nil && open > 0 {
		const n = 400
		t0 := math.Min(sp.shortestLife, tMax) * 1e-3
		found := make([]bool, len(xs))
		prev, remPrev := 0.0, rem0
		for j := 0; j <= n && open > 0; j++ {
			t := t0 * math.Pow(tMax/t0, float64(j)/n)
			rem := sp.remaining(t)
			for k, x := range xs {
				if math.IsInf(out[k], 1) || found[k] {
					continue
				}
				if ft := rem - (1 - x); ft <= 0 {
					br[k] = bracket{prev, t, remPrev - (1 - x), ft}
					found[k] = true
					open--
				}
			}
			prev, remPrev = t, rem
		}
	}
	for k, x := range xs {
		if math.IsInf(out[k], 1) {
			continue
		}
		f := func(t float64) float64 { return sp.remaining(t) - (1 - x) }
		t, err := brent(f, br[k].lo, br[k].hi, br[k].flo, br[k].fhi, 1e-12*tMax)
		if err != nil {
			t = math.Inf(1)
		}
		out[k] = t
	}
	return out
}

// sweep fills the spray statistics on the increasing time grid ts; it
// returns early with sp.stopped's error when the context is done.
func (sp *sprayPaths) sweep(ts, evap, d32, dv50 []float64) error {
	n := len(sp.d0)
	vol := make([]float64, n)
	for i := range sp.cursor {
		sp.cursor[i] = -1
	}
	if sp.tr == nil && sp.table != nil {
		return sp.sweepSteady(ts, evap, d32, dv50, vol)
	}
	for i := range sp.trCur {
		sp.trCur[i] = -1 // each heating path's step, walked forward from here
	}
	for k, t := range ts {
		if err := sp.stopped(); err != nil {
			return err
		}
		rem, s3, s2, ev := 0.0, 0.0, 0.0, 0.0
		for i := 0; i < n; i++ {
			var d, f float64
			if sp.tr != nil && sp.tr[i] != nil && t < sp.join[i] {
				d, f = sp.tr[i].atFrom(t, &sp.trCur[i])
			} else {
				d, f = sp.state(i, t, &sp.cursor[i])
			}
			v := sp.w[i] * f
			vol[i] = v
			rem += v
			ev += sp.w[i] * (1 - f)
			if d > 0 {
				// Number weight is conserved: n_i d³ scales with the
				// remaining mass, and d² follows from d.
				s3 += v
				if sp.sauter != nil {
					s2 += v / (sp.sauter[i] * d)
				} else {
					s2 += v / d
				}
			}
			sp.dNow[i] = d
		}
		evap[k] = math.Max(0, ev)
		if s2 > 0 {
			d32[k] = s3 / s2
		}
		dv50[k] = volumeMedian(sp.dNow, vol, rem)
	}
	return nil
}

// sweepSteady is sweep without transient heating: every bin that
// evaporates follows the table from d0, and since G grows with d the bins
// whose lifetime has passed form a prefix that stays gone. It computes what
// state does for each bin, with the table lookup inlined.
func (sp *sprayPaths) sweepSteady(ts, evap, d32, dv50, vol []float64) error {
	n := len(sp.d0)
	tb := sp.table
	// Per bin: ln d0, so that d/d0 = e^(u − ln d0) needs no division, and
	// w/d0, so that the bin's share of Σ n d² is (w/d0)(d/d0)².
	lnD0 := make([]float64, n)
	wOverD0 := make([]float64, n)
	for i, d := range sp.d0 {
		lnD0[i], wOverD0[i] = math.Log(d), sp.w[i]/d
		if sp.sauter != nil {
			wOverD0[i] = sp.w[i] / (sp.sauter[i] * d)
		}
	}
	gone := 0 // bins [0, gone) have evaporated
	evGone := 0.0
	for k, t := range ts {
		if err := sp.stopped(); err != nil {
			return err
		}
		for gone < n && sp.life[gone] <= t {
			vol[gone], sp.dNow[gone] = 0, 0
			evGone += sp.w[gone]
			gone++
		}
		// The evaporated fraction is summed as Σ w (1 − (d/d0)³), not
		// 1 − Σ w (d/d0)³, which cancels to rounding noise at early times.
		rem, s2, ev := 0.0, 0.0, evGone
		for i := gone; i < n; i++ {
			if math.IsInf(sp.life[i], 1) {
				v := sp.w[i]
				vol[i], sp.dNow[i] = v, sp.d0[i]
				rem += v
				s2 += wOverD0[i]
				continue
			}
			r := 1.0 // at t = 0 the initial state exactly (see state)
			if t > 0 {
				r = 0
				if tau := sp.g0[i] - t; tau > 0 {
					r = expFast(tb.lnDAt(logFast(tau), &sp.cursor[i]) - lnD0[i])
				}
			}
			f := r * r * r
			v := sp.w[i] * f
			vol[i], sp.dNow[i] = v, r*sp.d0[i]
			rem += v
			ev += sp.w[i] * (1 - f)
			s2 += wOverD0[i] * (r * r)
		}
		evap[k] = math.Max(0, ev)
		if s2 > 0 {
			d32[k] = rem / s2
		}
		dv50[k] = volumeMedian(sp.dNow, vol, rem)
	}
	return nil
}

// volumeMedian returns the diameter below which half of the volume vol
// (of total v) lies; see volumeQuantile.
func volumeMedian(d, vol []float64, v float64) float64 {
	return volumeQuantile(d, vol, v, 0.5)
}

// volumeQuantile returns the diameter below which the fraction q of the
// volume vol (of total v) lies, treating each bin as a point at d with the
// cumulative volume at bin i taken at its midpoint and interpolating
// linearly in d; bins are in increasing d. q is clamped to [0, 1].
func volumeQuantile(d, vol []float64, v, q float64) float64 {
	if !(v > 0) {
		return 0
	}
	at := math.Min(1, math.Max(0, q)) * v
	cum := 0.0
	prevD, prevC := 0.0, -1.0
	for i := range d {
		if vol[i] <= 0 {
			continue
		}
		c := cum + 0.5*vol[i]
		if c >= at {
			if prevC < 0 {
				return d[i]
			}
			return prevD + (d[i]-prevD)*(at-prevC)/(c-prevC)
		}
		prevD, prevC = d[i], c
		cum += vol[i]
	}
	return prevD
}
