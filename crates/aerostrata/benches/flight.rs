//! What the flight scan costs, measured in one run next to its yardstick: evaluating the
//! standard atmosphere's states at the same altitudes, so that the ratio is comparable on
//! any machine (the goals: the scan costs at most 1.3 times the states, and the scan with
//! winds, the wind's angle of attack and q-alpha at most 1.5 times the scan without).
//!
//! The flight is one million samples of an invented boost, coast and descent through the
//! standard atmosphere (0 to 40 km, up to Mach 2.5), built before timing. One criterion
//! iteration is one pass over all of them; `Throughput::Elements` records the count, so
//! criterion reports samples per second.
//!
//! | id             | what one element is                                                   |
//! |----------------|-----------------------------------------------------------------------|
//! | `states`       | `Altitude::geometric_m(z)` then `US1976.state(altitude)`              |
//! | `scan`         | `FlightScan::push` without a vehicle (q, Mach, Re per metre, summary) |
//! | `scan_vehicle` | `FlightScan::push` with a 7-point monotone-cubic Cd table and lengths |
//! | `scan_vectors` | `FlightScan::push_vector`: the same flight as velocity components     |
//! | `scan_winds`   | `push_vector` through a 41-level wind profile: airspeed, alpha, q-alpha |
//!
//! Before anything is timed, the scan's q and Mach are checked against the states'
//! (1e-14 relative), so that both do the same work. `std::hint::black_box` as in
//! benches/state.rs.

use std::hint::black_box;
use std::time::Duration;

use aerostrata::aero::{DragCurve, Interpolation};
use aerostrata::flight::{FlightScan, Sample, VectorSample, Vehicle};
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::{Altitude, Atmosphere, US1976};
use criterion::{Criterion, SamplingMode};

mod common;
use common::{bench_each, bench_main, group_of, settings};

/// Samples in the flight.
const COUNT: usize = 1_000_000;
/// Duration of the flight, s.
const DURATION_S: f64 = 200.0;
/// The group every benchmark lives in: `criterion/flight/<id>/new/estimates.json`.
const GROUP: &str = "flight";

/// The invented flight: 30 s of boost at 25 m/s^2, then a ballistic coast under 9.8 m/s^2
/// (apogee near 40 km at 106.5 s) and the fall back; velocity is signed (negative on the
/// way down), as a vertical-velocity log would have it.
fn flight() -> Vec<Sample> {
    let (boost_s, acceleration, gravity) = (30.0, 25.0, 9.8);
    let burnout_v = acceleration * boost_s;
    let burnout_z = 0.5 * acceleration * boost_s * boost_s;
    (0..COUNT)
        .map(|i| {
            let t = DURATION_S * i as f64 / COUNT as f64;
            let (z, v) = if t <= boost_s {
                (0.5 * acceleration * t * t, acceleration * t)
            } else {
                let c = t - boost_s;
                (burnout_z + burnout_v * c - 0.5 * gravity * c * c, burnout_v - gravity * c)
            };
            Sample { time_s: t, altitude_m: z.max(0.0), velocity_m_s: v }
        })
        .collect()
}

const CD_MACH: [f64; 7] = [0.0, 0.6, 0.9, 1.05, 1.3, 2.0, 4.0];
const CD: [f64; 7] = [0.42, 0.40, 0.46, 0.70, 0.62, 0.50, 0.40];

fn vehicle() -> Vehicle<'static> {
    let curve = DragCurve::table(&CD_MACH, &CD, Interpolation::MonotoneCubic).expect("a valid table");
    Vehicle::new(curve, 0.0182).and_then(|v| v.with_reference_length(3.2)).expect("a valid vehicle")
}

/// The same flight as ground-velocity components: mostly up, with a steady eastward drift
/// of a tenth of the speed, so that a wind changes the angle of attack.
fn vectors(samples: &[Sample]) -> Vec<VectorSample> {
    samples
        .iter()
        .map(|s| VectorSample {
            time_s: s.time_s,
            altitude_m: s.altitude_m,
            velocity_east_m_s: 0.1 * s.velocity_m_s.abs(),
            velocity_north_m_s: 0.0,
            velocity_up_m_s: s.velocity_m_s,
            axis: None,
        })
        .collect()
}

/// An invented westerly strengthening into a jet near 12 km: 41 levels, every kilometre.
fn winds() -> WindProfile<Vec<WindLevel>> {
    let levels = (0..=40)
        .map(|km| {
            let z = f64::from(km) * 1000.0;
            let speed = 5.0 + 45.0 * (-((z - 12_000.0) / 6000.0).powi(2)).exp();
            WindLevel::from_speed_direction(z, speed, 260.0 + f64::from(km))
        })
        .collect::<Result<Vec<_>, _>>()
        .expect("valid levels");
    WindProfile::new(levels).expect("a valid profile")
}

/// The scan's per-sample q and Mach equal what the states give, to rounding.
fn check_agreement(samples: &[Sample]) {
    let mut scan = FlightScan::new(US1976, None);
    for sample in samples.iter().step_by(997) {
        let point = scan.push(*sample).expect("the flight stays in range");
        let state = US1976.state(Altitude::geometric_m(sample.altitude_m).expect("valid")).expect("in range");
        let q = 0.5 * state.density_kg_m3 * sample.velocity_m_s * sample.velocity_m_s;
        let mach = sample.velocity_m_s.abs() / state.speed_of_sound().expect("defined below 86 km");
        for (ours, theirs) in [(point.dynamic_pressure_pa, q), (point.mach.expect("defined"), mach)] {
            assert!(ours == theirs || ((ours - theirs) / theirs).abs() < 1e-14, "{ours} vs {theirs}");
        }
    }
}

fn benchmarks(c: &mut Criterion) {
    let samples = flight();
    check_agreement(&samples);
    let vehicle = vehicle();

    let mut group = group_of(c, GROUP, COUNT);
    // One iteration is a whole flight (tens of ms): flat sampling, as criterion advises.
    group.sampling_mode(SamplingMode::Flat);

    bench_each(&mut group, "states", &samples, |sample| {
        Altitude::geometric_m(sample.altitude_m).and_then(|altitude| US1976.state(altitude))
    });

    for (id, vehicle) in [("scan", None), ("scan_vehicle", Some(vehicle))] {
        group.bench_function(id, |b| {
            b.iter(|| {
                let mut scan = FlightScan::new(US1976, vehicle);
                for sample in &samples {
                    let _ = black_box(scan.push(black_box(*sample)));
                }
                black_box(scan.summary())
            });
        });
    }

    let vectors = vectors(&samples);
    let winds = winds();
    for (id, with_winds) in [("scan_vectors", false), ("scan_winds", true)] {
        group.bench_function(id, |b| {
            b.iter(|| {
                let scan = FlightScan::new(US1976, None);
                let mut scan = if with_winds { scan.with_winds(&winds) } else { scan };
                for sample in &vectors {
                    let _ = black_box(scan.push_vector(black_box(*sample)));
                }
                black_box(scan.summary())
            });
        });
    }

    group.finish();
}

bench_main!(benchmarks, settings(10, Duration::from_secs(1), Duration::from_secs(12)));
