//! The rows of a sounding: as a user writes them ([`SoundingRow`]) and as the model keeps
//! them after construction ([`SoundingLevel`]), with the checks a row must pass alone and
//! against the rows before it (finite values, physical bands, increasing altitude,
//! falling pressure, and which columns it gives).

use crate::error::{Error, Result};
use crate::gas::{MAX_PRESSURE_PA, MAX_TEMPERATURE_K, MIN_PRESSURE_PA, MIN_TEMPERATURE_K};
use crate::humidity;
use crate::model::layered::Layer;

/// Smallest spacing allowed between the altitudes of two rows, m: closer rows carry no
/// information a flight could use, and a floor keeps every per-pair slope finite.
pub const MIN_ROW_SPACING_M: f64 = 1e-3;

// The names of a row's quantities in error messages; the CSV loader maps them back to
// its columns.
pub(super) const Q_TEMPERATURE: &str = "temperature";
pub(super) const Q_HUMID_TEMPERATURE: &str = "temperature of a row with humidity";
pub(super) const Q_PRESSURE: &str = "pressure";
pub(super) const Q_DENSITY: &str = "density";
pub(super) const Q_DEW_POINT: &str = "dew point";
pub(super) const Q_RELATIVE_HUMIDITY: &str = "relative humidity";

/// One row of a table, as a user writes it: altitude, temperature, and either a pressure
/// or a density, with optional humidity.
///
/// Which of pressure and density a table gives is fixed by its first rows: a pressure on
/// every row, a density on every row, or a pressure on the first row only (the others
/// then follow from the hydrostatic law). A row may give a dew point or a relative
/// humidity, or neither (dry air).
///
/// ```
/// use aerostrata::SoundingRow;
/// const SURFACE: SoundingRow =
///     SoundingRow::new(12.0, 304.15).with_pressure_pa(100_950.0).with_dew_point_k(297.35);
/// assert_eq!(SURFACE.pressure_pa, Some(100_950.0));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(deny_unknown_fields))]
pub struct SoundingRow {
    /// Altitude, m, of the kind the table declares ([`AltitudeKind`](crate::AltitudeKind)).
    pub altitude_m: f64,
    /// Kinetic temperature, K.
    pub temperature_k: f64,
    /// Pressure, Pa.
    #[cfg_attr(feature = "serde", serde(default, skip_serializing_if = "Option::is_none"))]
    pub pressure_pa: Option<f64>,
    /// Density of the (moist) air, kg/m^3.
    #[cfg_attr(feature = "serde", serde(default, skip_serializing_if = "Option::is_none"))]
    pub density_kg_m3: Option<f64>,
    /// Dew point, K.
    #[cfg_attr(feature = "serde", serde(default, skip_serializing_if = "Option::is_none"))]
    pub dew_point_k: Option<f64>,
    /// Relative humidity with respect to water, %.
    #[cfg_attr(feature = "serde", serde(default, skip_serializing_if = "Option::is_none"))]
    pub relative_humidity_percent: Option<f64>,
}

impl SoundingRow {
    /// A dry row with altitude `altitude_m` and temperature `temperature_k` and neither
    /// pressure nor density (what the rows above the first give in a hydrostatic table).
    pub const fn new(altitude_m: f64, temperature_k: f64) -> Self {
        Self {
            altitude_m,
            temperature_k,
            pressure_pa: None,
            density_kg_m3: None,
            dew_point_k: None,
            relative_humidity_percent: None,
        }
    }

    /// The row with pressure `pressure_pa`, Pa.
    #[must_use]
    pub const fn with_pressure_pa(self, pressure_pa: f64) -> Self {
        Self { pressure_pa: Some(pressure_pa), ..self }
    }

    /// The row with density `density_kg_m3`, kg/m^3.
    #[must_use]
    pub const fn with_density_kg_m3(self, density_kg_m3: f64) -> Self {
        Self { density_kg_m3: Some(density_kg_m3), ..self }
    }

    /// The row with dew point `dew_point_k`, K.
    #[must_use]
    pub const fn with_dew_point_k(self, dew_point_k: f64) -> Self {
        Self { dew_point_k: Some(dew_point_k), ..self }
    }

    /// The row with relative humidity `percent`, % (with respect to water).
    #[must_use]
    pub const fn with_relative_humidity_percent(self, percent: f64) -> Self {
        Self { relative_humidity_percent: Some(percent), ..self }
    }

