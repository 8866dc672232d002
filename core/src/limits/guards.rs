//! Power-operated and self-closing guards: closing force and kinetic energy
//! limits, with higher values where a protective device stops or reverses
//! the guard on contact.
//!
//! Values (ISO 14120:2015, which replaced EN 953:1997+A1:2009): without a
//! protective device, closing force ≤ 75 N and kinetic energy ≤ 4 J; with a
//! device (e.g. a pressure-sensitive edge) that automatically stops or
//! reverses the guard, ≤ 150 N and ≤ 10 J. **These values and their clause
//! are from memory** (believed ISO 14120:2015 5.3.x, formerly EN 953 5.2.5.x;
//! not confirmed): every check says so and prompts the user to confirm
//! against the current edition. No separate numeric limit for self-closing
//! guards is recalled; the same values are offered as a comparison and the
//! check says that too.
//!
//! Informative comparison: 16 CFR 1211.12(a)(1) (US residential garage door
//! operators, read in the primary text) requires an edge sensor to actuate at
//! a force of 15 lbf (66.723 N) or less.

use super::{input_ids, us_units, Check, Comparison, LimitEntry, LimitSet, LimitSetId, Subject};
use crate::cautions::CautionId;
use crate::error::{check, InputError};
use crate::figure::{ids, Provenance, SourceStatus};
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// Closing force limit without a protective device, N (ISO 14120:2015, from memory).
pub const FORCE_NO_DEVICE: f64 = 75.0;
/// Kinetic energy limit without a protective device, J (ISO 14120:2015, from memory).
pub const ENERGY_NO_DEVICE: f64 = 4.0;
/// Closing force limit with a stopping/reversing protective device, N (from memory).
pub const FORCE_WITH_DEVICE: f64 = 150.0;
/// Kinetic energy limit with a stopping/reversing protective device, J (from memory).
pub const ENERGY_WITH_DEVICE: f64 = 10.0;
/// Edge-sensor actuation force for US residential garage door operators:
/// 15 lbf = 66.723 N (16 CFR 1211.12(a)(1), confirmed; lbf exact per NIST SP 811).
pub const EDGE_SENSOR_ACTUATION_FORCE_US: f64 = 15.0 * us_units::POUND_FORCE;

const DOC: &str = "ISO 14120:2015";
const CLAUSE: &str = "clause not confirmed (believed 5.3.x; formerly EN 953:1997+A1:2009 5.2.5.x)";

fn provenance() -> Provenance {
    Provenance::new(DOC, CLAUSE, SourceStatus::FromMemory)
}

fn cfr_provenance() -> Provenance {
    Provenance::new("16 CFR 1211", "1211.12(a)(1)", SourceStatus::Confirmed)
}

/// How the guard moves.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum GuardKind {
    /// Moved by a power source (motor, cylinder).
    PowerOperated,
    /// Closed by a spring, a weight or a gas strut, without a power source.
    SelfClosing,
}

/// A guard to check, with its figures.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct GuardCase {
    /// Power-operated or self-closing.
    pub kind: GuardKind,
    /// True when a protective device (e.g. a pressure-sensitive edge)
    /// automatically stops or reverses the guard when it meets a person.
    pub protective_device: bool,
    /// Force the guard exerts at its closing edge, N (figure
    /// [`ids::CLOSING_FORCE_STATIC`]); `None` when not computed.
    pub closing_force: Option<f64>,
    /// Kinetic energy of the guard as it closes, J (figure
    /// [`ids::RELEASE_KINETIC_ENERGY`]); `None` when not computed.
    pub kinetic_energy: Option<f64>,
    /// Force that actuates the sensing edge, N, if known: compared, for
    /// information only, with the US garage-door-operator rule.
    pub edge_actuation_force: Option<f64>,
}

/// The (force, energy) limits in N and J for a guard with or without a
/// stopping/reversing protective device (ISO 14120:2015, from memory).
pub fn limits(protective_device: bool) -> (f64, f64) {
    if protective_device {
        (FORCE_WITH_DEVICE, ENERGY_WITH_DEVICE)
    } else {
        (FORCE_NO_DEVICE, ENERGY_NO_DEVICE)
    }
}

