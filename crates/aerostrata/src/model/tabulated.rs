//! A tabulated atmosphere: the rows of a weather-balloon sounding or of a site's
//! design-day profile, interpolated so that the result is exact at the rows, continuous,
//! and in hydrostatic balance between them.
//!
//! Between two rows the kinetic temperature and the virtual temperature are linear in
//! geopotential altitude and the pressure follows the layered model's hydrostatic
//! formula ([`Layer::temperature_pressure`], U.S. Standard Atmosphere 1976, Part 1) with
//! the virtual temperature in place of the molecular-scale one, which is the exact
//! integral of dp/dH = -rho g0 for moist air. Given pressures at both ends of a pair are
//! met by a per-pair effective gravity (see [`Tabulated`]). Humidity: Buck (1981), in
//! [`crate::humidity`].

use crate::altitude::{Altitude, AltitudeKind, AltitudeRange};
use crate::constants::{GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use crate::error::{positive, Error, Result};
use crate::gas::{Air, MAX_PRESSURE_PA, MAX_TEMPERATURE_K, MIN_PRESSURE_PA, MIN_TEMPERATURE_K};
use crate::humidity::{self, Humidity, MOLAR_MASS_RATIO};
use crate::math::{exp, ln};
use crate::state::State;

use super::atmosphere::Atmosphere;
use super::layered::Layer;
use super::standard::US1976;

/// Smallest spacing allowed between the altitudes of two rows, m: closer rows carry no
/// information a flight could use, and a floor keeps every per-pair slope finite.
pub const MIN_ROW_SPACING_M: f64 = 1e-3;

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

/// Fixed-point iterations for a humid row's hydrostatic pressure before the bisection
/// that always converges takes over; real rows converge in three or four.
const FIXED_POINT_ITERATIONS: usize = 32;
/// Bisection steps: more than the 2 x 1075 halvings that can separate two positive f64.
const BISECTION_ITERATIONS: usize = 2200;

// The names of a row's quantities in error messages; the CSV loader maps them back to
// its columns.
pub(crate) const Q_TEMPERATURE: &str = "temperature";
pub(crate) const Q_HUMID_TEMPERATURE: &str = "temperature of a row with humidity";
pub(crate) const Q_PRESSURE: &str = "pressure";
pub(crate) const Q_DENSITY: &str = "density";
pub(crate) const Q_DEW_POINT: &str = "dew point";
pub(crate) const Q_RELATIVE_HUMIDITY: &str = "relative humidity";

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
    /// Altitude, m, of the kind the table declares ([`AltitudeKind`]).
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

/// What a tabulated model does at altitudes beyond its first or last row.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(rename_all = "snake_case", deny_unknown_fields))]
pub enum OutsideTable {
    /// An [`Error::OutOfRange`] naming the table's band (the default).
    #[default]
    Error,
    /// The 1976 standard (`US1976`, through the [`Atmosphere`] trait), reached over a
    /// blend of `depth_m` geopotential metres from the table's edge; see [`Tabulated`].
    BlendIntoUs1976 {
        /// Depth of the blend, geopotential m (finite, above 0).
        depth_m: f64,
    },
}

/// One row of a table after construction: the row as given and what the model computed
/// from it (geopotential altitude, pressure, vapour pressure, virtual temperature) and,
/// for every row but the last, the interpolation towards the next row.
///
/// Users only handle it as storage: [`SoundingLevel::EMPTY`] fills a buffer for
/// [`Tabulated::from_rows_in`].
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SoundingLevel {
    row: SoundingRow,
    geopotential_m: f64,
    temperature_k: f64,
    pressure_pa: f64,
    virtual_temperature_k: f64,
    vapour_pressure_pa: f64,
    /// Geopotential distance to the next row, m (0 on the last row).
    spacing_m: f64,
    temperature_step_k: f64,
    virtual_temperature_step_k: f64,
    /// The pair's hydrostatic layer, its virtual temperatures divided by the pair's
    /// gravity factor.
    layer: Layer,
    /// p(next row) / layer pressure at the next row - 1: the layer formula's rounding at
    /// the upper row, spread linearly across the pair.
    residual: f64,
    gravity_factor: f64,
}

impl SoundingLevel {
    /// A placeholder to fill buffers with before [`Tabulated::from_rows_in`].
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
    /// row and in a table with pressure on the first row only); see [`Tabulated`].
    pub fn gravity_factor(&self) -> f64 {
        self.gravity_factor
    }
}

/// Air and humidity at one point of a tabulated model.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct MoistState {
    /// The full state, as [`Atmosphere::state`] gives it. Its mean molar mass is the
    /// moist air's, so its molecular-scale temperature T M0 / M is the virtual
    /// temperature and its density the moist density.
    pub state: State,
    /// The humidity quantities used.
    pub humidity: Humidity,
}

