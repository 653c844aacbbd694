//! `--output FILE`: where a command writes, and how a file appears only when the command
//! succeeds.

use std::fs::OpenOptions;
use std::io::{self, BufWriter, Write};
use std::path::{Path, PathBuf};

use crate::failure::Failure;

/// Where a command writes: stdout, or `--output PATH`.
///
/// A regular file (or a new name) appears only when the command succeeds: it is written
/// beside its final name and renamed at the end, so a failed run never leaves a
/// half-written file, nor clobbers an old one. Symbolic links are followed first, so the
/// file they point to is replaced and the link stays. Anything that is not a regular file
/// (a character device such as /dev/null, a FIFO, a terminal) is written directly and never
/// renamed over: replacing a device node with a regular file would break every other
/// program that uses it.
pub struct Destination {
    writer: BufWriter<Box<dyn Write>>,
    file: Option<(PathBuf, PathBuf)>,
}

/// Follows symbolic links from `path` to the name that is finally written (which may not
/// exist yet). Relative link targets are taken from the link's own folder, as the kernel
/// does.
fn resolve_links(path: &Path) -> Result<PathBuf, String> {
    let mut current = path.to_path_buf();
    // The kernel's own limit on a chain of links (Linux's MAXSYMLINKS).
    for _ in 0..40 {
        match std::fs::symlink_metadata(&current) {
            Ok(meta) if meta.file_type().is_symlink() => {
                let link = std::fs::read_link(&current).map_err(|e| e.to_string())?;
                current = match current.parent() {
                    Some(folder) if link.is_relative() => folder.join(link),
                    _ => link,
                };
            }
            _ => return Ok(current),
        }
    }
    Err("too many levels of symbolic links".into())
}

impl Destination {
    /// Stdout, or the file `path`.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the path when it is a directory or cannot be opened or
    /// created.
    pub fn open(path: Option<&Path>) -> Result<Self, Failure> {
        let Some(path) = path else {
            // 64 KiB as for a file: a million rows of CSV are some 360 MB, written in eight
            // times fewer system calls than through the default 8 KiB.
            let writer = BufWriter::with_capacity(1 << 16, Box::new(io::stdout().lock()) as Box<dyn Write>);
            return Ok(Destination { writer, file: None });
        };
        let cannot = |why: &dyn std::fmt::Display| {
            Failure::Input(format!("--output: cannot create {}: {why}", path.display()))
        };
        let target = resolve_links(path).map_err(|e| cannot(&e))?;
        let existing = match std::fs::metadata(&target) {
            Ok(meta) => Some(meta),
            Err(e) if e.kind() == io::ErrorKind::NotFound => None,
            Err(e) => return Err(cannot(&e)),
        };
        match existing {
            Some(meta) if meta.is_dir() => Err(Failure::Input(format!(
                "--output: {} is a directory; give a file name inside it",
                path.display()
            ))),
            Some(meta) if !meta.is_file() => {
                // A device, FIFO or socket: write into it, as a shell redirection would.
                let file = OpenOptions::new().write(true).open(&target).map_err(|e| cannot(&e))?;
                Ok(Destination { writer: BufWriter::with_capacity(1 << 16, Box::new(file)), file: None })
            }
            existing => {
                let name = target.file_name().ok_or_else(|| {
                    Failure::Input(format!("--output: '{}' is not a file name", path.display()))
                })?;
                let mut partial = std::ffi::OsString::from(".");
                partial.push(name);
                partial.push(format!(".partial-{}", std::process::id()));
                let temporary = target.with_file_name(partial);
                // create_new: never follow or reuse whatever already has the temporary name.
                let file = OpenOptions::new()
                    .write(true)
                    .create_new(true)
                    .open(&temporary)
                    .map_err(|e| cannot(&e))?;
                if let Some(meta) = existing {
                    // The replacement keeps the old file's permissions.
                    let _ = file.set_permissions(meta.permissions());
                }
                Ok(Destination {
                    writer: BufWriter::with_capacity(1 << 16, Box::new(file)),
                    file: Some((temporary, target)),
                })
            }
        }
    }

    /// Flushes and, for a regular file, gives it its final name.
    ///
    /// # Errors
    /// Writing or renaming fails, or the target became something other than a regular
    /// file while the command ran (it is then left as it is).
    pub fn commit(mut self) -> Result<(), Failure> {
        self.writer.flush()?;
        if let Some((temporary, target)) = self.file.take() {
            let replaceable = match std::fs::symlink_metadata(&target) {
                Ok(meta) => meta.file_type().is_file(),
                Err(e) => e.kind() == io::ErrorKind::NotFound,
            };
            let renamed = if replaceable {
                std::fs::rename(&temporary, &target)
            } else {
                Err(io::Error::other("it is no longer a regular file; left as it is"))
            };
            renamed.map_err(|e| {
                let _ = std::fs::remove_file(&temporary);
                Failure::Io(io::Error::new(e.kind(), format!("cannot write {}: {e}", target.display())))
            })?;
        }
        Ok(())
    }
}

impl Write for Destination {
    fn write(&mut self, buf: &[u8]) -> io::Result<usize> {
        self.writer.write(buf)
    }

    fn write_all(&mut self, buf: &[u8]) -> io::Result<()> {
        self.writer.write_all(buf)
    }

    fn flush(&mut self) -> io::Result<()> {
        self.writer.flush()
    }
}

impl Drop for Destination {
    fn drop(&mut self) {
        if let Some((temporary, _)) = self.file.take() {
            let _ = std::fs::remove_file(temporary);
        }
    }
}
