//! The loads a review signs off on: the maximum q with its uncertainty on a smooth and on
//! a cornered peak (both analytic, between samples), winds and the total angle of attack
//! (hand-worked cases), limit exceedances and the plateau on an analytic q(t), total and
//! recovery temperatures (independent computation).
//!
//! The analytic flights fly a constant acceleration A from rest through an exponential
//! atmosphere rho = rho0 exp(-z / H): q(t) = (rho0 A^2 / 2) t^2 exp(-A t^2 / (2 H)), whose
//! maximum is q* = rho0 A H / e at t* = sqrt(2 H / A) (derived by hand: dq/dt = 0). The
//! cornered flight burns out at tb < t*, when q is still rising, and coasts at a constant
//! deceleration D: q falls at once, so its maximum is q(tb) exactly, at the corner.

use aerostrata::flight::{
    exceedances, plateau, Axis, BoundaryLayer, FlightScan, Peak, Sample, VectorSample, RESOLVED_FRACTION,
};
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::{Altitude, Atmosphere, Error, Exponential, US1976};
use proptest::prelude::*;

const RHO0: f64 = 1.225;
const SCALE_HEIGHT_M: f64 = 8_000.0;
const ACCELERATION_M_S2: f64 = 30.0;
const TEMPERATURE_K: f64 = 288.15;

fn exponential() -> Exponential {
    Exponential::new(RHO0, SCALE_HEIGHT_M, TEMPERATURE_K).unwrap()
}

/// The peak of a flight given as (z, v) of t, sampled every `dt` from `phase`.
fn peak_of(dt: f64, phase: f64, end_s: f64, flight: impl Fn(f64) -> (f64, f64)) -> Peak {
    let mut scan = FlightScan::new(exponential(), None);
    let mut t = phase;
    while t <= end_s {
        let (altitude_m, velocity_m_s) = flight(t);
        scan.push(Sample { time_s: t, altitude_m, velocity_m_s }).unwrap();
        t += dt;
    }
    scan.summary().max_dynamic_pressure.unwrap()
}

fn q_of(z: f64, v: f64) -> f64 {
    0.5 * RHO0 * (-z / SCALE_HEIGHT_M).exp() * v * v
}

/// The smooth peak: the refined maximum within 1e-4 of q*, inside its own uncertainty,
/// and resolved, at spacings from 0.1 to 1 s and every phase.
#[test]
fn a_smooth_peak_is_refined_and_resolved() {
    let a = ACCELERATION_M_S2;
    let q_star = RHO0 * a * SCALE_HEIGHT_M / std::f64::consts::E;
    for dt in [0.1, 0.25, 0.5, 1.0] {
        for phase in [0.0, 0.13, 0.37, 0.5, 0.81] {
            let peak = peak_of(dt, phase * dt, 60.0, |t| (0.5 * a * t * t, a * t));
            let u = peak.uncertainty_pa.unwrap();
            let error = (peak.dynamic_pressure_pa - q_star).abs();
            assert!(error / q_star < 1e-4, "dt {dt} phase {phase}: {}", error / q_star);
            assert!(error <= u, "dt {dt} phase {phase}: q* outside {} +- {u}", peak.dynamic_pressure_pa);
            assert!(peak.resolved && u <= RESOLVED_FRACTION * q_star, "dt {dt}: {peak:?}");
            assert!(peak.sample_max_pa <= peak.dynamic_pressure_pa);
            assert_eq!(peak.suggested_spacing_s, None);
        }
    }
}

/// The cornered peak: the true maximum q(tb) lies within the refined value +- its
/// uncertainty at every spacing and phase; at 1 s the parabola under-reports it by more
/// than the resolved fraction, the peak is flagged unresolved and a finer spacing
/// suggested.
#[test]
fn a_cornered_peak_is_covered_and_flagged() {
    let (a, d) = (ACCELERATION_M_S2, 15.0);
    let tb = 12.5;
    let flight = |t: f64| {
        if t <= tb {
            (0.5 * a * t * t, a * t)
        } else {
            let c = t - tb;
            (0.5 * a * tb * tb + a * tb * c - 0.5 * d * c * c, a * tb - d * c)
        }
    };
    let (zb, vb) = flight(tb);
    let q_true = q_of(zb, vb);
    let mut worst_under = 0.0f64;
    for dt in [0.1, 0.25, 0.5, 1.0, 2.0] {
        for phase in [0.07, 0.25, 0.5, 0.75, 0.93] {
            let peak = peak_of(dt, phase * dt, 40.0, flight);
            let u = peak.uncertainty_pa.unwrap();
            let miss = q_true - peak.dynamic_pressure_pa;
            assert!(
                miss.abs() <= u,
                "dt {dt} phase {phase}: q {} +- {u} misses {q_true}",
                peak.dynamic_pressure_pa
            );
            assert!(peak.sample_max_pa <= peak.dynamic_pressure_pa + u);
            if dt == 1.0 {
                worst_under = worst_under.max(miss / q_true);
                assert!(!peak.resolved, "phase {phase}: {peak:?}");
                let spacing = peak.suggested_spacing_s.unwrap();
                assert!(spacing > 0.0 && spacing < dt, "{spacing}");
            }
        }
    }
    // The parabola alone under-reports the corner by percents at 1 s.
    assert!(worst_under > 0.01, "{worst_under}");
}

