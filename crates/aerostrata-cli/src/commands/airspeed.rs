//! `aerostrata airspeed`: calibrated, equivalent and true airspeed and Mach number, each
//! from any one of them, at a pressure altitude and outside air temperature, a static
//! pressure and temperature, or an altitude of the standard (hot or cold) day or of any
//! `--model`. One answer: a readable table by default, every digit with `--exact` or in
//! CSV and JSON.

use aerostrata::airspeed::{AirData, Airspeed, Airspeeds};
use aerostrata::units::{Dimension, Unit};
use aerostrata::{Atmosphere, Quantity};
use clap::builder::{PossibleValue, PossibleValuesParser, TypedValueParser};
use clap::{ArgGroup, Args};

use crate::args::model::{altitude_in, ModelArgs};
use crate::args::output::OutputArgs;
use crate::args::value::{Dimensional, ALTITUDE_Z, CAS, EAS, PRESSURE, PRESSURE_ALTITUDE, TAS, TEMPERATURE};
use crate::failure::Failure;
use crate::output::rows::{Column, Format, RowWriter};

#[derive(Args)]
#[command(
    after_help = "Examples:\n  aerostrata airspeed --cas 250kt --pressure-altitude 10000ft --temperature -5C\n  \
                       aerostrata airspeed --mach 0.8 --altitude 11km --offset +10K --units us"
)]
#[command(group(ArgGroup::new("speed").required(true).args(["cas", "eas", "tas", "mach"])))]
pub struct AirspeedArgs {
    #[arg(long, value_name = "SPEED", allow_hyphen_values = true, help = CAS.help("Calibrated airspeed"))]
    cas: Option<String>,
    #[arg(long, value_name = "SPEED", allow_hyphen_values = true, help = EAS.help("Equivalent airspeed"))]
    eas: Option<String>,
    #[arg(long, value_name = "SPEED", allow_hyphen_values = true, help = TAS.help("True airspeed"))]
    tas: Option<String>,
    /// Mach number.
    #[arg(long, value_name = "M", allow_negative_numbers = true)]
    mach: Option<f64>,
    /// The unit of bare airspeeds and of the airspeed columns (kept for old scripts: write
    /// the unit after the number instead, and --units for the output).
    #[arg(long, value_name = "UNIT", value_parser = SpeedUnitParser, hide = true)]
    unit: Option<&'static Unit>,
    #[arg(long, value_name = "H", allow_hyphen_values = true, conflicts_with_all = ["pressure", "altitude"],
          help = PRESSURE_ALTITUDE.help("Pressure altitude, geopotential (what an altimeter set to 1013.25 hPa \
                                          reads); with --temperature"))]
    pressure_altitude: Option<String>,
    #[arg(long, value_name = "P", allow_hyphen_values = true, conflicts_with = "altitude",
          help = PRESSURE.help("Static pressure; with --temperature"))]
    pressure: Option<String>,
    #[arg(long, alias = "oat", value_name = "T", allow_hyphen_values = true, conflicts_with = "altitude",
          help = TEMPERATURE.help("Outside (static) air temperature"))]
    temperature: Option<String>,
    #[arg(long, value_name = "Z", allow_hyphen_values = true,
          help = ALTITUDE_Z.help("Geometric altitude in the model's air (--model; the standard by default), \
                                   instead of a pressure and --temperature"))]
    altitude: Option<String>,
    #[command(flatten)]
    model: ModelArgs,
    /// Every digit in the table too (CSV and JSON always carry them).
    #[arg(long)]
    exact: bool,
    /// Output format [default: table].
    #[arg(long, value_enum)]
    format: Option<Format>,
    #[command(flatten)]
    out: OutputArgs,
}

/// `--unit`: a unit of speed as the core spells it (`kt`, `km/h`, `knots`), its symbols
/// offered to the help and the shell completions.
#[derive(Clone)]
struct SpeedUnitParser;

impl TypedValueParser for SpeedUnitParser {
    type Value = &'static Unit;

    fn parse_ref(
        &self,
        command: &clap::Command,
        argument: Option<&clap::Arg>,
        value: &std::ffi::OsStr,
    ) -> Result<Self::Value, clap::Error> {
        if let Some(unit) = value.to_str().and_then(|text| Unit::find(text, Dimension::Speed)) {
            return Ok(unit);
        }
        // Not a unit of speed: clap's own message, listing the units.
        let symbols: Vec<&'static str> = Dimension::Speed.units().map(Unit::symbol).collect();
        match PossibleValuesParser::new(symbols).parse_ref(command, argument, value) {
            Err(error) => Err(error),
            Ok(_) => Err(clap::Error::new(clap::error::ErrorKind::InvalidValue).with_cmd(command)),
        }
    }

