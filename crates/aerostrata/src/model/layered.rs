//! Layers of constant lapse rate in geopotential altitude: the machinery of the standard's
//! lower atmosphere, open to user layers.
//!
//! Within a layer the molecular-scale temperature is linear in geopotential altitude and
//! the pressure follows from the hydrostatic law integrated exactly (U.S. Standard
//! Atmosphere 1976, Part 1, the two pressure equations for zero and non-zero lapse rate).
//! Base pressures are computed once, at construction, never walked at evaluation.

use crate::altitude::{Altitude, AltitudeRange, MAX_GEOPOTENTIAL_M, MIN_GEOPOTENTIAL_M};
use crate::constants::{GMR_K_M, SEA_LEVEL_MOLAR_MASS_KG_KMOL};
use crate::error::{Error, Result};
use crate::gas::Air;
use crate::math::{exp, exp_each, ln_1p, ln_1p_each, pick};

use super::atmosphere::Atmosphere;

/// The steepest lapse rate a layer may have, K per geopotential metre, either sign: 100 K
/// per km, ten times the steepest layers of the free atmosphere (a strong surface
/// inversion, the dry-adiabatic 9.8 K/km, the thermosphere's 12 K/km; common practice, no
/// source), so that a lapse rate in K/km read as K/m is refused, and the inverse solvers
/// stay within their tolerances.
pub const MAX_LAPSE_RATE_K_M: f64 = 0.1;

/// The thinnest layer accepted, geopotential m (a sounding's closest rows,
/// [`crate::model::MIN_ROW_SPACING_M`]): a thinner one carries nothing a flight could use.
pub const MIN_LAYER_THICKNESS_M: f64 = 1.0e-3;

/// One complete layer: its base and its constant lapse rate.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Layer {
    /// Geopotential altitude of the base, m.
    pub base_geopotential_m: f64,
    /// Molecular-scale temperature at the base, K.
    pub base_temperature_k: f64,
    /// Pressure at the base, Pa.
    pub base_pressure_pa: f64,
    /// dT/dH, K per geopotential metre (negative when temperature falls with height).
    pub lapse_rate_k_m: f64,
}

/// A layer as a user describes it: where it ends and how temperature changes in it.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct LayerSpec {
    /// Geopotential altitude of the layer's top, m.
    pub top_geopotential_m: f64,
    /// dT/dH, K per geopotential metre.
    pub lapse_rate_k_m: f64,
}

impl Layer {
    const EMPTY: Layer = Layer {
        base_geopotential_m: 0.0,
        base_temperature_k: 0.0,
        base_pressure_pa: 0.0,
        lapse_rate_k_m: 0.0,
    };

    /// Molecular-scale temperature (K) and pressure (Pa) at geopotential altitude `h_m`,
    /// which may lie outside the layer (the layer is then extended).
    ///
    /// ```text
    /// T = Tb + L (H - Hb)
    /// p = pb (Tb / T)^(g0 M0 / (R* L))          L != 0
    /// p = pb exp(-g0 M0 (H - Hb) / (R* Tb))      L == 0
    /// ```
    /// The power is evaluated as exp(-(g0 M0 / (R* L)) ln(1 + L (H - Hb) / Tb)): the same
    /// number to a few ulps, at about half the cost of a general `pow`, and accurate near
    /// the base where T / Tb is close to 1.
    #[inline]
    pub fn temperature_pressure(&self, h_m: f64) -> (f64, f64) {
        let dh = h_m - self.base_geopotential_m;
        if self.lapse_rate_k_m == 0.0 {
            let p = self.base_pressure_pa * exp(-GMR_K_M * dh / self.base_temperature_k);
            (self.base_temperature_k, p)
        } else {
            let rise = self.lapse_rate_k_m * dh;
            let t = self.base_temperature_k + rise;
            let p = self.base_pressure_pa
                * exp(-(GMR_K_M / self.lapse_rate_k_m) * ln_1p(rise / self.base_temperature_k));
            (t, p)
        }
    }
}

/// Up to eight layers as columns, for the temperature and pressure of many altitudes at
/// once ([`LayerLanes::temperature_pressure`]); the batch path's form of the standard's
/// lower layers.
#[derive(Debug)]
pub(crate) struct LayerLanes {
    /// Base geopotential altitudes, m; +inf past the last layer, which no altitude picks.
    base_m: [f64; LANE_LAYERS],
    base_temperature_k: [f64; LANE_LAYERS],
    base_pressure_pa: [f64; LANE_LAYERS],
    lapse_rate_k_m: [f64; LANE_LAYERS],
    /// -(g0 M0 / (R* L)), the power of T / Tb (unused where L = 0).
    exponent: [f64; LANE_LAYERS],
    /// Room for the steps of [`LayerLanes::temperature_pressure`], made once and reused
    /// (zeroing it at every call was a tenth of a batch's time).
    scratch: [[f64; LANE_CHUNK]; 7],
}

