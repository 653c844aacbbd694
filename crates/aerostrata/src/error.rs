//! The core's one error type. Every message names the offending value and, where there
//! is one, the allowed range, so that a C status detail, a JS `Error` or a CLI line can
//! show it unchanged.

/// Everything that can go wrong in the core.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[non_exhaustive]
pub enum Error {
    /// An input was NaN or infinite.
    #[error("{quantity} must be a finite number, got {}", num(.value))]
    NotFinite {
        /// What the value was, in the trade's words ("geometric altitude").
        quantity: &'static str,
        /// The value given.
        value: f64,
    },
    /// A finite input lay outside the closed range a model or formula accepts.
    #[error("{quantity} {} {unit} is outside the allowed range {} to {} {unit}", num(.value), num(.min), num(.max))]
    OutOfRange {
        /// What the value was.
        quantity: &'static str,
        /// The unit of `value`, `min` and `max`.
        unit: &'static str,
        /// The value given.
        value: f64,
        /// The lowest value allowed.
        min: f64,
        /// The highest value allowed.
        max: f64,
    },
    /// An input that must be strictly positive was zero or negative.
    #[error("{quantity} must be greater than 0 {unit}, got {} {unit}", num(.value))]
    NotPositive {
        /// What the value was.
        quantity: &'static str,
        /// The unit of `value`.
        unit: &'static str,
        /// The value given.
        value: f64,
    },
    /// A layer of a layered model is inconsistent; `index` counts from 0.
    #[error("layer {index}: {problem}, got {value}")]
    InvalidLayer {
        /// Which layer (0 is the lowest).
        index: usize,
        /// What is wrong with it, naming the allowed values.
        problem: &'static str,
        /// The offending value.
        value: f64,
    },
    /// A property the model does not define at this altitude (for example viscosity in
    /// the free-molecular upper atmosphere).
    #[error("{quantity} is not defined by the model at geometric altitude {altitude_m} m")]
    Undefined {
        /// The property asked for.
        quantity: &'static str,
        /// Where it was asked for, geometric metres.
        altitude_m: f64,
    },
    /// A dimensionless finite input (a Mach number, a pressure ratio, a ratio of specific
    /// heats) lay outside the closed range a formula accepts.
    #[error("{quantity} {} is outside the allowed range {} to {}", num(.value), num(.min), num(.max))]
    RatioOutOfRange {
        /// What the value was ("Mach number", "total-to-static pressure ratio").
        quantity: &'static str,
        /// The value given.
        value: f64,
        /// The lowest value allowed.
        min: f64,
        /// The highest value allowed.
        max: f64,
    },
    /// A dimensionless input that must be strictly positive (a drag coefficient) was zero
    /// or negative.
    #[error("{quantity} must be greater than 0, got {}", num(.value))]
    RatioNotPositive {
        /// What the value was.
        quantity: &'static str,
        /// The value given.
        value: f64,
    },
    /// A point of a user table or series (a drag-coefficient table, the samples of a
    /// flight) is invalid; `index` counts from 0.
    #[error("{table} point {index}: {problem}, got {value}")]
    InvalidPoint {
        /// Which table or series ("drag table", "flight sample").
        table: &'static str,
        /// Which point (0 is the first).
        index: usize,
        /// What is wrong with it, naming the allowed values.
        problem: &'static str,
        /// The offending value.
        value: f64,
    },
    /// An iterative solver did not meet its tolerance within its iteration budget.
    #[error("{solver} did not converge within {iterations} iterations")]
    NoConvergence {
        /// Which solver ("terminal-velocity solver").
        solver: &'static str,
        /// The iteration budget it used up.
        iterations: u32,
    },
    /// A tabulated atmosphere (a sounding) was given fewer than two rows.
    #[error("a table needs at least 2 rows, got {count}")]
    TooFewRows {
        /// How many rows were given.
        count: usize,
    },
    /// A value in a row of a table was NaN or infinite; `row` counts from 0.
    #[error("row {row}: {quantity} must be a finite number, got {value}")]
    RowNotFinite {
        /// Which row (0 is the first).
        row: usize,
        /// Which value of the row ("temperature", "dew point").
        quantity: &'static str,
        /// The value given.
        value: f64,
    },
    /// The altitudes of a table do not increase strictly (by at least the minimum row
    /// spacing) from row to row.
    #[error("row {row}: altitude {altitude_m} m must be at least {min_spacing_m} m above the previous row's {previous_m} m")]
    AltitudeNotIncreasing {
        /// Which row (0 is the first).
        row: usize,
        /// Its altitude, m (in the table's kind of altitude).
        altitude_m: f64,
        /// The previous row's altitude, m.
        previous_m: f64,
        /// The smallest spacing allowed between rows, m.
        min_spacing_m: f64,
    },
    /// A row of a table has a temperature at or below 0 K.
    #[error("row {row}: temperature must be above 0 K, got {temperature_k} K")]
    RowTemperatureNotPositive {
        /// Which row (0 is the first).
        row: usize,
        /// The temperature given (after conversion to kelvin), K.
        temperature_k: f64,
    },
    /// A row of a table has a pressure or a density that is zero or negative.
    #[error("row {row}: {quantity} must be greater than 0 {unit}, got {value} {unit}")]
    RowNotPositive {
        /// Which row (0 is the first).
        row: usize,
        /// "pressure" or "density".
        quantity: &'static str,
        /// The unit of `value`.
        unit: &'static str,
        /// The value given.
        value: f64,
    },
    /// The pressure of a table (given, or derived from its density) does not fall from
    /// one row to the next.
    #[error("row {row}: pressure {pressure_pa} Pa must be below the previous row's {previous_pa} Pa")]
    PressureNotDecreasing {
        /// Which row (0 is the first).
        row: usize,
        /// Its pressure, Pa.
        pressure_pa: f64,
        /// The previous row's pressure, Pa.
        previous_pa: f64,
    },
    /// A row's relative humidity lies outside 0 to 100 %.
    #[error("row {row}: relative humidity {percent} % is outside the allowed range 0 to 100 %")]
    RelativeHumidityOutOfRange {
        /// Which row (0 is the first).
        row: usize,
        /// The relative humidity given, %.
        percent: f64,
    },
    /// A row's dew point is above its temperature.
    #[error("row {row}: dew point {dew_point_k} K must not be above the temperature {temperature_k} K")]
    DewPointAboveTemperature {
        /// Which row (0 is the first).
        row: usize,
        /// The dew point given, K.
        dew_point_k: f64,
        /// The row's temperature, K.
        temperature_k: f64,
    },
    /// A finite value of a table row lies outside the closed range the model accepts.
    #[error("row {row}: {quantity} {} {unit} is outside the allowed range {} to {} {unit}", num(.value), num(.min), num(.max))]
    RowOutOfRange {
        /// Which row (0 is the first).
        row: usize,
        /// What the value was.
        quantity: &'static str,
        /// The unit of `value`, `min` and `max`.
        unit: &'static str,
        /// The value given.
        value: f64,
        /// The lowest value allowed.
        min: f64,
        /// The highest value allowed.
        max: f64,
    },
    /// A row of a table gives a different set of quantities than the table needs (for
    /// example a density where the first row gives a pressure).
    #[error("row {row}: {problem}")]
    RowColumns {
        /// Which row (0 is the first).
        row: usize,
        /// What is wrong, naming what is expected.
        problem: &'static str,
    },
    /// Between two rows of a table, the given pressures fall much faster or slower than
    /// hydrostatic balance at the rows' temperatures allows.
    #[error("rows {row} and {}: the pressure falls {ratio} times as fast as hydrostatic balance at the rows' temperatures implies; the allowed range is {min} to {max}", .row + 1)]
    NotHydrostatic {
        /// The lower row of the pair (0 is the first).
        row: usize,
        /// The ratio of the given to the hydrostatic fall of ln p (the pair's effective
        /// gravity over g0).
        ratio: f64,
        /// The lowest ratio allowed.
        min: f64,
        /// The highest ratio allowed.
        max: f64,
    },
    /// A row's water-vapour pressure (from its dew point or relative humidity) is not
    /// below its pressure.
    #[error(
        "row {row}: vapour pressure {vapour_pressure_pa} Pa must be below the pressure {pressure_pa} Pa"
    )]
    VapourPressureTooHigh {
        /// Which row (0 is the first).
        row: usize,
        /// The vapour pressure, Pa.
        vapour_pressure_pa: f64,
        /// The row's pressure, Pa.
        pressure_pa: f64,
    },
    /// Caller-provided storage is shorter than the data to be put in it.
    #[error("storage holds {len} levels, the table has {needed} rows")]
    StorageTooSmall {
        /// How many entries are needed.
        needed: usize,
        /// How many the storage holds.
        len: usize,
    },
}

