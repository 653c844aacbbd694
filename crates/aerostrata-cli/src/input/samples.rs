//! The samples of a flight, read one line at a time through the tool's table reader, in
//! the columns and units a header names (any other column is kept out with a warning),
//! or time, geometric altitude and velocity in that order in the `--units` system
//! without one. Which columns make a sample, and the sample a row makes, are the core's
//! rules (`aerostrata::flight::FileLayout`), the same in every door: a speed relative to
//! the air, a ground-relative velocity by components, or by its speed and direction,
//! with the vehicle's axis where the velocity has a direction.

use std::io::BufRead;

use aerostrata::flight::{FileLayout, FileSample, VelocityGiven, FILE_COLUMNS, IMPLICIT_COLUMNS};
use aerostrata::Quantity;

use crate::failure::Failure;
use crate::input::table::{Columns, TableReader};
use crate::units::UnitSystem;

/// Reads samples one line at a time.
pub struct SampleReader<R> {
    table: TableReader<R>,
    layout: Option<FileLayout>,
}

impl<R: BufRead> SampleReader<R> {
    /// A reader of `input` (named `source` in messages), whose values are in `units`
    /// unless a header or a cell names others.
    pub fn new(input: R, source: impl Into<String>, units: UnitSystem) -> Self {
        let columns = Columns {
            accepts: &FILE_COLUMNS,
            implicit: &IMPLICIT_COLUMNS,
            check: Box::new(|header| FileLayout::of(header).map(drop).map_err(|e| e.to_string())),
        };
        SampleReader { table: TableReader::new(input, source, columns, Some(units)), layout: None }
    }

    /// The table underneath, for messages about the last line.
    pub fn table(&self) -> &TableReader<R> {
        &self.table
    }

    /// The underlying input.
    pub fn input_mut(&mut self) -> &mut R {
        self.table.input_mut()
    }

    /// The kind of file, once the first sample has been read.
    pub fn kind(&self) -> Option<VelocityGiven> {
        self.layout.map(|layout| layout.given())
    }

    /// The next sample, in SI, or `None` at the end.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the file, the line and the column at fault (an empty
    /// cell among them, an angle out of its range).
    pub fn next_sample(&mut self) -> Result<Option<FileSample>, Failure> {
        let Some(row) = self.table.next_row()? else { return Ok(None) };
        // The header's check has passed, so its layout is there.
        let layout = match self.layout {
            Some(layout) => Ok(layout),
            None => FileLayout::of(row.header()),
        };
        let sample = layout.map(|layout| (layout, layout.sample(row.values())));
        match sample {
            Ok((layout, sample)) => {
                self.layout = Some(layout);
                sample.map(Some).map_err(|e| self.table.at_column(e.index(), e))
            }
            Err(error) => Err(self.table.at_line(error)),
        }
    }

    /// The altitude's quantity in this file (`altitude` or `geometric_altitude`).
    pub fn altitude_quantity(&self) -> Quantity {
        self.layout.map_or(Quantity::Altitude, |layout| layout.altitude_quantity())
    }
}
