//! The Rust door, which is the core itself: its reference vectors (`vectors`, read by
//! `vector_file`) and the validation report written from them (`validate`), the generated
//! upper-atmosphere table (`upper`) and that table's flash cost on Cortex-M (`flash`).
//!
//! `upper.rs`, `vector_file.rs` and `vector_values.rs` stay at the top of src/: the first
//! is edited on another branch, the second is included by path from
//! tests/firmware/build.rs and the third from tests/firmware/src/vectors.rs.

pub mod flash;
#[path = "../upper.rs"]
pub mod upper;
pub mod validate;
#[path = "../vector_file.rs"]
pub mod vector_file;
#[path = "../vector_values.rs"]
pub mod vector_values;
pub mod vectors;
