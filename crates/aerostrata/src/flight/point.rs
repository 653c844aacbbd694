//! One sample of a flight, the vehicle that gives it a drag, and what the scan computes
//! for the sample: the air there, q, Mach and Reynolds numbers and the drag.

use super::motion::{angle_deg, norm, Axis, BoundaryLayer};
use super::MAX_TIME_S;
use crate::aero::{speed, CdSegment, DragCurve, MAX_AREA_M2, MAX_LENGTH_M};
use crate::altitude::Altitude;
use crate::constants::GAS_CONSTANT_J_KMOL_K;
use crate::error::{finite, positive, within, Error, Result};
use crate::flow::MAX_MACH;
use crate::math;
use crate::model::Atmosphere;
use crate::quantity::Quantity;
use crate::wind::{WindLevel, WindProfile, WindSegment};

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
    /// The ground-relative velocity's east, north and up components, m/s (a sample that
    /// gives its velocity's direction).
    pub velocity_enu_m_s: Option<[f64; 3]>,
    /// The wind's east and north components at the sample, m/s (a scan with winds).
    pub wind_en_m_s: Option<[f64; 2]>,
    /// Speed relative to the air, m/s: the ground-relative velocity less the wind; q,
    /// Mach and Reynolds numbers and drag are computed from it. Without winds, |velocity|.
    pub airspeed_m_s: f64,
    /// Total angle of attack, deg: between the vehicle's axis and the air-relative
    /// velocity (a sample that gives its velocity's direction, moving or with an axis).
    pub alpha_deg: Option<f64>,
    /// q-alpha, Pa deg: the dynamic pressure times the total angle of attack.
    pub q_alpha_pa_deg: Option<f64>,
    /// Total temperature T (1 + (gamma - 1) M^2 / 2), K.
    pub total_temperature_k: Option<f64>,
    /// Recovery (adiabatic-wall) temperature T (1 + r (gamma - 1) M^2 / 2), K, r the
    /// recovery factor of the scan's boundary layer (a scan that asks for it).
    pub recovery_temperature_k: Option<f64>,
}

