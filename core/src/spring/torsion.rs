//! Torsion spring (EN 13906-2): torque proportional to wind-up angle.
//!
//! Rate per radian from geometry k_θ = E·d⁴/(64·D·n) (N·m/rad) (EN 13906-2,
//! status M; Bhandari, *Design of Machine Elements* 3rd ed., Ex. 10.21 uses
//! the same form, status R), or given directly. Torque M = k_θ·θ; stored
//! energy W = ½·k_θ·(θ₂² − θ₁²). A preload angle is a mechanism state (see
//! [`super::states`]). The formula ignores the legs' own bending and the
//! friction of the coils on a mandrel.
//!
//! Bending stress σ = q·32·M/(π·d³) with q = (w + 0.07)/(w − 0.75), w = D/d
//! (EN 13906-2, status M), permissible 0.7·R_m for static loading (EN 13906-2,
//! from memory). The textbook inner-fibre factor K_i = (4C² − C − 1)/(4C(C − 1))
//! (Bhandari Ex. 10.21, status R) is given for comparison.

use super::helical::CoilDiameter;
use super::material::{Material, MaterialProps};
use super::{Axis, ForceLaw, Spring, StressAt, StressKind, Travel};
use crate::error::{check, InputError};
use crate::figure::SourceStatus;
use crate::units::{tag, Dim};
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

/// Default permissible bending stress fraction of R_m for a static torsion
/// spring: 0.7·R_m (EN 13906-2, from memory).
pub const DEFAULT_PERMISSIBLE_FRACTION: f64 = 0.7;

/// Torsion-spring rate k_θ = E·d⁴/(64·D·n) (N·m/rad) from E (Pa), d, D (m)
/// and active coils n (EN 13906-2; Bhandari Ex. 10.21).
pub fn torsion_rate(e: f64, d: f64, mean_d: f64, n: f64) -> f64 {
    e * d.powi(4) / (64.0 * mean_d * n)
}

/// Active coils for a wanted rate: n = E·d⁴/(64·D·k_θ) (Bhandari Ex. 10.21).
pub fn active_coils_for_rate(e: f64, d: f64, mean_d: f64, rate: f64) -> f64 {
    e * d.powi(4) / (64.0 * mean_d * rate)
}

/// EN 13906-2 bending stress correction q = (w + 0.07)/(w − 0.75) (from memory).
pub fn bending_factor_en(w: f64) -> f64 {
    (w + 0.07) / (w - 0.75)
}

/// Textbook inner-fibre factor K_i = (4C² − C − 1)/(4C(C − 1)) (Bhandari Ex. 10.21, R).
pub fn bending_factor_textbook(c: f64) -> f64 {
    (4.0 * c * c - c - 1.0) / (4.0 * c * (c - 1.0))
}

/// Coil geometry of a torsion spring.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct TorsionGeometry {
    /// Wire diameter d (m).
    pub wire_diameter: f64,
    /// Coil diameter as measured (m).
    pub coil_diameter: CoilDiameter,
    /// Active coils n.
    pub active_coils: f64,
    /// Wire material (Young's modulus required).
    pub material: Material,
    /// Tensile strength from the wire certificate (Pa).
    #[serde(default)]
    pub tensile_strength: Option<f64>,
    /// Permissible bending stress as a fraction of R_m; default 0.7.
    #[serde(default)]
    pub permissible_stress_fraction: Option<f64>,
}

/// Where the torsional rate comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(tag = "from", rename_all = "snake_case")]
pub enum TorsionRate {
    /// Given directly (N·m/rad).
    Given {
        /// k_θ (N·m/rad), > 0.
        rate: f64,
    },
    /// From the coil geometry.
    Geometry(TorsionGeometry),
}

/// Inputs of a torsion spring (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct TorsionSpec {
    /// Rate, given or from geometry.
    pub rate: TorsionRate,
    /// Largest admissible wind-up angle from free (rad).
    pub max_angle: f64,
}

/// A validated torsion spring.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TorsionSpring {
    spec: TorsionSpec,
    rate: f64,
    geometry: Option<(f64, f64, MaterialProps)>,
}

