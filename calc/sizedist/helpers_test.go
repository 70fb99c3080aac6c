package sizedist

import (
	"errors"
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/valid"
)

const um = 1e-6

// near reports a mismatch beyond the relative tolerance tol (absolute 1e-300
// so that exact zeros compare).
func near(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, 1e-300, tol) {
		t.Errorf("%s = %.12g, want %.12g (rel tol %g, rel err %.3g)", what, got, want, tol, math.Abs(got/want-1))
	}
}

// wantField checks that err is a *valid.FieldError on field.
func wantField(t *testing.T, err error, field string) *valid.FieldError {
	t.Helper()
	var fe *valid.FieldError
	if !errors.As(err, &fe) {
		t.Fatalf("error %v (%T) is not a *valid.FieldError", err, err)
	}
	if fe.Field != field {
		t.Errorf("error field %q, want %q (%v)", fe.Field, field, err)
	}
	return fe
}

func sumOf(x []float64) float64 {
	var s float64
	for _, v := range x {
		s += v
	}
	return s
}