impl FlightPoint {
    /// The quantities a flight point carries, in the order of its fields: what a door
    /// shows as one column per quantity.
    pub const QUANTITIES: [Quantity; 23] = [
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
        Quantity::VelocityEast,
        Quantity::VelocityNorth,
        Quantity::VelocityUp,
        Quantity::WindEast,
        Quantity::WindNorth,
        Quantity::Airspeed,
        Quantity::AngleOfAttack,
        Quantity::QAlpha,
        Quantity::TotalTemperature,
        Quantity::RecoveryTemperature,
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
    /// Bit of [`FlightPoint::defined`]: the velocity's east, north and up components are
    /// defined (the sample gave its velocity's direction).
    pub const DEFINED_VELOCITY_COMPONENTS: u8 = 16;
    /// Bit of [`FlightPoint::defined`]: the wind's components are defined (a scan with
    /// winds).
    pub const DEFINED_WIND: u8 = 32;
    /// Bit of [`FlightPoint::defined`]: the angle of attack and q-alpha are defined.
    pub const DEFINED_ALPHA: u8 = 64;
    /// Bit of [`FlightPoint::defined`]: the recovery temperature is defined (the scan
    /// asked for it, in the continuum). The total temperature goes with the Mach number.
    pub const DEFINED_RECOVERY_TEMPERATURE: u8 = 128;

    /// The `DEFINED_*` bit that says whether a point defines `quantity`, or 0 for a
    /// quantity every point carries (time, altitude, q, airspeed, the air's properties)
    /// and for one a point never carries: what a door needs to give a column only where
    /// the scan's setting can fill it (the velocity's components only for samples with a
    /// direction, the wind only with winds, the recovery temperature only with a boundary
    /// layer). The total temperature goes with the Mach number.
    pub const fn defined_bit(quantity: Quantity) -> u8 {
        use Quantity as Q;
        match quantity {
            Q::SpeedOfSound | Q::Mach | Q::TotalTemperature => Self::DEFINED_MACH,
            Q::UnitReynoldsNumber => Self::DEFINED_REYNOLDS_PER_M,
            Q::ReynoldsNumber => Self::DEFINED_REYNOLDS_NUMBER,
            Q::DragCoefficient | Q::Drag => Self::DEFINED_DRAG,
            Q::VelocityEast | Q::VelocityNorth | Q::VelocityUp => Self::DEFINED_VELOCITY_COMPONENTS,
            Q::WindEast | Q::WindNorth => Self::DEFINED_WIND,
            Q::AngleOfAttack | Q::QAlpha => Self::DEFINED_ALPHA,
            Q::RecoveryTemperature => Self::DEFINED_RECOVERY_TEMPERATURE,
            _ => 0,
        }
    }

    /// Which of the values that can be missing are defined, as `DEFINED_*` bits: what the
    /// C and WebAssembly doors hand on beside the values, which they give as NaN where
    /// `None`.
    pub fn defined(&self) -> u8 {
        let bit = |defined: bool, bit: u8| if defined { bit } else { 0 };
        bit(self.mach.is_some() && self.speed_of_sound_m_s.is_some(), Self::DEFINED_MACH)
            | bit(self.reynolds_per_m.is_some(), Self::DEFINED_REYNOLDS_PER_M)
            | bit(self.reynolds_number.is_some(), Self::DEFINED_REYNOLDS_NUMBER)
            | bit(self.drag_coefficient.is_some() && self.drag_n.is_some(), Self::DEFINED_DRAG)
            | bit(self.velocity_enu_m_s.is_some(), Self::DEFINED_VELOCITY_COMPONENTS)
            | bit(self.wind_en_m_s.is_some(), Self::DEFINED_WIND)
            | bit(self.alpha_deg.is_some() && self.q_alpha_pa_deg.is_some(), Self::DEFINED_ALPHA)
            | bit(self.recovery_temperature_k.is_some(), Self::DEFINED_RECOVERY_TEMPERATURE)
    }

    /// The value of `quantity`, in its SI unit ([`Quantity::info`]).
    ///
    /// # Errors
    /// [`Error::Undefined`] for a continuum quantity where the model does not define a
    /// speed of sound or a viscosity (above 86 km); [`Error::NotCarried`] for the drag,
    /// drag coefficient or Reynolds number of a scan without a vehicle (or reference
    /// length), the velocity's components, the angle of attack and q-alpha of a sample
    /// without the velocity's direction, the wind of a scan without winds, the recovery
    /// temperature of a scan that did not ask for it, and for a quantity that is not one
    /// of [`FlightPoint::QUANTITIES`].
    pub fn get(&self, quantity: Quantity) -> Result<f64> {
        let not_carried = |result| Error::NotCarried { quantity: quantity.name(), result };
        let optional = |value: Option<f64>, continuum: bool| {
            value.ok_or(if continuum || self.speed_of_sound_m_s.is_none() {
                Error::Undefined { quantity: quantity.info().label, altitude_m: self.altitude_m }
            } else {
                not_carried("a flight point scanned without a vehicle")
            })
        };
        let component = |values: Option<&[f64]>, i: usize, result| {
            values.and_then(|v| v.get(i).copied()).ok_or(not_carried(result))
        };
        let direction = "a flight sample without its velocity's direction";
        let velocity = self.velocity_enu_m_s.as_ref().map(|v| &v[..]);
        let wind = self.wind_en_m_s.as_ref().map(|w| &w[..]);
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
            Q::VelocityEast => component(velocity, 0, direction),
            Q::VelocityNorth => component(velocity, 1, direction),
            Q::VelocityUp => component(velocity, 2, direction),
            Q::WindEast => component(wind, 0, "a flight point scanned without winds"),
            Q::WindNorth => component(wind, 1, "a flight point scanned without winds"),
            Q::Airspeed => Ok(self.airspeed_m_s),
            Q::AngleOfAttack => self.alpha_deg.ok_or(not_carried(direction)),
            Q::QAlpha => self.q_alpha_pa_deg.ok_or(not_carried(direction)),
            Q::TotalTemperature => optional(self.total_temperature_k, true),
            Q::RecoveryTemperature => match self.recovery_temperature_k {
                Some(t) => Ok(t),
                None if self.total_temperature_k.is_some() => Err(not_carried(
                    "a flight point scanned without a boundary layer for the recovery factor",
                )),
                None => optional(None, true),
            },
            other => Err(Error::NotCarried { quantity: other.name(), result: "a flight point" }),
        }
    }
}

pub(super) fn bad_sample(index: usize, problem: &'static str, value: f64) -> Error {
    Error::InvalidPoint { table: "flight sample", index, problem, value }
}

