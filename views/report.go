package views

import (
	"fmt"
	"strings"
	"time"

	"fogbench/calc"
	"fogbench/calc/atomize"
	"fogbench/calc/units"
)

// Paper sizes a report is laid out for.
const (
	PaperA4     = "a4"
	PaperLetter = "letter"
)

// ReportView is a case laid out for print and PDF. It carries the case
// page's view model, so both show the same figures formatted the same way.
type ReportView struct {
	CaseView
	Generated  time.Time // when the report was drawn
	Paper      string    // "a4", "letter" or "" (the print dialog decides)
	LiquidName string
	GasName    string
}

// GeneratedText is the time the report was drawn, in UTC to the minute.
func (v ReportView) GeneratedText() string { return v.Generated.UTC().Format("2006-01-02 15:04 UTC") }

// SavedDate is the date of the revision shown.
func (v ReportView) SavedDate() string { return v.Updated.UTC().Format("2006-01-02") }

// HeaderLine is the running header: which case, which revision.
func (v ReportView) HeaderLine() string {
	return fmt.Sprintf("Case %d · revision %d · saved %s", v.ID, v.Revision, v.SavedDate())
}

// Purpose is the report's one-line statement of what was estimated.
func (v ReportView) Purpose() string {
	c := v.Case
	liquid := v.LiquidName
	if liquid == "" {
		liquid = c.Fluid
	}
	gas := v.GasName
	if gas == "" {
		gas = c.Gas.ID
	}
	liquid = strings.ToLower(liquid)
	return fmt.Sprintf("Estimate the drop sizes, the curvature (Laplace and Kelvin) effects and the evaporation of %s %s spray in %s at %s and %s.",
		article(liquid), liquid, strings.ToLower(gas),
		v.Display.Quantity(units.Pressure, c.Gas.PressurePa, 4), v.Display.Quantity(units.Temperature, c.Gas.TemperatureK, 4))
}

// article is "an" before a vowel sound ("an ethanol", "an n-heptane"),
// else "a".
func article(word string) string {
	if word == "" {
		return "a"
	}
	if strings.ContainsRune("aeiou", rune(word[0])) ||
		(len(word) > 1 && word[1] == '-' && strings.ContainsRune("fhlmnrsx", rune(word[0]))) {
		return "an"
	}
	return "a"
}

// PaperClass selects the named page of report.css, or none.
func (v ReportView) PaperClass() string {
	switch v.Paper {
	case PaperA4, PaperLetter:
		return "paper-" + v.Paper
	}
	return ""
}

// PropertyRows lists the property values the evaluation used, in the units
// engineers read them in.
func (v ReportView) PropertyRows() []Figure {
	if v.Result == nil {
		return nil
	}
	p := v.Result.Properties
	d := v.Display
	f := func(label, sym string, val float64, unit string) Figure {
		return Figure{Label: label, Symbol: sym, Value: Num(val, 4), Unit: unit}
	}
	return []Figure{
		{Label: "Reference surface temperature", Symbol: "T_s", Value: d.Value(units.Temperature, p.TemperatureK, 5), Unit: d.Unit(units.Temperature)},
		{Label: "Saturation pressure (flat surface)", Symbol: "p_sat", Value: d.Value(units.Pressure, p.SaturationPressurePa, 4), Unit: d.Unit(units.Pressure)},
		f("Surface tension", "σ", p.SurfaceTensionNM*1e3, "mN/m"),
		f("Liquid density", "ρ_L", p.LiquidDensityKgM3, "kg/m³"),
		f("Liquid viscosity", "μ_L", p.LiquidViscosityPaS*1e3, "mPa·s"),
		f("Latent heat", "L", p.LatentHeatJKg/1e3, "kJ/kg"),
		f("Liquid heat capacity", "c_p,L", p.LiquidHeatCapacityJKgK, "J/(kg·K)"),
		f("Molar mass", "M", p.MolarMassKgMol*1e3, "g/mol"),
		f("Molar volume", "v_L", p.MolarVolumeM3Mol*1e6, "cm³/mol"),
		{Label: "Normal boiling point", Symbol: "T_b", Value: d.Value(units.Temperature, p.NormalBoilingPointK, 5), Unit: d.Unit(units.Temperature)},
		f("Gas density (far field)", "ρ_g", p.GasDensityKgM3, "kg/m³"),
		{Label: "Film temperature (1/3 rule)", Symbol: "T_f", Value: d.Value(units.Temperature, p.FilmTemperatureK, 5), Unit: d.Unit(units.Temperature)},
		f("Film density", "ρ_f", p.FilmDensityKgM3, "kg/m³"),
		f("Film viscosity", "μ_f", p.FilmViscosityPaS*1e6, "µPa·s"),
		f("Film thermal conductivity", "k_f", p.FilmConductivityWMK*1e3, "mW/(m·K)"),
		f("Film heat capacity", "c_p,f", p.FilmHeatCapacityJKgK, "J/(kg·K)"),
		f("Vapor diffusivity in the gas", "D", p.DiffusivityM2S*1e6, "mm²/s"),
		f("Mean free path", "λ", p.MeanFreePathM*1e9, "nm"),
		f("Ambient vapor mole fraction", "X_∞", p.AmbientVaporMoleFraction, "–"),
	}
}

