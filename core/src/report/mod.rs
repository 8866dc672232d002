//! The report: everything an assessment found, in one serialisable value the
//! web sheet, the printed report and the CLI all format the same way.
//!
//! A report always exists for a readable scenario: an input error removes
//! only the figures that depend on it (they stay, marked missing with the
//! reason), never the whole report.

use crate::cautions::AppliedCaution;
use crate::error::InputError;
use crate::figure::{ids, Figure, Verdict};
use crate::identify::RateEstimate;
use crate::limits::Check;
use crate::release::HistoryPoint;
use crate::scenario::Identity;
use crate::sizing::SizingOutcome;
use crate::spring::{Axis, StatesReport};
use crate::tolerance::{MonteCarloResult, WorstCase};
use crate::units::{Dim, UnitSystem};
use serde::Serialize;

/// The outcome of one assessment.
#[derive(Debug, Clone, Serialize)]
pub struct Report {
    /// Program name and version that produced the report.
    pub program: String,
    /// Format version of the scenario assessed.
    pub schema_version: u32,
    /// SHA-256 of the scenario's canonical JSON (hex): ties a printed
    /// report to exactly the inputs it came from.
    pub scenario_hash: String,
    /// Who, what, where, when.
    pub identity: Identity,
    /// Units the figures are to be shown in.
    pub display_units: UnitSystem,
    /// Every numeric input as typed, with its SI value.
    pub inputs: Vec<InputLine>,
    /// Input errors, each naming its field path.
    pub errors: Vec<InputError>,
    /// Every figure, computed or missing with the reason.
    pub figures: Vec<Figure>,
    /// Every check against a limit.
    pub checks: Vec<Check>,
    /// Cautions that apply, with what brought each up.
    pub cautions: Vec<AppliedCaution>,
    /// Worst verdict over the checks that count (pass when there are none).
    pub verdict: Verdict,
    /// How many checks have each verdict.
    pub counts: VerdictCounts,
    /// Worrying but valid facts from the models (stall, bottoming, buckling,
    /// values from memory...), in words.
    pub notes: Vec<String>,
    /// Force–deflection curve of the spring with its states, for the plot.
    pub spring_curve: Option<SpringCurve>,
    /// Time history from release through the stop (one clock).
    pub history: Vec<HistoryPoint>,
    /// Index in `history` of the first point after contact, if any.
    pub contact_index: Option<usize>,
    /// Energy in each state of the spring.
    pub states: Option<StatesReport>,
    /// Buffer sizing per type, when asked for.
    pub sizing: Vec<SizingOutcome>,
    /// Field identification of the spring, when used.
    pub identification: Option<RateEstimate>,
    /// A second identification of the same spring, when given.
    pub identification_check: Option<RateEstimate>,
    /// The two identifications compared: agreement within 2 combined
    /// standard uncertainties, else the likely causes.
    pub identification_comparison: Option<crate::identify::Comparison>,
    /// Tolerance study, when run.
    pub study: Option<StudyReport>,
}

impl Report {
    /// The figure with this id, if present.
    pub fn figure(&self, id: &str) -> Option<&Figure> {
        self.figures.iter().find(|f| f.id == id)
    }

    /// The value of the figure with this id, if computed.
    pub fn value(&self, id: &str) -> Option<f64> {
        self.figure(id).and_then(|f| f.value)
    }
}

/// One input as typed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct InputLine {
    /// Dotted path.
    pub path: String,
    /// Kind of quantity.
    pub dim: Dim,
    /// Text as typed.
    pub text: String,
    /// SI value, when readable.
    pub si: Option<f64>,
    /// Tolerance as typed, if any.
    pub tolerance: String,
}

/// Count of checks per verdict.
#[derive(Debug, Clone, Copy, Default, PartialEq, Eq, Serialize)]
pub struct VerdictCounts {
    /// Within limit.
    pub pass: usize,
    /// Exceeds limit.
    pub fail: usize,
    /// Cannot check.
    pub unknown: usize,
    /// Not applicable.
    pub not_applicable: usize,
}

/// Points of a spring's characteristic for the force–deflection plot.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SpringCurve {
    /// Linear (m, N) or rotary (rad, N·m).
    pub axis: Axis,
    /// `(deflection, force)` on the loading branch.
    pub loading: Vec<[f64; 2]>,
    /// `(deflection, force)` on the unloading branch when it differs.
    pub unloading: Option<Vec<[f64; 2]>>,
    /// Named states: `(name, deflection)`; the energy between latched and
    /// released is the area to shade.
    pub states: Vec<(String, f64)>,
    /// Deflection in the latched state.
    pub latched: Option<f64>,
    /// Deflection in the released state.
    pub released: Option<f64>,
}

/// The tolerance study: which inputs varied, the worst-case corners and the
/// Monte Carlo percentiles, with exceedance probabilities per limit.
#[derive(Debug, Clone, PartialEq, Serialize, serde::Deserialize)]
pub struct StudyReport {
    /// The toleranced inputs: path, nominal, low, high (SI).
    pub inputs: Vec<StudyInputLine>,
    /// Figures followed, by id, with their kind.
    pub figures: Vec<(String, Dim)>,
    /// Limits followed: check id, figure index, threshold, at most?
    pub limits: Vec<StudyLimit>,
    /// Worst-case corners.
    pub worst_case: Option<WorstCase>,
    /// Monte Carlo.
    pub monte_carlo: Option<MonteCarloResult>,
}

