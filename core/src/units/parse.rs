//! Parsing text typed by a user into an SI value of an expected kind.
//!
//! Grammar (hand-written tokenizer, no regex, called on every keystroke):
//! `[space] [sign] number [space] [unit] [space]`, where the sign is `+`, `-`
//! or `−` (U+2212), the number is `digits [sep digits] [e|E [sign] digits]`
//! with `.` or `,` as the decimal mark, and the unit is any spelling of the
//! table ([`super::table`]) for the expected [`Dim`]. A bare number takes the
//! field's default unit. The result is `number · unit.factor` (SI).
//!
//! Rules that keep a typed value from being read wrong by a factor of 1000:
//! - A comma followed by exactly three digits after one to three leading
//!   digits (`1,200`, `12,500`) could be a thousands separator or a decimal
//!   comma: it is refused ([`UnitError::AmbiguousComma`]), the message asks
//!   for `1200` or `1.2`. Any other decimal comma is accepted (`2,4`,
//!   `0,750`, `1234,567`: none of these can be a thousands group).
//! - Digit grouping is refused, never guessed: `12 500`, `12'500`,
//!   `1.200,5`, `1,200.5` all give [`UnitError::DigitGrouping`]. Grouping
//!   with spaces could be read unambiguously, but a space also separates the
//!   number from its unit (`5 1/min`), and a refusal costs one keystroke.
//! - The point is always the decimal mark (`1.200 in` is 1.2 in, as US
//!   drawings write it).
//! - Unit letter case is exact (`MPa` ≠ `mPa`); a case slip is refused with a
//!   suggestion.
//! - `lb` is the pound (mass); pound-force must be written `lbf`. A mass unit
//!   in a force field is refused with a suggestion (`did you mean "lbf"?`)
//!   rather than converted with g_n: typing a mass where a force is asked
//!   usually means the field was misread, and the tool should say so.

use super::table::{self, find_any, find_in, units_of, Unit};
use super::Dim;
use crate::error::{InputError, Problem};
use std::fmt;

/// Longest text accepted, in bytes. Real quantities are a few dozen bytes;
/// refusing a pasted page keeps a keystroke handler fast.
pub const MAX_INPUT_LEN: usize = 256;

/// Longest unit text echoed back in a message, in chars.
const MAX_ECHO: usize = 24;

/// Why a text could not be read as a quantity. [`UnitError::message`] turns
/// it into words naming the expected kind with examples.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum UnitError {
    /// Nothing but whitespace.
    Empty,
    /// Longer than [`MAX_INPUT_LEN`] bytes.
    TooLong,
    /// No number at the start of the text (`mm`, `abc`, `- 5`).
    NoNumber,
    /// A number that cannot be read (`1e`, a digit group after the unit ...).
    Malformed,
    /// NaN, infinity, or a value that overflows once converted.
    NotFinite,
    /// A number other than zero so small that it becomes zero once
    /// converted to SI (`4.9e-324 deg`): refused rather than read as 0.
    Underflow,
    /// A comma followed by exactly three digits: thousands or decimal?
    AmbiguousComma {
        /// The number as typed, e.g. `1,200`.
        number: String,
    },
    /// Thousands grouping (`12 500`, `12'500`, `1.200,5`).
    DigitGrouping,
    /// A bare number where the field has no default unit.
    MissingUnit,
    /// A unit no kind knows.
    UnknownUnit {
        /// The unit as typed.
        unit: String,
    },
    /// A known unit of another kind.
    WrongDimension {
        /// The unit as typed.
        unit: String,
        /// The kind the unit measures (first in table order).
        found: Dim,
    },
}

/// Two typical entries per kind, one SI and one US customary, shown in
/// messages. Each parses to its kind (checked by a test).
pub fn examples(dim: Dim) -> [&'static str; 2] {
    match dim {
        Dim::Ratio => ["0.8", "80 %"],
        Dim::Length => ["12.5 mm", "0.5 in"],
        Dim::Area => ["50 mm²", "0.08 in²"],
        Dim::Force => ["120 N", "27 lbf"],
        Dim::Mass => ["2.5 kg", "5.5 lb"],
        Dim::Energy => ["4 J", "3 ft·lbf"],
        Dim::LinearRate => ["25 N/mm", "140 lbf/in"],
        Dim::TorsionalRate => ["0.5 N·m/rad", "4.4 lbf·in/rad"],
        Dim::Speed => ["0.5 m/s", "1.6 ft/s"],
        Dim::AngularSpeed => ["10 rad/s", "95 rpm"],
        Dim::Acceleration => ["9.81 m/s²", "1.5 g"],
        Dim::Pressure => ["200 MPa", "29000 psi"],
        Dim::Angle => ["90°", "1.5 rad"],
        Dim::Torque => ["12 N·m", "106 lbf·in"],
        Dim::Inertia => ["0.02 kg·m²", "68 lb·in²"],
        Dim::Time => ["0.25 s", "40 ms"],
        Dim::Frequency => ["5 Hz", "600 cycles/h"],
        Dim::Power => ["750 W", "1 hp"],
        Dim::LinearDamping => ["200 N·s/m", "1.1 lbf·s/in"],
        Dim::QuadraticDamping => ["50 N·s²/m²", "0.0007 lbf·s²/in²"],
        Dim::Density => ["7850 kg/m³", "0.284 lb/in³"],
        Dim::Probability => ["0.05", "5 %"],
    }
}

