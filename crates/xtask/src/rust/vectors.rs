//! Checking the core against the reference vectors of `tests/vectors` (read by
//! `vector_file`). The atmosphere files have the input column `geometric_altitude_m` or
//! `geopotential_altitude_m` and state quantities named as in `aerostrata eval` as their
//! other columns. The compressible-flow models take the input column `mach`:
//! `isentropic gamma=G` and `normal_shock gamma=G`. What each column names is computed
//! by `vector_values`, which the firmware harness shares.

use std::fmt::Write as _;
use std::fs;
use std::path::Path;

use aerostrata::{Altitude, Atmosphere, HydrostaticOffset, PerfectGas, State, TemperatureOffset, US1976};

use super::vector_values;
use crate::io_error;

pub use super::vector_file::{half_unit_of_last_digit, read, read_all, Rule, VectorFile};

/// What one column of one file came to.
#[derive(Debug, Clone)]
pub struct ColumnResult {
    pub column: String,
    pub rule: Rule,
    pub points: usize,
    pub worst_relative: f64,
    /// The loosest relative tolerance any point had (for `printed`, it varies by value).
    pub loosest_relative_tolerance: f64,
    /// The largest |error| / tolerance; at most 1 when every point passes.
    pub worst_ratio: f64,
    pub failures: Vec<String>,
}

/// The model a vector file names: `us1976 [offset=K]` or `hydrostatic_offset offset=K
/// [p0=PA]`.
fn model(name: &str) -> Result<Box<dyn Atmosphere>, String> {
    let mut words = name.split_whitespace();
    let base = words.next().unwrap_or_default();
    let mut parameter = |key: &str| -> Result<Option<f64>, String> {
        match words.next() {
            None => Ok(None),
            Some(word) => word
                .strip_prefix(key)
                .and_then(|value| value.parse().ok())
                .map(Some)
                .ok_or_else(|| format!("bad parameter '{word}' in model '{name}' (expected {key}NUMBER)")),
        }
    };
    let message = |e: aerostrata::Error| e.to_string();
    match base {
        "us1976" => match parameter("offset=")? {
            None => Ok(Box::new(US1976)),
            Some(offset) => Ok(Box::new(TemperatureOffset::new(US1976, offset).map_err(message)?)),
        },
        "hydrostatic_offset" => {
            let offset = parameter("offset=")?.ok_or_else(|| format!("model '{name}' needs offset=K"))?;
            let p0 = parameter("p0=")?.unwrap_or(aerostrata::constants::SEA_LEVEL_PRESSURE_PA);
            Ok(Box::new(HydrostaticOffset::new(offset, p0).map_err(message)?))
        }
        _ => Err(format!("unknown model '{name}'")),
    }
}

/// What a file's `# model:` line names: an atmosphere, or a compressible-flow relation.
enum Evaluator {
    Atmosphere(Box<dyn Atmosphere>),
    Isentropic(PerfectGas),
    NormalShock(PerfectGas),
}

impl Evaluator {
    fn for_model(name: &str) -> Result<Self, String> {
        let mut words = name.split_whitespace();
        let kind = words.next().unwrap_or_default();
        if kind != "isentropic" && kind != "normal_shock" {
            return model(name).map(Evaluator::Atmosphere);
        }
        let gas = match words.next().map(|w| w.strip_prefix("gamma=")) {
            None => PerfectGas::AIR,
            Some(Some(gamma)) => {
                let gamma: f64 = gamma.parse().map_err(|_| format!("bad gamma in model '{name}'"))?;
                PerfectGas::new(gamma).map_err(|e| format!("model '{name}': {e}"))?
            }
            Some(None) => return Err(format!("unknown parameter in model '{name}'")),
        };
        Ok(if kind == "isentropic" { Evaluator::Isentropic(gas) } else { Evaluator::NormalShock(gas) })
    }

    /// Every value one row's input gives, by column name (`None` where a quantity is not
    /// defined there).
    fn row(&self, input_column: &str, input: f64) -> Result<Row, String> {
        let message = |e: aerostrata::Error| e.to_string();
        match self {
            Evaluator::Atmosphere(atmosphere) => {
                let altitude = match input_column {
                    "geometric_altitude_m" => Altitude::geometric_m(input),
                    "geopotential_altitude_m" => Altitude::geopotential_m(input),
                    other => return Err(format!("unknown input column {other}")),
                }
                .map_err(message)?;
                let state = atmosphere.state(altitude).map_err(message)?;
                Ok(Row::State(Box::new(state), altitude))
            }
            _ if input_column != "mach" => {
                Err(format!("unknown input column {input_column} (expected mach)"))
            }
            Evaluator::Isentropic(gas) => {
                Ok(Row::Flow(vector_values::isentropic(gas, input).map_err(message)?.to_vec()))
            }
            Evaluator::NormalShock(gas) => {
                Ok(Row::Flow(vector_values::normal_shock(gas, input).map_err(message)?.to_vec()))
            }
        }
    }
}

