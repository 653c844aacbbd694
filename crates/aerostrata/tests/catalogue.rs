//! The quantity catalogue against the results that carry its quantities: every quantity of
//! a group is reachable through its result's `get`, with the value of the field it names.

use aerostrata::airspeed::{AirData, Airspeed};
use aerostrata::flight::{FlightScan, Sample, Vehicle};
use aerostrata::quantity::Group;
use aerostrata::{DragCurve, Error, Quantity, US1976};

#[test]
fn a_flight_point_gives_every_flight_quantity() {
    let curve = DragCurve::constant(0.45).unwrap();
    let vehicle = Vehicle::new(curve, 0.0182).unwrap().with_reference_length(3.2).unwrap();
    let scan = FlightScan::new(US1976, Some(vehicle));
    let point = scan.evaluate(Sample { time_s: 12.5, altitude_m: 9_000.0, velocity_m_s: 640.0 }).unwrap();
    let expected = [
        point.time_s,
        point.altitude_m,
        point.velocity_m_s,
        point.density_kg_m3,
        point.pressure_pa,
        point.temperature_k,
        point.speed_of_sound_m_s.unwrap(),
        point.mach.unwrap(),
        point.dynamic_pressure_pa,
        point.reynolds_per_m.unwrap(),
        point.reynolds_number.unwrap(),
        point.drag_coefficient.unwrap(),
        point.drag_n.unwrap(),
    ];
    for (quantity, value) in aerostrata::FlightPoint::QUANTITIES.iter().zip(expected) {
        assert_eq!(point.get(*quantity).unwrap(), value, "{quantity:?}");
    }
    // Every quantity of the flight group is in the point's list.
    for quantity in Quantity::of_group(Group::Flight) {
        assert!(aerostrata::FlightPoint::QUANTITIES.contains(&quantity), "{quantity:?}");
    }
    assert!(matches!(point.get(Quantity::CalibratedAirspeed), Err(Error::NotCarried { .. })));
}

#[test]
fn a_flight_point_says_why_a_value_is_missing() {
    let scan = FlightScan::new(US1976, None);
    let low = scan.evaluate(Sample { time_s: 0.0, altitude_m: 1_000.0, velocity_m_s: 100.0 }).unwrap();
    assert!(matches!(low.get(Quantity::Drag), Err(Error::NotCarried { .. })), "no vehicle");
    assert!(low.get(Quantity::Mach).is_ok());
    let high = scan.evaluate(Sample { time_s: 1.0, altitude_m: 120_000.0, velocity_m_s: 2_000.0 }).unwrap();
    assert!(matches!(high.get(Quantity::Mach), Err(Error::Undefined { .. })), "above 86 km");
    assert!(matches!(high.get(Quantity::Drag), Err(Error::Undefined { .. })));
    assert!(high.get(Quantity::DynamicPressure).is_ok());
}

#[test]
fn airspeeds_give_every_airspeed_quantity() {
    let air = AirData::from_pressure_altitude(3_048.0, 268.15).unwrap();
    let s = air.airspeeds(Airspeed::Calibrated(128.6)).unwrap();
    let expected =
        [s.calibrated_m_s, s.equivalent_m_s, s.true_m_s, s.mach, s.impact_pressure_pa, s.dynamic_pressure_pa];
    for (quantity, value) in aerostrata::airspeed::Airspeeds::QUANTITIES.iter().zip(expected) {
        assert_eq!(s.get(*quantity).unwrap(), value, "{quantity:?}");
    }
    for quantity in Quantity::of_group(Group::Airspeed) {
        assert!(aerostrata::airspeed::Airspeeds::QUANTITIES.contains(&quantity), "{quantity:?}");
    }
    assert!(matches!(s.get(Quantity::Temperature), Err(Error::NotCarried { .. })));
}

/// The US customary unit of every quantity converts back to the same SI value, and a
/// value's SI and US forms differ by the unit's definition alone.
#[test]
fn every_quantity_round_trips_through_its_us_unit() {
    for quantity in Quantity::ALL {
        let info = quantity.info();
        for si in [216.65, 288.15, 101_325.0] {
            let us = info.us.from_si(si);
            assert!((info.us.to_si(us) / si - 1.0).abs() <= 4.0 * f64::EPSILON, "{}", info.name);
        }
    }
    // Standard sea level: 2116.22 psf, 29.9213 inHg, 0.00237689 slug/ft3, 59 degF (the
    // 1976 standard's English-unit values; from memory of the printed table).
    let us = |q: Quantity, si: f64| q.info().us.from_si(si);
    assert!((us(Quantity::Pressure, 101_325.0) - 2116.22).abs() < 0.01);
    assert!((us(Quantity::StaticPressure, 101_325.0) - 29.9213).abs() < 1e-4);
    assert!((us(Quantity::Density, 1.225) - 0.00237689).abs() < 1e-7);
    assert_eq!(us(Quantity::Temperature, 288.15), 59.0);
    assert_eq!(us(Quantity::GeometricAltitude, 0.3048), 1.0);
}