impl TorsionSpring {
    /// Validate the inputs.
    ///
    /// # Errors
    /// Non-positive rate, angle or geometry; a material without Young's modulus.
    pub fn new(spec: TorsionSpec) -> Result<Self, InputError> {
        check::positive("max_angle", spec.max_angle)?;
        let (rate, geometry) = match &spec.rate {
            TorsionRate::Given { rate } => (check::positive("rate.rate", *rate)?, None),
            TorsionRate::Geometry(g) => {
                let d = check::positive("rate.wire_diameter", g.wire_diameter)?;
                let mean = g.coil_diameter.mean(d);
                if mean <= d {
                    return Err(InputError::invalid(
                        "rate.coil_diameter",
                        "the mean coil diameter must exceed the wire diameter",
                    ));
                }
                let n = check::positive("rate.active_coils", g.active_coils)?;
                if let Some(f) = g.permissible_stress_fraction {
                    check::in_range("rate.permissible_stress_fraction", f, 1e-3, 1.0)?;
                }
                let m = g
                    .material
                    .resolve(g.tensile_strength)
                    .map_err(|e| e.within("rate"))?;
                let Some(e) = m.youngs_modulus else {
                    return Err(InputError::invalid(
                        "rate.material.youngs_modulus",
                        "a torsion spring's rate needs Young's modulus E",
                    ));
                };
                let rate = check::derived(
                    "rate.wire_diameter",
                    torsion_rate(e, d, mean, n),
                    "a rate E·d⁴/(64·D·n)",
                )?;
                (rate, Some((d, mean, m)))
            }
        };
        Ok(Self {
            spec,
            rate,
            geometry,
        })
    }

    /// The inputs as entered.
    pub fn spec(&self) -> &TorsionSpec {
        &self.spec
    }

    /// Rate k_θ (N·m/rad).
    pub fn spring_rate(&self) -> f64 {
        self.rate
    }

    /// Bending stress σ = q·32·M/(π·d³) (Pa) at torque `m` (N·m), EN factor;
    /// `None` without geometry.
    pub fn bending_stress(&self, m: f64) -> Option<f64> {
        let (d, mean, _) = self.geometry.as_ref()?;
        Some(bending_factor_en(mean / d) * 32.0 * m / (PI * d.powi(3)))
    }

    /// Same with the textbook factor K_i (Bhandari Ex. 10.21).
    pub fn bending_stress_textbook(&self, m: f64) -> Option<f64> {
        let (d, mean, _) = self.geometry.as_ref()?;
        Some(bending_factor_textbook(mean / d) * 32.0 * m / (PI * d.powi(3)))
    }
}

impl Spring for TorsionSpring {
    fn axis(&self) -> Axis {
        Axis::Rotary
    }

    /// M = k_θ·θ (N·m).
    fn force(&self, q: f64, _travel: Travel) -> f64 {
        self.rate * q
    }

    /// W = ½·k_θ·(θ₂² − θ₁²) (J).
    fn work(&self, q1: f64, q2: f64, _travel: Travel) -> f64 {
        0.5 * self.rate * (q2 - q1) * (q2 + q1)
    }

    fn deflection_range(&self) -> (f64, f64) {
        (0.0, self.spec.max_angle)
    }

    /// The coil body barely moves; its rotational inertia is neglected (add
    /// the moving leg to the part's inertia).
    fn effective_mass(&self) -> f64 {
        0.0
    }

    fn rate(&self, _q: f64) -> f64 {
        self.rate
    }

    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: "torsion spring".into(),
            formula: "M = k_θ·θ with k_θ = E·d⁴/(64·D·n); W = ½·k_θ·(θ₂² − θ₁²)".into(),
            source:
                "EN 13906-2 (from memory); Bhandari, Design of Machine Elements 3rd ed., Ex. 10.21"
                    .into(),
            status: SourceStatus::Confirmed,
        }
    }

    fn stress(&self, q: f64) -> Option<StressAt> {
        let (d, mean, m) = self.geometry.as_ref()?;
        let torque = self.force(q, Travel::Loading);
        let sigma = self.bending_stress(torque)?;
        let textbook = self.bending_stress_textbook(torque)?;
        let fraction = match &self.spec.rate {
            TorsionRate::Geometry(g) => g.permissible_stress_fraction,
            TorsionRate::Given { .. } => None,
        }
        .unwrap_or(DEFAULT_PERMISSIBLE_FRACTION);
        let perm = m.tensile_strength(*d);
        let mut notes = vec![format!(
            "textbook inner-fibre factor K_i gives {} (Bhandari Ex. 10.21)",
            tag(textbook, Dim::Pressure)
        )];
        if perm.is_none() {
            notes.push("no tensile strength for this wire: enter R_m from the certificate".into());
        }
        Some(StressAt {
            kind: StressKind::Bending,
            stress: sigma,
            permissible: perm.as_ref().map(|(r, _)| fraction * r),
            ratio: perm.as_ref().map(|(r, _)| sigma / (fraction * r)),
            method: format!(
                "σ = q·32·M/(π·d³), q = (w + 0.07)/(w − 0.75) = {:.4}; σ_perm = {fraction}·R_m{}",
                bending_factor_en(mean / d),
                perm.map(|(_, s)| format!(" ({s})")).unwrap_or_default()
            ),
            source: "EN 13906-2 (factor q and 0.7·R_m from memory)".into(),
            notes,
        })
    }
}

