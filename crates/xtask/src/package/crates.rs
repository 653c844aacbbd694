//! The crates as a registry would hand them out: `cargo package` for the core, the CLI and
//! the C binding, then (with `--check`) each .crate unpacked into a fresh folder under
//! the system's temporary directory, where the repository cannot be seen, and built,
//! tested and documented there for every feature set it documents (docs.rs's among
//! them). The CLI and the C binding build against the core's unpacked .crate through a
//! `[patch]`, with their packed Cargo.lock otherwise as packed (`--locked`). A crate
//! whose unpacked files, toolchain and checks are unchanged since its last passing check
//! is not rebuilt (a stamp under the target directory).

use std::fs;
use std::path::{Path, PathBuf};
use std::time::Instant;

use crate::io_error;
use crate::package::versions::{workspace_version, Version};
use crate::process::Cmd;
use crate::scratch::Scratch;

/// A crate that is published, and how its .crate is checked.
#[derive(Debug)]
pub struct Publishable {
    pub name: &'static str,
    /// Depends on the core, so builds against the core's .crate.
    uses_core: bool,
    /// The feature sets `cargo doc` must document without warnings: (label, arguments).
    doc_sets: &'static [(&'static str, &'static [&'static str])],
}

const NO_DEFAULT: &str = "--no-default-features";

pub const CRATES: [Publishable; 3] = [
    Publishable {
        name: "aerostrata",
        uses_core: false,
        doc_sets: &[
            ("default features", &[]),
            ("no default features", &[NO_DEFAULT]),
            ("alloc", &[NO_DEFAULT, "--features", "alloc"]),
            ("std", &[NO_DEFAULT, "--features", "std"]),
            ("upper", &[NO_DEFAULT, "--features", "upper"]),
            ("upper-loadable", &[NO_DEFAULT, "--features", "upper-loadable"]),
            ("serde", &[NO_DEFAULT, "--features", "serde"]),
            ("rayon", &["--features", "rayon"]),
            ("all features", &["--all-features"]),
        ],
    },
    Publishable { name: "aerostrata-cli", uses_core: true, doc_sets: &[("default features", &[])] },
    Publishable {
        name: "aerostrata-c",
        uses_core: true,
        doc_sets: &[
            ("default features", &[]),
            (
                "bare metal: malloc and panic-handler, no std",
                &[NO_DEFAULT, "--features", "malloc,panic-handler"],
            ),
            ("bare metal with the upper atmosphere", &[NO_DEFAULT, "--features", "upper,malloc"]),
        ],
    },
];

/// Files every .crate must carry (the licences are the repository's, through symbolic
/// links that `cargo package` follows).
const REQUIRED: [&str; 5] = ["Cargo.toml", "Cargo.lock", "README.md", "LICENSE-MIT", "LICENSE-APACHE"];

/// No single file of a .crate above this: generated tables are about 60 KiB; anything
/// larger is test data that belongs in the repository, not the package.
const LARGEST_FILE_BYTES: u64 = 256 * 1024;

/// The property tests' seed, as in the test command, so that the run repeats.
const PROPTEST_SEED: &str = "19761976";

