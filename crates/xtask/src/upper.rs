//! `cargo xtask upper-table [--check]`: the number densities of the U.S. Standard
//! Atmosphere 1976 above 86 km, integrated once from the standard's diffusion equations
//! and written as the compact table the core interpolates
//! (crates/aerostrata/src/model/upper/upper_table.rs: data only), with where its nodes lie
//! and the digest of the table as the upper part's file (upper_layout.rs beside it, in the
//! `Segment` type of its sibling segment.rs; the core compiles the layout in with
//! `upper-loadable` too, and refuses a loaded file whose digest is not this one).
//!
//! The equations and every coefficient: U.S. Standard Atmosphere, 1976, Part 1 (the
//! section on the high-altitude region: molecular and eddy diffusion, thermal diffusion
//! for He and H, the vertical-flow terms, the hydrogen flux). The temperature is the
//! core's own closed form, so the table and the model cannot disagree about it.
//!
//! Method: classical fourth-order Runge-Kutta on y = ln n for N2, O, O2, Ar and He from
//! 86 km up, with a fixed step of 5 m, restarted at every altitude where a coefficient
//! changes form; then hydrogen (linear in n_H, because of its flux term) from its 500 km
//! value down and up to 1000 km with a 10 m step over the stored densities. The standard
//! defines hydrogen from 150 km up only; below, its own equation (flux, molecular and the
//! standard's eddy diffusion) is continued down to 86 km, so n_H is continuous at 150 km
//! instead of appearing there at once (see `hydrogen_rhs`).
//! The integration error is estimated by repeating with twice the step (RK4: the error
//! at step h is about 1/15 of the difference) and must stay below 1e-10 in ln n.

use std::fmt::Write as _;
use std::fs;
use std::path::Path;

