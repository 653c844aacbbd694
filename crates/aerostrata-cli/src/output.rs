//! Writing rows: CSV, JSON, an aligned terminal table or a Markdown table, to stdout or
//! to `--output FILE`, one row at a time so that any number of rows streams through.
//!
//! Column names are quantities with the unit actually used spelled out
//! (`temperature_K`, `temperature_degF`); CSV and JSON print every value with the
//! shortest digits that read back to the same f64, so nothing is lost between programs.
//! The terminal and Markdown tables show rounded values for people.

use std::fs::OpenOptions;
use std::io::{self, BufWriter, Write};
use std::path::{Path, PathBuf};

use aerostrata::State;
use aerostrata_cli::format::{exact, readable, Style};
use aerostrata_cli::units::{Quantity, UnitSystem};
use clap::ValueEnum;

use crate::Failure;

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

/// Where a command writes: stdout, or `--output PATH`.
///
/// A regular file (or a new name) appears only when the command succeeds: it is written
/// beside its final name and renamed at the end, so a failed run never leaves a
/// half-written file, nor clobbers an old one. Symbolic links are followed first, so the
/// file they point to is replaced and the link stays. Anything that is not a regular file
/// (a character device such as /dev/null, a FIFO, a terminal) is written directly and never
/// renamed over: replacing a device node with a regular file would break every other
/// program that uses it.
pub struct Destination {
    writer: BufWriter<Box<dyn Write>>,
    file: Option<(PathBuf, PathBuf)>,
}

/// Follows symbolic links from `path` to the name that is finally written (which may not
/// exist yet). Relative link targets are taken from the link's own folder, as the kernel
/// does.
fn resolve_links(path: &Path) -> Result<PathBuf, String> {
    let mut current = path.to_path_buf();
    // The kernel's own limit on a chain of links (Linux's MAXSYMLINKS).
    for _ in 0..40 {
        match std::fs::symlink_metadata(&current) {
            Ok(meta) if meta.file_type().is_symlink() => {
                let link = std::fs::read_link(&current).map_err(|e| e.to_string())?;
                current = match current.parent() {
                    Some(folder) if link.is_relative() => folder.join(link),
                    _ => link,
                };
            }
            _ => return Ok(current),
        }
    }
    Err("too many levels of symbolic links".into())
}

impl Destination {
    /// Stdout, or the file `path`.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the path when it is a directory or cannot be opened or
    /// created.
    pub fn open(path: Option<&Path>) -> Result<Self, Failure> {
        let Some(path) = path else {
            return Ok(Destination { writer: BufWriter::new(Box::new(io::stdout().lock())), file: None });
        };
        let cannot = |why: &dyn std::fmt::Display| {
            Failure::Input(format!("--output: cannot create {}: {why}", path.display()))
        };
        let target = resolve_links(path).map_err(|e| cannot(&e))?;
        let existing = match std::fs::metadata(&target) {
            Ok(meta) => Some(meta),
            Err(e) if e.kind() == io::ErrorKind::NotFound => None,
            Err(e) => return Err(cannot(&e)),
        };
        match existing {
            Some(meta) if meta.is_dir() => Err(Failure::Input(format!(
                "--output: {} is a directory; give a file name inside it",
                path.display()
            ))),
            Some(meta) if !meta.is_file() => {
                // A device, FIFO or socket: write into it, as a shell redirection would.
                let file = OpenOptions::new().write(true).open(&target).map_err(|e| cannot(&e))?;
                Ok(Destination { writer: BufWriter::with_capacity(1 << 16, Box::new(file)), file: None })
            }
            existing => {
                let name = target.file_name().ok_or_else(|| {
                    Failure::Input(format!("--output: '{}' is not a file name", path.display()))
                })?;
                let mut partial = std::ffi::OsString::from(".");
                partial.push(name);
                partial.push(format!(".partial-{}", std::process::id()));
                let temporary = target.with_file_name(partial);
                // create_new: never follow or reuse whatever already has the temporary name.
                let file = OpenOptions::new()
                    .write(true)
                    .create_new(true)
                    .open(&temporary)
                    .map_err(|e| cannot(&e))?;
                if let Some(meta) = existing {
                    // The replacement keeps the old file's permissions.
                    let _ = file.set_permissions(meta.permissions());
                }
                Ok(Destination {
                    writer: BufWriter::with_capacity(1 << 16, Box::new(file)),
                    file: Some((temporary, target)),
                })
            }
        }
    }

    /// Flushes and, for a regular file, gives it its final name.
    ///
    /// # Errors
    /// Writing or renaming fails, or the target became something other than a regular
    /// file while the command ran (it is then left as it is).
    pub fn commit(mut self) -> Result<(), Failure> {
        self.writer.flush()?;
        if let Some((temporary, target)) = self.file.take() {
            let replaceable = match std::fs::symlink_metadata(&target) {
                Ok(meta) => meta.file_type().is_file(),
                Err(e) => e.kind() == io::ErrorKind::NotFound,
            };
            let renamed = if replaceable {
                std::fs::rename(&temporary, &target)
            } else {
                Err(io::Error::other("it is no longer a regular file; left as it is"))
            };
            renamed.map_err(|e| {
                let _ = std::fs::remove_file(&temporary);
                Failure::Io(io::Error::new(e.kind(), format!("cannot write {}: {e}", target.display())))
            })?;
        }
        Ok(())
    }
}

