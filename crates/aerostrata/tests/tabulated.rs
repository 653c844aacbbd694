//! The tabulated (sounding) model: self-reproduction of the 1976 standard, round trips
//! through CSV and JSON, moist air against a published formula and a handbook table,
//! every validation error from a malformed CSV, and the laws it must obey everywhere.
//!
//! Tolerances, and why each is what it is:
//! - self-reproduction, 1e-5 relative in p and rho: the issue's requirement (the
//!   interpolation is the standard's own layer formula, so about 1e-14 is reached);
//! - rows, bit-identical: a table's rows hold the model's own T and p, and the state is
//!   derived from them by the same code;
//! - between rows of a hydrostatic source (US1976, layers, isothermal) with a row on
//!   every kink, 1e-13: rounding of the same formula evaluated from different bases;
//! - between rows of the exponential model, (dZ^2 / 8)(2 / r0) / H_rho: it is
//!   exponential in geometric altitude, the table hydrostatic in geopotential;
//! - between rows of a temperature offset dT, G |L| dT dH^2 / (8 T^2 (T + dT)) with
//!   G = g0 M0 / R*: the source keeps the standard's pressure, the table balances the
//!   shifted temperature, and they part by that much mid-pair;
//! - moist air against CIPM-2007: see `moist_density_matches_cipm_2007`;
//! - continuity across a row, 1e-11 relative between the value at the row and the
//!   straight-line extrapolation of the values 1 and 2 micrometres below it (a steep
//!   humidity step moves T_v by 0.5 K/m, so the gradient must be taken out);
//! - continuity at a blend's edge, 1e-9 relative over 1e-6 m: the gradient alone moves p
//!   by 1.3e-10 over that step;
//! - gas law p = rho R* T_v / M0, 1e-13: a few roundings;
//! - hydrostatic balance within a pair, 1e-6 for central differences over +-5 m and
//!   +-2.5 m combined to fourth order (a single difference over +-5 m is off by 4e-6
//!   where a humidity step makes T_v fall 0.2 K/m; the combination, by 2e-8); the layer
//!   formula's rounding, a few parts in 1e15 (1e-11 where it is evaluated as a general
//!   power of a base close to 1), adds less than 2e-8 over those steps.

use aerostrata::constants::{G0_M_S2, GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use aerostrata::humidity::{self, saturation_vapour_pressure_pa};
use aerostrata::model::sounding_io::{parse_csv, rows_to_csv};
use aerostrata::{
    Air, Altitude, AltitudeKind, Atmosphere, Error, Exponential, GeopotentialAltitude, Isothermal, LayerSpec,
    Layered, OutsideTable, SoundingLevel, SoundingRow, State, Tabulated, TemperatureOffset, US1976,
};
use proptest::prelude::*;

mod common;
use common::wild;

const SELF_REPRODUCTION: f64 = 1e-5;
const HYDROSTATIC_SOURCE_BETWEEN_ROWS: f64 = 1e-13;
const CONTINUITY: f64 = 1e-9;
const CONTINUITY_STEP_M: f64 = 1e-6;
const ROW_CONTINUITY: f64 = 1e-11;
const GAS_LAW: f64 = 1e-13;
const HYDROSTATIC_BALANCE: f64 = 1e-6;
const HYDROSTATIC_STEP_M: f64 = 5.0;
const EARTH_RADIUS_M: f64 = 6_356_766.0;

fn relative(a: f64, b: f64) -> f64 {
    if a == b {
        0.0
    } else {
        ((a - b) / b).abs()
    }
}

/// Rows written from `model` every `step` metres of `kind` from `from` to `to`, with the
/// model's pressure (or density) at every row, or pressure on the first row only.
#[derive(Clone, Copy, PartialEq, Debug)]
enum Given {
    Pressure,
    Density,
    FirstPressure,
}

fn rows_from(
    model: &dyn Atmosphere,
    kind: AltitudeKind,
    altitudes: &[f64],
    given: Given,
) -> Vec<SoundingRow> {
    altitudes
        .iter()
        .enumerate()
        .map(|(i, &a)| {
            let s = model.state(kind.altitude(a).unwrap()).unwrap();
            let row = SoundingRow::new(a, s.temperature_k);
            match given {
                Given::Pressure => row.with_pressure_pa(s.pressure_pa),
                Given::Density => row.with_density_kg_m3(s.density_kg_m3),
                Given::FirstPressure if i == 0 => row.with_pressure_pa(s.pressure_pa),
                Given::FirstPressure => row,
            }
        })
        .collect()
}

fn steps(from: f64, to: f64, step: f64) -> Vec<f64> {
    let count = ((to - from) / step).round() as usize;
    (0..=count).map(|i| from + i as f64 * step).collect()
}

/// Points between consecutive rows: `per_pair` evenly spaced interior points.
fn between(altitudes: &[f64], per_pair: usize) -> Vec<f64> {
    altitudes
        .windows(2)
        .flat_map(|w| (1..=per_pair).map(move |j| w[0] + (w[1] - w[0]) * j as f64 / (per_pair + 1) as f64))
        .collect()
}

/// The standard at every km of geopotential altitude from -5 km to 79 km (a row on every
/// layer base; 79 km geopotential is 79.99 km geometric, the top of the standard's
/// constant composition), written with geometric altitudes.
fn standard_geometric_km_rows(given: Given) -> (Vec<f64>, Vec<SoundingRow>) {
    let z: Vec<f64> = (-5..=79)
        .map(|km| GeopotentialAltitude::new(f64::from(km) * 1000.0).unwrap().to_geometric().meters())
        .collect();
    let rows = rows_from(&US1976, AltitudeKind::Geometric, &z, given);
    (z, rows)
}

#[test]
fn a_table_of_the_standard_reproduces_the_standard_between_its_rows() {
    for given in [Given::Pressure, Given::Density, Given::FirstPressure] {
        let (z, rows) = standard_geometric_km_rows(given);
        let table = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows).unwrap();
        let mut worst: f64 = 0.0;
        for z in between(&z, 9) {
            let alt = Altitude::geometric_m(z).unwrap();
            let (ours, standard) = (table.state(alt).unwrap(), US1976.state(alt).unwrap());
            for (a, b) in [
                (ours.pressure_pa, standard.pressure_pa),
                (ours.density_kg_m3, standard.density_kg_m3),
                (ours.temperature_k, standard.temperature_k),
            ] {
                worst = worst.max(relative(a, b));
            }
        }
        assert!(worst <= SELF_REPRODUCTION, "{given:?}: worst relative difference {worst:e}");
    }
}

