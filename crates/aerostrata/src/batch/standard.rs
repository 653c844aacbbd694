//! The 1976 standard's batch: the layers answer from -5 km up to 80 km geometric through
//! a cursor on the layer of the previous altitude; the rest of the range (the standard's
//! M/M0 table from 80 km, the upper part above 86 km) and every failing input go through
//! the model's own [`Atmosphere::air`], so every bit is the scalar path's.

use crate::altitude::{Altitude, AltitudeKind, AltitudeRange};
use crate::constants::SEA_LEVEL_MOLAR_MASS_KG_KMOL;
use crate::error::Error;
use crate::gas::Air;
use crate::model::{Atmosphere, Layer, Us1976, US1976};
use crate::quantity::Quantity;

use super::{check_request, run, BatchError};

/// The geopotential altitude of 80 km geometric: at and below it the standard's mean
/// molecular weight is M0 (its Table 8 starts at 80 km), so the layers alone answer.
const LAYERS_ALONE_TOP_GEOPOTENTIAL_M: f64 =
    AltitudeRange::from_geometric(80_000.0, 80_000.0).geopotential_min_m;

/// The layer holding the last altitude asked, with the band where it stays the layer the
/// scalar path's search would pick: `below <= h < above` (unbounded below for the first
/// layer, which also serves under its base; unbounded above for the last).
#[derive(Clone, Copy)]
struct Cursor {
    layers: &'static [Layer],
    layer: Layer,
    below: f64,
    above: f64,
}

impl Cursor {
    fn new(layers: &'static [Layer]) -> Option<Self> {
        // An empty band: the first altitude always searches.
        Some(Self { layers, layer: *layers.first()?, below: f64::INFINITY, above: f64::NEG_INFINITY })
    }

    /// Temperature (K) and pressure (Pa) at geopotential altitude `h_m`, from the same
    /// layer the scalar path's search picks (the last whose base is at or below `h_m`).
    #[inline]
    fn temperature_pressure(&mut self, h_m: f64) -> (f64, f64) {
        if !(self.below <= h_m && h_m < self.above) {
            self.seek(h_m);
        }
        self.layer.temperature_pressure(h_m)
    }

    #[inline]
    fn seek(&mut self, h_m: f64) {
        // The number of bases above the first at or below h: the scalar path's
        // `partition_point(base <= h) - 1` (or 0) for strictly increasing bases, without
        // the search's branches, which random altitudes mispredict.
        let index: usize =
            self.layers.iter().skip(1).map(|layer| usize::from(layer.base_geopotential_m <= h_m)).sum();
        if let Some(layer) = self.layers.get(index) {
            self.layer = *layer;
        }
        self.below = if index == 0 { f64::NEG_INFINITY } else { self.layer.base_geopotential_m };
        self.above = self.layers.get(index + 1).map_or(f64::INFINITY, |next| next.base_geopotential_m);
    }
}

/// The batch over a checked request, `offset` the index of the first altitude in the
/// caller's whole batch.
pub(crate) fn run_standard(
    kind: AltitudeKind,
    altitudes_m: &[f64],
    quantities: &[Quantity],
    outputs: &mut [&mut [f64]],
    offset: usize,
) -> Result<(), BatchError> {
    let range = US1976.range();
    let Some(mut cursor) = Cursor::new(US1976.layers()) else {
        return super::evaluate(&US1976, kind, altitudes_m, quantities, outputs);
    };
    run(altitudes_m, quantities, outputs, offset, |meters, slot: &mut (Altitude, Air)| -> Result<(), Error> {
        let altitude = kind.altitude(meters)?;
        let h = altitude.geopotential().meters();
        // In the standard's range (checked in the kind the caller gave, as the scalar
        // path checks it) and at or below 80 km.
        let above_bottom = match altitude {
            Altitude::Geometric(z) => z.meters() >= range.geometric_min_m,
            Altitude::Geopotential(_) => h >= range.geopotential_min_m,
        };
        if above_bottom && h <= LAYERS_ALONE_TOP_GEOPOTENTIAL_M {
            let (temperature_k, pressure_pa) = cursor.temperature_pressure(h);
            *slot = (altitude, Air::trusted(temperature_k, pressure_pa, SEA_LEVEL_MOLAR_MASS_KG_KMOL));
        } else {
            *slot = (altitude, US1976.air(altitude)?);
        }
        Ok(())
    })
}

impl Us1976 {
    /// The state quantities `quantities` at `altitudes_m` (each of the kind `kind`),
    /// written into `outputs` (column `c` gets quantity `c`, one value per altitude), bit
    /// for bit `US1976.state(alt)?.get(q)?`; no allocation, `no_std`.
    ///
    /// Only the quantities asked are computed (density needs temperature and pressure,
    /// not the viscosity), and the layer search is skipped while successive altitudes
    /// stay in one layer, which sorted or nearly sorted altitudes (a flight) do. With the
    /// `rayon` feature, `Us1976::batch_parallel` shares a large batch among threads.
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

#[cfg(test)]
mod tests {
    use super::*;

    /// The cursor picks the layer the scalar search picks at every base, just below and
    /// just above it, and below the first base (hand-worked: the bases are Table 4's).
    #[test]
    fn the_cursor_picks_the_searched_layer_in_any_order() {
        let layers = US1976.layers();
        let mut points = std::vec::Vec::new();
        for layer in layers {
            let b = layer.base_geopotential_m;
            points.extend([b, b - 1e-6, b + 1e-6, b - 1.0, b + 1.0]);
        }
        points.extend([-5_000.0, 84_852.0]);
        let forward = points.clone();
        let mut backward = points.clone();
        backward.reverse();
        for order in [forward, backward] {
            let mut cursor = Cursor::new(layers).unwrap();
            for &h in &order {
                let index = layers.partition_point(|l| l.base_geopotential_m <= h).saturating_sub(1);
                let expected = layers[index].temperature_pressure(h);
                let got = cursor.temperature_pressure(h);
                assert_eq!(
                    (got.0.to_bits(), got.1.to_bits()),
                    (expected.0.to_bits(), expected.1.to_bits()),
                    "{h}"
                );
            }
        }
    }
}
