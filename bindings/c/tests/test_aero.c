/*
 * The aerodynamic, compressible-flow, airspeed and altimetry functions, drag curves and
 * the flight scan, with terminal velocity.
 */
#include "check.h"

void test_helpers(void) {
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

void test_flight(void) {
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
