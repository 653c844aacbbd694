//! `aerostrata altitude`: pressure altitude (and, on request, density altitude and the
//! barometric altitude relative to a QNH setting or the pad's pressure) from static
//! pressures given on the command line or read one per line.

use aerostrata::inverse::{
    barometric_altitude_m, density_altitude_from, pressure_altitude, BarometricReference,
};
use clap::{ArgGroup, Args};

use crate::args::output::OutputArgs;
use crate::failure::Failure;
use crate::format::Style;
use crate::input::lines::{open_input, DataLines};
use crate::input::progress::When;
use crate::output::rows::{Column, Format, RowWriter};
use crate::units::{Quantity, UnitSystem};

#[derive(Args)]
#[command(group(ArgGroup::new("input").required(true).args(["pressure", "file"])))]
pub struct AltitudeArgs {
    /// Static pressure, Pa (inHg with --units us).
    #[arg(long, value_name = "P", allow_negative_numbers = true)]
    pressure: Option<f64>,
    /// File of static pressures (Pa, or inHg with --units us), one per line, instead of
    /// --pressure; `-` reads stdin. Blank lines and lines starting with `#` are skipped.
    file: Option<std::path::PathBuf>,
    /// Altimeter setting QNH, Pa or inHg: adds the altitude an altimeter set to it reads.
    #[arg(long, value_name = "P", allow_negative_numbers = true, conflicts_with = "pad")]
    qnh: Option<f64>,
    /// The pad's pressure at launch, Pa or inHg: adds the height above the pad.
    #[arg(long, value_name = "P", allow_negative_numbers = true)]
    pad: Option<f64>,
    /// Outside air temperature, K or degF: adds the density altitude (dry air).
    #[arg(long, value_name = "T", allow_negative_numbers = true)]
    temperature: Option<f64>,
    /// Output format.
    #[arg(long, value_enum, default_value_t = Format::Csv)]
    format: Format,
    #[command(flatten)]
    out: OutputArgs,
}

/// Runs `aerostrata altitude`.
///
/// # Errors
/// [`Failure::Input`] naming the option or the input line at fault; [`Failure::Io`] when
/// writing fails.
pub fn run(args: &AltitudeArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let pressure_unit = units.unit(Quantity::AltimeterPressure);
    let length = units.unit(Quantity::Length);
    let reference = match (args.qnh, args.pad) {
        (Some(setting), _) => Some((
            "qnh_altitude",
            "QNH",
            "--qnh",
            BarometricReference::Qnh { setting_pa: pressure_unit.to_si(setting) },
        )),
        (_, Some(pressure)) => Some((
            "height_above_pad",
            "h pad",
            "--pad",
            BarometricReference::Pad { pressure_pa: pressure_unit.to_si(pressure) },
        )),
        _ => None,
    };
    // Check the reference once, up front, so that its error names its option.
    if let Some((_, _, option, reference)) = reference {
        barometric_altitude_m(101_325.0, reference).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    }
    let temperature = args.temperature.map(|t| units.to_si(Quantity::Temperature, t));
    let mut columns = vec![
        Column::new(units, "pressure", "p", Quantity::AltimeterPressure, Style::Significant),
        Column::new(units, "pressure_altitude", "Hp", Quantity::Length, Style::Fixed(1)),
        Column::new(units, "pressure_altitude_geometric", "Zp", Quantity::Length, Style::Fixed(1)),
    ];
    if let Some((base, heading, _, _)) = reference {
        columns.push(Column::new(units, base, heading, Quantity::Length, Style::Fixed(1)));
    }
    if temperature.is_some() {
        columns.push(Column::new(units, "density_altitude", "Hd", Quantity::Length, Style::Fixed(1)));
    }
    let row = |pressure: f64| -> Result<Vec<Option<f64>>, String> {
        let pa = pressure_unit.to_si(pressure);
        // In US units the core's message (in Pa) follows the value as the user gave it.
        let given = |e: aerostrata::Error| match units {
            UnitSystem::Si => e.to_string(),
            UnitSystem::Us => format!("{pressure} inHg: {e}"),
        };
        let h = pressure_altitude(pa).map_err(given)?;
        let mut cells = vec![
            Some(pressure),
            Some(length.from_si(h.meters())),
            Some(length.from_si(h.to_geometric().meters())),
        ];
        if let Some((_, _, _, reference)) = reference {
            cells.push(Some(length.from_si(barometric_altitude_m(pa, reference).map_err(given)?)));
        }
        if let Some(t) = temperature {
            let d = density_altitude_from(pa, t).map_err(|e| format!("--temperature: {e}"))?;
            cells.push(Some(length.from_si(d.meters())));
        }
        Ok(cells)
    };
    // A single pressure is checked before anything is written, so a bad one leaves stdout empty.
    let single =
        args.pressure.map(|p| row(p).map_err(|m| Failure::Input(format!("--pressure: {m}")))).transpose()?;
    let mut input = match (&single, &args.file) {
        (None, Some(path)) => Some(DataLines::new(open_input(Some(path), When::Never)?)),
        _ => None,
    };
    let mut writer = RowWriter::new(args.out.destination()?, args.format, columns)?;
    if let Some(values) = single {
        writer.row(&values)?;
    } else if let Some(lines) = &mut input {
        let unit = pressure_unit.symbol;
        while let Some((number, text)) = lines.next_line()? {
            let pressure: f64 = text.parse().map_err(|_| {
                Failure::Input(format!("line {number}: '{text}' is not a pressure (a number of {unit})"))
            })?;
            let values = row(pressure).map_err(|m| Failure::Input(format!("line {number}: {m}")))?;
            writer.row(&values)?;
        }
    }
    writer.finish()?.commit()
}
