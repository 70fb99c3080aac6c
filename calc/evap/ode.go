package evap

import (
	"errors"
	"math"
)

// Dormand–Prince 5(4) coefficients: Dormand & Prince (1980), J. Comput.
// Appl. Math. 6(1), 19–26, Table 2 (also Hairer, Nørsett & Wanner, Solving
// Ordinary Differential Equations I, 2nd ed., Table 5.2 of ch. II).
const (
	dpC2, dpC3, dpC4, dpC5 = 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9

	dpA21                          = 1.0 / 5
	dpA31, dpA32                   = 3.0 / 40, 9.0 / 40
	dpA41, dpA42, dpA43            = 44.0 / 45, -56.0 / 15, 32.0 / 9
	dpA51, dpA52, dpA53, dpA54     = 19372.0 / 6561, -25360.0 / 2187, 64448.0 / 6561, -212.0 / 729
	dpA61, dpA62, dpA63, dpA64     = 9017.0 / 3168, -355.0 / 33, 46732.0 / 5247, 49.0 / 176
	dpA65                          = -5103.0 / 18656
	dpB1, dpB3, dpB4, dpB5, dpB6   = 35.0 / 384, 500.0 / 1113, 125.0 / 192, -2187.0 / 6784, 11.0 / 84
	dpE1, dpE3, dpE4, dpE5, dpE6   = 71.0 / 57600, -71.0 / 16695, 71.0 / 1920, -17253.0 / 339200, 22.0 / 525
	dpE7                           = -1.0 / 40
	dpSafety, dpMinScale, dpMaxScl = 0.9, 0.2, 5.0
)

// odeFunc evaluates dy/dt into dy.
type odeFunc func(t float64, y, dy []float64) error

// odeStepper integrates y' = f(t, y) by the embedded Runge–Kutta pair of
// Dormand & Prince: a 5th-order solution with a 4th-order error estimate,
// first-same-as-last, step size from the RMS of the scaled error with
// exponent 1/5 (Hairer, Nørsett & Wanner, ch. II.4, eq. 4.11–4.13).
type odeStepper struct {
	f          odeFunc
	rtol       float64
	atol       []float64
	k          [7][]float64
	yTmp, yNew []float64
	steps      int
}

var errStepTooSmall = errors.New("evap: ODE step size underflow")

func newODEStepper(f odeFunc, n int, rtol float64, atol []float64) *odeStepper {
	s := &odeStepper{f: f, rtol: rtol, atol: atol, yTmp: make([]float64, n), yNew: make([]float64, n)}
	for i := range s.k {
		s.k[i] = make([]float64, n)
	}
	return s
}

// run advances y from t0 towards tEnd with a first step h. After every
// accepted step it calls after(t, y, dy) with the new state and derivative;
// when after returns true the integration stops. It returns the final time.
// y is updated in place.
//
// An error of f at a trial stage (a stage state the step overshot to, such
// as a drop temperature past the liquid's critical point or a negative
// mass) rejects the step like a too-large error estimate: the step shrinks
// by dpMinScale and is tried again, as a recoverable right-hand-side
// failure is treated in adaptive solvers (Hindmarsh et al., ACM TOMS 31(3),
// 2005, CVODE's recoverable f errors). Only an error at the starting state,
// or one that persists until the step underflows, is returned; the latter
// is the stage's own error, not errStepTooSmall.
func (s *odeStepper) run(t0, tEnd float64, y []float64, h float64, after func(t float64, y, dy []float64) bool) (float64, error) {
	n := len(y)
	k := &s.k
	t := t0
	if err := s.f(t, y, k[0]); err != nil {
		return t, err
	}
	var stageErr error // the last trial-stage error since the last accepted step
	rejected := 0      // steps rejected in a row
	for t < tEnd {
		if t+h > tEnd {
			h = tEnd - t
		}
		// 0.2^100 = 1e-70: a hundred rejections in a row leave no step
		// size that could still succeed.
		if h <= 1e-14*math.Abs(t) || h <= 0 || rejected > 100 {
			if stageErr != nil {
				return t, stageErr
			}
			return t, errStepTooSmall
		}
		stage := func(dst []float64, c float64, coef ...float64) error {
			for i := 0; i < n; i++ {
				acc := 0.0
				for j, a := range coef {
					acc += a * k[j][i]
				}
				s.yTmp[i] = y[i] + h*acc
			}
			return s.f(t+c*h, s.yTmp, dst)
		}
		err := stage(k[1], dpC2, dpA21)
		if err == nil {
			err = stage(k[2], dpC3, dpA31, dpA32)
		}
		if err == nil {
			err = stage(k[3], dpC4, dpA41, dpA42, dpA43)
		}
		if err == nil {
			err = stage(k[4], dpC5, dpA51, dpA52, dpA53, dpA54)
		}
		if err == nil {
			err = stage(k[5], 1, dpA61, dpA62, dpA63, dpA64, dpA65)
		}
		if err == nil {
			for i := 0; i < n; i++ {
				s.yNew[i] = y[i] + h*(dpB1*k[0][i]+dpB3*k[2][i]+dpB4*k[3][i]+dpB5*k[4][i]+dpB6*k[5][i])
			}
			err = s.f(t+h, s.yNew, k[6])
		}
		if err != nil {
			stageErr = err
			rejected++
			h *= dpMinScale
			continue
		}
		errNorm := 0.0
		for i := 0; i < n; i++ {
			e := h * (dpE1*k[0][i] + dpE3*k[2][i] + dpE4*k[3][i] + dpE5*k[4][i] + dpE6*k[5][i] + dpE7*k[6][i])
			sc := s.atol[i] + s.rtol*math.Max(math.Abs(y[i]), math.Abs(s.yNew[i]))
			errNorm += (e / sc) * (e / sc)
		}
		errNorm = math.Sqrt(errNorm / float64(n))
		if math.IsNaN(errNorm) {
			rejected++
			h *= dpMinScale
			continue
		}
		scale := dpMaxScl
		if errNorm > 0 {
			scale = math.Min(dpMaxScl, math.Max(dpMinScale, dpSafety*math.Pow(errNorm, -0.2)))
		}
		if errNorm <= 1 {
			t += h
			copy(y, s.yNew)
			k[0], k[6] = k[6], k[0] // first same as last
			s.steps++
			stageErr, rejected = nil, 0
			if after != nil && after(t, y, k[0]) {
				return t, nil
			}
		} else {
			rejected++
			scale = math.Min(scale, 1)
		}
		h *= scale
	}
	return t, nil
}
