//! Atmosphere models behind one opaque handle, and the full state as a C struct.

use aerostrata_core::{
    Air, Altitude, AltitudeKind, Atmosphere, Exponential, HydrostaticOffset, Isothermal, LayerSpec, Layered,
    SoundingRow, State, Tabulated, US1976,
};
use alloc::vec::Vec;

use aerostrata_core::quantity::Group;
use aerostrata_core::Quantity;

use crate::catalogue::{AerostrataSpecies, AerostrataState};
use crate::error::{guard, require, AerostrataStatus, Failure};
use crate::{free_handle, handle_ref, into_handle, output, slice, slice_mut, write};

/// The models a handle can hold: any of the core's, owned.
pub(crate) type Model = aerostrata_core::AnyModel;

/// `altitude_kind` value: geometric altitude above mean sea level, m.
pub const AEROSTRATA_GEOMETRIC: u32 = 0;
/// `altitude_kind` value: geopotential altitude, geopotential m.
pub const AEROSTRATA_GEOPOTENTIAL: u32 = 1;

/// `AerostrataState::defined` bit: speed of sound, dynamic and kinematic viscosity and
/// thermal conductivity are defined (the continuum properties; not above 86 km).
pub const AEROSTRATA_DEFINED_CONTINUUM: u32 = 1;

pub(crate) fn altitude(meters: f64, kind: u32) -> Result<Altitude, Failure> {
    Ok(match kind {
        AEROSTRATA_GEOMETRIC => Altitude::geometric_m(meters)?,
        AEROSTRATA_GEOPOTENTIAL => Altitude::geopotential_m(meters)?,
        other => {
            return Err(Failure::invalid_argument(
                "altitude_kind",
                "must be AEROSTRATA_GEOMETRIC (0) or AEROSTRATA_GEOPOTENTIAL (1)",
                f64::from(other),
            ))
        }
    })
}

fn altitude_kind(kind: u32) -> Result<AltitudeKind, Failure> {
    match kind {
        AEROSTRATA_GEOMETRIC => Ok(AltitudeKind::Geometric),
        AEROSTRATA_GEOPOTENTIAL => Ok(AltitudeKind::Geopotential),
        other => Err(Failure::invalid_argument(
            "altitude_kind",
            "must be AEROSTRATA_GEOMETRIC (0) or AEROSTRATA_GEOPOTENTIAL (1)",
            f64::from(other),
        )),
    }
}

impl From<State> for AerostrataState {
    fn from(s: State) -> Self {
        // The continuum properties are defined together or not at all.
        let continuum =
            Quantity::of_group(Group::State).filter(|q| q.info().may_be_undefined).all(|q| s.get(q).is_ok());
        let defined = if continuum { AEROSTRATA_DEFINED_CONTINUUM } else { 0 };
        Self::from_values(|q| s.get(q).unwrap_or(f64::NAN), defined)
    }
}

/// An atmosphere model: the 1976 standard with a temperature offset, an exponential or
/// isothermal profile, user layers or a sounding. Opaque; made by an
/// `aerostrata_model_new_*` function and released with `aerostrata_model_free`.
///
/// A model never changes after it is made, so one model may be used from any number of
/// threads at once; it must not be used during or after `aerostrata_model_free`.
pub struct AerostrataModel {
    pub(crate) model: Model,
}

/// The tag word of a model handle ("modl").
pub(crate) const MODEL_TAG: u32 = u32::from_le_bytes(*b"modl");

impl crate::Handle for AerostrataModel {
    const TAG: u32 = MODEL_TAG;
    const WHAT: &'static str = "model";
    const FREE: &'static str = "aerostrata_model_free";
}

/// The standard with an offset; the standard itself for 0, so that a model and the
/// handle-free functions give the same bits.
fn standard(offset_k: f64) -> Result<Model, Failure> {
    Ok(Model::standard(offset_k)?)
}

