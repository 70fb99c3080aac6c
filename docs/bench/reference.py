#!/usr/bin/python3
"""Reference implementation of a fogbench case evaluation, for benchmarking.

This is the script a careful engineer would write with numpy and scipy
instead of using fogbench: per-bin Kelvin raise, Spalding number, film
properties and rates vectorised over the bins, and the spray history from
the drop-shrinkage time G(d) = integral_0^d rho_L pi d'^2 / (2 mdot(d')) dd'
taken by Gauss-Legendre panels on one fine log grid (no ODE solve per bin).
It is a yardstick for docs/performance.md and for the agreement test in
testdata/bench; it is not part of the application.

Scope (what it covers, and nothing more):
  liquids       water (IAPWS correlations) and n-heptane (DIPPR / Mulero /
                Chung forms), with the same coefficients as calc/fluid
  gas           air (Lemmon & Jacobsen 2004 dilute gas, Lemmon et al. 2000 cp)
  surface       fixed surface temperature (liquid_temperature_k); no steady
                (wet-bulb) solve, no transient heating
  equilibrium   the flat-surface vapor partial pressure at the gas pressure,
                times each class's Kelvin ratio: water by the IAPWS virial
                fugacity of H2O in humid air and the G7-04 Henry constants
                (python3-iapws humidAir._fugacity, _iapws._Henry) with an
                incompressible Poynting factor; n-heptane in air by a
                Peng-Robinson split (van der Waals mixing, k_ij 0.1441) whose
                liquid takes the pure-liquid fugacity p_sat phi_sat Poynting
                (docs/methods-evap.md, "Equilibrium at the gas pressure")
  convection    "none" (Sh = 2) and "ranz-marshall"; Fuchs-Sutugin transition
                factor on or off; accommodation coefficient
  ambient vapor vapor_mole_fraction only; the far field must be below
                saturation at the surface so that every class evaporates
  sizes         rosin-rammler (x_m, q) and log-normal (volume median, gsd)
                cut between d_min_m and d_max_m in log-spaced classes
  output        summary diameters, per-bin results, history (t, evaporated
                fraction, D32, Dv50) and t50/t90/t99, with fogbench's JSON names;
                not the curvature summary, property audit or warnings

Usage: /usr/bin/python3 docs/bench/reference.py CASES.json > RESULTS.json
(CASES.json is one fogbench-case/1 object or an array of them).
Library versions are printed on standard error.
"""

import json
import math
import sys

import numpy as np
import scipy
from scipy import interpolate, optimize, special

R = 8.314462618  # J/(mol K), CODATA 2018
M_AIR = 28.9647e-3  # kg/mol
ATM = 101325.0


# ------------------------------------------------------- surface equilibrium

PR_AIR = (132.6306, 3.786e6, 0.0335)  # air as one pseudo-component
KIJ_AIR = {"n-heptane": 0.1441}        # DECHEMA table (ChemSep pr.ipd), N2 value


def _pr_omegas():
    def eqs(u):
        x, A = u
        q = x * x + 2 * x - 1
        return [-1 / (x - 1) ** 2 + A * (2 * x + 2) / q ** 2,
                2 / (x - 1) ** 3 + A * (2 * q - 2 * (2 * x + 2) ** 2) / q ** 3]
    x, A = optimize.fsolve(eqs, [3.9, 5.9], xtol=1e-13)
    ob = 1 / (x - 1) - A / (x * x + 2 * x - 1)
    return A * ob, ob


PR_OA, PR_OB = _pr_omegas()


def _pr_ab(c, t):
    tc, pc, w = c
    k = 0.37464 + 1.54226 * w - 0.26992 * w * w
    return PR_OA * R * R * tc * tc / pc * (1 + k * (1 - math.sqrt(t / tc))) ** 2, PR_OB * R * tc / pc


