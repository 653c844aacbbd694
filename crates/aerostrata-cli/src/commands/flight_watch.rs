//! What `flight` watches while the samples stream past, beside the core's scan: the
//! intervals above `--q-limit` and `--q-alpha-limit` (the core's `LimitWatch`, one sample
//! at a time) and the span of samples around the maximum q that the plateau is measured
//! over (the core's `plateau`, which reads slices). Memory stays bounded by the samples
//! within the plateau fraction of the running maximum, not by the flight.

use std::collections::VecDeque;

use aerostrata::flight::{plateau, Exceedance, LimitWatch, Plateau};

use crate::failure::Failure;

/// The intervals where one quantity exceeds its limit.
pub struct Limit {
    watch: LimitWatch,
    /// The intervals closed so far, then all of them after [`Limit::finish`].
    pub found: Vec<Exceedance>,
}

impl Limit {
    /// A watch of values above `limit` (SI).
    ///
    /// # Errors
    /// [`Failure::Input`] naming `option` when the core refuses the limit.
    pub fn new(limit: f64, option: &str) -> Result<Self, Failure> {
        let watch = LimitWatch::new(limit).map_err(|e| Failure::Input(format!("{option}: {e}")))?;
        Ok(Limit { watch, found: Vec::new() })
    }

    /// The limit, SI.
    pub fn limit(&self) -> f64 {
        self.watch.limit()
    }

    /// Takes the value at `time_s`.
    ///
    /// # Errors
    /// The core's message for a value that is not finite or a time out of order.
    pub fn push(&mut self, time_s: f64, value: f64) -> aerostrata::Result<()> {
        self.found.extend(self.watch.push(time_s, value)?);
        Ok(())
    }

    /// Closes an interval still open at the last sample.
    pub fn finish(&mut self) {
        self.found.extend(self.watch.finish());
    }
}

/// The samples of q(t) around its running maximum that the plateau can reach: from the
/// last sample below (1 - fraction) times the running maximum before it to the first
/// below it after. A new maximum raises that threshold; the last sample below it is
/// found by a binary search of the samples that are lower than every later one (their
/// values increase with their index), kept as a stack.
pub struct PlateauTrack {
    fraction: f64,
    maximum: f64,
    /// The region around the maximum once closed by a sample below the threshold.
    closed: Vec<(f64, f64)>,
    /// The samples since the last one below the threshold (that one first).
    current: VecDeque<(f64, f64)>,
    /// Index of `current[0]` among all samples.
    base: usize,
    /// Indices of the samples of `current` lower than every later one, in order.
    minima: VecDeque<usize>,
    count: usize,
}

impl PlateauTrack {
    /// A track for a plateau within `fraction` of the maximum (0 < fraction < 1).
    pub fn new(fraction: f64) -> Self {
        PlateauTrack {
            fraction,
            maximum: f64::NEG_INFINITY,
            closed: Vec::new(),
            current: VecDeque::new(),
            base: 0,
            minima: VecDeque::new(),
            count: 0,
        }
    }

    fn threshold(&self) -> f64 {
        (1.0 - self.fraction) * self.maximum
    }

    fn value(&self, index: usize) -> f64 {
        self.current.get(index - self.base).map_or(f64::NAN, |s| s.1)
    }

    /// Takes q at `time_s`.
    pub fn push(&mut self, time_s: f64, q: f64) {
        let index = self.count;
        self.count += 1;
        if q > self.maximum {
            self.maximum = q;
            self.closed.clear();
            // Drop what lies before the last sample below the new threshold.
            let threshold = self.threshold();
            let below = self.minima.partition_point(|&i| self.value(i) < threshold);
            if let Some(&keep) = below.checked_sub(1).and_then(|b| self.minima.get(b)) {
                self.current.drain(..keep - self.base);
                self.minima.drain(..below - 1);
                self.base = keep;
            }
        } else if q < self.threshold() {
            let region = std::mem::take(&mut self.current);
            if self.closed.is_empty() {
                self.closed = region.into_iter().collect();
                self.closed.push((time_s, q));
            }
            self.base = index;
            self.minima.clear();
        }
        while self.minima.back().is_some_and(|&i| self.value(i) >= q) {
            self.minima.pop_back();
        }
        self.current.push_back((time_s, q));
        self.minima.push_back(index);
    }

    /// The plateau within the fraction of `maximum` (the refined maximum q), or `None`
    /// without samples.
    ///
    /// # Errors
    /// The core's message, naming `--plateau-fraction` where it is the fraction's.
    pub fn plateau(&self, maximum: f64) -> Result<Option<Plateau>, Failure> {
        let samples: Vec<(f64, f64)> =
            if self.closed.is_empty() { self.current.iter().copied().collect() } else { self.closed.clone() };
        let (times, values): (Vec<f64>, Vec<f64>) = samples.into_iter().unzip();
        plateau(&times, &values, Some(maximum), self.fraction)
            .map_err(|e| Failure::Input(format!("--plateau-fraction: {e}")))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The track gives the plateau the core finds over the whole series.
    #[test]
    fn the_track_keeps_what_the_whole_series_gives() {
        let series: Vec<Vec<f64>> = vec![
            vec![0.0, 97.0, 99.0, 100.0, 98.5, 50.0],
            vec![10.0, 99.0, 20.0, 99.5, 100.0, 99.0, 10.0, 99.9, 5.0],
            (0..200).map(f64::from).collect(),
            (0..200).map(|i| 100.0 - (f64::from(i) - 120.0).abs()).collect(),
            vec![1.0, 1.0, 1.0, 1.0],
            vec![5.0, 100.0, 99.0, 1.0, 100.5, 100.2, 100.4, 3.0],
        ];
        for values in series {
            let times: Vec<f64> = (0..values.len()).map(|i| i as f64 * 0.5).collect();
            let maximum = values.iter().copied().fold(f64::NEG_INFINITY, f64::max);
            let whole = plateau(&times, &values, Some(maximum), 0.02).unwrap();
            let mut track = PlateauTrack::new(0.02);
            for (t, q) in times.iter().zip(&values) {
                track.push(*t, *q);
            }
            let tracked = track.plateau(maximum).unwrap();
            assert_eq!(tracked, whole, "{values:?}");
        }
    }
}