// Sources are where the property values come from.
func (v ReportView) Sources() []calc.Source {
	if v.Result == nil {
		return nil
	}
	return v.Result.Properties.Sources
}

// Method is one model or equation the evaluation used, with its reference.
type Method struct {
	ID        string // anchor in the report: "method-" + ID
	Name      string
	Equation  string
	Use       string // what the report takes from it
	Reference string
}

// equilibriumMethod is the flat-surface equilibrium at the gas pressure:
// its equation, and the equation of state and sources the result names.
func equilibriumMethod(r *calc.Result) Method {
	m := Method{ID: "equilibrium", Name: "Surface equilibrium at the gas pressure (Poynting factor, fugacity coefficients, dissolved gas)",
		Equation:  "y_v φ_v p = x_L p_sat φ_sat exp[v_L (p − p_sat)/(R T)]; p_flat = y_v p; the surface stops at the mixture critical point of liquid and gas",
		Use:       "flat-surface vapor pressure of every class, gas dissolved in the liquid, latent heat at the surface, mixture critical limit",
		Reference: "docs/methods-evap.md (Equilibrium at the gas pressure)"}
	if r != nil && r.Equilibrium != nil {
		m.Reference = r.Equilibrium.Method + "; docs/methods-evap.md"
	}
	return m
}

// Anchor is the fragment a report links to.
func (m Method) Anchor() string { return "method-" + m.ID }

