//! The chart drawing every figure goes through: panels of line series with a title, axis
//! titles, legends and annotated points, written as SVG (`plot::svg`).
//!
//! Nothing is ever drawn over the data: each panel's legend sits in a band above its
//! axes and the notes of its annotated points in a band below, each note led by a dot of
//! its point's colour. Axes run from tick to tick (`plot::axis`), and the layout is
//! worked out from the figure's width, so that a narrow figure (a phone's) keeps its text
//! at a readable size: side-by-side panels wrap into rows, legends and notes into lines,
//! and the figure grows taller rather than squeezing its panels.

use crate::plot::axis::Axis;
use crate::plot::palette::color;
use crate::plot::svg::{text_width, wrap, Anchor, Stroke, Svg};

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

/// An annotated point: a dot on the data, and its note below the panel.
#[derive(Clone, Debug)]
pub struct Marker {
    /// Where, in the panel's data coordinates.
    pub at: (f64, f64),
    /// The note.
    pub text: String,
    /// Index into the palette.
    pub color: usize,
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
    /// Start the y axis at 0 when no value is negative (for q, Mach, heights).
    pub y_from_zero: bool,
}

/// How panels share a figure.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Layout {
    /// One above the other, sharing the x range (quantities against time).
    Stacked,
    /// Side by side, sharing the y range (quantities against altitude); they wrap into
    /// rows where the figure is too narrow for them all.
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
    /// Width and height, px. The height grows where the panels would otherwise be too
    /// short to read; the width is at least [`MIN_WIDTH`].
    pub size: (u32, u32),
}

/// The narrowest figure drawn, px (a small phone's screen is about 320 px wide).
pub const MIN_WIDTH: u32 = 240;

const PAD: f64 = 12.0;
const GAP: f64 = 20.0;
const TITLE_SIZE: f64 = 18.0;
const TITLE_LINE: f64 = 24.0;
const LABEL_SIZE: f64 = 13.0;
const LABEL_LINE: f64 = 17.0;
const TICK_SIZE: f64 = 12.0;
const TICK_LENGTH: f64 = 5.0;
const KEY_SIZE: f64 = 12.0;
const KEY_LINE: f64 = 18.0;
const SWATCH: f64 = 24.0;
/// Narrower than this, side-by-side panels wrap into rows.
const MIN_CELL_WIDTH: f64 = 250.0;
const MIN_PLOT_HEIGHT: f64 = 150.0;
/// Room right of the axes for the half of the last tick label that overhangs.
const RIGHT_ROOM: f64 = 28.0;
const GRID: &str = "#dddddd";
const MINOR_GRID: &str = "#f0f0f0";
const AXIS_LINE: &str = "#666666";

/// A range of data, and whether each end needs room: a line's end may sit on the frame,
/// a peak or an annotated point may not.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Span {
    lo: f64,
    hi: f64,
    room: (bool, bool),
}

impl Span {
    /// The span of `values`, each with whether it needs room.
    fn of(values: impl Iterator<Item = (f64, bool)>, log: bool) -> Option<Span> {
        let mut span: Option<Span> = None;
        for (v, room) in values.filter(|(v, _)| v.is_finite() && (!log || *v > 0.0)) {
            span = Some(match span {
                None => Span { lo: v, hi: v, room: (room, room) },
                Some(s) => s.union(Span { lo: v, hi: v, room: (room, room) }),
            });
        }
        span
    }

    fn union(self, other: Span) -> Span {
        let end = |a: f64, a_room: bool, b: f64, b_room: bool, lower: bool| {
            let a_wins = if lower { a < b } else { a > b };
            if a == b {
                (a, a_room || b_room)
            } else if a_wins {
                (a, a_room)
            } else {
                (b, b_room)
            }
        };
        let (lo, room_lo) = end(self.lo, self.room.0, other.lo, other.room.0, true);
        let (hi, room_hi) = end(self.hi, self.room.1, other.hi, other.room.1, false);
        Span { lo, hi, room: (room_lo, room_hi) }
    }
}

