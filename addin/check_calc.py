#!/usr/bin/python3
"""The add-in's check in a real Calc: every STRATA_* function typed as a formula into a
hidden sheet of a profile the .oxt was installed into, recalculated headless, each result
checked against a published value (the source named beside each check) and against the C
library the extension carries, called directly; an array formula over a column;
SUMPRODUCT over results; every kind of error a cell error (never 0); the Function Wizard's
text of every function. Run by `cargo xtask addin --check`:

    /usr/bin/python3 check_calc.py PROFILE FUNCTIONS_JSON LIBRARY VECTORS_DIR RESULTS_JSON EXAMPLE

EXAMPLE is examples/spreadsheet/invented-ascent.fods: a workbook whose cells are add-in
formulas; it is opened, recalculated and every formula cell compared with the library.

It starts its own soffice on a private pipe and stops it; only processes it started are
ever killed, by their PID. Exit status 0 and "RESULT: PASS" when every check passes.
"""
import csv
import ctypes
import json
import math
import os
import subprocess
import sys
import time

import uno
from com.sun.star.beans import PropertyValue
from com.sun.star.connection import NoConnectException

PROFILE, FUNCTIONS_JSON, LIBRARY, VECTORS, OUT, EXAMPLE = sys.argv[1:7]
PIPE = "strata_check_%d" % os.getpid()
CAUTION = "Not certified flight software; verify independently; local codes, range-safety rules and " \
          "licensed engineering practice govern."
# Calc's error codes (as the recipe observed them): IllegalArgumentException -> Err:502,
# a NaN result -> #NUM! (503), text for a number -> #VALUE! (519).
ERR_ARGUMENT, ERR_NUM, ERR_VALUE = 502, 503, 519

FUNCTIONS = json.load(open(FUNCTIONS_JSON))
BY_NAME = {f["display"]: f for f in FUNCTIONS}
D, U, S = ctypes.c_double, ctypes.c_uint32, ctypes.c_char_p
LIB = ctypes.CDLL(LIBRARY)


def cfn(symbol, types):
    fn = getattr(LIB, symbol)
    fn.restype, fn.argtypes = D, types
    return fn


xl_state = cfn("aerostrata_xl_state", [U, D, S])


def direct(f, first, numbers=(), spec=None):
    """The C library called directly, as the add-in calls it."""
    if f["call"] in ("state", "state_by_name"):
        return xl_state(f["ids"][0], first, spec)
    if f["call"] == "at_altitude":
        return cfn(f["symbol"], [D] * (1 + len(numbers)) + [S])(first, *numbers, spec)
    if f["call"] == "airspeed":
        return cfn(f["symbol"], [U, U, D, D, D])(f["ids"][0], f["ids"][1], first, *numbers)
    return cfn(f["symbol"], [D] * (1 + len(numbers)))(first, *numbers)


def half_unit(cell):
    """Half a unit of the last printed digit ("1.2250E+00" -> 5e-5)."""
    text = cell.strip().lstrip("+-")
    mantissa, _, exponent = text.upper().partition("E")
    decimals = len(mantissa.partition(".")[2])
    return 0.5 * 10.0 ** (int(exponent or 0) - decimals)


def read_vectors(name):
    """Rows as dicts of text, and each column's tolerance rule."""
    rules, lines = {}, []
    with open(os.path.join(VECTORS, name)) as f:
        for line in f:
            if line.startswith("# tolerance:"):
                words = line[len("# tolerance:"):].split()
                rules[words[0]] = words[1:]
            elif not line.startswith("#") and line.strip():
                lines.append(line)
    rows = list(csv.DictReader(lines))
    return rows, rules


def tolerance(rule, cell):
    if rule and rule[0] == "rel":
        return float(rule[1]) * abs(float(cell))
    if rule and rule[0] == "abs":
        return float(rule[1])
    return half_unit(cell)


def pv(name, value):
    p = PropertyValue()
    p.Name, p.Value = name, value
    return p


def children(pid):
    try:
        with open("/proc/%d/task/%d/children" % (pid, pid)) as f:
            return [int(x) for x in f.read().split()]
    except OSError:
        return []


class Sheet:
    """Formulas placed one per row of column A; read back after one recalculation."""

    def __init__(self, sheet):
        self.sheet = sheet
        self.row = 0
        self.pending = []   # (cell, check)

    def cell(self, address):
        return self.sheet.getCellRangeByName(address)

    def formula(self, text, **check):
        self.row += 1
        address = "A%d" % self.row
        self.cell(address).setFormula(text)
        check["formula"] = text
        self.pending.append((address, check))
        return address


