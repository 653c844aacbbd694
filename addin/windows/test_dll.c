/*
 * The spreadsheet functions of the aerostrata DLL loaded at run time, the way a
 * spreadsheet's macro language binds them (LoadLibrary + GetProcAddress, the stdcall
 * convention on 32-bit Windows): every export the macro module declares is present,
 * published values come back, errors are NaN, and a thousand calls through stdcall
 * pointers leave the stack intact. The same file built natively against the Linux
 * library (dlopen) prints the same "bits" lines: `cargo xtask addin --windows` compares
 * them, so the DLL gives the Linux library's numbers bit for bit.
 *
 *   test_dll LIBRARY EXPORTS_FILE     (EXPORTS_FILE: one function name a line)
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>

#ifdef _WIN32
#include <windows.h>
#define XL_CALL WINAPI /* __stdcall on 32-bit, the one convention on 64-bit */
typedef HMODULE library;
static library open_library(const char *path) { return LoadLibraryA(path); }
static void *symbol(library lib, const char *name) { return (void *)GetProcAddress(lib, name); }
#else
#include <dlfcn.h>
#define XL_CALL
typedef void *library;
static library open_library(const char *path) { return dlopen(path, RTLD_NOW); }
static void *symbol(library lib, const char *name) { return dlsym(lib, name); }
#endif

typedef double(XL_CALL *state_fn)(uint32_t, double, const char *);
typedef double(XL_CALL *d1_fn)(double);
typedef double(XL_CALL *d2_fn)(double, double);
typedef double(XL_CALL *at_fn)(double, double, const char *);
typedef double(XL_CALL *drag_fn)(double, double, double, double, const char *);
typedef double(XL_CALL *speed_fn)(uint32_t, uint32_t, double, double, double);

static int passed = 0;
static int failed = 0;

static void check(int ok, const char *what, double got) {
    if (ok) {
        passed++;
    } else {
        failed++;
        printf("FAIL %s (got %.17g)\n", what, got);
    }
}

/* Within `tol` of a published value; the source is in the message. */
static void print_bits(const char *what, double got) {
    uint64_t b;
    memcpy(&b, &got, sizeof b);
    printf("bits %s %016llx\n", what, (unsigned long long)b);
}

static void close_to(const char *what, double got, double want, double tol) {
    check(fabs(got - want) <= tol, what, got);
    print_bits(what, got);
}

/* A value only compared across platforms: defined, and printed as bits. */
static void bits(const char *what, double got) {
    check(!isnan(got), what, got);
    print_bits(what, got);
}

