//! Typed input errors: every refusal names the field and what is acceptable.
//!
//! A model's constructor validates its inputs and returns `Err(InputError)`
//! with a local field name (`wire_diameter`); the scenario layer prefixes the
//! path (`spring.wire_diameter`) with [`InputError::within`]. A worrying but
//! valid result (bottoming, a limit exceeded, a stall) is never an error: it is
//! data inside `Ok`.

use serde::{Deserialize, Serialize};
use std::fmt;

/// An input that cannot be used, with the field it came from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct InputError {
    /// Dotted path of the field, e.g. `spring.wire_diameter`.
    pub field: String,
    /// What is wrong and what would be acceptable.
    pub problem: Problem,
}

/// What is wrong with an input value.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
pub enum Problem {
    /// Nothing was entered where a value is needed.
    Empty,
    /// NaN or infinite.
    NotFinite,
    /// Must be strictly greater than zero.
    NotPositive,
    /// Must be zero or more.
    Negative,
    /// Outside an admissible interval (SI values, bounds inclusive).
    OutOfRange {
        /// Smallest acceptable value (SI).
        min: f64,
        /// Largest acceptable value (SI).
        max: f64,
    },
    /// The text could not be read as a quantity of the expected kind.
    Unit {
        /// Human-readable explanation naming the expected kind and examples.
        message: String,
    },
    /// Any other inconsistency, stated as what is acceptable.
    Invalid {
        /// Human-readable explanation naming what would be acceptable.
        message: String,
    },
}

impl InputError {
    /// A new error for `field`.
    pub fn new(field: impl Into<String>, problem: Problem) -> Self {
        Self {
            field: field.into(),
            problem,
        }
    }

    /// An error whose problem is explained in words.
    pub fn invalid(field: impl Into<String>, message: impl Into<String>) -> Self {
        Self::new(
            field,
            Problem::Invalid {
                message: message.into(),
            },
        )
    }

    /// Prefix the field path with a parent, e.g. `wire_diameter` within
    /// `spring` becomes `spring.wire_diameter`.
    #[must_use]
    pub fn within(mut self, parent: &str) -> Self {
        if parent.is_empty() {
            return self;
        }
        self.field = if self.field.is_empty() {
            parent.to_string()
        } else {
            format!("{parent}.{}", self.field)
        };
        self
    }

    /// The message alone, without the field path (for display beside a field).
    pub fn message(&self) -> String {
        match &self.problem {
            Problem::Empty => "a value is required".into(),
            Problem::NotFinite => "must be a finite number".into(),
            Problem::NotPositive => "must be greater than zero".into(),
            Problem::Negative => "must be zero or more".into(),
            Problem::OutOfRange { min, max } => {
                format!(
                    "must be between {} and {} (SI units)",
                    fmt_g(*min),
                    fmt_g(*max)
                )
            }
            Problem::Unit { message } | Problem::Invalid { message } => message.clone(),
        }
    }
}

fn fmt_g(x: f64) -> String {
    if x == f64::INFINITY {
        "∞".into()
    } else if x == f64::NEG_INFINITY {
        "−∞".into()
    } else {
        format!("{x}")
    }
}

impl fmt::Display for InputError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{}: {}", self.field, self.message())
    }
}

impl std::error::Error for InputError {}

/// Validation helpers used by every model constructor. Each returns the value
/// unchanged when acceptable.
pub mod check {
    use super::{InputError, Problem};

    /// Finite (not NaN, not ±∞).
    pub fn finite(field: &str, v: f64) -> Result<f64, InputError> {
        if v.is_finite() {
            Ok(v)
        } else {
            Err(InputError::new(field, Problem::NotFinite))
        }
    }

    /// Finite and strictly positive.
    pub fn positive(field: &str, v: f64) -> Result<f64, InputError> {
        finite(field, v)?;
        if v > 0.0 {
            Ok(v)
        } else {
            Err(InputError::new(field, Problem::NotPositive))
        }
    }

    /// Finite and zero or more.
    pub fn non_negative(field: &str, v: f64) -> Result<f64, InputError> {
        finite(field, v)?;
        if v >= 0.0 {
            Ok(v)
        } else {
            Err(InputError::new(field, Problem::Negative))
        }
    }

    /// A value derived from several inputs (a rate from a geometry, an area
    /// from dimensions) that must be finite and strictly positive: inputs of
    /// extreme size can overflow or underflow it even when each one passed
    /// its own check. The error names `field`, the input most likely at
    /// fault, and says what the product was.
    pub fn derived(field: &str, v: f64, what: &str) -> Result<f64, InputError> {
        if v.is_finite() && v > 0.0 {
            Ok(v)
        } else {
            Err(InputError::invalid(
                field,
                format!(
                    "gives {what} of {v}, not a finite positive number: check the size and unit of this and the related inputs"
                ),
            ))
        }
    }

    /// Finite and within `[min, max]` inclusive.
    pub fn in_range(field: &str, v: f64, min: f64, max: f64) -> Result<f64, InputError> {
        finite(field, v)?;
        if (min..=max).contains(&v) {
            Ok(v)
        } else {
            Err(InputError::new(field, Problem::OutOfRange { min, max }))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn within_builds_a_dotted_path() {
        let e = InputError::new("wire_diameter", Problem::NotPositive).within("spring");
        assert_eq!(e.field, "spring.wire_diameter");
        assert_eq!(
            e.to_string(),
            "spring.wire_diameter: must be greater than zero"
        );
    }

    #[test]
    fn checks_refuse_nan_and_sign() {
        assert!(check::positive("k", f64::NAN).is_err());
        assert!(check::positive("k", 0.0).is_err());
        assert!(check::non_negative("k", -1e-300).is_err());
        assert_eq!(check::in_range("e", 0.5, 0.0, 1.0), Ok(0.5));
    }
}
