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

/// The square root. IEEE 754 requires it correctly rounded, of libm and of every
/// instruction alike, so each path gives the same bits. libm uses the instruction on
/// x86-64 and aarch64; on wasm32 (on stable Rust) it has only a software square root, a
/// quarter of the wasm module's time, so where the module is built with SIMD (the npm
/// package is) the lane-wise `f64x2.sqrt` instruction takes it.
#[inline]
pub(crate) fn sqrt(x: f64) -> f64 {
    #[cfg(all(target_arch = "wasm32", target_feature = "simd128"))]
    {
        use core::arch::wasm32::{f64x2_extract_lane, f64x2_splat, f64x2_sqrt};
        f64x2_extract_lane::<0>(f64x2_sqrt(f64x2_splat(x)))
    }
    #[cfg(not(all(target_arch = "wasm32", target_feature = "simd128")))]
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

/// Sine and cosine of an angle in degrees. The whole turns and the quadrant are taken out
/// exactly first (so that 90 deg gives exactly 1 and 0, and a heading of 1e6 deg loses no
/// digits), then libm's sine and cosine of the remaining at most 45 degrees.
#[inline]
pub(crate) fn sin_cos_deg(degrees: f64) -> (f64, f64) {
    // fmod is exact in IEEE arithmetic; the remainder is in (-360, 360).
    let turn = libm::fmod(degrees, 360.0);
    let quadrants = libm::round(turn / 90.0);
    let rest = (turn - 90.0 * quadrants) * (core::f64::consts::PI / 180.0);
    let (s, c) = (libm::sin(rest), libm::cos(rest));
    // quadrants is an integer from -4 to 4.
    match (quadrants as i64).rem_euclid(4) {
        0 => (s, c),
        1 => (c, -s),
        2 => (-s, -c),
        _ => (-c, s),
    }
}

/// The angle of the point (x, y) from the x axis, degrees in (-180, 180].
#[inline]
pub(crate) fn atan2_deg(y: f64, x: f64) -> f64 {
    libm::atan2(y, x) * (180.0 / core::f64::consts::PI)
}

/// The cube root.
#[inline]
pub(crate) fn cbrt(x: f64) -> f64 {
    libm::cbrt(x)
}
