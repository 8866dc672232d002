//! A figure with its provenance: value (SI), quantity kind, the formula or
//! method that produced it, the source of that method, and the assumptions.
//!
//! The web sheet, the printed report and the CLI only format these, so all
//! three say the same thing. A figure that cannot be computed keeps its place
//! with `value: None` and the reasons, so a panel is never blank.

use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// How far a published value or formula was confirmed (the codes used in the
/// project's reference table).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum SourceStatus {
    /// Read in the primary text (regulation, textbook worked example).
    Confirmed,
    /// Read in a secondary source quoting the standard; the standard itself
    /// was not read.
    Secondary,
    /// Derived from confirmed formulas by exact arithmetic.
    Derived,
    /// A fact of the trade with no single citable source.
    CommonPractice,
    /// Recalled but not checked against the document: confirm against the
    /// current edition before relying on it.
    FromMemory,
    /// Entered by the user (a user-defined limit); Joulewise has not checked it.
    UserSupplied,
}

impl SourceStatus {
    /// Short words for display beside a source.
    pub fn describe(self) -> &'static str {
        match self {
            Self::Confirmed => "confirmed in the primary text",
            Self::Secondary => "from a secondary source quoting the standard",
            Self::Derived => "derived from confirmed formulas",
            Self::CommonPractice => "common practice",
            Self::FromMemory => "from memory: confirm against the current edition",
            Self::UserSupplied => "supplied by the user: not checked by Joulewise",
        }
    }
}

/// Where a formula or a limit comes from.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Provenance {
    /// Document, e.g. `EN 13906-1:2013`, `ISO/TS 15066:2016`, `29 CFR 1910.179`.
    pub document: String,
    /// Clause, table or equation, e.g. `Table A.2`; empty when not known.
    pub clause: String,
    /// How far this was confirmed.
    pub status: SourceStatus,
}

impl Provenance {
    /// A provenance record.
    pub fn new(document: &str, clause: &str, status: SourceStatus) -> Self {
        Self {
            document: document.into(),
            clause: clause.into(),
            status,
        }
    }

    /// One line: `ISO/TS 15066:2016, Table A.2 (from a secondary source ...)`.
    pub fn cite(&self) -> String {
        if self.clause.is_empty() {
            format!("{} ({})", self.document, self.status.describe())
        } else {
            format!(
                "{}, {} ({})",
                self.document,
                self.clause,
                self.status.describe()
            )
        }
    }
}

/// Outcome of comparing a figure with a limit. Never conveyed by colour alone.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Verdict {
    /// Within the limit.
    Pass,
    /// The limit does not apply to this case (explained in the check's note).
    NotApplicable,
    /// The figure could not be computed, so the check could not be made.
    Unknown,
    /// Outside the limit.
    Fail,
}

impl Verdict {
    /// The verdict in words.
    pub fn word(self) -> &'static str {
        match self {
            Self::Pass => "within limit",
            Self::NotApplicable => "not applicable",
            Self::Unknown => "cannot check",
            Self::Fail => "exceeds limit",
        }
    }
}

/// One computed figure with everything needed to trust it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Figure {
    /// Stable identifier, e.g. `release.contact_speed`; used by checks, the
    /// tolerance study and tests.
    pub id: String,
    /// Label for people, e.g. `Speed at contact`.
    pub label: String,
    /// Quantity kind; the value is in this kind's SI unit.
    pub dim: Dim,
    /// Value in SI, or `None` when it cannot be computed (see `missing`).
    pub value: Option<f64>,
    /// Why the value is missing (names the fields at fault).
    pub missing: Vec<String>,
    /// Formula or method, e.g. `E = ½·k·(x₂² − x₁²) (Hooke's law)`.
    pub method: String,
    /// Source of the formula or method.
    pub source: String,
    /// Assumptions behind the value, e.g. `rigid frame`.
    pub assumptions: Vec<String>,
}

impl Figure {
    /// A computed figure. A non-finite value is recorded as missing, never
    /// passed on as NaN.
    pub fn new(id: &str, label: &str, dim: Dim, value: f64) -> Self {
        let mut f = Self {
            id: id.into(),
            label: label.into(),
            dim,
            value: None,
            missing: Vec::new(),
            method: String::new(),
            source: String::new(),
            assumptions: Vec::new(),
        };
        if value.is_finite() {
            f.value = Some(value);
        } else {
            f.missing
                .push("the computation gave no finite value for these inputs".into());
        }
        f
    }

