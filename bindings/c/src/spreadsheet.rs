//! Spreadsheet-friendly scalar functions: plain doubles in, one double out, NaN on any
//! error (bad input, a property undefined at the altitude, or a caught panic). They are
//! the one documented exception to the status rule, for macro languages that can pass
//! and return doubles but not pointers. `extern "system"` is the C convention on every
//! platform except 32-bit Windows, where it is stdcall, which spreadsheet macros expect.
//! They do not set the thread's error detail. Thread-safe; they allocate nothing.

use aerostrata_core::airspeed::{AirData, Airspeed};
use aerostrata_core::{aero, inverse, Altitude, AnyModel, Atmosphere, State};

fn nan_on_error(f: impl FnOnce() -> aerostrata_core::Result<f64>) -> f64 {
    crate::error::catch(f).ok().and_then(Result::ok).unwrap_or(f64::NAN)
}

/// As `aerostrata_us1976_state`, so that a sheet and a C program give the same bits.
fn standard_state(altitude_m: f64, offset_k: f64) -> aerostrata_core::Result<State> {
    AnyModel::standard(offset_k)?.state(Altitude::geometric_m(altitude_m)?)
}

/// Temperature, K, of the 1976 standard plus `offset_k` at geometric `altitude_m`; NaN
/// on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_temperature_k(altitude_m: f64, offset_k: f64) -> f64 {
    nan_on_error(|| Ok(standard_state(altitude_m, offset_k)?.temperature_k))
}

/// Pressure, Pa, of the 1976 standard (the offset changes temperature and density, not
/// pressure) at geometric `altitude_m`; NaN on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_pressure_pa(altitude_m: f64, offset_k: f64) -> f64 {
    nan_on_error(|| Ok(standard_state(altitude_m, offset_k)?.pressure_pa))
}

/// Density, kg/m^3, of the 1976 standard plus `offset_k` at geometric `altitude_m`; NaN
/// on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_density(altitude_m: f64, offset_k: f64) -> f64 {
    nan_on_error(|| Ok(standard_state(altitude_m, offset_k)?.density_kg_m3))
}

/// Speed of sound, m/s, of the 1976 standard plus `offset_k` at geometric `altitude_m`;
/// NaN on error and above 86 km.
#[no_mangle]
pub extern "system" fn aerostrata_xl_speed_of_sound(altitude_m: f64, offset_k: f64) -> f64 {
    nan_on_error(|| standard_state(altitude_m, offset_k)?.speed_of_sound())
}

/// Dynamic viscosity, Pa s, of the 1976 standard plus `offset_k` at geometric
/// `altitude_m`; NaN on error and above 86 km.
#[no_mangle]
pub extern "system" fn aerostrata_xl_dynamic_viscosity(altitude_m: f64, offset_k: f64) -> f64 {
    nan_on_error(|| standard_state(altitude_m, offset_k)?.dynamic_viscosity())
}

/// Kinematic viscosity, m^2/s, of the 1976 standard plus `offset_k` at geometric
/// `altitude_m`; NaN on error and above 86 km.
#[no_mangle]
pub extern "system" fn aerostrata_xl_kinematic_viscosity(altitude_m: f64, offset_k: f64) -> f64 {
    nan_on_error(|| standard_state(altitude_m, offset_k)?.kinematic_viscosity())
}

/// Dynamic pressure rho V^2 / 2, Pa, from density and velocity; NaN on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_dynamic_pressure(density_kg_m3: f64, velocity_m_s: f64) -> f64 {
    nan_on_error(|| aero::dynamic_pressure_pa(density_kg_m3, velocity_m_s))
}

/// Mach number of `velocity_m_s` in the 1976 standard plus `offset_k` at geometric
/// `altitude_m`; NaN on error and above 86 km.
#[no_mangle]
pub extern "system" fn aerostrata_xl_mach(altitude_m: f64, offset_k: f64, velocity_m_s: f64) -> f64 {
    nan_on_error(|| aero::mach_number(velocity_m_s, standard_state(altitude_m, offset_k)?.speed_of_sound()?))
}

/// Pressure altitude, geopotential m, of `pressure_pa`; NaN on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_pressure_altitude(pressure_pa: f64) -> f64 {
    nan_on_error(|| Ok(inverse::pressure_altitude(pressure_pa)?.meters()))
}

/// Density altitude, geopotential m, of `density_kg_m3`; NaN on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_density_altitude(density_kg_m3: f64) -> f64 {
    nan_on_error(|| Ok(inverse::density_altitude(density_kg_m3)?.meters()))
}

/// True airspeed, m/s, of calibrated airspeed `calibrated_m_s` at pressure altitude
/// `pressure_altitude_m` and outside air temperature `temperature_k`; NaN on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_true_airspeed(
    calibrated_m_s: f64,
    pressure_altitude_m: f64,
    temperature_k: f64,
) -> f64 {
    nan_on_error(|| {
        Ok(AirData::from_pressure_altitude(pressure_altitude_m, temperature_k)?
            .airspeeds(Airspeed::Calibrated(calibrated_m_s))?
            .true_m_s)
    })
}

/// Calibrated airspeed, m/s, of true airspeed `true_m_s` at pressure altitude
/// `pressure_altitude_m` and outside air temperature `temperature_k`; NaN on error.
#[no_mangle]
pub extern "system" fn aerostrata_xl_calibrated_airspeed(
    true_m_s: f64,
    pressure_altitude_m: f64,
    temperature_k: f64,
) -> f64 {
    nan_on_error(|| {
        Ok(AirData::from_pressure_altitude(pressure_altitude_m, temperature_k)?
            .airspeeds(Airspeed::True(true_m_s))?
            .calibrated_m_s)
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata_core::US1976;

    #[test]
    fn values_and_nan() {
        assert_eq!(aerostrata_xl_pressure_pa(0.0, 0.0), 101_325.0);
        assert_eq!(
            aerostrata_xl_density(0.0, 0.0),
            US1976.state(Altitude::geometric_m(0.0).unwrap()).unwrap().density_kg_m3
        );
        assert!(aerostrata_xl_density(f64::NAN, 0.0).is_nan());
        assert!(aerostrata_xl_density(2.0e6, 0.0).is_nan());
        assert!(aerostrata_xl_speed_of_sound(150_000.0, 0.0).is_nan());
        assert!(aerostrata_xl_density(150_000.0, 0.0) > 0.0);
        assert!(aerostrata_xl_temperature_k(0.0, 15.0) == 303.15);
    }

    #[test]
    fn the_header_declares_exactly_these_functions() {
        // cbindgen skips extern "system", so cbindgen.toml declares them by hand.
        let source = include_str!("spreadsheet.rs");
        let config = include_str!("../cbindgen.toml");
        let marker = format!("pub extern {q}system{q} fn ", q = '"');
        let defined: Vec<&str> =
            source.split(marker.as_str()).skip(1).map(|rest| rest.split('(').next().unwrap_or("")).collect();
        let declared: Vec<&str> = config
            .split("AEROSTRATA_XL_CALL ")
            .skip(1)
            .filter_map(|rest| rest.split('(').next())
            .filter(|name| name.starts_with("aerostrata_xl_"))
            .collect();
        assert_eq!(defined.len(), 12);
        assert_eq!(defined, declared);
    }
}
