#!/usr/bin/env python3
"""Independent high-precision check of aerostrata's U.S. Standard Atmosphere, 1976.

The reference below is written directly from the standard's defining formulas
(NOAA-S/T 76-1562, October 1976) for -5 km to 86 km geometric altitude and is
evaluated with mpmath at 30 significant digits, so that its own rounding error
is many orders of magnitude below the tolerances it enforces on the f64 code.

Modes:
  usa76_mpmath.py [BIN]            run `BIN eval FILE` on fixed + random
                                   altitudes and compare its CSV with mpmath
                                   (BIN defaults to target/debug/aerostrata)
  usa76_mpmath.py --self-test      check the reference itself against a few
                                   printed values of the standard
  usa76_mpmath.py --check-vectors CSV
                                   check a tests/vectors file against mpmath,
                                   using that file's own tolerance lines

Every mode ends with a line "N passed, N failed" and exits 1 on any failure.
Standard library + mpmath only.
"""

import random
import sys

from mpmath import mp, mpf

from vector_tools import Tally, check_us1976_vectors, cli_rows, half_unit_of_last_digit, run_mode

mp.dps = 30

# ---------------------------------------------------------------------------
# Constants of the standard.  Given as strings so that mpmath holds the exact
# decimal values rather than their nearest binary doubles.
# ---------------------------------------------------------------------------
G0 = mpf("9.80665")          # m/s^2, also the geopotential metre's g0'
R0 = mpf("6356766")          # m, effective Earth radius
R_STAR = mpf("8314.32")      # J/(kmol K); the 1976 value, not today's CODATA
M0 = mpf("28.9644")          # kg/kmol, sea-level mean molar mass
N_A = mpf("6.022169e26")     # 1/kmol
SIGMA = mpf("3.65e-10")      # m, effective collision diameter
GAMMA = mpf("1.4")
BETA = mpf("1.458e-6")       # kg/(m s K^0.5), Sutherland
S_SUTH = mpf("110.4")        # K, Sutherland
P0 = mpf("101325")           # Pa
T0 = mpf("288.15")           # K

# Geopotential layer bases (m') and lapse rates of molecular-scale
# temperature (K per m'); the last layer ends at 84.852 km'.
_LAYER_DEFS = [
    ("0", "-6.5"),
    ("11000", "0"),
    ("20000", "1.0"),
    ("32000", "2.8"),
    ("47000", "0"),
    ("51000", "-2.8"),
    ("71000", "-2.0"),
]
H_TOP = mpf("84852")

# M/M0 between 80 and 86 km geometric, every 0.5 km, as given by the standard.
# Below 80 km the ratio is exactly 1.
_M_RATIO_TABLE = [
    ("80000", "1.000000"), ("80500", "0.999996"), ("81000", "0.999989"),
    ("81500", "0.999971"), ("82000", "0.999941"), ("82500", "0.999909"),
    ("83000", "0.999870"), ("83500", "0.999829"), ("84000", "0.999786"),
    ("84500", "0.999741"), ("85000", "0.999694"), ("85500", "0.999641"),
    ("86000", "0.999579"),
]
M_RATIO = [(mpf(z), mpf(r)) for z, r in _M_RATIO_TABLE]

Z_MIN = mpf("-5000")
Z_MAX = mpf("86000")

# g0 M0 / R*, the hydrostatic constant in K per m'.
_GMR = G0 * M0 / R_STAR


def _build_layers():
    """Chain base temperatures and pressures upward from sea level.

    Doing this here, rather than copying the standard's rounded base values,
    keeps the reference independent of any printed number; the self-test then
    compares the chained values with the printed ones.
    """
    layers = []
    h_b, t_b, p_b = mpf(0), T0, P0
    for i, (h_str, l_str) in enumerate(_LAYER_DEFS):
        h_b = mpf(h_str)
        lapse = mpf(l_str) / 1000
        layers.append((h_b, lapse, t_b, p_b))
        h_next = mpf(_LAYER_DEFS[i + 1][0]) if i + 1 < len(_LAYER_DEFS) else H_TOP
        t_b, p_b = _layer_tp(h_next, h_b, lapse, t_b, p_b)
    return layers


