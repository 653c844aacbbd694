//! Flight files: which columns of a table make a sample, and the sample a row makes. The
//! one set of rules every door reads a flight file by (the command line, the WebAssembly
//! module), over the one reader of headings and cells ([`crate::table`]).
//!
//! Three kinds of file: a speed relative to the air (`velocity`, or `speed`); a
//! ground-relative velocity by its components (`velocity_east`, `velocity_north`,
//! `velocity_up`); or by its speed and direction (`velocity` with `flight_path_angle` and
//! `heading`). The two with a direction may give the vehicle's axis (`axis_elevation`,
//! `axis_azimuth`). Time and the geometric altitude (`altitude` or `geometric_altitude`)
//! are always there. A column given twice, or a velocity given two ways, is refused: a
//! reader that kept one and dropped the other would guess.

use core::fmt;

use crate::error::Error;
use crate::flight::{Axis, FlightPoint, FlightScan, Sample, VectorSample};
use crate::model::Atmosphere;
use crate::quantity::Quantity;
use crate::table::{Header, MissingColumn};

use super::{AXIS_ANGLES, PATH_ANGLES, VELOCITY_COMPONENTS};

/// The quantities a flight file's header may name (a flight's altitude is geometric, so
/// `geometric_altitude` reads as well as `altitude`).
pub const FILE_COLUMNS: [Quantity; 11] = [
    Quantity::Time,
    Quantity::Altitude,
    Quantity::GeometricAltitude,
    Quantity::Velocity,
    Quantity::VelocityEast,
    Quantity::VelocityNorth,
    Quantity::VelocityUp,
    Quantity::FlightPathAngle,
    Quantity::Heading,
    Quantity::AxisElevation,
    Quantity::AxisAzimuth,
];

/// The columns of a flight file without a header, in order.
pub const IMPLICIT_COLUMNS: [Quantity; 3] = [Quantity::Time, Quantity::Altitude, Quantity::Velocity];

/// What a flight file gives of each sample's velocity.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum VelocityGiven {
    /// A speed relative to the air, without direction.
    Speed,
    /// The ground-relative velocity's east, north and up components.
    Components,
    /// The ground-relative speed, flight-path angle and heading.
    Path,
}

impl VelocityGiven {
    /// Whether the samples give their velocity's direction.
    pub fn has_direction(self) -> bool {
        self != VelocityGiven::Speed
    }
}

/// Where a flight file's quantities are: column indexes (from 0) of its header.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct FileLayout {
    given: VelocityGiven,
    time: usize,
    altitude: (Quantity, usize),
    /// The speed; or east, north, up; or speed, flight-path angle, heading.
    velocity: [Option<usize>; 3],
    axis: Option<(usize, usize)>,
}

/// Why a header cannot be a flight file's.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[non_exhaustive]
pub enum LayoutError {
    /// No column of the quantity (the time or the altitude).
    Missing(Quantity),
    /// Both `altitude` and `geometric_altitude`.
    TwoAltitudes,
    /// No velocity in any of the three ways.
    NoVelocity,
    /// The velocity in two ways (a speed beside the components, say).
    VelocityTwice,
    /// Some of the components, not all three.
    ComponentsIncomplete,
    /// A path angle without the speed or the other angle.
    PathIncomplete,
    /// One of the axis angles without the other.
    AxisIncomplete,
    /// The axis with a speed that has no direction.
    AxisWithoutDirection,
}

/// What [`SampleError::Empty`] says.
pub const EMPTY_CELL: &str = "an empty cell; every sample needs a value";

/// Why a row cannot be a sample. Column indexes count from 0.
#[derive(Clone, Copy, Debug, PartialEq)]
#[non_exhaustive]
pub enum SampleError {
    /// An empty cell where the sample needs a value.
    Empty {
        /// The column.
        index: usize,
    },
    /// A value outside its quantity's range (an axis elevation beyond 90 deg, say).
    Value {
        /// The column.
        index: usize,
        /// Why.
        error: Error,
    },
}

impl SampleError {
    /// The column at fault, from 0.
    pub fn index(&self) -> usize {
        match *self {
            SampleError::Empty { index } | SampleError::Value { index, .. } => index,
        }
    }
}

