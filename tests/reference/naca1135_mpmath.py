#!/usr/bin/env python3
"""Independent high-precision check of the compressible-flow vectors.

The relations below are the perfect-gas formulas of NACA Report 1135 (Equations,
Tables and Charts for Compressible Flow, Ames Research Staff, 1953): isentropic
total-to-static ratios and area ratio, the normal-shock relations and the
Rayleigh pitot formula. They are written here from the formulas alone and
evaluated with mpmath at 30 significant digits, so that their own rounding is
far below the half-unit-of-the-last-digit tolerance of a printed table.

Modes:
  naca1135_mpmath.py --check-vectors CSV [CSV ...]
        check tests/vectors files (models `isentropic gamma=G` and
        `normal_shock gamma=G`) against mpmath, using each file's own
        tolerance lines; lists every cell outside its tolerance
  naca1135_mpmath.py --table isentropic|normal_shock [--gamma G] MACH ...
        print the computed values at the given Mach numbers
  naca1135_mpmath.py --self-test
        check the formulas against identities that must hold exactly

Every checking mode ends with a line "N passed, N failed" and exits 1 on any
failure. Standard library + mpmath only.
"""

import argparse
import csv
import sys

from mpmath import mp, mpf, sqrt

from vector_tools import half_unit_of_last_digit

mp.dps = 30


# ---------------------------------------------------------------------------
# The relations, gamma a parameter.
# ---------------------------------------------------------------------------
def isentropic(m, g):
    """Static-to-total ratios and A/A* at Mach m (any m >= 0; A/A* for m > 0)."""
    x = 1 + (g - 1) / 2 * m * m
    t = 1 / x
    p = x ** (-g / (g - 1))
    rho = x ** (-1 / (g - 1))
    out = {"p_p0": p, "rho_rho0": rho, "t_t0": t}
    # Impact over static pressure: isentropic below Mach 1, Rayleigh's pitot formula above.
    out["qc_p"] = 1 / p - 1 if m <= 1 else normal_shock(m, g)["p02_p1"] - 1
    if m > 0:
        out["a_astar"] = (1 / m) * ((2 / (g + 1)) * x) ** ((g + 1) / (2 * (g - 1)))
    return out


def normal_shock(m, g):
    """Downstream-to-upstream ratios across a normal shock at upstream Mach m >= 1."""
    m2sq = (1 + (g - 1) / 2 * m * m) / (g * m * m - (g - 1) / 2)
    p21 = 1 + 2 * g / (g + 1) * (m * m - 1)
    r21 = (g + 1) * m * m / ((g - 1) * m * m + 2)
    t21 = p21 / r21
    # Total-pressure ratio: p02/p01 = (p2/p1) (p02/p2) / (p01/p1).
    p02_p2 = (1 + (g - 1) / 2 * m2sq) ** (g / (g - 1))
    p01_p1 = (1 + (g - 1) / 2 * m * m) ** (g / (g - 1))
    p0201 = p21 * p02_p2 / p01_p1
    # Rayleigh pitot formula, written in its closed form (not through the ratios
    # above, so that the two routes check each other in --self-test).
    rayleigh = ((g + 1) ** 2 * m * m / (4 * g * m * m - 2 * (g - 1))) ** (g / (g - 1)) * (
        (1 - g + 2 * g * m * m) / (g + 1)
    )
    return {
        "m2": sqrt(m2sq),
        "p2_p1": p21,
        "rho2_rho1": r21,
        "t2_t1": t21,
        "p02_p01": p0201,
        "p02_p1": rayleigh,
        "p1_p02": 1 / rayleigh,
        "_p02_p1_by_ratios": p21 * p02_p2,
    }


MODELS = {"isentropic": isentropic, "normal_shock": normal_shock}


def parse_model(text):
    """`isentropic gamma=1.4` -> (function, gamma as an exact decimal)."""
    words = text.split()
    if not words or words[0] not in MODELS:
        raise ValueError(f"unknown model '{text}'")
    gamma = mpf("1.4")
    for word in words[1:]:
        if word.startswith("gamma="):
            gamma = mpf(word[len("gamma="):])
        else:
            raise ValueError(f"unknown model parameter '{word}' in '{text}'")
    return MODELS[words[0]], gamma