def _pr_ln_phi(comps, kij, z, t, p, phase):
    (a1, b1), (a2, b2) = (_pr_ab(c, t) for c in comps)
    a12 = (1 - kij) * math.sqrt(a1 * a2)
    am = [[a1, a12], [a12, a2]]
    a = sum(z[i] * z[j] * am[i][j] for i in range(2) for j in range(2))
    b = z[0] * b1 + z[1] * b2
    A, B = a * p / (R * t) ** 2, b * p / (R * t)
    roots = np.roots([1, -(1 - B), A - 3 * B * B - 2 * B, -(A * B - B * B - B ** 3)])
    real = sorted(r.real for r in roots if abs(r.imag) < 1e-9 * max(1, abs(r.real)) and r.real > B)
    Z = real[0] if phase == "l" else real[-1]
    s2 = math.sqrt(2)
    lg = math.log((Z + (1 + s2) * B) / (Z + (1 - s2) * B))
    return [bi / b * (Z - 1) - math.log(Z - B)
            - A / (2 * s2 * B) * (2 * sum(z[j] * am[i][j] for j in range(2)) / a - bi / b) * lg
            for i, bi in enumerate((b1, b2))]


def flat_vapor_pressure(name, liq, t, p):
    """Equilibrium partial pressure (Pa) of the vapor over a flat surface of
    liq at t (K) under air at p (Pa)."""
    psat, v = liq.psat(t), liq.M / liq.rho(t)
    poy = math.exp(v * (p - psat) / (R * t))
    if name == "water":
        from iapws._iapws import _Henry
        from iapws.humidAir import _fugacity
        fl = _fugacity(t, psat / 1e6, 1.0) * 1e6 * poy
        kh = 0.7809 / (_Henry(t, "N2") * 1e6) + 0.2095 / (_Henry(t, "O2") * 1e6) + 0.0093 / (_Henry(t, "Ar") * 1e6)

        def res(x):
            return _fugacity(t, p / 1e6, x) * 1e6 - (1 - (1 - x) * p * kh) * fl
        x = optimize.brentq(res, 1e-12, min(0.999, 3 * psat / p), xtol=1e-16, rtol=1e-14)
        return x * p
    comps = [(liq.tc, liq.pc, liq.omega), PR_AIR]
    kij = KIJ_AIR[name]
    fl = psat * math.exp(_pr_ln_phi([comps[0]] * 2, 0, [1, 0], t, psat, "v")[0]) * poy
    d1 = math.log(fl / p) - _pr_ln_phi([comps[0]] * 2, 0, [1, 0], t, p, "l")[0]

    def eqs(u):
        x2, y2 = math.exp(u[0]), math.exp(u[1])
        l = _pr_ln_phi(comps, kij, [1 - x2, x2], t, p, "l")
        g = _pr_ln_phi(comps, kij, [1 - y2, y2], t, p, "v")
        return [math.log(1 - x2) + l[0] + d1 - math.log(1 - y2) - g[0],
                math.log(x2) + l[1] - math.log(y2) - g[1]]
    y2 = 1 - psat / p
    x2 = y2 * p / 5e8  # a Henry-like start, far from the trivial solution
    u = optimize.fsolve(eqs, [math.log(x2), math.log(y2)], xtol=1e-14)
    return (1 - math.exp(u[1])) * p


# ---------------------------------------------------------------- liquids

