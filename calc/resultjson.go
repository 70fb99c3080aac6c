package calc

import (
	"encoding/json"
	"math"
	"slices"
	"strconv"
	"unicode/utf8"
)

// AppendJSON appends r as encoding/json.Marshal writes it: the same field
// names and order, the same omissions, the same float format and string
// escaping, byte for byte (TestResultJSONMatchesEncodingJSON). It exists
// for speed: a batch result is mostly float64 arrays, and the reflective
// encoder's per-field work cost about as much again as the number
// formatting itself (docs/performance.md). A NaN or Inf, which Evaluate
// never returns, is an error as with encoding/json. The rare nested parts
// (atomizer, superheat) go through encoding/json.
func (r *Result) AppendJSON(b []byte) ([]byte, error) {
	w := jsonWriter{b: slices.Grow(b, r.jsonSizeHint())}
	w.result(r)
	return w.b, w.err
}

// AppendResultsJSON appends the results as a JSON array, as
// encoding/json.Marshal writes a []*Result.
func AppendResultsJSON(b []byte, rs []*Result) ([]byte, error) {
	if rs == nil {
		return append(b, "null"...), nil
	}
	hint := 2
	for _, r := range rs {
		hint += r.jsonSizeHint() + 1
	}
	// One allocation of about the right size: growing a megabyte buffer by
	// doubling copied it again and again, which cost more than the floats.
	w := jsonWriter{b: append(slices.Grow(b, hint), '[')}
	for i, r := range rs {
		if i > 0 {
			w.b = append(w.b, ',')
		}
		w.result(r)
	}
	w.b = append(w.b, ']')
	return w.b, w.err
}

// jsonSizeHint is a little above the length of r's JSON, so that the
// buffer is allocated once: a bin row is at most about 400 bytes, a history
// value 24 (shortest digits of a float64 and a comma), a property source
// about 250, an atomizer estimate with its provenance about 1.2 KB and the
// rest a few KB. An underestimate by a fifth had made
// every result's buffer grow by doubling.
func (r *Result) jsonSizeHint() int {
	if r == nil {
		return 4
	}
	n := 4096 + 400*len(r.Bins) + 250*len(r.Properties.Sources)
	if e := r.Equilibrium; e != nil {
		n += 300 + len(e.Method)
	}
	if h := r.History; h != nil {
		n += 24 * (len(h.TS) + len(h.XM) + len(h.EvaporatedMassFraction) + len(h.D32M) + len(h.Dv50M))
	}
	if a := r.Atomizer; a != nil {
		// Each estimate carries its provenance record (citation, what it
		// was checked against, note): up to about 1.2 KB.
		n += 1200*len(a.SMD) + 250*(len(a.Notes)+len(a.Warnings)+len(a.Groups))
	}
	return n
}

// jsonWriter appends JSON; the first error sticks.
type jsonWriter struct {
	b   []byte
	err error
}

func (w *jsonWriter) raw(s string) { w.b = append(w.b, s...) }

// float writes f as encoding/json does for a float64: shortest
// round-trip digits, exponent form below 1e-6 and from 1e21 with a
// one-digit negative exponent written without its leading zero.
func (w *jsonWriter) float(f float64) {
	if math.IsInf(f, 0) || math.IsNaN(f) {
		if w.err == nil {
			w.err = &json.UnsupportedValueError{Str: strconv.FormatFloat(f, 'g', -1, 64)}
		}
		w.b = append(w.b, '0')
		return
	}
	abs := math.Abs(f)
	fmt := byte('f')
	if abs != 0 && (abs < 1e-6 || abs >= 1e21) {
		fmt = 'e'
	}
	w.b = strconv.AppendFloat(w.b, f, fmt, -1, 64)
	if fmt == 'e' {
		n := len(w.b)
		if n >= 4 && w.b[n-4] == 'e' && w.b[n-3] == '-' && w.b[n-2] == '0' {
			w.b[n-2] = w.b[n-1]
			w.b = w.b[:n-1]
		}
	}
}

