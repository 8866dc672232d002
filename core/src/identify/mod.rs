//! Field identification of an undocumented spring: its rate from simple
//! measurements, each with a propagated standard uncertainty.
//!
//! Methods: [`static_sag`] (known mass, measured sag: k = m·g/δ),
//! [`dynamic`] (known mass, N oscillations timed: k = 4π²·(m + m_s/3)/T²),
//! [`two_point`](mod@two_point) (forces at two lengths: rate, free length, preload), and
//! [`compare`](mod@compare) (do two results agree within their combined uncertainty, and
//! if not, what is the likely cause). [`static_sag::frequency_from_sag`]
//! gives f = (1/2π)·√(g/δ) as a cross-check on a timed oscillation.
//!
//! Uncertainty: first-order propagation of independent input uncertainties
//! (JCGM 100:2008, the GUM, clause 5.1.2: u_c² = Σ (∂f/∂x_i)²·u²(x_i)). The
//! sensitivity coefficients ∂f/∂x_i are central differences of the model
//! function with a step of 10⁻⁶ of the input's magnitude (the models are
//! smooth products and quotients, so the difference quotient is exact to
//! about 10⁻¹⁰ relative). Each result lists every input with its value,
//! standard uncertainty, how that uncertainty was obtained, its sensitivity
//! coefficient and its contribution |c_i|·u(x_i). Standard uncertainties are
//! at coverage factor k = 1; double them for ≈ 95 % coverage.

pub mod compare;
pub mod dynamic;
pub mod static_sag;
pub mod two_point;

pub use compare::{compare, Cause, Comparison, LikelyCause};
pub use dynamic::{dynamic_rate, DynamicInput};
pub use static_sag::{frequency_from_sag, static_rate, StaticInput};
pub use two_point::{two_point, GaugedSpring, TwoPointInput, TwoPointResult};

use crate::error::InputError;
use crate::figure::Figure;
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// Figure identifiers of the identification results (they extend
/// `crate::figure::ids`).
pub mod ids {
    /// Identified spring rate (N/m).
    pub const IDENTIFY_RATE: &str = "identify.rate";
    /// Spring rate from the second (cross-check) method (N/m).
    pub const IDENTIFY_RATE_CHECK: &str = "identify.rate_check";
    /// Length at which the gauged force extrapolates to zero (m).
    pub const IDENTIFY_FREE_LENGTH: &str = "identify.free_length";
    /// Force at the requested installed length (N).
    pub const IDENTIFY_FORCE_AT_LENGTH: &str = "identify.force_at_length";
    /// Natural frequency (Hz).
    pub const IDENTIFY_NATURAL_FREQUENCY: &str = "identify.natural_frequency";
    /// Difference of two rate results in combined standard uncertainties.
    pub const IDENTIFY_DISAGREEMENT: &str = "identify.disagreement";
}

/// One input of a measurement model with its uncertainty budget line.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct InputUncertainty {
    /// Input name, e.g. `mass`.
    pub name: String,
    /// Value (SI).
    pub value: f64,
    /// Standard uncertainty u(x) (SI, k = 1).
    pub standard_uncertainty: f64,
    /// How u(x) was obtained, e.g. `rectangular ±0.5 mm: u = a/√3`.
    pub basis: String,
    /// Sensitivity coefficient ∂f/∂x.
    pub sensitivity: f64,
    /// Contribution |∂f/∂x|·u(x) to the result's uncertainty (SI of the result).
    pub contribution: f64,
}

/// A value with its combined standard uncertainty and budget.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Estimate {
    /// Best estimate (SI).
    pub value: f64,
    /// Combined standard uncertainty u_c (SI, k = 1).
    pub standard_uncertainty: f64,
    /// The inputs and their contributions.
    pub inputs: Vec<InputUncertainty>,
}

impl Estimate {
    /// Relative standard uncertainty u_c/|value| (∞ for a zero value).
    pub fn relative(&self) -> f64 {
        if self.value == 0.0 {
            f64::INFINITY
        } else {
            self.standard_uncertainty / self.value.abs()
        }
    }

    /// A one-line summary of the budget for a figure's assumptions.
    pub fn budget_line(&self) -> String {
        let parts: Vec<String> = self
            .inputs
            .iter()
            .filter(|i| i.standard_uncertainty > 0.0)
            .map(|i| {
                format!(
                    "{} (u = {:.3e}, {})",
                    i.name, i.standard_uncertainty, i.basis
                )
            })
            .collect();
        format!(
            "standard uncertainty u = {:.3e} ({:.2} %, k = 1) from {}",
            self.standard_uncertainty,
            100.0 * self.relative(),
            if parts.is_empty() {
                "no stated input uncertainty".into()
            } else {
                parts.join("; ")
            }
        )
    }
}

/// An input to [`propagate`]: name, value, standard uncertainty, basis.
pub(crate) struct In<'a> {
    pub name: &'a str,
    pub value: f64,
    pub u: f64,
    pub basis: String,
}

