//! The samples of a flight, read one CSV line at a time: time, geometric altitude and
//! velocity, in the order and units a header names, or in that order in the command's
//! units without one.

use std::io::BufRead;

use aerostrata::flight::Sample;
use aerostrata::units::Unit;
use aerostrata::Quantity;

use crate::failure::Failure;
use crate::input::lines::{number, DataLines};
use crate::units::{column, UnitSystem};

/// Where the samples' values sit in a row, and their units.
#[derive(Clone, Copy)]
struct Layout {
    time: usize,
    altitude: usize,
    velocity: usize,
    cells: usize,
    altitude_unit: &'static Unit,
    velocity_unit: &'static Unit,
}

/// Reads samples one line at a time from CSV text.
pub struct SampleReader<R> {
    lines: DataLines<R>,
    units: UnitSystem,
    layout: Option<Layout>,
}

impl<R: BufRead> SampleReader<R> {
    /// A reader of `input`, whose values are in `units` unless a header names others.
    pub fn new(input: R, units: UnitSystem) -> Self {
        SampleReader { lines: DataLines::new(input), units, layout: None }
    }

    /// The line number of the last line read (from 1).
    pub fn line_number(&self) -> usize {
        self.lines.number()
    }

    /// The underlying input.
    pub fn input_mut(&mut self) -> &mut R {
        self.lines.input_mut()
    }

    /// The next sample, in SI, or `None` at the end.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the line and the value at fault.
    pub fn next_sample(&mut self) -> Result<Option<Sample>, Failure> {
        while let Some((number, text)) = self.lines.next_line()? {
            let at_line = |m: String| Failure::Input(format!("line {number}: {m}"));
            let layout = match self.layout {
                Some(layout) => layout,
                None => {
                    let (layout, header) = layout_of(text, self.units).map_err(at_line)?;
                    self.layout = Some(layout);
                    if header {
                        continue;
                    }
                    layout
                }
            };
            return parse_sample(text, layout).map(Some).map_err(at_line);
        }
        Ok(None)
    }
}

/// The layout a first line gives, and whether it is a header (it has the time's column).
fn layout_of(text: &str, units: UnitSystem) -> Result<(Layout, bool), String> {
    let cells: Vec<&str> = text.split(',').map(str::trim).collect();
    let time = cells.iter().position(|c| *c == time_column());
    if time.is_none() {
        let layout = Layout {
            time: 0,
            altitude: 1,
            velocity: 2,
            cells: 3,
            altitude_unit: units.unit(Quantity::Altitude),
            velocity_unit: units.unit(Quantity::Velocity),
        };
        return Ok((layout, false));
    }
    // A header names each column in either system's unit, whatever --units says.
    let find = |quantity: Quantity| {
        [quantity.si(), quantity.us()]
            .into_iter()
            .find_map(|unit| cells.iter().position(|c| *c == column(quantity, unit)).map(|i| (i, unit)))
    };
    match (time, find(Quantity::Altitude), find(Quantity::Velocity)) {
        (Some(time), Some((altitude, altitude_unit)), Some((velocity, velocity_unit))) => {
            Ok((Layout { time, altitude, velocity, cells: cells.len(), altitude_unit, velocity_unit }, true))
        }
        _ => {
            let either = |q: Quantity| format!("{} or {}", column(q, q.si()), column(q, q.us()));
            Err(format!(
                "header '{text}' needs the columns {}, {}, and {}",
                time_column(),
                either(Quantity::Altitude),
                either(Quantity::Velocity)
            ))
        }
    }
}

/// The time's column: always in seconds.
fn time_column() -> String {
    column(Quantity::Time, Quantity::Time.si())
}

fn parse_sample(text: &str, layout: Layout) -> Result<Sample, String> {
    let cells: Vec<&str> = text.split(',').map(str::trim).collect();
    if cells.len() != layout.cells {
        let names = [
            time_column(),
            column(Quantity::Altitude, layout.altitude_unit),
            column(Quantity::Velocity, layout.velocity_unit),
        ];
        return Err(if layout.cells == 3 {
            format!("expected 3 values ({}), got {} in '{text}'", names.join(","), cells.len())
        } else {
            format!("expected {} values as in the header, got {} in '{text}'", layout.cells, cells.len())
        });
    }
    let time = Quantity::Time.si();
    Ok(Sample {
        time_s: time.to_si(number(cells[layout.time], Quantity::Time, time)?),
        altitude_m: layout.altitude_unit.to_si(number(
            cells[layout.altitude],
            Quantity::Altitude,
            layout.altitude_unit,
        )?),
        velocity_m_s: layout.velocity_unit.to_si(number(
            cells[layout.velocity],
            Quantity::Velocity,
            layout.velocity_unit,
        )?),
    })
}