def _layer_tp(h, h_b, lapse, t_b, p_b):
    t_m = t_b + lapse * (h - h_b)
    if lapse == 0:
        p = p_b * mp.exp(-_GMR * (h - h_b) / t_b)
    else:
        p = p_b * (t_b / t_m) ** (_GMR / lapse)
    return t_m, p


LAYERS = _build_layers()


def geopotential(z):
    return R0 * z / (R0 + z)


def geometric(h):
    return R0 * h / (R0 - h)


def molar_mass_ratio(z):
    """M/M0, linear in geometric altitude between the tabulated points."""
    if z <= M_RATIO[0][0]:
        return mpf(1)
    for (z1, r1), (z2, r2) in zip(M_RATIO, M_RATIO[1:]):
        if z <= z2:
            return r1 + (r2 - r1) * (z - z1) / (z2 - z1)
    raise ValueError("altitude above 86 km: outside the reference")


def state(z):
    """All tabulated quantities at geometric altitude z (m), as mpf.

    Keys are the column names shared by the vector files and the CLI.
    """
    z = mpf(z)
    if z < Z_MIN or z > Z_MAX:
        raise ValueError("altitude %s m outside [-5000, 86000]" % z)
    h = geopotential(z)
    # Below sea level the first layer is simply extended downward, as the
    # standard's tables do.  86 km geometric lies a few cm' above 84.852 km',
    # so the last layer is extended that little bit too.
    layer = LAYERS[0]
    for cand in LAYERS:
        if h >= cand[0]:
            layer = cand
    t_m, p = _layer_tp(h, *layer)
    ratio = molar_mass_ratio(z)
    t = t_m * ratio
    g = G0 * (R0 / (R0 + z)) ** 2
    rho = p * M0 / (R_STAR * t_m)
    mu = BETA * t ** mpf("1.5") / (t + S_SUTH)
    n = N_A * p / (R_STAR * t)
    return {
        "geometric_altitude_m": z,
        "geopotential_altitude_m": h,
        "temperature_K": t,
        "molecular_temperature_K": t_m,
        "pressure_Pa": p,
        "density_kg_m3": rho,
        # Uses T_M: the ratio M/M0 cancels between T and M.
        "speed_of_sound_m_s": mp.sqrt(GAMMA * R_STAR * t_m / M0),
        "dynamic_viscosity_Pa_s": mu,
        "kinematic_viscosity_m2_s": mu / rho,
        # The standard's empirical conductivity law, in W/(m K).
        "thermal_conductivity_W_m_K": mpf("2.64638e-3") * t ** mpf("1.5")
        / (t + mpf("245.4") * mpf(10) ** (-12 / t)),
        "gravity_m_s2": g,
        "number_density_m3": n,
        "mean_free_path_m": 1 / (mp.sqrt(2) * mp.pi * SIGMA ** 2 * n),
        "pressure_scale_height_m": R_STAR * t_m / (M0 * g),
        "mean_molar_mass_kg_kmol": M0 * ratio,
    }


def layer_base_altitudes():
    """Geometric altitudes (m) of all layer bases and of the 84.852 km' top."""
    return [geometric(layer[0]) for layer in LAYERS] + [geometric(H_TOP)]


# ---------------------------------------------------------------------------
# Small shared helpers
# ---------------------------------------------------------------------------
def rel_err(value, ref, floor=0):
    """|value - ref| relative to |ref|, but never to less than `floor`.

    The floor only matters for quantities that pass through zero (the
    geopotential altitude at sea level), where a pure relative error is
    meaningless.
    """
    return abs(mpf(value) - ref) / max(abs(ref), mpf(floor))


