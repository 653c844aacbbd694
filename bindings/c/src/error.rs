//! Status codes, the per-thread error detail and the panic boundary.
//!
//! Why a thread-local for the detail: an out-parameter on every function would double
//! the length of every signature for a value most callers never read, while one global
//! "last error" would be overwritten by other threads. A thread-local slot is written by
//! each status-returning call on the calling thread only, so threads never see each
//! other's failures and no signature grows.
//!
//! Without `std` (the bare-metal build) there are no threads to speak of and no
//! unwinding: the detail lives in one static slot behind a try-lock (a call from an
//! interrupt handler that lands while the main loop is writing it skips the write rather
//! than wait), and the panic boundary is inert because panics abort there.

use alloc::format;
use alloc::string::{String, ToString};
use core::ffi::{c_char, c_int};

use aerostrata_core::Error;

/// The result of every status-returning function. The numbers are stable: a number is
/// never reused for another meaning, new statuses get new numbers, and C code may store
/// and compare them. 0 is success.
#[repr(C)]
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum AerostrataStatus {
    /// Success; the outputs were written.
    Ok = 0,
    /// A panic inside the library was caught at the boundary (a bug in aerostrata; please
    /// report it with the message of `aerostrata_last_error`). Nothing was written.
    Panic = 1,
    /// A required pointer argument was NULL.
    NullPointer = 2,
    /// An argument was not one of the values the function accepts (an unknown altitude
    /// kind, airspeed kind or interpolation, or arrays too large for memory).
    InvalidArgument = 3,
    /// An input was NaN or infinite.
    NotFinite = 4,
    /// A finite input with a unit lay outside the allowed range (`min` to `max`).
    OutOfRange = 5,
    /// An input that must be above 0 was not.
    NotPositive = 6,
    /// A layer of a user layer model is inconsistent (`index` names it).
    InvalidLayer = 7,
    /// The quantity is not defined by the model at this altitude (the continuum
    /// properties above 86 km).
    Undefined = 8,
    /// A dimensionless input (Mach number, ratio, gamma) lay outside the allowed range.
    RatioOutOfRange = 9,
    /// A dimensionless input that must be above 0 (a drag coefficient) was not.
    RatioNotPositive = 10,
    /// A point of a drag table or a flight sample is invalid (`index` names it), or the
    /// table is too short.
    InvalidPoint = 11,
    /// An iterative solver did not converge.
    NoConvergence = 12,
    /// A sounding has fewer than 2 rows.
    TooFewRows = 13,
    /// A value of a sounding row is NaN or infinite (`index` names the row).
    RowNotFinite = 14,
    /// The altitudes of a sounding do not increase strictly.
    AltitudeNotIncreasing = 15,
    /// A sounding row has a temperature at or below 0 K.
    RowTemperatureNotPositive = 16,
    /// A sounding row has a pressure or density at or below 0.
    RowNotPositive = 17,
    /// The pressures of a sounding do not fall with altitude.
    PressureNotDecreasing = 18,
    /// A sounding row's relative humidity lies outside 0 to 100 %.
    RelativeHumidityOutOfRange = 19,
    /// A sounding row's dew point is above its temperature.
    DewPointAboveTemperature = 20,
    /// A finite value of a sounding row lies outside the allowed range.
    RowOutOfRange = 21,
    /// A sounding row gives the wrong set of quantities (mixes pressure and density, or
    /// gives both a dew point and a relative humidity).
    RowColumns = 22,
    /// Two sounding rows' pressures are far from hydrostatic balance.
    NotHydrostatic = 23,
    /// A sounding row's vapour pressure is not below its pressure.
    VapourPressureTooHigh = 24,
    /// Storage given to the core was too small (not reachable through this C API, which
    /// allocates its own storage; kept so that every error of the core has a status).
    StorageTooSmall = 25,
    /// An error of the core newer than this library's table of statuses; the message of
    /// `aerostrata_last_error` describes it.
    OtherError = 26,
    /// A quantity was asked of a result that does not carry it (a Mach number of a
    /// state).
    NotCarried = 27,
    /// A handle argument was not a live handle of its type: freed already (used after
    /// `_free`, or freed twice), a handle of another type (a drag curve passed as a
    /// model), or not a handle at all. The message says which. Only misuse that the
    /// library can see is reported; docs/c-guide.md says what it cannot see.
    InvalidHandle = 28,
}

/// Length of [`AerostrataErrorDetail::message`], bytes, the terminating NUL included.
pub const AEROSTRATA_MESSAGE_CAPACITY: usize = 256;

