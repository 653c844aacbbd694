//! `aerostrata plot profile` (state quantities against altitude, several models on the
//! same axes) and `aerostrata plot flight` (q and Mach number against time, the maximum
//! q marked): the options checked and the models and flights read, drawn by the `plot`
//! module and written as SVG.

use std::io::Write;
use std::path::{Path, PathBuf};

use aerostrata::{Atmosphere, FlightScan, Quantity};
use clap::{Args, Subcommand};

use crate::args::model::{altitude_quantity, band, offset_model};
use crate::args::output::OutputArgs;
use crate::args::vehicle::VehicleArgs;
use crate::failure::Failure;
use crate::format::tidy;
use crate::input::lines::open_input;
use crate::input::progress::When;
use crate::input::samples::SampleReader;
use crate::input::sounding;
use crate::plot::chart::Figure;
use crate::plot::flight::{flight_figure, flight_title, FlightTrace};
use crate::plot::profile::{ProfilePlot, QuantityParser, Scale, MAX_PANELS};
use crate::units::{in_words, UnitSystem};

#[derive(Subcommand)]
pub enum PlotCommand {
    /// State quantities against altitude, one panel per quantity, every model on the same
    /// axes (a log scale where a quantity spans decades).
    Profile(ProfileArgs),
    /// Dynamic pressure and Mach number against time for one or more flights (CSV as for
    /// `aerostrata flight`), each flight's maximum q marked.
    Flight(FlightPlotArgs),
}

#[derive(Args)]
#[command(
    after_help = "Example:\n  aerostrata plot profile temperature density --model standard --model offset=15 \\\n    \
                 --model sounding=examples/data/vessaro_key_hot_humid.csv --to 30000 -o profile.svg"
)]
pub struct ProfileArgs {
    /// Quantities of the state to plot by their catalogue names, each on its own panel
    /// (at most 4) [default: temperature pressure density].
    #[arg(value_parser = QuantityParser)]
    quantities: Vec<Quantity>,
    /// A model, repeatable: `standard`, `offset=DT` (the standard with T + DT at its
    /// pressure; K or degF) or `sounding=FILE` [default: standard].
    #[arg(long = "model", value_name = "MODEL")]
    models: Vec<String>,
    /// Legend names, in the order of the models [default: from the models].
    #[arg(long = "label", value_name = "TEXT")]
    labels: Vec<String>,
    /// Lowest altitude, m or ft [default: 0, or the lowest model bottom if higher].
    #[arg(long, value_name = "Z", allow_negative_numbers = true)]
    from: Option<f64>,
    /// Highest altitude, m or ft [default: the highest model top, at most 86 km].
    #[arg(long, value_name = "Z", allow_negative_numbers = true)]
    to: Option<f64>,
    /// Altitudes as geopotential instead of geometric.
    #[arg(long)]
    geopotential: bool,
    /// The quantity axes' scale.
    #[arg(long, value_enum, default_value_t = Scale::Auto)]
    scale: Scale,
    /// The title [default: the quantities against altitude].
    #[arg(long, value_name = "TEXT")]
    title: Option<String>,
    #[command(flatten)]
    size: SizeArgs,
    #[command(flatten)]
    out: OutputArgs,
}

#[derive(Args)]
#[command(
    after_help = "Example:\n  aerostrata plot flight full.csv throttled.csv --label 'full thrust' --label throttled \\\n    \
                 --cd-table 0:0.4,1:0.6,2:0.45 --area 0.03 -o q.svg"
)]
pub struct FlightPlotArgs {
    /// Flight files (CSV as for `aerostrata flight`), each its own line; `-` reads stdin.
    #[arg(required = true)]
    files: Vec<PathBuf>,
    /// Legend names, in the order of the files [default: the file names].
    #[arg(long = "label", value_name = "TEXT")]
    labels: Vec<String>,
    #[command(flatten)]
    vehicle: VehicleArgs,
    /// The title [default: the quantities plotted].
    #[arg(long, value_name = "TEXT")]
    title: Option<String>,
    #[command(flatten)]
    size: SizeArgs,
    #[command(flatten)]
    out: OutputArgs,
}

