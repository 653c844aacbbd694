//! The samples of a flight, read one CSV line at a time: time, geometric altitude and
//! velocity, in the order and units a header names, or in that order in the command's
//! units without one.

use std::io::BufRead;

use aerostrata::flight::Sample;

use crate::failure::Failure;
use crate::input::lines::DataLines;
use crate::units::{Quantity, Unit, UnitSystem};

/// Where the samples' values sit in a row, and their units.
#[derive(Clone, Copy)]
struct Layout {
    time: usize,
    altitude: usize,
    velocity: usize,
    cells: usize,
    altitude_unit: Unit,
    velocity_unit: Unit,
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

/// The layout a first line gives, and whether it is a header (it has a cell `time_s`).
fn layout_of(text: &str, units: UnitSystem) -> Result<(Layout, bool), String> {
    let cells: Vec<&str> = text.split(',').map(str::trim).collect();
    if !cells.contains(&"time_s") {
        let layout = Layout {
            time: 0,
            altitude: 1,
            velocity: 2,
            cells: 3,
            altitude_unit: units.unit(Quantity::Length),
            velocity_unit: units.unit(Quantity::Speed),
        };
        return Ok((layout, false));
    }
    let find = |quantity: Quantity| {
        [UnitSystem::Si, UnitSystem::Us].into_iter().find_map(|system| {
            let unit = system.unit(quantity);
            let base = if quantity == Quantity::Length { "altitude" } else { "velocity" };
            cells.iter().position(|c| *c == unit.key(base)).map(|i| (i, unit))
        })
    };
    let time = cells.iter().position(|c| *c == "time_s");
    match (time, find(Quantity::Length), find(Quantity::Speed)) {
        (Some(time), Some((altitude, altitude_unit)), Some((velocity, velocity_unit))) => Ok((
            Layout { time, altitude, velocity, cells: cells.len(), altitude_unit, velocity_unit },
            true,
        )),
        _ => Err(format!(
            "header '{text}' needs the columns time_s, altitude_m or altitude_ft, and velocity_m_s or velocity_ft_s"
        )),
    }
}

fn parse_sample(text: &str, layout: Layout) -> Result<Sample, String> {
    let cells: Vec<&str> = text.split(',').map(str::trim).collect();
    if cells.len() != layout.cells {
        let names = format!(
            "time_s,altitude_{},velocity_{}",
            layout.altitude_unit.suffix, layout.velocity_unit.suffix
        );
        return Err(if layout.cells == 3 {
            format!("expected 3 values ({names}), got {} in '{text}'", cells.len())
        } else {
            format!("expected {} values as in the header, got {} in '{text}'", layout.cells, cells.len())
        });
    }
    let number = |cell: &str, what: &str| -> Result<f64, String> {
        cell.parse().map_err(|_| format!("'{cell}' is not a {what}"))
    };
    let unit_name = |unit: Unit, metric: &str, us: &str| {
        if unit.suffix.starts_with('m') {
            metric.to_owned()
        } else {
            us.to_owned()
        }
    };
    let time_s = number(cells[layout.time], "time (a number of seconds)")?;
    let altitude = number(
        cells[layout.altitude],
        &format!("geometric altitude (a number of {})", unit_name(layout.altitude_unit, "metres", "feet")),
    )?;
    let velocity =
        number(cells[layout.velocity], &format!("velocity (a number of {})", layout.velocity_unit.symbol))?;
    Ok(Sample {
        time_s,
        altitude_m: layout.altitude_unit.to_si(altitude),
        velocity_m_s: layout.velocity_unit.to_si(velocity),
    })
}
