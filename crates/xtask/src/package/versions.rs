//! One version everywhere: the crates' (the workspace's `version`), the C header's
//! `AEROSTRATA_VERSION_*` macros (and cbindgen.toml, which writes them), the npm
//! package's, the add-in's, the shared library's file names and every dependency line
//! the documentation shows; one `rust-version` in the published crates and the README;
//! and CHANGELOG.md in the Keep a Changelog 1.1.0 shape with
//! Semantic Versioning 2.0.0 headings. The checks are functions of the texts, so that a
//! mismatched copy is tested without touching a file.

use std::path::Path;

use crate::io_error;
use crate::process::Cmd;

/// `MAJOR.MINOR.PATCH` with an optional pre-release or build suffix (kept in `text`).
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct Version {
    pub major: u64,
    pub minor: u64,
    pub patch: u64,
    pub text: String,
}

impl Version {
    /// Semantic Versioning 2.0.0, items 2, 9 and 10: three numbers without leading zeros,
    /// then `-pre` and `+build` if any.
    pub fn parse(text: &str) -> Result<Self, String> {
        let core = text.split(['-', '+']).next().unwrap_or_default();
        let numbers: Vec<&str> = core.split('.').collect();
        let number = |part: &str| -> Option<u64> {
            let plain = !part.is_empty() && part.bytes().all(|b| b.is_ascii_digit());
            let leading_zero = part.len() > 1 && part.starts_with('0');
            if plain && !leading_zero {
                part.parse().ok()
            } else {
                None
            }
        };
        match numbers.as_slice() {
            [a, b, c] => match (number(a), number(b), number(c)) {
                (Some(major), Some(minor), Some(patch)) => {
                    Ok(Self { major, minor, patch, text: text.to_owned() })
                }
                _ => Err(format!("`{text}` is not a version MAJOR.MINOR.PATCH")),
            },
            _ => Err(format!("`{text}` is not a version MAJOR.MINOR.PATCH")),
        }
    }

    fn triple(&self) -> (u64, u64, u64) {
        (self.major, self.minor, self.patch)
    }

    /// The shared library's SONAME: major and minor before 1.0 (a minor release may
    /// change the ABI), the major alone from 1.0 (docs/c-guide.md, "ABI stability").
    pub fn soname(&self) -> String {
        if self.major == 0 {
            format!("libaerostrata.so.0.{}", self.minor)
        } else {
            format!("libaerostrata.so.{}", self.major)
        }
    }

    /// Whether a Cargo requirement such as `0.1` or `1.2.3` (caret, the default) accepts
    /// this version: the Cargo book, "Specifying dependencies", caret requirements.
    fn accepted_by(&self, requirement: &str) -> bool {
        let requirement = requirement.trim().trim_start_matches('^');
        let parts: Result<Vec<u64>, _> = requirement.split('.').map(str::parse::<u64>).collect();
        let Ok(parts) = parts else { return false };
        let at_least = |parts: &[u64]| {
            let floor = (parts[0], parts.get(1).copied().unwrap_or(0), parts.get(2).copied().unwrap_or(0));
            self.triple() >= floor
        };
        match parts.as_slice() {
            [major, ..] if *major > 0 => self.major == *major && at_least(&parts),
            [0] => self.major == 0,
            [0, minor] | [0, minor, _] if *minor > 0 => {
                self.major == 0 && self.minor == *minor && at_least(&parts)
            }
            [0, 0] => self.major == 0 && self.minor == 0,
            [0, 0, patch] => self.triple() == (0, 0, *patch),
            _ => false,
        }
    }
}

