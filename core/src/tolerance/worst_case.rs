//! Worst-case corners: the lowest and highest value of every figure when each
//! toleranced input sits at an end of its band, with the combination that
//! produced it.
//!
//! Method (classical worst-case tolerance analysis, `common practice`):
//! - n ≤ [`EXHAUSTIVE_MAX_INPUTS`] (12): every one of the 2ⁿ corners plus the
//!   nominal point is evaluated. For a model that is monotone in each input
//!   over the band (the usual case: more rate, more energy), the extremes over
//!   the whole tolerance box lie at corners, so the result is exact. For a
//!   model with an extremum inside the band (e.g. a speed that peaks at some
//!   mass) the corners can miss it; the Monte Carlo then shows values beyond
//!   the corners.
//! - n > 12: a sensitivity-guided search. One-at-a-time finite differences
//!   across the band at the nominal (input i at its low and high end, the
//!   others nominal: f(x₀ ± tᵢ·eᵢ)) give for each figure and each input the
//!   end that raises (lowers) the figure; that points to one corner for the
//!   maximum and one for the minimum (an input whose ends both move the
//!   figure the wrong way stays nominal). From there a bounded local
//!   improvement moves one input at a time to another level (low, nominal,
//!   high) while the figure improves, for at most `local_passes` sweeps and
//!   `max_evaluations` model evaluations in all. Exact for a model that is
//!   monotone in each input with no interaction that reverses a sign; **not
//!   guaranteed** otherwise (a non-monotone or strongly interacting model
//!   can hide its extreme at a corner the search never visits).
//!
//! Every evaluated point, whatever phase it belongs to, is a candidate for
//! every figure's extremes; ties keep the first point met (the nominal
//! first), so an input that does not matter is shown at its nominal. A
//! failing evaluation (the model returns `Err`) is counted and never
//! silently dropped; a non-finite figure value is treated as missing.

use super::input::{Level, TolerancedInput};
use super::{FigureMeta, Model};
use crate::error::{check, InputError};
use crate::figure::Figure;
use serde::{Deserialize, Serialize};

/// Largest number of toleranced inputs for which every corner is evaluated
/// (2¹² = 4096 corners). Above it the sensitivity-guided search is used.
pub const EXHAUSTIVE_MAX_INPUTS: usize = 12;

/// Limits of the sensitivity-guided search (used only above
/// [`EXHAUSTIVE_MAX_INPUTS`] inputs).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct WorstCaseOptions {
    /// Model evaluations allowed in the search, 1..=1 000 000 (default
    /// 20 000). The search stops where the budget runs out and says so.
    pub max_evaluations: usize,
    /// Sweeps over all inputs in the local improvement of each figure and
    /// direction, 0..=100 (default 4).
    pub local_passes: usize,
}

impl Default for WorstCaseOptions {
    fn default() -> Self {
        Self {
            max_evaluations: 20_000,
            local_passes: 4,
        }
    }
}

impl WorstCaseOptions {
    /// Check the bounds stated on the fields.
    ///
    /// # Errors
    /// `max_evaluations` or `local_passes` out of range.
    pub fn validate(&self) -> Result<(), InputError> {
        check::in_range("max_evaluations", self.max_evaluations as f64, 1.0, 1e6)?;
        check::in_range("local_passes", self.local_passes as f64, 0.0, 100.0)?;
        Ok(())
    }
}

/// How the corners were searched.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case", tag = "kind")]
pub enum WorstCaseMethod {
    /// All 2ⁿ corners and the nominal point.
    Exhaustive {
        /// Number of corners evaluated, 2ⁿ.
        corners: usize,
    },
    /// Sensitivity-guided search (not guaranteed for non-monotone models).
    SensitivitySearch {
        /// The evaluation budget ran out before the search had converged.
        budget_exhausted: bool,
    },
}

/// One extreme of one figure and where it was found.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Extreme {
    /// The figure's value there (SI).
    pub value: f64,
    /// Level of each toleranced input, in input order.
    pub levels: Vec<Level>,
    /// Value of each toleranced input (SI), in input order.
    pub inputs: Vec<f64>,
}

