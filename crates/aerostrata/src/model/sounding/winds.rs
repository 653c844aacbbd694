//! Winds as CSV text (the `alloc` feature): the wind columns of a sounding, and a wind
//! file of its own (an altitude column and the wind), read through the one table reader
//! like every other column, into a [`WindProfile`] of geometric altitude.
//!
//! A wind is given as speed and the direction it blows FROM (`wind_speed_kt`,
//! `wind_direction_deg`; degrees clockwise from true north, the meteorological
//! convention) or as east and north components (`wind_east_m_s`, `wind_north_m_s`), not
//! both. A row may leave all of its wind cells empty (a sounding's level without a wind
//! report); a row that gives one cell of a pair must give the other. A sounding with
//! half a pair (a lone `wind_speed`) still loads: the column is kept out and listed, as
//! any column the reader cannot use.

use alloc::string::{String, ToString};
use alloc::vec::Vec;

use super::csv::{content, header_error, LoadError, Options};
use crate::altitude::AltitudeKind;
use crate::error::Error;
use crate::quantity::Quantity;
use crate::table::{self, CellError, Header};
use crate::wind::{WindLevel, WindProfile};

/// The quantities of a wind.
pub(super) const WIND_QUANTITIES: [Quantity; 4] =
    [Quantity::WindSpeed, Quantity::WindDirection, Quantity::WindEast, Quantity::WindNorth];

const HALF_A_WIND: &str = "empty, but the other half of this row's wind is given: give both or neither";

/// Which columns hold the wind.
#[derive(Debug, Clone, Copy)]
pub(super) enum WindColumns {
    /// Speed and the direction it blows from.
    Polar { speed: usize, direction: usize },
    /// East and north components.
    Components { east: usize, north: usize },
}

/// What a header says about the wind.
#[derive(Debug, Clone, Copy)]
pub(super) enum Found {
    /// No wind column.
    Nothing,
    /// A whole pair.
    Pair(WindColumns),
    /// Half a pair (a speed without a direction, an east component without a north one):
    /// the column's index, and what it lacks.
    Half(usize, &'static str),
    /// Both kinds of pair.
    Both,
}

impl Found {
    /// The message of a header that does not give one whole pair.
    pub(super) const BOTH: &'static str =
        "give the wind either as speed and direction or as east and north components, not both";
}

impl WindColumns {
    /// What `header` says about the wind.
    pub(super) fn of(header: &Header) -> Found {
        let at = |q| header.position(q);
        let polar = (at(Quantity::WindSpeed), at(Quantity::WindDirection));
        let components = (at(Quantity::WindEast), at(Quantity::WindNorth));
        match (polar, components) {
            ((None, None), (None, None)) => Found::Nothing,
            ((Some(speed), Some(direction)), (None, None)) => Found::Pair(Self::Polar { speed, direction }),
            ((None, None), (Some(east), Some(north))) => Found::Pair(Self::Components { east, north }),
            ((Some(_), Some(_)), (Some(_), Some(_))) => Found::Both,
            ((Some(i), None), _) => Found::Half(i, "a wind_speed column needs a wind_direction column"),
            ((None, Some(i)), _) => Found::Half(i, "a wind_direction column needs a wind_speed column"),
            (_, (Some(i), None)) => Found::Half(i, "a wind_east column needs a wind_north column"),
            (_, (None, Some(i))) => Found::Half(i, "a wind_north column needs a wind_east column"),
        }
    }

    fn indexes(self) -> [usize; 2] {
        match self {
            Self::Polar { speed, direction } => [speed, direction],
            Self::Components { east, north } => [east, north],
        }
    }

