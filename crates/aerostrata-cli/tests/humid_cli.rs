//! `altitude --dew-point` / `--relative-humidity`: the density altitude of moist air, the
//! core's `density_altitude_humid`, which tests/reference/humid_density_altitude_mpmath.py
//! checks at 30 digits (its "coastal afternoon" case: 1008 hPa, 32 degC, dew point 26 degC,
//! H = 776.98848261933234 m).

mod common;

use common::*;

/// The density-altitude column of a CSV answer.
fn density_altitude(args: &[&str]) -> f64 {
    let out = stdout_of(args, "");
    let mut lines = out.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let row: Vec<&str> = lines.next().unwrap().split(',').collect();
    let index = header.iter().position(|h| *h == "density_altitude_m").expect("a density altitude column");
    row[index].parse().unwrap()
}

#[test]
fn moist_air_gives_the_independent_density_altitude() {
    let base = ["altitude", "--pressure", "1008hPa", "--temperature", "32C", "--format", "csv"];
    let humid = density_altitude(&[&base[..], &["--dew-point", "26C"]].concat());
    assert!((humid - 776.988_482_619_332_3).abs() < 1e-9, "{humid}");
    // Dry air is lower (denser): the same day without the vapour.
    let dry = density_altitude(&base);
    assert!(humid - dry > 100.0 && humid - dry < 160.0, "{dry} {humid}");
    // 0 % relative humidity is dry air to the bit; the dew point in degF reads the same.
    assert_eq!(density_altitude(&[&base[..], &["--relative-humidity", "0"]].concat()), dry);
    let fahrenheit = density_altitude(&[&base[..], &["--dew-point", "78.8F"]].concat());
    assert!((fahrenheit - humid).abs() < 1e-6, "{fahrenheit}");
}

#[test]
fn impossible_moisture_is_refused_naming_its_option() {
    let base = ["altitude", "--pressure", "1008hPa", "--temperature", "32C"];
    fails_with(
        &[&base[..], &["--dew-point", "35C"]].concat(),
        "",
        "--dew-point: dew point 308.15 K is outside",
    );
    fails_with(&[&base[..], &["--relative-humidity", "170"]].concat(), "", "--relative-humidity 170: 170 %");
    // Without a temperature there is no moist density.
    fails_with(&["altitude", "--pressure", "1008hPa", "--dew-point", "26C"], "", "--temperature");
}