// Methods lists the models and equations this case's evaluation ran through,
// chosen from the case's options, so the list names only what was used. The
// references are those cited in calc's doc comments and docs/methods-*.md,
// with the recalled-not-read marks of those files in the user's words
// ("not checked against the printed source").
func (v ReportView) Methods() []Method {
	c := v.Case
	dist := c.Distribution
	var out []Method
	switch dist.Model {
	case "rosin-rammler":
		m := Method{ID: "sizes", Name: "Rosin–Rammler distribution",
			Equation:  "Q3(d) = 1 − exp[−(d/X)^q]",
			Use:       "cumulative volume of the drop sizes, cut into the size classes",
			Reference: "Rosin & Rammler, J. Inst. Fuel 7 (1933) 29–36; docs/methods-sizedist.md"}
		if dist.D32M > 0 {
			m.Equation += "; X from D32: X = D32 Γ(1 − 1/q)"
		}
		out = append(out, m)
	case "log-normal":
		out = append(out, Method{ID: "sizes", Name: "Log-normal distribution",
			Equation:  "Q(d) = Φ[(ln d − ln d50)/ln σg]; moments by the Hatch–Choate relations",
			Use:       "drop sizes, cut into the size classes",
			Reference: "Hatch & Choate, J. Franklin Inst. 207 (1929) 369–387 (citation details not checked); docs/methods-sizedist.md"})
	case "upper-limit":
		out = append(out, Method{ID: "sizes", Name: "Upper-limit log-normal distribution",
			Equation:  "Q3(d) = [1 + erf(δy)]/2, y = ln[a d/(d_max − d)], a = (d_max − Dv50)/Dv50",
			Use:       "drop sizes, cut into the size classes",
			Reference: "Mugele & Evans, Ind. Eng. Chem. 43 (1951) 1317–1324 (form not checked against the printed source); docs/methods-sizedist.md"})
	case "nukiyama-tanasawa":
		out = append(out, Method{ID: "sizes", Name: "Nukiyama–Tanasawa distribution",
			Equation:  "dN/dd = a d^p exp(−b d^q)",
			Use:       "drop sizes, cut into the size classes",
			Reference: "Nukiyama & Tanasawa, Trans. SME Japan 5 (1939) 62–67 (not checked against the printed source); docs/methods-sizedist.md"})
	case "atomizer":
		out = append(out, v.atomizerMethod())
		out = append(out, Method{ID: "sizes", Name: "Rosin–Rammler distribution around the correlation's SMD",
			Equation:  "Q3(d) = 1 − exp[−(d/X)^q], X = D32 Γ(1 − 1/q)",
			Use:       "drop sizes, cut into the size classes",
			Reference: "Rosin & Rammler, J. Inst. Fuel 7 (1933) 29–36; docs/methods-sizedist.md"})
	case "bins":
		out = append(out, Method{ID: "sizes", Name: "Measured size classes",
			Equation:  "constant number density in d within each class: <d^p> = (b^(p+1) − a^(p+1))/((p+1)(b − a))",
			Use:       "class averages, means and quantiles of the typed classes",
			Reference: "ASTM E799 class-average rule (the clause itself not read); docs/methods-sizedist.md"})
	}
	out = append(out,
		Method{ID: "means", Name: "Mean and representative diameters",
			Equation:  "D_pq = [Σ n_i <d^p>_i / Σ n_i <d^q>_i]^(1/(p−q)); Dv_F: fraction F of the volume in smaller drops",
			Use:       "D10, D30, D32, D43, Dv10, Dv50, Dv90 and the relative span",
			Reference: "Mugele & Evans (1951); ISO 9276-2:2014; docs/methods-sizedist.md"},
		Method{ID: "laplace", Name: "Young–Laplace equation",
			Equation:  "Δp = 2σ/r",
			Use:       "Laplace pressure per class; the diameter where it equals 1 atm",
			Reference: "Young–Laplace; docs/methods-evap.md (Curvature)"},
		Method{ID: "kelvin", Name: "Kelvin equation (Poynting integral, incompressible liquid)",
			Equation:  "p(r)/p_flat = exp[2σ v_L/(r R T)], p_flat the flat-surface equilibrium at the gas pressure; Kelvin length ℓ_K = 2σ v_L/(R T)",
			Use:       "vapor pressure raise per class and the curvature thresholds",
			Reference: "Thomson (1871); Seinfeld & Pandis, Atmospheric Chemistry and Physics, eq. 10.86 (equation number not checked); R from CODATA 2018"},
		equilibriumMethod(v.Result),
		Method{ID: "evaporation", Name: "Quasi-steady drop evaporation with Spalding transfer numbers",
			Equation:  "ṁ = π d ρ_g D Sh ln(1 + B_M), B_M = (Y_s − Y_∞)/(1 − Y_s); heat through B_T = (1 + B_M)^φ − 1",
			Use:       "evaporation rate, enhancement and lifetime per class",
			Reference: "Spalding (1953); Abramzon & Sirignano, Int. J. Heat Mass Transfer 32 (1989) 1605 (not checked against the printed source); docs/methods-evap.md"},
		convectionMethod(c.Evaporation.Convection))
	if !c.Evaporation.NoTransition {
		alpha := c.Evaporation.AccommodationCoef
		if alpha == 0 {
			alpha = 1
		}
		out = append(out, Method{ID: "transition", Name: "Fuchs–Sutugin transition-regime correction",
			Equation:  fmt.Sprintf("f = 0.75α(1 + Kn)/(Kn² + Kn + 0.283 Kn α + 0.75α), Kn = λ/r, α = %s", Num(alpha, 3)),
			Use:       "evaporation of drops comparable to the mean free path; Kn and regime per class",
			Reference: "Fuchs & Sutugin (1971); Seinfeld & Pandis eq. 12.43"})
	}
	if c.Heating == "transient" {
		out = append(out, Method{ID: "heating", Name: "Transient drop heating",
			Equation:  "dm/dt = −ṁ, m c_p,L dT_s/dt = Q − ṁL, integrated by Dormand–Prince 5(4)",
			Use:       "drop temperatures, lifetimes and the evaporation history, from the injection temperature",
			Reference: "Abramzon & Sirignano (1989) section 2 (not checked against the printed source); Dormand & Prince (1980); docs/methods-evap.md"})
	}
	// The per-class table (surface temperature, Kelvin ratio, rate) is at
	// the fixed or the steady temperature, transient heating or not.
	switch {
	case c.LiquidTemperatureK != nil:
		out = append(out, Method{ID: "temperature", Name: "Fixed drop temperature",
			Equation:  "T_s = the given liquid temperature for every class",
			Use:       "surface temperature per class",
			Reference: "case input"})
	default:
		out = append(out, Method{ID: "temperature", Name: "Steady (wet-bulb) drop temperature",
			Equation:  "root of Q − ṁL = 0 in T_s, solved per class by Brent's method",
			Use:       "surface temperature per class",
			Reference: "docs/methods-evap.md (Steady temperature)"})
	}
	out = append(out,
		Method{ID: "lifetime", Name: "Drop lifetime",
			Equation:  "t_life = ∫ (ρ_L π d²/2)/ṁ(d) dd from 0 to d0, by adaptive Gauss–Kronrod 7/15",
			Use:       "lifetime per class",
			Reference: "Piessens et al., QUADPACK (1983); d² law check: Godsave (1953), Spalding (1953); docs/methods-evap.md"},
		Method{ID: "history", Name: "Spray evaporation history",
			Equation:  "each class follows its own d(t); evaporated fraction 1 − Σ w_i (d_i/d0_i)³",
			Use:       "t50, t90, t99 and the history plot",
			Reference: "docs/methods-evap.md (Spray history)"})
	return out
}

