package calc

import (
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"strings"

	"fogbench/calc/fluid"
	"fogbench/calc/valid"
)

// CaseFormat is the format tag of version 1 of the case file
// (docs/case-format.md). Field names of version 1 stay stable; fields may be
// added.
const CaseFormat = "fogbench-case/1"

// MaxCaseFileBytes bounds a case file (or an array of cases) read by Decode.
const MaxCaseFileBytes = 8 << 20

// MaxCasesPerFile bounds the cases in one file: each costs up to seconds of
// evaluation, and one request must not occupy the server for hours.
const MaxCasesPerFile = 100

// MaxBatchFileBytes and MaxBatchCases bound a batch file read by
// DecodeBatch for `fogbench eval`, which runs on the engineer's own machine
// and time (Ctrl-C stops it), so a whole study fits in one process.
const (
	MaxBatchFileBytes = 64 << 20
	MaxBatchCases     = 10000
)

// Case is one spray scenario as an engineer enters it: the liquid, the gas it
// is sprayed into, and the drop-size distribution. All quantities are SI with
// the unit in the JSON name.
type Case struct {
	Format string `json:"format"`
	Name   string `json:"name"`
	Notes  string `json:"notes,omitempty"`
	Fluid  string `json:"fluid"`
	// CustomFluid defines a user liquid inside the case, so the case file
	// stays self-contained; it is used when its id equals Fluid.
	CustomFluid *fluid.CustomSpec `json:"custom_fluid,omitempty"`

	// LiquidTemperatureK fixes every drop's surface temperature. When nil,
	// each bin's drop sits at its own solved steady (wet-bulb) temperature.
	LiquidTemperatureK *float64 `json:"liquid_temperature_k,omitempty"`
	// InjectionTemperatureK with Heating "transient" starts the drops at this
	// temperature and heats or cools them in the evaporation history.
	InjectionTemperatureK *float64 `json:"injection_temperature_k,omitempty"`
	Heating               string   `json:"heating,omitempty"`

	Gas          Gas          `json:"gas"`
	Distribution Distribution `json:"distribution"`
	Evaporation  Evaporation  `json:"evaporation,omitzero"`
}

// Gas is the far-field gas the spray enters.
type Gas struct {
	ID           string  `json:"id,omitempty"` // "air" (default) or "nitrogen"
	PressurePa   float64 `json:"pressure_pa"`
	TemperatureK float64 `json:"temperature_k"`
	// Ambient vapor of the sprayed liquid, given in exactly one way.
	VaporMoleFraction      *float64 `json:"vapor_mole_fraction,omitempty"`
	VaporPartialPressurePa *float64 `json:"vapor_partial_pressure_pa,omitempty"`
	RelativeHumidity       *float64 `json:"relative_humidity,omitempty"` // 0..1, of the sprayed liquid's vapor
	RelativeVelocityMS     float64  `json:"relative_velocity_m_s,omitempty"`
}

// Distribution selects how the drop sizes are given: a parametric model, an
// atomizer correlation, or measured bins.
type Distribution struct {
	Model string `json:"model"`

	// rosin-rammler: 1 − Q3 = exp(−(D/X)^q)
	XM float64 `json:"x_m,omitempty"`
	Q  float64 `json:"q,omitempty"`
	// log-normal: median of the number or volume distribution and the
	// geometric standard deviation
	MedianM float64 `json:"median_m,omitempty"`
	GSD     float64 `json:"gsd,omitempty"`
	// upper-limit (Mugele–Evans): maximum diameter, volume median, spread
	DUpperM float64 `json:"d_upper_m,omitempty"`
	Dv50M   float64 `json:"dv50_m,omitempty"`
	Delta   float64 `json:"delta,omitempty"`
	// nukiyama-tanasawa: dN/dD = a D^p exp(−b D^q_nt) with b given through
	// the scale diameter b^(−1/q_nt)
	ScaleM float64 `json:"scale_m,omitempty"`
	P      float64 `json:"p,omitempty"`
	QNT    float64 `json:"q_nt,omitempty"`
	// Optional: size a parametric model by its Sauter mean diameter instead
	// of its own scale parameter (rosin-rammler with q, log-normal with gsd).
	D32M float64 `json:"d32_m,omitempty"`

	// atomizer: family, correlation, inputs; the spread q above shapes the
	// Rosin–Rammler distribution around the correlation's SMD.
	Family      string             `json:"family,omitempty"`
	Correlation string             `json:"correlation,omitempty"`
	Inputs      map[string]float64 `json:"inputs,omitempty"`

	// Cutting a model into bins.
	Bins    int     `json:"bins,omitempty"`
	DMinM   float64 `json:"d_min_m,omitempty"`
	DMaxM   float64 `json:"d_max_m,omitempty"`
	Spacing string  `json:"spacing,omitempty"` // "log" (default) or "linear"

	// bins: measured or hand-entered classes.
	EdgesM   []float64 `json:"edges_m,omitempty"`
	Fraction []float64 `json:"fraction,omitempty"`
	Basis    string    `json:"basis,omitempty"` // "volume" or "number"
}