/// Lowest and highest value found for one figure; `None` when no evaluated
/// point gave a finite value.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FigureExtremes {
    /// Value at the nominal point, if finite (SI).
    pub nominal: Option<f64>,
    /// Lowest value found.
    pub min: Option<Extreme>,
    /// Highest value found.
    pub max: Option<Extreme>,
}

/// Figure values with one input at an end of its band and the others nominal
/// (the one-at-a-time finite difference; the bars of a tornado chart).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Swing {
    /// Value with the input at its low end (SI); `None` if not finite or failed.
    pub low: Option<f64>,
    /// Value with the input at its high end (SI).
    pub high: Option<f64>,
}

impl Swing {
    /// Finite-difference sensitivity (f(high) − f(low)) / (2·t) in figure SI
    /// units per input SI unit; `None` when a side is missing or t = 0.
    pub fn sensitivity(&self, half_width: f64) -> Option<f64> {
        let d = (self.high? - self.low?) / (2.0 * half_width);
        d.is_finite().then_some(d)
    }
}

/// The first combination at which the model could not compute.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct CornerFailure {
    /// Level of each input there.
    pub levels: Vec<Level>,
    /// The model's error message.
    pub message: String,
}

/// Result of the worst-case corner analysis.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct WorstCase {
    /// How the corners were searched.
    pub method: WorstCaseMethod,
    /// Field paths of the toleranced inputs, in input order.
    pub input_names: Vec<String>,
    /// Model evaluations made.
    pub evaluations: usize,
    /// Evaluations at which the model returned an error.
    pub failed: usize,
    /// The first of those, with its message.
    pub first_failure: Option<CornerFailure>,
    /// Extremes per figure, in the model's figure order.
    pub figures: Vec<FigureExtremes>,
    /// One-at-a-time swings, indexed `[figure][input]`.
    pub swings: Vec<Vec<Swing>>,
}

#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Direction {
    Max,
    Min,
}

impl Direction {
    /// Whether `new` is strictly better than `old` in this direction.
    fn better(self, new: f64, old: Option<f64>) -> bool {
        match old {
            None => new.is_finite(),
            Some(o) => match self {
                Self::Max => new > o,
                Self::Min => new < o,
            },
        }
    }
}

#[derive(Debug, Default)]
struct Tracker {
    min: Option<(f64, Vec<Level>)>,
    max: Option<(f64, Vec<Level>)>,
}

/// Evaluates the model at level combinations, keeping every figure's
/// extremes and the failure count, within an evaluation budget.
struct Evaluator<'a, M: Model + ?Sized> {
    inputs: &'a [TolerancedInput],
    model: &'a mut M,
    x: Vec<f64>,
    y: Vec<f64>,
    budget: usize,
    evaluations: usize,
    failed: usize,
    first_failure: Option<CornerFailure>,
    trackers: Vec<Tracker>,
}

impl<M: Model + ?Sized> Evaluator<'_, M> {
    /// Evaluate at `levels`; `None` when the budget is spent, otherwise
    /// `Some(ok)` with the figure values left in `self.y` (NaN = missing).
    fn eval(&mut self, levels: &[Level]) -> Option<bool> {
        if self.evaluations >= self.budget {
            return None;
        }
        self.evaluations += 1;
        for ((x, input), &level) in self.x.iter_mut().zip(self.inputs).zip(levels) {
            *x = input.at(level);
        }
        self.y.fill(f64::NAN);
        match self.model.evaluate(&self.x, &mut self.y) {
            Ok(()) => {
                for (t, &v) in self.trackers.iter_mut().zip(&self.y) {
                    if !v.is_finite() {
                        continue;
                    }
                    if Direction::Max.better(v, t.max.as_ref().map(|m| m.0)) {
                        t.max = Some((v, levels.to_vec()));
                    }
                    if Direction::Min.better(v, t.min.as_ref().map(|m| m.0)) {
                        t.min = Some((v, levels.to_vec()));
                    }
                }
                Some(true)
            }
            Err(e) => {
                self.failed += 1;
                self.y.fill(f64::NAN);
                if self.first_failure.is_none() {
                    self.first_failure = Some(CornerFailure {
                        levels: levels.to_vec(),
                        message: e.to_string(),
                    });
                }
                Some(false)
            }
        }
    }

    fn value(&self, figure: usize) -> Option<f64> {
        self.y.get(figure).copied().filter(|v| v.is_finite())
    }
}

