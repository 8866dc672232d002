//! Extension spring with initial tension (EN 13906-3).
//!
//! Close-wound coils press on each other with the initial tension F₀: the
//! spring does not extend until F₀ is overcome, then F = F₀ + k·s for s > 0
//! (EN 13906-3, status M; same law in Shigley MED 10th ed. §10-11). The
//! rate is given, or computed from the body geometry with the helical
//! formula k = G·d⁴/(8·D³·n) (EN 13906-1/-3). Stored energy from free
//! (closed coils, s = 0): W(s) = F₀·s + ½·k·s², exact, so the step at s = 0
//! is integrated exactly.
//!
//! At s = 0 the force is taken as 0 (the spring at rest with its coils
//! closed); any s > 0 carries at least F₀. Energy locked in the coils by the
//! initial tension is not releasable through the ends and is not counted.
//! Hook stresses (usually what breaks first) are not modelled.

use super::helical::{bergstrasser, helical_rate, CoilDiameter};
use super::material::{Material, MaterialProps};
use super::{Axis, ForceLaw, Spring, StressAt, StressKind, Travel};
use crate::error::{check, InputError};
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};
use std::f64::consts::PI;

/// Default permissible shear stress fraction of R_m for the body of a static
/// extension spring: 0.45·R_m (EN 13906-3, from memory).
pub const DEFAULT_PERMISSIBLE_FRACTION: f64 = 0.45;

/// Body geometry of an extension spring.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct ExtensionGeometry {
    /// Wire diameter d (m).
    pub wire_diameter: f64,
    /// Coil diameter as measured (m).
    pub coil_diameter: CoilDiameter,
    /// Active coils n: the body coils (Shigley 10th ed. Eq. 10-39 adds G/E
    /// for the hook ends; from memory).
    pub active_coils: f64,
    /// Wire material.
    pub material: Material,
    /// Tensile strength from the wire certificate (Pa).
    #[serde(default)]
    pub tensile_strength: Option<f64>,
    /// Permissible shear stress as a fraction of R_m; default 0.45.
    #[serde(default)]
    pub permissible_stress_fraction: Option<f64>,
}

/// Where the rate comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(tag = "from", rename_all = "snake_case")]
pub enum ExtensionRate {
    /// Rate given directly (N/m), e.g. from a data sheet.
    Given {
        /// k (N/m), > 0.
        rate: f64,
    },
    /// Rate from the body geometry.
    Geometry(ExtensionGeometry),
}

/// Inputs of an extension spring (SI units).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct ExtensionSpec {
    /// Initial tension F₀ (N), ≥ 0.
    pub initial_tension: f64,
    /// Rate, given or from geometry.
    pub rate: ExtensionRate,
    /// Largest admissible extension (m), from the maker's data or design.
    pub max_deflection: f64,
    /// Free length inside the hooks (m), to convert lengths to extensions.
    #[serde(default)]
    pub free_length: Option<f64>,
}

/// A validated extension spring.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ExtensionSpring {
    spec: ExtensionSpec,
    rate: f64,
    geometry: Option<(f64, f64, f64, MaterialProps)>,
}

impl ExtensionSpring {
    /// Validate the inputs.
    ///
    /// # Errors
    /// Negative initial tension, non-positive rate, extension or geometry.
    pub fn new(spec: ExtensionSpec) -> Result<Self, InputError> {
        check::non_negative("initial_tension", spec.initial_tension)?;
        check::positive("max_deflection", spec.max_deflection)?;
        if let Some(l0) = spec.free_length {
            check::positive("free_length", l0)?;
        }
        let (rate, geometry) = match &spec.rate {
            ExtensionRate::Given { rate } => (check::positive("rate.rate", *rate)?, None),
            ExtensionRate::Geometry(g) => {
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
                let rate = check::derived(
                    "rate.wire_diameter",
                    helical_rate(m.shear_modulus, d, mean, n),
                    "a rate G·d⁴/(8·D³·n)",
                )?;
                (rate, Some((d, mean, n, m)))
            }
        };
        Ok(Self {
            spec,
            rate,
            geometry,
        })
    }

    /// The inputs as entered.
    pub fn spec(&self) -> &ExtensionSpec {
        &self.spec
    }

    /// Rate k (N/m) above the initial tension.
    pub fn spring_rate(&self) -> f64 {
        self.rate
    }

    /// Initial tension F₀ (N).
    pub fn initial_tension(&self) -> f64 {
        self.spec.initial_tension
    }

    /// Mass of the body coils ρ·(π·d²/4)·(π·D·n) (kg), hooks excluded;
    /// `None` without geometry and density.
    pub fn spring_mass(&self) -> Option<f64> {
        let (d, mean, n, m) = self.geometry.as_ref()?;
        m.density.map(|rho| rho * PI * d * d / 4.0 * PI * mean * n)
    }

    fn energy_from_free(&self, q: f64) -> f64 {
        let s = q.max(0.0);
        self.spec.initial_tension * s + 0.5 * self.rate * s * s
    }
}

impl Spring for ExtensionSpring {
    fn axis(&self) -> Axis {
        Axis::Linear
    }

    /// F = 0 for s ≤ 0; F = F₀ + k·s for s > 0 (N).
    fn force(&self, q: f64, _travel: Travel) -> f64 {
        if q > 0.0 {
            self.spec.initial_tension + self.rate * q
        } else {
            0.0
        }
    }

    /// W = [F₀·s + ½·k·s²] between the limits, with s clamped at 0 (J).
    fn work(&self, q1: f64, q2: f64, _travel: Travel) -> f64 {
        self.energy_from_free(q2) - self.energy_from_free(q1)
    }

