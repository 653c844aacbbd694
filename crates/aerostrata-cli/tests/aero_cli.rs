//! `aerostrata flight`, `airspeed` and `altitude` as a user runs them: outputs, formats
//! and every error path (exit status 2, one line on stderr).

mod common;

use common::*;

/// An invented boost and coast, every 0.25 s: 25 m/s^2 for 30 s, then ballistic.
fn ascent() -> String {
    let mut text = String::from("# an invented ascent\ntime_s,altitude_m,velocity_m_s\n");
    for i in 0..400 {
        let t = 0.25 * i as f64;
        let (z, v) = if t <= 30.0 {
            (12.5 * t * t, 25.0 * t)
        } else {
            let c = t - 30.0;
            (11_250.0 + 750.0 * c - 4.9 * c * c, 750.0 - 9.8 * c)
        };
        text += &format!("{t},{z},{v}\n");
    }
    text
}

#[test]
fn flight_writes_a_row_per_sample_and_a_summary() {
    let (csv, summary) = run(&["flight", "-"], &ascent());
    let q = column(&csv, "dynamic_pressure_Pa");
    assert_eq!(q.len(), 400);
    let largest = q.iter().flatten().fold(0.0f64, |a, b| a.max(*b));
    assert!(summary.contains("samples: 400"), "{summary}");
    assert!(summary.contains("max q: "), "{summary}");
    assert!(summary.contains("Mach 1 up: 1 crossing(s)"), "{summary}");
    assert!(summary.contains("Mach 1 down: 1 crossing(s)"), "{summary}");
    assert!(summary.contains("max drag: none"), "{summary}");
    // Without a vehicle the drag columns are empty.
    assert!(column(&csv, "drag_N").iter().all(Option::is_none));
    // The JSON summary: the peak is at least the largest sample.
    let (_, json) = run(&["flight", "-", "--summary", "json"], &ascent());
    let summary: serde_json::Value = serde_json::from_str(&json).unwrap();
    let peak = &summary["max_dynamic_pressure"];
    assert!(peak["dynamic_pressure_pa"].as_f64().unwrap() >= largest);
    assert_eq!(peak["refined"], true);
    assert_eq!(summary["samples"], 400);
    let up = summary["mach_one_up"]["first_time_s"].as_f64().unwrap();
    assert!(up > 10.0 && up < 15.0, "{up}");
    let (_, none) = run(&["flight", "-", "--summary", "none"], &ascent());
    assert!(none.is_empty());
}

