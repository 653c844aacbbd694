//! The altimeter's checks on the invented log: apogee detected within a stated tolerance
//! of the true apogee, for the shipped noise and for other draws of it; the pad zeroing;
//! the error paths.

use aerostrata::{Altitude, Atmosphere, TemperatureOffset, US1976};
use baro_altimeter::*;

/// Stated tolerances. Time: the filter's lag makes the call late, never early by more
/// than a sample; half a second is a drogue deployed a few metres past apogee at these
/// speeds. Height: 0.5 % (the geopotential metres the altimeter reads differ from
/// geometric ones by about 0.1 % here; noise and filtering add less).
const LATE_S: f64 = 0.5;
const EARLY_S: f64 = 0.1;
const HEIGHT: f64 = 0.005;

#[test]
fn apogee_is_detected_within_tolerance_for_every_noise_draw() {
    let site = HOT_DESERT_PAD;
    let truth = true_flight(site);
    let true_height = truth.apogee_altitude_m - site.pad_altitude_m;
    // The apogee of the invented rocket (about 3.2 km above the pad after 25 s).
    assert!((3_000.0..3_500.0).contains(&true_height) && (24.0..27.0).contains(&truth.apogee_time_s));
    for seed in [19_761_976, 1, 2, 3, 42, 1_234_567] {
        let log = barometer_log(site, &truth, &mut Noise::new(seed));
        let (rows, detection) = process(&log, TUNING).unwrap();
        let d = detection.expect("apogee detected");
        let late = d.apogee_time_s - truth.apogee_time_s;
        assert!((-EARLY_S..=LATE_S).contains(&late), "seed {seed}: late by {late} s");
        assert!(
            (d.apogee_height_m / true_height - 1.0).abs() < HEIGHT,
            "seed {seed}: {} m",
            d.apogee_height_m
        );
        assert!((0.0..2.0).contains(&d.launch_time_s), "seed {seed}: launch at {}", d.launch_time_s);
        assert_eq!(rows.len(), log.len());
    }
}

#[test]
fn the_pad_zeroes_the_altimeter() {
    let site = HOT_DESERT_PAD;
    let truth = true_flight(site);
    let log = barometer_log(site, &truth, &mut Noise::new(7));
    let (rows, detection) = process(&log, TUNING).unwrap();
    let day = TemperatureOffset::new(US1976, site.offset_k).unwrap();
    let pad = day.pressure_pa(Altitude::geometric_m(site.pad_altitude_m).unwrap()).unwrap();
    // 150 readings with 3 Pa noise: the mean is within 1 Pa (over 3 standard errors).
    assert!((detection.unwrap().pad_pressure_pa - pad).abs() < 1.0);
    let on_pad: Vec<&Processed> = rows.iter().filter(|r| r.time_s < 0.0).collect();
    assert!(on_pad.iter().all(|r| r.height_m.abs() < 2.0 && r.filtered_height_m.abs() < 1.0));
}

#[test]
fn noise_has_the_stated_spread() {
    let mut noise = Noise::new(99);
    let draws: Vec<f64> = (0..20_000).map(|_| noise.normal()).collect();
    let mean = draws.iter().sum::<f64>() / draws.len() as f64;
    let variance = draws.iter().map(|d| (d - mean) * (d - mean)).sum::<f64>() / draws.len() as f64;
    assert!(mean.abs() < 0.03 && (variance - 1.0).abs() < 0.05, "{mean} {variance}");
}

#[test]
fn bad_logs_are_errors_not_panics() {
    let only_flight = [Reading { time_s: 0.0, pressure_pa: 85_000.0 }];
    assert!(process(&only_flight, TUNING).unwrap_err().contains("no readings before ignition"));
    let bad = [Reading { time_s: -1.0, pressure_pa: 85_000.0 }, Reading { time_s: 0.0, pressure_pa: -5.0 }];
    let message = process(&bad, TUNING).unwrap_err();
    assert!(message.contains("t = 0 s") && message.contains("pressure"), "{message}");
    // A log that never climbs never calls apogee.
    let flat: Vec<Reading> =
        (0..300).map(|i| Reading { time_s: -3.0 + 0.02 * i as f64, pressure_pa: 85_000.0 }).collect();
    assert!(process(&flat, TUNING).unwrap().1.is_none());
}
