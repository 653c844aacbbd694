//! The quantity ids, the catalogue's texts and the records whose fields are catalogue
//! quantities, written by the build script (build/catalogue.rs) from the core's quantity
//! catalogue, so that the header's ids and fields are the catalogue's. cbindgen does not
//! follow `include!`: `cargo xtask header` hands it a copy of this crate in which the
//! generated text stands in this file's place.

include!(concat!(env!("OUT_DIR"), "/catalogue.rs"));
