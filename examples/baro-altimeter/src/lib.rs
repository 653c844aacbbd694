//! A barometric altimeter on an invented log: a small rocket flown (as the "truth") from
//! an invented desert pad on a hot day, its barometer sampled at 50 Hz with noise and
//! 1 Pa resolution; then what a flight computer does with the log: zero on the pad's
//! pressure, height above the pad through the core's inverse-altitude function, an
//! alpha-beta filter for the vertical speed, and apogee detection.
//!
//! The flight, the noise, the filter and the detection rule are this example's own
//! (invented, common shapes); the air (pressure, density on the hot day), gravity, drag
//! and the barometric altitude come from the `aerostrata` core.
//!
//! Not certified flight software: a flight computer's recovery logic must be verified
//! independently and flown under the range's safety code.

use aerostrata::aero::{drag_n, dynamic_pressure_pa};
use aerostrata::inverse::{barometric_altitude_m, BarometricReference};
use aerostrata::{Altitude, Atmosphere, GeometricAltitude, TemperatureOffset, US1976};

/// Where and on what day the invented flight happens.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Site {
    /// Pad elevation above mean sea level, m.
    pub pad_altitude_m: f64,
    /// The day's temperature offset from the standard, K (a hot day is positive).
    pub offset_k: f64,
}

/// The invented desert pad: 1450 m above sea level, ISA + 8 K. The core's temperature
/// offset keeps the standard's pressure at every altitude (it changes the density), so
/// the altimeter's standard pressure scale reads this day's heights without the usual
/// hot-day error; what remains is the geopotential metre against the geometric one.
pub const HOT_DESERT_PAD: Site = Site { pad_altitude_m: 1_450.0, offset_k: 8.0 };

/// The invented rocket (all numbers made up): lift-off mass, kg.
pub const LIFTOFF_MASS_KG: f64 = 10.0;
/// Propellant burnt, kg.
pub const PROPELLANT_KG: f64 = 1.5;
/// Constant thrust, N.
pub const THRUST_N: f64 = 1_200.0;
/// Burn time, s.
pub const BURN_S: f64 = 2.5;
/// Body drag coefficient (constant) and reference area (an 80 mm body), m^2.
pub const BODY_CD: f64 = 0.5;
/// See [`BODY_CD`].
pub const BODY_AREA_M2: f64 = 0.005_026_5;
/// Drogue drag area Cd A after deployment, m^2 (deployed 1 s after the true apogee by a
/// timer; the detection under test does not use it).
pub const DROGUE_CDA_M2: f64 = 0.25;

/// Barometer sample interval, s (50 Hz).
pub const SAMPLE_S: f64 = 0.02;
/// Seconds of log on the pad before ignition.
pub const PAD_S: f64 = 3.0;
/// Seconds of log after the true apogee.
pub const AFTER_APOGEE_S: f64 = 12.0;
/// The barometer's noise, Pa (standard deviation) and resolution, Pa.
pub const NOISE_PA: f64 = 3.0;
/// See [`NOISE_PA`].
pub const RESOLUTION_PA: f64 = 1.0;

/// Integration step of the true flight, s (RK4).
const TRUTH_STEP_S: f64 = 0.001;

/// One point of the true flight.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct TruePoint {
    /// Time since ignition, s.
    pub time_s: f64,
    /// Geometric altitude, m.
    pub altitude_m: f64,
    /// Vertical velocity, m/s.
    pub velocity_m_s: f64,
}

/// The true flight at the barometer's sample times, and its apogee.
#[derive(Clone, Debug)]
pub struct TrueFlight {
    /// Samples every [`SAMPLE_S`] from -[`PAD_S`].
    pub points: Vec<TruePoint>,
    /// Time of the apogee, s.
    pub apogee_time_s: f64,
    /// Altitude of the apogee, m.
    pub apogee_altitude_m: f64,
}

fn day(site: Site) -> TemperatureOffset<aerostrata::Us1976> {
    TemperatureOffset::new(US1976, site.offset_k).expect("an invented mild offset")
}

