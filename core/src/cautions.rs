//! Cautions: short warnings, written for Joulewise in plain words, shown
//! beside the figures and checks that call for them.
//!
//! Each caution has a stable [`CautionId`], a title, a text, the condition
//! that brings it up, and the sources behind it with how far each was
//! confirmed (29 CFR 1910.147(d)(5) and 1910.217(b) read in the primary
//! text; Directive 2006/42/EC Annex I 1.6.3 wording from a secondary source
//! with its clause number from memory; ISO 14118:2017 from memory).
//! [`cautions_for`] picks the cautions for an assessment from its figures
//! (stored or residual energy, bottoming of a buffer) and its checks (each
//! check lists the cautions it triggers; a failed or unknown check brings its
//! own caution). Three general cautions are always included: figures are
//! estimates to confirm by measurement, a competent person signs off, local
//! rules prevail.

use crate::figure::{ids, Figure, Provenance, SourceStatus, Verdict};
use crate::limits::Check;
use crate::units::tag;
use serde::{Deserialize, Serialize};

/// Stable identifier of a caution, in display order (most urgent first).
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum CautionId {
    /// At least one counted check exceeds its limit.
    LimitExceeded,
    /// At least one counted check could not be made.
    CheckNotMade,
    /// Stored spring energy must be released or blocked before work (lockout).
    LockOutStoredEnergy,
    /// Never dismantle a preloaded spring without a cage or compressor.
    NoDismantlingUnderPreload,
    /// A breaking spring can throw fragments.
    FractureFragments,
    /// The buffer runs out of stroke; the rest of the energy hits the hard stop.
    BufferBottoming,
    /// Transient contact with the head or face is not permissible.
    HeadContactNotPermissible,
    /// Body-region limits come from pain-onset studies on adults.
    BodyLimitsAdultPainOnset,
    /// Gaps and body limits do not cover children.
    ChildrenNotCovered,
    /// Some limits are from memory: confirm against the current edition.
    ValuesFromMemory,
    /// Some limits were read in secondary sources, not in the standard.
    ValuesFromSecondarySource,
    /// Some limits were entered by the user and are not checked.
    UserSuppliedLimit,
    /// Figures are estimates: confirm by measurement (general).
    ConfirmByMeasurement,
    /// A competent person must sign off the assessment (general).
    CompetentPersonSignsOff,
    /// Local law, standards in force and licensed practice prevail (general).
    LocalRulesPrevail,
}

impl CautionId {
    /// Every caution, in display order.
    pub const ALL: [CautionId; 15] = [
        CautionId::LimitExceeded,
        CautionId::CheckNotMade,
        CautionId::LockOutStoredEnergy,
        CautionId::NoDismantlingUnderPreload,
        CautionId::FractureFragments,
        CautionId::BufferBottoming,
        CautionId::HeadContactNotPermissible,
        CautionId::BodyLimitsAdultPainOnset,
        CautionId::ChildrenNotCovered,
        CautionId::ValuesFromMemory,
        CautionId::ValuesFromSecondarySource,
        CautionId::UserSuppliedLimit,
        CautionId::ConfirmByMeasurement,
        CautionId::CompetentPersonSignsOff,
        CautionId::LocalRulesPrevail,
    ];

    /// The cautions shown with every assessment.
    pub const GENERAL: [CautionId; 3] = [
        CautionId::ConfirmByMeasurement,
        CautionId::CompetentPersonSignsOff,
        CautionId::LocalRulesPrevail,
    ];
}

/// A caution with its text and sources.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Caution {
    /// Stable identifier.
    pub id: CautionId,
    /// Short title.
    pub title: String,
    /// The caution, in plain words.
    pub text: String,
    /// When it is shown.
    pub shown_when: String,
    /// Sources, each with how far it was confirmed; empty when the caution is
    /// plain good practice.
    pub sources: Vec<Provenance>,
    /// Shown with every assessment.
    pub general: bool,
}

/// A caution picked for an assessment, with what brought it up.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct AppliedCaution {
    /// The caution.
    pub caution: Caution,
    /// What in this assessment brought it up (figures, checks), in words.
    pub because: Vec<String>,
    /// Ids of the figures that brought it up (to place it beside them).
    pub figures: Vec<String>,
    /// Ids of the checks that brought it up.
    pub checks: Vec<String>,
}

fn p(document: &str, clause: &str, status: SourceStatus) -> Provenance {
    Provenance::new(document, clause, status)
}