/// The blend into the standard beyond one edge of a table.
#[derive(Debug, Clone, Copy, PartialEq)]
struct Blend {
    depth_m: f64,
    edge_geopotential_m: f64,
    temperature_offset_k: f64,
    molar_mass_offset_kg_kmol: f64,
    ln_pressure_ratio: f64,
    vapour_mole_fraction: f64,
}

/// A tabulated atmosphere: rows of altitude, temperature and pressure or density, with
/// optional humidity, interpolated hydrostatically.
///
/// `S` is the storage of the computed rows: an array `[SoundingLevel; N]`
/// ([`Tabulated::from_rows`]), a borrowed slice filled in place
/// ([`Tabulated::from_rows_in`]; neither allocates, so a sounding can live in a static
/// array on a flight computer), or with the `alloc` feature a `Vec`
/// ([`Tabulated::from_rows_vec`]).
///
/// # Formula
/// At each row, from its vapour pressure e (see [`crate::humidity`]: e = f(p) e_w(T_d)
/// from a dew point, e = RH/100 f(p) e_w(T) from a relative humidity, 0 if dry):
/// ```text
/// T_v = T / (1 - (e / p) (1 - epsilon))             virtual temperature
/// p   = rho R* T / M0 + (1 - epsilon) e             from a density (solved with e(p))
/// ```
/// Between rows i and i+1, with f = (H - H_i) / (H_{i+1} - H_i):
/// ```text
/// T(H)   = T_i + f (T_{i+1} - T_i)                  kinetic temperature
/// T_v(H) = T_v,i + f (T_v,i+1 - T_v,i)
/// p(H)   = p_i (T_v,i / T_v(H))^(k g0 M0 / (R* L))  L = dT_v/dH != 0
/// p(H)   = p_i exp(-k g0 M0 (H - H_i) / (R* T_v))   L = 0
/// M(H)   = M0 T(H) / T_v(H),   rho = p M / (R* T) = p M0 / (R* T_v)
/// ```
/// which is the layered model's formula ([`Layer::temperature_pressure`]) with T_v for
/// T_M and gravity k g0. k is the pair's gravity factor:
/// ```text
/// k = ln(p_i / p_{i+1}) / ln(p_i / p_hyd,i+1)
/// ```
/// with p_hyd the formula's pressure at row i+1 for k = 1: the one constant that makes
/// the pair meet both given pressures and stay strictly monotone, so that within every
/// pair dp/dH = -k rho g0 holds exactly. For a table built from the hydrostatic law
/// (pressure on the first row only) k = 1 everywhere, and data in hydrostatic balance
/// give k = 1 to rounding; construction rejects k outside
/// [`MIN_HYDROSTATIC_RATIO`]..=[`MAX_HYDROSTATIC_RATIO`]. The formula's own rounding at
/// row i+1 (below 1e-15 in practice, a few parts in 1e9 at most for a near-isothermal
/// pair) is spread linearly across the pair so the upper row is met to the last bits.
///
/// Beyond the table, with [`OutsideTable::BlendIntoUs1976`] of depth D: with w = 1 at the
/// edge row falling linearly to 0 at D geopotential metres beyond it (and 0 further),
/// and s the standard's values at the same altitude,
/// ```text
/// T = T_s + w (T_edge - T_s,edge)
/// M = M_s + w (M_edge - M_s,edge)
/// p = p_s (p_edge / p_s,edge)^w
/// ```
/// continuous in T, p and rho at the edge and at D, the standard itself beyond D; a
/// blend, not a hydrostatic model, inside D.
///
/// ```
/// use aerostrata::{Altitude, AltitudeKind, Atmosphere, SoundingRow, Tabulated};
/// // An invented three-row profile with a pressure on the first row only.
/// let rows = [
///     SoundingRow::new(0.0, 303.15).with_pressure_pa(101_000.0),
///     SoundingRow::new(1_000.0, 296.65),
///     SoundingRow::new(3_000.0, 283.65),
/// ];
/// let table = Tabulated::from_rows(AltitudeKind::Geopotential, &rows)?;
/// let s = table.state(Altitude::geopotential_m(500.0)?)?;
/// assert!((s.temperature_k - 299.9).abs() < 1e-9);
/// // Exact at the rows:
/// assert_eq!(table.state(Altitude::geopotential_m(0.0)?)?.pressure_pa, 101_000.0);
/// // And an error outside them, by default:
/// assert!(table.state(Altitude::geopotential_m(3_001.0)?).is_err());
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Tabulated<S> {
    levels: S,
    kind: AltitudeKind,
    table_range: AltitudeRange,
    range: AltitudeRange,
    below: Option<Blend>,
    above: Option<Blend>,
}

