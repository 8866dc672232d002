//! Adaptive Dormand–Prince 5(4) integrator with dense output and event
//! location, for the small (2–4 component) state of a released mechanism.
//!
//! # Method
//! The explicit Runge–Kutta pair RK5(4)7M of Dormand and Prince (1980), seven
//! stages with the last stage reused as the first of the next step (FSAL),
//! advanced with the 5th-order solution. The local error estimate
//! `err = √(1/N·Σ(eᵢ/skᵢ)²)`, `skᵢ = atol + rtol·max(|yᵢ|, |ŷᵢ|, mᵢ)` (`mᵢ`
//! a typical magnitude the model may declare, 0 by default), is kept at
//! or below 1 by a PI step-size controller (β = 0.04, safety 0.9, step ratio
//! bounded to [0.2, 10]); the initial step is chosen by the algorithm of
//! Hairer, Nørsett and Wanner, *Solving ODEs I*, 2nd ed., 1993, II.4
//! ("Starting step size"). Between steps the solution is available from the
//! order-4 continuous extension of the same reference (II.6), which uses the
//! seven stages already computed (no extra right-hand-side evaluation).
//!
//! # Events
//! An event is a scalar function `g(t, y)` with a direction (rising, falling
//! or either) and a terminal flag. After each accepted step the sign of every
//! `g` is compared with its value at the previous step; a change is located by
//! Brent's bracketed root finder on the dense output to machine precision in
//! `t` (or a requested tolerance). The earliest terminal event stops the
//! solve. A sign change that happens and reverses within one step is not
//! seen; [`SolverConfig::max_step`] bounds that risk.
//!
//! # Bounds
//! Every solve is bounded: a step cap ([`SolverConfig::max_steps`]), a
//! step-size floor (16 ulp of `t`) and a check of every new state for
//! non-finite values each end the solve with a typed [`OdeError`].
//!
//! The model is a trait ([`OdeSystem`]) with const-generic array state, so
//! the step loop allocates nothing and is monomorphised for the model (no
//! dynamic dispatch in the hot loop).

// Indexing here is into fixed-size stage and state arrays (`[f64; N]`,
// the tableau's seven stages) by loop counters bounded by those sizes;
// no index comes from user input.
#![allow(clippy::indexing_slicing)]

mod root;
mod tableau;

use crate::error::{check, InputError};
use std::fmt;
use tableau::*;

/// Largest number of event functions one system may declare.
pub const MAX_EVENTS: usize = 8;

/// Direction of a sign change that counts as an event.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Direction {
    /// Either direction.
    #[default]
    Either,
    /// `g` goes from negative to zero or positive.
    Rising,
    /// `g` goes from positive to zero or negative.
    Falling,
}

impl Direction {
    /// Whether the pair of values `g_old → g_new` is a crossing in this
    /// direction. A value of exactly zero at the start of a step never
    /// counts (so an event that stopped one solve does not fire again at
    /// the start of the next).
    #[inline]
    pub fn crossed(self, g_old: f64, g_new: f64) -> bool {
        let rising = g_old < 0.0 && g_new >= 0.0;
        let falling = g_old > 0.0 && g_new <= 0.0;
        match self {
            Self::Either => rising || falling,
            Self::Rising => rising,
            Self::Falling => falling,
        }
    }
}

/// How an event function is treated.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct EventSpec {
    /// Which sign changes count.
    pub direction: Direction,
    /// Stop the solve at the event (otherwise it is reported and the solve
    /// continues).
    pub terminal: bool,
}

impl EventSpec {
    /// A terminal event in the given direction.
    pub const fn terminal(direction: Direction) -> Self {
        Self {
            direction,
            terminal: true,
        }
    }

    /// A non-terminal (reported) event in the given direction.
    pub const fn reported(direction: Direction) -> Self {
        Self {
            direction,
            terminal: false,
        }
    }
}