/// The detail of the most recent status-returning call on the calling thread.
///
/// `value`, `min` and `max` are NaN when the failure has no such number, `index` is -1
/// when it names no layer, row or point. `message` is a NUL-terminated UTF-8 sentence
/// that names the bad input and the allowed range (truncated at a character boundary to
/// fit). After a success, `status` is `AEROSTRATA_STATUS_OK` and `message` is empty.
#[repr(C)]
#[derive(Debug, Clone, Copy)]
pub struct AerostrataErrorDetail {
    /// The status the call returned.
    pub status: AerostrataStatus,
    /// The offending value, or NaN.
    pub value: f64,
    /// The lowest allowed value, or NaN.
    pub min: f64,
    /// The highest allowed value, or NaN.
    pub max: f64,
    /// The layer, row, point or element index (from 0) the failure names, or -1.
    pub index: i64,
    /// The message, NUL-terminated.
    pub message: [c_char; AEROSTRATA_MESSAGE_CAPACITY],
}

impl AerostrataErrorDetail {
    pub(crate) const fn ok() -> Self {
        Self {
            status: AerostrataStatus::Ok,
            value: f64::NAN,
            min: f64::NAN,
            max: f64::NAN,
            index: -1,
            message: [0; AEROSTRATA_MESSAGE_CAPACITY],
        }
    }
}

/// A failure on its way to C: the status and its detail (the message not yet truncated).
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Failure {
    pub status: AerostrataStatus,
    pub value: f64,
    pub min: f64,
    pub max: f64,
    pub index: Option<usize>,
    pub message: String,
}

impl Failure {
    pub(crate) fn bare(status: AerostrataStatus, message: String) -> Self {
        Self { status, value: f64::NAN, min: f64::NAN, max: f64::NAN, index: None, message }
    }

    pub fn null(name: &str) -> Self {
        Self::bare(AerostrataStatus::NullPointer, format!("{name} must not be NULL"))
    }

    pub fn invalid_argument(name: &str, problem: &str, value: f64) -> Self {
        Self {
            value,
            ..Self::bare(AerostrataStatus::InvalidArgument, format!("{name}: {problem}, got {value}"))
        }
    }

    /// A name that names nothing the function knows.
    pub fn unknown_name(name: &str, given: &str) -> Self {
        let given = aerostrata_core::units::Quoted(given);
        Self::bare(AerostrataStatus::InvalidArgument, format!("{name}: no quantity is named {given}"))
    }

    /// The same failure, naming element `index` of a batch when the core's error names
    /// no index of its own.
    pub fn at_element(mut self, index: usize) -> Self {
        if self.index.is_none() {
            self.index = Some(index);
            self.message = format!("element {index}: {}", self.message);
        }
        self
    }
}

impl From<Error> for Failure {
    fn from(error: Error) -> Self {
        use AerostrataStatus as S;
        let message = error.to_string();
        let nan = f64::NAN;
        let (status, value, min, max, index) = match error {
            Error::NotFinite { value, .. } => (S::NotFinite, value, nan, nan, None),
            Error::OutOfRange { value, min, max, .. } => (S::OutOfRange, value, min, max, None),
            Error::NotPositive { value, .. } => (S::NotPositive, value, 0.0, nan, None),
            Error::InvalidLayer { index, value, .. } => (S::InvalidLayer, value, nan, nan, Some(index)),
            Error::Undefined { altitude_m, .. } => (S::Undefined, altitude_m, nan, nan, None),
            Error::RatioOutOfRange { value, min, max, .. } => (S::RatioOutOfRange, value, min, max, None),
            Error::RatioNotPositive { value, .. } => (S::RatioNotPositive, value, 0.0, nan, None),
            Error::InvalidPoint { index, value, .. } => (S::InvalidPoint, value, nan, nan, Some(index)),
            Error::NoConvergence { iterations, .. } => {
                (S::NoConvergence, f64::from(iterations), nan, nan, None)
            }
            Error::TooFewRows { count } => (S::TooFewRows, count as f64, 2.0, nan, None),
            Error::RowNotFinite { row, value, .. } => (S::RowNotFinite, value, nan, nan, Some(row)),
            Error::AltitudeNotIncreasing { row, altitude_m, previous_m, min_spacing_m } => {
                (S::AltitudeNotIncreasing, altitude_m, previous_m + min_spacing_m, nan, Some(row))
            }
            Error::RowTemperatureNotPositive { row, temperature_k } => {
                (S::RowTemperatureNotPositive, temperature_k, 0.0, nan, Some(row))
            }
            Error::RowNotPositive { row, value, .. } => (S::RowNotPositive, value, 0.0, nan, Some(row)),
            Error::PressureNotDecreasing { row, pressure_pa, previous_pa } => {
                (S::PressureNotDecreasing, pressure_pa, nan, previous_pa, Some(row))
            }
            Error::RelativeHumidityOutOfRange { row, percent } => {
                (S::RelativeHumidityOutOfRange, percent, 0.0, 100.0, Some(row))
            }
            Error::DewPointAboveTemperature { row, dew_point_k, temperature_k } => {
                (S::DewPointAboveTemperature, dew_point_k, nan, temperature_k, Some(row))
            }
            Error::RowOutOfRange { row, value, min, max, .. } => {
                (S::RowOutOfRange, value, min, max, Some(row))
            }
            Error::RowColumns { row, .. } => (S::RowColumns, nan, nan, nan, Some(row)),
            Error::NotHydrostatic { row, ratio, min, max } => (S::NotHydrostatic, ratio, min, max, Some(row)),
            Error::VapourPressureTooHigh { row, vapour_pressure_pa, pressure_pa } => {
                (S::VapourPressureTooHigh, vapour_pressure_pa, nan, pressure_pa, Some(row))
            }
            Error::StorageTooSmall { needed, len } => {
                (S::StorageTooSmall, len as f64, needed as f64, nan, None)
            }
            Error::NotCarried { .. } => (S::NotCarried, nan, nan, nan, None),
            _ => (S::OtherError, nan, nan, nan, None),
        };
        Self { status, value, min, max, index, message }
    }
}

