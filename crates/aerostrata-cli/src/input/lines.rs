//! Where a command's input comes from (a file, or stdin for `-` or no file, read through
//! a progress line) and the data lines in it: blank lines and `#` comments skipped, every
//! line numbered as an editor counts them, so that an error can name it.

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
    match path.filter(|path| path.as_os_str() != "-") {
        None => Ok(Progress::new(Box::new(io::stdin().lock()), None, when)),
        Some(path) => {
            let file = File::open(path)
                .map_err(|e| Failure::Input(format!("cannot open {}: {e}", path.display())))?;
            let size = file.metadata().ok().map(|m| m.len());
            Ok(Progress::new(Box::new(BufReader::with_capacity(1 << 16, file)), size, when))
        }
    }
}

/// The name of an input in messages: its path, or `stdin` for `-` or none.
pub fn source_name(path: Option<&Path>) -> String {
    match path.filter(|path| path.as_os_str() != "-") {
        Some(path) => path.display().to_string(),
        None => "stdin".to_owned(),
    }
}

/// The data lines of a text input, one at a time (any number of lines in bounded memory).
pub struct DataLines<R> {
    input: R,
    line: String,
    number: usize,
}

impl<R: BufRead> DataLines<R> {
    /// The lines of `input`.
    pub fn new(input: R) -> Self {
        DataLines { input, line: String::new(), number: 0 }
    }

    /// The next line that is neither blank nor a `#` comment, trimmed, with its number
    /// (from 1), or `None` at the end.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the line that cannot be read (not UTF-8, or a read error).
    pub fn next_line(&mut self) -> Result<Option<(usize, &str)>, Failure> {
        loop {
            self.line.clear();
            self.number += 1;
            let number = self.number;
            let read = self
                .input
                .read_line(&mut self.line)
                .map_err(|e| Failure::Input(format!("line {number}: cannot read: {e}")))?;
            if read == 0 {
                return Ok(None);
            }
            let text = self.line.trim();
            if !text.is_empty() && !text.starts_with('#') {
                return Ok(Some((number, self.line.trim())));
            }
        }
    }

    /// The underlying input.
    pub fn input_mut(&mut self) -> &mut R {
        &mut self.input
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn blank_lines_and_comments_are_skipped_but_counted() {
        let mut lines = DataLines::new("# altitudes\n0\n\n  11000  \n# done\n".as_bytes());
        assert_eq!(lines.next_line().unwrap(), Some((2, "0")));
        assert_eq!(lines.next_line().unwrap(), Some((4, "11000")));
        assert_eq!(lines.next_line().unwrap(), None);
    }

    #[test]
    fn a_line_that_is_not_text_is_named() {
        let mut lines = DataLines::new(&b"1\n\xff\n"[..]);
        assert_eq!(lines.next_line().unwrap(), Some((1, "1")));
        match lines.next_line() {
            Err(Failure::Input(message)) => {
                assert!(message.starts_with("line 2: cannot read: "), "{message}")
            }
            other => panic!("{other:?}"),
        }
    }
}