func (w *jsonWriter) floatPtr(f *float64) {
	if f == nil {
		w.raw("null")
		return
	}
	w.float(*f)
}

func (w *jsonWriter) floats(fs []float64) {
	if fs == nil {
		w.raw("null")
		return
	}
	w.b = append(w.b, '[')
	for i, f := range fs {
		if i > 0 {
			w.b = append(w.b, ',')
		}
		w.float(f)
	}
	w.b = append(w.b, ']')
}

// str writes s as encoding/json does: ", \ and the HTML characters <, >
// and & escaped (\u003c, \u003e, \u0026), other printable ASCII and
// valid UTF-8 as they are. Control characters, invalid UTF-8 and U+2028,
// U+2029 (rare here) go through encoding/json, so that escaping stays
// exactly its own.
func (w *jsonWriter) str(s string) {
	for i := 0; i < len(s); {
		c := s[i]
		if c >= utf8.RuneSelf {
			r, size := utf8.DecodeRuneInString(s[i:])
			if r == utf8.RuneError || r == '\u2028' || r == '\u2029' {
				w.marshal(s)
				return
			}
			i += size
			continue
		}
		if c < 0x20 {
			w.marshal(s)
			return
		}
		i++
	}
	w.b = append(w.b, '"')
	start := 0
	for i := 0; i < len(s); i++ {
		var esc string
		switch s[i] {
		case '"':
			esc = `\"`
		case '\\':
			esc = `\\`
		case '<':
			esc = `\u003c`
		case '>':
			esc = `\u003e`
		case '&':
			esc = `\u0026`
		default:
			continue
		}
		w.b = append(w.b, s[start:i]...)
		w.b = append(w.b, esc...)
		start = i + 1
	}
	w.b = append(w.b, s[start:]...)
	w.b = append(w.b, '"')
}

func (w *jsonWriter) strs(ss []string) {
	if ss == nil {
		w.raw("null")
		return
	}
	w.b = append(w.b, '[')
	for i, s := range ss {
		if i > 0 {
			w.b = append(w.b, ',')
		}
		w.str(s)
	}
	w.b = append(w.b, ']')
}

func (w *jsonWriter) marshal(v any) {
	data, err := json.Marshal(v)
	if err != nil && w.err == nil {
		w.err = err
	}
	w.b = append(w.b, data...)
}

func (w *jsonWriter) result(r *Result) {
	if r == nil {
		w.raw("null")
		return
	}
	w.raw(`{"summary":`)
	w.summary(&r.Summary)
	w.raw(`,"bins":`)
	if r.Bins == nil {
		w.raw("null")
	} else {
		w.b = append(w.b, '[')
		for i := range r.Bins {
			if i > 0 {
				w.b = append(w.b, ',')
			}
			w.bin(&r.Bins[i])
		}
		w.b = append(w.b, ']')
	}
	w.raw(`,"curvature":`)
	w.curvature(&r.Curvature)
	w.raw(`,"properties":`)
	w.properties(&r.Properties)
	if e := r.Equilibrium; e != nil {
		w.raw(`,"equilibrium":`)
		w.equilibrium(e)
	}
	if h := r.History; h != nil {
		w.raw(`,"history":`)
		w.history(h)
	}
	if r.Atomizer != nil {
		w.raw(`,"atomizer":`)
		w.marshal(r.Atomizer)
	}
	if r.Superheat != nil {
		w.raw(`,"superheat":`)
		w.marshal(r.Superheat)
	}
	w.raw(`,"warnings":`)
	w.strs(r.Warnings)
	w.b = append(w.b, '}')
}

