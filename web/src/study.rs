//! The tolerance study, run on the page's own thread in short slices.
//!
//! [`joulewise_core::assess::Study`] advances by a number of model
//! evaluations per call (worst-case corners first, then the Monte Carlo
//! samples). A slice is one task of the page's thread: calls of a few
//! milliseconds each, sized by the clock, until the next call would take the
//! slice past [`SLICE_BUDGET_MS`]; then the runner hands the thread back to
//! the browser (a zero-delay timeout), so typing, scrolling and painting go
//! on. A newer
//! report (the inputs changed) cancels the run in progress and starts
//! another; the result is shown only when complete.

use crate::state::Sheet;
use joulewise_core::assess::Study;
use joulewise_core::report::{Report, StudyReport};
use joulewise_core::scenario::Scenario;
use leptos::prelude::*;
use std::sync::Arc;
use wasm_bindgen::JsCast;

/// Time one slice may take: half the 50 ms that counts as a long task
/// (Long Tasks API), with room for the browser's own work in the same task
/// and for a call that takes longer than the one before it.
pub const SLICE_BUDGET_MS: f64 = 25.0;
/// Time one call into the study should take: short enough that the slice
/// ends close to its budget, long enough that the clock reads (and the
/// replay of the worst-case search, see `Study::advance`) cost little.
const CALL_TARGET_MS: f64 = 4.0;
/// Evaluations in the first call, before any timing is known: few enough to
/// stay short on a slow tablet with a costly model.
const FIRST_CALL: usize = 4;
/// Bounds of the adapted call size.
const CALL_MIN: usize = 1;
/// See [`CALL_MIN`].
const CALL_MAX: usize = 5_000;

/// Milliseconds from the page's clock (0 where there is none).
pub fn now_ms() -> f64 {
    web_sys::window()
        .and_then(|w| w.performance())
        .map_or(0.0, |p| p.now())
}

/// Give the thread back to the browser until a zero-delay timeout fires.
///
/// Not `scheduler.yield()`: tried, its continuations run ahead of rendering
/// in Chromium, so the progress bar was never painted while the study ran
/// (tests/e2e/specs/040-study.mjs). Chromium holds a nested zero-delay
/// timeout back 4 ms, which the 25 ms slices keep to a small share.
pub async fn yield_to_browser() {
    let promise = js_sys::Promise::new(&mut |resolve, _reject| {
        if let Some(w) = web_sys::window() {
            let _ =
                w.set_timeout_with_callback_and_timeout_and_arguments_0(resolve.unchecked_ref(), 0);
        }
    });
    let _ = wasm_bindgen_futures::JsFuture::from(promise).await;
}

/// Run `study` to the end in slices, calling `progress` (fraction done)
/// after each; `progress` returning false cancels the run (`None`).
pub async fn run_in_slices(
    mut study: Study,
    mut progress: impl FnMut(f64) -> bool,
) -> Option<StudyReport> {
    let mut n = FIRST_CALL;
    loop {
        let start = now_ms();
        let done = loop {
            let t0 = now_ms();
            let done = study.advance(n);
            let t1 = now_ms();
            let dt = t1 - t0;
            // Towards the target time per call, at most halving or doubling
            // at a time (the time per evaluation varies, e.g. with bottoming).
            let factor = if dt > 0.0 {
                (CALL_TARGET_MS / dt).clamp(0.5, 2.0)
            } else {
                2.0
            };
            let next = ((n as f64 * factor) as usize).clamp(CALL_MIN, CALL_MAX);
            // The next call is expected to take dt scaled like its size.
            let expected = dt * next as f64 / n as f64;
            n = next;
            if done || t1 - start + expected > SLICE_BUDGET_MS {
                break done;
            }
        };
        if !progress(study.progress()) {
            return None;
        }
        if done {
            return Some(study.finish());
        }
        yield_to_browser().await;
    }
}

/// Why the study does not run, in words.
pub fn idle_reason(report: &Report) -> String {
    if !report.errors.is_empty() {
        "The inputs have problems (see the list at the top of the inputs): the study runs once they are fixed."
            .into()
    } else if report.inputs.iter().all(|i| i.tolerance.trim().is_empty()) {
        "No input carries a tolerance. Give the inputs that vary a ± tolerance (switch on “Show a ± box under every number” in the Tolerances section) and the study runs by itself."
            .into()
    } else {
        "None of the figures the study follows could be computed for these inputs.".into()
    }
}

/// The study's state as the sheet shows it.
#[derive(Clone, Copy)]
pub struct StudyState {
    /// Fraction done, 0..=1.
    pub progress: RwSignal<f64>,
    /// A run is in progress.
    pub running: RwSignal<bool>,
    /// The last complete result.
    pub result: RwSignal<Option<Arc<StudyReport>>>,
    /// Why nothing runs (empty while running or done).
    pub idle: RwSignal<String>,
    /// Wall-clock time of the last complete run, ms.
    pub elapsed_ms: RwSignal<f64>,
    /// Bumped to cancel the run in progress.
    generation: StoredValue<u64>,
}

impl Default for StudyState {
    fn default() -> Self {
        Self::new()
    }
}

impl StudyState {
    /// An idle study.
    pub fn new() -> Self {
        Self {
            progress: RwSignal::new(0.0),
            running: RwSignal::new(false),
            result: RwSignal::new(None),
            idle: RwSignal::new(String::new()),
            elapsed_ms: RwSignal::new(0.0),
            generation: StoredValue::new(0),
        }
    }

    /// Start a study whenever the sheet's report changes (an effect: the
    /// timers and the work are the outside world of the reactive graph).
    pub fn run_on(self, sheet: Sheet) {
        Effect::new(move |_| {
            let report = sheet.report.get();
            let scenario = sheet.settled.get_untracked();
            self.start(scenario, report);
        });
    }

    /// Stop the run in progress (its partial result is dropped).
    pub fn stop(self) {
        self.generation.update_value(|g| *g += 1);
        self.running.set(false);
        self.idle
            .set("Stopped. Change an input or press “Run again”.".into());
    }

    /// Cancel any run and start the study of `s` with its nominal `report`.
    pub fn start(self, s: Scenario, report: Arc<Report>) {
        self.generation.update_value(|g| *g += 1);
        let mine = self.generation.get_value();
        self.result.set(None);
        self.progress.set(0.0);
        let Some(study) = Study::new(&s, &report) else {
            self.running.set(false);
            self.idle.set(idle_reason(&report));
            return;
        };
        self.idle.set(String::new());
        self.running.set(true);
        leptos::task::spawn_local(async move {
            let t0 = now_ms();
            let out = run_in_slices(study, |p| {
                let current = self.generation.try_get_value() == Some(mine);
                if current {
                    self.progress.set(p);
                }
                current
            })
            .await;
            if let Some(r) = out {
                if self.generation.try_get_value() == Some(mine) {
                    self.elapsed_ms.set(now_ms() - t0);
                    self.result.set(Some(Arc::new(r)));
                    self.running.set(false);
                }
            }
        });
    }
}