#[test]
fn above_80_km_the_table_keeps_the_standards_pressure_but_not_its_composition() {
    // Rows to the standard's top: 80-86 km geometric is where M/M0 departs from 1, which a
    // table of T and p cannot carry; its dry air (M0) makes density differ by M0 / M.
    let mut z: Vec<f64> = (79..=84)
        .map(|km| GeopotentialAltitude::new(f64::from(km) * 1000.0).unwrap().to_geometric().meters())
        .collect();
    z.push(86_000.0);
    let rows = rows_from(&US1976, AltitudeKind::Geometric, &z, Given::Pressure);
    let table = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows).unwrap();
    for z in between(&z, 9) {
        let alt = Altitude::geometric_m(z).unwrap();
        let (ours, standard) = (table.state(alt).unwrap(), US1976.state(alt).unwrap());
        assert!(relative(ours.pressure_pa, standard.pressure_pa) <= SELF_REPRODUCTION, "p at {z}");
        let composition = SEA_LEVEL_MOLAR_MASS_KG_KMOL / standard.mean_molar_mass_kg_kmol;
        assert!(
            relative(ours.density_kg_m3, standard.density_kg_m3 * composition) <= SELF_REPRODUCTION,
            "rho at {z}"
        );
    }
}

/// Round trip through CSV: the rows' states are bit-identical, and the states between
/// rows within `tolerance` of the model's. A model that derives its density other than
/// by p M / (R* T) from its T, p and M (a temperature offset scales the base model's
/// density) is met bit for bit in T, p and M, and within 4 ulp in the rest.
fn round_trip(model: &dyn Atmosphere, kind: AltitudeKind, altitudes: &[f64], tolerance: f64) {
    let rows = rows_from(model, kind, altitudes, Given::Pressure);
    let text = rows_to_csv(kind, &rows);
    let table = parse_csv(&text).unwrap();
    assert_eq!(table.kind(), kind);
    for &a in altitudes {
        let alt = kind.altitude(a).unwrap();
        let (ours, theirs, air) =
            (table.state(alt).unwrap(), model.state(alt).unwrap(), model.air(alt).unwrap());
        let rebuilt = Air::new(air.temperature_k(), air.pressure_pa(), air.molar_mass_kg_kmol()).unwrap();
        assert_eq!(ours, State::new(alt, rebuilt), "row at {a} m");
        if air == rebuilt {
            assert_eq!(ours, theirs, "row at {a} m");
        }
        for ((name, x), (_, y)) in ours.fields().iter().zip(theirs.fields().iter()) {
            assert!(relative(x.unwrap(), y.unwrap()) <= 4.0 * f64::EPSILON, "{name} at row {a} m");
        }
    }
    let mut worst: f64 = 0.0;
    for a in between(altitudes, 7) {
        let alt = kind.altitude(a).unwrap();
        let (ours, theirs) = (table.state(alt).unwrap(), model.state(alt).unwrap());
        for ((name, x), (_, y)) in ours.fields().iter().zip(theirs.fields().iter()) {
            let (x, y) = (x.unwrap(), y.unwrap());
            let difference = relative(x, y);
            assert!(difference <= tolerance, "{name} at {a} m: {x} vs {y} ({difference:e} > {tolerance:e})");
            worst = worst.max(difference);
        }
    }
    // The tolerance is a bound, not a slack: the worst point must come within a factor
    // 1000 of it unless the model is reproduced to rounding.
    assert!(
        worst <= tolerance && (worst >= tolerance / 1000.0 || tolerance <= HYDROSTATIC_SOURCE_BETWEEN_ROWS)
    );
}

#[test]
fn tables_written_from_models_read_back_the_same() {
    round_trip(
        &US1976,
        AltitudeKind::Geopotential,
        &steps(-5_000.0, 79_000.0, 250.0),
        HYDROSTATIC_SOURCE_BETWEEN_ROWS,
    );
    // An invented two-layer desert profile, rows on its layer base.
    let desert = Layered::from_lapse_rates(
        0.0,
        318.15,
        100_800.0,
        &[
            LayerSpec { top_geopotential_m: 3_000.0, lapse_rate_k_m: -0.0095 },
            LayerSpec { top_geopotential_m: 12_000.0, lapse_rate_k_m: 0.0 },
        ],
    )
    .unwrap();
    round_trip(
        &desert,
        AltitudeKind::Geopotential,
        &steps(0.0, 12_000.0, 600.0),
        HYDROSTATIC_SOURCE_BETWEEN_ROWS,
    );
    let isothermal = Isothermal::new(250.0, 101_325.0).unwrap();
    round_trip(
        &isothermal,
        AltitudeKind::Geometric,
        &steps(0.0, 50_000.0, 1_000.0),
        HYDROSTATIC_SOURCE_BETWEEN_ROWS,
    );

    let (dz, scale_height) = (500.0, 8_500.0);
    let exponential = Exponential::new(1.225, scale_height, 288.15).unwrap();
    let bound = dz * dz / 8.0 * (2.0 / EARTH_RADIUS_M) / scale_height;
    round_trip(&exponential, AltitudeKind::Geometric, &steps(0.0, 40_000.0, dz), 1.1 * bound);

    let (dh, offset_k) = (500.0, 15.0);
    let hot = TemperatureOffset::new(US1976, offset_k).unwrap();
    let g = G0_M_S2 * SEA_LEVEL_MOLAR_MASS_KG_KMOL / GAS_CONSTANT_J_KMOL_K;
    // The troposphere's lapse at its coldest (the tropopause, 216.65 K) is the worst case.
    let t = 216.65;
    let bound = g * 6.5e-3 * offset_k * dh * dh / (8.0 * t * t * (t + offset_k));
    round_trip(&hot, AltitudeKind::Geopotential, &steps(0.0, 30_000.0, dh), 1.1 * bound);
}