impl<const N: usize> Tabulated<[SoundingLevel; N]> {
    /// A model from `N` rows of `kind` altitudes, held in an array (no allocation).
    ///
    /// # Errors
    /// As [`Tabulated::from_rows_in`].
    pub fn from_rows(kind: AltitudeKind, rows: &[SoundingRow; N]) -> Result<Self> {
        let mut levels = [SoundingLevel::EMPTY; N];
        let table_range = build(kind, rows, &mut levels)?;
        Ok(Self::new(levels, kind, table_range))
    }
}

impl<'a> Tabulated<&'a [SoundingLevel]> {
    /// A model from `rows` of `kind` altitudes, computed into the caller's `levels`
    /// (as long as `rows` or longer; fill it with [`SoundingLevel::EMPTY`]). No
    /// allocation.
    ///
    /// # Errors
    /// [`Error::StorageTooSmall`] when `levels` is shorter than `rows`;
    /// [`Error::TooFewRows`] for fewer than two rows; for a row (counted from 0):
    /// [`Error::RowNotFinite`] for a NaN or infinity, [`Error::RowTemperatureNotPositive`],
    /// [`Error::RowNotPositive`] for a pressure or density at or below 0,
    /// [`Error::RelativeHumidityOutOfRange`] outside 0 to 100 %,
    /// [`Error::DewPointAboveTemperature`], [`Error::AltitudeNotIncreasing`] when an
    /// altitude is not at least [`MIN_ROW_SPACING_M`] above the previous one,
    /// [`Error::PressureNotDecreasing`] for a given or derived pressure,
    /// [`Error::RowColumns`] when the rows mix pressure and density, give both, or give
    /// both a dew point and a relative humidity, [`Error::RowOutOfRange`] for an altitude
    /// outside the representable band, a temperature or pressure outside the band of
    /// [`Air::new`] or, on a row with humidity, a temperature or dew point outside
    /// [`humidity::MIN_TEMPERATURE_K`]..=[`humidity::MAX_TEMPERATURE_K`],
    /// [`Error::VapourPressureTooHigh`] when the vapour pressure is not below the
    /// pressure, and [`Error::NotHydrostatic`] for a pair whose gravity factor lies
    /// outside [`MIN_HYDROSTATIC_RATIO`]..=[`MAX_HYDROSTATIC_RATIO`].
    pub fn from_rows_in(
        kind: AltitudeKind,
        rows: &[SoundingRow],
        levels: &'a mut [SoundingLevel],
    ) -> Result<Self> {
        let len = levels.len();
        let Some(levels) = levels.get_mut(..rows.len()) else {
            return Err(Error::StorageTooSmall { needed: rows.len(), len });
        };
        let table_range = build(kind, rows, levels)?;
        Ok(Self::new(&*levels, kind, table_range))
    }
}

