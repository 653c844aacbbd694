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
        (&["flight", "-"], "0,0,0\n1,abc,3\n", "stdin: line 2, column 2 (altitude_m): 'abc' is not a number"),
        (&["flight", "-"], "0,0,0\n\n0,10,3\n", "stdin: line 3: flight sample point 1: time (s) must be after"),
        (
            &["flight", "-"],
            "# comment\n0,0,0\n1,-6000,3\n",
            "stdin: line 3, column 2 (altitude_m): geometric altitude -6000 m is outside the allowed range -5000 to",
        ),
        (&["flight", "-"], "0,0,NaN\n", "line 1, column 3 (velocity_m_s): 'NaN' is not a number"),
        (&["flight", "-"], "0,0\n", "line 1: expected 3 values (time_s,altitude_m,velocity_m_s), got 2"),
        (&["flight", "-"], "time,altitude,velocity\n0,,1\n", "line 2, column 2 (altitude): an empty cell"),
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
        (&["flight", "-", "--cd", "0.5", "--area", "0"], "", "--area 0: 0 m2 is below any reference area"),
        (&["flight", "/no/such/file"], "", "cannot open /no/such/file"),
        (
            &["flight", "-", "--offset", "-400"],
            "0,0,0\n",
            "--offset -400: -400 K is below any day's offset from the standard temperature (-100 to 100 K)",
        ),
        (&["flight", "-", "--model", "offset=-400"], "0,0,0\n", "--model offset=-400: offset: an offset DT"),
    ]);
}

#[test]
fn airspeed_conversions() {
    let csv = |args: &[&str]| run(&[&["airspeed", "--format", "csv"], args].concat(), "").0;
    // CAS = EAS = TAS at standard sea level (by definition; common practice, no source).
    let at_sea_level = csv(&["--tas", "120", "--pressure-altitude", "0", "--temperature", "288.15"]);
    for name in ["calibrated_airspeed_m_s", "equivalent_airspeed_m_s", "true_airspeed_m_s"] {
        assert!((column(&at_sea_level, name)[0].unwrap() - 120.0).abs() < 1e-9, "{name}: {at_sea_level}");
    }
    // ISA at 10 000 m', Mach 0.8: CAS 146.985088 m/s (tests/reference/airspeed_mpmath.py).
    let high = csv(&["--mach", "0.8", "--pressure-altitude", "10000", "--temperature", "223.15"]);
    assert!((column(&high, "calibrated_airspeed_m_s")[0].unwrap() - 146.985088396063).abs() < 1e-9);
    // The temperature in degC or degF, the altitude in km: the same air (-50 degC is
    // 223.15 K exactly; -58 degF is -50 degC).
    assert_eq!(csv(&["--mach", "0.8", "--pressure-altitude", "10km", "--temperature", "-50C"]), high);
    let fahrenheit = csv(&["--mach", "0.8", "--pressure-altitude", "10km", "--temperature", "-58F"]);
    let cas = column(&fahrenheit, "calibrated_airspeed_m_s")[0].unwrap();
    assert!((cas - 146.985088396063).abs() < 1e-9, "{cas}");
    // Knots in and out (the old --unit and the unit written after the number), and the
    // same condition given as a static pressure.
    let kt = csv(&["--cas", "250", "--unit", "kt", "--pressure-altitude", "3048", "--oat", "268.15"]);
    assert_eq!(column(&kt, "calibrated_airspeed_kt")[0], Some(250.0));
    let written =
        csv(&["--cas", "250kt", "--pressure-altitude", "3048m", "--temperature", "268.15K", "--units", "us"]);
    let knots_from_si = column(&written, "calibrated_airspeed_kt")[0].unwrap();
    assert!((knots_from_si - 250.0).abs() < 1e-12, "{knots_from_si}");
    let p = column(&kt, "static_pressure_Pa")[0].unwrap().to_string();
    let same = csv(&["--cas", "250", "--unit", "kt", "--pressure", &p, "--temperature", "268.15"]);
    assert_eq!(same, kt);
    // The standard day at an altitude, as JSON.
    let (json, _) =
        run(&["airspeed", "--mach", "2", "--altitude", "11000", "--offset", "5", "--format", "json"], "");
    // JSON is an array of rows, here one, as for every tabular command.
    let value: serde_json::Value = serde_json::from_str(&json).unwrap();
    let value = &value[0];
    assert_eq!(value["mach"], 2.0);
    assert!(value["calibrated_airspeed_m_s"].as_f64().unwrap() > 340.0, "a supersonic CAS");
    // The same air through --model, the shorthand and the model language alike.
    let (by_model, _) = run(
        &["airspeed", "--mach", "2", "--altitude", "11km", "--model", "offset=+5K", "--format", "json"],
        "",
    );
    assert_eq!(by_model, json);
}

