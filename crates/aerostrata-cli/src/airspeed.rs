//! `aerostrata airspeed`: calibrated, equivalent and true airspeed and Mach number, each
//! from any one of them, at a pressure altitude and outside air temperature, a static
//! pressure and temperature, or an altitude of the standard (hot or cold) day.

use std::io::{self, Write};

use aerostrata::airspeed::{AirData, Airspeed};
use aerostrata::constants::units::KNOT_M_S;
use aerostrata::{Altitude, Atmosphere, TemperatureOffset, US1976};
use clap::{ArgGroup, Args, ValueEnum};

use crate::output::exact;
use crate::Failure;

#[derive(Args)]
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
    /// Unit of the speeds, in and out.
    #[arg(long, value_enum, default_value_t = SpeedUnit::Ms)]
    unit: SpeedUnit,
    /// Pressure altitude, geopotential m (what an altimeter set to 1013.25 hPa reads); with --oat.
    #[arg(long, value_name = "M", allow_negative_numbers = true, conflicts_with_all = ["pressure", "altitude"])]
    pressure_altitude: Option<f64>,
    /// Static pressure, Pa; with --oat.
    #[arg(long, value_name = "PA", allow_negative_numbers = true, conflicts_with = "altitude")]
    pressure: Option<f64>,
    /// Outside (static) air temperature, K.
    #[arg(long, value_name = "K", allow_negative_numbers = true, conflicts_with = "altitude")]
    oat: Option<f64>,
    /// Geometric altitude of the standard atmosphere, m (instead of a pressure and --oat).
    #[arg(long, value_name = "M", allow_negative_numbers = true)]
    altitude: Option<f64>,
    /// Temperature offset dT in kelvin for --altitude (a hot day is positive; default 0).
    #[arg(long, value_name = "K", allow_negative_numbers = true)]
    offset: Option<f64>,
    /// Output format.
    #[arg(long, value_enum, default_value_t = OutputFormat::Csv)]
    format: OutputFormat,
}

#[derive(Clone, Copy, ValueEnum)]
pub enum SpeedUnit {
    /// Metres per second.
    #[value(name = "m/s")]
    Ms,
    /// Knots (international nautical miles per hour).
    #[value(name = "kt")]
    Kt,
    /// Kilometres per hour.
    #[value(name = "km/h")]
    Kmh,
}

impl SpeedUnit {
    /// One unit in m/s.
    fn m_s(self) -> f64 {
        match self {
            SpeedUnit::Ms => 1.0,
            SpeedUnit::Kt => KNOT_M_S,
            SpeedUnit::Kmh => 1.0 / 3.6,
        }
    }

    /// The suffix of column names.
    fn suffix(self) -> &'static str {
        match self {
            SpeedUnit::Ms => "m_s",
            SpeedUnit::Kt => "kt",
            SpeedUnit::Kmh => "km_h",
        }
    }
}

#[derive(Clone, Copy, ValueEnum)]
pub enum OutputFormat {
    /// A header line and one row.
    Csv,
    /// One JSON object keyed like the CSV header.
    Json,
}

fn conditions(args: &AirspeedArgs) -> Result<AirData, Failure> {
    let input = |option: &str, e: aerostrata::Error| Failure::Input(format!("{option}: {e}"));
    if let Some(z) = args.altitude {
        let offset = args.offset.unwrap_or(0.0);
        let model = TemperatureOffset::new(US1976, offset).map_err(|e| input("--offset", e))?;
        let state =
            Altitude::geometric_m(z).and_then(|a| model.state(a)).map_err(|e| input("--altitude", e))?;
        return AirData::from_state(&state).map_err(|e| input("--altitude", e));
    }
    if args.offset.is_some() {
        return Err(Failure::Input(
            "--offset applies to --altitude only (give --oat K otherwise)".to_owned(),
        ));
    }
    let oat = args.oat.ok_or_else(|| {
        Failure::Input(
            "give --pressure-altitude M or --pressure PA with --oat K, or --altitude M of the standard day"
                .to_owned(),
        )
    })?;
    match (args.pressure_altitude, args.pressure) {
        (Some(h), None) => {
            AirData::from_pressure_altitude(h, oat).map_err(|e| input("--pressure-altitude/--oat", e))
        }
        (None, Some(p)) => AirData::new(p, oat).map_err(|e| input("--pressure/--oat", e)),
        _ => Err(Failure::Input("--oat needs --pressure-altitude M or --pressure PA".to_owned())),
    }
}

pub fn run(args: &AirspeedArgs) -> Result<(), Failure> {
    let air = conditions(args)?;
    let unit = args.unit.m_s();
    let (given, option) = match (args.cas, args.eas, args.tas, args.mach) {
        (Some(v), _, _, _) => (Airspeed::Calibrated(v * unit), "--cas"),
        (_, Some(v), _, _) => (Airspeed::Equivalent(v * unit), "--eas"),
        (_, _, Some(v), _) => (Airspeed::True(v * unit), "--tas"),
        (_, _, _, Some(m)) => (Airspeed::Mach(m), "--mach"),
        _ => return Err(Failure::Input("give one of --cas, --eas, --tas or --mach".to_owned())),
    };
    let s = air.airspeeds(given).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    let suffix = args.unit.suffix();
    let columns: [(String, f64); 9] = [
        (format!("calibrated_airspeed_{suffix}"), s.calibrated_m_s / unit),
        (format!("equivalent_airspeed_{suffix}"), s.equivalent_m_s / unit),
        (format!("true_airspeed_{suffix}"), s.true_m_s / unit),
        ("mach".to_owned(), s.mach),
        ("impact_pressure_Pa".to_owned(), s.impact_pressure_pa),
        ("dynamic_pressure_Pa".to_owned(), s.dynamic_pressure_pa),
        ("static_pressure_Pa".to_owned(), air.pressure_pa()),
        ("density_kg_m3".to_owned(), air.density_kg_m3()),
        ("speed_of_sound_m_s".to_owned(), air.speed_of_sound_m_s()),
    ];
    let mut out = io::stdout().lock();
    match args.format {
        OutputFormat::Csv => {
            let names: Vec<&str> = columns.iter().map(|(n, _)| n.as_str()).collect();
            let values: Vec<String> = columns.iter().map(|(_, v)| exact(*v)).collect();
            writeln!(out, "{}\n{}", names.join(","), values.join(","))?;
        }
        OutputFormat::Json => {
            let object: serde_json::Map<String, serde_json::Value> =
                columns.into_iter().map(|(n, v)| (n, v.into())).collect();
            writeln!(
                out,
                "{}",
                serde_json::to_string_pretty(&object).map_err(|e| Failure::Io(io::Error::other(e)))?
            )?;
        }
    }
    Ok(())
}
