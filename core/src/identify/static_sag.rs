//! Static identification: a known mass hung on (or set on) the spring and
//! the sag it causes: k = m·g/δ (Hooke's law).
//!
//! Uncertainties: the mass's standard uncertainty as entered; the sag read
//! with a tolerance ±a treated as a rectangular distribution, u(δ) = a/√3
//! (JCGM 100:2008, the GUM, 4.3.7). For a scale read to one division, taking
//! a = one division covers the two readings that make a sag (before and after
//! loading) and parallax; the GUM's value for a single rounded reading alone
//! would be half a division (u = division/√12). Gravity: g_n = 9.806 65 m/s²
//! unless a local value is entered; then u(g) = 0.026/√3 m/s², a rectangular
//! spread over the sea-level range 9.780–9.832 m/s² (common practice).
//!
//! Cross-check: a spring sagging δ under a load oscillates at
//! f = (1/2π)·√(g/δ) ≈ 15.76/√(δ in mm) Hz (single-degree-of-freedom
//! theory; reference-values.md §10, status R2/D).

// The propagated functions index the input vector built beside them, of a
// length fixed in the same call.
#![allow(clippy::indexing_slicing)]

use super::{propagate, Estimate, In, Method, RateEstimate};
use crate::error::{check, InputError};
use crate::G_N;
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

/// Standard uncertainty of g when no local value is entered: ±0.026 m/s²
/// (sea level, equator 9.780 to pole 9.832 m/s²) as a rectangular
/// distribution, u = 0.026/√3 (common practice).
pub const GRAVITY_HALF_WIDTH: f64 = 0.026;

/// Inputs of a static sag test (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct StaticInput {
    /// Known mass m (kg), including hook and holder.
    pub mass: f64,
    /// Standard uncertainty of the mass (kg).
    #[serde(default)]
    pub mass_uncertainty: f64,
    /// Measured sag δ (m).
    pub sag: f64,
    /// Reading tolerance ±a of the sag (m): half-width of a rectangular
    /// distribution, u = a/√3.
    pub sag_tolerance: f64,
    /// Local gravity (m/s²); default g_n with the spread described above.
    #[serde(default)]
    pub gravity: Option<f64>,
    /// Standard uncertainty of an entered local gravity (m/s²); default 0.
    #[serde(default)]
    pub gravity_uncertainty: Option<f64>,
}

fn gravity(g: Option<f64>, u: Option<f64>) -> Result<(f64, f64, String), InputError> {
    match g {
        Some(g) => {
            check::in_range("gravity", g, 9.7, 9.9)?;
            let u = check::non_negative("gravity_uncertainty", u.unwrap_or(0.0))?;
            Ok((g, u, "local value as entered".into()))
        }
        None => Ok((
            G_N,
            GRAVITY_HALF_WIDTH / 3f64.sqrt(),
            "g_n; rectangular ±0.026 m/s² for the sea-level range of g: u = a/√3".into(),
        )),
    }
}

/// Rate from a static sag: k = m·g/δ (N/m), with its uncertainty.
///
/// # Errors
/// Non-positive mass or sag; negative uncertainties; gravity outside
/// 9.7–9.9 m/s².
pub fn static_rate(input: &StaticInput) -> Result<RateEstimate, InputError> {
    let m = check::positive("mass", input.mass)?;
    let um = check::non_negative("mass_uncertainty", input.mass_uncertainty)?;
    let d = check::positive("sag", input.sag)?;
    let a = check::non_negative("sag_tolerance", input.sag_tolerance)?;
    let (g, ug, gbasis) = gravity(input.gravity, input.gravity_uncertainty)?;
    let rate = propagate(
        |x| x[0] * x[1] / x[2],
        &[
            In {
                name: "mass",
                value: m,
                u: um,
                basis: "as entered".into(),
            },
            In {
                name: "gravity",
                value: g,
                u: ug,
                basis: gbasis,
            },
            In {
                name: "sag",
                value: d,
                u: a / 3f64.sqrt(),
                basis: format!("rectangular ±{a:.3e} m: u = a/√3 (GUM 4.3.7)"),
            },
        ],
    )?;
    let mut notes = vec![
        "assumes a linear spring over the sag and no friction in guides (friction stops the mass short of its true sag, so the rate comes out high)".into(),
    ];
    if a > 0.1 * d {
        notes.push(
            "the reading tolerance exceeds 10 % of the sag: use a larger mass or a finer scale"
                .into(),
        );
    }
    Ok(RateEstimate {
        method: Method::StaticSag,
        rate,
        spring_mass_included: None,
        formula: "k = m·g/δ (Hooke's law)".into(),
        notes,
        frequency: frequency_from_sag(d, a, input.gravity).ok(),
    })
}