// Evaporation holds the options of the evaporation model. The zero value is
// the default: Ranz–Marshall convection, Fuchs–Sutugin transition correction,
// curvature on.
type Evaporation struct {
	Convection        string  `json:"convection,omitempty"` // "ranz-marshall" (default), "abramzon-sirignano", "none"
	NoTransition      bool    `json:"no_transition,omitempty"`
	AccommodationCoef float64 `json:"accommodation_coefficient,omitempty"` // Fuchs–Sutugin α, default 1
	SprayVelocityMS   float64 `json:"spray_velocity_m_s,omitempty"`        // for the history against distance
	MassFlowKgS       float64 `json:"mass_flow_kg_s,omitempty"`            // for the drop count per second
	MaxTimeS          float64 `json:"max_time_s,omitempty"`                // history horizon; default: to 99 % evaporated
}

// Decode reads one case or a JSON array of cases, at most MaxCaseFileBytes
// and MaxCasesPerFile. Unknown fields are errors, so a misspelt field name is
// reported rather than silently ignored.
func Decode(r io.Reader) ([]Case, error) {
	return DecodeBatch(r, MaxCaseFileBytes, MaxCasesPerFile)
}

// DecodeBatch is Decode with the file's size and case count bounded by
// maxBytes and maxCases instead of the server's limits.
func DecodeBatch(r io.Reader, maxBytes, maxCases int) ([]Case, error) {
	data, err := io.ReadAll(io.LimitReader(r, int64(maxBytes)+1))
	if err != nil {
		return nil, fmt.Errorf("read case file: %w", err)
	}
	if len(data) > maxBytes {
		return nil, &valid.FieldError{Field: "file", Message: fmt.Sprintf("case file is larger than %d MiB", maxBytes>>20)}
	}
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	trimmed := bytes.TrimSpace(data)
	if len(trimmed) == 0 {
		return nil, &valid.FieldError{Field: "file", Message: "case file is empty"}
	}
	if trimmed[0] == '[' {
		var raws []json.RawMessage
		if err := valid.DecodeJSON(trimmed, &raws, "file"); err != nil {
			return nil, err
		}
		if len(raws) == 0 {
			return nil, &valid.FieldError{Field: "file", Message: "is an empty list; send one case or a list of at least one"}
		}
		if len(raws) > maxCases {
			return nil, &valid.FieldError{Field: "file", Value: fmt.Sprint(len(raws)),
				Message: fmt.Sprintf("holds too many cases; at most %d per file", maxCases)}
		}
		cases := make([]Case, len(raws))
		for i, raw := range raws {
			// The list index names the case: "[2].gas.pressure_pa".
			c, err := DecodeAt(raw, fmt.Sprintf("[%d]", i))
			if err != nil {
				return nil, err
			}
			cases[i] = c
		}
		return cases, nil
	}
	c, err := DecodeOne(trimmed)
	if err != nil {
		return nil, err
	}
	return []Case{c}, nil
}

// DecodeOne reads one case from JSON. Errors are field errors naming the
// field by its path in the case file (valid.DecodeJSON); "file" stands for
// the whole file.
func DecodeOne(data []byte) (Case, error) {
	return decodeCase(data, "file")
}

