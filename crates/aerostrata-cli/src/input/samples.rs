//! The samples of a flight, read one line at a time through the tool's table reader:
//! time, geometric altitude and velocity relative to the air, in the columns and units a
//! header names (any other column is kept out with a warning), or in that order in the
//! `--units` system without one.

use std::io::BufRead;

use aerostrata::flight::Sample;
use aerostrata::Quantity;

use crate::failure::Failure;
use crate::input::table::{needs, Columns, TableReader};
use crate::units::UnitSystem;

/// The quantities a flight file's header may name: a flight's altitude is geometric, so
/// `geometric_altitude` reads as well as `altitude`.
const ACCEPTED: [Quantity; 4] =
    [Quantity::Time, Quantity::Altitude, Quantity::GeometricAltitude, Quantity::Velocity];
/// The columns of a file without a header.
const IMPLICIT: [Quantity; 3] = [Quantity::Time, Quantity::Altitude, Quantity::Velocity];

/// Reads samples one line at a time.
pub struct SampleReader<R> {
    table: TableReader<R>,
}

impl<R: BufRead> SampleReader<R> {
    /// A reader of `input` (named `source` in messages), whose values are in `units`
    /// unless a header or a cell names others.
    pub fn new(input: R, source: impl Into<String>, units: UnitSystem) -> Self {
        let columns = Columns {
            accepts: &ACCEPTED,
            implicit: &IMPLICIT,
            check: Box::new(|header| {
                needs(
                    header,
                    &[
                        &[Quantity::Time],
                        &[Quantity::Altitude, Quantity::GeometricAltitude],
                        &[Quantity::Velocity],
                    ],
                )
            }),
        };
        SampleReader { table: TableReader::new(input, source, columns, Some(units)) }
    }

    /// The table underneath, for messages about the last line.
    pub fn table(&self) -> &TableReader<R> {
        &self.table
    }

    /// The underlying input.
    pub fn input_mut(&mut self) -> &mut R {
        self.table.input_mut()
    }

    /// The next sample, in SI, or `None` at the end.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the file, the line and the column at fault (an empty
    /// cell among them).
    pub fn next_sample(&mut self) -> Result<Option<Sample>, Failure> {
        let Some(row) = self.table.next_row()? else { return Ok(None) };
        let altitude = row.get(Quantity::Altitude).or_else(|| row.get(Quantity::GeometricAltitude));
        let values = (row.get(Quantity::Time), altitude, row.get(Quantity::Velocity));
        let (Some(time_s), Some(altitude_m), Some(velocity_m_s)) = values else {
            let empty = match values {
                (None, _, _) => Quantity::Time,
                (_, None, _) => self.altitude_quantity(),
                _ => Quantity::Velocity,
            };
            return Err(self.table.at_cell(empty, "an empty cell; every sample needs a value"));
        };
        Ok(Some(Sample { time_s, altitude_m, velocity_m_s }))
    }

    /// The altitude's quantity in this file (`altitude` or `geometric_altitude`).
    pub fn altitude_quantity(&self) -> Quantity {
        match self.table.header() {
            Some(h) if h.position(Quantity::GeometricAltitude).is_some() => Quantity::GeometricAltitude,
            _ => Quantity::Altitude,
        }
    }
}
