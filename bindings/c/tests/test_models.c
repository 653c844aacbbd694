/*
 * Model handles (the standard, offsets, exponential, isothermal, user layers, soundings)
 * and batch evaluation: results, failures that write nothing, NULL arguments.
 */
#include "check.h"

/* Field by field (a struct's padding bytes are not comparable); NaN equals NaN. */
static int same_state(const AerostrataState *a, const AerostrataState *b) {
    const double *x = &a->geometric_altitude_m;
    const double *y = &b->geometric_altitude_m;
    int i;
    for (i = 0; i < 20; i++) {
        if (!(x[i] == y[i] || (isnan(x[i]) && isnan(y[i])))) {
            return 0;
        }
    }
    return a->defined == b->defined;
}

void test_models(void) {
    AerostrataModel *standard = NULL;
    AerostrataModel *hot = NULL;
    AerostrataModel *expo = NULL;
    AerostrataModel *iso = NULL;
    AerostrataModel *layers = NULL;
    AerostrataModel *sounding = NULL;
    AerostrataState a;
    AerostrataState b;
    double lo = 0.0;
    double hi = 0.0;

    STATUS(aerostrata_model_new_us1976(0.0, &standard), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_new_us1976(15.0, &hot), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_new_us1976(NAN, &hot), AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_model_new_us1976(0.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    CHECK(hot != NULL && standard != NULL);

    STATUS(aerostrata_model_state(standard, 11000.0, AEROSTRATA_GEOPOTENTIAL, &a), AEROSTRATA_STATUS_OK);
    CHECK(a.temperature_k == 216.65 && a.defined == AEROSTRATA_DEFINED_CONTINUUM);
    CHECK(fabs(a.pressure_pa - 22632.06) < 0.01);
    STATUS(aerostrata_us1976_state(11000.0, AEROSTRATA_GEOPOTENTIAL, 0.0, &b), AEROSTRATA_STATUS_OK);
    CHECK(same_state(&a, &b));
    STATUS(aerostrata_model_state(hot, 0.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_OK);
    CHECK(fabs(a.temperature_k - 303.15) < 1e-12 && a.pressure_pa == 101325.0);
    STATUS(aerostrata_us1976_state(0.0, AEROSTRATA_GEOMETRIC, 15.0, &b), AEROSTRATA_STATUS_OK);
    CHECK(same_state(&a, &b));
    STATUS(aerostrata_model_range_geometric_m(standard, &lo, &hi), AEROSTRATA_STATUS_OK);
    CHECK(lo == -5000.0 && hi == 1.0e6);
    STATUS(aerostrata_model_range_geometric_m(standard, NULL, &hi), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_model_state(NULL, 0.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_model_state(standard, 0.0, AEROSTRATA_GEOMETRIC, NULL), AEROSTRATA_STATUS_NULL_POINTER);

    /* Above 86 km: the continuum fields are NaN and flagged. */
    STATUS(aerostrata_model_state(standard, 300000.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_OK);
    CHECK(a.defined == 0 && isnan(a.speed_of_sound_m_s) && isnan(a.dynamic_viscosity_pa_s));
    CHECK(isnan(a.kinematic_viscosity_m2_s) && isnan(a.thermal_conductivity_w_m_k) && a.density_kg_m3 > 0.0);

    STATUS(aerostrata_model_new_exponential(1.225, 8500.0, 288.15, &expo), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_state(expo, 8500.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_OK);
    CHECK(fabs(a.density_kg_m3 - 1.225 / exp(1.0)) < 1e-12);
    STATUS(aerostrata_model_new_exponential(1.225, -1.0, 288.15, &iso), AEROSTRATA_STATUS_NOT_POSITIVE);
    CHECK(iso == NULL);
    STATUS(aerostrata_model_new_isothermal(250.0, 100000.0, &iso), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_state(iso, 5000.0, AEROSTRATA_GEOPOTENTIAL, &a), AEROSTRATA_STATUS_OK);
    CHECK(a.temperature_k == 250.0 && a.pressure_pa < 100000.0);

    {
        /* User layers that copy the standard's first two: same state. */
        AerostrataLayerSpec specs[2] = {{11000.0, -0.0065}, {20000.0, 0.0}};
        STATUS(aerostrata_model_new_layers(0.0, 288.15, 101325.0, specs, 2, &layers), AEROSTRATA_STATUS_OK);
        specs[0].lapse_rate_k_m = 99.0; /* copied: changing the array now has no effect */
        STATUS(aerostrata_model_state(layers, 15000.0, AEROSTRATA_GEOPOTENTIAL, &a), AEROSTRATA_STATUS_OK);
        STATUS(aerostrata_us1976_state(15000.0, AEROSTRATA_GEOPOTENTIAL, 0.0, &b), AEROSTRATA_STATUS_OK);
        CHECK(fabs(a.temperature_k - b.temperature_k) < 1e-9 && fabs(a.pressure_pa / b.pressure_pa - 1.0) < 1e-12);
        STATUS(aerostrata_model_state(layers, 20001.0, AEROSTRATA_GEOPOTENTIAL, &a), AEROSTRATA_STATUS_OUT_OF_RANGE);
        STATUS(aerostrata_model_new_layers(0.0, 288.15, 101325.0, NULL, 2, &iso), AEROSTRATA_STATUS_NULL_POINTER);
        STATUS(aerostrata_model_new_layers(0.0, 288.15, 101325.0, NULL, 0, &iso), AEROSTRATA_STATUS_INVALID_LAYER);
        specs[0].lapse_rate_k_m = NAN;
        STATUS(aerostrata_model_new_layers(0.0, 288.15, 101325.0, specs, 2, &iso), AEROSTRATA_STATUS_INVALID_LAYER);
    }
    {
        /* An invented three-row sounding, pressure on the first row only. */
        AerostrataSoundingRow rows[3] = {
            {10.0, 301.15, 100900.0, 0.0, 295.15, 0.0, AEROSTRATA_ROW_PRESSURE | AEROSTRATA_ROW_DEW_POINT},
            {1500.0, 291.65, 0.0, 0.0, 0.0, 60.0, AEROSTRATA_ROW_RELATIVE_HUMIDITY},
            {4000.0, 276.15, 0.0, 0.0, 0.0, 0.0, 0},
        };
        AerostrataErrorDetail d;
        STATUS(aerostrata_model_new_sounding(AEROSTRATA_GEOMETRIC, rows, 3, &sounding), AEROSTRATA_STATUS_OK);
        rows[0].temperature_k = -1.0; /* copied */
        STATUS(aerostrata_model_state(sounding, 10.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_OK);
        CHECK(fabs(a.temperature_k - 301.15) < 1e-9 && fabs(a.pressure_pa - 100900.0) < 1e-6);
        STATUS(aerostrata_model_state(sounding, 3000.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_OK);
        CHECK(a.temperature_k < 291.65 && a.temperature_k > 276.15 && a.pressure_pa < 100900.0);
        STATUS(aerostrata_model_state(sounding, 4001.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_OUT_OF_RANGE);
        /* Unsorted rows: the detail names the row. */
        rows[0].temperature_k = 301.15;
        rows[2].altitude_m = 1000.0;
        STATUS(aerostrata_model_new_sounding(AEROSTRATA_GEOMETRIC, rows, 3, &iso),
               AEROSTRATA_STATUS_ALTITUDE_NOT_INCREASING);
        CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2);
        STATUS(aerostrata_model_new_sounding(AEROSTRATA_GEOMETRIC, NULL, 3, &iso), AEROSTRATA_STATUS_NULL_POINTER);
        STATUS(aerostrata_model_new_sounding(AEROSTRATA_GEOMETRIC, rows, 0, &iso), AEROSTRATA_STATUS_TOO_FEW_ROWS);
        STATUS(aerostrata_model_new_sounding(5, rows, 3, &iso), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    }
    CHECK(iso != NULL); /* still the isothermal model: no failed _new overwrote it */
    STATUS(aerostrata_model_state(iso, 0.0, AEROSTRATA_GEOMETRIC, &a), AEROSTRATA_STATUS_OK);
    CHECK(a.temperature_k == 250.0);

    aerostrata_model_free(standard);
    aerostrata_model_free(hot);
    aerostrata_model_free(expo);
    aerostrata_model_free(iso);
    aerostrata_model_free(layers);
    aerostrata_model_free(sounding);
    aerostrata_model_free(NULL);
    passed++;
}

void test_batches(void) {
    double altitudes[4] = {0.0, 5000.0, 11000.0, 90000.0};
    AerostrataState states[4];
    AerostrataState sentinel;
    double t[4], p[4], rho[4];
    double untouched[4] = {-1.0, -1.0, -1.0, -1.0};
    AerostrataModel *model = NULL;
    AerostrataErrorDetail d;
    int i;

    STATUS(aerostrata_model_new_us1976(0.0, &model), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_states(model, altitudes, 4, AEROSTRATA_GEOMETRIC, states), AEROSTRATA_STATUS_OK);
    for (i = 0; i < 4; i++) {
        AerostrataState one;
        STATUS(aerostrata_model_state(model, altitudes[i], AEROSTRATA_GEOMETRIC, &one), AEROSTRATA_STATUS_OK);
        CHECK(same_state(&one, &states[i]));
    }
    CHECK(states[3].defined == 0 && states[0].defined == AEROSTRATA_DEFINED_CONTINUUM);
    STATUS(aerostrata_model_columns(model, altitudes, 4, AEROSTRATA_GEOMETRIC, t, p, rho), AEROSTRATA_STATUS_OK);
    for (i = 0; i < 4; i++) {
        CHECK(t[i] == states[i].temperature_k && p[i] == states[i].pressure_pa &&
              rho[i] == states[i].density_kg_m3);
    }
    STATUS(aerostrata_model_columns(model, altitudes, 4, AEROSTRATA_GEOMETRIC, NULL, NULL, untouched),
           AEROSTRATA_STATUS_OK);
    CHECK(untouched[2] == states[2].density_kg_m3);
    STATUS(aerostrata_us1976_states(altitudes, 4, AEROSTRATA_GEOMETRIC, 0.0, states), AEROSTRATA_STATUS_OK);
    CHECK(states[1].temperature_k == t[1]);

    /* A bad element: nothing written, the detail names it. */
    altitudes[2] = NAN;
    memset(&sentinel, 0x5a, sizeof sentinel);
    for (i = 0; i < 4; i++) {
        memcpy(&states[i], &sentinel, sizeof sentinel);
        untouched[i] = -1.0;
    }
    STATUS(aerostrata_model_states(model, altitudes, 4, AEROSTRATA_GEOMETRIC, states), AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2);
    CHECK(strstr(d.message, "element 2") != NULL);
    for (i = 0; i < 4; i++) {
        CHECK(memcmp(&states[i], &sentinel, sizeof sentinel) == 0);
    }
    STATUS(aerostrata_model_columns(model, altitudes, 4, AEROSTRATA_GEOMETRIC, untouched, NULL, NULL),
           AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(untouched[0] == -1.0 && untouched[3] == -1.0);
    altitudes[2] = 2.0e6;
    STATUS(aerostrata_us1976_states(altitudes, 4, AEROSTRATA_GEOMETRIC, 0.0, states), AEROSTRATA_STATUS_OUT_OF_RANGE);
    CHECK(memcmp(&states[0], &sentinel, sizeof sentinel) == 0);

    /* NULL arrays, and the empty batch. */
    STATUS(aerostrata_model_states(model, NULL, 4, AEROSTRATA_GEOMETRIC, states), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_model_states(model, altitudes, 4, AEROSTRATA_GEOMETRIC, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_model_states(model, NULL, 0, AEROSTRATA_GEOMETRIC, NULL), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_states(NULL, altitudes, 4, AEROSTRATA_GEOMETRIC, states), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_us1976_states(NULL, 0, AEROSTRATA_GEOMETRIC, 0.0, NULL), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_us1976_states(altitudes, 2, 3, 0.0, states), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    aerostrata_model_free(model);
}
