# The aerostrata spreadsheet add-in: a LibreOffice Calc add-in component (Python UNO)
# whose cell functions call the aerostrata C library it carries, through ctypes.
# Template: `cargo xtask addin` writes the function table from the core's quantity
# catalogue in place of the two @...@ markers, the rest is as committed (addin/).
#
# Errors: text where a number belongs, an unknown quantity name or a bad model raise
# IllegalArgumentException (Calc shows Err:502); a value the library cannot give (an
# altitude outside the model, a property undefined there) is NaN, which Calc shows as
# #NUM!. Nothing becomes 0.
import ctypes
import json
import math
import os
import platform
import struct
import sys
import threading

import unohelper
from com.sun.star.lang import IllegalArgumentException, Locale, XLocalizable, XServiceInfo, XServiceName
from com.sun.star.sheet import XAddIn
from org.aerostrata.calc import XStrataFunctions

IMPLEMENTATION = "org.aerostrata.calc.FunctionsImpl"
SERVICE = "org.aerostrata.calc.Functions"
ADDIN_SERVICE = "com.sun.star.sheet.AddIn"
CATEGORY = "Add-In"

# [{method, display, description, args: [[name, description, kind]], call, symbol, ids}]
FUNCTIONS = json.loads(r"""@FUNCTIONS@""")
# The state quantities' machine names and ids (the C library's AEROSTRATA_QUANTITY_*).
STATE_IDS = json.loads(r"""@STATE_IDS@""")

BY_METHOD = {f["method"]: f for f in FUNCTIONS}
BY_DISPLAY = {f["display"]: f["method"] for f in FUNCTIONS}
HERE = os.path.dirname(os.path.abspath(__file__))


def library_path():
    """The C library for this platform, in the extension's lib/<platform>/ folder."""
    bits = struct.calcsize("P") * 8
    if sys.platform.startswith("win"):
        return os.path.join(HERE, "lib", "windows_x86_64" if bits == 64 else "windows_x86", "aerostrata.dll")
    if sys.platform == "darwin":
        return os.path.join(HERE, "lib", "macos_" + platform.machine(), "libaerostrata.dylib")
    return os.path.join(HERE, "lib", "linux_" + platform.machine(), "libaerostrata.so")


_lib = None
_lock = threading.Lock()
D, U, S = ctypes.c_double, ctypes.c_uint32, ctypes.c_char_p


def lib():
    global _lib
    with _lock:
        if _lib is None:
            # The aerostrata_xl_* functions are extern "system": stdcall on 32-bit Windows.
            load = ctypes.WinDLL if sys.platform.startswith("win") else ctypes.CDLL
            handle = load(library_path())
            for f in FUNCTIONS:
                fn = getattr(handle, f["symbol"])
                fn.restype = D
                fn.argtypes = argtypes(f)
            handle.aerostrata_xl_model_valid.restype = D
            handle.aerostrata_xl_model_valid.argtypes = [S]
            _lib = handle
    return _lib


def argtypes(f):
    numbers = [D for a in f["args"] if a[2] in ("column", "number")]
    if f["call"] in ("state", "state_by_name"):
        return [U, D, S]
    if f["call"] == "at_altitude":
        return numbers + [S]
    if f["call"] == "airspeed":
        return [U, U] + numbers
    return numbers


def bad(what, value, position, source):
    text = repr(value)
    if len(text) > 40:
        text = text[:40] + "..."
    return IllegalArgumentException("%s: %s" % (what, text), source, position)


def column(value, f, source):
    """The first argument as rows of floats (None for an empty cell); text is an error."""
    if not isinstance(value, tuple):
        value = ((value,),)
    rows = []
    for row in value:
        out = []
        for v in row:
            if v is None or (isinstance(v, str) and v == ""):
                out.append(None)
            elif isinstance(v, bool):
                raise bad("%s: %s must be a number, not TRUE/FALSE" % (f["display"], f["args"][0][0]), v, 0, source)
            elif isinstance(v, (int, float)):
                out.append(float(v))
            else:
                raise bad("%s: %s must be a number" % (f["display"], f["args"][0][0]), v, 0, source)
        rows.append(out)
    return rows


