//! Compare two identified rates: do they agree within their combined
//! standard uncertainty, and if not, which causes are likely.
//!
//! Test: E = |k_a − k_b|/u_c with u_c = √(u_a² + u_b²) (independent
//! results); disagreement when E > 2 (about 95 % coverage for normally
//! distributed errors; the GUM's expanded uncertainty with k = 2, JCGM
//! 100:2008 6.3.3). When both results use the same weighed mass the mass
//! error is shared and partly cancels in the difference; treating the results
//! as independent then overstates u_c, so the test flags less readily (it errs
//! towards "agree").
//!
//! Likely causes are returned as data, ordered by how well they explain the
//! sign of the difference:
//! - spring mass ignored in an oscillation test: the rate comes out low;
//! - hand timing: scatter either way, larger with few oscillations;
//! - friction: in guides or between coils, stops a static sag short (rate
//!   high) and spreads gauge readings between loading and unloading;
//! - gauge zero offset: cancels in a two-point rate but shifts free length and
//!   preload, and a single-point reading would be biased;
//! - a non-linear spring measured over different ranges by the two methods.

use super::{Method, RateEstimate};
use crate::figure::Figure;
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// Coverage factor of the agreement test (≈ 95 %).
pub const COVERAGE: f64 = 2.0;

/// A likely cause of disagreement.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum LikelyCause {
    /// The spring's own mass was left out of an oscillation test.
    SpringMassIgnored,
    /// Stopwatch timing error.
    Timing,
    /// Friction in guides or between coils.
    Friction,
    /// Force gauge zero offset.
    GaugeZero,
    /// The spring is not linear over the ranges measured.
    Nonlinearity,
}

/// A cause with the reasoning for this comparison.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Cause {
    /// The cause.
    pub cause: LikelyCause,
    /// Why it fits here.
    pub explanation: String,
}

/// Outcome of comparing two rates.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Comparison {
    /// k_a − k_b (N/m).
    pub difference: f64,
    /// Combined standard uncertainty √(u_a² + u_b²) (N/m).
    pub combined_uncertainty: f64,
    /// |k_a − k_b|/u_c.
    pub normalized_error: f64,
    /// Whether the difference exceeds [`COVERAGE`]·u_c.
    pub disagree: bool,
    /// Likely causes, most likely first (empty when the results agree).
    pub likely_causes: Vec<Cause>,
}

/// Compare two rate results (see the module doc).
pub fn compare(a: &RateEstimate, b: &RateEstimate) -> Comparison {
    let difference = a.rate.value - b.rate.value;
    let uc = a
        .rate
        .standard_uncertainty
        .hypot(b.rate.standard_uncertainty);
    let normalized_error = if uc > 0.0 {
        difference.abs() / uc
    } else if difference == 0.0 {
        0.0
    } else {
        f64::INFINITY
    };
    let disagree = normalized_error > COVERAGE;
    let mut likely_causes = Vec::new();
    if disagree {
        let pair = [a, b];
        let other_of = |r: &RateEstimate| if std::ptr::eq(r, a) { b } else { a };
        for r in pair {
            let other = other_of(r);
            if r.method == Method::Oscillation
                && r.spring_mass_included == Some(false)
                && r.rate.value < other.rate.value
            {
                likely_causes.push(Cause {
                    cause: LikelyCause::SpringMassIgnored,
                    explanation: "the oscillation result is the lower one and left out the spring's mass, which makes it low by m/(m + m_s/3)".into(),
                });
            }
        }
        if pair.iter().any(|r| r.method == Method::Oscillation) {
            likely_causes.push(Cause {
                cause: LikelyCause::Timing,
                explanation: "hand timing scatters by about a tenth of a second per press: time more oscillations or use a video".into(),
            });
        }
        for r in pair {
            if r.method == Method::StaticSag && r.rate.value > other_of(r).rate.value {
                likely_causes.push(Cause {
                    cause: LikelyCause::Friction,
                    explanation: "the static result is the higher one: friction in guides or between coils stops the mass short of its true sag".into(),
                });
            }
        }
        if pair.iter().any(|r| r.method == Method::TwoPointGauge) {
            likely_causes.push(Cause {
                cause: LikelyCause::Friction,
                explanation: "gauge readings taken partly while loading and partly while unloading differ by the friction band".into(),
            });
            likely_causes.push(Cause {
                cause: LikelyCause::GaugeZero,
                explanation: "a gauge zero offset cancels in a two-point rate but biases any single reading and the free length: re-zero and repeat".into(),
            });
        }
        if a.method != b.method {
            likely_causes.push(Cause {
                cause: LikelyCause::Nonlinearity,
                explanation: "the two methods load the spring over different ranges; a progressive or degressive spring gives different rates".into(),
            });
        }
        let mut seen = Vec::new();
        likely_causes.retain(|c| {
            let fresh = !seen.contains(&c.cause);
            seen.push(c.cause);
            fresh
        });
    }
    Comparison {
        difference,
        combined_uncertainty: uc,
        normalized_error,
        disagree,
        likely_causes,
    }
}

