package numeric

import "math"

// CubicRoots returns the real roots of z³ + c2 z² + c1 z + c0 = 0: one when
// the discriminant q³ + r² is positive (Cardano's form), else three, the
// largest first (the trigonometric form, z_k = 2√(−q) cos((θ + 2πk)/3) − c2/3
// with cos θ = r/√(−q³)), where q = (3 c1 − c2²)/9 and
// r = (9 c2 c1 − 27 c0 − 2 c2³)/54 (Press et al., Numerical Recipes, 3rd ed.,
// section 5.6). Each root is polished by two Newton steps on the cubic. A
// triple root (q = r = 0) gives NaN; Peng–Robinson's cubic has one only at
// the critical point itself. The
// roots of Peng–Robinson's cubic in the compressibility Z are found this
// way in calc/flash and calc/fluid.
func CubicRoots(c2, c1, c0 float64) []float64 {
	f := func(z float64) float64 { return ((z+c2)*z+c1)*z + c0 }
	df := func(z float64) float64 { return (3*z+2*c2)*z + c1 }
	q := (3*c1 - c2*c2) / 9
	r := (9*c2*c1 - 27*c0 - 2*c2*c2*c2) / 54
	disc := q*q*q + r*r
	var roots []float64
	if disc > 0 {
		s := math.Cbrt(r + math.Sqrt(disc))
		t := math.Cbrt(r - math.Sqrt(disc))
		roots = []float64{s + t - c2/3}
	} else {
		th := math.Acos(math.Max(-1, math.Min(1, r/math.Sqrt(-q*q*q))))
		sq := 2 * math.Sqrt(-q)
		for k := 0; k < 3; k++ {
			roots = append(roots, sq*math.Cos((th+2*math.Pi*float64(k))/3)-c2/3)
		}
	}
	for i, z := range roots {
		for range 2 {
			if d := df(z); d != 0 {
				z -= f(z) / d
			}
		}
		roots[i] = z
	}
	return roots
}
