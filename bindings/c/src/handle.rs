//! Opaque handles that catch misuse: a handle given to C points to a small header holding
//! a type tag, a liveness word and a pointer to the value, and every call checks the first
//! two before it touches the third. The scheme is the common one of tagged allocations
//! with a quarantine of freed blocks (common practice, no source).
//!
//! Why a separate header: the value (a sounding's rows, a drag table) goes back to the
//! allocator as soon as its handle is freed, while the header (16 bytes on a 64-bit host,
//! 12 on Cortex-M) stays allocated, marked freed, in a quarantine of the last
//! [`QUARANTINE`] freed headers. A freed handle used again, or freed again, within that
//! window is reported as `AEROSTRATA_STATUS_INVALID_HANDLE` with a message instead of
//! reading freed memory. After the window the header itself is returned to the allocator
//! and misuse is undefined behaviour again (AddressSanitizer then reports it as a use
//! after free, as it should). docs/c-guide.md ("Handles that catch misuse") says what is
//! and is not detected.

use alloc::boxed::Box;
use alloc::format;
use core::sync::atomic::{AtomicPtr, AtomicU32, Ordering};

use crate::error::{self, AerostrataStatus, Failure};

/// The liveness word of a handle in use ("LIVE" in ASCII, read as a little-endian word).
const LIVE: u32 = u32::from_le_bytes(*b"LIVE");
/// The liveness word of a freed handle waiting in the quarantine.
const FREED: u32 = u32::from_le_bytes(*b"FREE");

/// How many freed headers are kept before the oldest goes back to the allocator: 256 on
/// a host (4 KiB), 16 on bare metal (192 bytes of a small heap).
#[cfg(feature = "std")]
pub(crate) const QUARANTINE: usize = 256;
/// How many freed headers are kept before the oldest goes back to the allocator.
#[cfg(not(feature = "std"))]
pub(crate) const QUARANTINE: usize = 16;

/// What every handle points to. `repr(C)` so that the tag and the liveness word sit at
/// the same offsets whatever the value's type: a handle of one type passed where another
/// belongs is read through the same two words and named.
#[repr(C)]
struct Header {
    tag: AtomicU32,
    life: AtomicU32,
    value: AtomicPtr<()>,
}

/// A type that C holds through a handle: its tag and the names its messages use.
pub(crate) trait Handle: Sized {
    /// The type's tag word, distinct from every other handle type's.
    const TAG: u32;
    /// What the handle is, for messages ("model").
    const WHAT: &'static str;
    /// The function that releases it ("aerostrata_model_free").
    const FREE: &'static str;
}

/// Every handle type's tag, name and constructors, for the message of a handle of one
/// type passed where another belongs.
const KINDS: [(u32, &str, &str); 3] = [
    (crate::model::MODEL_TAG, "model", "aerostrata_model_new_*"),
    (crate::flight::DRAG_CURVE_TAG, "drag curve", "aerostrata_drag_curve_new_*"),
    (crate::loads::WIND_PROFILE_TAG, "wind profile", "aerostrata_wind_profile_new*"),
];

/// A new handle owning `value`, released by [`free_handle`].
pub(crate) fn into_handle<T: Handle>(value: T) -> *mut T {
    let value = Box::into_raw(Box::new(value)).cast::<()>();
    let header =
        Header { tag: AtomicU32::new(T::TAG), life: AtomicU32::new(LIVE), value: AtomicPtr::new(value) };
    Box::into_raw(Box::new(header)).cast::<T>()
}

fn invalid(message: alloc::string::String) -> Failure {
    Failure::bare(AerostrataStatus::InvalidHandle, message)
}

/// The header of `handle` if it is a live handle of type `T`, else the failure that
/// says what it is instead; `rule` ends the message of a freed handle. `handle` is not
/// NULL.
fn header<'a, T: Handle>(name: &str, handle: *const T, rule: &str) -> Result<&'a Header, Failure> {
    let what = T::WHAT;
    let foreign = || {
        invalid(format!(
            "{name}: not a {what} made by aerostrata (no handle tag at this address): a pointer to \
             something else, or a handle freed so long ago that its memory was reused"
        ))
    };
    if handle as usize % core::mem::align_of::<Header>() != 0 {
        return Err(foreign());
    }
    // SAFETY: not NULL (the callers check) and aligned (checked above); that it points to
    // readable memory of at least a header's size is the caller's contract, which holds
    // for a live handle and for one freed within the quarantine's window.
    let header = unsafe { &*handle.cast::<Header>() };
    let tag = header.tag.load(Ordering::Acquire);
    let life = header.life.load(Ordering::Acquire);
    if tag != T::TAG {
        let Some((_, other, made_by)) = KINDS.iter().find(|(t, _, _)| *t == tag) else {
            return Err(foreign());
        };
        let freed = if life == FREED { "freed " } else { "" };
        return Err(invalid(format!(
            "{name}: got a {freed}{other} handle (made by {made_by}) where a {what} handle belongs"
        )));
    }
    match life {
        LIVE => Ok(header),
        FREED => Err(invalid(format!("{name}: this {what} was freed by {} already; {rule}", T::FREE))),
        _ => Err(foreign()),
    }
}

