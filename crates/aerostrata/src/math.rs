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
    let (s, c) = (sin_small(rest), cos_small(rest));
    // quadrants is an integer from -4 to 4.
    match (quadrants as i64).rem_euclid(4) {
        0 => (s, c),
        1 => (c, -s),
        2 => (-s, -c),
        _ => (-c, s),
    }
}

/// Whether |x| is within the kernels' range, pi/4 (by the high word, as fdlibm decides).
fn high_word(x: f64) -> u32 {
    ((x.to_bits() >> 32) as u32) & 0x7fff_ffff
}

/// sin x for |x| <= pi/4: fdlibm's `__kernel_sin` with a zero tail (Sun Microsystems,
/// 1993; the polynomial libm's `sin` evaluates for such x), bit for bit the same as
/// `libm::sin` there (tests below), without the argument reduction's code and tables,
/// which the size-budgeted WebAssembly module would otherwise carry.
#[allow(clippy::excessive_precision)] // the coefficients as published
fn sin_small(x: f64) -> f64 {
    const S1: f64 = -1.666_666_666_666_663_243_48e-1;
    const S2: f64 = 8.333_333_333_322_489_461_24e-3;
    const S3: f64 = -1.984_126_982_985_794_931_34e-4;
    const S4: f64 = 2.755_731_370_707_006_767_89e-6;
    const S5: f64 = -2.505_076_025_340_686_341_95e-8;
    const S6: f64 = 1.589_690_995_211_550_102_21e-10;
    if high_word(x) < 0x3e50_0000 {
        return x;
    }
    let z = x * x;
    let w = z * z;
    let r = S2 + z * (S3 + z * S4) + z * w * (S5 + z * S6);
    let v = z * x;
    x + v * (S1 + z * r)
}

/// cos x for |x| <= pi/4: fdlibm's `__kernel_cos` with a zero tail, as [`sin_small`].
#[allow(clippy::excessive_precision)] // the coefficients as published
fn cos_small(x: f64) -> f64 {
    const C1: f64 = 4.166_666_666_666_660_190_37e-2;
    const C2: f64 = -1.388_888_888_887_410_957_49e-3;
    const C3: f64 = 2.480_158_728_947_672_941_78e-5;
    const C4: f64 = -2.755_731_435_139_066_330_35e-7;
    const C5: f64 = 2.087_572_321_298_174_827_90e-9;
    const C6: f64 = -1.135_964_755_778_819_482_65e-11;
    if high_word(x) < 0x3e46_a09e {
        return 1.0;
    }
    let z = x * x;
    let w = z * z;
    let r = z * (C1 + z * (C2 + z * C3)) + w * w * (C4 + z * (C5 + z * C6));
    let hz = 0.5 * z;
    let w = 1.0 - hz;
    w + (((1.0 - w) - hz) + z * r)
}

/// The angle of the point (x, y) from the x axis, degrees in (-180, 180].
#[inline]
pub(crate) fn atan2_deg(y: f64, x: f64) -> f64 {
    libm::atan2(y, x) * (180.0 / core::f64::consts::PI)
}

/// The least integer not below x.
#[inline]
pub(crate) fn ceil(x: f64) -> f64 {
    libm::ceil(x)
}

/// The cube root.
#[inline]
pub(crate) fn cbrt(x: f64) -> f64 {
    libm::cbrt(x)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The kernels are libm's own polynomial for |x| <= pi/4: every bit the same as
    /// `libm::sin` and `libm::cos` on a dense sweep, at random points (a fixed xorshift
    /// sequence) and at the edges (0, the tiny-argument thresholds, pi/4 itself).
    #[test]
    fn the_small_kernels_are_libms_bits() {
        let quarter = core::f64::consts::FRAC_PI_4;
        let mut state = 0x9e37_79b9_7f4a_7c15_u64;
        let mut random = || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            (state >> 11) as f64 / (1u64 << 53) as f64
        };
        let edges =
            [0.0, -0.0, 1e-300, 7.45e-9, 7.46e-9, 1.49e-8, 1.5e-8, quarter, -quarter, 45.0 * (PI_180)];
        let sweep = (0..=200_000).map(|i| quarter * (f64::from(i) / 100_000.0 - 1.0));
        let randoms = (0..200_000).map(|_| quarter * (2.0 * random() - 1.0));
        for x in edges.into_iter().chain(sweep).chain(randoms) {
            assert_eq!(sin_small(x).to_bits(), libm::sin(x).to_bits(), "sin {x:e}");
            assert_eq!(cos_small(x).to_bits(), libm::cos(x).to_bits(), "cos {x:e}");
        }
    }

    const PI_180: f64 = core::f64::consts::PI / 180.0;

    /// Quarter turns are exact in degrees (sin 180 deg is 0, not the 1.2e-16 of
    /// `sin(180 * pi / 180)`), and every angle agrees with the radian form within that
    /// form's own error (the rounding of d pi / 180, up to |r| 2^-53, plus an ulp).
    #[test]
    fn degrees_reduce_exactly() {
        assert_eq!(sin_cos_deg(90.0), (1.0, 0.0));
        assert_eq!(sin_cos_deg(-270.0), (1.0, 0.0));
        assert_eq!(sin_cos_deg(180.0), (0.0, -1.0));
        assert_eq!(sin_cos_deg(0.0), (0.0, 1.0));
        for i in -7200..=7200 {
            let d = f64::from(i) * 0.1;
            let (s, c) = sin_cos_deg(d);
            let r = d * PI_180;
            let tolerance = 4e-16 + r.abs() * 1.2e-16;
            assert!((s - libm::sin(r)).abs() <= tolerance && (c - libm::cos(r)).abs() <= tolerance, "{d}");
        }
    }
}
