"""What every reference script shares: reading tests/vectors files, their tolerance
rules, and the closing "N passed, N failed" tally. See tests/vectors/README.md for the
file format. Standard library only; numbers come back in the caller's type (float or
mpmath's mpf), so a 30-digit script stays at 30 digits."""

import csv
from decimal import Decimal


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
