//! The one language in which every door names a model: `standard`, `offset=+15K`,
//! `isothermal=250K`, `exponential=1.225,8500m`, `sounding=FILE,blend=2000m`,
//! `layers=FILE`. The command line's `--model`, the web page's model selector and the
//! spreadsheet functions' model argument all read it here. Values take units as the
//! unit parser reads them (a bare number is in the SI unit), and each is checked against
//! what it can plausibly be. Files are only named: reading them is the door's business.

use core::fmt;

use crate::units::{self, Plausible, ReadError, Unit};

/// The grammar, for help texts and messages.
pub const GRAMMAR: &str = "standard | offset=DT | hydrostatic-offset=DT[,p0=P] | isothermal=T[,p0=P] \
                           | exponential=RHO0,SCALE_HEIGHT[,T] | sounding=FILE[,blend=DH] | layers=FILE";

/// A model as a spec names it.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum ModelSpec<'a> {
    /// The U.S. Standard Atmosphere 1976.
    Standard,
    /// The standard with every temperature shifted by `offset_k` at the standard's
    /// pressure ([`crate::TemperatureOffset`]).
    Offset {
        /// The offset, K.
        offset_k: f64,
    },
    /// The standard with every temperature shifted by `offset_k` and the pressure in
    /// hydrostatic balance from `sea_level_pressure_pa` ([`crate::HydrostaticOffset`]).
    HydrostaticOffset {
        /// The offset, K.
        offset_k: f64,
        /// The pressure at geopotential altitude 0, Pa (101 325 Pa unless given).
        sea_level_pressure_pa: f64,
    },
    /// An isothermal atmosphere ([`crate::Isothermal`]).
    Isothermal {
        /// Its temperature, K.
        temperature_k: f64,
        /// Its pressure at geopotential altitude 0, Pa (101 325 Pa unless given).
        pressure_pa: f64,
    },
    /// An exponential density profile ([`crate::Exponential`]).
    Exponential {
        /// Density at altitude 0, kg/m^3.
        density_kg_m3: f64,
        /// The height over which the density falls by e, m.
        scale_height_m: f64,
        /// The constant temperature, K (288.15 K unless given).
        temperature_k: f64,
    },
    /// A sounding read from a file (CSV or JSON, as the door reads them).
    Sounding {
        /// The file, as written in the spec.
        path: &'a str,
        /// Blend into the standard over this many geopotential metres beyond the table's
        /// rows (none: outside the rows is an error).
        blend_m: Option<f64>,
    },
    /// User layers of constant lapse rate read from a file.
    Layers {
        /// The file, as written in the spec.
        path: &'a str,
    },
}

/// What is wrong with a spec.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum SpecError<'a> {
    /// The name before `=` is none of the grammar's.
    UnknownModel {
        /// The name as written.
        name: &'a str,
    },
    /// A model that needs a value was given none, or a value is empty.
    Missing {
        /// The model.
        model: &'static str,
        /// What is missing ("an offset DT").
        what: &'static str,
    },
    /// More values than the model takes, or a key it does not know.
    Unexpected {
        /// The model.
        model: &'static str,
        /// The surplus text.
        text: &'a str,
    },
    /// A value is not a plausible value of its kind.
    Value {
        /// The model.
        model: &'static str,
        /// What the value is ("temperature T").
        what: &'static str,
        /// Why it was refused.
        error: ReadError<'a>,
    },
}

impl fmt::Display for SpecError<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        // What a person typed, escaped and cut (units::Quoted).
        let shown = units::Quoted(match self {
            SpecError::UnknownModel { name } => name,
            SpecError::Unexpected { text, .. } => text,
            _ => "",
        });
        match self {
            SpecError::UnknownModel { .. } => {
                write!(f, "unknown model {shown}; a model is one of: {GRAMMAR}")
            }
            SpecError::Missing { model, what } => {
                write!(f, "{model} needs {what}; a model is one of: {GRAMMAR}")
            }
            SpecError::Unexpected { model, .. } => {
                write!(f, "{model} does not take {shown}; a model is one of: {GRAMMAR}")
            }
            SpecError::Value { model, what, error } => write!(f, "{model}: {what}: {error}"),
        }
    }
}

