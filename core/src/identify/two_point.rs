//! Two-point force-gauge identification: the force at two installed
//! lengths gives the rate, the length at which the force extrapolates to
//! zero (the free length of a compression spring), and the force at any
//! other length (a preload).
//!
//! Model: a straight line through the two readings,
//! F(L) = F₁ + s·(L − L₁), s = (F₂ − F₁)/(L₂ − L₁); rate k = |s|; zero-force
//! length L_z = L₁ − F₁/s (Hooke's law). A compression spring pushes harder
//! when shorter (s < 0); an extension spring pulls harder when longer
//! (s > 0), and its L_z lies below its closed length by F₀/k, so with the
//! measured closed length the initial tension F₀ = F(L_closed) follows.
//!
//! Uncertainties: each length and each force reading carries its own
//! standard uncertainty (independent); a gauge zero offset z (standard
//! uncertainty u_z) shifts both force readings alike, so it cancels in the
//! rate but not in L_z, F₀ or a preload. First-order propagation (GUM 5.1.2).

// The propagated functions index the input vector built beside them, of a
// length fixed in the same call.
#![allow(clippy::indexing_slicing)]

use super::{propagate, Estimate, In, Method, RateEstimate};
use crate::error::{check, InputError};
use serde::{Deserialize, Serialize};

/// Which kind of spring is on the gauge.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum GaugedSpring {
    /// Compression spring: force rises as the length shrinks.
    Compression,
    /// Extension spring: force rises as the length grows.
    Extension,
}

/// Inputs of a two-point gauge test (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct TwoPointInput {
    /// Spring kind.
    pub kind: GaugedSpring,
    /// First installed length L₁ (m).
    pub length_1: f64,
    /// Force at L₁ (N).
    pub force_1: f64,
    /// Second installed length L₂ (m).
    pub length_2: f64,
    /// Force at L₂ (N).
    pub force_2: f64,
    /// Standard uncertainty of each length reading (m).
    #[serde(default)]
    pub length_uncertainty: f64,
    /// Standard uncertainty of each force reading (N).
    #[serde(default)]
    pub force_uncertainty: f64,
    /// Standard uncertainty of the gauge's zero (N), common to both readings.
    #[serde(default)]
    pub gauge_zero_uncertainty: f64,
    /// Length at which to report the force (a preload), m.
    #[serde(default)]
    pub at_length: Option<f64>,
    /// Measured closed length of an extension spring (m), for F₀.
    #[serde(default)]
    pub closed_length: Option<f64>,
}

/// Results of a two-point gauge test.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TwoPointResult {
    /// Rate k = |ΔF/ΔL| (N/m).
    pub rate: RateEstimate,
    /// Length at which the force extrapolates to zero (m).
    pub zero_force_length: Estimate,
    /// Force at `at_length` (N), when asked.
    pub force_at_length: Option<Estimate>,
    /// Initial tension F₀ of an extension spring (N), when its closed length is given.
    pub initial_tension: Option<Estimate>,
}

/// Identify a spring from two gauge readings.
///
/// # Errors
/// Equal lengths; non-finite values; negative uncertainties; force readings
/// whose trend contradicts the spring kind (readings swapped or wrong kind).
pub fn two_point(input: &TwoPointInput) -> Result<TwoPointResult, InputError> {
    let l1 = check::positive("length_1", input.length_1)?;
    let l2 = check::positive("length_2", input.length_2)?;
    let f1 = check::finite("force_1", input.force_1)?;
    let f2 = check::finite("force_2", input.force_2)?;
    let ul = check::non_negative("length_uncertainty", input.length_uncertainty)?;
    let uf = check::non_negative("force_uncertainty", input.force_uncertainty)?;
    let uz = check::non_negative("gauge_zero_uncertainty", input.gauge_zero_uncertainty)?;
    if l1 == l2 {
        return Err(InputError::invalid(
            "length_2",
            "the two lengths must differ",
        ));
    }
    let slope = (f2 - f1) / (l2 - l1);
    let consistent = match input.kind {
        GaugedSpring::Compression => slope < 0.0,
        GaugedSpring::Extension => slope > 0.0,
    };
    if !consistent {
        return Err(InputError::invalid(
            "force_2",
            match input.kind {
                GaugedSpring::Compression => "a compression spring must push harder at the shorter length: check the readings",
                GaugedSpring::Extension => "an extension spring must pull harder at the longer length: check the readings",
            },
        ));
    }
    let basis = || "as entered".to_string();
    let inputs = |extra: Option<(&'static str, f64)>| {
        let mut v = vec![
            In {
                name: "length 1",
                value: l1,
                u: ul,
                basis: basis(),
            },
            In {
                name: "force 1",
                value: f1,
                u: uf,
                basis: basis(),
            },
            In {
                name: "length 2",
                value: l2,
                u: ul,
                basis: basis(),
            },
            In {
                name: "force 2",
                value: f2,
                u: uf,
                basis: basis(),
            },
            In {
                name: "gauge zero offset",
                value: 0.0,
                u: uz,
                basis: "common to both readings".into(),
            },
        ];
        if let Some((name, value)) = extra {
            v.push(In {
                name,
                value,
                u: ul,
                basis: basis(),
            });
        }
        v
    };
    // x = [L1, F1, L2, F2, z, (L)]: true forces are F_i − z.
    let line = |x: &[f64], l: f64| {
        let s = (x[3] - x[1]) / (x[2] - x[0]);
        (x[1] - x[4]) + s * (l - x[0])
    };
    let rate = propagate(|x| ((x[3] - x[1]) / (x[2] - x[0])).abs(), &inputs(None))?;
    let zero_force_length = propagate(
        |x| {
            let s = (x[3] - x[1]) / (x[2] - x[0]);
            x[0] - (x[1] - x[4]) / s
        },
        &inputs(None),
    )?;
    let force_at_length = match input.at_length {
        Some(l) => {
            let l = check::positive("at_length", l)?;
            Some(propagate(
                |x| line(x, x[5]),
                &inputs(Some(("length asked", l))),
            )?)
        }
        None => None,
    };
    let initial_tension = match (input.kind, input.closed_length) {
        (GaugedSpring::Extension, Some(l)) => {
            let l = check::positive("closed_length", l)?;
            Some(propagate(
                |x| line(x, x[5]),
                &inputs(Some(("closed length", l))),
            )?)
        }
        _ => None,
    };
    let mut notes = vec![
        "two points fix a straight line: a progressive or degressive spring, or friction between \
         loading and unloading readings, is not seen"
            .into(),
    ];
    if let Some(f0) = &initial_tension {
        if f0.value < 0.0 {
            notes.push("the line gives a negative initial tension at the closed length: check the readings".into());
        }
    }
    Ok(TwoPointResult {
        rate: RateEstimate {
            method: Method::TwoPointGauge,
            rate,
            spring_mass_included: None,
            formula: "k = |F₂ − F₁|/|L₂ − L₁| (Hooke's law)".into(),
            notes,
            frequency: None,
        },
        zero_force_length,
        force_at_length,
        initial_tension,
    })
}

