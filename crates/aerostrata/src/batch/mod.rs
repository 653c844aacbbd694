//! Many altitudes at once: the state quantities a caller asks for, written into columns
//! the caller provides, with no allocation and the very bits of `state(alt).get(q)`.
//!
//! The work is done a block of altitudes at a time: first the air (T, p, M) of every
//! altitude of the block, then each requested column over the whole block, each by the
//! same expression [`State::new`](crate::State::new) uses, so that only what is asked is
//! computed. For the 1976 standard ([`Us1976::batch`](crate::Us1976::batch)) the air of a
//! block up to 86 km is computed a step at a time over all its altitudes, without
//! branches, so that the compiler runs the steps on several altitudes at once (SSE2 on
//! x86-64, simd128 in the web module), with the scalar path's very operations.
//!
//! Errors, decided: the first failing element (in input order) stops the batch, and its
//! index comes back with the core's own error ([`BatchError::Element`]); every column holds
//! the values of the elements before it, and the elements from it on are left as they
//! were. An element fails exactly where the scalar path fails: an altitude out of range
//! or not finite, or a continuum property (speed of sound, viscosity, conductivity)
//! asked where the model does not define it (above 86 km), with the error
//! `state(alt).get(q)` gives. Method: common practice, no source.

mod standard;

#[cfg(feature = "rayon")]
pub mod parallel;

use crate::altitude::{Altitude, AltitudeKind};
use crate::constants::{SEA_LEVEL_DENSITY_KG_M3, SEA_LEVEL_PRESSURE_PA, SEA_LEVEL_TEMPERATURE_K};
use crate::error::Error;
use crate::gas::{conductivity, sutherland, Air, COLLISION_CROSS_SECTION_M2};
use crate::model::Atmosphere;
use crate::quantity::{Group, Quantity};
use crate::state::State;

/// Altitudes per block: the block's altitudes and airs (64 bytes each, 2 KiB in all) and
/// the standard's lanes (about 3.5 KiB more) live on the stack, small enough for a
/// microcontroller's, and stay in the first-level cache. 32, 64 and 128 run equally fast
/// (the one-thread batch of `cargo xtask batch-bench`), so the smallest.
pub(crate) const BLOCK: usize = 32;

/// Why a batch stopped.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum BatchError {
    /// The numbers of quantities and of output columns differ.
    ColumnCount {
        /// Quantities asked.
        quantities: usize,
        /// Output columns given.
        columns: usize,
    },
    /// An output column is not exactly as long as the altitudes.
    ColumnLength {
        /// Which column (0 is the first).
        column: usize,
        /// Its length.
        len: usize,
        /// The number of altitudes.
        altitudes: usize,
    },
    /// A quantity asked is not a property of the atmosphere's state
    /// ([`Error::NotCarried`], as [`State::get`](crate::State::get) reports it).
    Quantity {
        /// Which column (0 is the first).
        column: usize,
        /// The core's error.
        error: Error,
    },
    /// The element at `index` failed as `state(alt).get(q)` fails there; the columns hold
    /// every element before it.
    Element {
        /// Which altitude (0 is the first).
        index: usize,
        /// The core's error, as the scalar path gives it.
        error: Error,
    },
}

impl BatchError {
    /// The core's error behind this one, where there is one.
    pub fn error(&self) -> Option<Error> {
        match *self {
            Self::Quantity { error, .. } | Self::Element { error, .. } => Some(error),
            Self::ColumnCount { .. } | Self::ColumnLength { .. } => None,
        }
    }
}

impl core::fmt::Display for BatchError {
    fn fmt(&self, f: &mut core::fmt::Formatter<'_>) -> core::fmt::Result {
        match self {
            Self::ColumnCount { quantities, columns } => write!(
                f,
                "a batch needs one output column per quantity: {quantities} quantities, {columns} columns; \
                 give as many columns as quantities"
            ),
            Self::ColumnLength { column, len, altitudes } => write!(
                f,
                "batch output column {column} holds {len} values for {altitudes} altitudes; give every column \
                 exactly one value per altitude"
            ),
            Self::Quantity { column, error } => write!(f, "batch quantity {column}: {error}"),
            Self::Element { index, error } => write!(f, "batch altitude {index}: {error}"),
        }
    }
}

impl core::error::Error for BatchError {}

