//! docs/cli.md cannot go stale: every ```console block there is a command (`$ ...`, run
//! by `sh` from the workspace root with this build's `aerostrata` first on PATH, stderr
//! merged into stdout) followed by its output, which must match. A command that writes
//! `docs/images/NAME.svg` is run into a scratch directory instead and its SVG must match
//! the committed one. `AEROSTRATA_BLESS=1 cargo test -p aerostrata-cli --test docs`
//! rewrites the outputs and the images.

use std::path::{Path, PathBuf};
use std::process::Command;

struct Block {
    /// Byte range of the output lines in the document.
    output: std::ops::Range<usize>,
    command: String,
}

fn blocks(doc: &str) -> Vec<Block> {
    let mut found = Vec::new();
    let mut rest = 0;
    while let Some(start) = doc[rest..].find("```console\n") {
        let body = rest + start + "```console\n".len();
        let end = body + doc[body..].find("```\n").expect("a closed block");
        let first_line_end = body + doc[body..].find('\n').expect("a command line");
        let command =
            doc[body..first_line_end].strip_prefix("$ ").expect("a block starts with `$ `").to_owned();
        found.push(Block { output: first_line_end + 1..end, command });
        rest = end + 4;
    }
    found
}

fn run(root: &Path, command: &str, images: &Path) -> String {
    let bin = PathBuf::from(env!("CARGO_BIN_EXE_aerostrata"));
    let path = format!("{}:{}", bin.parent().unwrap().display(), std::env::var("PATH").unwrap_or_default());
    let command = command.replace("docs/images/", &format!("{}/", images.display()));
    let output = Command::new("sh")
        .arg("-c")
        .arg(format!("{{ {command} ; }} 2>&1"))
        .current_dir(root)
        .env("PATH", path)
        .output()
        .unwrap();
    String::from_utf8(output.stdout).unwrap()
}

#[test]
fn the_cli_guide_shows_real_output() {
    let root = PathBuf::from(env!("CARGO_MANIFEST_DIR")).join("../..");
    let doc_path = root.join("docs/cli.md");
    let doc = std::fs::read_to_string(&doc_path).unwrap();
    let images = std::env::temp_dir().join(format!("aerostrata-docs-{}", std::process::id()));
    std::fs::create_dir_all(&images).unwrap();
    let bless = std::env::var_os("AEROSTRATA_BLESS").is_some();
    let found = blocks(&doc);
    assert!(found.len() >= 12, "docs/cli.md shows {} commands", found.len());
    let mut updated = doc.clone();
    let mut stale = Vec::new();
    // From the end, so that earlier ranges stay valid while replacing.
    for block in found.iter().rev() {
        let actual = run(&root, &block.command, &images);
        if doc[block.output.clone()] != actual {
            stale.push(block.command.clone());
            updated.replace_range(block.output.clone(), &actual);
        }
    }
    for entry in std::fs::read_dir(&images).unwrap() {
        let made = entry.unwrap().path();
        let committed = root.join("docs/images").join(made.file_name().unwrap());
        let new = std::fs::read(&made).unwrap();
        if std::fs::read(&committed).ok().as_deref() != Some(&new[..]) {
            stale.push(format!("docs/images/{}", committed.file_name().unwrap().to_string_lossy()));
            if bless {
                std::fs::write(&committed, &new).unwrap();
            }
        }
    }
    std::fs::remove_dir_all(&images).unwrap();
    if bless {
        std::fs::write(&doc_path, updated).unwrap();
    } else {
        assert!(stale.is_empty(), "docs/cli.md is stale for {stale:?}; run AEROSTRATA_BLESS=1 cargo test -p aerostrata-cli --test docs");
    }
}