func (w *jsonWriter) summary(s *Summary) {
	w.raw(`{"d10_m":`)
	w.floatPtr(s.D10M)
	w.raw(`,"d20_m":`)
	w.floatPtr(s.D20M)
	w.raw(`,"d30_m":`)
	w.floatPtr(s.D30M)
	w.raw(`,"d32_m":`)
	w.float(s.D32M)
	w.raw(`,"d43_m":`)
	w.float(s.D43M)
	w.raw(`,"dv10_m":`)
	w.float(s.Dv10M)
	w.raw(`,"dv50_m":`)
	w.float(s.Dv50M)
	w.raw(`,"dv90_m":`)
	w.float(s.Dv90M)
	w.raw(`,"span":`)
	w.float(s.Span)
	w.raw(`,"relative_span":`)
	w.float(s.RelativeSpan)
	w.raw(`,"t50_s":`)
	w.floatPtr(s.T50S)
	w.raw(`,"t90_s":`)
	w.floatPtr(s.T90S)
	w.raw(`,"t99_s":`)
	w.floatPtr(s.T99S)
	if s.DropsPerSecond != nil {
		w.raw(`,"drops_per_s":`)
		w.float(*s.DropsPerSecond)
	}
	w.b = append(w.b, '}')
}

func (w *jsonWriter) bin(b *BinResult) {
	w.raw(`{"d_lo_m":`)
	w.float(b.DLoM)
	w.raw(`,"d_hi_m":`)
	w.float(b.DHiM)
	w.raw(`,"d_m":`)
	w.float(b.DM)
	w.raw(`,"number_fraction":`)
	w.float(b.NumberFraction)
	w.raw(`,"volume_fraction":`)
	w.float(b.VolumeFraction)
	w.raw(`,"laplace_pa":`)
	w.float(b.LaplacePa)
	w.raw(`,"vapor_pressure_pa":`)
	w.float(b.VaporPressurePa)
	w.raw(`,"kelvin_ratio":`)
	w.float(b.KelvinRatio)
	w.raw(`,"evaporation_enhancement":`)
	w.float(b.EvaporationEnhancement)
	w.raw(`,"lifetime_s":`)
	w.floatPtr(b.LifetimeS)
	w.raw(`,"surface_temperature_k":`)
	w.float(b.SurfaceTemperatureK)
	w.raw(`,"knudsen":`)
	w.float(b.Knudsen)
	w.raw(`,"regime":`)
	w.str(b.Regime)
	w.raw(`,"evaporation_rate_kg_s":`)
	w.float(b.EvaporationRateKgS)
	if b.Grows != nil {
		if *b.Grows {
			w.raw(`,"grows":true`)
		} else {
			w.raw(`,"grows":false`)
		}
	}
	if b.Transcritical {
		w.raw(`,"transcritical":true`)
	}
	w.b = append(w.b, '}')
}

func (w *jsonWriter) equilibrium(e *Equilibrium) {
	w.raw(`{"temperature_k":`)
	w.float(e.TemperatureK)
	w.raw(`,"flat_vapor_pressure_pa":`)
	w.float(e.FlatVaporPressurePa)
	w.raw(`,"poynting_factor":`)
	w.float(e.PoyntingFactor)
	w.raw(`,"fugacity_factor":`)
	w.float(e.FugacityFactor)
	w.raw(`,"enhancement_factor":`)
	w.float(e.EnhancementFactor)
	w.raw(`,"dissolved_gas_mole_fraction":`)
	w.float(e.DissolvedGasMoleFraction)
	w.raw(`,"latent_heat_j_kg":`)
	w.float(e.LatentHeatJKg)
	if e.MixtureCriticalTemperatureK != nil {
		w.raw(`,"mixture_critical_temperature_k":`)
		w.float(*e.MixtureCriticalTemperatureK)
	}
	w.raw(`,"method":`)
	w.str(e.Method)
	w.b = append(w.b, '}')
}

