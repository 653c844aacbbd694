//! The C-firmware link test of `cargo xtask firmware`: tests/firmware/c (a bare-metal C
//! program with its own start-up code and linker script) built with Debian's
//! arm-none-eabi gcc and newlib against the no_std `libaerostrata.a` for
//! thumbv7em-none-eabihf and the committed header, run in QEMU on the MPS2 AN386 board.
//!
//! The program prints a bit line for every value of the standard-atmosphere vectors; this
//! module generates the list it works through (`cases.h`, from the same files and in the
//! same order as `vectors::bit_lines`), compares the printed bits with the native ones,
//! and requires the program's own checks to pass and QEMU to exit 0.

use std::fmt::Write as _;
use std::fs;
use std::path::Path;

use super::qemu;
use crate::io_error;
use crate::process::Cmd;
use crate::rust::vectors::{self, split_output, VectorFile};
use crate::setup::{self, TargetToolchain};

const TARGET: &str = "thumbv7em-none-eabihf";
const SOURCES: [&str; 2] = ["tests/firmware/c/main.c", "tests/firmware/c/startup.c"];
const LINKER_SCRIPT: &str = "tests/firmware/c/link.ld";
/// The float ABI of the library (thumbv7em-none-eabihf): hard float on the M4F's FPU.
const CPU_FLAGS: [&str; 4] = ["-mcpu=cortex-m4", "-mthumb", "-mfloat-abi=hard", "-mfpu=fpv4-sp-d16"];

/// What the run gave: values compared bit for bit, and the program's own checks.
pub struct Report {
    pub identical: usize,
    pub tally: String,
    pub seconds: f64,
}

/// The state columns the standard defines only where its air is a continuum.
const CONTINUUM: [&str; 4] = [
    "speed_of_sound_m_s",
    "dynamic_viscosity_pa_s",
    "kinematic_viscosity_m2_s",
    "thermal_conductivity_w_m_k",
];

/// The C accessor of a vector column: (kind, struct, field).
fn accessor(column: &str) -> Result<(&'static str, &'static str, String), String> {
    const STATE_FIELDS: [&str; 20] = [
        "geometric_altitude_m",
        "geopotential_altitude_m",
        "temperature_k",
        "molecular_temperature_k",
        "pressure_pa",
        "density_kg_m3",
        "speed_of_sound_m_s",
        "dynamic_viscosity_pa_s",
        "kinematic_viscosity_m2_s",
        "thermal_conductivity_w_m_k",
        "gravity_m_s2",
        "pressure_scale_height_m",
        "number_density_m3",
        "mean_particle_speed_m_s",
        "mean_free_path_m",
        "collision_frequency_hz",
        "mean_molar_mass_kg_kmol",
        "temperature_ratio",
        "pressure_ratio",
        "density_ratio",
    ];
    if let Some(species) = column.strip_prefix("n_") {
        let field = species.to_ascii_lowercase();
        if ["n2_m3", "o_m3", "o2_m3", "ar_m3", "he_m3", "h_m3"].contains(&field.as_str()) {
            return Ok(("CASE_SPECIES", "AerostrataSpecies", field));
        }
    }
    let field = column.to_ascii_lowercase();
    if !STATE_FIELDS.contains(&field.as_str()) {
        return Err(format!("column {column} has no field in the C interface"));
    }
    let kind = if CONTINUUM.contains(&field.as_str()) { "CASE_CONTINUUM" } else { "CASE_STATE" };
    Ok((kind, "AerostrataState", field))
}

/// The standard-atmosphere files among the vectors, with their temperature offsets.
fn standard_files(files: Vec<VectorFile>) -> Result<Vec<(VectorFile, f64)>, String> {
    let mut out = Vec::new();
    for file in files {
        let mut words = file.model.split_whitespace();
        if words.next() != Some("us1976") {
            continue;
        }
        let offset = match words.next().and_then(|w| w.strip_prefix("offset=")) {
            None => 0.0,
            Some(k) => k.parse().map_err(|_| format!("bad offset in model '{}'", file.model))?,
        };
        out.push((file, offset));
    }
    Ok(out)
}

