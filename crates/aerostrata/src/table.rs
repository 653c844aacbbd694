//! Reading tables of numbers (soundings, flight logs, lists of altitudes): the one reader
//! of column headings and cells that every door uses, so that a file means the same
//! thing to the command line, the web page and a program.
//!
//! A heading names a quantity of the catalogue with or without a unit, in any of the
//! spellings [`Quantity::from_column`] reads (`altitude_ft`, `altitude (ft)`,
//! `Altitude [m]`); a heading the reader does not take is kept out of the computation
//! (the door warns about it). A cell is a number, optionally with a unit of its own
//! (`35000ft`); a bare number is in its column's unit. Cells are separated by commas, or
//! by semicolons or tabs where the header line holds no comma; a UTF-8 byte-order mark
//! and double quotes around a cell are dropped. No allocation: a header holds at most
//! [`MAX_COLUMNS`] columns.

use core::fmt;

use crate::quantity::{self, ColumnError, Quantity};
use crate::units::{self, Reading, Unit, UnitError};

/// The most columns a table may have.
pub const MAX_COLUMNS: usize = 64;

/// The longest line a table may have, in bytes (without its end): far beyond any header
/// or row of numbers, and small enough that a text that is no table (one line of a
/// binary, or of 200 MB of commas) is refused after this much rather than held whole.
pub const MAX_LINE_BYTES: usize = 64 * 1024;

/// A column the reader takes: its quantity and the unit of its bare numbers.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Column {
    /// The quantity the heading names.
    pub quantity: Quantity,
    /// The unit of the column's bare numbers: the heading's, or the reader's default.
    pub unit: &'static Unit,
    /// Whether the heading named the unit.
    pub explicit: bool,
}

/// The columns of a table, read from its header line.
#[derive(Debug, Clone, PartialEq)]
pub struct Header {
    delimiter: char,
    columns: [Option<Column>; MAX_COLUMNS],
    count: usize,
}

/// Why a header line cannot be read. Column indexes count from 0.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum HeaderError<'a> {
    /// More than [`MAX_COLUMNS`] columns.
    TooManyColumns {
        /// How many the line has (counted up to one past the limit).
        count: usize,
    },
    /// A heading names a quantity the reader takes, with a unit of another dimension or
    /// an unknown unit.
    Unit {
        /// The column.
        index: usize,
        /// The heading as written.
        heading: &'a str,
        /// Why (the quantity and the unit as written).
        error: ColumnError<'a>,
    },
    /// Two columns name the same quantity.
    Duplicate {
        /// The quantity.
        quantity: Quantity,
        /// The first column naming it.
        first: usize,
        /// The second.
        second: usize,
    },
}

/// Why a row cannot be read. Column indexes count from 0.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum CellError<'a> {
    /// The row has another number of cells than the header has columns.
    Count {
        /// Columns of the header.
        expected: usize,
        /// Cells of the row (counted up to one past the header's).
        found: usize,
    },
    /// A cell of a column the reader takes is not a number of its quantity.
    Value {
        /// The column.
        index: usize,
        /// The cell as written.
        text: &'a str,
        /// Why.
        error: UnitError<'a>,
    },
}

/// A line longer than [`MAX_LINE_BYTES`] (its message leaves the line's number to the
/// door, which names the file too).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LineTooLong<'a> {
    /// The line's number, from 1.
    pub line: usize,
    /// Its text (at least its start).
    pub start: &'a str,
}

/// The data lines of `text`: each line that is neither blank nor a `#` comment, trimmed,
/// with its number from 1 (as an editor counts them). The one rule of lines for every
/// door: the command line reads its files through the same [`data_line`] and bound.
///
/// # Errors
/// [`LineTooLong`] for a line longer than [`MAX_LINE_BYTES`]; read no further after it.
pub fn data_lines(text: &str) -> impl Iterator<Item = Result<(usize, &str), LineTooLong<'_>>> {
    text.lines().enumerate().filter_map(|(index, line)| {
        if line.len() > MAX_LINE_BYTES {
            return Some(Err(LineTooLong { line: index + 1, start: line }));
        }
        data_line(line).map(|text| Ok((index + 1, text)))
    })
}

