#!/usr/bin/env python3
"""Independent check of the hydrostatic-offset day: the 1976 standard's molecular-scale
temperature shifted by a constant dT at every geopotential altitude, the pressure in
hydrostatic balance from a sea-level pressure p0.

The reference does not use the layers' closed forms (the code under test does): it
integrates the hydrostatic equation numerically,

    ln(p(H) / p0) = -(g0 M0 / R*) * integral from 0 to H of dH' / T_M(H'),

with mpmath's Gauss-Legendre quadrature at 30 significant digits, split at the layer
bases where T_M(H) bends, and T_M(H) = T_M,std(H) + dT from the standard's lapse rates
(NOAA-S/T 76-1562, October 1976, Table 4). The density is p M0 / (R* T_M), the speed of
sound sqrt(gamma R* T_M / M0), the kinetic temperature T_M M/M0 (M/M0 from the
standard's table between 80 and 86 km, the same table as usa76_mpmath.py's).

Modes:
  hydrostatic_offset_mpmath.py --write          write the vector files below
  hydrostatic_offset_mpmath.py --self-test      with dT = 0 the integral gives the
                                                standard's printed base pressures, and
                                                agrees with usa76_mpmath.py's closed form
  hydrostatic_offset_mpmath.py --check-vectors CSV
                                                check a vector file against the integral

Every mode ends with a line "N passed, N failed" and exits 1 on any failure.
Standard library + mpmath only.
"""

import os
import sys

from mpmath import mp, mpf

import usa76_mpmath as usa76
from vector_tools import ROOT, Tally, allowed_error, half_unit_of_last_digit, read_vector_file, run_mode

mp.dps = 30

# The days the vector files hold: (file, dT K, p0 Pa, what it stands for). Invented
# design days, not climatology.
DAYS = [
    ("hydrostatic_offset_hot.csv", "15", "101325", "a hot day, ISA+15 in balance"),
    ("hydrostatic_offset_cold.csv", "-25", "98000", "a cold day with a low sea-level pressure"),
]

# Geometric altitudes, m: below sea level, the boundary layer, through every layer of the
# standard (its bases lie at 0, 11.019, 20.063, 32.162, 47.350, 51.413, 71.802 km
# geometric), the 80 to 86 km band where M/M0 departs from 1, and the top.
ALTITUDES = [
    "-4500", "-1000", "0", "250", "1524", "3000", "6096", "9144", "10000", "11000",
    "11100", "15000", "20000", "20100", "26000", "32100", "32200", "40000", "47300",
    "47400", "50000", "51500", "60000", "71700", "71900", "76000", "80000", "80250",
    "83333", "85500", "86000",
]

COLUMNS = ["temperature_K", "molecular_temperature_K", "pressure_Pa", "density_kg_m3",
           "speed_of_sound_m_s"]

# 1e-10 relative is what the project's issue asks of the code; the code's closed forms in
# f64 (a power or an exponential per layer, seven layers chained) are expected to agree
# to a few 1e-15, so the files ask for 1e-12 and a miss means a real defect.
TOLERANCE = "rel 1e-12"

_GMR = usa76.G0 * usa76.M0 / usa76.R_STAR


def _bases():
    """The standard's layer bases (m'), lapse rates (K/m') and base T_M (K), the
    temperatures chained from 288.15 K by the lapse rates alone."""
    return [(h_b, lapse, t_b) for h_b, lapse, t_b, _ in usa76.LAYERS]


def t_m(h, dt):
    """T_M,std(H) + dT; below 0 the first layer extended, as the standard does."""
    layer = _bases()[0]
    for candidate in _bases():
        if h >= candidate[0]:
            layer = candidate
    h_b, lapse, t_b = layer
    return t_b + lapse * (h - h_b) + dt


def pressure(h, dt, p0):
    """p0 exp(-(g0 M0/R*) int_0^H dH'/T_M), the integral split at the bases."""
    def inverse(x):
        return 1 / t_m(x, dt)

    if h >= 0:
        integral = mp.quad(inverse, [mpf(0)] + [b[0] for b in _bases()[1:] if b[0] < h] + [h])
    else:
        # Below sea level, inside the first layer: the integral from 0 down to H.
        integral = -mp.quad(inverse, [h, mpf(0)])
    return p0 * mp.exp(-_GMR * integral)


def state(z, dt, p0):
    """The compared quantities at geometric altitude z (m)."""
    z, dt, p0 = mpf(z), mpf(dt), mpf(p0)
    h = usa76.geopotential(z)
    tm = t_m(h, dt)
    p = pressure(h, dt, p0)
    return {
        "temperature_K": tm * usa76.molar_mass_ratio(z),
        "molecular_temperature_K": tm,
        "pressure_Pa": p,
        "density_kg_m3": p * usa76.M0 / (usa76.R_STAR * tm),
        "speed_of_sound_m_s": mp.sqrt(usa76.GAMMA * usa76.R_STAR * tm / usa76.M0),
    }


