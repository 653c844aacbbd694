//! Between the rows of a sounding and beyond them: the search for the pair of rows that
//! holds an altitude, the pair's hydrostatic interpolation (the layered model's formula,
//! [`Layer::temperature_pressure`](crate::Layer::temperature_pressure), with T_v for T_M;
//! U.S. Standard Atmosphere 1976, Part 1), and the blend into the 1976 standard beyond the
//! table's edges.

use crate::altitude::{Altitude, AltitudeKind};
use crate::constants::SEA_LEVEL_MOLAR_MASS_KG_KMOL;
use crate::error::{positive, Error, Result};
use crate::gas::Air;
use crate::math::{ceil, exp, ln};
use crate::model::atmosphere::Atmosphere;
use crate::model::standard::US1976;

use super::rows::SoundingLevel;

/// What a tabulated model does at altitudes beyond its first or last row.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(rename_all = "snake_case", deny_unknown_fields))]
pub enum OutsideTable {
    /// An [`Error::OutOfRange`] naming the table's band (the default).
    #[default]
    Error,
    /// The 1976 standard (`US1976`, through the [`Atmosphere`] trait), reached over a
    /// blend of `depth_m` geopotential metres from the table's edge; see
    /// [`Tabulated`](crate::Tabulated).
    BlendIntoUs1976 {
        /// Depth of the blend, geopotential m (finite, above 0).
        depth_m: f64,
    },
}

/// The blend into the standard beyond one edge of a table.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) struct Blend {
    depth_m: f64,
    edge_geopotential_m: f64,
    temperature_offset_k: f64,
    molar_mass_offset_kg_kmol: f64,
    ln_pressure_ratio: f64,
    vapour_mole_fraction: f64,
}

/// The blend `outside` asks for beyond row `index` of `levels` (of `kind` altitudes), if
/// any.
pub(super) fn blend(
    levels: &[SoundingLevel],
    kind: AltitudeKind,
    outside: OutsideTable,
    index: usize,
) -> Result<Option<Blend>> {
    let OutsideTable::BlendIntoUs1976 { depth_m } = outside else {
        return Ok(None);
    };
    let depth_m = positive("blend depth", "m", depth_m)?;
    let Some(level) = levels.get(index) else {
        return Err(Error::TooFewRows { count: levels.len() });
    };
    let standard = US1976.air(kind.altitude(level.row.altitude_m)?)?;
    let edge = level_air(level)?;
    let blend = Blend {
        depth_m,
        edge_geopotential_m: level.geopotential_m,
        temperature_offset_k: edge.temperature_k() - standard.temperature_k(),
        molar_mass_offset_kg_kmol: edge.molar_mass_kg_kmol() - standard.molar_mass_kg_kmol(),
        ln_pressure_ratio: ln(edge.pressure_pa() / standard.pressure_pa()),
        vapour_mole_fraction: level.vapour_pressure_pa / level.pressure_pa,
    };
    check_falls(&blend, index == 0)?;
    Ok(Some(blend))
}

/// Steps of the blend's pressure check.
const BLEND_CHECK_STEPS: u32 = 512;

