//! Gas spring (gas strut): polytropic gas force plus a friction band.
//!
//! The gas force follows p·V^κ = const as the rod enters and shrinks the gas
//! volume: F_gas(s) = F_g0·(1 − a·s)^(−κ) with a = A_rod/V₀. The effective
//! volume comes from the progression: V_end/V_start = (F_g,end/F_g0)^(−1/κ),
//! so a = (1 − (F_g,end/F_g0)^(−1/κ))/stroke. Energy is integrated in closed
//! form: W(0→s) = F_g0·(1 − (1 − a·s)^(1−κ))/(a·(1 − κ)), and −F_g0·ln(1 − a·s)/a
//! for κ = 1 (evaluated with `expm1`/`ln_1p`, so κ near 1 and a small
//! progression lose no digits). Source: ideal-gas polytropic law
//! (thermodynamics); the friction band is common practice.
//!
//! **Friction band** f (N): the total difference between the compression and
//! extension curves at the same position (seal and guide friction acting
//! against the motion, ±f/2 about the gas force). A data sheet that gives the
//! friction force F_R per direction has f = 2·F_R. Compression (Travel::Loading)
//! gives F_gas + f/2, extension (Travel::Unloading) F_gas − f/2.
//!
//! **Nominal force** F₁ is the force at full extension (s = 0), read on the
//! extension curve by default, the trade's usual convention for quoting F₁
//! (common practice, from memory); the progression F₂/F₁ is read on the same
//! curve. **Polytropic index** κ defaults to 1.0 (isothermal): data-sheet
//! forces are measured slowly, and a strut held latched sits at ambient
//! temperature; for a fast stroke (a release) nitrogen tends to adiabatic
//! κ ≈ 1.4. With both end forces fixed by the data sheet the choice changes
//! the energy over the stroke by well under 1 % for progressions up to 1.5
//! (checked in the tests), far less than the ±0.34 %/K temperature effect
//! (p ∝ T, 1/293 K at 20 °C).

use super::{Axis, ForceLaw, Spring, Travel};
use crate::error::{check, InputError};
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};

/// Default polytropic index: isothermal (see the module doc).
pub const DEFAULT_POLYTROPIC_INDEX: f64 = 1.0;

/// Which curve the nominal force F₁ and the progression are read on.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum ForceReference {
    /// The extension (lower) curve: the force the strut pushes out with.
    #[default]
    Extension,
    /// The gas force, midway between the curves.
    Mean,
    /// The compression (higher) curve.
    Compression,
}

/// Inputs of a gas spring (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct GasSpec {
    /// Nominal force F₁ at full extension, s = 0 (N).
    pub nominal_force: f64,
    /// Progression F₂/F₁ over the stroke, ≥ 1.
    pub progression: f64,
    /// Stroke (m).
    pub stroke: f64,
    /// Friction band f: compression force − extension force at one position (N), ≥ 0.
    #[serde(default)]
    pub friction_band: f64,
    /// Curve on which F₁ and F₂/F₁ are read; default extension.
    #[serde(default)]
    pub force_reference: ForceReference,
    /// Polytropic index κ in [1, 5/3]; default 1.0.
    #[serde(default)]
    pub polytropic_index: Option<f64>,
    /// Mass of rod and piston moving with the part (kg); default 0.
    #[serde(default)]
    pub moving_mass: Option<f64>,
}

/// A validated gas spring.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct GasSpring {
    spec: GasSpec,
    kappa: f64,
    /// Gas force at s = 0 (N).
    f_g0: f64,
    /// A_rod/V₀ (1/m).
    a: f64,
    /// Half the friction band (N).
    half_band: f64,
}

