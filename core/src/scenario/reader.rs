//! Reading a scenario's numeric inputs, once from text and then, for the
//! tolerance study, many times from perturbed SI values.
//!
//! The first pass ([`Reader::record`]) parses every `Value` the model asks
//! for, checks it, and records it in visiting order with its path, dimension
//! and tolerance; errors are collected (not returned early) so one bad field
//! does not hide the figures that do not depend on it. A replay pass
//! ([`Reader::replay`]) hands out SI values from a slice in the same order
//! without touching text, which keeps a Monte Carlo sample cheap.

use super::value::{parse_tolerance, read_si, Spread, TolText, Value};
use crate::error::{check, InputError};
use crate::units::Dim;

/// Largest magnitude of any input in SI units (1e12: a terajoule, a
/// million tonnes, a thousand kilometres of travel). Every real machine
/// input is many orders below it; what lies beyond is a typing slip or a
/// hostile file, and refusing it keeps every product of a few inputs far
/// from overflow, so no figure can become infinite or NaN.
pub const MAX_MAGNITUDE: f64 = 1e12;

/// Smallest non-zero magnitude of any input in SI units (1e-12: a
/// picometre, a nanogram, a piconewton). Smaller non-zero values are slips
/// (a unit typed wrong by many prefixes) and would make quotients overflow.
pub const MIN_MAGNITUDE: f64 = 1e-12;

/// Refuse a value outside the magnitudes Joulewise accepts
/// ([`MIN_MAGNITUDE`] to [`MAX_MAGNITUDE`] in SI units, or zero), naming the
/// field and the SI unit.
fn plausible(field: &str, v: f64, dim: Dim) -> Result<f64, InputError> {
    let m = v.abs();
    if m == 0.0 || (MIN_MAGNITUDE..=MAX_MAGNITUDE).contains(&m) {
        return Ok(v);
    }
    let unit = match dim.si_symbol() {
        "" => String::new(),
        u => format!(" {u}"),
    };
    let which = if m > MAX_MAGNITUDE {
        "too large"
    } else {
        "too small"
    };
    Err(InputError::invalid(
        field,
        format!(
            "{which} to be a real value: Joulewise accepts magnitudes from 1e-12{unit} to \
             1e12{unit} (in SI units), or 0 where zero is allowed; check the number and its unit"
        ),
    ))
}

/// What an input must satisfy beyond being a finite quantity of its kind.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Rule {
    /// Any finite value.
    Any,
    /// Strictly positive.
    Positive,
    /// Zero or more.
    NonNegative,
    /// Within `[min, max]` (SI, inclusive).
    Range(f64, f64),
}

impl Rule {
    fn apply(self, field: &str, v: f64) -> Result<f64, InputError> {
        match self {
            Rule::Any => check::finite(field, v),
            Rule::Positive => check::positive(field, v),
            Rule::NonNegative => check::non_negative(field, v),
            Rule::Range(lo, hi) => check::in_range(field, v, lo, hi),
        }
    }
}

/// One numeric input met while reading a scenario.
#[derive(Debug, Clone, PartialEq)]
pub struct InputRecord {
    /// Dotted path, e.g. `spring.wire_diameter`.
    pub path: String,
    /// Kind of quantity.
    pub dim: Dim,
    /// Text as typed.
    pub text: String,
    /// SI value, when it could be read.
    pub si: Option<f64>,
    /// Tolerance, when one was given and could be read.
    pub tol: Option<TolText>,
    /// Spread of the tolerance.
    pub spread: Spread,
    /// The rule the value must satisfy (kept so perturbed values are checked
    /// the same way).
    pub rule: Rule,
}

enum Mode<'a> {
    Record,
    Replay(&'a [f64]),
}

/// Reads numeric inputs; see the module doc.
pub struct Reader<'a> {
    mode: Mode<'a>,
    /// Dotted path of the current section (one buffer, truncated on the way
    /// out of a section: no allocation per section once it has grown).
    prefix: String,
    cursor: usize,
    /// Inputs met, in visiting order (record mode only).
    pub records: Vec<InputRecord>,
    /// Problems found, each naming its field path.
    pub errors: Vec<InputError>,
}

