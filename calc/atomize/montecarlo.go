package atomize

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"sort"

	"fogbench/calc/valid"
)

// Percentiles summarizes a Monte Carlo propagation of input uncertainty to
// the chosen correlation's drop size.
type Percentiles struct {
	Family        string   `json:"family"`
	Correlation   string   `json:"correlation"`
	Quantity      string   `json:"quantity"`
	Deterministic float64  `json:"deterministic_m"` // the drop size at the nominal inputs
	P5            float64  `json:"p5_m"`
	P50           float64  `json:"p50_m"`
	P95           float64  `json:"p95_m"`
	Mean          float64  `json:"mean_m"`
	Samples       int      `json:"samples"`      // samples that could be evaluated
	Failed        int      `json:"failed"`       // samples rejected by validation (for example C_D > 1)
	OutOfRange    int      `json:"out_of_range"` // evaluated samples outside the validity range
	Seed          uint64   `json:"seed"`
	Warnings      []string `json:"warnings,omitempty"`
}

// propertyUncertainty maps the uncertainty keys of the properties to
// setters.
var propertyUncertainty = map[string]func(*Properties) *float64{
	qLiquidDensity:       func(p *Properties) *float64 { return &p.LiquidDensity },
	qLiquidViscosity:     func(p *Properties) *float64 { return &p.LiquidViscosity },
	qSurfaceTension:      func(p *Properties) *float64 { return &p.SurfaceTension },
	qGasDensity:          func(p *Properties) *float64 { return &p.GasDensity },
	"gas_viscosity_pa_s": func(p *Properties) *float64 { return &p.GasViscosity },
}

// MonteCarlo propagates stated input uncertainties to the drop size of the
// chosen correlation. uncert maps an input name (one given in inputs) or a
// property name (liquid_density_kg_m3, liquid_viscosity_pa_s,
// surface_tension_n_m, gas_density_kg_m3, gas_viscosity_pa_s) to its
// relative standard deviation (0 to 1). Each sample draws every uncertain
// quantity independently from a log-normal distribution with the nominal
// value as its mean and the given coefficient of variation:
//
//	x = x0 exp(s Z − s²/2),   s² = ln(1 + cv²),   Z ~ N(0, 1)
//
// which keeps every sample positive (a modelling choice: common practice,
// no source). n samples (2 to 1e6) are drawn from a PCG generator seeded
// with seed, so the same call gives the same answer. P5, P50 and P95 are
// sample quantiles with linear interpolation between order statistics
// (Hyndman & Fan 1996, definition 7). Samples that fail validation are
// counted in Failed and left out; evaluated samples outside the
// correlation's validity range are counted in OutOfRange and kept, with a
// warning.
func MonteCarlo(familyID, correlationID string, inputs map[string]float64, props Properties, uncert map[string]float64, n int, seed uint64) (Percentiles, error) {
	f, c, err := lookup(familyID, correlationID)
	if err != nil {
		return Percentiles{}, err
	}
	if c == nil {
		return Percentiles{}, &valid.FieldError{Field: "distribution.correlation",
			Message: "family " + f.info.ID + " has no SMD correlation: " + f.info.SMDStatus}
	}
	if n < 2 || n > 1_000_000 {
		return Percentiles{}, valid.Errorf("monte_carlo.n", float64(n), "must be between 2 and 1000000")
	}
	keys := make([]string, 0, len(uncert))
	for k := range uncert {
		keys = append(keys, k)
	}
	sort.Strings(keys) // map order is random; the draw order must not be
	for _, k := range keys {
		field := "uncertainty." + k
		_, isProp := propertyUncertainty[k]
		if _, given := inputs[k]; !given && !isProp {
			return Percentiles{}, valid.Errorf(field, uncert[k],
				"is neither a given input nor a property (liquid_density_kg_m3, liquid_viscosity_pa_s, surface_tension_n_m, gas_density_kg_m3, gas_viscosity_pa_s)")
		}
		if err := valid.Between(field, uncert[k], 0, 1, "(relative standard deviation)"); err != nil {
			return Percentiles{}, err
		}
	}
	pt, err := newPoint(f, inputs, props)
	if err != nil {
		return Percentiles{}, err
	}
	if err := c.applies(pt); err != nil {
		return Percentiles{}, err
	}
	det, err := c.estimate(pt)
	if err != nil {
		return Percentiles{}, err
	}
	out := Percentiles{Family: f.info.ID, Correlation: c.info.ID, Quantity: c.info.Quantity, Deterministic: det.SMD, Seed: seed}

	sigmas := make([]float64, len(keys))
	for i, k := range keys {
		sigmas[i] = math.Sqrt(math.Log1p(uncert[k] * uncert[k]))
	}
	rng := rand.New(rand.NewPCG(seed, seed^0x9e3779b97f4a7c15))
	in := make(map[string]float64, len(inputs))
	vals := make([]float64, 0, n)
	sum := 0.0
	for s := 0; s < n; s++ {
		for k, v := range inputs {
			in[k] = v
		}
		p := props
		for i, k := range keys {
			factor := math.Exp(sigmas[i]*rng.NormFloat64() - sigmas[i]*sigmas[i]/2)
			if set, ok := propertyUncertainty[k]; ok {
				*set(&p) *= factor
			} else {
				in[k] *= factor
			}
		}
		spt, err := newPoint(f, in, p)
		if err != nil || c.applies(spt) != nil {
			out.Failed++
			continue
		}
		e, err := c.estimate(spt)
		if err != nil {
			out.Failed++
			continue
		}
		if !e.InRange {
			out.OutOfRange++
		}
		vals = append(vals, e.SMD)
		sum += e.SMD
	}
	out.Samples = len(vals)
	if len(vals) < 2 {
		return Percentiles{}, fmt.Errorf("atomize: monte carlo: only %d of %d samples could be evaluated", len(vals), n)
	}
	slices.Sort(vals)
	out.P5, out.P50, out.P95 = quantile7(vals, 0.05), quantile7(vals, 0.50), quantile7(vals, 0.95)
	out.Mean = sum / float64(len(vals))
	if out.Failed > 0 {
		out.Warnings = append(out.Warnings, fmt.Sprintf("%d of %d samples failed validation and were left out", out.Failed, n))
	}
	if out.OutOfRange > 0 {
		out.Warnings = append(out.Warnings, fmt.Sprintf("%d of %d evaluated samples lie outside the validity range of %s",
			out.OutOfRange, out.Samples, c.info.ID))
	}
	if !c.info.Provenance.Checked {
		out.Warnings = append(out.Warnings, c.info.ID+": "+c.info.Provenance.Status)
	}
	return out, nil
}

// quantile7 is the sample quantile of sorted x at probability p with
// linear interpolation between order statistics, Hyndman & Fan (1996),
// Am. Stat. 50(4) 361, definition 7: h = (n − 1) p,
// Q = x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋+1] − x[⌊h⌋]).
func quantile7(x []float64, p float64) float64 {
	h := float64(len(x)-1) * p
	i := int(math.Floor(h))
	if i >= len(x)-1 {
		return x[len(x)-1]
	}
	return x[i] + (h-float64(i))*(x[i+1]-x[i])
}
