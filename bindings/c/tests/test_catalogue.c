/*
 * The spreadsheet functions (NaN on bad input), the species above 86 km, and the
 * quantity catalogue with its stable ids and US units.
 */
#include "check.h"

void test_spreadsheet(void) {
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

void test_species(void) {
    AerostrataSpecies n, before;
    AerostrataState s;
    double total;
    /* The standard's boundary values at 86 km. */
    STATUS(aerostrata_us1976_species(86000.0, AEROSTRATA_GEOMETRIC, &n), AEROSTRATA_STATUS_OK);
    CHECK(fabs(n.n2_m3 / 1.129794e20 - 1.0) < 1e-12 && fabs(n.o_m3 / 8.6e16 - 1.0) < 1e-12);
    /* Hydrogen's continuation below 150 km (the standard lists none there): 1.7e-6 of N. */
    CHECK(n.h_m3 > 0.0 && n.h_m3 < 1e-5 * n.n2_m3 && n.o2_m3 > 0.0 && n.ar_m3 > 0.0 && n.he_m3 > 0.0);
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

void test_catalogue(void) {
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
