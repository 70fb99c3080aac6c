package evap

import (
	"errors"
	"math"

	"fogbench/calc/valid"
)

// StateSweep evaluates drop states at many diameters under one set of
// conditions, as a spray's size classes need: State(d) returns exactly what
// Drop(d, Ts) returns for a fixed surface temperature Ts > 0, or
// SteadyState(d) for Ts = 0 (the same numbers, bit for bit:
// TestStateSweepMatchesDropAndSteadyState), but the conditions are checked
// and the boiling point found once, and diameters at the same surface
// temperature share the liquid's properties, which depend on T alone.
// A StateSweep is not safe for concurrent use.
type StateSweep struct {
	c     *Conditions
	ts    float64
	tb    float64  // boiling point at the gas pressure, for the steady temperature
	liq   liquidAt // liquid properties at the last surface temperature
	guess float64  // the last steady temperature solved, K (0: none)
}

// NewStateSweep checks the conditions and the surface temperature Ts (K;
// zero for each diameter's steady temperature) as Drop and SteadyState do.
func (c *Conditions) NewStateSweep(ts float64) (*StateSweep, error) {
	if err := c.Validate(); err != nil {
		return nil, err
	}
	s := &StateSweep{c: c, ts: ts}
	if ts != 0 {
		if err := c.checkSurfaceTemperature(ts); err != nil {
			return nil, err
		}
		return s, nil
	}
	tb, _, err := c.upperTemperature()
	if err != nil {
		return nil, err
	}
	s.tb = tb
	return s, nil
}

// State returns the drop state at diameter d (m); see StateSweep.
func (s *StateSweep) State(d float64) (DropState, error) {
	if err := valid.Positive("drop.diameter_m", d); err != nil {
		return DropState{}, err
	}
	if s.ts != 0 {
		return s.c.dropAt(d, s.ts, &s.liq)
	}
	// From the previous diameter's steady temperature, secant steps
	// (steadyNear) need two or three heat balances where the bracketing
	// solve needs about ten; they accept only a residual that bounds the
	// rate's error as Brent's tolerance does, and fall back to the
	// bracketing solve, which also reports boiling.
	var ts float64
	var err error
	ok := false
	if s.guess > 0 && d >= minSteadyDiameter {
		ts, _, ok = s.c.steadyNear(d, s.tb, s.guess, &s.liq)
	}
	if !ok {
		ts, err = s.c.steadyTemperature(d, s.tb, 0)
	}
	var warn string
	critical := errors.Is(err, ErrTranscritical)
	if errors.Is(err, ErrBoiling) || critical {
		if !critical {
			warn = err.Error()
		}
		ts = math.Nextafter(ts, 0)
		s.guess = 0
	} else if err != nil {
		return DropState{}, err
	} else {
		s.guess = ts
	}
	var st DropState
	if err = s.c.checkSurfaceTemperature(ts); err == nil {
		st, err = s.c.dropAt(d, ts, &s.liq)
	}
	if warn != "" {
		st.Warnings = append(st.Warnings, warn)
	}
	st.Transcritical = critical
	return st, err
}
