package sizedist

import (
	"math"

	"gonum.org/v1/gonum/integrate/quad"

	"fogbench/calc/valid"
)

// UpperLimit is the upper-limit distribution of Mugele & Evans (1951), Ind.
// Eng. Chem. 43(6) 1317–1324: a normal distribution on a volume basis in the
// transformed variable
//
//	y = ln[a D / (D_m − D)],   a = (D_m − Dv50)/Dv50,
//	dQ3/dy = (δ/√π) exp(−δ² y²),  so Q3(D) = [1 + erf(δ y)]/2,
//
// for 0 < D < D_m (form from memory, the 1951 paper not read; the SMD
// relation is derived below and checked by quadrature in the tests). DMax is
// the largest drop (m), Dv50 the volume median (m), Delta the spread δ
// (dimensionless, larger is narrower).
type UpperLimit struct{ DMax, Dv50, Delta float64 }

// Name is "upper-limit".
func (UpperLimit) Name() string { return "upper-limit" }

// Validate asks for 0 < Dv50 < DMax (m) and 0 < δ ≤ 100.
func (u UpperLimit) Validate() error {
	if err := valid.Positive("distribution.dv50_m", u.Dv50); err != nil {
		return err
	}
	if err := valid.Positive("distribution.d_max_m", u.DMax); err != nil {
		return err
	}
	if u.DMax <= u.Dv50 {
		return valid.Errorf("distribution.d_max_m", u.DMax, "must be above the volume median diameter %s m", valid.FormatValue(u.Dv50))
	}
	if err := valid.Positive("distribution.delta", u.Delta); err != nil {
		return err
	}
	if u.Delta > 100 {
		return valid.Errorf("distribution.delta", u.Delta, "must be at most 100")
	}
	return nil
}

func (u UpperLimit) a() float64 { return (u.DMax - u.Dv50) / u.Dv50 }

func (u UpperLimit) y(D float64) float64 { return math.Log(u.a() * D / (u.DMax - D)) }

// VolumeCDF is Q3(D) = [1 + erf(δ y)]/2; 0 for D ≤ 0, 1 for D ≥ D_m.
func (u UpperLimit) VolumeCDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	if D >= u.DMax {
		return 1
	}
	return 0.5 * math.Erfc(-u.Delta*u.y(D))
}

// VolumeSF is 1 − Q3(D) = erfc(δ y)/2.
func (u UpperLimit) VolumeSF(D float64) float64 {
	if !(D > 0) {
		return 1
	}
	if D >= u.DMax {
		return 0
	}
	return 0.5 * math.Erfc(u.Delta*u.y(D))
}

// VolumePDF is q3(D) = (δ/√π) exp(−δ²y²) · D_m/(D (D_m − D)) in 1/m, using
// dy/dD = D_m/(D (D_m − D)); 0 outside (0, D_m).
func (u UpperLimit) VolumePDF(D float64) float64 {
	if !(D > 0) || D >= u.DMax {
		return 0
	}
	y := u.y(D)
	return u.Delta / math.Sqrt(math.Pi) * math.Exp(-u.Delta*u.Delta*y*y) * u.DMax / (D * (u.DMax - D))
}

// NumberPDF is q0(D) = q3(D) D^-3 / E3[D^-3] in 1/m.
func (u UpperLimit) NumberPDF(D float64) float64 {
	if !(D > 0) || D >= u.DMax {
		return 0
	}
	lm3, err := u.logVolumeMoment(-3)
	if err != nil {
		return 0
	}
	return u.VolumePDF(D) * math.Exp(-3*math.Log(D)-lm3)
}

// logVolumeMoment is ln E3[D^k], the volume-weighted mean of D^k in m^k.
// With D = D_m / (1 + a e^−y) and y normal with variance 1/(2δ²), a
// non-positive integer k = −m has the closed form (binomial expansion and
// E[e^(−j y)] = exp(j²/(4δ²)))
//
//	E3[D^−m] = D_m^−m Σ_{j=0..m} C(m,j) a^j exp(j²/(4δ²)),
//
// which gives SMD = 1/E3[D^−1] = D_m / (1 + a exp(1/(4δ²))). Other k are
// integrated by 200-point Gauss–Legendre quadrature over ±12 standard
// deviations of y.
func (u UpperLimit) logVolumeMoment(k float64) (float64, error) {
	a := u.a()
	if k <= 0 && k == math.Trunc(k) && k >= -64 {
		m := int(-k)
		// log-sum-exp over j of ln C(m,j) + j ln a + j²/(4δ²).
		terms := make([]float64, m+1)
		top := math.Inf(-1)
		for j := 0; j <= m; j++ {
			lc, _ := math.Lgamma(float64(m + 1))
			l1, _ := math.Lgamma(float64(j + 1))
			l2, _ := math.Lgamma(float64(m - j + 1))
			terms[j] = lc - l1 - l2 + float64(j)*math.Log(a) + float64(j*j)/(4*u.Delta*u.Delta)
			top = math.Max(top, terms[j])
		}
		var s float64
		for _, t := range terms {
			s += math.Exp(t - top)
		}
		return k*math.Log(u.DMax) + top + math.Log(s), nil
	}
	sy := 1 / (math.Sqrt2 * u.Delta)
	f := func(z float64) float64 {
		lnD := math.Log(u.DMax) - math.Log1p(a*math.Exp(-sy*z))
		return math.Exp(-z*z/2+k*lnD) / math.Sqrt(2*math.Pi)
	}
	m := quad.Fixed(f, -12, 12, 200, quad.Legendre{}, 0)
	if !(m > 0) || math.IsInf(m, 0) {
		return 0, valid.Errorf("distribution.delta", u.Delta, "volume moment of order %g cannot be evaluated for this spread", k)
	}
	return math.Log(m), nil
}

