//! The ways of building the module that `cargo xtask wasm-bench` measures side by side:
//! the optimisation level of the core crate and of the whole module (the `wasm-release`
//! profile of the root Cargo.toml, overridden with `cargo --config`), wasm-opt's level,
//! and wasm's SIMD instructions. The package ships [`SHIPPED`]; the others are built only
//! to be measured against it.

/// One way of building the module.
pub struct Variant {
    /// A short name for tables and directories.
    pub name: &'static str,
    /// What differs, for the report.
    pub description: &'static str,
    /// `cargo --config` settings over the root Cargo.toml's `wasm-release` profile.
    pub profile: &'static [&'static str],
    /// wasm-opt's optimisation flag.
    pub wasm_opt: &'static str,
    /// Built with `-C target-feature=+simd128` (toolchain.rs's `WASM_RUSTFLAGS`).
    pub simd: bool,
}

/// The module as `cargo xtask wasm` builds it: the root Cargo.toml's profile as it
/// stands (the core crate at opt-level 2, the rest at "z"), wasm-opt `-O1`, SIMD on.
///
/// wasm-opt at `-O1`, not `-Oz`: measured side by side (docs/performance.md), `-O1`
/// leaves the module 12 KiB larger but 2.6 KiB smaller gzipped, and the batch about 9 %
/// faster in V8 (26.8 against 29.2 ms a million states); `-O2`, `-Os` and `-Oz` are as
/// slow as each other.
pub const SHIPPED: Variant = Variant {
    name: "shipped",
    description: "the package: the core crate at opt-level 2, the rest at \"z\", wasm-opt -O1, simd128",
    profile: &[],
    wasm_opt: "-O1",
    simd: true,
};

/// The others, each one change or two from [`SHIPPED`], in the order they are built
/// (the one without SIMD last: its different flags rebuild every crate).
pub const OTHERS: [Variant; 7] = [
    Variant {
        name: "core-z",
        description: "the core crate at opt-level \"z\" (as the rest of the module), wasm-opt -O1, simd128",
        profile: &["profile.wasm-release.package.aerostrata.opt-level=\"z\""],
        wasm_opt: "-O1",
        simd: true,
    },
    Variant {
        name: "core-s",
        description: "the core crate at opt-level \"s\", wasm-opt -O1, simd128",
        profile: &["profile.wasm-release.package.aerostrata.opt-level=\"s\""],
        wasm_opt: "-O1",
        simd: true,
    },
    Variant {
        name: "core-3",
        description: "the core crate at opt-level 3, wasm-opt -O1, simd128",
        profile: &["profile.wasm-release.package.aerostrata.opt-level=3"],
        wasm_opt: "-O1",
        simd: true,
    },
    Variant {
        name: "core-2-O0",
        description: "the package's build with wasm-opt -O0 (stripped only)",
        profile: &[],
        wasm_opt: "-O0",
        simd: true,
    },
    Variant {
        name: "core-2-Oz",
        description: "the package's build with wasm-opt -Oz",
        profile: &[],
        wasm_opt: "-Oz",
        simd: true,
    },
    Variant {
        name: "all-3",
        description: "the whole module at opt-level 3, wasm-opt -O1, simd128",
        profile: &["profile.wasm-release.opt-level=3"],
        wasm_opt: "-O1",
        simd: true,
    },
    Variant {
        name: "no-simd",
        description:
            "the package's build without simd128 (libm's software square root, no vector instructions)",
        profile: &[],
        wasm_opt: "-O1",
        simd: false,
    },
];
