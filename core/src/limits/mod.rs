//! Limit sets: published limits held as data, and pure functions that compare
//! a figure with a limit and say by how much it passes or fails.
//!
//! A [`Check`] names the figure it compares (an id from
//! [`crate::figure::ids`] or [`input_ids`]), the figure's value in SI, the
//! comparison, the limit in SI, the margin, the verdict and the provenance of
//! the limit (document, clause or table, and how far it was confirmed: a limit
//! recalled but not read carries [`SourceStatus::FromMemory`] and says so in
//! its notes).
//!
//! Margins, for a figure value `x` and a limit `L` (both SI):
//! - **at most** (`x ≤ L`): margin ratio (utilisation) `u = x / L`, margin
//!   difference (headroom) `d = L − x`;
//! - **at least** (`x ≥ L`): margin ratio `u = L / x`, margin difference
//!   `d = x − L`.
//!
//! In both cases `u ≤ 1` and `d ≥ 0` mean "within the limit", `u = 1` and
//! `d = 0` mean "exactly at the limit", which passes. The ratio is `None` when
//! its denominator is zero or negative (for example a gap of 0 against a
//! minimum gap): the difference is then the margin to read. A figure that
//! could not be computed gives [`Verdict::Unknown`] with the reason; no NaN
//! ever appears in a check.
//!
//! The sets: [`guards`] (ISO 14120:2015, from memory), [`body`] (ISO/TS
//! 15066:2016 Tables A.2 and A.3), [`gaps`] (ISO 13854:2017 Table 1),
//! [`lift`] (EN 81-20:2014/2020 clause 5.8, and California Title 8 §3108,
//! §1604.14, §3031), [`crane`] (29 CFR 1910.179(e)), [`gates`] (EN 12453),
//! and [`user`] (limits the user enters). [`catalogue`] lists them all with
//! values, units, sources and status, for the "how these figures were
//! checked" page and the printed report.

pub mod body;
pub mod crane;
pub mod gaps;
pub mod gates;
pub mod guards;
pub mod lift;
pub mod user;

use crate::cautions::CautionId;
use crate::figure::{Figure, Provenance, SourceStatus, Verdict};
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// Two figures that agree to this relative tolerance count as equal when
/// compared with a limit. Reason: inputs are typed in decimal and converted to
/// binary SI (e.g. `135 mm` → 0.135 m), which can land one or two ulps
/// (≈ 2e-16 relative) either side of the limit computed by a formula; a
/// stroke of exactly 135 mm must not fail a 135 mm minimum because of
/// representation error. 1e-9 is far above rounding noise and far below any
/// physical meaning (a nanometre on a metre).
pub const BOUNDARY_REL_TOL: f64 = 1e-9;

/// US customary and other conversion factors used by the rules that are
/// written in those units. All exact by definition (NIST SP 811 (2008)
/// Appendix B.8: 1 ft = 0.3048 m, 1 in = 0.0254 m, 1 lb = 0.453 592 37 kg,
/// 1 lbf = 1 lb × g_n).
pub mod us_units {
    /// 1 foot in metres (exact).
    pub const FOOT: f64 = 0.3048;
    /// 1 inch in metres (exact).
    pub const INCH: f64 = 0.0254;
    /// 1 ft/min in m/s (exact: 0.3048 / 60).
    pub const FOOT_PER_MINUTE: f64 = 0.00508;
    /// 1 pound-force in newtons (exact: 0.453 592 37 kg × 9.806 65 m/s²).
    pub const POUND_FORCE: f64 = 4.448_221_615_260_5;
    /// 1 pound (avoirdupois) in kilograms (exact).
    pub const POUND: f64 = 0.453_592_37;
}