/// A plausible sea-level (altitude 0) density of an exponential model: 0.01 to 10
/// kg/m^3 (Earth's is 1.225; the band takes other planets' and test atmospheres; common
/// practice, no source).
const SEA_LEVEL_DENSITY: Plausible = Plausible { min_si: 0.01, max_si: 10.0, what: "density at altitude 0" };
/// A plausible density scale height: 1 to 100 km (Earth's lower atmosphere about 8.5 km).
const SCALE_HEIGHT: Plausible = Plausible { min_si: 1_000.0, max_si: 100_000.0, what: "scale height" };
/// A plausible blend depth: 0 to 50 km.
const BLEND: Plausible = Plausible { min_si: 0.0, max_si: 50_000.0, what: "blend depth" };

fn value<'a>(
    model: &'static str,
    what: &'static str,
    text: Option<&'a str>,
    default: &'static Unit,
    plausible: &Plausible,
) -> Result<f64, SpecError<'a>> {
    let text = text.map(str::trim).filter(|t| !t.is_empty()).ok_or(SpecError::Missing { model, what })?;
    units::read(text, default, plausible).map(|r| r.si()).map_err(|error| SpecError::Value {
        model,
        what,
        error,
    })
}

/// `text` after `key=`, if it starts so (the key in any ASCII case).
fn keyed<'a>(text: &'a str, key: &str) -> Option<&'a str> {
    let (k, v) = text.split_once('=')?;
    k.trim().eq_ignore_ascii_case(key).then_some(v)
}

