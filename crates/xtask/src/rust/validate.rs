//! `cargo xtask validate`: docs/validation.md, from the reference vectors and the
//! independent mpmath check. With `--check` it fails when the committed report differs
//! from a fresh one, or when any vector misses its tolerance.

use std::fmt::Write as _;
use std::fs;
use std::path::Path;

use super::vectors::{self, Rule};
use crate::io_error;
use crate::process::Cmd;

const REPORT: &str = "docs/validation.md";

/// Residuals worth knowing about that no vector carries.
const NOTES: &str = "\n## Known residuals\n\n\
- Mean free path at sea level: remembered from the printed table as 6.6328E-08 m; the\n  \
  standard's defining formula L = 1 / (sqrt(2) pi sigma^2 n) with its own constants gives\n  \
  6.6332E-08 m (6e-5 relative, 8.6 times the printed tolerance). The cell is left out of\n  \
  the vectors rather than loosened; aerostrata follows the defining formula, which the\n  \
  mpmath check confirms to 4e-15. The other remembered mean-free-path values were not\n  \
  confident enough to keep, so this column has no printed points yet.\n\
- 86 km: the standard quotes T = 186.8673 K, which is T_M at exactly 84.852 km'\n  \
  times M/M0 = 0.999579; 86 km geometric is 84.852 05 km', where the formulas give\n  \
  186.86720 K. Both round to the table's 186.867.\n\
- The join at 86 km: the standard's five 86 km species, summed with T7 = 186.8673 K,\n  \
  give p = 0.37338449 Pa and rho = 6.9578798e-6 kg/m^3, against 0.37338046 Pa and\n  \
  6.9578238e-6 kg/m^3 from its layers at 86 km: 1.0789e-5 and 8.056e-6 relative (N\n  \
  7.99e-6, M 6.6e-8; the same sums in mpmath at 30 digits agree to every digit quoted).\n  \
  aerostrata adds hydrogen's continuation (below), 1.6727e-6 of N at 86 km, so its own\n  \
  step there is +1.2462e-5 in p, +8.114e-6 in rho, +9.662e-6 in N and -1.548e-6 in M:\n  \
  measured as its value at 86 km (the layers) against its first value above it (the\n  \
  next f64 altitude, the species); the scipy self-check's integration gives the same\n  \
  hydrogen to 7e-12. 86 km itself belongs to the layers.\n\
- 91 to 110 km: the ellipse's constants are derived at full precision from its joins\n  \
  (186.8673 K with zero gradient at 91 km, 240 K with 12 K/km at 110 km): Tc =\n  \
  263.190480 K, A = -76.323180 K, a = -19.942875 km, which round to the printed 263.1905,\n  \
  -76.3232 and -19.9429 km. The printed values end the ellipse at 239.999727 K, so with\n  \
  them p = N k T would rise by 1.14e-6 across 110 km. Temperatures here differ from the\n  \
  printed constants' by at most 2.7e-4 K (at 110 km), inside the table's 0.005 K.\n\
- 150 km: the standard lists hydrogen from 150 km up only, so taken literally its\n  \
  3.767e11 /m^3 appear at once there and p and N rise by 7.26e-6 (rho by 3.0e-7) across\n  \
  150 km. aerostrata continues hydrogen's own equation (its flux, molecular diffusion\n  \
  and, below 115 km, the standard's eddy diffusion) down to 86 km, and the scipy reference\n  \
  does the same independently: n_H is continuous at 150 km and p, rho and N fall across\n  \
  every join. A departure from the standard's totals below 150 km of at most 7.27e-6 in\n  \
  N and p and 3.04e-7 in rho (just below 150 km), 1.67e-6 in N at 86 km; the other five\n  \
  species are unchanged.\n\
- Above 500 km the remembered pressures, number densities and densities lie above the\n  \
  equations' solution by a margin growing from 1.3e-4 at 500 km to 1.0e-3 at 1000 km\n  \
  (within the 2e-3 asked for there). The crate's integration converges to 2e-13 and agrees\n  \
  with the independent scipy integration to 1e-8, so the residual lies between the printed\n  \
  table and the equations as read here (the standard's own numerical solution, or a detail\n  \
  of its helium and hydrogen treatment); it is not loosened away.\n\
- The species reading that reproduces the printed tables: the standard computes the\n  \
  species in sequence, so the N in each molecular-diffusion coefficient is N2 alone for O\n  \
  and O2 and N2 + O + O2 for Ar and He. With one N of all five species instead, O comes out\n  \
  3 % low at 100 km and the total density 6 % low at 500 km.\n";

pub fn run(root: &Path, check_only: bool) -> Result<(), String> {
    let (report, failures) = build(root)?;
    let path = root.join(REPORT);
    if check_only {
        let committed = fs::read_to_string(&path).unwrap_or_default();
        if committed != report {
            return Err(format!("{REPORT} is stale: run `cargo xtask validate` and commit it"));
        }
    } else {
        fs::write(&path, &report).map_err(|e| io_error("write", &path, e))?;
        eprintln!("wrote {REPORT}");
    }
    if failures.is_empty() {
        Ok(())
    } else {
        Err(format!("{} reference values missed their tolerance:\n{}", failures.len(), failures.join("\n")))
    }
}

