package sizedist

import (
	"math"

	"gonum.org/v1/gonum/mathext"

	"fogbench/calc/valid"
)

// LogNormal is the log-normal distribution: ln D is normal with median
// Median (m) and standard deviation ln GSD on the given basis. The moments of
// one basis are log-normal with the same GSD on every other basis, with the
// medians related by the Hatch–Choate relations (Hatch & Choate, J. Franklin
// Inst. 207 (1929) 369–387, citation details from memory):
//
//	x50,r = CMD exp(r ln²σg),   r = 0 number, 2 surface, 3 volume
//	D_pq  = CMD exp[(p + q)/2 · ln²σg]
//
// so the volume median (MMD, Dv50) is CMD exp(3 ln²σg) and
// SMD = CMD exp(2.5 ln²σg) = MMD exp(−0.5 ln²σg).
type LogNormal struct {
	Median float64 // median diameter of the basis below, m
	GSD    float64 // geometric standard deviation σg, > 1, dimensionless
	Basis  Basis   // which distribution Median belongs to
}

// Name is "log-normal".
func (LogNormal) Name() string { return "log-normal" }

// Validate asks for a finite Median > 0 m, 1 < GSD ≤ 20 and a known basis.
func (l LogNormal) Validate() error {
	if err := valid.Positive("distribution.median_m", l.Median); err != nil {
		return err
	}
	if err := valid.Finite("distribution.gsd", l.GSD); err != nil {
		return err
	}
	if l.GSD <= 1 || l.GSD > 20 {
		return valid.Errorf("distribution.gsd", l.GSD, "must be above 1 and at most 20")
	}
	if _, ok := l.Basis.order(); !ok {
		return &valid.FieldError{Field: "distribution.basis", Value: string(l.Basis), Message: `must be "number", "surface" or "volume"`}
	}
	return nil
}

func (l LogNormal) sigma() float64 { return math.Log(l.GSD) }

// CMD is the count (number) median diameter in m.
func (l LogNormal) CMD() float64 {
	r, _ := l.Basis.order()
	s := l.sigma()
	return l.Median * math.Exp(-r*s*s)
}

// MMD is the mass (volume) median diameter, Dv50, in m.
func (l LogNormal) MMD() float64 {
	s := l.sigma()
	return l.CMD() * math.Exp(3*s*s)
}

func (l LogNormal) z(D, median float64) float64 {
	return (math.Log(D) - math.Log(median)) / l.sigma()
}

// VolumeCDF is Q3(D) = Φ((ln D − ln MMD)/ln σg); 0 for D ≤ 0.
func (l LogNormal) VolumeCDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	return 0.5 * math.Erfc(-l.z(D, l.MMD())/math.Sqrt2)
}

// VolumeSF is 1 − Q3(D); 1 for D ≤ 0.
func (l LogNormal) VolumeSF(D float64) float64 {
	if !(D > 0) {
		return 1
	}
	return 0.5 * math.Erfc(l.z(D, l.MMD())/math.Sqrt2)
}

// VolumePDF is q3(D) = φ(z)/(D ln σg) in 1/m, z = (ln D − ln MMD)/ln σg.
func (l LogNormal) VolumePDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	z := l.z(D, l.MMD())
	return math.Exp(-z*z/2) / (math.Sqrt(2*math.Pi) * D * l.sigma())
}

// NumberPDF is q0(D) = φ(z)/(D ln σg) in 1/m, z = (ln D − ln CMD)/ln σg.
func (l LogNormal) NumberPDF(D float64) float64 {
	if !(D > 0) {
		return 0
	}
	z := l.z(D, l.CMD())
	return math.Exp(-z*z/2) / (math.Sqrt(2*math.Pi) * D * l.sigma())
}

// MeanDiameter is D_pq = CMD exp[(p + q)/2 · ln²σg] in m (Hatch & Choate
// 1929). It holds for every real p and q, including the geometric limit
// p = q, because all moments of a log-normal exist.
func (l LogNormal) MeanDiameter(p, q float64) (float64, error) {
	if err := checkOrders(p, q); err != nil {
		return 0, err
	}
	if err := l.Validate(); err != nil {
		return 0, err
	}
	s := l.sigma()
	d := l.CMD() * math.Exp((p+q)/2*s*s)
	if math.IsInf(d, 0) || d == 0 {
		return 0, valid.Errorf("distribution.gsd", l.GSD, "D%s%s overflows for this spread", fmtOrder(p), fmtOrder(q))
	}
	return d, nil
}

// VolumeQuantile is Dv_F = MMD exp(ln σg · Φ⁻¹(F)) in m; 0 for F ≤ 0 or
// NaN, +Inf for F ≥ 1.
func (l LogNormal) VolumeQuantile(F float64) float64 {
	if !(F > 0) {
		return 0
	}
	if F >= 1 {
		return math.Inf(1)
	}
	return l.MMD() * math.Exp(l.sigma()*mathext.NormalQuantile(F))
}

// LogNormalFromSMD gives the volume-basis log-normal with Sauter mean
// diameter d32 (m) and geometric standard deviation gsd:
// MMD = SMD exp(0.5 ln²σg) (Hatch & Choate 1929).
func LogNormalFromSMD(d32, gsd float64) (LogNormal, error) {
	if err := valid.Positive("distribution.d32_m", d32); err != nil {
		return LogNormal{}, err
	}
	l := LogNormal{Median: 1, GSD: gsd, Basis: BasisVolume}
	if err := l.Validate(); err != nil {
		return LogNormal{}, err
	}
	s := l.sigma()
	l.Median = d32 * math.Exp(0.5*s*s)
	return l, nil
}
