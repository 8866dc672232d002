//! A figure with its provenance: value (SI), quantity kind, the formula or
//! method that produced it, the source of that method, and the assumptions.
//!
//! The web sheet, the printed report and the CLI only format these, so all
//! three say the same thing. A figure that cannot be computed keeps its place
//! with `value: None` and the reasons, so a panel is never blank.

use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// How far a published value or formula was confirmed (the codes used in the
/// project's reference table).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum SourceStatus {
    /// Read in the primary text (regulation, textbook worked example).
    Confirmed,
    /// Read in a secondary source quoting the standard; the standard itself
    /// was not read.
    Secondary,
    /// Derived from confirmed formulas by exact arithmetic.
    Derived,
    /// A fact of the trade with no single citable source.
    CommonPractice,
    /// Recalled but not checked against the document: confirm against the
    /// current edition before relying on it.
    FromMemory,
}

impl SourceStatus {
    /// Short words for display beside a source.
    pub fn describe(self) -> &'static str {
        match self {
            Self::Confirmed => "confirmed in the primary text",
            Self::Secondary => "from a secondary source quoting the standard",
            Self::Derived => "derived from confirmed formulas",
            Self::CommonPractice => "common practice",
            Self::FromMemory => "from memory: confirm against the current edition",
        }
    }
}

/// Where a formula or a limit comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Provenance {
    /// Document, e.g. `EN 13906-1:2013`, `ISO/TS 15066:2016`, `29 CFR 1910.179`.
    pub document: String,
    /// Clause, table or equation, e.g. `Table A.2`; empty when not known.
    pub clause: String,
    /// How far this was confirmed.
    pub status: SourceStatus,
}

impl Provenance {
    /// A provenance record.
    pub fn new(document: &str, clause: &str, status: SourceStatus) -> Self {
        Self {
            document: document.into(),
            clause: clause.into(),
            status,
        }
    }

    /// One line: `ISO/TS 15066:2016, Table A.2 (from a secondary source ...)`.
    pub fn cite(&self) -> String {
        if self.clause.is_empty() {
            format!("{} ({})", self.document, self.status.describe())
        } else {
            format!("{}, {} ({})", self.document, self.clause, self.status.describe())
        }
    }
}

/// Outcome of comparing a figure with a limit. Never conveyed by colour alone.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Verdict {
    /// Within the limit.
    Pass,
    /// The limit does not apply to this case (explained in the check's note).
    NotApplicable,
    /// The figure could not be computed, so the check could not be made.
    Unknown,
    /// Outside the limit.
    Fail,
}

impl Verdict {
    /// The verdict in words.
    pub fn word(self) -> &'static str {
        match self {
            Self::Pass => "within limit",
            Self::NotApplicable => "not applicable",
            Self::Unknown => "cannot check",
            Self::Fail => "exceeds limit",
        }
    }
}

/// One computed figure with everything needed to trust it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Figure {
    /// Stable identifier, e.g. `release.contact_speed`; used by checks, the
    /// tolerance study and tests.
    pub id: String,
    /// Label for people, e.g. `Speed at contact`.
    pub label: String,
    /// Quantity kind; the value is in this kind's SI unit.
    pub dim: Dim,
    /// Value in SI, or `None` when it cannot be computed (see `missing`).
    pub value: Option<f64>,
    /// Why the value is missing (names the fields at fault).
    pub missing: Vec<String>,
    /// Formula or method, e.g. `E = ½·k·(x₂² − x₁²) (Hooke's law)`.
    pub method: String,
    /// Source of the formula or method.
    pub source: String,
    /// Assumptions behind the value, e.g. `rigid frame`.
    pub assumptions: Vec<String>,
}

impl Figure {
    /// A computed figure. A non-finite value is recorded as missing, never
    /// passed on as NaN.
    pub fn new(id: &str, label: &str, dim: Dim, value: f64) -> Self {
        let mut f = Self {
            id: id.into(),
            label: label.into(),
            dim,
            value: None,
            missing: Vec::new(),
            method: String::new(),
            source: String::new(),
            assumptions: Vec::new(),
        };
        if value.is_finite() {
            f.value = Some(value);
        } else {
            f.missing
                .push("the computation gave no finite value for these inputs".into());
        }
        f
    }

    /// A figure that cannot be computed, with the reasons.
    pub fn missing(id: &str, label: &str, dim: Dim, reasons: Vec<String>) -> Self {
        let mut f = Self::new(id, label, dim, 0.0);
        f.value = None;
        f.missing = reasons;
        f
    }

    /// Set the formula or method.
    #[must_use]
    pub fn method(mut self, method: &str) -> Self {
        self.method = method.into();
        self
    }

    /// Set the source of the method.
    #[must_use]
    pub fn source(mut self, source: &str) -> Self {
        self.source = source.into();
        self
    }

    /// Add an assumption.
    #[must_use]
    pub fn assume(mut self, assumption: &str) -> Self {
        self.assumptions.push(assumption.into());
        self
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn non_finite_values_become_missing() {
        let f = Figure::new("x", "X", Dim::Energy, f64::NAN);
        assert_eq!(f.value, None);
        assert_eq!(f.missing.len(), 1);
    }

    #[test]
    fn verdict_order_puts_fail_last_so_max_is_worst() {
        assert!(Verdict::Fail > Verdict::Unknown && Verdict::Unknown > Verdict::Pass);
    }
}