/// Checks `out` for NULL, makes the model and writes a new handle to it to `*out`: the
/// shape of every `aerostrata_model_new_*`.
fn new_model(
    out: *mut *mut AerostrataModel,
    make: impl FnOnce() -> Result<Model, Failure>,
) -> AerostrataStatus {
    output(out, || Ok(into_handle(AerostrataModel { model: make()? })))
}

/// Makes the 1976 standard atmosphere (-5 km to 1000 km geometric) with every
/// temperature shifted by `offset_k` kelvin at the standard's pressure (0 for the
/// standard itself; +15 for ISA+15).
///
/// On success writes a new model to `*out`; the caller owns it and releases it with
/// `aerostrata_model_free`. On failure `*out` is left unchanged.
///
/// Errors: NOT_FINITE for a NaN or infinite offset; NULL_POINTER for a NULL `out`.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_new_us1976(
    offset_k: f64,
    out: *mut *mut AerostrataModel,
) -> AerostrataStatus {
    new_model(out, || standard(offset_k))
}

/// Makes a hot or cold day in hydrostatic balance: the 1976 standard's temperature
/// profile shifted by `offset_k` kelvin at every geopotential altitude, and the pressure
/// integrated through it from `sea_level_pressure_pa` at geopotential altitude 0
/// (101325 for the standard's), -5 km to 86 km geometric. The other convention,
/// `aerostrata_model_new_us1976` with an offset, keeps the standard's pressure at each
/// altitude; docs/models.md says when to use which.
///
/// Ownership as `aerostrata_model_new_us1976`. Errors: NOT_FINITE or OUT_OF_RANGE for an
/// offset outside -100 to 100 K or a pressure outside 10 000 to 200 000 Pa; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_new_hydrostatic_offset(
    offset_k: f64,
    sea_level_pressure_pa: f64,
    out: *mut *mut AerostrataModel,
) -> AerostrataStatus {
    new_model(out, || Ok(Model::HydrostaticOffset(HydrostaticOffset::new(offset_k, sea_level_pressure_pa)?)))
}

/// Makes an exponential atmosphere: density `sea_level_density_kg_m3` at 0 m falling by
/// e every `scale_height_m`, at the constant temperature `temperature_k`.
///
/// Ownership as `aerostrata_model_new_us1976`. Errors: NOT_FINITE or NOT_POSITIVE for a
/// parameter that is not finite and above 0; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_new_exponential(
    sea_level_density_kg_m3: f64,
    scale_height_m: f64,
    temperature_k: f64,
    out: *mut *mut AerostrataModel,
) -> AerostrataStatus {
    new_model(out, || {
        Ok(Model::Exponential(Exponential::new(sea_level_density_kg_m3, scale_height_m, temperature_k)?))
    })
}

/// Makes an isothermal atmosphere at `temperature_k` with pressure
/// `sea_level_pressure_pa` at geopotential altitude 0.
///
/// Ownership as `aerostrata_model_new_us1976`. Errors: NOT_FINITE or NOT_POSITIVE for a
/// parameter that is not finite and above 0; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_new_isothermal(
    temperature_k: f64,
    sea_level_pressure_pa: f64,
    out: *mut *mut AerostrataModel,
) -> AerostrataStatus {
    new_model(out, || Ok(Model::Isothermal(Isothermal::new(temperature_k, sea_level_pressure_pa)?)))
}

/// One user layer: where it ends and its constant lapse rate.
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataLayerSpec {
    /// Geopotential altitude of the layer's top, m.
    pub top_geopotential_m: f64,
    /// dT/dH, K per geopotential metre (negative when temperature falls with height).
    pub lapse_rate_k_m: f64,
}

