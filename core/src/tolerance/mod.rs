//! Tolerance study: worst-case corners and a seeded Monte Carlo over the
//! inputs that carry a tolerance, for any model that maps input values to
//! figure values.
//!
//! The engine knows no physics. The scenario layer lists the toleranced
//! inputs ([`TolerancedInput`]: field path, nominal in SI, ± absolute or
//! relative band, uniform or normal with the tolerance at 3σ) and plugs the
//! model in as a closure `FnMut(&[f64], &mut [f64]) -> Result<(), E>` (or any
//! [`Model`]): input values in, figure values out (SI). Two analyses:
//! - [`worst_case()`]: every corner of the tolerance box for up to 12 inputs,
//!   otherwise a sensitivity-guided search; the lowest and highest value of
//!   each figure with the input combination that gave it
//!   ([`worst_case`](mod@worst_case) module doc: method and its limits).
//! - [`MonteCarloRun`] / [`monte_carlo()`]: seeded PCG32 sampling (uniform;
//!   normal by the Marsaglia polar method), min/P1/P5/P50/P95/P99/max, mean
//!   and standard deviation of every figure (Hyndman–Fan type 7, as numpy's
//!   default), the probability of exceeding each limit with a Wilson 95 %
//!   interval, and a histogram. Runs in slices for a browser (bit-identical
//!   to one go), with no allocation per sample.
//!
//! Assumptions every result carries: the toleranced inputs vary
//! independently of one another (no correlation between, say, wire diameter
//! and spring rate unless the scenario expresses one through the model); the
//! normal distribution is truncated at the tolerance band ([`input`] module
//! doc: why).
//!
//! ```
//! use joulewise_core::tolerance::*;
//! use joulewise_core::InputError;
//!
//! // Two toleranced inputs: spring rate (N/m) and stroke (m).
//! let inputs = vec![
//!     TolerancedInput::new("spring.rate", 2000.0, Tolerance::relative(0.10, Distribution::Normal), true)?,
//!     TolerancedInput::new("spring.stroke", 0.05, Tolerance::absolute(0.002, Distribution::Uniform), true)?,
//! ];
//! // The model: stored energy ½·k·s² (J), figure 0.
//! let mut model = |x: &[f64], y: &mut [f64]| -> Result<(), InputError> {
//!     y[0] = 0.5 * x[0] * x[1] * x[1];
//!     Ok(())
//! };
//! let wc = worst_case(&inputs, 1, &mut model, WorstCaseOptions::default())?;
//! let max = wc.figures[0].max.as_ref().unwrap();
//! assert_eq!(max.levels, vec![Level::High, Level::High]);
//!
//! let config = MonteCarloConfig {
//!     limits: vec![Limit { id: "energy_limit".into(), figure: 0, threshold: 2.8, comparison: Comparison::AtMost }],
//!     ..MonteCarloConfig::default()
//! };
//! // In slices (a browser would yield between them) ...
//! let mut run = MonteCarloRun::new(&inputs, 1, config.clone())?;
//! while !run.advance(&mut model, 1000).is_complete() {}
//! let sliced = run.finish();
//! // ... or in one go: the same result, bit for bit.
//! let whole = monte_carlo(&inputs, 1, config, &mut model)?;
//! assert_eq!(sliced, whole);
//! let p95 = whole.figures[0].summary.unwrap().p95;
//! assert!(p95 > 2.5 && p95 < max.value);
//! # Ok::<(), InputError>(())
//! ```

pub mod input;
pub mod monte_carlo;
pub mod sampler;
pub mod stats;
pub mod worst_case;

#[cfg(test)]
mod tests;

pub use input::{Distribution, Level, Tolerance, ToleranceKind, TolerancedInput};
pub use monte_carlo::{
    monte_carlo, Comparison, Exceedance, FigureDistribution, HistogramSpec, Limit,
    MonteCarloConfig, MonteCarloResult, MonteCarloRun, Progress, SampleFailure,
};
pub use stats::{Histogram, Interval, Summary};
pub use worst_case::{
    worst_case, CornerFailure, Extreme, FigureExtremes, Swing, WorstCase, WorstCaseMethod,
    WorstCaseOptions,
};

use crate::units::Dim;
use std::fmt;

/// A model the tolerance study can evaluate: input values (SI, in the order
/// of the toleranced inputs) in, figure values (SI) out.
///
/// `figures` is filled with NaN before each call; a figure the model cannot
/// give at that point may be left NaN (it counts as missing for that figure
/// alone). Return `Err` when nothing can be computed at that point; the study
/// counts it and keeps the first message. Any closure
/// `FnMut(&[f64], &mut [f64]) -> Result<(), E>` with `E: Display` is a model.
pub trait Model {
    /// Why the model could not compute.
    type Error: fmt::Display;

    /// Evaluate at `inputs`, writing into `figures`.
    fn evaluate(&mut self, inputs: &[f64], figures: &mut [f64]) -> Result<(), Self::Error>;
}

impl<E, F> Model for F
where
    E: fmt::Display,
    F: FnMut(&[f64], &mut [f64]) -> Result<(), E>,
{
    type Error = E;

    #[inline]
    fn evaluate(&mut self, inputs: &[f64], figures: &mut [f64]) -> Result<(), E> {
        self(inputs, figures)
    }
}

/// How to present one model figure in user-facing figures: the study's
/// results are indexed by figure position, the report by id.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct FigureMeta {
    /// Stable id of the underlying figure, e.g. `impact.peak_force`.
    pub id: String,
    /// Label for people, e.g. `Peak force on the buffer`.
    pub label: String,
    /// Quantity kind (the values are in its SI unit).
    pub dim: Dim,
}

impl FigureMeta {
    /// A description of one figure.
    pub fn new(id: &str, label: &str, dim: Dim) -> Self {
        Self {
            id: id.into(),
            label: label.into(),
            dim,
        }
    }
}
