package sizedist

import (
	"fmt"
	"math"

	"fogbench/calc/valid"
)

// Basis names what a fraction counts: drops, their surface, or their volume
// (equal to mass for one liquid). ISO 9276-1 writes these as r = 0, 2 and 3.
type Basis string

// The bases a distribution or a measured fraction can have.
const (
	BasisNumber  Basis = "number"
	BasisSurface Basis = "surface"
	BasisVolume  Basis = "volume"
)

// order is the ISO 9276-1 type index r of the basis: the power of D that
// weights a drop.
func (b Basis) order() (float64, bool) {
	switch b {
	case BasisNumber:
		return 0, true
	case BasisSurface:
		return 2, true
	case BasisVolume:
		return 3, true
	}
	return 0, false
}

// Binned is a droplet-size distribution given as classes (bins). Class i runs
// from Edges[i] to Edges[i+1] (m). Number and Volume hold the fraction of the
// drops and of the liquid volume in each class; each sums to 1.
//
// Inside a class the number density is taken as constant in D. That single
// rule fixes the class average of D^p (ASTM E799-03 (2015) class-average
// rule, from memory; the clause itself not read), the
// conversion between number and volume fractions, and the interpolation of
// quantiles inside a class.
type Binned struct {
	Edges  []float64 // class edges, ascending, len n+1, m
	Number []float64 // number fraction per class, sums to 1
	Volume []float64 // volume (mass) fraction per class, sums to 1
	// TruncatedBelow and TruncatedAbove are the volume fractions of the
	// parent model below Edges[0] and above Edges[n]; 0 for measured data.
	TruncatedBelow, TruncatedAbove float64
	Warnings                       []string
}

// Len is the number of classes.
func (b *Binned) Len() int { return len(b.Number) }

// Diameter is the representative diameter of class i in m: the geometric
// mean sqrt(Edges[i]·Edges[i+1]) of its edges, the class centre on the log
// axis where size distributions are plotted. The means and quantiles do not
// use it; they use the class averages described on Binned.
func (b *Binned) Diameter(i int) float64 {
	return geoMean(b.Edges[i], b.Edges[i+1])
}

// SauterDiameter is class i's own Sauter mean diameter in m,
// <D³>/<D²> over the class with the number density constant in D (the
// class-average rule the means use, see Binned): the diameter whose
// volume-to-surface ratio is the class's, so that Σv_i/Σ(v_i/D32_i) over
// the classes is the distribution's D32.
func (b *Binned) SauterDiameter(i int) float64 {
	ref := b.Diameter(i)
	lo, hi := b.Edges[i]/ref, b.Edges[i+1]/ref
	return ref * classAveragePow(lo, hi, 3) / classAveragePow(lo, hi, 2)
}

// classAveragePow is the class average <D^p> over [lo, hi] for a number
// density constant in D:
//
//	<D^p> = (hi^(p+1) − lo^(p+1)) / ((p+1)(hi − lo)),   p ≠ −1
//	<D^-1> = ln(hi/lo) / (hi − lo)
//
// written with r = hi/lo and expm1 so that narrow classes keep full
// precision: <D^p> = lo^p · expm1((p+1) ln r) / ((p+1) expm1(ln r)).
// Diameters in any unit; the result is in that unit to the power p.
func classAveragePow(lo, hi, p float64) float64 {
	// Small non-negative integer orders (all the Summary needs) use
	// (hi^(p+1) − lo^(p+1))/(hi − lo) = Σ_k hi^k lo^(p−k): no cancellation
	// and no transcendental calls.
	if p >= 0 && p <= 8 && p == math.Trunc(p) {
		n := int(p)
		var sum, hk float64 = 0, 1
		lk := make([]float64, 0, 9)
		lk = append(lk, 1)
		for k := 1; k <= n; k++ {
			lk = append(lk, lk[k-1]*lo)
		}
		for k := 0; k <= n; k++ {
			sum += hk * lk[n-k]
			hk *= hi
		}
		return sum / float64(n+1)
	}
	l := math.Log(hi / lo)
	if l == 0 {
		return math.Pow(lo, p)
	}
	s := p + 1
	var ratio float64
	if math.Abs(s*l) < 1e-12 {
		ratio = l
	} else {
		ratio = math.Expm1(s*l) / s
	}
	return math.Pow(lo, p) * ratio / math.Expm1(l)
}

