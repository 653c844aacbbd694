//! The robustness issue's consistency items, one check each: negative numbers as option
//! values, errors that blame the right option and print a readable value, `-o` to a
//! directory, flight files read by the rules soundings are read by (a byte-order mark,
//! headings in any case or quoted), doubled columns refused, and JSON soundings' errors
//! across rows with their line. Expected behaviour: common practice, no source.

mod common;

use common::{each_fails_with, fails_with, fails_with_all, run, scratch, values};

#[test]
fn a_negative_number_is_a_value_of_every_option() {
    each_fails_with(&[
        (&["table", "--from", "0", "--to", "10km", "--step", "-1"], "", "--step -1: -1 m is below"),
        (&["flight", "-", "--plateau-fraction", "-1"], "0,0,100\n1,1,100\n", "--plateau-fraction -1:"),
        (&["plot", "flight", "-", "--width", "-5"], "", "'-5' for '--width <PX>': -5 is not in 240..=20000"),
        (&["airspeed", "--mach", "-0.5", "--altitude", "0"], "", "--mach"),
    ]);
    // And a text may start with a hyphen: a legend entry.
    let dir = scratch("one-reader-label");
    let out = dir.join("p.svg");
    run(&["plot", "profile", "--label", "-cold-", "--output", out.to_str().unwrap()], "");
    assert!(std::fs::read_to_string(&out).unwrap().contains("-cold-"));
}

#[test]
fn errors_blame_the_option_given_and_print_readable_values() {
    each_fails_with(&[
        (
            &["airspeed", "--cas", "100kt", "--altitude", "1000", "--offset", "-300"],
            "",
            "--offset -300: -300 K",
        ),
        (&["eval", "--offset", "-300"], "1000\n", "--offset -300: -300 K is below"),
        (
            &["table", "--from", "0", "--to", "1", "--step", "1", "--offset", "1e300"],
            "",
            "1.00000e300 K is above",
        ),
    ]);
    let output =
        common::aerostrata().args(["airspeed", "--cas", "1e300kt", "--altitude", "0"]).output().unwrap();
    let stderr = String::from_utf8(output.stderr).unwrap();
    assert!(stderr.len() < 200 && !stderr.contains("0000000000"), "{stderr}");
}

#[test]
fn output_to_a_directory_is_bad_usage_like_a_bad_path() {
    let dir = scratch("one-reader-dir");
    let d = dir.to_str().unwrap();
    fails_with(&["eval", "-o", d], "0\n", "is a directory; give a file name inside it");
    fails_with(&["eval", "-o", &format!("{d}/no/such/dir/x.csv")], "0\n", "--output: cannot create");
}

#[test]
fn flight_files_take_a_byte_order_mark_and_headings_in_any_case_or_quoted() {
    let plain = "time_s,altitude_m,velocity_m_s\n0,0,100\n1,100,120\n";
    let expected = values(&run(&["flight", "-", "--summary", "none"], plain).0, "dynamic_pressure_Pa");
    for text in [
        "\u{feff}time_s,altitude_m,velocity_m_s\n0,0,100\n1,100,120\n",
        "TIME_S,ALTITUDE_M,Velocity_M_S\n0,0,100\n1,100,120\n",
        "\"time (s)\",\"altitude (m)\",\"velocity (m/s)\"\n0,0,100\n1,100,120\n",
    ] {
        let (out, err) = run(&["flight", "-", "--summary", "none"], text);
        assert_eq!(values(&out, "dynamic_pressure_Pa"), expected, "{text:?}");
        assert!(err.is_empty(), "{text:?}: {err}");
    }
}

#[test]
fn doubled_or_conflicting_columns_are_refused() {
    each_fails_with(&[
        (
            &["flight", "-"],
            "time_s,altitude_m,velocity_m_s,altitude_ft\n0,0,1,0\n",
            "columns 2 and 4 both give the altitude",
        ),
        (
            &["flight", "-"],
            "time_s,altitude_m,velocity_m_s,time_s\n0,0,1,0\n",
            "columns 1 and 4 both give the time",
        ),
        (&["eval"], "altitude_m,altitude_m\n0,0\n", "columns 1 and 2 both give the altitude"),
        (
            &["eval"],
            "altitude_m,geopotential_altitude_m\n0,0\n",
            "the header has columns geopotential_altitude and altitude: keep one",
        ),
        (
            &["flight", "-"],
            "time_s,altitude_m,velocity_m_s,velocity_east_m_s\n0,0,1,0\n",
            "the header gives the velocity twice",
        ),
    ]);
}

#[test]
fn json_soundings_errors_across_rows_carry_a_line() {
    let dir = scratch("one-reader-json");
    let cases = [
        (
            "one.json",
            "{\"altitude\": \"geometric\",\n \"rows\": [\n  {\"altitude_m\": 0, \"temperature_k\": 288, \"pressure_pa\": 101325}\n ]\n}\n",
            "a table needs at least 2 rows, got 1 at line 4",
        ),
        (
            "blend.json",
            "{\"altitude\": \"geometric\",\n \"below\": {\"blend_into_us1976\": {\"depth_m\": -5}},\n \"rows\": [\n  \
             {\"altitude_m\": 0, \"temperature_k\": 288, \"pressure_pa\": 101325},\n  \
             {\"altitude_m\": 1000, \"temperature_k\": 281, \"pressure_pa\": 90000}\n ]\n}\n",
            // Checked when the table is there, after its rows: the position after them.
            "got -5 m at line 7",
        ),
        (
            "order.json",
            "{\"altitude\": \"geometric\",\n \"rows\": [\n  \
             {\"altitude_m\": 0, \"temperature_k\": 288, \"pressure_pa\": 101325},\n  \
             {\"altitude_m\": 1000, \"temperature_k\": 281, \"pressure_pa\": 120000}\n ]\n}\n",
            "must be below the previous row's 101325 Pa at line 4",
        ),
    ];
    for (name, text, words) in cases {
        let path = dir.join(name);
        std::fs::write(&path, text).unwrap();
        let spec = format!("sounding={}", path.display());
        fails_with_all(
            2,
            &["table", "--from", "0", "--to", "100", "--step", "100", "--model", &spec],
            "",
            &[name, words],
        );
    }
}
