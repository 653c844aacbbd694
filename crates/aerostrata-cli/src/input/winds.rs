//! `--winds FILE` for `flight`: a CSV of altitude and wind (`wind_speed` with
//! `wind_direction`, the direction it blows from, or `wind_east` with `wind_north`, each
//! heading with its unit), read by the core's reader of wind files into a
//! `WindProfile` of geometric altitude (east and north components linear between levels,
//! the end levels held beyond the profile). A CSV sounding's own wind columns are read
//! with the sounding (input/sounding.rs).

use std::fs::File;
use std::path::Path;

use aerostrata::model::sounding_io::{read_winds_csv, Options};
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::Quantity;

use crate::failure::Failure;
use crate::input::lines::read_text;
use crate::units::UnitSystem;

/// A profile as the flight scan takes it.
pub type Winds = WindProfile<Vec<WindLevel>>;

/// One warning line naming the columns of `what` (`sounding day.csv`) a reader left out.
pub fn warn_ignored(what: &str, ignored: &[(usize, String)]) {
    if ignored.is_empty() {
        return;
    }
    let names: Vec<String> =
        ignored.iter().map(|(column, heading)| format!("{column} '{heading}'")).collect();
    eprintln!(
        "aerostrata: {what}: column{} {} not read",
        if names.len() == 1 { "" } else { "s" },
        names.join(", ")
    );
}

/// The winds of `--winds FILE`; headings without a unit read in `units`.
///
/// # Errors
/// [`Failure::Input`] naming the option, the file and, from the reader, the line, the
/// column and the value.
pub fn load_file(path: &Path, units: UnitSystem) -> Result<Winds, Failure> {
    let name = path.display();
    let file = File::open(path).map_err(|e| Failure::Input(format!("--winds: cannot read {name}: {e}")))?;
    let text = read_text(file, |_| Ok(())).map_err(|e| Failure::Input(format!("--winds {name}: {e}")))?;
    let default_unit = match units {
        UnitSystem::Si => Quantity::si,
        UnitSystem::Us => Quantity::us,
    };
    let options = Options { default_unit, ..Options::default() };
    let file = read_winds_csv(&text, &options).map_err(|e| Failure::Input(format!("--winds {name}: {e}")))?;
    warn_ignored(&format!("--winds {name}"), &file.ignored);
    Ok(file.winds)
}
