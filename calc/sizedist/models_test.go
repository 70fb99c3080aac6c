package sizedist

import (
	"bufio"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/integrate/quad"
)

// Values from scipy.stats (weibull_min for Rosin–Rammler's Q3, lognorm for
// the volume-basis log-normal) written by testdata/sizedist/gen_scipy.py;
// the CSV's first line names the scipy and numpy versions. Diameters in the
// file are µm. Tolerances: cdf abs 1e-13, ppf and moments rel 1e-11,
// expect_inv (scipy's adaptive quadrature) rel 1e-9.
func TestScipyReference(t *testing.T) {
	f, err := os.Open("../../testdata/sizedist/scipy_reference.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	sc.Scan()
	if !strings.Contains(sc.Text(), "scipy") {
		t.Fatalf("first line %q does not name scipy", sc.Text())
	}
	sc.Scan() // column names
	rows := 0
	for sc.Scan() {
		c := strings.Split(sc.Text(), ",")
		num := func(i int) float64 {
			v, err := strconv.ParseFloat(c[i], 64)
			if err != nil {
				t.Fatalf("line %q: %v", sc.Text(), err)
			}
			return v
		}
		p1, p2, arg, want := num(1)*um, num(2), num(4), num(5)
		var m Model
		switch c[0] {
		case "weibull_min":
			m = RosinRammler{X: p1, Q: p2}
		case "lognorm":
			m = LogNormal{Median: p1, GSD: math.Exp(p2), Basis: BasisVolume}
		default:
			t.Fatalf("unknown family %q", c[0])
		}
		what := fmt.Sprintf("%s(%g µm, %g) %s %g", c[0], p1/um, p2, c[3], arg)
		switch c[3] {
		case "cdf":
			if got := m.VolumeCDF(arg * um); math.Abs(got-want) > 1e-13 {
				t.Errorf("%s = %.15g, want %.15g", what, got, want)
			}
		case "ppf":
			near(t, what, m.VolumeQuantile(arg)/um, want, 1e-11)
		case "moment":
			// E3[D^n] = D_(3+n),3 ^ n.
			d, err := m.MeanDiameter(3+arg, 3)
			if err != nil {
				t.Fatal(err)
			}
			near(t, what, math.Pow(d/um, arg), want, 1e-11)
		case "expect_inv":
			d32, err := m.MeanDiameter(3, 2)
			if err != nil {
				t.Fatal(err)
			}
			near(t, what, 1/(d32/um), want, 1e-9)
		default:
			t.Fatalf("unknown quantity %q", c[3])
		}
		rows++
	}
	if rows < 150 {
		t.Fatalf("read only %d rows", rows)
	}
}

// Log-normal means. The first value is read in CalebBell/fluids
// (PSDLognormal, an ISO 9276-2-style example: volume basis, s = 0.5,
// median 5 µm, D32 = 5 exp(−0.125)); the others are computed by independent
// arithmetic from the Hatch–Choate relations (Hatch & Choate, J. Franklin
// Inst. 207 (1929) 369; citation details from memory). Tolerance: rel 1e-9
// for the full-precision values, rel 5e-6 for the six-figure table.
func TestLogNormalHatchChoate(t *testing.T) {
	iso := LogNormal{Median: 5 * um, GSD: math.Exp(0.5), Basis: BasisVolume}
	d32, _ := iso.MeanDiameter(3, 2)
	near(t, "ISO example D32 µm", d32/um, 4.412484512922977, 1e-9)
	d43, _ := iso.MeanDiameter(4, 3)
	near(t, "ISO example D43 µm", d43/um, 5*math.Exp(0.125), 1e-9)

	const tableTol = 5e-6
	for _, c := range []struct {
		cmd, gsd float64
		pq       [][3]float64
		mmd      float64
	}{
		{10, 1.5, [][3]float64{{1, 0, 10.8567}, {2, 0, 11.7869}, {3, 0, 12.7967}, {3, 2, 15.0833}, {4, 3, 17.7785}}, 16.3756},
		{20, 2.0, [][3]float64{{1, 0, 25.4307}, {3, 2, 66.4776}, {4, 3, 107.4814}}, 84.5287},
	} {
		l := LogNormal{Median: c.cmd * um, GSD: c.gsd, Basis: BasisNumber}
		for _, m := range c.pq {
			d, err := l.MeanDiameter(m[0], m[1])
			if err != nil {
				t.Fatal(err)
			}
			near(t, fmt.Sprintf("CMD %g σg %g D%g%g", c.cmd, c.gsd, m[0], m[1]), d/um, m[2], tableTol)
		}
		near(t, "MMD", l.VolumeQuantile(0.5)/um, c.mmd, tableTol)
		// The same distribution given by its volume median has equal means.
		v := LogNormal{Median: l.MMD(), GSD: c.gsd, Basis: BasisVolume}
		a, _ := v.MeanDiameter(3, 2)
		b, _ := l.MeanDiameter(3, 2)
		near(t, "basis change D32", a, b, 1e-14)
	}
}

// Computed by independent arithmetic (Mugele & Evans 1951 form, from memory):
// SMD of the upper-limit distribution. Tolerance rel 1e-5 on the printed
// six figures. The closed form is also checked against direct quadrature
// of ∫ q3(D)/D dD over (0, D_m) (rel 1e-8).
func TestUpperLimitSMD(t *testing.T) {
	for _, c := range []struct{ dm, dv50, delta, want float64 }{
		{200, 80, 1.0, 68.3518},
		{500, 150, 0.8, 112.3989},
	} {
		u := UpperLimit{DMax: c.dm * um, Dv50: c.dv50 * um, Delta: c.delta}
		smd, err := u.MeanDiameter(3, 2)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "SMD µm", smd/um, c.want, 1e-5)
		inv := quad.Fixed(func(D float64) float64 { return u.VolumePDF(D) / D }, 0, u.DMax, 4000, quad.Legendre{}, 0)
		near(t, "SMD by quadrature", 1/inv, smd, 1e-8)
		// Non-integer and positive orders go through the y-quadrature; check
		// D43 against direct quadrature in D too.
		d43, _ := u.MeanDiameter(4, 3)
		mean := quad.Fixed(func(D float64) float64 { return u.VolumePDF(D) * D }, 0, u.DMax, 4000, quad.Legendre{}, 0)
		near(t, "D43 by quadrature", d43, mean, 1e-8)
		back, err := UpperLimitFromSMD(smd, u.DMax, u.Delta)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "FromSMD Dv50", back.Dv50, u.Dv50, 1e-12)
		near(t, "Dv50 = quantile", u.VolumeQuantile(0.5), u.Dv50, 1e-14)
	}
}