def model(value, f, position, source):
    """The optional model argument: None for the standard, else a spec as bytes."""
    if value is None:
        return None
    if isinstance(value, bool):
        raise bad("%s: model must be an offset in K or a model spec" % f["display"], value, position, source)
    if isinstance(value, (int, float)):
        if not math.isfinite(value):
            raise bad("%s: the temperature offset must be finite" % f["display"], value, position, source)
        spec = "offset=%sK" % repr(float(value))
    elif isinstance(value, str):
        spec = value.strip()
        if spec == "":
            return None
    else:
        raise bad("%s: model must be one offset or one spec, not a range" % f["display"], value, position, source)
    encoded = spec.encode("utf-8")
    if math.isnan(lib().aerostrata_xl_model_valid(encoded)):
        raise bad(
            "%s: not a model (write an offset in K, or offset=+15K, hydrostatic-offset=+15K, isothermal=250K, "
            "exponential=1.225,8500m)" % f["display"],
            value,
            position,
            source,
        )
    return encoded


def quantity_id(value, f, source):
    name = value.strip().lower().replace(" ", "_").replace("-", "_") if isinstance(value, str) else None
    if name not in STATE_IDS:
        raise bad("%s: not a state quantity (one of %s)" % (f["display"], ", ".join(STATE_IDS)), value, 1, source)
    return STATE_IDS[name]


def evaluate(source, f, args):
    kinds = [a[2] for a in f["args"]]
    rows = column(args[0], f, source)
    numbers = []
    spec = None
    ids = list(f["ids"])
    for position, (kind, value) in enumerate(zip(kinds[1:], args[1:]), start=1):
        if kind == "number":
            numbers.append(float(value))
        elif kind == "text":
            ids = [quantity_id(value, f, source)]
        elif kind == "model":
            spec = model(value, f, position, source)
    fn = getattr(lib(), f["symbol"])
    call = f["call"]
    nan = float("nan")

    def one(x):
        if x is None:
            return nan
        if call in ("state", "state_by_name"):
            return fn(ids[0], x, spec)
        if call == "at_altitude":
            return fn(x, *numbers, spec)
        if call == "airspeed":
            return fn(ids[0], ids[1], x, *numbers)
        return fn(x, *numbers)

    return tuple(tuple(one(x) for x in row) for row in rows)


def method(f):
    def cell_function(self, *args):
        return evaluate(self, f, args)

    cell_function.__name__ = f["method"]
    return cell_function


class StrataFunctions(unohelper.Base, XStrataFunctions, XAddIn, XServiceName, XServiceInfo, XLocalizable):
    def __init__(self, ctx, *args):
        self.ctx = ctx
        self.locale = Locale("en", "US", "")

    # XAddIn: what the Function Wizard shows ("Funtion" is the interface's spelling).
    def getProgrammaticFuntionName(self, display):
        return BY_DISPLAY.get(display.upper(), "")

    def getDisplayFunctionName(self, name):
        return BY_METHOD[name]["display"] if name in BY_METHOD else ""

    def getFunctionDescription(self, name):
        return BY_METHOD[name]["description"] if name in BY_METHOD else ""

    def getDisplayArgumentName(self, name, n):
        args = BY_METHOD[name]["args"] if name in BY_METHOD else []
        return args[n][0] if 0 <= n < len(args) else ""

    def getArgumentDescription(self, name, n):
        args = BY_METHOD[name]["args"] if name in BY_METHOD else []
        return args[n][1] if 0 <= n < len(args) else ""

    def getProgrammaticCategoryName(self, name):
        return CATEGORY

    def getDisplayCategoryName(self, name):
        return CATEGORY

    # XLocalizable
    def setLocale(self, locale):
        self.locale = locale

    def getLocale(self):
        return self.locale

    # XServiceName, XServiceInfo
    def getServiceName(self):
        return SERVICE

    def getImplementationName(self):
        return IMPLEMENTATION

    def supportsService(self, name):
        return name in (SERVICE, ADDIN_SERVICE)

    def getSupportedServiceNames(self):
        return (SERVICE, ADDIN_SERVICE)


for _f in FUNCTIONS:
    setattr(StrataFunctions, _f["method"], method(_f))

g_ImplementationHelper = unohelper.ImplementationHelper()
g_ImplementationHelper.addImplementation(StrataFunctions, IMPLEMENTATION, (SERVICE, ADDIN_SERVICE))
