//! The flash and stack budget firmware: the full state of the standard at every altitude
//! of `BUDGET_ALTITUDES_M` (and, built with `upper`, the species above 86 km), nothing
//! else. Its .text + .rodata less `budget-empty`'s is the core's flash cost, libm and the
//! soft-float routines it pulls in included; the deepest stack of one state evaluation is
//! printed as `# stack state N B`.

#![no_std]
#![no_main]

use aerostrata::{Altitude, Atmosphere, US1976};
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
        match stack::measure(|| Altitude::geometric_m(black_box(z)).and_then(|a| US1976.state(a))) {
            Some((Ok(state), used)) => {
                black_box(state);
                deepest = deepest.max(used);
            }
            _ => ok = false,
        }
        #[cfg(feature = "upper")]
        if z > 86_000.0 {
            match stack::measure(|| Altitude::geometric_m(black_box(z)).and_then(|a| US1976.species(a))) {
                Some((Ok(species), used)) => {
                    black_box(species);
                    hprintln!("# stack species {} B", used);
                }
                _ => ok = false,
            }
        }
    }
    hprintln!("# stack state {} B", deepest);
    hprintln!("# result {} B", core::mem::size_of::<aerostrata::Result<aerostrata::State>>());
    aerostrata_firmware::exit(ok)
}
