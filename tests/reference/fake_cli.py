#!/usr/bin/env python3
"""Stand-in for `aerostrata eval FILE`, used only to test usa76_mpmath.py itself.

    fake_cli.py eval FILE

Environment:
  FAKE_CLI_MODE=mpmath   (default) the mpmath reference rounded to doubles:
                         the comparison must then report errors near 1e-16
  FAKE_CLI_MODE=f64      the same formulas in plain Python floats, to see what
                         a straightforward double-precision code achieves
  FAKE_CLI_PERTURB=COLUMN:REL[:ZMIN]
                         multiply COLUMN by (1 + REL) at altitudes >= ZMIN, so
                         that the failure path of the comparison is exercised
"""

import math
import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import usa76_mpmath as ref  # noqa: E402
from vector_tools import perturbation  # noqa: E402

COLUMNS = [
    "geometric_altitude_m", "geopotential_altitude_m", "temperature_K",
    "pressure_Pa", "density_kg_m3", "speed_of_sound_m_s",
    "dynamic_viscosity_Pa_s", "gravity_m_s2",
    # Present so that the comparison is seen to ignore columns it does not use.
    "unused_column",
]


def _f64_tables():
    g0, r0, rs, m0 = 9.80665, 6356766.0, 8314.32, 28.9644
    gmr = g0 * m0 / rs
    defs = [(0.0, -6.5e-3), (11000.0, 0.0), (20000.0, 1.0e-3), (32000.0, 2.8e-3),
            (47000.0, 0.0), (51000.0, -2.8e-3), (71000.0, -2.0e-3)]
    layers, t_b, p_b = [], 288.15, 101325.0
    for i, (h_b, lapse) in enumerate(defs):
        layers.append((h_b, lapse, t_b, p_b))
        h_n = defs[i + 1][0] if i + 1 < len(defs) else 84852.0
        t_b, p_b = _f64_tp(h_n, h_b, lapse, t_b, p_b, gmr)
    ratio = [(float(z), float(r)) for z, r in ref.M_RATIO]
    return g0, r0, rs, m0, gmr, layers, ratio


def _f64_tp(h, h_b, lapse, t_b, p_b, gmr):
    if lapse == 0.0:
        return t_b, p_b * math.exp(-gmr * (h - h_b) / t_b)
    t = t_b + lapse * (h - h_b)
    return t, p_b * math.pow(t_b / t, gmr / lapse)


def f64_state(z):
    g0, r0, rs, m0, gmr, layers, ratio = _f64_tables()
    h = r0 * z / (r0 + z)
    layer = layers[0]
    for cand in layers:
        if h >= cand[0]:
            layer = cand
    t_m, p = _f64_tp(h, *layer, gmr)
    r = 1.0
    if z > ratio[0][0]:
        for (z1, r1), (z2, r2) in zip(ratio, ratio[1:]):
            if z <= z2:
                r = r1 + (r2 - r1) * (z - z1) / (z2 - z1)
                break
    t = t_m * r
    q = r0 / (r0 + z)
    return {
        "geometric_altitude_m": z, "geopotential_altitude_m": h,
        "temperature_K": t, "pressure_Pa": p,
        "density_kg_m3": p * m0 / (rs * t_m),
        "speed_of_sound_m_s": math.sqrt(1.4 * rs * t_m / m0),
        "dynamic_viscosity_Pa_s": 1.458e-6 * t * math.sqrt(t) / (t + 110.4),
        "gravity_m_s2": g0 * q * q,
    }


def main(argv):
    if len(argv) != 2 or argv[0] != "eval":
        sys.stderr.write("usage: fake_cli.py eval FILE\n")
        return 2
    mode = os.environ.get("FAKE_CLI_MODE", "mpmath")
    perturb = perturbation()
    print(",".join(COLUMNS))
    with open(argv[1]) as f:
        for line in f:
            if not line.strip():
                continue
            z = float(line)
            if mode == "f64":
                values = f64_state(z)
            else:
                values = {k: float(v) for k, v in ref.state(z).items()}
            values["unused_column"] = -1.0
            perturb(values, z)
            print(",".join(repr(float(values[c])) for c in COLUMNS))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
