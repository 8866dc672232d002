//! How the figures were checked: for each model and each limit set, its
//! formula, its source and how far that source was confirmed, and the checks
//! that cover it, each with the reference it is compared against, its
//! tolerance and why that tolerance is right.
//!
//! This module holds data only; it computes nothing. The same data drives
//! the tests and the page that shows them, so the two cannot drift apart:
//! - the Python reference suite (`tests/reference/`) reads the catalogue
//!   through the reference harness, runs exactly the checks marked
//!   [`Runner::PythonSuite`] with the tolerance stated here, and fails when
//!   it implements a check the catalogue does not list or misses one it does;
//! - the cross-crate Rust tests (`tests/*.rs`) read their tolerances from
//!   [`check`], and `tests/verification.rs` confirms that every
//!   [`Runner::CoreUnitTest`] and [`Runner::CrossCrateTest`] names a test
//!   that exists, that every subject is covered by at least one check, that
//!   every limit set of [`crate::limits::catalogue`] has a subject whose
//!   status is its weakest entry's, and that the section "How the figures
//!   are checked" of DEVELOPERS.md is exactly [`markdown`];
//! - the web page renders [`catalogue`].
//!
//! Tolerances fall into a few kinds ([`ToleranceKind`]): floating-point
//! rounding where both sides evaluate exact definitions or closed forms;
//! half a unit in the last printed digit where a value is printed in a book,
//! a standard or a table; integrator tolerances where an ODE solution is
//! compared with another (Joulewise's Dormand–Prince 5(4) against scipy's
//! DOP853 at rtol 1e-12); quadrature error for numerical integrals; and the
//! known error of a model approximation (Rayleigh's one-third spring mass)
//! where a simple model is compared with an exact one. Sources carry the
//! status codes of the project's reference table (confirmed, secondary,
//! derived, common practice, from memory).

mod checks;
mod markdown;
mod subjects;

pub use markdown::{markdown, tol as tolerance_text};

use crate::figure::SourceStatus;
use serde::Serialize;

/// Whether a subject is a physical model or a set of published limits.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum SubjectKind {
    /// A model that computes figures (a spring, the release, a buffer...).
    Model,
    /// A set of published limits the figures are compared against.
    LimitSet,
}

/// One model or limit set, with its formula and source.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Subject {
    /// Stable id, e.g. `spring.helical` or `limits.crane`.
    pub id: &'static str,
    /// Model or limit set.
    pub kind: SubjectKind,
    /// Name for people.
    pub name: &'static str,
    /// Where it lives in the code, e.g. `core/src/spring/helical.rs`.
    pub module: &'static str,
    /// The formula (or, for a limit set, the rule) in one line.
    pub formula: &'static str,
    /// Document, clause or reference of the formula or the limits.
    pub source: &'static str,
    /// How far that source was confirmed (for a limit set: its weakest entry).
    pub status: SourceStatus,
}

/// What a check compares the figure with.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Basis {
    /// A value published in a standard, regulation, textbook example or
    /// NIST publication.
    PublishedValue,
    /// An independent computation by a general-purpose reference library
    /// (scipy, numpy, pint, uncertainties), with equations written from the
    /// physics description, not translated from Joulewise's code.
    ReferenceLibrary,
    /// A fact of the trade with no single citable source.
    CommonPractice,
    /// A closed form derived from confirmed formulas, evaluated separately.
    DerivedClosedForm,
    /// Two parts of Joulewise that must agree (e.g. sizing fed back into the
    /// impact model).
    RoundTrip,
}

impl Basis {
    /// The basis in words.
    pub fn describe(self) -> &'static str {
        match self {
            Self::PublishedValue => "published value",
            Self::ReferenceLibrary => "reference library",
            Self::CommonPractice => "common practice",
            Self::DerivedClosedForm => "derived closed form",
            Self::RoundTrip => "round trip within Joulewise",
        }
    }
}

/// The reference a check compares against.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Reference {
    /// Published value, reference library, common practice...
    pub basis: Basis,
    /// The source by name: `scipy.integrate.solve_ivp`, `Bhandari, Design
    /// of Machine Elements, 3rd ed.`, `29 CFR 1910.179`... Checks are counted
    /// per source name.
    pub name: &'static str,
    /// Clause, example, method or settings: `Ex. 10.1`, `DOP853, rtol 1e-12`.
    pub detail: &'static str,
    /// How far the source was confirmed.
    pub status: SourceStatus,
}