    /// The wind of a row whose values (in SI) are `values`, at geometric `altitude_m`:
    /// `None` when the row gives no wind.
    ///
    /// # Errors
    /// One cell of the pair without the other, or a value [`WindLevel`] refuses (a speed
    /// or component beyond [`crate::wind::MAX_WIND_M_S`], a direction beyond +-360 deg),
    /// at the line and column of the cell.
    pub(super) fn level(
        self,
        altitude_m: f64,
        values: &[Option<f64>],
        line: usize,
        names: &[String],
        cells: &[&str],
    ) -> Result<Option<WindLevel>, LoadError> {
        let [a, b] = self.indexes();
        let place = |error: LoadError, index: usize| {
            let error = error.in_column(index, names.get(index).map_or("", String::as_str));
            match cells.get(index).filter(|c| !c.is_empty()) {
                Some(cell) => error.with_value(cell),
                None => error,
            }
        };
        let (first, second) = match (values.get(a).copied().flatten(), values.get(b).copied().flatten()) {
            (None, None) => return Ok(None),
            (Some(first), Some(second)) => (first, second),
            (None, Some(_)) => return Err(place(LoadError::at(line, HALF_A_WIND), a)),
            (Some(_), None) => return Err(place(LoadError::at(line, HALF_A_WIND), b)),
        };
        let level = match self {
            Self::Polar { .. } => WindLevel::from_speed_direction(altitude_m, first, second),
            Self::Components { .. } => WindLevel::new(altitude_m, first, second),
        };
        level.map(Some).map_err(|error| {
            // Name the cell the refusal is about: the second of the pair for a direction
            // or a north component, else the first.
            let second_named = matches!(
                error,
                Error::OutOfRange { quantity: "wind direction" | "northward wind", .. }
                    | Error::NotFinite { quantity: "wind direction" | "northward wind", .. }
            );
            place(LoadError::model(line, error), if second_named { b } else { a })
        })
    }
}

/// A wind file as read: the profile, and the headings of the columns kept out of it.
#[derive(Debug, Clone)]
pub struct WindFile {
    /// The winds, lowest level first.
    pub winds: WindProfile<Vec<WindLevel>>,
    /// The columns the reader does not take, as (column number from 1, heading).
    pub ignored: Vec<(usize, String)>,
}

const WIND_COLUMNS: &str = "altitude (geometric) or geopotential_altitude, and wind_speed with \
     wind_direction (the direction it blows from) or wind_east with wind_north, each with its unit \
     (geometric_altitude_ft, wind_speed_kt, wind_direction_deg)";

/// Reads a wind profile from CSV text: `#` comments and blank lines anywhere, one header
/// line, one row per level; the same headings, units and cells as a sounding's
/// ([`super::csv::read_csv`]), except that a plain `altitude` column is read as geometric
/// (as in a flight file). Geopotential altitudes are converted to geometric.
///
/// ```
/// use aerostrata::model::sounding_io::{read_winds_csv, Options};
/// let text = "geometric_altitude_ft,wind_speed_kt,wind_direction_deg\n\
///             0,10,270\n\
///             10000,40,250\n";
/// let file = read_winds_csv(text, &Options::default())?;
/// let at = file.winds.at(0.0)?;
/// // 10 kt from the west blows toward the east: 10 * 1852 / 3600 m/s.
/// assert!((at.east_m_s - 10.0 * 1852.0 / 3600.0).abs() < 1e-12 && at.north_m_s.abs() < 1e-12);
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
///
/// # Errors
/// A [`LoadError`] at the line (and column and cell where there is one): no header, no
/// altitude or no wind columns, half a pair, a cell that is not a number of its quantity,
/// a missing altitude, a row without wind, a value a [`WindLevel`] refuses, altitudes not
/// increasing, no row.
pub fn read_winds_csv(text: &str, options: &Options) -> Result<WindFile, LoadError> {
    let mut lines = content(text);
    let Some((header_line, header_text)) = lines.next().transpose()? else {
        return Err(LoadError::at(text.lines().count().max(1), "no header line: name the columns first"));
    };
    let names: Vec<String> =
        table::cells(header_text, table::delimiter_of(header_text)).map(ToString::to_string).collect();
    let taken = |q: Quantity| {
        WIND_QUANTITIES.contains(&q)
            || matches!(q, Quantity::Altitude | Quantity::GeometricAltitude | Quantity::GeopotentialAltitude)
    };
    let header = Header::read(header_text, taken, options.default_unit)
        .map_err(|error| header_error(header_line, &names, error))?;
    // A plain `altitude` is geometric, as in a flight file (winds are reported against
    // height); a sounding, whose temperatures depend on which, must say.
    let one = |message: &str| Err(LoadError::at(header_line, message.to_string()));
    let geometric = match [Quantity::GeometricAltitude, Quantity::Altitude].map(|q| header.position(q)) {
        [Some(_), Some(_)] => return one("give one altitude column, geometric or geopotential"),
        [a, b] => a.or(b),
    };
    let (altitude, kind) = match (geometric, header.position(Quantity::GeopotentialAltitude)) {
        (Some(index), None) => (index, AltitudeKind::Geometric),
        (None, Some(index)) => (index, AltitudeKind::Geopotential),
        (Some(_), Some(_)) => return one("give one altitude column, geometric or geopotential"),
        (None, None) => {
            return one(&alloc::format!(
                "the header needs an altitude column; the columns are {WIND_COLUMNS}"
            ));
        }
    };
    let columns = match WindColumns::of(&header) {
        Found::Pair(columns) => columns,
        Found::Nothing => {
            return Err(LoadError::at(
                header_line,
                alloc::format!("the header names no wind column; the columns are {WIND_COLUMNS}"),
            ));
        }
        Found::Half(index, why) => {
            return Err(LoadError::at(header_line, why).in_column(index, &names[index]));
        }
        Found::Both => return Err(LoadError::at(header_line, Found::BOTH)),
    };
    let mut levels = Vec::new();
    let mut level_lines = Vec::new();
    let mut values = [None; table::MAX_COLUMNS];
    for next in lines {
        let (line, text) = next?;
        let cells: Vec<&str> = table::cells(text, header.delimiter()).collect();
        header.read_row(text, &mut values).map_err(|error| row_error(error, line, header_line, &names))?;
        let Some(altitude_m) = values[altitude] else {
            return Err(
                LoadError::at(line, "a value is required on every row").in_column(altitude, &names[altitude])
            );
        };
        let geometric_m = kind
            .altitude(altitude_m)
            .map(|h| h.geometric().meters())
            .map_err(|error| LoadError::model(line, error).in_column(altitude, &names[altitude]))?;
        let level = columns.level(geometric_m, &values, line, &names, &cells)?.ok_or_else(|| {
            let index = columns.indexes()[0];
            LoadError::at(line, "a row of a wind file needs its wind").in_column(index, &names[index])
        })?;
        levels.push(level);
        level_lines.push(line);
    }
    if levels.is_empty() {
        return Err(LoadError::at(header_line, "no row of winds after the header"));
    }
    let winds = profile(levels, &level_lines, altitude, &names)?;
    let ignored = header.ignored().map(|i| (i + 1, names.get(i).cloned().unwrap_or_default())).collect();
    Ok(WindFile { winds, ignored })
}

/// The profile of `levels` read from `lines`, an error at the line of the level it is
/// about (altitudes must increase).
pub(super) fn profile(
    levels: Vec<WindLevel>,
    lines: &[usize],
    altitude: usize,
    names: &[String],
) -> Result<WindProfile<Vec<WindLevel>>, LoadError> {
    WindProfile::new(levels).map_err(|error| {
        let line = match error {
            Error::InvalidPoint { index, .. } => lines.get(index).copied(),
            _ => None,
        };
        let line = line.or(lines.last().copied()).unwrap_or(1);
        LoadError::model(line, error).in_column(altitude, names.get(altitude).map_or("", String::as_str))
    })
}

/// A row that could not be read, placed at its line.
pub(super) fn row_error(
    error: CellError<'_>,
    line: usize,
    header_line: usize,
    names: &[String],
) -> LoadError {
    match error {
        CellError::Count { expected, found } => LoadError::at(
            line,
            alloc::format!("{found} cells, but the header on line {header_line} has {expected} columns"),
        ),
        CellError::Value { index, text, error } => LoadError::at(line, error.to_string())
            .in_column(index, names.get(index).map_or("", String::as_str))
            .with_value(text),
    }
}
