//! The only door to transcendental functions in the core.
//!
//! Every transcendental function the models need goes through here, and here only
//! to the pure-Rust `libm` crate, so the same input gives the same bits on x86-64,
//! wasm32 and Cortex-M (no platform libm, no fused multiply-add contraction).
//! `libm` documents its functions as accurate to within 1 ULP; `sqrt` is correctly rounded.

#[inline]
pub(crate) fn exp(x: f64) -> f64 {
    libm::exp(x)
}

#[inline]
pub(crate) fn sqrt(x: f64) -> f64 {
    libm::sqrt(x)
}

#[inline]
pub(crate) fn ln(x: f64) -> f64 {
    libm::log(x)
}

/// ln(1 + x), accurate for small x (where `ln(1.0 + x)` would lose the digits of x).
#[inline]
pub(crate) fn ln_1p(x: f64) -> f64 {
    libm::log1p(x)
}

/// exp(x) - 1, accurate for small x.
#[inline]
pub(crate) fn exp_m1(x: f64) -> f64 {
    libm::expm1(x)
}
