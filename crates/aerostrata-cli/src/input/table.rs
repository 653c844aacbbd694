//! Tables the tool reads (flight files, `eval`'s altitudes, `altitude`'s pressures, layer
//! files), one line at a time through the core's one reader of headings and cells
//! ([`aerostrata::table`]): a header in any spelling (`altitude (ft)`, `altitude_ft`,
//! `Altitude [m]`) picks the columns and their units, a heading's unit winning over
//! `--units`, a heading without one read in the `--units` system; a column the command
//! does not read is kept out with one warning line; without a header the columns are the
//! command's own, in order, in the `--units` system. A cell may carry its own unit
//! (`35000ft`). Errors name the file, the line and the column.

use std::io::BufRead;

use aerostrata::table::{self, CellError, Header};
use aerostrata::units::Unit;
use aerostrata::Quantity;

use crate::failure::Failure;
use crate::input::lines::DataLines;
use crate::units::UnitSystem;

/// A header's check: `Err` with what the command misses.
pub type Check = Box<dyn Fn(&Header) -> Result<(), String>>;

/// What a command reads from a table.
pub struct Columns {
    /// The quantities it takes from a header.
    pub accepts: &'static [Quantity],
    /// The columns of a table without a header, in order.
    pub implicit: &'static [Quantity],
    /// A header's check (the columns the command needs); the message says what is missing.
    pub check: Check,
}

/// The unit of a heading without one: `units`' unit, or SI for `None` (model files).
fn default_unit(units: Option<UnitSystem>, quantity: Quantity) -> &'static Unit {
    units.map_or(quantity.si(), |u| u.unit(quantity))
}

/// Reads a table's rows, values in SI.
pub struct TableReader<R> {
    lines: DataLines<R>,
    source: String,
    columns: Columns,
    units: Option<UnitSystem>,
    header: Option<Header>,
    headings: Vec<String>,
    implicit: bool,
    values: Vec<Option<f64>>,
    line: usize,
    /// The last line's text (a buffer reused from line to line).
    text: String,
}

impl<R: BufRead> TableReader<R> {
    /// A reader of `input`, named `source` in messages (a file name, or `stdin`);
    /// headings without a unit and headerless columns are in `units` (SI for `None`).
    pub fn new(input: R, source: impl Into<String>, columns: Columns, units: Option<UnitSystem>) -> Self {
        TableReader {
            lines: DataLines::new(input),
            source: source.into(),
            columns,
            units,
            header: None,
            headings: Vec::new(),
            implicit: false,
            values: Vec::new(),
            line: 0,
            text: String::new(),
        }
    }

    /// The underlying input.
    pub fn input_mut(&mut self) -> &mut R {
        self.lines.input_mut()
    }

    /// A bad input at the last line read.
    pub fn at_line(&self, message: impl std::fmt::Display) -> Failure {
        Failure::Input(format!("{}: line {}: {message}", self.source, self.line))
    }

    /// A bad input in the last line's cell of `quantity`.
    pub fn at_cell(&self, quantity: Quantity, message: impl std::fmt::Display) -> Failure {
        match self.header.as_ref().and_then(|h| h.position(quantity)) {
            Some(index) => self.at_column(index, message),
            None => self.at_line(message),
        }
    }

    /// A bad input in the last line's cell at `index` (from 0).
    pub fn at_column(&self, index: usize, message: impl std::fmt::Display) -> Failure {
        Failure::Input(format!(
            "{}: line {}, column {} ({}): {message}",
            self.source,
            self.line,
            index + 1,
            self.headings.get(index).map_or("", String::as_str)
        ))
    }