#[test]
fn flight_with_a_vehicle_and_files() {
    let dir = std::env::temp_dir().join(format!("aerostrata-aero-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let file = dir.join("ascent.csv");
    std::fs::write(&file, ascent()).unwrap();
    let path = file.to_str().unwrap();
    let args =
        ["flight", path, "--cd-table", "0:0.45,0.9:0.5,1.1:0.75,2:0.55", "--area", "0.0182", "--length", "3"];
    let (csv, summary) = run(&args, "");
    let drag = column(&csv, "drag_N");
    let cd = column(&csv, "drag_coefficient");
    let q = column(&csv, "dynamic_pressure_Pa");
    for ((d, c), q) in drag.iter().zip(&cd).zip(&q) {
        let (d, c, q) = (d.unwrap(), c.unwrap(), q.unwrap());
        assert!((d - q * c * 0.0182).abs() <= 1e-12 * d.max(1.0));
        assert!((0.45..=0.75).contains(&c), "Cd {c} outside the table's values");
    }
    let re = column(&csv, "reynolds_number");
    let unit = column(&csv, "reynolds_per_m");
    assert!((re[100].unwrap() / unit[100].unwrap() - 3.0).abs() < 1e-12);
    assert!(summary.contains("max drag: "), "{summary}");
    assert!(!summary.contains("max drag: none"), "{summary}");
    // Linear reading and a constant Cd also run; the same file through stdin is the same.
    let (linear, _) = run(&[&args[..], &["--interpolation", "linear"]].concat(), "");
    assert_ne!(linear, csv);
    let (constant, _) = run(&["flight", path, "--cd", "0.5", "--area", "0.01"], "");
    assert!(column(&constant, "drag_coefficient").iter().all(|c| *c == Some(0.5)));
    let (piped, _) = run(&[&["flight", "-"], &args[2..]].concat(), &ascent());
    assert_eq!(piped, csv);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn flight_bad_input_exits_2_with_one_line() {
    each_fails_with(&[
        (&["flight", "-"], "0,0,0\n1,abc,3\n", "line 2: 'abc' is not a number (altitude in m)"),
        (&["flight", "-"], "0,0,0\n\n0,10,3\n", "line 3: flight sample point 1: time (s) must be after"),
        (
            &["flight", "-"],
            "# comment\n0,0,0\n1,-6000,3\n",
            "line 3: geometric altitude -6000 m is outside the allowed range -5000 to",
        ),
        (&["flight", "-"], "0,0,NaN\n", "line 1: velocity must be a finite number, got NaN"),
        (&["flight", "-"], "0,0\n", "line 1: expected 3 values"),
        (&["flight", "-"], "time,altitude,velocity\n", "line 1: 'time' is not a number (time in s)"),
        (&["flight", "-", "--cd", "0.5"], "", "--cd and --cd-table need --area"),
        (&["flight", "-", "--area", "0.5"], "", "--area needs --cd or --cd-table"),
        (&["flight", "-", "--length", "2"], "", "--length needs"),
        (&["flight", "-", "--cd", "-1", "--area", "1"], "", "--cd: drag coefficient must be greater than 0"),
        (
            &["flight", "-", "--cd-table", "0:0.4,2:0.5,1:0.6", "--area", "1"],
            "",
            "--cd-table: drag table point 2: Mach number must be above the previous point's, got 1",
        ),
        (&["flight", "-", "--cd-table", "0:0.4,x", "--area", "1"], "", "--cd-table: 'x' is not MACH:CD"),
        (&["flight", "-", "--cd", "0.5", "--area", "0"], "", "--area: reference area must be greater than 0"),
        (&["flight", "/no/such/file"], "", "cannot open /no/such/file"),
        (&["flight", "-", "--offset", "-400"], "0,0,0\n", "line 1: temperature must be greater than 0 K"),
    ]);
}

#[test]
fn airspeed_conversions() {
    // CAS = EAS = TAS at standard sea level (by definition; common practice, no source).
    let (csv, _) = run(&["airspeed", "--tas", "120", "--pressure-altitude", "0", "--oat", "288.15"], "");
    for name in ["calibrated_airspeed_m_s", "equivalent_airspeed_m_s", "true_airspeed_m_s"] {
        assert!((column(&csv, name)[0].unwrap() - 120.0).abs() < 1e-9, "{name}: {csv}");
    }
    // ISA at 10 000 m', Mach 0.8: CAS 146.985088 m/s (tests/reference/airspeed_mpmath.py).
    let (csv, _) = run(&["airspeed", "--mach", "0.8", "--pressure-altitude", "10000", "--oat", "223.15"], "");
    assert!((column(&csv, "calibrated_airspeed_m_s")[0].unwrap() - 146.985088396063).abs() < 1e-9);
    // Knots in and out, and the same condition given as a static pressure.
    let (kt, _) = run(
        &["airspeed", "--cas", "250", "--unit", "kt", "--pressure-altitude", "3048", "--oat", "268.15"],
        "",
    );
    assert_eq!(column(&kt, "calibrated_airspeed_kt")[0], Some(250.0));
    let p = column(&kt, "static_pressure_Pa")[0].unwrap().to_string();
    let (same, _) =
        run(&["airspeed", "--cas", "250", "--unit", "kt", "--pressure", &p, "--oat", "268.15"], "");
    assert_eq!(same, kt);
    // The standard day at an altitude, as JSON.
    let (json, _) =
        run(&["airspeed", "--mach", "2", "--altitude", "11000", "--offset", "5", "--format", "json"], "");
    // JSON is an array of rows, here one, as for every tabular command.
    let value: serde_json::Value = serde_json::from_str(&json).unwrap();
    let value = &value[0];
    assert_eq!(value["mach"], 2.0);
    assert!(value["calibrated_airspeed_m_s"].as_f64().unwrap() > 340.0, "a supersonic CAS");
}

#[test]
fn airspeed_bad_input_exits_2_with_one_line() {
    each_fails_with(&[
        (
            &["airspeed", "--tas", "-5", "--pressure", "1e5", "--oat", "288"],
            "",
            "--tas: true airspeed -5 m/s is outside the allowed range 0 to",
        ),
        (&["airspeed", "--mach", "0.5"], "", "give --pressure-altitude H or --pressure P with --oat T"),
        (
            &["airspeed", "--mach", "0.5", "--oat", "250"],
            "",
            "--oat needs --pressure-altitude H or --pressure P",
        ),
        (
            &["airspeed", "--mach", "0.5", "--pressure", "1e5", "--oat", "288", "--offset", "3"],
            "",
            "--offset applies to --altitude only",
        ),
        (
            &["airspeed", "--mach", "0.5", "--pressure-altitude", "-6000", "--oat", "250"],
            "",
            "--pressure-altitude/--oat: geopotential altitude -6000 m is outside the allowed range",
        ),
        (
            &["airspeed", "--mach", "0.5", "--pressure", "1e5", "--oat", "-3"],
            "",
            "temperature must be greater than 0 K",
        ),
        (
            &["airspeed", "--cas", "NaN", "--altitude", "0"],
            "",
            "--cas: calibrated airspeed must be a finite number",
        ),
        (
            &["airspeed", "--mach", "0.5", "--altitude", "-7000"],
            "",
            "--altitude: geometric altitude -7000 m is outside",
        ),
    ]);
    // Two speeds, or none: a usage error (exit 2).
    let output =
        aerostrata().args(["airspeed", "--cas", "1", "--tas", "2", "--altitude", "0"]).output().unwrap();
    assert_eq!(output.status.code(), Some(2));
    let output = aerostrata().args(["airspeed", "--altitude", "0"]).output().unwrap();
    assert_eq!(output.status.code(), Some(2));
}

#[test]
fn altitude_from_pressure() {
    let (csv, _) = run(&["altitude", "--pressure", "22632.063973462926"], "");
    assert!((column(&csv, "pressure_altitude_m")[0].unwrap() - 11_000.0).abs() < 1e-9, "{csv}");
    let geometric = column(&csv, "pressure_altitude_geometric_m")[0].unwrap();
    assert!((geometric - 11_019.0).abs() < 0.5, "{geometric}");
    // A pad reads 0 on itself; QNH 101325 Pa gives the pressure altitude.
    let (csv, _) = run(&["altitude", "--pressure", "97000", "--pad", "97000"], "");
    assert_eq!(column(&csv, "height_above_pad_m")[0], Some(0.0));
    let (csv, _) = run(&["altitude", "--pressure", "90000", "--qnh", "101325", "--temperature", "280"], "");
    assert_eq!(column(&csv, "qnh_altitude_m")[0], column(&csv, "pressure_altitude_m")[0]);
    assert!(column(&csv, "density_altitude_m")[0].is_some());
    // One pressure per line, with line numbers in errors.
    let (csv, _) = run(&["altitude", "-"], "101325\n\n# a comment\n5474.888669677778\n");
    let h = column(&csv, "pressure_altitude_m");
    assert_eq!(h[0], Some(0.0));
    assert!((h[1].unwrap() - 20_000.0).abs() < 1e-9);
}

#[test]
fn altitude_bad_input_exits_2_with_one_line() {
    each_fails_with(&[
        (
            &["altitude", "--pressure", "2e6"],
            "",
            "--pressure: pressure 2000000 Pa is outside the allowed range",
        ),
        (&["altitude", "--pressure", "0"], "", "--pressure: pressure must be greater than 0 Pa, got 0 Pa"),
        (&["altitude", "--pressure", "inf"], "", "pressure must be a finite number, got inf"),
        (
            &["altitude", "--pressure", "9e4", "--qnh", "NaN"],
            "",
            "--qnh: QNH setting must be a finite number",
        ),
        (&["altitude", "--pressure", "9e4", "--pad", "5e5"], "", "--pad: pad pressure 500000 Pa is outside"),
        (
            &["altitude", "--pressure", "9e4", "--temperature", "0"],
            "",
            "--temperature: temperature must be greater than 0 K",
        ),
        (&["altitude", "-"], "101325\nabc\n", "line 2: 'abc' is not a number (static pressure in Pa)"),
        (&["altitude", "-"], "101325\n\n-4\n", "line 3: pressure must be greater than 0 Pa"),
        (&["altitude", "/no/such/file"], "", "cannot open /no/such/file"),
    ]);
    let output = aerostrata().args(["altitude"]).output().unwrap();
    assert_eq!(output.status.code(), Some(2));
}

#[test]
fn help_shows_an_example_per_new_subcommand() {
    for sub in ["flight", "airspeed", "altitude"] {
        let (help, _) = run(&[sub, "--help"], "");
        assert!(help.contains("Example:"), "{sub} help lacks an example");
    }
}
