package views

import (
	"fmt"

	"fogbench/calc"
	"fogbench/calc/units"
)

// SuperheatView is the superheat panel of a case whose liquid leaves the
// nozzle above its boiling point.
type SuperheatView struct {
	S       *calc.Superheat
	Plot    *Plot
	Display Display
}

// SuperheatView builds the panel's view model; its S is nil when the case
// is not superheated.
func (v CaseView) SuperheatView() SuperheatView {
	var s *calc.Superheat
	if v.Result != nil {
		s = v.Result.Superheat
	}
	return SuperheatView{S: s, Plot: v.SuperheatPlot, Display: v.Display}
}

// RegimeClass is the CSS class of the regime badge.
func (v SuperheatView) RegimeClass() string {
	switch v.S.Regime {
	case "fully flashing":
		return "regime regime-full"
	case "transitional":
		return "regime regime-transitional"
	}
	return "regime regime-none"
}

// Figures are the superheat numbers in display units; missing limits say
// why they are missing.
func (v SuperheatView) Figures() []Figure {
	s := v.S
	d := v.Display
	temp := func(t float64) (string, string) { return d.Value(units.Temperature, t, 5), d.Unit(units.Temperature) }
	opt := func(label, sym string, p *float64, missing, hint string) Figure {
		f := Figure{Label: label, Symbol: sym, Value: missing, Hint: hint}
		if p != nil {
			f.Value, f.Unit = temp(*p)
		}
		return f
	}
	tl, tu := temp(s.TemperatureK)
	ts, _ := temp(s.SaturationTemperatureK)
	figs := []Figure{
		{Label: "Liquid temperature", Symbol: "T_l", Value: tl, Unit: tu, Hint: "from " + s.TemperatureField},
		{Label: "Boiling point at the gas pressure", Symbol: "T_sat(p)", Value: ts, Unit: tu},
		{Label: "Degree of superheat", Symbol: "ΔT", Value: Num(s.DeltaTK, 4), Unit: "K", Hint: "T_l − T_sat(p_amb)"},
		{Label: "Pressure ratio", Symbol: "R_p", Value: Num(s.PressureRatio, 4), Hint: "p_sat(T_l)/p_amb"},
		{Label: "Jakob number", Symbol: "Ja", Value: Num(s.Jakob, 4), Hint: "ρ_l c_p ΔT/(ρ_v h_fg): vapor volume one volume of liquid can make by flashing"},
	}
	r := Figure{Label: "Critical bubble radius", Symbol: "r_c", Value: "none (no superheat)", Hint: "2σ/(p_v* − p_l): smaller bubbles collapse, larger ones grow"}
	if s.CriticalBubbleRadiusM != nil {
		r.Value, r.Unit = Num(*s.CriticalBubbleRadiusM*1e9, 4), "nm"
	}
	figs = append(figs, r)
	w := Figure{Label: "Nucleation barrier", Symbol: "W/kT", Value: "—", Hint: "16πσ³/(3(p_v* − p_l)²) over kT"}
	if s.NucleationBarrierKT != nil {
		w.Value = Num(*s.NucleationBarrierKT, 4)
	}
	figs = append(figs, w,
		Figure{Label: "Homogeneous nucleation rate", Symbol: "J", Value: Num(s.NucleationRateM3S, 3), Unit: "1/(m³ s)",
			Hint: "classical nucleation theory (Blander & Katz 1975 form)"},
		opt("Kinetic limit of superheat", "T_kl", s.KineticLimitK, "not reached below Tc",
			fmt.Sprintf("temperature at which J reaches %s per m³ and second at this pressure", Num(s.NucleationThresholdM3S, 2))),
		opt("Liquid spinodal (Peng–Robinson)", "T_sp", s.SpinodalK, "none at this pressure",
			"thermodynamic end of the metastable liquid at this pressure"),
	)
	return figs
}