/// Worst-case corners of `figure_count` figures of `model` over the bands of
/// `inputs` (method in the module doc).
///
/// The model receives the input values in the order of `inputs` and writes
/// `figure_count` figure values (SI) into its output slice, which is filled
/// with NaN before each call: a figure left NaN, or any non-finite value, is
/// missing at that point.
///
/// # Errors
/// `figure_count` when zero; the options out of range.
pub fn worst_case<M: Model + ?Sized>(
    inputs: &[TolerancedInput],
    figure_count: usize,
    model: &mut M,
    options: WorstCaseOptions,
) -> Result<WorstCase, InputError> {
    options.validate()?;
    if figure_count == 0 {
        return Err(InputError::invalid(
            "figure_count",
            "at least one figure is needed",
        ));
    }
    let n = inputs.len();
    let exhaustive = n <= EXHAUSTIVE_MAX_INPUTS;
    let mut ev = Evaluator {
        inputs,
        model,
        x: vec![0.0; n],
        y: vec![f64::NAN; figure_count],
        // The exhaustive path is bounded by its own 1 + 2n + 2ⁿ ≤ 4121 points.
        budget: if exhaustive {
            usize::MAX
        } else {
            options.max_evaluations
        },
        evaluations: 0,
        failed: 0,
        first_failure: None,
        trackers: (0..figure_count).map(|_| Tracker::default()).collect(),
    };

    // Nominal point, then the one-at-a-time ends.
    let mut levels = vec![Level::Nominal; n];
    let ok = ev.eval(&levels) == Some(true);
    let nominal: Vec<Option<f64>> = (0..figure_count)
        .map(|f| if ok { ev.value(f) } else { None })
        .collect();
    let mut swings = vec![
        vec![
            Swing {
                low: None,
                high: None
            };
            n
        ];
        figure_count
    ];
    for i in 0..n {
        for level in [Level::Low, Level::High] {
            if let Some(l) = levels.get_mut(i) {
                *l = level;
            }
            // A spent budget or a failure leaves no value (never a stale one).
            let ok = ev.eval(&levels) == Some(true);
            for (f, row) in swings.iter_mut().enumerate() {
                let v = if ok { ev.value(f) } else { None };
                if let Some(s) = row.get_mut(i) {
                    match level {
                        Level::Low => s.low = v,
                        _ => s.high = v,
                    }
                }
            }
        }
        if let Some(l) = levels.get_mut(i) {
            *l = Level::Nominal;
        }
    }

    let method = if exhaustive {
        let corners = 1usize << n;
        for mask in 0..corners {
            for (i, l) in levels.iter_mut().enumerate() {
                *l = if mask >> i & 1 == 1 {
                    Level::High
                } else {
                    Level::Low
                };
            }
            ev.eval(&levels);
        }
        WorstCaseMethod::Exhaustive { corners }
    } else {
        let mut exhausted = false;
        'search: for f in 0..figure_count {
            for dir in [Direction::Max, Direction::Min] {
                if !search(&mut ev, f, dir, &nominal, &swings, options.local_passes) {
                    exhausted = true;
                    break 'search;
                }
            }
        }
        WorstCaseMethod::SensitivitySearch {
            budget_exhausted: exhausted,
        }
    };

    let extreme = |found: Option<(f64, Vec<Level>)>| {
        found.map(|(value, levels)| Extreme {
            value,
            inputs: inputs.iter().zip(&levels).map(|(i, &l)| i.at(l)).collect(),
            levels,
        })
    };
    let figures = ev
        .trackers
        .into_iter()
        .zip(&nominal)
        .map(|(t, &nominal)| FigureExtremes {
            nominal,
            min: extreme(t.min),
            max: extreme(t.max),
        })
        .collect();
    Ok(WorstCase {
        method,
        input_names: inputs.iter().map(|i| i.name().to_string()).collect(),
        evaluations: ev.evaluations,
        failed: ev.failed,
        first_failure: ev.first_failure,
        figures,
        swings,
    })
}