// classAveragePowLog is the class average <D^p ln D> over [lo, hi] for a
// number density constant in D, by 8-point Gauss–Legendre quadrature in
// u = ln(D/lo) (the integrand lo^(p+1) e^((p+1)u) (ln lo + u) is smooth, so
// the rule is exact to rounding for classes narrower than a factor e).
func classAveragePowLog(lo, hi, p float64) float64 {
	l := math.Log(hi / lo)
	if l == 0 {
		return math.Pow(lo, p) * math.Log(lo)
	}
	// Split wide classes so each piece spans at most a factor e.
	pieces := int(math.Ceil(l))
	h := l / float64(pieces)
	lnlo := math.Log(lo)
	var sum float64
	for k := 0; k < pieces; k++ {
		u0 := float64(k) * h
		for j, x := range gl8x {
			u := u0 + h*(x+1)/2
			sum += gl8w[j] * h / 2 * math.Exp((p+1)*u) * (lnlo + u)
		}
	}
	return math.Pow(lo, p) * sum / math.Expm1(l)
}

// Nodes and weights of the 8-point Gauss–Legendre rule on [−1, 1]
// (Abramowitz & Stegun, Table 25.4).
var (
	gl8x = [8]float64{-0.9602898564975363, -0.7966664774136267, -0.5255324099163290, -0.1834346424956498, 0.1834346424956498, 0.5255324099163290, 0.7966664774136267, 0.9602898564975363}
	gl8w = [8]float64{0.1012285362903763, 0.2223810344533745, 0.3137066458778873, 0.3626837833783620, 0.3626837833783620, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763}
)

// MeanDiameter is the mean diameter D_pq of the binned data in m by the
// moment method (Mugele & Evans 1951, eq. for D_pq; ISO 9276-2:2014
// x̄_{p−q,q}):
//
//	D_pq = [ Σ n_i <D^p>_i / Σ n_i <D^q>_i ]^(1/(p−q)),   p ≠ q
//	D_pp = exp[ Σ n_i <D^p ln D>_i / Σ n_i <D^p>_i ]       (geometric limit)
//
// n_i are the number fractions and <·>_i the class averages for a number
// density constant in D (the ASTM E799 class-average rule, not the
// representative diameter raised to the power). Diameters are scaled by the
// geometric centre of the range before the powers are taken, so high orders
// do not underflow. p and q are real; an error names the order when p or q is
// not finite or when the moments are zero or overflow.
func (b *Binned) MeanDiameter(p, q float64) (float64, error) {
	if err := valid.Finite("distribution.p", p); err != nil {
		return 0, err
	}
	if err := valid.Finite("distribution.q", q); err != nil {
		return 0, err
	}
	n := b.Len()
	if n == 0 || len(b.Edges) != n+1 {
		return 0, &valid.FieldError{Field: "distribution.edges_m", Message: "the distribution has no classes"}
	}
	ref := geoMean(b.Edges[0], b.Edges[n])
	var mp, mq, mlog float64
	for i, f := range b.Number {
		if f == 0 {
			continue
		}
		lo, hi := b.Edges[i]/ref, b.Edges[i+1]/ref
		mp += f * classAveragePow(lo, hi, p)
		if p == q {
			mlog += f * classAveragePowLog(lo, hi, p)
		} else {
			mq += f * classAveragePow(lo, hi, q)
		}
	}
	var d float64
	if p == q {
		d = ref * math.Exp(mlog/mp)
	} else {
		d = ref * math.Pow(mp/mq, 1/(p-q))
	}
	if math.IsNaN(d) || math.IsInf(d, 0) || d <= 0 {
		return 0, &valid.FieldError{Field: "distribution.p", Value: valid.FormatValue(p),
			Message: fmt.Sprintf("mean diameter D(%g,%g) cannot be computed from these classes (moments are zero or overflow)", p, q)}
	}
	return d, nil
}

