//! Seeded Monte Carlo over the toleranced inputs, runnable in slices.
//!
//! Each sample draws every toleranced input independently from its
//! distribution (generator and normal method in [`super::sampler`]), in input
//! order, evaluates the model once, and records every figure. At the end each
//! figure gets min, P1, P5, P50, P95, P99, max, mean and standard deviation
//! (Hyndman–Fan type 7 quantiles, [`super::stats`]); each limit gets the share
//! of samples beyond it with a Wilson 95 % interval; one chosen figure gets a
//! histogram.
//!
//! **Slicing.** [`MonteCarloRun::advance`] runs up to `n` more samples; the
//! generator state (including the polar method's spare normal) lives in the
//! run, and every statistic is computed in [`MonteCarloRun::finish`] from the
//! values in sample order, so the result is bit-identical however the run is
//! sliced (tested). **Cost per sample**: no allocation; the input and figure
//! buffers are reused and each figure's column was reserved for the full
//! sample count up front. **Memory**: 8 bytes × samples × figures
//! (10 000 samples × 30 figures = 2.4 MB), refused above
//! [`MAX_STORED_VALUES`] values (128 MiB) because exact quantiles need every
//! value.
//!
//! **Failures are counted, never dropped**: a sample where the model returns
//! `Err` counts in `failed` (the first message is kept), and every figure
//! counts it as missing; a non-finite figure value counts as missing for that
//! figure alone. Statistics are over the samples with a value; the limit
//! result also gives the upper bound if every missing sample had exceeded.

use super::input::TolerancedInput;
use super::sampler::Sampler;
use super::stats::{wilson_95, Histogram, Interval, Summary};
use super::{FigureMeta, Model};
use crate::error::{check, InputError};
use crate::figure::Figure;
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// Default sample count.
pub const DEFAULT_SAMPLES: usize = 10_000;
/// Largest sample count accepted.
pub const MAX_SAMPLES: usize = 1_000_000;
/// Default seed (an arbitrary fixed number, printed in every report so the
/// study can be repeated).
pub const DEFAULT_SEED: u64 = 20_240_611;
/// Largest samples × figures stored for exact quantiles: 2²⁴ values, 128 MiB
/// of f64 (e.g. 10⁶ samples of 16 figures, or 10⁴ samples of 1677 figures).
pub const MAX_STORED_VALUES: usize = 1 << 24;
/// Default histogram bin count.
pub const DEFAULT_BINS: usize = 40;
/// Largest histogram bin count.
pub const MAX_BINS: usize = 1000;

/// Which side of the threshold a figure must stay on.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Comparison {
    /// The figure must be at most the threshold (a force or energy limit):
    /// exceeded when value > threshold.
    AtMost,
    /// The figure must be at least the threshold (a minimum gap): exceeded
    /// when value < threshold.
    AtLeast,
}

/// A limit on one figure, whose exceedance probability the study estimates.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct Limit {
    /// Identifier of the check, e.g. `guard.closing_force` (used in figure ids).
    pub id: String,
    /// Index of the figure in the model's output.
    pub figure: usize,
    /// Threshold in the figure's SI unit.
    pub threshold: f64,
    /// Which side the figure must stay on.
    pub comparison: Comparison,
}

impl Limit {
    /// Whether `value` lies beyond the limit (a value equal to the threshold
    /// is within it).
    pub fn is_exceeded(&self, value: f64) -> bool {
        match self.comparison {
            Comparison::AtMost => value > self.threshold,
            Comparison::AtLeast => value < self.threshold,
        }
    }
}

/// Which figure gets a histogram and with how many bins.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct HistogramSpec {
    /// Index of the figure in the model's output.
    pub figure: usize,
    /// Number of equal-width bins over the figure's min..max, 1..=1000.
    pub bins: usize,
}

/// Settings of a Monte Carlo study.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct MonteCarloConfig {
    /// Number of samples, 1..=1 000 000 (default 10 000).
    pub samples: usize,
    /// Seed of the PCG32 generator: the same seed and inputs give the same
    /// result, bit for bit.
    pub seed: u64,
    /// Limits whose exceedance probability is wanted.
    pub limits: Vec<Limit>,
    /// Optional histogram of one figure.
    pub histogram: Option<HistogramSpec>,
}

impl Default for MonteCarloConfig {
    fn default() -> Self {
        Self {
            samples: DEFAULT_SAMPLES,
            seed: DEFAULT_SEED,
            limits: Vec::new(),
            histogram: None,
        }
    }
}

