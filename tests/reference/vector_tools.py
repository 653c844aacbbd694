"""What every reference script shares: reading tests/vectors files, their tolerance
rules and the check of every cell, running the CLI under comparison, the fault the fake
CLIs inject, and the closing "N passed, N failed" tally. See tests/vectors/README.md for
the file format. Standard library only; numbers come back in the caller's type (float or
mpmath's mpf), so a 30-digit script stays at 30 digits."""

import argparse
import csv
import math
import os
import subprocess
import tempfile
from decimal import Decimal

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


class Tally:
    """Counts checks and prints the closing line every runner understands."""

    def __init__(self):
        self.passed = 0
        self.failed = 0

    def record(self, ok):
        if ok:
            self.passed += 1
        else:
            self.failed += 1

    def close(self):
        print("%d passed, %d failed" % (self.passed, self.failed))
        return 1 if self.failed else 0


def half_unit_of_last_digit(text, number=float):
    """Half a unit in the last written digit: '1.01325E+05' -> 0.5, '288.150' -> 0.0005.

    Decimal keeps the written exponent, so trailing zeros count as printed digits,
    which is what a printed table means by them.
    """
    return number(str(Decimal(5).scaleb(Decimal(text.strip()).as_tuple().exponent - 1)))


def read_vector_file(path):
    """Return (model, tolerances, header, rows) of a tests/vectors file; tolerances map
    a column to its rule as a list of words (['printed'], ['rel', '5e-4'], ...)."""
    model, tolerances, data = None, {}, []
    with open(path, newline="") as f:
        for line in f:
            if line.startswith("#"):
                key, sep, rest = line[1:].strip().partition(":")
                if not sep:
                    continue
                if key.strip() == "tolerance":
                    col, rule = rest.strip().split(None, 1)
                    tolerances[col] = rule.split()
                elif key.strip() == "model":
                    model = rest.strip()
            elif line.strip():
                data.append(line)
    reader = csv.reader(data)
    header = next(reader)
    return model, tolerances, header, list(reader)


def allowed_error(rule, text, ref, number=float):
    """The tolerance of one cell written as `text` with reference value `ref`."""
    if rule[0] == "printed":
        return half_unit_of_last_digit(text, number)
    if rule[0] == "rel":
        return number(rule[1]) * abs(ref)
    if rule[0] == "abs":
        return number(rule[1])
    raise ValueError("unknown tolerance rule %r" % " ".join(rule))


def check_us1976_vectors(path, references, number, describe_miss):
    """Check every filled cell of the us1976 vector file `path` with the file's own
    tolerances; print each miss and a summary line, and return the exit status.

    `references(altitudes)` gives one dict of column values per row, for the rows'
    altitudes as written (it may be lazy); `number` reads a cell (float or mpf);
    `describe_miss(altitude, column, text, reference, ratio)` is the line of a miss,
    `ratio` being its error over its tolerance.
    """
    tally = Tally()
    model, tolerances, header, rows = read_vector_file(path)
    if model != "us1976":
        print("%s: model %r is not checked by this script" % (path, model))
        tally.record(False)
        return tally.close()
    empty = 0
    for row, ref in zip(rows, references([row[0] for row in rows])):
        for col, text in zip(header[1:], row[1:]):
            if not text.strip():
                empty += 1
                continue
            if col not in ref:
                print("  Z = %-8s %-24s no computed value (%s)" % (row[0], col, text))
                tally.record(False)
                continue
            diff = abs(number(text) - ref[col])
            limit = allowed_error(tolerances[col], text, ref[col], number)
            ok = diff <= limit
            tally.record(ok)
            if not ok:
                print(describe_miss(row[0], col, text, ref[col], diff / limit))
    print("%s: %d rows, %d filled cells, %d empty cells"
          % (path, len(rows), tally.passed + tally.failed, empty))
    return tally.close()


# ---------------------------------------------------------------------------
# The CLI under comparison
# ---------------------------------------------------------------------------
def run_mode(argv, doc, compare_cli, self_check, check_vectors, reference, more=()):
    """The command line of a script that compares the CLI, and its exit status. Its modes,
    the first given runs: the script's check of itself, `self_check` = (option, help,
    function of no arguments); `--check-vectors CSV`, `check_vectors(CSV)` (`reference`
    names what the vectors are checked against); `more` (option, argparse's settings,
    function of the option's value); with none of them, `compare_cli(BIN)`, BIN defaulting
    to target/debug/aerostrata. `doc` is the script's docstring, whose first paragraph
    describes it in the help."""
    parser = argparse.ArgumentParser(description=doc.split("\n\n")[0])
    parser.add_argument("binary", nargs="?",
                        default=os.path.join(ROOT, "target", "debug", "aerostrata"),
                        help="aerostrata CLI (default: target/debug/aerostrata)")
    option, help_text, run_self_check = self_check
    modes = [(option, {"action": "store_true", "help": help_text}, lambda _: run_self_check()),
             ("--check-vectors",
              {"metavar": "CSV", "help": "check a vector file against the " + reference},
              check_vectors)] + list(more)
    for option, settings, _ in modes:
        parser.add_argument(option, **settings)
    args = vars(parser.parse_args(argv))
    for option, _, run in modes:
        value = args[option[2:].replace("-", "_")]
        if value:
            return run(value)
    return compare_cli(args["binary"])


def cli_rows(binary, args, altitudes, tally):
    """The CSV rows (dicts) of `BIN ARGS FILE` run on a file of the altitudes; None, with
    the failure printed and recorded in `tally`, when the CLI cannot be run or fails."""
    try:
        return run_cli(binary, args, altitudes)
    except (OSError, RuntimeError) as exc:
        print("cannot run the CLI: %s" % exc)
        tally.record(False)
        return None


def run_cli(binary, args, altitudes):
    """Run `BIN ARGS FILE` on a file of the altitudes, one per line as repr() writes
    them (it round-trips, so the CLI reads exactly the doubles the reference uses)."""
    with tempfile.NamedTemporaryFile("w", suffix=".txt", delete=False) as f:
        for z in altitudes:
            f.write(repr(z) + "\n")
        path = f.name
    try:
        proc = subprocess.run([binary] + args + [path], capture_output=True, text=True,
                              check=False)
    finally:
        os.unlink(path)
    if proc.returncode != 0:
        raise RuntimeError("%s %s exited with %d:\n%s"
                           % (binary, " ".join(args), proc.returncode, proc.stderr.strip()))
    lines = [ln for ln in proc.stdout.splitlines() if ln.strip()]
    return list(csv.DictReader(lines))


# ---------------------------------------------------------------------------
# The fake CLIs' injected fault
# ---------------------------------------------------------------------------
def perturbation():
    """The fault FAKE_CLI_PERTURB=COLUMN:REL[:ZMIN] asks for, as a function that
    multiplies a row's COLUMN by (1 + REL) at altitudes >= ZMIN (a row without a value
    there is left alone); without the variable, a function that changes nothing."""
    text = os.environ.get("FAKE_CLI_PERTURB")
    if not text:
        return lambda values, z: None
    parts = text.split(":")
    column, rel = parts[0], float(parts[1])
    z_min = float(parts[2]) if len(parts) > 2 else -math.inf

    def apply(values, z):
        if z >= z_min and values.get(column) is not None:
            values[column] *= 1.0 + rel
    return apply