fn record(failure: Option<&Failure>) {
    let mut detail = AerostrataErrorDetail::ok();
    if let Some(f) = failure {
        detail.status = f.status;
        detail.value = f.value;
        detail.min = f.min;
        detail.max = f.max;
        detail.index = f.index.and_then(|i| i64::try_from(i).ok()).unwrap_or(-1);
        // Truncate at a character boundary, leaving room for the NUL.
        let mut end = f.message.len().min(AEROSTRATA_MESSAGE_CAPACITY - 1);
        while !f.message.is_char_boundary(end) {
            end -= 1;
        }
        for (slot, byte) in detail.message.iter_mut().zip(f.message.as_bytes()[..end].iter()) {
            *slot = *byte as c_char;
        }
    }
    slot::store(detail);
}

#[cfg(feature = "std")]
use thread_slot as slot;

#[cfg(not(feature = "std"))]
use static_slot as slot;

/// Where the detail lives: one slot per thread with `std`.
#[cfg(feature = "std")]
mod thread_slot {
    use super::AerostrataErrorDetail;
    use std::cell::RefCell;

    thread_local! {
        static LAST: RefCell<AerostrataErrorDetail> = const { RefCell::new(AerostrataErrorDetail::ok()) };
    }

    pub fn store(detail: AerostrataErrorDetail) {
        // `try_with`: during thread teardown the slot may be gone; the status still reaches C.
        let _ = LAST.try_with(|last| {
            if let Ok(mut last) = last.try_borrow_mut() {
                *last = detail;
            }
        });
    }

    pub fn load() -> AerostrataErrorDetail {
        LAST.try_with(|last| last.try_borrow().map(|d| *d).unwrap_or(AerostrataErrorDetail::ok()))
            .unwrap_or(AerostrataErrorDetail::ok())
    }
}

/// Where the detail lives: one static slot without `std` (bare metal: one core, no
/// threads). A try-lock guards it: whoever finds it busy (an interrupt handler that
/// interrupted a store) skips its store, or reads "no detail", instead of spinning on a
/// lock its own interruptee holds.
#[cfg(any(not(feature = "std"), test))]
mod static_slot {
    use super::AerostrataErrorDetail;
    use core::cell::UnsafeCell;
    use core::sync::atomic::{AtomicBool, Ordering};

    struct Slot {
        busy: AtomicBool,
        detail: UnsafeCell<AerostrataErrorDetail>,
    }

    // SAFETY: `detail` is only touched by whoever set `busy` from false to true.
    unsafe impl Sync for Slot {}

    static LAST: Slot =
        Slot { busy: AtomicBool::new(false), detail: UnsafeCell::new(AerostrataErrorDetail::ok()) };

    pub(super) fn with<R>(f: impl FnOnce(&mut AerostrataErrorDetail) -> R) -> Option<R> {
        LAST.busy.compare_exchange(false, true, Ordering::Acquire, Ordering::Relaxed).ok()?;
        // SAFETY: the successful exchange above gives exclusive access until the release.
        let result = f(unsafe { &mut *LAST.detail.get() });
        LAST.busy.store(false, Ordering::Release);
        Some(result)
    }

