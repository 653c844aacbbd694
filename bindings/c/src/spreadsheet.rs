//! Spreadsheet-friendly scalar functions: plain doubles in (and, for a model, one
//! NUL-terminated spec string), one double out, NaN on any error (bad input, a property
//! undefined at the altitude, or a caught panic). They are the one documented exception to
//! the status rule, for macro languages and add-ins that can pass doubles and strings but
//! not pointers to records. `extern "system"` is the C convention on every platform except
//! 32-bit Windows, where it is stdcall, which spreadsheet macros expect. They do not set
//! the thread's error detail. Thread-safe; the standard models allocate nothing.

use core::ffi::{c_char, CStr};

use aerostrata_core::airspeed::{AirData, Airspeed};
use aerostrata_core::inverse::{barometric_altitude_m, BarometricReference};
use aerostrata_core::model::ModelSpec;
use aerostrata_core::quantity::Group;
use aerostrata_core::{aero, inverse, Altitude, AnyModel, Atmosphere, PerfectGas, Quantity, State};

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

fn nan_on_none(f: impl FnOnce() -> Option<f64>) -> f64 {
    crate::error::catch(f).ok().flatten().unwrap_or(f64::NAN)
}

/// The model a spreadsheet names: NULL or an empty string is the 1976 standard, anything
/// else a spec of the model grammar (`offset=+15K`, `hydrostatic-offset=+15K`,
/// `isothermal=250K`, `exponential=1.225,8500m`). Specs that name a file (`sounding=`,
/// `layers=`) are refused: a cell function reads no files. `None` for a spec that is not
/// valid UTF-8, does not parse, or names a model the core refuses.
///
/// # Safety
/// `model_spec` is NULL or points to a NUL-terminated string.
unsafe fn spec_model(model_spec: *const c_char) -> Option<AnyModel> {
    if model_spec.is_null() {
        return Some(AnyModel::Us1976);
    }
    // SAFETY: the caller passes NULL (handled above) or a NUL-terminated string.
    let text = unsafe { CStr::from_ptr(model_spec) }.to_str().ok()?;
    if text.trim().is_empty() {
        return Some(AnyModel::Us1976);
    }
    AnyModel::from_spec(&ModelSpec::parse(text).ok()?)?.ok()
}

/// A quantity of the state (`AEROSTRATA_QUANTITY_*` ids 0 to 19), else `None`.
fn state_quantity(quantity_id: u32) -> Option<Quantity> {
    Quantity::from_id(quantity_id).filter(|q| q.info().group == Group::State)
}

fn state_of(model: &AnyModel, altitude_m: f64) -> Option<State> {
    model.state(Altitude::geometric_m(altitude_m).ok()?).ok()
}

/// The state quantity `quantity_id` (an `AEROSTRATA_QUANTITY_*` id of the state group,
/// 0 to 19: temperature, pressure, density, speed of sound, viscosities, ...) in its SI
/// unit, at geometric `altitude_m` in the model `model_spec` names: NULL or "" for the
/// 1976 standard, else the model grammar of the command line's `--model` (`offset=+15K`,
/// `hydrostatic-offset=+15K`, `isothermal=250K`, `exponential=1.225,8500m`; no files).
///
/// NaN on error: an id outside the state group, a spec that does not parse or names a
/// file, an altitude outside the model, a property undefined there (the continuum
/// properties above 86 km). `model_spec` is NULL or a NUL-terminated UTF-8 string.
#[no_mangle]
pub unsafe extern "system" fn aerostrata_xl_state(
    quantity_id: u32,
    altitude_m: f64,
    model_spec: *const c_char,
) -> f64 {
    nan_on_none(|| {
        let quantity = state_quantity(quantity_id)?;
        // SAFETY: the caller's contract, passed on.
        let model = unsafe { spec_model(model_spec) }?;
        state_of(&model, altitude_m)?.get(quantity).ok()
    })
}