impl UnitError {
    /// The error in words for a field expecting `expected`, ending with what
    /// would be acceptable: `expected a force, e.g. "120 N" or "27 lbf"`.
    pub fn message(&self, expected: Dim) -> String {
        let [a, b] = examples(expected);
        let want = format!("expected {}, e.g. \"{a}\" or \"{b}\"", expected.noun());
        match self {
            UnitError::Empty => format!("no value entered; {want}"),
            UnitError::TooLong => format!("too long to be a quantity; {want}"),
            UnitError::NoNumber => format!("no number found at the start; {want}"),
            UnitError::Malformed => format!("not a number that can be read; {want}"),
            UnitError::NotFinite => format!("not a finite number; {want}"),
            UnitError::Underflow => format!("too small to be a real value (it becomes 0); {want}"),
            UnitError::AmbiguousComma { number } => {
                let (thousands, decimal) = comma_readings(number);
                format!(
                    "\"{number}\" could mean {thousands} or {decimal}: write {thousands} or {decimal} \
                     (no thousands separator); {want}"
                )
            }
            UnitError::DigitGrouping => format!(
                "write the number without thousands separators (12500, not 12 500 or 12,500) \
                 and with one decimal mark; {want}"
            ),
            UnitError::MissingUnit => format!("a unit is needed; {want}"),
            UnitError::UnknownUnit { unit } => {
                let hint = suggest(unit, expected)
                    .map(|s| format!(" (did you mean \"{s}\"?)"))
                    .unwrap_or_default();
                let accepted: Vec<&str> = units_of(expected)
                    .map(|u| u.symbol)
                    .filter(|s| !s.is_empty())
                    .collect();
                let accepted = if accepted.is_empty() {
                    String::new()
                } else {
                    format!("; units: {}", accepted.join(", "))
                };
                format!("unknown unit \"{}\"{hint}; {want}{accepted}", echo(unit))
            }
            UnitError::WrongDimension { unit, found } => {
                let hint = suggest(unit, expected)
                    .map(|s| format!(" (did you mean \"{s}\"?)"))
                    .unwrap_or_default();
                format!(
                    "\"{}\" measures {}, not {}{hint}; {want}",
                    echo(unit),
                    kinds_of(unit, *found),
                    expected.noun()
                )
            }
        }
    }

    /// The error as an [`InputError`] for `field`, with
    /// [`Problem::Unit`] carrying [`UnitError::message`].
    pub fn into_input_error(self, field: &str, expected: Dim) -> InputError {
        InputError::new(
            field,
            Problem::Unit {
                message: self.message(expected),
            },
        )
    }
}

impl fmt::Display for UnitError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            UnitError::Empty => f.write_str("no value entered"),
            UnitError::TooLong => f.write_str("too long to be a quantity"),
            UnitError::NoNumber => f.write_str("no number found at the start"),
            UnitError::Malformed => f.write_str("not a number that can be read"),
            UnitError::NotFinite => f.write_str("not a finite number"),
            UnitError::Underflow => f.write_str("too small to be a real value"),
            UnitError::AmbiguousComma { number } => {
                write!(f, "\"{number}\": thousands separator or decimal comma?")
            }
            UnitError::DigitGrouping => f.write_str("thousands separators are not accepted"),
            UnitError::MissingUnit => f.write_str("a unit is needed"),
            UnitError::UnknownUnit { unit } => write!(f, "unknown unit \"{}\"", echo(unit)),
            UnitError::WrongDimension { unit, found } => {
                write!(f, "\"{}\" measures {}", echo(unit), found.noun())
            }
        }
    }
}

impl std::error::Error for UnitError {}

/// Parse `text` as a quantity of kind `dim` and return it in SI.
///
/// A bare number takes `default_unit` (a spelling from the table for `dim`;
/// an empty default means a plain number for [`Dim::Ratio`] and
/// [`Dim::Probability`], and "a unit must be typed" for other kinds). The
/// result is `number · factor`, with the factor of the unit typed (or of the
/// default). See the module documentation for the accepted grammar and the
/// comma and grouping rules.
///
/// # Errors
/// A [`UnitError`] saying why; [`UnitError::message`] words it for the user.
pub fn parse_quantity(text: &str, dim: Dim, default_unit: &str) -> Result<f64, UnitError> {
    parse_with_unit(text, dim, default_unit).map(|(v, _)| v)
}

/// As [`parse_quantity`], also returning the unit that was typed (or the
/// default), so a caller can show the value back in the user's own unit.
///
/// # Errors
/// A [`UnitError`] saying why.
pub fn parse_with_unit(
    text: &str,
    dim: Dim,
    default_unit: &str,
) -> Result<(f64, &'static Unit), UnitError> {
    if text.len() > MAX_INPUT_LEN {
        return Err(UnitError::TooLong);
    }
    let text = text.trim();
    if text.is_empty() {
        return Err(UnitError::Empty);
    }
    let (negative, rest) = split_sign(text);
    if starts_non_finite(rest) {
        return Err(UnitError::NotFinite);
    }
    let num = scan_number(rest)?;
    let after = rest.get(num.end..).unwrap_or("");
    check_grouping(after)?;
    if num.comma && num.frac_digits == 3 && could_be_thousands_group(num.int_part(rest)) {
        let mut number = String::new();
        if negative {
            number.push('-');
        }
        number.push_str(rest.get(..num.mantissa_end).unwrap_or(""));
        return Err(UnitError::AmbiguousComma { number });
    }
    let magnitude = num.value(rest)?;
    let unit_text = after.trim_start();
    let unit = resolve_unit(unit_text, dim, default_unit)?;
    let signed = if negative { -magnitude } else { magnitude };
    let si = unit.to_si(signed);
    if !si.is_finite() {
        return Err(UnitError::NotFinite);
    }
    if si == 0.0 && magnitude != 0.0 {
        return Err(UnitError::Underflow);
    }
    // No negative zero leaves the parser: `-0` is 0.
    Ok((if si == 0.0 { 0.0 } else { si }, unit))
}

/// Find the unit of kind `dim` spelled `unit_text`, or the default when the
/// text carries no unit.
fn resolve_unit(unit_text: &str, dim: Dim, default_unit: &str) -> Result<&'static Unit, UnitError> {
    if unit_text.is_empty() {
        return match find_in(dim, default_unit) {
            Some(u) => Ok(u),
            None if default_unit.trim().is_empty() => Err(UnitError::MissingUnit),
            None => Err(UnitError::UnknownUnit {
                unit: default_unit.to_string(),
            }),
        };
    }
    // Separators alone (`5 .`, `5 -`, `5 ·`) normalise to no unit at all;
    // they are a slip or a cut-off text, never the plain number.
    if table::Normalized::new(unit_text).next().is_none() {
        return Err(UnitError::UnknownUnit {
            unit: unit_text.to_string(),
        });
    }
    if let Some(u) = find_in(dim, unit_text) {
        return Ok(u);
    }
    if unit_text.starts_with(|c: char| c.is_ascii_digit()) {
        // `12 500 N`: a digit group after a space. (`5 1/min` was found above.)
        let digits = unit_text.bytes().take_while(u8::is_ascii_digit).count();
        return Err(if digits == 3 {
            UnitError::DigitGrouping
        } else {
            UnitError::Malformed
        });
    }
    match find_any(unit_text).next() {
        Some(other) => Err(UnitError::WrongDimension {
            unit: unit_text.to_string(),
            found: other.dim,
        }),
        None => Err(UnitError::UnknownUnit {
            unit: unit_text.to_string(),
        }),
    }
}

