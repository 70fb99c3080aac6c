package views

import (
	"fmt"
	"strings"

	"fogbench/calc"
	"fogbench/calc/fluid"
	"fogbench/calc/units"
)

// FluidsView is the liquids page: every liquid's properties at one chosen
// temperature, plots comparing them over their ranges, and the user liquids.
type FluidsView struct {
	Chrome
	TempInput string // the temperature as typed
	TempUnit  string
	TempError string
	TK        float64 // the temperature of the table, K
	Rows      []FluidRow
	Plots     []Plot
}

// FluidRow is one liquid at the chosen temperature.
type FluidRow struct {
	ID, Name, Formula, Surrogate string
	User                         bool
	TMin, TMax                   float64 // joint published range, K
	Props                        *fluid.Properties
	Err                          string // why there are no values (past a hard limit)
}

// URL is the liquid's detail page.
func (r FluidRow) URL() string { return "/fluids/" + r.ID }

// Kind says where the liquid comes from.
func (r FluidRow) Kind() string {
	switch {
	case r.User:
		return "user-defined"
	case r.Surrogate != "":
		return "surrogate"
	}
	return "built-in"
}

// FluidColumns heads the comparison table, with the display units.
func (v FluidsView) FluidColumns() []string {
	return []string{"p_sat, " + v.Display.Unit(units.Pressure), "σ, mN/m", "ρ_L, kg/m³", "μ_L, mPa·s",
		"h_fg, kJ/kg", "c_p,L, kJ/(kg·K)", "M, g/mol", "T_b, " + v.Display.Unit(units.Temperature)}
}

// Cells formats a row's values in the view's units; empty when the liquid
// has no values at the temperature.
func (v FluidsView) Cells(r FluidRow) []string {
	p := r.Props
	if p == nil {
		return nil
	}
	return []string{
		v.Display.Value(units.Pressure, p.SaturationPressurePa, 4),
		Num(p.SurfaceTensionNM*1e3, 4),
		Num(p.LiquidDensityKgM3, 4),
		Num(p.LiquidViscosityPaS*1e3, 4),
		Num(p.LatentHeatJKg/1e3, 4),
		Num(p.LiquidHeatCapacityJKgK/1e3, 4),
		Num(p.MolarMassKgMol*1e3, 5),
		v.Display.Value(units.Temperature, p.NormalBoilingPointK, 5),
	}
}

// RangeText is a liquid's published range in display units.
func (v FluidsView) RangeText(r FluidRow) string {
	return rangeText(v.Display, r.TMin, r.TMax)
}

func rangeText(d Display, lo, hi float64) string {
	u := units.Default(d.System, units.Temperature)
	return Num(u.FromSI(lo), 4) + " – " + Num(u.FromSI(hi), 4) + " " + u.Symbol
}

// TempText is the table temperature in display units.
func (v FluidsView) TempText() string { return v.Display.Quantity(units.Temperature, v.TK, 5) }

// TempUnits lists the units the temperature box accepts.
func (v FluidsView) TempUnits() []string { return units.Symbols(units.Temperature) }

// FluidView is one liquid's page.
type FluidView struct {
	Chrome
	Liquid    FluidRow
	CAS       string
	Revision  int // user liquids: the stored revision
	Reference string
	Constants []Figure
	TempInput string
	TempUnit  string
	TempError string
	TK        float64
	Sources   []fluid.Source
	Plots     []Plot
	// Spec is the stored definition of a user liquid, shown as JSON.
	SpecJSON string
}

// TempUnits lists the units the temperature box accepts.
func (v FluidView) TempUnits() []string { return units.Symbols(units.Temperature) }

// RangeText is the liquid's joint published range.
func (v FluidView) RangeText() string { return rangeText(v.Display, v.Liquid.TMin, v.Liquid.TMax) }

// TempText is the table temperature in display units.
func (v FluidView) TempText() string { return v.Display.Quantity(units.Temperature, v.TK, 5) }

// PropertyRow is one property at the chosen temperature.
type PropertyRow struct {
	Label, Symbol, Key, Value, Unit string
}

