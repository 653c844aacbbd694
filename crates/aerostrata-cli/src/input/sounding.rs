//! `--sounding FILE`: a tabulated atmosphere (a weather-balloon sounding or a design-day
//! profile) instead of the standard, read by the core's loaders: CSV with a header of
//! quantities and units, or JSON (serde) when the file name ends in `.json`. The format
//! is in docs/soundings.md; the physics is all in the core.

use std::fs;
use std::path::Path;

use aerostrata::model::sounding_io::parse_csv;
use aerostrata::{OutsideTable, SoundingLevel, Tabulated};

/// The sounding in `path`, blending into the standard over `blend_m` geopotential metres
/// beyond its first and last rows when given (an error there otherwise).
///
/// # Errors
/// One line naming the file and, from the loader, the line, the column and the value.
pub fn load(path: &Path, blend_m: Option<f64>) -> Result<Tabulated<Vec<SoundingLevel>>, String> {
    let name = path.display();
    let text = fs::read_to_string(path).map_err(|e| format!("cannot read sounding {name}: {e}"))?;
    let is_json = path.extension().is_some_and(|extension| extension.eq_ignore_ascii_case("json"));
    let table = if is_json {
        serde_json::from_str::<Tabulated<Vec<SoundingLevel>>>(&text).map_err(|e| format!("{name}: {e}"))?
    } else {
        parse_csv(&text).map_err(|e| format!("{name}: {e}"))?
    };
    match blend_m {
        None => Ok(table),
        Some(depth_m) => {
            let outside = OutsideTable::BlendIntoUs1976 { depth_m };
            table.with_below(outside).and_then(|t| t.with_above(outside)).map_err(|e| format!("--blend: {e}"))
        }
    }
}
