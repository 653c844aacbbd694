//! No public function of the aerodynamic modules panics on any f64 (NaN, infinities,
//! zeros of both signs, subnormals, 1e300, anything), and whatever comes out `Ok` is
//! finite: no silent NaN or infinity.

use aerostrata::aero::{
    ballistic_coefficient_kg_m2, drag_n, dynamic_pressure_from_mach_pa, dynamic_pressure_pa, knudsen_number,
    mach_number, reynolds_number, terminal_velocity_m_s, terminal_velocity_with, velocity_from_mach_m_s,
    DragCurve, Interpolation, RarefactionRegime,
};
use aerostrata::airspeed::{sea_level_speed_of_sound_m_s, AirData, Airspeed};
use aerostrata::flight::{samples_from_slices, scan, FlightScan, Sample, Vehicle};
use aerostrata::flow::{MachBranch, PerfectGas};
use aerostrata::inverse::{
    altitude_of, altitude_of_with, altitude_where, barometric_altitude_m, density_altitude,
    density_altitude_from, pressure_altitude, BarometricReference, Property,
};
use aerostrata::{Air, Altitude, Atmosphere, Isothermal, SolverSettings, State, US1976};
use proptest::prelude::*;

mod common;
use common::wild;

fn ok_finite(result: aerostrata::Result<f64>) {
    if let Ok(value) = result {
        assert!(value.is_finite(), "Ok({value})");
    }
}

