package calc

import (
	"errors"
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"

	"fogbench/calc/evap"
	"fogbench/calc/fluid"
)

// caseFields are the case-file fields (or their prefixes) a field error
// may name: anything else (liquid.latent_heat_j_kg, film.…) is a property
// failure inside the model, which the user cannot act on.
var caseFields = []string{"format", "name", "notes", "fluid", "custom_fluid.", "liquid_temperature_k",
	"injection_temperature_k", "heating", "gas.", "distribution.", "evaporation.", "history."}

// checkUserError fails t unless err is one a user can act on: a field
// error naming a case field, or an invalid-input *Error (a physical limit
// in words) — never an internal fault, a solver failure or a property
// failure of the model.
func checkUserError(t *testing.T, what string, err error) {
	t.Helper()
	if err == nil {
		return
	}
	msg := err.Error()
	if ErrorCode(err) != Invalid {
		t.Errorf("%s: code %s: %v", what, ErrorCode(err), err)
		return
	}
	for _, bad := range []string{"not a usable number", "ODE", "evap:", "fluid:", "step size"} {
		if strings.Contains(msg, bad) {
			t.Errorf("%s: internal wording %q in %q", what, bad, msg)
			return
		}
	}
	for _, fe := range FieldErrors(err) {
		// A message names no second field: it sits beside its own.
		for _, f := range caseFields {
			if strings.HasPrefix(fe.Message, f) && strings.HasSuffix(f, ".") {
				t.Errorf("%s: the message of %s starts with another field: %q", what, fe.Field, fe.Message)
			}
		}
		ok := false
		for _, f := range caseFields {
			if fe.Field == f || strings.HasSuffix(f, ".") && strings.HasPrefix(fe.Field, f) {
				ok = true
			}
		}
		if !ok {
			t.Errorf("%s: the error names %q, no field of the case: %v", what, fe.Field, err)
		}
	}
	var ce *Error
	if len(FieldErrors(err)) == 0 && !errors.As(err, &ce) {
		t.Errorf("%s: neither a field error nor a physical limit: %v", what, err)
	}
}

// The Abramzon–Sirignano transient at 15 bar, 700 K completes for every
// class count: it failed with 8, 20, 200 and 2000 classes when a trial
// stage of the integrator overshot a nearly evaporated drop's mass below
// zero and its temperature to 1e15 K, and the stage's property failure
// ended the run instead of rejecting the step.
func TestTransientHighPressureEveryClassCount(t *testing.T) {
	counts := []int{2, 8, 11, 12, 20, 60, 200, 2000}
	if testing.Short() {
		counts = counts[:6]
	}
	for _, fluidID := range []string{"kerosene-surrogate", "n-dodecane"} {
		for _, u := range []float64{10, 0} {
			for _, n := range counts {
				if n > 200 && (fluidID != "kerosene-surrogate" || u == 0) {
					continue // 2000 classes once: seconds each
				}
				c := Case{Format: CaseFormat, Name: "A–S transient", Fluid: fluidID, Heating: "transient",
					InjectionTemperatureK: ptr(300),
					Gas:                   Gas{PressurePa: 15e5, TemperatureK: 700, RelativeVelocityMS: u},
					Distribution:          Distribution{Model: "rosin-rammler", D32M: 30e-6, Q: 2.5, Bins: n},
					Evaporation:           Evaporation{Convection: evap.ConvectionAbramzonSirignano}}
				res, err := Evaluate(c)
				if err != nil {
					t.Errorf("%s, u = %g m/s, %d classes: %v", fluidID, u, n, err)
					continue
				}
				if res.Summary.T50S == nil || !(*res.Summary.T50S > 0) {
					t.Errorf("%s, u = %g m/s, %d classes: no t50", fluidID, u, n)
				}
			}
		}
	}
}

// sweepCase draws one random case over 1–60 bar, 280–1000 K, every
// built-in liquid, every heating model (fixed, steady, transient) and
// every convection model.
func sweepCase(r *rand.Rand, liquids []*fluid.Liquid) Case {
	l := liquids[r.IntN(len(liquids))]
	convections := []string{evap.ConvectionRanzMarshall, evap.ConvectionFrossling, evap.ConvectionAbramzonSirignano, evap.ConvectionNone}
	gases := []string{"air", "nitrogen"}
	tmin, tmax := l.Range()
	c := Case{Format: CaseFormat, Name: "sweep", Fluid: l.ID,
		Gas: Gas{ID: gases[r.IntN(2)], PressurePa: 1e5 + r.Float64()*59e5, TemperatureK: 280 + r.Float64()*720,
			RelativeVelocityMS: []float64{0, 1, 10, 50}[r.IntN(4)]},
		Distribution: Distribution{Model: "rosin-rammler", D32M: 2e-6 + r.Float64()*150e-6, Q: 1.5 + 3*r.Float64(), Bins: 2 + r.IntN(14)},
		Evaporation:  Evaporation{Convection: convections[r.IntN(len(convections))]},
	}
	if r.IntN(4) == 0 {
		c.Gas.RelativeHumidity = ptr(1.2 * r.Float64())
	}
	liquidT := tmin + r.Float64()*(min(tmax, 700)-tmin)
	switch r.IntN(3) {
	case 0:
		c.LiquidTemperatureK = ptr(liquidT)
	case 1: // steady
	case 2:
		c.Heating = "transient"
		c.InjectionTemperatureK = ptr(liquidT)
	}
	return c
}

// A seeded sweep of random cases ends each in a result or a message the
// user can act on (a field or a physical limit), never a solver fault or
// a property failure inside the model.
func TestRandomSweepNeverFaults(t *testing.T) {
	n := 500
	if testing.Short() {
		n = 60
	}
	r := rand.New(rand.NewPCG(18, 2026))
	liquids := fluid.Liquids()
	ok, refused := 0, 0
	for i := range n {
		c := sweepCase(r, liquids)
		_, err := Evaluate(c)
		what := fmt.Sprintf("case %d (%s, %.3g bar, %.1f K, heating %q, %s)", i, c.Fluid, c.Gas.PressurePa/1e5, c.Gas.TemperatureK, c.Heating, c.Evaporation.Convection)
		checkUserError(t, what, err)
		if err == nil {
			ok++
		} else {
			refused++
			if testing.Verbose() {
				t.Logf("%s: %v", what, err)
			}
		}
	}
	t.Logf("%d evaluated, %d refused with a message", ok, refused)
}

// A heating drop of low volatility joins its steady path once its
// temperature is within 1 mK of the balance: n-hexadecane at 339 K into
// 292 K nitrogen at 33 bar settles 0.2 mK below the gas, finer than the
// integrator resolves, and used to take 200,000 steps per class (seconds
// each) and end in a refusal asking for history.max_time_s.
func TestLowVolatilityTransientSettles(t *testing.T) {
	c := Case{Format: CaseFormat, Name: "cold diesel", Fluid: "diesel-surrogate", Heating: "transient",
		InjectionTemperatureK: ptr(339.4),
		Gas:                   Gas{ID: "nitrogen", PressurePa: 32.9e5, TemperatureK: 291.7, RelativeVelocityMS: 10},
		Distribution:          Distribution{Model: "rosin-rammler", D32M: 145e-6, Q: 2.85, Bins: 15},
		Evaporation:           Evaporation{Convection: evap.ConvectionFrossling}}
	res, err := Evaluate(c)
	if err != nil {
		t.Fatal(err)
	}
	if res.Summary.T50S == nil || !(*res.Summary.T50S > 0) {
		t.Errorf("no t50: %v", res.Summary.T50S)
	}
}
