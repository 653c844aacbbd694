//! aerostrata's C door: thin `extern "C"` wrappers over the core crate, so that C flight
//! software, spreadsheet add-ins and any language with a C foreign-function interface get
//! the same numbers as Rust. No formula lives here: every value comes from the core.
//!
//! The conventions, which every function follows (the header repeats them):
//! - one prefix, `aerostrata_` for functions and `Aerostrata` for types;
//! - a function that can fail returns an [`AerostrataStatus`] (0 is success) and writes its
//!   outputs through pointers **only on success**; every pointer is checked for NULL;
//! - no panic unwinds into C: every export runs inside `catch_unwind` and reports
//!   [`AerostrataStatus::Panic`] (the spreadsheet functions return NaN instead);
//! - the detail of a failure (message, value, allowed range, index) is kept per thread and
//!   read with [`aerostrata_last_error`]; see `error.rs` for why a thread-local;
//! - a handle (model, drag curve, wind profile) carries a type tag and a liveness word
//!   that every call checks, so that a freed handle, a double free or a handle of another
//!   type is [`AerostrataStatus::InvalidHandle`] with a message (`handle.rs`).
//!
//! Features: `std` (default) for the panic boundary and the per-thread detail; without
//! it the crate is `no_std` + `alloc` for bare-metal static libraries, where `malloc`
//! routes the handles' allocations to the C library's `malloc`/`free` and
//! `panic-handler` supplies the `#[panic_handler]` (both for a C firmware, neither when
//! a Rust firmware links this crate and brings its own). `upper` (default) adds the
//! standard above 86 km.

#![cfg_attr(not(feature = "std"), no_std)]
#![warn(missing_docs)]
// Every export checks its pointers for NULL before it dereferences them; the safety
// contract (valid, aligned, `count` elements) is stated in each doc comment instead of a
// `# Safety` section that C readers of the header would not understand.
#![allow(clippy::missing_safety_doc)]

extern crate alloc;

mod aero;
#[cfg(feature = "malloc")]
mod allocator;
mod catalogue;
mod error;
mod flight;
mod handle;
mod loads;
mod model;
mod quantity;
mod spreadsheet;

pub use aero::*;
pub use catalogue::*;
pub use error::*;
pub use flight::*;
pub use loads::*;
pub use model::*;
pub use quantity::*;
pub use spreadsheet::*;

use core::ffi::c_char;

pub(crate) use handle::{free_handle, handle_ref, into_handle, Handle};

#[cfg(feature = "panic-handler")]
#[panic_handler]
fn panic(_: &core::panic::PanicInfo<'_>) -> ! {
    // No input reaches a panic (the tests prove it for every export); should a bug ever
    // get here on bare metal, stop in a way a debugger or watchdog sees.
    loop {
        core::hint::spin_loop();
    }
}

/// The library's version as a NUL-terminated string, for example "0.1.0". It equals
/// `AEROSTRATA_VERSION_STRING` of the header the program was compiled with unless the
/// program was linked against a different build of the shared library.
///
/// Ownership: a static string; never free it. Thread-safe.
#[no_mangle]
pub extern "C" fn aerostrata_version() -> *const c_char {
    concat!(env!("CARGO_PKG_VERSION"), "\0").as_ptr().cast()
}

/// Writes `value` through `out` if it is not NULL; NULL pointers are checked by callers
/// before any work, so this is only the final store of a successful call.
pub(crate) fn write<T>(out: *mut T, value: T) {
    // SAFETY: every caller has checked `out` for NULL first (see `error::require`); its
    // validity and alignment are the caller's contract stated in the header.
    unsafe { out.write(value) }
}

/// Checks `out` for NULL, runs `f` and writes its value to `*out` on success, inside the
/// panic boundary: the shape of every function with one output.
pub(crate) fn output<T>(out: *mut T, f: impl FnOnce() -> Result<T, Failure>) -> AerostrataStatus {
    error::guard(|| {
        error::require("out", out)?;
        let value = f()?;
        write(out, value);
        Ok(())
    })
}

/// Checks `count` elements at `data` before a slice is made over them: NULL is fine
/// only for a zero count, and the byte length must fit the address space.
fn check_elements<T>(name: &'static str, data: *const T, count: usize) -> Result<(), Failure> {
    error::require(name, data)?;
    if count > isize::MAX as usize / core::mem::size_of::<T>().max(1) {
        return Err(Failure::invalid_argument(
            name,
            "the element count is too large for memory",
            count as f64,
        ));
    }
    Ok(())
}

/// A slice over `count` elements at `data`, or NULL-pointer status. A zero count accepts
/// any pointer, NULL included (there is nothing to read).
pub(crate) fn slice<'a, T>(name: &'static str, data: *const T, count: usize) -> Result<&'a [T], Failure> {
    if count == 0 {
        return Ok(&[]);
    }
    check_elements(name, data, count)?;
    // SAFETY: non-NULL (checked above), and the caller promises `count` valid elements.
    Ok(unsafe { core::slice::from_raw_parts(data, count) })
}

/// A mutable slice over `count` elements at `data` (see [`slice`]).
pub(crate) fn slice_mut<'a, T>(
    name: &'static str,
    data: *mut T,
    count: usize,
) -> Result<&'a mut [T], Failure> {
    if count == 0 {
        return Ok(&mut []);
    }
    check_elements(name, data.cast_const(), count)?;
    // SAFETY: non-NULL (checked above), and the caller promises `count` writable elements
    // that nothing else reads or writes during the call.
    Ok(unsafe { core::slice::from_raw_parts_mut(data, count) })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn version_is_the_crate_version() {
        // SAFETY: aerostrata_version returns a static NUL-terminated string.
        let v = unsafe { core::ffi::CStr::from_ptr(aerostrata_version()) };
        assert_eq!(v.to_str().unwrap(), env!("CARGO_PKG_VERSION"));
    }
}
