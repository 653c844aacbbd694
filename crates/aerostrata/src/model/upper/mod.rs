//! The U.S. Standard Atmosphere 1976 above 86 km: closed-form kinetic temperature and
//! the number densities of N2, O, O2, Ar, He and H from a compact generated table.
//!
//! Temperature: the standard's four segments (Part 1: isothermal 86-91 km, elliptical
//! 91-110 km, linear 110-120 km, exponential 120-1000 km). Number densities: the
//! standard's diffusion equations integrated once, off line, by `cargo xtask upper-table`
//! (fixed-step RK4, converged to better than 1e-10; see crates/xtask/src/upper.rs), and
//! stored as ln n and d(ln n)/dZ at nodes; here each ln n is a piecewise cubic Hermite
//! interpolant through those values and slopes, within 1e-6 relative of the generator's
//! own integration everywhere (proved by a test of the generator). No integration at run
//! time. One departure from the standard: hydrogen, which it gives from 150 km up only,
//! is continued below by its own equation ([`HYDROGEN_BASE_M`]). The table is compiled in
//! with the `upper` feature, or loaded at run time with `upper-loadable` ([`load_tables`]).

mod segment;
mod tables;
mod upper_layout;
#[cfg(feature = "upper")]
mod upper_table;

use crate::altitude::AltitudeRange;
use crate::constants::{AVOGADRO_PER_KMOL, EARTH_RADIUS_M};
use crate::error::{Error, Result};
use crate::gas::Air;
use crate::math::{exp, sqrt};
use crate::quantity::Quantity;

#[cfg(all(feature = "upper", feature = "alloc"))]
pub use tables::tables_file;
pub use tables::{
    load_tables, tables_digest, tables_loaded, TABLES_DIGEST, TABLES_FILE_BYTES, TABLES_FORMAT, TABLES_MAGIC,
};
use upper_layout::SEGMENTS;

/// Where the upper part takes over, geometric m (86 km; at exactly 86 km the lower part
/// answers).
pub const BASE_M: f64 = 86_000.0;
/// Top of the standard, geometric m.
pub const TOP_M: f64 = 1_000_000.0;
/// The range of the upper part alone.
pub const RANGE: AltitudeRange = AltitudeRange::from_geometric(BASE_M, TOP_M);

/// Molecular weights of N2, O, O2, Ar, He, H, kg/kmol (the standard's values).
pub const MOLAR_MASS_KG_KMOL: [f64; 6] = [28.0134, 15.9994, 31.9988, 39.948, 4.0026, 1.00797];

/// Hydrogen is part of the standard from 150 km up. Below, the standard lists none;
/// aerostrata carries the continuation of the standard's hydrogen equation down to 86 km
/// (at most 7.3e-6 of N, just below 150 km; 1.7e-6 at 86 km), so that n_H, and with it
/// p, rho and N, are continuous at 150 km.
pub const HYDROGEN_BASE_M: f64 = 150_000.0;

// Temperature segments (the standard's constants, Part 1).
const T7_K: f64 = 186.8673;
const Z8_M: f64 = 91_000.0;
const Z9_M: f64 = 110_000.0;
const T9_K: f64 = 240.0;
const LAPSE_9_K_M: f64 = 0.012;
// The ellipse from (Z8, T7) with zero gradient to (Z9, T9) with gradient L9, temperature
// and gradient continuous at both ends; its constants follow from those five values:
//   r = (T9 - T7) / (L9 (Z9 - Z8)),  A = -(T9 - T7)(1 - r) / (1 - 2r),  Tc = T7 - A,
//   1 / a^2 = (1 - 2r) / ((Z9 - Z8)(1 - r))^2.
// They round to the standard's printed Tc = 263.1905 K, A = -76.3232 K, a = -19.9429 km
// (a unit test below checks it). The printed values themselves are not used: the ellipse
// they describe ends at 239.99973 K, 2.7e-4 K short of T9, so p = N k T would step up by
// 1.1e-6 at 110 km, where the number densities are continuous.
const ELLIPSE_R: f64 = (T9_K - T7_K) / (LAPSE_9_K_M * (Z9_M - Z8_M));
const ELLIPSE_A_K: f64 = -(T9_K - T7_K) * (1.0 - ELLIPSE_R) / (1.0 - 2.0 * ELLIPSE_R);
const ELLIPSE_TC_K: f64 = T7_K - ELLIPSE_A_K;
const ELLIPSE_INV_A2_PER_M2: f64 =
    (1.0 - 2.0 * ELLIPSE_R) / ((Z9_M - Z8_M) * (1.0 - ELLIPSE_R) * (Z9_M - Z8_M) * (1.0 - ELLIPSE_R));
const Z10_M: f64 = 120_000.0;
const T10_K: f64 = 360.0;
const T_INF_K: f64 = 1000.0;
const LAMBDA_PER_M: f64 = 0.01875e-3;

