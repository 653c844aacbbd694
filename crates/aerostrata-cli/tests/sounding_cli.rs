//! `--sounding FILE` on `aerostrata table` and `aerostrata eval`: the invented demo
//! sounding, JSON and CSV agreeing, the blend into the standard, and the error paths.

use std::path::PathBuf;

mod common;

use common::*;

fn demo() -> String {
    let path =
        PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../../examples/data/vessaro_key_hot_humid.csv");
    path.to_str().unwrap().to_owned()
}

#[test]
fn eval_gives_the_demo_soundings_rows_exactly() {
    let csv = stdout_of(&["eval", "--sounding", &demo()], "4\n1000\n30000\n");
    assert_eq!(values(&csv, "temperature_K"), vec![33.4 + 273.15, 25.3 + 273.15, -42.1 + 273.15]);
    assert_eq!(values(&csv, "pressure_Pa"), vec![1008.60 * 100.0, 902.35 * 100.0, 12.33 * 100.0]);
    // A humid row: the state's molecular-scale temperature is the virtual temperature. By
    // hand: e = 1.0041 x 611.21 Pa exp(17.502 x 26.1 / 267.07) = 3386 Pa at the 26.1 degC
    // dew point, e / p = 0.03357, T_v = T / (1 - 0.378 e / p) = T + 3.95 K; aloft, dry air.
    let virtual_temperature = values(&csv, "molecular_temperature_K");
    assert!((virtual_temperature[0] - (306.55 + 3.95)).abs() < 0.01, "{virtual_temperature:?}");
    assert_eq!(virtual_temperature[2], -42.1 + 273.15);
    let molar_mass = values(&csv, "mean_molar_mass_kg_kmol");
    assert!(molar_mass[0] < 28.6 && molar_mass[2] == 28.9644, "{molar_mass:?}");
}

#[test]
fn table_defaults_to_the_soundings_band() {
    let csv = stdout_of(&["table", "--sounding", &demo(), "--step", "1000", "--format", "csv"], "");
    let z = values(&csv, "geometric_altitude_m");
    assert_eq!(z.first(), Some(&4.0));
    assert_eq!(z.last(), Some(&29_004.0));
    let p = values(&csv, "pressure_Pa");
    assert!(p.windows(2).all(|w| w[1] < w[0]), "pressure falls");
    let text =
        stdout_of(&["table", "--sounding", &demo(), "--from", "4", "--to", "30000", "--step", "29996"], "");
    assert_eq!(text.lines().count(), 2 + 2);
}

#[test]
fn json_and_csv_soundings_agree() {
    let dir = scratch("json");
    let csv_path = dir.join("profile.csv");
    let json_path = dir.join("profile.json");
    std::fs::write(&csv_path, "geopotential_altitude_m,temperature_K,pressure_Pa,relative_humidity_percent\n0,303,100800,75\n1500,293.5,84350,60\n3000,284,70420,\n")
        .unwrap();
    std::fs::write(
        &json_path,
        r#"{"altitude": "geopotential", "rows": [
  {"altitude_m": 0, "temperature_k": 303, "pressure_pa": 100800, "relative_humidity_percent": 75},
  {"altitude_m": 1500, "temperature_k": 293.5, "pressure_pa": 84350, "relative_humidity_percent": 60},
  {"altitude_m": 3000, "temperature_k": 284, "pressure_pa": 70420}
]}"#,
    )
    .unwrap();
    let heights = "0\n700\n1500\n2999\n";
    let from_csv = stdout_of(&["eval", "--geopotential", "--sounding", csv_path.to_str().unwrap()], heights);
    let from_json =
        stdout_of(&["eval", "--geopotential", "--sounding", json_path.to_str().unwrap()], heights);
    assert_eq!(from_csv, from_json);
    assert_eq!(values(&from_csv, "pressure_Pa")[2], 84_350.0);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn outside_the_sounding_is_an_error_unless_blended() {
    fails_with_all(
        2,
        &["eval", "--sounding", &demo()],
        "0\n",
        &["stdin: line 1, column 1 (geometric_altitude_m): geometric altitude 0 m is outside the allowed range 4 to 30000 m"],
    );
    // Blended over 5 km, the standard itself from 35 km up and below -4996 m.
    let blended = stdout_of(&["eval", "--sounding", &demo(), "--blend", "5000"], "40000\n0\n");
    let spec = format!("sounding={},blend=5km", demo());
    assert_eq!(stdout_of(&["eval", "--model", &spec], "40000\n0\n"), blended, "--model gives the same model");
    let standard = stdout_of(&["eval"], "40000\n");
    assert_eq!(blended.lines().nth(1), standard.lines().nth(1));
    let t = values(&blended, "temperature_K");
    assert!((t[1] - 306.55).abs() < 0.1, "4 m below the first row: {t:?}");
}

#[test]
fn bad_soundings_exit_2_naming_file_line_column_and_value() {
    let dir = scratch("bad");
    let path = dir.join("bad.csv");
    std::fs::write(
        &path,
        "# invented\ngeometric_altitude_m,temperature_degC,pressure_hPa\n0,30,1010\n500,-290,950\n",
    )
    .unwrap();
    let file = path.to_str().unwrap();
    fails_with_all(
        2,
        &["eval", "--sounding", file],
        "0\n",
        &[file, "line 4, column 2 (temperature_degC), value '-290'", "temperature must be above 0 K"],
    );
    let json = dir.join("bad.json");
    std::fs::write(&json, "{\"altitude\": \"geometric\", \"rows\": [\n  {\"altitude_m\": 0, \"temperature_k\": 300, \"pressure_pa\": 100000},\n  {\"altitude_m\": 0, \"temperature_k\": 299, \"pressure_pa\": 99000}\n]}").unwrap();
    fails_with_all(
        2,
        &["table", "--sounding", json.to_str().unwrap()],
        "",
        &["row 1: altitude 0 m must be at least", "line 3"],
    );
    fails_with_all(
        2,
        &["eval", "--sounding", "/no/such/sounding.csv"],
        "",
        &["cannot read sounding /no/such/sounding.csv"],
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn options_that_do_not_apply_to_a_sounding() {
    fails_with_all(
        2,
        &["eval", "--sounding", &demo(), "--offset", "10"],
        "4\n",
        &["'--sounding <FILE>' cannot be used with '--offset <DT>'"],
    );
    fails_with_all(
        2,
        &["eval", "--sounding", &demo(), "--species"],
        "4\n",
        &["--species gives the standard's own number densities and cannot be combined with --sounding"],
    );
    fails_with_all(
        2,
        &["eval", "--sounding", &demo(), "--blend", "0"],
        "4\n",
        &["--blend: blend depth must be greater than 0 m"],
    );
    let output = aerostrata().args(["eval", "--blend", "5000"]).write_stdin("0\n").output().unwrap();
    assert_eq!(output.status.code(), Some(2), "--blend needs --sounding");
}
