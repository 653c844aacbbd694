//! The chart drawing: panels of line series with titles, axis labels, legends and
//! annotated points, drawn with plotters' SVG backend. Text is written as SVG `<text>`
//! elements (plotters' built-in size estimate lays it out), so no font is needed to build
//! or draw; the viewer renders the text with its own sans-serif font.

use plotters::coord::ranged1d::{AsRangedCoord, ValueFormatter};
use plotters::coord::Shift;
use plotters::prelude::*;

use crate::format::tick;

/// One line on a panel.
#[derive(Clone, Debug, Default)]
pub struct Series {
    /// Its name in the legend (empty: not in the legend).
    pub label: String,
    /// (x, y) points in drawing order; a non-finite coordinate breaks the line.
    pub points: Vec<(f64, f64)>,
    /// Drawn dashed rather than solid.
    pub dashed: bool,
    /// Index into the palette; series of the same thing on several panels share it.
    pub color: usize,
}

/// An annotated point: a dot and a note beside it.
#[derive(Clone, Debug)]
pub struct Marker {
    /// Where, in the panel's data coordinates.
    pub at: (f64, f64),
    /// The note.
    pub text: String,
    /// Index into the palette.
    pub color: usize,
}

/// Where a panel's legend goes.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub enum LegendPosition {
    /// Upper right corner.
    #[default]
    UpperRight,
    /// Upper left corner.
    UpperLeft,
    /// Lower right corner.
    LowerRight,
    /// Lower left corner.
    LowerLeft,
}

/// One set of axes.
#[derive(Clone, Debug, Default)]
pub struct Panel {
    /// The x axis's label, with its unit.
    pub x_label: String,
    /// The y axis's label, with its unit.
    pub y_label: String,
    /// The lines.
    pub series: Vec<Series>,
    /// Annotated points.
    pub markers: Vec<Marker>,
    /// A logarithmic x axis.
    pub log_x: bool,
    /// A logarithmic y axis.
    pub log_y: bool,
    /// Start the y axis at 0 when every value is positive (for q, Mach, heights).
    pub y_from_zero: bool,
    /// Where the legend goes.
    pub legend: LegendPosition,
}

/// How panels share a figure.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Layout {
    /// One above the other, sharing the x range (quantities against time).
    Stacked,
    /// Side by side, sharing the y range (quantities against altitude).
    SideBySide,
}

/// A whole figure.
#[derive(Clone, Debug)]
pub struct Figure {
    /// The title above every panel.
    pub title: String,
    /// How the panels are arranged.
    pub layout: Layout,
    /// The panels, top to bottom or left to right.
    pub panels: Vec<Panel>,
    /// Width and height, px.
    pub size: (u32, u32),
}

/// Distinguishable line colours (a common qualitative palette).
const PALETTE: [RGBColor; 6] = [
    RGBColor(31, 119, 180),
    RGBColor(214, 39, 40),
    RGBColor(44, 160, 44),
    RGBColor(148, 103, 189),
    RGBColor(255, 127, 14),
    RGBColor(110, 110, 110),
];

const FONT: &str = "sans-serif";

fn color(index: usize) -> RGBColor {
    PALETTE[index % PALETTE.len()]
}

/// A range of data with a little room on either side.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Span {
    lo: f64,
    hi: f64,
}

impl Span {
    fn of(values: impl Iterator<Item = f64>, log: bool) -> Option<Span> {
        let mut span: Option<Span> = None;
        for v in values.filter(|v| v.is_finite() && (!log || *v > 0.0)) {
            span = Some(match span {
                None => Span { lo: v, hi: v },
                Some(s) => Span { lo: s.lo.min(v), hi: s.hi.max(v) },
            });
        }
        span
    }

    fn union(self, other: Span) -> Span {
        Span { lo: self.lo.min(other.lo), hi: self.hi.max(other.hi) }
    }

    /// Widened by a twentieth of the span (a factor on a log axis); never empty.
    fn padded(self, log: bool) -> Span {
        if log {
            let (lo, hi) =
                if self.hi > self.lo { (self.lo, self.hi) } else { (self.lo / 2.0, self.hi * 2.0) };
            let factor = (hi / lo).powf(0.05);
            Span { lo: lo / factor, hi: hi * factor }
        } else {
            let width = self.hi - self.lo;
            let room = if width > 0.0 { 0.05 * width } else { 0.5 * self.lo.abs().max(1.0) };
            Span { lo: self.lo - room, hi: self.hi + room }
        }
    }
}

type Area<'a> = DrawingArea<SVGBackend<'a>, Shift>;