#[cfg(feature = "alloc")]
impl Tabulated<alloc::vec::Vec<SoundingLevel>> {
    /// A model from `rows` of `kind` altitudes, for a number of rows known only at run
    /// time.
    ///
    /// # Errors
    /// As [`Tabulated::from_rows_in`].
    pub fn from_rows_vec(kind: AltitudeKind, rows: &[SoundingRow]) -> Result<Self> {
        let mut levels = alloc::vec![SoundingLevel::EMPTY; rows.len()];
        let table_range = build(kind, rows, &mut levels)?;
        Ok(Self::new(levels, kind, table_range))
    }
}

impl<S: AsRef<[SoundingLevel]>> Tabulated<S> {
    fn new(levels: S, kind: AltitudeKind, table_range: AltitudeRange) -> Self {
        Self { levels, kind, table_range, range: table_range, below: None, above: None }
    }

    /// The computed rows, lowest first.
    pub fn levels(&self) -> &[SoundingLevel] {
        self.levels.as_ref()
    }

    /// The rows as given, lowest first.
    pub fn rows(&self) -> impl Iterator<Item = &SoundingRow> {
        self.levels().iter().map(SoundingLevel::row)
    }

    /// The kind of altitude the rows give.
    pub fn kind(&self) -> AltitudeKind {
        self.kind
    }

    /// The band from the first row to the last (without any blend).
    pub fn table_range(&self) -> AltitudeRange {
        self.table_range
    }

    /// What the model does below the first row.
    pub fn below(&self) -> OutsideTable {
        setting(self.below)
    }

    /// What the model does above the last row.
    pub fn above(&self) -> OutsideTable {
        setting(self.above)
    }

    /// The model with `outside` below its first row.
    ///
    /// # Errors
    /// For a blend: [`Error::NotFinite`] or [`Error::NotPositive`] for its depth, and the
    /// standard's own error when the first row lies outside the standard's range.
    pub fn with_below(mut self, outside: OutsideTable) -> Result<Self> {
        self.below = self.blend(outside, 0)?;
        self.range.geometric_min_m = self.table_range.geometric_min_m;
        self.range.geopotential_min_m = self.table_range.geopotential_min_m;
        if self.below.is_some() {
            let standard = US1976.range();
            self.range.geometric_min_m = self.range.geometric_min_m.min(standard.geometric_min_m);
            self.range.geopotential_min_m = self.range.geopotential_min_m.min(standard.geopotential_min_m);
        }
        Ok(self)
    }

    /// The model with `outside` above its last row.
    ///
    /// # Errors
    /// As [`Tabulated::with_below`], for the last row.
    pub fn with_above(mut self, outside: OutsideTable) -> Result<Self> {
        let last = self.levels().len().saturating_sub(1);
        self.above = self.blend(outside, last)?;
        self.range.geometric_max_m = self.table_range.geometric_max_m;
        self.range.geopotential_max_m = self.table_range.geopotential_max_m;
        if self.above.is_some() {
            let standard = US1976.range();
            self.range.geometric_max_m = self.range.geometric_max_m.max(standard.geometric_max_m);
            self.range.geopotential_max_m = self.range.geopotential_max_m.max(standard.geopotential_max_m);
        }
        Ok(self)
    }

    fn blend(&self, outside: OutsideTable, index: usize) -> Result<Option<Blend>> {
        let OutsideTable::BlendIntoUs1976 { depth_m } = outside else {
            return Ok(None);
        };
        let depth_m = positive("blend depth", "m", depth_m)?;
        let Some(level) = self.levels().get(index) else {
            return Err(Error::TooFewRows { count: self.levels().len() });
        };
        let standard = US1976.air(self.kind.altitude(level.row.altitude_m)?)?;
        let edge = level_air(level)?;
        Ok(Some(Blend {
            depth_m,
            edge_geopotential_m: level.geopotential_m,
            temperature_offset_k: edge.temperature_k() - standard.temperature_k(),
            molar_mass_offset_kg_kmol: edge.molar_mass_kg_kmol() - standard.molar_mass_kg_kmol(),
            ln_pressure_ratio: ln(edge.pressure_pa() / standard.pressure_pa()),
            vapour_mole_fraction: level.vapour_pressure_pa / level.pressure_pa,
        }))
    }

