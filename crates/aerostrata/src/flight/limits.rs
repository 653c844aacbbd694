//! Limits and plateaus of a sampled series such as q(t) or q-alpha(t): every interval where
//! a limit is exceeded, with the crossings interpolated linearly between samples, and the
//! span around the maximum where the series stays within a fraction of it (the quantity a
//! throttle-down hold is judged by).
//!
//! [`LimitWatch`] takes one sample at a time and holds nothing but the interval in progress;
//! [`exceedances`] runs it over two slices. [`plateau`] needs the whole series (the span
//! reaches back from a maximum that is known only at the end), so it reads slices.

use crate::error::{Error, Result};

/// One interval where a series exceeds its limit.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Exceedance {
    /// When the series rose above the limit, s: interpolated linearly between the last
    /// sample at or below it and the first above; the first sample's time when the series
    /// starts above it.
    pub start_time_s: f64,
    /// When it fell back to the limit, s, interpolated likewise; the last sample's time
    /// when the series ends above it.
    pub end_time_s: f64,
    /// The largest sampled value in the interval.
    pub peak: f64,
    /// Time of that sample, s.
    pub peak_time_s: f64,
    /// Whether the series was already above the limit at its first sample (the interval
    /// may have begun earlier).
    pub open_start: bool,
    /// Whether the series was still above the limit at its last sample (the interval may
    /// go on).
    pub open_end: bool,
}

/// Watches a series for values above a limit, one sample at a time.
///
/// ```
/// use aerostrata::flight::LimitWatch;
/// // q rises through 30 kPa at t = 1.5 s and falls back at t = 3.25 s.
/// let mut watch = LimitWatch::new(30_000.0)?;
/// let mut found = Vec::new();
/// for (t, q) in [(0.0, 10e3), (1.0, 20e3), (2.0, 40e3), (3.0, 35e3), (4.0, 15e3)] {
///     found.extend(watch.push(t, q)?);
/// }
/// found.extend(watch.finish());
/// assert_eq!(found.len(), 1);
/// assert_eq!((found[0].start_time_s, found[0].end_time_s, found[0].peak), (1.5, 3.25, 40e3));
/// # Ok::<(), aerostrata::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct LimitWatch {
    limit: f64,
    last: Option<(f64, f64)>,
    open: Option<Exceedance>,
}

impl LimitWatch {
    /// A watch for values above `limit`.
    ///
    /// # Errors
    /// [`Error::NotFinite`] for a limit that is not finite.
    pub fn new(limit: f64) -> Result<Self> {
        Ok(Self { limit: crate::error::finite("limit", limit)?, last: None, open: None })
    }

    /// The limit.
    pub fn limit(&self) -> f64 {
        self.limit
    }

    /// Takes the sample (`time_s`, `value`); returns the interval it closes, if any.
    ///
    /// # Errors
    /// [`Error::InvalidPoint`] for a time or value that is not finite, or a time not
    /// after the previous sample's; the watch is left as it was.
    pub fn push(&mut self, time_s: f64, value: f64) -> Result<Option<Exceedance>> {
        let bad = |problem, value| Error::InvalidPoint { table: "limit watch", index: 0, problem, value };
        if !time_s.is_finite() {
            return Err(bad("time (s) must be finite", time_s));
        }
        if !value.is_finite() {
            return Err(bad("the value must be finite", value));
        }
        if self.last.is_some_and(|(t, _)| time_s <= t) {
            return Err(bad("time (s) must be after the previous sample's", time_s));
        }
        let above = value > self.limit;
        let mut closed = None;
        let limit = self.limit;
        match (&mut self.open, self.last) {
            (Some(open), Some((t0, v0))) if !above => {
                open.end_time_s = crossing(limit, t0, v0, time_s, value);
                closed = self.open.take();
            }
            (Some(open), _) => {
                if value > open.peak {
                    open.peak = value;
                    open.peak_time_s = time_s;
                }
            }
            (None, last) if above => {
                let (start_time_s, open_start) = match last {
                    Some((t0, v0)) => (crossing(limit, t0, v0, time_s, value), false),
                    None => (time_s, true),
                };
                self.open = Some(Exceedance {
                    start_time_s,
                    end_time_s: time_s,
                    peak: value,
                    peak_time_s: time_s,
                    open_start,
                    open_end: false,
                });
            }
            (None, _) => {}
        }
        self.last = Some((time_s, value));
        Ok(closed)
    }

    /// Ends the series: the interval still open at its last sample, if any.
    pub fn finish(&mut self) -> Option<Exceedance> {
        let (t, _) = self.last?;
        self.open.take().map(|open| Exceedance { end_time_s: t, open_end: true, ..open })
    }
}

