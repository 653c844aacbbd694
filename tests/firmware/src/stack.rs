//! Stack high-water mark by painting: fill the free stack below the current stack pointer
//! with a pattern, run the code under test, and find the lowest word it overwrote.
//!
//! Painting is the common practice on targets without a stack-usage report from the
//! compiler (no source). The code runs twice, with two different patterns, so that a
//! word the code happens to write with the pattern's own value cannot hide the true
//! depth. Nothing else runs meanwhile: the firmwares enable no interrupt.

use core::arch::asm;
use core::ptr;

/// How far below the caller's frame the stack is painted, bytes: eight times the budget,
/// so that an overrun is seen as an overrun and not cut off at the edge of the paint.
pub const PAINT_BYTES: usize = 8 * 1024;

const PATTERNS: [u32; 2] = [0xA5C3_5A3C, 0x5A3C_A5C3];

extern "C" {
    /// The first free byte of RAM after .data, .bss and .uninit (cortex-m-rt's link.x).
    static __sheap: u32;
}

/// The stack used by `f`, bytes: from the stack pointer of this function's frame down to
/// the deepest word `f` (and everything it calls) wrote. What `f` returns lives in the
/// caller's frame and is not counted here; see [`core::mem::size_of`] of the result.
///
/// Returns `None` when the painted region would reach into static RAM (the stack is too
/// small for the measurement).
#[inline(never)]
pub fn measure<R, F: FnMut() -> R>(mut f: F) -> Option<(R, usize)> {
    let top = stack_pointer() & !3;
    let bottom = top.checked_sub(PAINT_BYTES)?;
    // Only the address of the linker symbol is taken, never its value.
    let statics_end = ptr::addr_of!(__sheap) as usize;
    if bottom <= statics_end {
        return None;
    }
    let mut deepest = 0;
    let mut result = None;
    for pattern in PATTERNS {
        // Painted in this function, whose frame lies wholly above `top`: a helper
        // function's own frame would sit in the region it paints.
        let mut address = bottom;
        while address < top {
            // SAFETY: [bottom, top) is free stack below this frame, inside RAM above the
            // statics (checked above); nothing else runs.
            unsafe { ptr::write_volatile(address as *mut u32, pattern) };
            address += 4;
        }
        let value = call(&mut f);
        let mut lowest = bottom;
        // SAFETY: as above; the words are read back after `f` returned.
        while lowest < top && unsafe { ptr::read_volatile(lowest as *const u32) } == pattern {
            lowest += 4;
        }
        deepest = deepest.max(top - lowest);
        result = Some(value);
    }
    result.map(|value| (value, deepest))
}

/// Calls `f` in a frame of its own below `measure`'s, so that nothing `f` needs can be
/// placed in `measure`'s frame by inlining.
#[inline(never)]
fn call<R, F: FnMut() -> R>(f: &mut F) -> R {
    f()
}

#[inline(always)]
fn stack_pointer() -> usize {
    let sp: usize;
    // SAFETY: reads the stack pointer register, nothing else.
    unsafe { asm!("mov {}, sp", out(reg) sp, options(nomem, nostack, preserves_flags)) };
    sp
}
