//! Body-region limits for contact between a moving part and a person:
//! quasi-static (clamping) and transient (free impact) force and pressure,
//! and the energy a region may take, per body region.
//!
//! Source: ISO/TS 15066:2016 Annex A, Table A.2 (quasi-static force `F` and
//! pressure `p` per specific area) and Table A.3 (effective spring constant
//! `k` and effective body mass `m_H`), read in public transcriptions (status
//! R2: the licensed text was not read). Transient limits are 2 × the
//! quasi-static values for force and pressure (Table A.2 footnote c); the
//! skull/forehead and face have no transient value because transient contact
//! with them is not permissible (A.3.2). Permissible transfer energy is
//! derived, `E = F²/(2k)` (Annex A), with `F` the transient force: e.g. the
//! hand, `(2 × 140 N)²/(2 × 75 000 N/m) = 0.5227 J`.
//!
//! ISO/TS 15066 is superseded: its limits were carried into ISO 10218-2:2025,
//! whose annex and table numbers for them were not confirmed. The pressures
//! are the 75th percentile of pain onset in adults (footnotes a, b): not
//! injury thresholds, not for children. The two-body contact physics that
//! produces the figures lives in `contact::body`; this module holds only the
//! limits and the checks.

use super::{Check, Comparison, LimitEntry, LimitSet, LimitSetId, Subject};
use crate::cautions::CautionId;
use crate::error::{check, InputError};
use crate::figure::{ids, Provenance, SourceStatus};
use crate::units::Dim;
use serde::{Deserialize, Serialize};

/// 1 N/cm² in Pa (exact: 1 cm² = 1e-4 m²).
const N_PER_CM2: f64 = 1e4;
/// 1 N/mm in N/m (exact).
const N_PER_MM: f64 = 1e3;
/// Transient limit = this factor × quasi-static limit, for force and pressure
/// (ISO/TS 15066:2016 Table A.2 footnote c, R2).
pub const TRANSIENT_FACTOR: f64 = 2.0;

const DOC: &str = "ISO/TS 15066:2016";
const SUPERSEDED: &str = "ISO/TS 15066:2016 is superseded: its limits were carried into ISO 10218-2:2025 (annex and table numbers there not confirmed).";

/// A body region of ISO/TS 15066:2016 Table A.2.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
#[serde(rename_all = "snake_case")]
pub enum BodyRegion {
    /// Skull and forehead.
    SkullForehead,
    /// Face.
    Face,
    /// Neck.
    Neck,
    /// Back and shoulders.
    BackShoulders,
    /// Chest.
    Chest,
    /// Abdomen.
    Abdomen,
    /// Pelvis.
    Pelvis,
    /// Upper arms and elbow joints.
    UpperArmElbow,
    /// Lower arms and wrist joints.
    LowerArmWrist,
    /// Hands and fingers.
    HandFingers,
    /// Thighs and knees.
    ThighKnee,
    /// Lower legs.
    LowerLeg,
}

/// Which hand a specific-area value is for.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "snake_case")]
pub enum Side {
    /// Either side (one value given).
    Either,
    /// Dominant side.
    Dominant,
    /// Non-dominant side.
    NonDominant,
}

/// A specific area of a region with its quasi-static pressure limit.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SpecificArea {
    /// Stable key, e.g. `back_of_hand_non_dominant`.
    pub key: &'static str,
    /// Label for people.
    pub label: &'static str,
    /// Which hand, where the table distinguishes.
    pub side: Side,
    /// Quasi-static pressure limit, Pa (Table A.2, given there in N/cm²).
    pub pressure: f64,
}

/// The limits and body model of one region.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct RegionLimits {
    /// The region.
    pub region: BodyRegion,
    /// Label for people.
    pub label: &'static str,
    /// Quasi-static force limit, N (Table A.2).
    pub quasi_static_force: f64,
    /// Specific areas with their quasi-static pressure limits (Table A.2).
    pub areas: &'static [SpecificArea],
    /// Effective spring constant k of the region, N/m (Table A.3, given in N/mm).
    pub spring_constant: f64,
    /// Effective mass m_H of the region, kg (Table A.3).
    pub mass: f64,
}

const fn area(key: &'static str, label: &'static str, side: Side, n_per_cm2: f64) -> SpecificArea {
    SpecificArea {
        key,
        label,
        side,
        pressure: n_per_cm2 * N_PER_CM2,
    }
}

const fn region(
    region: BodyRegion,
    label: &'static str,
    force: f64,
    areas: &'static [SpecificArea],
    k_n_per_mm: f64,
    mass: f64,
) -> RegionLimits {
    RegionLimits {
        region,
        label,
        quasi_static_force: force,
        areas,
        spring_constant: k_n_per_mm * N_PER_MM,
        mass,
    }
}

