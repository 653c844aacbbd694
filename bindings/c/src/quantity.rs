//! The quantity catalogue through C: what each quantity id means (name, symbol, label,
//! description, SI and US units), its US conversion, and reading a state's or a flight
//! sample's value by id. The ids and the records are generated from the core's catalogue
//! by the build script (`catalogue.rs`); nothing here lists quantities.

use core::ffi::{c_char, CStr};

use aerostrata_core::quantity::Group;
use aerostrata_core::units::Unit;
use aerostrata_core::{Error, Quantity};

use crate::catalogue::{AerostrataFlightPoint, AerostrataState, TEXTS};
use crate::error::{guard, require, AerostrataStatus, Failure};
use crate::{output, write};

/// `AerostrataQuantityInfo::group`: a property of the atmosphere's state.
pub const AEROSTRATA_GROUP_STATE: u32 = 0;
/// `AerostrataQuantityInfo::group`: a species' number density of the standard above 86 km.
pub const AEROSTRATA_GROUP_SPECIES: u32 = 1;
/// `AerostrataQuantityInfo::group`: a value of a flight sample.
pub const AEROSTRATA_GROUP_FLIGHT: u32 = 2;
/// `AerostrataQuantityInfo::group`: an airspeed, or a pressure behind one.
pub const AEROSTRATA_GROUP_AIRSPEED: u32 = 3;
/// `AerostrataQuantityInfo::group`: an altitude a barometer gives, or a pressure it reads.
pub const AEROSTRATA_GROUP_ALTIMETRY: u32 = 4;
/// `AerostrataQuantityInfo::group`: a parameter a person gives (an offset, a size).
pub const AEROSTRATA_GROUP_PARAMETER: u32 = 5;
/// `AerostrataQuantityInfo::group`: winds aloft (a sounding's, a wind profile's, a flight
/// sample's).
pub const AEROSTRATA_GROUP_WIND: u32 = 6;

fn group_id(group: Group) -> u32 {
    match group {
        Group::State => AEROSTRATA_GROUP_STATE,
        Group::Species => AEROSTRATA_GROUP_SPECIES,
        Group::Flight => AEROSTRATA_GROUP_FLIGHT,
        Group::Airspeed => AEROSTRATA_GROUP_AIRSPEED,
        Group::Altimetry => AEROSTRATA_GROUP_ALTIMETRY,
        Group::Wind => AEROSTRATA_GROUP_WIND,
        _ => AEROSTRATA_GROUP_PARAMETER,
    }
}

/// What the catalogue says of one quantity. The strings are static and NUL-terminated:
/// never free or change them.
#[repr(C)]
#[derive(Debug, Clone, Copy)]
pub struct AerostrataQuantityInfo {
    /// The id (an `AerostrataQuantity` value).
    pub id: u32,
    /// `AEROSTRATA_GROUP_*`: which result carries it.
    pub group: u32,
    /// 1 when it can be undefined (the continuum properties above 86 km, a drag without a
    /// vehicle), else 0.
    pub may_be_undefined: u32,
    /// The machine name, snake_case (`speed_of_sound`); CSV columns append the unit.
    pub name: *const c_char,
    /// The short symbol of tables (`a`).
    pub symbol: *const c_char,
    /// A label for people, lower case but for proper names (`speed of sound`).
    pub label: *const c_char,
    /// One line of what it is.
    pub description: *const c_char,
    /// The SI unit's symbol (`m/s`; empty for a pure number): every value in and out of
    /// this library is in it.
    pub si_unit: *const c_char,
    /// The US customary unit's symbol (`ft/s`), for `aerostrata_quantity_to_us`.
    pub us_unit: *const c_char,
    /// The CSV column name in SI (`speed_of_sound_m_s`), as every door writes it.
    pub si_column: *const c_char,
    /// The CSV column name in US units (`speed_of_sound_ft_s`).
    pub us_column: *const c_char,
}

pub(crate) fn quantity(id: u32) -> Result<Quantity, Failure> {
    Quantity::from_id(id).ok_or_else(|| {
        Failure::invalid_argument(
            "quantity",
            "is not a quantity id (AEROSTRATA_QUANTITY_*, 0 to AEROSTRATA_QUANTITY_COUNT - 1)",
            f64::from(id),
        )
    })
}

/// How many quantities the catalogue has (`AEROSTRATA_QUANTITY_COUNT` of the library the
/// program runs with): the ids run from 0 to this minus 1. Thread-safe.
#[no_mangle]
pub extern "C" fn aerostrata_quantity_count() -> u32 {
    u32::try_from(Quantity::ALL.len()).unwrap_or(u32::MAX)
}

/// Writes what the catalogue says of quantity `quantity` to `*out`.
///
/// Errors: INVALID_ARGUMENT for an id that names no quantity; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_quantity_info(
    quantity_id: u32,
    out: *mut AerostrataQuantityInfo,
) -> AerostrataStatus {
    guard(|| {
        require("out", out)?;
        let q = quantity(quantity_id)?;
        let info = q.info();
        let [name, symbol, label, description, si_unit, us_unit, si_column, us_column] =
            TEXTS[q.id() as usize].map(CStr::as_ptr);
        write(
            out,
            AerostrataQuantityInfo {
                id: info.id,
                group: group_id(info.group),
                may_be_undefined: u32::from(info.may_be_undefined),
                name,
                symbol,
                label,
                description,
                si_unit,
                us_unit,
                si_column,
                us_column,
            },
        );
        Ok(())
    })
}

