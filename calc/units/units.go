// Package units converts between the SI values that fogbench stores and
// computes with and the units engineers type and read. Every factor is exact
// by definition or taken from NIST Special Publication 811 (2008 edition,
// Appendix B.8/B.9, "Factors for units listed alphabetically/by kind"); the
// tests check each against the printed factor.
package units

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// Kind is the physical quantity a field holds.
type Kind string

const (
	Length      Kind = "length"
	Pressure    Kind = "pressure"
	Temperature Kind = "temperature"
	MassFlow    Kind = "massflow"
	Velocity    Kind = "velocity"
	Time        Kind = "time"
)

// Unit converts to and from SI by value_SI = value·Scale + Offset.
type Unit struct {
	Symbol string
	Kind   Kind
	Scale  float64
	Offset float64
}

// ToSI converts a value in this unit to SI. Decimal sub-units divide by
// their exact inverse, so 60 µm becomes exactly the double nearest 6e-5
// rather than 60 × 1e-6 = 5.9999999999999995e-05.
func (u Unit) ToSI(v float64) float64 {
	if inv, ok := exactInverse(u.Scale); ok {
		return v/inv + u.Offset
	}
	return v*u.Scale + u.Offset
}

// FromSI converts an SI value to this unit.
func (u Unit) FromSI(v float64) float64 {
	if inv, ok := exactInverse(u.Scale); ok {
		return (v - u.Offset) * inv
	}
	return (v - u.Offset) / u.Scale
}

// exactInverse reports 1/s when s is the reciprocal of a whole power of ten
// (1e-3, 1e-6, 1e-9).
func exactInverse(s float64) (float64, bool) {
	if s >= 1 {
		return 0, false
	}
	inv := math.Round(1 / s)
	for p := 10.0; p <= 1e12; p *= 10 {
		if inv == p && 1/p == s {
			return p, true
		}
	}
	return 0, false
}

// Exact definitions (NIST SP 811 B.8 gives each as exact unless noted).
const (
	inch        = 0.0254                // m, exact
	foot        = 0.3048                // m, exact
	pound       = 0.45359237            // kg (avoirdupois), exact
	psi         = 6.894757293168361e3   // Pa, pound-force per square inch: 4.4482216152605 N / (0.0254 m)²
	usGallon    = 3.785411784e-3        // m³, exact (231 in³)
	hour        = 3600.0                // s
	minute      = 60.0                  // s
	litre       = 1e-3                  // m³, exact
	fahrenheitK = 5.0 / 9.0             // K per °F
	fahrenheit0 = 273.15 - 32.0*5.0/9.0 // K at 0 °F
)

var all = []Unit{
	{"m", Length, 1, 0},
	{"mm", Length, 1e-3, 0},
	{"µm", Length, 1e-6, 0},
	{"nm", Length, 1e-9, 0},
	{"in", Length, inch, 0},

	{"Pa", Pressure, 1, 0},
	{"kPa", Pressure, 1e3, 0},
	{"MPa", Pressure, 1e6, 0},
	{"bar", Pressure, 1e5, 0},
	{"atm", Pressure, 101325, 0},
	{"psi", Pressure, psi, 0},

	{"K", Temperature, 1, 0},
	{"°C", Temperature, 1, 273.15},
	{"°F", Temperature, fahrenheitK, fahrenheit0},

	{"kg/s", MassFlow, 1, 0},
	{"kg/h", MassFlow, 1 / hour, 0},
	{"g/s", MassFlow, 1e-3, 0},
	{"lb/h", MassFlow, pound / hour, 0},

	{"m/s", Velocity, 1, 0},
	{"ft/s", Velocity, foot, 0},

	{"s", Time, 1, 0},
	{"ms", Time, 1e-3, 0},
	{"µs", Time, 1e-6, 0},
}

// Volume-flow units need the liquid density to become a mass flow; they are
// kept apart so a form can offer them only where a density is known.
var volumeFlow = []Unit{
	{"L/min", MassFlow, litre / minute, 0},
	{"US gal/h", MassFlow, usGallon / hour, 0},
}

// aliases lets a user or a CSV header type a unit the ASCII way.
var aliases = map[string]string{
	"um": "µm", "micron": "µm", "microns": "µm", "μm": "µm",
	"degc": "°C", "c": "°C", "°c": "°C", "degf": "°F", "f": "°F", "°f": "°F",
	"us": "µs", "μs": "µs", "gph": "US gal/h", "lpm": "L/min", "l/min": "L/min",
}

// Lookup finds a unit by symbol (or alias) within a kind.
func Lookup(kind Kind, symbol string) (Unit, error) {
	s := strings.TrimSpace(symbol)
	if a, ok := aliases[strings.ToLower(s)]; ok {
		s = a
	}
	for _, u := range all {
		if u.Kind == kind && u.Symbol == s {
			return u, nil
		}
	}
	for _, u := range volumeFlow {
		if u.Kind == kind && u.Symbol == s {
			return u, nil
		}
	}
	return Unit{}, fmt.Errorf("unknown %s unit %q (known: %s)", kind, symbol, strings.Join(Symbols(kind), ", "))
}

// MustLookup is Lookup for symbols fixed in code.
func MustLookup(kind Kind, symbol string) Unit {
	u, err := Lookup(kind, symbol)
	if err != nil {
		panic(err)
	}
	return u
}

// Symbols lists the mass-based units of a kind in display order.
func Symbols(kind Kind) []string {
	var out []string
	for _, u := range all {
		if u.Kind == kind {
			out = append(out, u.Symbol)
		}
	}
	return out
}

// VolumeFlow reports whether a flow unit is volumetric (needs a density).
func VolumeFlow(u Unit) bool {
	for _, v := range volumeFlow {
		if v.Symbol == u.Symbol {
			return true
		}
	}
	return false
}

// FlowSymbols lists mass and volume flow units.
func FlowSymbols() []string {
	out := Symbols(MassFlow)
	for _, u := range volumeFlow {
		out = append(out, u.Symbol)
	}
	return out
}

// System is a named default choice of display unit per kind.
type System string

const (
	SI System = "si"
	US System = "us"
)

var defaults = map[System]map[Kind]string{
	SI: {Length: "µm", Pressure: "kPa", Temperature: "°C", MassFlow: "g/s", Velocity: "m/s", Time: "ms"},
	US: {Length: "µm", Pressure: "psi", Temperature: "°F", MassFlow: "lb/h", Velocity: "ft/s", Time: "ms"},
}

// Default returns the system's display unit for a kind.
func Default(sys System, kind Kind) Unit {
	m, ok := defaults[sys]
	if !ok {
		m = defaults[SI]
	}
	return MustLookup(kind, m[kind])
}

// Systems lists the unit systems by name.
func Systems() []System {
	out := []System{SI, US}
	sort.Slice(out, func(i, j int) bool { return out[i] < out[j] })
	return out
}