/// The computed values of one row.
enum Row {
    State(Box<State>, Altitude),
    Flow(Vec<(&'static str, f64)>),
}

impl Row {
    /// The value `column` of `file` names, `None` where it is undefined; Err if the
    /// file's model has no such quantity.
    fn value_in(&self, file: &VectorFile, column: &str) -> Result<Option<f64>, String> {
        let value = match self {
            Row::State(state, altitude) => vector_values::atmosphere(state, *altitude, column),
            Row::Flow(values) => vector_values::flow(values, column),
        };
        value.ok_or_else(|| {
            format!("{}: no quantity named {column} for model {}", file.path.display(), file.model)
        })
    }
}

/// One row of a vector file with what the core computes for it.
struct Evaluated<'a> {
    line: usize,
    /// The cells as written, the input first.
    cells: &'a [String],
    input: f64,
    row: Row,
}

/// Every row of `file`, evaluated.
fn evaluate(file: &VectorFile) -> Result<Vec<Evaluated<'_>>, String> {
    let name = file.path.display();
    let evaluator = Evaluator::for_model(&file.model).map_err(|e| format!("{name}: {e}"))?;
    let mut rows = Vec::with_capacity(file.rows.len());
    for (line, cells) in &file.rows {
        let input: f64 =
            cells[0].parse().map_err(|_| format!("{name}:{line}: bad {} '{}'", file.input, cells[0]))?;
        let row = evaluator.row(&file.input, input).map_err(|e| format!("{name}:{line}: {e}"))?;
        rows.push(Evaluated { line: *line, cells, input, row });
    }
    Ok(rows)
}

/// Evaluates every row of `file` and compares each checked cell.
pub fn check(file: &VectorFile) -> Result<Vec<ColumnResult>, String> {
    let name = file.path.display();
    let mut results: Vec<ColumnResult> = file
        .columns
        .iter()
        .map(|column| ColumnResult {
            column: column.clone(),
            rule: file.rules[column],
            points: 0,
            worst_relative: 0.0,
            loosest_relative_tolerance: 0.0,
            worst_ratio: 0.0,
            failures: Vec::new(),
        })
        .collect();
    for Evaluated { line, cells, input, row } in evaluate(file)? {
        for (result, written) in results.iter_mut().zip(&cells[1..]) {
            if written.is_empty() {
                continue;
            }
            let reference: f64 = written
                .parse()
                .map_err(|_| format!("{name}:{line}: bad value '{written}' in {}", result.column))?;
            let ours = row
                .value_in(file, &result.column)?
                .ok_or_else(|| format!("{name}:{line}: {} is not defined there", result.column))?;
            let tolerance = match result.rule {
                Rule::Printed => half_unit_of_last_digit(written)
                    .ok_or_else(|| format!("{name}:{line}: cannot read the digits of '{written}'"))?,
                Rule::Relative(r) => r * reference.abs(),
                Rule::Absolute(a) => a,
            };
            let error = (ours - reference).abs();
            result.points += 1;
            result.worst_relative = result.worst_relative.max(error / reference.abs());
            result.loosest_relative_tolerance =
                result.loosest_relative_tolerance.max(tolerance / reference.abs());
            result.worst_ratio = result.worst_ratio.max(error / tolerance);
            if error > tolerance {
                result.failures.push(format!(
                    "{name}:{line}: {} at {} = {input}: computed {ours}, reference {written} (tolerance {tolerance:e})",
                    result.column, file.input
                ));
            }
        }
    }
    Ok(results)
}

/// The bit pattern of every quantity of every row of every file, one line each:
/// `FILE INPUT COLUMN BITS`, where FILE is the file's stem, INPUT the row's input cell as
/// written, COLUMN the header name and BITS the f64 as 16 lower-case hex digits (or
/// `undefined` where the model defines no value there). Every host (native, wasm,
/// firmware) writes this same format, so that a plain line comparison proves or refutes
/// bit identity. Empty reference cells are included: identity is about our outputs.
pub fn bit_lines<'a>(files: impl IntoIterator<Item = &'a VectorFile>) -> Result<Vec<String>, String> {
    let mut lines = Vec::new();
    for file in files {
        let stem = file.path.file_stem().map(|s| s.to_string_lossy().into_owned()).unwrap_or_default();
        for Evaluated { cells, row, .. } in evaluate(file)? {
            for column in &file.columns {
                let value = row.value_in(file, column)?;
                let bits = value.map_or_else(|| "undefined".to_owned(), |v| format!("{:016x}", v.to_bits()));
                lines.push(format!("{stem} {} {column} {bits}", cells[0]));
            }
        }
    }
    Ok(lines)
}