/// `--width` and `--height`: the figure's size.
#[derive(Args)]
pub struct SizeArgs {
    /// Width of the figure, px [default: 900 for a flight, 380 a panel for a profile].
    /// Text keeps its size: a narrow figure (360 for a phone) wraps its panels, legends
    /// and notes instead of shrinking them.
    #[arg(long, value_name = "PX", value_parser = clap::value_parser!(u32).range(240..=20_000))]
    width: Option<u32>,
    /// Height of the figure, px [default: 720 for a flight, 640 for a profile]; it grows
    /// where the panels would otherwise be too short to read.
    #[arg(long, value_name = "PX", value_parser = clap::value_parser!(u32).range(100..=20_000))]
    height: Option<u32>,
}

impl SizeArgs {
    fn apply(&self, figure: &mut Figure) {
        figure.size = (self.width.unwrap_or(figure.size.0), self.height.unwrap_or(figure.size.1));
    }
}

/// Runs `aerostrata plot profile` or `aerostrata plot flight`.
///
/// # Errors
/// [`Failure::Input`] naming the option or file at fault; [`Failure::Io`] when writing
/// fails.
pub fn run(command: &PlotCommand) -> Result<(), Failure> {
    let (mut figure, out, size) = match command {
        PlotCommand::Profile(args) => (profile(args)?, &args.out, &args.size),
        PlotCommand::Flight(args) => (flights(args)?, &args.out, &args.size),
    };
    size.apply(&mut figure);
    let svg = figure.to_svg().map_err(Failure::Input)?;
    let mut destination = out.destination()?;
    destination.write_all(svg.as_bytes())?;
    destination.commit()
}

struct Model {
    label: String,
    atmosphere: Box<dyn Atmosphere>,
}

fn parse_model(spec: &str, units: UnitSystem) -> Result<Model, Failure> {
    let bad = |why: &str| Failure::Input(format!("--model '{spec}': {why}"));
    let (kind, value) = spec.split_once('=').map_or((spec, None), |(k, v)| (k, Some(v)));
    match (kind, value) {
        ("standard", None) => {
            Ok(Model { label: "US 1976 standard".to_owned(), atmosphere: Box::new(aerostrata::US1976) })
        }
        ("offset", Some(value)) => {
            let offset: f64 = value.parse().map_err(|_| bad("the offset is not a number"))?;
            let model = offset_model(offset, units).map_err(|f| f.within(&format!("--model '{spec}'")))?;
            let unit = units.unit(Quantity::TemperatureOffset).symbol();
            Ok(Model { label: format!("standard {offset:+} {unit}"), atmosphere: Box::new(model) })
        }
        ("sounding", Some(path)) => {
            let table = sounding::load(Path::new(path), None).map_err(|m| bad(&m))?;
            let name = Path::new(path).file_stem().map_or(path.into(), |n| n.to_string_lossy());
            Ok(Model { label: format!("sounding {name}"), atmosphere: Box::new(table) })
        }
        _ => Err(bad("expected standard, offset=DT or sounding=FILE")),
    }
}