impl GasSpring {
    /// Validate the inputs and derive the gas-volume parameter.
    ///
    /// # Errors
    /// Non-positive force or stroke; progression below 1; negative band;
    /// κ outside [1, 5/3]; a band so wide that the extension force at full
    /// extension is not positive.
    pub fn new(spec: GasSpec) -> Result<Self, InputError> {
        let f1 = check::positive("nominal_force", spec.nominal_force)?;
        let r = check::finite("progression", spec.progression)?;
        if r < 1.0 {
            return Err(InputError::invalid(
                "progression",
                "must be at least 1 (the force rises as the rod goes in)",
            ));
        }
        let stroke = check::positive("stroke", spec.stroke)?;
        let band = check::non_negative("friction_band", spec.friction_band)?;
        let kappa = match spec.polytropic_index {
            Some(k) => check::in_range("polytropic_index", k, 1.0, 5.0 / 3.0)?,
            None => DEFAULT_POLYTROPIC_INDEX,
        };
        if let Some(m) = spec.moving_mass {
            check::non_negative("moving_mass", m)?;
        }
        let h = 0.5 * band;
        let shift = match spec.force_reference {
            ForceReference::Extension => h,
            ForceReference::Mean => 0.0,
            ForceReference::Compression => -h,
        };
        let f_g0 = f1 + shift;
        let f_g2 = r * f1 + shift;
        if f_g0 - h <= 0.0 {
            return Err(InputError::invalid(
                "friction_band",
                "the friction band leaves no extension force at full extension: it must be smaller",
            ));
        }
        let ratio = f_g2 / f_g0;
        // a = (1 − ratio^(−1/κ))/stroke, written with expm1 so a small
        // progression keeps its digits.
        let a = -(-(ratio.ln()) / kappa).exp_m1() / stroke;
        // A stroke of extreme size can overflow a (0 is a constant-force
        // spring, which the closed forms handle).
        if !(a.is_finite() && a >= 0.0) {
            return Err(InputError::invalid(
                "stroke",
                "too small for its progression: the gas volume cannot be derived; check its size and unit",
            ));
        }
        Ok(Self {
            spec,
            kappa,
            f_g0,
            a,
            half_band: h,
        })
    }

    /// The inputs as entered.
    pub fn spec(&self) -> &GasSpec {
        &self.spec
    }

    /// Polytropic index used.
    pub fn polytropic_index(&self) -> f64 {
        self.kappa
    }

    /// Gas force F_gas(s) = F_g0·(1 − a·s)^(−κ) (N) for 0 ≤ s ≤ stroke.
    fn gas_force_in(&self, s: f64) -> f64 {
        self.f_g0 * (-self.kappa * (-self.a * s).ln_1p()).exp()
    }

    /// dF_gas/ds = κ·a·F_gas/(1 − a·s) (N/m).
    fn gas_rate_in(&self, s: f64) -> f64 {
        self.kappa * self.a * self.gas_force_in(s) / (1.0 - self.a * s)
    }

    /// ∫₀^s F_gas (J), closed form, 0 ≤ s ≤ stroke.
    fn gas_work_in(&self, s: f64) -> f64 {
        if self.a == 0.0 {
            return self.f_g0 * s;
        }
        let l = (-self.a * s).ln_1p(); // ln(1 − a·s) ≤ 0
        let c = 1.0 - self.kappa; // ≤ 0
        let factor = if c == 0.0 { l } else { (c * l).exp_m1() / c };
        -self.f_g0 * factor / self.a
    }

    /// Gas force with linear extrapolation outside 0..stroke (never NaN).
    fn gas_force(&self, s: f64) -> f64 {
        let end = self.spec.stroke;
        if s < 0.0 {
            self.f_g0 + self.gas_rate_in(0.0) * s
        } else if s > end {
            self.gas_force_in(end) + self.gas_rate_in(end) * (s - end)
        } else {
            self.gas_force_in(s)
        }
    }

    /// ∫₀^s of [`Self::gas_force`], exact for the extrapolated lines too.
    fn gas_work(&self, s: f64) -> f64 {
        let end = self.spec.stroke;
        if s < 0.0 {
            self.f_g0 * s + 0.5 * self.gas_rate_in(0.0) * s * s
        } else if s > end {
            let x = s - end;
            self.gas_work_in(end) + self.gas_force_in(end) * x + 0.5 * self.gas_rate_in(end) * x * x
        } else {
            self.gas_work_in(s)
        }
    }

    fn branch_sign(travel: Travel) -> f64 {
        match travel {
            Travel::Loading => 1.0,
            Travel::Unloading => -1.0,
        }
    }
}