use Side::{Dominant as D, Either as E, NonDominant as ND};

// ISO/TS 15066:2016 Table A.2 (F in N, p in N/cm²) and Table A.3 (k in N/mm,
// m_H in kg), as transcribed in reference-values.md §1b (R2).
static SKULL: RegionLimits = region(
    BodyRegion::SkullForehead,
    "Skull and forehead",
    130.0,
    &[
        area("middle_of_forehead", "Middle of forehead", E, 130.0),
        area("temple", "Temple", E, 110.0),
    ],
    150.0,
    4.4,
);
static FACE: RegionLimits = region(
    BodyRegion::Face,
    "Face",
    65.0,
    &[area("masticatory_muscle", "Masticatory muscle", E, 110.0)],
    75.0,
    4.4,
);
static NECK: RegionLimits = region(
    BodyRegion::Neck,
    "Neck",
    150.0,
    &[
        area("neck_muscle", "Neck muscle", E, 140.0),
        area("seventh_neck_muscle", "Seventh neck muscle", E, 210.0),
    ],
    50.0,
    1.2,
);
static BACK: RegionLimits = region(
    BodyRegion::BackShoulders,
    "Back and shoulders",
    210.0,
    &[
        area("shoulder_joint", "Shoulder joint", E, 160.0),
        area("fifth_lumbar_vertebra", "Fifth lumbar vertebra", E, 210.0),
    ],
    35.0,
    40.0,
);
static CHEST: RegionLimits = region(
    BodyRegion::Chest,
    "Chest",
    140.0,
    &[
        area("sternum", "Sternum", E, 120.0),
        area("pectoral_muscle", "Pectoral muscle", E, 170.0),
    ],
    25.0,
    40.0,
);
static ABDOMEN: RegionLimits = region(
    BodyRegion::Abdomen,
    "Abdomen",
    110.0,
    &[area("abdominal_muscle", "Abdominal muscle", E, 140.0)],
    10.0,
    40.0,
);
static PELVIS: RegionLimits = region(
    BodyRegion::Pelvis,
    "Pelvis",
    180.0,
    &[area("pelvic_bone", "Pelvic bone", E, 210.0)],
    25.0,
    40.0,
);
static UPPER_ARM: RegionLimits = region(
    BodyRegion::UpperArmElbow,
    "Upper arms and elbow joints",
    150.0,
    &[
        area("deltoid_muscle", "Deltoid muscle", E, 190.0),
        area("humerus", "Humerus", E, 220.0),
    ],
    30.0,
    3.0,
);
static LOWER_ARM: RegionLimits = region(
    BodyRegion::LowerArmWrist,
    "Lower arms and wrist joints",
    160.0,
    &[
        area("radial_bone", "Radial bone", E, 190.0),
        area("forearm_muscle", "Forearm muscle", E, 180.0),
        area("arm_nerve", "Arm nerve", E, 180.0),
    ],
    40.0,
    2.0,
);
static HAND: RegionLimits = region(
    BodyRegion::HandFingers,
    "Hands and fingers",
    140.0,
    &[
        area(
            "forefinger_pad_dominant",
            "Forefinger pad, dominant hand",
            D,
            300.0,
        ),
        area(
            "forefinger_pad_non_dominant",
            "Forefinger pad, non-dominant hand",
            ND,
            270.0,
        ),
        area(
            "forefinger_end_joint_dominant",
            "Forefinger end joint, dominant hand",
            D,
            280.0,
        ),
        area(
            "forefinger_end_joint_non_dominant",
            "Forefinger end joint, non-dominant hand",
            ND,
            220.0,
        ),
        area("thenar_eminence", "Thenar eminence", E, 200.0),
        area("palm", "Palm (either hand)", E, 260.0),
        area(
            "back_of_hand_dominant",
            "Back of hand, dominant hand",
            D,
            200.0,
        ),
        area(
            "back_of_hand_non_dominant",
            "Back of hand, non-dominant hand",
            ND,
            190.0,
        ),
    ],
    75.0,
    0.6,
);
static THIGH: RegionLimits = region(
    BodyRegion::ThighKnee,
    "Thighs and knees",
    220.0,
    &[
        area("thigh_muscle", "Thigh muscle", E, 250.0),
        area("kneecap", "Kneecap", E, 220.0),
    ],
    50.0,
    75.0,
);
static LOWER_LEG: RegionLimits = region(
    BodyRegion::LowerLeg,
    "Lower legs",
    130.0,
    &[
        area("middle_of_shin", "Middle of shin", E, 220.0),
        area("calf_muscle", "Calf muscle", E, 210.0),
    ],
    60.0,
    75.0,
);

