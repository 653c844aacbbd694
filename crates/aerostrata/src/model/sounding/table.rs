//! The tabulated atmosphere itself: its storage (an array, a borrowed slice or a `Vec`),
//! its constructors, what it does beyond its rows, and its [`Atmosphere`] implementation:
//! hydrostatic interpolation between the rows (the formula is on [`Tabulated`]).

use crate::altitude::{Altitude, AltitudeKind, AltitudeRange};
use crate::error::{Error, Result};
use crate::gas::Air;
#[cfg(doc)]
use crate::humidity;
use crate::model::atmosphere::Atmosphere;
#[cfg(doc)]
use crate::model::layered::Layer;
use crate::model::standard::US1976;

use super::hydrostatics::build;
#[cfg(doc)]
use super::hydrostatics::{MAX_HYDROSTATIC_RATIO, MIN_HYDROSTATIC_RATIO};
use super::interpolate::{blend, blend_point, setting, table_point, Blend, OutsideTable, Point};
use super::moist::{moist_state, MoistState};
#[cfg(doc)]
use super::rows::MIN_ROW_SPACING_M;
use super::rows::{SoundingLevel, SoundingRow};

/// A tabulated atmosphere: rows of altitude, temperature and pressure or density, with
/// optional humidity, interpolated hydrostatically.
///
/// `S` is the storage of the computed rows: an array `[SoundingLevel; N]`
/// ([`Tabulated::from_rows`]), a borrowed slice filled in place
/// ([`Tabulated::from_rows_in`]; neither allocates, so a sounding can live in a static
/// array on a flight computer), or with the `alloc` feature a `Vec`
#[cfg_attr(feature = "alloc", doc = "([`Tabulated::from_rows_vec`]).")]
#[cfg_attr(not(feature = "alloc"), doc = "(`Tabulated::from_rows_vec`).")]
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
        self.below = blend(self.levels(), self.kind, outside, 0)?;
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
        self.above = blend(self.levels(), self.kind, outside, last)?;
        self.range.geometric_max_m = self.table_range.geometric_max_m;
        self.range.geopotential_max_m = self.table_range.geopotential_max_m;
        if self.above.is_some() {
            let standard = US1976.range();
            self.range.geometric_max_m = self.range.geometric_max_m.max(standard.geometric_max_m);
            self.range.geopotential_max_m = self.range.geopotential_max_m.max(standard.geopotential_max_m);
        }
        Ok(self)
    }

    /// The full state and the humidity quantities at `altitude`.
    ///
    /// # Errors
    /// As [`Atmosphere::air`].
    pub fn moist_state(&self, altitude: Altitude) -> Result<MoistState> {
        moist_state(altitude, &self.point(altitude)?)
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
            (false, false) => return table_point(self.levels(), h),
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
