package fluid

import "math"

// Water is described by the IAPWS releases. The constants below are those of
// the releases themselves (IAPWS R7-97(2012), R6-95(2018), SR1-86(1992)).
const (
	waterTc   = 647.096   // K, critical temperature (IAPWS R7-97 eq. 1 constants)
	waterPc   = 22.064e6  // Pa, critical pressure
	waterRhoc = 322.0     // kg/m3, critical density
	waterR    = 461.526   // J/(kg K), specific gas constant of IF97 (R7-97 eq. 1)
	waterR95  = 461.51805 // J/(kg K), specific gas constant of IAPWS-95 (R6-95 eq. 1)
)

// IAPWS R7-97(2012) Table 34: coefficients n1..n10 of the saturation-pressure
// equation (eq. 30) and its backward form (eq. 31), read in python3-iapws
// (iapws97.py).
var if97n = [11]float64{0,
	0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2,
	0.12020824702470e5, -0.32325550322333e7, 0.14915108613530e2,
	-0.48232657361591e4, 0.40511340542057e6, -0.23855557567849,
	0.65017534844798e3,
}

// waterSaturationPressure is IAPWS-IF97 region 4, R7-97(2012) eq. 30:
// theta = T + n9/(T - n10); A = theta^2 + n1 theta + n2; B = n3 theta^2 + n4 theta + n5;
// C = n6 theta^2 + n7 theta + n8; p_s = [2C/(-B + sqrt(B^2 - 4AC))]^4 MPa.
// T in K, result in Pa; valid 273.15 K <= T <= 647.096 K.
func waterSaturationPressure(T float64) float64 {
	n := &if97n
	th := T + n[9]/(T-n[10])
	a := th*th + n[1]*th + n[2]
	b := n[3]*th*th + n[4]*th + n[5]
	c := n[6]*th*th + n[7]*th + n[8]
	r := 2 * c / (-b + math.Sqrt(b*b-4*a*c))
	return r * r * r * r * 1e6
}

// waterSaturationTemperature is the IF97 backward equation, R7-97(2012)
// eq. 31: beta = p^(1/4) (p in MPa); E = beta^2 + n3 beta + n6;
// F = n1 beta^2 + n4 beta + n7; G = n2 beta^2 + n5 beta + n8;
// D = 2G/(-F - sqrt(F^2 - 4EG)); T_s = [n10 + D - sqrt((n10 + D)^2 - 4(n9 + n10 D))]/2.
// p in Pa, result in K; valid 611.213 Pa <= p <= 22.064 MPa.
func waterSaturationTemperature(p float64) float64 {
	n := &if97n
	beta := math.Sqrt(math.Sqrt(p / 1e6))
	e := beta*beta + n[3]*beta + n[6]
	f := n[1]*beta*beta + n[4]*beta + n[7]
	g := n[2]*beta*beta + n[5]*beta + n[8]
	d := 2 * g / (-f - math.Sqrt(f*f-4*e*g))
	return (n[10] + d - math.Sqrt((n[10]+d)*(n[10]+d)-4*(n[9]+n[10]*d))) / 2
}

// waterSurfaceTension is IAPWS R1-76(2014): sigma = B tau^mu (1 + b tau),
// tau = 1 - T/Tc, B = 235.8e-3 N/m, b = -0.625, mu = 1.256. T in K, result in
// N/m; valid from the triple point to Tc (the release allows supercooled
// water to 248.15 K).
func waterSurfaceTension(T float64) float64 {
	tau := math.Max(1-T/waterTc, 0)
	// powFromLog is math.Pow bit for bit without its argument checks and
	// exponent bookkeeping.
	return 235.8e-3 * powFromLog(tau, math.Log(tau), 1.256) * (1 - 0.625*tau)
}

// IAPWS SR1-86(1992), Revised Supplementary Release on Saturation Properties
// of Ordinary Water Substance, eqs. 1-3 (Wagner & Pruss 1993), coefficients
// read in python3-iapws 1.5.2 (iapws95.py, IAPWS95._Pv, _rhoL, _rhoG).
var (
	sr86a  = [6]float64{-7.85951783, 1.84408259, -11.7866497, 22.6807411, -15.9618719, 1.80122502}
	sr86ae = [6]float64{1, 1.5, 3, 3.5, 4, 7.5}
	sr86b  = [6]float64{1.99274064, 1.09965342, -0.510839303, -1.75493479, -45.5170352, -6.74694450e5}
	sr86c  = [6]float64{-2.0315024, -2.6830294, -5.38626492, -17.2991605, -44.7586581, -63.9201063}
)