// MeanDiameter is D_pq in m from the volume moments (number moment of order
// p = volume moment of order p − 3):
//
//	D_pq = [E3[D^(p−3)] / E3[D^(q−3)]]^(1/(p−q)),
//	D_pp = exp(E3[D^(p−3) ln D] / E3[D^(p−3)]).
//
// All orders exist because 0 < D < D_m and the lower tail is log-normal-like.
// Integer p, q ≤ 3 use the closed form of logVolumeMoment; others and the
// geometric limit use quadrature (accurate to about 1e-12 relative).
func (u UpperLimit) MeanDiameter(p, q float64) (float64, error) {
	if err := checkOrders(p, q); err != nil {
		return 0, err
	}
	if err := u.Validate(); err != nil {
		return 0, err
	}
	if p == q {
		a, sy, k := u.a(), 1/(math.Sqrt2*u.Delta), p-3
		lnDm := math.Log(u.DMax)
		// Weights relative to the central value keep exp() in range.
		f := func(z float64, withLog bool) float64 {
			lnD := lnDm - math.Log1p(a*math.Exp(-sy*z))
			w := math.Exp(-z*z/2 + k*(lnD-lnDm))
			if withLog {
				return w * lnD
			}
			return w
		}
		num := quad.Fixed(func(z float64) float64 { return f(z, true) }, -12, 12, 200, quad.Legendre{}, 0)
		den := quad.Fixed(func(z float64) float64 { return f(z, false) }, -12, 12, 200, quad.Legendre{}, 0)
		d := math.Exp(num / den)
		if !(d > 0) || math.IsInf(d, 0) {
			return 0, valid.Errorf("distribution.delta", u.Delta, "D%s%s cannot be evaluated for this spread", fmtOrder(p), fmtOrder(q))
		}
		return d, nil
	}
	lp, err := u.logVolumeMoment(p - 3)
	if err != nil {
		return 0, err
	}
	lq, err := u.logVolumeMoment(q - 3)
	if err != nil {
		return 0, err
	}
	d := math.Exp((lp - lq) / (p - q))
	if !(d > 0) || math.IsInf(d, 0) {
		return 0, valid.Errorf("distribution.delta", u.Delta, "D%s%s cannot be evaluated for this spread", fmtOrder(p), fmtOrder(q))
	}
	return d, nil
}

// VolumeQuantile is Dv_F = D_m / (1 + a e^−y) with y = erfinv(2F − 1)/δ, in
// m; 0 for F ≤ 0 or NaN and D_m for F ≥ 1.
func (u UpperLimit) VolumeQuantile(F float64) float64 {
	if !(F > 0) {
		return 0
	}
	if F >= 1 {
		return u.DMax
	}
	y := math.Erfinv(2*F-1) / u.Delta
	return u.DMax / (1 + u.a()*math.Exp(-y))
}

// UpperLimitFromSMD gives the upper-limit distribution with Sauter mean
// diameter d32 < dmax (m) and spread delta, inverting
// SMD = D_m / (1 + a exp(1/(4δ²))): a = (D_m/SMD − 1) exp(−1/(4δ²)),
// Dv50 = D_m / (1 + a).
func UpperLimitFromSMD(d32, dmax, delta float64) (UpperLimit, error) {
	if err := valid.Positive("distribution.d32_m", d32); err != nil {
		return UpperLimit{}, err
	}
	if err := valid.Positive("distribution.d_max_m", dmax); err != nil {
		return UpperLimit{}, err
	}
	if dmax <= d32 {
		return UpperLimit{}, valid.Errorf("distribution.d_max_m", dmax, "must be above the Sauter mean diameter %s m", valid.FormatValue(d32))
	}
	if err := valid.Positive("distribution.delta", delta); err != nil {
		return UpperLimit{}, err
	}
	a := (dmax/d32 - 1) * math.Exp(-1/(4*delta*delta))
	u := UpperLimit{DMax: dmax, Dv50: dmax / (1 + a), Delta: delta}
	return u, u.Validate()
}
