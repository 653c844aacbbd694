/*
 * Loads through winds aloft: wind profiles, the vector flight scan (airspeed, total angle
 * of attack, q-alpha, recovery temperature), the summary's honest maximum q and maximum
 * q-alpha, and limit exceedances; a NULL, a short array and a NaN at every entry point.
 *
 * Not certified flight software; verify independently; local codes, range-safety rules
 * and licensed engineering practice govern.
 */
#include "check.h"

/* pi from the C library's atan, for degrees (C99 has no M_PI). */
static double degrees(double radians) {
    return radians * 45.0 / atan(1.0);
}

static void test_wind_profiles(void) {
    double z[3] = {0.0, 1000.0, 2000.0};
    double east[3] = {10.0, -10.0, -10.0};
    double north[3] = {0.0, 4.0, 4.0};
    double speed[2] = {10.0, 20.0};
    double dir[2] = {270.0, 180.0};
    AerostrataWindProfile *winds = NULL;
    AerostrataWindProfile *untouched = NULL;
    AerostrataWind w;
    AerostrataErrorDetail d;

    STATUS(aerostrata_wind_profile_new(z, east, north, 3, &winds), AEROSTRATA_STATUS_OK);
    east[0] = 99.0; /* copied */
    /* Linear in each component: halfway between 10 and -10 m/s east is calm east-west
     * (common practice, no source: components, not speed and direction, are interpolated). */
    STATUS(aerostrata_wind_profile_at(winds, 500.0, &w), AEROSTRATA_STATUS_OK);
    CHECK(w.east_m_s == 0.0 && w.north_m_s == 2.0 && w.held == 0);
    /* A wind toward the north blows from the south: 180 deg (meteorological convention,
     * common practice, no source). */
    CHECK(w.speed_m_s == 2.0 && w.direction_deg == 180.0);
    STATUS(aerostrata_wind_profile_at(winds, 5000.0, &w), AEROSTRATA_STATUS_OK);
    CHECK(w.east_m_s == -10.0 && w.north_m_s == 4.0 && w.held == 1);
    STATUS(aerostrata_wind_profile_at(winds, -100.0, &w), AEROSTRATA_STATUS_OK);
    CHECK(w.east_m_s == 10.0 && w.held == 1);
    STATUS(aerostrata_wind_profile_at(winds, NAN, &w), AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_wind_profile_at(NULL, 0.0, &w), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_wind_profile_at(winds, 0.0, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    aerostrata_wind_profile_free(winds);
    winds = NULL;

    /* From speed and direction: a west wind (270 deg) blows toward the east, a south wind
     * (180 deg) toward the north: east = -W sin(dir), north = -W cos(dir). */
    STATUS(aerostrata_wind_profile_new_speed_direction(z, speed, dir, 2, &winds), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_wind_profile_at(winds, 0.0, &w), AEROSTRATA_STATUS_OK);
    CHECK(w.east_m_s == 10.0 && fabs(w.north_m_s) < 1e-14 && w.held == 0);
    STATUS(aerostrata_wind_profile_at(winds, 1000.0, &w), AEROSTRATA_STATUS_OK);
    CHECK(fabs(w.east_m_s) < 1e-14 && w.north_m_s == 20.0 && fabs(w.direction_deg - 180.0) < 1e-12);
    aerostrata_wind_profile_free(winds);
    aerostrata_wind_profile_free(NULL);

    /* Misuse: NULL arrays, a short (empty) profile, NaN, out of order, out of range; the
     * output is left alone. */
    east[0] = 10.0;
    STATUS(aerostrata_wind_profile_new(NULL, east, north, 3, &untouched), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_wind_profile_new(z, east, north, 3, NULL), AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_wind_profile_new(z, east, north, 0, &untouched), AEROSTRATA_STATUS_TOO_FEW_ROWS);
    STATUS(aerostrata_wind_profile_new_speed_direction(z, speed, dir, 0, &untouched), AEROSTRATA_STATUS_TOO_FEW_ROWS);
    z[1] = NAN;
    STATUS(aerostrata_wind_profile_new(z, east, north, 3, &untouched), AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 1);
    z[1] = 0.0;
    STATUS(aerostrata_wind_profile_new(z, east, north, 3, &untouched), AEROSTRATA_STATUS_INVALID_POINT);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 1);
    z[1] = 1000.0;
    north[2] = 300.0;
    STATUS(aerostrata_wind_profile_new(z, east, north, 3, &untouched), AEROSTRATA_STATUS_OUT_OF_RANGE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2 && d.max == 250.0);
    north[2] = 4.0;
    speed[1] = NAN;
    STATUS(aerostrata_wind_profile_new_speed_direction(z, speed, dir, 2, &untouched), AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 1);
    speed[1] = 20.0;
    dir[0] = 400.0;
    STATUS(aerostrata_wind_profile_new_speed_direction(z, speed, dir, 2, &untouched), AEROSTRATA_STATUS_OUT_OF_RANGE);
    STATUS(aerostrata_wind_profile_new_speed_direction(z, NULL, dir, 2, &untouched), AEROSTRATA_STATUS_NULL_POINTER);
    CHECK(untouched == NULL);
}

/* The hand case. A vehicle climbs straight up at V = 100 m/s through a steady wind of
 * w = 10 m/s from the west (270 deg), so the wind blows toward the east at +10 m/s. Its
 * axis lies along its ground velocity, (0, 0, 1). Relative to the air it moves at
 * (0 - 10, 0, 100) = (-10, 0, 100) m/s (east, north, up): the airspeed is
 * sqrt(100^2 + 10^2) = sqrt(10100) m/s, and the angle between the axis and the air-relative
 * velocity, the total angle of attack, has tan(alpha) = |horizontal| / vertical = w / V,
 * so alpha = atan(w / V) = atan(0.1) (5.7106 deg). q = rho Va^2 / 2 = 5050 rho, and
 * q-alpha = q alpha (Pa deg). Worked by hand; common practice, no source. */
static void test_crosswind_by_hand(AerostrataModel *model) {
    double wz[2] = {0.0, 5000.0};
    double ws[2] = {10.0, 10.0};
    double wd[2] = {270.0, 270.0};
    double t[3] = {0.0, 1.0, 2.0};
    double z[3] = {1000.0, 1100.0, 1200.0};
    double e[3] = {0.0, 0.0, 0.0};
    double n[3] = {0.0, 0.0, 0.0};
    double u[3] = {100.0, 100.0, 100.0};
    double alpha = degrees(atan(0.1));
    AerostrataWindProfile *winds = NULL;
    AerostrataFlightPoint p[3];
    AerostrataFlightSummary s;
    int i;

    STATUS(aerostrata_wind_profile_new_speed_direction(wz, ws, wd, 2, &winds), AEROSTRATA_STATUS_OK);
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, winds, AEROSTRATA_RECOVERY_TURBULENT, t, z, e, n, u,
                                         NULL, NULL, 3, p, &s),
           AEROSTRATA_STATUS_OK);
    for (i = 0; i < 3; i++) {
        CHECK(fabs(p[i].alpha_deg - alpha) <= 1e-14 * alpha);
        CHECK(fabs(p[i].airspeed_m_s - sqrt(10100.0)) <= 1e-15 * sqrt(10100.0));
        CHECK(fabs(p[i].dynamic_pressure_pa - 5050.0 * p[i].density_kg_m3) <= 1e-14 * p[i].dynamic_pressure_pa);
        CHECK(fabs(p[i].q_alpha_pa_deg - p[i].dynamic_pressure_pa * alpha) <= 1e-14 * p[i].q_alpha_pa_deg);
        CHECK(p[i].wind_east_m_s == 10.0 && fabs(p[i].wind_north_m_s) < 1e-14);
        CHECK(p[i].velocity_up_m_s == 100.0 && p[i].velocity_m_s == 100.0);
        CHECK(p[i].mach == p[i].airspeed_m_s / p[i].speed_of_sound_m_s);
        /* Pr < 1, so the recovery factor is below 1 and T < Tr < Tt (common practice, no
         * source). */
        CHECK(p[i].temperature_k < p[i].recovery_temperature_k &&
              p[i].recovery_temperature_k < p[i].total_temperature_k);
        CHECK(p[i].defined == (AEROSTRATA_POINT_MACH | AEROSTRATA_POINT_REYNOLDS_PER_M |
                               AEROSTRATA_POINT_VELOCITY_COMPONENTS | AEROSTRATA_POINT_WIND |
                               AEROSTRATA_POINT_ALPHA | AEROSTRATA_POINT_RECOVERY_TEMPERATURE));
    }
    /* q falls with density as the vehicle climbs at a steady airspeed: q-alpha peaks at the
     * first sample. */
    CHECK(s.has_max_q_alpha == 1 && s.max_q_alpha_sample_index == 0 && s.max_q_alpha_pa_deg == p[0].q_alpha_pa_deg);
    CHECK(s.max_q_alpha_airspeed_m_s == p[0].airspeed_m_s && s.max_q_alpha_mach == p[0].mach);
    CHECK(s.max_q_alpha_time_s == 0.0 && s.max_q_alpha_altitude_m == 1000.0);
    CHECK(s.max_q_velocity_m_s == p[0].airspeed_m_s && s.wind_held_samples == 0 && s.mach_undefined_samples == 0);

    /* A head wind and a tail wind on level flight toward the east at 200 m/s: 20 m/s from
     * the east (90 deg) adds to the airspeed, 20 m/s from the west takes from it; alpha 0. */
    {
        double hz[1] = {0.0};
        double hs[1] = {20.0};
        double hd[1] = {90.0};
        double level_e[3] = {200.0, 200.0, 200.0};
        double level_u[3] = {0.0, 0.0, 0.0};
        AerostrataWindProfile *head = NULL;
        STATUS(aerostrata_wind_profile_new_speed_direction(hz, hs, hd, 1, &head), AEROSTRATA_STATUS_OK);
        STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, head, AEROSTRATA_RECOVERY_NONE, t, z, level_e, n,
                                             level_u, NULL, NULL, 3, p, &s),
               AEROSTRATA_STATUS_OK);
        CHECK(fabs(p[1].airspeed_m_s - 220.0) < 1e-12 && fabs(p[1].alpha_deg) < 1e-12);
        CHECK(isnan(p[1].recovery_temperature_k) && !(p[1].defined & AEROSTRATA_POINT_RECOVERY_TEMPERATURE));
        /* The profile's one level is at 0 m: every sample above it holds its wind. */
        CHECK(s.wind_held_samples == 3);
        aerostrata_wind_profile_free(head);
        hd[0] = 270.0;
        STATUS(aerostrata_wind_profile_new_speed_direction(hz, hs, hd, 1, &head), AEROSTRATA_STATUS_OK);
        STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, head, AEROSTRATA_RECOVERY_LAMINAR, t, z, level_e,
                                             n, level_u, NULL, NULL, 3, p, &s),
               AEROSTRATA_STATUS_OK);
        CHECK(fabs(p[1].airspeed_m_s - 180.0) < 1e-12);
        aerostrata_wind_profile_free(head);
    }

    /* An axis given: tilted 10 deg from the vertical toward the east (elevation 80 deg,
     * azimuth 90 deg) on a vertical climb in still air: alpha = 10 deg (by hand). */
    {
        double el[3] = {80.0, 80.0, 80.0};
        double az[3] = {90.0, 90.0, 90.0};
        STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, AEROSTRATA_RECOVERY_NONE, t, z, e, n, u, el,
                                             az, 3, p, &s),
               AEROSTRATA_STATUS_OK);
        CHECK(fabs(p[2].alpha_deg - 10.0) < 1e-12 && p[2].airspeed_m_s == 100.0);
        CHECK(isnan(p[2].wind_east_m_s) && !(p[2].defined & AEROSTRATA_POINT_WIND));
    }
    aerostrata_wind_profile_free(winds);
}

