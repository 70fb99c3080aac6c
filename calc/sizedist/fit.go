package sizedist

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/optimize"

	"fogbench/calc/valid"
)

// FitResult is a model fitted to binned data.
type FitResult struct {
	Family string             `json:"family"`
	Model  Model              `json:"-"`
	Params map[string]float64 `json:"params"` // the model's fields by case-file name, SI units
	// Edges (m), the measured cumulative volume fraction at each edge, and
	// the residual model − measured there.
	Edges     []float64 `json:"edges_m"`
	Measured  []float64 `json:"measured"`
	Residuals []float64 `json:"residuals"`
	RMS       float64   `json:"rms"` // root mean square of Residuals, in cumulative fraction
	R2        float64   `json:"r2"`  // 1 − Σr² / Σ(C − mean C)²
	Warnings  []string  `json:"warnings,omitempty"`
}

// Families Fit accepts.
var Families = []string{"rosin-rammler", "log-normal", "upper-limit", "nukiyama-tanasawa"}

// family maps unconstrained parameters θ to a model, with a starting θ from
// the data's quantiles.
type family struct {
	start  func(b *Binned) []float64
	model  func(th []float64) Model
	params func(m Model) map[string]float64
}

// erfinv08 is erfinv(0.8), the y of the 90 % point of a unit-δ upper-limit
// distribution.
var erfinv08 = math.Erfinv(0.8)

var families = map[string]family{
	"rosin-rammler": {
		start: func(b *Binned) []float64 {
			q := math.Log(math.Log(10)/math.Log(10.0/9)) / math.Log(b.VolumeQuantile(0.9)/b.VolumeQuantile(0.1))
			return []float64{math.Log(b.VolumeQuantile(0.5) / math.Pow(math.Ln2, 1/q)), math.Log(q)}
		},
		model: func(th []float64) Model { return RosinRammler{X: math.Exp(th[0]), Q: math.Exp(th[1])} },
		params: func(m Model) map[string]float64 {
			r := m.(RosinRammler)
			return map[string]float64{"x_m": r.X, "q": r.Q}
		},
	},
	"log-normal": {
		start: func(b *Binned) []float64 {
			s := math.Log(b.VolumeQuantile(0.9)/b.VolumeQuantile(0.1)) / (2 * 1.2815515655446004)
			return []float64{math.Log(b.VolumeQuantile(0.5)), math.Log(s)}
		},
		model: func(th []float64) Model {
			return LogNormal{Median: math.Exp(th[0]), GSD: math.Exp(math.Exp(th[1])), Basis: BasisVolume}
		},
		params: func(m Model) map[string]float64 {
			l := m.(LogNormal)
			return map[string]float64{"median_m": l.Median, "gsd": l.GSD}
		},
	},
	"upper-limit": {
		start: func(b *Binned) []float64 {
			d50, d90 := b.VolumeQuantile(0.5), b.VolumeQuantile(0.9)
			dm := math.Max(1.5*d90, 1.05*b.Edges[len(b.Edges)-1])
			a := (dm - d50) / d50
			delta := 1.0
			if y := math.Log(a * d90 / (dm - d90)); y > 0 {
				delta = erfinv08 / y
			}
			return []float64{math.Log(d50), math.Log(dm/d50 - 1), math.Log(delta)}
		},
		model: func(th []float64) Model {
			d50 := math.Exp(th[0])
			return UpperLimit{Dv50: d50, DMax: d50 * (1 + math.Exp(th[1])), Delta: math.Exp(th[2])}
		},
		params: func(m Model) map[string]float64 {
			u := m.(UpperLimit)
			return map[string]float64{"d_max_m": u.DMax, "dv50_m": u.Dv50, "delta": u.Delta}
		},
	},
	"nukiyama-tanasawa": {
		// θ = (ln D*, ln(P + 4), ln Q) with B = D*^−Q, so D* carries the size
		// and the optimiser sees parameters of order one.
		start: func(b *Binned) []float64 {
			// For P = 2, Q = 1 the volume median of u = D/D* is about 5.67.
			return []float64{math.Log(b.VolumeQuantile(0.5) / 5.67), math.Log(6), 0}
		},
		model: func(th []float64) Model {
			q := math.Exp(th[2])
			return NukiyamaTanasawa{B: math.Exp(-q * th[0]), P: math.Exp(th[1]) - 4, Q: q}
		},
		params: func(m Model) map[string]float64 {
			n := m.(NukiyamaTanasawa)
			return map[string]float64{"b": n.B, "p": n.P, "q": n.Q}
		},
	},
}