def check_example(desktop, record):
    """The example workbook: every formula cell computes and equals the library's value."""
    doc = desktop.loadComponentFromURL(uno.systemPathToFileUrl(os.path.abspath(EXAMPLE)), "_blank", 0,
                                       (pv("Hidden", True),))
    try:
        doc.calculateAll()
        sheet = doc.Sheets.getByIndex(0)

        def cell(col, row):
            return sheet.getCellByPosition(col, row)

        cd, area = cell(1, 2).getValue(), cell(3, 2).getValue()
        mach = cfn("aerostrata_xl_mach_at", [D, D, S])
        q = cfn("aerostrata_xl_dynamic_pressure_at", [D, D, S])
        drag = cfn("aerostrata_xl_drag", [D, D, D, D, S])
        row, rows, max_q = 4, 0, 0.0
        while cell(0, row).getType().value == "VALUE" and cell(3, row).getFormula():
            z, v = cell(1, row).getValue(), cell(2, row).getValue()
            expected = [xl_state(5, z, None), xl_state(6, z, None), mach(z, v, None), q(z, v, None),
                        drag(z, v, cd, area, None), q(z, v, b"hydrostatic-offset=+15K"),
                        xl_state(5, z, b"offset=15.0K")]
            for col, want in enumerate(expected, start=3):
                c = cell(col, row)
                record("example workbook %s%d" % ("ABCDEFGHIJ"[col], row + 1),
                       c.getError() == 0 and c.getValue() == want and c.getFormula().startswith(("=", "{=")),
                       "the C library directly", value=c.getValue(), error=c.getError(), want=want,
                       formula=c.getFormula())
            max_q = max(max_q, expected[3])
            rows += 1
            row += 1
        c = cell(1, row)
        record("example workbook: maximum q", rows > 5 and c.getError() == 0 and c.getValue() == max_q,
               "the C library directly, maximum taken here", value=c.getValue(), want=max_q, rows=rows)
    finally:
        doc.close(True)