#[test]
fn density_tables_come_back_through_the_gas_law_within_two_ulp() {
    let altitudes = steps(0.0, 30_000.0, 1_000.0);
    let rows = rows_from(&US1976, AltitudeKind::Geopotential, &altitudes, Given::Density);
    let table = parse_csv(&rows_to_csv(AltitudeKind::Geopotential, &rows)).unwrap();
    for &h in &altitudes {
        let alt = Altitude::geopotential_m(h).unwrap();
        let (ours, standard) = (table.state(alt).unwrap(), US1976.state(alt).unwrap());
        assert_eq!(ours.temperature_k, standard.temperature_k);
        assert!(relative(ours.pressure_pa, standard.pressure_pa) <= 2.0 * f64::EPSILON);
        assert!(relative(ours.density_kg_m3, standard.density_kg_m3) <= 3.0 * f64::EPSILON);
    }
}

#[cfg(feature = "serde")]
#[test]
fn json_round_trip_gives_the_same_table() {
    let rows = [
        SoundingRow::new(4.0, 306.15).with_pressure_pa(100_850.0).with_dew_point_k(299.15),
        SoundingRow::new(500.0, 302.05).with_pressure_pa(95_290.0).with_relative_humidity_percent(72.5),
        SoundingRow::new(1_500.0, 295.05).with_pressure_pa(84_920.0),
        SoundingRow::new(3_000.0, 285.65).with_pressure_pa(70_930.0).with_dew_point_k(270.0),
    ];
    let table = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows)
        .unwrap()
        .with_above(OutsideTable::BlendIntoUs1976 { depth_m: 2_000.0 })
        .unwrap();
    let text = serde_json::to_string_pretty(&table).unwrap();
    let back: Tabulated<Vec<SoundingLevel>> = serde_json::from_str(&text).unwrap();
    assert_eq!(back, table);
    for z in [4.0, 250.0, 500.0, 2_999.0, 3_000.0, 4_000.0, 6_000.0] {
        let alt = Altitude::geometric_m(z).unwrap();
        assert_eq!(back.moist_state(alt).unwrap(), table.moist_state(alt).unwrap(), "at {z} m");
    }
    // And the CSV writer writes the same rows.
    assert_eq!(parse_csv(&aerostrata::model::sounding_io::to_csv(&table)).unwrap().levels(), table.levels());
}

#[cfg(feature = "serde")]
#[test]
fn json_errors_name_the_line_of_the_row_and_the_value() {
    let text = r#"{
  "altitude": "geometric",
  "rows": [
    {"altitude_m": 0.0, "temperature_k": 300.0, "pressure_pa": 100000.0},
    {"altitude_m": 1000.0, "temperature_k": -4.0, "pressure_pa": 89000.0},
    {"altitude_m": 2000.0, "temperature_k": 290.0, "pressure_pa": 79000.0}
  ]
}"#;
    let message = serde_json::from_str::<Tabulated<Vec<SoundingLevel>>>(text).unwrap_err().to_string();
    assert!(message.contains("row 1: temperature must be above 0 K, got -4 K"), "{message}");
    assert!(message.contains("line 5 column"), "{message}");
    let text = r#"{"altitude": "geometric", "rows": [{"altitude_m": 0.0, "temperature_k": 300.0, "pressure_pa": 1e5, "wind": 3}]}"#;
    let message = serde_json::from_str::<Tabulated<Vec<SoundingLevel>>>(text).unwrap_err().to_string();
    assert!(message.contains("unknown field `wind`"), "{message}");
}

#[test]
fn the_three_storages_give_the_same_model() {
    let (_, rows) = standard_geometric_km_rows(Given::FirstPressure);
    let owned = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows).unwrap();
    let mut buffer = [SoundingLevel::EMPTY; 100];
    let borrowed = Tabulated::from_rows_in(AltitudeKind::Geometric, &rows, &mut buffer).unwrap();
    let array: [SoundingRow; 85] = rows.clone().try_into().unwrap();
    let inline = Tabulated::from_rows(AltitudeKind::Geometric, &array).unwrap();
    assert_eq!(owned.levels(), borrowed.levels());
    assert_eq!(owned.levels(), inline.levels());
    let mut short = [SoundingLevel::EMPTY; 10];
    assert_eq!(
        Tabulated::from_rows_in(AltitudeKind::Geometric, &rows, &mut short).unwrap_err(),
        Error::StorageTooSmall { needed: 85, len: 10 }
    );
}

/// Handbook vapour pressure of pure water, Pa: CRC Handbook of Chemistry and Physics,
/// table "Vapor pressure of water" (from memory), with the tolerance each point gets.
/// Buck's fit (1981, from memory) is within 0.1 % of it from 0 to 40 degC and reads
/// 0.14 % high at 50 degC and 0.38 % at 60 degC, the top of aerostrata's band; the
/// tolerances are those deviations rounded up, so a wrong coefficient fails.
const HANDBOOK_VAPOUR_PRESSURE: [(f64, f64, f64); 8] = [
    (0.0, 611.2, 0.0002),
    (10.0, 1228.1, 0.001),
    (20.0, 2339.3, 0.001),
    (25.0, 3169.9, 0.001),
    (30.0, 4246.9, 0.001),
    (40.0, 7384.9, 0.001),
    (50.0, 12_352.0, 0.002),
    (60.0, 19_946.0, 0.004),
];

