package views

import (
	"fmt"
	"math"
	"net/url"
	"sort"
	"strings"

	"fogbench/calc/atomize"
	"fogbench/calc/units"
)

// AtomizerInputKind is the unit kind a form offers for an atomizer input of
// the given SI unit, or "" when the unit is fixed (dimensionless, m², deg,
// rpm, Hz).
func AtomizerInputKind(siUnit string) units.Kind {
	switch siUnit {
	case "Pa":
		return units.Pressure
	case "m":
		return units.Length
	case "kg/s":
		return units.MassFlow
	case "m/s":
		return units.Velocity
	}
	return ""
}

// AtomizerDefaultUnit is the unit an atomizer input starts in: nozzle
// dimensions in mm (drop sizes stay in µm), else the display unit.
func AtomizerDefaultUnit(kind units.Kind, d Display) string {
	if kind == units.Length {
		return "mm"
	}
	return d.Unit(kind)
}

// AtomizerInputKey is the form name of a family's input. Each family has its
// own names, so the hidden groups of other families never overwrite it.
func AtomizerInputKey(family, name string) string { return "at." + family + "." + name }

// AtomizerErrorKey is where a message about input name is shown.
func AtomizerErrorKey(name string) string { return "atomizer." + name }

// AtomizerInputField is one input of an atomizer family on a form.
type AtomizerInputField struct {
	Family, Name, Key  string
	Label              string
	FixedUnit          string // shown when Kind is ""
	Kind               units.Kind
	Value, Unit, Error string
	UnitOptions        []string
	Required           bool
	Hint               string
}

// AtomizerFormFamily is one family's group of inputs.
type AtomizerFormFamily struct {
	ID, Name, Description string
	Fields                []AtomizerInputField
	Correlations          []Option
	SMDStatus             string
	QHint                 string
}

// AtomizerFormFamilies lays out every family's inputs with the values, units
// and messages of a form (keys as AtomizerInputKey and AtomizerErrorKey).
func AtomizerFormFamilies(values, unitsChosen, errs map[string]string, d Display) []AtomizerFormFamily {
	var out []AtomizerFormFamily
	for _, f := range atomize.Families() {
		g := AtomizerFormFamily{ID: f.ID, Name: f.Name, Description: f.Description, SMDStatus: f.SMDStatus,
			QHint: fmt.Sprintf("Empty: the family's typical q = %s (%s).", Num(f.RosinRammlerQ, 3), f.RosinRammlerQSource)}
		for _, c := range f.Correlations {
			g.Correlations = append(g.Correlations, Option{c.ID, c.Name + " — " + c.Quantity})
		}
		// Messages name the input, not the family: show them in the chosen
		// family's group only.
		fe := errs
		if values["family"] != f.ID {
			fe = nil
		}
		for _, in := range f.Inputs {
			g.Fields = append(g.Fields, atomizerField(f.ID, in, values, unitsChosen, fe, d))
		}
		out = append(out, g)
	}
	return out
}

func atomizerField(family string, in atomize.InputInfo, values, unitsChosen, errs map[string]string, d Display) AtomizerInputField {
	key := AtomizerInputKey(family, in.Name)
	fld := AtomizerInputField{Family: family, Name: in.Name, Key: key, Label: upperFirst(in.Description),
		Kind: AtomizerInputKind(in.Unit), Value: values[key], Error: errs[AtomizerErrorKey(in.Name)], Required: in.Required}
	if fld.Kind == "" {
		fld.FixedUnit = in.Unit
		if in.Unit == "1" {
			fld.FixedUnit = "–"
		}
		fld.Hint = fmt.Sprintf("typical %s, usual %s – %s %s", Num(in.Typical, 3), Num(in.Min, 3), Num(in.Max, 3), fld.FixedUnit)
	} else {
		fld.Unit = unitsChosen[key]
		if fld.Unit == "" {
			fld.Unit = AtomizerDefaultUnit(fld.Kind, d)
		}
		fld.UnitOptions = units.Symbols(fld.Kind)
		u, err := units.Lookup(fld.Kind, fld.Unit)
		if err == nil {
			fld.Hint = fmt.Sprintf("typical %s, usual %s – %s %s", Num(u.FromSI(in.Typical), 3), Num(u.FromSI(in.Min), 3), Num(u.FromSI(in.Max), 3), u.Symbol)
		}
	}
	if in.Required {
		fld.Hint = "required; " + fld.Hint
	} else {
		fld.Hint = "optional; " + fld.Hint
	}
	return fld
}

