//! `--output` on what is already at the path: a regular file is replaced atomically, a
//! symbolic link is followed (the link stays, its target is replaced), and a character
//! device or a FIFO is written into, never renamed over. Run as root, the old behaviour
//! turned /dev/null into a regular file; these tests use a device node of their own in a
//! temporary folder, never the system's.

mod common;

use std::ffi::CString;
use std::fs;
use std::os::unix::fs::{FileTypeExt, OpenOptionsExt, PermissionsExt};
use std::path::{Path, PathBuf};

use common::{fails, run, scratch, stdout_of};

const TABLE: [&str; 4] = ["table", "--to", "2000", "--format"];

fn table_csv() -> String {
    stdout_of(&[&TABLE[..], &["csv"]].concat(), "")
}

fn write_table_to(path: &Path) {
    let (stdout, _) = run(&[&TABLE[..], &["csv", "-o", path.to_str().unwrap()]].concat(), "");
    assert!(stdout.is_empty());
}

/// Names in `dir`, to see that no partial file is left behind.
fn names(dir: &Path) -> Vec<String> {
    let mut names: Vec<String> =
        fs::read_dir(dir).unwrap().map(|e| e.unwrap().file_name().into_string().unwrap()).collect();
    names.sort();
    names
}

/// A fresh scratch folder `folder` and the path `name` in it, with the path as the C
/// string the libc call that makes a node there takes.
fn node_path(folder: &str, name: &str) -> (PathBuf, PathBuf, CString) {
    let dir = scratch(folder);
    let path = dir.join(name);
    let c_path = CString::new(path.to_str().unwrap()).unwrap();
    (dir, path, c_path)
}

#[test]
fn symbolic_links_are_followed_not_replaced() {
    let dir = scratch("out-links");
    let real = dir.join("real.csv");
    fs::write(&real, "old\n").unwrap();
    fs::set_permissions(&real, fs::Permissions::from_mode(0o640)).unwrap();
    let link = dir.join("link.csv");
    std::os::unix::fs::symlink("real.csv", &link).unwrap();
    write_table_to(&link);
    assert!(fs::symlink_metadata(&link).unwrap().file_type().is_symlink(), "the link stays a link");
    assert_eq!(fs::read_to_string(&real).unwrap(), table_csv(), "its target got the table");
    assert_eq!(fs::metadata(&real).unwrap().permissions().mode() & 0o777, 0o640, "permissions kept");

    // A chain of links through another folder, ending in a name that does not exist yet.
    let sub = dir.join("sub");
    fs::create_dir(&sub).unwrap();
    std::os::unix::fs::symlink("sub/../sub/new.csv", dir.join("hop.csv")).unwrap();
    std::os::unix::fs::symlink("hop.csv", dir.join("first.csv")).unwrap();
    write_table_to(&dir.join("first.csv"));
    assert_eq!(fs::read_to_string(sub.join("new.csv")).unwrap(), table_csv());
    assert!(fs::symlink_metadata(dir.join("first.csv")).unwrap().file_type().is_symlink());
    assert!(fs::symlink_metadata(dir.join("hop.csv")).unwrap().file_type().is_symlink());

    // A loop of links is refused, naming the option and the path.
    std::os::unix::fs::symlink("loop-b", dir.join("loop-a")).unwrap();
    std::os::unix::fs::symlink("loop-a", dir.join("loop-b")).unwrap();
    let looped = dir.join("loop-a");
    fails(2, &["table", "-o", looped.to_str().unwrap()], "", "--output: cannot create");
    assert_eq!(names(&dir), ["first.csv", "hop.csv", "link.csv", "loop-a", "loop-b", "real.csv", "sub"]);
    assert_eq!(names(&sub), ["new.csv"]);
    fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_fifo_is_written_into_and_stays_a_fifo() {
    let (dir, fifo, name) = node_path("out-fifo", "pipe");
    // SAFETY: a valid NUL-terminated path; mkfifo only creates a node.
    assert_eq!(unsafe { libc::mkfifo(name.as_ptr(), 0o600) }, 0, "mkfifo");
    // The read end is opened first without blocking, so that neither side waits on the
    // other (the table is far smaller than a pipe's buffer) and a broken run cannot hang
    // the test: a read with no writer left is simply the end of the data.
    let mut reader = fs::OpenOptions::new().read(true).custom_flags(libc::O_NONBLOCK).open(&fifo).unwrap();
    write_table_to(&fifo);
    let mut got = String::new();
    std::io::Read::read_to_string(&mut reader, &mut got).unwrap();
    assert_eq!(got, table_csv(), "the reader got the table through the FIFO");
    assert!(fs::symlink_metadata(&fifo).unwrap().file_type().is_fifo(), "still a FIFO");
    assert_eq!(names(&dir), ["pipe"], "no partial file beside it");
    fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_device_node_is_written_into_and_stays_a_device() {
    let (dir, device, name) = node_path("out-device", "null");
    // A node of the null device (major 1, minor 3 on Linux) of our own, in our own folder.
    // SAFETY: a valid NUL-terminated path; mknod only creates a node.
    let made = unsafe { libc::mknod(name.as_ptr(), libc::S_IFCHR | 0o666, libc::makedev(1, 3)) };
    if made != 0 {
        // Creating device nodes needs root (CAP_MKNOD); CI runs as root. Without root the
        // system's own /dev/null is safe to use: a user cannot rename over anything in /dev,
        // so a regression shows as a failed run, not as a broken machine.
        eprintln!("private device node not made ({}); using /dev/null", std::io::Error::last_os_error());
        write_table_to(Path::new("/dev/null"));
        assert!(fs::symlink_metadata("/dev/null").unwrap().file_type().is_char_device());
        fs::remove_dir_all(&dir).unwrap();
        return;
    }
    write_table_to(&device);
    let meta = fs::symlink_metadata(&device).unwrap();
    assert!(meta.file_type().is_char_device(), "still a character device, not a regular file");
    assert_eq!(meta.len(), 0);
    // Through a symbolic link too.
    let link = dir.join("link");
    std::os::unix::fs::symlink("null", &link).unwrap();
    write_table_to(&link);
    assert!(fs::symlink_metadata(&device).unwrap().file_type().is_char_device());
    assert_eq!(names(&dir), ["link", "null"], "no partial file beside it");
    fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_directory_is_refused_as_bad_input() {
    let dir = scratch("out-dir");
    fails(2, &["table", "-o", dir.to_str().unwrap()], "", "is a directory; give a file name inside it");
    assert!(fs::metadata(&dir).unwrap().is_dir());
    assert!(names(&dir).is_empty());
    fs::remove_dir_all(&dir).unwrap();
}
