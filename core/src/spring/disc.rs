//! Disc-spring (Belleville) stack, EN 16984 (formerly DIN 2092), after
//! Almen and László.
//!
//! Single disc without contact flats (K₄ = 1), outer diameter D_e, inner D_i,
//! thickness t, free cone height h₀ = l₀ − t, deflection s:
//! F = [4E/(1 − μ²)]·[t⁴/(K₁·D_e²)]·(s/t)·[(h₀/t − s/t)(h₀/t − s/(2t)) + 1]
//! with K₁ = (1/π)·((δ − 1)/δ)²/[(δ + 1)/(δ − 1) − 2/ln δ], δ = D_e/D_i
//! (EN 16984 / DIN 2092, status M: formula as recalled, confirm against the
//! standard). The textbook constant M = [6/(π·ln δ)]·((δ − 1)/δ)² (Bhandari,
//! *Design of Machine Elements* 3rd ed., Ex. 10.26, status R) can replace K₁;
//! it gives forces about 0.5 % higher. F is a cubic in s, so the energy is
//! its exact polynomial integral.
//!
//! Stack: n_s groups in series (alternating), each of n_p discs in parallel
//! (nested): F_stack(q) = n_p·F(q/n_s), W_stack = n_s·n_p·W(q/n_s). The flat
//! disc (s = h₀) is the limit, so q_max = n_s·h₀.
//!
//! Optional friction of parallel stacks (EN 16984 / DIN 2092 form, status M):
//! F = F_frictionless/(1 ∓ w_M·(n_p − 1) ∓ w_R), "−" loading, "+" unloading,
//! with w_M the friction between nested discs and w_R at the load edges. The
//! factor is constant along the travel, so the energy stays exact.

use super::{Axis, ForceLaw, Spring, Travel};
use crate::error::{check, InputError};
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

/// K₁ = (1/π)·((δ − 1)/δ)²/[(δ + 1)/(δ − 1) − 2/ln δ] (EN 16984 / DIN 2092, M).
pub fn k1(delta: f64) -> f64 {
    let a = (delta - 1.0) / delta;
    (1.0 / PI) * a * a / ((delta + 1.0) / (delta - 1.0) - 2.0 / delta.ln())
}

/// M = [6/(π·ln δ)]·((δ − 1)/δ)² (Almen–László, Bhandari Ex. 10.26, R).
pub fn almen_laszlo_m(delta: f64) -> f64 {
    let a = (delta - 1.0) / delta;
    6.0 / (PI * delta.ln()) * a * a
}

/// Which diameter-ratio constant the force formula uses.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum DiscConstant {
    /// K₁ of EN 16984 / DIN 2092.
    #[default]
    En16984K1,
    /// Textbook M (Almen–László).
    AlmenLaszloM,
}

/// Friction coefficients of a parallel stack (EN 16984 / DIN 2092 form, M).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct DiscFriction {
    /// w_M: friction between nested (parallel) discs, e.g. 0.01–0.03 (as recalled).
    pub between_discs: f64,
    /// w_R: friction at the load edges, e.g. 0.01–0.05 (as recalled).
    pub at_edges: f64,
}

/// Inputs of a disc-spring stack (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct DiscSpec {
    /// Outer diameter D_e (m).
    pub outer_diameter: f64,
    /// Inner diameter D_i (m).
    pub inner_diameter: f64,
    /// Thickness t (m).
    pub thickness: f64,
    /// Free cone height h₀ = l₀ − t (m).
    pub cone_height: f64,
    /// Young's modulus E (Pa); spring steel 206 000 N/mm² in DIN tables (M).
    pub youngs_modulus: f64,
    /// Poisson's ratio μ; 0.3 for spring steel (Bhandari Ex. 10.26, R).
    pub poisson_ratio: f64,
    /// Groups in series n_s (≥ 1).
    pub in_series: u32,
    /// Discs per group in parallel n_p (≥ 1).
    pub in_parallel: u32,
    /// Diameter-ratio constant; default K₁.
    #[serde(default)]
    pub constant: DiscConstant,
    /// Friction of the stack; none by default.
    #[serde(default)]
    pub friction: Option<DiscFriction>,
    /// Density (kg/m³) for the stack's own mass; none by default.
    #[serde(default)]
    pub density: Option<f64>,
}

