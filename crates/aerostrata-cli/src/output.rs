//! Writing states as CSV, JSON and aligned terminal tables.
//!
//! Column names are the core's state fields with their SI unit spelled out
//! (`temperature_K`, `pressure_Pa`); CSV and JSON print every value with the shortest
//! digits that read back to the same f64, so nothing is lost between programs.

use std::io::{self, Write};

use aerostrata::State;

/// Header names, in the order of [`State::fields`].
pub const COLUMNS: [&str; 20] = [
    "geometric_altitude_m",
    "geopotential_altitude_m",
    "temperature_K",
    "molecular_temperature_K",
    "pressure_Pa",
    "density_kg_m3",
    "speed_of_sound_m_s",
    "dynamic_viscosity_Pa_s",
    "kinematic_viscosity_m2_s",
    "thermal_conductivity_W_m_K",
    "gravity_m_s2",
    "pressure_scale_height_m",
    "number_density_m3",
    "mean_particle_speed_m_s",
    "mean_free_path_m",
    "collision_frequency_Hz",
    "mean_molar_mass_kg_kmol",
    "temperature_ratio",
    "pressure_ratio",
    "density_ratio",
];

/// The shortest decimal that reads back to `value` exactly; exponent form for very large
/// or small magnitudes.
pub fn exact(value: f64) -> String {
    let magnitude = value.abs();
    if magnitude != 0.0 && !(1e-3..1e7).contains(&magnitude) {
        format!("{value:e}")
    } else {
        format!("{value}")
    }
}

/// Header names of the species columns that `eval --species` adds.
pub const SPECIES_COLUMNS: [&str; 6] = ["n_N2_m3", "n_O_m3", "n_O2_m3", "n_Ar_m3", "n_He_m3", "n_H_m3"];

pub fn write_csv_header(out: &mut impl Write, species: bool) -> io::Result<()> {
    let extra: &[&str] = if species { &SPECIES_COLUMNS } else { &[] };
    writeln!(out, "{}", [&COLUMNS[..], extra].concat().join(","))
}

/// One row; `species` is `None` for no species columns, `Some(None)` for empty ones.
pub fn write_csv_row(
    out: &mut impl Write,
    state: &State,
    species: Option<Option<[f64; 6]>>,
) -> io::Result<()> {
    let mut cells: Vec<String> =
        state.fields().iter().map(|(_, v)| v.map(exact).unwrap_or_default()).collect();
    match species {
        Some(Some(n)) => cells.extend(n.iter().map(|v| exact(*v))),
        Some(None) => cells.extend(core::iter::repeat_n(String::new(), SPECIES_COLUMNS.len())),
        None => {}
    }
    writeln!(out, "{}", cells.join(","))
}

pub fn write_json(out: &mut impl Write, states: &[State]) -> io::Result<()> {
    let rows: Vec<serde_json::Value> = states
        .iter()
        .map(|state| {
            let object = COLUMNS
                .iter()
                .zip(state.fields())
                .map(|(name, (_, value))| {
                    ((*name).to_owned(), value.map_or(serde_json::Value::Null, Into::into))
                })
                .collect();
            serde_json::Value::Object(object)
        })
        .collect();
    serde_json::to_writer_pretty(&mut *out, &rows)?;
    writeln!(out)
}

/// The columns a terminal table shows: (field index, heading, unit, format).
const TERMINAL: [(usize, &str, &str); 11] = [
    (0, "Z", "m"),
    (1, "H", "m"),
    (2, "T", "K"),
    (4, "p", "Pa"),
    (5, "rho", "kg/m3"),
    (6, "a", "m/s"),
    (7, "mu", "Pa s"),
    (8, "nu", "m2/s"),
    (9, "k", "W/(m K)"),
    (10, "g", "m/s2"),
    (14, "mfp", "m"),
];

/// Six significant digits, fixed for the altitudes and temperatures, exponent otherwise.
fn readable(index: usize, value: f64) -> String {
    match index {
        0 | 1 => format!("{value:.1}"),
        2 | 3 => format!("{value:.3}"),
        6 | 10 => format!("{value:.4}"),
        _ => scientific(value),
    }
}

/// Six significant digits as `1.22500E+00`, the way printed tables show them.
fn scientific(value: f64) -> String {
    let text = format!("{value:.5e}");
    match text.split_once('e') {
        Some((mantissa, exponent)) => {
            let exponent: i32 = exponent.parse().unwrap_or(0);
            let sign = if exponent < 0 { '-' } else { '+' };
            format!("{mantissa}E{sign}{:02}", exponent.abs())
        }
        None => text,
    }
}

pub fn write_table(out: &mut impl Write, states: &[State]) -> io::Result<()> {
    let cells: Vec<Vec<String>> = states
        .iter()
        .map(|state| {
            let fields = state.fields();
            TERMINAL
                .iter()
                .map(|&(index, _, _)| fields[index].1.map_or_else(|| "-".to_owned(), |v| readable(index, v)))
                .collect()
        })
        .collect();
    let widths: Vec<usize> = TERMINAL
        .iter()
        .enumerate()
        .map(|(column, (_, name, unit))| {
            cells.iter().map(|row| row[column].len()).chain([name.len(), unit.len()]).max().unwrap_or(0)
        })
        .collect();
    let line = |out: &mut dyn Write, texts: &mut dyn Iterator<Item = String>| -> io::Result<()> {
        let padded: Vec<String> = texts.zip(&widths).map(|(text, width)| format!("{text:>width$}")).collect();
        writeln!(out, "{}", padded.join("  "))
    };
    line(out, &mut TERMINAL.iter().map(|(_, name, _)| (*name).to_owned()))?;
    line(out, &mut TERMINAL.iter().map(|(_, _, unit)| (*unit).to_owned()))?;
    for row in cells {
        line(out, &mut row.into_iter())?;
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata::{Altitude, Atmosphere, US1976};

    #[test]
    fn columns_follow_the_state_fields() {
        let state = US1976.state(Altitude::geometric_m(0.0).unwrap()).unwrap();
        for (column, (field, _)) in COLUMNS.iter().zip(state.fields()) {
            assert_eq!(column.to_lowercase(), field, "column {column} against field {field}");
        }
    }

    #[test]
    fn scientific_looks_like_a_printed_table() {
        assert_eq!(scientific(1.2249991558877122), "1.22500E+00");
        assert_eq!(scientific(6.633232327863704e-8), "6.63323E-08");
        assert_eq!(scientific(101_325.0), "1.01325E+05");
    }

    #[test]
    fn exact_round_trips() {
        for value in [101_325.0, 1.0 / 3.0, 6.6e-8, 2.547e25, -5000.0, 0.0, 1e-3, 9_999_999.5] {
            assert_eq!(exact(value).parse::<f64>().unwrap(), value);
        }
    }
}