impl MonteCarloConfig {
    /// Check the settings for a model with `figure_count` figures.
    ///
    /// # Errors
    /// `samples` out of 1..=1 000 000 or samples × figures above
    /// [`MAX_STORED_VALUES`]; `figure_count` zero; `limits[k].figure` out of
    /// range or `limits[k].threshold` not finite; `histogram.figure` or
    /// `histogram.bins` out of range.
    pub fn validate(&self, figure_count: usize) -> Result<(), InputError> {
        check::in_range("samples", self.samples as f64, 1.0, MAX_SAMPLES as f64)?;
        if figure_count == 0 {
            return Err(InputError::invalid(
                "figure_count",
                "at least one figure is needed",
            ));
        }
        if self.samples.saturating_mul(figure_count) > MAX_STORED_VALUES {
            return Err(InputError::invalid(
                "samples",
                format!(
                    "samples × figures may be at most {MAX_STORED_VALUES} (memory for exact percentiles); \
                     with {figure_count} figures use at most {} samples",
                    MAX_STORED_VALUES / figure_count
                ),
            ));
        }
        let last = (figure_count - 1) as f64;
        for (k, l) in self.limits.iter().enumerate() {
            let within = |e: InputError| e.within(&format!("limits[{k}]"));
            check::in_range("figure", l.figure as f64, 0.0, last).map_err(within)?;
            check::finite("threshold", l.threshold).map_err(within)?;
        }
        if let Some(h) = &self.histogram {
            let within = |e: InputError| e.within("histogram");
            check::in_range("figure", h.figure as f64, 0.0, last).map_err(within)?;
            check::in_range("bins", h.bins as f64, 1.0, MAX_BINS as f64).map_err(within)?;
        }
        Ok(())
    }
}

/// How far a run has got.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub struct Progress {
    /// Samples evaluated so far.
    pub done: usize,
    /// Samples requested.
    pub total: usize,
}

impl Progress {
    /// Share done, 0..=1.
    pub fn fraction(&self) -> f64 {
        if self.total == 0 {
            1.0
        } else {
            self.done as f64 / self.total as f64
        }
    }

    /// Whether every requested sample has been evaluated.
    pub fn is_complete(&self) -> bool {
        self.done >= self.total
    }
}

/// The first sample at which the model could not compute.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct SampleFailure {
    /// Index of the sample (0-based).
    pub sample: usize,
    /// Input values of that sample (SI), to reproduce it.
    pub inputs: Vec<f64>,
    /// The model's error message.
    pub message: String,
}

/// Distribution of one figure over the samples.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FigureDistribution {
    /// Samples with a finite value.
    pub valid: usize,
    /// Samples without one (model error or non-finite value).
    pub missing: usize,
    /// Statistics of the valid values; `None` when there are none.
    pub summary: Option<Summary>,
}

/// Exceedance of one limit over the samples.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Exceedance {
    /// The limit.
    pub limit: Limit,
    /// Samples beyond the limit.
    pub exceeded: usize,
    /// Samples where the figure had a value.
    pub evaluated: usize,
    /// Samples where it had none.
    pub missing: usize,
    /// exceeded / evaluated; `None` when nothing was evaluated.
    pub probability: Option<f64>,
    /// Wilson score interval at 95 % on that probability.
    pub interval: Option<Interval>,
    /// Upper Wilson bound if every missing sample had exceeded too:
    /// (exceeded + missing) of (evaluated + missing). Equal to the upper
    /// bound above when nothing is missing.
    pub high_if_missing_exceeded: Option<f64>,
}

/// Result of a Monte Carlo study.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct MonteCarloResult {
    /// Seed used.
    pub seed: u64,
    /// The generator, named so the study can be reproduced elsewhere.
    pub generator: String,
    /// Samples requested.
    pub samples_requested: usize,
    /// Samples evaluated (fewer when the run was finished early).
    pub samples_run: usize,
    /// Samples at which the model returned an error.
    pub failed: usize,
    /// The first of those.
    pub first_failure: Option<SampleFailure>,
    /// One entry per model figure, in order.
    pub figures: Vec<FigureDistribution>,
    /// One entry per configured limit, in order.
    pub limits: Vec<Exceedance>,
    /// Histogram of the chosen figure, if one was asked for and it has values.
    pub histogram: Option<Histogram>,
}

/// Name of the generator and seeding, as written into every result.
pub const GENERATOR: &str =
    "PCG32 (PCG-XSH-RR 64/32, O'Neill 2014), state = seed, stream 0xa02bdbf7bb3c0a7";