/// What a sample says of the vehicle's motion.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) enum Motion {
    /// A speed relative to the air (its sign ignored), no direction.
    Speed(f64),
    /// The ground-relative velocity (east, north, up), and the axis if given.
    Vector([f64; 3], Option<Axis>),
}

/// What a scan adds to each sample beyond the atmosphere: the vehicle, the winds and the
/// boundary layer of the recovery temperature.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) struct Setting<'v> {
    pub(super) vehicle: Option<Vehicle<'v>>,
    pub(super) winds: Option<WindProfile<&'v [WindLevel]>>,
    pub(super) recovery: Option<BoundaryLayer>,
}

/// The pieces of the drag curve and the wind profile the last sample fell in:
/// consecutive samples nearly always share them, so the tables are searched only when a
/// sample leaves them.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub(super) struct Cursor {
    cd: Option<CdSegment>,
    wind: Option<WindSegment>,
}

impl Cursor {
    /// Whether the wind at `altitude_m` of the last sample was held beyond the profile.
    pub(super) fn wind_held(&self, altitude_m: f64) -> bool {
        self.wind.is_some_and(|segment| segment.wind(altitude_m).held)
    }
}

/// The ratio of specific heats of the continuum air the models give (the 1976
/// standard's, and every model's speed of sound).
const GAMMA: f64 = 1.4;

