//! `--model SPEC` and its shorthands `--offset`, `--sounding` and `--blend`: the
//! atmosphere a command evaluates, named in the core's one model language
//! ([`aerostrata::model::spec`]); the files it names read here (soundings by the core's
//! loaders, layers by the tool's table reader). A shorthand builds the very spec it
//! stands for, so it gives the very same model. Also the altitudes in a model, read in
//! the user's units and checked against its range.

use std::path::{Path, PathBuf};

use aerostrata::model::spec::GRAMMAR;
use aerostrata::model::ModelSpec;
use aerostrata::units::{Tidy, Unit};
use aerostrata::{Altitude, AltitudeRange, AnyModel, Quantity};
use clap::Args;

use crate::args::value::{BLEND_DEPTH, OFFSET};
use crate::failure::Failure;
use crate::input::winds::Winds;
use crate::input::{layers, sounding};
use crate::units::UnitSystem;

/// The help of `--model`: the grammar, quoted from the core.
pub fn model_help() -> String {
    format!(
        "The atmosphere: {GRAMMAR}. Values take units (offset=+15K, isothermal=-20C,p0=1000hPa, \
         exponential=1.225,8.5km; a bare number is SI); FILE is a sounding (CSV, or JSON if named .json) or \
         a CSV of layers (docs/cli.md) [default: standard]"
    )
}

/// The atmosphere options of a command that evaluates air.
#[derive(Args)]
pub struct ModelArgs {
    #[arg(long, value_name = "SPEC", help = model_help(), conflicts_with_all = ["offset", "sounding"])]
    pub model: Vec<String>,
    #[arg(long, value_name = "DT", allow_hyphen_values = true, conflicts_with = "sounding",
          help = OFFSET.help("Shorthand for --model offset=DT: the standard, T + DT at its pressure \
                              (a hot day is positive)"))]
    pub offset: Option<String>,
    /// Shorthand for --model sounding=FILE: a sounding instead of the standard, CSV with a
    /// header of quantities and units, or JSON if the name ends in .json
    /// (docs/soundings.md). Outside its rows: an error, unless --blend is given.
    #[arg(long, value_name = "FILE")]
    pub sounding: Option<PathBuf>,
    #[arg(long, value_name = "DH", requires = "sounding", allow_hyphen_values = true,
          help = BLEND_DEPTH.help("With --sounding (shorthand for sounding=FILE,blend=DH): beyond the first \
                                    and last rows, blend into the standard over this geopotential depth"))]
    pub blend: Option<String>,
}

/// A model and its name for legends.
pub struct Model {
    /// The atmosphere.
    pub atmosphere: AnyModel,
    /// A short name (`standard +15 K`, `sounding vessaro_key_hot_humid`).
    pub label: String,
    /// The 1976 standard itself (no offset, no file).
    pub standard: bool,
    /// The winds of a CSV sounding's wind columns, which a flight may take.
    pub winds: Option<Winds>,
}

impl ModelArgs {
    /// The model the options name: `--model`, or a shorthand, or the standard.
    ///
    /// # Errors
    /// [`Failure::Input`] naming the option: a bad spec or value, a file that cannot be
    /// read, parameters the model refuses.
    pub fn load(&self, units: UnitSystem) -> Result<Model, Failure> {
        match self.model.as_slice() {
            [] => {}
            [text] => return load_spec(text, "--model", units),
            several => {
                return Err(Failure::Input(format!(
                    "--model is given {} times; only flight and plot profile take several models",
                    several.len()
                )))
            }
        }
        if let Some(path) = &self.sounding {
            let blend_m = self.blend.as_deref().map(|t| BLEND_DEPTH.si(t, units)).transpose()?;
            let path = path.to_string_lossy();
            return build(&ModelSpec::Sounding { path: &path, blend_m }, "--sounding", units);
        }
        if let Some(text) = &self.offset {
            return build(&ModelSpec::Offset { offset_k: OFFSET.si(text, units)? }, "--offset", units);
        }
        build(&ModelSpec::Standard, "--model", units)
    }

    /// Every model `--model` names (repeated), or the one of the shorthands or the standard.
    ///
    /// # Errors
    /// As [`ModelArgs::load`].
    pub fn load_all(&self, units: UnitSystem) -> Result<Vec<Model>, Failure> {
        if self.model.len() > 1 {
            return self.model.iter().map(|text| load_spec(text, "--model", units)).collect();
        }
        self.load(units).map(|model| vec![model])
    }

    /// Whether any of the options was given.
    pub fn given(&self) -> bool {
        !self.model.is_empty() || self.offset.is_some() || self.sounding.is_some()
    }

