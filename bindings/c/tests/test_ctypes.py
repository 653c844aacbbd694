"""The shared library through the door a spreadsheet add-in uses: load it with ctypes and
call symbols with plain doubles. Checks the spreadsheet functions and one status function
against the reference vectors of tests/vectors (the same files the Rust and C tests read).

Usage: python3 test_ctypes.py PATH/TO/libaerostrata.so VECTOR_DIR   Ends "N passed, N failed".
"""

import ctypes
import math
import os
import sys

passed = 0
failed = 0


def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print("FAIL:", what)


def printed_tolerance(cell):
    """Half a unit of the last digit written in the cell (tests/vectors/README.md)."""
    text = cell.strip().lstrip("+-")
    mantissa, _, exponent = text.upper().partition("E")
    decimals = len(mantissa.partition(".")[2])
    return 0.5 * 10.0 ** (int(exponent or 0) - decimals)


def read_vectors(path):
    tolerances, header, rows = {}, None, []
    with open(path, encoding="utf-8") as f:
        for line in f:
            line = line.rstrip("\r\n")
            if line.startswith("# tolerance: "):
                name, rule, *amount = line[len("# tolerance: "):].split()
                tolerances[name] = (rule, float(amount[0]) if amount else None)
            elif line.startswith("#") or not line:
                continue
            elif header is None:
                header = line.split(",")
            else:
                rows.append(line.split(","))
    if set(tolerances) != set(header[1:]):
        raise SystemExit(f"{path}: tolerance lines do not match the columns")
    return tolerances, header, rows


def tolerance(rule, cell):
    kind, amount = rule
    if kind == "printed":
        return printed_tolerance(cell)
    if kind == "rel":
        return amount * abs(float(cell))
    if kind == "abs":
        return amount
    raise SystemExit(f"unknown tolerance rule {kind}")


def main():
    lib = ctypes.CDLL(os.path.abspath(sys.argv[1]))
    vectors = sys.argv[2]
    functions = {
        "temperature_K": lib.aerostrata_xl_temperature_k,
        "pressure_Pa": lib.aerostrata_xl_pressure_pa,
        "density_kg_m3": lib.aerostrata_xl_density,
        "speed_of_sound_m_s": lib.aerostrata_xl_speed_of_sound,
        "dynamic_viscosity_Pa_s": lib.aerostrata_xl_dynamic_viscosity,
        "kinematic_viscosity_m2_s": lib.aerostrata_xl_kinematic_viscosity,
    }
    for f in functions.values():
        f.argtypes = [ctypes.c_double, ctypes.c_double]
        f.restype = ctypes.c_double
    checked = 0
    for name in ("usa76_lower.csv", "usa76_upper.csv", "usa76_upper_high.csv"):
        tolerances, header, rows = read_vectors(os.path.join(vectors, name))
        for row in rows:
            altitude = float(row[0])
            for column, cell in zip(header[1:], row[1:]):
                if cell == "" or column not in functions:
                    continue
                got = functions[column](altitude, 0.0)
                tol = tolerance(tolerances[column], cell)
                check(abs(got - float(cell)) <= tol, f"{name} {column} at {row[0]}: {got} vs {cell} (tol {tol})")
                checked += 1
    check(checked > 150, f"only {checked} vector cells reached the spreadsheet functions")

    # NaN on error, and above 86 km for the continuum properties.
    check(math.isnan(lib.aerostrata_xl_density(float("nan"), 0.0)), "NaN altitude gives NaN")
    check(math.isnan(lib.aerostrata_xl_density(2.0e6, 0.0)), "out-of-range altitude gives NaN")
    check(math.isnan(lib.aerostrata_xl_speed_of_sound(150000.0, 0.0)), "no speed of sound above 86 km")
    check(lib.aerostrata_xl_density(0.0, 15.0) < lib.aerostrata_xl_density(0.0, 0.0), "a hot day is thinner")

    q = lib.aerostrata_xl_dynamic_pressure
    q.argtypes = [ctypes.c_double, ctypes.c_double]
    q.restype = ctypes.c_double
    check(abs(q(1.225, 100.0) - 6125.0) < 1e-9, "dynamic pressure")

    # A status function and the thread's detail, through the same door.
    out = ctypes.c_double(-1.0)
    f = lib.aerostrata_pressure_altitude_m
    f.argtypes = [ctypes.c_double, ctypes.POINTER(ctypes.c_double)]
    f.restype = ctypes.c_int
    check(f(22632.06, ctypes.byref(out)) == 0 and abs(out.value - 11000.0) < 0.01, "pressure altitude")
    check(f(-5.0, ctypes.byref(out)) == 6 and abs(out.value - 11000.0) < 0.01, "NOT_POSITIVE, out unchanged")
    check(f(1.0, None) == 2, "NULL out gives NULL_POINTER")
    message = lib.aerostrata_status_message
    message.argtypes = [ctypes.c_int]
    message.restype = ctypes.c_char_p
    check(message(2) == b"a required pointer argument was NULL", "status message")

    # A handle freed twice or used after its free, as a wrapper's finaliser might do it:
    # INVALID_HANDLE (28), not a crash (the library's own contract, docs/c-guide.md).
    model = ctypes.c_void_p()
    new = lib.aerostrata_model_new_isothermal
    new.argtypes = [ctypes.c_double, ctypes.c_double, ctypes.POINTER(ctypes.c_void_p)]
    new.restype = ctypes.c_int
    free = lib.aerostrata_model_free
    free.argtypes = [ctypes.c_void_p]
    free.restype = ctypes.c_int
    span = lib.aerostrata_model_range_geometric_m
    span.argtypes = [ctypes.c_void_p, ctypes.POINTER(ctypes.c_double), ctypes.POINTER(ctypes.c_double)]
    span.restype = ctypes.c_int
    low, high = ctypes.c_double(-1.0), ctypes.c_double(-1.0)
    check(new(250.0, 101325.0, ctypes.byref(model)) == 0 and model.value, "a model")
    check(span(model, ctypes.byref(low), ctypes.byref(high)) == 0 and high.value > low.value, "its range")
    check(free(model) == 0, "freed once")
    low.value = -1.0
    check(span(model, ctypes.byref(low), ctypes.byref(high)) == 28 and low.value == -1.0, "used after free")
    check(free(model) == 28, "freed twice")
    check(free(None) == 0, "freeing NULL does nothing")
    check(message(28) == b"a handle was freed already, is of another type, or is not a handle", "its message")

    print(f"{passed} passed, {failed} failed")
    return 0 if failed == 0 else 1


if __name__ == "__main__":
    sys.exit(main())
