package calc

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// checkOutcome is the contract of Evaluate for any input: either a refusal
// that is the user's to fix (code invalid, every field error naming its
// field and saying what is wrong), or a result that encodes as JSON and
// holds no negative lifetime, fraction, time or diameter. encoding/json
// refuses NaN and ±Inf, so a successful Marshal proves none escaped.
func checkOutcome(t *testing.T, c Case, res *Result, err error) {
	t.Helper()
	if err != nil {
		if res != nil {
			t.Fatalf("error %v returned with a result", err)
		}
		if code := ErrorCode(err); code != Invalid {
			t.Fatalf("case %+v: error of code %q, want invalid: %v", c, code, err)
		}
		if strings.TrimSpace(ErrorMessage(err)) == "" {
			t.Fatalf("empty error message for %v", err)
		}
		var ce *Error
		if !errors.As(err, &ce) && len(FieldErrors(err)) == 0 {
			t.Fatalf("invalid input error that is neither a field error nor a calc.Error: %v", err)
		}
		for _, fe := range FieldErrors(err) {
			if fe.Field == "" || fe.Message == "" {
				t.Fatalf("field error without field or message: %#v", fe)
			}
		}
		return
	}
	if res == nil {
		t.Fatal("nil result without an error")
	}
	if _, err := json.Marshal(res); err != nil {
		t.Fatalf("case %+v: result does not encode as JSON: %v", c, err)
	}
	if len(res.Bins) < 1 {
		t.Fatal("a result without size classes")
	}
	var nsum, vsum float64
	for i, b := range res.Bins {
		if !(b.DLoM > 0 && b.DM >= b.DLoM && b.DHiM >= b.DM) {
			t.Fatalf("bin %d: diameters %g ≤ %g ≤ %g out of order or not positive", i, b.DLoM, b.DM, b.DHiM)
		}
		if b.NumberFraction < 0 || b.NumberFraction > 1+1e-12 || b.VolumeFraction < 0 || b.VolumeFraction > 1+1e-12 {
			t.Fatalf("bin %d: fractions %g, %g outside [0, 1]", i, b.NumberFraction, b.VolumeFraction)
		}
		nsum += b.NumberFraction
		vsum += b.VolumeFraction
		if b.LifetimeS != nil && *b.LifetimeS < 0 {
			t.Fatalf("bin %d: negative lifetime %g s", i, *b.LifetimeS)
		}
		if b.SurfaceTemperatureK <= 0 || b.LaplacePa < 0 || b.KelvinRatio < 1 {
			t.Fatalf("bin %d: surface %g K, Laplace %g Pa, Kelvin ratio %g", i, b.SurfaceTemperatureK, b.LaplacePa, b.KelvinRatio)
		}
	}
	if math.Abs(nsum-1) > 1e-6 || math.Abs(vsum-1) > 1e-6 {
		t.Fatalf("fractions sum to %g (number) and %g (volume)", nsum, vsum)
	}
	s := res.Summary
	for _, p := range []*float64{s.D10M, s.D20M, s.D30M} {
		if p != nil && !(*p > 0) {
			t.Fatalf("summary number mean %g in %+v", *p, s)
		}
	}
	for _, d := range []float64{s.D32M, s.D43M, s.Dv10M, s.Dv50M, s.Dv90M} {
		if !(d > 0) {
			t.Fatalf("summary diameter %g in %+v", d, s)
		}
	}
	for _, p := range []*float64{s.T50S, s.T90S, s.T99S} {
		if p != nil && *p < 0 {
			t.Fatalf("negative evaporation time %g", *p)
		}
	}
	if h := res.History; h != nil {
		for i, f := range h.EvaporatedMassFraction {
			if f < -1e-12 || f > 1+1e-9 {
				t.Fatalf("history point %d: evaporated fraction %g", i, f)
			}
			if h.TS[i] < 0 {
				t.Fatalf("history point %d: negative time %g", i, h.TS[i])
			}
		}
	}
}

