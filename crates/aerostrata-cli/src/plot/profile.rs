//! The profile plot: state quantities against altitude, one panel per quantity side by
//! side, each model a line of evenly spaced evaluations on every panel, on a log axis
//! where a quantity spans decades.

use aerostrata::{Altitude, Atmosphere};
use clap::ValueEnum;

use crate::output::state::state_field;
use crate::plot::chart::{Figure, Layout, LegendPosition, Panel, Series};
use crate::units::{Quantity, UnitSystem};

#[derive(Clone, Copy, PartialEq, Eq, ValueEnum)]
pub enum Scale {
    /// Logarithmic where a quantity spans more than a decade and a half, linear otherwise.
    Auto,
    /// Linear.
    Linear,
    /// Logarithmic.
    Log,
}

/// The state quantities that can be plotted.
#[derive(Clone, Copy, PartialEq, Eq, Debug, ValueEnum)]
pub enum PlotQuantity {
    Temperature,
    MolecularTemperature,
    Pressure,
    Density,
    SpeedOfSound,
    DynamicViscosity,
    KinematicViscosity,
    ThermalConductivity,
    Gravity,
    PressureScaleHeight,
    NumberDensity,
    MeanParticleSpeed,
    MeanFreePath,
    CollisionFrequency,
    MeanMolarMass,
    TemperatureRatio,
    PressureRatio,
    DensityRatio,
}

impl PlotQuantity {
    /// Its index in `State::fields`.
    fn field(self) -> usize {
        self as usize + 2
    }

    /// Its name in words (`speed of sound`) and the quantity of its unit.
    fn name(self) -> (String, Quantity) {
        let (base, quantity) = state_field(self.field());
        (base.replace('_', " "), quantity)
    }
}

/// The most panels a profile figure holds.
pub const MAX_PANELS: usize = 4;
/// Altitudes per model line.
const PROFILE_POINTS: usize = 300;

/// A profile figure being drawn, one model's line at a time.
pub struct ProfilePlot {
    quantities: Vec<PlotQuantity>,
    units: UnitSystem,
    geopotential: bool,
    panels: Vec<Panel>,
    lines: usize,
}

impl ProfilePlot {
    /// Empty panels for `quantities` in `units`, against geopotential or geometric altitude.
    pub fn new(quantities: Vec<PlotQuantity>, units: UnitSystem, geopotential: bool) -> Self {
        let kind = if geopotential { "geopotential" } else { "geometric" };
        let altitude_unit = altitude_scale(units).1;
        let panels = quantities
            .iter()
            .map(|q| {
                let (name, quantity) = q.name();
                let symbol = units.symbol(quantity);
                Panel {
                    x_label: if symbol.is_empty() { name } else { format!("{name} ({symbol})") },
                    y_label: format!("{kind} altitude ({altitude_unit})"),
                    // Low and to the left is where profiles of the air leave room.
                    legend: LegendPosition::LowerLeft,
                    ..Panel::default()
                }
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
        let altitude_scale = altitude_scale(self.units).0;
        let mut lines = vec![Vec::with_capacity(PROFILE_POINTS + 1); self.quantities.len()];
        for i in 0..=PROFILE_POINTS {
            let z = (from_m + (to_m - from_m) * i as f64 / PROFILE_POINTS as f64).min(to_m);
            let altitude =
                if self.geopotential { Altitude::geopotential_m(z) } else { Altitude::geometric_m(z) };
            let state = altitude.and_then(|a| atmosphere.state(a))?;
            let fields = state.fields();
            for (line, q) in lines.iter_mut().zip(&self.quantities) {
                let (_, quantity) = state_field(q.field());
                let value = fields[q.field()].1.map_or(f64::NAN, |v| self.units.from_si(quantity, v));
                line.push((value, z * altitude_scale));
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
            let names: Vec<String> = self.quantities.iter().map(|q| q.name().0).collect();
            let mut title = names.join(", ");
            if let Some(first) = title.get_mut(0..1) {
                first.make_ascii_uppercase();
            }
            format!("{title} against altitude")
        });
        let width = 120 + 380 * self.panels.len() as u32;
        Figure { title, layout: Layout::SideBySide, panels: self.panels, size: (width.max(560), 640) }
    }
}

/// Altitudes on the plot: km in SI, ft in US units (the factor from m, and the unit).
fn altitude_scale(units: UnitSystem) -> (f64, &'static str) {
    match units {
        UnitSystem::Si => (1e-3, "km"),
        UnitSystem::Us => (1.0 / aerostrata::constants::units::FOOT_M, "ft"),
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
        let quantities = vec![PlotQuantity::Temperature, PlotQuantity::Pressure];
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
    fn an_altitude_outside_the_model_is_the_cores_error() {
        let mut plot = ProfilePlot::new(vec![PlotQuantity::Density], UnitSystem::Us, true);
        let error = plot.add("standard", &aerostrata::US1976, 0.0, 2.0e6).unwrap_err();
        assert!(error.to_string().contains("outside the allowed range"), "{error}");
    }
}