fn flight_series() -> impl Strategy<Value = Vec<(f64, f64)>> {
    prop::collection::vec((0.01..2.0f64, 0.0..3_000.0f64), 1..60)
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 500, ..ProptestConfig::default() })]

    /// The uncertainty is never negative, the largest sample never above the maximum plus
    /// its uncertainty, and a resolved peak's uncertainty within its fraction.
    #[test]
    fn the_uncertainty_is_honest(series in flight_series()) {
        let mut scan = FlightScan::new(US1976, None);
        let mut t = 0.0;
        let mut largest = 0.0f64;
        for (step, v) in series {
            t += step;
            let point = scan.push(Sample { time_s: t, altitude_m: 1_000.0, velocity_m_s: v }).unwrap();
            largest = largest.max(point.dynamic_pressure_pa);
        }
        let peak = scan.summary().max_dynamic_pressure.unwrap();
        prop_assert_eq!(peak.sample_max_pa, largest);
        if let Some(u) = peak.uncertainty_pa {
            prop_assert!(u >= 0.0);
            prop_assert!(largest <= peak.dynamic_pressure_pa + u);
            if peak.resolved {
                prop_assert!(u <= RESOLVED_FRACTION * peak.dynamic_pressure_pa);
            }
        } else {
            prop_assert!(!peak.resolved);
        }
    }
}

/// A wind of `east` m/s toward the east everywhere from 0 to 50 km.
fn steady_wind(east: f64) -> WindProfile<[WindLevel; 2]> {
    WindProfile::new([WindLevel::new(0.0, east, 0.0).unwrap(), WindLevel::new(50_000.0, east, 0.0).unwrap()])
        .unwrap()
}

fn vector(velocity: [f64; 3], axis: Option<Axis>) -> VectorSample {
    VectorSample {
        time_s: 0.0,
        altitude_m: 1_000.0,
        velocity_east_m_s: velocity[0],
        velocity_north_m_s: velocity[1],
        velocity_up_m_s: velocity[2],
        axis,
    }
}

/// Hand-worked: a vertical climb at 100 m/s through a 10 m/s cross wind meets the air at
/// atan(10 / 100) = 5.710593137499643 deg, at sqrt(100^2 + 10^2) m/s; a tail wind of
/// 20 m/s takes 20 m/s off the airspeed of a vehicle flying with it, a head wind adds
/// it, and neither tilts the air-relative velocity off the axis.
#[test]
fn winds_set_the_airspeed_and_the_angle_of_attack() {
    let air = |winds: &WindProfile<[WindLevel; 2]>, velocity, axis| {
        FlightScan::new(US1976, None).with_winds(winds).evaluate_vector(vector(velocity, axis)).unwrap()
    };
    let rho = US1976.state(Altitude::geometric_m(1_000.0).unwrap()).unwrap().density_kg_m3;
    let cross = air(&steady_wind(10.0), [0.0, 0.0, 100.0], None);
    assert!((cross.alpha_deg.unwrap() - 5.710_593_137_499_643).abs() < 1e-13);
    assert!((cross.airspeed_m_s - 10_100f64.sqrt()).abs() < 1e-12);
    assert!((cross.dynamic_pressure_pa - 0.5 * rho * 10_100.0).abs() < 1e-9);
    assert!(
        (cross.q_alpha_pa_deg.unwrap() - cross.dynamic_pressure_pa * cross.alpha_deg.unwrap()).abs() < 1e-9
    );
    assert_eq!(cross.velocity_m_s, 100.0);
    assert_eq!(cross.wind_en_m_s, Some([10.0, 0.0]));
    let tail = air(&steady_wind(20.0), [100.0, 0.0, 0.0], None);
    assert_eq!((tail.airspeed_m_s, tail.alpha_deg), (80.0, Some(0.0)));
    let head = air(&steady_wind(-20.0), [100.0, 0.0, 0.0], None);
    assert_eq!((head.airspeed_m_s, head.alpha_deg), (120.0, Some(0.0)));
    // With an axis of its own: 10 deg off the vertical in still air is 10 deg of alpha.
    let tilted = air(&steady_wind(0.0), [0.0, 0.0, 100.0], Some(Axis::new(80.0, 90.0).unwrap()));
    assert!((tilted.alpha_deg.unwrap() - 10.0).abs() < 1e-12);
    // At rest on the pad without an axis there is no angle of attack.
    let pad = air(&steady_wind(5.0), [0.0, 0.0, 0.0], None);
    assert_eq!((pad.airspeed_m_s, pad.alpha_deg), (5.0, None));
}