    /// The option that was given, for messages (`--model` when none was).
    pub fn option(&self) -> &'static str {
        match (&self.offset, &self.sounding) {
            (Some(_), _) => "--offset",
            (_, Some(_)) => "--sounding",
            _ => "--model",
        }
    }
}

/// The model `text` names in the core's model language, given as `option`.
///
/// # Errors
/// [`Failure::Input`] naming the option and the spec.
pub fn load_spec(text: &str, option: &str, units: UnitSystem) -> Result<Model, Failure> {
    let within = |message: String| Failure::Input(format!("{option} {text}: {message}"));
    if units == UnitSystem::Us {
        if let Some(bare) = bare_number(text) {
            return Err(within(format!(
                "with --units us the bare number {bare} could be in either system's unit; write its unit \
                 (a bare number in a model is SI)"
            )));
        }
    }
    let spec = ModelSpec::parse(text).map_err(|e| within(e.to_string()))?;
    build(&spec, option, units)
}

/// The first bare number (other than 0, which reads the same in any unit) among the
/// values of a spec, files left aside: what `--units us` cannot read without a unit.
fn bare_number(text: &str) -> Option<&str> {
    let (name, args) = text.split_once('=')?;
    let name = name.trim().to_ascii_lowercase();
    let values: Vec<&str> = match name.as_str() {
        "layers" => Vec::new(),
        // The file is everything before `,blend=`.
        "sounding" => {
            let lower = args.to_ascii_lowercase();
            lower.find(",blend=").and_then(|at| args.get(at + ",blend=".len()..)).into_iter().collect()
        }
        _ => args.split(',').map(|v| v.split_once('=').map_or(v, |(_, v)| v)).collect(),
    };
    values.into_iter().map(str::trim).find(|v| v.parse::<f64>().is_ok_and(|x| x != 0.0))
}

/// The model of a parsed spec, its files read.
fn build(spec: &ModelSpec, option: &str, units: UnitSystem) -> Result<Model, Failure> {
    let refused = |e: aerostrata::Error| Failure::Input(format!("{option}: {e}"));
    let mut winds = None;
    let atmosphere = match *spec {
        ModelSpec::Sounding { path, blend_m } => {
            let (table, found) = sounding::load(Path::new(path), blend_m).map_err(Failure::Input)?;
            winds = found;
            AnyModel::Sounding(table)
        }
        ModelSpec::Layers { path } => AnyModel::Layers(layers::load(Path::new(path))?),
        ref other => match AnyModel::from_spec(other) {
            Some(model) => model.map_err(refused)?,
            None => return Err(Failure::Input(format!("{option}: this model is not available here"))),
        },
    };
    Ok(Model { atmosphere, label: label(spec, units), standard: matches!(spec, ModelSpec::Standard), winds })
}

/// A short name of a model for a legend, its values in `units`.
fn label(spec: &ModelSpec, units: UnitSystem) -> String {
    let value = |q: Quantity, si: f64| format!("{} {}", Tidy(units.from_si(q, si)), units.unit(q).symbol());
    let signed = |q: Quantity, si: f64| {
        let text = value(q, si);
        if si >= 0.0 {
            format!("+{text}")
        } else {
            text
        }
    };
    let p0 = |p: f64| {
        if p == aerostrata::constants::SEA_LEVEL_PRESSURE_PA {
            String::new()
        } else {
            format!(", p0 {}", value(Quantity::StaticPressure, p))
        }
    };
    let stem =
        |path: &str| Path::new(path).file_stem().map_or(path.to_owned(), |s| s.to_string_lossy().into());
    match *spec {
        ModelSpec::Standard => "US 1976 standard".to_owned(),
        ModelSpec::Offset { offset_k } => {
            format!("standard {}", signed(Quantity::TemperatureOffset, offset_k))
        }
        ModelSpec::HydrostaticOffset { offset_k, sea_level_pressure_pa } => format!(
            "hydrostatic standard {}{}",
            signed(Quantity::TemperatureOffset, offset_k),
            p0(sea_level_pressure_pa)
        ),
        ModelSpec::Isothermal { temperature_k, pressure_pa } => {
            format!("isothermal {}{}", value(Quantity::Temperature, temperature_k), p0(pressure_pa))
        }
        ModelSpec::Exponential { density_kg_m3, scale_height_m, .. } => format!(
            "exponential {}, H {}",
            value(Quantity::Density, density_kg_m3),
            value(Quantity::PressureScaleHeight, scale_height_m)
        ),
        ModelSpec::Sounding { path, .. } => format!("sounding {}", stem(path)),
        ModelSpec::Layers { path } => format!("layers {}", stem(path)),
        _ => "model".to_owned(),
    }
}

