//! The batch path against the scalar path: every value of `US1976.batch` (and of
//! `batch::evaluate`, and with the `rayon` feature `batch_parallel`) must be bit for bit
//! `state(alt).get(q)`, and a batch must stop where the scalar path first fails, with the
//! same error. The reference is the crate's own scalar path (itself checked against the
//! U.S. Standard Atmosphere 1976 by the vector tests); the boundaries (the layer bases of
//! the standard's Table 4, 80 km where its Table 8 of M/M0 starts, 86 km where the upper
//! part starts, the ends of the range) are hand-worked from the standard.

use aerostrata::batch::{self, BatchError};
use aerostrata::quantity::Group;
use aerostrata::{AltitudeKind, Atmosphere, Error, Isothermal, Quantity, US1976};
use proptest::prelude::*;

/// What a cell holds before the batch: a value no state quantity takes (negative).
const UNTOUCHED: f64 = -7.25;

fn state_quantities() -> Vec<Quantity> {
    Quantity::of_group(Group::State).collect()
}

/// The scalar path's value of `q` at `meters`.
fn scalar(model: &dyn Atmosphere, kind: AltitudeKind, meters: f64, q: Quantity) -> Result<f64, Error> {
    kind.altitude(meters).and_then(|a| model.state(a)).and_then(|s| s.get(q))
}

/// Runs `batch` on prefilled columns and checks it against the scalar path: the first
/// failing element (row by row, column by column within a row) is the batch's error,
/// every cell before it holds the scalar bits, every cell from it on is untouched.
fn check(
    model: &dyn Atmosphere,
    kind: AltitudeKind,
    altitudes: &[f64],
    quantities: &[Quantity],
    batch: impl FnOnce(&[f64], &[Quantity], &mut [&mut [f64]]) -> Result<(), BatchError>,
) -> Result<(), TestCaseError> {
    let mut storage = vec![vec![UNTOUCHED; altitudes.len()]; quantities.len()];
    let mut columns: Vec<&mut [f64]> = storage.iter_mut().map(Vec::as_mut_slice).collect();
    let outcome = batch(altitudes, quantities, &mut columns);
    let mut first_error = None;
    'rows: for (i, &meters) in altitudes.iter().enumerate() {
        // The state first (a bad altitude fails even when no quantity is asked), then
        // each quantity in column order.
        if let Err(error) = kind.altitude(meters).and_then(|a| model.state(a)) {
            first_error = Some((i, error));
            break 'rows;
        }
        for &q in quantities {
            if let Err(error) = scalar(model, kind, meters, q) {
                first_error = Some((i, error));
                break 'rows;
            }
        }
    }
    let end = first_error.map_or(altitudes.len(), |(i, _)| i);
    match first_error {
        None => prop_assert_eq!(outcome, Ok(())),
        // Compared as text: an error may carry the NaN it refused, and NaN != NaN.
        Some((index, error)) => {
            prop_assert_eq!(
                format!("{outcome:?}"),
                format!("{:?}", Err::<(), _>(BatchError::Element { index, error }))
            )
        }
    }
    for (c, &q) in quantities.iter().enumerate() {
        for (i, &meters) in altitudes.iter().enumerate().take(end) {
            let expected = scalar(model, kind, meters, q).map_err(|e| TestCaseError::fail(e.to_string()))?;
            prop_assert_eq!(
                storage[c][i].to_bits(),
                expected.to_bits(),
                "{:?} at {} m ({:?})",
                q,
                meters,
                kind
            );
        }
        for (i, value) in storage[c].iter().enumerate().skip(end) {
            prop_assert_eq!(value.to_bits(), UNTOUCHED.to_bits(), "{:?} written at {}", q, i);
        }
    }
    Ok(())
}

/// Altitudes where the standard changes: layer bases (geopotential) and a metre and a
/// micrometre either side, 80 km (M/M0 starts) and 86 km geometric (the upper part).
fn boundaries() -> Vec<f64> {
    let mut points = vec![-5_000.0, 0.0, 79_999.999, 80_000.0, 80_000.001, 85_999.999, 86_000.0, 86_000.001];
    for layer in US1976.layers() {
        let b = layer.base_geopotential_m;
        points.extend([b - 1.0, b - 1e-6, b, b + 1e-6, b + 1.0]);
    }
    points
}

