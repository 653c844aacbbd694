//! The unit parser (`aerostrata::units::parse` and `read`) and the column-heading parser
//! (`Quantity::from_column`) over arbitrary text: the first byte picks the quantity whose
//! dimension is read, the second its default unit and a plausibility band.

use aerostrata::units::{self, Plausible, Unit, HECTOPASCAL, KELVIN, KELVIN_DIFFERENCE, PASCAL};
use aerostrata::Quantity;

use crate::{finite, message, Bytes};

/// The doors' plausibility bands with the default units they are read in.
const BANDS: [(&Unit, Plausible); 5] = [
    (&KELVIN, Plausible::AIR_TEMPERATURE),
    (&KELVIN, Plausible::DEW_POINT),
    (&KELVIN_DIFFERENCE, Plausible::TEMPERATURE_OFFSET),
    (&HECTOPASCAL, Plausible::SEA_LEVEL_PRESSURE),
    (&PASCAL, Plausible::SURFACE_PRESSURE),
];

/// The target's body.
pub fn run(data: &[u8]) {
    let mut bytes = Bytes::new(data);
    let quantity = Quantity::ALL[bytes.below(Quantity::ALL.len())];
    let choice = bytes.byte();
    let text = bytes.rest();

    let default = if choice & 1 == 0 { quantity.si() } else { quantity.us() };
    match units::parse(text, default.dimension(), default) {
        Ok(reading) => {
            finite("the number read", reading.value);
            finite("the value in SI", reading.si());
            assert_eq!(
                reading.unit.dimension(),
                default.dimension(),
                "a unit of another dimension for {text:?}"
            );
        }
        Err(e) => message(&e),
    }

    let (unit, band) = &BANDS[usize::from(choice >> 1) % BANDS.len()];
    match units::read(text, unit, band) {
        Ok(reading) => {
            let si = reading.si();
            finite("the value in SI", si);
            assert!((band.min_si..=band.max_si).contains(&si), "{si} passed the band {band:?}");
        }
        Err(e) => message(&e),
    }

    match Quantity::from_column(text) {
        Ok(column) => {
            if let Some(unit) = column.unit {
                assert_eq!(unit.dimension(), column.quantity.si().dimension(), "heading {text:?}");
            }
        }
        Err(e) => message(&e),
    }
}
