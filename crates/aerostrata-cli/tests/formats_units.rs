//! Every tabular subcommand in every format and both unit systems (a round trip
//! SI -> US -> SI agreeing to 1e-12), `--output`, `--version`, completions, the man page,
//! plots, and the error paths of all of these (exit status and one stderr line).

mod common;

use common::*;

/// Exact factors, as the published definitions give them (the international foot and
/// nautical mile of 1959, the pound-force from the avoirdupois pound and g0; NIST SP 811
/// for the inch of mercury) — independent of the core's constants module.
const FOOT_M: f64 = 0.3048;
const KNOT_M_S: f64 = 1852.0 / 3600.0;
const INHG_PA: f64 = 3386.389;
const POUND_FORCE_N: f64 = 0.453_592_37 * 9.806_65;

/// Header and rows of CSV; empty cells are NaN.
fn csv(text: &str) -> (Vec<String>, Vec<Vec<f64>>) {
    let mut lines = text.lines();
    let header = lines.next().unwrap().split(',').map(str::to_owned).collect();
    let rows = lines.map(|l| l.split(',').map(|c| c.parse().unwrap_or(f64::NAN)).collect()).collect();
    (header, rows)
}

/// The JSON summary of a flight's stderr (after any warning about ignored columns).
fn summary_json(stderr: &str) -> serde_json::Value {
    serde_json::from_str(&stderr[stderr.find('{').expect("a JSON summary")..]).unwrap()
}

/// The texts of an SVG's `<text>` elements.
fn texts(svg: &str) -> Vec<String> {
    svg.split("<text")
        .skip(1)
        .filter_map(|part| {
            let body = &part[part.find('>')? + 1..];
            Some(body[..body.find("</text>")?].trim().to_owned())
        })
        .collect()
}

/// The SI value of a column named `key` in US units, by its unit suffix.
fn us_to_si(key: &str, value: f64) -> f64 {
    let ends = |suffix: &str| key.ends_with(suffix);
    if ends("_degF") {
        (value + 459.67) * 5.0 / 9.0
    } else if ends("_slug_ft3") {
        value * POUND_FORCE_N / FOOT_M.powi(4)
    } else if ends("_lbf_s_ft2") || ends("_psf") {
        value * POUND_FORCE_N / (FOOT_M * FOOT_M)
    } else if ends("_lbf_s_degR") {
        value * POUND_FORCE_N * 1.8
    } else if ends("_per_ft") {
        value / FOOT_M
    } else if ends("_ft2_s") {
        value * FOOT_M * FOOT_M
    } else if ends("_ft_s2") || ends("_ft_s") || ends("_ft") {
        value * FOOT_M
    } else if ends("_ft3") {
        value / FOOT_M.powi(3)
    } else if ends("_lbf") {
        value * POUND_FORCE_N
    } else if ends("_inHg") {
        value * INHG_PA
    } else if ends("_kt") {
        value * KNOT_M_S
    } else {
        // kg/kmol is lb/lbmol in number: the one unit both systems share.
        assert!(
            key.ends_with("_kg_kmol")
                || !key.contains("_m")
                    && !key.ends_with("_K")
                    && !key.ends_with("_Pa")
                    && !key.ends_with("_N"),
            "{key} still names an SI unit"
        );
        value
    }
}

/// The US run's CSV, converted back to SI, matches the SI run's to 1e-12 relative, and
/// every header names a US unit where the SI header names an SI one.
fn round_trip(si: &str, us: &str) {
    let (si_header, si_rows) = csv(si);
    let (us_header, us_rows) = csv(us);
    assert_eq!(si_rows.len(), us_rows.len());
    assert!(!si_rows.is_empty());
    for (row_si, row_us) in si_rows.iter().zip(&us_rows) {
        for ((key_si, key_us), (a, b)) in si_header.iter().zip(&us_header).zip(row_si.iter().zip(row_us)) {
            let back = us_to_si(key_us, *b);
            if a.is_nan() {
                assert!(b.is_nan(), "{key_si} empty in SI only");
                continue;
            }
            let scale = a.abs().max(1e-300);
            // Temperatures near 0 degF lose digits to Fahrenheit's offset; judge them in K.
            assert!((back - a).abs() <= 1e-12 * scale, "{key_si} {a} against {key_us} {b} -> {back}");
        }
    }
}

