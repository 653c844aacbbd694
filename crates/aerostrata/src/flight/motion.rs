//! A flight sample with the direction of its velocity, the vehicle's axis, and the angle
//! between the axis and the air-relative velocity: the total angle of attack the wind
//! gives a vehicle flying along its ground track, whose product with q sizes a slender
//! vehicle's bending loads.
//!
//! Vectors are east, north, up (a local level frame at the sample), in m/s; angles in
//! degrees, headings and azimuths clockwise from true north.

use crate::aero::MAX_SPEED_M_S;
use crate::error::{within, Result};
use crate::math;

/// A flight sample whose ground-relative velocity is given as east, north and up
/// components (see [`VectorSample::from_path`] for speed, flight-path angle and heading).
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct VectorSample {
    /// Time, s (strictly increasing along a flight).
    pub time_s: f64,
    /// Geometric altitude above mean sea level, m.
    pub altitude_m: f64,
    /// East component of the velocity relative to the ground, m/s.
    pub velocity_east_m_s: f64,
    /// North component, m/s.
    pub velocity_north_m_s: f64,
    /// Up component, m/s.
    pub velocity_up_m_s: f64,
    /// The vehicle's axis, where it is known; by default the axis lies along the
    /// ground-relative velocity (a vehicle flying its trajectory at zero angle of attack
    /// in still air).
    pub axis: Option<Axis>,
}

impl VectorSample {
    /// The sample whose ground-relative velocity has speed `speed_m_s`, climbs at
    /// `flight_path_angle_deg` above the horizontal and heads `heading_deg` clockwise from
    /// true north: east = V cos(gamma) sin(psi), north = V cos(gamma) cos(psi),
    /// up = V sin(gamma).
    ///
    /// ```
    /// use aerostrata::flight::VectorSample;
    /// // Straight up at 100 m/s.
    /// let s = VectorSample::from_path(1.0, 500.0, 100.0, 90.0, 0.0, None)?;
    /// assert_eq!((s.velocity_east_m_s, s.velocity_north_m_s, s.velocity_up_m_s), (0.0, 0.0, 100.0));
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) or
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) for a speed beyond
    /// +-[`MAX_SPEED_M_S`], a flight-path angle outside -90 to 90 deg or a heading outside
    /// -360 to 360 deg.
    pub fn from_path(
        time_s: f64,
        altitude_m: f64,
        speed_m_s: f64,
        flight_path_angle_deg: f64,
        heading_deg: f64,
        axis: Option<Axis>,
    ) -> Result<Self> {
        let speed = within("speed", "m/s", speed_m_s, -MAX_SPEED_M_S, MAX_SPEED_M_S)?.abs();
        let gamma = within("flight-path angle", "deg", flight_path_angle_deg, -90.0, 90.0)?;
        let psi = within("heading", "deg", heading_deg, -360.0, 360.0)?;
        let [east, north, up] = direction(gamma, psi);
        Ok(Self {
            time_s,
            altitude_m,
            velocity_east_m_s: speed * east,
            velocity_north_m_s: speed * north,
            velocity_up_m_s: speed * up,
            axis,
        })
    }

    pub(super) fn velocity(&self) -> [f64; 3] {
        [self.velocity_east_m_s, self.velocity_north_m_s, self.velocity_up_m_s]
    }
}

/// The direction of a vehicle's axis (nose forward).
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Axis {
    /// Angle above the horizontal, deg (-90 to 90).
    pub elevation_deg: f64,
    /// Direction of the horizontal part, deg clockwise from true north.
    pub azimuth_deg: f64,
}

impl Axis {
    /// The axis at `elevation_deg` above the horizontal and `azimuth_deg` clockwise from
    /// true north.
    ///
    /// # Errors
    /// [`Error::NotFinite`](crate::Error::NotFinite) or
    /// [`Error::OutOfRange`](crate::Error::OutOfRange) for an elevation outside -90 to 90
    /// deg or an azimuth outside -360 to 360 deg.
    pub fn new(elevation_deg: f64, azimuth_deg: f64) -> Result<Self> {
        Ok(Self {
            elevation_deg: within("axis elevation", "deg", elevation_deg, -90.0, 90.0)?,
            azimuth_deg: within("axis azimuth", "deg", azimuth_deg, -360.0, 360.0)?,
        })
    }

