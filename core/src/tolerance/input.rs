//! Toleranced inputs: a nominal value (SI) with a ± band and the distribution
//! assumed inside it.
//!
//! Band: an absolute tolerance `a` gives `[x − a, x + a]`; a relative tolerance
//! `f` (a fraction, 0.05 = 5 %) gives `[x − |x|·f, x + |x|·f]`. The band's
//! half-width `t` is what the worst-case corners use.
//!
//! Distributions for the Monte Carlo: uniform over the band; or normal with
//! the tolerance at three standard deviations, σ = t/3 (the usual reading of
//! a ± tolerance as a ±3σ process spread, `common practice`, e.g. the
//! "natural tolerance limits μ ± 3σ" of Montgomery, *Introduction to
//! Statistical Quality Control*, ch. 8 process capability; `from memory`).
//!
//! **Decision: [`Distribution::Normal`] is truncated at the tolerance band.**
//! A part outside its stated tolerance is out of specification, so the study
//! never samples one; it keeps the Monte Carlo inside the worst-case box (for
//! a model monotone in each input the Monte Carlo extremes can then never
//! exceed the corners, so the two analyses never contradict each other), and
//! a must-stay-positive input with a relative tolerance below 100 % can never
//! change sign. The price: the truncated normal has a standard deviation of
//! 0.986 58·σ and its 95th percentile is μ + 1.6332·σ instead of μ + 1.6449·σ
//! (scipy 1.17 `scipy.stats.truncnorm(-3, 3).std()` and `.ppf(0.95)`).
//! [`Distribution::NormalUnbounded`] keeps the plain normal for users who want
//! its tails (0.27 % of samples fall outside the band); for an input that must
//! stay positive it is only accepted while zero lies at least 6σ below the
//! nominal, and a non-positive draw is drawn again.

use crate::error::{check, InputError};
use serde::{Deserialize, Serialize};

/// Size of the ± band around the nominal value.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum ToleranceKind {
    /// ± this amount, in the SI unit of the input (e.g. ±0.000 2 m).
    Absolute(f64),
    /// ± this fraction of the nominal's magnitude (0.05 = ±5 %).
    Relative(f64),
}

/// How values are spread inside the band in the Monte Carlo. The worst-case
/// corners use the band ends whatever the distribution.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Distribution {
    /// Every value in the band equally likely.
    #[default]
    Uniform,
    /// Normal with σ = tolerance/3, truncated at the band (±3σ): no sample
    /// leaves the stated tolerance. Drawn by rejection of |z| > 3.
    Normal,
    /// Normal with σ = tolerance/3, not truncated: about 0.27 % of samples lie
    /// outside the band (two-sided tail beyond 3σ).
    NormalUnbounded,
}

/// A tolerance: the band and the distribution inside it.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct Tolerance {
    /// Size of the band.
    pub kind: ToleranceKind,
    /// Spread inside the band for the Monte Carlo.
    pub distribution: Distribution,
}

impl Tolerance {
    /// ± `amount` in the input's SI unit, with the given distribution.
    pub fn absolute(amount: f64, distribution: Distribution) -> Self {
        Self {
            kind: ToleranceKind::Absolute(amount),
            distribution,
        }
    }

    /// ± `fraction` of the nominal (0.05 = 5 %), with the given distribution.
    pub fn relative(fraction: f64, distribution: Distribution) -> Self {
        Self {
            kind: ToleranceKind::Relative(fraction),
            distribution,
        }
    }

    /// Half-width t of the band around `nominal` (SI): `a` for an absolute
    /// tolerance, `|nominal|·f` for a relative one.
    pub fn half_width(&self, nominal: f64) -> f64 {
        match self.kind {
            ToleranceKind::Absolute(a) => a,
            ToleranceKind::Relative(f) => nominal.abs() * f,
        }
    }

    /// Check this tolerance against its nominal value.
    ///
    /// # Errors
    /// `tolerance` when the amount is not finite or negative; when the input
    /// must stay positive, `nominal` when it is not > 0 and `tolerance` when
    /// the band reaches zero (relative ≥ 100 %, absolute ≥ nominal), or, for
    /// [`Distribution::NormalUnbounded`], when zero lies less than 6σ below
    /// the nominal (tolerance above 50 % of the nominal).
    pub fn validate(&self, nominal: f64, must_stay_positive: bool) -> Result<(), InputError> {
        check::finite("nominal", nominal)?;
        let amount = match self.kind {
            ToleranceKind::Absolute(a) | ToleranceKind::Relative(a) => a,
        };
        check::non_negative("tolerance", amount)?;
        let t = self.half_width(nominal);
        // An unbounded normal draw lies within ±12.01σ = ±4.004·t (the polar
        // method's largest |z| is √(−2 ln 2⁻¹⁰⁴)); 5·t keeps every draw finite.
        if !(nominal.abs() + 5.0 * t).is_finite() {
            return Err(InputError::invalid(
                "tolerance",
                "the band nominal ± tolerance must stay within the range of finite numbers",
            ));
        }
        if must_stay_positive {
            check::positive("nominal", nominal)?;
            if t >= nominal {
                let message = match self.kind {
                    ToleranceKind::Relative(_) => {
                        "this input must stay positive: a relative tolerance must be below 100 %"
                    }
                    ToleranceKind::Absolute(_) => {
                        "this input must stay positive: the tolerance must be smaller than the nominal value"
                    }
                };
                return Err(InputError::invalid("tolerance", message));
            }
            if self.distribution == Distribution::NormalUnbounded && 2.0 * t > nominal {
                return Err(InputError::invalid(
                    "tolerance",
                    "this input must stay positive: with an unbounded normal the tolerance may be at most 50 % \
                     of the nominal (zero at least 6σ away); use the truncated normal or a uniform spread",
                ));
            }
        }
        Ok(())
    }
}

