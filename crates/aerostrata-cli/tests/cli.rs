//! The `aerostrata` binary as a user runs it: outputs, formats and every error path.

mod common;

use common::*;

#[test]
fn default_table_covers_0_to_86_km() {
    let text = stdout_of(&["table"], "");
    let rows: Vec<&str> = text.lines().collect();
    assert_eq!(rows.len(), 2 + 87, "two heading lines and a row per km");
    assert!(rows[2].trim_start().starts_with("0.0"));
    assert!(rows[88].trim_start().starts_with("86000.0"));
    assert!(rows[2].contains("288.150"));
}

#[test]
fn table_csv_and_json_agree() {
    let args = ["table", "--from", "-5000", "--to", "30000", "--step", "2500"];
    let csv = stdout_of(&[&args[..], &["--format", "csv"]].concat(), "");
    let json = stdout_of(&[&args[..], &["--format", "json"]].concat(), "");
    let rows: serde_json::Value = serde_json::from_str(&json).unwrap();
    let pressures = values(&csv, "pressure_Pa");
    assert_eq!(pressures.len(), 15);
    for (row, p) in rows.as_array().unwrap().iter().zip(&pressures) {
        assert_eq!(row["pressure_Pa"].as_f64().unwrap(), *p);
    }
    assert_eq!(values(&csv, "geometric_altitude_m")[0], -5000.0);
}