/// Identifiers of values a check may compare that are entered by the user
/// (measured, or read from a data sheet) rather than computed by a model.
/// Computed figures use [`crate::figure::ids`].
pub mod input_ids {
    /// Force that actuates a guard's sensing edge (N), from its data sheet or a test.
    pub const GUARD_EDGE_ACTUATION_FORCE: &str = "guard.edge_actuation_force";
    /// Rated speed of a lift, hoist or crane motion (m/s).
    pub const RATED_SPEED: &str = "lift.rated_speed";
    /// Speed at which the car or counterweight strikes the buffer when a
    /// monitored terminal slowdown is fitted (m/s).
    pub const BUFFER_IMPACT_SPEED: &str = "lift.buffer_impact_speed";
    /// Full stroke of a buffer as built (m).
    pub const BUFFER_STROKE: &str = "buffer.stroke";
    /// Static force that compresses a linear lift buffer through its required
    /// stroke (N).
    pub const BUFFER_STATIC_FORCE_AT_STROKE: &str = "buffer.static_force_at_stroke";
    /// Static force that compresses a spring buffer solid (N).
    pub const BUFFER_FORCE_TO_SOLID: &str = "buffer.force_to_solid";
    /// Total time the deceleration exceeds 2.5 g during a buffer stop (s).
    pub const BUFFER_TIME_ABOVE_2_5_G: &str = "impact.time_above_2_5_g";
    /// Energy a crane bumper can absorb (J), from its data sheet.
    pub const CRANE_BUMPER_ENERGY_CAPACITY: &str = "crane.bumper_energy_capacity";
    /// Peak force measured on a powered gate or door after impact (N).
    pub const GATE_DYNAMIC_FORCE: &str = "gate.dynamic_force";
    /// Time from impact until the force on a powered gate falls to 150 N and
    /// stays there (s).
    pub const GATE_TIME_ABOVE_RESIDUAL: &str = "gate.time_above_150_n";
    /// Highest force on a powered gate after the dynamic period (N).
    pub const GATE_RESIDUAL_FORCE: &str = "gate.residual_force";
    /// Force on a powered gate 5 s after impact (N).
    pub const GATE_END_FORCE: &str = "gate.end_force";
}

/// How a figure is compared with its limit.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum Comparison {
    /// The figure must not exceed the limit (`x ≤ L`).
    AtMost,
    /// The figure must reach the limit (`x ≥ L`).
    AtLeast,
    /// The situation is not permitted at all: any value above zero fails
    /// (e.g. transient contact with the head).
    NotPermitted,
}

impl Comparison {
    /// The comparison as a symbol or short words, for tables.
    pub fn symbol(self) -> &'static str {
        match self {
            Self::AtMost => "≤",
            Self::AtLeast => "≥",
            Self::NotPermitted => "not permitted",
        }
    }

    /// The comparison in words, for sentences.
    pub fn words(self) -> &'static str {
        match self {
            Self::AtMost => "at most",
            Self::AtLeast => "at least",
            Self::NotPermitted => "not permitted",
        }
    }
}

/// What a check is about: its own id and label, and the figure it compares.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct Subject {
    /// Stable id of the check, e.g. `guard.closing_force`.
    pub id: String,
    /// Label for people, e.g. `Closing force of the guard`.
    pub label: String,
    /// Id of the figure compared (see [`crate::figure::ids`], [`input_ids`]).
    pub figure: String,
    /// Quantity kind of the figure and the limit.
    pub dim: Dim,
}

impl Subject {
    /// A subject.
    pub fn new(id: &str, label: &str, figure: &str, dim: Dim) -> Self {
        Self {
            id: id.into(),
            label: label.into(),
            figure: figure.into(),
            dim,
        }
    }
}

/// One figure compared with one limit, with margin, verdict and source.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Check {
    /// Stable id of the check, e.g. `lift.en81.stroke`.
    pub id: String,
    /// Label for people.
    pub label: String,
    /// Id of the figure compared.
    pub figure: String,
    /// The figure's value in SI; `None` when it could not be computed.
    pub value: Option<f64>,
    /// Quantity kind of the value and the limit.
    pub dim: Dim,
    /// How the value is compared with the limit.
    pub comparison: Comparison,
    /// The limit in SI; `None` for [`Comparison::NotPermitted`], for a check
    /// that does not apply, or when the limit itself could not be formed.
    pub limit: Option<f64>,
    /// Utilisation: `x/L` for at most, `L/x` for at least; ≤ 1 is within the
    /// limit. `None` when undefined (denominator zero or negative, or no value).
    pub margin_ratio: Option<f64>,
    /// Headroom in SI: `L − x` for at most, `x − L` for at least; ≥ 0 is
    /// within the limit.
    pub margin_difference: Option<f64>,
    /// Pass, fail, unknown (figure missing) or not applicable (see notes).
    pub verdict: Verdict,
    /// Where the limit comes from and how far it was confirmed.
    pub provenance: Provenance,
    /// An informative comparison (e.g. a rule written for another kind of
    /// machine): shown, but never counted in the overall verdict.
    pub informative: bool,
    /// Explanations: why a value is missing, why a rule does not apply, what
    /// the limit assumes, a prompt to confirm a value from memory.
    pub notes: Vec<String>,
    /// Cautions this check triggers (see [`crate::cautions`]).
    pub cautions: Vec<CautionId>,
}

