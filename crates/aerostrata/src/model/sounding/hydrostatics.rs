//! From the rows of a sounding to the levels the model keeps: each row's pressure (as
//! given, from its density, or from the hydrostatic law) and virtual temperature, and
//! each pair's hydrostatic layer with the gravity factor that meets both rows' pressures
//! (the layer equations of U.S. Standard Atmosphere 1976, Part 1, with T_v for T_M).

use crate::altitude::{AltitudeKind, AltitudeRange};
use crate::error::{Error, Result};
use crate::gas::{MAX_PRESSURE_PA, MIN_PRESSURE_PA};
use crate::humidity;
use crate::math::ln;
use crate::model::layered::Layer;

use super::moist::{
    bisect_row, dry_vapour_pressure_pa, fixed_point_row, pressure_from_density, virtual_temperature,
};
use super::rows::{check_row, SoundingLevel, SoundingRow, MIN_ROW_SPACING_M, Q_PRESSURE};

/// Lowest ratio allowed between the fall of ln p that a pair of rows gives and the fall
/// that hydrostatic balance at their temperatures implies (the pair's effective gravity
/// over g0). Real soundings sit within a few parts in 1000 of 1; a ratio near 0.3 or 3.3
/// is the signature of feet read as metres or the reverse.
pub const MIN_HYDROSTATIC_RATIO: f64 = 0.5;
/// Highest such ratio; see [`MIN_HYDROSTATIC_RATIO`].
pub const MAX_HYDROSTATIC_RATIO: f64 = 2.0;

/// Relative change of virtual temperature across a pair below which the pair is
/// evaluated as isothermal (at its mean virtual temperature).
///
/// Why: evaluated as a general power, the layer formula p = pb (Tb / T)^(g0 M0 / (R* L))
/// raises a base within r of 1 to a power of order 1/r, so its rounding (about 2e-16 in
/// the base) grows to 2e-16 / r in ln p per scale height; the isothermal form at the
/// pair's mean temperature is off by about r / 8 per scale height between the rows (and
/// by r^2 / 12 at them). The two meet near r = 4e-8, where both stay below 5e-9, however
/// [`Layer::temperature_pressure`] evaluates the power (a form through ln(1 + x) has no
/// such loss, and leaves only the r / 8).
const ISOTHERMAL_PAIR_RELATIVE: f64 = 4e-8;

/// How the rows' pressures are known.
#[derive(Clone, Copy, PartialEq)]
enum Mode {
    Pressure,
    Density,
    Hydrostatic,
}