#[test]
fn winds_need_a_direction_and_are_held_beyond_the_profile() {
    let winds = WindProfile::new([
        WindLevel::new(0.0, 5.0, 0.0).unwrap(),
        WindLevel::new(2_000.0, 15.0, 0.0).unwrap(),
    ])
    .unwrap();
    let mut scan = FlightScan::new(US1976, None).with_winds(&winds);
    let scalar = scan.push(Sample { time_s: 0.0, altitude_m: 0.0, velocity_m_s: 10.0 });
    assert!(matches!(scalar, Err(Error::InvalidPoint { index: 0, .. })), "{scalar:?}");
    for (i, z) in [500.0, 1_500.0, 2_500.0, 3_000.0].into_iter().enumerate() {
        let point = scan.push_vector(VectorSample {
            altitude_m: z,
            time_s: i as f64,
            ..vector([0.0, 0.0, 50.0], None)
        });
        let east = point.unwrap().wind_en_m_s.unwrap()[0];
        assert_eq!(east, (5.0 + z / 200.0).min(15.0));
    }
    let summary = scan.summary();
    assert_eq!(summary.wind_held_samples, 2);
    let max = summary.max_q_alpha.unwrap();
    // The strongest wind at the lowest speed: the held 15 m/s at 2500 and 3000 m.
    assert!(max.altitude_m >= 2_500.0 && max.mach.is_some());
}

/// q(t) = Q - b (t - c)^2 sampled every h: its crossings of L lie at c +- sqrt((Q - L) / b)
/// (solved by hand), and linear interpolation between samples finds them to within
/// h^2 |q''| / (8 |q'|) (the interpolation error of a line, over the slope).
#[test]
fn exceedances_and_the_plateau_of_an_analytic_q() {
    let (big_q, b, c, h) = (50_000.0, 400.0, 30.0, 0.05);
    let times: Vec<f64> = (0..=1_200).map(|i| f64::from(i) * h).collect();
    let q: Vec<f64> = times.iter().map(|t| big_q - b * (t - c) * (t - c)).collect();
    let limit = 40_000.0;
    let half = ((big_q - limit) / b).sqrt();
    let slope = 2.0 * b * half;
    let tolerance = 1.5 * h * h * 2.0 * b / (8.0 * slope);
    let found: Vec<_> = exceedances(&times, &q, limit).unwrap().map(Result::unwrap).collect();
    assert_eq!(found.len(), 1);
    assert!((found[0].start_time_s - (c - half)).abs() < tolerance, "{:?}", found[0]);
    assert!((found[0].end_time_s - (c + half)).abs() < tolerance, "{:?}", found[0]);
    assert_eq!(found[0].peak, big_q);
    // The plateau within 2 % of the maximum: c +- sqrt(0.02 Q / b).
    let p = plateau(&times, &q, None, 0.02).unwrap().unwrap();
    let half = (0.02 * big_q / b).sqrt();
    let tolerance = 1.5 * h * h * 2.0 * b / (8.0 * 2.0 * b * half);
    assert!(
        (p.start_time_s - (c - half)).abs() < tolerance && (p.end_time_s - (c + half)).abs() < tolerance,
        "{p:?}"
    );
    assert!(!p.open);
}

/// At 15 km (216.65 K in the standard's isothermal layer) and Mach 2: the total
/// temperature 1.8 T = 389.97 K (NACA Report 1135, equation 43: T/Tt = (1 + (gamma - 1)
/// M^2 / 2)^-1), and the recovery temperatures with Pr from the standard's viscosity and
/// conductivity formulas and cp = gamma R* / ((gamma - 1) M0): Pr = 0.7322747481927614,
/// turbulent Tr = 372.8712228786427 K, laminar 364.9652162919074 K (computed
/// independently with mpmath at 30 digits; equation number from memory).
#[test]
fn total_and_recovery_temperatures() {
    let z = Altitude::geometric_m(15_000.0).unwrap();
    let a = US1976.state(z).unwrap().speed_of_sound().unwrap();
    let sample = Sample { time_s: 0.0, altitude_m: 15_000.0, velocity_m_s: 2.0 * a };
    let at = |layer| FlightScan::new(US1976, None).with_recovery(layer).evaluate(sample).unwrap();
    let turbulent = at(BoundaryLayer::Turbulent);
    assert_eq!(turbulent.mach, Some(2.0));
    assert!((turbulent.total_temperature_k.unwrap() - 389.97).abs() < 1e-10);
    assert!((turbulent.recovery_temperature_k.unwrap() - 372.871_222_878_642_7).abs() < 1e-9);
    assert!(
        (at(BoundaryLayer::Laminar).recovery_temperature_k.unwrap() - 364.965_216_291_907_4).abs() < 1e-9
    );
    // Not asked for, not given.
    assert_eq!(FlightScan::new(US1976, None).evaluate(sample).unwrap().recovery_temperature_k, None);
}

/// Above 86 km the Mach number is undefined: the summary counts those samples, so that a
/// crossing there is not silently lost.
#[cfg(feature = "upper")]
#[test]
fn samples_without_a_mach_number_are_counted() {
    let mut scan = FlightScan::new(US1976, None);
    for (i, z) in [80_000.0, 85_000.0, 90_000.0, 100_000.0, 85_500.0].into_iter().enumerate() {
        scan.push(Sample { time_s: i as f64, altitude_m: z, velocity_m_s: 300.0 }).unwrap();
    }
    assert_eq!(scan.summary().mach_undefined_samples, 2);
}