impl Write for Destination {
    fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
        self.writer.write(buf)
    }

    fn write_all(&mut self, buf: &[u8]) -> io::Result<()> {
        self.writer.write_all(buf)
    }

    fn flush(&mut self) -> io::Result<()> {
        self.writer.flush()
    }
}

impl Drop for Destination {
    fn drop(&mut self) {
        if let Some((temporary, _)) = self.file.take() {
            let _ = std::fs::remove_file(temporary);
        }
    }
}

/// The state's columns: (base name, table heading, quantity, rounding, shown in tables),
/// in the order of [`State::fields`].
const STATE: [(&str, &str, Quantity, Style, bool); 20] = [
    ("geometric_altitude", "Z", Quantity::Length, Style::Fixed(1), true),
    ("geopotential_altitude", "H", Quantity::Length, Style::Fixed(1), true),
    ("temperature", "T", Quantity::Temperature, Style::Fixed(3), true),
    ("molecular_temperature", "TM", Quantity::Temperature, Style::Fixed(3), false),
    ("pressure", "p", Quantity::Pressure, Style::Scientific, true),
    ("density", "rho", Quantity::Density, Style::Scientific, true),
    ("speed_of_sound", "a", Quantity::Speed, Style::Fixed(4), true),
    ("dynamic_viscosity", "mu", Quantity::DynamicViscosity, Style::Scientific, true),
    ("kinematic_viscosity", "nu", Quantity::KinematicViscosity, Style::Scientific, true),
    ("thermal_conductivity", "k", Quantity::ThermalConductivity, Style::Scientific, true),
    ("gravity", "g", Quantity::Acceleration, Style::Fixed(4), true),
    ("pressure_scale_height", "Hp", Quantity::Length, Style::Fixed(1), false),
    ("number_density", "n", Quantity::NumberDensity, Style::Scientific, false),
    ("mean_particle_speed", "V", Quantity::Speed, Style::Fixed(2), false),
    ("mean_free_path", "mfp", Quantity::Length, Style::Scientific, true),
    ("collision_frequency", "nu_c", Quantity::Frequency, Style::Scientific, false),
    ("mean_molar_mass", "M", Quantity::MolarMass, Style::Fixed(4), false),
    ("temperature_ratio", "theta", Quantity::Dimensionless, Style::Scientific, false),
    ("pressure_ratio", "delta", Quantity::Dimensionless, Style::Scientific, false),
    ("density_ratio", "sigma", Quantity::Dimensionless, Style::Scientific, false),
];

/// The base name (without unit) and quantity of the state's field `index`.
pub fn state_field(index: usize) -> (&'static str, Quantity) {
    (STATE[index].0, STATE[index].2)
}

/// The species' names, as `eval --species` adds them.
const SPECIES: [&str; 6] = ["N2", "O", "O2", "Ar", "He", "H"];

/// The columns of a state, and with `species` the standard's six number densities.
pub fn state_columns(units: UnitSystem, species: bool) -> Vec<Column> {
    let mut columns: Vec<Column> = STATE
        .iter()
        .map(|&(base, heading, quantity, style, shown)| {
            let column = Column::new(units, base, heading, quantity, style);
            if shown {
                column
            } else {
                column.hidden()
            }
        })
        .collect();
    if species {
        for name in SPECIES {
            columns.push(Column::new(
                units,
                &format!("n_{name}"),
                name,
                Quantity::NumberDensity,
                Style::Scientific,
            ));
        }
    }
    columns
}

/// A state's values in `units`, and with `species` the six number densities (in 1/m^3
/// from the core; `Some(None)` for empty cells below 86 km).
pub fn state_values(state: &State, units: UnitSystem, species: Option<Option<[f64; 6]>>) -> Vec<Option<f64>> {
    let mut values: Vec<Option<f64>> = state
        .fields()
        .iter()
        .enumerate()
        .map(|(index, (_, value))| value.map(|v| units.from_si(STATE[index].2, v)))
        .collect();
    match species {
        Some(Some(n)) => values.extend(n.iter().map(|v| Some(units.from_si(Quantity::NumberDensity, *v)))),
        Some(None) => values.extend([None; 6]),
        None => {}
    }
    values
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata::{Altitude, Atmosphere, US1976};

    #[test]
    fn columns_follow_the_state_fields() {
        let state = US1976.state(Altitude::geometric_m(0.0).unwrap()).unwrap();
        for (column, (field, _)) in state_columns(UnitSystem::Si, false).iter().zip(state.fields()) {
            assert_eq!(column.key.to_lowercase(), field, "column {} against field {field}", column.key);
        }
    }

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