/// Every text the check reads, gathered by [`run`] (or written by a test).
pub struct Copies {
    /// The root Cargo.toml.
    pub workspace_manifest: String,
    /// Every workspace member's resolved version: (package, version).
    pub members: Vec<(String, String)>,
    /// Every member's requirement on the core: (package, requirement as cargo reports it).
    pub core_requirements: Vec<(String, String)>,
    pub header: String,
    pub cbindgen: String,
    pub package_json: String,
    pub addin_description: String,
    pub changelog: String,
    /// Documentation and sources that name the library's files or show a dependency
    /// line: (path, text).
    pub texts: Vec<(String, String)>,
    /// The published crates' `rust-version`: (package, rust-version or "" when unset).
    pub rust_versions: Vec<(String, String)>,
    pub readme: String,
}

/// The workspace's version: `version` in `[workspace.package]` of the root Cargo.toml.
pub fn workspace_version(manifest: &str) -> Result<Version, String> {
    let value = toml_string(manifest, "workspace.package", "version")
        .ok_or("Cargo.toml has no `version = \"...\"` in [workspace.package]")?;
    Version::parse(&value).map_err(|e| format!("Cargo.toml [workspace.package]: {e}"))
}

/// The string value of `key = "..."` in `[section]` of a TOML text (one line, as the
/// workspace's manifest writes it).
pub fn toml_string(text: &str, section: &str, key: &str) -> Option<String> {
    let mut inside = false;
    for line in text.lines().map(str::trim) {
        if line.starts_with('[') {
            inside = line == format!("[{section}]");
        } else if inside {
            let Some((name, value)) = line.split_once('=') else { continue };
            if name.trim() == key {
                let value = value.trim();
                return value.strip_prefix('"').and_then(|v| v.split_once('"')).map(|(v, _)| v.to_owned());
            }
        }
    }
    None
}

/// Every disagreement among the copies, one line each (empty when all are in step).
pub fn problems(copies: &Copies) -> Result<Vec<String>, String> {
    let version = workspace_version(&copies.workspace_manifest)?;
    let v = &version.text;
    let mut problems = Vec::new();
    for (package, found) in &copies.members {
        if found != v {
            problems.push(format!("crate {package} is at {found}, the workspace at {v}"));
        }
    }
    for (package, requirement) in &copies.core_requirements {
        if requirement.trim_start_matches('^') != v.as_str() {
            problems.push(format!(
                "{package} requires aerostrata {requirement}; with the workspace at {v} it should say \
                 version = \"{v}\""
            ));
        }
    }
    problems.extend(macro_problems("bindings/c/include/aerostrata.h", &copies.header, &version));
    problems.extend(macro_problems("bindings/c/cbindgen.toml", &copies.cbindgen, &version));
    match serde_json::from_str::<serde_json::Value>(&copies.package_json) {
        Ok(json) => match json.get("version").and_then(|x| x.as_str()) {
            Some(found) if found == v => {}
            Some(found) => {
                problems.push(format!("bindings/wasm/package.json says version {found}, the crates {v}"))
            }
            None => problems.push("bindings/wasm/package.json has no \"version\"".to_owned()),
        },
        Err(e) => problems.push(format!("bindings/wasm/package.json is not JSON: {e}")),
    }
    match between(&copies.addin_description, "<version value=\"", "\"") {
        // Filled in with the crates' version when `cargo xtask addin` builds the .oxt.
        Some("@VERSION@") => {}
        Some(found) if found == v => {}
        Some(found) => problems.push(format!(
            "addin/description.xml says version {found}, the crates {v} (write @VERSION@ to take theirs)"
        )),
        None => problems.push("addin/description.xml has no <version value=\"...\"/>".to_owned()),
    }
    for (path, text) in &copies.texts {
        problems.extend(library_name_problems(path, text, &version));
        if path.ends_with(".md") {
            problems.extend(dependency_line_problems(path, text, &version));
        }
    }
    problems.extend(changelog_problems(&copies.changelog, &version));
    problems.extend(rust_version_problems(copies));
    Ok(problems)
}

/// The text between `open` and the next `close` after it.
fn between<'a>(text: &'a str, open: &str, close: &str) -> Option<&'a str> {
    let start = text.find(open)? + open.len();
    let length = text[start..].find(close)?;
    Some(&text[start..start + length])
}

