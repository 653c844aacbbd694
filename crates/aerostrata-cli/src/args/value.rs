//! The value of an option that carries a dimension: a number with an optional unit
//! (`15C`, `288.15K`, `1020hPa`, `35000ft`, `250kt`, `+27F`), read by the core's one
//! reader ([`aerostrata::units::read`]) and checked against what the option can plausibly
//! be. A bare number is in the SI unit of the option's quantity; where it is implausible
//! there and plausible in another unit, it is refused with the fix spelled out
//! (`--temperature 15: 15 K is below any air temperature ...; write 15degC or 288.15K`).
//! With `--units us` a bare number is refused as ambiguous: `--units` chooses the
//! output's units, and an option's input is always in its own stated unit or SI.

use aerostrata::units::{self, Plausible, Reading, Unit};
use aerostrata::Quantity;

use crate::failure::Failure;
use crate::units::UnitSystem;

/// An option with a dimension: its name, its quantity (whose SI unit a bare number is
/// in, and whose US unit a bare number could be mistaken for), and its plausible band.
#[derive(Clone, Copy, Debug)]
pub struct Dimensional {
    /// The option as typed (`--temperature`).
    pub option: &'static str,
    /// The quantity the value is.
    pub quantity: Quantity,
    /// What the value can plausibly be, in SI.
    pub band: Plausible,
    /// The value written with units, for the help (`15C, 288.15K, 59F`).
    pub examples: &'static str,
}

/// Altitudes of the atmosphere: the band every model of the tool covers, the 1976
/// standard's -5 km to 1000 km (a layered model from a file is evaluated within it too).
const ALTITUDE: Plausible = Plausible { min_si: -5_000.0, max_si: 1_000_000.0, what: "altitude" };
/// A table's altitude step: finer than a millimetre is a slip of the keyboard, coarser
/// than the 1005 km the standard spans gives a single row (common practice, no source).
const STEP: Plausible = Plausible { min_si: 0.001, max_si: 1_005_000.0, what: "altitude step" };
/// A static pressure: from vacuum to above the 1976 standard's 177 kPa at -5 km (from
/// memory of the standard's table); the core refuses 0 itself.
const STATIC_PRESSURE: Plausible = Plausible { min_si: 0.0, max_si: 200_000.0, what: "static pressure" };
/// An airspeed: from rest to 10 km/s, above the 7.8 km/s of a low orbit, the fastest
/// anything moves through air (common practice, no source).
const AIRSPEED: Plausible = Plausible { min_si: 0.0, max_si: 10_000.0, what: "airspeed" };
/// A drag reference area: from 1 cm2 (a body 11 mm across) to 10 000 m2 (a large
/// parachute's canopy is a few thousand; common practice, no source).
const AREA: Plausible = Plausible { min_si: 1e-4, max_si: 10_000.0, what: "reference area" };
/// A reference length for the Reynolds number: 1 mm to 1 km (common practice, no source).
const LENGTH: Plausible = Plausible { min_si: 0.001, max_si: 1_000.0, what: "reference length" };
/// How far a sounding is blended into the standard beyond its rows: up to 50 km, the
/// depth the core's model language takes (`sounding=FILE,blend=DH`); the core refuses 0.
const BLEND: Plausible = Plausible { min_si: 0.0, max_si: 50_000.0, what: "blend depth" };