    pub fn store(detail: AerostrataErrorDetail) {
        let _ = with(|last| *last = detail);
    }

    pub fn load() -> AerostrataErrorDetail {
        with(|last| *last).unwrap_or(AerostrataErrorDetail::ok())
    }
}

/// Runs `f`; with `std`, a panic inside it is caught and returned as its message. Without
/// `std` panics abort (the firmware's panic handler runs), so this only calls `f`.
pub(crate) fn catch<R>(f: impl FnOnce() -> R) -> Result<R, String> {
    #[cfg(feature = "std")]
    {
        std::panic::catch_unwind(std::panic::AssertUnwindSafe(f)).map_err(|payload| {
            payload
                .downcast_ref::<&str>()
                .map(|s| (*s).into())
                .or_else(|| payload.downcast_ref::<String>().cloned())
                .unwrap_or_else(|| "a panic without a message".into())
        })
    }
    #[cfg(not(feature = "std"))]
    {
        Ok(f())
    }
}

/// `Ok(())` if `pointer` is not NULL, else a NULL-pointer failure naming it.
pub(crate) fn require<T>(name: &str, pointer: *const T) -> Result<(), Failure> {
    if pointer.is_null() {
        Err(Failure::null(name))
    } else {
        Ok(())
    }
}

/// Runs `body` inside the panic boundary, records its detail for this thread and returns
/// its status.
pub(crate) fn guard(body: impl FnOnce() -> Result<(), Failure>) -> AerostrataStatus {
    let status = guard_failures(body);
    if status == AerostrataStatus::Ok {
        record(None);
    }
    status
}

/// As [`guard`], but a success leaves the thread's detail as it was: the `_free`
/// functions, which cleanup code calls between a failure and the reading of its detail.
pub(crate) fn guard_failures(body: impl FnOnce() -> Result<(), Failure>) -> AerostrataStatus {
    let outcome = catch(body).unwrap_or_else(|text| {
        Err(Failure::bare(AerostrataStatus::Panic, format!("internal error (a bug in aerostrata): {text}")))
    });
    match outcome {
        Ok(()) => AerostrataStatus::Ok,
        Err(failure) => {
            record(Some(&failure));
            failure.status
        }
    }
}

/// A static, NUL-terminated English sentence for `status` (an `AerostrataStatus` value
/// given as an int, so that any number is safe to pass); an unknown number gives
/// "unknown status". Never NULL.
///
/// Ownership: static; never free it. Thread-safe.
#[no_mangle]
pub extern "C" fn aerostrata_status_message(status: c_int) -> *const c_char {
    let text: &'static str = catch(|| status_text(status)).unwrap_or("unknown status\0");
    text.as_ptr().cast()
}

fn status_text(status: c_int) -> &'static str {
    match status {
        0 => "success\0",
        1 => "internal error: a panic was caught at the library boundary\0",
        2 => "a required pointer argument was NULL\0",
        3 => "an argument is not one of the accepted values\0",
        4 => "an input was NaN or infinite\0",
        5 => "an input lies outside the allowed range\0",
        6 => "an input must be greater than zero\0",
        7 => "a layer of the layer model is inconsistent\0",
        8 => "the quantity is not defined by the model at this altitude\0",
        9 => "a dimensionless input lies outside the allowed range\0",
        10 => "a dimensionless input must be greater than zero\0",
        11 => "a point of a table or series is invalid\0",
        12 => "an iterative solver did not converge\0",
        13 => "a table needs at least 2 rows\0",
        14 => "a value of a table row was NaN or infinite\0",
        15 => "the altitudes of a table must increase strictly\0",
        16 => "a table row's temperature must be above 0 K\0",
        17 => "a table row's pressure or density must be greater than zero\0",
        18 => "the pressures of a table must fall with altitude\0",
        19 => "a table row's relative humidity lies outside 0 to 100 %\0",
        20 => "a table row's dew point is above its temperature\0",
        21 => "a value of a table row lies outside the allowed range\0",
        22 => "a table row gives the wrong set of quantities\0",
        23 => "the pressures of two table rows are far from hydrostatic balance\0",
        24 => "a table row's vapour pressure is not below its pressure\0",
        25 => "the storage given is too small\0",
        26 => "an error this version of the library has no status for\0",
        27 => "the result does not carry that quantity\0",
        28 => "a handle was freed already, is of another type, or is not a handle\0",
        _ => "unknown status\0",
    }
}