/// Which end of its band an input sits at in a worst-case combination.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Level {
    /// Nominal − tolerance.
    Low,
    /// The nominal value.
    Nominal,
    /// Nominal + tolerance.
    High,
}

impl Level {
    /// The level in words.
    pub fn word(self) -> &'static str {
        match self {
            Self::Low => "low",
            Self::Nominal => "nominal",
            Self::High => "high",
        }
    }
}

/// One model input that carries a tolerance, validated.
///
/// The model closure receives the values of the toleranced inputs in the
/// order they were given; inputs without a tolerance stay inside the model.
/// Serialisable for reports; not deserialisable, so that every instance has
/// passed [`TolerancedInput::new`].
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TolerancedInput {
    name: String,
    nominal: f64,
    tolerance: Tolerance,
    must_stay_positive: bool,
}

impl TolerancedInput {
    /// A toleranced input. `name` is the input's field path (e.g.
    /// `spring.rate`), used in errors and in the worst-case combinations;
    /// `nominal` is in SI; `must_stay_positive` says whether a zero or negative
    /// value is physically meaningless (a mass, a spring rate, a length).
    ///
    /// # Errors
    /// As [`Tolerance::validate`], with the field path prefixed by `name`
    /// (`spring.rate.tolerance`).
    pub fn new(
        name: &str,
        nominal: f64,
        tolerance: Tolerance,
        must_stay_positive: bool,
    ) -> Result<Self, InputError> {
        tolerance
            .validate(nominal, must_stay_positive)
            .map_err(|e| e.within(name))?;
        Ok(Self {
            name: name.into(),
            nominal,
            tolerance,
            must_stay_positive,
        })
    }

    /// Field path of the input.
    pub fn name(&self) -> &str {
        &self.name
    }

    /// Nominal value (SI).
    pub fn nominal(&self) -> f64 {
        self.nominal
    }

    /// The tolerance.
    pub fn tolerance(&self) -> Tolerance {
        self.tolerance
    }

    /// Whether the input must stay strictly positive.
    pub fn must_stay_positive(&self) -> bool {
        self.must_stay_positive
    }

    /// Half-width t of the band (SI).
    pub fn half_width(&self) -> f64 {
        self.tolerance.half_width(self.nominal)
    }

    /// Lower end of the band, nominal − t (SI).
    pub fn low(&self) -> f64 {
        self.nominal - self.half_width()
    }

    /// Upper end of the band, nominal + t (SI).
    pub fn high(&self) -> f64 {
        self.nominal + self.half_width()
    }

    /// The value at a level (SI).
    pub fn at(&self, level: Level) -> f64 {
        match level {
            Level::Low => self.low(),
            Level::Nominal => self.nominal,
            Level::High => self.high(),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn relative_band_uses_the_magnitude_of_a_negative_nominal() {
        let i = TolerancedInput::new(
            "offset",
            -2.0,
            Tolerance::relative(0.1, Distribution::Uniform),
            false,
        )
        .unwrap();
        assert_eq!((i.low(), i.high()), (-2.2, -1.8));
    }

    #[test]
    fn refuses_non_finite_and_negative_amounts_naming_the_field() {
        let e = TolerancedInput::new(
            "spring.rate",
            1000.0,
            Tolerance::relative(f64::NAN, Distribution::Uniform),
            true,
        )
        .unwrap_err();
        assert_eq!(e.field, "spring.rate.tolerance");
        assert!(TolerancedInput::new(
            "m",
            1.0,
            Tolerance::absolute(-0.1, Distribution::Uniform),
            false
        )
        .is_err());
    }

    #[test]
    fn a_must_stay_positive_input_cannot_reach_zero() {
        let rel = |f, d| TolerancedInput::new("m", 2.0, Tolerance::relative(f, d), true);
        assert!(rel(1.0, Distribution::Uniform).is_err());
        assert!(rel(0.99, Distribution::Normal).is_ok());
        // A sign flip is acceptable where the caller says so (an offset).
        assert!(TolerancedInput::new(
            "offset",
            2.0,
            Tolerance::relative(1.5, Distribution::Uniform),
            false
        )
        .is_ok());
        assert!(TolerancedInput::new(
            "m",
            2.0,
            Tolerance::absolute(2.0, Distribution::Uniform),
            true
        )
        .is_err());
        assert!(TolerancedInput::new(
            "m",
            0.0,
            Tolerance::absolute(0.0, Distribution::Uniform),
            true
        )
        .is_err());
        // Unbounded normal: zero must lie at least 6σ = 2t below the nominal.
        assert!(rel(0.5, Distribution::NormalUnbounded).is_ok());
        assert!(rel(0.51, Distribution::NormalUnbounded).is_err());
    }

    #[test]
    fn a_band_that_overflows_is_refused() {
        let e = TolerancedInput::new(
            "x",
            1e308,
            Tolerance::relative(1.0, Distribution::Uniform),
            false,
        )
        .unwrap_err();
        assert_eq!(e.field, "x.tolerance");
    }
}