/// First-order (GUM 5.1.2) propagation through `f` with independent inputs;
/// sensitivities by central differences (step 10⁻⁶ of the input's scale,
/// 10⁻⁹ absolute for an input that is zero with zero uncertainty).
///
/// # Errors
/// Readings of extreme size for which the value, a sensitivity or the
/// combined uncertainty is not a finite number: the error names the input
/// whose contribution failed (its name with `_` for spaces), or the first
/// input when the value itself failed.
pub(crate) fn propagate(
    f: impl Fn(&[f64]) -> f64,
    inputs: &[In<'_>],
) -> Result<Estimate, InputError> {
    let e = propagate_unchecked(f, inputs);
    let field = |name: &str| name.replace(' ', "_");
    let first = inputs.first().map_or("value", |i| i.name);
    if !e.value.is_finite() {
        return Err(InputError::invalid(
            field(first),
            "these readings give no finite value: check their sizes and units",
        ));
    }
    if let Some(bad) = e
        .inputs
        .iter()
        .find(|i| !i.sensitivity.is_finite() || !i.contribution.is_finite())
    {
        return Err(InputError::invalid(
            field(&bad.name),
            "this reading is of a size for which the uncertainty cannot be computed: check its size and unit",
        ));
    }
    if !e.standard_uncertainty.is_finite() {
        return Err(InputError::invalid(
            field(first),
            "these readings give no finite uncertainty: check their sizes and units",
        ));
    }
    Ok(e)
}

fn propagate_unchecked(f: impl Fn(&[f64]) -> f64, inputs: &[In<'_>]) -> Estimate {
    let x: Vec<f64> = inputs.iter().map(|i| i.value).collect();
    let value = f(&x);
    let mut budget = Vec::with_capacity(inputs.len());
    let mut sum_sq = 0.0;
    for (k, inp) in inputs.iter().enumerate() {
        // Step 10⁻⁶ of the input's scale; an input that is exactly zero with
        // no uncertainty (an omitted spring mass, a zero offset) gets an
        // absolute step so its sensitivity is still reported correctly.
        let scale = inp.value.abs().max(inp.u);
        let h = if scale > 0.0 { 1e-6 * scale } else { 1e-9 };
        let mut xp = x.clone();
        let mut xm = x.clone();
        if let (Some(p), Some(m)) = (xp.get_mut(k), xm.get_mut(k)) {
            *p += h;
            *m -= h;
        }
        let c = (f(&xp) - f(&xm)) / (2.0 * h);
        let contribution = (c * inp.u).abs();
        sum_sq += contribution * contribution;
        budget.push(InputUncertainty {
            name: inp.name.into(),
            value: inp.value,
            standard_uncertainty: inp.u,
            basis: inp.basis.clone(),
            sensitivity: c,
            contribution,
        });
    }
    Estimate {
        value,
        standard_uncertainty: sum_sq.sqrt(),
        inputs: budget,
    }
}

/// Which field method produced a rate.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Method {
    /// Known mass, measured sag.
    StaticSag,
    /// Known mass, timed oscillations.
    Oscillation,
    /// Force gauge at two lengths.
    TwoPointGauge,
}

impl Method {
    /// The method in words.
    pub fn describe(self) -> &'static str {
        match self {
            Method::StaticSag => "static sag under a known mass",
            Method::Oscillation => "timed oscillation of a known mass",
            Method::TwoPointGauge => "force gauge at two lengths",
        }
    }
}

/// A spring rate identified in the field.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RateEstimate {
    /// Which method.
    pub method: Method,
    /// Rate k (N/m) with its uncertainty budget.
    pub rate: Estimate,
    /// For the oscillation method: whether the spring's own mass was included.
    pub spring_mass_included: Option<bool>,
    /// Formula used.
    pub formula: String,
    /// Caveats (worrying but valid).
    pub notes: Vec<String>,
    /// Natural frequency of the test mass on the spring (Hz), where the
    /// method gives one: from the sag f = (1/2π)·√(g/δ) (static), or as
    /// timed f = N/t (oscillation). Set beside another method's rate it is a
    /// quick cross-check.
    #[serde(default)]
    pub frequency: Option<Estimate>,
}

impl RateEstimate {
    /// The identified rate as a figure, with the uncertainty in its assumptions.
    pub fn figures(&self) -> Vec<Figure> {
        let mut f = Figure::new(
            ids::IDENTIFY_RATE,
            "Identified spring rate",
            Dim::LinearRate,
            self.rate.value,
        )
        .method(&self.formula)
        .source("JCGM 100:2008 (GUM) 5.1.2 first-order propagation; measurement model as stated")
        .assume(&format!("method: {}", self.method.describe()))
        .assume(&self.rate.budget_line());
        for n in &self.notes {
            f = f.assume(n);
        }
        vec![f]
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;

    /// Central differences on a product/quotient: truncation ~h² = 1e-12,
    /// rounding ~1e-16/1e-6 = 1e-10.
    pub(crate) const REL_SENSITIVITY: f64 = 1e-8;

    /// Found by the property tests: a mass of 1.8e308 kg made the rate
    /// infinite and its uncertainty budget NaN; a reading of such a size
    /// is now refused naming it.
    #[test]
    fn readings_that_overflow_are_refused_naming_the_input() {
        let e = static_rate(&StaticInput {
            mass: f64::MAX,
            mass_uncertainty: 1.0,
            sag: 0.1,
            sag_tolerance: 1e-3,
            gravity: None,
            gravity_uncertainty: None,
        })
        .unwrap_err();
        assert_eq!(e.field, "mass", "{e}");
    }

    #[test]
    fn propagation_of_a_quotient_adds_relative_variances() {
        // f = a/b: (u_f/f)² = (u_a/a)² + (u_b/b)² (GUM 5.1.6 for products of powers).
        let e = propagate(
            |x| x[0] / x[1],
            &[
                In {
                    name: "a",
                    value: 10.0,
                    u: 0.3,
                    basis: String::new(),
                },
                In {
                    name: "b",
                    value: 4.0,
                    u: 0.16,
                    basis: String::new(),
                },
            ],
        )
        .unwrap();
        assert!((e.value - 2.5).abs() < REL_EXACT);
        let rel = (0.03f64.powi(2) + 0.04f64.powi(2)).sqrt();
        assert!((e.relative() / rel - 1.0).abs() < REL_SENSITIVITY);
        assert!((e.inputs[1].sensitivity - (-10.0 / 16.0)).abs() < REL_SENSITIVITY);
    }
}
