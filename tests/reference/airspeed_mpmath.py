#!/usr/bin/env python3
"""Independent values for the airspeed worked examples of crates/aerostrata/tests.

Written from the definitions alone (docs/aerodynamics.md, "Airspeeds") and evaluated
with mpmath at 30 significant digits: TAS V = M a, EAS = V sqrt(rho / rho0), and CAS
from the impact pressure qc = p f(M) through qc = p0 f(CAS / a0), where f is the
subsonic isentropic pitot relation up to Mach 1 and the Rayleigh pitot formula above
it; sea-level standard p0, T0, rho0 and a0 of the 1976 standard; gamma = 1.4. The
static pressure at a pressure altitude comes from the standard's first two layers
(geopotential altitude, up to 20 km).

Prints one line per example: pressure altitude (m'), OAT (K), Mach, then p, a, TAS,
EAS, CAS (m/s), qc and q (Pa), 15 significant digits. Standard library + mpmath.
"""

from mpmath import findroot, mp, mpf, sqrt

mp.dps = 30

GAMMA = mpf("1.4")
R_STAR = mpf("8314.32")
M0 = mpf("28.9644")
G0 = mpf("9.80665")
T0 = mpf("288.15")
P0 = mpf("101325")
GMR = G0 * M0 / R_STAR
RHO0 = P0 * M0 / (R_STAR * T0)
A0 = sqrt(GAMMA * R_STAR * T0 / M0)
LAPSE = mpf("-0.0065")


def pitot(m):
    """qc / p at Mach m."""
    g = GAMMA
    if m <= 1:
        return (1 + (g - 1) / 2 * m * m) ** (g / (g - 1)) - 1
    return ((g + 1) ** 2 * m * m / (4 * g * m * m - 2 * (g - 1))) ** (g / (g - 1)) * (
        (1 - g + 2 * g * m * m) / (g + 1)
    ) - 1


def mach_of(ratio):
    """Inverse of pitot()."""
    g = GAMMA
    if ratio <= pitot(mpf(1)):
        return sqrt(2 / (g - 1) * ((ratio + 1) ** ((g - 1) / g) - 1))
    return findroot(lambda m: pitot(m) - ratio, mpf(2))


def pressure(h):
    """The standard's pressure at geopotential altitude h <= 20 km."""
    t11 = T0 + LAPSE * 11000
    p11 = P0 * (T0 / t11) ** (GMR / LAPSE)
    if h <= 11000:
        return P0 * (T0 / (T0 + LAPSE * h)) ** (GMR / LAPSE)
    return p11 * mp.e ** (-GMR * (h - 11000) / t11)


EXAMPLES = [
    ("10000", "223.15", "0.8"),
    ("0", "288.15", "1.5"),
    ("11000", "216.65", "2.0"),
    ("3000", "278.65", "0.3"),
    ("20000", "216.65", "3.0"),
]


def main():
    print(f"a0 = {mp.nstr(A0, 15)} m/s")
    for h, t, m in EXAMPLES:
        p = pressure(mpf(h))
        temperature = mpf(t)
        mach = mpf(m)
        a = sqrt(GAMMA * R_STAR * temperature / M0)
        rho = p * M0 / (R_STAR * temperature)
        v = mach * a
        qc = p * pitot(mach)
        cas = A0 * mach_of(qc / P0)
        eas = v * sqrt(rho / RHO0)
        values = [p, a, v, eas, cas, qc, rho * v * v / 2]
        print(h, t, m, " ".join(mp.nstr(x, 15) for x in values))


if __name__ == "__main__":
    main()