/// Compares another host's bit lines with the native ones, line by line, and returns how
/// many are identical; Err names, for every difference, the vector (file and input), the
/// quantity and both values (bits and decimal).
pub fn compare_bits(host: &str, native: &[String], other: &[String]) -> Result<usize, String> {
    let mut differences = Vec::new();
    let mut identical = 0usize;
    for (index, (ours, theirs)) in native.iter().zip(other).enumerate() {
        let (key_native, bits_native) = ours.rsplit_once(' ').unwrap_or((ours, ""));
        let (key_other, bits_other) = theirs.rsplit_once(' ').unwrap_or((theirs, ""));
        if key_native != key_other {
            differences.push(format!(
                "line {}: the native build has '{key_native}', {host} has '{key_other}' (the lists are out of step)",
                index + 1
            ));
            break;
        }
        if bits_native == bits_other {
            identical += 1;
            continue;
        }
        let mut words = key_native.splitn(3, ' ');
        let (file, input, quantity) =
            (words.next().unwrap_or(""), words.next().unwrap_or(""), words.next().unwrap_or(""));
        differences.push(format!(
            "{file} at input {input}, {quantity}: native {}, {host} {}",
            describe(bits_native),
            describe(bits_other)
        ));
    }
    if native.len() != other.len() {
        differences.push(format!("the native build gave {} values, {host} {}", native.len(), other.len()));
    }
    if differences.is_empty() {
        Ok(identical)
    } else {
        let shown = differences.len().min(50);
        let mut message =
            format!("{} bit difference(s) between the native build and {host}:\n", differences.len());
        for difference in &differences[..shown] {
            let _ = writeln!(message, "  {difference}");
        }
        if shown < differences.len() {
            let _ = writeln!(message, "  ... and {} more", differences.len() - shown);
        }
        Err(message)
    }
}

/// Another host's output split into its own notes (`# ...` lines, without the prefix:
/// the firmware harness's figures, say) and its bit lines.
pub fn split_output(stdout: &str) -> (Vec<String>, Vec<String>) {
    let mut harness = Vec::new();
    let mut bits = Vec::new();
    for line in stdout.lines().map(str::trim_end).filter(|l| !l.is_empty()) {
        match line.strip_prefix("# ") {
            Some(rest) => harness.push(rest.to_owned()),
            None => bits.push(line.to_owned()),
        }
    }
    (harness, bits)
}

/// `cargo xtask bits --compare FILE`: another host's bit lines (e.g. the wasm module's,
/// written by its Node script) against the native ones.
pub fn compare_file(root: &Path, host: &str, path: &Path) -> Result<(), String> {
    let text = fs::read_to_string(path).map_err(|e| io_error("read", path, e))?;
    let (_, other) = split_output(&text);
    let native = bit_lines(&read_all(root)?)?;
    let identical = compare_bits(host, &native, &other)?;
    eprintln!("{host}: {identical} values bit-identical to the native build");
    Ok(())
}