/// The values at a sample (the `index`-th) of time `time_s`, geometric altitude
/// `altitude_m` and motion `motion`, reading the tables through `cursor`.
#[inline(always)]
pub(super) fn compute<A: Atmosphere>(
    atmosphere: &A,
    setting: &Setting<'_>,
    index: usize,
    (time_s, altitude_m, motion): (f64, f64, Motion),
    cursor: &mut Cursor,
) -> Result<FlightPoint> {
    if !(time_s.is_finite() && (-MAX_TIME_S..=MAX_TIME_S).contains(&time_s)) {
        return Err(bad_sample(index, "time (s) must be finite and within -1e12 to 1e12 s", time_s));
    }
    let (velocity_m_s, velocity_enu_m_s, wind_en_m_s, air_velocity, axis) = match motion {
        Motion::Speed(v) => {
            if setting.winds.is_some() {
                return Err(bad_sample(
                    index,
                    "winds need the velocity's direction (east, north and up components, or speed, \
                     flight-path angle and heading), not a speed alone; speed",
                    v,
                ));
            }
            (v, None, None, None, None)
        }
        Motion::Vector(v, axis) => {
            for (name, c) in ["velocity east", "velocity north", "velocity up"].into_iter().zip(v) {
                speed(name, c)?;
            }
            let wind = match &setting.winds {
                Some(winds) => {
                    let segment = match cursor.wind {
                        Some(segment) if segment.holds(altitude_m) => segment,
                        _ => *cursor.wind.insert(winds.segment(finite("geometric altitude", altitude_m)?)),
                    };
                    Some(segment.wind(altitude_m))
                }
                None => None,
            };
            let (east, north) = wind.map_or((0.0, 0.0), |w| (w.east_m_s, w.north_m_s));
            let ground_speed = norm(v);
            // The axis: as given, else along the ground-relative velocity (none at rest).
            let axis = axis.map(|a| a.unit()).or((ground_speed > 0.0).then(|| v.map(|c| c / ground_speed)));
            let air = [v[0] - east, v[1] - north, v[2]];
            (ground_speed, Some(v), wind.map(|w| [w.east_m_s, w.north_m_s]), Some(air), axis)
        }
    };
    let v = match air_velocity {
        Some(air) => speed("airspeed", norm(air))?,
        None => speed("velocity", velocity_m_s)?,
    };
    let air = atmosphere.air(Altitude::geometric_m(altitude_m)?)?;
    let rho = air.density_kg_m3();
    let speed_of_sound_m_s = air.speed_of_sound_m_s();
    let mach = speed_of_sound_m_s.map(|a| v / a);
    let dynamic_pressure_pa = 0.5 * rho * v * v;
    let mu = air.dynamic_viscosity_pa_s();
    let reynolds_per_m = mu.map(|mu| rho * v / mu);
    let (mut reynolds_number, mut drag_coefficient, mut drag_n) = (None, None, None);
    if let Some(vehicle) = &setting.vehicle {
        reynolds_number = reynolds_per_m.zip(vehicle.reference_length_m).map(|(re, l)| re * l);
        drag_coefficient = if vehicle.drag.is_constant() {
            Some(vehicle.drag.min_cd())
        } else {
            mach.map(|m| {
                let m = m.min(MAX_MACH);
                match &mut cursor.cd {
                    Some(segment) if segment.holds(m) => segment.cd(m),
                    slot => slot.insert(vehicle.drag.segment(m)).cd(m),
                }
            })
        };
        drag_n = drag_coefficient.map(|cd| dynamic_pressure_pa * cd * vehicle.reference_area_m2);
    }
    // The angle between the axis and the air-relative velocity; none in still air.
    let alpha_deg = match (axis, air_velocity) {
        (Some(axis), Some(air)) if v > 0.0 => Some(angle_deg(axis, air)),
        _ => None,
    };
    let t = air.temperature_k();
    let heating = mach.map(|m| 0.5 * (GAMMA - 1.0) * m * m);
    // The conductivity (a power and an exponential) only when a recovery factor is asked.
    let conductivity = || setting.recovery.and_then(|_| air.thermal_conductivity_w_m_k());
    let recovery_temperature_k = match (setting.recovery, heating, mu, conductivity()) {
        (Some(layer), Some(heating), Some(mu), Some(k)) => {
            // Pr = mu cp / k with cp = gamma R / ((gamma - 1) M) of the air at the sample.
            let cp = GAMMA / (GAMMA - 1.0) * GAS_CONSTANT_J_KMOL_K / air.molar_mass_kg_kmol();
            let prandtl = mu * cp / k;
            let r = match layer {
                BoundaryLayer::Laminar => math::sqrt(prandtl),
                BoundaryLayer::Turbulent => math::cbrt(prandtl),
            };
            Some(t * (1.0 + r * heating))
        }
        _ => None,
    };
    Ok(FlightPoint {
        time_s,
        altitude_m,
        velocity_m_s,
        density_kg_m3: rho,
        pressure_pa: air.pressure_pa(),
        temperature_k: t,
        speed_of_sound_m_s,
        mach,
        dynamic_pressure_pa,
        reynolds_per_m,
        reynolds_number,
        drag_coefficient,
        drag_n,
        velocity_enu_m_s,
        wind_en_m_s,
        airspeed_m_s: v,
        alpha_deg,
        q_alpha_pa_deg: alpha_deg.map(|a| dynamic_pressure_pa * a),
        total_temperature_k: heating.map(|h| t * (1.0 + h)),
        recovery_temperature_k,
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

    /// `defined_bit` agrees with `defined` and `get`: a quantity of a point is given
    /// exactly when its bit is set (or it has none), in every setting and at rest.
    #[test]
    fn each_quantity_has_the_bit_that_defines_it() {
        use crate::flight::{BoundaryLayer, VectorSample};
        use crate::wind::{WindLevel, WindProfile};
        let winds = WindProfile::new([WindLevel::new(0.0, 5.0, -3.0).unwrap()]).unwrap();
        let vehicle = Vehicle::new(DragCurve::constant(0.5).unwrap(), 0.02).unwrap();
        let with_length = vehicle.with_reference_length(1.5).unwrap();
        let vector = |up, z| VectorSample::from_path(0.0, z, up, 80.0, 45.0, None).unwrap();
        let check = |point: FlightPoint| {
            for q in FlightPoint::QUANTITIES {
                let bit = FlightPoint::defined_bit(q);
                let given = bit == 0 || point.defined() & bit != 0;
                assert_eq!(point.get(q).is_ok(), given, "{q:?} at {point:?}");
            }
        };
        let altitudes: &[f64] = if cfg!(feature = "upper") { &[1_000.0, 120_000.0] } else { &[1_000.0] };
        for &z in altitudes {
            for v in [0.0, 250.0] {
                let full = FlightScan::new(US1976, Some(with_length))
                    .with_winds(&winds)
                    .with_recovery(BoundaryLayer::Laminar);
                check(full.evaluate_vector(vector(v, z)).unwrap());
                check(FlightScan::new(US1976, Some(vehicle)).evaluate_vector(vector(v, z)).unwrap());
                let scalar = Sample { time_s: 0.0, altitude_m: z, velocity_m_s: v };
                check(FlightScan::new(US1976, None).evaluate(scalar).unwrap());
            }
        }
    }
}