/// Makes a model of `count` layers of constant lapse rate stacked from a base at
/// geopotential altitude `base_geopotential_m` with temperature `base_temperature_k` and
/// pressure `base_pressure_pa`; `layers` lists them lowest first.
///
/// The `count` layers are copied: the caller may free or change `layers` as soon as this
/// returns. Ownership of the model as `aerostrata_model_new_us1976`.
///
/// Errors: INVALID_LAYER (the detail's `index` names the layer) for no layers, a NaN, a
/// top not above its base, a temperature reaching 0 K or a pressure underflowing;
/// NULL_POINTER for a NULL `out`, or a NULL `layers` with `count` above 0.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_new_layers(
    base_geopotential_m: f64,
    base_temperature_k: f64,
    base_pressure_pa: f64,
    layers: *const AerostrataLayerSpec,
    count: usize,
    out: *mut *mut AerostrataModel,
) -> AerostrataStatus {
    new_model(out, || {
        let given = slice("layers", layers, count)?;
        let specs: Vec<LayerSpec> = given
            .iter()
            .map(|l| LayerSpec { top_geopotential_m: l.top_geopotential_m, lapse_rate_k_m: l.lapse_rate_k_m })
            .collect();
        let model =
            Layered::from_lapse_rates_vec(base_geopotential_m, base_temperature_k, base_pressure_pa, &specs)?;
        Ok(Model::Layers(model))
    })
}

/// `AerostrataSoundingRow::fields` bit: the row gives `pressure_pa`.
pub const AEROSTRATA_ROW_PRESSURE: u32 = 1;
/// `AerostrataSoundingRow::fields` bit: the row gives `density_kg_m3`.
pub const AEROSTRATA_ROW_DENSITY: u32 = 2;
/// `AerostrataSoundingRow::fields` bit: the row gives `dew_point_k`.
pub const AEROSTRATA_ROW_DEW_POINT: u32 = 4;
/// `AerostrataSoundingRow::fields` bit: the row gives `relative_humidity_percent`.
pub const AEROSTRATA_ROW_RELATIVE_HUMIDITY: u32 = 8;

/// One row of a sounding. `altitude_m` and `temperature_k` are always read; each of the
/// other four values is read only when its bit is set in `fields` (otherwise its value is
/// ignored, so it may be anything). Which rows must give what is described at
/// `aerostrata_model_new_sounding`.
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct AerostrataSoundingRow {
    /// Altitude, m, of the kind the sounding declares.
    pub altitude_m: f64,
    /// Kinetic temperature, K.
    pub temperature_k: f64,
    /// Pressure, Pa (read with `AEROSTRATA_ROW_PRESSURE`).
    pub pressure_pa: f64,
    /// Density of the (moist) air, kg/m^3 (read with `AEROSTRATA_ROW_DENSITY`).
    pub density_kg_m3: f64,
    /// Dew point, K (read with `AEROSTRATA_ROW_DEW_POINT`).
    pub dew_point_k: f64,
    /// Relative humidity over water, % (read with `AEROSTRATA_ROW_RELATIVE_HUMIDITY`).
    pub relative_humidity_percent: f64,
    /// Which of the four optional values the row gives: `AEROSTRATA_ROW_*` bits.
    pub fields: u32,
}

