package sizedist

import (
	"math"

	"gonum.org/v1/gonum/mathext"

	"fogbench/calc/valid"
)

// NukiyamaTanasawa is the Nukiyama–Tanasawa distribution (Nukiyama &
// Tanasawa 1939, Trans. Soc. Mech. Eng. Japan 5, 62–67; from memory) as a
// number density
//
//	dN/dD = a D^P exp(−B D^Q)
//
// with a the normalising constant. Units are SI-consistent: B is in m^−Q so
// that B D^Q is dimensionless (B in µm^−Q times 10^(6Q) gives m^−Q); P and
// Q are dimensionless. The original work used P = 2. With u = B D^Q the
// moments are Gamma functions:
//
//	∫ D^k dN ∝ Γ((k + P + 1)/Q) B^(−(k+P+1)/Q)
//
// so the volume CDF is the regularised lower incomplete gamma function
// Q3(D) = P((P + 4)/Q, B D^Q).
type NukiyamaTanasawa struct{ B, P, Q float64 }

// Name is "nukiyama-tanasawa".
func (NukiyamaTanasawa) Name() string { return "nukiyama-tanasawa" }

// Validate asks for a finite B > 0 (m^−Q), −4 < P ≤ 50 (so the volume
// distribution is normalisable) and 0 < Q ≤ 20.
func (n NukiyamaTanasawa) Validate() error {
	if err := valid.Positive("distribution.b", n.B); err != nil {
		return err
	}
	if err := valid.Finite("distribution.p", n.P); err != nil {
		return err
	}
	if n.P <= -4 || n.P > 50 {
		return valid.Errorf("distribution.p", n.P, "must be above −4 and at most 50")
	}
	if err := valid.Positive("distribution.q", n.Q); err != nil {
		return err
	}
	if n.Q > 20 {
		return valid.Errorf("distribution.q", n.Q, "must be at most 20")
	}
	return nil
}

// shape is the gamma shape (k + P + 1)/Q of the number moment of order k.
func (n NukiyamaTanasawa) shape(k float64) float64 { return (k + n.P + 1) / n.Q }

// VolumeCDF is Q3(D) = P((P+4)/Q, B D^Q); 0 for D ≤ 0.
func (n NukiyamaTanasawa) VolumeCDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	return mathext.GammaIncReg(n.shape(3), n.B*math.Pow(D, n.Q))
}

// VolumeSF is 1 − Q3(D), the upper regularised incomplete gamma function.
func (n NukiyamaTanasawa) VolumeSF(D float64) float64 {
	if !(D > 0) {
		return 1
	}
	return mathext.GammaIncRegComp(n.shape(3), n.B*math.Pow(D, n.Q))
}

// density is the normalised density of D^k dN in 1/m:
// Q B^s D^(k+P) exp(−B D^Q) / Γ(s), s = (k + P + 1)/Q.
func (n NukiyamaTanasawa) density(D, k float64) float64 {
	s := n.shape(k)
	lg, _ := math.Lgamma(s)
	return math.Exp(math.Log(n.Q) + s*math.Log(n.B) + (k+n.P)*math.Log(D) - n.B*math.Pow(D, n.Q) - lg)
}

// VolumePDF is q3(D) = Q B^s D^(P+3) exp(−B D^Q)/Γ(s), s = (P+4)/Q, in 1/m.
func (n NukiyamaTanasawa) VolumePDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	return n.density(D, 3)
}

// NumberPDF is q0(D) = Q B^s D^P exp(−B D^Q)/Γ(s), s = (P+1)/Q, in 1/m, for
// P > −1. For P ≤ −1 the number density cannot be normalised (it diverges
// at D → 0) and NumberPDF is 0 for every D > 0, as for RosinRammler.
func (n NukiyamaTanasawa) NumberPDF(D float64) float64 {
	if !(D > 0) || n.P <= -1 {
		return 0
	}
	return n.density(D, 0)
}

// MeanDiameter is D_pq in m (from the moments above):
//
//	D_pq = B^(−1/Q) [Γ((p+P+1)/Q) / Γ((q+P+1)/Q)]^(1/(p−q))
//	D_pp = B^(−1/Q) exp(ψ((p+P+1)/Q) / Q)        (geometric limit)
//
// An order needs p + P + 1 > 0; otherwise the error on "distribution.p"
// says the moment diverges.
func (n NukiyamaTanasawa) MeanDiameter(p, q float64) (float64, error) {
	if err := checkOrders(p, q); err != nil {
		return 0, err
	}
	if err := n.Validate(); err != nil {
		return 0, err
	}
	for _, k := range []float64{p, q} {
		if k+n.P+1 <= 0 {
			return 0, valid.Errorf("distribution.p", n.P,
				"D%s%s of a Nukiyama–Tanasawa distribution is undefined: the moment of order %g diverges at small drops unless p > %g",
				fmtOrder(p), fmtOrder(q), k, -1-k)
		}
	}
	scale := math.Pow(n.B, -1/n.Q)
	if p == q {
		return scale * math.Exp(mathext.Digamma(n.shape(p))/n.Q), nil
	}
	lp, _ := math.Lgamma(n.shape(p))
	lq, _ := math.Lgamma(n.shape(q))
	return scale * math.Exp((lp-lq)/(p-q)), nil
}

// VolumeQuantile is Dv_F = (P⁻¹((P+4)/Q, F) / B)^(1/Q) in m; 0 for F ≤ 0 or
// NaN, +Inf for F ≥ 1.
func (n NukiyamaTanasawa) VolumeQuantile(F float64) float64 {
	if !(F > 0) {
		return 0
	}
	if F >= 1 {
		return math.Inf(1)
	}
	return math.Pow(mathext.GammaIncRegInv(n.shape(3), F)/n.B, 1/n.Q)
}

// NukiyamaTanasawaFromSMD gives the Nukiyama–Tanasawa distribution with
// Sauter mean diameter d32 (m) and exponents p, q:
// B = [Γ((p+4)/q) / (Γ((p+3)/q) D32)]^q, which needs p > −3.
func NukiyamaTanasawaFromSMD(d32, p, q float64) (NukiyamaTanasawa, error) {
	if err := valid.Positive("distribution.d32_m", d32); err != nil {
		return NukiyamaTanasawa{}, err
	}
	n := NukiyamaTanasawa{B: 1, P: p, Q: q}
	if err := n.Validate(); err != nil {
		return NukiyamaTanasawa{}, err
	}
	if p <= -3 {
		return NukiyamaTanasawa{}, valid.Errorf("distribution.p", p, "must be above −3 for a finite Sauter mean diameter")
	}
	l4, _ := math.Lgamma(n.shape(3))
	l3, _ := math.Lgamma(n.shape(2))
	n.B = math.Exp(q * (l4 - l3 - math.Log(d32)))
	return n, nil
}
