//! The flight plot: dynamic pressure and Mach number against time for one or more
//! flights, each kept in bounded memory however long it is, with the maximum q (from the
//! scan's exact summary) marked.

use aerostrata::flight::{FlightSummary, Sample};
use aerostrata::units::{Unit, KILOPASCAL};
use aerostrata::Quantity;

use crate::format::tidy_short;
use crate::plot::chart::{Figure, Layout, Marker, Panel, Series};
use crate::plot::{axis_label, capitalised};
use crate::units::UnitSystem;

/// At most this many points are kept of a flight for plotting.
pub const FLIGHT_PLOT_POINTS: usize = 1024;

/// A flight kept for plotting, with bounded memory: every sample is offered, and when
/// the buffer is full every other kept point is dropped and the stride doubles, so a
/// flight of any length keeps between half and all of [`FLIGHT_PLOT_POINTS`] points
/// spread evenly over it. The maximum-q point is annotated from the scan's exact summary,
/// not from the kept points.
#[derive(Clone, Debug)]
pub struct FlightTrace {
    /// The flight's name in the legend.
    pub label: String,
    /// Kept (time s, dynamic pressure Pa, Mach number or NaN).
    points: Vec<(f64, f64, f64)>,
    stride: usize,
    offered: usize,
    /// The scan's summary (set by the caller when the flight is complete).
    pub summary: Option<FlightSummary>,
}

impl FlightTrace {
    /// An empty trace named `label`.
    pub fn new(label: impl Into<String>) -> Self {
        Self { label: label.into(), points: Vec::new(), stride: 1, offered: 0, summary: None }
    }

    /// Offers one sample's time (s), dynamic pressure (Pa) and Mach number.
    pub fn offer(&mut self, time_s: f64, dynamic_pressure_pa: f64, mach: Option<f64>) {
        if self.offered % self.stride == 0 {
            if self.points.len() == FLIGHT_PLOT_POINTS {
                let mut index = 0;
                self.points.retain(|_| {
                    index += 1;
                    index % 2 == 1
                });
                self.stride *= 2;
            }
            if self.offered % self.stride == 0 {
                self.points.push((time_s, dynamic_pressure_pa, mach.unwrap_or(f64::NAN)));
            }
        }
        self.offered += 1;
    }

    /// The points kept.
    pub fn len(&self) -> usize {
        self.points.len()
    }

    /// Whether no point is kept.
    pub fn is_empty(&self) -> bool {
        self.points.is_empty()
    }
}

/// The unit of dynamic pressure on plots: kPa in SI (readable ticks), the catalogue's
/// unit otherwise.
fn pressure_unit(units: UnitSystem) -> &'static Unit {
    match units {
        UnitSystem::Si => &KILOPASCAL,
        UnitSystem::Us => units.unit(Quantity::DynamicPressure),
    }
}

/// The flight figure's title when none is given: the two quantities it plots.
pub fn flight_title() -> String {
    let (q, mach) = (Quantity::DynamicPressure.info().label, Quantity::Mach.info().label);
    capitalised(format!("{q} and {mach}"))
}

/// Dynamic pressure and Mach number against time for one or more flights, on two
/// stacked panels, each flight's maximum q marked on both.
pub fn flight_figure(title: &str, traces: &[FlightTrace], units: UnitSystem) -> Figure {
    let (q, t) = (Quantity::DynamicPressure.info(), Quantity::Time.info());
    let q_unit = pressure_unit(units);
    let t_unit = units.unit(Quantity::Time);
    let against_time = |y_label: String| Panel {
        x_label: axis_label(Quantity::Time, t_unit),
        y_label,
        y_from_zero: true,
        ..Panel::default()
    };
    // q's symbol too: it names the maximum marked on the panel.
    let mut q_panel = against_time(format!("{} {} ({})", q.label, q.symbol, q_unit.symbol()));
    let mut mach = against_time(axis_label(Quantity::Mach, units.unit(Quantity::Mach)));
    for (index, trace) in traces.iter().enumerate() {
        let line = |y: &dyn Fn(&(f64, f64, f64)) -> f64| Series {
            label: trace.label.clone(),
            points: trace.points.iter().map(|p| (t_unit.from_si(p.0), y(p))).collect(),
            dashed: false,
            color: index,
        };
        q_panel.series.push(line(&|p| q_unit.from_si(p.1)));
        mach.series.push(line(&|p| p.2));
        if let Some(peak) = trace.summary.as_ref().and_then(|s| s.max_dynamic_pressure) {
            let (time, value) = (t_unit.from_si(peak.time_s), q_unit.from_si(peak.dynamic_pressure_pa));
            q_panel.markers.push(Marker {
                at: (time, value),
                text: format!(
                    "max {} {} {} at {} = {} {}",
                    q.symbol,
                    tidy_short(value),
                    q_unit.symbol(),
                    t.symbol,
                    tidy_short(time),
                    t_unit.symbol()
                ),
                color: index,
            });
            if let Some(m) = peak.mach {
                mach.markers.push(Marker {
                    at: (time, m),
                    text: format!("Mach {} at max {}", tidy_short(m), q.symbol),
                    color: index,
                });
            }
        }
    }
    Figure { title: title.to_owned(), layout: Layout::Stacked, panels: vec![q_panel, mach], size: (900, 720) }
}

/// A convenience for callers that hold whole samples: the trace of `samples` as the
/// core's scan sees them through `scan`.
///
/// # Errors
/// The first sample the scan rejects, with its index.
pub fn trace_flight<A: aerostrata::Atmosphere>(
    label: &str,
    samples: impl IntoIterator<Item = Sample>,
    mut scan: aerostrata::FlightScan<'_, A>,
) -> Result<FlightTrace, aerostrata::Error> {
    let mut trace = FlightTrace::new(label);
    for sample in samples {
        let point = scan.push(sample)?;
        trace.offer(point.time_s, point.dynamic_pressure_pa, point.mach);
    }
    trace.summary = Some(scan.summary());
    Ok(trace)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_trace_keeps_bounded_evenly_spread_points() {
        let mut trace = FlightTrace::new("x");
        for i in 0..1_000_000 {
            trace.offer(i as f64, 1.0, None);
        }
        assert!(
            trace.len() <= FLIGHT_PLOT_POINTS && trace.len() >= FLIGHT_PLOT_POINTS / 2,
            "{}",
            trace.len()
        );
        let gaps: Vec<f64> = trace.points.windows(2).map(|w| w[1].0 - w[0].0).collect();
        assert!(gaps.iter().all(|g| *g == gaps[0]), "evenly spread");
        assert_eq!(trace.points[0].0, 0.0);
    }
}
