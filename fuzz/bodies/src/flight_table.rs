//! A flight file as every door reads it: the core's rule of lines, its header reader
//! with the flight files' columns, the layout that says which columns make a sample (or
//! the columns of a file without a header), each row's sample pushed into a flight scan
//! of the 1976 standard with a small vehicle (and, for the samples with a direction, the
//! winds of a light breeze).

use aerostrata::flight::{FileLayout, FlightScan, Vehicle, FILE_COLUMNS, IMPLICIT_COLUMNS};
use aerostrata::table::{self, Header};
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::{DragCurve, Quantity, US1976};

use crate::{all_finite, finite, message, text};

/// The target's body.
pub fn run(data: &[u8]) {
    let text = text(data);
    let mut lines = table::data_lines(text);
    let (header, implicit) = match lines.next() {
        None => return,
        Some(Err(e)) => return message(&e),
        Some(Ok((_, first))) if table::is_header(first) => {
            match Header::read(first, |q| FILE_COLUMNS.contains(&q), Quantity::si) {
                Ok(header) => (header, None),
                Err(e) => return message(&e),
            }
        }
        Some(Ok((_, first))) => (Header::implicit(&IMPLICIT_COLUMNS, first, Quantity::si), Some(first)),
    };
    let layout = match FileLayout::of(&header) {
        Ok(layout) => layout,
        Err(e) => return message(&e),
    };
    let drag = DragCurve::constant(0.45).expect("a constant drag coefficient of 0.45");
    let vehicle = Vehicle::new(drag, 0.018).expect("a reference area of 0.018 m^2");
    let levels = [
        WindLevel::new(0.0, 3.0, -2.0).expect("a calm wind level"),
        WindLevel::new(3_000.0, 12.0, 1.0).expect("a light wind level"),
    ];
    let winds = WindProfile::new(levels).expect("a two-level wind profile");
    let mut scan = FlightScan::new(US1976, Some(vehicle));
    if layout.given().has_direction() {
        scan = scan.with_winds(&winds);
    }
    let mut out = vec![None; header.count()];
    for line in implicit.into_iter().map(|row| Ok((0, row))).chain(lines) {
        let row = match line {
            Ok((_, row)) => row,
            Err(e) => return message(&e),
        };
        if let Err(e) = header.read_row(row, &mut out) {
            message(&e);
            continue;
        }
        for value in out.iter().flatten() {
            finite("a cell", *value);
        }
        let sample = match layout.sample(&out) {
            Ok(sample) => sample,
            Err(e) => {
                message(&e);
                continue;
            }
        };
        match sample.push(&mut scan) {
            Ok(point) => check_point(&point),
            Err(e) => message(&e),
        }
    }
    all_finite("the scan's summary", &scan.summary());
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