impl BodyRegion {
    /// Every region, in the order of Table A.2.
    pub const ALL: [BodyRegion; 12] = [
        BodyRegion::SkullForehead,
        BodyRegion::Face,
        BodyRegion::Neck,
        BodyRegion::BackShoulders,
        BodyRegion::Chest,
        BodyRegion::Abdomen,
        BodyRegion::Pelvis,
        BodyRegion::UpperArmElbow,
        BodyRegion::LowerArmWrist,
        BodyRegion::HandFingers,
        BodyRegion::ThighKnee,
        BodyRegion::LowerLeg,
    ];

    /// The region's limits and body model (Tables A.2 and A.3).
    pub fn limits(self) -> &'static RegionLimits {
        match self {
            Self::SkullForehead => &SKULL,
            Self::Face => &FACE,
            Self::Neck => &NECK,
            Self::BackShoulders => &BACK,
            Self::Chest => &CHEST,
            Self::Abdomen => &ABDOMEN,
            Self::Pelvis => &PELVIS,
            Self::UpperArmElbow => &UPPER_ARM,
            Self::LowerArmWrist => &LOWER_ARM,
            Self::HandFingers => &HAND,
            Self::ThighKnee => &THIGH,
            Self::LowerLeg => &LOWER_LEG,
        }
    }

    /// Label for people.
    pub fn label(self) -> &'static str {
        self.limits().label
    }

    /// False for the skull/forehead and the face: transient contact with them
    /// is not permissible (ISO/TS 15066 A.3.2; Table A.2 footnote c).
    pub fn transient_contact_permitted(self) -> bool {
        !matches!(self, Self::SkullForehead | Self::Face)
    }

    /// Quasi-static force limit F, N (Table A.2).
    pub fn quasi_static_force(self) -> f64 {
        self.limits().quasi_static_force
    }

    /// Transient force limit 2·F, N (Table A.2 footnote c); `None` where
    /// transient contact is not permissible.
    pub fn transient_force(self) -> Option<f64> {
        self.transient_contact_permitted()
            .then(|| TRANSIENT_FACTOR * self.quasi_static_force())
    }

    /// Effective spring constant k, N/m (Table A.3).
    pub fn spring_constant(self) -> f64 {
        self.limits().spring_constant
    }

    /// Effective body mass m_H, kg (Table A.3).
    pub fn mass(self) -> f64 {
        self.limits().mass
    }

    /// The specific area with `key`, or `None` for the region's most
    /// demanding area (lowest pressure limit).
    ///
    /// # Errors
    /// `key` is not an area of this region (the message lists the keys).
    pub fn area(self, key: Option<&str>) -> Result<&'static SpecificArea, InputError> {
        let areas = self.limits().areas;
        match key {
            Some(k) => areas.iter().find(|a| a.key == k).ok_or_else(|| {
                let keys: Vec<&str> = areas.iter().map(|a| a.key).collect();
                InputError::invalid(
                    "specific_area",
                    format!("for {} one of: {}", self.label(), keys.join(", ")),
                )
            }),
            None => areas
                .iter()
                .min_by(|a, b| a.pressure.total_cmp(&b.pressure))
                .ok_or_else(|| InputError::invalid("specific_area", "the region has no areas")),
        }
    }

    /// Quasi-static pressure limit p, Pa, of an area (Table A.2); `None`
    /// key → lowest in the region.
    ///
    /// # Errors
    /// Unknown area key.
    pub fn quasi_static_pressure(self, key: Option<&str>) -> Result<f64, InputError> {
        Ok(self.area(key)?.pressure)
    }

    /// Transient pressure limit 2·p, Pa (footnote c); `Ok(None)` where
    /// transient contact is not permissible.
    ///
    /// # Errors
    /// Unknown area key.
    pub fn transient_pressure(self, key: Option<&str>) -> Result<Option<f64>, InputError> {
        let p = self.quasi_static_pressure(key)?;
        Ok(self
            .transient_contact_permitted()
            .then_some(TRANSIENT_FACTOR * p))
    }

    /// Permissible transient transfer energy `E = (2F)²/(2k)`, J (derived
    /// from Table A.2 footnote c, Table A.3 and Annex A `E = F²/(2k)`);
    /// `None` where transient contact is not permissible.
    pub fn transient_energy(self) -> Option<f64> {
        self.transient_force()
            .map(|f| f * f / (2.0 * self.spring_constant()))
    }

    /// Energy at the quasi-static force, `F²/(2k)`, J (derived; ¼ of the
    /// transient energy). Shown for information; not a limit of the TS.
    pub fn quasi_static_energy(self) -> f64 {
        let f = self.quasi_static_force();
        f * f / (2.0 * self.spring_constant())
    }
}