#[test]
fn saturation_vapour_pressure_matches_a_handbook_table() {
    for (t_c, handbook, tolerance) in HANDBOOK_VAPOUR_PRESSURE {
        let e = humidity::pure_water_saturation_vapour_pressure_pa(t_c + 273.15).unwrap();
        assert!(relative(e, handbook) <= tolerance, "{t_c} degC: {e} Pa vs {handbook} Pa");
    }
}

/// Density of moist air by the CIPM-2007 equation (Picard, Davis, Glaeser and Fujii,
/// Metrologia 45 (2008) 149-155; coefficients from memory of the paper), evaluated at 30
/// digits by tests/reference/moist_air_cipm2007_mpmath.py, which prints these lines:
/// (t degC, p Pa, RH %, rho kg/m^3, compressibility Z, molar mass of its dry air kg/kmol).
const CIPM_2007: [(f64, f64, f64, f64, f64, f64); 6] = [
    (20.0, 101_325.0, 50.0, 1.19931389547, 0.999614767525, 28.96546),
    (30.0, 101_325.0, 80.0, 1.15001170673, 0.99962774356, 28.96546),
    (35.0, 100_000.0, 90.0, 1.10923399318, 0.999596243692, 28.96546),
    (25.0, 90_000.0, 60.0, 1.04351602643, 0.999672337745, 28.96546),
    (0.0, 101_325.0, 100.0, 1.29010887353, 0.999400397183, 28.96546),
    (40.0, 95_000.0, 40.0, 1.04464438056, 0.999746560337, 28.96546),
];

/// aerostrata's moist air is an ideal mixture with the standard's dry air; CIPM-2007
/// carries a compressibility factor Z (1 - Z = 2.5e-4 to 6e-4 here) and a dry-air molar
/// mass with 400 umol/mol of CO2 (3.7e-5 heavier), so the raw densities agree to 7e-4.
/// Taking those two known differences out, what is left is the vapour term: Buck's
/// saturation pressure and enhancement factor against CIPM's (about 1e-3 of e apart),
/// times the vapour's share of the density (at most 2 %), plus the part of Z that grows
/// with humidity (1.8e-4 at 35 degC, 90 %): 2.5e-4. Ignoring the vapour would be 2e-3 to
/// 2e-2 off at these points; a sign slip in (1 - epsilon) more.
#[test]
fn moist_density_matches_cipm_2007() {
    for (t_c, p, rh, rho_cipm, z, m_a) in CIPM_2007 {
        let t = t_c + 273.15;
        let e = rh / 100.0 * saturation_vapour_pressure_pa(t, p).unwrap();
        let rho = humidity::moist_air(t, p, e).unwrap().density_kg_m3();
        assert!(relative(rho, rho_cipm) <= 7e-4, "{t_c} degC {rh} %: {rho} vs {rho_cipm}");
        let like_cipm = rho * (m_a / SEA_LEVEL_MOLAR_MASS_KG_KMOL) / z;
        assert!(relative(like_cipm, rho_cipm) <= 2.5e-4, "{t_c} degC {rh} %: {like_cipm} vs {rho_cipm}");
        // Dry air of the same T and p: the humidity effect itself is there.
        let dry = humidity::moist_air(t, p, 0.0).unwrap().density_kg_m3();
        assert!(rh == 0.0 || relative(rho, dry) > 1e-3);
    }
}

#[test]
fn a_humid_table_reports_its_humidity_and_moist_density() {
    let (t, p, rh) = (308.15, 100_000.0, 90.0);
    let rows = [
        SoundingRow::new(0.0, t).with_pressure_pa(p).with_relative_humidity_percent(rh),
        SoundingRow::new(1_000.0, 301.65).with_relative_humidity_percent(80.0),
        SoundingRow::new(2_000.0, 296.15).with_dew_point_k(288.15),
    ];
    let table = Tabulated::from_rows(AltitudeKind::Geopotential, &rows).unwrap();
    let at = |h: f64| table.moist_state(Altitude::geopotential_m(h).unwrap()).unwrap();
    let surface = at(0.0);
    assert!((surface.humidity.relative_humidity_percent.unwrap() - rh).abs() < 1e-10);
    let e = rh / 100.0 * saturation_vapour_pressure_pa(t, p).unwrap();
    assert_eq!(surface.state.density_kg_m3, humidity::moist_air(t, p, e).unwrap().density_kg_m3());
    assert!((surface.humidity.vapour_pressure_pa - e).abs() <= 1e-12 * e);
    // The state's molecular-scale temperature is the virtual temperature.
    assert!(relative(surface.state.molecular_temperature_k, surface.humidity.virtual_temperature_k) < 1e-15);
    assert!((at(1_000.0).humidity.relative_humidity_percent.unwrap() - 80.0).abs() < 1e-10);
    assert!((at(2_000.0).humidity.dew_point_k.unwrap() - 288.15).abs() < 1e-9);
    // Between rows the vapour follows the interpolated virtual temperature.
    let mid = at(1_500.0);
    assert!(
        mid.humidity.vapour_pressure_pa > 0.0 && mid.humidity.dew_point_k.unwrap() < mid.state.temperature_k
    );
}

// ---------------------------------------------------------------------------------
// Outside the table.
// ---------------------------------------------------------------------------------

fn hot_humid_rows() -> [SoundingRow; 4] {
    [
        SoundingRow::new(500.0, 305.15).with_pressure_pa(95_500.0).with_dew_point_k(297.15),
        SoundingRow::new(1_500.0, 298.65).with_pressure_pa(85_220.0).with_dew_point_k(293.15),
        SoundingRow::new(3_000.0, 289.15).with_pressure_pa(71_500.0).with_dew_point_k(280.15),
        SoundingRow::new(6_000.0, 268.15).with_pressure_pa(48_600.0),
    ]
}

#[test]
fn outside_the_table_is_an_error_by_default() {
    let table = Tabulated::from_rows(AltitudeKind::Geometric, &hot_humid_rows()).unwrap();
    let message = table.state(Altitude::geometric_m(6_000.5).unwrap()).unwrap_err().to_string();
    assert_eq!(message, "geometric altitude 6000.5 m is outside the allowed range 500 to 6000 m");
    assert!(table.state(Altitude::geometric_m(499.0).unwrap()).is_err());
    assert_eq!(table.above(), OutsideTable::Error);
}

