package flash

import (
	"errors"
	"fmt"
	"math"

	"fogbench/calc/phys"
	"fogbench/calc/valid"
)

// DefaultNucleationThreshold is the homogeneous nucleation rate, in nuclei
// per m3 per s, taken as the kinetic limit of superheat: 1e6 per cm3 per s,
// the order of the rates observed in the droplet-in-host-liquid superheat
// experiments that Blander & Katz (AIChE J. 21 (1975) 833–848) review (from
// memory). Because J rises by orders of magnitude per kelvin there, the
// limit moves by well under a kelvin per decade of threshold.
const DefaultNucleationThreshold = 1e12

// ErrNoKineticLimit is wrapped when the nucleation rate does not reach the
// threshold between the saturation and the critical temperature.
var ErrNoKineticLimit = errors.New("flash: the nucleation rate does not reach the threshold below the critical temperature")

// BubbleVaporPressure returns the pressure of the vapor inside a bubble in
// equilibrium with liquid at pressure pl (Pa), in Pa:
//
//	p_v* = p_sat · exp( v_l (p_l − p_sat) / (R T) )
//
// psat is the flat-surface saturation pressure at T (Pa), vl the liquid
// molar volume M/ρ_l (m3/mol), T in K. It is the Poynting correction of an
// incompressible liquid with an ideal vapor — the same integral as for a
// drop (calc/evap.KelvinRatio), with the liquid now below p_sat, so p_v* is
// slightly below p_sat (Blander & Katz 1975, eq. for the bubble's vapor
// pressure; Carey, Liquid–Vapor Phase-Change Phenomena, 2nd ed. (2008),
// ch. 5 — from memory for the equation numbers). Valid for a liquid far
// from its critical point; inputs are not checked (see Nucleation).
func BubbleVaporPressure(psat, pl, vl, T float64) float64 {
	return psat * math.Exp(vl*(pl-psat)/(phys.GasConstant*T))
}

// CriticalRadius returns the radius in m of the bubble in unstable
// equilibrium with the superheated liquid, from the Laplace balance
//
//	r_c = 2 σ / (p_v* − p_l)
//
// with σ in N/m and pressures in Pa. Smaller bubbles collapse, larger ones
// grow. It is +Inf when p_v* ≤ p_l (no superheat: no bubble can grow)
// (Young–Laplace; Blander & Katz 1975).
func CriticalRadius(sigma, pv, pl float64) float64 {
	if !(pv > pl) {
		return math.Inf(1)
	}
	return 2 * sigma / (pv - pl)
}

// Barrier returns the reversible work in J to form the critical bubble,
//
//	W = 16 π σ³ / (3 (p_v* − p_l)²) = (4/3) π r_c² σ
//
// (Gibbs; classical nucleation theory as in Blander & Katz 1975, from
// memory for the equation number). It is +Inf when p_v* ≤ p_l.
func Barrier(sigma, pv, pl float64) float64 {
	if !(pv > pl) {
		return math.Inf(1)
	}
	d := pv - pl
	return 16 * math.Pi * sigma * sigma * sigma / (3 * d * d)
}

// NucleationRate returns the homogeneous bubble nucleation rate in nuclei
// per m3 per s,
//
//	J = N (2 σ / (π m))^0.5 · exp(−W / (k T))
//
// with N the number density of liquid molecules (1/m3), m the mass of one
// molecule (kg), σ in N/m, W the barrier in J and T in K; k is the CODATA
// 2018 Boltzmann constant. This is the form reviewed by Blander & Katz
// (AIChE J. 21 (1975) 833–848) with their factor B (≈ 2/3 to 1 for
// bubbles) set to 1 and the δ = 1 − v_l/v_v correction of the barrier
// left out (both change the rate far less than a kelvin of superheat does;
// from memory). J ≥ 0; it is 0 where W is +Inf or σ ≤ 0 (a surface tension
// correlation past its own critical point: no nucleus to speak of).
func NucleationRate(n, m, sigma, w, T float64) float64 {
	if !(sigma > 0) || math.IsInf(w, 1) {
		return 0
	}
	return n * math.Sqrt(2*sigma/(math.Pi*m)) * math.Exp(-w/(phys.Boltzmann*T))
}

