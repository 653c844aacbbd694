//! The version check over invented copies: in step they pass, and each deliberately
//! mismatched copy is refused with a message naming the file.

use super::*;

const CHANGELOG: &str = "# Changelog\n\n\
    The format follows [Keep a Changelog](https://keepachangelog.com/en/1.1.0/), and the\n\
    project uses [Semantic Versioning](https://semver.org/spec/v2.0.0.html).\n\n\
    ## [Unreleased]\n\n### Added\n\n- Something new.\n\n\
    ## [0.1.0] - 2026-01-15\n\n### Added\n\n- The first release.\n\n### Fixed\n\n- A bug.\n";

fn copies(version: &str) -> Copies {
    let (major, minor, patch) = {
        let v = Version::parse(version).unwrap();
        (v.major, v.minor, v.patch)
    };
    let macros = format!(
        "#define AEROSTRATA_VERSION_MAJOR {major}\n#define AEROSTRATA_VERSION_MINOR {minor}\n\
         #define AEROSTRATA_VERSION_PATCH {patch}\n#define AEROSTRATA_VERSION_STRING \"{version}\"\n"
    );
    Copies {
        workspace_manifest: format!(
            "[workspace]\nresolver = \"2\"\n\n[workspace.package]\nversion = \"{version}\"\nedition = \"2021\"\n\
             rust-version = \"1.85\"\n"
        ),
        members: vec![("aerostrata".into(), version.into()), ("aerostrata-cli".into(), version.into())],
        core_requirements: vec![("aerostrata-cli".into(), format!("^{version}"))],
        header: format!("/* header */\n{macros}"),
        cbindgen: format!("after_includes = \"\"\"\n{macros}\"\"\"\n"),
        package_json: format!("{{\"name\": \"aerostrata\", \"version\": \"{version}\"}}"),
        addin_description: "<description>\n  <version value=\"@VERSION@\"/>\n</description>\n".into(),
        changelog: CHANGELOG.into(),
        texts: vec![
            (
                "docs/c-guide.md".into(),
                format!("the SONAME (now `libaerostrata.so.{major}.{minor}`) of libaerostrata.so.{version}\n"),
            ),
            ("README.md".into(), format!("`aerostrata = {{ version = \"{major}.{minor}\" }}`\n")),
        ],
        rust_versions: vec![("aerostrata".into(), "1.85".into()), ("aerostrata-cli".into(), "1.85".into())],
        readme: "# x\n\n## Minimum supported Rust version\n\nBuilds with Rust 1.85 and later.\n\n## Next\n\nRust 1.99.\n"
            .into(),
    }
}

fn problems_of(copies: &Copies) -> Vec<String> {
    problems(copies).unwrap()
}

/// Asserts exactly one problem, containing every one of `words`.
fn refused(copies: &Copies, words: &[&str]) {
    let found = problems_of(copies);
    assert_eq!(found.len(), 1, "{found:#?}");
    for word in words {
        assert!(found[0].contains(word), "{word:?} not in {:?}", found[0]);
    }
}

#[test]
fn versions_parse_as_semantic_versioning_says() {
    // Semantic Versioning 2.0.0, items 2 and 9: three numbers, no leading zeros.
    let v = Version::parse("0.12.3").unwrap();
    assert_eq!((v.major, v.minor, v.patch), (0, 12, 3));
    assert_eq!(Version::parse("1.0.0-rc.1").unwrap().triple(), (1, 0, 0));
    for bad in ["0.1", "0.1.0.0", "01.1.0", "a.b.c", "", "0..1"] {
        assert!(Version::parse(bad).is_err(), "{bad}");
    }
}

#[test]
fn caret_requirements_follow_cargo() {
    // The Cargo book, "Specifying dependencies": ^0.1 accepts 0.1.z, not 0.2.0; ^1.2
    // accepts 1.y.z from 1.2.0; ^0.0.3 only 0.0.3.
    let accepts = |req: &str, v: &str| Version::parse(v).unwrap().accepted_by(req);
    assert!(accepts("0.1", "0.1.0") && accepts("0.1", "0.1.9") && accepts("0.1.0", "0.1.4"));
    assert!(!accepts("0.1", "0.2.0") && !accepts("0.1.5", "0.1.4"));
    assert!(accepts("1.2", "1.9.0") && !accepts("1.2", "1.1.0") && !accepts("1", "2.0.0"));
    assert!(accepts("0.0.3", "0.0.3") && !accepts("0.0.3", "0.0.4"));
    assert!(!accepts("*", "0.1.0") && !accepts("0.x", "0.1.0"));
}

