//! A command line that cannot be misread: every dimensional option takes a unit, a bare
//! number that cannot be meant is refused naming its option, `--units us` refuses bare
//! numbers as ambiguous; files are read through the core's table reader (headings in any
//! spelling, unknown columns left out with a warning); `--model` in every command that
//! evaluates air, giving the very numbers of the old flags; the plots' own palette.

mod common;

use common::*;

fn sounding() -> String {
    concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples/data/vessaro_key_hot_humid.csv").to_owned()
}

#[test]
fn bare_numbers_that_cannot_be_meant_are_refused_naming_the_option() {
    // 15 K is no air temperature; 1020 Pa no sea-level pressure (the bands: 120 to 350 K,
    // 850 to 1100 hPa, the core's `Plausible` presets).
    fails_with(
        &["airspeed", "--mach", "0.5", "--pressure-altitude", "0", "--oat", "15"],
        "",
        "--temperature 15: 15 K is below any air temperature (120 to 350 K); write 15degC or 288.15K, or 15degF \
         (263.706 K)",
    );
    fails_with(
        &["altitude", "--pressure", "90000", "--temperature", "15"],
        "",
        "--temperature 15: 15 K is below any air temperature",
    );
    fails_with(
        &["altitude", "--pressure", "90000", "--qnh", "1020"],
        "",
        "--qnh 1020: 1020 Pa is below any sea-level pressure (85000 to 110000 Pa); write 1020hPa or 102000Pa, or \
         1020mbar (102000 Pa)",
    );
    fails_with(
        &["altitude", "--pressure", "90000", "--pad", "981"],
        "",
        "--pad 981: 981 Pa is below any surface pressure",
    );
    fails_with(
        &["airspeed", "--mach", "0.5", "--altitude", "35000", "--units", "us"],
        "",
        "--altitude 35000: with --units us a bare number could be m or ft; write 35000ft or 35000m",
    );
    fails_with(
        &["table", "--units", "us", "--to", "40000"],
        "",
        "--to 40000: with --units us a bare number could be m or ft",
    );
    fails_with(
        &["airspeed", "--mach", "0.5", "--altitude", "10ft", "--units", "us", "--offset", "15"],
        "",
        "--offset 15: with --units us a bare number could be K or degF",
    );
    fails_with(
        &["flight", "-", "--cd", "0.5", "--area", "0.3", "--units", "us"],
        "0,0,0\n",
        "--area 0.3: with --units us a bare number could be m2 or ft2",
    );
}

#[test]
fn a_temperature_in_any_unit_gives_the_same_answer() {
    let airspeed = |t: &str| {
        stdout_of(
            &[
                "airspeed",
                "--mach",
                "0.8",
                "--pressure-altitude",
                "10000ft",
                "--temperature",
                t,
                "--format",
                "csv",
            ],
            "",
        )
    };
    // 15 + 273.15 is the double 288.15: degC to K adds exactly here, so every bit agrees.
    assert_eq!(airspeed("15C"), airspeed("288.15K"));
    assert_eq!(airspeed("15degC"), airspeed("288.15"));
    // 59 degF is 15 degC (common practice, no source); (59 - 32) / 1.8 + 273.15 rounds
    // to within an ulp or two of 288.15.
    let (c, f) =
        (values(&airspeed("15C"), "true_airspeed_m_s")[0], values(&airspeed("59F"), "true_airspeed_m_s")[0]);
    assert!((c - f).abs() <= 1e-12 * c, "{c} against {f}");
    let density =
        |t: &str| stdout_of(&["altitude", "--pressure", "843hPa", "--temperature", t, "--format", "csv"], "");
    assert_eq!(density("8C"), density("281.15K"));
    // 1020 hPa is 102000 Pa exactly.
    let qnh = |p: &str| stdout_of(&["altitude", "--pressure", "90000", "--qnh", p, "--format", "csv"], "");
    assert_eq!(qnh("1020hPa"), qnh("102000"));
    assert_eq!(qnh("1020hPa"), qnh("102kPa"));
}

