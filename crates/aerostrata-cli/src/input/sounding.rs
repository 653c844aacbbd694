//! `--sounding FILE`: a tabulated atmosphere (a weather-balloon sounding or a design-day
//! profile) instead of the standard, read by the core's loaders: CSV with a header of
//! quantities and units, or JSON (serde) when the file name ends in `.json`. The format
//! is in docs/soundings.md; the physics is all in the core. A CSV sounding's wind columns
//! give its winds (which `flight` blows over the samples); columns the reader does not
//! take are named in one warning.

use std::fs::{self, File};
use std::path::Path;

use aerostrata::model::sounding_io::{read_csv, Options};
use aerostrata::{Error, OutsideTable, SoundingLevel, Tabulated};

use crate::input::lines::read_text;

use crate::input::winds::{warn_ignored, Winds};
/// Whether `path` names a JSON sounding (by its extension).
pub fn is_json(path: &Path) -> bool {
    path.extension().is_some_and(|extension| extension.eq_ignore_ascii_case("json"))
}

/// The sounding in `path`, blending into the standard over `blend_m` geopotential metres
/// beyond its first and last rows when given (an error there otherwise), and the winds
/// of its wind columns where a CSV sounding has them.
///
/// # Errors
/// One line naming the file and, from the loader, the line, the column and the value.
pub fn load(
    path: &Path,
    blend_m: Option<f64>,
) -> Result<(Tabulated<Vec<SoundingLevel>>, Option<Winds>), String> {
    let name = path.display();
    let json = is_json(path);
    // A CSV sounding's header is checked before the rest of the file is read: the header
    // alone reads as a table of no rows, so any other error there is the header's.
    // (JSON is read as it is, whose one line may be long, and whose errors give columns.)
    let header_only = |text: &str| match read_csv(text, &Options::default()) {
        Err(e) if !matches!(e.model_error(), Some(Error::TooFewRows { .. })) => Err(e.to_string()),
        _ => Ok(()),
    };
    let cannot = |e: std::io::Error| format!("cannot read sounding {name}: {e}");
    let text = if json {
        fs::read_to_string(path).map_err(cannot)?
    } else {
        read_text(File::open(path).map_err(cannot)?, header_only).map_err(|e| format!("{name}: {e}"))?
    };
    let (table, winds) = if json {
        (
            serde_json::from_str::<Tabulated<Vec<SoundingLevel>>>(&text)
                .map_err(|e| format!("{name}: {e}"))?,
            None,
        )
    } else {
        let sounding = read_csv(&text, &Options::default()).map_err(|e| format!("{name}: {e}"))?;
        warn_ignored(&format!("sounding {name}"), &sounding.ignored);
        (sounding.table, sounding.winds)
    };
    let table = match blend_m {
        None => table,
        Some(depth_m) => {
            let outside = OutsideTable::BlendIntoUs1976 { depth_m };
            table
                .with_below(outside)
                .and_then(|t| t.with_above(outside))
                .map_err(|e| format!("--blend: {e}"))?
        }
    };
    Ok((table, winds))
}