#[test]
fn table_round_trips_through_us_units() {
    let si =
        stdout_of(&["table", "--from", "-2000", "--to", "80000", "--step", "4100", "--format", "csv"], "");
    let feet = |m: f64| format!("{}ft", m / FOOT_M);
    let (f, t, s) = (feet(-2000.0), feet(80000.0), feet(4100.0));
    let us =
        stdout_of(&["table", "--units", "us", "--from", &f, "--to", &t, "--step", &s, "--format", "csv"], "");
    assert!(us.starts_with("geometric_altitude_ft,geopotential_altitude_ft,temperature_degF,"), "{us}");
    round_trip(&si, &us);
}

#[test]
fn eval_round_trips_with_species_and_a_hot_day() {
    let heights_m = [0.0, 1234.5, 11_000.0, 47_000.0, 120_000.0, 500_000.0];
    let si_in: String = heights_m.iter().map(|h| format!("{h}\n")).collect();
    let us_in: String = heights_m.iter().map(|h| format!("{}\n", h / FOOT_M)).collect();
    let si = stdout_of(&["eval", "--species"], &si_in);
    let us = stdout_of(&["eval", "--species", "--units", "us"], &us_in);
    round_trip(&si, &us);
    // A temperature offset of 9 degF is 5 K.
    let si = stdout_of(&["eval", "--offset", "5"], "0\n1234.5\n11000\n");
    let us_in: String = [0.0, 1234.5, 11_000.0].iter().map(|h| format!("{}\n", h / FOOT_M)).collect();
    let us = stdout_of(&["eval", "--offset", "9F", "--units", "us"], &us_in);
    round_trip(&si, &us);
}

fn flight_log(feet: bool) -> String {
    let scale = if feet { 1.0 / FOOT_M } else { 1.0 };
    let unit = if feet { "ft" } else { "m" };
    let mut text = format!("# invented\nphase,time_s,velocity_{unit}_s,altitude_{unit}\n");
    for i in 0..200 {
        let t = 0.5 * i as f64;
        let (z, v) = if t <= 30.0 {
            (12.5 * t * t, 25.0 * t)
        } else {
            (11_250.0 + 750.0 * (t - 30.0) - 4.9 * (t - 30.0).powi(2), 750.0 - 9.8 * (t - 30.0))
        };
        text += &format!("{},{t},{},{}\n", if t <= 30.0 { "boost" } else { "coast" }, v * scale, z * scale);
    }
    text
}

#[test]
fn flight_round_trips_and_reads_headed_columns() {
    let vehicle_si = ["--cd-table", "0:0.45,1.1:0.75,2:0.55", "--area", "0.0182", "--length", "3"];
    let area_ft2 = format!("{}ft2", 0.0182 / (FOOT_M * FOOT_M));
    let length_ft = format!("{}ft", 3.0 / FOOT_M);
    let vehicle_us = [
        "--cd-table",
        "0:0.45,1.1:0.75,2:0.55",
        "--area",
        &area_ft2,
        "--length",
        &length_ft,
        "--units",
        "us",
    ];
    let (si, summary_si) =
        run(&[&["flight", "-", "--summary", "json"], &vehicle_si[..]].concat(), &flight_log(false));
    let (us, summary_us) =
        run(&[&["flight", "-", "--summary", "json"], &vehicle_us[..]].concat(), &flight_log(true));
    assert!(us.starts_with("time_s,altitude_ft,velocity_ft_s,density_slug_ft3,pressure_psf,temperature_degF,speed_of_sound_ft_s,mach,dynamic_pressure_psf,reynolds_per_ft,"), "{us}");
    round_trip(&si, &us);
    // A header naming metres is read in metres whatever --units says.
    let (mixed, _) =
        run(&[&["flight", "-", "--summary", "none"], &vehicle_us[..]].concat(), &flight_log(false));
    round_trip(&si, &mixed);
    let (si, us) = (summary_json(&summary_si), summary_json(&summary_us));
    // The text column is left out, with one warning line naming it.
    assert!(summary_si.starts_with("aerostrata: stdin: line 2: column 1 'phase' not read"), "{summary_si}");
    assert_eq!(us["units"], "us");
    let (q_si, q_us) = (&si["max_dynamic_pressure"], &us["max_dynamic_pressure"]);
    let q = q_si["dynamic_pressure_pa"].as_f64().unwrap();
    assert!(
        (q_us["dynamic_pressure_psf"].as_f64().unwrap() * POUND_FORCE_N / (FOOT_M * FOOT_M) / q - 1.0).abs()
            < 1e-12
    );
    let z = q_si["altitude_m"].as_f64().unwrap();
    assert!((q_us["altitude_ft"].as_f64().unwrap() * FOOT_M / z - 1.0).abs() < 1e-12);
    let drag = si["max_drag"]["value"].as_f64().unwrap();
    assert!((us["max_drag"]["drag_lbf"].as_f64().unwrap() * POUND_FORCE_N / drag - 1.0).abs() < 1e-12);
    // The text summary names the units used.
    let (_, text) = run(&[&["flight", "-"], &vehicle_us[..]].concat(), &flight_log(true));
    assert!(
        text.contains(" psf at t = ") && text.contains(" lbf at t = ") && text.contains(" ft/s, Mach"),
        "{text}"
    );
}

