"""Headless LibreOffice Calc runner: builds a standard-atmosphere sheet whose every
number comes from libaerostrata.so (through aerostrata_cells.py), recalculates, saves it
as .ods and .csv, and closes the document in a `finally` (a document left open keeps a
headless soffice running).

Run by soffice as the macro `runner.py$main` of a user profile (see README.md).
Environment: AEROSTRATA_LIB (path to libaerostrata.so), AEROSTRATA_OUT (output path
without extension: writes OUT.ods, OUT.csv, and OUT.log with "ok" or the error),
AEROSTRATA_CELLS (path to aerostrata_cells.py; default: beside this file).
"""

import importlib.util
import os
import traceback

import uno
from com.sun.star.beans import PropertyValue

HEADER = (
    "geometric_altitude_m",
    "temperature_K",
    "pressure_Pa",
    "density_kg_m3",
    "velocity_m_s",
    "dynamic_pressure_Pa",
    "dynamic_pressure_formula_Pa",
)
# 0-10 km every km, then every 5 km to 85 km, and 86 km: all rows of usa76_lower.csv.
ALTITUDES_M = [1000.0 * k for k in range(0, 11)] + [1000.0 * k for k in range(15, 86, 5)] + [86000.0]


def invented_velocity_m_s(altitude_m):
    """A made-up ascent profile: 120 m/s at the ground, 25 m/s faster every kilometre."""
    return 120.0 + 0.025 * altitude_m


def _prop(name, value):
    p = PropertyValue()
    p.Name = name
    p.Value = value
    return p


def _cells_module():
    path = os.environ.get("AEROSTRATA_CELLS")
    if not path:
        here = globals().get("__file__", "runner.py")
        if here.startswith("file:"):  # LibreOffice gives the macro's file as a URL
            here = uno.fileUrlToSystemPath(here)
        path = os.path.join(os.path.dirname(os.path.abspath(here)), "aerostrata_cells.py")
    spec = importlib.util.spec_from_file_location("aerostrata_cells", path)
    module = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(module)
    return module


def fill(sheet, cells):
    for col, name in enumerate(HEADER):
        sheet.getCellByPosition(col, 0).setString(name)
    for i, h in enumerate(ALTITUDES_M):
        row = i + 1
        at = sheet.getCellByPosition
        at(0, row).setValue(h)
        at(1, row).setValue(cells.temperature_k(h))
        at(2, row).setValue(cells.pressure_pa(h))
        at(3, row).setValue(cells.density(h))
        at(4, row).setValue(invented_velocity_m_s(h))
        # q from the values as they stand in the sheet, by the library's q function ...
        at(5, row).setValue(cells.dynamic_pressure(at(3, row).getValue(), at(4, row).getValue()))
        # ... and by a Calc formula, evaluated by the recalculation below.
        at(6, row).setFormula(f"=0.5*D{row + 1}*E{row + 1}^2")


def main(*_args):
    out = os.environ.get("AEROSTRATA_OUT", os.path.join(os.getcwd(), "aerostrata_sheet"))
    log = "ok\n"
    doc = None
    try:
        cells = _cells_module()
        ctx = XSCRIPTCONTEXT.getComponentContext()  # noqa: F821 (provided by LibreOffice)
        smgr = ctx.ServiceManager
        desktop = smgr.createInstanceWithContext("com.sun.star.frame.Desktop", ctx)
        doc = desktop.loadComponentFromURL("private:factory/scalc", "_blank", 0, (_prop("Hidden", True),))
        sheet = doc.getSheets().getByIndex(0)
        sheet.setName("standard_atmosphere")
        fill(sheet, cells)
        doc.calculateAll()
        doc.storeToURL(uno.systemPathToFileUrl(out + ".ods"), (_prop("FilterName", "calc8"),))
        # Token 9 "false": save full values, not the cells as shown (15 significant digits).
        csv_options = "44,34,76,1,,0,false,true,false"
        doc.storeToURL(
            uno.systemPathToFileUrl(out + ".csv"),
            (_prop("FilterName", "Text - txt - csv (StarCalc)"), _prop("FilterOptions", csv_options)),
        )
    except Exception:  # report anything, then still close the document
        log = traceback.format_exc()
    finally:
        if doc is not None:
            try:
                doc.close(True)
            except Exception:
                log += traceback.format_exc()
        with open(out + ".log", "w", encoding="utf-8") as f:
            f.write(log)


g_exportedScripts = (main,)