/// A Monte Carlo study in progress. Create it, call [`advance`](Self::advance)
/// until [`Progress::is_complete`], then [`finish`](Self::finish).
#[derive(Debug, Clone)]
pub struct MonteCarloRun {
    inputs: Vec<TolerancedInput>,
    config: MonteCarloConfig,
    sampler: Sampler,
    done: usize,
    failed: usize,
    first_failure: Option<SampleFailure>,
    x: Vec<f64>,
    y: Vec<f64>,
    columns: Vec<Vec<f64>>,
    missing: Vec<usize>,
    exceeded: Vec<usize>,
}

impl MonteCarloRun {
    /// A new run over `inputs` for a model with `figure_count` figures.
    /// Reserves the memory for every value up front (module doc).
    ///
    /// # Errors
    /// As [`MonteCarloConfig::validate`].
    pub fn new(
        inputs: &[TolerancedInput],
        figure_count: usize,
        config: MonteCarloConfig,
    ) -> Result<Self, InputError> {
        config.validate(figure_count)?;
        let limits = config.limits.len();
        Ok(Self {
            inputs: inputs.to_vec(),
            sampler: Sampler::new(config.seed),
            done: 0,
            failed: 0,
            first_failure: None,
            x: vec![0.0; inputs.len()],
            y: vec![f64::NAN; figure_count],
            columns: (0..figure_count)
                .map(|_| Vec::with_capacity(config.samples))
                .collect(),
            missing: vec![0; figure_count],
            exceeded: vec![0; limits],
            config,
        })
    }

    /// Evaluate up to `max_samples` more samples (fewer when the run reaches
    /// its sample count) and return the progress. The model receives the
    /// input values in the order of `inputs` and writes the figure values (SI)
    /// into its output slice, which is filled with NaN before each call (a
    /// figure left NaN is missing for that sample). Pass the same model to
    /// every call.
    pub fn advance<M: Model + ?Sized>(&mut self, model: &mut M, max_samples: usize) -> Progress {
        let todo = max_samples.min(self.config.samples.saturating_sub(self.done));
        for _ in 0..todo {
            for (x, input) in self.x.iter_mut().zip(&self.inputs) {
                *x = self.sampler.draw(input);
            }
            self.y.fill(f64::NAN);
            match model.evaluate(&self.x, &mut self.y) {
                Ok(()) => {
                    for ((col, miss), &v) in
                        self.columns.iter_mut().zip(&mut self.missing).zip(&self.y)
                    {
                        if v.is_finite() {
                            col.push(v);
                        } else {
                            *miss += 1;
                        }
                    }
                    for (l, c) in self.config.limits.iter().zip(&mut self.exceeded) {
                        if let Some(&v) = self.y.get(l.figure) {
                            if v.is_finite() && l.is_exceeded(v) {
                                *c += 1;
                            }
                        }
                    }
                }
                Err(e) => {
                    self.failed += 1;
                    for m in &mut self.missing {
                        *m += 1;
                    }
                    if self.first_failure.is_none() {
                        self.first_failure = Some(SampleFailure {
                            sample: self.done,
                            inputs: self.x.clone(),
                            message: e.to_string(),
                        });
                    }
                }
            }
            self.done += 1;
        }
        self.progress()
    }

    /// How far the run has got.
    pub fn progress(&self) -> Progress {
        Progress {
            done: self.done,
            total: self.config.samples,
        }
    }

    /// Statistics of the samples evaluated so far (all of them when the run
    /// is complete; a run finished early says so in `samples_run`).
    pub fn finish(self) -> MonteCarloResult {
        let Self {
            config,
            done,
            failed,
            first_failure,
            columns,
            missing,
            exceeded,
            ..
        } = self;
        let valid: Vec<usize> = columns.iter().map(Vec::len).collect();
        let limits = config
            .limits
            .iter()
            .zip(&exceeded)
            .map(|(l, &k)| {
                let n = valid.get(l.figure).copied().unwrap_or(0);
                let m = missing.get(l.figure).copied().unwrap_or(0);
                let interval = wilson_95(k, n);
                Exceedance {
                    limit: l.clone(),
                    exceeded: k,
                    evaluated: n,
                    missing: m,
                    probability: (n > 0).then(|| k as f64 / n as f64),
                    interval,
                    high_if_missing_exceeded: wilson_95(k + m, n + m).map(|i| i.high),
                }
            })
            .collect();
        let histogram = config.histogram.and_then(|h| {
            columns
                .get(h.figure)
                .and_then(|c| Histogram::of(h.figure, c, h.bins))
        });
        let figures = columns
            .into_iter()
            .zip(&missing)
            .map(|(mut col, &m)| FigureDistribution {
                valid: col.len(),
                missing: m,
                summary: Summary::of(&mut col),
            })
            .collect();
        MonteCarloResult {
            seed: config.seed,
            generator: GENERATOR.into(),
            samples_requested: config.samples,
            samples_run: done,
            failed,
            first_failure,
            figures,
            limits,
            histogram,
        }
    }