func upperFirst(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

// AtomizerPanelView is the atomizer part of a case page or of the
// workbench: one evaluated operating point.
type AtomizerPanelView struct {
	Display Display
	Result  atomize.Result
	// LiquidDensity is the density the flow numbers were converted with.
	LiquidDensity float64
}

// FlowFigures are the liquid flow, flow numbers and discharge coefficient.
func (v AtomizerPanelView) FlowFigures() []Figure {
	r, d := v.Result, v.Display
	var figs []Figure
	if r.MassFlowKnown {
		figs = append(figs, Figure{Label: "Liquid mass flow", Symbol: "ṁ_L", Value: d.Value(units.MassFlow, r.MassFlow, 4), Unit: d.Unit(units.MassFlow)})
	}
	if r.GasMassFlow > 0 {
		figs = append(figs, Figure{Label: "Atomizing gas flow", Symbol: "ṁ_A", Value: d.Value(units.MassFlow, r.GasMassFlow, 4), Unit: d.Unit(units.MassFlow)})
	}
	if r.FlowKnown {
		figs = append(figs,
			Figure{Label: "Flow number (SI)", Symbol: "FN", Value: Num(r.FlowNumberSI, 4), Unit: "m²"},
			Figure{Label: "Flow number (US)", Symbol: "FN_US", Value: Num(r.FlowNumberUS, 4), Unit: "lb/(h·psi^0.5)"},
			Figure{Label: "Flow number (UK)", Symbol: "FN_UK", Value: Num(r.FlowNumberUK, 4), Unit: "UK gal/(h·psi^0.5)"},
			Figure{Label: "Discharge coefficient", Symbol: "C_D", Value: Num(r.DischargeCoefficient, 4)})
	}
	if r.LiquidVelocity > 0 {
		figs = append(figs, Figure{Label: "Mean orifice velocity", Symbol: "U_L", Value: d.Value(units.Velocity, r.LiquidVelocity, 4), Unit: d.Unit(units.Velocity)})
	}
	if r.ConeAngleKnown {
		figs = append(figs, Figure{Label: "Spray cone angle (full)", Symbol: "2θ", Value: Num(r.ConeAngleDeg, 3), Unit: "°", Hint: r.ConeAngleSource})
	}
	if r.FilmThicknessKnown {
		figs = append(figs, Figure{Label: "Film thickness at the orifice", Symbol: "t", Value: Micro(r.FilmThickness), Unit: "µm", Hint: r.FilmThicknessSource})
	}
	return figs
}

// FlowNumberNote states the flow-number conversions with the exact unit
// definitions and the density used.
func (v AtomizerPanelView) FlowNumberNote() string {
	if !v.Result.FlowKnown {
		return ""
	}
	kUS := atomize.Hour / atomize.Pound * math.Sqrt(atomize.PSI)
	kUK := atomize.Hour / atomize.UKGallon * math.Sqrt(atomize.PSI)
	rho := v.LiquidDensity
	if rho == 0 && v.Result.FlowNumberSI > 0 {
		// The density the conversion used follows from the result itself.
		rho = math.Pow(v.Result.FlowNumberUS/(kUS*v.Result.FlowNumberSI), 2)
	}
	return fmt.Sprintf("FN = ṁ_L/(ρ_L ΔP)^0.5 in m². FN_US = ṁ[lb/h]/ΔP[psi]^0.5 = (3600/0.45359237)·6894.757^0.5·ρ_L^0.5·FN = %s·ρ_L^0.5·FN; "+
		"FN_UK = Q[UK gal/h]/ΔP[psi]^0.5 = (3600/0.00454609)·6894.757^0.5·ρ_L^−0.5·FN = %s·ρ_L^−0.5·FN, with ρ_L = %s kg/m³ "+
		"(1 lb = 0.45359237 kg, 1 psi = 6894.757 Pa, 1 UK gal = 4.54609 L, all exact by definition).",
		Num(kUS, 6), Num(kUK, 6), Num(rho, 5))
}

// SMDRow is one correlation's estimate.
type SMDRow struct {
	Correlation, Name, Quantity, SMD, Source, Status string
	InRange, Chosen                                  bool
	Checked                                          bool // the form was checked against an independent text
	Warnings                                         []string
}

// RangeText says whether the estimate lies in the correlation's range.
func (r SMDRow) RangeText() string {
	if r.InRange {
		return "in range"
	}
	return "outside range"
}

// SMDRows lists every correlation's estimate, the chosen one first.
func (v AtomizerPanelView) SMDRows() []SMDRow {
	names := correlationNames()
	var rows []SMDRow
	for i, e := range v.Result.SMD {
		rows = append(rows, SMDRow{Correlation: e.Correlation, Name: names[e.Correlation], Quantity: e.Quantity,
			SMD: Micro(e.SMD), Source: e.Source, Status: e.Status, InRange: e.InRange, Chosen: i == 0, Warnings: e.Warnings,
			Checked: e.Provenance.Checked})
	}
	return rows
}

func correlationNames() map[string]string {
	out := map[string]string{}
	for _, f := range atomize.Families() {
		for _, c := range f.Correlations {
			out[c.ID] = c.Name
		}
	}
	return out
}

// BandText is the spread between the correlations.
func (v AtomizerPanelView) BandText() string {
	b := v.Result.SMDBand
	if b.Count < 2 {
		return ""
	}
	return fmt.Sprintf("%s – %s µm across %d correlations (largest/smallest = %s)", Micro(b.Min), Micro(b.Max), b.Count, Num(b.Ratio, 3))
}

// GroupRows are the dimensionless groups with their regimes.
func (v AtomizerPanelView) GroupRows() []atomize.Group { return v.Result.Groups }

// GroupValue formats a group's value.
func GroupValue(g atomize.Group) string { return Num(g.Value, 4) }

// BenchView is the atomizer workbench: one family, its operating point, and
// optionally the inverse sizing, Monte Carlo percentiles and a sweep plot.
type BenchView struct {
	Chrome
	Family      atomize.FamilyInfo
	Families    []Option
	Values      map[string]string
	Units       map[string]string
	Errors      map[string]string
	General     string
	Fluids      []Option
	Gases       []Option
	Correlation string
	Panel       *AtomizerPanelView
	Solution    *atomize.Solution
	SolveUnit   string // display unit of the solved input
	SolveKind   units.Kind
	MC          *atomize.Percentiles
	Sweep       *Plot
	FlowSweep   *Plot
	SweepNote   []string
	CaseURL     string // "use in a new case"
	APIJSON     string // the request body for POST /api/atomize
}

// Value is what was typed for a field.
func (v BenchView) Value(name string) string { return v.Values[name] }

// Error is the message of a field.
func (v BenchView) Error(name string) string { return v.Errors[name] }

// HasErrors reports whether anything is marked.
func (v BenchView) HasErrors() bool { return len(v.Errors) > 0 || v.General != "" }

// Fields are the family's inputs on the bench.
func (v BenchView) Fields() []AtomizerInputField {
	var out []AtomizerInputField
	for _, in := range v.Family.Inputs {
		out = append(out, atomizerField(v.Family.ID, in, v.Values, v.Units, v.Errors, v.Display))
	}
	return out
}

// InputOptions are the family's inputs as options (unknowns and sweep
// variables).
func (v BenchView) InputOptions() []Option {
	var out []Option
	for _, in := range v.Family.Inputs {
		out = append(out, Option{in.Name, in.Name + " (" + in.Unit + ")"})
	}
	return out
}

// CorrelationOptions are the family's correlations.
func (v BenchView) CorrelationOptions() []Option {
	var out []Option
	for _, c := range v.Family.Correlations {
		out = append(out, Option{c.ID, c.Name + " — " + c.Quantity})
	}
	return out
}

// FamilyURL links to another family's bench.
func FamilyURL(id string) string { return "/atomizers/" + url.PathEscape(id) }

// SolutionValue formats the solved (or nearest) value in the unit of that
// input on the form.
func (v BenchView) SolutionValue() string {
	s := v.Solution
	if s == nil {
		return ""
	}
	if v.SolveKind != "" {
		u, err := units.Lookup(v.SolveKind, v.SolveUnit)
		if err == nil {
			return Num(u.FromSI(s.Value), 6) + " " + u.Symbol
		}
	}
	return Num(s.Value, 6) + " " + v.SolveUnit
}

// SolutionAchieved formats what the solution gives against the target.
func (v BenchView) SolutionAchieved() string {
	s := v.Solution
	if s == nil {
		return ""
	}
	if s.Quantity == "smd_m" {
		return fmt.Sprintf("%s µm for a target of %s µm (relative error %s)", Micro(s.Achieved), Micro(s.Target), Num(s.RelativeError, 3))
	}
	d := v.Display
	return fmt.Sprintf("%s for a target of %s (relative error %s)", d.Quantity(units.MassFlow, s.Achieved, 6), d.Quantity(units.MassFlow, s.Target, 6), Num(s.RelativeError, 3))
}

// BracketText is the searched interval.
func (v BenchView) BracketText() string {
	s := v.Solution
	if s == nil {
		return ""
	}
	return fmt.Sprintf("searched %s – %s (SI) from %s, %d iterations", Num(s.Bracket[0], 4), Num(s.Bracket[1], 4), s.BracketSource, s.Iterations)
}

// MCFigures are the Monte Carlo percentiles.
func (v BenchView) MCFigures() []Figure {
	m := v.MC
	if m == nil {
		return nil
	}
	return []Figure{
		{Label: "At the nominal inputs", Symbol: "deterministic", Value: Micro(m.Deterministic), Unit: "µm"},
		{Label: "5th percentile", Symbol: "p5", Value: Micro(m.P5), Unit: "µm"},
		{Label: "Median", Symbol: "p50", Value: Micro(m.P50), Unit: "µm"},
		{Label: "95th percentile", Symbol: "p95", Value: Micro(m.P95), Unit: "µm"},
		{Label: "Mean", Symbol: "mean", Value: Micro(m.Mean), Unit: "µm"},
	}
}

// MCNote says how the percentiles were drawn.
func (v BenchView) MCNote() string {
	m := v.MC
	if m == nil {
		return ""
	}
	return fmt.Sprintf("%s by %s: %d samples evaluated (%d rejected, %d outside the validity range), seed %d. Each uncertain input is drawn log-normally with its nominal value as mean and the given coefficient of variation.",
		m.Quantity, m.Correlation, m.Samples, m.Failed, m.OutOfRange, m.Seed)
}

// CorrelationInfos are the family's correlations with equation, units,
// validity, source and verification status.
func (v BenchView) CorrelationInfos() []atomize.CorrelationInfo { return v.Family.Correlations }

// RangesText lists a correlation's validity ranges.
func RangesText(c atomize.CorrelationInfo) string {
	var parts []string
	for _, r := range c.Ranges {
		parts = append(parts, fmt.Sprintf("%s %s – %s", r.Quantity, Num(r.Min, 3), Num(r.Max, 3)))
	}
	sort.Strings(parts)
	return strings.Join(parts, "; ")
}

// UnitOptions lists the units of a kind the bench offers (mass units only
// for flows); with Unit it makes BenchView a UnitFields for numberField.
func (v BenchView) UnitOptions(kind units.Kind) []string { return units.Symbols(kind) }

// Unit is the unit chosen for a bench field, or the display default (µm for
// the target drop size).
func (v BenchView) Unit(name string, kind units.Kind) string {
	if u := v.Units[name]; u != "" {
		return u
	}
	return v.Display.Unit(kind)
}

// AtomizerView is the atomizer panel of a case whose drop sizes come from a
// nozzle, or nil.
func (v CaseView) AtomizerView() *AtomizerPanelView {
	if v.Result == nil || v.Result.Atomizer == nil {
		return nil
	}
	return &AtomizerPanelView{Display: v.Display, Result: *v.Result.Atomizer}
}
