//! A point-mass vertical ascent of an invented single-stage sounding rocket, the
//! Skelvik SK-1 demonstrator (every number below is made up for this example), through
//! the U.S. Standard Atmosphere 1976 with gravity falling off with altitude, integrated with the
//! classical fourth-order Runge-Kutta method at a fixed step.
//!
//! The vehicle's own physics (thrust curve, mass flow, the equations of motion, the
//! throttle law) lives here; every number about the air and the aerodynamics (density,
//! speed of sound, gravity, Cd at a Mach number, dynamic pressure, drag, the refined
//! maximum q) comes from the `aerostrata` core.
//!
//! Not certified flight software, and not a design tool: a demonstration of the library.

use aerostrata::aero::{drag_n, dynamic_pressure_pa, mach_number, DragCurve, Interpolation};
use aerostrata::flight::{FlightScan, FlightSummary, Sample, Vehicle};
use aerostrata::{Altitude, Atmosphere, GeometricAltitude, US1976};

/// Full-throttle thrust against burn time (s, N): a quick rise, a slowly regressive burn
/// and a tail-off to zero at 20 s. Invented.
pub const THRUST_CURVE: [(f64, f64); 9] = [
    (0.0, 0.0),
    (0.15, 9_000.0),
    (0.5, 8_600.0),
    (4.0, 8_200.0),
    (10.0, 7_600.0),
    (16.0, 7_000.0),
    (19.0, 6_600.0),
    (19.6, 3_000.0),
    (20.0, 0.0),
];

/// Effective exhaust velocity, m/s: propellant mass flow = thrust / this (a specific
/// impulse of about 214 s). Invented.
pub const EXHAUST_VELOCITY_M_S: f64 = 2_100.0;

/// Dry mass (structure, motor case, payload), kg. Invented.
pub const DRY_MASS_KG: f64 = 55.0;

/// Reference area: a 0.20 m body diameter, m^2.
pub const REFERENCE_AREA_M2: f64 = core::f64::consts::PI * 0.10 * 0.10;

/// Mach numbers of the drag table.
pub const CD_MACH: [f64; 8] = [0.0, 0.8, 0.95, 1.1, 1.3, 2.0, 3.0, 5.0];
/// Drag coefficients of the drag table (a transonic rise, then a slow fall). Invented.
pub const CD_VALUES: [f64; 8] = [0.42, 0.40, 0.48, 0.62, 0.58, 0.46, 0.38, 0.32];

/// Launch site elevation, m above mean sea level (an invented desert range).
pub const PAD_ALTITUDE_M: f64 = 1_200.0;

/// The lowest throttle setting the engine holds (of full thrust). Invented.
pub const MIN_THROTTLE: f64 = 0.4;

/// The dynamic-pressure limit the throttled flight must stay under, Pa. Invented: chosen
/// well below the full-thrust flight's maximum so that the throttle has work to do.
pub const Q_LIMIT_PA: f64 = 120_000.0;

/// The throttle law aims at this share of the limit: the control margin.
pub const Q_SET_FRACTION: f64 = 0.95;

/// How fast the throttle law closes on its set point, s.
pub const Q_TIME_CONSTANT_S: f64 = 0.5;

/// The integration step, s.
pub const STEP_S: f64 = 0.01;

/// The burn time at full throttle, s.
pub fn burn_time_s() -> f64 {
    THRUST_CURVE[THRUST_CURVE.len() - 1].0
}

/// Full-throttle thrust at burn time `t`, N (linear between the curve's points, 0 outside).
pub fn full_thrust_n(t: f64) -> f64 {
    if t <= 0.0 || t >= burn_time_s() {
        return 0.0;
    }
    let i = THRUST_CURVE.iter().position(|p| p.0 > t).unwrap_or(THRUST_CURVE.len() - 1);
    let (t0, f0) = THRUST_CURVE[i - 1];
    let (t1, f1) = THRUST_CURVE[i];
    f0 + (f1 - f0) * (t - t0) / (t1 - t0)
}

