//! Robustness checks shared by the fuzz targets (`fuzz/`, libFuzzer on a
//! nightly toolchain) and the stable-toolchain regression tests
//! (`tests/fuzz_corpus.rs`, `tests/hostile_files.rs`): what must hold for
//! any input whatever.
//!
//! - A file is either refused with a [`FileError`] whose message says what is
//!   wrong, or read into a scenario.
//! - A scenario is always assessed (an input error removes only the figures
//!   that depend on it); every input error names its field path and says
//!   what is acceptable; every figure that is missing says why.
//! - No number anywhere in the report is NaN or infinite ([`scan`]): every
//!   figure value, every check value, limit and margin, every point of the
//!   time history and of the spring curve.
//! - Nothing panics, and every evaluation ends in bounded time (the fuzz
//!   runs use libFuzzer's `-timeout=`; the stable tests a generous wall-clock
//!   bound per case).

pub mod hostile;
pub mod mutate;
pub mod scan;
pub mod seeds;

use joulewise_core::assess::{assess, assess_summary, Study};
use joulewise_core::report::Report;
use joulewise_core::scenario::{FileError, Scenario};

/// Check one report; `Err` lists every violation.
///
/// # Errors
/// A non-finite number in the report, an input error without a field path
/// or a message, a missing figure without a reason.
pub fn check_report(r: &Report) -> Result<(), String> {
    let mut bad = scan::non_finite_paths(r);
    for e in &r.errors {
        if e.field.is_empty() || e.message().trim().is_empty() {
            bad.push(format!("input error without a field or message: {e:?}"));
        }
    }
    for f in &r.figures {
        if f.value.is_none() && f.missing.is_empty() {
            bad.push(format!("figure {} is missing without a reason", f.id));
        }
    }
    if serde_json::to_string(r).is_err() {
        bad.push("the report does not serialise to JSON".into());
    }
    if bad.is_empty() {
        Ok(())
    } else {
        Err(bad.join("\n"))
    }
}

/// Check a file error: it must say what is wrong.
///
/// # Errors
/// An empty message.
pub fn check_file_error(e: &FileError) -> Result<(), String> {
    if e.message.trim().is_empty() {
        Err(format!("file error without a message: {e:?}"))
    } else {
        Ok(())
    }
}

/// What became of one input.
#[derive(Debug)]
pub enum Outcome {
    /// Refused as a file, with the reason.
    Refused(FileError),
    /// Read and assessed; the number of input errors in the report.
    Assessed {
        /// Input errors in the nominal report.
        input_errors: usize,
    },
}

/// Assess a scenario in full and in summary and check both reports. When
/// `study_samples` is given and the scenario has at most `study_inputs`
/// toleranced inputs, the tolerance study runs too (Monte Carlo capped at
/// that many samples) and its result is checked.
///
/// # Errors
/// A violation of [`check_report`], or an assessment refused although the
/// scenario was read (the only refusal is a format version mismatch, which
/// `from_json` and `from_value` never let through).
pub fn check_scenario(s: &Scenario, study: Option<(u32, usize)>) -> Result<usize, String> {
    let r = assess(s).map_err(|e| format!("assess refused a scenario it was given: {e}"))?;
    check_report(&r).map_err(|e| format!("full report: {e}"))?;
    let summary =
        assess_summary(s).map_err(|e| format!("assess_summary refused a scenario: {e}"))?;
    check_report(&summary).map_err(|e| format!("summary report: {e}"))?;
    if let Some((samples, max_inputs)) = study {
        let mut capped = s.clone();
        capped.study.samples = capped.study.samples.min(samples);
        if let Some(mut st) = Study::new(&capped, &r) {
            let inputs = r.inputs.iter().filter(|i| !i.tolerance.is_empty()).count();
            if inputs <= max_inputs {
                let mut slices = 0;
                while !st.advance(samples as usize) {
                    slices += 1;
                    if slices > 1_000 {
                        return Err("the tolerance study does not finish".into());
                    }
                }
                let rep = st.finish();
                let bad = scan::non_finite_paths(&rep);
                if !bad.is_empty() {
                    return Err(format!("study: {}", bad.join("\n")));
                }
            }
        }
    }
    Ok(r.errors.len())
}

/// Read a file's bytes as a scenario and, when it reads, assess it; check
/// everything [`check_report`] and [`check_file_error`] require.
///
/// # Errors
/// Any violation, described.
pub fn check_bytes(bytes: &[u8], study: Option<(u32, usize)>) -> Result<Outcome, String> {
    match Scenario::from_bytes(bytes) {
        Err(e) => {
            check_file_error(&e)?;
            Ok(Outcome::Refused(e))
        }
        Ok(s) => {
            let input_errors = check_scenario(&s, study)?;
            Ok(Outcome::Assessed { input_errors })
        }
    }
}

