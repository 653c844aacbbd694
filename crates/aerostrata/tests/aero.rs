//! Aerodynamic helpers and compressible flow: published values, identities that must
//! hold, inverses that must round-trip, and every solver's failure modes.
//!
//! (The NACA Report 1135 table values are checked cell by cell by the reference-vector
//! test in crates/xtask/src/rust/vectors.rs, from tests/vectors/naca1135_*.csv.)
//!
//! Tolerances, and why each is what it is:
//! - `IDENTITY`: 1e-13 relative, for two f64 routes to one quantity, each a handful of
//!   libm calls (each within 1 ulp) and roundings;
//! - `MPMATH`: 1e-13 relative against 30-digit mpmath values (tests/reference/
//!   naca1135_mpmath.py --table): the f64 formulas plus rounding of the printed 16 digits;
//! - Mach round trips: the inverse of p/p0 (or T/T0, qc/p) is ill-conditioned at low
//!   Mach, where the ratio is 1 - O(M^2): an error of one ulp in the ratio moves M by about
//!   eps / (gamma M). The allowed error is therefore 64 eps (M + 1/M), a margin of ~40
//!   over that condition number, plus the solver's own 1e-14;
//! - `SOLVED`: 1e-12 relative for quantities found by the bracketed solver, whose
//!   tolerance is 1e-14 in Mach (or 1e-9 m/s in speed) plus 4 ulps.

use aerostrata::aero::{
    ballistic_coefficient_kg_m2, drag_n, dynamic_pressure_from_mach_pa, dynamic_pressure_pa, knudsen_number,
    mach_number, reynolds_number, terminal_velocity_m_s, terminal_velocity_with, DragCurve, Interpolation,
    RarefactionRegime, MAX_SPEED_M_S,
};
use aerostrata::flow::{MachBranch, PerfectGas, MAX_MACH};
use aerostrata::{Air, Altitude, Atmosphere, Error, SolverSettings, State, US1976};
use proptest::prelude::*;

mod common;
use common::relative;

const IDENTITY: f64 = 1e-13;
const MPMATH: f64 = 1e-13;
const SOLVED: f64 = 1e-12;

fn mach_round_trip_tolerance(m: f64) -> f64 {
    64.0 * f64::EPSILON * (m + 1.0 / m.max(1e-300)) + 1e-14
}

/// Too few iterations for any solver to meet its tolerance.
const STARVED: SolverSettings =
    SolverSettings { absolute_tolerance: 0.0, relative_tolerance: 0.0, max_iterations: 2 };

#[test]
fn gamma_is_a_parameter_with_air_the_default() {
    assert_eq!(PerfectGas::default(), PerfectGas::AIR);
    assert_eq!(PerfectGas::AIR.gamma(), 1.4);
    // gamma = 1.3 against mpmath (naca1135_mpmath.py --table isentropic --gamma 1.3 0.5 2).
    let g = PerfectGas::new(1.3).unwrap();
    assert!(relative(g.pressure_ratio(0.5).unwrap(), 0.8525467634304) < MPMATH);
    assert!(relative(g.density_ratio(2.0).unwrap(), 0.2087372981783077) < MPMATH);
    assert!(relative(g.temperature_ratio(2.0).unwrap(), 0.625) < MPMATH);
    assert!(relative(g.area_ratio(2.0).unwrap(), 1.773188406658596) < MPMATH);
    let shock = g.normal_shock(2.0).unwrap();
    assert!(relative(shock.downstream_mach, 0.5628780357842335) < MPMATH);
    assert!(relative(shock.total_pressure_ratio, 0.700571103362555) < MPMATH);
    assert!(relative(shock.pitot_pressure_ratio, 5.369973527311732) < MPMATH);
    for bad in [1.0, 0.9, 1.8, f64::NAN, f64::INFINITY] {
        assert!(PerfectGas::new(bad).is_err(), "gamma {bad} accepted");
    }
    let e = PerfectGas::new(2.0).unwrap_err();
    assert_eq!(e.to_string(), "ratio of specific heats 2 is outside the allowed range 1.01 to 1.7");
}