/// A validated disc-spring stack.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct DiscStack {
    spec: DiscSpec,
    /// C = 4·E·t/((1 − μ²)·K·D_e²) (N/m³): F = C·s·[(h₀ − s)(h₀ − s/2) + t²].
    c: f64,
    load_factor: f64,
    unload_factor: f64,
}

impl DiscStack {
    /// Validate the inputs.
    ///
    /// # Errors
    /// Non-positive dimensions; D_i ≥ D_e; μ outside [0, 0.5); zero counts;
    /// friction so large that the loading factor diverges.
    pub fn new(spec: DiscSpec) -> Result<Self, InputError> {
        let de = check::positive("outer_diameter", spec.outer_diameter)?;
        let di = check::positive("inner_diameter", spec.inner_diameter)?;
        if di >= de {
            return Err(InputError::invalid(
                "inner_diameter",
                "must be smaller than the outer diameter",
            ));
        }
        let t = check::positive("thickness", spec.thickness)?;
        check::positive("cone_height", spec.cone_height)?;
        let e = check::positive("youngs_modulus", spec.youngs_modulus)?;
        let mu = check::in_range("poisson_ratio", spec.poisson_ratio, 0.0, 0.499)?;
        if spec.in_series == 0 {
            return Err(InputError::invalid("in_series", "at least one disc group"));
        }
        if spec.in_parallel == 0 {
            return Err(InputError::invalid(
                "in_parallel",
                "at least one disc per group",
            ));
        }
        if let Some(r) = spec.density {
            check::positive("density", r)?;
        }
        let delta = de / di;
        let k = match spec.constant {
            DiscConstant::En16984K1 => k1(delta),
            DiscConstant::AlmenLaszloM => almen_laszlo_m(delta),
        };
        let c = check::derived(
            "thickness",
            4.0 * e * t / ((1.0 - mu * mu) * k * de * de),
            "a disc constant 4·E·t/((1 − μ²)·K₁·D_e²)",
        )?;
        // The force of a disc pressed flat, C·h₀·t², bounds every force of
        // the stack; it must be a number too.
        check::derived(
            "thickness",
            c * spec.cone_height * t * t,
            "a flat-disc force C·h₀·t²",
        )?;
        let (load_factor, unload_factor) = match spec.friction {
            None => (1.0, 1.0),
            Some(fr) => {
                let wm = check::in_range("friction.between_discs", fr.between_discs, 0.0, 0.2)?;
                let wr = check::in_range("friction.at_edges", fr.at_edges, 0.0, 0.2)?;
                let sum = wm * f64::from(spec.in_parallel - 1) + wr;
                if sum >= 0.9 {
                    return Err(InputError::invalid(
                        "friction",
                        "w_M·(n_p − 1) + w_R must stay well below 1; fewer discs in parallel or less friction",
                    ));
                }
                (1.0 / (1.0 - sum), 1.0 / (1.0 + sum))
            }
        };
        Ok(Self {
            spec,
            c,
            load_factor,
            unload_factor,
        })
    }

    /// The inputs as entered.
    pub fn spec(&self) -> &DiscSpec {
        &self.spec
    }

    /// Force of one frictionless disc at its deflection `s` (N).
    pub fn single_disc_force(&self, s: f64) -> f64 {
        let h0 = self.spec.cone_height;
        let t = self.spec.thickness;
        self.c * s * ((h0 - s) * (h0 - s / 2.0) + t * t)
    }

    /// ∫₀^s of the single-disc force (J), exact polynomial integral:
    /// C·[(h₀² + t²)·s²/2 − h₀·s³/2 + s⁴/8].
    pub fn single_disc_energy(&self, s: f64) -> f64 {
        let h0 = self.spec.cone_height;
        let t = self.spec.thickness;
        self.c * ((h0 * h0 + t * t) * s * s / 2.0 - h0 * s * s * s / 2.0 + s.powi(4) / 8.0)
    }

