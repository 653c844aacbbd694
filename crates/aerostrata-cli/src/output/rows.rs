//! Writing rows: CSV, JSON, an aligned terminal table or a Markdown table, one row at a
//! time so that any number of rows streams through.
//!
//! Column names are quantities with the unit actually used spelled out
//! (`temperature_K`, `temperature_degF`); CSV and JSON print every value with the
//! shortest digits that read back to the same f64, so nothing is lost between programs.
//! The terminal and Markdown tables show rounded values for people.

use std::io::{self, Write};

use clap::ValueEnum;

use crate::format::{exact, readable, Style};
use crate::units::{Quantity, UnitSystem};

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
    pub heading: String,
    /// The unit's symbol for those tables (`Pa`).
    pub unit: String,
    /// Shown in the terminal and Markdown tables (CSV and JSON show every column).
    pub shown: bool,
    /// Rounding for the terminal and Markdown tables.
    pub style: Style,
}

impl Column {
    /// A column of `quantity` named `base` in `units`.
    pub fn new(units: UnitSystem, base: &str, heading: &str, quantity: Quantity, style: Style) -> Self {
        let unit = units.unit(quantity);
        Column {
            key: unit.key(base),
            heading: heading.to_owned(),
            unit: unit.symbol.to_owned(),
            shown: true,
            style,
        }
    }

    /// The same column, left out of the terminal and Markdown tables.
    pub fn hidden(self) -> Self {
        Column { shown: false, ..self }
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
}

impl<W: Write> RowWriter<W> {
    /// Starts the output (CSV header, JSON bracket, Markdown heading).
    ///
    /// # Errors
    /// Writing fails.
    pub fn new(mut out: W, format: Format, columns: Vec<Column>) -> io::Result<Self> {
        match format {
            Format::Csv => {
                let keys: Vec<&str> = columns.iter().map(|c| c.key.as_str()).collect();
                writeln!(out, "{}", keys.join(","))?;
            }
            Format::Json => write!(out, "[")?,
            Format::Markdown => {
                let shown = columns.iter().filter(|c| c.shown);
                let headings: Vec<String> = shown
                    .clone()
                    .map(|c| {
                        if c.unit.is_empty() {
                            c.heading.clone()
                        } else {
                            format!("{} ({})", c.heading, c.unit)
                        }
                    })
                    .collect();
                writeln!(out, "| {} |", headings.join(" | "))?;
                writeln!(out, "|{}", shown.map(|_| " ---: |").collect::<String>())?;
            }
            Format::Table => {}
        }
        Ok(RowWriter { out, format, columns, rows: 0, pending: Vec::new(), widths: None })
    }

    /// One row, a value (or nothing) per column.
    ///
    /// # Errors
    /// Writing fails.
    pub fn row(&mut self, values: &[Option<f64>]) -> io::Result<()> {
        debug_assert_eq!(values.len(), self.columns.len());
        match self.format {
            Format::Csv => {
                let cells: Vec<String> = values.iter().map(|v| v.map(exact).unwrap_or_default()).collect();
                writeln!(self.out, "{}", cells.join(","))?;
            }
            Format::Json => {
                let separator = if self.rows == 0 { "\n  " } else { ",\n  " };
                let fields: Vec<String> = self
                    .columns
                    .iter()
                    .zip(values)
                    .map(|(c, v)| {
                        let key = serde_json::Value::from(c.key.as_str());
                        format!("{key}: {}", v.map_or_else(|| "null".to_owned(), exact))
                    })
                    .collect();
                write!(self.out, "{separator}{{{}}}", fields.join(", "))?;
            }
            Format::Markdown => {
                let cells = self.shown_cells(values);
                writeln!(self.out, "| {} |", cells.join(" | "))?;
            }
            Format::Table => {
                let cells = self.shown_cells(values);
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

    fn shown_cells(&self, values: &[Option<f64>]) -> Vec<String> {
        self.columns
            .iter()
            .zip(values)
            .filter(|(c, _)| c.shown)
            .map(|(c, v)| v.map_or_else(|| "-".to_owned(), |v| readable(c.style, v)))
            .collect()
    }

    fn table_line(&mut self, cells: &[String]) -> io::Result<()> {
        let widths = self.widths.as_deref().unwrap_or(&[]);
        let padded: Vec<String> =
            cells.iter().zip(widths).map(|(text, width)| format!("{text:>width$}")).collect();
        writeln!(self.out, "{}", padded.join("  "))
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
                    .map(|row| row[i].len())
                    .chain([c.heading.len(), c.unit.len()])
                    .max()
                    .unwrap_or(0)
            })
            .collect();
        let headings: Vec<String> = shown.iter().map(|c| c.heading.clone()).collect();
        let units: Vec<String> = shown.iter().map(|c| c.unit.clone()).collect();
        self.widths = Some(widths);
        self.table_line(&headings)?;
        self.table_line(&units)?;
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

#[cfg(test)]
mod tests {
    use super::*;

    fn written(format: Format, rows: usize) -> String {
        let columns = vec![
            Column::new(UnitSystem::Si, "x", "x", Quantity::Length, Style::Fixed(1)),
            Column::new(UnitSystem::Si, "y", "y", Quantity::Dimensionless, Style::Significant).hidden(),
        ];
        let mut writer = RowWriter::new(Vec::new(), format, columns).unwrap();
        for i in 0..rows {
            writer.row(&[Some(i as f64 * 1000.0), (i % 2 == 0).then_some(0.5)]).unwrap();
        }
        String::from_utf8(writer.finish().unwrap()).unwrap()
    }

    #[test]
    fn every_format_writes_rows() {
        assert_eq!(written(Format::Csv, 2), "x_m,y\n0,0.5\n1000,\n");
        assert_eq!(written(Format::Json, 0), "[]\n");
        let json: serde_json::Value = serde_json::from_str(&written(Format::Json, 2)).unwrap();
        assert_eq!(json[1]["x_m"], 1000.0);
        assert!(json[1]["y"].is_null());
        assert_eq!(written(Format::Markdown, 1), "| x (m) |\n| ---: |\n| 0.0 |\n");
        assert_eq!(written(Format::Table, 2), "     x\n     m\n   0.0\n1000.0\n");
        // Past the sizing rows the widths stay; a wider value pushes its line out.
        let long = written(Format::Table, TABLE_SIZING_ROWS + 1);
        assert_eq!(long.lines().count(), TABLE_SIZING_ROWS + 3);
        assert!(long.lines().all(|l| l.len() >= 8));
    }
}