/// The most layers [`LayerLanes`] holds: a power of two, so a layer index is masked, not
/// bounds-checked, and the standard's seven fit.
const LANE_LAYERS: usize = 8;

/// Altitudes [`LayerLanes::temperature_pressure`] works through at a time.
const LANE_CHUNK: usize = 32;

impl LayerLanes {
    /// The columns of `layers`, or `None` for none or more than eight.
    pub(crate) fn new(layers: &[Layer]) -> Option<Self> {
        if layers.is_empty() || layers.len() > LANE_LAYERS {
            return None;
        }
        let mut lanes = Self {
            base_m: [f64::INFINITY; LANE_LAYERS],
            base_temperature_k: [1.0; LANE_LAYERS],
            base_pressure_pa: [1.0; LANE_LAYERS],
            lapse_rate_k_m: [0.0; LANE_LAYERS],
            exponent: [0.0; LANE_LAYERS],
            scratch: [[0.0; LANE_CHUNK]; 7],
        };
        for (i, layer) in layers.iter().enumerate() {
            lanes.base_m[i] = layer.base_geopotential_m;
            lanes.base_temperature_k[i] = layer.base_temperature_k;
            lanes.base_pressure_pa[i] = layer.base_pressure_pa;
            lanes.lapse_rate_k_m[i] = layer.lapse_rate_k_m;
            if layer.lapse_rate_k_m != 0.0 {
                lanes.exponent[i] = -(GMR_K_M / layer.lapse_rate_k_m);
            }
        }
        Some(lanes)
    }

    /// Molecular-scale temperature (K) and pressure (Pa) at each geopotential altitude of
    /// `h_m`, into `temperature_k` and `pressure_pa` (as long; extra length is left alone),
    /// bit for bit [`Layer::temperature_pressure`] of the layer [`Layered`]'s search picks
    /// (the last whose base is at or below h; the first below every base). The same
    /// expressions, a step at a time over all the altitudes, without branches: the layer
    /// by counting the bases at or below h, both of the layer's pressure laws computed and
    /// one chosen, the logarithm and the exponential through `math`'s lane kernels.
    pub(crate) fn temperature_pressure(
        &mut self,
        h_m: &[f64],
        temperature_k: &mut [f64],
        pressure_pa: &mut [f64],
    ) {
        let chunks = h_m.chunks(LANE_CHUNK).zip(temperature_k.chunks_mut(LANE_CHUNK));
        for ((h_m, temperature_k), pressure_pa) in chunks.zip(pressure_pa.chunks_mut(LANE_CHUNK)) {
            let n = h_m.len().min(temperature_k.len()).min(pressure_pa.len());
            let (h_m, temperature_k, pressure_pa) =
                (&h_m[..n], &mut temperature_k[..n], &mut pressure_pa[..n]);
            let [dh, base_t, lapse, exponent, base_p, quotient, ratio] = &mut self.scratch;
            // Each step a loop of its own: the gathers of the layers' values (loads by
            // index, which no baseline vector unit has) apart from the arithmetic, which
            // then runs lane-wise. The layer of each altitude is the number of bases at or
            // below it: on x86-64 counted base by base in a loop of its own (a compare and
            // an add a lane, which vectorise: 3 % off a batch), in V8 within the gathers
            // (there the loop of its own made the batch 13 to 19 % slower). The same count.
            #[cfg(not(target_arch = "wasm32"))]
            let mut layer = [0u64; LANE_CHUNK];
            #[cfg(not(target_arch = "wasm32"))]
            for &b in &self.base_m[1..] {
                for (i, &h) in layer.iter_mut().zip(h_m) {
                    *i += u64::from(b <= h);
                }
            }
            for (j, &h) in h_m.iter().enumerate() {
                #[cfg(not(target_arch = "wasm32"))]
                let i = (layer[j] as usize) % LANE_LAYERS;
                #[cfg(target_arch = "wasm32")]
                let i = self.base_m[1..].iter().map(|&b| usize::from(b <= h)).sum::<usize>() % LANE_LAYERS;
                dh[j] = h - self.base_m[i];
                base_t[j] = self.base_temperature_k[i];
                lapse[j] = self.lapse_rate_k_m[i];
                exponent[j] = self.exponent[i];
                base_p[j] = self.base_pressure_pa[i];
            }
            // One division a lane: by Tb, of -g0 M0 dH / R* in an isothermal layer (the
            // exponential's argument) and of L dH in the others (the logarithm's, which
            // the isothermal lanes take as 0, inside its kernel).
            for j in 0..n {
                let (dh, tb, isothermal) = (dh[j], base_t[j], lapse[j] == 0.0);
                let rise = lapse[j] * dh;
                temperature_k[j] = pick(isothermal, tb, tb + rise);
                quotient[j] = pick(isothermal, -GMR_K_M * dh, rise) / tb;
                ratio[j] = pick(isothermal, 0.0, quotient[j]);
            }
            // The pressures' room holds the logarithms, then `ratio` the exponential's
            // argument, then the pressures' room the exponentials.
            ln_1p_each(&ratio[..n], pressure_pa);
            for j in 0..n {
                ratio[j] = pick(lapse[j] == 0.0, quotient[j], exponent[j] * pressure_pa[j]);
            }
            exp_each(&ratio[..n], pressure_pa);
            for (p, &pb) in pressure_pa.iter_mut().zip(base_p.iter()) {
                *p *= pb;
            }
        }
    }
}