/* The summary's new fields on an invented boost with a corner at burnout (q rising, then
 * falling at once) sampled coarsely, so the peak is bounded but not resolved. */
static void test_summary_fields(AerostrataModel *model) {
    double t[7] = {0.0, 2.0, 4.0, 6.0, 8.0, 10.0, 12.0};
    double z[7];
    double e[7] = {0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0};
    double n[7] = {0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0};
    double u[7];
    double sample_max = 0.0;
    AerostrataFlightPoint p[7];
    AerostrataFlightSummary s;
    int i;

    CHECK(sizeof(AerostrataFlightSummary) == AEROSTRATA_FLIGHT_SUMMARY_SIZE);
    CHECK(aerostrata_flight_summary_size() == sizeof(AerostrataFlightSummary));
    for (i = 0; i < 7; i++) {
        /* 60 m/s^2 for 7 s, then a coast at -9.8 m/s^2. */
        double b = t[i] < 7.0 ? t[i] : 7.0;
        double c = t[i] - b;
        u[i] = 60.0 * b - 9.8 * c;
        z[i] = 30.0 * b * b + 420.0 * c - 4.9 * c * c;
    }
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, AEROSTRATA_RECOVERY_NONE, t, z, e, n, u, NULL,
                                         NULL, 7, p, &s),
           AEROSTRATA_STATUS_OK);
    for (i = 0; i < 7; i++) {
        sample_max = p[i].dynamic_pressure_pa > sample_max ? p[i].dynamic_pressure_pa : sample_max;
    }
    CHECK(s.has_max_q == 1 && s.max_q_sample_max_pa == sample_max && s.max_q_pa >= sample_max);
    CHECK(s.has_max_q_uncertainty == 1 && s.max_q_uncertainty_pa > 0.0);
    /* Bounded, not resolved at 2 s spacing, and the spacing suggested is finer. */
    CHECK(s.max_q_resolved == 0 && s.has_max_q_suggested_spacing == 1);
    CHECK(s.max_q_suggested_spacing_s > 0.0 && s.max_q_suggested_spacing_s < 2.0);
    /* Still air, axis along the velocity: alpha is 0 and so is every q-alpha. */
    CHECK(s.has_max_q_alpha == 1 && s.max_q_alpha_pa_deg == 0.0);
    CHECK(s.mach_undefined_samples == 0 && s.wind_held_samples == 0 && isnan(s.max_drag_mach));

    /* The largest sample last: no bound (the maximum may lie beyond the record). */
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, AEROSTRATA_RECOVERY_NONE, t, z, e, n, u, NULL,
                                         NULL, 3, p, &s),
           AEROSTRATA_STATUS_OK);
    CHECK(s.has_max_q_uncertainty == 0 && isnan(s.max_q_uncertainty_pa) && s.max_q_resolved == 0);
    CHECK(s.has_max_q_suggested_spacing == 0 && isnan(s.max_q_suggested_spacing_s));

    /* The scalar scan fills the new fields too; no q-alpha without the velocity's direction. */
    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, t, z, u, 7, p, &s), AEROSTRATA_STATUS_OK);
    CHECK(s.has_max_q_alpha == 0 && isnan(s.max_q_alpha_pa_deg) && s.max_q_alpha_sample_index == 0);
    CHECK(s.has_max_q_uncertainty == 1 && s.max_q_sample_max_pa == sample_max);
    CHECK(isnan(p[3].alpha_deg) && isnan(p[3].velocity_up_m_s) && !(p[3].defined & AEROSTRATA_POINT_ALPHA));

    /* Above 86 km the Mach number is undefined, and counted. */
    {
        double hz[2] = {85000.0, 90000.0};
        double hu[2] = {1000.0, 1000.0};
        STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, AEROSTRATA_RECOVERY_TURBULENT, t, hz, e, n,
                                             hu, NULL, NULL, 2, p, &s),
               AEROSTRATA_STATUS_OK);
        CHECK(s.mach_undefined_samples == 1 && isnan(p[1].mach) && isnan(p[1].recovery_temperature_k));
    }
}