/// `cargo xtask package [--check]`.
pub fn run(root: &Path, check: bool) -> Result<(), String> {
    let started = Instant::now();
    let manifest = root.join("Cargo.toml");
    let manifest = fs::read_to_string(&manifest).map_err(|e| io_error("read", &manifest, e))?;
    let version = workspace_version(&manifest)?;
    let files = pack(root, &version)?;
    if !check {
        return Ok(());
    }
    let scratch = Scratch::new(root, "crates")?;
    let mut dirs = Vec::new();
    for (krate, file) in CRATES.iter().zip(&files) {
        let place = scratch.path().to_string_lossy();
        // -m: the files dated now. cargo packs every file dated 2006-07-24 (for
        // reproducible .crate files), so with those dates a rebuild in the shared target
        // directory would find last run's outputs newer than the sources and keep them.
        Cmd::new("tar").args(["-xzmf"]).arg(file).args(["-C", &place]).quiet().run()?;
        let dir = scratch.path().join(format!("{}-{}", krate.name, version.text));
        inspect(&dir)?;
        dirs.push(dir);
    }
    let toolchain = Cmd::new("rustc").arg("-vV").quiet().stdout()?;
    let target = crate::target_dir(root).join("package-check");
    let core = dirs[0].clone();
    for (krate, dir) in CRATES.iter().zip(&dirs) {
        let mut trees = vec![dir.as_path()];
        if krate.uses_core {
            trees.push(&core);
        }
        let key = format!("{:016x}", fingerprint(&trees, &format!("{toolchain}{krate:?}{PROPTEST_SEED}"))?);
        let stamp = target.join("stamps").join(krate.name);
        if fs::read_to_string(&stamp).is_ok_and(|s| s == key) {
            eprintln!(
                "  {} {}: as at its last passing check (stamp {key}); not rebuilt",
                krate.name, version.text
            );
            continue;
        }
        verify(krate, dir, &core, &target, &version)?;
        let stamps = target.join("stamps");
        fs::create_dir_all(&stamps).map_err(|e| io_error("create", &stamps, e))?;
        fs::write(&stamp, key).map_err(|e| io_error("write", &stamp, e))?;
    }
    eprintln!(
        "  the core, the CLI and the C binding build, test and document from their .crate files ({:.0} s)",
        started.elapsed().as_secs_f64()
    );
    Ok(())
}

/// `cargo package` of the three crates (not verified by cargo: [`verify`] does it from
/// the unpacked files); their paths, in [`CRATES`]' order.
fn pack(root: &Path, version: &Version) -> Result<Vec<PathBuf>, String> {
    let mut args = vec!["package", "--no-verify", "--allow-dirty"];
    for krate in &CRATES {
        args.extend(["-p", krate.name]);
    }
    Cmd::new("cargo").args(&args).dir(root).capture()?;
    let mut files = Vec::new();
    for krate in &CRATES {
        let file =
            crate::target_dir(root).join("package").join(format!("{}-{}.crate", krate.name, version.text));
        let bytes = fs::metadata(&file).map_err(|e| io_error("find", &file, e))?.len();
        eprintln!("  {} ({:.1} KiB)", file.display(), bytes as f64 / 1024.0);
        files.push(file);
    }
    Ok(files)
}

/// The required files are there (the licences as text, not as link paths) and nothing is
/// large.
fn inspect(dir: &Path) -> Result<(), String> {
    for name in REQUIRED {
        let path = dir.join(name);
        let bytes = fs::metadata(&path).map(|m| m.len()).unwrap_or(0);
        // A licence checked out where symbolic links are not supported is its link's
        // path: a few bytes.
        if (bytes < 200 && name.starts_with("LICENSE")) || bytes == 0 {
            return Err(format!("{} lacks {name} (or it is {bytes} bytes)", dir.display()));
        }
    }
    let mut files = Vec::new();
    walk(dir, &mut files)?;
    for file in files {
        let source = fs::read_to_string(&file).unwrap_or_default();
        if file.extension().is_some_and(|e| e == "rs") && reaches_out(&source) {
            return Err(format!(
                "{} reads the repository (a path through ../..), which a user of the .crate does not have: \
                 exclude it in the crate's Cargo.toml or give it its data inside the crate",
                file.display()
            ));
        }
        let bytes = fs::metadata(&file).map_err(|e| io_error("read", &file, e))?.len();
        if bytes > LARGEST_FILE_BYTES {
            return Err(format!(
                "{} is {} KiB, above the {} KiB a packaged file may have: exclude it in the crate's \
                 Cargo.toml (include/exclude)",
                file.display(),
                bytes / 1024,
                LARGEST_FILE_BYTES / 1024
            ));
        }
    }
    Ok(())
}