    /// Force of one disc pressed flat F_c = C·h₀·t² (N).
    pub fn flat_force(&self) -> f64 {
        self.single_disc_force(self.spec.cone_height)
    }

    fn factor(&self, travel: Travel) -> f64 {
        match travel {
            Travel::Loading => self.load_factor,
            Travel::Unloading => self.unload_factor,
        }
    }

    fn ns(&self) -> f64 {
        f64::from(self.spec.in_series)
    }

    fn np(&self) -> f64 {
        f64::from(self.spec.in_parallel)
    }
}

impl Spring for DiscStack {
    fn axis(&self) -> Axis {
        Axis::Linear
    }

    /// F = factor·n_p·F_disc(q/n_s) (N).
    fn force(&self, q: f64, travel: Travel) -> f64 {
        self.factor(travel) * self.np() * self.single_disc_force(q / self.ns())
    }

    /// W = factor·n_s·n_p·[W_disc(q₂/n_s) − W_disc(q₁/n_s)] (J).
    fn work(&self, q1: f64, q2: f64, travel: Travel) -> f64 {
        let ns = self.ns();
        self.factor(travel)
            * ns
            * self.np()
            * (self.single_disc_energy(q2 / ns) - self.single_disc_energy(q1 / ns))
    }

    fn deflection_range(&self) -> (f64, f64) {
        (0.0, self.ns() * self.spec.cone_height)
    }

    /// One third of the stack's mass (uniform-stack Rayleigh analogy); 0
    /// without density.
    fn effective_mass(&self) -> f64 {
        let s = &self.spec;
        s.density.map_or(0.0, |rho| {
            let disc = rho * PI / 4.0
                * (s.outer_diameter.powi(2) - s.inner_diameter.powi(2))
                * s.thickness;
            disc * self.ns() * self.np() / 3.0
        })
    }

    /// dF/dq = factor·(n_p/n_s)·C·[(h₀² + t²) − 3·h₀·s + 1.5·s²], s = q/n_s.
    fn rate(&self, q: f64) -> f64 {
        let h0 = self.spec.cone_height;
        let t = self.spec.thickness;
        let s = q / self.ns();
        self.load_factor * self.np() / self.ns()
            * self.c
            * (h0 * h0 + t * t - 3.0 * h0 * s + 1.5 * s * s)
    }

    fn force_law(&self) -> ForceLaw {
        let constant = match self.spec.constant {
            DiscConstant::En16984K1 => "K₁ (EN 16984 / DIN 2092)",
            DiscConstant::AlmenLaszloM => "M (Almen–László, Bhandari Ex. 10.26)",
        };
        ForceLaw {
            model: "disc-spring stack".into(),
            formula: format!(
                "F = n_p·4E/(1 − μ²)·t⁴/(K·D_e²)·(s/t)·[(h₀/t − s/t)(h₀/t − s/(2t)) + 1], s = q/n_s, \
                 K = {constant}; W is its exact polynomial integral"
            ),
            source: "EN 16984 (ex DIN 2092), Almen–László (formula as recalled)".into(),
            status: SourceStatus::FromMemory,
        }
    }

    fn notes(&self) -> Vec<String> {
        let mut notes = Vec::new();
        let ratio = self.spec.cone_height / self.spec.thickness;
        if ratio > 2f64.sqrt() {
            notes.push(format!(
                "h₀/t = {ratio:.2} exceeds √2: the force falls before the disc is flat, so a \
                 series stack snaps through unevenly and a latched position may not be stable"
            ));
        } else if ratio > 1.3 && self.spec.in_series > 1 {
            notes.push(format!(
                "h₀/t = {ratio:.2}: the nearly flat characteristic makes the discs of a series stack \
                 deflect unevenly (equal deflection is assumed)"
            ));
        }
        if self.spec.friction.is_some() {
            notes.push(
                "stack friction after EN 16984 / DIN 2092 (form and coefficients from memory)"
                    .into(),
            );
        }
        notes
    }
}

#[cfg(test)]
mod tests {
    use super::super::testkit;
    use super::super::testkit::REL_FEW_OPS;
    use super::*;
    use crate::test_tol::REL_EXACT;
    use proptest::prelude::*;

