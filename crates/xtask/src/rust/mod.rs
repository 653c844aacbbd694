//! The Rust door, which is the core itself: its reference vectors (`vectors`, read by
//! `vector_file`) and the validation report written from them (`validate`), the generated
//! upper-atmosphere table (`upper`) and that table's flash cost on Cortex-M (`flash`).
//!
//! `upper.rs` and `vector_file.rs` stay at the top of src/: the first is edited on
//! another branch, the second is included by path from tests/firmware/build.rs.

pub mod flash;
#[path = "../upper.rs"]
pub mod upper;
pub mod validate;
#[path = "../vector_file.rs"]
pub mod vector_file;
pub mod vectors;
