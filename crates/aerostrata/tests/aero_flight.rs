//! The flight scan: an invented flight with a closed-form maximum of q(t), Mach 1
//! crossings of a flight with linear Mach number, and properties of random series.
//!
//! The analytic flight: constant acceleration A from rest, z = A t^2 / 2, V = A t,
//! through an exponential atmosphere rho = rho0 exp(-z / H) at a fixed temperature. Then
//!
//! ```text
//! q(t) = (rho0 A^2 / 2) t^2 exp(-A t^2 / (2 H))
//! t*   = sqrt(2 H / A),  z* = H,  V* = sqrt(2 A H),  q* = rho0 A H / e
//! ```
//!
//! Tolerance of the parabola through three samples dt apart (derived, not fitted): for
//! q = Q + q2 tau^2 / 2 + q3 tau^3 / 6 about the true peak, the interpolating parabola
//! is q minus (q3 / 6)(tau - tau0)(tau - tau1)(tau - tau2), so its vertex is off by
//! |q3 / q2| (dt^2 - 3 c^2) / 6 <= |q3 / q2| dt^2 / 6 and its height by at most
//! |q3| 3 dt^3 / 48, c being the middle sample's offset from the peak (|c| <= dt / 2).
//! Here q3 / q2 = -1 / t* and q3 / Q = 4 / t*^3, so
//!
//! ```text
//! |t - t*| <= dt^2 / (6 t*),     |q - q*| / q* <= dt^3 / (4 t*^3)
//! ```
//!
//! to leading order; the tests allow 1.25 times these (the next order is smaller by
//! about dt / t* < 0.1) plus 1e-12 for rounding. Altitude and velocity are quadratic and
//! linear in t, which the three-point interpolation reproduces exactly, so at the reported
//! time they must match the profile to rounding (1e-9 relative).

use aerostrata::aero::{DragCurve, Interpolation};
use aerostrata::flight::{samples_from_slices, scan, FlightScan, Sample, Vehicle};
use aerostrata::{Atmosphere, Error, Exponential, US1976};
use proptest::prelude::*;

const RHO0: f64 = 1.225;
const SCALE_HEIGHT_M: f64 = 8_000.0;
const ACCELERATION_M_S2: f64 = 30.0;
const TEMPERATURE_K: f64 = 288.15;

fn analytic_flight(dt: f64, phase: f64, vehicle: Option<Vehicle<'_>>) -> aerostrata::FlightSummary {
    let model = Exponential::new(RHO0, SCALE_HEIGHT_M, TEMPERATURE_K).unwrap();
    let count = (60.0 / dt) as usize;
    let samples = (0..count).map(|i| {
        let t = (i as f64 + phase) * dt;
        Sample { time_s: t, altitude_m: 0.5 * ACCELERATION_M_S2 * t * t, velocity_m_s: ACCELERATION_M_S2 * t }
    });
    scan(model, vehicle, samples, |_| {}).unwrap()
}

#[test]
fn maximum_q_of_the_analytic_flight() {
    let t_star = (2.0 * SCALE_HEIGHT_M / ACCELERATION_M_S2).sqrt();
    let q_star = RHO0 * ACCELERATION_M_S2 * SCALE_HEIGHT_M / core::f64::consts::E;
    let model = Exponential::new(RHO0, SCALE_HEIGHT_M, TEMPERATURE_K).unwrap();
    let a = model.state(aerostrata::Altitude::geometric_m(0.0).unwrap()).unwrap().speed_of_sound().unwrap();
    for dt in [1.0, 0.5, 0.25, 0.1, 0.02] {
        for phase in [0.0, 0.25, 0.5, 0.77] {
            let peak = analytic_flight(dt, phase, None).max_dynamic_pressure.unwrap();
            assert!(peak.refined);
            let time_bound = 1.25 * dt * dt / (6.0 * t_star) + 1e-12;
            let q_bound = 1.25 * dt.powi(3) / (4.0 * t_star.powi(3)) + 1e-12;
            let at = format!("dt {dt}, phase {phase}: {peak:?}");
            assert!((peak.time_s - t_star).abs() <= time_bound, "{at}: time off by {}", peak.time_s - t_star);
            assert!((peak.dynamic_pressure_pa / q_star - 1.0).abs() <= q_bound, "{at}: q* {q_star}");
            let t = peak.time_s;
            let (z, v) = (0.5 * ACCELERATION_M_S2 * t * t, ACCELERATION_M_S2 * t);
            assert!((peak.altitude_m / z - 1.0).abs() < 1e-9, "{at}: altitude at its time {z}");
            assert!((peak.velocity_m_s / v - 1.0).abs() < 1e-9, "{at}: velocity at its time {v}");
            assert!((peak.mach.unwrap() / (v / a) - 1.0).abs() < 1e-9, "{at}: Mach");
        }
    }
    // Unrefined, the best sample can be a whole dt / 2 away; refined it is far closer.
    let coarse = analytic_flight(1.0, 0.5, None).max_dynamic_pressure.unwrap();
    assert!((coarse.time_s - t_star).abs() < 0.01);
}