/// `--temperature`: outside (static) air temperature.
pub const TEMPERATURE: Dimensional = Dimensional {
    option: "--temperature",
    quantity: Quantity::Temperature,
    band: Plausible::AIR_TEMPERATURE,
    examples: "15C, 288.15K, 59F",
};
/// `--dew-point`: the air's dew point.
pub const DEW_POINT: Dimensional = Dimensional {
    option: "--dew-point",
    quantity: Quantity::DewPoint,
    band: Plausible::DEW_POINT,
    examples: "12C, 285.15K, 54F",
};
/// A relative humidity: 0 to 100 % with respect to liquid water (the core refuses more).
const RELATIVE_HUMIDITY_BAND: Plausible = Plausible { min_si: 0.0, max_si: 100.0, what: "relative humidity" };
/// `--relative-humidity`: the air's relative humidity.
pub const RELATIVE_HUMIDITY: Dimensional = Dimensional {
    option: "--relative-humidity",
    quantity: Quantity::RelativeHumidity,
    band: RELATIVE_HUMIDITY_BAND,
    examples: "65%, 65percent",
};
/// `--offset`: the day's temperature offset from the standard.
pub const OFFSET: Dimensional = Dimensional {
    option: "--offset",
    quantity: Quantity::TemperatureOffset,
    band: Plausible::TEMPERATURE_OFFSET,
    examples: "+15K, -10C, +27F",
};
/// `--qnh`: the altimeter setting.
pub const QNH: Dimensional = Dimensional {
    option: "--qnh",
    quantity: Quantity::AltimeterSetting,
    band: Plausible::SEA_LEVEL_PRESSURE,
    examples: "1020hPa, 30.12inHg, 102000Pa",
};
/// `--pad`: the pressure on the pad at launch.
pub const PAD: Dimensional = Dimensional {
    option: "--pad",
    quantity: Quantity::StaticPressure,
    band: Plausible::SURFACE_PRESSURE,
    examples: "981hPa, 28.97inHg, 98100Pa",
};
/// `--pressure`: a static pressure.
pub const PRESSURE: Dimensional = Dimensional {
    option: "--pressure",
    quantity: Quantity::StaticPressure,
    band: STATIC_PRESSURE,
    examples: "843hPa, 24.9inHg, 84300Pa",
};
/// `--pressure-altitude`.
pub const PRESSURE_ALTITUDE: Dimensional = Dimensional {
    option: "--pressure-altitude",
    quantity: Quantity::PressureAltitude,
    band: ALTITUDE,
    examples: "10000ft, 3048m",
};
/// `--altitude` (airspeed): a geometric altitude.
pub const ALTITUDE_Z: Dimensional = Dimensional {
    option: "--altitude",
    quantity: Quantity::GeometricAltitude,
    band: ALTITUDE,
    examples: "35000ft, 10km, 10668m",
};
/// `--from` and `--to`: the ends of a table or a plot.
pub const FROM: Dimensional = Dimensional {
    option: "--from",
    quantity: Quantity::GeometricAltitude,
    band: ALTITUDE,
    examples: "0, -2km, 500ft",
};
/// `--to`.
pub const TO: Dimensional = Dimensional {
    option: "--to",
    quantity: Quantity::GeometricAltitude,
    band: ALTITUDE,
    examples: "30km, 100000ft",
};
/// `--step`: a table's altitude step.
pub const STEP_Z: Dimensional = Dimensional {
    option: "--step",
    quantity: Quantity::GeometricAltitude,
    band: STEP,
    examples: "500m, 5000ft",
};
/// `--blend`: the depth a sounding blends into the standard over.
pub const BLEND_DEPTH: Dimensional = Dimensional {
    option: "--blend",
    quantity: Quantity::GeopotentialAltitude,
    band: BLEND,
    examples: "5km, 2000m",
};
/// `--area`: the drag's reference area.
pub const REFERENCE_AREA: Dimensional = Dimensional {
    option: "--area",
    quantity: Quantity::ReferenceArea,
    band: AREA,
    examples: "0.0182m2, 182cm2, 0.196ft2",
};
/// `--length`: the Reynolds number's reference length.
pub const REFERENCE_LENGTH: Dimensional = Dimensional {
    option: "--length",
    quantity: Quantity::ReferenceLength,
    band: LENGTH,
    examples: "3m, 9.8ft",
};
/// `--cas`.
pub const CAS: Dimensional = Dimensional {
    option: "--cas",
    quantity: Quantity::CalibratedAirspeed,
    band: AIRSPEED,
    examples: "250kt, 128.6m/s",
};
/// `--eas`.
pub const EAS: Dimensional = Dimensional {
    option: "--eas",
    quantity: Quantity::EquivalentAirspeed,
    band: AIRSPEED,
    examples: "250kt, 128.6m/s",
};
/// `--tas`.
pub const TAS: Dimensional = Dimensional {
    option: "--tas",
    quantity: Quantity::TrueAirspeed,
    band: AIRSPEED,
    examples: "450kt, 231.5m/s",
};

impl Dimensional {
    /// The option's help: `what`, then how its value is written, its unit and its band.
    pub fn help(&self, what: &str) -> String {
        let si = self.quantity.si();
        format!(
            "{what}. A number and its unit ({}); a bare number is {}. Accepted: {} to {} {}",
            self.examples,
            si.symbol(),
            units::Tidy(si.from_si(self.band.min_si)),
            units::Tidy(si.from_si(self.band.max_si)),
            si.symbol()
        )
    }

    /// The same option under another name (`--from` and `--to` of a geopotential table).
    pub const fn of(self, quantity: Quantity) -> Self {
        Dimensional { quantity, ..self }
    }

    /// `text` read as this option's value: a bare number in the SI unit, refused as
    /// ambiguous with `--units us` (unless it means the same in both, as 0 m and 0 ft do).
    ///
    /// # Errors
    /// [`Failure::Input`] naming the option and the text: not a value of the quantity,
    /// ambiguous, or outside the band.
    pub fn read(&self, text: &str, units: UnitSystem) -> Result<Reading, Failure> {
        self.read_in(text, None, units)
    }