/// A system of first-order ODEs `dy/dt = f(t, y)` with `N` state
/// components, and its event functions.
pub trait OdeSystem<const N: usize> {
    /// Right-hand side: write `f(t, y)` into `dy`.
    fn rhs(&self, t: f64, y: &[f64; N], dy: &mut [f64; N]);

    /// Number of event functions (at most [`MAX_EVENTS`]).
    fn event_count(&self) -> usize {
        0
    }

    /// Value of event function `index` at `(t, y)`; an event happens where
    /// it changes sign.
    fn event(&self, index: usize, t: f64, y: &[f64; N]) -> f64 {
        let _ = (index, t, y);
        0.0
    }

    /// Direction and terminal flag of event function `index`.
    fn event_spec(&self, index: usize) -> EventSpec {
        let _ = index;
        EventSpec::default()
    }

    /// Typical magnitude of each state component (in its own unit): the
    /// floor of the scale its local error is measured against,
    /// `skᵢ = atol + rtol·max(|yᵢ|, |ŷᵢ|, mᵢ)`. Zero (the default) leaves
    /// the pure mixed absolute/relative control. A component that starts
    /// at zero and only accumulates (an energy integral) would otherwise be
    /// held to `rtol` of its own tiny early values, forcing many small
    /// steps that no printed figure needs; its magnitude (e.g. the energy
    /// at contact) states what accuracy matters instead — the "typical y"
    /// of Hairer–Nørsett–Wanner I, II.4 (scaling of the error norm).
    fn magnitudes(&self) -> [f64; N] {
        [0.0; N]
    }
}

/// A system given by a closure `f(t, y, dy)`, without events.
pub struct FnSystem<F>(pub F);

impl<const N: usize, F: Fn(f64, &[f64; N], &mut [f64; N])> OdeSystem<N> for FnSystem<F> {
    #[inline]
    fn rhs(&self, t: f64, y: &[f64; N], dy: &mut [f64; N]) {
        (self.0)(t, y, dy);
    }
}

/// Settings of one solve. Units follow the model's state (SI).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SolverConfig {
    /// Relative tolerance of the local error (dimensionless), in
    /// `[1e-14, 0.1]`.
    pub rtol: f64,
    /// Absolute tolerance of the local error, in the state's units; > 0.
    pub atol: f64,
    /// First step (in the unit of `t`); `None` chooses it automatically
    /// (Hairer's algorithm, one extra right-hand-side evaluation).
    pub initial_step: Option<f64>,
    /// Largest step (unit of `t`); `f64::INFINITY` for none.
    pub max_step: f64,
    /// Largest number of attempted steps (accepted + rejected) before
    /// [`OdeError::TooManySteps`].
    pub max_steps: usize,
    /// End of the integration interval (unit of `t`); may be
    /// `f64::INFINITY` when a terminal event is expected to stop the solve.
    pub t_end: f64,
    /// Absolute tolerance on the time of an event; 0 locates it to machine
    /// precision.
    pub event_tol: f64,
}

impl Default for SolverConfig {
    /// rtol 1e-8 (the reference setting of the comparison with scipy's
    /// RK45), atol 1e-12, automatic first step, no step limit, 100 000
    /// steps, no end time.
    fn default() -> Self {
        Self {
            rtol: 1e-8,
            atol: 1e-12,
            initial_step: None,
            max_step: f64::INFINITY,
            max_steps: 100_000,
            t_end: f64::INFINITY,
            event_tol: 0.0,
        }
    }
}

impl SolverConfig {
    /// Check the settings for a solve starting at `t0`.
    ///
    /// # Errors
    /// An [`InputError`] naming the offending field.
    pub fn validate(&self, t0: f64) -> Result<(), InputError> {
        check::in_range("rtol", self.rtol, 1e-14, 0.1)?;
        check::positive("atol", self.atol)?;
        if let Some(h) = self.initial_step {
            check::positive("initial_step", h)?;
        }
        if self.max_step.is_nan() || self.max_step <= 0.0 {
            return Err(InputError::invalid(
                "max_step",
                "must be greater than zero (infinity for no limit)",
            ));
        }
        if self.max_steps == 0 {
            return Err(InputError::invalid("max_steps", "must be at least 1"));
        }
        check::finite("t0", t0)?;
        if self.t_end.is_nan() || self.t_end <= t0 {
            return Err(InputError::invalid(
                "t_end",
                "must be later than the start time (infinity for none)",
            ));
        }
        check::non_negative("event_tol", self.event_tol)?;
        Ok(())
    }
}

