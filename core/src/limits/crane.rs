//! Crane bridge and trolley bumpers: mean deceleration at a fraction of rated
//! load speed, and the energy the bumper must absorb.
//!
//! Source: 29 CFR 1910.179 (primary text read, R). Bridge bumpers, (e)(2)(i):
//! stop the crane, **excluding the lifted load**, at an average deceleration
//! ≤ 3 ft/s² (0.9144 m/s²) when travelling either way at 20 % of rated load
//! speed; (e)(2)(i)(a): enough energy-absorbing capacity to stop the crane
//! travelling at ≥ 40 % of rated load speed. Trolley bumpers, (e)(3)(i): stop
//! the trolley, excluding the lifted load, at an average deceleration
//! ≤ 4.7 ft/s² (1.432 56 m/s²) at ⅓ of rated load speed. The text read gives
//! no separate energy-capacity speed for trolley bumpers; the energy shown
//! for a trolley is the kinetic energy ½·m·(v/3)² at the deceleration check
//! speed, which the bumper must absorb to meet (e)(3)(i) (derived).
//!
//! Derived helper: the shortest stroke that can meet a deceleration limit `a`
//! from a check speed `u` is `u²/(2a)` (constant deceleration, the ideal
//! bumper); any real bumper needs more.

use super::{input_ids, us_units, Check, Comparison, LimitEntry, LimitSet, LimitSetId, Subject};
use crate::error::{check, InputError};
use crate::figure::{ids, Provenance, SourceStatus};
use crate::units::tag;
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// Bridge bumper average deceleration limit, m/s² (3 ft/s², 1910.179(e)(2)(i), R).
pub const BRIDGE_DECELERATION_MAX: f64 = 3.0 * us_units::FOOT;
/// Fraction of rated load speed at which the bridge deceleration is checked
/// (20 %, 1910.179(e)(2)(i), R).
pub const BRIDGE_DECELERATION_SPEED_FRACTION: f64 = 0.2;
/// Fraction of rated load speed from which a bridge bumper must be able to
/// stop the crane (40 %, 1910.179(e)(2)(i)(a), R).
pub const BRIDGE_ENERGY_SPEED_FRACTION: f64 = 0.4;
/// Trolley bumper average deceleration limit, m/s² (4.7 ft/s², 1910.179(e)(3)(i), R).
pub const TROLLEY_DECELERATION_MAX: f64 = 4.7 * us_units::FOOT;
/// Fraction of rated load speed at which the trolley deceleration is checked
/// (⅓, 1910.179(e)(3)(i), R).
pub const TROLLEY_DECELERATION_SPEED_FRACTION: f64 = 1.0 / 3.0;

const DOC: &str = "29 CFR 1910.179";

fn cfr(clause: &str) -> Provenance {
    Provenance::new(DOC, clause, SourceStatus::Confirmed)
}

/// Which motion the bumper stops.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum CraneTravel {
    /// Bridge travel.
    Bridge,
    /// Trolley travel.
    Trolley,
}

/// A crane bumper to check.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct CraneBumperCase {
    /// Bridge or trolley.
    pub travel: CraneTravel,
    /// Rated load speed of this motion, m/s.
    pub rated_speed: f64,
    /// Mass of the moving bridge (crane) or trolley, **excluding the lifted
    /// load**, kg (the rule says so for both).
    pub mass_excluding_load: f64,
    /// Energy the bumper(s) can absorb, J, from the data sheet.
    pub bumper_energy_capacity: Option<f64>,
    /// Average deceleration of a stop from the deceleration check speed
    /// ([`deceleration_check_speed`]), m/s², computed or measured with the
    /// mass excluding the lifted load.
    pub mean_deceleration: Option<f64>,
}

/// The deceleration limit, m/s².
pub fn deceleration_limit(travel: CraneTravel) -> f64 {
    match travel {
        CraneTravel::Bridge => BRIDGE_DECELERATION_MAX,
        CraneTravel::Trolley => TROLLEY_DECELERATION_MAX,
    }
}

/// Speed at which the deceleration limit is checked, m/s: 20 % (bridge) or
/// ⅓ (trolley) of rated load speed.
pub fn deceleration_check_speed(travel: CraneTravel, rated_speed: f64) -> f64 {
    rated_speed
        * match travel {
            CraneTravel::Bridge => BRIDGE_DECELERATION_SPEED_FRACTION,
            CraneTravel::Trolley => TROLLEY_DECELERATION_SPEED_FRACTION,
        }
}

/// Speed from which the bumper must absorb the kinetic energy, m/s: 40 % of
/// rated load speed for a bridge ((e)(2)(i)(a), R); for a trolley the
/// deceleration check speed ⅓ (derived: no separate fraction in the text read).
pub fn energy_check_speed(travel: CraneTravel, rated_speed: f64) -> f64 {
    match travel {
        CraneTravel::Bridge => BRIDGE_ENERGY_SPEED_FRACTION * rated_speed,
        CraneTravel::Trolley => deceleration_check_speed(travel, rated_speed),
    }
}