/// An invented boost, every 0.5 s, its altitude in feet.
fn boost(header: &str, extra: &str) -> String {
    let mut text = format!("# invented\n{header}\n");
    for i in 0..40 {
        let t = 0.5 * f64::from(i);
        text += &format!("{t},{},{}{extra}\n", 15.0 * t * t / 0.3048, 30.0 * t);
    }
    text
}

#[test]
fn flight_headings_in_every_spelling_read_alike_and_unknown_columns_warn() {
    let run_flight = |text: &str| run(&["flight", "-", "--summary", "none", "--format", "csv"], text);
    let (plain, quiet) = run_flight(&boost("time_s,altitude_ft,velocity_m_s", ""));
    assert!(quiet.is_empty(), "{quiet}");
    for header in [
        "time (s),altitude (ft),velocity (m/s)",
        "Time [s],Altitude [ft],Velocity [m/s]",
        "time,altitude_ft,velocity",
    ] {
        assert_eq!(run_flight(&boost(header, "")).0, plain, "{header}");
    }
    // A heading's unit wins over --units; the output follows --units.
    let (us, _) = run(
        &["flight", "-", "--summary", "none", "--units", "us"],
        &boost("time_s,altitude_ft,velocity_m_s", ""),
    );
    assert!(us.starts_with("time_s,altitude_ft,velocity_ft_s,"));
    assert_eq!(values(&us, "altitude_ft")[4], 15.0 * 4.0 / 0.3048);
    // A column the flight does not read: loaded, with one warning line naming it.
    let (with_wind, warning) = run_flight(&boost("time_s,altitude_ft,velocity_m_s,wind_speed_kt", ",12"));
    assert_eq!(with_wind, plain);
    assert_eq!(warning.lines().count(), 1, "{warning}");
    assert!(warning.starts_with("aerostrata: stdin: line 2: column 4 'wind_speed_kt' not read"), "{warning}");
}

#[test]
fn eval_takes_a_headed_column_in_any_spelling() {
    let plain = stdout_of(&["eval", "--geopotential"], "0\n11000\n");
    for text in [
        "geopotential_altitude_m\n0\n11000\n",
        "geopotential_altitude (km)\n0\n11\n",
        "Geopotential_Altitude [ft]\n0\n36089.23884514436\n",
    ] {
        let got = stdout_of(&["eval"], text);
        let (a, b) = (values(&got, "temperature_K"), values(&plain, "temperature_K"));
        assert!(a.iter().zip(&b).all(|(x, y)| (x - y).abs() < 1e-9), "{text}: {a:?} against {b:?}");
    }
    // A table: only its altitude column is read, and the rest named on stderr.
    let (table, warning) = run(&["eval"], "label,altitude (m),note\nsea,0,x\ntop,11000,y\n");
    assert_eq!(values(&table, "geometric_altitude_m"), vec![0.0, 11000.0]);
    assert!(warning.contains("columns 1 'label', 3 'note' not read"), "{warning}");
    // A value may carry its own unit.
    assert_eq!(values(&stdout_of(&["eval"], "1km\n"), "geometric_altitude_m"), vec![1000.0]);
}

