#!/usr/bin/env python3
"""Stand-in for `aerostrata eval --species FILE`, used only to test usa76_upper_scipy.py.

    usa76_upper_fake_cli.py eval --species FILE

It answers from the reference's own integration, run with the second set of
solver settings (Radau, rtol 1e-13, max_step 100 m), so a comparison against it
must pass with errors near 1e-11.  Rows at or below 86 km have empty species
cells and the lower layers' bulk values (from usa76_mpmath.py), as the CLI does.

Environment:
  FAKE_CLI_PERTURB=COLUMN:REL[:ZMIN]   multiply COLUMN by (1 + REL) at altitudes
                                       >= ZMIN, to exercise the failure path
  FAKE_CLI_BLANK=COLUMN                write COLUMN empty in every row
"""

import os
import sys

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import usa76_upper_scipy as ref  # noqa: E402
from vector_tools import perturbation  # noqa: E402

COLUMNS = (["geometric_altitude_m", "temperature_K", "pressure_Pa", "density_kg_m3",
            "mean_molar_mass_kg_kmol", "number_density_m3"] + ref.SPECIES_COLS
           # Present so that the comparison is seen to ignore columns it does not use.
           + ["unused_column"])


def main(argv):
    if len(argv) != 3 or argv[0] != "eval" or argv[1] != "--species":
        sys.stderr.write("usage: usa76_upper_fake_cli.py eval --species FILE\n")
        return 2
    perturb = perturbation()
    blank = os.environ.get("FAKE_CLI_BLANK")
    with open(argv[2]) as f:
        alts = [float(ln) for ln in f if ln.strip() and not ln.startswith("#")]
    upper = [z for z in alts if z > ref.Z_BOT]
    solved = dict(zip(upper, ref.solve(upper, ref.SECOND_OPTS))) if upper else {}
    print(",".join(COLUMNS))
    for z in alts:
        if z > ref.Z_BOT:
            values = dict(solved[z])
        else:
            values = {k: v for k, v in ref._lower_state(z).items() if k in COLUMNS}
            values.update({c: None for c in ref.SPECIES_COLS})
        values["geometric_altitude_m"] = z
        values["unused_column"] = -1.0
        perturb(values, z)
        if blank:
            values[blank] = None
        print(",".join("" if values.get(c) is None else repr(float(values[c]))
                       for c in COLUMNS))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
