package fluid

import (
	"fmt"
	"math"

	"fogbench/calc/valid"
)

// CorrelationSpec is one user-given property correlation: a form name, its
// coefficients A..E and its validity range. The forms each property accepts
// are listed on CustomSpec.
type CorrelationSpec struct {
	Form  string  `json:"form"`
	Value float64 `json:"value,omitempty"` // the constant, for form "constant"
	A     float64 `json:"a,omitempty"`
	B     float64 `json:"b,omitempty"`
	C     float64 `json:"c,omitempty"`
	D     float64 `json:"d,omitempty"`
	E     float64 `json:"e,omitempty"`
	TMinK float64 `json:"t_min_k"`
	TMaxK float64 `json:"t_max_k"`
}

// CustomSpec defines a user liquid in SI units. Forms accepted:
//
//	vapor_pressure:        "antoine"   log10(p/Pa) = A - B/(T + C)
//	                       "dippr101"  ln(p/Pa) = A + B/T + C ln T + D T^E
//	                       "wagner25"  ln(p/pc) = (A t + B t^1.5 + C t^2.5 + D t^5)/Tr, t = 1 - Tr
//	liquid_density:        "constant" (kg/m3) | "dippr105" rho = M A/B^(1 + (1 - T/C)^D), A in mol/m3
//	surface_tension:       "constant" (N/m) | "linear" sigma = A + B T | "power" sigma = A (1 - T/Tc)^B
//	liquid_viscosity:      "constant" (Pa s) | "dippr101" mu = exp(A + B/T + C ln T + D T^E)
//	latent_heat:           "constant" (J/kg) | "watson" h = A [(1 - T/Tc)/(1 - B/Tc)]^C, A in J/kg at B K
//	                       (C = 0.38 if zero) | "dippr106" h = A (1 - Tr)^(B + C Tr + D Tr^2)/M, A in J/mol
//	liquid_heat_capacity:  "constant" (J/(kg K)) | "dippr100" cp = (A + B T + C T^2 + D T^3 + E T^4)/M, J/(mol K)
//	vapor_heat_capacity:   "constant" (J/(kg K)) | "poling" cp = R (A + B T + C T^2 + D T^3 + E T^4)/M
//
// Vapor viscosity and conductivity follow from Chung's method with the
// critical constants, so critical_volume_m3_mol is needed; if zero it is
// estimated as Vc = Zc R Tc/pc with Zc = 0.2918 - 0.0928 omega (Pitzer
// correlation as given in Reid, Prausnitz & Poling 4th ed.; from memory).
type CustomSpec struct {
	ID                   string          `json:"id"`
	Name                 string          `json:"name"`
	MolarMassKgMol       float64         `json:"molar_mass_kg_mol"`
	CriticalTemperatureK float64         `json:"critical_temperature_k"`
	CriticalPressurePa   float64         `json:"critical_pressure_pa"`
	CriticalVolumeM3Mol  float64         `json:"critical_volume_m3_mol,omitempty"`
	NormalBoilingPointK  float64         `json:"normal_boiling_point_k"`
	MeltingPointK        float64         `json:"melting_point_k"`
	DipoleMomentDebye    float64         `json:"dipole_moment_debye,omitempty"`
	DiffusionVolume      float64         `json:"diffusion_volume"`
	VaporPressure        CorrelationSpec `json:"vapor_pressure"`
	LiquidDensity        CorrelationSpec `json:"liquid_density"`
	SurfaceTension       CorrelationSpec `json:"surface_tension"`
	LiquidViscosity      CorrelationSpec `json:"liquid_viscosity"`
	LatentHeat           CorrelationSpec `json:"latent_heat"`
	LiquidHeatCapacity   CorrelationSpec `json:"liquid_heat_capacity"`
	VaporHeatCapacity    CorrelationSpec `json:"vapor_heat_capacity"`
	Reference            string          `json:"reference,omitempty"` // where the user took the data from
}

