package atomize

import (
	"errors"
	"fmt"
	"fogbench/calc/numeric"
	"math"

	"fogbench/calc/valid"
)

// Target is what Solve aims at: set exactly one of SMD (m) or MassFlow
// (kg/s).
type Target struct {
	SMD      float64 `json:"smd_m,omitempty"`
	MassFlow float64 `json:"mass_flow_kg_s,omitempty"`
}

// Solution is the result of an inverse sizing.
type Solution struct {
	Unknown       string     `json:"unknown"`
	Value         float64    `json:"value"` // the unknown's value: the solution, or the nearest reachable value
	Reached       bool       `json:"reached"`
	Quantity      string     `json:"quantity"` // "smd_m" or "mass_flow_kg_s"
	Target        float64    `json:"target"`
	Achieved      float64    `json:"achieved"`
	RelativeError float64    `json:"relative_error"` // Achieved/Target − 1
	Bracket       [2]float64 `json:"bracket"`
	BracketSource string     `json:"bracket_source"`
	Iterations    int        `json:"iterations"`
	Result        Result     `json:"result"` // the full evaluation at Value
	Message       string     `json:"message"`
	Warnings      []string   `json:"warnings,omitempty"`
}

// solveScanPoints is the number of log-spaced points scanned for a sign
// change before Brent's method refines it.
const solveScanPoints = 48

// Solve finds the value of one input (unknown, e.g. "delta_p_pa",
// "orifice_diameter_m", "air_velocity_m_s", "speed_rpm", "frequency_hz")
// that makes the chosen correlation give target.SMD, or the liquid flow
// equal target.MassFlow, with the other inputs as given.
//
// The search bracket is the correlation's validity range for the unknown
// where it states one, otherwise the usual input range of the family
// (common practice, no source). The bracket is scanned at 48 log-spaced
// points for a sign change of value/target − 1, which Brent's method
// (numeric.Brent) then refines in ln x to about 1e-13 relative. When several
// sign changes exist the smallest root is returned with a warning. When
// none exists, Reached is false, Message says so, and Value is the
// nearest reachable point (the scan minimum of |value/target − 1|, refined
// by golden-section search).
//
// Errors: unknown family, correlation or input name, a target that is not
// exactly one positive finite number, a family without an SMD correlation
// for an SMD target, and every input error of Evaluate.
func Solve(familyID, correlationID string, inputs map[string]float64, props Properties, unknown string, target Target) (Solution, error) {
	f, c, err := lookup(familyID, correlationID)
	if err != nil {
		return Solution{}, err
	}
	info, ok := f.inputInfo(unknown)
	if !ok {
		return Solution{}, &valid.FieldError{Field: "solve.unknown", Value: unknown,
			Message: "not an input of family " + f.info.ID + "; its inputs are: " + f.inputNames()}
	}
	smdTarget := target.SMD != 0
	if err := checkTarget(target); err != nil {
		return Solution{}, err
	}
	if smdTarget && c == nil {
		return Solution{}, &valid.FieldError{Field: "target.smd_m", Value: valid.FormatValue(target.SMD),
			Message: "family " + f.info.ID + " has no SMD correlation: " + f.info.SMDStatus}
	}
	sol := Solution{Unknown: unknown, Quantity: "smd_m", Target: target.SMD}
	if !smdTarget {
		sol.Quantity, sol.Target = "mass_flow_kg_s", target.MassFlow
	}

	in := make(map[string]float64, len(inputs)+1)
	for k, v := range inputs {
		in[k] = v
	}
	// residual is value/target − 1 at x; err reports why x cannot be
	// evaluated.
	residual := func(x float64) (float64, error) {
		in[unknown] = x
		pt, err := newPoint(f, in, props)
		if err != nil {
			return math.NaN(), err
		}
		if !smdTarget {
			if !pt.hasMass {
				return math.NaN(), missing(inMassFlow, "the liquid mass flow is not known for family "+f.info.ID+" with these inputs")
			}
			return pt.mdot/sol.Target - 1, nil
		}
		if err := c.applies(pt); err != nil {
			return math.NaN(), err
		}
		v := c.smd(pt)
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return math.NaN(), errors.New("non-finite drop size")
		}
		return v/sol.Target - 1, nil
	}

	lo, hi := info.Min, info.Max
	sol.BracketSource = "usual input range of " + unknown + " (common practice, no source)"
	if smdTarget {
		for _, r := range c.info.Ranges {
			if r.Quantity == unknown && r.Min < hi && r.Max > lo {
				lo, hi = math.Max(lo, r.Min), math.Min(hi, r.Max)
				sol.BracketSource = "validity range of " + c.info.ID + " for " + unknown + " (" + r.Source + ")"
			}
		}
	}
	sol.Bracket = [2]float64{lo, hi}

	// Scan in u = ln x.
	ulo, uhi := math.Log(lo), math.Log(hi)
	us := make([]float64, solveScanPoints)
	gs := make([]float64, solveScanPoints)
	var firstErr error
	for i := range us {
		us[i] = ulo + (uhi-ulo)*float64(i)/float64(solveScanPoints-1)
		g, err := residual(math.Exp(us[i]))
		if err != nil && firstErr == nil {
			firstErr = err
		}
		gs[i] = g
	}
	best := -1
	var roots []int
	for i := range gs {
		if math.IsNaN(gs[i]) {
			continue
		}
		if best < 0 || math.Abs(gs[i]) < math.Abs(gs[best]) {
			best = i
		}
		if i > 0 && !math.IsNaN(gs[i-1]) && (gs[i-1] > 0) != (gs[i] > 0) {
			roots = append(roots, i)
		}
		if gs[i] == 0 && (len(roots) == 0 || roots[len(roots)-1] != i) {
			roots = append(roots, i)
		}
	}
	if best < 0 {
		// Nothing in the bracket can be evaluated: report why.
		var fe *valid.FieldError
		if errors.As(firstErr, &fe) {
			return Solution{}, firstErr
		}
		return Solution{}, fmt.Errorf("atomize: solve %s: no point in %g–%g can be evaluated: %v", unknown, lo, hi, firstErr)
	}

	g := func(u float64) float64 { v, _ := residual(math.Exp(u)); return v }
	var u float64
	if len(roots) > 0 {
		i := roots[0]
		if gs[i] == 0 {
			u = us[i]
		} else {
			var it int
			u, it, err = numeric.Brent(g, us[i-1], us[i], gs[i-1], gs[i], 1e-13, 200)
			sol.Iterations = it
			if err != nil {
				return Solution{}, fmt.Errorf("atomize: solve %s: %w", unknown, err)
			}
		}
		sol.Reached = true
		if len(roots) > 1 {
			sol.Warnings = append(sol.Warnings, fmt.Sprintf("%d solutions exist in the bracket; the smallest %s is returned", len(roots), unknown))
		}
	} else {
		a, b := us[max(best-1, 0)], us[min(best+1, solveScanPoints-1)]
		u = goldenMinimum(func(u float64) float64 { return math.Abs(g(u)) }, a, b, us[best], math.Abs(gs[best]))
	}
	sol.Value = math.Exp(u)
	in[unknown] = sol.Value
	rc := c
	if !smdTarget && c != nil {
		// A mass-flow target does not need the chosen correlation; if it
		// cannot be evaluated here, report the others.
		if pt, err := newPoint(f, in, props); err == nil && c.applies(pt) != nil {
			rc = nil
		}
	}
	res, err := f.resultAt(in, props, rc)
	if err != nil {
		return Solution{}, err
	}
	sol.Result = res
	if smdTarget {
		sol.Achieved = res.SMD[0].SMD
	} else {
		sol.Achieved = res.MassFlow
	}
	sol.RelativeError = sol.Achieved/sol.Target - 1
	name := "SMD"
	unit := "m"
	if !smdTarget {
		name, unit = "mass flow", "kg/s"
	}
	if sol.Reached {
		sol.Message = fmt.Sprintf("%s = %s %s gives %s = %s %s", unknown, valid.FormatValue(sol.Value), info.Unit,
			name, valid.FormatValue(sol.Achieved), unit)
	} else {
		sol.Message = fmt.Sprintf("no %s in %s–%s %s (%s) gives %s = %s %s; the nearest reachable is %s = %s %s at %s = %s %s",
			unknown, valid.FormatValue(lo), valid.FormatValue(hi), info.Unit, sol.BracketSource, name,
			valid.FormatValue(sol.Target), unit, name, valid.FormatValue(sol.Achieved), unit, unknown,
			valid.FormatValue(sol.Value), info.Unit)
		if math.Abs(gs[0]-gs[len(gs)-1]) < 1e-12*math.Abs(gs[0]+1) {
			sol.Message += fmt.Sprintf("; the %s does not depend on %s here", name, unknown)
		}
		sol.Warnings = append(sol.Warnings, sol.Message)
	}
	return sol, nil
}