    /// The unit vector (east, north, up).
    pub(super) fn unit(&self) -> [f64; 3] {
        direction(self.elevation_deg, self.azimuth_deg)
    }
}

/// Which boundary layer the recovery temperature is for: the recovery factor is Pr^(1/2)
/// for a laminar one and Pr^(1/3) for a turbulent one (the classical flat-plate values;
/// common practice, no source), Pr the Prandtl number of the air at the sample.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum BoundaryLayer {
    /// Recovery factor Pr^(1/2).
    Laminar,
    /// Recovery factor Pr^(1/3): the higher wall temperature of the two, the default.
    #[default]
    Turbulent,
}

/// The unit vector at `elevation` above the horizontal and `azimuth` clockwise from north.
fn direction(elevation_deg: f64, azimuth_deg: f64) -> [f64; 3] {
    let (sin_e, cos_e) = math::sin_cos_deg(elevation_deg);
    let (sin_a, cos_a) = math::sin_cos_deg(azimuth_deg);
    [cos_e * sin_a, cos_e * cos_a, sin_e]
}

pub(super) fn norm(v: [f64; 3]) -> f64 {
    math::sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2])
}

/// The angle between `a` and `b`, degrees in [0, 180], as atan2(|a x b|, a . b): accurate
/// at small angles, where acos of the normalised dot product loses half its digits.
pub(super) fn angle_deg(a: [f64; 3], b: [f64; 3]) -> f64 {
    let cross = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
    let dot = a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    math::atan2_deg(norm(cross), dot)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Hand-worked: a vertical climb at 100 m/s through a 10 m/s cross wind meets the
    /// air at atan(10/100) = 5.710593137499643 deg (computed by hand, atan(0.1) in
    /// degrees).
    #[test]
    fn angles_between_vectors() {
        let alpha = angle_deg([0.0, 0.0, 1.0], [-10.0, 0.0, 100.0]);
        assert!((alpha - 5.710_593_137_499_643).abs() < 1e-13, "{alpha}");
        assert_eq!(angle_deg([1.0, 0.0, 0.0], [2.0, 0.0, 0.0]), 0.0);
        assert_eq!(angle_deg([1.0, 0.0, 0.0], [0.0, 3.0, 0.0]), 90.0);
        assert_eq!(angle_deg([1.0, 0.0, 0.0], [-3.0, 0.0, 0.0]), 180.0);
        // A tiny angle keeps its digits: 1e-9 rad.
        let tiny = angle_deg([1.0, 0.0, 0.0], [1.0, 1e-9, 0.0]);
        assert!((tiny - 1e-9 * 180.0 / core::f64::consts::PI).abs() < 1e-22);
    }

    #[test]
    fn paths_and_axes_point_where_they_say() {
        let s = |gamma, psi| VectorSample::from_path(0.0, 0.0, 10.0, gamma, psi, None).unwrap().velocity();
        assert_eq!(s(0.0, 90.0), [10.0, 0.0, 0.0]);
        assert_eq!(s(0.0, 180.0), [0.0, -10.0, 0.0]);
        assert_eq!(s(-90.0, 0.0), [0.0, 0.0, -10.0]);
        let [e, n, u] = s(30.0, 45.0);
        assert!(
            (u - 5.0).abs() < 1e-14 && (e - n).abs() < 1e-14 && (e * e + n * n + u * u - 100.0).abs() < 1e-12
        );
        assert_eq!(Axis::new(90.0, 123.0).unwrap().unit()[2], 1.0);
        assert!(Axis::new(91.0, 0.0).is_err());
        assert!(VectorSample::from_path(0.0, 0.0, 10.0, 95.0, 0.0, None).is_err());
        assert!(VectorSample::from_path(0.0, 0.0, f64::NAN, 0.0, 0.0, None).is_err());
    }
}