#[test]
fn the_blend_into_the_standard_is_continuous_and_ends_in_the_standard() {
    let depth = 3_000.0;
    let blend = OutsideTable::BlendIntoUs1976 { depth_m: depth };
    let table = Tabulated::from_rows(AltitudeKind::Geometric, &hot_humid_rows())
        .unwrap()
        .with_above(blend)
        .unwrap()
        .with_below(blend)
        .unwrap();
    assert_eq!(table.range().geometric_min_m, US1976.range().geometric_min_m);
    assert_eq!(table.range().geometric_max_m, US1976.range().geometric_max_m);
    let state = |z: f64| table.state(Altitude::geometric_m(z).unwrap()).unwrap();
    for (edge, outward) in [(6_000.0, 1.0), (500.0, -1.0)] {
        let (at, beyond) = (state(edge), state(edge + outward * CONTINUITY_STEP_M));
        for (a, b) in [
            (at.temperature_k, beyond.temperature_k),
            (at.pressure_pa, beyond.pressure_pa),
            (at.density_kg_m3, beyond.density_kg_m3),
        ] {
            assert!(relative(b, a) <= CONTINUITY, "at {edge} m: {a} vs {b}");
        }
        // Half-way through the blend, half of the edge's temperature difference is left.
        let h_edge = Altitude::geometric_m(edge).unwrap().geopotential().meters();
        let h_mid = Altitude::geopotential_m(h_edge + outward * depth / 2.0).unwrap();
        let standard_edge = US1976.state(Altitude::geometric_m(edge).unwrap()).unwrap();
        let expected = US1976.state(h_mid).unwrap().temperature_k
            + 0.5 * (at.temperature_k - standard_edge.temperature_k);
        assert!((table.state(h_mid).unwrap().temperature_k - expected).abs() < 1e-9);
        // At and beyond the blend's depth, the standard itself.
        // (At exactly D the weight is 0 to rounding; a metre beyond, exactly 0.)
        let alt = Altitude::geopotential_m(h_edge + outward * depth).unwrap();
        let (ours, standard) = (table.state(alt).unwrap(), US1976.state(alt).unwrap());
        assert!(relative(ours.temperature_k, standard.temperature_k) < 1e-12);
        assert!(relative(ours.pressure_pa, standard.pressure_pa) < 1e-12);
        for extra in [depth + 1.0, depth + 5_000.0] {
            let alt = Altitude::geopotential_m(h_edge + outward * extra).unwrap();
            if US1976.range().check(alt).is_ok() {
                assert_eq!(table.state(alt).unwrap(), US1976.state(alt).unwrap());
            }
        }
    }
    // Vapour fades out through the blend.
    let above = table.moist_state(Altitude::geometric_m(6_500.0).unwrap()).unwrap();
    assert_eq!(above.humidity.vapour_pressure_pa, 0.0);
    let below = table.moist_state(Altitude::geometric_m(400.0).unwrap()).unwrap();
    assert!(below.humidity.vapour_pressure_pa > 0.0);
}

#[test]
fn blend_settings_are_checked() {
    let table = Tabulated::from_rows(AltitudeKind::Geometric, &hot_humid_rows()).unwrap();
    for depth in [0.0, -1.0, f64::NAN] {
        assert!(table.clone().with_above(OutsideTable::BlendIntoUs1976 { depth_m: depth }).is_err());
    }
    // A table that starts below the standard's range cannot blend into it there.
    let deep = [
        SoundingRow::new(-6_000.0, 330.0).with_pressure_pa(190_000.0),
        SoundingRow::new(-5_500.0, 327.0).with_pressure_pa(180_500.0),
    ];
    let deep = Tabulated::from_rows(AltitudeKind::Geometric, &deep).unwrap();
    let error = deep.with_below(OutsideTable::BlendIntoUs1976 { depth_m: 1_000.0 }).unwrap_err();
    assert!(error.to_string().contains("outside the allowed range"), "{error}");
}

// ---------------------------------------------------------------------------------
// Every validation error, from a malformed CSV.
// ---------------------------------------------------------------------------------

/// The loader's message for `text`, which must fail.
fn csv_error(text: &str) -> String {
    parse_csv(text).map(|_| ()).unwrap_err().to_string()
}

fn assert_mentions(message: &str, words: &[&str]) {
    for word in words {
        assert!(message.contains(word), "{message:?} should contain {word:?}");
    }
}

const HEADER: &str =
    "# invented test data\ngeometric_altitude_m,temperature_degC,pressure_hPa,dew_point_degC\n";

#[test]
fn fewer_than_two_rows() {
    let message = csv_error(&format!("{HEADER}0,30,1010,24\n"));
    assert_mentions(&message, &["line 2", "a table needs at least 2 rows, got 1"]);
}

#[test]
fn altitudes_not_increasing() {
    let message = csv_error(&format!("{HEADER}0,30,1010,24\n1000,24,900,20\n1000,20,850,15\n"));
    assert_mentions(
        &message,
        &[
            "line 5",
            "column 1 (geometric_altitude_m)",
            "value '1000'",
            "row 2: altitude 1000 m must be at least",
        ],
    );
}

#[test]
fn temperature_at_or_below_zero_kelvin() {
    let message = csv_error(&format!("{HEADER}0,30,1010,24\n1000,-300,900,\n"));
    assert_mentions(
        &message,
        &["line 4", "column 2 (temperature_degC)", "value '-300'", "temperature must be above 0 K"],
    );
}

#[test]
fn pressure_not_positive() {
    let message = csv_error(&format!("{HEADER}0,30,1010,24\n1000,24,0,\n"));
    assert_mentions(
        &message,
        &["line 4", "column 3 (pressure_hPa)", "value '0'", "pressure must be greater than 0 Pa"],
    );
}

