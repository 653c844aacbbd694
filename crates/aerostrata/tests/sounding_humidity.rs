//! Moist air in the tabulated (sounding) model: Buck's saturation vapour pressure against
//! a handbook table, the moist density against the CIPM-2007 equation, and a humid
//! table's reported humidity and density (each check names its source and tolerance).

use aerostrata::constants::SEA_LEVEL_MOLAR_MASS_KG_KMOL;
use aerostrata::humidity::{self, saturation_vapour_pressure_pa};
use aerostrata::{Altitude, AltitudeKind, SoundingRow, Tabulated};

mod common;
use common::relative;

/// Handbook vapour pressure of pure water, Pa: CRC Handbook of Chemistry and Physics,
/// table "Vapor pressure of water" (from memory), with the tolerance each point gets.
/// Buck's fit (1981, from memory) is within 0.1 % of it from 0 to 40 degC and reads
/// 0.14 % high at 50 degC and 0.38 % at 60 degC, the top of aerostrata's band; the
/// tolerances are those deviations rounded up, so a wrong coefficient fails.
const HANDBOOK_VAPOUR_PRESSURE: [HandbookPoint; 8] = [
    HandbookPoint { t_c: 0.0, pa: 611.2, tolerance: 0.0002 },
    HandbookPoint { t_c: 10.0, pa: 1228.1, tolerance: 0.001 },
    HandbookPoint { t_c: 20.0, pa: 2339.3, tolerance: 0.001 },
    HandbookPoint { t_c: 25.0, pa: 3169.9, tolerance: 0.001 },
    HandbookPoint { t_c: 30.0, pa: 4246.9, tolerance: 0.001 },
    HandbookPoint { t_c: 40.0, pa: 7384.9, tolerance: 0.001 },
    HandbookPoint { t_c: 50.0, pa: 12_352.0, tolerance: 0.002 },
    HandbookPoint { t_c: 60.0, pa: 19_946.0, tolerance: 0.004 },
];

/// A point of the handbook table: temperature, degC; vapour pressure, Pa; and the relative
/// tolerance Buck's fit gets there.
struct HandbookPoint {
    t_c: f64,
    pa: f64,
    tolerance: f64,
}

#[test]
fn saturation_vapour_pressure_matches_a_handbook_table() {
    for HandbookPoint { t_c, pa: handbook, tolerance } in HANDBOOK_VAPOUR_PRESSURE {
        let e = humidity::pure_water_saturation_vapour_pressure_pa(t_c + 273.15).unwrap();
        assert!(relative(e, handbook) <= tolerance, "{t_c} degC: {e} Pa vs {handbook} Pa");
    }
}

/// Density of moist air by the CIPM-2007 equation (Picard, Davis, Glaeser and Fujii,
/// Metrologia 45 (2008) 149-155; coefficients from memory of the paper), evaluated at 30
/// digits by tests/reference/moist_air_cipm2007_mpmath.py, which prints these lines:
/// (t degC, p Pa, RH %, rho kg/m^3, compressibility Z, molar mass of its dry air kg/kmol).
const CIPM_2007: [(f64, f64, f64, f64, f64, f64); 6] = [
    (20.0, 101_325.0, 50.0, 1.19931389547, 0.999614767525, 28.96546),
    (30.0, 101_325.0, 80.0, 1.15001170673, 0.99962774356, 28.96546),
    (35.0, 100_000.0, 90.0, 1.10923399318, 0.999596243692, 28.96546),
    (25.0, 90_000.0, 60.0, 1.04351602643, 0.999672337745, 28.96546),
    (0.0, 101_325.0, 100.0, 1.29010887353, 0.999400397183, 28.96546),
    (40.0, 95_000.0, 40.0, 1.04464438056, 0.999746560337, 28.96546),
];

/// aerostrata's moist air is an ideal mixture with the standard's dry air; CIPM-2007
/// carries a compressibility factor Z (1 - Z = 2.5e-4 to 6e-4 here) and a dry-air molar
/// mass with 400 umol/mol of CO2 (3.7e-5 heavier), so the raw densities agree to 7e-4.
/// Taking those two known differences out, what is left is the vapour term: Buck's
/// saturation pressure and enhancement factor against CIPM's (about 1e-3 of e apart),
/// times the vapour's share of the density (at most 2 %), plus the part of Z that grows
/// with humidity (1.8e-4 at 35 degC, 90 %): 2.5e-4. Ignoring the vapour would be 2e-3 to
/// 2e-2 off at these points; a sign slip in (1 - epsilon) more.
#[test]
fn moist_density_matches_cipm_2007() {
    for (t_c, p, rh, rho_cipm, z, m_a) in CIPM_2007 {
        let t = t_c + 273.15;
        let e = rh / 100.0 * saturation_vapour_pressure_pa(t, p).unwrap();
        let rho = humidity::moist_air(t, p, e).unwrap().density_kg_m3();
        assert!(relative(rho, rho_cipm) <= 7e-4, "{t_c} degC {rh} %: {rho} vs {rho_cipm}");
        let like_cipm = rho * (m_a / SEA_LEVEL_MOLAR_MASS_KG_KMOL) / z;
        assert!(relative(like_cipm, rho_cipm) <= 2.5e-4, "{t_c} degC {rh} %: {like_cipm} vs {rho_cipm}");
        // Dry air of the same T and p: the humidity effect itself is there.
        let dry = humidity::moist_air(t, p, 0.0).unwrap().density_kg_m3();
        assert!(rh == 0.0 || relative(rho, dry) > 1e-3);
    }
}

#[test]
fn a_humid_table_reports_its_humidity_and_moist_density() {
    let (t, p, rh) = (308.15, 100_000.0, 90.0);
    let rows = [
        SoundingRow::new(0.0, t).with_pressure_pa(p).with_relative_humidity_percent(rh),
        SoundingRow::new(1_000.0, 301.65).with_relative_humidity_percent(80.0),
        SoundingRow::new(2_000.0, 296.15).with_dew_point_k(288.15),
    ];
    let table = Tabulated::from_rows(AltitudeKind::Geopotential, &rows).unwrap();
    let at = |h: f64| table.moist_state(Altitude::geopotential_m(h).unwrap()).unwrap();
    let surface = at(0.0);
    assert!((surface.humidity.relative_humidity_percent.unwrap() - rh).abs() < 1e-10);
    let e = rh / 100.0 * saturation_vapour_pressure_pa(t, p).unwrap();
    assert_eq!(surface.state.density_kg_m3, humidity::moist_air(t, p, e).unwrap().density_kg_m3());
    assert!((surface.humidity.vapour_pressure_pa - e).abs() <= 1e-12 * e);
    // The state's molecular-scale temperature is the virtual temperature.
    assert!(relative(surface.state.molecular_temperature_k, surface.humidity.virtual_temperature_k) < 1e-15);
    assert!((at(1_000.0).humidity.relative_humidity_percent.unwrap() - 80.0).abs() < 1e-10);
    assert!((at(2_000.0).humidity.dew_point_k.unwrap() - 288.15).abs() < 1e-9);
    // Between rows the vapour follows the interpolated virtual temperature.
    let mid = at(1_500.0);
    assert!(
        mid.humidity.vapour_pressure_pa > 0.0 && mid.humidity.dew_point_k.unwrap() < mid.state.temperature_k
    );
}