impl Spring for GasSpring {
    fn axis(&self) -> Axis {
        Axis::Linear
    }

    /// F = F_gas(s) ± f/2: + compressing (Loading), − extending (Unloading).
    fn force(&self, q: f64, travel: Travel) -> f64 {
        self.gas_force(q) + Self::branch_sign(travel) * self.half_band
    }

    /// W = [W_gas(s) ± f/2·s] between the limits (J), closed form.
    fn work(&self, q1: f64, q2: f64, travel: Travel) -> f64 {
        self.gas_work(q2) - self.gas_work(q1)
            + Self::branch_sign(travel) * self.half_band * (q2 - q1)
    }

    fn deflection_range(&self) -> (f64, f64) {
        (0.0, self.spec.stroke)
    }

    fn effective_mass(&self) -> f64 {
        self.spec.moving_mass.unwrap_or(0.0)
    }

    fn rate(&self, q: f64) -> f64 {
        let end = self.spec.stroke;
        self.gas_rate_in(q.clamp(0.0, end))
    }

    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: "gas spring".into(),
            formula: format!(
                "F = F_g0·(1 − a·s)^(−κ) ± f/2 with κ = {}, a = (1 − (F_g2/F_g0)^(−1/κ))/stroke; \
                 W integrated in closed form",
                self.kappa
            ),
            source: "polytropic gas law p·V^κ = const; friction band ±f/2 (common practice)".into(),
            status: SourceStatus::CommonPractice,
        }
    }

    fn notes(&self) -> Vec<String> {
        vec![
            "a gas spring stays charged at full extension: the gas energy is not released by the \
             mechanism and the strut must never be opened or heated"
                .into(),
            "gas force rises about 0.34 % per kelvin near 20 °C (p ∝ absolute temperature)".into(),
        ]
    }
}

#[cfg(test)]
mod tests {
    use super::super::testkit;
    use super::super::testkit::REL_FEW_OPS;
    use super::*;
    use proptest::prelude::*;

    fn spring(f1: f64, r: f64, band: f64, kappa: f64) -> GasSpring {
        GasSpring::new(GasSpec {
            nominal_force: f1,
            progression: r,
            stroke: 0.1,
            friction_band: band,
            force_reference: ForceReference::Extension,
            polytropic_index: Some(kappa),
            moving_mass: None,
        })
        .unwrap()
    }

    #[test]
    fn ends_reproduce_the_data_sheet_forces() {
        let s = spring(400.0, 1.3, 60.0, 1.4);
        assert!((s.force(0.0, Travel::Unloading) - 400.0).abs() < REL_FEW_OPS * 400.0);
        assert!((s.force(0.1, Travel::Unloading) - 520.0).abs() < REL_FEW_OPS * 520.0);
        assert!((s.force(0.0, Travel::Loading) - 460.0).abs() < REL_FEW_OPS * 460.0);
    }

    #[test]
    fn isothermal_energy_has_the_log_form() {
        // κ = 1, no friction: W = F₁·stroke·ln(r)/(1 − 1/r) (integral of
        // F₁/(1 − a·s) with a = (1 − 1/r)/stroke; calculus).
        let s = spring(300.0, 1.5, 0.0, 1.0);
        let expect = 300.0 * 0.1 * 1.5f64.ln() / (1.0 - 1.0 / 1.5);
        assert!((s.work(0.0, 0.1, Travel::Loading) - expect).abs() < REL_FEW_OPS * expect);
    }

    #[test]
    fn kappa_near_one_is_continuous() {
        let w1 = spring(300.0, 1.4, 0.0, 1.0).work(0.0, 0.1, Travel::Loading);
        let w2 = spring(300.0, 1.4, 0.0, 1.0 + 1e-12).work(0.0, 0.1, Travel::Loading);
        // κ moved by 1e-12 may move W by about that much relative, times ln terms.
        const REL_KAPPA_STEP: f64 = 1e-9;
        assert!((w1 - w2).abs() < REL_KAPPA_STEP * w1);
    }

