/*
 * Handle misuse the library catches: a handle used after its _free, freed twice, passed
 * where a handle of another type belongs, a pointer that is no handle, NULL. Each gives
 * AEROSTRATA_STATUS_INVALID_HANDLE (NULL_POINTER for NULL) with a message that says
 * which, writes no output, and reads no freed memory: the freed handle's header waits in
 * the library's quarantine, so AddressSanitizer and Valgrind see only live memory
 * (docs/c-guide.md, "Handles that catch misuse"). The expected behaviour is the
 * library's own contract (common practice, no source).
 */
#include "check.h"

/* The thread's detail message contains `text`. */
static int message_has(const char *text) {
    AerostrataErrorDetail d;
    if (aerostrata_last_error(&d) != AEROSTRATA_STATUS_OK) return 0;
    if (strstr(d.message, text) == NULL) {
        printf("  message: %s\n  wanted:  %s\n", d.message, text);
        return 0;
    }
    return 1;
}

static void test_freed_model(void) {
    AerostrataModel *model = NULL;
    AerostrataState s;
    double lo = -1.0, hi = -1.0;

    STATUS(aerostrata_model_new_isothermal(250.0, 101325.0, &model), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_state(model, 0.0, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_model_free(model) == AEROSTRATA_STATUS_OK);

    /* Used after free: every call that takes the model says so, and writes nothing. */
    s.temperature_k = -1.0;
    STATUS(aerostrata_model_state(model, 0.0, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("model: this model was freed by aerostrata_model_free already; "
                      "a handle must not be used after it is freed"));
    CHECK(s.temperature_k == -1.0);
    STATUS(aerostrata_model_range_geometric_m(model, &lo, &hi), AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(lo == -1.0 && hi == -1.0);

    /* Freed twice: refused, with its own sentence. */
    STATUS(aerostrata_model_free(model), AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("this model was freed by aerostrata_model_free already; a handle must be freed once"));
    CHECK(strcmp(aerostrata_status_message(AEROSTRATA_STATUS_INVALID_HANDLE),
                 "a handle was freed already, is of another type, or is not a handle") == 0);
}

static void test_freed_curve_and_winds(void) {
    AerostrataModel *model = NULL;
    AerostrataDragCurve *curve = NULL;
    AerostrataWindProfile *winds = NULL;
    AerostrataWind w;
    double out = -1.0;
    double z[2] = {0.0, 1000.0};
    double east[2] = {5.0, 10.0};
    double north[2] = {0.0, 0.0};

    STATUS(aerostrata_model_new_us1976(0.0, &model), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_drag_curve_new_constant(0.5, &curve), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_drag_curve_free(curve) == AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_drag_curve_cd(curve, 0.5, &out), AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("curve: this drag curve was freed by aerostrata_drag_curve_free already"));
    STATUS(aerostrata_terminal_velocity_m_s(model, 0.0, AEROSTRATA_GEOMETRIC, 1.0, 0.01, curve, &out),
           AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(out == -1.0);
    STATUS(aerostrata_drag_curve_free(curve), AEROSTRATA_STATUS_INVALID_HANDLE);

    STATUS(aerostrata_wind_profile_new(z, east, north, 2, &winds), AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_wind_profile_free(winds) == AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_wind_profile_at(winds, 500.0, &w), AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("profile: this wind profile was freed by aerostrata_wind_profile_free already"));
    STATUS(aerostrata_wind_profile_free(winds), AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(aerostrata_model_free(model) == AEROSTRATA_STATUS_OK);
}

static void test_wrong_type(void) {
    AerostrataModel *model = NULL;
    AerostrataDragCurve *curve = NULL;
    AerostrataState s;
    double cd = -1.0;

    STATUS(aerostrata_model_new_us1976(0.0, &model), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_drag_curve_new_constant(0.5, &curve), AEROSTRATA_STATUS_OK);
    /* A curve where a model belongs, and the other way round. */
    STATUS(aerostrata_model_state((const AerostrataModel *)(const void *)curve, 0.0, AEROSTRATA_GEOMETRIC, &s),
           AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("model: got a drag curve handle (made by aerostrata_drag_curve_new_*) "
                      "where a model handle belongs"));
    STATUS(aerostrata_drag_curve_cd((const AerostrataDragCurve *)(const void *)model, 0.5, &cd),
           AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("curve: got a model handle"));
    CHECK(cd == -1.0);
    /* Freeing through the wrong _free is refused and releases nothing: both still work. */
    STATUS(aerostrata_model_free((AerostrataModel *)(void *)curve), AEROSTRATA_STATUS_INVALID_HANDLE);
    STATUS(aerostrata_drag_curve_cd(curve, 0.5, &cd), AEROSTRATA_STATUS_OK);
    CHECK(cd == 0.5);
    STATUS(aerostrata_model_state(model, 0.0, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_OK);
    /* A freed handle of another type is named as such. */
    CHECK(aerostrata_drag_curve_free(curve) == AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_state((const AerostrataModel *)(const void *)curve, 0.0, AEROSTRATA_GEOMETRIC, &s),
           AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("got a freed drag curve handle"));
    CHECK(aerostrata_model_free(model) == AEROSTRATA_STATUS_OK);
}

static void test_not_a_handle(void) {
    /* Readable memory that holds no handle tag (zeros, then a state record), and a
     * misaligned address, which is refused before anything is read. */
    double zeros[4] = {0.0, 0.0, 0.0, 0.0};
    AerostrataState s;
    AerostrataState record;
    memset(&record, 0, sizeof record);
    record.temperature_k = 288.15;

    STATUS(aerostrata_model_state((const AerostrataModel *)(const void *)zeros, 0.0, AEROSTRATA_GEOMETRIC, &s),
           AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(message_has("model: not a model made by aerostrata (no handle tag at this address)"));
    STATUS(aerostrata_model_state((const AerostrataModel *)(const void *)&record, 0.0, AEROSTRATA_GEOMETRIC, &s),
           AEROSTRATA_STATUS_INVALID_HANDLE);
    STATUS(aerostrata_model_state((const AerostrataModel *)(const void *)((const char *)zeros + 1), 0.0,
                                  AEROSTRATA_GEOMETRIC, &s),
           AEROSTRATA_STATUS_INVALID_HANDLE);
    STATUS(aerostrata_model_free((AerostrataModel *)(void *)zeros), AEROSTRATA_STATUS_INVALID_HANDLE);
    CHECK(zeros[0] == 0.0 && zeros[1] == 0.0);
    /* NULL: its own status for a call, nothing at all for a free. */
    STATUS(aerostrata_model_state(NULL, 0.0, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_NULL_POINTER);
    CHECK(message_has("model must not be NULL"));
    CHECK(aerostrata_model_free(NULL) == AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_drag_curve_free(NULL) == AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_wind_profile_free(NULL) == AEROSTRATA_STATUS_OK);
}

/* Cleanup between a failure and the reading of its detail keeps the detail: a _free that
 * succeeds does not write it. */
static void test_free_keeps_the_detail(void) {
    AerostrataModel *model = NULL;
    AerostrataState s;
    AerostrataErrorDetail d;

    STATUS(aerostrata_model_new_us1976(0.0, &model), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_model_state(model, 2.0e6, AEROSTRATA_GEOMETRIC, &s), AEROSTRATA_STATUS_OUT_OF_RANGE);
    CHECK(aerostrata_model_free(model) == AEROSTRATA_STATUS_OK);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.status == AEROSTRATA_STATUS_OUT_OF_RANGE);
    CHECK(d.value == 2.0e6);
}

void test_handles(void) {
    test_freed_model();
    test_freed_curve_and_winds();
    test_wrong_type();
    test_not_a_handle();
    test_free_keeps_the_detail();
}