/// Why a solve ended.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum StopReason {
    /// `t_end` was reached.
    ReachedEnd,
    /// Terminal event `index` occurred.
    Event {
        /// Index of the event function.
        index: usize,
    },
}

/// Work done by a solve.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub struct Stats {
    /// Evaluations of the right-hand side (6 per step with FSAL, plus 1 at
    /// the start and 1 for the automatic first step).
    pub rhs_evaluations: usize,
    /// Accepted steps.
    pub accepted_steps: usize,
    /// Rejected steps (error too large or non-finite stage).
    pub rejected_steps: usize,
    /// Evaluations of event functions (including root finding).
    pub event_evaluations: usize,
}

impl Stats {
    /// Add another solve's work (phases of one simulation).
    pub fn add(&mut self, other: &Stats) {
        self.rhs_evaluations += other.rhs_evaluations;
        self.accepted_steps += other.accepted_steps;
        self.rejected_steps += other.rejected_steps;
        self.event_evaluations += other.event_evaluations;
    }
}

/// End state of a successful solve.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Solution<const N: usize> {
    /// Time at the end (t_end or the terminal event).
    pub t: f64,
    /// State at the end.
    pub y: [f64; N],
    /// Why the solve ended.
    pub stop: StopReason,
    /// Work done.
    pub stats: Stats,
}

/// Why a solve could not be completed.
#[derive(Debug, Clone, PartialEq)]
pub enum OdeError {
    /// The settings or the initial state are not usable.
    Input(InputError),
    /// The step size fell below the resolution of `t` (the problem is
    /// probably stiff or has a singularity here).
    StepUnderflow {
        /// Time reached.
        t: f64,
        /// Step size attempted.
        step: f64,
    },
    /// The step cap was reached before `t_end` or a terminal event.
    TooManySteps {
        /// Time reached.
        t: f64,
        /// Steps attempted.
        steps: usize,
    },
    /// The state or its derivative became NaN or infinite and could not be
    /// avoided by smaller steps.
    NonFinite {
        /// Time reached.
        t: f64,
    },
    /// More event functions than [`MAX_EVENTS`].
    TooManyEvents {
        /// Number declared.
        count: usize,
    },
}

impl fmt::Display for OdeError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Self::Input(e) => write!(f, "integrator settings: {e}"),
            Self::StepUnderflow { t, step } => write!(
                f,
                "the integration step fell to {step:e} at t = {t} s: the motion \
                 cannot be resolved (stiff or singular model)"
            ),
            Self::TooManySteps { t, steps } => write!(
                f,
                "the motion was not settled after {steps} integration steps (t = {t} s)"
            ),
            Self::NonFinite { t } => {
                write!(f, "the motion became non-finite at t = {t} s")
            }
            Self::TooManyEvents { count } => write!(
                f,
                "{count} event functions declared; at most {MAX_EVENTS} are supported"
            ),
        }
    }
}

impl std::error::Error for OdeError {}

impl From<InputError> for OdeError {
    fn from(e: InputError) -> Self {
        Self::Input(e)
    }
}

/// One accepted step with its continuous extension (order 4), valid on
/// `[t0, t_stop]` (`t_stop = t0 + h` unless a terminal event cut the step).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct DenseStep<const N: usize> {
    /// Start of the step.
    pub t0: f64,
    /// Step size.
    pub h: f64,
    /// End of validity (the step end or the terminal event).
    pub t_stop: f64,
    /// Coefficients r₁…r₅ of `y(t₀ + θh) = r₁ + θ(r₂ + (1−θ)(r₃ + θ(r₄ + (1−θ)r₅)))`
    /// (Hairer–Nørsett–Wanner II.6).
    pub r: [[f64; N]; 5],
}