def _path(name):
    return os.path.join(ROOT, "tests", "vectors", name)


def write():
    tally = Tally()
    for name, dt, p0, what in DAYS:
        lines = [
            "# The 1976 standard's temperature profile shifted by %s K at every geopotential" % dt,
            "# altitude, pressure in hydrostatic balance from %s Pa at 0 m' (%s)." % (p0, what),
            "# Computed with mpmath at 30 digits by tests/reference/hydrostatic_offset_mpmath.py,",
            "# which integrates the hydrostatic equation by quadrature (not the layers' closed",
            "# forms the code uses); layer constants from NOAA-S/T 76-1562 (1976). Written to",
            "# 17 significant digits.",
            "# model: hydrostatic_offset offset=%s p0=%s" % (dt, p0),
        ]
        lines += ["# tolerance: %s %s" % (column, TOLERANCE) for column in COLUMNS]
        lines.append(",".join(["geometric_altitude_m"] + COLUMNS))
        for z in ALTITUDES:
            values = state(z, dt, p0)
            lines.append(",".join([z] + [mp.nstr(values[c], 17, min_fixed=-4, max_fixed=8)
                                         for c in COLUMNS]))
        with open(_path(name), "w", newline="\n") as f:
            f.write("\n".join(lines) + "\n")
        print("wrote tests/vectors/%s (%d rows)" % (name, len(ALTITUDES)))
        tally.record(True)
    return tally.close()


def check_vectors(path):
    """Every cell of `path` against the integral, with the file's own tolerances."""
    tally = Tally()
    model, tolerances, header, rows = read_vector_file(path)
    words = (model or "").split()
    if not words or words[0] != "hydrostatic_offset":
        print("%s: model %r is not checked by this script" % (path, model))
        tally.record(False)
        return tally.close()
    parameters = dict(word.split("=", 1) for word in words[1:])
    dt, p0 = parameters.get("offset", "0"), parameters.get("p0", "101325")
    worst = mpf(0)
    for row in rows:
        reference = state(row[0], dt, p0)
        for column, text in zip(header[1:], row[1:]):
            if not text.strip():
                continue
            error = abs(mpf(text) - reference[column])
            limit = allowed_error(tolerances[column], text, reference[column], mpf)
            worst = max(worst, error / abs(reference[column]))
            ok = error <= limit
            tally.record(ok)
            if not ok:
                print("  Z = %-8s %-24s file %s, integral %s" % (row[0], column, text,
                                                                mp.nstr(reference[column], 20)))
    print("%s: dT = %s K, p0 = %s Pa, %d rows, worst relative difference %.1e"
          % (os.path.relpath(path, ROOT), dt, p0, len(rows), float(worst)))
    return tally.close()


# The standard's base pressures as printed (from memory of its Table 4, the same values as
# usa76_mpmath.py's self-test): with dT = 0 the integral must give them.
PRINTED_BASES = [("11000", "22632.06"), ("20000", "5474.889"), ("32000", "868.0187"),
                 ("47000", "110.9063"), ("51000", "66.93887"), ("71000", "3.956420")]


def self_test():
    tally = Tally()
    print("dT = 0: the integral against the standard's printed base pressures (from memory):")
    for h, printed in PRINTED_BASES:
        value = pressure(mpf(h), mpf(0), usa76.P0)
        ok = abs(value - mpf(printed)) <= half_unit_of_last_digit(printed, mpf)
        tally.record(ok)
        print("  p at H = %6s m'  printed %-10s integral %-22s %s"
              % (h, printed, mp.nstr(value, 15), "ok" if ok else "FAILED"))
    worst = mpf(0)
    for z in ALTITUDES:
        closed = usa76.state(z)["pressure_Pa"]
        worst = max(worst, abs(pressure(usa76.geopotential(mpf(z)), mpf(0), usa76.P0) / closed - 1))
    ok = worst < mpf("1e-25")
    tally.record(ok)
    print("dT = 0: the integral against usa76_mpmath.py's closed form at %d altitudes: "
          "worst relative difference %.1e (limit 1e-25) %s"
          % (len(ALTITUDES), float(worst), "ok" if ok else "FAILED"))
    return tally.close()


def compare_cli(_binary):
    print("no CLI comparison in this script: the vector files carry the check to every door")
    return 0


if __name__ == "__main__":
    sys.exit(run_mode(sys.argv[1:], __doc__, compare_cli,
                      ("--self-test", "check the integral against the standard", self_test),
                      check_vectors, "quadrature of the hydrostatic equation",
                      more=[("--write", {"action": "store_true", "help": "write the vector files"},
                             lambda _: write())]))