impl Check {
    fn blank(subject: Subject, comparison: Comparison, provenance: Provenance) -> Self {
        let mut c = Self {
            id: subject.id,
            label: subject.label,
            figure: subject.figure,
            value: None,
            dim: subject.dim,
            comparison,
            limit: None,
            margin_ratio: None,
            margin_difference: None,
            verdict: Verdict::Unknown,
            provenance,
            informative: false,
            notes: Vec::new(),
            cautions: Vec::new(),
        };
        match c.provenance.status {
            SourceStatus::FromMemory => {
                c.notes.push(format!(
                    "This limit is from memory and was not read in {}: confirm it against the current edition before relying on the verdict.",
                    c.provenance.document
                ));
                c.cautions.push(CautionId::ValuesFromMemory);
            }
            SourceStatus::Secondary => c.cautions.push(CautionId::ValuesFromSecondarySource),
            SourceStatus::UserSupplied => c.cautions.push(CautionId::UserSuppliedLimit),
            SourceStatus::Confirmed | SourceStatus::Derived | SourceStatus::CommonPractice => {}
        }
        c
    }

    /// Record the value, turning a non-finite one into a missing one with a note.
    fn take_value(&mut self, value: Option<f64>) {
        match value {
            Some(v) if v.is_finite() => self.value = Some(v),
            Some(_) => self.notes.push(format!(
                "The figure `{}` is not a finite number, so this check could not be made.",
                self.figure
            )),
            None => self.notes.push(format!(
                "The figure `{}` could not be computed or was not given, so this check could not be made.",
                self.figure
            )),
        }
    }

    /// Compare `value` with `limit`: passes when `value ≤ limit` (within
    /// [`BOUNDARY_REL_TOL`]). Margin ratio `value/limit`, difference
    /// `limit − value`. A missing or non-finite value gives
    /// [`Verdict::Unknown`]; a non-finite limit too.
    pub fn at_most(
        subject: Subject,
        value: Option<f64>,
        limit: f64,
        provenance: Provenance,
    ) -> Self {
        Self::compare(subject, value, Comparison::AtMost, limit, provenance)
    }

    /// Compare `value` with `limit`: passes when `value ≥ limit` (within
    /// [`BOUNDARY_REL_TOL`]). Margin ratio `limit/value`, difference
    /// `value − limit`. A missing or non-finite value gives
    /// [`Verdict::Unknown`]; a non-finite limit too.
    pub fn at_least(
        subject: Subject,
        value: Option<f64>,
        limit: f64,
        provenance: Provenance,
    ) -> Self {
        Self::compare(subject, value, Comparison::AtLeast, limit, provenance)
    }

    /// A situation that is not permitted at any magnitude: fails when `value`
    /// is above zero, passes when it is zero or less (the situation does not
    /// arise), unknown when missing. No limit value, no margins.
    pub fn not_permitted(subject: Subject, value: Option<f64>, provenance: Provenance) -> Self {
        let mut c = Self::blank(subject, Comparison::NotPermitted, provenance);
        c.take_value(value);
        c.verdict = match c.value {
            None => Verdict::Unknown,
            Some(v) if v > 0.0 => Verdict::Fail,
            Some(_) => {
                c.notes.push(
                    "The figure is zero: the situation that is not permitted does not arise."
                        .into(),
                );
                Verdict::Pass
            }
        };
        c
    }

    /// A limit that does not apply to this case, with the reason. The value
    /// is kept for display; there is no limit and no margin, and the
    /// comparison is recorded as at most only nominally.
    pub fn not_applicable(
        subject: Subject,
        value: Option<f64>,
        provenance: Provenance,
        why: &str,
    ) -> Self {
        let mut c = Self::blank(subject, Comparison::AtMost, provenance);
        c.value = value.filter(|v| v.is_finite());
        c.verdict = Verdict::NotApplicable;
        c.notes.push(why.into());
        c
    }