/// Leading sign: `+`, `-` or `−` (U+2212).
fn split_sign(text: &str) -> (bool, &str) {
    if let Some(r) = text.strip_prefix('+') {
        (false, r)
    } else if let Some(r) = text.strip_prefix('-') {
        (true, r)
    } else if let Some(r) = text.strip_prefix('−') {
        (true, r)
    } else {
        (false, text)
    }
}

/// `nan`, `inf`, `infinity` (any case) or `∞`.
fn starts_non_finite(rest: &str) -> bool {
    let head = rest.get(..3).unwrap_or("");
    head.eq_ignore_ascii_case("nan") || head.eq_ignore_ascii_case("inf") || rest.starts_with('∞')
}

/// Byte positions of a scanned number within the text after the sign.
struct Scanned {
    int_digits: usize,
    frac_digits: usize,
    comma: bool,
    /// End of the mantissa (digits and decimal mark).
    mantissa_end: usize,
    /// End of the number including the exponent.
    end: usize,
}

impl Scanned {
    fn int_part<'a>(&self, rest: &'a str) -> &'a str {
        rest.get(..self.int_digits).unwrap_or("")
    }

    /// The value of the unsigned number. The slice holds only ASCII digits,
    /// one decimal mark and an exponent, so the standard library's correctly
    /// rounded decimal conversion reads it; a decimal comma is first copied
    /// to a point in a stack buffer (heap only for absurdly long numbers).
    fn value(&self, rest: &str) -> Result<f64, UnitError> {
        let slice = rest.get(..self.end).ok_or(UnitError::Malformed)?;
        let parsed = if self.comma {
            let mut buf = [0u8; 64];
            if slice.len() <= buf.len() {
                for (dst, src) in buf.iter_mut().zip(slice.bytes()) {
                    *dst = if src == b',' { b'.' } else { src };
                }
                let s = std::str::from_utf8(buf.get(..slice.len()).unwrap_or(&[]))
                    .map_err(|_| UnitError::Malformed)?;
                s.parse::<f64>()
            } else {
                slice.replace(',', ".").parse::<f64>()
            }
        } else {
            slice.parse::<f64>()
        };
        let v = parsed.map_err(|_| UnitError::Malformed)?;
        // `1e-400` reads as 0.0: a number with a digit other than zero that
        // vanishes is refused, never read as zero.
        let mantissa = rest.get(..self.mantissa_end).unwrap_or("");
        if v == 0.0 && mantissa.bytes().any(|b| (b'1'..=b'9').contains(&b)) {
            return Err(UnitError::Underflow);
        }
        if v.is_finite() {
            Ok(v)
        } else {
            Err(UnitError::NotFinite)
        }
    }
}

/// Scan `digits [(.|,) digits] [(e|E) [+|-] digits]` at the start of `rest`.
fn scan_number(rest: &str) -> Result<Scanned, UnitError> {
    let b = rest.as_bytes();
    let digits_from = |i: usize| {
        b.get(i..)
            .map_or(0, |s| s.iter().take_while(|c| c.is_ascii_digit()).count())
    };
    let int_digits = digits_from(0);
    let mut i = int_digits;
    let mut frac_digits = 0;
    let mut comma = false;
    if let Some(&sep) = b.get(i) {
        if sep == b'.' || sep == b',' {
            let f = digits_from(i + 1);
            // A mark needs a digit on one side at least: `5.`, `.5` but not `.`.
            if int_digits > 0 || f > 0 {
                comma = sep == b',';
                frac_digits = f;
                i += 1 + f;
            }
        }
    }
    if int_digits == 0 && frac_digits == 0 {
        return Err(UnitError::NoNumber);
    }
    let mantissa_end = i;
    if let Some(&e) = b.get(i) {
        if e == b'e' || e == b'E' {
            let mut j = i + 1;
            if matches!(b.get(j), Some(b'+') | Some(b'-')) {
                j += 1;
            }
            let d = digits_from(j);
            if d > 0 {
                i = j + d;
            }
        }
    }
    Ok(Scanned {
        int_digits,
        frac_digits,
        comma,
        mantissa_end,
        end: i,
    })
}

/// Refuse what follows a number when it is a second decimal mark or a digit
/// group glued by an apostrophe or underscore: `1.200,5`, `1,2.5`, `12'500`.
fn check_grouping(after: &str) -> Result<(), UnitError> {
    let mut chars = after.chars();
    let first = chars.next();
    let second = chars.next();
    match (first, second) {
        (Some('.' | ',' | '\'' | '’' | '_'), Some(d)) if d.is_ascii_digit() => {
            Err(UnitError::DigitGrouping)
        }
        _ => Ok(()),
    }
}

/// Whether the digits before a comma could be the leading group of a number
/// written with thousands separators: one to three digits, not starting with
/// 0. (`0,750` and `1234,567` cannot be, so they are decimal commas.)
fn could_be_thousands_group(int_part: &str) -> bool {
    (1..=3).contains(&int_part.len()) && !int_part.starts_with('0')
}

/// The two readings of an ambiguous number: (`1200`, `1.2`) for `1,200`.
fn comma_readings(number: &str) -> (String, String) {
    let thousands: String = number.chars().filter(|&c| c != ',').collect();
    let decimal = number.replace(',', ".");
    let decimal = if decimal.contains('.') {
        decimal
            .trim_end_matches('0')
            .trim_end_matches('.')
            .to_string()
    } else {
        decimal
    };
    (thousands, decimal)
}