/// `#define AEROSTRATA_VERSION_MAJOR 0` and its three siblings against the version.
fn macro_problems(path: &str, text: &str, version: &Version) -> Vec<String> {
    let expected = [
        ("AEROSTRATA_VERSION_MAJOR", version.major.to_string()),
        ("AEROSTRATA_VERSION_MINOR", version.minor.to_string()),
        ("AEROSTRATA_VERSION_PATCH", version.patch.to_string()),
        ("AEROSTRATA_VERSION_STRING", format!("\"{}\"", version.text)),
    ];
    let mut problems = Vec::new();
    for (name, want) in expected {
        let found: Vec<&str> = text
            .lines()
            .filter_map(|line| line.trim().strip_prefix("#define "))
            .filter_map(|rest| rest.trim().strip_prefix(name))
            .filter(|rest| rest.starts_with([' ', '\t']))
            .map(str::trim)
            .collect();
        match found.as_slice() {
            [] => problems.push(format!("{path} does not define {name} (should be {want})")),
            [one] if *one == want => {}
            _ => problems.push(format!("{path} defines {name} as {}, should be {want}", found.join(" and "))),
        }
    }
    problems
}

/// Every `libaerostrata.so.N[.N[.N]]` in a text must be the SONAME or the real file name,
/// or name a later version (the policy to come).
fn library_name_problems(path: &str, text: &str, version: &Version) -> Vec<String> {
    const STEM: &str = "libaerostrata.so.";
    let (soname, real) = (version.soname(), format!("libaerostrata.so.{}", version.text));
    let mut problems = Vec::new();
    for (number, line) in text.lines().enumerate() {
        for (at, _) in line.match_indices(STEM) {
            let tail = &line[at + STEM.len()..];
            let digits = tail.find(|c: char| !c.is_ascii_digit() && c != '.').unwrap_or(tail.len());
            let suffix = tail[..digits].trim_end_matches('.');
            if suffix.is_empty() {
                continue; // libaerostrata.so.MAJOR.MINOR and the like: a pattern, not a name
            }
            let name = format!("{STEM}{suffix}");
            // A later version's name states the policy to come (from 1.0, the major alone).
            let mut parts = suffix.split('.').map(|p| p.parse::<u64>().unwrap_or(0));
            let named = (parts.next().unwrap_or(0), parts.next().unwrap_or(0), parts.next().unwrap_or(0));
            if name != soname && name != real && named <= version.triple() {
                problems.push(format!(
                    "{path} line {}: {name} is neither the SONAME {soname} nor the file {real}",
                    number + 1
                ));
            }
        }
    }
    problems
}

/// Every `aerostrata = "REQ"` or `aerostrata = { version = "REQ" ... }` shown in the
/// documentation must accept the current version (a reader copies it).
fn dependency_line_problems(path: &str, text: &str, version: &Version) -> Vec<String> {
    let mut problems = Vec::new();
    for (number, line) in text.lines().enumerate() {
        for (at, _) in line.match_indices("aerostrata = ") {
            let before = line[..at].chars().next_back();
            if before.is_some_and(|c| c.is_alphanumeric() || c == '_' || c == '-') {
                continue; // another crate's name ending in `aerostrata`
            }
            let rest = &line[at + "aerostrata = ".len()..];
            let requirement = if rest.starts_with('"') {
                between(rest, "\"", "\"")
            } else if rest.starts_with('{') {
                let table = rest.split('}').next().unwrap_or(rest);
                between(table, "version = \"", "\"")
            } else {
                None
            };
            if let Some(requirement) = requirement {
                if !version.accepted_by(requirement) {
                    problems.push(format!(
                        "{path} line {}: the dependency line asks for aerostrata \"{requirement}\", which \
                         does not accept the crates' {}",
                        number + 1,
                        version.text
                    ));
                }
            }
        }
    }
    problems
}

