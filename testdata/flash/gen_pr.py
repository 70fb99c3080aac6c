#!/usr/bin/python3
"""Reference values of the Peng-Robinson saturation pressure and liquid
spinodal for calc/flash, computed independently of the Go code with Debian's
python3-numpy (numpy.roots on the cubic in Z and on the spinodal quartic in
x = v/b) and python3-scipy (scipy.optimize.brentq on the equal-fugacity
condition, scipy.optimize.fsolve on the critical conditions).

Run:  /usr/bin/python3 testdata/flash/gen_pr.py > testdata/flash/pr_scipy.csv
"""
import math

import numpy as np
import scipy
from scipy.optimize import brentq, fsolve

R = 8.314462618  # J/(mol K), CODATA 2018


def critical_omegas():
    # Unknowns x = v/b and A = a/(b R T) at the critical point, from
    # dp/dx = 0 and d2p/dx2 = 0 of p b/(R T) = 1/(x-1) - A/(x^2+2x-1).
    def eqs(u):
        x, A = u
        q = x * x + 2 * x - 1
        d1 = -1 / (x - 1) ** 2 + A * (2 * x + 2) / q ** 2
        d2 = 2 / (x - 1) ** 3 + A * (2 * q - 2 * (2 * x + 2) ** 2) / q ** 3
        return [d1, d2]
    x, A = fsolve(eqs, [3.9, 5.9], xtol=1e-13)
    omega_b = 1 / (x - 1) - A / (x * x + 2 * x - 1)
    return A * omega_b, omega_b


OMEGA_A, OMEGA_B = critical_omegas()


def params(tc, pc, w, t):
    kappa = 0.37464 + 1.54226 * w - 0.26992 * w * w
    alpha = (1 + kappa * (1 - math.sqrt(t / tc))) ** 2
    return OMEGA_A * R * R * tc * tc / pc * alpha, OMEGA_B * R * tc / pc


def z_roots(a, b, t, p):
    A = a * p / (R * t) ** 2
    B = b * p / (R * t)
    c = [1, -(1 - B), A - 3 * B * B - 2 * B, -(A * B - B * B - B ** 3)]
    r = np.roots(c)
    real = sorted(x.real for x in r if abs(x.imag) < 1e-10 * max(1, abs(x.real)) and x.real > B)
    return real, A, B


def ln_phi(z, A, B):
    s2 = math.sqrt(2)
    return z - 1 - math.log(z - B) - A / (2 * s2 * B) * math.log((z + (1 + s2) * B) / (z + (1 - s2) * B))


def spinodals(tc, pc, w, t):
    a, b = params(tc, pc, w, t)
    A = a / (b * R * t)
    # (x^2+2x-1)^2 - 2A (x+1)(x-1)^2 = 0
    quartic = np.polysub(np.polymul([1, 2, -1], [1, 2, -1]), np.polymul([2 * A], np.polymul([1, 1], [1, -2, 1])))
    xs = sorted(x.real for x in np.roots(quartic) if abs(x.imag) < 1e-9 and x.real > 1)
    p = lambda x: R * t / (b * (x - 1)) - a / (b * b * (x * x + 2 * x - 1))
    return p(xs[0]), p(xs[-1]), b * xs[0]


def psat(tc, pc, w, t):
    a, b = params(tc, pc, w, t)
    pl, pv, _ = spinodals(tc, pc, w, t)
    lo = max(pl, 0) * (1 + 1e-9) if pl > 0 else pv * 1e-12
    hi = pv * (1 - 1e-9)

    def g(lnp):
        zs, A, B = z_roots(a, b, t, math.exp(lnp))
        return ln_phi(zs[0], A, B) - ln_phi(zs[-1], A, B)
    return math.exp(brentq(g, math.log(lo), math.log(hi), xtol=1e-14, rtol=1e-15))


SUBSTANCES = [
    # name, Tc (K), pc (Pa), omega: constants typed here so the table does
    # not depend on fogbench's fluid library.
    ("water-constants", 647.096, 22.064e6, 0.3443),
    ("heptane-like", 540.2, 2.74e6, 0.35),
    ("light-gas-like", 190.6, 4.6e6, 0.011),
]

print(f"# python3-scipy {scipy.__version__}, python3-numpy {np.__version__} (Debian); Omega_a = {OMEGA_A!r}, Omega_b = {OMEGA_B!r}")
print("name,tc_k,pc_pa,omega,t_k,psat_pa,spinodal_pa,spinodal_v_m3_mol")
for name, tc, pc, w in SUBSTANCES:
    for tr in (0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 0.99):
        t = tr * tc
        sp, _, sv = spinodals(tc, pc, w, t)
        print(f"{name},{tc!r},{pc!r},{w!r},{t!r},{psat(tc, pc, w, t)!r},{sp!r},{sv!r}")