// hostile are values that have no business in a case: not numbers,
// infinities, signs and magnitudes no spray has.
var hostile = []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, math.Copysign(0, -1), -1, -1e-6,
	1e-320, 1e-30, 1e30, 1e300, math.MaxFloat64}

// randomCase draws a case near one of the sound starting points and, two
// times in three, spoils one to three of its fields with hostile values.
func randomCase(rng *rand.Rand) Case {
	logU := func(lo, hi float64) float64 { return lo * math.Pow(hi/lo, rng.Float64()) }
	c := Case{Format: CaseFormat, Name: "property case", Fluid: []string{"water", "n-heptane", "ethanol", "n-decane"}[rng.IntN(4)],
		Gas: Gas{PressurePa: logU(2e4, 2e6), TemperatureK: 280 + 400*rng.Float64()}}
	if rng.IntN(2) == 0 {
		c.LiquidTemperatureK = ptr(280 + 20*rng.Float64())
	}
	if rng.IntN(6) == 0 {
		c.Heating, c.InjectionTemperatureK = "transient", ptr(250+80*rng.Float64())
	}
	if rng.IntN(3) == 0 {
		c.Gas.VaporMoleFraction = ptr(0.02 * rng.Float64())
	}
	d := &c.Distribution
	d.Bins = 2 + rng.IntN(7)
	switch rng.IntN(6) {
	case 0:
		d.Model, d.XM, d.Q = "rosin-rammler", logU(2e-6, 3e-4), 1.2+5*rng.Float64()
	case 1:
		d.Model, d.MedianM, d.GSD, d.Basis = "log-normal", logU(2e-6, 3e-4), 1.1+2*rng.Float64(), "volume"
	case 2:
		d.Model, d.DUpperM, d.Dv50M, d.Delta = "upper-limit", 4e-4, logU(2e-6, 2e-4), 0.5+2*rng.Float64()
	case 3:
		d.Model, d.ScaleM, d.P, d.QNT = "nukiyama-tanasawa", logU(2e-6, 1e-4), 2, 1
	case 4:
		d.Model, d.Family = "atomizer", "pressure-swirl"
		d.Inputs = map[string]float64{"delta_p_pa": logU(1e5, 1e7), "orifice_diameter_m": logU(2e-4, 2e-3), "mass_flow_kg_s": logU(1e-3, 0.1)}
	case 5:
		d.Model, d.Basis = "bins", "volume"
		n := d.Bins
		d.Bins = 0
		e := logU(1e-6, 2e-5)
		sum := 0.0
		for range n {
			d.EdgesM = append(d.EdgesM, e)
			d.Fraction = append(d.Fraction, 0.01+rng.Float64())
			sum += d.Fraction[len(d.Fraction)-1]
			e *= 1.2 + rng.Float64()
		}
		d.EdgesM = append(d.EdgesM, e)
		for i := range d.Fraction {
			d.Fraction[i] /= sum
		}
	}
	if d.Model != "bins" && rng.IntN(3) == 0 {
		d.DMinM, d.DMaxM = logU(5e-7, 5e-6), logU(1e-4, 1e-3)
	}
	if rng.IntN(4) == 0 {
		c.Evaporation.MaxTimeS = logU(1e-3, 100)
	}
	if rng.IntN(4) == 0 {
		c.Evaporation.MassFlowKgS, c.Evaporation.SprayVelocityMS = logU(1e-4, 1), logU(1, 100)
	}
	spoilers := []func(v float64){
		func(v float64) { c.Gas.PressurePa = v },
		func(v float64) { c.Gas.TemperatureK = v },
		func(v float64) { c.Gas.RelativeVelocityMS = v },
		func(v float64) { c.LiquidTemperatureK = ptr(v) },
		func(v float64) { c.Heating, c.InjectionTemperatureK = "transient", ptr(v) },
		func(v float64) { c.Gas.VaporMoleFraction, c.Gas.RelativeHumidity = ptr(v), nil },
		func(v float64) { c.Gas.VaporMoleFraction, c.Gas.RelativeHumidity = nil, ptr(v) },
		func(v float64) { d.XM, d.MedianM, d.Dv50M, d.ScaleM = v, v, v, v },
		func(v float64) { d.Q, d.GSD, d.Delta, d.QNT = v, v, v, v },
		func(v float64) { d.D32M = v },
		func(v float64) { d.DUpperM, d.P = v, v },
		func(v float64) { d.DMinM = v },
		func(v float64) { d.DMaxM = v },
		func(v float64) {
			if len(d.EdgesM) > 0 {
				d.EdgesM[rng.IntN(len(d.EdgesM))] = v
			}
		},
		func(v float64) {
			if len(d.Fraction) > 0 {
				d.Fraction[rng.IntN(len(d.Fraction))] = v
			}
		},
		func(v float64) {
			if d.Inputs != nil {
				d.Inputs[[]string{"delta_p_pa", "orifice_diameter_m", "mass_flow_kg_s", "no_such_input"}[rng.IntN(4)]] = v
			}
		},
		func(v float64) { c.Evaporation.AccommodationCoef = v },
		func(v float64) { c.Evaporation.MassFlowKgS = v },
		func(v float64) { c.Evaporation.SprayVelocityMS = v },
		func(v float64) { c.Evaporation.MaxTimeS = v },
		func(float64) { d.Bins = []int{-1, 1, MaxBins + 1, math.MaxInt32}[rng.IntN(4)] },
		func(float64) { d.EdgesM, d.Fraction = make([]float64, MaxBins+5), make([]float64, MaxBins+4) },
		func(float64) { c.Fluid = "no-such-liquid" },
		func(v float64) { c.Gas.VaporMoleFraction, c.Gas.RelativeHumidity = nil, ptr(math.Abs(v)) },
	}
	spoiled := 0
	if rng.IntN(3) > 0 {
		spoiled = 1 + rng.IntN(3)
	}
	for range spoiled {
		v := hostile[rng.IntN(len(hostile))]
		if rng.IntN(3) == 0 {
			v = -logU(1e-9, 1e9) // a plain negative of any size
		}
		spoilers[rng.IntN(len(spoilers))](v)
	}
	return c
}

