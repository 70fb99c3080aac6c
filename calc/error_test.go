package calc

import (
	"context"
	"errors"
	"fmt"
	"testing"

	"fogbench/calc/valid"
)

func TestErrorCodes(t *testing.T) {
	cases := []struct {
		err  error
		code Code
	}{
		{nil, ""},
		{Errorf(NotFound, "x"), NotFound},
		{fmt.Errorf("wrapped: %w", Errorf(Conflict, "x")), Conflict},
		{valid.Errorf("a", 1, "bad"), Invalid},
		{valid.Errors{valid.Errorf("a", 1, "bad")}, Invalid},
		// A store read stopped with its request is not an internal fault.
		{fmt.Errorf("store: get case 3: %w", context.Canceled), Canceled},
		{fmt.Errorf("store: get case 3: %w", context.DeadlineExceeded), Canceled},
		{errors.New("disk on fire"), Internal},
	}
	for _, c := range cases {
		if got := ErrorCode(c.err); got != c.code {
			t.Errorf("%v: code %q, want %q", c.err, got, c.code)
		}
	}
	if msg := ErrorMessage(errors.New("secret path /x/y")); msg == "secret path /x/y" {
		t.Error("an internal error's text must not reach the user")
	}
	if msg := ErrorMessage(fmt.Errorf("read: %w", context.Canceled)); msg == "" || msg == ErrorMessage(errors.New("x")) {
		t.Errorf("a cancelled request needs its own message, got %q", msg)
	}
}
