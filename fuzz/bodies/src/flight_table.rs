//! A flight file as the command line reads it (time, altitude and speed, or velocity
//! components), through the core's table reader, each row pushed into a flight scan of
//! the 1976 standard with a small vehicle and the winds of a light breeze. The command
//! line's own reader (`crates/aerostrata-cli/src/input`) is private to its crate; it
//! reads through this same table reader and scan.

use aerostrata::flight::{FlightScan, Sample, VectorSample, Vehicle};
use aerostrata::table::Header;
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::{DragCurve, Quantity, US1976};

use crate::{all_finite, finite, message, text};

/// What a flight file's header may name (the command line's flight columns).
const FLIGHT: [Quantity; 9] = [
    Quantity::Time,
    Quantity::Altitude,
    Quantity::GeometricAltitude,
    Quantity::Velocity,
    Quantity::VelocityEast,
    Quantity::VelocityNorth,
    Quantity::VelocityUp,
    Quantity::AxisElevation,
    Quantity::AxisAzimuth,
];

/// The target's body.
pub fn run(data: &[u8]) {
    let text = text(data);
    let mut lines = text.lines();
    let Some(first) = lines.next() else { return };
    let header = match Header::read(first, |q| FLIGHT.contains(&q), Quantity::si) {
        Ok(header) => header,
        Err(e) => return message(&e),
    };
    let drag = DragCurve::constant(0.45).expect("a constant drag coefficient of 0.45");
    let vehicle = Vehicle::new(drag, 0.018).expect("a reference area of 0.018 m^2");
    let levels = [
        WindLevel::new(0.0, 3.0, -2.0).expect("a calm wind level"),
        WindLevel::new(3_000.0, 12.0, 1.0).expect("a light wind level"),
    ];
    let winds = WindProfile::new(levels).expect("a two-level wind profile");
    let mut scalar = FlightScan::new(US1976, Some(vehicle));
    let mut vector = FlightScan::new(US1976, Some(vehicle)).with_winds(&winds);

    let at = |q: Quantity| header.position(q);
    let altitude = at(Quantity::Altitude).or(at(Quantity::GeometricAltitude));
    let mut out = vec![None; header.count()];
    for line in lines {
        if let Err(e) = header.read_row(line, &mut out) {
            message(&e);
            continue;
        }
        let cell = |index: Option<usize>| index.and_then(|i| out[i]);
        for value in out.iter().flatten() {
            finite("a cell", *value);
        }
        let (Some(time_s), Some(altitude_m)) = (cell(at(Quantity::Time)), cell(altitude)) else {
            continue;
        };
        if let Some(velocity_m_s) = cell(at(Quantity::Velocity)) {
            match scalar.push(Sample { time_s, altitude_m, velocity_m_s }) {
                Ok(point) => check_point(&point),
                Err(e) => message(&e),
            }
        }
        let east = cell(at(Quantity::VelocityEast));
        let north = cell(at(Quantity::VelocityNorth));
        let up = cell(at(Quantity::VelocityUp));
        if let (Some(velocity_east_m_s), Some(velocity_north_m_s), Some(velocity_up_m_s)) = (east, north, up)
        {
            let sample = VectorSample {
                time_s,
                altitude_m,
                velocity_east_m_s,
                velocity_north_m_s,
                velocity_up_m_s,
                axis: None,
            };
            match vector.push_vector(sample) {
                Ok(point) => check_point(&point),
                Err(e) => message(&e),
            }
        }
    }
    all_finite("the scalar scan's summary", &scalar.summary());
    all_finite("the vector scan's summary", &vector.summary());
}

fn check_point(point: &aerostrata::FlightPoint) {
    for &quantity in Quantity::ALL {
        match point.get(quantity) {
            Ok(value) => finite(quantity.info().label, value),
            Err(e) => message(&e),
        }
    }
    all_finite("a flight point", point);
}