fn table_a2(clause: &str) -> Provenance {
    Provenance::new(DOC, clause, SourceStatus::Secondary)
}

fn region_cautions(c: Check) -> Check {
    c.caution(CautionId::BodyLimitsAdultPainOnset)
        .caution(CautionId::ChildrenNotCovered)
        .note(SUPERSEDED)
}

fn head_check(
    region: BodyRegion,
    id: &str,
    label: &str,
    figure: &str,
    dim: Dim,
    value: Option<f64>,
) -> Check {
    region_cautions(
        Check::not_permitted(
            Subject::new(id, &format!("{label}: {}", region.label()), figure, dim),
            value,
            table_a2("Table A.2 footnote c; A.3.2"),
        )
        .note("Transient contact with the skull, forehead or face is not permissible at any force; the table gives no transient value for these regions.")
        .caution(CautionId::HeadContactNotPermissible),
    )
}

/// Peak transient contact force (figure [`ids::BODY_TRANSIENT_FORCE`], N)
/// against 2·F of the region (Table A.2 and footnote c, R2). For the skull,
/// forehead and face: not permitted.
pub fn transient_force_check(region: BodyRegion, force: Option<f64>) -> Check {
    let label = "Transient contact force";
    match region.transient_force() {
        None => head_check(
            region,
            "body.transient_force",
            label,
            ids::BODY_TRANSIENT_FORCE,
            Dim::Force,
            force,
        ),
        Some(lim) => region_cautions(Check::at_most(
            Subject::new(
                "body.transient_force",
                &format!("{label}: {}", region.label()),
                ids::BODY_TRANSIENT_FORCE,
                Dim::Force,
            ),
            force,
            lim,
            table_a2("Table A.2 (quasi-static force) × 2 per footnote c"),
        )),
    }
}

/// Peak transient contact pressure (figure [`ids::BODY_TRANSIENT_PRESSURE`],
/// Pa) against 2·p of the specific area (`None` → the region's lowest).
/// Skull, forehead, face: not permitted.
///
/// # Errors
/// Unknown area key.
pub fn transient_pressure_check(
    region: BodyRegion,
    area: Option<&str>,
    pressure: Option<f64>,
) -> Result<Check, InputError> {
    let a = region.area(area)?;
    let label = "Transient contact pressure";
    Ok(match region.transient_pressure(Some(a.key))? {
        None => head_check(
            region,
            "body.transient_pressure",
            label,
            ids::BODY_TRANSIENT_PRESSURE,
            Dim::Pressure,
            pressure,
        ),
        Some(lim) => region_cautions(
            Check::at_most(
                Subject::new(
                    "body.transient_pressure",
                    &format!("{label}: {} ({})", region.label(), a.label),
                    ids::BODY_TRANSIENT_PRESSURE,
                    Dim::Pressure,
                ),
                pressure,
                lim,
                table_a2("Table A.2 (specific-area pressure) × 2 per footnote c"),
            )
            .note(&area_note(area)),
        ),
    })
}

fn area_note(area: Option<&str>) -> String {
    if area.is_none() {
        "No specific area was chosen, so the region's lowest pressure limit is used (a conservative choice made by Joulewise, not a rule of the TS).".into()
    } else {
        "Pressure limit of the chosen specific area.".into()
    }
}

/// Energy transferred to the region (figure [`ids::BODY_TRANSFER_ENERGY`], J)
/// against `(2F)²/(2k)` (derived from Table A.2 footnote c, Table A.3 and
/// Annex A). Skull, forehead, face: not permitted.
pub fn transfer_energy_check(region: BodyRegion, energy: Option<f64>) -> Check {
    let label = "Energy transferred to the body";
    match region.transient_energy() {
        None => head_check(region, "body.transfer_energy", label, ids::BODY_TRANSFER_ENERGY, Dim::Energy, energy),
        Some(lim) => region_cautions(
            Check::at_most(
                Subject::new(
                    "body.transfer_energy",
                    &format!("{label}: {}", region.label()),
                    ids::BODY_TRANSFER_ENERGY,
                    Dim::Energy,
                ),
                energy,
                lim,
                Provenance::new(
                    DOC,
                    "Annex A E = F²/(2k), with F = 2 × Table A.2 force (footnote c) and k from Table A.3",
                    SourceStatus::Derived,
                ),
            )
            .note("Derived limit: the energy that takes the region's spring constant to the transient force limit. Inputs are from a secondary source (R2).")
            .caution(CautionId::ValuesFromSecondarySource),
        ),
    }
}

