//! The shape of the upper atmosphere's generated table: runs of equally spaced nodes.
//! The generated data (`upper_table.rs`, written by `cargo xtask upper-table`) and the
//! interpolation that reads it (`mod.rs`) both use this type; neither imports the other.

/// One run of equally spaced table nodes.
pub(super) struct Segment {
    /// Geometric altitude of the first node, m.
    pub(super) start_m: f64,
    /// Geometric altitude of the last node, m.
    pub(super) end_m: f64,
    /// Node spacing, m.
    pub(super) step_m: f64,
    /// Index of the first node in the table.
    pub(super) first: u16,
    /// Number of intervals (nodes - 1).
    pub(super) intervals: u16,
}