/// What the handle `handle` (the argument `name`) holds, or the failure that says why it
/// cannot be used: NULL, freed, of another type or not a handle at all.
pub(crate) fn handle_ref<'a, T: Handle>(name: &str, handle: *const T) -> Result<&'a T, Failure> {
    error::require(name, handle)?;
    let value =
        header(name, handle, "a handle must not be used after it is freed")?.value.load(Ordering::Acquire);
    if value.is_null() {
        // Freed by another thread between the two loads (a misuse the header documents).
        return Err(invalid(format!("{name}: this {} was freed by {} during the call", T::WHAT, T::FREE)));
    }
    // SAFETY: the header is live, so `value` came from `Box::into_raw` of a `T` in
    // `into_handle` and has not been released.
    Ok(unsafe { &*value.cast::<T>() })
}

/// Releases a handle made by [`into_handle`]: NULL does nothing (status OK); a freed
/// handle, a handle of another type or a pointer that is no handle gives
/// `InvalidHandle` and releases nothing. The thread's error detail is written only on a
/// failure, so that freeing handles between a failed call and reading its detail keeps
/// the detail.
pub(crate) fn free_handle<T: Handle>(name: &str, handle: *mut T) -> AerostrataStatus {
    if handle.is_null() {
        return AerostrataStatus::Ok;
    }
    error::guard_failures(|| {
        let rule = "a handle must be freed once";
        let header = header(name, handle.cast_const(), rule)?;
        // Two threads freeing one handle at once: one wins, the other is told.
        if header.life.compare_exchange(LIVE, FREED, Ordering::AcqRel, Ordering::Acquire).is_err() {
            return Err(invalid(format!(
                "{name}: this {} was freed by {} already; {rule}",
                T::WHAT,
                T::FREE
            )));
        }
        let value = header.value.swap(core::ptr::null_mut(), Ordering::AcqRel);
        if !value.is_null() {
            // SAFETY: made by Box::into_raw in `into_handle`; the exchange above makes
            // this the one release.
            drop(unsafe { Box::from_raw(value.cast::<T>()) });
        }
        quarantine::keep(handle.cast::<Header>());
        Ok(())
    })
}

/// Releases a header for good: its words are cleared first, so that a stale handle that
/// still finds them before the allocator reuses the memory reads "not a handle".
///
/// # Safety
/// `header` came from `into_handle`, is freed, and is released once.
unsafe fn release(header: *mut Header) {
    // SAFETY: the caller's contract.
    let boxed = unsafe { Box::from_raw(header) };
    boxed.tag.store(0, Ordering::Release);
    boxed.life.store(0, Ordering::Release);
    drop(boxed);
}

/// The last [`QUARANTINE`] freed headers, oldest first out.
struct Ring {
    slots: [*mut Header; QUARANTINE],
    next: usize,
}

// SAFETY: the ring owns the freed headers it holds; nothing else writes them.
unsafe impl Send for Ring {}

impl Ring {
    const fn new() -> Self {
        Self { slots: [core::ptr::null_mut(); QUARANTINE], next: 0 }
    }

    /// Keeps `header`, and returns the oldest one it pushes out (NULL while not full).
    fn push(&mut self, header: *mut Header) -> *mut Header {
        let slot = &mut self.slots[self.next % QUARANTINE];
        let out = core::mem::replace(slot, header);
        self.next = (self.next + 1) % QUARANTINE;
        out
    }
}

#[cfg(feature = "std")]
mod quarantine {
    use super::{release, Header, Ring};
    use std::sync::Mutex;

    static RING: Mutex<Ring> = Mutex::new(Ring::new());

    /// Keeps the freed `header` and releases the one it pushes out.
    pub(super) fn keep(header: *mut Header) {
        // A poisoned lock only means a panic elsewhere; the ring itself is consistent.
        let out = RING.lock().unwrap_or_else(std::sync::PoisonError::into_inner).push(header);
        if !out.is_null() {
            // SAFETY: the ring held it, freed, and gave it up just now.
            unsafe { release(out) }
        }
    }
}

/// Bare metal: a try-lock rather than a lock, as in the error slot. A free that finds the
/// ring busy (an interrupt handler that interrupted another free) releases its header at
/// once, so that handle is not watched.
#[cfg(not(feature = "std"))]
mod quarantine {
    use super::{release, Header, Ring};
    use core::cell::UnsafeCell;
    use core::sync::atomic::{AtomicBool, Ordering};

    struct Guarded {
        busy: AtomicBool,
        ring: UnsafeCell<Ring>,
    }

    // SAFETY: `ring` is only touched by whoever set `busy` from false to true.
    unsafe impl Sync for Guarded {}

    static RING: Guarded = Guarded { busy: AtomicBool::new(false), ring: UnsafeCell::new(Ring::new()) };

