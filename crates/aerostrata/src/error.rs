//! The core's one error type. Every message names the offending value and, where there
//! is one, the allowed range, so that a C status detail, a JS `Error` or a CLI line can
//! show it unchanged. The wording lives in one place, [`Error::message_parts`]: `Display`
//! writes it with Rust's number formatting, and a door that cannot afford that machinery
//! (the size-budgeted WebAssembly module) writes the same parts with its own.

/// Everything that can go wrong in the core.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[non_exhaustive]
pub enum Error {
    /// An input was NaN or infinite.
    NotFinite {
        /// What the value was, in the trade's words ("geometric altitude").
        quantity: &'static str,
        /// The value given.
        value: f64,
    },
    /// A finite input lay outside the closed range a model or formula accepts.
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
    NotPositive {
        /// What the value was.
        quantity: &'static str,
        /// The unit of `value`.
        unit: &'static str,
        /// The value given.
        value: f64,
    },
    /// A layer of a layered model is inconsistent; `index` counts from 0.
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
    Undefined {
        /// The property asked for.
        quantity: &'static str,
        /// Where it was asked for, geometric metres.
        altitude_m: f64,
    },
    /// A dimensionless finite input (a Mach number, a pressure ratio, a ratio of specific
    /// heats) lay outside the closed range a formula accepts.
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
    RatioNotPositive {
        /// What the value was.
        quantity: &'static str,
        /// The value given.
        value: f64,
    },
    /// A point of a user table or series (a drag-coefficient table, the samples of a
    /// flight) is invalid; `index` counts from 0.
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
    NoConvergence {
        /// Which solver ("terminal-velocity solver").
        solver: &'static str,
        /// The iteration budget it used up.
        iterations: u32,
    },
    /// A tabulated atmosphere (a sounding) was given fewer than two rows.
    TooFewRows {
        /// How many rows were given.
        count: usize,
    },
    /// A value in a row of a table was NaN or infinite; `row` counts from 0.
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
    RowTemperatureNotPositive {
        /// Which row (0 is the first).
        row: usize,
        /// The temperature given (after conversion to kelvin), K.
        temperature_k: f64,
    },
    /// A row of a table has a pressure or a density that is zero or negative.
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
    PressureNotDecreasing {
        /// Which row (0 is the first).
        row: usize,
        /// Its pressure, Pa.
        pressure_pa: f64,
        /// The previous row's pressure, Pa.
        previous_pa: f64,
    },
    /// A row's relative humidity lies outside 0 to 100 %.
    RelativeHumidityOutOfRange {
        /// Which row (0 is the first).
        row: usize,
        /// The relative humidity given, %.
        percent: f64,
    },
    /// A row's dew point is above its temperature.
    DewPointAboveTemperature {
        /// Which row (0 is the first).
        row: usize,
        /// The dew point given, K.
        dew_point_k: f64,
        /// The row's temperature, K.
        temperature_k: f64,
    },
    /// A finite value of a table row lies outside the closed range the model accepts.
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
    RowColumns {
        /// Which row (0 is the first).
        row: usize,
        /// What is wrong, naming what is expected.
        problem: &'static str,
    },
    /// Between two rows of a table, the given pressures fall much faster or slower than
    /// hydrostatic balance at the rows' temperatures allows.
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
    VapourPressureTooHigh {
        /// Which row (0 is the first).
        row: usize,
        /// The vapour pressure, Pa.
        vapour_pressure_pa: f64,
        /// The row's pressure, Pa.
        pressure_pa: f64,
    },
    /// A quantity of the catalogue was asked of a result that does not carry it (a Mach
    /// number of an atmosphere state).
    NotCarried {
        /// The quantity's machine name.
        quantity: &'static str,
        /// The result asked ("an atmosphere state").
        result: &'static str,
    },
    /// A blend from a table into the standard would make pressure rise with altitude
    /// somewhere in it: the table's pressure at its edge is too far from the standard's
    /// for the blend's depth.
    BlendRaisesPressure {
        /// Which side of the table: "below" or "above".
        side: &'static str,
        /// The depth asked for, geopotential m.
        depth_m: f64,
        /// The table's pressure at its edge over the standard's there.
        ratio: f64,
        /// A depth over which the blend would keep pressure falling, geopotential m.
        min_depth_m: f64,
    },
    /// An altitude above 86 km needs the upper atmosphere's tables, which this build loads
    /// at run time (the `upper-loadable` feature without `upper`) and which have not been
    /// loaded: call `model::upper::load_tables` first.
    UpperNotLoaded {
        /// The altitude that needed them, geometric m.
        altitude_m: f64,
    },
    /// A file offered as the upper atmosphere's tables is not this build's tables' file.
    UpperTablesRefused {
        /// What is wrong with it.
        problem: &'static str,
        /// Its length, bytes.
        len: usize,
        /// The length of the file this build reads, bytes.
        expected: usize,
    },
    /// Caller-provided storage is shorter than the data to be put in it.
    StorageTooSmall {
        /// How many entries are needed.
        needed: usize,
        /// How many the storage holds.
        len: usize,
    },
}

