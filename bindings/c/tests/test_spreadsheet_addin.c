/*
 * The spreadsheet add-in's functions (aerostrata_xl_state and the model-spec variants):
 * every one against the status-returning functions of the same library, bit for bit, so
 * that a cell and a C program agree; the published values through them are checked by
 * the add-in's own test (cargo xtask addin --check) and, for the status-returning
 * functions, by test_vectors.c. Errors are NaN, never 0.
 */
#include "check.h"

#include <stdlib.h>

/* Every state quantity at altitudes across the standard, from the spec and the offset
 * variant, against aerostrata_us1976_state + aerostrata_state_get. */
static void state_by_id(void) {
    static const double altitudes[] = {-5000.0, 0.0, 1000.0, 11000.0, 20000.0, 47000.0, 85999.0, 86000.0, 150000.0, 999000.0};
    static const double offsets[] = {0.0, 15.0, -25.5};
    static const char *const offset_specs[] = {NULL, "offset=+15K", "offset=-25.5K"};
    size_t i, k;
    uint32_t id;
    int compared = 0;
    for (i = 0; i < sizeof altitudes / sizeof altitudes[0]; i++) {
        for (k = 0; k < sizeof offsets / sizeof offsets[0]; k++) {
            AerostrataState s;
            STATUS(aerostrata_us1976_state(altitudes[i], AEROSTRATA_GEOMETRIC, offsets[k], &s), AEROSTRATA_STATUS_OK);
            for (id = 0; id < 20; id++) {
                double want;
                double by_spec = aerostrata_xl_state(id, altitudes[i], offset_specs[k]);
                double by_offset = aerostrata_xl_state_offset(id, altitudes[i], offsets[k]);
                if (aerostrata_state_get(&s, id, &want) == AEROSTRATA_STATUS_OK) {
                    check(memcmp(&by_spec, &want, sizeof want) == 0, "xl_state bits = state_get bits", __LINE__);
                    check(memcmp(&by_offset, &want, sizeof want) == 0, "xl_state_offset bits = state_get", __LINE__);
                    compared++;
                } else {
                    /* Undefined above 86 km: NaN, not 0. */
                    check(isnan(by_spec) && isnan(by_offset), "undefined -> NaN", __LINE__);
                }
            }
        }
    }
    CHECK(compared > 500);
    /* The standard by NULL, "" and "standard" is one model. */
    CHECK(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 5000.0, "") ==
          aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 5000.0, "standard"));
    CHECK(aerostrata_xl_state(AEROSTRATA_QUANTITY_PRESSURE, 0.0, NULL) == 101325.0);
}

