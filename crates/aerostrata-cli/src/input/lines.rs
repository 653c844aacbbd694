//! Where a command's input comes from: a file, or stdin for `-` or no file, read through
//! a progress line.

use std::fs::File;
use std::io::{self, BufRead, BufReader};
use std::path::Path;

use crate::failure::Failure;
use crate::input::progress::{Progress, When};

/// A file, or stdin for `-` or no file, with a progress line when asked.
///
/// # Errors
/// [`Failure::Input`] naming the file when it cannot be opened.
pub fn open_input(path: Option<&Path>, when: When) -> Result<Progress<Box<dyn BufRead>>, Failure> {
    match path {
        None => Ok(Progress::new(Box::new(io::stdin().lock()), None, when)),
        Some(path) if path.as_os_str() == "-" => Ok(Progress::new(Box::new(io::stdin().lock()), None, when)),
        Some(path) => {
            let file = File::open(path)
                .map_err(|e| Failure::Input(format!("cannot open {}: {e}", path.display())))?;
            let size = file.metadata().ok().map(|m| m.len());
            Ok(Progress::new(Box::new(BufReader::with_capacity(1 << 16, file)), size, when))
        }
    }
}