/// The propellant the curve burns, kg: total impulse / exhaust velocity (the trapezoid
/// rule is exact for a piecewise-linear curve).
pub fn propellant_mass_kg() -> f64 {
    let impulse: f64 = THRUST_CURVE.windows(2).map(|w| 0.5 * (w[0].1 + w[1].1) * (w[1].0 - w[0].0)).sum();
    impulse / EXHAUST_VELOCITY_M_S
}

/// The drag curve from the core.
pub fn drag_curve() -> DragCurve<'static> {
    DragCurve::table(&CD_MACH, &CD_VALUES, Interpolation::MonotoneCubic).expect("the invented table is valid")
}

/// How the engine is commanded.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Throttle {
    /// Full thrust throughout.
    Full,
    /// Hold dynamic pressure under the limit (Pa).
    HoldQ {
        /// The limit, Pa.
        limit_pa: f64,
    },
}

/// The state integrated: altitude (m), vertical velocity (m/s), mass (kg) and the burn
/// time consumed at full-throttle equivalent (s; it advances at the throttle setting).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct State {
    /// Geometric altitude, m.
    pub altitude_m: f64,
    /// Vertical velocity, m/s.
    pub velocity_m_s: f64,
    /// Mass, kg.
    pub mass_kg: f64,
    /// Burn time consumed, s.
    pub burn_s: f64,
}

/// Forces and conditions at a state.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Conditions {
    /// Throttle setting, 0 to 1.
    pub throttle: f64,
    /// Thrust, N.
    pub thrust_n: f64,
    /// Dynamic pressure, Pa (core).
    pub dynamic_pressure_pa: f64,
    /// Mach number (core), `None` in the rarefied air above 86 km.
    pub mach: Option<f64>,
    /// Drag, N (core).
    pub drag_n: f64,
    /// Gravity, m/s^2 (core).
    pub gravity_m_s2: f64,
    /// Density, kg/m^3 (core).
    pub density_kg_m3: f64,
}

/// The air and loads at `state` for a throttle setting.
fn loads(state: &State, curve: &DragCurve) -> (f64, Option<f64>, f64, f64, f64) {
    let z = state.altitude_m;
    let air = US1976.air(Altitude::geometric_m(z).expect("finite")).expect("inside the standard");
    let rho = air.density_kg_m3();
    let v = state.velocity_m_s.abs();
    let q = dynamic_pressure_pa(rho, v).expect("finite speed");
    // Above 86 km the standard gives no speed of sound (the air is no continuum); drag
    // there is negligible (q of a few pascals) and is left out.
    let mach = air.speed_of_sound_m_s().map(|a| mach_number(v, a).expect("finite"));
    let drag = match mach {
        Some(m) => drag_n(q, curve.cd(m).expect("Mach in range"), REFERENCE_AREA_M2).expect("finite"),
        None => 0.0,
    };
    let g = GeometricAltitude::new(z).expect("finite").gravity_m_s2();
    (rho, mach, q, drag, g)
}

/// The throttle setting the law asks for at `state`.
///
/// The law (invented for this example; a common shape): let the dynamic pressure close
/// on the set point q_s = 0.95 q_limit no faster than a first-order lag of time constant
/// tau, dq/dt = (q_s - q)/tau. With q = rho v^2 / 2,
/// ```text
/// dq/dt = (1/2) v^3 drho/dh + rho v a,       a = (T - D)/m - g
/// a_req = ((q_s - q)/tau - (1/2) v^3 drho/dh) / (rho v)
/// throttle = clamp((m (a_req + g) + D) / T_full, MIN_THROTTLE, 1)
/// ```
/// drho/dh is the central difference of the core's density 10 m either side.
fn throttle_setting(state: &State, law: Throttle, q: f64, drag: f64, g: f64, rho: f64) -> f64 {
    let full = full_thrust_n(state.burn_s);
    let Throttle::HoldQ { limit_pa } = law else { return 1.0 };
    let v = state.velocity_m_s;
    if full <= 0.0 || v <= 1.0 {
        return 1.0;
    }
    let density = |z: f64| US1976.density_kg_m3(Altitude::geometric_m(z).expect("finite")).expect("in range");
    let slope = (density(state.altitude_m + 10.0) - density(state.altitude_m - 10.0)) / 20.0;
    let q_set = Q_SET_FRACTION * limit_pa;
    let wanted = ((q_set - q) / Q_TIME_CONSTANT_S - 0.5 * v * v * v * slope) / (rho * v);
    ((state.mass_kg * (wanted + g) + drag) / full).clamp(MIN_THROTTLE, 1.0)
}