/// The lowest and highest altitude of `range`, m, geopotential or geometric.
pub fn band(range: AltitudeRange, geopotential: bool) -> (f64, f64) {
    if geopotential {
        (range.geopotential_min_m, range.geopotential_max_m)
    } else {
        (range.geometric_min_m, range.geometric_max_m)
    }
}

/// The quantity an altitude is: geopotential or geometric.
pub fn altitude_quantity(geopotential: bool) -> Quantity {
    if geopotential {
        Quantity::GeopotentialAltitude
    } else {
        Quantity::GeometricAltitude
    }
}

/// An altitude of `meters` checked against `range`; outside SI the message names the
/// value and the range in `unit` (the core's message otherwise).
///
/// # Errors
/// A message for a value that is not finite or outside `range`.
pub fn altitude_in(
    unit: &Unit,
    meters: f64,
    geopotential: bool,
    range: AltitudeRange,
) -> Result<Altitude, String> {
    let quantity = altitude_quantity(geopotential);
    let altitude =
        if geopotential { Altitude::geopotential_m(meters) } else { Altitude::geometric_m(meters) };
    let checked = altitude.and_then(|a| range.check(a));
    if unit == quantity.si() {
        return checked.map_err(|e| e.to_string());
    }
    let label = quantity.info().label;
    if !meters.is_finite() {
        return Err(format!("{label} must be a finite number, got {meters}"));
    }
    let (lo, hi) = band(range, geopotential);
    checked.map_err(|_| {
        let symbol = unit.symbol();
        let user = |m: f64| Tidy(unit.from_si(m));
        format!(
            "{label} {} {symbol} is outside the allowed range {} to {} {symbol}",
            user(meters),
            user(lo),
            user(hi)
        )
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use aerostrata::Atmosphere;

    fn state(model: &Model, z: f64) -> aerostrata::State {
        model.atmosphere.state(Altitude::geometric_m(z).unwrap()).unwrap()
    }

    #[test]
    fn a_shorthand_is_the_very_spec_it_stands_for() {
        let args = |offset: Option<&str>, model: Option<&str>| ModelArgs {
            model: model.map(str::to_owned).into_iter().collect(),
            offset: offset.map(str::to_owned),
            sounding: None,
            blend: None,
        };
        let by_offset = args(Some("-10C"), None).load(UnitSystem::Si).unwrap();
        let by_model = args(None, Some("offset=-10K")).load(UnitSystem::Si).unwrap();
        assert_eq!(state(&by_offset, 3000.0), state(&by_model, 3000.0));
        assert_eq!(by_offset.label, "standard -10 K");
        assert_eq!(args(None, None).load(UnitSystem::Si).unwrap().label, "US 1976 standard");
        assert_eq!(args(Some("+27F"), None).load(UnitSystem::Us).unwrap().label, "standard +27 degF");
    }

    #[test]
    fn every_model_without_a_file_and_its_label() {
        for (spec, label) in [
            ("standard", "US 1976 standard"),
            ("isothermal=250K", "isothermal 250 K"),
            ("hydrostatic-offset=+15K,p0=1030hPa", "hydrostatic standard +15 K, p0 103000 Pa"),
            ("exponential=1.225,8.5km", "exponential 1.225 kg/m3, H 8500 m"),
        ] {
            let model = load_spec(spec, "--model", UnitSystem::Si).unwrap();
            assert_eq!(model.label, label);
            assert!(state(&model, 1000.0).pressure_pa > 0.0);
        }
    }

    #[test]
    fn bare_numbers_in_a_spec_under_us_units() {
        assert_eq!(bare_number("offset=27"), Some("27"));
        assert_eq!(bare_number("offset=+27F"), None);
        assert_eq!(bare_number("isothermal=250K,p0=1013"), Some("1013"));
        assert_eq!(bare_number("sounding=a,1.csv"), None);
        assert_eq!(bare_number("sounding=a.csv,blend=2000"), Some("2000"));
        assert_eq!(bare_number("offset=0"), None);
        let message = match load_spec("offset=27", "--model", UnitSystem::Us) {
            Err(Failure::Input(m)) => m,
            other => panic!("{:?}", other.map(|m| m.label)),
        };
        assert!(message.starts_with("--model offset=27: with --units us the bare number 27"), "{message}");
        let message = match load_spec("warm", "--model", UnitSystem::Si) {
            Err(Failure::Input(m)) => m,
            other => panic!("{:?}", other.map(|m| m.label)),
        };
        assert!(
            message.starts_with("--model warm: unknown model 'warm'; a model is one of: standard"),
            "{message}"
        );
    }
}