#[test]
fn the_soname_carries_the_minor_version_until_one() {
    // docs/c-guide.md, "ABI stability" (the project's own policy).
    assert_eq!(Version::parse("0.1.0").unwrap().soname(), "libaerostrata.so.0.1");
    assert_eq!(Version::parse("0.2.7").unwrap().soname(), "libaerostrata.so.0.2");
    assert_eq!(Version::parse("1.4.2").unwrap().soname(), "libaerostrata.so.1");
}

#[test]
fn copies_in_step_pass() {
    assert_eq!(problems_of(&copies("0.1.0")), Vec::<String>::new());
    // A version newer than the newest release: its work is under Unreleased.
    let mut next = copies("0.2.0");
    next.changelog = CHANGELOG.into();
    assert_eq!(problems_of(&next), Vec::<String>::new());
}

#[test]
fn a_mismatched_crate_or_requirement_is_refused() {
    let mut c = copies("0.1.0");
    c.members[1].1 = "0.1.1".into();
    refused(&c, &["aerostrata-cli", "0.1.1", "0.1.0"]);
    let mut c = copies("0.2.0");
    c.core_requirements[0].1 = "^0.1.0".into();
    refused(&c, &["aerostrata-cli", "^0.1.0", "version = \"0.2.0\""]);
}

#[test]
fn a_mismatched_header_or_cbindgen_macro_is_refused() {
    let mut c = copies("0.1.0");
    c.header = c.header.replace("MINOR 1", "MINOR 2");
    refused(&c, &["aerostrata.h", "AEROSTRATA_VERSION_MINOR as 2, should be 1"]);
    let mut c = copies("0.1.0");
    c.cbindgen = c.cbindgen.replace("\"0.1.0\"", "\"0.1.1\"");
    refused(&c, &["cbindgen.toml", "AEROSTRATA_VERSION_STRING"]);
    let mut c = copies("0.1.0");
    c.header = c.header.replace("#define AEROSTRATA_VERSION_PATCH 0\n", "");
    refused(&c, &["does not define AEROSTRATA_VERSION_PATCH"]);
    // A longer name that starts the same is another macro.
    let mut c = copies("0.1.0");
    c.header.push_str("#define AEROSTRATA_VERSION_MAJOR_TEXT \"zero\"\n");
    assert_eq!(problems_of(&c), Vec::<String>::new());
}

#[test]
fn a_mismatched_npm_or_addin_version_is_refused() {
    let mut c = copies("0.1.0");
    c.package_json = c.package_json.replace("0.1.0", "0.1.2");
    refused(&c, &["package.json", "0.1.2"]);
    let mut c = copies("0.1.0");
    c.addin_description = c.addin_description.replace("@VERSION@", "0.0.9");
    refused(&c, &["addin/description.xml", "0.0.9"]);
    let mut c = copies("0.1.0");
    c.addin_description = c.addin_description.replace("@VERSION@", "0.1.0");
    assert_eq!(problems_of(&c), Vec::<String>::new());
}

#[test]
fn stale_library_names_and_dependency_lines_are_refused() {
    let mut c = copies("0.2.0");
    c.texts[0].1.push_str("links to libaerostrata.so.0.1 here\n");
    refused(&c, &["docs/c-guide.md line 2", "libaerostrata.so.0.1 ", "libaerostrata.so.0.2"]);
    let mut c = copies("0.2.0");
    c.texts[1].1 = "aerostrata = { version = \"0.1\", default-features = false }\n".into();
    refused(&c, &["README.md line 1", "\"0.1\"", "0.2.0"]);
    let mut c = copies("0.2.0");
    c.texts[1].1 = "aerostrata = \"0.1.0\"\nmy-aerostrata = \"9\"\n".into();
    refused(&c, &["README.md line 1"]);
    // A pattern, not a name: libaerostrata.so.MAJOR.MINOR; and the policy from 1.0 on.
    let mut c = copies("0.1.0");
    c.texts[0].1.push_str("it is `libaerostrata.so.MAJOR.MINOR`; from 1.0 `libaerostrata.so.1`.\n");
    assert_eq!(problems_of(&c), Vec::<String>::new());
}