/// (dz/dt, dv/dt) of the rocket at time `t` (s), altitude `z`, velocity `v`.
fn derivative(site: Site, t: f64, z: f64, v: f64, drogue: bool) -> (f64, f64) {
    let air = day(site);
    let rho = air.density_kg_m3(Altitude::geometric_m(z).expect("finite")).expect("in range");
    let g = GeometricAltitude::new(z).expect("finite").gravity_m_s2();
    let burning = (0.0..BURN_S).contains(&t);
    let mass = LIFTOFF_MASS_KG - PROPELLANT_KG * (t / BURN_S).clamp(0.0, 1.0);
    let thrust = if burning { THRUST_N } else { 0.0 };
    let q = dynamic_pressure_pa(rho, v).expect("finite");
    let (cd, area) = if drogue { (1.0, DROGUE_CDA_M2) } else { (BODY_CD, BODY_AREA_M2) };
    let drag = drag_n(q, cd, area).expect("finite") * v.signum();
    let mut a = (thrust - drag) / mass - g;
    if z <= site.pad_altitude_m && v <= 0.0 && a < 0.0 && t < BURN_S {
        a = 0.0; // on the pad
    }
    (v, a)
}

/// Flies the invented rocket (RK4 at 1 ms) and keeps the points at the sample times.
pub fn true_flight(site: Site) -> TrueFlight {
    let (mut z, mut v, mut t) = (site.pad_altitude_m, 0.0f64, 0.0f64);
    let per_sample = (SAMPLE_S / TRUTH_STEP_S).round() as usize;
    let pad_samples = (PAD_S / SAMPLE_S).round() as usize;
    let mut points: Vec<TruePoint> = (0..pad_samples)
        .map(|i| TruePoint { time_s: -PAD_S + i as f64 * SAMPLE_S, altitude_m: z, velocity_m_s: 0.0 })
        .collect();
    let mut apogee: Option<(f64, f64)> = None;
    let mut step = 0usize;
    loop {
        if step % per_sample == 0 {
            points.push(TruePoint { time_s: t, altitude_m: z, velocity_m_s: v });
        }
        if apogee.is_some_and(|(ta, _)| t >= ta + AFTER_APOGEE_S) {
            break;
        }
        let drogue = apogee.is_some_and(|(ta, _)| t >= ta + 1.0);
        let h = TRUTH_STEP_S;
        let k1 = derivative(site, t, z, v, drogue);
        let k2 = derivative(site, t + h / 2.0, z + h / 2.0 * k1.0, v + h / 2.0 * k1.1, drogue);
        let k3 = derivative(site, t + h / 2.0, z + h / 2.0 * k2.0, v + h / 2.0 * k2.1, drogue);
        let k4 = derivative(site, t + h, z + h * k3.0, v + h * k3.1, drogue);
        let z1 = z + h / 6.0 * (k1.0 + 2.0 * k2.0 + 2.0 * k3.0 + k4.0);
        let v1 = v + h / 6.0 * (k1.1 + 2.0 * k2.1 + 2.0 * k3.1 + k4.1);
        if apogee.is_none() && t > BURN_S && v > 0.0 && v1 <= 0.0 {
            // Linear in v for the time; at 1 ms the altitude's error is micrometres.
            let f = v / (v - v1);
            apogee = Some((t + f * h, z + f * h * v / 2.0));
        }
        step += 1;
        t = step as f64 * h;
        z = z1;
        v = v1;
    }
    let (apogee_time_s, apogee_altitude_m) = apogee.expect("the flight has an apogee");
    TrueFlight { points, apogee_time_s, apogee_altitude_m }
}

/// A small, fixed, reproducible noise source: xorshift64* (Vigna 2016) for uniforms, and
/// the sum of twelve of them less six (Irwin-Hall) for a unit normal deviate.
pub struct Noise(u64);

impl Noise {
    /// A source seeded with `seed` (not 0).
    pub fn new(seed: u64) -> Self {
        Noise(seed.max(1))
    }

    fn uniform(&mut self) -> f64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        (self.0.wrapping_mul(0x2545_F491_4F6C_DD1D) >> 11) as f64 / (1u64 << 53) as f64
    }

    /// Approximately normal, mean 0, standard deviation 1 (bounded to +-6).
    pub fn normal(&mut self) -> f64 {
        (0..12).map(|_| self.uniform()).sum::<f64>() - 6.0
    }
}

/// One barometer reading.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Reading {
    /// Time since ignition, s.
    pub time_s: f64,
    /// Static pressure, Pa (noisy, rounded to the resolution).
    pub pressure_pa: f64,
}