#[test]
fn maximum_drag_and_reynolds_with_a_vehicle() {
    let drag = DragCurve::constant(0.5).unwrap();
    let vehicle = Vehicle::new(drag, 0.01).unwrap().with_reference_length(2.0).unwrap();
    let summary = analytic_flight(0.5, 0.0, Some(vehicle));
    let peak = summary.max_dynamic_pressure.unwrap();
    let max_drag = summary.max_drag.unwrap();
    // Constant Cd: the largest drag is at the largest-q sample.
    assert_eq!(max_drag.sample_index, peak.sample_index);
    let model = Exponential::new(RHO0, SCALE_HEIGHT_M, TEMPERATURE_K).unwrap();
    let flight = FlightScan::new(model, Some(vehicle));
    let point = flight
        .evaluate(Sample {
            time_s: max_drag.time_s,
            altitude_m: max_drag.altitude_m,
            velocity_m_s: max_drag.velocity_m_s,
        })
        .unwrap();
    assert!((max_drag.value - point.dynamic_pressure_pa * 0.5 * 0.01).abs() <= 1e-12 * max_drag.value);
    let re = point.reynolds_number.unwrap();
    assert!((re / (point.reynolds_per_m.unwrap() * 2.0) - 1.0).abs() < 1e-15);
    // Without a vehicle there is no drag.
    assert!(analytic_flight(0.5, 0.0, None).max_drag.is_none());
}

#[test]
fn the_scan_reads_the_drag_curve_exactly_as_the_curve_does() {
    // The scan keeps the piece of the curve the last sample used; its Cd must be the
    // curve's own at every sample, across pieces, in both directions of Mach.
    let mach = [0.0, 0.6, 0.9, 1.05, 1.3, 2.0, 4.0];
    let cd = [0.42, 0.40, 0.46, 0.70, 0.62, 0.50, 0.40];
    for interpolation in [Interpolation::Linear, Interpolation::MonotoneCubic] {
        let curve = DragCurve::table(&mach, &cd, interpolation).unwrap();
        let vehicle = Vehicle::new(curve, 0.02).unwrap();
        let mut flight = FlightScan::new(US1976, Some(vehicle));
        for i in 0..2_000 {
            let t = 0.05 * i as f64;
            // Up to Mach 5 (beyond the table) and back down.
            let v = 1_700.0 * (core::f64::consts::PI * t / 100.0).sin();
            let point = flight.push(Sample { time_s: t, altitude_m: 5_000.0, velocity_m_s: v }).unwrap();
            assert_eq!(point.drag_coefficient.unwrap(), curve.cd(point.mach.unwrap()).unwrap(), "t = {t}");
        }
    }
}

#[test]
fn mach_one_crossings_of_a_linear_mach_history() {
    // Constant temperature, so a is constant and M(t) = V(t) / a is piecewise linear:
    // up through Mach 1 at t = 10 s, down at t = 30 s, up again at 50 s, which linear
    // interpolation between samples finds exactly (to rounding).
    let model = Exponential::new(RHO0, SCALE_HEIGHT_M, TEMPERATURE_K).unwrap();
    let a = model.state(aerostrata::Altitude::geometric_m(0.0).unwrap()).unwrap().speed_of_sound().unwrap();
    let mach = |t: f64| {
        if t <= 20.0 {
            0.1 * t
        } else if t <= 40.0 {
            2.0 - 0.1 * (t - 20.0)
        } else {
            0.1 * (t - 40.0)
        }
    };
    let samples = (0..=90).map(|i| {
        let t = 0.7 * i as f64; // a step that does not land on the crossings
        Sample { time_s: t, altitude_m: 1_000.0, velocity_m_s: mach(t) * a }
    });
    let summary = scan(model, None, samples, |_| {}).unwrap();
    assert_eq!(summary.mach_one_up.count, 2);
    assert_eq!(summary.mach_one_down.count, 1);
    assert!((summary.mach_one_up.first_time_s.unwrap() - 10.0).abs() < 1e-9);
    assert!((summary.mach_one_up.last_time_s.unwrap() - 50.0).abs() < 1e-9);
    assert!((summary.mach_one_down.first_time_s.unwrap() - 30.0).abs() < 1e-9);
    let max = summary.max_mach.unwrap();
    assert!((max.value - mach(max.time_s)).abs() < 1e-12 && max.value > 1.9);
}