# ---------------------------------------------------------------------------
# Mode 1: compare the aerostrata CLI with mpmath
# ---------------------------------------------------------------------------
# CLI column -> floor for the relative error (see rel_err).
COMPARED = [
    ("geopotential_altitude_m", 1),
    ("temperature_K", 0),
    ("pressure_Pa", 0),
    ("density_kg_m3", 0),
    ("speed_of_sound_m_s", 0),
    ("dynamic_viscosity_Pa_s", 0),
    ("gravity_m_s2", 0),
    ("molecular_temperature_K", 0),
    ("kinematic_viscosity_m2_s", 0),
    ("thermal_conductivity_W_m_K", 0),
    ("number_density_m3", 0),
    ("mean_free_path_m", 0),
    ("pressure_scale_height_m", 0),
    ("mean_molar_mass_kg_kmol", 0),
]
# Below 80 km everything is closed-form, so only f64 rounding remains.  From
# 80 km up the molecular-weight interpolation is done in f64 on six-digit
# table values, and the looser bound leaves room for a differently arranged
# (but equivalent) interpolation formula.
BANDS = [
    ("Z < 80 km", lambda z: z < 80000, mpf("1e-12")),
    ("80-86 km", lambda z: z >= 80000, mpf("1e-9")),
]
SEED = 1976
N_RANDOM = 200


def comparison_altitudes():
    """Fixed altitudes that matter, then seeded uniform random ones.

    The fixed set puts every layer base and the M/M0 table ends in the run;
    repr() of a float round-trips, so the CLI reads exactly the double that
    the reference evaluates.
    """
    fixed = [float(z) for z in layer_base_altitudes()]
    fixed += [-5000.0, 80000.0, 86000.0]
    rng = random.Random(SEED)
    rand = [rng.uniform(-5000.0, 86000.0) for _ in range(N_RANDOM)]
    return fixed + rand


def compare_cli(binary):
    tally = Tally()
    altitudes = comparison_altitudes()
    rows = cli_rows(binary, ["eval"], altitudes, tally)
    if rows is None:
        return tally.close()
    if len(rows) != len(altitudes):
        print("CLI returned %d rows for %d altitudes" % (len(rows), len(altitudes)))
        tally.record(False)
        return tally.close()
    missing = [c for c, _ in COMPARED + [("geometric_altitude_m", 0)]
               if c not in rows[0]]
    if missing:
        print("CLI output lacks columns: %s" % ", ".join(missing))
        tally.record(False)
        return tally.close()

    # worst[(band, column)] = (error, altitude, count, failures)
    worst = {}
    for z, row in zip(altitudes, rows):
        if float(row["geometric_altitude_m"]) != z:
            print("row order mismatch: sent %r, got %s" % (z, row["geometric_altitude_m"]))
            tally.record(False)
            continue
        ref = state(z)
        band, _, limit = next(b for b in BANDS if b[1](z))
        for col, floor in COMPARED:
            try:
                err = rel_err(row[col], ref[col], floor)
            except (ValueError, TypeError):
                err = mp.inf  # unparsable or empty cell counts as a failure
            ok = err <= limit
            tally.record(ok)
            w = worst.setdefault((band, col), [mpf(-1), None, 0, 0])
            w[2] += 1
            w[3] += 0 if ok else 1
            if err > w[0]:
                w[0], w[1] = err, z

    for band, _, limit in BANDS:
        for col, _ in COMPARED:
            if (band, col) not in worst:
                continue
            err, z, count, fails = worst[(band, col)]
            print("%-26s %-9s %4d checks  worst rel err %.3e at Z = %.3f m"
                  "  (limit %s)  %s"
                  % (col, band, count, float(err), z, mp.nstr(limit, 1),
                     "ok" if fails == 0 else "%d FAILED" % fails))
    return tally.close()


# ---------------------------------------------------------------------------
# Mode 2: check the reference against printed values of the standard
# ---------------------------------------------------------------------------
# From memory of the printed table (the standard's layer-base values and
# sea-level table entries).  Each is compared to half a unit of its
# last written digit.
def _t_m_top():
    return _layer_tp(H_TOP, *LAYERS[-1])[0]


