//! The profile plot: state quantities against altitude, one panel per quantity side by
//! side, each model a line of evenly spaced evaluations on every panel, on a log axis
//! where a quantity spans decades.

use aerostrata::quantity::Group;
use aerostrata::units::{Unit, KILOMETRE};
use aerostrata::{Altitude, Atmosphere, Quantity};
use clap::builder::{PossibleValue, PossibleValuesParser, TypedValueParser};
use clap::ValueEnum;

use crate::args::model::altitude_quantity;
use crate::plot::chart::{Figure, Layout, Panel, Series};
use crate::plot::{axis_label, capitalised};
use crate::units::UnitSystem;

#[derive(Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Scale {
    /// Logarithmic where a quantity spans more than a decade and a half, linear otherwise.
    Auto,
    /// Linear.
    Linear,
    /// Logarithmic.
    Log,
}

/// The quantities a profile can plot: the state's, but for the altitudes it is plotted
/// against.
pub fn plottable() -> impl Iterator<Item = Quantity> {
    Quantity::of_group(Group::State)
        .filter(|q| !matches!(q, Quantity::GeometricAltitude | Quantity::GeopotentialAltitude))
}

/// A plottable quantity by its catalogue name (`speed_of_sound`; `speed-of-sound` too),
/// the names offered to the help and the shell completions.
#[derive(Clone)]
pub struct QuantityParser;

impl TypedValueParser for QuantityParser {
    type Value = Quantity;

    fn parse_ref(
        &self,
        command: &clap::Command,
        argument: Option<&clap::Arg>,
        value: &std::ffi::OsStr,
    ) -> Result<Quantity, clap::Error> {
        let name = value.to_str().map(|text| text.replace('-', "_"));
        if let Some(quantity) = plottable().find(|q| Some(q.name()) == name.as_deref()) {
            return Ok(quantity);
        }
        // Not one of them: clap's own message, listing them.
        let names: Vec<&'static str> = plottable().map(Quantity::name).collect();
        match PossibleValuesParser::new(names).parse_ref(command, argument, value) {
            Err(error) => Err(error),
            Ok(_) => Err(clap::Error::new(clap::error::ErrorKind::InvalidValue).with_cmd(command)),
        }
    }

    fn possible_values(&self) -> Option<Box<dyn Iterator<Item = PossibleValue> + '_>> {
        Some(Box::new(plottable().map(|q| PossibleValue::new(q.name()))))
    }
}

/// The most panels a profile figure holds.
pub const MAX_PANELS: usize = 4;
/// Altitudes per model line.
const PROFILE_POINTS: usize = 300;

/// A profile figure being drawn, one model's line at a time.
pub struct ProfilePlot {
    quantities: Vec<Quantity>,
    units: UnitSystem,
    geopotential: bool,
    panels: Vec<Panel>,
    lines: usize,
}

impl ProfilePlot {
    /// Empty panels for `quantities` in `units`, against geopotential or geometric altitude.
    pub fn new(quantities: Vec<Quantity>, units: UnitSystem, geopotential: bool) -> Self {
        let altitude = altitude_quantity(geopotential);
        let panels = quantities
            .iter()
            .map(|q| Panel {
                x_label: axis_label(*q, units.unit(*q)),
                y_label: axis_label(altitude, altitude_unit(units, altitude)),
                ..Panel::default()
            })
            .collect();
        ProfilePlot { quantities, units, geopotential, panels, lines: 0 }
    }

    /// Adds `atmosphere`'s line, named `label`, from `from_m` to `to_m` (the plot's kind
    /// of altitude, m), on every panel.
    ///
    /// # Errors
    /// The core's error for the first altitude `atmosphere` cannot evaluate.
    pub fn add(
        &mut self,
        label: &str,
        atmosphere: &dyn Atmosphere,
        from_m: f64,
        to_m: f64,
    ) -> Result<(), aerostrata::Error> {
        let altitude_unit = altitude_unit(self.units, altitude_quantity(self.geopotential));
        let mut lines = vec![Vec::with_capacity(PROFILE_POINTS + 1); self.quantities.len()];
        for i in 0..=PROFILE_POINTS {
            let z = (from_m + (to_m - from_m) * i as f64 / PROFILE_POINTS as f64).min(to_m);
            let altitude =
                if self.geopotential { Altitude::geopotential_m(z) } else { Altitude::geometric_m(z) };
            let state = altitude.and_then(|a| atmosphere.state(a))?;
            for (line, q) in lines.iter_mut().zip(&self.quantities) {
                // A gap in the line where the model leaves the quantity undefined.
                let value = state.get(*q).map_or(f64::NAN, |v| self.units.from_si(*q, v));
                line.push((value, altitude_unit.from_si(z)));
            }
        }
        for (panel_index, (panel, points)) in self.panels.iter_mut().zip(lines).enumerate() {
            // The legend once, on the first panel: the colours are the same on every one.
            let label = if panel_index == 0 { label.to_owned() } else { String::new() };
            panel.series.push(Series { label, points, dashed: false, color: self.lines });
        }
        self.lines += 1;
        Ok(())
    }