    /// The unit of the column of `quantity` (its heading's, or the default).
    pub fn unit_of(&self, quantity: Quantity) -> &'static Unit {
        let column = self.header.as_ref().and_then(|h| h.position(quantity).and_then(|i| h.column(i)));
        column.map_or_else(|| default_unit(self.units, quantity), |c| c.unit)
    }

    /// The next row's value of each quantity taken (SI; `None` for an empty cell or a
    /// quantity the table lacks), or `None` at the end.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the file, the line and the column: a bad header, a row
    /// of the wrong width, a cell that is not a number of its column's quantity.
    pub fn next_row(&mut self) -> Result<Option<Row<'_>>, Failure> {
        loop {
            let source = &self.source;
            let Some((number, line)) = self.lines.next_line().map_err(|e| e.within(source))? else {
                return Ok(None);
            };
            // Copied into a buffer reused from line to line (the borrow of `lines` ends here).
            let mut text = std::mem::take(&mut self.text);
            text.clear();
            text.push_str(line);
            self.line = number;
            if self.header.is_none() {
                if table::is_header(&text) {
                    self.read_header(&text)?;
                    self.text = text;
                    continue;
                }
                self.implicit_header(&text)?;
            }
            let Some(header) = &self.header else { return Ok(None) };
            self.values.clear();
            self.values.resize(header.count(), None);
            let failure = header.read_row(&text, &mut self.values).err().map(|e| self.cell_error(&e));
            self.text = text;
            if let Some(failure) = failure {
                return Err(failure);
            }
            let Some(header) = &self.header else { return Ok(None) };
            return Ok(Some(Row { header, values: &self.values }));
        }
    }

    fn read_header(&mut self, text: &str) -> Result<(), Failure> {
        let units = self.units;
        let accepts = self.columns.accepts;
        let header = Header::read(text, |q| accepts.contains(&q), |q| default_unit(units, q))
            .map_err(|e| self.at_line(e))?;
        if header.ignored().count() == header.count() {
            let names: Vec<&str> = accepts.iter().map(|q| q.name()).collect();
            return Err(self.at_line(format!(
                "{} is neither a row of numbers nor a header naming {}",
                aerostrata::units::Quoted(text),
                names.join(", ")
            )));
        }
        (self.columns.check)(&header).map_err(|m| self.at_line(m))?;
        self.headings = table::cells(text, header.delimiter()).map(str::to_owned).collect();
        let ignored: Vec<String> = header
            .ignored()
            .map(|i| format!("{} '{}'", i + 1, self.headings.get(i).map_or("", String::as_str)))
            .collect();
        if !ignored.is_empty() {
            let taken: Vec<&str> = self.columns.accepts.iter().map(|q| q.name()).collect();
            eprintln!(
                "aerostrata: {}: line {}: column{} {} not read (the columns read here: {})",
                self.source,
                self.line,
                if ignored.len() == 1 { "" } else { "s" },
                ignored.join(", "),
                taken.join(", ")
            );
        }
        self.header = Some(header);
        Ok(())
    }

    /// A table without a header: the command's own columns, in order.
    fn implicit_header(&mut self, first_row: &str) -> Result<(), Failure> {
        let units = self.units;
        let header = Header::implicit(self.columns.implicit, first_row, |q| default_unit(units, q));
        self.headings =
            self.columns.implicit.iter().map(|q| crate::units::column(*q, default_unit(units, *q))).collect();
        self.header = Some(header);
        self.implicit = true;
        Ok(())
    }

    fn cell_error(&self, error: &CellError) -> Failure {
        match *error {
            CellError::Count { expected, found } if self.implicit => self.at_line(format!(
                "expected {expected} value{} ({}), got {found}",
                if expected == 1 { "" } else { "s" },
                self.headings.join(",")
            )),
            CellError::Value { index, error, .. } => Failure::Input(format!(
                "{}: line {}, column {} ({}): {error}",
                self.source,
                self.line,
                index + 1,
                self.headings.get(index).map_or("", String::as_str)
            )),
            ref other => self.at_line(other),
        }
    }
}

/// One row of a table.
pub struct Row<'a> {
    header: &'a Header,
    values: &'a [Option<f64>],
}

impl Row<'_> {
    /// The value of `quantity`, SI; `None` for an empty cell or a quantity the table lacks.
    pub fn get(&self, quantity: Quantity) -> Option<f64> {
        self.header.position(quantity).and_then(|i| self.values.get(i).copied().flatten())
    }

    /// The table's header.
    pub fn header(&self) -> &Header {
        self.header
    }

    /// Each column's value, SI, by the header's column index.
    pub fn values(&self) -> &[Option<f64>] {
        self.values
    }
}

