package atomize

import (
	"math"

	"fogbench/calc/valid"
)

// SweepSeries is one correlation's drop size along a sweep.
type SweepSeries struct {
	Correlation string    `json:"correlation"`
	Quantity    string    `json:"quantity"`
	SMD         []float64 `json:"smd_m"`    // 0 where Valid is false
	Valid       []bool    `json:"valid"`    // the correlation could be evaluated at this point
	InRange     []bool    `json:"in_range"` // inside every validity range of the correlation
	// The validity range of the swept variable, when the correlation states
	// one (HasRange).
	RangeMin float64 `json:"range_min"`
	RangeMax float64 `json:"range_max"`
	HasRange bool    `json:"has_range"`
}

// SweepResult tabulates drop size and flow against one input.
type SweepResult struct {
	Family        string        `json:"family"`
	Variable      string        `json:"variable"`
	Unit          string        `json:"unit"`
	X             []float64     `json:"x"`
	LogSpaced     bool          `json:"log_spaced"`
	MassFlow      []float64     `json:"mass_flow_kg_s"` // 0 where not known
	MassFlowKnown []bool        `json:"mass_flow_known"`
	Series        []SweepSeries `json:"series"`
	Warnings      []string      `json:"warnings,omitempty"`
}

// Sweep evaluates every correlation of the family and the liquid mass flow
// at n points of one input (variable) from lo to hi, the other inputs held
// as given, for plotting. Points are geometrically spaced when hi/lo ≥ 10,
// evenly otherwise. Points that cannot be evaluated (an input missing, or
// one a correlation needs, or a value that overflows)
// have Valid false and value 0, with the reason once in Warnings; nothing
// returned is NaN. Errors: unknown family or variable, lo or hi not
// positive and finite, lo ≥ hi, n outside 2..2000, and bad properties.
func Sweep(familyID string, inputs map[string]float64, props Properties, variable string, lo, hi float64, n int) (SweepResult, error) {
	f, _, err := lookup(familyID, "")
	if err != nil {
		return SweepResult{}, err
	}
	info, ok := f.inputInfo(variable)
	if !ok {
		return SweepResult{}, &valid.FieldError{Field: "sweep.variable", Value: variable,
			Message: "not an input of family " + f.info.ID + "; its inputs are: " + f.inputNames()}
	}
	if err := valid.Positive("sweep.lo", lo); err != nil {
		return SweepResult{}, err
	}
	if err := valid.Positive("sweep.hi", hi); err != nil {
		return SweepResult{}, err
	}
	if hi <= lo {
		return SweepResult{}, valid.Errorf("sweep.hi", hi, "must be greater than the lower end %s", valid.FormatValue(lo))
	}
	if n < 2 || n > 2000 {
		return SweepResult{}, valid.Errorf("sweep.n", float64(n), "must be between 2 and 2000")
	}
	if err := validateProperties(props); err != nil {
		return SweepResult{}, err
	}
	res := SweepResult{Family: f.info.ID, Variable: variable, Unit: info.Unit, LogSpaced: hi/lo >= 10,
		X: make([]float64, n), MassFlow: make([]float64, n), MassFlowKnown: make([]bool, n)}
	res.Series = make([]SweepSeries, len(f.corrs))
	for j, c := range f.corrs {
		s := SweepSeries{Correlation: c.info.ID, Quantity: c.info.Quantity,
			SMD: make([]float64, n), Valid: make([]bool, n), InRange: make([]bool, n)}
		for _, r := range c.info.Ranges {
			if r.Quantity == variable {
				s.RangeMin, s.RangeMax, s.HasRange = r.Min, r.Max, true
			}
		}
		res.Series[j] = s
	}
	seen := map[string]bool{}
	warn := func(msg string) {
		if !seen[msg] {
			seen[msg] = true
			res.Warnings = append(res.Warnings, msg)
		}
	}
	in := make(map[string]float64, len(inputs)+1)
	for k, v := range inputs {
		in[k] = v
	}
	for i := range res.X {
		t := float64(i) / float64(n-1)
		x := lo + t*(hi-lo)
		if res.LogSpaced {
			x = lo * math.Pow(hi/lo, t)
		}
		if i == n-1 {
			x = hi
		}
		res.X[i] = x
		in[variable] = x
		pt, err := newPoint(f, in, props)
		if err != nil {
			warn(err.Error())
			continue
		}
		if pt.hasMass && !math.IsInf(pt.mdot, 0) && !math.IsNaN(pt.mdot) {
			res.MassFlow[i], res.MassFlowKnown[i] = pt.mdot, true
		}
		for j, c := range f.corrs {
			if err := c.applies(pt); err != nil {
				warn(err.Error())
				continue
			}
			e, err := c.estimate(pt)
			if err != nil {
				warn(err.Error())
				continue
			}
			s := &res.Series[j]
			s.SMD[i], s.Valid[i], s.InRange[i] = e.SMD, true, e.InRange
		}
	}
	var infos []SMDEstimate
	for _, c := range f.corrs {
		infos = append(infos, SMDEstimate{Correlation: c.info.ID, Provenance: c.info.Provenance})
	}
	if w := unconfirmedWarning(infos); w != "" {
		res.Warnings = append(res.Warnings, w)
	}
	return res, nil
}