/// The legend of a panel: its labelled series, each label once.
fn legend_items(panel: &Panel) -> Vec<&Series> {
    let mut items: Vec<&Series> = Vec::new();
    for series in panel.series.iter().filter(|s| !s.label.is_empty()) {
        if !items
            .iter()
            .any(|s| s.label == series.label && s.color == series.color && s.dashed == series.dashed)
        {
            items.push(series);
        }
    }
    items
}

/// Whether two panels' legends list the same items.
fn same_legend(a: &Panel, b: &Panel) -> bool {
    let (a, b) = (legend_items(a), legend_items(b));
    a.len() == b.len()
        && a.iter().zip(&b).all(|(x, y)| x.label == y.label && x.color == y.color && x.dashed == y.dashed)
}

/// The legend's items laid out in lines no wider than `width`: (item, x offset) per line.
fn legend_lines<'a>(items: &[&'a Series], width: f64) -> Vec<Vec<(&'a Series, f64)>> {
    let mut lines: Vec<Vec<(&Series, f64)>> = Vec::new();
    let mut x = 0.0;
    for item in items {
        let item_width = SWATCH + 6.0 + text_width(&item.label, KEY_SIZE);
        if x > 0.0 && x + item_width > width {
            x = 0.0;
        }
        if x == 0.0 {
            lines.push(Vec::new());
        }
        if let Some(line) = lines.last_mut() {
            line.push((item, x));
        }
        x += item_width + 18.0;
    }
    lines
}

/// What each panel holds around its axes, laid out for a cell `width` px wide.
struct Bands<'a> {
    legend: Vec<Vec<(&'a Series, f64)>>,
    notes: Vec<(usize, Vec<String>)>,
    x_title: Vec<String>,
}

impl<'a> Bands<'a> {
    fn of(panel: &'a Panel, width: f64) -> Self {
        let legend = legend_lines(&legend_items(panel), width);
        let notes = panel.markers.iter().map(|m| (m.color, wrap(&m.text, KEY_SIZE, width - 18.0))).collect();
        let x_title = wrap(&panel.x_label, LABEL_SIZE, width - 40.0);
        Bands { legend, notes, x_title }
    }

    fn top(&self) -> f64 {
        if self.legend.is_empty() {
            0.0
        } else {
            self.legend.len() as f64 * KEY_LINE + 10.0
        }
    }

    fn bottom(&self) -> f64 {
        let notes: usize = self.notes.iter().map(|(_, lines)| lines.len()).sum();
        let notes = if notes == 0 { 0.0 } else { 6.0 + notes as f64 * KEY_LINE };
        TICK_LENGTH + TICK_SIZE + 8.0 + self.x_title.len() as f64 * LABEL_LINE + notes
    }
}

type Failed = String;

