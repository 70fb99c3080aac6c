package sizedist

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// Check values computed by independent arithmetic from the closed forms of
// Rosin & Rammler, J. Inst. Fuel 7 (1933) 29, in the volume-basis spray
// convention, diameters in µm.
// Tolerance: rel 1e-5, because the table prints six significant figures.
const rrTableTol = 1e-5

func TestRosinRammlerReferenceMeans(t *testing.T) {
	type mean struct {
		p, q, want float64
	}
	cases := []struct {
		x, q                    float64
		dv10, dv50, dv90, rspan float64
		means                   []mean
	}{
		{100, 2.5, 40.6510, 86.3635, 139.6003, 1.14573, []mean{{3, 2, 67.1505}, {4, 3, 88.7264}, {2, 1, 32.4383}}},
		{100, 3.5, 52.5733, 90.0578, 126.9083, 0.82541, []mean{{3, 2, 78.3704}, {4, 3, 89.9747}, {1, 0, 31.5744}, {2, 0, 44.1436}, {3, 0, 53.4518}, {2, 1, 61.7163}}},
		{100, 4.0, 56.9731, 91.2444, 123.1839, 0.72564, []mean{{3, 2, 81.6049}, {4, 3, 90.6402}, {1, 0, 48.8871}, {3, 0, 65.0938}}},
		{50, 2.0, 16.2296, 41.6277, 75.8714, 1.43274, []mean{{3, 2, 28.2095}, {4, 3, 44.3113}}},
	}
	for _, c := range cases {
		r := RosinRammler{X: c.x * um, Q: c.q}
		for _, m := range c.means {
			got, err := r.MeanDiameter(m.p, m.q)
			if err != nil {
				t.Errorf("X=%g q=%g D%g%g: %v", c.x, c.q, m.p, m.q, err)
				continue
			}
			near(t, "D_pq µm", got/um, m.want, rrTableTol)
		}
		near(t, "Dv10 µm", r.VolumeQuantile(0.1)/um, c.dv10, rrTableTol)
		near(t, "Dv50 µm", r.VolumeQuantile(0.5)/um, c.dv50, rrTableTol)
		near(t, "Dv90 µm", r.VolumeQuantile(0.9)/um, c.dv90, rrTableTol)
		rs := (r.VolumeQuantile(0.9) - r.VolumeQuantile(0.1)) / r.VolumeQuantile(0.5)
		near(t, "relative span", rs, c.rspan, rrTableTol)
	}
}

// Computed by independent arithmetic from the same closed forms:
// Dv0.5/SMD = (ln 2)^(1/q) Γ(1 − 1/q), printed to 7 digits. Tolerance rel 1e-6.
func TestRosinRammlerDv50OverSMD(t *testing.T) {
	for _, c := range []struct{ q, want float64 }{{2, 1.475665}, {2.5, 1.286118}, {3, 1.198390}, {3.5, 1.149132}} {
		r := RosinRammler{X: 1e-4, Q: c.q}
		smd, err := r.MeanDiameter(3, 2)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "Dv50/SMD", r.VolumeQuantile(0.5)/smd, c.want, 1e-6)
	}
}

// Existence of the number means (from the volume moments X^k Γ(1 + k/q),
// finite for k > −q): D10, D20, D30 need q > 3 and D21 q > 2.
func TestRosinRammlerUndefinedMeans(t *testing.T) {
	r := RosinRammler{X: 100 * um, Q: 2.5}
	for _, pq := range [][2]float64{{1, 0}, {2, 0}, {3, 0}, {0, 0}} {
		_, err := r.MeanDiameter(pq[0], pq[1])
		if err == nil {
			t.Errorf("q=2.5 D%g%g: no error", pq[0], pq[1])
			continue
		}
		fe := wantField(t, err, "distribution.q")
		if !strings.Contains(fe.Message, "undefined") {
			t.Errorf("message %q does not say undefined", fe.Message)
		}
	}
	if _, err := (RosinRammler{X: 1e-4, Q: 2}).MeanDiameter(2, 1); err == nil {
		t.Error("q=2 D21: no error")
	}
	if r.NumberPDF(10*um) != 0 {
		t.Error("NumberPDF for q ≤ 3 must be 0 (not normalisable)")
	}
}

// Identities over seeded random parameters: the quantile inverts the CDF,
// the survival function complements it, the PDF is the CDF's derivative,
// the means are ordered D10 ≤ D20 ≤ ... (Mugele & Evans: D_pq rises with
// p and q), the geometric limit D_pp lies between D_(p−ε)p and D_(p+ε)p, and
// FromSMD/FromDv50 round-trip.
func TestRosinRammlerIdentities(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for range 200 {
		r := RosinRammler{X: (10 + 300*rng.Float64()) * um, Q: 1.2 + 4*rng.Float64()}
		F := 0.001 + 0.998*rng.Float64()
		D := r.VolumeQuantile(F)
		near(t, "Q3(Dv_F)", r.VolumeCDF(D), F, 1e-12)
		near(t, "Q3+SF", r.VolumeCDF(D)+r.VolumeSF(D), 1, 1e-14)
		h := D * 1e-5
		near(t, "dQ3/dD", (r.VolumeCDF(D+h)-r.VolumeCDF(D-h))/(2*h), r.VolumePDF(D), 1e-6)
		d32, _ := r.MeanDiameter(3, 2)
		d43, _ := r.MeanDiameter(4, 3)
		d33, _ := r.MeanDiameter(3, 3)
		lo, _ := r.MeanDiameter(3-1e-6, 3)
		hi, _ := r.MeanDiameter(3+1e-6, 3)
		if !(d32 < d33 && d33 < d43) {
			t.Errorf("%+v: D32 %g, D33 %g, D43 %g not ordered", r, d32, d33, d43)
		}
		near(t, "D33 limit", d33, (lo+hi)/2, 1e-6)
		back, err := RosinRammlerFromSMD(d32, r.Q)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "FromSMD X", back.X, r.X, 1e-12)
		back, _ = RosinRammlerFromDv50(r.VolumeQuantile(0.5), r.Q)
		near(t, "FromDv50 X", back.X, r.X, 1e-12)
	}
}

func TestRosinRammlerValidate(t *testing.T) {
	for _, c := range []struct {
		r     RosinRammler
		field string
	}{
		{RosinRammler{X: 0, Q: 2}, "distribution.x_m"},
		{RosinRammler{X: math.NaN(), Q: 2}, "distribution.x_m"},
		{RosinRammler{X: 1e-4, Q: -1}, "distribution.q"},
		{RosinRammler{X: 1e-4, Q: math.Inf(1)}, "distribution.q"},
	} {
		wantField(t, c.r.Validate(), c.field)
	}
	_, err := RosinRammlerFromSMD(50*um, 1)
	wantField(t, err, "distribution.q")
}
