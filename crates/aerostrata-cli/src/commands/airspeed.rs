//! `aerostrata airspeed`: calibrated, equivalent and true airspeed and Mach number, each
//! from any one of them, at a pressure altitude and outside air temperature, a static
//! pressure and temperature, or an altitude of the standard (hot or cold) day.

use aerostrata::airspeed::{AirData, Airspeed};
use aerostrata::constants::units::{FOOT_PER_SECOND_M_S, KNOT_M_S};
use aerostrata::Atmosphere;
use clap::{ArgGroup, Args, ValueEnum};

use crate::args::model::{altitude_in, offset_model};
use crate::args::output::OutputArgs;
use crate::failure::Failure;
use crate::format::Style;
use crate::output::rows::{Column, Format, RowWriter};
use crate::units::{Quantity, UnitSystem};

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
    /// Unit of the speeds, in and out [default: m/s, or kt with --units us].
    #[arg(long, value_enum)]
    unit: Option<SpeedUnit>,
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
    /// Feet per second.
    #[value(name = "ft/s")]
    Fts,
}

impl SpeedUnit {
    /// One unit in m/s.
    fn m_s(self) -> f64 {
        match self {
            SpeedUnit::Ms => 1.0,
            SpeedUnit::Kt => KNOT_M_S,
            SpeedUnit::Kmh => 1.0 / 3.6,
            SpeedUnit::Fts => FOOT_PER_SECOND_M_S,
        }
    }

    /// The suffix of column names.
    fn suffix(self) -> &'static str {
        match self {
            SpeedUnit::Ms => "m_s",
            SpeedUnit::Kt => "kt",
            SpeedUnit::Kmh => "km_h",
            SpeedUnit::Fts => "ft_s",
        }
    }

    /// The symbol for a table heading.
    fn symbol(self) -> &'static str {
        match self {
            SpeedUnit::Ms => "m/s",
            SpeedUnit::Kt => "kt",
            SpeedUnit::Kmh => "km/h",
            SpeedUnit::Fts => "ft/s",
        }
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
        (Some(h), None) => AirData::from_pressure_altitude(units.to_si(Quantity::Length, h), oat)
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
    let speed_unit = args.unit.unwrap_or(match units {
        UnitSystem::Si => SpeedUnit::Ms,
        UnitSystem::Us => SpeedUnit::Kt,
    });
    let unit = speed_unit.m_s();
    let (given, option) = match (args.cas, args.eas, args.tas, args.mach) {
        (Some(v), _, _, _) => (Airspeed::Calibrated(v * unit), "--cas"),
        (_, Some(v), _, _) => (Airspeed::Equivalent(v * unit), "--eas"),
        (_, _, Some(v), _) => (Airspeed::True(v * unit), "--tas"),
        (_, _, _, Some(m)) => (Airspeed::Mach(m), "--mach"),
        _ => return Err(Failure::Input("give one of --cas, --eas, --tas or --mach".to_owned())),
    };
    let s = air.airspeeds(given).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    let speed = |base: &str, heading: &str| Column {
        key: format!("{base}_{}", speed_unit.suffix()),
        heading: heading.to_owned(),
        unit: speed_unit.symbol().to_owned(),
        shown: true,
        style: Style::Significant,
    };
    let columns = vec![
        speed("calibrated_airspeed", "CAS"),
        speed("equivalent_airspeed", "EAS"),
        speed("true_airspeed", "TAS"),
        Column::new(units, "mach", "M", Quantity::Dimensionless, Style::Significant),
        Column::new(units, "impact_pressure", "qc", Quantity::Pressure, Style::Significant),
        Column::new(units, "dynamic_pressure", "q", Quantity::Pressure, Style::Significant),
        Column::new(units, "static_pressure", "p", Quantity::Pressure, Style::Significant),
        Column::new(units, "density", "rho", Quantity::Density, Style::Scientific),
        Column::new(units, "speed_of_sound", "a", Quantity::Speed, Style::Significant),
    ];
    let u = |q: Quantity, v: f64| Some(units.from_si(q, v));
    let values = [
        Some(s.calibrated_m_s / unit),
        Some(s.equivalent_m_s / unit),
        Some(s.true_m_s / unit),
        Some(s.mach),
        u(Quantity::Pressure, s.impact_pressure_pa),
        u(Quantity::Pressure, s.dynamic_pressure_pa),
        u(Quantity::Pressure, air.pressure_pa()),
        u(Quantity::Density, air.density_kg_m3()),
        u(Quantity::Speed, air.speed_of_sound_m_s()),
    ];
    let mut writer = RowWriter::new(args.out.destination()?, args.format, columns)?;
    writer.row(&values)?;
    writer.finish()?.commit()
}
