//! Properties of the tabulated (sounding) model over random tables: no panic and no
//! silent NaN for any rows or text, exact at the rows and continuous across them, and
//! pressure falling with the gas law and hydrostatic balance holding everywhere.
//!
//! Tolerances, and why each is what it is:
//! - continuity across a row, 1e-11 relative between the value at the row and the
//!   straight-line extrapolation of the values 1 and 2 micrometres below it (a steep
//!   humidity step moves T_v by 0.5 K/m, so the gradient must be taken out);
//! - gas law p = rho R* T_v / M0, 1e-13: a few roundings;
//! - hydrostatic balance within a pair, 1e-6 for central differences over +-5 m and
//!   +-2.5 m combined to fourth order (a single difference over +-5 m is off by 4e-6
//!   where a humidity step makes T_v fall 0.2 K/m; the combination, by 2e-8); the layer
//!   formula's rounding, a few parts in 1e15 (1e-11 where it is evaluated as a general
//!   power of a base close to 1), adds less than 2e-8 over those steps.

use aerostrata::constants::{G0_M_S2, GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use aerostrata::humidity;
use aerostrata::model::sounding_io::{parse_csv, rows_to_csv};
use aerostrata::{Altitude, AltitudeKind, Atmosphere, OutsideTable, SoundingRow, Tabulated};
use proptest::prelude::*;

mod common;
use common::{assert_finite, relative, wild};

const CONTINUITY_STEP_M: f64 = 1e-6;
const ROW_CONTINUITY: f64 = 1e-11;
const GAS_LAW: f64 = 1e-13;
const HYDROSTATIC_BALANCE: f64 = 1e-6;
const HYDROSTATIC_STEP_M: f64 = 5.0;

fn wild_row() -> impl Strategy<Value = SoundingRow> {
    let optional = || proptest::option::of(wild());
    (wild(), wild(), optional(), optional(), optional(), optional()).prop_map(
        |(altitude_m, temperature_k, pressure_pa, density_kg_m3, dew_point_k, relative_humidity_percent)| {
            SoundingRow {
                pressure_pa,
                density_kg_m3,
                dew_point_k,
                relative_humidity_percent,
                ..SoundingRow::new(altitude_m, temperature_k)
            }
        },
    )
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