#[test]
fn density_not_positive() {
    let text = "geopotential_altitude_ft,temperature_K,density_kg_m3\n0,300,1.17\n3000,294,-1.05\n";
    let message = csv_error(text);
    assert_mentions(
        &message,
        &["line 3", "column 3 (density_kg_m3)", "value '-1.05'", "density must be greater than 0"],
    );
}

#[test]
fn pressure_not_decreasing() {
    let message = csv_error(&format!("{HEADER}0,30,1010,24\n1000,24,1010.5,\n"));
    assert_mentions(
        &message,
        &["line 4", "column 3 (pressure_hPa)", "value '1010.5'", "must be below the previous row's"],
    );
}

#[test]
fn derived_pressure_not_decreasing() {
    // Densities whose pressures (rho R T) rise: 1.0 kg/m^3 at 300 K is above 1.2 at 240 K.
    let text = "geometric_altitude_m,temperature_K,density_kg_m3\n0,240,1.2\n100,300,1.0\n";
    assert_mentions(
        &csv_error(text),
        &["line 3", "column 3 (density_kg_m3)", "value '1.0'", "must be below the previous"],
    );
}

#[test]
fn relative_humidity_outside_0_to_100() {
    let text = "geometric_altitude_m,temperature_degC,pressure_hPa,relative_humidity_percent\n0,30,1010,70\n1000,24,900,101\n";
    assert_mentions(
        &csv_error(text),
        &[
            "line 3",
            "column 4 (relative_humidity_percent)",
            "value '101'",
            "outside the allowed range 0 to 100 %",
        ],
    );
    let text = "geometric_altitude_m,temperature_degC,pressure_hPa,relative_humidity_percent\n0,30,1010,-0.5\n1000,24,900,\n";
    assert_mentions(&csv_error(text), &["line 2", "value '-0.5'", "relative humidity -0.5 %"]);
}

#[test]
fn dew_point_above_temperature() {
    let message = csv_error(&format!("{HEADER}0,25,1010,26\n1000,24,900,\n"));
    assert_mentions(
        &message,
        &["line 3", "column 4 (dew_point_degC)", "value '26'", "must not be above the temperature"],
    );
}

#[test]
fn nan_and_infinity_anywhere() {
    for (cells, column, value) in [
        ("nan,24,900,", "column 1 (geometric_altitude_m)", "nan"),
        ("1000,inf,900,", "column 2 (temperature_degC)", "inf"),
        ("1000,24,NaN,", "column 3 (pressure_hPa)", "NaN"),
        ("1000,24,900,-infinity", "column 4 (dew_point_degC)", "-infinity"),
    ] {
        let message = csv_error(&format!("{HEADER}0,30,1010,24\n{cells}\n"));
        assert_mentions(
            &message,
            &["line 4", column, &format!("value '{value}'"), "must be a finite number"],
        );
    }
}

#[test]
fn feet_read_as_metres_break_hydrostatic_balance() {
    // Altitudes in feet under a metre header: the pressures fall 3.3 times too fast.
    let text = "geometric_altitude_m,temperature_degC,pressure_hPa\n0,30,1010\n3281,23.5,898.6\n";
    assert_mentions(
        &csv_error(text),
        &[
            "line 3",
            "column 3 (pressure_hPa)",
            "value '898.6'",
            "rows 0 and 1",
            "the allowed range is 0.5 to 2",
        ],
    );
}

#[test]
fn mixed_or_missing_columns() {
    let text = "geometric_altitude_m,temperature_K,pressure_Pa,density_kg_m3\n0,300,100000,\n100,299,,1.15\n";
    assert_mentions(
        &csv_error(text),
        &["line 3", "row 1: gives a density, but the first row gives a pressure"],
    );
    let text = "geometric_altitude_m,temperature_K,pressure_Pa\n0,300,100000\n100,299,98900\n200,298,\n";
    assert_mentions(&csv_error(text), &["line 4", "row 2: gives no pressure, but the rows before it do"]);
    let text = "geometric_altitude_m,temperature_K,pressure_Pa\n0,300,\n100,299,\n";
    assert_mentions(&csv_error(text), &["line 2", "the first row must give a pressure or a density"]);
    let text = "geometric_altitude_m,temperature_K,pressure_Pa,dew_point_K,relative_humidity_percent\n0,300,1e5,290,50\n100,299,,,\n";
    assert_mentions(&csv_error(text), &["line 2", "both a dew point and a relative humidity"]);
}

#[test]
fn humidity_outside_the_saturation_formulas_band() {
    let message = csv_error(&format!("{HEADER}0,75,1010,24\n1000,24,900,\n"));
    assert_mentions(
        &message,
        &["line 3", "column 2 (temperature_degC)", "value '75'", "temperature of a row with humidity"],
    );
}

#[test]
fn vapour_pressure_above_the_pressure() {
    // 55 degC and saturated at 100 hPa: the vapour alone would be 157 hPa.
    let message = csv_error(&format!("{HEADER}0,55,100,55\n1000,50,90,\n"));
    assert_mentions(
        &message,
        &[
            "line 3",
            "column 4 (dew_point_degC)",
            "value '55'",
            "vapour pressure",
            "must be below the pressure",
        ],
    );
}

