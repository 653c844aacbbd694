#!/usr/bin/env python3
"""Density of moist air by the CIPM-2007 equation, at 30 digits, for aerostrata's
moist-air test (crates/aerostrata/tests/sounding_humidity.rs).

Source: A. Picard, R. S. Davis, M. Glaeser and K. Fujii, "Revised formula for the
density of moist air (CIPM-2007)", Metrologia 45 (2008) 149-155. Its coefficients
below are written from memory of the paper; the script's self-test checks the
saturation vapour pressure they give against a handbook table of the vapour
pressure of water (CRC Handbook, from memory) before printing anything.

The CIPM equation is independent of aerostrata's: a different saturation formula
(its own fit, not Buck's), a different enhancement factor, a compressibility factor
Z for the non-ideal gas, and a molar mass of dry air with 400 umol/mol of CO2.

Usage: moist_air_cipm2007_mpmath.py   prints one line per test point:
    t_degC p_Pa RH_percent rho_kg_m3 Z M_a_kg_kmol
and ends with "N passed, N failed" for the self-test. Standard library + mpmath.
"""

import sys

from mpmath import exp, mp, mpf

from vector_tools import Tally

mp.dps = 30

R = mpf("8.314472")          # J/(mol K), the CIPM-2007 value
M_V = mpf("18.01528e-3")     # kg/mol, water
X_CO2 = mpf("0.0004")        # mole fraction of CO2

A = mpf("1.2378847e-5")      # K^-2
B = mpf("-1.9121316e-2")     # K^-1
C = mpf("33.93711047")
D = mpf("-6.3431645e3")      # K

ALPHA = mpf("1.00062")
BETA = mpf("3.14e-8")        # Pa^-1
GAMMA = mpf("5.6e-7")        # K^-2

A0 = mpf("1.58123e-6")       # K Pa^-1
A1 = mpf("-2.9331e-8")       # Pa^-1
A2 = mpf("1.1043e-10")       # K^-1 Pa^-1
B0 = mpf("5.707e-6")         # K Pa^-1
B1 = mpf("-2.051e-8")        # Pa^-1
C0 = mpf("1.9898e-4")        # K Pa^-1
C1 = mpf("-2.376e-6")        # Pa^-1
D_Z = mpf("1.83e-11")        # K^2 Pa^-2
E_Z = mpf("-0.765e-8")       # K^2 Pa^-2

# Test points: (t in degC, p in Pa, relative humidity in %), a metrology laboratory's
# reference condition and hot, humid days.
POINTS = [
    ("20", "101325", "50"),
    ("30", "101325", "80"),
    ("35", "100000", "90"),
    ("25", "90000", "60"),
    ("0", "101325", "100"),
    ("40", "95000", "40"),
]

# Handbook vapour pressure of water, Pa (CRC Handbook of Chemistry and Physics, table
# "Vapor pressure of water", from memory).
HANDBOOK = [("0", "611.2"), ("20", "2339.3"), ("30", "4246.9"), ("40", "7384.9"), ("50", "12352")]


def saturation_pa(t_k):
    return exp(A * t_k**2 + B * t_k + C + D / t_k)


def density(t_c, p, rh):
    t_k = t_c + mpf("273.15")
    f = ALPHA + BETA * p + GAMMA * t_c**2
    x_v = rh / 100 * f * saturation_pa(t_k) / p
    z = (
        1
        - p / t_k * (A0 + A1 * t_c + A2 * t_c**2 + (B0 + B1 * t_c) * x_v + (C0 + C1 * t_c) * x_v**2)
        + (p / t_k) ** 2 * (D_Z + E_Z * x_v**2)
    )
    m_a = (mpf("28.96546") + mpf("12.011") * (X_CO2 - mpf("0.0004"))) * mpf("1e-3")
    rho = p * m_a / (z * R * t_k) * (1 - x_v * (1 - M_V / m_a))
    return rho, z, m_a * 1000


def main():
    tally = Tally()
    for t_c, expected in HANDBOOK:
        value = saturation_pa(mpf(t_c) + mpf("273.15"))
        # The handbook's last digit, and 1e-4 relative for the fit itself.
        ok = abs(value - mpf(expected)) <= mpf("2e-4") * mpf(expected)
        tally.record(ok)
        if not ok:
            print(f"self-test: p_sv({t_c} degC) = {mp.nstr(value, 8)} Pa, handbook {expected} Pa", file=sys.stderr)
    for t_c, p, rh in POINTS:
        rho, z, m_a = density(mpf(t_c), mpf(p), mpf(rh))
        print(t_c, p, rh, mp.nstr(rho, 12), mp.nstr(z, 12), mp.nstr(m_a, 9))
    return tally.close()


if __name__ == "__main__":
    sys.exit(main())