    fn deflection_range(&self) -> (f64, f64) {
        (0.0, self.spec.max_deflection)
    }

    /// Body-coil mass / 3 (Rayleigh); 0 when unknown.
    fn effective_mass(&self) -> f64 {
        self.spring_mass().map_or(0.0, |m| m / 3.0)
    }

    fn rate(&self, _q: f64) -> f64 {
        self.rate
    }

    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: "extension spring with initial tension".into(),
            formula: "F = F₀ + k·s for s > 0; W = F₀·s + ½·k·s²".into(),
            source: "EN 13906-3 (from memory); Shigley MED 10th ed. §10-11".into(),
            status: SourceStatus::FromMemory,
        }
    }

    fn stress(&self, q: f64) -> Option<StressAt> {
        let (d, mean, _, m) = self.geometry.as_ref()?;
        let kb = bergstrasser(mean / d);
        let f = self.force(q, Travel::Loading);
        let tau = kb * 8.0 * f * mean / (PI * d.powi(3));
        let fraction = match &self.spec.rate {
            ExtensionRate::Geometry(g) => g.permissible_stress_fraction,
            ExtensionRate::Given { .. } => None,
        }
        .unwrap_or(DEFAULT_PERMISSIBLE_FRACTION);
        let mut notes = vec![
            "body coils only: the hooks carry extra bending and torsion and usually fail first"
                .into(),
        ];
        let perm = m.tensile_strength(*d);
        if perm.is_none() {
            notes.push("no tensile strength for this wire: enter R_m from the certificate".into());
        }
        Some(StressAt {
            kind: StressKind::Shear,
            stress: tau,
            permissible: perm.as_ref().map(|(r, _)| fraction * r),
            ratio: perm.as_ref().map(|(r, _)| tau / (fraction * r)),
            method: format!(
                "τ_k = k_B·8·F·D/(π·d³), k_B = {kb:.4}; τ_perm = {fraction}·R_m{}",
                perm.map(|(_, s)| format!(" ({s})")).unwrap_or_default()
            ),
            source:
                "EN 13906-3 (permissible fraction 0.45 from memory); EN 13906-1 Bergsträsser factor"
                    .into(),
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

    fn spring(f0: f64, k: f64) -> ExtensionSpring {
        ExtensionSpring::new(ExtensionSpec {
            initial_tension: f0,
            rate: ExtensionRate::Given { rate: k },
            max_deflection: 0.1,
            free_length: None,
        })
        .unwrap()
    }

    #[test]
    fn force_is_zero_until_initial_tension_is_overcome() {
        let s = spring(20.0, 1000.0);
        assert_eq!(s.force(0.0, Travel::Loading), 0.0);
        assert_eq!(s.force(-0.01, Travel::Loading), 0.0);
        assert!((s.force(1e-9, Travel::Loading) - (20.0 + 1000.0 * 1e-9)).abs() < REL_EXACT * 20.0);
        // W = F₀·s + ½·k·s² = 20·0.05 + ½·1000·0.0025 = 2.25 J (hand arithmetic).
        assert!((s.work(0.0, 0.05, Travel::Unloading) - 2.25).abs() < REL_EXACT * 2.25);
        assert!((s.work(-0.02, 0.05, Travel::Loading) - 2.25).abs() < REL_EXACT * 2.25);
    }

    #[test]
    fn rate_from_geometry_is_the_helical_formula() {
        // Same formula as a compression spring (EN 13906-3 refers to EN 13906-1):
        // G = 81 370 N/mm², d = 7, D = 42, n = 8 → 41.203 N/mm (Bhandari Ex. 10.1, R).
        let s = ExtensionSpring::new(ExtensionSpec {
            initial_tension: 0.0,
            rate: ExtensionRate::Geometry(ExtensionGeometry {
                wire_diameter: 7e-3,
                coil_diameter: CoilDiameter::Mean(42e-3),
                active_coils: 8.0,
                material: Material::Custom {
                    name: None,
                    shear_modulus: 81_370e6,
                    youngs_modulus: None,
                    density: Some(7850.0),
                    tensile_strength: Some(1090e6),
                },
                tensile_strength: None,
                permissible_stress_fraction: None,
            }),
            max_deflection: 0.05,
            free_length: None,
        })
        .unwrap();
        const REL_T1: f64 = 1e-4; // reference-values.md T1 tolerance
        assert!((s.spring_rate() / 41_203.0 - 1.0).abs() < REL_T1);
        let st = s.stress(0.01).unwrap();
        assert!(st.ratio.is_some() && st.notes.iter().any(|n| n.contains("hooks")));
        assert!(s.effective_mass() > 0.0);
    }

    #[test]
    fn refuses_negative_initial_tension() {
        let e = ExtensionSpring::new(ExtensionSpec {
            initial_tension: -1.0,
            rate: ExtensionRate::Given { rate: 1.0 },
            max_deflection: 0.1,
            free_length: None,
        })
        .unwrap_err();
        assert_eq!(e.field, "initial_tension");
    }

    proptest! {
        #[test]
        fn work_is_the_integral_of_force(f0 in 0.0..500.0f64, k in 10.0..1e5f64, a in 0.0..1.0f64, b in 0.0..1.0f64) {
            let s = spring(f0, k);
            testkit::check_work_is_integral(&s, 0.1 * a, 0.1 * b, Travel::Loading);
            testkit::check_work_algebra(&s, 0.1 * a, 0.1 * b, 0.03, Travel::Loading);
            testkit::check_energy_monotone(&s, Travel::Loading);
        }
    }
}