fn altitude() -> impl Strategy<Value = f64> {
    // Without the `upper` feature the altitudes above 86 km are out of range: the error path.
    prop_oneof![
        8 => -5_000.0..86_000.0f64,
        2 => 78_000.0..88_000.0f64,
        2 => prop::sample::select(boundaries()),
        1 => 86_000.0..1_000_000.0f64,
        // Out of range, not finite: the error paths.
        1 => prop_oneof![Just(f64::NAN), Just(f64::INFINITY), Just(-5_000.001), Just(2e6), -1e7..1e7f64],
    ]
}

fn request() -> impl Strategy<Value = (Vec<f64>, Vec<Quantity>, bool, bool)> {
    (
        prop::collection::vec(altitude(), 0..700),
        prop::collection::vec(prop::sample::select(state_quantities()), 0..6),
        any::<bool>(),
        any::<bool>(),
    )
}

fn kind_of(geopotential: bool) -> AltitudeKind {
    if geopotential {
        AltitudeKind::Geopotential
    } else {
        AltitudeKind::Geometric
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 400, ..ProptestConfig::default() })]

    /// Random altitudes (sorted half the time, as a flight gives them), random columns.
    #[test]
    fn the_standards_batch_is_the_scalar_path((mut altitudes, quantities, sorted, geopotential) in request()) {
        if sorted {
            altitudes.sort_by(f64::total_cmp);
        }
        let kind = kind_of(geopotential);
        check(&US1976, kind, &altitudes, &quantities, |a, q, o| US1976.batch(kind, a, q, o))?;
    }

    /// The generic batch of any model (here an isothermal one) is its scalar path too.
    #[test]
    fn any_models_batch_is_the_scalar_path((altitudes, quantities, _, geopotential) in request()) {
        let model = Isothermal::new(250.0, 90_000.0).unwrap();
        let kind = kind_of(geopotential);
        check(&model, kind, &altitudes, &quantities, |a, q, o| batch::evaluate(&model, kind, a, q, o))?;
        check(&US1976, kind, &altitudes, &quantities, |a, q, o| batch::evaluate(&US1976, kind, a, q, o))?;
    }
}

/// Every quantity of the state group on a dense sorted sweep up to 86 km, and every one
/// the standard defines above it (all but the continuum properties) up to the top.
#[test]
fn every_state_quantity_on_sweeps() {
    let all = state_quantities();
    let sweep: Vec<f64> = (0..=91_000).map(|i| -5_000.0 + f64::from(i)).collect();
    check(&US1976, AltitudeKind::Geometric, &sweep, &all, |a, q, o| {
        US1976.batch(AltitudeKind::Geometric, a, q, o)
    })
    .unwrap();
    if cfg!(feature = "upper") {
        let defined: Vec<Quantity> = all.iter().copied().filter(|q| !q.info().may_be_undefined).collect();
        let high: Vec<f64> = (0..=10_000).map(|i| 86_000.0 + 91.4 * f64::from(i)).collect();
        let kind = AltitudeKind::Geometric;
        check(&US1976, kind, &high, &defined, |a, q, o| US1976.batch(kind, a, q, o)).unwrap();
    }
}

/// The lane-wise path (its layer counting, its logarithm and exponential kernels) over a
/// dense random set of the lower standard's altitudes, in random order, both kinds:
/// every state quantity, bit for bit the scalar path.
#[test]
fn every_state_quantity_at_random_lower_altitudes() {
    let all = state_quantities();
    let mut seed = 0x853c_49e6_748f_ea9b_u64;
    let fractions: Vec<f64> = (0..60_000)
        .map(|_| {
            seed ^= seed << 13;
            seed ^= seed >> 7;
            seed ^= seed << 17;
            (seed >> 11) as f64 / (1u64 << 53) as f64
        })
        .collect();
    // The lower standard ends at 86 km geometric, 84 852 m geopotential.
    for (kind, top) in [(AltitudeKind::Geometric, 86_000.0), (AltitudeKind::Geopotential, 84_852.0)] {
        let altitudes: Vec<f64> = fractions.iter().map(|f| -5_000.0 + (top + 5_000.0) * f).collect();
        check(&US1976, kind, &altitudes, &all, |a, q, o| US1976.batch(kind, a, q, o)).unwrap();
    }
}