    pub(super) fn keep(header: *mut Header) {
        let out = if RING.busy.compare_exchange(false, true, Ordering::Acquire, Ordering::Relaxed).is_ok() {
            // SAFETY: the exchange above gives exclusive access until the release.
            let out = unsafe { &mut *RING.ring.get() }.push(header);
            RING.busy.store(false, Ordering::Release);
            out
        } else {
            header
        };
        if !out.is_null() {
            // SAFETY: freed, and no longer held by the ring (or never put there).
            unsafe { release(out) }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::error::{aerostrata_last_error, AerostrataErrorDetail};

    #[derive(Debug)]
    struct Probe(#[allow(dead_code)] u64);
    impl Handle for Probe {
        const TAG: u32 = u32::from_le_bytes(*b"prob");
        const WHAT: &'static str = "probe";
        const FREE: &'static str = "probe_free";
    }

    fn message() -> alloc::string::String {
        let mut d = AerostrataErrorDetail::ok();
        // SAFETY: `d` is writable.
        unsafe { aerostrata_last_error(&mut d) };
        let bytes: alloc::vec::Vec<u8> =
            d.message.iter().take_while(|&&c| c != 0).map(|&c| c as u8).collect();
        alloc::string::String::from_utf8(bytes).unwrap()
    }

    #[test]
    fn a_freed_handle_is_named_and_a_second_free_refused() {
        let h = into_handle(Probe(7));
        assert!(handle_ref("p", h).is_ok());
        assert_eq!(free_handle("p", h), AerostrataStatus::Ok);
        let e = handle_ref("p", h).unwrap_err();
        assert_eq!(e.status, AerostrataStatus::InvalidHandle);
        assert_eq!(
            e.message,
            "p: this probe was freed by probe_free already; a handle must not be used after it is freed"
        );
        assert_eq!(free_handle("p", h), AerostrataStatus::InvalidHandle);
        assert_eq!(message(), "p: this probe was freed by probe_free already; a handle must be freed once");
    }

    #[test]
    fn another_type_is_named_and_left_alive() {
        let model = into_handle(crate::AerostrataModel { model: crate::model::Model::Us1976 });
        let e = handle_ref("p", model.cast::<Probe>()).unwrap_err();
        assert_eq!(
            e.message,
            "p: got a model handle (made by aerostrata_model_new_*) where a probe handle belongs"
        );
        assert_eq!(free_handle("p", model.cast::<Probe>()), AerostrataStatus::InvalidHandle);
        assert!(handle_ref("model", model).is_ok(), "a refused free releases nothing");
        assert_eq!(free_handle("model", model), AerostrataStatus::Ok);
        let e = handle_ref("p", model.cast::<Probe>()).unwrap_err();
        assert!(e.message.starts_with("p: got a freed model handle (made by"), "{}", e.message);
    }

    #[test]
    fn memory_that_is_no_handle_is_refused_without_reading_past_a_header() {
        let words = [0u64; 2];
        let e = handle_ref("p", words.as_ptr().cast::<Probe>()).unwrap_err();
        assert_eq!(e.status, AerostrataStatus::InvalidHandle);
        assert!(e.message.starts_with("p: not a probe made by aerostrata"), "{}", e.message);
        // Misaligned: refused before any read.
        let e = handle_ref("p", words.as_ptr().cast::<u8>().wrapping_add(1).cast::<Probe>()).unwrap_err();
        assert!(e.message.starts_with("p: not a probe"), "{}", e.message);
        assert_eq!(
            handle_ref("p", core::ptr::null::<Probe>()).unwrap_err().status,
            AerostrataStatus::NullPointer
        );
    }

    #[test]
    fn a_free_that_succeeds_keeps_the_detail_of_the_failure_before_it() {
        let _ = error::guard(|| Err(Failure::null("earlier")));
        let h = into_handle(Probe(1));
        assert_eq!(free_handle("p", h), AerostrataStatus::Ok);
        assert_eq!(free_handle("p", core::ptr::null_mut::<Probe>()), AerostrataStatus::Ok);
        assert_eq!(message(), "earlier must not be NULL");
    }

    #[test]
    fn two_threads_freeing_one_handle_release_it_once() {
        let h = into_handle(Probe(3)) as usize;
        let free = move || free_handle("p", h as *mut Probe);
        let other = std::thread::spawn(free);
        let mine = free();
        let theirs = other.join().unwrap();
        let mut both = [mine, theirs];
        both.sort_by_key(|s| *s as i32);
        assert_eq!(both, [AerostrataStatus::Ok, AerostrataStatus::InvalidHandle]);
    }

    #[test]
    fn the_ring_gives_up_its_oldest_header_once_full() {
        let mut ring = Ring::new();
        let fake = |i: usize| (8 * (i + 1)) as *mut Header;
        for i in 0..QUARANTINE {
            assert!(ring.push(fake(i)).is_null(), "not full yet at {i}");
        }
        assert_eq!(ring.push(fake(QUARANTINE)), fake(0));
        assert_eq!(ring.push(fake(QUARANTINE + 1)), fake(1));
    }
}
