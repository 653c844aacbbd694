//! Writing rows: CSV, JSON, an aligned terminal table or a Markdown table, one row at a
//! time so that any number of rows streams through.
//!
//! Column names are quantities with the unit actually used spelled out
//! (`temperature_K`, `temperature_degF`); CSV and JSON print every value with the
//! shortest digits that read back to the same f64, so nothing is lost between programs.
//! The terminal and Markdown tables show rounded values for people.

use std::io::{self, Write};

use aerostrata::quantity::Rounding;
use aerostrata::units::Unit;
use aerostrata::Quantity;
use clap::ValueEnum;

use crate::format::{exact, readable, write_exact};
use crate::units::{column, UnitSystem};

/// Output format of a tabular command.
#[derive(Clone, Copy, Debug, PartialEq, Eq, ValueEnum)]
pub enum Format {
    /// Aligned columns for a terminal (rounded values).
    Table,
    /// Comma-separated values with a header of quantities and units (exact values).
    Csv,
    /// An array of objects keyed like the CSV header (exact values).
    Json,
    /// A Markdown table for reports (rounded values).
    Markdown,
}

/// One output column.
#[derive(Clone, Debug)]
pub struct Column {
    /// The CSV and JSON name, with its unit (`pressure_Pa`).
    pub key: String,
    /// The short heading of the terminal and Markdown tables (`p`).
    pub heading: &'static str,
    /// The unit's symbol for those tables (`Pa`).
    pub unit: &'static str,
    /// Shown in the terminal and Markdown tables (CSV and JSON show every column).
    pub shown: bool,
    /// Rounding of numbers for the terminal and Markdown tables.
    pub rounding: Rounding,
    /// Holds text (aligned left in the tables) rather than numbers.
    pub text: bool,
    /// The key as a JSON string, quoted and escaped once.
    pub json_key: String,
}

impl Column {
    /// The column of `quantity` in `units`, as the catalogue names, shows and rounds it.
    pub fn of(units: UnitSystem, quantity: Quantity) -> Self {
        Column::in_unit(quantity, units.unit(quantity))
    }

    /// The column of `quantity` in `unit` (a unit the user picked, such as `--unit kt`).
    pub fn in_unit(quantity: Quantity, unit: &'static Unit) -> Self {
        let info = quantity.info();
        let key = column(quantity, unit);
        Column {
            json_key: serde_json::Value::from(key.as_str()).to_string(),
            key,
            heading: info.symbol,
            unit: unit.symbol(),
            shown: info.primary,
            rounding: info.rounding,
            text: false,
        }
    }

    /// A column of text named `key` everywhere.
    pub fn text(key: &'static str) -> Self {
        Column {
            key: key.to_owned(),
            json_key: serde_json::Value::from(key).to_string(),
            heading: key,
            unit: "",
            shown: true,
            rounding: Rounding::Significant,
            text: true,
        }
    }
}

/// One value of a row.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Cell<'a> {
    /// A number, or nothing (an empty CSV cell, JSON `null`, `-` in the tables).
    Number(Option<f64>),
    /// Text.
    Text(&'a str),
    /// Yes or no (`true` or `false`).
    Flag(bool),
}

impl Cell<'_> {
    /// As CSV has it: exact digits; text quoted when it holds a comma, a quote or a line
    /// break (RFC 4180).
    fn csv(&self) -> String {
        match *self {
            Cell::Number(value) => value.map(exact).unwrap_or_default(),
            Cell::Text(text) if text.contains([',', '"', '\n', '\r']) => {
                format!("\"{}\"", text.replace('"', "\"\""))
            }
            Cell::Text(text) => text.to_owned(),
            Cell::Flag(flag) => flag.to_string(),
        }
    }

    /// As JSON has it: exact digits or `null`, a string, `true` or `false`.
    fn json(&self) -> String {
        match *self {
            Cell::Number(value) => value.map_or_else(|| "null".to_owned(), exact),
            Cell::Text(text) => serde_json::Value::from(text).to_string(),
            Cell::Flag(flag) => flag.to_string(),
        }
    }

    /// As the tables show it with `--exact`: every digit, `-` for nothing.
    fn exact(&self) -> String {
        match *self {
            Cell::Number(value) => value.map_or_else(|| "-".to_owned(), exact),
            _ => self.readable(Rounding::Significant),
        }
    }

    /// As the tables show it to people: rounded numbers, `-` for nothing.
    fn readable(&self, rounding: Rounding) -> String {
        match *self {
            Cell::Number(value) => value.map_or_else(|| "-".to_owned(), |v| readable(rounding, v)),
            Cell::Text(text) => text.to_owned(),
            Cell::Flag(flag) => flag.to_string(),
        }
    }
}

