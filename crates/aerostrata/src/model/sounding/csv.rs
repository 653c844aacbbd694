//! Soundings as CSV text (the `alloc` feature): reading through the one table reader
//! ([`crate::table`]), with errors that name the line, the column and the value as
//! written, and writing, with every value's shortest decimal that reads back to the same
//! f64.
//!
//! The format (docs/soundings.md): `#` comment lines and blank lines anywhere; one
//! header line naming each column (a quantity of the catalogue, with or without a unit:
//! `geometric_altitude_ft`, `temperature (degC)`, `Pressure [hPa]`); then one row per
//! line, an empty cell meaning "not given", a cell's own unit (`850hPa`) winning over its
//! column's. A heading without a unit reads in the reader's default unit (SI unless the
//! caller says otherwise). Wind columns give [`Sounding::winds`] (winds.rs, which also
//! reads a wind file of its own); columns the reader does not take (remarks, say) are
//! kept out and listed in [`Sounding::ignored`]. Every value is checked against what the atmosphere
//! can have at its row (see [`Options::plausibility`]), so that pascals in a hectopascal
//! column, or kelvins in a Celsius one, are refused with the likely mix-up named. JSON
//! goes through serde instead.
//!
//! ```
//! use aerostrata::model::sounding_io::parse_csv;
//! use aerostrata::{Altitude, Atmosphere};
//! let text = "# an invented profile\n\
//!             geometric_altitude_ft,temperature_degC,pressure_hPa,relative_humidity_percent\n\
//!             0,30,1010,70\n\
//!             3280.84,23.5,,55\n";
//! let table = parse_csv(text)?;
//! let s = table.state(Altitude::geometric_m(0.0)?)?;
//! assert_eq!(s.pressure_pa, 101_000.0);
//! # Ok::<(), Box<dyn std::error::Error>>(())
//! ```

use alloc::boxed::Box;
use alloc::format;
use alloc::string::{String, ToString};
use alloc::vec::Vec;
use core::fmt::{self, Write as _};

use crate::altitude::AltitudeKind;
use crate::error::{Error, MessagePart};
use crate::model::{Atmosphere, US1976};
use crate::quantity::{ColumnError, Quantity};
use crate::table::{self, Header, HeaderError};
use crate::units::{self, Tidy, Unit};

use super::rows::{
    SoundingLevel, SoundingRow, Q_DENSITY, Q_DEW_POINT, Q_HUMID_TEMPERATURE, Q_PRESSURE, Q_RELATIVE_HUMIDITY,
    Q_TEMPERATURE,
};
use super::table::Tabulated;
use super::winds::{self, Found, WindColumns, WIND_QUANTITIES};
use crate::wind::{WindLevel, WindProfile};

pub use super::winds::{read_winds_csv, WindFile};

/// A sounding that could not be read: where (line, and column and cell where there is
/// one) and why.
#[derive(Debug, Clone, PartialEq)]
pub struct LoadError(Box<Located>);

#[derive(Debug, Clone, PartialEq)]
struct Located {
    line: usize,
    column: Option<(usize, String)>,
    value: Option<String>,
    why: Why,
}

/// Why, kept as parts so that a door can write the numbers its own way (the size-budgeted
/// WebAssembly module writes them without Rust's float formatting).
#[derive(Debug, Clone, PartialEq)]
enum Why {
    /// Words (and integers) only.
    Text(String),
    /// The model's own error.
    Model(Error),
    /// A value outside what the atmosphere can have at its row, in SI.
    Implausible {
        value: f64,
        min: f64,
        max: f64,
        unit: &'static str,
        what: &'static str,
        /// The column's unit, and the unit and heading that would make the value plausible.
        hint: Option<(&'static str, &'static str, String)>,
    },
}

impl LoadError {
    pub(super) fn at(line: usize, message: impl Into<String>) -> Self {
        Self(Box::new(Located { line, column: None, value: None, why: Why::Text(message.into()) }))
    }

    pub(super) fn model(line: usize, error: Error) -> Self {
        Self(Box::new(Located { line, column: None, value: None, why: Why::Model(error) }))
    }

