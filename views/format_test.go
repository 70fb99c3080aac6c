package views

import (
	"math"
	"testing"

	"fogbench/calc/units"
)

func TestNum(t *testing.T) {
	cases := []struct {
		v    float64
		sig  int
		want string
	}{
		{0, 3, "0"},
		{1.23456, 3, "1.23"},
		{123456, 3, "123456"},
		{1.5e-7, 3, "1.50×10⁻⁷"},
		{2.5e8, 2, "2.5×10⁸"},
		{-0.0021, 2, "-0.0021"},
		{math.NaN(), 3, "—"},
		{math.Inf(1), 3, "∞"},
	}
	for _, c := range cases {
		if got := Num(c.v, c.sig); got != c.want {
			t.Errorf("Num(%v, %d) = %q, want %q", c.v, c.sig, got, c.want)
		}
	}
}

func TestDisplayConverts(t *testing.T) {
	si := Display{System: units.SI}
	us := Display{System: units.US}
	if got := si.Quantity(units.Temperature, 298.15, 4); got != "25 °C" {
		t.Errorf("SI temperature %q", got)
	}
	if got := us.Quantity(units.Temperature, 373.15, 4); got != "212 °F" {
		t.Errorf("US temperature %q", got)
	}
	if got := si.Quantity(units.Pressure, 101325, 6); got != "101.325 kPa" {
		t.Errorf("SI pressure %q", got)
	}
	if Micro(5e-5) != "50" {
		t.Errorf("Micro %q", Micro(5e-5))
	}
}