impl<const N: usize> DenseStep<N> {
    /// State at time `t` (meaningful within the step).
    #[inline]
    pub fn eval(&self, t: f64) -> [f64; N] {
        let th = (t - self.t0) / self.h;
        let th1 = 1.0 - th;
        let mut y = [0.0; N];
        for (i, yi) in y.iter_mut().enumerate() {
            let r = &self.r;
            *yi = r[0][i] + th * (r[1][i] + th1 * (r[2][i] + th * (r[3][i] + th1 * r[4][i])));
        }
        y
    }

    /// Time derivative of the interpolant at `t`; it equals the right-hand
    /// side exactly at both ends of the step.
    #[inline]
    pub fn derivative(&self, t: f64) -> [f64; N] {
        let th = (t - self.t0) / self.h;
        let th1 = 1.0 - th;
        let mut d = [0.0; N];
        for (i, di) in d.iter_mut().enumerate() {
            let r = &self.r;
            let u = r[3][i] + th1 * r[4][i];
            let w = r[2][i] + th * u;
            let z = r[1][i] + th1 * w;
            let dz = -w + th1 * (u - th * r[4][i]);
            *di = (z + th * dz) / self.h;
        }
        d
    }
}

/// Receives the accepted steps and the non-terminal events of a solve.
pub trait Observer<const N: usize> {
    /// Whether [`Observer::step`] needs to be called (skips building the
    /// dense output when nobody listens and no events are declared).
    fn wants_steps(&self) -> bool {
        true
    }
    /// An accepted step.
    fn step(&mut self, step: &DenseStep<N>) {
        let _ = step;
    }
    /// A non-terminal event `index` at `(t, y)`.
    fn event(&mut self, index: usize, t: f64, y: &[f64; N]) {
        let _ = (index, t, y);
    }
}

/// The observer that ignores everything.
impl<const N: usize> Observer<N> for () {
    fn wants_steps(&self) -> bool {
        false
    }
}

/// Records every accepted step so the solution can be evaluated anywhere or
/// sampled for a plot afterwards (allocates; use only when output is wanted).
#[derive(Debug, Clone, Default, PartialEq)]
pub struct Trajectory<const N: usize> {
    steps: Vec<DenseStep<N>>,
}

impl<const N: usize> Observer<N> for Trajectory<N> {
    fn step(&mut self, step: &DenseStep<N>) {
        self.steps.push(*step);
    }
}

impl<const N: usize> Trajectory<N> {
    /// An empty record.
    pub fn new() -> Self {
        Self { steps: Vec::new() }
    }

    /// The recorded steps in time order.
    pub fn steps(&self) -> &[DenseStep<N>] {
        &self.steps
    }

    /// Time span `(start, stop)` covered, or `None` when empty.
    pub fn span(&self) -> Option<(f64, f64)> {
        Some((self.steps.first()?.t0, self.steps.last()?.t_stop))
    }

    /// State at `t` from the step that contains it (clamped to the span).
    pub fn eval(&self, t: f64) -> Option<[f64; N]> {
        let (a, b) = self.span()?;
        let t = t.clamp(a, b);
        let i = self.steps.partition_point(|s| s.t_stop < t);
        let s = self.steps.get(i).or(self.steps.last())?;
        Some(s.eval(t))
    }

    /// `n` points equally spaced in time over the span, both ends included
    /// (`n = 1` gives the start).
    pub fn sample(&self, n: usize) -> Vec<(f64, [f64; N])> {
        let Some((a, b)) = self.span() else {
            return Vec::new();
        };
        let mut out = Vec::with_capacity(n);
        let mut i = 0;
        for k in 0..n {
            let t = if n > 1 {
                a + (b - a) * (k as f64) / ((n - 1) as f64)
            } else {
                a
            };
            while i + 1 < self.steps.len() && self.steps[i].t_stop < t {
                i += 1;
            }
            if let Some(s) = self.steps.get(i) {
                out.push((t, s.eval(t)));
            }
        }
        out
    }
}