/// Sensitivity-guided search for one figure in one direction; returns false
/// when the evaluation budget ran out.
fn search<M: Model + ?Sized>(
    ev: &mut Evaluator<'_, M>,
    figure: usize,
    dir: Direction,
    nominal: &[Option<f64>],
    swings: &[Vec<Swing>],
    passes: usize,
) -> bool {
    let y0 = nominal.get(figure).copied().flatten();
    let Some(row) = swings.get(figure) else {
        return true;
    };
    // Start: each input at the level its one-at-a-time values favour;
    // nominal first so that a tie (an input that does not matter) stays put.
    let mut current: Vec<Level> = row
        .iter()
        .map(|s| {
            let mut best = (Level::Nominal, y0);
            for (level, v) in [(Level::High, s.high), (Level::Low, s.low)] {
                if let Some(v) = v {
                    if dir.better(v, best.1) {
                        best = (level, Some(v));
                    }
                }
            }
            best.0
        })
        .collect();
    let Some(ok) = ev.eval(&current) else {
        return false;
    };
    let mut value = if ok { ev.value(figure) } else { None };
    let mut trial = current.clone();
    for _ in 0..passes {
        let mut improved = false;
        for i in 0..current.len() {
            let Some(&here) = current.get(i) else {
                continue;
            };
            for alt in [Level::Low, Level::Nominal, Level::High] {
                if alt == here {
                    continue;
                }
                trial.copy_from_slice(&current);
                if let Some(t) = trial.get_mut(i) {
                    *t = alt;
                }
                let Some(ok) = ev.eval(&trial) else {
                    return false;
                };
                let v = if ok { ev.value(figure) } else { None };
                if let Some(v) = v {
                    if dir.better(v, value) {
                        value = Some(v);
                        current.copy_from_slice(&trial);
                        improved = true;
                        break;
                    }
                }
            }
        }
        if !improved {
            break;
        }
    }
    true
}

impl WorstCase {
    /// The extremes as user-facing figures, `{id}.worst_min` and
    /// `{id}.worst_max`, for the figures described by `meta` (in the model's
    /// figure order; extra model figures without a description are skipped).
    /// The assumptions name the inputs that are off nominal at that extreme.
    pub fn figures(&self, meta: &[FigureMeta]) -> Vec<Figure> {
        let method = match self.method {
            WorstCaseMethod::Exhaustive { corners } => format!(
                "worst case over all {corners} corners of the tolerance bands and the nominal point"
            ),
            WorstCaseMethod::SensitivitySearch { budget_exhausted } => format!(
                "worst case by a sensitivity-guided corner search ({} evaluations{}); not guaranteed \
                 when the figure is not monotone in each input",
                self.evaluations,
                if budget_exhausted { ", evaluation budget exhausted" } else { "" }
            ),
        };
        let source = "classical worst-case tolerance analysis (common practice)";
        let mut out = Vec::new();
        for (m, fx) in meta.iter().zip(&self.figures) {
            for (suffix, words, found) in [
                ("worst_min", "lowest", &fx.min),
                ("worst_max", "highest", &fx.max),
            ] {
                let id = format!("{}.{suffix}", m.id);
                let label = format!("{}, worst-case {words}", m.label);
                let fig = match found {
                    Some(e) => {
                        let mut fig = Figure::new(&id, &label, m.dim, e.value)
                            .method(&method)
                            .source(source)
                            .assume("each toleranced input anywhere within its band, independently of the others");
                        let off: Vec<String> = self
                            .input_names
                            .iter()
                            .zip(&e.levels)
                            .zip(&e.inputs)
                            .filter(|((_, l), _)| **l != Level::Nominal)
                            .map(|((name, l), x)| format!("{name} {} = {x} (SI)", l.word()))
                            .collect();
                        fig = fig.assume(&if off.is_empty() {
                            "every input at its nominal value".to_string()
                        } else {
                            format!("inputs at the band ends: {}", off.join(", "))
                        });
                        if self.failed > 0 {
                            fig = fig.assume(&format!(
                                "the model could not compute at {} of {} points; those are not included",
                                self.failed, self.evaluations
                            ));
                        }
                        fig
                    }
                    None => Figure::missing(
                        &id,
                        &label,
                        m.dim,
                        vec!["the model gave no finite value at any corner".into()],
                    ),
                };
                out.push(fig);
            }
        }
        out
    }
}