// PropertyRows lists every property at the chosen temperature.
func (v FluidView) PropertyRows() []PropertyRow {
	p := v.Liquid.Props
	if p == nil {
		return nil
	}
	d := v.Display
	return []PropertyRow{
		{"Saturation (vapor) pressure", "p_sat", "saturation_pressure_pa", d.Value(units.Pressure, p.SaturationPressurePa, 5), d.Unit(units.Pressure)},
		{"Surface tension", "σ", "surface_tension_n_m", Num(p.SurfaceTensionNM*1e3, 5), "mN/m"},
		{"Liquid density", "ρ_L", "liquid_density_kg_m3", Num(p.LiquidDensityKgM3, 5), "kg/m³"},
		{"Liquid viscosity", "μ_L", "liquid_viscosity_pa_s", Num(p.LiquidViscosityPaS*1e3, 5), "mPa·s"},
		{"Latent heat of vaporization", "h_fg", "latent_heat_j_kg", Num(p.LatentHeatJKg/1e3, 5), "kJ/kg"},
		{"Liquid heat capacity", "c_p,L", "liquid_heat_capacity_j_kg_k", Num(p.LiquidHeatCapacityJKgK/1e3, 5), "kJ/(kg·K)"},
		{"Vapor heat capacity (ideal gas)", "c_p,v", "vapor_heat_capacity_j_kg_k", Num(p.VaporHeatCapacityJKgK/1e3, 5), "kJ/(kg·K)"},
		{"Vapor viscosity (low pressure)", "μ_v", "vapor_viscosity_pa_s", Num(p.VaporViscosityPaS*1e6, 5), "µPa·s"},
		{"Vapor thermal conductivity", "k_v", "vapor_conductivity_w_m_k", Num(p.VaporConductivityWMK*1e3, 5), "mW/(m·K)"},
		{"Liquid molar volume", "v_L", "molar_volume_m3_mol", Num(p.MolarVolumeM3Mol*1e6, 5), "cm³/mol"},
	}
}

// Warnings are the range warnings at the chosen temperature.
func (v FluidView) Warnings() []string {
	if v.Liquid.Props == nil {
		return nil
	}
	return v.Liquid.Props.Warnings
}

// ConstantFigures lists the liquid's constants in display units.
func ConstantFigures(l *fluid.Liquid, d Display) []Figure {
	return []Figure{
		{Label: "Molar mass", Symbol: "M", Value: Num(l.MolarMass()*1e3, 6), Unit: "g/mol"},
		{Label: "Normal boiling point", Symbol: "T_b", Value: d.Value(units.Temperature, l.NormalBoilingPoint(), 5), Unit: d.Unit(units.Temperature)},
		{Label: "Melting (triple) point", Symbol: "T_m", Value: d.Value(units.Temperature, l.MeltingPoint(), 5), Unit: d.Unit(units.Temperature)},
		{Label: "Critical temperature", Symbol: "T_c", Value: d.Value(units.Temperature, l.CriticalTemperature(), 5), Unit: d.Unit(units.Temperature)},
		{Label: "Critical pressure", Symbol: "p_c", Value: d.Value(units.Pressure, l.CriticalPressure(), 5), Unit: d.Unit(units.Pressure)},
		{Label: "Acentric factor", Symbol: "ω", Value: Num(l.AcentricFactor(), 4)},
		{Label: "Fuller diffusion volume", Symbol: "Σv", Value: Num(l.DiffusionVolume(), 4)},
	}
}

// PropertiesUsedView is the audit table of a case: each value the
// evaluation used, with its source.
type PropertiesUsedView struct {
	Display    Display
	Properties calc.Properties
}

// UsedRow is one line of the properties-used table.
type UsedRow struct {
	Label, Key, Value, Unit string
}