class Water:
    """IAPWS releases as used by calc/fluid (water.go)."""
    M = 18.015268e-3
    tc, pc, rhoc = 647.096, 22.064e6, 322.0
    diff_volume = 13.1
    n = [0, 0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2,
         0.12020824702470e5, -0.32325550322333e7, 0.14915108613530e2,
         -0.48232657361591e4, 0.40511340542057e6, -0.23855557567849,
         0.65017534844798e3]

    def psat(self, T):  # IAPWS R7-97 eq. 30
        n = self.n
        th = T + n[9] / (T - n[10])
        a = th * th + n[1] * th + n[2]
        b = n[3] * th * th + n[4] * th + n[5]
        c = n[6] * th * th + n[7] * th + n[8]
        return (2 * c / (-b + np.sqrt(b * b - 4 * a * c))) ** 4 * 1e6

    def sigma(self, T):  # IAPWS R1-76
        tau = max(1 - T / self.tc, 0)
        return 235.8e-3 * tau ** 1.256 * (1 - 0.625 * tau)

    def rho(self, T):  # SR1-86 eq. 2
        t3 = np.cbrt(max(1 - T / self.tc, 0))
        b = [1.99274064, 1.09965342, -0.510839303, -1.75493479, -45.5170352, -6.74694450e5]
        e = [1, 2, 5, 16, 43, 110]
        return self.rhoc * (1 + sum(bi * t3 ** ei for bi, ei in zip(b, e)))

    def latent(self, T):  # Clapeyron with SR1-86 eqs. 1-3
        tau = max(1 - T / self.tc, 0)
        a = [-7.85951783, 1.84408259, -11.7866497, 22.6807411, -15.9618719, 1.80122502]
        ae = [1, 1.5, 3, 3.5, 4, 7.5]
        s = sum(ai * tau ** ei for ai, ei in zip(a, ae))
        ds = sum(ai * ei * tau ** (ei - 1) for ai, ei in zip(a, ae))
        slope = self.pc * math.exp(self.tc / T * s) * (-self.tc / T ** 2 * s - ds / T)
        t6 = tau ** (1 / 6)
        c = [-2.0315024, -2.6830294, -5.38626492, -17.2991605, -44.7586581, -63.9201063]
        ce = [2, 4, 8, 18, 37, 71]
        rhov = math.exp(sum(ci * t6 ** ei for ci, ei in zip(c, ce))) * self.rhoc
        return T * slope * (1 / rhov - 1 / self.rho(T))

    def cp_vapor(self, T):  # IAPWS-95 ideal-gas part
        tau = self.tc / T
        n0 = [0.012436, 0.97315, 1.2795, 0.96956, 0.24873]
        g0 = [1.28728967, 3.53734222, 7.74073708, 9.24437796, 27.5075105]
        s = 1 + 3.00632
        for ni, gi in zip(n0, g0):
            x = gi * tau
            e = math.exp(-x)
            s += ni * x * x * e / (1 - e) ** 2
        return s * 461.51805

    def mu_vapor(self, T):  # IAPWS R12-08 eq. 11
        tr = T / self.tc
        h = [1.67752, 2.20462, 0.6366564, -0.241605]
        return 100 * math.sqrt(tr) / sum(hi / tr ** i for i, hi in enumerate(h)) * 1e-6

    def k_vapor(self, T):  # IAPWS R15-11 eq. 16
        tr = T / self.tc
        lk = [2.443221e-3, 1.323095e-2, 6.770357e-3, -3.454586e-3, 4.096266e-4]
        return math.sqrt(tr) / sum(v / tr ** k for k, v in enumerate(lk)) * 1e-3


class Heptane:
    """n-heptane as in calc/fluid catalog.go (Perry DIPPR, Mulero, Poling, Chung)."""
    M = 100.204e-3
    tc, pc, vc = 540.2, 2.74e6, 428e-6
    diff_volume = 15.9 * 7 + 2.31 * 16

    def __init__(self):
        self.omega = -math.log10(self.psat(0.7 * self.tc) / self.pc) - 1

    def psat(self, T):
        return math.exp(87.829 - 6996.4 / T - 9.8802 * math.log(T) + 7.2099e-06 * T ** 2)

    def sigma(self, T):
        tau = max(1 - T / 540.13, 0)
        return max(0.07765 * tau ** 1.319 - 0.02599 * tau ** 1.6, 0)

    def rho(self, T):
        tau = max(1 - T / 540.2, 0)
        return 612.59 / 0.26211 ** (1 + tau ** 0.28141) * self.M

    def latent(self, T):
        tr = T / 540.2
        return 50014 * (1 - tr) ** 0.38795 / self.M

    def cp_vapor(self, T):
        return R * (9.634 + T * (0.004156 + T * (0.00015494 + T * (-2.0066e-07 + T * 7.77e-11)))) / self.M

    def mu_vapor(self, T):  # Chung et al., Poling eq. 9-4.10
        vcc = self.vc * 1e6
        fc = 1 - 0.2756 * self.omega
        ts = 1.2593 * T / self.tc
        om = 1.16145 * ts ** -0.14874 + 0.52487 * math.exp(-0.77320 * ts) + 2.16178 * math.exp(-2.43787 * ts)
        return 40.785 * fc * math.sqrt(self.M * 1e3 * T) / (vcc ** (2 / 3) * om) * 1e-7

    def k_vapor(self, T):  # Chung et al., Poling eq. 10-3.14
        cv = self.cp_vapor(T) * self.M - R
        alpha = cv / R - 1.5
        beta = 0.7862 - 0.7109 * self.omega + 1.3168 * self.omega ** 2
        z = 2 + 10.5 * (T / self.tc) ** 2
        psi = 1 + alpha * (0.215 + 0.28288 * alpha - 1.061 * beta + 0.26665 * z) / (0.6366 + beta * z + 1.061 * alpha * beta)
        return 3.75 * psi * R * self.mu_vapor(T) / self.M