impl Comparison {
    /// The normalized error as a figure, with the causes as assumptions.
    pub fn figures(&self) -> Vec<Figure> {
        let mut f = Figure::new(
            super::ids::IDENTIFY_DISAGREEMENT,
            "Difference of the two rates in combined standard uncertainties",
            Dim::Ratio,
            self.normalized_error,
        )
        .method("E = |k_a − k_b|/√(u_a² + u_b²); disagreement when E > 2")
        .source("JCGM 100:2008 (GUM) 6.3.3, coverage factor k = 2")
        .assume("the two results are treated as independent");
        for c in &self.likely_causes {
            f = f.assume(&c.explanation);
        }
        vec![f]
    }
}

#[cfg(test)]
mod tests {
    use super::super::{dynamic_rate, static_rate, DynamicInput, StaticInput};
    use super::*;
    use crate::G_N;
    use std::f64::consts::PI;

    #[test]
    fn consistent_results_agree() {
        // A 1000 N/m spring: 2 kg sags 19.613 mm; 2 kg oscillates with
        // T = 2π·√(2/1000) (SDOF). Both methods return 1000 N/m.
        let st = static_rate(&StaticInput {
            mass: 2.0,
            mass_uncertainty: 0.005,
            sag: 2.0 * G_N / 1000.0,
            sag_tolerance: 0.0005,
            gravity: None,
            gravity_uncertainty: None,
        })
        .unwrap();
        let period = 2.0 * PI * (2.0f64 / 1000.0).sqrt();
        let dy = dynamic_rate(&DynamicInput {
            mass: 2.0,
            mass_uncertainty: 0.005,
            oscillations: 20,
            time: 20.0 * period,
            timing_uncertainty: None,
            spring_mass: Some(0.0),
            spring_mass_uncertainty: 0.0,
        })
        .unwrap();
        let c = compare(&st, &dy);
        assert!(!c.disagree && c.likely_causes.is_empty());
    }

    #[test]
    fn ignored_spring_mass_is_named_first() {
        // True rate 1000 N/m, spring 0.9 kg, load 1 kg: the true period uses
        // 1.3 kg; ignoring the spring gives k = 1000/1.3 = 769 N/m.
        let st = static_rate(&StaticInput {
            mass: 1.0,
            mass_uncertainty: 0.002,
            sag: G_N / 1000.0,
            sag_tolerance: 0.0002,
            gravity: None,
            gravity_uncertainty: None,
        })
        .unwrap();
        let period = 2.0 * PI * (1.3f64 / 1000.0).sqrt();
        let dy = dynamic_rate(&DynamicInput {
            mass: 1.0,
            mass_uncertainty: 0.002,
            oscillations: 30,
            time: 30.0 * period,
            timing_uncertainty: Some(0.05),
            spring_mass: None,
            spring_mass_uncertainty: 0.0,
        })
        .unwrap();
        let c = compare(&st, &dy);
        assert!(c.disagree);
        assert_eq!(c.likely_causes[0].cause, LikelyCause::SpringMassIgnored);
        assert!(c
            .likely_causes
            .iter()
            .any(|x| x.cause == LikelyCause::Friction));
        assert!(c
            .likely_causes
            .iter()
            .any(|x| x.cause == LikelyCause::Timing));
        assert_eq!(c.figures().len(), 1);
    }
}