    fn is_humid(&self) -> bool {
        self.dew_point_k.is_some() || self.relative_humidity_percent.is_some()
    }
}

/// One row of a table after construction: the row as given and what the model computed
/// from it (geopotential altitude, pressure, vapour pressure, virtual temperature) and,
/// for every row but the last, the interpolation towards the next row.
///
/// Users only handle it as storage: [`SoundingLevel::EMPTY`] fills a buffer for
/// [`Tabulated::from_rows_in`](crate::Tabulated::from_rows_in).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SoundingLevel {
    pub(super) row: SoundingRow,
    pub(super) geopotential_m: f64,
    pub(super) temperature_k: f64,
    pub(super) pressure_pa: f64,
    pub(super) virtual_temperature_k: f64,
    pub(super) vapour_pressure_pa: f64,
    /// Geopotential distance to the next row, m (0 on the last row).
    pub(super) spacing_m: f64,
    pub(super) temperature_step_k: f64,
    pub(super) virtual_temperature_step_k: f64,
    /// The pair's hydrostatic layer, its virtual temperatures divided by the pair's
    /// gravity factor.
    pub(super) layer: Layer,
    /// p(next row) / layer pressure at the next row - 1: the layer formula's rounding at
    /// the upper row, spread linearly across the pair.
    pub(super) residual: f64,
    pub(super) gravity_factor: f64,
}

impl SoundingLevel {
    /// A placeholder to fill buffers with before
    /// [`Tabulated::from_rows_in`](crate::Tabulated::from_rows_in).
    pub const EMPTY: Self = Self {
        row: SoundingRow::new(0.0, 0.0),
        geopotential_m: 0.0,
        temperature_k: 0.0,
        pressure_pa: 0.0,
        virtual_temperature_k: 0.0,
        vapour_pressure_pa: 0.0,
        spacing_m: 0.0,
        temperature_step_k: 0.0,
        virtual_temperature_step_k: 0.0,
        layer: Layer {
            base_geopotential_m: 0.0,
            base_temperature_k: 0.0,
            base_pressure_pa: 0.0,
            lapse_rate_k_m: 0.0,
        },
        residual: 0.0,
        gravity_factor: 1.0,
    };

    /// The row as given.
    pub fn row(&self) -> &SoundingRow {
        &self.row
    }

    /// Geopotential altitude of the row, m.
    pub fn geopotential_altitude_m(&self) -> f64 {
        self.geopotential_m
    }

    /// Kinetic temperature, K (as given).
    pub fn temperature_k(&self) -> f64 {
        self.temperature_k
    }

    /// Pressure, Pa: as given, or derived from the density or the hydrostatic law.
    pub fn pressure_pa(&self) -> f64 {
        self.pressure_pa
    }

    /// Virtual temperature, K (the temperature itself for a dry row).
    pub fn virtual_temperature_k(&self) -> f64 {
        self.virtual_temperature_k
    }

    /// Water-vapour pressure, Pa (0 for a dry row).
    pub fn vapour_pressure_pa(&self) -> f64 {
        self.vapour_pressure_pa
    }

    /// The effective gravity over g0 of the pair from this row to the next (1 on the last
    /// row and in a table with pressure on the first row only); see
    /// [`Tabulated`](crate::Tabulated).
    pub fn gravity_factor(&self) -> f64 {
        self.gravity_factor
    }
}

