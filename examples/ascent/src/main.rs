//! `cargo run -p ascent --release`: flies the invented Skelvik SK-1 sounding rocket twice
//! (full thrust, and throttled to hold dynamic pressure under a limit), prints the figures of
//! merit and a step-halving convergence check, and writes CSV and SVG under
//! `target/examples/ascent/`. With `--docs` it also copies the figures to `docs/images/`.

use std::fmt::Write as _;
use std::path::PathBuf;

use aerostrata_cli::plot::{flight_figure, Figure, FlightTrace, Layout, Marker, Panel, Series};
use aerostrata_cli::units::UnitSystem;
use ascent::{fly, Flight, Results, Throttle, PAD_ALTITUDE_M, Q_LIMIT_PA, STEP_S};

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let root = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../..");
    let target = std::env::var_os("CARGO_TARGET_DIR").map_or_else(|| root.join("target"), |d| root.join(d));
    let out = target.join("examples").join("ascent");
    std::fs::create_dir_all(&out)?;

    let throttled = Throttle::HoldQ { limit_pa: Q_LIMIT_PA };
    let flights = [("full thrust", Throttle::Full, "full_thrust"), ("throttled", throttled, "throttled")];
    let mut report = String::new();
    writeln!(
        report,
        "Skelvik SK-1 (invented) from a pad at {PAD_ALTITUDE_M} m, US 1976 standard atmosphere, RK4 step {STEP_S} s"
    )?;
    writeln!(report, "q limit for the throttled flight: {:.1} kPa\n", Q_LIMIT_PA / 1e3)?;
    writeln!(report, "| flight | max q (kPa) | at t (s) | at altitude (m) | Mach at max q | burnout t (s) | burnout altitude (m) | burnout velocity (m/s) | apogee t (s) | apogee (m) |")?;
    writeln!(report, "| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |")?;
    let mut flown = Vec::new();
    for (label, law, file) in flights {
        let flight = fly(law, STEP_S);
        let r = flight.results();
        writeln!(
            report,
            "| {label} | {:.2} | {:.3} | {:.1} | {:.3} | {:.3} | {:.1} | {:.2} | {:.2} | {:.1} |",
            r.max_q_pa / 1e3,
            r.max_q_time_s,
            r.max_q_altitude_m,
            r.max_q_mach,
            r.burnout.time_s,
            r.burnout.altitude_m,
            r.burnout.velocity_m_s,
            r.apogee.time_s,
            r.apogee.altitude_m
        )?;
        std::fs::write(out.join(format!("{file}.csv")), trajectory_csv(&flight))?;
        flown.push((label, flight));
    }
    writeln!(
        report,
        "\nConvergence: each flight again at twice and half the step (differences from the {STEP_S} s run)\n"
    )?;
    writeln!(report, "| flight | step (s) | max q (Pa) | burnout velocity (m/s) | apogee (m) |")?;
    writeln!(report, "| --- | ---: | ---: | ---: | ---: |")?;
    for ((label, law, _), (_, base)) in flights.iter().zip(&flown) {
        let base = base.results();
        for step in [2.0 * STEP_S, STEP_S / 2.0] {
            let r = fly(*law, step).results();
            writeln!(
                report,
                "| {label} | {step} | {:+.3e} | {:+.3e} | {:+.3e} |",
                r.max_q_pa - base.max_q_pa,
                r.burnout.velocity_m_s - base.burnout.velocity_m_s,
                r.apogee.altitude_m - base.apogee.altitude_m
            )?;
        }
    }
    print!("{report}");
    std::fs::write(out.join("summary.md"), &report)?;

    let traces: Vec<FlightTrace> = flown.iter().map(|(label, f)| trace(label, f)).collect();
    let mut q_mach =
        flight_figure("Skelvik SK-1 ascent: dynamic pressure and Mach number", &traces, UnitSystem::Si);
    q_mach.panels[0].series.push(Series {
        label: format!("q limit {:.0} kPa", Q_LIMIT_PA / 1e3),
        points: vec![(0.0, Q_LIMIT_PA / 1e3), (flown[1].1.results().apogee.time_s, Q_LIMIT_PA / 1e3)],
        dashed: true,
        color: 5,
    });
    let figures = [("ascent_q_mach.svg", q_mach), ("ascent_trajectory.svg", trajectory_figure(&flown))];
    for (name, figure) in &figures {
        let svg = figure.to_svg()?;
        std::fs::write(out.join(name), &svg)?;
        if std::env::args().any(|a| a == "--docs") {
            std::fs::write(root.join("docs/images").join(name), &svg)?;
        }
    }
    if std::env::args().any(|a| a == "--docs") {
        // Small copies of the two flights (every 0.5 s) for docs/cli.md's examples: the
        // columns `aerostrata flight` reads (the throttle is in the full CSV under target/).
        for (label, flight) in &flown {
            let mut text = format!(
                "# The invented Skelvik SK-1 demonstrator, {label}, every 0.5 s (examples/ascent;\n\
                 # written by `cargo run -p ascent --release -- --docs`). Invented data, for\n\
                 # demonstrations only.\n\
                 time_s,altitude_m,velocity_m_s\n"
            );
            for p in flight.points.iter().step_by((0.5 / STEP_S).round() as usize) {
                writeln!(text, "{},{},{}", p.time_s, p.state.altitude_m, p.state.velocity_m_s)?;
            }
            let name = format!("sk1_{}.csv", label.replace(' ', "_"));
            std::fs::write(root.join("examples/data").join(name), text)?;
        }
    }
    eprintln!("wrote {}", out.display());
    Ok(())
}