impl FileLayout {
    /// The layout of a header read with [`FILE_COLUMNS`] taken.
    ///
    /// ```
    /// use aerostrata::flight::{FileLayout, FILE_COLUMNS};
    /// use aerostrata::table::Header;
    /// let header = Header::read("time_s,altitude_ft,speed (kt)", |q| FILE_COLUMNS.contains(&q), |q| q.si())?;
    /// let layout = FileLayout::of(&header)?;
    /// let mut values = [None; 3];
    /// header.read_row("1,1000,250", &mut values)?;
    /// assert_eq!(layout.sample(&values)?.altitude_m(), 304.8);
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    ///
    /// # Errors
    /// [`LayoutError`]: what the header misses or gives twice.
    pub fn of(header: &Header) -> Result<Self, LayoutError> {
        let at = |q: Quantity| header.position(q);
        let count = |qs: &[Quantity]| qs.iter().filter(|q| at(**q).is_some()).count();
        let time = at(Quantity::Time).ok_or(LayoutError::Missing(Quantity::Time))?;
        let altitude = match (at(Quantity::Altitude), at(Quantity::GeometricAltitude)) {
            (Some(_), Some(_)) => return Err(LayoutError::TwoAltitudes),
            (Some(i), None) => (Quantity::Altitude, i),
            (None, Some(i)) => (Quantity::GeometricAltitude, i),
            (None, None) => return Err(LayoutError::Missing(Quantity::Altitude)),
        };
        let speed = at(Quantity::Velocity);
        let (components, path) = (count(&VELOCITY_COMPONENTS), count(&PATH_ANGLES));
        let (given, velocity) = if components > 0 {
            if speed.is_some() || path > 0 {
                return Err(LayoutError::VelocityTwice);
            }
            if components < 3 {
                return Err(LayoutError::ComponentsIncomplete);
            }
            (VelocityGiven::Components, VELOCITY_COMPONENTS.map(at))
        } else if path > 0 {
            if speed.is_none() || path < 2 {
                return Err(LayoutError::PathIncomplete);
            }
            (VelocityGiven::Path, [speed, at(Quantity::FlightPathAngle), at(Quantity::Heading)])
        } else if speed.is_some() {
            (VelocityGiven::Speed, [speed, None, None])
        } else {
            return Err(LayoutError::NoVelocity);
        };
        let axis = match (at(Quantity::AxisElevation), at(Quantity::AxisAzimuth)) {
            (None, None) => None,
            (Some(e), Some(a)) if given.has_direction() => Some((e, a)),
            (Some(_), Some(_)) => return Err(LayoutError::AxisWithoutDirection),
            _ => return Err(LayoutError::AxisIncomplete),
        };
        Ok(FileLayout { given, time, altitude, velocity, axis })
    }

    /// What the file gives of the velocity.
    pub fn given(&self) -> VelocityGiven {
        self.given
    }

    /// The quantity of the altitude's column (`altitude` or `geometric_altitude`).
    pub fn altitude_quantity(&self) -> Quantity {
        self.altitude.0
    }

    /// The columns a sample is made of, in [`FILE_COLUMNS`]' order: (quantity, index).
    pub fn columns(&self) -> impl Iterator<Item = (Quantity, usize)> + '_ {
        let velocity: [Quantity; 3] = match self.given {
            VelocityGiven::Speed | VelocityGiven::Path => {
                [Quantity::Velocity, Quantity::FlightPathAngle, Quantity::Heading]
            }
            VelocityGiven::Components => VELOCITY_COMPONENTS,
        };
        let axis = self.axis.map(|(e, a)| [(AXIS_ANGLES[0], e), (AXIS_ANGLES[1], a)]);
        [(Quantity::Time, self.time), self.altitude]
            .into_iter()
            .chain(velocity.into_iter().zip(self.velocity).filter_map(|(q, i)| Some((q, i?))))
            .chain(axis.into_iter().flatten())
    }

    /// The sample of a row read by the header this layout is of (`values[i]` is column
    /// i's value in SI, as [`Header::read_row`] gives them).
    ///
    /// # Errors
    /// [`SampleError`]: an empty cell the sample needs, an axis or path angle out of its
    /// range (the time, altitude and speed are checked where the sample is used).
    pub fn sample(&self, values: &[Option<f64>]) -> Result<FileSample, SampleError> {
        let need = |index: usize| values.get(index).copied().flatten().ok_or(SampleError::Empty { index });
        let time_s = need(self.time)?;
        let altitude_m = need(self.altitude.1)?;
        let [first, second, third] = self.velocity.map(|i| i.map(need).transpose());
        let (first, second, third) = (first?.unwrap_or(0.0), second?.unwrap_or(0.0), third?.unwrap_or(0.0));
        let axis = match self.axis {
            None => None,
            Some((e, a)) => Some(
                Axis::new(need(e)?, need(a)?)
                    .map_err(|error| SampleError::Value { index: axis_column(&error, e, a), error })?,
            ),
        };
        Ok(match self.given {
            VelocityGiven::Speed => FileSample::Speed(Sample { time_s, altitude_m, velocity_m_s: first }),
            VelocityGiven::Components => FileSample::Vector(VectorSample {
                time_s,
                altitude_m,
                velocity_east_m_s: first,
                velocity_north_m_s: second,
                velocity_up_m_s: third,
                axis,
            }),
            VelocityGiven::Path => FileSample::Vector(
                VectorSample::from_path(time_s, altitude_m, first, second, third, axis).map_err(|error| {
                    let index = match named(&error) {
                        "heading" => self.velocity[2],
                        "flight-path angle" => self.velocity[1],
                        _ => self.velocity[0],
                    };
                    SampleError::Value { index: index.unwrap_or(self.time), error }
                })?,
            ),
        })
    }
}