impl Figure {
    /// The figure as an SVG document.
    ///
    /// # Errors
    /// A message when a panel has nothing finite to draw (on a log axis: nothing
    /// positive).
    pub fn to_svg(&self) -> Result<String, Failed> {
        let mut spans = Vec::with_capacity(self.panels.len());
        for (number, panel) in self.panels.iter().enumerate() {
            // Each point, and whether it needs room: every point but a line's two ends.
            let points = || {
                let lines = panel.series.iter().flat_map(|s| {
                    let last = s.points.len().saturating_sub(1);
                    s.points.iter().enumerate().map(move |(i, p)| (*p, i != 0 && i != last))
                });
                lines.chain(panel.markers.iter().map(|m| (m.at, true)))
            };
            let x = Span::of(points().map(|(p, room)| (p.0, room)), panel.log_x);
            let y = Span::of(points().map(|(p, room)| (p.1, room)), panel.log_y);
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
        Ok(self.draw(&spans))
    }

    fn draw(&self, spans: &[(Span, Span)]) -> String {
        let width = f64::from(self.size.0.max(MIN_WIDTH));
        let inner = width - 2.0 * PAD;
        let count = self.panels.len().max(1);
        let columns = match self.layout {
            Layout::Stacked => 1,
            Layout::SideBySide => (((inner + GAP) / (MIN_CELL_WIDTH + GAP)).floor() as usize).clamp(1, count),
        };
        let rows = count.div_ceil(columns);
        let cell_width = (inner - GAP * (columns - 1) as f64) / columns as f64;
        let mut bands: Vec<Bands> = self.panels.iter().map(|p| Bands::of(p, cell_width)).collect();
        // A legend the same as the panel's before it is said once.
        for i in (1..bands.len()).rev() {
            if same_legend(&self.panels[i], &self.panels[i - 1]) {
                bands[i].legend.clear();
            }
        }
        let row_band = |row: usize, top: bool| {
            let band = |b: &Bands| if top { b.top() } else { b.bottom() };
            bands.iter().skip(row * columns).take(columns).map(band).fold(0.0, f64::max)
        };
        let tops: Vec<f64> = (0..rows).map(|r| row_band(r, true)).collect();
        let bottoms: Vec<f64> = (0..rows).map(|r| row_band(r, false)).collect();
        let title = wrap(&self.title, TITLE_SIZE, inner);
        let title_height = title.len() as f64 * TITLE_LINE + 8.0;
        let fixed = 2.0 * PAD
            + title_height
            + tops.iter().sum::<f64>()
            + bottoms.iter().sum::<f64>()
            + GAP * (rows - 1) as f64;
        let min_plot = if self.layout == Layout::SideBySide && rows > 1 {
            MIN_PLOT_HEIGHT.max(0.8 * cell_width)
        } else {
            MIN_PLOT_HEIGHT
        };
        let plot_height = ((f64::from(self.size.1) - fixed) / rows as f64).max(min_plot);
        let height = fixed + plot_height * rows as f64;

        // The y axes need the plot's height; their labels and title set the left margin,
        // the same for every panel so that stacked axes line up.
        let y_axes: Vec<Axis> = self
            .panels
            .iter()
            .zip(spans)
            .map(|(panel, (_, y))| {
                let from_zero = panel.y_from_zero && y.lo >= 0.0;
                Axis::fit(y.lo, y.hi, panel.log_y, y.room, from_zero, plot_height, &|_| 2.3 * TICK_SIZE)
            })
            .collect();
        let y_titles: Vec<Vec<String>> =
            self.panels.iter().map(|p| wrap(&p.y_label, LABEL_SIZE, plot_height)).collect();
        let widest_tick = y_axes
            .iter()
            .flat_map(|a| a.ticks.iter().map(|t| text_width(&t.label, TICK_SIZE)))
            .fold(0.0, f64::max);
        let title_lines = y_titles.iter().map(Vec::len).max().unwrap_or(1) as f64;
        let left = title_lines * LABEL_LINE + 6.0 + widest_tick + 4.0 + TICK_LENGTH;
        let plot_width = (cell_width - left - RIGHT_ROOM).max(40.0);

        let mut svg = Svg::new(width, height);
        for (i, line) in title.iter().enumerate() {
            svg.text(
                width / 2.0,
                PAD + (i + 1) as f64 * TITLE_LINE - 6.0,
                TITLE_SIZE,
                Anchor::Middle,
                line,
                false,
            );
        }
        let mut row_y = PAD + title_height;
        for row in 0..rows {
            for column in 0..columns {
                let index = row * columns + column;
                let Some(panel) = self.panels.get(index) else { break };
                let cell_x = PAD + column as f64 * (cell_width + GAP);
                let x = spans[index].0;
                let x_axis = Axis::fit(x.lo, x.hi, panel.log_x, x.room, false, plot_width, &|label| {
                    text_width(label, TICK_SIZE) + 14.0
                });
                let area =
                    Area { x: cell_x + left, y: row_y + tops[row], width: plot_width, height: plot_height };
                let axes = Axes { x: &x_axis, y: &y_axes[index], area };
                draw_panel(&mut svg, panel, &axes, &bands[index], &y_titles[index], (cell_x, row_y), index);
            }
            row_y += tops[row] + plot_height + bottoms[row] + GAP;
        }
        svg.finish()
    }
}

/// Where a panel's axes are, px.
#[derive(Clone, Copy)]
struct Area {
    x: f64,
    y: f64,
    width: f64,
    height: f64,
}

struct Axes<'a> {
    x: &'a Axis,
    y: &'a Axis,
    area: Area,
}