#[test]
fn far_ends_of_the_mach_range_match_mpmath() {
    // naca1135_mpmath.py --table isentropic 0.001 1000 and --table normal_shock 10 1000.
    let air = PerfectGas::AIR;
    assert!(relative(air.pressure_ratio(0.001).unwrap(), 0.999999300000315) < MPMATH);
    assert!(relative(air.area_ratio(0.001).unwrap(), 578.7040509259954) < MPMATH);
    assert!(relative(air.pressure_ratio(1000.0).unwrap(), 2.795036058438007e-19) < 1e-12);
    assert!(relative(air.area_ratio(1000.0).unwrap(), 4629699074421.297) < 1e-12);
    let shock = air.normal_shock(10.0).unwrap();
    assert!(relative(shock.downstream_mach, 0.3875752730434155) < MPMATH);
    assert!(relative(shock.temperature_ratio, 20.3875) < MPMATH);
    assert!(relative(shock.total_pressure_ratio, 0.003044752643416093) < 1e-12);
    let shock = air.normal_shock(1000.0).unwrap();
    assert!(relative(shock.total_pressure_ratio, 3.598777174207487e-13) < 1e-11);
    assert!(relative(shock.pitot_pressure_ratio, 1287560.195634345) < MPMATH);
}

#[test]
fn pitot_formulas_meet_at_mach_1() {
    for gamma in [1.1, 1.3, 1.4, 1.67] {
        let gas = PerfectGas::new(gamma).unwrap();
        let sonic = gas.sonic_impact_pressure_ratio();
        let below = gas.impact_pressure_ratio(1.0 - f64::EPSILON).unwrap();
        let at = gas.impact_pressure_ratio(1.0).unwrap();
        let above = gas.impact_pressure_ratio(1.0 + 2.0 * f64::EPSILON).unwrap();
        assert!(relative(at, sonic) < IDENTITY, "gamma {gamma}");
        assert!(relative(below, above) < IDENTITY, "gamma {gamma}: {below} vs {above}");
        assert!(relative(1.0 / (1.0 + sonic), gas.pressure_ratio(1.0).unwrap()) < IDENTITY);
        // And the inverse is continuous too.
        assert!((gas.mach_from_impact_pressure_ratio(sonic).unwrap() - 1.0).abs() < 1e-14);
        assert!((gas.mach_from_impact_pressure_ratio(sonic * (1.0 + 1e-15)).unwrap() - 1.0).abs() < 1e-13);
    }
    // For gamma = 1.4 the sonic value is 1.2^3.5 - 1 = 0.892929...
    assert!(relative(PerfectGas::AIR.sonic_impact_pressure_ratio(), 1.2f64.powf(3.5) - 1.0) < IDENTITY);
}

#[test]
fn a_normal_shock_at_mach_1_is_no_shock() {
    let shock = PerfectGas::AIR.normal_shock(1.0).unwrap();
    for value in [
        shock.downstream_mach,
        shock.pressure_ratio,
        shock.density_ratio,
        shock.temperature_ratio,
        shock.total_pressure_ratio,
    ] {
        assert!((value - 1.0).abs() < 1e-15, "{shock:?}");
    }
}

#[test]
fn normal_shock_refuses_subsonic_flow() {
    let e = PerfectGas::AIR.normal_shock(0.9).unwrap_err();
    assert_eq!(e.to_string(), "upstream Mach number 0.9 is outside the allowed range 1 to 1000");
    assert!(matches!(PerfectGas::AIR.normal_shock(f64::NAN), Err(Error::NotFinite { .. })));
    assert!(PerfectGas::AIR.normal_shock(1000.5).is_err());
}