/// A number as a message shows it: the shortest digits that read back to the same f64,
/// in exponent form when very small or very large (so that a limit of 7.5e-9 Pa does not
/// print as 0.0000000075...).
pub(crate) struct Num(f64);

impl core::fmt::Display for Num {
    fn fmt(&self, f: &mut core::fmt::Formatter<'_>) -> core::fmt::Result {
        let magnitude = self.0.abs();
        if magnitude != 0.0 && magnitude.is_finite() && !(1e-4..1e9).contains(&magnitude) {
            write!(f, "{:e}", self.0)
        } else {
            write!(f, "{}", self.0)
        }
    }
}

fn num(value: &f64) -> Num {
    Num(*value)
}

/// Shorthand for results of the core.
pub type Result<T> = core::result::Result<T, Error>;

/// `value` if finite, else [`Error::NotFinite`].
#[inline]
pub(crate) fn finite(quantity: &'static str, value: f64) -> Result<f64> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(Error::NotFinite { quantity, value })
    }
}

/// `value` if finite and strictly positive.
#[inline]
pub(crate) fn positive(quantity: &'static str, unit: &'static str, value: f64) -> Result<f64> {
    let value = finite(quantity, value)?;
    if value > 0.0 {
        Ok(value)
    } else {
        Err(Error::NotPositive { quantity, unit, value })
    }
}

/// `value` if finite and within `[min, max]`.
#[inline]
pub(crate) fn within(
    quantity: &'static str,
    unit: &'static str,
    value: f64,
    min: f64,
    max: f64,
) -> Result<f64> {
    let value = finite(quantity, value)?;
    if (min..=max).contains(&value) {
        Ok(value)
    } else {
        Err(Error::OutOfRange { quantity, unit, value, min, max })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn messages_show_tiny_and_huge_limits_in_exponent_form() {
        let e =
            Error::OutOfRange { quantity: "pressure", unit: "Pa", value: 2e6, min: 7.5e-9, max: 177_761.5 };
        assert_eq!(e.to_string(), "pressure 2000000 Pa is outside the allowed range 7.5e-9 to 177761.5 Pa");
        let e = Error::RatioOutOfRange { quantity: "Mach number", value: -0.5, min: 0.0, max: 1e12 };
        assert_eq!(e.to_string(), "Mach number -0.5 is outside the allowed range 0 to 1e12");
        let e = Error::NotFinite { quantity: "altitude", value: f64::NAN };
        assert_eq!(e.to_string(), "altitude must be a finite number, got NaN");
        // The digits still read back to the very value.
        assert_eq!(Num(6.633232327863704e-8).to_string().parse::<f64>(), Ok(6.633232327863704e-8));
    }
}
