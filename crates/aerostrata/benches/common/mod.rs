//! What the benchmarks share: the generator of their fixed pseudo-random altitudes,
//! criterion's settings, the group of a benchmark binary, the timed loop over a prepared
//! set of inputs, and the binary's `main`. Each benchmark uses a part of it, so the rest
//! is dead code there.
#![allow(dead_code)]

use std::hint::black_box;
use std::time::Duration;

use criterion::measurement::WallTime;
use criterion::{BenchmarkGroup, Criterion, Throughput};

/// Marsaglia's xorshift64 (G. Marsaglia, "Xorshift RNGs", Journal of Statistical Software
/// 8 (2003); from memory): tiny, deterministic, good enough to scatter altitudes.
pub struct XorShift64(pub u64);

impl XorShift64 {
    pub fn next_u64(&mut self) -> u64 {
        let mut x = self.0;
        x ^= x << 13;
        x ^= x >> 7;
        x ^= x << 17;
        self.0 = x;
        x
    }

    /// Uniform in [0, 1), from the top 53 bits.
    pub fn next_unit(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 * (1.0 / (1u64 << 53) as f64)
    }
}

/// Criterion taking `sample_size` samples after `warm_up`, over about `measurement`.
pub fn settings(sample_size: usize, warm_up: Duration, measurement: Duration) -> Criterion {
    Criterion::default().sample_size(sample_size).warm_up_time(warm_up).measurement_time(measurement)
}

/// The settings of the benchmarks whose iteration is a pass over 1024 evaluations: 30
/// samples, half a second of warm-up, two seconds of measurement.
pub fn per_evaluation() -> Criterion {
    settings(30, Duration::from_millis(500), Duration::from_secs(2))
}

/// The benchmark group `name` (the first part of each benchmark's id), one iteration of
/// which is `elements` evaluations: criterion reports the throughput per evaluation.
pub fn group_of<'a>(c: &'a mut Criterion, name: &str, elements: usize) -> BenchmarkGroup<'a, WallTime> {
    let mut group = c.benchmark_group(name);
    group.throughput(Throughput::Elements(elements as u64));
    group
}

/// Times `f` over every element of `inputs` as benchmark `id` of `group`: one criterion
/// iteration is one pass, each input and each result behind `black_box`, so that the
/// compiler neither hoists the work out of the loop nor drops it.
pub fn bench_each<T: Copy, R>(
    group: &mut BenchmarkGroup<'_, WallTime>,
    id: &str,
    inputs: &[T],
    mut f: impl FnMut(T) -> R,
) {
    group.bench_function(id, |b| {
        b.iter(|| {
            for &input in inputs {
                black_box(f(black_box(input)));
            }
        });
    });
}

/// The `main` of a benchmark binary: criterion's group `benches` running the function
/// `$benchmarks` with the settings `$config`.
macro_rules! bench_main {
    ($benchmarks:path, $config:expr) => {
        criterion::criterion_group! {
            name = benches;
            config = $config;
            targets = $benchmarks
        }
        criterion::criterion_main!(benches);
    };
}
pub(crate) use bench_main;
