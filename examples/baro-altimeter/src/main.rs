//! `cargo run -p baro-altimeter --release`: makes the invented barometer log, runs the
//! altimeter over it, prints what it detected against the truth, and writes the log, the
//! processed samples (CSV) and a plot (SVG) under `target/examples/baro-altimeter/`. With
//! `--docs` it also copies the plot to `docs/images/`.

use std::fmt::Write as _;
use std::path::PathBuf;

use aerostrata_cli::plot::{Figure, Layout, Marker, Panel, Series};
use baro_altimeter::{barometer_log, process, true_flight, Noise, HOT_DESERT_PAD, NOISE_PA, SAMPLE_S};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let root = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../..");
    let target = std::env::var_os("CARGO_TARGET_DIR").map_or_else(|| root.join("target"), |d| root.join(d));
    let out = target.join("examples").join("baro-altimeter");
    std::fs::create_dir_all(&out)?;

    let site = HOT_DESERT_PAD;
    let truth = true_flight(site);
    let log = barometer_log(site, &truth, &mut Noise::new(19_761_976));
    let (rows, detection) = process(&log, baro_altimeter::TUNING)?;
    let detection = detection.ok_or("the altimeter never called apogee")?;
    let true_height = truth.apogee_altitude_m - site.pad_altitude_m;

    let mut log_csv = String::from("time_s,pressure_Pa\n");
    for r in &log {
        writeln!(log_csv, "{},{}", r.time_s, r.pressure_pa)?;
    }
    std::fs::write(out.join("barometer_log.csv"), log_csv)?;
    let mut csv = String::from("time_s,pressure_Pa,height_above_pad_m,filtered_height_m,vertical_speed_m_s,true_height_m,true_vertical_speed_m_s\n");
    for (r, t) in rows.iter().zip(&truth.points) {
        writeln!(
            csv,
            "{},{},{},{},{},{},{}",
            r.time_s,
            r.pressure_pa,
            r.height_m,
            r.filtered_height_m,
            r.vertical_speed_m_s,
            t.altitude_m - site.pad_altitude_m,
            t.velocity_m_s
        )?;
    }
    std::fs::write(out.join("altimeter.csv"), csv)?;

    let mut report = String::new();
    writeln!(
        report,
        "Invented log: pad at {} m, ISA {:+} K, {} Hz, noise {NOISE_PA} Pa",
        site.pad_altitude_m,
        site.offset_k,
        1.0 / SAMPLE_S
    )?;
    writeln!(report, "pad pressure (mean before ignition): {:.2} Pa", detection.pad_pressure_pa)?;
    writeln!(report, "launch detected at t = {:.2} s", detection.launch_time_s)?;
    writeln!(
        report,
        "apogee: detected at t = {:.2} s, true at t = {:.3} s (late by {:.3} s)",
        detection.apogee_time_s,
        truth.apogee_time_s,
        detection.apogee_time_s - truth.apogee_time_s
    )?;
    writeln!(
        report,
        "apogee height above the pad: barometric {:.1} m, true {:.1} m ({:+.2} %: geopotential against geometric metres)",
        detection.apogee_height_m,
        true_height,
        100.0 * (detection.apogee_height_m / true_height - 1.0)
    )?;
    print!("{report}");
    std::fs::write(out.join("summary.txt"), &report)?;

    let figure = figure(&rows, &truth, site.pad_altitude_m, &detection, true_height);
    let svg = figure.to_svg()?;
    std::fs::write(out.join("baro_altimeter.svg"), &svg)?;
    if std::env::args().any(|a| a == "--docs") {
        std::fs::write(root.join("docs/images/baro_altimeter.svg"), &svg)?;
    }
    eprintln!("wrote {}", out.display());
    Ok(())
}

fn figure(
    rows: &[baro_altimeter::Processed],
    truth: &baro_altimeter::TrueFlight,
    pad_m: f64,
    detection: &baro_altimeter::Detection,
    true_height: f64,
) -> Figure {
    let height = Panel {
        x_label: "time since ignition (s)".to_owned(),
        y_label: "height above the pad (m)".to_owned(),
        series: vec![
            altimeter_line("barometric, raw", 5, rows.iter().map(|r| (r.time_s, r.height_m))),
            altimeter_line(
                "barometric, filtered",
                0,
                rows.iter().step_by(2).map(|r| (r.time_s, r.filtered_height_m)),
            ),
            true_line(
                "true (geometric)",
                truth.points.iter().step_by(5).map(|p| (p.time_s, p.altitude_m - pad_m)),
            ),
        ],
        markers: vec![
            Marker {
                at: (truth.apogee_time_s, true_height),
                text: format!("true apogee {true_height:.0} m at {:.2} s", truth.apogee_time_s),
                color: 1,
            },
            Marker {
                at: (detection.apogee_time_s, detection.apogee_height_m),
                text: format!(
                    "detected {:.0} m at {:.2} s",
                    detection.apogee_height_m, detection.apogee_time_s
                ),
                color: 0,
            },
        ],
        ..Panel::default()
    };
    let speed = Panel {
        x_label: "time since ignition (s)".to_owned(),
        y_label: "vertical speed (m/s)".to_owned(),
        series: vec![
            altimeter_line("filtered", 0, rows.iter().map(|r| (r.time_s, r.vertical_speed_m_s))),
            true_line("true", truth.points.iter().step_by(5).map(|p| (p.time_s, p.velocity_m_s))),
        ],
        markers: vec![Marker {
            at: (detection.apogee_time_s, 0.0),
            text: format!("apogee called at {:.2} s", detection.apogee_time_s),
            color: 0,
        }],
        ..Panel::default()
    };
    Figure {
        title: "Barometric altimeter on an invented log (ISA + 8 K, 50 Hz, 3 Pa noise)".to_owned(),
        layout: Layout::Stacked,
        panels: vec![height, speed],
        size: (900, 760),
    }
}

/// A solid line of what the altimeter computed, in palette colour `color`.
fn altimeter_line(label: &str, color: usize, points: impl Iterator<Item = (f64, f64)>) -> Series {
    Series { label: label.to_owned(), points: points.collect(), dashed: false, color }
}

/// A dashed line of the true flight, in the truth's colour (that of its apogee marker).
fn true_line(label: &str, points: impl Iterator<Item = (f64, f64)>) -> Series {
    Series { label: label.to_owned(), points: points.collect(), dashed: true, color: 1 }
}
