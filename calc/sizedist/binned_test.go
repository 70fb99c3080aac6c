package sizedist

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// Hand arithmetic (ISO 9276-2 moment definitions, ASTM E799 class-average
// rule): classes 10–20 and 20–30 µm with number fractions 0.6 and 0.4.
//
//	<D>   = 15, 25                 → M1 = 0.6·15 + 0.4·25 = 19
//	<D²>  = 7000/30, 19000/30      → M2 = 140 + 253.333… = 393.333…
//	<D³>  = 150000/40, 650000/40   → M3 = 2250 + 6500 = 8750
//	<D⁴>  = 3.1e6/50, 21.1e6/50    → M4 = 37200 + 168800 = 206000
//	D10 = 19, D20 = √393.333 = 19.83263, D30 = 8750^(1/3) = 20.60613,
//	D32 = 8750/393.333 = 22.24576, D43 = 206000/8750 = 23.54286 µm
//	volume fractions 2250/8750 = 0.2571429 and 6500/8750 = 0.7428571
//	Dv50: t = (0.5 − 0.2571429)/0.7428571 = 17/52 inside class 2;
//	      D⁴ = 20⁴ + (17/52)(30⁴ − 20⁴) = 160000 + 212500 = 372500, D = 24.70481 µm
//	Dn50: t = 0.5/0.6 inside class 1, D = 10 + 10·5/6 = 18.33333 µm
//
// Tolerance rel 1e-6 (the figures above carry 7 digits).
func TestBinnedHandArithmetic(t *testing.T) {
	const tol = 1e-6
	b, err := FromFractions([]float64{10 * um, 20 * um, 30 * um}, []float64{60, 40}, BasisNumber)
	if err != nil {
		t.Fatal(err)
	}
	if len(b.Warnings) != 0 {
		t.Errorf("unexpected warnings %q", b.Warnings)
	}
	near(t, "v1", b.Volume[0], 2250.0/8750, tol)
	near(t, "v2", b.Volume[1], 6500.0/8750, tol)
	s := b.Summary()
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"D10", s.D10, 19},
		{"D20", s.D20, math.Sqrt(393.333333333333)},
		{"D30", s.D30, math.Cbrt(8750)},
		{"D21", s.D21, 393.333333333333 / 19},
		{"D31", s.D31, math.Sqrt(8750.0 / 19)},
		{"D32", s.D32, 8750 / 393.333333333333},
		{"D43", s.D43, 206000.0 / 8750},
		{"Dv50", s.Dv50, math.Pow(372500, 0.25)},
		{"Dn50", s.Dn50, 10 + 10*5.0/6},
	} {
		near(t, c.name+" µm", c.got/um, c.want, tol)
	}
	near(t, "D20 printed", s.D20/um, 19.83263, tol)
	near(t, "D32 printed", s.D32/um, 22.24576, tol)
	near(t, "D43 printed", s.D43/um, 23.54286, tol)
	near(t, "Dv50 printed", s.Dv50/um, 24.70481, tol)

	// The same classes given on a volume basis give back the number fractions.
	bv, err := FromFractions(b.Edges, b.Volume, BasisVolume)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "n1 from volume", bv.Number[0], 0.6, 1e-12)
	// Representative diameter is the geometric mean of the edges.
	near(t, "Diameter(0)", b.Diameter(0)/um, math.Sqrt(200), 1e-12)
}

// A geometric-limit mean D_pp lies between D_(p±ε),p of the same data.
func TestBinnedGeometricLimit(t *testing.T) {
	b, err := Cut(RosinRammler{X: 80 * um, Q: 2.4}, 2*um, 400*um, 60, SpacingLog)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range []float64{0, 1, 3} {
		dpp, err := b.MeanDiameter(p, p)
		if err != nil {
			t.Fatal(err)
		}
		lo, _ := b.MeanDiameter(p-1e-6, p)
		hi, _ := b.MeanDiameter(p+1e-6, p)
		near(t, fmt.Sprintf("D%g%g", p, p), dpp, (lo+hi)/2, 1e-7)
	}
}

func TestFromFractionsSums(t *testing.T) {
	edges := []float64{1 * um, 2 * um, 4 * um, 8 * um}
	for _, c := range []struct {
		frac []float64
		note bool
	}{
		{[]float64{20, 50, 30}, false},
		{[]float64{0.2, 0.5, 0.3}, false},
		{[]float64{20, 50, 29}, true},     // 99 %: normalised with a note
		{[]float64{0.2, 0.5, 0.31}, true}, // 1.01
	} {
		b, err := FromFractions(edges, c.frac, BasisVolume)
		if err != nil {
			t.Errorf("%v: %v", c.frac, err)
			continue
		}
		if got := len(b.Warnings) > 0; got != c.note {
			t.Errorf("%v: note %v, want %v (%q)", c.frac, got, c.note, b.Warnings)
		}
		near(t, "sum volume", sumOf(b.Volume), 1, 1e-14)
		near(t, "sum number", sumOf(b.Number), 1, 1e-14)
	}
}

