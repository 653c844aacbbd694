//! `aerostrata flight FILE`: the flight scan of a CSV of samples (time, geometric
//! altitude, and a speed relative to the air or a ground-relative velocity with its
//! direction) through the standard atmosphere or any `--model` (several for an envelope),
//! with winds from `--winds` or a sounding's wind columns, one sample at a time (any number
//! of samples in bounded memory); per-sample rows on stdout or `--output`, the summary
//! (flight_report.rs) on stderr, ending with the caution that stands wherever loads are
//! shown.

use std::io::{self, BufRead, Write};
use std::path::PathBuf;

use aerostrata::flight::{BoundaryLayer, FlightPoint, FlightScan, PLATEAU_FRACTION};
use aerostrata::units::{Plausible, Unit};
use aerostrata::{AltitudeRange, AnyModel, Quantity};
use clap::{Args, ValueEnum};

use crate::args::model::{altitude_in, Model, ModelArgs};
use crate::args::output::OutputArgs;
use crate::args::value::Dimensional;
use crate::args::vehicle::VehicleArgs;
use crate::commands::flight_report::{self, caution, Exceeded, Report};
use crate::commands::flight_watch::{Limit, PlateauTrack};
use crate::failure::Failure;
use crate::input::lines::{open_input, source_name};
use crate::input::progress::{Progress, When};
use crate::input::samples::SampleReader;
use crate::input::winds::{self, Winds};
use crate::output::rows::{Cell, Column, Format, RowWriter};
use crate::units::UnitSystem;
use aerostrata::flight::{FileSample, VelocityGiven};

pub use crate::commands::flight_report::CAUTION;

/// A limit on the dynamic pressure: from 100 Pa (13 m/s at sea level, no structural
/// limit) to 5 MPa (Mach 5 at sea level is 1.8 MPa); common practice, no source.
const Q_LIMIT: Dimensional = Dimensional {
    option: "--q-limit",
    quantity: Quantity::DynamicPressure,
    band: Plausible { min_si: 100.0, max_si: 5.0e6, what: "dynamic-pressure limit" },
    examples: "35kPa, 700psf, 35000Pa",
};
/// A limit on q-alpha: from 1000 Pa deg to 5e7 Pa deg (5 MPa at 10 deg); launch
/// vehicles' limits are some 1e5 to 3e5 Pa deg (from memory).
const Q_ALPHA_LIMIT: Dimensional = Dimensional {
    option: "--q-alpha-limit",
    quantity: Quantity::QAlpha,
    band: Plausible { min_si: 1000.0, max_si: 5.0e7, what: "q-alpha limit" },
    examples: "150000Pa_deg, 3000psf_deg",
};