func (v ReportView) atomizerMethod() Method {
	d := v.Case.Distribution
	m := Method{ID: "atomizer", Name: "Atomizer correlation " + d.Correlation, Use: "Sauter mean diameter of the spray"}
	id := d.Correlation
	if v.Result != nil && v.Result.Atomizer != nil && v.Result.Atomizer.Correlation != "" {
		id = v.Result.Atomizer.Correlation
	}
	for _, f := range atomize.Families() {
		if f.ID != d.Family {
			continue
		}
		for _, c := range f.Correlations {
			if c.ID == id || (id == "" && c.ID == f.DefaultCorrelation) {
				m.Name = fmt.Sprintf("%s (%s atomizer)", c.Name, f.Name)
				m.Equation = c.Equation
				m.Reference = c.Source
				if c.Status != "" {
					m.Reference += " — status: " + c.Status
				}
				if c.Validity != "" {
					m.Use += "; valid for " + c.Validity
				}
			}
		}
	}
	return m
}

func convectionMethod(name string) Method {
	switch name {
	case "abramzon-sirignano":
		return Method{ID: "convection", Name: "Abramzon–Sirignano film model",
			Equation:  "Sh* = 2 + (Sh0 − 2)/F(B_M), Nu* = 2 + (Nu0 − 2)/F(B_T), F(B) = (1 + B)^0.7 ln(1 + B)/B",
			Use:       "convective transfer at the relative velocity",
			Reference: "Abramzon & Sirignano (1989) (form not checked against the printed source); Clift, Grace & Weber (1978)"}
	case "frossling":
		return Method{ID: "convection", Name: "Frössling convection",
			Equation:  "Sh = 2(1 + 0.276 Re^½ Sc^⅓)",
			Use:       "convective transfer at the relative velocity",
			Reference: "Frössling (1938) (not checked against the printed source); docs/methods-evap.md"}
	case "none":
		return Method{ID: "convection", Name: "Stagnant surroundings",
			Equation:  "Sh = Nu = 2",
			Use:       "no convective enhancement",
			Reference: "limit of a sphere in still gas"}
	}
	return Method{ID: "convection", Name: "Ranz–Marshall convection",
		Equation:  "Sh = 2 + 0.6 Re^½ Sc^⅓, Nu = 2 + 0.6 Re^½ Pr^⅓",
		Use:       "convective transfer at the relative velocity",
		Reference: "Ranz & Marshall, Chem. Eng. Prog. 48 (1952) 141–146 and 173–180 (not checked against the printed source)"}
}

// MethodRef is the short label ("M3") of the method with this id, as the
// methods section numbers them, or "" when the evaluation did not use it.
func (v ReportView) MethodRef(id string) string {
	for i, m := range v.Methods() {
		if m.ID == id {
			return fmt.Sprintf("M%d", i+1)
		}
	}
	return ""
}

// MethodRefs joins the labels of several methods: "M1, M2".
func (v ReportView) MethodRefs(ids ...string) string {
	var refs []string
	for _, id := range ids {
		if r := v.MethodRef(id); r != "" {
			refs = append(refs, r)
		}
	}
	return strings.Join(refs, ", ")
}

// BinColumn is one column of the per-class table: its heading with unit and
// the method it comes from.
type BinColumn struct {
	Heading string
	Method  string // method id, "" for plain inputs
}

// BinColumns are the headings of the per-class table, in display units; the
// case page, the print report and the PDF all draw the table from them.
func (v CaseView) BinColumns() []BinColumn {
	d := v.Display
	return []BinColumn{
		{"Class, µm", "sizes"},
		{"d, µm", "sizes"},
		{"Number, %", "sizes"},
		{"Volume, %", "sizes"},
		{"Laplace 2σ/r, " + d.Unit(units.Pressure), "laplace"},
		{"Vapor pressure, " + d.Unit(units.Pressure), "equilibrium"},
		{"Kelvin ratio p(r)/p_flat", "kelvin"},
		{"Evaporation enhancement", "evaporation"},
		{"Lifetime, " + d.Unit(units.Time), "lifetime"},
		{"Surface T, " + d.Unit(units.Temperature), "temperature"},
		{"Kn", "transition"},
		{"Regime", "transition"},
	}
}

// Cells is the row in column order.
func (b BinRow) Cells() []string {
	return []string{b.Range, b.D, b.NumberPct, b.VolumePct, b.Laplace, b.VaporPressure, b.Kelvin, b.Enhancement, b.Lifetime, b.Ts, b.Kn, b.Regime}
}