/// The published crates declare the workspace's `rust-version`, and the README's
/// "Minimum supported Rust version" section names it.
fn rust_version_problems(copies: &Copies) -> Vec<String> {
    let Some(rust) = toml_string(&copies.workspace_manifest, "workspace.package", "rust-version") else {
        return vec!["Cargo.toml has no rust-version in [workspace.package]".to_owned()];
    };
    let mut problems = Vec::new();
    for (package, found) in &copies.rust_versions {
        if *found != rust {
            problems.push(format!("crate {package} declares rust-version \"{found}\", the workspace {rust}"));
        }
    }
    const HEADING: &str = "## Minimum supported Rust version";
    match copies.readme.split_once(HEADING) {
        None => problems.push(format!("README.md has no `{HEADING}` section")),
        Some((_, rest)) => {
            let section = rest.split("\n## ").next().unwrap_or(rest);
            let named = section.split("Rust ").skip(1).filter_map(|t| {
                let end = t.find(|c: char| !c.is_ascii_digit() && c != '.').unwrap_or(t.len());
                Some(t[..end].trim_end_matches('.')).filter(|v| !v.is_empty())
            });
            let named: Vec<&str> = named.collect();
            if named.is_empty() || named.iter().any(|v| *v != rust) {
                problems.push(format!(
                    "README.md's `{HEADING}` names Rust {}, the crates' rust-version is {rust}",
                    if named.is_empty() { "no version".to_owned() } else { named.join(", ") }
                ));
            }
        }
    }
    problems
}

/// The sections Keep a Changelog 1.1.0 names, in its order.
const CHANGE_KINDS: [&str; 6] = ["Added", "Changed", "Deprecated", "Removed", "Fixed", "Security"];

