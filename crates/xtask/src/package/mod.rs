//! The Rust crates as users get them: each published crate built, tested and documented
//! from its .crate in a folder that cannot see the repository (`crates`), the minimum
//! supported Rust version built (`msrv`), and one version stated everywhere with
//! CHANGELOG.md in shape (`versions`).

pub mod crates;
pub mod msrv;
pub mod versions;

use std::path::Path;

/// `cargo xtask package [--check]`: the .crate files under target/package; with
/// `--check`, each built, tested and documented from its unpacked form.
pub fn run(root: &Path, args: &[String]) -> Result<(), String> {
    match args {
        [] => crates::run(root, false),
        [flag] if flag == "--check" => crates::run(root, true),
        _ => Err("usage: cargo xtask package [--check]".to_owned()),
    }
}
