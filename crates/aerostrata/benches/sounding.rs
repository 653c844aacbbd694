//! What one evaluation of a 200-row tabulated sounding costs, measured in one run next to
//! the 1976 standard at the same altitudes, so that the ratio is comparable on any
//! machine (the goal: the sounding at most 1.5 times the standard).
//!
//! The sounding is an invented hot, humid profile (rows every 100 m of geometric altitude
//! from 0 to 19.9 km, dew points below 10 km, a pressure on every row); the altitudes are
//! 1024 pseudo-random geometric altitudes uniform over the same band (fixed seed),
//! converted to [`Altitude`] before timing. One criterion iteration evaluates all of them.
//!
//! | id                        | what one element is                                     |
//! |---------------------------|---------------------------------------------------------|
//! | `standard_full_state`     | `US1976.state(alt)`                                     |
//! | `sounding_full_state`     | `sounding.state(alt)`, the 200-row humid sounding       |
//! | `sounding_dry_full_state` | the same rows without humidity                          |
//! | `sounding_uneven_full_state` | 200 humid rows spaced as (i / 199)^2: 0.5 m apart at the ground, 200 m at the top |
//! | `sounding_moist_state`    | `sounding.moist_state(alt)`: the state and the humidity |
//! | `standard_density`        | `US1976.density_kg_m3(alt)`                             |
//! | `sounding_density`        | `sounding.density_kg_m3(alt)`                           |
//!
//! Before anything is timed, the sounding is checked to give a finite state at every
//! sampled altitude and its own rows back at the rows.

use aerostrata::{Altitude, AltitudeKind, Atmosphere, SoundingLevel, SoundingRow, Tabulated, US1976};
use criterion::Criterion;

mod common;
use common::{bench_each, bench_main, group_of, per_evaluation, XorShift64};

const COUNT: usize = 1024;
const ROWS: usize = 200;
const ROW_SPACING_M: f64 = 100.0;
const SEED: u64 = 0x2545_f491_4f6c_dd1d;
const GROUP: &str = "sounding";

/// Temperature (K) and dew point (K, below 10 km) of the invented profile at `z_m`.
fn profile(z_m: f64) -> (f64, Option<f64>) {
    let t = if z_m < 16_500.0 { 306.5 - 6.6e-3 * z_m } else { 197.6 + 2.0e-3 * (z_m - 16_500.0) };
    let dew_point = (z_m < 10_000.0).then_some(t - 6.0 - 1.4e-3 * z_m);
    (t, dew_point)
}

/// The rows: temperatures and dew points from the profile, and pressures from the
/// hydrostatic law (a table with a pressure on the first row only), then written on every
/// row rounded to 0.01 Pa as a real sounding's would be. Evenly spaced, or `uneven`ly
/// (dense near the ground, as a balloon's rows are where it rises through the surface
/// layer, sparse aloft) over the same band.
fn rows(humid: bool, uneven: bool) -> Vec<SoundingRow> {
    let top_m = (ROWS - 1) as f64 * ROW_SPACING_M;
    let mut rows: Vec<SoundingRow> = (0..ROWS)
        .map(|i| {
            let fraction = i as f64 / (ROWS - 1) as f64;
            let z = if uneven { top_m * fraction * fraction } else { i as f64 * ROW_SPACING_M };
            let (t, dew_point) = profile(z);
            let row = SoundingRow::new(z, t);
            match dew_point {
                Some(td) if humid => row.with_dew_point_k(td),
                _ => row,
            }
        })
        .collect();
    rows[0].pressure_pa = Some(100_900.0);
    let hydrostatic = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows).expect("a valid profile");
    for (row, level) in rows.iter_mut().zip(hydrostatic.levels()) {
        row.pressure_pa = Some((level.pressure_pa() * 100.0).round() / 100.0);
    }
    rows
}

fn check(table: &Tabulated<Vec<SoundingLevel>>, rows: &[SoundingRow], altitudes: &[Altitude]) {
    for &altitude in altitudes {
        let state = table.state(altitude).expect("inside the table");
        assert!(state.fields().iter().all(|(_, v)| v.is_none_or(f64::is_finite)));
    }
    for row in rows {
        let state = table.state(Altitude::geometric_m(row.altitude_m).unwrap()).unwrap();
        assert_eq!(state.temperature_k, row.temperature_k);
        assert_eq!(Some(state.pressure_pa), row.pressure_pa);
    }
}

fn benchmarks(c: &mut Criterion) {
    let top_m = (ROWS - 1) as f64 * ROW_SPACING_M;
    let mut rng = XorShift64(SEED);
    let altitudes: Vec<Altitude> =
        (0..COUNT).map(|_| Altitude::geometric_m(rng.next_unit() * top_m).expect("in range")).collect();
    let (humid_rows, dry_rows, uneven_rows) = (rows(true, false), rows(false, false), rows(true, true));
    let humid = Tabulated::from_rows_vec(AltitudeKind::Geometric, &humid_rows).expect("a valid sounding");
    let dry = Tabulated::from_rows_vec(AltitudeKind::Geometric, &dry_rows).expect("a valid sounding");
    let uneven = Tabulated::from_rows_vec(AltitudeKind::Geometric, &uneven_rows).expect("a valid sounding");
    check(&humid, &humid_rows, &altitudes);
    check(&dry, &dry_rows, &altitudes);
    check(&uneven, &uneven_rows, &altitudes);

    let mut group = group_of(c, GROUP, COUNT);
    bench_each(&mut group, "standard_full_state", &altitudes, |altitude| US1976.state(altitude));
    bench_each(&mut group, "sounding_full_state", &altitudes, |altitude| humid.state(altitude));
    bench_each(&mut group, "sounding_dry_full_state", &altitudes, |altitude| dry.state(altitude));
    bench_each(&mut group, "sounding_uneven_full_state", &altitudes, |altitude| uneven.state(altitude));
    bench_each(&mut group, "sounding_moist_state", &altitudes, |altitude| humid.moist_state(altitude));
    bench_each(&mut group, "standard_density", &altitudes, |altitude| US1976.density_kg_m3(altitude));
    bench_each(&mut group, "sounding_density", &altitudes, |altitude| humid.density_kg_m3(altitude));
    group.finish();
}

bench_main!(benchmarks, per_evaluation());