/// A check for [`Columns::check`]: the header has a column of each of `groups`, each a
/// list of quantities of which exactly one must be there.
pub fn needs(header: &Header, groups: &[&[Quantity]]) -> Result<(), String> {
    for group in groups {
        let present: Vec<&Quantity> = group.iter().filter(|q| header.position(**q).is_some()).collect();
        match present.len() {
            1 => {}
            0 => return Err(table::MissingColumn(group).to_string()),
            _ => {
                let present: Vec<&str> = present.iter().map(|q| q.name()).collect();
                return Err(format!("the header has columns {}: keep one", present.join(" and ")));
            }
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    const FLIGHT: [Quantity; 3] = [Quantity::Time, Quantity::Altitude, Quantity::Velocity];

    fn reader(text: &str, units: UnitSystem) -> TableReader<&[u8]> {
        let columns = Columns {
            accepts: &FLIGHT,
            implicit: &FLIGHT,
            check: Box::new(|h| needs(h, &[&[Quantity::Time], &[Quantity::Altitude], &[Quantity::Velocity]])),
        };
        TableReader::new(text.as_bytes(), "f.csv", columns, Some(units))
    }

    fn rows(text: &str, units: UnitSystem) -> Result<Vec<[Option<f64>; 3]>, String> {
        let mut reader = reader(text, units);
        let mut out = Vec::new();
        loop {
            match reader.next_row() {
                Ok(Some(row)) => out.push(FLIGHT.map(|q| row.get(q))),
                Ok(None) => return Ok(out),
                Err(Failure::Input(m)) => return Err(m),
                Err(e) => panic!("{e:?}"),
            }
        }
    }

    #[test]
    fn headers_in_every_spelling_give_the_same_rows() {
        let expected = [[Some(1.0), Some(304.8), Some(2.0)]];
        for text in [
            "time_s,altitude_ft,velocity_m_s\n1,1000,2\n",
            "time (s);altitude (ft);velocity (m/s)\n1;1000;2\n",
            "Time [s],Velocity [m/s],Altitude [ft],phase\n1,2,1000,boost\n",
            "# headerless, in the --units system\n1,1000,6.561679790026247\n",
        ] {
            let got = rows(text, UnitSystem::Us).unwrap();
            assert!(
                (got[0][1].unwrap() - 304.8).abs() < 1e-9 && got[0][0] == expected[0][0],
                "{text}: {got:?}"
            );
        }
        // A heading's unit wins over --units; a heading without one takes it.
        assert_eq!(
            rows("time,altitude_m,velocity\n0,1000,10\n", UnitSystem::Us).unwrap()[0][1],
            Some(1000.0)
        );
        assert_eq!(rows("time,altitude,velocity\n0,1000,0\n", UnitSystem::Us).unwrap()[0][1], Some(304.8));
        // A cell's own unit wins over its column's.
        assert_eq!(rows("0,1km,0\n", UnitSystem::Si).unwrap()[0][1], Some(1000.0));
    }

    #[test]
    fn errors_name_the_file_the_line_and_the_column() {
        let error = |text: &str| rows(text, UnitSystem::Si).unwrap_err();
        assert_eq!(
            error("# x\n0,0,0\n1,abc,3\n"),
            "f.csv: line 3, column 2 (altitude_m): 'abc' is not a number"
        );
        assert_eq!(
            error("0,0\n"),
            "f.csv: line 1: expected 3 values (time_s,altitude_m,velocity_m_s), got 2"
        );
        assert_eq!(error("NaN,0,0\n"), "f.csv: line 1, column 1 (time_s): 'NaN' is not a number");
        assert_eq!(
            error("abc\n"),
            "f.csv: line 1: 'abc' is neither a row of numbers nor a header naming time, altitude, velocity"
        );
        assert_eq!(
            error("time_s,alt,velocity_m_s\n"),
            "f.csv: line 1: the header needs a column altitude (a heading such as altitude_m or 'altitude (m)')"
        );
        assert_eq!(
            error("time_s,altitude_m,velocity_m_s\n1,2\n"),
            "f.csv: line 2: 2 cells, but the header has 3 columns"
        );
        assert!(error("time,altitude (kg),velocity\n")
            .starts_with("f.csv: line 1: column 2 'altitude (kg)': unknown"));
        let mut r = reader("time_s,velocity_m_s,altitude_ft\n1,2,3\n", UnitSystem::Si);
        assert!(r.next_row().unwrap().is_some());
        assert_eq!(r.unit_of(Quantity::Altitude).symbol(), "ft");
        match r.at_cell(Quantity::Altitude, "too high") {
            Failure::Input(m) => assert_eq!(m, "f.csv: line 2, column 3 (altitude_ft): too high"),
            other => panic!("{other:?}"),
        }
    }
}