/// One piece of an error message, as [`Error::message_parts`] gives them.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum MessagePart {
    /// Words, units and punctuation.
    Text(&'static str),
    /// A value or a limit.
    Number(f64),
    /// A count, a row, layer or point index, an iteration budget.
    Count(usize),
}

impl Error {
    /// The message, piece by piece, in the order it reads; `Display` joins them.
    pub fn message_parts(&self, mut part: impl FnMut(MessagePart)) {
        self.write_parts(&mut part);
    }

    fn write_parts(&self, part: &mut dyn FnMut(MessagePart)) {
        use MessagePart::{Count as C, Number as N, Text as T};
        let mut parts = |pieces: &[MessagePart]| pieces.iter().for_each(|p| part(*p));
        // A row's value errors read as the plain ones, after the row.
        let row_prefix = |row: usize| [T("row "), C(row), T(": ")];
        match *self {
            Error::NotFinite { quantity, value } => parts(&[T(quantity), T(" must be a finite number, got "), N(value)]),
            Error::OutOfRange { quantity, unit, value, min, max } => parts(&[
                T(quantity),
                T(" "),
                N(value),
                T(" "),
                T(unit),
                T(" is outside the allowed range "),
                N(min),
                T(" to "),
                N(max),
                T(" "),
                T(unit),
            ]),
            Error::NotPositive { quantity, unit, value } => parts(&[
                T(quantity),
                T(" must be greater than 0 "),
                T(unit),
                T(", got "),
                N(value),
                T(" "),
                T(unit),
            ]),
            Error::InvalidLayer { index, problem, value } => {
                parts(&[T("layer "), C(index), T(": "), T(problem), T(", got "), N(value)])
            }
            Error::Undefined { quantity, altitude_m } => parts(&[
                T(quantity),
                T(" is not defined by the model at geometric altitude "),
                N(altitude_m),
                T(" m"),
            ]),
            Error::RatioOutOfRange { quantity, value, min, max } => parts(&[
                T(quantity),
                T(" "),
                N(value),
                T(" is outside the allowed range "),
                N(min),
                T(" to "),
                N(max),
            ]),
            Error::RatioNotPositive { quantity, value } => {
                parts(&[T(quantity), T(" must be greater than 0, got "), N(value)])
            }
            Error::InvalidPoint { table, index, problem, value } => {
                parts(&[T(table), T(" point "), C(index), T(": "), T(problem), T(", got "), N(value)])
            }
            Error::NoConvergence { solver, iterations } => {
                parts(&[T(solver), T(" did not converge within "), C(iterations as usize), T(" iterations")])
            }
            Error::TooFewRows { count } => parts(&[T("a table needs at least 2 rows, got "), C(count)]),
            Error::RowNotFinite { row, quantity, value } => {
                parts(&row_prefix(row));
                Error::NotFinite { quantity, value }.write_parts(part);
            }
            Error::AltitudeNotIncreasing { row, altitude_m, previous_m, min_spacing_m } => parts(&[
                T("row "),
                C(row),
                T(": altitude "),
                N(altitude_m),
                T(" m must be at least "),
                N(min_spacing_m),
                T(" m above the previous row's "),
                N(previous_m),
                T(" m"),
            ]),
            Error::RowTemperatureNotPositive { row, temperature_k } => {
                parts(&[T("row "), C(row), T(": temperature must be above 0 K, got "), N(temperature_k), T(" K")])
            }
            Error::RowNotPositive { row, quantity, unit, value } => {
                parts(&row_prefix(row));
                Error::NotPositive { quantity, unit, value }.write_parts(part);
            }
            Error::PressureNotDecreasing { row, pressure_pa, previous_pa } => parts(&[
                T("row "),
                C(row),
                T(": pressure "),
                N(pressure_pa),
                T(" Pa must be below the previous row's "),
                N(previous_pa),
                T(" Pa"),
            ]),
            Error::RelativeHumidityOutOfRange { row, percent } => parts(&[
                T("row "),
                C(row),
                T(": relative humidity "),
                N(percent),
                T(" % is outside the allowed range 0 to 100 %"),
            ]),
            Error::DewPointAboveTemperature { row, dew_point_k, temperature_k } => parts(&[
                T("row "),
                C(row),
                T(": dew point "),
                N(dew_point_k),
                T(" K must not be above the temperature "),
                N(temperature_k),
                T(" K"),
            ]),
            Error::RowOutOfRange { row, quantity, unit, value, min, max } => {
                parts(&row_prefix(row));
                Error::OutOfRange { quantity, unit, value, min, max }.write_parts(part);
            }
            Error::RowColumns { row, problem } => parts(&[T("row "), C(row), T(": "), T(problem)]),
            Error::NotHydrostatic { row, ratio, min, max } => parts(&[
                T("rows "),
                C(row),
                T(" and "),
                C(row.saturating_add(1)),
                T(": the pressure falls "),
                N(ratio),
                T(" times as fast as hydrostatic balance at the rows' temperatures implies; the allowed range is "),
                N(min),
                T(" to "),
                N(max),
            ]),
            Error::VapourPressureTooHigh { row, vapour_pressure_pa, pressure_pa } => parts(&[
                T("row "),
                C(row),
                T(": vapour pressure "),
                N(vapour_pressure_pa),
                T(" Pa must be below the pressure "),
                N(pressure_pa),
                T(" Pa"),
            ]),
            Error::NotCarried { quantity, result } => parts(&[T(quantity), T(" is not a quantity of "), T(result)]),
            Error::StorageTooSmall { needed, len } => {
                parts(&[T("storage holds "), C(len), T(" levels, the table has "), C(needed), T(" rows")])
            }
            Error::UpperNotLoaded { altitude_m } => parts(&[
                T("geometric altitude "),
                N(altitude_m),
                T(" m is above 86 km, where the upper atmosphere's tables are needed and are not loaded: "),
                T("load them first (aerostrata::model::upper::load_tables)"),
            ]),
            Error::UpperTablesRefused { problem, len, expected } => parts(&[
                T("the upper-atmosphere tables file of "),
                C(len),
                T(" bytes was refused (this build reads one of "),
                C(expected),
                T(" bytes): "),
                T(problem),
            ]),
            Error::BlendRaisesPressure { side, depth_m, ratio, min_depth_m } => parts(&[
                T("a blend of "),
                N(depth_m),
                T(" m into the standard "),
                T(side),
                T(" the table would make pressure rise with altitude (the table's edge pressure is "),
                N(ratio),
                T(" times the standard's there): blend over at least "),
                N(min_depth_m),
                T(" m, or check the table's pressure"),
            ]),
        }
    }
}

/// The message: the parts of [`Error::message_parts`], numbers with the shortest digits
/// that read back to the same f64, in exponent form when very small or very large (so
/// that a limit of 7.5e-9 Pa does not print as 0.0000000075...).
impl core::fmt::Display for Error {
    fn fmt(&self, f: &mut core::fmt::Formatter<'_>) -> core::fmt::Result {
        let mut result = Ok(());
        self.message_parts(|part| {
            if result.is_ok() {
                result = match part {
                    MessagePart::Text(text) => f.write_str(text),
                    MessagePart::Count(count) => write!(f, "{count}"),
                    MessagePart::Number(value) => {
                        let magnitude = value.abs();
                        if magnitude != 0.0 && magnitude.is_finite() && !(1e-4..1e9).contains(&magnitude) {
                            write!(f, "{value:e}")
                        } else {
                            write!(f, "{value}")
                        }
                    }
                };
            }
        });
        result
    }
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
        let e = Error::RatioNotPositive { quantity: "x", value: 6.633232327863704e-8 };
        assert_eq!(e.to_string(), "x must be greater than 0, got 6.633232327863704e-8");
    }
}
