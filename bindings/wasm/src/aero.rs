//! The point loads, in the default module and the full one: dynamic pressure, drag, Mach,
//! Reynolds and Knudsen numbers, the rarefaction regime, the ballistic coefficient, and
//! the unit factors; each a thin call of the core function of the same name, its
//! arguments read as JS numbers (`number_function!`, which flow.rs shares). Compressible
//! flow, airspeeds, altimetry and drag tables are the full module's (flow.rs).

use alloc::string::String;

use aerostrata::aero::{self, RarefactionRegime};
use aerostrata::units;
use aerostrata::PerfectGas;
use wasm_bindgen::prelude::*;

use crate::error::Js;
use crate::js::{self, record};

/// A function of JS numbers that returns the core's `Result<f64>`: each argument is read
/// with `js::number` (a `TypeError` unless it is a JS number), the core does the rest.
/// After a `;`, the name under which the body gets the perfect gas of a last, optional
/// argument `gamma`, the ratio of specific heats (default 1.4, air; 1.01 to 1.7).
/// Its docs are `#[doc = "..."]` attributes rather than `///` comments: forwarded through
/// a macro, `///` arrives as a raw string that wasm-bindgen would copy into the `.d.ts`
/// with its `r"` prefix.
macro_rules! number_function {
    (
        $(#[doc = $doc:literal])*
        $js:ident => fn $name:ident($($arg:ident as $js_arg:ident),* $(; $gas:ident)? $(,)?) $body:block
    ) => {
        $(#[doc = $doc])*
        #[wasm_bindgen(js_name = $js)]
        pub fn $name(
            $(#[wasm_bindgen(js_name = $js_arg, unchecked_param_type = "number")] $arg: JsValue,)*
            $(#[wasm_bindgen(js_name = gamma, unchecked_optional_param_type = "number")] $gas: JsValue,)?
        ) -> Result<f64, JsValue> {
            $(let $arg = js::number(stringify!($js_arg), &$arg)?;)*
            $(let $gas = gas(&$gas)?;)?
            let result: aerostrata::Result<f64> = $body;
            result.js()
        }
    };
}

/// The perfect gas of ratio of specific heats `gamma` (1.4 when omitted).
pub(crate) fn gas(gamma: &JsValue) -> Result<PerfectGas, JsValue> {
    PerfectGas::new(js::number_or("gamma", gamma, 1.4)?).js()
}

number_function! {
    #[doc = " Dynamic pressure q = rho V^2 / 2, Pa, of air of density `densityKgM3` (kg/m^3)"]
    #[doc = " moving at `velocityMS` (m/s; its sign is ignored)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a density outside 0 to 1e6 kg/m^3 or a speed above 1e8 m/s."]
    dynamicPressurePa => fn dynamic_pressure_pa(density as densityKgM3, velocity as velocityMS) {
        aero::dynamic_pressure_pa(density, velocity)
    }
}

number_function! {
    #[doc = " Dynamic pressure from Mach number, q = gamma p M^2 / 2, Pa, at static pressure"]
    #[doc = " `staticPressurePa` (Pa) and Mach number `mach`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a pressure or Mach number out of range."]
    dynamicPressureFromMachPa => fn dynamic_pressure_from_mach_pa(pressure as staticPressurePa, mach as mach; gas) {
        aero::dynamic_pressure_from_mach_pa(pressure, mach, gas)
    }
}

number_function! {
    #[doc = " Drag D = q Cd A, N, at dynamic pressure `dynamicPressurePa` (Pa) with drag"]
    #[doc = " coefficient `dragCoefficient` on reference area `referenceAreaM2` (m^2)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range (Cd above 0 and at most 100)."]
    dragN => fn drag_n(q as dynamicPressurePa, cd as dragCoefficient, area as referenceAreaM2) {
        aero::drag_n(q, cd, area)
    }
}

number_function! {
    #[doc = " Mach number |V| / a for a speed `velocityMS` (m/s) in air of speed of sound"]
    #[doc = " `speedOfSoundMS` (m/s)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range."]
    machNumber => fn mach_number(velocity as velocityMS, a as speedOfSoundMS) {
        aero::mach_number(velocity, a)
    }
}

number_function! {
    #[doc = " True speed V = M a, m/s, of Mach number `mach` in air of speed of sound"]
    #[doc = " `speedOfSoundMS` (m/s): the inverse of `machNumber`."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range."]
    velocityFromMachMS => fn velocity_from_mach_m_s(mach as mach, a as speedOfSoundMS) {
        aero::velocity_from_mach_m_s(mach, a)
    }
}

number_function! {
    #[doc = " Reynolds number rho |V| L / mu for density `densityKgM3` (kg/m^3), speed"]
    #[doc = " `velocityMS` (m/s), reference length `lengthM` (m) and dynamic viscosity"]
    #[doc = " `dynamicViscosityPaS` (Pa s)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range."]
    reynoldsNumber => fn reynolds_number(
        density as densityKgM3,
        velocity as velocityMS,
        length as lengthM,
        mu as dynamicViscosityPaS,
    ) {
        aero::reynolds_number(density, velocity, length, mu)
    }
}

number_function! {
    #[doc = " Knudsen number lambda / L for a mean free path `meanFreePathM` (m) and a body of"]
    #[doc = " size `lengthM` (m)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range."]
    knudsenNumber => fn knudsen_number(lambda as meanFreePathM, length as lengthM) {
        aero::knudsen_number(lambda, length)
    }
}

number_function! {
    #[doc = " Ballistic coefficient m / (Cd A), kg/m^2, of a body of mass `massKg` (kg) with drag"]
    #[doc = " coefficient `dragCoefficient` on reference area `referenceAreaM2` (m^2)."]
    #[doc = ""]
    #[doc = " Throws a `RangeError` for a value out of range."]
    ballisticCoefficientKgM2 => fn ballistic_coefficient_kg_m2(
        mass as massKg,
        cd as dragCoefficient,
        area as referenceAreaM2,
    ) {
        aero::ballistic_coefficient_kg_m2(mass, cd, area)
    }
}

/// The flow regime of Knudsen number `knudsen`: `"continuum"` (below 0.01), `"slip"`
/// (below 0.1), `"transitional"` (below 10) or `"freeMolecular"`.
///
/// Throws a `RangeError` for a negative or non-finite Knudsen number.
#[wasm_bindgen(js_name = rarefactionRegime, unchecked_return_type = "RarefactionRegime")]
pub fn rarefaction_regime(
    #[wasm_bindgen(js_name = knudsen, unchecked_param_type = "number")] knudsen: JsValue,
) -> Result<String, JsValue> {
    let regime = RarefactionRegime::of(js::number("knudsen", &knudsen)?).js()?;
    Ok(String::from(match regime {
        RarefactionRegime::Continuum => "continuum",
        RarefactionRegime::Slip => "slip",
        RarefactionRegime::Transitional => "transitional",
        RarefactionRegime::FreeMolecular => "freeMolecular",
    }))
}

/// The exact unit factors to SI the core uses at its edges (international foot of 1959,
/// knot, pound-force, slug, inch of mercury per NIST SP 811), for converting at the edges
/// of a page: multiply a value in the unit by its factor to get SI.
#[wasm_bindgen(js_name = unitFactors, unchecked_return_type = "UnitFactors")]
pub fn unit_factors() -> JsValue {
    record(
        "footM,knotMS,poundForceN,psfPa,psiPa,inHgPa,hPaPa,slugKg,slugPerFt3KgM3,rankineK,celsiusZeroK",
        &[
            units::FOOT_M,
            units::KNOT_M_S,
            units::POUND_FORCE_N,
            units::PSF_PA,
            units::PSI_PA,
            units::INHG_PA,
            units::HPA_PA,
            units::SLUG_KG,
            units::SLUG_FT3_KG_M3,
            units::RANKINE_K,
            units::CELSIUS_ZERO_K,
        ],
    )
}