    pub(super) fn in_column(mut self, index: usize, name: &str) -> Self {
        self.0.column = Some((index + 1, units::Escaped(name).to_string()));
        self
    }

    pub(super) fn with_value(mut self, text: &str) -> Self {
        self.0.value = Some(units::Escaped(text).to_string());
        self
    }

    /// The line of the text, counting from 1.
    pub fn line(&self) -> usize {
        self.0.line
    }

    /// The column's number (from 1) and its header name, where the problem has a column.
    pub fn column(&self) -> Option<(usize, &str)> {
        self.0.column.as_ref().map(|(index, name)| (*index, name.as_str()))
    }

    /// The cell as written (cut to 40 characters), where the problem has one.
    pub fn value(&self) -> Option<&str> {
        self.0.value.as_deref()
    }

    /// The model's own error, when the text was well formed but the table was not.
    pub fn model_error(&self) -> Option<&Error> {
        match &self.0.why {
            Why::Model(error) => Some(error),
            _ => None,
        }
    }

    /// The message after its place (`line 3, column 2 (temperature_degC), value 'x': `),
    /// piece by piece: a door writes the numbers its own way, [`fmt::Display`] with
    /// Rust's. The model's errors come as their own parts ([`Error::message_parts`]).
    pub fn message_parts(&self, mut part: impl FnMut(units::Part<'_>)) {
        use units::Part::{Number, Text};
        match &self.0.why {
            Why::Text(text) => part(Text(text)),
            Why::Model(error) => error.message_parts(|p| match p {
                MessagePart::Text(text) => part(Text(text)),
                MessagePart::Number(value) => part(Number(value)),
                MessagePart::Count(count) => part(Number(count as f64)),
            }),
            Why::Implausible { value, min, max, unit, what, hint } => {
                for piece in
                    [Number(*value), Text(" "), Text(unit), Text(" is outside "), Text(what), Text(" (")]
                {
                    part(piece);
                }
                for piece in [Number(*min), Text(" to "), Number(*max), Text(" "), Text(unit), Text(")")] {
                    part(piece);
                }
                if let Some((column_unit, fit, heading)) = hint {
                    for piece in
                        [Text("; the column reads "), Text(column_unit), Text(": if it holds "), Text(fit)]
                    {
                        part(piece);
                    }
                    part(Text(", head it "));
                    part(Text(heading));
                }
                part(Text(" (check the data, or read it without the plausibility check)"));
            }
        }
    }
}

impl fmt::Display for LoadError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let located = &self.0;
        write!(f, "line {}", located.line)?;
        if let Some((index, name)) = &located.column {
            write!(f, ", column {index} ({name})")?;
        }
        if let Some(value) = &located.value {
            write!(f, ", value '{value}'")?;
        }
        f.write_str(": ")?;
        if let Why::Model(error) = &located.why {
            // The model's wording and number format, exactly as its own Display.
            return write!(f, "{error}");
        }
        let mut result = Ok(());
        self.message_parts(|p| {
            if result.is_ok() {
                result = match p {
                    units::Part::Text(text) => f.write_str(text),
                    units::Part::Number(value) => write!(f, "{}", Tidy(value)),
                };
            }
        });
        result
    }
}