/// The six species' number densities at one altitude, 1/m^3.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Species {
    /// Molecular nitrogen.
    pub n2_m3: f64,
    /// Atomic oxygen.
    pub o_m3: f64,
    /// Molecular oxygen.
    pub o2_m3: f64,
    /// Argon.
    pub ar_m3: f64,
    /// Helium.
    pub he_m3: f64,
    /// Atomic hydrogen (below 150 km, where the standard lists none, the continuation
    /// of its equation; see [`HYDROGEN_BASE_M`]).
    pub h_m3: f64,
}

impl Species {
    /// The densities in the standard's order N2, O, O2, Ar, He, H.
    pub fn as_array(&self) -> [f64; 6] {
        [self.n2_m3, self.o_m3, self.o2_m3, self.ar_m3, self.he_m3, self.h_m3]
    }

    /// Total number density, 1/m^3.
    pub fn total_m3(&self) -> f64 {
        self.as_array().iter().sum()
    }

    /// Mass density sum(n_i M_i) / N_A, kg/m^3.
    pub fn density_kg_m3(&self) -> f64 {
        let mass: f64 = self.as_array().iter().zip(MOLAR_MASS_KG_KMOL).map(|(n, m)| n * m).sum();
        mass / AVOGADRO_PER_KMOL
    }

    /// The number density `quantity` names, 1/m^3 ([`Quantity::info`]; the catalogue's
    /// species are in the standard's order, that of [`Species::as_array`]).
    ///
    /// # Errors
    /// [`Error::NotCarried`] for a quantity that is not a species' number density.
    ///
    /// ```
    /// use aerostrata::{Altitude, Quantity, US1976};
    /// # #[cfg(feature = "upper")] {
    /// let n = US1976.species(Altitude::geometric_m(200_000.0)?)?;
    /// assert_eq!(n.get(Quantity::AtomicOxygenNumberDensity)?, n.o_m3);
    /// assert!(n.get(Quantity::Temperature).is_err());
    /// # }
    /// # Ok::<(), aerostrata::Error>(())
    /// ```
    pub fn get(&self, quantity: Quantity) -> Result<f64> {
        use Quantity as Q;
        match quantity {
            Q::NitrogenNumberDensity => Ok(self.n2_m3),
            Q::AtomicOxygenNumberDensity => Ok(self.o_m3),
            Q::OxygenNumberDensity => Ok(self.o2_m3),
            Q::ArgonNumberDensity => Ok(self.ar_m3),
            Q::HeliumNumberDensity => Ok(self.he_m3),
            Q::AtomicHydrogenNumberDensity => Ok(self.h_m3),
            other => {
                Err(Error::NotCarried { quantity: other.name(), result: "the species' number densities" })
            }
        }
    }
}

/// Kinetic temperature (K) and its gradient dT/dZ (K/m) at geometric altitude `z_m`,
/// 86 km <= Z <= 1000 km.
///
/// ```text
/// 86-91 km     T = 186.8673
/// 91-110 km    T = Tc + A sqrt(1 - ((Z - 91 km) / a)^2)      Tc = 263.190480, A = -76.323180, a = -19.942875 km
/// 110-120 km   T = 240 + 12 (Z - 110 km)                     (K, km)
/// 120-1000 km  T = Tinf - (Tinf - 360) exp(-lambda xi)       Tinf = 1000, lambda = 0.01875 /km,
///              xi = (Z - 120 km)(r0 + 120 km) / (r0 + Z)
/// ```
///
/// The ellipse's constants are those that make T and dT/dZ continuous at 91 and 110 km,
/// at full precision; the standard prints them rounded (263.1905, -76.3232, -19.9429 km),
/// which would leave T 2.7e-4 K short of 240 K at 110 km. T and dT/dZ are continuous at
/// every join.
///
/// # Errors
/// [`Error::NotFinite`] or [`Error::OutOfRange`] for an altitude outside [`BASE_M`] to
/// [`TOP_M`].
pub fn temperature(z_m: f64) -> Result<(f64, f64)> {
    Ok(temperature_within(crate::error::within("geometric altitude", "m", z_m, BASE_M, TOP_M)?))
}

/// [`temperature`] at an altitude the caller has checked.
pub(crate) fn temperature_within(z_m: f64) -> (f64, f64) {
    if z_m <= Z8_M {
        (T7_K, 0.0)
    } else if z_m <= Z9_M {
        let dz = z_m - Z8_M;
        let root = sqrt(1.0 - dz * dz * ELLIPSE_INV_A2_PER_M2);
        (ELLIPSE_TC_K + ELLIPSE_A_K * root, -ELLIPSE_A_K * ELLIPSE_INV_A2_PER_M2 * dz / root)
    } else if z_m <= Z10_M {
        (T9_K + LAPSE_9_K_M * (z_m - Z9_M), LAPSE_9_K_M)
    } else {
        let ratio = (EARTH_RADIUS_M + Z10_M) / (EARTH_RADIUS_M + z_m);
        let xi = (z_m - Z10_M) * ratio;
        let decay = (T_INF_K - T10_K) * exp(-LAMBDA_PER_M * xi);
        (T_INF_K - decay, LAMBDA_PER_M * decay * ratio * ratio)
    }
}