// NewCustomLiquid validates spec and builds a Liquid from it. Every bad field
// is reported at once in a valid.Errors naming it ("custom.critical_pressure_pa",
// "custom.vapor_pressure.form", ...): constants must be finite and positive,
// melting point < boiling point < critical temperature, each range must lie
// in [melting point, Tc], every property must be finite and positive over its
// range, the vapor pressure must rise with T over its range, surface tension
// and latent heat must not rise, and p_s at the given boiling point must be
// within 10 % of 101325 Pa (a consistency check; common practice, no source).
func NewCustomLiquid(spec CustomSpec) (*Liquid, error) {
	var es valid.Errors
	const pre = "custom."
	if spec.ID == "" {
		es = append(es, &valid.FieldError{Field: pre + "id", Message: "must not be empty"})
	} else if _, err := Lookup(spec.ID); err == nil {
		es = append(es, &valid.FieldError{Field: pre + "id", Value: spec.ID, Message: "is a built-in liquid; choose another id"})
	}
	for f, v := range map[string]float64{
		"molar_mass_kg_mol": spec.MolarMassKgMol, "critical_temperature_k": spec.CriticalTemperatureK,
		"critical_pressure_pa": spec.CriticalPressurePa, "normal_boiling_point_k": spec.NormalBoilingPointK,
		"melting_point_k": spec.MeltingPointK, "diffusion_volume": spec.DiffusionVolume,
	} {
		es.Add(valid.Positive(pre+f, v))
	}
	es.Add(valid.NonNegative(pre+"critical_volume_m3_mol", spec.CriticalVolumeM3Mol))
	es.Add(valid.NonNegative(pre+"dipole_moment_debye", spec.DipoleMomentDebye))
	if err := es.Err(); err != nil {
		return nil, err
	}
	if !(spec.MeltingPointK < spec.NormalBoilingPointK && spec.NormalBoilingPointK < spec.CriticalTemperatureK) {
		es.Add(valid.Errorf(pre+"normal_boiling_point_k", spec.NormalBoilingPointK,
			"must lie between the melting point and the critical temperature"))
		return nil, es.Err()
	}
	m, tc, pc := spec.MolarMassKgMol, spec.CriticalTemperatureK, spec.CriticalPressurePa
	l := &Liquid{
		ID: spec.ID, Name: spec.Name, molarMass: m, tc: tc, pc: pc,
		tb: spec.NormalBoilingPointK, tmelt: spec.MeltingPointK,
		dipole: spec.DipoleMomentDebye, diffVolume: spec.DiffusionVolume,
	}
	if l.Name == "" {
		l.Name = spec.ID
	}
	ref := "user data"
	if spec.Reference != "" {
		ref = "user data: " + spec.Reference
	}
	build := func(field, property string, cs CorrelationSpec, forms map[string]func(CorrelationSpec) func(float64) float64) correlation {
		f, ok := forms[cs.Form]
		if !ok {
			names := make([]string, 0, len(forms))
			for k := range forms {
				names = append(names, k)
			}
			es = append(es, &valid.FieldError{Field: pre + field + ".form", Value: cs.Form, Message: fmt.Sprintf("unknown form; use one of %v", names)})
			return correlation{}
		}
		lo, hi := cs.TMinK, cs.TMaxK
		if !(lo >= l.tmelt && hi <= tc && lo < hi) {
			es.Add(valid.Errorf(pre+field+".t_min_k", lo, "range %s..%s K must be ordered and lie within melting point %s K .. Tc %s K",
				valid.FormatValue(lo), valid.FormatValue(hi), valid.FormatValue(l.tmelt), valid.FormatValue(tc)))
			return correlation{}
		}
		return correlation{property, "user " + cs.Form, ref, lo, hi, f(cs)}
	}
	constant := func(cs CorrelationSpec) func(float64) float64 { return func(float64) float64 { return cs.Value } }
	l.psat = build("vapor_pressure", "saturation pressure", spec.VaporPressure, map[string]func(CorrelationSpec) func(float64) float64{
		"antoine":  func(c CorrelationSpec) func(float64) float64 { return antoine(c.A, c.B, c.C) },
		"dippr101": func(c CorrelationSpec) func(float64) float64 { return dippr101(c.A, c.B, c.C, c.D, c.E) },
		"wagner25": func(c CorrelationSpec) func(float64) float64 { return wagner25(tc, pc, c.A, c.B, c.C, c.D) },
	})
	l.rho = build("liquid_density", "liquid density", spec.LiquidDensity, map[string]func(CorrelationSpec) func(float64) float64{
		"constant": constant,
		"dippr105": func(c CorrelationSpec) func(float64) float64 {
			return molarToMassDensity(m, dippr105(c.A, c.B, c.C, c.D))
		},
	})
	l.sigma = build("surface_tension", "surface tension", spec.SurfaceTension, map[string]func(CorrelationSpec) func(float64) float64{
		"constant": constant,
		"linear": func(c CorrelationSpec) func(float64) float64 {
			return func(T float64) float64 { return math.Max(c.A+c.B*T, 0) }
		},
		"power": func(c CorrelationSpec) func(float64) float64 { return mulero(tc, []float64{c.A}, []float64{c.B}) },
	})
	l.mu = build("liquid_viscosity", "liquid viscosity", spec.LiquidViscosity, map[string]func(CorrelationSpec) func(float64) float64{
		"constant": constant,
		"dippr101": func(c CorrelationSpec) func(float64) float64 { return dippr101(c.A, c.B, c.C, c.D, c.E) },
	})
	l.hvap = build("latent_heat", "latent heat", spec.LatentHeat, map[string]func(CorrelationSpec) func(float64) float64{
		"constant": constant,
		"watson": func(c CorrelationSpec) func(float64) float64 {
			n := c.C
			if n == 0 {
				n = 0.38
			}
			return watson(c.A, c.B, tc, n)
		},
		"dippr106": func(c CorrelationSpec) func(float64) float64 { return perMass(m, dippr106(tc, c.A, c.B, c.C, c.D)) },
	})
	l.cp = build("liquid_heat_capacity", "liquid heat capacity", spec.LiquidHeatCapacity, map[string]func(CorrelationSpec) func(float64) float64{
		"constant": constant,
		"dippr100": func(c CorrelationSpec) func(float64) float64 { return perMass(m, dippr100(c.A, c.B, c.C, c.D, c.E)) },
	})
	// The vapor cp range may exceed Tc (it is a gas property): checked apart.
	vc := spec.VaporHeatCapacity
	vforms := map[string]func(CorrelationSpec) func(float64) float64{
		"constant": constant,
		"poling":   func(c CorrelationSpec) func(float64) float64 { return perMass(m, idealGasCp(c.A, c.B, c.C, c.D, c.E)) },
	}
	if f, ok := vforms[vc.Form]; !ok {
		es = append(es, &valid.FieldError{Field: pre + "vapor_heat_capacity.form", Value: vc.Form, Message: "unknown form; use constant or poling"})
	} else if !(vc.TMinK > 0 && vc.TMinK < vc.TMaxK) {
		es.Add(valid.Errorf(pre+"vapor_heat_capacity.t_min_k", vc.TMinK, "range must be positive and ordered"))
	} else {
		l.cpVapor = correlation{"vapor heat capacity", "user " + vc.Form, ref, vc.TMinK, vc.TMaxK, f(vc)}
	}
	if spec.VaporPressure.Form == "antoine" && !(l.tmelt+spec.VaporPressure.C > 0) {
		es.Add(valid.Errorf(pre+"vapor_pressure.c", spec.VaporPressure.C, "makes T + C non-positive above the melting point"))
	}
	if err := es.Err(); err != nil {
		return nil, err
	}

	// Values: finite and positive over each range; p_s rising; sigma and
	// latent heat not rising.
	checks := []struct {
		field string
		c     correlation
		trend int // +1 rising, -1 not rising, 0 none
	}{
		{"vapor_pressure", l.psat, +1}, {"liquid_density", l.rho, 0}, {"surface_tension", l.sigma, -1},
		{"liquid_viscosity", l.mu, 0}, {"latent_heat", l.hvap, -1}, {"liquid_heat_capacity", l.cp, 0},
		{"vapor_heat_capacity", l.cpVapor, 0},
	}
	for _, ck := range checks {
		prev := math.NaN()
		for i := 0; i <= 100; i++ {
			T := ck.c.tmin + (ck.c.tmax-ck.c.tmin)*float64(i)/100
			v := ck.c.eval(T)
			if math.IsNaN(v) || math.IsInf(v, 0) || v < 0 || (v == 0 && ck.field != "surface_tension" && ck.field != "latent_heat") {
				es.Add(valid.Errorf(pre+ck.field, v, "is not a finite positive value at %.2f K", T))
				break
			}
			if i > 0 && ((ck.trend > 0 && !(v > prev)) || (ck.trend < 0 && v > prev*(1+1e-12))) {
				word := "rise"
				if ck.trend < 0 {
					word = "not rise"
				}
				es.Add(valid.Errorf(pre+ck.field, T, "must %s with temperature over its range (fails at this temperature, K)", word))
				break
			}
			prev = v
		}
	}
	if err := es.Err(); err != nil {
		return nil, err
	}
	if tb := spec.NormalBoilingPointK; tb >= l.psat.tmin && tb <= l.psat.tmax {
		if ps := l.psat.eval(tb); math.Abs(ps/101325-1) > 0.1 {
			es.Add(valid.Errorf(pre+"vapor_pressure", ps, "gives %s Pa at the normal boiling point %s K; expected 101325 Pa within 10 %%",
				valid.FormatValue(ps), valid.FormatValue(tb)))
		}
	}
	if err := es.Err(); err != nil {
		return nil, err
	}
	// The acentric factor by its definition (Pitzer 1955), extrapolating the
	// user's curve to 0.7 Tc if its range stops short.
	l.omega = -log10(l.psat.eval(0.7*tc)/pc) - 1
	if math.IsNaN(l.omega) || math.IsInf(l.omega, 0) {
		return nil, valid.Errorf(pre+"vapor_pressure", l.omega, "cannot be evaluated at 0.7 Tc for the acentric factor")
	}
	l.vc = spec.CriticalVolumeM3Mol
	if l.vc == 0 {
		l.vc = (0.2918 - 0.0928*l.omega) * gasConstant * tc / pc
	}
	l.constants = []Source{{"all constants", "user-defined liquid", ref}}
	chungVapor(l)
	return l, nil
}