// waterSaturatedLiquidDensity is SR1-86(1992) eq. 2:
// rho'/rhoc = 1 + sum b_i tau^(k_i/3), k = 1, 2, 5, 16, 43, 110. T in K,
// kg/m3; valid 273.16 K to Tc, stated uncertainty 0.1 % or better away from Tc.
func waterSaturatedLiquidDensity(T float64) float64 {
	// The integer powers 1, 2, 5, 16, 43, 110 of tau^(1/3) by products
	// (math.Pow made this a sixth of a steady-temperature evaluation).
	return sr86LiquidDensity(math.Cbrt(math.Max(1-T/waterTc, 0)))
}

// sr86LiquidDensity is eq. 2 of waterSaturatedLiquidDensity in x = tau^(1/3).
func sr86LiquidDensity(x float64) float64 {
	x2 := x * x
	x4 := x2 * x2
	x5 := x4 * x
	x8 := x4 * x4
	x16 := x8 * x8
	x32 := x16 * x16
	x43 := x32 * x8 * x2 * x
	x64 := x32 * x32
	x110 := x64 * x32 * x8 * x4 * x2
	b := &sr86b
	s := 1 + b[0]*x + b[1]*x2 + b[2]*x5 + b[3]*x16 + b[4]*x43 + b[5]*x110
	return s * waterRhoc
}

// waterSaturatedVaporDensity is SR1-86(1992) eq. 3:
// ln(rho”/rhoc) = sum c_i tau^(k_i/6), k = 2, 4, 8, 18, 37, 71. T in K, kg/m3.
func waterSaturatedVaporDensity(T float64) float64 {
	// The integer powers 2, 4, 8, 18, 37, 71 of tau^(1/6) by products, with
	// tau^(1/6) = (tau^(1/3))^(1/2): a cube root and a square root cost less
	// than math.Pow and agree with it to rounding (TestWaterSR86Forms).
	return sr86VaporDensity(math.Sqrt(math.Cbrt(math.Max(1-T/waterTc, 0))))
}

// sr86VaporDensity is eq. 3 of waterSaturatedVaporDensity in x = tau^(1/6).
func sr86VaporDensity(x float64) float64 {
	x2 := x * x
	x4 := x2 * x2
	x8 := x4 * x4
	x16 := x8 * x8
	x18 := x16 * x2
	x32 := x16 * x16
	x37 := x32 * x4 * x
	x64 := x32 * x32
	x71 := x64 * x4 * x2 * x
	c := &sr86c
	s := c[0]*x2 + c[1]*x4 + c[2]*x8 + c[3]*x18 + c[4]*x37 + c[5]*x71
	return math.Exp(s) * waterRhoc
}

// waterSaturationSlope is dp_s/dT of SR1-86(1992) eq. 1,
// ln(p/pc) = (Tc/T) sum a_i tau^e_i, in Pa/K.
func waterSaturationSlope(T float64) float64 {
	// The powers 1, 1.5, 3, 3.5, 4, 7.5 of tau and their derivatives by
	// products of tau and its square root.
	tau := math.Max(1-T/waterTc, 0)
	return sr86Slope(T, tau, math.Sqrt(tau))
}

// sr86Slope is waterSaturationSlope given tau = 1 - T/Tc and r = tau^(1/2).
func sr86Slope(T, tau, r float64) float64 {
	t2 := tau * tau
	t3 := t2 * tau
	t6 := t3 * t3
	a, e := &sr86a, &sr86ae
	s := a[0]*tau + a[1]*tau*r + a[2]*t3 + a[3]*t3*r + a[4]*t2*t2 + a[5]*t6*tau*r
	ds := a[0]*e[0] + a[1]*e[1]*r + a[2]*e[2]*t2 + a[3]*e[3]*t2*r + a[4]*e[4]*t3 + a[5]*e[5]*t6*r
	// d/dT of (Tc/T) s(tau), with dtau/dT = -1/Tc.
	dlnp := -waterTc/(T*T)*s - ds/T
	return waterPc * math.Exp(waterTc/T*s) * dlnp
}