/// Why a tolerance has the size it has.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum ToleranceKind {
    /// Both sides evaluate exact definitions or closed forms: only
    /// floating-point rounding separates them.
    FloatRounding,
    /// The reference value is printed to a few significant figures: half a
    /// unit in the last printed digit.
    PrintedDigits,
    /// A pass/fail decision at a boundary: exact (the boundary itself passes).
    Decision,
    /// Two numerical integrations of the same ODE, each within its tolerance.
    OdeTolerance,
    /// A numerical quadrature or a discretised model against a closed form.
    Quadrature,
    /// A simplified model against the exact one: the known size of the
    /// simplification's error.
    ModelApproximation,
}

impl ToleranceKind {
    /// The kind in words.
    pub fn describe(self) -> &'static str {
        match self {
            Self::FloatRounding => "floating-point rounding",
            Self::PrintedDigits => "printed digits",
            Self::Decision => "exact decision",
            Self::OdeTolerance => "ODE tolerance",
            Self::Quadrature => "quadrature or discretisation",
            Self::ModelApproximation => "model approximation",
        }
    }
}

/// A named tolerance with its reason.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Tolerance {
    /// Largest relative deviation accepted, |got − want|/|want| (for a
    /// pass/fail decision: 0, the verdict must agree).
    pub relative: f64,
    /// Why it has this size, in one word.
    pub kind: ToleranceKind,
    /// Why it has this size, in words.
    pub why: &'static str,
}

/// Where a check runs.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Runner {
    /// A unit test inside joulewise-core, by its path as `cargo test` lists
    /// it (`spring::helical::tests::t1_bhandari_ex_10_1_rate_and_free_length`).
    CoreUnitTest {
        /// Test path.
        path: &'static str,
    },
    /// A test of the cross-crate `tests/` folder (package joulewise-tests).
    CrossCrateTest {
        /// File under `tests/`, e.g. `published_values.rs`.
        file: &'static str,
        /// Test function name.
        name: &'static str,
    },
    /// The Python reference suite under `tests/reference/` (run by
    /// `cargo xtask test --only reference`); the check id names it there.
    PythonSuite,
}

/// One check: what it compares, against what, within what tolerance.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Check {
    /// Stable id, e.g. `py.impact.power_law` or `core.helical.bhandari_10_1`.
    pub id: &'static str,
    /// What is compared, in words.
    pub title: &'static str,
    /// Ids of the subjects (models, limit sets) it covers.
    pub covers: &'static [&'static str],
    /// What it is compared with.
    pub reference: Reference,
    /// The accepted deviation and why.
    pub tolerance: Tolerance,
    /// Where it runs.
    pub runner: Runner,
}

/// Every subject and every check.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Catalogue {
    /// Models and limit sets, models first.
    pub subjects: &'static [Subject],
    /// Checks, grouped by the subject they mainly cover.
    pub checks: &'static [Check],
}

impl Catalogue {
    /// The checks that cover subject `id`.
    pub fn checks_of<'a>(&'a self, id: &'a str) -> impl Iterator<Item = &'static Check> + 'a {
        self.checks.iter().filter(move |c| c.covers.contains(&id))
    }

    /// The subject with this id.
    pub fn subject(&self, id: &str) -> Option<&'static Subject> {
        self.subjects.iter().find(|s| s.id == id)
    }
}

/// The catalogue of every model, limit set and check.
pub fn catalogue() -> Catalogue {
    Catalogue {
        subjects: subjects::SUBJECTS,
        checks: checks::CHECKS,
    }
}

/// The check with this id.
pub fn check(id: &str) -> Option<&'static Check> {
    checks::CHECKS.iter().find(|c| c.id == id)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ids_are_unique_and_every_check_covers_known_subjects() {
        let cat = catalogue();
        let mut ids: Vec<&str> = cat.checks.iter().map(|c| c.id).collect();
        ids.extend(cat.subjects.iter().map(|s| s.id));
        let n = ids.len();
        ids.sort_unstable();
        ids.dedup();
        assert_eq!(ids.len(), n, "duplicate ids");
        for c in cat.checks {
            assert!(!c.covers.is_empty(), "{}", c.id);
            for s in c.covers {
                assert!(cat.subject(s).is_some(), "{} covers unknown {s}", c.id);
            }
            assert!(
                c.tolerance.relative.is_finite() && c.tolerance.relative >= 0.0,
                "{}",
                c.id
            );
            assert!(
                !c.tolerance.why.is_empty() && !c.title.is_empty(),
                "{}",
                c.id
            );
            let python = matches!(c.runner, Runner::PythonSuite);
            assert_eq!(python, c.id.starts_with("py."), "{}", c.id);
        }
    }

    #[test]
    fn every_subject_is_covered() {
        let cat = catalogue();
        for s in cat.subjects {
            assert!(
                cat.checks_of(s.id).next().is_some(),
                "{} has no check",
                s.id
            );
        }
    }
}