/// Pressure must fall with altitude across the blend. In it ln p = ln p_std + w L (L the
/// log of the edge's pressure ratio, w running from 1 at the edge to 0 at the blend's far
/// end), so d ln p / dH = -1 / H_s -+ L / depth: a large ratio over a short depth reverses
/// it. Checked at [`BLEND_CHECK_STEPS`] even steps of the blend (within the standard's
/// range), where the standard's own fall sets how much each step may take back; the
/// least depth that keeps every step falling is suggested in the error.
fn check_falls(blend: &Blend, below: bool) -> Result<()> {
    let sign = if below { -1.0 } else { 1.0 };
    let at = |h: f64| US1976.air(Altitude::geopotential_m(h)?).map(|air| ln(air.pressure_pa()));
    let step = blend.depth_m / f64::from(BLEND_CHECK_STEPS);
    let mut worst = 0.0_f64;
    let mut previous = at(blend.edge_geopotential_m)?;
    for i in 1..=BLEND_CHECK_STEPS {
        let Ok(next) = at(blend.edge_geopotential_m + sign * step * f64::from(i)) else { break };
        // Stepping away from the table; the standard's fall of ln p over the step, upwards.
        let standard_fall = sign * (previous - next);
        if standard_fall.is_nan() || standard_fall <= 0.0 {
            break;
        }
        // Going up a step, w grows by step / depth below the table and falls by it above.
        let change = blend.ln_pressure_ratio * step / blend.depth_m;
        let rise = if below { change } else { -change };
        worst = worst.max(rise / standard_fall);
        previous = next;
    }
    if worst < 1.0 {
        return Ok(());
    }
    Err(Error::BlendRaisesPressure {
        side: if below { "below" } else { "above" },
        depth_m: blend.depth_m,
        ratio: exp(blend.ln_pressure_ratio),
        // The blend's term scales as 1 / depth: this depth brings the worst step to half.
        min_depth_m: ceil(2.0 * worst * blend.depth_m),
    })
}

/// Interpolation at geopotential altitude `h_m` within `levels` (or a rounding beyond
/// their ends).
#[inline]
pub(super) fn table_point(levels: &[SoundingLevel], h_m: f64) -> Result<Point> {
    let count = levels.len();
    // The first row above h: rows below it hold h between them.
    let above = first_above(levels, h_m);
    let level = if above >= count { levels.last() } else { levels.get(above.saturating_sub(1)) };
    let Some(level) = level else {
        return Err(Error::TooFewRows { count });
    };
    if above >= count || h_m == level.geopotential_m {
        return Ok(Point::at_level(level));
    }
    let f = (h_m - level.geopotential_m) / level.spacing_m;
    let (_, layer_pressure_pa) = level.layer.temperature_pressure(h_m);
    Ok(Point {
        temperature_k: level.temperature_k + f * level.temperature_step_k,
        virtual_temperature_k: level.virtual_temperature_k + f * level.virtual_temperature_step_k,
        pressure_pa: layer_pressure_pa * (1.0 + f * level.residual),
        molar_mass_kg_kmol: None,
        vapour_pressure_pa: None,
        continuum: true,
    })
}

/// The index of the first level above `h_m` (`levels.len()` if none is), as
/// `partition_point` would give it, found by a bracketed search: a guess from the
/// position of `h_m` between the first and last rows (right at once for evenly spaced
/// rows), then steps doubling away from it until the answer is bracketed, then bisection
/// inside the bracket. At most about 2 log2(n) comparisons, one or two for even spacing.
#[inline]
fn first_above(levels: &[SoundingLevel], h_m: f64) -> usize {
    let count = levels.len();
    let (Some(first), Some(last)) = (levels.first(), levels.last()) else {
        return 0;
    };
    let position = (h_m - first.geopotential_m) / (last.geopotential_m - first.geopotential_m);
    // `as` saturates: NaN and negative positions give 0, large ones the last index.
    let guess = ((position * (count - 1) as f64) as usize).min(count - 1);
    let below = |i: usize| levels[i].geopotential_m <= h_m;
    let (lo, hi) = if below(guess) {
        // Levels up to `guess` are at or below h: gallop upwards.
        let (mut lo, mut step) = (guess, 1);
        while lo + step < count && below(lo + step) {
            lo += step;
            step *= 2;
        }
        (lo + 1, (lo + step).min(count))
    } else {
        // `guess` is above h: gallop downwards.
        let (mut hi, mut step) = (guess, 1);
        while hi >= step && !below(hi - step) {
            hi -= step;
            step *= 2;
        }
        (hi.saturating_sub(step - 1).min(hi), hi)
    };
    // The answer lies in lo..=hi: every level before lo is at or below h, hi is above it
    // (or the end).
    lo + levels[lo..hi].partition_point(|level| level.geopotential_m <= h_m)
}