static void test_vector_scan_misuse(AerostrataModel *model) {
    double t[3] = {0.0, 1.0, 2.0};
    double z[3] = {0.0, 100.0, 200.0};
    double e[3] = {0.0, 0.0, 0.0};
    double n[3] = {0.0, 0.0, 0.0};
    double u[3] = {100.0, 100.0, 100.0};
    double el[3] = {90.0, 90.0, 90.0};
    double az[3] = {0.0, 0.0, 0.0};
    AerostrataFlightPoint p[3];
    AerostrataFlightPoint p_sentinel[3];
    AerostrataFlightSummary s;
    AerostrataFlightSummary sentinel;
    AerostrataErrorDetail d;

    memset(&sentinel, 0x5a, sizeof sentinel);
    memset(p_sentinel, 0x5a, sizeof p_sentinel);
    memcpy(&s, &sentinel, sizeof s);
    memcpy(p, p_sentinel, sizeof p);
    STATUS(aerostrata_flight_scan_vector(NULL, NULL, 0.0, 0.0, NULL, 0, t, z, e, n, u, NULL, NULL, 3, p, &s),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 0, t, z, e, NULL, u, NULL, NULL, 3, p, &s),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 0, t, z, e, n, u, NULL, NULL, 3, p, NULL),
           AEROSTRATA_STATUS_NULL_POINTER);
    /* One axis array without the other. */
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 0, t, z, e, n, u, el, NULL, 3, p, &s),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 9, t, z, e, n, u, NULL, NULL, 3, p, &s),
           AEROSTRATA_STATUS_INVALID_ARGUMENT);
    n[1] = NAN;
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 0, t, z, e, n, u, NULL, NULL, 3, p, &s),
           AEROSTRATA_STATUS_NOT_FINITE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 1);
    n[1] = 0.0;
    el[2] = 95.0;
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 0, t, z, e, n, u, el, az, 3, p, &s),
           AEROSTRATA_STATUS_OUT_OF_RANGE);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2 && d.max == 90.0);
    el[2] = 90.0;
    t[2] = 1.0;
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 0, t, z, e, n, u, el, az, 3, p, &s),
           AEROSTRATA_STATUS_INVALID_POINT);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 2);
    t[2] = 2.0;
    /* Nothing written by any failure. */
    CHECK(memcmp(&s, &sentinel, sizeof s) == 0 && memcmp(p, p_sentinel, sizeof p) == 0);
    /* A short (empty) flight: a summary with nothing in it. */
    STATUS(aerostrata_flight_scan_vector(model, NULL, 0.0, 0.0, NULL, 0, NULL, NULL, NULL, NULL, NULL, NULL, NULL, 0,
                                         NULL, &s),
           AEROSTRATA_STATUS_OK);
    CHECK(s.samples == 0 && s.has_max_q == 0 && s.has_max_q_alpha == 0 && isnan(s.max_q_sample_max_pa));
}