/// Conditions at `state` under `law`.
pub fn conditions(state: &State, law: Throttle, curve: &DragCurve) -> Conditions {
    let (rho, mach, q, drag, g) = loads(state, curve);
    let throttle = throttle_setting(state, law, q, drag, g, rho);
    Conditions {
        throttle,
        thrust_n: throttle * full_thrust_n(state.burn_s),
        dynamic_pressure_pa: q,
        mach,
        drag_n: drag,
        gravity_m_s2: g,
        density_kg_m3: rho,
    }
}

/// The time derivative of the state.
fn derivative(state: &State, law: Throttle, curve: &DragCurve) -> State {
    let c = conditions(state, law, curve);
    let drag = c.drag_n * state.velocity_m_s.signum();
    let mut acceleration = (c.thrust_n - drag) / state.mass_kg - c.gravity_m_s2;
    let mut velocity = state.velocity_m_s;
    // On the pad until thrust exceeds weight: the pad holds the vehicle up.
    if state.altitude_m <= PAD_ALTITUDE_M && velocity <= 0.0 && acceleration < 0.0 {
        acceleration = 0.0;
        velocity = 0.0;
    }
    // Burn time runs at the throttle setting (at 1 after burnout, where it no longer
    // matters), so that it stays smooth across burnout for the integrator.
    State {
        altitude_m: velocity,
        velocity_m_s: acceleration,
        mass_kg: -c.thrust_n / EXHAUST_VELOCITY_M_S,
        burn_s: c.throttle,
    }
}

fn add(s: &State, d: &State, h: f64) -> State {
    State {
        altitude_m: s.altitude_m + h * d.altitude_m,
        velocity_m_s: s.velocity_m_s + h * d.velocity_m_s,
        mass_kg: s.mass_kg + h * d.mass_kg,
        burn_s: s.burn_s + h * d.burn_s,
    }
}

/// One classical Runge-Kutta step of `h` seconds.
pub fn rk4_step(s: &State, h: f64, law: Throttle, curve: &DragCurve) -> State {
    let k1 = derivative(s, law, curve);
    let k2 = derivative(&add(s, &k1, h / 2.0), law, curve);
    let k3 = derivative(&add(s, &k2, h / 2.0), law, curve);
    let k4 = derivative(&add(s, &k3, h), law, curve);
    let combine = |a: f64, b: f64, c: f64, d: f64| (a + 2.0 * b + 2.0 * c + d) / 6.0;
    let slope = State {
        altitude_m: combine(k1.altitude_m, k2.altitude_m, k3.altitude_m, k4.altitude_m),
        velocity_m_s: combine(k1.velocity_m_s, k2.velocity_m_s, k3.velocity_m_s, k4.velocity_m_s),
        mass_kg: combine(k1.mass_kg, k2.mass_kg, k3.mass_kg, k4.mass_kg),
        burn_s: combine(k1.burn_s, k2.burn_s, k3.burn_s, k4.burn_s),
    };
    add(s, &slope, h)
}

/// One recorded point of a flight.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Point {
    /// Time since ignition, s.
    pub time_s: f64,
    /// The state.
    pub state: State,
    /// The conditions.
    pub conditions: Conditions,
}

/// An event interpolated between steps.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Event {
    /// Time, s.
    pub time_s: f64,
    /// Geometric altitude, m.
    pub altitude_m: f64,
    /// Vertical velocity, m/s.
    pub velocity_m_s: f64,
}

/// A flown trajectory, ignition to apogee.
#[derive(Clone, Debug)]
pub struct Flight {
    /// Every step.
    pub points: Vec<Point>,
    /// The core's scan of the points: the refined maximum q and the Mach number there.
    pub summary: FlightSummary,
    /// Burnout (burn time used up), interpolated linearly in burn time.
    pub burnout: Event,
    /// Mass at burnout, kg.
    pub burnout_mass_kg: f64,
    /// Apogee (velocity zero), by the cubic Hermite through the two steps around it.
    pub apogee: Event,
}

