//! Spring models: force as a function of deflection and the energy stored
//! between any two deflections.
//!
//! Every model implements [`Spring`]. The coordinate `q` is the deflection
//! from the unloaded state in the spring's working sense (compression for a
//! compression spring, extension for an extension spring, wind-up angle for a
//! torsion spring), in m or rad; the generalised force is in N or N·m and is
//! positive when the spring pushes back towards `q = 0`.
//!
//! Models (one file each): [`linear`], [`helical`] (EN 13906-1, with the
//! [`material`] table), [`extension`] (initial tension), [`torsion`]
//! (EN 13906-2), [`gas`] (polytropic gas spring with a friction band),
//! [`disc`] (EN 16984 Almen–László stacks), [`table`] (measured curve, PCHIP),
//! [`combine`] (series and parallel, and the [`SpringModel`] enum over all of
//! them), and [`states`] (stored, released and residual energy between named
//! mechanism states).

use crate::error::InputError;
use crate::figure::SourceStatus;
use serde::{Deserialize, Serialize};

pub mod combine;
pub mod disc;
pub mod extension;
pub mod gas;
pub mod helical;
pub mod linear;
pub mod material;
mod solve;
pub mod states;
pub mod table;
pub mod torsion;

#[cfg(test)]
pub(crate) mod testkit;

pub use combine::{Parallel, Series, SpringModel, SpringSpec};
pub use disc::{DiscSpec, DiscStack};
pub use extension::{ExtensionSpec, ExtensionSpring};
pub use gas::{GasSpec, GasSpring};
pub use helical::{HelicalSpec, HelicalSpring};
pub use linear::{LinearSpec, LinearSpring};
pub use material::{Grade, Material};
pub use states::{State, StateRole, StatesReport};
pub use table::{TableSpec, TableSpring};
pub use torsion::{TorsionSpec, TorsionSpring};

/// The force law of a model in words, carried into every figure derived from
/// it so a reader can trace the number to a formula and a source.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ForceLaw {
    /// Model name, e.g. `helical compression spring`.
    pub model: String,
    /// Formula of force and energy, e.g. `F = k·s; W = ½·k·(s₂² − s₁²)`.
    pub formula: String,
    /// Document and clause the formula comes from.
    pub source: String,
    /// How far that source was confirmed.
    pub status: SourceStatus,
}

/// Which stress a spring model reports.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum StressKind {
    /// Corrected torsional shear stress in the wire (helical compression and
    /// extension springs).
    Shear,
    /// Corrected bending stress in the wire (torsion springs).
    Bending,
}

/// Wire stress at one deflection, with the permissible value it is compared
/// against when the material's strength is known.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StressAt {
    /// Shear or bending.
    pub kind: StressKind,
    /// Corrected stress (Pa).
    pub stress: f64,
    /// Permissible stress (Pa), `None` when the tensile strength is unknown.
    pub permissible: Option<f64>,
    /// `stress / permissible`, `None` when the permissible stress is unknown.
    pub ratio: Option<f64>,
    /// Formula used for the stress and the permissible value.
    pub method: String,
    /// Source of that formula.
    pub source: String,
    /// Why the permissible stress is missing, or other caveats.
    pub notes: Vec<String>,
}

/// Whether a spring's coordinate is a length or an angle.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Axis {
    /// Deflection in m, force in N, rate in N/m.
    Linear,
    /// Deflection in rad, torque in N·m, rate in N·m/rad.
    Rotary,
}

/// Direction of travel along the characteristic. Springs with hysteresis
/// (gas-spring seal friction, disc-stack friction, a measured unloading
/// curve) give a higher force while being loaded than while unloading; the
/// energy a released spring gives back is the integral of the unloading force.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Travel {
    /// Deflection increasing (spring being wound, compressed or stretched).
    Loading,
    /// Deflection decreasing (spring giving back energy).
    Unloading,
}

/// A spring acting along one coordinate.
///
/// Implementations are validated on construction (constructors return
/// `Result<Self, InputError>`), so these methods never fail; a deflection
/// outside [`Spring::deflection_range`] is reported by
/// [`Spring::check_deflection`] and the other methods extrapolate the model.
pub trait Spring {
    /// Linear (N, m) or rotary (N·m, rad).
    fn axis(&self) -> Axis;

    /// Force (N) or torque (N·m) at deflection `q`, on the given branch.
    fn force(&self, q: f64, travel: Travel) -> f64;

    /// Work ∫ force dq from `q1` to `q2` on the given branch (J), exact:
    /// closed form where one exists, otherwise the exact integral of the
    /// interpolant. Sign follows the limits (`work(a, b) = −work(b, a)`).
    fn work(&self, q1: f64, q2: f64, travel: Travel) -> f64;

    /// Admissible deflections `(min, max)`; `max` is e.g. the deflection at
    /// solid length, the end of a gas spring's stroke or the flat disc.
    fn deflection_range(&self) -> (f64, f64);

    /// The spring's own mass share that moves with the part (kg), e.g. one
    /// third of a helical spring's mass (Rayleigh). Zero when unknown.
    fn effective_mass(&self) -> f64 {
        0.0
    }

    /// Local rate dF/dq (N/m or N·m/rad) on the loading branch; default is a
    /// central difference, models with a closed form override it.
    fn rate(&self, q: f64) -> f64 {
        let (lo, hi) = self.deflection_range();
        let h = ((hi - lo).abs() * 1e-6).max(1e-12);
        let a = (q - h).max(lo);
        let b = (q + h).min(hi);
        if b > a {
            (self.force(b, Travel::Loading) - self.force(a, Travel::Loading)) / (b - a)
        } else {
            0.0
        }
    }

    /// The model's force law, formula and source, for figure provenance.
    /// Models override this; the default names no source.
    fn force_law(&self) -> ForceLaw {
        ForceLaw {
            model: "spring".into(),
            formula: "W = ∫F dq".into(),
            source: String::new(),
            status: SourceStatus::CommonPractice,
        }
    }

    /// Corrected wire stress at deflection `q` (loading branch), for models
    /// that know their wire geometry; `None` otherwise.
    fn stress(&self, _q: f64) -> Option<StressAt> {
        None
    }

    /// Worrying but valid facts about the spring as entered (a spring index
    /// outside the usual range, a falling characteristic, buckling, a
    /// discrepancy in the material data). Empty by default.
    fn notes(&self) -> Vec<String> {
        Vec::new()
    }

    /// `Ok(())` when `q` lies in the admissible range, otherwise an error on
    /// `field` that states the range.
    fn check_deflection(&self, field: &str, q: f64) -> Result<(), InputError> {
        let (lo, hi) = self.deflection_range();
        if q.is_finite() && q >= lo - 1e-12 && q <= hi + 1e-12 {
            Ok(())
        } else {
            Err(crate::error::InputError::new(
                field,
                crate::error::Problem::OutOfRange { min: lo, max: hi },
            ))
        }
    }
}