/* Exceedances of q over a scanned flight: the crossings are where the straight line
 * between two samples meets the limit (linear interpolation, common practice, no source). */
static void test_exceedances(AerostrataModel *model) {
    double t[5] = {0.0, 1.0, 2.0, 3.0, 4.0};
    double z[5] = {0.0, 0.0, 0.0, 0.0, 0.0};
    double v[5] = {50.0, 150.0, 250.0, 150.0, 50.0};
    double q_limit;
    AerostrataFlightPoint p[5];
    AerostrataFlightSummary s;
    AerostrataExceedance out[2];
    AerostrataExceedance sentinel;
    AerostrataErrorDetail d;
    size_t found = 99;
    double start;

    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, t, z, v, 5, p, &s), AEROSTRATA_STATUS_OK);
    /* A limit halfway between the q of 150 m/s and of 250 m/s. */
    q_limit = 0.5 * (p[1].dynamic_pressure_pa + p[2].dynamic_pressure_pa);
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE, q_limit, out, 2, &found),
           AEROSTRATA_STATUS_OK);
    CHECK(found == 1);
    start = 1.0 + (q_limit - p[1].dynamic_pressure_pa) / (p[2].dynamic_pressure_pa - p[1].dynamic_pressure_pa);
    CHECK(fabs(out[0].start_time_s - 1.5) < 1e-12 && fabs(out[0].start_time_s - start) < 1e-15);
    CHECK(fabs(out[0].end_time_s - 2.5) < 1e-12 && out[0].peak == p[2].dynamic_pressure_pa);
    CHECK(out[0].peak_time_s == 2.0 && out[0].open_start == 0 && out[0].open_end == 0);
    /* Two intervals (Mach above 0.4, rising and falling twice), room for none: the count
     * says how many there are. */
    v[2] = 100.0;
    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, t, z, v, 5, p, &s), AEROSTRATA_STATUS_OK);
    memset(&sentinel, 0x5a, sizeof sentinel);
    memcpy(&out[1], &sentinel, sizeof sentinel);
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_MACH, 0.4, NULL, 0, &found), AEROSTRATA_STATUS_OK);
    CHECK(found == 2);
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_MACH, 0.4, out, 1, &found), AEROSTRATA_STATUS_OK);
    CHECK(found == 2 && out[0].end_time_s < 2.0 && memcmp(&out[1], &sentinel, sizeof sentinel) == 0);
    /* Already above at the start, still above at the end. */
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_VELOCITY, 10.0, out, 2, &found),
           AEROSTRATA_STATUS_OK);
    CHECK(found == 1 && out[0].open_start == 1 && out[0].open_end == 1 && out[0].start_time_s == 0.0);
    CHECK(out[0].end_time_s == 4.0);

    /* Misuse: nothing written. */
    found = 99;
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_MACH, NAN, out, 2, &found),
           AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_flight_exceedances(NULL, 5, AEROSTRATA_QUANTITY_MACH, 0.4, out, 2, &found),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_MACH, 0.4, NULL, 2, &found),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_MACH, 0.4, out, 2, NULL),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_GRAVITY, 0.4, out, 2, &found),
           AEROSTRATA_STATUS_NOT_CARRIED);
    STATUS(aerostrata_flight_exceedances(p, 5, 9999, 0.4, out, 2, &found), AEROSTRATA_STATUS_INVALID_ARGUMENT);
    /* q-alpha of a scalar scan is undefined (NaN) at every sample: the first is named. */
    STATUS(aerostrata_flight_exceedances(p, 5, AEROSTRATA_QUANTITY_Q_ALPHA, 100.0, out, 2, &found),
           AEROSTRATA_STATUS_INVALID_POINT);
    CHECK(aerostrata_last_error(&d) == AEROSTRATA_STATUS_OK && d.index == 0);
    CHECK(found == 99);
    /* No samples: no interval. */
    STATUS(aerostrata_flight_exceedances(NULL, 0, AEROSTRATA_QUANTITY_MACH, 0.4, NULL, 0, &found),
           AEROSTRATA_STATUS_OK);
    CHECK(found == 0);
}