#[derive(Args)]
#[command(after_help = concat!(
    "Example:\n  aerostrata flight ascent.csv --cd-table 0:0.45,0.9:0.5,1.1:0.75,2:0.55 \
     --area 0.0182m2 --summary json\n\n",
    caution!()
))]
pub struct FlightArgs {
    /// CSV of samples, one per line: time, geometric altitude and velocity relative to
    /// the air (its sign ignored), in s, m and m/s (ft and ft/s with --units us). A first
    /// line naming the columns in any spelling (time_s, `altitude (ft)`, `Velocity [m/s]`;
    /// geometric_altitude too) picks them and their units, which win over --units; other
    /// columns are left out with a warning; a cell may carry its unit (35000ft). A
    /// ground-relative velocity with its direction: velocity_east, velocity_north and
    /// velocity_up, or velocity (or speed), flight_path_angle and heading; either with
    /// axis_elevation and axis_azimuth for the vehicle's axis (along the velocity
    /// otherwise). Blank lines and lines starting with `#` are skipped; `-` reads stdin.
    pub file: PathBuf,
    #[command(flatten)]
    pub vehicle: VehicleArgs,
    #[command(flatten)]
    pub model: ModelArgs,
    /// Winds aloft over any model: a CSV of geometric_altitude (or geopotential_altitude)
    /// and wind_speed with wind_direction (the direction it blows from, deg clockwise from
    /// true north), or wind_east with wind_north, each heading with its unit
    /// (wind_speed_kt). Linear in altitude between levels, the end levels held beyond
    /// them. Replaces a sounding's own wind columns. Needs a file giving the velocity's
    /// direction.
    #[arg(long, value_name = "FILE")]
    winds: Option<PathBuf>,
    #[arg(long, value_name = "Q", allow_hyphen_values = true,
          help = Q_LIMIT.help("List every interval where q exceeds this limit"))]
    q_limit: Option<String>,
    #[arg(long, value_name = "QALPHA", allow_hyphen_values = true,
          help = Q_ALPHA_LIMIT.help("List every interval where q-alpha exceeds this limit (a file giving the \
                                      velocity's direction)"))]
    q_alpha_limit: Option<String>,
    /// The q plateau: the span around the maximum where q stays within this fraction of it
    /// (0.02 or 2%; above 0, below 0.5).
    #[arg(long, value_name = "FRACTION", default_value = "2%")]
    plateau_fraction: String,
    /// The boundary layer of the recovery temperature (a file giving the velocity's
    /// direction): recovery factor Pr^(1/2) laminar, Pr^(1/3) turbulent.
    #[arg(long, value_enum, default_value_t = Layer::Turbulent)]
    boundary_layer: Layer,
    /// How the summary is written to stderr.
    #[arg(long, value_enum, default_value_t = SummaryFormat::Text)]
    summary: SummaryFormat,
    /// Output format of the per-sample rows.
    #[arg(long, value_enum, default_value_t = Format::Csv)]
    format: Format,
    /// A progress line on stderr while a large input is read.
    #[arg(long, value_enum, default_value_t = When::Auto)]
    progress: When,
    #[command(flatten)]
    out: OutputArgs,
}

#[derive(Clone, Copy, ValueEnum)]
pub enum Layer {
    /// Recovery factor Pr^(1/2).
    Laminar,
    /// Recovery factor Pr^(1/3).
    Turbulent,
}

#[derive(Clone, Copy, ValueEnum)]
pub enum SummaryFormat {
    /// A few lines for a person.
    Text,
    /// One JSON object.
    Json,
    /// No summary.
    None,
}

/// The per-sample quantities of a file of `kind`: a speed without direction gives the
/// flight point's first thirteen (up to the drag); a velocity with its direction adds its
/// components, the wind (where there is one), airspeed, alpha, q-alpha and the total and
/// recovery temperatures.
fn quantities(kind: VelocityGiven, winds: bool) -> Vec<Quantity> {
    const SPEED_ONLY: usize = 13;
    match kind {
        VelocityGiven::Speed => FlightPoint::QUANTITIES[..SPEED_ONLY].to_vec(),
        VelocityGiven::Components | VelocityGiven::Path => FlightPoint::QUANTITIES
            .iter()
            .copied()
            .filter(|q| winds || !matches!(q, Quantity::WindEast | Quantity::WindNorth))
            .collect(),
    }
}

/// `--plateau-fraction`: a fraction (0.02) or a percentage (2%).
fn plateau_fraction(text: &str) -> Result<f64, Failure> {
    let trimmed = text.trim();
    let (number, scale) = match trimmed.strip_suffix('%') {
        Some(percent) => (percent.trim(), 0.01),
        None => (trimmed, 1.0),
    };
    let fraction = number.parse::<f64>().ok().map(|f| f * scale).filter(|f| *f > 0.0 && *f < 0.5);
    fraction.ok_or_else(|| {
        Failure::Input(format!(
            "--plateau-fraction {trimmed}: a fraction above 0 and below 0.5 (0.02) or a percentage (2%) is \
             expected; the default is {}%",
            PLATEAU_FRACTION * 100.0
        ))
    })
}

/// What one model's scan watches beside the core's summary.
struct Watch {
    q: Option<Limit>,
    q_alpha: Option<Limit>,
    plateau: Option<PlateauTrack>,
}

