#!/usr/bin/env python3
"""Independent check of aerostrata's U.S. Standard Atmosphere, 1976 above 86 km.

The reference below is written directly from the equations the crate adopts
above 86 km (the project's implementation spec, as revised so that D_i of O and
O2 uses N = n(N2) and D_i of Ar and He uses N = n(N2)+n(O)+n(O2); itself a
reading of NOAA-S/T 76-1562, October 1976): a closed-form kinetic temperature
and the diffusion equations for ln n of N2, O, O2, Ar and He, integrated upward
from their 86 km values with scipy.integrate.solve_ivp, plus atomic hydrogen
integrated from its 500 km value down to 150 km and up to 1000 km.  Below 150 km
the standard lists no hydrogen; the crate carries the continuation of hydrogen's
equation down to 86 km, and so does this reference, written here from the
equation (flux form, with the standard's eddy diffusion and background weight
below 120 km) over a dense-output solution of the other five species, not taken
from the crate.  The ellipse's constants (91-110 km) are derived here from its
joins, unrounded, as the crate does: the printed ones end 2.7e-4 K short of
240 K.  The integration is restarted at every altitude where a coefficient
changes form (91, 95, 97, 100, 110, 115, 120, 150 and 500 km) and at every
altitude asked for, so no output is interpolated.

Modes:
  usa76_upper_scipy.py [BIN]        run `BIN eval --species FILE` at fixed
                                    altitudes from 86.5 to 1000 km and compare
                                    its CSV with the integration
                                    (BIN defaults to target/debug/aerostrata)
  usa76_upper_scipy.py --self-check integrate twice, with different methods,
                                    tolerances and step limits, and show the
                                    solution has converged to 1e-10; also
                                    show the jump at 86 km between the lower
                                    layers and the species
  usa76_upper_scipy.py --check-vectors CSV
                                    check a tests/vectors file against the
                                    integration (rows at or below 86 km
                                    against usa76_mpmath.py), using that
                                    file's own tolerance lines
  usa76_upper_scipy.py --draft      compare the memory draft
                                    (usa76_upper_memory_draft.csv) with the
                                    integration, cell by cell, under the
                                    vector files' rules

Every mode ends with a line "N passed, N failed" and exits 1 on any failure.
Needs numpy and scipy (python3 -m pip install scipy numpy).
"""

import csv
import math
import os
import sys

import numpy as np
from scipy.integrate import solve_ivp

from vector_tools import Tally, check_us1976_vectors, cli_rows, half_unit_of_last_digit, run_mode

HERE = os.path.dirname(os.path.abspath(__file__))

# ---------------------------------------------------------------------------
# Constants (spec: same as the lower part)
# ---------------------------------------------------------------------------
G0 = 9.80665             # m/s^2
R0 = 6356766.0           # m
R_STAR = 8314.32         # J/(kmol K)
N_A = 6.022169e26        # 1/kmol
K_B = 1.380622e-23       # J/K
M0 = 28.9644             # kg/kmol

# Species, in the order used throughout: the five integrated from 86 km, then H.
SPECIES = ["N2", "O", "O2", "Ar", "He", "H"]
MASS = {"N2": 28.0134, "O": 15.9994, "O2": 31.9988, "Ar": 39.948,
        "He": 4.0026, "H": 1.00797}
N86 = {"N2": 1.129794e20, "O": 8.6e16, "O2": 3.030898e19, "Ar": 1.351400e18,
       "He": 7.5817e14}
# Molecular diffusion D_i = a_i / N_i (T/273.15)^b_i, a_i in 1/(m s).
DIFF = {"O": (6.986e20, 0.750), "O2": (4.863e20, 0.750), "Ar": (4.487e20, 0.870),
        "He": (1.700e21, 0.691), "H": (3.305e21, 0.500)}
# N_i in D_i (spec as revised: the standard solves the species in sequence), as
# indices into (N2, O, O2, Ar, He): O and O2 see N2 only, Ar and He see N2+O+O2,
# H sees all five.
N_FOR_D = {"O": (0,), "O2": (0,), "Ar": (0, 1, 2), "He": (0, 1, 2), "H": (0, 1, 2, 3, 4)}
ALPHA = {"N2": 0.0, "O": 0.0, "O2": 0.0, "Ar": 0.0, "He": -0.40, "H": -0.25}
# Vertical-flow term, Z in km, result in 1/km: (Q, U, W) and the optional (q, u, w).
FLOW = {
    "O": ((-5.809644e-4, 56.90311, 2.706240e-5), (-3.416248e-3, 97.0, 5.008765e-4)),
    "O2": ((1.366212e-4, 86.0, 8.333333e-5), None),
    "Ar": ((9.434079e-5, 86.0, 8.333333e-5), None),
    "He": ((-2.457369e-4, 86.0, 6.666667e-4), None),
}
PHI_H = 7.2e11           # 1/(m^2 s), hydrogen flux
N_H_500 = 8.0e10         # 1/m^3 at 500 km

