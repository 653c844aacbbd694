//! `aerostrata altitude`: pressure altitude (and, on request, density altitude, the
//! barometric altitude relative to a QNH setting or the pad's pressure, and the altitude
//! where a model's air has the pressure) from static pressures given on the command line
//! or read one per line. One answer: a readable table by default, every digit with
//! `--exact` or in CSV and JSON; a file of pressures: CSV by default.

use aerostrata::inverse::{
    altitude_of, barometric_altitude_m, density_altitude, density_altitude_from, density_altitude_humid,
    pressure_altitude, BarometricReference, Moisture, Property,
};
use aerostrata::units::Tidy;
use aerostrata::{Altitude, AnyModel, Atmosphere, Quantity};
use clap::{ArgGroup, Args};

use crate::args::model::ModelArgs;
use crate::args::output::OutputArgs;
use crate::args::value::{DEW_POINT, PAD, PRESSURE, QNH, RELATIVE_HUMIDITY, TEMPERATURE};
use crate::failure::Failure;
use crate::input::lines::{open_input, source_name};
use crate::input::progress::When;
use crate::input::table::{needs, Columns, TableReader};
use crate::output::rows::{Column, Format, RowWriter};
use crate::units::UnitSystem;

#[derive(Args)]
#[command(
    after_help = "Examples:\n  aerostrata altitude --pressure 843hPa --pad 981hPa --temperature 8C\n  \
                       aerostrata altitude --pressure 1008hPa --temperature 32C --dew-point 26C\n  \
                       printf '29.92\\n20.58\\n' | aerostrata altitude - --units us --qnh 30.12inHg\n  \
                       aerostrata altitude --pressure 700hPa --model hydrostatic-offset=+15K"
)]
#[command(group(ArgGroup::new("input").required(true).args(["pressure", "file"])))]
pub struct AltitudeArgs {
    #[arg(long, value_name = "P", allow_hyphen_values = true, help = PRESSURE.help("Static pressure"))]
    pressure: Option<String>,
    /// File of static pressures, one per line, instead of --pressure (in Pa, or inHg with
    /// --units us; a value may carry its unit, 843hPa; a first line may name the column,
    /// `static_pressure (hPa)`); `-` reads stdin. Blank lines and lines starting with `#`
    /// are skipped.
    file: Option<std::path::PathBuf>,
    #[arg(long, value_name = "P", allow_hyphen_values = true, conflicts_with = "pad",
          help = QNH.help("Altimeter setting QNH: adds the altitude an altimeter set to it reads"))]
    qnh: Option<String>,
    #[arg(long, value_name = "P", allow_hyphen_values = true,
          help = PAD.help("The pad's pressure at launch: adds the height above the pad"))]
    pad: Option<String>,
    #[arg(long, alias = "oat", value_name = "T", allow_hyphen_values = true,
          help = TEMPERATURE.help("Outside air temperature: adds the density altitude (dry air)"))]
    temperature: Option<String>,
    #[arg(long, value_name = "TD", allow_hyphen_values = true, requires = "temperature",
          conflicts_with = "relative_humidity",
          help = DEW_POINT.help("With --temperature: the dew point, for the density altitude of moist air"))]
    dew_point: Option<String>,
    #[arg(long, value_name = "RH", requires = "temperature",
          help = RELATIVE_HUMIDITY.help("With --temperature: the relative humidity, for the density altitude of moist air"))]
    relative_humidity: Option<String>,
    #[command(flatten)]
    model: ModelArgs,
    /// Every digit in the table too (CSV and JSON always carry them).
    #[arg(long)]
    exact: bool,
    /// Output format [default: table for --pressure, CSV for a file].
    #[arg(long, value_enum)]
    format: Option<Format>,
    #[command(flatten)]
    out: OutputArgs,
}

const PRESSURES: [Quantity; 2] = [Quantity::StaticPressure, Quantity::Pressure];

/// What each row adds to the pressure altitudes.
struct Extras {
    reference: Option<(Quantity, BarometricReference)>,
    temperature_k: Option<f64>,
    moisture: Option<Moisture>,
    model: Option<AnyModel>,
}

impl Extras {
    fn quantities(&self) -> Vec<Quantity> {
        let mut quantities =
            vec![Quantity::StaticPressure, Quantity::PressureAltitude, Quantity::PressureAltitudeGeometric];
        quantities.extend(self.reference.map(|(quantity, _)| quantity));
        if self.model.is_some() {
            quantities.push(Quantity::GeometricAltitude);
        }
        if self.temperature_k.is_some() || self.model.is_some() {
            quantities.push(Quantity::DensityAltitude);
        }
        quantities
    }

