//! Pressure falls with altitude across a table's blend into the standard, or the blend is
//! refused; and a pressure the blended model has is found by the inverse solver.

use aerostrata::inverse::{altitude_of, Property};
use aerostrata::{Altitude, AltitudeKind, Atmosphere, Error, OutsideTable, SoundingRow, Tabulated};
use proptest::prelude::*;

fn table(surface_pa: f64, depth_m: f64) -> Result<Tabulated<[aerostrata::SoundingLevel; 3]>, Error> {
    let rows = [
        SoundingRow::new(0.0, 288.15).with_pressure_pa(surface_pa),
        SoundingRow::new(1000.0, 281.65),
        SoundingRow::new(3000.0, 268.65),
    ];
    let blend = OutsideTable::BlendIntoUs1976 { depth_m };
    Tabulated::from_rows(AltitudeKind::Geometric, &rows)?.with_below(blend)?.with_above(blend)
}

fn pressure<A: Atmosphere>(model: &A, z: f64) -> f64 {
    model.state(Altitude::geometric_m(z).unwrap()).unwrap().pressure_pa
}

/// The robustness issue's case: a 481 800 Pa surface blended over 2 km made
/// p(-1000 m) = 113 931 Pa fall below p(0) = 474 903 Pa. Now refused, naming a depth
/// that works; and at that depth pressure falls everywhere.
#[test]
fn the_reported_blend_is_refused_with_a_depth_that_works() {
    let error = table(481_800.0, 2000.0).unwrap_err();
    let Error::BlendRaisesPressure { side: "below", min_depth_m, .. } = error else {
        panic!("{error:?}");
    };
    assert!(error.to_string().contains("would make pressure rise with altitude"), "{error}");
    let model = table(481_800.0, min_depth_m).unwrap();
    let grid: Vec<f64> = (-50..=100).map(|i| pressure(&model, f64::from(i) * 100.0)).collect();
    assert!(grid.windows(2).all(|w| w[1] < w[0]));
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    /// Accepted blends keep pressure falling on a 5 m grid through both blends (below
    /// the table, -5 km to 0, and above it, 3 km up to 3 km plus the depth); the inverse
    /// solver finds every pressure of the grid at its altitude; refused blends name a
    /// depth that is accepted.
    #[test]
    fn accepted_blends_fall_and_invert(ratio in 0.6f64..1.6, depth in 100.0f64..4000.0) {
        let surface = 101_325.0 * ratio;
        match table(surface, depth) {
            Ok(model) => {
                let top = 3000.0 + depth + 100.0;
                let count = ((top + 5000.0) / 5.0) as i32;
                let mut previous = f64::INFINITY;
                for i in 0..=count {
                    let z = -5000.0 + 5.0 * f64::from(i);
                    let p = pressure(&model, z);
                    prop_assert!(p < previous, "p({z}) = {p} not below {previous}");
                    previous = p;
                    if i % 97 == 0 {
                        let found = altitude_of(&model, Property::Pressure, p).unwrap();
                        prop_assert!((found.meters() - z).abs() < 1e-3, "{z}: {found:?}");
                    }
                }
            }
            Err(Error::BlendRaisesPressure { min_depth_m, depth_m, .. }) => {
                prop_assert!(min_depth_m > depth_m);
                prop_assert!(table(surface, min_depth_m).is_ok(), "{min_depth_m} m refused too");
            }
            Err(other) => prop_assert!(false, "{other}"),
        }
    }
}