fn profile(args: &ProfileArgs) -> Result<Figure, Failure> {
    let units = args.out.units;
    let quantities = if args.quantities.is_empty() {
        vec![Quantity::Temperature, Quantity::Pressure, Quantity::Density]
    } else {
        args.quantities.clone()
    };
    if quantities.len() > MAX_PANELS {
        return Err(Failure::Input(format!(
            "{} quantities given; a profile plot holds 1 to {MAX_PANELS}",
            quantities.len()
        )));
    }
    let specs = if args.models.is_empty() { vec!["standard".to_owned()] } else { args.models.clone() };
    let mut models = specs.iter().map(|s| parse_model(s, units)).collect::<Result<Vec<_>, _>>()?;
    if args.labels.len() > models.len() {
        return Err(Failure::Input(format!("{} labels for {} models", args.labels.len(), models.len())));
    }
    for (model, label) in models.iter_mut().zip(&args.labels) {
        model.label.clone_from(label);
    }
    let band_of = |m: &Model| band(m.atmosphere.range(), args.geopotential);
    let length = units.unit(altitude_quantity(args.geopotential));
    let lowest = models.iter().map(|m| band_of(m).0).fold(f64::INFINITY, f64::min);
    let highest = models.iter().map(|m| band_of(m).1).fold(f64::NEG_INFINITY, f64::max);
    let from = args.from.map_or(lowest.max(0.0), |z| length.to_si(z));
    let to = args.to.map_or(highest.min(86_000.0), |z| length.to_si(z));
    let unit = length.symbol();
    for (option, value) in [("--from", args.from), ("--to", args.to)] {
        if let Some(v) = value.filter(|v| !v.is_finite()) {
            let what = in_words(altitude_quantity(args.geopotential), length);
            return Err(Failure::Input(format!("{option} must be a finite number ({what}), got {v}")));
        }
    }
    let in_units = |m: f64| tidy(length.from_si(m));
    if to <= from {
        return Err(Failure::Input(format!(
            "--to {} {unit} must be above --from {} {unit}",
            in_units(to),
            in_units(from)
        )));
    }
    let mut plot = ProfilePlot::new(quantities, units, args.geopotential);
    for (model, spec) in models.iter().zip(&specs) {
        let (bottom, top) = band_of(model);
        let (lo, hi) = (from.max(bottom), to.min(top));
        if hi <= lo {
            return Err(Failure::Input(format!(
                "--model '{spec}' covers {} to {} {unit}, outside --from {} to --to {} {unit}",
                in_units(bottom),
                in_units(top),
                in_units(from),
                in_units(to)
            )));
        }
        plot.add(&model.label, model.atmosphere.as_ref(), lo, hi)
            .map_err(|e| Failure::Input(format!("--model '{spec}': {e}")))?;
    }
    Ok(plot.figure(args.scale, args.title.clone()))
}

fn flights(args: &FlightPlotArgs) -> Result<Figure, Failure> {
    let units = args.out.units;
    if args.labels.len() > args.files.len() {
        return Err(Failure::Input(format!("{} labels for {} files", args.labels.len(), args.files.len())));
    }
    let table = args.vehicle.table()?;
    let vehicle = args.vehicle.vehicle(&table, units)?;
    let mut traces = Vec::with_capacity(args.files.len());
    for (index, path) in args.files.iter().enumerate() {
        let name = path.display().to_string();
        let label = args.labels.get(index).cloned().unwrap_or_else(|| {
            path.file_stem().map_or_else(|| name.clone(), |s| s.to_string_lossy().into_owned())
        });
        let atmosphere = offset_model(args.vehicle.offset(), units)?;
        let mut scan = FlightScan::new(atmosphere, vehicle);
        let input = open_input(Some(path), When::Never)?;
        let mut reader = SampleReader::new(input, units);
        let mut trace = FlightTrace::new(label);
        while let Some(sample) = reader.next_sample().map_err(|f| f.within(&name))? {
            let point = scan
                .push(sample)
                .map_err(|e| Failure::Input(format!("{name}: line {}: {e}", reader.line_number())))?;
            trace.offer(point.time_s, point.dynamic_pressure_pa, point.mach);
        }
        if trace.is_empty() {
            return Err(Failure::Input(format!("{name}: no samples to plot")));
        }
        trace.summary = Some(scan.summary());
        traces.push(trace);
    }
    let title = args.title.clone().unwrap_or_else(flight_title);
    Ok(flight_figure(&title, &traces, units))
}