    /// A figure that cannot be computed, with the reasons.
    pub fn missing(id: &str, label: &str, dim: Dim, reasons: Vec<String>) -> Self {
        let mut f = Self::new(id, label, dim, 0.0);
        f.value = None;
        f.missing = reasons;
        f
    }

    /// Set the formula or method.
    #[must_use]
    pub fn method(mut self, method: &str) -> Self {
        self.method = method.into();
        self
    }

    /// Set the source of the method.
    #[must_use]
    pub fn source(mut self, source: &str) -> Self {
        self.source = source.into();
        self
    }

    /// Add an assumption.
    #[must_use]
    pub fn assume(mut self, assumption: &str) -> Self {
        self.assumptions.push(assumption.into());
        self
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn non_finite_values_become_missing() {
        let f = Figure::new("x", "X", Dim::Energy, f64::NAN);
        assert_eq!(f.value, None);
        assert_eq!(f.missing.len(), 1);
    }

    #[test]
    fn verdict_order_puts_fail_last_so_max_is_worst() {
        assert!(Verdict::Fail > Verdict::Unknown && Verdict::Unknown > Verdict::Pass);
    }
}

/// Stable identifiers of the figures the models produce. Limit checks, the
/// tolerance study, the web sheet and the tests refer to figures by these
/// names, so they are shared here rather than spelled in each module.
pub mod ids {
    /// Spring rate (N/m or N·m/rad) at the latched state.
    pub const SPRING_RATE: &str = "spring.rate";
    /// Spring force (N or N·m) in the latched (loaded) state.
    pub const SPRING_FORCE_LATCHED: &str = "spring.force_latched";
    /// Spring force (N or N·m) in the released state (residual preload).
    pub const SPRING_FORCE_RELEASED: &str = "spring.force_released";
    /// Energy stored in the spring in the latched state, from free (J).
    pub const ENERGY_STORED_LATCHED: &str = "energy.stored_latched";
    /// Energy still stored when the part rests on its stop: what a lockout
    /// procedure must still release or block (J).
    pub const ENERGY_RESIDUAL: &str = "energy.residual";
    /// Energy the spring gives up between the latched and released states (J).
    pub const ENERGY_RELEASED: &str = "energy.released";
    /// Corrected shear stress of a helical spring at the latched state (Pa).
    pub const SPRING_SHEAR_STRESS: &str = "spring.shear_stress";
    /// Ratio of that stress to the material's permissible stress.
    pub const SPRING_STRESS_RATIO: &str = "spring.stress_ratio";

    /// Mass the moving part presents at the hazard point (kg): m plus the
    /// spring's share, or I/r² for a rotating part.
    pub const RELEASE_EFFECTIVE_MASS: &str = "release.effective_mass";
    /// Speed of the hazard point when contact begins (m/s).
    pub const RELEASE_CONTACT_SPEED: &str = "release.contact_speed";
    /// Kinetic energy of the moving part when contact begins (J).
    pub const RELEASE_KINETIC_ENERGY: &str = "release.kinetic_energy";
    /// Time from release to contact (s).
    pub const RELEASE_TIME_TO_CONTACT: &str = "release.time_to_contact";
    /// Where the part stops if it never reaches contact (m or rad from latch).
    pub const RELEASE_STALL_POSITION: &str = "release.stall_position";
    /// Static force the part exerts at the closing point when it comes to rest
    /// there (spring + drive + gravity − friction), N.
    pub const CLOSING_FORCE_STATIC: &str = "release.closing_force_static";

