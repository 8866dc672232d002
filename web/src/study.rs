//! The tolerance study, run on the page's own thread in short slices.
//!
//! [`joulewise_core::assess::Study`] does the worst-case corners in its first
//! slice, then the Monte Carlo samples a slice at a time. Between slices the
//! runner hands the thread back to the browser (a zero-delay timeout), so
//! typing, scrolling and painting go on; the slice size adapts so a slice
//! takes about [`SLICE_TARGET_MS`]. A newer report (the inputs changed)
//! cancels the run in progress and starts another; the result is shown only
//! when complete.

use crate::state::Sheet;
use joulewise_core::assess::Study;
use joulewise_core::report::{Report, StudyReport};
use joulewise_core::scenario::Scenario;
use leptos::prelude::*;
use std::sync::Arc;
use wasm_bindgen::JsCast;

/// Time one slice should take: well under the 50 ms that counts as a long
/// task, with room for the browser's own work in the same frame budget.
pub const SLICE_TARGET_MS: f64 = 20.0;
/// Samples in the first Monte Carlo slice, before any timing is known:
/// few enough to stay short on a slow tablet with a costly model.
const FIRST_SLICE: usize = 20;
/// Bounds of the adapted slice size.
const SLICE_MIN: usize = 5;
/// See [`SLICE_MIN`].
const SLICE_MAX: usize = 5_000;

/// Milliseconds from the page's clock (0 where there is none).
pub fn now_ms() -> f64 {
    web_sys::window()
        .and_then(|w| w.performance())
        .map_or(0.0, |p| p.now())
}

/// Give the thread back to the browser until a zero-delay timeout fires.
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
    let mut n = FIRST_SLICE;
    // The first call does the worst-case corners, not `n` samples: its time
    // says nothing about the time per sample.
    let mut corners = true;
    loop {
        let t0 = now_ms();
        let done = study.advance(n);
        let dt = now_ms() - t0;
        if !progress(study.progress()) {
            return None;
        }
        if done {
            return Some(study.finish());
        }
        if !corners {
            // Towards the target time, at most halving or doubling at a
            // time (the time per sample varies, e.g. with bottoming).
            let factor = if dt > 0.0 { SLICE_TARGET_MS / dt } else { 2.0 };
            let scaled = n as f64 * factor.clamp(0.5, 2.0);
            n = (scaled as usize).clamp(SLICE_MIN, SLICE_MAX);
        }
        corners = false;
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