fn finite_all(values: &[f64]) {
    for value in values {
        assert!(value.is_finite(), "{values:?}");
    }
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 3000, ..ProptestConfig::default() })]

    #[test]
    fn aero_functions(a in wild(), b in wild(), c in wild(), d in wild()) {
        ok_finite(dynamic_pressure_pa(a, b));
        ok_finite(dynamic_pressure_from_mach_pa(a, b, PerfectGas::AIR));
        ok_finite(drag_n(a, b, c));
        ok_finite(mach_number(a, b));
        ok_finite(velocity_from_mach_m_s(a, b));
        ok_finite(reynolds_number(a, b, c, d));
        ok_finite(knudsen_number(a, b));
        ok_finite(ballistic_coefficient_kg_m2(a, b, c));
        let _ = RarefactionRegime::of(a);
        if let Ok(curve) = DragCurve::constant(a) {
            ok_finite(curve.cd(b));
            ok_finite(curve.cd_in_table(b));
        }
        let mach = [a.abs().min(5.0), 1.0, 1.0 + b.abs().min(100.0) + 1e-9];
        let cd = [c, d, 0.5];
        for interpolation in [Interpolation::Linear, Interpolation::MonotoneCubic] {
            if let Ok(curve) = DragCurve::table(&mach, &cd, interpolation) {
                for m in [a, b, c, d] {
                    ok_finite(curve.cd(m));
                    ok_finite(curve.cd_in_table(m));
                }
            }
            let raw = [a, b, c];
            let _ = DragCurve::table(&raw, &cd, interpolation);
        }
    }

    #[test]
    fn terminal_velocity(z in wild(), mass in wild(), area in wild(), cd in wild(), t in wild(), p in wild()) {
        let mach = [0.0, 0.9, 1.2, 2.0];
        let table = [0.3, 0.35, if cd.is_nan() { 0.5 } else { cd.abs().clamp(0.01, 100.0) }, 0.4];
        let curves = [
            DragCurve::table(&mach, &table, Interpolation::MonotoneCubic).unwrap(),
            DragCurve::table(&mach, &table, Interpolation::Linear).unwrap(),
            DragCurve::constant(0.5).unwrap(),
        ];
        let mut states = Vec::new();
        if let Ok(altitude) = Altitude::geometric_m(z) {
            if let Ok(s) = US1976.state(altitude) { states.push(s); }
        }
        if let Ok(air) = Air::new(t, p, 28.9644) {
            states.push(State::new(Altitude::geometric_m(0.0).unwrap(), air));
            states.push(State::new(Altitude::geometric_m(0.0).unwrap(), air.rarefied()));
        }
        for state in &states {
            for curve in &curves {
                ok_finite(terminal_velocity_m_s(state, mass, area, curve));
                ok_finite(terminal_velocity_with(
                    state,
                    mass,
                    area,
                    curve,
                    &SolverSettings { absolute_tolerance: t.abs(), relative_tolerance: 0.0, max_iterations: 5 },
                ));
            }
        }
    }

    #[test]
    fn flow_functions(a in wild(), b in wild(), gamma in prop_oneof![wild(), 1.01..1.7f64]) {
        let _ = PerfectGas::new(gamma);
        for gas in [PerfectGas::AIR, PerfectGas::new(gamma).unwrap_or_default()] {
            ok_finite(gas.pressure_ratio(a));
            ok_finite(gas.temperature_ratio(a));
            ok_finite(gas.density_ratio(a));
            ok_finite(gas.area_ratio(a));
            ok_finite(gas.mach_from_pressure_ratio(a));
            ok_finite(gas.mach_from_temperature_ratio(a));
            ok_finite(gas.mach_from_density_ratio(a));
            ok_finite(gas.mach_from_area_ratio(a, MachBranch::Subsonic));
            ok_finite(gas.mach_from_area_ratio(a, MachBranch::Supersonic));
            ok_finite(gas.impact_pressure_ratio(a));
            ok_finite(gas.impact_pressure_pa(b, a));
            ok_finite(gas.mach_from_impact_pressure_ratio(a));
            let settings = SolverSettings { absolute_tolerance: b, relative_tolerance: b, max_iterations: 3 };
            ok_finite(gas.mach_from_impact_pressure_ratio_with(a, &settings));
            ok_finite(gas.mach_from_area_ratio_with(a, MachBranch::Supersonic, &settings));
            assert!(gas.sonic_impact_pressure_ratio().is_finite());
            if let Ok(i) = gas.isentropic(a) {
                finite_all(&[i.pressure_ratio, i.temperature_ratio, i.density_ratio]);
            }
            if let Ok(s) = gas.normal_shock(a) {
                finite_all(&[
                    s.downstream_mach,
                    s.pressure_ratio,
                    s.density_ratio,
                    s.temperature_ratio,
                    s.total_pressure_ratio,
                    s.pitot_pressure_ratio,
                ]);
            }
        }
    }

    #[test]
    fn airspeed_functions(h in wild(), t in wild(), p in wild(), v in wild()) {
        assert!(sea_level_speed_of_sound_m_s().is_finite());
        let mut conditions = Vec::new();
        conditions.extend(AirData::new(p, t));
        conditions.extend(AirData::from_pressure_altitude(h, t));
        if let Ok(altitude) = Altitude::geometric_m(h) {
            if let Ok(s) = US1976.state(altitude) {
                conditions.extend(AirData::from_state(&s));
            }
        }
        for air in conditions {
            finite_all(&[air.pressure_pa(), air.density_kg_m3(), air.speed_of_sound_m_s()]);
            for given in [Airspeed::Calibrated(v), Airspeed::Equivalent(v), Airspeed::True(v), Airspeed::Mach(v)] {
                if let Ok(s) = air.airspeeds(given) {
                    finite_all(&[s.calibrated_m_s, s.equivalent_m_s, s.true_m_s, s.mach, s.impact_pressure_pa, s.dynamic_pressure_pa]);
                }
            }
        }
    }

    #[test]
    fn inverse_functions(p in wild(), t in wild(), r in wild(), n in 0u32..300) {
        for h in [pressure_altitude(p), density_altitude(p), density_altitude_from(p, t)].into_iter().flatten() {
            assert!(h.meters().is_finite());
        }
        for reference in [
            BarometricReference::StandardSeaLevel,
            BarometricReference::Qnh { setting_pa: r },
            BarometricReference::Pad { pressure_pa: r },
        ] {
            ok_finite(barometric_altitude_m(p, reference));
        }
        let settings = SolverSettings { absolute_tolerance: r, relative_tolerance: t, max_iterations: n };
        let _ = SolverSettings::new(r, t, n);
        let isothermal = Isothermal::new(250.0, 100_000.0).unwrap();
        for property in [Property::Pressure, Property::Density, Property::NumberDensity] {
            for z in [
                altitude_of(&US1976, property, p),
                altitude_of_with(&US1976, property, p, &settings),
                altitude_of(&isothermal, property, p),
            ]
            .into_iter()
            .flatten()
            {
                assert!(z.meters().is_finite());
            }
        }
        let result = altitude_where(&US1976, "temperature", "K", Air::temperature_k, p, &settings);
        if let Ok(z) = result { assert!(z.meters().is_finite()); }
        // A property that returns garbage: the solver must refuse it, not panic.
        let garbage = |air: &Air| if air.pressure_pa() > 1_000.0 { f64::NAN } else { air.pressure_pa() };
        let _ = altitude_where(&US1976, "garbage", "", garbage, p, &SolverSettings::ALTITUDE);
    }

    #[test]
    fn flight_functions(a in wild(), b in wild(), c in wild(), d in wild()) {
        let _ = Vehicle::new(DragCurve::constant(0.5).unwrap(), a);
        if let Ok(vehicle) = Vehicle::new(DragCurve::constant(0.5).unwrap(), 0.01) {
            let _ = vehicle.with_reference_length(b);
        }
        let mut flight = FlightScan::new(US1976, None);
        for sample in [
            Sample { time_s: a, altitude_m: b, velocity_m_s: c },
            Sample { time_s: d, altitude_m: c, velocity_m_s: b },
            Sample { time_s: b, altitude_m: a, velocity_m_s: d },
        ] {
            let _ = flight.evaluate(sample);
            if let Ok(point) = flight.push(sample) {
                finite_all(&[point.dynamic_pressure_pa, point.density_kg_m3]);
            }
        }
        let _ = flight.summary();
        let times = [a, b, c];
        let altitudes = [b, c, d];
        let speeds = [c, d, a];
        if let Ok(samples) = samples_from_slices(&times, &altitudes, &speeds) {
            let _ = scan(US1976, None, samples, |point| assert!(point.dynamic_pressure_pa.is_finite()));
        }
        let _ = samples_from_slices(&times, &altitudes[..2], &speeds).is_err();
    }
}