#[test]
fn model_gives_the_numbers_of_the_old_flags_in_every_command() {
    let pairs: [(&[&str], &[&str]); 2] = [
        (&["--offset", "15"], &["--model", "offset=15"]),
        (&["--offset", "-10C"], &["--model", "offset=-10K"]),
    ];
    for (old, new) in pairs {
        let same = |command: &[&str], stdin: &str| {
            let a = stdout_of(&[command, old].concat(), stdin);
            let b = stdout_of(&[command, new].concat(), stdin);
            assert_eq!(a, b, "{command:?} {old:?} against {new:?}");
            assert!(!a.is_empty());
        };
        same(&["table", "--to", "20km", "--format", "csv"], "");
        same(&["eval"], "0\n11000\n");
        same(&["flight", "-", "--summary", "none"], "0,0,0\n1,100,200\n2,400,400\n");
        same(&["airspeed", "--mach", "0.8", "--altitude", "11km", "--format", "csv"], "");
        same(&["altitude", "--pressure", "700hPa", "--format", "csv"], "");
        same(&["plot", "flight", "-"], "0,0,0\n1,100,200\n2,400,400\n");
    }
    // The old default, and the standard named.
    for command in [&["table", "--to", "5km"][..], &["airspeed", "--mach", "0.5", "--altitude", "1km"]] {
        assert_eq!(stdout_of(command, ""), stdout_of(&[command, &["--model", "standard"]].concat(), ""));
    }
    // A sounding, by its shorthands or by the model language.
    let spec = format!("sounding={},blend=5000", sounding());
    let by_flags = stdout_of(
        &["table", "--sounding", &sounding(), "--blend", "5000", "--from", "0", "--format", "csv"],
        "",
    );
    assert_eq!(stdout_of(&["table", "--model", &spec, "--from", "0", "--format", "csv"], ""), by_flags);
    // plot profile takes several; its labels say which.
    let svg = stdout_of(
        &[
            "plot",
            "profile",
            "temperature",
            "--model",
            "isothermal=250K",
            "--model",
            "exponential=1.225,8.5km",
            "--to",
            "20km",
        ],
        "",
    );
    assert!(
        svg.contains(">isothermal 250 K<") && svg.contains(">exponential 1.225 kg/m3, H 8500 m<"),
        "{svg}"
    );
    // Every model of the grammar without a file, in eval.
    for spec in ["hydrostatic-offset=+15K,p0=1020hPa", "isothermal=-20C", "exponential=1.225,8500m,250K"] {
        let csv = stdout_of(&["eval", "--model", spec], "0\n5000\n");
        assert_eq!(values(&csv, "pressure_Pa").len(), 2, "{spec}");
    }
}

#[test]
fn layers_from_a_file() {
    let dir = scratch("layers");
    let path = dir.join("warm.csv");
    // The 1976 standard's first two layers (0 to 11 km at -6.5 K/km, then isothermal to
    // 20 km; U.S. Standard Atmosphere 1976, Table 4) written as breakpoints.
    std::fs::write(
        &path,
        "# the standard's lowest layers\ngeopotential_altitude_m,temperature_K,pressure_Pa\n0,288.15,101325\n11000,216.65,\n20000,216.65,\n",
    )
    .unwrap();
    let spec = format!("layers={}", path.display());
    let layers = stdout_of(&["eval", "--geopotential", "--model", &spec], "0\n5000\n11000\n19000\n");
    let standard = stdout_of(&["eval", "--geopotential"], "0\n5000\n11000\n19000\n");
    for name in ["temperature_K", "pressure_Pa", "density_kg_m3"] {
        for (a, b) in values(&layers, name).iter().zip(values(&standard, name)) {
            assert!((a / b - 1.0).abs() < 1e-12, "{name}: {a} against {b}");
        }
    }
    // Outside the layers: the model's range, named.
    fails_with(
        &["eval", "--geopotential", "--model", &spec],
        "25000\n",
        "geopotential altitude 25000 m is outside the allowed range 0 to 20000 m",
    );
    std::fs::write(&path, "geopotential_altitude_m,temperature_K,pressure_Pa\n0,288.15,\n1000,280,\n")
        .unwrap();
    fails_with(
        &["eval", "--model", &spec],
        "0\n",
        "line 2, column 3 (pressure_Pa): the first row needs the pressure",
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn figures_use_the_palette_of_our_own_and_read_at_a_phones_width() {
    let flight = "0,0,0\n1,100,200\n2,400,400\n3,900,500\n";
    let svg = stdout_of(&["plot", "flight", "-", "--width", "360"], flight).to_lowercase();
    // The colours the figures drew with before, in the palette's order.
    for old in ["#1f77b4", "#d62728", "#2ca02c", "#9467bd", "#ff7f0e"] {
        assert!(!svg.contains(old), "{old}");
    }
    assert!(svg.contains("#3018ba"), "the palette's first colour");
    assert!(svg.contains("width=\"360\""));
    // Every text keeps a size that reads on a phone.
    let sizes: Vec<f64> = svg
        .split("font-size=\"")
        .skip(1)
        .map(|rest| rest[..rest.find('"').unwrap()].parse().unwrap())
        .collect();
    assert!(!sizes.is_empty() && sizes.iter().all(|s| *s >= 12.0), "{sizes:?}");
}