/// CHANGELOG.md in the Keep a Changelog 1.1.0 shape: `# Changelog`, an introduction that
/// names Keep a Changelog and Semantic Versioning, `## [Unreleased]` first, then every
/// release as `## [X.Y.Z] - YYYY-MM-DD`, newest first; within each, only the six kinds of
/// change, each once, in the usual order. The crates' version is either the newest
/// release or newer than every release (the work under Unreleased leads to it).
pub fn changelog_problems(text: &str, current: &Version) -> Vec<String> {
    let mut problems = Vec::new();
    let mut lines = text.lines().enumerate().filter(|(_, l)| !l.trim().is_empty());
    if lines.next().map(|(_, l)| l.trim()) != Some("# Changelog") {
        problems.push("CHANGELOG.md does not open with `# Changelog`".to_owned());
    }
    for (name, address) in [("Keep a Changelog", "keepachangelog.com"), ("Semantic Versioning", "semver.org")]
    {
        if !text.contains(address) {
            problems.push(format!("CHANGELOG.md's introduction does not link {name} ({address})"));
        }
    }
    let mut releases: Vec<(Version, String)> = Vec::new();
    let has_unreleased =
        text.lines().any(|l| l.strip_prefix("## ").is_some_and(|h| h.trim() == "[Unreleased]"));
    let mut seen_unreleased = false;
    let mut kinds: Vec<usize> = Vec::new();
    let mut release_line: Option<usize> = None;
    let mut empty_releases = Vec::new();
    // A release (not Unreleased) lists at least one kind of change.
    fn end_release(line: Option<usize>, kinds: &[usize], empty: &mut Vec<usize>) {
        if let (Some(line), true) = (line, kinds.is_empty()) {
            empty.push(line);
        }
    }
    for (index, line) in text.lines().enumerate() {
        let number = index + 1;
        if let Some(heading) = line.strip_prefix("## ") {
            end_release(release_line, &kinds, &mut empty_releases);
            kinds.clear();
            release_line = None;
            let heading = heading.trim();
            if heading == "[Unreleased]" {
                if seen_unreleased || !releases.is_empty() {
                    problems.push(format!("CHANGELOG.md line {number}: [Unreleased] must come once, first"));
                }
                seen_unreleased = true;
                continue;
            }
            if !seen_unreleased && has_unreleased {
                problems.push(format!("CHANGELOG.md line {number}: a release before `## [Unreleased]`"));
                seen_unreleased = true;
            }
            match release_heading(heading) {
                Ok((version, date)) => {
                    if let Some((newer, newer_date)) = releases.last() {
                        if version.triple() >= newer.triple() {
                            problems.push(format!(
                                "CHANGELOG.md line {number}: {} is listed below {}; newest first",
                                version.text, newer.text
                            ));
                        }
                        if date > *newer_date {
                            problems.push(format!(
                                "CHANGELOG.md line {number}: {} dated {date}, after {} of {newer_date}",
                                version.text, newer.text
                            ));
                        }
                    }
                    releases.push((version, date));
                    release_line = Some(number);
                }
                Err(e) => problems.push(format!("CHANGELOG.md line {number}: {e}")),
            }
        } else if let Some(kind) = line.strip_prefix("### ") {
            match CHANGE_KINDS.iter().position(|k| *k == kind.trim()) {
                None => problems.push(format!(
                    "CHANGELOG.md line {number}: `### {}` is not one of {}",
                    kind.trim(),
                    CHANGE_KINDS.join(", ")
                )),
                Some(at) if kinds.contains(&at) => problems.push(format!(
                    "CHANGELOG.md line {number}: a second `### {}` in one release",
                    kind.trim()
                )),
                Some(at) if kinds.last().is_some_and(|last| *last > at) => problems.push(format!(
                    "CHANGELOG.md line {number}: `### {}` after `### {}`; the order is {}",
                    kind.trim(),
                    CHANGE_KINDS[*kinds.last().unwrap_or(&0)],
                    CHANGE_KINDS.join(", ")
                )),
                Some(at) => kinds.push(at),
            }
        }
    }
    end_release(release_line, &kinds, &mut empty_releases);
    for line in empty_releases {
        problems
            .push(format!("CHANGELOG.md line {line}: a release without any `### Added` ... `### Security`"));
    }
    if !has_unreleased {
        problems.push("CHANGELOG.md has no `## [Unreleased]` section".to_owned());
    }
    if let Some((newest, _)) = releases.first() {
        if newest.triple() > current.triple() {
            problems.push(format!(
                "CHANGELOG.md releases {} but the crates are at {}: bump the workspace version",
                newest.text, current.text
            ));
        } else if newest.triple() == current.triple() && newest.text != current.text {
            problems.push(format!(
                "CHANGELOG.md's newest release {} differs from the crates' {}",
                newest.text, current.text
            ));
        }
    }
    problems
}

/// `[X.Y.Z] - YYYY-MM-DD` into the version and the date (as text, which sorts as dates do).
fn release_heading(heading: &str) -> Result<(Version, String), String> {
    let shape = || format!("`## {heading}` is not `## [X.Y.Z] - YYYY-MM-DD`");
    let (bracketed, date) = heading.split_once(" - ").ok_or_else(shape)?;
    let version = bracketed.strip_prefix('[').and_then(|v| v.strip_suffix(']')).ok_or_else(shape)?;
    let version = Version::parse(version)?;
    let date = date.trim();
    let parts: Vec<&str> = date.split('-').collect();
    let valid = match parts.as_slice() {
        [y, m, d] if y.len() == 4 && m.len() == 2 && d.len() == 2 => {
            let number = |s: &str| s.parse::<u32>().ok();
            matches!((number(y), number(m), number(d)), (Some(_), Some(1..=12), Some(1..=31)))
        }
        _ => false,
    };
    if valid {
        Ok((version, date.to_owned()))
    } else {
        Err(format!("`{date}` in `## {heading}` is not a date YYYY-MM-DD"))
    }
}

