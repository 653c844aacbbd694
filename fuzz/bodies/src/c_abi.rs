//! The C library's entry points (`aerostrata-c`, linked as an rlib) driven by arbitrary
//! bytes: each step picks a call (model constructors with parameters and tables, the
//! spreadsheet functions with spec strings, states one at a time and in batches, drag
//! curves, winds, flight scans and their exceedances and plateaus, frees) and its arguments. Pointers
//! are always valid or NULL (a dangling pointer is the caller's undefined behaviour, not
//! something the library can detect); lengths always match the arrays. Every status is
//! checked: OK with finite outputs, or an error status whose detail message is
//! NUL-terminated, short and readable; never PANIC, never a crash.

use core::ffi::CStr;
use core::mem::MaybeUninit;
use core::ptr::{null, null_mut};
use std::ffi::CString;

use aerostrata_c::*;

use crate::{checked_text, finite, Bytes};

/// The most calls one input makes, and the longest table or batch it builds, so that one
/// input stays fast.
const MAX_STEPS: usize = 64;
const MAX_ROWS: usize = 24;

/// The target's body.
pub fn run(data: &[u8]) {
    let mut bytes = Bytes::new(data);
    let mut world = World::default();
    for _ in 0..MAX_STEPS {
        if bytes.is_empty() {
            break;
        }
        world.step(&mut bytes);
    }
    world.free_all();
}

#[derive(Default)]
struct World {
    models: Vec<*mut AerostrataModel>,
    curves: Vec<*mut AerostrataDragCurve>,
    winds: Vec<*mut AerostrataWindProfile>,
    points: Vec<AerostrataFlightPoint>,
}

fn zeroed<T>() -> T {
    // SAFETY: only used for the library's `#[repr(C)]` records of doubles and integers,
    // for which all-zero bits are a value.
    unsafe { MaybeUninit::zeroed().assume_init() }
}

/// Checks a status: OK, or an error whose detail reads well. Returns whether it was OK.
fn status(call: &str, status: AerostrataStatus) -> bool {
    assert!(status != AerostrataStatus::Panic, "{call} panicked (caught at the boundary)");
    // SAFETY: the library returns a static NUL-terminated string for every status.
    let text = unsafe { CStr::from_ptr(aerostrata_status_message(status as i32)) };
    checked_text(text.to_str().expect("status messages are UTF-8"));
    if status == AerostrataStatus::Ok {
        return true;
    }
    let mut detail: AerostrataErrorDetail = zeroed();
    // SAFETY: a valid pointer to a record of the right type.
    assert_eq!(unsafe { aerostrata_last_error(&mut detail) }, AerostrataStatus::Ok, "{call}: last_error");
    assert!(
        detail.status == status,
        "{call}: the detail's status {:?} is not the call's {status:?}",
        detail.status
    );
    let bytes: Vec<u8> = detail.message.iter().map(|&c| c as u8).collect();
    let end = bytes.iter().position(|&b| b == 0).expect("the detail's message is NUL-terminated");
    let text = core::str::from_utf8(&bytes[..end]).expect("the detail's message is UTF-8");
    checked_text(text);
    false
}

/// Reads every quantity of a state through the library's accessor: OK and finite, or
/// an error status.
fn check_state(state: &AerostrataState) {
    for id in 0..aerostrata_quantity_count() + 2 {
        let mut value = f64::NAN;
        // SAFETY: valid pointers.
        if status("aerostrata_state_get", unsafe { aerostrata_state_get(state, id, &mut value) }) {
            finite("a state's quantity", value);
        }
    }
}

fn check_point(point: &AerostrataFlightPoint) {
    for id in 0..aerostrata_quantity_count() + 2 {
        let mut value = f64::NAN;
        // SAFETY: valid pointers.
        if status("aerostrata_flight_point_get", unsafe {
            aerostrata_flight_point_get(point, id, &mut value)
        }) {
            finite("a flight point's quantity", value);
        }
    }
}

