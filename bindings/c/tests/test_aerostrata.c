/*
 * C tests of libaerostrata: the reference vectors of tests/vectors (the same files the
 * Rust tests read), every status, NULL arguments, bad arrays, outputs written only on
 * success, and handle lifetimes. Built as C99 with -Wall -Wextra -Werror -pedantic
 * against the static and the shared library, and run under AddressSanitizer with
 * UBSan and under Valgrind by `cargo xtask test` (crates/xtask/src/c/c_test.rs).
 *
 * Usage: test_aerostrata VECTOR_DIR        Ends with "N passed, N failed".
 */
#include "aerostrata.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int passed = 0;
static int failed = 0;

static void check(int ok, const char *what, int line) {
    if (ok) {
        passed++;
    } else {
        failed++;
        printf("FAIL line %d: %s\n", line, what);
    }
}
#define CHECK(cond) check((cond) ? 1 : 0, #cond, __LINE__)

/* The status a call returned, and that the thread's detail agrees with it. */
static int status_is(AerostrataStatus got, AerostrataStatus want, int line) {
    AerostrataErrorDetail d;
    int ok = got == want;
    if (!ok) {
        printf("FAIL line %d: status %d (%s), want %d\n", line, (int)got, aerostrata_status_message((int)got),
               (int)want);
    }
    if (aerostrata_last_error(&d) != AEROSTRATA_STATUS_OK || d.status != got) {
        printf("FAIL line %d: the detail's status %d differs from the returned %d\n", line, (int)d.status,
               (int)got);
        ok = 0;
    }
    return ok;
}
#define STATUS(call, want) check(status_is((call), (want), __LINE__), #call, __LINE__)

/* ------------------------------------------------------------------ vectors */

#define MAX_COLUMNS 32
#define MAX_LINE 4096

enum rule { RULE_NONE, RULE_PRINTED, RULE_REL, RULE_ABS };

struct column {
    char name[64];
    enum rule rule;
    double amount;
};

/* Half a unit of the last digit written in `cell` ("1.2250E+00" -> 5e-5). */
static double printed_tolerance(const char *cell) {
    const char *p = cell;
    int decimals = 0;
    int exponent = 0;
    const char *dot;
    const char *e;
    while (*p == ' ' || *p == '+' || *p == '-') {
        p++;
    }
    dot = strchr(p, '.');
    e = strpbrk(p, "eE");
    if (dot != NULL && (e == NULL || dot < e)) {
        const char *end = e != NULL ? e : dot + strlen(dot);
        while (end > dot + 1 && (end[-1] == '\r' || end[-1] == '\n' || end[-1] == ' ')) {
            end--;
        }
        decimals = (int)(end - dot - 1);
    }
    if (e != NULL) {
        exponent = atoi(e + 1);
    }
    return 0.5 * pow(10.0, (double)(exponent - decimals));
}

static int parse_tolerance(const char *text, struct column *columns, int count) {
    char name[64];
    char rule[16];
    double amount = 0.0;
    int i;
    int fields = sscanf(text, "%63s %15s %lf", name, rule, &amount);
    if (fields < 2) {
        return 0;
    }
    for (i = 0; i < count; i++) {
        if (strcmp(columns[i].name, name) == 0) {
            return 0; /* a repeated tolerance line */
        }
    }
    if (count >= MAX_COLUMNS) {
        return 0;
    }
    strcpy(columns[count].name, name);
    if (strcmp(rule, "printed") == 0) {
        columns[count].rule = RULE_PRINTED;
    } else if (strcmp(rule, "rel") == 0 && fields == 3) {
        columns[count].rule = RULE_REL;
    } else if (strcmp(rule, "abs") == 0 && fields == 3) {
        columns[count].rule = RULE_ABS;
    } else {
        return 0;
    }
    columns[count].amount = amount;
    return 1;
}

/* The computed value for a vector column, found through the quantity catalogue (the
 * column is the quantity's SI column name); 0 when the state does not carry it. */
static int us1976_value(const AerostrataState *s, const char *name, double *value) {
    uint32_t id;
    AerostrataQuantityInfo info;
    for (id = 0; id < aerostrata_quantity_count(); id++) {
        if (aerostrata_quantity_info(id, &info) == AEROSTRATA_STATUS_OK && strcmp(info.si_column, name) == 0) {
            return aerostrata_state_get(s, id, value) == AEROSTRATA_STATUS_OK;
        }
    }
    return 0;
}

static int shock_value(const AerostrataNormalShock *s, const char *name, double *value) {
    if (strcmp(name, "m2") == 0) {
        *value = s->downstream_mach;
    } else if (strcmp(name, "p2_p1") == 0) {
        *value = s->pressure_ratio;
    } else if (strcmp(name, "rho2_rho1") == 0) {
        *value = s->density_ratio;
    } else if (strcmp(name, "t2_t1") == 0) {
        *value = s->temperature_ratio;
    } else if (strcmp(name, "p02_p01") == 0) {
        *value = s->total_pressure_ratio;
    } else if (strcmp(name, "p1_p02") == 0) {
        *value = 1.0 / s->pitot_pressure_ratio; /* the table prints the reciprocal */
    } else {
        return 0;
    }
    return 1;
}

enum vector_model { MODEL_US1976, MODEL_SHOCK };