#[test]
fn one_answer_reads_well_and_exact_gives_every_digit() {
    let (table, _) =
        run(&["airspeed", "--cas", "250kt", "--pressure-altitude", "10000ft", "--temperature", "-5C"], "");
    let lines: Vec<&str> = table.lines().collect();
    assert_eq!(lines.len(), 3, "{table}");
    assert!(
        lines[0].split_whitespace().eq(["CAS", "EAS", "TAS", "M", "qc", "q", "p", "rho", "a"]),
        "{table}"
    );
    assert!(lines[2].contains("0.4523") && !lines[2].contains("0.45227"), "rounded: {table}");
    let (exact, _) = run(
        &["airspeed", "--cas", "250kt", "--pressure-altitude", "10000ft", "--temperature", "-5C", "--exact"],
        "",
    );
    assert!(exact.contains("0.45227490371064966"), "{exact}");
    let (altitude, _) = run(&["altitude", "--pressure", "843hPa"], "");
    assert!(altitude.lines().nth(2).unwrap().trim_start().starts_with("84300.0"), "{altitude}");
    let (exact, _) = run(&["altitude", "--pressure", "843hPa", "--exact"], "");
    assert!(exact.lines().nth(2).unwrap().split_whitespace().nth(1).unwrap().len() > 10, "{exact}");
}