/// Runs `aerostrata flight`.
///
/// # Errors
/// [`Failure::Input`] naming the option or the input line at fault; [`Failure::Io`] when
/// writing fails.
pub fn run(args: &FlightArgs) -> Result<(), Failure> {
    let units = args.out.units;
    let models = args.model.load_all(units)?;
    let table = args.vehicle.table()?;
    let vehicle = args.vehicle.vehicle(&table, units)?;
    let given_winds = args.winds.as_deref().map(|p| winds::load_file(p, units)).transpose()?;
    let q_limit = args.q_limit.as_deref().map(|t| Q_LIMIT.si(t, units)).transpose()?;
    let q_alpha_limit = args.q_alpha_limit.as_deref().map(|t| Q_ALPHA_LIMIT.si(t, units)).transpose()?;
    let fraction = plateau_fraction(&args.plateau_fraction)?;
    let layer = match args.boundary_layer {
        Layer::Laminar => BoundaryLayer::Laminar,
        Layer::Turbulent => BoundaryLayer::Turbulent,
    };

    let source = source_name(Some(&args.file));
    let input = open_input(Some(&args.file), args.progress)?;
    let mut reader = SampleReader::new(input, source.clone(), units);
    let first = reader.next_sample()?;
    let kind = reader.kind().unwrap_or(VelocityGiven::Speed);
    let directed = kind.has_direction();
    if !directed {
        let fix =
            "give velocity_east, velocity_north and velocity_up (or velocity, flight_path_angle and heading)";
        if let Some(path) = &args.winds {
            return Err(Failure::Input(format!(
                "--winds {}: {source} gives speeds relative to the air, without direction, so winds cannot apply; \
                 {fix}",
                path.display()
            )));
        }
        if q_alpha_limit.is_some() {
            return Err(Failure::Input(format!(
                "--q-alpha-limit: {source} gives speeds without direction, so q-alpha is not known; {fix}"
            )));
        }
        for model in models.iter().filter(|m| m.winds.is_some()) {
            eprintln!(
                "aerostrata: {}: its wind columns are not used: {source} gives speeds relative to the air; to fly \
                 through the winds, {fix}",
                model.label
            );
        }
    }
    // --winds replaces a sounding's own.
    let winds_of: Vec<Option<&Winds>> = models
        .iter()
        .map(|m| if directed { given_winds.as_ref().or(m.winds.as_ref()) } else { None })
        .collect();
    let several = models.len() > 1;
    let quantities = quantities(kind, winds_of.iter().any(Option::is_some));
    let mut columns: Vec<Column> = quantities.iter().map(|q| Column::of(units, *q)).collect();
    if several {
        columns.insert(0, Column::text("model"));
    }
    let mut scans: Vec<FlightScan<'_, &AnyModel>> = models
        .iter()
        .zip(&winds_of)
        .map(|(model, found)| {
            let scan = FlightScan::new(&model.atmosphere, vehicle);
            let scan = match found {
                Some(w) => scan.with_winds(*w),
                None => scan,
            };
            if directed {
                scan.with_recovery(layer)
            } else {
                scan
            }
        })
        .collect();
    let summarised = !matches!(args.summary, SummaryFormat::None);
    let mut watches = Vec::with_capacity(models.len());
    for _ in &models {
        watches.push(Watch {
            q: q_limit.map(|l| Limit::new(l, "--q-limit")).transpose()?,
            q_alpha: q_alpha_limit.map(|l| Limit::new(l, "--q-alpha-limit")).transpose()?,
            plateau: summarised.then(|| PlateauTrack::new(fraction)),
        });
    }
    let mut writer = RowWriter::new(args.out.destination()?, args.format, columns)?;
    let mut flight =
        Flight { models: &models, scans: &mut scans, watches: &mut watches, quantities: &quantities, units };
    let result = flight.stream(first, &mut reader, &mut writer);
    reader.input_mut().clear();
    result?;
    writer.finish()?.commit()?;
    if !summarised {
        return Ok(());
    }
    let mut reports = Vec::with_capacity(models.len());
    for ((model, scan), (watch, found)) in models.iter().zip(&scans).zip(watches.iter_mut().zip(&winds_of)) {
        let summary = scan.summary();
        let plateau = match (&watch.plateau, summary.max_dynamic_pressure) {
            (Some(track), Some(peak)) if peak.dynamic_pressure_pa > 0.0 => {
                track.plateau(peak.dynamic_pressure_pa)?
            }
            _ => None,
        };
        let mut limits = Vec::new();
        for (quantity, limit) in
            [(Quantity::DynamicPressure, &mut watch.q), (Quantity::QAlpha, &mut watch.q_alpha)]
        {
            if let Some(limit) = limit {
                limit.finish();
                limits.push(Exceeded {
                    quantity,
                    limit: limit.limit(),
                    intervals: std::mem::take(&mut limit.found),
                });
            }
        }
        reports.push(Report {
            label: model.label.clone(),
            summary,
            winds: found.is_some(),
            directed,
            limits,
            plateau,
        });
    }
    match args.summary {
        SummaryFormat::Text => eprint!("{}", flight_report::text(&reports, units)),
        SummaryFormat::Json => eprintln!(
            "{}",
            serde_json::to_string_pretty(&flight_report::json(&reports, units))
                .map_err(|e| Failure::Io(io::Error::other(e)))?
        ),
        SummaryFormat::None => {}
    }
    Ok(())
}