    /// Bytes reserved for stored values and buffers (for tests and memory
    /// budgets); unchanged by [`advance`](Self::advance).
    pub fn reserved_bytes(&self) -> usize {
        let f = std::mem::size_of::<f64>();
        self.columns.iter().map(|c| c.capacity() * f).sum::<usize>()
            + (self.x.capacity() + self.y.capacity()) * f
    }
}

/// Run a whole study in one go: [`MonteCarloRun::new`], one
/// [`advance`](MonteCarloRun::advance) over every sample, then
/// [`finish`](MonteCarloRun::finish).
///
/// # Errors
/// As [`MonteCarloConfig::validate`].
pub fn monte_carlo<M: Model + ?Sized>(
    inputs: &[TolerancedInput],
    figure_count: usize,
    config: MonteCarloConfig,
    model: &mut M,
) -> Result<MonteCarloResult, InputError> {
    let mut run = MonteCarloRun::new(inputs, figure_count, config)?;
    let total = run.progress().total;
    run.advance(model, total);
    Ok(run.finish())
}

impl MonteCarloResult {
    /// The percentiles and extremes as user-facing figures,
    /// `{id}.p50`, `{id}.p95`, `{id}.p99`, `{id}.mc_min`, `{id}.mc_max`, for
    /// the figures described by `meta` (model figure order), and
    /// `{limit id}.exceedance_probability` for each limit.
    pub fn figures(&self, meta: &[FigureMeta]) -> Vec<Figure> {
        let method = format!(
            "Monte Carlo, {} samples, seed {}, {}; percentile by Hyndman–Fan type 7 (linear interpolation)",
            self.samples_run, self.seed, self.generator
        );
        let source = "Hyndman & Fan, The American Statistician 50(4) 361–365 (1996), definition 7";
        let independent = "toleranced inputs independent of one another, each spread as stated \
                           (normal: σ = tolerance/3)";
        let mut out = Vec::new();
        for (m, d) in meta.iter().zip(&self.figures) {
            let picks: [(&str, &str, Option<f64>); 5] = [
                ("p50", "median", d.summary.map(|s| s.p50)),
                ("p95", "95th percentile", d.summary.map(|s| s.p95)),
                ("p99", "99th percentile", d.summary.map(|s| s.p99)),
                ("mc_min", "lowest sampled", d.summary.map(|s| s.min)),
                ("mc_max", "highest sampled", d.summary.map(|s| s.max)),
            ];
            for (suffix, words, value) in picks {
                let id = format!("{}.{suffix}", m.id);
                let label = format!("{}, {words}", m.label);
                let mut fig = match value {
                    Some(v) => Figure::new(&id, &label, m.dim, v)
                        .method(&method)
                        .source(source)
                        .assume(independent),
                    None => Figure::missing(
                        &id,
                        &label,
                        m.dim,
                        vec!["no sample gave a finite value".into()],
                    ),
                };
                if d.missing > 0 {
                    fig = fig.assume(&format!(
                        "{} of {} samples gave no value and are not included",
                        d.missing, self.samples_run
                    ));
                }
                out.push(fig);
            }
        }
        for e in &self.limits {
            let id = format!("{}.exceedance_probability", e.limit.id);
            let label = format!("Probability of exceeding the limit {}", e.limit.id);
            let fig = match (e.probability, e.interval) {
                (Some(p), Some(i)) => {
                    let mut fig = Figure::new(&id, &label, Dim::Probability, p)
                        .method(&format!(
                            "{} of {} samples beyond the threshold {}; Wilson score interval at 95 %: {} to {}",
                            e.exceeded, e.evaluated, e.limit.threshold, i.low, i.high
                        ))
                        .source("Wilson, J. Amer. Statist. Assoc. 22, 209–212 (1927)")
                        .assume(independent);
                    if e.missing > 0 {
                        if let Some(h) = e.high_if_missing_exceeded {
                            fig = fig.assume(&format!(
                                "{} samples gave no value; if all of them exceeded, the upper bound would be {h}",
                                e.missing
                            ));
                        }
                    }
                    fig
                }
                _ => Figure::missing(
                    &id,
                    &label,
                    Dim::Probability,
                    vec!["no sample gave a value for this figure".into()],
                ),
            };
            out.push(fig);
        }
        out
    }
}