/// Above 86 km the speed of sound is undefined: the batch stops at the first such
/// altitude with the scalar path's own error, having written everything before it.
#[cfg(feature = "upper")]
#[test]
fn an_undefined_quantity_stops_the_batch_at_its_altitude() {
    let altitudes = [10_000.0, 85_000.0, 90_000.0, 20_000.0];
    let (mut t, mut a) = ([UNTOUCHED; 4], [UNTOUCHED; 4]);
    let outcome = US1976.batch(
        AltitudeKind::Geometric,
        &altitudes,
        &[Quantity::Temperature, Quantity::SpeedOfSound],
        &mut [&mut t, &mut a],
    );
    let Err(BatchError::Element { index: 2, error: Error::Undefined { altitude_m, .. } }) = outcome else {
        panic!("expected the undefined speed of sound at index 2, got {outcome:?}");
    };
    assert_eq!(altitude_m, 90_000.0);
    assert!(t[1] > 0.0 && a[1] > 0.0);
    assert_eq!([t[2], a[2], t[3], a[3]], [UNTOUCHED; 4]);
}

#[test]
fn malformed_requests_are_refused_before_anything_is_written() {
    let altitudes = [0.0, 1_000.0];
    let mut one = [UNTOUCHED; 2];
    let mut short = [UNTOUCHED; 1];
    let g = AltitudeKind::Geometric;
    assert_eq!(
        US1976.batch(g, &altitudes, &[Quantity::Density, Quantity::Pressure], &mut [&mut one]),
        Err(BatchError::ColumnCount { quantities: 2, columns: 1 })
    );
    assert_eq!(
        US1976.batch(g, &altitudes, &[Quantity::Density, Quantity::Pressure], &mut [&mut one, &mut short]),
        Err(BatchError::ColumnLength { column: 1, len: 1, altitudes: 2 })
    );
    let outcome = US1976.batch(g, &altitudes, &[Quantity::Mach], &mut [&mut one]);
    assert!(
        matches!(outcome, Err(BatchError::Quantity { column: 0, error: Error::NotCarried { .. } })),
        "{outcome:?}"
    );
    assert_eq!(one, [UNTOUCHED; 2]);
    let message = BatchError::ColumnLength { column: 1, len: 1, altitudes: 2 }.to_string();
    assert!(message.contains("column 1") && message.contains("2 altitudes"), "{message}");
}

/// The parallel batch gives the serial batch's bits, and the lowest failing index.
#[cfg(feature = "rayon")]
#[test]
fn the_parallel_batch_is_the_serial_batch() {
    let count = 5 * aerostrata::batch::parallel::CHUNK + 123;
    let mut state = 0x2545_f491_4f6c_dd1d_u64;
    let mut altitudes: Vec<f64> = (0..count)
        .map(|_| {
            state ^= state << 13;
            state ^= state >> 7;
            state ^= state << 17;
            -5_000.0 + 91_000.0 * ((state >> 11) as f64 / (1u64 << 53) as f64)
        })
        .collect();
    let quantities = [
        Quantity::Temperature,
        Quantity::Pressure,
        Quantity::Density,
        Quantity::SpeedOfSound,
        Quantity::DynamicViscosity,
    ];
    let kind = AltitudeKind::Geometric;
    let run = |altitudes: &[f64], parallel: bool| {
        let mut storage = vec![vec![UNTOUCHED; altitudes.len()]; quantities.len()];
        let mut columns: Vec<&mut [f64]> = storage.iter_mut().map(Vec::as_mut_slice).collect();
        let outcome = if parallel {
            US1976.batch_parallel(kind, altitudes, &quantities, &mut columns)
        } else {
            US1976.batch(kind, altitudes, &quantities, &mut columns)
        };
        (outcome, storage)
    };
    let (serial, serial_values) = run(&altitudes, false);
    let (parallel, parallel_values) = run(&altitudes, true);
    assert_eq!(serial, Ok(()));
    assert_eq!(parallel, Ok(()));
    for (s, p) in serial_values.iter().zip(&parallel_values) {
        assert!(s.iter().zip(p).all(|(a, b)| a.to_bits() == b.to_bits()));
    }
    // Two failures in different chunks: the lower index is reported.
    let (low, high) =
        (2 * aerostrata::batch::parallel::CHUNK + 7, 4 * aerostrata::batch::parallel::CHUNK + 1);
    altitudes[high] = f64::NAN;
    altitudes[low] = 1e6 + 1.0;
    let (parallel, values) = run(&altitudes, true);
    assert!(matches!(parallel, Err(BatchError::Element { index, .. }) if index == low), "{parallel:?}");
    assert!(values[0][..low].iter().zip(&serial_values[0]).all(|(a, b)| a.to_bits() == b.to_bits()));
}