/// The request checked: as many columns as quantities, each as long as the altitudes,
/// every quantity one the state carries.
pub(crate) fn check_request(
    count: usize,
    quantities: &[Quantity],
    outputs: &[&mut [f64]],
) -> Result<(), BatchError> {
    if quantities.len() != outputs.len() {
        return Err(BatchError::ColumnCount { quantities: quantities.len(), columns: outputs.len() });
    }
    for (column, (quantity, output)) in quantities.iter().zip(outputs).enumerate() {
        if quantity.info().group != Group::State {
            let error = Error::NotCarried { quantity: quantity.name(), result: "an atmosphere state" };
            return Err(BatchError::Quantity { column, error });
        }
        if output.len() != count {
            return Err(BatchError::ColumnLength { column, len: output.len(), altitudes: count });
        }
    }
    Ok(())
}

/// The state quantities of any model at `altitudes_m` (each of the kind `kind`), one
/// column per quantity of `quantities`, written into `outputs` (column `c` gets
/// quantity `c`), every value bit for bit `model.state(alt)?.get(q)?`.
///
/// For the 1976 standard [`Us1976::batch`](crate::Us1976::batch) is faster (its layers
/// lane-wise); this one asks `model.air` for every altitude.
///
/// ```
/// use aerostrata::batch;
/// use aerostrata::{AltitudeKind, Atmosphere, Isothermal, Quantity};
/// let model = Isothermal::new(250.0, 100_000.0)?;
/// let altitudes = [0.0, 1_000.0, 2_000.0];
/// let (mut t, mut p) = ([0.0; 3], [0.0; 3]);
/// batch::evaluate(&model, AltitudeKind::Geometric, &altitudes, &[Quantity::Temperature, Quantity::Pressure],
///     &mut [&mut t, &mut p]).unwrap();
/// assert_eq!(t, [250.0; 3]);
/// assert_eq!(p[0], 100_000.0);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`BatchError::ColumnCount`], [`BatchError::ColumnLength`] or
/// [`BatchError::Quantity`] for a malformed request (nothing written);
/// [`BatchError::Element`] for the first altitude where the scalar path fails (the
/// columns hold every element before it).
pub fn evaluate<A: Atmosphere + ?Sized>(
    model: &A,
    kind: AltitudeKind,
    altitudes_m: &[f64],
    quantities: &[Quantity],
    outputs: &mut [&mut [f64]],
) -> Result<(), BatchError> {
    check_request(altitudes_m.len(), quantities, outputs)?;
    run(altitudes_m, quantities, outputs, 0, |inputs, block| {
        each_alone(inputs, block, |meters| {
            let altitude = kind.altitude(meters)?;
            Ok((altitude, model.air(altitude)?))
        })
    })
}

/// Fills `block` from `inputs` one altitude at a time by `air`, stopping at the first
/// failure with its index (the slots from it on are left as they were).
pub(crate) fn each_alone(
    inputs: &[f64],
    block: &mut [(Altitude, Air)],
    mut air: impl FnMut(f64) -> Result<(Altitude, Air), Error>,
) -> Result<(), (usize, Error)> {
    for (j, (&meters, slot)) in inputs.iter().zip(block.iter_mut()).enumerate() {
        *slot = air(meters).map_err(|error| (j, error))?;
    }
    Ok(())
}

/// The block loop behind every batch, on a checked request: `airs` writes the altitude
/// and air of each input of a block into its slot, or stops at the first input where the
/// scalar path fails and gives its index in the block and the error; `offset` is the
/// index of the first input in the caller's whole batch (the parallel chunks), for the
/// error's index.
pub(crate) fn run(
    altitudes_m: &[f64],
    quantities: &[Quantity],
    outputs: &mut [&mut [f64]],
    offset: usize,
    mut airs: impl FnMut(&[f64], &mut [(Altitude, Air)]) -> Result<(), (usize, Error)>,
) -> Result<(), BatchError> {
    let mut block = Block::new();
    for (number, inputs) in altitudes_m.chunks(BLOCK).enumerate() {
        block.columns(inputs, number * BLOCK, offset, quantities, outputs, &mut airs)?;
    }
    Ok(())
}

/// The altitudes and airs of one block of inputs, and the columns written from them.
pub(crate) struct Block {
    slots: [(Altitude, Air); BLOCK],
}

impl Block {
    pub(crate) fn new() -> Self {
        // Overwritten before it is read: `columns` reads only the slots it has just
        // filled. (Sea level and unit air are valid: the placeholder needs no check.)
        let placeholder = (AltitudeKind::Geometric.checked_by_caller(0.0), Air::trusted(1.0, 1.0, 1.0));
        Self { slots: [placeholder; BLOCK] }
    }