/// Rows a terminal table holds back to size its columns; later rows use those widths.
const TABLE_SIZING_ROWS: usize = 1000;

/// Writes rows in one format, streaming.
pub struct RowWriter<W: Write> {
    out: W,
    format: Format,
    columns: Vec<Column>,
    rows: usize,
    /// Terminal table: rows held back until the widths are known.
    pending: Vec<Vec<String>>,
    widths: Option<Vec<usize>>,
    exact: bool,
    /// The line being built (CSV and JSON rows of numbers).
    line: Vec<u8>,
}

impl<W: Write> RowWriter<W> {
    /// Starts the output (CSV header, JSON bracket, Markdown heading).
    ///
    /// # Errors
    /// Writing fails.
    pub fn new(mut out: W, format: Format, columns: Vec<Column>) -> io::Result<Self> {
        match format {
            Format::Csv => {
                let keys: Vec<String> = columns.iter().map(|c| Cell::Text(&c.key).csv()).collect();
                writeln!(out, "{}", keys.join(","))?;
            }
            Format::Json => write!(out, "[")?,
            Format::Markdown => {
                let shown = columns.iter().filter(|c| c.shown);
                let headings: Vec<String> = shown
                    .clone()
                    .map(|c| {
                        let heading = markdown(c.heading);
                        if c.unit.is_empty() {
                            heading
                        } else {
                            format!("{heading} ({})", markdown(c.unit))
                        }
                    })
                    .collect();
                writeln!(out, "| {} |", headings.join(" | "))?;
                let rule: String = shown.map(|c| if c.text { " --- |" } else { " ---: |" }).collect();
                writeln!(out, "|{rule}")?;
            }
            Format::Table => {}
        }
        Ok(RowWriter {
            out,
            format,
            columns,
            rows: 0,
            pending: Vec::new(),
            widths: None,
            exact: false,
            line: Vec::with_capacity(1024),
        })
    }

    /// With `exact`, the terminal and Markdown tables too write every number with the
    /// digits that read back to it (CSV and JSON always do).
    pub fn exact(mut self, exact: bool) -> Self {
        self.exact = exact;
        self
    }

    /// One row of numbers, a value (or nothing) per column.
    ///
    /// # Errors
    /// Writing fails.
    pub fn row(&mut self, values: &[Option<f64>]) -> io::Result<()> {
        match self.format {
            Format::Csv => {
                // The format of the largest outputs: numbers straight into the line.
                let line = &mut self.line;
                line.clear();
                for (i, value) in values.iter().enumerate() {
                    if i > 0 {
                        line.push(b',');
                    }
                    if let Some(value) = value {
                        write_exact(line, *value);
                    }
                }
                line.push(b'\n');
                self.out.write_all(line)?;
                self.rows += 1;
                Ok(())
            }
            Format::Json => self.data_line(values.iter().map(|v| Cell::Number(*v))),
            Format::Table | Format::Markdown => {
                let cells: Vec<Cell> = values.iter().map(|v| Cell::Number(*v)).collect();
                self.cells(&cells)
            }
        }
    }

