//! Dynamic identification: a known mass oscillating on the spring, N full
//! oscillations timed over t: T = t/N, k = 4π²·(m + m_s/3)/T² (single
//! degree of freedom; the spring's own mass enters with Rayleigh's share
//! one third, reference-values.md §10, status R).
//!
//! Timing uncertainty: a person with a stopwatch. Human reaction time to a
//! visual cue is around 0.2 s, but when timing a periodic motion the person
//! anticipates the turning point, so most of that delay is common to the
//! start and the stop press and cancels in t. What remains is the scatter of
//! each press, of the order of 0.05–0.1 s (from memory: not checked against a
//! study). The default is a standard uncertainty of 0.1 s on the total time
//! t (two presses of about 0.07 s each, combined). Timing 20 or more
//! oscillations makes this small against t.
//!
//! The Rayleigh share 1/3 is exact for a load much heavier than the spring;
//! it rises towards 4/π² ≈ 0.405 as the load becomes light (same source).
//! Light damping lengthens the period by a negligible amount (second order
//! in the damping ratio).

// The propagated functions index the input vector built beside them, of a
// length fixed in the same call.
#![allow(clippy::indexing_slicing)]

use super::{propagate, Estimate, In, Method, RateEstimate};
use crate::error::{check, InputError};
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

/// Default standard uncertainty of a hand-timed total time (s); see the
/// module doc (from memory).
pub const DEFAULT_TIMING_UNCERTAINTY: f64 = 0.1;

/// Inputs of an oscillation test (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct DynamicInput {
    /// Oscillating mass m (kg), including hook and holder.
    pub mass: f64,
    /// Standard uncertainty of the mass (kg).
    #[serde(default)]
    pub mass_uncertainty: f64,
    /// Number N of full oscillations timed (≥ 1).
    pub oscillations: u32,
    /// Total time t for the N oscillations (s).
    pub time: f64,
    /// Standard uncertainty of t (s); default 0.1 s (hand timing).
    #[serde(default)]
    pub timing_uncertainty: Option<f64>,
    /// Mass of the spring itself (kg), if known.
    #[serde(default)]
    pub spring_mass: Option<f64>,
    /// Standard uncertainty of the spring mass (kg).
    #[serde(default)]
    pub spring_mass_uncertainty: f64,
}

struct Checked {
    m: f64,
    um: f64,
    n: f64,
    t: f64,
    ut: f64,
    ms: f64,
    ums: f64,
    timing_basis: String,
}

fn checked(input: &DynamicInput) -> Result<Checked, InputError> {
    let m = check::positive("mass", input.mass)?;
    let um = check::non_negative("mass_uncertainty", input.mass_uncertainty)?;
    if input.oscillations == 0 {
        return Err(InputError::invalid(
            "oscillations",
            "time at least one full oscillation",
        ));
    }
    let t = check::positive("time", input.time)?;
    let (ut, timing_basis) = match input.timing_uncertainty {
        Some(u) => (
            check::non_negative("timing_uncertainty", u)?,
            "as entered".to_string(),
        ),
        None => (
            DEFAULT_TIMING_UNCERTAINTY,
            "default for hand timing, two presses (from memory)".to_string(),
        ),
    };
    let ms = match input.spring_mass {
        Some(v) => check::non_negative("spring_mass", v)?,
        None => 0.0,
    };
    let ums = check::non_negative("spring_mass_uncertainty", input.spring_mass_uncertainty)?;
    Ok(Checked {
        m,
        um,
        n: f64::from(input.oscillations),
        t,
        ut,
        ms,
        ums,
        timing_basis,
    })
}

