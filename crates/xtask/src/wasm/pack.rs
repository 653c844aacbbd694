//! `cargo xtask npm-check`: the npm package as a user gets it. `npm pack` makes the
//! tarball of the built package, a fresh project in a temporary folder outside the
//! checkout installs it (offline: the tarball needs nothing else), and the consumers of
//! bindings/wasm/tests/consumer use it there: Node as an ES module and as CommonJS,
//! `tsc --strict` over its declarations (and a file that must fail), and a plain page
//! that maps "aerostrata" to the web entry with an import map, in headless Chromium.
//!
//! TypeScript comes from the registry at a pinned version, through an npm cache under
//! target/npm-cache, so a second run does not download it again.

use std::fs;
use std::path::Path;
use std::time::Instant;

use super::package::Package;
use crate::process::Cmd;
use crate::scratch::{copy_tree, Scratch};
use crate::{io_error, setup, target_dir};

const CONSUMER_DIR: &str = "bindings/wasm/tests/consumer";
/// The TypeScript the declarations are checked with: the last release of the compiler
/// written in TypeScript (7 is a native build with per-platform packages).
const TYPESCRIPT: &str = "typescript@5.9.3";
/// A plain `lib`: the declarations bring `esnext.disposable` (for `[Symbol.dispose]`)
/// themselves.
const TSC_FLAGS: [&str; 10] = [
    "--strict",
    "--noEmit",
    "--module",
    "nodenext",
    "--moduleResolution",
    "nodenext",
    "--target",
    "es2022",
    "--lib",
    "es2022,dom",
];
const GOOD_TYPES: &str = "types.mts";
const WRONG_TYPES: &str = "types_wrong.mts";

/// Packs `package`, installs the tarball into a fresh project and runs every consumer
/// there; prints a line per consumer and the seconds each stage took.
pub fn check(root: &Path, package: &Package) -> Result<(), String> {
    setup::node(root)?;
    let mut lines = Vec::new();
    let mut clock = Instant::now();
    let mut lap = |what: &str, lines: &mut Vec<String>| {
        lines.push(format!("{what}: {:.1} s", clock.elapsed().as_secs_f64()));
        clock = Instant::now();
    };
    let scratch = Scratch::new(root, "npm-consumer")?;
    let packed = Cmd::new("npm")
        .args(["pack", "--json", "--pack-destination"])
        .arg(scratch.path())
        .dir(&package.dir)
        .stdout()?;
    let (tarball, summary) = read_pack_json(&packed)?;
    lines.push(summary);
    let project = scratch.path().join("project");
    fs::create_dir_all(&project).map_err(|e| io_error("create", &project, e))?;
    Cmd::new("npm").args(["init", "-y"]).dir(&project).quiet().capture()?;
    Cmd::new("npm")
        .args(["install", &format!("../{tarball}"), "--offline", "--no-audit", "--no-fund"])
        .dir(&project)
        .run()?;
    lap("npm pack and install offline", &mut lines);
    let cache = target_dir(root).join("npm-cache");
    Cmd::new("npm")
        .args(["install", "--save-dev", TYPESCRIPT, "--prefer-offline", "--no-audit", "--no-fund", "--cache"])
        .arg(&cache)
        .dir(&project)
        .run()?;
    lap(&format!("{TYPESCRIPT} (npm cache {})", cache.display()), &mut lines);
    copy_tree(&root.join(CONSUMER_DIR), &project)?;

    for script in ["esm.mjs", "cjs.cjs"] {
        let printed = Cmd::new("node").arg(script).dir(&project).capture()?.stdout_text();
        lines.push(printed.trim().to_owned());
    }
    lap("Node consumers", &mut lines);

    // One run over both files (tsc's start-up is most of its time): the good file must
    // give no error, the wrong one exactly the errors it names.
    let tsc = project.join("node_modules/typescript/bin/tsc");
    let typed =
        Cmd::new("node").arg(&tsc).args(TSC_FLAGS).args([GOOD_TYPES, WRONG_TYPES]).dir(&project).output()?;
    let source = fs::read_to_string(project.join(WRONG_TYPES)).map_err(|e| io_error("read", &project, e))?;
    let expected = expected_errors(&source);
    let found = reported_errors(&typed.stdout_text());
    if typed.success || expected.is_empty() || found != expected {
        return Err(format!(
            "tsc over {GOOD_TYPES} and {WRONG_TYPES}: expected only the errors {expected:?} (line in \
             {WRONG_TYPES}, code), got {found:?} (line 0: another file) ({}):\n{}",
            typed.status,
            typed.stdout_text()
        ));
    }
    lines.push(format!("tsc --strict: {GOOD_TYPES} clean, {WRONG_TYPES} fails with {found:?} (line, code)"));
    lap("tsc", &mut lines);

    lines.push(browser(root, &project)?);
    lap("Chromium through an import map", &mut lines);
    for line in &lines {
        eprintln!("  npm package: {line}");
    }
    Ok(())
}

