//! Soundings as CSV text (the `std` feature): reading, with errors that name the line,
//! the column and the value as written, and writing, with every value's shortest
//! decimal that reads back to the same f64.
//!
//! The format (docs/soundings.md): `#` comment lines and blank lines anywhere; one
//! header line naming each column as `<quantity>_<unit>`; then one row per line, cells
//! separated by commas, an empty cell meaning "not given". JSON goes through serde
//! instead: [`Tabulated`] serialises as its kind of altitude, its rows and its
//! behaviour beyond them, and deserialises through the same checks.
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

use std::boxed::Box;
use std::fmt::{self, Write as _};
use std::string::{String, ToString};
use std::vec::Vec;

use crate::altitude::AltitudeKind;
use crate::error::Error;
use crate::units::{fahrenheit_to_kelvin, CELSIUS_ZERO_K, FOOT_M, HPA_PA};

use super::rows::{
    SoundingLevel, SoundingRow, Q_DENSITY, Q_DEW_POINT, Q_HUMID_TEMPERATURE, Q_PRESSURE, Q_RELATIVE_HUMIDITY,
    Q_TEMPERATURE,
};
use super::table::Tabulated;

/// A sounding that could not be read: where (line, and column and cell where there is
/// one) and why.
#[derive(Debug, Clone, PartialEq)]
pub struct LoadError(Box<Located>);

#[derive(Debug, Clone, PartialEq)]
struct Located {
    line: usize,
    column: Option<(usize, String)>,
    value: Option<String>,
    message: String,
    error: Option<Error>,
}

impl LoadError {
    fn at(line: usize, message: impl Into<String>) -> Self {
        Self(Box::new(Located { line, column: None, value: None, message: message.into(), error: None }))
    }

    fn model(line: usize, error: Error) -> Self {
        let mut out = Self::at(line, error.to_string());
        out.0.error = Some(error);
        out
    }

    fn in_column(mut self, index: usize, name: &str) -> Self {
        self.0.column = Some((index + 1, name.to_string()));
        self
    }