#[test]
fn malformed_text() {
    assert_mentions(&csv_error("# only a comment\n"), &["line 1", "no header line"]);
    assert_mentions(
        &csv_error("altitude_m,temperature_K,pressure_Pa\n"),
        &["line 1", "column 1 (altitude_m)", "say which altitude"],
    );
    assert_mentions(
        &csv_error("geometric_altitude_m,temperature_C,pressure_Pa\n"),
        &["line 1", "column 2 (temperature_C)", "unit 'C' is not one of K, degC, degF"],
    );
    assert_mentions(
        &csv_error("geometric_altitude_m,temperature_K,wind_kt\n"),
        &["column 3 (wind_kt)", "unknown column"],
    );
    assert_mentions(
        &csv_error("geometric_altitude_m,temperature_K,pressure_Pa,pressure_hPa\n"),
        &["column 4 (pressure_hPa)", "a second column of this quantity (the first is column 3)"],
    );
    assert_mentions(
        &csv_error("geometric_altitude_m,pressure_Pa\n"),
        &["line 1", "needs a temperature column"],
    );
    assert_mentions(&csv_error("geometric_altitude_m,temperature_K\n"), &["needs a pressure"]);
    assert_mentions(
        &csv_error(&format!("{HEADER}0,30,1010\n")),
        &["line 3", "3 cells, but the header on line 2 has 4 columns"],
    );
    assert_mentions(
        &csv_error(&format!("{HEADER}0,thirty,1010,\n")),
        &["line 3", "column 2 (temperature_degC)", "value 'thirty'", "not a number"],
    );
    assert_mentions(
        &csv_error(&format!("{HEADER}0,,1010,\n")),
        &["line 3", "column 2 (temperature_degC)", "a value is required"],
    );
}

#[test]
fn units_are_converted() {
    let text = "\u{feff}# units\r\ngeopotential_altitude_km,temperature_degF,pressure_kPa,relative_humidity_percent\r\n\
                0,86,101,50\r\n\"1\",72.5,89.9,\r\n";
    let table = parse_csv(text).unwrap();
    let level = table.levels()[1];
    assert_eq!(level.geopotential_altitude_m(), 1_000.0);
    assert!((level.temperature_k() - (72.5 + 459.67) * 5.0 / 9.0).abs() < 1e-12);
    assert!(relative(level.pressure_pa(), 89_900.0) <= f64::EPSILON);
    assert!(table.levels()[0].vapour_pressure_pa() > 0.0);
}

// ---------------------------------------------------------------------------------
// Properties.
// ---------------------------------------------------------------------------------

fn wild_row() -> impl Strategy<Value = SoundingRow> {
    (
        wild(),
        wild(),
        proptest::option::of(wild()),
        proptest::option::of(wild()),
        proptest::option::of(wild()),
        proptest::option::of(wild()),
    )
        .prop_map(
            |(
                altitude_m,
                temperature_k,
                pressure_pa,
                density_kg_m3,
                dew_point_k,
                relative_humidity_percent,
            )| {
                SoundingRow {
                    altitude_m,
                    temperature_k,
                    pressure_pa,
                    density_kg_m3,
                    dew_point_k,
                    relative_humidity_percent,
                }
            },
        )
}

fn assert_finite(state: &State) {
    for (name, value) in state.fields() {
        if let Some(value) = value {
            assert!(value.is_finite(), "{name} = {value}");
        }
    }
}

