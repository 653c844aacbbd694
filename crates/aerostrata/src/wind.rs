//! Winds aloft: a profile of horizontal wind against geometric altitude, from a sounding's
//! wind columns or a wind file, and the wind at any altitude. The east and north
//! components are interpolated linearly in geometric altitude between levels (not speed
//! and direction, which would turn a wind that reverses through calm into a full-strength
//! wind from the side); beyond the profile's lowest and highest levels the nearest
//! level's wind is held, and [`WindAt::held`] says so.
//!
//! Directions follow the meteorological convention: the direction the wind blows FROM,
//! degrees clockwise from true north (a north wind, 0 deg, blows toward the south).

use crate::error::{within, Error, Result};
use crate::math;

/// Largest wind component or speed accepted, m/s: above the fastest winds of the
/// troposphere's jet streams (about 110 m/s) and of the mesosphere and lower thermosphere
/// (100 to 200 m/s; both common practice, no source), so that a real profile always fits
/// and a unit mix-up (knots read as m/s is only a factor of 2; a speed in km/h or ft/s
/// read as m/s can be a factor of 3.6) of a strong wind is caught.
pub const MAX_WIND_M_S: f64 = 250.0;

/// Largest number of levels a wind profile holds (as a sounding).
pub const MAX_LEVELS: usize = 1_000_000;

/// The wind at one level of a profile.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct WindLevel {
    /// Geometric altitude, m.
    pub altitude_m: f64,
    /// East component of the wind's velocity (toward the east is positive), m/s.
    pub east_m_s: f64,
    /// North component of the wind's velocity (toward the north is positive), m/s.
    pub north_m_s: f64,
}

impl WindLevel {
    /// The level at `altitude_m` of a wind of `speed_m_s` blowing from `direction_deg`
    /// (clockwise from true north): east = -W sin(dir), north = -W cos(dir).
    ///
    /// ```
    /// use aerostrata::wind::WindLevel;
    /// // A 10 m/s wind from the west (270 deg) blows toward the east.
    /// let level = WindLevel::from_speed_direction(1000.0, 10.0, 270.0)?;
    /// assert_eq!((level.east_m_s, level.north_m_s), (10.0, 0.0));
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::OutOfRange`] for a speed outside 0 to
    /// [`MAX_WIND_M_S`], a direction outside -360 to 360 deg or an altitude that is not
    /// finite.
    pub fn from_speed_direction(altitude_m: f64, speed_m_s: f64, direction_deg: f64) -> Result<Self> {
        let speed = within("wind speed", "m/s", speed_m_s, 0.0, MAX_WIND_M_S)?;
        let direction = within("wind direction", "deg", direction_deg, -360.0, 360.0)?;
        let (sin, cos) = math::sin_cos_deg(direction);
        // `0.0 - x`, not `-x`: a calm wind's components are +0, whatever its direction.
        Self::new(altitude_m, 0.0 - speed * sin, 0.0 - speed * cos)
    }

    /// The level at `altitude_m` with the given components.
    ///
    /// # Errors
    /// [`Error::NotFinite`] or [`Error::OutOfRange`] for an altitude that is not finite or
    /// a component beyond +-[`MAX_WIND_M_S`].
    pub fn new(altitude_m: f64, east_m_s: f64, north_m_s: f64) -> Result<Self> {
        Ok(Self {
            altitude_m: crate::error::finite("wind level altitude", altitude_m)?,
            east_m_s: within("eastward wind", "m/s", east_m_s, -MAX_WIND_M_S, MAX_WIND_M_S)?,
            north_m_s: within("northward wind", "m/s", north_m_s, -MAX_WIND_M_S, MAX_WIND_M_S)?,
        })
    }

    /// The wind's speed, m/s.
    pub fn speed_m_s(&self) -> f64 {
        math::sqrt(self.east_m_s * self.east_m_s + self.north_m_s * self.north_m_s)
    }

    /// The direction the wind blows from, degrees clockwise from true north in [0, 360);
    /// 0 for a calm.
    pub fn direction_deg(&self) -> f64 {
        if self.east_m_s == 0.0 && self.north_m_s == 0.0 {
            return 0.0;
        }
        let toward = math::atan2_deg(self.east_m_s, self.north_m_s);
        // From = toward + 180, in [0, 360).
        let from = toward + 180.0;
        if from >= 360.0 {
            from - 360.0
        } else {
            from
        }
    }
}

/// The wind at one altitude, as a profile gives it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WindAt {
    /// East component, m/s.
    pub east_m_s: f64,
    /// North component, m/s.
    pub north_m_s: f64,
    /// Whether the altitude is below the profile's lowest level or above its highest, so
    /// that the nearest level's wind was held rather than interpolated.
    pub held: bool,
}

/// A wind profile: levels of increasing geometric altitude, interpolated linearly in each
/// component. `S` is anything that holds the levels (`[WindLevel; N]`, `&[WindLevel]`,
/// `Vec<WindLevel>`): the profile never allocates.
///
/// ```
/// use aerostrata::wind::{WindLevel, WindProfile};
/// let levels = [
///     WindLevel::from_speed_direction(0.0, 4.0, 270.0)?,      // 4 m/s from the west
///     WindLevel::from_speed_direction(3000.0, 20.0, 270.0)?,  // 20 m/s from the west
/// ];
/// let winds = WindProfile::new(levels)?;
/// let at = winds.at(1500.0)?;
/// assert!((at.east_m_s - 12.0).abs() < 1e-12 && !at.held);
/// assert!(winds.at(9000.0)?.held);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct WindProfile<S> {
    levels: S,
}