    /// reference-values.md T13 tolerance (4 500 N from inputs printed to 6 s.f.).
    const REL_T13: f64 = 1e-3;
    /// reference-values.md T14 tolerance for the formula value.
    const REL_T14: f64 = 1e-3;
    /// Constants M and K₁ tabulated to 5 decimals in reference-values.md §7.
    const ABS_5_DECIMALS: f64 = 5e-6;
    /// A ratio of two 5-decimal constants (~0.63): rounding of each is ≤ 8e-6 relative.
    const REL_RATIO_5_DECIMALS: f64 = 2e-5;

    fn disc(de: f64, di: f64, t: f64, h0: f64, e: f64, constant: DiscConstant) -> DiscStack {
        DiscStack::new(DiscSpec {
            outer_diameter: de,
            inner_diameter: di,
            thickness: t,
            cone_height: h0,
            youngs_modulus: e,
            poisson_ratio: 0.3,
            in_series: 1,
            in_parallel: 1,
            constant,
            friction: None,
            density: None,
        })
        .unwrap()
    }

    #[test]
    fn constants_m_and_k1() {
        // reference-values.md §7 (status D from the R/M formulas):
        // δ = 1.75: M = 0.62684, K₁ = 0.63011; δ = 2.0: M = 0.68884, K₁ = 0.69433.
        assert!((almen_laszlo_m(1.75) - 0.62684).abs() < ABS_5_DECIMALS);
        assert!((k1(1.75) - 0.63011).abs() < ABS_5_DECIMALS);
        assert!((almen_laszlo_m(2.0) - 0.68884).abs() < ABS_5_DECIMALS);
        assert!((k1(2.0) - 0.69433).abs() < ABS_5_DECIMALS);
    }

    #[test]
    fn t13_bhandari_ex_10_26_flat_force_with_m() {
        // Bhandari, Design of Machine Elements 3rd ed., Ex. 10.26 (status R):
        // E = 207 000 N/mm², μ = 0.3, t = 2.65298 mm, h = 3.97947 mm,
        // D₀ = 154.818 mm, D₀/D_i = 1.75 → flattened by P = 4 500 N.
        let d = disc(
            154.818e-3,
            154.818e-3 / 1.75,
            2.65298e-3,
            3.97947e-3,
            207e9,
            DiscConstant::AlmenLaszloM,
        );
        assert!((d.flat_force() / 4500.0 - 1.0).abs() < REL_T13);
        // The same disc with DIN K₁ is about 0.5 % softer (reference-values.md §7, D).
        let k = disc(
            154.818e-3,
            154.818e-3 / 1.75,
            2.65298e-3,
            3.97947e-3,
            207e9,
            DiscConstant::En16984K1,
        );
        assert!((d.flat_force() / k.flat_force() - 0.63011 / 0.62684).abs() < REL_RATIO_5_DECIMALS);
    }

    #[test]
    fn t14_din_k1_series_a_40() {
        // reference-values.md T14: Series A 40 × 20.4 × 2.25, h₀ = 0.9 mm,
        // E = 206 000 N/mm², μ = 0.3: F(0.675 mm) = 6 500.2 N and F_c = 8 456 N
        // from the K₁ formula (status D; the formula itself is M). The
        // catalogue lists about 6 500 N at 0.75·h₀ (DIN 2093 / EN 16983 table,
        // status M).
        let d = disc(
            40e-3,
            20.4e-3,
            2.25e-3,
            0.9e-3,
            206e9,
            DiscConstant::En16984K1,
        );
        assert!((d.force(0.675e-3, Travel::Loading) / 6500.2 - 1.0).abs() < REL_T14);
        assert!((d.flat_force() / 8456.0 - 1.0).abs() < REL_T14);
    }