/// A record's numbers may be NaN where the header documents it (an unset group of a
/// summary), never infinite.
fn no_infinity(what: &str, record: &impl core::fmt::Debug) {
    let shown = format!("{record:?}");
    let bad = shown.split(|c: char| !(c.is_ascii_alphanumeric() || c == '_')).any(|w| w == "inf");
    assert!(!bad, "{what} has an infinite number: {shown}");
}

impl World {
    fn pick<T: Copy>(list: &[T], bytes: &mut Bytes<'_>, none: T) -> T {
        // One choice in eight is NULL, the rest one of the live handles.
        let choice = bytes.below(8 * list.len().max(1));
        if list.is_empty() || choice % 8 == 7 {
            none
        } else {
            list[choice % list.len()]
        }
    }

    fn model(&self, bytes: &mut Bytes<'_>) -> *const AerostrataModel {
        Self::pick(&self.models, bytes, null_mut()).cast_const()
    }

    fn keep_model(&mut self, ok: bool, model: *mut AerostrataModel) {
        if ok {
            assert!(!model.is_null(), "OK without a model");
            self.models.push(model);
        }
    }

    fn step(&mut self, bytes: &mut Bytes<'_>) {
        let mut model_out: *mut AerostrataModel = null_mut();
        match bytes.below(20) {
            0 => {
                let offset = bytes.f64();
                // SAFETY: a valid out pointer; likewise below.
                let ok = status("model_new_us1976", unsafe {
                    aerostrata_model_new_us1976(offset, &mut model_out)
                });
                self.keep_model(ok, model_out);
            }
            1 => {
                let (offset, p0) = (bytes.f64(), bytes.f64());
                let s = unsafe { aerostrata_model_new_hydrostatic_offset(offset, p0, &mut model_out) };
                let ok = status("model_new_hydrostatic_offset", s);
                self.keep_model(ok, model_out);
            }
            2 => {
                let (rho, h, t) = (bytes.f64(), bytes.f64(), bytes.f64());
                let s = unsafe { aerostrata_model_new_exponential(rho, h, t, &mut model_out) };
                let ok = status("model_new_exponential", s);
                self.keep_model(ok, model_out);
            }
            3 => {
                let (t, p0) = (bytes.f64(), bytes.f64());
                let s = unsafe { aerostrata_model_new_isothermal(t, p0, &mut model_out) };
                let ok = status("model_new_isothermal", s);
                self.keep_model(ok, model_out);
            }
            4 => {
                let (base, t, p) = (bytes.f64(), bytes.f64(), bytes.f64());
                let count = bytes.below(9);
                let layers: Vec<AerostrataLayerSpec> = (0..count)
                    .map(|_| AerostrataLayerSpec {
                        top_geopotential_m: bytes.f64(),
                        lapse_rate_k_m: bytes.f64(),
                    })
                    .collect();
                let s = unsafe {
                    aerostrata_model_new_layers(base, t, p, layers.as_ptr(), count, &mut model_out)
                };
                let ok = status("model_new_layers", s);
                self.keep_model(ok, model_out);
            }
            5 => {
                let kind = u32::from(bytes.byte() % 3);
                let count = bytes.below(MAX_ROWS);
                let rows: Vec<AerostrataSoundingRow> = (0..count)
                    .map(|_| AerostrataSoundingRow {
                        altitude_m: bytes.f64(),
                        temperature_k: bytes.f64(),
                        pressure_pa: bytes.f64(),
                        density_kg_m3: bytes.f64(),
                        dew_point_k: bytes.f64(),
                        relative_humidity_percent: bytes.f64(),
                        fields: u32::from(bytes.byte() % 32),
                    })
                    .collect();
                let s = unsafe { aerostrata_model_new_sounding(kind, rows.as_ptr(), count, &mut model_out) };
                let ok = status("model_new_sounding", s);
                self.keep_model(ok, model_out);
            }
            6 => {
                let model = self.model(bytes);
                let (altitude, kind) = (bytes.f64(), u32::from(bytes.byte() % 3));
                let mut state: AerostrataState = zeroed();
                if status("model_state", unsafe { aerostrata_model_state(model, altitude, kind, &mut state) })
                {
                    check_state(&state);
                }
            }
            7 => {
                let model = self.model(bytes);
                let count = bytes.below(MAX_ROWS);
                let altitudes: Vec<f64> = (0..count).map(|_| bytes.f64()).collect();
                let kind = u32::from(bytes.byte() % 3);
                let mut states: Vec<AerostrataState> = (0..count).map(|_| zeroed()).collect();
                let s = unsafe {
                    aerostrata_model_states(model, altitudes.as_ptr(), count, kind, states.as_mut_ptr())
                };
                if status("model_states", s) {
                    states.iter().for_each(check_state);
                }
                let (mut t, mut p, mut r) = (vec![0.0; count], vec![0.0; count], vec![0.0; count]);
                let s = unsafe {
                    aerostrata_model_columns(
                        model,
                        altitudes.as_ptr(),
                        count,
                        kind,
                        t.as_mut_ptr(),
                        p.as_mut_ptr(),
                        r.as_mut_ptr(),
                    )
                };
                if status("model_columns", s) {
                    t.iter().chain(&p).chain(&r).for_each(|&v| finite("a column value", v));
                }
            }
            8 => {
                if !self.models.is_empty() {
                    let model = self.models.swap_remove(bytes.below(self.models.len()));
                    unsafe { aerostrata_model_free(model) };
                } else {
                    unsafe { aerostrata_model_free(null_mut()) };
                }
            }
            9 => {
                let spec = CString::new(bytes.str().replace('\0', "")).expect("no NUL left");
                let spec_ptr = if bytes.byte() & 7 == 0 { null() } else { spec.as_ptr() };
                let (id, altitude) = (u32::from(bytes.byte()), bytes.f64());
                let values = unsafe {
                    [
                        aerostrata_xl_state(id, altitude, spec_ptr),
                        aerostrata_xl_model_valid(spec_ptr),
                        aerostrata_xl_mach_at(altitude, bytes.f64(), spec_ptr),
                        aerostrata_xl_dynamic_pressure_at(altitude, bytes.f64(), spec_ptr),
                        aerostrata_xl_drag(altitude, bytes.f64(), bytes.f64(), bytes.f64(), spec_ptr),
                    ]
                };
                for value in values {
                    // The spreadsheet functions' one error value is NaN; never infinity.
                    assert!(!value.is_infinite(), "a spreadsheet function gave {value} for {spec:?}");
                }
            }
            10 => {
                let mut curve: *mut AerostrataDragCurve = null_mut();
                let ok = if bytes.byte() & 1 == 0 {
                    let cd = bytes.f64();
                    status("drag_curve_new_constant", unsafe {
                        aerostrata_drag_curve_new_constant(cd, &mut curve)
                    })
                } else {
                    let count = bytes.below(MAX_ROWS);
                    let mach: Vec<f64> = (0..count).map(|_| bytes.f64()).collect();
                    let cd: Vec<f64> = (0..count).map(|_| bytes.f64()).collect();
                    let interpolation = u32::from(bytes.byte() % 4);
                    let s = unsafe {
                        aerostrata_drag_curve_new_table(
                            mach.as_ptr(),
                            cd.as_ptr(),
                            count,
                            interpolation,
                            &mut curve,
                        )
                    };
                    status("drag_curve_new_table", s)
                };
                if ok {
                    assert!(!curve.is_null(), "OK without a drag curve");
                    self.curves.push(curve);
                    let mut cd = f64::NAN;
                    if status("drag_curve_cd", unsafe {
                        aerostrata_drag_curve_cd(curve, bytes.f64(), &mut cd)
                    }) {
                        finite("a drag coefficient", cd);
                    }
                }
            }
            11 => {
                let count = bytes.below(MAX_ROWS);
                let columns: Vec<Vec<f64>> =
                    (0..3).map(|_| (0..count).map(|_| bytes.f64()).collect()).collect();
                let mut profile: *mut AerostrataWindProfile = null_mut();
                let (a, b, c) = (columns[0].as_ptr(), columns[1].as_ptr(), columns[2].as_ptr());
                let ok = if bytes.byte() & 1 == 0 {
                    status("wind_profile_new", unsafe {
                        aerostrata_wind_profile_new(a, b, c, count, &mut profile)
                    })
                } else {
                    let s =
                        unsafe { aerostrata_wind_profile_new_speed_direction(a, b, c, count, &mut profile) };
                    status("wind_profile_new_speed_direction", s)
                };
                if ok {
                    assert!(!profile.is_null(), "OK without a wind profile");
                    self.winds.push(profile);
                    let mut wind: AerostrataWind = zeroed();
                    if status("wind_profile_at", unsafe {
                        aerostrata_wind_profile_at(profile, bytes.f64(), &mut wind)
                    }) {
                        for v in [wind.east_m_s, wind.north_m_s, wind.speed_m_s, wind.direction_deg] {
                            finite("a wind", v);
                        }
                    }
                }
            }
            12 | 13 => self.scan(bytes),
            14 => {
                let count = self.points.len();
                let id = u32::from(bytes.byte());
                let limit = bytes.f64();
                let capacity = bytes.below(8);
                let mut out: Vec<AerostrataExceedance> = (0..capacity).map(|_| zeroed()).collect();
                let mut found = 0usize;
                let s = unsafe {
                    aerostrata_flight_exceedances(
                        self.points.as_ptr(),
                        count,
                        id,
                        limit,
                        out.as_mut_ptr(),
                        capacity,
                        &mut found,
                    )
                };
                if status("flight_exceedances", s) {
                    for e in out.iter().take(found.min(capacity)) {
                        finite("an exceedance's peak", e.peak);
                        no_infinity("an exceedance", e);
                    }
                }
                let (maximum, fraction) = (bytes.f64(), bytes.f64());
                let mut plateau: AerostrataPlateau = zeroed();
                let mut has = 0u32;
                let s = unsafe {
                    aerostrata_flight_plateau(
                        self.points.as_ptr(),
                        count,
                        id,
                        maximum,
                        fraction,
                        &mut plateau,
                        &mut has,
                    )
                };
                if status("flight_plateau", s) && has == 1 {
                    for v in [plateau.start_time_s, plateau.end_time_s, plateau.maximum, plateau.fraction] {
                        finite("a plateau", v);
                    }
                }
            }
            15 => {
                let (altitude, kind, offset) = (bytes.f64(), u32::from(bytes.byte() % 3), bytes.f64());
                let mut state: AerostrataState = zeroed();
                if status("us1976_state", unsafe {
                    aerostrata_us1976_state(altitude, kind, offset, &mut state)
                }) {
                    check_state(&state);
                }
                let mut species: AerostrataSpecies = zeroed();
                if status("us1976_species", unsafe {
                    aerostrata_us1976_species(altitude, kind, &mut species)
                }) {
                    no_infinity("the species", &species);
                }
            }
            16 => {
                let count = bytes.below(MAX_ROWS);
                let altitudes: Vec<f64> = (0..count).map(|_| bytes.f64()).collect();
                let (kind, offset) = (u32::from(bytes.byte() % 3), bytes.f64());
                let mut states: Vec<AerostrataState> = (0..count).map(|_| zeroed()).collect();
                let s = unsafe {
                    aerostrata_us1976_states(altitudes.as_ptr(), count, kind, offset, states.as_mut_ptr())
                };
                if status("us1976_states", s) {
                    states.iter().for_each(check_state);
                }
            }
            17 => {
                let model = self.model(bytes);
                let curve = Self::pick(&self.curves, bytes, null_mut());
                let (altitude, kind, mass, area) =
                    (bytes.f64(), u32::from(bytes.byte() % 3), bytes.f64(), bytes.f64());
                let mut v = f64::NAN;
                let s = unsafe {
                    aerostrata_terminal_velocity_m_s(model, altitude, kind, mass, area, curve, &mut v)
                };
                if status("terminal_velocity_m_s", s) {
                    finite("a terminal velocity", v);
                }
            }
            18 => {
                let model = self.model(bytes);
                let (mut min, mut max) = (f64::NAN, f64::NAN);
                if status("model_range_geometric_m", unsafe {
                    aerostrata_model_range_geometric_m(model, &mut min, &mut max)
                }) {
                    finite("a range's bottom", min);
                    finite("a range's top", max);
                }
            }
            _ => {
                if !self.curves.is_empty() {
                    let curve = self.curves.swap_remove(bytes.below(self.curves.len()));
                    unsafe { aerostrata_drag_curve_free(curve) };
                }
                if !self.winds.is_empty() && bytes.byte() & 1 == 0 {
                    let profile = self.winds.swap_remove(bytes.below(self.winds.len()));
                    unsafe { aerostrata_wind_profile_free(profile) };
                }
            }
        }
    }

