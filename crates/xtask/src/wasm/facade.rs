//! The package's entry over its two modules (bindings/wasm/js/parts.js): written from the
//! exports of the lite and the full builds' JS glue, so that every function and class
//! member the full module has is exported once, taken from the lite module when it has
//! it. A member the lite module has and the full module lacks is an error: the entry
//! could not give it after `loadFull()`.

use std::collections::BTreeMap;

/// What one build's glue exports.
#[derive(Debug, Default, PartialEq)]
pub struct Exports {
    /// The functions, without the module's hidden ones (`__` names) and its initialisers.
    pub functions: Vec<String>,
    /// The classes by name.
    pub classes: BTreeMap<String, Class>,
}

/// The public members of one exported class.
#[derive(Debug, Default, PartialEq)]
pub struct Class {
    /// Whether it has a constructor of its own.
    pub constructor: bool,
    pub statics: Vec<String>,
    pub methods: Vec<String>,
    pub getters: Vec<String>,
}

/// Methods the modules add to a class when they start (glue.js's `guardFreed`), which
/// the glue's class body does not show.
const ADDED_METHODS: [(&str, &str); 1] = [("AtmosphereModel", "batchInto")];

/// The word for a class's objects in messages ("this model was freed"), as the module's
/// own start (lib.rs) says it.
const OBJECT_WORDS: [(&str, &str); 2] = [("AtmosphereModel", "model"), ("WindProfile", "wind profile")];

fn identifier(text: &str) -> String {
    text.chars().take_while(|c| c.is_alphanumeric() || *c == '_' || *c == '$').collect()
}

/// The exports of wasm-bindgen's glue for the web target (the version is pinned; its
/// classes are `export class NAME {` ... `}` with members indented four spaces).
pub fn exports(glue: &str) -> Result<Exports, String> {
    let mut out = Exports::default();
    let mut class: Option<(String, Class)> = None;
    for (n, line) in glue.lines().enumerate() {
        if let Some((name, members)) = class.as_mut() {
            if line == "}" {
                let (name, members) = class.take().unwrap_or_default();
                out.classes.insert(name, members);
                continue;
            }
            let Some(member) = line.strip_prefix("    ") else { continue };
            if member.starts_with(' ')
                || member.starts_with('}')
                || member.starts_with('/')
                || member.starts_with('*')
            {
                continue;
            }
            let (list, rest) = if let Some(rest) = member.strip_prefix("static ") {
                (&mut members.statics, rest)
            } else if let Some(rest) = member.strip_prefix("get ") {
                (&mut members.getters, rest)
            } else if member.starts_with("set ") {
                return Err(format!(
                    "glue line {}: class {name} has a setter, which the entry cannot forward",
                    n + 1
                ));
            } else if member.starts_with("constructor(") {
                members.constructor = true;
                continue;
            } else {
                (&mut members.methods, member)
            };
            let id = identifier(rest);
            if !id.is_empty() && rest[id.len()..].starts_with('(') && !id.starts_with("__") && id != "free" {
                list.push(id);
            }
        } else if let Some(rest) = line.strip_prefix("export class ") {
            class = Some((identifier(rest), Class::default()));
        } else if let Some(rest) = line.strip_prefix("export function ") {
            let id = identifier(rest);
            if !id.starts_with("__") && id != "initSync" {
                out.functions.push(id);
            }
        } else if line.starts_with("export {") && line != "export { initSync, __wbg_init as default };" {
            return Err(format!("glue line {}: an export the entry does not know: {line}", n + 1));
        }
    }
    for (class, method) in ADDED_METHODS {
        if let Some(members) = out.classes.get_mut(class) {
            members.methods.push(method.to_owned());
        }
    }
    Ok(out)
}

/// `{name: inLite, ...}` for the members of `full`, `inLite` when `lite` has it too.
fn members(full: &[String], lite: Option<&[String]>) -> String {
    let items: Vec<String> =
        full.iter().map(|m| format!("{m}: {}", lite.is_some_and(|l| l.contains(m)))).collect();
    format!("{{ {} }}", items.join(", "))
}

