//! The 1976 standard's batch: from -5 km up to 86 km the layers answer a block of
//! altitudes at a time, lane-wise ([`LayerLanes`]: the layer of each altitude by counting
//! bases, the logarithm and exponential by the math module's lane kernels, all without
//! branches, so the compiler runs several altitudes at once), then the standard's M/M0
//! from 80 km ([`lower_air`], as the scalar path); the upper part above 86 km and every
//! failing input go through the model's own [`Atmosphere::air`], so every bit is the
//! scalar path's.

use crate::altitude::{geopotential_of, Altitude, AltitudeKind};
use crate::error::Error;
use crate::gas::Air;
use crate::model::{lower_air, Atmosphere, LayerLanes, Us1976, LOWER_RANGE, US1976};
use crate::quantity::Quantity;

use super::{check_request, each_alone, run, BatchError, BLOCK};

/// The batch over a checked request, `offset` the index of the first altitude in the
/// caller's whole batch.
pub(crate) fn run_standard(
    kind: AltitudeKind,
    altitudes_m: &[f64],
    quantities: &[Quantity],
    outputs: &mut [&mut [f64]],
    offset: usize,
) -> Result<(), BatchError> {
    let Some(lanes) = LayerLanes::new(US1976.layers()) else {
        return super::evaluate(&US1976, kind, altitudes_m, quantities, outputs);
    };
    run(altitudes_m, quantities, outputs, offset, |inputs, block| airs(&lanes, kind, inputs, block))
}

/// The altitudes and airs of one block (at most [`BLOCK`] inputs), or the first input's
/// failure, as [`super::run`] asks.
fn airs(
    lanes: &LayerLanes,
    kind: AltitudeKind,
    inputs: &[f64],
    block: &mut [(Altitude, Air)],
) -> Result<(), (usize, Error)> {
    // The lower standard's range in the kind the caller gave, as the scalar path checks it.
    let ((bottom, top), geometric) = match kind {
        AltitudeKind::Geometric => ((LOWER_RANGE.geometric_min_m, LOWER_RANGE.geometric_max_m), true),
        AltitudeKind::Geopotential => {
            ((LOWER_RANGE.geopotential_min_m, LOWER_RANGE.geopotential_max_m), false)
        }
    };
    let n = inputs.len().min(BLOCK);
    let (mut h_m, mut lower) = ([0.0; BLOCK], [false; BLOCK]);
    for ((&meters, h), lower) in inputs.iter().zip(h_m.iter_mut()).zip(lower.iter_mut()) {
        *h = if geometric { geopotential_of(meters) } else { meters };
        // NaN fails both.
        *lower = (meters >= bottom) & (meters <= top);
    }
    let (mut temperature_k, mut pressure_pa) = ([0.0; BLOCK], [0.0; BLOCK]);
    lanes.temperature_pressure(&h_m[..n], &mut temperature_k[..n], &mut pressure_pa[..n]);
    let mut j = 0;
    each_alone(inputs, block, |meters| {
        let k = j % BLOCK;
        j += 1;
        let altitude = kind.altitude(meters)?;
        if lower[k] {
            Ok((altitude, lower_air(altitude, h_m[k], temperature_k[k], pressure_pa[k])))
        } else {
            Ok((altitude, US1976.air(altitude)?))
        }
    })
}

impl Us1976 {
    /// The state quantities `quantities` at `altitudes_m` (each of the kind `kind`),
    /// written into `outputs` (column `c` gets quantity `c`, one value per altitude), bit
    /// for bit `US1976.state(alt)?.get(q)?`; no allocation, `no_std`.
    ///
    /// Only the quantities asked are computed (density needs temperature and pressure,
    /// not the viscosity), and up to 86 km the layers' temperature and pressure are
    /// computed lane-wise over blocks of altitudes, in any order. With the `rayon`
    /// feature, `Us1976::batch_parallel` shares a large batch among threads.
    ///
    /// ```
    /// use aerostrata::{AltitudeKind, Altitude, Atmosphere, Quantity, US1976};
    /// let altitudes = [0.0, 5_000.0, 11_000.0];
    /// let (mut rho, mut a) = ([0.0; 3], [0.0; 3]);
    /// US1976.batch(AltitudeKind::Geometric, &altitudes, &[Quantity::Density, Quantity::SpeedOfSound],
    ///     &mut [&mut rho, &mut a]).unwrap();
    /// let s = US1976.state(Altitude::geometric_m(5_000.0)?)?;
    /// assert_eq!(rho[1].to_bits(), s.density_kg_m3.to_bits());
    /// // Sea level: 1.2250 kg/m^3 (U.S. Standard Atmosphere 1976, Table I; from memory).
    /// assert!((rho[0] - 1.2250).abs() < 0.5e-4);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`BatchError::ColumnCount`], [`BatchError::ColumnLength`] or
    /// [`BatchError::Quantity`] for a malformed request (nothing written);
    /// [`BatchError::Element`] with the index of the first altitude where
    /// `state(alt)?.get(q)` fails (out of range, not finite, or a speed of sound,
    /// viscosity or conductivity asked above 86 km) and that error; the columns then hold
    /// every element before it and are untouched from it on.
    pub fn batch(
        &self,
        kind: AltitudeKind,
        altitudes_m: &[f64],
        quantities: &[Quantity],
        outputs: &mut [&mut [f64]],
    ) -> Result<(), BatchError> {
        check_request(altitudes_m.len(), quantities, outputs)?;
        run_standard(kind, altitudes_m, quantities, outputs, 0)
    }
}