// TestEvaluateHostileInputs runs Evaluate over seeded random cases, two
// thirds of them spoiled with NaN, ±Inf, negatives, zeros and absurd sizes, and
// holds every outcome to checkOutcome. The budget keeps it to a few seconds.
func TestEvaluateHostileInputs(t *testing.T) {
	rng := rand.New(rand.NewPCG(10, 2026))
	n, budget := 400, 8*time.Second
	if testing.Short() {
		n, budget = 60, 2*time.Second
	}
	start := time.Now()
	var ok, refused int
	for i := 0; i < n && time.Since(start) < budget; i++ {
		c := randomCase(rng)
		res, err := Evaluate(c)
		checkOutcome(t, c, res, err)
		if err != nil {
			refused++
		} else {
			ok++
		}
	}
	t.Logf("%d evaluated, %d refused in %v", ok, refused, time.Since(start).Round(time.Millisecond))
	// Both branches must be exercised, or the test proves little.
	if ok < 5 || refused < 5 {
		t.Fatalf("only %d good and %d refused cases: the generator has drifted", ok, refused)
	}
}

// Each hostile value put in a field Evaluate reads is refused with an
// error that names that field.
func TestEvaluateNamesTheBadField(t *testing.T) {
	base := func() Case {
		return Case{Format: CaseFormat, Name: "named", Fluid: "water", LiquidTemperatureK: ptr(293),
			Gas:          Gas{PressurePa: 101325, TemperatureK: 300},
			Distribution: Distribution{Model: "rosin-rammler", XM: 5e-5, Q: 2.5, Bins: 4}}
	}
	type spoil struct {
		field string
		set   func(c *Case, v float64)
	}
	spoils := []spoil{
		{"gas.pressure_pa", func(c *Case, v float64) { c.Gas.PressurePa = v }},
		{"gas.temperature_k", func(c *Case, v float64) { c.Gas.TemperatureK = v }},
		{"gas.relative_velocity_m_s", func(c *Case, v float64) { c.Gas.RelativeVelocityMS = v }},
		{"liquid_temperature_k", func(c *Case, v float64) { c.LiquidTemperatureK = ptr(v) }},
		{"gas.vapor_mole_fraction", func(c *Case, v float64) { c.Gas.VaporMoleFraction = ptr(v) }},
		{"gas.relative_humidity", func(c *Case, v float64) { c.Gas.RelativeHumidity = ptr(v) }},
		{"gas.vapor_partial_pressure_pa", func(c *Case, v float64) { c.Gas.VaporPartialPressurePa = ptr(v) }},
		{"distribution.x_m", func(c *Case, v float64) { c.Distribution.XM = v }},
		{"distribution.q", func(c *Case, v float64) { c.Distribution.Q = v }},
		{"distribution.d_min_m", func(c *Case, v float64) { c.Distribution.DMinM = v }},
		{"distribution.d_max_m", func(c *Case, v float64) { c.Distribution.DMaxM = v }},
		{"evaporation.mass_flow_kg_s", func(c *Case, v float64) { c.Evaporation.MassFlowKgS = v }},
		{"evaporation.spray_velocity_m_s", func(c *Case, v float64) { c.Evaporation.SprayVelocityMS = v }},
		{"evaporation.max_time_s", func(c *Case, v float64) { c.Evaporation.MaxTimeS = v }},
		{"evaporation.accommodation_coefficient", func(c *Case, v float64) { c.Evaporation.AccommodationCoef = v }},
	}
	for _, sp := range spoils {
		for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1), -1} {
			c := base()
			sp.set(&c, v)
			res, err := Evaluate(c)
			if err == nil {
				t.Errorf("%s = %g: accepted", sp.field, v)
				continue
			}
			checkOutcome(t, c, res, err)
			named := false
			for _, fe := range FieldErrors(err) {
				named = named || strings.HasPrefix(fe.Field, sp.field)
			}
			if !named {
				t.Errorf("%s = %g: error does not name the field: %v", sp.field, v, err)
			}
		}
	}
	// Absurd sizes: a bin count and a measured-class list far past the limit.
	c := base()
	c.Distribution.Bins = 1 << 30
	if _, err := Evaluate(c); err == nil || FieldErrors(err).For("distribution.bins") == "" {
		t.Errorf("bins 2^30: %v", err)
	}
	c = base()
	c.Distribution = Distribution{Model: "bins", Basis: "volume", EdgesM: make([]float64, 100001), Fraction: make([]float64, 100000)}
	for i := range c.Distribution.EdgesM {
		c.Distribution.EdgesM[i] = 1e-6 * (1 + float64(i))
		if i < len(c.Distribution.Fraction) {
			c.Distribution.Fraction[i] = 1
		}
	}
	start := time.Now()
	if _, err := Evaluate(c); err == nil || FieldErrors(err).For("distribution.edges_m") == "" {
		t.Errorf("100 000 measured classes: %v", err)
	}
	if d := time.Since(start); d > time.Second {
		t.Errorf("refusing 100 000 classes took %v: the size must be checked before any work", d)
	}
}

