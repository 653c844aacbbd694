//! Checks of dimensionless inputs (Mach numbers, pressure ratios, tolerances, drag
//! coefficients): finite and within a closed range, or strictly positive. The unit-bearing
//! checks (`finite`, `positive`, `within`) live with the error type; these give the
//! ratio errors, whose messages carry no unit.

use crate::error::{finite, Error, Result};

/// `value` if finite and within `[min, max]`, else [`Error::RatioOutOfRange`].
#[inline]
pub(crate) fn ratio_within(quantity: &'static str, value: f64, min: f64, max: f64) -> Result<f64> {
    let value = finite(quantity, value)?;
    if (min..=max).contains(&value) {
        Ok(value)
    } else {
        Err(Error::RatioOutOfRange { quantity, value, min, max })
    }
}

/// `value` if finite, strictly positive and at most `max`.
#[inline]
pub(crate) fn positive_ratio(quantity: &'static str, value: f64, max: f64) -> Result<f64> {
    let value = finite(quantity, value)?;
    if value <= 0.0 {
        return Err(Error::RatioNotPositive { quantity, value });
    }
    ratio_within(quantity, value, 0.0, max)
}