    /// Peak force on the buffer (N).
    pub const IMPACT_PEAK_FORCE: &str = "impact.peak_force";
    /// Buffer stroke used (m).
    pub const IMPACT_STROKE_USED: &str = "impact.stroke_used";
    /// Peak deceleration of the moving part (m/s²).
    pub const IMPACT_PEAK_DECELERATION: &str = "impact.peak_deceleration";
    /// Mean deceleration over the stop, contact speed / stopping time (m/s²).
    pub const IMPACT_MEAN_DECELERATION: &str = "impact.mean_deceleration";
    /// Time from contact to standstill (s).
    pub const IMPACT_STOP_TIME: &str = "impact.stop_time";
    /// Speed of the part as it leaves the buffer (m/s).
    pub const IMPACT_REBOUND_SPEED: &str = "impact.rebound_speed";
    /// Energy the buffer absorbs per cycle, kinetic plus drive work (J).
    pub const IMPACT_ENERGY_PER_CYCLE: &str = "impact.energy_per_cycle";
    /// Energy absorbed per hour at the cycle rate, as a mean heat load (W).
    pub const IMPACT_HEAT_LOAD: &str = "impact.heat_load";
    /// Speed left when the stroke is exhausted (bottoming), m/s; 0 if none.
    pub const IMPACT_RESIDUAL_SPEED: &str = "impact.residual_speed";
    /// Energy left for the hard stop when the stroke is exhausted (J).
    pub const IMPACT_RESIDUAL_ENERGY: &str = "impact.residual_energy";
    /// Effective mass 2·E_total/v² the trade uses to select absorbers (kg).
    pub const IMPACT_EFFECTIVE_MASS: &str = "impact.effective_mass";

    /// Reduced mass of the two-body contact (kg).
    pub const BODY_REDUCED_MASS: &str = "body.reduced_mass";
    /// Peak transient contact force on the body region (N).
    pub const BODY_TRANSIENT_FORCE: &str = "body.transient_force";
    /// Energy transferred to the body region (J).
    pub const BODY_TRANSFER_ENERGY: &str = "body.transfer_energy";
    /// Peak transient contact pressure (Pa).
    pub const BODY_TRANSIENT_PRESSURE: &str = "body.transient_pressure";
    /// Highest relative speed the region's limits permit (m/s).
    pub const BODY_PERMISSIBLE_SPEED: &str = "body.permissible_speed";
    /// Quasi-static clamping force when the part comes to rest on the body (N).
    pub const BODY_CLAMPING_FORCE: &str = "body.clamping_force";
    /// Quasi-static clamping pressure (Pa).
    pub const BODY_CLAMPING_PRESSURE: &str = "body.clamping_pressure";

    /// Smallest gap left at the closing point (m).
    pub const GAP_CLOSING_GAP: &str = "gap.closing_gap";

    /// Buffer sizing: stroke the sized buffer uses to stop the part (m).
    pub const SIZING_STROKE: &str = "sizing.stroke";
    /// Buffer sizing: rate of a sized linear spring, or the secant rate
    /// (end force / stroke) of a power-law buffer (N/m).
    pub const SIZING_RATE: &str = "sizing.rate";
    /// Buffer sizing: force level of a constant-force absorber (mean force)
    /// or a gas spring's force at contact (N).
    pub const SIZING_FORCE_LEVEL: &str = "sizing.force_level";
    /// Buffer sizing: coefficient c of an orifice damper F = c·v² (N·s²/m²).
    pub const SIZING_DAMPING: &str = "sizing.damping_coefficient";
    /// Buffer sizing: peak buffer force of the sized buffer (N).
    pub const SIZING_PEAK_FORCE: &str = "sizing.peak_force";
    /// Buffer sizing: peak deceleration of the part (m/s²).
    pub const SIZING_PEAK_DECELERATION: &str = "sizing.peak_deceleration";
    /// Buffer sizing: mean deceleration, contact speed / stopping time (m/s²).
    pub const SIZING_MEAN_DECELERATION: &str = "sizing.mean_deceleration";
    /// Buffer sizing: time from contact to standstill (s).
    pub const SIZING_STOP_TIME: &str = "sizing.stop_time";
    /// Buffer sizing: effective mass 2·E_total/v² used to select absorbers (kg).
    pub const SIZING_EFFECTIVE_MASS: &str = "sizing.effective_mass";
    /// Buffer sizing: energy per cycle, kinetic plus propelling work (J).
    pub const SIZING_ENERGY_PER_CYCLE: &str = "sizing.energy_per_cycle";
    /// Buffer sizing: energy per hour at the cycle rate (J, per hour).
    pub const SIZING_ENERGY_PER_HOUR: &str = "sizing.energy_per_hour";
    /// Buffer sizing: mean heat load of the energy the buffer absorbs (W).
    pub const SIZING_HEAT_LOAD: &str = "sizing.heat_load";
    /// Buffer sizing: energy left for the end stop when an orifice damper
    /// hands over at its residual speed (J).
    pub const SIZING_RESIDUAL_ENERGY: &str = "sizing.residual_energy";
}
