package numeric

import (
	"slices"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// Roots against cubics built from known roots (closed form, outside the
// project): (z−1)(z−2)(z−3), (z−0.3)(z−0.05)(z−0.01) (the shape of a
// Peng–Robinson cubic with liquid, unstable and vapor roots), z³ − 1 (one
// real root); tolerance abs or rel 1e-9.
func TestCubicRoots(t *testing.T) {
	const tol = 1e-9
	fromRoots := func(a, b, c float64) (c2, c1, c0 float64) {
		return -(a + b + c), a*b + b*c + c*a, -a * b * c
	}
	cases := []struct {
		name           string
		c2, c1, c0     float64
		want           []float64
		largestIsFirst bool
	}{
		{"1, 2, 3", -6, 11, -6, []float64{1, 2, 3}, true},
		{"z³ − 1", 0, 0, -1, []float64{1}, true},
	}
	c2, c1, c0 := fromRoots(0.3, 0.05, 0.01)
	cases = append(cases, struct {
		name           string
		c2, c1, c0     float64
		want           []float64
		largestIsFirst bool
	}{"0.3, 0.05, 0.01", c2, c1, c0, []float64{0.01, 0.05, 0.3}, true})
	for _, c := range cases {
		got := CubicRoots(c.c2, c.c1, c.c0)
		if c.largestIsFirst && len(got) > 0 && got[0] != slices.Max(got) {
			t.Errorf("%s: largest root not first: %v", c.name, got)
		}
		slices.Sort(got)
		if len(got) != len(c.want) {
			t.Errorf("%s: %d roots %v, want %v", c.name, len(got), got, c.want)
			continue
		}
		for i := range got {
			if !scalar.EqualWithinAbsOrRel(got[i], c.want[i], tol, tol) {
				t.Errorf("%s: roots %v, want %v", c.name, got, c.want)
				break
			}
		}
	}
}