/// Quasi-static clamping force (figure [`ids::BODY_CLAMPING_FORCE`], N)
/// against F of the region (Table A.2, R2). Applies to every region,
/// including the head and face.
pub fn clamping_force_check(region: BodyRegion, force: Option<f64>) -> Check {
    region_cautions(Check::at_most(
        Subject::new(
            "body.clamping_force",
            &format!("Quasi-static clamping force: {}", region.label()),
            ids::BODY_CLAMPING_FORCE,
            Dim::Force,
        ),
        force,
        region.quasi_static_force(),
        table_a2("Table A.2 (quasi-static force)"),
    ))
}

/// Quasi-static clamping pressure (figure [`ids::BODY_CLAMPING_PRESSURE`],
/// Pa) against p of the specific area (`None` → the region's lowest).
///
/// # Errors
/// Unknown area key.
pub fn clamping_pressure_check(
    region: BodyRegion,
    area: Option<&str>,
    pressure: Option<f64>,
) -> Result<Check, InputError> {
    let a = region.area(area)?;
    Ok(region_cautions(
        Check::at_most(
            Subject::new(
                "body.clamping_pressure",
                &format!(
                    "Quasi-static clamping pressure: {} ({})",
                    region.label(),
                    a.label
                ),
                ids::BODY_CLAMPING_PRESSURE,
                Dim::Pressure,
            ),
            pressure,
            a.pressure,
            table_a2("Table A.2 (specific-area pressure)"),
        )
        .note(&area_note(area)),
    ))
}

/// A contact with a body region and the figures to check (any may be missing).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
#[cfg_attr(feature = "schema", derive(schemars::JsonSchema))]
pub struct BodyContactCase {
    /// The region contacted.
    pub region: BodyRegion,
    /// Key of the specific area for pressure limits (see [`SpecificArea`]);
    /// `None` → the region's lowest pressure limit.
    pub specific_area: Option<String>,
    /// Whether the contact is transient (free impact, the person can recoil).
    pub transient: bool,
    /// Whether the part can come to rest on the person (clamping, quasi-static).
    pub quasi_static: bool,
    /// Peak transient force, N.
    pub transient_force: Option<f64>,
    /// Peak transient pressure, Pa.
    pub transient_pressure: Option<f64>,
    /// Energy transferred, J.
    pub transfer_energy: Option<f64>,
    /// Quasi-static clamping force, N.
    pub clamping_force: Option<f64>,
    /// Quasi-static clamping pressure, Pa.
    pub clamping_pressure: Option<f64>,
}

/// All checks for a body contact: transient force, pressure and energy when
/// `transient`, clamping force and pressure when `quasi_static`.
///
/// # Errors
/// Unknown area key; a given figure negative or not finite.
pub fn body_checks(case: &BodyContactCase) -> Result<Vec<Check>, InputError> {
    for (field, v) in [
        ("transient_force", case.transient_force),
        ("transient_pressure", case.transient_pressure),
        ("transfer_energy", case.transfer_energy),
        ("clamping_force", case.clamping_force),
        ("clamping_pressure", case.clamping_pressure),
    ] {
        if let Some(v) = v {
            check::non_negative(field, v)?;
        }
    }
    let area = case.specific_area.as_deref();
    let mut out = Vec::new();
    if case.transient {
        out.push(transient_force_check(case.region, case.transient_force));
        out.push(transient_pressure_check(
            case.region,
            area,
            case.transient_pressure,
        )?);
        out.push(transfer_energy_check(case.region, case.transfer_energy));
    }
    if case.quasi_static {
        out.push(clamping_force_check(case.region, case.clamping_force));
        out.push(clamping_pressure_check(
            case.region,
            area,
            case.clamping_pressure,
        )?);
    }
    Ok(out)
}