LIQUIDS = {"water": Water(), "n-heptane": Heptane()}


# ---------------------------------------------------------------- air

def air_mu(T):  # Lemmon & Jacobsen (2004) eq. 2, micro-Pa s
    b = [0.431, -0.4623, 0.08406, 0.005341, -0.00331]
    x = math.log(T / 103.3)
    om = math.exp(b[0] + x * (b[1] + x * (b[2] + x * (b[3] + x * b[4]))))
    return 0.0266958 * math.sqrt(28.9586 * T) / (0.360 ** 2 * om)


def air_k(T):  # Lemmon & Jacobsen (2004) eq. 5
    tau = 132.6312 / T
    return (1.308 * air_mu(T) + 1.405 * tau ** -1.1 - 1.036 * tau ** -0.3) * 1e-3


def air_cp(T):  # ideal-gas part of Lemmon et al. (2000)
    tau = 132.6312 / T
    ftt = -2.490888032 / tau ** 2
    for n, t in zip([0.6057194e-7, -0.210274769e-4, -0.158860716e-3, 9.7450251743948, 10.0986147428912, -0.19536342e-3],
                    [-3, -2, -1, 0, 1, 1.5]):
        ftt += n * t * (t - 1) * tau ** (t - 2)
    for n, th in [(0.791309509, 25.36365), (0.212236768, 16.90741)]:
        e = math.exp(-th * tau)
        ftt -= n * th * th * e / (1 - e) ** 2
    n, th, c = -0.197938904, 87.31279, 2 / 3
    e = math.exp(-th * tau)
    ftt += c * n * th * th * e / (c * e + 1) ** 2
    return (1 - tau * tau * ftt) * 8.31451 / 28.9586e-3


# ---------------------------------------------------------------- evaporation

def mass_fraction(x, mv, mg):
    return x * mv / (x * mv + (1 - x) * mg)