// Fit fits a model family ("rosin-rammler", "log-normal", "upper-limit",
// "nukiyama-tanasawa") to binned data by least squares on the cumulative
// volume curve at the class edges:
//
//	minimise Σ_j [Q3_model(D_j) − C_j]²,  C_j = T_below + (1 − T_below − T_above) Σ_{i<j} v_i
//
// where T_below and T_above are the Binned truncated tails (0 for measured
// data, so C runs from 0 to 1). The parameters are searched as logarithms
// (positive by construction) with gonum's Nelder–Mead simplex, restarted
// once from the best point. RMS is in units of cumulative fraction; R² is
// 1 − Σr²/Σ(C − C̄)². A fit with R² below 0.99 carries a warning. Errors:
// "distribution.family" for an unknown family, the Binned's own errors.
func Fit(b *Binned, familyName string) (FitResult, error) {
	fam, ok := families[familyName]
	if !ok {
		return FitResult{}, &valid.FieldError{Field: "distribution.family", Value: familyName,
			Message: `must be "rosin-rammler", "log-normal", "upper-limit" or "nukiyama-tanasawa"`}
	}
	if b == nil || b.Len() < 2 || len(b.Edges) != b.Len()+1 || len(b.Volume) != b.Len() {
		return FitResult{}, &valid.FieldError{Field: "distribution.edges_m", Message: "needs at least two classes to fit"}
	}
	if err := checkEdges(b.Edges); err != nil {
		return FitResult{}, err
	}
	inRange := 1 - b.TruncatedBelow - b.TruncatedAbove
	measured := make([]float64, len(b.Edges))
	measured[0] = b.TruncatedBelow
	var cum float64
	for i, v := range b.Volume {
		cum += v
		measured[i+1] = b.TruncatedBelow + inRange*cum
	}
	cost := func(th []float64) float64 {
		m := fam.model(th)
		if m.Validate() != nil {
			return 1e6
		}
		var s float64
		for j, e := range b.Edges {
			r := m.VolumeCDF(e) - measured[j]
			s += r * r
		}
		if math.IsNaN(s) {
			return 1e6
		}
		return s
	}
	th := fam.start(b)
	for i, v := range th {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			th[i] = 0
		}
	}
	for range 3 {
		res, err := optimize.Minimize(optimize.Problem{Func: cost}, th, &optimize.Settings{
			FuncEvaluations: 4000,
			Converger:       &optimize.FunctionConverge{Absolute: 1e-15, Relative: 1e-12, Iterations: 200},
		}, &optimize.NelderMead{})
		if err != nil && res == nil {
			return FitResult{}, fmt.Errorf("sizedist: fit %s: %w", familyName, err)
		}
		th = res.X
	}
	m := fam.model(th)
	if err := m.Validate(); err != nil {
		return FitResult{}, fmt.Errorf("sizedist: fit %s found no valid parameters: %w", familyName, err)
	}
	out := FitResult{Family: familyName, Model: m, Params: fam.params(m), Edges: append([]float64(nil), b.Edges...), Measured: measured}
	var mean float64
	for _, c := range measured {
		mean += c
	}
	mean /= float64(len(measured))
	var ssr, sst float64
	out.Residuals = make([]float64, len(measured))
	for j, e := range b.Edges {
		r := m.VolumeCDF(e) - measured[j]
		out.Residuals[j] = r
		ssr += r * r
		sst += (measured[j] - mean) * (measured[j] - mean)
	}
	out.RMS = math.Sqrt(ssr / float64(len(measured)))
	if sst > 0 {
		out.R2 = 1 - ssr/sst
	}
	if out.R2 < 0.99 {
		out.Warnings = append(out.Warnings, fmt.Sprintf("the %s fit is poor (R² = %.4f)", familyName, out.R2))
	}
	return out, nil
}