/// Rate from timed oscillations: k = 4π²·N²·(m + m_s/3)/t² (N/m), with its
/// uncertainty.
///
/// # Errors
/// Non-positive mass or time; zero oscillations; negative uncertainties.
pub fn dynamic_rate(input: &DynamicInput) -> Result<RateEstimate, InputError> {
    let c = checked(input)?;
    let n = c.n;
    let rate = propagate(
        |x| 4.0 * PI * PI * n * n * (x[0] + x[2] / 3.0) / (x[1] * x[1]),
        &[
            In {
                name: "mass",
                value: c.m,
                u: c.um,
                basis: "as entered".into(),
            },
            In {
                name: "time",
                value: c.t,
                u: c.ut,
                basis: c.timing_basis.clone(),
            },
            In {
                name: "spring mass",
                value: c.ms,
                u: c.ums,
                basis: "as entered".into(),
            },
        ],
    )?;
    let mut notes = Vec::new();
    if input.spring_mass.is_none() {
        notes.push(
            "spring mass ignored: the rate comes out low by the factor m/(m + m_s/3); weigh the spring if it can be removed"
                .into(),
        );
    } else if c.ms > 0.5 * c.m {
        notes.push(
            "spring mass exceeds half the load: Rayleigh's one third understates its share (up to 4/π² ≈ 0.405)"
                .into(),
        );
    }
    if c.ut > 0.02 * c.t {
        notes.push("timing uncertainty exceeds 2 % of the time: time more oscillations".into());
    }
    Ok(RateEstimate {
        method: Method::Oscillation,
        rate,
        spring_mass_included: Some(input.spring_mass.is_some()),
        frequency: oscillation_frequency(input).ok(),
        formula: "k = 4π²·(m + m_s/3)/T², T = t/N (SDOF with Rayleigh's spring-mass share)".into(),
        notes,
    })
}

/// Measured oscillation frequency f = N/t (Hz) with its uncertainty, to set
/// beside [`super::frequency_from_sag`].
///
/// # Errors
/// As [`dynamic_rate`].
pub fn oscillation_frequency(input: &DynamicInput) -> Result<Estimate, InputError> {
    let c = checked(input)?;
    let n = c.n;
    propagate(
        |x| n / x[0],
        &[In {
            name: "time",
            value: c.t,
            u: c.ut,
            basis: c.timing_basis,
        }],
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;

    #[test]
    fn rate_from_period_with_and_without_spring_mass() {
        // 2 kg, 20 oscillations in 10 s: T = 0.5 s, k = 4π²·2/0.25 = 315.83 N/m;
        // with a 0.3 kg spring: 4π²·2.1/0.25 (SDOF with Rayleigh share).
        let base = DynamicInput {
            mass: 2.0,
            mass_uncertainty: 0.0,
            oscillations: 20,
            time: 10.0,
            timing_uncertainty: None,
            spring_mass: None,
            spring_mass_uncertainty: 0.0,
        };
        let a = dynamic_rate(&base).unwrap();
        assert!((a.rate.value - 4.0 * PI * PI * 2.0 / 0.25).abs() < REL_EXACT * 400.0);
        // u_k/k = 2·u_t/t = 2 % with the 0.1 s default.
        assert!((a.rate.relative() - 0.02).abs() < super::super::tests::REL_SENSITIVITY);
        assert!(a.notes.iter().any(|n| n.contains("spring mass ignored")));
        let b = dynamic_rate(&DynamicInput {
            spring_mass: Some(0.3),
            ..base.clone()
        })
        .unwrap();
        assert!((b.rate.value - 4.0 * PI * PI * 2.1 / 0.25).abs() < REL_EXACT * 400.0);
        assert_eq!(b.spring_mass_included, Some(true));
        let f = oscillation_frequency(&base).unwrap();
        assert!((f.value - 2.0).abs() < REL_EXACT);
    }

    #[test]
    fn refusals() {
        let e = dynamic_rate(&DynamicInput {
            mass: 1.0,
            mass_uncertainty: 0.0,
            oscillations: 0,
            time: 5.0,
            timing_uncertainty: None,
            spring_mass: None,
            spring_mass_uncertainty: 0.0,
        })
        .unwrap_err();
        assert_eq!(e.field, "oscillations");
    }
}