/// The scans of one flight through each model, and what they write and watch.
struct Flight<'a, 's> {
    models: &'a [Model],
    scans: &'a mut [FlightScan<'s, &'s AnyModel>],
    watches: &'a mut [Watch],
    quantities: &'a [Quantity],
    units: UnitSystem,
}

impl Flight<'_, '_> {
    fn stream<R: BufRead, W: Write>(
        &mut self,
        first: Option<FileSample>,
        reader: &mut SampleReader<Progress<R>>,
        writer: &mut RowWriter<W>,
    ) -> Result<(), Failure> {
        let several = self.models.len() > 1;
        let mut next = first;
        // Each column's unit, looked up once.
        let units: Vec<&Unit> = self.quantities.iter().map(|q| self.units.unit(*q)).collect();
        let mut values = Vec::with_capacity(self.quantities.len());
        let mut cells = Vec::with_capacity(self.quantities.len() + 1);
        while let Some(sample) = next {
            let altitude = reader.altitude_quantity();
            let table = reader.table();
            for ((model, scan), watch) in
                self.models.iter().zip(self.scans.iter_mut()).zip(self.watches.iter_mut())
            {
                let within = |m: String| if several { format!("{m} (model {})", model.label) } else { m };
                // An altitude out of the model's range, named in its column's unit.
                let range: AltitudeRange = aerostrata::Atmosphere::range(&model.atmosphere);
                altitude_in(table.unit_of(altitude), sample.altitude_m(), false, range)
                    .map_err(|m| table.at_cell(altitude, within(m)))?;
                let point = sample.push(scan).map_err(|e| table.at_line(within(e.to_string())))?;
                let at = |e: aerostrata::Error| table.at_line(within(e.to_string()));
                if let Some(limit) = &mut watch.q {
                    limit.push(point.time_s, point.dynamic_pressure_pa).map_err(at)?;
                }
                if let (Some(limit), Some(qa)) = (&mut watch.q_alpha, point.q_alpha_pa_deg) {
                    limit.push(point.time_s, qa).map_err(at)?;
                }
                if let Some(track) = &mut watch.plateau {
                    track.push(point.time_s, point.dynamic_pressure_pa);
                }
                values.clear();
                // `+ 0.0` writes a zero component of a velocity at rest as 0, not -0.
                values.extend(
                    self.quantities
                        .iter()
                        .zip(&units)
                        .map(|(q, unit)| point.get(*q).ok().map(|v| unit.from_si(v) + 0.0)),
                );
                if several {
                    cells.clear();
                    cells.push(Cell::Text(&model.label));
                    cells.extend(values.iter().map(|v| Cell::Number(*v)));
                    writer.cells(&cells)?;
                } else {
                    writer.row(&values)?;
                }
            }
            next = reader.next_sample()?;
        }
        Ok(())
    }
}
