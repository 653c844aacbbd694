//! `aerostrata flight` and the loads an engineer signs off on: files that give the
//! velocity's direction, winds, q-alpha, limit exceedances, the resolution of the maximum
//! q, and the envelope over several models.

mod common;

use common::{column, each_fails_with, run, scratch, values};

/// An invented climb, every 0.5 s: a ground velocity by components, in SI.
fn climb_si() -> String {
    let mut text = String::from("time_s,altitude_m,velocity_east_m_s,velocity_north_m_s,velocity_up_m_s\n");
    for i in 0..40 {
        let t = f64::from(i) * 0.5;
        let up = 20.0 * t;
        let east = 3.0 * t;
        let z = 10.0 * t * t + 50.0;
        text += &format!("{t},{z},{east},{},{up}\n", -0.5 * t);
    }
    text
}

/// The same climb in feet and feet per second (the international foot, 0.3048 m exactly).
fn climb_ft() -> String {
    let ft = 0.3048;
    let mut lines = climb_si().lines().map(str::to_owned).collect::<Vec<_>>().into_iter();
    lines.next();
    let mut text = String::from(
        "time (s),altitude (ft),velocity_east (ft/s),velocity_north (ft/s),velocity_up (ft/s)\n",
    );
    for line in lines {
        let v: Vec<f64> = line.split(',').map(|c| c.parse().unwrap()).collect();
        text += &format!("{},{},{},{},{}\n", v[0], v[1] / ft, v[2] / ft, v[3] / ft, v[4] / ft);
    }
    text
}

fn close(a: f64, b: f64, relative: f64) -> bool {
    (a - b).abs() <= relative * a.abs().max(b.abs()).max(1e-300)
}

#[test]
fn a_vector_flight_in_feet_and_in_metres_gives_the_same_numbers() {
    let (si, _) = run(&["flight", "-", "--summary", "none"], &climb_si());
    let (ft, _) = run(&["flight", "-", "--summary", "none"], &climb_ft());
    let header = si.lines().next().unwrap();
    assert_eq!(header, ft.lines().next().unwrap());
    for name in ["velocity_east_m_s", "airspeed_m_s", "alpha_deg", "q_alpha_Pa_deg", "recovery_temperature_K"]
    {
        assert!(header.split(',').any(|c| c == name), "{header}");
    }
    assert!(!header.contains("wind_east"), "no wind columns without winds: {header}");
    for name in header.split(',') {
        for (a, b) in column(&si, name).into_iter().zip(column(&ft, name)) {
            match (a, b) {
                // Angles of zero come out as a few 1e-15 deg after the foot's rounding.
                (Some(a), Some(b)) => {
                    assert!(close(a, b, 1e-12) || (a - b).abs() < 1e-9, "{name}: {a} vs {b}")
                }
                (a, b) => assert_eq!(a.is_some(), b.is_some(), "{name}"),
            }
        }
    }
    // Without winds and with the axis along the velocity, the angle of attack is zero (and
    // undefined at rest, the first sample).
    let alpha = column(&si, "alpha_deg");
    assert_eq!(alpha[0], None);
    assert!(alpha[1..].iter().all(|a| a.is_some_and(|a| a.abs() < 1e-9)), "{alpha:?}");
}