/* Checks every cell of one vector file; returns the number of cells checked. */
static int check_vector_file(const char *dir, const char *file, enum vector_model model) {
    char path[1024];
    char line[MAX_LINE];
    struct column tolerances[MAX_COLUMNS];
    int tolerance_count = 0;
    char header[MAX_COLUMNS][64];
    int header_count = 0;
    int have_model = 0;
    int cells = 0;
    int skipped = 0;
    FILE *f;
    snprintf(path, sizeof path, "%s/%s", dir, file);
    f = fopen(path, "r");
    if (f == NULL) {
        printf("FAIL: cannot open %s\n", path);
        failed++;
        return 0;
    }
    while (fgets(line, sizeof line, f) != NULL) {
        char *cell;
        char *save;
        int col;
        line[strcspn(line, "\r\n")] = '\0';
        if (line[0] == '#') {
            if (strncmp(line, "# model: ", 9) == 0) {
                const char *want = model == MODEL_US1976 ? "us1976" : "normal_shock gamma=1.4";
                check(strcmp(line + 9, want) == 0, "the file's model is the one tested", __LINE__);
                have_model = 1;
            } else if (strncmp(line, "# tolerance: ", 13) == 0) {
                check(parse_tolerance(line + 13, tolerances, tolerance_count), line, __LINE__);
                tolerance_count++;
            }
            continue;
        }
        if (line[0] == '\0') {
            continue;
        }
        if (header_count == 0) {
            /* The header: every column but the first needs a tolerance line. */
            for (cell = strtok(line, ","); cell != NULL && header_count < MAX_COLUMNS; cell = strtok(NULL, ",")) {
                strncpy(header[header_count], cell, 63);
                header[header_count][63] = '\0';
                header_count++;
            }
            check(header_count - 1 == tolerance_count, "one tolerance line per value column", __LINE__);
            for (col = 1; col < header_count; col++) {
                int found = 0;
                int t;
                for (t = 0; t < tolerance_count; t++) {
                    found |= strcmp(tolerances[t].name, header[col]) == 0;
                }
                check(found, header[col], __LINE__);
            }
            continue;
        }
        {
            /* A data row: split keeping empty cells. */
            char *cells_text[MAX_COLUMNS];
            int n = 0;
            double input;
            AerostrataState state;
            AerostrataNormalShock shock;
            AerostrataStatus status;
            cell = line;
            while (n < MAX_COLUMNS) {
                cells_text[n++] = cell;
                save = strchr(cell, ',');
                if (save == NULL) {
                    break;
                }
                *save = '\0';
                cell = save + 1;
            }
            input = strtod(cells_text[0], NULL);
            if (model == MODEL_US1976) {
                status = aerostrata_us1976_state(input, AEROSTRATA_GEOMETRIC, 0.0, &state);
            } else {
                status = aerostrata_normal_shock(AEROSTRATA_GAMMA_AIR, input, &shock);
            }
            if (status != AEROSTRATA_STATUS_OK) {
                printf("FAIL %s: input %s gives status %d\n", file, cells_text[0], (int)status);
                failed++;
                continue;
            }
            for (col = 1; col < n && col < header_count; col++) {
                double reference;
                double computed;
                double tolerance = 0.0;
                int t;
                int known;
                if (cells_text[col][0] == '\0') {
                    continue;
                }
                known = model == MODEL_US1976 ? us1976_value(&state, header[col], &computed)
                                              : shock_value(&shock, header[col], &computed);
                if (!known) {
                    skipped++;
                    continue;
                }
                reference = strtod(cells_text[col], NULL);
                for (t = 0; t < tolerance_count; t++) {
                    if (strcmp(tolerances[t].name, header[col]) == 0) {
                        switch (tolerances[t].rule) {
                        case RULE_PRINTED:
                            tolerance = printed_tolerance(cells_text[col]);
                            break;
                        case RULE_REL:
                            tolerance = tolerances[t].amount * fabs(reference);
                            break;
                        case RULE_ABS:
                            tolerance = tolerances[t].amount;
                            break;
                        case RULE_NONE:
                            break;
                        }
                    }
                }
                cells++;
                if (fabs(computed - reference) <= tolerance) {
                    passed++;
                } else {
                    failed++;
                    printf("FAIL %s: %s at %s: computed %.10g, reference %s, tolerance %.3g\n", file, header[col],
                           cells_text[0], computed, cells_text[col], tolerance);
                }
            }
        }
    }
    fclose(f);
    check(have_model, "the file names its model", __LINE__);
    printf("%s: %d cells checked, %d cells of quantities without a C function (species) skipped\n", file, cells,
           skipped);
    return cells;
}

/* ------------------------------------------------------------------ statuses */

static void test_status_messages(void) {
    int s;
    for (s = 0; s <= AEROSTRATA_STATUS_NOT_CARRIED; s++) {
        const char *m = aerostrata_status_message(s);
        int t;
        CHECK(m != NULL && strlen(m) > 0 && strcmp(m, "unknown status") != 0);
        for (t = 0; t < s; t++) {
            CHECK(strcmp(m, aerostrata_status_message(t)) != 0);
        }
    }
    CHECK(strcmp(aerostrata_status_message(-1), "unknown status") == 0);
    CHECK(strcmp(aerostrata_status_message(AEROSTRATA_STATUS_NOT_CARRIED + 1), "unknown status") == 0);
    CHECK(strcmp(aerostrata_status_message(1000000), "unknown status") == 0);
    CHECK(AEROSTRATA_STATUS_OK == 0 && AEROSTRATA_STATUS_PANIC == 1 && AEROSTRATA_STATUS_NULL_POINTER == 2);
    CHECK(aerostrata_last_error(NULL) == AEROSTRATA_STATUS_NULL_POINTER);
    CHECK(strcmp(aerostrata_version(), AEROSTRATA_VERSION_STRING) == 0);
}

static void test_detail(void) {
    AerostrataState s;
    AerostrataErrorDetail d;
    double out = 0.0;
    STATUS(aerostrata_us1976_state(2.0e6, AEROSTRATA_GEOMETRIC, 0.0, &s), AEROSTRATA_STATUS_OUT_OF_RANGE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK);
    CHECK(d.value == 2.0e6 && d.min == -5000.0 && d.max == 1.0e6 && d.index == -1);
    CHECK(strstr(d.message, "geometric altitude") != NULL && strstr(d.message, "1000000") != NULL);
    /* A success clears it. */
    STATUS(aerostrata_dynamic_pressure_pa(1.225, 100.0, &out), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.status == AEROSTRATA_STATUS_OK);
    CHECK(d.message[0] == '\0' && isnan(d.value) && d.index == -1);
    /* Reading it does not change it. */
    STATUS(aerostrata_us1976_state(NAN, AEROSTRATA_GEOMETRIC, 0.0, &s), AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.status == AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.status == AEROSTRATA_STATUS_NOT_FINITE);
}

