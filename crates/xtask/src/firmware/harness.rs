//! The Rust vector harness of `cargo xtask firmware` and the firmware budgets.
//!
//! For each of the two targets (Cortex-M4F on the MPS2 AN386 board, Cortex-M3 on the
//! LM3S6965 board) it builds the vector harness and the budget firmwares, runs them in
//! QEMU under `timeout`, reads the bit lines and the harness lines they print over
//! semihosting, compares every bit line with `vectors::bit_lines` evaluated natively, and
//! checks the budgets: flash (.text + .rodata of `budget-state` less `budget-empty`) for
//! the lower standard alone and with the upper atmosphere, the stack high-water mark of a
//! full-state evaluation (painted stack, plus the result the caller holds), and no heap
//! (no allocator symbol in any image). docs/firmware.md explains each figure.

use std::fmt::Write as _;
use std::fs;
use std::path::Path;

use super::cargo::{build_settings, cargo};
use super::qemu;
use crate::io_error;
use crate::rust::flash;
use crate::rust::vectors::{self, split_output};
use crate::setup::TargetToolchain;

/// Flash budget of a firmware that uses only the lower standard atmosphere, bytes.
pub const LOWER_FLASH_BUDGET_BYTES: u64 = 12 * 1024;
/// Flash budget with the upper atmosphere (86-1000 km) as well, bytes.
pub const UPPER_FLASH_BUDGET_BYTES: u64 = 40 * 1024;
/// Stack budget of one full-state evaluation, the result included, bytes.
pub const STACK_BUDGET_BYTES: u64 = 1024;

/// Symbols that only a program with a heap contains: Rust's allocator shims and C's malloc.
const ALLOCATOR_SYMBOLS: [&str; 6] =
    ["__rust_alloc", "__rdl_alloc", "__rg_alloc", "__rust_alloc_error_handler", "malloc", "_malloc_r"];

/// What one target gave.
pub(super) struct TargetReport {
    target: String,
    values: usize,
    checked: usize,
    identical: usize,
    harness_seconds: f64,
    lower_flash: Flash,
    upper_flash: Flash,
    /// Worst stack of a full-state evaluation, bytes: the harness over every us1976 row,
    /// the lower-only budget firmware and the upper one.
    stack_state: [u64; 3],
    stack_result: u64,
    stack_species: u64,
    stack_row: u64,
}

/// The flash of a budget firmware pair, bytes.
struct Flash {
    empty: u64,
    state: u64,
    /// Of the difference: libm's functions, the soft-float routines, the upper table.
    libm: u64,
    soft_float: u64,
    table: u64,
}

impl Flash {
    fn cost(&self) -> u64 {
        self.state.saturating_sub(self.empty)
    }
}

/// The number N of the harness line `PREFIX N ...` (e.g. `stack state 740 B`).
fn figure(harness: &[String], prefix: &str) -> Result<u64, String> {
    harness
        .iter()
        .filter_map(|l| l.strip_prefix(prefix))
        .filter_map(|rest| rest.split_whitespace().next().and_then(|n| n.parse::<u64>().ok()))
        .max()
        .ok_or_else(|| format!("no line '# {prefix} N' in the firmware's output"))
}

/// Reads an ELF image and fails if it links an allocator.
fn read_elf(path: &Path) -> Result<Vec<u8>, String> {
    let data = fs::read(path).map_err(|e| io_error("read", path, e))?;
    let file = object::File::parse(&*data).map_err(|e| format!("{}: {e}", path.display()))?;
    let names: Vec<String> = flash::symbols(&file).into_iter().map(|(name, _)| name).collect();
    no_heap(&names).map_err(|e| format!("{}: {e}", path.display()))?;
    Ok(data)
}

/// Err naming every allocator symbol among `names`.
fn no_heap(names: &[String]) -> Result<(), String> {
    let found: Vec<&str> = names
        .iter()
        .map(String::as_str)
        .filter(|name| ALLOCATOR_SYMBOLS.iter().any(|a| name == a || name.starts_with(&format!("{a}."))))
        .collect();
    if found.is_empty() {
        Ok(())
    } else {
        Err(format!("links a heap allocator: {}", found.join(", ")))
    }
}