impl Axes<'_> {
    fn px(&self, (x, y): (f64, f64)) -> (f64, f64) {
        let a = self.area;
        (a.x + self.x.fraction(x) * a.width, a.y + a.height - self.y.fraction(y) * a.height)
    }
}

fn draw_panel(
    svg: &mut Svg,
    panel: &Panel,
    axes: &Axes,
    bands: &Bands,
    y_title: &[String],
    (cell_x, cell_y): (f64, f64),
    index: usize,
) {
    let a = axes.area;
    let solid = |colour, width| Stroke { colour, width, dash: None };
    // The legend, above the axes.
    for (line_index, line) in bands.legend.iter().enumerate() {
        let baseline = cell_y + (line_index + 1) as f64 * KEY_LINE - 5.0;
        for (series, x) in line {
            let colour = color(series.color).hex();
            let dash = series.dashed.then_some("6 4");
            let x = cell_x + x;
            svg.line(
                (x, baseline - 4.0),
                (x + SWATCH, baseline - 4.0),
                &Stroke { colour: &colour, width: 2.5, dash },
            );
            svg.text(x + SWATCH + 6.0, baseline, KEY_SIZE, Anchor::Start, &series.label, false);
        }
    }
    // The grid, then the frame and ticks.
    let vertical = |svg: &mut Svg, v: f64, colour| {
        let (x, _) = axes.px((v, axes.y.lo));
        svg.line((x, a.y), (x, a.y + a.height), &solid(colour, 1.0));
    };
    let horizontal = |svg: &mut Svg, v: f64, colour| {
        let (_, y) = axes.px((axes.x.lo, v));
        svg.line((a.x, y), (a.x + a.width, y), &solid(colour, 1.0));
    };
    axes.x.minor.iter().for_each(|v| vertical(svg, *v, MINOR_GRID));
    axes.y.minor.iter().for_each(|v| horizontal(svg, *v, MINOR_GRID));
    axes.x.ticks.iter().for_each(|t| vertical(svg, t.value, GRID));
    axes.y.ticks.iter().for_each(|t| horizontal(svg, t.value, GRID));
    svg.frame(a.x, a.y, a.width, a.height, &solid(AXIS_LINE, 1.0));
    let bottom = a.y + a.height;
    for t in &axes.x.ticks {
        let (x, _) = axes.px((t.value, axes.y.lo));
        svg.line((x, bottom), (x, bottom + TICK_LENGTH), &solid(AXIS_LINE, 1.0));
        svg.text(x, bottom + TICK_LENGTH + TICK_SIZE + 1.0, TICK_SIZE, Anchor::Middle, &t.label, false);
    }
    for t in &axes.y.ticks {
        let (_, y) = axes.px((axes.x.lo, t.value));
        svg.line((a.x - TICK_LENGTH, y), (a.x, y), &solid(AXIS_LINE, 1.0));
        svg.text(a.x - TICK_LENGTH - 4.0, y + 0.35 * TICK_SIZE, TICK_SIZE, Anchor::End, &t.label, false);
    }
    // The axis titles.
    let mut y = bottom + TICK_LENGTH + TICK_SIZE + 8.0;
    for line in &bands.x_title {
        y += LABEL_LINE;
        svg.text(a.x + a.width / 2.0, y - 4.0, LABEL_SIZE, Anchor::Middle, line, false);
    }
    for (i, line) in y_title.iter().enumerate() {
        let x = cell_x + (i + 1) as f64 * LABEL_LINE - 4.0;
        svg.text(x, a.y + a.height / 2.0, LABEL_SIZE, Anchor::Middle, line, true);
    }
    // The data, clipped to the axes.
    let clip = format!("plot-area-{index}");
    svg.clip(&clip, a.x, a.y, a.width, a.height);
    for series in &panel.series {
        let colour = color(series.color).hex();
        let stroke = Stroke { colour: &colour, width: 2.0, dash: series.dashed.then_some("8 5") };
        for run in segments(&series.points, panel.log_x, panel.log_y) {
            let points: Vec<(f64, f64)> = run.into_iter().map(|p| axes.px(p)).collect();
            svg.path(&points, &stroke, &clip);
        }
    }
    for marker in &panel.markers {
        svg.dot(axes.px(marker.at), 4.5, &color(marker.color).hex());
    }
    // The notes, below the axes.
    if !bands.notes.is_empty() {
        y += 6.0;
    }
    for (colour, lines) in &bands.notes {
        for (i, line) in lines.iter().enumerate() {
            y += KEY_LINE;
            if i == 0 {
                svg.dot((cell_x + 6.0, y - 8.0), 4.5, &color(*colour).hex());
            }
            svg.text(cell_x + 16.0, y - 4.0, KEY_SIZE, Anchor::Start, line, false);
        }
    }
}

