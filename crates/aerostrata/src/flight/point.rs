//! One sample of a flight, the vehicle that gives it a drag, and what the scan computes
//! for the sample: the air there, q, Mach and Reynolds numbers and the drag.

use super::MAX_TIME_S;
use crate::aero::{speed, CdSegment, DragCurve, MAX_AREA_M2, MAX_LENGTH_M};
use crate::altitude::Altitude;
use crate::error::{positive, within, Error, Result};
use crate::flow::MAX_MACH;
use crate::model::Atmosphere;
use crate::quantity::Quantity;

/// One sample of a flight.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Sample {
    /// Time, s (any origin; strictly increasing along a flight).
    pub time_s: f64,
    /// Geometric altitude above mean sea level, m.
    pub altitude_m: f64,
    /// Velocity relative to the air, m/s. Its sign is ignored (a log of vertical velocity
    /// that turns negative on descent can be used as it is): the speed is |V|.
    pub velocity_m_s: f64,
}

/// What the scan needs of a vehicle to give drag and Reynolds number.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Vehicle<'a> {
    drag: DragCurve<'a>,
    reference_area_m2: f64,
    reference_length_m: Option<f64>,
}

impl<'a> Vehicle<'a> {
    /// A vehicle with drag curve `drag` referred to the area `reference_area_m2`.
    ///
    /// # Errors
    /// [`Error::NotFinite`], [`Error::NotPositive`] or [`Error::OutOfRange`] for an area
    /// that is not finite and within (0, [`MAX_AREA_M2`]].
    pub fn new(drag: DragCurve<'a>, reference_area_m2: f64) -> Result<Self> {
        let area = positive("reference area", "m^2", reference_area_m2)?;
        let area = within("reference area", "m^2", area, 0.0, MAX_AREA_M2)?;
        Ok(Self { drag, reference_area_m2: area, reference_length_m: None })
    }

    /// The same vehicle with a reference length (for the Reynolds number), m.
    ///
    /// # Errors
    /// [`Error::NotFinite`], [`Error::NotPositive`] or [`Error::OutOfRange`] for a
    /// length that is not finite and within (0, [`MAX_LENGTH_M`]].
    pub fn with_reference_length(self, reference_length_m: f64) -> Result<Self> {
        let length = positive("reference length", "m", reference_length_m)?;
        let length = within("reference length", "m", length, 0.0, MAX_LENGTH_M)?;
        Ok(Self { reference_length_m: Some(length), ..self })
    }

    /// The drag curve.
    pub fn drag(&self) -> &DragCurve<'a> {
        &self.drag
    }

    /// The reference area, m^2.
    pub fn reference_area_m2(&self) -> f64 {
        self.reference_area_m2
    }

    /// The reference length, m, if one was given.
    pub fn reference_length_m(&self) -> Option<f64> {
        self.reference_length_m
    }
}

/// What the scan gives for one sample. Continuum quantities are `None` where the model
/// does not define a speed of sound or a viscosity (the rarefied upper atmosphere); drag
/// needs a vehicle, and a Mach number unless the vehicle's Cd is constant.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct FlightPoint {
    /// Time, s.
    pub time_s: f64,
    /// Geometric altitude, m.
    pub altitude_m: f64,
    /// Velocity as given, m/s.
    pub velocity_m_s: f64,
    /// Density, kg/m^3.
    pub density_kg_m3: f64,
    /// Static pressure, Pa.
    pub pressure_pa: f64,
    /// Kinetic temperature, K.
    pub temperature_k: f64,
    /// Speed of sound, m/s.
    pub speed_of_sound_m_s: Option<f64>,
    /// Mach number |V| / a.
    pub mach: Option<f64>,
    /// Dynamic pressure rho V^2 / 2, Pa.
    pub dynamic_pressure_pa: f64,
    /// Unit Reynolds number rho |V| / mu, 1/m.
    pub reynolds_per_m: Option<f64>,
    /// Reynolds number for the vehicle's reference length.
    pub reynolds_number: Option<f64>,
    /// The vehicle's drag coefficient at this Mach number.
    pub drag_coefficient: Option<f64>,
    /// Drag q Cd A, N.
    pub drag_n: Option<f64>,
}