/// Copies the detail of the most recent status-returning call made on the calling
/// thread into `*out` (this call itself does not change it). Returns
/// `AEROSTRATA_STATUS_NULL_POINTER` if `out` is NULL, else `AEROSTRATA_STATUS_OK`.
///
/// Thread-safety: each thread has its own detail; a call on one thread never changes
/// another thread's. The spreadsheet functions (`aerostrata_xl_*`) do not set it, and the
/// `_free` functions set it only when they fail (so that cleanup between a failed call
/// and the reading of its detail keeps the detail). In the
/// bare-metal build (no std) there is one detail for the whole program, and a call made
/// from an interrupt handler while another call is storing its detail leaves no detail.
#[no_mangle]
pub unsafe extern "C" fn aerostrata_last_error(out: *mut AerostrataErrorDetail) -> AerostrataStatus {
    if out.is_null() {
        return AerostrataStatus::NullPointer;
    }
    let copied = catch(slot::load);
    match copied {
        Ok(detail) => {
            crate::write(out, detail);
            AerostrataStatus::Ok
        }
        Err(_) => AerostrataStatus::Panic,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use alloc::vec::Vec;

    fn last() -> AerostrataErrorDetail {
        let mut d = AerostrataErrorDetail::ok();
        // SAFETY: `d` is a valid, writable detail.
        assert_eq!(unsafe { aerostrata_last_error(&mut d) }, AerostrataStatus::Ok);
        d
    }

    fn message(d: &AerostrataErrorDetail) -> String {
        let bytes: Vec<u8> = d.message.iter().take_while(|&&c| c != 0).map(|&c| c as u8).collect();
        String::from_utf8(bytes).unwrap()
    }

    #[test]
    fn a_panic_becomes_the_panic_status_with_its_message() {
        let status = guard(|| panic!("deliberate test panic"));
        assert_eq!(status, AerostrataStatus::Panic);
        let d = last();
        assert_eq!(d.status, AerostrataStatus::Panic);
        assert!(message(&d).contains("deliberate test panic"), "{}", message(&d));
    }

    #[test]
    fn success_clears_the_detail() {
        assert_eq!(guard(|| Err(Failure::null("out"))), AerostrataStatus::NullPointer);
        assert_eq!(message(&last()), "out must not be NULL");
        assert_eq!(guard(|| Ok(())), AerostrataStatus::Ok);
        let d = last();
        assert_eq!(d.status, AerostrataStatus::Ok);
        assert_eq!(d.message[0], 0);
        assert_eq!(d.index, -1);
    }

    #[test]
    fn long_messages_are_cut_at_a_character_boundary() {
        let long = "é".repeat(400);
        let _ = guard(|| Err(Failure::invalid_argument(&long, "x", 1.0)));
        let text = message(&last());
        assert!(text.len() < AEROSTRATA_MESSAGE_CAPACITY && text.len() >= AEROSTRATA_MESSAGE_CAPACITY - 3);
        assert!(text.chars().all(|c| c == 'é'));
    }

    #[test]
    fn every_status_has_its_own_message() {
        let mut seen = std::collections::HashSet::new();
        for s in 0..=28 {
            assert!(seen.insert(status_text(s)), "status {s} repeats a message");
        }
        assert_eq!(status_text(29), "unknown status\0");
        assert_eq!(status_text(-1), "unknown status\0");
    }

    /// The bare-metal slot (tested here on the host, on one thread): a store and a load
    /// while the slot is busy (as in an interrupt handler that lands mid-store) neither
    /// wait nor tear the detail; they skip the store and read "no detail".
    #[test]
    fn the_static_slot_skips_rather_than_waits_when_busy() {
        let mut failed = AerostrataErrorDetail::ok();
        failed.status = AerostrataStatus::OutOfRange;
        failed.index = 3;
        static_slot::store(failed);
        assert_eq!(static_slot::load().status, AerostrataStatus::OutOfRange);
        let inner = static_slot::with(|_| {
            static_slot::store(AerostrataErrorDetail::ok());
            static_slot::load().status
        });
        assert_eq!(inner, Some(AerostrataStatus::Ok), "a busy slot reads as no detail");
        let kept = static_slot::load();
        assert_eq!(
            (kept.status, kept.index),
            (AerostrataStatus::OutOfRange, 3),
            "the busy store was skipped"
        );
    }

    #[test]
    fn the_detail_is_per_thread() {
        let _ = guard(|| Err(Failure::null("here")));
        std::thread::spawn(|| {
            assert_eq!(last().status, AerostrataStatus::Ok);
            let _ = guard(|| Err(Failure::null("there")));
        })
        .join()
        .unwrap();
        assert_eq!(message(&last()), "here must not be NULL");
    }
}