    /// A check whose limit cannot be formed (e.g. it depends on a mass that
    /// was not given): [`Verdict::Unknown`], no limit, with the reason.
    pub fn unknown_limit(
        subject: Subject,
        comparison: Comparison,
        value: Option<f64>,
        provenance: Provenance,
        why: &str,
    ) -> Self {
        let mut c = Self::blank(subject, comparison, provenance);
        c.value = value.filter(|v| v.is_finite());
        c.verdict = Verdict::Unknown;
        c.notes.push(why.into());
        c
    }

    fn compare(
        subject: Subject,
        value: Option<f64>,
        comparison: Comparison,
        limit: f64,
        provenance: Provenance,
    ) -> Self {
        let mut c = Self::blank(subject, comparison, provenance);
        c.take_value(value);
        if !limit.is_finite() {
            c.notes
                .push("The limit is not a finite number, so this check could not be made.".into());
            c.verdict = Verdict::Unknown;
            return c;
        }
        c.limit = Some(limit);
        let Some(x) = c.value else {
            c.verdict = Verdict::Unknown;
            return c;
        };
        let tied = (x - limit).abs() <= BOUNDARY_REL_TOL * x.abs().max(limit.abs());
        let (num, den, diff, within) = match comparison {
            Comparison::AtLeast => (limit, x, x - limit, x >= limit),
            // NotPermitted never reaches here; treat it as at most for safety.
            Comparison::AtMost | Comparison::NotPermitted => (x, limit, limit - x, x <= limit),
        };
        if tied {
            c.margin_difference = Some(0.0);
            c.margin_ratio = (den > 0.0).then_some(1.0);
            c.verdict = Verdict::Pass;
        } else {
            c.margin_difference = diff.is_finite().then_some(diff);
            c.margin_ratio = if den > 0.0 {
                let r = num / den;
                r.is_finite().then_some(r)
            } else {
                None
            };
            c.verdict = if within { Verdict::Pass } else { Verdict::Fail };
        }
        c
    }

    /// Add a note.
    #[must_use]
    pub fn note(mut self, note: &str) -> Self {
        self.notes.push(note.into());
        self
    }

    /// Add a caution this check triggers (kept once).
    #[must_use]
    pub fn caution(mut self, id: CautionId) -> Self {
        if !self.cautions.contains(&id) {
            self.cautions.push(id);
        }
        self
    }

    /// Mark the check as informative: shown, not counted in the overall verdict.
    #[must_use]
    pub fn informative(mut self) -> Self {
        self.informative = true;
        self
    }

    /// When the value is missing, add the reasons it is missing (e.g. a
    /// figure's `missing` list). Does nothing when the value is present.
    #[must_use]
    pub fn missing_because(mut self, reasons: &[String]) -> Self {
        if self.value.is_none() {
            self.notes.extend(reasons.iter().cloned());
        }
        self
    }
}

/// The worst verdict among the checks that count (informative ones are
/// skipped), ordered Fail > Unknown > NotApplicable > Pass. `None` when no
/// check counts.
pub fn worst_verdict(checks: &[Check]) -> Option<Verdict> {
    checks
        .iter()
        .filter(|c| !c.informative)
        .map(|c| c.verdict)
        .max()
}

/// The value of figure `id` among `figures`, or the reasons it is missing
/// (the figure's own reasons, or that no such figure was computed).
pub fn figure_value(figures: &[Figure], id: &str) -> Result<f64, Vec<String>> {
    match figures.iter().find(|f| f.id == id) {
        Some(f) => match f.value {
            Some(v) if v.is_finite() => Ok(v),
            _ => Err(if f.missing.is_empty() {
                vec![format!("the figure `{id}` has no value")]
            } else {
                f.missing.clone()
            }),
        },
        None => Err(vec![format!(
            "no figure `{id}` was computed in this assessment"
        )]),
    }
}