/// An atmosphere of layers with constant lapse rate, dry air of the standard's sea-level
/// composition (M = M0, so kinetic and molecular-scale temperature coincide).
///
/// `S` is the storage: an array `[Layer; N]` (no allocation; see
/// [`Layered::from_lapse_rates`]), a borrowed slice, or with the `alloc` feature a
/// `Vec<Layer>`. The model is defined from the first base to the last top, in
/// geopotential altitude.
///
/// ```
/// use aerostrata::{Altitude, Atmosphere, Layered, LayerSpec};
/// // An invented two-layer desert profile: a steep surface lapse, then isothermal.
/// let desert = Layered::from_lapse_rates(0.0, 318.15, 100_800.0, &[
///     LayerSpec { top_geopotential_m: 3_000.0, lapse_rate_k_m: -0.0095 },
///     LayerSpec { top_geopotential_m: 12_000.0, lapse_rate_k_m: 0.0 },
/// ])?;
/// let s = desert.state(Altitude::geopotential_m(5_000.0)?)?;
/// assert!((s.temperature_k - 289.65).abs() < 1e-9);
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Layered<S> {
    layers: S,
    range: AltitudeRange,
}

/// Relative mismatch allowed between a layer's computed top and the next layer's given
/// base in [`Layered::from_layers`]: loose enough for values typed to 10 digits, tight
/// enough to catch a wrong layer.
const CONTINUITY_TOLERANCE: f64 = 1e-9;

impl<S: AsRef<[Layer]>> Layered<S> {
    /// A model from complete layers, checked for consistency, defined from the first
    /// base up to `top_geopotential_m`.
    ///
    /// # Errors
    /// [`Error::InvalidLayer`] when there are no layers, a value is not finite, a base
    /// temperature or pressure is not positive, the bases do not increase strictly, the
    /// top is not above the last base, the temperature reaches 0 K inside a layer, or a
    /// base temperature or pressure differs from the layer below's top by more than
    /// 1e-9 relative.
    pub fn from_layers(layers: S, top_geopotential_m: f64) -> Result<Self> {
        let list = layers.as_ref();
        let Some(first) = list.first() else {
            return Err(invalid(0, "at least one layer is needed; layer count", 0.0));
        };
        for (index, layer) in list.iter().enumerate() {
            check_layer_values(index, layer)?;
        }
        for (index, pair) in list.windows(2).enumerate() {
            let (below, above) = (&pair[0], &pair[1]);
            let index = index + 1;
            if above.base_geopotential_m <= below.base_geopotential_m {
                return Err(invalid(
                    index,
                    "base geopotential altitude (m) must be above the layer below's base",
                    above.base_geopotential_m,
                ));
            }
            let (t_top, p_top) = below.temperature_pressure(above.base_geopotential_m);
            check_top_temperature(index - 1, t_top)?;
            if !close(above.base_temperature_k, t_top) {
                return Err(invalid(
                    index,
                    "base temperature (K) must continue the layer below within 1e-9 relative",
                    above.base_temperature_k,
                ));
            }
            if !close(above.base_pressure_pa, p_top) {
                return Err(invalid(
                    index,
                    "base pressure (Pa) must continue the layer below within 1e-9 relative",
                    above.base_pressure_pa,
                ));
            }
        }
        let last_index = list.len() - 1;
        let last = &list[last_index];
        check_top(last_index, last, top_geopotential_m)?;
        let range = AltitudeRange::from_geopotential(first.base_geopotential_m, top_geopotential_m);
        Ok(Self { layers, range })
    }