#[test]
fn isentropic_and_area_inverses_refuse_their_outside() {
    let air = PerfectGas::AIR;
    for (result, words) in [
        (
            air.mach_from_pressure_ratio(1.5),
            "static-to-total pressure ratio 1.5 is outside the allowed range",
        ),
        (air.mach_from_pressure_ratio(0.0), "static-to-total pressure ratio 0 is outside"),
        (air.mach_from_temperature_ratio(-0.2), "static-to-total temperature ratio -0.2 is outside"),
        (air.mach_from_density_ratio(2.0), "static-to-total density ratio 2 is outside"),
        (
            air.mach_from_area_ratio(0.5, MachBranch::Supersonic),
            "area ratio A/A* 0.5 is outside the allowed range 1 to",
        ),
        (air.mach_from_area_ratio(1e10, MachBranch::Subsonic), "area ratio A/A* 1e10 is outside"),
        (air.mach_from_impact_pressure_ratio(-0.1), "impact-to-static pressure ratio -0.1 is outside"),
        (air.mach_from_impact_pressure_ratio(1e12), "impact-to-static pressure ratio 1e12 is outside"),
        (air.area_ratio(0.0), "Mach number 0 is outside the allowed range 1e-9 to 1000"),
        (air.pressure_ratio(-1.0), "Mach number -1 is outside the allowed range 0 to 1000"),
    ] {
        let e = result.unwrap_err();
        assert!(e.to_string().contains(words), "{e} should contain {words}");
    }
}