/// cases.h: one entry per value, in the order of `vectors::bit_lines` over the same files.
fn cases_header(files: &[(VectorFile, f64)]) -> Result<(String, usize), String> {
    let mut body = String::new();
    let mut count = 0usize;
    for (file, offset) in files {
        let stem = file.path.file_stem().map(|s| s.to_string_lossy().into_owned()).unwrap_or_default();
        let kind = match file.input.as_str() {
            "geometric_altitude_m" => "AEROSTRATA_GEOMETRIC",
            "geopotential_altitude_m" => "AEROSTRATA_GEOPOTENTIAL",
            other => return Err(format!("{}: unknown input column {other}", file.path.display())),
        };
        for (line, cells) in &file.rows {
            let input: f64 = cells[0]
                .parse()
                .map_err(|_| format!("{}:{line}: bad altitude '{}'", file.path.display(), cells[0]))?;
            for column in &file.columns {
                let (case_kind, strukt, field) = accessor(column)?;
                let _ = writeln!(
                    body,
                    "    {{\"{stem}\", \"{}\", 0x{:016x}ULL, {kind}, {offset:?}, \"{column}\", {case_kind}, offsetof({strukt}, {field})}},",
                    cells[0],
                    input.to_bits()
                );
                count += 1;
            }
        }
    }
    let header = format!(
        "/* Generated by `cargo xtask firmware` from tests/vectors (the standard-atmosphere files); do not edit. */\n\
         #define CASE_COUNT {count}\n\
         static const struct bit_case CASES[CASE_COUNT] = {{\n{body}}};\n"
    );
    Ok((header, count))
}

/// Builds and runs the C firmware; Err on any bit difference, failed check or bad exit.
pub fn run(root: &Path, toolchain: TargetToolchain) -> Result<Report, String> {
    setup::apt_install(root, &["gcc-arm-none-eabi", "libnewlib-arm-none-eabi"])?;
    let package = crate::c::package::bare_metal(root, TARGET, toolchain)?;
    let files = standard_files(vectors::read_all(root)?)?;
    let native = vectors::bit_lines(files.iter().map(|(f, _)| f))?;
    let (header, count) = cases_header(&files)?;
    if count != native.len() {
        return Err(format!("cases.h lists {count} values, the native bit lines {}", native.len()));
    }
    let work = crate::target_dir(root).join("firmware-c");
    fs::create_dir_all(&work).map_err(|e| io_error("create", &work, e))?;
    fs::write(work.join("cases.h"), header).map_err(|e| format!("cannot write cases.h: {e}"))?;
    let elf = work.join("c-firmware.elf");
    let s = |p: &Path| p.to_string_lossy().into_owned();
    let include_package = format!("-I{}", s(&package.prefix.join("include")));
    let include_work = format!("-I{}", s(&work));
    let script = format!("-T{}", s(&root.join(LINKER_SCRIPT)));
    let sources: Vec<String> = SOURCES.iter().map(|p| s(&root.join(p))).collect();
    let mut args: Vec<&str> = CPU_FLAGS.to_vec();
    args.extend([
        "-std=c99",
        "-O2",
        "-Wall",
        "-Wextra",
        "-Werror",
        "-ffunction-sections",
        "-fdata-sections",
        "--specs=rdimon.specs",
        &include_package,
        &include_work,
    ]);
    args.extend(sources.iter().map(String::as_str));
    let static_lib = s(&package.static_lib);
    let elf_arg = s(&elf);
    args.extend([
        &static_lib,
        "-lm",
        &script,
        "-Wl,--gc-sections",
        "-Wl,--no-warn-execstack",
        "-o",
        &elf_arg,
    ]);
    Cmd::new("arm-none-eabi-gcc").args(args).dir(root).run()?;

    let run = qemu::run(TARGET, &elf)?;
    let (lines, bits) = split_output(&format!("{}\n{}", run.stdout_text(), run.stderr_text()));
    for line in lines.iter().filter(|l| l.starts_with("FAIL") || l.starts_with("error")) {
        eprintln!("C firmware: {line}");
    }
    let tally = lines.iter().rev().find(|l| l.ends_with(" failed")).cloned().unwrap_or_default();
    if !run.success || !tally.ends_with(" 0 failed") {
        return Err(format!(
            "the C firmware failed in QEMU ({}; '{tally}'); last output:\n{}",
            run.status,
            run.last_lines()
        ));
    }
    let identical = vectors::compare_bits("the C firmware (Cortex-M4F)", &native, &bits)?;
    Ok(Report { identical, tally, seconds: run.seconds })
}
