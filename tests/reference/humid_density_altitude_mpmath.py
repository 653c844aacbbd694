#!/usr/bin/env python3
"""Density altitude of moist air, computed independently at 30 digits with mpmath.

The check of aerostrata::inverse::density_altitude_humid (crates/aerostrata/tests/
humid_density_altitude.rs holds the numbers this prints). Written from the formulas, not
from the library's code:
- vapour pressure: Buck (1981), e = f(p) * 611.21 Pa * exp(17.502 t / (240.97 + t)),
  f(p) = 1.0007 + 3.46e-6 * p[hPa], t in degC (at the dew point; or RH times the
  saturation value at the air temperature);
- moist air is an ideal mixture: rho = (p - e) Md / (R* T) + e Mw / (R* T), with
  Md = 28.9644 kg/kmol and R* = 8314.32 J/(kmol K) (U.S. Standard Atmosphere 1976,
  Table 2 and eq. 2) and Mw = 18.01528 kg/kmol (water; from memory);
- the standard's troposphere (U.S. Standard Atmosphere 1976, eqs. 33a and 42 with
  L = -6.5 K/km, T0 = 288.15 K, p0 = 101 325 Pa, g0 = 9.80665 m/s^2):
  rho(H) = rho0 (1 + L H / T0)^(-(1 + g0 Md / (R* L))), solved for H in closed form.
Usage: python3 humid_density_altitude_mpmath.py  (prints one line per case)
"""
from mpmath import mp, mpf, exp

mp.dps = 30
R = mpf("8314.32")
MD = mpf("28.9644")
MW = mpf("18.01528")
G0 = mpf("9.80665")
T0 = mpf("288.15")
P0 = mpf(101325)
L = mpf("-0.0065")


def buck(t_k, p_pa):
    t = t_k - mpf("273.15")
    return (mpf("1.0007") + mpf("3.46e-6") * p_pa / 100) * mpf("611.21") * exp(mpf("17.502") * t / (mpf("240.97") + t))


def density_altitude(rho):
    rho0 = P0 * MD / (R * T0)
    n = -(1 + G0 * MD / (R * L))
    return T0 / L * ((rho / rho0) ** (1 / n) - 1)


def humid(p, t, e):
    return density_altitude(((p - e) * MD + e * MW) / (R * t))


# (case, pressure Pa, temperature K, dew point K or None, relative humidity % or None)
CASES = [
    ("coastal afternoon", "100800", "305.15", "299.15", None),
    ("high desert pad", "85000", "308.15", "263.15", None),
    ("tropical saturated", "101000", "303.15", None, "100"),
    ("cool morning", "95000", "283.15", None, "60"),
    ("dry air", "90000", "290.15", None, "0"),
]

for name, p, t, td, rh in CASES:
    p, t = mpf(p), mpf(t)
    e = buck(mpf(td), p) if td is not None else mpf(rh) / 100 * buck(t, p)
    print(f"{name}: H = {mp.nstr(humid(p, t, e), 20)} m")
