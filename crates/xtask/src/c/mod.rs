//! The C door's automation: the committed header regenerated (or checked) with a pinned
//! cbindgen (`header`), after the C source generated from the quantity catalogue (`catalogue`), the library laid out as a C package (`package`), and the C tests
//! against it (`c_test`), among them the altimeter example built as a C project would
//! build it (`altimeter`).

mod altimeter;
pub mod c_test;
mod catalogue;

pub use catalogue::field as field_name;
pub mod header;
pub mod package;