// Computed by independent arithmetic (moment form of Nukiyama & Tanasawa
// 1939, from memory). B is given in µm^−q in the table and converted to m^−q.
// Tolerance rel 1e-5 on the printed six figures (exact ones rel 1e-12).
func TestNukiyamaTanasawaMeans(t *testing.T) {
	for _, c := range []struct {
		p, q, bMicron float64
		pq            [][3]float64
		tol           float64
	}{
		{2, 1, 0.1, [][3]float64{{1, 0, 30}, {3, 2, 50}, {4, 3, 60}}, 1e-12},
		{2, 1, 0.1, [][3]float64{{2, 0, 34.6410}, {3, 0, 39.1487}}, 1e-5},
		{2, 2, 0.001, [][3]float64{{1, 0, 35.6825}, {3, 0, 41.4790}, {3, 2, 47.5766}, {4, 3, 52.5468}}, 1e-5},
	} {
		n := NukiyamaTanasawa{B: c.bMicron * math.Pow(1e6, c.q), P: c.p, Q: c.q}
		for _, m := range c.pq {
			d, err := n.MeanDiameter(m[0], m[1])
			if err != nil {
				t.Fatal(err)
			}
			near(t, fmt.Sprintf("NT p=%g q=%g D%g%g µm", c.p, c.q, m[0], m[1]), d/um, m[2], c.tol)
		}
	}
	if _, err := (NukiyamaTanasawa{B: 1e5, P: -1.5, Q: 1}).MeanDiameter(1, 0); err == nil {
		t.Error("NT p=−1.5 D10: want an error, the number moment diverges")
	} else {
		wantField(t, err, "distribution.p")
	}
}

