#!/usr/bin/python3
"""Independent arithmetic of the dense-gas viscosity and conductivity of
Chung, Ajlan, Lee & Starling, Ind. Eng. Chem. Res. 27 (1988) 671, as given by
Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed.
(viscosity eqs. 9-6.18 to 9-6.21, Table 9-6; conductivity eq. 10-5.4, Table
10-3), written here from the published form in plain Python 3 (no library;
the coefficient tables as read in CalebBell/chemicals thermal_conductivity.py
Chung_dense and two open implementations of the viscosity method).

Writes chung_dense.csv: the dense viscosity and conductivity from a given
dilute value, T, molar density, M, Tc, Vc, omega (nonpolar: mu_r = kappa = 0)
at points of an N2-like and an N2 + n-dodecane pseudo-fluid, SI units.
The first line names the method and the Python version.
"""
import math
import sys

EA = [6.32402, 1.2102e-3, 5.28346, 6.62263, 19.74540, -1.89992, 24.27450, 0.79716, -0.23816, 0.068629]
EB = [50.41190, -1.1536e-3, 254.209, 38.0957, 7.63034, -12.53670, 3.44945, 1.11764, 0.067695, 0.34793]
BA = [2.4166, -0.50924, 6.6107, 14.543, 0.79274, -5.8634, 91.089]
BB = [0.74824, -1.5094, 5.6207, -8.9139, 0.82019, 12.801, 128.11]


def g2(c, y):
    g1 = (1 - 0.5 * y) / (1 - y) ** 3
    return (c[0] / y * (1 - math.exp(-c[3] * y)) + c[1] * g1 * math.exp(c[4] * y) + c[2] * g1) / (c[0] * c[3] + c[1] + c[2])


def visc(mu0, T, rho, M, Tc, Vc, w):
    E = [a + b * w for a, b in zip(EA, EB)]
    vcc = Vc * 1e6
    y = rho * 1e-6 * vcc / 6  # rho mol/m3 -> mol/cm3
    G2 = g2(E, y)
    ts = 1.2593 * T / Tc
    muss = E[6] * y ** 2 * G2 * math.exp(E[7] + E[8] / ts + E[9] / ts ** 2)
    return mu0 * (1 / G2 + E[5] * y) + 36.344 * (M * 1e3 * Tc) ** 0.5 / vcc ** (2 / 3) * muss * 1e-7


def cond(k0, T, rho, M, Tc, Vc, w):
    B = [a + b * w for a, b in zip(BA, BB)]
    vcc = Vc * 1e6
    y = rho * 1e-6 * vcc / 6
    G2 = g2(B, y)
    q = 3.586e-3 * (Tc / M) ** 0.5 / vcc ** (2 / 3)
    return k0 * (1 / G2 + B[5] * y) + q * B[6] * y ** 2 * (T / Tc) ** 0.5 * G2


print("# Chung et al. (1988) dense terms, plain arithmetic, Python %s" % sys.version.split()[0])
print("mu0_pa_s,k0_w_m_k,t_k,rho_mol_m3,m_kg_mol,tc_k,vc_m3_mol,omega,mu_pa_s,k_w_m_k")
pts = [
    # N2 (Tc 126.192 K, Vc 89.41 cm3/mol, omega 0.0372) at 600 K, 20/40/60 bar
    (2.9e-5, 0.044, 600, 2e6 / (8.314462618 * 600), 28.0134e-3, 126.192, 1 / 11183.9, 0.0372),
    (2.9e-5, 0.044, 600, 4e6 / (8.314462618 * 600), 28.0134e-3, 126.192, 1 / 11183.9, 0.0372),
    (2.9e-5, 0.044, 600, 6e6 / (8.314462618 * 600), 28.0134e-3, 126.192, 1 / 11183.9, 0.0372),
    # a 20 % n-dodecane + N2 pseudo-fluid by Kay's rule at 500 K, 40 bar
    (1.9e-5, 0.035, 500, 4e6 / (8.314462618 * 500 * 0.95), 0.2 * 170.33e-3 + 0.8 * 28.0134e-3,
     0.2 * 658 + 0.8 * 126.192, 0.2 * 754e-6 + 0.8 / 11183.9, 0.2 * 0.576 + 0.8 * 0.0372),
]
for mu0, k0, T, rho, M, Tc, Vc, w in pts:
    print("%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g,%.17g" % (
        mu0, k0, T, rho, M, Tc, Vc, w, visc(mu0, T, rho, M, Tc, Vc, w), cond(k0, T, rho, M, Tc, Vc, w)))
