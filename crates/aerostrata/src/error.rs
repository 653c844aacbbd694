//! The core's one error type. Every message names the offending value and, where there
//! is one, the allowed range, so that a C status detail, a JS `Error` or a CLI line can
//! show it unchanged.

/// Everything that can go wrong in the core.
#[derive(Debug, Clone, Copy, PartialEq, thiserror::Error)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
#[non_exhaustive]
pub enum Error {
    /// An input was NaN or infinite.
    #[error("{quantity} must be a finite number, got {value}")]
    NotFinite {
        /// What the value was, in the trade's words ("geometric altitude").
        quantity: &'static str,
        /// The value given.
        value: f64,
    },
    /// A finite input lay outside the closed range a model or formula accepts.
    #[error("{quantity} {value} {unit} is outside the allowed range {min} to {max} {unit}")]
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
    #[error("{quantity} must be greater than 0 {unit}, got {value} {unit}")]
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