/// The report's text and every miss.
fn build(root: &Path) -> Result<(String, Vec<String>), String> {
    let mut out = String::new();
    let mut failures = Vec::new();
    out.push_str(
        "# Validation report\n\n\
         Generated by `cargo xtask validate` from `tests/vectors/*.csv` and\n\
         `tests/reference/usa76_mpmath.py`; the test command regenerates it and fails if it\n\
         differs from this file or if any value misses its tolerance. Relative errors are\n\
         |computed - reference| / |reference|. A `printed` tolerance is half a unit of the last\n\
         digit of each reference value as printed, so its relative size varies from value to\n\
         value; the column shows the loosest one.\n",
    );
    for file in vectors::read_all(root)? {
        let results = vectors::check(&file)?;
        let relative = file.path.strip_prefix(root).unwrap_or(&file.path).display().to_string();
        let _ = writeln!(out, "\n## `{relative}` (model `{}`)\n", file.model);
        for line in &file.source {
            let _ = writeln!(out, "> {line}");
        }
        out.push_str(
            "\n| quantity | points | worst relative error | tolerance | worst error / tolerance | result |\n\
             | --- | ---: | ---: | --- | ---: | --- |\n",
        );
        for result in results {
            let tolerance = match result.rule {
                Rule::Printed => {
                    format!(
                        "half a unit of the last printed digit (up to {:.1e} relative)",
                        result.loosest_relative_tolerance
                    )
                }
                Rule::Relative(r) => format!("{r:.1e} relative"),
                Rule::Absolute(a) => format!("{a:e} absolute"),
            };
            if result.points == 0 {
                let _ = writeln!(out, "| {} | 0 | - | {tolerance} | - | no values |", result.column);
                continue;
            }
            let verdict = if result.failures.is_empty() { "pass" } else { "FAIL" };
            let _ = writeln!(
                out,
                "| {} | {} | {:.2e} | {} | {:.2} | {} |",
                result.column, result.points, result.worst_relative, tolerance, result.worst_ratio, verdict
            );
            failures.extend(result.failures);
        }
    }
    out.push_str(
        "\n## Independent high-precision check (mpmath, 30 digits)\n\n\
         `tests/reference/usa76_mpmath.py` implements the standard's equations in mpmath at 30\n\
         significant digits and compares them with `aerostrata eval` at pseudo-random\n\
         altitudes (fixed seed) and every layer base. Its summary:\n\n```text\n",
    );
    Cmd::new("cargo").args(["build", "--quiet", "-p", "aerostrata-cli"]).dir(root).run()?;
    let binary = crate::target_dir(root).join("debug/aerostrata");
    // The report must not depend on where the binary was built.
    let binary_text = binary.to_str().ok_or("non-UTF-8 path")?;
    // A script's summary goes into the report; a script that fails is a miss of the check.
    let mut script =
        |out: &mut String, args: &[&str]| match Cmd::new("python3").args(args).dir(root).quiet().stdout() {
            Ok(text) => out.push_str(&text.replace(binary_text, "aerostrata")),
            Err(message) => failures.push(message),
        };
    script(&mut out, &["tests/reference/usa76_mpmath.py", binary_text]);
    out.push_str(
        "```\n\n## Independent integration above 86 km (scipy)\n\n\
         `tests/reference/usa76_upper_scipy.py` integrates the same diffusion equations with\n\
         scipy's DOP853 (rtol 1e-12, restarted wherever a coefficient changes form) and compares\n\
         species, N, p, rho and M with `aerostrata eval --species` at a dozen altitudes from 86 to\n\
         1000 km (limit 1e-6 relative; T to 1e-12). Its summary:\n\n```text\n",
    );
    script(&mut out, &["tests/reference/usa76_upper_scipy.py", binary_text]);
    out.push_str(
        "```\n\n## Independent check of the compressible-flow vectors (mpmath, 30 digits)\n\n\
         `tests/reference/naca1135_mpmath.py` writes the perfect-gas relations of NACA Report\n\
         1135 in mpmath at 30 significant digits, checks them against identities that must hold\n\
         exactly (`--self-test`), and checks every cell of `tests/vectors/naca1135_*.csv` with\n\
         the files' own tolerances (`--check-vectors`), the check the remembered table values\n\
         went through before they were kept. Its summaries:\n\n```text\n",
    );
    script(&mut out, &["tests/reference/naca1135_mpmath.py", "--self-test"]);
    script(
        &mut out,
        &[
            "tests/reference/naca1135_mpmath.py",
            "--check-vectors",
            "tests/vectors/naca1135_isentropic.csv",
            "tests/vectors/naca1135_normal_shock.csv",
        ],
    );
    out.push_str(
        "```\n\n## Independent check of the hydrostatic-offset days (mpmath, 30 digits)\n\n\
         `tests/reference/hydrostatic_offset_mpmath.py` integrates the hydrostatic equation\n\
         through the shifted temperature profile by quadrature (not the layers' closed forms\n\
         the code uses), checks that with no offset it gives the standard's base pressures,\n\
         and checks every cell of `tests/vectors/hydrostatic_offset_*.csv` against the\n\
         integral. Its summaries:\n\n```text\n",
    );
    script(&mut out, &["tests/reference/hydrostatic_offset_mpmath.py", "--self-test"]);
    for day in ["hot", "cold"] {
        let file = format!("tests/vectors/hydrostatic_offset_{day}.csv");
        script(&mut out, &["tests/reference/hydrostatic_offset_mpmath.py", "--check-vectors", &file]);
    }
    out.push_str("```\n");
    out.push_str(NOTES);
    Ok((out, failures))
}
