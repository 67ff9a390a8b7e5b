//! A small timing kit shared by the benchmarks (`#[path = "kit/mod.rs"] mod kit;`), so that the
//! test build carries no benchmark framework and its dependencies.
//!
//! Each benchmark runs its routine for a short warm-up, which also estimates the time of one
//! call; then it takes `sample_size` samples, each timing enough calls to last about
//! `MEASURE / sample_size`, and prints the median time per call with the fastest and the slowest
//! sample (and the rate, when a throughput is set). A median of samples, not a mean, because the
//! machines are shared and noisy: a sample slowed by another process moves the mean, not the
//! median. Ratios of two versions should be measured in one session, alternating the binaries.
//!
//! `cargo bench --bench NAME [FILTER]` runs the benchmarks whose full name (`group/name`)
//! contains FILTER; `-- --list` lists them. Run by `cargo test --benches`, every routine is
//! called once, as a smoke test.

#![allow(dead_code)]

use std::time::{Duration, Instant};

pub use std::hint::black_box;

/// How long a benchmark's warm-up runs.
const WARM_UP: Duration = Duration::from_millis(500);
/// How long a benchmark's samples take together, about.
const MEASURE: Duration = Duration::from_secs(3);
/// Samples per benchmark unless its group says otherwise.
const DEFAULT_SAMPLES: usize = 20;

/// What the command line asked for.
#[derive(Debug, Clone, Default)]
struct Options {
    filter: Option<String>,
    list: bool,
    /// One call per routine (run by `cargo test --benches`).
    smoke: bool,
}

impl Options {
    fn from_args() -> Options {
        let mut o = Options::default();
        for a in std::env::args().skip(1) {
            match a.as_str() {
                "--list" => o.list = true,
                "--test" => o.smoke = true,
                "--bench" => {}
                s if s.starts_with('-') => {}
                s => o.filter = Some(s.to_string()),
            }
        }
        o
    }
}

/// The runner handed to each benchmark function.
pub struct Runner {
    options: Options,
}

impl Default for Runner {
    fn default() -> Self {
        Runner { options: Options::from_args() }
    }
}

impl Runner {
    /// A benchmark outside any group.
    pub fn bench_function(
        &mut self,
        name: impl AsRef<str>,
        f: impl FnMut(&mut Timer),
    ) -> &mut Self {
        run(&self.options, name.as_ref(), DEFAULT_SAMPLES, None, f);
        self
    }

    /// A group of benchmarks sharing a name prefix and settings.
    pub fn benchmark_group(&mut self, name: &str) -> Group<'_> {
        Group { runner: self, name: name.to_string(), samples: DEFAULT_SAMPLES, throughput: None }
    }
}

/// Work done by one call, to print a rate beside the time.
#[derive(Debug, Clone, Copy)]
pub enum Throughput {
    /// Items processed per call.
    Elements(u64),
}

/// How `iter_batched` prepares inputs (kept for the call sites; every input is made per call).
#[derive(Debug, Clone, Copy)]
pub enum BatchSize {
    SmallInput,
}

/// A named group of benchmarks.
pub struct Group<'a> {
    runner: &'a mut Runner,
    name: String,
    samples: usize,
    throughput: Option<Throughput>,
}

impl Group<'_> {
    /// Samples per benchmark of the group (at least 2).
    pub fn sample_size(&mut self, n: usize) -> &mut Self {
        self.samples = n.max(2);
        self
    }

    /// Work per call, for the rate.
    pub fn throughput(&mut self, t: Throughput) -> &mut Self {
        self.throughput = Some(t);
        self
    }

    /// A benchmark of the group.
    pub fn bench_function(
        &mut self,
        name: impl AsRef<str>,
        f: impl FnMut(&mut Timer),
    ) -> &mut Self {
        let full = format!("{}/{}", self.name, name.as_ref());
        run(&self.runner.options, &full, self.samples, self.throughput, f);
        self
    }

    /// The end of the group.
    pub fn finish(self) {}
}

/// Times the routine a benchmark hands it.
pub struct Timer {
    /// Calls to make in this sample.
    calls: u64,
    /// Time the calls took (setup of `iter_batched` excluded).
    elapsed: Duration,
}

impl Timer {
    /// Time `calls` calls of the routine.
    pub fn iter<T>(&mut self, mut routine: impl FnMut() -> T) {
        let start = Instant::now();
        for _ in 0..self.calls {
            black_box(routine());
        }
        self.elapsed = start.elapsed();
    }

    /// Time the routine on inputs made by `setup`, which is not timed.
    pub fn iter_batched<I, T>(
        &mut self,
        mut setup: impl FnMut() -> I,
        mut routine: impl FnMut(I) -> T,
        _size: BatchSize,
    ) {
        let mut elapsed = Duration::ZERO;
        for _ in 0..self.calls {
            let input = setup();
            let start = Instant::now();
            black_box(routine(input));
            elapsed += start.elapsed();
        }
        self.elapsed = elapsed;
    }
}

/// One sample: `calls` calls of the benchmark, the time per call.
fn sample(f: &mut impl FnMut(&mut Timer), calls: u64) -> Duration {
    let mut t = Timer { calls, elapsed: Duration::ZERO };
    f(&mut t);
    t.elapsed / calls.max(1) as u32
}

fn run(
    options: &Options,
    name: &str,
    samples: usize,
    throughput: Option<Throughput>,
    mut f: impl FnMut(&mut Timer),
) {
    if options.filter.as_deref().is_some_and(|p| !name.contains(p)) {
        return;
    }
    if options.list {
        println!("{name}: benchmark");
        return;
    }
    if options.smoke {
        sample(&mut f, 1);
        println!("{name}: ran once");
        return;
    }
    // Warm-up: calls doubled until the warm-up time is spent; the last round estimates a call.
    let start = Instant::now();
    let mut calls = 1u64;
    let mut per_call = sample(&mut f, calls);
    while start.elapsed() < WARM_UP {
        calls = calls.saturating_mul(2);
        per_call = sample(&mut f, calls);
    }
    let target = MEASURE / samples as u32;
    let calls = (target.as_secs_f64() / per_call.as_secs_f64().max(1e-9)).clamp(1.0, 1e9) as u64;
    let mut times: Vec<Duration> = (0..samples).map(|_| sample(&mut f, calls)).collect();
    times.sort();
    let median = times[times.len() / 2];
    let rate = match throughput {
        Some(Throughput::Elements(n)) => {
            format!(", {:.3e} elements/s", n as f64 / median.as_secs_f64().max(1e-12))
        }
        None => String::new(),
    };
    println!(
        "{name}: median {} per call (fastest {}, slowest {}; {} samples of {} calls){rate}",
        show(median),
        show(times[0]),
        show(times[times.len() - 1]),
        samples,
        calls
    );
}

/// A duration with a unit that keeps three or four significant figures.
fn show(d: Duration) -> String {
    let s = d.as_secs_f64();
    if s >= 1.0 {
        format!("{s:.3} s")
    } else if s >= 1e-3 {
        format!("{:.3} ms", s * 1e3)
    } else if s >= 1e-6 {
        format!("{:.3} µs", s * 1e6)
    } else {
        format!("{:.1} ns", s * 1e9)
    }
}

/// The benchmark functions of a file, run in order (the file's `main`).
#[macro_export]
macro_rules! bench_main {
    ($($f:path),+ $(,)?) => {
        fn main() {
            let mut runner = $crate::kit::Runner::default();
            $( $f(&mut runner); )+
        }
    };
}