#[test]
fn every_flow_solver_reports_non_convergence() {
    let air = PerfectGas::AIR;
    for result in [
        air.mach_from_area_ratio_with(2.5, MachBranch::Supersonic, &STARVED),
        air.mach_from_area_ratio_with(2.5, MachBranch::Subsonic, &STARVED),
        air.mach_from_impact_pressure_ratio_with(10.0, &STARVED),
    ] {
        match result {
            Err(Error::NoConvergence { iterations: 2, solver }) => {
                assert!(solver.contains("Mach"), "{solver}")
            }
            other => panic!("expected non-convergence, got {other:?}"),
        }
    }
    let e = air.mach_from_impact_pressure_ratio_with(10.0, &STARVED).unwrap_err();
    assert_eq!(e.to_string(), "Mach-from-impact-pressure solver did not converge within 2 iterations");
    // The same problems converge with the defaults, and invalid settings are refused.
    assert!(air.mach_from_impact_pressure_ratio(10.0).is_ok());
    let bad = SolverSettings { absolute_tolerance: -1.0, ..SolverSettings::MACH };
    assert!(air.mach_from_impact_pressure_ratio_with(10.0, &bad).is_err());
    assert!(SolverSettings::new(1e-9, 0.0, 0).is_err());
    assert!(SolverSettings::new(f64::NAN, 0.0, 10).is_err());
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 2000, ..ProptestConfig::default() })]

    #[test]
    fn isentropic_inverses_round_trip(m in prop_oneof![0.0..1.0f64, 1.0..10.0f64, 10.0..MAX_MACH], gamma in 1.05..1.67f64) {
        let gas = PerfectGas::new(gamma).unwrap();
        let tolerance = mach_round_trip_tolerance(m);
        let back = gas.mach_from_pressure_ratio(gas.pressure_ratio(m).unwrap()).unwrap();
        prop_assert!((back - m).abs() <= tolerance, "p/p0: {m} -> {back}");
        let back = gas.mach_from_temperature_ratio(gas.temperature_ratio(m).unwrap()).unwrap();
        prop_assert!((back - m).abs() <= tolerance, "T/T0: {m} -> {back}");
        let back = gas.mach_from_density_ratio(gas.density_ratio(m).unwrap()).unwrap();
        prop_assert!((back - m).abs() <= tolerance, "rho/rho0: {m} -> {back}");
        let back = gas.mach_from_impact_pressure_ratio(gas.impact_pressure_ratio(m).unwrap()).unwrap();
        prop_assert!((back - m).abs() <= tolerance.max(SOLVED * m), "qc/p: {m} -> {back}");
    }

    #[test]
    fn area_ratio_inverse_round_trips_on_both_branches(m in prop_oneof![1e-3..1.0f64, 1.0..MAX_MACH]) {
        let gas = PerfectGas::AIR;
        let branch = if m < 1.0 { MachBranch::Subsonic } else { MachBranch::Supersonic };
        let ratio = gas.area_ratio(m).unwrap();
        let back = gas.mach_from_area_ratio(ratio, branch).unwrap();
        // A/A* is flat at Mach 1 (dA/dM = 0), so the inverse loses half the digits there:
        // |dM| ~ sqrt(eps) near M = 1. Away from it, SOLVED, but never below twice the
        // Mach solvers' absolute tolerance of 1e-14 (which dominates at small Mach).
        let absolute_floor = 2e-14;
        let tolerance = if (m - 1.0).abs() < 0.1 { 2e-7 } else { (SOLVED * m).max(absolute_floor) };
        prop_assert!((back - m).abs() <= tolerance, "{m} -> A/A* {ratio} -> {back}");
        // In the ratio itself the round trip is tight; at small Mach A/A* ~ 0.58 / M, so the
        // solver's absolute floor shows up relatively as floor / M.
        prop_assert!(relative(gas.area_ratio(back).unwrap(), ratio) < SOLVED.max(absolute_floor / m));
    }

    #[test]
    fn normal_shock_identities(m in 1.0..MAX_MACH, gamma in 1.05..1.67f64) {
        let gas = PerfectGas::new(gamma).unwrap();
        let shock = gas.normal_shock(m).unwrap();
        prop_assert!(shock.downstream_mach <= 1.0 && shock.downstream_mach > 0.0);
        prop_assert!(shock.total_pressure_ratio <= 1.0 && shock.total_pressure_ratio > 0.0);
        // T2/T1 = (p2/p1)/(rho2/rho1), by the gas law.
        prop_assert!(relative(shock.temperature_ratio * shock.density_ratio, shock.pressure_ratio) < IDENTITY);
        // p02/p1 = (p02/p01)(p01/p1): Rayleigh's formula against the total-pressure loss.
        let p01_p1 = 1.0 / gas.pressure_ratio(m).unwrap();
        prop_assert!(relative(shock.total_pressure_ratio * p01_p1, shock.pitot_pressure_ratio) < 1e-12);
        // p02/p1 = (p2/p1)(p02/p2) with p02/p2 isentropic at M2.
        let p02_p2 = 1.0 / gas.pressure_ratio(shock.downstream_mach).unwrap();
        prop_assert!(relative(shock.pressure_ratio * p02_p2, shock.pitot_pressure_ratio) < 1e-12);
        // Total temperature is conserved: T2/T1 = (T0/T1)/(T0/T2).
        let t_ratio = gas.temperature_ratio(m).unwrap() / gas.temperature_ratio(shock.downstream_mach).unwrap();
        prop_assert!(relative(1.0 / t_ratio, shock.temperature_ratio) < 1e-12);
    }

    #[test]
    fn both_dynamic_pressures_agree(z in -5_000.0..86_000.0f64, v in 0.0..3_000.0f64) {
        let s = US1976.state(Altitude::geometric_m(z).unwrap()).unwrap();
        let a = s.speed_of_sound().unwrap();
        let incompressible = dynamic_pressure_pa(s.density_kg_m3, v).unwrap();
        let compressible = dynamic_pressure_from_mach_pa(s.pressure_pa, v / a, PerfectGas::AIR).unwrap();
        prop_assert!(relative(compressible, incompressible) < IDENTITY || v == 0.0);
        prop_assert_eq!(dynamic_pressure_pa(s.density_kg_m3, -v).unwrap(), incompressible);
    }

    #[test]
    fn cubic_is_monotone_and_bounded_between_points(
        steps in prop::collection::vec((0.01..2.0f64, -0.3..0.3f64), 2..8),
        start in 0.1..1.0f64,
        t in 0.0..1.0f64,
    ) {
        let mut mach = vec![0.0];
        let mut cd = vec![start];
        for (dm, dcd) in &steps {
            mach.push(mach.last().unwrap() + dm);
            cd.push((cd.last().unwrap() + dcd).max(0.01));
        }
        let curve = DragCurve::table(&mach, &cd, Interpolation::MonotoneCubic).unwrap();
        let linear = DragCurve::table(&mach, &cd, Interpolation::Linear).unwrap();
        for i in 0..mach.len() - 1 {
            let (lo, hi) = (cd[i].min(cd[i + 1]), cd[i].max(cd[i + 1]));
            let m = mach[i] + t * (mach[i + 1] - mach[i]);
            let m2 = mach[i] + (0.5 + 0.5 * t) * (mach[i + 1] - mach[i]);
            let (y, y2) = (curve.cd(m).unwrap(), curve.cd(m2).unwrap());
            prop_assert!(y >= lo && y <= hi, "cubic {y} outside [{lo}, {hi}] at {m}");
            let l = linear.cd(m).unwrap();
            prop_assert!(l >= lo - 1e-15 && l <= hi + 1e-15);
            // Monotone: moving toward the right end never moves away from its value.
            if cd[i + 1] >= cd[i] { prop_assert!(y2 >= y); } else { prop_assert!(y2 <= y); }
        }
        for (m, c) in mach.iter().zip(&cd) {
            prop_assert_eq!(curve.cd(*m).unwrap(), *c);
            prop_assert!((linear.cd(*m).unwrap() - c).abs() <= 1e-15);
        }
        prop_assert_eq!(curve.cd(mach[mach.len() - 1] + 1.0).unwrap(), cd[cd.len() - 1]);
    }
}