impl<S: AsRef<[WindLevel]>> WindProfile<S> {
    /// A profile of `levels`, lowest first.
    ///
    /// # Errors
    /// [`Error::TooFewRows`] for no level; [`Error::InvalidPoint`] (naming the level's
    /// index) for more than [`MAX_LEVELS`] levels, an altitude that is not finite or not
    /// above the previous level's, or a component that is not finite or beyond
    /// +-[`MAX_WIND_M_S`].
    pub fn new(levels: S) -> Result<Self> {
        let list = levels.as_ref();
        if list.is_empty() {
            return Err(Error::TooFewRows { count: 0 });
        }
        let bad = |index: usize, problem: &'static str, value: f64| Error::InvalidPoint {
            table: "wind profile",
            index,
            problem,
            value,
        };
        if list.len() > MAX_LEVELS {
            return Err(bad(
                MAX_LEVELS,
                "a wind profile holds at most 1 000 000 levels; levels",
                list.len() as f64,
            ));
        }
        let mut previous: Option<f64> = None;
        for (index, level) in list.iter().enumerate() {
            if !level.altitude_m.is_finite() {
                return Err(bad(index, "the altitude (m) must be finite", level.altitude_m));
            }
            if previous.is_some_and(|p| level.altitude_m <= p) {
                return Err(bad(index, "altitudes (m) must increase from level to level", level.altitude_m));
            }
            for component in [level.east_m_s, level.north_m_s] {
                if !(component.is_finite() && component.abs() <= MAX_WIND_M_S) {
                    return Err(bad(
                        index,
                        "a wind component (m/s) must be finite and within +-250 m/s",
                        component,
                    ));
                }
            }
            previous = Some(level.altitude_m);
        }
        Ok(Self { levels })
    }

    /// The same profile, borrowing the levels (checked already).
    pub(crate) fn borrowed(&self) -> WindProfile<&[WindLevel]> {
        WindProfile { levels: self.levels.as_ref() }
    }

    /// The levels, lowest first.
    pub fn levels(&self) -> &[WindLevel] {
        self.levels.as_ref()
    }

    /// The wind at geometric altitude `altitude_m`.
    ///
    /// # Errors
    /// [`Error::NotFinite`] for an altitude that is not finite.
    pub fn at(&self, altitude_m: f64) -> Result<WindAt> {
        let altitude_m = crate::error::finite("geometric altitude", altitude_m)?;
        Ok(self.segment(altitude_m).wind(altitude_m))
    }

    /// The piece of the profile that holds `altitude_m` (finite).
    pub(crate) fn segment(&self, altitude_m: f64) -> WindSegment {
        let levels = self.levels.as_ref();
        // The first level above the altitude; levels[..above] are at or below it.
        let above = levels.partition_point(|level| level.altitude_m <= altitude_m);
        match (above.checked_sub(1).and_then(|i| levels.get(i)), levels.get(above)) {
            (Some(low), Some(high)) => WindSegment::between(low, high),
            (Some(low), None) => WindSegment::held(low, low.altitude_m, f64::INFINITY),
            (None, Some(high)) => WindSegment::held(high, f64::NEG_INFINITY, high.altitude_m),
            // `new` refuses an empty profile: a calm, held, for completeness.
            (None, None) => WindSegment {
                low_m: f64::NEG_INFINITY,
                high_m: f64::INFINITY,
                east: (0.0, 0.0),
                north: (0.0, 0.0),
                held: true,
            },
        }
    }
}

/// One piece of a profile: the wind between two levels, or a level's wind held beyond the
/// profile. A flight scan keeps the piece its last sample fell in, since consecutive
/// samples nearly always share it.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct WindSegment {
    low_m: f64,
    high_m: f64,
    east: (f64, f64),
    north: (f64, f64),
    held: bool,
}

impl WindSegment {
    fn between(low: &WindLevel, high: &WindLevel) -> Self {
        let span = high.altitude_m - low.altitude_m;
        Self {
            low_m: low.altitude_m,
            high_m: high.altitude_m,
            east: (low.east_m_s, (high.east_m_s - low.east_m_s) / span),
            north: (low.north_m_s, (high.north_m_s - low.north_m_s) / span),
            held: false,
        }
    }

    /// The level's wind held from `low_m` to `high_m` (one of them the level's altitude,
    /// where nothing is held).
    fn held(level: &WindLevel, low_m: f64, high_m: f64) -> Self {
        Self { low_m, high_m, east: (level.east_m_s, 0.0), north: (level.north_m_s, 0.0), held: true }
    }