    /// The full state and the humidity quantities at `altitude`.
    ///
    /// # Errors
    /// As [`Atmosphere::air`].
    pub fn moist_state(&self, altitude: Altitude) -> Result<MoistState> {
        let point = self.point(altitude)?;
        let air = point.air()?;
        let vapour_pressure_pa = point.vapour_pressure_pa.unwrap_or_else(|| {
            let fraction =
                (1.0 - point.temperature_k / point.virtual_temperature_k) / (1.0 - MOLAR_MASS_RATIO);
            fraction.max(0.0) * point.pressure_pa
        });
        let humidity = Humidity::from_checked(
            air.temperature_k(),
            air.pressure_pa(),
            vapour_pressure_pa,
            point.virtual_temperature_k,
        );
        Ok(MoistState { state: State::new(altitude, air), humidity })
    }

    /// What the model gives at `altitude`, before [`Air::new`] checks it.
    fn point(&self, altitude: Altitude) -> Result<Point> {
        let altitude = self.range.check(altitude)?;
        let h = altitude.geopotential().meters();
        let (below_table, above_table) = match altitude {
            Altitude::Geometric(z) => {
                (z.meters() < self.table_range.geometric_min_m, z.meters() > self.table_range.geometric_max_m)
            }
            Altitude::Geopotential(_) => {
                (h < self.table_range.geopotential_min_m, h > self.table_range.geopotential_max_m)
            }
        };
        let blend = match (below_table, above_table) {
            (false, false) => return self.table_point(h),
            (true, _) => self.below,
            (_, true) => self.above,
        };
        match blend {
            Some(blend) => blend_point(&blend, altitude, h),
            // Unreachable through `range`, which only reaches beyond the table where a
            // blend is set; the table's own band is the honest error.
            None => Err(self.table_range.check(altitude).err().unwrap_or(Error::TooFewRows { count: 0 })),
        }
    }

