//! An axis of a chart: its range widened to round values so that ticks run along the
//! whole of it, from end to end, and the ticks themselves, as many as fit the axis's
//! length without their labels touching. Linear axes step by 1, 2, 2.5 or 5 times a power
//! of ten; logarithmic ones by decades, or by 1, 2 and 5 within a decade where there is
//! room (common practice, no source).

use crate::format::tick;

/// A tick: where, and its label.
#[derive(Clone, Debug, PartialEq)]
pub struct Tick {
    /// The value, in the axis's data units.
    pub value: f64,
    /// The label, as the ticks of every figure write numbers.
    pub label: String,
}

/// An axis ready to draw: its range, its labelled ticks and, on a logarithmic axis, the
/// unlabelled grid lines between them.
#[derive(Clone, Debug, PartialEq)]
pub struct Axis {
    /// The value at the start (left or bottom).
    pub lo: f64,
    /// The value at the end (right or top).
    pub hi: f64,
    /// Logarithmic.
    pub log: bool,
    /// Labelled ticks, the first at `lo` and the last at `hi`.
    pub ticks: Vec<Tick>,
    /// Values of the minor grid lines (logarithmic axes only).
    pub minor: Vec<f64>,
}

/// The mantissas of linear steps, finest first.
const LINEAR_STEPS: [f64; 4] = [1.0, 2.0, 2.5, 5.0];
/// The share of the data's span left free at an end that needs room, so that no peak
/// touches the frame.
const ROOM: f64 = 0.03;

impl Axis {
    /// Where `value` falls along the axis, 0 at `lo` and 1 at `hi`.
    pub fn fraction(&self, value: f64) -> f64 {
        if self.log {
            (value.log10() - self.lo.log10()) / (self.hi.log10() - self.lo.log10())
        } else {
            (value - self.lo) / (self.hi - self.lo)
        }
    }

    /// An axis for data from `lo` to `hi` (finite, `lo <= hi`; on a log axis positive),
    /// `length` px long, whose ticks lie at least `spacing(label)` px apart (the larger of
    /// two neighbours'). `room` asks for a little room beyond `lo` and `hi` (where a peak
    /// or a point reaches them; a line that merely ends there may end on the frame);
    /// `from_zero` starts a linear axis at 0 when `lo` is not negative.
    pub fn fit(
        lo: f64,
        hi: f64,
        log: bool,
        room: (bool, bool),
        from_zero: bool,
        length: f64,
        spacing: &dyn Fn(&str) -> f64,
    ) -> Axis {
        let candidates =
            if log { log_candidates(lo, hi, room) } else { linear_candidates(lo, hi, room, from_zero) };
        let fits = |axis: &Axis| {
            axis.ticks.windows(2).all(|pair| {
                let gap = (axis.fraction(pair[1].value) - axis.fraction(pair[0].value)) * length;
                gap >= spacing(&pair[0].label).max(spacing(&pair[1].label))
            })
        };
        let mut last = None;
        for axis in candidates {
            if fits(&axis) {
                return axis;
            }
            last = Some(axis);
        }
        // Nothing fits (a very short axis): the coarsest, its two ends only.
        let mut axis = last.unwrap_or_else(|| plain(lo, hi));
        if axis.ticks.len() > 2 {
            let ends = [axis.ticks[0].clone(), axis.ticks[axis.ticks.len() - 1].clone()];
            axis.ticks = ends.to_vec();
        }
        axis
    }
}

/// An axis from `lo` to `hi` with a tick at each end, for degenerate data.
fn plain(lo: f64, hi: f64) -> Axis {
    let ticks = vec![Tick { value: lo, label: tick(lo) }, Tick { value: hi, label: tick(hi) }];
    Axis { lo, hi, log: false, ticks, minor: Vec::new() }
}

/// `n` times `mantissa` times ten to the `power`, computed so that round values stay
/// round (a division by a power of ten rather than a product with its inexact inverse).
fn value(n: f64, mantissa: f64, power: i32) -> f64 {
    if power >= 0 {
        n * mantissa * 10f64.powi(power)
    } else {
        n * mantissa / 10f64.powi(-power)
    }
}

