//! The bare-metal side of the firmware proof: the reference vectors evaluated through
//! the core on an emulated Cortex-M, a stack high-water measurement by painting, and the
//! small firmwares whose flash cost is the core's budget.
//!
//! Every line the firmwares print over semihosting is either a bit line in the format of
//! `cargo xtask bits` (`FILE INPUT COLUMN BITS`) or a harness line starting with `# `,
//! which the xtask reads for the verdict, the counts and the stack figures.

#![no_std]

pub mod stack;
#[cfg(feature = "upper")]
pub mod vectors;

use core::hint::black_box;
use cortex_m_semihosting::{debug, hprintln};

/// Ends the run with QEMU's exit status 0 (`true`) or 1 (`false`).
pub fn exit(success: bool) -> ! {
    debug::exit(if success { debug::EXIT_SUCCESS } else { debug::EXIT_FAILURE });
    // Without a semihosting host the call returns; stop here.
    loop {
        cortex_m::asm::bkpt();
    }
}

/// What the budget firmwares measure: `evaluate` at each of `altitudes_m` inside the
/// stack measurement, its result kept alive with `black_box`. Prints the deepest stack as
/// `# stack NAME N B` and says whether every evaluation succeeded.
pub fn deepest_stack<T, E>(
    name: &str,
    altitudes_m: impl IntoIterator<Item = f64>,
    mut evaluate: impl FnMut(f64) -> Result<T, E>,
) -> bool {
    let mut deepest = 0usize;
    let mut ok = true;
    for z in altitudes_m {
        match stack::measure(|| evaluate(black_box(z))) {
            Some((Ok(value), used)) => {
                black_box(value);
                deepest = deepest.max(used);
            }
            _ => ok = false,
        }
    }
    hprintln!("# stack {} {} B", name, deepest);
    ok
}

/// Geometric altitudes, m, at which the budget firmwares evaluate the state: one inside
/// every layer of the lower standard, its ends, and (with `upper`) points up to 1000 km.
/// Both the empty and the evaluating firmware carry the same table, so it cancels out of
/// the flash difference.
#[cfg(not(feature = "upper"))]
pub static BUDGET_ALTITUDES_M: [f64; 12] =
    [-5000.0, 0.0, 5000.0, 11000.0, 15000.0, 25000.0, 40000.0, 50000.0, 60000.0, 75000.0, 80500.0, 86000.0];

/// As above, with the upper atmosphere's range.
#[cfg(feature = "upper")]
pub static BUDGET_ALTITUDES_M: [f64; 18] = [
    -5000.0, 0.0, 5000.0, 11000.0, 15000.0, 25000.0, 40000.0, 50000.0, 60000.0, 75000.0, 80500.0, 86000.0,
    90000.0, 110000.0, 120000.0, 200000.0, 500000.0, 1000000.0,
];