/// The state quantity `quantity_id` (as `aerostrata_xl_state`) in the 1976 standard plus
/// `offset_k` at geometric `altitude_m`: the same bits as `aerostrata_us1976_state`. NaN
/// on error (as `aerostrata_xl_state`; a NaN or infinite offset).
#[no_mangle]
pub extern "system" fn aerostrata_xl_state_offset(quantity_id: u32, altitude_m: f64, offset_k: f64) -> f64 {
    nan_on_none(|| standard_state(altitude_m, offset_k).ok()?.get(state_quantity(quantity_id)?).ok())
}

/// 1.0 when `model_spec` names a model the spreadsheet functions accept (NULL or "" for
/// the standard, else a spec of the model grammar that names no file), NaN otherwise: how
/// an add-in tells a bad model argument from an altitude outside a good model.
#[no_mangle]
pub unsafe extern "system" fn aerostrata_xl_model_valid(model_spec: *const c_char) -> f64 {
    // SAFETY: the caller's contract, passed on.
    nan_on_none(|| unsafe { spec_model(model_spec) }.map(|_| 1.0))
}

/// Mach number V / a of `velocity_m_s` at geometric `altitude_m` in the model
/// `model_spec` names (as `aerostrata_xl_state`); NaN on error and above 86 km.
#[no_mangle]
pub unsafe extern "system" fn aerostrata_xl_mach_at(
    altitude_m: f64,
    velocity_m_s: f64,
    model_spec: *const c_char,
) -> f64 {
    nan_on_none(|| {
        // SAFETY: the caller's contract, passed on.
        let state = state_of(&unsafe { spec_model(model_spec) }?, altitude_m)?;
        aero::mach_number(velocity_m_s, state.speed_of_sound().ok()?).ok()
    })
}

/// Dynamic pressure q = rho V^2 / 2, Pa, of `velocity_m_s` at geometric `altitude_m` in
/// the model `model_spec` names (as `aerostrata_xl_state`); NaN on error.
#[no_mangle]
pub unsafe extern "system" fn aerostrata_xl_dynamic_pressure_at(
    altitude_m: f64,
    velocity_m_s: f64,
    model_spec: *const c_char,
) -> f64 {
    nan_on_none(|| {
        // SAFETY: the caller's contract, passed on.
        let state = state_of(&unsafe { spec_model(model_spec) }?, altitude_m)?;
        aero::dynamic_pressure_pa(state.density_kg_m3, velocity_m_s).ok()
    })
}

/// Drag D = q Cd A, N, of a body with drag coefficient `drag_coefficient` on
/// `reference_area_m2` at `velocity_m_s` and geometric `altitude_m` in the model
/// `model_spec` names (as `aerostrata_xl_state`); NaN on error.
#[no_mangle]
pub unsafe extern "system" fn aerostrata_xl_drag(
    altitude_m: f64,
    velocity_m_s: f64,
    drag_coefficient: f64,
    reference_area_m2: f64,
    model_spec: *const c_char,
) -> f64 {
    nan_on_none(|| {
        // SAFETY: the caller's contract, passed on.
        let state = state_of(&unsafe { spec_model(model_spec) }?, altitude_m)?;
        let q = aero::dynamic_pressure_pa(state.density_kg_m3, velocity_m_s).ok()?;
        aero::drag_n(q, drag_coefficient, reference_area_m2).ok()
    })
}

/// QNH altitude, m: what an altimeter set to `qnh_pa` reads at static pressure
/// `pressure_pa` (the standard's pressure altitude of the pressure less that of the
/// setting); NaN on error, and for a setting outside the lower standard's pressures.
#[no_mangle]
pub extern "system" fn aerostrata_xl_qnh_altitude(pressure_pa: f64, qnh_pa: f64) -> f64 {
    nan_on_error(|| barometric_altitude_m(pressure_pa, BarometricReference::Qnh { setting_pa: qnh_pa }))
}