/// Which limit set a check or catalogue entry belongs to.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum LimitSetId {
    /// Power-operated and self-closing guards (ISO 14120:2015, from memory).
    Guards,
    /// Body regions (ISO/TS 15066:2016 Tables A.2, A.3).
    BodyRegions,
    /// Minimum gaps against crushing (ISO 13854:2017 Table 1).
    CrushingGaps,
    /// Lift buffers (EN 81-20:2014/2020 clause 5.8).
    LiftBuffersEn81,
    /// Lift and hoist buffers, US (California Title 8, following ASME A17.1).
    LiftBuffersUs,
    /// Crane bridge and trolley bumpers (29 CFR 1910.179(e)).
    CraneBumpers,
    /// Power-operated doors and gates (EN 12453).
    PoweredGates,
    /// Limits entered by the user.
    UserDefined,
}

/// One value or rule of a limit set, for the catalogue.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LimitEntry {
    /// Stable key within the set, e.g. `force_no_device`.
    pub key: String,
    /// What is limited, in words.
    pub quantity: String,
    /// How a figure is compared with it.
    pub comparison: Comparison,
    /// The value in SI, or `None` when the entry is a rule or formula
    /// (see `rule`) or a prohibition.
    pub value: Option<f64>,
    /// Quantity kind of the value (its SI unit via [`Dim::si_symbol`]).
    pub dim: Dim,
    /// The rule as a formula or sentence, e.g. `s ≥ 0.135·v², s ≥ 65 mm`.
    pub rule: String,
    /// The value as the source writes it, in its own units, e.g. `3 ft/s²`.
    pub as_published: String,
    /// Document, clause or table, and how far it was confirmed.
    pub provenance: Provenance,
    /// Scope, conditions, caveats.
    pub note: String,
    /// True for a model parameter or an instrument definition listed with
    /// the set (e.g. a body region's spring constant): not a limit, so no
    /// comparison applies to it.
    pub parameter: bool,
}

impl LimitEntry {
    /// An entry; builder-style setters below fill the rest.
    pub(crate) fn new(
        key: &str,
        quantity: &str,
        comparison: Comparison,
        dim: Dim,
        provenance: Provenance,
    ) -> Self {
        Self {
            key: key.into(),
            quantity: quantity.into(),
            comparison,
            value: None,
            dim,
            rule: String::new(),
            as_published: String::new(),
            provenance,
            note: String::new(),
            parameter: false,
        }
    }

    #[must_use]
    pub(crate) fn parameter(mut self) -> Self {
        self.parameter = true;
        self
    }

    #[must_use]
    pub(crate) fn value(mut self, v: f64) -> Self {
        self.value = Some(v);
        self
    }

    #[must_use]
    pub(crate) fn rule(mut self, r: &str) -> Self {
        self.rule = r.into();
        self
    }

    #[must_use]
    pub(crate) fn published(mut self, p: &str) -> Self {
        self.as_published = p.into();
        self
    }

    #[must_use]
    pub(crate) fn note(mut self, n: &str) -> Self {
        self.note = n.into();
        self
    }
}

/// A limit set with every value, its sources and an explanation in our own words.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct LimitSet {
    /// Which set.
    pub id: LimitSetId,
    /// Title for people.
    pub title: String,
    /// Documents with edition, e.g. `ISO 13854:2017`.
    pub documents: Vec<String>,
    /// What the set applies to, and what it does not cover.
    pub scope: String,
    /// Explanation and caution shown beside the set, in our own words.
    pub explanation: String,
    /// The values and rules.
    pub entries: Vec<LimitEntry>,
    /// Cautions that always go with this set.
    pub cautions: Vec<CautionId>,
}

impl LimitSet {
    /// True when any entry is from memory: the app must prompt the user to
    /// confirm against the current edition.
    pub fn has_values_from_memory(&self) -> bool {
        self.entries
            .iter()
            .any(|e| e.provenance.status == SourceStatus::FromMemory)
    }
}

/// Every built-in limit set with its values, units, sources and status, in a
/// fixed order. User-defined limits are added by [`catalogue_with_user`].
pub fn catalogue() -> Vec<LimitSet> {
    vec![
        guards::limit_set(),
        body::limit_set(),
        gaps::limit_set(),
        lift::en81_limit_set(),
        lift::us_limit_set(),
        crane::limit_set(),
        gates::limit_set(),
    ]
}