/// Energy the bumper must be able to absorb, J: ½·m·u² with `u` from
/// [`energy_check_speed`] and `m` the mass excluding the lifted load.
pub fn required_energy_capacity(
    travel: CraneTravel,
    rated_speed: f64,
    mass_excluding_load: f64,
) -> f64 {
    let u = energy_check_speed(travel, rated_speed);
    0.5 * mass_excluding_load * u * u
}

/// Shortest stroke that can meet the deceleration limit from the check
/// speed, m: `u²/(2a)` (ideal constant-deceleration bumper; derived).
pub fn minimum_constant_deceleration_stroke(travel: CraneTravel, rated_speed: f64) -> f64 {
    let u = deceleration_check_speed(travel, rated_speed);
    u * u / (2.0 * deceleration_limit(travel))
}

/// Checks of a crane bumper: average deceleration at the check speed, and
/// energy capacity against the required energy.
///
/// # Errors
/// Rated speed or mass not positive; a given figure negative or not finite.
pub fn crane_bumper_checks(case: &CraneBumperCase) -> Result<Vec<Check>, InputError> {
    let v = check::positive("rated_speed", case.rated_speed)?;
    let m = check::positive("mass_excluding_load", case.mass_excluding_load)?;
    for (field, x) in [
        ("bumper_energy_capacity", case.bumper_energy_capacity),
        ("mean_deceleration", case.mean_deceleration),
    ] {
        if let Some(x) = x {
            check::non_negative(field, x)?;
        }
    }
    let mass_note =
        "The mass is that of the crane or trolley excluding the lifted load, as the rule says.";
    let (what, decel_clause, decel_words) = match case.travel {
        CraneTravel::Bridge => (
            "bridge",
            "(e)(2)(i)",
            "at most 3 ft/s² (0.9144 m/s²) when travelling at 20 % of rated load speed",
        ),
        CraneTravel::Trolley => (
            "trolley",
            "(e)(3)(i)",
            "at most 4.7 ft/s² (1.432 56 m/s²) when travelling at ⅓ of rated load speed",
        ),
    };
    let u = deceleration_check_speed(case.travel, v);
    let decel = Check::at_most(
        Subject::new(
            &format!("crane.{what}.mean_deceleration"),
            &format!("Average deceleration of the {what} on its bumpers"),
            ids::IMPACT_MEAN_DECELERATION,
            Dim::Acceleration,
        ),
        case.mean_deceleration,
        deceleration_limit(case.travel),
        cfr(decel_clause),
    )
    .note(&format!(
        "Average deceleration {decel_words}: check speed {}.",
        tag(u, Dim::Speed)
    ))
    .note(mass_note);
    let required = required_energy_capacity(case.travel, v, m);
    let energy_subject = Subject::new(
        &format!("crane.{what}.energy_capacity"),
        &format!("Energy capacity of the {what} bumpers"),
        input_ids::CRANE_BUMPER_ENERGY_CAPACITY,
        Dim::Energy,
    );
    let energy = match case.travel {
        CraneTravel::Bridge => Check::at_least(energy_subject, case.bumper_energy_capacity, required, cfr("(e)(2)(i)(a)"))
            .note("The bumpers must be able to stop the crane travelling at 40 % of rated load speed or more: capacity ≥ ½·m·(0.4·v)²."),
        CraneTravel::Trolley => Check::at_least(
            energy_subject,
            case.bumper_energy_capacity,
            required,
            Provenance::new(DOC, "(e)(3)(i) (energy derived from the deceleration rule)", SourceStatus::Derived),
        )
        .note("The text read gives no separate energy-capacity speed for trolley bumpers: the required energy is the kinetic energy at the deceleration check speed, ½·m·(v/3)², which the bumper must absorb to meet (e)(3)(i)."),
    }
    .note(mass_note);
    Ok(vec![decel, energy])
}