impl TwoPointResult {
    /// Rate, zero-force length and requested force as figures.
    pub fn figures(&self) -> Vec<crate::figure::Figure> {
        use super::ids;
        use crate::figure::Figure;
        use crate::units::Dim;
        let src =
            "JCGM 100:2008 (GUM) 5.1.2 first-order propagation; straight line through two readings";
        let mut out = self.rate.figures();
        out.push(
            Figure::new(
                ids::IDENTIFY_FREE_LENGTH,
                "Length at zero force",
                Dim::Length,
                self.zero_force_length.value,
            )
            .method("L_z = L₁ − F₁/s, s = (F₂ − F₁)/(L₂ − L₁)")
            .source(src)
            .assume(&self.zero_force_length.budget_line()),
        );
        if let Some(f) = &self.force_at_length {
            out.push(
                Figure::new(
                    ids::IDENTIFY_FORCE_AT_LENGTH,
                    "Force at the installed length",
                    Dim::Force,
                    f.value,
                )
                .method("F(L) = F₁ + s·(L − L₁)")
                .source(src)
                .assume(&f.budget_line()),
            );
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;

    fn base() -> TwoPointInput {
        // Compression spring: 200 N at 80 mm, 500 N at 50 mm → k = 10 N/mm,
        // L₀ = 80 + 200/10 = 100 mm, force at 60 mm = 400 N (Hooke's law).
        TwoPointInput {
            kind: GaugedSpring::Compression,
            length_1: 0.080,
            force_1: 200.0,
            length_2: 0.050,
            force_2: 500.0,
            length_uncertainty: 0.0002,
            force_uncertainty: 2.0,
            gauge_zero_uncertainty: 1.0,
            at_length: Some(0.060),
            closed_length: None,
        }
    }

    #[test]
    fn rate_free_length_and_preload() {
        let r = two_point(&base()).unwrap();
        assert!((r.rate.rate.value - 10_000.0).abs() < REL_EXACT * 1e4);
        assert!((r.zero_force_length.value - 0.100).abs() < REL_EXACT);
        assert!((r.force_at_length.as_ref().unwrap().value - 400.0).abs() < REL_EXACT * 1e3);
        // The zero offset cancels in the rate but not in the free length.
        let rate_zero = r
            .rate
            .rate
            .inputs
            .iter()
            .find(|i| i.name == "gauge zero offset")
            .unwrap();
        assert!(rate_zero.contribution < REL_EXACT * 1e4);
        let l0_zero = r
            .zero_force_length
            .inputs
            .iter()
            .find(|i| i.name == "gauge zero offset")
            .unwrap();
        assert!(l0_zero.contribution > 0.0);
        // u(k) = √(2·u_F² + k²·2·u_L²)/ΔL (GUM 5.1.2 on k = ΔF/ΔL).
        let uk = (2.0 * 4.0 + 1e8 * 2.0 * 0.0002f64.powi(2)).sqrt() / 0.030;
        assert!(
            (r.rate.rate.standard_uncertainty / uk - 1.0).abs()
                < super::super::tests::REL_SENSITIVITY
        );
        assert_eq!(r.figures().len(), 3);
    }

    #[test]
    fn extension_spring_initial_tension() {
        // Extension: 60 N at 120 mm, 90 N at 150 mm → k = 1 N/mm; closed length
        // 100 mm → F₀ = 60 − 20 = 40 N; zero-force length 60 mm.
        let r = two_point(&TwoPointInput {
            kind: GaugedSpring::Extension,
            length_1: 0.120,
            force_1: 60.0,
            length_2: 0.150,
            force_2: 90.0,
            closed_length: Some(0.100),
            at_length: None,
            ..base()
        })
        .unwrap();
        assert!((r.initial_tension.unwrap().value - 40.0).abs() < REL_EXACT * 100.0);
        assert!((r.zero_force_length.value - 0.060).abs() < REL_EXACT);
    }

    #[test]
    fn swapped_readings_are_refused() {
        let e = two_point(&TwoPointInput {
            force_2: 100.0,
            ..base()
        })
        .unwrap_err();
        assert_eq!(e.field, "force_2");
        let e = two_point(&TwoPointInput {
            length_2: 0.080,
            ..base()
        })
        .unwrap_err();
        assert_eq!(e.field, "length_2");
    }
}