/// The flash figures of one budget firmware pair, from the two ELF images.
fn flash_pair(empty: &[u8], state: &[u8]) -> Result<Flash, String> {
    let empty = object::File::parse(empty).map_err(|e| e.to_string())?;
    let state = object::File::parse(state).map_err(|e| e.to_string())?;
    let empty_names: Vec<String> = flash::symbols(&empty).into_iter().map(|(n, _)| n).collect();
    let added: Vec<(String, u64)> =
        flash::symbols(&state).into_iter().filter(|(n, _)| !empty_names.contains(n)).collect();
    let sum =
        |keep: &dyn Fn(&str) -> bool| -> u64 { added.iter().filter(|(n, _)| keep(n)).map(|(_, s)| s).sum() };
    Ok(Flash {
        empty: flash::code_and_constants_bytes(&empty)?,
        state: flash::code_and_constants_bytes(&state)?,
        libm: sum(&|n| n.contains("4libm")),
        soft_float: sum(&|n| n.contains("compiler_builtins") || n.starts_with("__aeabi_")),
        table: flash::upper_table_symbols(&added).iter().map(|(_, s)| s).sum(),
    })
}

pub(super) fn run_target(
    root: &Path,
    toolchain: TargetToolchain,
    target: &str,
    native: &[String],
) -> Result<TargetReport, String> {
    let firmware = root.join("tests/firmware");
    let (_, _, target_dir) = build_settings(root, toolchain);
    let release = target_dir.join(target).join("release");

    // With the upper atmosphere: the vector harness and the upper budget pair.
    cargo(
        &firmware,
        toolchain,
        &["build", "--quiet", "--release", "--target", target, "--features", "upper"],
    )?;
    let harness_elf = release.join("vectors");
    read_elf(&harness_elf)?;
    let harness = qemu::run(target, &harness_elf)?;
    let (lines, bits) = split_output(&harness.stdout_text());
    for line in lines.iter().filter(|l| l.starts_with("miss") || l.starts_with("error")) {
        eprintln!("{target}: {line}");
    }
    if !harness.success {
        return Err(format!(
            "the vector harness failed in QEMU ({}); last output:\n{}",
            harness.status,
            harness.last_lines()
        ));
    }
    let identical = vectors::compare_bits(target, native, &bits)?;
    let values = usize::try_from(figure(&lines, "summary")?).map_err(|e| e.to_string())?;
    let checked = lines
        .iter()
        .find_map(|l| l.strip_prefix("summary"))
        .and_then(|l| l.split(',').nth(1))
        .and_then(|c| c.split_whitespace().next())
        .and_then(|n| n.parse().ok())
        .ok_or("no checked count in the summary line")?;
    if values != native.len() {
        return Err(format!("the harness evaluated {values} values, the native build {}", native.len()));
    }
    let upper = budget_pair(&release, target)?;

    // The lower standard alone.
    cargo(
        &firmware,
        toolchain,
        &[
            "build",
            "--quiet",
            "--release",
            "--target",
            target,
            "--bin",
            "budget-empty",
            "--bin",
            "budget-state",
        ],
    )?;
    let lower = budget_pair(&release, target)?;

    Ok(TargetReport {
        target: target.to_owned(),
        values,
        checked,
        identical,
        harness_seconds: harness.seconds,
        lower_flash: lower.0,
        upper_flash: upper.0,
        stack_state: [figure(&lines, "stack state")?, lower.1, upper.1],
        stack_result: figure(&lines, "stack result")?,
        stack_species: figure(&lines, "stack species")?,
        stack_row: figure(&lines, "stack row")?,
    })
}

/// Reads and runs the budget firmware pair just built: its flash figures and the deepest
/// stack of a state evaluation `budget-state` measured.
fn budget_pair(release: &Path, target: &str) -> Result<(Flash, u64), String> {
    let empty = read_elf(&release.join("budget-empty"))?;
    let state_elf = release.join("budget-state");
    let state = read_elf(&state_elf)?;
    let flash = flash_pair(&empty, &state)?;
    let run = qemu::run(target, &state_elf)?;
    if !run.success {
        return Err(format!("budget-state failed in QEMU ({}):\n{}", run.status, run.last_lines()));
    }
    let (lines, _) = split_output(&run.stdout_text());
    Ok((flash, figure(&lines, "stack state")?))
}