/// The body-region limit set for the catalogue.
pub fn limit_set() -> LimitSet {
    let mut entries = Vec::new();
    for r in BodyRegion::ALL {
        let l = r.limits();
        let key = |s: &str| format!("{}.{s}", serde_key(r));
        entries.push(
            LimitEntry::new(
                &key("quasi_static_force"),
                &format!("{}: quasi-static force", l.label),
                Comparison::AtMost,
                Dim::Force,
                table_a2("Table A.2"),
            )
            .value(l.quasi_static_force)
            .published(&format!("{} N", l.quasi_static_force)),
        );
        match r.transient_force() {
            Some(ft) => entries.push(
                LimitEntry::new(
                    &key("transient_force"),
                    &format!("{}: transient force", l.label),
                    Comparison::AtMost,
                    Dim::Force,
                    table_a2("Table A.2 footnote c"),
                )
                .value(ft)
                .rule("2 × quasi-static force"),
            ),
            None => entries.push(
                LimitEntry::new(
                    &key("transient_contact"),
                    &format!("{}: transient contact", l.label),
                    Comparison::NotPermitted,
                    Dim::Force,
                    table_a2("Table A.2 footnote c; A.3.2"),
                )
                .rule("transient contact not permissible")
                .note("No transient value is given for this region."),
            ),
        }
        for a in l.areas {
            let p = a.pressure / N_PER_CM2;
            entries.push(
                LimitEntry::new(
                    &key(&format!("pressure.{}", a.key)),
                    &format!("{}: quasi-static pressure, {}", l.label, a.label),
                    Comparison::AtMost,
                    Dim::Pressure,
                    table_a2("Table A.2"),
                )
                .value(a.pressure)
                .published(&format!("{p} N/cm²"))
                .note(if r.transient_contact_permitted() {
                    "Transient limit: 2 × this value (footnote c)."
                } else {
                    "No transient value: transient contact not permissible."
                }),
            );
        }
        entries.push(
            LimitEntry::new(
                &key("spring_constant"),
                &format!("{}: effective spring constant k", l.label),
                Comparison::AtMost,
                Dim::LinearRate,
                table_a2("Table A.3"),
            )
            .value(l.spring_constant)
            .published(&format!("{} N/mm", l.spring_constant / N_PER_MM))
            .note("Body model, not a limit.")
            .parameter(),
        );
        entries.push(
            LimitEntry::new(
                &key("mass"),
                &format!("{}: effective mass m_H", l.label),
                Comparison::AtMost,
                Dim::Mass,
                table_a2("Table A.3"),
            )
            .value(l.mass)
            .published(&format!("{} kg", l.mass))
            .note("Body model, not a limit.")
            .parameter(),
        );
        if let Some(e) = r.transient_energy() {
            entries.push(
                LimitEntry::new(
                    &key("transfer_energy"),
                    &format!("{}: transfer energy", l.label),
                    Comparison::AtMost,
                    Dim::Energy,
                    Provenance::new(
                        DOC,
                        "Annex A E = F²/(2k), F = 2 × Table A.2 force, k from Table A.3",
                        SourceStatus::Derived,
                    ),
                )
                .value(e)
                .rule("E = (2F)²/(2k)"),
            );
        }
    }
    LimitSet {
        id: LimitSetId::BodyRegions,
        title: "Contact with body regions".into(),
        documents: vec![DOC.into(), "ISO 10218-2:2025 (now holds these limits; numbering not confirmed)".into()],
        scope: "Contact between a moving part and an adult's body region: transient (the person can move away) and quasi-static (clamped). Not for children. Transient contact with the skull, forehead or face is not permissible.".into(),
        explanation: "These limits mark where contact starts to hurt adults in laboratory tests, not where injury begins, and they assume the contact is foreseeable and rare. Transient values are twice the clamping values; the head and face have none because striking them is not acceptable. The values were read in public transcriptions of the technical specification, which is now superseded by ISO 10218-2:2025: check them against the document you work to.".into(),
        entries,
        cautions: vec![
            CautionId::BodyLimitsAdultPainOnset,
            CautionId::ChildrenNotCovered,
            CautionId::HeadContactNotPermissible,
            CautionId::ValuesFromSecondarySource,
        ],
    }
}