// waterLatentHeat is the Clapeyron equation h” - h' = T (dp_s/dT)(1/rho” -
// 1/rho') evaluated with the SR1-86(1992) auxiliary equations 1-3. T in K,
// J/kg; valid 273.16 K to Tc (zero at Tc).
func waterLatentHeat(T float64) float64 {
	if T >= waterTc {
		return 0
	}
	// The three equations share tau and its roots: tau^(1/2) for eq. 1,
	// tau^(1/3) for eq. 2 and its square root tau^(1/6) for eq. 3, the
	// same numbers as the three functions give one by one.
	tau := math.Max(1-T/waterTc, 0)
	c := math.Cbrt(tau)
	return T * sr86Slope(T, tau, math.Sqrt(tau)) * (1/sr86VaporDensity(math.Sqrt(c)) - 1/sr86LiquidDensity(c))
}

// IAPWS R12-08, Release on the IAPWS Formulation 2008 for the Viscosity of
// Ordinary Water Substance, eqs. 11 and 12 (coefficients read in
// python3-iapws 1.5.2, _iapws.py _Viscosity).
var (
	r12H0  = [4]float64{1.67752, 2.20462, 0.6366564, -0.241605}
	r12I   = [21]int{0, 1, 2, 3, 0, 1, 2, 3, 5, 0, 1, 2, 3, 4, 0, 1, 0, 3, 4, 3, 5}
	r12J   = [21]int{0, 0, 0, 0, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2, 3, 3, 4, 4, 5, 6, 6}
	r12Hij = [21]float64{0.520094, 0.850895e-1, -0.108374e1, -0.289555, 0.222531, 0.999115,
		0.188797e1, 0.126613e1, 0.120573, -0.281378, -0.906851, -0.772479,
		-0.489837, -0.257040, 0.161913, 0.257399, -0.325372e-1, 0.698452e-1,
		0.872102e-2, -0.435673e-2, -0.593264e-3}
)

// waterDiluteViscosity is R12-08 eq. 11, the zero-density limit
// mu0 = 100 sqrt(Tr) / sum_{i=0..3} H_i/Tr^i  [uPa s], Tr = T/Tc; Pa s.
func waterDiluteViscosity(T float64) float64 {
	tr := T / waterTc
	return r12DiluteViscosity(1/tr, math.Sqrt(tr))
}

// r12DiluteViscosity is eq. 11 given x = 1/Tr and r = Tr^(1/2).
func r12DiluteViscosity(x, r float64) float64 {
	h := &r12H0
	s := h[0] + x*(h[1]+x*(h[2]+x*h[3])) // sum H_i/Tr^i by Horner's rule
	return 100 * r / s * 1e-6
}

// waterViscosity is R12-08 eq. 10 without the critical enhancement
// (mu2 = 1, which the release permits outside a small region around the
// critical point): mu = mu0(T) mu1(T, rho), with
// mu1 = exp(rhor sum H_ij (1/Tr - 1)^i (rhor - 1)^j). T in K, rho in kg/m3, Pa s.
func waterViscosity(T, rho float64) float64 {
	tr := T / waterTc
	dr := rho / waterRhoc
	var s float64
	for k, h := range r12Hij {
		s += h * math.Pow(1/tr-1, float64(r12I[k])) * math.Pow(dr-1, float64(r12J[k]))
	}
	return waterDiluteViscosity(T) * math.Exp(dr*s)
}

// waterDiluteConductivity is IAPWS R15-11 (Release on the IAPWS Formulation
// 2011 for the Thermal Conductivity of Ordinary Water Substance) eq. 16, the
// zero-density limit lambda0 = sqrt(Tr) / sum_{k=0..4} L_k/Tr^k [mW/(m K)];
// W/(m K). Coefficients read in python3-iapws 1.5.2 (_iapws.py _ThCond).
func waterDiluteConductivity(T float64) float64 {
	tr := T / waterTc
	return r15DiluteConductivity(1/tr, math.Sqrt(tr))
}

// r15DiluteConductivity is eq. 16 given x = 1/Tr and r = Tr^(1/2).
func r15DiluteConductivity(x, r float64) float64 {
	l := [5]float64{2.443221e-3, 1.323095e-2, 6.770357e-3, -3.454586e-3, 4.096266e-4}
	s := l[0] + x*(l[1]+x*(l[2]+x*(l[3]+x*l[4]))) // sum L_k/Tr^k by Horner's rule
	return r / s * 1e-3
}

// waterVaporFilm returns waterVaporHeatCapacity, waterDiluteViscosity and
// waterDiluteConductivity at T, bit for bit; the two dilute-gas terms share
// Tr, 1/Tr and sqrt(Tr).
func waterVaporFilm(T float64) (cp, mu, k float64) {
	tr := T / waterTc
	x, r := 1/tr, math.Sqrt(tr)
	return waterVaporHeatCapacity(T), r12DiluteViscosity(x, r), r15DiluteConductivity(x, r)
}