    /// Whether `altitude_m` falls in this piece (its lower end included).
    pub(crate) fn holds(&self, altitude_m: f64) -> bool {
        self.low_m <= altitude_m && altitude_m < self.high_m
    }

    pub(crate) fn wind(&self, altitude_m: f64) -> WindAt {
        // A held piece has no slope, and its lower end may be infinite.
        let dz = if self.held { 0.0 } else { altitude_m - self.low_m };
        WindAt {
            east_m_s: self.east.0 + self.east.1 * dz,
            north_m_s: self.north.0 + self.north.1 * dz,
            // Exactly at the single level of a profile, nothing is held.
            held: self.held && altitude_m != self.low_m && altitude_m != self.high_m,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Directions by hand: the meteorological convention names where the wind comes
    /// from (common practice, no source).
    #[test]
    fn directions_are_where_the_wind_comes_from() {
        let level = |dir: f64| WindLevel::from_speed_direction(0.0, 10.0, dir).unwrap();
        assert_eq!((level(0.0).east_m_s, level(0.0).north_m_s), (0.0, -10.0));
        assert_eq!((level(90.0).east_m_s, level(90.0).north_m_s), (-10.0, 0.0));
        assert_eq!((level(180.0).east_m_s, level(180.0).north_m_s), (0.0, 10.0));
        assert_eq!((level(270.0).east_m_s, level(270.0).north_m_s), (10.0, 0.0));
        assert_eq!(level(-90.0), level(270.0));
        for dir in [0.0, 45.0, 90.0, 135.5, 180.0, 270.0, 359.0] {
            let back = level(dir);
            assert!((back.direction_deg() - dir).abs() < 1e-12, "{dir} -> {}", back.direction_deg());
            assert!((back.speed_m_s() - 10.0).abs() < 1e-12);
        }
        let calm = WindLevel::from_speed_direction(0.0, 0.0, 123.0).unwrap();
        assert_eq!((calm.east_m_s, calm.north_m_s, calm.direction_deg()), (0.0, 0.0, 0.0));
    }

    #[test]
    fn components_interpolate_linearly_and_are_held_beyond() {
        let levels = [
            WindLevel::new(100.0, 10.0, 0.0).unwrap(),
            WindLevel::new(1100.0, -10.0, 4.0).unwrap(),
            WindLevel::new(2100.0, -10.0, 4.0).unwrap(),
        ];
        let winds = WindProfile::new(&levels[..]).unwrap();
        // Halfway, the reversing wind is calm (speed and direction would not be).
        let mid = winds.at(600.0).unwrap();
        assert_eq!((mid.east_m_s, mid.north_m_s, mid.held), (0.0, 2.0, false));
        assert_eq!(winds.at(100.0).unwrap(), WindAt { east_m_s: 10.0, north_m_s: 0.0, held: false });
        assert_eq!(winds.at(1100.0).unwrap(), WindAt { east_m_s: -10.0, north_m_s: 4.0, held: false });
        assert_eq!(winds.at(2100.0).unwrap(), WindAt { east_m_s: -10.0, north_m_s: 4.0, held: false });
        assert_eq!(winds.at(-50.0).unwrap(), WindAt { east_m_s: 10.0, north_m_s: 0.0, held: true });
        assert_eq!(winds.at(9e9).unwrap(), WindAt { east_m_s: -10.0, north_m_s: 4.0, held: true });
        let single = WindProfile::new([WindLevel::new(500.0, 3.0, 4.0).unwrap()]).unwrap();
        assert!(!single.at(500.0).unwrap().held);
        assert!(single.at(0.0).unwrap().held && single.at(1e4).unwrap().held);
        assert!(winds.at(f64::NAN).is_err());
    }

    #[test]
    fn bad_profiles_are_refused_naming_the_level() {
        let level = |z: f64, e: f64| WindLevel { altitude_m: z, east_m_s: e, north_m_s: 0.0 };
        let none: [WindLevel; 0] = [];
        assert!(matches!(WindProfile::new(none), Err(Error::TooFewRows { count: 0 })));
        assert!(matches!(
            WindProfile::new([level(0.0, 1.0), level(0.0, 1.0)]),
            Err(Error::InvalidPoint { index: 1, .. })
        ));
        assert!(matches!(
            WindProfile::new([level(0.0, 1.0), level(10.0, 300.0)]),
            Err(Error::InvalidPoint { index: 1, .. })
        ));
        assert!(matches!(
            WindProfile::new([level(f64::NAN, 1.0)]),
            Err(Error::InvalidPoint { index: 0, .. })
        ));
        assert!(WindLevel::from_speed_direction(0.0, 251.0, 0.0).is_err());
        assert!(WindLevel::from_speed_direction(0.0, -1.0, 0.0).is_err());
        assert!(WindLevel::from_speed_direction(0.0, 10.0, 400.0).is_err());
    }
}
