//! `cargo xtask icount [--against REV]`: instructions per evaluation of the core's hot
//! paths, counted by `valgrind --tool=callgrind` over the workload of
//! crates/aerostrata/examples/icount.rs (the criterion benchmarks' work, run once). With
//! `--against REV` the same workload is built on the core of another git revision (in a
//! temporary worktree under target/icount) and counted too, so that a change's cost shows
//! as a ratio of instruction counts: unlike wall-clock time on a shared machine, they
//! repeat to the last digit. Writes its section of docs/performance.md.

use std::fmt::Write as _;
use std::fs;
use std::path::{Path, PathBuf};

use crate::io_error;
use crate::process::Cmd;
use crate::target_dir;

/// The workload's cases and how many evaluations each makes (examples/icount.rs).
const CASES: [(&str, f64, &str); 7] = [
    ("state", 204_800.0, "`US1976.state(alt)`, 0 to 86 km"),
    ("density", 204_800.0, "`US1976.density_kg_m3(alt)`, 0 to 86 km"),
    ("upper", 204_800.0, "`US1976.state(alt)`, 86 to 1000 km"),
    ("sounding", 204_800.0, "`state(alt)` of a humid 200-row sounding"),
    ("flight", 200_000.0, "one sample of the flight scan"),
    ("flight_vehicle", 200_000.0, "one sample of the scan with a Cd table and drag"),
    ("flight_winds", 200_000.0, "one sample of the vector scan through winds: alpha, q-alpha"),
];

/// The most the scan with winds may cost, as a multiple of the scan without.
const WINDS_GOAL: f64 = 1.5;

const EXAMPLE: &str = "crates/aerostrata/examples/icount.rs";

/// Builds the workload in `checkout` (into `target`) and returns the executable.
fn build(checkout: &Path, target: &Path) -> Result<PathBuf, String> {
    Cmd::new("cargo")
        .args([
            "build",
            "--quiet",
            "--release",
            "-p",
            "aerostrata",
            "--example",
            "icount",
            "--features",
            "std,upper",
        ])
        .envs([("CARGO_TARGET_DIR", target)])
        .dir(checkout)
        .run()?;
    Ok(target.join("release").join("examples").join("icount"))
}

/// The instructions callgrind counts for one case.
fn count(exe: &Path, case: &str, out: &Path) -> Result<u64, String> {
    let output = Cmd::new("valgrind")
        .args(["--tool=callgrind"])
        .arg(format!("--callgrind-out-file={}", out.display()))
        .arg(exe)
        .arg(case)
        .quiet()
        .capture()?;
    let text = output.stderr_text();
    text.lines()
        .find_map(|line| line.split("Collected :").nth(1))
        .and_then(|n| n.trim().parse().ok())
        .ok_or_else(|| format!("callgrind printed no count for {case}:\n{text}"))
}

fn counts(exe: &Path, work: &Path, label: &str) -> Result<Vec<u64>, String> {
    CASES.iter().map(|(case, _, _)| count(exe, case, &work.join(format!("{label}-{case}.out")))).collect()
}

pub fn run(root: &Path, against: Option<&str>) -> Result<(), String> {
    crate::setup::apt_install(root, &["valgrind"])?;
    let work = target_dir(root).join("icount");
    fs::create_dir_all(&work).map_err(|e| io_error("create", &work, e))?;
    let exe = build(root, &target_dir(root))?;
    let now = counts(&exe, &work, "now")?;
    let before = match against {
        None => None,
        Some(rev) => {
            let checkout = work.join("checkout");
            if checkout.exists() {
                let _ =
                    Cmd::new("git").args(["worktree", "remove", "--force"]).arg(&checkout).dir(root).run();
            }
            Cmd::new("git").args(["worktree", "add", "--detach"]).arg(&checkout).arg(rev).dir(root).run()?;
            let result = (|| {
                let example = checkout.join(EXAMPLE);
                fs::create_dir_all(example.parent().unwrap_or(&checkout))
                    .map_err(|e| io_error("create", &example, e))?;
                fs::copy(root.join(EXAMPLE), &example).map_err(|e| io_error("copy to", &example, e))?;
                let exe = build(&checkout, &work.join("checkout-target"))?;
                counts(&exe, &work, "before")
            })();
            Cmd::new("git").args(["worktree", "remove", "--force"]).arg(&checkout).dir(root).run()?;
            Some((rev, result?))
        }
    };
    let mut table = String::from("| case | one evaluation is | instructions per evaluation |");
    if let Some((rev, _)) = &before {
        let _ = write!(table, " at `{rev}` | now / then |");
    }
    table.push('\n');
    table.push_str(if before.is_some() { "|---|---|---:|---:|---:|\n" } else { "|---|---|---:|\n" });
    for (i, (case, evaluations, what)) in CASES.iter().enumerate() {
        let per = now[i] as f64 / evaluations;
        let _ = write!(table, "| `{case}` | {what} | {per:.1} |");
        if let Some((_, then)) = &before {
            let old = then[i] as f64 / evaluations;
            let _ = write!(table, " {old:.1} | {:.4} |", per / old);
        }
        table.push('\n');
        eprintln!("{case}: {per:.1} instructions per evaluation");
    }
    let per = |case: &str| {
        CASES.iter().position(|(c, _, _)| *c == case).map_or(f64::NAN, |i| now[i] as f64 / CASES[i].1)
    };
    let winds = per("flight_winds") / per("flight");
    let verdict = if winds <= WINDS_GOAL { "met" } else { "NOT met" };
    let _ = write!(
        table,
        "\nThe scan with winds, the wind's angle of attack and q-alpha costs {winds:.2} times the \
         scan without (`flight_winds` / `flight`; goal: at most {WINDS_GOAL}x, {verdict}).\n"
    );
    eprintln!("flight_winds / flight: {winds:.2}x (goal at most {WINDS_GOAL}x, {verdict})");
    let (begin, end) = (crate::report::ICOUNT.begin, crate::report::ICOUNT.end);
    let section = format!(
        "{begin}
## Instruction counts

Measured by `cargo xtask icount{against}` (crates/xtask/src/icount.rs): the workload of
crates/aerostrata/examples/icount.rs (the benchmarks' work, run once) under `valgrind
--tool=callgrind`, whose instruction counts repeat to the last digit whatever else the
machine does, unlike the nanoseconds above. The whole program is counted (building the
sounding and the altitudes included, under 1 % of each case), divided by the
evaluations the case makes. This is how a change that must not cost speed (a
restructuring, a new door) is checked: on a shared two-core machine the nanoseconds
above move by tens of per cent from one run of `cargo xtask bench` to the next, and the
goals' verdicts with them, while these counts move only when the work does.{against_text}

{table}{end}",
        against = against.map_or(String::new(), |rev| format!(" --against {rev}")),
        against_text = against.map_or(String::new(), |rev| format!(
            " The same workload was also built on the core of `{rev}` and counted in the same run; the last \
             column is the ratio, now over then."
        )),
    );
    let path = root.join("docs/performance.md");
    let report = fs::read_to_string(&path).unwrap_or_default();
    fs::write(&path, crate::report::ICOUNT.splice(&report, &section))
        .map_err(|e| io_error("write", &path, e))?;
    eprintln!("wrote docs/performance.md");
    Ok(())
}