    /// The row of a static pressure, Pa, in `units`.
    fn row(&self, pa: f64, units: UnitSystem) -> Result<Vec<Option<f64>>, String> {
        let h = pressure_altitude(pa).map_err(|e| e.to_string())?;
        let out = |q: Quantity, si: f64| Some(units.from_si(q, si));
        let mut cells = vec![
            out(Quantity::StaticPressure, pa),
            out(Quantity::PressureAltitude, h.meters()),
            out(Quantity::PressureAltitudeGeometric, h.to_geometric().meters()),
        ];
        if let Some((quantity, reference)) = self.reference {
            cells.push(out(quantity, barometric_altitude_m(pa, reference).map_err(|e| e.to_string())?));
        }
        // The model's air at the pressure: where it is, and its density.
        let mut model_density = None;
        if let Some(model) = &self.model {
            let z = altitude_of(model, Property::Pressure, pa).map_err(|e| format!("in the model: {e}"))?;
            let state = Altitude::geometric_m(z.meters())
                .and_then(|a| model.state(a))
                .map_err(|e| format!("in the model: {e}"))?;
            cells.push(out(Quantity::GeometricAltitude, z.meters()));
            model_density = Some(state.density_kg_m3);
        }
        let density = match (self.temperature_k, model_density) {
            (Some(t), _) => Some(match self.moisture {
                Some(moisture) => density_altitude_humid(pa, t, moisture).map_err(|e| match moisture {
                    Moisture::DewPoint { .. } => format!("--dew-point: {e}"),
                    Moisture::RelativeHumidity { .. } => format!("--relative-humidity: {e}"),
                })?,
                None => density_altitude_from(pa, t).map_err(|e| format!("--temperature: {e}"))?,
            }),
            (None, Some(rho)) => Some(density_altitude(rho).map_err(|e| format!("in the model: {e}"))?),
            (None, None) => None,
        };
        if let Some(d) = density {
            cells.push(out(Quantity::DensityAltitude, d.meters()));
        }
        Ok(cells)
    }
}

/// Runs `aerostrata altitude`.
///
/// # Errors
/// [`Failure::Input`] naming the option, or the file, line and column at fault;
/// [`Failure::Io`] when writing fails.
pub fn run(args: &AltitudeArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let reference = match (&args.qnh, &args.pad) {
        (Some(setting), _) => Some((
            Quantity::QnhAltitude,
            "--qnh",
            BarometricReference::Qnh { setting_pa: QNH.si(setting, units)? },
        )),
        (_, Some(pressure)) => Some((
            Quantity::HeightAbovePad,
            "--pad",
            BarometricReference::Pad { pressure_pa: PAD.si(pressure, units)? },
        )),
        _ => None,
    };
    // Check the reference once, up front, so that its error names its option.
    if let Some((_, option, reference)) = reference {
        barometric_altitude_m(101_325.0, reference).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    }
    let temperature_k = args.temperature.as_deref().map(|t| TEMPERATURE.si(t, units)).transpose()?;
    let model = args.model.given().then(|| args.model.load(units)).transpose()?.map(|m| m.atmosphere);
    let moisture = match (&args.dew_point, &args.relative_humidity) {
        (Some(td), _) => Some(Moisture::DewPoint { dew_point_k: DEW_POINT.si(td, units)? }),
        (_, Some(rh)) => Some(Moisture::RelativeHumidity { percent: RELATIVE_HUMIDITY.si(rh, units)? }),
        _ => None,
    };
    // Check the moisture once, up front, so that its error names its option.
    if let (Some(t), Some(moisture)) = (temperature_k, moisture) {
        let option = if args.dew_point.is_some() { "--dew-point" } else { "--relative-humidity" };
        density_altitude_humid(101_325.0, t, moisture)
            .map_err(|e| Failure::Input(format!("{option}: {e}")))?;
    }
    let extras = Extras { reference: reference.map(|(q, _, r)| (q, r)), temperature_k, moisture, model };
    let columns = extras.quantities().iter().map(|q| Column::of(units, *q)).collect();
    // A single pressure is checked before anything is written, so a bad one leaves stdout empty.
    let single = match &args.pressure {
        Some(text) => {
            let pa = PRESSURE.si(text, units)?;
            Some(
                extras
                    .row(pa, units)
                    .map_err(|m| Failure::Input(format!("--pressure {}: {m}", text.trim())))?,
            )
        }
        None => None,
    };
    let mut input = match (&single, &args.file) {
        (None, Some(path)) => {
            let columns = Columns {
                accepts: &PRESSURES,
                implicit: &PRESSURES[..1],
                check: Box::new(|h| needs(h, &[&PRESSURES])),
            };
            let name = source_name(Some(path));
            Some(TableReader::new(open_input(Some(path), When::Never)?, name, columns, Some(units)))
        }
        _ => None,
    };
    let default = if single.is_some() { Format::Table } else { Format::Csv };
    let format = args.format.unwrap_or(default);
    let mut writer = RowWriter::new(args.out.destination()?, format, columns)?.exact(args.exact);
    if let Some(values) = single {
        writer.row(&values)?;
    } else if let Some(reader) = &mut input {
        while let Some(row) = reader.next_row()? {
            let Some((quantity, pa)) = PRESSURES.iter().find_map(|q| row.get(*q).map(|v| (*q, v))) else {
                return Err(reader.at_line("an empty cell; give a pressure"));
            };
            let values = extras.row(pa, units).map_err(|m| {
                // The core's message is in Pa; another unit's value leads it.
                let unit = reader.unit_of(quantity);
                if unit == quantity.si() {
                    reader.at_cell(quantity, m)
                } else {
                    reader.at_cell(quantity, format!("{} {}: {m}", Tidy(unit.from_si(pa)), unit.symbol()))
                }
            })?;
            writer.row(&values)?;
        }
    }
    writer.finish()?.commit()
}