// IAPWS-95 ideal-gas part (R6-95(2018) Table 1), coefficients read in
// python3-iapws 1.5.2 (iapws95.py IAPWS95.Fi0).
var (
	iapws95n0 = [5]float64{0.012436, 0.97315, 1.2795, 0.96956, 0.24873}
	iapws95g0 = [5]float64{1.28728967, 3.53734222, 7.74073708, 9.24437796, 27.5075105}
)

// waterVaporHeatCapacity is the ideal-gas isobaric heat capacity of IAPWS-95:
// cp0/R = 1 + n3 + sum n_i (g_i tau)^2 e^(g_i tau)/(e^(g_i tau) - 1)^2,
// tau = Tc/T, n3 = 3.00632, R = 461.51805 J/(kg K). T in K, J/(kg K); the
// release covers 130 K to 1273 K for the ideal-gas part.
func waterVaporHeatCapacity(T float64) float64 {
	tau := waterTc / T
	s := 1 + 3.00632
	for i, n := range iapws95n0 {
		x := iapws95g0[i] * tau
		e := math.Exp(-x)
		s += n * x * x * e / ((1 - e) * (1 - e))
	}
	return s * waterR95
}

// IAPWS-IF97 region 1 (R7-97(2012) Table 2), coefficients read in
// python3-iapws 1.5.2 (iapws97.py _Region1).
var (
	if97r1I = [34]int{0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2, 3, 3, 3, 4,
		4, 4, 5, 8, 8, 21, 23, 29, 30, 31, 32}
	if97r1J = [34]int{-2, -1, 0, 1, 2, 3, 4, 5, -9, -7, -1, 0, 1, 3, -3, 0, 1, 3, 17, -4, 0,
		6, -5, -2, 10, -8, -11, -6, -29, -31, -38, -39, -40, -41}
	if97r1n = [34]float64{0.14632971213167, -0.84548187169114, -0.37563603672040e1,
		0.33855169168385e1, -0.95791963387872, 0.15772038513228,
		-0.16616417199501e-1, 0.81214629983568e-3, 0.28319080123804e-3,
		-0.60706301565874e-3, -0.18990068218419e-1, -0.32529748770505e-1,
		-0.21841717175414e-1, -0.52838357969930e-4, -0.47184321073267e-3,
		-0.30001780793026e-3, 0.47661393906987e-4, -0.44141845330846e-5,
		-0.72694996297594e-15, -0.31679644845054e-4, -0.28270797985312e-5,
		-0.85205128120103e-9, -0.22425281908000e-5, -0.65171222895601e-6,
		-0.14341729937924e-12, -0.40516996860117e-6, -0.12734301741641e-8,
		-0.17424871230634e-9, -0.68762131295531e-18, 0.14478307828521e-19,
		0.26335781662795e-22, -0.11947622640071e-22, 0.18228094581404e-23,
		-0.93537087292458e-25}
)

// waterRegion1HeatCapacity is the isobaric heat capacity of IAPWS-IF97
// region 1 (R7-97(2012) eq. 7 and Table 3): cp = -R tau^2 gamma_tautau,
// gamma = sum n_i (7.1 - pi)^I_i (tau - 1.222)^J_i, pi = p/16.53 MPa,
// tau = 1386 K/T. T in K, p in Pa, J/(kg K); valid 273.15 K <= T <= 623.15 K,
// p_s(T) <= p <= 100 MPa.
func waterRegion1HeatCapacity(T, p float64) float64 {
	pi := p / 16.53e6
	tau := 1386 / T
	var gtt float64
	for k, n := range if97r1n {
		j := float64(if97r1J[k])
		gtt += n * math.Pow(7.1-pi, float64(if97r1I[k])) * j * (j - 1) * math.Pow(tau-1.222, j-2)
	}
	return -waterR * tau * tau * gtt
}

// waterLiquidHeatCapacity is region-1 cp on the saturated-liquid line,
// evaluated at p = max(p_s(T), 101325 Pa) so that below the normal boiling
// point it is the liquid at atmospheric pressure (the difference is below
// 0.01 %). T in K, J/(kg K).
func waterLiquidHeatCapacity(T float64) float64 {
	return waterRegion1HeatCapacity(T, math.Max(waterSaturationPressure(T), 101325))
}
