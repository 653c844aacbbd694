//! `aerostrata airspeed`: calibrated, equivalent and true airspeed and Mach number, each
//! from any one of them, at a pressure altitude and outside air temperature, a static
//! pressure and temperature, or an altitude of the standard (hot or cold) day.

use aerostrata::airspeed::{AirData, Airspeed, Airspeeds};
use aerostrata::units::{Dimension, Unit};
use aerostrata::{Atmosphere, Quantity};
use clap::builder::{PossibleValue, PossibleValuesParser, TypedValueParser};
use clap::{ArgGroup, Args};

use crate::args::model::{altitude_in, offset_model};
use crate::args::output::OutputArgs;
use crate::failure::Failure;
use crate::output::rows::{Column, Format, RowWriter};

#[derive(Args)]
#[command(
    after_help = "Example:\n  aerostrata airspeed --cas 250 --unit kt --pressure-altitude 3048 --oat 268.15"
)]
#[command(group(ArgGroup::new("speed").required(true).args(["cas", "eas", "tas", "mach"])))]
pub struct AirspeedArgs {
    /// Calibrated airspeed, in --unit.
    #[arg(long, value_name = "SPEED", allow_negative_numbers = true)]
    cas: Option<f64>,
    /// Equivalent airspeed, in --unit.
    #[arg(long, value_name = "SPEED", allow_negative_numbers = true)]
    eas: Option<f64>,
    /// True airspeed, in --unit.
    #[arg(long, value_name = "SPEED", allow_negative_numbers = true)]
    tas: Option<f64>,
    /// Mach number.
    #[arg(long, value_name = "M", allow_negative_numbers = true)]
    mach: Option<f64>,
    /// Unit of the airspeeds, in and out: any unit of speed of the core [default: m/s,
    /// or kt with --units us].
    #[arg(long, value_name = "UNIT", value_parser = SpeedUnitParser)]
    unit: Option<&'static Unit>,
    /// Pressure altitude, geopotential m or ft (what an altimeter set to 1013.25 hPa
    /// reads); with --oat.
    #[arg(long, value_name = "H", allow_negative_numbers = true, conflicts_with_all = ["pressure", "altitude"])]
    pressure_altitude: Option<f64>,
    /// Static pressure, Pa or psf; with --oat.
    #[arg(long, value_name = "P", allow_negative_numbers = true, conflicts_with = "altitude")]
    pressure: Option<f64>,
    /// Outside (static) air temperature, K or degF.
    #[arg(long, value_name = "T", allow_negative_numbers = true, conflicts_with = "altitude")]
    oat: Option<f64>,
    /// Geometric altitude of the standard atmosphere, m or ft (instead of a pressure and
    /// --oat).
    #[arg(long, value_name = "Z", allow_negative_numbers = true)]
    altitude: Option<f64>,
    /// Temperature offset dT for --altitude (a hot day is positive; default 0), K or degF.
    #[arg(long, value_name = "DT", allow_negative_numbers = true)]
    offset: Option<f64>,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Csv)]
    format: Format,
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
    if let Some(z) = args.altitude {
        let model = offset_model(args.offset.unwrap_or(0.0), units)?;
        let state = altitude_in(units, z, false, model.range())
            .and_then(|a| model.state(a).map_err(|e| e.to_string()))
            .map_err(|m| Failure::Input(format!("--altitude: {m}")))?;
        return AirData::from_state(&state).map_err(|e| input("--altitude", e));
    }
    if args.offset.is_some() {
        return Err(Failure::Input("--offset applies to --altitude only (give --oat otherwise)".to_owned()));
    }
    let oat = args.oat.ok_or_else(|| {
        Failure::Input(
            "give --pressure-altitude H or --pressure P with --oat T, or --altitude Z of the standard day"
                .to_owned(),
        )
    })?;
    let oat = units.to_si(Quantity::Temperature, oat);
    match (args.pressure_altitude, args.pressure) {
        (Some(h), None) => AirData::from_pressure_altitude(units.to_si(Quantity::PressureAltitude, h), oat)
            .map_err(|e| input("--pressure-altitude/--oat", e)),
        (None, Some(p)) => {
            AirData::new(units.to_si(Quantity::Pressure, p), oat).map_err(|e| input("--pressure/--oat", e))
        }
        _ => Err(Failure::Input("--oat needs --pressure-altitude H or --pressure P".to_owned())),
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
    let (given, option) = match (args.cas, args.eas, args.tas, args.mach) {
        (Some(v), _, _, _) => (Airspeed::Calibrated(unit(Quantity::CalibratedAirspeed).to_si(v)), "--cas"),
        (_, Some(v), _, _) => (Airspeed::Equivalent(unit(Quantity::EquivalentAirspeed).to_si(v)), "--eas"),
        (_, _, Some(v), _) => (Airspeed::True(unit(Quantity::TrueAirspeed).to_si(v)), "--tas"),
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
    let mut writer = RowWriter::new(args.out.destination()?, args.format, columns)?;
    writer.row(&values)?;
    writer.finish()?.commit()
}
