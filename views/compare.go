package views

import (
	"fmt"
	"math"
	"net/url"
	"strconv"
	"strings"

	"fogbench/calc"
)

// MaxCompare is the most cases one comparison shows side by side.
const MaxCompare = 6

// CompareView is the side-by-side comparison of 2 to MaxCompare cases
// against a baseline: input and result tables with differences and overlay
// plots. It carries the numbers (not only text) so that other outputs, such
// as a printed comparison report, can be built from the same model.
type CompareView struct {
	Chrome
	Cases   []CompareCase // in the order of the URL
	Base    int           // index into Cases of the baseline
	Inputs  []CompareRow  // case-file fields, all of them
	Results []CompareRow  // key results
	Plots   []Plot        // overlays, one series per case
}

// CompareCase is one column of a comparison.
type CompareCase struct {
	ID       int64
	Revision int
	Name     string
	Case     calc.Case
	Result   *calc.Result // nil when the case could not be computed
	Error    string       // why it could not be computed
}

// CompareRow is one quantity across the cases. For numbers, Values holds
// them in the unit shown (Unit); Has says which cases have the quantity.
// For text, Text holds it and Numeric is false.
type CompareRow struct {
	Label   string
	Symbol  string
	Unit    string
	Numeric bool
	Values  []float64
	Has     []bool
	Text    []string
	// Key, when set, is what Differs compares in a text row (the exact
	// value) where Text is rounded for display.
	Key []string
	Sig int // significant figures to show; 4 when zero
}

// IDs lists the case numbers in column order.
func (v CompareView) IDs() []int64 {
	ids := make([]int64, len(v.Cases))
	for i, c := range v.Cases {
		ids[i] = c.ID
	}
	return ids
}

// BaseCase is the baseline column.
func (v CompareView) BaseCase() CompareCase { return v.Cases[v.Base] }

// CompareURL is the address that reopens a comparison of ids with the
// baseline base.
func CompareURL(ids []int64, base int64) string {
	parts := make([]string, len(ids))
	for i, id := range ids {
		parts[i] = strconv.FormatInt(id, 10)
	}
	return "/compare?ids=" + url.QueryEscape(strings.Join(parts, ",")) + "&base=" + strconv.FormatInt(base, 10)
}

// URL reopens this comparison.
func (v CompareView) URL() string { return CompareURL(v.IDs(), v.BaseCase().ID) }

// BaseURL is this comparison with case i as the baseline.
func (v CompareView) BaseURL(i int) string { return CompareURL(v.IDs(), v.Cases[i].ID) }

// WithoutURL is this comparison without case i, or "" when that would leave
// fewer than two cases.
func (v CompareView) WithoutURL(i int) string {
	if len(v.Cases) <= 2 {
		return ""
	}
	var ids []int64
	for j, c := range v.Cases {
		if j != i {
			ids = append(ids, c.ID)
		}
	}
	base := v.BaseCase().ID
	if i == v.Base {
		base = ids[0]
	}
	return CompareURL(ids, base)
}

// Differs reports whether case i's value differs from the baseline's.
func (r CompareRow) Differs(i, base int) bool {
	if r.Numeric {
		if r.Has[i] != r.Has[base] {
			return true
		}
		return r.Has[i] && r.Values[i] != r.Values[base]
	}
	if r.Key != nil {
		return r.Key[i] != r.Key[base]
	}
	return r.Text[i] != r.Text[base]
}

// AnyDiffers reports whether any case differs from the baseline.
func (r CompareRow) AnyDiffers(base int) bool {
	n := len(r.Text)
	if r.Numeric {
		n = len(r.Values)
	}
	for i := range n {
		if r.Differs(i, base) {
			return true
		}
	}
	return false
}

func (r CompareRow) sig() int {
	if r.Sig > 0 {
		return r.Sig
	}
	return 4
}

// Cell is case i's value as shown.
func (r CompareRow) Cell(i int) string {
	if !r.Numeric {
		if r.Text[i] == "" {
			return "—"
		}
		return r.Text[i]
	}
	if !r.Has[i] {
		return "—"
	}
	return Num(r.Values[i], r.sig())
}

// Delta is case i minus the baseline, in the row's unit, signed; "" for the
// baseline itself, for text, and where either value is missing.
func (r CompareRow) Delta(i, base int) string {
	if !r.Numeric || i == base || !r.Has[i] || !r.Has[base] {
		return ""
	}
	d := r.Values[i] - r.Values[base]
	if d == 0 {
		return "±0"
	}
	s := Num(d, 3)
	if d > 0 {
		s = "+" + s
	}
	return strings.Replace(s, "-", "−", 1)
}

// DeltaPercent is the difference relative to the baseline, in percent; ""
// where Delta is empty or the baseline is zero (no meaningful ratio).
func (r CompareRow) DeltaPercent(i, base int) string {
	if r.Delta(i, base) == "" || r.Values[base] == 0 {
		return ""
	}
	p := (r.Values[i] - r.Values[base]) / math.Abs(r.Values[base]) * 100
	s := fmt.Sprintf("%+.3g %%", p)
	if math.Abs(p) >= 1000 {
		s = fmt.Sprintf("%+.0f %%", p)
	}
	return strings.Replace(s, "-", "−", 1)
}

// DeltaText joins Delta and DeltaPercent for a table cell.
func (r CompareRow) DeltaText(i, base int) string {
	d := r.Delta(i, base)
	if d == "" {
		return ""
	}
	if p := r.DeltaPercent(i, base); p != "" {
		return d + " (" + p + ")"
	}
	return d
}

// ChangedInputs counts the input rows that differ from the baseline.
func (v CompareView) ChangedInputs() int {
	n := 0
	for _, r := range v.Inputs {
		if r.AnyDiffers(v.Base) {
			n++
		}
	}
	return n
}

// FieldUnit is the unit a case-file field is shown in, read from the
// suffix of its name (docs/case-format.md), and the factor from the file's
// SI value: diameters and lengths in µm, the rest as stored.
func FieldUnit(path string) (string, float64) {
	name := path[strings.LastIndex(path, ".")+1:]
	switch {
	case strings.HasSuffix(name, "_m_s"):
		return "m/s", 1
	case strings.HasSuffix(name, "_kg_s"):
		return "kg/s", 1
	case strings.HasSuffix(name, "_pa"):
		return "Pa", 1
	case strings.HasSuffix(name, "_k"):
		return "K", 1
	case strings.HasSuffix(name, "_m"):
		return "µm", 1e6
	case strings.HasSuffix(name, "_s"):
		return "s", 1
	}
	return "", 1
}
