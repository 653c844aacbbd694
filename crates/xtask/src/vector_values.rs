//! The value each column of a reference-vector file names, computed through the core:
//! the quantities of an atmosphere's state and the 1976 standard's species, by their
//! catalogue names in SI (`temperature_K`, `n_N2_m3`); the isentropic ratios `p_p0`,
//! `rho_rho0`, `t_t0`, `a_astar` (A/A*) and `qc_p` (impact over static pressure); the
//! normal-shock relations `m2`, `p2_p1`, `rho2_rho1`, `t2_t1`, `p02_p01`, `p02_p1`
//! (Rayleigh pitot) and `p1_p02`.
//!
//! `no_std` and allocation-free: the native check (`rust/vectors.rs`) and the firmware
//! harness (tests/firmware/src/vectors.rs includes this file with `#[path]`) evaluate
//! every column by the same code, so that their bit lines can only differ by the target.

use aerostrata::quantity::Group;
use aerostrata::{Altitude, Error, PerfectGas, Quantity, State, US1976};

/// The value the column `heading` names in a row whose `state` is at `altitude`: a
/// quantity of the state, or a species' number density of the standard, written in its
/// SI unit or with none. `None` when the column names no such quantity; `Some(None)`
/// where the model defines none there.
pub fn atmosphere(state: &State, altitude: Altitude, heading: &str) -> Option<Option<f64>> {
    let read = Quantity::from_column(heading).ok()?;
    let q = read.quantity;
    if read.unit.is_some_and(|unit| unit != q.si()) {
        return None;
    }
    match q.info().group {
        Group::State => Some(state.get(q).ok()),
        Group::Species => Some(US1976.species(altitude).and_then(|n| n.get(q)).ok()),
        _ => None,
    }
}

/// The columns of an `isentropic` file at Mach `mach`.
///
/// # Errors
/// The core's, for a Mach number or ratio it refuses.
pub fn isentropic(gas: &PerfectGas, mach: f64) -> Result<[(&'static str, f64); 5], Error> {
    Ok([
        ("p_p0", gas.pressure_ratio(mach)?),
        ("rho_rho0", gas.density_ratio(mach)?),
        ("t_t0", gas.temperature_ratio(mach)?),
        ("a_astar", gas.area_ratio(mach)?),
        ("qc_p", gas.impact_pressure_ratio(mach)?),
    ])
}

/// The columns of a `normal_shock` file at upstream Mach `mach`.
///
/// # Errors
/// The core's, for an upstream Mach number it refuses (below 1, say).
pub fn normal_shock(gas: &PerfectGas, mach: f64) -> Result<[(&'static str, f64); 7], Error> {
    let shock = gas.normal_shock(mach)?;
    Ok([
        ("m2", shock.downstream_mach),
        ("p2_p1", shock.pressure_ratio),
        ("rho2_rho1", shock.density_ratio),
        ("t2_t1", shock.temperature_ratio),
        ("p02_p01", shock.total_pressure_ratio),
        ("p02_p1", shock.pitot_pressure_ratio),
        ("p1_p02", 1.0 / shock.pitot_pressure_ratio),
    ])
}

/// The value the column `heading` names among a compressible-flow row's `columns`, as
/// [`atmosphere`] gives it (a flow relation is defined wherever it is computed).
pub fn flow(columns: &[(&'static str, f64)], heading: &str) -> Option<Option<f64>> {
    columns.iter().find(|(name, _)| *name == heading).map(|(_, value)| Some(*value))
}
