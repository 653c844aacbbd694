//! Every `Ok` is finite: the inputs an outside robustness run found giving `Ok(inf)` are
//! refused with an error that names the limit.

use aerostrata::flow::PerfectGas;
use aerostrata::humidity::{virtual_temperature_k, Humidity};
use aerostrata::Error;

#[test]
fn humid_air_at_absurd_temperatures_is_refused() {
    for t in [f64::MAX, 1.0e6, 0.5] {
        let out = virtual_temperature_k(t, 1000.0, 101_325.0);
        assert!(matches!(out, Err(Error::OutOfRange { quantity: "temperature", .. })), "{t}: {out:?}");
        assert!(Humidity::new(t, 101_325.0, 1000.0).is_err(), "{t}");
    }
    assert!(virtual_temperature_k(300.0, 1000.0, f64::MAX).is_err());
    // What the band keeps: hot and humid air (from memory: T_v exceeds T by a few K).
    let tv = virtual_temperature_k(303.15, 4000.0, 101_325.0).unwrap();
    assert!(tv > 303.15 && tv < 308.0);
}

#[test]
fn an_area_ratio_past_the_largest_double_is_refused_at_its_mach_number() {
    let gas = PerfectGas::new(1.01).unwrap();
    let error = gas.area_ratio(1000.0).unwrap_err();
    let Error::RatioOutOfRange { quantity: "Mach number", max, .. } = error else { panic!("{error:?}") };
    // The named maximum is the edge: finite just below it, refused just above.
    assert!(gas.area_ratio(max).unwrap().is_finite());
    assert!(gas.area_ratio(max * (1.0 + 1e-9)).is_err());
    assert!(max > 10.0 && max < 1000.0, "{max}");
    // Air is finite to the relations' own limit.
    assert!(PerfectGas::AIR.area_ratio(1000.0).unwrap().is_finite());
}

/// Layers are bounded to what an atmosphere can have: a lapse rate of at most 0.1 K/m
/// either way and a thickness of at least 1 mm (the robustness run's 1e16 K/m over a
/// nanometre made the inverse solvers wrong 17-fold); at the bounds the inverse solver
/// finds every pressure at its altitude.
#[test]
fn layers_are_bounded_and_invert_at_the_bounds() {
    use aerostrata::inverse::{altitude_of, Property};
    use aerostrata::model::{LayerSpec, Layered};
    use aerostrata::{Altitude, Atmosphere};
    let build = |lapse: f64, top: f64| {
        let specs = [
            LayerSpec { top_geopotential_m: top, lapse_rate_k_m: lapse },
            LayerSpec { top_geopotential_m: 20_000.0, lapse_rate_k_m: -0.0065 },
        ];
        Layered::from_lapse_rates(0.0, 288.15, 101_325.0, &specs)
    };
    for (lapse, top) in [(1e16, 1e-9), (0.2, 100.0), (-0.11, 100.0), (0.05, 1e-4), (f64::NAN, 10.0)] {
        assert!(matches!(build(lapse, top), Err(Error::InvalidLayer { index: 0, .. })), "{lapse} {top}");
    }
    for (lapse, top) in [(0.1, 1e-3), (-0.1, 50.0), (0.1, 300.0)] {
        let model = build(lapse, top).unwrap();
        for i in 0..=200 {
            let h = top * 2.0 * f64::from(i) / 200.0;
            let altitude = Altitude::geopotential_m(h).unwrap();
            let p = model.state(altitude).unwrap().pressure_pa;
            let found = altitude_of(&model, Property::Pressure, p).unwrap().meters();
            let z = altitude.geometric().meters();
            assert!((found - z).abs() <= 1e-6 * (1.0 + z), "{lapse} {top} at {h}: {found} vs {z}");
        }
    }
}