    /// A flight scan, scalar or with velocity components, its points kept for
    /// `flight_exceedances`.
    fn scan(&mut self, bytes: &mut Bytes<'_>) {
        let model = self.model(bytes);
        let drag = Self::pick(&self.curves, bytes, null_mut());
        let (area, length) = (bytes.f64(), bytes.f64());
        let count = bytes.below(MAX_ROWS);
        let vector = bytes.byte() % 2 == 1;
        let columns: Vec<Vec<f64>> =
            (0..if vector { 7 } else { 3 }).map(|_| (0..count).map(|_| bytes.f64()).collect()).collect();
        let mut points: Vec<AerostrataFlightPoint> = (0..count).map(|_| zeroed()).collect();
        let mut summary: AerostrataFlightSummary = zeroed();
        assert_eq!(aerostrata_flight_summary_size(), core::mem::size_of::<AerostrataFlightSummary>());
        let column = |i: usize| columns[i].as_ptr();
        let s = if vector {
            let winds = Self::pick(&self.winds, bytes, null_mut());
            let layer = u32::from(bytes.byte() % 4);
            let axis = |i: usize| if bytes_flag(&columns[i]) { column(i) } else { null() };
            unsafe {
                aerostrata_flight_scan_vector(
                    model,
                    drag,
                    area,
                    length,
                    winds,
                    layer,
                    column(0),
                    column(1),
                    column(2),
                    column(3),
                    column(4),
                    axis(5),
                    axis(6),
                    count,
                    points.as_mut_ptr(),
                    &mut summary,
                )
            }
        } else {
            unsafe {
                aerostrata_flight_scan(
                    model,
                    drag,
                    area,
                    length,
                    column(0),
                    column(1),
                    column(2),
                    count,
                    points.as_mut_ptr(),
                    &mut summary,
                )
            }
        };
        if status(if vector { "flight_scan_vector" } else { "flight_scan" }, s) {
            points.iter().for_each(check_point);
            no_infinity("a flight summary", &summary);
            self.points = points;
        }
    }

    fn free_all(&mut self) {
        for model in self.models.drain(..) {
            unsafe { aerostrata_model_free(model) };
        }
        for curve in self.curves.drain(..) {
            unsafe { aerostrata_drag_curve_free(curve) };
        }
        for profile in self.winds.drain(..) {
            unsafe { aerostrata_wind_profile_free(profile) };
        }
    }
}

/// Whether an optional column is given: by the sign bit of its first value, so that the
/// choice comes from the input without another byte.
fn bytes_flag(column: &[f64]) -> bool {
    column.first().is_some_and(|v| v.is_sign_negative())
}