/* The spec variants of the other models against their model handles. */
static void state_by_spec(void) {
    AerostrataModel *hot = NULL;
    AerostrataModel *cold = NULL;
    AerostrataModel *iso = NULL;
    AerostrataState s;
    double want;
    STATUS(aerostrata_model_new_hydrostatic_offset(15.0, 101325.0, &hot), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_new_hydrostatic_offset(-25.0, 98000.0, &cold), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_new_isothermal(250.0, 101325.0, &iso), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_state(hot, 8000.0, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 8000.0, "hydrostatic-offset=+15K") == s.density_kg_m3);
    STATUS(aerostrata_model_state(cold, 3000.0, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_state(AEROSTRATA_QUANTITY_PRESSURE, 3000.0, "hydrostatic-offset=-25K,p0=980hPa") ==
          s.pressure_pa);
    STATUS(aerostrata_model_state(iso, 12000.0, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_state(AEROSTRATA_QUANTITY_TEMPERATURE, 12000.0, "isothermal=250K") == 250.0);
    STATUS(aerostrata_state_get(&s, AEROSTRATA_QUANTITY_SPEED_OF_SOUND, &want), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_state(AEROSTRATA_QUANTITY_SPEED_OF_SOUND, 12000.0, "isothermal=250K") == want);
    CHECK(aerostrata_xl_mach_at(12000.0, want, "isothermal=250K") == 1.0);
    STATUS(aerostrata_dynamic_pressure_pa(s.density_kg_m3, 200.0, &want), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_dynamic_pressure_at(12000.0, 200.0, "isothermal=250K") == want);
    {
        double drag;
        STATUS(aerostrata_drag_n(want, 0.45, 0.02, &drag), AEROSTRATA_STATUS_OK);
        CHECK(aerostrata_xl_drag(12000.0, 200.0, 0.45, 0.02, "isothermal=250K") == drag);
    }
    aerostrata_model_free(hot);
    aerostrata_model_free(cold);
    aerostrata_model_free(iso);
}

/* Altimetry, airspeeds and compressible flow against the status-returning functions. */
static void other_functions(void) {
    AerostrataAirspeeds a;
    AerostrataIsentropic ise;
    AerostrataNormalShock shock;
    double want;
    STATUS(aerostrata_barometric_altitude_m(90000.0, AEROSTRATA_REFERENCE_QNH, 100500.0, &want), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_qnh_altitude(90000.0, 100500.0) == want);
    STATUS(aerostrata_airspeeds_at_pressure_altitude(3000.0, 270.0, AEROSTRATA_CALIBRATED, 80.0, &a),
           AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_airspeed(AEROSTRATA_QUANTITY_CALIBRATED_AIRSPEED, AEROSTRATA_QUANTITY_TRUE_AIRSPEED, 80.0,
                                 3000.0, 270.0) == a.true_m_s);
    CHECK(aerostrata_xl_airspeed(AEROSTRATA_QUANTITY_CALIBRATED_AIRSPEED, AEROSTRATA_QUANTITY_EQUIVALENT_AIRSPEED,
                                 80.0, 3000.0, 270.0) == a.equivalent_m_s);
    CHECK(aerostrata_xl_airspeed(AEROSTRATA_QUANTITY_CALIBRATED_AIRSPEED, AEROSTRATA_QUANTITY_MACH, 80.0, 3000.0,
                                 270.0) == a.mach);
    CHECK(fabs(aerostrata_xl_airspeed(AEROSTRATA_QUANTITY_TRUE_AIRSPEED, AEROSTRATA_QUANTITY_CALIBRATED_AIRSPEED,
                                      a.true_m_s, 3000.0, 270.0) - 80.0) < 1e-9);
    CHECK(aerostrata_xl_true_airspeed(80.0, 3000.0, 270.0) == a.true_m_s);
    STATUS(aerostrata_isentropic(1.4, 2.5, &ise), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_isentropic_pressure_ratio(2.5) == ise.pressure_ratio);
    CHECK(aerostrata_xl_isentropic_temperature_ratio(2.5) == ise.temperature_ratio);
    CHECK(aerostrata_xl_isentropic_density_ratio(2.5) == ise.density_ratio);
    STATUS(aerostrata_normal_shock(1.4, 2.0, &shock), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_normal_shock_mach(2.0) == shock.downstream_mach);
    CHECK(aerostrata_xl_normal_shock_pressure_ratio(2.0) == shock.pressure_ratio);
    CHECK(aerostrata_xl_normal_shock_density_ratio(2.0) == shock.density_ratio);
    CHECK(aerostrata_xl_normal_shock_temperature_ratio(2.0) == shock.temperature_ratio);
    CHECK(aerostrata_xl_normal_shock_total_pressure_ratio(2.0) == shock.total_pressure_ratio);
    /* NACA Report 1135, Table II, M1 = 2: p2/p1 = 4.5000 (an exact value of the formula). */
    CHECK(fabs(aerostrata_xl_normal_shock_pressure_ratio(2.0) - 4.5) < 1e-12);
}

/* Every error is NaN: bad ids, specs, altitudes, NaN inputs, undefined properties. */
static void errors_are_nan(void) {
    CHECK(isnan(aerostrata_xl_state(20, 1000.0, NULL)));   /* a species, not the state */
    CHECK(isnan(aerostrata_xl_state(9999, 1000.0, NULL)));  /* no such id */
    CHECK(isnan(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 2.0e6, NULL)));
    CHECK(isnan(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, NAN, NULL)));
    CHECK(isnan(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 1000.0, "offset=288")));
    CHECK(isnan(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 1000.0, "warm")));
    CHECK(isnan(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 1000.0, "sounding=day.csv")));
    CHECK(isnan(aerostrata_xl_state(AEROSTRATA_QUANTITY_DENSITY, 1000.0, "\xff\xfe")));
    CHECK(isnan(aerostrata_xl_state_offset(AEROSTRATA_QUANTITY_DENSITY, 1000.0, INFINITY)));
    CHECK(isnan(aerostrata_xl_state(AEROSTRATA_QUANTITY_SPEED_OF_SOUND, 100000.0, NULL)));
    CHECK(aerostrata_xl_model_valid(NULL) == 1.0 && aerostrata_xl_model_valid("isothermal=250K") == 1.0);
    CHECK(isnan(aerostrata_xl_model_valid("isothermal=-3K")) && isnan(aerostrata_xl_model_valid("layers=x.csv")));
    CHECK(isnan(aerostrata_xl_mach_at(100000.0, 300.0, NULL)));
    CHECK(isnan(aerostrata_xl_dynamic_pressure_at(1000.0, NAN, NULL)));
    CHECK(isnan(aerostrata_xl_drag(1000.0, 100.0, -1.0, 0.1, NULL)));
    CHECK(isnan(aerostrata_xl_qnh_altitude(90000.0, 0.01)));
    CHECK(isnan(aerostrata_xl_airspeed(AEROSTRATA_QUANTITY_MACH, AEROSTRATA_QUANTITY_TRUE_AIRSPEED, 0.5, 0.0, 288.15)));
    CHECK(isnan(aerostrata_xl_airspeed(AEROSTRATA_QUANTITY_TRUE_AIRSPEED, AEROSTRATA_QUANTITY_DENSITY, 50.0, 0.0, 288.15)));
    CHECK(isnan(aerostrata_xl_isentropic_pressure_ratio(-1.0)));
    CHECK(isnan(aerostrata_xl_normal_shock_mach(0.5)));
}

void test_spreadsheet_addin(void) {
    state_by_id();
    state_by_spec();
    other_functions();
    errors_are_nan();
}