fn trajectory_csv(flight: &Flight) -> String {
    let mut text = String::from("time_s,altitude_m,velocity_m_s,mass_kg,throttle,thrust_N,density_kg_m3,mach,dynamic_pressure_Pa,drag_N\n");
    for p in &flight.points {
        let c = &p.conditions;
        let mach = c.mach.map(|m| m.to_string()).unwrap_or_default();
        let _ = writeln!(
            text,
            "{},{},{},{},{},{},{},{mach},{},{}",
            p.time_s,
            p.state.altitude_m,
            p.state.velocity_m_s,
            p.state.mass_kg,
            c.throttle,
            c.thrust_n,
            c.density_kg_m3,
            c.dynamic_pressure_pa,
            c.drag_n
        );
    }
    text
}

fn trace(label: &str, flight: &Flight) -> FlightTrace {
    let mut trace = FlightTrace::new(label);
    for p in &flight.points {
        trace.offer(p.time_s, p.conditions.dynamic_pressure_pa, p.conditions.mach);
    }
    trace.summary = Some(flight.summary);
    trace
}

/// Altitude, velocity and throttle against time, burnout and apogee marked.
fn trajectory_figure(flown: &[(&str, Flight)]) -> Figure {
    let panel = |y: &str| Panel {
        x_label: "time (s)".to_owned(),
        y_label: y.to_owned(),
        y_from_zero: true,
        ..Panel::default()
    };
    let mut altitude = panel("geometric altitude (km)");
    let mut velocity = panel("vertical velocity (m/s)");
    let mut throttle = panel("throttle (of full thrust)");
    for (index, (label, flight)) in flown.iter().enumerate() {
        let r: Results = flight.results();
        let series = |f: &dyn Fn(&ascent::Point) -> f64| Series {
            label: (*label).to_owned(),
            points: flight.points.iter().step_by(20).map(|p| (p.time_s, f(p))).collect(),
            dashed: false,
            color: index,
        };
        altitude.series.push(series(&|p| p.state.altitude_m / 1e3));
        velocity.series.push(series(&|p| p.state.velocity_m_s));
        let burning: Vec<(f64, f64)> = flight
            .points
            .iter()
            .take_while(|p| p.time_s <= r.burnout.time_s)
            .step_by(5)
            .map(|p| (p.time_s, p.conditions.throttle))
            .collect();
        throttle.series.push(Series {
            label: (*label).to_owned(),
            points: burning,
            dashed: false,
            color: index,
        });
        altitude.markers.push(Marker {
            at: (r.apogee.time_s, r.apogee.altitude_m / 1e3),
            text: format!("apogee {:.2} km", r.apogee.altitude_m / 1e3),
            color: index,
        });
        velocity.markers.push(Marker {
            at: (r.burnout.time_s, r.burnout.velocity_m_s),
            text: format!("burnout {:.0} m/s", r.burnout.velocity_m_s),
            color: index,
        });
    }
    Figure {
        title: "Skelvik SK-1 ascent: altitude, velocity and throttle".to_owned(),
        layout: Layout::Stacked,
        panels: vec![altitude, velocity, throttle],
        size: (900, 900),
    }
}