/// An airspeed converted: `speed_m_s` is the airspeed `given_id` names
/// (`AEROSTRATA_QUANTITY_CALIBRATED_AIRSPEED`, `_EQUIVALENT_AIRSPEED` or
/// `_TRUE_AIRSPEED`), the result the airspeed quantity `wanted_id` names (the same three,
/// `_MACH`, `_IMPACT_PRESSURE` in Pa or `_DYNAMIC_PRESSURE` in Pa), at pressure altitude
/// `pressure_altitude_m` and outside air temperature `temperature_k`. NaN on error (an id
/// of neither kind, a speed or an air state the core refuses).
#[no_mangle]
pub extern "system" fn aerostrata_xl_airspeed(
    given_id: u32,
    wanted_id: u32,
    speed_m_s: f64,
    pressure_altitude_m: f64,
    temperature_k: f64,
) -> f64 {
    nan_on_none(|| {
        let given = match Quantity::from_id(given_id)? {
            Quantity::CalibratedAirspeed => Airspeed::Calibrated(speed_m_s),
            Quantity::EquivalentAirspeed => Airspeed::Equivalent(speed_m_s),
            Quantity::TrueAirspeed => Airspeed::True(speed_m_s),
            _ => return None,
        };
        let air = AirData::from_pressure_altitude(pressure_altitude_m, temperature_k).ok()?;
        air.airspeeds(given).ok()?.get(Quantity::from_id(wanted_id)?).ok()
    })
}

