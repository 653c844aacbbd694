//! `--sounding FILE`: a tabulated atmosphere (a weather-balloon sounding or a design-day
//! profile) instead of the standard, read by the core's loaders: CSV with a header of
//! quantities and units, or JSON (serde) when the file name ends in `.json`. The format
//! is in docs/soundings.md; the physics is all in the core. Columns the atmosphere does
//! not take are named in one warning; wind columns are left to `flight` (input/winds.rs).

use std::fs;
use std::path::Path;

use aerostrata::model::sounding_io::{read_csv, Options};
use aerostrata::{OutsideTable, Quantity, SoundingLevel, Tabulated};

/// Whether `path` names a JSON sounding (by its extension).
pub fn is_json(path: &Path) -> bool {
    path.extension().is_some_and(|extension| extension.eq_ignore_ascii_case("json"))
}

/// Whether a heading is one of the wind's (read by `flight`, not by the atmosphere).
fn is_wind(heading: &str) -> bool {
    Quantity::from_column(heading).is_ok_and(|c| {
        matches!(
            c.quantity,
            Quantity::WindSpeed | Quantity::WindDirection | Quantity::WindEast | Quantity::WindNorth
        )
    })
}

/// The sounding in `path`, blending into the standard over `blend_m` geopotential metres
/// beyond its first and last rows when given (an error there otherwise).
///
/// # Errors
/// One line naming the file and, from the loader, the line, the column and the value.
pub fn load(path: &Path, blend_m: Option<f64>) -> Result<Tabulated<Vec<SoundingLevel>>, String> {
    let name = path.display();
    let text = fs::read_to_string(path).map_err(|e| format!("cannot read sounding {name}: {e}"))?;
    let table = if is_json(path) {
        serde_json::from_str::<Tabulated<Vec<SoundingLevel>>>(&text).map_err(|e| format!("{name}: {e}"))?
    } else {
        let sounding = read_csv(&text, &Options::default()).map_err(|e| format!("{name}: {e}"))?;
        let others: Vec<String> = sounding
            .ignored
            .iter()
            .filter(|(_, heading)| !is_wind(heading))
            .map(|(column, heading)| format!("{column} '{heading}'"))
            .collect();
        if !others.is_empty() {
            eprintln!(
                "aerostrata: sounding {name}: column{} {} not read (a sounding gives altitude, temperature, \
                 pressure or density, dew point or relative humidity, and winds for flight)",
                if others.len() == 1 { "" } else { "s" },
                others.join(", ")
            );
        }
        sounding.table
    };
    match blend_m {
        None => Ok(table),
        Some(depth_m) => {
            let outside = OutsideTable::BlendIntoUs1976 { depth_m };
            table.with_below(outside).and_then(|t| t.with_above(outside)).map_err(|e| format!("--blend: {e}"))
        }
    }
}