// FuzzDecodeEvaluate feeds arbitrary bytes to the case decoder and every
// decoded case to the validator, and to Evaluate when the case is small
// enough to keep the fuzzer fast. Nothing may panic; outcomes obey
// checkOutcome, and a decoded case re-encodes.
func FuzzDecodeEvaluate(f *testing.F) {
	files, _ := filepath.Glob("../testdata/cases/*.json")
	demo, _ := filepath.Glob("../store/demo/*.json")
	for _, name := range append(files, demo...) {
		data, err := os.ReadFile(name)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data)
	}
	f.Add([]byte(`{"format":"fogbench-case/1","name":"x","fluid":"water","gas":{"pressure_pa":-1,"temperature_k":1e999},"distribution":{"model":"rosin-rammler","x_m":5e-5,"q":2.5,"bins":3}}`))
	f.Add([]byte(`[{"format":"fogbench-case/1","name":"x","fluid":"water","liquid_temperature_k":300,"gas":{"pressure_pa":101325,"temperature_k":300},"distribution":{"model":"bins","edges_m":[1e-6,2e-6,4e-6],"fraction":[0.5,0.5],"basis":"volume"}}]`))
	f.Fuzz(func(t *testing.T, data []byte) {
		cases, err := Decode(bytes.NewReader(data))
		if err != nil {
			if cases != nil || ErrorCode(err) != Invalid || len(FieldErrors(err)) == 0 {
				t.Fatalf("decode error %v (code %s) with %d cases", err, ErrorCode(err), len(cases))
			}
			return
		}
		if len(cases) > MaxCasesPerFile {
			t.Fatalf("decoded %d cases, above the limit of %d", len(cases), MaxCasesPerFile)
		}
		for _, c := range cases {
			if _, err := c.Encode(); err != nil {
				t.Fatalf("decoded case does not re-encode: %v", err)
			}
			if err := Validate(c); err != nil {
				checkOutcome(t, c, nil, err)
				continue
			}
			d := c.Distribution
			if d.Bins > 8 || len(d.EdgesM) > 9 || c.Heating == "transient" {
				continue // valid, but too slow to evaluate at fuzzing speed
			}
			res, err := Evaluate(c)
			checkOutcome(t, c, res, err)
		}
	})
}