/// A unit of `expected` that the user probably meant: the same spelling in
/// another letter case (`mpa` → `MPa`), or with `lb` → `lbf` / `kg` → `kgf`
/// where a force-based kind is expected (`lb/in` → `lbf/in`). Suggested in
/// the message only, never accepted.
fn suggest(text: &str, expected: Dim) -> Option<&'static str> {
    if let Some(u) = units_of(expected).find(|u| {
        u.spellings()
            .any(|s| table::same_spelling_ignoring_case(s, text))
    }) {
        return Some(u.symbol);
    }
    for (from, to) in [("lbs", "lbf"), ("lb", "lbf"), ("kg", "kgf")] {
        let fixed = replace_unless_followed_by_f(text, from, to);
        if fixed != text {
            if let Some(u) = find_in(expected, &fixed) {
                return Some(u.symbol);
            }
        }
    }
    None
}

/// Replace each `from` not already followed by `f` (so `lbf` stays `lbf`).
fn replace_unless_followed_by_f(text: &str, from: &str, to: &str) -> String {
    let mut out = String::with_capacity(text.len() + 2);
    let mut rest = text;
    while let Some(pos) = rest.find(from) {
        let (head, tail) = rest.split_at(pos);
        out.push_str(head);
        let after = tail.get(from.len()..).unwrap_or("");
        if after.starts_with('f') {
            out.push_str(from);
        } else {
            out.push_str(to);
        }
        rest = after;
    }
    out.push_str(rest);
    out
}

/// The kinds a spelling measures, in words: `a torque or an energy`.
fn kinds_of(unit: &str, found: Dim) -> String {
    let mut dims: Vec<Dim> = Vec::new();
    for u in find_any(unit) {
        if !dims.contains(&u.dim) {
            dims.push(u.dim);
        }
    }
    if dims.is_empty() {
        dims.push(found);
    }
    let nouns: Vec<&str> = dims.iter().map(|d| d.noun()).collect();
    nouns.join(" or ")
}

