//! Linear spring (Hooke's law): F = k·q, stored energy W = ½·k·(q₂² − q₁²).
//!
//! The plainest model: a rate, an optional free length, and the largest
//! admissible deflection, given directly or through the solid length
//! (`q_max = L₀ − L_c`). A preload is not a property of the spring but a
//! mechanism state (a deflection), see [`super::states`]. Source: Hooke's
//! law; the energy form is in reference-values.md §6 (status D).

use super::{Axis, ForceLaw, Spring, Travel};
use crate::error::{check, InputError};
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};

/// Inputs of a linear spring (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct LinearSpec {
    /// Spring rate k (N/m), > 0.
    pub rate: f64,
    /// Free (unloaded) length L₀ (m); needed only with `solid_length` or to
    /// convert installed lengths to deflections.
    #[serde(default)]
    pub free_length: Option<f64>,
    /// Largest admissible deflection (m), e.g. the catalogue's maximum travel.
    #[serde(default)]
    pub max_deflection: Option<f64>,
    /// Solid (block) length L_c (m); gives `q_max = L₀ − L_c`, needs
    /// `free_length`. When both limits are given the smaller travel governs.
    #[serde(default)]
    pub solid_length: Option<f64>,
}

/// A validated linear spring.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LinearSpring {
    spec: LinearSpec,
    max: f64,
}

impl LinearSpring {
    /// Validate the inputs.
    ///
    /// # Errors
    /// `rate` not positive; a length not positive; neither `max_deflection`
    /// nor `solid_length` given; `solid_length` without `free_length` or not
    /// shorter than it.
    pub fn new(spec: LinearSpec) -> Result<Self, InputError> {
        check::positive("rate", spec.rate)?;
        if let Some(l0) = spec.free_length {
            check::positive("free_length", l0)?;
        }
        let mut max = f64::INFINITY;
        if let Some(m) = spec.max_deflection {
            max = check::positive("max_deflection", m)?;
        }
        if let Some(lc) = spec.solid_length {
            check::positive("solid_length", lc)?;
            let Some(l0) = spec.free_length else {
                return Err(InputError::invalid(
                    "free_length",
                    "the free length is needed to turn a solid length into a maximum deflection",
                ));
            };
            if lc >= l0 {
                return Err(InputError::invalid(
                    "solid_length",
                    "must be shorter than the free length",
                ));
            }
            max = max.min(l0 - lc);
        }
        if !max.is_finite() {
            return Err(InputError::invalid(
                "max_deflection",
                "give the maximum deflection or the solid length, so travel beyond it can be refused",
            ));
        }
        Ok(Self { spec, max })
    }

    /// The inputs as entered.
    pub fn spec(&self) -> &LinearSpec {
        &self.spec
    }

    /// Largest admissible deflection (m).
    pub fn max_deflection(&self) -> f64 {
        self.max
    }

    /// Free length (m), when entered.
    pub fn free_length(&self) -> Option<f64> {
        self.spec.free_length
    }
}

impl Spring for LinearSpring {
    fn axis(&self) -> Axis {
        Axis::Linear
    }

    /// F = k·q (N); no hysteresis, both branches alike.
    fn force(&self, q: f64, _travel: Travel) -> f64 {
        self.spec.rate * q
    }

    /// W = ½·k·(q₂² − q₁²) (J), written as ½·k·(q₂ − q₁)·(q₂ + q₁) to avoid
    /// cancellation between close deflections.
    fn work(&self, q1: f64, q2: f64, _travel: Travel) -> f64 {
        0.5 * self.spec.rate * (q2 - q1) * (q2 + q1)
    }

    fn deflection_range(&self) -> (f64, f64) {
        (0.0, self.max)
    }

    fn rate(&self, _q: f64) -> f64 {
        self.spec.rate
    }

    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: "linear spring".into(),
            formula: "F = k·s; W = ½·k·(s₂² − s₁²)".into(),
            source: "Hooke's law".into(),
            status: SourceStatus::CommonPractice,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::super::testkit;
    use super::*;
    use crate::test_tol::REL_EXACT;
    use proptest::prelude::*;

    fn spring(k: f64, max: f64) -> LinearSpring {
        LinearSpring::new(LinearSpec {
            rate: k,
            free_length: None,
            max_deflection: Some(max),
            solid_length: None,
        })
        .unwrap()
    }

    #[test]
    fn energy_from_preload_to_latch() {
        // ½·k·(s₂² − s₁²) with k = 20 N/mm, 10 → 30 mm: ½·20 000·(0.03² − 0.01²) = 8 J
        // (Hooke's law, hand arithmetic).
        let s = spring(20_000.0, 0.05);
        assert!((s.work(0.01, 0.03, Travel::Unloading) - 8.0).abs() < REL_EXACT * 8.0);
    }

    #[test]
    fn solid_length_limits_travel_and_both_limits_take_the_smaller() {
        let s = LinearSpring::new(LinearSpec {
            rate: 1000.0,
            free_length: Some(0.1),
            max_deflection: Some(0.07),
            solid_length: Some(0.04),
        })
        .unwrap();
        assert!((s.max_deflection() - 0.06).abs() < REL_EXACT);
    }

    #[test]
    fn refuses_bad_inputs_naming_the_field() {
        let bad = |spec: LinearSpec| LinearSpring::new(spec).unwrap_err().field;
        let base = LinearSpec {
            rate: 1000.0,
            free_length: None,
            max_deflection: Some(0.01),
            solid_length: None,
        };
        assert_eq!(
            bad(LinearSpec {
                rate: -1.0,
                ..base.clone()
            }),
            "rate"
        );
        assert_eq!(
            bad(LinearSpec {
                max_deflection: None,
                ..base.clone()
            }),
            "max_deflection"
        );
        assert_eq!(
            bad(LinearSpec {
                solid_length: Some(0.02),
                ..base.clone()
            }),
            "free_length"
        );
        assert_eq!(
            bad(LinearSpec {
                solid_length: Some(0.2),
                free_length: Some(0.1),
                ..base
            }),
            "solid_length"
        );
    }

    #[test]
    fn out_of_range_deflection_is_refused() {
        let s = spring(1000.0, 0.02);
        assert!(s.check_deflection("q", 0.021).is_err());
        assert!(s.check_deflection("q", 0.02).is_ok());
    }

    proptest! {
        #[test]
        fn work_is_the_integral_of_force(k in 10.0..1e6f64, a in 0.0..1.0f64, b in 0.0..1.0f64) {
            let s = spring(k, 0.1);
            testkit::check_work_is_integral(&s, 0.1 * a, 0.1 * b, Travel::Loading);
            testkit::check_work_algebra(&s, 0.1 * a, 0.1 * b, 0.05, Travel::Loading);
            testkit::check_energy_monotone(&s, Travel::Unloading);
        }
    }
}