/// Makes a model from a sounding of `count` rows at altitudes of `altitude_kind`
/// (`AEROSTRATA_GEOMETRIC` or `AEROSTRATA_GEOPOTENTIAL`), lowest first. The rows give a
/// pressure on every row, a density on every row, or a pressure on the first row only
/// (the rest then follows from hydrostatic balance); each may give a dew point or a
/// relative humidity. The model is defined from the first row's altitude to the last's.
///
/// The rows are copied: the caller may free or change `rows` as soon as this returns.
/// Ownership of the model as `aerostrata_model_new_us1976`.
///
/// Errors: TOO_FEW_ROWS below 2 rows; ROW_NOT_FINITE, ALTITUDE_NOT_INCREASING,
/// ROW_TEMPERATURE_NOT_POSITIVE, ROW_NOT_POSITIVE, PRESSURE_NOT_DECREASING,
/// RELATIVE_HUMIDITY_OUT_OF_RANGE, DEW_POINT_ABOVE_TEMPERATURE, ROW_OUT_OF_RANGE,
/// ROW_COLUMNS, NOT_HYDROSTATIC, VAPOUR_PRESSURE_TOO_HIGH for a bad row (the detail's
/// `index` names it); INVALID_ARGUMENT for an unknown `altitude_kind` or unknown bits in
/// `fields`; NULL_POINTER.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_new_sounding(
    altitude_kind: u32,
    rows: *const AerostrataSoundingRow,
    count: usize,
    out: *mut *mut AerostrataModel,
) -> AerostrataStatus {
    new_model(out, || {
        let kind = self::altitude_kind(altitude_kind)?;
        let given = slice("rows", rows, count)?;
        let all = AEROSTRATA_ROW_PRESSURE
            | AEROSTRATA_ROW_DENSITY
            | AEROSTRATA_ROW_DEW_POINT
            | AEROSTRATA_ROW_RELATIVE_HUMIDITY;
        let mut converted = Vec::with_capacity(given.len());
        for (index, r) in given.iter().enumerate() {
            if r.fields & !all != 0 {
                return Err(Failure::invalid_argument(
                    "fields",
                    "unknown AEROSTRATA_ROW_* bits",
                    f64::from(r.fields),
                )
                .at_element(index));
            }
            let mut row = SoundingRow::new(r.altitude_m, r.temperature_k);
            let has = |bit: u32| r.fields & bit != 0;
            row.pressure_pa = has(AEROSTRATA_ROW_PRESSURE).then_some(r.pressure_pa);
            row.density_kg_m3 = has(AEROSTRATA_ROW_DENSITY).then_some(r.density_kg_m3);
            row.dew_point_k = has(AEROSTRATA_ROW_DEW_POINT).then_some(r.dew_point_k);
            row.relative_humidity_percent =
                has(AEROSTRATA_ROW_RELATIVE_HUMIDITY).then_some(r.relative_humidity_percent);
            converted.push(row);
        }
        Ok(Model::Sounding(Tabulated::from_rows_vec(kind, &converted)?))
    })
}

/// Releases a model made by an `aerostrata_model_new_*` function. NULL is accepted and
/// does nothing (OK). The model must not be used afterwards, nor freed twice, nor be in
/// use by another thread.
///
/// Errors: INVALID_HANDLE, releasing nothing, for a model freed already, a handle of
/// another type or a pointer that is no handle (within the limits docs/c-guide.md
/// states). The thread's error detail is written only on failure.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_free(model: *mut AerostrataModel) -> AerostrataStatus {
    free_handle("model", model)
}

pub(crate) fn model_ref<'a>(model: *const AerostrataModel) -> Result<&'a Model, Failure> {
    Ok(&handle_ref("model", model)?.model)
}

/// The geometric altitude range of `model`, m: writes the lowest and highest altitudes
/// the model accepts to `*min_m` and `*max_m`.
///
/// Errors: NULL_POINTER. Thread-safe for a shared model.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_range_geometric_m(
    model: *const AerostrataModel,
    min_m: *mut f64,
    max_m: *mut f64,
) -> AerostrataStatus {
    guard(|| {
        let m = model_ref(model)?;
        require("min_m", min_m)?;
        require("max_m", max_m)?;
        let range = m.range();
        write(min_m, range.geometric_min_m);
        write(max_m, range.geometric_max_m);
        Ok(())
    })
}

/// The full state of `model` at `altitude_m` metres of `altitude_kind`
/// (`AEROSTRATA_GEOMETRIC` or `AEROSTRATA_GEOPOTENTIAL`), written to `*out` on success.
///
/// Errors: NOT_FINITE or OUT_OF_RANGE for an altitude outside the model's range (the
/// detail gives the range); INVALID_ARGUMENT for an unknown kind; NULL_POINTER; a
/// model's own errors. Thread-safe for a shared model.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_state(
    model: *const AerostrataModel,
    altitude_m: f64,
    altitude_kind: u32,
    out: *mut AerostrataState,
) -> AerostrataStatus {
    output(out, || Ok(model_ref(model)?.state(altitude(altitude_m, altitude_kind)?)?.into()))
}

