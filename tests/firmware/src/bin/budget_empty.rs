//! The baseline of the flash budget: the same start-up, stack measurement, printing and
//! exit as `budget-state`, with no call into the core. Its flash is subtracted from
//! `budget-state`'s to give the core's own cost (see docs/firmware.md).

#![no_std]
#![no_main]

use aerostrata_firmware::{deepest_stack, BUDGET_ALTITUDES_M};
use cortex_m_rt::entry;
use panic_semihosting as _;

#[entry]
fn main() -> ! {
    let ok = deepest_stack("state", BUDGET_ALTITUDES_M, |z| Ok::<f64, ()>(z + 1.0));
    aerostrata_firmware::exit(ok)
}