Z_BOT = 86000.0
Z_TOP = 1000000.0
Z_H_BOT = 150000.0
Z_H_REF = 500000.0
# Altitudes (m) where some coefficient changes form; every integration restarts there.
BREAKS = [91000.0, 95000.0, 97000.0, 100000.0, 110000.0, 115000.0, 120000.0,
          150000.0, 500000.0]

# The lower part's values at 86 km (computed by the crate's layer model; see
# usa76_mpmath.py), used to show the jump at 86 km.
LOWER_86 = {"pressure_Pa": 0.37338046, "density_kg_m3": 6.9578238e-6}


# ---------------------------------------------------------------------------
# Temperature, gravity, eddy diffusion
# ---------------------------------------------------------------------------
def _ellipse():
    """Tc (K), A (K) and a (km) of the 91-110 km ellipse T = Tc + A sqrt(1 - ((Z-91)/a)^2).

    From its joins: T = T7 with zero slope at 91 km (the ellipse's vertex, so
    Tc = T7 - A) and T = 240 K with 12 K/km at 110 km.  At 110 km, with x = 19 km / a
    and s = sqrt(1 - x^2): 240 - T7 = -A (1 - s), and the slope -A x / (a s) =
    -A (1 - s^2) / (19 km s) = 12 K/km.  Dividing the second by the first gives s,
    then A and a.  They round to the standard's printed 263.1905, -76.3232, -19.9429.
    """
    t7, t9, slope, span = 186.8673, 240.0, 12.0, 19.0
    rise = t9 - t7
    # slope span s = rise (1 + s)
    s = rise / (slope * span - rise)
    a_t = -rise / (1.0 - s)
    a_z = -span / math.sqrt(1.0 - s * s)
    return t7 - a_t, a_t, a_z


ELLIPSE_TC, ELLIPSE_A, ELLIPSE_AZ = _ellipse()


def temperature(z):
    """Kinetic temperature T (K) and dT/dZ (K/m) at geometric altitude z (m)."""
    zk = z / 1000.0
    if zk <= 91.0:
        return 186.8673, 0.0
    if zk <= 110.0:
        tc, a_t, a_z = ELLIPSE_TC, ELLIPSE_A, ELLIPSE_AZ
        x = (zk - 91.0) / a_z
        s = math.sqrt(1.0 - x * x)
        return tc + a_t * s, -(a_t / a_z) * x / s / 1000.0
    if zk <= 120.0:
        return 240.0 + 12.0 * (zk - 110.0), 12.0 / 1000.0
    t_inf, t10, lam = 1000.0, 360.0, 0.01875
    r0k = R0 / 1000.0
    xi = (zk - 120.0) * (r0k + 120.0) / (r0k + zk)
    e = math.exp(-lam * xi)
    dtdz = lam * (t_inf - t10) * ((r0k + 120.0) / (r0k + zk)) ** 2 * e
    return t_inf - (t_inf - t10) * e, dtdz / 1000.0


def gravity(z):
    q = R0 / (R0 + z)
    return G0 * q * q


def eddy(z):
    """Eddy diffusion coefficient K (m^2/s)."""
    zk = z / 1000.0
    if zk < 95.0:
        return 120.0
    if zk < 115.0:
        d = 400.0 - (zk - 95.0) ** 2
        return 120.0 * math.exp(1.0 - 400.0 / d) if d > 0.0 else 0.0
    return 0.0


def background_mass(z):
    return M0 if z <= 100000.0 else MASS["N2"]


def flow(name, z):
    """The vertical-flow term of species `name`, in 1/m."""
    zk = z / 1000.0
    terms = FLOW.get(name)
    if terms is None:
        return 0.0
    (big_q, big_u, big_w), small = terms
    f = big_q * (zk - big_u) ** 2 * math.exp(-big_w * (zk - big_u) ** 3)
    if small is not None and zk < small[1]:
        q, u, w = small
        f += q * (u - zk) ** 2 * math.exp(-w * (u - zk) ** 3)
    return f / 1000.0