/// A toleranced input of the study.
#[derive(Debug, Clone, PartialEq, Serialize, serde::Deserialize)]
pub struct StudyInputLine {
    /// Dotted path.
    pub path: String,
    /// Kind.
    pub dim: Dim,
    /// Nominal (SI).
    pub nominal: f64,
    /// Lowest value (SI).
    pub low: f64,
    /// Highest value (SI).
    pub high: f64,
    /// Uniform or normal.
    pub spread: crate::scenario::Spread,
}

/// A limit followed by the study.
#[derive(Debug, Clone, PartialEq, Serialize, serde::Deserialize)]
pub struct StudyLimit {
    /// Check id.
    pub check: String,
    /// Check label.
    pub label: String,
    /// Figure id.
    pub figure: String,
    /// Threshold (SI).
    pub threshold: f64,
    /// True for "at most", false for "at least".
    pub at_most: bool,
}

/// Kind of quantity of a figure id, for user limits and the study. Spring
/// force and rate figures are listed with their linear kinds (N, N/m); a
/// rotary spring's figures carry their own kinds in the report.
pub fn figure_dim(id: &str) -> Option<Dim> {
    use ids::*;
    let d = match id {
        SPRING_RATE => Dim::LinearRate,
        SPRING_FORCE_LATCHED | SPRING_FORCE_RELEASED => Dim::Force,
        ENERGY_STORED_LATCHED | ENERGY_RESIDUAL | ENERGY_RELEASED => Dim::Energy,
        SPRING_SHEAR_STRESS => Dim::Pressure,
        SPRING_STRESS_RATIO => Dim::Ratio,
        RELEASE_EFFECTIVE_MASS | IMPACT_EFFECTIVE_MASS | BODY_REDUCED_MASS => Dim::Mass,
        RELEASE_CONTACT_SPEED
        | IMPACT_REBOUND_SPEED
        | IMPACT_RESIDUAL_SPEED
        | BODY_PERMISSIBLE_SPEED => Dim::Speed,
        RELEASE_KINETIC_ENERGY
        | IMPACT_ENERGY_PER_CYCLE
        | IMPACT_RESIDUAL_ENERGY
        | BODY_TRANSFER_ENERGY => Dim::Energy,
        RELEASE_TIME_TO_CONTACT | IMPACT_STOP_TIME => Dim::Time,
        RELEASE_STALL_POSITION | IMPACT_STROKE_USED | GAP_CLOSING_GAP => Dim::Length,
        CLOSING_FORCE_STATIC | IMPACT_PEAK_FORCE | BODY_TRANSIENT_FORCE | BODY_CLAMPING_FORCE => {
            Dim::Force
        }
        IMPACT_PEAK_DECELERATION | IMPACT_MEAN_DECELERATION => Dim::Acceleration,
        IMPACT_HEAT_LOAD => Dim::Power,
        BODY_TRANSIENT_PRESSURE | BODY_CLAMPING_PRESSURE => Dim::Pressure,
        _ => return None,
    };
    Some(d)
}

/// Every figure id a user limit may name, with its kind.
pub fn figure_catalogue() -> Vec<(&'static str, Dim)> {
    use ids::*;
    [
        SPRING_RATE,
        SPRING_FORCE_LATCHED,
        SPRING_FORCE_RELEASED,
        ENERGY_STORED_LATCHED,
        ENERGY_RESIDUAL,
        ENERGY_RELEASED,
        SPRING_SHEAR_STRESS,
        SPRING_STRESS_RATIO,
        RELEASE_EFFECTIVE_MASS,
        RELEASE_CONTACT_SPEED,
        RELEASE_KINETIC_ENERGY,
        RELEASE_TIME_TO_CONTACT,
        RELEASE_STALL_POSITION,
        CLOSING_FORCE_STATIC,
        IMPACT_PEAK_FORCE,
        IMPACT_STROKE_USED,
        IMPACT_PEAK_DECELERATION,
        IMPACT_MEAN_DECELERATION,
        IMPACT_STOP_TIME,
        IMPACT_REBOUND_SPEED,
        IMPACT_ENERGY_PER_CYCLE,
        IMPACT_HEAT_LOAD,
        IMPACT_RESIDUAL_SPEED,
        IMPACT_RESIDUAL_ENERGY,
        IMPACT_EFFECTIVE_MASS,
        BODY_REDUCED_MASS,
        BODY_TRANSIENT_FORCE,
        BODY_TRANSFER_ENERGY,
        BODY_TRANSIENT_PRESSURE,
        BODY_PERMISSIBLE_SPEED,
        BODY_CLAMPING_FORCE,
        BODY_CLAMPING_PRESSURE,
        GAP_CLOSING_GAP,
    ]
    .into_iter()
    .filter_map(|id| figure_dim(id).map(|d| (id, d)))
    .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_catalogued_figure_has_a_kind() {
        assert!(figure_catalogue().len() >= 30);
        assert_eq!(figure_dim("no.such.figure"), None);
    }
}