// VolumeQuantile is Dv_F in m: the diameter below which the fraction F of the
// liquid volume lies (F = 0.5 gives the volume median diameter, ISO 9276-2
// x_50,3). Inside the class [a, b] that holds F the cumulative volume for a
// number density constant in D grows as D^4, so
//
//	D = (a^4 + t (b^4 − a^4))^(1/4),   t = (F − Q3(a)) / v_i.
//
// F ≤ 0 (or NaN) gives Edges[0]; F ≥ 1 gives Edges[n].
func (b *Binned) VolumeQuantile(F float64) float64 {
	return quantile(b.Edges, b.Volume, F, 4)
}

// NumberQuantile is Dn_F in m, the diameter below which the fraction F of the
// drops lies (ISO 9276-2 x_50,0 for F = 0.5). For a number density constant
// in D the cumulative number is linear in D inside a class:
// D = a + t (b − a), t = (F − Q0(a)) / n_i. F is clamped to [0, 1] as for
// VolumeQuantile.
func (b *Binned) NumberQuantile(F float64) float64 {
	return quantile(b.Edges, b.Number, F, 1)
}

// quantile inverts a cumulative built from class fractions; inside a class
// the cumulative grows as D^k.
func quantile(edges, frac []float64, F float64, k float64) float64 {
	n := len(frac)
	if n == 0 || len(edges) != n+1 {
		return 0
	}
	if !(F > 0) {
		return edges[0]
	}
	if F >= 1 {
		return edges[n]
	}
	var cum float64
	for i, f := range frac {
		if f <= 0 {
			continue
		}
		if cum+f >= F || i == n-1 {
			t := (F - cum) / f
			t = math.Max(0, math.Min(1, t))
			a, bb := edges[i], edges[i+1]
			if k == 1 {
				return a + t*(bb-a)
			}
			r := bb / a
			return a * math.Pow(1+t*math.Expm1(k*math.Log(r)), 1/k)
		}
		cum += f
	}
	return edges[n]
}

// Summary holds the usual mean and representative diameters of a
// distribution (m) and its spread. Mean diameters are D_pq of Mugele & Evans
// (1951); Dv10, Dv50, Dv90 are volume quantiles and Dn50 the number median
// (ISO 9276-2 x_10,3, x_50,3, x_90,3, x_50,0). Span = Dv90 − Dv10 in m;
// RelativeSpan = (Dv90 − Dv10)/Dv50, dimensionless (the "relative span
// factor" of ASTM E799, from memory). A mean that is
// undefined for the distribution is 0 and explained in Warnings.
type Summary struct {
	D10          float64  `json:"d10_m"`
	D20          float64  `json:"d20_m"`
	D30          float64  `json:"d30_m"`
	D21          float64  `json:"d21_m"`
	D31          float64  `json:"d31_m"`
	D32          float64  `json:"d32_m"`
	D43          float64  `json:"d43_m"`
	Dv10         float64  `json:"dv10_m"`
	Dv50         float64  `json:"dv50_m"`
	Dv90         float64  `json:"dv90_m"`
	Dn50         float64  `json:"dn50_m"`
	Span         float64  `json:"span"`
	RelativeSpan float64  `json:"relative_span"`
	Warnings     []string `json:"warnings,omitempty"`
}

// meanOrders lists the (p, q) of the Summary means in field order.
var meanOrders = [7][2]float64{{1, 0}, {2, 0}, {3, 0}, {2, 1}, {3, 1}, {3, 2}, {4, 3}}

func (s *Summary) means() [7]*float64 {
	return [7]*float64{&s.D10, &s.D20, &s.D30, &s.D21, &s.D31, &s.D32, &s.D43}
}

func (s *Summary) setSpread() {
	s.Span = s.Dv90 - s.Dv10
	if s.Dv50 > 0 {
		s.RelativeSpan = s.Span / s.Dv50
	}
}