// Step-size controller constants (Hairer–Nørsett–Wanner I, II.4 and IV.2;
// the values of their DOPRI5 code): safety factor, bounds of the step ratio,
// and the PI exponent β.
const SAFE: f64 = 0.9;
/// 1/fac1: the step may shrink at most by 5 after an accepted step.
const FACC1: f64 = 5.0;
/// 1/fac2: the step may grow at most by 10.
const FACC2: f64 = 0.1;
const BETA: f64 = 0.04;
/// 1/5 − 0.75·β: exponent of the current error in the PI controller.
const EXPO1: f64 = 0.2 - BETA * 0.75;
/// Consecutive non-finite trial steps tolerated (each quarters the step)
/// before giving up: 4⁻³⁰ ≈ 1e-18 of the original step.
const MAX_NONFINITE_RETRIES: usize = 30;

/// A root of `f` in the bracket `[a, b]` (with `fa = f(a)`, `fb = f(b)` of
/// opposite signs), by Brent's method to within `tol` (absolute; 0 for
/// machine precision). Bounded: at most 200 evaluations of `f`. Returns the
/// end with the smaller |f| when `[a, b]` is not a bracket.
pub fn find_root<F: FnMut(f64) -> f64>(f: F, a: f64, b: f64, fa: f64, fb: f64, tol: f64) -> f64 {
    root::brent(f, a, b, fa, fb, tol.max(0.0))
}

/// Integrate `sys` from `(t0, y0)` with settings `cfg`, without output.
///
/// # Errors
/// See [`solve`].
pub fn integrate<S, const N: usize>(
    sys: &S,
    t0: f64,
    y0: [f64; N],
    cfg: &SolverConfig,
) -> Result<Solution<N>, OdeError>
where
    S: OdeSystem<N> + ?Sized,
{
    solve(sys, t0, y0, cfg, &mut ())
}

