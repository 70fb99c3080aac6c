package atomize

import (
	"fmt"
	"math"
	"strings"

	"fogbench/calc/valid"
)

// lookup finds the family and the chosen correlation; an empty
// correlationID picks the family's default, which is nil for a family that
// offers none.
func lookup(familyID, correlationID string) (*family, *correlation, error) {
	f, ok := familyByID[familyID]
	if !ok {
		return nil, nil, &valid.FieldError{Field: "distribution.family", Value: familyID,
			Message: "unknown atomizer family; valid families: " + familyIDs()}
	}
	if correlationID == "" {
		correlationID = f.info.DefaultCorrelation
		if correlationID == "" {
			return f, nil, nil
		}
	}
	c := f.correlation(correlationID)
	if c == nil {
		msg := "unknown correlation for family " + f.info.ID + "; valid correlations: " + f.correlationIDs()
		if len(f.corrs) == 0 {
			msg = "family " + f.info.ID + " has no SMD correlation (" + f.info.SMDStatus + "); leave the correlation empty"
		}
		return nil, nil, &valid.FieldError{Field: "distribution.correlation", Value: correlationID, Message: msg}
	}
	return f, c, nil
}

// Evaluate computes the operating point of an atomizer of the given family:
// the liquid flow (mass flow, flow number in SI, US lb/(h psi^0.5) and UK
// gal/(h psi^0.5), discharge coefficient), the drop size from every
// applicable correlation with the chosen one first (an empty correlation
// picks the family default), the spread between them, the cone angle and
// film thickness where a published method gives them, and the
// dimensionless groups.
//
// Inputs are SI with the unit in the name (see Families). Properties are SI.
// Bad input (NaN, ±Inf, zero or negative values, unknown names, missing
// required inputs) returns a *valid.FieldError naming
// "distribution.inputs.<name>", "properties.<name>", "distribution.family"
// or "distribution.correlation". Points outside a correlation's validity
// range are evaluated and flagged (InRange false, with a warning), never
// silently extrapolated.
func Evaluate(familyID, correlationID string, inputs map[string]float64, props Properties) (Result, error) {
	f, c, err := lookup(familyID, correlationID)
	if err != nil {
		return Result{}, err
	}
	pt, err := newPoint(f, inputs, props)
	if err != nil {
		return Result{}, err
	}
	return f.result(pt, c)
}

// estimate evaluates correlation c at pt with its range checks.
func (c *correlation) estimate(pt *point) (SMDEstimate, error) {
	v := c.smd(pt)
	if math.IsNaN(v) || math.IsInf(v, 0) || v <= 0 {
		return SMDEstimate{}, &valid.FieldError{Field: "distribution.inputs", Value: valid.FormatValue(v),
			Message: "the inputs are so extreme that " + c.info.ID + " gives no finite drop size"}
	}
	e := SMDEstimate{Correlation: c.info.ID, SMD: v, Quantity: c.info.Quantity, InRange: true,
		Source: c.info.Source, Status: c.info.Status, Provenance: c.info.Provenance}
	for _, r := range c.info.Ranges {
		q, ok := pt.quantity(r.Quantity)
		if ok && (q < r.Min || q > r.Max) {
			e.InRange = false
			e.Warnings = append(e.Warnings, fmt.Sprintf("%s: %s = %s is outside its validity range %s–%s (%s); the value is extrapolated",
				c.info.ID, r.Quantity, valid.FormatValue(q), valid.FormatValue(r.Min), valid.FormatValue(r.Max), r.Source))
		}
	}
	if c.info.Quantity != quantitySMD {
		e.Warnings = append(e.Warnings, fmt.Sprintf("%s gives the %s, not the SMD", c.info.ID, c.info.Quantity))
	}
	return e, nil
}