/// Whether Rust source names a path that climbs out of its crate to the repository's
/// folders (`"../../examples/..."`, `.join("../..")`), outside comments.
fn reaches_out(source: &str) -> bool {
    source
        .lines()
        .map(|l| l.split("//").next().unwrap_or(l))
        .any(|code| code.contains("\"../../") || code.contains("\"/../../") || code.contains("(\"../..\")"))
}

/// Every file under `dir`, sorted (also the versions check's walk).
pub(super) fn walk(dir: &Path, files: &mut Vec<PathBuf>) -> Result<(), String> {
    let mut entries: Vec<PathBuf> = fs::read_dir(dir)
        .map_err(|e| io_error("list", dir, e))?
        .filter_map(Result::ok)
        .map(|e| e.path())
        .collect();
    entries.sort();
    for entry in entries {
        if entry.is_dir() {
            walk(&entry, files)?;
        } else {
            files.push(entry);
        }
    }
    Ok(())
}

/// FNV-1a (64 bits) over `salt` and every file of the trees (its path within the tree,
/// length and bytes), leaving out `.cargo_vcs_info.json`, which names the commit.
fn fingerprint(trees: &[&Path], salt: &str) -> Result<u64, String> {
    let mut hash = Fnv::new();
    hash.add(salt.as_bytes());
    for tree in trees {
        let mut files = Vec::new();
        walk(tree, &mut files)?;
        for file in files {
            let relative = file.strip_prefix(tree.parent().unwrap_or(tree)).unwrap_or(&file);
            if relative.ends_with(".cargo_vcs_info.json") {
                continue;
            }
            let bytes = fs::read(&file).map_err(|e| io_error("read", &file, e))?;
            hash.add(relative.to_string_lossy().as_bytes());
            hash.add(&(bytes.len() as u64).to_le_bytes());
            hash.add(&bytes);
        }
    }
    Ok(hash.0)
}

/// The Fowler-Noll-Vo hash FNV-1a, 64 bits (offset basis and prime from its authors'
/// description, draft-eastlake-fnv).
struct Fnv(u64);

impl Fnv {
    fn new() -> Self {
        Self(0xcbf2_9ce4_8422_2325)
    }

    fn add(&mut self, bytes: &[u8]) {
        for byte in bytes {
            self.0 = (self.0 ^ u64::from(*byte)).wrapping_mul(0x0000_0100_0000_01b3);
        }
    }
}

/// The packed Cargo.lock with the core's entry made a path entry: the packed lock names
/// the core as a crates.io package with the .crate's checksum; patched to the unpacked
/// .crate it has neither source nor checksum, and everything else stays as packed.
pub fn lock_with_local_core(lock: &str) -> String {
    let mut out = String::with_capacity(lock.len());
    let mut in_core = false;
    for line in lock.lines() {
        if line.starts_with("[[") || line.is_empty() {
            in_core = false;
        }
        if line == "name = \"aerostrata\"" {
            in_core = true;
        }
        if in_core && (line.starts_with("source = ") || line.starts_with("checksum = ")) {
            continue;
        }
        out.push_str(line);
        out.push('\n');
    }
    out
}