class Drops:
    """Quasi-steady drop evaporation at a fixed surface temperature,
    vectorised over diameters (fogbench calc/evap drop.go evaluate)."""

    def __init__(self, case):
        self.liq = liq = LIQUIDS[case["fluid"]]
        gas = case["gas"]
        ev = case.get("evaporation", {})
        self.p, self.tinf = gas["pressure_pa"], gas["temperature_k"]
        self.u = gas.get("relative_velocity_m_s", 0.0)
        self.ts = ts = case["liquid_temperature_k"]
        self.conv = ev.get("convection", "ranz-marshall") or "ranz-marshall"
        self.transition = not ev.get("no_transition", False)
        self.alpha = ev.get("accommodation_coefficient", 0) or 1.0
        self.psat, self.sigma, self.rho_l = liq.psat(ts), liq.sigma(ts), liq.rho(ts)
        if self.psat >= self.p:
            raise ValueError("surface temperature at or above the boiling point")
        self.pflat = flat_vapor_pressure(case["fluid"], liq, ts, self.p)
        self.lk = 2 * self.sigma * (liq.M / self.rho_l) / (R * ts)
        self.yinf = mass_fraction(gas.get("vapor_mole_fraction", 0.0), liq.M, M_AIR)
        # Film at the 1/3-rule temperature: pure-component values are scalars.
        tr = ts + (self.tinf - ts) / 3
        self.tr = tr
        mv, mg = liq.M, M_AIR
        self.cpv, cpg = liq.cp_vapor(tr), air_cp(tr)
        muv, mug = liq.mu_vapor(tr), air_mu(tr) * 1e-6
        kv, kg = liq.k_vapor(tr), air_k(tr)
        self.pure = (cpg, muv, mug, kv, kg)
        mab = 2 / (1 / (mv * 1e3) + 1 / (mg * 1e3))
        s = np.cbrt(liq.diff_volume) + np.cbrt(19.7)
        self.diff = 1.43e-2 * tr ** 1.75 / (self.p * math.sqrt(mab) * s * s)
        cbar = math.sqrt(8 * R * tr / (math.pi * mv))
        self.lam = 3 * self.diff / cbar

        def phi(mui, muj, mi, mj):
            return (1 + math.sqrt(mui / muj) * (mj / mi) ** 0.25) ** 2 / math.sqrt(8 * (1 + mi / mj))
        self.phi_vg, self.phi_gv = phi(muv, mug, mv, mg), phi(mug, muv, mg, mv)

    def rate(self, d, curved=True):
        """Evaporation rate (kg/s), Kelvin ratio and Knudsen number at d (m)."""
        liq, mv = self.liq, self.liq.M
        r = d / 2
        s = np.exp(np.minimum(self.lk / r, 700)) if curved else np.ones_like(d)
        xs = np.minimum(s * self.pflat / self.p, 1 - 1e-6)
        ys = mass_fraction(xs, mv, M_AIR)
        bm = (ys - self.yinf) / (1 - ys)
        yr = ys + (self.yinf - ys) / 3
        nv, ng = yr / mv, (1 - yr) / M_AIR
        xv = nv / (nv + ng)
        xg = 1 - xv
        cpg, muv, mug, kv, kg = self.pure
        rho = self.p / (nv + ng) / (R * self.tr)
        mu = xv * muv / (xv + xg * self.phi_vg) + xg * mug / (xg + xv * self.phi_gv)
        if self.conv == "ranz-marshall":
            re = rho * self.u * d / mu
            sc = mu / (rho * self.diff)
            sh = 2 + 0.6 * np.sqrt(re) * np.cbrt(sc)
        else:
            sh = 2.0
        kn = self.lam / r
        fs = 1.0
        if self.transition:
            a = self.alpha
            fs = 0.75 * a * (1 + kn) / (kn * kn + kn + 0.283 * kn * a + 0.75 * a)
        mdot = np.pi * d * rho * self.diff * sh * np.log1p(bm) * fs
        return mdot, s, kn


# ---------------------------------------------------------------- sizes

def volume_cdf_sf(dist, d):
    if dist["model"] == "rosin-rammler":
        x = (d / dist["x_m"]) ** dist["q"]
        return -np.expm1(-x), np.exp(-x)
    if dist["model"] == "log-normal" and dist.get("basis", "volume") == "volume":
        z = (np.log(d) - math.log(dist["median_m"])) / math.log(dist["gsd"])
        return 0.5 * special.erfc(-z / math.sqrt(2)), 0.5 * special.erfc(z / math.sqrt(2))
    raise ValueError("distribution model not covered by the reference: " + dist["model"])


def class_average_pow(lo, hi, p):
    """<D^p> over each class for a number density constant in D (integer p)."""
    return sum(hi ** k * lo ** (p - k) for k in range(p + 1)) / (p + 1)


def cut(dist):
    n, dmin, dmax = dist["bins"], dist["d_min_m"], dist["d_max_m"]
    edges = np.exp(np.log(dmin) + np.arange(n + 1) * (np.log(dmax) - np.log(dmin)) / n)
    edges[0], edges[-1] = dmin, dmax
    cdf, sf = volume_cdf_sf(dist, edges)
    vol = np.where(cdf[:-1] > 0.5, sf[:-1] - sf[1:], cdf[1:] - cdf[:-1])
    vol = np.maximum(vol, 0)
    ref = math.exp((math.log(dmin) + math.log(dmax)) / 2)
    num = vol / class_average_pow(edges[:-1] / ref, edges[1:] / ref, 3)
    return edges, num / num.sum(), vol / vol.sum()


def quantile(edges, frac, F, k):
    cum = np.concatenate(([0.0], np.cumsum(frac)))
    i = min(int(np.searchsorted(cum[1:], F)), len(frac) - 1)
    while frac[i] <= 0 and i < len(frac) - 1:
        i += 1
    t = min(max((F - cum[i]) / frac[i], 0), 1)
    a, b = edges[i], edges[i + 1]
    return a * (1 + t * math.expm1(k * math.log(b / a))) ** (1 / k)