func (w *jsonWriter) curvature(c *Curvature) {
	w.raw(`{"kelvin_length_m":`)
	w.float(c.KelvinLengthM)
	w.raw(`,"enhancement_1pct_d_m":`)
	w.floatPtr(c.Enhancement1PctDM)
	w.raw(`,"enhancement_10pct_d_m":`)
	w.floatPtr(c.Enhancement10PctDM)
	w.raw(`,"laplace_one_atm_d_m":`)
	w.float(c.LaplaceOneAtmDM)
	if c.KelvinCriticalRadiusM != nil {
		w.raw(`,"kelvin_critical_radius_m":`)
		w.float(*c.KelvinCriticalRadiusM)
	}
	w.raw(`,"reference_temperature_k":`)
	w.float(c.ReferenceTemperatureK)
	w.b = append(w.b, '}')
}

func (w *jsonWriter) properties(p *Properties) {
	w.raw(`{"fluid":`)
	w.str(p.Fluid)
	w.raw(`,"temperature_k":`)
	w.float(p.TemperatureK)
	w.raw(`,"saturation_pressure_pa":`)
	w.float(p.SaturationPressurePa)
	w.raw(`,"surface_tension_n_m":`)
	w.float(p.SurfaceTensionNM)
	w.raw(`,"liquid_density_kg_m3":`)
	w.float(p.LiquidDensityKgM3)
	w.raw(`,"liquid_viscosity_pa_s":`)
	w.float(p.LiquidViscosityPaS)
	w.raw(`,"latent_heat_j_kg":`)
	w.float(p.LatentHeatJKg)
	w.raw(`,"liquid_heat_capacity_j_kg_k":`)
	w.float(p.LiquidHeatCapacityJKgK)
	w.raw(`,"molar_mass_kg_mol":`)
	w.float(p.MolarMassKgMol)
	w.raw(`,"molar_volume_m3_mol":`)
	w.float(p.MolarVolumeM3Mol)
	w.raw(`,"normal_boiling_point_k":`)
	w.float(p.NormalBoilingPointK)
	w.raw(`,"gas_density_kg_m3":`)
	w.float(p.GasDensityKgM3)
	w.raw(`,"film_temperature_k":`)
	w.float(p.FilmTemperatureK)
	w.raw(`,"film_density_kg_m3":`)
	w.float(p.FilmDensityKgM3)
	w.raw(`,"film_viscosity_pa_s":`)
	w.float(p.FilmViscosityPaS)
	w.raw(`,"film_conductivity_w_m_k":`)
	w.float(p.FilmConductivityWMK)
	w.raw(`,"film_heat_capacity_j_kg_k":`)
	w.float(p.FilmHeatCapacityJKgK)
	w.raw(`,"diffusivity_m2_s":`)
	w.float(p.DiffusivityM2S)
	w.raw(`,"mean_free_path_m":`)
	w.float(p.MeanFreePathM)
	w.raw(`,"ambient_vapor_mole_fraction":`)
	w.float(p.AmbientVaporMoleFraction)
	w.raw(`,"sources":`)
	if p.Sources == nil {
		w.raw("null")
	} else {
		w.b = append(w.b, '[')
		for i, s := range p.Sources {
			if i > 0 {
				w.b = append(w.b, ',')
			}
			w.raw(`{"property":`)
			w.str(s.Property)
			w.raw(`,"method":`)
			w.str(s.Method)
			w.raw(`,"reference":`)
			w.str(s.Reference)
			w.b = append(w.b, '}')
		}
		w.b = append(w.b, ']')
	}
	w.b = append(w.b, '}')
}

func (w *jsonWriter) history(h *History) {
	w.raw(`{"t_s":`)
	w.floats(h.TS)
	if len(h.XM) > 0 {
		w.raw(`,"x_m":`)
		w.floats(h.XM)
	}
	w.raw(`,"evaporated_mass_fraction":`)
	w.floats(h.EvaporatedMassFraction)
	w.raw(`,"d32_m":`)
	w.floats(h.D32M)
	w.raw(`,"dv50_m":`)
	w.floats(h.Dv50M)
	w.b = append(w.b, '}')
}
