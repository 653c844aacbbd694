//! What one evaluation of the standard atmosphere costs, measured in one run next to the
//! yardsticks it is judged against, so that the ratios are comparable on any machine.
//!
//! Every benchmark walks the same fixed, pseudo-random set of geometric altitudes
//! (uniform in [0, 86 000] m, fixed seed) converted to [`Altitude`] before timing; one
//! criterion iteration is one pass over the whole set, and the report
//! (`cargo xtask bench`, which writes `docs/performance.md`) divides by the set's size,
//! read back from criterion's `benchmark.json` (the `Throughput::Elements` recorded here).
//!
//! The benchmark ids are parsed by `crates/xtask/src/bench.rs`; keep them stable:
//!
//! | id                               | what one element is                                   |
//! |----------------------------------|-------------------------------------------------------|
//! | `full_state`                     | `US1976.state(alt)`                                   |
//! | `density_only`                   | `US1976.density_kg_m3(alt)`                           |
//! | `libm_pow_plus_sqrt`             | one `libm::pow` plus one `libm::sqrt`                 |
//! | `baseline_layer_walk_density`    | naive density: walk the layers up from sea level      |
//! | `baseline_layer_walk_full_state` | the naive walk, then the library's own [`State::new`] |
//!
//! Before anything is timed, both baselines are checked against the library (1e-12
//! relative), so that the comparison is between implementations that agree.
//!
//! `std::hint::black_box` is used (in benches/common) rather than `criterion::black_box`:
//! in criterion 0.5 without its nightly feature the latter is a volatile copy of its
//! argument, which for a whole [`State`] (about 30 machine words) would charge a memory
//! copy to `full_state` that the other benchmarks do not pay. (Later criterion releases
//! re-export the standard one.)