/// Validates `rows`, fills `out` (as long as `rows`) and returns the table's band.
pub(super) fn build(
    kind: AltitudeKind,
    rows: &[SoundingRow],
    out: &mut [SoundingLevel],
) -> Result<AltitudeRange> {
    if rows.len() < 2 {
        return Err(Error::TooFewRows { count: rows.len() });
    }
    if out.len() < rows.len() {
        return Err(Error::StorageTooSmall { needed: rows.len(), len: out.len() });
    }
    let (altitude_min, altitude_max) = kind.band();
    for (index, row) in rows.iter().enumerate() {
        check_row(index, row, &rows[..index])?;
        if !(altitude_min..=altitude_max).contains(&row.altitude_m) {
            return Err(Error::RowOutOfRange {
                row: index,
                quantity: kind.quantity(),
                unit: "m",
                value: row.altitude_m,
                min: altitude_min,
                max: altitude_max,
            });
        }
    }
    let mode = if rows[0].density_kg_m3.is_some() {
        Mode::Density
    } else if rows[1].pressure_pa.is_some() {
        Mode::Pressure
    } else {
        Mode::Hydrostatic
    };
    for (index, row) in rows.iter().enumerate() {
        let geopotential_m = kind.altitude(row.altitude_m)?.geopotential().meters();
        let dry_vapour_pa = dry_vapour_pressure_pa(row);
        let (pressure_pa, virtual_temperature_k) = match (mode, index.checked_sub(1)) {
            (Mode::Hydrostatic, Some(below)) => {
                hydrostatic_row(index, &out[below], geopotential_m, row.temperature_k, dry_vapour_pa)?
            }
            (Mode::Density, _) => {
                let p =
                    pressure_from_density(row.density_kg_m3.unwrap_or(0.0), row.temperature_k, dry_vapour_pa);
                (p, virtual_temperature(index, row.temperature_k, dry_vapour_pa, p)?)
            }
            _ => {
                let p = row.pressure_pa.unwrap_or(0.0);
                (p, virtual_temperature(index, row.temperature_k, dry_vapour_pa, p)?)
            }
        };
        if !(MIN_PRESSURE_PA..=MAX_PRESSURE_PA).contains(&pressure_pa) {
            return Err(Error::RowOutOfRange {
                row: index,
                quantity: Q_PRESSURE,
                unit: "Pa",
                value: pressure_pa,
                min: MIN_PRESSURE_PA,
                max: MAX_PRESSURE_PA,
            });
        }
        let level = SoundingLevel {
            row: *row,
            geopotential_m,
            temperature_k: row.temperature_k,
            pressure_pa,
            virtual_temperature_k,
            vapour_pressure_pa: dry_vapour_pa * humidity::enhancement(pressure_pa),
            ..SoundingLevel::EMPTY
        };
        if let Some(below) = index.checked_sub(1) {
            let lower = &mut out[below];
            if level.geopotential_m <= lower.geopotential_m {
                return Err(Error::AltitudeNotIncreasing {
                    row: index,
                    altitude_m: row.altitude_m,
                    previous_m: lower.row.altitude_m,
                    min_spacing_m: MIN_ROW_SPACING_M,
                });
            }
            if level.pressure_pa >= lower.pressure_pa {
                return Err(Error::PressureNotDecreasing {
                    row: index,
                    pressure_pa: level.pressure_pa,
                    previous_pa: lower.pressure_pa,
                });
            }
            join(below, lower, &level, mode == Mode::Hydrostatic)?;
        }
        out[index] = level;
    }
    let first = rows[0].altitude_m;
    let last = rows[rows.len() - 1].altitude_m;
    Ok(match kind {
        AltitudeKind::Geometric => AltitudeRange::from_geometric(first, last),
        AltitudeKind::Geopotential => AltitudeRange::from_geopotential(first, last),
    })
}

/// The hydrostatic layer of a pair from (H_a, T_v,a, p_a) to (H_b, T_v,b), with its
/// virtual temperatures divided by the gravity factor `k`.
fn pair_layer(h_a: f64, tv_a: f64, p_a: f64, h_b: f64, tv_b: f64, k: f64) -> Layer {
    let step = tv_b - tv_a;
    if step.abs() <= ISOTHERMAL_PAIR_RELATIVE * tv_a.min(tv_b) {
        Layer {
            base_geopotential_m: h_a,
            base_temperature_k: 0.5 * (tv_a + tv_b) / k,
            base_pressure_pa: p_a,
            lapse_rate_k_m: 0.0,
        }
    } else {
        Layer {
            base_geopotential_m: h_a,
            base_temperature_k: tv_a / k,
            base_pressure_pa: p_a,
            lapse_rate_k_m: step / (h_b - h_a) / k,
        }
    }
}

/// The pressure and virtual temperature of row `index` (a table with pressure on the
/// first row only) from the row below: the layer's pressure at the row, where the row's
/// T_v depends on that pressure through its vapour's mole fraction.
fn hydrostatic_row(
    index: usize,
    lower: &SoundingLevel,
    h_m: f64,
    temperature_k: f64,
    dry_vapour_pa: f64,
) -> Result<(f64, f64)> {
    let (h_a, tv_a, p_a) = (lower.geopotential_m, lower.virtual_temperature_k, lower.pressure_pa);
    let top = |tv_b: f64| pair_layer(h_a, tv_a, p_a, h_m, tv_b, 1.0).temperature_pressure(h_m).1;
    if dry_vapour_pa == 0.0 {
        return Ok((top(temperature_k), temperature_k));
    }
    fixed_point_row(temperature_k, dry_vapour_pa, top)
        .map_or_else(|| bisect_row(index, p_a, temperature_k, dry_vapour_pa, top), Ok)
}

