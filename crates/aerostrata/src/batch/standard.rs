//! The 1976 standard's batch: from -5 km up to 86 km the layers answer a block of
//! altitudes at a time, lane-wise ([`LayerLanes`]: the layer of each altitude by counting
//! bases, the logarithm and exponential by the math module's lane kernels, all without
//! branches, so the compiler runs several altitudes at once), then the standard's M/M0
//! from 80 km as the scalar path applies it ([`lower_air_by_ratio`]); the upper part
//! above 86 km and every failing input go through the model's own [`Atmosphere::air`],
//! so every bit is the scalar path's.

use crate::altitude::{geopotential_of, Altitude, AltitudeKind};
use crate::gas::Air;
use crate::model::{
    lower_air_by_ratio, lower_molar_mass_ratio, Atmosphere, LayerLanes, Us1976, LOWER_RANGE, US1976,
};
use crate::quantity::Quantity;

use super::{check_request, each_alone, fill, BatchError, Block, BLOCK};

/// The batch over a checked request, `offset` the index of the first altitude in the
/// caller's whole batch.
pub(crate) fn run_standard(
    kind: AltitudeKind,
    altitudes_m: &[f64],
    quantities: &[Quantity],
    outputs: &mut [&mut [f64]],
    offset: usize,
) -> Result<(), BatchError> {
    let Some(mut lanes) = LayerLanes::new(US1976.layers()) else {
        return super::evaluate(&US1976, kind, altitudes_m, quantities, outputs);
    };
    let mut block = Block::new();
    let mut lower = LowerLanes::new();
    for (number, inputs) in altitudes_m.chunks(BLOCK).enumerate() {
        let start = number * BLOCK;
        lower.compute(&mut lanes, kind, inputs);
        if lower.all {
            // Every input in the lower standard: no error, no rarefied air, so each column
            // straight from the lanes, each value's air built where it is used (the
            // compiler keeps only what the quantity reads of it).
            for (&quantity, output) in quantities.iter().zip(outputs.iter_mut()) {
                if let Some(column) = output.get_mut(start..start + lower.count) {
                    fill(quantity, column, |j| lower.piece(kind, j));
                }
            }
        } else {
            let mut airs = |inputs: &[f64], slots: &mut [(Altitude, Air)]| {
                let mut j = 0;
                each_alone(inputs, slots, |meters| {
                    let k = j;
                    j += 1;
                    if lower.within[k % BLOCK] {
                        Ok(lower.piece(kind, k))
                    } else {
                        let altitude = kind.altitude(meters)?;
                        Ok((altitude, US1976.air(altitude)?))
                    }
                })
            };
            block.columns(inputs, start, offset, quantities, outputs, &mut airs)?;
        }
    }
    Ok(())
}

/// One block's inputs as the lower standard sees them, computed lane-wise.
struct LowerLanes {
    /// The inputs (at most [`BLOCK`]) and their geopotential altitudes.
    meters: [f64; BLOCK],
    h_m: [f64; BLOCK],
    count: usize,
    /// Whether each input lies in the lower standard's range (checked in the kind the
    /// caller gave, as the scalar path checks it), and whether all do.
    within: [bool; BLOCK],
    all: bool,
    /// The layers' molecular-scale temperature (K) and pressure (Pa), and M/M0.
    temperature_k: [f64; BLOCK],
    pressure_pa: [f64; BLOCK],
    ratio: [f64; BLOCK],
}

impl LowerLanes {
    /// Room for a block, filled by [`LowerLanes::compute`] (made once a batch).
    fn new() -> Self {
        Self {
            meters: [0.0; BLOCK],
            h_m: [0.0; BLOCK],
            count: 0,
            within: [false; BLOCK],
            all: false,
            temperature_k: [0.0; BLOCK],
            pressure_pa: [0.0; BLOCK],
            ratio: [1.0; BLOCK],
        }
    }

    /// The lanes of the block `inputs` (at most [`BLOCK`]).
    fn compute(&mut self, lanes: &mut LayerLanes, kind: AltitudeKind, inputs: &[f64]) {
        let ((bottom, top), geometric) = match kind {
            AltitudeKind::Geometric => ((LOWER_RANGE.geometric_min_m, LOWER_RANGE.geometric_max_m), true),
            AltitudeKind::Geopotential => {
                ((LOWER_RANGE.geopotential_min_m, LOWER_RANGE.geopotential_max_m), false)
            }
        };
        let count = inputs.len().min(BLOCK);
        self.count = count;
        for (j, &meters) in inputs.iter().enumerate().take(count) {
            self.meters[j] = meters;
            self.h_m[j] = if geometric { geopotential_of(meters) } else { meters };
            // NaN fails both.
            self.within[j] = (meters >= bottom) & (meters <= top);
        }
        self.all = self.within[..count].iter().fold(true, |all, &within| all & within);
        lanes.temperature_pressure(
            &self.h_m[..count],
            &mut self.temperature_k[..count],
            &mut self.pressure_pa[..count],
        );
        let ratios = self.ratio.iter_mut().zip(&self.within).zip(&self.meters).zip(&self.h_m).take(count);
        for (((ratio, &within), &meters), &h) in ratios {
            *ratio = if within { lower_molar_mass_ratio(kind.checked_by_caller(meters), h) } else { 1.0 };
        }
    }

    /// The altitude and air of input `j`, which must lie [`within`](Self::within).
    #[inline(always)]
    fn piece(&self, kind: AltitudeKind, j: usize) -> (Altitude, Air) {
        let k = j % BLOCK;
        let air = lower_air_by_ratio(self.temperature_k[k], self.pressure_pa[k], self.ratio[k]);
        (kind.checked_by_caller(self.meters[k]), air)
    }
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