# ---------------------------------------------------------------------------
# The ODE system.  State: y_i = ln(n_i / n_i,ref) for the five heavy species
# (ref: the 86 km value) and, where present, y_H = ln(n_H / 8e10).
# ---------------------------------------------------------------------------
HEAVY = SPECIES[:5]
LOG_REF = np.array([math.log(N86[s]) for s in HEAVY])


def rhs(z, y):
    t, dtdz = temperature(z)
    g = gravity(z)
    k_eddy = eddy(z)
    mb = background_mass(z)
    n = np.exp(y[:5] + LOG_REF)
    gr = g / (R_STAR * t)
    out = np.empty_like(y)
    out[0] = -(dtdz / t + mb * gr)
    for i, name in enumerate(HEAVY[1:], start=1):
        a, b = DIFF[name]
        d = a / sum(float(n[j]) for j in N_FOR_D[name]) * (t / 273.15) ** b
        f = d / (d + k_eddy)                 # 1 where K = 0
        out[i] = -(dtdz / t + gr * (f * MASS[name] + (1.0 - f) * mb)
                   + f * ALPHA[name] * dtdz / t + flow(name, z))
    if len(y) > 5:
        out[5] = hydrogen_slope(z, n, y[5])
    return out


def hydrogen_slope(z, n, y_h):
    """d y_H / dZ (1/m), y_H = ln(n_H / 8e10), over the heavy densities n (N2..He).

    The flux form of the diffusion equation, with the escape flux phi:
      n_H v = phi = -D (dn/dZ + n (1+alpha) T'/T + n g M_H/(R T))
                    - K (dn/dZ + n T'/T + n g M/(R T)),
    solved for dn/dZ and divided by n.  Above 115 km K = 0 and it is the standard's
    hydrogen equation; below 150 km (no hydrogen in the standard) it is its
    continuation, with the standard's K and background weight M as for the others.
    """
    t, dtdz = temperature(z)
    gr = gravity(z) / (R_STAR * t)
    k_eddy = eddy(z)
    a, b = DIFF["H"]
    d_h = a / sum(float(n[j]) for j in N_FOR_D["H"]) * (t / 273.15) ** b
    n_h = N_H_500 * math.exp(y_h)
    thermal = (d_h * (1.0 + ALPHA["H"]) + k_eddy) * dtdz / t
    weight = (d_h * MASS["H"] + k_eddy * background_mass(z)) * gr
    return -(thermal + weight + PHI_H / n_h) / (d_h + k_eddy)


DEFAULT_OPTS = {"method": "DOP853", "rtol": 1e-12, "atol": 1e-14, "max_step": 250.0}
SECOND_OPTS = {"method": "Radau", "rtol": 1e-13, "atol": 1e-15, "max_step": 100.0}


def _march(y0, stops, opts, fun=rhs, dense=None):
    """Integrate from stops[0] through every stop; return the state at each.

    With a list `dense`, each piece's continuous solution is appended to it as
    (low, high, sol).
    """
    out = [np.array(y0, dtype=float)]
    y = out[0]
    for a, b in zip(stops, stops[1:]):
        if a == b:
            out.append(y.copy())
            continue
        sol = solve_ivp(fun, (a, b), y, method=opts["method"], rtol=opts["rtol"],
                        atol=opts["atol"], max_step=opts["max_step"],
                        dense_output=dense is not None)
        if not sol.success:
            raise RuntimeError("integration %g -> %g m failed: %s" % (a, b, sol.message))
        y = sol.y[:, -1]
        out.append(y.copy())
        if dense is not None:
            dense.append((min(a, b), max(a, b), sol.sol))
    return out


def _hydrogen_below_150_km(y_h_150, altitudes, opts):
    """y_H at each altitude below 150 km: hydrogen's equation continued downward.

    The heavy species come from their own upward integration (86 -> 150 km, dense
    output, restarted at the same breaks), so they are not integrated downward.
    """
    stops = sorted(set([Z_BOT, Z_H_BOT] + [b for b in BREAKS if b < Z_H_BOT]))
    pieces = []
    _march(np.zeros(5), stops, opts, dense=pieces)

    def heavy_at(z):
        for low, high, sol in pieces:
            if low <= z <= high:
                return np.exp(sol(z) + LOG_REF)
        raise ValueError("altitude %r m outside 86 to 150 km" % z)

    down = sorted(set([Z_BOT, Z_H_BOT] + [b for b in BREAKS if b < Z_H_BOT]
                      + [z for z in altitudes if z < Z_H_BOT]), reverse=True)
    def fun(z, y):
        return np.array([hydrogen_slope(z, heavy_at(z), y[0])])
    return {z: s[0] for z, s in zip(down, _march([y_h_150], down, opts, fun=fun))}


