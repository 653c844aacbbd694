//! `--offset`, `--geopotential`, `--sounding` and `--blend`: the atmosphere a command
//! evaluates (the 1976 standard, on a hot or cold day, or a sounding) and the altitudes
//! in it, read in the user's units and checked against the model's range.

use std::path::PathBuf;

use aerostrata::{Altitude, AltitudeRange, Atmosphere, Quantity, TemperatureOffset, US1976};
use clap::Args;

use crate::failure::Failure;
use crate::format::tidy;
use crate::input::sounding;
use crate::units::UnitSystem;

#[derive(Args)]
pub struct ModelArgs {
    /// Temperature offset dT (a hot day is positive): T = T_std + dT at the standard's
    /// pressure; K, or degF with --units us.
    #[arg(long, value_name = "DT", default_value_t = 0.0, allow_negative_numbers = true)]
    pub offset: f64,
    /// Read altitudes as geopotential instead of geometric.
    #[arg(long)]
    pub geopotential: bool,
    /// Use a sounding instead of the standard: CSV with a header of quantities and units,
    /// or JSON if the name ends in .json (docs/soundings.md). Outside its rows: an error,
    /// unless --blend is given.
    #[arg(long, value_name = "FILE")]
    pub sounding: Option<PathBuf>,
    /// With --sounding: beyond the first and last rows, blend into the standard over this
    /// many geopotential metres (feet with --units us).
    #[arg(long, value_name = "DEPTH", requires = "sounding")]
    pub blend: Option<f64>,
}

impl ModelArgs {
    /// The model the options describe.
    ///
    /// # Errors
    /// [`Failure::Input`] for an offset with a sounding, a bad offset or a bad sounding.
    pub fn model(&self, units: UnitSystem) -> Result<Box<dyn Atmosphere>, Failure> {
        if let Some(path) = &self.sounding {
            if self.offset != 0.0 {
                return Err(Failure::Input(
                    "--offset applies to the standard and cannot be combined with --sounding".to_owned(),
                ));
            }
            let blend = self.blend.map(|depth| units.to_si(Quantity::GeopotentialAltitude, depth));
            return Ok(Box::new(sounding::load(path, blend).map_err(Failure::Input)?));
        }
        Ok(Box::new(offset_model(self.offset, units)?))
    }

    /// Whether the options leave the plain standard (no offset, no sounding).
    pub fn is_plain_standard(&self) -> bool {
        self.offset == 0.0 && self.sounding.is_none()
    }
}

/// The standard with a temperature offset given in `units`.
///
/// # Errors
/// [`Failure::Input`] naming `--offset` when the offset is not finite or too cold.
pub fn offset_model(
    offset: f64,
    units: UnitSystem,
) -> Result<TemperatureOffset<aerostrata::Us1976>, Failure> {
    TemperatureOffset::new(US1976, units.to_si(Quantity::TemperatureOffset, offset))
        .map_err(|e| Failure::Input(format!("--offset: {e}")))
}

/// The lowest and highest altitude of `range`, m, geopotential or geometric.
pub fn band(range: AltitudeRange, geopotential: bool) -> (f64, f64) {
    if geopotential {
        (range.geopotential_min_m, range.geopotential_max_m)
    } else {
        (range.geometric_min_m, range.geometric_max_m)
    }
}

/// The quantity an altitude is: geopotential or geometric.
pub fn altitude_quantity(geopotential: bool) -> Quantity {
    if geopotential {
        Quantity::GeopotentialAltitude
    } else {
        Quantity::GeometricAltitude
    }
}

/// An altitude given in `units`, checked against `range`; outside SI the message names
/// the value and the range in the user's unit.
///
/// # Errors
/// The core's message for a value that is not finite or outside `range`.
pub fn altitude_in(
    units: UnitSystem,
    value: f64,
    geopotential: bool,
    range: AltitudeRange,
) -> Result<Altitude, String> {
    let quantity = altitude_quantity(geopotential);
    let unit = units.unit(quantity);
    let meters = unit.to_si(value);
    let altitude =
        if geopotential { Altitude::geopotential_m(meters) } else { Altitude::geometric_m(meters) };
    let checked = altitude.and_then(|a| range.check(a));
    if unit == quantity.si() {
        return checked.map_err(|e| e.to_string());
    }
    let label = quantity.info().label;
    if !value.is_finite() {
        return Err(format!("{label} must be a finite number, got {value}"));
    }
    let (lo, hi) = band(range, geopotential);
    checked.map_err(|_| {
        let symbol = unit.symbol();
        let user = |m: f64| tidy(unit.from_si(m));
        format!(
            "{label} {} {symbol} is outside the allowed range {} to {} {symbol}",
            tidy(value),
            user(lo),
            user(hi)
        )
    })
}
