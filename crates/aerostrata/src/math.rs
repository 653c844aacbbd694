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
/// x86-64 and aarch64, but through inline assembly, which the compiler cannot run on
/// several lanes; with `std`, `f64::sqrt` is the compiler's own square root, which it
/// can (the batch path's speed of sound and viscosity). On wasm32 (on stable Rust) libm
/// has only a software square root, a quarter of the wasm module's time, so where the
/// module is built with SIMD (the npm package is) the lane-wise `f64x2.sqrt` instruction
/// takes it.
#[inline]
pub(crate) fn sqrt(x: f64) -> f64 {
    #[cfg(all(target_arch = "wasm32", target_feature = "simd128"))]
    {
        use core::arch::wasm32::{f64x2_extract_lane, f64x2_splat, f64x2_sqrt};
        f64x2_extract_lane::<0>(f64x2_sqrt(f64x2_splat(x)))
    }
    #[cfg(all(feature = "std", not(all(target_arch = "wasm32", target_feature = "simd128"))))]
    {
        x.sqrt()
    }
    #[cfg(not(any(feature = "std", all(target_arch = "wasm32", target_feature = "simd128"))))]
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

/// `exp` of every element of `x` into `out` (as many), bit for bit [`exp`] of each: the
/// kernel of libm's `exp` (FreeBSD's `e_exp.c`, Sun Microsystems, 2004) written without
/// branches, so that the compiler can run it on several lanes at once, for |x| <= 700
/// (no overflow, underflow or special value there); every other element, NaN included,
/// is recomputed by [`exp`] itself. The batch path's pressures go through here.
pub(crate) fn exp_each(x: &[f64], out: &mut [f64]) {
    for (&x, out) in x.iter().zip(out.iter_mut()) {
        *out = exp_kernel(x);
    }
    // Whether any element needs it first: a test of all the lanes at once.
    let outside = |x: f64| x.is_nan() | (magnitude(x) > EXP_KERNEL_MAX);
    if x.iter().fold(false, |any, &x| any | outside(x)) {
        for (&x, out) in x.iter().zip(out.iter_mut()) {
            if outside(x) {
                *out = exp(x);
            }
        }
    }
}

/// `ln(1 + x)` of every element of `x` into `out`, bit for bit [`ln_1p`] of each: libm's
/// `log1p` (FreeBSD's `s_log1p.c`, Sun Microsystems, 1993) on the interval where it needs
/// no argument reduction (1 + x within sqrt(2)/2 and sqrt(2)), without branches; every
/// other element is recomputed by [`ln_1p`] itself.
pub(crate) fn ln_1p_each(x: &[f64], out: &mut [f64]) {
    for (&x, out) in x.iter().zip(out.iter_mut()) {
        *out = ln_1p_kernel(x);
    }
    if !x.iter().fold(true, |all, &x| all & ln_1p_kernel_holds(x)) {
        for (&x, out) in x.iter().zip(out.iter_mut()) {
            if !ln_1p_kernel_holds(x) {
                *out = ln_1p(x);
            }
        }
    }
}

/// |x|, by clearing the sign bit.
#[inline(always)]
fn magnitude(x: f64) -> f64 {
    f64::from_bits(x.to_bits() & !SIGN_BIT)
}

const SIGN_BIT: u64 = 1 << 63;

/// `if condition { a } else { b }` by masking bits: what a vector select does, which the
/// compiler's cost model takes as cheap on every target (with branches, or with its own
/// selects, it keeps the kernels scalar on x86-64's baseline SSE2).
#[inline(always)]
pub(crate) fn pick(condition: bool, a: f64, b: f64) -> f64 {
    let mask = u64::from(condition).wrapping_neg();
    f64::from_bits((a.to_bits() & mask) | (b.to_bits() & !mask))
}

/// The f64 whose high 32 bits are `high` and low 32 bits zero: libm decides its cases by
/// the high word of |x|, and `hx >= high` is `|x| >= high_word_float(high)` exactly.
const fn high_word_float(high: u64) -> f64 {
    f64::from_bits(high << 32)
}

/// 1.5 * 2^52: adding and taking it off rounds |t| < 2^51 to an integer.
const ROUNDING_SHIFT: f64 = 6_755_399_441_055_744.0;
/// 2^52 + 1023: adding it to an integer k puts k + 1023 in the low bits.
const EXPONENT_SHIFT: f64 = 4_503_599_627_371_519.0;

/// Where [`exp_kernel`] is libm's `exp`: no overflow or underflow (libm's special cases
/// start at |x| = 708.39) and 2^k a normal number.
const EXP_KERNEL_MAX: f64 = 700.0;

/// libm's `exp` for |x| <= [`EXP_KERNEL_MAX`], its three cases of argument reduction chosen
/// by selects instead of branches. Written operation for operation as libm's (same
/// constants, same order), which is what makes the bits the same; a test sweeps it.
#[inline(always)]
#[allow(clippy::excessive_precision, clippy::approx_constant)] // libm's constants, as it writes them
fn exp_kernel(x: f64) -> f64 {
    const LN2HI: f64 = 6.93147180369123816490e-01;
    const LN2LO: f64 = 1.90821492927058770002e-10;
    const INVLN2: f64 = 1.44269504088896338700e+00;
    const P1: f64 = 1.66666666666666019037e-01;
    const P2: f64 = -2.77777777770155933842e-03;
    const P3: f64 = 6.61375632143793436117e-05;
    const P4: f64 = -1.65339022054652515390e-06;
    const P5: f64 = 4.13813679705723846039e-08;
    let ax = magnitude(x);
    let sign = x.to_bits() & SIGN_BIT;
    // libm: |x| >= 1.5 ln2 takes k = trunc(x / ln2 +- 0.5) (its `as i32`); above 0.5 ln2
    // k is +-1; above 2^-28 k is 0; below, exp(x) is 1 + x. The truncation here is in
    // floating point, so that it runs lane-wise: t rounded to nearest by adding and
    // taking off 1.5 * 2^52 (exact for |t| < 2^51), then a step toward zero where that
    // rounded away from it (t has x's sign wherever the truncation is used).
    let one = f64::from_bits(1.0_f64.to_bits() | sign);
    let t = INVLN2 * x + f64::from_bits(0.5_f64.to_bits() | sign);
    let nearest = (t + ROUNDING_SHIFT) - ROUNDING_SHIFT;
    let truncated = nearest - pick(magnitude(nearest) > magnitude(t), one, 0.0);
    let kf = pick(
        ax >= high_word_float(0x3ff0_a2b2),
        truncated,
        pick(ax >= high_word_float(0x3fd6_2e43), one, 0.0),
    );
    // With k = 0 these are libm's hi = x, lo = 0 and x unchanged: x - 0 * LN2HI is x.
    let hi = x - kf * LN2HI;
    let lo = kf * LN2LO;
    let r = hi - lo;
    let rr = r * r;
    let c = r - rr * (P1 + rr * (P2 + rr * (P3 + rr * (P4 + rr * P5))));
    let y = 1.0 + (r * c / (2.0 - c) - lo + hi);
    // libm's scalbn(y, k) is this one multiplication while 2^k is normal (|k| <= 1010
    // here). 2^k from k + 1023 read out of the low bits of 2^52 + 1023 + k (exact); the
    // mask keeps the exponent field in range for the lanes recomputed later.
    let scale = f64::from_bits(((kf + EXPONENT_SHIFT).to_bits() & 0x7ff) << 52);
    pick(ax >= high_word_float(0x3e30_0001), y * scale, 1.0 + x)
}

/// Whether [`ln_1p_kernel`] is libm's `log1p` at x: -0.2929 < x < 0.4142 (libm's k = 0
/// case, by its high-word tests), NaN excluded.
#[inline(always)]
fn ln_1p_kernel_holds(x: f64) -> bool {
    (x < high_word_float(0x3fda_827a)) & (-x < high_word_float(0x3fd2_bec5))
}

/// libm's `log1p` where [`ln_1p_kernel_holds`]: f = x, k = 0, c = 0, written operation
/// for operation as libm's. Its terms in k and c are +0 there, and adding +0 to the
/// nonzero sum changes no bit (zeros and tiny x return x before), so they are left out.
#[inline(always)]
#[allow(clippy::excessive_precision)] // libm's constants
fn ln_1p_kernel(x: f64) -> f64 {
    const LG1: f64 = 6.666666666666735130e-01;
    const LG2: f64 = 3.999999999940941908e-01;
    const LG3: f64 = 2.857142874366239149e-01;
    const LG4: f64 = 2.222219843214978396e-01;
    const LG5: f64 = 1.818357216161805012e-01;
    const LG6: f64 = 1.531383769920937332e-01;
    const LG7: f64 = 1.479819860511658591e-01;
    let f = x;
    let hfsq = 0.5 * f * f;
    let s = f / (2.0 + f);
    let z = s * s;
    let w = z * z;
    let t1 = w * (LG2 + w * (LG4 + w * LG6));
    let t2 = z * (LG1 + w * (LG3 + w * (LG5 + w * LG7)));
    let r = t2 + t1;
    let full = s * (hfsq + r) - hfsq + f;
    // |x| < 2^-53: libm returns x itself.
    pick(magnitude(x) < high_word_float(0x3ca0_0000), x, full)
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

    /// Uniform numbers in [0, 1) from a fixed xorshift64 sequence.
    fn uniform(mut state: u64) -> impl FnMut() -> f64 {
        move || {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            (state >> 11) as f64 / (1u64 << 53) as f64
        }
    }

    /// The kernels are libm's own polynomial for |x| <= pi/4: every bit the same as
    /// `libm::sin` and `libm::cos` on a dense sweep, at random points (a fixed xorshift
    /// sequence) and at the edges (0, the tiny-argument thresholds, pi/4 itself).
    #[test]
    fn the_small_kernels_are_libms_bits() {
        let quarter = core::f64::consts::FRAC_PI_4;
        let mut random = uniform(0x9e37_79b9_7f4a_7c15);
        let edges =
            [0.0, -0.0, 1e-300, 7.45e-9, 7.46e-9, 1.49e-8, 1.5e-8, quarter, -quarter, 45.0 * (PI_180)];
        let sweep = (0..=200_000).map(|i| quarter * (f64::from(i) / 100_000.0 - 1.0));
        let randoms = (0..200_000).map(|_| quarter * (2.0 * random() - 1.0));
        for x in edges.into_iter().chain(sweep).chain(randoms) {
            assert_eq!(sin_small(x).to_bits(), libm::sin(x).to_bits(), "sin {x:e}");
            assert_eq!(cos_small(x).to_bits(), libm::cos(x).to_bits(), "cos {x:e}");
        }
    }

    /// The lane kernels give libm's bits: `exp` on a dense sweep of [-720, 720] (the
    /// kernel's domain and the recomputed edges), at random points and at every threshold
    /// of libm's cases and one ulp either side; `log1p` likewise over [-1.5, 1.5].
    #[test]
    fn the_lane_kernels_are_libms_bits() {
        let mut random = uniform(0x2545_f491_4f6c_dd1d);
        let around = |x: f64| {
            let b = x.to_bits();
            [
                f64::from_bits(b - 1),
                x,
                f64::from_bits(b + 1),
                -f64::from_bits(b - 1),
                -x,
                -f64::from_bits(b + 1),
            ]
        };
        let mut exp_args: std::vec::Vec<f64> = (-720_000..=720_000).map(|i| f64::from(i) * 1e-3).collect();
        exp_args.extend((0..400_000).map(|_| 1440.0 * random() - 720.0));
        exp_args.extend((0..200_000).map(|_| 4.0 * random() - 2.0));
        for high in [0x3ff0_a2b2, 0x3fd6_2e42, 0x3fd6_2e43, 0x3e30_0000, 0x3e30_0001, 0x4086_232b] {
            exp_args.extend(around(high_word_float(high)));
        }
        exp_args.extend(around(700.0));
        exp_args.extend([0.0, -0.0, 1e-300, f64::NAN, f64::INFINITY, f64::NEG_INFINITY, 709.9, -745.2]);
        let mut out = std::vec![0.0; exp_args.len()];
        exp_each(&exp_args, &mut out);
        for (&x, &y) in exp_args.iter().zip(&out) {
            assert_eq!(y.to_bits(), libm::exp(x).to_bits(), "exp {x:e}");
        }
        let mut log_args: std::vec::Vec<f64> =
            (-1_500_000..=1_500_000).map(|i| f64::from(i) * 1e-6).collect();
        log_args.extend((0..400_000).map(|_| 0.8 * random() - 0.35));
        log_args.extend((0..100_000).map(|_| (random() - 0.5) * 1e-12));
        for high in [0x3fda_827a, 0x3fd2_bec4, 0x3fd2_bec5, 0x3ca0_0000] {
            log_args.extend(around(high_word_float(high)));
        }
        log_args.extend([0.0, -0.0, 1e-300, 5e-324, -1.0, -2.0, f64::NAN, f64::INFINITY, f64::NEG_INFINITY]);
        let mut out = std::vec![0.0; log_args.len()];
        ln_1p_each(&log_args, &mut out);
        for (&x, &y) in log_args.iter().zip(&out) {
            assert_eq!(y.to_bits(), libm::log1p(x).to_bits(), "log1p {x:e}");
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