def solve(altitudes, opts=None):
    """State at each altitude (m, 86 km <= z <= 1000 km) as a list of dicts.

    Keys are the CLI's column names.  Each altitude is hit exactly by the
    integrator (it is added to the restart points), never interpolated.
    """
    opts = dict(DEFAULT_OPTS, **(opts or {}))
    alts = [float(z) for z in altitudes]
    for z in alts:
        if not Z_BOT <= z <= Z_TOP:
            raise ValueError("altitude %r m outside [86000, 1000000]" % z)
    # 1. the heavy species, 86 -> 500 km
    up = sorted(set([Z_BOT, Z_H_REF] + [b for b in BREAKS if b <= Z_H_REF]
                    + [z for z in alts if z <= Z_H_REF]))
    heavy = dict(zip(up, _march(np.zeros(5), up, opts)))
    # 2. all six from 500 km down to 150 km (the heavy species only to feed D_H)
    down = sorted(set([Z_H_BOT, Z_H_REF] + [b for b in BREAKS if Z_H_BOT <= b <= Z_H_REF]
                      + [z for z in alts if Z_H_BOT <= z <= Z_H_REF]), reverse=True)
    start = np.append(heavy[Z_H_REF], 0.0)
    hyd = {z: s[5] for z, s in zip(down, _march(start, down, opts))}
    # 2b. hydrogen alone from 150 km down to 86 km (its continuation)
    hyd.update(_hydrogen_below_150_km(hyd[Z_H_BOT], alts, opts))
    # 3. all six from 500 km up to 1000 km
    top = sorted(set([Z_H_REF, Z_TOP] + [z for z in alts if z >= Z_H_REF]))
    upper = dict(zip(top, _march(start, top, opts)))

    states = []
    for z in alts:
        if z > Z_H_REF:
            y = upper[z]
            heavy_y, y_h = y[:5], y[5]
        else:
            heavy_y, y_h = heavy[z], hyd[z]
        n = {name: math.exp(v + r) for name, v, r in zip(HEAVY, heavy_y, LOG_REF)}
        n["H"] = N_H_500 * math.exp(y_h)
        states.append(derived(z, n))
    return states


def derived(z, n):
    t, _ = temperature(z)
    total = sum(n[s] for s in SPECIES)
    rho = sum(n[s] * MASS[s] for s in SPECIES) / N_A
    row = {
        "geometric_altitude_m": z,
        "temperature_K": t,
        "pressure_Pa": total * K_B * t,
        "density_kg_m3": rho,
        "mean_molar_mass_kg_kmol": rho * N_A / total,
        "number_density_m3": total,
    }
    for s in SPECIES:
        row["n_%s_m3" % s] = n[s]
    return row


SPECIES_COLS = ["n_%s_m3" % s for s in SPECIES]
BULK_COLS = ["number_density_m3", "pressure_Pa", "density_kg_m3",
             "mean_molar_mass_kg_kmol"]


# ---------------------------------------------------------------------------
# Small shared helpers
# ---------------------------------------------------------------------------
def rel(value, ref):
    return abs(value - ref) / abs(ref)


# ---------------------------------------------------------------------------
# Mode 1: compare the CLI with the integration
# ---------------------------------------------------------------------------
CLI_ALTITUDES = [86500.0, 90000.0, 93500.0, 96000.0, 99000.0, 105000.0, 112500.0,
                 118000.0, 135000.0, 150000.0, 175000.0, 300000.0, 480000.0,
                 500000.0, 650000.0, 1000000.0]
T_LIMIT = 1e-12
N_LIMIT = 1e-6


def _cell(row, col):
    text = (row.get(col) or "").strip()
    return float(text) if text else None