#[test]
fn airspeed_and_altitude_round_trip() {
    let si = stdout_of(
        &["airspeed", "--tas", "200", "--altitude", "7000", "--offset", "10", "--format", "csv"],
        "",
    );
    let (tas, z, dt) = (format!("{}kt", 200.0 / KNOT_M_S), format!("{}ft", 7000.0 / FOOT_M), "18F");
    let us = stdout_of(
        &["airspeed", "--tas", &tas, "--altitude", &z, "--offset", dt, "--units", "us", "--format", "csv"],
        "",
    );
    assert!(us.starts_with("calibrated_airspeed_kt,"), "{us}");
    round_trip(&si, &us);
    // The same air given as a pressure and a temperature.
    let p = csv(&si).1[0][6];
    let si2 = stdout_of(
        &["airspeed", "--mach", "0.6", "--pressure", &p.to_string(), "--oat", "250", "--format", "csv"],
        "",
    );
    let p_psf = format!("{}psf", p / (POUND_FORCE_N / (FOOT_M * FOOT_M)));
    let oat_f = format!("{}F", 250.0 * 1.8 - 459.67);
    let us2 = stdout_of(
        &[
            "airspeed",
            "--mach",
            "0.6",
            "--pressure",
            &p_psf,
            "--oat",
            &oat_f,
            "--units",
            "us",
            "--format",
            "csv",
        ],
        "",
    );
    round_trip(&si2, &us2);
    // Altimetry in inHg.
    let pressures = [101_325.0, 84_300.0, 30_000.0];
    let si_in: String = pressures.iter().map(|p| format!("{p}\n")).collect();
    let us_in: String = pressures.iter().map(|p| format!("{}\n", p / INHG_PA)).collect();
    let pad = format!("{}inHg", 98_100.0 / INHG_PA);
    let si = stdout_of(&["altitude", "-", "--pad", "98100", "--temperature", "281.2"], &si_in);
    let us = stdout_of(
        &[
            "altitude",
            "-",
            "--pad",
            &pad,
            "--temperature",
            &format!("{}degF", 281.2 * 1.8 - 459.67),
            "--units",
            "us",
        ],
        &us_in,
    );
    assert!(us.starts_with("static_pressure_inHg,pressure_altitude_ft,pressure_altitude_geometric_ft,height_above_pad_ft,density_altitude_ft"), "{us}");
    round_trip(&si, &us);
    // Speeds in ft/s on request.
    let fts =
        stdout_of(&["airspeed", "--tas", "100", "--unit", "ft/s", "--altitude", "0", "--format", "csv"], "");
    assert_eq!(csv(&fts).1[0][2], 100.0);
    assert!(fts.starts_with("calibrated_airspeed_ft_s,"));
}

