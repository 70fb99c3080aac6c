package valid

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func TestChecks(t *testing.T) {
	cases := []struct {
		name string
		err  error
		want string // substring of the message; "" means no error
	}{
		{"finite ok", Finite("a", 1), ""},
		{"finite nan", Finite("a", math.NaN()), "a: must be a finite number (got NaN)"},
		{"finite inf", Finite("a", math.Inf(-1)), "(got -Inf)"},
		{"positive zero", Positive("gas.pressure_pa", 0), "gas.pressure_pa: must be greater than zero (got 0)"},
		{"positive ok", Positive("a", 1e-9), ""},
		{"nonneg neg", NonNegative("a", -2), "must not be negative (got -2)"},
		{"nonneg zero", NonNegative("a", 0), ""},
		{"between low", Between("t", 100, 200, 300, "K"), "must be between 200 and 300 K (got 100)"},
		{"between edge", Between("t", 300, 200, 300, "K"), ""},
	}
	for _, c := range cases {
		if c.want == "" {
			if c.err != nil {
				t.Errorf("%s: unexpected error %v", c.name, c.err)
			}
			continue
		}
		if c.err == nil || !strings.Contains(c.err.Error(), c.want) {
			t.Errorf("%s: got %v, want message containing %q", c.name, c.err, c.want)
		}
	}
}

func TestErrorsCollect(t *testing.T) {
	var es Errors
	if !es.Add(Positive("a", -1)) || !es.Add(nil) {
		t.Fatal("field errors must be collected")
	}
	if es.Add(errors.New("disk full")) {
		t.Fatal("a foreign error must not be swallowed")
	}
	es.Add(Errors{Errorf("b", 2, "too big"), Errorf("c", 3, "too small")})
	if len(es) != 3 || es.For("b") != "too big" || es.For("z") != "" {
		t.Fatalf("collected %v", es)
	}
	var none Errors
	if none.Err() != nil || es.Err() == nil {
		t.Fatal("Err must be nil only when empty")
	}
	var fe *FieldError
	if !errors.As(es.Err(), new(Errors)) || !errors.As(Positive("x", 0), &fe) || fe.Field != "x" {
		t.Fatal("errors.As must find the types")
	}
}

// A field checked twice (the case's range, then a model's own guard) keeps
// its first message alone; other fields keep theirs.
func TestErrorsNameAFieldOnce(t *testing.T) {
	var es Errors
	es.Add(Errorf("gas.pressure_pa", 0, "must be between 1000 and 2e+07 Pa"))
	es.Add(Errors{Errorf("gas.pressure_pa", 0, "must be greater than zero"), Errorf("gas.temperature_k", 5000, "must be between 200 and 2500 K")})
	if len(es) != 2 || es[0].Message != "must be between 1000 and 2e+07 Pa" || es[1].Field != "gas.temperature_k" {
		t.Fatalf("got %v", es)
	}
}
