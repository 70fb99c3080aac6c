package views

import (
	"math"
	"strconv"
	"strings"

	"fogbench/calc/units"
)

// Num formats a number to sig significant figures, switching to scientific
// notation outside 1e-3..1e6 so tables stay narrow and nothing is rounded to
// a misleading zero.
func Num(v float64, sig int) string {
	switch {
	case math.IsNaN(v):
		return "—"
	case math.IsInf(v, 1):
		return "∞"
	case math.IsInf(v, -1):
		return "−∞"
	case v == 0:
		return "0"
	}
	a := math.Abs(v)
	if a < 1e-3 || a >= 1e6 {
		s := strconv.FormatFloat(v, 'e', sig-1, 64)
		mant, exp, _ := strings.Cut(s, "e")
		e, _ := strconv.Atoi(exp)
		return mant + "×10" + superscript(e)
	}
	s := strconv.FormatFloat(v, 'g', sig, 64)
	if strings.Contains(s, "e") { // 'g' chose exponent form for e.g. 123456 at sig 3
		s = strconv.FormatFloat(v, 'f', 0, 64)
	}
	return s
}

func superscript(e int) string {
	const digits = "⁰¹²³⁴⁵⁶⁷⁸⁹"
	d := []rune(digits)
	s := strconv.Itoa(e)
	var b strings.Builder
	for _, c := range s {
		if c == '-' {
			b.WriteRune('⁻')
			continue
		}
		b.WriteRune(d[c-'0'])
	}
	return b.String()
}

// Display converts SI values into the reader's chosen units.
type Display struct {
	System units.System
}

// Quantity formats an SI value of a kind in the display unit, with the unit.
func (d Display) Quantity(kind units.Kind, si float64, sig int) string {
	u := units.Default(d.System, kind)
	return Num(u.FromSI(si), sig) + " " + u.Symbol
}

// Value formats an SI value of a kind in the display unit, without the unit.
func (d Display) Value(kind units.Kind, si float64, sig int) string {
	return Num(units.Default(d.System, kind).FromSI(si), sig)
}

// Unit is the display unit symbol of a kind.
func (d Display) Unit(kind units.Kind) string {
	return units.Default(d.System, kind).Symbol
}

// Micro formats a diameter in µm whatever the system: the trade quotes drop
// sizes in micrometres in both.
func Micro(m float64) string { return Num(m*1e6, 4) }

// Percent formats a fraction as a percentage.
func Percent(f float64) string { return Num(f*100, 3) }