#[cfg(test)]
mod tests {
    use super::super::testkit;
    use super::*;
    use crate::test_tol::REL_EXACT;
    use proptest::prelude::*;

    /// reference-values.md T11 tolerance (result printed to 5 s.f.).
    const REL_T11: f64 = 1e-4;

    #[test]
    fn t11_bhandari_ex_10_21_coils() {
        // Bhandari, Design of Machine Elements 3rd ed., Ex. 10.21 (status R):
        // E = 207 000 N/mm², d = 1.6 mm, D = 18 mm, k = 3 N·mm/rad → N = 392.53.
        let n = active_coils_for_rate(207e9, 1.6e-3, 18e-3, 3e-3);
        assert!((n / 392.53 - 1.0).abs() < REL_T11);
        // And back: that many coils give 3 N·mm/rad.
        let s = TorsionSpring::new(TorsionSpec {
            rate: TorsionRate::Geometry(TorsionGeometry {
                wire_diameter: 1.6e-3,
                coil_diameter: CoilDiameter::Mean(18e-3),
                active_coils: n,
                material: Material::Custom {
                    name: None,
                    shear_modulus: 79.3e9,
                    youngs_modulus: Some(207e9),
                    density: None,
                    tensile_strength: None,
                },
                tensile_strength: None,
                permissible_stress_fraction: None,
            }),
            max_angle: 3.0,
        })
        .unwrap();
        assert!((s.spring_rate() - 3e-3).abs() < REL_EXACT * 3e-3);
        assert_eq!(s.axis(), Axis::Rotary);
        // The textbook factor at C = 18/1.6 = 11.25 (Bhandari Ex. 10.21 formula, R).
        let c: f64 = 11.25;
        let ki = (4.0 * c * c - c - 1.0) / (4.0 * c * (c - 1.0));
        assert!((bending_factor_textbook(c) - ki).abs() < REL_EXACT);
        // Both approximate the curved-beam inner-fibre stress: over the usual
        // index range 4..20 the EN factor is the larger (conservative) one, by
        // less than 2 % (computed here from the two formulas, not an outside value).
        const REL_FACTOR_SPREAD: f64 = 0.02;
        for w in [4.0, 6.0, 8.0, 12.0, 16.0, 20.0] {
            let ratio = bending_factor_en(w) / bending_factor_textbook(w);
            assert!(
                (1.0..1.0 + REL_FACTOR_SPREAD).contains(&ratio),
                "w = {w}: {ratio}"
            );
        }
        assert!(s.stress(1.0).unwrap().ratio.is_none());
    }

    #[test]
    fn t12_door_energy() {
        // reference-values.md T12 (status D): k_θ = 2 N·m/rad unwinding from 2.0
        // to 0.5 rad releases ΔE = ½·2·(4 − 0.25) = 3.75 J.
        let s = TorsionSpring::new(TorsionSpec {
            rate: TorsionRate::Given { rate: 2.0 },
            max_angle: 3.0,
        })
        .unwrap();
        assert!((s.work(0.5, 2.0, Travel::Unloading) - 3.75).abs() < REL_EXACT * 3.75);
    }

    #[test]
    fn a_material_without_e_is_refused() {
        let e = TorsionSpring::new(TorsionSpec {
            rate: TorsionRate::Geometry(TorsionGeometry {
                wire_diameter: 1e-3,
                coil_diameter: CoilDiameter::Mean(10e-3),
                active_coils: 5.0,
                material: Material::Custom {
                    name: None,
                    shear_modulus: 79.3e9,
                    youngs_modulus: None,
                    density: None,
                    tensile_strength: None,
                },
                tensile_strength: None,
                permissible_stress_fraction: None,
            }),
            max_angle: 1.0,
        })
        .unwrap_err();
        assert_eq!(e.field, "rate.material.youngs_modulus");
    }

    proptest! {
        #[test]
        fn work_is_the_integral_of_torque(k in 0.01..100.0f64, a in 0.0..1.0f64, b in 0.0..1.0f64) {
            let s = TorsionSpring::new(TorsionSpec { rate: TorsionRate::Given { rate: k }, max_angle: 6.0 }).unwrap();
            testkit::check_work_is_integral(&s, 6.0 * a, 6.0 * b, Travel::Unloading);
            testkit::check_work_algebra(&s, 6.0 * a, 6.0 * b, 1.0, Travel::Loading);
            testkit::check_energy_monotone(&s, Travel::Loading);
        }
    }
}