#[test]
fn drag_tables_are_validated_like_soundings() {
    let cases: [(&[f64], &[f64], usize, &str); 7] = [
        (&[0.0, 1.0], &[0.5], 1, "same length"),
        (&[0.5], &[0.5], 0, "at least 2 points"),
        (&[0.0, 1.0, 1.0], &[0.5, 0.6, 0.7], 2, "above the previous"),
        (&[0.0, 2.0, 1.0], &[0.5, 0.6, 0.7], 2, "above the previous"),
        (&[0.0, f64::NAN], &[0.5, 0.6], 1, "Mach number must be finite"),
        (&[-1.0, 1.0], &[0.5, 0.6], 0, "Mach number must be finite and within 0 to 1000"),
        (&[0.0, 1.0], &[0.5, 0.0], 1, "drag coefficient must be finite, above 0"),
    ];
    for (mach, cd, index, words) in cases {
        match DragCurve::table(mach, cd, Interpolation::Linear) {
            Err(Error::InvalidPoint { table: "drag table", index: i, problem, .. }) => {
                assert_eq!(i, index, "{problem}");
                assert!(problem.contains(words), "{problem} should say {words}");
            }
            other => panic!("{mach:?} {cd:?}: expected an invalid point, got {other:?}"),
        }
    }
    let e = DragCurve::table(&[0.0, 1.0], &[0.5, -2.0], Interpolation::Linear).unwrap_err();
    assert_eq!(
        e.to_string(),
        "drag table point 1: drag coefficient must be finite, above 0 and at most 100, got -2"
    );
    assert!(DragCurve::constant(0.0).is_err());
    assert_eq!(
        DragCurve::constant(-1.0).unwrap_err().to_string(),
        "drag coefficient must be greater than 0, got -1"
    );
}

#[test]
fn drag_curves_interpolate_and_hold_their_ends() {
    let mach = [0.5, 1.0, 2.0];
    let cd = [0.4, 0.8, 0.6];
    let linear = DragCurve::table(&mach, &cd, Interpolation::Linear).unwrap();
    assert!((linear.cd(0.75).unwrap() - 0.6).abs() < 1e-15);
    assert!((linear.cd(1.5).unwrap() - 0.7).abs() < 1e-15);
    assert_eq!(linear.cd(0.0).unwrap(), 0.4);
    assert_eq!(linear.cd(9.0).unwrap(), 0.6);
    assert_eq!(linear.min_cd(), 0.4);
    assert_eq!(linear.max_cd(), 0.8);
    let e = linear.cd_in_table(2.5).unwrap_err();
    assert_eq!(e.to_string(), "Mach number 2.5 is outside the allowed range 0.5 to 2");
    assert!(linear.cd_in_table(0.5).is_ok() && linear.cd_in_table(2.0).is_ok());
    assert!(linear.cd(-0.1).is_err() && linear.cd(f64::NAN).is_err());
    // The cubic has a flat top at the interior maximum: slope 0 there, so just beside it
    // the curve is flatter than the straight lines.
    let cubic = DragCurve::table(&mach, &cd, Interpolation::MonotoneCubic).unwrap();
    let near = 1.0 - 1e-3;
    assert!(cubic.cd(near).unwrap() > linear.cd(near).unwrap());
    assert!(cubic.cd(near).unwrap() <= 0.8);
    // A straight-line table is reproduced exactly by the cubic (all slopes equal).
    let straight =
        DragCurve::table(&[0.0, 1.0, 3.0], &[0.2, 0.4, 0.8], Interpolation::MonotoneCubic).unwrap();
    for m in [0.25, 0.5, 2.0, 2.9] {
        assert!((straight.cd(m).unwrap() - (0.2 + 0.2 * m)).abs() < 1e-15, "at {m}");
    }
}