/// Every interval where `values` (at `times_s`, strictly increasing) exceeds `limit`, in
/// order, without allocating.
///
/// # Errors
/// [`Error::InvalidPoint`] when the slices differ in length, and as [`LimitWatch::push`]
/// (naming the sample's index); the iterator ends after an error.
pub fn exceedances<'s>(
    times_s: &'s [f64],
    values: &'s [f64],
    limit: f64,
) -> Result<impl Iterator<Item = Result<Exceedance>> + 's> {
    same_length(times_s, values)?;
    let mut watch = LimitWatch::new(limit)?;
    let mut samples = times_s.iter().zip(values).enumerate();
    let mut done = false;
    Ok(core::iter::from_fn(move || {
        if done {
            return None;
        }
        for (index, (&t, &v)) in samples.by_ref() {
            match watch.push(t, v) {
                Ok(Some(closed)) => return Some(Ok(closed)),
                Ok(None) => {}
                Err(Error::InvalidPoint { table, problem, value, .. }) => {
                    done = true;
                    return Some(Err(Error::InvalidPoint { table, index, problem, value }));
                }
                Err(other) => {
                    done = true;
                    return Some(Err(other));
                }
            }
        }
        done = true;
        watch.finish().map(Ok)
    }))
}

/// The span around a series' maximum where it stays within a fraction of it.
#[derive(Debug, Clone, Copy, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize))]
pub struct Plateau {
    /// Where the series rose to within the fraction of its maximum, s (interpolated).
    pub start_time_s: f64,
    /// Where it fell below it again, s (interpolated).
    pub end_time_s: f64,
    /// The maximum it is measured from.
    pub maximum: f64,
    /// The fraction: the plateau is where the series is at least (1 - fraction) times
    /// the maximum.
    pub fraction: f64,
    /// Whether the plateau reaches the first or the last sample (it may go on beyond).
    pub open: bool,
}

/// The default fraction of a plateau: 2 % below the maximum.
pub const PLATEAU_FRACTION: f64 = 0.02;

/// The contiguous span around the largest of `values` (at `times_s`) where the series is
/// at least (1 - `fraction`) times `maximum` (the refined maximum of the series, or the
/// largest sample when `None`), the crossings interpolated linearly between samples.
/// `None` for an empty series or a maximum that is not above 0.
///
/// ```
/// use aerostrata::flight::plateau;
/// let t = [0.0, 1.0, 2.0, 3.0, 4.0, 5.0];
/// let q = [0.0, 97.0, 99.0, 100.0, 98.5, 50.0];
/// // At least 98: from the crossing between 1 and 2 s to the one between 4 and 5 s.
/// let p = plateau(&t, &q, None, 0.02)?.unwrap();
/// assert!((p.start_time_s - 1.5).abs() < 1e-12);
/// assert!((p.end_time_s - (4.0 + 0.5 / 48.5)).abs() < 1e-12);
/// # Ok::<(), aerostrata::Error>(())
/// ```
///
/// # Errors
/// [`Error::InvalidPoint`] when the slices differ in length, a value is not finite or
/// the times are not finite and increasing; [`Error::RatioOutOfRange`] for a fraction
/// outside (0, 1); [`Error::OutOfRange`] for a maximum below the largest sample.
pub fn plateau(
    times_s: &[f64],
    values: &[f64],
    maximum: Option<f64>,
    fraction: f64,
) -> Result<Option<Plateau>> {
    same_length(times_s, values)?;
    if !fraction.is_finite() {
        return Err(Error::NotFinite { quantity: "plateau fraction", value: fraction });
    }
    if !(fraction > 0.0 && fraction < 1.0) {
        // A fraction, so no unit (an OutOfRange would print an empty one).
        return Err(Error::RatioOutOfRange {
            quantity: "plateau fraction",
            value: fraction,
            min: 0.0,
            max: 1.0,
        });
    }
    for (index, &t) in times_s.iter().enumerate() {
        let previous = index.checked_sub(1).and_then(|i| times_s.get(i));
        if !t.is_finite() || previous.is_some_and(|&p| t <= p) {
            return Err(Error::InvalidPoint {
                table: "series",
                index,
                problem: "times must be finite and increase",
                value: t,
            });
        }
    }
    let mut peak: Option<(usize, f64)> = None;
    for (index, &v) in values.iter().enumerate() {
        if !v.is_finite() {
            return Err(Error::InvalidPoint {
                table: "series",
                index,
                problem: "values must be finite",
                value: v,
            });
        }
        if peak.is_none_or(|(_, p)| v > p) {
            peak = Some((index, v));
        }
    }
    let Some((k, sampled)) = peak else { return Ok(None) };
    let maximum = maximum.unwrap_or(sampled);
    if !(maximum >= sampled && maximum.is_finite()) {
        return Err(Error::OutOfRange {
            quantity: "plateau maximum",
            unit: "",
            value: maximum,
            min: sampled,
            max: f64::MAX,
        });
    }
    if maximum <= 0.0 {
        return Ok(None);
    }
    let floor = (1.0 - fraction) * maximum;
    let time = |i: usize| times_s.get(i).copied().unwrap_or(f64::NAN);
    let value = |i: usize| values.get(i).copied().unwrap_or(f64::NAN);
    let cross = |i: usize, j: usize| {
        let t = time(i) + (floor - value(i)) / (value(j) - value(i)) * (time(j) - time(i));
        if t.is_finite() {
            t.max(time(i).min(time(j))).min(time(i).max(time(j)))
        } else {
            time(j)
        }
    };
    // The largest sample may itself be below the floor when the refined maximum is far
    // above it: the plateau is then the instant of the largest sample.
    let mut first = k;
    while first > 0 && value(first - 1) >= floor {
        first -= 1;
    }
    let mut last = k;
    while last + 1 < values.len() && value(last + 1) >= floor {
        last += 1;
    }
    let start_time_s = if first > 0 && value(first) >= floor { cross(first - 1, first) } else { time(first) };
    let end_time_s =
        if last + 1 < values.len() && value(last) >= floor { cross(last + 1, last) } else { time(last) };
    Ok(Some(Plateau {
        start_time_s,
        end_time_s,
        maximum,
        fraction,
        open: first == 0 || last + 1 == values.len(),
    }))
}

