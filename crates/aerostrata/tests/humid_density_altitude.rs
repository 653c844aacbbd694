//! Density altitude of moist air against an independent 30-digit computation
//! (tests/reference/humid_density_altitude_mpmath.py: Buck's vapour pressure, an ideal
//! mixture of dry air and vapour, the standard's troposphere solved in closed form).

use aerostrata::inverse::{density_altitude_from, density_altitude_humid, Moisture};
use aerostrata::Error;

#[test]
#[allow(clippy::excessive_precision)] // the script's digits as printed
fn matches_the_independent_computation() {
    let dew = |k| Moisture::DewPoint { dew_point_k: k };
    let rh = |percent| Moisture::RelativeHumidity { percent };
    // (pressure Pa, temperature K, moisture, H from the script, m)
    let cases = [
        (100_800.0, 305.15, dew(299.15), 776.988_482_619_332_34),
        (85_000.0, 308.15, dew(263.15), 2_470.766_826_447_600_2),
        (101_000.0, 303.15, rh(100.0), 723.559_828_469_007_85),
        (95_000.0, 283.15, rh(60.0), 516.729_095_359_457_19),
        (90_000.0, 290.15, rh(0.0), 1_287.564_372_369_003_5),
    ];
    for (p, t, moisture, expected) in cases {
        let h = density_altitude_humid(p, t, moisture).unwrap().meters();
        // 1e-9 m: the closed forms agree to rounding (a few ulps of the density).
        assert!((h - expected).abs() < 1e-9, "{p} Pa {t} K {moisture:?}: {h} vs {expected}");
    }
    // Dry air is the dry-air density altitude, bit for bit.
    let dry = density_altitude_humid(90_000.0, 290.15, rh(0.0)).unwrap();
    assert_eq!(dry, density_altitude_from(90_000.0, 290.15).unwrap());
}

#[test]
fn impossible_moisture_is_refused() {
    let above = density_altitude_humid(100_000.0, 300.0, Moisture::DewPoint { dew_point_k: 301.0 });
    assert!(matches!(above, Err(Error::OutOfRange { quantity: "dew point", .. })), "{above:?}");
    for percent in [-1.0, 100.5, f64::NAN] {
        let out = density_altitude_humid(100_000.0, 300.0, Moisture::RelativeHumidity { percent });
        assert!(out.is_err(), "{percent}");
    }
    // 15 read as kelvin is not a temperature Buck's formula covers.
    assert!(density_altitude_humid(100_000.0, 15.0, Moisture::RelativeHumidity { percent: 50.0 }).is_err());
}