/// The axis column an [`Axis::new`] error names.
fn axis_column(error: &Error, elevation: usize, azimuth: usize) -> usize {
    if named(error) == "axis azimuth" {
        azimuth
    } else {
        elevation
    }
}

/// The quantity a range error names.
fn named(error: &Error) -> &'static str {
    match *error {
        Error::OutOfRange { quantity, .. } | Error::NotFinite { quantity, .. } => quantity,
        _ => "",
    }
}

/// A sample of either kind.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum FileSample {
    /// A speed without direction.
    Speed(Sample),
    /// A ground-relative velocity with its direction.
    Vector(VectorSample),
}

impl FileSample {
    /// The sample's geometric altitude, m.
    pub fn altitude_m(&self) -> f64 {
        match self {
            FileSample::Speed(s) => s.altitude_m,
            FileSample::Vector(s) => s.altitude_m,
        }
    }

    /// Records the sample in `scan`.
    ///
    /// # Errors
    /// As [`FlightScan::push`] and [`FlightScan::push_vector`].
    pub fn push<A: Atmosphere>(self, scan: &mut FlightScan<'_, A>) -> crate::Result<FlightPoint> {
        match self {
            FileSample::Speed(s) => scan.push(s),
            FileSample::Vector(s) => scan.push_vector(s),
        }
    }
}

struct Names<'a>(&'a [Quantity]);

impl fmt::Display for Names<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, q) in self.0.iter().enumerate() {
            f.write_str(if i == 0 { "" } else { ", " })?;
            f.write_str(q.name())?;
        }
        Ok(())
    }
}

impl fmt::Display for LayoutError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let (components, path, axis) =
            (Names(&VELOCITY_COMPONENTS), Names(&PATH_ANGLES), Names(&AXIS_ANGLES));
        match self {
            // The altitude may be headed either way.
            LayoutError::Missing(Quantity::Altitude) => {
                write!(f, "{}", MissingColumn(&[Quantity::Altitude, Quantity::GeometricAltitude]))
            }
            LayoutError::Missing(q) => write!(f, "{}", MissingColumn(core::slice::from_ref(q))),
            LayoutError::TwoAltitudes => f.write_str("the header has columns altitude and geometric_altitude: keep one"),
            LayoutError::NoVelocity => write!(
                f,
                "the header needs the velocity: a column velocity or speed (relative to the air), or {components} \
                 (ground velocity), or velocity with {path}"
            ),
            LayoutError::VelocityTwice => write!(
                f,
                "the header gives the velocity twice: keep velocity alone, velocity with {path}, or {components}"
            ),
            LayoutError::ComponentsIncomplete => {
                write!(f, "the velocity's components need all three columns: {components}")
            }
            LayoutError::PathIncomplete => {
                write!(f, "a velocity by its direction needs velocity (or speed), {path}")
            }
            LayoutError::AxisIncomplete => write!(f, "the vehicle's axis needs both {axis}"),
            LayoutError::AxisWithoutDirection => {
                write!(f, "{axis} need the velocity's direction ({components} or {path})")
            }
        }
    }
}

impl fmt::Display for SampleError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SampleError::Empty { .. } => f.write_str(EMPTY_CELL),
            SampleError::Value { error, .. } => write!(f, "{error}"),
        }
    }
}

impl core::error::Error for LayoutError {}

impl core::error::Error for SampleError {}

#[cfg(test)]
mod tests {
    use super::*;

    fn layout(line: &str) -> Result<FileLayout, LayoutError> {
        let header = Header::read(line, |q| FILE_COLUMNS.contains(&q), |q| q.si()).unwrap();
        FileLayout::of(&header)
    }