/// The full state of `model` at each of the `count` altitudes `altitudes_m` (all of
/// `altitude_kind`), written to `out[0]` .. `out[count - 1]`.
///
/// All or nothing: if any altitude fails, nothing is written and the detail's `index`
/// names the first failing element. `altitudes_m` and `out` may be NULL only when
/// `count` is 0. Errors: as `aerostrata_model_state`. Thread-safe for a shared model.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_states(
    model: *const AerostrataModel,
    altitudes_m: *const f64,
    count: usize,
    altitude_kind: u32,
    out: *mut AerostrataState,
) -> AerostrataStatus {
    guard(|| {
        let m = model_ref(model)?;
        let input = slice("altitudes_m", altitudes_m, count)?;
        let output = slice_mut("out", out, count)?;
        let states = evaluate_all(m, input, altitude_kind)?;
        for (slot, state) in output.iter_mut().zip(states) {
            *slot = state.into();
        }
        Ok(())
    })
}

/// One output column of `aerostrata_model_columns`: what it takes from the air.
type Column = fn(&Air) -> f64;

fn evaluate_all(m: &Model, altitudes: &[f64], kind: u32) -> Result<Vec<State>, Failure> {
    altitudes
        .iter()
        .enumerate()
        .map(|(i, &a)| {
            altitude(a, kind).and_then(|h| m.state(h).map_err(Failure::from)).map_err(|f| f.at_element(i))
        })
        .collect()
}

/// Temperature (K), pressure (Pa) and density (kg/m^3) of `model` at each of the `count`
/// altitudes `altitudes_m` of `altitude_kind`, as three columns: `temperature_k[i]`,
/// `pressure_pa[i]`, `density_kg_m3[i]`. Any of the three output arrays may be NULL
/// when that column is not wanted.
///
/// All or nothing, as `aerostrata_model_states`. Thread-safe for a shared model.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_model_columns(
    model: *const AerostrataModel,
    altitudes_m: *const f64,
    count: usize,
    altitude_kind: u32,
    temperature_k: *mut f64,
    pressure_pa: *mut f64,
    density_kg_m3: *mut f64,
) -> AerostrataStatus {
    guard(|| {
        let m = model_ref(model)?;
        let input = slice("altitudes_m", altitudes_m, count)?;
        let airs: Vec<Air> = input
            .iter()
            .enumerate()
            .map(|(i, &a)| {
                altitude(a, altitude_kind)
                    .and_then(|h| m.air(h).map_err(Failure::from))
                    .map_err(|f| f.at_element(i))
            })
            .collect::<Result<_, _>>()?;
        let columns: [(*mut f64, Column); 3] = [
            (temperature_k, Air::temperature_k),
            (pressure_pa, Air::pressure_pa),
            (density_kg_m3, Air::density_kg_m3),
        ];
        for (column, value) in columns {
            if !column.is_null() {
                for (slot, air) in slice_mut("column", column, count)?.iter_mut().zip(&airs) {
                    *slot = value(air);
                }
            }
        }
        Ok(())
    })
}

/// The full state of the 1976 standard with temperature offset `offset_k` (0 for the
/// standard itself) at `altitude_m` metres of `altitude_kind`, without making a model.
/// Allocates nothing.
///
/// Errors: NOT_FINITE for a NaN offset or altitude; OUT_OF_RANGE outside -5 km to
/// 1000 km geometric; INVALID_ARGUMENT for an unknown kind; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_us1976_state(
    altitude_m: f64,
    altitude_kind: u32,
    offset_k: f64,
    out: *mut AerostrataState,
) -> AerostrataStatus {
    output(out, || {
        let h = altitude(altitude_m, altitude_kind)?;
        Ok(Model::standard(offset_k)?.state(h)?.into())
    })
}