func checkTarget(t Target) error {
	switch {
	case t.SMD != 0 && t.MassFlow != 0:
		return valid.Errorf("target.mass_flow_kg_s", t.MassFlow, "give one target, SMD or mass flow, not both")
	case t.SMD != 0:
		return valid.Positive("target.smd_m", t.SMD)
	case t.MassFlow != 0:
		return valid.Positive("target.mass_flow_kg_s", t.MassFlow)
	}
	return &valid.FieldError{Field: "target.smd_m", Message: "give a target SMD or mass flow"}
}

// resultAt evaluates the full Result at inputs in.
func (f *family) resultAt(in map[string]float64, props Properties, c *correlation) (Result, error) {
	pt, err := newPoint(f, in, props)
	if err != nil {
		return Result{}, err
	}
	return f.result(pt, c)
}

// goldenMinimum minimizes h on [a, b] by golden-section search (Kiefer
// 1953), starting from the best known point x0 with value h0; it returns
// the best point found. Used only to locate the nearest reachable value.
func goldenMinimum(h func(float64) float64, a, b, x0, h0 float64) float64 {
	const invPhi = 0.6180339887498949 // (√5 − 1)/2
	bestX, bestH := x0, h0
	c := b - invPhi*(b-a)
	d := a + invPhi*(b-a)
	hc, hd := h(c), h(d)
	for i := 0; i < 80 && b-a > 1e-14*(1+math.Abs(a)); i++ {
		if hc < hd {
			b, d, hd = d, c, hc
			c = b - invPhi*(b-a)
			hc = h(c)
		} else {
			a, c, hc = c, d, hd
			d = a + invPhi*(b-a)
			hd = h(d)
		}
	}
	for _, p := range [][2]float64{{c, hc}, {d, hd}, {a, h(a)}, {b, h(b)}} {
		if !math.IsNaN(p[1]) && p[1] < bestH {
			bestX, bestH = p[0], p[1]
		}
	}
	return bestX
}