/// Runs `args` in every format and checks each parses and holds `rows` rows.
fn every_format(args: &[&str], stdin: &str, rows: usize, key: &str) {
    let csv_text = stdout_of(&[args, &["--format", "csv"]].concat(), stdin);
    let (header, values) = csv(&csv_text);
    assert_eq!(values.len(), rows, "{args:?} csv");
    let column = header.iter().position(|h| h == key).unwrap_or_else(|| panic!("{key} in {header:?}"));
    let json: serde_json::Value =
        serde_json::from_str(&stdout_of(&[args, &["--format", "json"]].concat(), stdin)).unwrap();
    let array = json.as_array().unwrap();
    assert_eq!(array.len(), rows, "{args:?} json");
    for (object, row) in array.iter().zip(&values) {
        assert_eq!(object.as_object().unwrap().len(), header.len());
        assert_eq!(object[key].as_f64().unwrap(), row[column], "{args:?}: JSON and CSV give the same digits");
    }
    let table = stdout_of(&[args, &["--format", "table"]].concat(), stdin);
    let lines: Vec<&str> = table.lines().collect();
    assert_eq!(lines.len(), rows + 2, "{args:?} table: two heading lines and the rows");
    let width = lines[0].len();
    assert!(lines.iter().all(|l| l.len() == width), "{args:?} table is aligned:\n{table}");
    let markdown = stdout_of(&[args, &["--format", "markdown"]].concat(), stdin);
    let lines: Vec<&str> = markdown.lines().collect();
    assert_eq!(lines.len(), rows + 2, "{args:?} markdown");
    assert!(lines[1].starts_with("| ---: |"), "{markdown}");
    let bars = lines[0].matches('|').count();
    assert!(lines.iter().all(|l| l.starts_with("| ") && l.ends_with(" |") && l.matches('|').count() == bars));
}

#[test]
fn every_tabular_subcommand_in_every_format() {
    every_format(&["table", "--to", "5000"], "", 6, "pressure_Pa");
    every_format(&["table", "--units", "us", "--to", "20000ft"], "", 5, "pressure_psf");
    every_format(&["eval"], "0\n11000\n", 2, "density_kg_m3");
    every_format(&["eval", "--species"], "50000\n300000\n", 2, "geometric_altitude_m");
    every_format(
        &["flight", "-", "--summary", "none", "--cd", "0.5", "--area", "0.02"],
        &flight_log(false),
        200,
        "drag_N",
    );
    every_format(&["airspeed", "--cas", "120", "--altitude", "2000"], "", 1, "true_airspeed_m_s");
    every_format(&["altitude", "-", "--qnh", "102000"], "101325\n90000\n", 2, "qnh_altitude_m");
    every_format(&["altitude", "--pressure", "29.92inHg", "--units", "us"], "", 1, "pressure_altitude_ft");
}

#[test]
fn output_goes_to_a_file_only_on_success() {
    let dir = scratch("output");
    let file = dir.join("table.csv");
    let path = file.to_str().unwrap();
    let (stdout, _) = run(&["table", "--to", "3000", "--format", "csv", "--output", path], "");
    assert!(stdout.is_empty());
    assert_eq!(
        std::fs::read_to_string(&file).unwrap(),
        stdout_of(&["table", "--to", "3000", "--format", "csv"], "")
    );
    // A failing run leaves neither a new file nor a half-written one, and keeps the old.
    let other = dir.join("eval.csv");
    fails(
        2,
        &["eval", "-o", other.to_str().unwrap()],
        "0\n1000\nxyz\n",
        "stdin: line 3, column 1 (geometric_altitude_m): 'xyz' is not a number",
    );
    assert!(!other.exists());
    fails(2, &["eval", "-o", path], "1e9\n", "line 1, column 1 (geometric_altitude_m): geometric altitude");
    assert!(std::fs::read_to_string(&file).unwrap().starts_with("geometric_altitude_m,"));
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 1, "no partial files left");
    fails(2, &["table", "-o", "/no/such/dir/t.csv"], "", "--output: cannot create /no/such/dir/t.csv");
    // Every writing command takes -o.
    for args in [
        vec!["airspeed", "--mach", "0.5", "--altitude", "0"],
        vec!["altitude", "--pressure", "90000"],
        vec!["completions", "fish"],
        vec!["man"],
        vec!["plot", "profile", "temperature"],
    ] {
        let target = dir.join("x.out");
        run(&[&args[..], &["-o", target.to_str().unwrap()]].concat(), "");
        assert!(std::fs::metadata(&target).unwrap().len() > 50, "{args:?}");
        std::fs::remove_file(&target).unwrap();
    }
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn version_completions_and_man_page() {
    let version = stdout_of(&["--version"], "");
    assert_eq!(version.trim(), format!("aerostrata {}", env!("CARGO_PKG_VERSION")));
    for shell in ["bash", "zsh", "fish", "elvish", "powershell"] {
        let script = stdout_of(&["completions", shell], "");
        for word in ["aerostrata", "table", "flight", "plot", "--units"] {
            assert!(script.contains(word), "{shell} completions lack {word}");
        }
    }
    let page = stdout_of(&["man"], "");
    assert!(page.contains(".TH aerostrata 1"), "{}", &page[..200]);
    for word in ["table", "eval", "flight", "airspeed", "altitude", "plot"] {
        assert!(page.contains(word), "man page lacks {word}");
    }
    let page = stdout_of(&["man", "plot", "profile"], "");
    assert!(page.contains(".TH aerostrata-plot-profile 1") && page.contains("\\-\\-model"), "{page}");
    fails(2, &["man", "plot", "nothing"], "", "man: no subcommand 'nothing' under 'aerostrata-plot'");
    fails(2, &["completions", "tcsh"], "", "invalid value 'tcsh'");
    // Help of every subcommand carries an example and exits 0.
    for sub in
        [&["plot", "profile"][..], &["plot", "flight"], &["completions"], &["man"], &["table"], &["eval"]]
    {
        let help = stdout_of(&[sub, &["--help"]].concat(), "");
        assert!(help.contains("Example"), "{sub:?}");
    }
}