impl FlightPoint {
    /// The quantities a flight point carries, in the order of its fields: what a door
    /// shows as one column per quantity.
    pub const QUANTITIES: [Quantity; 13] = [
        Quantity::Time,
        Quantity::Altitude,
        Quantity::Velocity,
        Quantity::Density,
        Quantity::Pressure,
        Quantity::Temperature,
        Quantity::SpeedOfSound,
        Quantity::Mach,
        Quantity::DynamicPressure,
        Quantity::UnitReynoldsNumber,
        Quantity::ReynoldsNumber,
        Quantity::DragCoefficient,
        Quantity::Drag,
    ];

    /// Bit of [`FlightPoint::defined`]: the speed of sound and the Mach number are defined.
    pub const DEFINED_MACH: u8 = 1;
    /// Bit of [`FlightPoint::defined`]: the unit Reynolds number is defined.
    pub const DEFINED_REYNOLDS_PER_M: u8 = 2;
    /// Bit of [`FlightPoint::defined`]: the Reynolds number is defined (a reference length
    /// was given).
    pub const DEFINED_REYNOLDS_NUMBER: u8 = 4;
    /// Bit of [`FlightPoint::defined`]: the drag coefficient and the drag are defined (a
    /// vehicle was given).
    pub const DEFINED_DRAG: u8 = 8;

    /// Which of the values that can be missing are defined, as `DEFINED_*` bits: what the
    /// C and WebAssembly doors hand on beside the values, which they give as NaN where
    /// `None`.
    pub fn defined(&self) -> u8 {
        let bit = |defined: bool, bit: u8| if defined { bit } else { 0 };
        bit(self.mach.is_some() && self.speed_of_sound_m_s.is_some(), Self::DEFINED_MACH)
            | bit(self.reynolds_per_m.is_some(), Self::DEFINED_REYNOLDS_PER_M)
            | bit(self.reynolds_number.is_some(), Self::DEFINED_REYNOLDS_NUMBER)
            | bit(self.drag_coefficient.is_some() && self.drag_n.is_some(), Self::DEFINED_DRAG)
    }

    /// The value of `quantity`, in its SI unit ([`Quantity::info`]).
    ///
    /// # Errors
    /// [`Error::Undefined`] for a continuum quantity where the model does not define a
    /// speed of sound or a viscosity (above 86 km); [`Error::NotCarried`] for the drag,
    /// drag coefficient or Reynolds number of a scan without a vehicle (or reference
    /// length), and for a quantity that is not one of [`FlightPoint::QUANTITIES`].
    pub fn get(&self, quantity: Quantity) -> Result<f64> {
        let optional = |value: Option<f64>, continuum: bool| {
            value.ok_or(if continuum || self.speed_of_sound_m_s.is_none() {
                Error::Undefined { quantity: quantity.info().label, altitude_m: self.altitude_m }
            } else {
                Error::NotCarried {
                    quantity: quantity.name(),
                    result: "a flight point scanned without a vehicle",
                }
            })
        };
        use Quantity as Q;
        match quantity {
            Q::Time => Ok(self.time_s),
            Q::Altitude => Ok(self.altitude_m),
            Q::Velocity => Ok(self.velocity_m_s),
            Q::Density => Ok(self.density_kg_m3),
            Q::Pressure => Ok(self.pressure_pa),
            Q::Temperature => Ok(self.temperature_k),
            Q::SpeedOfSound => optional(self.speed_of_sound_m_s, true),
            Q::Mach => optional(self.mach, true),
            Q::DynamicPressure => Ok(self.dynamic_pressure_pa),
            Q::UnitReynoldsNumber => optional(self.reynolds_per_m, true),
            Q::ReynoldsNumber => optional(self.reynolds_number, false),
            Q::DragCoefficient => optional(self.drag_coefficient, false),
            Q::Drag => optional(self.drag_n, false),
            other => Err(Error::NotCarried { quantity: other.name(), result: "a flight point" }),
        }
    }
}