def summary(edges, num, vol):
    ref = math.exp((math.log(edges[0]) + math.log(edges[-1])) / 2)
    lo, hi = edges[:-1] / ref, edges[1:] / ref
    mom = {p: float(np.dot(num, class_average_pow(lo, hi, p))) for p in range(5)}

    def dpq(p, q):
        return ref * (mom[p] / mom[q]) ** (1 / (p - q))
    dv10, dv50, dv90 = (quantile(edges, vol, F, 4) for F in (0.1, 0.5, 0.9))
    return {"d10_m": dpq(1, 0), "d20_m": dpq(2, 0), "d30_m": dpq(3, 0), "d32_m": dpq(3, 2),
            "d43_m": dpq(4, 3), "dv10_m": dv10, "dv50_m": dv50, "dv90_m": dv90,
            "span": (dv90 - dv10) / dv50, "relative_span": (dv90 - dv10) / dv50}


# ---------------------------------------------------------------- history

GL_X, GL_W = np.polynomial.legendre.leggauss(6)


def shrinkage_time(drops, d0):
    """G(d) on one fine log grid that contains every bin diameter, by
    six-point Gauss-Legendre panels in ln d; below the first node G grows as
    the local power of d."""
    lo, hi = d0[0] * 1e-4, d0[-1]
    grid = np.exp(np.linspace(math.log(lo), math.log(hi), int(math.log10(hi / lo) * 40) + 1))
    u = np.log(np.union1d(grid, d0))
    mid, half = 0.5 * (u[1:] + u[:-1]), 0.5 * (u[1:] - u[:-1])
    x = np.exp(mid[:, None] + half[:, None] * GL_X[None, :])

    def g(d):
        mdot = drops.rate(d)[0]
        if np.any(mdot <= 0):
            raise ValueError("a drop size on the path does not evaporate")
        return drops.rho_l * np.pi * d ** 3 / (2 * mdot)
    panels = half * (g(x) @ GL_W)
    g_nodes = g(np.exp(u))
    p0 = min(4, max(0.5, math.log(g_nodes[1] / g_nodes[0]) / (u[1] - u[0])))
    G = np.concatenate(([g_nodes[0] / p0], g_nodes[0] / p0 + np.cumsum(panels)))
    # dG/du = g(d): the exact slope of ln G in u at each node, d ln G/du = g/G.
    return u, G, p0, g_nodes / G


