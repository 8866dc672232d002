//! Minimum gaps against crushing: a gap at a closing point is safe for a body
//! part when it stays at least as wide as that part's minimum gap.
//!
//! Source: ISO 13854:2017 Table 1 (read in a secondary source, R2): body
//! 500 mm, head (least favourable position) 300 mm, leg 180 mm, foot 120 mm,
//! toes 50 mm, arm 120 mm, hand/wrist/fist 100 mm, finger 25 mm. The check is
//! `gap ≥ minimum`. Children are not covered: the standard asks for their
//! behaviour and dimensions to be assessed separately.
//!
//! What is deliberately not implemented: any rule that a gap *smaller* than a
//! minimum can be acceptable because the body part cannot enter it. The
//! standard's provisions on that were not confirmed for Joulewise, so a gap
//! below the minimum is reported as failing, with a note leaving that
//! judgement to the assessor.

use super::{Check, Comparison, LimitEntry, LimitSet, LimitSetId, Subject};
use crate::cautions::CautionId;
use crate::error::{check, InputError};
use crate::figure::{ids, Provenance, SourceStatus};
use crate::units::Dim;
use serde::{Deserialize, Serialize};

const DOC: &str = "ISO 13854:2017";

fn provenance() -> Provenance {
    Provenance::new(DOC, "Table 1", SourceStatus::Secondary)
}

/// A body part of ISO 13854:2017 Table 1.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum BodyPart {
    /// The whole body.
    Body,
    /// Head, in its least favourable position.
    Head,
    /// Leg.
    Leg,
    /// Foot.
    Foot,
    /// Toes.
    Toes,
    /// Arm.
    Arm,
    /// Hand, wrist, fist.
    HandWristFist,
    /// Finger.
    Finger,
}

impl BodyPart {
    /// Every part, in the order of Table 1.
    pub const ALL: [BodyPart; 8] = [
        BodyPart::Body,
        BodyPart::Head,
        BodyPart::Leg,
        BodyPart::Foot,
        BodyPart::Toes,
        BodyPart::Arm,
        BodyPart::HandWristFist,
        BodyPart::Finger,
    ];

    /// Label for people.
    pub fn label(self) -> &'static str {
        match self {
            Self::Body => "Body",
            Self::Head => "Head (least favourable position)",
            Self::Leg => "Leg",
            Self::Foot => "Foot",
            Self::Toes => "Toes",
            Self::Arm => "Arm",
            Self::HandWristFist => "Hand, wrist, fist",
            Self::Finger => "Finger",
        }
    }

    /// Minimum gap, m (ISO 13854:2017 Table 1, R2; given there in mm).
    pub fn minimum_gap(self) -> f64 {
        let mm = match self {
            Self::Body => 500.0,
            Self::Head => 300.0,
            Self::Leg => 180.0,
            Self::Foot | Self::Arm => 120.0,
            Self::Toes => 50.0,
            Self::HandWristFist => 100.0,
            Self::Finger => 25.0,
        };
        mm * 1e-3
    }
}

/// The smallest gap left at the closing point (figure
/// [`ids::GAP_CLOSING_GAP`], m) against the minimum gap for `part`
/// (Table 1): passes when `gap ≥ minimum`.
pub fn gap_check(part: BodyPart, gap: Option<f64>) -> Check {
    let c = Check::at_least(
        Subject::new(
            &format!("gap.minimum.{}", key(part)),
            &format!(
                "Gap at the closing point against crushing: {}",
                part.label()
            ),
            ids::GAP_CLOSING_GAP,
            Dim::Length,
        ),
        gap,
        part.minimum_gap(),
        provenance(),
    )
    .caution(CautionId::ChildrenNotCovered)
    .note("Minimum gaps are for adults; children must be assessed separately (ISO 13854).");
    if c.verdict == crate::figure::Verdict::Fail {
        c.note("A gap below the minimum may only be acceptable if the body part cannot enter it at all. Joulewise does not assess that: the assessor must judge it from the standard.")
    } else {
        c
    }
}