// result assembles the Result of a resolved point with chosen correlation c
// (nil when the family has none).
func (f *family) result(pt *point, c *correlation) (Result, error) {
	r := Result{Family: f.info.ID, SMDStatus: f.info.SMDStatus}
	if c != nil {
		if err := c.applies(pt); err != nil {
			return Result{}, err
		}
		r.Correlation = c.info.ID
		e, err := c.estimate(pt)
		if err != nil {
			return Result{}, err
		}
		r.SMD = append(r.SMD, e)
		r.Warnings = append(r.Warnings, e.Warnings...)
	}
	for _, o := range f.corrs {
		if o == c {
			continue
		}
		if err := o.applies(pt); err != nil {
			pt.notef("%s not evaluated: %v", o.info.ID, err)
			continue
		}
		e, err := o.estimate(pt)
		if err != nil {
			return Result{}, err
		}
		r.SMD = append(r.SMD, e)
	}
	if w := unconfirmedWarning(r.SMD); w != "" {
		r.Warnings = append(r.Warnings, w)
	}
	r.SMDBand = band(r.SMD)
	if a, ok := r.Estimate("rizk-lefebvre-1980"); ok {
		if b, ok := r.Estimate("elshanawany-lefebvre-1980"); ok {
			ratio := math.Max(a.SMD, b.SMD) / math.Min(a.SMD, b.SMD)
			r.Warnings = append(r.Warnings, fmt.Sprintf("the two prefilming airblast forms differ by a factor of %.2f here "+
				"(about 2.9 for kerosene at 100 m/s, ALR 3, 20 mm lip); neither published form was confirmed here, so use neither as a validation target", ratio))
		}
	}

	r.MassFlow, r.MassFlowKnown = pt.mdot, pt.hasMass
	if pt.hasMass && pt.has(inALR) {
		r.GasMassFlow = pt.in[inALR] * pt.mdot
	}
	if pt.fn > 0 {
		r.FlowNumberSI = pt.fn
		r.FlowNumberUS = flowNumberUS(pt.fn, pt.p.LiquidDensity)
		r.FlowNumberUK = flowNumberUK(pt.fn, pt.p.LiquidDensity)
	}
	r.DischargeCoefficient, r.FlowKnown = pt.cd, pt.flowKnown
	r.LiquidVelocity = pt.uL
	if pt.coneKnown {
		r.ConeAngleDeg, r.ConeAngleKnown, r.ConeAngleSource = pt.cone, true, pt.coneSource
	}
	if pt.filmKnown {
		r.FilmThickness, r.FilmThicknessKnown, r.FilmThicknessSource = pt.film, true, pt.filmSource
	}
	r.Groups = f.groups(pt)
	r.Warnings = append(r.Warnings, pt.warnings...)
	r.Notes = pt.notes
	if err := r.checkFinite(); err != nil {
		return Result{}, err
	}
	return r, nil
}

// unconfirmedWarning names the estimates whose published form was not
// confirmed, or is "" when every one was checked.
func unconfirmedWarning(es []SMDEstimate) string {
	var ids []string
	for _, e := range es {
		if !e.Provenance.Checked {
			ids = append(ids, e.Correlation)
		}
	}
	if len(ids) == 0 {
		return ""
	}
	return "published form not confirmed here for " + strings.Join(ids, ", ") + ": use the band between correlations"
}

// applies reports why c cannot be evaluated at pt, or nil when it can.
func (c *correlation) applies(pt *point) error {
	if c.needs == nil {
		return nil
	}
	return c.needs(pt)
}

// band is the spread between the estimates that predict the SMD.
func band(es []SMDEstimate) Band {
	var b Band
	for _, e := range es {
		if e.Quantity != quantitySMD {
			continue
		}
		if b.Count == 0 || e.SMD < b.Min {
			b.Min = e.SMD
		}
		if b.Count == 0 || e.SMD > b.Max {
			b.Max = e.SMD
		}
		b.Count++
	}
	if b.Count > 1 {
		b.Ratio = b.Max / b.Min
	}
	return b
}

// checkFinite keeps NaN and ±Inf from escaping when inputs are extreme
// enough to overflow.
func (r Result) checkFinite() error {
	vals := []struct {
		name string
		v    float64
	}{
		{"mass_flow_kg_s", r.MassFlow}, {"gas_mass_flow_kg_s", r.GasMassFlow},
		{"flow_number_m2", r.FlowNumberSI}, {"flow_number_lb_h_psi05", r.FlowNumberUS},
		{"flow_number_ukgal_h_psi05", r.FlowNumberUK}, {"discharge_coefficient", r.DischargeCoefficient},
		{"liquid_velocity_m_s", r.LiquidVelocity}, {"cone_angle_deg", r.ConeAngleDeg},
		{"film_thickness_m", r.FilmThickness}, {"smd_band", r.SMDBand.Ratio},
	}
	for _, g := range r.Groups {
		vals = append(vals, struct {
			name string
			v    float64
		}{g.Symbol, g.Value})
	}
	for _, x := range vals {
		if math.IsNaN(x.v) || math.IsInf(x.v, 0) {
			return &valid.FieldError{Field: "distribution.inputs", Value: valid.FormatValue(x.v),
				Message: "the inputs are so extreme that " + x.name + " is not a finite number"}
		}
	}
	return nil
}
