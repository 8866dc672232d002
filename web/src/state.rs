//! The sheet's state: one `RwSignal<Scenario>` holding everything the user
//! entered, exactly as typed, and the report derived from it.
//!
//! Derive, don't sync: every field is a [`Binding`] to one member of the
//! scenario; the report is a memo of a *settled* copy of the scenario, which
//! follows the scenario 150 ms after the last change (the only effect here
//! is that timer), so typing stays fluid and there is no calculate button.
//! A change of display units alone does not settle anew: it changes no
//! figure, only how figures are shown.

use crate::bind::Binding;
use crate::lens::value_mut;
use crate::study::StudyState;
use joulewise_core::assess::assess;
use joulewise_core::figure::Verdict;
use joulewise_core::report::{Report, VerdictCounts};
use joulewise_core::scenario::{Scenario, Spread};
use joulewise_core::InputError;
use leptos::prelude::*;
use std::sync::Arc;
use std::time::Duration;

/// Milliseconds between the last change and the recomputation.
pub const SETTLE_MS: u64 = 150;

/// The views of the sheet.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum View {
    /// Inputs, figures, checks, cautions and plots.
    Assessment,
    /// Buffer sizing from limits.
    Sizing,
    /// Tolerance study.
    Study,
    /// How the figures are checked (models, sources, checks, tolerances).
    Checked,
    /// The library of kept assessments.
    Library,
}

/// Everything the sheet shares, provided as context (all handles are Copy).
#[derive(Clone, Copy)]
pub struct Sheet {
    /// The assessment as typed.
    pub scenario: RwSignal<Scenario>,
    /// The scenario the report was computed from.
    pub settled: RwSignal<Scenario>,
    /// The nominal report of the settled scenario.
    pub report: Memo<Arc<Report>>,
    /// Show a ± tolerance box under every number (not only those that have one).
    pub show_tol: RwSignal<bool>,
    /// The view shown.
    pub view: RwSignal<View>,
    /// The tolerance study running in slices.
    pub study: StudyState,
    /// The inputs changed and the report has not caught up yet.
    pub pending: Memo<bool>,
}

/// The report, or (for a scenario of another format version, which the
/// sheet never builds) an empty one that says why.
pub fn assess_or_explain(s: &Scenario) -> Report {
    assess(s).unwrap_or_else(|e| Report {
        program: format!("Joulewise {}", joulewise_core::VERSION),
        schema_version: s.schema_version,
        scenario_hash: String::new(),
        identity: s.identity.clone(),
        display_units: s.display_units,
        inputs: Vec::new(),
        errors: vec![InputError::invalid("schema_version", e.to_string())],
        figures: Vec::new(),
        checks: Vec::new(),
        cautions: Vec::new(),
        verdict: Verdict::Unknown,
        counts: VerdictCounts::default(),
        notes: Vec::new(),
        spring_curve: None,
        history: Vec::new(),
        contact_index: None,
        states: None,
        sizing: Vec::new(),
        identification: None,
        identification_check: None,
        identification_comparison: None,
        study: None,
    })
}

/// Whether `a` and `b` give the same figures (they differ at most in the
/// display units).
fn same_figures(a: &Scenario, b: &Scenario) -> bool {
    let mut c = a.clone();
    c.display_units = b.display_units;
    &c == b
}

impl Sheet {
    /// Create the state from a first scenario, start the settle timer and
    /// the study runner, and provide the state as context.
    pub fn provide(initial: Scenario) -> Self {
        let scenario = RwSignal::new(initial.clone());
        let settled = RwSignal::new(initial);
        let report = Memo::new_with_compare(
            move |_| Arc::new(assess_or_explain(&settled.get())),
            |_, _| true,
        );
        let pending = Memo::new(move |_| scenario.with(|s| settled.with(|x| !same_figures(s, x))));
        let sheet = Self {
            scenario,
            settled,
            report,
            pending,
            show_tol: RwSignal::new(false),
            view: RwSignal::new(View::Assessment),
            study: StudyState::new(),
        };
        Effect::new(move |pending: Option<Option<TimeoutHandle>>| {
            let s = scenario.get();
            if let Some(Some(h)) = pending {
                h.clear();
            }
            if settled.with_untracked(|x| same_figures(&s, x)) {
                return None;
            }
            set_timeout_with_handle(move || settled.set(s), Duration::from_millis(SETTLE_MS)).ok()
        });
        sheet.study.run_on(sheet);
        provide_context(sheet);
        sheet
    }

    /// The state provided above.
    pub fn get() -> Self {
        // Every component of the sheet sits below `App`, which provides it.
        #[allow(clippy::expect_used)]
        use_context::<Self>().expect("Sheet::provide runs in App before any section")
    }

    /// Start again from `s` (a demo or a blank sheet): settles at once.
    pub fn load(self, s: Scenario) {
        self.scenario.set(s.clone());
        self.settled.set(s);
    }

    /// Read something of the scenario that needs mutable access to reach
    /// (the lens walks `&mut`); tracked, and nothing is changed.
    pub fn peek<T>(self, f: impl FnOnce(&mut Scenario) -> T) -> Option<T> {
        self.scenario.track();
        self.scenario.try_update_untracked(f)
    }

    /// Bindings to the text, tolerance and spread of the input at `path`.
    pub fn value(self, path: &str) -> (Binding<String>, Binding<String>, Binding<Spread>) {
        let text = {
            let (p, q) = (path.to_string(), path.to_string());
            Binding::new(
                move || {
                    self.peek(|s| value_mut(s, &p, false).map(|v| v.text.clone()))
                        .flatten()
                        .unwrap_or_default()
                },
                move |t| {
                    self.scenario.update(|s| {
                        if let Some(v) = value_mut(s, &q, true) {
                            v.text = t;
                        }
                    })
                },
            )
        };
        let tol = {
            let (p, q) = (path.to_string(), path.to_string());
            Binding::new(
                move || {
                    self.peek(|s| value_mut(s, &p, false).map(|v| v.tol.clone()))
                        .flatten()
                        .unwrap_or_default()
                },
                move |t| {
                    self.scenario.update(|s| {
                        if let Some(v) = value_mut(s, &q, true) {
                            v.tol = t;
                        }
                    })
                },
            )
        };
        let spread = {
            let (p, q) = (path.to_string(), path.to_string());
            Binding::new(
                move || {
                    self.peek(|s| value_mut(s, &p, false).map(|v| v.spread))
                        .flatten()
                        .unwrap_or_default()
                },
                move |t| {
                    self.scenario.update(|s| {
                        if let Some(v) = value_mut(s, &q, true) {
                            v.spread = t;
                        }
                    })
                },
            )
        };
        (text, tol, spread)
    }

    /// The core's message for the input at `path`, shown only while the
    /// report was computed from the text now in the field (a message about
    /// text already corrected would mislead).
    pub fn problem(self, path: &str, text: Option<Binding<String>>) -> Signal<Option<String>> {
        let path = path.to_string();
        Signal::derive(move || {
            self.report.with(|r| {
                let e = r.errors.iter().find(|e| e.field == path)?;
                if let Some(t) = text {
                    let current = t.get();
                    let assessed = r.inputs.iter().find(|i| i.path == path)?;
                    if assessed.text != current {
                        return None;
                    }
                }
                Some(e.message())
            })
        })
    }
}
