//! `aerostrata altitude`: pressure altitude (and, on request, density altitude and the
//! barometric altitude relative to a QNH setting or the pad's pressure) from static
//! pressures given on the command line or read one per line.

use aerostrata::inverse::{
    barometric_altitude_m, density_altitude_from, pressure_altitude, BarometricReference,
};
use aerostrata::Quantity;
use clap::{ArgGroup, Args};

use crate::args::output::OutputArgs;
use crate::failure::Failure;
use crate::input::lines::{number, open_input, DataLines};
use crate::input::progress::When;
use crate::output::rows::{Column, Format, RowWriter};

#[derive(Args)]
#[command(after_help = "Example:\n  aerostrata altitude --pressure 84300 --pad 98100 --temperature 281.2")]
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
    let pressure_unit = units.unit(Quantity::StaticPressure);
    let reference = match (args.qnh, args.pad) {
        (Some(setting), _) => Some((
            Quantity::QnhAltitude,
            "--qnh",
            BarometricReference::Qnh { setting_pa: units.to_si(Quantity::AltimeterSetting, setting) },
        )),
        (_, Some(pressure)) => Some((
            Quantity::HeightAbovePad,
            "--pad",
            BarometricReference::Pad { pressure_pa: pressure_unit.to_si(pressure) },
        )),
        _ => None,
    };
    // Check the reference once, up front, so that its error names its option.
    if let Some((_, option, reference)) = reference {
        barometric_altitude_m(101_325.0, reference).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    }
    let temperature = args.temperature.map(|t| units.to_si(Quantity::Temperature, t));
    let mut quantities =
        vec![Quantity::StaticPressure, Quantity::PressureAltitude, Quantity::PressureAltitudeGeometric];
    quantities.extend(reference.map(|(quantity, _, _)| quantity));
    quantities.extend(temperature.map(|_| Quantity::DensityAltitude));
    let columns = quantities.iter().map(|q| Column::of(units, *q)).collect();
    let row = |pressure: f64| -> Result<Vec<Option<f64>>, String> {
        let pa = pressure_unit.to_si(pressure);
        // Outside SI the core's message (in Pa) follows the value as the user gave it.
        let given = |e: aerostrata::Error| {
            if pressure_unit == Quantity::StaticPressure.si() {
                e.to_string()
            } else {
                format!("{pressure} {}: {e}", pressure_unit.symbol())
            }
        };
        let h = pressure_altitude(pa).map_err(given)?;
        // The pressure as given: it is already in the column's unit.
        let mut cells = vec![
            Some(pressure),
            Some(units.from_si(Quantity::PressureAltitude, h.meters())),
            Some(units.from_si(Quantity::PressureAltitudeGeometric, h.to_geometric().meters())),
        ];
        if let Some((quantity, _, reference)) = reference {
            cells.push(Some(units.from_si(quantity, barometric_altitude_m(pa, reference).map_err(given)?)));
        }
        if let Some(t) = temperature {
            let d = density_altitude_from(pa, t).map_err(|e| format!("--temperature: {e}"))?;
            cells.push(Some(units.from_si(Quantity::DensityAltitude, d.meters())));
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
        while let Some((line, text)) = lines.next_line()? {
            let at_line = |m: String| Failure::Input(format!("line {line}: {m}"));
            let pressure = number(text, Quantity::StaticPressure, pressure_unit).map_err(at_line)?;
            writer.row(&row(pressure).map_err(at_line)?)?;
        }
    }
    writer.finish()?.commit()
}