/// Every budget a target's figures exceed, as messages.
pub(super) fn budget_failures(report: &TargetReport) -> Vec<String> {
    let mut failures = Vec::new();
    let target = &report.target;
    for (name, flash, budget) in [
        ("lower standard only", &report.lower_flash, LOWER_FLASH_BUDGET_BYTES),
        ("with the upper atmosphere", &report.upper_flash, UPPER_FLASH_BUDGET_BYTES),
    ] {
        if flash.cost() > budget {
            failures
                .push(format!("{target}: flash {name} is {} B, over the {budget} B budget", flash.cost()));
        }
    }
    let deepest = report.stack_state.iter().max().copied().unwrap_or(u64::MAX);
    if deepest + report.stack_result > STACK_BUDGET_BYTES {
        failures.push(format!(
            "{target}: a full-state evaluation takes {deepest} B of stack plus its {} B result, over the {STACK_BUDGET_BYTES} B budget",
            report.stack_result
        ));
    }
    failures
}

fn kib(bytes: u64) -> String {
    format!("{bytes} B ({:.1} KiB)", bytes as f64 / 1024.0)
}

/// The figures of every target, as printed at the end of the run.
pub(super) fn summary(reports: &[TargetReport]) -> String {
    let mut text = String::from("\nfirmware figures:\n");
    for r in reports {
        let [harness, lower, upper] = r.stack_state;
        let _ = writeln!(
            text,
            "{}: {} of {} values bit-identical to native; {} reference values checked; vector run {:.2} s in QEMU",
            r.target, r.identical, r.values, r.checked, r.harness_seconds
        );
        for (name, f, budget) in [
            ("lower only", &r.lower_flash, LOWER_FLASH_BUDGET_BYTES),
            ("with upper", &r.upper_flash, UPPER_FLASH_BUDGET_BYTES),
        ] {
            let _ = writeln!(
                text,
                "  flash {name}: {} (budget {}); of which libm {} B, soft-float routines {} B, upper table {} B; baseline firmware {} B",
                kib(f.cost()),
                kib(budget),
                f.libm,
                f.soft_float,
                f.table,
                f.empty
            );
        }
        let _ = writeln!(
            text,
            "  stack of a full-state evaluation: {harness} B (every vector altitude), {lower} B (lower only), {upper} B (with upper); + {} B result = {} B (budget {STACK_BUDGET_BYTES} B)",
            r.stack_result,
            harness.max(lower).max(upper) + r.stack_result
        );
        let _ = writeln!(
            text,
            "  stack of the species: {} B; of the harness's generic row evaluation: {} B; heap: none",
            r.stack_species, r.stack_row
        );
    }
    text
}

#[cfg(test)]
mod tests {
    use super::*;

    fn lines(text: &str) -> Vec<String> {
        text.lines().map(str::to_owned).collect()
    }

    #[test]
    fn harness_lines_are_told_from_bit_lines() {
        let (harness, bits) =
            split_output("# stack state 740 B\nf 1 q 0000000000000000\n# summary 1 values\n");
        assert_eq!(harness, ["stack state 740 B", "summary 1 values"]);
        assert_eq!(bits, ["f 1 q 0000000000000000"]);
        assert_eq!(figure(&harness, "stack state"), Ok(740));
        assert!(figure(&harness, "stack row").is_err());
    }

    #[test]
    fn allocator_symbols_are_found() {
        let clean = lines("main\n__aeabi_dadd\nlibm_malloc_free_helper");
        assert!(no_heap(&clean).is_ok());
        let heap = lines("main\n__rust_alloc\nmalloc");
        assert_eq!(no_heap(&heap), Err("links a heap allocator: __rust_alloc, malloc".to_owned()));
    }

    #[test]
    fn budgets_fail_when_exceeded() {
        let flash = |cost: u64| Flash { empty: 1000, state: 1000 + cost, libm: 0, soft_float: 0, table: 0 };
        let report = |lower: u64, upper: u64, stack: u64| TargetReport {
            target: "t".to_owned(),
            values: 1,
            checked: 1,
            identical: 1,
            harness_seconds: 0.0,
            lower_flash: flash(lower),
            upper_flash: flash(upper),
            stack_state: [stack, 0, 0],
            stack_result: 192,
            stack_species: 0,
            stack_row: 0,
        };
        assert!(budget_failures(&report(12 * 1024, 40 * 1024, 1024 - 192)).is_empty());
        assert_eq!(budget_failures(&report(12 * 1024 + 1, 0, 0)).len(), 1);
        assert_eq!(budget_failures(&report(0, 40 * 1024 + 1, 0)).len(), 1);
        assert!(budget_failures(&report(0, 0, 1024 - 191))[0].contains("stack"));
    }
}