#[test]
fn mach_reynolds_drag_and_knudsen() {
    let s = US1976.state(Altitude::geometric_m(0.0).unwrap()).unwrap();
    let a = s.speed_of_sound().unwrap();
    assert!(relative(mach_number(-a, a).unwrap(), 1.0) < 1e-15);
    assert!(mach_number(1.0, 0.0).is_err());
    assert!(mach_number(MAX_SPEED_M_S * 2.0, a).is_err());
    assert_eq!(drag_n(1000.0, 0.5, 0.01).unwrap(), 5.0);
    assert!(drag_n(-1.0, 0.5, 0.01).is_err() && drag_n(1.0, 200.0, 0.01).is_err());
    // Re = V L / nu against the standard's kinematic viscosity at sea level, 1.4607E-05
    // (Table III; from memory of the printed table, 5 digits: 3.4e-5 relative).
    let re = reynolds_number(s.density_kg_m3, 100.0, 2.0, s.dynamic_viscosity().unwrap()).unwrap();
    assert!(relative(re, 200.0 / 1.4607e-5) < 3.5e-5);
    assert!(reynolds_number(1.2, 10.0, 1.0, 0.0).is_err());
    // Regimes, each boundary belonging to the regime above it.
    for (kn, regime) in [
        (0.0, RarefactionRegime::Continuum),
        (0.0099, RarefactionRegime::Continuum),
        (0.01, RarefactionRegime::Slip),
        (0.0999, RarefactionRegime::Slip),
        (0.1, RarefactionRegime::Transitional),
        (9.99, RarefactionRegime::Transitional),
        (10.0, RarefactionRegime::FreeMolecular),
        (1e30, RarefactionRegime::FreeMolecular),
    ] {
        assert_eq!(RarefactionRegime::of(kn).unwrap(), regime, "Kn = {kn}");
    }
    assert!(RarefactionRegime::of(-1.0).is_err() && RarefactionRegime::of(f64::NAN).is_err());
    // A 1 m body: continuum at sea level (mean free path 6.6e-8 m), slip at 86 km (1.2e-2
    // m, from L = 1 / (sqrt(2) pi sigma^2 n) with the standard's n = 1.45e20 /m^3).
    let kn = knudsen_number(s.mean_free_path_m, 1.0).unwrap();
    assert_eq!(RarefactionRegime::of(kn).unwrap(), RarefactionRegime::Continuum);
    let high = US1976.state(Altitude::geometric_m(86_000.0).unwrap()).unwrap();
    let kn = knudsen_number(high.mean_free_path_m, 1.0).unwrap();
    assert!((kn - 1.2e-2).abs() < 0.05e-2, "{kn}");
    assert_eq!(RarefactionRegime::of(kn).unwrap(), RarefactionRegime::Slip);
    assert!(knudsen_number(1e300, 1e-12).is_err());
    assert_eq!(ballistic_coefficient_kg_m2(10.0, 0.5, 0.02).unwrap(), 1000.0);
    assert!(ballistic_coefficient_kg_m2(10.0, 0.0, 0.02).is_err());
}