/// Checks for a guard: closing force and kinetic energy against the ISO
/// 14120 values (from memory), and, when the edge actuation force is given,
/// an informative comparison with 16 CFR 1211.12(a)(1).
///
/// # Errors
/// A given figure that is negative or not finite.
pub fn guard_checks(case: &GuardCase) -> Result<Vec<Check>, InputError> {
    for (field, v) in [
        ("closing_force", case.closing_force),
        ("kinetic_energy", case.kinetic_energy),
        ("edge_actuation_force", case.edge_actuation_force),
    ] {
        if let Some(v) = v {
            check::non_negative(field, v)?;
        }
    }
    let (f_lim, e_lim) = limits(case.protective_device);
    let device = if case.protective_device {
        "with a protective device that stops or reverses the guard"
    } else {
        "without a protective device"
    };
    let self_closing_note = "No separate numeric limit for self-closing guards is recalled; the power-operated guard values are shown as a comparison.";
    let mut force = Check::at_most(
        Subject::new(
            "guard.closing_force",
            &format!("Closing force of the guard ({device})"),
            ids::CLOSING_FORCE_STATIC,
            Dim::Force,
        ),
        case.closing_force,
        f_lim,
        provenance(),
    )
    .note("The force limit is compared with the static force at the closing edge; the peak force of a moving edge striking a person is assessed by the body-region checks.");
    let mut energy = Check::at_most(
        Subject::new(
            "guard.kinetic_energy",
            &format!("Kinetic energy of the closing guard ({device})"),
            ids::RELEASE_KINETIC_ENERGY,
            Dim::Energy,
        ),
        case.kinetic_energy,
        e_lim,
        provenance(),
    );
    if case.kind == GuardKind::SelfClosing {
        force = force.note(self_closing_note);
        energy = energy.note(self_closing_note);
    }
    let mut out = vec![force, energy];
    if let Some(a) = case.edge_actuation_force {
        out.push(
            Check::at_most(
                Subject::new(
                    "guard.edge_actuation_force_us",
                    "Sensing-edge actuation force (US garage door operators, for comparison)",
                    input_ids::GUARD_EDGE_ACTUATION_FORCE,
                    Dim::Force,
                ),
                Some(a),
                EDGE_SENSOR_ACTUATION_FORCE_US,
                cfr_provenance(),
            )
            .informative()
            .note("Informative: this US rule is written for residential garage door operators, not for machine guards."),
        );
    }
    Ok(out)
}