// Summary computes the means (MeanDiameter), quantiles (VolumeQuantile,
// NumberQuantile) and spreads of the binned data. It copies the Binned
// warnings; a mean that cannot be computed is left 0 with a warning.
func (b *Binned) Summary() Summary {
	var s Summary
	s.Warnings = append(s.Warnings, b.Warnings...)
	// The seven means need only the moments of order 0 to 4: sum each once
	// (in the order MeanDiameter sums them, so every mean is bit for bit the
	// one MeanDiameter gives) instead of twice per mean.
	var m [5]float64
	n := b.Len()
	if n > 0 && len(b.Edges) == n+1 {
		ref := geoMean(b.Edges[0], b.Edges[n])
		for i, f := range b.Number {
			if f == 0 {
				continue
			}
			lo, hi := b.Edges[i]/ref, b.Edges[i+1]/ref
			for k := range m {
				m[k] += f * classAveragePow(lo, hi, float64(k))
			}
		}
		for k, dst := range s.means() {
			p, q := meanOrders[k][0], meanOrders[k][1]
			d := ref * math.Pow(m[int(p)]/m[int(q)], 1/(p-q))
			if math.IsNaN(d) || math.IsInf(d, 0) || d <= 0 {
				_, err := b.MeanDiameter(p, q) // the same failure, with its message
				if err != nil {
					s.Warnings = append(s.Warnings, err.Error())
				}
				continue
			}
			*dst = d
		}
	} else {
		_, err := b.MeanDiameter(1, 0)
		s.Warnings = append(s.Warnings, err.Error())
	}
	s.Dv10 = b.VolumeQuantile(0.1)
	s.Dv50 = b.VolumeQuantile(0.5)
	s.Dv90 = b.VolumeQuantile(0.9)
	s.Dn50 = b.NumberQuantile(0.5)
	s.setSpread()
	return s
}

// FromFractions builds binned data from measured classes: edges in m
// (ascending, positive, len n+1, n ≥ 2) and one fraction per class on the
// given basis. Fractions may be given as percent (summing to 100) or as
// fractions (summing to 1); a sum within 2 % of either is normalised with a
// note in Warnings, a sum further off is rejected. The other basis follows
// from the class averages for a number density constant in D:
//
//	v_i ∝ n_i <D^3>_i,   n_i ∝ v_i / <D^3>_i,   n_i ∝ s_i / <D^2>_i.
//
// Errors are *valid.FieldError on "distribution.edges_m",
// "distribution.fraction" or "distribution.basis".
func FromFractions(edges, fraction []float64, basis Basis) (*Binned, error) {
	r, ok := basis.order()
	if !ok {
		return nil, &valid.FieldError{Field: "distribution.basis", Value: string(basis), Message: `must be "number", "surface" or "volume"`}
	}
	if err := checkEdges(edges); err != nil {
		return nil, err
	}
	n := len(edges) - 1
	if len(fraction) != n {
		return nil, &valid.FieldError{Field: "distribution.fraction", Value: fmt.Sprint(len(fraction)),
			Message: fmt.Sprintf("needs one fraction per class: %d edges make %d classes", len(edges), n)}
	}
	var sum float64
	for i, f := range fraction {
		if math.IsNaN(f) || math.IsInf(f, 0) || f < 0 {
			return nil, &valid.FieldError{Field: "distribution.fraction", Value: valid.FormatValue(f),
				Message: fmt.Sprintf("fraction of class %d must be a finite number not below zero", i+1)}
		}
		sum += f
	}
	note, err := checkSum(sum)
	if err != nil {
		return nil, &valid.FieldError{Field: "distribution.fraction", Value: valid.FormatValue(sum), Message: err.Error()}
	}
	b := &Binned{Edges: append([]float64(nil), edges...)}
	if note != "" {
		b.Warnings = append(b.Warnings, note)
	}
	given := make([]float64, n)
	for i, f := range fraction {
		given[i] = f / sum
	}
	if err := b.fillBases(given, r); err != nil {
		return nil, err
	}
	return b, nil
}

// fillBases sets Number and Volume from fractions of ISO type r.
func (b *Binned) fillBases(given []float64, r float64) error {
	n := len(given)
	ref := geoMean(b.Edges[0], b.Edges[n])
	num := make([]float64, n)
	if r == 0 {
		copy(num, given)
	} else {
		for i, g := range given {
			num[i] = g / classAveragePow(b.Edges[i]/ref, b.Edges[i+1]/ref, r)
		}
	}
	vol := make([]float64, n)
	for i, f := range num {
		vol[i] = f * classAveragePow(b.Edges[i]/ref, b.Edges[i+1]/ref, 3)
	}
	if r == 3 {
		copy(vol, given)
	}
	if !normalise(num) || !normalise(vol) {
		return &valid.FieldError{Field: "distribution.fraction", Message: "all fractions are zero"}
	}
	b.Number, b.Volume = num, vol
	return nil
}

