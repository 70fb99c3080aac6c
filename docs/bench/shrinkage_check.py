#!/usr/bin/python3
"""A third, tighter computation of the spray's lifetimes and t50/t90/t99, to
decide which side is wrong when fogbench and docs/bench/reference.py differ.

It uses reference.py's per-class physics (which agrees with fogbench's rates
to 1e-9 at every class diameter) but none of either program's tables: each
shrinkage time G(d) = integral_0^d rho_L pi d'^2 / (2 mdot(d')) dd' is taken
by scipy.integrate.quad in ln d at a relative tolerance of 1e-13, each
diameter on the path by brentq on G(d) = G(d0) - t, and t50/t90/t99 by
brentq on the remaining volume. It is slow (about a minute a case) and is
not run by the tests.

Usage: /usr/bin/python3 docs/bench/shrinkage_check.py CASES.json [CASE_INDEX ...]
Writes, per case, the lifetimes and t50/t90/t99 as JSON on standard output;
library versions on standard error.
"""

import json
import math
import os
import sys

import numpy as np
import scipy
from scipy import integrate, optimize

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import reference  # noqa: E402


def check(case):
    drops = reference.Drops(case)
    edges, _, vol = reference.cut(case["distribution"])
    d0 = np.exp((np.log(edges[:-1]) + np.log(edges[1:])) / 2)

    def g(d):
        mdot = drops.rate(np.array([d]))[0][0]
        return drops.rho_l * math.pi * d * d / (2 * mdot)

    def G(d):
        # In u = ln d from d·1e-12, below which the time is negligible.
        v, _ = integrate.quad(lambda u: g(math.exp(u)) * math.exp(u), math.log(d * 1e-12), math.log(d),
                              epsabs=0, epsrel=1e-13, limit=500)
        return v

    life = np.array([G(x) for x in d0])

    def diameter(i, t):
        tau = life[i] - t
        if tau <= 0:
            return 0.0
        return optimize.brentq(lambda d: G(d) - tau, d0[i] * 1e-9, d0[i], xtol=1e-20, rtol=1e-14)

    def remaining(t):
        return sum(vol[i] * (diameter(i, t) / d0[i]) ** 3 for i in range(len(d0)))

    tmax = float(life.max())
    times = {}
    for x in (0.5, 0.9, 0.99):
        times["t%d_s" % round(100 * x)] = optimize.brentq(lambda t: remaining(t) - (1 - x), 0, tmax, xtol=1e-14 * tmax)
    return {"name": case.get("name", ""), "lifetime_s": life.tolist(), **times}


def main():
    print(f"shrinkage check: python {sys.version.split()[0]}, numpy {np.__version__}, scipy {scipy.__version__}",
          file=sys.stderr)
    with open(sys.argv[1]) as f:
        data = json.load(f)
    cases = data if isinstance(data, list) else [data]
    pick = [int(a) for a in sys.argv[2:]] or range(len(cases))
    json.dump([check(cases[k]) for k in pick], sys.stdout, indent=1)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