#[test]
fn profile_plots_draw_several_models_with_labels_and_log_axes() {
    let sounding = concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples/data/vessaro_key_hot_humid.csv");
    let model = format!("sounding={sounding}");
    let svg = stdout_of(
        &[
            "plot",
            "profile",
            "temperature",
            "pressure",
            "--model",
            "standard",
            "--model",
            "offset=15",
            "--model",
            &model,
            "--to",
            "30000",
        ],
        "",
    );
    assert!(svg.starts_with("<svg") && svg.trim_end().ends_with("</svg>"));
    for text in [
        "Temperature, pressure against altitude",
        "temperature (K)",
        "pressure (Pa)",
        "geometric altitude (km)",
        "US 1976 standard",
        "standard +15 K",
        "sounding vessaro_key_hot_humid",
    ] {
        assert!(svg.contains(text), "{text}");
    }
    // Pressure spans decades: its axis is logarithmic, ticks at powers of ten.
    let labels = texts(&svg);
    assert!(
        ["1000", "10000", "100000"].iter().all(|t| labels.iter().any(|l| l == t)),
        "log ticks: {labels:?}"
    );
    let us = stdout_of(
        &[
            "plot",
            "profile",
            "density",
            "--units",
            "us",
            "--model",
            "offset=+27F",
            "--label",
            "hot day",
            "--title",
            "Hot",
        ],
        "",
    );
    let labels = texts(&us);
    for text in ["density (slug/ft3)", "geometric altitude (ft)", "hot day", "Hot"] {
        assert!(labels.iter().any(|l| l == text), "{text} in {labels:?}");
    }
    let linear =
        texts(&stdout_of(&["plot", "profile", "pressure", "--scale", "linear", "--to", "30000"], ""));
    assert!(!linear.iter().any(|l| l == "1000"), "{linear:?}");
}