/// The barometer log of a flight: the day's true pressure (core) plus noise, rounded.
pub fn barometer_log(site: Site, truth: &TrueFlight, noise: &mut Noise) -> Vec<Reading> {
    let air = day(site);
    truth
        .points
        .iter()
        .map(|p| {
            let pressure =
                air.pressure_pa(Altitude::geometric_m(p.altitude_m).expect("finite")).expect("in range");
            let noisy = pressure + NOISE_PA * noise.normal();
            Reading { time_s: p.time_s, pressure_pa: (noisy / RESOLUTION_PA).round() * RESOLUTION_PA }
        })
        .collect()
}

/// The altimeter's tuning: the gains of an alpha-beta filter on height (common
/// practice, no source) and the height at which it arms.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Tuning {
    /// Share of each height residual taken into the height.
    pub alpha: f64,
    /// Share of each residual (per sample interval) taken into the vertical speed.
    pub beta: f64,
    /// Height above the pad at which the altimeter arms (launch detected), m.
    pub arm_height_m: f64,
}

/// The tuning used: gains smooth enough for a few tenths of a metre of noise at 50 Hz,
/// quick enough that the vertical speed lags the truth by a few tenths of a second; armed
/// 30 m above the pad.
pub const TUNING: Tuning = Tuning { alpha: 0.12, beta: 0.008, arm_height_m: 30.0 };

/// One processed sample.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Processed {
    /// Time, s.
    pub time_s: f64,
    /// The reading, Pa.
    pub pressure_pa: f64,
    /// Height above the pad from this reading alone (core), m.
    pub height_m: f64,
    /// Filtered height, m.
    pub filtered_height_m: f64,
    /// Filtered vertical speed, m/s.
    pub vertical_speed_m_s: f64,
}

/// What the altimeter found.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Detection {
    /// The pad pressure it zeroed on (mean of the readings before ignition), Pa.
    pub pad_pressure_pa: f64,
    /// When it armed (filtered height above [`Tuning::arm_height_m`]), s.
    pub launch_time_s: f64,
    /// When it called apogee (first filtered vertical speed at or below 0 after arming), s.
    pub apogee_time_s: f64,
    /// The highest filtered height up to then, m above the pad.
    pub apogee_height_m: f64,
}

/// Runs the altimeter over a log.
///
/// # Errors
/// The core's message for a reading outside the standard's pressures, with its time.
pub fn process(log: &[Reading], tuning: Tuning) -> Result<(Vec<Processed>, Option<Detection>), String> {
    let pad: Vec<f64> = log.iter().filter(|r| r.time_s < 0.0).map(|r| r.pressure_pa).collect();
    if pad.is_empty() {
        return Err("the log has no readings before ignition to zero on".to_owned());
    }
    let pad_pressure_pa = pad.iter().sum::<f64>() / pad.len() as f64;
    let reference = BarometricReference::Pad { pressure_pa: pad_pressure_pa };
    let mut rows = Vec::with_capacity(log.len());
    let (mut h, mut v) = (0.0f64, 0.0f64);
    let mut launch = None;
    let mut apogee = None;
    let mut highest = f64::NEG_INFINITY;
    let mut last_time = None;
    for reading in log {
        let z = barometric_altitude_m(reading.pressure_pa, reference)
            .map_err(|e| format!("t = {} s: {e}", reading.time_s))?;
        let dt = last_time.map_or(SAMPLE_S, |t0| reading.time_s - t0);
        last_time = Some(reading.time_s);
        let predicted = h + v * dt;
        let residual = z - predicted;
        h = predicted + tuning.alpha * residual;
        v += tuning.beta / dt * residual;
        highest = highest.max(h);
        if launch.is_none() && h > tuning.arm_height_m {
            launch = Some(reading.time_s);
        }
        if launch.is_some() && apogee.is_none() && v <= 0.0 {
            apogee = Some((reading.time_s, highest));
        }
        rows.push(Processed {
            time_s: reading.time_s,
            pressure_pa: reading.pressure_pa,
            height_m: z,
            filtered_height_m: h,
            vertical_speed_m_s: v,
        });
    }
    let detection = launch.zip(apogee).map(|(launch_time_s, (apogee_time_s, apogee_height_m))| Detection {
        pad_pressure_pa,
        launch_time_s,
        apogee_time_s,
        apogee_height_m,
    });
    Ok((rows, detection))
}