/// The tarball's file name from `npm pack --json`, and a line on its size and contents.
fn read_pack_json(text: &str) -> Result<(String, String), String> {
    let value: serde_json::Value =
        serde_json::from_str(text).map_err(|e| format!("npm pack --json printed no JSON ({e}):\n{text}"))?;
    let first = value.get(0).ok_or("npm pack --json: an empty list")?;
    let name = first.get("filename").and_then(|v| v.as_str()).ok_or("npm pack --json: no filename")?;
    if name.contains('/') || !name.ends_with(".tgz") {
        return Err(format!("npm pack made '{name}', not a .tgz file name"));
    }
    let size = first.get("size").and_then(|v| v.as_u64()).unwrap_or(0);
    let files = first.get("files").and_then(|v| v.as_array()).map_or(0, Vec::len);
    Ok((name.to_owned(), format!("{name}: {files} files, {:.1} KiB packed", size as f64 / 1024.0)))
}

/// The errors a file declares it must give: `// TSnnnn: why` names the error expected on
/// the line below it, as (line, code) with lines counted from 1.
fn expected_errors(source: &str) -> Vec<(usize, u32)> {
    source
        .lines()
        .enumerate()
        .filter_map(|(i, line)| {
            let code = line.trim_start().strip_prefix("// TS")?.split(':').next()?.parse().ok()?;
            Some((i + 2, code))
        })
        .collect()
}

/// Every error tsc reported, as (line, code) in WRONG_TYPES, or (0, code) for an error in
/// any other file (the package's own declarations among them), in the order given.
fn reported_errors(output: &str) -> Vec<(usize, u32)> {
    output
        .lines()
        .filter_map(|line| {
            let (place, rest) = line.split_once(": error TS")?;
            let code = rest.split(':').next()?.parse().ok()?;
            let line_number = place
                .strip_prefix(WRONG_TYPES)
                .and_then(|p| p.strip_prefix('('))
                .and_then(|p| p.split(',').next())
                .and_then(|n| n.parse().ok())
                .unwrap_or(0);
            Some((line_number, code))
        })
        .collect()
}

/// Serves the project on 127.0.0.1 and opens page.html in Debian's Chromium through
/// playwright-core, as `cargo xtask browser-test` does.
fn browser(root: &Path, project: &Path) -> Result<String, String> {
    super::browser::serve(root, project, |port, playwright| {
        Cmd::new("node")
            .arg("browser.mjs")
            .arg(format!("http://127.0.0.1:{port}/page.html"))
            .arg(playwright)
            .dir(project)
            .timeout(180)
            .capture()
            .map(|o| o.stdout_text().trim().to_owned())
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_wrong_file_names_its_errors_and_tsc_output_is_read_against_them() {
        let source = "// header\nconst a = 1;\n// TS2322: a number is not a string.\nconst p: string = 1;\n  // TS2531: null\nx;\n";
        assert_eq!(expected_errors(source), [(4, 2322), (6, 2531)]);
        // tsc 5.9's format; an error in the package's declarations counts as line 0.
        let output = "types_wrong.mts(4,7): error TS2322: Type 'number' is not assignable to type 'string'.\n\
                      node_modules/aerostrata/node/aerostrata.d.ts(621,13): error TS2550: Property 'dispose' ...\n\
                      types_wrong.mts(6,20): error TS2531: Object is possibly 'null'.\n";
        assert_eq!(reported_errors(output), [(4, 2322), (0, 2550), (6, 2531)]);
        assert_ne!(reported_errors(output), expected_errors(source));
        assert!(reported_errors("").is_empty());
    }

    #[test]
    fn the_tarball_is_read_from_npm_pack_json() {
        let json = r#"[{"id": "aerostrata@0.1.0", "filename": "aerostrata-0.1.0.tgz", "size": 204800,
                       "files": [{"path": "package.json"}, {"path": "web/aerostrata.js"}]}]"#;
        let (name, line) = read_pack_json(json).unwrap();
        assert_eq!(name, "aerostrata-0.1.0.tgz");
        assert_eq!(line, "aerostrata-0.1.0.tgz: 2 files, 200.0 KiB packed");
        assert!(read_pack_json("[]").is_err());
        assert!(read_pack_json(r#"[{"filename": "../x.tgz"}]"#).is_err());
        assert!(read_pack_json("npm notice").is_err());
    }
}