def history(drops, d0, w, steps=200, max_time=0.0, sauter=None):
    """sauter: per bin, the class's own Sauter diameter over d0; D32 counts
    the bin's drops at that many times its diameter (docs/methods-evap.md)."""
    if sauter is None:
        sauter = np.ones_like(d0)
    u, G, p0, slope = shrinkage_time(drops, d0)
    life = np.exp(np.interp(np.log(d0), u, np.log(G)))  # d0 are grid nodes: exact
    # d(t) from G(d) = G(d0) - t: cubic Hermite interpolation of ln d in ln G
    # with the exact node slopes d u/d ln G = G/g. (A PCHIP interpolant, whose
    # slopes are estimated from neighbouring nodes, put t50 of a stagnant
    # n-heptane case 2.75e-4 late against an adaptive-quadrature solution of
    # G(d) = G(d0) - t, docs/bench/shrinkage_check.py.)
    lnd_of_lnG = interpolate.CubicHermiteSpline(np.log(G), u, 1 / slope, extrapolate=False)

    def diameters(t):
        tau = life[None, :] - np.atleast_1d(t)[:, None]
        out = np.zeros_like(tau)
        pos = tau > 0
        v = np.log(tau[pos])
        below = v < math.log(G[0])
        # v = ln(life) of the largest class may round an ulp past the last
        # node, where the interpolant (extrapolate=False) gives NaN.
        lnd = np.where(below, u[0] + (v - math.log(G[0])) / p0,
                       lnd_of_lnG(np.clip(v, math.log(G[0]), math.log(G[-1]))))
        out[pos] = np.exp(lnd)
        return out

    def remaining(t):
        d = diameters(t)[0]
        return float(np.dot(w, (d / d0) ** 3))

    t_max = float(life.max())

    def crossing(x):
        return optimize.brentq(lambda t: remaining(t) - (1 - x), 0, t_max, xtol=1e-12 * t_max)
    t50, t90, t99 = crossing(0.5), crossing(0.9), crossing(0.99)
    t_end = max_time or t99
    t_first = max(t_end * 1e-6, min(t_end * 1e-3, 0.05 * float(life.min())))
    ts = np.concatenate(([0.0], t_first * np.exp(np.log(t_end / t_first) * np.arange(steps) / (steps - 1))))
    ts[-1] = t_end
    d = diameters(ts)
    v = w[None, :] * (d / d0[None, :]) ** 3
    rem = v.sum(axis=1)
    with np.errstate(divide="ignore", invalid="ignore"):
        s2 = np.where(d > 0, v / (sauter[None, :] * d), 0).sum(axis=1)
    d32 = np.where(s2 > 0, rem / np.where(s2 > 0, s2, 1), 0)
    # Dv50: each bin a point at its diameter, cumulative volume at its middle.
    cmid = np.cumsum(v, axis=1) - 0.5 * v
    dv50 = np.zeros(len(ts))
    for k in range(len(ts)):
        alive = v[k] > 0
        if rem[k] <= 0 or not alive.any():
            continue
        c, dk = cmid[k][alive], d[k][alive]
        half = 0.5 * rem[k]
        j = int(np.searchsorted(c, half))
        if j == 0:
            dv50[k] = dk[0]
        elif j >= len(c):
            dv50[k] = dk[-1]
        else:
            dv50[k] = dk[j - 1] + (dk[j] - dk[j - 1]) * (half - c[j - 1]) / (c[j] - c[j - 1])
    hist = {"t_s": ts.tolist(), "evaporated_mass_fraction": np.maximum(0, 1 - rem).tolist(),
            "d32_m": d32.tolist(), "dv50_m": dv50.tolist()}
    return life, hist, (t50, t90, t99)


# ---------------------------------------------------------------- case

def regime(kn):
    return np.select([kn < 0.01, kn < 0.1, kn <= 10], ["continuum", "slip", "transition"], "free-molecular")


def evaluate(case):
    drops = Drops(case)
    edges, num, vol = cut(case["distribution"])
    d = np.exp((np.log(edges[:-1]) + np.log(edges[1:])) / 2)
    mdot, s, kn = drops.rate(d)
    flat = drops.rate(d, curved=False)[0]
    enh = np.where(flat > 0, mdot / flat, 0)
    lo, hi = edges[:-1] / d, edges[1:] / d
    sauter = class_average_pow(lo, hi, 3) / class_average_pow(lo, hi, 2)
    life, hist, (t50, t90, t99) = history(drops, d, vol, max_time=case.get("evaporation", {}).get("max_time_s", 0),
                                          sauter=sauter)
    summ = summary(edges, num, vol)
    summ.update({"t50_s": t50, "t90_s": t90, "t99_s": t99})
    reg = regime(kn)
    bins = [{"d_lo_m": edges[i], "d_hi_m": edges[i + 1], "d_m": d[i], "number_fraction": num[i],
             "volume_fraction": vol[i], "laplace_pa": 2 * drops.sigma / (d[i] / 2),
             "vapor_pressure_pa": s[i] * drops.pflat, "kelvin_ratio": s[i], "evaporation_enhancement": enh[i],
             "lifetime_s": life[i], "surface_temperature_k": drops.ts, "knudsen": kn[i], "regime": str(reg[i]),
             "evaporation_rate_kg_s": mdot[i]} for i in range(len(d))]
    bins = [{k: (float(v) if isinstance(v, (float, np.floating)) else v) for k, v in b.items()} for b in bins]
    return {"summary": summ, "bins": bins, "history": hist}


def main():
    print(f"fogbench reference: python {sys.version.split()[0]}, numpy {np.__version__}, scipy {scipy.__version__}",
          file=sys.stderr)
    with open(sys.argv[1]) as f:
        data = json.load(f)
    cases = data if isinstance(data, list) else [data]
    results = [evaluate(c) for c in cases]
    json.dump(results if isinstance(data, list) else results[0], sys.stdout, indent=2)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