#[test]
fn the_scan_refuses_bad_samples_and_stays_as_it_was() {
    let mut flight = FlightScan::new(US1976, None);
    flight.push(Sample { time_s: 0.0, altitude_m: 0.0, velocity_m_s: 10.0 }).unwrap();
    flight.push(Sample { time_s: 1.0, altitude_m: 10.0, velocity_m_s: 20.0 }).unwrap();
    let before = flight.summary();
    let e = flight.push(Sample { time_s: 1.0, altitude_m: 20.0, velocity_m_s: 30.0 }).unwrap_err();
    assert_eq!(e.to_string(), "flight sample point 2: time (s) must be after the previous sample's, got 1");
    let e = flight.push(Sample { time_s: f64::NAN, altitude_m: 20.0, velocity_m_s: 30.0 }).unwrap_err();
    assert!(matches!(e, Error::InvalidPoint { index: 2, .. }), "{e}");
    let e = flight.push(Sample { time_s: 2.0, altitude_m: 1e7, velocity_m_s: 30.0 }).unwrap_err();
    assert!(e.to_string().starts_with("geometric altitude 10000000 m is outside the allowed range"), "{e}");
    let e = flight.push(Sample { time_s: 2.0, altitude_m: 20.0, velocity_m_s: f64::INFINITY }).unwrap_err();
    assert_eq!(e.to_string(), "velocity must be a finite number, got inf");
    assert_eq!(flight.summary(), before);
    assert_eq!(flight.samples(), 2);
    // Slices of different lengths.
    let e = samples_from_slices(&[0.0, 1.0], &[0.0], &[0.0, 1.0]).err().unwrap();
    assert!(e.to_string().contains("same length"), "{e}");
}

#[test]
fn peaks_at_the_ends_are_reported_unrefined() {
    // Decelerating from the first sample: the first sample is the largest.
    let t = [0.0, 1.0, 2.0];
    let z = [100.0, 200.0, 300.0];
    let v = [300.0, 200.0, 100.0];
    let summary = scan(US1976, None, samples_from_slices(&t, &z, &v).unwrap(), |_| {}).unwrap();
    let peak = summary.max_dynamic_pressure.unwrap();
    assert!(!peak.refined && peak.sample_index == 0 && peak.time_s == 0.0);
    // Accelerating to the last sample: the last sample so far.
    let v = [100.0, 200.0, 300.0];
    let summary = scan(US1976, None, samples_from_slices(&t, &z, &v).unwrap(), |_| {}).unwrap();
    let peak = summary.max_dynamic_pressure.unwrap();
    assert!(!peak.refined && peak.sample_index == 2);
    // No samples, no summary values.
    let empty = scan(US1976, None, core::iter::empty(), |_| {}).unwrap();
    assert!(empty.samples == 0 && empty.max_dynamic_pressure.is_none() && empty.max_mach.is_none());
}

#[test]
fn values_carried_to_the_refined_peak_stay_within_the_samples() {
    // A burnout kink at the largest sample (invented numbers): the quadratic through the
    // velocities 300, 310, 100 m/s peaks near 333 m/s where the q parabola has its vertex;
    // the refined peak must not report more speed, or Mach, than was sampled.
    let t = [0.0, 1.0, 2.0, 3.0];
    let z = [1000.0, 1000.0, 1000.0, 1000.0];
    let v = [100.0, 300.0, 310.0, 100.0];
    let mut sampled_q = Vec::new();
    let summary = scan(US1976, None, samples_from_slices(&t, &z, &v).unwrap(), |p| {
        sampled_q.push(p.dynamic_pressure_pa)
    })
    .unwrap();
    let peak = summary.max_dynamic_pressure.unwrap();
    let max_mach = summary.max_mach.unwrap();
    assert!(peak.refined && peak.time_s < 2.0, "{peak:?}");
    assert!(peak.velocity_m_s <= 310.0, "{peak:?}");
    assert!(peak.mach.unwrap() <= max_mach.value, "{peak:?} against {max_mach:?}");
    // The refined q itself is the parabola's vertex, at least the largest sample.
    assert!(
        peak.dynamic_pressure_pa >= sampled_q[2]
            && sampled_q[2] == sampled_q.iter().copied().fold(0.0, f64::max)
    );
}

#[test]
fn above_86_km_q_is_given_and_mach_is_not() {
    let top = US1976.range().geometric_max_m;
    if top <= 86_000.0 {
        return;
    }
    let curve_mach = [0.0, 1.0, 3.0];
    let curve_cd = [0.4, 0.7, 0.5];
    let table = DragCurve::table(&curve_mach, &curve_cd, Interpolation::Linear).unwrap();
    let vehicle = Vehicle::new(table, 0.02).unwrap();
    let mut flight = FlightScan::new(US1976, Some(vehicle));
    let low = flight.push(Sample { time_s: 0.0, altitude_m: 80_000.0, velocity_m_s: 1_500.0 }).unwrap();
    let high = flight.push(Sample { time_s: 1.0, altitude_m: 120_000.0, velocity_m_s: 1_500.0 }).unwrap();
    assert!(low.mach.is_some() && low.drag_n.is_some());
    assert!(high.mach.is_none() && high.drag_n.is_none() && high.reynolds_per_m.is_none());
    assert!(high.dynamic_pressure_pa > 0.0 && high.dynamic_pressure_pa < low.dynamic_pressure_pa);
}

