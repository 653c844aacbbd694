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

/// The text of an open file read whole (a sounding, a winds file), its lines bounded as
/// [`DataLines`] bounds them, comments and blank lines kept as blank lines so that line
/// numbers stay the file's; `check_header` sees the text up to the first data line (the
/// header) before the rest is read, so that a file that is not what it should be is
/// refused at once, however large.
///
/// # Errors
/// A message naming the line: it cannot be read, is too long, or the header's check fails.
pub fn read_text(
    file: File,
    mut check_header: impl FnMut(&str) -> Result<(), String>,
) -> Result<String, String> {
    let mut lines = DataLines::new(BufReader::with_capacity(1 << 16, file));
    let mut text = String::new();
    let mut count = 0;
    while let Some((number, line)) = lines.next_line().map_err(|e| match e {
        Failure::Input(message) => message,
        Failure::Io(error) => error.to_string(),
    })? {
        for _ in count + 1..number {
            text.push('\n');
        }
        text.push_str(line);
        text.push('\n');
        if count == 0 {
            check_header(&text)?;
        }
        count = number;
    }
    Ok(text)
}

/// The name of an input in messages: its path, or `stdin` for `-` or none.
pub fn source_name(path: Option<&Path>) -> String {
    match path.filter(|path| path.as_os_str() != "-") {
        Some(path) => path.display().to_string(),
        None => "stdin".to_owned(),
    }
}

/// The longest line read, in bytes: the core's bound for every door.
pub use aerostrata::table::MAX_LINE_BYTES;

/// The data lines of a text input, one at a time (any number of lines in bounded memory,
/// none longer than [`MAX_LINE_BYTES`]).
pub struct DataLines<R> {
    input: R,
    line: Vec<u8>,
    number: usize,
}

impl<R: BufRead> DataLines<R> {
    /// The lines of `input`.
    pub fn new(input: R) -> Self {
        DataLines { input, line: Vec::new(), number: 0 }
    }

    /// The next line that is neither blank nor a `#` comment, trimmed, with its number
    /// (from 1), or `None` at the end, by the core's rule of lines
    /// ([`aerostrata::table::data_line`]: a UTF-8 byte-order mark, as editors write it,
    /// dropped).
    ///
    /// # Errors
    /// [`Failure::Input`] naming the line that cannot be read: longer than
    /// [`MAX_LINE_BYTES`], not UTF-8, or a read error.
    pub fn next_line(&mut self) -> Result<Option<(usize, &str)>, Failure> {
        loop {
            self.number += 1;
            if !self.read_line()? {
                return Ok(None);
            }
            let bytes = &self.line[..];
            let text = std::str::from_utf8(bytes).map_err(|e| {
                Failure::Input(format!(
                    "line {}: cannot read: not UTF-8 text (byte {} of the line is 0x{:02x}); save the file as \
                     UTF-8",
                    self.number,
                    e.valid_up_to() + 1,
                    bytes.get(e.valid_up_to()).copied().unwrap_or(0)
                ))
            })?;
            if let Some(trimmed) = aerostrata::table::data_line(text) {
                // Where the trimmed text lies, so that the borrow of the line ends here.
                let from = trimmed.as_ptr() as usize - text.as_ptr() as usize;
                let to = from + trimmed.len();
                let text = std::str::from_utf8(&self.line[from..to]).unwrap_or_default();
                return Ok(Some((self.number, text)));
            }
        }
    }

    /// Reads the next line (without its end) into `self.line`; `false` at the end.
    fn read_line(&mut self) -> Result<bool, Failure> {
        self.line.clear();
        let number = self.number;
        let mut any = false;
        loop {
            let buffer = match self.input.fill_buf() {
                Ok(buffer) => buffer,
                Err(e) if e.kind() == io::ErrorKind::Interrupted => continue,
                Err(e) => return Err(Failure::Input(format!("line {number}: cannot read: {e}"))),
            };
            if buffer.is_empty() {
                return Ok(any);
            }
            any = true;
            let (chunk, used, end) = match buffer.iter().position(|b| *b == b'\n') {
                Some(at) => (&buffer[..at], at + 1, true),
                None => (buffer, buffer.len(), false),
            };
            if self.line.len() + chunk.len() > MAX_LINE_BYTES {
                let start = String::from_utf8_lossy(if self.line.is_empty() {
                    &chunk[..chunk.len().min(160)]
                } else {
                    &self.line[..self.line.len().min(160)]
                });
                let error = aerostrata::table::LineTooLong { line: number, start: &start };
                return Err(Failure::Input(format!("line {number}: {error}")));
            }
            self.line.extend_from_slice(chunk);
            self.input.consume(used);
            if end {
                return Ok(true);
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

    /// Common practice, no source: a line is bounded, so an endless line (here an
    /// endless reader of commas) is refused after `MAX_LINE_BYTES`, not read forever.
    #[test]
    fn an_endless_line_is_refused_at_the_bound() {
        let mut lines = DataLines::new(io::BufReader::new(io::repeat(b',')));
        match lines.next_line() {
            Err(Failure::Input(message)) => {
                assert!(message.starts_with("line 1: longer than 65536 bytes"), "{message}");
                assert!(message.contains("',,,,") && message.len() < 200, "{message}");
            }
            other => panic!("{other:?}"),
        }
        // A line of exactly the bound is read.
        let text = format!("{}\n2\n", "1".repeat(MAX_LINE_BYTES));
        let mut lines = DataLines::new(text.as_bytes());
        assert_eq!(lines.next_line().unwrap().map(|(n, t)| (n, t.len())), Some((1, MAX_LINE_BYTES)));
        assert_eq!(lines.next_line().unwrap(), Some((2, "2")));
    }

    /// Common practice, no source: editors may open a UTF-8 file with a byte-order mark,
    /// which is no part of the first heading (before, a flight file's header with one was
    /// refused, the mark invisible in the message). Files joined by `cat` carry one at
    /// the start of a later line, which the core's rule of lines drops as well.
    #[test]
    fn a_byte_order_mark_is_skipped() {
        let mut lines = DataLines::new("\u{feff}time_s,altitude_m\n\u{feff}1\n".as_bytes());
        assert_eq!(lines.next_line().unwrap(), Some((1, "time_s,altitude_m")));
        assert_eq!(lines.next_line().unwrap(), Some((2, "1")));
    }
}