/// A bit field of a bit line, with its decimal value: `0x40d61a0000000000 (22632.0)`.
fn describe(bits: &str) -> String {
    match u64::from_str_radix(bits, 16) {
        Ok(b) if bits.len() == 16 => format!("0x{bits} ({:?})", f64::from_bits(b)),
        _ => format!("'{bits}'"),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn last_digit_rule() {
        assert_eq!(half_unit_of_last_digit("1.01325E+05"), Some(0.5));
        assert_eq!(half_unit_of_last_digit("288.150"), Some(0.0005));
        assert_eq!(half_unit_of_last_digit("86000"), Some(0.5));
        assert!((half_unit_of_last_digit("6.6328E-08").unwrap() - 0.5e-12).abs() < 1e-27);
        // NACA Report 1135 prints ratios without the leading zero.
        assert_eq!(".99303".parse::<f64>(), Ok(0.99303));
        assert!((half_unit_of_last_digit(".99303").unwrap() - 0.5e-5).abs() < 1e-20);
    }

    #[test]
    fn flow_models_are_read_and_checked() {
        let dir = std::env::temp_dir().join(format!("aerostrata-vectors-{}", std::process::id()));
        fs::create_dir_all(&dir).unwrap();
        let path = dir.join("flow.csv");
        // p/p0 at Mach 2 is 0.127804525... : "0.1278" passes, "0.1279" misses its half unit.
        fs::write(
            &path,
            "# source\n# model: isentropic gamma=1.4\n# tolerance: p_p0 printed\nmach,p_p0\n2.0,.1278\n2.0,.1279\n",
        )
        .unwrap();
        let results = check(&read(&path).unwrap()).unwrap();
        assert_eq!(results[0].points, 2);
        assert_eq!(results[0].failures.len(), 1, "{:?}", results[0].failures);
        fs::write(
            &path,
            "# model: normal_shock gamma=1.3\n# tolerance: m2 rel 1e-12\nmach,m2\n2,0.5628780357842335\n",
        )
        .unwrap();
        let results = check(&read(&path).unwrap()).unwrap();
        assert!(results[0].failures.is_empty(), "{:?}", results[0].failures);
        fs::write(&path, "# model: normal_shock gamma=1.4\n# tolerance: m2 printed\nmach,m2\n0.5,1.0\n")
            .unwrap();
        assert!(check(&read(&path).unwrap()).unwrap_err().contains("upstream Mach number 0.5"));
        fs::write(&path, "# model: isentropic gamma=3\n# tolerance: p_p0 printed\nmach,p_p0\n1,1\n").unwrap();
        assert!(check(&read(&path).unwrap()).is_err());
        fs::write(&path, "# model: isentropic\n# tolerance: wrong printed\nmach,wrong\n1,1\n").unwrap();
        assert!(check(&read(&path).unwrap()).unwrap_err().contains("no quantity named wrong"));
        fs::write(&path, "# model: isentropic\n# tolerance: p_p0 printed\naltitude_m,p_p0\n1,1\n").unwrap();
        assert!(check(&read(&path).unwrap()).unwrap_err().contains("expected mach"));
        fs::remove_dir_all(&dir).unwrap();
    }

    #[test]
    fn identical_lines_are_counted() {
        let native = lines("usa76_lower 0 temperature_K 4072026666666666\nf 1 q undefined");
        assert_eq!(compare_bits("m4", &native, &native.clone()), Ok(2));
    }

    fn lines(text: &str) -> Vec<String> {
        text.lines().map(str::to_owned).collect()
    }

    #[test]
    fn a_difference_names_vector_quantity_and_both_values() {
        let native = lines("usa76_lower 11000 pressure_Pa 40d61a0000000000");
        let other = lines("usa76_lower 11000 pressure_Pa 40d61a0000000001");
        let error = compare_bits("thumbv7m-none-eabi", &native, &other).unwrap_err();
        assert!(error.contains("usa76_lower at input 11000, pressure_Pa"), "{error}");
        assert!(error.contains("native 0x40d61a0000000000 (22632.0)"), "{error}");
        assert!(error.contains("thumbv7m-none-eabi 0x40d61a0000000001"), "{error}");
    }

    #[test]
    fn missing_extra_and_shifted_lines_fail() {
        let native = lines("a 1 x 0000000000000000\na 2 x 0000000000000000");
        assert!(compare_bits("h", &native, &native[..1]).unwrap_err().contains("gave 2 values, h 1"));
        let shifted = lines("a 2 x 0000000000000000\na 1 x 0000000000000000");
        assert!(compare_bits("h", &native, &shifted).unwrap_err().contains("out of step"));
        let undefined = lines("a 1 x undefined\na 2 x 0000000000000000");
        assert!(compare_bits("h", &native, &undefined).unwrap_err().contains("h 'undefined'"));
    }

    #[test]
    fn bit_lines_cover_every_cell_in_one_format() {
        let files = read_all(&crate::workspace_root()).unwrap();
        let lines = bit_lines(&files).unwrap();
        let cells: usize = files.iter().map(|f| f.rows.len() * f.columns.len()).sum();
        assert_eq!(lines.len(), cells);
        // Sea level of the standard is 288.15 K exactly (the standard's defining value).
        let sea_level = format!("usa76_lower 0 temperature_K {:016x}", 288.15f64.to_bits());
        assert!(lines.contains(&sea_level), "no line {sea_level}");
        assert!(lines.iter().all(|l| l.split(' ').count() == 4));
    }

    /// Every vector of every file within its tolerance: the Rust door's reference test.
    #[test]
    fn core_meets_every_reference_vector() {
        let root = crate::workspace_root();
        let files = read_all(&root).unwrap();
        assert!(!files.is_empty(), "no vector files");
        let mut failures = Vec::new();
        let mut checked = 0;
        for file in &files {
            for result in check(file).unwrap() {
                checked += result.points;
                failures.extend(result.failures);
            }
        }
        assert!(checked > 100, "only {checked} values checked");
        assert!(failures.is_empty(), "{} misses:\n{}", failures.len(), failures.join("\n"));
    }
}