/// The values of a spec: `a,b,c`, at most `N` of them.
fn values<'a, const N: usize>(
    model: &'static str,
    args: &'a str,
) -> Result<[Option<&'a str>; N], SpecError<'a>> {
    let mut out = [None; N];
    let mut parts = args.split(',');
    for slot in &mut out {
        *slot = parts.next();
    }
    match parts.next() {
        Some(extra) => Err(SpecError::Unexpected { model, text: extra }),
        None => Ok(out),
    }
}

impl<'a> ModelSpec<'a> {
    /// Reads a spec (see [`GRAMMAR`]); names and keys in any ASCII case, white space
    /// around values ignored.
    ///
    /// ```
    /// use aerostrata::model::ModelSpec;
    /// // 27 degF as a difference is 27 x 5/9 = 15 K.
    /// assert_eq!(ModelSpec::parse("offset=+27F")?, ModelSpec::Offset { offset_k: 15.0 });
    /// assert_eq!(
    ///     ModelSpec::parse("isothermal=-20C,p0=1000hPa")?,
    ///     ModelSpec::Isothermal { temperature_k: 253.14999999999998, pressure_pa: 100_000.0 }
    /// );
    /// assert_eq!(
    ///     ModelSpec::parse("sounding=day.csv,blend=2km")?,
    ///     ModelSpec::Sounding { path: "day.csv", blend_m: Some(2000.0) }
    /// );
    /// assert!(ModelSpec::parse("offset=288").is_err(), "288 K is no day's offset");
    /// # Ok::<(), aerostrata::model::SpecError>(())
    /// ```
    ///
    /// # Errors
    /// [`SpecError`] naming the model and the value: an unknown model, a missing or
    /// surplus value, a value that is not a plausible value of its kind.
    pub fn parse(spec: &'a str) -> Result<Self, SpecError<'a>> {
        let spec = spec.trim();
        let (name, args) = match spec.split_once('=') {
            Some((name, args)) => (name.trim(), Some(args)),
            None => (spec, None),
        };
        let is = |candidate: &str| name.eq_ignore_ascii_case(candidate);
        if is("standard") {
            return match args {
                None => Ok(ModelSpec::Standard),
                Some(text) => Err(SpecError::Unexpected { model: "standard", text }),
            };
        }
        if is("offset") {
            let offset_k = value(
                "offset",
                "an offset DT",
                args,
                &units::KELVIN_DIFFERENCE,
                &Plausible::TEMPERATURE_OFFSET,
            )?;
            return Ok(ModelSpec::Offset { offset_k });
        }
        if is("hydrostatic-offset") {
            let [dt, p] = values::<2>("hydrostatic-offset", args.unwrap_or(""))?;
            let offset_k = value(
                "hydrostatic-offset",
                "an offset DT",
                dt,
                &units::KELVIN_DIFFERENCE,
                &Plausible::TEMPERATURE_OFFSET,
            )?;
            let sea_level_pressure_pa = match p {
                None => crate::constants::SEA_LEVEL_PRESSURE_PA,
                Some(text) => {
                    let p0 = keyed(text, "p0")
                        .ok_or(SpecError::Unexpected { model: "hydrostatic-offset", text })?;
                    let plausible = &Plausible::SEA_LEVEL_PRESSURE;
                    value(
                        "hydrostatic-offset",
                        "a sea-level pressure p0",
                        Some(p0),
                        &units::PASCAL,
                        plausible,
                    )?
                }
            };
            return Ok(ModelSpec::HydrostaticOffset { offset_k, sea_level_pressure_pa });
        }
        if is("isothermal") {
            let [t, p] = values::<2>("isothermal", args.unwrap_or(""))?;
            let temperature_k =
                value("isothermal", "a temperature T", t, &units::KELVIN, &Plausible::AIR_TEMPERATURE)?;
            let pressure_pa = match p {
                None => crate::constants::SEA_LEVEL_PRESSURE_PA,
                Some(text) => {
                    let p0 = keyed(text, "p0").ok_or(SpecError::Unexpected { model: "isothermal", text })?;
                    value(
                        "isothermal",
                        "a pressure p0",
                        Some(p0),
                        &units::PASCAL,
                        &Plausible::SURFACE_PRESSURE,
                    )?
                }
            };
            return Ok(ModelSpec::Isothermal { temperature_k, pressure_pa });
        }
        if is("exponential") {
            let [rho, h, t] = values::<3>("exponential", args.unwrap_or(""))?;
            let density_kg_m3 = value(
                "exponential",
                "a density RHO0",
                rho,
                &units::KILOGRAM_PER_CUBIC_METRE,
                &SEA_LEVEL_DENSITY,
            )?;
            let scale_height_m = value("exponential", "a scale height", h, &units::METRE, &SCALE_HEIGHT)?;
            let temperature_k = match t {
                None => crate::constants::SEA_LEVEL_TEMPERATURE_K,
                Some(_) => {
                    value("exponential", "a temperature T", t, &units::KELVIN, &Plausible::AIR_TEMPERATURE)?
                }
            };
            return Ok(ModelSpec::Exponential { density_kg_m3, scale_height_m, temperature_k });
        }
        if is("sounding") {
            let args = args.map(str::trim).filter(|a| !a.is_empty());
            let args = args.ok_or(SpecError::Missing { model: "sounding", what: "a file" })?;
            // The file is everything before a `,blend=` (so a file name may hold commas).
            let (path, blend_m) = match find_ignoring_case(args, ",blend=") {
                None => (args, None),
                Some(at) => {
                    let (path, rest) = args.split_at_checked(at).unwrap_or((args, ""));
                    let depth = rest.get(",blend=".len()..);
                    (path, Some(value("sounding", "a blend depth DH", depth, &units::METRE, &BLEND)?))
                }
            };
            return Ok(ModelSpec::Sounding { path: path.trim(), blend_m });
        }
        if is("layers") {
            let path = args.map(str::trim).filter(|a| !a.is_empty());
            let path = path.ok_or(SpecError::Missing { model: "layers", what: "a file" })?;
            return Ok(ModelSpec::Layers { path });
        }
        Err(SpecError::UnknownModel { name })
    }
}

/// The byte position of `needle` in `hay`, comparing without ASCII case.
fn find_ignoring_case(hay: &str, needle: &str) -> Option<usize> {
    let (hay, needle) = (hay.as_bytes(), needle.as_bytes());
    (0..=hay.len().checked_sub(needle.len())?)
        .find(|&i| hay.get(i..i + needle.len()).is_some_and(|window| window.eq_ignore_ascii_case(needle)))
}

impl core::error::Error for SpecError<'_> {}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_model_of_the_grammar() {
        assert_eq!(ModelSpec::parse("standard"), Ok(ModelSpec::Standard));
        assert_eq!(ModelSpec::parse(" Standard "), Ok(ModelSpec::Standard));
        assert_eq!(ModelSpec::parse("offset=15"), Ok(ModelSpec::Offset { offset_k: 15.0 }));
        assert_eq!(ModelSpec::parse("offset=-10C"), Ok(ModelSpec::Offset { offset_k: -10.0 }));
        assert_eq!(
            ModelSpec::parse("hydrostatic-offset=+15K"),
            Ok(ModelSpec::HydrostaticOffset { offset_k: 15.0, sea_level_pressure_pa: 101_325.0 })
        );
        assert_eq!(
            ModelSpec::parse("Hydrostatic-Offset=-10C,p0=1030hPa"),
            Ok(ModelSpec::HydrostaticOffset { offset_k: -10.0, sea_level_pressure_pa: 103_000.0 })
        );
        assert!(
            ModelSpec::parse("hydrostatic-offset=15,p0=1030").is_err(),
            "1030 Pa is no sea-level pressure"
        );
        assert_eq!(
            ModelSpec::parse("isothermal=250"),
            Ok(ModelSpec::Isothermal { temperature_k: 250.0, pressure_pa: 101_325.0 })
        );
        assert_eq!(
            ModelSpec::parse("exponential=1.225,8.5km"),
            Ok(ModelSpec::Exponential {
                density_kg_m3: 1.225,
                scale_height_m: 8500.0,
                temperature_k: 288.15
            })
        );
        assert_eq!(
            ModelSpec::parse("exponential=1.225,8500,250K"),
            Ok(ModelSpec::Exponential { density_kg_m3: 1.225, scale_height_m: 8500.0, temperature_k: 250.0 })
        );
        assert_eq!(
            ModelSpec::parse("sounding=a,b.csv"),
            Ok(ModelSpec::Sounding { path: "a,b.csv", blend_m: None })
        );
        assert_eq!(
            ModelSpec::parse("sounding=day.csv,BLEND=500"),
            Ok(ModelSpec::Sounding { path: "day.csv", blend_m: Some(500.0) })
        );
        assert_eq!(ModelSpec::parse("layers=warm.csv"), Ok(ModelSpec::Layers { path: "warm.csv" }));
    }

    #[test]
    fn errors_name_the_model_the_value_and_the_grammar() {
        let message = |spec: &str| ModelSpec::parse(spec).unwrap_err().to_string();
        assert!(message("isa").starts_with("unknown model 'isa'; a model is one of: standard | offset=DT"));
        assert!(message("offset").starts_with("offset needs an offset DT"));
        assert!(message("offset=").starts_with("offset needs an offset DT"));
        assert_eq!(
            message("offset=288"),
            "offset: an offset DT: 288 K is above any day's offset from the standard temperature (-100 to 100 K)"
        );
        assert_eq!(
            message("isothermal=15"),
            "isothermal: a temperature T: 15 K is below any air temperature (120 to 350 K); write 15degC or 288.15K, \
             or 15degF (263.706 K)"
        );
        assert!(message("isothermal=250,1000").starts_with("isothermal does not take '1000'"));
        assert!(message("exponential=1.225").starts_with("exponential needs a scale height"));
        assert!(message("exponential=1,2,3,4").starts_with("exponential does not take '4'"));
        assert!(message("standard=5").starts_with("standard does not take '5'"));
        assert!(message("sounding=").starts_with("sounding needs a file"));
        assert!(message("sounding=x.csv,blend=10ft/s").contains("a blend depth DH"));
        assert!(message(&"z".repeat(500)).len() < 300, "echoed input is cut");
    }
}