// Rows lists the values in display units, keyed by their result names.
func (v PropertiesUsedView) Rows() []UsedRow {
	p, d := v.Properties, v.Display
	return []UsedRow{
		{"Reference surface temperature", "temperature_k", d.Value(units.Temperature, p.TemperatureK, 5), d.Unit(units.Temperature)},
		{"Saturation pressure", "saturation_pressure_pa", d.Value(units.Pressure, p.SaturationPressurePa, 5), d.Unit(units.Pressure)},
		{"Surface tension", "surface_tension_n_m", Num(p.SurfaceTensionNM*1e3, 5), "mN/m"},
		{"Liquid density", "liquid_density_kg_m3", Num(p.LiquidDensityKgM3, 5), "kg/m³"},
		{"Liquid viscosity", "liquid_viscosity_pa_s", Num(p.LiquidViscosityPaS*1e3, 5), "mPa·s"},
		{"Latent heat", "latent_heat_j_kg", Num(p.LatentHeatJKg/1e3, 5), "kJ/kg"},
		{"Liquid heat capacity", "liquid_heat_capacity_j_kg_k", Num(p.LiquidHeatCapacityJKgK/1e3, 5), "kJ/(kg·K)"},
		{"Molar mass", "molar_mass_kg_mol", Num(p.MolarMassKgMol*1e3, 6), "g/mol"},
		{"Liquid molar volume", "molar_volume_m3_mol", Num(p.MolarVolumeM3Mol*1e6, 5), "cm³/mol"},
		{"Normal boiling point", "normal_boiling_point_k", d.Value(units.Temperature, p.NormalBoilingPointK, 5), d.Unit(units.Temperature)},
		{"Far-field gas density", "gas_density_kg_m3", Num(p.GasDensityKgM3, 5), "kg/m³"},
		{"Film temperature (1/3 rule)", "film_temperature_k", d.Value(units.Temperature, p.FilmTemperatureK, 5), d.Unit(units.Temperature)},
		{"Film density", "film_density_kg_m3", Num(p.FilmDensityKgM3, 5), "kg/m³"},
		{"Film viscosity", "film_viscosity_pa_s", Num(p.FilmViscosityPaS*1e6, 5), "µPa·s"},
		{"Film thermal conductivity", "film_conductivity_w_m_k", Num(p.FilmConductivityWMK*1e3, 5), "mW/(m·K)"},
		{"Film heat capacity", "film_heat_capacity_j_kg_k", Num(p.FilmHeatCapacityJKgK/1e3, 5), "kJ/(kg·K)"},
		{"Vapor–gas diffusivity", "diffusivity_m2_s", Num(p.DiffusivityM2S*1e6, 5), "mm²/s"},
		{"Mean free path", "mean_free_path_m", Num(p.MeanFreePathM*1e9, 4), "nm"},
		{"Ambient vapor mole fraction", "ambient_vapor_mole_fraction", Num(p.AmbientVaporMoleFraction, 4), ""},
	}
}

// CustomLiquidForm is the form for a user-defined liquid: the raw strings
// typed, and a message per bad field (keys as in the CustomSpec JSON, e.g.
// "vapor_pressure.a").
type CustomLiquidForm struct {
	Chrome
	Action   string
	Editing  bool // the id is fixed once stored
	Revision int
	Values   map[string]string
	Errors   map[string]string
	General  string
}

// Value is what was typed for a field.
func (f CustomLiquidForm) Value(name string) string { return f.Values[name] }

// Error is the message of a field, or "".
func (f CustomLiquidForm) Error(name string) string { return f.Errors[name] }

// HasErrors reports whether anything is marked.
func (f CustomLiquidForm) HasErrors() bool { return len(f.Errors) > 0 || f.General != "" }

// RowErrors gathers the messages of one correlation row (its form,
// coefficients, range and the checks on the whole curve).
func (f CustomLiquidForm) RowErrors(prop string) []string {
	var out []string
	for _, k := range append([]string{prop}, CorrelationColumns...) {
		key := prop
		if k != prop {
			key = prop + "." + k
		}
		if m := f.Errors[key]; m != "" {
			if key == prop {
				out = append(out, m)
			} else {
				out = append(out, k+": "+m)
			}
		}
	}
	return out
}

// CellInvalid reports whether a row cell is the field an error names.
func (f CustomLiquidForm) CellInvalid(prop, col string) bool {
	return f.Errors[prop+"."+col] != ""
}

// CorrelationColumns are the inputs of each correlation row.
var CorrelationColumns = []string{"form", "value", "a", "b", "c", "d", "e", "t_min_k", "t_max_k"}

// CustomConstant is one constant of a user liquid.
type CustomConstant struct {
	Key, Label, Unit, Help string
}

