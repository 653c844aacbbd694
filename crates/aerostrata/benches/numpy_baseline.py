"""What a user would write instead of the batch path: the 1976 standard's temperature,
pressure, density, speed of sound and dynamic viscosity of many altitudes at once, as a
hand-written vectorized numpy evaluation (no validation of the input, no M/M0 table
between 80 and 86 km). The baseline `cargo xtask batch-bench` times against the core's
batch (crates/aerostrata/benches/batch.rs).

The constants and layers are the standard's (U.S. Standard Atmosphere 1976, Part 1:
Table 4's layers, the sea-level values, Sutherland's constants; typed from memory of the
printed tables); the layers' base pressures are chained once, before timing, as a user
would.

    python3 numpy_baseline.py ALTITUDES.f64 RUNS     # time; one JSON line on stdout
    python3 numpy_baseline.py                         # a summary on its own altitudes

ALTITUDES.f64 holds little-endian f64 geometric altitudes in metres (what
`cargo bench -p aerostrata --bench batch -- write FILE` writes).
"""

import json
import sys
import time

import numpy as np

G0 = 9.80665  # m/s^2
M0 = 28.9644  # kg/kmol
R_STAR = 8314.32  # J/(kmol K)
R0 = 6356766.0  # m, effective Earth radius
GAMMA = 1.4
BETA = 1.458e-6  # Sutherland, kg/(m s K^1/2)
S = 110.4  # Sutherland's constant, K
GMR = G0 * M0 / R_STAR

BASES = np.array([0.0, 11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0])
LAPSES = np.array([-6.5e-3, 0.0, 1.0e-3, 2.8e-3, 0.0, -2.8e-3, -2.0e-3])


def chain():
    """Base temperatures and pressures of the layers, from sea level up."""
    temperatures, pressures = [288.15], [101325.0]
    for i in range(len(BASES) - 1):
        t, p, lapse = temperatures[-1], pressures[-1], LAPSES[i]
        dh = BASES[i + 1] - BASES[i]
        if lapse == 0.0:
            pressures.append(p * np.exp(-GMR * dh / t))
            temperatures.append(t)
        else:
            top = t + lapse * dh
            pressures.append(p * (t / top) ** (GMR / lapse))
            temperatures.append(top)
    return np.array(temperatures), np.array(pressures)


BASE_T, BASE_P = chain()
# Per layer: the exponent of the power law (zero where the layer is isothermal, unused).
SAFE_LAPSES = np.where(LAPSES == 0.0, 1.0, LAPSES)
EXPONENTS = GMR / SAFE_LAPSES


def evaluate(z):
    """T (K), p (Pa), rho (kg/m^3), a (m/s), mu (Pa s) at geometric altitudes z (m)."""
    h = R0 * z / (R0 + z)
    i = np.searchsorted(BASES, h, side="right") - 1
    np.clip(i, 0, len(BASES) - 1, out=i)
    tb, pb, lapse, dh = BASE_T[i], BASE_P[i], LAPSES[i], h - BASES[i]
    t = tb + lapse * dh
    isothermal = lapse == 0.0
    p = np.where(isothermal, pb * np.exp(-GMR * dh / tb), pb * (tb / t) ** EXPONENTS[i])
    rho = p * M0 / (R_STAR * t)
    a = np.sqrt(GAMMA * R_STAR * t / M0)
    mu = BETA * t * np.sqrt(t) / (t + S)
    return t, p, rho, a, mu


def time_runs(z, runs, warm_up_s=0.5):
    start = time.perf_counter()
    evaluate(z)
    first = (time.perf_counter() - start) * 1e3
    warm = time.perf_counter()
    while time.perf_counter() - warm < warm_up_s:
        evaluate(z)
    runs_ms = []
    for _ in range(runs):
        start = time.perf_counter()
        columns = evaluate(z)
        runs_ms.append((time.perf_counter() - start) * 1e3)
    sums = [float(np.sum(c)) for c in columns]
    return runs_ms, first, sums


def main(argv):
    if len(argv) == 3:
        z = np.fromfile(argv[1], dtype="<f8")
        runs_ms, first, sums = time_runs(z, max(1, int(argv[2])))
        print(json.dumps({"runs_ms": runs_ms, "first_ms": first, "sums": sums, "numpy": np.__version__}))
        return 0
    if len(argv) != 1:
        print(__doc__, file=sys.stderr)
        return 2
    z = np.random.default_rng(1976).uniform(0.0, 86000.0, 1_000_000)
    runs_ms, _, _ = time_runs(z, 5)
    print(f"numpy {np.__version__}: {min(runs_ms):.1f} ms for {z.size} altitudes, five quantities (fastest of 5)")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
