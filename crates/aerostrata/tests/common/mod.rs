//! What the test files share: the generator of hostile f64 for the no-panic property
//! tests, the relative difference every tolerance is stated in, the 1976 standard's state
//! at an altitude in its range, and the finiteness check of a state. Each test file uses a
//! part of it, so the rest is dead code there.
#![allow(dead_code)]

use aerostrata::{Altitude, Atmosphere, State, US1976};
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

/// |a - b| / |b|, and 0 when the two are exactly equal (so that equal zeros pass).
pub fn relative(a: f64, b: f64) -> f64 {
    if a == b {
        0.0
    } else {
        ((a - b) / b).abs()
    }
}

/// The 1976 standard's state at geometric altitude `z_m`, m, inside its range.
pub fn standard_at(z_m: f64) -> State {
    US1976.state(Altitude::geometric_m(z_m).unwrap()).unwrap()
}

/// The 1976 standard's state at geopotential altitude `h_m`, m', inside its range.
pub fn standard_at_geopotential(h_m: f64) -> State {
    US1976.state(Altitude::geopotential_m(h_m).unwrap()).unwrap()
}

/// A state that came out Ok must be wholly finite: no silent NaN or infinity.
pub fn assert_finite(state: &State) {
    for (name, value) in state.fields() {
        if let Some(value) = value {
            assert!(value.is_finite(), "{name} = {value}");
        }
    }
}
