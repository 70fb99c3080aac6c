// Package valid holds the field error that every calc package returns for bad
// input, and the small checks that build it. A FieldError names the input
// field in the case-file spelling (for example "distribution.q") and carries
// the offending value, so a form can show the message beside the field and a
// command-line user can find the line to fix.
package valid

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// FieldError is bad input in one field.
type FieldError struct {
	Field   string // case-file path of the field, e.g. "gas.pressure_pa"
	Value   string // the offending value as the user gave it or as formatted here
	Message string // what is wrong, in words for the user
}

func (e *FieldError) Error() string {
	if e.Value == "" {
		return fmt.Sprintf("%s: %s", e.Field, e.Message)
	}
	return fmt.Sprintf("%s: %s (got %s)", e.Field, e.Message, e.Value)
}

// Errorf builds a FieldError for a numeric value.
func Errorf(field string, value float64, format string, args ...any) *FieldError {
	return &FieldError{Field: field, Value: FormatValue(value), Message: fmt.Sprintf(format, args...)}
}

// FormatValue prints a number the way an error message should show it.
func FormatValue(v float64) string {
	switch {
	case math.IsNaN(v):
		return "NaN"
	case math.IsInf(v, 1):
		return "+Inf"
	case math.IsInf(v, -1):
		return "-Inf"
	}
	return strconv.FormatFloat(v, 'g', 6, 64)
}

// Errors collects several field errors so a form can mark every bad field at
// once rather than one per submit.
type Errors []*FieldError

func (es Errors) Error() string {
	parts := make([]string, len(es))
	for i, e := range es {
		parts[i] = e.Error()
	}
	return strings.Join(parts, "; ")
}

// Add appends err when it is a FieldError or Errors; it returns false for any
// other non-nil error so the caller can pass that one up unchanged. A field
// already named keeps its first message: several checks of one value (the
// case's range, then a property model's own guard) would otherwise say the
// same thing twice beside one field ("must be between 1000 and 2e+07 Pa";
// "must be greater than zero").
func (es *Errors) Add(err error) bool {
	if err == nil {
		return true
	}
	var fe *FieldError
	var many Errors
	switch {
	case errors.As(err, &many):
		for _, e := range many {
			es.addOnce(e)
		}
	case errors.As(err, &fe):
		es.addOnce(fe)
	default:
		return false
	}
	return true
}

func (es *Errors) addOnce(fe *FieldError) {
	for _, e := range *es {
		if e.Field == fe.Field {
			return
		}
	}
	*es = append(*es, fe)
}

// Err returns nil when nothing was collected, else the collection.
func (es Errors) Err() error {
	if len(es) == 0 {
		return nil
	}
	return es
}

// For returns the first message for a field, or "".
func (es Errors) For(field string) string {
	for _, e := range es {
		if e.Field == field {
			return e.Message
		}
	}
	return ""
}

// Finite rejects NaN and ±Inf.
func Finite(field string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Errorf(field, v, "must be a finite number")
	}
	return nil
}

// Positive rejects NaN, ±Inf, zero and negatives.
func Positive(field string, v float64) error {
	if err := Finite(field, v); err != nil {
		return err
	}
	if v <= 0 {
		return Errorf(field, v, "must be greater than zero")
	}
	return nil
}

// NonNegative rejects NaN, ±Inf and negatives.
func NonNegative(field string, v float64) error {
	if err := Finite(field, v); err != nil {
		return err
	}
	if v < 0 {
		return Errorf(field, v, "must not be negative")
	}
	return nil
}

// Between rejects values outside [lo, hi] (and NaN, ±Inf). unit is appended to
// the bounds in the message, e.g. "K".
func Between(field string, v, lo, hi float64, unit string) error {
	if err := Finite(field, v); err != nil {
		return err
	}
	if v < lo || v > hi {
		return Errorf(field, v, "must be between %s and %s %s", FormatValue(lo), FormatValue(hi), unit)
	}
	return nil
}
