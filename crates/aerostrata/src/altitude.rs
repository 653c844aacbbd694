//! Geometric and geopotential altitude as distinct types, and gravity with altitude.
//!
//! Geopotential altitude H is the geometric altitude Z rescaled so that the hydrostatic
//! law takes its sea-level form with g0 everywhere: H = r0 Z / (r0 + Z), with the
//! standard's effective Earth radius r0 = 6 356 766 m (U.S. Standard Atmosphere 1976,
//! Part 1). The two are easy to confuse (they differ by 1.2 km at 86 km), so they
//! are separate types and every model says which one it takes.

use crate::constants::{EARTH_RADIUS_M, G0_M_S2};
use crate::error::{within, Result};

/// Lowest geometric altitude any altitude value may hold, m (1000 km below sea level).
pub const MIN_GEOMETRIC_M: f64 = -1.0e6;
/// Highest geometric altitude any altitude value may hold, m (10 000 km).
pub const MAX_GEOMETRIC_M: f64 = 1.0e7;
/// The geopotential image of [`MIN_GEOMETRIC_M`], m.
pub const MIN_GEOPOTENTIAL_M: f64 = geopotential_of(MIN_GEOMETRIC_M);
/// The geopotential image of [`MAX_GEOMETRIC_M`], m.
pub const MAX_GEOPOTENTIAL_M: f64 = geopotential_of(MAX_GEOMETRIC_M);

pub(crate) const fn geopotential_of(z: f64) -> f64 {
    EARTH_RADIUS_M * z / (EARTH_RADIUS_M + z)
}

const fn geometric_of(h: f64) -> f64 {
    EARTH_RADIUS_M * h / (EARTH_RADIUS_M - h)
}

/// Geometric altitude Z above mean sea level, metres.
///
/// Holds a finite value between [`MIN_GEOMETRIC_M`] and [`MAX_GEOMETRIC_M`], a band wide
/// enough for any atmosphere and narrow enough that conversion is well conditioned.
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(try_from = "f64", into = "f64"))]
pub struct GeometricAltitude(f64);

/// Geopotential altitude H, geopotential metres.
///
/// Holds a finite value between [`MIN_GEOPOTENTIAL_M`] and [`MAX_GEOPOTENTIAL_M`].
#[derive(Debug, Clone, Copy, PartialEq, PartialOrd)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(try_from = "f64", into = "f64"))]
pub struct GeopotentialAltitude(f64);

impl GeometricAltitude {
    /// A geometric altitude of `meters` above mean sea level.
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) for NaN or infinity,
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) outside
    /// [`MIN_GEOMETRIC_M`]..=[`MAX_GEOMETRIC_M`].
    pub fn new(meters: f64) -> Result<Self> {
        within("geometric altitude", "m", meters, MIN_GEOMETRIC_M, MAX_GEOMETRIC_M).map(Self)
    }

    /// The altitude in metres.
    #[inline]
    pub const fn meters(self) -> f64 {
        self.0
    }

    /// The geopotential altitude of this point.
    ///
    /// ```text
    /// H = r0 Z / (r0 + Z)
    /// ```
    #[inline]
    pub fn to_geopotential(self) -> GeopotentialAltitude {
        GeopotentialAltitude(geopotential_of(self.0))
    }

    /// Acceleration of gravity at this altitude, m/s^2 (inverse-square law).
    ///
    /// ```text
    /// g(Z) = g0 (r0 / (r0 + Z))^2
    /// ```
    /// Source: U.S. Standard Atmosphere 1976, Part 1 (gravity with altitude).
    ///
    /// ```
    /// # use aerostrata::GeometricAltitude;
    /// // The standard's Table I: 9.5466 m/s^2 at 86 km (from memory of the printed table).
    /// let g = GeometricAltitude::new(86_000.0)?.gravity_m_s2();
    /// assert!((g - 9.5466).abs() <= 0.5e-4);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    #[inline]
    pub fn gravity_m_s2(self) -> f64 {
        let ratio = EARTH_RADIUS_M / (EARTH_RADIUS_M + self.0);
        G0_M_S2 * ratio * ratio
    }
}

impl GeopotentialAltitude {
    /// A geopotential altitude of `meters` geopotential metres.
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) for NaN or infinity,
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) outside
    /// [`MIN_GEOPOTENTIAL_M`]..=[`MAX_GEOPOTENTIAL_M`].
    pub fn new(meters: f64) -> Result<Self> {
        within("geopotential altitude", "m", meters, MIN_GEOPOTENTIAL_M, MAX_GEOPOTENTIAL_M).map(Self)
    }

    /// The altitude in geopotential metres.
    #[inline]
    pub const fn meters(self) -> f64 {
        self.0
    }

    /// The geometric altitude of this point.
    ///
    /// ```text
    /// Z = r0 H / (r0 - H)
    /// ```
    ///
    /// ```
    /// # use aerostrata::GeopotentialAltitude;
    /// // The top of the standard's lower layers: 84.852 km geopotential is 86 km geometric
    /// // (U.S. Standard Atmosphere 1976, Part 1; 86 000 m to the metre).
    /// let z = GeopotentialAltitude::new(84_852.0)?.to_geometric().meters();
    /// assert!((z - 86_000.0).abs() < 0.5);
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    #[inline]
    pub fn to_geometric(self) -> GeometricAltitude {
        GeometricAltitude(geometric_of(self.0))
    }
}

impl TryFrom<f64> for GeometricAltitude {
    type Error = crate::Error;
    fn try_from(meters: f64) -> Result<Self> {
        Self::new(meters)
    }
}

impl TryFrom<f64> for GeopotentialAltitude {
    type Error = crate::Error;
    fn try_from(meters: f64) -> Result<Self> {
        Self::new(meters)
    }
}

