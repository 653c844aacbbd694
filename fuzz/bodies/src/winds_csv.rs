//! The winds reader (`aerostrata::model::sounding_io::read_winds_csv`, behind
//! `--winds FILE`) over arbitrary text, in SI and US default units; the winds read are
//! evaluated at the probe altitudes and at their own levels.

use aerostrata::model::sounding_io::{read_winds_csv, Options};
use aerostrata::Quantity;

use crate::sounding_csv::check_winds;
use crate::{message, text};

/// The target's body.
pub fn run(data: &[u8]) {
    let text = text(data);
    for (default_unit, plausibility) in [(Quantity::si as fn(Quantity) -> _, true), (Quantity::us, false)] {
        match read_winds_csv(text, &Options { default_unit, plausibility }) {
            Ok(file) => {
                let levels: Vec<f64> = file.winds.levels().iter().map(|l| l.altitude_m).collect();
                check_winds(&file.winds, &levels);
            }
            Err(e) => message(&e),
        }
    }
}
