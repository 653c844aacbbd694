/*
 * A small program that uses the installed C package as any C project would: it
 * includes <aerostrata.h> and links through pkg-config or CMake's find_package
 * (`cargo xtask c-package --check` builds it both ways from a copy of the package).
 * It prints the standard's sea level and fails (exit 1) on any value that is not the
 * published one.
 *
 * Sources: U.S. Standard Atmosphere 1976, Table I at 0 m: 288.150 K, 1.01325E+05 Pa,
 * 1.2250 kg/m^3; at 11 000 m geopotential (the first layer's top, lapse rate
 * -6.5 K/km: 288.15 - 71.5) 216.650 K and 2.2632E+04 Pa. q = rho V^2 / 2 at 1.225
 * kg/m^3 and 100 m/s is 6125 Pa (hand-worked). A temperature offset keeps the standard's
 * pressure (docs/models.md).
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include <aerostrata.h>

static int failures = 0;

static void check(const char *what, double got, double want, double tolerance) {
    if (!(fabs(got - want) <= tolerance)) {
        printf("FAILED: %s: %.10g, expected %.10g within %g\n", what, got, want, tolerance);
        failures++;
    }
}

int main(void) {
    AerostrataState s;
    AerostrataModel *hot = NULL;
    AerostrataErrorDetail detail;
    double q = 0.0;

    /* The library loaded is the one the header describes. */
    if (strcmp(aerostrata_version(), AEROSTRATA_VERSION_STRING) != 0) {
        printf("FAILED: library %s, header %s\n", aerostrata_version(), AEROSTRATA_VERSION_STRING);
        failures++;
    }

    if (aerostrata_us1976_state(0.0, AEROSTRATA_GEOMETRIC, 0.0, &s) != AEROSTRATA_STATUS_OK) {
        printf("FAILED: the standard at 0 m\n");
        return 1;
    }
    /* The line the build step reads back. */
    printf("sea level: %.3f K, %.1f Pa, %.4f kg/m3\n", s.temperature_k, s.pressure_pa, s.density_kg_m3);
    check("sea-level temperature, K", s.temperature_k, 288.15, 0.0005);
    check("sea-level pressure, Pa", s.pressure_pa, 101325.0, 0.5);
    check("sea-level density, kg/m3", s.density_kg_m3, 1.2250, 0.00005);

    if (aerostrata_us1976_state(11000.0, AEROSTRATA_GEOPOTENTIAL, 0.0, &s) != AEROSTRATA_STATUS_OK) {
        printf("FAILED: the standard at 11 000 m'\n");
        return 1;
    }
    check("temperature at 11 km', K", s.temperature_k, 216.65, 0.0005);
    check("pressure at 11 km', Pa", s.pressure_pa, 22632.0, 0.5);

    if (aerostrata_dynamic_pressure_pa(1.225, 100.0, &q) != AEROSTRATA_STATUS_OK) {
        printf("FAILED: dynamic pressure\n");
        return 1;
    }
    check("dynamic pressure, Pa", q, 6125.0, 1e-9);

    /* A handle: made, used and freed. */
    if (aerostrata_model_new_us1976(15.0, &hot) != AEROSTRATA_STATUS_OK
        || aerostrata_model_state(hot, 0.0, AEROSTRATA_GEOMETRIC, &s) != AEROSTRATA_STATUS_OK
        || aerostrata_model_free(hot) != AEROSTRATA_STATUS_OK) {
        printf("FAILED: the standard + 15 K through a model handle\n");
        return 1;
    }
    check("standard + 15 K at 0 m, K", s.temperature_k, 303.15, 0.0005);
    check("standard + 15 K at 0 m, Pa", s.pressure_pa, 101325.0, 0.5);

    /* An error is a status and a message naming the value, not a number. */
    if (aerostrata_us1976_state(2.0e6, AEROSTRATA_GEOMETRIC, 0.0, &s) != AEROSTRATA_STATUS_OUT_OF_RANGE
        || aerostrata_last_error(&detail) != AEROSTRATA_STATUS_OK
        || strstr(detail.message, "2000000") == NULL) {
        printf("FAILED: 2000 km was not refused with a message naming it\n");
        failures++;
    }

    printf("%s: %d failed\n", failures == 0 ? "ok" : "FAILED", failures);
    return failures == 0 ? 0 : 1;
}