    /// Interpolation at geopotential altitude `h_m` within the table (or a rounding
    /// beyond its ends).
    #[inline]
    fn table_point(&self, h_m: f64) -> Result<Point> {
        let levels = self.levels();
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

fn setting(blend: Option<Blend>) -> OutsideTable {
    blend.map_or(OutsideTable::Error, |b| OutsideTable::BlendIntoUs1976 { depth_m: b.depth_m })
}

/// The model's values at one point, before [`Air::new`].
struct Point {
    temperature_k: f64,
    virtual_temperature_k: f64,
    pressure_pa: f64,
    /// Set in the blends; in the table M follows from T and T_v.
    molar_mass_kg_kmol: Option<f64>,
    /// Set at rows (exactly as computed there) and in the blends.
    vapour_pressure_pa: Option<f64>,
    continuum: bool,
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
    fn air(&self) -> Result<Air> {
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

fn blend_point(blend: &Blend, altitude: Altitude, h_m: f64) -> Result<Point> {
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

impl<S: AsRef<[SoundingLevel]>> Atmosphere for Tabulated<S> {
    fn range(&self) -> AltitudeRange {
        self.range
    }

    /// # Errors
    /// [`Error::OutOfRange`] outside the table (and its blends); the standard's errors in
    /// a blend; [`Air::new`]'s where a blend leaves its bands.
    fn air(&self, altitude: Altitude) -> Result<Air> {
        self.point(altitude)?.air()
    }
}

/// The checks that need only a row and the rows before it: values, units of sense,
/// order, and which quantities the row gives. Shared by the constructors and by
/// deserialisation (which reports the line of the row).
pub(crate) fn check_row(index: usize, row: &SoundingRow, before: &[SoundingRow]) -> Result<()> {
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

/// How the rows' pressures are known.
#[derive(Clone, Copy, PartialEq)]
enum Mode {
    Pressure,
    Density,
    Hydrostatic,
}

/// Validates `rows`, fills `out` (as long as `rows`) and returns the table's band.
fn build(kind: AltitudeKind, rows: &[SoundingRow], out: &mut [SoundingLevel]) -> Result<AltitudeRange> {
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

/// The row's vapour pressure before the enhancement factor (which depends on the
/// pressure): e_w(T_d), or RH/100 e_w(T), or 0. Rows are checked: humid ones are in band.
fn dry_vapour_pressure_pa(row: &SoundingRow) -> f64 {
    match (row.dew_point_k, row.relative_humidity_percent) {
        (Some(td), _) => humidity::pure_water_pa(td),
        (None, Some(rh)) => rh / 100.0 * humidity::pure_water_pa(row.temperature_k),
        (None, None) => 0.0,
    }
}

/// p from rho, T and a vapour pressure e = e0 (F0 + F1 p):
/// p = rho R* T / M0 + (1 - epsilon) e, solved for p (linear in it).
fn pressure_from_density(density_kg_m3: f64, temperature_k: f64, dry_vapour_pa: f64) -> f64 {
    let (f0, f1) = humidity::enhancement_coefficients();
    let dry = density_kg_m3 * GAS_CONSTANT_J_KMOL_K * temperature_k / SEA_LEVEL_MOLAR_MASS_KG_KMOL;
    let vapour = (1.0 - MOLAR_MASS_RATIO) * dry_vapour_pa;
    (dry + vapour * f0) / (1.0 - vapour * f1)
}

/// T_v of a row at pressure `p`, or [`Error::VapourPressureTooHigh`].
fn virtual_temperature(
    index: usize,
    temperature_k: f64,
    dry_vapour_pa: f64,
    pressure_pa: f64,
) -> Result<f64> {
    virtual_temperature_at(temperature_k, dry_vapour_pa, pressure_pa).ok_or(Error::VapourPressureTooHigh {
        row: index,
        vapour_pressure_pa: dry_vapour_pa * humidity::enhancement(pressure_pa),
        pressure_pa,
    })
}

fn virtual_temperature_at(temperature_k: f64, dry_vapour_pa: f64, pressure_pa: f64) -> Option<f64> {
    let fraction = dry_vapour_pa * humidity::enhancement(pressure_pa) / pressure_pa;
    (fraction < 1.0 && pressure_pa > 0.0).then(|| temperature_k / (1.0 - fraction * (1.0 - MOLAR_MASS_RATIO)))
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

/// The fixed point p = top(T_v(p)), where it converges (it does in three or four steps
/// for real rows: d ln p / d ln T_v is about half the pair's depth in scale heights, and
/// d ln T_v / d ln p about 0.4 e / p).
fn fixed_point_row(temperature_k: f64, dry_vapour_pa: f64, top: impl Fn(f64) -> f64) -> Option<(f64, f64)> {
    let mut p = top(temperature_k);
    for _ in 0..FIXED_POINT_ITERATIONS {
        let next = top(virtual_temperature_at(temperature_k, dry_vapour_pa, p)?);
        if (next - p).abs() <= 4.0 * f64::EPSILON * p {
            return Some((next, virtual_temperature_at(temperature_k, dry_vapour_pa, next)?));
        }
        p = next;
    }
    None
}

/// The same root by bisection of g(p) = p - top(T_v(p)), which increases with p: it is
/// positive at the lower row's pressure `p_a` (the layer falls below its base) and, if
/// the row has a solution at all, negative just above the pressure at which the vapour
/// would fill the whole pressure.
fn bisect_row(
    index: usize,
    p_a: f64,
    temperature_k: f64,
    dry_vapour_pa: f64,
    top: impl Fn(f64) -> f64,
) -> Result<(f64, f64)> {
    let (f0, f1) = humidity::enhancement_coefficients();
    let too_high = Error::VapourPressureTooHigh {
        row: index,
        vapour_pressure_pa: dry_vapour_pa * humidity::enhancement(p_a),
        pressure_pa: p_a,
    };
    let lowest = dry_vapour_pa * f0 / (1.0 - dry_vapour_pa * f1);
    if !(lowest > 0.0 && lowest < p_a) {
        return Err(too_high);
    }
    let g = |p: f64| virtual_temperature_at(temperature_k, dry_vapour_pa, p).map(|tv| p - top(tv));
    let (mut lo, mut hi) = (lowest, p_a);
    for _ in 0..BISECTION_ITERATIONS {
        let mid = 0.5 * (lo + hi);
        if mid <= lo || mid >= hi {
            break;
        }
        match g(mid) {
            Some(value) if value > 0.0 => hi = mid,
            _ => lo = mid,
        }
    }
    match (virtual_temperature_at(temperature_k, dry_vapour_pa, hi), g(hi)) {
        (Some(tv), Some(value)) if value.abs() <= 1e-9 * hi => Ok((hi, tv)),
        _ => Err(too_high),
    }
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

/// Which value of a row an error is about, for the loaders that show the user's cell.
#[cfg(feature = "std")]
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Field {
    Altitude,
    Temperature,
    Pressure,
    Density,
    DewPoint,
    RelativeHumidity,
    /// The dew point or the relative humidity, whichever the row gives.
    Humidity,
    /// The pressure, or the density it was derived from.
    PressureSource,
}

/// The row (counted from 0) and the value an error of a table is about.
#[cfg(feature = "std")]
pub(crate) fn error_field(error: &Error) -> Option<(usize, Option<Field>)> {
    let by_quantity = |quantity: &str| match quantity {
        Q_TEMPERATURE | Q_HUMID_TEMPERATURE => Some(Field::Temperature),
        Q_PRESSURE => Some(Field::PressureSource),
        Q_DENSITY => Some(Field::Density),
        Q_DEW_POINT => Some(Field::DewPoint),
        Q_RELATIVE_HUMIDITY => Some(Field::RelativeHumidity),
        _ => Some(Field::Altitude),
    };
    match *error {
        Error::RowNotFinite { row, quantity, .. } => Some((
            row,
            match quantity {
                Q_PRESSURE => Some(Field::Pressure),
                other => by_quantity(other),
            },
        )),
        Error::RowOutOfRange { row, quantity, .. } => Some((row, by_quantity(quantity))),
        Error::RowNotPositive { row, quantity, .. } => {
            Some((row, Some(if quantity == Q_DENSITY { Field::Density } else { Field::Pressure })))
        }
        Error::AltitudeNotIncreasing { row, .. } => Some((row, Some(Field::Altitude))),
        Error::RowTemperatureNotPositive { row, .. } => Some((row, Some(Field::Temperature))),
        Error::PressureNotDecreasing { row, .. } => Some((row, Some(Field::PressureSource))),
        Error::RelativeHumidityOutOfRange { row, .. } => Some((row, Some(Field::RelativeHumidity))),
        Error::DewPointAboveTemperature { row, .. } => Some((row, Some(Field::DewPoint))),
        Error::VapourPressureTooHigh { row, .. } => Some((row, Some(Field::Humidity))),
        Error::NotHydrostatic { row, .. } => Some((row + 1, Some(Field::PressureSource))),
        Error::RowColumns { row, .. } => Some((row, None)),
        _ => None,
    }
}

#[cfg(feature = "serde")]
mod serde_support {
    use super::{SoundingLevel, Tabulated};

    /// The rows of a table, serialised as given.
    struct Rows<'a>(&'a [SoundingLevel]);

    impl serde::Serialize for Rows<'_> {
        fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
            serializer.collect_seq(self.0.iter().map(SoundingLevel::row))
        }
    }

    /// A table serialises as what it was built from: `altitude` (its kind), `rows` as
    /// given, and what it does `below` and `above` them.
    impl<S: AsRef<[SoundingLevel]>> serde::Serialize for Tabulated<S> {
        fn serialize<Ser: serde::Serializer>(&self, serializer: Ser) -> Result<Ser::Ok, Ser::Error> {
            use serde::ser::SerializeStruct;
            let mut out = serializer.serialize_struct("Tabulated", 4)?;
            out.serialize_field("altitude", &self.kind)?;
            out.serialize_field("rows", &Rows(self.levels()))?;
            out.serialize_field("below", &self.below())?;
            out.serialize_field("above", &self.above())?;
            out.end()
        }
    }

    #[cfg(feature = "alloc")]
    mod owned {
        use alloc::vec::Vec;
        use core::fmt;

        use serde::de::{DeserializeSeed, Error as _, MapAccess, SeqAccess, Visitor};

        use super::super::{check_row, AltitudeKind, OutsideTable, SoundingLevel, SoundingRow, Tabulated};

        /// Rows checked one by one as they are read, each inside its own map visit, so
        /// that a format that knows lines (JSON) reports the line of the bad row.
        struct CheckedRows(Vec<SoundingRow>);

        impl<'de> serde::Deserialize<'de> for CheckedRows {
            fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
                struct RowsVisitor;
                impl<'de> Visitor<'de> for RowsVisitor {
                    type Value = CheckedRows;
                    fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
                        f.write_str("a list of sounding rows")
                    }
                    fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<CheckedRows, A::Error> {
                        let mut rows = Vec::with_capacity(seq.size_hint().unwrap_or(0).min(4096));
                        while let Some(row) = seq.next_element_seed(RowSeed { before: &rows })? {
                            rows.push(row);
                        }
                        Ok(CheckedRows(rows))
                    }
                }
                deserializer.deserialize_seq(RowsVisitor)
            }
        }

        /// The names of a row's fields, as [`SoundingRow`] serialises them.
        const FIELDS: [&str; 6] = [
            "altitude_m",
            "temperature_k",
            "pressure_pa",
            "density_kg_m3",
            "dew_point_k",
            "relative_humidity_percent",
        ];

        #[derive(serde::Deserialize)]
        #[serde(field_identifier, rename_all = "snake_case")]
        enum Field {
            AltitudeM,
            TemperatureK,
            PressurePa,
            DensityKgM3,
            DewPointK,
            RelativeHumidityPercent,
        }

        /// One row, read and checked against the rows `before` it.
        struct RowSeed<'a> {
            before: &'a [SoundingRow],
        }

        impl<'de> DeserializeSeed<'de> for RowSeed<'_> {
            type Value = SoundingRow;
            fn deserialize<D: serde::Deserializer<'de>>(
                self,
                deserializer: D,
            ) -> Result<SoundingRow, D::Error> {
                deserializer.deserialize_struct("SoundingRow", &FIELDS, self)
            }
        }

        impl<'de> Visitor<'de> for RowSeed<'_> {
            type Value = SoundingRow;
            fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
                f.write_str("a sounding row")
            }
            fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<SoundingRow, A::Error> {
                let mut values: [Option<f64>; 6] = [None; 6];
                let mut seen = [false; 6];
                while let Some(field) = map.next_key::<Field>()? {
                    let slot = field as usize;
                    if core::mem::replace(&mut seen[slot], true) {
                        return Err(A::Error::duplicate_field(FIELDS[slot]));
                    }
                    // `null` reads as "not given", as an absent field does.
                    values[slot] = map.next_value::<Option<f64>>()?;
                }
                let [altitude, temperature, pressure, density, dew_point, relative_humidity] = values;
                let row = SoundingRow {
                    altitude_m: altitude.ok_or_else(|| A::Error::missing_field(FIELDS[0]))?,
                    temperature_k: temperature.ok_or_else(|| A::Error::missing_field(FIELDS[1]))?,
                    pressure_pa: pressure,
                    density_kg_m3: density,
                    dew_point_k: dew_point,
                    relative_humidity_percent: relative_humidity,
                };
                check_row(self.before.len(), &row, self.before).map_err(A::Error::custom)?;
                Ok(row)
            }
        }