/// Linear axes over the data, finest steps first.
fn linear_candidates(lo: f64, hi: f64, (room_lo, room_hi): (bool, bool), from_zero: bool) -> Vec<Axis> {
    let span = hi - lo;
    let (room_lo, room_hi) = if span > 0.0 { (room_lo, room_hi) } else { (true, true) };
    let room = if span > 0.0 { ROOM * span } else { 0.5 * lo.abs().max(1.0) };
    let lo = if from_zero && lo >= 0.0 {
        0.0
    } else if room_lo {
        lo - room
    } else {
        lo
    };
    let hi = if room_hi { hi + room } else { hi };
    let top = (hi - lo).log10().floor() as i32;
    let mut axes = Vec::new();
    for power in (top - 2)..=(top + 1) {
        for mantissa in LINEAR_STEPS {
            let step = value(1.0, mantissa, power);
            // A small allowance, so that a value a rounding error past a tick keeps it.
            let first = (lo / step + 1e-9).floor();
            let last = (hi / step - 1e-9).ceil();
            let count = last - first;
            if !(1.0..=200.0).contains(&count) {
                continue;
            }
            let ticks: Vec<Tick> = (0..=count as i64)
                .map(|i| {
                    let v = value(first + i as f64, mantissa, power);
                    Tick { value: v, label: tick(v) }
                })
                .collect();
            let (lo, hi) = (ticks[0].value, ticks[ticks.len() - 1].value);
            axes.push(Axis { lo, hi, log: false, ticks, minor: Vec::new() });
        }
    }
    axes
}

/// The largest of 1, 2 and 5 times a power of ten at or below `v` (`up`: the smallest at
/// or above).
fn one_two_five(v: f64, up: bool) -> f64 {
    let power = v.log10().floor() as i32;
    let candidates = [1.0, 2.0, 5.0, 10.0].map(|m| value(1.0, m, power));
    if up {
        candidates.into_iter().find(|c| *c >= v * (1.0 - 1e-12)).unwrap_or(candidates[3])
    } else {
        candidates.into_iter().rev().find(|c| *c <= v * (1.0 + 1e-12)).unwrap_or(candidates[0])
    }
}

/// Logarithmic axes over positive data: ticks at 1, 2 and 5 in each decade, then at
/// every decade, then every 2nd, 3rd, 5th ... decade.
fn log_candidates(lo: f64, hi: f64, (room_lo, room_hi): (bool, bool)) -> Vec<Axis> {
    let (lo, hi) = if hi > lo { (lo, hi) } else { (lo / 2.0, hi * 2.0) };
    let factor = (hi / lo).powf(ROOM);
    let lo = if room_lo { lo / factor } else { lo };
    let hi = if room_hi { hi * factor } else { hi };
    let mut axes = Vec::new();
    // 1, 2 and 5 in every decade, the ends on such values.
    let (start, end) = (one_two_five(lo, false), one_two_five(hi, true));
    let mut ticks = Vec::new();
    let mut power = start.log10().floor() as i32;
    'decades: loop {
        for m in [1.0, 2.0, 5.0] {
            let v = value(1.0, m, power);
            if v > end * (1.0 + 1e-12) {
                break 'decades;
            }
            if v >= start * (1.0 - 1e-12) {
                ticks.push(Tick { value: v, label: tick(v) });
            }
        }
        power += 1;
    }
    axes.push(Axis { lo: start, hi: end, log: true, ticks, minor: Vec::new() });
    // Every decade, the ends on 1, 2 or 5 (a decade's room is not wasted beyond the data).
    let (first, last) = (start.log10().ceil() as i32, end.log10().floor() as i32);
    let mut ticks = vec![Tick { value: start, label: tick(start) }];
    for p in first..=last {
        let v = value(1.0, 1.0, p);
        if v > start * (1.0 + 1e-12) && v < end * (1.0 - 1e-12) {
            ticks.push(Tick { value: v, label: tick(v) });
        }
    }
    ticks.push(Tick { value: end, label: tick(end) });
    let minor = (first - 1..=last)
        .flat_map(|p| (2..10).map(move |m| value(1.0, f64::from(m), p)))
        .filter(|v| *v > start && *v < end)
        .collect();
    axes.push(Axis { lo: start, hi: end, log: true, ticks, minor });
    // Every n-th decade, the ends on such decades.
    let (first, last) = (lo.log10().floor() as i32, hi.log10().ceil() as i32);
    for every in [1, 2, 3, 5, 10, 20, 50, 100] {
        let first = first.div_euclid(every) * every;
        let last = -((-last).div_euclid(every) * every);
        if last <= first {
            continue;
        }
        let ticks: Vec<Tick> = (first..=last)
            .step_by(every as usize)
            .map(|p| {
                let v = value(1.0, 1.0, p);
                Tick { value: v, label: tick(v) }
            })
            .collect();
        let minor = if every == 1 && last - first <= 8 {
            (first..last).flat_map(|p| (2..10).map(move |m| value(1.0, f64::from(m), p))).collect()
        } else {
            Vec::new()
        };
        axes.push(Axis { lo: value(1.0, 1.0, first), hi: value(1.0, 1.0, last), log: true, ticks, minor });
    }
    axes
}