// Identities for every family over seeded random parameters: the quantile
// inverts the CDF; the PDF is the CDF's derivative; q0 integrates to 1;
// the number mean D10 equals ∫ D q0 dD; D_pp lies between its neighbours;
// means rise with order (D10 ≤ D21 ≤ D32 ≤ D43).
func TestModelIdentities(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 11))
	models := func() []Model {
		return []Model{
			RosinRammler{X: (20 + 200*rng.Float64()) * um, Q: 3.2 + 2*rng.Float64()},
			LogNormal{Median: (5 + 100*rng.Float64()) * um, GSD: 1.2 + rng.Float64(), Basis: []Basis{BasisNumber, BasisSurface, BasisVolume}[rng.IntN(3)]},
			UpperLimit{DMax: 300 * um, Dv50: (40 + 100*rng.Float64()) * um, Delta: 0.6 + rng.Float64()},
			NukiyamaTanasawa{B: math.Pow((20+50*rng.Float64())*um, -1), P: 1 + 2*rng.Float64(), Q: 0.7 + rng.Float64()},
		}
	}
	for range 20 {
		for _, m := range models() {
			if err := m.Validate(); err != nil {
				t.Fatalf("%+v: %v", m, err)
			}
			for _, F := range []float64{0.02, 0.1, 0.5, 0.9, 0.98} {
				D := m.VolumeQuantile(F)
				near(t, m.Name()+" Q3(Dv_F)", m.VolumeCDF(D), F, 1e-9)
				h := D * 1e-5
				near(t, m.Name()+" dQ3/dD", (m.VolumeCDF(D+h)-m.VolumeCDF(D-h))/(2*h), m.VolumePDF(D), 1e-6)
				near(t, m.Name()+" CDF+SF", m.VolumeCDF(D)+volumeSF(m, D), 1, 1e-14)
			}
			// Integrals over u = ln D.
			lo, hi := math.Log(m.VolumeQuantile(1e-12)/100), math.Log(m.VolumeQuantile(1-1e-12)*1.01)
			if u, ok := m.(UpperLimit); ok {
				hi = math.Log(u.DMax)
			}
			if r, ok := m.(RosinRammler); ok {
				// q0 ∝ D^(q−4) near 0: the number tail reaches far down.
				lo = math.Log(r.X) - 200
			}
			norm := quad.Fixed(func(x float64) float64 { D := math.Exp(x); return m.NumberPDF(D) * D }, lo, hi, 3000, quad.Legendre{}, 0)
			near(t, m.Name()+" ∫q0", norm, 1, 1e-7)
			mean := quad.Fixed(func(x float64) float64 { D := math.Exp(x); return m.NumberPDF(D) * D * D }, lo, hi, 3000, quad.Legendre{}, 0)
			d10, err := m.MeanDiameter(1, 0)
			if err != nil {
				t.Fatalf("%+v: %v", m, err)
			}
			near(t, m.Name()+" D10 = ∫D q0", mean, d10, 1e-7)
			d21, _ := m.MeanDiameter(2, 1)
			d32, _ := m.MeanDiameter(3, 2)
			d43, _ := m.MeanDiameter(4, 3)
			if !(d10 < d21 && d21 < d32 && d32 < d43) {
				t.Errorf("%+v: means not rising: %g %g %g %g", m, d10, d21, d32, d43)
			}
			d22, err := m.MeanDiameter(2, 2)
			if err != nil {
				t.Fatal(err)
			}
			a, _ := m.MeanDiameter(2-1e-5, 2)
			b, _ := m.MeanDiameter(2+1e-5, 2)
			near(t, m.Name()+" D22 limit", d22, (a+b)/2, 1e-7)
		}
	}
}

func TestModelConstructorsAndValidate(t *testing.T) {
	l, err := LogNormalFromSMD(40*um, 1.8)
	if err != nil {
		t.Fatal(err)
	}
	d, _ := l.MeanDiameter(3, 2)
	near(t, "LogNormalFromSMD", d, 40*um, 1e-13)
	n, err := NukiyamaTanasawaFromSMD(40*um, 2, 1.5)
	if err != nil {
		t.Fatal(err)
	}
	d, _ = n.MeanDiameter(3, 2)
	near(t, "NukiyamaTanasawaFromSMD", d, 40*um, 1e-13)
	for _, c := range []struct {
		m     Model
		field string
	}{
		{LogNormal{Median: 1e-5, GSD: 1, Basis: BasisVolume}, "distribution.gsd"},
		{LogNormal{Median: 1e-5, GSD: 2, Basis: "mass"}, "distribution.basis"},
		{LogNormal{Median: -1e-5, GSD: 2, Basis: BasisVolume}, "distribution.median_m"},
		{UpperLimit{DMax: 1e-4, Dv50: 2e-4, Delta: 1}, "distribution.d_max_m"},
		{UpperLimit{DMax: 3e-4, Dv50: 2e-4, Delta: 0}, "distribution.delta"},
		{NukiyamaTanasawa{B: 1e5, P: -5, Q: 1}, "distribution.p"},
		{NukiyamaTanasawa{B: 1e5, P: 2, Q: math.NaN()}, "distribution.q"},
		{NukiyamaTanasawa{B: 0, P: 2, Q: 1}, "distribution.b"},
	} {
		wantField(t, c.m.Validate(), c.field)
	}
}