/// The runs of finite points of `points` (on a log axis: positive too).
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

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn segments_break_at_gaps() {
        let points = [(0.0, 1.0), (1.0, f64::NAN), (2.0, 3.0), (3.0, 4.0), (4.0, -1.0)];
        assert_eq!(segments(&points, false, false).len(), 2);
        assert_eq!(segments(&points, false, true), vec![vec![(0.0, 1.0)], vec![(2.0, 3.0), (3.0, 4.0)]]);
    }

    fn figure(width: u32) -> Figure {
        let panel = |label: &str| Panel {
            x_label: "time (s)".to_owned(),
            y_label: label.to_owned(),
            series: vec![
                Series { label: "one".to_owned(), points: vec![(0.0, 1.0), (1.0, 2.0)], ..Series::default() },
                Series {
                    label: "two".to_owned(),
                    points: vec![(0.0, 2.0), (1.0, 1.0)],
                    color: 1,
                    dashed: true,
                },
            ],
            markers: vec![Marker { at: (1.0, 2.0), text: "peak at t = 1 s".to_owned(), color: 0 }],
            ..Panel::default()
        };
        Figure {
            title: "A title & more".to_owned(),
            layout: Layout::SideBySide,
            panels: vec![panel("q (kPa)"), panel("Mach number"), panel("drag (N)")],
            size: (width, 300),
        }
    }

    #[test]
    fn a_figure_has_its_title_labels_legend_and_notes() {
        let svg = figure(1200).to_svg().unwrap();
        for text in ["A title &amp; more", "time (s)", "q (kPa)", ">one<", ">two<", "peak at t = 1 s", "<svg"]
        {
            assert!(svg.contains(text), "{text}");
        }
        assert!(svg.contains("stroke-dasharray=\"8 5\""), "the dashed series");
        assert!(svg.contains(&color(1).hex()));
        let empty = Figure { panels: vec![Panel::default()], ..figure(400) };
        assert!(empty.to_svg().unwrap_err().contains("no finite"));
    }

    /// The height an SVG declares.
    fn height(svg: &str) -> f64 {
        let at = svg.find("height=\"").unwrap() + 8;
        svg[at..at + svg[at..].find('"').unwrap()].parse().unwrap()
    }

    #[test]
    fn a_narrow_figure_wraps_its_panels_and_grows() {
        let wide = figure(1200).to_svg().unwrap();
        let narrow = figure(360).to_svg().unwrap();
        assert!(
            height(&narrow) > 2.5 * height(&wide),
            "three rows: {} against {}",
            height(&narrow),
            height(&wide)
        );
        // The same notes, at the same size.
        assert_eq!(narrow.matches(">peak at t = 1 s<").count(), 3);
        assert_eq!(wide.matches(">peak at t = 1 s<").count(), 3);
        assert!(narrow.contains("width=\"360\""));
        let tiny = Figure { size: (10, 10), ..figure(10) }.to_svg().unwrap();
        assert!(tiny.contains(&format!("width=\"{MIN_WIDTH}\"")));
    }
}