    #[test]
    fn polytropic_index_matters_little_with_fixed_end_forces() {
        // The claim in the module doc: with both end forces fixed, κ = 1.0 vs
        // 1.4 changes the stroke energy by < 1 % for progressions up to 1.5.
        const REL_KAPPA_CLAIM: f64 = 0.01;
        for r in [1.1, 1.3, 1.5] {
            let iso = spring(300.0, r, 0.0, 1.0).work(0.0, 0.1, Travel::Loading);
            let adi = spring(300.0, r, 0.0, 1.4).work(0.0, 0.1, Travel::Loading);
            assert!((iso / adi - 1.0).abs() < REL_KAPPA_CLAIM, "r = {r}");
        }
    }

    #[test]
    fn progression_one_is_a_constant_force() {
        let s = spring(250.0, 1.0, 20.0, 1.4);
        assert!((s.work(0.0, 0.1, Travel::Unloading) - 250.0 * 0.1).abs() < REL_FEW_OPS * 25.0);
        assert!((s.work(0.0, 0.1, Travel::Loading) - 270.0 * 0.1).abs() < REL_FEW_OPS * 27.0);
    }

    #[test]
    fn extrapolation_stays_finite() {
        let s = spring(250.0, 2.0, 20.0, 1.4);
        for q in [-1.0, 0.5, 10.0] {
            assert!(s.force(q, Travel::Loading).is_finite());
            assert!(s.work(0.0, q, Travel::Loading).is_finite());
        }
    }

    #[test]
    fn refusals() {
        let base = GasSpec {
            nominal_force: 100.0,
            progression: 1.2,
            stroke: 0.1,
            friction_band: 10.0,
            force_reference: ForceReference::Compression,
            polytropic_index: None,
            moving_mass: None,
        };
        let err = |s: GasSpec| GasSpring::new(s).unwrap_err().field;
        assert_eq!(
            err(GasSpec {
                progression: 0.9,
                ..base.clone()
            }),
            "progression"
        );
        assert_eq!(
            err(GasSpec {
                friction_band: 100.0,
                ..base.clone()
            }),
            "friction_band"
        );
        assert_eq!(
            err(GasSpec {
                polytropic_index: Some(2.0),
                ..base
            }),
            "polytropic_index"
        );
    }

    proptest! {
        #[test]
        fn work_is_the_integral_of_force(f1 in 10.0..3000.0f64, r in 1.0..2.5f64, bandf in 0.0..0.5f64, kappa in 1.0..(5.0 / 3.0), a in 0.0..1.0f64, b in 0.0..1.0f64) {
            let s = spring(f1, r, bandf * f1, kappa);
            for t in [Travel::Loading, Travel::Unloading] {
                testkit::check_work_is_integral(&s, 0.1 * a, 0.1 * b, t);
                testkit::check_work_algebra(&s, 0.1 * a, 0.1 * b, 0.05, t);
                testkit::check_energy_monotone(&s, t);
            }
            // Hysteresis: compression work exceeds extension work by f·Δs.
            let loss = s.work(0.0, 0.1, Travel::Loading) - s.work(0.0, 0.1, Travel::Unloading);
            prop_assert!((loss - bandf * f1 * 0.1).abs() <= REL_FEW_OPS * s.work(0.0, 0.1, Travel::Loading));
        }
    }
}

/// Inputs each valid but of extreme size (found by the property tests in
/// `tests/properties.rs`).
#[cfg(test)]
mod extreme_inputs {
    use super::*;
    use crate::spring::SpringSpec;

    fn spec(stroke: f64) -> GasSpec {
        GasSpec {
            nominal_force: 150.0,
            progression: 1.4,
            stroke,
            friction_band: 30.0,
            force_reference: ForceReference::Extension,
            polytropic_index: None,
            moving_mass: None,
        }
    }

    /// A stroke of 5e-324 m made the gas parameter a = ∞ and every force
    /// NaN; a stroke of 1.8e308 m made the energy over the stroke NaN.
    /// Both are refused naming the stroke.
    #[test]
    fn strokes_of_extreme_size_are_refused() {
        assert_eq!(GasSpring::new(spec(5e-324)).unwrap_err().field, "stroke");
        let e = SpringSpec::Gas(spec(f64::MAX)).build().unwrap_err();
        assert_eq!(e.field, "stroke", "{e}");
    }
}