/// The guard limit set for the catalogue.
pub fn limit_set() -> LimitSet {
    let e = |key: &str, q: &str, dim: Dim, v: f64, publ: &str| {
        LimitEntry::new(key, q, Comparison::AtMost, dim, provenance())
            .value(v)
            .published(publ)
            .note("From memory: value and clause not confirmed. Confirm against the current edition of ISO 14120.")
    };
    LimitSet {
        id: LimitSetId::Guards,
        title: "Power-operated and self-closing guards".into(),
        documents: vec![DOC.into(), "16 CFR 1211 (informative)".into()],
        scope: "Movable guards that close under power or by a spring, weight or gas strut. No separate numeric limit for self-closing guards is recalled; the power-operated values are offered as a comparison.".into(),
        explanation: "A guard that closes by itself can trap or strike whoever is in its way. Keep the force at the closing edge and the energy of the moving guard low enough that a person can push it back without harm; a sensing edge that stops or reverses the guard allows higher values. The values shown were recalled, not read in the standard: confirm them against the current edition before relying on a verdict.".into(),
        entries: vec![
            e("force_no_device", "Closing force, no protective device", Dim::Force, FORCE_NO_DEVICE, "75 N"),
            e("energy_no_device", "Kinetic energy, no protective device", Dim::Energy, ENERGY_NO_DEVICE, "4 J"),
            e("force_with_device", "Closing force, with a device that stops or reverses the guard", Dim::Force, FORCE_WITH_DEVICE, "150 N"),
            e("energy_with_device", "Kinetic energy, with a device that stops or reverses the guard", Dim::Energy, ENERGY_WITH_DEVICE, "10 J"),
            LimitEntry::new(
                "edge_actuation_force_us",
                "Edge sensor actuation force, US residential garage door operators (informative)",
                Comparison::AtMost,
                Dim::Force,
                cfr_provenance(),
            )
            .value(EDGE_SENSOR_ACTUATION_FORCE_US)
            .published("15 lbf")
            .note("Written for residential garage door operators; shown for comparison only."),
        ],
        cautions: vec![CautionId::ValuesFromMemory],
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::figure::Verdict;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;

    fn case(device: bool, f: Option<f64>, e: Option<f64>) -> GuardCase {
        GuardCase {
            kind: GuardKind::PowerOperated,
            protective_device: device,
            closing_force: f,
            kinetic_energy: e,
            edge_actuation_force: None,
        }
    }

    #[test]
    fn iso_14120_values_from_memory() {
        // ISO 14120:2015, clause not confirmed: 75 N / 4 J, 150 N / 10 J
        // (reference-values.md §2, status M: from memory).
        assert_eq!(limits(false), (75.0, 4.0));
        assert_eq!(limits(true), (150.0, 10.0));
        let checks = guard_checks(&case(false, Some(75.0), Some(4.1))).unwrap();
        assert_eq!(checks[0].verdict, Verdict::Pass);
        assert_eq!(checks[1].verdict, Verdict::Fail);
        for c in &checks {
            assert_eq!(c.provenance.status, SourceStatus::FromMemory);
            assert!(c.provenance.clause.contains("not confirmed"));
            assert!(c.notes.iter().any(|n| n.contains("current edition")));
            assert!(c.cautions.contains(&CautionId::ValuesFromMemory));
        }
        let with = guard_checks(&case(true, Some(140.0), Some(4.1))).unwrap();
        assert_eq!(with[0].verdict, Verdict::Pass);
        assert_eq!(with[1].verdict, Verdict::Pass);
        assert_eq!(with[0].limit, Some(150.0));
        assert_eq!(with[1].limit, Some(10.0));
    }

    #[test]
    fn spring_closed_door_t12_against_the_4_j_limit() {
        // reference-values.md T12 (D): ΔE = ½·2·(2.0² − 0.5²) = 3.75 J, compared
        // with the 4 J guard limit (ISO 14120, from memory).
        let de = 0.5 * 2.0 * (2.0_f64.powi(2) - 0.5_f64.powi(2));
        let mut c = case(false, None, Some(de));
        c.kind = GuardKind::SelfClosing;
        let checks = guard_checks(&c).unwrap();
        assert_eq!(checks[1].verdict, Verdict::Pass);
        assert_relative_eq!(
            checks[1].margin_ratio.unwrap(),
            3.75 / 4.0,
            max_relative = REL_EXACT
        );
        assert!(checks[1].notes.iter().any(|n| n.contains("self-closing")));
        assert_eq!(checks[0].verdict, Verdict::Unknown);
    }

    #[test]
    fn us_edge_sensor_15_lbf_is_informative() {
        // 16 CFR 1211.12(a)(1) (R): 15 lbf; 1 lbf = 4.448 221 615 260 5 N exact
        // (NIST SP 811 B.8, R2/D) → 66.723 N (reference-values.md §2 prints 66.7 N).
        assert_relative_eq!(
            EDGE_SENSOR_ACTUATION_FORCE_US,
            66.723_324_228_907_5,
            max_relative = REL_EXACT
        );
        let mut c = case(false, Some(10.0), Some(1.0));
        c.edge_actuation_force = Some(70.0);
        let checks = guard_checks(&c).unwrap();
        let us = &checks[2];
        assert!(us.informative);
        assert_eq!(us.verdict, Verdict::Fail);
        assert_eq!(us.provenance.status, SourceStatus::Confirmed);
        assert_eq!(super::super::worst_verdict(&checks), Some(Verdict::Pass));
    }

    #[test]
    fn negative_figures_are_refused() {
        let e = guard_checks(&case(false, Some(-1.0), None)).unwrap_err();
        assert_eq!(e.field, "closing_force");
    }
}