    /// A CSV or JSON row, built in one reused line: no allocation per row or per number
    /// (these are the formats of large outputs).
    fn data_line<'c>(&mut self, cells: impl Iterator<Item = Cell<'c>>) -> io::Result<()> {
        let line = &mut self.line;
        line.clear();
        let json = self.format == Format::Json;
        if json {
            line.extend_from_slice(if self.rows == 0 { b"\n  {" } else { b",\n  {" });
        }
        for (i, (column, cell)) in self.columns.iter().zip(cells).enumerate() {
            if i > 0 {
                line.extend_from_slice(if json { b", " } else { b"," });
            }
            if json {
                line.extend_from_slice(column.json_key.as_bytes());
                line.extend_from_slice(b": ");
            }
            match cell {
                Cell::Number(Some(value)) => write_exact(line, value),
                Cell::Number(None) if json => line.extend_from_slice(b"null"),
                Cell::Number(None) => {}
                other => line.extend_from_slice(if json { other.json() } else { other.csv() }.as_bytes()),
            }
        }
        line.extend_from_slice(if json { b"}" } else { b"\n" });
        self.out.write_all(&self.line)?;
        self.rows += 1;
        Ok(())
    }

    /// One row, a cell per column.
    ///
    /// # Errors
    /// Writing fails.
    pub fn cells(&mut self, cells: &[Cell]) -> io::Result<()> {
        debug_assert_eq!(cells.len(), self.columns.len());
        match self.format {
            Format::Csv | Format::Json => return self.data_line(cells.iter().copied()),
            Format::Markdown => {
                let cells: Vec<String> = self.shown_cells(cells).iter().map(|c| markdown(c)).collect();
                writeln!(self.out, "| {} |", cells.join(" | "))?;
            }
            Format::Table => {
                let cells = self.shown_cells(cells);
                match &self.widths {
                    Some(_) => self.table_line(&cells)?,
                    None => {
                        self.pending.push(cells);
                        if self.pending.len() == TABLE_SIZING_ROWS {
                            self.flush_pending()?;
                        }
                    }
                }
            }
        }
        self.rows += 1;
        Ok(())
    }

    fn shown_cells(&self, cells: &[Cell]) -> Vec<String> {
        let shown = self.columns.iter().zip(cells).filter(|(c, _)| c.shown);
        if self.exact {
            shown.map(|(_, v)| v.exact()).collect()
        } else {
            shown.map(|(c, v)| v.readable(c.rounding)).collect()
        }
    }

    /// A line of the terminal table: numbers aligned right, text left.
    fn table_line(&mut self, cells: &[String]) -> io::Result<()> {
        let widths = self.widths.as_deref().unwrap_or(&[]);
        let shown = self.columns.iter().filter(|c| c.shown);
        let padded: Vec<String> = cells
            .iter()
            .zip(widths)
            .zip(shown)
            .map(
                |((text, width), c)| {
                    if c.text {
                        format!("{text:<width$}")
                    } else {
                        format!("{text:>width$}")
                    }
                },
            )
            .collect();
        writeln!(self.out, "{}", padded.join("  ").trim_end())
    }

    /// Sizes the terminal table's columns from the rows held back and writes them.
    fn flush_pending(&mut self) -> io::Result<()> {
        let shown: Vec<&Column> = self.columns.iter().filter(|c| c.shown).collect();
        let widths: Vec<usize> = shown
            .iter()
            .enumerate()
            .map(|(i, c)| {
                self.pending
                    .iter()
                    .map(|row| row[i].chars().count())
                    .chain([c.heading.chars().count(), c.unit.chars().count()])
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        let headings: Vec<String> = shown.iter().map(|c| c.heading.to_owned()).collect();
        let units: Vec<String> = shown.iter().map(|c| c.unit.to_owned()).collect();
        self.widths = Some(widths);
        self.table_line(&headings)?;
        // Columns that are all text or pure numbers have no unit line.
        if units.iter().any(|u| !u.is_empty()) {
            self.table_line(&units)?;
        }
        for row in std::mem::take(&mut self.pending) {
            self.table_line(&row)?;
        }
        Ok(())
    }

    /// Ends the output (JSON bracket, held-back table rows) and returns the writer.
    ///
    /// # Errors
    /// Writing fails.
    pub fn finish(mut self) -> io::Result<W> {
        match self.format {
            Format::Json => writeln!(self.out, "{}]", if self.rows == 0 { "" } else { "\n" })?,
            Format::Table if self.widths.is_none() => self.flush_pending()?,
            _ => {}
        }
        Ok(self.out)
    }
}

/// `text` in a Markdown table cell: a `|` would end the cell.
fn markdown(text: &str) -> String {
    text.replace('|', "\\|")
}

#[cfg(test)]
mod tests {
    use super::*;

    fn written(format: Format, rows: usize) -> String {
        let columns = vec![
            Column::of(UnitSystem::Si, Quantity::Altitude),
            Column { shown: false, ..Column::of(UnitSystem::Si, Quantity::Mach) },
        ];
        let mut writer = RowWriter::new(Vec::new(), format, columns).unwrap();
        for i in 0..rows {
            writer.row(&[Some(i as f64 * 1000.0), (i % 2 == 0).then_some(0.5)]).unwrap();
        }
        String::from_utf8(writer.finish().unwrap()).unwrap()
    }

    #[test]
    fn every_format_writes_rows() {
        assert_eq!(written(Format::Csv, 2), "altitude_m,mach\n0,0.5\n1000,\n");
        assert_eq!(written(Format::Json, 0), "[]\n");
        let json: serde_json::Value = serde_json::from_str(&written(Format::Json, 2)).unwrap();
        assert_eq!(json[1]["altitude_m"], 1000.0);
        assert!(json[1]["mach"].is_null());
        assert_eq!(written(Format::Markdown, 1), "| Z (m) |\n| ---: |\n| 0.0 |\n");
        assert_eq!(written(Format::Table, 2), "     Z\n     m\n   0.0\n1000.0\n");
        let columns = vec![Column::of(UnitSystem::Si, Quantity::Mach)];
        let mut exact = RowWriter::new(Vec::new(), Format::Table, columns).unwrap().exact(true);
        exact.row(&[Some(2.0 / 3.0)]).unwrap();
        assert_eq!(
            String::from_utf8(exact.finish().unwrap()).unwrap(),
            "                 M\n0.6666666666666666\n"
        );
        // Past the sizing rows the widths stay; a wider value pushes its line out.
        let long = written(Format::Table, TABLE_SIZING_ROWS + 1);
        assert_eq!(long.lines().count(), TABLE_SIZING_ROWS + 3);
        assert!(long.lines().all(|l| l.len() >= 8));
    }

    #[test]
    fn text_cells_are_quoted_escaped_and_aligned_left() {
        let write = |format: Format| {
            let columns = vec![Column::text("name"), Column::text("note"), Column::text("flag")];
            let mut writer = RowWriter::new(Vec::new(), format, columns).unwrap();
            writer.cells(&[Cell::Text("a"), Cell::Text("x, \"y\" | z"), Cell::Flag(true)]).unwrap();
            writer.cells(&[Cell::Text("long name"), Cell::Text("-"), Cell::Flag(false)]).unwrap();
            String::from_utf8(writer.finish().unwrap()).unwrap()
        };
        assert_eq!(write(Format::Csv), "name,note,flag\na,\"x, \"\"y\"\" | z\",true\nlong name,-,false\n");
        let json: serde_json::Value = serde_json::from_str(&write(Format::Json)).unwrap();
        assert_eq!(json[0]["note"], "x, \"y\" | z");
        assert_eq!(json[1]["flag"], false);
        assert_eq!(
            write(Format::Markdown),
            "| name | note | flag |\n| --- | --- | --- |\n| a | x, \"y\" \\| z | true |\n| long name | - | false |\n"
        );
        assert_eq!(
            write(Format::Table),
            "name       note        flag\na          x, \"y\" | z  true\nlong name  -           false\n"
        );
    }
}
