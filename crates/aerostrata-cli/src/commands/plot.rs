//! `aerostrata plot profile` (state quantities against altitude, several models on the
//! same axes) and `aerostrata plot flight` (q, Mach number and drag against time, the
//! maxima marked): the options checked and the models and flights read, drawn by the
//! `plot` module and written as SVG.

use std::io::Write;
use std::path::PathBuf;

use aerostrata::units::Tidy;
use aerostrata::{Atmosphere, FlightScan, Quantity};
use clap::{Args, Subcommand};

use crate::args::model::{altitude_quantity, band, load_spec, model_help, Model, ModelArgs};
use crate::args::output::OutputArgs;
use crate::args::value::{FROM, TO};
use crate::args::vehicle::VehicleArgs;
use crate::failure::Failure;
use crate::input::lines::{open_input, source_name};
use crate::input::progress::When;
use crate::input::samples::SampleReader;
use crate::plot::chart::Figure;
use crate::plot::flight::{flight_figure, flight_title, FlightTrace};
use crate::plot::profile::{ProfilePlot, QuantityParser, Scale, MAX_PANELS};

#[derive(Subcommand)]
pub enum PlotCommand {
    /// State quantities against altitude, one panel per quantity, every model on the same
    /// axes (a log scale where a quantity spans decades).
    Profile(ProfileArgs),
    /// Dynamic pressure, Mach number and (with --cd or --cd-table and --area) drag against
    /// time for one or more flights (CSV as for `aerostrata flight`), the maxima marked.
    Flight(FlightPlotArgs),
}

/// The help of `plot profile --model`: repeatable.
fn profile_model_help() -> String {
    format!("A model, repeatable, each a line on every panel. {}", model_help())
}

#[derive(Args)]
#[command(
    after_help = "Examples:\n  aerostrata plot profile temperature density --model standard --model offset=+15K \\\n    \
                 --model sounding=examples/data/vessaro_key_hot_humid.csv --to 30km -o profile.svg\n  \
                 aerostrata plot profile temperature --model isothermal=250K --width 360 -o phone.svg"
)]
pub struct ProfileArgs {
    /// Quantities of the state to plot by their catalogue names, each on its own panel
    /// (at most 4) [default: temperature pressure density].
    #[arg(value_parser = QuantityParser)]
    quantities: Vec<Quantity>,
    #[arg(long = "model", value_name = "SPEC", help = profile_model_help())]
    models: Vec<String>,
    /// Legend names, in the order of the models [default: from the models].
    #[arg(long = "label", value_name = "TEXT")]
    labels: Vec<String>,
    #[arg(long, value_name = "Z", allow_hyphen_values = true,
          help = FROM.help("Lowest altitude [default: 0, or the lowest model bottom if higher]"))]
    from: Option<String>,
    #[arg(long, value_name = "Z", allow_hyphen_values = true,
          help = TO.help("Highest altitude [default: the highest model top, at most 86 km]"))]
    to: Option<String>,
    /// Altitudes (--from, --to and the axis) as geopotential instead of geometric.
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
                 --cd-table 0:0.4,1:0.6,2:0.45 --area 0.03m2 -o q.svg"
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
    #[command(flatten)]
    model: ModelArgs,
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
    /// Height of the figure, px [default: 300 a panel for a flight, 640 for a profile];
    /// it grows where the panels would otherwise be too short to read.
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
    let mut models =
        specs.iter().map(|s| load_spec(s, "--model", units)).collect::<Result<Vec<Model>, _>>()?;
    if args.labels.len() > models.len() {
        return Err(Failure::Input(format!("{} labels for {} models", args.labels.len(), models.len())));
    }
    for (model, label) in models.iter_mut().zip(&args.labels) {
        model.label.clone_from(label);
    }
    let band_of = |m: &Model| band(m.atmosphere.range(), args.geopotential);
    let altitude = altitude_quantity(args.geopotential);
    let length = units.unit(altitude);
    let lowest = models.iter().map(|m| band_of(m).0).fold(f64::INFINITY, f64::min);
    let highest = models.iter().map(|m| band_of(m).1).fold(f64::NEG_INFINITY, f64::max);
    let read = |option: &crate::args::value::Dimensional, text: &Option<String>| {
        text.as_deref().map(|t| option.of(altitude).si(t, units)).transpose()
    };
    let from = read(&FROM, &args.from)?.unwrap_or(lowest.max(0.0));
    let to = read(&TO, &args.to)?.unwrap_or(highest.min(86_000.0));
    let unit = length.symbol();
    let in_units = |m: f64| Tidy(length.from_si(m));
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
                "--model {spec} covers {} to {} {unit}, outside --from {} to --to {} {unit}",
                in_units(bottom),
                in_units(top),
                in_units(from),
                in_units(to)
            )));
        }
        plot.add(&model.label, &model.atmosphere, lo, hi)
            .map_err(|e| Failure::Input(format!("--model {spec}: {e}")))?;
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
    let model = args.model.load(units)?;
    let mut traces = Vec::with_capacity(args.files.len());
    for (index, path) in args.files.iter().enumerate() {
        let name = source_name(Some(path));
        let label = args.labels.get(index).cloned().unwrap_or_else(|| {
            path.file_stem().map_or_else(|| name.clone(), |s| s.to_string_lossy().into_owned())
        });
        let mut scan = FlightScan::new(&model.atmosphere, vehicle);
        let input = open_input(Some(path), When::Never)?;
        let mut reader = SampleReader::new(input, name.clone(), units);
        let mut trace = FlightTrace::new(label);
        while let Some(sample) = reader.next_sample()? {
            let point = sample.push(&mut scan).map_err(|e| reader.table().at_line(e))?;
            trace.offer_point(&point);
        }
        if trace.is_empty() {
            return Err(Failure::Input(format!("{name}: no samples to plot")));
        }
        trace.summary = Some(scan.summary());
        traces.push(trace);
    }
    let drag = traces.iter().any(FlightTrace::has_drag);
    let title = args.title.clone().unwrap_or_else(|| flight_title(drag));
    Ok(flight_figure(&title, &traces, units))
}