/// The line's text, trimmed, if it holds data: not blank and not a `#` comment (a UTF-8
/// byte-order mark and a carriage return dropped first).
pub fn data_line(line: &str) -> Option<&str> {
    let text = clean(line).trim();
    (!text.is_empty() && !text.starts_with('#')).then_some(text)
}

/// The line without a UTF-8 byte-order mark and a trailing carriage return.
pub fn clean(line: &str) -> &str {
    line.strip_prefix('\u{feff}').unwrap_or(line).trim_end_matches(['\r', '\n'])
}

/// The cell separator of a header line: a comma, or a semicolon or tab where it holds no
/// comma.
pub fn delimiter_of(header: &str) -> char {
    if header.contains(',') {
        ','
    } else if header.contains(';') {
        ';'
    } else if header.contains('\t') {
        '\t'
    } else {
        ','
    }
}

/// The cells of `line`, trimmed, with surrounding double quotes dropped.
pub fn cells(line: &str, delimiter: char) -> impl Iterator<Item = &str> {
    Split { rest: Some(clean(line)), delimiter }.map(|cell| {
        let cell = cell.trim();
        cell.strip_prefix('"').and_then(|c| c.strip_suffix('"')).map_or(cell, str::trim)
    })
}

/// `str::split` by one character, searching bytes for an ASCII delimiter (the comma,
/// semicolon or tab of every table): the same pieces, without a char searcher set up for
/// every row.
struct Split<'a> {
    rest: Option<&'a str>,
    delimiter: char,
}

impl<'a> Iterator for Split<'a> {
    type Item = &'a str;

    fn next(&mut self) -> Option<&'a str> {
        let rest = self.rest?;
        let at = match u8::try_from(self.delimiter) {
            Ok(byte) if byte.is_ascii() => rest.bytes().position(|b| b == byte),
            _ => rest.find(self.delimiter),
        };
        match at {
            Some(at) => {
                self.rest = rest.get(at + self.delimiter.len_utf8()..);
                rest.get(..at)
            }
            None => {
                self.rest = None;
                Some(rest)
            }
        }
    }
}

/// Whether `line` is a header rather than a row: its first cell does not start like a
/// number (an optional sign, then a digit or a point), and not every cell is a number
/// (`NaN` and `inf` start like words, but mean to be numbers: a row, refused as such).
pub fn is_header(line: &str) -> bool {
    let delimiter = delimiter_of(clean(line));
    let first = cells(line, delimiter).next().unwrap_or("");
    let unsigned = first.strip_prefix(['+', '-']).unwrap_or(first);
    !first.is_empty()
        && !unsigned.starts_with(|c: char| c.is_ascii_digit() || c == '.')
        && !cells(line, delimiter).all(|cell| cell.parse::<f64>().is_ok())
}

/// A heading's quantity and unit: [`Quantity::from_column`], and a heading `speed`
/// (`speed_m_s`, `Speed (kt)`) read as the velocity, the catalogue's name for a
/// flight's speed, which a file giving the speed with its flight-path angle and heading
/// may well call speed. A heading the catalogue knows (`speed_of_sound`) stays its own.
///
/// # Errors
/// As [`Quantity::from_column`].
pub fn heading(cell: &str) -> Result<quantity::Column, ColumnError<'_>> {
    match Quantity::from_column(cell) {
        Err(ColumnError::Unknown) => speed(cell.trim()).unwrap_or(Err(ColumnError::Unknown)),
        read => read,
    }
}