/// The caution with `id`.
pub fn caution(id: CautionId) -> Caution {
    use SourceStatus::{CommonPractice, Confirmed, FromMemory, Secondary};
    let (title, text, shown_when, sources): (&str, &str, &str, Vec<Provenance>) = match id {
        CautionId::LimitExceeded => (
            "A limit is exceeded",
            "At least one figure is outside its limit. Do not use the mechanism as it is: change the design (a weaker spring, a lower speed, a softer or longer buffer, a wider gap) or add protection, then assess it again.",
            "a check that counts towards the verdict fails",
            Vec::new(),
        ),
        CautionId::CheckNotMade => (
            "Some checks could not be made",
            "At least one check has no verdict because a figure could not be computed or was not given. A check that was not made is not a pass: supply the missing inputs or measure the figure.",
            "a check that counts towards the verdict is unknown",
            Vec::new(),
        ),
        CautionId::LockOutStoredEnergy => (
            "Release or block the spring before work",
            "A spring keeps its energy after the power is switched off and locked. Before anyone reaches into the mechanism, let the spring run down to its free state, or hold it with a block, pin or clamp made to take the full spring force. Then check that nothing can move. If the spring can load up again while the work goes on, keep checking until the work is finished.",
            "the spring stores energy in the latched or released state, or that energy could not be computed",
            vec![
                p("29 CFR 1910.147", "(d)(5)(i)–(ii); (d)(6)", Confirmed),
                p("Directive 2006/42/EC", "Annex I 1.6.3 (wording from a secondary source; clause number from memory)", FromMemory),
                p("ISO 14118:2017", "clause 5 (sub-clauses not confirmed)", FromMemory),
            ],
        ),
        CautionId::NoDismantlingUnderPreload => (
            "Never take a preloaded spring apart without a cage or compressor",
            "A spring that still pushes or pulls when the mechanism is at rest can fly out when its cover, retainer or last fastener comes off. Remove it only inside a cage, or with a compressor or tensioner made for that spring, and let it out slowly under control. Do not undo fasteners that are holding the spring load.",
            "energy or force remains in the spring at its released position, or it could not be computed",
            vec![p("29 CFR 1910.147", "Appendix A, step (6) (springs named as stored energy; non-mandatory)", Confirmed)],
        ),
        CautionId::FractureFragments => (
            "A breaking spring can throw pieces",
            "Springs can break without warning, from fatigue, corrosion or overload, and a loaded spring can throw fragments or let broken coils tangle. Keep springs enclosed or guided so that a broken spring stays where it is. US rules for mechanical power presses ask for exactly this: compression springs guided on a rod or in a tube.",
            "the mechanism stores spring energy",
            vec![p("29 CFR 1910.217", "(b)(1), (b)(4)(iii)", Confirmed)],
        ),
        CautionId::BufferBottoming => (
            "The buffer runs out of stroke",
            "The moving part still has speed when the buffer is fully compressed, so the rest of its energy goes into the hard stop and the frame as a sharp blow, and the figures after that point are not reliable. Use a buffer with more stroke or capacity, or lower the speed.",
            "energy or speed is left when the buffer stroke is used up",
            Vec::new(),
        ),
        CautionId::HeadContactNotPermissible => (
            "No striking contact with the head or face",
            "A moving part must not strike the skull, forehead or face at any force: there is no acceptable transient value for these regions. Keep the part out of reach of the head by guarding, distance or layout.",
            "a body-region check concerns transient contact with the skull, forehead or face",
            vec![p("ISO/TS 15066:2016", "A.3.2; Table A.2 footnote c", Secondary)],
        ),
        CautionId::BodyLimitsAdultPainOnset => (
            "Body-region limits mark the onset of pain in adults",
            "The pressure limits are where three in four adult volunteers began to feel pain under a small flat probe; the force limits come from a review of the least injurious forces. They are not injury thresholds with a margin, they were written for collaborative robots, and they do not cover children, older or otherwise vulnerable people. The technical specification they come from has been folded into ISO 10218-2:2025.",
            "any body-region check is made",
            vec![p("ISO/TS 15066:2016", "Table A.2, footnotes a and b", Secondary)],
        ),
        CautionId::ChildrenNotCovered => (
            "Children are not covered",
            "The gaps and body-region limits are for adults. Where children can reach the machine, their smaller size and different behaviour must be assessed separately.",
            "a crushing-gap or body-region check is made",
            vec![
                p("ISO 13854:2017", "scope (children assessed separately)", Secondary),
                p("ISO/TS 15066:2016", "Table A.2, footnotes a and b (adult subjects)", Secondary),
            ],
        ),
        CautionId::ValuesFromMemory => (
            "Some limits are from memory",
            "At least one limit used here was recalled, not read in the document. Look it up in the current edition of the named standard and correct it if needed before relying on the verdict.",
            "a check or limit set uses a value marked from memory",
            Vec::new(),
        ),
        CautionId::ValuesFromSecondarySource => (
            "Some limits were read in secondary sources",
            "At least one limit was taken from a source that quotes the standard, not from the standard itself. Check it against the edition you work to before treating it as binding.",
            "a check uses a value read in a secondary source",
            Vec::new(),
        ),
        CautionId::UserSuppliedLimit => (
            "Some limits were entered by the user",
            "Limits typed in by the user are compared as given. Joulewise has not checked their values or their sources.",
            "a user-defined limit is checked",
            Vec::new(),
        ),
        CautionId::ConfirmByMeasurement => (
            "Figures are estimates: confirm them by measurement",
            "Every figure here comes from the inputs and a model. Springs vary from batch to batch, friction and wear change speeds, and real contact is softer or harder than assumed. Before relying on a result close to a limit, measure the real mechanism with an instrument and method made for it, for example ISO/PAS 5672 for forces and pressures on people, EN 12445 for powered gates and doors.",
            "always",
            vec![
                p("ISO/PAS 5672:2023", "test method for contact force and pressure", Secondary),
                p("EN 12445", "test points and method for powered gates", Secondary),
            ],
        ),
        CautionId::CompetentPersonSignsOff => (
            "A competent person signs off",
            "This is a calculation aid, not an approval. A person with the training and experience to judge the machine and its use must review the inputs, the assumptions and the figures, and sign the assessment.",
            "always",
            vec![p("Joulewise", "", CommonPractice)],
        ),
        CautionId::LocalRulesPrevail => (
            "Local law and licensed practice come first",
            "The limits shown come from published standards and regulations, some from other countries than yours. Where local law, a standard in force where the machine is used, an inspector, or licensed practice (for lifts and cranes, for example) asks for something else, that takes precedence.",
            "always",
            vec![p("Joulewise", "", CommonPractice)],
        ),
    };
    Caution {
        id,
        title: title.into(),
        text: text.into(),
        shown_when: shown_when.into(),
        sources,
        general: CautionId::GENERAL.contains(&id),
    }
}