#[test]
fn the_changelog_shape_is_checked() {
    // Keep a Changelog 1.1.0: Unreleased first, `## [X.Y.Z] - YYYY-MM-DD`, newest first,
    // the six kinds of change.
    let v = Version::parse("0.1.0").unwrap();
    let check = |text: &str| changelog_problems(text, &v);
    assert_eq!(check(CHANGELOG), Vec::<String>::new());
    let one = |text: &str, words: &[&str]| {
        let found = check(text);
        assert_eq!(found.len(), 1, "{found:#?}");
        for word in words {
            assert!(found[0].contains(word), "{word:?} not in {:?}", found[0]);
        }
    };
    one(&CHANGELOG.replace("## [Unreleased]\n", ""), &["no `## [Unreleased]`"]);
    one(&CHANGELOG.replace("2026-01-15", "15 January 2026"), &["not a date"]);
    one(&CHANGELOG.replace("2026-01-15", "2026-13-01"), &["not a date"]);
    one(&CHANGELOG.replace("[0.1.0] - ", "[0.1.0] "), &["is not `## [X.Y.Z] - YYYY-MM-DD`"]);
    one(&CHANGELOG.replace("### Fixed", "### Bugs"), &["`### Bugs` is not one of"]);
    one(&CHANGELOG.replace("### Fixed", "### Added"), &["a second `### Added`"]);
    let reordered = CHANGELOG.replace("### Added\n\n- The first", "### Fixed\n\n- The first").replacen(
        "### Fixed\n\n- A bug",
        "### Added\n\n- A bug",
        1,
    );
    one(&reordered, &["`### Added` after `### Fixed`"]);
    one(
        &CHANGELOG.replace("## [0.1.0] - 2026-01-15", "## [0.3.0] - 2026-01-15"),
        &["releases 0.3.0", "0.1.0"],
    );
    let older = format!("{CHANGELOG}\n## [0.2.0] - 2025-01-01\n\n### Added\n\n- Older.\n");
    one(&older, &["0.2.0 is listed below 0.1.0"]);
    let later_date = format!("{CHANGELOG}\n## [0.0.9] - 2026-02-01\n\n### Added\n\n- Older.\n");
    one(&later_date, &["0.0.9 dated 2026-02-01, after 0.1.0"]);
    let empty = format!("{CHANGELOG}\n## [0.0.9] - 2025-02-01\n");
    one(&empty, &["a release without any"]);
    let below =
        CHANGELOG.replace("## [Unreleased]\n\n### Added\n\n- Something new.\n\n", "") + "\n## [Unreleased]\n";
    assert!(
        check(&below).iter().any(|p| p.contains("a release before `## [Unreleased]`")),
        "{:?}",
        check(&below)
    );
    one(&CHANGELOG.replace("semver.org", "example.invalid"), &["Semantic Versioning"]);
}

#[test]
fn the_workspace_version_is_read_from_its_section() {
    let manifest =
        "[package]\nversion = \"9.9.9\"\n[workspace.package]\n# note\nversion = \"0.1.0\" # the crates\n";
    assert_eq!(workspace_version(manifest).unwrap().text, "0.1.0");
    assert!(workspace_version("[workspace]\nmembers = []\n").unwrap_err().contains("[workspace.package]"));
    assert_eq!(toml_string(manifest, "package", "version").as_deref(), Some("9.9.9"));
}

#[test]
fn the_rust_version_is_one_in_manifests_and_readme() {
    let mut c = copies("0.1.0");
    c.rust_versions[1].1 = "1.88".into();
    refused(&c, &["aerostrata-cli", "1.88", "1.85"]);
    let mut c = copies("0.1.0");
    c.readme = c.readme.replace("Rust 1.85 and", "Rust 1.80 and");
    refused(&c, &["README.md", "names Rust 1.80", "1.85"]);
    let mut c = copies("0.1.0");
    c.readme = c.readme.replace("## Minimum supported Rust version", "## Toolchains");
    refused(&c, &["README.md has no `## Minimum supported Rust version`"]);
}