    /// Fills the slots from `inputs` (at most [`BLOCK`], the first at index `start` of
    /// the caller's columns and `offset + start` of the whole batch) by `airs`, then
    /// writes the quantities' columns up to the first failure, which it returns.
    pub(crate) fn columns(
        &mut self,
        inputs: &[f64],
        start: usize,
        offset: usize,
        quantities: &[Quantity],
        outputs: &mut [&mut [f64]],
        airs: &mut impl FnMut(&[f64], &mut [(Altitude, Air)]) -> Result<(), (usize, Error)>,
    ) -> Result<(), BatchError> {
        let count = inputs.len().min(BLOCK);
        let (mut failure, mut filled) = match airs(inputs, &mut self.slots[..count]) {
            Ok(()) => (None, count),
            Err((j, error)) => (Some((j, error)), j),
        };
        // A continuum property asked of rarefied air fails before any air error after it.
        if quantities.iter().any(|q| q.info().may_be_undefined) {
            if let Some(j) = self.slots[..filled].iter().position(|(_, air)| !air.is_continuum()) {
                let (altitude, air) = self.slots[j];
                let state = State::new(altitude, air);
                if let Some(error) = quantities.iter().find_map(|&q| state.get(q).err()) {
                    failure = Some((j, error));
                    filled = j;
                }
            }
        }
        let slots = &self.slots;
        for (&quantity, output) in quantities.iter().zip(outputs.iter_mut()) {
            if let Some(column) = output.get_mut(start..start + filled) {
                fill(quantity, column, |j| slots[j % BLOCK]);
            }
        }
        match failure {
            Some((j, error)) => Err(BatchError::Element { index: offset + start + j, error }),
            None => Ok(()),
        }
    }
}
/// Writes `column[j] = f(altitude_j, air_j)` over a block, `piece(j)` giving the
/// altitude and air of element j: one loop per quantity, so that the choice of the
/// quantity is made once per block, not once per element.
#[inline(always)]
fn each(column: &mut [f64], piece: &impl Fn(usize) -> (Altitude, Air), f: impl Fn(Altitude, &Air) -> f64) {
    for (j, slot) in column.iter_mut().enumerate() {
        let (altitude, air) = piece(j);
        *slot = f(altitude, &air);
    }
}

/// Column `quantity` of a block (`piece(j)` the altitude and air of element j), each
/// value by the expression of [`State::new`] (a test checks every quantity against
/// [`State::get`] bit for bit). The continuum properties by their formulas alone: the
/// callers stop before any rarefied air.
#[inline(always)]
pub(crate) fn fill(quantity: Quantity, column: &mut [f64], piece: impl Fn(usize) -> (Altitude, Air)) {
    use Quantity as Q;
    match quantity {
        Q::GeometricAltitude => each(column, &piece, |h, _| h.geometric().meters()),
        Q::GeopotentialAltitude => each(column, &piece, |h, _| h.geopotential().meters()),
        Q::Temperature => each(column, &piece, |_, air| air.temperature_k()),
        Q::MolecularTemperature => each(column, &piece, |_, air| air.molecular_temperature_k()),
        Q::Pressure => each(column, &piece, |_, air| air.pressure_pa()),
        Q::Density => each(column, &piece, |_, air| air.density_kg_m3()),
        Q::SpeedOfSound => each(column, &piece, |_, air| air.continuum_speed_of_sound_m_s()),
        Q::DynamicViscosity => each(column, &piece, |_, air| sutherland(air.temperature_k())),
        Q::KinematicViscosity => {
            each(column, &piece, |_, air| sutherland(air.temperature_k()) / air.density_kg_m3())
        }
        Q::ThermalConductivity => each(column, &piece, |_, air| conductivity(air.temperature_k())),
        Q::Gravity => each(column, &piece, |h, _| h.geometric().gravity_m_s2()),
        Q::PressureScaleHeight => {
            each(column, &piece, |h, air| air.pressure_scale_height_m(h.geometric().gravity_m_s2()))
        }
        Q::NumberDensity => each(column, &piece, |_, air| air.number_density_m3()),
        Q::MeanParticleSpeed => each(column, &piece, |_, air| air.mean_particle_speed_m_s()),
        Q::MeanFreePath => each(column, &piece, |_, air| crate::gas::mean_free_path(air.number_density_m3())),
        Q::CollisionFrequency => each(column, &piece, |_, air| {
            air.mean_particle_speed_m_s() * air.number_density_m3() * COLLISION_CROSS_SECTION_M2
        }),
        Q::MeanMolarMass => each(column, &piece, |_, air| air.molar_mass_kg_kmol()),
        Q::TemperatureRatio => each(column, &piece, |_, air| air.temperature_k() / SEA_LEVEL_TEMPERATURE_K),
        Q::PressureRatio => each(column, &piece, |_, air| air.pressure_pa() / SEA_LEVEL_PRESSURE_PA),
        Q::DensityRatio => each(column, &piece, |_, air| air.density_kg_m3() / SEA_LEVEL_DENSITY_KG_M3),
        // `check_request` lets only the state's quantities through.
        _ => {}
    }
}
