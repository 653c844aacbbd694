//! The global allocator of the bare-metal C library: the C library's own `malloc` and
//! `free` (newlib's on a microcontroller), so that the handles of user models and drag
//! curves come from the heap the C program already manages. Only the `_new` functions and
//! the batch functions that build a `Vec` allocate; the standard atmosphere and every
//! scalar helper never do.

use core::alloc::{GlobalAlloc, Layout};
use core::ffi::c_void;

// The C library declares these in <stdlib.h>; the public header must not declare them
// again (a second declaration can clash with the C library's own, for example with
// attributes or another `size_t`): cbindgen.toml excludes them.
extern "C" {
    fn malloc(size: usize) -> *mut c_void;
    fn free(pointer: *mut c_void);
}

/// malloc's alignment guarantee on the 32-bit Arm EABI and on 64-bit hosts (8 bytes at
/// least); larger alignments are refused (a null pointer, which Rust reports as an
/// allocation failure) rather than over-allocated, since nothing here asks for them.
const MALLOC_ALIGN: usize = 8;

struct Malloc;

// SAFETY: malloc returns memory suitably aligned for any type of up to MALLOC_ALIGN
// bytes' alignment, or NULL; free accepts what malloc returned.
unsafe impl GlobalAlloc for Malloc {
    unsafe fn alloc(&self, layout: Layout) -> *mut u8 {
        if layout.align() > MALLOC_ALIGN {
            return core::ptr::null_mut();
        }
        // SAFETY: a plain C call; a zero size is never asked of a GlobalAlloc.
        unsafe { malloc(layout.size()).cast() }
    }

    unsafe fn dealloc(&self, pointer: *mut u8, _: Layout) {
        // SAFETY: `pointer` came from `alloc` above (GlobalAlloc's contract).
        unsafe { free(pointer.cast()) }
    }
}

#[global_allocator]
static ALLOCATOR: Malloc = Malloc;
