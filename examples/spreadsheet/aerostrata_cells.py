"""aerostrata cell functions for LibreOffice Calc: a Python macro that loads the shared
library with ctypes and calls its `extern "system"` spreadsheet functions (plain doubles
in, one double out, NaN on any error).

The library is found through the AEROSTRATA_LIB environment variable (a full path to
libaerostrata.so), else by the loader's usual search for "libaerostrata.so". Put this
file in a profile's user/Scripts/python/ (or inside the .ods under Scripts/python/) so
that Calc lists it as a macro; runner.py also imports it directly.
"""

import ctypes
import os

_TWO_ARGS = (
    "aerostrata_xl_temperature_k",
    "aerostrata_xl_pressure_pa",
    "aerostrata_xl_density",
    "aerostrata_xl_speed_of_sound",
    "aerostrata_xl_dynamic_pressure",
)
_lib = None


def library():
    """The shared library, loaded once, with the signatures declared."""
    global _lib
    if _lib is None:
        lib = ctypes.CDLL(os.environ.get("AEROSTRATA_LIB", "libaerostrata.so"))
        for name in _TWO_ARGS:
            f = getattr(lib, name)
            f.argtypes = [ctypes.c_double, ctypes.c_double]
            f.restype = ctypes.c_double
        f = lib.aerostrata_xl_mach
        f.argtypes = [ctypes.c_double, ctypes.c_double, ctypes.c_double]
        f.restype = ctypes.c_double
        _lib = lib
    return _lib


def temperature_k(altitude_m, offset_k=0.0):
    """Temperature, K, of the 1976 standard plus offset_k at geometric altitude_m."""
    return library().aerostrata_xl_temperature_k(float(altitude_m), float(offset_k))


def pressure_pa(altitude_m, offset_k=0.0):
    """Pressure, Pa, at geometric altitude_m."""
    return library().aerostrata_xl_pressure_pa(float(altitude_m), float(offset_k))


def density(altitude_m, offset_k=0.0):
    """Density, kg/m^3, of the 1976 standard plus offset_k at geometric altitude_m."""
    return library().aerostrata_xl_density(float(altitude_m), float(offset_k))


def speed_of_sound(altitude_m, offset_k=0.0):
    """Speed of sound, m/s (NaN above 86 km)."""
    return library().aerostrata_xl_speed_of_sound(float(altitude_m), float(offset_k))


def dynamic_pressure(density_kg_m3, velocity_m_s):
    """Dynamic pressure rho V^2 / 2, Pa, computed by the library."""
    return library().aerostrata_xl_dynamic_pressure(float(density_kg_m3), float(velocity_m_s))


def mach(altitude_m, offset_k, velocity_m_s):
    """Mach number of velocity_m_s at geometric altitude_m (NaN above 86 km)."""
    return library().aerostrata_xl_mach(float(altitude_m), float(offset_k), float(velocity_m_s))


g_exportedScripts = (temperature_k, pressure_pa, density, speed_of_sound, dynamic_pressure, mach)