/// [`catalogue`] followed by a set holding the user's own limits (if any).
pub fn catalogue_with_user(limits: &[user::UserLimit]) -> Vec<LimitSet> {
    let mut all = catalogue();
    if !limits.is_empty() {
        all.push(user::limit_set(limits));
    }
    all
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;
    use proptest::prelude::*;

    fn subj() -> Subject {
        Subject::new("t.check", "Test", "t.figure", Dim::Force)
    }

    fn prov() -> Provenance {
        Provenance::new("Test document", "", SourceStatus::Derived)
    }

    #[test]
    fn at_most_margins_are_utilisation_and_headroom() {
        // Arithmetic of the margin definitions (module doc), no outside source.
        let c = Check::at_most(subj(), Some(60.0), 75.0, prov());
        assert_eq!(c.verdict, Verdict::Pass);
        assert_relative_eq!(c.margin_ratio.unwrap(), 0.8, max_relative = REL_EXACT);
        assert_relative_eq!(c.margin_difference.unwrap(), 15.0, max_relative = REL_EXACT);
        let f = Check::at_most(subj(), Some(90.0), 75.0, prov());
        assert_eq!(f.verdict, Verdict::Fail);
        assert_relative_eq!(f.margin_ratio.unwrap(), 1.2, max_relative = REL_EXACT);
        assert_relative_eq!(
            f.margin_difference.unwrap(),
            -15.0,
            max_relative = REL_EXACT
        );
    }

    #[test]
    fn at_least_margins_are_inverted_utilisation_and_headroom() {
        let c = Check::at_least(subj(), Some(0.030), 0.025, prov());
        assert_eq!(c.verdict, Verdict::Pass);
        assert_relative_eq!(
            c.margin_ratio.unwrap(),
            0.025 / 0.030,
            max_relative = REL_EXACT
        );
        assert_relative_eq!(
            c.margin_difference.unwrap(),
            0.005,
            max_relative = REL_EXACT
        );
        let f = Check::at_least(subj(), Some(0.020), 0.025, prov());
        assert_eq!(f.verdict, Verdict::Fail);
        assert_relative_eq!(f.margin_ratio.unwrap(), 1.25, max_relative = REL_EXACT);
        assert!(f.margin_difference.unwrap() < 0.0);
    }

    #[test]
    fn exactly_at_the_limit_passes_with_unit_utilisation() {
        // 135 mm typed and converted must not fail a 0.135 m minimum through
        // representation error (BOUNDARY_REL_TOL).
        let typed = 135.0 * 0.001;
        let c = Check::at_least(subj(), Some(typed), 0.135 * 1.0 * 1.0, prov());
        assert_eq!(c.verdict, Verdict::Pass);
        assert_eq!(c.margin_ratio, Some(1.0));
        assert_eq!(c.margin_difference, Some(0.0));
        let d = Check::at_most(subj(), Some(75.0), 75.0, prov());
        assert_eq!(d.verdict, Verdict::Pass);
    }

    #[test]
    fn checks_round_trip_through_json() {
        let c = Check::at_most(subj(), None, 75.0, prov()).caution(CautionId::LimitExceeded);
        let json = serde_json::to_string(&c).unwrap();
        let back: Check = serde_json::from_str(&json).unwrap();
        assert_eq!(back, c);
    }

    #[test]
    fn only_the_values_marked_m_are_from_memory() {
        // reference-values.md marks as M: ISO 14120 force/energy (§2) and the
        // EN 12453 gap split and end force (§8). Everything else in the
        // catalogue is R, R2 or D.
        let mut memory: Vec<String> = catalogue()
            .iter()
            .flat_map(|s| {
                s.entries
                    .iter()
                    .filter(|e| e.provenance.status == SourceStatus::FromMemory)
                    .map(move |e| format!("{:?}.{}", s.id, e.key))
            })
            .collect();
        memory.sort();
        assert_eq!(
            memory,
            [
                "Guards.energy_no_device",
                "Guards.energy_with_device",
                "Guards.force_no_device",
                "Guards.force_with_device",
                "PoweredGates.dynamic_small_gap",
                "PoweredGates.dynamic_wide_gap",
                "PoweredGates.end_force",
            ]
        );
    }

    #[test]
    fn a_zero_value_against_a_minimum_has_no_ratio_but_a_difference() {
        let c = Check::at_least(subj(), Some(0.0), 0.025, prov());
        assert_eq!(c.verdict, Verdict::Fail);
        assert_eq!(c.margin_ratio, None);
        assert_relative_eq!(
            c.margin_difference.unwrap(),
            -0.025,
            max_relative = REL_EXACT
        );
    }

    #[test]
    fn missing_or_non_finite_values_give_unknown_with_a_reason() {
        for v in [None, Some(f64::NAN), Some(f64::INFINITY)] {
            let c = Check::at_most(subj(), v, 75.0, prov());
            assert_eq!(c.verdict, Verdict::Unknown);
            assert_eq!(c.value, None);
            assert_eq!(c.margin_ratio, None);
            assert!(!c.notes.is_empty());
        }
        let c = Check::at_most(subj(), None, 75.0, prov())
            .missing_because(&["spring rate not given".into()]);
        assert!(c.notes.iter().any(|n| n.contains("spring rate")));
        let c = Check::at_most(subj(), Some(1.0), f64::NAN, prov());
        assert_eq!(c.verdict, Verdict::Unknown);
        assert_eq!(c.limit, None);
    }

    #[test]
    fn not_permitted_fails_any_positive_value() {
        assert_eq!(
            Check::not_permitted(subj(), Some(1e-6), prov()).verdict,
            Verdict::Fail
        );
        assert_eq!(
            Check::not_permitted(subj(), Some(0.0), prov()).verdict,
            Verdict::Pass
        );
        assert_eq!(
            Check::not_permitted(subj(), None, prov()).verdict,
            Verdict::Unknown
        );
    }

    #[test]
    fn from_memory_limits_say_so_and_trigger_the_caution() {
        let p = Provenance::new("ISO 14120:2015", "", SourceStatus::FromMemory);
        let c = Check::at_most(subj(), Some(1.0), 75.0, p);
        assert!(c
            .notes
            .iter()
            .any(|n| n.contains("from memory") && n.contains("current edition")));
        assert!(c.cautions.contains(&CautionId::ValuesFromMemory));
    }

    #[test]
    fn worst_verdict_skips_informative_checks() {
        let pass = Check::at_most(subj(), Some(1.0), 2.0, prov());
        let fail = Check::at_most(subj(), Some(3.0), 2.0, prov()).informative();
        assert_eq!(worst_verdict(&[pass.clone(), fail]), Some(Verdict::Pass));
        let unknown = Check::at_most(subj(), None, 2.0, prov());
        assert_eq!(worst_verdict(&[pass, unknown]), Some(Verdict::Unknown));
        assert_eq!(worst_verdict(&[]), None);
    }

    #[test]
    fn figure_value_reports_why_a_figure_is_missing() {
        let figs = vec![
            Figure::new("a", "A", Dim::Force, 5.0),
            Figure::missing("b", "B", Dim::Force, vec!["no rate".into()]),
        ];
        assert_eq!(figure_value(&figs, "a"), Ok(5.0));
        assert_eq!(figure_value(&figs, "b"), Err(vec!["no rate".to_string()]));
        assert!(figure_value(&figs, "c").is_err());
    }

    #[test]
    fn catalogue_lists_every_set_once_with_finite_values() {
        let all = catalogue();
        let ids: Vec<_> = all.iter().map(|s| s.id).collect();
        let mut dedup = ids.clone();
        dedup.dedup();
        assert_eq!(ids.len(), dedup.len());
        assert_eq!(all.len(), 7);
        for set in &all {
            assert!(!set.documents.is_empty(), "{:?}", set.id);
            assert!(!set.explanation.is_empty(), "{:?}", set.id);
            assert!(!set.entries.is_empty(), "{:?}", set.id);
            for e in &set.entries {
                assert!(e.value.is_none_or(f64::is_finite), "{:?} {}", set.id, e.key);
                assert!(
                    e.value.is_some() || !e.rule.is_empty(),
                    "{:?} {}",
                    set.id,
                    e.key
                );
                assert!(!e.provenance.document.is_empty());
            }
        }
        // The guard values are from memory (reference-values.md §2, M) and
        // the catalogue must say so.
        assert!(all
            .iter()
            .any(|s| s.id == LimitSetId::Guards && s.has_values_from_memory()));
    }

    fn no_nan(checks: &[Check]) -> bool {
        checks.iter().all(|c| {
            [c.value, c.limit, c.margin_ratio, c.margin_difference]
                .iter()
                .all(|o| o.is_none_or(f64::is_finite))
        })
    }

    proptest! {
        #[test]
        fn limit_sets_never_produce_nan(
            v in 1e-3..20.0f64,
            x in prop::option::of(0.0..1e7f64),
            y in prop::option::of(0.0..1e3f64),
            m in 1.0..1e6f64,
        ) {
            for t in [lift::En81BufferType::LinearAccumulation, lift::En81BufferType::NonLinearAccumulation, lift::En81BufferType::Dissipation] {
                let case = lift::En81BufferCase {
                    buffer_type: t,
                    rated_speed: v,
                    stroke: y,
                    monitored_slowdown_impact_speed: Some(v / 2.0),
                    stop: lift::BufferStop { mean_deceleration: y, peak_deceleration: x, time_above_2_5_g: None, return_speed: y },
                    static_force_at_stroke: x,
                    moving_mass: Some(m),
                };
                prop_assert!(no_nan(&lift::en81_checks(&case).unwrap()));
            }
            for (inst, bt) in [
                (lift::UsInstallation::Elevator, lift::UsBufferType::Oil),
                (lift::UsInstallation::Elevator, lift::UsBufferType::Spring),
                (lift::UsInstallation::ConstructionHoist, lift::UsBufferType::Spring),
                (lift::UsInstallation::ConstructionHoist, lift::UsBufferType::Oil),
            ] {
                let case = lift::UsBufferCase {
                    installation: inst,
                    buffer_type: bt,
                    rated_speed: v,
                    stroke: y,
                    terminal_speed_limiter: x.is_some(),
                    stop: lift::BufferStop { mean_deceleration: y, peak_deceleration: y, time_above_2_5_g: None, return_speed: None },
                    force_to_solid: x,
                    car_and_rated_load_mass: Some(m),
                };
                prop_assert!(no_nan(&lift::us_checks(&case).unwrap()));
            }
            for travel in [crane::CraneTravel::Bridge, crane::CraneTravel::Trolley] {
                let case = crane::CraneBumperCase { travel, rated_speed: v, mass_excluding_load: m, bumper_energy_capacity: x, mean_deceleration: y };
                prop_assert!(no_nan(&crane::crane_bumper_checks(&case).unwrap()));
            }
            let gate = gates::GateForceCase { gap_width: v / 10.0, dynamic_force: x, time_above_residual: None, residual_force: x, end_force: y };
            prop_assert!(no_nan(&gates::gate_checks(&gate).unwrap()));
            for r in body::BodyRegion::ALL {
                let case = body::BodyContactCase {
                    region: r, specific_area: None, transient: true, quasi_static: true,
                    transient_force: x, transient_pressure: x, transfer_energy: y, clamping_force: x, clamping_pressure: x,
                };
                prop_assert!(no_nan(&body::body_checks(&case).unwrap()));
            }
            prop_assert!(no_nan(&gaps::gap_checks(&gaps::BodyPart::ALL, y).unwrap()));
            let guard = guards::GuardCase { kind: guards::GuardKind::SelfClosing, protective_device: x.is_some(), closing_force: x, kinetic_energy: y, edge_actuation_force: y };
            prop_assert!(no_nan(&guards::guard_checks(&guard).unwrap()));
        }

        #[test]
        fn checks_never_carry_nan(
            x in prop_oneof![any::<f64>(), -1e6..1e6f64],
            l in prop_oneof![any::<f64>(), -1e6..1e6f64],
            missing in any::<bool>(),
        ) {
            let v = if missing { None } else { Some(x) };
            for c in [
                Check::at_most(subj(), v, l, prov()),
                Check::at_least(subj(), v, l, prov()),
                Check::not_permitted(subj(), v, prov()),
            ] {
                for o in [c.value, c.limit, c.margin_ratio, c.margin_difference] {
                    prop_assert!(o.is_none_or(f64::is_finite));
                }
                if c.value.is_none() || c.limit.is_none() && c.comparison != Comparison::NotPermitted {
                    prop_assert_eq!(c.verdict, Verdict::Unknown);
                }
                if c.verdict == Verdict::Pass {
                    prop_assert!(c.margin_difference.is_none_or(|d| d >= 0.0));
                }
                if c.verdict == Verdict::Fail && c.comparison != Comparison::NotPermitted {
                    prop_assert!(c.margin_difference.is_none_or(|d| d < 0.0));
                }
            }
        }
    }
}