/* The plateau of q around its maximum: where the straight line between two samples meets
 * (1 - fraction) times the maximum (linear interpolation, common practice, no source).
 * Speeds rising and falling symmetrically about 2 s make a symmetric plateau. */
static void test_plateau(AerostrataModel *model) {
    double t[5] = {0.0, 1.0, 2.0, 3.0, 4.0};
    double z[5] = {0.0, 0.0, 0.0, 0.0, 0.0};
    double v[5] = {50.0, 240.0, 250.0, 240.0, 50.0};
    AerostrataFlightPoint p[5];
    AerostrataFlightSummary s;
    AerostrataPlateau out;
    AerostrataPlateau sentinel;
    uint32_t found = 99;
    double floor, start;

    STATUS(aerostrata_flight_scan(model, NULL, 0.0, 0.0, t, z, v, 5, p, &s), AEROSTRATA_STATUS_OK);
    /* Within 10 % of the largest sample: the floor lies between samples 0 and 1. */
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE, NAN, 0.1, &out, &found),
           AEROSTRATA_STATUS_OK);
    floor = 0.9 * p[2].dynamic_pressure_pa;
    start = 0.0 + (floor - p[0].dynamic_pressure_pa) / (p[1].dynamic_pressure_pa - p[0].dynamic_pressure_pa);
    CHECK(found == 1 && out.maximum == p[2].dynamic_pressure_pa && out.fraction == 0.1 && out.open == 0);
    CHECK(fabs(out.start_time_s - start) < 1e-15 && fabs(out.end_time_s - (4.0 - start)) < 1e-12);
    /* Within 2 % of the summary's refined maximum (above the largest sample). */
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE, s.max_q_pa, 0.02, &out, &found),
           AEROSTRATA_STATUS_OK);
    CHECK(found == 1 && out.maximum == s.max_q_pa && out.start_time_s > 1.0 && out.end_time_s < 3.0);

    /* Misuse: nothing written. */
    memset(&sentinel, 0x5a, sizeof sentinel);
    memcpy(&out, &sentinel, sizeof out);
    found = 99;
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE, NAN, 1.0, &out, &found),
           AEROSTRATA_STATUS_RATIO_OUT_OF_RANGE);
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE, NAN, NAN, &out, &found),
           AEROSTRATA_STATUS_NOT_FINITE);
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_DYNAMIC_PRESSURE, 1.0, 0.02, &out, &found),
           AEROSTRATA_STATUS_OUT_OF_RANGE);
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_GRAVITY, NAN, 0.02, &out, &found),
           AEROSTRATA_STATUS_NOT_CARRIED);
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_Q_ALPHA, NAN, 0.02, &out, &found),
           AEROSTRATA_STATUS_INVALID_POINT);
    STATUS(aerostrata_flight_plateau(NULL, 5, AEROSTRATA_QUANTITY_MACH, NAN, 0.02, &out, &found),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_MACH, NAN, 0.02, NULL, &found),
           AEROSTRATA_STATUS_NULL_POINTER);
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_MACH, NAN, 0.02, &out, NULL),
           AEROSTRATA_STATUS_NULL_POINTER);
    /* Times that do not increase (points made by hand, not by a scan). */
    p[3].time_s = 1.0;
    STATUS(aerostrata_flight_plateau(p, 5, AEROSTRATA_QUANTITY_MACH, NAN, 0.02, &out, &found),
           AEROSTRATA_STATUS_INVALID_POINT);
    CHECK(found == 99 && memcmp(&out, &sentinel, sizeof out) == 0);
    /* No samples: no plateau. */
    STATUS(aerostrata_flight_plateau(NULL, 0, AEROSTRATA_QUANTITY_MACH, NAN, 0.02, &out, &found),
           AEROSTRATA_STATUS_OK);
    CHECK(found == 0 && memcmp(&out, &sentinel, sizeof out) == 0);
}

void test_loads(void) {
    AerostrataModel *model = NULL;
    STATUS(aerostrata_model_new_us1976(0.0, &model), AEROSTRATA_STATUS_OK);
    test_wind_profiles();
    test_crosswind_by_hand(model);
    test_summary_fields(model);
    test_vector_scan_misuse(model);
    test_exceedances(model);
    test_plateau(model);
    aerostrata_model_free(model);
}