pub(super) fn setting(blend: Option<Blend>) -> OutsideTable {
    blend.map_or(OutsideTable::Error, |b| OutsideTable::BlendIntoUs1976 { depth_m: b.depth_m })
}

/// The model's values at one point, before [`Air::new`].
pub(super) struct Point {
    pub(super) temperature_k: f64,
    pub(super) virtual_temperature_k: f64,
    pub(super) pressure_pa: f64,
    /// Set in the blends; in the table M follows from T and T_v.
    pub(super) molar_mass_kg_kmol: Option<f64>,
    /// Set at rows (exactly as computed there) and in the blends.
    pub(super) vapour_pressure_pa: Option<f64>,
    pub(super) continuum: bool,
}

impl Point {
    fn at_level(level: &SoundingLevel) -> Self {
        Self {
            temperature_k: level.temperature_k,
            virtual_temperature_k: level.virtual_temperature_k,
            pressure_pa: level.pressure_pa,
            molar_mass_kg_kmol: None,
            vapour_pressure_pa: Some(level.vapour_pressure_pa),
            continuum: true,
        }
    }

    #[inline]
    pub(super) fn air(&self) -> Result<Air> {
        let molar_mass = self.molar_mass_kg_kmol.unwrap_or(
            // Exactly M0 where the air is dry (T_v == T).
            SEA_LEVEL_MOLAR_MASS_KG_KMOL * (self.temperature_k / self.virtual_temperature_k),
        );
        let air = Air::new(self.temperature_k, self.pressure_pa, molar_mass)?;
        Ok(if self.continuum { air } else { air.rarefied() })
    }
}

fn level_air(level: &SoundingLevel) -> Result<Air> {
    Point::at_level(level).air()
}

pub(super) fn blend_point(blend: &Blend, altitude: Altitude, h_m: f64) -> Result<Point> {
    let standard = US1976.air(altitude)?;
    let distance = (h_m - blend.edge_geopotential_m).abs();
    let w = (1.0 - distance / blend.depth_m).max(0.0);
    let (temperature_k, molar_mass, pressure_pa) = if w > 0.0 {
        (
            standard.temperature_k() + w * blend.temperature_offset_k,
            standard.molar_mass_kg_kmol() + w * blend.molar_mass_offset_kg_kmol,
            standard.pressure_pa() * exp(w * blend.ln_pressure_ratio),
        )
    } else {
        (standard.temperature_k(), standard.molar_mass_kg_kmol(), standard.pressure_pa())
    };
    Ok(Point {
        temperature_k,
        virtual_temperature_k: temperature_k * SEA_LEVEL_MOLAR_MASS_KG_KMOL / molar_mass,
        pressure_pa,
        molar_mass_kg_kmol: Some(molar_mass),
        vapour_pressure_pa: Some(w * blend.vapour_mole_fraction * pressure_pa),
        continuum: standard.is_continuum(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_bracketed_search_finds_what_partition_point_finds() {
        // Uneven spacing (dense near the ground, sparse aloft), as real soundings have.
        let mut levels = [SoundingLevel::EMPTY; 40];
        let cube = |i: f64| -50.0 + i * i * i;
        for (i, level) in levels.iter_mut().enumerate() {
            level.geopotential_m = cube(i as f64);
        }
        let mut h: f64 = -200.0;
        while h < 70_000.0 {
            let on_a_level = cube(((h / 1_700.0) as i64) as f64);
            for probe in [h, on_a_level, f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
                let expected = levels.partition_point(|level| level.geopotential_m <= probe);
                assert_eq!(first_above(&levels, probe), expected, "at {probe}");
            }
            h += 13.7;
        }
        assert_eq!(first_above(&levels[..0], 1.0), 0);
    }
}
