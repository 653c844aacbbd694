//! The flash and stack budget firmware: the full state of the standard at every altitude
//! of `BUDGET_ALTITUDES_M` (and, built with `upper`, the species above 86 km), nothing
//! else. Its .text + .rodata less `budget-empty`'s is the core's flash cost, libm and the
//! soft-float routines it pulls in included; the deepest stack of one state evaluation is
//! printed as `# stack state N B`.

#![no_std]
#![no_main]

use aerostrata::{Altitude, Atmosphere, US1976};
use aerostrata_firmware::{deepest_stack, BUDGET_ALTITUDES_M};
use cortex_m_rt::entry;
use cortex_m_semihosting::hprintln;
use panic_semihosting as _;

#[entry]
fn main() -> ! {
    let state = deepest_stack("state", BUDGET_ALTITUDES_M, |z| {
        Altitude::geometric_m(z).and_then(|a| US1976.state(a))
    });
    let species = species();
    hprintln!("# result {} B", core::mem::size_of::<aerostrata::Result<aerostrata::State>>());
    aerostrata_firmware::exit(state && species)
}

/// The species at the altitudes above 86 km, their deepest stack printed as
/// `# stack species N B`.
#[cfg(feature = "upper")]
fn species() -> bool {
    let above = BUDGET_ALTITUDES_M.into_iter().filter(|z| *z > 86_000.0);
    deepest_stack("species", above, |z| Altitude::geometric_m(z).and_then(|a| US1976.species(a)))
}

/// Without `upper` there are no species.
#[cfg(not(feature = "upper"))]
fn species() -> bool {
    true
}