    #[test]
    fn stacking_rules() {
        let one = disc(
            40e-3,
            20.4e-3,
            2.25e-3,
            0.9e-3,
            206e9,
            DiscConstant::En16984K1,
        );
        let stack = DiscStack::new(DiscSpec {
            in_series: 3,
            in_parallel: 2,
            ..one.spec().clone()
        })
        .unwrap();
        let s = 0.5e-3;
        // Series multiplies deflection, parallel multiplies force.
        let f = stack.force(3.0 * s, Travel::Loading);
        assert!((f - 2.0 * one.force(s, Travel::Loading)).abs() < REL_FEW_OPS * f);
        let w = stack.work(0.0, 3.0 * s, Travel::Loading);
        assert!((w - 6.0 * one.work(0.0, s, Travel::Loading)).abs() < REL_FEW_OPS * w);
        assert!((stack.deflection_range().1 - 2.7e-3).abs() < REL_EXACT);
    }

    #[test]
    fn friction_raises_loading_and_lowers_unloading() {
        let base = disc(
            40e-3,
            20.4e-3,
            2.25e-3,
            0.9e-3,
            206e9,
            DiscConstant::En16984K1,
        );
        let fr = DiscStack::new(DiscSpec {
            in_parallel: 3,
            friction: Some(DiscFriction {
                between_discs: 0.02,
                at_edges: 0.03,
            }),
            ..base.spec().clone()
        })
        .unwrap();
        let plain = 3.0 * base.force(0.5e-3, Travel::Loading);
        // 1/(1 − 0.02·2 − 0.03) and 1/(1 + 0.07).
        assert!((fr.force(0.5e-3, Travel::Loading) - plain / 0.93).abs() < REL_FEW_OPS * plain);
        assert!(
            (fr.force(0.5e-3, Travel::Unloading) - plain / 1.07).abs() < REL_EXACT * plain * 4.0
        );
    }

    #[test]
    fn falling_characteristic_is_noted() {
        let d = disc(
            154.818e-3,
            88.47e-3,
            2.65298e-3,
            3.97947e-3,
            207e9,
            DiscConstant::AlmenLaszloM,
        );
        assert!(d.notes().iter().any(|n| n.contains("√2")));
    }

    proptest! {
        #[test]
        fn work_is_the_integral_of_force(delta in 1.5..3.0f64, tr in 0.02..0.08f64, hr in 0.2..1.4f64, ns in 1u32..4, np in 1u32..4, a in 0.0..1.0f64, b in 0.0..1.0f64) {
            let de = 50e-3;
            let t = tr * de / 2.0;
            let s = DiscStack::new(DiscSpec {
                outer_diameter: de, inner_diameter: de / delta, thickness: t, cone_height: hr * t,
                youngs_modulus: 206e9, poisson_ratio: 0.3, in_series: ns, in_parallel: np,
                constant: DiscConstant::En16984K1,
                friction: Some(DiscFriction { between_discs: 0.02, at_edges: 0.02 }), density: Some(7850.0),
            }).unwrap();
            let hi = s.deflection_range().1;
            for tv in [Travel::Loading, Travel::Unloading] {
                testkit::check_work_is_integral(&s, a * hi, b * hi, tv);
                testkit::check_work_algebra(&s, a * hi, b * hi, 0.3 * hi, tv);
                // h₀/t < √2: force never falls, so energy is monotone.
                testkit::check_energy_monotone(&s, tv);
            }
        }
    }
}

/// Inputs each valid but of extreme size (found by the property tests in
/// `tests/properties.rs`).
#[cfg(test)]
mod extreme_inputs {
    use super::*;

    /// A thickness of 1.8e306 m made the force ∞ and, at zero deflection,
    /// ∞·0 = NaN; the disc constant and the flat-disc force must now be
    /// finite.
    #[test]
    fn a_disc_whose_force_overflows_is_refused() {
        let e = DiscStack::new(DiscSpec {
            outer_diameter: 0.1,
            inner_diameter: 0.05,
            thickness: 1.8e306,
            cone_height: 0.01,
            youngs_modulus: 2.06e11,
            poisson_ratio: 0.3,
            in_series: 1,
            in_parallel: 1,
            constant: DiscConstant::En16984K1,
            friction: None,
            density: None,
        })
        .unwrap_err();
        assert_eq!(e.field, "thickness", "{e}");
    }
}
