package evap

import "math"

// tableNodesPerDecade sets the ln d spacing of the shrinkage table.
const tableNodesPerDecade = 16

// shrinkTable holds G(d) = ∫_0^d (ρ_L π d'²/2)/ṁ(d') dd', the time a drop of
// diameter d needs to evaporate. Every drop of the same conditions follows
// the same d(t) curve, shifted in time, so a drop that starts at d0 has
// diameter d(t) with G(d) = G(d0) − t.
//
// Nodes are uniform in u = ln d. Between nodes u is a cubic Hermite
// function of v = ln G with the exact slopes du/dv = G/g, where
// g = dG/du = ρ_L π d³/(2 ṁ); the same interpolant serves both directions,
// so inverse and forward lookups agree. A pure power law (the d² law) is
// reproduced exactly. Below the first node G ∝ d^p0 with the local exponent
// there.
type shrinkTable struct {
	u, v, q []float64 // ln d, ln G, du/dv at the nodes
	p0      float64
	seg     []hermiteSegment // node interval j, for lnD
}

// hermiteSegment is the cubic Hermite of one node interval in monomial
// form, u = a0 + x(a1 + x(a2 + x a3)) with x = (v − v0)·invH: the sweep
// evaluates it once per bin and time step, and the Lagrange form cost a
// division and twice the multiplications.
type hermiteSegment struct {
	v0, invH, a0, a1, a2, a3 float64
}

// setSegments fills tb.seg from the nodes.
func (tb *shrinkTable) setSegments() {
	tb.seg = make([]hermiteSegment, len(tb.u)-1)
	for j := range tb.seg {
		H := tb.v[j+1] - tb.v[j]
		u0, u1, m0, m1 := tb.u[j], tb.u[j+1], H*tb.q[j], H*tb.q[j+1]
		tb.seg[j] = hermiteSegment{v0: tb.v[j], invH: 1 / H, a0: u0, a1: m0,
			a2: 3*(u1-u0) - 2*m0 - m1, a3: 2*(u0-u1) + m0 + m1}
	}
}

// buildShrinkTable integrates G over [dLo, dHi] with five-point
// Gauss–Legendre on each node interval; rate supplies ṁ and ρ_L. It
// returns ok = false when ṁ ≤ 0 somewhere (the drop would not evaporate).
//
// With the steady surface temperature the nodes are solved first, each
// from the linear extrapolation of the two before it, and every
// Gauss–Legendre point from the cubic through the four nearest nodes'
// temperatures (see rateFunc.atNear): the guesses only start the solve,
// whose acceptance test bounds the rate's error, so the table is the one
// the bracketing solver gives to about 1e-11 (TestShrinkTableNearMatchesExact).
func buildShrinkTable(rate *rateFunc, dLo, dHi float64) (*shrinkTable, bool, error) {
	u0, u1 := math.Log(dLo), math.Log(dHi)
	n := int(math.Ceil((u1 - u0) / (math.Ln10 / tableNodesPerDecade)))
	if n < 2 {
		n = 2
	}
	h := (u1 - u0) / float64(n)
	tb := &shrinkTable{u: make([]float64, n+1), v: make([]float64, n+1), q: make([]float64, n+1)}
	g := func(u, guess float64) (float64, bool, error) {
		d := math.Exp(u)
		m, rho, err := rate.atNear(d, guess)
		if err != nil {
			return 0, false, err
		}
		if !(m > 0) {
			return 0, false, nil
		}
		return rho * math.Pi * d * d * d / (2 * m), true, nil
	}
	gn := make([]float64, n+1)
	nodeT := make([]float64, n+1)
	for j := 0; j <= n; j++ {
		u := u0 + float64(j)*h
		if j == n {
			u = u1
		}
		tb.u[j] = u
		guess := 0.0
		switch {
		case j >= 2:
			guess = 2*nodeT[j-1] - nodeT[j-2]
		case j == 1:
			guess = nodeT[0]
		}
		var ok bool
		var err error
		if gn[j], ok, err = g(u, guess); err != nil || !ok {
			return nil, ok, err
		}
		nodeT[j] = rate.lastT
	}
	G := 0.0
	for j := 1; j <= n; j++ {
		u := tb.u[j]
		if j == 1 {
			// Tail below the first node from the local power law g ∝ d^p0.
			tb.p0 = math.Min(4, math.Max(0.5, math.Log(gn[1]/gn[0])/h))
			G = gn[0] / tb.p0
			tb.v[0], tb.q[0] = math.Log(G), G/gn[0]
		}
		mid := 0.5 * (tb.u[j-1] + u)
		half := 0.5 * (u - tb.u[j-1])
		k0 := min(max(j-2, 0), n-3) // the four nodes around interval j
		sum := 0.0
		for k, x := range gl5Nodes {
			uk := mid + half*x
			guess := 0.0
			if n >= 3 {
				guess = cubicThrough(nodeT[k0:k0+4], (uk-tb.u[k0])/h)
			}
			gk, ok, err := g(uk, guess)
			if err != nil || !ok {
				return nil, ok, err
			}
			sum += gl5Weights[k] * gk
		}
		G += half * sum
		tb.v[j], tb.q[j] = math.Log(G), G/gn[j]
	}
	tb.setSegments()
	return tb, true, nil
}

