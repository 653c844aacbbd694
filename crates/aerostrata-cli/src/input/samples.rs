//! The samples of a flight, read one line at a time through the tool's table reader, in
//! the columns and units a header names (any other column is kept out with a warning),
//! or time, geometric altitude and velocity in that order in the `--units` system
//! without one. Three kinds of file: a speed relative to the air (`velocity`); a
//! ground-relative velocity by components (`velocity_east`, `velocity_north`,
//! `velocity_up`); or by its speed and direction (`velocity` or `speed`,
//! `flight_path_angle`, `heading`). The two with a direction may give the vehicle's axis
//! (`axis_elevation`, `axis_azimuth`).

use std::io::BufRead;

use aerostrata::flight::{Axis, FlightPoint, FlightScan, Sample, VectorSample};
use aerostrata::table::Header;
use aerostrata::Atmosphere;
use aerostrata::Quantity;

use crate::failure::Failure;
use crate::input::table::{needs, Columns, TableReader};
use crate::units::UnitSystem;

/// The quantities a flight file's header may name: a flight's altitude is geometric, so
/// `geometric_altitude` reads as well as `altitude`.
const ACCEPTED: [Quantity; 11] = [
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
/// The columns of a file without a header.
const IMPLICIT: [Quantity; 3] = [Quantity::Time, Quantity::Altitude, Quantity::Velocity];
use aerostrata::flight::{AXIS_ANGLES as AXIS, PATH_ANGLES as PATH, VELOCITY_COMPONENTS as COMPONENTS};

/// What a flight file gives of each sample's velocity.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Kind {
    /// A speed relative to the air, without direction.
    Speed,
    /// The ground-relative velocity's east, north and up components.
    Components,
    /// The ground-relative speed, flight-path angle and heading.
    Path,
}

impl Kind {
    /// Whether the samples give their velocity's direction.
    pub fn has_direction(self) -> bool {
        self != Kind::Speed
    }
}

/// A sample of either kind.
#[derive(Clone, Copy, Debug)]
pub enum FlightSample {
    /// A speed without direction.
    Speed(Sample),
    /// A ground-relative velocity with its direction.
    Vector(VectorSample),
}

impl FlightSample {
    /// The sample's geometric altitude, m.
    pub fn altitude_m(&self) -> f64 {
        match self {
            FlightSample::Speed(s) => s.altitude_m,
            FlightSample::Vector(s) => s.altitude_m,
        }
    }

    /// Records the sample in `scan`.
    ///
    /// # Errors
    /// As [`FlightScan::push`] and [`FlightScan::push_vector`].
    pub fn push<A: Atmosphere>(self, scan: &mut FlightScan<'_, A>) -> aerostrata::Result<FlightPoint> {
        match self {
            FlightSample::Speed(s) => scan.push(s),
            FlightSample::Vector(s) => scan.push_vector(s),
        }
    }
}

/// The kind of file `header` describes.
///
/// # Errors
/// What is missing or doubled, for the header's line.
fn kind_of(header: &Header) -> Result<Kind, String> {
    let has = |q: &Quantity| header.position(*q).is_some();
    let names = |qs: &[Quantity]| qs.iter().map(|q| q.name()).collect::<Vec<_>>().join(", ");
    needs(header, &[&[Quantity::Time], &[Quantity::Altitude, Quantity::GeometricAltitude]])?;
    let components = COMPONENTS.iter().filter(|q| has(q)).count();
    let path = PATH.iter().filter(|q| has(q)).count();
    let velocity = has(&Quantity::Velocity);
    let twice = || {
        format!(
            "the header gives the velocity twice: keep velocity alone, velocity with {}, or {}",
            names(&PATH),
            names(&COMPONENTS)
        )
    };
    let kind = if components > 0 {
        if velocity || path > 0 {
            return Err(twice());
        }
        if components < 3 {
            return Err(format!("the velocity's components need all three columns: {}", names(&COMPONENTS)));
        }
        Kind::Components
    } else if path > 0 {
        if !velocity || path < 2 {
            return Err(format!("a velocity by its direction needs velocity (or speed), {}", names(&PATH)));
        }
        Kind::Path
    } else if velocity {
        Kind::Speed
    } else {
        return Err(format!(
            "the header needs the velocity: a column velocity (speed relative to the air), or {} (ground \
             velocity), or velocity (or speed) with {}",
            names(&COMPONENTS),
            names(&PATH)
        ));
    };
    match (AXIS.iter().filter(|q| has(q)).count(), kind) {
        (0, _) => Ok(kind),
        (2, Kind::Components | Kind::Path) => Ok(kind),
        (2, Kind::Speed) => Err(format!(
            "{} need the velocity's direction ({} or {})",
            names(&AXIS),
            names(&COMPONENTS),
            names(&PATH)
        )),
        _ => Err(format!("the vehicle's axis needs both {}", names(&AXIS))),
    }
}