#[test]
fn q_alpha_through_a_crosswind_matches_a_hand_computation() {
    let dir = scratch("crosswind");
    let winds = dir.join("winds.csv");
    // A steady 20 kt wind from the west (270 deg) at every altitude: it blows toward the
    // east at 20 x 1852/3600 m/s (the knot is 1852 m per hour, by definition).
    std::fs::write(&winds, "geometric_altitude_m,wind_speed_kt,wind_direction_deg\n0,20,270\n5000,20,270\n")
        .unwrap();
    let w: f64 = 20.0 * 1852.0 / 3600.0;
    // Straight up at 150 m/s with the axis vertical.
    let flight = "time_s,altitude_m,velocity_east_m_s,velocity_north_m_s,velocity_up_m_s\n\
                  0,1000,0,0,150\n1,1150,0,0,150\n2,1300,0,0,150\n";
    let (csv, summary) = run(&["flight", "-", "--winds", winds.to_str().unwrap()], flight);
    // The air-relative velocity is the ground velocity less the wind: (-w, 0, 150). Its
    // angle to the vertical axis is atan(w / 150); its speed sqrt(150^2 + w^2), so
    // q = rho (150^2 + w^2) / 2 and q-alpha = q x atan(w / 150) in degrees.
    let alpha = (w / 150.0).atan().to_degrees();
    let airspeed = (150.0_f64 * 150.0 + w * w).sqrt();
    for (i, rho) in values(&csv, "density_kg_m3").into_iter().enumerate() {
        let q = 0.5 * rho * airspeed * airspeed;
        assert!(close(values(&csv, "alpha_deg")[i], alpha, 1e-12), "alpha");
        assert!(close(values(&csv, "airspeed_m_s")[i], airspeed, 1e-12), "airspeed");
        assert!(close(values(&csv, "dynamic_pressure_Pa")[i], q, 1e-12), "q");
        assert!(close(values(&csv, "q_alpha_Pa_deg")[i], q * alpha, 1e-12), "q-alpha");
        assert!(close(values(&csv, "wind_east_m_s")[i], w, 1e-12), "wind east");
    }
    assert!(summary.contains("max q alpha: "), "{summary}");
    assert!(summary.contains("wind held beyond the profile's ends at 0 sample(s)"), "{summary}");
}

#[test]
fn winds_need_the_velocitys_direction() {
    let dir = scratch("winds-refused");
    let winds = dir.join("w.csv");
    std::fs::write(&winds, "geometric_altitude_m,wind_east_m_s,wind_north_m_s\n0,5,0\n").unwrap();
    let w = winds.to_str().unwrap();
    let bad = dir.join("bad.csv");
    std::fs::write(&bad, "geometric_altitude_m,wind_speed_kt,wind_direction_deg\n0,fast,270\n").unwrap();
    let vector = "time_s,altitude_m,velocity_east_m_s,velocity_north_m_s,velocity_up_m_s\n0,0,0,0,1\n";
    each_fails_with(&[
        (&["flight", "-", "--winds", bad.to_str().unwrap()], vector, "line 2"),
        (
            &["flight", "-", "--winds", w],
            "0,0,10\n1,10,20\n",
            "give velocity_east, velocity_north and velocity_up",
        ),
        (&["flight", "-", "--q-alpha-limit", "3000psf_deg"], "0,0,10\n", "--q-alpha-limit"),
        (&["flight", "-", "--q-limit", "35"], "0,0,10\n", "--q-limit 35"),
        (&["flight", "-", "--plateau-fraction", "60%"], "0,0,10\n", "--plateau-fraction 60%"),
        (
            &["flight", "-"],
            "time_s,altitude_m,velocity_east_m_s,velocity_up_m_s\n0,0,1,1\n",
            "the velocity's components need all three columns",
        ),
    ]);
}

/// q at each sample of a flight at sea level with speeds `speeds`, one per second, and
/// the summary as JSON.
fn sea_level(speeds: &[f64], extra: &[&str]) -> (Vec<f64>, serde_json::Value) {
    let mut flight = String::from("time_s,altitude_m,velocity_m_s\n");
    for (i, v) in speeds.iter().enumerate() {
        flight += &format!("{i},0,{v}\n");
    }
    let mut args = vec!["flight", "-", "--summary", "json"];
    args.extend_from_slice(extra);
    let (csv, stderr) = run(&args, &flight);
    let q = if extra.contains(&"us") { "dynamic_pressure_psf" } else { "dynamic_pressure_Pa" };
    (values(&csv, q), serde_json::from_str(&stderr).unwrap())
}