// cubicThrough is the cubic through y[0..3] at x = 0, 1, 2, 3 (Lagrange
// form), evaluated at x.
func cubicThrough(y []float64, x float64) float64 {
	a, b, c := x-1, x-2, x-3
	return -y[0]*a*b*c/6 + y[1]*x*b*c/2 - y[2]*x*a*c/2 + y[3]*x*a*b/6
}

// lnD returns ln d on node interval j for v = ln G (cubic Hermite).
func (tb *shrinkTable) lnD(j int, v float64) float64 {
	s := &tb.seg[j]
	x := (v - s.v0) * s.invH
	return s.a0 + x*(s.a1+x*(s.a2+x*s.a3))
}

// diameter returns d for a remaining evaporation time tau (s); tau ≤ 0
// means the drop is gone. *cursor is a node index hint that callers
// walking towards smaller tau keep between calls. It takes ln tau by
// logFast and e^u by expFast (within a few ulp of math.Log and math.Exp),
// as sweepSteady does.
func (tb *shrinkTable) diameter(tau float64, cursor *int) float64 {
	if !(tau > 0) {
		return 0
	}
	return expFast(tb.lnDAt(logFast(tau), cursor))
}

// lnDAt returns ln d at v = ln G: the Hermite of the interval holding v,
// found from the hint *cursor (that interval or the one below, the usual
// cases in a sweep, else by bisection), or below the first node the
// power-law tail.
func (tb *shrinkTable) lnDAt(v float64, cursor *int) float64 {
	if v <= tb.v[0] {
		return tb.u[0] + (v-tb.v[0])/tb.p0
	}
	last := len(tb.v) - 2
	j := *cursor
	if j < 0 || j > last || v < tb.v[j] || v > tb.v[j+1] {
		if j >= 1 && j <= last && v < tb.v[j] && v >= tb.v[j-1] {
			j--
		} else {
			j = tb.search(v)
		}
	}
	*cursor = j
	return tb.lnD(j, v)
}

func (tb *shrinkTable) search(v float64) int {
	lo, hi := 0, len(tb.v)-2
	if v >= tb.v[hi+1] {
		return hi
	}
	for lo < hi {
		m := (lo + hi + 1) / 2
		if tb.v[m] <= v {
			lo = m
		} else {
			hi = m - 1
		}
	}
	return lo
}

// evaporationTime returns G(d) by inverting the Hermite interpolant on the
// interval that holds ln d (bisection to 1e-13 in the interval coordinate).
func (tb *shrinkTable) evaporationTime(d float64) float64 {
	u := math.Log(d)
	if u <= tb.u[0] {
		return math.Exp(tb.v[0] + tb.p0*(u-tb.u[0]))
	}
	h := tb.u[1] - tb.u[0]
	j := int((u - tb.u[0]) / h)
	if j > len(tb.u)-2 {
		j = len(tb.u) - 2
	}
	for j > 0 && u < tb.u[j] {
		j--
	}
	for j < len(tb.u)-2 && u > tb.u[j+1] {
		j++
	}
	lo, hi := tb.v[j], tb.v[j+1]
	for i := 0; i < 60 && hi-lo > 1e-13*math.Max(1, math.Abs(lo)); i++ {
		m := 0.5 * (lo + hi)
		if tb.lnD(j, m) < u {
			lo = m
		} else {
			hi = m
		}
	}
	return math.Exp(0.5 * (lo + hi))
}