int main(int argc, char **argv) {
    library lib;
    FILE *exports;
    char name[128];
    int i, count = 0;
    state_fn state;
    d1_fn pressure_altitude, shock_p, isentropic_p;
    d2_fn qnh;
    at_fn mach, q;
    drag_fn drag;
    speed_fn airspeed;
    double acc = 0.0;
    if (argc < 3) {
        printf("usage: test_dll LIBRARY EXPORTS_FILE\n");
        return 2;
    }
    lib = open_library(argv[1]);
    if (!lib) {
        printf("FAIL cannot load %s\n", argv[1]);
        return 2;
    }
    printf("pointer size %d bytes\n", (int)sizeof(void *));
    exports = fopen(argv[2], "r");
    if (!exports) {
        printf("FAIL cannot read %s\n", argv[2]);
        return 2;
    }
    while (fscanf(exports, "%127s", name) == 1) {
        count++;
        check(symbol(lib, name) != NULL, name, 0.0);
    }
    fclose(exports);
    check(count > 20, "the exports file lists the functions", (double)count);

    state = (state_fn)symbol(lib, "aerostrata_xl_state");
    pressure_altitude = (d1_fn)symbol(lib, "aerostrata_xl_pressure_altitude");
    shock_p = (d1_fn)symbol(lib, "aerostrata_xl_normal_shock_pressure_ratio");
    isentropic_p = (d1_fn)symbol(lib, "aerostrata_xl_isentropic_pressure_ratio");
    qnh = (d2_fn)symbol(lib, "aerostrata_xl_qnh_altitude");
    mach = (at_fn)symbol(lib, "aerostrata_xl_mach_at");
    q = (at_fn)symbol(lib, "aerostrata_xl_dynamic_pressure_at");
    drag = (drag_fn)symbol(lib, "aerostrata_xl_drag");
    airspeed = (speed_fn)symbol(lib, "aerostrata_xl_airspeed");
    if (!state || !pressure_altitude || !shock_p || !isentropic_p || !qnh || !mach || !q || !drag || !airspeed) {
        printf("FAIL a function is missing\n");
        return 3;
    }
    /* U.S. Standard Atmosphere 1976 (tests/vectors/usa76_lower.csv), half a unit of the
     * last printed digit: rho = 3.6480E-01 kg/m3 and a = 295.15 m/s at 11 km, p = 101325 Pa
     * at 0, T = 216.650 K at 20 km. Ids: AEROSTRATA_QUANTITY_* (5 density, 6 speed of
     * sound, 4 pressure, 2 temperature). */
    close_to("density_11km", state(5, 11000.0, NULL), 0.36480, 0.5e-4);
    close_to("speed_of_sound_11km", state(6, 11000.0, NULL), 295.15, 0.005);
    close_to("pressure_0m", state(4, 0.0, ""), 101325.0, 0.0);
    close_to("temperature_20km", state(2, 20000.0, "standard"), 216.650, 0.0005);
    /* mpmath at 30 digits (tests/vectors/hydrostatic_offset_hot.csv, rel 1e-12): the
     * +15 K hydrostatic day's density at -4500 m. */
    close_to("density_hot_day", state(5, -4500.0, "hydrostatic-offset=+15K"), 1.7237002761062603,
         1e-12 * 1.7237);
    /* NACA Report 1135: p2/p1 = 4.5000 at M1 = 2 (Table II), p/p0 = .52828 at M = 1 (Table I). */
    close_to("shock_p2_p1_m2", shock_p(2.0), 4.5, 0.5e-4);
    close_to("isentropic_p_p0_m1", isentropic_p(1.0), 0.52828, 0.5e-5);
    /* The 1976 standard's 11 km layer base, 22632.06 Pa (geopotential). */
    close_to("pressure_altitude_11km", pressure_altitude(22632.06), 11000.0, 0.01);
    /* At standard sea level CAS = TAS (common practice, no source); ids 35 CAS, 37 TAS. */
    close_to("cas_to_tas_sea_level", airspeed(35, 37, 100.0, 0.0, 288.15), 100.0, 1e-9);
    bits("mach_5km", mach(5000.0, 250.0, "offset=+10K"));
    bits("q_5km", q(5000.0, 250.0, "isothermal=250K"));
    bits("drag_5km", drag(5000.0, 250.0, 0.3, 0.05, NULL));
    bits("qnh_altitude", qnh(90000.0, 100500.0));
    bits("tas_of_cas", airspeed(35, 37, 120.0, 6000.0, 240.0));
    /* Errors are NaN, never 0. */
    check(isnan(state(5, 2.0e6, NULL)), "altitude outside the model -> NaN", 0.0);
    check(isnan(state(5, 1000.0, "warm")), "a bad spec -> NaN", 0.0);
    check(isnan(state(6, 100000.0, NULL)), "undefined above 86 km -> NaN", 0.0);
    check(isnan(shock_p(0.5)), "subsonic shock -> NaN", 0.0);
    /* A convention mismatch would corrupt the stack within a few calls. */
    for (i = 0; i < 1000; i++) {
        acc += state(5, 11000.0, NULL) + drag(1000.0, 100.0, 0.5, 0.01, NULL);
    }
    check(fabs(acc / 1000.0 - (state(5, 11000.0, NULL) + drag(1000.0, 100.0, 0.5, 0.01, NULL))) < 1e-12,
          "1000 calls through the stdcall pointers", acc);
    printf("%d passed, %d failed\n", passed, failed);
    return failed == 0 ? 0 : 1;
}
