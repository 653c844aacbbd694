//! `--model layers=FILE`: an atmosphere of layers of constant lapse rate, from a CSV of
//! breakpoints read by the tool's table reader. Columns `geopotential_altitude`,
//! `temperature` and `pressure` (any spelling, a unit in each heading or SI without one);
//! one row per breakpoint, altitudes strictly increasing, the pressure on the first row
//! only. Between two rows the temperature is linear in geopotential altitude and the
//! pressure follows from the hydrostatic law: the core's `Layered` model, the machinery
//! of the 1976 standard's lower atmosphere (docs/cli.md gives the format).

use std::fs::File;
use std::io::BufReader;
use std::path::Path;

use aerostrata::model::MAX_LAPSE_RATE_K_M;
use aerostrata::units::Tidy;
use aerostrata::{Layer, LayerSpec, Layered, Quantity};

use crate::failure::Failure;
use crate::input::table::{needs, Columns, TableReader};

const COLUMNS: [Quantity; 3] = [Quantity::GeopotentialAltitude, Quantity::Temperature, Quantity::Pressure];

/// The layered model the file at `path` describes.
///
/// # Errors
/// [`Failure::Input`] naming the file, its line and column: a bad header or cell, a
/// first row without a pressure, a later row with one, altitudes that do not increase,
/// fewer than two rows, or the core's refusal of the layers (a temperature that reaches
/// 0 K, a pressure that underflows).
pub fn load(path: &Path) -> Result<Layered<Vec<Layer>>, Failure> {
    let name = path.display().to_string();
    let file = File::open(path).map_err(|e| Failure::Input(format!("cannot read layers {name}: {e}")))?;
    let columns = Columns {
        accepts: &COLUMNS,
        implicit: &COLUMNS,
        check: Box::new(|header| {
            needs(
                header,
                &[&[Quantity::GeopotentialAltitude], &[Quantity::Temperature], &[Quantity::Pressure]],
            )
        }),
    };
    let mut table = TableReader::new(BufReader::new(file), name.clone(), columns, None);
    let mut base: Option<(f64, f64, f64)> = None;
    let mut last: Option<(f64, f64)> = None;
    let mut specs = Vec::new();
    while let Some(row) = table.next_row()? {
        let (h, t, p) = (
            row.get(Quantity::GeopotentialAltitude),
            row.get(Quantity::Temperature),
            row.get(Quantity::Pressure),
        );
        let (Some(h), Some(t)) = (h, t) else {
            let empty = if h.is_none() { Quantity::GeopotentialAltitude } else { Quantity::Temperature };
            return Err(table.at_cell(empty, "an empty cell; every row needs an altitude and a temperature"));
        };
        match (last, p) {
            (None, Some(p)) => base = Some((h, t, p)),
            (None, None) => {
                return Err(table.at_cell(Quantity::Pressure, "the first row needs the pressure at its altitude"))
            }
            (Some(_), Some(_)) => {
                return Err(table.at_cell(
                    Quantity::Pressure,
                    "only the first row gives a pressure (the others follow from the lapse rates); leave it empty",
                ))
            }
            (Some((below_h, below_t)), None) => {
                if h <= below_h {
                    let unit = table.unit_of(Quantity::GeopotentialAltitude);
                    return Err(table.at_cell(
                        Quantity::GeopotentialAltitude,
                        format!(
                            "altitude {} {} is not above the row before's {} {}",
                            Tidy(unit.from_si(h)),
                            unit.symbol(),
                            Tidy(unit.from_si(below_h)),
                            unit.symbol()
                        ),
                    ));
                }
                let lapse = (t - below_t) / (h - below_h);
                if lapse.is_nan() || lapse.abs() > MAX_LAPSE_RATE_K_M {
                    return Err(table.at_cell(
                        Quantity::Temperature,
                        format!(
                            "the temperature changes by {} K from the row before: a lapse rate of {} K/km, \
                             steeper than any atmosphere's 100 K/km (check the temperature's unit and the \
                             altitudes)",
                            Tidy(t - below_t),
                            Tidy(lapse * 1000.0)
                        ),
                    ));
                }
                specs.push(LayerSpec { top_geopotential_m: h, lapse_rate_k_m: lapse });
            }
        }
        last = Some((h, t));
    }
    let Some((h0, t0, p0)) = base.filter(|_| !specs.is_empty()) else {
        return Err(Failure::Input(format!("{name}: at least two rows (one layer) are needed")));
    };
    Layered::from_lapse_rates_vec(h0, t0, p0, &specs).map_err(|e| Failure::Input(format!("{name}: {e}")))
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata::{Altitude, Atmosphere, US1976};

    fn write(name: &str, text: &str) -> std::path::PathBuf {
        let path = std::env::temp_dir().join(format!("aerostrata-layers-{}-{name}.csv", std::process::id()));
        std::fs::write(&path, text).unwrap();
        path
    }

    fn error(text: &str) -> String {
        let path = write("bad", text);
        let message = match load(&path) {
            Err(Failure::Input(m)) => m,
            other => panic!("{other:?}"),
        };
        std::fs::remove_file(path).unwrap();
        message.split_once(": ").map_or(message.clone(), |(_, rest)| rest.to_owned())
    }

    #[test]
    fn the_standards_lower_layers_as_a_file_are_the_standard() {
        // The 1976 standard's first three layer bases (Table 4 of the standard; base
        // pressure 101 325 Pa): 288.15 K at 0, 216.65 K from 11 to 20 km, 228.65 K at 32 km.
        let path = write(
            "standard",
            "# the standard's lower layers\ngeopotential_altitude (km),temperature (K),pressure (hPa)\n\
             0,288.15,1013.25\n11,216.65,\n20,216.65,\n32,228.65,\n",
        );
        let layers = load(&path).unwrap();
        std::fs::remove_file(path).unwrap();
        for h in [0.0, 5_000.0, 11_000.0, 15_000.0, 25_000.0, 32_000.0] {
            let at = Altitude::geopotential_m(h).unwrap();
            let (ours, standard) = (layers.state(at).unwrap(), US1976.state(at).unwrap());
            assert!((ours.temperature_k - standard.temperature_k).abs() < 1e-9, "{h}");
            assert!((ours.pressure_pa / standard.pressure_pa - 1.0).abs() < 1e-12, "{h}");
        }
    }

    #[test]
    fn bad_files_are_named_with_line_and_column() {
        assert_eq!(
            error("geopotential_altitude_m,temperature_K,pressure_Pa\n0,288.15,\n1000,280,\n"),
            "line 2, column 3 (pressure_Pa): the first row needs the pressure at its altitude"
        );
        assert!(error("geopotential_altitude_m,temperature_K,pressure_Pa\n0,288,101325\n1000,280,90000\n")
            .starts_with("line 3, column 3 (pressure_Pa): only the first row gives a pressure"));
        assert_eq!(
            error("geopotential_altitude_m,temperature_K,pressure_Pa\n0,288,101325\n0,280,\n"),
            "line 3, column 1 (geopotential_altitude_m): altitude 0 m is not above the row before's 0 m"
        );
        assert_eq!(
            error("geopotential_altitude_m,temperature_K,pressure_Pa\n0,288,101325\n"),
            "at least two rows (one layer) are needed"
        );
        assert!(error("altitude_m,temperature_K,pressure_Pa\n")
            .starts_with("line 1: the header needs a column geopotential_altitude"));
        assert!(error("geopotential_altitude_m,temperature_K,pressure_Pa\n0,288,101325\n1000,-5,\n")
            .starts_with("line 3, column 2 (temperature_K): the temperature changes by -293 K"));
        assert!(
            matches!(load(Path::new("/no/such/layers.csv")), Err(Failure::Input(m)) if m.starts_with("cannot read layers /no/such/layers.csv"))
        );
    }
}
