//! Fresh folders outside the repository for the packaging checks: a package is proven by
//! using it where nothing of the checkout can be reached by a relative path, a search
//! path or a workspace. The folder is removed when the check is done, passed or failed.

use std::fs;
use std::path::{Path, PathBuf};
use std::time::{SystemTime, UNIX_EPOCH};

use crate::io_error;

/// A new, empty folder under the system's temporary directory, removed on drop.
pub struct Scratch {
    path: PathBuf,
}

impl Scratch {
    /// `TMPDIR/aerostrata-LABEL-PID-NANOS`; refused if that would lie inside `root` (a
    /// TMPDIR pointed into the checkout would let the consumer see the repository).
    pub fn new(root: &Path, label: &str) -> Result<Self, String> {
        let nanos = SystemTime::now().duration_since(UNIX_EPOCH).map_or(0, |d| d.subsec_nanos());
        let base = std::env::temp_dir();
        let path = base.join(format!("aerostrata-{label}-{}-{nanos}", std::process::id()));
        let root = root.canonicalize().unwrap_or_else(|_| root.to_path_buf());
        let inside = base.canonicalize().is_ok_and(|base| base.starts_with(&root));
        if inside {
            return Err(format!(
                "the temporary directory {} is inside the checkout {}: set TMPDIR to a folder outside it",
                base.display(),
                root.display()
            ));
        }
        fs::create_dir_all(&path).map_err(|e| io_error("create", &path, e))?;
        Ok(Self { path })
    }

    pub fn path(&self) -> &Path {
        &self.path
    }
}

impl Drop for Scratch {
    fn drop(&mut self) {
        // Best effort: a folder left under the temporary directory harms nothing.
        let _ = fs::remove_dir_all(&self.path);
    }
}

/// Copies the tree `from` to `to`, symbolic links as links (a C package's versioned
/// library names are links and must stay so).
pub fn copy_tree(from: &Path, to: &Path) -> Result<(), String> {
    fs::create_dir_all(to).map_err(|e| io_error("create", to, e))?;
    for entry in fs::read_dir(from).map_err(|e| io_error("read", from, e))? {
        let entry = entry.map_err(|e| io_error("read", from, e))?;
        let (path, dest) = (entry.path(), to.join(entry.file_name()));
        let kind = entry.file_type().map_err(|e| io_error("read", &path, e))?;
        if kind.is_symlink() {
            let target = fs::read_link(&path).map_err(|e| io_error("read", &path, e))?;
            std::os::unix::fs::symlink(&target, &dest).map_err(|e| io_error("link", &dest, e))?;
        } else if kind.is_dir() {
            copy_tree(&path, &dest)?;
        } else {
            fs::copy(&path, &dest).map_err(|e| io_error("copy", &path, e))?;
        }
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_scratch_folder_is_fresh_outside_the_checkout_and_removed_after() {
        let root = Path::new(env!("CARGO_MANIFEST_DIR"));
        let scratch = Scratch::new(root, "unit").unwrap();
        let path = scratch.path().to_path_buf();
        assert!(path.is_dir() && fs::read_dir(&path).unwrap().next().is_none());
        assert!(!path.starts_with(root));
        fs::write(path.join("file"), "x").unwrap();
        drop(scratch);
        assert!(!path.exists());
        // The temporary directory itself as the "checkout": refused.
        let error = Scratch::new(&std::env::temp_dir(), "unit").err().unwrap();
        assert!(error.contains("inside the checkout"), "{error}");
    }

    #[test]
    fn links_are_copied_as_links() {
        let root = Path::new(env!("CARGO_MANIFEST_DIR"));
        let scratch = Scratch::new(root, "unit-copy").unwrap();
        let from = scratch.path().join("from");
        fs::create_dir_all(from.join("lib")).unwrap();
        fs::write(from.join("lib/libx.so.1.0"), "elf").unwrap();
        std::os::unix::fs::symlink("libx.so.1.0", from.join("lib/libx.so")).unwrap();
        let to = scratch.path().join("to");
        copy_tree(&from, &to).unwrap();
        assert_eq!(fs::read_link(to.join("lib/libx.so")).unwrap(), Path::new("libx.so.1.0"));
        assert_eq!(fs::read_to_string(to.join("lib/libx.so")).unwrap(), "elf");
    }
}
