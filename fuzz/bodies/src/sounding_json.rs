//! Soundings in JSON (the core's serde support, behind `--model sounding=FILE.json`):
//! arbitrary text deserialised as a table, which goes through the constructors' checks
//! row by row; a table read is evaluated across and beyond its rows and must serialise
//! back to JSON that reads as the same table.

use aerostrata::{SoundingLevel, Tabulated};

use crate::{finite, message, probe, text};

/// The target's body.
pub fn run(data: &[u8]) {
    let text = text(data);
    match serde_json::from_str::<Tabulated<Vec<SoundingLevel>>>(text) {
        Ok(table) => {
            let rows: Vec<f64> = table.levels().iter().map(|l| l.row().altitude_m).collect();
            for &altitude_m in &rows {
                finite("a row's altitude", altitude_m);
            }
            probe(&table, &rows);
            let written = serde_json::to_string(&table).expect("a table serialises");
            let again: Tabulated<Vec<SoundingLevel>> = serde_json::from_str(&written)
                .unwrap_or_else(|e| panic!("{written} does not read back: {e}"));
            assert_eq!(again.levels(), table.levels(), "the rows changed through JSON");
        }
        Err(e) => message(&e),
    }
}
