//! The vector harness: every row of every file of `tests/vectors`, evaluated through the
//! core on the emulated Cortex-M, each value printed as its f64 bit pattern in the line
//! format of `cargo xtask bits` and each reference cell checked against its tolerance.
//! Exits with status 1 on any miss or error, 0 otherwise.
//!
//! Harness lines start with `# `: `# miss ...` and `# error ...` name what failed,
//! `# stack ...` give the high-water marks, `# summary ...` the counts.

#![no_std]
#![no_main]

use aerostrata::quantity::Group;
use aerostrata::Quantity;
use aerostrata::{Altitude, Atmosphere, State, US1976};
use aerostrata_firmware::stack;
use aerostrata_firmware::vectors::{Evaluated, Evaluator, FILES};
use core::hint::black_box;
use cortex_m_rt::entry;
use cortex_m_semihosting::hprintln;
use panic_semihosting as _;

#[entry]
fn main() -> ! {
    let mut values = 0usize;
    let mut checked = 0usize;
    let mut misses = 0usize;
    let mut errors = 0usize;
    // Deepest stack, bytes: a direct call of the state, the species, and this harness's
    // own generic row evaluation (flow rows included; more than a firmware needs).
    let mut stack_state = 0usize;
    let mut stack_species = 0usize;
    let mut stack_row = 0usize;

    for file in FILES {
        let evaluator = match Evaluator::new(file.model) {
            Ok(evaluator) => evaluator,
            Err(error) => {
                hprintln!("# error {}: model '{}': {}", file.stem, file.model_name, error);
                errors += 1;
                continue;
            }
        };
        let has_species = file
            .columns
            .iter()
            .any(|c| Quantity::from_column(c).is_ok_and(|read| read.quantity.info().group == Group::Species));
        for row in file.rows {
            let Some((evaluated, used)) = stack::measure(|| evaluator.row(file.input, row.input)) else {
                hprintln!("# error the stack is too small to paint {} bytes", stack::PAINT_BYTES);
                aerostrata_firmware::exit(false);
            };
            stack_row = stack_row.max(used);
            let evaluated = match evaluated {
                Ok(evaluated) => evaluated,
                Err(failure) => {
                    hprintln!(
                        "# error {}:{}: {} = {}: {}",
                        file.stem,
                        row.line,
                        file.input_name,
                        row.input_text,
                        failure
                    );
                    errors += 1;
                    continue;
                }
            };
            if let Evaluated::State(_, altitude) = &evaluated {
                stack_state = stack_state.max(state_stack(&evaluator, *altitude));
                if has_species {
                    stack_species = stack_species.max(species_stack(*altitude));
                }
            }
            for (column, cell) in file.columns.iter().zip(row.cells) {
                let Some(value) = evaluated.value(column) else {
                    hprintln!(
                        "# error {}: no quantity named {} for model {}",
                        file.stem,
                        column,
                        file.model_name
                    );
                    errors += 1;
                    continue;
                };
                values += 1;
                match value {
                    Some(v) => hprintln!("{} {} {} {:016x}", file.stem, row.input_text, column, v.to_bits()),
                    None => hprintln!("{} {} {} undefined", file.stem, row.input_text, column),
                }
                let Some(cell) = cell else { continue };
                checked += 1;
                match value {
                    Some(v) if cell.passes(v) => {}
                    Some(v) => {
                        misses += 1;
                        hprintln!(
                            "# miss {}:{}: {} at {} = {}: computed {:e}, reference {} (tolerance {:e})",
                            file.stem,
                            row.line,
                            column,
                            file.input_name,
                            row.input_text,
                            v,
                            cell.text,
                            cell.tolerance
                        );
                    }
                    None => {
                        misses += 1;
                        hprintln!("# miss {}:{}: {} is not defined there", file.stem, row.line, column);
                    }
                }
            }
        }
    }

    hprintln!("# stack state {} B", stack_state);
    hprintln!("# stack result {} B", core::mem::size_of::<aerostrata::Result<State>>());
    hprintln!("# stack species {} B", stack_species);
    hprintln!("# stack row {} B", stack_row);
    hprintln!("# summary {} values, {} checked, {} misses, {} errors", values, checked, misses, errors);
    aerostrata_firmware::exit(misses == 0 && errors == 0)
}

/// The stack a direct call of the file's atmosphere takes for the full state at
/// `altitude`, bytes, as a firmware would make it.
fn state_stack(evaluator: &Evaluator, altitude: Altitude) -> usize {
    // The state is returned into `measure`'s frame, as a caller would hold it, and kept
    // alive with `black_box` so that no part of its computation can be optimised away.
    let measured = match evaluator {
        Evaluator::Standard => stack::measure(|| US1976.state(altitude)),
        Evaluator::Offset(offset) => stack::measure(|| offset.state(altitude)),
        Evaluator::Hydrostatic(day) => stack::measure(|| day.state(altitude)),
        Evaluator::Isentropic(_) | Evaluator::NormalShock(_) => return 0,
    };
    measured.map_or(usize::MAX, |(state, used)| {
        black_box(&state);
        used
    })
}

/// The stack the standard's species take at `altitude`, bytes (below 86 km the call
/// returns its error at once).
fn species_stack(altitude: Altitude) -> usize {
    stack::measure(|| US1976.species(altitude)).map_or(usize::MAX, |(species, used)| {
        black_box(&species);
        used
    })
}