#[cfg(test)]
mod tests {
    use super::*;

    fn labels(axis: &Axis) -> Vec<&str> {
        axis.ticks.iter().map(|t| t.label.as_str()).collect()
    }

    #[test]
    fn linear_axes_end_on_ticks() {
        let axis = Axis::fit(0.0, 206.2, false, (true, true), true, 600.0, &|_| 40.0);
        assert_eq!((axis.lo, axis.hi), (0.0, 220.0));
        assert_eq!(
            labels(&axis),
            ["0", "20", "40", "60", "80", "100", "120", "140", "160", "180", "200", "220"]
        );
        // Shorter: coarser steps, still from end to end.
        let axis = Axis::fit(0.0, 124.0, false, (true, true), false, 300.0, &|_| 50.0);
        assert_eq!(axis.ticks.first().unwrap().value, axis.lo);
        assert_eq!(axis.ticks.last().unwrap().value, axis.hi);
        assert!(axis.lo < 0.0 && axis.hi > 124.0, "room for the data: {axis:?}");
        assert_eq!(labels(&axis), ["-50", "0", "50", "100", "150"]);
        // A line that ends on a round value ends on the frame.
        let axis = Axis::fit(0.0, 30.0, false, (false, false), false, 400.0, &|_| 40.0);
        assert_eq!((axis.lo, axis.hi), (0.0, 30.0));
        // Round values stay round.
        let axis = Axis::fit(0.1, 0.7, false, (true, true), false, 500.0, &|_| 40.0);
        assert!(labels(&axis).contains(&"0.3"), "{axis:?}");
    }

    #[test]
    fn log_axes_take_decades_or_1_2_5() {
        let axis = Axis::fit(1197.0, 40_000.0, true, (true, true), false, 120.0, &|_| 30.0);
        assert_eq!(labels(&axis), ["1000", "10000", "50000"]);
        let axis = Axis::fit(1197.0, 101_325.0, true, (true, true), false, 100.0, &|_| 30.0);
        assert_eq!(labels(&axis), ["1000", "10000", "100000", "1e6"]);
        assert_eq!(axis.minor.len(), 3 * 8);
        let wide = Axis::fit(1197.0, 101_325.0, true, (true, true), false, 900.0, &|_| 30.0);
        assert_eq!(labels(&wide)[..4], ["1000", "2000", "5000", "10000"]);
        assert_eq!(wide.hi, 200_000.0);
        let decades = Axis::fit(1e-12, 1e12, true, (true, true), false, 200.0, &|_| 30.0);
        assert!(decades.ticks.len() <= 7 && decades.ticks.len() >= 3, "{decades:?}");
        assert!((decades.fraction(decades.hi) - 1.0).abs() < 1e-12);
    }

    #[test]
    fn a_flat_line_or_a_tiny_axis_still_has_two_ends() {
        let flat = Axis::fit(5.0, 5.0, false, (false, false), false, 300.0, &|_| 30.0);
        assert!(flat.lo < 5.0 && flat.hi > 5.0);
        let tiny = Axis::fit(0.0, 1.0, false, (true, true), false, 10.0, &|_| 30.0);
        assert_eq!(tiny.ticks.len(), 2);
    }
}