PRINTED_FACTS = [
    # (description, function giving the mpmath value, printed string)
    ("P_b at H = 11 km' (Pa)", lambda: LAYERS[1][3], "22632.06"),
    ("P_b at H = 20 km' (Pa)", lambda: LAYERS[2][3], "5474.889"),
    ("P_b at H = 32 km' (Pa)", lambda: LAYERS[3][3], "868.0187"),
    ("P_b at H = 47 km' (Pa)", lambda: LAYERS[4][3], "110.9063"),
    ("P_b at H = 51 km' (Pa)", lambda: LAYERS[5][3], "66.93887"),
    ("P_b at H = 71 km' (Pa)", lambda: LAYERS[6][3], "3.956420"),
    ("T_M,b at H = 71 km' (K)", lambda: LAYERS[6][2], "214.65"),
    # The standard's 186.8673 K is T_M at exactly 84.852 km' times M/M0 at
    # 86 km.  86 km geometric is 84852.05 m', so the defining formulas give
    # 186.86720 K there; the 3-decimal Table I entry agrees with both.
    ("T_M at H = 84.852 km' (K)", lambda: _t_m_top(), "186.946"),
    ("T_M(84.852 km') * M/M0 (K)", lambda: _t_m_top() * M_RATIO[-1][1], "186.8673"),
    ("T at Z = 86 km (K)", lambda: state(86000)["temperature_K"], "186.867"),
    ("p at Z = 86 km (Pa)", lambda: state(86000)["pressure_Pa"], "0.3734"),
    ("rho at sea level (kg/m^3)", lambda: state(0)["density_kg_m3"], "1.225"),
    ("a at sea level (m/s)", lambda: state(0)["speed_of_sound_m_s"], "340.29"),
    ("mu at sea level (Pa s)", lambda: state(0)["dynamic_viscosity_Pa_s"], "1.7894E-05"),
    ("n at sea level (1/m^3)", lambda: state(0)["number_density_m3"], "2.5470E+25"),
    ("H_P at sea level (m)", lambda: state(0)["pressure_scale_height_m"], "8434.5"),
]


def self_test():
    tally = Tally()
    print("reference vs printed values (from memory of the printed table):")
    for desc, fn, printed in PRINTED_FACTS:
        value = fn()
        tol = half_unit_of_last_digit(printed, mpf)
        diff = abs(value - mpf(printed))
        ok = diff <= tol
        tally.record(ok)
        print("  %-28s printed %-12s mpmath %-22s %s"
              % (desc, printed, mp.nstr(value, 15), "ok" if ok else "MISMATCH"))
    # A wrong constant shows up in the printed values above; what they cannot
    # see is a layer chosen wrongly at a base.  So also check that T and p are
    # continuous across every base and that the altitude conversions invert.
    worst = mpf(0)
    for layer in LAYERS[1:]:
        z_b = geometric(layer[0])
        below, above = state(z_b - mpf("1e-18")), state(z_b + mpf("1e-18"))
        for col in ("temperature_K", "pressure_Pa"):
            worst = max(worst, abs(below[col] / above[col] - 1))
        worst = max(worst, abs(geopotential(z_b) - layer[0]) / layer[0])
    ok = worst < mpf("1e-18")
    tally.record(ok)
    print("  continuity at layer bases: worst relative jump %s  %s"
          % (mp.nstr(worst, 3), "ok" if ok else "MISMATCH"))
    return tally.close()


# ---------------------------------------------------------------------------
# Mode 3: check a vector file against mpmath
# ---------------------------------------------------------------------------
def check_vectors(path):
    def miss(z, col, text, ref, ratio):
        return ("  Z = %-7s %-28s file %-12s mpmath %-16s off by %.2f x tolerance"
                % (z, col, text, mp.nstr(ref, 10), float(ratio)))
    return check_us1976_vectors(path, lambda altitudes: map(state, altitudes), mpf, miss)


def main(argv):
    return run_mode(argv, __doc__, compare_cli,
                    ("--self-test", "check the reference against printed values", self_test),
                    check_vectors, "reference")


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
