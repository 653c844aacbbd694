//! The flight plot: dynamic pressure, Mach number and (for a vehicle with a drag model)
//! drag against time for one or more flights, each kept in bounded memory however long
//! it is, with the maxima (from the scan's exact summary) marked.

use aerostrata::flight::{FlightPoint, FlightSummary, Sample};
use aerostrata::units::{Unit, KILOPASCAL};
use aerostrata::Quantity;

use crate::format::tidy_short;
use crate::plot::chart::{Figure, Layout, Marker, Panel, Series};
use crate::plot::{axis_label, capitalised};
use crate::units::UnitSystem;

/// At most this many points are kept of a flight for plotting.
pub const FLIGHT_PLOT_POINTS: usize = 1024;

/// A kept point: time s, dynamic pressure Pa, Mach number and drag N (NaN where none).
type Point = (f64, f64, f64, f64);

/// A flight kept for plotting, with bounded memory: every sample is offered, and when
/// the buffer is full every other kept point is dropped and the stride doubles, so a
/// flight of any length keeps between half and all of [`FLIGHT_PLOT_POINTS`] points
/// spread evenly over it. The maxima are annotated from the scan's exact summary, not
/// from the kept points.
#[derive(Clone, Debug)]
pub struct FlightTrace {
    /// The flight's name in the legend.
    pub label: String,
    points: Vec<Point>,
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
        self.offer_with_drag(time_s, dynamic_pressure_pa, mach, None);
    }

    /// Offers one point of the core's scan, its drag with it.
    pub fn offer_point(&mut self, point: &FlightPoint) {
        self.offer_with_drag(point.time_s, point.dynamic_pressure_pa, point.mach, point.drag_n);
    }

    fn offer_with_drag(
        &mut self,
        time_s: f64,
        dynamic_pressure_pa: f64,
        mach: Option<f64>,
        drag_n: Option<f64>,
    ) {
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
                let missing = |v: Option<f64>| v.unwrap_or(f64::NAN);
                self.points.push((time_s, dynamic_pressure_pa, missing(mach), missing(drag_n)));
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

    /// Whether any kept point has a drag.
    pub fn has_drag(&self) -> bool {
        self.points.iter().any(|p| p.3.is_finite())
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

/// The flight figure's title when none is given: the quantities it plots.
pub fn flight_title(drag: bool) -> String {
    let label = |q: Quantity| q.info().label;
    let (q, mach) = (label(Quantity::DynamicPressure), label(Quantity::Mach));
    capitalised(if drag {
        format!("{q}, {mach} and {}", label(Quantity::Drag))
    } else {
        format!("{q} and {mach}")
    })
}

/// Dynamic pressure and Mach number (and drag, where any flight has one) against time
/// for one or more flights, on stacked panels, each flight's maximum q marked on the
/// first two and its maximum drag on the third.
pub fn flight_figure(title: &str, traces: &[FlightTrace], units: UnitSystem) -> Figure {
    let (q, t, drag) = (Quantity::DynamicPressure.info(), Quantity::Time.info(), Quantity::Drag.info());
    let q_unit = pressure_unit(units);
    let t_unit = units.unit(Quantity::Time);
    let drag_unit = units.unit(Quantity::Drag);
    let against_time = |y_label: String| Panel {
        x_label: axis_label(Quantity::Time, t_unit),
        y_label,
        y_from_zero: true,
        ..Panel::default()
    };
    // The symbols too: they name the maxima marked on the panels.
    let mut q_panel = against_time(format!("{} {} ({})", q.label, q.symbol, q_unit.symbol()));
    let mut mach = against_time(axis_label(Quantity::Mach, units.unit(Quantity::Mach)));
    let mut drag_panel = against_time(format!("{} {} ({})", drag.label, drag.symbol, drag_unit.symbol()));
    let at = |value: f64, unit: &Unit, time: f64| {
        format!(
            "{} {} at {} = {} {}",
            tidy_short(value),
            unit.symbol(),
            t.symbol,
            tidy_short(time),
            t_unit.symbol()
        )
    };
    for (index, trace) in traces.iter().enumerate() {
        let line = |y: &dyn Fn(&Point) -> f64| Series {
            label: trace.label.clone(),
            points: trace.points.iter().map(|p| (t_unit.from_si(p.0), y(p))).collect(),
            dashed: false,
            color: index,
        };
        q_panel.series.push(line(&|p| q_unit.from_si(p.1)));
        mach.series.push(line(&|p| p.2));
        if trace.has_drag() {
            drag_panel.series.push(line(&|p| drag_unit.from_si(p.3)));
        }
        let Some(summary) = &trace.summary else { continue };
        if let Some(peak) = summary.max_dynamic_pressure {
            let (time, value) = (t_unit.from_si(peak.time_s), q_unit.from_si(peak.dynamic_pressure_pa));
            let text = format!("max {} {}", q.symbol, at(value, q_unit, time));
            q_panel.markers.push(Marker { at: (time, value), text, color: index });
            if let Some(m) = peak.mach {
                let text = format!("Mach {} at max {}", tidy_short(m), q.symbol);
                mach.markers.push(Marker { at: (time, m), text, color: index });
            }
        }
        if let Some(peak) = summary.max_drag.filter(|_| trace.has_drag()) {
            let (time, value) = (t_unit.from_si(peak.time_s), drag_unit.from_si(peak.value));
            let text = format!("max {} {}", drag.symbol, at(value, drag_unit, time));
            drag_panel.markers.push(Marker { at: (time, value), text, color: index });
        }
    }
    let mut panels = vec![q_panel, mach];
    if !drag_panel.series.is_empty() {
        panels.push(drag_panel);
    }
    let height = 120 + 300 * panels.len() as u32;
    Figure { title: title.to_owned(), layout: Layout::Stacked, panels, size: (900, height) }
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
        trace.offer_point(&scan.push(sample)?);
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
        assert!(!trace.has_drag());
    }

    #[test]
    fn a_drag_panel_only_with_a_drag() {
        let mut with = FlightTrace::new("with drag");
        let mut without = FlightTrace::new("without");
        for i in 0..10 {
            let t = f64::from(i);
            with.offer_with_drag(t, 1000.0 * t, Some(0.1 * t), Some(5.0 * t));
            without.offer(t, 1000.0 * t, Some(0.1 * t));
        }
        assert_eq!(flight_figure("a", &[without.clone()], UnitSystem::Si).panels.len(), 2);
        let figure = flight_figure("b", &[without, with], UnitSystem::Si);
        assert_eq!(figure.panels.len(), 3);
        assert_eq!(figure.panels[2].y_label, "drag D (N)");
        assert_eq!(figure.panels[2].series[0].color, 1, "the flight's own colour");
        assert_eq!(flight_title(true), "Dynamic pressure, Mach number and drag");
    }
}