/// Reads samples one line at a time.
pub struct SampleReader<R> {
    table: TableReader<R>,
    kind: Option<Kind>,
}

impl<R: BufRead> SampleReader<R> {
    /// A reader of `input` (named `source` in messages), whose values are in `units`
    /// unless a header or a cell names others.
    pub fn new(input: R, source: impl Into<String>, units: UnitSystem) -> Self {
        let columns = Columns {
            accepts: &ACCEPTED,
            implicit: &IMPLICIT,
            check: Box::new(|header| kind_of(header).map(|_| ())),
        };
        SampleReader { table: TableReader::new(input, source, columns, Some(units)), kind: None }
    }

    /// The table underneath, for messages about the last line.
    pub fn table(&self) -> &TableReader<R> {
        &self.table
    }

    /// The underlying input.
    pub fn input_mut(&mut self) -> &mut R {
        self.table.input_mut()
    }

    /// The kind of file, once the first sample has been read.
    pub fn kind(&self) -> Option<Kind> {
        self.kind
    }

    /// The next sample, in SI, or `None` at the end.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the file, the line and the column at fault (an empty
    /// cell among them, an angle out of its range).
    pub fn next_sample(&mut self) -> Result<Option<FlightSample>, Failure> {
        let altitude_quantity = self.altitude_quantity();
        let Some(row) = self.table.next_row()? else { return Ok(None) };
        let values = ACCEPTED.map(|q| row.get(q));
        let kind = match self.kind {
            Some(kind) => kind,
            None => {
                let header = self.table.header().ok_or_else(|| self.table.at_line("no header"))?;
                let kind = kind_of(header).map_err(|m| self.table.at_line(m))?;
                self.kind = Some(kind);
                kind
            }
        };
        let altitude_quantity =
            if self.table.header().is_some() { self.altitude_quantity() } else { altitude_quantity };
        let get = |q: Quantity| ACCEPTED.iter().position(|k| *k == q).and_then(|i| values[i]);
        let need = |q: Quantity| {
            get(q).ok_or_else(|| self.table.at_cell(q, "an empty cell; every sample needs a value"))
        };
        let time_s = need(Quantity::Time)?;
        let altitude_m = need(altitude_quantity)?;
        let axis = match (get(Quantity::AxisElevation), get(Quantity::AxisAzimuth)) {
            (Some(elevation), Some(azimuth)) => Some(
                Axis::new(elevation, azimuth).map_err(|e| self.table.at_cell(Quantity::AxisElevation, e))?,
            ),
            _ => None,
        };
        let sample = match kind {
            Kind::Speed => {
                FlightSample::Speed(Sample { time_s, altitude_m, velocity_m_s: need(Quantity::Velocity)? })
            }
            Kind::Components => FlightSample::Vector(VectorSample {
                time_s,
                altitude_m,
                velocity_east_m_s: need(Quantity::VelocityEast)?,
                velocity_north_m_s: need(Quantity::VelocityNorth)?,
                velocity_up_m_s: need(Quantity::VelocityUp)?,
                axis,
            }),
            Kind::Path => {
                let (speed, gamma, heading) =
                    (need(Quantity::Velocity)?, need(Quantity::FlightPathAngle)?, need(Quantity::Heading)?);
                let sample = VectorSample::from_path(time_s, altitude_m, speed, gamma, heading, axis)
                    .map_err(|e| self.table.at_line(e))?;
                FlightSample::Vector(sample)
            }
        };
        Ok(Some(sample))
    }

    /// The altitude's quantity in this file (`altitude` or `geometric_altitude`).
    pub fn altitude_quantity(&self) -> Quantity {
        match self.table.header() {
            Some(h) if h.position(Quantity::GeometricAltitude).is_some() => Quantity::GeometricAltitude,
            _ => Quantity::Altitude,
        }
    }
}