fn failed(error: impl std::fmt::Display) -> String {
    format!("cannot draw the plot: {error}")
}

impl Figure {
    /// The figure as an SVG document.
    ///
    /// # Errors
    /// A message when a panel has nothing finite to draw (on a log axis: nothing
    /// positive) or plotters fails.
    pub fn to_svg(&self) -> Result<String, String> {
        let mut spans = Vec::with_capacity(self.panels.len());
        for (number, panel) in self.panels.iter().enumerate() {
            let points = || {
                panel.series.iter().flat_map(|s| s.points.iter()).chain(panel.markers.iter().map(|m| &m.at))
            };
            let x = Span::of(points().map(|p| p.0), panel.log_x);
            let y = Span::of(points().map(|p| p.1), panel.log_y);
            match (x, y) {
                (Some(x), Some(y)) => spans.push((x, y)),
                _ => {
                    return Err(format!(
                        "plot panel {}: no finite (and, on a log axis, positive) values to draw",
                        number + 1
                    ))
                }
            }
        }
        match self.layout {
            Layout::Stacked => {
                let shared = spans.iter().map(|s| s.0).reduce(Span::union);
                spans.iter_mut().for_each(|s| s.0 = shared.unwrap_or(s.0));
            }
            Layout::SideBySide => {
                let shared = spans.iter().map(|s| s.1).reduce(Span::union);
                spans.iter_mut().for_each(|s| s.1 = shared.unwrap_or(s.1));
            }
        }
        let mut svg = String::new();
        {
            let root = SVGBackend::with_string(&mut svg, self.size).into_drawing_area();
            root.fill(&WHITE).map_err(failed)?;
            let root = root.titled(&self.title, (FONT, 22)).map_err(failed)?;
            let shape = match self.layout {
                Layout::Stacked => (self.panels.len(), 1),
                Layout::SideBySide => (1, self.panels.len()),
            };
            let areas = root.split_evenly(shape);
            for ((area, panel), (x, y)) in areas.iter().zip(&self.panels).zip(spans) {
                let mut y = y.padded(panel.log_y);
                if !panel.markers.is_empty() && !panel.log_y {
                    // Room above the highest point for its note.
                    y.hi += 0.06 * (y.hi - y.lo);
                }
                if panel.y_from_zero && !panel.log_y && y.lo < 0.0 && spans_positive(panel) {
                    y.lo = 0.0;
                }
                let x = x.padded(panel.log_x);
                match (panel.log_x, panel.log_y) {
                    (false, false) => draw_panel(area, panel, x.lo..x.hi, y.lo..y.hi)?,
                    (true, false) => draw_panel(area, panel, (x.lo..x.hi).log_scale(), y.lo..y.hi)?,
                    (false, true) => draw_panel(area, panel, x.lo..x.hi, (y.lo..y.hi).log_scale())?,
                    (true, true) => {
                        draw_panel(area, panel, (x.lo..x.hi).log_scale(), (y.lo..y.hi).log_scale())?
                    }
                }
            }
            root.present().map_err(failed)?;
        }
        Ok(svg)
    }
}

fn spans_positive(panel: &Panel) -> bool {
    panel.series.iter().flat_map(|s| &s.points).all(|p| !p.1.is_finite() || p.1 >= 0.0)
}

/// The runs of finite points of `points`.
fn segments(points: &[(f64, f64)], log_x: bool, log_y: bool) -> Vec<Vec<(f64, f64)>> {
    let usable =
        |p: &(f64, f64)| p.0.is_finite() && p.1.is_finite() && (!log_x || p.0 > 0.0) && (!log_y || p.1 > 0.0);
    let mut runs: Vec<Vec<(f64, f64)>> = vec![Vec::new()];
    for p in points {
        if usable(p) {
            if let Some(run) = runs.last_mut() {
                run.push(*p);
            }
        } else if runs.last().is_some_and(|run| !run.is_empty()) {
            runs.push(Vec::new());
        }
    }
    runs.retain(|run| !run.is_empty());
    runs
}