impl From<GeometricAltitude> for f64 {
    fn from(altitude: GeometricAltitude) -> f64 {
        altitude.0
    }
}

impl From<GeopotentialAltitude> for f64 {
    fn from(altitude: GeopotentialAltitude) -> f64 {
        altitude.0
    }
}

/// An altitude that says which kind it is; what every model takes.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(rename_all = "snake_case"))]
pub enum Altitude {
    /// Geometric altitude above mean sea level.
    Geometric(GeometricAltitude),
    /// Geopotential altitude.
    Geopotential(GeopotentialAltitude),
}

impl Altitude {
    /// A geometric altitude of `meters`; see [`GeometricAltitude::new`] for the errors.
    pub fn geometric_m(meters: f64) -> Result<Self> {
        GeometricAltitude::new(meters).map(Self::Geometric)
    }

    /// A geopotential altitude of `meters`; see [`GeopotentialAltitude::new`] for the errors.
    pub fn geopotential_m(meters: f64) -> Result<Self> {
        GeopotentialAltitude::new(meters).map(Self::Geopotential)
    }

    /// This point as a geometric altitude (converted if need be).
    #[inline]
    pub fn geometric(self) -> GeometricAltitude {
        match self {
            Self::Geometric(z) => z,
            Self::Geopotential(h) => h.to_geometric(),
        }
    }

    /// This point as a geopotential altitude (converted if need be).
    #[inline]
    pub fn geopotential(self) -> GeopotentialAltitude {
        match self {
            Self::Geometric(z) => z.to_geopotential(),
            Self::Geopotential(h) => h,
        }
    }
}

impl From<GeometricAltitude> for Altitude {
    fn from(z: GeometricAltitude) -> Self {
        Self::Geometric(z)
    }
}

impl From<GeopotentialAltitude> for Altitude {
    fn from(h: GeopotentialAltitude) -> Self {
        Self::Geopotential(h)
    }
}

/// Which kind of altitude a number is: what the rows of a table (a sounding) declare.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(rename_all = "snake_case"))]
pub enum AltitudeKind {
    /// Geometric altitude above mean sea level, m.
    Geometric,
    /// Geopotential altitude, geopotential m.
    Geopotential,
}

impl AltitudeKind {
    /// `meters` of this kind as a tagged [`Altitude`].
    ///
    /// # Errors
    /// As [`Altitude::geometric_m`] or [`Altitude::geopotential_m`].
    pub fn altitude(self, meters: f64) -> Result<Altitude> {
        match self {
            Self::Geometric => Altitude::geometric_m(meters),
            Self::Geopotential => Altitude::geopotential_m(meters),
        }
    }

    /// `meters` of this kind as an [`Altitude`], for a caller that has checked it lies in
    /// a model's range (always within the band [`AltitudeKind::altitude`] checks).
    #[inline]
    pub(crate) const fn checked_by_caller(self, meters: f64) -> Altitude {
        match self {
            Self::Geometric => Altitude::Geometric(GeometricAltitude(meters)),
            Self::Geopotential => Altitude::Geopotential(GeopotentialAltitude(meters)),
        }
    }

    /// The kind's name, as error messages give it.
    pub(crate) fn quantity(self) -> &'static str {
        match self {
            Self::Geometric => "geometric altitude",
            Self::Geopotential => "geopotential altitude",
        }
    }

    /// The band any altitude of this kind may hold, m.
    pub(crate) fn band(self) -> (f64, f64) {
        match self {
            Self::Geometric => (MIN_GEOMETRIC_M, MAX_GEOMETRIC_M),
            Self::Geopotential => (MIN_GEOPOTENTIAL_M, MAX_GEOPOTENTIAL_M),
        }
    }
}

/// The closed band of altitudes where a model is defined, held in both kinds of altitude
/// so that a caller's altitude is checked in the kind the caller gave.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct AltitudeRange {
    /// Lowest geometric altitude, m.
    pub geometric_min_m: f64,
    /// Highest geometric altitude, m.
    pub geometric_max_m: f64,
    /// Lowest geopotential altitude, m.
    pub geopotential_min_m: f64,
    /// Highest geopotential altitude, m.
    pub geopotential_max_m: f64,
}

impl AltitudeRange {
    /// The band between two geometric altitudes (the caller keeps `min <= max`).
    pub const fn from_geometric(min_m: f64, max_m: f64) -> Self {
        Self {
            geometric_min_m: min_m,
            geometric_max_m: max_m,
            geopotential_min_m: geopotential_of(min_m),
            geopotential_max_m: geopotential_of(max_m),
        }
    }

    /// The band between two geopotential altitudes (the caller keeps `min <= max`).
    pub const fn from_geopotential(min_m: f64, max_m: f64) -> Self {
        Self {
            geometric_min_m: geometric_of(min_m),
            geometric_max_m: geometric_of(max_m),
            geopotential_min_m: min_m,
            geopotential_max_m: max_m,
        }
    }

    /// `altitude` if it lies in the band, else an error naming the kind of altitude the
    /// caller gave and the band in that kind.
    ///
    /// # Errors
    /// [`Error::OutOfRange`](crate::Error::OutOfRange).
    pub fn check(&self, altitude: Altitude) -> Result<Altitude> {
        match altitude {
            Altitude::Geometric(z) => {
                within("geometric altitude", "m", z.meters(), self.geometric_min_m, self.geometric_max_m)?
            }
            Altitude::Geopotential(h) => within(
                "geopotential altitude",
                "m",
                h.meters(),
                self.geopotential_min_m,
                self.geopotential_max_m,
            )?,
        };
        Ok(altitude)
    }
}