def main():
    started = time.time()
    results = {"checks": [], "ok": False}
    cmd = ["/usr/lib/libreoffice/program/soffice", "--headless", "--invisible", "--norestore", "--nologo",
           "--nodefault", "--nolockcheck", "-env:UserInstallation=" + uno.systemPathToFileUrl(PROFILE),
           "--accept=pipe,name=%s;urp;StarOffice.ComponentContext" % PIPE]
    log = open(os.path.join(os.path.dirname(OUT), "soffice.log"), "w")
    proc = subprocess.Popen(cmd, stdout=log, stderr=subprocess.STDOUT)
    doc = desktop = None

    def record(name, ok, source, **detail):
        detail.update(name=name, ok=bool(ok), source=source)
        results["checks"].append(detail)

    try:
        local = uno.getComponentContext()
        resolver = local.ServiceManager.createInstanceWithContext("com.sun.star.bridge.UnoUrlResolver", local)
        ctx = None
        for _ in range(600):
            try:
                ctx = resolver.resolve("uno:pipe,name=%s;urp;StarOffice.ComponentContext" % PIPE)
                break
            except NoConnectException:
                if proc.poll() is not None:
                    raise RuntimeError("soffice exited early, status %s" % proc.returncode)
                time.sleep(0.1)
        if ctx is None:
            raise RuntimeError("no connection to soffice in 60 s")
        results["t_connect_s"] = round(time.time() - started, 2)
        smgr = ctx.ServiceManager
        desktop = smgr.createInstanceWithContext("com.sun.star.frame.Desktop", ctx)
        doc = desktop.loadComponentFromURL("private:factory/scalc", "_blank", 0, (pv("Hidden", True),))
        sheet = Sheet(doc.Sheets.getByIndex(0))
        checked = {f["display"]: 0 for f in FUNCTIONS}

        def value(f, args, want, tol, source, numbers=(), spec=None):
            """One formula whose result must be `want` within `tol` and the library's own bits."""
            text = "=%s(%s)" % (f["display"], ";".join(args))
            lib_value = direct(f, float(args[0]), numbers, spec)
            sheet.formula(text, want=want, tol=tol, lib=lib_value, source=source, function=f["display"])

        # 1. Every state function against the U.S. Standard Atmosphere 1976 tables
        #    (tests/vectors/usa76_lower.csv, usa76_upper.csv: printed values, half a unit
        #    of the last digit unless the file says otherwise).
        for name in ("usa76_lower.csv", "usa76_upper.csv"):
            rows, rules = read_vectors(name)
            for f in FUNCTIONS:
                col = f.get("vector_column")
                if not col or col not in rules:
                    continue
                for row in rows[::3]:
                    if row.get(col, "").strip():
                        z = row["geometric_altitude_m"]
                        value(f, [z], float(row[col]), tolerance(rules[col], row[col]),
                              "U.S. Standard Atmosphere 1976 (%s, %s at %s m)" % (name, col, z))
        # The state quantities the tables do not print (ratios, geopotential altitude, ...)
        # and the generic STRATA_STATE: the C library called directly.
        for f in FUNCTIONS:
            if f["call"] == "state":
                for z in ("0", "5500", "30000"):
                    want = xl_state(f["ids"][0], float(z), None)
                    value(f, [z], want, 0.0, "the C library directly (aerostrata_xl_state)")
        state = BY_NAME["STRATA_STATE"]
        for quantity in ("temperature", "speed_of_sound", "mean_free_path", "Density Ratio"):
            qid = {"temperature": 2, "speed_of_sound": 6, "mean_free_path": 14, "Density Ratio": 19}[quantity]
            want = xl_state(qid, 7000.0, None)
            sheet.formula('=STRATA_STATE(7000;"%s")' % quantity, want=want, tol=0.0, lib=want,
                          source="the C library directly (id %d)" % qid, function="STRATA_STATE")
        # 2. Model specs and offsets: the hydrostatic-offset days computed with mpmath at 30
        #    digits (tests/vectors/hydrostatic_offset_{hot,cold}.csv, rel 1e-12).
        for name, spec in (("hydrostatic_offset_hot.csv", "hydrostatic-offset=+15K"),
                           ("hydrostatic_offset_cold.csv", "hydrostatic-offset=-25K,p0=98000Pa")):
            rows, rules = read_vectors(name)
            for f in FUNCTIONS:
                col = f.get("vector_column")
                if not col or col not in rules:
                    continue
                for row in rows[::6]:
                    z = row["geometric_altitude_m"]
                    value(f, [z, '"%s"' % spec], float(row[col]), tolerance(rules[col], row[col]),
                          "mpmath quadrature, 30 digits (%s, %s at %s m)" % (name, col, z),
                          spec=spec.encode())
        # An offset as a number and as a spec give the library's bits of that model.
        dens = BY_NAME["STRATA_DENSITY"]
        want = cfn("aerostrata_xl_state_offset", [U, D, D])(5, 3000.0, 15.0)
        value(dens, ["3000", "15"], want, 0.0, "the C library directly (aerostrata_xl_state_offset)",
              spec=b"offset=15.0K")
        value(dens, ["3000", '"offset=+15K"'], want, 0.0, "the C library directly (aerostrata_xl_state_offset)",
              spec=b"offset=+15K")
        value(BY_NAME["STRATA_TEMPERATURE"], ["12000", '"isothermal=250K"'], 250.0, 0.0,
              "the isothermal model's definition (common practice, no source)", spec=b"isothermal=250K")
        # 3. Compressible flow: NACA Report 1135, Tables I and II (printed values).
        for name, columns in (("naca1135_isentropic.csv", {"p_p0": "STRATA_ISENTROPIC_PRESSURE_RATIO",
                                                           "rho_rho0": "STRATA_ISENTROPIC_DENSITY_RATIO",
                                                           "t_t0": "STRATA_ISENTROPIC_TEMPERATURE_RATIO"}),
                              ("naca1135_normal_shock.csv", {"m2": "STRATA_SHOCK_MACH",
                                                             "p2_p1": "STRATA_SHOCK_PRESSURE_RATIO",
                                                             "rho2_rho1": "STRATA_SHOCK_DENSITY_RATIO",
                                                             "t2_t1": "STRATA_SHOCK_TEMPERATURE_RATIO",
                                                             "p02_p01": "STRATA_SHOCK_TOTAL_PRESSURE_RATIO"})):
            rows, rules = read_vectors(name)
            for col, display in columns.items():
                for row in rows[::2]:
                    if row.get(col, "").strip():
                        value(BY_NAME[display], [row["mach"]], float(row[col]), tolerance(rules.get(col), row[col]),
                              "NACA Report 1135 (%s, %s at M %s)" % (name, col, row["mach"]))
        # 4. Mach, q and drag at an altitude: the definitions over the tables' values at
        #    11 km geometric (U.S. Standard Atmosphere 1976, usa76_lower.csv: a = 295.15 m/s,
        #    rho = 3.6480E-01 kg/m3), within what their printed digits allow.
        value(BY_NAME["STRATA_MACH"], ["11000", "295.15"], 1.0, 0.5e-2 / 295.15,
              "U.S. Standard Atmosphere 1976, a = 295.15 m/s at 11 km", numbers=(295.15,))
        q = 0.5 * 0.36480 * 250 ** 2
        value(BY_NAME["STRATA_DYNAMIC_PRESSURE"], ["11000", "250"], q, 0.5e-4 / 0.3648 * q,
              "U.S. Standard Atmosphere 1976, rho = 3.6480E-01 kg/m3 at 11 km; q = rho V^2 / 2", numbers=(250.0,))
        value(BY_NAME["STRATA_DRAG"], ["11000", "250", "0.3", "0.05"], q * 0.3 * 0.05, 0.5e-4 / 0.3648 * q * 0.015,
              "U.S. Standard Atmosphere 1976, rho at 11 km; D = q Cd A", numbers=(250.0, 0.3, 0.05))
        # 5. Altimetry: the 1976 standard's layer boundaries (p = 22632.06 Pa at H = 11 km,
        #    rho = 1.2250 kg/m3 at 0), and QNH 1013.25 hPa reading the pressure altitude.
        value(BY_NAME["STRATA_PRESSURE_ALTITUDE"], ["22632.06"], 11000.0, 0.01,
              "U.S. Standard Atmosphere 1976, p at the 11 km layer base")
        value(BY_NAME["STRATA_PRESSURE_ALTITUDE"], ["101325"], 0.0, 1e-9, "U.S. Standard Atmosphere 1976, p0")
        value(BY_NAME["STRATA_DENSITY_ALTITUDE"], ["1.225"], 0.0, 0.5,
              "U.S. Standard Atmosphere 1976, rho0 = 1.2250 kg/m3")
        want = cfn("aerostrata_xl_pressure_altitude", [D])(90000.0)
        value(BY_NAME["STRATA_QNH_ALTITUDE"], ["90000", "101325"], want, 1e-9,
              "the altimeter convention: set to 1013.25 hPa it reads pressure altitude (common practice, no source)",
              numbers=(101325.0,))
        # 6. Airspeeds: at standard sea level CAS = EAS = TAS (NACA Report 1135's
        #    definitions); elsewhere the library directly.
        for f in FUNCTIONS:
            if f["call"] == "airspeed":
                value(f, ["100", "0", "288.15"], 100.0, 1e-9,
                      "at standard sea level CAS = EAS = TAS (common practice, no source)", numbers=(0.0, 288.15))
                want = direct(f, 120.0, (6000.0, 240.0))
                value(f, ["120", "6000", "240"], want, 0.0, "the C library directly (aerostrata_xl_airspeed)",
                      numbers=(6000.0, 240.0))

        # 7. An array formula over a column of altitudes, and SUMPRODUCT over results.
        lower, rules = read_vectors("usa76_lower.csv")
        column = [r for r in lower if r["density_kg_m3"].strip()][:20]
        for i, r in enumerate(column):
            sheet.cell("B%d" % (i + 1)).setValue(float(r["geometric_altitude_m"]))
        n = len(column)
        sheet.cell("C1:C%d" % n).setArrayFormula("=STRATA_DENSITY(B1:B%d)" % n)
        sheet.cell("D1:D%d" % n).setArrayFormula('=STRATA_TEMPERATURE(B1:B%d;"offset=+10K")' % n)
        # One row more than the column: the empty cell below it gives #NUM!, not a value.
        sheet.cell("E1:E%d" % (n + 1)).setArrayFormula("=STRATA_PRESSURE(B1:B%d)" % (n + 1))
        sumproduct = sheet.formula("=SUMPRODUCT(STRATA_DENSITY(B1:B%d);B1:B%d)" % (n, n), kind="sumproduct")
        mean = sheet.formula("=AVERAGE(STRATA_PRESSURE(B1:B%d))" % n, kind="average")

        # 8. Errors: each kind a cell error, never 0.
        errors = [
            ("an altitude outside the model", "=STRATA_DENSITY(2000000)", ERR_NUM),
            ("below the model's base", "=STRATA_PRESSURE(-6000)", ERR_NUM),
            ("a property undefined there (NaN from the library)", "=STRATA_SPEED_OF_SOUND(100000)", ERR_NUM),
            ("Mach above 86 km", "=STRATA_MACH(100000;300)", ERR_NUM),
            ("text where a number belongs", '=STRATA_DENSITY("abc")', ERR_ARGUMENT),
            ("text for a number argument", '=STRATA_MACH(1000;"fast")', ERR_VALUE),
            ("an unknown quantity name", '=STRATA_STATE(1000;"colour")', ERR_ARGUMENT),
            ("a model that does not parse", '=STRATA_DENSITY(1000;"warm")', ERR_ARGUMENT),
            ("an implausible offset", "=STRATA_DENSITY(1000;300)", ERR_ARGUMENT),
            ("a model that needs a file", '=STRATA_DENSITY(1000;"sounding=day.csv")', ERR_ARGUMENT),
            ("a subsonic normal shock", "=STRATA_SHOCK_MACH(0.5)", ERR_NUM),
            ("a negative pressure", "=STRATA_PRESSURE_ALTITUDE(-5)", ERR_NUM),
        ]
        error_cells = []
        for what, text, code in errors:
            error_cells.append((what, sheet.formula(text, kind="error"), code))
        iserror = sheet.formula("=ISERROR(STRATA_DENSITY(2000000))", kind="iserror")

        t_calc = time.time()
        doc.calculateAll()
        results["t_calc_s"] = round(time.time() - t_calc, 2)

        def read(address):
            cell = sheet.cell(address)
            return cell.getValue(), cell.getError(), cell.getString(), cell.getFormula()

        for address, check in sheet.pending:
            if "want" not in check:
                continue
            got, error, text, formula = read(address)
            want, tol, lib_value = check["want"], check["tol"], check["lib"]
            ok = error == 0 and abs(got - want) <= tol and got == lib_value and formula.startswith("=")
            record(check["formula"], ok, check["source"], cell=address, value=got, error=error, want=want,
                   tol=tol, library=lib_value)
            checked[check["function"]] += 1
        # The array formula's cells: the table's printed values and the library's bits.
        for i, r in enumerate(column):
            got, error, _, _ = read("C%d" % (i + 1))
            z = float(r["geometric_altitude_m"])
            want = float(r["density_kg_m3"])
            ok = error == 0 and abs(got - want) <= tolerance(rules["density_kg_m3"], r["density_kg_m3"]) \
                and got == xl_state(5, z, None)
            record("{=STRATA_DENSITY(B1:B%d)} row %d" % (n, i + 1), ok,
                   "U.S. Standard Atmosphere 1976 (usa76_lower.csv, density at %s m)" % r["geometric_altitude_m"],
                   value=got, error=error, want=want)
            got, error, _, _ = read("D%d" % (i + 1))
            want = xl_state(2, z, b"offset=+10K")
            record('{=STRATA_TEMPERATURE(B1:B%d;"offset=+10K")} row %d' % (n, i + 1),
                   error == 0 and got == want, "the C library directly", value=got, error=error, want=want)
        got, error, text, _ = read("E%d" % (n + 1))
        record("an empty cell in the altitude column gives #NUM!", error == ERR_NUM,
               "the add-in's error rules (docs/spreadsheet.md)", value=got, error=error, string=text)
        got, error, _, _ = read("E%d" % n)
        record("the column's other rows still compute", error == 0 and got == xl_state(4, float(column[-1][
            "geometric_altitude_m"]), None), "the C library directly", value=got, error=error)
        altitudes = [float(r["geometric_altitude_m"]) for r in column]
        want = sum(xl_state(5, z, None) * z for z in altitudes)
        got, error, _, _ = read(sumproduct)
        record("SUMPRODUCT over STRATA_DENSITY of a column", error == 0 and abs(got - want) <= 1e-9 * abs(want),
               "the C library directly, summed here", value=got, error=error, want=want)
        want = sum(xl_state(4, z, None) for z in altitudes) / len(altitudes)
        got, error, _, _ = read(mean)
        record("AVERAGE over STRATA_PRESSURE of a column", error == 0 and abs(got - want) <= 1e-9 * abs(want),
               "the C library directly, averaged here", value=got, error=error, want=want)
        for what, address, code in error_cells:
            got, error, text, formula = read(address)
            record("error: %s (%s)" % (what, formula), error == code and text not in ("0", ""),
                   "the add-in's error rules (docs/spreadsheet.md)", value=got, error=error, string=text,
                   expected_error=code)
        got, error, _, _ = read(iserror)
        record("ISERROR of an out-of-model altitude is TRUE", error == 0 and got == 1.0, "Calc's ISERROR",
               value=got)

        # 9. The Function Wizard's text of every function.
        descriptions = smgr.createInstanceWithContext("com.sun.star.sheet.FunctionDescriptions", ctx)
        wizard = {}
        for i in range(descriptions.getCount()):
            props = {p.Name: p.Value for p in descriptions.getByIndex(i)}
            if str(props.get("Name", "")).startswith("STRATA_"):
                wizard[props["Name"]] = props
        for f in FUNCTIONS:
            props = wizard.get(f["display"])
            ok = props is not None and CAUTION in props["Description"] and props["Description"] == f["description"]
            args = list(props["Arguments"]) if props else []
            ok = ok and len(args) == len(f["args"]) and all(
                a.Name == want[0] and a.Description == want[1] and a.Description for a, want in zip(args, f["args"]))
            ok = ok and all(a.IsOptional == (want[2] == "model") for a, want in zip(args, f["args"]))
            ok = ok and (f["unit"] in props["Description"])
            record("Function Wizard text of %s" % f["display"], ok, "FunctionDescriptions (what the Wizard shows)",
                   description=props["Description"] if props else None)
        # 10. Every function was checked through a formula at least once.
        for f in FUNCTIONS:
            record("%s checked through a formula" % f["display"], checked[f["display"]] > 0, "this check's coverage", count=checked[f["display"]])

        # 11. The document keeps its formulas: saved as .ods, reloaded, recalculated.
        ods = os.path.join(os.path.dirname(OUT), "roundtrip.ods")
        first_address, first_check = sheet.pending[0]
        doc.storeToURL(uno.systemPathToFileUrl(ods), (pv("FilterName", "calc8"),))
        doc.close(True)
        doc = desktop.loadComponentFromURL(uno.systemPathToFileUrl(ods), "_blank", 0, (pv("Hidden", True),))
        doc.calculateAll()
        cell = doc.Sheets.getByIndex(0).getCellRangeByName(first_address)
        record("after saving as .ods and reloading", cell.getError() == 0 and cell.getValue() == first_check["lib"],
               "the C library directly", value=cell.getValue(), formula=cell.getFormula())
        doc.close(True)
        doc = None
        check_example(desktop, record)
        results["ok"] = all(c["ok"] for c in results["checks"]) and len(results["checks"]) > 300
    except Exception as e:
        results["exception"] = repr(e)
    finally:
        try:
            if doc is not None:
                doc.close(True)
        except Exception as e:
            results["close_error"] = repr(e)
        try:
            if desktop is not None:
                desktop.terminate()
        except Exception:
            pass   # the connection drops while the office shuts down
        try:
            proc.wait(timeout=30)
        except subprocess.TimeoutExpired:
            for pid in [proc.pid] + children(proc.pid):
                try:
                    os.kill(pid, 9)
                except ProcessLookupError:
                    pass
            proc.wait()
        results["t_total_s"] = round(time.time() - started, 2)
        with open(OUT, "w") as f:
            json.dump(results, f, indent=1, default=str)
    failed = [c for c in results["checks"] if not c["ok"]]
    for c in failed[:40]:
        print("FAIL %s: %s" % (c["name"], {k: v for k, v in c.items() if k not in ("name", "ok")}))
    if "exception" in results:
        print("FAIL exception:", results["exception"])
    print("%d passed, %d failed" % (len(results["checks"]) - len(failed), len(failed)))
    print("timings: connect %s s, recalculation %s s, total %s s" % (
        results.get("t_connect_s"), results.get("t_calc_s"), results.get("t_total_s")))
    print("RESULT:", "PASS" if results["ok"] else "FAIL")
    return 0 if results["ok"] else 1


if __name__ == "__main__":
    sys.exit(main())