    fn with_value(mut self, text: &str) -> Self {
        self.0.value = Some(text.to_string());
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

    /// The cell as written, where the problem has one.
    pub fn value(&self) -> Option<&str> {
        self.0.value.as_deref()
    }

    /// The model's own error, when the text was well formed but the table was not.
    pub fn model_error(&self) -> Option<&Error> {
        self.0.error.as_ref()
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
        write!(f, ": {}", located.message)
    }
}

impl std::error::Error for LoadError {
    fn source(&self) -> Option<&(dyn std::error::Error + 'static)> {
        self.0.error.as_ref().map(|e| e as &(dyn std::error::Error + 'static))
    }
}

/// What a column holds.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Quantity {
    Altitude(AltitudeKind),
    Temperature,
    Pressure,
    Density,
    DewPoint,
    RelativeHumidity,
}

/// The units a column may be written in, with their conversion to SI.
#[derive(Debug, Clone, Copy, PartialEq)]
enum Unit {
    Metre,
    Kilometre,
    Foot,
    Kelvin,
    Celsius,
    Fahrenheit,
    Pascal,
    Hectopascal,
    Kilopascal,
    KilogramPerCubicMetre,
    Percent,
}

impl Unit {
    fn to_si(self, value: f64) -> f64 {
        match self {
            Self::Metre | Self::Kelvin | Self::Pascal | Self::KilogramPerCubicMetre | Self::Percent => value,
            Self::Kilometre | Self::Kilopascal => value * 1_000.0,
            Self::Foot => value * FOOT_M,
            Self::Celsius => value + CELSIUS_ZERO_K,
            Self::Fahrenheit => fahrenheit_to_kelvin(value),
            Self::Hectopascal => value * HPA_PA,
        }
    }
}

/// Quantities by header prefix, with their units (header spelling, lower case) and the
/// list an error shows.
/// A quantity's header prefix, what it is, its units by spelling, and how errors list them.
type QuantitySpec = (&'static str, Quantity, &'static [(&'static str, Unit)], &'static str);

const QUANTITIES: [QuantitySpec; 7] = [
    (
        "geometric_altitude",
        Quantity::Altitude(AltitudeKind::Geometric),
        &[("m", Unit::Metre), ("km", Unit::Kilometre), ("ft", Unit::Foot)],
        "m, km, ft",
    ),
    (
        "geopotential_altitude",
        Quantity::Altitude(AltitudeKind::Geopotential),
        &[("m", Unit::Metre), ("km", Unit::Kilometre), ("ft", Unit::Foot)],
        "m, km, ft",
    ),
    (
        "temperature",
        Quantity::Temperature,
        &[("k", Unit::Kelvin), ("degc", Unit::Celsius), ("degf", Unit::Fahrenheit)],
        "K, degC, degF",
    ),
    (
        "pressure",
        Quantity::Pressure,
        &[
            ("pa", Unit::Pascal),
            ("hpa", Unit::Hectopascal),
            ("mbar", Unit::Hectopascal),
            ("kpa", Unit::Kilopascal),
        ],
        "Pa, hPa, mbar, kPa",
    ),
    ("density", Quantity::Density, &[("kg_m3", Unit::KilogramPerCubicMetre)], "kg_m3"),
    (
        "dew_point",
        Quantity::DewPoint,
        &[("k", Unit::Kelvin), ("degc", Unit::Celsius), ("degf", Unit::Fahrenheit)],
        "K, degC, degF",
    ),
    ("relative_humidity", Quantity::RelativeHumidity, &[("percent", Unit::Percent)], "percent"),
];

const KNOWN_COLUMNS: &str = "geometric_altitude_<m|km|ft> or geopotential_altitude_<m|km|ft>, \
     temperature_<K|degC|degF>, pressure_<Pa|hPa|mbar|kPa>, density_kg_m3, \
     dew_point_<K|degC|degF>, relative_humidity_percent";

#[derive(Debug, Clone)]
struct Column {
    name: String,
    quantity: Quantity,
    unit: Unit,
}

fn parse_column(line: usize, index: usize, name: &str) -> Result<Column, LoadError> {
    let lower = name.to_ascii_lowercase();
    let at = |message: String| LoadError::at(line, message).in_column(index, name);
    if lower == "altitude_m" || lower == "altitude_ft" || lower == "altitude_km" || lower == "height_m" {
        return Err(at("say which altitude: geometric_altitude_<unit> or geopotential_altitude_<unit> \
             (they differ by 1.2 km at 86 km)"
            .to_string()));
    }
    for (prefix, quantity, units, listed) in QUANTITIES {
        let Some(rest) = lower.strip_prefix(prefix).and_then(|rest| rest.strip_prefix('_')) else {
            continue;
        };
        return match units.iter().find(|(spelling, _)| *spelling == rest) {
            Some(&(_, unit)) => Ok(Column { name: name.to_string(), quantity, unit }),
            None => {
                let written = name.get(name.len() - rest.len()..).unwrap_or(rest);
                Err(at(format!("unit '{written}' is not one of {listed} for {prefix}")))
            }
        };
    }
    Err(at(format!("unknown column; the columns are {KNOWN_COLUMNS}")))
}

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

impl Layout {
    fn slot(&mut self, quantity: Quantity) -> &mut Option<usize> {
        match quantity {
            Quantity::Altitude(_) => &mut self.altitude,
            Quantity::Temperature => &mut self.temperature,
            Quantity::Pressure => &mut self.pressure,
            Quantity::Density => &mut self.density,
            Quantity::DewPoint => &mut self.dew_point,
            Quantity::RelativeHumidity => &mut self.relative_humidity,
        }
    }
}

/// Cells of a line: split at commas, trimmed, surrounding double quotes removed.
fn cells(text: &str) -> impl Iterator<Item = &str> {
    text.split(',').map(|cell| {
        let cell = cell.trim();
        cell.strip_prefix('"').and_then(|c| c.strip_suffix('"')).unwrap_or(cell).trim()
    })
}

/// A data row as read, kept for error messages.
struct ReadRow {
    line: usize,
    cells: Vec<String>,
}

/// Reads a sounding from CSV text.
///
/// # Errors
/// A [`LoadError`] naming the line (from 1), and where there is one the column (number
/// and header name) and the cell as written: no header; an unknown, duplicated or
/// missing column or unit (an altitude and a temperature column are required, and a
/// pressure or a density column); a line with a different number of cells than the
/// header; a cell that is not a number; a missing altitude or temperature; and every
/// error of [`Tabulated::from_rows_vec`], whose message it carries.
pub fn parse_csv(text: &str) -> Result<Tabulated<Vec<SoundingLevel>>, LoadError> {
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    let mut content = text
        .lines()
        .enumerate()
        .map(|(index, line)| (index + 1, line.trim()))
        .filter(|(_, line)| !line.is_empty() && !line.starts_with('#'));
    let Some((header_line, header)) = content.next() else {
        let last = text.lines().count().max(1);
        return Err(LoadError::at(
            last,
            "no header line: the first line that is not a comment must name the columns",
        ));
    };
    let mut columns = Vec::new();
    let mut layout = Layout::default();
    for (index, name) in cells(header).enumerate() {
        let column = parse_column(header_line, index, name)?;
        let slot = layout.slot(column.quantity);
        if let Some(first) = *slot {
            return Err(LoadError::at(
                header_line,
                format!("a second column of this quantity (the first is column {})", first + 1),
            )
            .in_column(index, name));
        }
        *slot = Some(index);
        columns.push(column);
    }
    let Some(altitude_index) = layout.altitude else {
        return Err(LoadError::at(header_line, "the header needs an altitude column: geometric_altitude_<m|km|ft> or geopotential_altitude_<m|km|ft>"));
    };
    let kind = match columns[altitude_index].quantity {
        Quantity::Altitude(kind) => kind,
        _ => AltitudeKind::Geometric,
    };
    let Some(temperature_index) = layout.temperature else {
        return Err(LoadError::at(
            header_line,
            "the header needs a temperature column: temperature_<K|degC|degF>",
        ));
    };
    if layout.pressure.is_none() && layout.density.is_none() {
        return Err(LoadError::at(
            header_line,
            "the header needs a pressure_<Pa|hPa|mbar|kPa> or a density_kg_m3 column",
        ));
    }

    let mut rows = Vec::new();
    let mut read = Vec::new();
    for (line, text) in content {
        let texts: Vec<String> = cells(text).map(str::to_string).collect();
        if texts.len() != columns.len() {
            return Err(LoadError::at(
                line,
                format!(
                    "{} cells, but the header on line {header_line} has {} columns",
                    texts.len(),
                    columns.len()
                ),
            ));
        }
        let mut values = [None; 6];
        for (index, (cell, column)) in texts.iter().zip(&columns).enumerate() {
            if cell.is_empty() {
                continue;
            }
            let number: f64 = cell.parse().map_err(|_| {
                LoadError::at(line, "not a number").in_column(index, &column.name).with_value(cell)
            })?;
            let slot = match column.quantity {
                Quantity::Altitude(_) => 0,
                Quantity::Temperature => 1,
                Quantity::Pressure => 2,
                Quantity::Density => 3,
                Quantity::DewPoint => 4,
                Quantity::RelativeHumidity => 5,
            };
            values[slot] = Some(column.unit.to_si(number));
        }
        let required = |slot: usize, index: usize| {
            values[slot].ok_or_else(|| {
                LoadError::at(line, "a value is required on every row").in_column(index, &columns[index].name)
            })
        };
        rows.push(SoundingRow {
            altitude_m: required(0, altitude_index)?,
            temperature_k: required(1, temperature_index)?,
            pressure_pa: values[2],
            density_kg_m3: values[3],
            dew_point_k: values[4],
            relative_humidity_percent: values[5],
        });
        read.push(ReadRow { line, cells: texts });
    }
    Tabulated::from_rows_vec(kind, &rows)
        .map_err(|error| located(error, header_line, &layout, &columns, &read))
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
    columns: &[Column],
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
        out = out.in_column(index, &columns[index].name);
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
}
