//! The C door's automation: the committed header regenerated (or checked) with a pinned
//! cbindgen (`header`), reading the C source generated from the quantity catalogue
//! (`catalogue`, shared with bindings/c's build script), the library laid out as a C
//! package (`package`), and the C tests against it (`c_test`), among them the altimeter
//! example built as a C project would build it (`altimeter`), and a consumer built from a
//! copy of the package in a fresh folder (`consumer`).

mod altimeter;
pub mod c_test;
pub mod consumer;
// The generator of the C door's catalogue source lives with the build script that
// writes it; `header` and the C firmware's accessors need it too.
#[path = "../../../../bindings/c/build/catalogue.rs"]
mod catalogue;

pub use catalogue::{field as field_name, species_field};
pub mod header;
pub mod package;
