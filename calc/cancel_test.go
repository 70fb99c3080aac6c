package calc

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"strings"
	"testing"
	"time"
)

// bigTransientCase is the largest kind of case a user can ask for: the
// maximum number of classes, each heated along its own transient path
// (about 2 s on the development machine).
func bigTransientCase() Case {
	tinj := 300.0
	return Case{Format: CaseFormat, Name: "large transient (invented)", Fluid: "n-decane",
		InjectionTemperatureK: &tinj, Heating: "transient",
		Gas:          Gas{ID: "air", PressurePa: 300000, TemperatureK: 600, RelativeVelocityMS: 5},
		Distribution: Distribution{Model: "rosin-rammler", XM: 3e-5, Q: 3, Bins: MaxBins}}
}

// A done context stops EvaluateContext with a Canceled error that says why;
// a context whose deadline passes mid-way stops a large transient case soon
// after. The bound is generous (seconds, for slow or race-instrumented
// runs): the checks sit between classes and time steps, each under a few
// milliseconds of work.
func TestEvaluateContextCancels(t *testing.T) {
	c := bigTransientCase()
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	res, err := EvaluateContext(ctx, c)
	if res != nil || ErrorCode(err) != Canceled || !errors.Is(err, context.Canceled) || !strings.Contains(ErrorMessage(err), "cancelled") {
		t.Fatalf("cancelled before the start: result %v, err %v (code %q)", res != nil, err, ErrorCode(err))
	}

	for _, after := range []time.Duration{20 * time.Millisecond, 300 * time.Millisecond} {
		ctx, cancel := context.WithTimeout(context.Background(), after)
		start := time.Now()
		res, err = EvaluateContext(ctx, c)
		took := time.Since(start)
		cancel()
		if res != nil || ErrorCode(err) != Canceled || !errors.Is(err, context.DeadlineExceeded) || !strings.Contains(ErrorMessage(err), "time limit") {
			t.Fatalf("deadline %v: result %v after %v, err %v (code %q)", after, res != nil, took, err, ErrorCode(err))
		}
		if late := took - after; late > 3*time.Second {
			t.Errorf("deadline %v: stopped %v after it passed", after, late)
		}
		var e *Error
		errors.As(err, &e)
		t.Logf("deadline %v: returned after %v (%v)", after, took, e.Err)
	}
}

// Evaluate is EvaluateContext with a context that is never done: the same
// result.
func TestEvaluateIsEvaluateContext(t *testing.T) {
	c := waterCase()
	a, err := Evaluate(c)
	if err != nil {
		t.Fatal(err)
	}
	b, err := EvaluateContext(context.Background(), c)
	if err != nil {
		t.Fatal(err)
	}
	ja, err := json.Marshal(a)
	if err != nil {
		t.Fatal(err)
	}
	jb, err := json.Marshal(b)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(ja, jb) {
		t.Error("Evaluate and EvaluateContext give different results")
	}
}
