//! What the no-panic property tests of every test file share.

use proptest::prelude::*;

/// Any f64 at all, weighted toward the ones that break code: NaN, infinities, signed
/// zeros, subnormals, the extremes, and the bands where altitudes, temperatures,
/// pressures and Mach numbers live.
pub fn wild() -> impl Strategy<Value = f64> {
    prop_oneof![
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(0.0),
        Just(-0.0),
        Just(1.0),
        Just(f64::MIN_POSITIVE),
        Just(5e-324),
        Just(1e300),
        Just(-1e300),
        Just(f64::MAX),
        -2.0..6.0f64,
        0.0..400.0f64,
        1.0..2e5f64,
        -1e7..1e7f64,
        any::<f64>(),
    ]
}
