package calc

import (
	"context"
	"errors"
	"fmt"

	"fogbench/calc/valid"
)

// Code classifies an Error for the layers above: the server maps it to an
// HTTP status, the command line to an exit code.
type Code string

const (
	Invalid  Code = "invalid"  // the user's input is wrong; the message says how
	NotFound Code = "notfound" // the thing asked for does not exist
	Conflict Code = "conflict" // the thing changed since the user last saw it
	Internal Code = "internal" // a fault of ours; the message is generic
	// Canceled: the caller stopped the work (a deadline passed or the
	// client left) before it finished; the message says which.
	Canceled Code = "canceled"
	// Unavailable: the case library cannot store anything now (its disk
	// is full, or it is read-only); nothing of the request was saved and
	// the message says why.
	Unavailable Code = "unavailable"
)

// Error is an application error with a code and a message fit for the user.
type Error struct {
	Code    Code
	Message string
	Err     error // the underlying cause, logged but not shown for Internal
}

func (e *Error) Error() string {
	if e.Err != nil && e.Code == Internal {
		return fmt.Sprintf("%s: %v", e.Message, e.Err)
	}
	return e.Message
}

func (e *Error) Unwrap() error { return e.Err }

// Errorf returns an *Error with the given code.
func Errorf(code Code, format string, args ...any) *Error {
	return &Error{Code: code, Message: fmt.Sprintf(format, args...)}
}

// ErrorCode reports the code of err: the code of an *Error in its chain,
// Invalid for field errors, Internal for anything else.
func ErrorCode(err error) Code {
	var e *Error
	var fe *valid.FieldError
	var fes valid.Errors
	switch {
	case err == nil:
		return ""
	case errors.As(err, &e):
		return e.Code
	case errors.As(err, &fes), errors.As(err, &fe):
		return Invalid
	case errors.Is(err, context.Canceled), errors.Is(err, context.DeadlineExceeded):
		// A store read or other step that stopped with its request (the
		// client left, the time limit passed) is not a fault of ours.
		return Canceled
	}
	return Internal
}

// ErrorMessage returns the text to show a user for err: the message of an
// *Error or field error, a generic sentence for internal faults.
func ErrorMessage(err error) string {
	var e *Error
	if errors.As(err, &e) && e.Code != Internal {
		return e.Message
	}
	switch ErrorCode(err) {
	case Invalid:
		return err.Error()
	case Canceled:
		return "The request stopped before it finished (time limit, or the page was left)."
	}
	return "An internal error occurred; it has been logged."
}

// FieldErrors returns the field errors in err's chain, or nil.
func FieldErrors(err error) valid.Errors {
	var fes valid.Errors
	if errors.As(err, &fes) {
		return fes
	}
	var fe *valid.FieldError
	if errors.As(err, &fe) {
		return valid.Errors{fe}
	}
	return nil
}

// CaseError is what a batch (an array of cases in `fogbench eval` or
// POST /api/evaluate) writes in place of the result of a case that could
// not be computed, so one case never aborts the others: the message a
// user sees (ErrorMessage), the code, and the fields named.
type CaseError struct {
	Error  string           `json:"error"`
	Code   Code             `json:"code"`
	Fields []CaseErrorField `json:"fields,omitempty"`
}

// CaseErrorField is one field error of a CaseError.
type CaseErrorField struct {
	Field   string `json:"field"`
	Message string `json:"message"`
	Value   string `json:"value,omitempty"`
}

// NewCaseError returns the CaseError of err.
func NewCaseError(err error) CaseError {
	ce := CaseError{Error: ErrorMessage(err), Code: ErrorCode(err)}
	for _, fe := range FieldErrors(err) {
		ce.Fields = append(ce.Fields, CaseErrorField{Field: fe.Field, Message: fe.Message, Value: fe.Value})
	}
	return ce
}

// InBatch names the case at list index i (from 0) of an array of cases in
// its error, the same way decoding names it: field errors get the "[i]."
// prefix ("[1].distribution.q"), other errors "case i+1: " in front. The
// error code is kept. POST /api/evaluate and `fogbench eval` both use it.
func InBatch(i int, err error) error {
	if err == nil {
		return nil
	}
	if len(FieldErrors(err)) > 0 {
		return valid.Within(fmt.Sprintf("[%d]", i), err)
	}
	return fmt.Errorf("case %d: %w", i+1, err)
}
