package evap

import (
	"errors"
	"math"
)

// Gauss–Kronrod 7/15 nodes and weights on [−1, 1], from QUADPACK's qk15
// (Piessens et al., QUADPACK, Springer 1983). Index 7 is the centre; odd
// indices are the Gauss nodes.
var (
	gkNodes = [8]float64{
		0.991455371120812639206854697526329, 0.949107912342758524526189684047851,
		0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
		0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
		0.207784955007898467600689403773245, 0,
	}
	gkWeights = [8]float64{
		0.022935322010529224963732008058970, 0.063092092629978553290700663189204,
		0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
		0.169004726639267902826583426598550, 0.190350578064785409913256402421014,
		0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
	}
	gaussWeights7 = [4]float64{ // for gkNodes[1], [3], [5], [7]
		0.129484966168869693270611432679082, 0.279705391489276667901467771423780,
		0.381830050505118944950369775488975, 0.417959183673469387755102040816327,
	}
)

// kronrod15 returns the 15-point Kronrod estimate of ∫f over [a, b] and the
// difference to the embedded 7-point Gauss estimate as its error estimate.
func kronrod15(f func(float64) float64, a, b float64) (k, errEst float64) {
	c, h := 0.5*(a+b), 0.5*(b-a)
	fc := f(c)
	k = gkWeights[7] * fc
	g := gaussWeights7[3] * fc
	for i := 0; i < 7; i++ {
		x := h * gkNodes[i]
		s := f(c-x) + f(c+x)
		k += gkWeights[i] * s
		if i%2 == 1 {
			g += gaussWeights7[i/2] * s
		}
	}
	return k * h, math.Abs((k - g) * h)
}

var errQuadrature = errors.New("evap: adaptive quadrature did not reach its tolerance")

// integrate returns ∫f over [a, b] by globally adaptive Gauss–Kronrod 7/15
// quadrature (the QUADPACK qag strategy): the interval with the largest
// error estimate is bisected until the summed estimate is below
// max(absTol, relTol·|I|). Gauss–Kronrod never evaluates the end points,
// so integrable end singularities are allowed. It also returns the summed
// error estimate.
func integrate(f func(float64) float64, a, b, relTol, absTol float64) (float64, float64, error) {
	type piece struct{ a, b, v, e float64 }
	const maxPieces = 2000
	v, e := kronrod15(f, a, b)
	ps := make([]piece, 1, 64)
	ps[0] = piece{a, b, v, e}
	total, errSum := v, e
	for len(ps) < maxPieces {
		if errSum <= math.Max(absTol, relTol*math.Abs(total)) || math.IsNaN(total) {
			break
		}
		worst := 0
		for i := range ps {
			if ps[i].e > ps[worst].e {
				worst = i
			}
		}
		w := ps[worst]
		m := 0.5 * (w.a + w.b)
		v1, e1 := kronrod15(f, w.a, m)
		v2, e2 := kronrod15(f, m, w.b)
		ps[worst] = piece{w.a, m, v1, e1}
		ps = append(ps, piece{m, w.b, v2, e2})
		// Re-sum rather than update to keep rounding from drifting.
		total, errSum = 0, 0
		for _, p := range ps {
			total += p.v
			errSum += p.e
		}
	}
	if math.IsNaN(total) || math.IsInf(total, 0) {
		return total, errSum, errors.New("evap: integrand is not finite")
	}
	if errSum > math.Max(absTol, relTol*math.Abs(total)) {
		return total, errSum, errQuadrature
	}
	return total, errSum, nil
}

// Five-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz &
// Stegun, Table 25.4); exact for polynomials up to degree 9.
var (
	gl5Nodes   = [5]float64{-0.906179845938663992797626878299392, -0.538469310105683091036314420700208, 0, 0.538469310105683091036314420700208, 0.906179845938663992797626878299392}
	gl5Weights = [5]float64{0.236926885056189087514264040719917, 0.478628670499366468041291514835638, 0.568888888888888888888888888888889, 0.478628670499366468041291514835638, 0.236926885056189087514264040719917}
)