    /// A model over trusted layers and range (the standard's, typed from its tables).
    pub(crate) const fn from_trusted(layers: S, range: AltitudeRange) -> Self {
        Self { layers, range }
    }

    /// The layers, lowest first.
    pub fn layers(&self) -> &[Layer] {
        self.layers.as_ref()
    }

    /// Extends the lowest layer down to `bottom_geopotential_m` (for example below sea
    /// level), keeping its lapse rate.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] when the new bottom is not finite, is above the first base
    /// or below the lowest representable geopotential altitude;
    /// [`Error::InvalidLayer`] when the temperature would reach 0 K.
    pub fn extend_below(self, bottom_geopotential_m: f64) -> Result<Self> {
        let first = self.layers.as_ref()[0];
        crate::error::within(
            "bottom geopotential altitude",
            "m",
            bottom_geopotential_m,
            MIN_GEOPOTENTIAL_M,
            first.base_geopotential_m,
        )?;
        let (t, _) = first.temperature_pressure(bottom_geopotential_m);
        check_top_temperature(0, t)?;
        let range = AltitudeRange::from_geopotential(bottom_geopotential_m, self.range.geopotential_max_m);
        Ok(Self { layers: self.layers, range })
    }

    /// Molecular-scale temperature (K) and pressure (Pa) at a geopotential altitude the
    /// caller has checked against the range.
    #[inline]
    pub(crate) fn temperature_pressure(&self, h_m: f64) -> (f64, f64) {
        let layers = self.layers.as_ref();
        // The last layer whose base is at or below h; the first layer also serves below
        // its base when the range was extended downward.
        let index = layers.partition_point(|layer| layer.base_geopotential_m <= h_m);
        layers[index.saturating_sub(1)].temperature_pressure(h_m)
    }
}

impl<const N: usize> Layered<[Layer; N]> {
    /// A model of `N` layers, stacked from a base (`base_geopotential_m`, with temperature
    /// `base_temperature_k` and pressure `base_pressure_pa`) by each layer's top and lapse
    /// rate. Base temperatures and pressures are computed here, once.
    ///
    /// # Errors
    /// [`Error::InvalidLayer`] for no layers, non-finite values, a non-positive base
    /// temperature or pressure, a top not above its base or above the highest
    /// representable altitude, a temperature that reaches 0 K, or a pressure that
    /// underflows to zero.
    pub fn from_lapse_rates(
        base_geopotential_m: f64,
        base_temperature_k: f64,
        base_pressure_pa: f64,
        specs: &[LayerSpec; N],
    ) -> Result<Self> {
        let mut layers = [Layer::EMPTY; N];
        let top = stack(base_geopotential_m, base_temperature_k, base_pressure_pa, specs, &mut layers)?;
        let range = AltitudeRange::from_geopotential(base_geopotential_m, top);
        Ok(Self { layers, range })
    }
}

#[cfg(feature = "alloc")]
impl Layered<alloc::vec::Vec<Layer>> {
    /// As [`Layered::from_lapse_rates`], for a number of layers known only at run time.
    ///
    /// # Errors
    /// As [`Layered::from_lapse_rates`].
    pub fn from_lapse_rates_vec(
        base_geopotential_m: f64,
        base_temperature_k: f64,
        base_pressure_pa: f64,
        specs: &[LayerSpec],
    ) -> Result<Self> {
        let mut layers = alloc::vec![Layer::EMPTY; specs.len()];
        let top = stack(base_geopotential_m, base_temperature_k, base_pressure_pa, specs, &mut layers)?;
        let range = AltitudeRange::from_geopotential(base_geopotential_m, top);
        Ok(Self { layers, range })
    }
}

impl<S: AsRef<[Layer]>> Atmosphere for Layered<S> {
    fn range(&self) -> AltitudeRange {
        self.range
    }

    fn air(&self, altitude: Altitude) -> Result<Air> {
        let h = self.range.check(altitude)?.geopotential().meters();
        let (t, p) = self.temperature_pressure(h);
        Air::new(t, p, SEA_LEVEL_MOLAR_MASS_KG_KMOL)
    }
}

