//! Writing SVG by hand: the few elements a chart needs (text, lines, paths, circles,
//! rectangles, clip paths), coordinates to a tenth of a pixel so that a figure's bytes are
//! the same on every machine, and the text measure the layout works with. Text is left to
//! the viewer's sans-serif font; no font is needed to build or to draw.

use std::fmt::Write as _;

/// How a text is placed against its x.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Anchor {
    /// x is the text's left end.
    Start,
    /// x is the text's middle.
    Middle,
    /// x is the text's right end.
    End,
}

impl Anchor {
    fn name(self) -> &'static str {
        match self {
            Anchor::Start => "start",
            Anchor::Middle => "middle",
            Anchor::End => "end",
        }
    }
}

/// A stroke: colour, width in px, and a dash pattern (none: solid).
#[derive(Clone, Copy, Debug)]
pub struct Stroke<'a> {
    /// `#rrggbb`.
    pub colour: &'a str,
    /// Width, px.
    pub width: f64,
    /// Dash and gap lengths, px (`"8 5"`).
    pub dash: Option<&'a str>,
}

/// The width a text takes in a sans-serif font of `size` px: 0.6 em a character, a
/// little more than the average of common sans-serif faces, so that the layout errs
/// toward room (common practice, no source).
pub fn text_width(text: &str, size: f64) -> f64 {
    text.chars().count() as f64 * size * 0.6
}

/// `text` broken at spaces into lines no wider than `width` px (a word longer than that
/// stays whole on its own line).
pub fn wrap(text: &str, size: f64, width: f64) -> Vec<String> {
    let mut lines: Vec<String> = Vec::new();
    let mut line = String::new();
    for word in text.split(' ').filter(|w| !w.is_empty()) {
        let candidate = if line.is_empty() { word.to_owned() } else { format!("{line} {word}") };
        if !line.is_empty() && text_width(&candidate, size) > width {
            lines.push(std::mem::replace(&mut line, word.to_owned()));
        } else {
            line = candidate;
        }
    }
    if !line.is_empty() || lines.is_empty() {
        lines.push(line);
    }
    lines
}

/// A coordinate: one decimal, without a trailing `.0`.
fn n(value: f64) -> String {
    let text = format!("{value:.1}");
    match text.strip_suffix(".0") {
        Some(whole) if whole != "-0" => whole.to_owned(),
        Some(_) => "0".to_owned(),
        None => text,
    }
}

/// `text` with the characters that XML reserves escaped.
pub fn escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&apos;"),
            c => out.push(c),
        }
    }
    out
}

fn stroke_attributes(stroke: &Stroke) -> String {
    let dash = stroke.dash.map(|d| format!(" stroke-dasharray=\"{d}\"")).unwrap_or_default();
    format!(" stroke=\"{}\" stroke-width=\"{}\"{dash}", stroke.colour, n(stroke.width))
}

/// An SVG document being written.
pub struct Svg {
    out: String,
}

impl Svg {
    /// A white document `width` by `height` px.
    pub fn new(width: f64, height: f64) -> Self {
        let (w, h) = (n(width), n(height));
        let mut out = format!(
            "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{w}\" height=\"{h}\" viewBox=\"0 0 {w} {h}\" \
             font-family=\"sans-serif\">\n"
        );
        let _ = writeln!(out, "<rect x=\"0\" y=\"0\" width=\"{w}\" height=\"{h}\" fill=\"#ffffff\"/>");
        Svg { out }
    }

    /// A clip rectangle named `id`, for [`Svg::path`].
    pub fn clip(&mut self, id: &str, x: f64, y: f64, width: f64, height: f64) {
        let _ = writeln!(
            self.out,
            "<clipPath id=\"{id}\"><rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\"/></clipPath>",
            n(x),
            n(y),
            n(width),
            n(height)
        );
    }

    /// A line of text with its baseline at `y`; `rotated`: turned to read upward, about
    /// (x, y).
    pub fn text(&mut self, x: f64, y: f64, size: f64, anchor: Anchor, text: &str, rotated: bool) {
        let turn =
            if rotated { format!(" transform=\"rotate(-90 {} {})\"", n(x), n(y)) } else { String::new() };
        let _ = writeln!(
            self.out,
            "<text x=\"{}\" y=\"{}\" font-size=\"{}\" text-anchor=\"{}\" fill=\"#1a1a1a\"{turn}>{}</text>",
            n(x),
            n(y),
            n(size),
            anchor.name(),
            escape(text)
        );
    }

    /// A straight line.
    pub fn line(&mut self, (x1, y1): (f64, f64), (x2, y2): (f64, f64), stroke: &Stroke) {
        let _ = writeln!(
            self.out,
            "<line x1=\"{}\" y1=\"{}\" x2=\"{}\" y2=\"{}\"{}/>",
            n(x1),
            n(y1),
            n(x2),
            n(y2),
            stroke_attributes(stroke)
        );
    }

    /// A polyline through `points`, clipped to the clip rectangle `clip`.
    pub fn path(&mut self, points: &[(f64, f64)], stroke: &Stroke, clip: &str) {
        let mut d = String::with_capacity(points.len() * 12);
        for (i, (x, y)) in points.iter().enumerate() {
            let _ = write!(d, "{}{},{}", if i == 0 { "M" } else { " L" }, n(*x), n(*y));
        }
        let _ = writeln!(
            self.out,
            "<path d=\"{d}\" fill=\"none\"{} stroke-linejoin=\"round\" clip-path=\"url(#{clip})\"/>",
            stroke_attributes(stroke)
        );
    }

    /// A filled circle with a dark rim.
    pub fn dot(&mut self, (x, y): (f64, f64), radius: f64, fill: &str) {
        let _ = writeln!(
            self.out,
            "<circle cx=\"{}\" cy=\"{}\" r=\"{}\" fill=\"{fill}\" stroke=\"#1a1a1a\" stroke-width=\"1\"/>",
            n(x),
            n(y),
            n(radius)
        );
    }

    /// An unfilled rectangle.
    pub fn frame(&mut self, x: f64, y: f64, width: f64, height: f64, stroke: &Stroke) {
        let _ = writeln!(
            self.out,
            "<rect x=\"{}\" y=\"{}\" width=\"{}\" height=\"{}\" fill=\"none\"{}/>",
            n(x),
            n(y),
            n(width),
            n(height),
            stroke_attributes(stroke)
        );
    }

    /// The document.
    pub fn finish(mut self) -> String {
        self.out.push_str("</svg>\n");
        self.out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn coordinates_escapes_and_wrapping() {
        assert_eq!(n(12.0), "12");
        assert_eq!(n(12.345), "12.3");
        assert_eq!(n(-0.01), "0");
        assert_eq!(escape("q < 5 & \"x\""), "q &lt; 5 &amp; &quot;x&quot;");
        assert_eq!(
            wrap("max q 206.2 kPa at t = 17.65 s", 10.0, 100.0),
            ["max q 206.2 kPa", "at t = 17.65 s"]
        );
        assert_eq!(wrap("", 10.0, 100.0), [""]);
        assert_eq!(wrap("unbreakable_long_word", 10.0, 30.0), ["unbreakable_long_word"]);
        let mut svg = Svg::new(100.0, 50.0);
        svg.text(1.0, 2.0, 12.0, Anchor::End, "a<b", false);
        let svg = svg.finish();
        assert!(svg.starts_with("<svg") && svg.ends_with("</svg>\n"));
        assert!(svg.contains(">a&lt;b</text>"), "{svg}");
    }
}