    fn sample(header_line: &str, row: &str) -> Result<FileSample, SampleError> {
        let header = Header::read(header_line, |q| FILE_COLUMNS.contains(&q), |q| q.si()).unwrap();
        let mut values = [None; 16];
        header.read_row(row, &mut values).unwrap();
        FileLayout::of(&header).unwrap().sample(&values)
    }

    /// Common practice, no source: a file that gives the velocity two ways, or half of
    /// one way, is refused rather than read by a guess.
    #[test]
    fn every_header_rule() {
        use LayoutError as E;
        assert_eq!(layout("time,altitude,velocity").map(|l| l.given()), Ok(VelocityGiven::Speed));
        assert_eq!(
            layout("time,geometric_altitude_ft,speed_kt").map(|l| l.altitude_quantity()),
            Ok(Quantity::GeometricAltitude)
        );
        assert_eq!(
            layout("time,altitude,velocity_east,velocity_north,velocity_up,axis_elevation,axis_azimuth")
                .map(|l| l.given()),
            Ok(VelocityGiven::Components)
        );
        assert_eq!(
            layout("time,altitude,speed,flight_path_angle,heading").map(|l| l.given()),
            Ok(VelocityGiven::Path)
        );
        for (line, error) in [
            ("altitude,velocity", E::Missing(Quantity::Time)),
            ("time,velocity", E::Missing(Quantity::Altitude)),
            ("time,altitude,geometric_altitude,velocity", E::TwoAltitudes),
            ("time,altitude", E::NoVelocity),
            ("time,altitude,velocity,velocity_east,velocity_north,velocity_up", E::VelocityTwice),
            ("time,altitude,velocity_east,velocity_up,flight_path_angle", E::VelocityTwice),
            ("time,altitude,velocity_east,velocity_north", E::ComponentsIncomplete),
            ("time,altitude,velocity,heading", E::PathIncomplete),
            ("time,altitude,flight_path_angle,heading", E::PathIncomplete),
            ("time,altitude,velocity,axis_elevation,axis_azimuth", E::AxisWithoutDirection),
            ("time,altitude,velocity_east,velocity_north,velocity_up,axis_azimuth", E::AxisIncomplete),
        ] {
            assert_eq!(layout(line), Err(error), "{line}");
        }
        assert_eq!(
            E::Missing(Quantity::Time).to_string(),
            "the header needs a column time (a heading such as time_s or 'time (s)')"
        );
        assert_eq!(
            E::Missing(Quantity::Altitude).to_string(),
            "the header needs a column altitude or geometric_altitude (a heading such as altitude_m or 'altitude (m)')"
        );
    }

    /// Hand-worked: a path of 100 m/s at 90 deg flight-path angle is straight up.
    #[test]
    fn rows_make_samples_and_name_their_column() {
        let up = sample("time,altitude,speed,flight_path_angle,heading", "1,10,100,90,0").unwrap();
        match up {
            FileSample::Vector(v) => {
                assert_eq!((v.velocity_up_m_s, v.time_s, v.altitude_m), (100.0, 1.0, 10.0));
                assert!(v.velocity_east_m_s.abs() < 1e-12 && v.velocity_north_m_s.abs() < 1e-12);
            }
            other => panic!("{other:?}"),
        }
        let speed = sample("altitude_ft,time,velocity_kt", "1000,2,100").unwrap();
        assert_eq!(
            speed,
            FileSample::Speed(Sample {
                time_s: 2.0,
                altitude_m: 304.8,
                velocity_m_s: 100.0 * crate::units::KNOT_M_S
            })
        );
        assert_eq!(sample("time,altitude,velocity", "1,,3"), Err(SampleError::Empty { index: 1 }));
        let wrong = "time,altitude,velocity_east,velocity_north,velocity_up,axis_elevation,axis_azimuth";
        assert_eq!(sample(wrong, "0,0,1,1,1,95,0").map_err(|e| e.index()), Err(5));
        assert_eq!(sample(wrong, "0,0,1,1,1,45,400").map_err(|e| e.index()), Err(6));
        let path = "time,altitude,velocity,flight_path_angle,heading";
        assert_eq!(sample(path, "0,0,1,95,0").map_err(|e| e.index()), Err(3));
        let columns: std::vec::Vec<_> =
            layout("x,time,velocity,heading,altitude,flight_path_angle").unwrap().columns().collect();
        assert_eq!(
            columns,
            [
                (Quantity::Time, 1),
                (Quantity::Altitude, 4),
                (Quantity::Velocity, 2),
                (Quantity::FlightPathAngle, 5),
                (Quantity::Heading, 3)
            ]
        );
    }
}