    fn possible_values(&self) -> Option<Box<dyn Iterator<Item = PossibleValue> + '_>> {
        Some(Box::new(Dimension::Speed.units().map(|u| PossibleValue::new(u.symbol()))))
    }
}

fn conditions(args: &AirspeedArgs) -> Result<AirData, Failure> {
    let units = args.out.units;
    let input = |option: &str, e: aerostrata::Error| Failure::Input(format!("{option}: {e}"));
    if let Some(text) = &args.altitude {
        let z = ALTITUDE_Z.si(text, units)?;
        let model = args.model.load(units)?;
        let unit = units.unit(Quantity::GeometricAltitude);
        let state = altitude_in(unit, z, false, model.atmosphere.range())
            .and_then(|a| model.atmosphere.state(a).map_err(|e| e.to_string()))
            .map_err(|m| Failure::Input(format!("--altitude {}: {m}", text.trim())))?;
        return AirData::from_state(&state).map_err(|e| input("--altitude", e));
    }
    if args.model.given() {
        return Err(Failure::Input(format!(
            "{} applies to --altitude only (the air at an altitude of the model); with --pressure or \
             --pressure-altitude the air is given by them and --temperature",
            args.model.option()
        )));
    }
    let temperature = args.temperature.as_deref().ok_or_else(|| {
        Failure::Input(
            "give --pressure-altitude H or --pressure P with --temperature T, or --altitude Z of the standard \
             day (or of --model)"
                .to_owned(),
        )
    })?;
    let temperature = TEMPERATURE.si(temperature, units)?;
    match (&args.pressure_altitude, &args.pressure) {
        (Some(h), None) => AirData::from_pressure_altitude(PRESSURE_ALTITUDE.si(h, units)?, temperature)
            .map_err(|e| input("--pressure-altitude/--temperature", e)),
        (None, Some(p)) => AirData::new(PRESSURE.si(p, units)?, temperature)
            .map_err(|e| input("--pressure/--temperature", e)),
        _ => Err(Failure::Input("--temperature needs --pressure-altitude H or --pressure P".to_owned())),
    }
}

/// Runs `aerostrata airspeed`.
///
/// # Errors
/// [`Failure::Input`] naming the option at fault; [`Failure::Io`] when writing fails.
pub fn run(args: &AirspeedArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let air = conditions(args)?;
    // The airspeeds in --unit, or the catalogue's unit of each.
    let unit = |q: Quantity| match args.unit {
        Some(unit) if unit.dimension() == q.si().dimension() => unit,
        _ => units.unit(q),
    };
    let speed = |option: &Dimensional, text: &str| option.read_in(text, args.unit, units).map(|r| r.si());
    let (given, option) = match (&args.cas, &args.eas, &args.tas, args.mach) {
        (Some(v), _, _, _) => (Airspeed::Calibrated(speed(&CAS, v)?), "--cas"),
        (_, Some(v), _, _) => (Airspeed::Equivalent(speed(&EAS, v)?), "--eas"),
        (_, _, Some(v), _) => (Airspeed::True(speed(&TAS, v)?), "--tas"),
        (_, _, _, Some(m)) => (Airspeed::Mach(m), "--mach"),
        _ => return Err(Failure::Input("give one of --cas, --eas, --tas or --mach".to_owned())),
    };
    let s = air.airspeeds(given).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    // The airspeeds, then the air they were found in (which has no `get` of its own).
    let air_values = [
        (Quantity::StaticPressure, air.pressure_pa()),
        (Quantity::Density, air.density_kg_m3()),
        (Quantity::SpeedOfSound, air.speed_of_sound_m_s()),
    ];
    let mut columns: Vec<Column> =
        Airspeeds::QUANTITIES.iter().map(|q| Column::in_unit(*q, unit(*q))).collect();
    let mut values: Vec<Option<f64>> =
        Airspeeds::QUANTITIES.iter().map(|q| s.get(*q).ok().map(|v| unit(*q).from_si(v))).collect();
    for (q, value) in air_values {
        columns.push(Column::of(units, q));
        values.push(Some(units.from_si(q, value)));
    }
    let format = args.format.unwrap_or(Format::Table);
    let mut writer = RowWriter::new(args.out.destination()?, format, columns)?.exact(args.exact);
    writer.row(&values)?;
    writer.finish()?.commit()
}