/// Flies the Skelvik SK-1 from the pad to apogee with a step of `step_s` under `law`.
pub fn fly(law: Throttle, step_s: f64) -> Flight {
    let curve = drag_curve();
    let mut state = State {
        altitude_m: PAD_ALTITUDE_M,
        velocity_m_s: 0.0,
        mass_kg: DRY_MASS_KG + propellant_mass_kg(),
        burn_s: 0.0,
    };
    let mut time = 0.0;
    let mut points = vec![Point { time_s: time, state, conditions: conditions(&state, law, &curve) }];
    let mut burnout = None;
    let mut step = 0u64;
    let apogee = loop {
        let next = rk4_step(&state, step_s, law, &curve);
        step += 1;
        let next_time = step as f64 * step_s;
        if burnout.is_none() && next.burn_s >= burn_time_s() {
            let f = (burn_time_s() - state.burn_s) / (next.burn_s - state.burn_s);
            let lerp = |a: f64, b: f64| a + f * (b - a);
            burnout = Some((
                Event {
                    time_s: lerp(time, next_time),
                    altitude_m: lerp(state.altitude_m, next.altitude_m),
                    velocity_m_s: lerp(state.velocity_m_s, next.velocity_m_s),
                },
                lerp(state.mass_kg, next.mass_kg),
            ));
        }
        if burnout.is_some() && next.velocity_m_s <= 0.0 {
            break hermite_apogee(time, &state, next_time, &next);
        }
        state = next;
        time = next_time;
        points.push(Point { time_s: time, state, conditions: conditions(&state, law, &curve) });
    };
    let vehicle = Vehicle::new(curve, REFERENCE_AREA_M2).expect("valid area");
    let mut scan = FlightScan::new(US1976, Some(vehicle));
    for p in &points {
        let sample =
            Sample { time_s: p.time_s, altitude_m: p.state.altitude_m, velocity_m_s: p.state.velocity_m_s };
        scan.push(sample).expect("the trajectory stays inside the standard");
    }
    let (burnout, burnout_mass_kg) = burnout.expect("the motor burns out before apogee");
    Flight { points, summary: scan.summary(), burnout, burnout_mass_kg, apogee }
}

/// Where the velocity crosses zero between two steps: the time by linear interpolation of
/// the velocity, the altitude by the cubic Hermite through both ends' altitude and
/// velocity (its derivative).
fn hermite_apogee(t0: f64, s0: &State, t1: f64, s1: &State) -> Event {
    let h = t1 - t0;
    let f = s0.velocity_m_s / (s0.velocity_m_s - s1.velocity_m_s);
    let (h00, h10, h01, h11) = (
        2.0 * f * f * f - 3.0 * f * f + 1.0,
        f * f * f - 2.0 * f * f + f,
        -2.0 * f * f * f + 3.0 * f * f,
        f * f * f - f * f,
    );
    let z = h00 * s0.altitude_m + h10 * h * s0.velocity_m_s + h01 * s1.altitude_m + h11 * h * s1.velocity_m_s;
    Event { time_s: t0 + f * h, altitude_m: z, velocity_m_s: 0.0 }
}

/// The figures of merit of a flight.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Results {
    /// Maximum dynamic pressure, Pa (core, refined between steps).
    pub max_q_pa: f64,
    /// Its time, s.
    pub max_q_time_s: f64,
    /// Its altitude, m.
    pub max_q_altitude_m: f64,
    /// Mach number at maximum q.
    pub max_q_mach: f64,
    /// Burnout.
    pub burnout: Event,
    /// Apogee.
    pub apogee: Event,
}

impl Flight {
    /// The figures of merit.
    pub fn results(&self) -> Results {
        let peak = self.summary.max_dynamic_pressure.expect("a flight has samples");
        Results {
            max_q_pa: peak.dynamic_pressure_pa,
            max_q_time_s: peak.time_s,
            max_q_altitude_m: peak.altitude_m,
            max_q_mach: peak.mach.unwrap_or(f64::NAN),
            burnout: self.burnout,
            apogee: self.apogee,
        }
    }
}