pub(super) fn bad_sample(index: usize, problem: &'static str, value: f64) -> Error {
    Error::InvalidPoint { table: "flight sample", index, problem, value }
}

/// The values at `sample` (the `index`-th), reading the vehicle's drag curve through
/// `cd_segment`, which is refreshed when the Mach number has left it.
#[inline]
pub(super) fn compute<A: Atmosphere>(
    atmosphere: &A,
    vehicle: Option<&Vehicle<'_>>,
    index: usize,
    sample: Sample,
    cd_segment: &mut Option<CdSegment>,
) -> Result<FlightPoint> {
    let time_s = sample.time_s;
    if !(time_s.is_finite() && (-MAX_TIME_S..=MAX_TIME_S).contains(&time_s)) {
        return Err(bad_sample(index, "time (s) must be finite and within -1e12 to 1e12 s", time_s));
    }
    let v = speed("velocity", sample.velocity_m_s)?;
    let air = atmosphere.air(Altitude::geometric_m(sample.altitude_m)?)?;
    let rho = air.density_kg_m3();
    let speed_of_sound_m_s = air.speed_of_sound_m_s();
    let mach = speed_of_sound_m_s.map(|a| v / a);
    let dynamic_pressure_pa = 0.5 * rho * v * v;
    let reynolds_per_m = air.dynamic_viscosity_pa_s().map(|mu| rho * v / mu);
    let (mut reynolds_number, mut drag_coefficient, mut drag_n) = (None, None, None);
    if let Some(vehicle) = vehicle {
        reynolds_number = reynolds_per_m.zip(vehicle.reference_length_m).map(|(re, l)| re * l);
        drag_coefficient = if vehicle.drag.is_constant() {
            Some(vehicle.drag.min_cd())
        } else {
            mach.map(|m| {
                let m = m.min(MAX_MACH);
                match cd_segment {
                    Some(segment) if segment.holds(m) => segment.cd(m),
                    _ => cd_segment.insert(vehicle.drag.segment(m)).cd(m),
                }
            })
        };
        drag_n = drag_coefficient.map(|cd| dynamic_pressure_pa * cd * vehicle.reference_area_m2);
    }
    Ok(FlightPoint {
        time_s,
        altitude_m: sample.altitude_m,
        velocity_m_s: sample.velocity_m_s,
        density_kg_m3: rho,
        pressure_pa: air.pressure_pa(),
        temperature_k: air.temperature_k(),
        speed_of_sound_m_s,
        mach,
        dynamic_pressure_pa,
        reynolds_per_m,
        reynolds_number,
        drag_coefficient,
        drag_n,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::flight::FlightScan;
    use crate::model::US1976;

    /// Each bit stands for its values: every one in the continuum with a vehicle and a
    /// reference length, the drag and Reynolds number not without them, and with a
    /// Mach-independent Cd only the drag above 86 km.
    #[test]
    fn defined_bits_follow_the_values() {
        let sample = |altitude_m| Sample { time_s: 0.0, altitude_m, velocity_m_s: 300.0 };
        let vehicle = Vehicle::new(DragCurve::constant(0.5).unwrap(), 0.02).unwrap();
        let with_length = vehicle.with_reference_length(1.5).unwrap();
        let all = FlightPoint::DEFINED_MACH
            | FlightPoint::DEFINED_REYNOLDS_PER_M
            | FlightPoint::DEFINED_REYNOLDS_NUMBER
            | FlightPoint::DEFINED_DRAG;
        let point =
            |vehicle, altitude_m| FlightScan::new(US1976, vehicle).evaluate(sample(altitude_m)).unwrap();
        assert_eq!(point(Some(with_length), 1_000.0).defined(), all);
        assert_eq!(point(Some(vehicle), 1_000.0).defined(), all & !FlightPoint::DEFINED_REYNOLDS_NUMBER);
        assert_eq!(
            point(None, 1_000.0).defined(),
            FlightPoint::DEFINED_MACH | FlightPoint::DEFINED_REYNOLDS_PER_M
        );
        #[cfg(feature = "upper")]
        assert_eq!(point(Some(with_length), 120_000.0).defined(), FlightPoint::DEFINED_DRAG);
    }
}