/// Largest relative difference allowed when an SI value is formatted to 17
/// significant figures in a unit and read back: the division by the unit's
/// factor and the multiplication back each round once (2 × 2⁻⁵³ ≈ 2.2e-16),
/// and 17 digits identify a double exactly; 1e-15 leaves a few units of
/// rounding to spare.
pub const UNIT_ROUND_TRIP_REL: f64 = 1e-15;

/// Check the unit parser on one text: the first byte picks the kind of
/// quantity, the second the default unit (the field's default, none, or a
/// unit of the table), the rest is the text (read as UTF-8, invalid bytes
/// replaced). See [`check_unit_text`].
///
/// # Errors
/// Any violation, described.
pub fn check_unit_bytes(data: &[u8]) -> Result<(), String> {
    use joulewise_core::units::{all_units, Dim};
    let (Some(&d), Some(&u)) = (data.first(), data.get(1)) else {
        return Ok(());
    };
    let dim = Dim::ALL
        .get(usize::from(d) % Dim::ALL.len())
        .copied()
        .unwrap_or(Dim::Length);
    let table = all_units();
    let default = match u % 4 {
        0 => joulewise_core::scenario::resolve::default_unit(dim),
        1 => "",
        _ => table
            .get(usize::from(u) % table.len())
            .map_or("", |x| x.symbol),
    };
    let text = String::from_utf8_lossy(data.get(2..).unwrap_or(&[]));
    check_unit_text(&text, dim, default)
}

/// Check the unit parser on one text of kind `dim` with `default_unit`:
/// a value read is finite and never −0; formatted to 17 significant figures
/// in the unit that was typed and read back it is the same value (within
/// [`UNIT_ROUND_TRIP_REL`]); a refusal words its reason; a tolerance read
/// from the same text is finite and not negative.
///
/// # Errors
/// Any violation, described.
pub fn check_unit_text(
    text: &str,
    dim: joulewise_core::units::Dim,
    default_unit: &str,
) -> Result<(), String> {
    use joulewise_core::scenario::value::{parse_tolerance, TolText};
    use joulewise_core::units::{format_sig, parse_quantity, parse_with_unit};
    let read = parse_with_unit(text, dim, default_unit);
    let plain = parse_quantity(text, dim, default_unit);
    match (&read, &plain) {
        (Ok((v, _)), Ok(p)) if v.to_bits() == p.to_bits() => {}
        (Err(a), Err(b)) if a == b => {}
        _ => {
            return Err(format!(
                "{text:?}: parse_quantity and parse_with_unit disagree"
            ))
        }
    }
    match read {
        Ok((v, unit)) => {
            if !v.is_finite() || (v == 0.0 && v.is_sign_negative()) {
                return Err(format!("{text:?} as {dim:?} read as {v:?}"));
            }
            let shown = unit.from_si(v);
            // Below the normal range a division loses digits; nothing to
            // compare there.
            if shown.is_finite() && (shown == 0.0 || shown.abs() > 1e-290) {
                // Read back in the unit shown (a plain number's unit has
                // no symbol, so it is also the default for the read-back).
                let again = format!("{} {}", format_sig(shown, 17), unit.symbol);
                match parse_quantity(&again, dim, unit.symbol) {
                    Ok(w) => {
                        let tol = UNIT_ROUND_TRIP_REL * v.abs();
                        if (w - v).abs() > tol {
                            return Err(format!(
                                "{text:?} as {dim:?}: {v:e} shown as {again:?} reads back as {w:e}"
                            ));
                        }
                    }
                    Err(e) => {
                        return Err(format!(
                            "{text:?} as {dim:?}: {v:e} shown as {again:?} does not read back: {e}"
                        ))
                    }
                }
            }
        }
        Err(e) => {
            if e.message(dim).trim().is_empty() || e.to_string().trim().is_empty() {
                return Err(format!("{text:?}: refused without words"));
            }
            let ie = e.into_input_error("field", dim);
            if ie.field != "field" || ie.message().is_empty() {
                return Err(format!("{text:?}: input error lost its field"));
            }
        }
    }
    match parse_tolerance(text, dim, default_unit) {
        Ok(Some(TolText::Absolute(a) | TolText::Relative(a))) if !a.is_finite() || a < 0.0 => {
            Err(format!("{text:?}: tolerance read as {a}"))
        }
        Err(msg) if msg.trim().is_empty() => {
            Err(format!("{text:?}: tolerance refused without words"))
        }
        _ => Ok(()),
    }
}