/// The crane bumper limit set for the catalogue.
pub fn limit_set() -> LimitSet {
    LimitSet {
        id: LimitSetId::CraneBumpers,
        title: "Crane bridge and trolley bumpers".into(),
        documents: vec![format!("{DOC} (overhead and gantry cranes)")],
        scope: "Bumpers at the ends of bridge and trolley travel of overhead and gantry cranes in the US. Masses exclude the lifted load. CMAA 70 and EN 13001-2 buffer criteria are not included (not confirmed).".into(),
        explanation: "A crane bumper must bring the bridge or trolley to rest gently from a fraction of its rated speed, and a bridge bumper must hold enough energy to stop it from a higher speed. The rules count the crane without its load, so a suspended load may still swing. Stops, which absorb no energy, are a different thing from bumpers.".into(),
        entries: vec![
            LimitEntry::new("bridge_deceleration", "Bridge: average deceleration at 20 % of rated load speed", Comparison::AtMost, Dim::Acceleration, cfr("(e)(2)(i)"))
                .value(BRIDGE_DECELERATION_MAX)
                .published("3 ft/s²"),
            LimitEntry::new("bridge_energy", "Bridge: energy capacity to stop from 40 % of rated load speed", Comparison::AtLeast, Dim::Energy, cfr("(e)(2)(i)(a)"))
                .rule("E ≥ ½·m·(0.4·v)², m excluding the lifted load"),
            LimitEntry::new("trolley_deceleration", "Trolley: average deceleration at ⅓ of rated load speed", Comparison::AtMost, Dim::Acceleration, cfr("(e)(3)(i)"))
                .value(TROLLEY_DECELERATION_MAX)
                .published("4.7 ft/s²"),
            LimitEntry::new("trolley_energy", "Trolley: energy at the deceleration check speed", Comparison::AtLeast, Dim::Energy, Provenance::new(DOC, "(e)(3)(i) (derived)", SourceStatus::Derived))
                .rule("E ≥ ½·m·(v/3)², m excluding the lifted load")
                .note("Implied by the deceleration rule; the text read gives no separate energy-capacity speed for trolleys."),
        ],
        cautions: Vec::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::figure::Verdict;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;

    /// reference-values.md T25/T26 quote results to 1e-3 relative.
    const REL_T25: f64 = 1e-3;

    #[test]
    fn limits_in_si() {
        // 1910.179(e)(2)(i), (e)(3)(i) (R): 3 and 4.7 ft/s²; 1 ft = 0.3048 m exact.
        assert_relative_eq!(BRIDGE_DECELERATION_MAX, 0.9144, max_relative = REL_EXACT);
        assert_relative_eq!(TROLLEY_DECELERATION_MAX, 1.432_56, max_relative = REL_EXACT);
    }

    #[test]
    fn t25_bridge_bumper() {
        // T25, 29 CFR 1910.179(e)(2) (R), arithmetic D: rated 200 fpm, 20 t
        // excluding load → deceleration check at 40 fpm = 0.667 ft/s; ideal
        // stroke at 3 ft/s² = 0.889 in; energy at 80 fpm (0.4064 m/s) = 1 651.6 J.
        let v = 200.0 * us_units::FOOT_PER_MINUTE;
        let u = deceleration_check_speed(CraneTravel::Bridge, v);
        assert_relative_eq!(u / us_units::FOOT, 0.6667, max_relative = REL_T25);
        let s = minimum_constant_deceleration_stroke(CraneTravel::Bridge, v);
        assert_relative_eq!(s / us_units::INCH, 0.889, max_relative = REL_T25);
        assert_relative_eq!(
            energy_check_speed(CraneTravel::Bridge, v),
            0.4064,
            max_relative = REL_EXACT
        );
        let e = required_energy_capacity(CraneTravel::Bridge, v, 20_000.0);
        assert_relative_eq!(e, 1651.6, max_relative = REL_T25);
        let case = |cap: f64, a: f64| CraneBumperCase {
            travel: CraneTravel::Bridge,
            rated_speed: v,
            mass_excluding_load: 20_000.0,
            bumper_energy_capacity: Some(cap),
            mean_deceleration: Some(a),
        };
        let ok = crane_bumper_checks(&case(1700.0, 0.9)).unwrap();
        assert!(ok.iter().all(|c| c.verdict == Verdict::Pass));
        assert_eq!(ok[0].provenance.status, SourceStatus::Confirmed);
        let bad = crane_bumper_checks(&case(1600.0, 0.95)).unwrap();
        assert!(bad.iter().all(|c| c.verdict == Verdict::Fail));
        assert!(bad.iter().all(|c| c
            .notes
            .iter()
            .any(|n| n.contains("excluding the lifted load"))));
    }

    #[test]
    fn t26_trolley_bumper() {
        // T26, 29 CFR 1910.179(e)(3) (R), arithmetic D: 5 000 kg trolley rated
        // 0.5 m/s → check speed 0.1667 m/s; limit 1.43256 m/s²; ideal stroke
        // 9.70 mm; E = 69.44 J.
        let u = deceleration_check_speed(CraneTravel::Trolley, 0.5);
        assert_relative_eq!(u, 0.1667, max_relative = REL_T25);
        assert_relative_eq!(
            minimum_constant_deceleration_stroke(CraneTravel::Trolley, 0.5),
            9.70e-3,
            max_relative = REL_T25
        );
        assert_relative_eq!(
            required_energy_capacity(CraneTravel::Trolley, 0.5, 5000.0),
            69.44,
            max_relative = REL_T25
        );
        let c = crane_bumper_checks(&CraneBumperCase {
            travel: CraneTravel::Trolley,
            rated_speed: 0.5,
            mass_excluding_load: 5000.0,
            bumper_energy_capacity: None,
            mean_deceleration: Some(TROLLEY_DECELERATION_MAX),
        })
        .unwrap();
        assert_eq!(c[0].verdict, Verdict::Pass);
        assert_eq!(c[1].verdict, Verdict::Unknown);
        assert_eq!(c[1].provenance.status, SourceStatus::Derived);
    }

    #[test]
    fn bad_inputs_are_refused() {
        let c = CraneBumperCase {
            travel: CraneTravel::Bridge,
            rated_speed: 1.0,
            mass_excluding_load: 0.0,
            bumper_energy_capacity: None,
            mean_deceleration: None,
        };
        assert_eq!(
            crane_bumper_checks(&c).unwrap_err().field,
            "mass_excluding_load"
        );
    }
}