// The last guard finds a NaN or ±Inf wherever it hides in a result and
// names where it is.
func TestNonFiniteFindsThePath(t *testing.T) {
	lt := 1.0
	r := &Result{Bins: []BinResult{{DM: 1e-6}, {DM: 2e-6, LifetimeS: &lt}}, History: &History{TS: []float64{0, 1}}}
	if p := nonFinite(r); p != "" {
		t.Fatalf("finite result reported at %s", p)
	}
	lt = math.Inf(1)
	if p := nonFinite(r); !strings.HasPrefix(p, "bins[1].lifetime_s") {
		t.Fatalf("got %q, want bins[1].lifetime_s", p)
	}
	lt = 1
	r.History.TS[1] = math.NaN()
	if p := nonFinite(r); !strings.HasPrefix(p, "history.t_s[1]") {
		t.Fatalf("got %q, want history.t_s[1]", p)
	}
}

// The work one request may ask for is bounded by the classes summed over
// its cases, measured bins and model bins alike.
func TestCheckWork(t *testing.T) {
	model := Case{Distribution: Distribution{Model: "rosin-rammler", Bins: 2000}}
	dflt := Case{Distribution: Distribution{Model: "log-normal"}}
	measured := Case{Distribution: Distribution{Model: "bins", EdgesM: make([]float64, 1001)}}
	if got := []int{model.Classes(), dflt.Classes(), measured.Classes()}; got[0] != 2000 || got[1] != DefaultBins || got[2] != 1000 {
		t.Fatalf("classes %v", got)
	}
	if err := CheckWork([]Case{model, model}); err != nil {
		t.Errorf("two cases of 2000 classes: %v", err)
	}
	err := CheckWork([]Case{model, model, measured})
	if fes := FieldErrors(err); len(fes) != 1 || fes[0].Field != "file" || fes[0].Value != "5000" {
		t.Errorf("5000 classes: %v", err)
	}
	many := make([]Case, MaxCasesPerFile)
	for i := range many {
		many[i] = dflt
	}
	if err := CheckWork(many); err != nil {
		t.Errorf("%d cases of the default %d classes: %v", MaxCasesPerFile, DefaultBins, err)
	}
}