fn speed(cell: &str) -> Option<Result<quantity::Column, ColumnError<'_>>> {
    let velocity = Quantity::Velocity;
    let rest = cell.get(..5).filter(|head| head.eq_ignore_ascii_case("speed")).and(cell.get(5..))?;
    if rest.is_empty() {
        return Some(Ok(quantity::Column { quantity: velocity, unit: None }));
    }
    let unit = match rest.strip_prefix(['_', ' ']) {
        Some(unit) if !unit.trim_start().starts_with(['(', '[']) => unit,
        _ => {
            let rest = rest.trim_start();
            let inner = |open, close| rest.strip_prefix(open).and_then(|r: &str| r.strip_suffix(close));
            inner('(', ')').or_else(|| inner('[', ']'))?
        }
    }
    .trim();
    Some(match Unit::find(unit, velocity.si().dimension()) {
        Some(unit) => Ok(quantity::Column { quantity: velocity, unit: Some(unit) }),
        None => Err(ColumnError::Unit { quantity: velocity, unit }),
    })
}

impl Header {
    /// Reads a header line: each heading that names a quantity `accepts` takes is a
    /// column, with the heading's unit or else `default_unit(quantity)`; the others are
    /// kept out (see [`Header::ignored`]).
    ///
    /// ```
    /// use aerostrata::table::Header;
    /// use aerostrata::Quantity;
    /// let flight = [Quantity::Time, Quantity::Altitude, Quantity::Velocity];
    /// let header = Header::read("time_s;Altitude [ft];phase;velocity (kt)", |q| flight.contains(&q), |q| q.si())?;
    /// assert_eq!(header.position(Quantity::Altitude), Some(1));
    /// assert_eq!(header.ignored().collect::<Vec<_>>(), [2]);
    /// let mut values = [None; 4];
    /// header.read_row("1.5;3280.84;x;100", &mut values)?;
    /// assert_eq!(values[1], Some(3280.84 * 0.3048));
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    ///
    /// # Errors
    /// [`HeaderError`]: too many columns, a taken quantity with a wrong unit, a quantity
    /// named twice.
    pub fn read<'a>(
        line: &'a str,
        accepts: impl Fn(Quantity) -> bool,
        default_unit: impl Fn(Quantity) -> &'static Unit,
    ) -> Result<Header, HeaderError<'a>> {
        let line = clean(line);
        let delimiter = delimiter_of(line);
        let mut header = Header { delimiter, columns: [None; MAX_COLUMNS], count: 0 };
        for (index, heading) in cells(line, delimiter).enumerate() {
            if index >= MAX_COLUMNS {
                return Err(HeaderError::TooManyColumns { count: index + 1 });
            }
            header.count = index + 1;
            let column = match self::heading(heading) {
                Ok(read) if accepts(read.quantity) => Column {
                    quantity: read.quantity,
                    unit: read.unit.unwrap_or_else(|| default_unit(read.quantity)),
                    explicit: read.unit.is_some(),
                },
                Err(error @ ColumnError::Unit { quantity, .. }) if accepts(quantity) => {
                    return Err(HeaderError::Unit { index, heading, error });
                }
                _ => continue,
            };
            if let Some(first) = header.position(column.quantity) {
                return Err(HeaderError::Duplicate { quantity: column.quantity, first, second: index });
            }
            if let Some(slot) = header.columns.get_mut(index) {
                *slot = Some(column);
            }
        }
        Ok(header)
    }

    /// The header of a table without one: `quantities` in order (at most
    /// [`MAX_COLUMNS`]), each in `default_unit(quantity)`, cells separated as in
    /// `first_row`.
    pub fn implicit(
        quantities: &[Quantity],
        first_row: &str,
        default_unit: impl Fn(Quantity) -> &'static Unit,
    ) -> Header {
        let mut header =
            Header { delimiter: delimiter_of(clean(first_row)), columns: [None; MAX_COLUMNS], count: 0 };
        for (slot, &quantity) in header.columns.iter_mut().zip(quantities) {
            *slot = Some(Column { quantity, unit: default_unit(quantity), explicit: false });
            header.count += 1;
        }
        header
    }

    /// How many columns the header line has (taken or not).
    pub fn count(&self) -> usize {
        self.count
    }

    /// The column at `index`, if the reader takes it.
    pub fn column(&self, index: usize) -> Option<Column> {
        self.columns.get(index).copied().flatten()
    }

    /// Where `quantity` is, if a column names it.
    pub fn position(&self, quantity: Quantity) -> Option<usize> {
        // Only the line's columns (a reader asks for every row: not all MAX_COLUMNS slots).
        let columns = self.columns.get(..self.count).unwrap_or(&self.columns);
        columns.iter().position(|c| c.is_some_and(|c| c.quantity == quantity))
    }

    /// The indexes of the columns the reader does not take, for a warning.
    pub fn ignored(&self) -> impl Iterator<Item = usize> + '_ {
        (0..self.count).filter(|&i| self.column(i).is_none())
    }

    /// The cell separator.
    pub fn delimiter(&self) -> char {
        self.delimiter
    }

    /// Reads a row into `out` (at least [`Header::count`] long): `out[i]` is column i's
    /// value in SI, `None` for an empty cell or a column the reader does not take.
    ///
    /// # Errors
    /// [`CellError::Count`] for a row of another width than the header, and
    /// [`CellError::Value`] for a taken cell that is not a number of its quantity.
    pub fn read_row<'a>(&self, line: &'a str, out: &mut [Option<f64>]) -> Result<(), CellError<'a>> {
        let mut found = 0;
        for (index, text) in cells(line, self.delimiter).enumerate() {
            found = index + 1;
            if index >= self.count {
                break;
            }
            let value = match self.column(index) {
                Some(column) if !text.is_empty() => {
                    Some(read_cell(text, column.unit).map(|r| r.si()).map_err(|error| CellError::Value {
                        index,
                        text,
                        error,
                    })?)
                }
                _ => None,
            };
            if let Some(slot) = out.get_mut(index) {
                *slot = value;
            }
        }
        if found != self.count {
            return Err(CellError::Count { expected: self.count, found });
        }
        Ok(())
    }
}