/// Fills `lower`'s interpolation towards `upper` (row `below` and the next).
fn join(below: usize, lower: &mut SoundingLevel, upper: &SoundingLevel, hydrostatic: bool) -> Result<()> {
    let (h_a, tv_a, p_a) = (lower.geopotential_m, lower.virtual_temperature_k, lower.pressure_pa);
    let (h_b, tv_b, p_b) = (upper.geopotential_m, upper.virtual_temperature_k, upper.pressure_pa);
    let k = if hydrostatic {
        1.0
    } else {
        let p_hydrostatic = pair_layer(h_a, tv_a, p_a, h_b, tv_b, 1.0).temperature_pressure(h_b).1;
        ln(p_a / p_b) / ln(p_a / p_hydrostatic)
    };
    if !(MIN_HYDROSTATIC_RATIO..=MAX_HYDROSTATIC_RATIO).contains(&k) {
        return Err(Error::NotHydrostatic {
            row: below,
            ratio: k,
            min: MIN_HYDROSTATIC_RATIO,
            max: MAX_HYDROSTATIC_RATIO,
        });
    }
    let layer = pair_layer(h_a, tv_a, p_a, h_b, tv_b, k);
    let (_, p_top) = layer.temperature_pressure(h_b);
    lower.spacing_m = h_b - h_a;
    lower.temperature_step_k = upper.temperature_k - lower.temperature_k;
    lower.virtual_temperature_step_k = tv_b - tv_a;
    lower.layer = layer;
    lower.residual = p_b / p_top - 1.0;
    lower.gravity_factor = k;
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::super::table::Tabulated;
    use super::*;
    use crate::humidity::MOLAR_MASS_RATIO;

    #[test]
    fn hydrostatic_pairs_have_no_residual_and_unit_gravity_factor() {
        let rows = [
            SoundingRow::new(0.0, 300.0).with_pressure_pa(100_000.0),
            SoundingRow::new(1_000.0, 294.0),
            SoundingRow::new(2_000.0, 294.0),
        ];
        let table = Tabulated::from_rows(AltitudeKind::Geopotential, &rows).unwrap();
        for level in table.levels() {
            assert_eq!(level.residual, 0.0);
            assert_eq!(level.gravity_factor(), 1.0);
        }
    }

    #[test]
    fn humid_hydrostatic_rows_solve_their_own_virtual_temperature() {
        let rows = [
            SoundingRow::new(0.0, 303.0).with_pressure_pa(100_800.0).with_relative_humidity_percent(80.0),
            SoundingRow::new(1_500.0, 293.0).with_relative_humidity_percent(70.0),
        ];
        let table = Tabulated::from_rows(AltitudeKind::Geopotential, &rows).unwrap();
        let top = table.levels()[1];
        let e = 0.7 * humidity::pure_water_pa(293.0) * humidity::enhancement(top.pressure_pa);
        let tv = 293.0 / (1.0 - e / top.pressure_pa * (1.0 - MOLAR_MASS_RATIO));
        assert!((top.virtual_temperature_k - tv).abs() < 1e-12 * tv);
        // And the pair's layer meets the row's pressure (the fixed point's tolerance).
        assert!(table.levels()[0].residual.abs() < 1e-14);
    }

    #[test]
    fn bisection_finds_the_root_the_fixed_point_finds() {
        let (tv_a, p_a) = (305.0, 100_800.0);
        let e0 = 0.9 * humidity::pure_water_pa(296.0);
        let top = |tv_b: f64| pair_layer(0.0, tv_a, p_a, 2_000.0, tv_b, 1.0).temperature_pressure(2_000.0).1;
        let (p, tv) = fixed_point_row(296.0, e0, top).unwrap();
        let (p_bisected, tv_bisected) = bisect_row(1, p_a, 296.0, e0, top).unwrap();
        // The fixed point stops within 4 ulp; bisection runs to adjacent doubles.
        assert!((p - p_bisected).abs() < 1e-14 * p, "{p} vs {p_bisected}");
        assert!((tv - tv_bisected).abs() < 1e-14 * tv);
        assert!(tv > 296.0);
        // A vapour pressure above the lower row's pressure has no solution.
        assert!(matches!(
            bisect_row(1, 1_000.0, 296.0, 2_000.0, top),
            Err(Error::VapourPressureTooHigh { .. })
        ));
    }
}