#[test]
fn airspeed_bad_input_exits_2_with_one_line() {
    each_fails_with(&[
        (
            &["airspeed", "--tas", "-5", "--pressure", "1e5", "--temperature", "288"],
            "",
            "--tas -5: -5 m/s is below any airspeed (0 to 10000 m/s)",
        ),
        (&["airspeed", "--mach", "0.5"], "", "give --pressure-altitude H or --pressure P with --temperature T"),
        (
            &["airspeed", "--mach", "0.5", "--temperature", "250"],
            "",
            "--temperature needs --pressure-altitude H or --pressure P",
        ),
        (
            &["airspeed", "--mach", "0.5", "--pressure", "1e5", "--oat", "288", "--offset", "3"],
            "",
            "--offset applies to --altitude only",
        ),
        (
            &["airspeed", "--mach", "0.5", "--pressure", "1e5", "--oat", "288", "--model", "isothermal=250K"],
            "",
            "--model applies to --altitude only",
        ),
        (
            &["airspeed", "--mach", "0.5", "--pressure-altitude", "-6000", "--oat", "250"],
            "",
            "--pressure-altitude -6000: -6000 m is below any altitude (-5000 to 1000000 m); write -6000ft or -1828.8m",
        ),
        (
            &["airspeed", "--mach", "0.5", "--pressure", "1e5", "--temperature", "-3"],
            "",
            "--temperature -3: -3 K is below any air temperature (120 to 350 K); write -3degC or 270.15K",
        ),
        (&["airspeed", "--cas", "NaN", "--altitude", "0"], "", "--cas NaN: 'NaN' is not a number"),
        (&["airspeed", "--mach", "0.5", "--altitude", "-7000"], "", "--altitude -7000: -7000 m is below any altitude"),
        (
            &[
                "airspeed",
                "--mach",
                "0.5",
                "--altitude",
                "50km",
                "--sounding",
                concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples/data/vessaro_key_hot_humid.csv"),
            ],
            "",
            "--altitude 50km: geometric altitude 50000 m is outside the allowed range 4 to 30000 m",
        ),
        // The option at fault is named, not the one beside it.
        (&["airspeed", "--mach", "0.5", "--altitude", "0", "--offset", "-300"], "", "--offset -300: -300 K is below"),
        (&["airspeed", "--mach", "0.5", "--altitude", "35000", "--units", "us"], "", "--altitude 35000: with --units us"),
        (&["airspeed", "--cas", "250", "--altitude", "0ft", "--units", "us"], "", "--cas 250: with --units us a bare number could be m/s or kt; write 250kt or 250m/s"),
        (&["airspeed", "--mach", "0.5", "--pressure", "29.92", "--temperature", "15C", "--units", "us"], "", "--pressure 29.92: with --units us a bare number could be Pa or inHg"),
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
    let csv = |args: &[&str]| run(&[&["altitude", "--format", "csv"], args].concat(), "").0;
    let tropopause = csv(&["--pressure", "22632.063973462926"]);
    assert!((column(&tropopause, "pressure_altitude_m")[0].unwrap() - 11_000.0).abs() < 1e-9, "{tropopause}");
    let geometric = column(&tropopause, "pressure_altitude_geometric_m")[0].unwrap();
    assert!((geometric - 11_019.0).abs() < 0.5, "{geometric}");
    // A pad reads 0 on itself; QNH 101325 Pa gives the pressure altitude.
    assert_eq!(column(&csv(&["--pressure", "97000", "--pad", "970hPa"]), "height_above_pad_m")[0], Some(0.0));
    let with_qnh = csv(&["--pressure", "90000", "--qnh", "1013.25hPa", "--temperature", "280"]);
    assert_eq!(column(&with_qnh, "qnh_altitude_m")[0], column(&with_qnh, "pressure_altitude_m")[0]);
    assert!(column(&with_qnh, "density_altitude_m")[0].is_some());
    // 1020 hPa written in hPa, mbar or Pa: the same setting to the last bit.
    let qnh = |setting: &str| csv(&["--pressure", "90000", "--qnh", setting]);
    assert_eq!(qnh("1020hPa"), qnh("102000"));
    assert_eq!(qnh("1020mbar"), qnh("102000Pa"));
    // One pressure per line, with line numbers in errors; CSV by default for a file.
    let (lines, _) = run(&["altitude", "-"], "101325\n\n# a comment\n5474.888669677778\n");
    let h = column(&lines, "pressure_altitude_m");
    assert_eq!(h[0], Some(0.0));
    assert!((h[1].unwrap() - 20_000.0).abs() < 1e-9);
    // A headed column, in hPa, whatever --units says.
    let (headed, _) = run(&["altitude", "-", "--units", "us"], "static_pressure (hPa)\n1013.25\n");
    assert_eq!(column(&headed, "pressure_altitude_ft")[0], Some(0.0));
    // With a model: where its air has the pressure, and the density altitude of that air.
    let standard = csv(&["--pressure", "90000", "--model", "standard"]);
    let (z, zp) =
        (column(&standard, "geometric_altitude_m")[0], column(&standard, "pressure_altitude_geometric_m")[0]);
    assert!((z.unwrap() - zp.unwrap()).abs() < 1e-6, "the standard's own pressure altitude: {standard}");
    let hot = csv(&["--pressure", "90000", "--offset", "+15K"]);
    assert_eq!(hot, csv(&["--pressure", "90000", "--model", "offset=+15K"]));
    let (z_hot, hd) =
        (column(&hot, "geometric_altitude_m")[0].unwrap(), column(&hot, "density_altitude_m")[0].unwrap());
    assert!(z_hot > zp.unwrap() && hd > z_hot, "a hot day: higher, and thinner still: {hot}");
}

#[test]
fn altitude_bad_input_exits_2_with_one_line() {
    each_fails_with(&[
        (&["altitude", "--pressure", "2e6"], "", "--pressure 2e6: 2000000 Pa is above any static pressure"),
        (&["altitude", "--pressure", "0"], "", "--pressure 0: pressure must be greater than 0 Pa, got 0 Pa"),
        (&["altitude", "--pressure", "inf"], "", "--pressure inf: 'inf' is not a number"),
        (&["altitude", "--pressure", "9e4", "--qnh", "NaN"], "", "--qnh NaN: 'NaN' is not a number"),
        (
            &["altitude", "--pressure", "9e4", "--qnh", "1020"],
            "",
            "--qnh 1020: 1020 Pa is below any sea-level pressure (85000 to 110000 Pa); write 1020hPa or 102000Pa",
        ),
        (&["altitude", "--pressure", "9e4", "--pad", "5e5"], "", "--pad 5e5: 500000 Pa is above any surface pressure"),
        (
            &["altitude", "--pressure", "9e4", "--temperature", "0"],
            "",
            "--temperature 0: 0 K is below any air temperature (120 to 350 K); write 0degC or 273.15K",
        ),
        (&["altitude", "-"], "101325\nabc\n", "stdin: line 2, column 1 (static_pressure_Pa): 'abc' is not a number"),
        (&["altitude", "-"], "101325\n\n-4\n", "stdin: line 3, column 1 (static_pressure_Pa): pressure must be greater"),
        (&["altitude", "-", "--units", "us"], "29.92\n-4\n", "line 2, column 1 (static_pressure_inHg): -4 inHg: pressure"),
        (&["altitude", "/no/such/file"], "", "cannot open /no/such/file"),
        (&["altitude", "--pressure", "84300", "--units", "us"], "", "--pressure 84300: with --units us a bare number could be Pa or inHg"),
    ]);
    let output = aerostrata().args(["altitude"]).output().unwrap();
    assert_eq!(output.status.code(), Some(2));
}

#[test]
fn help_shows_an_example_per_new_subcommand() {
    for sub in ["flight", "airspeed", "altitude"] {
        let (help, _) = run(&[sub, "--help"], "");
        assert!(help.contains("Example"), "{sub} help lacks an example");
    }
}

#[test]
fn the_caution_ends_the_flight_help_its_manual_page_and_its_summaries() {
    const CAUTION: &str =
        "Not certified flight software; verify independently; local codes, range-safety rules \
                           and licensed engineering practice govern.";
    let (help, _) = run(&["flight", "--help"], "");
    assert!(help.trim_end().ends_with(CAUTION), "{help}");
    let (page, _) = run(&["man", "flight"], "");
    let words = |text: &str| text.replace("\\-", "-").split_whitespace().collect::<Vec<_>>().join(" ");
    assert!(words(&page).contains(CAUTION), "{page}");
    let (_, text) = run(&["flight", "-"], &ascent());
    assert!(text.trim_end().ends_with(CAUTION), "{text}");
    let (_, json) = run(&["flight", "-", "--summary", "json"], &ascent());
    let summary: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert_eq!(summary["caution"], CAUTION);
    let (_, json) = run(&["flight", "-", "--summary", "json", "--units", "us"], &ascent());
    assert_eq!(serde_json::from_str::<serde_json::Value>(&json).unwrap()["caution"], CAUTION);
}