/// A valid table: a hot, humid invented profile with random spacing, lapse rates and
/// humidity, its pressures either derived (first row only), given (then perturbed a
/// little, so that pairs need a gravity factor) or as densities.
fn valid_table() -> impl Strategy<Value = (AltitudeKind, Vec<SoundingRow>)> {
    let row = (
        10.0..2_500.0f64,
        -9.0e-3..4.0e-3f64,
        prop_oneof![Just(None), Just(Some(true)), Just(Some(false))],
        0.0..100.0f64,
        0.0..15.0f64,
        -2e-3..2e-3f64,
    );
    (
        prop_oneof![Just(AltitudeKind::Geometric), Just(AltitudeKind::Geopotential)],
        -400.0..3_000.0f64,
        285.0..318.0f64,
        90_000.0..104_000.0f64,
        0..3u8,
        proptest::collection::vec(row, 1..14),
    )
        .prop_map(|(kind, start, t0, p0, given, rest)| {
            let mut rows =
                vec![SoundingRow::new(start, t0).with_pressure_pa(p0).with_relative_humidity_percent(60.0)];
            let (mut z, mut t) = (start, t0);
            for (spacing, lapse, humid, rh, depression, _) in &rest {
                z += spacing;
                t = (t + lapse * spacing).clamp(200.0, 330.0);
                let mut row = SoundingRow::new(z, t);
                // Humid rows where the air could hold the vapour (below 12 km, where the
                // pressure stays above 19 kPa, and below 310 K, where e_w is 6.2 kPa).
                let humid = if z < 12_000.0 && t < 310.0 { *humid } else { None };
                row = match humid {
                    Some(true) => row.with_relative_humidity_percent(*rh),
                    Some(false) if t - depression > 175.0 => row.with_dew_point_k(t - depression),
                    _ => row,
                };
                rows.push(row);
            }
            let hydrostatic = Tabulated::from_rows_vec(kind, &rows).expect("a valid hydrostatic table");
            if given != 0 {
                // Pressures moved by a random walk of up to 2e-3 per 2.5 km of spacing: the
                // pairs then need gravity factors up to 1 +- 0.7 %.
                let mut walk = 0.0;
                let steps = std::iter::once((0.0, 0.0)).chain(rest.iter().map(|r| (r.0, r.5)));
                for ((row, level), (spacing, step)) in rows.iter_mut().zip(hydrostatic.levels()).zip(steps) {
                    walk += step * spacing / 2_500.0;
                    let p = level.pressure_pa() * (1.0 + walk);
                    if given == 1 {
                        row.pressure_pa = Some(p);
                    } else {
                        let air = humidity::moist_air(level.temperature_k(), p, level.vapour_pressure_pa())
                            .unwrap();
                        row.pressure_pa = None;
                        row.density_kg_m3 = Some(air.density_kg_m3());
                    }
                }
            }
            (kind, rows)
        })
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 600, ..ProptestConfig::default() })]

    #[test]
    fn random_rows_never_panic(rows in proptest::collection::vec(wild_row(), 0..6), a in wild(), depth in wild()) {
        for kind in [AltitudeKind::Geometric, AltitudeKind::Geopotential] {
            let Ok(table) = Tabulated::from_rows_vec(kind, &rows) else { continue };
            for outside in [OutsideTable::Error, OutsideTable::BlendIntoUs1976 { depth_m: depth }] {
                let Ok(model) = table.clone().with_above(outside).and_then(|t| t.with_below(outside)) else { continue };
                for altitude in [Altitude::geometric_m(a), Altitude::geopotential_m(a)].into_iter().flatten() {
                    if let Ok(s) = model.state(altitude) { assert_finite(&s); }
                    if let Ok(m) = model.moist_state(altitude) {
                        assert_finite(&m.state);
                        prop_assert!(m.humidity.vapour_pressure_pa.is_finite() && m.humidity.vapour_pressure_pa >= 0.0);
                    }
                }
                for row in &rows {
                    if let Ok(altitude) = kind.altitude(row.altitude_m) {
                        if let Ok(s) = model.state(altitude) { assert_finite(&s); }
                    }
                }
            }
        }
        let _ = parse_csv(&rows_to_csv(AltitudeKind::Geometric, &rows));
    }

    #[test]
    fn random_csv_text_never_panics(lines in proptest::collection::vec("[ -~]{0,40}", 0..6), header in 0..3usize) {
        let headers = [
            "geometric_altitude_ft,temperature_degC,pressure_hPa,dew_point_degC,relative_humidity_percent",
            "geopotential_altitude_m,temperature_K,density_kg_m3",
            "",
        ];
        let text = format!("{}\n{}\n", headers[header], lines.join("\n"));
        let _ = parse_csv(&text).map(|t| t.state(Altitude::geometric_m(0.0).unwrap()));
        let numeric: Vec<String> = lines.iter().map(|l| l.chars().map(|c| if c.is_ascii_digit() || ",.-e".contains(c) { c } else { ',' }).collect()).collect();
        let _ = parse_csv(&format!("{}\n{}\n", headers[header], numeric.join("\n")));
    }

    #[test]
    fn exact_at_rows_and_continuous_across_them((kind, rows) in valid_table()) {
        let table = Tabulated::from_rows_vec(kind, &rows).unwrap();
        for (i, (row, level)) in rows.iter().zip(table.levels()).enumerate() {
            let altitude = kind.altitude(row.altitude_m).unwrap();
            let m = table.moist_state(altitude).unwrap();
            prop_assert_eq!(m.state.temperature_k, row.temperature_k);
            prop_assert_eq!(m.state.pressure_pa, level.pressure_pa());
            if let Some(p) = row.pressure_pa { prop_assert_eq!(m.state.pressure_pa, p); }
            if let Some(rho) = row.density_kg_m3 { prop_assert!(relative(m.state.density_kg_m3, rho) < 4.0 * f64::EPSILON); }
            if let Some(rh) = row.relative_humidity_percent { prop_assert!((m.humidity.relative_humidity_percent.unwrap() - rh).abs() < 1e-9); }
            if let Some(td) = row.dew_point_k { prop_assert!((m.humidity.dew_point_k.unwrap() - td).abs() < 1e-8); }
            if i > 0 {
                let h = level.geopotential_altitude_m();
                let at = |h: f64| table.state(Altitude::geopotential_m(h).unwrap()).unwrap();
                let (one, two, here) = (at(h - CONTINUITY_STEP_M), at(h - 2.0 * CONTINUITY_STEP_M), at(h));
                for (((name, a), (_, b)), (_, c)) in one.fields().iter().zip(two.fields().iter()).zip(here.fields().iter()).skip(2) {
                    let (a, b, c) = (a.unwrap(), b.unwrap(), c.unwrap());
                    let limit = 2.0 * a - b;
                    prop_assert!(relative(limit, c) <= ROW_CONTINUITY, "{} jumps at row {}: {} from below vs {}", name, i, limit, c);
                }
            }
        }
    }

    #[test]
    fn pressure_falls_and_the_gas_and_hydrostatic_laws_hold((kind, rows) in valid_table(), fractions in proptest::collection::vec(0.0..1.0f64, 8)) {
        let table = Tabulated::from_rows_vec(kind, &rows).unwrap();
        let levels = table.levels();
        let (bottom, top) = (levels[0].geopotential_altitude_m(), levels[levels.len() - 1].geopotential_altitude_m());
        let mut heights: Vec<f64> = fractions.iter().map(|f| bottom + f * (top - bottom)).collect();
        heights.sort_by(f64::total_cmp);
        let at = |h: f64| table.moist_state(Altitude::geopotential_m(h).unwrap()).unwrap();
        let mut previous: Option<f64> = None;
        for &h in &heights {
            let m = at(h);
            if let Some(p) = previous { prop_assert!(m.state.pressure_pa <= p); }
            previous = Some(m.state.pressure_pa);
            let gas = m.state.density_kg_m3 * GAS_CONSTANT_J_KMOL_K * m.humidity.virtual_temperature_k / SEA_LEVEL_MOLAR_MASS_KG_KMOL;
            prop_assert!(relative(gas, m.state.pressure_pa) < GAS_LAW, "p {} vs rho R T_v {}", m.state.pressure_pa, gas);
            // dp/dH = -k rho g0 inside a pair (k its gravity factor).
            let pair = levels.partition_point(|l| l.geopotential_altitude_m() <= h).saturating_sub(1).min(levels.len() - 2);
            let (lo, hi) = (levels[pair].geopotential_altitude_m(), levels[pair + 1].geopotential_altitude_m());
            if h - lo > 2.0 * HYDROSTATIC_STEP_M && hi - h > 2.0 * HYDROSTATIC_STEP_M {
                // Central differences over +-s and +-s/2, combined (Richardson) so that the
                // error is of order s^4.
                let central = |s: f64| (at(h + s).state.pressure_pa - at(h - s).state.pressure_pa) / (2.0 * s);
                let dp = (4.0 * central(HYDROSTATIC_STEP_M / 2.0) - central(HYDROSTATIC_STEP_M)) / 3.0;
                let expected = -levels[pair].gravity_factor() * m.state.density_kg_m3 * G0_M_S2;
                prop_assert!(relative(dp, expected) < HYDROSTATIC_BALANCE, "at H={}: dp/dH {} vs -k rho g0 {}", h, dp, expected);
            }
        }
    }
}
