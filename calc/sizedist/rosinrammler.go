package sizedist

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/mathext"

	"fogbench/calc/valid"
)

// RosinRammler is the Rosin–Rammler (Weibull) distribution on a volume basis
// (Rosin & Rammler, J. Inst. Fuel 7 (1933) 29–36; spray form as in Lefebvre
// & McDonell, Atomization and Sprays, 2nd ed. 2017, drop-size distribution
// chapter, from memory):
//
//	1 − Q3(D) = exp[−(D/X)^q]
//
// X (m) is the diameter with 1 − 1/e = 63.2 % of the volume below it and Q
// (dimensionless, > 0) the spread parameter; larger Q is narrower. Sprays
// usually have Q between 1.5 and 4.
type RosinRammler struct{ X, Q float64 }

// Name is "rosin-rammler".
func (RosinRammler) Name() string { return "rosin-rammler" }

// Validate asks for finite X > 0 m and 0 < Q ≤ 100.
func (r RosinRammler) Validate() error {
	if err := valid.Positive("distribution.x_m", r.X); err != nil {
		return err
	}
	if err := valid.Positive("distribution.q", r.Q); err != nil {
		return err
	}
	if r.Q > 100 {
		return valid.Errorf("distribution.q", r.Q, "must be at most 100")
	}
	return nil
}

// VolumeCDF is Q3(D) = 1 − exp[−(D/X)^q]; 0 for D ≤ 0.
func (r RosinRammler) VolumeCDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	return -math.Expm1(-math.Pow(D/r.X, r.Q))
}

// VolumeSF is 1 − Q3(D) = exp[−(D/X)^q]; 1 for D ≤ 0.
func (r RosinRammler) VolumeSF(D float64) float64 {
	if !(D > 0) {
		return 1
	}
	return math.Exp(-math.Pow(D/r.X, r.Q))
}

// VolumePDF is q3(D) = (q/X)(D/X)^(q−1) exp[−(D/X)^q] in 1/m; 0 for D ≤ 0.
func (r RosinRammler) VolumePDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	x := D / r.X
	return r.Q / r.X * math.Pow(x, r.Q-1) * math.Exp(-math.Pow(x, r.Q))
}

// NumberPDF is q0(D) = q3(D) D^-3 / ∫q3 D^-3 dD = q3(D) (X/D)³ / Γ(1 − 3/q)
// in 1/m for q > 3. For q ≤ 3 the integral diverges at D → 0: the normalised
// number density is 0 for every D > 0 (all drops are vanishingly small), and
// MeanDiameter reports the number means as undefined.
func (r RosinRammler) NumberPDF(D float64) float64 {
	if !(D > 0) || r.Q <= 3 {
		return 0
	}
	x := r.X / D
	return r.VolumePDF(D) * x * x * x / math.Gamma(1-3/r.Q)
}

// MeanDiameter is D_pq in m (Mugele & Evans 1951 definition) from the volume
// moments E3[D^k] = X^k Γ(1 + k/q), k > −q:
//
//	D_pq = X [Γ(1 + (p−3)/q) / Γ(1 + (q'−3)/q)]^(1/(p−q'))      (q' the second order)
//	D_pp = X exp[ψ(1 + (p−3)/q) / q]                              (geometric limit)
//
// e.g. SMD = D32 = X/Γ(1 − 1/q), D43 = X Γ(1 + 1/q). An order needs
// p − 3 > −q; otherwise the number moment diverges at D → 0 and the error,
// on "distribution.q", says so (for example D10, D20, D30 need q > 3 and D21
// needs q > 2).
func (r RosinRammler) MeanDiameter(p, q float64) (float64, error) {
	if err := checkOrders(p, q); err != nil {
		return 0, err
	}
	if err := r.Validate(); err != nil {
		return 0, err
	}
	for _, k := range []float64{p, q} {
		if k-3 <= -r.Q {
			return 0, valid.Errorf("distribution.q", r.Q,
				"D%s%s of a Rosin–Rammler distribution is undefined: the moment of order %g diverges at small drops unless q > %g",
				fmtOrder(p), fmtOrder(q), k, 3-k)
		}
	}
	if p == q {
		return r.X * math.Exp(mathext.Digamma(1+(p-3)/r.Q)/r.Q), nil
	}
	lp, _ := math.Lgamma(1 + (p-3)/r.Q)
	lq, _ := math.Lgamma(1 + (q-3)/r.Q)
	return r.X * math.Exp((lp-lq)/(p-q)), nil
}

// VolumeQuantile is Dv_F = X (−ln(1 − F))^(1/q) in m; 0 for F ≤ 0 or NaN,
// +Inf for F ≥ 1 (the distribution has no largest drop).
func (r RosinRammler) VolumeQuantile(F float64) float64 {
	if !(F > 0) {
		return 0
	}
	if F >= 1 {
		return math.Inf(1)
	}
	return r.X * math.Pow(-math.Log1p(-F), 1/r.Q)
}

// RosinRammlerFromSMD gives the Rosin–Rammler distribution with Sauter mean
// diameter d32 (m) and spread q: X = D32 Γ(1 − 1/q), which needs q > 1.
func RosinRammlerFromSMD(d32, q float64) (RosinRammler, error) {
	if err := valid.Positive("distribution.d32_m", d32); err != nil {
		return RosinRammler{}, err
	}
	if err := valid.Finite("distribution.q", q); err != nil {
		return RosinRammler{}, err
	}
	if q <= 1 || q > 100 {
		return RosinRammler{}, valid.Errorf("distribution.q", q, "must be above 1 and at most 100 for a finite Sauter mean diameter")
	}
	return RosinRammler{X: d32 * math.Gamma(1-1/q), Q: q}, nil
}

// RosinRammlerFromDv50 gives the Rosin–Rammler distribution with volume
// median diameter dv50 (m) and spread q (0 < q ≤ 100): X = Dv50 / (ln 2)^(1/q).
func RosinRammlerFromDv50(dv50, q float64) (RosinRammler, error) {
	if err := valid.Positive("distribution.dv50_m", dv50); err != nil {
		return RosinRammler{}, err
	}
	r := RosinRammler{X: 1, Q: q}
	if err := r.Validate(); err != nil {
		return RosinRammler{}, err
	}
	r.X = dv50 / math.Pow(math.Ln2, 1/q)
	return r, nil
}

// fmtOrder prints a mean-diameter order compactly, 1 → "1", 1.5 → "(1.5)".
func fmtOrder(k float64) string {
	if k == math.Trunc(k) && k >= 0 && k < 10 {
		return fmt.Sprintf("%g", k)
	}
	return fmt.Sprintf("(%g)", k)
}