/// Every member of `lite` is in `full` (else the entry could not give it after `loadFull`).
fn check_subset(lite: &Exports, full: &Exports) -> Result<(), String> {
    let missing = |what: &str, names: &[String], of: &[String]| -> Result<(), String> {
        match names.iter().find(|n| !of.contains(n)) {
            Some(n) => Err(format!("the lite module has {what} {n}, which the full module lacks")),
            None => Ok(()),
        }
    };
    missing("the function", &lite.functions, &full.functions)?;
    for (name, l) in &lite.classes {
        let f = full
            .classes
            .get(name)
            .ok_or_else(|| format!("the lite module has the class {name}, which the full module lacks"))?;
        missing(&format!("{name}'s static"), &l.statics, &f.statics)?;
        missing(&format!("{name}'s method"), &l.methods, &f.methods)?;
        missing(&format!("{name}'s getter"), &l.getters, &f.getters)?;
        if l.constructor && !f.constructor {
            return Err(format!("the lite module's {name} has a constructor, which the full module's lacks"));
        }
    }
    Ok(())
}

/// The entry's exports, as `(name, expression)` over `p`, what parts.js's `parts` gave.
fn entries(lite: &Exports, full: &Exports) -> Result<Vec<(String, String)>, String> {
    check_subset(lite, full)?;
    let mut out: Vec<(String, String)> =
        ["loadFull", "fullLoaded", "loadUpper"].iter().map(|n| ((*n).to_owned(), format!("p.{n}"))).collect();
    for (name, f) in &full.classes {
        let l = lite.classes.get(name);
        let what = OBJECT_WORDS.iter().find(|(c, _)| c == name).map(|(_, w)| *w).ok_or_else(|| {
            format!("the class {name} has no word for its objects in facade.rs's OBJECT_WORDS")
        })?;
        let ctor = match (f.constructor, l.is_some_and(|l| l.constructor)) {
            (false, _) => "null",
            (true, true) => "true",
            (true, false) => "false",
        };
        out.push((
            name.clone(),
            format!(
                "p.cls(\"{name}\", {{\n  what: \"{what}\",\n  ctor: {ctor},\n  statics: {},\n  methods: {},\n  getters: {},\n}})",
                members(&f.statics, l.map(|l| l.statics.as_slice())),
                members(&f.methods, l.map(|l| l.methods.as_slice())),
                members(&f.getters, l.map(|l| l.getters.as_slice())),
            ),
        ));
    }
    for name in &full.functions {
        out.push((name.clone(), format!("p.fn(\"{name}\", {})", lite.functions.contains(name))));
    }
    Ok(out)
}

const HEADER: &str = "// The package's entry, written by `cargo xtask wasm` (crates/xtask/src/wasm/facade.rs)
// from the exports of its two modules: the default one in lite/ and the full one in full/,
// loaded by `loadFull()`. How the two are joined: parts.js beside this file.
";