fn read_cell<'a>(text: &'a str, unit: &'static Unit) -> Result<Reading, UnitError<'a>> {
    units::parse(text, unit.dimension(), unit)
}

impl fmt::Display for HeaderError<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            HeaderError::TooManyColumns { count } => {
                write!(f, "the header has {count} or more columns; a table has at most {MAX_COLUMNS}")
            }
            HeaderError::Unit { index, heading, error } => {
                write!(f, "column {} {}: {error}", index + 1, units::Quoted(heading))
            }
            HeaderError::Duplicate { quantity, first, second } => write!(
                f,
                "columns {} and {} both give the {}; keep one",
                first + 1,
                second + 1,
                quantity.info().label
            ),
        }
    }
}

impl fmt::Display for CellError<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            CellError::Count { expected, found } => {
                write!(f, "{found} cells, but the header has {expected} columns")
            }
            CellError::Value { index, error, .. } => write!(f, "column {}: {error}", index + 1),
        }
    }
}

/// A header without a column of any of `.0` (alternatives, the usual first), for a
/// message: "the header needs a column altitude or geometric_altitude (a heading such as
/// altitude_m or 'altitude (m)')".
pub struct MissingColumn<'a>(pub &'a [Quantity]);

impl fmt::Display for MissingColumn<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str("the header needs a column ")?;
        for (i, q) in self.0.iter().enumerate() {
            f.write_str(if i == 0 { "" } else { " or " })?;
            f.write_str(q.name())?;
        }
        if let Some(q) = self.0.first() {
            let (name, si) = (q.name(), q.si());
            write!(f, " (a heading such as {name}_{} or '{name} ({})')", si.suffix(), si.symbol())?;
        }
        Ok(())
    }
}