/// Fills `out` (as long as `specs`) with the layers stacked from the base; returns the top.
fn stack(
    base_geopotential_m: f64,
    base_temperature_k: f64,
    base_pressure_pa: f64,
    specs: &[LayerSpec],
    out: &mut [Layer],
) -> Result<f64> {
    if specs.is_empty() {
        return Err(invalid(0, "at least one layer is needed; layer count", 0.0));
    }
    let mut base = Layer {
        base_geopotential_m,
        base_temperature_k,
        base_pressure_pa,
        lapse_rate_k_m: specs[0].lapse_rate_k_m,
    };
    for (index, (spec, slot)) in specs.iter().zip(out.iter_mut()).enumerate() {
        base.lapse_rate_k_m = spec.lapse_rate_k_m;
        check_layer_values(index, &base)?;
        check_top(index, &base, spec.top_geopotential_m)?;
        *slot = base;
        let (t, p) = base.temperature_pressure(spec.top_geopotential_m);
        if p.partial_cmp(&0.0) != Some(core::cmp::Ordering::Greater) {
            return Err(invalid(index, "pressure must stay above 0 Pa up to the top; top pressure (Pa)", p));
        }
        base = Layer {
            base_geopotential_m: spec.top_geopotential_m,
            base_temperature_k: t,
            base_pressure_pa: p,
            lapse_rate_k_m: 0.0,
        };
    }
    Ok(base.base_geopotential_m)
}

fn check_layer_values(index: usize, layer: &Layer) -> Result<()> {
    if !(MIN_GEOPOTENTIAL_M..=MAX_GEOPOTENTIAL_M).contains(&layer.base_geopotential_m) {
        return Err(invalid(
            index,
            "base geopotential altitude (m) must be finite and within -1.19e6 to 3.89e6 m",
            layer.base_geopotential_m,
        ));
    }
    if !(layer.base_temperature_k.is_finite() && layer.base_temperature_k > 0.0) {
        return Err(invalid(
            index,
            "base temperature (K) must be finite and above 0 K",
            layer.base_temperature_k,
        ));
    }
    if !(layer.base_pressure_pa.is_finite() && layer.base_pressure_pa > 0.0) {
        return Err(invalid(
            index,
            "base pressure (Pa) must be finite and above 0 Pa",
            layer.base_pressure_pa,
        ));
    }
    if !(layer.lapse_rate_k_m.is_finite() && layer.lapse_rate_k_m.abs() <= MAX_LAPSE_RATE_K_M) {
        return Err(invalid(
            index,
            "lapse rate (K/m) must be finite and within -0.1 to 0.1 K/m (100 K per km)",
            layer.lapse_rate_k_m,
        ));
    }
    Ok(())
}

fn check_top(index: usize, layer: &Layer, top_geopotential_m: f64) -> Result<()> {
    let thick_enough = top_geopotential_m - layer.base_geopotential_m >= MIN_LAYER_THICKNESS_M;
    if !(thick_enough && top_geopotential_m <= MAX_GEOPOTENTIAL_M) {
        return Err(invalid(
            index,
            "top geopotential altitude (m) must be finite, at least 1 mm above the layer's base and at most \
             3.89e6 m",
            top_geopotential_m,
        ));
    }
    let (t_top, _) = layer.temperature_pressure(top_geopotential_m);
    check_top_temperature(index, t_top)
}

fn check_top_temperature(index: usize, t_top: f64) -> Result<()> {
    if t_top > 0.0 && t_top.is_finite() {
        Ok(())
    } else {
        Err(invalid(index, "temperature must stay above 0 K through the layer; top temperature (K)", t_top))
    }
}

fn close(given: f64, computed: f64) -> bool {
    (given - computed).abs() <= CONTINUITY_TOLERANCE * computed.abs()
}

fn invalid(index: usize, problem: &'static str, value: f64) -> Error {
    Error::InvalidLayer { index, problem, value }
}

deserialize_through! {
    /// What deserialisation reads before [`Layered::from_layers`] (and, for a range that
    /// reaches below the first base, [`Layered::extend_below`]) validates it.
    LayeredParts<S: AsRef<[Layer]>> { layers: S, range: AltitudeRange } => Layered<S>,
    {
        let bottom = range.geopotential_min_m;
        let model = Layered::from_layers(layers, range.geopotential_max_m)?;
        match model.layers().first() {
            Some(first) if bottom < first.base_geopotential_m => model.extend_below(bottom),
            _ => Ok(model),
        }
    }
}