    /// The figure, its quantity axes on `scale`, titled `title` or after the quantities.
    pub fn figure(mut self, scale: Scale, title: Option<String>) -> Figure {
        for panel in &mut self.panels {
            panel.log_x = match scale {
                Scale::Linear => false,
                Scale::Log => true,
                Scale::Auto => spans_decades(panel),
            };
        }
        let title = title.unwrap_or_else(|| {
            let labels: Vec<&str> = self.quantities.iter().map(|q| q.info().label).collect();
            capitalised(format!("{} against altitude", labels.join(", ")))
        });
        let width = 120 + 380 * self.panels.len() as u32;
        Figure { title, layout: Layout::SideBySide, panels: self.panels, size: (width.max(560), 640) }
    }
}

/// The unit of the altitude axis: km in SI (readable ticks up to 1000 km), the
/// catalogue's unit otherwise.
fn altitude_unit(units: UnitSystem, altitude: Quantity) -> &'static Unit {
    match units {
        UnitSystem::Si => &KILOMETRE,
        UnitSystem::Us => units.unit(altitude),
    }
}

/// Whether a panel's values are all positive and span more than a decade and a half.
fn spans_decades(panel: &Panel) -> bool {
    let values = panel.series.iter().flat_map(|s| s.points.iter().map(|p| p.0)).filter(|v| v.is_finite());
    let (mut lo, mut hi) = (f64::INFINITY, 0.0f64);
    for v in values {
        if v <= 0.0 {
            return false;
        }
        lo = lo.min(v);
        hi = hi.max(v);
    }
    hi > 0.0 && hi / lo > 30.0
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn one_legend_and_a_log_axis_where_a_quantity_spans_decades() {
        let quantities = vec![Quantity::Temperature, Quantity::Pressure];
        let mut plot = ProfilePlot::new(quantities, UnitSystem::Si, false);
        plot.add("standard", &aerostrata::US1976, 0.0, 50_000.0).unwrap();
        let figure = plot.figure(Scale::Auto, None);
        assert_eq!(figure.title, "Temperature, pressure against altitude");
        let [temperature, pressure] = &figure.panels[..] else { panic!("two panels") };
        assert_eq!(temperature.x_label, "temperature (K)");
        assert_eq!(pressure.y_label, "geometric altitude (km)");
        assert_eq!(temperature.series[0].label, "standard");
        assert!(pressure.series[0].label.is_empty(), "the legend once, on the first panel");
        // Pressure falls more than a thousandfold over 50 km (101 325 Pa to about 80 Pa,
        // U.S. Standard Atmosphere 1976, from memory), temperature by less than a factor of 2.
        assert!(pressure.log_x && !temperature.log_x);
        assert_eq!(temperature.series[0].points.len(), PROFILE_POINTS + 1);
        assert_eq!(temperature.series[0].points.last().unwrap().1, 50.0);
    }

    #[test]
    fn quantities_are_read_by_their_catalogue_names() {
        let command = clap::Command::new("plot");
        let parse = |text: &str| QuantityParser.parse_ref(&command, None, std::ffi::OsStr::new(text));
        assert_eq!(parse("speed_of_sound").unwrap(), Quantity::SpeedOfSound);
        assert_eq!(parse("mean-free-path").unwrap(), Quantity::MeanFreePath);
        assert!(parse("geometric_altitude").is_err(), "the altitudes are the vertical axis");
        assert!(parse("speed").is_err());
        assert_eq!(plottable().count(), Quantity::of_group(Group::State).count() - 2);
    }

    #[test]
    fn an_altitude_outside_the_model_is_the_cores_error() {
        let mut plot = ProfilePlot::new(vec![Quantity::Density], UnitSystem::Us, true);
        let error = plot.add("standard", &aerostrata::US1976, 0.0, 2.0e6).unwrap_err();
        assert!(error.to_string().contains("outside the allowed range"), "{error}");
    }
}
