//! A numeric input as the user typed it.
//!
//! Nothing the user entered is ever lost: the text is stored verbatim
//! (`"12,5 mm"`, `"3 lbf/in"`), the SI value is stored beside it for readers
//! of the file, and the tolerance is stored as typed (`"±5 %"`, `"0.2 mm"`).
//! The core re-reads the text on every assessment, so a file edited by hand
//! cannot carry an SI value that disagrees with its text.

use crate::error::InputError;
use crate::units::{self, Dim};
use serde::{Deserialize, Serialize};

/// How a toleranced input is spread in the Monte Carlo study.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Spread {
    /// Uniform over nominal ± tolerance.
    #[default]
    Uniform,
    /// Normal with the tolerance at three standard deviations.
    Normal,
}

/// A numeric input: text as typed, SI value, optional tolerance.
#[derive(Debug, Clone, Default, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(deny_unknown_fields)]
pub struct Value {
    /// Exactly what the user typed: a number, optionally with a unit.
    pub text: String,
    /// SI value of `text` when the file was written (informative; the core
    /// always re-reads `text`).
    #[serde(default, skip_serializing_if = "Option::is_none")]
    pub si: Option<f64>,
    /// Tolerance as typed: `±5 %`, `5%`, `± 0.2 mm`, `0.2` (field's unit);
    /// empty for none.
    #[serde(default, skip_serializing_if = "String::is_empty")]
    pub tol: String,
    /// Spread of the tolerance in the Monte Carlo study.
    #[serde(default, skip_serializing_if = "is_uniform")]
    pub spread: Spread,
}

fn is_uniform(s: &Spread) -> bool {
    *s == Spread::Uniform
}

impl Value {
    /// A value from text, without tolerance.
    pub fn new(text: &str) -> Self {
        Self {
            text: text.into(),
            ..Self::default()
        }
    }

    /// A value from text with a tolerance text.
    pub fn with_tol(text: &str, tol: &str, spread: Spread) -> Self {
        Self {
            text: text.into(),
            si: None,
            tol: tol.into(),
            spread,
        }
    }

    /// True when nothing was entered.
    pub fn is_blank(&self) -> bool {
        self.text.trim().is_empty()
    }
}

/// A tolerance read from its text.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum TolText {
    /// ± this many SI units.
    Absolute(f64),
    /// ± this fraction of the nominal (0.05 for 5 %).
    Relative(f64),
}

/// Read a tolerance text: optional `±` or `+/-`, then either a percentage
/// (`5 %`) or a quantity of the field's dimension (`0.2 mm`, or a bare number
/// in the field's default unit). Empty text is `Ok(None)`.
pub fn parse_tolerance(
    text: &str,
    dim: Dim,
    default_unit: &str,
) -> Result<Option<TolText>, String> {
    let t = text.trim();
    if t.is_empty() {
        return Ok(None);
    }
    let t = t
        .strip_prefix('±')
        .or_else(|| t.strip_prefix("+/-"))
        .or_else(|| t.strip_prefix("+-"))
        .unwrap_or(t)
        .trim();
    let tol = if let Some(pct) = t.strip_suffix('%') {
        let f = units::parse_quantity(pct.trim(), Dim::Ratio, "").map_err(|e| {
            format!(
                "a tolerance is a percentage (e.g. \"±5 %\") or {} (e.g. \"±0.2 mm\"): {}",
                dim.noun(),
                e.message(Dim::Ratio)
            )
        })?;
        TolText::Relative(f / 100.0)
    } else {
        let a = units::parse_quantity(t, dim, default_unit).map_err(|e| {
            format!(
                "a tolerance is a percentage (e.g. \"±5 %\") or {}: {}",
                dim.noun(),
                e.message(dim)
            )
        })?;
        TolText::Absolute(a)
    };
    let size = match tol {
        TolText::Absolute(a) | TolText::Relative(a) => a,
    };
    if !size.is_finite() || size < 0.0 {
        return Err("a tolerance must be zero or a positive amount".into());
    }
    Ok(Some(tol))
}

/// Read `value` as a quantity of `dim` (bare numbers in `default_unit`),
/// with the error naming `field`.
pub fn read_si(
    field: &str,
    value: &Value,
    dim: Dim,
    default_unit: &str,
) -> Result<f64, InputError> {
    units::parse_quantity(&value.text, dim, default_unit)
        .map_err(|e| e.into_input_error(field, dim))
}