/// Every caution, in display order, for the "how these figures were checked"
/// page and the printed report.
pub fn catalogue() -> Vec<Caution> {
    CautionId::ALL.iter().map(|&id| caution(id)).collect()
}

/// State of a figure for triggering: `Some(true)` value above zero,
/// `Some(false)` zero or less, `None` present but missing; absent → not listed.
fn figure_state<'a>(figures: &'a [Figure], id: &str) -> Option<(&'a Figure, Option<bool>)> {
    figures
        .iter()
        .find(|f| f.id == id)
        .map(|f| (f, f.value.filter(|v| v.is_finite()).map(|v| v > 0.0)))
}

/// The cautions for an assessment, in display order, each once, with what
/// brought it up:
/// - from figures: stored, released or residual spring energy above zero, or
///   present but not computable → lockout, and fragments; residual energy or
///   released-state spring force above zero (or not computable) → no
///   dismantling without a cage; energy or speed left at the end of a buffer
///   stroke → bottoming;
/// - from checks: every caution a check lists; a counted check that fails →
///   limit exceeded; a counted check that is unknown → check not made;
/// - always: confirm by measurement, competent person, local rules.
pub fn cautions_for(figures: &[Figure], checks: &[Check]) -> Vec<AppliedCaution> {
    // (caution, reason in words, figure id, check id)
    let mut reasons: Vec<(CautionId, String, Option<String>, Option<String>)> = Vec::new();
    let mut add_from = |id: CautionId, why: String, fig: Option<&str>, chk: Option<&str>| {
        reasons.push((id, why, fig.map(str::to_string), chk.map(str::to_string)))
    };

    let describe = |f: &Figure, present: Option<bool>| match (present, f.value) {
        (Some(true), Some(v)) => Some(format!("{} is {}", f.label, tag(v, f.dim))),
        (None, _) => Some(format!("{} could not be computed", f.label)),
        _ => None,
    };

    for id in [
        ids::ENERGY_STORED_LATCHED,
        ids::ENERGY_RELEASED,
        ids::ENERGY_RESIDUAL,
    ] {
        if let Some((f, state)) = figure_state(figures, id) {
            if let Some(why) = describe(f, state) {
                add_from(
                    CautionId::LockOutStoredEnergy,
                    why.clone(),
                    Some(&f.id),
                    None,
                );
                add_from(CautionId::FractureFragments, why, Some(&f.id), None);
            }
        }
    }
    for id in [ids::ENERGY_RESIDUAL, ids::SPRING_FORCE_RELEASED] {
        if let Some((f, state)) = figure_state(figures, id) {
            if let Some(why) = describe(f, state) {
                add_from(CautionId::NoDismantlingUnderPreload, why, Some(&f.id), None);
            }
        }
    }
    for id in [ids::IMPACT_RESIDUAL_ENERGY, ids::IMPACT_RESIDUAL_SPEED] {
        if let Some((f, Some(true))) = figure_state(figures, id) {
            if let Some(v) = f.value {
                add_from(
                    CautionId::BufferBottoming,
                    format!("{} is {}", f.label, tag(v, f.dim)),
                    Some(&f.id),
                    None,
                );
            }
        }
    }
    for c in checks {
        for &id in &c.cautions {
            add_from(
                id,
                format!("check: {}", c.label),
                Some(&c.figure),
                Some(&c.id),
            );
        }
        if !c.informative {
            match c.verdict {
                Verdict::Fail => add_from(
                    CautionId::LimitExceeded,
                    format!("check failed: {}", c.label),
                    Some(&c.figure),
                    Some(&c.id),
                ),
                Verdict::Unknown => add_from(
                    CautionId::CheckNotMade,
                    format!("check not made: {}", c.label),
                    Some(&c.figure),
                    Some(&c.id),
                ),
                Verdict::Pass | Verdict::NotApplicable => {}
            }
        }
    }
    for id in CautionId::GENERAL {
        add_from(id, "shown with every assessment".into(), None, None);
    }

    CautionId::ALL
        .iter()
        .filter_map(|&id| {
            let mut because: Vec<String> = Vec::new();
            let mut figs: Vec<String> = Vec::new();
            let mut chks: Vec<String> = Vec::new();
            for (_, why, fig, chk) in reasons.iter().filter(|(r, ..)| *r == id) {
                if !because.contains(why) {
                    because.push(why.clone());
                }
                if let Some(fid) = fig.as_ref().filter(|x| !x.is_empty()) {
                    if !figs.contains(fid) {
                        figs.push(fid.clone());
                    }
                }
                if let Some(cid) = chk {
                    if !chks.contains(cid) {
                        chks.push(cid.clone());
                    }
                }
            }
            (!because.is_empty()).then(|| AppliedCaution {
                caution: caution(id),
                because,
                figures: figs,
                checks: chks,
            })
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::limits::{Check, Subject};
    use crate::units::Dim;

    fn ids_of(a: &[AppliedCaution]) -> Vec<CautionId> {
        a.iter().map(|c| c.caution.id).collect()
    }

    #[test]
    fn every_caution_has_a_title_text_and_condition() {
        let all = catalogue();
        assert_eq!(all.len(), CautionId::ALL.len());
        for c in &all {
            assert!(
                !c.title.is_empty() && !c.text.is_empty() && !c.shown_when.is_empty(),
                "{:?}",
                c.id
            );
        }
        // Lockout cites 29 CFR 1910.147(d)(5) (R) and marks the EU and ISO
        // clause numbers as from memory (reference-values.md §11).
        let lock = caution(CautionId::LockOutStoredEnergy);
        assert!(lock.sources.iter().any(|s| s.document == "29 CFR 1910.147"
            && s.clause.contains("(d)(5)")
            && s.status == SourceStatus::Confirmed));
        assert!(lock
            .sources
            .iter()
            .any(|s| s.document.contains("2006/42/EC") && s.status == SourceStatus::FromMemory));
        assert!(lock
            .sources
            .iter()
            .any(|s| s.document.contains("ISO 14118") && s.status == SourceStatus::FromMemory));
        // Fragments cite 1910.217(b)(4)(iii) guided compression springs (R).
        let frag = caution(CautionId::FractureFragments);
        assert!(frag
            .sources
            .iter()
            .any(|s| s.clause.contains("(b)(4)(iii)") && s.status == SourceStatus::Confirmed));
    }

    #[test]
    fn general_cautions_are_always_included() {
        let a = cautions_for(&[], &[]);
        assert_eq!(ids_of(&a), CautionId::GENERAL.to_vec());
        assert!(a.iter().all(|c| c.caution.general));
    }

    #[test]
    fn residual_energy_brings_lockout_cage_and_fragments() {
        let figs = vec![
            Figure::new(
                ids::ENERGY_STORED_LATCHED,
                "Energy stored when latched",
                Dim::Energy,
                12.0,
            ),
            Figure::new(
                ids::ENERGY_RESIDUAL,
                "Energy left at rest",
                Dim::Energy,
                3.5,
            ),
        ];
        let a = cautions_for(&figs, &[]);
        let got = ids_of(&a);
        for id in [
            CautionId::LockOutStoredEnergy,
            CautionId::NoDismantlingUnderPreload,
            CautionId::FractureFragments,
        ] {
            assert!(got.contains(&id), "{id:?}");
        }
        let lock = a
            .iter()
            .find(|c| c.caution.id == CautionId::LockOutStoredEnergy)
            .unwrap();
        assert!(lock
            .because
            .iter()
            .any(|b| crate::units::render(b, crate::units::UnitSystem::Si).contains("3.5 J")));
        // No residual energy and no residual force: no cage caution.
        let none = vec![
            Figure::new(ids::ENERGY_STORED_LATCHED, "Stored", Dim::Energy, 12.0),
            Figure::new(ids::ENERGY_RESIDUAL, "Residual", Dim::Energy, 0.0),
            Figure::new(ids::SPRING_FORCE_RELEASED, "Force at rest", Dim::Force, 0.0),
        ];
        assert!(!ids_of(&cautions_for(&none, &[])).contains(&CautionId::NoDismantlingUnderPreload));
        // A residual energy that could not be computed is treated as possibly present.
        let unknown = vec![Figure::missing(
            ids::ENERGY_RESIDUAL,
            "Residual",
            Dim::Energy,
            vec!["no rate".into()],
        )];
        let got = ids_of(&cautions_for(&unknown, &[]));
        assert!(got.contains(&CautionId::LockOutStoredEnergy));
        assert!(got.contains(&CautionId::NoDismantlingUnderPreload));
    }

    #[test]
    fn checks_bring_their_cautions_and_verdict_cautions() {
        let subj = || Subject::new("x", "Closing force", "f", Dim::Force);
        let memory = Provenance::new("ISO 14120:2015", "", SourceStatus::FromMemory);
        let failed = Check::at_most(subj(), Some(80.0), 75.0, memory);
        let unknown = Check::at_most(
            subj(),
            None,
            75.0,
            Provenance::new("d", "", SourceStatus::Derived),
        );
        let informative_fail = Check::at_most(
            subj(),
            Some(80.0),
            66.7,
            Provenance::new("16 CFR 1211", "", SourceStatus::Confirmed),
        )
        .informative();
        let got = ids_of(&cautions_for(&[], &[failed, unknown]));
        assert!(got.contains(&CautionId::LimitExceeded));
        assert!(got.contains(&CautionId::CheckNotMade));
        assert!(got.contains(&CautionId::ValuesFromMemory));
        let got = ids_of(&cautions_for(&[], &[informative_fail]));
        assert!(!got.contains(&CautionId::LimitExceeded));
        // Display order is kept and each caution appears once.
        let mut sorted = got.clone();
        sorted.sort();
        sorted.dedup();
        assert_eq!(sorted, got);
    }

    #[test]
    fn head_contact_and_bottoming() {
        let head = crate::limits::body::transient_force_check(
            crate::limits::body::BodyRegion::Face,
            Some(5.0),
        );
        let figs = vec![Figure::new(
            ids::IMPACT_RESIDUAL_ENERGY,
            "Energy at bottoming",
            Dim::Energy,
            0.8,
        )];
        let got = ids_of(&cautions_for(&figs, &[head]));
        for id in [
            CautionId::HeadContactNotPermissible,
            CautionId::BodyLimitsAdultPainOnset,
            CautionId::ChildrenNotCovered,
            CautionId::BufferBottoming,
            CautionId::LimitExceeded,
        ] {
            assert!(got.contains(&id), "{id:?}");
        }
    }
}