/// Writes the id of the quantity whose machine name is the NUL-terminated `name`
/// (`"speed_of_sound"`, exactly) to `*out`.
///
/// Errors: INVALID_ARGUMENT for a name no quantity has (or not UTF-8); NULL_POINTER.
/// Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_quantity_from_name(
    name: *const c_char,
    out: *mut u32,
) -> AerostrataStatus {
    guard(|| {
        require("name", name)?;
        require("out", out)?;
        // SAFETY: non-NULL, and NUL-terminated by the caller's contract.
        let text = unsafe { CStr::from_ptr(name) }.to_str().unwrap_or("");
        let q = Quantity::from_name(text).ok_or_else(|| Failure::unknown_name("name", text))?;
        write(out, q.id());
        Ok(())
    })
}

fn finite(name: &'static str, value: f64) -> Result<f64, Failure> {
    if value.is_finite() {
        Ok(value)
    } else {
        Err(Error::NotFinite { quantity: name, value }.into())
    }
}

/// `value` of quantity `quantity_id` through `convert` with the quantity's US unit,
/// written to `*out`: the shape of both conversions.
fn convert_us(
    quantity_id: u32,
    value: f64,
    out: *mut f64,
    convert: fn(&Unit, f64) -> f64,
) -> AerostrataStatus {
    output(out, || Ok(convert(quantity(quantity_id)?.us(), finite("value", value)?)))
}

/// Converts `si`, a value of quantity `quantity` in its SI unit, to the quantity's US
/// customary unit (`us_unit` of `aerostrata_quantity_info`), written to `*out`.
///
/// Errors: NOT_FINITE; INVALID_ARGUMENT for an unknown id; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_quantity_to_us(
    quantity_id: u32,
    si: f64,
    out: *mut f64,
) -> AerostrataStatus {
    convert_us(quantity_id, si, out, Unit::from_si)
}

/// Converts `us`, a value of quantity `quantity` in its US customary unit, to its SI
/// unit, written to `*out`.
///
/// Errors: NOT_FINITE; INVALID_ARGUMENT for an unknown id; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_quantity_from_us(
    quantity_id: u32,
    us: f64,
    out: *mut f64,
) -> AerostrataStatus {
    convert_us(quantity_id, us, out, Unit::to_si)
}

/// The value of quantity `quantity_id` in the record at `record` (the argument `name`,
/// the result `result`, at `altitude_m` of it), written to `*out`: the field `get` gives,
/// or NOT_CARRIED for a quantity the record has no field for, or UNDEFINED where the
/// field is NaN. `record` must be NULL or point to a valid record.
unsafe fn record_get<R>(
    name: &'static str,
    record: *const R,
    quantity_id: u32,
    out: *mut f64,
    result: &'static str,
    read: impl FnOnce(&R, Quantity) -> (Option<f64>, f64),
) -> AerostrataStatus {
    guard(|| {
        require(name, record)?;
        require("out", out)?;
        let q = quantity(quantity_id)?;
        // SAFETY: non-NULL, and a valid record by the caller's contract.
        let (value, altitude_m) = read(unsafe { &*record }, q);
        match value {
            None => Err(Error::NotCarried { quantity: q.name(), result }.into()),
            Some(v) if v.is_nan() => Err(Error::Undefined { quantity: q.label(), altitude_m }.into()),
            Some(v) => {
                write(out, v);
                Ok(())
            }
        }
    })
}

/// The value of quantity `quantity` in `*state` (in its SI unit), written to `*out`: the
/// one accessor that reaches every property of the state by id, new ones included.
///
/// Errors: UNDEFINED where the state does not define it (the continuum properties above
/// 86 km); NOT_CARRIED for a quantity that is not a property of the state (a Mach number);
/// INVALID_ARGUMENT for an unknown id; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_state_get(
    state: *const AerostrataState,
    quantity_id: u32,
    out: *mut f64,
) -> AerostrataStatus {
    record_get("state", state, quantity_id, out, "an atmosphere state", |s, q| {
        (s.get(q), s.geometric_altitude_m)
    })
}

/// The value of quantity `quantity` in `*point` (in its SI unit), written to `*out`.
///
/// Errors: UNDEFINED where the sample does not define it (Mach above 86 km, a drag
/// without a vehicle); NOT_CARRIED for a quantity a flight sample does not carry;
/// INVALID_ARGUMENT for an unknown id; NULL_POINTER. Thread-safe.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_flight_point_get(
    point: *const AerostrataFlightPoint,
    quantity_id: u32,
    out: *mut f64,
) -> AerostrataStatus {
    record_get("point", point, quantity_id, out, "a flight point", |p, q| (p.get(q), p.altitude_m))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The generated texts are the core catalogue's, and each CSV column reads back as its
    /// quantity in its unit.
    #[test]
    fn generated_texts_match_the_core_catalogue() {
        assert_eq!(TEXTS.len(), Quantity::ALL.len());
        for q in Quantity::ALL {
            let i = q.info();
            let texts: Vec<&str> = TEXTS[i.id as usize].iter().map(|t| t.to_str().unwrap()).collect();
            assert_eq!(texts[..6], [i.name, i.symbol, i.label, i.description, i.si.symbol(), i.us.symbol()]);
            for (column, unit) in texts[6..].iter().zip([i.si, i.us]) {
                let read = Quantity::from_column(column).unwrap();
                assert_eq!((read.quantity, read.unit.unwrap_or(unit)), (*q, unit), "{column}");
            }
        }
    }
}