use aerostrata::constants::{EARTH_RADIUS_M, G0_M_S2, GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use aerostrata::{Air, Altitude, Atmosphere, Result, State, US1976};
use criterion::Criterion;

mod common;
use common::{bench_each, bench_main, group_of, per_evaluation, XorShift64};

/// How many altitudes one iteration evaluates.
const COUNT: usize = 1024;
/// Fixed seed of the altitude generator (any non-zero value; fixed so runs compare).
const SEED: u64 = 0x9e37_79b9_7f4a_7c15;
/// Top of the sampled band, geometric m (the band starts at sea level).
const TOP_M: f64 = 86_000.0;

/// The group every benchmark lives in: `target/criterion/state/<id>/new/estimates.json`.
const GROUP: &str = "state";

// The constants the naive baseline is written with, typed here as a from-scratch
// implementation would type them; `check_constants` proves they are the library's.
const G0: f64 = 9.806_65;
const M0: f64 = 28.964_4;
const R_STAR: f64 = 8_314.32;
const R0: f64 = 6_356_766.0;

/// The fixed altitudes, geometric metres.
fn altitudes_m() -> Vec<f64> {
    let mut rng = XorShift64(SEED);
    (0..COUNT).map(|_| rng.next_unit() * TOP_M).collect()
}

/// A naive layered atmosphere: only the base altitudes and lapse rates of the layers and
/// the sea-level temperature and pressure are kept; every call walks up from sea level,
/// recomputing each crossed layer's top temperature and pressure (one `pow` or `exp`
/// per layer) before evaluating the layer that holds the altitude.
struct LayerWalk {
    base_geopotential_m: Vec<f64>,
    lapse_rate_k_m: Vec<f64>,
    sea_level_temperature_k: f64,
    sea_level_pressure_pa: f64,
}

impl LayerWalk {
    fn from_standard() -> Self {
        let layers = US1976.layers();
        Self {
            base_geopotential_m: layers.iter().map(|l| l.base_geopotential_m).collect(),
            lapse_rate_k_m: layers.iter().map(|l| l.lapse_rate_k_m).collect(),
            sea_level_temperature_k: layers[0].base_temperature_k,
            sea_level_pressure_pa: layers[0].base_pressure_pa,
        }
    }

    /// Temperature (K) and pressure (Pa) at geometric altitude `z_m` (at or above the
    /// first base; no range check, no M/M0 correction above 80 km).
    fn temperature_pressure(&self, z_m: f64) -> (f64, f64) {
        let h = R0 * z_m / (R0 + z_m);
        let gmr = G0 * M0 / R_STAR;
        let mut t_base = self.sea_level_temperature_k;
        let mut p_base = self.sea_level_pressure_pa;
        let last = self.base_geopotential_m.len() - 1;
        for i in 0..=last {
            let inside = i == last || h < self.base_geopotential_m[i + 1];
            let to = if inside { h } else { self.base_geopotential_m[i + 1] };
            let dh = to - self.base_geopotential_m[i];
            let lapse = self.lapse_rate_k_m[i];
            let (t, p) = if lapse == 0.0 {
                (t_base, p_base * libm::exp(-gmr * dh / t_base))
            } else {
                let t = t_base + lapse * dh;
                (t, p_base * libm::pow(t_base / t, gmr / lapse))
            };
            if inside {
                return (t, p);
            }
            t_base = t;
            p_base = p;
        }
        unreachable!("the last layer is always `inside`")
    }

    fn density_kg_m3(&self, altitude: Altitude) -> f64 {
        let (t, p) = self.temperature_pressure(altitude.geometric().meters());
        p * M0 / (R_STAR * t)
    }

    /// The walk's temperature and pressure, then the library's own derivation of every
    /// other property: the difference from `full_state` is the walk alone (less the
    /// range check and the M/M0 table, which the baseline skips).
    fn state(&self, altitude: Altitude) -> Result<State> {
        let (t, p) = self.temperature_pressure(altitude.geometric().meters());
        Ok(State::new(altitude, Air::standard_composition(t, p)?))
    }
}

fn check_constants() {
    assert_eq!(G0, G0_M_S2);
    assert_eq!(M0, SEA_LEVEL_MOLAR_MASS_KG_KMOL);
    assert_eq!(R_STAR, GAS_CONSTANT_J_KMOL_K);
    assert_eq!(R0, EARTH_RADIUS_M);
}

/// |a - b| / |b|, and 0 when both are exactly equal (zero altitude, for one).
fn relative_difference(a: f64, b: f64) -> f64 {
    if a == b {
        0.0
    } else {
        (a - b).abs() / b.abs()
    }
}

/// The baselines agree with the library to 1e-12 relative: density everywhere, every
/// field of the state below 80 km (above it the library applies the standard's M/M0
/// table to temperature and molecular weight, which the baseline omits; density is
/// unaffected, since the ratio cancels in p M / (R* T)).
fn check_baselines(walk: &LayerWalk, altitudes: &[Altitude]) {
    const TOLERANCE: f64 = 1e-12;
    // The sampled points plus every layer base and both ends of the band.
    let mut points: Vec<Altitude> = altitudes.to_vec();
    for layer in US1976.layers() {
        points.push(
            Altitude::geopotential_m(layer.base_geopotential_m).expect("a layer base is a valid altitude"),
        );
    }
    points.push(Altitude::geometric_m(TOP_M).expect("86 km is a valid altitude"));
    for &altitude in &points {
        let z = altitude.geometric().meters();
        let ours = US1976.density_kg_m3(altitude).expect("the altitude is in the standard's range");
        let theirs = walk.density_kg_m3(altitude);
        let difference = relative_difference(theirs, ours);
        assert!(difference <= TOLERANCE, "baseline density at {z} m differs by {difference:e} relative");
        if z < 80_000.0 {
            let ours = US1976.state(altitude).expect("in range");
            let theirs = walk.state(altitude).expect("positive temperature and pressure");
            for ((name, a), (_, b)) in theirs.fields().iter().zip(ours.fields().iter()) {
                match (a, b) {
                    (Some(a), Some(b)) => {
                        let difference = relative_difference(*a, *b);
                        assert!(
                            difference <= TOLERANCE,
                            "baseline {name} at {z} m differs by {difference:e}"
                        );
                    }
                    (None, None) => {}
                    _ => panic!("baseline {name} at {z} m is defined in one state only"),
                }
            }
        }
    }
}

/// Inputs of the pow-plus-sqrt yardstick, one per altitude: (T0 / T, g0 M0 / (R* L0), T)
/// with T the standard's temperature there and L0 the first layer's lapse rate, i.e. the
/// power a layer evaluation takes and the square root a speed of sound takes.
fn pow_sqrt_inputs(altitudes: &[Altitude]) -> Vec<(f64, f64, f64)> {
    let first = US1976.layers()[0];
    let exponent = G0 * M0 / (R_STAR * first.lapse_rate_k_m);
    altitudes
        .iter()
        .map(|&altitude| {
            let t = US1976.temperature_k(altitude).expect("in range");
            (first.base_temperature_k / t, exponent, t)
        })
        .collect()
}

fn benchmarks(c: &mut Criterion) {
    check_constants();
    let altitudes: Vec<Altitude> = altitudes_m()
        .into_iter()
        .map(|z| Altitude::geometric_m(z).expect("sampled altitudes are valid"))
        .collect();
    let walk = LayerWalk::from_standard();
    check_baselines(&walk, &altitudes);
    let pow_sqrt = pow_sqrt_inputs(&altitudes);
    // The same fractions of the range, mapped onto the upper part (86 to 1000 km).
    let upper: Vec<Altitude> = altitudes_m()
        .into_iter()
        .map(|z| Altitude::geometric_m(86_000.0 + 914_000.0 * z / TOP_M).expect("valid"))
        .collect();

    let mut group = group_of(c, GROUP, COUNT);

    bench_each(&mut group, "full_state", &altitudes, |altitude| US1976.state(altitude));
    bench_each(&mut group, "full_state_upper", &upper, |altitude| US1976.state(altitude));
    bench_each(&mut group, "density_only", &altitudes, |altitude| US1976.density_kg_m3(altitude));
    bench_each(&mut group, "libm_pow_plus_sqrt", &pow_sqrt, |(ratio, exponent, t)| {
        libm::pow(ratio, exponent) + libm::sqrt(t)
    });
    bench_each(&mut group, "baseline_layer_walk_density", &altitudes, |altitude| {
        walk.density_kg_m3(altitude)
    });
    bench_each(&mut group, "baseline_layer_walk_full_state", &altitudes, |altitude| walk.state(altitude));
    group.finish();
}

bench_main!(benchmarks, per_evaluation());