#[test]
fn an_exceedance_interval_matches_a_hand_made_series() {
    let (q, summary) = sea_level(&[100.0, 200.0, 300.0, 250.0, 150.0, 260.0], &["--q-limit", "30kPa"]);
    // Linear interpolation of q between the samples either side of each crossing.
    let cross = |i: usize| i as f64 + (30_000.0 - q[i]) / (q[i + 1] - q[i]);
    let found = summary["q_limit_exceedances"].as_array().unwrap();
    assert_eq!(found.len(), 2, "{summary}");
    let first = &found[0];
    assert!(close(first["start_time_s"].as_f64().unwrap(), cross(1), 1e-12));
    assert!(close(first["end_time_s"].as_f64().unwrap(), cross(3), 1e-12));
    assert_eq!(first["peak_pa"].as_f64().unwrap(), q[2]);
    assert_eq!((first["open_start"].as_bool(), first["open_end"].as_bool()), (Some(false), Some(false)));
    // The series ends above the limit: the second interval is open at its end.
    let second = &found[1];
    assert!(close(second["start_time_s"].as_f64().unwrap(), cross(4), 1e-12));
    assert_eq!(second["end_time_s"].as_f64(), Some(5.0));
    assert_eq!(second["open_end"].as_bool(), Some(true));
    assert_eq!(summary["q_limit"]["dynamic_pressure_Pa"].as_f64(), Some(30_000.0));
    // In US units the limit is read with its unit and written in psf.
    let (_, us) = sea_level(&[100.0, 300.0, 100.0], &["--q-limit", "600psf", "--units", "us"]);
    let limit = us["q_limit"]["dynamic_pressure_psf"].as_f64().unwrap();
    assert!(us["q_limit_exceedances"][0]["peak_psf"].as_f64().is_some(), "{us}");
    assert!(close(limit, 600.0, 1e-12), "{us}");
}

#[test]
fn a_coarse_cornered_flight_is_advised_to_be_resampled() {
    // Speeds rising and falling linearly about a corner at 5.3 s, sampled every second.
    let coarse: Vec<f64> = (0..=10).map(|i| 300.0 - 40.0 * (f64::from(i) - 5.3).abs()).collect();
    let mut flight = String::from("time_s,altitude_m,velocity_m_s\n");
    for (i, v) in coarse.iter().enumerate() {
        flight += &format!("{i},0,{v}\n");
    }
    let (_, text) = run(&["flight", "-"], &flight);
    assert!(text.contains(": not resolved\n"), "{text}");
    assert!(text.contains("  resample at "), "{text}");
    // A smooth peak sampled finely is resolved, with no advice.
    let mut smooth = String::from("time_s,altitude_m,velocity_m_s\n");
    for i in 0..=400 {
        let t = f64::from(i) * 0.025;
        smooth += &format!("{t},0,{}\n", 300.0 - 4.0 * (t - 5.3) * (t - 5.3));
    }
    let (_, text) = run(&["flight", "-"], &smooth);
    assert!(text.contains(": resolved\n") && !text.contains("resample"), "{text}");
    assert!(text.trim_end().ends_with("licensed engineering practice govern."), "{text}");
}

/// The max q of each model's summary and the model the worst-case line names.
fn envelope(models: &[&str]) -> (Vec<(String, f64)>, String) {
    let data = concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples/data/sk1_full_thrust.csv");
    let mut args = vec!["flight", data, "--summary", "json"];
    for m in models {
        args.extend(["--model", m]);
    }
    let (csv, stderr) = run(&args, "");
    assert!(csv.starts_with("model,time_s,"), "a model column with several models");
    let summary: serde_json::Value = serde_json::from_str(&stderr).unwrap();
    let each: Vec<(String, f64)> = summary["models"]
        .as_array()
        .unwrap()
        .iter()
        .map(|m| {
            let q = m["max_dynamic_pressure"]["dynamic_pressure_pa"].as_f64().unwrap();
            (m["model"].as_str().unwrap().to_owned(), q)
        })
        .collect();
    let worst = summary["worst_case"].as_array().unwrap();
    let q = worst.iter().find(|w| w["quantity"] == "dynamic_pressure").unwrap();
    (each, q["model"].as_str().unwrap().to_owned())
}

#[test]
fn the_envelope_names_the_model_of_the_largest_maximum_q() {
    // A ground-launched flight at fixed geometric altitudes. A hydrostatic hot day has
    // more air above every altitude than the standard and a cold day less; the offset
    // convention keeps the standard's pressure, so there a cold day is the denser.
    for (models, expected) in [
        (["standard", "hydrostatic-offset=+15K", "hydrostatic-offset=-15K"], "hydrostatic standard +15 K"),
        (["standard", "offset=+15K", "offset=-15K"], "standard -15 K"),
    ] {
        let (each, named) = envelope(&models);
        let largest = each.iter().max_by(|a, b| a.1.total_cmp(&b.1)).unwrap();
        assert_eq!(named, largest.0, "{each:?}");
        assert_eq!(named, expected, "{each:?}");
    }
}