/// Reads every copy from the repository.
fn gather(root: &Path) -> Result<Copies, String> {
    let read = |relative: &str| {
        let path = root.join(relative);
        std::fs::read_to_string(&path).map_err(|e| io_error("read", &path, e))
    };
    let metadata = Cmd::new("cargo")
        .args(["metadata", "--format-version", "1", "--no-deps", "--offline"])
        .dir(root)
        .quiet()
        .stdout()?;
    let metadata: serde_json::Value =
        serde_json::from_str(&metadata).map_err(|e| format!("cargo metadata gave no JSON: {e}"))?;
    let mut members = Vec::new();
    let mut core_requirements = Vec::new();
    let mut rust_versions = Vec::new();
    for package in metadata["packages"].as_array().into_iter().flatten() {
        let name = package["name"].as_str().unwrap_or_default().to_owned();
        members.push((name.clone(), package["version"].as_str().unwrap_or_default().to_owned()));
        if crate::package::crates::CRATES.iter().any(|c| c.name == name) {
            let rust = package["rust_version"].as_str().unwrap_or_default().to_owned();
            rust_versions.push((name.clone(), rust));
        }
        for dependency in package["dependencies"].as_array().into_iter().flatten() {
            if dependency["name"] == "aerostrata" {
                core_requirements
                    .push((name.clone(), dependency["req"].as_str().unwrap_or_default().to_owned()));
            }
        }
    }
    let mut texts = Vec::new();
    for place in
        ["README.md", "DEVELOPERS.md", "docs", "bindings/c", "examples/c-altimeter", "crates/xtask/src/c"]
    {
        collect_texts(root, &root.join(place), &mut texts)?;
    }
    Ok(Copies {
        workspace_manifest: read("Cargo.toml")?,
        members,
        core_requirements,
        header: read("bindings/c/include/aerostrata.h")?,
        cbindgen: read("bindings/c/cbindgen.toml")?,
        package_json: read("bindings/wasm/package.json")?,
        addin_description: read("addin/description.xml")?,
        changelog: read("CHANGELOG.md")?,
        texts,
        rust_versions,
        readme: read("README.md")?,
    })
}

/// The text files under `path` (or `path` itself) whose names end in one of the
/// extensions a version can hide in.
fn collect_texts(root: &Path, path: &Path, texts: &mut Vec<(String, String)>) -> Result<(), String> {
    const EXTENSIONS: [&str; 9] = ["md", "rs", "toml", "txt", "h", "c", "cmake", "py", "in"];
    let mut files = Vec::new();
    if path.is_dir() {
        super::crates::walk(path, &mut files)?;
    } else {
        files.push(path.to_path_buf());
    }
    for file in files {
        if file.extension().and_then(|e| e.to_str()).is_some_and(|e| EXTENSIONS.contains(&e)) {
            let text = std::fs::read_to_string(&file).map_err(|e| io_error("read", &file, e))?;
            let relative = file.strip_prefix(root).unwrap_or(&file).to_string_lossy().into_owned();
            texts.push((relative, text));
        }
    }
    Ok(())
}

/// `cargo xtask versions`: Ok with a line naming the version, or every disagreement.
pub fn run(root: &Path) -> Result<(), String> {
    let copies = gather(root)?;
    let problems = problems(&copies)?;
    let version = workspace_version(&copies.workspace_manifest)?;
    if problems.is_empty() {
        eprintln!(
            "  versions in step: {} in {} crates, the C header, cbindgen.toml, package.json and the \
             add-in; SONAME {}; {} files scanned; CHANGELOG.md in shape; rust-version {} in the published \
             crates and the README",
            version.text,
            copies.members.len(),
            version.soname(),
            copies.texts.len(),
            toml_string(&copies.workspace_manifest, "workspace.package", "rust-version").unwrap_or_default()
        );
        Ok(())
    } else {
        Err(format!("versions out of step:\n  {}", problems.join("\n  ")))
    }
}

#[cfg(test)]
#[path = "versions_tests.rs"]
mod tests;