/// The six species' number densities of the 1976 standard at `altitude_m` metres of
/// `altitude_kind`, from 86 km to 1000 km geometric. Allocates nothing.
///
/// Errors: NOT_FINITE for a NaN altitude; OUT_OF_RANGE outside 86 km to 1000 km
/// geometric; INVALID_ARGUMENT for an unknown kind; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_us1976_species(
    altitude_m: f64,
    altitude_kind: u32,
    out: *mut AerostrataSpecies,
) -> AerostrataStatus {
    output(out, || {
        let n = US1976.species(altitude(altitude_m, altitude_kind)?)?;
        Ok(AerostrataSpecies::from_values(|q| n.get(q))?)
    })
}

/// As `aerostrata_model_states` for the 1976 standard with temperature offset `offset_k`.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_us1976_states(
    altitudes_m: *const f64,
    count: usize,
    altitude_kind: u32,
    offset_k: f64,
    out: *mut AerostrataState,
) -> AerostrataStatus {
    guard(|| {
        let input = slice("altitudes_m", altitudes_m, count)?;
        let output = slice_mut("out", out, count)?;
        let model = standard(offset_k)?;
        let states = evaluate_all(&model, input, altitude_kind)?;
        for (slot, state) in output.iter_mut().zip(states) {
            *slot = state.into();
        }
        Ok(())
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use core::ptr;

    #[test]
    fn standard_sea_level_through_the_handle_and_directly() {
        let mut model = ptr::null_mut();
        // SAFETY: valid out-pointers; the model is freed once.
        unsafe {
            assert_eq!(aerostrata_model_new_us1976(0.0, &mut model), AerostrataStatus::Ok);
            let mut a = core::mem::zeroed::<AerostrataState>();
            let mut b = core::mem::zeroed::<AerostrataState>();
            assert_eq!(
                aerostrata_model_state(model, 0.0, AEROSTRATA_GEOMETRIC, &mut a),
                AerostrataStatus::Ok
            );
            assert_eq!(aerostrata_us1976_state(0.0, AEROSTRATA_GEOMETRIC, 0.0, &mut b), AerostrataStatus::Ok);
            assert_eq!(a, b);
            assert_eq!(a.pressure_pa, 101_325.0);
            assert_eq!(a.defined, AEROSTRATA_DEFINED_CONTINUUM);
            assert_eq!(aerostrata_model_free(model), AerostrataStatus::Ok);
        }
    }

    #[test]
    fn above_86_km_the_continuum_fields_are_nan_and_flagged() {
        // SAFETY: valid out-pointer.
        let s = unsafe {
            let mut s = core::mem::zeroed::<AerostrataState>();
            assert_eq!(
                aerostrata_us1976_state(200_000.0, AEROSTRATA_GEOMETRIC, 0.0, &mut s),
                AerostrataStatus::Ok
            );
            s
        };
        assert_eq!(s.defined, 0);
        assert!(s.speed_of_sound_m_s.is_nan() && s.dynamic_viscosity_pa_s.is_nan());
        assert!(s.density_kg_m3 > 0.0);
    }

    #[test]
    fn a_failed_batch_writes_nothing() {
        let alts = [0.0, 1000.0, f64::NAN];
        let sentinel = AerostrataState::from(US1976.state(Altitude::geometric_m(5.0).unwrap()).unwrap());
        let mut out = [sentinel; 3];
        // SAFETY: three altitudes and three states.
        let status = unsafe {
            aerostrata_us1976_states(alts.as_ptr(), 3, AEROSTRATA_GEOMETRIC, 0.0, out.as_mut_ptr())
        };
        assert_eq!(status, AerostrataStatus::NotFinite);
        assert!(out.iter().all(|s| *s == sentinel));
    }
}