/// The web build's entry, an ES module.
pub fn web_entry(lite: &Exports, full: &Exports) -> Result<String, String> {
    let mut out = String::from(HEADER);
    out.push_str(
        "
import * as lite from \"./lite/aerostrata.js\";
import { parts } from \"./parts.js\";

const p = parts(
  lite,
  async (source) => {
    const full = await import(\"./full/aerostrata.js\");
    await full.default({ module_or_path: source });
    return full;
  },
  {
    full: new URL(\"./full/aerostrata_bg.wasm\", import.meta.url),
    upper: new URL(\"./aerostrata_upper.bin\", import.meta.url),
  },
  false,
);

/** Instantiates the default module (aerostrata_bg.wasm beside this file unless given). */
export default function init(input) {
  return lite.default(input);
}

/** Instantiates the default module synchronously from its bytes or a compiled module. */
export function initSync(module) {
  return lite.initSync(module);
}
",
    );
    for (name, expression) in entries(lite, full)? {
        out.push_str(&format!("\nexport const {name} = {expression};\n"));
    }
    Ok(out)
}

/// The Node build's entry, CommonJS.
pub fn node_entry(lite: &Exports, full: &Exports) -> Result<String, String> {
    let mut out = String::from(HEADER);
    out.push_str(
        "
\"use strict\";
const lite = require(\"./lite/aerostrata.js\");
const { parts } = require(\"./parts.js\");

// The Node build of the full module reads its own file when required.
const p = parts(
  lite,
  async () => require(\"./full/aerostrata.js\"),
  { full: null, upper: require(\"path\").join(__dirname, \"aerostrata_upper.bin\") },
  true,
);
",
    );
    for (name, expression) in entries(lite, full)? {
        out.push_str(&format!("\nexports.{name} = {expression};\n"));
    }
    Ok(out)
}

/// The entry's types: the full build's declarations (every export, `loadFull` among the
/// module's own declarations), with the web build's initialisers' types the lite
/// module's, which `init` and `initSync` instantiate.
pub fn web_types(lite_types: &str, full_types: &str) -> Result<String, String> {
    const INIT: &str = "export type InitInput";
    let head = full_types.find(INIT).ok_or("the full module's .d.ts has no InitInput")?;
    let tail = lite_types.find(INIT).ok_or("the lite module's .d.ts has no InitInput")?;
    Ok(format!("{}{}", &full_types[..head], &lite_types[tail..]))
}

/// The line each declaration only the full module has gets in its doc comment.
const NEEDS_FULL: &str = "Needs the full module: call `await loadFull()` first (the default module throws an `Error` that says so).";

/// `types` (a `.d.ts` of the full module's) with [`NEEDS_FULL`] added to the doc comment
/// of every function, class and class member of `full` that `lite` lacks, so that an
/// editor shows it beside the declaration (the entry's own functions, `loadFull` and the
/// like, are neither's exports and stay as they are).
pub fn mark_full_only(types: &str, lite: &Exports, full: &Exports) -> String {
    let mut out: Vec<String> = Vec::new();
    let mut class: Option<String> = None;
    for line in types.lines() {
        let full_only = if let Some(rest) = line.strip_prefix("export function ") {
            let id = identifier(rest);
            full.functions.contains(&id) && !lite.functions.contains(&id)
        } else if let Some(rest) = line.strip_prefix("export class ") {
            class = Some(identifier(rest));
            !lite.classes.contains_key(&identifier(rest))
        } else if line == "}" {
            class = None;
            false
        } else if let (Some(name), Some(member)) = (&class, line.strip_prefix("    ")) {
            member_full_only(lite.classes.get(name), member)
        } else {
            false
        };
        if full_only {
            let indent: String = line.chars().take_while(|c| *c == ' ').collect();
            if out.last().is_some_and(|l| l.trim() == "*/") {
                let at = out.len() - 1;
                out.splice(at..at, [format!("{indent} *"), format!("{indent} * {NEEDS_FULL}")]);
            } else {
                out.push(format!("{indent}/** {NEEDS_FULL} */"));
            }
        }
        out.push(line.to_owned());
    }
    out.push(String::new());
    out.join("\n")
}

/// Whether the declaration `member` (a line of a class's body, unindented) is one the
/// lite module's class `lite` lacks (every member when it lacks the class); not for doc
/// lines, `free`, `[Symbol.dispose]` or the private constructor.
fn member_full_only(lite: Option<&Class>, member: &str) -> bool {
    let (kind, rest) = if let Some(rest) = member.strip_prefix("static ") {
        ("static", rest)
    } else if let Some(rest) = member.strip_prefix("readonly ") {
        ("getter", rest)
    } else {
        ("method", member)
    };
    let id = identifier(rest);
    if id.is_empty() || ["free", "private"].contains(&id.as_str()) || member.starts_with(' ') {
        return false;
    }
    let Some(lite) = lite else { return true };
    match (kind, id.as_str()) {
        ("method", "constructor") => !lite.constructor,
        ("static", _) => !lite.statics.contains(&id),
        ("getter", _) => !lite.getters.contains(&id),
        _ => !lite.methods.contains(&id),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    const GLUE: &str = "export class AtmosphereModel {
    static __wrap(ptr) {
        return 1;
    }
    free() {
        wasm.x();
    }
    /**
     * @returns {string}
     */
    get kind() {
        return 2;
    }
    state(altitudeM, altitudeKind) {
        return 3;
    }
    static standard(offsetK) {
        return 4;
    }
    [Symbol.dispose]() {}
}
export function __aerostrataStart() {}
export function version() {}
export { initSync, __wbg_init as default };
";

    /// The glue above with one function more, as the full module's.
    fn full_glue() -> String {
        GLUE.replace(
            "export function version() {}",
            "export function version() {}\nexport function parseValue() {}",
        )
    }

    #[test]
    fn the_glue_gives_its_public_members_and_the_added_ones() {
        let e = exports(GLUE).unwrap();
        assert_eq!(e.functions, ["version"]);
        let c = &e.classes["AtmosphereModel"];
        assert!(!c.constructor);
        assert_eq!(c.statics, ["standard"]);
        assert_eq!(c.methods, ["state", "batchInto"]);
        assert_eq!(c.getters, ["kind"]);
    }

    #[test]
    fn members_the_full_module_lacks_are_refused_and_the_rest_say_where_they_are() {
        let lite = exports(GLUE).unwrap();
        let mut full = exports(&full_glue()).unwrap();
        let entry = web_entry(&lite, &full).unwrap();
        assert!(entry.contains("export const version = p.fn(\"version\", true);"), "{entry}");
        assert!(entry.contains("export const parseValue = p.fn(\"parseValue\", false);"), "{entry}");
        assert!(entry.contains("statics: { standard: true }"), "{entry}");
        assert!(node_entry(&lite, &full).unwrap().contains("exports.loadFull = p.loadFull;"));
        full.functions.retain(|f| f != "version");
        assert!(web_entry(&lite, &full).unwrap_err().contains("function version"));
        full.classes.get_mut("AtmosphereModel").unwrap().getters.clear();
        assert!(check_subset(&lite, &full).is_err());
    }

    #[test]
    fn the_full_modules_declarations_say_so_in_their_docs() {
        let lite = exports(GLUE).unwrap();
        let types = "/**
 * Reads a value.
 */
export function parseValue(text: string): number;
/** The version. */
export function version(): string;
export class AtmosphereModel {
    private constructor();
    free(): void;
    /**
     * A state.
     */
    state(altitudeM: number): AtmosphereState;
    scanFlight(timeS: number[]): FlightScanResult;
    static fromSpec(spec: string): AtmosphereModel;
    readonly kind: ModelKind;
}
export class WindProfile {
    readonly levelCount: number;
}
";
        let full = exports(&full_glue()).unwrap();
        let marked =
            mark_full_only(&format!("{types}export function loadFull(): Promise<void>;\n"), &lite, &full);
        let expected = format!(
            "/**
 * Reads a value.
 *
 * {NEEDS_FULL}
 */
export function parseValue(text: string): number;
/** The version. */
export function version(): string;
export class AtmosphereModel {{
    private constructor();
    free(): void;
    /**
     * A state.
     */
    state(altitudeM: number): AtmosphereState;
    /** {NEEDS_FULL} */
    scanFlight(timeS: number[]): FlightScanResult;
    /** {NEEDS_FULL} */
    static fromSpec(spec: string): AtmosphereModel;
    readonly kind: ModelKind;
}}
/** {NEEDS_FULL} */
export class WindProfile {{
    /** {NEEDS_FULL} */
    readonly levelCount: number;
}}
export function loadFull(): Promise<void>;
"
        );
        assert_eq!(marked, expected);
    }

    #[test]
    fn an_unknown_export_or_a_setter_is_an_error() {
        assert!(exports("export { x as y };").is_err());
        assert!(exports("export class A {\n    set x(v) {\n    }\n}\n").is_err());
    }
}