// Nucleus collects the classical-nucleation figures of a liquid at one
// temperature and pressure.
type Nucleus struct {
	TemperatureK         float64 // T
	PressurePa           float64 // liquid pressure p_l
	SaturationPressurePa float64 // p_sat(T), flat surface
	BubbleVaporPa        float64 // p_v*, vapor pressure inside the critical bubble
	SurfaceTensionNM     float64 // σ(T)
	CriticalRadiusM      float64 // r_c; +Inf without superheat
	BarrierJ             float64 // W; +Inf without superheat
	BarrierKT            float64 // W/(k T); +Inf without superheat
	Rate                 float64 // J, 1/(m3 s)
}

// Nucleation evaluates the critical bubble and the homogeneous nucleation
// rate of liquid l at T (K) under liquid pressure p (Pa); see
// BubbleVaporPressure, CriticalRadius, Barrier and NucleationRate. The
// properties (σ, ρ_l, p_sat) are the liquid's saturation values at T: the
// usual assumption of classical nucleation theory that the flat-interface σ
// applies to the nucleus. T must lie in (0, Tc) and p > 0, else an error
// naming the field.
func Nucleation(l Liquid, T, p float64) (Nucleus, error) {
	if err := checkState(l, T, p); err != nil {
		return Nucleus{}, err
	}
	return nucleation(l, T, p), nil
}

func nucleation(l Liquid, T, p float64) Nucleus {
	m := l.MolarMass()
	rho := l.Density(T)
	ps := l.SaturationPressure(T)
	sigma := l.SurfaceTension(T)
	pv := BubbleVaporPressure(ps, p, m/rho, T)
	w := Barrier(sigma, pv, p)
	n := rho * phys.Avogadro / m
	return Nucleus{
		TemperatureK: T, PressurePa: p, SaturationPressurePa: ps, BubbleVaporPa: pv, SurfaceTensionNM: sigma,
		CriticalRadiusM: CriticalRadius(sigma, pv, p), BarrierJ: w, BarrierKT: w / (phys.Boltzmann * T),
		Rate: NucleationRate(n, m/phys.Avogadro, sigma, w, T),
	}
}

// checkState validates a liquid state: T finite in (0, Tc), p finite > 0.
func checkState(l Liquid, T, p float64) error {
	if err := valid.Positive("liquid_temperature_k", T); err != nil {
		return err
	}
	if tc := l.CriticalTemperature(); T >= tc {
		return valid.Errorf("liquid_temperature_k", T, "must be below the critical temperature %s K", valid.FormatValue(tc))
	}
	return valid.Positive("pressure_pa", p)
}

// KineticLimit returns the kinetic limit of superheat at liquid pressure p
// (Pa): the temperature in K at which the homogeneous nucleation rate J of
// Nucleation reaches threshold (1/(m3 s); 0 means
// DefaultNucleationThreshold). Above it a liquid boils explosively within
// microseconds whatever its purity.
//
// ln J rises steeply from −∞ at T_sat(p); the root of ln J − ln threshold
// is bracketed by stepping from T_sat(p) towards Tc in 1/400 of the
// interval and refined by bisection to 1e-9 K. When J stays below the
// threshold up to Tc the error wraps ErrNoKineticLimit; p outside the
// liquid's saturation range is an error on "pressure_pa".
func KineticLimit(l Liquid, p, threshold float64) (float64, error) {
	if threshold == 0 {
		threshold = DefaultNucleationThreshold
	}
	if err := valid.Positive("nucleation_threshold_m3_s", threshold); err != nil {
		return 0, err
	}
	if err := valid.Positive("pressure_pa", p); err != nil {
		return 0, err
	}
	ts, err := l.SaturationTemperature(p)
	if err != nil {
		return 0, err
	}
	tc := l.CriticalTemperature()
	lnth := math.Log(threshold)
	f := func(T float64) float64 {
		j := nucleation(l, T, p).Rate
		if !(j > 0) {
			return -1e3 // far below any threshold
		}
		return math.Log(j) - lnth
	}
	const steps = 400
	top := tc * (1 - 1e-9)
	dt := (top - ts) / steps
	if !(dt > 0) {
		return 0, fmt.Errorf("p = %s Pa: T_sat = %s K is at the critical temperature: %w", valid.FormatValue(p), valid.FormatValue(ts), ErrNoKineticLimit)
	}
	lo, flo := ts, f(ts)
	for i := 1; i <= steps; i++ {
		t := ts + float64(i)*dt
		if i == steps {
			t = top
		}
		ft := f(t)
		if ft >= 0 {
			return bisect(f, lo, t, flo, ft, 1e-9), nil
		}
		lo, flo = t, ft
	}
	return 0, fmt.Errorf("p = %s Pa, threshold %s /(m3 s): %w", valid.FormatValue(p), valid.FormatValue(threshold), ErrNoKineticLimit)
}