def compare_cli(binary):
    tally = Tally()
    rows = cli_rows(binary, ["eval", "--species"], CLI_ALTITUDES, tally)
    if rows is None:
        return tally.close()
    needed = ["geometric_altitude_m", "temperature_K"] + SPECIES_COLS + BULK_COLS
    missing = [c for c in needed if rows and c not in rows[0]]
    if len(rows) != len(CLI_ALTITUDES) or missing:
        print("CLI returned %d rows for %d altitudes%s"
              % (len(rows), len(CLI_ALTITUDES),
                 "; lacks columns: " + ", ".join(missing) if missing else ""))
        tally.record(False)
        return tally.close()
    refs = solve(CLI_ALTITUDES)
    print("CLI %s vs scipy (%s, rtol %g): limits T %g, species/N/p/rho/M %g"
          % (binary, DEFAULT_OPTS["method"], DEFAULT_OPTS["rtol"], T_LIMIT, N_LIMIT))
    for z, row, ref in zip(CLI_ALTITUDES, rows, refs):
        try:
            z_cli = float(row["geometric_altitude_m"])
        except ValueError:
            z_cli = None
        if z_cli != z:
            print("Z = %9.1f m  row order mismatch: got %r" % (z, row["geometric_altitude_m"]))
            tally.record(False)
            continue
        groups = [("T", ["temperature_K"], T_LIMIT),
                  ("species", SPECIES_COLS, N_LIMIT),
                  ("N p rho M", BULK_COLS, N_LIMIT)]
        for label, cols, limit in groups:
            worst, worst_col, bad = 0.0, cols[0], []
            for col in cols:
                value = _cell(row, col)
                if value is None:
                    ok, err = False, math.inf    # an empty cell where a value is due
                else:
                    err = rel(value, ref[col])
                    ok = err <= limit
                tally.record(ok)
                if not ok:
                    bad.append("%s cli %s ref %.10e" % (col, row.get(col), ref[col]))
                if err > worst:
                    worst, worst_col = err, col
            print("Z = %9.1f m  %-9s worst rel err %.2e (%s)  %s"
                  % (z, label, worst, worst_col,
                     "ok" if not bad else "FAILED: " + "; ".join(bad)))
    return tally.close()


# ---------------------------------------------------------------------------
# Mode 2: self-check
# ---------------------------------------------------------------------------
SELF_ALTITUDES = [86000.0, 88000.0, 91000.0, 93000.0, 95000.0, 97000.0, 100000.0,
                  105000.0, 110000.0, 115000.0, 120000.0, 130000.0, 150000.0,
                  200000.0, 300000.0, 400000.0, 500000.0, 600000.0, 800000.0,
                  1000000.0]
CONVERGED = 1e-10


def self_check():
    tally = Tally()
    first = solve(SELF_ALTITUDES, DEFAULT_OPTS)
    second = solve(SELF_ALTITUDES, SECOND_OPTS)
    print("convergence: %s rtol %g atol %g max_step %g m  vs  %s rtol %g atol %g max_step %g m"
          % (DEFAULT_OPTS["method"], DEFAULT_OPTS["rtol"], DEFAULT_OPTS["atol"],
             DEFAULT_OPTS["max_step"], SECOND_OPTS["method"], SECOND_OPTS["rtol"],
             SECOND_OPTS["atol"], SECOND_OPTS["max_step"]))
    for a, b in zip(first, second):
        worst, worst_col = 0.0, ""
        for col in SPECIES_COLS + BULK_COLS:
            if a[col] == 0.0 and b[col] == 0.0:
                continue
            err = rel(a[col], b[col])
            if err > worst:
                worst, worst_col = err, col
        ok = worst <= CONVERGED
        tally.record(ok)
        print("  Z = %8.0f m  max rel difference %.2e (%s)  %s"
              % (a["geometric_altitude_m"], worst, worst_col, "ok" if ok else "NOT CONVERGED"))

    # The hydrogen boundary value must be reproduced exactly at 500 km.
    h500 = first[SELF_ALTITUDES.index(Z_H_REF)]["n_H_m3"]
    ok = h500 == N_H_500
    tally.record(ok)
    print("  n_H(500 km) = %.10e  %s" % (h500, "ok" if ok else "MISMATCH"))

    # The jump at 86 km between the lower layers and the species.
    s86 = first[0]
    n_h = s86["n_H_m3"]
    five = {"pressure_Pa": s86["pressure_Pa"] - n_h * K_B * s86["temperature_K"],
            "density_kg_m3": s86["density_kg_m3"] - n_h * MASS["H"] / N_A}
    print("86 km: upper part (sum of species, N k T with T = 186.8673 K) vs lower part (layers):")
    for col, unit in (("pressure_Pa", "Pa"), ("density_kg_m3", "kg/m^3")):
        print("  %-14s species %.8e  lower %.8e %s  relative jump %+.3e"
              " (the standard's five species alone %+.3e)"
              % (col, s86[col], LOWER_86[col], unit, s86[col] / LOWER_86[col] - 1.0,
                 five[col] / LOWER_86[col] - 1.0))
    print("  number density %.8e 1/m^3, M = %.6f kg/kmol (species); hydrogen's continuation"
          " %.4e 1/m^3, %.4e of N"
          % (s86["number_density_m3"], s86["mean_molar_mass_kg_kmol"], n_h,
             n_h / s86["number_density_m3"]))
    return tally.close()


