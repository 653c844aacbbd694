//! The baseline of the flash budget: the same start-up, stack measurement, printing and
//! exit as `budget-state`, with no call into the core. Its flash is subtracted from
//! `budget-state`'s to give the core's own cost (see docs/firmware.md).

#![no_std]
#![no_main]

use aerostrata_firmware::{stack, BUDGET_ALTITUDES_M};
use core::hint::black_box;
use cortex_m_rt::entry;
use cortex_m_semihosting::hprintln;
use panic_semihosting as _;

#[entry]
fn main() -> ! {
    let mut deepest = 0usize;
    let mut ok = true;
    for z in BUDGET_ALTITUDES_M {
        match stack::measure(|| black_box(black_box(z) + 1.0)) {
            Some((value, used)) => {
                black_box(value);
                deepest = deepest.max(used);
            }
            None => ok = false,
        }
    }
    hprintln!("# stack state {} B", deepest);
    aerostrata_firmware::exit(ok)
}