fn serde_key(r: BodyRegion) -> &'static str {
    match r {
        BodyRegion::SkullForehead => "skull_forehead",
        BodyRegion::Face => "face",
        BodyRegion::Neck => "neck",
        BodyRegion::BackShoulders => "back_shoulders",
        BodyRegion::Chest => "chest",
        BodyRegion::Abdomen => "abdomen",
        BodyRegion::Pelvis => "pelvis",
        BodyRegion::UpperArmElbow => "upper_arm_elbow",
        BodyRegion::LowerArmWrist => "lower_arm_wrist",
        BodyRegion::HandFingers => "hand_fingers",
        BodyRegion::ThighKnee => "thigh_knee",
        BodyRegion::LowerLeg => "lower_leg",
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::figure::Verdict;
    use crate::test_tol::REL_EXACT;
    use approx::assert_relative_eq;

    /// reference-values.md §1c and T15 print energies to 4 significant figures.
    const REL_4SF: f64 = crate::test_tol::REL_PRINTED_4SF;

    #[test]
    fn table_a2_a3_values_per_region() {
        // ISO/TS 15066:2016 Table A.2 (F, N) and Table A.3 (k N/mm, m_H kg),
        // reference-values.md §1b, status R2 (public transcription).
        let expect: [(BodyRegion, f64, f64, f64); 12] = [
            (BodyRegion::SkullForehead, 130.0, 150.0, 4.4),
            (BodyRegion::Face, 65.0, 75.0, 4.4),
            (BodyRegion::Neck, 150.0, 50.0, 1.2),
            (BodyRegion::BackShoulders, 210.0, 35.0, 40.0),
            (BodyRegion::Chest, 140.0, 25.0, 40.0),
            (BodyRegion::Abdomen, 110.0, 10.0, 40.0),
            (BodyRegion::Pelvis, 180.0, 25.0, 40.0),
            (BodyRegion::UpperArmElbow, 150.0, 30.0, 3.0),
            (BodyRegion::LowerArmWrist, 160.0, 40.0, 2.0),
            (BodyRegion::HandFingers, 140.0, 75.0, 0.6),
            (BodyRegion::ThighKnee, 220.0, 50.0, 75.0),
            (BodyRegion::LowerLeg, 130.0, 60.0, 75.0),
        ];
        for (r, f, k, m) in expect {
            assert_eq!(r.quasi_static_force(), f, "{r:?}");
            assert_eq!(r.spring_constant(), k * 1e3, "{r:?}");
            assert_eq!(r.mass(), m, "{r:?}");
        }
    }

    #[test]
    fn table_a2_specific_area_pressures() {
        // ISO/TS 15066:2016 Table A.2 specific areas, N/cm² (reference-values.md §1b, R2).
        let expect: [(BodyRegion, &str, f64); 28] = [
            (BodyRegion::SkullForehead, "middle_of_forehead", 130.0),
            (BodyRegion::SkullForehead, "temple", 110.0),
            (BodyRegion::Face, "masticatory_muscle", 110.0),
            (BodyRegion::Neck, "neck_muscle", 140.0),
            (BodyRegion::Neck, "seventh_neck_muscle", 210.0),
            (BodyRegion::BackShoulders, "shoulder_joint", 160.0),
            (BodyRegion::BackShoulders, "fifth_lumbar_vertebra", 210.0),
            (BodyRegion::Chest, "sternum", 120.0),
            (BodyRegion::Chest, "pectoral_muscle", 170.0),
            (BodyRegion::Abdomen, "abdominal_muscle", 140.0),
            (BodyRegion::Pelvis, "pelvic_bone", 210.0),
            (BodyRegion::UpperArmElbow, "deltoid_muscle", 190.0),
            (BodyRegion::UpperArmElbow, "humerus", 220.0),
            (BodyRegion::LowerArmWrist, "radial_bone", 190.0),
            (BodyRegion::LowerArmWrist, "forearm_muscle", 180.0),
            (BodyRegion::LowerArmWrist, "arm_nerve", 180.0),
            (BodyRegion::HandFingers, "forefinger_pad_dominant", 300.0),
            (
                BodyRegion::HandFingers,
                "forefinger_pad_non_dominant",
                270.0,
            ),
            (
                BodyRegion::HandFingers,
                "forefinger_end_joint_dominant",
                280.0,
            ),
            (
                BodyRegion::HandFingers,
                "forefinger_end_joint_non_dominant",
                220.0,
            ),
            (BodyRegion::HandFingers, "thenar_eminence", 200.0),
            (BodyRegion::HandFingers, "palm", 260.0),
            (BodyRegion::HandFingers, "back_of_hand_dominant", 200.0),
            (BodyRegion::HandFingers, "back_of_hand_non_dominant", 190.0),
            (BodyRegion::ThighKnee, "thigh_muscle", 250.0),
            (BodyRegion::ThighKnee, "kneecap", 220.0),
            (BodyRegion::LowerLeg, "middle_of_shin", 220.0),
            (BodyRegion::LowerLeg, "calf_muscle", 210.0),
        ];
        let total: usize = BodyRegion::ALL.iter().map(|r| r.limits().areas.len()).sum();
        assert_eq!(total, expect.len());
        for (r, key, p) in expect {
            assert_eq!(
                r.quasi_static_pressure(Some(key)).unwrap(),
                p * 1e4,
                "{key}"
            );
        }
        // Lowest-area default (Joulewise's conservative choice): back of hand ND 190.
        assert_eq!(
            BodyRegion::HandFingers.quasi_static_pressure(None).unwrap(),
            190.0e4
        );
        assert!(BodyRegion::Chest.area(Some("palm")).is_err());
    }

    #[test]
    fn transient_is_twice_quasi_static_except_head_t18() {
        // Table A.2 footnote c (R2): transient = 2 × quasi-static, force and pressure.
        for r in BodyRegion::ALL {
            if r.transient_contact_permitted() {
                assert_eq!(r.transient_force(), Some(2.0 * r.quasi_static_force()));
                assert_eq!(
                    r.transient_pressure(None).unwrap(),
                    Some(2.0 * r.quasi_static_pressure(None).unwrap())
                );
            }
        }
        // T18 (A.2 footnote c / A.3.2, R2): skull/forehead and face, transient
        // contact not permissible, no transient value.
        for r in [BodyRegion::SkullForehead, BodyRegion::Face] {
            assert_eq!(r.transient_force(), None);
            assert_eq!(r.transient_pressure(None).unwrap(), None);
            assert_eq!(r.transient_energy(), None);
            let c = transient_force_check(r, Some(10.0));
            assert_eq!(c.comparison, Comparison::NotPermitted);
            assert_eq!(c.verdict, Verdict::Fail);
            assert_eq!(c.limit, None);
            assert!(c.cautions.contains(&CautionId::HeadContactNotPermissible));
            assert!(c.notes.iter().any(|n| n.contains("not permissible")));
            assert_eq!(transfer_energy_check(r, Some(0.01)).verdict, Verdict::Fail);
            assert_eq!(
                transient_pressure_check(r, None, Some(1.0))
                    .unwrap()
                    .verdict,
                Verdict::Fail
            );
            // Quasi-static clamping of the face has a limit: 65 N (Table A.2, R2).
            assert_eq!(clamping_force_check(r, Some(60.0)).verdict, Verdict::Pass);
        }
        assert_eq!(
            clamping_force_check(BodyRegion::Face, Some(66.0)).verdict,
            Verdict::Fail
        );
    }

    #[test]
    fn transfer_energy_t15_and_section_1c() {
        // reference-values.md T15 and §1c (D from Table A.2/A.3 R2 values):
        // E_T = (2F)²/(2k), printed to 4 significant figures.
        let expect = [
            (BodyRegion::Neck, 0.900),
            (BodyRegion::BackShoulders, 2.520),
            (BodyRegion::Chest, 1.568),
            (BodyRegion::Abdomen, 2.420),
            (BodyRegion::Pelvis, 2.592),
            (BodyRegion::UpperArmElbow, 1.500),
            (BodyRegion::LowerArmWrist, 1.280),
            (BodyRegion::HandFingers, 0.5227),
            (BodyRegion::ThighKnee, 1.936),
            (BodyRegion::LowerLeg, 0.5633),
        ];
        for (r, e) in expect {
            assert_relative_eq!(r.transient_energy().unwrap(), e, max_relative = REL_4SF);
        }
        // Quasi-static energy is ¼ (§1c, D): hand 0.1307 J.
        assert_relative_eq!(
            BodyRegion::HandFingers.quasi_static_energy(),
            0.1307,
            max_relative = REL_4SF
        );
        assert_relative_eq!(
            BodyRegion::HandFingers.quasi_static_energy() * 4.0,
            BodyRegion::HandFingers.transient_energy().unwrap(),
            max_relative = REL_EXACT
        );
    }

    #[test]
    fn checks_for_a_hand_at_the_boundaries() {
        // Hand transient force limit 280 N (Table A.2 × 2, R2).
        let at = transient_force_check(BodyRegion::HandFingers, Some(280.0));
        assert_eq!(at.verdict, Verdict::Pass);
        assert_eq!(at.margin_ratio, Some(1.0));
        assert_eq!(
            transient_force_check(BodyRegion::HandFingers, Some(280.5)).verdict,
            Verdict::Fail
        );
        // T17 (R2): back of hand ND 190 N/cm² → transient 380 N/cm².
        let p = transient_pressure_check(
            BodyRegion::HandFingers,
            Some("back_of_hand_non_dominant"),
            Some(370.0e4),
        )
        .unwrap();
        assert_eq!(p.limit, Some(380.0e4));
        assert_eq!(p.verdict, Verdict::Pass);
        let missing = transfer_energy_check(BodyRegion::HandFingers, None);
        assert_eq!(missing.verdict, Verdict::Unknown);
        assert_eq!(missing.provenance.status, SourceStatus::Derived);
        for c in [&at, &p, &missing] {
            assert!(c.cautions.contains(&CautionId::BodyLimitsAdultPainOnset));
            assert!(c.notes.iter().any(|n| n.contains("10218-2:2025")));
        }
    }

    #[test]
    fn body_checks_follow_the_contact_kind() {
        let mut case = BodyContactCase {
            region: BodyRegion::Chest,
            specific_area: Some("sternum".into()),
            transient: true,
            quasi_static: false,
            transient_force: Some(200.0),
            transient_pressure: None,
            transfer_energy: Some(1.0),
            clamping_force: None,
            clamping_pressure: None,
        };
        let c = body_checks(&case).unwrap();
        assert_eq!(c.len(), 3);
        assert_eq!(c[1].limit, Some(240.0e4));
        case.quasi_static = true;
        assert_eq!(body_checks(&case).unwrap().len(), 5);
        case.specific_area = Some("kneecap".into());
        assert_eq!(body_checks(&case).unwrap_err().field, "specific_area");
    }
}