        #[derive(serde::Deserialize)]
        #[serde(deny_unknown_fields)]
        struct Parts {
            altitude: AltitudeKind,
            rows: CheckedRows,
            #[serde(default)]
            below: OutsideTable,
            #[serde(default)]
            above: OutsideTable,
        }

        /// Reads what [`Tabulated`]'s `Serialize` writes, through the constructors'
        /// checks.
        impl<'de> serde::Deserialize<'de> for Tabulated<Vec<SoundingLevel>> {
            fn deserialize<D: serde::Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
                let parts = Parts::deserialize(deserializer)?;
                Tabulated::from_rows_vec(parts.altitude, &parts.rows.0)
                    .and_then(|table| table.with_below(parts.below))
                    .and_then(|table| table.with_above(parts.above))
                    .map_err(D::Error::custom)
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

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

    #[cfg(feature = "std")]
    #[test]
    fn error_fields_name_the_row_and_value() {
        let e = Error::NotHydrostatic { row: 3, ratio: 3.3, min: 0.5, max: 2.0 };
        assert_eq!(error_field(&e), Some((4, Some(Field::PressureSource))));
        let e = Error::RowNotFinite { row: 1, quantity: Q_DEW_POINT, value: f64::NAN };
        assert_eq!(error_field(&e), Some((1, Some(Field::DewPoint))));
    }
}