// CustomConstants lists the constants the form asks for, in SI as the case
// file stores them.
func CustomConstants() []CustomConstant {
	return []CustomConstant{
		{"molar_mass_kg_mol", "Molar mass", "kg/mol", "e.g. 0.100204 for n-heptane"},
		{"normal_boiling_point_k", "Normal boiling point", "K", "at 101325 Pa; checked against the vapor-pressure curve (within 10 %)"},
		{"melting_point_k", "Melting (triple) point", "K", "lower hard limit of the liquid"},
		{"critical_temperature_k", "Critical temperature", "K", "upper hard limit of the liquid"},
		{"critical_pressure_pa", "Critical pressure", "Pa", ""},
		{"critical_volume_m3_mol", "Critical volume", "m³/mol", "optional; estimated from Tc, pc and ω when empty"},
		{"dipole_moment_debye", "Dipole moment", "D", "optional; 0 for non-polar liquids"},
		{"diffusion_volume", "Fuller diffusion volume Σv", "–", "sum of atomic volumes, Poling et al. 5th ed. Table 11-1"},
	}
}

// CustomProperty is one correlation row of the form.
type CustomProperty struct {
	Key, Label string
	Forms      []Option
}

// CustomProperties lists the correlations with the forms each accepts (see
// fluid.CustomSpec for the equations).
func CustomProperties() []CustomProperty {
	return []CustomProperty{
		{"vapor_pressure", "Vapor pressure, Pa", []Option{{"antoine", "Antoine: log10 p = A − B/(T + C)"}, {"dippr101", "DIPPR 101: ln p = A + B/T + C ln T + D T^E"}, {"wagner25", "Wagner 2.5-5: ln(p/pc) = (A τ + B τ^1.5 + C τ^2.5 + D τ^5)/Tr"}}},
		{"liquid_density", "Liquid density, kg/m³", []Option{{"constant", "constant"}, {"dippr105", "DIPPR 105: ρ = M A/B^(1 + (1 − T/C)^D), A in mol/m³"}}},
		{"surface_tension", "Surface tension, N/m", []Option{{"constant", "constant"}, {"linear", "linear: σ = A + B T"}, {"power", "power: σ = A (1 − T/Tc)^B"}}},
		{"liquid_viscosity", "Liquid viscosity, Pa·s", []Option{{"constant", "constant"}, {"dippr101", "DIPPR 101: μ = exp(A + B/T + C ln T + D T^E)"}}},
		{"latent_heat", "Latent heat, J/kg", []Option{{"constant", "constant"}, {"watson", "Watson: A [(1 − T/Tc)/(1 − B/Tc)]^C, A in J/kg at B K"}, {"dippr106", "DIPPR 106: A (1 − Tr)^(B + C Tr + D Tr²)/M, A in J/mol"}}},
		{"liquid_heat_capacity", "Liquid heat capacity, J/(kg·K)", []Option{{"constant", "constant"}, {"dippr100", "DIPPR 100: (A + B T + C T² + D T³ + E T⁴)/M, J/(mol·K)"}}},
		{"vapor_heat_capacity", "Vapor heat capacity, J/(kg·K)", []Option{{"constant", "constant"}, {"poling", "ideal gas: R (A + B T + C T² + D T³ + E T⁴)/M"}}},
	}
}

// FieldName is the form input name of a row cell.
func FieldName(prop, col string) string { return prop + "." + col }

// ColumnLabel heads a correlation column.
func ColumnLabel(col string) string {
	switch col {
	case "form":
		return "Form"
	case "value":
		return "Constant"
	case "t_min_k":
		return "T min, K"
	case "t_max_k":
		return "T max, K"
	}
	return strings.ToUpper(col)
}

// CellLabel is the accessible name of a row cell.
func CellLabel(p CustomProperty, col string) string {
	return fmt.Sprintf("%s: %s", p.Label, ColumnLabel(col))
}

// PropertiesUsedView is the audit table of the case's result.
func (v CaseView) PropertiesUsedView() PropertiesUsedView {
	var p calc.Properties
	if v.Result != nil {
		p = v.Result.Properties
	}
	return PropertiesUsedView{Display: v.Display, Properties: p}
}

// Flag marks a liquid with values extrapolated past a published range.
func (r FluidRow) Flag() string {
	if r.Props != nil && len(r.Props.Warnings) > 0 {
		return "extrapolated"
	}
	return "in range"
}

// WarningText joins the range warnings for a tooltip.
func (r FluidRow) WarningText() string {
	if r.Props == nil {
		return ""
	}
	return strings.Join(r.Props.Warnings, " ")
}