impl core::error::Error for LoadError {
    fn source(&self) -> Option<&(dyn core::error::Error + 'static)> {
        self.model_error().map(|e| e as &(dyn core::error::Error + 'static))
    }
}

/// How a sounding is read.
#[derive(Debug, Clone, Copy)]
pub struct Options {
    /// The unit of a column whose heading names none (the quantity's SI unit by default;
    /// a door that reads in US units passes `Quantity::us`).
    pub default_unit: fn(Quantity) -> &'static Unit,
    /// Check every value against what the atmosphere can have at its row: temperatures
    /// and dew points within 120 to 350 K, pressures within 0.5 to 1.5 times and densities
    /// within 0.5 to 2 times the 1976 standard's at the row's altitude (where the standard
    /// is defined, -5 to 86 km). These bands hold every day the Earth has (common practice,
    /// no source); turn the check off only for another planet or a test atmosphere.
    pub plausibility: bool,
}

impl Default for Options {
    fn default() -> Self {
        Self { default_unit: Quantity::si, plausibility: true }
    }
}

/// A sounding as read: the model, and the headings of the columns kept out of it.
#[derive(Debug, Clone)]
pub struct Sounding {
    /// The table.
    pub table: Tabulated<Vec<SoundingLevel>>,
    /// The winds, where the sounding has wind columns (`wind_speed` and `wind_direction`,
    /// or `wind_east` and `wind_north`), at the rows that give them, against geometric
    /// altitude (see [`read_winds_csv`] for the columns).
    pub winds: Option<WindProfile<Vec<WindLevel>>>,
    /// The columns the reader does not take, as (column number from 1, heading), for a
    /// warning: remarks, anything else.
    pub ignored: Vec<(usize, String)>,
}

/// The quantities a sounding's columns may hold.
const TAKEN: [Quantity; 7] = [
    Quantity::GeometricAltitude,
    Quantity::GeopotentialAltitude,
    Quantity::Temperature,
    Quantity::Pressure,
    Quantity::Density,
    Quantity::DewPoint,
    Quantity::RelativeHumidity,
];

const KNOWN_COLUMNS: &str = "geometric_altitude or geopotential_altitude, temperature, pressure or density, \
     and optionally dew_point or relative_humidity and a wind (wind_speed with wind_direction, or wind_east \
     with wind_north), each with its unit (geometric_altitude_ft, temperature_degC, pressure_hPa, wind_speed_kt)";

/// Where each quantity sits in the header.
#[derive(Debug, Default)]
struct Layout {
    altitude: Option<usize>,
    temperature: Option<usize>,
    pressure: Option<usize>,
    density: Option<usize>,
    dew_point: Option<usize>,
    relative_humidity: Option<usize>,
}

/// A data row as read, kept for error messages.
struct ReadRow {
    line: usize,
    cells: Vec<String>,
}

/// Reads a sounding from CSV text with the default [`Options`]; see [`read_csv`].
///
/// # Errors
/// As [`read_csv`].
pub fn parse_csv(text: &str) -> Result<Tabulated<Vec<SoundingLevel>>, LoadError> {
    read_csv(text, &Options::default()).map(|sounding| sounding.table)
}

/// Reads a sounding from CSV text.
///
/// # Errors
/// A [`LoadError`] naming the line (from 1), and where there is one the column (number
/// and header name) and the cell as written: no header; a column of a quantity the
/// reader takes with a wrong unit, or named twice; no altitude, temperature or pressure
/// (or density) column, or an altitude that does not say which kind; a line with another
/// number of cells than the header; a cell that is not a number of its quantity; a
/// missing altitude or temperature; every error of [`Tabulated::from_rows_vec`], whose
/// message it carries; and a value the atmosphere cannot have at its row, naming the
/// likely unit mix-up (unless [`Options::plausibility`] is off).
pub fn read_csv(text: &str, options: &Options) -> Result<Sounding, LoadError> {
    let mut content = content(text);
    let Some((header_line, header_text)) = content.next().transpose()? else {
        let last = text.lines().count().max(1);
        return Err(LoadError::at(
            last,
            "no header line: the first line that is not a comment must name the columns",
        ));
    };
    let names: Vec<String> =
        table::cells(header_text, table::delimiter_of(header_text)).map(str::to_string).collect();
    for (index, name) in names.iter().enumerate() {
        if Quantity::from_column(name).is_ok_and(|c| c.quantity == Quantity::Altitude) {
            return Err(LoadError::at(
                header_line,
                "say which altitude: geometric_altitude or geopotential_altitude (they differ by 1.2 km at 86 km)",
            )
            .in_column(index, name));
        }
    }
    let taken = |q| TAKEN.contains(&q) || WIND_QUANTITIES.contains(&q);
    let header = Header::read(header_text, taken, options.default_unit)
        .map_err(|error| header_error(header_line, &names, error))?;
    let (wind_columns, wind_half) = match WindColumns::of(&header) {
        Found::Nothing => (None, None),
        Found::Pair(columns) => (Some(columns), None),
        Found::Half(index, _) => (None, Some(index)),
        Found::Both => return Err(LoadError::at(header_line, Found::BOTH)),
    };
    let layout = Layout {
        altitude: header
            .position(Quantity::GeometricAltitude)
            .or(header.position(Quantity::GeopotentialAltitude)),
        temperature: header.position(Quantity::Temperature),
        pressure: header.position(Quantity::Pressure),
        density: header.position(Quantity::Density),
        dew_point: header.position(Quantity::DewPoint),
        relative_humidity: header.position(Quantity::RelativeHumidity),
    };
    if header.position(Quantity::GeometricAltitude).is_some()
        && header.position(Quantity::GeopotentialAltitude).is_some()
    {
        return Err(LoadError::at(
            header_line,
            "give one altitude column, geometric or geopotential, not both",
        ));
    }
    let Some(altitude_index) = layout.altitude else {
        return Err(LoadError::at(
            header_line,
            format!("the header needs an altitude column; the columns are {KNOWN_COLUMNS}"),
        ));
    };
    let kind = if header.position(Quantity::GeometricAltitude).is_some() {
        AltitudeKind::Geometric
    } else {
        AltitudeKind::Geopotential
    };
    let Some(temperature_index) = layout.temperature else {
        return Err(LoadError::at(
            header_line,
            format!("the header needs a temperature column; the columns are {KNOWN_COLUMNS}"),
        ));
    };
    if layout.pressure.is_none() && layout.density.is_none() {
        return Err(LoadError::at(
            header_line,
            format!("the header needs a pressure or a density column; the columns are {KNOWN_COLUMNS}"),
        ));
    }

    let mut rows = Vec::new();
    let mut read = Vec::new();
    let (mut wind_levels, mut wind_lines) = (Vec::new(), Vec::new());
    let mut values = [None; table::MAX_COLUMNS];
    for next in content {
        let (line, text) = next?;
        header
            .read_row(text, &mut values)
            .map_err(|error| winds::row_error(error, line, header_line, &names))?;
        let required = |index: usize| {
            values[index].ok_or_else(|| {
                LoadError::at(line, "a value is required on every row").in_column(index, &names[index])
            })
        };
        let optional = |index: Option<usize>| index.and_then(|i| values[i]);
        rows.push(SoundingRow {
            altitude_m: required(altitude_index)?,
            temperature_k: required(temperature_index)?,
            pressure_pa: optional(layout.pressure),
            density_kg_m3: optional(layout.density),
            dew_point_k: optional(layout.dew_point),
            relative_humidity_percent: optional(layout.relative_humidity),
        });
        let cells: Vec<&str> = table::cells(text, header.delimiter()).collect();
        if let (Some(columns), Some(row)) = (wind_columns, rows.last()) {
            let geometric_m =
                kind.altitude(row.altitude_m).map(|h| h.geometric().meters()).map_err(|error| {
                    LoadError::model(line, error).in_column(altitude_index, &names[altitude_index])
                })?;
            if let Some(level) = columns.level(geometric_m, &values, line, &names, &cells)? {
                wind_levels.push(level);
                wind_lines.push(line);
            }
        }
        read.push(ReadRow { line, cells: cells.into_iter().map(str::to_string).collect() });
    }
    let table = Tabulated::from_rows_vec(kind, &rows)
        .map_err(|error| located(error, header_line, &layout, &names, &read))?;
    if options.plausibility {
        check_plausible(kind, &rows, &read, &layout, &names, &header)?;
    }
    let winds = match wind_columns {
        None => None,
        Some(_) if wind_levels.is_empty() => {
            return Err(LoadError::at(header_line, "the wind columns hold no wind on any row"));
        }
        Some(_) => Some(winds::profile(wind_levels, &wind_lines, altitude_index, &names)?),
    };
    let mut kept_out: Vec<usize> = header.ignored().collect();
    if let Some(half) = wind_half {
        // In column order (no sort: it would cost the WebAssembly module 2 KiB).
        kept_out.insert(kept_out.partition_point(|&i| i < half), half);
    }
    let ignored = kept_out.into_iter().map(|i| (i + 1, names.get(i).cloned().unwrap_or_default())).collect();
    Ok(Sounding { table, winds, ignored })
}

/// The lines of `text` that are neither blank nor comments, as (line number from 1, text),
/// by the one rule of lines ([`table::data_lines`]).
pub(super) fn content(text: &str) -> impl Iterator<Item = Result<(usize, &str), LoadError>> {
    table::data_lines(text).map(|line| line.map_err(|e| LoadError::at(e.line, e.to_string())))
}

pub(super) fn header_error(line: usize, names: &[String], error: HeaderError<'_>) -> LoadError {
    match error {
        HeaderError::TooManyColumns { .. } => LoadError::at(line, error.to_string()),
        HeaderError::Duplicate { quantity, first, second } => LoadError::at(
            line,
            format!("a second column of the {} (the first is column {})", quantity.info().label, first + 1),
        )
        .in_column(second, names.get(second).map_or("", String::as_str)),
        HeaderError::Unit { index, error: ColumnError::Unit { quantity, unit }, .. } => LoadError::at(
            line,
            format!(
                "unit {} is not one of the {}'s: {}",
                units::Quoted(unit),
                quantity.info().label,
                units::UnitList(quantity.si().dimension())
            ),
        )
        .in_column(index, names.get(index).map_or("", String::as_str)),
        HeaderError::Unit { index, .. } => LoadError::at(line, error.to_string())
            .in_column(index, names.get(index).map_or("", String::as_str)),
    }
}

/// The band a value of `quantity` can have at geometric or geopotential `altitude_m`, in
/// SI, and what it is called: `None` where there is no band (outside the standard).
fn band(quantity: Quantity, kind: AltitudeKind, altitude_m: f64) -> Option<(f64, f64, &'static str)> {
    match quantity {
        Quantity::Temperature | Quantity::DewPoint => {
            let p = units::Plausible::AIR_TEMPERATURE;
            Some((p.min_si, p.max_si, "any air temperature"))
        }
        Quantity::Pressure | Quantity::Density => {
            let state = kind.altitude(altitude_m).and_then(|h| US1976.state(h)).ok()?;
            if state.geometric_altitude_m > 86_000.0 {
                return None;
            }
            Some(if quantity == Quantity::Pressure {
                (
                    0.5 * state.pressure_pa,
                    1.5 * state.pressure_pa,
                    "0.5 to 1.5 times the standard's pressure there",
                )
            } else {
                (
                    0.5 * state.density_kg_m3,
                    2.0 * state.density_kg_m3,
                    "0.5 to 2 times the standard's density there",
                )
            })
        }
        _ => None,
    }
}

/// Every value of every row within what the atmosphere can have there, else an error at
/// the first that is not, naming the unit its column would need to make it plausible.
fn check_plausible(
    kind: AltitudeKind,
    rows: &[SoundingRow],
    read: &[ReadRow],
    layout: &Layout,
    names: &[String],
    header: &Header,
) -> Result<(), LoadError> {
    let columns = [
        (layout.temperature, Quantity::Temperature),
        (layout.pressure, Quantity::Pressure),
        (layout.density, Quantity::Density),
        (layout.dew_point, Quantity::DewPoint),
    ];
    for (row, read_row) in rows.iter().zip(read) {
        let given = [Some(row.temperature_k), row.pressure_pa, row.density_kg_m3, row.dew_point_k];
        for ((index, quantity), value) in columns.iter().zip(given) {
            let (Some(index), Some(si)) = (*index, value) else { continue };
            let Some((min, max, what)) = band(*quantity, kind, row.altitude_m) else { continue };
            if (min..=max).contains(&si) {
                continue;
            }
            let cell = read_row.cells.get(index).map_or("", String::as_str);
            let Some(column) = header.column(index) else { continue };
            let si_unit = quantity.si();
            // A cell written as a bare number takes its column's unit: the likely mix-up
            // is a column whose heading names the wrong unit.
            let mut hint = None;
            if let Ok(reading) = units::parse(cell, column.unit.dimension(), column.unit) {
                let fits = column
                    .unit
                    .dimension()
                    .units()
                    .find(|u| *u != reading.unit && (min..=max).contains(&u.to_si(reading.value)));
                if let (false, Some(unit)) = (reading.explicit, fits) {
                    hint = Some((
                        column.unit.symbol(),
                        unit.symbol(),
                        format!("{}_{}", quantity.name(), unit.suffix()),
                    ));
                }
            }
            let why = Why::Implausible {
                value: si_unit.from_si(si),
                min: si_unit.from_si(min),
                max: si_unit.from_si(max),
                unit: si_unit.symbol(),
                what,
                hint,
            };
            let error = LoadError(Box::new(Located { line: read_row.line, column: None, value: None, why }));
            return Err(error.in_column(index, &names[index]).with_value(cell));
        }
    }
    Ok(())
}

/// Which value of a row an error is about, for the loaders that show the user's cell.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Field {
    Altitude,
    Temperature,
    Pressure,
    Density,
    DewPoint,
    RelativeHumidity,
    /// The dew point or the relative humidity, whichever the row gives.
    Humidity,
    /// The pressure, or the density it was derived from.
    PressureSource,
}

/// The row (counted from 0) and the value an error of a table is about.
fn error_field(error: &Error) -> Option<(usize, Option<Field>)> {
    let by_quantity = |quantity: &str| match quantity {
        Q_TEMPERATURE | Q_HUMID_TEMPERATURE => Some(Field::Temperature),
        Q_PRESSURE => Some(Field::PressureSource),
        Q_DENSITY => Some(Field::Density),
        Q_DEW_POINT => Some(Field::DewPoint),
        Q_RELATIVE_HUMIDITY => Some(Field::RelativeHumidity),
        _ => Some(Field::Altitude),
    };
    match *error {
        Error::RowNotFinite { row, quantity, .. } => Some((
            row,
            match quantity {
                Q_PRESSURE => Some(Field::Pressure),
                other => by_quantity(other),
            },
        )),
        Error::RowOutOfRange { row, quantity, .. } => Some((row, by_quantity(quantity))),
        Error::RowNotPositive { row, quantity, .. } => {
            Some((row, Some(if quantity == Q_DENSITY { Field::Density } else { Field::Pressure })))
        }
        Error::AltitudeNotIncreasing { row, .. } => Some((row, Some(Field::Altitude))),
        Error::RowTemperatureNotPositive { row, .. } => Some((row, Some(Field::Temperature))),
        Error::PressureNotDecreasing { row, .. } => Some((row, Some(Field::PressureSource))),
        Error::RelativeHumidityOutOfRange { row, .. } => Some((row, Some(Field::RelativeHumidity))),
        Error::DewPointAboveTemperature { row, .. } => Some((row, Some(Field::DewPoint))),
        Error::VapourPressureTooHigh { row, .. } => Some((row, Some(Field::Humidity))),
        Error::NotHydrostatic { row, .. } => Some((row + 1, Some(Field::PressureSource))),
        Error::RowColumns { row, .. } => Some((row, None)),
        _ => None,
    }
}

/// The model's `error` placed at its line, column and cell.
fn located(
    error: Error,
    header_line: usize,
    layout: &Layout,
    names: &[String],
    read: &[ReadRow],
) -> LoadError {
    let plain = |line| LoadError::model(line, error);
    let Some((row, field)) = error_field(&error) else {
        let line = read.last().map_or(header_line, |r| r.line);
        return plain(if matches!(error, Error::TooFewRows { .. }) { header_line } else { line });
    };
    let Some(read_row) = read.get(row) else {
        return plain(header_line);
    };
    let given =
        |index: Option<usize>| index.filter(|&i| read_row.cells.get(i).is_some_and(|c| !c.is_empty()));
    let index = match field {
        None => None,
        Some(Field::Altitude) => layout.altitude,
        Some(Field::Temperature) => layout.temperature,
        Some(Field::Pressure) => layout.pressure,
        Some(Field::Density) => layout.density,
        Some(Field::DewPoint) => layout.dew_point,
        Some(Field::RelativeHumidity) => layout.relative_humidity,
        Some(Field::Humidity) => given(layout.dew_point).or(given(layout.relative_humidity)),
        Some(Field::PressureSource) => given(layout.pressure).or(given(layout.density)),
    };
    let mut out = plain(read_row.line);
    if let Some(index) = index {
        out = out.in_column(index, names.get(index).map_or("", String::as_str));
        if let Some(cell) = read_row.cells.get(index).filter(|c| !c.is_empty()) {
            out = out.with_value(cell);
        }
    }
    out
}

/// The shortest decimal that reads back to `value` exactly; exponent form for very large
/// or small magnitudes.
fn exact(value: f64) -> String {
    let magnitude = value.abs();
    if magnitude != 0.0 && !(1e-3..1e7).contains(&magnitude) {
        format!("{value:e}")
    } else {
        format!("{value}")
    }
}

/// `rows` of `kind` altitudes as CSV text in SI units (what [`parse_csv`] reads back to
/// the same bits): an altitude and a temperature column, and a pressure, density, dew
/// point or relative humidity column where any row gives one.
pub fn rows_to_csv(kind: AltitudeKind, rows: &[SoundingRow]) -> String {
    type Get = fn(&SoundingRow) -> Option<f64>;
    let altitude = match kind {
        AltitudeKind::Geometric => "geometric_altitude_m",
        AltitudeKind::Geopotential => "geopotential_altitude_m",
    };
    let all: [(&str, Get); 6] = [
        (altitude, |r| Some(r.altitude_m)),
        ("temperature_K", |r| Some(r.temperature_k)),
        ("pressure_Pa", |r| r.pressure_pa),
        ("density_kg_m3", |r| r.density_kg_m3),
        ("dew_point_K", |r| r.dew_point_k),
        ("relative_humidity_percent", |r| r.relative_humidity_percent),
    ];
    let used: Vec<(&str, Get)> =
        all.into_iter().filter(|(_, get)| rows.iter().any(|r| get(r).is_some())).collect();
    let mut out = String::new();
    let names: Vec<&str> = used.iter().map(|(name, _)| *name).collect();
    out.push_str(&names.join(","));
    out.push('\n');
    for row in rows {
        let cells: Vec<String> =
            used.iter().map(|(_, get)| get(row).map(exact).unwrap_or_default()).collect();
        // Writing to a String cannot fail.
        let _ = writeln!(out, "{}", cells.join(","));
    }
    out
}

/// A table's rows as CSV text; see [`rows_to_csv`].
pub fn to_csv<S: AsRef<[SoundingLevel]>>(table: &Tabulated<S>) -> String {
    let rows: Vec<SoundingRow> = table.rows().copied().collect();
    rows_to_csv(table.kind(), &rows)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn error_fields_name_the_row_and_value() {
        let e = Error::NotHydrostatic { row: 3, ratio: 3.3, min: 0.5, max: 2.0 };
        assert_eq!(error_field(&e), Some((4, Some(Field::PressureSource))));
        let e = Error::RowNotFinite { row: 1, quantity: Q_DEW_POINT, value: f64::NAN };
        assert_eq!(error_field(&e), Some((1, Some(Field::DewPoint))));
    }

    /// Common practice, no source: a text that is no table (here a header of 100 000
    /// commas, which the C library and the web module are handed whole) is refused at
    /// its long line, before its cells are collected.
    #[test]
    fn a_long_line_is_refused_with_its_number() {
        let text =
            alloc::format!("# wide\ngeometric_altitude_m,temperature_K,pressure_Pa{}\n", ",".repeat(100_000));
        let e = read_csv(&text, &Options::default()).unwrap_err();
        assert_eq!(e.line(), 2);
        assert!(e.to_string().contains("longer than 65536 bytes"), "{e}");
        let winds =
            alloc::format!("altitude_m,wind_speed_kt,wind_direction_deg\n0,1,2\n{}", "9".repeat(70_000));
        assert_eq!(read_winds_csv(&winds, &Options::default()).unwrap_err().line(), 3);
    }
}