#[test]
fn flight_plots_mark_the_maximum_q() {
    let dir = scratch("plot");
    let (a, b) = (dir.join("fast.csv"), dir.join("slow.csv"));
    std::fs::write(&a, flight_log(false)).unwrap();
    std::fs::write(&b, flight_log(true)).unwrap();
    let svg = stdout_of(
        &[
            "plot",
            "flight",
            a.to_str().unwrap(),
            b.to_str().unwrap(),
            "--label",
            "metres",
            "--cd",
            "0.5",
            "--area",
            "0.02",
        ],
        "",
    );
    for text in [
        "Dynamic pressure, Mach number and drag",
        "dynamic pressure q (kPa)",
        "drag D (N)",
        "max D ",
        "Mach number",
        "time (s)",
        "metres",
        "slow",
        "max q ",
        "at max q",
    ] {
        assert!(svg.contains(text), "{text}");
    }
    // The note carries the core's refined maximum (the same as the flight summary's).
    let (_, summary) = run(&["flight", a.to_str().unwrap(), "--summary", "json"], "");
    let summary = summary_json(&summary);
    let q_kpa = summary["max_dynamic_pressure"]["dynamic_pressure_pa"].as_f64().unwrap() / 1000.0;
    assert!(
        svg.contains(&format!("max q {q_kpa:.1} kPa")) || svg.contains(&format!("max q {q_kpa:.2} kPa")),
        "{q_kpa}"
    );
    let us = stdout_of(&["plot", "flight", a.to_str().unwrap(), "--units", "us"], "");
    assert!(us.contains("dynamic pressure q (psf)") && us.contains(" psf at t = "));
    assert!(
        us.contains("Dynamic pressure and Mach number") && !us.contains("drag D"),
        "no drag without a vehicle"
    );
    // The same flight through --model and its shorthand: the same figure.
    let hot = |model: &[&str]| stdout_of(&[&["plot", "flight", a.to_str().unwrap()], model].concat(), "");
    assert_eq!(hot(&["--offset", "+10K"]), hot(&["--model", "offset=+10K"]));
    assert_ne!(hot(&["--offset", "+10K"]), hot(&[]));
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn plot_errors_exit_2_with_one_line() {
    fails(
        2,
        &["plot", "profile", "--model", "warm"],
        "",
        "--model warm: unknown model 'warm'; a model is one of: standard | offset=DT",
    );
    fails(
        2,
        &["plot", "profile", "--model", "offset=hot"],
        "",
        "--model offset=hot: offset: an offset DT: 'hot' is not a number",
    );
    fails(2, &["plot", "profile", "--model", "offset=-400"], "", "-400 K is below any day's offset");
    fails(
        2,
        &["plot", "profile", "--model", "sounding=/no/such.csv"],
        "",
        "cannot read sounding /no/such.csv",
    );
    fails(2, &["plot", "profile", "--model", "layers=/no/such.csv"], "", "cannot read layers /no/such.csv");
    fails(
        2,
        &["plot", "profile", "temperature", "pressure", "density", "gravity", "mean-free-path"],
        "",
        "5 quantities given; a profile plot holds 1 to 4",
    );
    fails(
        2,
        &["plot", "profile", "--from", "5000", "--to", "1000"],
        "",
        "--to 1000 m must be above --from 5000 m",
    );
    fails(2, &["plot", "profile", "--to", "NaN"], "", "--to NaN: 'NaN' is not a number");
    let sounding = concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples/data/vessaro_key_hot_humid.csv");
    fails(
        2,
        &["plot", "profile", "--model", &format!("sounding={sounding}"), "--from", "40000", "--to", "50000"],
        "",
        "covers 4 to 30000 m, outside --from 40000 to --to 50000 m",
    );
    fails(2, &["plot", "profile", "--label", "a", "--label", "b"], "", "2 labels for 1 models");
    fails(2, &["plot", "profile", "speed"], "", "invalid value 'speed'");
    fails(2, &["plot", "profile", "--width", "100"], "", "invalid value '100' for '--width <PX>'");
    fails(2, &["plot", "flight", "/no/such/flight.csv"], "", "cannot open /no/such/flight.csv");
    fails(
        2,
        &["plot", "flight", "-"],
        "0,0,0\n1,x,1\n",
        "stdin: line 2, column 2 (altitude_m): 'x' is not a number",
    );
    fails(2, &["plot", "flight", "-"], "# nothing\n", "stdin: no samples to plot");
    fails(2, &["plot", "flight", "-", "--area", "1"], "", "--area needs --cd or --cd-table");
    let output = aerostrata().args(["plot", "flight"]).output().unwrap();
    assert_eq!(output.status.code(), Some(2), "a flight file is required");
}

#[test]
fn us_units_choose_the_output_and_refuse_bare_numbers_as_input() {
    fails(
        2,
        &["eval", "--units", "us"],
        "0\n4000000\n",
        "stdin: line 2, column 1 (geometric_altitude_ft): geometric altitude 4000000 ft is outside the allowed \
         range -16404.2 to 3280840 ft",
    );
    fails(2, &["table", "--units", "us", "--step", "0"], "", "--step 0: 0 m is below any altitude step");
    fails(
        2,
        &["table", "--units", "us", "--from", "-20000"],
        "",
        "--from -20000: with --units us a bare number could be m or ft; write -20000ft or -20000m",
    );
    fails(
        2,
        &["table", "--units", "us", "--from", "-20000ft"],
        "",
        "--from -20000ft: -20000 ft is below any altitude (-16404.2 to 3280840 ft)",
    );
    fails(
        2,
        &["eval", "--units", "us"],
        "abc\n",
        "'abc' is neither a row of numbers nor a header naming geometric_altitude",
    );
    fails(
        2,
        &["flight", "-", "--units", "us"],
        "0,-17000,1\n",
        "stdin: line 1, column 2 (altitude_ft): geometric altitude -17000 ft is outside",
    );
    fails(
        2,
        &["flight", "-"],
        "time_s,alt,velocity_m_s\n",
        "stdin: line 1: the header needs a column altitude",
    );
    fails(
        2,
        &["flight", "-"],
        "time_s,altitude_m,velocity_m_s\n1,2,3,4\n",
        "stdin: line 2: 4 cells, but the header has 3 columns",
    );
    fails(
        2,
        &["altitude", "--pressure", "100", "--units", "us"],
        "",
        "--pressure 100: with --units us a bare number could be Pa or inHg",
    );
    fails(
        2,
        &["altitude", "--pressure", "100inHg", "--units", "us"],
        "",
        "--pressure 100inHg: 100 inHg is above any static pressure (0 to 59.06 inHg)",
    );
    fails(2, &["eval", "--units", "metric"], "", "invalid value 'metric'");
    fails(
        2,
        &["airspeed", "--mach", "1", "--altitude", "-20000ft", "--units", "us"],
        "",
        "--altitude -20000ft: -20000 ft is below any altitude",
    );
    fails(
        2,
        &["eval", "--units", "us", "--offset", "27"],
        "0\n",
        "--offset 27: with --units us a bare number could be K or degF; write 27degF or 27K",
    );
    fails(
        2,
        &["eval", "--units", "us", "--model", "offset=27"],
        "0\n",
        "--model offset=27: with --units us the bare number 27",
    );
    fails(
        2,
        &["plot", "profile", "--units", "us", "--model", "isothermal=250,p0=1000hPa"],
        "",
        "--model isothermal=250,p0=1000hPa: with --units us the bare number 250",
    );
    // 0 is 0 in either unit; a value with its unit is read in it whatever --units says.
    let zero =
        stdout_of(&["table", "--units", "us", "--from", "0", "--to", "10000ft", "--format", "csv"], "");
    assert_eq!(values(&zero, "geometric_altitude_ft"), vec![0.0, 5000.0, 10000.0]);
    let metres = stdout_of(
        &["table", "--units", "us", "--from", "0", "--to", "3048m", "--step", "1524m", "--format", "csv"],
        "",
    );
    assert_eq!(values(&metres, "geometric_altitude_ft"), vec![0.0, 5000.0, 10000.0]);
}

#[test]
fn a_progress_line_when_asked_and_none_otherwise() {
    let dir = scratch("progress");
    let file = dir.join("heights.txt");
    std::fs::write(&file, "0\n1000\n".repeat(5000)).unwrap();
    let path = file.to_str().unwrap();
    let (quiet_out, quiet_err) = run(&["eval", path], "");
    assert!(quiet_err.is_empty(), "not a terminal: no progress line");
    let (out, err) = run(&["eval", path, "--progress", "always"], "");
    assert_eq!(out, quiet_out, "the progress line never touches the output");
    assert!(err.contains("aerostrata: ") && err.contains("% of ") && err.contains("MiB read"), "{err:?}");
    assert!(err.ends_with("\r\u{1b}[K"), "the line is erased at the end: {err:?}");
    let (_, err) = run(&["flight", "-", "--progress", "always", "--summary", "text"], &flight_log(false));
    assert!(err.contains("MiB read") && err.contains("\r\u{1b}[Ksamples: 200"), "{err:?}");
    std::fs::remove_dir_all(&dir).unwrap();
}