#[test]
fn a_path_file_reads_as_its_components() {
    // 200 m/s climbing at 30 deg, heading 60 deg (east-north-east): east = V cos30 sin60,
    // north = V cos30 cos60, up = V sin30.
    let path =
        "time_s,altitude_m,speed_m_s,flight_path_angle_deg,heading_deg\n0,100,200,30,60\n1,200,200,30,60\n";
    let (c30, s30) = (30f64.to_radians().cos(), 30f64.to_radians().sin());
    let (s60, c60) = (60f64.to_radians().sin(), 60f64.to_radians().cos());
    let components = format!(
        "time_s,altitude_m,velocity_east_m_s,velocity_north_m_s,velocity_up_m_s\n0,100,{e},{n},{u}\n1,200,{e},{n},{u}\n",
        e = 200.0 * c30 * s60,
        n = 200.0 * c30 * c60,
        u = 200.0 * s30
    );
    let (a, _) = run(&["flight", "-", "--summary", "none"], path);
    let (b, _) = run(&["flight", "-", "--summary", "none"], &components);
    for name in ["velocity_east_m_s", "velocity_north_m_s", "velocity_up_m_s", "dynamic_pressure_Pa"] {
        for (x, y) in values(&a, name).into_iter().zip(values(&b, name)) {
            assert!(close(x, y, 1e-13), "{name}: {x} vs {y}");
        }
    }
}

#[test]
fn a_soundings_wind_columns_blow_on_a_flight_with_direction() {
    let dir = scratch("sounding-winds");
    let sounding = dir.join("windy.csv");
    // The 1976 standard's temperatures and pressures at 0, 1 and 2 km geometric (U.S.
    // Standard Atmosphere 1976, its tables; from memory), with
    // an invented east wind growing with height.
    std::fs::write(
        &sounding,
        "geometric_altitude_m,temperature_K,pressure_Pa,wind_east_m_s,wind_north_m_s\n\
         0,288.15,101325,2,0\n1000,281.651,89876.3,6,0\n2000,275.154,79501.4,10,0\n",
    )
    .unwrap();
    let model = format!("sounding={}", sounding.display());
    let flight = "time_s,altitude_m,velocity_east_m_s,velocity_north_m_s,velocity_up_m_s\n0,500,0,0,100\n1,1500,0,0,100\n";
    let (csv, text) = run(&["flight", "-", "--model", &model], flight);
    // Linear in altitude: 4 m/s at 500 m, 8 m/s at 1500 m.
    assert_eq!(values(&csv, "wind_east_m_s"), [4.0, 8.0]);
    assert!(text.contains("wind held beyond the profile's ends at 0 sample(s)"), "{text}");
    // --winds replaces them.
    let winds = dir.join("calm_above.csv");
    std::fs::write(&winds, "geometric_altitude_m,wind_east_m_s,wind_north_m_s\n1000,1,0\n").unwrap();
    let (csv, text) = run(&["flight", "-", "--model", &model, "--winds", winds.to_str().unwrap()], flight);
    assert_eq!(values(&csv, "wind_east_m_s"), [1.0, 1.0]);
    assert!(text.contains("wind held beyond the profile's ends at 2 sample(s)"), "{text}");
    // A file of speeds without direction: the winds are left out, with a warning.
    let (csv, text) = run(&["flight", "-", "--model", &model], "0,500,100\n1,1500,100\n");
    assert!(!csv.contains("wind_east"));
    assert!(
        text.starts_with("aerostrata: sounding ") && text.contains("wind columns are not used"),
        "{text}"
    );
}

#[test]
fn several_models_only_where_they_are_taken() {
    each_fails_with(&[(
        &["table", "--model", "standard", "--model", "offset=+15K"],
        "",
        "--model is given 2 times; only flight and plot profile take several models",
    )]);
}