// DecodeAt reads one case that sits at path inside a larger JSON document
// (a list of cases, a bundle, a request): its errors name the field from
// the document's top, "cases[0].case.gas.pressure_pa".
func DecodeAt(data []byte, path string) (Case, error) {
	c, err := decodeCase(data, "")
	return c, valid.Within(path, err)
}

func decodeCase(data []byte, doc string) (Case, error) {
	var c Case
	if err := valid.DecodeJSON(data, &c, doc); err != nil {
		return Case{}, err
	}
	return c, nil
}

// Encode writes the case as indented JSON, the form stored and exported.
func (c Case) Encode() ([]byte, error) {
	return json.MarshalIndent(c, "", "  ")
}

// Normalize fills defaults that the file may omit (format tag, gas id).
func (c *Case) Normalize() {
	if c.Format == "" {
		c.Format = CaseFormat
	}
	if c.Gas.ID == "" {
		c.Gas.ID = "air"
	}
	if c.Distribution.Spacing == "" && c.Distribution.Model != "bins" {
		c.Distribution.Spacing = "log"
	}
	c.Name = strings.TrimSpace(c.Name)
	c.Distribution.prune()
}

// prune clears the parameters the chosen model does not read, so a case
// saved after switching models carries no stale values (they would show in
// comparisons and diffs as differences that change nothing).
func (d *Distribution) prune() {
	keep := Distribution{Model: d.Model}
	switch d.Model {
	case "bins":
		keep.EdgesM, keep.Fraction, keep.Basis = d.EdgesM, d.Fraction, d.Basis
		*d = keep
		return
	case "rosin-rammler":
		keep.XM, keep.Q, keep.D32M = d.XM, d.Q, d.D32M
	case "log-normal":
		keep.MedianM, keep.GSD, keep.Basis, keep.D32M = d.MedianM, d.GSD, d.Basis, d.D32M
	case "upper-limit":
		keep.DUpperM, keep.Dv50M, keep.Delta, keep.D32M = d.DUpperM, d.Dv50M, d.Delta, d.D32M
	case "nukiyama-tanasawa":
		keep.ScaleM, keep.P, keep.QNT, keep.D32M = d.ScaleM, d.P, d.QNT, d.D32M
	case "atomizer":
		keep.Family, keep.Correlation, keep.Inputs, keep.Q = d.Family, d.Correlation, d.Inputs, d.Q
	default:
		return // unknown model: leave everything for the validator to report
	}
	keep.Bins, keep.DMinM, keep.DMaxM, keep.Spacing = d.Bins, d.DMinM, d.DMaxM, d.Spacing
	*d = keep
}

// MaxClassesPerRequest bounds the size classes one server request may ask
// to evaluate, summed over its cases: evaluation time grows with the
// classes (a transient 2000-class case takes seconds), and although
// EvaluateContext stops when a client gives up, the work done until then
// is spent.
const MaxClassesPerRequest = 4000

// Classes is the number of size classes the case will be evaluated in:
// its measured classes, or its bins (DefaultBins when not given).
func (c Case) Classes() int {
	d := c.Distribution
	if d.Model == "bins" {
		return max(len(d.EdgesM)-1, 0)
	}
	if d.Bins <= 0 {
		return DefaultBins
	}
	return d.Bins
}

// CheckWork refuses a set of cases whose classes together exceed
// MaxClassesPerRequest, naming the file.
func CheckWork(cases []Case) error {
	total := 0
	for _, c := range cases {
		total += min(c.Classes(), MaxBins+1) // an absurd count is the validator's to report
	}
	if total > MaxClassesPerRequest {
		return &valid.FieldError{Field: "file", Value: fmt.Sprint(total),
			Message: fmt.Sprintf("asks for too many size classes in one request: at most %d in all; send fewer cases or fewer bins", MaxClassesPerRequest)}
	}
	return nil
}

// IsArray reports whether a case file holds a JSON array of cases.
func IsArray(data []byte) bool {
	t := bytes.TrimSpace(bytes.TrimPrefix(data, []byte("\xef\xbb\xbf")))
	return len(t) > 0 && t[0] == '['
}