/// Builds, tests and documents one unpacked crate.
fn verify(
    krate: &Publishable,
    dir: &Path,
    core: &Path,
    target: &Path,
    version: &Version,
) -> Result<(), String> {
    // A second earlier, for file systems that keep whole seconds.
    let started = std::time::SystemTime::now() - std::time::Duration::from_secs(1);
    let patch = if krate.uses_core {
        let lock_path = dir.join("Cargo.lock");
        let lock = fs::read_to_string(&lock_path).map_err(|e| io_error("read", &lock_path, e))?;
        fs::write(&lock_path, lock_with_local_core(&lock)).map_err(|e| io_error("write", &lock_path, e))?;
        let core = serde_json::to_string(&core.to_string_lossy()).map_err(|e| e.to_string())?;
        vec!["--config".to_owned(), format!("patch.crates-io.aerostrata.path={core}")]
    } else {
        Vec::new()
    };
    let place = format!("{} .crate", krate.name);
    let cargo = |args: &[&str]| {
        Cmd::new("cargo")
            .args(args)
            .args(["--quiet", "--locked"])
            .args(&patch)
            .envs([("CARGO_TARGET_DIR", target)])
            .dir(dir)
            .place(&place)
    };
    cargo(&["build"]).run()?;
    cargo(&["test"]).envs([("PROPTEST_RNG_SEED", PROPTEST_SEED)]).run()?;
    let docs_rs =
        docs_rs_arguments(&cargo(&["metadata", "--format-version", "1", "--no-deps"]).quiet().stdout()?)
            .map_err(|e| format!("{}: {e}", dir.join("Cargo.toml").display()))?;
    let mut sets: Vec<(String, Vec<String>, String)> = krate
        .doc_sets
        .iter()
        .map(|(label, args)| {
            ((*label).to_owned(), args.iter().map(|a| (*a).to_owned()).collect(), String::new())
        })
        .collect();
    match sets.iter_mut().find(|(_, args, _)| *args == docs_rs.0) {
        Some(set) => set.2.clone_from(&docs_rs.1),
        None => sets.push(("as docs.rs builds it".to_owned(), docs_rs.0, docs_rs.1)),
    }
    for (label, args, rustdoc_args) in &sets {
        eprintln!("  {}: docs with {label}", krate.name);
        let flags = format!("-D warnings {rustdoc_args}");
        let mut doc = vec!["doc", "--no-deps"];
        doc.extend(args.iter().map(String::as_str));
        cargo(&doc).envs([("RUSTDOCFLAGS", flags.trim())]).run()?;
    }
    if krate.name == "aerostrata-c" {
        check_soname(&target.join("debug").join("libaerostrata_c.so"), version)?;
        check_build_script_inputs(&target.join("debug").join("build"), dir, started)?;
    }
    Ok(())
}

/// The C binding's build script declares (`rerun-if-changed`) only files inside the
/// unpacked crate: it reads nothing of the repository's. Its outputs from this check's
/// builds (those written since `since`) are read.
fn check_build_script_inputs(build: &Path, dir: &Path, since: std::time::SystemTime) -> Result<(), String> {
    let mut outputs = 0;
    for entry in fs::read_dir(build).map_err(|e| io_error("list", build, e))?.filter_map(Result::ok) {
        let output = entry.path().join("output");
        let fresh = fs::metadata(&output).and_then(|m| m.modified()).is_ok_and(|t| t >= since);
        if !entry.file_name().to_string_lossy().starts_with("aerostrata-c-") || !fresh {
            continue;
        }
        outputs += 1;
        let text = fs::read_to_string(&output).map_err(|e| io_error("read", &output, e))?;
        for input in build_script_inputs(&text) {
            if !inside(Path::new(input), dir) {
                return Err(format!(
                    "the C binding's build script reads {input}, outside its .crate ({}): it would fail for \
                     a user",
                    output.display()
                ));
            }
        }
    }
    if outputs == 0 {
        return Err(format!("no output of the C binding's build script under {}", build.display()));
    }
    eprintln!("  aerostrata-c: its build script declares only files inside the .crate ({outputs} runs)");
    Ok(())
}

/// Whether a path a build script declares (relative to its crate, or absolute) lies
/// inside the crate's folder `dir`.
fn inside(path: &Path, dir: &Path) -> bool {
    let escapes = path.components().any(|c| c == std::path::Component::ParentDir);
    !escapes && (path.is_relative() || path.starts_with(dir))
}

/// The paths a build script's output declares with `cargo:rerun-if-changed=` (or the
/// `cargo::` form of Rust 1.77 and later).
pub fn build_script_inputs(output: &str) -> Vec<&str> {
    output
        .lines()
        .filter_map(|l| {
            l.strip_prefix("cargo:rerun-if-changed=").or_else(|| l.strip_prefix("cargo::rerun-if-changed="))
        })
        .collect()
}