/// Integrate `sys` from `(t0, y0)` with settings `cfg`, passing every
/// accepted step and non-terminal event to `obs`.
///
/// # Errors
/// [`OdeError::Input`] for unusable settings or a non-finite initial state,
/// [`OdeError::TooManyEvents`], and the failures [`OdeError::StepUnderflow`],
/// [`OdeError::TooManySteps`], [`OdeError::NonFinite`].
pub fn solve<S, O, const N: usize>(
    sys: &S,
    t0: f64,
    y0: [f64; N],
    cfg: &SolverConfig,
    obs: &mut O,
) -> Result<Solution<N>, OdeError>
where
    S: OdeSystem<N> + ?Sized,
    O: Observer<N> + ?Sized,
{
    cfg.validate(t0)?;
    if y0.iter().any(|v| !v.is_finite()) {
        return Err(InputError::new("y0", crate::error::Problem::NotFinite).into());
    }
    let n_ev = sys.event_count();
    if n_ev > MAX_EVENTS {
        return Err(OdeError::TooManyEvents { count: n_ev });
    }
    let mut specs = [EventSpec::default(); MAX_EVENTS];
    for (i, s) in specs.iter_mut().enumerate().take(n_ev) {
        *s = sys.event_spec(i);
    }

    let mags = sys.magnitudes();
    let mut stats = Stats::default();
    let t_end = cfg.t_end;
    let mut t = t0;
    let mut y = y0;
    let mut k1 = [0.0; N];
    sys.rhs(t, &y, &mut k1);
    stats.rhs_evaluations += 1;
    if k1.iter().any(|v| !v.is_finite()) {
        return Err(OdeError::NonFinite { t });
    }
    let mut g_old = [0.0; MAX_EVENTS];
    for (i, g) in g_old.iter_mut().enumerate().take(n_ev) {
        *g = sys.event(i, t, &y);
        stats.event_evaluations += 1;
    }

    let mut h = match cfg.initial_step {
        Some(h) => h,
        None => initial_step(sys, t, &y, &k1, &mags, cfg, &mut stats),
    };
    h = h.min(cfg.max_step);
    let want_dense = n_ev > 0 || obs.wants_steps();
    let mut facold: f64 = 1e-4;
    let mut last_rejected = false;
    let mut nonfinite_retries = 0;

    let (mut k2, mut k3, mut k4, mut k5, mut k6, mut k7) =
        ([0.0; N], [0.0; N], [0.0; N], [0.0; N], [0.0; N], [0.0; N]);
    let mut yt = [0.0; N];
    let mut y_new = [0.0; N];

    loop {
        let attempts = stats.accepted_steps + stats.rejected_steps;
        if attempts >= cfg.max_steps {
            return Err(OdeError::TooManySteps { t, steps: attempts });
        }
        if 0.1 * h.abs() <= t.abs() * f64::EPSILON || h <= 0.0 || !h.is_finite() {
            return Err(OdeError::StepUnderflow { t, step: h });
        }
        // Land exactly on t_end rather than leave a sliver (Hairer's 1.01 rule).
        let mut last = false;
        if t + 1.01 * h >= t_end {
            h = t_end - t;
            last = true;
        }

        for i in 0..N {
            yt[i] = y[i] + h * A21 * k1[i];
        }
        sys.rhs(t + C2 * h, &yt, &mut k2);
        for i in 0..N {
            yt[i] = y[i] + h * (A31 * k1[i] + A32 * k2[i]);
        }
        sys.rhs(t + C3 * h, &yt, &mut k3);
        for i in 0..N {
            yt[i] = y[i] + h * (A41 * k1[i] + A42 * k2[i] + A43 * k3[i]);
        }
        sys.rhs(t + C4 * h, &yt, &mut k4);
        for i in 0..N {
            yt[i] = y[i] + h * (A51 * k1[i] + A52 * k2[i] + A53 * k3[i] + A54 * k4[i]);
        }
        sys.rhs(t + C5 * h, &yt, &mut k5);
        for i in 0..N {
            yt[i] =
                y[i] + h * (A61 * k1[i] + A62 * k2[i] + A63 * k3[i] + A64 * k4[i] + A65 * k5[i]);
        }
        let t_new = if last { t_end } else { t + h };
        sys.rhs(t_new, &yt, &mut k6);
        for i in 0..N {
            y_new[i] = y[i] + h * (B1 * k1[i] + B3 * k3[i] + B4 * k4[i] + B5 * k5[i] + B6 * k6[i]);
        }
        sys.rhs(t_new, &y_new, &mut k7);
        stats.rhs_evaluations += 6;

        let mut err = 0.0;
        for i in 0..N {
            let sk = cfg.atol + cfg.rtol * y[i].abs().max(y_new[i].abs()).max(mags[i]);
            let e =
                h * (E1 * k1[i] + E3 * k3[i] + E4 * k4[i] + E5 * k5[i] + E6 * k6[i] + E7 * k7[i]);
            err += (e / sk) * (e / sk);
        }
        err = (err / N.max(1) as f64).sqrt();

        let finite = err.is_finite()
            && y_new.iter().all(|v| v.is_finite())
            && k7.iter().all(|v| v.is_finite());
        if !finite {
            nonfinite_retries += 1;
            stats.rejected_steps += 1;
            if nonfinite_retries > MAX_NONFINITE_RETRIES {
                return Err(OdeError::NonFinite { t });
            }
            h *= 0.25;
            last_rejected = true;
            continue;
        }
        nonfinite_retries = 0;

        let fac11 = approx_pow(err, EXPO1);
        if err <= 1.0 {
            // Accepted: PI control of the next step.
            let fac = (fac11 / approx_pow(facold, BETA) / SAFE).clamp(FACC2, FACC1);
            let mut h_next = (h / fac).min(cfg.max_step);
            if last_rejected {
                h_next = h_next.min(h);
            }
            facold = err.max(1e-4);
            last_rejected = false;
            stats.accepted_steps += 1;

            let mut stop: Option<(f64, usize)> = None;
            if want_dense {
                let mut dense = DenseStep {
                    t0: t,
                    h,
                    t_stop: t_new,
                    r: [[0.0; N]; 5],
                };
                for i in 0..N {
                    let ydiff = y_new[i] - y[i];
                    let bspl = h * k1[i] - ydiff;
                    dense.r[0][i] = y[i];
                    dense.r[1][i] = ydiff;
                    dense.r[2][i] = bspl;
                    dense.r[3][i] = ydiff - h * k7[i] - bspl;
                    dense.r[4][i] = h
                        * (D1 * k1[i]
                            + D3 * k3[i]
                            + D4 * k4[i]
                            + D5 * k5[i]
                            + D6 * k6[i]
                            + D7 * k7[i]);
                }
                if n_ev > 0 {
                    stop = locate_events(
                        sys, cfg, &specs, n_ev, &dense, &y_new, &mut g_old, obs, &mut stats,
                    );
                }
                if let Some((te, _)) = stop {
                    dense.t_stop = te;
                }
                obs.step(&dense);
                if let Some((te, index)) = stop {
                    return Ok(Solution {
                        t: te,
                        y: if te == t_new { y_new } else { dense.eval(te) },
                        stop: StopReason::Event { index },
                        stats,
                    });
                }
            }

            t = t_new;
            y = y_new;
            k1 = k7;
            if last {
                return Ok(Solution {
                    t,
                    y,
                    stop: StopReason::ReachedEnd,
                    stats,
                });
            }
            h = h_next;
        } else {
            h /= FACC1.min(fac11 / SAFE);
            last_rejected = true;
            stats.rejected_steps += 1;
        }
    }
}