/// The checks that need only a row and the rows before it: values, units of sense,
/// order, and which quantities the row gives. Shared by the constructors and by
/// deserialisation (which reports the line of the row).
pub(super) fn check_row(index: usize, row: &SoundingRow, before: &[SoundingRow]) -> Result<()> {
    let not_finite = |quantity, value: f64| Error::RowNotFinite { row: index, quantity, value };
    let optional = [
        (Q_PRESSURE, row.pressure_pa),
        (Q_DENSITY, row.density_kg_m3),
        (Q_DEW_POINT, row.dew_point_k),
        (Q_RELATIVE_HUMIDITY, row.relative_humidity_percent),
    ];
    if !row.altitude_m.is_finite() {
        return Err(not_finite("altitude", row.altitude_m));
    }
    if !row.temperature_k.is_finite() {
        return Err(not_finite(Q_TEMPERATURE, row.temperature_k));
    }
    for (quantity, value) in optional {
        if let Some(value) = value.filter(|v| !v.is_finite()) {
            return Err(not_finite(quantity, value));
        }
    }
    check_columns(index, row, before)?;
    if row.temperature_k <= 0.0 {
        return Err(Error::RowTemperatureNotPositive { row: index, temperature_k: row.temperature_k });
    }
    for (quantity, unit, value) in
        [(Q_PRESSURE, "Pa", row.pressure_pa), (Q_DENSITY, "kg/m^3", row.density_kg_m3)]
    {
        if let Some(value) = value.filter(|v| *v <= 0.0) {
            return Err(Error::RowNotPositive { row: index, quantity, unit, value });
        }
    }
    if let Some(percent) = row.relative_humidity_percent.filter(|rh| !(0.0..=100.0).contains(rh)) {
        return Err(Error::RelativeHumidityOutOfRange { row: index, percent });
    }
    if let Some(dew_point_k) = row.dew_point_k.filter(|td| *td > row.temperature_k) {
        return Err(Error::DewPointAboveTemperature {
            row: index,
            dew_point_k,
            temperature_k: row.temperature_k,
        });
    }
    let out_of_range = |quantity, unit, value, min, max| {
        if (min..=max).contains(&value) {
            Ok(())
        } else {
            Err(Error::RowOutOfRange { row: index, quantity, unit, value, min, max })
        }
    };
    out_of_range(Q_TEMPERATURE, "K", row.temperature_k, MIN_TEMPERATURE_K, MAX_TEMPERATURE_K)?;
    if let Some(p) = row.pressure_pa {
        out_of_range(Q_PRESSURE, "Pa", p, MIN_PRESSURE_PA, MAX_PRESSURE_PA)?;
    }
    if row.is_humid() {
        let (min, max) = (humidity::MIN_TEMPERATURE_K, humidity::MAX_TEMPERATURE_K);
        out_of_range(Q_HUMID_TEMPERATURE, "K", row.temperature_k, min, max)?;
        if let Some(td) = row.dew_point_k {
            out_of_range(Q_DEW_POINT, "K", td, min, max)?;
        }
    }
    if let Some(previous) = before.last() {
        if row.altitude_m - previous.altitude_m < MIN_ROW_SPACING_M {
            return Err(Error::AltitudeNotIncreasing {
                row: index,
                altitude_m: row.altitude_m,
                previous_m: previous.altitude_m,
                min_spacing_m: MIN_ROW_SPACING_M,
            });
        }
        if let (Some(pressure_pa), Some(previous_pa)) = (row.pressure_pa, previous.pressure_pa) {
            if pressure_pa >= previous_pa {
                return Err(Error::PressureNotDecreasing { row: index, pressure_pa, previous_pa });
            }
        }
    }
    Ok(())
}

/// Whether the row gives what the table's first rows say every row gives.
fn check_columns(index: usize, row: &SoundingRow, before: &[SoundingRow]) -> Result<()> {
    let columns = |problem| Err(Error::RowColumns { row: index, problem });
    if row.dew_point_k.is_some() && row.relative_humidity_percent.is_some() {
        return columns("gives both a dew point and a relative humidity; give one of them");
    }
    let (has_p, has_rho) = (row.pressure_pa.is_some(), row.density_kg_m3.is_some());
    if has_p && has_rho {
        return columns("gives both a pressure and a density; give one of them");
    }
    match (before.first(), before.get(1)) {
        (None, _) if !has_p && !has_rho => columns("the first row must give a pressure or a density"),
        (None, _) => Ok(()),
        (Some(first), second) => {
            if first.density_kg_m3.is_some() {
                return if has_rho {
                    Ok(())
                } else {
                    columns("gives no density, but the first row does; give a density on every row")
                };
            }
            if has_rho {
                return columns(
                    "gives a density, but the first row gives a pressure; give a pressure on every row or on the first row only",
                );
            }
            match second {
                None => Ok(()),
                Some(second) if second.pressure_pa.is_some() && !has_p => columns(
                    "gives no pressure, but the rows before it do; give a pressure on every row or on the first row only",
                ),
                Some(second) if second.pressure_pa.is_none() && has_p => columns(
                    "gives a pressure, but the second row does not; give a pressure on every row or on the first row only",
                ),
                Some(_) => Ok(()),
            }
        }
    }
}
