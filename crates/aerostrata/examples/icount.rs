//! The instruction-count workload of `cargo xtask icount`: the work of the criterion
//! benchmarks (the standard below and above 86 km, density alone, a humid 200-row
//! sounding, a flight scan with and without a vehicle), each run once so that
//! `valgrind --tool=callgrind` counts its instructions; instructions, unlike wall-clock
//! time on a shared machine, repeat to the last digit. `--against REV` builds this file
//! on REV's core, so it uses only interfaces the core has had since the winds came in
//! (commit 256c43d): compare against that revision or a later one.
//! Usage: `icount CASE`, CASE one of state, density, upper, sounding, flight,
//! flight_vehicle, flight_winds.

use aerostrata::flight::{FlightScan, Sample, VectorSample, Vehicle};
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::{
    Altitude, AltitudeKind, Atmosphere, DragCurve, Interpolation, SoundingRow, Tabulated, US1976,
};
use std::hint::black_box;

struct XorShift64(u64);
impl XorShift64 {
    fn next_f64(&mut self) -> f64 {
        self.0 ^= self.0 << 13;
        self.0 ^= self.0 >> 7;
        self.0 ^= self.0 << 17;
        (self.0 >> 11) as f64 / (1u64 << 53) as f64
    }
}

fn altitudes(lo: f64, hi: f64) -> Vec<Altitude> {
    let mut rng = XorShift64(0x2545_f491_4f6c_dd1d);
    (0..1024).map(|_| Altitude::geometric_m(lo + (hi - lo) * rng.next_f64()).unwrap()).collect()
}

fn main() {
    let case = std::env::args().nth(1).unwrap_or_default();
    let reps = 200;
    match case.as_str() {
        "state" => {
            let a = altitudes(0.0, 86_000.0);
            for _ in 0..reps {
                for &h in &a {
                    black_box(US1976.state(black_box(h)).unwrap());
                }
            }
        }
        "density" => {
            let a = altitudes(0.0, 86_000.0);
            for _ in 0..reps {
                for &h in &a {
                    black_box(US1976.density_kg_m3(black_box(h)).unwrap());
                }
            }
        }
        "upper" => {
            let a = altitudes(86_000.0, 1_000_000.0);
            for _ in 0..reps {
                for &h in &a {
                    black_box(US1976.state(black_box(h)).unwrap());
                }
            }
        }
        "sounding" => {
            let rows: Vec<SoundingRow> = (0..200)
                .map(|i| {
                    let z = i as f64 * 100.0;
                    let t = if z < 16_500.0 { 306.5 - 6.6e-3 * z } else { 197.6 + 2.0e-3 * (z - 16_500.0) };
                    let row = SoundingRow::new(z, t);
                    let row = if i == 0 { row.with_pressure_pa(101_000.0) } else { row };
                    if z < 10_000.0 {
                        row.with_dew_point_k(t - 6.0 - 1.4e-3 * z)
                    } else {
                        row
                    }
                })
                .collect();
            let table = Tabulated::from_rows_vec(AltitudeKind::Geometric, &rows).unwrap();
            let a = altitudes(0.0, 19_900.0);
            for _ in 0..reps {
                for &h in &a {
                    black_box(table.state(black_box(h)).unwrap());
                }
            }
        }
        "flight" | "flight_vehicle" => {
            let mach = [0.0, 0.6, 0.9, 1.05, 1.3, 2.0, 4.0];
            let cd = [0.42, 0.40, 0.48, 0.72, 0.66, 0.52, 0.38];
            let curve = DragCurve::table(&mach, &cd, Interpolation::MonotoneCubic).unwrap();
            let vehicle = (case == "flight_vehicle").then(|| Vehicle::new(curve, 0.02).unwrap());
            let mut scan = FlightScan::new(US1976, vehicle);
            for i in 0..200_000 {
                let t = i as f64 * 1e-3;
                let (z, v) =
                    if t < 60.0 { (5.0 * t * t, 10.0 * t) } else { (18_000.0 + 600.0 * (t - 60.0), 600.0) };
                black_box(scan.push(Sample { time_s: t, altitude_m: z, velocity_m_s: v }).unwrap());
            }
            black_box(scan.summary());
        }
        "flight_winds" => {
            // The flight above as ground-velocity components with an eastward drift, through
            // a 41-level westerly (as benches/flight.rs).
            let levels: Vec<WindLevel> = (0..=40)
                .map(|km| {
                    WindLevel::from_speed_direction(f64::from(km) * 1000.0, 5.0 + f64::from(km), 270.0)
                        .unwrap()
                })
                .collect();
            let winds = WindProfile::new(levels).unwrap();
            let mut scan = FlightScan::new(US1976, None).with_winds(&winds);
            for i in 0..200_000 {
                let t = i as f64 * 1e-3;
                let (z, v) =
                    if t < 60.0 { (5.0 * t * t, 10.0 * t) } else { (18_000.0 + 600.0 * (t - 60.0), 600.0) };
                let sample = VectorSample {
                    time_s: t,
                    altitude_m: z,
                    velocity_east_m_s: 0.1 * v,
                    velocity_north_m_s: 0.0,
                    velocity_up_m_s: v,
                    axis: None,
                };
                black_box(scan.push_vector(sample).unwrap());
            }
            black_box(scan.summary());
        }
        _ => eprintln!("usage: icount state|density|upper|sounding|flight|flight_vehicle|flight_winds"),
    }
}