impl<'a> Reader<'a> {
    /// A first pass that parses text and records every input.
    pub fn record() -> Reader<'static> {
        Reader {
            mode: Mode::Record,
            prefix: String::new(),
            cursor: 0,
            records: Vec::new(),
            errors: Vec::new(),
        }
    }

    /// A replay pass that hands out `values` (SI) in recorded order.
    pub fn replay(values: &'a [f64]) -> Reader<'a> {
        Reader {
            mode: Mode::Replay(values),
            prefix: String::new(),
            cursor: 0,
            records: Vec::new(),
            errors: Vec::new(),
        }
    }

    /// True when this is a replay pass.
    pub fn is_replay(&self) -> bool {
        matches!(self.mode, Mode::Replay(_))
    }

    /// Read the inputs of a sub-structure with `name` added to the path.
    pub fn within<T>(&mut self, name: &str, f: impl FnOnce(&mut Self) -> T) -> T {
        let len = self.prefix.len();
        if !self.prefix.is_empty() {
            self.prefix.push('.');
        }
        self.prefix.push_str(name);
        let out = f(self);
        self.prefix.truncate(len);
        out
    }

    /// Full dotted path of a field in the current section.
    pub fn path(&self, field: &str) -> String {
        let mut p = String::with_capacity(self.prefix.len() + 1 + field.len());
        p.push_str(&self.prefix);
        if !field.is_empty() {
            if !p.is_empty() {
                p.push('.');
            }
            p.push_str(field);
        }
        p
    }

    /// Record an error on a field of the current section.
    pub fn error(&mut self, field: &str, message: impl Into<String>) {
        let path = self.path(field);
        self.errors.push(InputError::invalid(path, message));
    }

    /// Record an error produced by a model constructor (its field is local to
    /// the current section).
    pub fn model_error(&mut self, e: InputError) {
        let e = e.within(&self.prefix);
        self.errors.push(e);
    }

    /// Read a required numeric input. `None` when it cannot be used (the
    /// error is recorded).
    pub fn num(
        &mut self,
        field: &str,
        value: &Value,
        dim: Dim,
        default_unit: &str,
        rule: Rule,
    ) -> Option<f64> {
        if let Mode::Replay(values) = self.mode {
            let v = values.get(self.cursor).copied();
            self.cursor += 1;
            // Perturbed values obey the same rule; a sample that breaks it is
            // reported by the study as a failed evaluation.
            return v.and_then(|v| {
                rule.apply(field, v)
                    .and_then(|v| plausible(field, v, dim))
                    .ok()
            });
        }
        let path = self.path(field);
        let parsed = if value.is_blank() {
            Err(InputError::new(&path, crate::error::Problem::Empty))
        } else {
            read_si(&path, value, dim, default_unit)
                .and_then(|v| rule.apply(&path, v))
                .and_then(|v| plausible(&path, v, dim))
        };
        let tol = match parse_tolerance(&value.tol, dim, default_unit) {
            Ok(t) => t,
            Err(msg) => {
                self.errors
                    .push(InputError::invalid(format!("{path}.tol"), msg));
                None
            }
        };
        let si = match parsed {
            Ok(v) => Some(v),
            Err(e) => {
                self.errors.push(e);
                None
            }
        };
        self.records.push(InputRecord {
            path,
            dim,
            text: value.text.clone(),
            si,
            tol,
            spread: value.spread,
            rule,
        });
        si
    }

    /// An input derived from others (e.g. a rate identified from field
    /// measurements), entered into the study with its own tolerance. In a
    /// replay pass it takes its value from the replayed slice like any input.
    pub fn derived(
        &mut self,
        field: &str,
        dim: Dim,
        value: f64,
        tol: Option<TolText>,
        rule: Rule,
    ) -> Option<f64> {
        if let Mode::Replay(values) = self.mode {
            let v = values.get(self.cursor).copied();
            self.cursor += 1;
            return v.and_then(|v| {
                rule.apply(field, v)
                    .and_then(|v| plausible(field, v, dim))
                    .ok()
            });
        }
        let path = self.path(field);
        let checked = rule
            .apply(&path, value)
            .and_then(|v| plausible(&path, v, dim));
        let si = match checked {
            Ok(v) => Some(v),
            Err(e) => {
                self.errors.push(e);
                None
            }
        };
        self.records.push(InputRecord {
            path,
            dim,
            text: String::new(),
            si,
            tol,
            spread: Spread::Normal,
            rule,
        });
        si
    }

    /// The tolerance of the input read last, removed from the tolerance
    /// study: for an input whose tolerance is a measurement uncertainty that
    /// the model propagates itself (field identification).
    pub fn take_tolerance(&mut self) -> Option<TolText> {
        match self.mode {
            Mode::Replay(_) => None,
            Mode::Record => self.records.last_mut().and_then(|r| r.tol.take()),
        }
    }

    /// Read an optional numeric input: blank text means `None` without error.
    pub fn opt(
        &mut self,
        field: &str,
        value: &Option<Value>,
        dim: Dim,
        default_unit: &str,
        rule: Rule,
    ) -> Option<f64> {
        match value {
            Some(v) if !v.is_blank() => self.num(field, v, dim, default_unit, rule),
            _ => None,
        }
    }

    /// Read an input that defaults to `default_si` when left blank; `None`
    /// (with the error recorded) when something unusable was entered.
    pub fn or(
        &mut self,
        field: &str,
        value: &Option<Value>,
        dim: Dim,
        default_unit: &str,
        rule: Rule,
        default_si: f64,
    ) -> Option<f64> {
        match value {
            // An invalid entry is not quietly replaced by the default: the
            // figures that depend on it go missing, naming the field.
            Some(v) if !v.is_blank() => self.num(field, v, dim, default_unit, rule),
            _ => Some(default_si),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn errors_are_collected_with_paths_and_reading_goes_on() {
        let mut r = Reader::record();
        let a = r.within("spring", |r| {
            r.num(
                "rate",
                &Value::new("-3 N/mm"),
                Dim::LinearRate,
                "N/mm",
                Rule::Positive,
            )
        });
        let b = r.within("part", |r| {
            r.num("mass", &Value::new("2 kg"), Dim::Mass, "kg", Rule::Positive)
        });
        assert_eq!(a, None);
        assert_eq!(b, Some(2.0));
        assert_eq!(r.errors.len(), 1);
        assert_eq!(r.errors[0].field, "spring.rate");
        assert_eq!(r.records.len(), 2);
    }

    #[test]
    fn absurd_magnitudes_are_refused_with_the_field_and_unit() {
        let mut r = Reader::record();
        for text in ["1e300 kg", "1e13 kg", "1e-13 kg", "-2e12 kg"] {
            let v = r.num("mass", &Value::new(text), Dim::Mass, "kg", Rule::Any);
            assert_eq!(v, None, "{text}");
        }
        assert_eq!(r.errors.len(), 4);
        assert!(r.errors.iter().all(|e| e.field == "mass"));
        assert!(r.errors[0].message().contains("1e12 kg"), "{}", r.errors[0]);
        // Zero, and the ends of the band, are accepted.
        for text in ["0", "-0", "1e12 kg", "1e-12 kg", "-1e12 kg"] {
            let v = r.num("mass", &Value::new(text), Dim::Mass, "kg", Rule::Any);
            assert!(v.is_some(), "{text}");
        }
        let vals = [1e300];
        let mut r = Reader::replay(&vals);
        let v = Value::new("ignored");
        assert_eq!(r.num("a", &v, Dim::Mass, "kg", Rule::Positive), None);
    }

    #[test]
    fn replay_hands_out_values_in_order_and_applies_rules() {
        let vals = [3.0, -1.0];
        let mut r = Reader::replay(&vals);
        let v = Value::new("ignored");
        assert_eq!(r.num("a", &v, Dim::Mass, "kg", Rule::Positive), Some(3.0));
        assert_eq!(r.num("b", &v, Dim::Mass, "kg", Rule::Positive), None);
    }
}
