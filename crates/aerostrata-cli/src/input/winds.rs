//! Winds aloft for `flight`: `--winds FILE` (a CSV of altitude and wind: `wind_speed` and
//! `wind_direction`, the direction the wind blows from, or `wind_east` and `wind_north`,
//! each heading with its unit) or the wind columns of a CSV sounding, read by the tool's
//! table reader into the core's `WindProfile` (east and north components, linear in
//! geometric altitude, the end levels held beyond the profile).

use std::fs::File;
use std::io::BufReader;
use std::path::Path;

use aerostrata::table::Header;
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::{Altitude, Error, GeometricAltitude, Quantity};

use crate::failure::Failure;
use crate::input::table::{Columns, TableReader};
use crate::units::UnitSystem;

/// A profile as the flight scan takes it.
pub type Winds = WindProfile<Vec<WindLevel>>;

const ACCEPTED: [Quantity; 7] = [
    Quantity::Altitude,
    Quantity::GeometricAltitude,
    Quantity::GeopotentialAltitude,
    Quantity::WindSpeed,
    Quantity::WindDirection,
    Quantity::WindEast,
    Quantity::WindNorth,
];
const ALTITUDES: [Quantity; 3] =
    [Quantity::Altitude, Quantity::GeometricAltitude, Quantity::GeopotentialAltitude];
/// The columns of a wind file without a header.
const IMPLICIT: [Quantity; 3] = [Quantity::GeometricAltitude, Quantity::WindSpeed, Quantity::WindDirection];
const POLAR: [Quantity; 2] = [Quantity::WindSpeed, Quantity::WindDirection];
const COMPONENTS: [Quantity; 2] = [Quantity::WindEast, Quantity::WindNorth];

/// Where a file's winds come from: a wind file must have them; a sounding may not.
#[derive(Clone, Copy, PartialEq, Eq)]
enum Source {
    WindFile,
    Sounding,
}

/// How the header gives the wind, or why it cannot be read; `Ok(None)` for a sounding
/// without wind columns.
fn layout(header: &Header, source: Source) -> Result<Option<(Quantity, bool)>, String> {
    let has = |q: &Quantity| header.position(*q).is_some();
    let altitudes: Vec<&Quantity> = ALTITUDES.iter().filter(|q| has(q)).collect();
    let (polar, components) =
        (POLAR.iter().filter(|q| has(q)).count(), COMPONENTS.iter().filter(|q| has(q)).count());
    if source == Source::Sounding && polar + components == 0 {
        return Ok(None);
    }
    let altitude = match altitudes.as_slice() {
        [one] => **one,
        [] => {
            return Err("the header needs an altitude column (geometric_altitude_m, altitude_ft)".to_owned())
        }
        _ => return Err("the header has more than one altitude column: keep one".to_owned()),
    };
    match (polar, components) {
        (2, 0) => Ok(Some((altitude, true))),
        (0, 2) => Ok(Some((altitude, false))),
        (0, 0) => {
            Err("the header needs the wind: wind_speed and wind_direction, or wind_east and wind_north"
                .to_owned())
        }
        (2, 2) => {
            Err("the header gives the wind twice: keep wind_speed and wind_direction, or wind_east and \
                      wind_north"
                .to_owned())
        }
        _ => Err("the wind needs both wind_speed and wind_direction (the direction it blows from), or both \
                  wind_east and wind_north"
            .to_owned()),
    }
}

/// The winds of `--winds FILE`; headings without a unit read in `units`.
///
/// # Errors
/// [`Failure::Input`] naming the file, the line and the column.
pub fn load_file(path: &Path, units: UnitSystem) -> Result<Winds, Failure> {
    read(path, Source::WindFile, Some(units))?
        .ok_or_else(|| Failure::Input(format!("--winds {}: no wind levels", path.display())))
}

/// The winds of a CSV sounding's wind columns, `None` where it has none. Rows with an
/// empty wind cell are passed over (a sounding may lose its wind before its temperature).
///
/// # Errors
/// [`Failure::Input`] naming the file, the line and the column.
pub fn load_sounding(path: &Path) -> Result<Option<Winds>, Failure> {
    read(path, Source::Sounding, None)
}

fn read(path: &Path, source: Source, units: Option<UnitSystem>) -> Result<Option<Winds>, Failure> {
    let name = path.display().to_string();
    let file = File::open(path).map_err(|e| Failure::Input(format!("cannot read winds {name}: {e}")))?;
    let columns = Columns { accepts: &ACCEPTED, implicit: &IMPLICIT, check: Box::new(|_| Ok(())) };
    let mut table = TableReader::new(BufReader::new(file), name.clone(), columns, units);
    if source == Source::Sounding {
        table = table.quiet();
    }
    let mut levels = Vec::new();
    let mut lines = Vec::new();
    let mut shape: Option<(Quantity, bool)> = None;
    while let Some(row) = table.next_row()? {
        let values = ACCEPTED.map(|q| row.get(q));
        let (altitude, polar) = match shape {
            Some(shape) => shape,
            None => {
                let header = table.header().ok_or_else(|| table.at_line("a wind file needs a header"))?;
                match layout(header, source).map_err(|m| table.at_line(m))? {
                    Some(found) => *shape.insert(found),
                    None => return Ok(None),
                }
            }
        };
        let get = |q: Quantity| ACCEPTED.iter().position(|k| *k == q).and_then(|i| values[i]);
        let (a, b) = if polar {
            (Quantity::WindSpeed, Quantity::WindDirection)
        } else {
            (Quantity::WindEast, Quantity::WindNorth)
        };
        let (Some(z), Some(first), Some(second)) = (get(altitude), get(a), get(b)) else {
            if source == Source::Sounding {
                continue;
            }
            let empty = [altitude, a, b].into_iter().find(|q| get(*q).is_none()).unwrap_or(altitude);
            return Err(table.at_cell(empty, "an empty cell; every level needs its altitude and wind"));
        };
        let z = if altitude == Quantity::GeopotentialAltitude {
            let geometric: GeometricAltitude =
                Altitude::geopotential_m(z).map_err(|e| table.at_cell(altitude, e))?.geometric();
            f64::from(geometric)
        } else {
            z
        };
        let level = if polar {
            WindLevel::from_speed_direction(z, first, second)
        } else {
            WindLevel::new(z, first, second)
        };
        levels.push(level.map_err(|e| table.at_cell(a, e))?);
        lines.push(table.line());
    }
    if levels.is_empty() {
        return match source {
            Source::Sounding => Ok(None),
            Source::WindFile => Err(Failure::Input(format!("{name}: no wind levels"))),
        };
    }
    WindProfile::new(levels).map(Some).map_err(|e| match e {
        Error::InvalidPoint { index, .. } => {
            let line = lines.get(index).copied().unwrap_or(0);
            Failure::Input(format!("{name}: line {line}: {e}"))
        }
        other => Failure::Input(format!("{name}: {other}")),
    })
}