/// Where the straight line from (t0, v0) to (t1, v1) meets `limit`, held within the two
/// times against rounding.
fn crossing(limit: f64, t0: f64, v0: f64, t1: f64, v1: f64) -> f64 {
    let t = t0 + (limit - v0) / (v1 - v0) * (t1 - t0);
    if t.is_finite() {
        t.max(t0).min(t1)
    } else {
        t1
    }
}

fn same_length(times_s: &[f64], values: &[f64]) -> Result<()> {
    if times_s.len() == values.len() {
        Ok(())
    } else {
        Err(Error::InvalidPoint {
            table: "series",
            index: times_s.len().min(values.len()),
            problem: "times and values must have the same length; longest length",
            value: times_s.len().max(values.len()) as f64,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn all(times: &[f64], values: &[f64], limit: f64) -> ([Option<Exceedance>; 4], usize) {
        let mut out = [None; 4];
        let mut n = 0;
        for e in exceedances(times, values, limit).unwrap() {
            out[n] = Some(e.unwrap());
            n += 1;
        }
        (out, n)
    }

    #[test]
    fn intervals_open_and_close_at_the_interpolated_crossings() {
        let t = [0.0, 1.0, 2.0, 3.0, 4.0, 5.0, 6.0];
        let v = [20.0, 40.0, 20.0, 10.0, 35.0, 50.0, 45.0];
        let (found, n) = all(&t, &v, 30.0);
        assert_eq!(n, 2);
        let first = found[0].unwrap();
        assert_eq!(
            (first.start_time_s, first.end_time_s, first.peak, first.peak_time_s),
            (0.5, 1.5, 40.0, 1.0)
        );
        assert!(!first.open_start && !first.open_end);
        let second = found[1].unwrap();
        assert_eq!((second.start_time_s, second.end_time_s, second.peak), (3.8, 6.0, 50.0));
        assert!(second.open_end);
        // Already above at the start; exactly at the limit is not above it.
        let (found, n) = all(&[0.0, 1.0, 2.0], &[31.0, 30.0, 30.0], 30.0);
        assert_eq!(n, 1);
        assert_eq!((found[0].unwrap().start_time_s, found[0].unwrap().end_time_s), (0.0, 1.0));
        assert!(found[0].unwrap().open_start);
        assert_eq!(all(&[0.0, 1.0], &[30.0, 30.0], 30.0).1, 0);
    }

    #[test]
    fn bad_series_are_refused_naming_the_sample() {
        let mut it = exceedances(&[0.0, 1.0, 1.0], &[1.0, 2.0, 3.0], 0.0).unwrap();
        assert!(matches!(it.next(), Some(Err(Error::InvalidPoint { index: 2, .. }))));
        assert!(it.next().is_none());
        assert!(exceedances(&[0.0], &[1.0, 2.0], 0.0).is_err());
        assert!(LimitWatch::new(f64::NAN).is_err());
        assert!(plateau(&[0.0, 1.0], &[1.0, f64::NAN], None, 0.02).is_err());
        assert!(plateau(&[0.0, 1.0], &[1.0, 2.0], None, 1.5).is_err());
        assert!(plateau(&[0.0, 1.0], &[1.0, 2.0], Some(1.0), 0.02).is_err());
        assert_eq!(plateau(&[], &[], None, 0.02).unwrap(), None);
        // Times that do not increase, or are not finite, are refused: a crossing between
        // them would be no time at all (before, an Ok with a NaN time).
        assert!(plateau(&[0.0, 0.0], &[1.0, 2.0], None, 0.02).is_err());
        assert!(plateau(&[f64::NAN, 1.0], &[2.0, 1.0], None, 0.5).is_err());
    }

    #[test]
    fn a_plateau_at_the_ends_is_open() {
        let p = plateau(&[0.0, 1.0, 2.0], &[100.0, 99.0, 50.0], None, 0.02).unwrap().unwrap();
        assert!(p.open && p.start_time_s == 0.0);
        // A refined maximum far above every sample: the plateau is the largest sample's
        // instant.
        let p = plateau(&[0.0, 1.0, 2.0], &[50.0, 90.0, 50.0], Some(100.0), 0.02).unwrap().unwrap();
        assert_eq!((p.start_time_s, p.end_time_s), (1.0, 1.0));
    }
}