/// The next f64 above `x` (finite `x`): consecutive samples one ulp apart.
fn next_up(x: f64) -> f64 {
    if x == 0.0 {
        f64::from_bits(1)
    } else if x > 0.0 {
        f64::from_bits(x.to_bits() + 1)
    } else {
        f64::from_bits(x.to_bits() - 1)
    }
}

/// A random flight: increasing times, altitudes within the standard, any velocity.
fn flight_series() -> impl Strategy<Value = Vec<(f64, f64, f64)>> {
    prop::collection::vec((1e-6..50.0f64, -5_000.0..86_000.0f64, -3_000.0..3_000.0f64), 0..60)
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 1000, ..ProptestConfig::default() })]

    #[test]
    fn the_peak_is_never_below_any_sample(series in flight_series(), start in -1e6..1e6f64) {
        let mut t = start;
        let mut flight = FlightScan::new(US1976, None);
        let mut largest: f64 = 0.0;
        let (mut first_t, mut last_t) = (None, 0.0);
        for (dt, z, v) in series {
            t += dt;
            let point = flight.push(Sample { time_s: t, altitude_m: z, velocity_m_s: v }).unwrap();
            largest = largest.max(point.dynamic_pressure_pa);
            first_t.get_or_insert(t);
            last_t = t;
        }
        let summary = flight.summary();
        if let Some(peak) = summary.max_dynamic_pressure {
            prop_assert!(peak.dynamic_pressure_pa >= largest, "{peak:?} below sample q {largest}");
            prop_assert!(peak.dynamic_pressure_pa.is_finite() && peak.time_s.is_finite());
            prop_assert!(peak.time_s >= first_t.unwrap() && peak.time_s <= last_t);
            prop_assert!(peak.altitude_m.is_finite() && peak.velocity_m_s.is_finite());
        } else {
            prop_assert_eq!(summary.samples, 0);
        }
        for crossing in [summary.mach_one_up, summary.mach_one_down] {
            for time in [crossing.first_time_s, crossing.last_time_s].into_iter().flatten() {
                prop_assert!(time >= first_t.unwrap() && time <= last_t);
            }
        }
    }

    #[test]
    fn random_series_never_panic(series in prop::collection::vec((any::<f64>(), any::<f64>(), any::<f64>()), 0..40)) {
        let mach = [0.0, 1.2];
        let cd = [0.3, 0.6];
        let vehicle = Vehicle::new(DragCurve::table(&mach, &cd, Interpolation::MonotoneCubic).unwrap(), 0.1).unwrap();
        let mut flight = FlightScan::new(US1976, Some(vehicle));
        let mut largest: f64 = 0.0;
        for (t, z, v) in series {
            if let Ok(point) = flight.push(Sample { time_s: t, altitude_m: z, velocity_m_s: v }) {
                largest = largest.max(point.dynamic_pressure_pa);
                for value in [point.dynamic_pressure_pa, point.density_kg_m3, point.pressure_pa] {
                    prop_assert!(value.is_finite());
                }
                for value in [point.mach, point.reynolds_per_m, point.drag_n, point.drag_coefficient].into_iter().flatten() {
                    prop_assert!(value.is_finite());
                }
            }
        }
        if let Some(peak) = flight.summary().max_dynamic_pressure {
            prop_assert!(peak.dynamic_pressure_pa >= largest && peak.dynamic_pressure_pa.is_finite());
        }
    }

    /// Samples packed closer in time than f64 can resolve a parabola, at huge times.
    #[test]
    fn tight_and_late_samples_still_give_a_peak(base in -1e12..1e12f64, v in 1.0..2_000.0f64) {
        let mut flight = FlightScan::new(US1976, None);
        let mut t = base;
        for dv in [0.0, 5.0, 9.0, 5.0, 0.0] {
            t = next_up(t);
            flight.push(Sample { time_s: t, altitude_m: 0.0, velocity_m_s: v + dv }).unwrap();
        }
        let peak = flight.summary().max_dynamic_pressure.unwrap();
        let sample_max = 0.5 * US1976.density_kg_m3(aerostrata::Altitude::geometric_m(0.0).unwrap()).unwrap() * (v + 9.0) * (v + 9.0);
        prop_assert!(peak.dynamic_pressure_pa >= sample_max * (1.0 - 1e-15));
        prop_assert!(peak.time_s.is_finite());
    }
}