/// Checks of the gap for several body parts (e.g. every part that can reach
/// the closing point).
///
/// # Errors
/// A given gap negative or not finite.
pub fn gap_checks(parts: &[BodyPart], gap: Option<f64>) -> Result<Vec<Check>, InputError> {
    if let Some(g) = gap {
        check::non_negative("gap", g)?;
    }
    Ok(parts.iter().map(|&p| gap_check(p, gap)).collect())
}

fn key(part: BodyPart) -> &'static str {
    match part {
        BodyPart::Body => "body",
        BodyPart::Head => "head",
        BodyPart::Leg => "leg",
        BodyPart::Foot => "foot",
        BodyPart::Toes => "toes",
        BodyPart::Arm => "arm",
        BodyPart::HandWristFist => "hand_wrist_fist",
        BodyPart::Finger => "finger",
    }
}

/// The crushing-gap limit set for the catalogue.
pub fn limit_set() -> LimitSet {
    LimitSet {
        id: LimitSetId::CrushingGaps,
        title: "Minimum gaps against crushing".into(),
        documents: vec![DOC.into()],
        scope: "Gaps between parts that close on each other, per body part that can reach them. Adults only: children's sizes and behaviour must be assessed separately.".into(),
        explanation: "A closing gap does not crush a body part if, when fully closed, it is still at least as wide as that part. Check every body part that can get into the gap. A gap narrower than a part's minimum is only acceptable if the part cannot enter at all; Joulewise does not make that judgement. The values were read in a secondary source, not in the standard.".into(),
        entries: BodyPart::ALL
            .iter()
            .map(|&p| {
                LimitEntry::new(key(p), p.label(), Comparison::AtLeast, Dim::Length, provenance())
                    .value(p.minimum_gap())
                    .published(&format!("{} mm", (p.minimum_gap() * 1e3).round()))
            })
            .collect(),
        cautions: vec![CautionId::ChildrenNotCovered, CautionId::ValuesFromSecondarySource],
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::figure::Verdict;

    #[test]
    fn table_1_values() {
        // ISO 13854:2017 Table 1, mm (reference-values.md §3, R2).
        let expect = [
            (BodyPart::Body, 500.0),
            (BodyPart::Head, 300.0),
            (BodyPart::Leg, 180.0),
            (BodyPart::Foot, 120.0),
            (BodyPart::Toes, 50.0),
            (BodyPart::Arm, 120.0),
            (BodyPart::HandWristFist, 100.0),
            (BodyPart::Finger, 25.0),
        ];
        for (p, mm) in expect {
            assert_eq!(p.minimum_gap(), mm * 1e-3, "{p:?}");
        }
    }

    #[test]
    fn t19_boundaries() {
        // reference-values.md T19 (ISO 13854:2017 Table 1, R2): finger 24 mm
        // fails, 25 passes; toes 49 fails, 50 passes; body 500 passes.
        let mm = |x: f64| Some(x * 1e-3);
        assert_eq!(gap_check(BodyPart::Finger, mm(24.0)).verdict, Verdict::Fail);
        assert_eq!(gap_check(BodyPart::Finger, mm(25.0)).verdict, Verdict::Pass);
        assert_eq!(gap_check(BodyPart::Toes, mm(49.0)).verdict, Verdict::Fail);
        assert_eq!(gap_check(BodyPart::Toes, mm(50.0)).verdict, Verdict::Pass);
        assert_eq!(gap_check(BodyPart::Body, mm(500.0)).verdict, Verdict::Pass);
        let f = gap_check(BodyPart::Finger, mm(24.0));
        assert!(f.notes.iter().any(|n| n.contains("cannot enter")));
        assert!(f.cautions.contains(&CautionId::ChildrenNotCovered));
        assert_eq!(f.provenance.status, SourceStatus::Secondary);
    }

    #[test]
    fn a_closed_gap_fails_every_part_and_a_missing_gap_is_unknown() {
        let all = gap_checks(&BodyPart::ALL, Some(0.0)).unwrap();
        assert!(all
            .iter()
            .all(|c| c.verdict == Verdict::Fail && c.margin_ratio.is_none()));
        let unknown = gap_checks(&[BodyPart::Finger], None).unwrap();
        assert_eq!(unknown[0].verdict, Verdict::Unknown);
        assert!(gap_checks(&[BodyPart::Finger], Some(-0.001)).is_err());
    }
}