/// Natural frequency of a load on a spring from its static sag:
/// f = (1/2π)·√(g/δ) (Hz), ≈ 15.76/√(δ in mm) (SDOF theory), with the
/// uncertainty from the sag tolerance ±a (rectangular) and g.
///
/// # Errors
/// Non-positive sag or negative tolerance.
pub fn frequency_from_sag(
    sag: f64,
    sag_tolerance: f64,
    local_gravity: Option<f64>,
) -> Result<Estimate, InputError> {
    let d = check::positive("sag", sag)?;
    let a = check::non_negative("sag_tolerance", sag_tolerance)?;
    let (g, ug, gbasis) = gravity(local_gravity, None)?;
    propagate(
        |x| (x[0] / x[1]).sqrt() / (2.0 * PI),
        &[
            In {
                name: "gravity",
                value: g,
                u: ug,
                basis: gbasis,
            },
            In {
                name: "sag",
                value: d,
                u: a / 3f64.sqrt(),
                basis: format!("rectangular ±{a:.3e} m: u = a/√3 (GUM 4.3.7)"),
            },
        ],
    )
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;

    /// reference-values.md T27 tolerance (values printed to 4–5 s.f.).
    const REL_T27: f64 = 1e-3;

    #[test]
    fn t27_frequency_from_static_deflection() {
        // f = (1/2π)·√(g/δ) = 15.76/√(δ in mm) Hz (SDOF; reference-values.md
        // §10 and T27, status R2/D): δ = 1 mm → 15.761 Hz; 6 mm → 6.434 Hz;
        // 25 mm → 3.152 Hz.
        for (mm, hz) in [(1.0, 15.761), (6.0, 6.434), (25.0, 3.152)] {
            let f = frequency_from_sag(mm * 1e-3, 0.0, None).unwrap();
            assert!((f.value / hz - 1.0).abs() < REL_T27, "{mm} mm");
            assert!((f.value * mm.sqrt() / 15.76 - 1.0).abs() < REL_T27);
        }
    }

    #[test]
    fn static_rate_and_its_budget() {
        // 5 kg sagging 12.0 mm, scale read to ±0.5 mm, mass ±0.01 kg:
        // k = 5·9.806 65/0.012 = 4 086.1 N/m (Hooke's law).
        let r = static_rate(&StaticInput {
            mass: 5.0,
            mass_uncertainty: 0.01,
            sag: 0.012,
            sag_tolerance: 0.0005,
            gravity: None,
            gravity_uncertainty: None,
        })
        .unwrap();
        assert!((r.rate.value - 5.0 * G_N / 0.012).abs() < REL_EXACT * 5000.0);
        // u/k = √((0.01/5)² + (0.026/√3/9.806 65)² + (0.0005/√3/0.012)²).
        let rel = ((0.002f64).powi(2)
            + (GRAVITY_HALF_WIDTH / 3f64.sqrt() / G_N).powi(2)
            + (0.0005 / 3f64.sqrt() / 0.012).powi(2))
        .sqrt();
        assert!((r.rate.relative() / rel - 1.0).abs() < super::super::tests::REL_SENSITIVITY);
        assert_eq!(r.rate.inputs.len(), 3);
        assert!(r.rate.inputs[2].basis.contains("√3"));
        assert!(!r.figures()[0].assumptions.is_empty());
    }

    #[test]
    fn refusals() {
        let base = StaticInput {
            mass: 1.0,
            mass_uncertainty: 0.0,
            sag: 0.01,
            sag_tolerance: 0.0,
            gravity: None,
            gravity_uncertainty: None,
        };
        assert_eq!(
            static_rate(&StaticInput {
                sag: 0.0,
                ..base.clone()
            })
            .unwrap_err()
            .field,
            "sag"
        );
        assert_eq!(
            static_rate(&StaticInput {
                gravity: Some(98.0),
                ..base
            })
            .unwrap_err()
            .field,
            "gravity"
        );
    }
}