/// A unit as typed, cut to [`MAX_ECHO`] chars for a message.
fn echo(unit: &str) -> String {
    if unit.chars().count() > MAX_ECHO {
        let mut s: String = unit.chars().take(MAX_ECHO).collect();
        s.push('…');
        s
    } else {
        unit.to_string()
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::units::table::{all_units, factor};

    /// Parses of a number and one multiplication by a factor: only
    /// floating-point rounding separates them (see `crate::test_tol`).
    const REL_EXACT: f64 = crate::test_tol::REL_EXACT;

    fn close(a: f64, b: f64) -> bool {
        (a - b).abs() <= REL_EXACT * b.abs().max(f64::MIN_POSITIVE)
    }

    fn p(text: &str, dim: Dim, default: &str) -> f64 {
        parse_quantity(text, dim, default).unwrap_or_else(|e| panic!("{text:?}: {e}"))
    }

    fn err(text: &str, dim: Dim, default: &str) -> UnitError {
        parse_quantity(text, dim, default).expect_err(text)
    }

    /// Check a list of (text, expected SI) for one kind.
    fn check(dim: Dim, default: &str, cases: &[(&str, f64)]) {
        for &(text, want) in cases {
            let got = p(text, dim, default);
            assert!(
                close(got, want),
                "{text:?} as {dim:?}: got {got}, want {want}"
            );
        }
    }

    #[test]
    fn every_spelling_of_every_unit_parses_to_its_factor() {
        for u in all_units() {
            for s in u.spellings() {
                let text = format!("2 {s}");
                let got = p(&text, u.dim, "");
                assert!(close(got, 2.0 * u.factor), "{text:?}: {got}");
                // And glued to the number, except where gluing changes the
                // reading (`2 1/min` vs `21/min`).
                if !s.starts_with(|c: char| c.is_ascii_digit()) && !s.is_empty() {
                    let glued = format!("2{s}");
                    let got = p(&glued, u.dim, "");
                    assert!(close(got, 2.0 * u.factor), "{glued:?}: {got}");
                }
            }
        }
    }

    #[test]
    fn spellings_named_in_the_task_are_all_accepted() {
        let lbf = factor::POUND_FORCE;
        let cases: &[(&str, Dim, f64)] = &[
            ("N·mm", Dim::Torque, 1e-3),
            ("N*mm", Dim::Torque, 1e-3),
            ("N.mm", Dim::Torque, 1e-3),
            ("Nmm", Dim::Torque, 1e-3),
            ("m/s²", Dim::Acceleration, 1.0),
            ("m/s^2", Dim::Acceleration, 1.0),
            ("m/s2", Dim::Acceleration, 1.0),
            ("°", Dim::Angle, factor::DEGREE),
            ("deg", Dim::Angle, factor::DEGREE),
            ("kg·m²", Dim::Inertia, 1.0),
            ("kg*m^2", Dim::Inertia, 1.0),
            ("lbf·in", Dim::Torque, lbf * factor::INCH),
            ("in·lbf", Dim::Torque, lbf * factor::INCH),
            ("in-lbf", Dim::Torque, lbf * factor::INCH),
            ("ft·lbf", Dim::Energy, lbf * factor::FOOT),
            ("ft-lbf", Dim::Energy, lbf * factor::FOOT),
            (
                "lb·ft²",
                Dim::Inertia,
                factor::POUND * factor::FOOT * factor::FOOT,
            ),
            ("N·m", Dim::Torque, 1.0),
            ("Nm", Dim::Energy, 1.0),
            ("g", Dim::Mass, 1e-3),
            ("g", Dim::Acceleration, factor::STANDARD_GRAVITY),
            ("g_n", Dim::Acceleration, factor::STANDARD_GRAVITY),
            ("gn", Dim::Acceleration, factor::STANDARD_GRAVITY),
        ];
        for &(unit, dim, f) in cases {
            let got = p(&format!("1 {unit}"), dim, "");
            assert!(close(got, f), "{unit} as {dim:?}: {got}");
        }
    }

    #[test]
    fn length() {
        check(
            Dim::Length,
            "mm",
            &[
                ("12.5", 0.0125),
                ("12.5 mm", 0.0125),
                ("12.5mm", 0.0125),
                ("0.5 in", 0.0127),
                ("0.5\"", 0.0127),
                ("2 ft", 0.6096),
                ("3 cm", 0.03),
                ("1.5 m", 1.5),
                ("250 µm", 250e-6),
                ("250 um", 250e-6),
            ],
        );
    }

    #[test]
    fn area() {
        check(
            Dim::Area,
            "mm²",
            &[
                ("50", 50e-6),
                ("50 mm2", 50e-6),
                ("50 mm^2", 50e-6),
                ("2 cm²", 2e-4),
                ("1 m²", 1.0),
                ("1 in²", 0.0254 * 0.0254),
                ("1 sq in", 0.0254 * 0.0254),
                ("1 ft^2", 0.3048 * 0.3048),
            ],
        );
    }

    #[test]
    fn force() {
        let lbf = 0.453_592_37 * 9.806_65;
        check(
            Dim::Force,
            "N",
            &[
                ("120", 120.0),
                ("120 N", 120.0),
                ("1.2 kN", 1200.0),
                ("1.2 KN", 1200.0),
                ("27 lbf", 27.0 * lbf),
                ("10 kgf", 98.0665),
                ("10 kp", 98.0665),
                ("5 daN", 50.0),
            ],
        );
    }

    #[test]
    fn mass() {
        check(
            Dim::Mass,
            "kg",
            &[
                ("2.5", 2.5),
                ("250 g", 0.25),
                ("5.5 lb", 5.5 * 0.453_592_37),
                ("5.5 lbs", 5.5 * 0.453_592_37),
                ("16 oz", 0.453_592_37),
                ("1.5 t", 1500.0),
            ],
        );
    }

    #[test]
    fn energy() {
        let lbf = 0.453_592_37 * 9.806_65;
        check(
            Dim::Energy,
            "J",
            &[
                ("4", 4.0),
                ("4 J", 4.0),
                ("2 kJ", 2000.0),
                ("500 mJ", 0.5),
                ("4 N·m", 4.0),
                ("4 Nm", 4.0),
                ("4000 N·mm", 4.0),
                ("4000 Nmm", 4.0),
                ("3 ft·lbf", 3.0 * 0.3048 * lbf),
                ("3 ft-lbf", 3.0 * 0.3048 * lbf),
                ("3 lbf·ft", 3.0 * 0.3048 * lbf),
                ("36 in·lbf", 36.0 * 0.0254 * lbf),
                ("36 in-lbf", 36.0 * 0.0254 * lbf),
                ("36 lbf·in", 36.0 * 0.0254 * lbf),
            ],
        );
    }

    #[test]
    fn linear_rate() {
        let lbf = 0.453_592_37 * 9.806_65;
        check(
            Dim::LinearRate,
            "N/mm",
            &[
                ("25", 25_000.0),
                ("2,4 N/mm", 2400.0),
                ("25000 N/m", 25_000.0),
                ("25 kN/m", 25_000.0),
                ("2.5 N/cm", 250.0),
                ("0.025 kN/mm", 25_000.0),
                ("3 lbf/in", 3.0 * lbf / 0.0254),
                ("36 lbf/ft", 36.0 * lbf / 0.3048),
                ("1 kgf/mm", 9806.65),
            ],
        );
    }

    #[test]
    fn torsional_rate() {
        let lbf = 0.453_592_37 * 9.806_65;
        let deg = std::f64::consts::PI / 180.0;
        check(
            Dim::TorsionalRate,
            "N·mm/deg",
            &[
                ("10", 0.01 / deg),
                ("0.5 N·m/rad", 0.5),
                ("0.5 Nm/rad", 0.5),
                ("500 N·mm/rad", 0.5),
                ("10 N·mm/deg", 0.01 / deg),
                ("10 N.mm/°", 0.01 / deg),
                ("1 N·m/deg", 1.0 / deg),
                ("4.4 lbf·in/rad", 4.4 * lbf * 0.0254),
                ("4.4 in-lbf/rad", 4.4 * lbf * 0.0254),
                ("0.1 lbf·in/deg", 0.1 * lbf * 0.0254 / deg),
                ("1 lbf·ft/rad", lbf * 0.3048),
                ("1 lbf·ft/deg", lbf * 0.3048 / deg),
            ],
        );
    }

    #[test]
    fn speed() {
        check(
            Dim::Speed,
            "m/s",
            &[
                ("0.5", 0.5),
                ("500 mm/s", 0.5),
                ("30 m/min", 0.5),
                ("36 km/h", 10.0),
                ("1 ft/s", 0.3048),
                ("10 in/s", 0.254),
                ("200 ft/min", 200.0 * 0.3048 / 60.0),
                ("200 fpm", 200.0 * 0.3048 / 60.0),
                ("1 mph", 0.447_04),
            ],
        );
    }

    #[test]
    fn angular_speed() {
        let tau = std::f64::consts::TAU;
        check(
            Dim::AngularSpeed,
            "rad/s",
            &[
                ("10", 10.0),
                ("10 rad/s", 10.0),
                ("180 deg/s", std::f64::consts::PI),
                ("180 °/s", std::f64::consts::PI),
                ("60 rpm", tau),
                ("60 rev/min", tau),
                ("60 r/min", tau),
                ("1 rev/s", tau),
            ],
        );
    }

    #[test]
    fn acceleration() {
        check(
            Dim::Acceleration,
            "m/s²",
            &[
                ("9.81", 9.81),
                ("9.81 m/s²", 9.81),
                ("9.81 m/s^2", 9.81),
                ("9.81 m/s2", 9.81),
                ("1000 mm/s²", 1.0),
                ("1 g", 9.806_65),
                ("1 g_n", 9.806_65),
                ("1 gn", 9.806_65),
                ("1 gₙ", 9.806_65),
                ("1 ft/s²", 0.3048),
                ("1 in/s^2", 0.0254),
            ],
        );
    }

    #[test]
    fn pressure() {
        let psi = 0.453_592_37 * 9.806_65 / (0.0254 * 0.0254);
        check(
            Dim::Pressure,
            "MPa",
            &[
                ("200", 200e6),
                ("200 MPa", 200e6),
                ("200 N/mm²", 200e6),
                ("200 N/mm^2", 200e6),
                ("190 N/cm²", 1.9e6),
                ("5 bar", 5e5),
                ("100 kPa", 1e5),
                ("81 GPa", 81e9),
                ("1 Pa", 1.0),
                ("29000 psi", 29_000.0 * psi),
                ("29 ksi", 29_000.0 * psi),
                ("11.5 Mpsi", 11.5e6 * psi),
                ("1 kgf/cm²", 98_066.5),
                ("1 kgf/mm²", 9_806_650.0),
            ],
        );
    }

    #[test]
    fn angle() {
        let pi = std::f64::consts::PI;
        check(
            Dim::Angle,
            "deg",
            &[
                ("90", pi / 2.0),
                ("100°", 100.0 * pi / 180.0),
                ("100 deg", 100.0 * pi / 180.0),
                ("100 º", 100.0 * pi / 180.0),
                ("1.75 rad", 1.75),
                ("0.5 rev", pi),
                ("2 turns", 2.0 * std::f64::consts::TAU),
            ],
        );
    }

    #[test]
    fn torque() {
        let lbf = 0.453_592_37 * 9.806_65;
        check(
            Dim::Torque,
            "N·m",
            &[
                ("12", 12.0),
                ("12 N·m", 12.0),
                ("12 Nm", 12.0),
                ("12 N*m", 12.0),
                ("12 N-m", 12.0),
                ("1200 N·cm", 12.0),
                ("12000 N·mm", 12.0),
                ("0.012 kN·m", 12.0),
                ("106 lbf·in", 106.0 * lbf * 0.0254),
                ("106 in·lbf", 106.0 * lbf * 0.0254),
                ("106 in-lbf", 106.0 * lbf * 0.0254),
                ("9 lbf·ft", 9.0 * lbf * 0.3048),
                ("9 ft·lbf", 9.0 * lbf * 0.3048),
                ("9 ft-lbf", 9.0 * lbf * 0.3048),
            ],
        );
    }

    #[test]
    fn inertia() {
        let lb = 0.453_592_37;
        let lbf = lb * 9.806_65;
        check(
            Dim::Inertia,
            "kg·m²",
            &[
                ("0.02", 0.02),
                ("0.02 kg·m²", 0.02),
                ("0.02 kg*m^2", 0.02),
                ("0.02 kgm2", 0.02),
                ("200 kg·cm²", 0.02),
                ("20000 kg·mm²", 0.02),
                ("1 g·cm²", 1e-7),
                ("68 lb·in²", 68.0 * lb * 0.0254 * 0.0254),
                ("68 lb*in^2", 68.0 * lb * 0.0254 * 0.0254),
                ("1 lb·ft²", lb * 0.3048 * 0.3048),
                ("1 lbf·in·s²", lbf * 0.0254),
                ("1 slug·ft²", lbf * 0.3048),
            ],
        );
    }

    #[test]
    fn time() {
        check(
            Dim::Time,
            "s",
            &[
                ("0.25", 0.25),
                ("40 ms", 0.04),
                ("2 min", 120.0),
                ("1.5 h", 5400.0),
                ("3 sec", 3.0),
                ("1 hr", 3600.0),
            ],
        );
    }

    #[test]
    fn frequency() {
        check(
            Dim::Frequency,
            "Hz",
            &[
                ("5", 5.0),
                ("5 Hz", 5.0),
                ("5 1/s", 5.0),
                ("5 /s", 5.0),
                ("5 s⁻¹", 5.0),
                ("60 /min", 1.0),
                ("60 1/min", 1.0),
                ("60 cycles/min", 1.0),
                ("3600 /h", 1.0),
                ("3600 cycles/h", 1.0),
                ("3600 per hour", 1.0),
                ("3600 1/h", 1.0),
            ],
        );
    }

    #[test]
    fn power() {
        let lbf = 0.453_592_37 * 9.806_65;
        check(
            Dim::Power,
            "W",
            &[
                ("750", 750.0),
                ("0.75 kW", 750.0),
                ("3600 J/h", 1.0),
                ("3.6 kJ/h", 1.0),
                ("1 ft·lbf/s", 0.3048 * lbf),
                ("3600 ft·lbf/h", 0.3048 * lbf),
                ("1 hp", 550.0 * 0.3048 * lbf),
            ],
        );
    }

    #[test]
    fn damping() {
        let lbf = 0.453_592_37 * 9.806_65;
        check(
            Dim::LinearDamping,
            "N·s/m",
            &[
                ("200", 200.0),
                ("200 N·s/m", 200.0),
                ("200 Ns/m", 200.0),
                ("0.2 N·s/mm", 200.0),
                ("0.2 kN·s/m", 200.0),
                ("1 lbf·s/in", lbf / 0.0254),
                ("1 lbf·s/ft", lbf / 0.3048),
            ],
        );
        check(
            Dim::QuadraticDamping,
            "N·s²/m²",
            &[
                ("50", 50.0),
                ("50 N·s²/m²", 50.0),
                ("50 N*s^2/m^2", 50.0),
                ("1 N·s²/mm²", 1e6),
                ("1 lbf·s²/in²", lbf / (0.0254 * 0.0254)),
                ("1 lbf·s²/ft²", lbf / (0.3048 * 0.3048)),
            ],
        );
    }

    #[test]
    fn density() {
        let lb = 0.453_592_37;
        check(
            Dim::Density,
            "kg/m³",
            &[
                ("7850", 7850.0),
                ("7.85 g/cm³", 7850.0),
                ("7.85 kg/dm³", 7850.0),
                ("7.85 kg/dm^3", 7850.0),
                ("7.85 t/m³", 7850.0),
                ("0.284 lb/in³", 0.284 * lb / 0.0254f64.powi(3)),
                ("490 lb/ft³", 490.0 * lb / 0.3048f64.powi(3)),
            ],
        );
    }

    #[test]
    fn ratio_and_probability() {
        check(Dim::Ratio, "", &[("0.8", 0.8), ("80 %", 0.8), ("80%", 0.8)]);
        check(Dim::Probability, "", &[("0.05", 0.05), ("5 %", 0.05)]);
        check(Dim::Probability, "%", &[("5", 0.05), ("5 %", 0.05)]);
    }

    #[test]
    fn signs_exponents_and_whitespace() {
        check(
            Dim::Force,
            "N",
            &[
                ("  12 N  ", 12.0),
                ("+12 N", 12.0),
                ("-12 N", -12.0),
                ("−12 N", -12.0),
                ("1.2e3 N", 1200.0),
                ("1.2E-3 kN", 1.2),
                ("1,2e3 N", 1200.0),
                ("1e+2", 100.0),
                (".5 N", 0.5),
                ("5. N", 5.0),
                ("12\u{a0}N", 12.0),
                ("12\u{202f}N", 12.0),
                ("12   N", 12.0),
            ],
        );
        assert_eq!(p("-0", Dim::Force, "N").to_bits(), 0.0f64.to_bits());
    }

    #[test]
    fn decimal_comma_alone_is_accepted() {
        check(
            Dim::Length,
            "mm",
            &[
                ("2,4", 0.0024),
                ("0,75", 0.000_75),
                ("0,750", 0.000_75),
                ("1234,567", 1.234_567),
                ("12,5 mm", 0.0125),
                ("1,2000", 0.0012),
                (",5", 0.0005),
            ],
        );
    }

    #[test]
    fn comma_with_three_digits_is_refused() {
        for text in ["1,200", "12,500 N", "-1,200 N", "999,000", "1,200e3 N"] {
            assert!(
                matches!(err(text, Dim::Force, "N"), UnitError::AmbiguousComma { .. }),
                "{text}"
            );
        }
        let msg = err("1,200", Dim::Force, "N").message(Dim::Force);
        assert!(msg.contains("1200") && msg.contains("1.2"), "{msg}");
        let msg = err("12,500 N", Dim::Force, "N").message(Dim::Force);
        assert!(msg.contains("12500") && msg.contains("12.5"), "{msg}");
    }

    #[test]
    fn digit_grouping_is_refused() {
        for text in [
            "12 500 N", "1 000", "12'500 N", "12_500", "1.200,5", "1,200.5", "1.2.3",
        ] {
            assert_eq!(
                err(text, Dim::Force, "N"),
                UnitError::DigitGrouping,
                "{text}"
            );
        }
        assert_eq!(err("12 5 N", Dim::Force, "N"), UnitError::Malformed);
    }

    /// Found by the property tests: `4.9e-324 deg` and `1e-400 mm` were
    /// read as 0, silently, so a field that allows zero took them.
    #[test]
    fn numbers_that_vanish_are_refused_not_read_as_zero() {
        for (text, dim) in [
            ("4.9e-324 deg", Dim::Angle),
            ("1e-400 mm", Dim::Length),
            ("1e-400", Dim::Ratio),
            ("-3e-330 mm", Dim::Length),
        ] {
            assert_eq!(err(text, dim, "mm"), UnitError::Underflow, "{text}");
        }
        assert_eq!(p("0e-400 mm", Dim::Length, "mm"), 0.0);
        assert_eq!(p("0.000", Dim::Ratio, ""), 0.0);
    }

    /// Found by the `units_parse` fuzz target: a unit made only of
    /// separators normalised to the empty spelling of a plain number, so
    /// `5 .`, `5 -` and `5 *` read as 5 where a ratio was expected.
    #[test]
    fn separators_alone_are_not_a_unit() {
        for text in ["5 .", "5 -", "5 *", "5 ·", "0 .", "5 . ·"] {
            assert!(
                matches!(err(text, Dim::Ratio, ""), UnitError::UnknownUnit { .. }),
                "{text}"
            );
        }
        assert_eq!(p("5.", Dim::Ratio, ""), 5.0);
        assert_eq!(p(" 5 ", Dim::Ratio, ""), 5.0);
    }

    #[test]
    fn empty_and_non_finite_are_refused() {
        assert_eq!(err("", Dim::Force, "N"), UnitError::Empty);
        assert_eq!(err("   ", Dim::Force, "N"), UnitError::Empty);
        for text in [
            "NaN", "nan N", "inf", "-inf", "Infinity", "∞", "1e999", "1e308 kN",
        ] {
            assert_eq!(err(text, Dim::Force, "N"), UnitError::NotFinite, "{text}");
        }
        for text in ["N", "abc", "- 5", ".", "--5", "e5"] {
            assert_eq!(err(text, Dim::Force, "N"), UnitError::NoNumber, "{text}");
        }
        let long = "1".repeat(MAX_INPUT_LEN + 1);
        assert_eq!(err(&long, Dim::Force, "N"), UnitError::TooLong);
    }

    #[test]
    fn bare_number_without_default_needs_a_unit() {
        assert_eq!(err("12", Dim::Force, ""), UnitError::MissingUnit);
        assert_eq!(p("12 N", Dim::Force, ""), 12.0);
        let msg = UnitError::MissingUnit.message(Dim::Force);
        assert!(msg.contains("a force"), "{msg}");
    }

    #[test]
    fn wrong_dimension_names_the_kinds_and_gives_examples() {
        let e = err("12 kg", Dim::Force, "N");
        assert_eq!(
            e,
            UnitError::WrongDimension {
                unit: "kg".into(),
                found: Dim::Mass
            }
        );
        let msg = e.message(Dim::Force);
        assert!(msg.contains("a mass") && msg.contains("a force"), "{msg}");
        assert!(
            msg.contains("\"120 N\"") && msg.contains("\"27 lbf\""),
            "{msg}"
        );
        assert!(msg.contains("did you mean \"kgf\""), "{msg}");

        let msg = err("5 N·m", Dim::LinearRate, "N/mm").message(Dim::LinearRate);
        assert!(msg.contains("an energy or a torque"), "{msg}");
        assert!(
            msg.contains("expected a spring rate, e.g. \"25 N/mm\""),
            "{msg}"
        );
    }

    #[test]
    fn pound_is_a_mass_and_pound_force_must_be_lbf() {
        let e = err("27 lb", Dim::Force, "N");
        assert!(matches!(
            e,
            UnitError::WrongDimension {
                found: Dim::Mass,
                ..
            }
        ));
        let msg = e.message(Dim::Force);
        assert!(msg.contains("did you mean \"lbf\""), "{msg}");
        let msg = err("3 lb/in", Dim::LinearRate, "N/mm").message(Dim::LinearRate);
        assert!(msg.contains("did you mean \"lbf/in\""), "{msg}");
        let msg = err("3 ft-lb", Dim::Energy, "J").message(Dim::Energy);
        assert!(msg.contains("did you mean \"ft·lbf\""), "{msg}");
        let msg = err("3 lbs", Dim::Force, "N").message(Dim::Force);
        assert!(msg.contains("did you mean \"lbf\""), "{msg}");
    }

    #[test]
    fn unknown_unit_names_the_kind_lists_units_and_suggests_case() {
        let e = err("12 furlongs", Dim::Length, "mm");
        assert_eq!(
            e,
            UnitError::UnknownUnit {
                unit: "furlongs".into()
            }
        );
        let msg = e.message(Dim::Length);
        assert!(msg.contains("unknown unit \"furlongs\""), "{msg}");
        assert!(
            msg.contains("expected a length, e.g. \"12.5 mm\" or \"0.5 in\""),
            "{msg}"
        );
        assert!(msg.contains("mm, cm"), "{msg}");
        // `mpa` is not accepted as MPa (a case slip is a factor 10⁹ in
        // principle), but the message suggests it.
        let msg = err("200 mpa", Dim::Pressure, "MPa").message(Dim::Pressure);
        assert!(msg.contains("did you mean \"MPa\""), "{msg}");
    }

    #[test]
    fn every_example_parses_to_its_kind() {
        for dim in Dim::ALL {
            for ex in examples(dim) {
                assert!(parse_quantity(ex, dim, "").is_ok(), "{ex:?} as {dim:?}");
            }
            assert!(!UnitError::Empty.message(dim).is_empty());
        }
    }

    #[test]
    fn into_input_error_carries_the_message() {
        let e = UnitError::Empty.into_input_error("wire_diameter", Dim::Length);
        assert_eq!(e.field, "wire_diameter");
        assert!(matches!(&e.problem, Problem::Unit { message } if message.contains("a length")));
    }

    #[test]
    fn parse_with_unit_returns_the_unit_typed() {
        let (v, u) = parse_with_unit("3 lbf/in", Dim::LinearRate, "N/mm").unwrap();
        assert_eq!(u.symbol, "lbf/in");
        assert!(close(v, 3.0 * factor::POUND_FORCE / factor::INCH));
        let (_, u) = parse_with_unit("3", Dim::LinearRate, "N/mm").unwrap();
        assert_eq!(u.symbol, "N/mm");
        let (_, u) = parse_with_unit("3 in-lbf", Dim::Torque, "N·m").unwrap();
        assert_eq!(u.symbol, "lbf·in");
    }

    mod props {
        use super::*;
        use proptest::prelude::*;

        fn any_dim() -> impl Strategy<Value = Dim> {
            (0..Dim::ALL.len()).prop_map(|i| Dim::ALL[i])
        }

        fn any_unit() -> impl Strategy<Value = &'static Unit> {
            (0..all_units().len()).prop_map(|i| &all_units()[i])
        }

        /// Text assembled from the pieces a quantity is made of, so the
        /// tokenizer's corners (signs, marks, exponents, groups, odd spaces)
        /// are hit far more often than by uniformly random strings.
        fn quantityish() -> impl Strategy<Value = String> {
            let piece = prop_oneof![
                Just("1"),
                Just("0"),
                Just("9"),
                Just("123"),
                Just(","),
                Just("."),
                Just("e"),
                Just("E"),
                Just("-"),
                Just("+"),
                Just("−"),
                Just(" "),
                Just("\u{a0}"),
                Just("'"),
                Just("_"),
                Just("mm"),
                Just("N"),
                Just("lbf"),
                Just("/"),
                Just("²"),
                Just("^"),
                Just("°"),
                Just("·"),
                Just("µ"),
                Just("inf"),
                Just("NaN"),
                Just("∞"),
                Just("é"),
                Just("\u{301}"),
                Just("\u{feff}"),
                Just("🙂"),
                Just("\0"),
            ];
            prop::collection::vec(piece, 0..24).prop_map(|v| v.concat())
        }

        proptest! {
            #[test]
            fn never_panics_on_arbitrary_text(text in any::<String>(), dim in any_dim()) {
                let _ = parse_quantity(&text, dim, "");
                if let Err(e) = parse_quantity(&text, dim, "mm") {
                    prop_assert!(!e.message(dim).is_empty());
                }
            }

            #[test]
            fn never_panics_on_quantity_like_text(text in quantityish(), dim in any_dim()) {
                match parse_quantity(&text, dim, examples(dim)[0].split(' ').nth(1).unwrap_or("")) {
                    Ok(v) => prop_assert!(v.is_finite()),
                    Err(e) => prop_assert!(!e.message(dim).is_empty()),
                }
            }

            #[test]
            fn never_panics_on_huge_text(
                text in prop::collection::vec(any::<char>(), 0..5000)
                    .prop_map(|v| v.into_iter().collect::<String>()),
                dim in any_dim(),
            ) {
                let _ = parse_quantity(&text, dim, "N");
                let padded = format!("1{text}");
                let _ = parse_quantity(&padded, dim, "N");
            }

            #[test]
            fn number_and_unit_parse_to_number_times_factor(
                unit in any_unit(),
                m in 1.0f64..10.0,
                e in -12i32..12,
                neg in any::<bool>(),
                exponent_form in any::<bool>(),
            ) {
                let x = if neg { -m } else { m } * 10f64.powi(e);
                let number = if exponent_form { format!("{x:e}") } else { format!("{x}") };
                let text = format!("{number} {}", unit.symbol);
                let got = parse_quantity(&text, unit.dim, "").unwrap();
                // Rust prints the shortest text that reads back to the same
                // f64, so the parse sees x itself: the product is bit-exact.
                prop_assert_eq!(got, x * unit.factor, "{}", text);
            }

            #[test]
            fn a_value_is_finite_whenever_parsing_succeeds(text in "\\PC{0,40}", dim in any_dim()) {
                if let Ok(v) = parse_quantity(&text, dim, "") {
                    prop_assert!(v.is_finite());
                }
            }
        }
    }

    #[test]
    fn long_unit_text_is_cut_in_messages() {
        let e = err("1 abcdefghijklmnopqrstuvwxyzabcdefgh", Dim::Force, "N");
        let msg = e.message(Dim::Force);
        assert!(msg.contains('…') && !msg.contains("xyzabcdefgh"), "{msg}");
    }
}