# ---------------------------------------------------------------------------
# Modes.
# ---------------------------------------------------------------------------
def check_vectors(paths):
    passed = failed = 0
    for path in paths:
        model = None
        rules = {}
        rows = []
        header = None
        with open(path, newline="") as handle:
            for number, line in enumerate(handle, start=1):
                line = line.strip()
                if not line:
                    continue
                if line.startswith("#"):
                    body = line[1:].strip()
                    if body.startswith("model:"):
                        model = body[len("model:"):].strip()
                    elif body.startswith("tolerance:"):
                        words = body[len("tolerance:"):].split()
                        rules[words[0]] = words[1:]
                    continue
                cells = next(csv.reader([line]))
                if header is None:
                    header = [c.strip() for c in cells]
                else:
                    rows.append((number, [c.strip() for c in cells]))
        function, gamma = parse_model(model)
        for number, cells in rows:
            mach = mpf(cells[0])
            exact = function(mach, gamma)
            for column, written in zip(header[1:], cells[1:]):
                if written == "":
                    continue
                rule = rules[column]
                reference = mpf(written)
                if rule[0] == "printed":
                    tolerance = half_unit_of_last_digit(written, mpf)
                elif rule[0] == "rel":
                    tolerance = mpf(rule[1]) * abs(reference)
                else:
                    tolerance = mpf(rule[1])
                value = exact[column]
                error = abs(value - reference)
                if error <= tolerance:
                    passed += 1
                else:
                    failed += 1
                    print(
                        f"{path}:{number}: {column} at Mach {cells[0]}: written {written}, "
                        f"mpmath {mp.nstr(value, 10)} (error {mp.nstr(error / tolerance, 3)} "
                        f"times the tolerance)"
                    )
    print(f"{passed} passed, {failed} failed")
    return failed == 0


def table(kind, gamma, machs):
    function = MODELS[kind]
    for text in machs:
        values = function(mpf(text), mpf(gamma))
        cells = " ".join(f"{k}={mp.nstr(v, 16)}" for k, v in values.items() if not k.startswith("_"))
        print(f"M={text} {cells}")


def self_test():
    passed = failed = 0

    def expect(name, a, b, tolerance=mpf("1e-25")):
        nonlocal passed, failed
        if abs(a - b) <= tolerance * max(1, abs(b)):
            passed += 1
        else:
            failed += 1
            print(f"FAIL {name}: {a} vs {b}")

    for gamma in (mpf("1.4"), mpf("1.3"), mpf("5") / 3):
        sonic = isentropic(mpf(1), gamma)
        expect("A/A* = 1 at M = 1", sonic["a_astar"], mpf(1))
        expect("T*/T0 = 2/(g+1)", sonic["t_t0"], 2 / (gamma + 1))
        weak = normal_shock(mpf(1), gamma)
        for key in ("m2", "p2_p1", "rho2_rho1", "t2_t1", "p02_p01"):
            expect(f"normal shock at M = 1 is no shock ({key})", weak[key], mpf(1))
        # Rayleigh's formula meets the isentropic pitot pressure at M = 1.
        expect("Rayleigh = isentropic at M = 1", weak["p02_p1"], 1 / sonic["p_p0"])
        for m in ("1.2", "2", "3.7", "5"):
            shock = normal_shock(mpf(m), gamma)
            expect(f"Rayleigh closed form = ratio chain at M = {m}", shock["p02_p1"], shock["_p02_p1_by_ratios"])
            # p02/p01 is also (A*/A*2) i.e. p02/p1 divided by p01/p1.
            p01_p1 = 1 / isentropic(mpf(m), gamma)["p_p0"]
            expect(f"p02/p01 = (p02/p1) / (p01/p1) at M = {m}", shock["p02_p01"], shock["p02_p1"] / p01_p1)
            # The downstream Mach of the downstream Mach's shock is the upstream Mach
            # (the relation is an involution).
            expect(f"M2 relation is an involution at M = {m}",
                   sqrt((1 + (gamma - 1) / 2 * shock["m2"] ** 2) / (gamma * shock["m2"] ** 2 - (gamma - 1) / 2)),
                   mpf(m))
    print(f"{passed} passed, {failed} failed")
    return failed == 0


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    parser.add_argument("--check-vectors", nargs="+", metavar="CSV")
    parser.add_argument("--table", choices=sorted(MODELS))
    parser.add_argument("--gamma", default="1.4")
    parser.add_argument("--self-test", action="store_true")
    parser.add_argument("mach", nargs="*")
    args = parser.parse_args()
    if args.check_vectors:
        return 0 if check_vectors(args.check_vectors) else 1
    if args.table:
        table(args.table, args.gamma, args.mach)
        return 0
    if args.self_test:
        return 0 if self_test() else 1
    parser.print_help()
    return 2


if __name__ == "__main__":
    sys.exit(main())
