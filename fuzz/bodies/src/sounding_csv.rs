//! The sounding reader (`aerostrata::model::sounding_io::read_csv`, behind `--model
//! sounding=FILE` and `aerostrata sounding`) over arbitrary text, with SI and US default
//! units and the plausibility check on and off; a sounding read is evaluated across and
//! beyond its rows, and its winds wherever it has them.

use aerostrata::model::sounding_io::{read_csv, Options};
use aerostrata::wind::{WindLevel, WindProfile};
use aerostrata::Quantity;

use crate::{finite, message, probe, text, PROBE_ALTITUDES_M};

/// The target's body.
pub fn run(data: &[u8]) {
    let text = text(data);
    for (default_unit, plausibility) in [(Quantity::si as fn(Quantity) -> _, true), (Quantity::us, false)] {
        match read_csv(text, &Options { default_unit, plausibility }) {
            Ok(sounding) => {
                let rows: Vec<f64> = sounding.table.levels().iter().map(|l| l.row().altitude_m).collect();
                for &altitude_m in &rows {
                    finite("a row's altitude", altitude_m);
                }
                probe(&sounding.table, &rows);
                if let Some(winds) = &sounding.winds {
                    check_winds(winds, &rows);
                }
                for (_, heading) in &sounding.ignored {
                    assert!(heading.chars().count() <= 1_000_000, "an ignored heading's length");
                }
            }
            Err(e) => message(&e),
        }
    }
}

/// Evaluates a wind profile at the probe altitudes and at `extra`: a wind or an error,
/// never a number that is not finite.
pub fn check_winds(winds: &WindProfile<Vec<WindLevel>>, extra: &[f64]) {
    for &altitude_m in PROBE_ALTITUDES_M.iter().chain(extra) {
        match winds.at(altitude_m) {
            Ok(wind) => {
                finite("the wind's east component", wind.east_m_s);
                finite("the wind's north component", wind.north_m_s);
            }
            Err(e) => message(&e),
        }
    }
}