impl fmt::Display for LineTooLong<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "longer than {MAX_LINE_BYTES} bytes, the longest line read (it starts {}); is this a table of \
             numbers, one row per line?",
            units::Quoted(self.start)
        )
    }
}

impl core::error::Error for LineTooLong<'_> {}

impl core::error::Error for HeaderError<'_> {}

impl core::error::Error for CellError<'_> {}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::{FOOT, KELVIN};

    const FLIGHT: [Quantity; 3] = [Quantity::Time, Quantity::Altitude, Quantity::Velocity];

    fn flight_header(line: &str) -> Result<Header, HeaderError<'_>> {
        Header::read(line, |q| FLIGHT.contains(&q), |q| q.si())
    }

    #[test]
    fn headings_in_every_spelling_and_unknown_ones_kept_out() {
        let header =
            flight_header("\u{feff}\"time (s)\",altitude_ft,Velocity [m/s],wind_speed_kt\r").unwrap();
        assert_eq!(header.count(), 4);
        assert_eq!(
            header.column(1),
            Some(Column { quantity: Quantity::Altitude, unit: &FOOT, explicit: true })
        );
        assert_eq!(header.ignored().collect::<std::vec::Vec<_>>(), [3]);
        let mut row = [None; 4];
        header.read_row("1,1000,250,30", &mut row).unwrap();
        assert_eq!(row, [Some(1.0), Some(304.8), Some(250.0), None]);
        // A cell's own unit wins over the column's.
        header.read_row("1,1km,250kt,", &mut row).unwrap();
        assert_eq!(row[1], Some(1000.0));
        assert!((row[2].unwrap() - 250.0 * 1852.0 / 3600.0).abs() < 1e-12);
        // A header without units takes the reader's default.
        let header = Header::read(
            "altitude;temperature",
            |_| true,
            |q| if q.si() == &KELVIN { &KELVIN } else { &FOOT },
        )
        .unwrap();
        assert_eq!(header.delimiter(), ';');
        assert_eq!(header.column(0).unwrap().unit, &FOOT);
        assert!(!header.column(0).unwrap().explicit);
    }

    #[test]
    fn errors_name_the_column() {
        assert_eq!(
            flight_header("time,altitude (kg)").unwrap_err().to_string(),
            "column 2 'altitude (kg)': unknown unit 'kg' for the altitude; write m, km, ft, mi or nmi"
        );
        assert_eq!(
            flight_header("time_s,altitude_m,altitude_ft").unwrap_err().to_string(),
            "columns 2 and 3 both give the altitude; keep one"
        );
        let header = flight_header("time,altitude,velocity").unwrap();
        let mut row = [None; 3];
        assert_eq!(
            header.read_row("1,2", &mut row).unwrap_err().to_string(),
            "2 cells, but the header has 3 columns"
        );
        assert_eq!(
            header.read_row("1,2,3,4", &mut row).unwrap_err(),
            CellError::Count { expected: 3, found: 4 }
        );
        assert_eq!(
            header.read_row("1,abc,3", &mut row).unwrap_err().to_string(),
            "column 2: 'abc' is not a number"
        );
        assert_eq!(
            header.read_row("1,2degC,3", &mut row).unwrap_err().to_string(),
            "column 2: 'degC' is a unit of temperature, not of length; write m, km, ft, mi or nmi"
        );
        let wide = "q,".repeat(80);
        assert!(matches!(flight_header(&wide), Err(HeaderError::TooManyColumns { count: 65 })));
    }

    /// Common practice, no source: the byte splitter gives `str::split`'s pieces, empty
    /// ones and a delimiter outside ASCII included.
    #[test]
    fn cells_split_as_str_split_does() {
        for line in ["a,b,,c", ",", "", "x", "1;2;3", "a\tb", ",,a,", "é,ü,,ß", "a→b→c", "→"] {
            for delimiter in [',', ';', '\t', '→'] {
                let ours: std::vec::Vec<&str> = Split { rest: Some(line), delimiter }.collect();
                let std: std::vec::Vec<&str> = line.split(delimiter).collect();
                assert_eq!(ours, std, "{line:?} by {delimiter:?}");
            }
        }
    }

    /// A table without a header reads as one naming its columns would.
    #[test]
    fn an_implicit_header_reads_as_a_written_one() {
        let implicit =
            Header::implicit(&FLIGHT, "1;2;3", |q| if q == Quantity::Altitude { &FOOT } else { q.si() });
        assert_eq!(implicit.delimiter(), ';');
        let written = Header::read("time;altitude (ft);velocity", |_| true, |q| q.si()).unwrap();
        let (mut a, mut b) = ([None; 3], [None; 3]);
        implicit.read_row("1;1000;3", &mut a).unwrap();
        written.read_row("1;1000;3", &mut b).unwrap();
        assert_eq!(a, b);
        assert_eq!(implicit.count(), 3);
        assert!(!implicit.column(1).unwrap().explicit);
    }

    #[test]
    fn headers_are_told_from_rows() {
        assert!(is_header("time_s,altitude_m"));
        assert!(is_header("\u{feff}Altitude [m]"));
        assert!(!is_header("0,1000"));
        assert!(!is_header("35000ft"));
        assert!(!is_header("-5,3"));
        assert!(!is_header(".5"));
        assert!(!is_header(""));
        // Words that are numbers make a row (refused as such by the cell reader).
        assert!(!is_header("NaN,0,0"));
        assert!(!is_header("inf;1"));
        assert!(is_header("NaN,altitude"));
    }

    /// Common practice, no source: blank lines and `#` comments are no data but count,
    /// so that a message names the line an editor shows; a line is bounded.
    #[test]
    fn data_lines_are_numbered_and_bounded() {
        let text = "\u{feff}# made by hand\r\ntime_s,altitude_m\r\n\n  1,2  \n#\n3,4";
        let lines: std::vec::Vec<_> = data_lines(text).collect();
        assert_eq!(lines, [Ok((2, "time_s,altitude_m")), Ok((4, "1,2")), Ok((6, "3,4"))]);
        let long = format!("a\n{}\nb", ",".repeat(MAX_LINE_BYTES + 1));
        let error = data_lines(&long).find_map(Result::err).unwrap();
        assert_eq!(error.line, 2);
        let message = error.to_string();
        assert!(message.starts_with("longer than 65536 bytes"), "{message}");
        assert!(message.contains("',,,,") && message.len() < 200, "{message}");
        // A line of exactly the bound is read.
        let exact = "1".repeat(MAX_LINE_BYTES);
        assert_eq!(data_lines(&exact).next(), Some(Ok((1, exact.as_str()))));
    }

    /// Common practice, no source: a flight's speed column is often headed `speed`.
    #[test]
    fn a_speed_heading_is_the_velocity() {
        use crate::units::KNOT;
        let velocity = |unit| Ok(quantity::Column { quantity: Quantity::Velocity, unit });
        assert_eq!(heading("speed"), velocity(None));
        assert_eq!(heading("Speed (kt)"), velocity(Some(&KNOT)));
        assert_eq!(heading("speed[kt]"), velocity(Some(&KNOT)));
        assert_eq!(heading("SPEED_kt"), velocity(Some(&KNOT)));
        assert_eq!(heading("speed_of_sound").map(|c| c.quantity), Ok(Quantity::SpeedOfSound));
        assert_eq!(heading("speed_kg"), Err(ColumnError::Unit { quantity: Quantity::Velocity, unit: "kg" }));
        assert_eq!(heading("speedy"), Err(ColumnError::Unknown));
        assert_eq!(heading("spee"), Err(ColumnError::Unknown));
        let header = flight_header("time,speed (kt),altitude").unwrap();
        assert_eq!(header.position(Quantity::Velocity), Some(1));
    }
}