/// The geometric altitudes of the table's nodes, m, lowest first; where two runs of
/// nodes meet, the shared altitude appears once.
pub fn table_nodes() -> impl Iterator<Item = f64> {
    SEGMENTS.iter().enumerate().flat_map(|(index, segment)| {
        let skip_first = usize::from(index > 0);
        (skip_first..=segment.intervals as usize).map(move |k| segment.start_m + k as f64 * segment.step_m)
    })
}

/// The species at `z_m`, 86 km <= Z <= 1000 km (the caller checks).
///
/// # Errors
/// [`Error::UpperNotLoaded`] when the tables are neither compiled in nor loaded.
pub(crate) fn species(z_m: f64) -> Result<Species> {
    let (ln_density, slope) = tables::tables(z_m)?;
    // The segment holding z: the first whose end is at or above it.
    let segment = SEGMENTS.iter().find(|s| z_m <= s.end_m).unwrap_or(&SEGMENTS[SEGMENTS.len() - 1]);
    let position = ((z_m - segment.start_m) / segment.step_m).max(0.0);
    let interval = (position as usize).min(segment.intervals as usize - 1);
    let u = position - interval as f64;
    let lower = segment.first as usize + interval;
    let (y0, y1) = (&ln_density[lower], &ln_density[lower + 1]);
    let (d0, d1) = (&slope[lower], &slope[lower + 1]);
    // Cubic Hermite basis on [0, 1]; slopes are per metre, scaled by the step.
    let u2 = u * u;
    let u3 = u2 * u;
    let h00 = 2.0 * u3 - 3.0 * u2 + 1.0;
    let h10 = u3 - 2.0 * u2 + u;
    let h01 = -2.0 * u3 + 3.0 * u2;
    let h11 = u3 - u2;
    let step = segment.step_m;
    let ln_n =
        |i: usize| h00 * y0[i] + h01 * y1[i] + step * (h10 * f64::from(d0[i]) + h11 * f64::from(d1[i]));
    Ok(Species {
        n2_m3: exp(ln_n(0)),
        o_m3: exp(ln_n(1)),
        o2_m3: exp(ln_n(2)),
        ar_m3: exp(ln_n(3)),
        he_m3: exp(ln_n(4)),
        h_m3: exp(ln_n(5)),
    })
}

/// The air at `z_m`, 86 km < Z <= 1000 km (the caller checks).
pub(crate) fn air(z_m: f64) -> Result<Air> {
    let (temperature_k, _) = temperature_within(z_m);
    let species = species(z_m)?;
    Air::from_number_density(temperature_k, species.total_m3(), species.density_kg_m3())
}

/// The species at an altitude the standard's upper part covers, or an error naming the
/// band.
pub(crate) fn species_checked(z_m: f64) -> Result<Species> {
    if (BASE_M..=TOP_M).contains(&z_m) {
        species(z_m)
    } else {
        Err(Error::OutOfRange {
            quantity: "geometric altitude for species number densities",
            unit: "m",
            value: z_m,
            min: BASE_M,
            max: TOP_M,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The ellipse's constants, derived from the joins' conditions, round to the ones the
    /// U.S. Standard Atmosphere 1976 (Part 1) prints: Tc = 263.1905 K, A = -76.3232 K,
    /// a = -19.9429 km. So the derivation is the standard's own, only unrounded.
    #[test]
    fn ellipse_constants_round_to_the_printed_ones() {
        let at_4_decimals = |x: f64| (x * 1e4).round() as i64;
        assert_eq!(at_4_decimals(ELLIPSE_TC_K), 2_631_905);
        assert_eq!(at_4_decimals(ELLIPSE_A_K), -763_232);
        let semi_axis_km = -1.0 / sqrt(ELLIPSE_INV_A2_PER_M2) / 1000.0;
        assert_eq!(at_4_decimals(semi_axis_km), -199_429);
        // And they are not the printed ones: those miss T9 by 2.7e-4 K.
        assert!((ELLIPSE_TC_K - 263.1905).abs() > 1e-5 && (ELLIPSE_A_K + 76.3232).abs() > 1e-5);
    }

    /// The catalogue's species are those of `as_array`, in its order, and `get` gives
    /// each one's value (the doors read them by quantity).
    #[test]
    #[cfg(feature = "upper")]
    fn get_walks_the_catalogue_in_the_standards_order() {
        use crate::quantity::Group;
        let n = species(500_000.0).unwrap();
        let quantities: Vec<Quantity> = Quantity::of_group(Group::Species).collect();
        assert_eq!(quantities.len(), n.as_array().len());
        for (quantity, value) in quantities.iter().zip(n.as_array()) {
            assert_eq!(n.get(*quantity).unwrap().to_bits(), value.to_bits(), "{quantity:?}");
        }
        for quantity in Quantity::ALL.iter().filter(|q| q.info().group != Group::Species) {
            assert!(matches!(n.get(*quantity), Err(Error::NotCarried { .. })), "{quantity:?}");
        }
    }
}
