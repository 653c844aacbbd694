//! Reading the reference vectors of `tests/vectors` (their format: tests/vectors/README.md):
//! `#` comment lines first, among them `# model: NAME` and one `# tolerance: COLUMN RULE`
//! per checked column, where RULE is `printed` (half a unit of the last digit of each
//! value as written), `rel X` or `abs X`; then a header whose first column is the input;
//! then rows, empty cells unchecked.
//!
//! Only the standard library: this one file also serves the firmware harness's build
//! script (tests/firmware/build.rs includes it with `#[path]`), so that the host and the
//! firmware read the files by the same code.

use std::collections::BTreeMap;
use std::fs;
use std::path::{Path, PathBuf};

/// How close a computed value must be to a reference value.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Rule {
    /// Half a unit of the last printed digit of each reference value.
    Printed,
    /// A relative tolerance.
    Relative(f64),
    /// An absolute tolerance in the column's unit.
    Absolute(f64),
}

/// One parsed vector file.
pub struct VectorFile {
    pub path: PathBuf,
    /// The comment lines before the machine-readable ones: the source.
    pub source: Vec<String>,
    pub model: String,
    pub rules: BTreeMap<String, Rule>,
    pub input: String,
    pub columns: Vec<String>,
    /// Rows as (line number, cells as written).
    pub rows: Vec<(usize, Vec<String>)>,
}

pub fn read_all(root: &Path) -> Result<Vec<VectorFile>, String> {
    let dir = root.join("tests/vectors");
    let mut paths: Vec<PathBuf> = fs::read_dir(&dir)
        .map_err(|e| format!("cannot read {}: {e}", dir.display()))?
        .filter_map(|entry| entry.ok().map(|e| e.path()))
        .filter(|p| p.extension().is_some_and(|x| x == "csv"))
        .collect();
    paths.sort();
    paths.iter().map(|p| read(p)).collect()
}

pub fn read(path: &Path) -> Result<VectorFile, String> {
    let text = fs::read_to_string(path).map_err(|e| format!("cannot read {}: {e}", path.display()))?;
    let name = path.display();
    let mut file = VectorFile {
        path: path.to_path_buf(),
        source: Vec::new(),
        model: String::new(),
        rules: BTreeMap::new(),
        input: String::new(),
        columns: Vec::new(),
        rows: Vec::new(),
    };
    for (index, line) in text.lines().enumerate() {
        let number = index + 1;
        let line = line.trim();
        if line.is_empty() {
            continue;
        }
        if let Some(comment) = line.strip_prefix('#') {
            let comment = comment.trim();
            if let Some(model) = comment.strip_prefix("model:") {
                file.model = model.trim().to_owned();
            } else if let Some(rule) = comment.strip_prefix("tolerance:") {
                let (column, rule) = parse_rule(rule).map_err(|e| format!("{name}:{number}: {e}"))?;
                file.rules.insert(column, rule);
            } else if file.model.is_empty() && file.rules.is_empty() {
                file.source.push(comment.to_owned());
            }
            continue;
        }
        let cells: Vec<String> = line.split(',').map(|c| c.trim().to_owned()).collect();
        if file.columns.is_empty() {
            file.input = cells[0].clone();
            file.columns = cells[1..].to_vec();
        } else if cells.len() != file.columns.len() + 1 {
            return Err(format!(
                "{name}:{number}: {} cells, the header has {}",
                cells.len(),
                file.columns.len() + 1
            ));
        } else {
            file.rows.push((number, cells));
        }
    }
    if file.model.is_empty() {
        return Err(format!("{name}: no '# model:' line"));
    }
    for column in &file.columns {
        if !file.rules.contains_key(column) {
            return Err(format!("{name}: column {column} has no '# tolerance:' line"));
        }
    }
    if let Some(stray) = file.rules.keys().find(|rule| !file.columns.contains(rule)) {
        return Err(format!("{name}: '# tolerance: {stray}' names no column of the header"));
    }
    Ok(file)
}

fn parse_rule(text: &str) -> Result<(String, Rule), String> {
    let words: Vec<&str> = text.split_whitespace().collect();
    let number = |w: Option<&&str>| -> Result<f64, String> {
        w.and_then(|w| w.parse::<f64>().ok()).filter(|x| *x > 0.0).ok_or(format!("bad tolerance '{text}'"))
    };
    let rule = match words.get(1).copied() {
        Some("printed") => Rule::Printed,
        Some("rel") => Rule::Relative(number(words.get(2))?),
        Some("abs") => Rule::Absolute(number(words.get(2))?),
        _ => return Err(format!("bad tolerance '{text}': expected COLUMN printed|rel X|abs X")),
    };
    Ok((words[0].to_owned(), rule))
}

/// Half a unit of the last digit of a number as written: "1.01325E+05" -> 0.5,
/// "288.150" -> 0.0005, "86000" -> 0.5.
pub fn half_unit_of_last_digit(written: &str) -> Option<f64> {
    let lower = written.to_ascii_lowercase();
    let (mantissa, exponent) = match lower.split_once('e') {
        Some((m, e)) => (m, e.parse::<i32>().ok()?),
        None => (lower.as_str(), 0),
    };
    let decimals = mantissa.split_once('.').map_or(0, |(_, fraction)| fraction.len() as i32);
    Some(0.5 * 10f64.powi(exponent - decimals))
}