#[test]
fn eval_reads_stdin_and_files_and_skips_blanks() {
    let csv = stdout_of(&["eval"], "0\n\n# a comment\n11000\n");
    assert_eq!(values(&csv, "temperature_K"), vec![288.15, 216.77351270445553]);
    let dir = std::env::temp_dir().join(format!("aerostrata-cli-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let file = dir.join("altitudes.txt");
    std::fs::write(&file, "0\n11000\n").unwrap();
    assert_eq!(stdout_of(&["eval", file.to_str().unwrap()], ""), csv);
    assert_eq!(stdout_of(&["eval", "-"], "0\n11000\n"), csv);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn eval_header_names_quantities_and_units() {
    let csv = stdout_of(&["eval"], "0\n");
    let header = csv.lines().next().unwrap();
    for name in [
        "geometric_altitude_m",
        "geopotential_altitude_m",
        "temperature_K",
        "pressure_Pa",
        "density_kg_m3",
        "speed_of_sound_m_s",
        "dynamic_viscosity_Pa_s",
    ] {
        assert!(header.split(',').any(|c| c == name), "{name} missing from {header}");
    }
}

#[test]
fn offset_and_geopotential_options() {
    let hot = stdout_of(&["eval", "--offset", "15"], "0\n");
    assert_eq!(stdout_of(&["eval", "--offset", "+15K"], "0\n"), hot);
    assert_eq!(stdout_of(&["eval", "--offset", "+27F"], "0\n").lines().count(), 2);
    assert_eq!(values(&hot, "temperature_K"), vec![303.15]);
    assert_eq!(values(&hot, "pressure_Pa"), vec![101_325.0]);
    let cold = stdout_of(&["eval", "--offset", "-15"], "0\n");
    assert_eq!(values(&cold, "temperature_K"), vec![273.15]);
    let geo = stdout_of(&["eval", "--geopotential"], "11000\n");
    assert_eq!(values(&geo, "temperature_K"), vec![216.65]);
    assert_eq!(values(&geo, "pressure_Pa"), vec![22_632.063_973_462_93]);
}

#[test]
fn bad_input_exits_2_with_one_line() {
    fails_with(
        &["eval"],
        "0\nabc\n",
        "stdin: line 2, column 1 (geometric_altitude_m): 'abc' is not a number",
    );
    fails_with(
        &["eval"],
        "0\n\n1200000\n",
        "stdin: line 3, column 1 (geometric_altitude_m): geometric altitude 1200000 m is outside the allowed range \
         -5000 to 1000000 m",
    );
    fails_with(&["eval"], "NaN\n", "stdin: line 1, column 1 (geometric_altitude_m): 'NaN' is not a number");
    fails_with(
        &["eval", "--geopotential"],
        "-6000\n",
        "geopotential altitude -6000 m is outside the allowed range",
    );
    fails_with(&["eval", "--offset", "-400"], "0\n", "--offset -400: -400 K is below any day's offset");
    fails_with(&["eval", "/no/such/file"], "", "cannot open /no/such/file");
    fails_with(
        &["table", "--step", "0"],
        "",
        "--step 0: 0 m is below any altitude step (0.001 to 1005000 m)",
    );
    fails_with(&["table", "--from", "10", "--to", "0"], "", "--to 0 m must not be below --from 10 m");
    fails_with(&["table", "--to", "1000001"], "", "--to 1000001: 1000001 m is above any altitude");
    fails_with(
        &["table", "--to", "1000km", "--sounding", "/no/such.csv"],
        "",
        "cannot read sounding /no/such.csv",
    );
    fails_with(&["eval", "--species", "--offset", "5"], "0\n", "cannot be combined with --offset");
    fails_with(&["table", "--step", "0.001"], "", "gives 86000001 rows, more than the 1000000 allowed");
    fails_with(&["table", "--offset", "inf"], "", "--offset inf: 'inf' is not a number");
    fails_with(
        &["eval", "--geopotential"],
        "altitude_ft\n0\n",
        "line 1: the heading names a geometric altitude",
    );
}

#[test]
fn negative_numbers_as_separate_arguments() {
    let csv =
        stdout_of(&["table", "--from", "-2000", "--to", "-1000", "--step", "500", "--format", "csv"], "");
    assert_eq!(values(&csv, "geometric_altitude_m"), vec![-2000.0, -1500.0, -1000.0]);
    let cold = stdout_of(&["eval", "--offset", "-10"], "0\n");
    assert_eq!(values(&cold, "temperature_K"), vec![278.15]);
    let cold_c = stdout_of(&["eval", "--offset", "-10C"], "0\n");
    assert_eq!(cold_c, cold);
    fails_with(&["table", "--step", "-1"], "", "--step -1: -1 m is below any altitude step");
    let (_, summary) = run(&["flight", "-", "--offset", "-10K", "--summary", "json"], "0,0,0\n1,10,20\n");
    assert!(summary.contains("\"samples\": 2"), "{summary}");
    let air = stdout_of(
        &["airspeed", "--mach", "0.5", "--altitude", "-1000", "--offset", "-5", "--format", "csv"],
        "",
    );
    assert!(values(&air, "static_pressure_Pa")[0] > 101_325.0);
    let temperature = stdout_of(
        &[
            "airspeed",
            "--mach",
            "0.5",
            "--pressure-altitude",
            "0",
            "--temperature",
            "-20C",
            "--format",
            "csv",
        ],
        "",
    );
    assert!(values(&temperature, "speed_of_sound_m_s")[0] < 320.0);
}

#[test]
fn usage_errors_exit_2() {
    let output = aerostrata().args(["table", "--format", "xml"]).output().unwrap();
    assert_eq!(output.status.code(), Some(2));
    let output = aerostrata().arg("frobnicate").output().unwrap();
    assert_eq!(output.status.code(), Some(2));
}

#[test]
fn help_shows_an_example_per_subcommand() {
    for sub in ["table", "eval"] {
        let help = stdout_of(&[sub, "--help"], "");
        assert!(help.contains("Example"), "{sub} help lacks an example");
    }
}

#[test]
fn species_columns_above_86_km() {
    let csv = stdout_of(&["eval", "--species"], "50000\n120000\n400000\n");
    let header: Vec<&str> = csv.lines().next().unwrap().split(',').collect();
    let n2 = header.iter().position(|c| *c == "n_N2_m3").unwrap();
    let h = header.iter().position(|c| *c == "n_H_m3").unwrap();
    let total = header.iter().position(|c| *c == "number_density_m3").unwrap();
    let rows: Vec<Vec<&str>> = csv.lines().skip(1).map(|l| l.split(',').collect()).collect();
    assert_eq!(rows[0][n2], "", "no species below 86 km");
    let n2_120: f64 = rows[1][n2].parse().unwrap();
    // N2 at 120 km: 3.726E+17 /m^3 (U.S. Standard Atmosphere 1976; from memory of the printed table).
    assert!((n2_120 / 3.726e17 - 1.0).abs() < 2e-4, "{n2_120}");
    // Below 150 km the standard lists no hydrogen; aerostrata carries its equation's
    // continuation there, a small share of N (3.3e-6 at 120 km; docs/models.md).
    let (h_120, n_120): (f64, f64) = (rows[1][h].parse().unwrap(), rows[1][total].parse().unwrap());
    assert!(h_120 > 0.0 && h_120 / n_120 < 1e-5, "{h_120} of {n_120}");
    assert!(rows[2][h].parse::<f64>().unwrap() > 0.0);
    // The whole range: a table to 1000 km.
    let table =
        stdout_of(&["table", "--from", "80000", "--to", "1000000", "--step", "20000", "--format", "csv"], "");
    assert_eq!(table.lines().count(), 1 + 47);
}