func TestFromFractionsErrors(t *testing.T) {
	e := []float64{1 * um, 2 * um, 4 * um}
	for _, c := range []struct {
		name   string
		edges  []float64
		frac   []float64
		basis  Basis
		field  string
		inText string
	}{
		{"basis", e, []float64{50, 50}, "mass", "distribution.basis", "volume"},
		{"one class", []float64{1 * um, 2 * um}, []float64{100}, BasisVolume, "distribution.edges_m", "2 classes"},
		{"descending", []float64{1 * um, 3 * um, 2 * um}, []float64{50, 50}, BasisVolume, "distribution.edges_m", "ascend"},
		{"zero edge", []float64{0, 3 * um, 4 * um}, []float64{50, 50}, BasisVolume, "distribution.edges_m", "above zero"},
		{"NaN edge", []float64{1 * um, math.NaN(), 4 * um}, []float64{50, 50}, BasisVolume, "distribution.edges_m", "finite"},
		{"count", e, []float64{100}, BasisVolume, "distribution.fraction", "one fraction per class"},
		{"negative", e, []float64{110, -10}, BasisVolume, "distribution.fraction", "class 2"},
		{"Inf", e, []float64{math.Inf(1), 0}, BasisNumber, "distribution.fraction", "finite"},
		{"sum 95", e, []float64{50, 45}, BasisVolume, "distribution.fraction", "expected 100"},
		{"sum 0", e, []float64{0, 0}, BasisVolume, "distribution.fraction", "expected 100"},
	} {
		b, err := FromFractions(c.edges, c.frac, c.basis)
		if b != nil || err == nil {
			t.Errorf("%s: got %v, %v; want an error", c.name, b, err)
			continue
		}
		fe := wantField(t, err, c.field)
		if !strings.Contains(fe.Error(), c.inText) {
			t.Errorf("%s: message %q lacks %q", c.name, fe.Error(), c.inText)
		}
	}
}

func TestDropsPerSecond(t *testing.T) {
	// Hand arithmetic: one class pair with D30 = 20.60613 µm (see
	// TestBinnedHandArithmetic); 1 g/s of water (998 kg/m³) gives
	// 1e-3/998 / (π/6 · 8750e-18) = 2.18707e8 drops/s.
	b, _ := FromFractions([]float64{10 * um, 20 * um, 30 * um}, []float64{60, 40}, BasisNumber)
	n, err := DropsPerSecond(b, 1e-3, 998)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "drops/s", n, 1e-3/998/(math.Pi/6*8750e-18), 1e-9)
	near(t, "drops/s printed", n, 2.18707e8, 1e-5)
	if DropRate(b, 1e-3, 0) != 0 {
		t.Error("DropRate with zero density must be 0")
	}
	_, err = DropsPerSecond(b, -1, 998)
	wantField(t, err, "flow.mass_flow_kg_s")
}

// Summary's means come from one pass over the moments; each must equal what
// MeanDiameter gives for its (p, q) exactly, over seeded random classes.
func TestSummaryMeansEqualMeanDiameter(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	for trial := 0; trial < 200; trial++ {
		n := 2 + rng.IntN(60)
		edges := make([]float64, n+1)
		edges[0] = 1e-7 * (1 + rng.Float64())
		for i := 1; i <= n; i++ {
			edges[i] = edges[i-1] * (1.01 + 2*rng.Float64())
		}
		fr := make([]float64, n)
		for i := range fr {
			if rng.IntN(5) > 0 {
				fr[i] = rng.Float64()
			}
		}
		fr[rng.IntN(n)] += 0.1
		sum := 0.0
		for _, f := range fr {
			sum += f
		}
		for i := range fr {
			fr[i] /= sum
		}
		b, err := FromFractions(edges, fr, BasisVolume)
		if err != nil {
			t.Fatal(err)
		}
		s := b.Summary()
		for k, dst := range s.means() {
			want, err := b.MeanDiameter(meanOrders[k][0], meanOrders[k][1])
			if err != nil {
				t.Fatal(err)
			}
			if *dst != want {
				t.Fatalf("trial %d D%v: Summary %v, MeanDiameter %v", trial, meanOrders[k], *dst, want)
			}
		}
	}
}