// normalise scales x to sum 1; false when the sum is not positive and finite.
func normalise(x []float64) bool {
	var s float64
	for _, v := range x {
		s += v
	}
	if !(s > 0) || math.IsInf(s, 0) {
		return false
	}
	for i := range x {
		x[i] /= s
	}
	return true
}

// sumTolerance is how far (relative) a measured total may miss 100 % or 1
// and still be normalised: a project rule for rounding in instrument
// exports (common practice, no source).
const sumTolerance = 0.02

// checkSum accepts a total near 1 or 100 and returns a note when it had to
// be normalised.
func checkSum(sum float64) (string, error) {
	if !(sum > 0) || math.IsInf(sum, 0) {
		return "", fmt.Errorf("fractions sum to %s; expected 100 %% or 1", valid.FormatValue(sum))
	}
	for _, target := range []float64{1, 100} {
		dev := sum/target - 1
		if math.Abs(dev) <= 1e-9 {
			return "", nil
		}
		if math.Abs(dev) <= sumTolerance {
			unit := ""
			if target == 100 {
				unit = " %"
			}
			return fmt.Sprintf("fractions summed to %.4g%s, not %g%s; they were normalised", sum, unit, target, unit), nil
		}
	}
	return "", fmt.Errorf("fractions sum to %s; expected 100 %% or 1 (within %g %%)", valid.FormatValue(sum), 100*sumTolerance)
}

// checkEdges asks for at least three positive, finite, strictly ascending
// edges (two classes).
func checkEdges(edges []float64) error {
	if len(edges) < 3 {
		return &valid.FieldError{Field: "distribution.edges_m", Value: fmt.Sprint(len(edges)),
			Message: "needs at least 3 edges (2 classes)"}
	}
	for i, e := range edges {
		if math.IsNaN(e) || math.IsInf(e, 0) || e <= 0 {
			return &valid.FieldError{Field: "distribution.edges_m", Value: valid.FormatValue(e),
				Message: fmt.Sprintf("edge %d must be a finite diameter above zero", i+1)}
		}
		if i > 0 && e <= edges[i-1] {
			return &valid.FieldError{Field: "distribution.edges_m", Value: valid.FormatValue(e),
				Message: fmt.Sprintf("edges must ascend: edge %d is not above edge %d (%s)", i+1, i, valid.FormatValue(edges[i-1]))}
		}
	}
	return nil
}

// DropsPerSecond is the number of drops a spray makes per second:
//
//	N' = (ṁ/ρ) / (π/6 · D30³)
//
// with ṁ the liquid mass flow in kg/s, ρ the liquid density in kg/m³ and D30
// the volume mean diameter of the binned data in m (definition of D30,
// Mugele & Evans 1951). ṁ ≥ 0 and ρ > 0, else a field error on
// "flow.mass_flow_kg_s" or "liquid.density_kg_m3".
func DropsPerSecond(b *Binned, massFlow, liquidDensity float64) (float64, error) {
	if err := valid.NonNegative("flow.mass_flow_kg_s", massFlow); err != nil {
		return 0, err
	}
	if err := valid.Positive("liquid.density_kg_m3", liquidDensity); err != nil {
		return 0, err
	}
	d30, err := b.MeanDiameter(3, 0)
	if err != nil {
		return 0, err
	}
	return massFlow / liquidDensity / (math.Pi / 6 * d30 * d30 * d30), nil
}

// DropRate is DropsPerSecond that returns 0 for invalid input; use
// DropsPerSecond where the reason matters.
func DropRate(b *Binned, massFlow, liquidDensity float64) float64 {
	n, err := DropsPerSecond(b, massFlow, liquidDensity)
	if err != nil {
		return 0
	}
	return n
}