fn sea_level() -> State {
    US1976.state(Altitude::geometric_m(0.0).unwrap()).unwrap()
}

#[test]
fn terminal_velocity_with_constant_cd_is_the_closed_form() {
    let s = US1976.state(Altitude::geometric_m(3_000.0).unwrap()).unwrap();
    let v = terminal_velocity_m_s(&s, 2.0, 0.5, &DragCurve::constant(1.2).unwrap()).unwrap();
    let expected = (2.0 * 2.0 * s.gravity_m_s2 / (s.density_kg_m3 * 1.2 * 0.5)).sqrt();
    assert!(relative(v, expected) < 1e-15);
}

#[test]
fn terminal_velocity_with_a_drag_rise_balances_weight() {
    // An invented dense dart falling through a drag rise: the balance lies in the
    // transonic part of the table, where Cd depends strongly on Mach.
    let mach = [0.0, 0.6, 0.9, 1.1, 1.5, 3.0];
    let cd = [0.30, 0.31, 0.45, 0.75, 0.62, 0.45];
    for interpolation in [Interpolation::Linear, Interpolation::MonotoneCubic] {
        let curve = DragCurve::table(&mach, &cd, interpolation).unwrap();
        for (z, mass) in [(0.0, 0.5), (0.0, 3.0), (10_000.0, 3.0), (30_000.0, 1.0)] {
            let s = US1976.state(Altitude::geometric_m(z).unwrap()).unwrap();
            let area = 2e-3;
            let v = terminal_velocity_m_s(&s, mass, area, &curve).unwrap();
            let a = s.speed_of_sound().unwrap();
            let drag = dynamic_pressure_pa(s.density_kg_m3, v).unwrap() * curve.cd(v / a).unwrap() * area;
            let weight = mass * s.gravity_m_s2;
            // The solver pins the speed to 1e-9 m/s + 4 ulps; drag moves by
            // (2 + dln Cd / dln M) dV / V, at most about 5 dV / V on this table: 2e-11.
            assert!(
                relative(drag, weight) < 1e-10,
                "z {z}, m {mass}: drag {drag} vs weight {weight} at {v} m/s"
            );
        }
    }
}

#[test]
fn terminal_velocity_errors() {
    let curve_points = ([0.0, 1.0, 2.0], [0.3, 0.9, 0.5]);
    let curve = DragCurve::table(&curve_points.0, &curve_points.1, Interpolation::Linear).unwrap();
    let s = sea_level();
    // Non-convergence with a starved budget.
    match terminal_velocity_with(&s, 5.0, 1e-3, &curve, &STARVED) {
        Err(Error::NoConvergence { solver: "terminal-velocity solver", iterations: 2 }) => {}
        other => panic!("expected non-convergence, got {other:?}"),
    }
    assert!(terminal_velocity_m_s(&s, 5.0, 1e-3, &curve).is_ok());
    // Domain: mass and area.
    assert!(terminal_velocity_m_s(&s, 0.0, 1.0, &curve).is_err());
    assert!(terminal_velocity_m_s(&s, 1.0, f64::NAN, &curve).is_err());
    // Faster than any flight: a heavy speck in the thinnest air a model can give.
    let thin = State::new(Altitude::geometric_m(0.0).unwrap(), Air::new(300.0, 1e-150, 28.9644).unwrap());
    let e = terminal_velocity_m_s(&thin, 1e6, 1e-6, &DragCurve::constant(0.5).unwrap()).unwrap_err();
    assert!(e.to_string().starts_with("terminal velocity"), "{e}");
    // A Mach-dependent curve needs a speed of sound.
    let rarefied =
        State::new(Altitude::geometric_m(0.0).unwrap(), Air::new(300.0, 1e-3, 28.9644).unwrap().rarefied());
    assert!(matches!(terminal_velocity_m_s(&rarefied, 1.0, 1.0, &curve), Err(Error::Undefined { .. })));
    assert!(terminal_velocity_m_s(&rarefied, 1.0, 1.0, &DragCurve::constant(0.5).unwrap()).is_ok());
}
