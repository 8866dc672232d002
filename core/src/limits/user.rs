//! User-defined limits: a threshold the user enters for any figure, with the
//! source they cite. Joulewise compares the figure with it like any other
//! limit but has not checked the value: its status is
//! [`SourceStatus::UserSupplied`], and the check says so.

use super::{figure_value, Check, Comparison, LimitEntry, LimitSet, LimitSetId, Subject};
use crate::cautions::CautionId;
use crate::error::{check, InputError};
use crate::figure::{Figure, Provenance, SourceStatus};
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// A limit the user defines.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct UserLimit {
    /// Name shown beside the check, e.g. `Customer spec: ejector energy`.
    pub name: String,
    /// Id of the figure compared (see [`crate::figure::ids`]).
    pub figure: String,
    /// Quantity kind of the threshold; must match the figure's.
    pub dim: Dim,
    /// Threshold in the SI unit of `dim`.
    pub threshold: f64,
    /// How the figure is compared with the threshold.
    pub comparison: Comparison,
    /// Where the value comes from, in the user's words (document, clause).
    pub source: String,
}

impl UserLimit {
    /// Check that the limit can be used: name and figure given, threshold finite.
    ///
    /// # Errors
    /// Empty name or figure id; threshold not finite.
    pub fn validate(&self) -> Result<(), InputError> {
        if self.name.trim().is_empty() {
            return Err(InputError::invalid("name", "a name for the limit"));
        }
        if self.figure.trim().is_empty() {
            return Err(InputError::invalid(
                "figure",
                "the id of the figure to compare",
            ));
        }
        check::finite("threshold", self.threshold)?;
        Ok(())
    }

    fn provenance(&self) -> Provenance {
        let doc = if self.source.trim().is_empty() {
            "source not stated"
        } else {
            self.source.as_str()
        };
        Provenance::new(doc, "", SourceStatus::UserSupplied)
    }

    fn subject(&self) -> Subject {
        let key: String = self
            .name
            .chars()
            .map(|c| {
                if c.is_ascii_alphanumeric() {
                    c.to_ascii_lowercase()
                } else {
                    '_'
                }
            })
            .collect();
        Subject::new(&format!("user.{key}"), &self.name, &self.figure, self.dim)
    }

    /// Compare `value` (SI) with the threshold.
    ///
    /// # Errors
    /// The limit is invalid (see [`UserLimit::validate`]).
    pub fn check(&self, value: Option<f64>) -> Result<Check, InputError> {
        self.validate()?;
        let c = match self.comparison {
            Comparison::AtMost => {
                Check::at_most(self.subject(), value, self.threshold, self.provenance())
            }
            Comparison::AtLeast => {
                Check::at_least(self.subject(), value, self.threshold, self.provenance())
            }
            Comparison::NotPermitted => {
                Check::not_permitted(self.subject(), value, self.provenance())
            }
        };
        Ok(c.note("A limit entered by the user: Joulewise has not checked its value or source."))
    }

    /// Find the figure among `figures` and compare it. A missing figure, or
    /// one of another quantity kind, gives an Unknown check that says why.
    ///
    /// # Errors
    /// The limit is invalid (see [`UserLimit::validate`]).
    pub fn check_figures(&self, figures: &[Figure]) -> Result<Check, InputError> {
        if let Some(f) = figures.iter().find(|f| f.id == self.figure) {
            if f.dim != self.dim {
                self.validate()?;
                return Ok(Check::unknown_limit(
                    self.subject(),
                    self.comparison,
                    None,
                    self.provenance(),
                    &format!(
                        "The figure `{}` is {} but the limit is {}: they cannot be compared.",
                        self.figure,
                        f.dim.noun(),
                        self.dim.noun()
                    ),
                ));
            }
        }
        match figure_value(figures, &self.figure) {
            Ok(v) => self.check(Some(v)),
            Err(reasons) => Ok(self.check(None)?.missing_because(&reasons)),
        }
    }
}

/// The user's limits as a set for the catalogue.
pub fn limit_set(limits: &[UserLimit]) -> LimitSet {
    LimitSet {
        id: LimitSetId::UserDefined,
        title: "Limits entered by the user".into(),
        documents: limits
            .iter()
            .map(|l| l.source.clone())
            .filter(|s| !s.trim().is_empty())
            .collect(),
        scope: "Thresholds the user entered for particular figures.".into(),
        explanation: "These limits were typed in by the user with the source they cite. Joulewise compares figures with them but has not checked the values or the sources.".into(),
        entries: limits
            .iter()
            .map(|l| {
                let e = LimitEntry::new(&l.name, &l.name, l.comparison, l.dim, l.provenance())
                    .note(&format!("Figure `{}`.", l.figure));
                if l.threshold.is_finite() && l.comparison != Comparison::NotPermitted {
                    e.value(l.threshold)
                } else {
                    e.rule(l.comparison.words())
                }
            })
            .collect(),
        cautions: vec![CautionId::UserSuppliedLimit],
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::figure::{ids, Verdict};

    fn lim() -> UserLimit {
        UserLimit {
            name: "Bakery line spec: ejector energy".into(),
            figure: ids::RELEASE_KINETIC_ENERGY.into(),
            dim: Dim::Energy,
            threshold: 2.0,
            comparison: Comparison::AtMost,
            source: "Invented customer specification, section 4".into(),
        }
    }

    #[test]
    fn compares_and_says_it_is_user_supplied() {
        let c = lim().check(Some(1.5)).unwrap();
        assert_eq!(c.verdict, Verdict::Pass);
        assert_eq!(c.provenance.status, SourceStatus::UserSupplied);
        assert!(c.cautions.contains(&CautionId::UserSuppliedLimit));
        assert_eq!(c.figure, ids::RELEASE_KINETIC_ENERGY);
        assert_eq!(lim().check(Some(2.5)).unwrap().verdict, Verdict::Fail);
    }

    #[test]
    fn finds_figures_and_explains_missing_or_mismatched_ones() {
        let figs = vec![Figure::new(
            ids::RELEASE_KINETIC_ENERGY,
            "KE",
            Dim::Energy,
            1.0,
        )];
        assert_eq!(lim().check_figures(&figs).unwrap().verdict, Verdict::Pass);
        let c = lim().check_figures(&[]).unwrap();
        assert_eq!(c.verdict, Verdict::Unknown);
        assert!(c.notes.iter().any(|n| n.contains("no figure")));
        let wrong = vec![Figure::new(
            ids::RELEASE_KINETIC_ENERGY,
            "KE",
            Dim::Force,
            1.0,
        )];
        let c = lim().check_figures(&wrong).unwrap();
        assert_eq!(c.verdict, Verdict::Unknown);
        assert!(c.notes.iter().any(|n| n.contains("cannot be compared")));
    }

    #[test]
    fn invalid_limits_are_refused() {
        let mut l = lim();
        l.threshold = f64::NAN;
        assert_eq!(l.check(Some(1.0)).unwrap_err().field, "threshold");
        l = lim();
        l.name = " ".into();
        assert_eq!(l.validate().unwrap_err().field, "name");
        assert_eq!(limit_set(&[lim()]).entries.len(), 1);
    }
}