/// The `cargo doc` arguments and the rustdoc flags of `[package.metadata.docs.rs]`, from
/// `cargo metadata`'s JSON; Err when a published crate lacks the table.
pub fn docs_rs_arguments(metadata: &str) -> Result<(Vec<String>, String), String> {
    let json: serde_json::Value =
        serde_json::from_str(metadata).map_err(|e| format!("cargo metadata gave no JSON: {e}"))?;
    // `[package.metadata.docs.rs]` is, in TOML, the table `rs` inside `docs`.
    let table = &json["packages"][0]["metadata"]["docs"]["rs"];
    if !table.is_object() {
        return Err("no [package.metadata.docs.rs] (docs.rs would build the default features only, \
                    unsaid)"
            .to_owned());
    }
    let mut args = Vec::new();
    if table["all-features"] == true {
        args.push("--all-features".to_owned());
    }
    if table["no-default-features"] == true {
        args.push(NO_DEFAULT.to_owned());
    }
    let features: Vec<&str> =
        table["features"].as_array().into_iter().flatten().filter_map(|f| f.as_str()).collect();
    if !features.is_empty() {
        args.extend(["--features".to_owned(), features.join(",")]);
    }
    let rustdoc: Vec<&str> =
        table["rustdoc-args"].as_array().into_iter().flatten().filter_map(|f| f.as_str()).collect();
    Ok((args, rustdoc.join(" ")))
}

