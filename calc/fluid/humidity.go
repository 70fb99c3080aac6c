package fluid

import "fogbench/calc/valid"

// VaporMoleFractionFromPartialPressure returns x = pv/p for a vapor partial
// pressure pv and total pressure p, both in Pa (Dalton's law, ideal gas).
// pv must be in [0, p); p positive; errors name "gas.vapor_partial_pressure_pa"
// and "gas.pressure_pa".
func VaporMoleFractionFromPartialPressure(pv, p float64) (float64, error) {
	var es valid.Errors
	es.Add(valid.NonNegative("gas.vapor_partial_pressure_pa", pv))
	es.Add(valid.Positive("gas.pressure_pa", p))
	if err := es.Err(); err != nil {
		return 0, err
	}
	if pv >= p {
		return 0, valid.Errorf("gas.vapor_partial_pressure_pa", pv, "must be below the total pressure %s Pa", valid.FormatValue(p))
	}
	return pv / p, nil
}

// MaxSaturationRatio bounds a relative saturation: above 1 the gas is
// supersaturated (drops larger than the Kelvin equilibrium size grow);
// beyond 10 no gas stays supersaturated without nucleating drops of its
// own (common practice, no source).
const MaxSaturationRatio = 10

// VaporMoleFractionFromRelativeHumidity returns x = rh p_s(T)/p for a
// relative saturation rh in [0, MaxSaturationRatio] (above 1:
// supersaturated) of the liquid's vapor at gas temperature T
// in K and pressure p in Pa (ideal gas; the enhancement factor of real moist
// air, about 1.004 at 1 atm, is neglected). T must lie inside the liquid's
// hard limits (the saturation pressure is undefined above Tc); p_s(T) must be
// below p.
func VaporMoleFractionFromRelativeHumidity(l *Liquid, rh, T, p float64) (float64, error) {
	var es valid.Errors
	es.Add(valid.Between("gas.relative_humidity", rh, 0, MaxSaturationRatio, "(saturation ratio; 1 = saturated, above 1 supersaturated)"))
	es.Add(valid.Positive("gas.pressure_pa", p))
	if T < l.tmelt || T > l.tc {
		es.Add(valid.Errorf("gas.temperature_k", T, "relative saturation of %s is defined only between %s K and %s K",
			l.Name, valid.FormatValue(l.tmelt), valid.FormatValue(l.tc)))
	} else {
		es.Add(valid.Finite("gas.temperature_k", T))
	}
	if err := es.Err(); err != nil {
		return 0, err
	}
	ps := l.SaturationPressure(T)
	if rh*ps >= p {
		return 0, valid.Errorf("gas.temperature_k", T, "%s vapor pressure %s Pa at this temperature exceeds the total pressure",
			l.Name, valid.FormatValue(ps))
	}
	return rh * ps / p, nil
}

// MassFractionFromMoleFraction converts a vapor mole fraction x to a mass
// fraction Y = x Mv / (x Mv + (1 - x) Mg), molar masses in kg/mol.
func MassFractionFromMoleFraction(x, mv, mg float64) float64 {
	return x * mv / (x*mv + (1-x)*mg)
}

// MoleFractionFromMassFraction converts a vapor mass fraction Y to a mole
// fraction x = (Y/Mv) / (Y/Mv + (1 - Y)/Mg).
func MoleFractionFromMassFraction(y, mv, mg float64) float64 {
	return (y / mv) / (y/mv + (1-y)/mg)
}