/// `x^p` for `x ≥ 0` to about 1e-5 relative, for the step-size controller
/// only (its factors are heuristics, clamped to [0.1, 5] anyway); several
/// times cheaper than `powf`, which matters because the controller runs
/// on every step. `2^(p·log₂x)` with `ln m = 2·artanh((m−1)/(m+1))` (4
/// terms, |t| ≤ 1/3) and a degree-7 Taylor series of `2^f`, f ∈ [0, 1).
/// Falls back to `powf` outside the normal range.
#[inline]
fn approx_pow(x: f64, p: f64) -> f64 {
    if x == 0.0 {
        return 0.0;
    }
    if !(x.is_normal() && x > 0.0) {
        return x.powf(p);
    }
    let bits = x.to_bits();
    let e = ((bits >> 52) & 0x7ff) as i64 - 1023;
    let m = f64::from_bits((bits & 0x000f_ffff_ffff_ffff) | 0x3ff0_0000_0000_0000);
    let t = (m - 1.0) / (m + 1.0);
    let t2 = t * t;
    let ln_m = 2.0 * t * (1.0 + t2 * (1.0 / 3.0 + t2 * (1.0 / 5.0 + t2 * (1.0 / 7.0))));
    let y = p * (e as f64 + ln_m * std::f64::consts::LOG2_E);
    if !(-1000.0..=1000.0).contains(&y) {
        return x.powf(p);
    }
    // floor(y) for |y| ≤ 1000 by truncation (a library call on targets
    // without a rounding instruction, e.g. baseline x86-64).
    let whole = (y as i64) as f64;
    let k = if whole > y { whole - 1.0 } else { whole };
    let g = (y - k) * std::f64::consts::LN_2;
    let two_f = 1.0
        + g * (1.0
            + g * (1.0 / 2.0
                + g * (1.0 / 6.0
                    + g * (1.0 / 24.0
                        + g * (1.0 / 120.0 + g * (1.0 / 720.0 + g * (1.0 / 5040.0)))))));
    two_f * f64::from_bits(((k as i64 + 1023) as u64) << 52)
}

