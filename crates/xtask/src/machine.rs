//! What a benchmark report says about the machine it ran on: logical CPUs, CPU model,
//! compiler, date and load average (`cargo xtask bench` and `cargo xtask wasm-bench`).

use std::ffi::OsStr;
use std::path::Path;
use std::time::{SystemTime, UNIX_EPOCH};
use std::{env, fs};

use crate::process::Cmd;

/// What the report says about the machine and the toolchain.
pub struct Machine {
    pub cpus: String,
    pub cpu_model: String,
    pub rustc: String,
    pub date: String,
    pub load_before: Option<[f64; 3]>,
}

impl Machine {
    pub fn probe(root: &Path) -> Self {
        let cpus = Cmd::new("nproc")
            .quiet()
            .capture()
            .ok()
            .map(|o| o.stdout_text().trim().to_owned())
            .or_else(|| std::thread::available_parallelism().ok().map(|n| n.to_string()))
            .unwrap_or_else(|| "unknown".to_owned());
        let cpu_model = fs::read_to_string("/proc/cpuinfo")
            .ok()
            .and_then(|info| {
                info.lines()
                    .filter_map(|line| line.split_once(':'))
                    .find(|(key, _)| key.trim() == "model name")
                    .map(|(_, value)| value.trim().to_owned())
            })
            .unwrap_or_else(|| "unknown (no model name in /proc/cpuinfo)".to_owned());
        let rustc = version(root, env::var_os("RUSTC").unwrap_or_else(|| "rustc".into()));
        Self { cpus, cpu_model, rustc, date: today_utc(), load_before: load_average() }
    }
}

/// The 1, 5 and 15 minute load averages, from `/proc/loadavg`.
pub fn load_average() -> Option<[f64; 3]> {
    let text = fs::read_to_string("/proc/loadavg").ok()?;
    let mut fields = text.split_whitespace().map(|f| f.parse::<f64>().ok());
    Some([fields.next()??, fields.next()??, fields.next()??])
}

pub fn load_text(load: Option<[f64; 3]>) -> String {
    load.map_or_else(|| "unknown".to_owned(), |[a, b, c]| format!("{a:.2}, {b:.2}, {c:.2}"))
}

/// Today's date in UTC as YYYY-MM-DD, from the system clock.
fn today_utc() -> String {
    let seconds = SystemTime::now().duration_since(UNIX_EPOCH).map_or(0, |d| d.as_secs());
    let (year, month, day) = civil_from_days((seconds / 86_400) as i64);
    format!("{year:04}-{month:02}-{day:02}")
}

/// The proleptic Gregorian date `days` days after 1970-01-01: count whole 400-year eras
/// (146 097 days each) from 0000-03-01, so that leap days fall at the end of a year.
fn civil_from_days(days: i64) -> (i64, u32, u32) {
    let shifted = days + 719_468; // days from 0000-03-01 to 1970-01-01
    let era = shifted.div_euclid(146_097);
    let day_of_era = shifted.rem_euclid(146_097);
    let year_of_era = (day_of_era - day_of_era / 1_460 + day_of_era / 36_524 - day_of_era / 146_096) / 365;
    let day_of_year = day_of_era - (365 * year_of_era + year_of_era / 4 - year_of_era / 100);
    let month_from_march = (5 * day_of_year + 2) / 153;
    let day = (day_of_year - (153 * month_from_march + 2) / 5 + 1) as u32;
    let month = if month_from_march < 10 { month_from_march + 3 } else { month_from_march - 9 } as u32;
    let year = year_of_era + era * 400 + i64::from(month <= 2);
    (year, month, day)
}

/// The first line `PROGRAM --version` prints (run in `root`, where a toolchain file
/// applies), or "unknown".
pub fn version(root: &Path, program: impl AsRef<OsStr>) -> String {
    Cmd::new(program)
        .arg("--version")
        .dir(root)
        .quiet()
        .capture()
        .ok()
        .and_then(|o| o.stdout_text().lines().next().map(|l| l.trim().to_owned()))
        .filter(|v| !v.is_empty())
        .unwrap_or_else(|| "unknown".to_owned())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dates_from_unix_days() {
        assert_eq!(civil_from_days(0), (1970, 1, 1));
        assert_eq!(civil_from_days(11_016), (2000, 2, 29));
        assert_eq!(civil_from_days(19_782), (2024, 2, 29));
        assert_eq!(civil_from_days(-1), (1969, 12, 31));
    }
}