    /// As [`Dimensional::read`], a bare number in `bare` when given (the airspeeds'
    /// `--unit`): the user has then said what a bare number is, and it is not ambiguous.
    ///
    /// # Errors
    /// As [`Dimensional::read`].
    pub fn read_in(
        &self,
        text: &str,
        bare: Option<&'static Unit>,
        units: UnitSystem,
    ) -> Result<Reading, Failure> {
        let trimmed = text.trim();
        let fail = |message: String| {
            let prefix = if trimmed.is_empty() {
                self.option.to_owned()
            } else {
                format!("{} {trimmed}", self.option)
            };
            Failure::Input(format!("{prefix}: {message}"))
        };
        let (si, us) = (self.quantity.si(), self.quantity.us());
        let default = bare.unwrap_or(si);
        let reading = units::parse(text, default.dimension(), default).map_err(|e| fail(e.to_string()))?;
        if !reading.explicit
            && bare.is_none()
            && units == UnitSystem::Us
            && si.to_si(reading.value) != us.to_si(reading.value)
        {
            return Err(fail(format!(
                "with --units us a bare number could be {} or {}; write {trimmed}{} or {trimmed}{}",
                si.symbol(),
                us.symbol(),
                us.symbol(),
                si.symbol()
            )));
        }
        // A unit the user wrote is their word: the band is said in it too.
        let default = if reading.explicit { reading.unit } else { default };
        units::read(text, default, &self.band).map_err(|e| fail(e.to_string()))
    }

    /// As [`Dimensional::read`], the value in SI.
    ///
    /// # Errors
    /// As [`Dimensional::read`].
    pub fn si(&self, text: &str, units: UnitSystem) -> Result<f64, Failure> {
        self.read(text, units).map(|r| r.si())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn message(option: &Dimensional, text: &str, units: UnitSystem) -> String {
        match option.read(text, units) {
            Err(Failure::Input(message)) => message,
            other => panic!("{text}: {other:?}"),
        }
    }

    #[test]
    fn values_with_units_and_bare_si() {
        let si = |option: &Dimensional, text: &str| option.si(text, UnitSystem::Si).unwrap();
        // 15 + 273.15 is 288.15 to the last bit (the Celsius conversion adds exactly).
        assert_eq!(si(&TEMPERATURE, "15C"), 288.15);
        assert_eq!(si(&TEMPERATURE, "288.15"), 288.15);
        assert_eq!(si(&QNH, "1020hPa"), 102_000.0);
        assert_eq!(si(&OFFSET, "-10"), -10.0);
        assert_eq!(si(&ALTITUDE_Z, "35000ft"), 35_000.0 * 0.3048);
        // 27 degF as a difference is 15 K (27 x 5/9).
        assert!((si(&OFFSET, "+27F") - 15.0).abs() < 1e-13);
        assert_eq!(TEMPERATURE.si("59F", UnitSystem::Us).unwrap(), si(&TEMPERATURE, "59F"));
        assert_eq!(ALTITUDE_Z.si("0", UnitSystem::Us).unwrap(), 0.0, "0 m is 0 ft");
        let kt = CAS.read_in("250", Some(&aerostrata::units::KNOT), UnitSystem::Us).unwrap();
        assert_eq!((kt.value, kt.unit.symbol()), (250.0, "kt"));
    }

    #[test]
    fn a_bare_number_that_cannot_be_meant_is_refused_with_the_fix() {
        assert_eq!(
            message(&TEMPERATURE, "15", UnitSystem::Si),
            "--temperature 15: 15 K is below any air temperature (120 to 350 K); write 15degC or 288.15K, \
             or 15degF (263.706 K)"
        );
        assert!(
            message(&QNH, "1020", UnitSystem::Si).starts_with("--qnh 1020: 1020 Pa is below any sea-level")
        );
        assert_eq!(
            message(&ALTITUDE_Z, "35000", UnitSystem::Us),
            "--altitude 35000: with --units us a bare number could be m or ft; write 35000ft or 35000m"
        );
        assert_eq!(
            message(&ALTITUDE_Z, "35000kg", UnitSystem::Si).split(": ").next(),
            Some("--altitude 35000kg")
        );
        assert_eq!(message(&STEP_Z, " ", UnitSystem::Si), "--step: no value given");
        assert_eq!(
            message(&TEMPERATURE, "-300C", UnitSystem::Si),
            "--temperature -300C: -300 degC is below any air temperature (-153.15 to 76.85 degC)"
        );
    }

    #[test]
    fn the_help_states_the_unit_and_the_band() {
        assert_eq!(
            TEMPERATURE.help("Outside air temperature"),
            "Outside air temperature. A number and its unit (15C, 288.15K, 59F); a bare number is K. \
             Accepted: 120 to 350 K"
        );
        assert!(REFERENCE_AREA.help("Area").ends_with("Accepted: 0.0001 to 10000 m2"));
    }
}
