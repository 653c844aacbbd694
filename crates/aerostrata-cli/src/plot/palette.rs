//! The line colours of every figure: a palette of aerostrata's own, chosen to stay apart
//! for readers with any common colour-vision deficiency.
//!
//! The colours came from a search over sRGB for the six colours whose smallest CIELAB
//! difference (CIE 1976 delta E*ab) between any two is largest, under normal vision and
//! under simulated protanopia, deuteranopia and tritanopia (the dichromat matrices of
//! Machado, Oliveira and Fernandes, IEEE TVCG 15 (2009), severity 1), with every colour at
//! CIELAB lightness L* 60 or darker so that a 2 px line stands out on white; then rounded
//! by hand. The smallest difference is about 35 under each kind of vision (a difference
//! of 10 is plainly visible side by side; common practice, no source). The tests below
//! recompute it.

/// An sRGB colour.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Rgb(pub u8, pub u8, pub u8);

impl Rgb {
    /// As SVG and CSS write it: `#3018ba`.
    pub fn hex(self) -> String {
        format!("#{:02x}{:02x}{:02x}", self.0, self.1, self.2)
    }
}

/// The palette, in the order series take it: indigo, orange, cerulean, plum, umber, and
/// a mid grey for reference lines (limits, raw data behind a filtered line).
pub const PALETTE: [Rgb; 6] = [
    Rgb(48, 24, 186),
    Rgb(220, 102, 16),
    Rgb(0, 152, 218),
    Rgb(120, 0, 106),
    Rgb(68, 54, 6),
    Rgb(140, 140, 140),
];

/// The colour of palette index `index` (the palette repeats past its end).
pub fn color(index: usize) -> Rgb {
    PALETTE[index % PALETTE.len()]
}

#[cfg(test)]
mod tests {
    use super::*;

    /// sRGB to linear light (IEC 61966-2-1).
    fn linear(c: u8) -> f64 {
        let c = f64::from(c) / 255.0;
        if c <= 0.04045 {
            c / 12.92
        } else {
            ((c + 0.055) / 1.055).powf(2.4)
        }
    }

    /// Linear sRGB to CIELAB, D65 white (IEC 61966-2-1's matrix; CIE 15 for L*a*b*).
    fn lab([r, g, b]: [f64; 3]) -> [f64; 3] {
        let x = (0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.950_47;
        let y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
        let z = (0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.088_83;
        let f = |t: f64| if t > 216.0 / 24389.0 { t.cbrt() } else { (24389.0 / 27.0 * t + 16.0) / 116.0 };
        let (fx, fy, fz) = (f(x), f(y), f(z));
        [116.0 * fy - 16.0, 500.0 * (fx - fy), 200.0 * (fy - fz)]
    }

    /// Machado, Oliveira and Fernandes (2009), severity 1.0, on linear RGB (the matrices
    /// from memory of the paper's table; each row sums to 1, as there).
    const DICHROMATS: [(&str, [[f64; 3]; 3]); 3] = [
        (
            "protanopia",
            [
                [0.152286, 1.052583, -0.204868],
                [0.114503, 0.786281, 0.099216],
                [-0.003882, -0.048116, 1.051998],
            ],
        ),
        (
            "deuteranopia",
            [
                [0.367322, 0.860646, -0.227968],
                [0.280085, 0.672501, 0.047413],
                [-0.011820, 0.042940, 0.968881],
            ],
        ),
        (
            "tritanopia",
            [
                [1.255528, -0.076749, -0.178779],
                [-0.078411, 0.930809, 0.147602],
                [0.004733, 0.691367, 0.303900],
            ],
        ),
    ];

    fn seen(c: Rgb, matrix: Option<&[[f64; 3]; 3]>) -> [f64; 3] {
        let rgb = [linear(c.0), linear(c.1), linear(c.2)];
        let rgb = match matrix {
            None => rgb,
            Some(m) => m.map(|row| (row[0] * rgb[0] + row[1] * rgb[1] + row[2] * rgb[2]).clamp(0.0, 1.0)),
        };
        lab(rgb)
    }

    fn smallest_difference(colours: &[Rgb], matrix: Option<&[[f64; 3]; 3]>) -> f64 {
        let mut smallest = f64::INFINITY;
        for (i, a) in colours.iter().enumerate() {
            for b in &colours[i + 1..] {
                let (a, b) = (seen(*a, matrix), seen(*b, matrix));
                let d = ((a[0] - b[0]).powi(2) + (a[1] - b[1]).powi(2) + (a[2] - b[2]).powi(2)).sqrt();
                smallest = smallest.min(d);
            }
        }
        smallest
    }

    #[test]
    fn the_colours_stay_apart_under_every_kind_of_vision() {
        for row in DICHROMATS.iter().flat_map(|(_, m)| m) {
            assert!((row.iter().sum::<f64>() - 1.0).abs() < 2e-6, "a matrix row sums to 1");
        }
        assert!(smallest_difference(&PALETTE, None) > 30.0);
        for (name, matrix) in &DICHROMATS {
            let d = smallest_difference(&PALETTE, Some(matrix));
            assert!(d > 30.0, "{name}: two colours only {d:.1} apart");
        }
        for colour in PALETTE {
            let lightness = seen(colour, None)[0];
            assert!(lightness <= 60.0, "{} too light on white: L* {lightness:.1}", colour.hex());
        }
    }

    #[test]
    fn the_palette_is_not_the_one_the_figures_used_before() {
        // The first three colours the figures drew with until this palette replaced them.
        let before = [Rgb(31, 119, 180), Rgb(214, 39, 40), Rgb(44, 160, 44)];
        for old in before {
            for new in PALETTE {
                let channel = |a: u8, b: u8| (i32::from(a) - i32::from(b)).abs();
                let distance = channel(old.0, new.0) + channel(old.1, new.1) + channel(old.2, new.2);
                assert!(distance > 40, "{} is too close to {}", new.hex(), old.hex());
            }
        }
        // Under deuteranopia the old red and green were nearly one colour.
        assert!(smallest_difference(&before, Some(&DICHROMATS[1].1)) < 15.0);
        assert_eq!(color(7), PALETTE[1]);
        assert_eq!(PALETTE[0].hex(), "#3018ba");
    }
}