/* Each reachable status, from a call that should give it; the output must be unchanged. */
static void test_every_status(void) {
    double out = -123.0;
    AerostrataState s;
    AerostrataModel *model = NULL;
    AerostrataDragCurve *curve = NULL;
    AerostrataNormalShock shock;
    AerostrataAirspeeds speeds;

    STATUS(aerostrata_dynamic_pressure_pa(1.0, 1.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_us1976_state(0.0, 7, 0.0, &s), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    STATUS(aerostrata_dynamic_pressure_pa(NAN, 1.0, &out), AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_dynamic_pressure_pa(-1.0, 1.0, &out), AEROSTRATA_STATUS_OUT_OF_RANGE);
    STATUS(aerostrata_mach_number(100.0, 0.0, &out), AEROSTRATA_STATUS_NOT_POSITIVE);
    {
        AerostrataLayerSpec bad[1] = {{-100.0, -0.0065}};
        STATUS(aerostrata_model_new_layers(0.0, 288.15, 101325.0, bad, 1, &model), AEROSTRATA_STATUS_INVALID_LAYER);
    }
    STATUS(aerostrata_normal_shock(AEROSTRATA_GAMMA_AIR, 0.5, &shock), AEROSTRATA_STATUS_RATIO_OUT_OF_RANGE);
    STATUS(aerostrata_drag_curve_new_constant(0.0, &curve), AEROSTRATA_STATUS_RATIO_NOT_POSITIVE);
    {
        double mach[2] = {1.0, 0.5};
        double cd[2] = {0.5, 0.6};
        STATUS(aerostrata_drag_curve_new_table(mach, cd, 2, AEROSTRATA_LINEAR, &curve), AEROSTRATA_STATUS_INVALID_POINT);
    }
    {
        AerostrataSoundingRow one[1] = {{0.0, 288.0, 101325.0, 0.0, 0.0, 0.0, AEROSTRATA_ROW_PRESSURE}};
        STATUS(aerostrata_model_new_sounding(AEROSTRATA_GEOMETRIC, one, 1, &model), AEROSTRATA_STATUS_TOO_FEW_ROWS);
    }
    {
        /* One bad row per status of a sounding's rows. */
        struct {
            AerostrataSoundingRow rows[2];
            AerostrataStatus want;
        } cases[] = {
            {{{0, 288, 101325, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}, {1000, NAN, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_ROW_NOT_FINITE},
            {{{0, 288, 101325, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}, {0, 280, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_ALTITUDE_NOT_INCREASING},
            {{{0, 288, 101325, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}, {1000, -5, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_ROW_TEMPERATURE_NOT_POSITIVE},
            {{{0, 288, -1, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}, {1000, 280, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_ROW_NOT_POSITIVE},
            {{{0, 288, 90000, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}, {1000, 280, 95000, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}},
             AEROSTRATA_STATUS_PRESSURE_NOT_DECREASING},
            {{{0, 288, 101325, 0, 0, 150, AEROSTRATA_ROW_PRESSURE | AEROSTRATA_ROW_RELATIVE_HUMIDITY},
              {1000, 280, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_RELATIVE_HUMIDITY_OUT_OF_RANGE},
            {{{0, 288, 101325, 0, 300, 0, AEROSTRATA_ROW_PRESSURE | AEROSTRATA_ROW_DEW_POINT},
              {1000, 280, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_DEW_POINT_ABOVE_TEMPERATURE},
            {{{0, 288, 2.0e9, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}, {1000, 280, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_ROW_OUT_OF_RANGE},
            {{{0, 288, 101325, 1.2, 0, 0, AEROSTRATA_ROW_PRESSURE | AEROSTRATA_ROW_DENSITY},
              {1000, 280, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_ROW_COLUMNS},
            {{{0, 288, 101325, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}, {1000, 280, 50000, 0, 0, 0, AEROSTRATA_ROW_PRESSURE}},
             AEROSTRATA_STATUS_NOT_HYDROSTATIC},
            {{{0, 330, 5000, 0, 325, 0, AEROSTRATA_ROW_PRESSURE | AEROSTRATA_ROW_DEW_POINT},
              {1000, 325, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_VAPOUR_PRESSURE_TOO_HIGH},
            {{{0, 288, 101325, 0, 0, 0, AEROSTRATA_ROW_PRESSURE | 64}, {1000, 280, 0, 0, 0, 0, 0}},
             AEROSTRATA_STATUS_INVALID_ARGUMENT},
        };
        size_t i;
        for (i = 0; i < sizeof cases / sizeof cases[0]; i++) {
            AerostrataModel *m = NULL;
            AerostrataStatus got = aerostrata_model_new_sounding(AEROSTRATA_GEOMETRIC, cases[i].rows, 2, &m);
            if (got != cases[i].want) {
                AerostrataErrorDetail d;
                aerostrata_last_error(&d);
                printf("FAIL sounding case %u: status %d, want %d (%s)\n", (unsigned)i, (int)got, (int)cases[i].want,
                       d.message);
                failed++;
            } else {
                AerostrataErrorDetail d;
                aerostrata_last_error(&d);
                check(d.index >= 0 && d.index <= 1 && d.message[0] != '\0', "a row error names its row", __LINE__);
                passed++;
            }
            check(m == NULL, "a failed _new leaves the handle unwritten", __LINE__);
            aerostrata_model_free(m);
        }
    }
    STATUS(aerostrata_us1976_state(150000.0, AEROSTRATA_GEOMETRIC, 0.0, &s), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_mach_number(100.0, s.speed_of_sound_m_s, &out), AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_airspeeds(101325.0, 288.15, 9, 100.0, &speeds), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    CHECK(out == -123.0);
    CHECK(model == NULL && curve == NULL);
    /* UNDEFINED through the flight scan is not reachable (the scan reports undefined
     * values as NaN with flags); PANIC, NO_CONVERGENCE, STORAGE_TOO_SMALL and
     * OTHER_ERROR have no input that gives them through this interface (the panic
     * boundary is tested in the Rust unit tests of bindings/c/src/error.rs). */
}

/* ------------------------------------------------------------------ models */

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

static void test_models(void) {
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

static void test_batches(void) {
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

/* ------------------------------------------------------------------ helpers */

static void test_helpers(void) {
    double out = 0.0;
    AerostrataIsentropic ise;
    AerostrataNormalShock shock;
    AerostrataAirspeeds speeds;
    double qc = 0.0;

    STATUS(aerostrata_dynamic_pressure_pa(1.225, 100.0, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 6125.0) < 1e-9);
    STATUS(aerostrata_dynamic_pressure_from_mach_pa(101325.0, 0.5, AEROSTRATA_GAMMA_AIR, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 0.7 * 101325.0 * 0.25) < 1e-9);
    STATUS(aerostrata_dynamic_pressure_from_mach_pa(101325.0, 0.5, 3.0, &out), AEROSTRATA_STATUS_RATIO_OUT_OF_RANGE);
    STATUS(aerostrata_drag_n(1000.0, 0.5, 0.01, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 5.0) < 1e-12);
    STATUS(aerostrata_mach_number(340.0, 340.0, &out), AEROSTRATA_STATUS_OK);
    CHECK(out == 1.0);
    /* V = M a, the definition of the Mach number (common practice, no source). */
    STATUS(aerostrata_velocity_from_mach_m_s(0.5, 340.0, &out), AEROSTRATA_STATUS_OK);
    CHECK(out == 170.0);
    STATUS(aerostrata_velocity_from_mach_m_s(-0.5, 340.0, &out), AEROSTRATA_STATUS_RATIO_OUT_OF_RANGE);
    STATUS(aerostrata_velocity_from_mach_m_s(0.5, 0.0, &out), AEROSTRATA_STATUS_NOT_POSITIVE);
    STATUS(aerostrata_velocity_from_mach_m_s(0.5, 340.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_reynolds_number(1.225, 50.0, 0.1, 1.7894e-5, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 1.225 * 5.0 / 1.7894e-5) < 1e-6);
    STATUS(aerostrata_reynolds_number(1.225, 50.0, 0.1, 0.0, &out), AEROSTRATA_STATUS_NOT_POSITIVE);
    STATUS(aerostrata_knudsen_number(0.01, 1.0, &out), AEROSTRATA_STATUS_OK);
    CHECK(out == 0.01);
    STATUS(aerostrata_ballistic_coefficient_kg_m2(4.0, 0.5, 7.85e-3, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 1019.1) < 0.1);

    /* NACA Report 1135 at Mach 2 (as the core's doctest): p/p0 .12780, T/T0 .55556. */
    STATUS(aerostrata_isentropic(AEROSTRATA_GAMMA_AIR, 2.0, &ise), AEROSTRATA_STATUS_OK);
    CHECK(fabs(ise.pressure_ratio - 0.12780) <= 0.5e-5 && fabs(ise.temperature_ratio - 0.55556) <= 0.5e-5);
    STATUS(aerostrata_mach_from_pressure_ratio(AEROSTRATA_GAMMA_AIR, ise.pressure_ratio, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 2.0) < 1e-12);
    STATUS(aerostrata_isentropic(AEROSTRATA_GAMMA_AIR, -1.0, &ise), AEROSTRATA_STATUS_RATIO_OUT_OF_RANGE);
    STATUS(aerostrata_isentropic(AEROSTRATA_GAMMA_AIR, 2.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_normal_shock(AEROSTRATA_GAMMA_AIR, 2.0, &shock), AEROSTRATA_STATUS_OK);
    CHECK(fabs(shock.downstream_mach - 0.57735) < 1e-5 && fabs(shock.pressure_ratio - 4.5) < 1e-12);
    STATUS(aerostrata_normal_shock(AEROSTRATA_GAMMA_AIR, 2.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);

    STATUS(aerostrata_impact_pressure_pa(AEROSTRATA_GAMMA_AIR, 50000.0, 0.8, &qc), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_mach_from_impact_pressure_ratio(AEROSTRATA_GAMMA_AIR, qc / 50000.0, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 0.8) < 1e-9);
    STATUS(aerostrata_mach_from_impact_pressure_ratio(AEROSTRATA_GAMMA_AIR, -1.0, &out),
           AEROSTRATA_STATUS_RATIO_OUT_OF_RANGE);

    /* The core's doctest: ISA at 10 000 m pressure altitude, Mach 0.8. */
    STATUS(aerostrata_airspeeds_at_pressure_altitude(10000.0, 223.15, AEROSTRATA_MACH, 0.8, &speeds),
           AEROSTRATA_STATUS_OK);
    CHECK(fabs(speeds.true_m_s - 239.5706) < 1e-4 && fabs(speeds.equivalent_m_s - 139.0549) < 1e-4);
    CHECK(fabs(speeds.calibrated_m_s - 146.9851) < 1e-4);
    {
        AerostrataAirspeeds back;
        STATUS(aerostrata_airspeeds_at_pressure_altitude(10000.0, 223.15, AEROSTRATA_CALIBRATED,
                                                         speeds.calibrated_m_s, &back),
               AEROSTRATA_STATUS_OK);
        CHECK(fabs(back.mach - 0.8) < 1e-9);
        STATUS(aerostrata_airspeeds(101325.0, 288.15, AEROSTRATA_TRUE, 100.0, &back), AEROSTRATA_STATUS_OK);
        CHECK(fabs(back.calibrated_m_s - 100.0) < 1e-9 && fabs(back.equivalent_m_s - 100.0) < 1e-9);
        STATUS(aerostrata_airspeeds(101325.0, 288.15, AEROSTRATA_EQUIVALENT, -5.0, &back),
               AEROSTRATA_STATUS_OUT_OF_RANGE);
        STATUS(aerostrata_airspeeds(101325.0, -1.0, AEROSTRATA_TRUE, 100.0, &back), AEROSTRATA_STATUS_NOT_POSITIVE);
        STATUS(aerostrata_airspeeds(101325.0, 288.15, AEROSTRATA_TRUE, 100.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    }

    STATUS(aerostrata_pressure_altitude_m(22632.06, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 11000.0) < 0.01);
    STATUS(aerostrata_pressure_altitude_m(0.0, &out), AEROSTRATA_STATUS_NOT_POSITIVE);
    STATUS(aerostrata_density_altitude_m(1.2250, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out) < 0.5);
    STATUS(aerostrata_density_altitude_from_m(101325.0, 308.15, &out), AEROSTRATA_STATUS_OK);
    CHECK(fabs(out - 693.5136) < 1e-4);
    STATUS(aerostrata_barometric_altitude_m(98000.0, AEROSTRATA_REFERENCE_PAD, 98000.0, &out), AEROSTRATA_STATUS_OK);
    CHECK(out == 0.0);
    {
        double standard = 0.0;
        STATUS(aerostrata_barometric_altitude_m(90000.0, AEROSTRATA_REFERENCE_STANDARD, NAN, &standard),
               AEROSTRATA_STATUS_OK);
        STATUS(aerostrata_barometric_altitude_m(90000.0, AEROSTRATA_REFERENCE_QNH, 101325.0, &out),
               AEROSTRATA_STATUS_OK);
        CHECK(out == standard);
        STATUS(aerostrata_pressure_altitude_m(90000.0, &out), AEROSTRATA_STATUS_OK);
        CHECK(out == standard);
    }
    STATUS(aerostrata_barometric_altitude_m(90000.0, AEROSTRATA_REFERENCE_QNH, 1.0e6, &out),
           AEROSTRATA_STATUS_OUT_OF_RANGE);
    STATUS(aerostrata_barometric_altitude_m(90000.0, 3, 1.0, &out), AEROSTRATA_STATUS_INVALID_ARGUMENT);
}

/* ------------------------------------------------------------------ drag and flight */

static void test_flight(void) {
    /* An invented small rocket's drag rise. */
    double mach[5] = {0.0, 0.8, 1.05, 1.5, 3.0};
    double cd[5] = {0.45, 0.43, 0.68, 0.55, 0.40};
    double t[4] = {0.0, 1.0, 2.0, 3.0};
    double z[4] = {0.0, 100.0, 400.0, 900.0};
    double v[4] = {0.0, 200.0, 400.0, 300.0};
    AerostrataDragCurve *curve = NULL;
    AerostrataDragCurve *constant = NULL;
    AerostrataModel *model = NULL;
    AerostrataFlightPoint points[4];
    AerostrataFlightSummary summary;
    AerostrataFlightSummary sentinel;
    AerostrataErrorDetail d;
    double value = 0.0;

    STATUS(aerostrata_drag_curve_new_table(mach, cd, 5, AEROSTRATA_MONOTONE_CUBIC, &curve), AEROSTRATA_STATUS_OK);
    cd[2] = -1.0; /* copied */
    STATUS(aerostrata_drag_curve_cd(curve, 1.05, &value), AEROSTRATA_STATUS_OK);
    CHECK(value == 0.68);
    STATUS(aerostrata_drag_curve_cd(curve, 0.9, &value), AEROSTRATA_STATUS_OK);
    CHECK(value > 0.43 && value < 0.68);
    STATUS(aerostrata_drag_curve_cd(curve, 5.0, &value), AEROSTRATA_STATUS_OK);
    CHECK(value == 0.40);
    STATUS(aerostrata_drag_curve_cd(curve, NAN, &value), AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_drag_curve_cd(NULL, 1.0, &value), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_drag_curve_cd(curve, 1.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    /* Bad tables: a negative Cd, too short, NaN, unsorted, NULL, unknown interpolation. */
    STATUS(aerostrata_drag_curve_new_table(mach, cd, 5, AEROSTRATA_LINEAR, &constant), AEROSTRATA_STATUS_INVALID_POINT);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2 && d.value == -1.0);
    cd[2] = 0.68;
    STATUS(aerostrata_drag_curve_new_table(mach, cd, 1, AEROSTRATA_LINEAR, &constant), AEROSTRATA_STATUS_INVALID_POINT);
    mach[1] = NAN;
    STATUS(aerostrata_drag_curve_new_table(mach, cd, 5, AEROSTRATA_LINEAR, &constant), AEROSTRATA_STATUS_INVALID_POINT);
    mach[1] = 2.0;
    STATUS(aerostrata_drag_curve_new_table(mach, cd, 5, AEROSTRATA_LINEAR, &constant), AEROSTRATA_STATUS_INVALID_POINT);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2);
    mach[1] = 0.8;
    STATUS(aerostrata_drag_curve_new_table(NULL, cd, 5, AEROSTRATA_LINEAR, &constant), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_drag_curve_new_table(mach, cd, 5, 2, &constant), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    STATUS(aerostrata_drag_curve_new_table(mach, cd, 5, AEROSTRATA_LINEAR, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    CHECK(constant == NULL);
    STATUS(aerostrata_drag_curve_new_constant(150.0, &constant), AEROSTRATA_STATUS_RATIO_OUT_OF_RANGE);
    STATUS(aerostrata_drag_curve_new_constant(0.5, &constant), AEROSTRATA_STATUS_OK);

    STATUS(aerostrata_model_new_us1976(0.0, &model), AEROSTRATA_STATUS_OK);
    /* As the core's doctest: one Mach 1 crossing up (between samples 1 and 2), one down
     * (between 2 and 3, at 300 m/s), maximum q at sample 2. */
    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, t, z, v, 4, points, &summary), AEROSTRATA_STATUS_OK);
    CHECK(summary.samples == 4 && summary.has_max_q == 1 && summary.max_q_sample_index == 2);
    CHECK(summary.mach_one_up_count == 1 && summary.mach_one_down_count == 1);
    CHECK(summary.mach_one_down_first_time_s > 2.0 && summary.mach_one_down_last_time_s < 3.0);
    CHECK(summary.mach_one_up_first_time_s > 1.0 && summary.mach_one_up_first_time_s < 2.0);
    CHECK(summary.has_max_drag == 0 && isnan(summary.max_drag_n) && summary.max_q_refined == 1);
    CHECK(points[2].defined == (AEROSTRATA_POINT_MACH | AEROSTRATA_POINT_REYNOLDS_PER_M) && isnan(points[2].drag_n));
    CHECK(isnan(points[2].reynolds_number) && points[2].reynolds_per_m > 0.0);
    {
        double q = 0.0;
        STATUS(aerostrata_dynamic_pressure_pa(points[2].density_kg_m3, 400.0, &q), AEROSTRATA_STATUS_OK);
        CHECK(q == points[2].dynamic_pressure_pa);
    }
    STATUS(aerostrata_flight_scan(model, curve, 0.00785, 0.1, t, z, v, 4, points, &summary), AEROSTRATA_STATUS_OK);
    CHECK(summary.has_max_drag == 1 && summary.max_drag_n > 0.0);
    CHECK(points[3].defined == (AEROSTRATA_POINT_MACH | AEROSTRATA_POINT_REYNOLDS_PER_M |
                                AEROSTRATA_POINT_REYNOLDS_NUMBER | AEROSTRATA_POINT_DRAG));
    {
        double drag = 0.0;
        STATUS(aerostrata_drag_n(points[3].dynamic_pressure_pa, points[3].drag_coefficient, 0.00785, &drag),
               AEROSTRATA_STATUS_OK);
        CHECK(drag == points[3].drag_n);
    }
    {
        /* Every field by its quantity id, through the catalogue. */
        double got = 0.0;
        STATUS(aerostrata_flight_point_get(&points[3], AEROSTRATA_QUANTITY_DRAG, &got), AEROSTRATA_STATUS_OK);
        CHECK(got == points[3].drag_n);
        STATUS(aerostrata_flight_point_get(&points[3], AEROSTRATA_QUANTITY_MACH, &got), AEROSTRATA_STATUS_OK);
        CHECK(got == points[3].mach);
        STATUS(aerostrata_flight_point_get(&points[3], AEROSTRATA_QUANTITY_TIME, &got), AEROSTRATA_STATUS_OK);
        CHECK(got == 3.0);
        STATUS(aerostrata_flight_point_get(&points[3], AEROSTRATA_QUANTITY_GRAVITY, &got),
               AEROSTRATA_STATUS_NOT_CARRIED);
    }
    STATUS(aerostrata_flight_scan(model, constant, 0.01, 0.0, t, z, v, 4, NULL, &summary), AEROSTRATA_STATUS_OK);
    CHECK(summary.has_max_drag == 1 && summary.max_drag_sample_index == 2);

    /* Failures: nothing written. */
    memset(&sentinel, 0x33, sizeof sentinel);
    memcpy(&summary, &sentinel, sizeof sentinel);
    t[2] = 0.5; /* unsorted times */
    STATUS(aerostrata_flight_scan(model, curve, 0.01, 0.1, t, z, v, 4, points, &summary),
           AEROSTRATA_STATUS_INVALID_POINT);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2);
    CHECK(memcmp(&summary, &sentinel, sizeof sentinel) == 0);
    t[2] = 2.0;
    z[3] = NAN;
    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, t, z, v, 4, points, &summary), AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 3);
    z[3] = 900.0;
    STATUS(aerostrata_flight_scan(model, curve, -1.0, 0.0, t, z, v, 4, points, &summary), AEROSTRATA_STATUS_NOT_POSITIVE);
    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, NULL, z, v, 4, points, &summary),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, t, z, v, 4, points, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_scan(NULL, NULL, 0.0, 0.0, t, z, v, 4, points, &summary), AEROSTRATA_STATUS_NULL_POINTER);
    CHECK(memcmp(&summary, &sentinel, sizeof sentinel) == 0);
    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, NULL, NULL, NULL, 0, NULL, &summary), AEROSTRATA_STATUS_OK);
    CHECK(summary.samples == 0 && summary.has_max_q == 0 && isnan(summary.max_q_pa));

    /* Terminal velocity. A constant Cd has the closed form V = sqrt(2 m g / (rho Cd A))
     * (common practice, no source), with rho and g of the same state. */
    {
        AerostrataState sl;
        double vt = 0.0, closed, before = -7.0;
        STATUS(aerostrata_model_state(model, 0.0, AEROSTRATA_GEOMETRIC, &sl), AEROSTRATA_STATUS_OK);
        STATUS(aerostrata_terminal_velocity_m_s(model, 0.0, AEROSTRATA_GEOMETRIC, 0.5, 0.8, constant, &vt),
               AEROSTRATA_STATUS_OK);
        closed = sqrt(2.0 * 0.5 * sl.gravity_m_s2 / (sl.density_kg_m3 * 0.5 * 0.8));
        CHECK(fabs(vt - closed) <= 1e-14 * closed);
        /* With the drag rise: at the speed found, drag balances weight. */
        STATUS(aerostrata_model_state(model, 3000.0, AEROSTRATA_GEOMETRIC, &sl), AEROSTRATA_STATUS_OK);
        STATUS(aerostrata_terminal_velocity_m_s(model, 3000.0, AEROSTRATA_GEOMETRIC, 40.0, 0.00785, curve, &vt),
               AEROSTRATA_STATUS_OK);
        {
            double cd_at = 0.0;
            STATUS(aerostrata_drag_curve_cd(curve, vt / sl.speed_of_sound_m_s, &cd_at), AEROSTRATA_STATUS_OK);
            CHECK(fabs(0.5 * sl.density_kg_m3 * vt * vt * cd_at * 0.00785 / (40.0 * sl.gravity_m_s2) - 1.0) < 1e-9);
        }
        vt = before;
        STATUS(aerostrata_terminal_velocity_m_s(model, 120000.0, AEROSTRATA_GEOMETRIC, 40.0, 0.00785, curve, &vt),
               AEROSTRATA_STATUS_UNDEFINED);
        STATUS(aerostrata_terminal_velocity_m_s(model, 0.0, AEROSTRATA_GEOMETRIC, -1.0, 0.8, constant, &vt),
               AEROSTRATA_STATUS_NOT_POSITIVE);
        STATUS(aerostrata_terminal_velocity_m_s(model, 0.0, 7, 1.0, 0.8, constant, &vt),
               AEROSTRATA_STATUS_INVALID_ARGUMENT);
        STATUS(aerostrata_terminal_velocity_m_s(model, 0.0, AEROSTRATA_GEOMETRIC, 1.0, 0.8, NULL, &vt),
               AEROSTRATA_STATUS_NULL_POINTER);
        STATUS(aerostrata_terminal_velocity_m_s(NULL, 0.0, AEROSTRATA_GEOMETRIC, 1.0, 0.8, constant, &vt),
               AEROSTRATA_STATUS_NULL_POINTER);
        STATUS(aerostrata_terminal_velocity_m_s(model, 0.0, AEROSTRATA_GEOMETRIC, 1.0, 0.8, constant, NULL),
               AEROSTRATA_STATUS_NULL_POINTER);
        CHECK(vt == before);
    }

    aerostrata_drag_curve_free(curve);
    aerostrata_drag_curve_free(constant);
    aerostrata_drag_curve_free(NULL);
    aerostrata_model_free(model);
}

/* ------------------------------------------------------------------ spreadsheet */

static void test_spreadsheet(void) {
    AerostrataState s;
    double a;
    STATUS(aerostrata_us1976_state(5000.0, AEROSTRATA_GEOMETRIC, 10.0, &s), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_xl_temperature_k(5000.0, 10.0) == s.temperature_k);
    CHECK(aerostrata_xl_pressure_pa(5000.0, 10.0) == s.pressure_pa);
    CHECK(aerostrata_xl_density(5000.0, 10.0) == s.density_kg_m3);
    CHECK(aerostrata_xl_speed_of_sound(5000.0, 10.0) == s.speed_of_sound_m_s);
    CHECK(aerostrata_xl_dynamic_viscosity(5000.0, 10.0) == s.dynamic_viscosity_pa_s);
    CHECK(aerostrata_xl_kinematic_viscosity(5000.0, 10.0) == s.kinematic_viscosity_m2_s);
    CHECK(aerostrata_xl_dynamic_pressure(s.density_kg_m3, 100.0) == 0.5 * s.density_kg_m3 * 100.0 * 100.0);
    CHECK(fabs(aerostrata_xl_mach(5000.0, 10.0, s.speed_of_sound_m_s) - 1.0) < 1e-15);
    CHECK(fabs(aerostrata_xl_pressure_altitude(22632.06) - 11000.0) < 0.01);
    CHECK(fabs(aerostrata_xl_density_altitude(1.2250)) < 0.5);
    a = aerostrata_xl_true_airspeed(146.9851, 10000.0, 223.15);
    CHECK(fabs(a - 239.5706) < 1e-3);
    CHECK(fabs(aerostrata_xl_calibrated_airspeed(a, 10000.0, 223.15) - 146.9851) < 1e-9);
    CHECK(isnan(aerostrata_xl_density(NAN, 0.0)) && isnan(aerostrata_xl_density(2.0e6, 0.0)));
    CHECK(isnan(aerostrata_xl_speed_of_sound(150000.0, 0.0)) && isnan(aerostrata_xl_mach(150000.0, 0.0, 10.0)));
    CHECK(isnan(aerostrata_xl_pressure_altitude(-1.0)) && isnan(aerostrata_xl_true_airspeed(-1.0, 0.0, 288.15)));
    CHECK(isnan(aerostrata_xl_dynamic_pressure(INFINITY, 1.0)));
}

static void test_species(void) {
    AerostrataSpecies n, before;
    AerostrataState s;
    double total;
    /* The standard's boundary values at 86 km. */
    STATUS(aerostrata_us1976_species(86000.0, AEROSTRATA_GEOMETRIC, &n), AEROSTRATA_STATUS_OK);
    CHECK(fabs(n.n2_m3 / 1.129794e20 - 1.0) < 1e-12 && fabs(n.o_m3 / 8.6e16 - 1.0) < 1e-12);
    CHECK(n.h_m3 == 0.0 && n.o2_m3 > 0.0 && n.ar_m3 > 0.0 && n.he_m3 > 0.0);
    /* Consistent with the full state's number density. */
    STATUS(aerostrata_us1976_species(300000.0, AEROSTRATA_GEOMETRIC, &n), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_us1976_state(300000.0, AEROSTRATA_GEOMETRIC, 0.0, &s), AEROSTRATA_STATUS_OK);
    total = n.n2_m3 + n.o_m3 + n.o2_m3 + n.ar_m3 + n.he_m3 + n.h_m3;
    CHECK(fabs(total / s.number_density_m3 - 1.0) < 1e-9 && n.h_m3 > 0.0 && n.o_m3 > n.n2_m3);
    /* Errors leave the output alone. */
    before = n;
    STATUS(aerostrata_us1976_species(50000.0, AEROSTRATA_GEOMETRIC, &n), AEROSTRATA_STATUS_OUT_OF_RANGE);
    STATUS(aerostrata_us1976_species(NAN, AEROSTRATA_GEOMETRIC, &n), AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_us1976_species(100000.0, 9, &n), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    CHECK(memcmp(&n, &before, sizeof n) == 0);
    STATUS(aerostrata_us1976_species(100000.0, AEROSTRATA_GEOMETRIC, NULL), AEROSTRATA_STATUS_NULL_POINTER);
}

/* ------------------------------------------------------------------ catalogue */

static void test_catalogue(void) {
    AerostrataQuantityInfo info;
    AerostrataState s, high;
    uint32_t id, back;
    double v, us;
    /* The ids are part of the ABI: these never change (common practice for a stable C ABI). */
    CHECK(AEROSTRATA_QUANTITY_GEOMETRIC_ALTITUDE == 0 && AEROSTRATA_QUANTITY_TEMPERATURE == 2);
    CHECK(AEROSTRATA_QUANTITY_DENSITY_RATIO == 19 && AEROSTRATA_QUANTITY_MACH == 29);
    CHECK(aerostrata_quantity_count() == AEROSTRATA_QUANTITY_COUNT);
    STATUS(aerostrata_us1976_state(11000.0, AEROSTRATA_GEOPOTENTIAL, 0.0, &s), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_us1976_state(120000.0, AEROSTRATA_GEOMETRIC, 0.0, &high), AEROSTRATA_STATUS_OK);
    for (id = 0; id < AEROSTRATA_QUANTITY_COUNT; id++) {
        STATUS(aerostrata_quantity_info(id, &info), AEROSTRATA_STATUS_OK);
        CHECK(info.id == id && strlen(info.name) > 0 && strlen(info.label) > 0 && strlen(info.symbol) > 0);
        CHECK(strncmp(info.si_column, info.name, strlen(info.name)) == 0);
        STATUS(aerostrata_quantity_from_name(info.name, &back), AEROSTRATA_STATUS_OK);
        CHECK(back == id);
        /* US units round-trip (common practice, no source). */
        STATUS(aerostrata_quantity_to_us(id, 288.15, &us), AEROSTRATA_STATUS_OK);
        STATUS(aerostrata_quantity_from_us(id, us, &v), AEROSTRATA_STATUS_OK);
        CHECK(fabs(v / 288.15 - 1.0) < 1e-14);
        if (info.group == AEROSTRATA_GROUP_STATE) {
            STATUS(aerostrata_state_get(&s, id, &v), AEROSTRATA_STATUS_OK);
            CHECK(isfinite(v));
            STATUS(aerostrata_state_get(&high, id, &v),
                   info.may_be_undefined ? AEROSTRATA_STATUS_UNDEFINED : AEROSTRATA_STATUS_OK);
        } else {
            STATUS(aerostrata_state_get(&s, id, &v), AEROSTRATA_STATUS_NOT_CARRIED);
        }
    }
    /* The accessor reads the very field (U.S. Standard Atmosphere 1976: 216.65 K at 11 km
     * geopotential). */
    STATUS(aerostrata_state_get(&s, AEROSTRATA_QUANTITY_TEMPERATURE, &v), AEROSTRATA_STATUS_OK);
    CHECK(v == s.temperature_k && fabs(v - 216.65) < 1e-9);
    STATUS(aerostrata_quantity_to_us(AEROSTRATA_QUANTITY_TEMPERATURE, 288.15, &v), AEROSTRATA_STATUS_OK);
    CHECK(v == 59.0);
    STATUS(aerostrata_quantity_from_name("temperature", &back), AEROSTRATA_STATUS_OK);
    CHECK(back == AEROSTRATA_QUANTITY_TEMPERATURE);
    /* Errors leave the outputs alone. */
    v = 42.0;
    back = 7;
    STATUS(aerostrata_quantity_info(AEROSTRATA_QUANTITY_COUNT, &info), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    STATUS(aerostrata_state_get(&s, AEROSTRATA_QUANTITY_COUNT, &v), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    STATUS(aerostrata_state_get(&s, 0xFFFFFFFFu, &v), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    STATUS(aerostrata_quantity_from_name("Temperature", &back), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    STATUS(aerostrata_quantity_to_us(AEROSTRATA_QUANTITY_TEMPERATURE, NAN, &v), AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(v == 42.0 && back == 7);
    STATUS(aerostrata_state_get(NULL, 0, &v), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_state_get(&s, 0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_quantity_from_name(NULL, &back), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_quantity_info(0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_point_get(NULL, 0, &v), AEROSTRATA_STATUS_NULL_POINTER);
}

int main(int argc, char **argv) {
    const char *dir = argc > 1 ? argv[1] : "tests/vectors";
    int cells = 0;
    test_status_messages();
    test_detail();
    test_every_status();
    test_models();
    test_batches();
    test_helpers();
    test_flight();
    test_spreadsheet();
    test_species();
    test_catalogue();
    cells += check_vector_file(dir, "usa76_lower.csv", MODEL_US1976);
    cells += check_vector_file(dir, "usa76_upper.csv", MODEL_US1976);
    cells += check_vector_file(dir, "usa76_upper_high.csv", MODEL_US1976);
    cells += check_vector_file(dir, "naca1135_normal_shock.csv", MODEL_SHOCK);
    check(cells > 300, "the vector files hold the cells they should", __LINE__);
    printf("%d passed, %d failed\n", passed, failed);
    return failed == 0 ? 0 : 1;
}