/// The shared library built from the C binding's .crate names itself as the C package
/// installs it (`libaerostrata.so.0.1` for 0.1.z).
fn check_soname(library: &Path, version: &Version) -> Result<(), String> {
    use object::read::elf::{Dyn as _, FileHeader as _};
    let data = fs::read(library).map_err(|e| io_error("read", library, e))?;
    let broken = |e: object::read::Error| format!("{}: {e}", library.display());
    let header = object::elf::FileHeader64::<object::Endianness>::parse(&*data).map_err(broken)?;
    let endian = header.endian().map_err(broken)?;
    let sections = header.sections(endian, &*data).map_err(broken)?;
    let mut found = None;
    if let Some((entries, link)) = sections.dynamic(endian, &*data).map_err(broken)? {
        let strings = sections.strings(endian, &*data, link).map_err(broken)?;
        for entry in entries {
            if entry.tag32(endian) == Some(object::elf::DT_SONAME) {
                found = Some(
                    String::from_utf8_lossy(entry.string(endian, strings).map_err(broken)?).into_owned(),
                );
            }
        }
    }
    let wanted = version.soname();
    match found {
        Some(name) if name == wanted => {
            eprintln!("  aerostrata-c: {} has the SONAME {name}", library.display());
            Ok(())
        }
        Some(name) => Err(format!("{} has the SONAME {name}, should be {wanted}", library.display())),
        None => Err(format!("{} has no SONAME, should be {wanted}", library.display())),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_core_entry_of_a_packed_lock_loses_its_registry() {
        // Cargo's lock file format (version 4), from a packed lock of this workspace.
        let lock = "version = 4\n\n[[package]]\nname = \"aerostrata\"\nversion = \"0.1.0\"\n\
                    source = \"registry+https://github.com/rust-lang/crates.io-index\"\nchecksum = \"ab\"\n\
                    dependencies = [\n \"libm\",\n]\n\n[[package]]\nname = \"libm\"\nversion = \"0.2.16\"\n\
                    source = \"registry+https://github.com/rust-lang/crates.io-index\"\nchecksum = \"cd\"\n";
        let patched = lock_with_local_core(lock);
        assert_eq!(
            patched,
            "version = 4\n\n[[package]]\nname = \"aerostrata\"\nversion = \"0.1.0\"\ndependencies = [\n \
             \"libm\",\n]\n\n[[package]]\nname = \"libm\"\nversion = \"0.2.16\"\n\
             source = \"registry+https://github.com/rust-lang/crates.io-index\"\nchecksum = \"cd\"\n"
        );
        // A crate whose name only starts the same keeps its source.
        let other = lock.replace("name = \"aerostrata\"", "name = \"aerostrata-extra\"");
        assert_eq!(lock_with_local_core(&other), other);
    }

    #[test]
    fn a_build_script_declares_its_inputs() {
        // The Cargo book, "Build scripts": both prefixes.
        let output = "cargo:rustc-cdylib-link-arg=-Wl,-soname,x\ncargo:rerun-if-changed=build\n\
                      cargo::rerun-if-changed=/abs/file\ncargo:rerun-if-env-changed=CC\n";
        assert_eq!(build_script_inputs(output), ["build", "/abs/file"]);
        let dir = Path::new("/tmp/unpacked/aerostrata-c-0.1.0");
        assert!(inside(Path::new("build"), dir) && inside(&dir.join("build/main.rs"), dir));
        assert!(!inside(Path::new("../../README.md"), dir));
        assert!(!inside(Path::new("/work/repo/bindings/c/build"), dir));
        assert!(!inside(&dir.join("../aerostrata-0.1.0/src/lib.rs"), dir));
    }

    #[test]
    fn a_source_that_reaches_into_the_repository_is_found() {
        // Lines from this workspace's CLI tests and core (common practice, no source).
        assert!(reaches_out(r#"let p = concat!(env!("CARGO_MANIFEST_DIR"), "/../../examples/data/x.csv");"#));
        assert!(reaches_out(r#"let root = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../..");"#));
        assert!(reaches_out(r#"#[doc = include_str!("../../../README.md")]"#));
        assert!(!reaches_out(r#"let config = include_str!("../cbindgen.toml");"#));
        assert!(!reaches_out("// as in ../../tests/vectors/usa76_lower.csv\nlet x = 1;"));
        assert!(!reaches_out(r#"symlink("sub/../sub/new.csv", dir.join("hop.csv"))"#));
    }

    #[test]
    fn docs_rs_metadata_becomes_cargo_doc_arguments() {
        // docs.rs's documented keys (docs.rs/about/metadata): all-features,
        // no-default-features, features, rustdoc-args.
        let meta =
            |table: &str| format!("{{\"packages\": [{{\"metadata\": {{\"docs\": {{\"rs\": {table}}}}}}}]}}");
        let args = |table: &str| docs_rs_arguments(&meta(table)).unwrap();
        assert_eq!(args("{\"all-features\": true}"), (vec!["--all-features".to_owned()], String::new()));
        assert_eq!(args("{\"features\": [\"std\", \"upper\"]}").0, ["--features", "std,upper"]);
        assert_eq!(
            args("{\"no-default-features\": true, \"features\": [\"upper\"], \"rustdoc-args\": [\"--cfg\", \"docsrs\"]}"),
            (vec![NO_DEFAULT.to_owned(), "--features".to_owned(), "upper".to_owned()], "--cfg docsrs".to_owned())
        );
        assert!(docs_rs_arguments("{\"packages\": [{\"metadata\": null}]}").unwrap_err().contains("docs.rs"));
    }

    #[test]
    fn the_fingerprint_follows_content_not_the_commit() {
        let scratch = Scratch::new(Path::new(env!("CARGO_MANIFEST_DIR")), "unit").unwrap();
        let tree = scratch.path().join("crate-0.1.0");
        fs::create_dir_all(tree.join("src")).unwrap();
        fs::write(tree.join("src/lib.rs"), "pub fn f() {}\n").unwrap();
        fs::write(tree.join(".cargo_vcs_info.json"), "{\"sha1\": \"1\"}").unwrap();
        let first = fingerprint(&[&tree], "salt").unwrap();
        fs::write(tree.join(".cargo_vcs_info.json"), "{\"sha1\": \"2\"}").unwrap();
        assert_eq!(fingerprint(&[&tree], "salt").unwrap(), first);
        assert_ne!(fingerprint(&[&tree], "other").unwrap(), first);
        fs::write(tree.join("src/lib.rs"), "pub fn g() {}\n").unwrap();
        assert_ne!(fingerprint(&[&tree], "salt").unwrap(), first);
    }
}