use aerostrata::constants::{EARTH_RADIUS_M, G0_M_S2, GAS_CONSTANT_J_KMOL_K, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use aerostrata::model::upper::{tables_digest, temperature, MOLAR_MASS_KG_KMOL, TABLES_FORMAT, TABLES_MAGIC};

pub const TABLE: &str = "crates/aerostrata/src/model/upper/upper_table.rs";
/// The generated layout: the node runs, the node count and the tables' digest.
pub const LAYOUT: &str = "crates/aerostrata/src/model/upper/upper_layout.rs";

/// RK4 step for the five diffusing species, m.
const STEP_M: f64 = 5.0;
/// Integration error allowed in ln n (the 1e-10).
pub const INTEGRATION_TOLERANCE: f64 = 1e-10;
/// Interpolation error allowed in ln n (1e-6 relative in n).
pub const INTERPOLATION_TOLERANCE: f64 = 1e-6;

/// Number densities at 86 km, 1/m^3: N2, O, O2, Ar, He (the standard's boundary values).
const N_86: [f64; 5] = [1.129794e20, 8.6e16, 3.030898e19, 1.351400e18, 7.5817e14];
/// Molecular diffusion: D_i = a_i / N_i (T / 273.15)^b_i, a_i in 1/(m s); O, O2, Ar, He, H.
/// The standard computes the species in sequence, so N_i is the density of what comes
/// before: N2 alone for O and O2, N2 + O + O2 for Ar and He, all five for H.
const DIFFUSION_A: [f64; 5] = [6.986e20, 4.863e20, 4.487e20, 1.700e21, 3.305e21];
const DIFFUSION_B: [f64; 5] = [0.750, 0.750, 0.870, 0.691, 0.500];
/// Thermal diffusion factors, O, O2, Ar, He, H.
const ALPHA: [f64; 5] = [0.0, 0.0, 0.0, -0.40, -0.25];
/// Vertical-flow terms v/(D+K) = Q (Z - U)^2 exp(-W (Z - U)^3), Z in km, result in 1/km;
/// O, O2, Ar, He.
const FLOW_Q: [f64; 4] = [-5.809644e-4, 1.366212e-4, 9.434079e-5, -2.457369e-4];
const FLOW_U_KM: [f64; 4] = [56.90311, 86.0, 86.0, 86.0];
const FLOW_W: [f64; 4] = [2.706240e-5, 8.333333e-5, 8.333333e-5, 6.666667e-4];
/// The second flow term, for atomic oxygen below 97 km only.
const FLOW_Q_O_LOW: f64 = -3.416248e-3;
const FLOW_U_O_LOW_KM: f64 = 97.0;
const FLOW_W_O_LOW: f64 = 5.008765e-4;
/// Eddy diffusion: K7 = 120 m^2/s to 95 km, decaying to zero at 115 km.
const EDDY_K7: f64 = 120.0;
/// Hydrogen: flux phi, 1/(m^2 s), and its density at 500 km, 1/m^3.
const HYDROGEN_FLUX: f64 = 7.2e11;
const HYDROGEN_500: f64 = 8.0e10;
const HYDROGEN_FROM_M: f64 = 150_000.0;
const HYDROGEN_ANCHOR_M: f64 = 500_000.0;

/// Altitudes (m) where a coefficient changes form: the integration restarts at each, and
/// each is a table node (a slope may jump there).
const BREAKS_M: [f64; 11] = [86e3, 91e3, 95e3, 97e3, 100e3, 110e3, 115e3, 120e3, 150e3, 500e3, 1000e3];

/// The table's runs of equally spaced nodes (start, end, spacing; m), tiling 86 to 1000 km
/// with a node on every break: fine where the profiles bend (diffusive separation, the
/// elliptical temperature steepening toward 110 km, the rapid rise above 120 km),
/// coarse above where they are nearly exponential. Chosen so the interpolation error
/// stays under half of [`INTERPOLATION_TOLERANCE`] (the rest is margin for the f32 slopes
/// and rounding at run time); the generator checks it.
const NODE_SEGMENTS: [(f64, f64, f64); 15] = [
    (86e3, 91e3, 250.0),
    (91e3, 95e3, 250.0),
    (95e3, 97e3, 500.0),
    (97e3, 100e3, 500.0),
    (100e3, 106e3, 500.0),
    (106e3, 110e3, 200.0),
    (110e3, 115e3, 250.0),
    (115e3, 120e3, 500.0),
    (120e3, 130e3, 500.0),
    (130e3, 150e3, 1000.0),
    (150e3, 200e3, 2500.0),
    (200e3, 300e3, 5000.0),
    (300e3, 500e3, 10000.0),
    (500e3, 700e3, 20000.0),
    (700e3, 1000e3, 50000.0),
];

/// The background weight in the mixing terms: M0 while mixed (to 100 km), N2 above.
fn background_molar_mass(regime_z_m: f64) -> f64 {
    if regime_z_m < 100e3 {
        SEA_LEVEL_MOLAR_MASS_KG_KMOL
    } else {
        MOLAR_MASS_KG_KMOL[0]
    }
}

fn eddy(z_m: f64, regime_z_m: f64) -> f64 {
    if regime_z_m < 95e3 {
        EDDY_K7
    } else if regime_z_m < 115e3 {
        let x = z_m / 1000.0 - 95.0;
        EDDY_K7 * libm::exp(1.0 - 400.0 / (400.0 - x * x))
    } else {
        0.0
    }
}

/// v_i / (D_i + K) for O, O2, Ar, He (index 0..4), 1/m.
fn flow(species: usize, z_m: f64, regime_z_m: f64) -> f64 {
    let z = z_m / 1000.0;
    let d = z - FLOW_U_KM[species];
    let mut per_km = FLOW_Q[species] * d * d * libm::exp(-FLOW_W[species] * d * d * d);
    if species == 0 && regime_z_m < 97e3 {
        let d = FLOW_U_O_LOW_KM - z;
        per_km += FLOW_Q_O_LOW * d * d * libm::exp(-FLOW_W_O_LOW * d * d * d);
    }
    per_km / 1000.0
}

/// The core's temperature profile at an altitude of the integration, 86 to 1000 km (the
/// integration never steps outside it; NaN would show in the table's check if it did).
fn temperature_at(z_m: f64) -> (f64, f64) {
    temperature(z_m).unwrap_or((f64::NAN, f64::NAN))
}

fn gravity(z_m: f64) -> f64 {
    let ratio = EARTH_RADIUS_M / (EARTH_RADIUS_M + z_m);
    G0_M_S2 * ratio * ratio
}

/// d(ln n)/dZ of N2, O, O2, Ar, He at `z_m`, with the coefficient forms of the piece
/// containing `regime_z_m` (which settles the side at a break).
fn rhs(z_m: f64, y: &[f64; 5], regime_z_m: f64) -> [f64; 5] {
    let (t, dt_dz) = temperature_at(z_m);
    let g = gravity(z_m);
    let mb = background_molar_mass(regime_z_m);
    let k = eddy(z_m, regime_z_m);
    let n: [f64; 5] = y.map(libm::exp);
    let background = [n[0], n[0], n[0] + n[1] + n[2], n[0] + n[1] + n[2]];
    let thermal = dt_dz / t;
    let per_weight = g / (GAS_CONSTANT_J_KMOL_K * t);
    let mut out = [0.0; 5];
    out[0] = -(thermal + mb * per_weight);
    for i in 1..5 {
        let j = i - 1;
        let d = DIFFUSION_A[j] / background[j] * libm::pow(t / 273.15, DIFFUSION_B[j]);
        let share = d / (d + k);
        let weight = MOLAR_MASS_KG_KMOL[i] + mb * k / d + ALPHA[j] * GAS_CONSTANT_J_KMOL_K / g * dt_dz;
        out[i] = -(thermal + per_weight * share * weight + flow(j, z_m, regime_z_m));
    }
    out
}

/// d(n_H)/dZ at `z_m` for hydrogen density `n_h` over background density `total` (the
/// other five species), with the coefficient forms of the piece containing `regime_z_m`.
///
/// The flux form of the species' equations, with the hydrogen flux phi in place of a
/// fitted flow term:
///   dn/dZ = -n [(1 + alpha D/(D+K)) T'/T + g (D M_H + K M) / ((D+K) R T)] - phi/(D+K).
/// Above 115 km, where K = 0, it is the standard's hydrogen equation; below 150 km the
/// standard gives no hydrogen, and this continues the same equation down to 86 km with
/// the standard's K and background weight M, as for the other species. Integrated
/// downward it is well behaved: n_H grows downward like its own scale height and the
/// flux term, both positive, so n_H stays positive and smooth, and its share of N falls
/// from 7.3e-6 at 150 km to 1.7e-6 at 86 km.
fn hydrogen_rhs(z_m: f64, n_h: f64, total: f64, regime_z_m: f64) -> f64 {
    let (t, dt_dz) = temperature_at(z_m);
    let d = DIFFUSION_A[4] / total * libm::pow(t / 273.15, DIFFUSION_B[4]);
    let k = eddy(z_m, regime_z_m);
    let share = d / (d + k);
    let weight = MOLAR_MASS_KG_KMOL[5] * share + background_molar_mass(regime_z_m) * (1.0 - share);
    let per_weight = gravity(z_m) * weight / (GAS_CONSTANT_J_KMOL_K * t);
    -n_h * ((1.0 + ALPHA[4] * share) * dt_dz / t + per_weight) - HYDROGEN_FLUX / (d + k)
}

/// The integrated profiles at every multiple of the step from 86 to 1000 km.
pub struct Solution {
    pub step_m: f64,
    /// ln n of N2, O, O2, Ar, He at 86 km + i step.
    pub ln_n: Vec<[f64; 5]>,
    /// n_H at 86 km + i step at even i (0 at odd i); below 150 km the continuation.
    pub n_h: Vec<f64>,
}

impl Solution {
    fn index(&self, z_m: f64) -> usize {
        ((z_m - BREAKS_M[0]) / self.step_m).round() as usize
    }

    /// ln n of all six species at a multiple of twice the step.
    pub fn ln_n_at(&self, z_m: f64) -> [f64; 6] {
        let i = self.index(z_m);
        let y = self.ln_n[i];
        [y[0], y[1], y[2], y[3], y[4], self.n_h[i].ln()]
    }
}

/// Integrates everything with RK4 at `step_m` (which must divide 1 km evenly).
pub fn integrate(step_m: f64) -> Solution {
    let count = ((BREAKS_M[10] - BREAKS_M[0]) / step_m).round() as usize;
    let mut ln_n = Vec::with_capacity(count + 1);
    let mut y = N_86.map(f64::ln);
    ln_n.push(y);
    for piece in BREAKS_M.windows(2) {
        let (a, b) = (piece[0], piece[1]);
        let regime = 0.5 * (a + b);
        let steps = ((b - a) / step_m).round() as usize;
        for s in 0..steps {
            let z = a + s as f64 * step_m;
            let h = step_m;
            let k1 = rhs(z, &y, regime);
            let k2 = rhs(z + 0.5 * h, &add(&y, &k1, 0.5 * h), regime);
            let k3 = rhs(z + 0.5 * h, &add(&y, &k2, 0.5 * h), regime);
            let k4 = rhs(z + h, &add(&y, &k3, h), regime);
            for i in 0..5 {
                y[i] += h / 6.0 * (k1[i] + 2.0 * k2[i] + 2.0 * k3[i] + k4[i]);
            }
            ln_n.push(y);
        }
    }
    let total = |i: usize| -> f64 { ln_n[i].iter().map(|v| libm::exp(*v)).sum() };
    let mut n_h = vec![0.0; ln_n.len()];
    let z_of = |i: usize| BREAKS_M[0] + i as f64 * step_m;
    let anchor = ((HYDROGEN_ANCHOR_M - BREAKS_M[0]) / step_m).round() as usize;
    n_h[anchor] = HYDROGEN_500;
    // RK4 with step 2h, so that the midpoints are stored points of the other species.
    // Every break is a multiple of 2h from the anchor, so no step straddles one and its
    // midpoint settles the coefficients' forms.
    for direction in [-1i64, 1] {
        let mut i = anchor as i64;
        let mut n = HYDROGEN_500;
        loop {
            let next = i + 2 * direction;
            if next < 0 || next as usize >= ln_n.len() {
                break;
            }
            let (i0, im, i1) = (i as usize, (i + direction) as usize, next as usize);
            let h = 2.0 * step_m * direction as f64;
            let regime = z_of(im);
            let k1 = hydrogen_rhs(z_of(i0), n, total(i0), regime);
            let k2 = hydrogen_rhs(z_of(im), n + 0.5 * h * k1, total(im), regime);
            let k3 = hydrogen_rhs(z_of(im), n + 0.5 * h * k2, total(im), regime);
            let k4 = hydrogen_rhs(z_of(i1), n + h * k3, total(i1), regime);
            n += h / 6.0 * (k1 + 2.0 * k2 + 2.0 * k3 + k4);
            n_h[i1] = n;
            i = next;
        }
    }
    Solution { step_m, ln_n, n_h }
}

fn add(y: &[f64; 5], k: &[f64; 5], h: f64) -> [f64; 5] {
    core::array::from_fn(|i| y[i] + h * k[i])
}

/// One table node: altitude, ln n of the six species, and their slopes d(ln n)/dZ with
/// the coefficient forms of the segment it belongs to.
struct Node {
    ln_n: [f64; 6],
    slope: [f64; 6],
}

fn node(solution: &Solution, z_m: f64, regime_z_m: f64) -> Node {
    let i = solution.index(z_m);
    let y = solution.ln_n[i];
    let d = rhs(z_m, &y, regime_z_m);
    let n_h = solution.n_h[i];
    let total: f64 = y.iter().map(|v| libm::exp(*v)).sum();
    let (h_value, h_slope) = (n_h.ln(), hydrogen_rhs(z_m, n_h, total, regime_z_m) / n_h);
    Node { ln_n: [y[0], y[1], y[2], y[3], y[4], h_value], slope: [d[0], d[1], d[2], d[3], d[4], h_slope] }
}

/// The generated sources (the table, the layout), and the worst interpolation error of the
/// table they describe against the integration, in ln n.
fn generate(solution: &Solution, integration_error: f64, verbose: bool) -> (String, String, f64) {
    let mut segments = String::new();
    let mut values = String::new();
    let mut slopes = String::new();
    // The table as the upper part's file (model/upper/tables.rs): the header, then every
    // ln n as f64, then every slope as f32, little-endian in table order.
    let mut file_values: Vec<u8> = Vec::new();
    let mut file_slopes: Vec<u8> = Vec::new();
    let mut count = 0usize;
    let mut worst: f64 = 0.0;
    for &(a, b, step) in &NODE_SEGMENTS {
        let mut segment_worst = [0.0f64; 6];
        let regime = 0.5 * (a + b);
        let intervals = ((b - a) / step).round() as usize;
        let _ = writeln!(
            segments,
            "    Segment {{ start_m: {a:?}, end_m: {b:?}, step_m: {step:?}, first: {count}, intervals: {intervals} }},"
        );
        let nodes: Vec<Node> = (0..=intervals).map(|k| node(solution, a + k as f64 * step, regime)).collect();
        for n in &nodes {
            let _ = writeln!(values, "    {:?},", n.ln_n);
            let slope32: Vec<String> = n.slope.iter().map(|s| format!("{:?}", *s as f32)).collect();
            let _ = writeln!(slopes, "    [{}],", slope32.join(", "));
            n.ln_n.iter().for_each(|v| file_values.extend(v.to_le_bytes()));
            n.slope.iter().for_each(|v| file_slopes.extend((*v as f32).to_le_bytes()));
        }
        // The interpolant against the integration at every other stored point inside.
        for (k, pair) in nodes.windows(2).enumerate() {
            let z0 = a + k as f64 * step;
            let inner = (step / (2.0 * solution.step_m)).round() as usize;
            for m in 1..inner {
                let z = z0 + (2 * m) as f64 * solution.step_m;
                let u = (z - z0) / step;
                let truth = solution.ln_n_at(z);
                for s in 0..6 {
                    let slope = |n: &Node| f64::from(n.slope[s] as f32);
                    let value =
                        hermite(pair[0].ln_n[s], pair[1].ln_n[s], slope(&pair[0]), slope(&pair[1]), step, u);
                    segment_worst[s] = segment_worst[s].max((value - truth[s]).abs());
                }
            }
        }
        if verbose {
            let per_species = segment_worst.map(|e| format!("{e:.1e}"));
            eprintln!("  nodes {a}-{b} m every {step} m: worst |d ln n| N2 O O2 Ar He H {per_species:?}");
        }
        worst = segment_worst.iter().fold(worst, |w, e| w.max(*e));
        count += intervals + 1;
    }
    let mut file = Vec::from(TABLES_MAGIC);
    file.extend(TABLES_FORMAT.to_le_bytes());
    file.extend(file_values);
    file.extend(file_slopes);
    let digest = tables_digest(&file);
    let mut table = String::new();
    let _ = write!(
        table,
        "// @generated by `cargo xtask upper-table` (crates/xtask/src/upper.rs); do not edit.\n\
         //\n\
         // ln n (n in 1/m^3) and d(ln n)/dZ (per metre) of N2, O, O2, Ar, He, H at the nodes of\n\
         // each segment, from the diffusion equations of the U.S. Standard Atmosphere 1976\n\
         // integrated by RK4 at a {STEP_M} m step (estimated integration error {integration_error:.1e} in\n\
         // ln n). The standard gives hydrogen from 150 km up; below, its entries continue its\n\
         // equation down to 86 km. Cubic Hermite interpolation of this table departs from the\n\
         // integration by at most {worst:.1e} in ln n. Where the nodes lie: upper_layout.rs.\n\n\
         #[rustfmt::skip]\n\
         pub(super) static LN_DENSITY: [[f64; 6]; {count}] = [\n{values}];\n\n\
         #[rustfmt::skip]\n\
         pub(super) static SLOPE: [[f32; 6]; {count}] = [\n{slopes}];\n"
    );
    let mut layout = String::new();
    let _ = write!(
        layout,
        "// @generated by `cargo xtask upper-table` (crates/xtask/src/upper.rs); do not edit.\n\
         //\n\
         // Where the nodes of upper_table.rs lie, and the digest of that table as the upper\n\
         // part's file (tables.rs): compiled in with `upper` and with `upper-loadable` alike.\n\n\
         use super::segment::Segment;\n\n\
         /// Nodes in the table.\n\
         pub(super) const NODES: usize = {count};\n\n\
         /// The 64-bit FNV-1a digest of the tables' file ({} bytes), the one file\n\
         /// [`load_tables`](super::load_tables) accepts.\n\
         pub const TABLES_DIGEST: u64 = {digest:#018x};\n\n\
         #[rustfmt::skip]\n\
         pub(super) static SEGMENTS: [Segment; {}] = [\n{segments}];\n",
        file.len(),
        NODE_SEGMENTS.len()
    );
    (table, layout, worst)
}

/// The node runs must tile the range, each a whole number of steps of the integration,
/// and no run may straddle a break (its regime would be wrong on one side).
fn check_segments() -> Result<(), String> {
    let mut at = BREAKS_M[0];
    for &(a, b, step) in &NODE_SEGMENTS {
        let whole = |x: f64| (x - x.round()).abs() < 1e-9;
        if a != at || b <= a || !whole((b - a) / step) || !whole(step / (2.0 * STEP_M)) {
            return Err(format!("node run {a}-{b} m by {step} m does not tile the range"));
        }
        if BREAKS_M.iter().any(|&z| z > a && z < b) {
            return Err(format!("node run {a}-{b} m straddles a break"));
        }
        at = b;
    }
    if at == BREAKS_M[BREAKS_M.len() - 1] {
        Ok(())
    } else {
        Err(format!("node runs end at {at} m, not at 1000 km"))
    }
}

/// Cubic Hermite interpolation on one interval of length `step` at fraction `u`; the
/// same arithmetic as the core's.
fn hermite(y0: f64, y1: f64, d0: f64, d1: f64, step: f64, u: f64) -> f64 {
    let u2 = u * u;
    let u3 = u2 * u;
    (2.0 * u3 - 3.0 * u2 + 1.0) * y0
        + (-2.0 * u3 + 3.0 * u2) * y1
        + step * ((u3 - 2.0 * u2 + u) * d0 + (u3 - u2) * d1)
}

/// The largest share n_H/N of hydrogen's continuation below 150 km, and where.
fn hydrogen_share_below_150_km(solution: &Solution) -> (f64, f64) {
    let mut worst = (0.0f64, 0.0);
    for i in (0..solution.ln_n.len()).step_by(2) {
        let z = BREAKS_M[0] + i as f64 * solution.step_m;
        if z > HYDROGEN_FROM_M {
            break;
        }
        let heavy: f64 = solution.ln_n[i].iter().map(|v| libm::exp(*v)).sum();
        let share = solution.n_h[i] / (heavy + solution.n_h[i]);
        if share > worst.0 {
            worst = (share, z);
        }
    }
    worst
}

/// The worst difference in ln n between integrations at `STEP_M` and twice it, over
/// their common points, divided by 15: RK4's error estimate at `STEP_M`.
fn integration_error(fine: &Solution, coarse: &Solution) -> f64 {
    let mut worst: f64 = 0.0;
    for (i, c) in coarse.ln_n.iter().enumerate() {
        let z = BREAKS_M[0] + i as f64 * coarse.step_m;
        let f = fine.ln_n[fine.index(z)];
        for s in 0..5 {
            worst = worst.max((f[s] - c[s]).abs());
        }
        // Hydrogen lives on every other point of each solution.
        if i % 2 == 0 {
            let (a, b) = (fine.n_h[fine.index(z)], coarse.n_h[i]);
            if a > 0.0 && b > 0.0 {
                worst = worst.max((a.ln() - b.ln()).abs());
            }
        }
    }
    worst / 15.0
}

pub fn run(root: &Path, check_only: bool) -> Result<(), String> {
    check_segments()?;
    let fine = integrate(STEP_M);
    let coarse = integrate(2.0 * STEP_M);
    let error = integration_error(&fine, &coarse);
    if error > INTEGRATION_TOLERANCE {
        return Err(format!("integration error {error:e} exceeds {INTEGRATION_TOLERANCE:e}"));
    }
    let (table, layout, worst) = generate(&fine, error, !check_only);
    if !check_only {
        let (share, at) = hydrogen_share_below_150_km(&fine);
        eprintln!("  hydrogen's continuation below 150 km: n_H/N at most {share:.3e} (at {at} m)");
    }
    if worst > INTERPOLATION_TOLERANCE / 2.0 {
        return Err(format!(
            "table interpolation error {worst:e} exceeds half of {INTERPOLATION_TOLERANCE:e}: refine NODE_SEGMENTS"
        ));
    }
    for (name, source) in [(TABLE, &table), (LAYOUT, &layout)] {
        let path = root.join(name);
        if check_only {
            let committed = fs::read_to_string(&path).unwrap_or_default();
            if committed != *source {
                return Err(format!(
                    "{name} differs from a fresh generation: run `cargo xtask upper-table` and commit it"
                ));
            }
        } else {
            fs::write(&path, source).map_err(|e| format!("cannot write {}: {e}", path.display()))?;
        }
    }
    eprintln!("upper table: integration error {error:.1e}, interpolation error {worst:.1e} (ln n)");
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata::{Altitude, US1976};

    /// The core's run-time interpolation (f32 slopes and all) against this generator's
    /// integration at every 10 m from 86 to 1000 km: within 1e-6 relative in every species.
    #[test]
    fn runtime_interpolation_is_within_1e_6_of_the_integration() {
        let solution = integrate(STEP_M);
        let mut worst: f64 = 0.0;
        let mut points = 0;
        for i in (0..solution.ln_n.len()).step_by(2) {
            let z = BREAKS_M[0] + i as f64 * STEP_M;
            let species = US1976.species(Altitude::geometric_m(z).unwrap()).unwrap().as_array();
            let truth = solution.ln_n_at(z);
            for s in 0..6 {
                worst = worst.max((species[s].ln() - truth[s]).abs());
            }
            points += 1;
        }
        assert!(points > 90_000);
        assert!(worst <= INTERPOLATION_TOLERANCE, "worst interpolation error {worst:e}");
    }

    /// Hydrogen below 150 km, where the standard lists none, is its equation continued
    /// downward: positive, falling with altitude, its share of N largest at 150 km, and
    /// meeting the standard's hydrogen there in value (one integration runs through it)
    /// and in slope (the equation's two sides agree at 150 km, where K = 0).
    #[test]
    fn hydrogen_continuation_is_small_falls_and_meets_the_standard_at_150_km() {
        let solution = integrate(STEP_M);
        let heavy = |i: usize| -> f64 { solution.ln_n[i].iter().map(|v| libm::exp(*v)).sum() };
        let share = |i: usize| solution.n_h[i] / (heavy(i) + solution.n_h[i]);
        let top = solution.index(HYDROGEN_FROM_M);
        let mut below = f64::INFINITY;
        for i in (0..=top).step_by(2) {
            let n_h = solution.n_h[i];
            assert!(n_h > 0.0 && n_h < below, "n_H {n_h} at {} m", BREAKS_M[0] + i as f64 * STEP_M);
            assert!(share(i) <= share(top));
            below = n_h;
        }
        assert!(share(0) > 1e-6 && share(top) < 1e-5, "{} {}", share(0), share(top));
        let (n_h, total) = (solution.n_h[top], heavy(top));
        let from_below = hydrogen_rhs(HYDROGEN_FROM_M, n_h, total, 140e3);
        let from_above = hydrogen_rhs(HYDROGEN_FROM_M, n_h, total, 175e3);
        assert_eq!(from_below.to_bits(), from_above.to_bits());
    }

    #[test]
    fn integration_converges() {
        let error = integration_error(&integrate(STEP_M), &integrate(2.0 * STEP_M));
        assert!(error <= INTEGRATION_TOLERANCE, "{error:e}");
    }
}