/// Check every event over an accepted step; report non-terminal ones in time
/// order up to the first terminal one, which is returned. Updates `g_old` to
/// the values at the step end.
#[allow(clippy::too_many_arguments)] // internal helper of the step loop
fn locate_events<S, O, const N: usize>(
    sys: &S,
    cfg: &SolverConfig,
    specs: &[EventSpec; MAX_EVENTS],
    n_ev: usize,
    dense: &DenseStep<N>,
    y_new: &[f64; N],
    g_old: &mut [f64; MAX_EVENTS],
    obs: &mut O,
    stats: &mut Stats,
) -> Option<(f64, usize)>
where
    S: OdeSystem<N> + ?Sized,
    O: Observer<N> + ?Sized,
{
    let (ta, tb) = (dense.t0, dense.t_stop);
    let tol = cfg
        .event_tol
        .max(2.0 * f64::EPSILON * ta.abs().max(tb.abs()));
    let mut hits = [(0.0, 0usize); MAX_EVENTS];
    let mut n_hits = 0;
    for i in 0..n_ev {
        let g_new = sys.event(i, tb, y_new);
        stats.event_evaluations += 1;
        if specs[i].direction.crossed(g_old[i], g_new) {
            let mut evals = 0;
            let root = root::brent(
                |tt| {
                    evals += 1;
                    sys.event(i, tt, &dense.eval(tt))
                },
                ta,
                tb,
                g_old[i],
                g_new,
                tol,
            );
            stats.event_evaluations += evals;
            if let Some(slot) = hits.get_mut(n_hits) {
                *slot = (root, i);
                n_hits += 1;
            }
        }
        g_old[i] = g_new;
    }
    let hits = &mut hits[..n_hits];
    hits.sort_by(|a, b| a.0.total_cmp(&b.0).then(a.1.cmp(&b.1)));
    for &(te, i) in hits.iter() {
        if specs[i].terminal {
            return Some((te, i));
        }
        obs.event(i, te, &dense.eval(te));
    }
    None
}

/// Starting step size (Hairer–Nørsett–Wanner I, II.4): make the explicit
/// Euler step's local error about 0.01·tolerance, using one extra
/// right-hand-side evaluation.
fn initial_step<S, const N: usize>(
    sys: &S,
    t: f64,
    y: &[f64; N],
    f0: &[f64; N],
    mags: &[f64; N],
    cfg: &SolverConfig,
    stats: &mut Stats,
) -> f64
where
    S: OdeSystem<N> + ?Sized,
{
    const ORDER: i32 = 5;
    let mut dnf = 0.0;
    let mut dny = 0.0;
    for i in 0..N {
        let sk = cfg.atol + cfg.rtol * y[i].abs().max(mags[i]);
        dnf += (f0[i] / sk) * (f0[i] / sk);
        dny += (y[i] / sk) * (y[i] / sk);
    }
    let mut h = if dnf <= 1e-10 || dny <= 1e-10 {
        1e-6
    } else {
        (dny / dnf).sqrt() * 0.01
    };
    h = h.min(cfg.max_step).min(cfg.t_end - t);
    let mut y1 = [0.0; N];
    for i in 0..N {
        y1[i] = y[i] + h * f0[i];
    }
    let mut f1 = [0.0; N];
    sys.rhs(t + h, &y1, &mut f1);
    stats.rhs_evaluations += 1;
    let mut der2 = 0.0;
    for i in 0..N {
        let sk = cfg.atol + cfg.rtol * y[i].abs().max(mags[i]);
        der2 += ((f1[i] - f0[i]) / sk) * ((f1[i] - f0[i]) / sk);
    }
    let der2 = der2.sqrt() / h;
    let der12 = der2.abs().max(dnf.sqrt());
    let h1 = if !der12.is_finite() {
        h * 1e-3
    } else if der12 <= 1e-15 {
        (h * 1e-3).max(1e-6)
    } else {
        (0.01 / der12).powf(1.0 / f64::from(ORDER))
    };
    let h = (100.0 * h).min(h1).min(cfg.max_step);
    if h.is_finite() && h > 0.0 {
        h
    } else {
        1e-6
    }
}

#[cfg(test)]
mod tests;