# ---------------------------------------------------------------------------
# Mode 3: check a vector file
# ---------------------------------------------------------------------------
def _lower_state(z):
    """The crate's value at or below 86 km comes from the layers (usa76_mpmath.py)."""
    sys.path.insert(0, HERE)
    import usa76_mpmath as lower  # noqa: E402  (needs mpmath)
    return {k: float(v) for k, v in lower.state(z).items()}


def reference_rows(altitudes):
    upper = [z for z in altitudes if z > Z_BOT]
    solved = dict(zip(upper, solve(upper))) if upper else {}
    return [solved[z] if z > Z_BOT else _lower_state(z) for z in altitudes]


def check_vectors(path):
    def miss(z, col, text, ref, ratio):
        return ("  Z = %-8s %-24s file %-11s computed %-17.10e off by %.2f x tolerance"
                % (z, col, text, ref, ratio))
    return check_us1976_vectors(
        path, lambda altitudes: reference_rows([float(z) for z in altitudes]), float, miss)


# ---------------------------------------------------------------------------
# Mode 4: the memory draft, cell by cell
# ---------------------------------------------------------------------------
def read_draft(path):
    """The draft holds two header+rows blocks; return a list of (z, col, text, conf)."""
    cells, header = [], None
    with open(path, newline="") as f:
        for line in f:
            if line.startswith("#") or not line.strip():
                continue
            parts = next(csv.reader([line]))
            if parts[0] == "geometric_altitude_m":
                header = parts
                continue
            conf = parts[-1]
            for col, text in zip(header[1:-1], parts[1:-1]):
                if text.strip():
                    cells.append((float(parts[0]), col, text.strip(), conf))
    return cells


def draft(path):
    """Each remembered cell against the integration.

    Columns /printed and /rel give |memory - computed| in units of half the
    last printed digit and of the issue's figure (rel 5e-4 to 500 km, 2e-3
    above).  A cell passes under the rule the vector files use: printed for
    temperature, the issue's figure for everything else.
    """
    tally = Tally()
    cells = read_draft(path)
    alts = sorted(set(z for z, _, _, _ in cells))
    refs = dict(zip(alts, reference_rows(alts)))
    print("%-8s %-24s %-12s %-17s %-9s %-8s %-8s %s"
          % ("Z km", "column", "memory", "computed", "rel diff", "/printed", "/rel", "conf"))
    for z, col, text, conf in cells:
        ref = refs[z].get(col)
        if ref is None:
            continue
        diff = abs(float(text) - ref)
        issue_rel = 5e-4 if z <= Z_H_REF else 2e-3
        r_printed = diff / half_unit_of_last_digit(text)
        r_rel = diff / (issue_rel * abs(ref)) if ref else math.inf
        # The rule the vector files use: printed for T, the issue's rel for the rest.
        ok = (r_printed if col == "temperature_K" else r_rel) <= 1.0
        tally.record(ok)
        print("%-8g %-24s %-12s %-17.10e %-9.2e %-8.2f %-8.2f %s%s"
              % (z / 1000, col, text, ref, diff / abs(ref) if ref else math.inf,
                 r_printed, r_rel, conf, "" if ok else "  <-- DISAGREES"))
    return tally.close()


def main(argv):
    draft_mode = ("--draft", {"nargs": "?", "metavar": "CSV",
                              "const": os.path.join(HERE, "usa76_upper_memory_draft.csv"),
                              "help": "compare the memory draft with the integration"}, draft)
    return run_mode(argv, __doc__, compare_cli,
                    ("--self-check", "show the integration converged; show the 86 km jump",
                     self_check),
                    check_vectors, "integration", [draft_mode])


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