fn draw_panel<X, Y>(area: &Area, panel: &Panel, x: X, y: Y) -> Result<(), String>
where
    X: AsRangedCoord<Value = f64>,
    Y: AsRangedCoord<Value = f64>,
    X::CoordDescType: ValueFormatter<f64>,
    Y::CoordDescType: ValueFormatter<f64>,
{
    let (width, height) = area.dim_in_pixel();
    let (narrow, short) = (width < 500, height < 300);
    let mut chart = ChartBuilder::on(area)
        .margin(12)
        .x_label_area_size(46)
        .y_label_area_size(72)
        .build_cartesian_2d(x, y)
        .map_err(failed)?;
    let x_format = |v: &f64| tick(*v);
    let y_format = |v: &f64| tick(*v);
    chart
        .configure_mesh()
        .x_labels(if narrow { 5 } else { 10 })
        .y_labels(if short { 5 } else { 10 })
        .x_desc(&panel.x_label)
        .y_desc(&panel.y_label)
        .x_label_formatter(&x_format)
        .y_label_formatter(&y_format)
        .axis_desc_style((FONT, 15))
        .label_style((FONT, 12))
        .light_line_style(RGBColor(235, 235, 235))
        .bold_line_style(RGBColor(210, 210, 210))
        .draw()
        .map_err(failed)?;
    let mut legend = false;
    for series in &panel.series {
        let colour = color(series.color);
        let style = colour.stroke_width(2);
        let mut labelled = series.label.is_empty();
        for run in segments(&series.points, panel.log_x, panel.log_y) {
            let drawn = if series.dashed {
                chart.draw_series(DashedLineSeries::new(run, 8, 5, style)).map_err(failed)?
            } else {
                chart.draw_series(LineSeries::new(run, style)).map_err(failed)?
            };
            if !labelled {
                labelled = true;
                legend = true;
                let dashed = series.dashed;
                drawn.label(series.label.as_str()).legend(move |(x, y)| {
                    let end = if dashed { 10 } else { 22 };
                    PathElement::new(vec![(x, y), (x + end, y)], colour.stroke_width(2))
                });
            }
        }
    }
    for (number, marker) in panel.markers.iter().enumerate() {
        let colour = color(marker.color);
        let (x_range, _) = (chart.x_range(), ());
        let in_right_half = (marker.at.0 - x_range.start) > 0.55 * (x_range.end - x_range.start);
        // plotters' estimate of text width is about 0.46 em per character.
        let width = (marker.text.chars().count() as f64 * 13.0 * 0.5) as i32;
        // Notes alternate above and below their points, so that two close ones stay apart.
        let dy = if number % 2 == 0 { -18 } else { 8 };
        let offset = if in_right_half { (-10 - width, dy) } else { (10, dy) };
        let dot = EmptyElement::at(marker.at)
            + Circle::new((0, 0), 5, colour.filled())
            + Circle::new((0, 0), 5, BLACK.stroke_width(1))
            + Text::new(marker.text.clone(), offset, (FONT, 13).into_font().color(&BLACK));
        chart.draw_series(std::iter::once(dot)).map_err(failed)?;
    }
    if legend {
        let position = match panel.legend {
            LegendPosition::UpperRight => SeriesLabelPosition::UpperRight,
            LegendPosition::UpperLeft => SeriesLabelPosition::UpperLeft,
            LegendPosition::LowerRight => SeriesLabelPosition::LowerRight,
            LegendPosition::LowerLeft => SeriesLabelPosition::LowerLeft,
        };
        chart
            .configure_series_labels()
            .position(position)
            .label_font((FONT, 13))
            .background_style(WHITE.mix(0.85))
            .border_style(RGBColor(160, 160, 160))
            .draw()
            .map_err(failed)?;
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn segments_break_at_gaps() {
        let points = [(0.0, 1.0), (1.0, f64::NAN), (2.0, 3.0), (3.0, 4.0), (4.0, -1.0)];
        assert_eq!(segments(&points, false, false).len(), 2);
        assert_eq!(segments(&points, false, true), vec![vec![(0.0, 1.0)], vec![(2.0, 3.0), (3.0, 4.0)]]);
    }

    #[test]
    fn a_figure_has_its_title_labels_and_legend() {
        let panel = Panel {
            x_label: "time (s)".to_owned(),
            y_label: "q (kPa)".to_owned(),
            series: vec![Series {
                label: "one".to_owned(),
                points: vec![(0.0, 1.0), (1.0, 2.0)],
                ..Series::default()
            }],
            markers: vec![Marker { at: (1.0, 2.0), text: "peak".to_owned(), color: 0 }],
            ..Panel::default()
        };
        let figure = Figure {
            title: "A title".to_owned(),
            layout: Layout::Stacked,
            panels: vec![panel],
            size: (400, 300),
        };
        let svg = figure.to_svg().unwrap();
        for text in ["A title", "time (s)", "q (kPa)", "one", "peak", "<svg"] {
            assert!(svg.contains(text), "{text}");
        }
        let empty = Figure { panels: vec![Panel::default()], ..figure };
        assert!(empty.to_svg().unwrap_err().contains("no finite"));
    }
}