macro_rules! flow_ratio {
    ($(#[$doc:meta])* $name:ident, $mach:ident => $value:expr) => {
        $(#[$doc])*
        #[no_mangle]
        pub extern "system" fn $name($mach: f64) -> f64 {
            nan_on_error(|| $value)
        }
    };
}

flow_ratio!(
    /// Isentropic static over total pressure p/p0 = (1 + (gamma-1)/2 M^2)^(-gamma/(gamma-1))
    /// of air (gamma = 1.4) at Mach `mach` (NACA Report 1135); NaN on error.
    aerostrata_xl_isentropic_pressure_ratio, mach => PerfectGas::AIR.pressure_ratio(mach)
);
flow_ratio!(
    /// Isentropic static over total temperature T/T0 = 1 / (1 + (gamma-1)/2 M^2) of air at
    /// Mach `mach` (NACA Report 1135); NaN on error.
    aerostrata_xl_isentropic_temperature_ratio, mach => PerfectGas::AIR.temperature_ratio(mach)
);
flow_ratio!(
    /// Isentropic static over total density rho/rho0 = (1 + (gamma-1)/2 M^2)^(-1/(gamma-1))
    /// of air at Mach `mach` (NACA Report 1135); NaN on error.
    aerostrata_xl_isentropic_density_ratio, mach => PerfectGas::AIR.density_ratio(mach)
);
flow_ratio!(
    /// Downstream Mach number M2 of a normal shock in air at upstream Mach `mach` (at least
    /// 1; NACA Report 1135); NaN on error.
    aerostrata_xl_normal_shock_mach, mach => Ok(PerfectGas::AIR.normal_shock(mach)?.downstream_mach)
);
flow_ratio!(
    /// Static pressure ratio p2/p1 across a normal shock in air at upstream Mach `mach`
    /// (NACA Report 1135); NaN on error.
    aerostrata_xl_normal_shock_pressure_ratio, mach => Ok(PerfectGas::AIR.normal_shock(mach)?.pressure_ratio)
);
flow_ratio!(
    /// Density ratio rho2/rho1 across a normal shock in air at upstream Mach `mach` (NACA
    /// Report 1135); NaN on error.
    aerostrata_xl_normal_shock_density_ratio, mach => Ok(PerfectGas::AIR.normal_shock(mach)?.density_ratio)
);
flow_ratio!(
    /// Static temperature ratio T2/T1 across a normal shock in air at upstream Mach `mach`
    /// (NACA Report 1135); NaN on error.
    aerostrata_xl_normal_shock_temperature_ratio, mach => Ok(PerfectGas::AIR.normal_shock(mach)?.temperature_ratio)
);
flow_ratio!(
    /// Total pressure ratio p02/p01 across a normal shock in air at upstream Mach `mach`
    /// (NACA Report 1135); NaN on error.
    aerostrata_xl_normal_shock_total_pressure_ratio,
    mach => Ok(PerfectGas::AIR.normal_shock(mach)?.total_pressure_ratio)
);

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
    fn state_by_id_and_spec() {
        let at = |z: f64| US1976.state(Altitude::geometric_m(z).unwrap()).unwrap();
        let spec = |text: &str| alloc::ffi::CString::new(text).unwrap();
        let density = Quantity::Density.id();
        // SAFETY (every call below): NULL or a CString's NUL-terminated pointer.
        unsafe {
            assert_eq!(aerostrata_xl_state(density, 5000.0, core::ptr::null()), at(5000.0).density_kg_m3);
            assert_eq!(
                aerostrata_xl_state(density, 5000.0, spec(" standard ").as_ptr()),
                at(5000.0).density_kg_m3
            );
            assert_eq!(
                aerostrata_xl_state(density, 5000.0, spec("offset=+27F").as_ptr()),
                aerostrata_xl_state_offset(density, 5000.0, 15.0)
            );
            assert_eq!(
                aerostrata_xl_state(Quantity::Temperature.id(), 9000.0, spec("isothermal=250K").as_ptr()),
                250.0
            );
            assert!(aerostrata_xl_state(Quantity::Mach.id(), 5000.0, core::ptr::null()).is_nan());
            assert!(aerostrata_xl_state(density, 5000.0, spec("layers=a.csv").as_ptr()).is_nan());
            assert!(aerostrata_xl_model_valid(spec("exponential=1.225,8500m").as_ptr()) == 1.0);
            assert!(aerostrata_xl_model_valid(spec("offset=15").as_ptr()) == 1.0);
            assert!(aerostrata_xl_model_valid(spec("offset").as_ptr()).is_nan());
        }
        let given = Quantity::TrueAirspeed.id();
        assert_eq!(aerostrata_xl_airspeed(given, given, 70.0, 1000.0, 280.0), 70.0);
        assert!(aerostrata_xl_airspeed(given, Quantity::Time.id(), 70.0, 1000.0, 280.0).is_nan());
        assert!(aerostrata_xl_isentropic_temperature_ratio(f64::INFINITY).is_nan());
    }

    #[test]
    fn the_header_declares_exactly_these_functions() {
        // cbindgen skips extern "system", so cbindgen.toml declares them by hand.
        let source = include_str!("spreadsheet.rs");
        let config = include_str!("../cbindgen.toml");
        let marker = format!("extern {q}system{q} fn ", q = '"');
        // Functions written out, then those of `flow_ratio!`, whose name is the first
        // argument of each use.
        let mut defined: Vec<&str> = source
            .split(marker.as_str())
            .skip(1)
            .map(|rest| rest.split('(').next().unwrap_or(""))
            .filter(|name| name.starts_with("aerostrata_xl_"))
            .collect();
        let uses = source.split("\nflow_ratio!(").skip(1);
        defined.extend(
            uses.filter_map(|body| {
                body.split([' ', '\n', ',']).find(|word| word.starts_with("aerostrata_xl_"))
            }),
        );
        let declared: Vec<&str> = config
            .split("AEROSTRATA_XL_CALL ")
            .skip(1)
            .filter_map(|rest| rest.split('(').next())
            .filter(|name| name.starts_with("aerostrata_xl_"))
            .collect();
        assert_eq!(defined.len(), 28);
        assert_eq!(defined, declared);
    }
}
